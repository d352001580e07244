package datasheet

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/plot/vg"

	"cylcav/figure"
	"cylcav/filter"
	"cylcav/filterplot"
	"cylcav/iris"
	"cylcav/physics"
)

// Filter is a filter design with everything computed for it: the input of
// FromFilter. FromFilter recomputes no verdict: the checks, the iris
// verdicts (iris.Judge) and the manufacturing results are shown as given;
// it computes only the curves of its charts.
type Filter struct {
	// Title names the filter (empty: one made from the design).
	Title string
	// Design is the synthesised filter; OrderChosen is true when its order
	// came from the rejections.
	Design      *filter.Design
	OrderChosen bool
	// Realisation holds the cavities (nil: none sized); Shape says how
	// their D/L was chosen, FillLabel names their fill.
	Realisation *filter.Realisation
	Shape       string
	FillLabel   string
	// Irises realises every coupling as an iris or hole (nil: not sized),
	// IrisWall is the wall thickness at them, m.
	Irises   *iris.Plan
	IrisWall float64
	// Q0 holds the unloaded Q per resonator of the response (empty:
	// lossless).
	Q0 []float64
	// InsertionLoss and LosslessLoss are the midband insertion loss with
	// and without the losses, dB; Delay the group delay of S21.
	InsertionLoss, LosslessLoss float64
	Delay                       filter.DelayStats
	// Checks are Design.Check's lines for the response with Q0 and the
	// realisation's spurious resonances.
	Checks []filter.Check
	// Sweep is the frequency range of the response chart, Hz.
	Sweep [2]float64
	// The manufacturing analyses, each nil when it was not asked for.
	Yield  *filter.YieldResult
	Screws []filter.ScrewTuning
	Drift  *filter.DriftResult
	Power  *filter.PowerResult
	// Warnings are the findings of the design for people; Notes the
	// standing notes of the tool (sign convention, field-solver note).
	Warnings, Notes []string
}

// Headings of the filter datasheet's sections, in order (a section with
// nothing to show is left out: the realisation without cavities, the
// manufacturing analyses when none was asked for).
const (
	SecSpec        = "Specification and verdicts"
	SecTopology    = "Topology"
	SecMatrix      = "Coupling matrix"
	SecResonators  = "Resonators"
	SecRealisation = "Coupling realisation"
	SecResponse    = "Response"
	SecManufacture = "Manufacture: tolerance, temperature, power"
	SecCautions    = "Cautions"
	SecConventions = "Conventions"
)

// filterMethod is the closing note of a filter datasheet.
const filterMethod = "Synthesis by the generalised Chebyshev recursion (Cameron, IEEE T-MTT 47(4), 1999) and the N+2 coupling matrix (Cameron, Kudsia & Mansour 2007, ch. 8); response of the coupling matrix with the resonators' unloaded Q; cavities by the closed-cylinder resonance condition (Pozar, Microwave Engineering, 4th ed., sec. 6.4); irises by mode matching, holes by Bethe's small-aperture theory; manufacturing figures as described in the cylcav documentation."

// VerdictText is the verdict column of a specification line on the
// datasheet: "info" for an information line, else the check's verdict
// (filter.Verdict.String: "pass", "fail", "outside model").
func VerdictText(c filter.Check) string {
	if c.Info {
		return "info"
	}
	return c.Verdict.String()
}

