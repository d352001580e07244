package filter_test

import (
	"encoding/json"
	"math"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
)

// TestFabBadInput: the manufacturing flags refuse bad values and bad
// combinations with exit status 2, naming the flag, the value and the range.
func TestFabBadInput(t *testing.T) {
	base := []string{"--f0", "10GHz", "--bw", "100MHz", "--order", "4"}
	cav := func(extra ...string) []string {
		return append(append(append([]string{}, base...), "--mode", "TE011", "--wall", "copper"), extra...)
	}
	clitest.CheckBadInput(t, "filter", []clitest.BadCase{
		{Args: cav("--tolerance", "-1mm"), Code: 2, Want: []string{`--tolerance "-1mm"`, "between 0 m and 1 mm"}},
		{Args: cav("--tolerance", "5"), Code: 2, Want: []string{`--tolerance "5"`, "needs a unit"}},
		{Args: cav("--tolerance", "5um", "--samples", "1"), Code: 2, Want: []string{`--samples "1"`, "between 2 and 1000000"}},
		{Args: cav("--tolerance", "5um", "--coupling-tolerance", "80%"), Code: 2, Want: []string{`--coupling-tolerance "80%"`}},
		{Args: cav("--tolerance", "5um", "--accept-return-loss", "30dB"), Code: 2, Want: []string{`--accept-return-loss "30dB"`, "at most the design's return loss 20 dB"}},
		{Args: cav("--hole-tolerance", "5um"), Code: 2, Want: []string{"--hole-tolerance needs --holes"}},
		{Args: cav("--samples", "100"), Code: 2, Want: []string{"--samples needs --tolerance"}},
		{Args: cav("--rod-metal", "invar"), Code: 2, Want: []string{"--rod-metal needs --temp"}},
		{Args: cav("--power", "0W"), Code: 2, Want: []string{`--power "0W"`, "between 1.000 uW and 1.000 GW"}},
		{Args: cav("--power", "200"), Code: 2, Want: []string{`--power "200"`, "no unit", "W, kW"}},
		{Args: cav("--power", "1W", "--pressure", "5kPa"), Code: 2, Want: []string{`--pressure "5kPa"`, "between 10.00 kPa and 300.0 kPa"}},
		{Args: cav("--pressure", "70kPa"), Code: 2, Want: []string{"--pressure needs --power"}},
		{Args: append(append([]string{}, base...), "--tolerance", "5um"), Code: 2, Want: []string{"--tolerance needs the cavities"}},
		{Args: append(append([]string{}, base...), "--mode", "TE011", "--temp", "0C:40C"), Code: 2, Want: []string{"--temp needs the body metal", "--wall"}},
		// A metal known only near room temperature is refused at 77 K.
		{Args: append(append([]string{}, base...), "--mode", "TE011", "--wall", "brass", "--temp", "77K:300K"), Code: 2,
			Want: []string{`--temp "77K:300K"`, "-50.00 C to 200.0 C"}},
	})
}

// TestFabJSON runs all three analyses and checks the JSON keys and a few
// relations: the linearised and Monte Carlo spreads are close, the drift
// has two ends, and the power margin is the breakdown field over the peak.
func TestFabJSON(t *testing.T) {
	r := clitest.Run(t, "filter", "--f0", "10GHz", "--bw", "100MHz", "--return-loss", "23dB", "--order", "5",
		"--mode", "TE011", "--wall", "copper", "--ratio", "1.2", "--tolerance", "5um", "--samples", "300", "--seed", "4",
		"--accept-return-loss", "18dB", "--temp", "15C:25C", "--power", "100W", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	var out struct {
		Manufacture struct {
			Tolerance struct {
				Samples int     `json:"samples"`
				Yield   float64 `json:"yield"`
				Points  []struct {
					F      float64 `json:"f_hz"`
					Std    float64 `json:"s21_std_db"`
					Linear float64 `json:"s21_linear_std_db"`
				} `json:"points"`
				Tuning []struct {
					Span float64 `json:"span_hz"`
				} `json:"tuning"`
			} `json:"tolerance"`
			Drift struct {
				Ends []struct {
					T       float64 `json:"t_k"`
					Verdict string  `json:"verdict"`
				} `json:"ends"`
			} `json:"drift"`
			Power struct {
				Breakdown  float64 `json:"breakdown_v_per_m"`
				Resonators []struct {
					EPeak  float64 `json:"e_peak_v_per_m"`
					Margin float64 `json:"margin"`
				} `json:"resonators"`
				Cautions []string `json:"cautions"`
			} `json:"power"`
		} `json:"manufacture"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	m := out.Manufacture
	if m.Tolerance.Samples != 300 || len(m.Tolerance.Tuning) != 5 || len(m.Tolerance.Points) != 3 {
		t.Errorf("tolerance: %+v", m.Tolerance)
	}
	for _, p := range m.Tolerance.Points {
		// At f0 of an odd-order design |S21| is at a maximum: first order
		// vanishes there and only second order remains.
		if p.Linear < 1e-3 {
			continue
		}
		if math.Abs(p.Std-p.Linear) > 0.25*p.Linear {
			t.Errorf("%g Hz: MC std %g dB, linear %g dB", p.F, p.Std, p.Linear)
		}
	}
	if len(m.Drift.Ends) != 2 || math.Abs(m.Drift.Ends[0].T-288.15) > 1e-9 {
		t.Errorf("drift: %+v", m.Drift)
	}
	if len(m.Power.Resonators) != 5 || len(m.Power.Cautions) < 3 {
		t.Errorf("power: %+v", m.Power)
	}
	for _, x := range m.Power.Resonators {
		if math.Abs(x.Margin*x.EPeak-m.Power.Breakdown) > 1e-9*m.Power.Breakdown {
			t.Errorf("margin %g x peak %g != breakdown %g", x.Margin, x.EPeak, m.Power.Breakdown)
		}
	}
}
