package filter

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"cylcav/cmd/cylcav/internal/cmdutil"
	bandpass "cylcav/filter"
	"cylcav/physics"
)

// checkName names a check for people: "return loss", "passband ripple",
// "rejection from 10.25 GHz" (a rejection holds from F outwards).
func checkName(c bandpass.Check) string {
	if c.F != 0 {
		return c.Name + " from " + physics.FormatFrequency(c.F, 6)
	}
	return c.Name
}

// failText states the required and achieved values of a failed check and
// why it fails.
func failText(c bandpass.Check) string {
	if c.Spurious != nil {
		return c.Note
	}
	return fmt.Sprintf("achieved %s, required %s", achievedText(c), requiredText(c))
}

// requiredText prints the requirement of a check: ">= 40.00 dB", or
// "(info)" for an information line without one.
func requiredText(c bandpass.Check) string {
	if math.IsNaN(c.Required) {
		return "(info)"
	}
	rel := "<="
	if c.AtLeast {
		rel = ">="
	}
	return rel + " " + dbText(c.Required) + " dB"
}

// achievedText prints the achieved value of a check, with the frequency of
// a rejection's least attenuation: "41.28 dB at 10.2500 GHz"; "not
// computed" for a line outside the model.
func achievedText(c bandpass.Check) string {
	if c.Verdict == bandpass.OutsideModel && math.IsNaN(c.Achieved) {
		return "not computed"
	}
	t := dbText(c.Achieved) + " dB"
	if c.Name == "rejection" {
		t += " at " + physics.FormatFrequency(c.Worst, 6)
	}
	return t
}

// resultText is the result column of a check.
func resultText(c bandpass.Check) string {
	switch {
	case c.Info:
		return "info"
	case c.Verdict == bandpass.NotMet:
		return "FAIL"
	case c.Verdict == bandpass.OutsideModel:
		return "NOT CHECKED"
	}
	return "pass"
}

// verdictKey is the JSON form of a verdict: "pass", "fail" or
// "outside_model".
func verdictKey(v bandpass.Verdict) string {
	return strings.ReplaceAll(v.String(), " ", "_")
}

// dbText prints a level in dB to 4 significant digits, "infinite" for
// +Inf (a lossless response exactly at a transmission zero).
func dbText(v float64) string {
	if math.IsInf(v, 1) {
		return "infinite"
	}
	return strconv.FormatFloat(v, 'f', dbDecimals(v), 64)
}

func dbDecimals(v float64) int {
	a := math.Abs(v)
	switch {
	case a >= 100:
		return 1
	case a >= 10:
		return 2
	case a >= 1:
		return 3
	}
	return 4
}