// FromFilter assembles the datasheet of a filter, drawing its charts in
// theme th: the specification with the verdict of every mask line, the
// topology diagram, the coupling matrix, the resonators, the coupling
// realisation, the response charts, the manufacturing results that were
// computed, the cautions and the conventions.
func FromFilter(in Filter, th figure.Theme) (*Sheet, error) {
	d := in.Design
	if d == nil || d.Folded == nil {
		return nil, errors.New("datasheet: a filter datasheet needs a synthesised design")
	}
	s := d.Spec
	n := d.Order()
	f1, f2 := filter.BandpassFrequency(-1, s.F0, s.BW), filter.BandpassFrequency(1, s.F0, s.BW)
	rz := in.Realisation
	sh := &Sheet{Kind: "Bandpass filter datasheet", Method: filterMethod}
	sh.Title = in.Title
	if sh.Title == "" {
		sh.Title = fmt.Sprintf("%d-resonator %s bandpass filter at %s", n, familyWord(s.Family), freq(s.F0))
	}
	// The headline is also the PDF's running footer: kept short.
	sh.Headline = fmt.Sprintf("passband %s .. %s (FBW %.4g %%), %s", freq(f1), freq(f2), 100*d.FBW, d.Topology.Description())
	if rz != nil {
		sh.Headline += fmt.Sprintf(", %s cavities", rz.Mode)
	}
	overall := filter.Overall(in.Checks)
	sh.Facts = []KV{
		{"Order N", strconv.Itoa(n)},
		{"Centre f0", freq(s.F0)},
		{"Bandwidth", freq(s.BW)},
	}
	if s.Family == filter.Chebyshev {
		sh.Facts = append(sh.Facts, KV{"Return loss", dB(s.ReturnLoss)})
	}
	sh.Facts = append(sh.Facts,
		KV{"Insertion loss at f0", dB(in.InsertionLoss)},
		KV{"Group delay at f0", ns(in.Delay.AtF0)},
		KV{"Specification", overallText(overall)},
	)
	if rz != nil {
		sh.Facts = append(sh.Facts, KV{"Cavities", rz.Mode.String()})
	}
	if len(in.Q0) > 0 {
		sh.Facts = append(sh.Facts, KV{"Unloaded Q0", q0Range(in.Q0)})
	}
	if y := in.Yield; y != nil && !math.IsNaN(y.Yield) {
		sh.Facts = append(sh.Facts, KV{"Yield as machined", fmt.Sprintf("%.1f %%", 100*y.Yield)})
	}
	if p := in.Power; p != nil {
		sh.Facts = append(sh.Facts, KV{"Power limit (air)", physics.FormatSI(p.Limit, "W", 3)})
	}

	// 1. Specification and the verdict of every line.
	spec := Table{Caption: "Specification", Header: []string{"Quantity", "Value"}}
	spec.add(false, "Centre frequency f0 (geometric)", freq(s.F0))
	spec.add(false, "Passband f1 .. f2", freq(f1)+" .. "+freq(f2))
	spec.add(false, "Bandwidth bw, fractional", fmt.Sprintf("%s, %.5g %%", freq(s.BW), 100*d.FBW))
	switch s.Family {
	case filter.Chebyshev:
		spec.add(false, "Response", fmt.Sprintf("Chebyshev, return loss %s (ripple %s)", dB(s.ReturnLoss), dB(s.Ripple)))
	case filter.Butterworth:
		spec.add(false, "Response", "Butterworth (maximally flat), 3.01 dB at the band edges")
	}
	for _, g := range d.Mask().Regions {
		what := fmt.Sprintf("≥ %s from %s", dB(g.Attenuation), freq(g.F))
		end := g.High
		if !g.Above {
			end = g.Low
		}
		switch {
		case g.OutsideModel:
			what += " outwards (beyond the model range)"
		default:
			what += " to " + freq(end)
		}
		spec.add(false, "Rejection", what)
	}
	how := "given"
	if in.OrderChosen {
		how = "the smallest that meets every rejection band"
	}
	spec.add(false, "Order N", fmt.Sprintf("%d (%s)", n, how))
	if len(d.Zeros) > 0 {
		var zs []string
		for _, z := range d.Zeros {
			zs = append(zs, freq(filter.BandpassFrequency(z, s.F0, s.BW)))
		}
		spec.add(false, "Transmission zeros", strings.Join(zs, ", "))
	}
	checks := Table{Caption: "Verdict per mask line (the specification check of the response with the unloaded Q0 and the cavities' spurious resonances)",
		Header: []string{"Requirement", "Required", "Achieved", "Verdict"}, Num: []bool{false, true, true, false}}
	var checkNotes []string
	for _, c := range in.Checks {
		v := VerdictText(c)
		checks.add(!c.Info && c.Verdict != filter.Met, checkName(c), requiredText(c), achievedText(c), v)
		if !c.Info && c.Verdict != filter.Met && c.Note != "" {
			checkNotes = append(checkNotes, checkName(c)+": "+c.Note)
		}
	}
	specBlocks := []Block{{Table: &spec}, {Table: &checks}}
	specBlocks = append(specBlocks, Block{Para: "Overall: " + overallText(overall) + ". Return loss and ripple are checked on the designed (lossless) response; info lines show the effect of the losses."})
	if len(checkNotes) > 0 {
		specBlocks = append(specBlocks, Block{List: &List{Lead: "Lines not met:", Class: "cautions", Items: checkNotes}})
	}
	sh.Sections = append(sh.Sections, Section{SecSpec, specBlocks})

	// 2. Topology diagram.
	tp, err := filterplot.NewTopology(d)
	if err != nil {
		return nil, err
	}
	tf, err := tp.Figure(th)
	if err != nil {
		return nil, err
	}
	rows := 1.0
	for _, nd := range tp.Nodes {
		if nd.Y != 0 {
			rows = 2
		}
	}
	// The diagram's notes follow it as a note, so that the figure stays
	// short enough to share a page with the specification.
	tf.Notes = nil
	topo := &Chart{ID: "topology", Title: "Coupling topology",
		Caption: "Resonators and their couplings as realised by the coupling matrix of section 3 (" + tp.Form + ").",
		Figure:  tf, Page: figure.Page{Width: 7.5 * vg.Inch, Height: vg.Length(1.6+0.55*rows) * vg.Inch}}
	sh.Sections = append(sh.Sections, Section{SecTopology, []Block{{Chart: topo}, {Note: strings.Join(tp.Notes, " ")}}})

	// 3. Coupling matrix, couplings and external Q.
	mt := Table{Caption: fmt.Sprintf("Coupling matrix M, normalised (N+2 = %d, rows and columns S, 1..%d, L; |M| < %g set as 0)", n+2, n, filter.MatrixZero)}
	mt.Header = append(mt.Header, "")
	mt.Num = append(mt.Num, false)
	for j := 0; j < n+2; j++ {
		mt.Header = append(mt.Header, rowName(j, n))
		mt.Num = append(mt.Num, true)
	}
	for i := 0; i < n+2; i++ {
		row := []string{rowName(i, n)}
		for j := 0; j < n+2; j++ {
			row = append(row, minus(strconv.FormatFloat(d.Entry(i, j), 'f', 4, 64)))
		}
		mt.add(false, row...)
	}
	kt := Table{Caption: "Physical couplings k = FBW·M and external Q", Header: []string{"Coupling", "M", "k", "Kind"}, Num: []bool{false, true, true, false}}
	for i := 1; i < n; i++ {
		kt.add(false, fmt.Sprintf("%d–%d", i, i+1), num6(d.Entry(i, i+1)), num6(d.FBW*d.Entry(i, i+1)), "main line")
	}
	for i := 0; i < n+2; i++ {
		for j := i + 2; j < n+2; j++ {
			if m := d.Entry(i, j); m != 0 {
				kt.add(false, rowName(i, n)+"–"+rowName(j, n), num6(m), num6(d.FBW*m), "cross")
			}
		}
	}
	kt.add(true, "Qext input (S–1)", "", fmt.Sprintf("%.6g", d.QextIn), "external Q")
	kt.add(true, "Qext output ("+strconv.Itoa(n)+"–L)", "", fmt.Sprintf("%.6g", d.QextOut), "external Q")
	sh.Sections = append(sh.Sections, Section{SecMatrix, []Block{{Table: &mt}, {Table: &kt}}})

	// 4. Resonators.
	sh.Sections = append(sh.Sections, Section{SecResonators, resonatorBlocks(in)})

	// 5. Coupling realisation.
	if bs := realisationBlocks(in); len(bs) > 0 {
		sh.Sections = append(sh.Sections, Section{SecRealisation, bs})
	}

	// 6. Response charts.
	rb, err := responseBlocks(in, th)
	if err != nil {
		return nil, err
	}
	sh.Sections = append(sh.Sections, Section{SecResponse, rb})

	// 7. Manufacture.
	if bs := manufactureBlocks(in); len(bs) > 0 {
		sh.Sections = append(sh.Sections, Section{SecManufacture, bs})
	}

	// 8. Cautions: the design's warnings, the power cautions, then the
	// standing safety notes.
	var cautions []Block
	if len(in.Warnings) > 0 {
		cautions = append(cautions, Block{List: &List{Lead: "For this design:", Class: "cautions", Items: in.Warnings}})
	}
	if p := in.Power; p != nil && len(p.Cautions) > 0 {
		cautions = append(cautions, Block{List: &List{Lead: "Power handling:", Class: "cautions", Items: p.Cautions}})
	}
	cautions = append(cautions, Block{List: &List{Lead: "Safety:", Class: "safety", Items: SafetyNotes()}})
	sh.Sections = append(sh.Sections, Section{SecCautions, cautions})

	// 9. Conventions.
	conv := []Block{{Para: "Mode index convention: TE_nmp and TM_nmp, n azimuthal, m radial, p axial."}}
	for _, nt := range in.Notes {
		conv = append(conv, Block{Para: nt})
	}
	sh.Sections = append(sh.Sections, Section{SecConventions, conv})
	return sh, nil
}

