package q

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/physics"
	"cylcav/qfactor"
)

// maxResidualOhm bounds --residual: far above any superconducting surface.
const maxResidualOhm = 1.0

// PartNames names the wall parts in the order side wall, end plate A, end
// plate B, as printed.
var PartNames = [3]string{"side wall (r = a)", "end plate A (z = 0)", "end plate B (z = d)"}

// WallFlags are the wall-material flags shared by `cylcav q` and `cylcav
// modes`: --wall, --end-wall, --end-wall-a, --end-wall-b, --temperature,
// --roughness, --roughness-model, --plating, --plating-thickness,
// --superconducting and --residual. Temperature, roughness, plating and the
// superconducting state apply to every wall part.
type WallFlags struct {
	cmd                                                   *cobra.Command
	wall, end, endA, endB, rough, roughModel, temperature string
	plating, platingThickness, residual                   string
	superconducting                                       bool
}

// AddWallFlags registers the wall flags on cmd.
func AddWallFlags(cmd *cobra.Command) *WallFlags {
	w := &WallFlags{cmd: cmd}
	f := cmd.Flags()
	f.StringVar(&w.wall, "wall", "", "wall metal: library name or sigma=/iacs=/rho=... (see 'cylcav materials')")
	f.StringVar(&w.end, "end-wall", "", "metal of both end plates, when not the --wall metal")
	f.StringVar(&w.endA, "end-wall-a", "", "metal of end plate A (z = 0); overrides --end-wall")
	f.StringVar(&w.endB, "end-wall-b", "", "metal of end plate B (z = d); overrides --end-wall")
	f.StringVar(&w.rough, "roughness", "", "RMS surface roughness of the walls, e.g. 0.4um (default smooth)")
	f.StringVar(&w.roughModel, "roughness-model", "hammerstad", "roughness correction: hammerstad|groiss")
	f.StringVar(&w.temperature, "temperature", "", "wall temperature, e.g. 60C or 2K (default 20C)")
	f.StringVar(&w.plating, "plating", "", "plating metal over every wall part, e.g. silver")
	f.StringVar(&w.platingThickness, "plating-thickness", "", "plating thickness, e.g. 5um (required with --plating)")
	f.BoolVar(&w.superconducting, "superconducting", false, "niobium walls in the superconducting state (BCS model; needs --temperature, e.g. 2K)")
	f.StringVar(&w.residual, "residual", "", "residual surface resistance with --superconducting, e.g. 10nohm (default 10 nohm)")
	cmdutil.Needs(cmd, "roughness-model", "roughness")
	cmdutil.Needs(cmd, "plating-thickness", "plating")
	cmdutil.Needs(cmd, "residual", "superconducting")
	for _, name := range []string{"end-wall", "end-wall-a", "end-wall-b", "roughness", "temperature", "plating", "superconducting"} {
		cmdutil.Needs(cmd, name, "wall")
	}
	return w
}

// Given reports whether --wall was given (an empty value counts: it is
// rejected by Surfaces, not ignored).
func (w *WallFlags) Given() bool { return w.set("wall") }

// set reports whether the flag name was given on the command line.
func (w *WallFlags) set(name string) bool { return w.cmd.Flags().Changed(name) }

