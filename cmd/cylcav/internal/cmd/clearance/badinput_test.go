package clearance_test

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
		args := append([]string{"clearance"}, tc.args...)
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
	cav := []string{"--diameter", "40mm", "--length", "30mm"}
	with := func(extra ...string) []string { return append(extra, cav...) }
	checkBad(t, []badCase{
		{with("--mode", "TX011"), 2, []string{`--mode "TX011"`, "TE or TM"}},
		{with("--mode", "TE010"), 2, []string{`--mode "TE010"`, "did you mean TE011 or TM010?"}},
		{with("--mode", "TE0"), 2, []string{`--mode "TE0"`, "three indices"}},
		{with("--mode", "TM(1,2)"), 2, []string{`--mode "TM(1,2)"`, "three indices"}},
		{with("--mode", ""), 2, []string{`--mode ""`}},
		{cav, 2, []string{`"mode"`, "not set"}},
		{[]string{"--mode", "TE011", "--diameter", "40mm"}, 2, []string{`"length"`, "not set"}},
		{[]string{"--mode", "TE011", "--length", "30mm"}, 2, []string{"diameter", "radius", "required"}},
		{[]string{"--mode", "TE011", "--diameter", "40mm", "--radius", "20mm", "--length", "30mm"}, 2, []string{"diameter", "radius"}},
		{[]string{"--mode", "TE011", "--diameter", "", "--length", "30mm"}, 2, []string{`--diameter ""`, "empty"}},
		{[]string{"--mode", "TE011", "--diameter", "0", "--length", "30mm"}, 2, []string{`--diameter "0"`, "must be between"}},
		{[]string{"--mode", "TE011", "--diameter", "-3mm", "--length", "30mm"}, 2, []string{`--diameter "-3mm"`, "must be between"}},
		{[]string{"--mode", "TE011", "--radius", "Inf", "--length", "30mm"}, 2, []string{`--radius "Inf"`, "not a finite number"}},
		{[]string{"--mode", "TE011", "--diameter", "40mm", "--length", "5 furlong"}, 2, []string{`--length "5 furlong"`, "unknown unit"}},
		{with("--mode", "TE011", "--window", ""), 2, []string{`--window ""`, "empty"}},
		{with("--mode", "TE011", "--window", "-5%"), 2, []string{`--window "-5%"`, "between 0% and 1000%"}},
		{with("--mode", "TE011", "--window", "2000%"), 2, []string{`--window "2000%"`, "between 0% and 1000%"}},
		{with("--mode", "TE011", "--window", "-1GHz"), 2, []string{`--window "-1GHz"`, "10 times the wanted frequency"}},
		{with("--mode", "TE011", "--window", "10GHzz"), 2, []string{`--window "10GHzz"`, "unknown unit"}},
		// 10 x f(TE011) of this cavity = 104.15 GHz (its frequency, 10.415 GHz, from `cylcav modes`).
		{with("--mode", "TE011", "--window", "1e20Hz"), 2, []string{`--window "1e20Hz"`, "104.15 GHz"}},
		{with("--mode", "TE011", "--fill", ""), 2, []string{`--fill ""`, "empty"}},
		{with("--mode", "TE011", "--fill", "eps=0.5"), 2, []string{`--fill "eps=0.5"`, "between 1 and 10000"}},
		{with("--mode", "TE011", "--format", "xml"), 2, []string{`--format "xml"`}},
		{with("--mode", "TE011", "extra"), 2, []string{"extra"}},
	})
}