// resonatorBlocks is the resonator table: mode, frequency, D, L (and the
// lengths corrected for the irises), Q0 and, with a tolerance analysis,
// the tuning range each resonator needs and the screw that covers it.
func resonatorBlocks(in Filter) []Block {
	d, rz := in.Design, in.Realisation
	n := d.Order()
	if rz == nil {
		q := "infinite (lossless response)"
		if len(in.Q0) > 0 {
			q = q0Range(in.Q0)
		}
		return []Block{{Para: "No cavities were sized (no mode, wall, fill or ratio given): the resonators are the coupling matrix's, with unloaded Q " + q + "."}}
	}
	t := Table{Caption: fmt.Sprintf("Cavities: %s, fill %s, %s", rz.Mode, in.FillLabel, in.Shape)}
	t.Header = []string{"Resonator", "Mode", "f", "D", "L"}
	t.Num = []bool{false, false, true, true, true}
	var trusted []bool
	if pl := in.Irises; pl != nil {
		trusted = pl.Trusted()
		t.Header = append(t.Header, "L with irises")
		t.Num = append(t.Num, true)
	}
	t.Header = append(t.Header, "Q0")
	t.Num = append(t.Num, true)
	for i, c := range rz.Cavities {
		row := []string{strconv.Itoa(c.Resonator), rz.Mode.String(), freq(c.F), length(c.Cavity.Diameter()), length(c.Cavity.Length)}
		if pl := in.Irises; pl != nil {
			v := "–"
			if trusted[i] {
				tu := pl.Cavities[i]
				if pl.Mode.P == 0 {
					v = "D " + length(2*tu.CorrectedRadius)
				} else {
					v = length(tu.CorrectedLength)
				}
			}
			row = append(row, v)
		}
		row = append(row, qText(c.Q0))
		t.add(false, row...)
	}
	out := []Block{{Table: &t}}
	if in.Irises != nil {
		out = append(out, Block{Note: "L with irises: the length with which each cavity, loaded by the irises on its end plates, resonates at its frequency (TM0m0: the diameter); – where an iris opening into it is not realised or outside its range."})
	}
	// The tuning range each resonator needs (tolerance analysis).
	if len(in.Screws) == n {
		tt := Table{Caption: "Tuning range each resonator needs (from the machining tolerance) and the tuning screw that covers it",
			Header: []string{"Resonator", "Tuning needed", "Span", "Screw at", "Screw tip radius"},
			Num:    []bool{false, true, true, false, true}}
		for _, sc := range in.Screws {
			at := "end plate, ρ = " + micro(physics.FormatLength(sc.At.Rho, 3))
			if sc.OnSide {
				at = "side wall, z = " + micro(physics.FormatLength(sc.At.Z, 3))
			}
			rad := "–"
			if !math.IsNaN(sc.Radius) {
				rad = micro(physics.FormatLength(sc.Radius, 4))
				if !sc.Valid {
					rad += " (outside Slater's range)"
				}
			}
			tt.add(false, strconv.Itoa(sc.Resonator), signedFreq(-sc.High)+" .. "+signedFreq(-sc.Low), physics.FormatFrequency(sc.Span, 4), at, rad)
		}
		out = append(out, Block{Table: &tt}, Block{Note: "Tuning needed: the frequency change that brings every Monte Carlo sample of the resonator back to its design frequency; the screw tip is the hemispherical boss (Slater perturbation) whose shift spans it. The Slater model holds for a tip radius up to 5 % of the wavelength and 20 % of the gap to the other walls."})
	}
	// Spurious resonances near the band.
	st := Table{Caption: fmt.Sprintf("Spurious resonances of the cavities from %s to %s", freq(rz.Window[0]), freq(rz.Window[1])),
		Header: []string{"Mode", "f", "Offset from f0", "Cavities", "Where"}, Num: []bool{false, true, true, false, false}}
	for _, g := range rz.SpuriousGroups() {
		at, off := freq(g.FMin), signedPct(g.FMin/d.Spec.F0-1)
		if g.FMax > g.FMin {
			at += " .. " + freq(g.FMax)
			off += " .. " + signedPct(g.FMax/d.Spec.F0-1)
		}
		st.add(g.Alarm(), g.Mode.String(), at, off, resonatorList(g.Resonators), g.Where())
	}
	if len(st.Rows) == 0 {
		out = append(out, Block{Para: st.Caption + ": none."})
	} else {
		out = append(out, Block{Table: &st})
	}
	return out
}