// Surfaces validates the flags into the side wall, end plate A and end
// plate B surfaces. It needs --wall; every error is a usage error naming
// the flag, the value and the valid range.
func (w *WallFlags) Surfaces() ([3]qfactor.Surface, error) {
	var out [3]qfactor.Surface
	if !w.Given() {
		return out, cmdutil.Usagef("--wall is required, e.g. --wall copper or --wall sigma=5.8e7")
	}
	type spec struct{ flag, value string }
	specs := [3]spec{{"wall", w.wall}, {"wall", w.wall}, {"wall", w.wall}}
	if w.set("end-wall") {
		specs[1], specs[2] = spec{"end-wall", w.end}, spec{"end-wall", w.end}
	}
	if w.set("end-wall-a") {
		specs[1] = spec{"end-wall-a", w.endA}
	}
	if w.set("end-wall-b") {
		specs[2] = spec{"end-wall-b", w.endB}
	}
	var common qfactor.Surface
	if w.set("temperature") {
		t, err := physics.ParseTemperature(w.temperature)
		if err != nil {
			return out, cmdutil.FlagError("temperature", w.temperature, err)
		}
		if t <= 0 || t > 2000 {
			return out, cmdutil.FlagError("temperature", w.temperature, fmt.Errorf("must be above 0 K and at most 2000 K"))
		}
		common.Temperature = t
	}
	if w.set("roughness") {
		r, err := cmdutil.Length("roughness", w.rough, 0, 1e-3)
		if err != nil {
			return out, err
		}
		common.Roughness = r
	}
	var err error
	if common.RoughnessModel, err = qfactor.ParseRoughnessModel(w.roughModel); err != nil {
		return out, cmdutil.FlagError("roughness-model", w.roughModel, err)
	}
	if w.set("roughness-model") && !w.set("roughness") {
		return out, cmdutil.Usagef("--roughness-model needs --roughness, e.g. --roughness 0.4um")
	}
	switch {
	case w.set("plating") && !w.set("plating-thickness"):
		return out, cmdutil.Usagef("--plating needs --plating-thickness, e.g. --plating-thickness 5um")
	case !w.set("plating") && w.set("plating-thickness"):
		return out, cmdutil.Usagef("--plating-thickness needs --plating, e.g. --plating silver")
	case w.set("plating"):
		pm, err := physics.ParseConductor(w.plating)
		if err != nil {
			return out, cmdutil.FlagError("plating", w.plating, err)
		}
		th, err := cmdutil.Length("plating-thickness", w.platingThickness, 0, 0.1)
		if err != nil {
			return out, err
		}
		common.Plating = &qfactor.Plating{Metal: pm, Thickness: th}
	}
	if w.superconducting {
		if !w.set("temperature") {
			return out, cmdutil.Usagef("--superconducting needs --temperature, e.g. --temperature 2K")
		}
		if w.set("plating") {
			return out, cmdutil.Usagef("--superconducting cannot be combined with --plating")
		}
		bcs := qfactor.NiobiumBCS()
		if common.Temperature > bcs.Tc/2 {
			return out, cmdutil.FlagError("temperature", w.temperature, fmt.Errorf("the BCS model of superconducting niobium holds from 0 K to Tc/2 = %g K", bcs.Tc/2))
		}
		if w.set("residual") {
			r, err := parseOhm(w.residual)
			if err != nil {
				return out, cmdutil.FlagError("residual", w.residual, err)
			}
			if r < 0 || r > maxResidualOhm {
				return out, cmdutil.FlagError("residual", w.residual, fmt.Errorf("must be between 0 and %g ohm", maxResidualOhm))
			}
			bcs.Residual = r
		}
		common.Superconductor = &bcs
	} else if w.set("residual") {
		return out, cmdutil.Usagef("--residual needs --superconducting")
	}
	for i, s := range specs {
		c, err := physics.ParseConductor(s.value)
		if err != nil {
			return out, cmdutil.FlagError(s.flag, s.value, err)
		}
		if w.superconducting && c.Name != "niobium" {
			return out, cmdutil.FlagError(s.flag, s.value, fmt.Errorf("--superconducting models niobium walls only; this wall part is %s", c.Name))
		}
		if !w.superconducting {
			// The linear resistivity model's range depends on the metal.
			if _, err := qfactor.Conductivity(c, common.Temperature); err != nil {
				return out, cmdutil.FlagError("temperature", w.temperature, fmt.Errorf("%s: %w", s.flag, err))
			}
		}
		part := common
		part.Conductor = c
		out[i] = part
	}
	if p := common.Plating; p != nil {
		if _, err := qfactor.Conductivity(p.Metal, common.Temperature); err != nil {
			return out, cmdutil.FlagError("temperature", w.temperature, fmt.Errorf("plating: %w", err))
		}
	}
	return out, nil
}

// Resistance returns the surface resistances of the three wall parts at any
// frequency, for qfactor.UnloadedQ and UnloadedQAll. Each distinct warning
// of the surface models goes to warn once.
func Resistance(s [3]qfactor.Surface, warn func(string)) qfactor.WallsAt {
	seen := map[string]bool{}
	return func(f float64) (qfactor.Walls, error) {
		var v [3]float64
		for i, part := range s {
			rs, warns, err := part.Resistance(f)
			if err != nil {
				return qfactor.Walls{}, fmt.Errorf("%s: %w", PartNames[i], err)
			}
			v[i] = rs
			for _, x := range warns {
				if !seen[x] {
					seen[x] = true
					warn(x)
				}
			}
		}
		return qfactor.Walls{Side: v[0], EndA: v[1], EndB: v[2]}, nil
	}
}

// parseOhm parses a resistance with an optional unit ohm, mohm, uohm or
// nohm ("10nohm", "1e-8", "0.02 mohm").
func parseOhm(s string) (float64, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	scale := 1.0
	for _, u := range []struct {
		suffix string
		f      float64
	}{{"nohm", 1e-9}, {"uohm", 1e-6}, {"mohm", 1e-3}, {"ohm", 1}} {
		if strings.HasSuffix(t, u.suffix) {
			t, scale = strings.TrimSpace(strings.TrimSuffix(t, u.suffix)), u.f
			break
		}
	}
	v, err := strconv.ParseFloat(t, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("not a resistance; write e.g. 10nohm, 0.02mohm or 1e-8 (ohm)")
	}
	return v * scale, nil
}
