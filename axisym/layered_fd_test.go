package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/internal/fdref"
	"cylcav/physics"

	"cylcav/physics/quad"
	"gonum.org/v1/gonum/mat"
)

// puckBody is an invented dielectric resonator in a can: a puck (radius 6
// mm, height 5 mm, eps_r 38) on a low-permittivity support (radius 3 mm,
// height 6 mm, eps_r 2.1) in a can of radius 12 mm and height 19 mm.
func puckBody() Body {
	a := 0.012
	return Body{Sections: []Section{
		{Length: 0.006, Radius: a, Layers: []Layer{{Radius: 0.003, Medium: physics.Medium{EpsR: 2.1}}, {Radius: a}}},
		{Length: 0.005, Radius: a, Layers: []Layer{{Radius: 0.006, Medium: physics.Medium{EpsR: 38}}, {Radius: a}}},
		{Length: 0.008, Radius: a},
	}}
}

// epsOf returns the relative permittivity of body b at (r, z).
func epsOf(b Body, r, z float64) float64 {
	z0 := 0.0
	for _, s := range b.Sections {
		if z < z0+s.Length || s.Length == 0 {
			if len(s.Layers) == 0 {
				return s.Fill.Eps()
			}
			for _, l := range s.Layers {
				if r < l.Radius {
					return l.Medium.Eps()
				}
			}
			return 1
		}
		z0 += s.Length
	}
	return 1
}

// TestPuckFiniteDifference is test group 6 by an independent route: no
// published table of a dielectric resonator in a cavity was at hand, so
// the lowest TE0 resonance (the TE01-delta-like mode) of puckBody is
// checked against a finite-difference solution of the E_phi problem with
// the permittivity varying over the grid (fdTE0), on grids of 1/4,
// 1/6 and 1/8 mm extrapolated to zero step by Richardson's rule with the
// order 2 that the smooth (H^2) solution of a problem with a discontinuous
// zeroth-order coefficient allows (Strang and Fix, ch. 3, as recalled);
// the stated accuracy is fdref.Safety times the difference of the two
// extrapolations.
func TestPuckFiniteDifference(t *testing.T) {
	if testing.Short() {
		t.Skip("finite differences on up to 18000 points")
	}
	b := puckBody()
	eps := func(r, z float64) float64 { return epsOf(b, r, z) }
	hs := [3]float64{0.001 / 4, 0.001 / 6, 0.001 / 8}
	var lam [3]float64
	for i, h := range hs {
		lam[i] = fdTE0(t, b.Sections, h, eps)
	}
	ex1, ex2 := fdref.Richardson(hs, lam, 2.0)
	fd := physics.SpeedOfLight * math.Sqrt(ex2) / (2 * math.Pi)
	acc := fdref.Safety * math.Abs(ex2-ex1) / ex2 / 2
	got, err := Solve(b, Request{MaxFrequency: 6e9, Families: []cavity.Family{cavity.TE}})
	if err != nil || len(got) == 0 {
		t.Fatal(got, err)
	}
	d := math.Abs(got[0].Frequency-fd) / fd
	t.Logf("finite differences %.9g Hz (grids %.9g %.9g %.9g Hz, accuracy %.2g), mode matching %.9g Hz (change %.2g), rel. difference %.2g",
		fd, physics.SpeedOfLight*math.Sqrt(lam[0])/(2*math.Pi), physics.SpeedOfLight*math.Sqrt(lam[1])/(2*math.Pi),
		physics.SpeedOfLight*math.Sqrt(lam[2])/(2*math.Pi), acc, got[0].Frequency, got[0].Change/got[0].Frequency, d)
	if d > acc+got[0].Change/fd {
		t.Errorf("TE0 #1 = %.9g Hz, want %.9g Hz (finite differences, accuracy %.2g), rel. difference %.2g",
			got[0].Frequency, fd, acc, d)
	}
}

// TestLayeredNoneMissed checks the resonance count of a body with layered
// sections, where the Wittrick-Williams count is not proven (the modes of a
// layered section change with frequency), by brute force: on a fine grid
// of frequencies the count never decreases, and s(f) = sign(det B(f))
// (-1)^J0(f), which changes sign exactly where an eigenvalue of B crosses
// zero (a pole flips one eigenvalue from +inf to -inf, J0 compensates),
// changes sign between grid points as often, modulo 2, as Solve lists
// resonances there. The determinant comes from gonum's LU, not from the
// elimination of the count.
func TestLayeredNoneMissed(t *testing.T) {
	b := puckBody()
	const fmax = 10e9
	for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
		counts, err := ModeCounts(b, fam, fmax, 12)
		if err != nil {
			t.Fatal(err)
		}
		freqs, _, err := resonancesWith(b, fam, fmax, counts, false)
		if err != nil {
			t.Fatal(err)
		}
		s, _ := newSystem(b, fam, counts)
		a := make([]float64, s.ndof*s.ndof)
		s.calibrate(b, a)
		const grid = 600
		prevJ, prevS := 0, 0.0
		for i := 1; i <= grid; i++ {
			f := fmax * float64(i) / grid
			j, _ := s.count(f, a)
			j0 := s.eval(f, a)
			sg := detSign(a, s.ndof) * float64(1-2*(j0%2))
			if j < prevJ {
				t.Errorf("%v: count falls from %d to %d at %g Hz", fam, prevJ, j, f)
			}
			if i > 1 {
				lo := f - fmax/grid
				n := 0
				for _, x := range freqs {
					if x > lo && x <= f {
						n++
					}
				}
				flip := sg != prevS
				if flip != (n%2 == 1) {
					t.Errorf("%v: %g..%g Hz: determinant sign flip %v, Solve lists %d resonances", fam, lo, f, flip, n)
				}
				if j-prevJ != n {
					t.Errorf("%v: %g..%g Hz: count rises by %d, Solve lists %d", fam, lo, f, j-prevJ, n)
				}
			}
			prevJ, prevS = j, sg
		}
		t.Logf("%v: %d resonances below %g Hz, count monotone and determinant signs consistent on %d points", fam, len(freqs), fmax, grid)
	}
}