// realisationBlocks is the coupling-realisation table: the irises (radius,
// thickness, method, iris.Judge's verdict and its reasons), or without
// them the holes of the main line and what the other couplings need.
func realisationBlocks(in Filter) []Block {
	d, rz := in.Design, in.Realisation
	if rz == nil {
		return nil
	}
	n := d.Order()
	if pl := in.Irises; pl != nil {
		t := Table{Caption: fmt.Sprintf("Irises and holes (%s cavities on one axis, walls %s thick)", pl.Mode, length(in.IrisWall)),
			Header: []string{"Coupling", "Required", "Method", "Radius", "Thickness", "Achieved", "Verdict"},
			Num:    []bool{false, true, false, true, true, true, false}}
		var notes []string
		for _, c := range pl.Couplings {
			req := "k " + num6(c.Required)
			if c.Kind == "port" {
				req = fmt.Sprintf("Qext %.6g", c.Required)
			}
			st, why := iris.Judge(c)
			radius, ach := "–", "–"
			if st == iris.Valid { // no number from a method outside its range
				radius, ach = length(c.Radius), fmt.Sprintf("%.6g", c.Achieved)
			}
			label := rowName(c.From, n) + "–" + rowName(c.To, n)
			t.add(st != iris.Valid, label, req, c.Method.String(), radius, length(c.Thickness), ach, st.String())
			for _, w := range why {
				notes = append(notes, label+": "+w)
			}
		}
		out := []Block{{Table: &t}}
		if len(notes) > 0 {
			out = append(out, Block{List: &List{Lead: "Couplings not valid as sized:", Class: "cautions", Items: notes}})
		}
		settled := fmt.Sprintf("The corrected cavity lengths settled in %d passes.", pl.Passes)
		if !pl.Converged {
			settled = fmt.Sprintf("The corrected cavity lengths did NOT settle in %d passes (last change %.2g): take them as estimates.", pl.Passes, pl.Change)
		}
		out = append(out, Block{Note: "Radius and achieved value are given only where the method holds (verdict valid). " + settled})
		return out
	}
	t := Table{Caption: "Coupling realisation", Header: []string{"Coupling", "Required", "Realisation"}, Num: []bool{false, true, false}}
	for _, a := range rz.Apertures {
		how := a.Note
		if a.Sized {
			where := "ρ/a"
			if a.Wall == filter.SideWall {
				where = "z/L"
			}
			how = fmt.Sprintf("hole of radius %s in the %s at %s = %.4g (k = %.6f)", length(a.Radius), a.Wall, where, a.Position, a.K)
			if !a.Valid() {
				how += "; " + a.Note
			}
		}
		t.add(a.Sized && !a.Valid(), fmt.Sprintf("%d–%d", a.From, a.To), "k "+num6(a.Required), how)
	}
	for _, c := range rz.Cross {
		t.add(false, rowName(c.From, n)+"–"+rowName(c.To, n), "k "+num6(c.K), "by a field solver or by measurement (depends on the layout)")
	}
	for i, p := range rz.Ports {
		name := [2]string{"input", "output"}[i]
		t.add(false, fmt.Sprintf("%s (resonator %d)", name, p.Resonator), fmt.Sprintf("Qext %.5g", p.Qext),
			fmt.Sprintf("by a field solver or by measurement: reflected group delay %s", ns(p.GroupDelay)))
	}
	return []Block{{Table: &t}}
}

