package tune_test

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"cylcav/cavity"
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

// TestEndPlateVerdictEverywhere: an end plate does not tune a p = 0 mode,
// and tune, design, chart and report all say so with the one library
// sentence (cavity.Mode.EndPlateTuning): refusals of a tuning request exit
// with status 2; without one, design and report state it (no flat
// "0 Hz per mm" tuning curve, no tuning chart).
func TestEndPlateVerdictEverywhere(t *testing.T) {
	m, _ := cavity.ParseMode("TM010")
	verdict := m.EndPlateTuning()
	if verdict == nil {
		t.Fatal("TM010: EndPlateTuning() = nil, want an error")
	}
	want := "an end plate does not tune it"
	if !strings.Contains(verdict.Error(), want) {
		t.Fatalf("verdict %q lacks %q", verdict, want)
	}
	dir := t.TempDir()
	for _, c := range []struct {
		args []string
		code int
	}{
		{[]string{"tune", "--mode", "TM010", "--diameter", "90mm", "--length-range", "20mm:30mm"}, 2},
		{[]string{"design", "--mode", "TM010", "--freq", "2.45GHz", "--tuning", "1%"}, 2},
		{[]string{"chart", "--mode", "TM010", "--diameter", "90mm", "--length", "30mm", "--tuning", "1%", "-o", filepath.Join(dir, "c.svg")}, 2},
		{[]string{"report", "--mode", "TM010", "--freq", "2.45GHz", "--tuning", "1%", "-o", filepath.Join(dir, "r1.html")}, 2},
		{[]string{"design", "--mode", "TM010", "--freq", "2.45GHz"}, 0},
		{[]string{"chart", "--mode", "TM010", "--diameter", "90mm", "--length", "30mm", "-o", filepath.Join(dir, "c2.svg")}, 0},
	} {
		r := clitest.Run(t, c.args...)
		if r.Code != c.code || !strings.Contains(r.Stdout+r.Stderr, verdict.Error()) {
			t.Errorf("%v: exit %d, output %q; want exit %d and %q", c.args, r.Code, r.Stdout+r.Stderr, c.code, verdict.Error())
		}
	}
	html := filepath.Join(dir, "r2.html")
	if r := clitest.Run(t, "report", "--mode", "TM010", "--freq", "2.45GHz", "-o", html); r.Code != 0 {
		t.Fatalf("report: exit %d, %s", r.Code, r.Stderr)
	}
	b, err := os.ReadFile(html)
	if err != nil {
		t.Fatal(err)
	}
	if s := string(b); !strings.Contains(s, want) || strings.Contains(s, "0 Hz/mm") {
		t.Errorf("datasheet of TM010: want the verdict %q and no flat tuning table", want)
	}
}
