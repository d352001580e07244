package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/internal/fdref"
	"cylcav/physics"
)

// slabsOf describes a vacuum body of sections for package fdref.
func slabsOf(secs []Section) []fdref.Slab {
	out := make([]fdref.Slab, len(secs))
	for i, s := range secs {
		out[i] = fdref.Slab{Length: s.Length, Inner: s.InnerRadius, Outer: s.Radius}
	}
	return out
}

// fdTE0 returns the lowest k^2 (1/m^2) of the TE0 (E_phi) problem of a
// body of sections (circular or coaxial) closed by plates, with relative
// permittivity eps(r, z) (nil: vacuum), by package fdref's finite
// differences on a square grid of step h, which must divide every radius
// and length; written independently of the mode-matching solver.
func fdTE0(t *testing.T, secs []Section, h float64, eps func(r, z float64) float64) float64 {
	t.Helper()
	lam, err := fdref.TE0(fdref.Problem{Slabs: slabsOf(secs), Step: h, Eps: eps})
	if err != nil {
		t.Fatal(err)
	}
	return lam
}

// TestSteppedFiniteDifference is test group 5: the lowest TE0 resonance of
// a stepped body by mode matching against an independent finite-difference
// solution of the scalar E_phi problem, extrapolated to zero step.
//
// Near a 270-degree edge u ~ rho^(2/3) (Meixner 1972), so the
// finite-difference eigenvalue converges as h^(4/3) (Strang and Fix, An
// Analysis of the Finite Element Method, ch. 8 on singularities, as
// recalled). Richardson extrapolation with that exponent on the grid pairs
// (h1, h2) and (h2, h3) gives two estimates; the accuracy stated for the
// finer one is fdref.Safety times their difference.
func TestSteppedFiniteDifference(t *testing.T) {
	if testing.Short() {
		t.Skip("finite differences on up to 28000 points")
	}
	b := stepped()
	hs := [3]float64{0.02 / 60, 0.02 / 90, 0.02 / 120}
	var lam [3]float64
	for i, h := range hs {
		lam[i] = fdTE0(t, b.Sections, h, nil)
	}
	ex1, ex2 := fdref.Richardson(hs, lam, 4.0/3)
	fd := physics.SpeedOfLight * math.Sqrt(ex2) / (2 * math.Pi)
	acc := fdref.Safety * math.Abs(ex2-ex1) / ex2 / 2 // relative, in frequency
	t.Logf("finite differences: f = %.9g Hz, stated accuracy %.2g", fd, acc)
	got, err := Solve(b, Request{MaxFrequency: 12e9, Modes: 60, Families: []cavity.Family{cavity.TE}})
	if err != nil || len(got) == 0 {
		t.Fatal(got, err)
	}
	if d := math.Abs(got[0].Frequency-fd) / fd; d > acc+got[0].Change/fd {
		t.Errorf("TE0 #1 = %.9g Hz, want %.9g Hz (finite differences, accuracy %.2g), rel. difference %.2g",
			got[0].Frequency, fd, acc, d)
	}
	// The edge-conditioned path (edgebasis.go) against the same reference.
	edge, _, err := edgeSolve(b, cavity.TE, 12e9)
	if err != nil || len(edge) == 0 {
		t.Fatal(edge, err)
	}
	d := math.Abs(edge[0]-fd) / fd
	t.Logf("edge basis %.12g Hz, rel. difference %.2g", edge[0], d)
	if d > acc {
		t.Errorf("edge basis: TE0 #1 = %.9g Hz, want %.9g Hz (finite differences, accuracy %.2g)", edge[0], fd, acc)
	}
}

// TestReentrantFiniteDifference repeats test group 5 for a coaxial
// re-entrant body (a post from one end plate) in TE0, which exercises the
// coaxial modes and the coaxial-in-circular junction: E_phi also vanishes
// on the post. The post's corner is a 270-degree edge, so the same
// extrapolation applies.
func TestReentrantFiniteDifference(t *testing.T) {
	if testing.Short() {
		t.Skip("finite differences on up to 28000 points")
	}
	b := Body{Sections: []Section{{Length: 0.02, Radius: 0.02, InnerRadius: 0.004}, {Length: 0.01, Radius: 0.02}}}
	hs := [3]float64{0.02 / 60, 0.02 / 90, 0.02 / 120}
	var lam [3]float64
	for i, h := range hs {
		lam[i] = fdTE0(t, b.Sections, h, nil)
	}
	ex1, ex2 := fdref.Richardson(hs, lam, 4.0/3)
	fd := physics.SpeedOfLight * math.Sqrt(ex2) / (2 * math.Pi)
	acc := fdref.Safety * math.Abs(ex2-ex1) / ex2 / 2
	got, err := Solve(b, Request{MaxFrequency: 12e9, Modes: 60, Families: []cavity.Family{cavity.TE}})
	if err != nil || len(got) == 0 {
		t.Fatal(got, err)
	}
	d := math.Abs(got[0].Frequency-fd) / fd
	t.Logf("finite differences %.9g Hz (accuracy %.2g), mode matching %.9g Hz, rel. difference %.2g", fd, acc, got[0].Frequency, d)
	if d > acc+got[0].Change/fd {
		t.Errorf("TE0 #1 = %.9g Hz, want %.9g Hz (finite differences, accuracy %.2g), rel. difference %.2g",
			got[0].Frequency, fd, acc, d)
	}
}
