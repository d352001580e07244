package iris

import (
	"math"
	"testing"

	"cylcav/cavity"
)

// fdHalfTE0 returns the lowest k^2 (1/m^2) of the TE0 (E_phi = u) problem
// on the half of a mirror-symmetric vacuum pair: a cell of radius a and
// length l on the end plate at z = 0, then half the iris (radius ri, length
// th) up to the mirror plane, where the field is odd (u = 0, a perfectly
// conducting plane) or even (du/dz = 0, a magnetic plane). Grid step h
// must divide a, ri, l and th.
//
// u obeys (1/r)(r u_r)_r - u/r^2 + u_zz + k^2 u = 0, u = 0 on the axis and
// on metal (Jackson, Classical Electrodynamics, 3rd ed., sec. 8.7, as
// recalled); multiplied by r the five-point operator is symmetric, A u =
// k^2 R u, R = diag(r). The even plane is a row of unknowns at z = zmax
// with the ghost u_{nz+1} = u_{nz-1} and the row halved, which keeps A
// symmetric (LeVeque, Finite Difference Methods for Ordinary and Partial
// Differential Equations, SIAM 2007, sec. 2.12, Neumann conditions, as
// recalled). The lowest eigenvalue comes from inverse iteration with a
// banded Cholesky factor (Golub and Van Loan, Matrix Computations, 4th ed.,
// sec. 4.3.5 and 8.2.2). Written for this test, independent of the
// mode-matching solver.
func fdHalfTE0(a, l, ri, th, h float64, even bool) float64 {
	nl := int(math.Round(l / h))
	nz := nl + int(math.Round(th/h))
	na, ni := int(math.Round(a/h)), int(math.Round(ri/h))
	jmax := nz - 1
	if even {
		jmax = nz
	}
	// top(j) is the last unknown radius index at row j.
	top := func(j int) int {
		if j < nl {
			return na - 1
		}
		return ni - 1 // the junction plane and the iris: field only in the hole
	}
	idx := make([][]int, jmax+1)
	n, w := 0, 0
	for j := 1; j <= jmax; j++ {
		idx[j] = make([]int, top(j)+1)
		for i := 1; i <= top(j); i++ {
			idx[j][i] = n
			n++
		}
		w = max(w, top(j))
	}
	at := func(i, j int) int {
		if j < 1 || j > jmax || i < 1 || i > top(j) {
			return -1
		}
		return idx[j][i]
	}
	band := make([]float64, n*(w+1))
	rw := make([]float64, n)
	for j := 1; j <= jmax; j++ {
		half := 1.0
		if even && j == nz {
			half = 0.5
		}
		for i := 1; i <= top(j); i++ {
			p := idx[j][i]
			r := float64(i) * h
			rp, rm := r+h/2, r-h/2
			rw[p] = half * r
			band[p*(w+1)] = half * ((rp+rm)/(h*h) + 1/r + 2*r/(h*h))
			if q := at(i-1, j); q >= 0 {
				band[p*(w+1)+p-q] = -half * rm / (h * h)
			}
			if q := at(i, j-1); q >= 0 {
				band[p*(w+1)+p-q] = -r / (h * h) // the halved ghost pair: 2 r/h^2 / 2
			}
		}
	}
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
	for range 500 {
		for p := range y {
			y[p] = rw[p] * x[p]
		}
		solve(y)
		var num, den, s float64
		for p := range y {
			num += x[p] * rw[p] * x[p]
			den += x[p] * rw[p] * y[p]
			s += y[p] * y[p]
		}
		next := num / den
		s = math.Sqrt(s)
		for p := range x {
			x[p] = y[p] / s
		}
		if math.Abs(next-lambda) <= 1e-14*next {
			return next
		}
		lambda = next
	}
	return lambda
}

// fdSafety widens the difference of successive Richardson extrapolations
// into a stated accuracy (common practice for Richardson estimates).
const fdSafety = 3

// TestPairFiniteDifference checks k of two TE011 cells through a centred
// iris against finite differences of the even and odd half problems
// (fdHalfTE0), each extrapolated to zero step with the exponent 4/3 of a
// 270-degree edge (u ~ rho^(2/3), Meixner 1972; Strang and Fix, An Analysis
// of the Finite Element Method, ch. 8, as recalled); k = (l_h - l_l)/(l_h +
// l_l) in the eigenvalues k^2 (Hong and Lancaster 2001, sec. 8.2). The
// stated accuracy is fdSafety times the change between the extrapolations
// from the coarser and the finer grid pairs.
func TestPairFiniteDifference(t *testing.T) {
	if testing.Short() {
		t.Skip("finite differences on up to 40000 points")
	}
	const a, l, ri, th = 0.012, 0.012, 0.006, 0.002
	hs := []float64{0.001 / 6, 0.001 / 9, 0.001 / 12}
	var odd, even [3]float64
	for i, h := range hs {
		odd[i] = fdHalfTE0(a, l, ri, th/2, h, false)
		even[i] = fdHalfTE0(a, l, ri, th/2, h, true)
	}
	const p = 4.0 / 3
	extrap := func(lam [3]float64, i int) float64 {
		x, y := math.Pow(hs[i], p), math.Pow(hs[i+1], p)
		return (lam[i+1]*x - lam[i]*y) / (x - y)
	}
	kOf := func(l1, l2 float64) float64 { return math.Abs(l1-l2) / (l1 + l2) }
	k1 := kOf(extrap(odd, 0), extrap(even, 0))
	k2 := kOf(extrap(odd, 1), extrap(even, 1))
	acc := fdSafety * math.Abs(k2-k1)
	pair := Pair{Radius: a, Length: l, Mode: cavity.Mode{Family: cavity.TE, M: 1, P: 1}, Wall: th, Modes: 80}
	pt, err := pair.At(ri)
	if err != nil {
		t.Fatal(err)
	}
	d := math.Abs(pt.K - k2)
	t.Logf("finite differences: k = %.7g (accuracy %.2g; grids %v), mode matching k = %.7g (change %.2g), difference %.2g (%.2g relative)",
		k2, acc, []float64{kOf(odd[0], even[0]), kOf(odd[1], even[1]), kOf(odd[2], even[2])}, pt.K, pt.KChange, d, d/k2)
	if d > acc+pt.KChange {
		t.Errorf("k = %.7g by mode matching, want %.7g by finite differences (accuracy %.2g)", pt.K, k2, acc)
	}
}
