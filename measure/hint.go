package measure

import (
	"fmt"
	"math"
	"sort"

	"cylcav/cavity"
	"cylcav/physics"
)

// ModeHint names the mode of one measured resonance: the resonance
// nearest F (Hz) is Mode. With it Identify can start without the
// cavity's drawn size (see CavityFromHint).
type ModeHint struct {
	Mode cavity.Mode
	F    float64
}

// The ratios D/L CavityFromHint searches: from a flat pillbox to a long
// tube, wider than any cavity built as a resonator or filter section
// (common practice). A cavity outside them is refused, not guessed.
const (
	HintRatioMin = 0.2
	HintRatioMax = 5.0
)

// hintGrid is the number of ratios tried, evenly in log(D/L): steps of
// 0.16 %, which move any mode's frequency by at most that (derived: f
// depends on D and L through 1/D^2 and 1/L^2 with weights summing to 1),
// inside the 20 x MatchTol capture of Identify's fit.
const hintGrid = 2000

// hintCapture is the relative distance within which a measured frequency
// counts as near a mode while the ratio is searched: twice Identify's
// default MatchTol, since the start is not yet fitted and the hinted
// resonance may be one of a split TE0mp/TM1mp pair (a few 0.1 %).
const hintCapture = 2 * 0.003

// HintSearch is the result of CavityFromHint.
type HintSearch struct {
	// Cavity is the best starting cavity: the hinted mode at the hinted
	// resonance's measured frequency, the ratio D/L that puts modes
	// nearest the most other resonances.
	Cavity cavity.Cavity
	Hinted int // index of the hinted resonance in f0

	// Near is the number of resonances within hintCapture of a mode of
	// Cavity, the hinted one included, and Chance the number expected
	// near one by chance (see CavityFromHint).
	Near   int
	Chance float64

	// Ambiguous is set when a clearly different ratio (more than 5 %
	// away) explains the resonances about as well (score within one
	// resonance):
	// the identification then rests on too few resonances or a wrong
	// hint, and Alternative is that other starting cavity.
	Ambiguous   bool
	Alternative cavity.Cavity
}

// CavityFromHint finds a starting cavity for Identify when the drawn size
// is not known: the resonance nearest h.F (within 2 %) is taken to be
// h.Mode, which fixes the cavity's scale for each ratio D/L (a cylinder's
// frequencies scale as 1/size at a fixed ratio: Pozar, Microwave
// Engineering, 4th ed., sec. 6.4). The ratio, searched over
// [HintRatioMin, HintRatioMax], is the one with the highest score
//
//	score = Near - N p,   p = min(1, 2 hintCapture n / ln(fmax/fmin)),
//
// Near the resonances within hintCapture of a mode and N p the number
// expected there by chance: n distinct mode frequencies spread over the
// sweep's range put a random frequency within hintCapture of one with
// probability p (derived; a long cavity's dense spectrum matches
// anything, and this keeps it from winning). Ties go to the smaller sum
// of squared relative residuals. fill is the cavity's fill.
//
// The result only starts Identify, which then fits D and L (or the fill)
// to every matched resonance.
func CavityFromHint(f0 []float64, h ModeHint, fill physics.Medium) (HintSearch, error) {
	if err := h.Mode.Validate(); err != nil {
		return HintSearch{}, err
	}
	if !(h.F > 0) || math.IsInf(h.F, 0) {
		return HintSearch{}, fmt.Errorf("measure: the hinted frequency must be > 0 Hz and finite, got %g Hz", h.F)
	}
	if err := fill.Validate(); err != nil {
		return HintSearch{}, err
	}
	if len(f0) == 0 {
		return HintSearch{}, fmt.Errorf("measure: no resonance to identify")
	}
	hinted, fmax := -1, 0.0
	for i, f := range f0 {
		if !(f > 0) || math.IsInf(f, 0) {
			return HintSearch{}, fmt.Errorf("measure: resonance %d: frequency must be > 0 Hz and finite, got %g Hz", i+1, f)
		}
		fmax = math.Max(fmax, f)
		if hinted < 0 || math.Abs(f-h.F) < math.Abs(f0[hinted]-h.F) {
			hinted = i
		}
	}
	// The hint must point at a measured resonance.
	const hintReach = 0.02
	if math.Abs(f0[hinted]-h.F)/h.F > hintReach {
		return HintSearch{}, fmt.Errorf("measure: no resonance within %.0f %% of the hinted %.6g GHz (nearest %.6g GHz)", 100*hintReach, h.F/1e9, f0[hinted]/1e9)
	}
	fh := f0[hinted]
	// at returns the cavity of ratio D/L = r with h.Mode at fh.
	at := func(r float64) cavity.Cavity {
		unit := cavity.Cavity{Radius: r / 2, Length: 1, Fill: fill}
		s := unit.Frequency(h.Mode) / fh
		return cavity.Cavity{Radius: s * r / 2, Length: s, Fill: fill}
	}
	fmin := fmax
	for _, f := range f0 {
		fmin = math.Min(fmin, f)
	}
	lo, hi := fmin*(1-hintCapture), fmax*(1+hintCapture)
	// spread is ln(fmax/fmin), at least one capture width wide.
	spread := math.Max(math.Log(hi/lo), 2*hintCapture)
	type trial struct {
		r, score, ss, chance float64
		near                 int
	}
	trials := make([]trial, hintGrid)
	lr0, lr1 := math.Log(HintRatioMin), math.Log(HintRatioMax)
	for k := range trials {
		r := math.Exp(lr0 + (lr1-lr0)*float64(k)/(hintGrid-1))
		c := at(r)
		ms, err := c.Modes(hi)
		if err != nil {
			return HintSearch{}, err
		}
		var fs []float64
		for _, m := range ms {
			// one frequency per TE0mp/TM1mp pair
			if m.Frequency >= lo && (len(fs) == 0 || m.Frequency > fs[len(fs)-1]*(1+1e-12)) {
				fs = append(fs, m.Frequency)
			}
		}
		tr := trial{r: r, chance: math.Min(1, 2*hintCapture*float64(len(fs))/spread) * float64(len(f0))}
		for _, f := range f0 {
			if d := nearestRel(fs, f); d <= hintCapture {
				tr.near++
				tr.ss += d * d
			}
		}
		tr.score = float64(tr.near) - tr.chance
		trials[k] = tr
	}
	better := func(a, b trial) bool {
		if a.score != b.score {
			return a.score > b.score
		}
		return a.ss < b.ss
	}
	best := 0
	for k := range trials {
		if better(trials[k], trials[best]) {
			best = k
		}
	}
	out := HintSearch{Cavity: at(trials[best].r), Hinted: hinted, Near: trials[best].near, Chance: trials[best].chance}
	// The best trial of the ratios clearly away from the best.
	const apart = 0.05
	alt := -1
	for k, tr := range trials {
		if math.Abs(math.Log(tr.r/trials[best].r)) > apart && (alt < 0 || better(tr, trials[alt])) {
			alt = k
		}
	}
	if alt >= 0 && trials[alt].score > trials[best].score-1 {
		out.Ambiguous, out.Alternative = true, at(trials[alt].r)
	}
	return out, nil
}

// nearestRel returns the relative distance |f - g|/g to the nearest g of
// the ascending fs (+Inf when fs is empty).
func nearestRel(fs []float64, f float64) float64 {
	k := sort.SearchFloat64s(fs, f)
	d := math.Inf(1)
	for _, j := range []int{k - 1, k} {
		if j >= 0 && j < len(fs) {
			d = math.Min(d, math.Abs(f-fs[j])/fs[j])
		}
	}
	return d
}
