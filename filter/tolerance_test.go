package filter

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"cylcav/cavity"
)

// tolDesign is an invented 6-pole 1 % channel filter with two rejection
// lines, realised as TE011 copper cavities with D/L = 1.2.
func tolDesign(t testing.TB) (*Design, *Realisation) {
	t.Helper()
	s := Spec{F0: 10e9, BW: 100e6, Order: 6, ReturnLoss: 20,
		Rejections: []Rejection{{F: 10.12e9, Attenuation: 40}, {F: 9.88e9, Attenuation: 40}}}
	d, err := Synthesize(s)
	if err != nil {
		t.Fatal(err)
	}
	r, err := Realise(d, RealiseOptions{Shape: cavity.ByRatio(1.2), Walls: copperWalls()})
	if err != nil {
		t.Fatal(err)
	}
	return d, r
}

// TestYieldLinearAgrees checks the Monte Carlo spread of |S21| and |S11|
// against the linearised spread (an independent route: central
// differences of the response times the standard deviations) for small
// tolerances, where the response is nearly linear in the errors. The
// sampling error of a standard deviation from n normal samples is
// sigma/sqrt(2(n-1)) (any statistics text; recalled from memory); the
// bound is four of those plus 2 % for the curvature left at these
// tolerances.
func TestYieldLinearAgrees(t *testing.T) {
	d, r := tolDesign(t)
	const n = 4000
	freqs := []float64{9.93e9, 9.95e9, 10.0e9, 10.05e9, 10.07e9, 10.12e9}
	res, err := Yield(d, r, YieldOptions{Machining: Machining{Diameter: 1e-6, Length: 1e-6, Coupling: 0.003},
		Samples: n, Seed: 7, Freqs: freqs})
	if err != nil {
		t.Fatal(err)
	}
	se := 1 / math.Sqrt(2*(n-1))
	for _, p := range res.Points {
		for _, q := range []struct {
			name string
			s    Scatter
		}{{"S21", p.S21DB}, {"S11", p.S11DB}} {
			if q.s.Linear < 1e-6 {
				continue
			}
			rel := math.Abs(q.s.Std-q.s.Linear) / q.s.Linear
			t.Logf("%.4g GHz %s: MC std %.4g dB, linear %.4g dB (rel %.3g, 4 SE = %.3g)", p.F/1e9, q.name, q.s.Std, q.s.Linear, rel, 4*se)
			if rel > 4*se+0.02 {
				t.Errorf("%.4g GHz %s: Monte Carlo std %.4g dB differs from linearised %.4g dB by %.3g (> %.3g)", p.F/1e9, q.name, q.s.Std, q.s.Linear, rel, 4*se+0.02)
			}
		}
	}
}

// TestYieldReproducible checks that a run depends on the seed only, not on
// the number of workers, and that tiny and huge tolerances give yields of
// 1 and 0 through the specification check.
func TestYieldReproducible(t *testing.T) {
	d, r := tolDesign(t)
	tol := Machining{Diameter: 20e-6, Length: 20e-6, Coupling: 0.02}
	run := func(workers int, seed uint64, tol Machining) *YieldResult {
		res, err := Yield(d, r, YieldOptions{Machining: tol, Samples: 40, Seed: seed, Workers: workers, Verdict: true, ReturnLoss: 19,
			Freqs: []float64{10.12e9}})
		if err != nil {
			t.Fatal(err)
		}
		return res
	}
	a, b := run(1, 3, tol), run(3, 3, tol)
	if a.Yield != b.Yield || a.Tuning[2] != b.Tuning[2] || a.Lines[0].P50 != b.Lines[0].P50 {
		t.Errorf("1 and 3 workers differ: yield %g/%g, tuning %+v/%+v", a.Yield, b.Yield, a.Tuning[2], b.Tuning[2])
	}
	if got := run(2, 1, Machining{Diameter: 1e-9}).Yield; got != 1 {
		t.Errorf("yield at 1 nm tolerance = %g, want 1", got)
	}
	if got := run(2, 1, Machining{Diameter: 200e-6, Length: 200e-6}).Yield; got != 0 {
		t.Errorf("yield at 0.2 mm tolerance of a 1 %% filter = %g, want 0", got)
	}
}

