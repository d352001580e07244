package datasheet

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/plot/vg"

	"cylcav/cavity"
	"cylcav/design"
	"cylcav/figure"
	"cylcav/modechart"
	"cylcav/physics"
)

// cavitySheet is the content of a cavity design's datasheet, part by
// part, before FromDesign arranges it into the sections of a Sheet.
type cavitySheet struct {
	Title    string
	Demo     bool   // the built-in demo scenario (its title is the sheet's)
	Headline string // one line: mode, frequency, D and L
	Facts    []KV   // the key figures at the top

	Dimensions Table
	Modes      Table // modes near the band
	ModesNote  string
	Q          Table
	QNote      string
	Clearance  Table
	Sensitive  Table
	Spread     Table
	Tuning     Table
	// Accel and AccelNotes are the section "Operating figures"
	// (accel.go: superconducting, bench, accelerator and bulb figures);
	// empty for other designs.
	Accel      []Table
	AccelNotes []string
	Materials  []Material
	Cautions   []string // from the design
	Safety     []string // always printed
	Convention string

	Charts []Chart
}

// KV is a labelled value.
type KV struct{ Key, Value string }

// Table is a captioned table of strings.
type Table struct {
	Caption string
	Header  []string
	Rows    [][]string
	// Emph marks rows to emphasise (the wanted mode); missing entries
	// are false.
	Emph []bool
	// Num marks columns of numbers, set right-aligned.
	Num []bool
}

// IsEmph reports whether row i is emphasised.
func (t Table) IsEmph(i int) bool { return i < len(t.Emph) && t.Emph[i] }

// IsNum reports whether column j holds numbers.
func (t Table) IsNum(j int) bool { return j < len(t.Num) && t.Num[j] }

func (t *Table) add(emph bool, cells ...string) {
	t.Rows = append(t.Rows, cells)
	t.Emph = append(t.Emph, emph)
}

// Material is a material and where its values come from.
type Material struct {
	Role, Name, Description string
	Values                  []KV
	Source, Note            string
}

// Chart is one figure of the datasheet, rendered from its figure in each
// output format.
type Chart struct {
	ID, Title, Caption string
	Figure             *figure.Figure
	Page               figure.Page
}

// modeWindow is the half-width of the band of the mode table and the
// Q-versus-frequency chart, as a fraction of the design frequency.
const modeWindow = 0.25

