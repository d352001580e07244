package size_test

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"slices"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/size"
	"cylcav/cmd/cylcav/internal/cmdutil"
)

// TestSizePozarJSON sizes the PTFE-filled TE011 cavity with d = 2a (D/L =
// 1) at 5 GHz of Pozar, Microwave Engineering, 4th ed., sec. 6.4 (Example
// 6.4 there, recalled from memory): a = 2.74 cm, d = 5.48 cm to the
// printed digits.
func TestSizePozarJSON(t *testing.T) {
	r := clitest.Run(t, "size", "--mode", "TE011", "--freq", "5GHz", "--ratio", "1", "--fill", "eps=2.08", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d, stderr %q", r.Code, r.Stderr)
	}
	out := r.Stdout
	var v map[string]any
	if err := json.Unmarshal([]byte(out), &v); err != nil {
		t.Fatalf("invalid JSON: %v\n%s", err, out)
	}
	var keys []string
	for k := range v {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	want := []string{"diameter_m", "eps_r", "f_hz", "length_m", "mode", "mu_r", "radius_m", "ratio_d_over_l"}
	if !slices.Equal(keys, want) {
		t.Errorf("keys = %v, want %v", keys, want)
	}
	if v["mode"] != "TE011" || v["f_hz"] != 5e9 || v["eps_r"] != 2.08 || v["mu_r"] != 1.0 {
		t.Errorf("JSON = %v", v)
	}
	a, d := v["radius_m"].(float64), v["length_m"].(float64)
	if math.Round(a*1e4)/1e2 != 2.74 || math.Round(d*1e4)/1e2 != 5.48 {
		t.Errorf("a = %.5f cm, d = %.5f cm; want 2.74 cm and 5.48 cm (Pozar)", a*100, d*100)
	}
	if r := v["ratio_d_over_l"].(float64); math.Abs(r-1) > 1e-15 {
		t.Errorf("ratio_d_over_l = %.17g, want 1", r)
	}
	if D := v["diameter_m"].(float64); D != 2*a {
		t.Errorf("diameter_m = %g, want 2 radius_m = %g", D, 2*a)
	}
}

func TestSizeTableAndCSV(t *testing.T) {
	r := clitest.Run(t, "size", "--mode", "TM010", "--freq", "2.45GHz", "--length", "20mm")
	if r.Code != 0 {
		t.Fatalf("exit %d", r.Code)
	}
	out := r.Stdout
	// Radius j_{0,1} c/(2 pi f) = 46.8337 mm (mpmath 1.3.0); p = 0 makes
	// the length free, which the table says.
	for _, w := range []string{"TM010 at 2.45 GHz, length 20 mm, fill vacuum (eps_r 1, mu_r 1)", "n azimuthal, m radial, p axial",
		"radius    46.8337 mm", "length    20.0000 mm", "any length works"} {
		if !strings.Contains(out, w) {
			t.Errorf("output lacks %q:\n%s", w, out)
		}
	}
	r = clitest.Run(t, "size", "--mode", "TE(1,1,3)", "--freq", "12GHz", "--diameter", "0.04m", "--format", "csv")
	if r.Code != 0 {
		t.Fatalf("exit %d", r.Code)
	}
	out = r.Stdout
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if want := []string{"mode", "f_hz", "radius_m", "diameter_m", "length_m", "ratio_d_over_l", "eps_r", "mu_r"}; len(recs) != 2 || !slices.Equal(recs[0], want) {
		t.Fatalf("CSV = %v, want header %v and one row", recs, want)
	}
	if recs[1][0] != "TE113" || recs[1][3] != "0.04" {
		t.Errorf("CSV row = %v", recs[1])
	}
}

// TestSizeBadInput checks that bad input gives exit status 2, nothing on
// standard output and one line on standard error naming the flag and the
// value.
func TestSizeBadInput(t *testing.T) {
	clitest.CheckBadInput(t, "size", []clitest.BadCase{
		{Args: []string{"--mode", "TE010", "--freq", "5GHz", "--ratio", "1"}, Code: 2, Want: []string{`--mode "TE010"`, "did you mean TE011 or TM010?"}},
		{Args: []string{"--mode", "TX011", "--freq", "5GHz", "--ratio", "1"}, Code: 2, Want: []string{`--mode "TX011"`, "TE or TM"}},
		{Args: []string{"--freq", "5GHz", "--ratio", "1"}, Code: 2, Want: []string{"missing --mode"}},
		{Args: []string{"--mode", "TE011", "--ratio", "1"}, Code: 2, Want: []string{"missing --freq"}},
		{Args: []string{"--mode", "TE011", "--freq", "5GHz"}, Code: 2, Want: []string{"--ratio", "--diameter", "--length"}},
		{Args: []string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "1", "--diameter", "3cm"}, Code: 2, Want: []string{"--ratio and --diameter given"}},
		{Args: []string{"--mode", "TE011", "--freq", "0", "--ratio", "1"}, Code: 2, Want: []string{`--freq "0"`, "must be between"}},
		{Args: []string{"--mode", "TE011", "--freq", "NaN", "--ratio", "1"}, Code: 2, Want: []string{`--freq "NaN"`}},
		{Args: []string{"--mode", "TE011", "--freq", "5 parsecs", "--ratio", "1"}, Code: 2, Want: []string{`--freq "5 parsecs"`}},
		{Args: []string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "-1"}, Code: 2, Want: []string{`--ratio "-1"`, "between 0.001 and 1000"}},
		{Args: []string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "Inf"}, Code: 2, Want: []string{`--ratio "Inf"`}},
		{Args: []string{"--mode", "TE011", "--freq", "5GHz", "--diameter", "0"}, Code: 2, Want: []string{`--diameter "0"`, "must be between"}},
		{Args: []string{"--mode", "TE011", "--freq", "5GHz", "--length", "-2mm"}, Code: 2, Want: []string{`--length "-2mm"`, "must be between"}},
		{Args: []string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "1", "--fill", "eps=abc"}, Code: 2, Want: []string{`--fill "eps=abc"`}},
		// Targets that cannot be met name the least value that works
		// (mpmath 1.3.0: 2 j_{1,1} c/(2 pi 10 GHz) = 36.5648 mm; c/(2 x 10
		// GHz) = 14.9896 mm; 2 j_{0,1} c/(2 pi 10 GHz) = 22.9485 mm).
		{Args: []string{"--mode", "TE011", "--freq", "10GHz", "--diameter", "20mm"}, Code: 2, Want: []string{`--freq "10GHz" with --diameter "20mm"`, "must exceed 36.5648 mm"}},
		{Args: []string{"--mode", "TE011", "--freq", "10GHz", "--length", "10mm"}, Code: 2, Want: []string{`--length "10mm"`, "must exceed 14.9896 mm"}},
		{Args: []string{"--mode", "TM010", "--freq", "10GHz", "--diameter", "20mm"}, Code: 2, Want: []string{"p = 0", "use diameter 22.9485 mm with any length"}},
		{Args: []string{"--mode", "TE011", "--freq", "2kHz", "--ratio", "1"}, Code: 2, Want: []string{`--freq "2kHz" with --ratio "1"`, "must be in 1 um..1000 m"}},
		// Added by the CLI review: a plain number takes nothing after it.
		{Args: []string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "1abc"}, Code: 2, Want: []string{`--ratio "1abc"`, `unexpected "abc"`, "between 0.001 and 1000"}},
		{Args: []string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "1:2"}, Code: 2, Want: []string{`--ratio "1:2"`, "between 0.001 and 1000"}},
		{Args: []string{"--mode", "TE011", "--freq", "5GHz", "--ratio", ""}, Code: 2, Want: []string{`--ratio ""`, "empty"}},
		{Args: []string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "1e400"}, Code: 2, Want: []string{`--ratio "1e400"`, "out of range"}},
		{Args: []string{"--mode", "TE011", "--freq", "10GHzz", "--ratio", "1"}, Code: 2, Want: []string{`--freq "10GHzz"`, "unknown unit"}},
		{Args: []string{"--mode", "TE0", "--freq", "5GHz", "--ratio", "1"}, Code: 2, Want: []string{`--mode "TE0"`, "three indices"}},
		{Args: []string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "1", "extra"}, Code: 2, Want: []string{"extra"}},
	})
}

// TestSizeHelpExample runs the worked examples of `cylcav size --help` and
// checks that the lines they show appear, in order, in the real output.
func TestSizeHelpExample(t *testing.T) {
	clitest.CheckExamples(t, size.NewCmdSize(cmdutil.Test(nil, nil), nil).Example)
}
