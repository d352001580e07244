package modes_test

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"regexp"
	"slices"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/cmd/modes"
	"cylcav/cmd/cylcav/internal/cmd/root"
	"cylcav/cmd/cylcav/internal/cmdutil"
)

// cylcav runs the command line in-process and returns standard output,
// standard error and the exit status.
func cylcav(t *testing.T, args ...string) (stdout, stderr string, code int) {
	t.Helper()
	var out, errOut bytes.Buffer
	code = root.Main(cmdutil.Test(&out, &errOut), args)
	return out.String(), errOut.String(), code
}

// Reference frequencies of the 25 mm radius, 50 mm long air cavity, from
// testdata/cavity/modes.txt (mpmath 1.3.0, 40 digits); the first three are
// the project's first issue's acceptance values, 4.5897, 4.6190 and 5.4821
// GHz.
var air25x50 = []struct {
	mode string
	f    float64
}{
	{"TM010", 4.5897011134084022e9},
	{"TE111", 4.6190401851620957e9},
	{"TM011", 5.4820532738920463e9},
	{"TE211", 6.5548667734946444e9},
	{"TE112", 6.949689748056874e9},
	{"TM110", 7.3129566930275621e9},
	{"TM012", 7.5508650802338557e9},
	{"TE011", 7.9035996470889638e9},
	{"TM111", 7.9035996470889638e9},
	{"TE212", 8.3623521679231268e9},
	{"TE311", 8.5602537673510177e9},
	{"TE012", 9.4567194493423205e9},
	{"TM112", 9.4567194493423205e9},
	{"TE113", 9.6558762694582877e9},
}

// fTol: the library agrees with mpmath to about 1e-15 relative (see the
// cavity tests); JSON round-trips a float64 exactly.
const fTol = 2e-14

func TestModesTable(t *testing.T) {
	out, errOut, code := cylcav(t, "modes", "--diameter", "50mm", "--length", "50mm", "--count", "14")
	if code != 0 || errOut != "" {
		t.Fatalf("exit %d, stderr %q", code, errOut)
	}
	lines := strings.Split(strings.TrimRight(out, "\n"), "\n")
	if want := "cavity: radius 25 mm, diameter 50 mm, length 50 mm, fill vacuum (eps_r 1, mu_r 1)"; lines[0] != want {
		t.Errorf("line 1 = %q, want %q", lines[0], want)
	}
	if !strings.Contains(lines[1], "n azimuthal, m radial, p axial") {
		t.Errorf("line 2 = %q, want the index convention", lines[1])
	}
	rows := lines[3:]
	if len(rows) != len(air25x50) {
		t.Fatalf("%d rows, want %d:\n%s", len(rows), len(air25x50), out)
	}
	// The acceptance: TM010 4.5897 GHz, TE111 4.6190 GHz, TM011
	// 5.4821 GHz, in this order.
	for i, want := range []string{"TM010 TM 0 1 0 4.5897 GHz 1", "TE111 TE 1 1 1 4.6190 GHz 2", "TM011 TM 0 1 1 5.4821 GHz 1"} {
		if got := strings.Join(strings.Fields(rows[i])[1:], " "); got != want {
			t.Errorf("row %d = %q, want %q", i+1, got, want)
		}
	}
	for i, r := range rows {
		f := strings.Fields(r)
		if f[1] != air25x50[i].mode {
			t.Errorf("row %d mode = %s, want %s", i+1, f[1], air25x50[i].mode)
		}
	}
	if got := strings.Fields(rows[7]); got[len(got)-1] != "TM111" {
		t.Errorf("row 8 = %q, want TE011 degenerate with TM111", rows[7])
	}
}

