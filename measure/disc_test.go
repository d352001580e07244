package measure_test

import (
	"math"
	"math/rand/v2"
	"testing"

	"cylcav/axisym"
	"cylcav/cavity"
	"cylcav/measure"
	"cylcav/physics"
)

// discBody is the disc-loaded cavity as a body of package axisym: the
// mode-matching solver, a route independent of DiscResonance's shooting
// (its two sections of one radius are exact there, one radial mode each).
func discBody(a, l, t, eps, tand float64) axisym.Body {
	return axisym.Body{Sections: []axisym.Section{
		{Length: t, Radius: a, Fill: physics.Medium{EpsR: eps, TanDelta: tand}},
		{Length: l - t, Radius: a},
	}}
}

// solveDisc returns the axisym TE0 resonance continuing from mode m, or
// with near > 0 the one nearest that frequency (the enclosing-cylinder
// label goes by order within the family, and a thin disc of high
// permittivity reorders TE0mp modes of different m).
func solveDisc(t *testing.T, b axisym.Body, m cavity.Mode, fmax, near float64) axisym.Resonance {
	t.Helper()
	res, err := axisym.Solve(b, axisym.Request{MaxFrequency: fmax, Families: []cavity.Family{cavity.TE}, Losses: true, Modes: 6})
	if err != nil {
		t.Fatal(err)
	}
	best := -1
	for i, r := range res {
		if near > 0 {
			if best < 0 || math.Abs(r.Frequency-near) < math.Abs(res[best].Frequency-near) {
				best = i
			}
		} else if r.HasOrigin && r.Origin == m {
			best = i
		}
	}
	if best < 0 {
		t.Fatalf("no resonance of %v below %g Hz", m, fmax)
	}
	return res[best]
}

// discTol is the agreement of DiscResonance with the mode-matching
// solver: both are exact for this body, so only the solvers' root
// tolerances and quadratures remain.
const discTol = 1e-9

func TestDiscResonanceAgainstAxisym(t *testing.T) {
	const a, l = 0.015, 0.026
	for _, tc := range []struct {
		t, eps float64
		m      cavity.Mode
	}{
		{0.003, 9.8, cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}},
		{0.003, 1, cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}},
		{0.006, 2.1, cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 2}},
		{0.002, 24, cavity.Mode{Family: cavity.TE, N: 0, M: 2, P: 1}},
	} {
		got, err := measure.DiscResonance(a, l, tc.t, tc.eps, tc.m)
		if err != nil {
			t.Fatal(err)
		}
		r := solveDisc(t, discBody(a, l, tc.t, tc.eps, 0), tc.m, 1.01*cavity.Cavity{Radius: a, Length: l}.Frequency(tc.m), got.F)
		if math.Abs(got.F/r.Frequency-1) > discTol {
			t.Errorf("%v, t %g, eps %g: F = %.12g Hz, want %.12g Hz (axisym)", tc.m, tc.t, tc.eps, got.F, r.Frequency)
		}
		if g := r.Loss.G(); math.Abs(got.G/g-1) > discTol {
			t.Errorf("%v, t %g, eps %g: G = %.12g ohm, want %.12g ohm (axisym)", tc.m, tc.t, tc.eps, got.G, g)
		}
		if math.Abs(got.FillE-r.Loss.FillE[0]) > discTol {
			t.Errorf("%v, t %g, eps %g: FillE = %.12g, want %.12g (axisym)", tc.m, tc.t, tc.eps, got.FillE, r.Loss.FillE[0])
		}
	}
	if _, err := measure.DiscResonance(a, l, 0.003, 4, cavity.Mode{Family: cavity.TM, N: 0, M: 1, P: 0}); err == nil {
		t.Error("TM010: nil error, want the model's refusal")
	}
}

// discCase is an invented measurement: a 30 mm copper can 26 mm long,
// TE011, with a 3 mm alumina-like disc (eps_r 9.8, tan delta 2e-4).
var discCase = struct {
	a, l, t, eps, tand float64
	m                  cavity.Mode
}{0.015, 0.026, 0.003, 9.8, 2e-4, cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}}

