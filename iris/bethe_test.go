package iris

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/filter"
)

// betheLimitTol bounds |k_exact/k_Bethe - 1| for the smallest iris,
// r/a = 0.05 and k0 r = 0.12: Bethe's theory is the first term of an
// expansion in k0 r, and the field of the closed cell varies over the hole
// by (j_01 r/a)^2/4 = 0.4 % (J0's series); 1.5 % leaves room for the
// mode-matching truncation of a knife-edge iris (Change about 1e-3 of k).
const betheLimitTol = 0.015

// TestBetheLimitTM010 checks the coupling of two TM010 cells through a
// small centred iris in a very thin wall (1 um) against Bethe's
// small-hole theory (H. A. Bethe, Phys. Rev. 66 (1944) 163-182: electric
// polarisability 2 r^3/3; the coupling of two cavities through it as
// derived and tested in package filter, CouplingThrough): on the axis
// E_z is largest and H_t zero, so the coupling is purely electric and
// Bethe's limit is meaningful (for TE0 cells the centred hole has no
// dipole term). The two must meet as the iris shrinks: the departure
// shrinks with the radius and is below betheLimitTol at r = a/20.
func TestBetheLimitTM010(t *testing.T) {
	if testing.Short() {
		t.Skip("400 modes")
	}
	tm010 := cavity.Mode{Family: cavity.TM, M: 1, P: 0}
	p := Pair{Radius: 0.02, Length: 0.01, Mode: tm010, Wall: 1e-6, Modes: 400}
	prev := math.Inf(1)
	for _, r := range []float64{0.004, 0.002, 0.001} {
		pt, err := p.At(r)
		if err != nil {
			t.Fatal(err)
		}
		hc, err := filter.CouplingThrough(p.Cell(), p.Cell(), tm010, filter.Hole{Wall: filter.EndWall, Position: 1e-12, Radius: r})
		if err != nil {
			t.Fatal(err)
		}
		if hc.K >= 0 {
			t.Errorf("r = %g m: Bethe's k = %g, want electric (negative)", r, hc.K)
		}
		dev := math.Abs(pt.K/math.Abs(hc.K) - 1)
		t.Logf("r = %g m: k = %.6g (change %.2g), Bethe %.6g, departure %.4f", r, pt.K, pt.KChange, math.Abs(hc.K), dev)
		if !(dev < prev) {
			t.Errorf("r = %g m: departure from Bethe %.4g did not shrink (previous %.4g)", r, dev, prev)
		}
		prev = dev
	}
	if prev > betheLimitTol {
		t.Errorf("smallest iris: departure from Bethe %.4g, want below %g", prev, betheLimitTol)
	}
}
