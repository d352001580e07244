package stack_test

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"testing"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/stack"
)

// TestBulbHomogeneous checks --bulb-diameter end to end on a closed
// cylinder: the filling factors of every TE0 resonance must be the closed
// forms of cavity.Cavity.FillingFactors (DLMF 10.22 integrals).
func TestBulbHomogeneous(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "can.yaml")
	if err := os.WriteFile(file, []byte("sections:\n  - length: 30mm\n    radius: 20mm\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	r := clitest.Run(t, "stack", file, "--fmax", "12GHz", "--family", "te", "--bulb-diameter", "24mm", "--bulb-length", "20mm", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	var out struct {
		Resonances []stack.Row `json:"resonances"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	c := cavity.Cavity{Radius: 0.02, Length: 0.03}
	if len(out.Resonances) == 0 {
		t.Fatal("no resonances")
	}
	// bulbTol: the command's quadrature stops at 1e-9 (axisym.DefaultRegionTol).
	const bulbTol = 1e-8
	for _, row := range out.Resonances {
		m, err := cavity.ParseMode(row.ContinuesFrom)
		if err != nil {
			t.Fatal(err)
		}
		want, err := c.FillingFactors(m, cavity.Bulb{Radius: 0.012, Length: 0.02})
		if err != nil {
			t.Fatal(err)
		}
		if row.Bulb == nil {
			t.Fatalf("%s: no bulb in the JSON", row.ContinuesFrom)
		}
		if math.Abs(row.Bulb.MagneticZ-want.MagneticZ) > bulbTol || math.Abs(row.Bulb.Maser-want.Maser) > bulbTol ||
			math.Abs(row.Bulb.Electric-want.Electric) > bulbTol || math.Abs(row.Bulb.Magnetic-want.Magnetic) > bulbTol {
			t.Errorf("%s: bulb %+v, want %+v (closed form)", row.ContinuesFrom, *row.Bulb, want)
		}
	}
	// CSV carries the four columns.
	r = clitest.Run(t, "stack", file, "--fmax", "12GHz", "--bulb-diameter", "24mm", "--bulb-length", "20mm", "--format", "csv")
	if r.Code != 0 {
		t.Fatalf("csv: exit %d: %s", r.Code, r.Stderr)
	}
}

func TestBulbBadInput(t *testing.T) {
	inRepo(t)
	clitest.CheckBadInput(t, "stack", []clitest.BadCase{
		{Args: []string{"examples/disc-in-can.yaml", "--fmax", "12GHz", "--bulb-diameter", "40mm", "--bulb-length", "5mm"}, Code: 2, Want: []string{"--bulb-diameter 40 mm", "section 2"}},
		{Args: []string{"examples/disc-in-can.yaml", "--fmax", "12GHz", "--bulb-diameter", "10mm", "--bulb-length", "30mm"}, Code: 2, Want: []string{"--bulb-length 30 mm", "outside the body"}},
		{Args: []string{"examples/disc-in-can.yaml", "--fmax", "12GHz", "--bulb-diameter", "10mm"}, Code: 2, Want: []string{"--bulb-length"}},
		{Args: []string{"examples/disc-in-can.yaml", "--fmax", "12GHz", "--bulb-centre", "3mm"}, Code: 2, Want: []string{"--bulb-diameter"}},
	})
}
