package materials_test

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/materials"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/physics"
)

// run executes `cylcav materials args...` and returns its standard output,
// failing the test unless it succeeds.
func run(t *testing.T, args ...string) string {
	t.Helper()
	r := clitest.Run(t, append([]string{"materials"}, args...)...)
	if r.Code != 0 {
		t.Fatalf("cylcav materials %v: exit %d, stderr %q", args, r.Code, r.Stderr)
	}
	return r.Stdout
}

func TestTable(t *testing.T) {
	out := run(t)
	for _, c := range physics.Conductors() {
		if !strings.Contains(out, "\n"+c.Name+" ") {
			t.Errorf("table lacks conductor %q", c.Name)
		}
	}
	for _, d := range physics.Dielectrics() {
		if !strings.Contains(out, "\n"+d.Name+" ") {
			t.Errorf("table lacks dielectric %q", d.Name)
		}
	}
	for _, want := range []string{"Wall metals", "Fill dielectrics", "58.00 MS/m", "100.0 %", "Sources:\n[1] IACS definition", "10 GHz", "(ferromagnetic)"} {
		if !strings.Contains(out, want) {
			t.Errorf("table lacks %q:\n%s", want, out)
		}
	}
	// Every source is printed once, and every row cites one.
	refs := strings.Count(out, "\n[")
	if refs == 0 || refs > len(physics.Conductors())+len(physics.Dielectrics()) {
		t.Errorf("table has %d source lines", refs)
	}
	only := run(t, "--kind", "dielectric")
	if strings.Contains(only, "Wall metals") || !strings.Contains(only, "sapphire-cold") {
		t.Errorf("--kind dielectric table:\n%s", only)
	}
	// The uniaxial rows show both permittivities (Krupka et al. 1999,
	// recalled from memory: eps_perp 9.3899, eps_par 11.5867 near 296 K).
	for _, line := range strings.Split(only, "\n") {
		if strings.HasPrefix(line, "sapphire ") && !(strings.Contains(line, "9.3899") && strings.Contains(line, "11.5867")) {
			t.Errorf("sapphire row lacks eps_perp and eps_par: %q", line)
		}
	}
}

func TestJSON(t *testing.T) {
	out := run(t, "--format", "json")
	var lib struct {
		Conductors  []map[string]any `json:"conductors"`
		Dielectrics []map[string]any `json:"dielectrics"`
	}
	if err := json.Unmarshal([]byte(out), &lib); err != nil {
		t.Fatalf("JSON output does not parse: %v\n%s", err, out)
	}
	if len(lib.Conductors) != len(physics.Conductors()) || len(lib.Dielectrics) != len(physics.Dielectrics()) {
		t.Fatalf("JSON has %d conductors and %d dielectrics", len(lib.Conductors), len(lib.Dielectrics))
	}
	cu := lib.Conductors[0]
	if cu["name"] != "copper" || cu["conductivity_s_per_m"] != 58e6 || cu["alpha_per_k"] != 0.00393 || cu["source"] == "" {
		t.Errorf("first conductor = %v", cu)
	}
	if ptfe := lib.Dielectrics[2]; ptfe["name"] != "ptfe" || ptfe["tan_delta_freq_hz"] != 1e10 || ptfe["tc_eps_per_k"] != nil {
		t.Errorf("ptfe = %v, want tan_delta_freq_hz 1e10 and tc_eps_per_k null", ptfe)
	}
	only := run(t, "--kind", "conductor", "--format", "json")
	if strings.Contains(only, `"dielectrics"`) {
		t.Errorf("--kind conductor JSON lists dielectrics")
	}
}

func TestCSV(t *testing.T) {
	out := run(t, "--format", "csv")
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatalf("CSV output does not parse: %v", err)
	}
	if got, want := len(recs), 1+len(physics.Conductors())+len(physics.Dielectrics()); got != want {
		t.Fatalf("CSV has %d records, want %d", got, want)
	}
	if strings.Join(recs[0], ",") != strings.Join(materials.CSVHeader, ",") {
		t.Errorf("CSV header = %v", recs[0])
	}
	for _, r := range recs[1:] {
		if len(r) != len(materials.CSVHeader) || r[len(r)-1] == "" {
			t.Errorf("CSV row %v: want %d fields and a source", r[:2], len(materials.CSVHeader))
		}
	}
}

func TestBadInput(t *testing.T) {
	for _, args := range [][]string{{"--kind", "plasma"}, {"--format", "xml"}} {
		r := clitest.Run(t, append([]string{"materials"}, args...)...)
		if r.Code != 2 {
			t.Errorf("materials %v: exit %d, stderr %q; want a usage error (exit 2)", args, r.Code, r.Stderr)
			continue
		}
		if !strings.Contains(r.Stderr, args[1]) {
			t.Errorf("materials %v: error %q does not name the value", args, r.Stderr)
		}
	}
	var got *materials.Options
	cmd := materials.NewCmdMaterials(cmdutil.Test(&bytes.Buffer{}, &bytes.Buffer{}), func(o *materials.Options) error { got = o; return nil })
	cmd.SetArgs([]string{"--kind", "Fill"})
	if err := cmd.Execute(); err != nil || got == nil || got.Kind != materials.Dielectric || got.Format != cmdutil.Table {
		t.Errorf("--kind Fill: options %+v, error %v", got, err)
	}
}
