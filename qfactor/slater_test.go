package qfactor_test

// This file checks cavity.Cavity.SphereShift for degenerate modes by an
// independent route: degenerate first-order perturbation theory built
// here from the fields of fields_test.go (Pozar's component form, with its
// own phase convention: TE phasors E = j e, H = h; TM phasors E = e,
// H = j h), each pattern normalised by its stored energy integrated
// numerically (quadrature), the Hermitian perturbation matrix of Slater's
// point dipoles
//
//	M_ij = -(E_i* . p_j + mu H_i* . m_j) / (4 sqrt(W_i W_j)),
//	p = 4 pi eps r0^3 E,  m = -2 pi r0^3 H
//
// (Slater 1946; Maier and Slater 1952; the conducting-sphere moments of
// Jackson, Classical Electrodynamics, 3rd ed., sec. 10.1.B, recalled from
// memory), and its eigenvalues from gonum's mat.EigenSym on the real
// symmetric embedding [[Re M, -Im M], [Im M, Re M]], whose spectrum is that
// of M with every eigenvalue doubled.

import (
	"math"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"

	"cylcav/cavity"
)

// slaterTol: the two routes share only the Bessel functions; they differ
// by the rounding of the field sums, the Jacobi and gonum eigen-solvers and
// the quadrature of W (about 1e-13 relative), far below 1e-9.
const slaterTol = 1e-9

// pattern is a field pattern for the test: sin selects the sin(n phi)
// polarisation.
type pattern struct {
	m   cavity.Mode
	sin bool
}

// slaterShifts returns the eigen-shifts Delta f / f of the patterns set in
// cavity c for a conducting sphere of radius r0 at (rho, phi, z), with the
// image factor (1 free, 1/2 on one wall, 1/4 in a corner).
func slaterShifts(t *testing.T, c cavity.Cavity, set []pattern, rho, phi, z, r0, factor float64) []float64 {
	t.Helper()
	n := len(set)
	type phasor struct{ e, h [3]complex128 }
	ph := make([]phasor, n)
	var eps, mu float64
	for i, p := range set {
		f := newField(c, p.m)
		eps, mu = f.eps, f.mu
		at := phi
		if p.sin {
			at -= math.Pi / (2 * float64(p.m.N)) // cos(n(phi - pi/2n)) = sin(n phi)
		}
		e, h := f.at(rho, at, z)
		w := quadrature(c, p.m).we // W = (eps/2) integral |e|^2 dV, numerically
		s := 1 / math.Sqrt(w)
		for k := range 3 {
			if p.m.Family == cavity.TE {
				ph[i].e[k], ph[i].h[k] = complex(0, e[k]*s), complex(h[k]*s, 0)
			} else {
				ph[i].e[k], ph[i].h[k] = complex(e[k]*s, 0), complex(0, h[k]*s)
			}
		}
	}
	r3 := r0 * r0 * r0
	big := mat.NewSymDense(2*n, nil)
	for i := range n {
		for j := range n {
			var ee, hh complex128
			for k := range 3 {
				ee += cmplxConj(ph[i].e[k]) * ph[j].e[k]
				hh += cmplxConj(ph[i].h[k]) * ph[j].h[k]
			}
			m := complex(-factor/4, 0) * (complex(4*math.Pi*eps*r3, 0)*ee - complex(2*math.Pi*mu*r3, 0)*hh)
			if j >= i {
				big.SetSym(i, j, real(m))
				big.SetSym(n+i, n+j, real(m))
			}
			big.SetSym(n+i, j, imag(m))
		}
	}
	var es mat.EigenSym
	if !es.Factorize(big, false) {
		t.Fatal("EigenSym did not converge")
	}
	vals := es.Values(nil)
	slices.Sort(vals)
	out := make([]float64, n)
	for i := range n {
		out[i] = vals[2*i]
	}
	return out
}

func cmplxConj(z complex128) complex128 { return complex(real(z), -imag(z)) }

