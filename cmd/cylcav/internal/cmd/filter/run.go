package filter

import (
	"bytes"
	"errors"
	"fmt"
	"math"
	"strings"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/figure"
	bandpass "cylcav/filter"
	"cylcav/filterplot"
	"cylcav/iris"
	"cylcav/physics"
	"cylcav/qfactor"
)

// Result is everything `cylcav filter` computed, before any output.
type Result struct {
	Opts *Options
	// Design is the synthesised filter; OrderChosen is true when its order
	// came from the rejections.
	Design      *bandpass.Design
	OrderChosen bool

	// Realisation holds the cavities; nil without them. Shape says how
	// their D/L was chosen.
	Realisation *bandpass.Realisation
	Shape       string
	// Irises is the realisation of the couplings as irises and holes
	// (--iris-wall); nil otherwise.
	Irises *iris.Plan

	// Q0 holds the unloaded Q per resonator used for the response (nil
	// for lossless); Lossless is true when none is finite.
	Q0       []float64
	Lossless bool

	// InsertionLoss is the midband (f0) insertion loss with the losses,
	// LosslessLoss the same without them. DelayEstimate is LosslessLoss
	// plus the first-order dissipation from the lossless group delay at f0
	// (bandpass.DelayLoss), Cohn LosslessLoss plus Cohn's 1959 dissipation
	// estimate (all-pole designs only); NaN where they do not apply (a
	// lossless response; Cohn: designs with transmission zeros).
	InsertionLoss, LosslessLoss, DelayEstimate, Cohn float64

	// Delay is the group delay of S21 with the losses.
	Delay bandpass.DelayStats

	Checks []bandpass.Check
	// Verdict is the overall verdict of Checks (bandpass.Overall).
	Verdict bandpass.Verdict
	// Warnings are findings for people, in a fixed order: wall models,
	// the realisation, the checks.
	Warnings []string
	// Sweep is the frequency range of the Touchstone file and the plot.
	Sweep [2]float64

	// Space is the result of zero placement and topology (space.go).
	Space SpaceResult

	// Written lists the files written, in order.
	Written []string

	touchstone, plot, sheet []byte
}

// runFilter computes the design, writes the files and prints the result.
func runFilter(opts *Options) error {
	r, err := Compute(opts)
	if err != nil {
		return err
	}
	fab, err := computeFab(opts, r)
	if err != nil {
		return err
	}
	// Every file is rendered before any is written (all or none).
	if err := r.buildSheet(fab); err != nil {
		return err
	}
	if err := r.writeFiles(); err != nil {
		return err
	}
	if opts.Format == cmdutil.JSON {
		return cmdutil.WriteJSON(opts.IO.Out, struct {
			Output
			Manufacture *FabOut `json:"manufacture,omitempty"`
		}{r.JSON(), fab.json()})
	}
	if err := r.WriteTable(opts.IO.Out); err != nil {
		return err
	}
	return writeFabTable(opts.IO.Out, fab)
}

