package qfactor_test

import (
	"math"
	"testing"

	"cylcav/qfactor"
)

func TestCombine(t *testing.T) {
	inf := math.Inf(1)
	for _, tc := range []struct {
		q    []float64
		want float64
	}{
		{[]float64{29351, 2500}, 1 / (1/29351.0 + 1/2500.0)},
		{[]float64{inf, 2500}, 2500},
		{[]float64{inf, inf}, inf},
		{nil, inf},
	} {
		if got := qfactor.Combine(tc.q...); got != tc.want && relErr(got, tc.want) > veryclose {
			t.Errorf("Combine(%v) = %g, want %g", tc.q, got, tc.want)
		}
	}
}

// TestLoaded checks loaded Q against Pozar, Microwave Engineering, 4th ed.,
// sec. 6.1 and 6.6: critical coupling (beta = 1) halves Q0; beta = Q0/Qext
// makes the coupling and external-Q forms agree.
func TestLoaded(t *testing.T) {
	ql, err := qfactor.LoadedByCoupling(10000, 1)
	if err != nil || ql != 5000 {
		t.Errorf("LoadedByCoupling(1e4, 1) = %g, %v; want 5000 (critical coupling)", ql, err)
	}
	ql2, _ := qfactor.LoadedByCoupling(10000, 0.5, 1.5)
	if ql2 != 10000.0/3 {
		t.Errorf("LoadedByCoupling(1e4, 0.5, 1.5) = %g, want %g", ql2, 10000.0/3)
	}
	for _, qe := range []float64{500, 10000, 3e5} {
		a, _ := qfactor.LoadedByCoupling(10000, qfactor.Coupling(10000, qe))
		b, _ := qfactor.LoadedByExternalQ(10000, qe)
		if relErr(a, b) > veryclose {
			t.Errorf("LoadedByCoupling(1e4, 1e4/%g) = %.15g, want LoadedByExternalQ = %.15g", qe, a, b)
		}
	}
	inf := math.Inf(1)
	if q, _ := qfactor.LoadedByExternalQ(inf, 800); q != 800 {
		t.Errorf("LoadedByExternalQ(Inf, 800) = %g, want 800", q)
	}
	if q, _ := qfactor.LoadedByExternalQ(1200, inf); q != 1200 {
		t.Errorf("LoadedByExternalQ(1200, Inf) = %g, want 1200", q)
	}
	if bw := qfactor.Bandwidth(1e9, 5000); bw != 2e5 {
		t.Errorf("Bandwidth(1 GHz, 5000) = %g, want 2e5 Hz", bw)
	}
	if bw := qfactor.Bandwidth(1e9, inf); bw != 0 {
		t.Errorf("Bandwidth(1 GHz, Inf) = %g, want 0", bw)
	}
	for _, bad := range []struct {
		q0, x float64
	}{{0, 1}, {-5, 1}, {math.NaN(), 1}, {100, -1}, {100, math.NaN()}, {100, inf}} {
		if _, err := qfactor.LoadedByCoupling(bad.q0, bad.x); err == nil {
			t.Errorf("LoadedByCoupling(%g, %g) error = nil, want an error", bad.q0, bad.x)
		}
	}
	for _, bad := range []struct {
		q0, x float64
	}{{0, 1}, {100, 0}, {100, -3}, {100, math.NaN()}} {
		if _, err := qfactor.LoadedByExternalQ(bad.q0, bad.x); err == nil {
			t.Errorf("LoadedByExternalQ(%g, %g) error = nil, want an error", bad.q0, bad.x)
		}
	}
}
