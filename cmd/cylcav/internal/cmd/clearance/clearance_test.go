package clearance_test

import (
	"encoding/json"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/clearance"
)

func TestClearanceJSON(t *testing.T) {
	r := clitest.Run(t, "clearance", "--mode", "TE011", "--diameter", "40mm", "--length", "30mm", "--fill", "vacuum", "--window", "10%", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d, stderr %q", r.Code, r.Stderr)
	}
	out := r.Stdout
	var o clearance.Output
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
	r = clitest.Run(t, "clearance", "--mode", "TE111", "--diameter", "40mm", "--length", "80mm", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d, stderr %q", r.Code, r.Stderr)
	}
	if !strings.Contains(r.Stdout, `"below": null`) {
		t.Errorf("clearance JSON for the lowest mode lacks \"below\": null:\n%s", r.Stdout)
	}
}

func TestClearanceErrors(t *testing.T) {
	for _, args := range [][]string{
		{"--mode", "TE011", "--diameter", "-4mm", "--length", "30mm"},
		{"--mode", "TE011", "--diameter", "40mm", "--length", "30mm", "--window", "abc"},
		{"--mode", "XX011", "--diameter", "40mm", "--length", "30mm"},
	} {
		if r := clitest.Run(t, append([]string{"clearance"}, args...)...); r.Code != 2 {
			t.Errorf("clearance %v: exit %d, stderr %q; want a usage error (status 2)", args, r.Code, r.Stderr)
		}
	}
}