// TestSphereShiftDegenerate compares the eigen-shifts of SphereShift with
// slaterShifts for single, paired (n >= 1) and TE0mp/TM1mp sets, free, on
// a wall and in a corner, and checks that a free sphere's shifts do not
// depend on its azimuth (rotation symmetry of a round cavity).
func TestSphereShiftDegenerate(t *testing.T) {
	mode := func(s string) cavity.Mode {
		m, err := cavity.ParseMode(s)
		if err != nil {
			t.Fatal(err)
		}
		return m
	}
	te011, tm111, te111, tm010, te211 := mode("TE011"), mode("TM111"), mode("TE111"), mode("TM010"), mode("TE211")
	c0 := cavity.Cavity{Radius: 0.02, Length: 0.03}
	// An accidental degeneracy: TE111 meets TM010 at L = pi a /
	// sqrt(j01^2 - j'11^2) (resonance formula, Pozar sec. 6.4), a 3x3 set.
	x01, x11 := tm010.Root(), te111.Root()
	cx := cavity.Cavity{Radius: 0.02, Length: math.Pi * 0.02 / math.Sqrt(x01*x01-x11*x11)}
	for _, tc := range []struct {
		c            cavity.Cavity
		name         string
		m            cavity.Mode
		set          []pattern
		rho, phi, z  float64
		r0, factor   float64
		contact      cavity.Contact
		wantSplit    bool
		azimuthCheck bool
	}{
		{cx, "TM010/TE111 accidental", tm010, []pattern{{tm010, false}, {te111, false}, {te111, true}}, 0.008, 0.3, 0.015, 0.4e-3, 1, cavity.Free, true, true},
		{c0, "TM010 free", tm010, []pattern{{tm010, false}}, 0.005, 0.3, 0.012, 0.4e-3, 1, cavity.Free, false, true},
		{c0, "TE111 free", te111, []pattern{{te111, false}, {te111, true}}, 0.011, 0.7, 0.009, 0.4e-3, 1, cavity.Free, true, true},
		{c0, "TE211 free", te211, []pattern{{te211, false}, {te211, true}}, 0.013, 0.2, 0.02, 0.4e-3, 1, cavity.Free, true, true},
		{c0, "TE011/TM111 free", te011, []pattern{{te011, false}, {tm111, false}, {tm111, true}}, 0.012, 0.4, 0.009, 0.4e-3, 1, cavity.Free, true, true},
		{c0, "TE011/TM111 screw on end plate", te011, []pattern{{te011, false}, {tm111, false}, {tm111, true}}, 0.009, 1.1, 0, 0.5e-3, 0.5, cavity.OnWall, true, true},
		{c0, "TE111 screw on side wall", te111, []pattern{{te111, false}, {te111, true}}, 0.02, 0.5, 0.012, 0.5e-3, 0.5, cavity.OnWall, true, true},
		{c0, "TE111 screw in the corner", te111, []pattern{{te111, false}, {te111, true}}, 0.02, 0.5, 0.03, 0.5e-3, 0.25, cavity.InCorner, true, false},
	} {
		c := tc.c
		want := slaterShifts(t, c, tc.set, tc.rho, tc.phi, tc.z, tc.r0, tc.factor)
		phis := []float64{tc.phi}
		if tc.azimuthCheck {
			phis = append(phis, tc.phi+0.37, tc.phi+2.9)
		}
		for _, phi := range phis {
			got, err := c.SphereShift(tc.m, cavity.Point{Rho: tc.rho, Phi: phi, Z: tc.z}, tc.r0)
			if err != nil {
				t.Fatalf("%s: %v", tc.name, err)
			}
			if len(got.Patterns) != len(tc.set) {
				t.Fatalf("%s: patterns %v, want %d", tc.name, got.Patterns, len(tc.set))
			}
			for i, p := range tc.set {
				if got.Patterns[i].Mode != p.m || got.Patterns[i].Sin != p.sin {
					t.Errorf("%s: pattern %d = %v, want %v sin=%v", tc.name, i, got.Patterns[i], p.m, p.sin)
				}
			}
			if got.Contact != tc.contact {
				t.Errorf("%s: contact %v, want %v", tc.name, got.Contact, tc.contact)
			}
			scale := math.Max(math.Abs(want[0]), math.Abs(want[len(want)-1]))
			for k := range want {
				if math.Abs(got.Relative[k]-want[k]) > slaterTol*scale {
					t.Errorf("%s, phi = %.3g: eigen-shift %d = %.12g, want %.12g (degenerate perturbation theory)", tc.name, phi, k, got.Relative[k], want[k])
				}
			}
			if split := want[len(want)-1]-want[0] > 1e-6*scale; split != tc.wantSplit {
				t.Errorf("%s: shifts %v split = %v, want %v", tc.name, want, split, tc.wantSplit)
			}
		}
	}
}
