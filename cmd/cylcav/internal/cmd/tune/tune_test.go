package tune_test

import (
	"encoding/json"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/tune"
)

func TestTuneTable(t *testing.T) {
	r := clitest.Run(t, "tune", "--mode", "TE011", "--diameter", "40mm", "--length-range", "25mm:40mm", "--steps", "3", "--sphere", "1mm", "--at", "20mm,0,15mm")
	if r.Code != 0 {
		t.Fatalf("exit %d, stderr %q", r.Code, r.Stderr)
	}
	for _, want := range []string{"n azimuthal", "Crossing: TE112", "Worst clearance", "screw tip", "TM111"} {
		if !strings.Contains(r.Stdout, want) {
			t.Errorf("tune output lacks %q:\n%s", want, r.Stdout)
		}
	}
}

func TestTuneJSON(t *testing.T) {
	r := clitest.Run(t, "tune", "--mode", "TE011", "--diameter", "40mm", "--length-range", "28mm:32mm", "--steps", "4", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d, stderr %q", r.Code, r.Stderr)
	}
	var o tune.Output
	if err := json.Unmarshal([]byte(r.Stdout), &o); err != nil {
		t.Fatal(err)
	}
	if len(o.Points) != 5 || o.Points[0].FHz <= o.Points[4].FHz {
		t.Errorf("tune JSON points = %+v, want 5 points with f falling as L grows", o.Points)
	}
}

func TestTuneErrors(t *testing.T) {
	for _, args := range [][]string{
		{"--mode", "TE011", "--diameter", "40mm", "--length-range", "32mm:28mm"},
		{"--mode", "TE011", "--diameter", "40mm", "--length-range", "28mm:32mm", "--steps", "0"},
		{"--mode", "TE011", "--diameter", "40mm", "--length-range", "28mm:32mm", "--sphere", "1mm"},
		{"--mode", "TE011", "--diameter", "40mm", "--length-range", "28mm:32mm", "--sphere", "1mm", "--at", "19.5mm,0,15mm"},
	} {
		if r := clitest.Run(t, append([]string{"tune"}, args...)...); r.Code != 2 {
			t.Errorf("tune %v: exit %d, stderr %q; want a usage error (status 2)", args, r.Code, r.Stderr)
		}
	}
}
