package cavity

import (
	"fmt"
	"math"
	"slices"
	"strings"
)

// Neighbour is another resonance seen from a wanted mode: its mode, its
// frequency and its offset from the wanted frequency.
type Neighbour struct {
	Mode      Mode
	Frequency float64 // Hz
	Offset    float64 // f_i - f_w, Hz (negative below the wanted mode)
	Relative  float64 // (f_i - f_w) / f_w, dimensionless
}

// ClearanceOptions selects what Cavity.Clearance counts and lists. The zero
// value lists no window and excludes the exact companion.
type ClearanceOptions struct {
	// Window is the half-width of the listing window as a fraction of the
	// wanted frequency (0.1 lists every mode within +-10 %). It must be in
	// 0..MaxWindow.
	Window float64
	// WindowHz is the half-width of the listing window in Hz; when both are
	// given the wider window is used.
	WindowHz float64
	// CountDegenerate counts the exact companion (TE0mp with TM1mp) as a
	// spurious mode, which makes the clearance zero. By default it is left
	// out of the clearance and reported in Clearance.Degenerate instead.
	CountDegenerate bool
}

// MaxWindow is the largest listing window Cavity.Clearance accepts, as a
// fraction of the wanted frequency.
const MaxWindow = 10.0

// Clearance describes the spectrum around a wanted mode of one cavity.
type Clearance struct {
	Mode      Mode
	Frequency float64 // wanted-mode frequency, Hz

	// Value is the clearance: the smallest |f_i - f_w| / f_w over every
	// other mode i, leaving out the exact companion unless CountDegenerate
	// was set. It is +Inf only if no other mode exists, which never happens
	// for a real cylinder (there is always a mode above).
	Value float64
	// Limiting is the mode that sets Value.
	Limiting Mode

	// Below and Above are the nearest counted modes below (f_i <= f_w) and
	// above (f_i > f_w); nil when there is none (Below is nil for the
	// lowest mode of a cavity).
	Below, Above *Neighbour

	// Degenerate lists the exact companion of the wanted mode (TE0mp and
	// TM1mp resonate together in every cylinder). It needs suppression by
	// other means (a mode trap, a non-contacting plunger with a gap), not
	// by the choice of D/L. It is listed whether or not it is counted.
	Degenerate []Mode

	// InWindow lists every counted mode within the window, sorted by
	// frequency; the wanted mode is not listed.
	InWindow []Neighbour

	// FreeLow and FreeHigh bound the spurious-free window, the open band
	// around the wanted frequency that holds no counted mode: the
	// frequencies of Below (0 when Below is nil) and Above.
	FreeLow, FreeHigh float64
}

