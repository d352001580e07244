package tune

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/cmdutil"
)

func run(t *testing.T, args ...string) (string, error) {
	t.Helper()
	var out, errOut bytes.Buffer
	cmd := NewCmdTune(cmdutil.Test(&out, &errOut), nil)
	cmd.SetArgs(args)
	cmd.SetOut(&out)
	cmd.SetErr(&errOut)
	cmd.SilenceUsage, cmd.SilenceErrors = true, true
	err := cmd.Execute()
	return out.String(), err
}

func TestTuneTable(t *testing.T) {
	out, err := run(t, "--mode", "TE011", "--diameter", "40mm", "--length-range", "25mm:40mm", "--steps", "3", "--sphere", "1mm", "--at", "20mm,0,15mm")
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"n azimuthal", "Crossing: TE112", "Worst clearance", "screw tip", "TM111"} {
		if !strings.Contains(out, want) {
			t.Errorf("tune output lacks %q:\n%s", want, out)
		}
	}
}

func TestTuneJSON(t *testing.T) {
	out, err := run(t, "--mode", "TE011", "--diameter", "40mm", "--length-range", "28mm:32mm", "--steps", "4", "--format", "json")
	if err != nil {
		t.Fatal(err)
	}
	var o Output
	if err := json.Unmarshal([]byte(out), &o); err != nil {
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
		if _, err := run(t, args...); cmdutil.ExitStatus(err) != 2 {
			t.Errorf("tune %v: error %v, want a usage error (status 2)", args, err)
		}
	}
}
