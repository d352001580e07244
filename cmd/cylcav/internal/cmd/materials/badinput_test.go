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
