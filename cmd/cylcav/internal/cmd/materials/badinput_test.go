package materials_test

import (
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
)

func TestBadInputMain(t *testing.T) {
	clitest.CheckBadInput(t, "materials", []clitest.BadCase{
		{Args: []string{"--kind", ""}, Code: 2, Want: []string{`--kind ""`, "conductor or dielectric"}},
		{Args: []string{"--kind", "plasma"}, Code: 2, Want: []string{`--kind "plasma"`, "conductor or dielectric"}},
		{Args: []string{"--format", "yaml"}, Code: 2, Want: []string{`--format "yaml"`, "table|json|csv"}},
		{Args: []string{"extra"}, Code: 2, Want: []string{"extra"}},
	})
}

// TestKindWords: --kind takes its words in any case, with the plurals and
// the flag names as other words, and refuses a second --kind.
func TestKindWords(t *testing.T) {
	for _, k := range []string{" Wall ", "conductors", "DIELECTRIC", "fill"} {
		if r := clitest.Run(t, "materials", "--kind", k, "--format", "csv"); r.Code != 0 || r.Stdout == "" {
			t.Errorf("materials --kind %q: exit %d, stderr %q; want a listing", k, r.Code, r.Stderr)
		}
	}
	clitest.CheckBadInput(t, "materials", []clitest.BadCase{
		{Args: []string{"--kind", "conductor", "--kind", "dielectric"}, Code: 2, Want: []string{`--kind "dielectric"`, "given twice"}},
	})
}
