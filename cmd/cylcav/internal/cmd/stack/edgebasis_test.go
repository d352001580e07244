package stack_test

import (
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
)

// TestEdgeBasisFlag runs --edge-basis end to end: on the nosed cell the
// TM010-like frequency is the edge model's (axisym's TestEdgeExampleBodies
// checks that body against a much larger model; without the flag the
// command prints 2.952372 GHz with a change of 28 kHz); a coaxial body
// falls back with a warning; --order 1 is refused (exit 2, naming the
// flag).
func TestEdgeBasisFlag(t *testing.T) {
	inRepo(t)
	r := clitest.Run(t, "stack", "examples/nosed-cell.yaml", "--fmax", "4GHz", "--family", "tm", "--edge-basis", "--format", "csv")
	if r.Code != 0 || r.Stderr != "" {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	// 2.952395428 GHz with --edge-basis; 2.952372 GHz, change 28 kHz, without.
	if !strings.Contains(r.Stdout, "2.9523954") {
		t.Errorf("nosed cell: %s", r.Stdout)
	}
	r = clitest.Run(t, "stack", "examples/reentrant.yaml", "--fmax", "4GHz", "--edge-basis")
	if r.Code != 0 || !strings.Contains(r.Stderr, "warning: --edge-basis") {
		t.Errorf("re-entrant: exit %d, stderr %q", r.Code, r.Stderr)
	}
	r = clitest.Run(t, "stack", "examples/nosed-cell.yaml", "--fmax", "4GHz", "--order", "1", "--edge-basis")
	if r.Code != 2 || !strings.Contains(r.Stderr, "edge-basis") {
		t.Errorf("--order 1: exit %d, stderr %q", r.Code, r.Stderr)
	}
}
