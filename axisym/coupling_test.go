package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// irisPair is two equal cells (length cell, radius a) joined by a centred
// circular iris of radius ri and thickness t: invented dimensions.
func irisPair(cell, a, ri, t float64) Body {
	return Body{Sections: []Section{
		{Length: cell, Radius: a},
		{Length: t, Radius: ri},
		{Length: cell, Radius: a},
	}}
}

// evanescentSlopeTol bounds the relative error of the decay rate of k with
// the iris thickness: the next TE0 mode of the iris guide (j_{1,2}) adds a
// share of k at most exp(-(alpha2 - alpha) t1) = 1.2e-3 at t1 = 16 mm
// (amplitude ratio at most 1), which moves the slope measured over
// alpha (t2 - t1) = 1.7 by at most 7e-4.
const evanescentSlopeTol = 1e-3

// TestCouplingEvanescentIris checks the coupling coefficient of two TE011
// cells against the physics of a thick iris: the iris is a circular guide
// below cut-off, and for a long iris the coupling is carried by its lowest
// TE0 mode alone, so k falls as exp(-alpha t) with the thickness t, alpha =
// sqrt((j'_{0,1}/r)^2 - k0^2) its attenuation constant (Pozar, Microwave
// Engineering, 4th ed., sec. 3.4: TE01 cut-off p'_{01} = j_{1,1} = 3.8317;
// evanescent decay; the thickness correction of Cohn's iris design rests
// on the same decay). alpha here is computed from the closed form, not
// from the solver.
func TestCouplingEvanescentIris(t *testing.T) {
	const a, ri, t1, t2 = 0.020, 0.008, 0.016, 0.020
	k := func(th float64) (Coupling, float64) {
		r, err := Solve(irisPair(0.040, a, ri, th), Request{MaxFrequency: 10.5e9, Families: []cavity.Family{cavity.TE}})
		if err != nil {
			t.Fatal(err)
		}
		if len(r) != 2 || r[0].Origin.P != 1 || r[1].Origin.P != 2 {
			t.Fatalf("t = %g m: want the TE011/TE012 pair below 10.5 GHz, got %+v", th, r)
		}
		c, err := CouplingOf(r[0], r[1])
		if err != nil {
			t.Fatal(err)
		}
		return c, math.Sqrt(r[0].Frequency * r[1].Frequency)
	}
	c1, f := k(t1)
	c2, _ := k(t2)
	k0 := 2 * math.Pi * f / physics.SpeedOfLight
	j11 := 3.8317059702075123 // Abramowitz and Stegun Table 9.5 (j_{1,1}), recalled from memory
	alpha := math.Sqrt(math.Pow(j11/ri, 2) - k0*k0)
	slope := math.Log(c1.K/c2.K) / (t2 - t1)
	if d := math.Abs(slope-alpha) / alpha; d > evanescentSlopeTol {
		t.Errorf("decay of k with the iris thickness: %.6g 1/m, want alpha = %.6g 1/m (rel. %.2g)", slope, alpha, d)
	}
	for _, c := range []Coupling{c1, c2} {
		// The convergence estimate must be small against k itself.
		if !(c.Change < 1e-2*c.K) {
			t.Errorf("k = %.6g changes by %.3g when the modes grow by half", c.K, c.Change)
		}
	}
}

// TestCouplingOf checks the formula on a pair written out by hand (Hong and
// Lancaster 2001, sec. 8.2: k = (f2^2 - f1^2)/(f2^2 + f1^2)), its symmetry
// in the pair, and the errors.
func TestCouplingOf(t *testing.T) {
	lo := Resonance{Family: cavity.TE, Index: 1, Frequency: 9.9e9, Coarse: 9.9e9 + 300}
	hi := Resonance{Family: cavity.TE, Index: 2, Frequency: 10.0e9, Coarse: 10.0e9 + 500}
	want := (10.0*10.0 - 9.9*9.9) / (10.0*10.0 + 9.9*9.9)
	wantCoarse := ((10.0e9+500)*(10.0e9+500) - (9.9e9+300)*(9.9e9+300)) / ((10.0e9+500)*(10.0e9+500) + (9.9e9+300)*(9.9e9+300))
	for _, p := range [][2]Resonance{{lo, hi}, {hi, lo}} {
		c, err := CouplingOf(p[0], p[1])
		if err != nil {
			t.Fatal(err)
		}
		// 1e-13: a few roundings of the direct formula's squares.
		if math.Abs(c.K-want) > 1e-13*want || math.Abs(c.Change-math.Abs(want-wantCoarse)) > 1e-6*math.Abs(want-wantCoarse) {
			t.Errorf("CouplingOf = %+v, want k = %.15g, change %.6g", c, want, math.Abs(want-wantCoarse))
		}
	}
	noCoarse := hi
	noCoarse.Coarse = 0
	if c, _ := CouplingOf(lo, noCoarse); !math.IsInf(c.Change, 1) {
		t.Errorf("without a smaller model the change must be +Inf, got %g", c.Change)
	}
	tm := hi
	tm.Family = cavity.TM
	for _, p := range [][2]Resonance{{lo, tm}, {lo, lo}, {lo, {Family: cavity.TE, Index: 3}}} {
		if _, err := CouplingOf(p[0], p[1]); err == nil {
			t.Errorf("CouplingOf(%+v, %+v): want an error", p[0], p[1])
		}
	}
}
