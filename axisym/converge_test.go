package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
)

// stepped is the test body of the convergence and finite-difference
// checks: a wide centre cell between two narrow pieces (every step a
// 270-degree edge).
func stepped() Body {
	return Body{Sections: []Section{
		{Length: 0.01, Radius: 0.01},
		{Length: 0.02, Radius: 0.02},
		{Length: 0.01, Radius: 0.01},
	}}
}

// Bounds on the observed algebraic convergence order of the lowest
// resonance of stepped(). The order measured on N = 20, 40, 80 modes in the
// widest section is 2.0 for both families (see the package doc); the band
// allows for the next term of the asymptotic series at these N.
const (
	minOrder = 1.7
	maxOrder = 2.3
)

// TestConvergenceRate is test group 8: with steps the frequency converges
// algebraically in the number of modes N (the field is singular at each
// step edge: Meixner's edge condition), at the observed order 2: the
// successive differences shrink by about 4 when N doubles. Without steps
// (TestSplitCylinder) the result is exact at any N.
func TestConvergenceRate(t *testing.T) {
	if testing.Short() {
		t.Skip("solves the stepped body with up to 80 modes")
	}
	for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
		var f [3]float64
		for i, n := range []int{20, 40, 80} {
			r, _, err := resonances(stepped(), fam, 12e9, n, false)
			if err != nil || len(r) == 0 {
				t.Fatalf("%v0 with %d modes: %v %v", fam, n, r, err)
			}
			f[i] = r[0]
		}
		d1, d2 := f[1]-f[0], f[2]-f[1]
		order := math.Log2(d1 / d2)
		if !(order >= minOrder && order <= maxOrder) {
			t.Errorf("%v0: observed convergence order %.3f (f = %v), want %g..%g", fam, order, f, minOrder, maxOrder)
		}
	}
}

// TestChangeBoundsError checks that the convergence estimate of Solve is
// of the size of the true truncation error: against a reference with four
// times the modes, the error of the reported frequency lies within
// Change (the fine model has 1.5 N modes; with order 2 its error is about
// 0.8 Change).
func TestChangeBoundsError(t *testing.T) {
	if testing.Short() {
		t.Skip("reference with 160 modes")
	}
	got, err := Solve(stepped(), Request{MaxFrequency: 10e9, Modes: 20, Families: []cavity.Family{cavity.TM}})
	if err != nil || len(got) == 0 {
		t.Fatal(got, err)
	}
	ref, _, err := resonances(stepped(), cavity.TM, 10e9, 160, false)
	if err != nil {
		t.Fatal(err)
	}
	for i, r := range got {
		e := math.Abs(r.Frequency - ref[i])
		if e > r.Change {
			t.Errorf("TM0 #%d: error %.3g Hz against 160 modes exceeds the estimate %.3g Hz", i+1, e, r.Change)
		}
	}
}
