package design_test

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
		args := append([]string{"design"}, tc.args...)
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
	with := func(extra ...string) []string {
		return append([]string{"--mode", "TE011", "--freq", "10GHz"}, extra...)
	}
	checkBad(t, []badCase{
		{[]string{"--mode", "TE011"}, 2, []string{"--mode and --freq"}},
		{[]string{"--mode", "TE011", "--freq", ""}, 2, []string{`--freq ""`, "empty"}},
		{[]string{"--mode", "", "--freq", "10GHz"}, 2, []string{`--mode ""`}},
		{[]string{"--mode", "TE(0,1)", "--freq", "10GHz"}, 2, []string{"three indices"}},
		{[]string{"--mode", "TE011", "--freq", "0"}, 2, []string{`--freq "0"`, "must be between"}},
		{with("--ratio-range", "3:0.5"), 2, []string{`--ratio-range "3:0.5"`, "above high end"}},
		{with("--ratio-range", "a:b"), 2, []string{`--ratio-range "a:b"`, "no number"}},
		{with("--ratio-range", "1:"), 2, []string{`--ratio-range "1:"`, "empty"}},
		{with("--ratio-range", ":2"), 2, []string{`--ratio-range ":2"`, "empty"}},
		{with("--ratio-range", "0x1p0:2"), 2, []string{`--ratio-range "0x1p0:2"`, "unexpected"}},
		{with("--ratio-range", "0.001:2"), 2, []string{`--ratio-range "0.001:2"`, "between 0.01 and 100"}},
		{with("--min-clearance", "-5%"), 2, []string{`--min-clearance "-5%"`, "between 0% and 100%"}},
		{with("--min-clearance", "500%"), 2, []string{`--min-clearance "500%"`, "between 0% and 100%"}},
		{with("--min-clearance", ""), 2, []string{`--min-clearance ""`, "empty"}},
		{with("--tuning", ""), 2, []string{`--tuning ""`, "empty"}},
		{with("--tuning", "-1%"), 2, []string{`--tuning "-1%"`, "between 0% and 50%"}},
		{with("--temp", "-300C:20C"), 2, []string{`--temp "-300C:20C"`, "below absolute zero"}},
		{with("--temp", "60C:-20C"), 2, []string{`--temp "60C:-20C"`, "above high end"}},
		{with("--temp", ""), 2, []string{`--temp ""`, "LO:HI"}},
		{with("--wall", ""), 2, []string{`--wall ""`, "empty"}},
		{with("--wall", "unobtainium"), 2, []string{`--wall "unobtainium"`, "available"}},
		{with("--wall", "copper", "--min-q", "1abc"), 2, []string{`--min-q "1abc"`, `unexpected "abc"`}},
		{with("--fill", "eps=0.5"), 2, []string{`--fill "eps=0.5"`, "between 1 and 10000"}},
		{with("--tolerance", ""), 2, []string{`--tolerance ""`, "empty"}},
		{with("--tolerance", "-1mm"), 2, []string{`--tolerance "-1mm"`, "must be between"}},
		{with("--tolerance", "0.02mm", "--samples", "0"), 2, []string{`--samples "0"`, "between 1 and"}},
		{with("--tolerance", "0.02mm", "--samples", "99999999999"), 2, []string{`--samples "99999999999"`, "between 1 and"}},
		{with("--seed", "-1"), 2, []string{`--seed "-1"`, "not a whole number >= 0"}},
		{with("--objective", "speed"), 2, []string{`--objective "speed"`, "clearance|q"}},
		{with("--format", "xml"), 2, []string{`--format "xml"`}},
		{with("extra"), 2, []string{"extra"}},
		// Impossible requests: status 1 and what was achievable
		// (7.364 % at D/L = 1.388: testdata/cavity/gen_optimum.py).
		{with("--min-clearance", "50%"), 1, []string{"best clearance", "7.364 %"}},
		{with("--max-diameter", "10mm"), 1, []string{"cutoff diameter"}},
		{with("--tuning", "45%"), 1, []string{"tuning", "D/L >="}},
		// Beyond the reach of the mode chart (cavity.MaxChartModes).
		{[]string{"--mode", "TE(50,50,50)", "--freq", "10GHz"}, 1, []string{"lower-order mode"}},
	})
}

// TestWideTuning: a tuning range whose end-plate travel would reach an
// endless cylinder at the low end of the D/L range (TE011 beyond about
// +-2 %) still gives a design.
func TestWideTuning(t *testing.T) {
	for _, x := range []string{"3%", "20%"} {
		var out, errOut bytes.Buffer
		code := root.Main(cmdutil.Test(&out, &errOut), []string{"design", "--mode", "TE011", "--freq", "10GHz", "--tuning", x, "--format", "json"})
		if code != 0 || !strings.Contains(out.String(), `"tuned_length_m"`) {
			t.Errorf("cylcav design --tuning %s: exit %d, stderr %q; want a design", x, code, errOut.String())
		}
	}
}
