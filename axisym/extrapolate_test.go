package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
)

// TestExtrapolateStepped checks the Richardson extrapolation on the
// five-section body against a reference extrapolated from twice the modes
// (60, 120 and 240 in the widest section): the two must agree within the
// sum of their error estimates, and each extrapolation must be closer to
// the reference than the finest model it starts from (the extrapolation
// must gain). Observed: estimates 4e-8..3e-7 relative at N = 30, 4e-9..9e-8
// at N = 60; 1e-8 is reached only from N = 120 (finest model 480 modes) and
// not for every resonance (see the package doc).
func TestExtrapolateStepped(t *testing.T) {
	if testing.Short() {
		t.Skip("reference with 240 modes")
	}
	b := fiveSections()
	got, err := Extrapolate(b, cavity.TM, 10e9, 30)
	if err != nil {
		t.Fatal(err)
	}
	ref, err := Extrapolate(b, cavity.TM, 10e9, 60)
	if err != nil {
		t.Fatal(err)
	}
	if len(got) < 5 || len(ref) < 5 {
		t.Fatalf("want five resonances, got %d and %d", len(got), len(ref))
	}
	for i, g := range got[:5] {
		r := ref[i]
		if !g.Regular || !r.Regular {
			t.Errorf("TM0 #%d: convergence not regular (%+v, %+v)", i+1, g, r)
			continue
		}
		d := math.Abs(g.Frequency - r.Frequency)
		if d > g.Error+r.Error {
			t.Errorf("TM0 #%d: extrapolation %.12g Hz is %.3g Hz from the reference %.12g Hz, beyond the estimates %.3g + %.3g Hz",
				i+1, g.Frequency, d, r.Frequency, g.Error, r.Error)
		}
		if plain := math.Abs(g.Models[2] - r.Frequency); d >= plain {
			t.Errorf("TM0 #%d: extrapolation (off by %.3g Hz) does not improve on its finest model (off by %.3g Hz)", i+1, d, plain)
		}
	}
}

// TestExtrapolateExact checks that a body without steps (two sections of
// one radius, different fills) keeps the exact closed-form frequencies:
// the three models agree to rounding, so nothing is extrapolated
// (compared with Solve, which is tested to 1e-9 against the
// transverse-resonance equation in TestTwoFills).
func TestExtrapolateExact(t *testing.T) {
	b := Body{Sections: []Section{
		{Length: 0.01, Radius: 0.015},
		{Length: 0.02, Radius: 0.015},
	}}
	b.Sections[0].Fill.EpsR = 4
	ex, err := Extrapolate(b, cavity.TE, 12e9, 10)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := Solve(b, Request{MaxFrequency: 12e9, Modes: 10, Families: []cavity.Family{cavity.TE}})
	if err != nil {
		t.Fatal(err)
	}
	if len(ex) == 0 || len(ex) != len(sol) {
		t.Fatalf("%d extrapolated, %d solved", len(ex), len(sol))
	}
	for i, e := range ex {
		// 1e-12: the models' roots are found to 1e-14; the rest is rounding.
		if !e.Regular || !math.IsNaN(e.Order) || math.Abs(e.Frequency-sol[i].Frequency) > 1e-12*e.Frequency || e.Error > 1e-12*e.Frequency {
			t.Errorf("TE0 #%d: %+v, want %.14g Hz unchanged", i+1, e, sol[i].Frequency)
		}
	}
}

// TestExtrapolateBad checks the errors.
func TestExtrapolateBad(t *testing.T) {
	for _, c := range []struct {
		fam   cavity.Family
		fmax  float64
		modes int
	}{{cavity.TM, 0, 10}, {cavity.TM, math.Inf(1), 10}, {cavity.Family(9), 1e10, 10}, {cavity.TM, 1e10, MaxModes}} {
		if _, err := Extrapolate(fiveSections(), c.fam, c.fmax, c.modes); err == nil {
			t.Errorf("Extrapolate(%v, %g, %d): want an error", c.fam, c.fmax, c.modes)
		}
	}
}
