package tune_test

import (
	"bytes"
	"slices"
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
		args := append([]string{"tune"}, tc.args...)
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
	base := []string{"--mode", "TE011", "--diameter", "40mm"}
	with := func(extra ...string) []string { return append(append([]string{}, base...), extra...) }
	ok := slices.Clip(with("--length-range", "28mm:32mm")) // each append copies
	checkBad(t, []badCase{
		{with("--length-range", "3:0.5"), 2, []string{`--length-range "3:0.5"`, "above high end"}},
		{with("--length-range", "a:b"), 2, []string{`--length-range "a:b"`, "no number"}},
		{with("--length-range", "1:"), 2, []string{`--length-range "1:"`, "empty"}},
		{with("--length-range", ":2"), 2, []string{`--length-range ":2"`, "empty"}},
		{with("--length-range", "28mm"), 2, []string{`--length-range "28mm"`, "LO:HI"}},
		{with("--length-range", "0:30mm"), 2, []string{`--length-range "0:30mm"`, "must be between"}},
		// The mode chart reaches D/L 0.01..100 (cavity.MinDesignRatio..MaxDesignRatio):
		// 0.4 mm..4 m for a 40 mm diameter.
		{with("--length-range", "1mm:1000m"), 2, []string{`--length-range "1mm:1000m"`, "400.0 um and 4.000 m"}},
		{with(), 2, []string{`"length-range"`, "not set"}},
		{[]string{"--mode", "TE011", "--diameter", "", "--length-range", "28mm:32mm"}, 2, []string{`--diameter ""`, "empty"}},
		{[]string{"--mode", "TE010", "--diameter", "40mm", "--length-range", "28mm:32mm"}, 2, []string{`--mode "TE010"`, "p >= 1"}},
		{append(ok, "--steps", "0"), 2, []string{`--steps "0"`, "between 1 and 100000"}},
		{append(ok, "--steps", "-1"), 2, []string{`--steps "-1"`, "between 1 and 100000"}},
		{append(ok, "--steps", "1e3"), 2, []string{`--steps "1e3"`, "not a whole number"}},
		{append(ok, "--sphere", "1mm"), 2, []string{"--sphere and --at"}},
		{append(ok, "--sphere", "", "--at", "20mm,0,15mm"), 2, []string{`--sphere ""`, "empty"}},
		{append(ok, "--sphere", "1mm", "--at", ""), 2, []string{`--at ""`, "RHO,PHI,Z"}},
		{append(ok, "--sphere", "1mm", "--at", "20mm,x,15mm"), 2, []string{`--at "20mm,x,15mm"`, "degrees"}},
		{append(ok, "--sphere", "1mm", "--at", "30mm,0,15mm"), 2, []string{`--at "30mm,0,15mm"`, "inside the cavity"}},
		{append(ok, "--sphere", "30mm", "--at", "20mm,0,15mm"), 2, []string{`--sphere "30mm"`, "does not fit"}},
		{append(ok, "--fill", "unobtainium"), 2, []string{`--fill "unobtainium"`, "available"}},
		{append(ok, "--format", "xml"), 2, []string{`--format "xml"`}},
		{append(ok, "extra"), 2, []string{"extra"}},
	})
}
