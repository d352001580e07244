package measure

import (
	"fmt"
	"math"
	"sort"
)

// Peak is a resonance found in a sweep, with rough values to start a fit.
type Peak struct {
	Index  int     // index of the extreme point in the sweep
	F      float64 // frequency of the extreme point, Hz
	BW     float64 // half-power bandwidth, Hz (rough: from the magnitude only)
	Height float64 // height of the peak (depth of the dip) above the background, dB
}

// FindSettings tunes FindPeaks. The zero value gives the defaults.
type FindSettings struct {
	// Dip looks for dips (|S11| of a reflection measurement) instead of
	// peaks (|S21| of a transmission measurement).
	Dip bool

	// MinHeight is the smallest height of a peak (depth of a dip) above the
	// local background, in dB; 0 means 10 dB for peaks (a resonance seen
	// in transmission stands tens of dB above the leakage) and 1 dB for
	// dips (an undercoupled reflection dip can be shallow).
	MinHeight float64

	// NoiseFactor: a peak must also stand NoiseFactor times the noise's
	// standard deviation (estimated from point-to-point differences) above
	// the background; 0 means 8.
	NoiseFactor float64

	// Split is the dip, in dB below the lower of two maxima, that makes
	// them two resonances rather than one; 0 means 3 dB.
	Split float64
}

// backgroundBlock is the window, in points, of the background filter: wide
// enough that a resonance of a few to a few tens of points is removed,
// narrow enough that a wide sweep's background (leakage interfering with
// far resonance tails) is followed. A sweep shorter than four windows is
// taken to hold one resonance and its skirts, and its window is half the
// sweep.
const backgroundBlock = 201

// smoothWindow is the number of points over which FindPeaks averages the
// power: the mean of 9 exponentially distributed noise powers (the
// magnitude squared of complex Gaussian noise) stays within about 8 dB
// between its 0.5 % and 99.5 % points (chi-squared with 18 degrees of
// freedom), below the 10 dB default height, while a resonance spanning a
// few points is kept (its position and bandwidth come from the raw trace).
const smoothWindow = 9

func backgroundWindow(n int) int {
	if n < 4*backgroundBlock {
		return max(n/2, 3)
	}
	return backgroundBlock
}

// FindPeaks finds the resonances in the magnitude sweep mag (|S|, linear)
// over ascending frequencies f: the background is the morphological
// opening of the trace in dB (a running minimum, then a running maximum,
// over a window of backgroundBlock points or more), which removes every
// peak narrower than the window and keeps a sloping baseline exactly
// (Soille, Morphological Image Analysis, 2nd ed., Springer 2003, sec. 4.3:
// the opening as the envelope below the signal); the noise is
// estimated from the median absolute point-to-point difference; every run
// of points standing above the background by more than the thresholds of s
// holds one or more resonances, split where the response drops by s.Split
// between two maxima. The peaks are returned in ascending frequency.
// A sweep with no resonance gives an error that says so.
func FindPeaks(f, mag []float64, s FindSettings) ([]Peak, error) {
	n := len(f)
	if n != len(mag) {
		return nil, fmt.Errorf("measure: %d frequencies and %d magnitudes", n, len(mag))
	}
	if n < minFitPoints {
		return nil, fmt.Errorf("measure: a sweep of %d points is too short to find resonances (need %d)", n, minFitPoints)
	}
	minH, nf, split := s.MinHeight, s.NoiseFactor, s.Split
	if minH == 0 {
		minH = 10
		if s.Dip {
			minH = 1
		}
	}
	if nf == 0 {
		nf = 8
	}
	if split == 0 {
		split = 3
	}
	sign := 1.0
	if s.Dip {
		sign = -1
	}
	// y: the trace in dB, turned so that resonances are peaks.
	// The power is first averaged over smoothWindow points: a noise floor
	// in dB has deep notches (the magnitude of complex noise comes near
	// zero), which the background filter below would take for the
	// background.
	y := make([]float64, n)
	floor := -400.0 // dB; a zero magnitude would be -Inf
	var sum float64
	pw := make([]float64, n)
	for i, m := range mag {
		if !(m >= 0) || math.IsInf(m, 0) {
			return nil, fmt.Errorf("measure: magnitude %g at %g Hz is not finite and >= 0", m, f[i])
		}
		pw[i] = m * m
	}
	h := smoothWindow / 2
	for i := 0; i < min(h, n); i++ {
		sum += pw[i]
	}
	for i := range y {
		if i+h < n {
			sum += pw[i+h]
		}
		if i-h-1 >= 0 {
			sum -= pw[i-h-1]
		}
		cnt := min(i+h, n-1) - max(i-h, 0) + 1
		y[i] = sign * math.Max(10*math.Log10(sum/float64(cnt)), floor)
	}
	raw := make([]float64, n)
	for i, m := range mag {
		raw[i] = sign * math.Max(20*math.Log10(m), floor)
	}
	base := background(y)
	diffs := make([]float64, n-1)
	for i := range diffs {
		diffs[i] = math.Abs((y[i+1] - base[i+1]) - (y[i] - base[i]))
	}
	// 1.4826 MAD estimates a normal standard deviation; differences of two
	// points have sqrt 2 times the noise of one (common practice).
	sigma := 1.4826 * median(diffs) / math.Sqrt2
	thr := math.Max(minH, nf*sigma)

	var peaks []Peak
	for i := 0; i < n; {
		if y[i]-base[i] <= thr {
			i++
			continue
		}
		j := i
		for j < n && y[j]-base[j] > thr {
			j++
		}
		peaks = append(peaks, splitRun(f, y, raw, base, i, j, split, sign)...)
		i = j
	}
	if len(peaks) == 0 {
		what := "peak of |S21|"
		if s.Dip {
			what = "dip of |S11|"
		}
		return nil, fmt.Errorf("measure: no resonance in %g..%g Hz: no %s stands %.3g dB above the background (noise %.3g dB)", f[0], f[n-1], what, thr, sigma)
	}
	return peaks, nil
}

