package modes_test

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"slices"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/modes"
	"cylcav/cmd/cylcav/internal/cmdutil"
)

// Reference frequencies of the 25 mm radius, 50 mm long air cavity, from
// cavity/testdata/modes.txt (mpmath 1.3.0, 40 digits); the first three are
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
	r := clitest.Run(t, "modes", "--diameter", "50mm", "--length", "50mm", "--count", "14")
	if r.Code != 0 || r.Stderr != "" {
		t.Fatalf("exit %d, stderr %q", r.Code, r.Stderr)
	}
	out := r.Stdout
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
	r := clitest.Run(t, "modes", "--diameter", "50mm", "--length", "50mm", "--count", "14", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d", r.Code)
	}
	out := r.Stdout
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
	r := clitest.Run(t, "modes", "--radius", "25mm", "--length", "5cm", "--fmax", "9.5GHz", "--format", "csv")
	if r.Code != 0 {
		t.Fatalf("exit %d", r.Code)
	}
	out := r.Stdout
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
	// Microwave Engineering, 4th ed., sec. 6.4): eps_r = 4 halves them.
	r := clitest.Run(t, "modes", "--diameter", "50mm", "--length", "50mm", "--fill", "eps=4", "--count", "1", "--digits", "8")
	if r.Code != 0 {
		t.Fatalf("exit %d", r.Code)
	}
	out := r.Stdout
	if !strings.Contains(out, "fill eps_r 4, mu_r 1") || !strings.Contains(out, "TM010  TM      0  1  0  2.2948506 GHz") {
		t.Errorf("output:\n%s\nwant fill eps_r 4 and TM010 at 2.2948506 GHz (half of 4.5897011)", out)
	}
	out = clitest.Run(t, "modes", "--diameter", "50mm", "--length", "50mm", "--fill", "ptfe", "--count", "1").Stdout
	if !strings.Contains(out, "fill ptfe (eps_r 2.08, mu_r 1)") {
		t.Errorf("output:\n%s\nwant the library fill named", out)
	}
	// Default count.
	out = clitest.Run(t, "modes", "--diameter", "50mm", "--length", "50mm").Stdout
	if n := strings.Count(out, "\n") - 3; n != modes.DefaultCount {
		t.Errorf("default listing has %d rows, want %d", n, modes.DefaultCount)
	}
}

// TestModesBadInput checks that bad input gives exit status 2 and one line
// on standard error naming the flag, the value and what is valid, with
// nothing on standard output.
func TestModesBadInput(t *testing.T) {
	clitest.CheckBadInput(t, "modes", []clitest.BadCase{
		{Args: []string{"--diameter", "0", "--length", "50mm"}, Code: 2, Want: []string{`--diameter "0"`, "must be between"}},
		{Args: []string{"--diameter", "-3mm", "--length", "50mm"}, Code: 2, Want: []string{`--diameter "-3mm"`, "must be between"}},
		{Args: []string{"--diameter", "NaN", "--length", "50mm"}, Code: 2, Want: []string{`--diameter "NaN"`}},
		{Args: []string{"--radius", "Inf", "--length", "50mm"}, Code: 2, Want: []string{`--radius "Inf"`}},
		{Args: []string{"--diameter", "50km", "--length", "50mm"}, Code: 2, Want: []string{`--diameter "50km"`}},
		{Args: []string{"--diameter", "50furlong", "--length", "50mm"}, Code: 2, Want: []string{`--diameter "50furlong"`, "unit"}},
		{Args: []string{"--diameter", "50mm", "--length", "1e9m"}, Code: 2, Want: []string{`--length "1e9m"`, "must be between"}},
		{Args: []string{"--diameter", "50mm", "--radius", "25mm", "--length", "50mm"}, Code: 2, Want: []string{"--diameter and --radius"}},
		{Args: []string{"--length", "50mm"}, Code: 2, Want: []string{"--diameter or --radius"}},
		{Args: []string{"--diameter", "50mm"}, Code: 2, Want: []string{"missing --length"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--count", "0"}, Code: 2, Want: []string{`--count "0"`, "between 1 and"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--count", "x"}, Code: 2, Want: []string{`"x"`, "--count"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--count", "99999999"}, Code: 2, Want: []string{`--count "99999999"`, "between 1 and 5000000"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--digits", "2"}, Code: 2, Want: []string{`--digits "2"`, "between 3 and 17"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--digits", "18"}, Code: 2, Want: []string{`--digits "18"`, "between 3 and 17"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--fmax", "-1GHz"}, Code: 2, Want: []string{`--fmax "-1GHz"`, "must be between"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--fmax", "10GHz", "--count", "3"}, Code: 2, Want: []string{"--fmax and --count"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--fmax", "50THz"}, Code: 2, Want: []string{`--fmax "50THz"`, "above 1000"}},
		{Args: []string{"--diameter", "2m", "--length", "2m", "--fmax", "30GHz"}, Code: 2, Want: []string{`--fmax "30GHz"`, "more than", "listing limit"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--fill", "eps=0.5"}, Code: 2, Want: []string{`--fill "eps=0.5"`, "between 1 and"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--fill", "cheese"}, Code: 2, Want: []string{`--fill "cheese"`, "available"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--format", "xml"}, Code: 2, Want: []string{`--format "xml"`, "table|json|csv"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--digits", "40"}, Code: 2, Want: []string{`--digits "40"`, "between 3 and 17"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "extra"}, Code: 2, Want: []string{"extra"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--colour"}, Code: 2, Want: []string{"--colour"}},
		// Added by the CLI review: empty and malformed values are errors,
		// never "flag absent".
		{Args: []string{"--diameter", "", "--length", "50mm"}, Code: 2, Want: []string{`--diameter ""`, "empty"}},
		{Args: []string{"--diameter", "1e400", "--length", "50mm"}, Code: 2, Want: []string{`--diameter "1e400"`, "out of range"}},
		{Args: []string{"--diameter", "1nm", "--length", "50mm"}, Code: 2, Want: []string{`--diameter "1nm"`, "must be between"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--fmax", "10GHzz"}, Code: 2, Want: []string{`--fmax "10GHzz"`, "unknown unit"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--count", "1e3"}, Code: 2, Want: []string{`--count "1e3"`, "not a whole number"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--wall", ""}, Code: 2, Want: []string{`--wall ""`, "empty"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--wall", "sigma="}, Code: 2, Want: []string{`--wall "sigma="`, "empty"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--wall", "sigma=abc"}, Code: 2, Want: []string{`--wall "sigma=abc"`, "no number"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--wall", "iacs=500%"}, Code: 2, Want: []string{`--wall "iacs=500%"`, "between 0.01 % and 200 %"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--fill", "eps=2,tand=-1"}, Code: 2, Want: []string{`--fill "eps=2,tand=-1"`, "between 0 and 1"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--wall", "copper", "--temperature", "-300C"}, Code: 2, Want: []string{`--temperature "-300C"`, "below absolute zero"}},
		{Args: []string{"--diameter", "50mm", "--length", "50mm", "--wall", "copper", "--temperature", "4K"}, Code: 2, Want: []string{`--temperature "4K"`, "-50.00 C to 200.0 C"}},
	})
}

// TestModesHelpExample runs the worked examples of `cylcav modes --help`
// and checks that the output lines they show appear, in order, in the real
// output ("..." skips lines).
func TestModesHelpExample(t *testing.T) {
	clitest.CheckExamples(t, modes.NewCmdModes(cmdutil.Test(nil, nil), nil).Example)
}
