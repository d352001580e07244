package cavity

import (
	"bufio"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"cylcav/physics"
)

// The reference table cavity/testdata/modes.txt lists every mode up to a
// limit for five invented cavities, with frequencies computed by
// cavity/testdata/gen_modes.py with mpmath 1.3.0 at 40 significant digits
// (mpmath.besseljzero; c = 299792458 m/s exact), independently of cylcav
// and of physics/bessel. It is printed to 17 significant digits.

// refTol is the relative tolerance against the mpmath frequencies: the
// Bessel zeros are good to about 1e-14 relative (physics/bessel's
// contract) and the formula adds a few ulps.
const refTol = 2e-14

type refCavity struct {
	name  string
	cav   Cavity
	fmax  float64
	modes []Resonance
}

func readReference(t testing.TB) []refCavity {
	t.Helper()
	f, err := os.Open(filepath.Join("testdata", "modes.txt"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var out []refCavity
	sc := bufio.NewScanner(f)
	num := func(s string) float64 {
		v, err := strconv.ParseFloat(s, 64)
		if err != nil {
			t.Fatalf("modes.txt: %v", err)
		}
		return v
	}
	for sc.Scan() {
		line := strings.TrimSpace(sc.Text())
		if line == "" || strings.HasPrefix(line, "#") || line == "end" {
			continue
		}
		fs := strings.Fields(line)
		if fs[0] == "cavity" {
			if len(fs) != 7 {
				t.Fatalf("modes.txt: bad header %q", line)
			}
			out = append(out, refCavity{
				name: fs[1],
				cav:  Cavity{Radius: num(fs[2]), Length: num(fs[3]), Fill: physics.Medium{EpsR: num(fs[4]), MuR: num(fs[5])}},
				fmax: num(fs[6]),
			})
			continue
		}
		if len(fs) != 6 || len(out) == 0 {
			t.Fatalf("modes.txt: bad row %q", line)
		}
		m, err := ParseMode(fs[0])
		if err != nil {
			t.Fatalf("modes.txt: %v", err)
		}
		if m.Family.String() != fs[1] || strconv.Itoa(m.N) != fs[2] || strconv.Itoa(m.M) != fs[3] || strconv.Itoa(m.P) != fs[4] {
			t.Fatalf("modes.txt: label %s disagrees with indices in %q", fs[0], line)
		}
		rc := &out[len(out)-1]
		rc.modes = append(rc.modes, Resonance{Mode: m, Frequency: num(fs[5])})
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	if len(out) == 0 {
		t.Fatal("modes.txt: no cavities")
	}
	return out
}

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

// TestModesReference checks Modes against the complete mpmath lists: the
// same modes, in the same order (including the TE-before-TM order of exact
// ties), at the same frequencies.
func TestModesReference(t *testing.T) {
	for _, rc := range readReference(t) {
		got, err := rc.cav.Modes(rc.fmax)
		if err != nil {
			t.Fatalf("%s: Modes(%g) error: %v", rc.name, rc.fmax, err)
		}
		if len(got) != len(rc.modes) {
			t.Errorf("%s: len(Modes(%g)) = %d, want %d", rc.name, rc.fmax, len(got), len(rc.modes))
		}
		for i := range min(len(got), len(rc.modes)) {
			g, w := got[i], rc.modes[i]
			if g.Mode != w.Mode {
				t.Errorf("%s: Modes(%g)[%d] = %v, want %v", rc.name, rc.fmax, i, g.Mode, w.Mode)
				continue
			}
			if e := relErr(g.Frequency, w.Frequency); e > refTol {
				t.Errorf("%s: f(%v) = %.17g, want %.17g (rel. error %.2g)", rc.name, g.Mode, g.Frequency, w.Frequency, e)
			}
			if f := rc.cav.Frequency(g.Mode); f != g.Frequency {
				t.Errorf("%s: Frequency(%v) = %.17g, want %.17g as listed by Modes", rc.name, g.Mode, f, g.Frequency)
			}
		}
	}
}

// TestDoneValues checks the values the project's first issue names for a
// 25 mm radius, 50 mm long air cavity (TM010 4.5897 GHz, TE111 4.6190 GHz,
// TM011 5.4821 GHz; mpmath-based, see cavity/testdata/modes.txt) to the
// printed digits.
func TestDoneValues(t *testing.T) {
	c := Cavity{Radius: 0.025, Length: 0.05}
	got, err := c.Lowest(3)
	if err != nil {
		t.Fatal(err)
	}
	want := []struct {
		label string
		ghz   float64
	}{{"TM010", 4.5897}, {"TE111", 4.6190}, {"TM011", 5.4821}}
	const printed = 0.5e-4 // half a unit in the fourth decimal of GHz
	if len(got) != len(want) {
		t.Fatalf("Lowest(3) = %v, want 3 modes", got)
	}
	for i, w := range want {
		if got[i].Mode.String() != w.label || math.Abs(got[i].Frequency/1e9-w.ghz) > printed {
			t.Errorf("Lowest(3)[%d] = %v %.5f GHz, want %s %.4f GHz", i, got[i].Mode, got[i].Frequency/1e9, w.label, w.ghz)
		}
	}
}