// FromDesign assembles the datasheet of a single-cavity design result,
// drawing its charts in theme th: ten sections from the dimensions to the
// cautions, with the mode chart, Q0 against frequency, the trade-off and
// the tuning curve (no Q section and no Q chart without a wall metal).
func FromDesign(r design.Result, th figure.Theme) (*Sheet, error) {
	d := r.Design
	spec := d.Spec
	c := d.Cavity
	w := spec.Mode
	f0 := c.Frequency(w)
	sh := &cavitySheet{Title: "Cavity datasheet: " + w.String() + " at " + freq(spec.Frequency), Demo: r.Scenario.Title != ""}
	if sh.Demo {
		sh.Title = r.Scenario.Title
	}
	operate, machine := r.Scenario.Temps()
	sh.Headline = fmt.Sprintf("%v at %s, D = %s, L = %s at %s", w, freq(spec.Frequency),
		length(c.Diameter()), length(c.Length), temp(operate))
	sh.Convention = "Modes are named TE_nmp and TM_nmp: n is the azimuthal index (fields vary as cos nφ or sin nφ), " +
		"m the radial index (the m-th zero of J'_n for TE, of J_n for TM), p the axial index (half-wavelengths along the length; " +
		"p ≥ 1 for TE, p ≥ 0 for TM). TE0mp and TM1mp resonate at exactly the same frequency in every cylinder."

	// Key facts.
	sh.Facts = []KV{
		{"Wanted mode", w.String()},
		{"Frequency", freq(f0)},
		{"Diameter D", length(c.Diameter())},
		{"Length L", length(c.Length)},
		{"D/L", strconv.FormatFloat(d.Ratio, 'f', 4, 64)},
		{"Clearance", pct(d.Clearance.Value) + " (" + d.Clearance.Limiting.String() + ")"},
	}
	if !math.IsNaN(d.Q0) && !math.IsInf(d.Q0, 0) {
		sh.Facts = append(sh.Facts, KV{"Unloaded Q0", qText(d.Q0)})
	}
	sh.Facts = append(sh.Facts, accelFacts(r)...)

	// Dimensions and tolerances.
	dim := Table{Caption: "Dimensions and tolerances (inside surfaces, at " + temp(operate) + ")", Header: []string{"Quantity", "Value", "Note"}}
	edge := "interior optimum"
	if r.RatioFixed() {
		edge = "fixed: the allowed range has zero width"
	} else if d.AtRangeEdge {
		edge = fmt.Sprintf("on the edge of the allowed range (%s)", d.Limit)
	} else if d.Limit != cavity.NoLimit {
		edge = fmt.Sprintf("held by the %s constraint", d.Limit)
	}
	tol := r.Analysis.Settings.Tolerance
	dim.add(false, "Diameter D", length(c.Diameter()), tolText(tol.Diameter))
	dim.add(false, "Radius a", length(c.Radius), "")
	dim.add(false, "Length L", length(c.Length), tolText(tol.Length))
	if m := r.Machined; m != c {
		dim.add(false, "Diameter D at "+temp(machine), length(m.Diameter()), "machine to this; it becomes D at "+temp(operate))
		dim.add(false, "Length L at "+temp(machine), length(m.Length), "machine to this")
	}
	dim.add(false, "Ratio D/L", strconv.FormatFloat(d.Ratio, 'f', 6, 64), fmt.Sprintf("allowed %.4g..%.4g; %s", d.AllowedRatio[0], d.AllowedRatio[1], edge))
	if spec.Tuning > 0 {
		dim.add(false, "Length at f (1 − tuning)", length(r.Analysis.TunedLength[0]), fmt.Sprintf("tuning ±%s by one end plate", short(spec.Tuning)))
		dim.add(false, "Length at f (1 + tuning)", length(r.Analysis.TunedLength[1]), "")
	}
	fill := r.Scenario.Fill
	dim.add(false, "Fill", spec.Fill.Label(), fmt.Sprintf("εr = %.6g, μr = %.6g", spec.Fill.Eps(), spec.Fill.Mu()))
	sh.Dimensions = dim

	// Modes near the band, with Q0 where a wall is known.
	cl, err := c.Clearance(w, cavity.ClearanceOptions{Window: modeWindow, CountDegenerate: spec.CountDegenerate})
	if err != nil {
		return nil, err
	}
	var qOf func(m cavity.Mode) (float64, error)
	if ok, _ := r.Scenario.WallQ(); ok {
		qOf = func(m cavity.Mode) (float64, error) { return r.Scenario.ModeQ(m)(c) }
	}
	mt := Table{Caption: fmt.Sprintf("Modes within ±%s of the wanted frequency", short(modeWindow)),
		Header: []string{"Mode", "Frequency", "Offset", "Offset", "Q0", "Note"},
		Num:    []bool{false, true, true, true, true, false}}
	type entry struct {
		m       cavity.Mode
		f       float64
		wanted  bool
		comment string
	}
	var entries []entry
	for _, nb := range cl.InWindow {
		entries = append(entries, entry{m: nb.Mode, f: nb.Frequency})
	}
	entries = append(entries, entry{m: w, f: f0, wanted: true, comment: "wanted"})
	for _, m := range cl.Degenerate {
		if !spec.CountDegenerate {
			entries = append(entries, entry{m: m, f: c.Frequency(m), comment: "exact companion: suppress by other means"})
		}
	}
	// Sort by frequency, the wanted mode before its companion.
	for i := 1; i < len(entries); i++ {
		for j := i; j > 0 && (entries[j].f < entries[j-1].f || (entries[j].f == entries[j-1].f && entries[j].wanted)); j-- {
			entries[j], entries[j-1] = entries[j-1], entries[j]
		}
	}
	var qpts []modechart.ModeQ
	for _, e := range entries {
		note := e.comment
		if e.m == cl.Limiting && !e.wanted {
			note = "sets the clearance"
		} else if cl.Below != nil && e.m == cl.Below.Mode && note == "" {
			note = "nearest below"
		} else if cl.Above != nil && e.m == cl.Above.Mode && note == "" {
			note = "nearest above"
		}
		q := "–"
		if qOf != nil {
			v, err := qOf(e.m)
			if err != nil {
				return nil, err
			}
			q = qText(v)
			qpts = append(qpts, modechart.ModeQ{Mode: e.m, Frequency: e.f, Q0: v, Wanted: e.wanted})
		}
		off := e.f - f0
		mt.add(e.wanted, e.m.String(), freq(e.f), signedFreq(off), signedPct(off/f0), q, note)
	}
	sh.Modes = mt
	sh.ModesNote = "Each mode with n ≥ 1 has two polarisations (cos nφ and sin nφ) at the same frequency."

	// Q0 breakdown.
	if u := r.Unloaded; u != nil {
		wall := r.Scenario.Wall
		q := Table{Caption: fmt.Sprintf("Unloaded Q of %v (%s walls at %s, smooth surfaces)", w, wall.Name, temp(operate)),
			Header: []string{"Part", "Surface resistance", "Partial Q", "Share of loss"},
			Num:    []bool{false, true, true, true}}
		q.add(false, "Side wall", ohm(u.Wall.Rs.Side), qText(u.Wall.QSide), pct(u.Share.Side))
		q.add(false, "End plate A", ohm(u.Wall.Rs.EndA), qText(u.Wall.QEndA), pct(u.Share.EndA))
		q.add(false, "End plate B", ohm(u.Wall.Rs.EndB), qText(u.Wall.QEndB), pct(u.Share.EndB))
		q.add(false, "Walls together", "", qText(u.Wall.QWall), pct(u.Share.Side+u.Share.EndA+u.Share.EndB))
		q.add(false, "Fill ("+spec.Fill.Label()+")", "", qText(u.QFill), pct(u.Share.Fill))
		q.add(true, "Unloaded Q0", "", qText(u.Q0), "100 %")
		sh.Q = q
		sh.QNote = "1/Q0 = 1/Q_wall + 1/Q_fill. Real surfaces (roughness, joints, plating) give less: allow 10–30 % below the smooth-wall figure (common practice)."
		if r.Scenario.Superconductor != nil {
			// The normal-metal allowance does not apply: a superconducting
			// Q0 is set by the residual resistance assumed.
			sh.QNote = "1/Q0 = 1/Q_wall + 1/Q_fill. Superconducting walls: Q0 rests on the residual resistance assumed (see Operating figures); surface preparation, trapped magnetic flux and hydrogen in the niobium raise it and can lower Q0 several-fold."
		}
	}

	// Clearance.
	ct := Table{Caption: "Spurious-mode clearance (smallest |f_i − f_w| / f_w over every other mode)", Header: []string{"Quantity", "Value"}}
	ct.add(true, "Clearance at the nominal size", pct(d.Clearance.Value)+", set by "+d.Clearance.Limiting.String())
	if cl.Below != nil {
		ct.add(false, "Nearest below", fmt.Sprintf("%v at %s (%s)", cl.Below.Mode, freq(cl.Below.Frequency), signedPct(cl.Below.Relative)))
	}
	if cl.Above != nil {
		ct.add(false, "Nearest above", fmt.Sprintf("%v at %s (%s)", cl.Above.Mode, freq(cl.Above.Frequency), signedPct(cl.Above.Relative)))
	}
	ct.add(false, "Spurious-free window", freq(cl.FreeLow)+" .. "+freq(cl.FreeHigh))
	reach := r.Analysis.Reach
	if span := reach.Operation.Span(); span != "" {
		ct.add(true, "Worst over "+span, fmt.Sprintf("%s, set by %v (reachable D/L %.4g .. %.4g)", pct(reach.Worst), reach.WorstNames(), reach.RatioLo, reach.RatioHi))
	}
	if spec.MinClearance > 0 || !reach.Meets() {
		verdict := "met"
		if !reach.Meets() {
			verdict = "NOT met: " + offenders(reach)
		}
		ct.add(!reach.Meets(), "Required "+pct(spec.MinClearance), verdict)
	}
	for _, m := range cl.Degenerate {
		ct.add(false, "Exact companion", m.String()+" (not counted; needs a mode trap, a plunger gap or coupling on its field nulls)")
	}
	sh.Clearance = ct

	// Sensitivities and thermal drift.
	s := r.Analysis.Sensitivity
	st := Table{Caption: "Sensitivities of the wanted frequency", Header: []string{"Quantity", "Value"}}
	st.add(false, "df/dD", signedFreq(s.DfDD*1e-3)+" per mm")
	st.add(false, "df/dL", signedFreq(s.DfDL*1e-3)+" per mm")
	st.add(false, "Axial share s = (β/k)²", fmt.Sprintf("%.4f", s.AxialShare))
	st.add(false, "df/dT", fmt.Sprintf("%s per K (%s ppm/K)", signedFreq(s.DfDT), minus(fmt.Sprintf("%.4g", 1e6*s.TempCoeff))))
	if r.Scenario.TempGiven {
		th := spec.Thermal
		st.add(false, "Temperature range", temp(th.TMin)+" .. "+temp(th.TMax))
		st.add(false, "Expansion at "+temp(operate)+": side wall / length", fmt.Sprintf("%.3g / %.3g ppm/K", 1e6*th.AlphaRadial, 1e6*th.AlphaAxial))
		st.add(false, "Drift at the range ends", signedFreq(r.Analysis.Drift[0])+" / "+signedFreq(r.Analysis.Drift[1]))
	}
	sh.Sensitive = st

	// Tolerance spread.
	if sp := r.Analysis.Spread; sp != nil {
		dist := "uniform"
		if tol.Distribution == cavity.Normal {
			sig := tol.Sigmas
			if sig == 0 {
				sig = cavity.DefaultSigmas
			}
			dist = fmt.Sprintf("normal, tolerance = %g σ", sig)
		}
		t := Table{Caption: fmt.Sprintf("Machining tolerance: Monte Carlo, %d samples, seed %d (%s)", sp.Samples, tol.Seed, dist),
			Header: []string{"Quantity", "Value"}}
		t.add(false, "Tolerances", "D "+tolText(tol.Diameter)+", L "+tolText(tol.Length))
		t.add(false, "Mean frequency", freq(sp.Mean))
		t.add(false, "Standard deviation", physics.FormatFrequency(sp.Std, 4)+" (linearised "+physics.FormatFrequency(sp.LinearStd, 4)+")")
		t.add(false, "1st .. 99th percentile", freq(sp.P01)+" .. "+freq(sp.P99))
		t.add(true, "Worst clearance among the samples", pct(sp.WorstClearance)+", set by "+sp.WorstMode.String())
		sh.Spread = t
	}

	// Tuning curve: over the reachable set (cavity.Reach) expressed as
	// end-plate spacings at the nominal diameter, so that its worst case
	// is the one of the clearance table; L ± 5 % for illustration when the
	// set is a single point. A mode an end plate does not tune has no
	// curve, and the table says why (cavity.Mode.EndPlateTuning).
	var tc cavity.TuningCurve
	if err := w.EndPlateTuning(); err != nil {
		sh.Tuning = Table{Caption: "Tuning by one end plate: none. " + upperFirst(strings.TrimPrefix(err.Error(), "cavity: ")) + "."}
	} else {
		D := c.Diameter()
		lLo, lHi := D/reach.RatioHi, D/reach.RatioLo
		caption := fmt.Sprintf("Tuning by one end plate (diameter fixed) over the reachable set (%s), as spacings at the nominal diameter", reach.Operation.Span())
		if reach.RatioHi <= reach.RatioLo {
			lLo, lHi = 0.95*c.Length, 1.05*c.Length
			caption = "Tuning by one end plate (diameter fixed), L ± 5 % for illustration (no tuning range, temperature range or tolerance given; section 4 gives the clearance at the nominal size)"
		}
		tc, err = c.Tune(w, lLo, lHi, 120, spec.CountDegenerate)
		if err != nil {
			return nil, err
		}
		tt := Table{Caption: fmt.Sprintf("%s; worst clearance %s at L = %s (%v)", caption, pct(tc.Worst), length(tc.WorstLength), tc.WorstMode),
			Header: []string{"Length L", "Frequency", "df/dL", "Clearance", "Set by"},
			Num:    []bool{true, true, true, true, false}}
		for i := 0; i < len(tc.Points); i += 15 {
			p := tc.Points[i]
			tt.add(false, length(p.Length), freq(p.Frequency), signedFreq(p.DfDL*1e-3)+"/mm", pct(p.Clearance), p.Limiting.String())
		}
		for _, x := range tc.Crossings {
			tt.add(true, length(x.Length), freq(x.Frequency), "", "0 %", "crossed by "+x.Mode.String())
		}
		sh.Tuning = tt
	}

	// Materials.
	if wall := r.Scenario.Wall; wall != nil {
		m := Material{Role: "Wall metal", Name: wall.Name, Description: wall.Description, Source: wall.Source, Note: wall.Note}
		m.Values = append(m.Values, KV{"Conductivity at 20 °C", fmt.Sprintf("%.4g MS/m (%.1f %% IACS)", wall.Conductivity/1e6, 100*wall.IACS())})
		if wall.Expansion != 0 {
			m.Values = append(m.Values, KV{"Expansion", fmt.Sprintf("%.3g ppm/K", 1e6*wall.Expansion)})
		}
		sh.Materials = append(sh.Materials, m)
	}
	{
		m := Material{Role: "Fill", Name: spec.Fill.Label(), Description: fill.Description, Source: fill.Source, Note: fill.Note}
		m.Values = append(m.Values, KV{"Relative permittivity", fmt.Sprintf("%.6g", spec.Fill.Eps())})
		td := fmt.Sprintf("%.3g", spec.Fill.TanDelta)
		if spec.Fill.TanDeltaFreq > 0 {
			td += " at " + freq(spec.Fill.TanDeltaFreq)
		}
		m.Values = append(m.Values, KV{"Loss tangent", td})
		if spec.Fill.TCEpsKnown {
			m.Values = append(m.Values, KV{"Temperature coefficient of εr", minus(fmt.Sprintf("%.4g ppm/K", 1e6*spec.Fill.TCEps))})
		}
		sh.Materials = append(sh.Materials, m)
	}
	if r.Scenario.TempGiven {
		th := spec.Thermal
		sh.Materials = append(sh.Materials, Material{Role: "Thermal model", Name: "expansion coefficients at " + temp(operate),
			Values: []KV{{"Side wall (sets D)", fmt.Sprintf("%.3g ppm/K", 1e6*th.AlphaRadial)}, {"Length (end spacers)", fmt.Sprintf("%.3g ppm/K", 1e6*th.AlphaAxial)}},
			Source: "the local slope of each metal's thermal strain: integrated cryogenic contraction data where the metal has them (see cylcav materials), else its linear coefficient or the --alpha-side / --alpha-axial flags; the drift uses the full strain law"})
	}

	sh.Accel, sh.AccelNotes = accelSection(r)
	sh.Cautions = r.Cautions
	sh.Safety = SafetyNotes()

	// Charts.
	if err := sh.addCharts(r, th, tc, qpts); err != nil {
		return nil, err
	}
	return sh.sheet(), nil
}