// responseBlocks are the response charts and the loss figures.
func responseBlocks(in Filter, th figure.Theme) ([]Block, error) {
	d := in.Design
	s := d.Spec
	page := figure.Page{Width: 7.5 * vg.Inch, Height: 6.2 * vg.Inch}
	rp, err := filterplot.NewResponsePlot(d, filterplot.PlotOptions{Lo: in.Sweep[0], Hi: in.Sweep[1], Q0: in.Q0})
	if err != nil {
		return nil, err
	}
	rf, err := rp.Figure(th)
	if err != nil {
		return nil, err
	}
	lt := Table{Caption: "Losses and group delay", Header: []string{"Quantity", "Value"}}
	lt.add(false, "Unloaded Q0", q0Range(in.Q0))
	lt.add(true, "Insertion loss at f0", dB(in.InsertionLoss)+" (lossless "+dB(in.LosslessLoss)+")")
	lt.add(false, "Group delay of S21 at f0", ns(in.Delay.AtF0))
	lt.add(false, "Group delay across the passband", ns(in.Delay.Min)+" .. "+ns(in.Delay.Max)+" (variation "+ns(in.Delay.Variation())+")")
	out := []Block{
		{Table: &lt},
		{Chart: &Chart{ID: "response", Title: "Response with the specification mask",
			Caption: "|S21| and |S11| with the return-loss line and the rejection regions, and the group delay of S21, from the coupling matrix with the unloaded Q0.",
			Figure:  rf, Page: page}},
	}
	pf, err := filterplot.PassbandFigure(th, d, in.Q0, 0)
	if err != nil {
		return nil, err
	}
	out = append(out, Block{Chart: &Chart{ID: "passband", Title: "Passband insertion loss",
		Caption: "The passband magnified: |S21| with the losses against the lossless design.",
		Figure:  pf, Page: figure.Page{Width: 7.5 * vg.Inch, Height: 4.2 * vg.Inch}}})
	rz := in.Realisation
	if rz == nil {
		out = append(out, Block{Note: "Wide view with spurious resonances: omitted, no cavities were sized, so there are no spurious resonances to mark."})
		return out, nil
	}
	lo := math.Max(rz.Window[0], s.F0*(1-filter.ModelOffset))
	hi := math.Min(rz.Window[1], s.F0*(1+filter.ModelOffset))
	var ms []filterplot.Marker
	for _, g := range rz.SpuriousGroups() {
		// One marker per mode, at the middle of its range over the
		// resonators (the table gives the range).
		ms = append(ms, filterplot.Marker{F: (g.FMin + g.FMax) / 2, Label: g.Mode.String(), Alarm: g.Alarm()})
	}
	notes := []string{"The coupling-matrix response knows only the wanted mode: each spurious resonance of the cavities is marked where it lies, and near it the built filter passes or reflects power that this curve does not show."}
	if len(ms) == 0 {
		notes = append(notes, "No spurious resonance of the cavities lies in this range.")
	}
	wf, err := filterplot.WideFigure(th, d, in.Q0, lo, hi, 0, ms, notes)
	if err != nil {
		return nil, err
	}
	out = append(out, Block{Chart: &Chart{ID: "wide", Title: "Wide view",
		Caption: fmt.Sprintf("|S21| and |S11| over f0 ± %g %% (the spurious search window and the model's range) with the cavities' spurious resonances marked.", 100*(hi-lo)/(2*s.F0)),
		Figure:  wf, Page: figure.Page{Width: 7.5 * vg.Inch, Height: 4.6 * vg.Inch}}})
	return out, nil
}

