package iris

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/internal/fdref"
)

// fdHalf returns the lowest k^2 (1/m^2) of the n = 0 problem of family
// fam on the half of a mirror-symmetric vacuum pair: a cell of radius a and
// length l on the end plate at z = 0, then half the iris (radius ri, length
// th) up to the mirror plane, which is a metal plate (the odd TE0 or the
// electric-wall TM0 half) or a magnetic plane (the even TE0 or the
// magnetic-wall TM0 half); grid step h must divide a, ri, l and th. It is
// package fdref's finite-difference (TE0) or finite-volume (TM0) solution,
// written independently of the mode-matching solver.
func fdHalf(t *testing.T, fam cavity.Family, a, l, ri, th, h float64, far fdref.Far) float64 {
	t.Helper()
	p := fdref.Problem{Slabs: []fdref.Slab{{Length: l, Outer: a}, {Length: th, Outer: ri}}, Step: h, Far: far}
	solve := fdref.TE0
	if fam == cavity.TM {
		solve = fdref.TM0
	}
	lam, err := solve(p)
	if err != nil {
		t.Fatal(err)
	}
	return lam
}

// TestPairFiniteDifference checks k of two TE011 cells through a centred
// iris against finite differences of the even and odd half problems
// (fdHalf), each extrapolated to zero step with the exponent 4/3 of a
// 270-degree edge (u ~ rho^(2/3), Meixner 1972; Strang and Fix, An Analysis
// of the Finite Element Method, ch. 8, as recalled); k = (l_h - l_l)/(l_h +
// l_l) in the eigenvalues k^2 (Hong and Lancaster 2001, sec. 8.2). The
// stated accuracy is fdref.Safety times the change between the extrapolations
// from the coarser and the finer grid pairs.
func TestPairFiniteDifference(t *testing.T) {
	if testing.Short() {
		t.Skip("finite differences on up to 40000 points")
	}
	const a, l, ri, th = 0.012, 0.012, 0.006, 0.002
	hs := [3]float64{0.001 / 6, 0.001 / 9, 0.001 / 12}
	var odd, even [3]float64
	for i, h := range hs {
		odd[i] = fdHalf(t, cavity.TE, a, l, ri, th/2, h, fdref.Plate)
		even[i] = fdHalf(t, cavity.TE, a, l, ri, th/2, h, fdref.Magnetic)
	}
	kOf := func(l1, l2 float64) float64 { return math.Abs(l1-l2) / (l1 + l2) }
	c1, f1 := fdref.Richardson(hs, odd, 4.0/3)
	c2, f2 := fdref.Richardson(hs, even, 4.0/3)
	k1, k2 := kOf(c1, c2), kOf(f1, f2)
	acc := fdref.Safety * math.Abs(k2-k1)
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
