package filter

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// fastLUTol is the agreement required between the complex modal path and
// the LU reference (the target, 1e-12): on S parameters, which are
// of magnitude <= 1, absolute; on dS21/dOmega relative to its size plus 1.
const fastLUTol = 1e-12

// TestFastResponseMatchesLU checks the O(N) complex modal response of
// resonators with unequal losses against the LU factorisation of the full
// network matrix (the reference, an independent route) on random seeded
// symmetric coupling matrices of every order 2..14, with random Q0 from 500
// to 20000 at FBW 0.5..3 %, and that the fast path is really taken.
func TestFastResponseMatchesLU(t *testing.T) {
	rng := rand.New(rand.NewPCG(12, 2))
	used := 0
	total := 0
	for trial := 0; trial < 200; trial++ {
		r := 2 + trial%13
		n := r + 2
		m := mat.NewDense(n, n, nil)
		set := func(i, j int, v float64) { m.Set(i, j, v); m.Set(j, i, v) }
		for i := 1; i < r; i++ {
			set(i, i+1, 0.5+0.5*rng.Float64()) // main line
		}
		for i := 1; i <= r; i++ {
			set(i, i, 0.3*(rng.Float64()-0.5))
			if i+3 <= r && rng.Float64() < 0.5 {
				set(i, i+3, 0.3*(rng.Float64()-0.5)) // cross couplings
			}
		}
		set(0, 1, 1+0.3*rng.Float64())
		set(r, n-1, 1+0.3*rng.Float64())
		fbw := 0.005 + 0.025*rng.Float64()
		loss := make([]float64, r)
		for i := range loss {
			q0 := 500 + 19500*rng.Float64()
			loss[i] = 1 / (fbw * q0)
		}
		ev := newEvaluator(m, loss)
		if !ev.cmodal {
			t.Errorf("trial %d (N = %d): complex modal decomposition refused", trial, r)
			continue
		}
		ref := newEvaluator(m, loss)
		for p := 0; p < 50; p++ {
			w := -4 + 8*rng.Float64()
			s11, s21, s22, ds, ok := ev.atComplexModal(w)
			total++
			if !ok {
				continue
			}
			used++
			r11, r21, r22, rds := ref.atLU(w)
			if d := max(cmplx.Abs(s11-r11), cmplx.Abs(s21-r21), cmplx.Abs(s22-r22)); d > fastLUTol {
				t.Errorf("trial %d (N = %d) Omega = %g: S differs from LU by %.3g", trial, r, w, d)
			}
			if d := cmplx.Abs(ds-rds) / (1 + cmplx.Abs(rds)); d > fastLUTol {
				t.Errorf("trial %d (N = %d) Omega = %g: dS21/dOmega differs from LU by %.3g relative", trial, r, w, d)
			}
		}
	}
	if used < total*9/10 {
		t.Errorf("complex modal path used at only %d of %d points", used, total)
	}
}

// TestFastResponseSynthesised checks the response of a synthesised design
// with unequal Q0 (12 resonators, four zeros) against the LU path at 2001
// points over +-3 bandwidths.
func TestFastResponseSynthesised(t *testing.T) {
	d, err := Synthesize(benchSpec)
	if err != nil {
		t.Fatal(err)
	}
	q0 := make([]float64, 12)
	for i := range q0 {
		q0[i] = 3000 + 700*float64(i)
	}
	ev, err := d.evaluator(q0)
	if err != nil {
		t.Fatal(err)
	}
	if !ev.cmodal {
		t.Fatal("complex modal decomposition refused")
	}
	ref, _ := d.evaluator(q0)
	worst := 0.0
	for i := 0; i <= 2000; i++ {
		w := -3 + 6*float64(i)/2000
		s11, s21, s22, _ := ev.at(w)
		r11, r21, r22, _ := ref.atLU(w)
		worst = math.Max(worst, max(cmplx.Abs(s11-r11), cmplx.Abs(s21-r21), cmplx.Abs(s22-r22)))
	}
	if worst > fastLUTol {
		t.Errorf("worst difference from LU %.3g > %g", worst, fastLUTol)
	}
	t.Logf("worst |S - S_LU| = %.2g", worst)
}

// TestCsymEigen checks the decomposition itself: B V = V diag(lambda) and
// V^T V = I for a random complex symmetric matrix.
func TestCsymEigen(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	const r = 8
	b := make([]complex128, r*r)
	for i := 0; i < r; i++ {
		for j := i; j < r; j++ {
			v := complex(rng.Float64()-0.5, 0)
			if i == j {
				v = complex(2*rng.Float64()-1, -0.05*rng.Float64())
			}
			b[i*r+j], b[j*r+i] = v, v
		}
	}
	lam, v, ok := csymEigen(append([]complex128(nil), b...), r)
	if !ok {
		t.Fatal("refused")
	}
	for i := 0; i < r; i++ {
		for k := 0; k < r; k++ {
			var bv, vtv complex128
			for j := 0; j < r; j++ {
				bv += b[i*r+j] * v[j*r+k]
				vtv += v[j*r+i] * v[j*r+k]
			}
			if d := cmplx.Abs(bv - v[i*r+k]*lam[k]); d > 1e-13 {
				t.Errorf("(BV - V Lambda)_%d%d = %.3g", i, k, d)
			}
			want := complex(0, 0)
			if i == k {
				want = 1
			}
			if d := cmplx.Abs(vtv - want); d > 1e-13 {
				t.Errorf("(V^T V - I)_%d%d = %.3g", i, k, d)
			}
		}
	}
}

// BenchmarkResponse1e4MixedLU times the LU reference path on the points of
// BenchmarkResponse1e4Mixed, for comparison with the complex modal path.
func BenchmarkResponse1e4MixedLU(b *testing.B) {
	d, err := Synthesize(benchSpec)
	if err != nil {
		b.Fatal(err)
	}
	q0 := make([]float64, 12)
	for i := range q0 {
		q0[i] = 8000 + 100*float64(i)
	}
	ev, err := d.evaluator(q0)
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		for i := 0; i < 10000; i++ {
			ev.atLU(LowpassOmega(9.5e9+float64(i)*1e5, d.Spec.F0, d.Spec.BW))
		}
	}
}

// TestS11S21Lean checks the Monte Carlo's lean evaluation (no derivative,
// textbook reciprocal) against the full one, common and unequal losses.
func TestS11S21Lean(t *testing.T) {
	d, err := Synthesize(benchSpec)
	if err != nil {
		t.Fatal(err)
	}
	for _, q0 := range [][]float64{
		{5000, 5000, 5000, 5000, 5000, 5000, 5000, 5000, 5000, 5000, 5000, 5000},
		{3000, 4000, 5000, 6000, 7000, 8000, 9000, 10000, 11000, 12000, 13000, 14000},
	} {
		ev, err := d.evaluator(q0)
		if err != nil {
			t.Fatal(err)
		}
		for i := 0; i <= 4000; i++ {
			w := -4 + 8*float64(i)/4000
			a11, a21 := ev.s11s21(w)
			b11, b21, _, _ := ev.at(w)
			if dd := max(cmplx.Abs(a11-b11), cmplx.Abs(a21-b21)); dd > 1e-13 {
				t.Fatalf("Omega = %g: lean differs by %.3g", w, dd)
			}
			if a21 != 0 && math.Abs(db2(a21)-db(a21)) > 1e-12*(1+math.Abs(db(a21))) {
				t.Fatalf("db2 %g != db %g", db2(a21), db(a21))
			}
		}
	}
}