// manufactureBlocks are the tolerance/yield, temperature and power
// results that were computed.
func manufactureBlocks(in Filter) []Block {
	var out []Block
	if y := in.Yield; y != nil {
		m := y.Machining
		yt := Table{Caption: fmt.Sprintf("Machining tolerance: Monte Carlo, %d samples, seed %d, errors normal with tolerance = 3σ", y.Samples, y.Seed),
			Header: []string{"Quantity", "Value"}}
		tols := []string{"D ±" + micro(physics.FormatLength(m.Diameter, 3)), "L ±" + micro(physics.FormatLength(m.Length, 3))}
		if m.Hole > 0 {
			tols = append(tols, "hole radii ±"+micro(physics.FormatLength(m.Hole, 3)))
		}
		if m.Coupling > 0 {
			tols = append(tols, fmt.Sprintf("other couplings ±%.3g %%", 100*m.Coupling))
		}
		yt.add(false, "Tolerances", strings.Join(tols, ", "))
		if y.ReturnLoss > 0 {
			yt.add(false, "Return loss accepted", dB(y.ReturnLoss))
		}
		if !math.IsNaN(y.Yield) {
			v := fmt.Sprintf("%.1f %% ± %.1f %%", 100*y.Yield, 100*y.YieldStd)
			if y.Outside > 0 {
				v += fmt.Sprintf(" (%.1f %% not checkable: outside the model)", 100*y.Outside)
			}
			yt.add(true, "Yield as machined (before tuning)", v)
		}
		out = append(out, Block{Table: &yt})
		if len(y.Lines) > 0 {
			lt := Table{Caption: "Each specification line over the samples (dB)",
				Header: []string{"Line", "Required", "Nominal", "Mean", "Std", "5 %", "95 %", "Met"},
				Num:    []bool{false, true, true, true, true, true, true, true}}
			for _, l := range y.Lines {
				lt.add(false, checkName(l.Check), numDB(l.Required), numDB(l.Achieved), numDB(l.Scatter.Mean), numDB(l.Scatter.Std),
					numDB(l.P05), numDB(l.P95), fmt.Sprintf("%.1f %%", 100*l.Met))
			}
			out = append(out, Block{Table: &lt})
		}
		if len(y.Points) > 0 {
			pt := Table{Caption: "Spread of the response at the mask points (Monte Carlo std and the linearised std)",
				Header: []string{"f", "S21", "Std", "Linear", "S11", "Std", "Linear"},
				Num:    []bool{true, true, true, true, true, true, true}}
			for _, p := range y.Points {
				pt.add(false, freq(p.F), numDB(p.S21DB.Nominal), numDB(p.S21DB.Std), numDB(p.S21DB.Linear),
					numDB(p.S11DB.Nominal), numDB(p.S11DB.Std), numDB(p.S11DB.Linear))
			}
			out = append(out, Block{Table: &pt}, Block{Note: "The tuning range each resonator needs and its screw are in the section on the resonators."})
		}
	}
	if dr := in.Drift; dr != nil {
		t := Table{Caption: fmt.Sprintf("Temperature drift (dimensions at %s; couplings and Q0 kept)", temp(dr.Reference)),
			Header: []string{"Resonator", "df/dT", "Shift at " + temp(dr.Low.T), "Shift at " + temp(dr.High.T)},
			Num:    []bool{false, true, true, true}}
		for i := range dr.DfDT {
			t.add(false, strconv.Itoa(i+1), signedFreq(dr.DfDT[i])+"/K", signedFreq(dr.Low.Shift[i]), signedFreq(dr.High.Shift[i]))
		}
		out = append(out, Block{Table: &t})
		vt := Table{Caption: "Specification at the ends of the temperature range", Header: []string{"Temperature", "Verdict", "Lines not met"}}
		for _, e := range []filter.DriftEnd{dr.Low, dr.High} {
			var bad []string
			for _, c := range e.Checks {
				if !c.Info && c.Verdict != filter.Met {
					bad = append(bad, checkName(c)+" "+achievedText(c))
				}
			}
			vt.add(e.Verdict != filter.Met, temp(e.T), overallText(e.Verdict), strings.Join(bad, "; "))
		}
		out = append(out, Block{Table: &vt})
	}
	if p := in.Power; p != nil {
		t := Table{Caption: fmt.Sprintf("Power handling at %s input (largest stored energy over the passband; breakdown field %s, air at %.4g kPa)",
			physics.FormatSI(p.Power, "W", 4), fmt.Sprintf("%.4g MV/m", p.Breakdown/1e6), p.Pressure/1e3),
			Header: []string{"Resonator", "Energy", "At", "Peak E", "Wall H", "Margin", "Power limit"},
			Num:    []bool{false, true, true, true, true, true, true}}
		for _, r := range p.Resonators {
			t.add(r.Resonator == p.Worst, strconv.Itoa(r.Resonator), microSI(physics.FormatSI(r.Energy, "J", 4)), freq(r.F),
				fmt.Sprintf("%.4g MV/m", r.EPeak/1e6), physics.FormatSI(r.HWall, "A/m", 4), fmt.Sprintf("%.3g ×", r.Margin), physics.FormatSI(r.MaxPower, "W", 4))
		}
		out = append(out, Block{Table: &t}, Block{Para: fmt.Sprintf("Power limit (first estimate): %s, set by resonator %d. Read the section Cautions before applying power.", physics.FormatSI(p.Limit, "W", 4), p.Worst)})
	}
	return out
}