// discPair makes the synthetic empty and loaded measurements with package
// axisym (frequencies, and Q0 from the matched fields with copper walls of
// classical skin-effect Rs at each frequency and the disc's loss tangent).
func discPair(t *testing.T) measure.DiscInput {
	c := discCase
	q := func(b axisym.Body) (f, q0 float64) {
		r := solveDisc(t, b, c.m, 1.01*cavity.Cavity{Radius: c.a, Length: c.l}.Frequency(c.m), 0)
		// Classical skin effect, Rs = sqrt(omega mu0 / (2 sigma)) (Pozar,
		// Microwave Engineering, 4th ed., eq. (1.131)), copper 5.8e7 S/m.
		rs := math.Sqrt(2 * math.Pi * r.Frequency * physics.VacuumPermeability / (2 * 5.8e7))
		fills := make([]physics.Medium, len(b.Sections))
		for i, s := range b.Sections {
			fills[i] = s.Fill
		}
		q0, _, _ = r.Loss.Q0(func(axisym.Part) float64 { return rs }, fills)
		return r.Frequency, q0
	}
	fe, qe := q(discBody(c.a, c.l, c.t, 1, 0))
	ff, qf := q(discBody(c.a, c.l, c.t, c.eps, c.tand))
	return measure.DiscInput{Mode: c.m, Radius: c.a, Length: c.l, Thickness: c.t,
		FEmpty: fe, FFilled: ff, Q0Empty: qe, Q0Filled: qf}
}

func TestMeasureDiscSynthetic(t *testing.T) {
	in := discPair(t)
	r, err := measure.MeasureDisc(in)
	if err != nil {
		t.Fatal(err)
	}
	// epsTol: both routes are exact for the body; tandTol: the wall
	// scaling by G and Rs ~ sqrt(f) is exact for a classical skin effect.
	const epsTol, tandTol = 1e-7, 1e-4
	if math.Abs(r.EpsR/discCase.eps-1) > epsTol {
		t.Errorf("eps_r = %.10g, want %g", r.EpsR, discCase.eps)
	}
	if math.Abs(r.TanDelta/discCase.tand-1) > tandTol {
		t.Errorf("tan delta = %.6g, want %g", r.TanDelta, discCase.tand)
	}
	t.Logf("f %g -> %g Hz, Q0 %.0f -> %.0f, eps %.8g, tand %.6g, FillE %.4f, QWall %.0f", in.FEmpty, in.FFilled, in.Q0Empty, in.Q0Filled, r.EpsR, r.TanDelta, r.FillE, r.QWall)
}

// TestDiscBudgetMonteCarlo checks the first-order budget against a Monte
// Carlo of the inputs (normal, seeded): the standard deviations of eps_r
// and tan delta over the samples must match the budget's to mcTol.
func TestDiscBudgetMonteCarlo(t *testing.T) {
	in := discPair(t)
	in.FEmptyErr, in.FFilledErr = 2e3, 2e3
	in.Q0EmptyErr, in.Q0FilledErr = 0.01*in.Q0Empty, 0.01*in.Q0Filled
	in.RadiusErr, in.LengthErr, in.ThicknessErr = 5e-6, 5e-6, 10e-6
	in.RsExponentErr = 0.05
	r, err := measure.MeasureDisc(in)
	if err != nil {
		t.Fatal(err)
	}
	// mcTol: with n samples the standard deviation of a standard
	// deviation is about 1/sqrt(2n), 4.5 % for n = 250; 15 % is over
	// three of those, plus the curvature the first-order budget leaves.
	const n, mcTol = 250, 0.15
	rng := rand.New(rand.NewPCG(1, 2))
	var se, se2, st, st2 float64
	for range n {
		s := in
		s.FEmpty += rng.NormFloat64() * in.FEmptyErr
		s.FFilled += rng.NormFloat64() * in.FFilledErr
		s.Q0Empty += rng.NormFloat64() * in.Q0EmptyErr
		s.Q0Filled += rng.NormFloat64() * in.Q0FilledErr
		s.Radius += rng.NormFloat64() * in.RadiusErr
		s.Length += rng.NormFloat64() * in.LengthErr
		s.Thickness += rng.NormFloat64() * in.ThicknessErr
		e, tn, err := measure.DiscSample(s, 0.5+rng.NormFloat64()*in.RsExponentErr)
		if err != nil {
			t.Fatal(err)
		}
		se, se2, st, st2 = se+e, se2+e*e, st+tn, st2+tn*tn
	}
	sdE := math.Sqrt(se2/n - se*se/n/n)
	sdT := math.Sqrt(st2/n - st*st/n/n)
	if math.Abs(sdE/r.EpsRErr-1) > mcTol || math.Abs(sdT/r.TanDeltaErr-1) > mcTol {
		t.Errorf("Monte Carlo sd eps %.3g, tand %.3g; budget %.3g, %.3g", sdE, sdT, r.EpsRErr, r.TanDeltaErr)
	}
	t.Logf("budget eps %.3g tand %.3g; MC %.3g %.3g; terms %+v", r.EpsRErr, r.TanDeltaErr, sdE, sdT, r.Budget)
}
