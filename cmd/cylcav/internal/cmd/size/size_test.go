package size_test

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"regexp"
	"slices"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/cmd/root"
	"cylcav/cmd/cylcav/internal/cmd/size"
	"cylcav/cmd/cylcav/internal/cmdutil"
)

func cylcav(t *testing.T, args ...string) (stdout, stderr string, code int) {
	t.Helper()
	var out, errOut bytes.Buffer
	code = root.Main(cmdutil.Test(&out, &errOut), args)
	return out.String(), errOut.String(), code
}

// TestSizePozarJSON sizes the PTFE-filled TE011 cavity with d = 2a (D/L =
// 1) at 5 GHz of Pozar, Microwave Engineering, 4th ed., sec. 6.7 (Example
// 6.4 there, recalled from memory): a = 2.74 cm, d = 5.48 cm to the
// printed digits.
func TestSizePozarJSON(t *testing.T) {
	out, errOut, code := cylcav(t, "size", "--mode", "TE011", "--freq", "5GHz", "--ratio", "1", "--fill", "eps=2.08", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d, stderr %q", code, errOut)
	}
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
	out, _, code := cylcav(t, "size", "--mode", "TM010", "--freq", "2.45GHz", "--length", "20mm")
	if code != 0 {
		t.Fatalf("exit %d", code)
	}
	// Radius j_{0,1} c/(2 pi f) = 46.8337 mm (mpmath 1.3.0); p = 0 makes
	// the length free, which the table says.
	for _, w := range []string{"TM010 at 2.45 GHz, length 20 mm, fill vacuum (eps_r 1, mu_r 1)", "n azimuthal, m radial, p axial",
		"radius    46.8337 mm", "length    20.0000 mm", "any length works"} {
		if !strings.Contains(out, w) {
			t.Errorf("output lacks %q:\n%s", w, out)
		}
	}
	out, _, code = cylcav(t, "size", "--mode", "TE(1,1,3)", "--freq", "12GHz", "--diameter", "0.04", "--format", "csv")
	if code != 0 {
		t.Fatalf("exit %d", code)
	}
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

func TestSizeBadInput(t *testing.T) {
	for _, tc := range []struct {
		args []string
		want []string
	}{
		{[]string{"--mode", "TE010", "--freq", "5GHz", "--ratio", "1"}, []string{`--mode "TE010"`, "did you mean TE011 or TM010?"}},
		{[]string{"--mode", "TX011", "--freq", "5GHz", "--ratio", "1"}, []string{`--mode "TX011"`, "TE or TM"}},
		{[]string{"--freq", "5GHz", "--ratio", "1"}, []string{"missing --mode"}},
		{[]string{"--mode", "TE011", "--ratio", "1"}, []string{"missing --freq"}},
		{[]string{"--mode", "TE011", "--freq", "5GHz"}, []string{"--ratio", "--diameter", "--length"}},
		{[]string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "1", "--diameter", "3cm"}, []string{"--ratio and --diameter given"}},
		{[]string{"--mode", "TE011", "--freq", "0", "--ratio", "1"}, []string{`--freq "0"`, "must be between"}},
		{[]string{"--mode", "TE011", "--freq", "NaN", "--ratio", "1"}, []string{`--freq "NaN"`}},
		{[]string{"--mode", "TE011", "--freq", "5 parsecs", "--ratio", "1"}, []string{`--freq "5 parsecs"`}},
		{[]string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "-1"}, []string{`--ratio "-1"`, "between 0.001 and 1000"}},
		{[]string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "Inf"}, []string{`--ratio "Inf"`}},
		{[]string{"--mode", "TE011", "--freq", "5GHz", "--diameter", "0"}, []string{`--diameter "0"`, "must be between"}},
		{[]string{"--mode", "TE011", "--freq", "5GHz", "--length", "-2mm"}, []string{`--length "-2mm"`, "must be between"}},
		{[]string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "1", "--fill", "eps=abc"}, []string{`--fill "eps=abc"`}},
		// Targets that cannot be met name the least value that works
		// (mpmath 1.3.0: 2 j_{1,1} c/(2 pi 10 GHz) = 36.5648 mm; c/(2 x 10
		// GHz) = 14.9896 mm; 2 j_{0,1} c/(2 pi 10 GHz) = 22.9485 mm).
		{[]string{"--mode", "TE011", "--freq", "10GHz", "--diameter", "20mm"}, []string{`--freq "10GHz" with --diameter "20mm"`, "must exceed 36.5648 mm"}},
		{[]string{"--mode", "TE011", "--freq", "10GHz", "--length", "10mm"}, []string{`--length "10mm"`, "must exceed 14.9896 mm"}},
		{[]string{"--mode", "TM010", "--freq", "10GHz", "--diameter", "20mm"}, []string{"p = 0", "use diameter 22.9485 mm with any length"}},
		{[]string{"--mode", "TE011", "--freq", "2kHz", "--ratio", "1"}, []string{`--freq "2kHz" with --ratio "1"`, "must be in 1 um..1000 m"}},
		// Added by the CLI review: a plain number takes nothing after it.
		{[]string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "1abc"}, []string{`--ratio "1abc"`, `unexpected "abc"`, "between 0.001 and 1000"}},
		{[]string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "1:2"}, []string{`--ratio "1:2"`, "between 0.001 and 1000"}},
		{[]string{"--mode", "TE011", "--freq", "5GHz", "--ratio", ""}, []string{`--ratio ""`, "empty"}},
		{[]string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "1e400"}, []string{`--ratio "1e400"`, "out of range"}},
		{[]string{"--mode", "TE011", "--freq", "10GHzz", "--ratio", "1"}, []string{`--freq "10GHzz"`, "unknown unit"}},
		{[]string{"--mode", "TE0", "--freq", "5GHz", "--ratio", "1"}, []string{`--mode "TE0"`, "three indices"}},
		{[]string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "1", "extra"}, []string{"extra"}},
	} {
		args := append([]string{"size"}, tc.args...)
		out, errOut, code := cylcav(t, args...)
		if code != 2 || out != "" || strings.Count(errOut, "\n") != 1 {
			t.Errorf("cylcav %s: exit %d, stdout %q, stderr %q; want exit 2 and one line on stderr", strings.Join(args, " "), code, out, errOut)
		}
		for _, w := range tc.want {
			if !strings.Contains(errOut, w) {
				t.Errorf("cylcav %s: stderr %q, want it to contain %q", strings.Join(args, " "), errOut, w)
			}
		}
	}
}

