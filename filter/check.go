package filter

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"cylcav/physics"
)

// Verdict is the outcome of one check line or of a whole table.
type Verdict int

const (
	// Met: the requirement holds.
	Met Verdict = iota
	// NotMet: the requirement fails.
	NotMet
	// OutsideModel: the requirement lies where the coupling-matrix model
	// does not hold (beyond the model range or beyond a spurious resonance
	// of the cavities), so it cannot be checked.
	OutsideModel
)

// String returns "pass", "fail" or "outside model".
func (v Verdict) String() string {
	switch v {
	case Met:
		return "pass"
	case NotMet:
		return "fail"
	case OutsideModel:
		return "outside model"
	}
	return fmt.Sprintf("Verdict(%d)", int(v))
}

// Check is one line of a specification check: a named requirement, the
// value required, the value achieved by the computed response, and the
// verdict. Values are in dB. AtLeast tells the direction: true when the
// achieved value must be >= Required (return loss, rejection), false when
// it must be <= Required (ripple).
type Check struct {
	Name     string
	F        float64 // Hz: a rejection's stated frequency, 0 for a passband-wide line
	Required float64 // dB; NaN for an information line without a requirement
	Achieved float64 // dB; NaN when not evaluated (Verdict OutsideModel)
	AtLeast  bool
	// Pass is Verdict == Met.
	Pass    bool
	Verdict Verdict
	// Info is true for a line reported for information (a derived value,
	// or the effect of the losses), which does not decide the overall
	// verdict (see Overall).
	Info bool
	// Band is, for a rejection, the frequency range (Hz, ascending) on
	// which the response was evaluated: from F outwards to the end of the
	// band of interest or to the first spurious resonance inside it.
	Band [2]float64
	// Worst is the frequency (Hz) at which Achieved is taken: the
	// attenuation minimum of a rejection band, or the worst passband point.
	Worst float64
	// Spurious is, for a rejection, the cavity resonance that fails it
	// (inside the rejection band, Verdict NotMet) or that puts it outside
	// the model (between the passband and F, Verdict OutsideModel); nil
	// otherwise.
	Spurious *Spurious
	// Note says why a line is not Met, for people.
	Note string
}

// Overall returns the verdict of a check table: NotMet if any requirement
// (a line that is not Info) fails, else OutsideModel if any requirement
// could not be checked, else Met.
func Overall(checks []Check) Verdict {
	v := Met
	for _, c := range checks {
		if c.Info {
			continue
		}
		switch c.Verdict {
		case NotMet:
			return NotMet
		case OutsideModel:
			v = OutsideModel
		}
	}
	return v
}

// checkTol is the margin, in dB, by which an achieved value may miss the
// requirement and still pass: rounding only (the lossless design meets its
// return loss exactly at the ripple peaks).
const checkTol = 1e-9

// passbandSamples is the number of uniformly spaced passband samples per
// resonator used by Check, on top of the exact ripple peaks and reflection
// zeros.
const passbandSamples = 64

