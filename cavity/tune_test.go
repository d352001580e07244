package cavity

import (
	"fmt"
	"math"
	"testing"

	"cylcav/physics"
)

// TestSlaterEndPlateMatchesTuningSlope: Slater's theorem applied to the
// thin volume removed when end plate B moves in by delta must give the
// exact tuning slope df/dL = -f (beta/k)^2 / L (Sensitivity) to first
// order. The quadrature is exact to rounding; slaterTol covers it.
func TestSlaterEndPlateMatchesTuningSlope(t *testing.T) {
	const slaterTol = 1e-10
	for _, tc := range []struct {
		mode string
		c    Cavity
	}{
		{"TE011", Cavity{Radius: 0.02, Length: 0.03}},
		{"TE012", Cavity{Radius: 0.02, Length: 0.05}},
		{"TE013", Cavity{Radius: 0.015, Length: 0.09, Fill: physics.Medium{EpsR: 2.08}}},
		{"TE021", Cavity{Radius: 0.04, Length: 0.03}},
		{"TE111", Cavity{Radius: 0.01, Length: 0.03}},
		{"TM011", Cavity{Radius: 0.02, Length: 0.03}},
		{"TM212", Cavity{Radius: 0.02, Length: 0.03}},
	} {
		m := mustMode(t, tc.mode)
		s, err := tc.c.Sensitivity(m, Thermal{})
		if err != nil {
			t.Fatal(err)
		}
		const delta = 1e-6
		got, err := tc.c.EndPlateShift(m, delta)
		if err != nil {
			t.Fatal(err)
		}
		want := -s.DfDL * delta // the length shrinks by delta
		if math.Abs(got-want) > slaterTol*math.Abs(want) {
			t.Errorf("%s Slater end-plate shift = %.15g Hz, want %.15g Hz (-df/dL delta)", tc.mode, got, want)
		}
	}
}

// TestSphereShiftTM010Axis: a small metal sphere at the centre of a TM010
// cavity sits in pure Ez = E0, where W = pi eps E0^2 a^2 L J_1(j01)^2 / 2
// (derived from the TM010 field, Pozar sec. 6.4), so Slater's formula
// reduces to Delta f / f = -2 r0^3 / (a^2 L J_1(j01)^2): the bead-pull
// result. J_1(j01) from mpmath 1.3.0 at 25 digits.
func TestSphereShiftTM010Axis(t *testing.T) {
	const j1AtJ01 = 0.5191474972894667881402026 // mpmath besselj(1, besseljzero(0, 1))
	c := Cavity{Radius: 0.04, Length: 0.05}
	r0 := 0.5e-3
	p, err := c.SphereShift(mustMode(t, "TM010"), Point{0, 0, 0.025}, r0)
	if err != nil {
		t.Fatal(err)
	}
	want := -2 * r0 * r0 * r0 / (c.Radius * c.Radius * c.Length * j1AtJ01 * j1AtJ01)
	if len(p.Relative) != 1 || math.Abs(p.Relative[0]-want) > routeTol*math.Abs(want) {
		t.Errorf("SphereShift(TM010 centre) = %.15g, want [%.15g]", p.Relative, want)
	}
	if !p.Valid || p.Contact != Free {
		t.Errorf("SphereShift(TM010 centre) valid %v contact %v, want valid free sphere", p.Valid, p.Contact)
	}
	// A TE011 screw tip on the side wall sits in pure tangential H: the
	// frequency rises (Slater: removing magnetic-field volume raises f).
	c = Cavity{Radius: 0.02, Length: 0.03}
	p, err = c.SphereShift(mustMode(t, "TE011"), Point{0.02, 0, 0.015}, 1e-3)
	if err != nil {
		t.Fatal(err)
	}
	// The set is TE011 with TM111 cos and sin; at the side wall TE011's
	// Hz and TM111's H_phi are orthogonal, so TE011 keeps its own shift.
	te := -1
	for k, v := range p.Vectors {
		if math.Abs(v[0]) > 1-routeTol {
			te = k
		}
	}
	if te < 0 || !(p.Relative[te] > 0) || p.Contact != OnWall {
		t.Errorf("SphereShift(TE011 side wall) = %+v, want a positive shift of the TE011 pattern on the wall", p)
	}
	if _, err := c.SphereShift(mustMode(t, "TE011"), Point{0.0195, 0, 0.015}, 1e-3); err == nil {
		t.Errorf("SphereShift(sphere through the wall) error = nil, want an error")
	}
}