var prompt = regexp.MustCompile(`^\s*\$ cylcav (.*)$`)

// TestSizeHelpExample runs the worked examples of `cylcav size --help` and
// checks that the lines they show appear, in order, in the real output.
func TestSizeHelpExample(t *testing.T) {
	lines := strings.Split(size.NewCmdSize(cmdutil.Test(nil, nil), nil).Example, "\n")
	ran := 0
	for i := 0; i < len(lines); i++ {
		m := prompt.FindStringSubmatch(lines[i])
		if m == nil {
			continue
		}
		out, errOut, code := cylcav(t, strings.Fields(m[1])...)
		if code != 0 {
			t.Errorf("example %q: exit %d, stderr %q", m[1], code, errOut)
			continue
		}
		ran++
		got := strings.Split(out, "\n")
		k := 0
		for i+1 < len(lines) && strings.TrimSpace(lines[i+1]) != "" && !prompt.MatchString(lines[i+1]) {
			i++
			want := strings.TrimPrefix(lines[i], "  ")
			for k < len(got) && got[k] != want {
				k++
			}
			if k == len(got) {
				t.Errorf("example %q: output lacks %q (in order); got:\n%s", m[1], want, out)
				break
			}
		}
	}
	if ran == 0 {
		t.Error("help text has no worked example")
	}
}
