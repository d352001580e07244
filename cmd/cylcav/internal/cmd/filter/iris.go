package filter

import (
	"fmt"
	"math"
	"strings"

	"github.com/spf13/cobra"

	"cylcav/axisym"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/iris"
	"cylcav/physics"
)

// Exact iris sizing of in-line TE0mp/TM0mp filters (package iris): the
// flags, their checks, the computation and the output.

// IrisOptions are the parsed flags of the iris sizing.
type IrisOptions struct {
	// Wall is the wall thickness at every iris and hole, m.
	Wall float64
	// Modes is the solver's mode count.
	Modes int
	// PortRadius is the port guide radius, m (0: the end cavity's).
	PortRadius float64
}

// maxIrisWall bounds --iris-wall.
const maxIrisWall = 0.1 // m

// portSolver is the open-end solver that sizes the end irises (nil would
// report them as not available).
var portSolver iris.PortFunc = axisym.PortQ

// irisFlags holds the flag values before they are checked.
type irisFlags struct {
	opts IrisOptions
}

// addIrisFlags registers --iris-wall, --iris-modes and --iris-port-radius.
func addIrisFlags(cmd *cobra.Command) *irisFlags {
	fl := &irisFlags{}
	f := cmd.Flags()
	cmdutil.LengthVar(f, &fl.opts.Wall, "iris-wall", "size every coupling as an iris or hole in a wall this thick, e.g. 2mm: in-line TE0mp/TM0mp cavities, centred irises solved by mode matching", 1e-6, maxIrisWall)
	cmdutil.IntVar(f, &fl.opts.Modes, "iris-modes", axisym.DefaultModes, fmt.Sprintf("waveguide modes in the widest section of the iris solver, 4..%d", axisym.MaxModes), 4, axisym.MaxModes)
	cmdutil.LengthVar(f, &fl.opts.PortRadius, "iris-port-radius", "radius of the circular waveguide ports (default: the end cavity's radius)", 1e-6, 1e3)
	cmdutil.Needs(cmd, "iris-modes", "iris-wall")
	cmdutil.Needs(cmd, "iris-port-radius", "iris-wall")
	return fl
}

// checkIris completes opts.Iris from the flags (after checkCavities).
func (opts *Options) checkIris(changed func(string) bool, fl *irisFlags) error {
	if !changed("iris-wall") {
		return nil
	}
	if changed("holes") {
		return cmdutil.Usagef("give --holes (Bethe's small holes) or --iris-wall (irises solved exactly), not both")
	}
	if opts.Mode.N != 0 {
		return cmdutil.FlagError("mode", opts.Mode.String(), fmt.Errorf("--iris-wall sizes centred irises between cavities on one axis, which needs a TE0mp or TM0mp mode (n = 0), e.g. TE011 or TM010"))
	}
	o := fl.opts
	opts.Iris = &o
	return nil
}

// sizeIrises realises every coupling of the design as an iris or hole.
func (r *Result) sizeIrises() error {
	o := r.Opts.Iris
	pl, err := iris.Realise(r.Design, r.Realisation, iris.Options{Wall: o.Wall, Modes: o.Modes, Port: portSolver, PortRadius: o.PortRadius})
	if err != nil {
		return err
	}
	r.Irises = pl
	for _, c := range pl.Couplings {
		st, why := iris.Judge(c)
		if st != iris.Valid {
			r.Warnings = append(r.Warnings, fmt.Sprintf("coupling %s: %s: %s", couplingLabel(c, r.Design.Order()), st, strings.Join(why, "; ")))
		}
	}
	for _, t := range pl.Cavities {
		if !t.Complete {
			r.Warnings = append(r.Warnings, fmt.Sprintf("cavity %d: the corrected length lacks the loading of an iris that could not be sized", t.Resonator))
		}
	}
	if !pl.Converged {
		r.Warnings = append(r.Warnings, fmt.Sprintf("the corrected cavity lengths did not settle in %d passes (last change %.2g relative, want %g): take them as estimates", pl.Passes, pl.Change, iris.DimensionTol))
	}
	return nil
}

// couplingLabel is "S-1", "1-2", "6-L", "2-5".
func couplingLabel(c iris.Coupling, n int) string {
	return rowName(c.From, n) + "-" + rowName(c.To, n)
}