// Check evaluates the design against its specification and returns the
// pass/fail table. q0 holds the unloaded quality factors (one per
// resonator, empty for lossless); spurious lists the other resonances of
// the cavities (Realisation.Spurious, nil without cavities). The lines, in
// this fixed order:
//
//  1. "return loss": the smallest passband return loss of the lossless
//     design, required >= the spec's ReturnLoss (Butterworth: the
//     band-edge 3.0103 dB, Info);
//  2. "passband ripple": the spread max - min of the lossless passband
//     insertion loss, required <= the spec's Ripple (Butterworth:
//     3.0103 dB, Info). Return loss and ripple are one requirement (each
//     fixes the other) on the design's ripple level; the losses are
//     reported apart, so that a correct design never fails on them;
//  3. with finite q0 only, two Info lines: "return loss with losses", the
//     smallest passband return loss of the lossy response, and
//     "passband rounding with losses", the spread max - min of its
//     passband insertion loss (dissipation rounds the band edges);
//  4. "rejection" for each region of the mask (Spec.Mask), in the order
//     of Spec.Rejections: the least insertion loss (with the losses) from
//     F outwards to the end of the band of interest, required >= the
//     Attenuation. Its minimum is located exactly (bandMinimum: the lobes
//     between and beyond the transmission zeros are bracketed on samples
//     and refined). A spurious resonance of the cavities inside the region
//     fails the line (the filter passes signal there; the response is
//     evaluated up to it); a region beyond the model range, or beyond the
//     first spurious resonance on its side of the passband (the
//     TE0mp/TM1mp companion and resonances inside the passband excepted),
//     is OutsideModel with Achieved NaN.
//
// The passband is sampled at the exact ripple peaks and reflection zeros of
// the lossless response plus passbandSamples*N uniform points in Omega,
// each local extremum refined by golden-section search, so the minimum
// return loss and the insertion-loss extremes are found exactly.
func (d *Design) Check(q0 []float64, spurious []Spurious) ([]Check, error) {
	if d == nil || d.Folded == nil || d.Spec.Order < 1 {
		return nil, errors.New("filter: Check needs a synthesised design (from Synthesize)")
	}
	s := d.Spec
	lossless, err := d.evaluator(nil)
	if err != nil {
		return nil, err
	}
	lossy, err := d.evaluator(q0)
	if err != nil {
		return nil, err
	}
	grid := d.passbandGrid()
	pb := passbandExtremes(lossless, grid)
	reqRL, reqRipple := s.ReturnLoss, s.Ripple
	info := s.Family == Butterworth
	if info {
		reqRL = ReturnLossFromRipple(10 * math.Log10(2))
		reqRipple = 10 * math.Log10(2)
	}
	bp := func(w float64) float64 { return BandpassFrequency(w, s.F0, s.BW) }
	checks := []Check{
		{Name: "return loss", Required: reqRL, Achieved: pb.minRL, AtLeast: true, Info: info, Worst: bp(pb.wRL)},
		{Name: "passband ripple", Required: reqRipple, Achieved: pb.maxIL - pb.minIL, Info: info, Worst: bp(pb.wMaxIL)},
	}
	if lossyQ(q0) {
		pl := passbandExtremes(lossy, grid)
		checks = append(checks,
			Check{Name: "return loss with losses", Required: math.NaN(), Achieved: pl.minRL, AtLeast: true, Info: true, Worst: bp(pl.wRL)},
			Check{Name: "passband rounding with losses", Required: math.NaN(), Achieved: pl.maxIL - pl.minIL, Info: true, Worst: bp(pl.wMaxIL)})
	}
	il := func(w float64) float64 {
		_, s21, _, _ := lossy.at(w)
		return -db(s21)
	}
	f1, f2 := BandpassFrequency(-1, s.F0, s.BW), BandpassFrequency(1, s.F0, s.BW)
	for _, g := range s.mask().Regions {
		c := Check{Name: "rejection", F: g.F, Required: g.Attenuation, Achieved: math.NaN(), AtLeast: true}
		first := firstSpurious(spurious, g.Above, f1, f2)
		switch {
		case first != nil && (g.Above && first.F < g.F || !g.Above && first.F > g.F):
			c.Verdict, c.Spurious = OutsideModel, first
			c.Note = fmt.Sprintf("beyond the first spurious resonance of the cavities, %s at %s, the coupling-matrix model does not hold", first.Mode, physics.FormatFrequency(first.F, 6))
		case g.OutsideModel:
			side := "+"
			if !g.Above {
				side = "-"
			}
			c.Verdict = OutsideModel
			c.Note = fmt.Sprintf("beyond f0 %s %g %%, the coupling-matrix model does not hold (frequency-dependent couplings, cavity modes)", side, 100*ModelOffset)
		default:
			lo, hi := g.Low, g.High
			if first != nil && first.F >= lo && first.F <= hi {
				c.Spurious = first
				if g.Above {
					hi = first.F
				} else {
					lo = first.F
				}
			}
			c.Band = [2]float64{lo, hi}
			w, a := bandMinimum(il, LowpassOmega(lo, s.F0, s.BW), LowpassOmega(hi, s.F0, s.BW), d.Zeros)
			c.Achieved, c.Worst = a, bp(w)
			switch {
			case c.Spurious != nil:
				c.Verdict = NotMet
				c.Note = fmt.Sprintf("spurious resonance %s of the cavities at %s lies in the rejection band: the filter passes signal there", c.Spurious.Mode, physics.FormatFrequency(c.Spurious.F, 6))
			case a < g.Attenuation-checkTol:
				c.Verdict = NotMet
				c.Note = fmt.Sprintf("the attenuation falls to %.4g dB at %s", a, physics.FormatFrequency(c.Worst, 6))
			}
		}
		checks = append(checks, c)
	}
	for i := range checks {
		c := &checks[i]
		if c.Name == "rejection" || math.IsNaN(c.Required) {
			c.Pass = c.Verdict == Met
			continue
		}
		if c.AtLeast {
			c.Pass = c.Achieved >= c.Required-checkTol
		} else {
			c.Pass = c.Achieved <= c.Required+checkTol
		}
		if !c.Pass {
			c.Verdict = NotMet
		}
	}
	return checks, nil
}