// cavityMethod is the closing note of a cavity datasheet: where its
// numbers come from.
const cavityMethod = "Resonant frequencies from the closed-cylinder resonance condition (Pozar, Microwave Engineering, 4th ed., sec. 6.4; Harrington, Time-Harmonic Electromagnetic Fields, sec. 5.3); unloaded Q by the surface-resistance perturbation method; clearance, optimum and tolerance analysis as described in the cylcav documentation."

// sheet arranges the parts into the sections of the datasheet.
func (sh *cavitySheet) sheet() *Sheet {
	chart := func(id string) []Block {
		for i := range sh.Charts {
			if sh.Charts[i].ID == id {
				return []Block{{Chart: &sh.Charts[i]}}
			}
		}
		return nil
	}
	join := func(bs ...[]Block) []Block {
		var out []Block
		for _, b := range bs {
			out = append(out, b...)
		}
		return out
	}
	table := func(t Table) []Block { return []Block{{Table: &t}} }
	// tuning is the chart and table of the tuning curve, or, for a mode
	// an end plate does not tune (no rows), the table's caption as the
	// section's text, so the section says why it is empty.
	tuning := func(t Table, charts []Block) []Block {
		if len(t.Rows) == 0 {
			return join(charts, []Block{{Para: t.Caption}})
		}
		return join(charts, table(t))
	}
	out := &Sheet{
		Kind:     "Cavity resonator datasheet",
		Title:    sh.Title,
		Headline: sh.Headline,
		Facts:    sh.Facts,
		Method:   cavityMethod,
	}
	secs := []Section{
		{"Dimensions and tolerances", table(sh.Dimensions)},
		{"Mode chart", chart("mode-chart")},
		{"Modes near the band", join(table(sh.Modes), []Block{{Note: sh.ModesNote}}, chart("q-frequency"))},
		{"Spurious-mode clearance", join(table(sh.Clearance), chart("trade-off"))},
	}
	if len(sh.Q.Rows) > 0 {
		secs = append(secs, Section{"Unloaded Q", join(table(sh.Q), []Block{{Note: sh.QNote}})})
	}
	sens := table(sh.Sensitive)
	if len(sh.Spread.Rows) > 0 {
		sens = join(sens, table(sh.Spread))
	}
	var cautions []Block
	if len(sh.Cautions) > 0 {
		cautions = []Block{{List: &List{Lead: "For this design:", Class: "cautions", Items: sh.Cautions}}}
	}
	cautions = append(cautions, Block{List: &List{Lead: "Safety:", Class: "safety", Items: sh.Safety}})
	secs = append(secs,
		Section{"Sensitivities and tolerance spread", sens},
		Section{"Tuning", tuning(sh.Tuning, chart("tuning"))},
	)
	if len(sh.Accel) > 0 {
		var bs []Block
		for _, t := range sh.Accel {
			bs = append(bs, table(t)...)
		}
		for _, n := range sh.AccelNotes {
			bs = append(bs, Block{Note: n})
		}
		secs = append(secs, Section{"Operating figures", bs})
	}
	secs = append(secs,
		Section{"Materials and their sources", []Block{{Materials: sh.Materials}}},
		Section{"Index convention", []Block{{Para: sh.Convention}}},
		Section{"Cautions", cautions},
	)
	out.Sections = secs
	return out
}