// writeIrises prints the coupling realisation and the corrected cavities.
func writeIrises(b *strings.Builder, r *Result) {
	pl := r.Irises
	if pl == nil {
		return
	}
	n := r.Design.Order()
	fl := func(v float64) string { return physics.FormatLength(v, 6) }
	fmt.Fprintf(b, "\nIrises and holes (%s cavities on one axis, walls %s, solver modes %d)\n", pl.Mode, fl(r.Opts.Iris.Wall), r.Opts.Iris.Modes)
	t := cmdutil.NewTable(b, "  coupling", "required", "method", "radius", "achieved", "change", "verdict")
	var notes []string
	for _, c := range pl.Couplings {
		req := fmt.Sprintf("k %.6g", c.Required)
		if c.Kind == "port" {
			req = fmt.Sprintf("Qext %.6g", c.Required)
		}
		st, why := iris.Judge(c)
		radius, ach, ch := "-", "-", "-"
		if st == iris.Valid { // no number from a method outside its range
			radius = fl(c.Radius)
			ach = fmt.Sprintf("%.6g", c.Achieved)
			if !math.IsNaN(c.Change) {
				ch = fmt.Sprintf("%.2g", c.Change)
			}
		}
		t.Row("  "+couplingLabel(c, n), req, c.Method.String(), radius, ach, ch, st.String())
		if st == iris.Valid {
			notes = append(notes, fmt.Sprintf("%s: %s", couplingLabel(c, n), c.Where))
		}
		for _, w := range why {
			notes = append(notes, fmt.Sprintf("%s: %s", couplingLabel(c, n), w))
		}
	}
	_ = t.Flush()
	for _, nt := range notes {
		fmt.Fprintf(b, "  - %s\n", nt)
	}
	settled := fmt.Sprintf("settled in %d passes", pl.Passes)
	if !pl.Converged {
		settled = fmt.Sprintf("NOT settled after %d passes", pl.Passes)
	}
	how := "each iris lengthens the cavities it opens into by its extension"
	if pl.Mode.P == 0 {
		how = "TM0m0: the irises' detunings add and the diameter restores f"
	}
	fmt.Fprintf(b, "\nCavities with the irises in place (%s; %s)\n", how, settled)
	t = cmdutil.NewTable(b, "  resonator", "f", "D", "L closed", "extension", "detuning", "L corrected", "D corrected")
	trusted := pl.Trusted()
	for i, c := range pl.Cavities {
		ext, shift, lc, dc := fl(c.Extension), fmt.Sprintf("%+.4f %%", 100*c.Shift), fl(c.CorrectedLength), fl(2*c.CorrectedRadius)
		if pl.Mode.P == 0 {
			ext = "n/a"
		}
		if !trusted[i] {
			ext, shift, lc, dc = "-", "-", "-", "-"
		}
		t.Row(fmt.Sprintf("  %d", c.Resonator), physics.FormatFrequency(c.F, 6), fl(2*c.Radius), fl(c.Length), ext, shift, lc, dc)
	}
	_ = t.Flush()
	for i, ok := range trusted {
		if !ok {
			fmt.Fprintf(b, "  - cavity %d: no corrected dimensions: an iris that opens into it is not realised or outside its range\n", i+1)
		}
	}
}

// IrisOut is the JSON form of the coupling realisation.
type IrisOut struct {
	WallM     float64            `json:"wall_m"`
	Modes     int                `json:"solver_modes"`
	Passes    int                `json:"passes"`
	Settled   bool               `json:"lengths_settled"`
	Change    float64            `json:"last_relative_length_change"`
	Couplings []IrisCouplingOut  `json:"couplings"`
	Cavities  []IrisCavityOut    `json:"cavities"`
	Curves    []IrisCurveOut     `json:"k_radius_curves"`
	Limits    map[string]float64 `json:"limits"`
}

// IrisCouplingOut is one coupling: achieved and change are k (main,
// cross) or Qext (port) and their convergence estimates; the numbers are
// null unless the verdict is valid.
type IrisCouplingOut struct {
	From         int                 `json:"from"`
	To           int                 `json:"to"`
	Kind         string              `json:"kind"`
	K            *float64            `json:"k_required,omitempty"`
	Qext         *float64            `json:"qext_required,omitempty"`
	Method       string              `json:"method"`
	RadiusM      *cmdutil.JSONNumber `json:"radius_m"`
	ThicknessM   float64             `json:"thickness_m"`
	Where        string              `json:"position"`
	Achieved     *cmdutil.JSONNumber `json:"achieved"`
	KChange      *cmdutil.JSONNumber `json:"change"`
	RadiusChange *cmdutil.JSONNumber `json:"radius_change_m"`
	Shift        *cmdutil.JSONNumber `json:"detuning_per_cavity"`
	Extension    *cmdutil.JSONNumber `json:"extension_m"`
	Iterations   int                 `json:"iterations"`
	Verdict      string              `json:"verdict"`
	Reasons      []string            `json:"reasons"`
}

