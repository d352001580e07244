package measure

import (
	"encoding/json"
	"math"
	"os"
	"testing"

	"cylcav/cavity"
)

// TestIdentify: the synthetic whole-cavity sweep of
// testdata/measure/gen_modes.py (modes of a cavity built 0.08 mm wider and
// 0.15 mm shorter than drawn, each moved by 150 ppm, a split TE011/TM111
// pair and a coupling-loop resonance) is fitted, and Identify recovers the
// built D and L within its stated uncertainty, names every mode, resolves
// the pair by Q and flags the loop.
func TestIdentify(t *testing.T) {
	b, err := os.ReadFile("../testdata/measure/modes_truth.json")
	if err != nil {
		t.Fatal(err)
	}
	var truth struct {
		D    float64 `json:"diameter_m"`
		L    float64 `json:"length_m"`
		NomD float64 `json:"nominal_diameter_m"`
		NomL float64 `json:"nominal_length_m"`
		Res  []struct {
			Label string  `json:"label"`
			F0    float64 `json:"f0_hz"`
		} `json:"resonances"`
	}
	if err := json.Unmarshal(b, &truth); err != nil {
		t.Fatal(err)
	}
	rs, err := Analyze(readSweep(t, "modes.s2p"), Settings{})
	if err != nil {
		t.Fatal(err)
	}
	if len(rs) != len(truth.Res) {
		t.Fatalf("%d resonances found, want %d", len(rs), len(truth.Res))
	}
	f0 := make([]float64, len(rs))
	q0 := make([]float64, len(rs))
	for i, r := range rs {
		f0[i], q0[i] = r.F0, r.Q0
	}
	id, err := Identify(f0, q0, IdentifySettings{Nominal: cavity.Cavity{Radius: truth.NomD / 2, Length: truth.NomL}})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("D = %.5f +- %.5f mm (built %.5f), L = %.5f +- %.5f mm (built %.5f), RMS %.3g", 2e3*id.Cavity.Radius, 2e3*id.RadiusErr, 1e3*truth.D, 1e3*id.Cavity.Length, 1e3*id.LengthErr, 1e3*truth.L, id.RMS)
	within(t, "radius", id.Cavity.Radius, id.RadiusErr, truth.D/2)
	within(t, "length", id.Cavity.Length, id.LengthErr, truth.L)
	for i, w := range truth.Res {
		a := id.Assign[i]
		if w.Label == "loop" {
			if a.Matched {
				t.Errorf("resonance %d (coupling loop, %.4g GHz) matched to %v", i, w.F0/1e9, a.Mode)
			}
			continue
		}
		if !a.Matched || a.Mode.String() != w.Label || a.Unresolved {
			t.Errorf("resonance %d at %.4g GHz: %v (matched %v, unresolved %v, residual %.2g), want %s", i, w.F0/1e9, a.Mode, a.Matched, a.Unresolved, a.Residual, w.Label)
		}
	}
	// splitTol: the two resonances of the pair overlap (20 MHz apart,
	// bandwidths 4 and 7 MHz), and each single-resonance fit sees its
	// partner's tail, which moves each f0 by a few hundred kHz.
	const splitTol = 1e6
	if len(id.Pairs) != 1 || math.Abs(id.Pairs[0].Split-20e6) > splitTol {
		t.Errorf("pairs %+v, want one TE011/TM111 split of 20 MHz", id.Pairs)
	}
	// The fitted cavity's frequencies scatter as the generator's 150 ppm.
	if !(id.RMS > 50e-6 && id.RMS < 300e-6) {
		t.Errorf("RMS residual %.3g, want about 1.5e-4", id.RMS)
	}
}