// Clearance returns the spectrum around the wanted mode w of cavity c: the
// clearance (the smallest |f_i - f_w| / f_w over every other mode), the
// nearest spurious modes below and above, the exact companion reported
// apart, every mode in the window of opt, and the spurious-free window.
//
// The modes come from Modes, so the result is complete and exact to the
// accuracy of the Bessel zeros (about 1e-14 relative). Errors: an invalid
// cavity or mode, or a window outside 0..MaxWindow (fraction) or not finite
// and >= 0 (Hz).
func (c Cavity) Clearance(w Mode, opt ClearanceOptions) (Clearance, error) {
	if err := c.Validate(); err != nil {
		return Clearance{}, err
	}
	if err := c.Fill.RequireIsotropic("cavity: the clearance model"); err != nil {
		return Clearance{}, err
	}
	if err := w.Validate(); err != nil {
		return Clearance{}, err
	}
	if !(opt.Window >= 0 && opt.Window <= MaxWindow) {
		return Clearance{}, fmt.Errorf("cavity: clearance window must be in 0..%g (fraction of the wanted frequency), got %g", MaxWindow, opt.Window)
	}
	if !(opt.WindowHz >= 0) || math.IsInf(opt.WindowHz, 0) {
		return Clearance{}, fmt.Errorf("cavity: clearance window must be finite and >= 0 Hz, got %g Hz", opt.WindowHz)
	}
	fw := c.Frequency(w)
	win := math.Max(opt.Window, opt.WindowHz/fw)
	if win > MaxWindow {
		return Clearance{}, fmt.Errorf("cavity: clearance window must be at most %g times the wanted frequency (%g Hz), got %g Hz", MaxWindow, MaxWindow*fw, opt.WindowHz)
	}
	comp, hasComp := w.Companion()
	out := Clearance{Mode: w, Frequency: fw, Value: math.Inf(1)}
	if hasComp {
		out.Degenerate = []Mode{comp}
	}
	counted := func(m Mode) bool {
		return m != w && (opt.CountDegenerate || !hasComp || m != comp)
	}
	// Grow the search limit until a counted mode above f_w is found; a
	// cylinder has infinitely many modes, so this ends.
	span := math.Max(win, 0.25)
	var res []Resonance
	for {
		var err error
		res, err = c.Modes(fw * (1 + span))
		if err != nil {
			return Clearance{}, err
		}
		found := false
		for _, r := range res {
			if r.Frequency > fw && counted(r.Mode) {
				found = true
				break
			}
		}
		if found || span > 1e3 {
			break
		}
		span *= 2
	}
	for _, r := range res {
		if !counted(r.Mode) {
			continue
		}
		nb := Neighbour{Mode: r.Mode, Frequency: r.Frequency, Offset: r.Frequency - fw, Relative: (r.Frequency - fw) / fw}
		if r.Frequency <= fw {
			out.Below = &nb // the list is sorted: the last one wins
		} else if out.Above == nil {
			out.Above = &nb
		}
		if math.Abs(nb.Relative) <= win && win > 0 {
			out.InWindow = append(out.InWindow, nb)
		}
	}
	if out.Below != nil {
		out.FreeLow = out.Below.Frequency
		out.Value, out.Limiting = -out.Below.Relative, out.Below.Mode
	}
	if out.Above != nil {
		out.FreeHigh = out.Above.Frequency
		if out.Above.Relative < out.Value {
			out.Value, out.Limiting = out.Above.Relative, out.Above.Mode
		}
	} else {
		out.FreeHigh = math.Inf(1)
	}
	return out, nil
}

// The mode chart. For a homogeneous fill the resonance condition of every
// mode, multiplied by D^2,
//
//	(k D)^2 = 4 x^2 + (p pi)^2 s,   s = (D/L)^2,
//
// is a straight line in s (Pozar, Microwave Engineering, 4th ed., sec. 6.4,
// the resonance formula rewritten with a = D/2, d = L; this is the classical
// mode chart of (fD)^2 against (D/L)^2). The frequency ratio of mode i to the
// wanted mode w therefore depends on s alone (derived):
//
//	rho_i(s)^2 = (gx_i + gp_i s) / (gx_w + gp_w s),  gx = 4 x^2, gp = (p pi)^2,
//
// a Moebius function of s, monotone on s >= 0. The types below work on it.

// chartMode is one mode as a line on the mode chart.
type chartMode struct {
	mode   Mode
	gx, gp float64 // 4 x^2 and (p pi)^2
}

func newChartMode(m Mode) chartMode {
	x := m.Root()
	p := float64(m.P) * math.Pi
	return chartMode{mode: m, gx: 4 * x * x, gp: p * p}
}

// g returns (k D)^2 of the mode at s = (D/L)^2.
func (m chartMode) g(s float64) float64 { return m.gx + m.gp*s }

// MaxChartModes is the largest number of modes chartModes lists at one
// ratio, and so the reach of Optimize and Tune: a few seconds of work at
// most on a 2-core virtual machine (TE(0,1,20) over D/L 0.5..3 lists about
// 3.4e4 modes and optimises in 0.6 s; TE(1,17,1) takes about 4 s: the cost
// grows faster than the count and varies from mode to mode). A wanted mode
// of higher order, with more modes below it, gives an error naming the
// limit instead of running for minutes.
const MaxChartModes = 50_000

