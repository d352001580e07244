package iris

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/internal/fdref"
)

// TestPairFiniteVolumeTM010 is TestPairFiniteDifference for two TM010
// cells through a centred iris (electric coupling: E_z is largest on the
// axis): k from the lowest eigenvalues of the electric- and magnetic-plane
// half problems (fdHalf), each extrapolated to zero step with the
// exponent 4/3 of a 270-degree edge (as in package axisym's finite-volume
// test), against Pair.At.
func TestPairFiniteVolumeTM010(t *testing.T) {
	if testing.Short() {
		t.Skip("finite volumes on up to 12000 cells")
	}
	const a, l, ri, th = 0.012, 0.008, 0.005, 0.001
	hs := [3]float64{0.0005 / 3, 0.0005 / 4, 0.0005 / 5}
	var el, mg [3]float64
	for i, h := range hs {
		el[i] = fdHalf(t, cavity.TM, a, l, ri, th/2, h, fdref.Plate)
		mg[i] = fdHalf(t, cavity.TM, a, l, ri, th/2, h, fdref.Magnetic)
	}
	kOf := func(l1, l2 float64) float64 { return math.Abs(l1-l2) / (l1 + l2) }
	c1, f1 := fdref.Richardson(hs, el, 4.0/3)
	c2, f2 := fdref.Richardson(hs, mg, 4.0/3)
	k1, k2 := kOf(c1, c2), kOf(f1, f2)
	acc := fdref.Safety * math.Abs(k2-k1)
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
