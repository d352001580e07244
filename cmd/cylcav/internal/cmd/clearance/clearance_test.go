package clearance

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
	cmd := NewCmdClearance(cmdutil.Test(&out, &errOut), nil)
	cmd.SetArgs(args)
	cmd.SetOut(&out)
	cmd.SetErr(&errOut)
	cmd.SilenceUsage, cmd.SilenceErrors = true, true
	err := cmd.Execute()
	return out.String(), err
}

func TestClearanceJSON(t *testing.T) {
	out, err := run(t, "--mode", "TE011", "--diameter", "40mm", "--length", "30mm", "--fill", "vacuum", "--window", "10%", "--format", "json")
	if err != nil {
		t.Fatal(err)
	}
	var o Output
	if err := json.Unmarshal([]byte(out), &o); err != nil {
		t.Fatal(err)
	}
	if o.Mode != "TE011" || o.Below == nil || o.Below.Mode != "TM110" || o.Above == nil || o.Above.Mode != "TE112" ||
		len(o.Degenerate) != 1 || o.Degenerate[0] != "TM111" || len(o.InWindow) == 0 {
		t.Errorf("clearance JSON = %+v, want TE011 between TM110 and TE112 with TM111 degenerate", o)
	}
	for _, k := range []string{`"below"`, `"above"`, `"clearance_pct"`, `"in_window"`, `"offset_pct"`, `"offset_hz"`} {
		if !strings.Contains(out, k) {
			t.Errorf("clearance JSON lacks %s", k)
		}
	}
	// The lowest mode has no neighbour below: null.
	out, err = run(t, "--mode", "TE111", "--diameter", "40mm", "--length", "80mm", "--format", "json")
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(out, `"below": null`) {
		t.Errorf("clearance JSON for the lowest mode lacks \"below\": null:\n%s", out)
	}
}

func TestClearanceErrors(t *testing.T) {
	for _, args := range [][]string{
		{"--mode", "TE011", "--diameter", "-4mm", "--length", "30mm"},
		{"--mode", "TE011", "--diameter", "40mm", "--length", "30mm", "--window", "abc"},
		{"--mode", "XX011", "--diameter", "40mm", "--length", "30mm"},
	} {
		if _, err := run(t, args...); cmdutil.ExitStatus(err) != 2 {
			t.Errorf("clearance %v: error %v, want a usage error (status 2)", args, err)
		}
	}
}