// chartModes returns every mode i other than w (and other than w's exact
// companion unless countDegenerate) whose frequency ratio f_i/f_w is at
// most 1+b somewhere on sLo <= s <= sHi. Because each ratio is monotone in
// s, such a mode has ratio <= 1+b at sLo or at sHi, so the list is the
// union of two calls to Modes at those ratios: complete by construction.
// Exact companions of other modes (TE0mp and TM1mp share a chart line) are
// kept once, as the TE member, since their lines are identical.
func chartModes(w Mode, sLo, sHi, b float64, countDegenerate bool) ([]chartMode, error) {
	comp, hasComp := w.Companion()
	seen := map[Mode]bool{}
	var out []chartMode
	for _, s := range []float64{sLo, sHi} {
		r := math.Sqrt(s)
		// A cavity of diameter 1 m at ratio r: L = 1/r stays inside
		// MinSize..MaxSize for every ratio MinRatio..MaxRatio.
		c := Cavity{Radius: 0.5, Length: 1 / r}
		fmax := c.Frequency(w) * (1 + b) * (1 + 1e-12)
		// Count before listing (as Modes does): a high-order wanted mode
		// has millions of modes below it and would take minutes.
		e, err := c.enumerate(fmax, math.MaxInt)
		if err != nil {
			return nil, fmt.Errorf("cavity: listing the modes near %s at D/L = %.6g: %w", w, r, err)
		}
		if e.total > MaxChartModes {
			return nil, fmt.Errorf("cavity: %d modes lie below %.4g times the frequency of %s at D/L = %.6g, more than the %d the mode-chart methods handle; choose a lower-order mode or a narrower D/L range", e.total, 1+b, w, r, MaxChartModes)
		}
		res := e.list(c)
		for _, q := range res {
			m := q.Mode
			if m == w || (hasComp && m == comp && !countDegenerate) {
				continue
			}
			key := m
			if m.Family == TM && m.N == 1 && m.P >= 1 && !(hasComp && m == comp) {
				// TM1mp shares its chart line with TE0mp (bit-equal roots);
				// keep one line unless the TE member is the wanted mode.
				if te, _ := m.Companion(); te != w {
					key = te
				}
			}
			if seen[key] {
				continue
			}
			seen[key] = true
			out = append(out, newChartMode(key))
		}
	}
	slices.SortFunc(out, func(a, b chartMode) int { return compareModes(a.mode, b.mode) })
	return out, nil
}

// compareModes orders modes TE before TM, then by n, m, p.
func compareModes(a, b Mode) int {
	switch {
	case a.Family != b.Family:
		return int(a.Family) - int(b.Family)
	case a.N != b.N:
		return a.N - b.N
	case a.M != b.M:
		return a.M - b.M
	}
	return a.P - b.P
}

// clearanceAtRatio returns the clearance of w at s = (D/L)^2 and the mode
// that sets it, listing the modes itself (slow path, for isolated points).
func clearanceAtRatio(w Mode, s float64, countDegenerate bool) (float64, Mode, error) {
	c := Cavity{Radius: 0.5, Length: 1 / math.Sqrt(s)}
	cl, err := c.Clearance(w, ClearanceOptions{CountDegenerate: countDegenerate})
	if err != nil {
		return 0, Mode{}, err
	}
	return cl.Value, cl.Limiting, nil
}

// Operation describes how a built cavity is used and made: the wanted mode,
// the tuning by one end plate, the worst-case machining tolerance and the
// temperature range. Cavity.Reach turns it into the reachable set and the
// worst-case clearance. The zero value of every optional field means "none".
type Operation struct {
	Mode Mode
	// Tuning is the half-width of the tuning range as a fraction (0.01
	// for +-1 %): at every temperature and size within tolerance the end
	// plate tunes the cavity over (1 +- Tuning) of its own frequency
	// (the model of DesignSpec.Tuning). It needs p >= 1 (EndPlateTuning).
	Tuning float64
	// DiameterTol and LengthTol are the worst-case machining tolerances
	// +-t in m, 0 <= t < a tenth of the dimension.
	DiameterTol, LengthTol float64
	// Thermal gives the expansion coefficients and the temperature range
	// (TRef is the temperature at which the cavity has its nominal size).
	Thermal Thermal
	// MinClearance is the required clearance (fraction); modes closer than
	// it somewhere on the set are listed in Reach.Offending.
	MinClearance float64
	// CountDegenerate counts the exact companion (see ClearanceOptions).
	CountDegenerate bool
}

