package cavity

import (
	"fmt"
	"math"
	"slices"
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