// TestTuneCurve checks the tuning curve against Frequency, the slope
// against a central difference and each crossing against equal
// frequencies.
func TestTuneCurve(t *testing.T) {
	// fdTol: a central difference with step 1e-6 L has truncation error
	// about 1e-12 and rounding error about 1e-16/1e-6 = 1e-10 relative.
	const fdTol = 1e-7
	w := mustMode(t, "TE011")
	c := Cavity{Radius: 0.02}
	tc, err := c.Tune(w, 0.02, 0.05, 30, false)
	if err != nil {
		t.Fatal(err)
	}
	if len(tc.Points) != 31 {
		t.Fatalf("Tune points = %d, want 31", len(tc.Points))
	}
	for _, p := range tc.Points {
		cc := Cavity{Radius: 0.02, Length: p.Length}
		if f := cc.Frequency(w); f != p.Frequency {
			t.Errorf("Tune f(L = %g) = %.15g, want %.15g", p.Length, p.Frequency, f)
		}
		h := 1e-6 * p.Length
		up, dn := cc, cc
		up.Length += h
		dn.Length -= h
		if fd := (up.Frequency(w) - dn.Frequency(w)) / (2 * h); math.Abs(p.DfDL-fd) > fdTol*math.Abs(fd) {
			t.Errorf("Tune df/dL(L = %g) = %.12g, want %.12g (central difference)", p.Length, p.DfDL, fd)
		}
		if want := bruteClearance(t, w, 0.04/p.Length); math.Abs(p.Clearance-want) > routeTol {
			t.Errorf("Tune clearance(L = %g) = %.15g, want %.15g", p.Length, p.Clearance, want)
		}
	}
	if len(tc.Crossings) == 0 || tc.Worst != 0 {
		t.Fatalf("Tune over D/L 0.8..2 crossings %v worst %g, want crossings and zero worst clearance", tc.Crossings, tc.Worst)
	}
	for _, x := range tc.Crossings {
		cc := Cavity{Radius: 0.02, Length: x.Length}
		if fw, fi := cc.Frequency(w), cc.Frequency(x.Mode); math.Abs(fw-fi) > routeTol*fw {
			t.Errorf("Tune crossing %s at L = %g: f = %.15g and %.15g, want equal", x.Mode, x.Length, fw, fi)
		}
	}
	// A range without crossings: the worst clearance is at an end.
	tc, err = c.Tune(w, 0.04/1.7, 0.04/1.3, 4, false)
	if err != nil {
		t.Fatal(err)
	}
	ends := math.Min(bruteClearance(t, w, 1.7), bruteClearance(t, w, 1.3))
	if len(tc.Crossings) != 0 || math.Abs(tc.Worst-ends) > routeTol {
		t.Errorf("Tune(D/L 1.3..1.7) worst %.15g crossings %v, want %.15g and none", tc.Worst, tc.Crossings, ends)
	}
}

func ExampleCavity_Tune() {
	// An invented 40 mm TE011 cavity tuned from 29 mm to 31 mm.
	m, _ := ParseMode("TE011")
	c := Cavity{Radius: 0.02}
	tc, _ := c.Tune(m, 0.029, 0.031, 2, false)
	for _, p := range tc.Points {
		fmt.Printf("L = %.1f mm: f = %.4f GHz, clearance %.2f %% (%s)\n", 1e3*p.Length, p.Frequency/1e9, 100*p.Clearance, p.Limiting)
	}
	// Output:
	// L = 29.0 mm: f = 10.5013 GHz, clearance 6.96 % (TE112)
	// L = 30.0 mm: f = 10.4176 GHz, clearance 4.78 % (TE112)
	// L = 31.0 mm: f = 10.3413 GHz, clearance 2.71 % (TE112)
}
