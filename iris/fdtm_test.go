package iris

import (
	"math"
	"testing"

	"cylcav/cavity"
)

// fdHalfTM0 returns the lowest k^2 (1/m^2) of the TM0 (H_phi = u) problem
// on the half of a mirror-symmetric vacuum pair: a cell of radius a and
// length l on the end plate at z = 0, then half the iris (radius ri,
// length th) up to the mirror plane, which is a perfectly conducting plane
// (E_t = 0: the natural condition, no term) or a magnetic one (H_t = u =
// 0 on the plane). Cell-centred finite volumes on a square grid of step h,
// which must divide a, ri, l and th.
//
// u makes the Rayleigh quotient
//
//	k^2 = min int [ (1/r) (d(r u)/dr)^2 + r (du/dz)^2 ] dr dz / int r u^2 dr dz
//
// stationary (the curl-curl form for n = 0 TM fields; Jackson, Classical
// Electrodynamics, 3rd ed., sec. 8.7, as recalled); E_t = 0 on metal is its
// natural boundary condition, u ~ r at the axis gives the axis cell the
// term 2 h u^2, faces between cells give r (du)^2 (z faces) and
// (d(r u))^2 / r_face (r faces), and u = 0 on a magnetic plane half a cell
// away gives that cell 2 r u^2 (derived: r (u/(h/2))^2 over the half cell,
// h (h/2)). Lowest eigenvalue by inverse iteration with a banded Cholesky
// factor (Golub and Van Loan, Matrix Computations, 4th ed., sec. 4.3.5 and
// 8.2.2). Written for this test, independent of the mode-matching solver.
func fdHalfTM0(a, l, ri, th, h float64, magnetic bool) float64 {
	nl := int(math.Round(l / h))
	nz := nl + int(math.Round(th/h))
	na, ni := int(math.Round(a/h)), int(math.Round(ri/h))
	width := func(j int) int {
		if j < nl {
			return na
		}
		return ni
	}
	idx := make([][]int, nz)
	n, w := 0, 0
	for j := range nz {
		idx[j] = make([]int, width(j))
		for i := range idx[j] {
			idx[j][i] = n
			n++
		}
		w = max(w, width(j))
	}
	at := func(i, j int) int {
		if j < 0 || j >= nz || i < 0 || i >= len(idx[j]) {
			return -1
		}
		return idx[j][i]
	}
	band := make([]float64, n*(w+1))
	mass := make([]float64, n)
	add := func(p, q int, v float64) { band[p*(w+1)+p-q] += v }
	rc := func(i int) float64 { return (float64(i) + 0.5) * h }
	for j := range nz {
		for i := range idx[j] {
			p := idx[j][i]
			r := rc(i)
			mass[p] = r * h * h
			if i == 0 {
				add(p, p, 2*h)
			}
			if q := at(i+1, j); q >= 0 {
				rf := float64(i+1) * h
				r1 := rc(i + 1)
				add(p, p, r*r/rf)
				add(q, q, r1*r1/rf)
				add(q, p, -r*r1/rf)
			}
			if q := at(i, j+1); q >= 0 {
				add(p, p, r)
				add(q, q, r)
				add(q, p, -r)
			}
			if magnetic && j == nz-1 {
				add(p, p, 2*r)
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
			y[p] = mass[p] * x[p]
		}
		solve(y)
		var num, den, s float64
		for p := range y {
			num += x[p] * mass[p] * x[p]
			den += x[p] * mass[p] * y[p]
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

// TestPairFiniteVolumeTM010 is TestPairFiniteDifference for two TM010
// cells through a centred iris (electric coupling: E_z is largest on the
// axis): k from the lowest eigenvalues of the electric- and magnetic-plane
// half problems (fdHalfTM0), each extrapolated to zero step with the
// exponent 4/3 of a 270-degree edge (as in package axisym's finite-volume
// test), against Pair.At.
func TestPairFiniteVolumeTM010(t *testing.T) {
	if testing.Short() {
		t.Skip("finite volumes on up to 12000 cells")
	}
	const a, l, ri, th = 0.012, 0.008, 0.005, 0.001
	hs := []float64{0.0005 / 3, 0.0005 / 4, 0.0005 / 5}
	var el, mg [3]float64
	for i, h := range hs {
		el[i] = fdHalfTM0(a, l, ri, th/2, h, false)
		mg[i] = fdHalfTM0(a, l, ri, th/2, h, true)
	}
	const p = 4.0 / 3
	extrap := func(lam [3]float64, i int) float64 {
		x, y := math.Pow(hs[i], p), math.Pow(hs[i+1], p)
		return (lam[i+1]*x - lam[i]*y) / (x - y)
	}
	kOf := func(l1, l2 float64) float64 { return math.Abs(l1-l2) / (l1 + l2) }
	k1 := kOf(extrap(el, 0), extrap(mg, 0))
	k2 := kOf(extrap(el, 1), extrap(mg, 1))
	acc := fdSafety * math.Abs(k2-k1)
	pair := Pair{Radius: a, Length: l, Mode: cavity.Mode{Family: cavity.TM, M: 1, P: 0}, Wall: th, Modes: 80}
	pt, err := pair.At(ri)
	if err != nil {
		t.Fatal(err)
	}
	d := math.Abs(pt.K - k2)
	t.Logf("finite volumes: k = %.7g (accuracy %.2g; grids %v), mode matching k = %.7g (change %.2g), difference %.2g (%.2g relative)",
		k2, acc, []float64{kOf(el[0], mg[0]), kOf(el[1], mg[1]), kOf(el[2], mg[2])}, pt.K, pt.KChange, d, d/k2)
	if d > acc+pt.KChange {
		t.Errorf("k = %.7g by mode matching, want %.7g by finite volumes (accuracy %.2g)", pt.K, k2, acc)
	}
}
