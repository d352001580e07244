package materials_test

import (
	"bytes"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/cmd/root"
	"cylcav/cmd/cylcav/internal/cmdutil"
)

// badCase is one command line that must fail: exit status code (2 for bad
// input, 1 for an impossible request), nothing on standard output, one
// line on standard error containing every string of want.
type badCase struct {
	args []string
	code int
	want []string
}

// checkBad runs each case in-process through root.Main.
func checkBad(t *testing.T, cases []badCase) {
	t.Helper()
	for _, tc := range cases {
		var out, errOut bytes.Buffer
		args := append([]string{"materials"}, tc.args...)
		code := root.Main(cmdutil.Test(&out, &errOut), args)
		line := strings.Join(args, " ")
		if code != tc.code || out.Len() != 0 || strings.Count(errOut.String(), "\n") != 1 {
			t.Errorf("cylcav %s: exit %d, stdout %.80q, stderr %q; want exit %d, no output and one line on stderr", line, code, out.String(), errOut.String(), tc.code)
		}
		for _, w := range tc.want {
			if !strings.Contains(errOut.String(), w) {
				t.Errorf("cylcav %s: stderr %q, want it to contain %q", line, errOut.String(), w)
			}
		}
	}
}

func TestBadInputMain(t *testing.T) {
	checkBad(t, []badCase{
		{[]string{"--kind", ""}, 2, []string{`--kind ""`, "conductor or dielectric"}},
		{[]string{"--kind", "plasma"}, 2, []string{`--kind "plasma"`, "conductor or dielectric"}},
		{[]string{"--format", "yaml"}, 2, []string{`--format "yaml"`, "table|json|csv"}},
		{[]string{"extra"}, 2, []string{"extra"}},
	})
}