func TestModesJSON(t *testing.T) {
	out, _, code := cylcav(t, "modes", "--diameter", "50mm", "--length", "50mm", "--count", "14", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d", code)
	}
	var v map[string]json.RawMessage
	if err := json.Unmarshal([]byte(out), &v); err != nil {
		t.Fatalf("invalid JSON: %v\n%s", err, out)
	}
	for _, k := range []string{"cavity", "modes"} {
		if _, ok := v[k]; !ok {
			t.Errorf("JSON has no %q key", k)
		}
	}
	var cav map[string]float64
	if err := json.Unmarshal(v["cavity"], &cav); err != nil {
		t.Fatal(err)
	}
	if want := map[string]float64{"radius_m": 0.025, "length_m": 0.05, "eps_r": 1, "mu_r": 1}; !mapsEqual(cav, want) {
		t.Errorf("cavity = %v, want %v", cav, want)
	}
	var list []map[string]any
	if err := json.Unmarshal(v["modes"], &list); err != nil {
		t.Fatal(err)
	}
	if len(list) != len(air25x50) {
		t.Fatalf("%d modes, want %d", len(list), len(air25x50))
	}
	wantKeys := []string{"degeneracy", "degenerate_with", "f_hz", "family", "m", "mode", "n", "p"}
	for i, m := range list {
		var keys []string
		for k := range m {
			keys = append(keys, k)
		}
		slices.Sort(keys)
		if !slices.Equal(keys, wantKeys) {
			t.Errorf("modes[%d] keys = %v, want %v", i, keys, wantKeys)
		}
		if m["mode"] != air25x50[i].mode {
			t.Errorf("modes[%d].mode = %v, want %s", i, m["mode"], air25x50[i].mode)
		}
		if f := m["f_hz"].(float64); math.Abs(f-air25x50[i].f) > fTol*air25x50[i].f {
			t.Errorf("modes[%d].f_hz = %.17g, want %.17g (mpmath)", i, f, air25x50[i].f)
		}
		dw, ok := m["degenerate_with"].([]any)
		if !ok {
			t.Errorf("modes[%d].degenerate_with = %v, want an array", i, m["degenerate_with"])
		}
		switch m["mode"] {
		case "TE011":
			if len(dw) != 1 || dw[0] != "TM111" {
				t.Errorf("TE011 degenerate_with = %v, want [TM111]", dw)
			}
			if m["family"] != "TE" || m["n"] != 0.0 || m["m"] != 1.0 || m["p"] != 1.0 || m["degeneracy"] != 1.0 {
				t.Errorf("TE011 = %v", m)
			}
		case "TM010":
			if len(dw) != 0 {
				t.Errorf("TM010 degenerate_with = %v, want []", dw)
			}
		}
	}
}

func mapsEqual(a, b map[string]float64) bool {
	if len(a) != len(b) {
		return false
	}
	for k, v := range a {
		if w, ok := b[k]; !ok || w != v {
			return false
		}
	}
	return true
}

func TestModesCSV(t *testing.T) {
	out, _, code := cylcav(t, "modes", "--radius", "25mm", "--length", "5cm", "--fmax", "9.5GHz", "--format", "csv")
	if code != 0 {
		t.Fatalf("exit %d", code)
	}
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if want := []string{"mode", "family", "n", "m", "p", "f_hz", "degeneracy", "degenerate_with"}; !slices.Equal(recs[0], want) {
		t.Errorf("header = %v, want %v", recs[0], want)
	}
	if !slices.Equal(recs[0], modes.Header()) {
		t.Errorf("header = %v, want modes.Header() = %v", recs[0], modes.Header())
	}
	// Every mode up to 9.5 GHz: the first 13 of the reference list.
	if len(recs)-1 != 13 {
		t.Fatalf("%d rows, want 13", len(recs)-1)
	}
	for i, r := range recs[1:] {
		if r[0] != air25x50[i].mode {
			t.Errorf("row %d = %v, want %s", i+1, r, air25x50[i].mode)
		}
	}
	if r := recs[13]; r[0] != "TM112" || r[7] != "TE012" {
		t.Errorf("row 13 = %v, want TM112 degenerate with TE012", r)
	}
}

func TestModesFill(t *testing.T) {
	// A fill of eps_r scales every frequency by 1/sqrt(eps_r) (Pozar,
	// Microwave Engineering, 4th ed., sec. 6.7): eps_r = 4 halves them.
	out, _, code := cylcav(t, "modes", "--diameter", "50mm", "--length", "50mm", "--fill", "eps=4", "--count", "1", "--digits", "8")
	if code != 0 {
		t.Fatalf("exit %d", code)
	}
	if !strings.Contains(out, "fill eps_r 4, mu_r 1") || !strings.Contains(out, "TM010  TM      0  1  0  2.2948506 GHz") {
		t.Errorf("output:\n%s\nwant fill eps_r 4 and TM010 at 2.2948506 GHz (half of 4.5897011)", out)
	}
	out, _, _ = cylcav(t, "modes", "--diameter", "50mm", "--length", "50mm", "--fill", "ptfe", "--count", "1")
	if !strings.Contains(out, "fill ptfe (eps_r 2.08, mu_r 1)") {
		t.Errorf("output:\n%s\nwant the library fill named", out)
	}
	// Default count.
	out, _, _ = cylcav(t, "modes", "--diameter", "50mm", "--length", "50mm")
	if n := strings.Count(out, "\n") - 3; n != modes.DefaultCount {
		t.Errorf("default listing has %d rows, want %d", n, modes.DefaultCount)
	}
}