// IrisCavityOut is one cavity with its corrected dimensions (null unless
// every iris opening into it was sized and is valid: corrected_valid).
type IrisCavityOut struct {
	Resonator       int                 `json:"resonator"`
	F               float64             `json:"f_hz"`
	RadiusM         float64             `json:"radius_m"`
	LengthM         float64             `json:"length_m"`
	Shift           *cmdutil.JSONNumber `json:"iris_detuning"`
	Extension       *cmdutil.JSONNumber `json:"iris_extension_m"`
	Complete        bool                `json:"corrected_valid"`
	CorrectedRadius *cmdutil.JSONNumber `json:"corrected_radius_m"`
	CorrectedLength *cmdutil.JSONNumber `json:"corrected_length_m"`
}

// IrisCurveOut is one k-versus-radius curve.
type IrisCurveOut struct {
	CellRadiusM float64          `json:"cell_radius_m"`
	CellLengthM float64          `json:"cell_length_m"`
	Couplings   []string         `json:"couplings"`
	Points      []IrisCurvePoint `json:"points"`
}

// IrisCurvePoint is one point of a curve.
type IrisCurvePoint struct {
	RadiusM float64 `json:"radius_m"`
	K       float64 `json:"k"`
	KChange float64 `json:"k_change"`
	LowHz   float64 `json:"f_low_hz"`
	HighHz  float64 `json:"f_high_hz"`
	Shift   float64 `json:"detuning"`
}

// irisJSON returns the JSON form, nil without iris sizing.
func (r *Result) irisJSON() *IrisOut {
	pl := r.Irises
	if pl == nil {
		return nil
	}
	n := r.Design.Order()
	num := func(v float64) *cmdutil.JSONNumber { x := cmdutil.JSONNumber(v); return &x }
	o := &IrisOut{WallM: r.Opts.Iris.Wall, Modes: r.Opts.Iris.Modes, Passes: pl.Passes, Settled: pl.Converged, Change: pl.Change, Couplings: []IrisCouplingOut{}, Cavities: []IrisCavityOut{}, Curves: []IrisCurveOut{},
		Limits: map[string]float64{"max_relative_change": iris.MaxRelChange, "min_isolation_splits": iris.MinIsolation,
			"max_detuning_per_iris": iris.MaxShift, "length_tolerance": iris.DimensionTol}}
	for _, c := range pl.Couplings {
		st, why := iris.Judge(c)
		co := IrisCouplingOut{From: c.From, To: c.To, Kind: c.Kind, Method: c.Method.Key(), ThicknessM: c.Thickness, Where: c.Where,
			Iterations: c.Iterations, Verdict: strings.ReplaceAll(st.String(), " ", "_"), Reasons: append([]string{}, why...)}
		req := c.Required
		if c.Kind == "port" {
			co.Qext = &req
		} else {
			co.K = &req
		}
		if st == iris.Valid { // no number from a method outside its range
			co.RadiusM, co.Achieved = num(c.Radius), num(c.Achieved)
			co.KChange, co.RadiusChange, co.Shift = num(c.Change), num(c.RadiusChange), num(c.Shift)
			if c.Method != iris.BetheThick {
				co.Extension = num(c.Extension)
			}
		}
		o.Couplings = append(o.Couplings, co)
	}
	trusted := pl.Trusted()
	for i, t := range pl.Cavities {
		co := IrisCavityOut{Resonator: t.Resonator, F: t.F, RadiusM: t.Radius, LengthM: t.Length, Complete: trusted[i]}
		if trusted[i] {
			co.Shift, co.Extension, co.CorrectedRadius, co.CorrectedLength = num(t.Shift), num(t.Extension), num(t.CorrectedRadius), num(t.CorrectedLength)
		}
		o.Cavities = append(o.Cavities, co)
	}
	for _, cv := range pl.Curves {
		co := IrisCurveOut{CellRadiusM: cv.Pair.Radius, CellLengthM: cv.Pair.Length, Couplings: []string{}}
		for _, u := range cv.Used {
			co.Couplings = append(co.Couplings, couplingLabel(pl.Couplings[u], n))
		}
		for _, p := range cv.Points {
			co.Points = append(co.Points, IrisCurvePoint{RadiusM: p.Radius, K: p.K, KChange: p.KChange, LowHz: p.Low, HighHz: p.High, Shift: p.Shift})
		}
		o.Curves = append(o.Curves, co)
	}
	return o
}