// rowName names row i of an N+2 matrix: S, 1..N, L.
func rowName(i, n int) string {
	switch i {
	case 0:
		return "S"
	case n + 1:
		return "L"
	}
	return strconv.Itoa(i)
}

func familyWord(f filter.Family) string {
	if f == filter.Butterworth {
		return "Butterworth"
	}
	return "Chebyshev"
}

// checkName names a check line: "rejection from 10.25 GHz".
func checkName(c filter.Check) string {
	if c.F != 0 {
		return c.Name + " from " + freq(c.F)
	}
	return c.Name
}

func requiredText(c filter.Check) string {
	if math.IsNaN(c.Required) {
		return "(info)"
	}
	if c.AtLeast {
		return "≥ " + dB(c.Required)
	}
	return "≤ " + dB(c.Required)
}

func achievedText(c filter.Check) string {
	if c.Verdict == filter.OutsideModel && math.IsNaN(c.Achieved) {
		return "not computed"
	}
	t := dB(c.Achieved)
	if c.Name == "rejection" && c.Worst != 0 {
		t += " at " + freq(c.Worst)
	}
	return t
}

func overallText(v filter.Verdict) string {
	switch v {
	case filter.Met:
		return "pass"
	case filter.NotMet:
		return "FAIL"
	}
	return "not fully checked"
}