// TestTuningNeed checks the tuning range against the frequency
// sensitivities: the frequency error of a resonator is
// df = (df/dD) dD + (df/dL) dL, normal with standard deviation
// sqrt((df/dD sigma_D)^2 + (df/dL sigma_L)^2); the range of 4000 normal
// samples lies between 6 and 9 standard deviations (expected range of a
// normal sample, about 7.4 sigma for n = 4000: Tippett 1925, recalled
// from memory).
func TestTuningNeed(t *testing.T) {
	d, r := tolDesign(t)
	tol := Machining{Diameter: 30e-6, Length: 30e-6}
	res, err := Yield(d, r, YieldOptions{Machining: tol, Samples: 4000, Seed: 11})
	if err != nil {
		t.Fatal(err)
	}
	for i, c := range r.Cavities {
		s, err := c.Cavity.Sensitivity(r.Mode, cavity.Thermal{})
		if err != nil {
			t.Fatal(err)
		}
		sd := math.Hypot(s.DfDD*tol.Diameter/3, s.DfDL*tol.Length/3)
		if k := res.Tuning[i].Span / sd; k < 6 || k > 9 {
			t.Errorf("resonator %d: tuning span %.4g Hz = %.3g sigma, want 6..9", i+1, res.Tuning[i].Span, k)
		}
	}
	st, err := ScrewTunings(r, res.Tuning)
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range st {
		// TE011 on the axis of an end plate: normal H only, the boss
		// raises f (Slater: removing magnetic energy).
		if !(s.PerCube > 0) {
			t.Errorf("resonator %d: shift per r0^3 = %g, want > 0 for TE011", s.Resonator, s.PerCube)
		}
		if !s.OnSide || math.Abs(s.At.Z/r.Cavities[0].Cavity.Length-0.5) > 0.04 {
			t.Errorf("resonator %d: screw at %+v (side wall %v), want the side wall at mid-length, where TE011's wall H peaks", s.Resonator, s.At, s.OnSide)
		}
		if math.Abs(s.Shift-s.Span)/s.Span > 1e-9 {
			t.Errorf("resonator %d: screw shift %g Hz, want the span %g Hz (first order: r0^3 law)", s.Resonator, s.Shift, s.Span)
		}
	}
}

// TestHoleSensitivity checks the sensitivity of a coupling to its hole
// radius against Bethe's law for a thin wall: k = g r0^3 (Bethe 1944;
// both polarisabilities scale as r0^3), so dM/dr0 = 3 M / r0.
func TestHoleSensitivity(t *testing.T) {
	d, err := Synthesize(Spec{F0: 10e9, BW: 20e6, Order: 4, ReturnLoss: 20})
	if err != nil {
		t.Fatal(err)
	}
	r, err := Realise(d, RealiseOptions{Shape: cavity.ByRatio(1.2), Hole: &Hole{Wall: EndWall}})
	if err != nil {
		t.Fatal(err)
	}
	src, err := Sensitivities(d, r, Machining{Hole: 10e-6})
	if err != nil {
		t.Fatal(err)
	}
	seen := 0
	for _, s := range src {
		e := s.Entries[0]
		a := r.Apertures[e.I-1]
		if !a.Sized || a.Thickness != 0 {
			t.Fatalf("aperture %d-%d not a sized thin hole", a.From, a.To)
		}
		want := 3 * d.Folded.At(e.I, e.J) / a.Radius
		if rel := math.Abs(e.DM-want) / want; rel > 1e-6 {
			t.Errorf("%s: dM/dr0 = %g /m, Bethe's r0^3 law gives %g /m", s.Name, e.DM, want)
		}
		if math.Abs(s.Sigma-10e-6/3) > 1e-18 {
			t.Errorf("%s: sigma %g m, want tolerance/3", s.Name, s.Sigma)
		}
		seen++
	}
	if seen != 3 {
		t.Errorf("%d hole sources, want 3 (main line of 4 resonators)", seen)
	}
}

// TestYieldRecount recounts the yield of a short run serially: each sample
// redrawn from PCG(seed, k) in the order of Sensitivities, the matrix moved
// entry by entry with gonum, and judged by Design.Check and Overall; the
// count must equal Yield's, and the progress callback must reach the total.
func TestYieldRecount(t *testing.T) {
	d, r := tolDesign(t)
	tol := Machining{Diameter: 4e-6, Length: 4e-6, Coupling: 0.01}
	const n, seed = 60, 9
	last := 0
	res, err := Yield(d, r, YieldOptions{Machining: tol, Samples: n, Seed: seed, Verdict: true, ReturnLoss: 18,
		Progress: func(done, total int) { last = done }})
	if err != nil {
		t.Fatal(err)
	}
	if last != n {
		t.Errorf("progress ended at %d, want %d", last, n)
	}
	src, err := Sensitivities(d, r, tol)
	if err != nil {
		t.Fatal(err)
	}
	md := *d
	md.Spec.ReturnLoss, md.Spec.Ripple = 18, RippleFromReturnLoss(18)
	pass := 0
	for k := 0; k < n; k++ {
		rng := rand.New(rand.NewPCG(seed, uint64(k)))
		m := mat.DenseCopyOf(d.Folded)
		for _, s := range src {
			x := s.Sigma * rng.NormFloat64()
			for _, e := range s.Entries {
				m.Set(e.I, e.J, m.At(e.I, e.J)+e.DM*x)
				if e.I != e.J {
					m.Set(e.J, e.I, m.At(e.J, e.I)+e.DM*x)
				}
			}
		}
		sd := md
		sd.Folded = m
		checks, err := sd.Check(r.Q0(), nil)
		if err != nil {
			t.Fatal(err)
		}
		if Overall(checks) == Met {
			pass++
		}
	}
	if got := res.Yield * n; math.Abs(got-float64(pass)) > 1e-9 {
		t.Errorf("Yield counts %g passing samples, the serial recount %d", got, pass)
	}
	if pass == 0 || pass == n {
		t.Errorf("recount %d of %d: choose a tolerance with a yield between 0 and 1", pass, n)
	}
	t.Logf("yield %d of %d", pass, n)
}
