package measure

import (
	"encoding/json"
	"math"
	"math/rand/v2"
	"os"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

type modesTruth struct {
	D    float64 `json:"diameter_m"`
	L    float64 `json:"length_m"`
	NomD float64 `json:"nominal_diameter_m"`
	NomL float64 `json:"nominal_length_m"`
	Res  []struct {
		Label string  `json:"label"`
		F0    float64 `json:"f0_hz"`
	} `json:"resonances"`
}

// modesSweep reads the truth of testdata/measure/modes.s2p and fits the sweep.
func modesSweep(t *testing.T) (modesTruth, []Resonance) {
	t.Helper()
	b, err := os.ReadFile("../testdata/measure/modes_truth.json")
	if err != nil {
		t.Fatal(err)
	}
	var truth modesTruth
	if err := json.Unmarshal(b, &truth); err != nil {
		t.Fatal(err)
	}
	rs, err := Analyze(readSweep(t, "modes.s2p"), Settings{})
	if err != nil {
		t.Fatal(err)
	}
	return truth, rs
}

// TestIdentify: the synthetic whole-cavity sweep of
// testdata/measure/gen_modes.py (modes of a cavity built 0.08 mm wider and
// 0.15 mm shorter than drawn, each moved by 150 ppm, a split TE011/TM111
// pair and a coupling-loop resonance) is fitted, and Identify recovers the
// built D and L within its stated uncertainty, names every mode, resolves
// the pair by Q and flags the loop.
func TestIdentify(t *testing.T) {
	truth, rs := modesSweep(t)
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
	// splitTol: the two resonances of the pair overlap (40 MHz apart,
	// bandwidths 4 and 7 MHz), and each single-resonance fit sees its
	// partner's tail, which moves each f0 by a few hundred kHz.
	const splitTol = 1e6
	if len(id.Pairs) != 1 || math.Abs(id.Pairs[0].Split-40e6) > splitTol {
		t.Errorf("pairs %+v, want one TE011/TM111 split of 40 MHz", id.Pairs)
	}
	// The fitted cavity's frequencies scatter as the generator's 150 ppm.
	if !(id.RMS > 50e-6 && id.RMS < 300e-6) {
		t.Errorf("RMS residual %.3g, want about 1.5e-4", id.RMS)
	}
}

// TestWallsFromSweep: the unloaded Qs fitted from the sweep of
// gen_modes.py, whose Q0s come from Harrington's closed forms (1961, sec.
// 5.3, evaluated in numpy) for 2.5 % IACS walls with the TM modes' Q cut
// to 0.75 by a poor end-plate contact, give back 2.5 % IACS for the TE
// modes and 2.5 % x 0.75^2 for the TM modes, and the contact warning.
func TestWallsFromSweep(t *testing.T) {
	b, err := os.ReadFile("../testdata/measure/modes_truth.json")
	if err != nil {
		t.Fatal(err)
	}
	var truth struct {
		D, L     float64
		IACS     float64 `json:"wall_iacs_fraction"`
		TMFactor float64 `json:"tm_q_factor"`
	}
	if err := json.Unmarshal(b, &truth); err != nil {
		t.Fatal(err)
	}
	rs, err := Analyze(readSweep(t, "modes.s2p"), Settings{})
	if err != nil {
		t.Fatal(err)
	}
	f0 := make([]float64, len(rs))
	q0 := make([]float64, len(rs))
	for i, r := range rs {
		f0[i], q0[i] = r.F0, r.Q0
	}
	id, err := Identify(f0, q0, IdentifySettings{Nominal: cavity.Cavity{Radius: 20e-3, Length: 31e-3}})
	if err != nil {
		t.Fatal(err)
	}
	var idx []int
	var modes []cavity.Mode
	var qs, qe []float64
	for i, a := range id.Assign {
		if a.Matched && !a.Unresolved {
			idx, modes = append(idx, i), append(modes, a.Mode)
			qs, qe = append(qs, rs[i].Q0), append(qe, rs[i].Q0Err)
		}
	}
	d, err := DiagnoseWalls(id.Cavity, idx, modes, qs, qe, nil)
	if err != nil {
		t.Fatal(err)
	}
	// sweepWallTol: each single-resonance fit also sees the tails of its
	// neighbours (TM011 lies 210 MHz from the broad loop resonance), which
	// moves Q0 by up to 2 %, 4 % in conductivity. The overlapping
	// TE011/TM111 pair (40 MHz apart, 2-7 MHz wide) is off by more and is
	// left out.
	const sweepWallTol = 0.05
	for _, mw := range d.Modes {
		if _, pair := mw.Mode.Companion(); pair {
			continue
		}
		want := truth.IACS
		if mw.Mode.Family == cavity.TM {
			want *= truth.TMFactor * truth.TMFactor
		}
		if math.Abs(mw.IACS-want) > sweepWallTol*want {
			t.Errorf("%v: %.4g %% IACS, want %.4g %%", mw.Mode, 100*mw.IACS, 100*want)
		}
	}
	if !d.Joint {
		t.Errorf("TE0 %.3g, TM %.3g: no end-plate warning", d.TE0, d.TM)
	}
}

// TestIdentifyFill: with the dimensions held, Identify fits the fill's
// permittivity. The frequencies are those of a PTFE-filled cavity
// (eps_r 2.08), from the resonance formula (Pozar sec. 6.4) evaluated by
// package cavity, each moved by a seeded 100 ppm; the nominal fill is 2.0.
func TestIdentifyFill(t *testing.T) {
	c := cavity.Cavity{Radius: 20e-3, Length: 31e-3, Fill: physics.Medium{EpsR: 2.08}}
	rng := rand.New(rand.NewPCG(5, 6))
	var f0, q0 []float64
	want := []string{}
	for _, s := range []string{"TM010", "TE111", "TM011", "TE211", "TM110", "TE112"} {
		m, _ := cavity.ParseMode(s)
		f0 = append(f0, c.Frequency(m)*(1+100e-6*rng.NormFloat64()))
		q0 = append(q0, math.NaN())
		want = append(want, s)
	}
	nominal := c
	nominal.Fill.EpsR = 2.0
	id, err := Identify(f0, q0, IdentifySettings{Nominal: nominal, FitFill: true})
	if err != nil {
		t.Fatal(err)
	}
	within(t, "eps_r", id.Cavity.Fill.Eps(), id.EpsErr, 2.08)
	for i, a := range id.Assign {
		if !a.Matched || a.Mode.String() != want[i] {
			t.Errorf("resonance %d: %v (matched %v), want %s", i, a.Mode, a.Matched, want[i])
		}
	}
	if id.Cavity.Radius != c.Radius || id.Cavity.Length != c.Length {
		t.Errorf("FitFill moved the dimensions: %+v", id.Cavity)
	}
}

// TestIdentifyFromHint: the same synthetic sweep as TestIdentify, with no
// drawn size, only the frequency range of the sweep and the hint "the
// resonance near 10.36 GHz is TE011". CavityFromHint's start and
// Identify's fit recover the built D and L within the stated uncertainty
// and name every mode as the generator made it (gen_modes.py).
func TestIdentifyFromHint(t *testing.T) {
	truth, rs := modesSweep(t)
	f0 := make([]float64, len(rs))
	q0 := make([]float64, len(rs))
	for i, r := range rs {
		f0[i], q0[i] = r.F0, r.Q0
	}
	te011 := cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}
	h, err := CavityFromHint(f0, ModeHint{Mode: te011, F: 10.36e9}, physics.Medium{})
	if err != nil {
		t.Fatal(err)
	}
	if h.Ambiguous {
		t.Errorf("ambiguous: D/L %.4g and %.4g fit alike", 2*h.Cavity.Radius/h.Cavity.Length, 2*h.Alternative.Radius/h.Alternative.Length)
	}
	if truth.Res[h.Hinted].Label != "TE011" {
		t.Errorf("hinted resonance %d is %s, want TE011", h.Hinted, truth.Res[h.Hinted].Label)
	}
	// The loop resonance is near no mode; every other is.
	if h.Near != len(f0)-1 {
		t.Errorf("%d resonances near modes of the start, want %d", h.Near, len(f0)-1)
	}
	id, err := Identify(f0, q0, IdentifySettings{Nominal: h.Cavity})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("start D = %.4f mm, L = %.4f mm; fitted D = %.5f +- %.5f mm, L = %.5f +- %.5f mm",
		2e3*h.Cavity.Radius, 1e3*h.Cavity.Length, 2e3*id.Cavity.Radius, 2e3*id.RadiusErr, 1e3*id.Cavity.Length, 1e3*id.LengthErr)
	within(t, "radius", id.Cavity.Radius, id.RadiusErr, truth.D/2)
	within(t, "length", id.Cavity.Length, id.LengthErr, truth.L)
	for i, w := range truth.Res {
		a := id.Assign[i]
		if w.Label == "loop" {
			if a.Matched {
				t.Errorf("resonance %d (coupling loop) matched to %v", i, a.Mode)
			}
			continue
		}
		if !a.Matched || a.Mode.String() != w.Label {
			t.Errorf("resonance %d at %.4g GHz: %v (matched %v), want %s", i, w.F0/1e9, a.Mode, a.Matched, w.Label)
		}
	}
}

// TestCavityFromHintAmbiguous: a single resonance with its hint fits any
// ratio at all (the hinted mode is put on it at every ratio): the search
// says so. A hint far from every resonance is an
// error.
func TestCavityFromHintAmbiguous(t *testing.T) {
	te011 := cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}
	h, err := CavityFromHint([]float64{10e9}, ModeHint{Mode: te011, F: 10e9}, physics.Medium{})
	if err != nil {
		t.Fatal(err)
	}
	if !h.Ambiguous {
		t.Errorf("one resonance: not reported ambiguous")
	}
	if _, err := CavityFromHint([]float64{9e9, 10e9}, ModeHint{Mode: te011, F: 12e9}, physics.Medium{}); err == nil {
		t.Errorf("hint 2 GHz from every resonance accepted")
	}
}