// SafetyNotes returns the safety notes every cavity or filter datasheet
// carries (a new slice on each call).
func SafetyNotes() []string {
	return []string{
		"High RF power: a resonant cavity multiplies the incident power into strong fields. Keep covers, couplings and tuners fitted while power is applied; RF burns are deep and are not felt at once. Keep exposure within the limits of the applicable RF-exposure rules and check leakage at joints and tuning screws.",
		"High voltage: the transmitters, amplifiers and power supplies that feed a cavity carry lethal voltages; only qualified people may open or adjust them.",
		"Breakdown and multipaction: the peak fields of a high-Q cavity can arc in air or multipact in vacuum, damaging surfaces and detuning the cavity. Derate the input power, keep surfaces clean and dry, and condition vacuum cavities gradually.",
		"Cryogenics: cooled cavities bring cold burns, embrittlement and asphyxiation from boil-off gas; follow cryogen-handling practice and ventilate.",
		"This datasheet is a design aid, not a safety assessment: defer to local codes, the equipment maker's instructions and licensed practice.",
	}
}

// addCharts renders the four figures of the datasheet.
func (sh *cavitySheet) addCharts(r design.Result, th figure.Theme, tc cavity.TuningCurve, qpts []modechart.ModeQ) error {
	d := r.Design
	spec := d.Spec
	c := d.Cavity
	page := figure.Page{Width: 7.5 * vg.Inch, Height: 5.6 * vg.Inch}

	// Mode chart around the design, with the operating box.
	op := r.Analysis.Reach.Operation
	cs := modechart.Spec{
		Wanted: spec.Mode, Cavity: c, Tuning: op.Tuning,
		DiameterTol: op.DiameterTol, LengthTol: op.LengthTol, Thermal: op.Thermal,
		Clearance: op.MinClearance, CountDegenerate: op.CountDegenerate,
	}
	if cs.Clearance == 0 {
		// Without a requirement, mark the modes within the clearance the
		// design achieves along its path.
		cs.Clearance = r.Analysis.Reach.Worst * (1 + 1e-6)
	}
	if !(cs.Clearance > 0 && cs.Clearance < 1) {
		cs.Clearance = 0
	}
	// The chart spans the allowed range and the whole reachable set with
	// a margin.
	rLo, rHi := r.Analysis.Reach.RatioLo, r.Analysis.Reach.RatioHi
	cs.RatioMin = math.Max(modechart.MinRatio, math.Min(spec.RatioMin, 0.8*rLo))
	cs.RatioMax = math.Min(modechart.MaxRatio, math.Max(spec.RatioMax, 1.25*rHi))
	ch, err := modechart.New(cs)
	if err != nil {
		return err
	}
	fig, err := ch.Figure(th)
	if err != nil {
		return err
	}
	sh.Charts = append(sh.Charts, Chart{ID: "mode-chart", Title: "Mode chart",
		Caption: "Every TE and TM mode as a line of (f·D)² against (D/L)². The design point sits on the wanted mode's line; the wide band along it is the reachable set (tuning, temperature and worst-case machining tolerance), the set section 4's worst case is taken over.",
		Figure:  fig, Page: page})

	// Trade-off curves.
	cv := r.Analysis.Curve
	if len(cv.Ratio) >= 2 {
		tf, err := modechart.TradeOffFigure(th, "Design trade-off against D/L", modechart.TradeOffCurves{
			Ratio: cv.Ratio, Clearance: cv.Clearance, WorstClearance: cv.WorstClearance, Q0: cv.Q0,
			Chosen: d.Ratio, MinClearance: spec.MinClearance, MinQ: spec.MinQ,
		})
		if err != nil {
			return err
		}
		sh.Charts = append(sh.Charts, Chart{ID: "trade-off", Title: "Trade-off",
			Caption: "Clearance and unloaded Q0 of the wanted mode over the allowed D/L range, each cavity sized for the design frequency.",
			Figure:  tf, Page: page})
	}

	// Tuning curve with the neighbouring modes (none for a mode an end
	// plate does not tune; the tuning table says why).
	if len(tc.Points) > 0 {
		tcv := modechart.TuningCurves{Wanted: spec.Mode.String(), Design: c.Length}
		if spec.Tuning > 0 {
			tcv.Range = r.Analysis.TunedLength
		}
		others := map[cavity.Mode]bool{}
		for _, L := range []float64{tc.Points[0].Length, tc.Points[len(tc.Points)-1].Length} {
			cc := c
			cc.Length = L
			cl, err := cc.Clearance(spec.Mode, cavity.ClearanceOptions{Window: 0.12})
			if err != nil {
				return err
			}
			for _, nb := range cl.InWindow {
				others[nb.Mode] = true
			}
		}
		var names []cavity.Mode
		for m := range others {
			names = append(names, m)
		}
		sortModes(names)
		ys := make([][]float64, len(names))
		for _, p := range tc.Points {
			tcv.Length = append(tcv.Length, p.Length)
			tcv.Freq = append(tcv.Freq, p.Frequency)
			tcv.Clearance = append(tcv.Clearance, p.Clearance)
			cc := c
			cc.Length = p.Length
			for i, m := range names {
				ys[i] = append(ys[i], cc.Frequency(m))
			}
		}
		for i, m := range names {
			tcv.Others = append(tcv.Others, modechart.Series{Name: m.String(), Y: ys[i]})
		}
		tf, err := modechart.TuningFigure(th, "Tuning by one end plate", tcv)
		if err != nil {
			return err
		}
		sh.Charts = append(sh.Charts, Chart{ID: "tuning", Title: "Tuning curve",
			Caption: "Resonant frequency against the end-plate spacing, with the modes within ±12 % of the wanted one, and the clearance along the path.",
			Figure:  tf, Page: page})
	}

	// Q0 against frequency; a single mode (one dot) is left to the table.
	if len(qpts) > 1 {
		qf, err := modechart.QFigure(th, "Unloaded Q0 of the modes near the band", qpts)
		if err != nil {
			return err
		}
		sh.Charts = append(sh.Charts, Chart{ID: "q-frequency", Title: "Q0 against frequency",
			Caption: fmt.Sprintf("Unloaded Q0 of every mode within ±%s of the wanted frequency, %s walls, smooth surfaces.", short(modeWindow), r.Scenario.Wall.Name),
			Figure:  qf, Page: figure.Page{Width: 7.5 * vg.Inch, Height: 4.2 * vg.Inch}})
	}
	return nil
}