// dB prints a level to 4 significant digits with its unit.
func dB(v float64) string {
	if math.IsInf(v, 1) {
		return "∞ dB"
	}
	return minus(strconv.FormatFloat(v, 'g', 4, 64)) + " dB"
}

// numDB prints a level without its unit, "–" when not finite.
func numDB(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "–"
	}
	return minus(strconv.FormatFloat(v, 'g', 4, 64))
}

// microSI writes the prefix micro as µ ("1.2 uJ" -> "1.2 µJ").
func microSI(s string) string { return strings.Replace(s, " u", " µ", 1) }

func num6(v float64) string { return minus(strconv.FormatFloat(v, 'f', 6, 64)) }

func ns(sec float64) string { return strconv.FormatFloat(sec*1e9, 'g', 4, 64) + " ns" }

// q0Range prints the unloaded Qs of the resonators.
func q0Range(q0 []float64) string {
	if len(q0) == 0 {
		return "∞ (lossless)"
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, v := range q0 {
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	if lo == hi {
		return qText(lo)
	}
	return qText(lo) + " .. " + qText(hi)
}

func resonatorList(r []int) string {
	if len(r) > 1 && r[len(r)-1]-r[0] == len(r)-1 {
		return fmt.Sprintf("%d–%d", r[0], r[len(r)-1])
	}
	s := make([]string, len(r))
	for i, v := range r {
		s[i] = strconv.Itoa(v)
	}
	return strings.Join(s, ", ")
}