// ToleranceError reports a machining tolerance outside 0..a tenth of its
// dimension, where the worst-case reach is no longer a small-error model.
type ToleranceError struct {
	Name       string  // "diameter tolerance" or "length tolerance"
	Value, Max float64 // m
}

// Error names the tolerance, its value and the limit.
func (e *ToleranceError) Error() string {
	return fmt.Sprintf("cavity: %s must be in 0..%.4g m (below a tenth of the dimension), got %g m", e.Name, e.Max, e.Value)
}

// Span names, for people, what the reachable set of op spans: "tuning,
// temperature and machining tolerance", any one or two of them, or ""
// when the set is the nominal cavity alone.
func (op Operation) Span() string {
	var parts []string
	if op.Tuning > 0 {
		parts = append(parts, "tuning")
	}
	if op.Thermal.hasRange() {
		parts = append(parts, "temperature")
	}
	if op.DiameterTol > 0 || op.LengthTol > 0 {
		parts = append(parts, "machining tolerance")
	}
	switch len(parts) {
	case 0:
		return ""
	case 1:
		return parts[0]
	}
	return strings.Join(parts[:len(parts)-1], ", ") + " and " + parts[len(parts)-1]
}

// Offender is a spurious mode that comes within the required clearance of
// the wanted mode somewhere on the reachable set, or crosses it there.
type Offender struct {
	Mode Mode
	// Clearance is the smallest |f_i / f_w - 1| over the set (zero when
	// the mode crosses the wanted one).
	Clearance float64
	// Crosses is true when f_i = f_w somewhere on the set.
	Crosses bool
	// Ratio is the D/L where the smallest distance is reached.
	Ratio float64
}

// Reach is the reachable set of a cavity in operation and its worst-case
// clearance, the single verdict that the optimiser, the mode chart, the
// tuning table and the datasheet all report.
//
// On the mode chart every state of the wanted mode lies on its own line,
// so the reachable set is the segment of the wanted mode's line over
// D/L = RatioLo..RatioHi (not a box in D/L and f·D: the chart's corners
// away from the line are never reached).
type Reach struct {
	Mode Mode
	// Ratio is the nominal D/L; RatioLo..RatioHi the D/L span of the set.
	Ratio, RatioLo, RatioHi float64
	// Worst is the smallest clearance anywhere on the set, reached at
	// D/L = WorstRatio and set by WorstMode (zero when a mode crosses).
	// It is exact: the minimum over the whole segment, not over samples.
	Worst      float64
	WorstMode  Mode
	WorstRatio float64
	// WorstModes lists every mode whose smallest clearance on the set ties
	// with Worst to within TieClearance, in mode order; WorstMode is the
	// first of them.
	// An optimum often balances two modes at the two ends of the set; both
	// are named so that a verdict does not depend on the last bit of a
	// dimension.
	WorstModes []Mode
	// Operation is the request the set was computed for.
	Operation Operation
	// Offending lists every mode that crosses the wanted one on the set
	// or comes within MinClearance of it, by increasing Clearance (ties in
	// mode order: TE before TM, then n, m, p). A TE0mp/TM1mp pair of
	// spurious modes is listed once, by its TE member.
	Offending []Offender
}

// TieClearance is the difference of clearance (a fraction) below which two
// modes count as setting the worst case together: half a unit of the last
// digit printed (clearances are printed in percent with three decimals),
// far above the rounding of dimensions printed to six digits.
const TieClearance = 5e-6

