package measure

import (
	"fmt"
	"math"
	"math/cmplx"
	"sort"

	"cylcav/touchstone"
)

// Kind says how a resonance was measured.
type Kind int

const (
	Reflection   Kind = iota + 1 // one port: S11
	Transmission                 // two ports: S21, with S11 and S22 for the couplings
)

func (k Kind) String() string {
	switch k {
	case Reflection:
		return "reflection"
	case Transmission:
		return "transmission"
	}
	return fmt.Sprintf("Kind(%d)", int(k))
}

// Settings tunes Analyze. The zero value gives the defaults.
type Settings struct {
	Find FindSettings // Dip is set from the port count

	// Window is the half width of the fitted window in rough bandwidths
	// (FindPeaks' BW) on each side of a peak; 0 means 3. Windows stop half
	// way to a neighbouring resonance.
	Window float64

	// MaxDelay bounds the cable delay searched by the fit, s; 0 means the
	// inverse of the window width (a full turn of phase across it), a
	// negative value fixes the delay at zero.
	MaxDelay float64
}

// Resonance is one fitted resonance of a sweep.
type Resonance struct {
	Kind Kind
	Peak Peak // where FindPeaks found it

	F0, F0Err float64 // resonant frequency and standard uncertainty, Hz
	QL, QLErr float64 // loaded Q and standard uncertainty

	// Beta1 (port 1) and Beta2 (port 2; 0 for a reflection measurement)
	// are the coupling coefficients, with standard uncertainties.
	Beta1, Beta1Err float64
	Beta2, Beta2Err float64

	Q0, Q0Err float64 // unloaded Q and standard uncertainty

	// Main is the fit of S11 (reflection) or S21 (transmission); Port1 and
	// Port2 are the fits of S11 and S22 of a transmission measurement.
	Main, Port1, Port2 *Circle

	// Q3dB is the loaded Q from the half-power bandwidth of the magnitude
	// (NaN when the response does not cross the half-power level on both
	// sides of the window); Agree says whether it matches the fit within
	// agreeTol plus three standard uncertainties of QL.
	Q3dB  float64
	Agree bool

	// Problem, when not empty, says why the resonance could not be fitted;
	// the numbers are then NaN.
	Problem string
}

// agreeTol is the relative difference between the 3 dB and the fitted QL
// beyond which Analyze reports a disagreement: the 3 dB method, with
// interpolated half-power points, is good to a few percent on a clean
// isolated resonance (common practice), so a larger difference means
// leakage, delay or coupling loss bias the magnitude.
const agreeTol = 0.05

// Analyze finds and fits every resonance of a one-port (reflection, dips
// of |S11|) or two-port (transmission, peaks of |S21|) sweep. It returns
// an error when the sweep has no resonance; a resonance that cannot be
// fitted is returned with its Problem set.
func Analyze(d *touchstone.Data, s Settings) ([]Resonance, error) {
	if err := d.Validate(); err != nil {
		return nil, err
	}
	kind := Transmission
	main := d.Param(1, 1)
	if d.Ports == 1 {
		kind = Reflection
	} else {
		main = d.Param(2, 1)
	}
	fs := s.Find
	fs.Dip = kind == Reflection
	mag := make([]float64, len(main))
	for i, v := range main {
		mag[i] = cmplx.Abs(v)
	}
	peaks, err := FindPeaks(d.Freq, mag, fs)
	if err != nil {
		return nil, err
	}
	win := s.Window
	if win == 0 {
		win = 3
	}
	out := make([]Resonance, len(peaks))
	for k, p := range peaks {
		lo, hi := p.F-win*p.BW, p.F+win*p.BW
		if k > 0 {
			lo = math.Max(lo, (peaks[k-1].F+p.F)/2)
		}
		if k < len(peaks)-1 {
			hi = math.Min(hi, (peaks[k+1].F+p.F)/2)
		}
		i := sort.SearchFloat64s(d.Freq, lo)
		j := sort.SearchFloat64s(d.Freq, hi)
		if j < len(d.Freq) && d.Freq[j] == hi {
			j++
		}
		out[k] = fitOne(d, kind, p, i, j, s.MaxDelay)
	}
	return out, nil
}