// Compute does all the work of the command except writing: synthesis,
// realisation, response, checks, and the contents of the Touchstone file
// and the plot when asked for.
func Compute(opts *Options) (*Result, error) {
	r := &Result{Opts: opts, Cohn: math.NaN(), DelayEstimate: math.NaN()}
	spec := opts.Spec
	r.OrderChosen = spec.Order == 0
	d, err := r.design()
	if err != nil {
		return nil, err
	}
	spec = d.Spec
	r.Design = d
	n := d.Order()

	switch {
	case opts.Cavities:
		if err := r.realise(); err != nil {
			return nil, err
		}
		r.Q0 = r.Realisation.Q0()
	case opts.Q0 > 0:
		r.Q0 = make([]float64, n)
		for i := range r.Q0 {
			r.Q0[i] = opts.Q0
		}
	}
	r.Lossless = true
	for _, v := range r.Q0 {
		if !math.IsInf(v, 1) {
			r.Lossless = false
		}
	}

	f0 := spec.F0
	mid, err := d.Response([]float64{f0}, r.Q0)
	if err != nil {
		return nil, err
	}
	r.InsertionLoss = mid[0].InsertionLoss()
	ll, err := d.Response([]float64{f0}, nil)
	if err != nil {
		return nil, err
	}
	r.LosslessLoss = ll[0].InsertionLoss()
	if !r.Lossless {
		ld, err := d.Delay(nil)
		if err != nil {
			return nil, err
		}
		e, err := bandpass.DelayLoss(f0, ld.AtF0, r.Q0)
		if err != nil {
			return nil, err
		}
		r.DelayEstimate = r.LosslessLoss + e
		if d.G != nil {
			c, err := bandpass.CohnLoss(d.G, d.FBW, r.Q0)
			if err != nil {
				return nil, err
			}
			r.Cohn = r.LosslessLoss + c
		}
	}
	if r.Delay, err = d.Delay(r.Q0); err != nil {
		return nil, err
	}
	var spurious []bandpass.Spurious
	if r.Realisation != nil {
		spurious = r.Realisation.Spurious
	}
	if r.Checks, err = d.Check(r.Q0, spurious); err != nil {
		return nil, err
	}
	r.Verdict = bandpass.Overall(r.Checks)
	for _, c := range r.Checks {
		switch {
		case c.Info:
		case c.Verdict == bandpass.NotMet:
			r.Warnings = append(r.Warnings, "the response does not meet the specification: "+checkName(c)+" ("+failText(c)+")")
		case c.Verdict == bandpass.OutsideModel:
			r.Warnings = append(r.Warnings, "not checked: "+checkName(c)+": "+c.Note)
		}
	}

	lo, hi, err := bandpass.SweepRange(d, opts.Span)
	if err != nil {
		return nil, cmdutil.FlagError("span", fmt.Sprint(opts.Span), err)
	}
	r.Sweep = [2]float64{lo, hi}
	if opts.Touchstone != "" {
		if err := r.buildTouchstone(); err != nil {
			return nil, err
		}
	}
	if opts.Plot != "" {
		if err := r.buildPlot(); err != nil {
			return nil, err
		}
	}
	return r, nil
}

// realise sizes the cavities.
func (r *Result) realise() error {
	opts := r.Opts
	ratio := opts.Ratio
	if ratio == 0 {
		ds := cavity.DesignSpec{Mode: opts.Mode, Frequency: opts.Spec.F0, Fill: opts.Fill}
		if opts.Walls != nil {
			ds.Q = qfactor.Q0Constraint(opts.Mode, *opts.Walls)
		}
		des, err := cavity.Optimize(ds)
		if errors.Is(err, cavity.ErrInfeasible) {
			return cmdutil.Usagef("--mode %s: no D/L in %g..%g gives the mode a spurious-free clearance: %v; give --ratio", opts.Mode, cavity.DefaultRatioMin, cavity.DefaultRatioMax, err)
		}
		if err != nil {
			return fmt.Errorf("choosing D/L for %s at %s: %w", opts.Mode, physics.FormatFrequency(opts.Spec.F0, 6), err)
		}
		ratio = des.Ratio
		r.Shape = fmt.Sprintf("D/L = %.5g from the design optimiser (largest spurious-free clearance of %s at f0 for D/L in %g..%g: %.3g %%)",
			ratio, opts.Mode, cavity.DefaultRatioMin, cavity.DefaultRatioMax, 100*des.Clearance.Value)
	} else {
		r.Shape = fmt.Sprintf("D/L = %.5g (--ratio)", ratio)
	}
	ro := bandpass.RealiseOptions{
		Mode: opts.Mode, Shape: cavity.ByRatio(ratio), Fill: opts.Fill, Walls: opts.Walls, Hole: opts.Hole,
	}
	rz, err := bandpass.Realise(r.Design, ro)
	if errors.Is(err, cavity.ErrInfeasible) {
		return cmdutil.Usagef("cavities: %v", err)
	}
	if err != nil {
		return err
	}
	r.Realisation = rz
	if opts.Iris != nil {
		if err := r.sizeIrises(); err != nil {
			return err
		}
	}
	for _, w := range rz.WallWarnings {
		r.Warnings = append(r.Warnings, "walls: "+w)
	}
	r.Warnings = append(r.Warnings, condenseWarnings(rz)...)
	checks := make([][]qfactor.Warning, len(rz.Cavities))
	for i, cd := range rz.Cavities {
		checks[i] = cd.Validity
	}
	for _, c := range qfactor.Condense(checks) {
		r.Warnings = append(r.Warnings, fmt.Sprintf("cavity %d: %s", rz.Cavities[c.First].Resonator, c.Text("cavities")))
	}
	return nil
}

