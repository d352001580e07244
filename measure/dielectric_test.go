package measure

import (
	"math"
	"math/rand/v2"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/qfactor"
)

// TestMeasureDielectric: an empty and a PTFE-filled copper TE011 cavity,
// computed by packages cavity and qfactor (the filled cavity's wall Q from
// the filled mode's own fields, not from the scaling MeasureDielectric
// uses), give back the fill's eps_r and tan(delta).
func TestMeasureDielectric(t *testing.T) {
	cu, err := physics.LookupConductor("copper")
	if err != nil {
		t.Fatal(err)
	}
	walls := qfactor.SameWalls(qfactor.Surface{Conductor: cu})
	m := cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}
	empty := cavity.Cavity{Radius: 27.4e-3, Length: 54.8e-3}
	filled := empty
	// PTFE as in Pozar's TE011 example (sec. 6.7): eps_r 2.08, tan(delta) 4e-4.
	filled.Fill = physics.Medium{EpsR: 2.08, TanDelta: 4e-4}
	ue, err := qfactor.UnloadedQ(empty, m, walls.At(nil))
	if err != nil {
		t.Fatal(err)
	}
	uf, err := qfactor.UnloadedQ(filled, m, walls.At(nil))
	if err != nil {
		t.Fatal(err)
	}
	r, err := MeasureDielectric(DielectricInput{FEmpty: ue.Wall.Frequency, FFilled: uf.Wall.Frequency, Q0Empty: ue.Q0, Q0Filled: uf.Q0})
	if err != nil {
		t.Fatal(err)
	}
	// dielTol: both routes are closed forms in float64; rounding only.
	const dielTol = 1e-9
	if math.Abs(r.EpsR-2.08) > dielTol*2.08 || math.Abs(r.TanDelta-4e-4) > dielTol*4e-4*100 {
		t.Errorf("eps_r = %.12g, tan(delta) = %.12g; want 2.08, 4e-4", r.EpsR, r.TanDelta)
	}
	if _, err := MeasureDielectric(DielectricInput{FEmpty: 1e9, FFilled: 2e9, Q0Empty: 1e4, Q0Filled: 1e3}); err == nil {
		t.Error("filled above empty: no error")
	}
}

// TestDielectricBudgetMonteCarlo checks the first-order uncertainty budget
// against a Monte Carlo of the inputs (normal, seeded), the wall exponent
// included.
func TestDielectricBudgetMonteCarlo(t *testing.T) {
	in := DielectricInput{
		FEmpty: 7.2e9, FEmptyErr: 2e3, FFilled: 4.99e9, FFilledErr: 3e3,
		Q0Empty: 14000, Q0EmptyErr: 150, Q0Filled: 2100, Q0FilledErr: 25,
	}
	r, err := MeasureDielectric(in)
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(11, 12))
	const n = 40000
	var se, se2, st, st2 float64
	for i := 0; i < n; i++ {
		e, d := dielectricAt(in.FEmpty+in.FEmptyErr*rng.NormFloat64(), in.FFilled+in.FFilledErr*rng.NormFloat64(),
			in.Q0Empty+in.Q0EmptyErr*rng.NormFloat64(), in.Q0Filled+in.Q0FilledErr*rng.NormFloat64(), 0.5+0.1*rng.NormFloat64())
		se += e
		se2 += e * e
		st += d
		st2 += d * d
	}
	sdE := math.Sqrt(se2/n - sq(se/n))
	sdT := math.Sqrt(st2/n - sq(st/n))
	// mcTol: the standard deviation of n = 40000 normal samples is known to
	// about 1/sqrt(2n) = 0.35 %; 3 % leaves room for the budget's first-order
	// neglect of the (small) curvature.
	const mcTol = 0.03
	if math.Abs(r.EpsRErr-sdE) > mcTol*sdE || math.Abs(r.TanDeltaErr-sdT) > mcTol*sdT {
		t.Errorf("budget eps_r %.4g, tan(delta) %.4g; Monte Carlo %.4g, %.4g", r.EpsRErr, r.TanDeltaErr, sdE, sdT)
	}
	t.Logf("eps_r %.5f +- %.2g, tan(delta) %.4g +- %.2g", r.EpsR, r.EpsRErr, r.TanDelta, r.TanDeltaErr)
}
