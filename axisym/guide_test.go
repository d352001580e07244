package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
)

// quadTol is the agreement required between the closed-form overlap
// integrals (DLMF 10.22.5) and Gauss-Legendre quadrature of the mode
// functions: both are exact to rounding at this panel count.
const quadTol = 1e-11

// gauss integrates f over [lo, hi] with composite 5-point Gauss-Legendre
// quadrature on n panels (nodes and weights: A&S Table 25.4, recalled).
func gauss(f func(float64) float64, lo, hi float64, n int) float64 {
	x := [5]float64{0, -0.5384693101056831, 0.5384693101056831, -0.9061798459386640, 0.9061798459386640}
	w := [5]float64{0.5688888888888889, 0.4786286704993665, 0.4786286704993665, 0.2369268850561891, 0.2369268850561891}
	h := (hi - lo) / float64(n)
	var s float64
	for i := range n {
		c := lo + (float64(i)+0.5)*h
		for k := range 5 {
			s += w[k] * f(c+x[k]*h/2)
		}
	}
	return s * h / 2
}

// TestCouplingQuadrature checks the normalisation (norm) and the overlap
// matrix (coupling) of the n = 0 modes against direct quadrature of
// 2 pi int e_b e_a r dr with the mode functions N J1(kc r) of Pozar,
// Microwave Engineering, 4th ed., sec. 3.4: the derived closed forms by an
// independent route.
func TestCouplingQuadrature(t *testing.T) {
	const a, b = 0.0071, 0.0193
	for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
		ka := cutoffs(fam, a, 6)
		kb := cutoffs(fam, b, 9)
		m := coupling(fam, kb, ka, b, a)
		for i, q := range kb {
			for j, p := range ka {
				want := gauss(func(r float64) float64 {
					return 2 * math.Pi * norm(fam, q, b) * math.J1(q*r) * norm(fam, p, a) * math.J1(p*r) * r
				}, 0, a, 400)
				if d := math.Abs(m[i*len(ka)+j] - want); d > quadTol {
					t.Errorf("%v coupling[%d][%d] = %.15g, want %.15g (quadrature)", fam, i, j, m[i*len(ka)+j], want)
				}
			}
		}
		for _, p := range ka {
			got := gauss(func(r float64) float64 {
				e := norm(fam, p, a) * math.J1(p*r)
				return 2 * math.Pi * e * e * r
			}, 0, a, 400)
			if math.Abs(got-1) > quadTol {
				t.Errorf("%v norm at kc = %g: integral %.15g, want 1", fam, p, got)
			}
		}
	}
}

// TestLommelTie checks the equal-argument branch of lommel against the
// general branch just outside the tie band.
func TestLommelTie(t *testing.T) {
	const a = 0.01
	p := 5.52 / a
	got := lommel(p, p*(1+lommelTie/2), a)
	want := lommel(p, p*(1+1e-5), a) // general form, error about 1e-11 relative
	if d := math.Abs(got-want) / math.Abs(want); d > 2e-5 {
		t.Errorf("lommel at a tie = %.15g, want about %.15g (rel. %.2g)", got, want, d)
	}
}