// comments are the header lines of the Touchstone file.
func (r *Result) comments() []string {
	d := r.Design
	out := []string{"written by cylcav filter"}
	out = append(out, d.Summary()...)
	out = append(out, "unloaded Q0 per resonator: "+q0Text(r.Q0, d.Order()))
	if rz := r.Realisation; rz != nil {
		c := rz.Cavities[0].Cavity
		out = append(out, fmt.Sprintf("cavities: %s, %s, first D = %s, L = %s", rz.Mode, r.Shape,
			physics.FormatLength(c.Diameter(), 6), physics.FormatLength(c.Length, 6)))
	}
	return append(out, FieldSolverNote)
}

func (r *Result) buildTouchstone() error {
	fs, err := bandpass.Sweep(r.Sweep[0], r.Sweep[1], r.Opts.Points)
	if err != nil {
		return cmdutil.FlagError("points", fmt.Sprint(r.Opts.Points), err)
	}
	pts, err := r.Design.Response(fs, r.Q0)
	if err != nil {
		return err
	}
	var b bytes.Buffer
	if err := bandpass.WriteTouchstone(&b, pts, r.comments()); err != nil {
		return err
	}
	r.touchstone = b.Bytes()
	return nil
}

func (r *Result) buildPlot() error {
	rp, err := filterplot.NewResponsePlot(r.Design, filterplot.PlotOptions{
		Lo: r.Sweep[0], Hi: r.Sweep[1], Q0: r.Q0, Notes: []string{FieldSolverNote},
	})
	if err != nil {
		return err
	}
	fig, err := rp.Figure(figure.DefaultTheme())
	if err != nil {
		return err
	}
	r.plot, err = figure.Encode(fig, r.Opts.PlotFormat, figure.Page{DPI: r.Opts.DPI})
	return err
}

// writeFiles writes the Touchstone file and the plot. Both targets are
// checked before either is written, so that a refused overwrite leaves no
// file behind; a failure of the second write removes the first file when
// it did not exist before.
func (r *Result) writeFiles() error {
	var files []cmdutil.File
	if r.Opts.Touchstone != "" {
		files = append(files, cmdutil.File{Flag: "touchstone", Path: r.Opts.Touchstone, Data: r.touchstone})
	}
	if r.Opts.Plot != "" {
		files = append(files, cmdutil.File{Flag: "plot", Path: r.Opts.Plot, Data: r.plot})
	}
	if r.Opts.Datasheet != "" {
		files = append(files, cmdutil.File{Flag: "datasheet", Path: r.Opts.Datasheet, Data: r.sheet})
	}
	files = append(files, r.spaceFiles()...)
	if err := cmdutil.WriteFiles(r.Opts.Force, files...); err != nil {
		return err
	}
	for _, f := range files {
		r.Written = append(r.Written, f.Path)
	}
	return nil
}

// q0Text describes the unloaded Qs of the response.
func q0Text(q0 []float64, n int) string {
	if len(q0) == 0 {
		return "infinite (lossless response)"
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, v := range q0 {
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	if lo == hi {
		return fmt.Sprintf("%s in each of the %d resonators", qText(lo), n)
	}
	return fmt.Sprintf("%s..%s", qText(lo), qText(hi))
}

// qText prints a Q to 5 significant digits, "infinite" for +Inf.
func qText(v float64) string {
	if math.IsInf(v, 1) {
		return "infinite"
	}
	return fmt.Sprintf("%.5g", v)
}

// condenseWarnings returns the realisation's warnings with the per-cavity
// spurious warnings merged into one line per mode.
func condenseWarnings(rz *bandpass.Realisation) []string {
	var out []string
	for _, w := range rz.Warnings {
		if !strings.HasPrefix(w, "spurious ") {
			out = append(out, w)
		}
	}
	ff := func(f float64) string { return physics.FormatFrequency(f, 6) }
	for _, g := range rz.SpuriousGroups() {
		at := ff(g.FMin)
		if g.FMax > g.FMin {
			at = ff(g.FMin) + ".." + ff(g.FMax)
		}
		switch {
		case g.InPassband && !g.Companion:
			out = append(out, fmt.Sprintf("spurious %s at %s lies in the passband (cavities %s)", g.Mode, at, resonators(g.Resonators)))
		case g.Stopband >= 0:
			sb := rz.Stopbands[g.Stopband]
			out = append(out, fmt.Sprintf("spurious %s at %s lies in the rejection band %s..%s (%g dB): the filter will not reject there (cavities %s)",
				g.Mode, at, ff(sb.Low), ff(sb.High), sb.Attenuation, resonators(g.Resonators)))
		}
	}
	return out
}
