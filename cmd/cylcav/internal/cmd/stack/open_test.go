package stack_test

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"cylcav/axisym"
	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/stack"
)

// TestOpenEndsJSON runs the fed-cell example end to end: its TE011-like
// resonance radiates into the feeding guide, with the external Q of
// axisym.PortQ for the model the command lists (1.5 times the default
// modes), and the pipe cutoff is the TE01 cutoff of a 20 mm radius guide,
// j'_{0,1} c / (2 pi a) with j'_{0,1} = 3.831705970207512 (A&S Table 9.5,
// recalled).
func TestOpenEndsJSON(t *testing.T) {
	inRepo(t)
	r := clitest.Run(t, "stack", "examples/fed-cell.yaml", "--fmax", "10.5GHz", "--family", "te", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	var out struct {
		Cutoff struct {
			TE0Hz *float64 `json:"te0_hz"`
		} `json:"pipe_cutoff"`
		Resonances []stack.Row `json:"resonances"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	want := 3.831705970207512 * 299792458 / (2 * math.Pi * 0.020)
	if out.Cutoff.TE0Hz == nil || math.Abs(*out.Cutoff.TE0Hz-want) > 1e-9*want {
		t.Errorf("pipe cutoff %v, want %.10g Hz", out.Cutoff.TE0Hz, want)
	}
	if len(out.Resonances) != 1 || out.Resonances[0].Status != "radiating" || out.Resonances[0].QExt == nil {
		t.Fatalf("want one radiating resonance with Qext, got %+v", out.Resonances)
	}
	g, err := stack.ParseGeometry("fed-cell.yaml", mustRead(t, "examples/fed-cell.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	f0, q, err := axisym.PortQ(g.Body, cavity.TE, 9.87e9, (3*axisym.DefaultModes+1)/2)
	if err != nil {
		t.Fatal(err)
	}
	row := out.Resonances[0]
	if math.Abs(row.FHz-f0) > 1e-9*f0 || math.Abs(*row.QExt-q) > 1e-6*q {
		t.Errorf("row f %.10g Hz Qext %.8g, PortQ %.10g Hz %.8g", row.FHz, *row.QExt, f0, q)
	}
	// The nosed open cell: trapped below the cutoff, radiating above.
	r = clitest.Run(t, "stack", "examples/nosed-cell-open.yaml", "--fmax", "16GHz", "--family", "tm", "--format", "csv")
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	if !strings.Contains(r.Stdout, ",trapped,") || !strings.Contains(r.Stdout, ",radiating,") || !strings.Contains(strings.SplitN(r.Stdout, "\n", 2)[0], "status,f_imag_hz,q_ext") {
		t.Errorf("csv lacks the open-end columns: %q", r.Stdout)
	}
}

func mustRead(t *testing.T, p string) []byte {
	t.Helper()
	b, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// TestOpenEndsBadInput checks the ends and walls keys of the geometry file.
func TestOpenEndsBadInput(t *testing.T) {
	dir := t.TempDir()
	write := func(name, text string) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	sec := "sections:\n  - length: 30mm\n    radius: 20mm\n"
	walls := write("walls.yaml", "walls:\n  side: copper\n"+sec)
	bad := []clitest.BadCase{
		{Args: []string{write("end.yaml", "end_a: open\n"+sec), "--fmax", "10GHz"}, Code: 2, Want: []string{"end.yaml:1", "end_a", "plate or pipe"}},
		{Args: []string{write("wk.yaml", "walls:\n  roof: copper\n"+sec), "--fmax", "10GHz"}, Code: 2, Want: []string{"wk.yaml:2", "walls.roof", "unknown key"}},
		{Args: []string{write("wm.yaml", "walls:\n  side: unobtainium\n"+sec), "--fmax", "10GHz"}, Code: 2, Want: []string{"wm.yaml:2", "walls.side"}},
		{Args: []string{write("ws.yaml", "walls:\n  steps: copper\n"+sec), "--fmax", "10GHz"}, Code: 2, Want: []string{"ws.yaml:2", "walls.side", "missing"}},
		{Args: []string{walls, "--fmax", "10GHz", "--wall", "copper"}, Code: 2, Want: []string{"walls", "--wall", "one place"}},
		{Args: []string{write("rad.yaml", "end_a: pipe\nsections:\n  - length: 10mm\n    radius: 20mm\n  - length: 2mm\n    radius: 10mm\n  - length: 40mm\n    radius: 20mm\n"), "--fmax", "10.5GHz", "--family", "te", "--field-map", filepath.Join(dir, "m.svg")}, Code: 2, Want: []string{"--map", "radiates"}},
	}
	clitest.CheckBadInput(t, "stack", bad)
	if r := clitest.Run(t, "stack", walls, "--fmax", "10GHz"); r.Code != 0 || !strings.Contains(r.Stdout, "Q0") {
		t.Errorf("walls from the file give no Q0: exit %d, %q %q", r.Code, r.Stdout, r.Stderr)
	}
}