// WorstNames returns the modes of WorstModes joined by ", " ("TE112,
// TE311"), or WorstMode alone when the list is empty.
func (r Reach) WorstNames() string {
	if len(r.WorstModes) == 0 {
		return r.WorstMode.String()
	}
	names := make([]string, len(r.WorstModes))
	for i, m := range r.WorstModes {
		names[i] = m.String()
	}
	return strings.Join(names, ", ")
}

// Meets reports whether the worst-case clearance is at least the required
// one and no mode crosses the wanted one.
func (r Reach) Meets() bool { return len(r.Offending) == 0 }

// Verdict states the worst case for people: "worst over tuning 7.231 %
// (TE311)", then, with a required clearance or a crossing mode, whether it
// is met and which modes offend, each with its smallest clearance and
// where it is reached ("required 7 %: NOT met: TE112 6.95 % at D/L
// 1.42"). Every command prints this one sentence.
func (r Reach) Verdict() string {
	var b strings.Builder
	span := r.Operation.Span()
	if span == "" {
		span = "the nominal size"
	}
	fmt.Fprintf(&b, "worst over %s %.3f %% (%s)", span, 100*r.Worst, r.WorstNames())
	if r.Operation.MinClearance == 0 && len(r.Offending) == 0 {
		return b.String()
	}
	if r.Operation.MinClearance > 0 {
		fmt.Fprintf(&b, "; required %.4g %%", 100*r.Operation.MinClearance)
	}
	if r.Meets() {
		b.WriteString(": met")
		return b.String()
	}
	b.WriteString(": NOT met: ")
	for i, o := range r.Offending {
		if i > 0 {
			b.WriteString(", ")
		}
		if o.Crosses {
			fmt.Fprintf(&b, "%s crosses at D/L %.4g", o.Mode, o.Ratio)
		} else {
			fmt.Fprintf(&b, "%s %.3f %% at D/L %.4g", o.Mode, 100*o.Clearance, o.Ratio)
		}
	}
	return b.String()
}

