package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// fdTE0 returns the lowest k^2 (1/m^2) of the TE0 (E_phi) problem of a
// vacuum body of sections (circular or coaxial) by second-order finite
// differences on a square grid of step h, which must divide every radius
// and length.
//
// E_phi = u(r, z) obeys (1/r)(r u_r)_r - u/r^2 + u_zz + k^2 u = 0 with
// u = 0 on the axis and on every metal surface (Jackson, Classical
// Electrodynamics, 3rd ed., sec. 8.7, for the n = 0 TE fields, as
// recalled). Multiplied by r the operator is symmetric, giving
// A u = k^2 R u with R = diag(r) and the five-point stencil
//
//	(A u)_ij = -[r_{i+1/2}(u_{i+1,j} - u_ij) - r_{i-1/2}(u_ij - u_{i-1,j})]/h^2
//	           + u_ij/r_i - r_i (u_{i,j+1} - 2 u_ij + u_{i,j-1})/h^2.
//
// The lowest eigenvalue comes from inverse iteration with a banded
// Cholesky factor of A (Golub and Van Loan, Matrix Computations, 4th ed.,
// sec. 4.3.5 and 8.2.2) and the Rayleigh quotient.
func fdTE0(secs []Section, h float64) float64 { return fdTE0Eps(secs, h, nil) }

// fdTE0Eps is fdTE0 with a relative permittivity eps(r, z) (nil: vacuum):
// the mass matrix becomes diag(r eps), eps at each node the mean of the
// four grid cells around it (a finite-volume lumping; derived).
func fdTE0Eps(secs []Section, h float64, eps func(r, z float64) float64) float64 {
	var nz int
	var lo, hi []float64 // inner and outer radius of the field region at z_j
	for si, s := range secs {
		n := int(math.Round(s.Length / h))
		for k := range n {
			a, b := s.InnerRadius, s.Radius
			if k == 0 && si > 0 {
				// A junction plane: field only where both sides have it.
				a, b = max(a, secs[si-1].InnerRadius), min(b, secs[si-1].Radius)
			}
			lo, hi = append(lo, a), append(hi, b)
		}
		nz += n
	}
	lo, hi = append(lo, 0), append(hi, 0)
	// Unknowns: lo(z_j) < r_i < hi(z_j), 0 < j < nz, ordered by j then i.
	idx := make([][]int, nz+1)
	n, w := 0, 0
	for j := 1; j < nz; j++ {
		i0 := int(math.Round(lo[j]/h)) + 1
		m := int(math.Round(hi[j]/h)) - 1
		idx[j] = make([]int, m+1)
		for i := range idx[j] {
			idx[j][i] = -1
		}
		for i := i0; i <= m; i++ {
			idx[j][i] = n
			n++
		}
		w = max(w, m)
	}
	at := func(i, j int) int {
		if j <= 0 || j >= nz || i <= 0 || i >= len(idx[j]) {
			return -1
		}
		return idx[j][i]
	}
	// Band storage: band[p*(w+1) + (p-q)] holds A[p][q] for p-w <= q <= p.
	band := make([]float64, n*(w+1))
	rw := make([]float64, n)
	for j := 1; j < nz; j++ {
		for i := 1; i < len(idx[j]); i++ {
			p := idx[j][i]
			if p < 0 {
				continue
			}
			r := float64(i) * h
			rp, rm := r+h/2, r-h/2
			rw[p] = r
			if eps != nil {
				z := float64(j) * h
				rw[p] *= (eps(r-h/2, z-h/2) + eps(r+h/2, z-h/2) + eps(r-h/2, z+h/2) + eps(r+h/2, z+h/2)) / 4
			}
			band[p*(w+1)] = (rp+rm)/(h*h) + 1/r + 2*r/(h*h)
			if q := at(i-1, j); q >= 0 {
				band[p*(w+1)+p-q] = -rm / (h * h)
			}
			if q := at(i, j-1); q >= 0 {
				band[p*(w+1)+p-q] = -r / (h * h)
			}
		}
	}
	// Banded Cholesky, A = L L^T, in place.
	for p := range n {
		for q := max(0, p-w); q <= p; q++ {
			s := band[p*(w+1)+p-q]
			for k := max(0, p-w, q-w); k < q; k++ {
				s -= band[p*(w+1)+p-k] * band[q*(w+1)+q-k]
			}
			if q == p {
				band[p*(w+1)] = math.Sqrt(s)
			} else {
				band[p*(w+1)+p-q] = s / band[q*(w+1)]
			}
		}
	}
	solve := func(b []float64) {
		for p := range n {
			s := b[p]
			for k := max(0, p-w); k < p; k++ {
				s -= band[p*(w+1)+p-k] * b[k]
			}
			b[p] = s / band[p*(w+1)]
		}
		for p := n - 1; p >= 0; p-- {
			s := b[p]
			for k := p + 1; k <= min(n-1, p+w); k++ {
				s -= band[k*(w+1)+k-p] * b[k]
			}
			b[p] = s / band[p*(w+1)]
		}
	}
	x := make([]float64, n)
	for p := range x {
		x[p] = 1
	}
	y := make([]float64, n)
	var lambda float64
	for range 300 {
		for p := range y {
			y[p] = rw[p] * x[p]
		}
		solve(y) // y = A^-1 R x
		// Rayleigh quotient x^T R x / x^T R y estimates lambda since A y = R x.
		var num, den float64
		for p := range y {
			num += x[p] * rw[p] * x[p]
			den += x[p] * rw[p] * y[p]
		}
		next := num / den
		var s float64
		for _, v := range y {
			s += v * v
		}
		s = math.Sqrt(s)
		for p := range x {
			x[p] = y[p] / s
		}
		if math.Abs(next-lambda) <= 1e-14*next {
			lambda = next
			break
		}
		lambda = next
	}
	return lambda
}

