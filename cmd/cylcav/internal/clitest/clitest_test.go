package clitest_test

import (
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
)

func TestRun(t *testing.T) {
	r := clitest.Run(t, "version")
	if r.Code != 0 || !strings.HasPrefix(r.Stdout, "cylcav ") || r.Stderr != "" {
		t.Errorf("Run(version) = %+v, want exit 0 and the version on standard output", r)
	}
	r = clitest.Run(t, "modes", "--length", "50mm")
	if r.Code != 2 || r.Stdout != "" || !strings.HasPrefix(r.Stderr, "cylcav: ") {
		t.Errorf("Run(modes --length 50mm) = %+v, want exit 2 and one error line", r)
	}
}

func TestCheckBadInput(t *testing.T) {
	clitest.CheckBadInput(t, "materials", []clitest.BadCase{
		{Args: []string{"--kind", "plasma"}, Code: 2, Want: []string{`--kind "plasma"`}},
	})
}

func TestCheckExamples(t *testing.T) {
	// TM010 of a 50 mm x 50 mm vacuum cavity: 4.5897 GHz (the modes
	// command's reference, cavity/testdata/modes.txt).
	clitest.CheckExamples(t, `  # an example
  $ cylcav modes --diameter 50mm --length 50mm --count 1
  cavity: radius 25 mm, diameter 50 mm, length 50 mm, fill vacuum (eps_r 1, mu_r 1)
  ...
  1  TM010  TM      0  1  0  4.5897 GHz  1

  $ cylcav version`)
}
