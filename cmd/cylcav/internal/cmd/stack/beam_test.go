package stack_test

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/stack"
)

// TestBeamHarmonics checks --bunch-freq on a closed cylinder of radius
// 20 mm and length 30 mm: TM010 at c j_01/(2 pi a) = 5.7378 GHz (j_01 =
// 2.404825557695773, A&S Table 9.5) lies on the third harmonic of a
// 1912.6 MHz bunch train (flagged), and for a 1.5 GHz train its nearest
// harmonic is h = 4 (5.7378/1.5 = 3.83), 262 MHz away (not flagged). The
// statement that the dipoles' transverse R/Q is not computed (the dipole
// frequencies are listed with --order 1) is in the JSON and the table.
func TestBeamHarmonics(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "can.yaml")
	if err := os.WriteFile(file, []byte("sections:\n  - length: 30mm\n    radius: 20mm\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	f010 := 299792458 * 2.404825557695773 / (2 * math.Pi * 0.02)
	for _, tc := range []struct {
		bunch string
		h     int
		off   float64
		near  bool
	}{
		{"1912.6MHz", 3, f010 - 3*1912.6e6, true},
		{"1.5GHz", 4, f010 - 6e9, false},
	} {
		r := clitest.Run(t, "stack", file, "--fmax", "6GHz", "--family", "tm", "--bunch-freq", tc.bunch, "--format", "json")
		if r.Code != 0 {
			t.Fatalf("exit %d: %s", r.Code, r.Stderr)
		}
		var out struct {
			Resonances []stack.Row `json:"resonances"`
			Dipoles    string      `json:"dipoles"`
		}
		if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
			t.Fatal(err)
		}
		if len(out.Resonances) != 1 || out.Resonances[0].Harmonic == nil {
			t.Fatalf("--bunch-freq %s: %d resonances, want TM010 with its harmonic", tc.bunch, len(out.Resonances))
		}
		h := out.Resonances[0].Harmonic
		if h.Harmonic != tc.h || math.Abs(h.OffsetHz-tc.off) > 1e-6*f010 || h.Near != tc.near {
			t.Errorf("--bunch-freq %s: %+v, want harmonic %d, offset %g Hz, near %v", tc.bunch, *h, tc.h, tc.off, tc.near)
		}
		if !strings.Contains(out.Dipoles, "--order 1") || !strings.Contains(out.Dipoles, "transverse R/Q is not computed") {
			t.Errorf("--bunch-freq %s: JSON dipoles %q, want the pointer to --order 1 and that transverse R/Q is not computed", tc.bunch, out.Dipoles)
		}
	}
	// The table says so too, with --beta alone.
	r := clitest.Run(t, "stack", file, "--fmax", "6GHz", "--beta", "1")
	if r.Code != 0 || !strings.Contains(r.Stdout, "dipole (n = 1) modes") {
		t.Errorf("--beta 1: exit %d, no dipole note in\n%s", r.Code, r.Stdout)
	}
}

// TestHarmonicTE0NotFlagged: a TE0 resonance exactly on a beam harmonic
// is not flagged NEAR in the table (E_phi only: a beam does not drive it),
// though JSON keeps the proximity verdict; the note names the window that
// was used, not "our default" when --harmonic-window is given (both found
// by the user pass). The TE011 frequency of the 40 x 30 mm can is
// package cavity's closed form (Pozar 2012, sec. 6.7).
func TestHarmonicTE0NotFlagged(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "can.yaml")
	if err := os.WriteFile(file, []byte("sections:\n  - length: 30mm\n    radius: 20mm\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	m, err := cavity.ParseMode("TE011")
	if err != nil {
		t.Fatal(err)
	}
	f := (cavity.Cavity{Radius: 0.02, Length: 0.03}).Frequency(m)
	bunch := strconv.FormatFloat(f/8, 'f', 3, 64) + "Hz"
	r := clitest.Run(t, "stack", file, "--fmax", "11GHz", "--family", "te", "--bunch-freq", bunch, "--harmonic-window", "1%")
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	if strings.Contains(r.Stdout, "NEAR 8 x") || !strings.Contains(r.Stdout, "(near, R/Q 0)") || strings.Contains(r.Stdout, "our default window") || !strings.Contains(r.Stdout, "(--harmonic-window)") {
		t.Errorf("TE011 on the 8th harmonic:\n%s", r.Stdout)
	}
	r = clitest.Run(t, "stack", file, "--fmax", "11GHz", "--family", "te", "--bunch-freq", bunch, "--format", "json")
	if r.Code != 0 || !strings.Contains(r.Stdout, `"near_harmonic": true`) || !strings.Contains(r.Stdout, `"beam_drivable": false`) {
		t.Errorf("JSON: exit %d, %s", r.Code, r.Stdout)
	}
}

// TestHarmonicDipoleFlagged: a resonance of order 1 (a dipole) near a beam
// harmonic is flagged NEAR: its transverse R/Q is not computed, so it is
// not ruled out (after the merge with --order the TE0 rule had read it as
// "(near, R/Q 0)"). The nosed cell's two dipoles at 4.453 and 5.066 GHz
// lie 2.1 % and 2.6 % from 7 and 8 x 650 MHz, inside a 3 % window.
func TestHarmonicDipoleFlagged(t *testing.T) {
	inRepo(t)
	r := clitest.Run(t, "stack", "examples/nosed-cell.yaml", "--fmax", "6GHz", "--order", "1", "--bunch-freq", "650MHz", "--harmonic-window", "3%")
	if r.Code != 0 || !strings.Contains(r.Stdout, "NEAR 7 x 650 MHz") || !strings.Contains(r.Stdout, "NEAR 8 x 650 MHz") || strings.Contains(r.Stdout, "MHz (near, R/Q 0)") {
		t.Errorf("exit %d:\n%s%s", r.Code, r.Stdout, r.Stderr)
	}
}