// TestSteppedFiniteDifference is test group 5: the lowest TE0 resonance of
// a stepped body by mode matching against an independent finite-difference
// solution of the scalar E_phi problem, extrapolated to zero step.
//
// Near a 270-degree edge u ~ rho^(2/3) (Meixner 1972), so the
// finite-difference eigenvalue converges as h^(4/3) (Strang and Fix, An
// Analysis of the Finite Element Method, ch. 8 on singularities, as
// recalled). Richardson extrapolation with that exponent on the grid pairs
// (h1, h2) and (h2, h3) gives two estimates; the accuracy stated for the
// finer one is fdSafety times their difference.
func TestSteppedFiniteDifference(t *testing.T) {
	if testing.Short() {
		t.Skip("finite differences on up to 28000 points")
	}
	b := stepped()
	hs := []float64{0.02 / 60, 0.02 / 90, 0.02 / 120}
	var lam [3]float64
	for i, h := range hs {
		lam[i] = fdTE0(b.Sections, h)
	}
	const p = 4.0 / 3
	extrap := func(i int) float64 {
		a, c := math.Pow(hs[i], p), math.Pow(hs[i+1], p)
		return (lam[i+1]*a - lam[i]*c) / (a - c)
	}
	ex1, ex2 := extrap(0), extrap(1)
	fd := physics.SpeedOfLight * math.Sqrt(ex2) / (2 * math.Pi)
	acc := fdSafety * math.Abs(ex2-ex1) / ex2 / 2 // relative, in frequency
	t.Logf("finite differences: f = %.9g Hz, stated accuracy %.2g", fd, acc)
	got, err := Solve(b, Request{MaxFrequency: 12e9, Modes: 60, Families: []cavity.Family{cavity.TE}})
	if err != nil || len(got) == 0 {
		t.Fatal(got, err)
	}
	if d := math.Abs(got[0].Frequency-fd) / fd; d > acc+got[0].Change/fd {
		t.Errorf("TE0 #1 = %.9g Hz, want %.9g Hz (finite differences, accuracy %.2g), rel. difference %.2g",
			got[0].Frequency, fd, acc, d)
	}
}

// fdSafety widens the difference of successive extrapolations into a stated
// accuracy (common practice for Richardson estimates).
const fdSafety = 3

// TestReentrantFiniteDifference repeats test group 5 for a coaxial
// re-entrant body (a post from one end plate) in TE0, which exercises the
// coaxial modes and the coaxial-in-circular junction: E_phi also vanishes
// on the post. The post's corner is a 270-degree edge, so the same
// extrapolation applies.
func TestReentrantFiniteDifference(t *testing.T) {
	if testing.Short() {
		t.Skip("finite differences on up to 28000 points")
	}
	b := Body{Sections: []Section{{Length: 0.02, Radius: 0.02, InnerRadius: 0.004}, {Length: 0.01, Radius: 0.02}}}
	hs := []float64{0.02 / 60, 0.02 / 90, 0.02 / 120}
	var lam [3]float64
	for i, h := range hs {
		lam[i] = fdTE0(b.Sections, h)
	}
	const p = 4.0 / 3
	extrap := func(i int) float64 {
		a, c := math.Pow(hs[i], p), math.Pow(hs[i+1], p)
		return (lam[i+1]*a - lam[i]*c) / (a - c)
	}
	ex1, ex2 := extrap(0), extrap(1)
	fd := physics.SpeedOfLight * math.Sqrt(ex2) / (2 * math.Pi)
	acc := fdSafety * math.Abs(ex2-ex1) / ex2 / 2
	got, err := Solve(b, Request{MaxFrequency: 12e9, Modes: 60, Families: []cavity.Family{cavity.TE}})
	if err != nil || len(got) == 0 {
		t.Fatal(got, err)
	}
	d := math.Abs(got[0].Frequency-fd) / fd
	t.Logf("finite differences %.9g Hz (accuracy %.2g), mode matching %.9g Hz, rel. difference %.2g", fd, acc, got[0].Frequency, d)
	if d > acc+got[0].Change/fd {
		t.Errorf("TE0 #1 = %.9g Hz, want %.9g Hz (finite differences, accuracy %.2g), rel. difference %.2g",
			got[0].Frequency, fd, acc, d)
	}
}
