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

// mode returns the normalised transverse field e_m(r) of guide g.
func mode(g guide, m int, r float64) float64 {
	if g.tem && m == 0 {
		return g.norm[m] / r
	}
	return g.norm[m] * g.z(m, 1, g.kc[m]*r)
}

// TestCouplingQuadrature checks the normalisation and the overlap matrix
// (coupling) of the n = 0 modes of circular and coaxial guides against
// direct quadrature of 2 pi int e_w e_g r dr: the derived closed forms
// (Lommel's integrals, DLMF 10.22.5) by an independent route. The guides
// are wide/narrow pairs as at a step: circular in circular, coaxial in
// circular (a re-entrant post), coaxial in coaxial.
func TestCouplingQuadrature(t *testing.T) {
	pairs := []struct{ wi, wo, gi, go_ float64 }{
		{0, 0.0193, 0, 0.0071},
		{0, 0.0193, 0.002, 0.0193},
		{0, 0.0193, 0.003, 0.011},
		{0.001, 0.0193, 0.004, 0.012},
	}
	for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
		for _, pr := range pairs {
			w := newGuide(fam, pr.wi, pr.wo, 9)
			g := newGuide(fam, pr.gi, pr.go_, 6)
			m := coupling(w, g)
			for i := range w.kc {
				for j := range g.kc {
					want := gauss(func(r float64) float64 {
						return 2 * math.Pi * mode(w, i, r) * mode(g, j, r) * r
					}, g.inner, g.outer, 400)
					if d := math.Abs(m[i*len(g.kc)+j] - want); d > quadTol {
						t.Errorf("%v %v: coupling[%d][%d] = %.15g, want %.15g (quadrature)", fam, pr, i, j, m[i*len(g.kc)+j], want)
					}
				}
			}
			for _, gd := range []guide{w, g} {
				for k := range gd.kc {
					got := gauss(func(r float64) float64 {
						e := mode(gd, k, r)
						return 2 * math.Pi * e * e * r
					}, gd.inner, gd.outer, 400)
					if math.Abs(got-1) > quadTol {
						t.Errorf("%v guide %g..%g m, mode %d: norm integral %.15g, want 1", fam, gd.inner, gd.outer, k, got)
					}
				}
			}
		}
	}
}

// TestBoundaryConditions checks that every mode function vanishes where
// the field must (Jackson, Classical Electrodynamics, 3rd ed., sec. 8.2):
// E_z, proportional to Z0, at both conductors for TM; E_phi, proportional
// to Z1, for TE.
func TestBoundaryConditions(t *testing.T) {
	const tol = 1e-13
	for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
		nu := 0
		if fam == cavity.TE {
			nu = 1
		}
		for _, gd := range []guide{newGuide(fam, 0, 0.01, 8), newGuide(fam, 0.002, 0.01, 8), newGuide(fam, 0.0099, 0.01, 4)} {
			for m := range gd.kc {
				if gd.tem && m == 0 {
					continue
				}
				for _, r := range []float64{gd.inner, gd.outer} {
					if r == 0 {
						continue
					}
					// Compare with the size of the function inside the guide.
					scale := math.Abs(gd.z(m, nu, gd.kc[m]*(gd.inner+gd.outer)/2)) + math.Abs(gd.z(m, 1-nu, gd.kc[m]*(gd.inner+gd.outer)/2))
					if v := gd.z(m, nu, gd.kc[m]*r); math.Abs(v) > tol*math.Max(scale, 1) {
						t.Errorf("%v guide %g..%g m, mode %d: Z%d at r = %g is %g, want 0", fam, gd.inner, gd.outer, m, nu, r, v)
					}
				}
			}
		}
	}
}

// TestLommelTie checks the equal-argument branch of lommel against the
// general branch just outside the tie band.
func TestLommelTie(t *testing.T) {
	const a = 0.01
	p := 5.52 / a
	g := guide{kc: []float64{p, p * (1 + lommelTie/2), p * (1 + 1e-5)}, ca: []float64{1, 1, 1}, cb: []float64{0, 0, 0}}
	got := radial(g, 0, g, 1, 0, a)
	want := radial(g, 0, g, 2, 0, a) // general form, error about 1e-11 relative
	if d := math.Abs(got-want) / math.Abs(want); d > 2e-5 {
		t.Errorf("lommel at a tie = %.15g, want about %.15g (rel. %.2g)", got, want, d)
	}
}