// nsText prints a time in ns to 4 significant digits.
func nsText(sec float64) string {
	return strconv.FormatFloat(sec*1e9, 'g', 4, 64) + " ns"
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

// WriteTable prints the result for people.
func (r *Result) WriteTable(w io.Writer) error {
	var b strings.Builder
	d := r.Design
	s := d.Spec
	n := d.Order()
	ff := func(f float64) string { return physics.FormatFrequency(f, 6) }
	f1, f2 := bandpass.BandpassFrequency(-1, s.F0, s.BW), bandpass.BandpassFrequency(1, s.F0, s.BW)

	fmt.Fprintf(&b, "Specification\n")
	fmt.Fprintf(&b, "  centre f0 = %s, bandwidth bw = %s (FBW = %.5g %%), passband %s..%s\n", ff(s.F0), ff(s.BW), 100*d.FBW, ff(f1), ff(f2))
	switch s.Family {
	case bandpass.Chebyshev:
		fmt.Fprintf(&b, "  Chebyshev response: return loss %s dB, ripple %s dB\n", dbText(s.ReturnLoss), dbText(s.Ripple))
	case bandpass.Butterworth:
		fmt.Fprintf(&b, "  Butterworth (maximally flat) response, 3.01 dB at the band edges\n")
	}
	for _, g := range d.Mask().Regions {
		side, end := "+", g.High
		if !g.Above {
			side, end = "-", g.Low
		}
		if g.OutsideModel {
			fmt.Fprintf(&b, "  rejection >= %s dB from %s outwards (beyond f0 %s %g %%, where the model does not hold)\n",
				dbText(g.Attenuation), ff(g.F), side, 100*bandpass.ModelOffset)
			continue
		}
		if g.Bounded {
			fmt.Fprintf(&b, "  rejection >= %s dB from %s to %s\n", dbText(g.Attenuation), ff(g.F), ff(end))
			continue
		}
		fmt.Fprintf(&b, "  rejection >= %s dB from %s outwards to %s (f0 %s %g %%, the end of the band of interest)\n",
			dbText(g.Attenuation), ff(g.F), ff(end), side, 100*bandpass.ModelOffset)
	}
	how := "given"
	if r.OrderChosen {
		how = "the smallest that meets every rejection band"
	}
	fmt.Fprintf(&b, "  order N = %d (%s)\n", n, how)

	if d.G != nil {
		fmt.Fprintf(&b, "\nLowpass prototype g values (Matthaei, Young & Jones sec. 4.05)\n")
		t := cmdutil.NewTable(&b)
		var names, vals []string
		for i, g := range d.G {
			names = append(names, fmt.Sprintf("g%d", i))
			vals = append(vals, fmt.Sprintf("%.6f", g))
		}
		t.Row(append([]string{" "}, names...)...)
		t.Row(append([]string{" "}, vals...)...)
		if err := t.Flush(); err != nil {
			return err
		}
	}

	fmt.Fprintf(&b, "\nTransmission zeros\n")
	if len(d.Zeros) == 0 {
		fmt.Fprintf(&b, "  none (all-pole response)\n")
	} else {
		t := cmdutil.NewTable(&b, "  frequency", "Omega (normalised)")
		for _, z := range d.Zeros {
			t.Row("  "+ff(bandpass.BandpassFrequency(z, s.F0, s.BW)), fmt.Sprintf("%+.6f", z))
		}
		if err := t.Flush(); err != nil {
			return err
		}
		if len(d.Zeros) == n {
			fmt.Fprintf(&b, "  fully canonical: N zeros need the direct source-load coupling M_SL\n")
		}
	}

	r.writeSpace(&b)

	fmt.Fprintf(&b, "\nCoupling matrix M, %s, normalised (N+2 = %d; |M| < %g printed as 0)\n", matrixTitle(d), n+2, bandpass.MatrixZero)
	t := cmdutil.NewTable(&b)
	head := []string{" "}
	for j := 0; j < n+2; j++ {
		head = append(head, fmt.Sprintf("%8s", rowName(j, n)))
	}
	t.Row(head...)
	for i := 0; i < n+2; i++ {
		row := []string{"  " + rowName(i, n)}
		for j := 0; j < n+2; j++ {
			row = append(row, fmt.Sprintf("%8.4f", d.Entry(i, j)))
		}
		t.Row(row...)
	}
	if err := t.Flush(); err != nil {
		return err
	}

	fmt.Fprintf(&b, "\nPhysical couplings (k = FBW * M) and external Q\n")
	t = cmdutil.NewTable(&b, "  coupling", fmt.Sprintf("%9s", "M"), fmt.Sprintf("%10s", "k"))
	for i := 1; i < n; i++ {
		t.Row(fmt.Sprintf("  k%d,%d", i, i+1), fmt.Sprintf("%9.6f", d.Entry(i, i+1)), fmt.Sprintf("%10.6f", d.Coupling(i, i+1)))
	}
	for i := 0; i < n+2; i++ {
		for j := i + 2; j < n+2; j++ {
			if m := d.Entry(i, j); m != 0 {
				t.Row(fmt.Sprintf("  cross %s-%s", rowName(i, n), rowName(j, n)), fmt.Sprintf("%9.6f", m), fmt.Sprintf("%10.6f", d.FBW*m))
			}
		}
	}
	if err := t.Flush(); err != nil {
		return err
	}
	fmt.Fprintf(&b, "  Qext in = %.6g, Qext out = %.6g\n", d.QextIn, d.QextOut)
	var detuned []string
	for i := 1; i <= n; i++ {
		if m := d.Entry(i, i); m != 0 {
			detuned = append(detuned, fmt.Sprintf("%d: %s", i, ff(bandpass.BandpassFrequency(-m, s.F0, s.BW))))
		}
	}
	if len(detuned) > 0 {
		fmt.Fprintf(&b, "  resonators tuned off f0 (M_ii != 0): %s\n", strings.Join(detuned, ", "))
	}

	fmt.Fprintf(&b, "\nLosses and group delay\n")
	fmt.Fprintf(&b, "  unloaded Q0: %s\n", q0Text(r.Q0, n))
	fmt.Fprintf(&b, "  insertion loss at f0: %s dB with the losses (lossless: %s dB)\n", dbText(r.InsertionLoss), dbText(r.LosslessLoss))
	if r.Lossless {
		fmt.Fprintf(&b, "  dissipation estimates: not applicable (lossless response)\n")
	} else {
		fmt.Fprintf(&b, "  estimate from the group delay: %s dB (lossless loss + 4.343*w0*tau(f0)/Q0, first order in 1/Q0)\n", dbText(r.DelayEstimate))
		if !math.IsNaN(r.Cohn) {
			fmt.Fprintf(&b, "  Cohn's estimate (Proc. IRE 1959): %s dB (lossless loss + 4.343*sum(g_i)/(FBW*Q0), first order in 1/Q0)\n", dbText(r.Cohn))
		} else {
			fmt.Fprintf(&b, "  Cohn's estimate: not applicable (all-pole designs only)\n")
		}
	}
	gd := r.Delay
	fmt.Fprintf(&b, "  group delay of S21: %s at f0; %s..%s across the passband (variation %s)\n",
		nsText(gd.AtF0), strings.TrimSuffix(nsText(gd.Min), " ns"), nsText(gd.Max), nsText(gd.Variation()))

	if rz := r.Realisation; rz != nil {
		writeCavities(&b, r, ff)
		writeIrises(&b, r)
	} else {
		fmt.Fprintf(&b, "\nCavities: none sized (give --mode, --wall, --fill or --ratio)\n")
	}

	fmt.Fprintf(&b, "\nSpecification check\n")
	t = cmdutil.NewTable(&b, "  requirement", "required", "achieved", "result")
	var notes []string
	for _, c := range r.Checks {
		t.Row("  "+checkName(c), requiredText(c), achievedText(c), resultText(c))
		if !c.Info && c.Verdict != bandpass.Met && c.Note != "" {
			notes = append(notes, checkName(c)+": "+c.Note)
		}
	}
	if err := t.Flush(); err != nil {
		return err
	}
	for _, nt := range notes {
		fmt.Fprintf(&b, "  - %s\n", nt)
	}
	switch r.Verdict {
	case bandpass.Met:
		fmt.Fprintf(&b, "  overall: pass\n")
	case bandpass.NotMet:
		fmt.Fprintf(&b, "  overall: FAIL\n")
	default:
		fmt.Fprintf(&b, "  overall: NOT FULLY CHECKED (no requirement fails where the model holds)\n")
	}
	fmt.Fprintf(&b, "  (return loss and ripple are checked on the designed, lossless response; info lines show the losses' effect)\n")

	if len(r.Written) > 0 {
		fmt.Fprintf(&b, "\nFiles (frequency range %s..%s)\n", ff(r.Sweep[0]), ff(r.Sweep[1]))
		for _, p := range r.Written {
			fmt.Fprintf(&b, "  wrote %s\n", p)
		}
	}
	if len(r.Warnings) > 0 {
		fmt.Fprintf(&b, "\nWarnings\n")
		for _, wn := range r.Warnings {
			fmt.Fprintf(&b, "  - %s\n", wn)
		}
	}
	fmt.Fprintf(&b, "\n%s\n", ConventionNote)
	if r.Realisation != nil {
		fmt.Fprintf(&b, "Mode index convention: TE_nmp / TM_nmp, n azimuthal, m radial, p axial.\n")
	}
	fmt.Fprintf(&b, "Note: %s\n", FieldSolverNote)
	_, err := io.WriteString(w, b.String())
	return err
}

// writeCavities prints the cavities, spurious modes and couplings of the
// realisation.
func writeCavities(b *strings.Builder, r *Result, ff func(float64) string) {
	rz := r.Realisation
	opts := r.Opts
	fmt.Fprintf(b, "\nCavities: %s, fill %s, %s\n", rz.Mode, opts.Fill.Label(), r.Shape)
	t := cmdutil.NewTable(b, "  resonator", "f", "diameter D", "length L", "Q0")
	for _, c := range rz.Cavities {
		t.Row(fmt.Sprintf("  %d", c.Resonator), ff(c.F), physics.FormatLength(c.Cavity.Diameter(), 6),
			physics.FormatLength(c.Cavity.Length, 6), qText(c.Q0))
	}
	_ = t.Flush()

	fmt.Fprintf(b, "\nSpurious modes of the cavities from %s to %s\n", ff(rz.Window[0]), ff(rz.Window[1]))
	if len(rz.Spurious) == 0 {
		fmt.Fprintf(b, "  none\n")
	} else {
		t = cmdutil.NewTable(b, "  mode", "f", "offset from f0", "cavities", "where")
		f0 := r.Design.Spec.F0
		for _, g := range rz.SpuriousGroups() {
			at, off := ff(g.FMin), percent(g.FMin/f0-1)
			if g.FMax > g.FMin {
				at += ".." + ff(g.FMax)
				off += ".." + percent(g.FMax/f0-1)
			}
			t.Row("  "+g.Mode.String(), at, off, resonators(g.Resonators), g.Where())
		}
		_ = t.Flush()
	}

	if r.Irises != nil {
		return // the iris table (writeIrises) realises every coupling
	}
	fmt.Fprintf(b, "\nCoupling realisation\n")
	t = cmdutil.NewTable(b, "  coupling", fmt.Sprintf("%10s", "k required"), "realisation")
	for _, a := range rz.Apertures {
		how := a.Note
		if a.Sized {
			where := "rho/a"
			if a.Wall == bandpass.SideWall {
				where = "z/L"
			}
			how = fmt.Sprintf("hole r0 = %s in the %s at %s = %.4g (k = %.6f)", physics.FormatLength(a.Radius, 4), a.Wall, where, a.Position, a.K)
			if !a.Valid() {
				how += "; " + a.Note
			}
		}
		t.Row(fmt.Sprintf("  k%d,%d", a.From, a.To), fmt.Sprintf("%10.6f", a.Required), how)
	}
	for _, c := range rz.Cross {
		t.Row(fmt.Sprintf("  cross %s-%s", rowName(c.From, len(rz.Cavities)), rowName(c.To, len(rz.Cavities))), fmt.Sprintf("%10.6f", c.K),
			"realise with a field solver or by measurement (depends on the layout)")
	}
	for i, p := range rz.Ports {
		name := [2]string{"input", "output"}[i]
		t.Row(fmt.Sprintf("  %s (%d)", name, p.Resonator), fmt.Sprintf("Qext %.5g", p.Qext),
			fmt.Sprintf("realise with a field solver or by measurement: reflected group delay %.4g ns", p.GroupDelay*1e9))
	}
	_ = t.Flush()
}

func resonators(r []int) string {
	if len(r) > 1 && r[len(r)-1]-r[0] == len(r)-1 {
		return fmt.Sprintf("%d-%d", r[0], r[len(r)-1])
	}
	s := make([]string, len(r))
	for i, v := range r {
		s[i] = strconv.Itoa(v)
	}
	return strings.Join(s, ",")
}

// Output is the JSON form of a result. Keys are stable, snake_case, SI.
// Values that are infinite (a lossless Q0, the rejection of a lossless
// response exactly at a zero) are null.
type Output struct {
	Order                 int            `json:"order"`
	OrderChosen           bool           `json:"order_from_rejections"`
	Family                string         `json:"response"`
	F0                    float64        `json:"f0_hz"`
	BW                    float64        `json:"bw_hz"`
	FBW                   float64        `json:"fbw"`
	ReturnLoss            *float64       `json:"return_loss_db"`
	Ripple                *float64       `json:"ripple_db"`
	Rejections            []RejectionOut `json:"rejections"`
	G                     []float64      `json:"g"`
	Zeros                 []float64      `json:"transmission_zeros_hz"`
	ZerosNormalised       []float64      `json:"transmission_zeros_normalised"`
	CouplingMatrix        [][]float64    `json:"coupling_matrix"`
	K                     []float64      `json:"k"`
	Cross                 []CrossOut     `json:"cross_couplings"`
	QextIn                float64        `json:"qext_in"`
	QextOut               float64        `json:"qext_out"`
	Q0                    []*float64     `json:"q0"`
	InsertionLoss         float64        `json:"insertion_loss_db"`
	LosslessInsertionLoss float64        `json:"lossless_insertion_loss_db"`
	DelayInsertionLoss    *float64       `json:"delay_estimate_insertion_loss_db"`
	CohnInsertionLoss     *float64       `json:"cohn_insertion_loss_db"`
	GroupDelayF0          float64        `json:"group_delay_f0_s"`
	GroupDelayMin         float64        `json:"group_delay_passband_min_s"`
	GroupDelayMax         float64        `json:"group_delay_passband_max_s"`
	GroupDelayVariation   float64        `json:"group_delay_passband_variation_s"`
	Mode                  *string        `json:"mode"`
	CavityShape           *string        `json:"cavity_shape"`
	Cavities              []CavityOut    `json:"cavities"`
	Spurious              []SpuriousOut  `json:"spurious"`
	Apertures             []ApertureOut  `json:"apertures"`
	Ports                 []PortOut      `json:"ports"`
	Checks                []CheckOut     `json:"checks"`
	Pass                  bool           `json:"pass"`
	Verdict               string         `json:"verdict"`
	SweepHz               [2]float64     `json:"sweep_hz"`
	Files                 []string       `json:"files"`
	Warnings              []string       `json:"warnings"`
	Convention            string         `json:"convention"`
	Notes                 []string       `json:"notes"`
	MatrixZeroThreshold   float64        `json:"matrix_zero_threshold"`
	Irises                *IrisOut       `json:"irises,omitempty"`
	ModeIndexConvention   string         `json:"mode_index_convention"`
	// Topology, RealPairs, TripletZeros, Placement and MatrixFile: see
	// space.go.
	Topology     string        `json:"topology"`
	RealPairs    []float64     `json:"real_axis_zero_pairs_normalised"`
	TripletZeros []float64     `json:"triplet_zeros_normalised"`
	Placement    *PlacementOut `json:"zero_placement"`
	MatrixFile   *string       `json:"matrix_file"`
}

// RejectionOut is one rejection requirement.
type RejectionOut struct {
	F           float64 `json:"f_hz"`
	Attenuation float64 `json:"attenuation_db"`
	End         float64 `json:"end_hz,omitempty"` // the band's far end when given; absent: the end of the band of interest
}

// CrossOut is a coupling outside the main line.
type CrossOut struct {
	From int     `json:"from"`
	To   int     `json:"to"`
	M    float64 `json:"m"`
	K    float64 `json:"k"`
}

// CavityOut is the cavity of one resonator.
type CavityOut struct {
	Resonator int      `json:"resonator"`
	F         float64  `json:"f_hz"`
	Diameter  float64  `json:"diameter_m"`
	Length    float64  `json:"length_m"`
	Q0        *float64 `json:"q0"`
}

// SpuriousOut is a spurious resonance near the band.
type SpuriousOut struct {
	Mode       string  `json:"mode"`
	F          float64 `json:"f_hz"`
	Offset     float64 `json:"offset_hz"`
	Relative   float64 `json:"relative_offset"`
	Resonators []int   `json:"resonators"`
	Companion  bool    `json:"companion"`
	InPassband bool    `json:"in_passband"`
	InStopband bool    `json:"in_rejection_band"`
}

// ApertureOut is the realisation of one main-line coupling.
type ApertureOut struct {
	From     int      `json:"from"`
	To       int      `json:"to"`
	K        float64  `json:"k"`
	Sized    bool     `json:"sized"`
	Radius   *float64 `json:"radius_m"`
	Valid    bool     `json:"bethe_valid"`
	Achieved *float64 `json:"k_hole"`
	Note     string   `json:"note"`
}

// PortOut is the coupling of a port to its end resonator.
type PortOut struct {
	Resonator  int     `json:"resonator"`
	Qext       float64 `json:"qext"`
	GroupDelay float64 `json:"group_delay_s"`
	Note       string  `json:"note"`
}

// CheckOut is one line of the specification check.
type CheckOut struct {
	Name     string   `json:"name"`
	F        *float64 `json:"f_hz"`
	Required *float64 `json:"required_db"`
	Achieved *float64 `json:"achieved_db"`
	AtLeast  bool     `json:"at_least"`
	Pass     bool     `json:"pass"`
	// Verdict is "pass", "fail", "outside_model" (not checkable) or
	// "info" (not a requirement).
	Verdict string `json:"verdict"`
	// Stated is false for a value shown for information only
	// (bandpass.Check.Info); the overall verdict ignores it.
	Stated bool `json:"stated"`
	// Band is the range searched for a rejection's least attenuation (Hz),
	// WorstF where the achieved value lies.
	Band   *[2]float64 `json:"band_hz"`
	WorstF *float64    `json:"worst_f_hz"`
	// SpuriousMode and SpuriousF name the cavity resonance that fails the
	// rejection or puts it outside the model.
	SpuriousMode *string  `json:"spurious_mode"`
	SpuriousF    *float64 `json:"spurious_f_hz"`
	Note         string   `json:"note"`
}

// finite returns &v, or nil for NaN and infinities.
func finite(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}

// JSON returns the result in its JSON form.
func (r *Result) JSON() Output {
	d := r.Design
	s := d.Spec
	n := d.Order()
	o := Output{
		Order: n, OrderChosen: r.OrderChosen, Family: s.Family.String(),
		F0: s.F0, BW: s.BW, FBW: d.FBW,
		G:               d.G,
		Zeros:           []float64{},
		ZerosNormalised: append([]float64{}, d.Zeros...),
		Rejections:      []RejectionOut{},
		K:               append([]float64{}, d.K...),
		Cross:           []CrossOut{},
		QextIn:          d.QextIn, QextOut: d.QextOut,
		Q0:                    []*float64{},
		InsertionLoss:         r.InsertionLoss,
		LosslessInsertionLoss: r.LosslessLoss,
		DelayInsertionLoss:    finite(r.DelayEstimate),
		CohnInsertionLoss:     finite(r.Cohn),
		GroupDelayF0:          r.Delay.AtF0,
		GroupDelayMin:         r.Delay.Min,
		GroupDelayMax:         r.Delay.Max,
		GroupDelayVariation:   r.Delay.Variation(),
		Cavities:              []CavityOut{},
		Spurious:              []SpuriousOut{},
		Apertures:             []ApertureOut{},
		Ports:                 []PortOut{},
		Checks:                []CheckOut{},
		Pass:                  r.Verdict == bandpass.Met,
		Verdict:               verdictKey(r.Verdict),
		SweepHz:               r.Sweep,
		Files:                 append([]string{}, r.Written...),
		Warnings:              append([]string{}, r.Warnings...),
		Convention:            ConventionNote,
		Notes:                 []string{FieldSolverNote},
		MatrixZeroThreshold:   bandpass.MatrixZero,
		ModeIndexConvention:   "n azimuthal, m radial, p axial",
	}
	if s.Family == bandpass.Chebyshev {
		o.ReturnLoss, o.Ripple = finite(s.ReturnLoss), finite(s.Ripple)
	}
	r.spaceJSON(&o)
	for _, rj := range s.Rejections {
		o.Rejections = append(o.Rejections, RejectionOut{F: rj.F, Attenuation: rj.Attenuation, End: rj.End})
	}
	for _, z := range d.Zeros {
		o.Zeros = append(o.Zeros, bandpass.BandpassFrequency(z, s.F0, s.BW))
	}
	o.CouplingMatrix = make([][]float64, n+2)
	for i := range o.CouplingMatrix {
		o.CouplingMatrix[i] = make([]float64, n+2)
		for j := range o.CouplingMatrix[i] {
			o.CouplingMatrix[i][j] = d.Entry(i, j)
		}
	}
	for i := 0; i < n+2; i++ {
		for j := i + 2; j < n+2; j++ {
			if m := d.Entry(i, j); m != 0 {
				o.Cross = append(o.Cross, CrossOut{From: i, To: j, M: m, K: d.FBW * m})
			}
		}
	}
	for _, v := range r.Q0 {
		o.Q0 = append(o.Q0, finite(v))
	}
	if rz := r.Realisation; rz != nil {
		m, shape := rz.Mode.String(), r.Shape
		o.Mode, o.CavityShape = &m, &shape
		for _, c := range rz.Cavities {
			o.Cavities = append(o.Cavities, CavityOut{Resonator: c.Resonator, F: c.F,
				Diameter: c.Cavity.Diameter(), Length: c.Cavity.Length, Q0: finite(c.Q0)})
		}
		for _, sp := range rz.Spurious {
			o.Spurious = append(o.Spurious, SpuriousOut{Mode: sp.Mode.String(), F: sp.F, Offset: sp.Offset, Relative: sp.Relative,
				Resonators: sp.Resonators, Companion: sp.Companion, InPassband: sp.InPassband, InStopband: sp.Stopband >= 0})
		}
		for _, a := range rz.Apertures {
			ao := ApertureOut{From: a.From, To: a.To, K: a.Required, Sized: a.Sized, Valid: a.Valid(), Note: a.Note}
			if a.Sized {
				ao.Radius, ao.Achieved = finite(a.Radius), finite(a.K)
			}
			o.Apertures = append(o.Apertures, ao)
		}
		for _, p := range rz.Ports {
			o.Ports = append(o.Ports, PortOut{Resonator: p.Resonator, Qext: p.Qext, GroupDelay: p.GroupDelay, Note: p.Note})
		}
	}
	for _, c := range r.Checks {
		co := checkOut(c)
		if sp := c.Spurious; sp != nil {
			m := sp.Mode.String()
			co.SpuriousMode, co.SpuriousF = &m, finite(sp.F)
		}
		o.Checks = append(o.Checks, co)
	}
	o.Irises = r.irisJSON()
	return o
}

// percent prints a signed fraction as a percentage with 3 decimals, zero
// without a sign.
func percent(x float64) string {
	s := fmt.Sprintf("%+.3f %%", 100*x)
	if s == "+0.000 %" || s == "-0.000 %" {
		return "0.000 %"
	}
	return s
}
