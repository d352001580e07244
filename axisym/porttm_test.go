package axisym

import (
	"math"
	"math/cmplx"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// TestPortQTM010ThinIris checks PortQ on a TM010 cell (radius 20 mm,
// length 10 mm) fed through a centred iris of radius 4 mm in a 1 um wall
// from a TM01 guide of radius 30 mm, started at the closed cell's
// resonance j_{0,1} c / (2 pi a) itself: there the cell line's beta is 0,
// a pole of its TM susceptance, and the thin iris's many nearly shorted
// modes make the determinant underflow a float64 (the cases the even pole
// factor, the off-axis scaling and the mantissa-exponent determinant of
// port.go are for). The root must be the same as from a start beside it,
// and its Qext must match the group delay of the port reflection
// (PortS11, Qext = omega0 tau / 4; Kajfez, Q Factor, 1994, ch. 2, as
// recalled) to 1e-3 as in TestPortQGroupDelay.
func TestPortQTM010ThinIris(t *testing.T) {
	const a = 0.020
	fc := 2.404825557695773 * physics.SpeedOfLight / (2 * math.Pi * a) // A&S Table 9.5 (recalled)
	// The port is the pipe at end A (PortS11's convention).
	b := Body{Sections: []Section{
		{Length: 0.030, Radius: 0.030},
		{Length: 1e-6, Radius: 0.004},
		{Length: 0.010, Radius: a},
	}, EndA: Pipe}
	f0, q, err := PortQ(b, cavity.TM, fc, 150)
	if err != nil {
		t.Fatal(err)
	}
	f1, q1, err := PortQ(b, cavity.TM, fc*1.003, 150)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(f1-f0) > 1e-10*f0 || math.Abs(q1-q) > 1e-6*q {
		t.Errorf("start at the closed resonance: %.12g Hz Qext %.8g; start beside it: %.12g Hz Qext %.8g", f0, q, f1, q1)
	}
	fg, qg := groupDelayQModes(t, b, cavity.TM, f0, q, 150)
	if d := math.Abs(qg-q) / q; d > 1e-3 {
		t.Errorf("Qext complex route %.8g, group delay %.8g (rel %.1e)", q, qg, d)
	}
	if d := math.Abs(fg-f0) / f0; d > 0.1/q {
		t.Errorf("f0 complex route %.12g, group-delay peak %.12g", f0, fg)
	}
	t.Logf("f0 %.10g Hz (closed cell %.10g Hz), Qext %.8g (complex), %.8g (group delay)", f0, fc, q, qg)
}

// groupDelayQModes is groupDelayQ with modes waveguide modes in the widest
// section.
func groupDelayQModes(t *testing.T, b Body, fam cavity.Family, f0, q float64, modes int) (float64, float64) {
	t.Helper()
	bw := f0 / q
	h := 1e-4 * bw
	tau := func(f float64) float64 {
		s1, err1 := PortS11(b, fam, f-h, modes)
		s2, err2 := PortS11(b, fam, f+h, modes)
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		return -cmplx.Phase(s2/s1) / (2 * math.Pi * 2 * h)
	}
	lo, hi := f0-bw, f0+bw
	g := (math.Sqrt(5) - 1) / 2
	for range 60 {
		a, c := hi-g*(hi-lo), lo+g*(hi-lo)
		if tau(a) > tau(c) {
			hi = c
		} else {
			lo = a
		}
	}
	fp := 0.5 * (lo + hi)
	return fp, 2 * math.Pi * fp * tau(fp) / 4
}