// background returns the opening of y over a window of w points
// (see backgroundWindow).
func background(y []float64) []float64 {
	w := backgroundWindow(len(y))
	return runningExtreme(runningExtreme(y, w, true), w, false)
}

// runningExtreme returns the minimum (or maximum) of y over the centred
// window of w points at each index, shortened at the ends, in O(len(y))
// with a monotonic deque of indices.
func runningExtreme(y []float64, w int, isMin bool) []float64 {
	n := len(y)
	out := make([]float64, n)
	dq := make([]int, 0, w)
	half := w / 2
	better := func(a, b float64) bool {
		if isMin {
			return a <= b
		}
		return a >= b
	}
	next := 0 // next index to push
	for i := 0; i < n; i++ {
		for ; next < n && next <= i+half; next++ {
			for len(dq) > 0 && better(y[next], y[dq[len(dq)-1]]) {
				dq = dq[:len(dq)-1]
			}
			dq = append(dq, next)
		}
		for dq[0] < i-half {
			dq = dq[1:]
		}
		out[i] = y[dq[0]]
	}
	return out
}

// median returns the median of v, reordering v.
func median(v []float64) float64 {
	sort.Float64s(v)
	n := len(v)
	if n%2 == 1 {
		return v[n/2]
	}
	return (v[n/2-1] + v[n/2]) / 2
}

// splitRun returns the resonances in the run y[i:j] above threshold: its
// local maxima, kept from the highest down when the response between a
// maximum and every kept one drops by split dB below the lower of the two.
// Each peak's position and bandwidth are then taken from the unsmoothed
// trace raw.
func splitRun(f, y, raw, base []float64, i, j int, split, sign float64) []Peak {
	var cand []int
	for k := i; k < j; k++ {
		if (k == i || y[k] >= y[k-1]) && (k == j-1 || y[k] > y[k+1]) {
			cand = append(cand, k)
		}
	}
	sort.Slice(cand, func(a, b int) bool { return y[cand[a]] > y[cand[b]] })
	var kept []int
	for _, c := range cand {
		ok := true
		for _, k := range kept {
			lo, hi := min(c, k), max(c, k)
			low := math.Inf(1)
			for m := lo; m <= hi; m++ {
				low = math.Min(low, y[m])
			}
			if math.Min(y[c], y[k])-low < split {
				ok = false
				break
			}
		}
		if ok {
			kept = append(kept, c)
		}
	}
	sort.Ints(kept)
	out := make([]Peak, 0, len(kept))
	// A resonance is narrower than the background's scale: a bump as wide
	// as a background block is the background's own shape (interference
	// of leakage and far resonance tails), not a resonance.
	n := len(f)
	for _, k := range kept {
		// the raw extreme within the smoothing window
		for m := max(k-smoothWindow/2, 0); m <= min(k+smoothWindow/2, n-1); m++ {
			if raw[m] > raw[k] {
				k = m
			}
		}
		bw := halfPowerWidth(f, raw, base, k, sign)
		w := backgroundWindow(n)
		lo, hi := max(k-w/2, 0), min(k+w/2, n-1)
		if bw >= f[hi]-f[lo] {
			continue
		}
		out = append(out, Peak{Index: k, F: f[k], BW: bw, Height: raw[k] - base[k]})
	}
	return out
}

// halfPowerWidth returns the width between the points, on either side of
// the extreme k, where the power is half way between the extreme and the
// background (linear interpolation between points); for a peak far above
// the background that is the -3 dB width. Where the response does not
// come back down on one side, the other side's half width is doubled.
func halfPowerWidth(f, y, base []float64, k int, sign float64) float64 {
	pw := func(i int) float64 { return math.Pow(10, sign*y[i]/10) }
	pk, bg := pw(k), math.Pow(10, sign*base[k]/10)
	level := (pk + bg) / 2
	cross := func(dir int) (float64, bool) {
		for i := k; i+dir >= 0 && i+dir < len(f); i += dir {
			a, b := pw(i), pw(i+dir)
			if (a-level)*(b-level) <= 0 && a != b {
				u := (a - level) / (a - b)
				return f[i] + u*(f[i+dir]-f[i]), true
			}
		}
		return 0, false
	}
	lo, okL := cross(-1)
	hi, okH := cross(1)
	switch {
	case okL && okH:
		return hi - lo
	case okL:
		return 2 * (f[k] - lo)
	case okH:
		return 2 * (hi - f[k])
	}
	return f[len(f)-1] - f[0]
}