// Reach returns the set of D/L ratios that cavity c visits in operation op
// and the worst-case clearance of the wanted mode over it (derived).
//
// Method: machining errors within +-DiameterTol, +-LengthTol give D/L in
// (D - dD)/(L + dL) .. (D + dD)/(L - dL) (exact, not first order). The
// temperature then scales D/L by kappa(T) = (1 + alpha_r dT)/(1 + alpha_z
// dT) and tuning to (1 + t) of the frequency at fixed D moves s = (D/L)^2
// to (1 + t)^2 (s + a0) - a0 (see newPath). All three maps are increasing
// in s, so the set is one interval of s. Each ratio f_i/f_w is monotone in
// s (see chartMode), so the smallest distance of each mode over the
// interval is at an end of it, or zero where the mode crosses the wanted
// one (a linear equation in s). The modes are listed by chartModes with a
// bound above the clearance at one end, which makes the list complete.
//
// Errors: invalid cavity, mode or thermal model; a tolerance outside
// 0..a tenth of its dimension; a tuning outside 0..MaxTuning or of a mode
// that an end plate does not tune (EndPlateTuning); a set that reaches
// outside MinDesignRatio..MaxDesignRatio; more than MaxChartModes modes
// near the wanted one.
func (c Cavity) Reach(op Operation) (Reach, error) {
	w := op.Mode
	if err := c.Validate(); err != nil {
		return Reach{}, err
	}
	if err := c.Fill.RequireIsotropic("cavity: the reachable-set model (tuning, temperature, tolerance)"); err != nil {
		return Reach{}, err
	}
	if err := w.Validate(); err != nil {
		return Reach{}, err
	}
	D, L := c.Diameter(), c.Length
	for _, q := range []struct {
		name   string
		v, dim float64
	}{{"diameter tolerance", op.DiameterTol, D}, {"length tolerance", op.LengthTol, L}} {
		if !(q.v >= 0 && q.v < q.dim/10) {
			return Reach{}, &ToleranceError{Name: q.name, Value: q.v, Max: q.dim / 10}
		}
	}
	if !(op.Tuning >= 0 && op.Tuning <= MaxTuning) {
		return Reach{}, fmt.Errorf("cavity: tuning range must be in 0..%g (a fraction; 0.02 is +-2 %%), got %g", MaxTuning, op.Tuning)
	}
	if op.Tuning > 0 {
		if err := w.EndPlateTuning(); err != nil {
			return Reach{}, err
		}
	}
	if !(op.MinClearance >= 0 && op.MinClearance < 1) {
		return Reach{}, fmt.Errorf("cavity: minimum clearance must be in 0..1 (a fraction; 0.03 is 3 %%), got %g", op.MinClearance)
	}
	if err := op.Thermal.Validate(); err != nil {
		return Reach{}, err
	}
	kmin, kmax := op.Thermal.kappaRange()
	wc := newChartMode(w)
	var a0 float64
	if wc.gp > 0 {
		a0 = wc.gx / wc.gp
	}
	pa := newPath(a0, op.Tuning, kmin, kmax)
	sLo := pa.lo.at(sq((D - op.DiameterTol) / (L + op.LengthTol)))
	sHi := pa.hi.at(sq((D + op.DiameterTol) / (L - op.LengthTol)))
	if !(sLo >= sq(MinDesignRatio)) {
		if op.Tuning > 0 && sLo <= 0 {
			return Reach{}, fmt.Errorf("cavity: %s cannot be tuned down by %.4g %% by one end plate: its frequency never falls below %.6g Hz however long the cavity; lower the tuning", w, 100*op.Tuning, frequency(c.scale(), w.Root(), c.Radius, 0, 1))
		}
		return Reach{}, fmt.Errorf("cavity: the reachable D/L falls to %.4g, below %g (the reach of the mode chart); lower the tuning or the tolerance", math.Sqrt(math.Max(sLo, 0)), MinDesignRatio)
	}
	if sHi > sq(MaxDesignRatio) {
		return Reach{}, fmt.Errorf("cavity: the reachable D/L rises to %.4g, above %g (the reach of the mode chart); lower the tuning or the tolerance", math.Sqrt(sHi), MaxDesignRatio)
	}
	out := Reach{Mode: w, Ratio: D / L, RatioLo: math.Sqrt(sLo), RatioHi: math.Sqrt(sHi), Operation: op}
	sp, err := spanClearance(wc, interval{sLo, sHi}, op.MinClearance, op.CountDegenerate)
	if err != nil {
		return Reach{}, err
	}
	out.Worst, out.WorstMode, out.WorstRatio = sp.worst, sp.worstMode, math.Sqrt(sp.worstS)
	// Modes that tie for the worst case are named in mode order, and the
	// first of them is WorstMode, so that the verdict does not depend on
	// which of them won by the last bit.
	var ties []Offender
	for _, o := range sp.modes {
		if o.Clearance <= out.Worst+TieClearance && (o.Crosses || out.Worst > 0) {
			ties = append(ties, o)
		}
	}
	slices.SortStableFunc(ties, func(a, b Offender) int { return compareModes(a.Mode, b.Mode) })
	for _, o := range ties {
		out.WorstModes = append(out.WorstModes, o.Mode)
	}
	if len(ties) > 0 {
		out.WorstMode, out.WorstRatio = ties[0].Mode, ties[0].Ratio
	}
	for _, o := range sp.modes {
		if o.Crosses || o.Clearance < op.MinClearance {
			out.Offending = append(out.Offending, o)
		}
	}
	return out, nil
}

// span is the clearance of a wanted mode over an interval of s.
type span struct {
	worst     float64
	worstMode Mode
	worstS    float64
	// modes holds every listed mode with its smallest distance over the
	// interval, sorted by distance, then mode order.
	modes []Offender
	// crossS holds, parallel to modes, the s where a crossing mode meets
	// the wanted one (0 for the others).
	crossS []float64
}