func sortModes(ms []cavity.Mode) {
	for i := 1; i < len(ms); i++ {
		for j := i; j > 0 && less(ms[j], ms[j-1]); j-- {
			ms[j], ms[j-1] = ms[j-1], ms[j]
		}
	}
}

func less(a, b cavity.Mode) bool {
	if a.Family != b.Family {
		return a.Family < b.Family
	}
	if a.N != b.N {
		return a.N < b.N
	}
	if a.M != b.M {
		return a.M < b.M
	}
	return a.P < b.P
}

func freq(f float64) string { return physics.FormatFrequency(f, 7) }

// length prints a length for people, micrometres as µm.
func length(m float64) string { return micro(physics.FormatLength(m, 6)) }

func micro(s string) string { return strings.Replace(s, " um", " µm", 1) }

// temp prints a temperature in degrees Celsius (or kelvin when cold).
func temp(k float64) string {
	s := physics.FormatTemperature(k, 4)
	if strings.HasSuffix(s, " C") {
		s = strings.TrimSuffix(s, " C") + " °C"
	}
	return minus(s)
}

// minus writes a leading hyphen-minus as the minus sign.
func minus(s string) string {
	if strings.HasPrefix(s, "-") {
		return "−" + s[1:]
	}
	return s
}

func signedFreq(v float64) string {
	if v < 0 {
		return "−" + physics.FormatFrequency(-v, 4)
	}
	return "+" + physics.FormatFrequency(v, 4)
}