func fitOne(d *touchstone.Data, kind Kind, p Peak, i, j int, maxDelay float64) Resonance {
	nan := math.NaN()
	r := Resonance{Kind: kind, Peak: p, F0: nan, F0Err: nan, QL: nan, QLErr: nan, Beta1: nan, Beta1Err: nan,
		Beta2: nan, Beta2Err: nan, Q0: nan, Q0Err: nan, Q3dB: nan}
	f := d.Freq[i:j]
	if len(f) > 1 && maxDelay == 0 {
		maxDelay = 1 / (f[len(f)-1] - f[0])
	}
	if maxDelay < 0 {
		maxDelay = 0
	}
	fGuess, qGuess := p.F, p.F/p.BW
	set := FitSettings{MaxDelay: maxDelay}
	fit := func(s []complex128) (*Circle, error) {
		c, err := FitCircle(f, s[i:j], fGuess, qGuess, set)
		return &c, err
	}
	var err error
	if kind == Reflection {
		if r.Main, err = fit(d.Param(1, 1)); err != nil {
			r.Problem = err.Error()
			return r
		}
	} else {
		if r.Main, err = fit(d.Param(2, 1)); err == nil {
			// The reflection circles start from the transmission fit.
			// With f0 and QL fixed the resonance's own phase cannot be
			// taken for a delay, so a longer one is searched: the
			// reflections see the cables twice, and a broad resonance's
			// window can exceed the inverse of that round trip.
			fGuess, qGuess, set.Fixed = r.Main.F0, r.Main.QL, true
			set.MaxDelay = fixedDelayFactor * maxDelay
			if r.Port1, err = fit(d.Param(1, 1)); err == nil {
				r.Port2, err = fit(d.Param(2, 2))
			}
		}
		if err != nil {
			r.Problem = err.Error()
			return r
		}
	}
	m := r.Main
	r.F0, r.F0Err, r.QL, r.QLErr = m.F0, m.F0Err, m.QL, m.QLErr
	if kind == Reflection {
		dd := m.Diameter
		if !(dd < 2) {
			r.Problem = fmt.Sprintf("reflection circle diameter %.3g is not below 2: not a passive resonance", dd)
			return r
		}
		r.Beta1 = dd / (2 - dd)                   // Kajfez 2011 ch. 2: d = 2 beta/(1 + beta)
		r.Beta1Err = 2 * m.DiameterErr / sq(2-dd) // derived
		r.Beta2, r.Beta2Err = 0, 0
		r.Q0 = 2 * m.QL / (2 - dd) // QL (1 + beta)
		r.Q0Err = math.Hypot(2*m.QLErr/(2-dd), 2*m.QL*m.DiameterErr/sq(2-dd))
	} else {
		d1, d2 := r.Port1.Diameter, r.Port2.Diameter
		e1, e2 := r.Port1.DiameterErr, r.Port2.DiameterErr
		den := 2 - d1 - d2
		if !(den > 0) {
			r.Problem = fmt.Sprintf("reflection circles of S11 and S22 (diameters %.3g, %.3g) sum to 2 or more: not a two-port transmission resonance", d1, d2)
			return r
		}
		// derived from d_i = 2 beta_i / (1 + beta1 + beta2), Kajfez 2011 ch. 2
		r.Beta1, r.Beta2 = d1/den, d2/den
		r.Beta1Err = math.Hypot((2-d2)*e1, d1*e2) / sq(den)
		r.Beta2Err = math.Hypot(d2*e1, (2-d1)*e2) / sq(den)
		r.Q0 = 2 * m.QL / den // QL (1 + beta1 + beta2)
		r.Q0Err = math.Hypot(2*m.QLErr/den, 2*m.QL*math.Hypot(e1, e2)/sq(den))
	}
	mag := make([]float64, j-i)
	main := d.Param(1, 1)
	if kind == Transmission {
		main = d.Param(2, 1)
	}
	for k := range mag {
		mag[k] = cmplx.Abs(main[i+k])
	}
	detuned := -1.0 // transmission: half the peak power
	if kind == Reflection {
		detuned = cmplx.Abs(m.Detuned)
	}
	if bw := threeDB(f, mag, detuned); bw > 0 {
		r.Q3dB = r.F0 / bw
		r.Agree = math.Abs(r.Q3dB-r.QL) <= agreeTol*r.QL+3*r.QLErr
	}
	return r
}

// fixedDelayFactor widens the delay search of the reflection fits of a
// transmission measurement (f0 and QL fixed) beyond the inverse of the
// window: four windows' worth of phase turns, enough for the round trip
// of cables a few times longer than the one-way delay of the default
// (derived from the default's rule; checked on gen_disc.py's sweeps).
const fixedDelayFactor = 4

func sq(x float64) float64 { return x * x }

// threeDB returns the half-power bandwidth of the magnitude sweep: for a
// peak (detuned < 0) the width at half the peak power, for a dip the width
// where the power is half way between the minimum and the detuned power
// detuned^2 (for an ideal reflection circle these are the points t = t0 +-
// 1/QL; Kajfez 2011 ch. 2). The detuned magnitude comes from the fit, as
// the window's ends are still on the resonance's skirts. It returns 0 when
// the response does not cross the level on both sides.
func threeDB(f, mag []float64, detuned float64) float64 {
	dip := detuned >= 0
	n := len(f)
	p := make([]float64, n)
	k := 0
	for i, m := range mag {
		p[i] = m * m
		if (!dip && p[i] > p[k]) || (dip && p[i] < p[k]) {
			k = i
		}
	}
	level := p[k] / 2
	if dip {
		level = (p[k] + detuned*detuned) / 2
	}
	cross := func(dir int) (float64, bool) {
		for i := k; i+dir >= 0 && i+dir < n; i += dir {
			a, b := p[i], p[i+dir]
			if (a-level)*(b-level) <= 0 && a != b {
				return f[i] + (a-level)/(a-b)*(f[i+dir]-f[i]), true
			}
		}
		return 0, false
	}
	lo, ok1 := cross(-1)
	hi, ok2 := cross(1)
	if !ok1 || !ok2 {
		return 0
	}
	return hi - lo
}