// spanClearance returns the smallest distance |rho_i - 1| of every mode
// that comes within b of the wanted mode w over iv, and the worst of them,
// with the list made complete for the worst case (derived; see Reach).
func spanClearance(w chartMode, iv interval, b float64, countDegenerate bool) (span, error) {
	// Any mode that sets the worst clearance is within the clearance at
	// iv.lo of the wanted mode somewhere on iv.
	v0, _, err := clearanceAtRatio(w.mode, iv.lo, countDegenerate)
	if err != nil {
		return span{}, err
	}
	bound := math.Max(b, v0)*(1+1e-9) + 1e-12
	modes, err := chartModes(w.mode, iv.lo, iv.hi, bound, countDegenerate)
	if err != nil {
		return span{}, err
	}
	out := span{worst: math.Inf(1)}
	type item struct {
		o Offender
		s float64
	}
	var items []item
	for _, m := range modes {
		r1 := math.Sqrt(m.g(iv.lo)/w.g(iv.lo)) - 1
		r2 := math.Sqrt(m.g(iv.hi)/w.g(iv.hi)) - 1
		it := item{o: Offender{Mode: m.mode}}
		switch {
		case (r1 <= 0) != (r2 <= 0) || r1 == 0 || r2 == 0:
			// The lines meet where gx_m + gp_m s = gx_w + gp_w s.
			s := iv.lo
			if d := m.gp - w.gp; d != 0 {
				s = math.Min(math.Max((w.gx-m.gx)/d, iv.lo), iv.hi)
			} else if r2 == 0 {
				s = iv.hi
			}
			it.o.Crosses, it.s = true, s
			it.o.Ratio = math.Sqrt(s)
		case math.Abs(r1) <= math.Abs(r2):
			it.o.Clearance, it.o.Ratio = math.Abs(r1), math.Sqrt(iv.lo)
		default:
			it.o.Clearance, it.o.Ratio = math.Abs(r2), math.Sqrt(iv.hi)
		}
		items = append(items, it)
	}
	slices.SortStableFunc(items, func(a, b item) int {
		if c := cmpFloat(a.o.Clearance, b.o.Clearance); c != 0 {
			return c
		}
		return compareModes(a.o.Mode, b.o.Mode)
	})
	for _, it := range items {
		out.modes = append(out.modes, it.o)
		out.crossS = append(out.crossS, it.s)
	}
	if len(items) > 0 {
		o := items[0].o
		out.worst, out.worstMode, out.worstS = o.Clearance, o.Mode, sq(o.Ratio)
	}
	return out, nil
}

// kappaRange returns the smallest and largest factor by which the
// temperature range scales D/L, each including 1 (the reference).
func (t Thermal) kappaRange() (kmin, kmax float64) {
	kmin, kmax = 1, 1
	if t.hasRange() {
		k1, k2 := t.ratioScale(t.TMin), t.ratioScale(t.TMax)
		kmin, kmax = math.Min(1, math.Min(k1, k2)), math.Max(1, math.Max(k1, k2))
	}
	return kmin, kmax
}

// ModesBelow returns the modes of c that resonate strictly below mode w,
// lowest first, at most max of them, and how many there are in all. An
// accelerating TM010 cell whose length exceeds about 2.03 times its
// radius has TE111 below it (Pozar, Microwave Engineering, 4th ed., sec.
// 6.4, with j'_11 = 1.8412 and j_01 = 2.4048: derived), so it is no longer
// the fundamental mode. Errors: invalid cavity or mode, max < 1, or those
// of Count.
func (c Cavity) ModesBelow(w Mode, max int) ([]Resonance, int, error) {
	if err := c.Validate(); err != nil {
		return nil, 0, err
	}
	if err := w.Validate(); err != nil {
		return nil, 0, err
	}
	if max < 1 {
		return nil, 0, fmt.Errorf("cavity: number of modes must be >= 1, got %d", max)
	}
	f := math.Nextafter(c.Frequency(w), 0)
	n, _, err := c.Count(f)
	if err != nil {
		return nil, 0, err
	}
	if n == 0 {
		return nil, 0, nil
	}
	low, err := c.Lowest(min(n, max))
	if err != nil {
		return nil, 0, err
	}
	out := low[:0]
	for _, r := range low {
		if r.Frequency <= f {
			out = append(out, r)
		}
	}
	return out, n, nil
}