// firstSpurious returns the spurious resonance nearest the passband on one
// side of it (above f2 when above, else below f1), leaving out the exact
// companion of the wanted mode and resonances inside the passband; nil if
// there is none.
func firstSpurious(sp []Spurious, above bool, f1, f2 float64) *Spurious {
	var best *Spurious
	for i := range sp {
		s := &sp[i]
		if s.Companion || (s.F >= f1 && s.F <= f2) {
			continue
		}
		switch {
		case above && s.F > f2 && (best == nil || s.F < best.F):
			best = s
		case !above && s.F < f1 && (best == nil || s.F > best.F):
			best = s
		}
	}
	if best == nil {
		return nil
	}
	c := *best
	return &c
}

// lossyQ reports whether q0 holds a finite unloaded Q.
func lossyQ(q0 []float64) bool {
	for _, q := range q0 {
		if !math.IsInf(q, 1) {
			return true
		}
	}
	return false
}

// evaluator returns the network evaluator of the folded matrix with the
// unloaded Qs q0 (empty for lossless).
func (d *Design) evaluator(q0 []float64) (*evaluator, error) {
	loss, err := lossTerms(d.Spec.Order, d.Spec.F0, d.Spec.BW, q0)
	if err != nil {
		return nil, err
	}
	return newEvaluator(d.Folded, loss), nil
}

// passbandGrid returns the passband samples of Check, ascending: the exact
// reflection zeros and ripple peaks (band edges for Butterworth) and
// passbandSamples*N uniform points in Omega.
func (d *Design) passbandGrid() []float64 {
	n := d.Spec.Order
	var ws []float64
	ws = append(ws, d.ReflectionZeros...)
	if d.Spec.Family == Chebyshev {
		ws = append(ws, ripplePeaks(n, d.Zeros, d.RealPairs...)...)
	} else {
		ws = append(ws, -1, 1)
	}
	m := passbandSamples * n
	for i := 0; i <= m; i++ {
		ws = append(ws, -1+2*float64(i)/float64(m))
	}
	slices.Sort(ws)
	return slices.Compact(ws)
}

// passband holds the extremes of a response across the passband and where
// they lie (normalised Omega).
type passband struct {
	minRL, minIL, maxIL float64
	wRL, wMinIL, wMaxIL float64
}

// passbandExtremes locates the smallest return loss and the extremes of the
// insertion loss of ev on the passband grid, each refined (gridMinimum).
func passbandExtremes(ev *evaluator, grid []float64) passband {
	rl := func(w float64) float64 {
		s11, _, _, _ := ev.at(w)
		return -db(s11)
	}
	il := func(w float64) float64 {
		_, s21, _, _ := ev.at(w)
		return -db(s21)
	}
	var p passband
	p.wRL, p.minRL = gridMinimum(rl, grid)
	p.wMinIL, p.minIL = gridMinimum(il, grid)
	var negMax float64
	p.wMaxIL, negMax = gridMinimum(func(w float64) float64 { return -il(w) }, grid)
	p.maxIL = -negMax
	return p
}

// DelayStats summarises the group delay of S21 (seconds): at the centre
// frequency and its extremes across the passband.
type DelayStats struct {
	AtF0     float64 // s, at f0
	Min, Max float64 // s, the extremes across the passband f1..f2
	FMin     float64 // Hz, where Min is taken
	FMax     float64 // Hz, where Max is taken
}

// Variation returns Max - Min, the passband group-delay variation.
func (g DelayStats) Variation() float64 { return g.Max - g.Min }

// Delay returns the group delay of S21 of the design with unloaded Qs q0
// (empty for lossless) at f0 and its extremes across the passband, located
// on the passband grid of Check and refined by golden-section search. The
// delay is the exact derivative of the network (see Response).
func (d *Design) Delay(q0 []float64) (DelayStats, error) {
	if d == nil || d.Folded == nil || d.Spec.Order < 1 {
		return DelayStats{}, errors.New("filter: Delay needs a synthesised design (from Synthesize)")
	}
	ev, err := d.evaluator(q0)
	if err != nil {
		return DelayStats{}, err
	}
	f0, bw := d.Spec.F0, d.Spec.BW
	tau := func(w float64) float64 {
		_, s21, _, ds := ev.at(w)
		f := BandpassFrequency(w, f0, bw)
		return -imag(ds/s21) * (1 + (f0/f)*(f0/f)) / bw / (2 * math.Pi)
	}
	grid := d.passbandGrid()
	var g DelayStats
	g.AtF0 = tau(0)
	wmin, tmin := gridMinimum(tau, grid)
	wmax, negMax := gridMinimum(func(w float64) float64 { return -tau(w) }, grid)
	g.Min, g.Max = tmin, -negMax
	g.FMin, g.FMax = BandpassFrequency(wmin, f0, bw), BandpassFrequency(wmax, f0, bw)
	return g, nil
}