// TestLayeredOverlap checks pieceIntegral (Lommel's closed forms and the
// quadrature) against Gauss-Legendre quadrature of high order on pieces
// of every kind, and the orthonormality of the modes of a layered guide
// (weight 1 for TE0, 1/eps for TM0: int e_m h_n dS = delta_mn).
func TestLayeredOverlap(t *testing.T) {
	ps := []piece{
		{kind: kindJY, k: 300, p2: 300 * 300, a: 1, b: 0.3},
		{kind: kindJY, k: 1200, p2: 1200 * 1200, a: -0.2, b: 1},
		{kind: kindIK, k: 500, p2: -500 * 500, a: 1, b: 2},
		{kind: kindPow, a: 1, b: 1e-6},
		{kind: kindJY, k: 300 * (1 + 1e-5), p2: sq(300 * (1 + 1e-5)), a: 1, b: 0.3},
	}
	lo, hi := 0.002, 0.006
	x, w := quad.GaussLegendre(400)
	for i, f := range ps {
		for j, g := range ps {
			got := pieceIntegral(f, g, lo, hi)
			var want float64
			for q := range x {
				r := 0.5*(hi+lo) + 0.5*(hi-lo)*x[q]
				u, _ := f.fg(r)
				v, _ := g.fg(r)
				want += w[q] * r * u * v * 0.5 * (hi - lo)
			}
			scale := math.Sqrt(math.Abs(pieceIntegral(f, f, lo, hi) * pieceIntegral(g, g, lo, hi)))
			if d := math.Abs(got-want) / scale; d > 1e-11 {
				t.Errorf("pieces %d, %d: %.15g, quadrature %.15g (rel %.2g)", i, j, got, want, d)
			}
		}
	}
	for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
		sec := puckBody().Sections[1]
		lg := newLayeredGuide(fam, sec, 15)
		lg.at(2 * math.Pi * 5e9 / physics.SpeedOfLight)
		ms := make([][]piece, len(lg.modes))
		for m := range lg.modes {
			ms[m] = lg.modes[m].pieces
		}
		if len(ms) != 15 {
			t.Fatalf("%v: %d modes", fam, len(ms))
		}
		// overlap(w, g) integrates h_w e_g: with w = g the Gram matrix of
		// the biorthogonal pair.
		gram := overlap(ms, ms, sec.InnerRadius, sec.Radius)
		for i := range ms {
			for j := range ms {
				want := 0.0
				if i == j {
					want = 1
				}
				if d := math.Abs(gram[i*len(ms)+j] - want); d > 1e-10 {
					t.Errorf("%v: int e_%d h_%d dS = %.3g, want %g", fam, i+1, j+1, gram[i*len(ms)+j], want)
				}
			}
		}
		// beta^2 decreasing, and the count of modes above each one right.
		for m := range lg.modes {
			if m > 0 && !(lg.modes[m].beta2 < lg.modes[m-1].beta2) {
				t.Errorf("%v: beta^2 not decreasing at mode %d", fam, m+1)
			}
		}
	}
}

// detSign returns the sign of the determinant of the symmetric matrix
// whose upper triangle a holds (n x n, row-major), from gonum's LU.
func detSign(a []float64, n int) float64 {
	if n == 0 {
		return 1
	}
	m := mat.NewDense(n, n, nil)
	for i := range n {
		for j := i; j < n; j++ {
			m.Set(i, j, a[i*n+j])
			m.Set(j, i, a[i*n+j])
		}
	}
	var lu mat.LU
	lu.Factorize(m)
	_, sign := lu.LogDet()
	return sign
}

// BenchmarkPuckFiveTE0 solves the five lowest TE0 resonances of puckBody
// (DefaultModes, two models for the convergence estimate).
func BenchmarkPuckFiveTE0(b *testing.B) {
	body := puckBody()
	for i := 0; i < b.N; i++ {
		res, err := Solve(body, Request{MaxFrequency: 11.7e9, Families: []cavity.Family{cavity.TE}})
		if err != nil || len(res) != 5 {
			b.Fatal(len(res), err)
		}
	}
}
