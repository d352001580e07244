package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// closedTol is the agreement required with the closed-form cylinder (test
// group 1 of the issue): the resonances of the truncated model are
// bracketed to relTol, and a body without steps has no truncation error.
const closedTol = 1e-10

// closedList returns the TE0mp and TM0mp modes of c below fmax from the
// enumeration of package cavity (Pozar, Microwave Engineering, 4th ed.,
// sec. 6.4), split by family, in frequency order.
func closedList(t *testing.T, c cavity.Cavity, fmax float64) map[cavity.Family][]cavity.Resonance {
	t.Helper()
	all, err := c.Modes(fmax)
	if err != nil {
		t.Fatal(err)
	}
	out := map[cavity.Family][]cavity.Resonance{}
	for _, r := range all {
		if r.Mode.N == 0 {
			out[r.Mode.Family] = append(out[r.Mode.Family], r)
		}
	}
	return out
}

// checkClosed solves b and compares every n = 0 resonance below fmax with
// the closed-form list of the cylinder c, which b must equal physically.
func checkClosed(t *testing.T, name string, b Body, c cavity.Cavity, fmax float64, wantLabels bool, tol float64) {
	t.Helper()
	got, err := Solve(b, Request{MaxFrequency: fmax, Modes: 8})
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	want := closedList(t, c, fmax)
	for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
		var g []Resonance
		for _, r := range got {
			if r.Family == fam {
				g = append(g, r)
			}
		}
		w := want[fam]
		if len(g) != len(w) {
			t.Errorf("%s: %v0 resonances below %g Hz: got %d, want %d (closed form)", name, fam, fmax, len(g), len(w))
			continue
		}
		for i := range w {
			if d := math.Abs(g[i].Frequency-w[i].Frequency) / w[i].Frequency; d > tol {
				t.Errorf("%s: %v0 #%d = %.15g Hz, want %.15g Hz (%v, closed form), rel. error %.2g",
					name, fam, i+1, g[i].Frequency, w[i].Frequency, w[i].Mode, d)
			}
			if wantLabels && !g[i].OriginTied && g[i].Origin != w[i].Mode {
				t.Errorf("%s: %v0 #%d continues from %v, want %v", name, fam, i+1, g[i].Origin, w[i].Mode)
			}
		}
	}
}

// TestOneSection is test group 1: a body of one section is the closed
// cylinder, and Solve must give exactly its n = 0 mode list.
func TestOneSection(t *testing.T) {
	for _, c := range []cavity.Cavity{
		{Radius: 0.02, Length: 0.03},
		{Radius: 0.05, Length: 0.011},
		{Radius: 0.004, Length: 0.1, Fill: physics.Medium{EpsR: 9.8}},
	} {
		fmax := 6 * c.Frequency(cavity.Mode{Family: cavity.TM, M: 1})
		b := Body{Sections: []Section{{Length: c.Length, Radius: c.Radius, Fill: c.Fill}}}
		checkClosed(t, "one section", b, c, fmax, c.Fill.EpsR == 0, closedTol)
	}
}

// coincidentTol is the agreement required when a resonance of the body
// falls exactly on a resonance of one closed section, as it does in a cut
// cylinder whose piece is a whole number of half guide wavelengths long:
// the junction matrix then holds entries of order 1/(f - f_pole) and the
// sign count near the root carries their rounding, about eps/|f - f_pole|
// relative, which limits the bracket to about sqrt(eps) = 1.5e-8 (derived;
// the package doc states it).
const coincidentTol = 2e-8

// TestSplitCylinder cuts a cylinder into sections of equal radius and fill:
// the junctions change nothing, so the closed-form list must come back.
// This checks the junction assembly and the Wittrick-Williams count for
// both families, including resonances that fall exactly on a pole of one
// section (a half-length section resonates with the whole).
func TestSplitCylinder(t *testing.T) {
	c := cavity.Cavity{Radius: 0.02, Length: 0.04}
	fmax := 5 * c.Frequency(cavity.Mode{Family: cavity.TM, M: 1})
	for _, cuts := range [][]float64{{0.5}, {0.3, 0.7}, {0.11, 0.5, 0.62, 0.9}} {
		var b Body
		z := 0.0
		for _, u := range append(cuts, 1) {
			b.Sections = append(b.Sections, Section{Length: (u - z) * c.Length, Radius: c.Radius})
			z = u
		}
		checkClosed(t, "split cylinder", b, c, fmax, true, coincidentTol)
	}
}
