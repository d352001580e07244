package cmdutil

import (
	"errors"
	"fmt"

	"github.com/spf13/cobra"

	"cylcav/physics"
	"cylcav/qfactor"
)

// WallFlags are the wall-material flags shared by `cylcav q`, `cylcav
// modes` and `cylcav filter`: --wall, --end-wall, --end-wall-a,
// --end-wall-b, --temperature, --roughness, --roughness-model, --plating,
// --plating-thickness, --superconducting and --residual. Temperature,
// roughness, plating and the superconducting state apply to every wall
// part.
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
	Needs(cmd, "roughness-model", "roughness")
	Needs(cmd, "plating-thickness", "plating")
	Needs(cmd, "residual", "superconducting")
	for _, name := range []string{"end-wall", "end-wall-a", "end-wall-b", "roughness", "temperature", "plating", "superconducting"} {
		Needs(cmd, name, "wall")
		NeedsExample(cmd, name, "--wall copper")
	}
	// Niobium is the only superconducting wall modelled.
	NeedsExample(cmd, "superconducting", "--wall niobium --superconducting --temperature 2K")
	NeedsExample(cmd, "residual", "--wall niobium --superconducting --temperature 2K")
	NeedsExample(cmd, "roughness-model", "--roughness 0.4um")
	NeedsExample(cmd, "plating-thickness", "--plating silver")
	return w
}

// Given reports whether --wall was given (an empty value counts: it is
// rejected by Walls, not ignored).
func (w *WallFlags) Given() bool { return w.set("wall") }

// set reports whether the flag name was given on the command line.
func (w *WallFlags) set(name string) bool { return w.cmd.Flags().Changed(name) }

// wallSpec is a wall-metal flag and its value.
type wallSpec struct{ flag, value string }

// Walls reads the flags into the cavity's wall set and validates it with
// qfactor.WallSet.Validate. It needs --wall; every error is a usage error
// naming the flag, the value and the valid range.
func (w *WallFlags) Walls() (qfactor.WallSet, error) {
	if !w.Given() {
		return qfactor.WallSet{}, Usagef("--wall is required, e.g. --wall copper or --wall sigma=5.8e7")
	}
	specs := [3]wallSpec{{"wall", w.wall}, {"wall", w.wall}, {"wall", w.wall}}
	if w.set("end-wall") {
		specs[1], specs[2] = wallSpec{"end-wall", w.end}, wallSpec{"end-wall", w.end}
	}
	if w.set("end-wall-a") {
		specs[1] = wallSpec{"end-wall-a", w.endA}
	}
	if w.set("end-wall-b") {
		specs[2] = wallSpec{"end-wall-b", w.endB}
	}
	common, err := w.common()
	if err != nil {
		return qfactor.WallSet{}, err
	}
	var parts [3]qfactor.Surface
	for i, s := range specs {
		c, err := physics.ParseConductor(s.value)
		if err != nil {
			return qfactor.WallSet{}, FlagError(s.flag, s.value, err)
		}
		parts[i] = common
		parts[i].Conductor = c
	}
	set := qfactor.WallSet{Side: parts[0], EndA: parts[1], EndB: parts[2]}
	if err := set.Validate(); err != nil {
		return qfactor.WallSet{}, w.blame(err, specs)
	}
	return set, nil
}

// common reads the settings shared by every wall part, with the rules
// between flags that Needs does not state (a flag that needs another is
// refused alone by CheckNeeds before the command runs).
func (w *WallFlags) common() (qfactor.Surface, error) {
	var s qfactor.Surface
	if w.set("temperature") {
		t, err := physics.ParseTemperature(w.temperature)
		if err != nil {
			return s, FlagError("temperature", w.temperature, err)
		}
		if t == 0 {
			// Zero is the library's "20 C"; absolute zero itself is no wall
			// temperature.
			return s, FlagError("temperature", w.temperature, fmt.Errorf("must be above 0 K and at most %g K", qfactor.MaxWallTemperature))
		}
		s.Temperature = t
	}
	if w.set("roughness") {
		r, err := Length("roughness", w.rough, 0, qfactor.MaxRoughness)
		if err != nil {
			return s, err
		}
		s.Roughness = r
	}
	var err error
	if s.RoughnessModel, err = qfactor.ParseRoughnessModel(w.roughModel); err != nil {
		return s, FlagError("roughness-model", w.roughModel, err)
	}
	switch {
	case w.set("plating") && !w.set("plating-thickness"):
		return s, Usagef("--plating needs --plating-thickness, e.g. --plating-thickness 5um")
	case w.set("plating"):
		pm, err := physics.ParseConductor(w.plating)
		if err != nil {
			return s, FlagError("plating", w.plating, err)
		}
		th, err := Length("plating-thickness", w.platingThickness, 0, qfactor.MaxPlatingThickness)
		if err != nil {
			return s, err
		}
		s.Plating = &qfactor.Plating{Metal: pm, Thickness: th}
	}
	if w.superconducting {
		if !w.set("temperature") {
			return s, Usagef("--superconducting needs --temperature, e.g. --temperature 2K")
		}
		bcs := qfactor.NiobiumBCS()
		if w.set("residual") {
			r, err := physics.ParseResistance(w.residual)
			if err != nil {
				return s, FlagError("residual", w.residual, err)
			}
			bcs.Residual = r
		}
		s.Superconductor = &bcs
	}
	return s, nil
}

// blame turns an error of qfactor.WallSet.Validate into a usage error
// naming the flag that set the offending value.
func (w *WallFlags) blame(err error, specs [3]wallSpec) error {
	var we *qfactor.WallError
	if !errors.As(err, &we) {
		return &UsageError{Err: err}
	}
	flag, value := "", ""
	switch we.Setting {
	case qfactor.SettingMetal:
		flag, value = specs[we.Part].flag, specs[we.Part].value
	case qfactor.SettingTemperature:
		flag, value = "temperature", w.temperature
	case qfactor.SettingRoughness:
		flag, value = "roughness", w.rough
	case qfactor.SettingPlating:
		flag, value = "plating", w.plating
	case qfactor.SettingPlatingThickness:
		flag, value = "plating-thickness", w.platingThickness
	case qfactor.SettingResidual:
		flag, value = "residual", w.residual
	}
	if !w.set(flag) {
		// A default broke a rule (for example the default 20 C outside a
		// user metal's range): name the metal's flag instead.
		flag, value = specs[we.Part].flag, specs[we.Part].value
	}
	return FlagError(flag, value, we)
}
