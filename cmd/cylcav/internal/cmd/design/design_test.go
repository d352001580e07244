package design_test

import (
	"encoding/json"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/design"
)

// rfCaution is the general RF caution as design prints it: the sentence
// form of the clause `cylcav q` prints.
const rfCaution = "High RF power can cause burns and harmful RF exposure, and breakdown and multipaction in the cavity; follow local codes and licensed practice."

func TestDesignDemo(t *testing.T) {
	r := clitest.Run(t, "design")
	if r.Code != 0 {
		t.Fatalf("exit %d, stderr %q", r.Code, r.Stderr)
	}
	out := r.Stdout
	first, _, _ := strings.Cut(out, "\n")
	if !strings.HasPrefix(first, "Demo scenario (no flags given):") {
		t.Errorf("first line = %q, want it to say this is the demo scenario", first)
	}
	for _, want := range []string{"diameter D =", "Clearance:", "TM111", "Q0 =", "df/dT", "percentile", "n azimuthal"} {
		if !strings.Contains(out, want) {
			t.Errorf("demo output lacks %q:\n%s", want, out)
		}
	}
	// The general RF caution closes the list of cautions, once.
	if n := strings.Count(out, rfCaution); n != 1 || !strings.HasSuffix(out, "  - "+rfCaution+"\n") {
		t.Errorf("demo output has the RF caution %d times, want once as the last caution:\n%s", n, out)
	}
}

func TestDesignJSON(t *testing.T) {
	r := clitest.Run(t, "design", "--mode", "TE011", "--freq", "10GHz", "--wall", "copper", "--tolerance", "0.02mm", "--samples", "2000", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d, stderr %q", r.Code, r.Stderr)
	}
	out := r.Stdout
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("design --format json output is not JSON: %v\n%s", err, out)
	}
	for _, k := range []string{"mode", "f_hz", "diameter_m", "length_m", "ratio_d_over_l", "clearance_pct", "at_range_edge", "below", "above", "degenerate", "q0", "sensitivity", "tolerance"} {
		if _, ok := m[k]; !ok {
			t.Errorf("design JSON lacks key %q", k)
		}
	}
	sens := m["sensitivity"].(map[string]any)
	for _, k := range []string{"df_dd_hz_per_m", "df_dl_hz_per_m", "df_dt_hz_per_k"} {
		if _, ok := sens[k]; !ok {
			t.Errorf("design JSON sensitivity lacks key %q", k)
		}
	}
	// An interior optimum that no bound holds: "limit" is present and null.
	if l, ok := m["limit"]; !ok || l != nil {
		t.Errorf("design JSON limit = %v (present %v), want null", l, ok)
	}
	if c, ok := m["cautions"].([]any); !ok || len(c) == 0 || c[len(c)-1] != rfCaution {
		t.Errorf("design JSON cautions = %v, want the RF caution last", m["cautions"])
	}
}

// TestDesignLimit checks that a bound holding the optimum is named in the
// JSON "limit" (here --min-clearance, which --objective q keeps at 5 %).
func TestDesignLimit(t *testing.T) {
	r := clitest.Run(t, "design", "--mode", "TE011", "--freq", "10GHz", "--wall", "copper", "--objective", "q",
		"--min-clearance", "5%", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d, stderr %q", r.Code, r.Stderr)
	}
	var o design.Output
	if err := json.Unmarshal([]byte(r.Stdout), &o); err != nil {
		t.Fatal(err)
	}
	if o.Limit == nil || *o.Limit == "" {
		t.Errorf("design --objective q --min-clearance 5%%: limit = %v, want the bound named", o.Limit)
	}
}

func TestDesignCSV(t *testing.T) {
	r := clitest.Run(t, "design", "--mode", "TM010", "--freq", "3GHz", "--format", "csv")
	if r.Code != 0 {
		t.Fatalf("exit %d, stderr %q", r.Code, r.Stderr)
	}
	if !strings.HasPrefix(r.Stdout, "ratio_d_over_l,diameter_m,length_m,clearance_pct,worst_clearance_pct,q0\n") {
		t.Errorf("design CSV header = %q", strings.SplitN(r.Stdout, "\n", 2)[0])
	}
}

// TestDesignErrors: bad input exits with 2, an impossible request with 1.
func TestDesignErrors(t *testing.T) {
	for _, tc := range []struct {
		args   []string
		status int
		want   string
	}{
		{[]string{"--mode", "TE010", "--freq", "10GHz"}, 2, "--mode"},
		{[]string{"--mode", "TE011"}, 2, "--mode and --freq"},
		{[]string{"--mode", "TE011", "--freq", "10GHz", "--ratio-range", "3:1"}, 2, "--ratio-range"},
		{[]string{"--mode", "TE011", "--freq", "10GHz", "--objective", "q"}, 2, "--wall"},
		{[]string{"--mode", "TM010", "--freq", "10GHz", "--tuning", "1%"}, 2, "p = 0"},
		{[]string{"--mode", "TE011", "--freq", "10GHz", "--min-clearance", "20%"}, 1, "best clearance"},
	} {
		r := clitest.Run(t, append([]string{"design"}, tc.args...)...)
		if r.Code != tc.status || !strings.Contains(r.Stderr, tc.want) {
			t.Errorf("design %v: status %d, stderr %q; want status %d mentioning %q", tc.args, r.Code, r.Stderr, tc.status, tc.want)
		}
	}
}

// TestDesignValidity checks that design prints the library's validity
// warnings (qfactor.Validity, tested against independent routes there)
// among its cautions: walls of a magnetic metal given by values.
func TestDesignValidity(t *testing.T) {
	r := clitest.Run(t, "design", "--mode", "TE011", "--freq", "10GHz", "--wall", "sigma=1e7,mur=50")
	if r.Code != 0 {
		t.Fatalf("exit %d, stderr %q", r.Code, r.Stderr)
	}
	if !strings.Contains(r.Stdout, "  - The wall metal given by its values has mu_r = 50: its microwave permeability is uncertain") {
		t.Errorf("design output lacks the permeability caution:\n%s", r.Stdout)
	}
	if r := clitest.Run(t, "design", "--mode", "TE011", "--freq", "10GHz", "--wall", "copper"); strings.Contains(r.Stdout, "mu_r") {
		t.Errorf("copper design mentions mu_r:\n%s", r.Stdout)
	}
}