func signedPct(f float64) string {
	if f < 0 {
		return fmt.Sprintf("−%.3f %%", -100*f)
	}
	return fmt.Sprintf("+%.3f %%", 100*f)
}

// short prints a fraction as a percentage with up to 3 significant digits.
func short(f float64) string { return fmt.Sprintf("%.3g %%", 100*f) }

func pct(f float64) string {
	if math.IsInf(f, 1) {
		return "∞"
	}
	return fmt.Sprintf("%.3f %%", 100*f)
}

// sciQ is the Q above which qText switches to four significant digits in
// scientific notation: a superconducting Q0 of 1.226e+10 is known to a few
// per cent at best (residual resistance), and eleven digits would claim
// more; every normal-metal Q stays below it and is printed whole.
const sciQ = 1e7

// qText formats a Q: whole below sciQ, four significant digits above it.
func qText(q float64) string {
	switch {
	case math.IsInf(q, 1):
		return "∞ (lossless)"
	case q >= sciQ:
		return qSci(q)
	}
	return fmt.Sprintf("%.0f", q)
}

func ohm(r float64) string { return physics.FormatSI(r, "Ω", 4) }

func tolText(t float64) string {
	if t == 0 {
		return "no tolerance given"
	}
	return "±" + micro(physics.FormatLength(t, 3))
}

// offenders lists a reach's offending modes for people.
func offenders(r cavity.Reach) string {
	var parts []string
	for _, o := range r.Offending {
		if o.Crosses {
			parts = append(parts, fmt.Sprintf("%v crosses at D/L %.4g", o.Mode, o.Ratio))
		} else {
			parts = append(parts, fmt.Sprintf("%v %s at D/L %.4g", o.Mode, pct(o.Clearance), o.Ratio))
		}
	}
	return strings.Join(parts, ", ")
}

// upperFirst capitalises the first letter of a sentence.
func upperFirst(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}