// TestModesBadInput checks that bad input gives exit status 2 and one line
// on standard error naming the flag, the value and what is valid, with
// nothing on standard output.
func TestModesBadInput(t *testing.T) {
	for _, tc := range []struct {
		args []string
		want []string
	}{
		{[]string{"--diameter", "0", "--length", "50mm"}, []string{`--diameter "0"`, "must be between"}},
		{[]string{"--diameter", "-3mm", "--length", "50mm"}, []string{`--diameter "-3mm"`, "must be between"}},
		{[]string{"--diameter", "NaN", "--length", "50mm"}, []string{`--diameter "NaN"`}},
		{[]string{"--radius", "Inf", "--length", "50mm"}, []string{`--radius "Inf"`}},
		{[]string{"--diameter", "50km", "--length", "50mm"}, []string{`--diameter "50km"`}},
		{[]string{"--diameter", "50furlong", "--length", "50mm"}, []string{`--diameter "50furlong"`, "unit"}},
		{[]string{"--diameter", "50mm", "--length", "1e9"}, []string{`--length "1e9"`, "must be between"}},
		{[]string{"--diameter", "50mm", "--radius", "25mm", "--length", "50mm"}, []string{"--diameter and --radius"}},
		{[]string{"--length", "50mm"}, []string{"--diameter or --radius"}},
		{[]string{"--diameter", "50mm"}, []string{"missing --length"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--count", "0"}, []string{`--count "0"`, "between 1 and"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--count", "x"}, []string{`"x"`, "--count"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--fmax", "-1GHz"}, []string{`--fmax "-1GHz"`, "must be between"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--fmax", "10GHz", "--count", "3"}, []string{"--fmax and --count"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--fmax", "50THz"}, []string{`--fmax "50THz"`, "above 1000"}},
		{[]string{"--diameter", "2m", "--length", "2m", "--fmax", "30GHz"}, []string{`--fmax "30GHz"`, "more than", "listing limit"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--fill", "eps=0.5"}, []string{`--fill "eps=0.5"`, "between 1 and"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--fill", "cheese"}, []string{`--fill "cheese"`, "available"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--format", "xml"}, []string{`--format "xml"`, "table|json|csv"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--digits", "40"}, []string{`--digits "40"`, "between 3 and 17"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "extra"}, []string{"extra"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--colour"}, []string{"--colour"}},
		// Added by the CLI review: empty and malformed values are errors,
		// never "flag absent".
		{[]string{"--diameter", "", "--length", "50mm"}, []string{`--diameter ""`, "empty"}},
		{[]string{"--diameter", "1e400", "--length", "50mm"}, []string{`--diameter "1e400"`, "out of range"}},
		{[]string{"--diameter", "1nm", "--length", "50mm"}, []string{`--diameter "1nm"`, "must be between"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--fmax", "10GHzz"}, []string{`--fmax "10GHzz"`, "unknown unit"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--count", "1e3"}, []string{`--count "1e3"`, "not a whole number"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--wall", ""}, []string{`--wall ""`, "empty"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--wall", "sigma="}, []string{`--wall "sigma="`, "empty"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--wall", "sigma=abc"}, []string{`--wall "sigma=abc"`, "no number"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--wall", "iacs=500%"}, []string{`--wall "iacs=500%"`, "between 0.01 % and 200 %"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--fill", "eps=2,tand=-1"}, []string{`--fill "eps=2,tand=-1"`, "between 0 and 1"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--wall", "copper", "--temperature", "-300C"}, []string{`--temperature "-300C"`, "below absolute zero"}},
		{[]string{"--diameter", "50mm", "--length", "50mm", "--wall", "copper", "--temperature", "4K"}, []string{`--temperature "4K"`, "-50.00 C to 200.0 C"}},
	} {
		args := append([]string{"modes"}, tc.args...)
		out, errOut, code := cylcav(t, args...)
		if code != 2 {
			t.Errorf("cylcav %s: exit %d, want 2 (stderr %q)", strings.Join(args, " "), code, errOut)
		}
		if out != "" {
			t.Errorf("cylcav %s: stdout %.200q..., want nothing", strings.Join(args, " "), out)
		}
		if strings.Count(errOut, "\n") != 1 {
			t.Errorf("cylcav %s: stderr %q, want one line", strings.Join(args, " "), errOut)
		}
		for _, w := range tc.want {
			if !strings.Contains(errOut, w) {
				t.Errorf("cylcav %s: stderr %q, want it to contain %q", strings.Join(args, " "), errOut, w)
			}
		}
	}
}

// TestModesHelpExample runs the worked examples of `cylcav modes --help`
// and checks that the output lines they show appear, in order, in the real
// output ("..." skips lines).
func TestModesHelpExample(t *testing.T) {
	checkExamples(t, modes.NewCmdModes(cmdutil.Test(nil, nil), nil).Example)
}

var prompt = regexp.MustCompile(`^\s*\$ cylcav (.*)$`)

func checkExamples(t *testing.T, example string) {
	t.Helper()
	lines := strings.Split(example, "\n")
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
			if strings.TrimSpace(want) == "..." {
				continue
			}
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