// DelayLoss returns the first-order dissipation loss at f0, in dB, of a
// filter with unloaded quality factors q0 (one per resonator, or a single
// value for all) whose lossless group delay at f0 is tau seconds:
//
//	dIL(f0) ~= 4.343 omega0 tau(f0) / Q0  dB,   omega0 = 2 pi f0
//
// Derived: loss in every resonator moves the lowpass variable s = j Omega to
// s + d with d = f0/(bw Q0) (see Response), and to first order
// ln|S21| changes by -d tau_Omega, tau_Omega = -d arg S21/d Omega; at f0
// tau_Omega = pi bw tau, so dIL = 8.686 pi f0 tau / Q0. This is the
// classical proportionality of dissipation loss and group delay
// (Matthaei, Young & Jones 1964, sec. 4.13, recalled from memory); for an
// all-pole design matched at f0 it equals Cohn's estimate (CohnLoss),
// since there tau_Omega(0) = sum g_i / 2, and unlike Cohn's form it holds
// for designs with transmission zeros too. With unequal Q0 the mean of
// 1/Q0 is used (exact to first order when the resonators store equal
// energy, as in a synchronously tuned design).
func DelayLoss(f0, tau float64, q0 []float64) (float64, error) {
	if !(f0 > 0) || math.IsInf(f0, 0) {
		return 0, fmt.Errorf("filter: centre frequency must be > 0 Hz and finite, got %g Hz", f0)
	}
	if !(tau > 0) || math.IsInf(tau, 0) {
		return 0, fmt.Errorf("filter: group delay must be > 0 s and finite, got %g s", tau)
	}
	if len(q0) == 0 {
		return 0, errors.New("filter: DelayLoss needs at least one unloaded Q")
	}
	inv := 0.0
	for i, q := range q0 {
		if !(q > 0) {
			return 0, fmt.Errorf("filter: unloaded Q of resonator %d must be > 0, got %g", i+1, q)
		}
		inv += 1 / q
	}
	inv /= float64(len(q0))
	return dbPerNeper20 / 2 * 2 * math.Pi * f0 * tau * inv, nil // 4.343 omega0 tau / Q0 (derived above)
}

// gridMinimum returns the smallest value of f over the ascending samples ws
// and where it lies, each sample that is no larger than its neighbours
// refined by golden-section search on the bracket its neighbours form.
func gridMinimum(f func(float64) float64, ws []float64) (wmin, fmin float64) {
	ys := make([]float64, len(ws))
	wmin, fmin = math.NaN(), math.Inf(1)
	for i, w := range ws {
		ys[i] = f(w)
		if ys[i] < fmin {
			wmin, fmin = w, ys[i]
		}
	}
	for i := 1; i+1 < len(ws); i++ {
		if !(ys[i] <= ys[i-1] && ys[i] <= ys[i+1]) {
			continue
		}
		x, y := goldenMin(f, ws[i-1], ws[i+1])
		if y < fmin {
			wmin, fmin = x, y
		}
	}
	return wmin, fmin
}

// CohnLoss returns Cohn's estimate of the midband insertion loss, in dB, of
// a direct-coupled resonator filter with lowpass element values
// g = [g_0, ..., g_{N+1}], fractional bandwidth fbw and unloaded quality
// factors q0 (one per resonator, or a single value for all):
//
//	IL(f0) ~= 4.343 sum_{i=1..N} g_i / (fbw Q0_i)  dB
//
// (S. B. Cohn, "Dissipation loss in multiple-coupled-resonator filters",
// Proc. IRE 47 (1959) 1342-1348; 4.343 = 10 log10 e), the dissipation
// loss on top of the lossless midband loss. It is first order in 1/Q0 and
// assumes a matched midband: against the exact response (Response) it is
// within 1 % for odd N, and for even N with ripple up to 0.01 dB, at losses
// below 1 dB; for even N it overestimates as the ripple grows (2 % at
// 0.1 dB, 10 % at 0.5 dB), the midband then being a ripple peak. It applies
// to all-pole designs (for which Design.G is set).
func CohnLoss(g []float64, fbw float64, q0 []float64) (float64, error) {
	if err := checkG(g); err != nil {
		return 0, err
	}
	if err := checkFBW(fbw); err != nil {
		return 0, err
	}
	n := len(g) - 2
	if len(q0) != 1 && len(q0) != n {
		return 0, fmt.Errorf("filter: need 1 or %d unloaded Q values, got %d", n, len(q0))
	}
	sum := 0.0
	for i := 1; i <= n; i++ {
		q := q0[0]
		if len(q0) == n {
			q = q0[i-1]
		}
		if !(q > 0) {
			return 0, fmt.Errorf("filter: unloaded Q of resonator %d must be > 0, got %g", i, q)
		}
		sum += g[i] / q
	}
	return dbPerNeper20 / 2 * sum / fbw, nil // Cohn 1959: 4.343 sum g_i/(fbw Q0)
}
