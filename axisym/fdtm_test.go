package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/internal/fdref"
	"cylcav/physics"
)

// fdTM0 returns the lowest k^2 (1/m^2) of the TM0 (H_phi) problem of a
// vacuum body of sections (circular or coaxial) closed by plates, by
// package fdref's cell-centred finite volumes on a square grid of step h,
// which must divide every radius and length.
func fdTM0(t *testing.T, secs []Section, h float64) float64 {
	t.Helper()
	lam, err := fdref.TM0(fdref.Problem{Slabs: slabsOf(secs), Step: h})
	if err != nil {
		t.Fatal(err)
	}
	return lam
}

// TestTMFiniteDifference is test group 5 for TM0: the lowest TM0
// resonance of a closed cylinder (a check of the scheme against the closed
// form) and of a re-entrant body and the stepped body against the
// extrapolated finite-volume solution (exponent 4/3, as in
// TestSteppedFiniteDifference).
func TestTMFiniteDifference(t *testing.T) {
	if testing.Short() {
		t.Skip("finite volumes on up to 48000 cells")
	}
	for _, tc := range []struct {
		name string
		b    Body
		p    float64
	}{
		{"cylinder", Body{Sections: []Section{{Length: 0.03, Radius: 0.02}}}, 2},
		{"re-entrant", Body{Sections: []Section{{Length: 0.02, Radius: 0.02, InnerRadius: 0.004}, {Length: 0.01, Radius: 0.02}}}, 4.0 / 3},
		{"stepped", stepped(), 4.0 / 3},
	} {
		hs := [3]float64{0.02 / 60, 0.02 / 90, 0.02 / 120}
		var lam [3]float64
		for i, h := range hs {
			lam[i] = fdTM0(t, tc.b.Sections, h)
		}
		ex1, ex2 := fdref.Richardson(hs, lam, tc.p)
		fd := physics.SpeedOfLight * math.Sqrt(ex2) / (2 * math.Pi)
		acc := fdref.Safety*math.Abs(ex2-ex1)/ex2/2 + 1e-7
		got, err := Solve(tc.b, Request{MaxFrequency: 8e9, Modes: 60, Families: []cavity.Family{cavity.TM}})
		if err != nil || len(got) == 0 {
			t.Fatal(got, err)
		}
		d := math.Abs(got[0].Frequency-fd) / fd
		t.Logf("%s: finite volumes %.9g Hz (accuracy %.2g), mode matching %.9g Hz, rel. difference %.2g", tc.name, fd, acc, got[0].Frequency, d)
		if d > acc+got[0].Change/fd {
			t.Errorf("%s: TM0 #1 = %.9g Hz, want %.9g Hz (finite volumes, accuracy %.2g), rel. difference %.2g",
				tc.name, got[0].Frequency, fd, acc, d)
		}
		if tc.name != "stepped" {
			continue
		}
		// The edge-conditioned path (edgebasis.go) against the same reference.
		edge, _, err := edgeSolve(tc.b, cavity.TM, 8e9)
		if err != nil || len(edge) == 0 {
			t.Fatal(edge, err)
		}
		d = math.Abs(edge[0]-fd) / fd
		t.Logf("%s: edge basis %.12g Hz, rel. difference %.2g", tc.name, edge[0], d)
		if d > acc {
			t.Errorf("%s: edge basis: TM0 #1 = %.9g Hz, want %.9g Hz (finite volumes, accuracy %.2g)", tc.name, edge[0], fd, acc)
		}
	}
}
