package q_test

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
		args := append([]string{"q"}, tc.args...)
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

// TestBadInputMain: flags given empty are errors, not "absent"; plain
// numbers take nothing after them; temperatures outside the wall model
// name --temperature and the model's range.
func TestBadInputMain(t *testing.T) {
	cu := []string{"--radius", "20mm", "--length", "40mm", "--wall", "copper"}
	with := func(extra ...string) []string { return append(extra, cu...) }
	checkBad(t, []badCase{
		{with("--mode", ""), 2, []string{`--mode ""`, "TE011"}},
		{with("--mode", "TX011"), 2, []string{`--mode "TX011"`, "TE or TM"}},
		{with("--mode", "TE010"), 2, []string{`--mode "TE010"`, "p >= 1"}},
		{with("--mode", "TM(1,2)"), 2, []string{`--mode "TM(1,2)"`, "three indices"}},
		{[]string{"--mode", "TE011", "--diameter", "", "--length", "40mm", "--wall", "copper"}, 2, []string{`--diameter ""`, "empty"}},
		{[]string{"--mode", "TE011", "--diameter", "1e9", "--length", "40mm", "--wall", "copper"}, 2, []string{`--diameter "1e9"`, "must be between"}},
		{[]string{"--mode", "TE011", "--radius", "20mm", "--length", "", "--wall", "copper"}, 2, []string{`--length ""`, "empty"}},
		{[]string{"--mode", "TE011", "--radius", "20mm", "--length", "40mm", "--wall", ""}, 2, []string{`--wall ""`, "empty"}},
		{[]string{"--mode", "TE011", "--radius", "20mm", "--length", "40mm", "--wall", "sigma=abc"}, 2, []string{`--wall "sigma=abc"`, "no number"}},
		{with("--mode", "TE011", "--fill", ""), 2, []string{`--fill ""`, "empty"}},
		{with("--mode", "TE011", "--fill", "eps=0.5"), 2, []string{`--fill "eps=0.5"`, "between 1 and 10000"}},
		{with("--mode", "TE011", "--fill", "eps=2,tand=-1"), 2, []string{"tand must be between 0 and 1"}},
		{with("--mode", "TE011", "--beta", ""), 2, []string{`--beta ""`, "empty"}},
		{with("--mode", "TE011", "--beta", "1abc"), 2, []string{`--beta "1abc"`, `unexpected "abc"`, "between 0 and"}},
		{with("--mode", "TE011", "--qext", ""), 2, []string{`--qext ""`, "empty"}},
		{with("--mode", "TE011", "--qext", "1e400"), 2, []string{`--qext "1e400"`, "out of range"}},
		{with("--mode", "TM010", "--particle-speed", "0.5,"), 2, []string{`--particle-speed "0.5,"`, "between 1e-06 and 1"}},
		{with("--mode", "TM010", "--particle-speed", "NaN"), 2, []string{`--particle-speed "NaN"`, "not a finite number"}},
		{with("--mode", "TE011", "--end-wall", ""), 2, []string{`--end-wall ""`, "empty"}},
		{with("--mode", "TE011", "--end-wall-a", "unobtainium"), 2, []string{`--end-wall-a "unobtainium"`, "available"}},
		{with("--mode", "TE011", "--temperature", ""), 2, []string{`--temperature ""`, "empty"}},
		{with("--mode", "TE011", "--temperature", "-300C"), 2, []string{`--temperature "-300C"`, "below absolute zero"}},
		// Linear resistivity model of copper: -50 C..200 C (physics.Conductors).
		{with("--mode", "TE011", "--temperature", "4K"), 2, []string{`--temperature "4K"`, "-50.00 C to 200.0 C"}},
		{with("--mode", "TE011", "--temperature", "500C"), 2, []string{`--temperature "500C"`, "-50.00 C to 200.0 C"}},
		{with("--mode", "TE011", "--temperature", "60C", "--end-wall", "sigma=1e7"), 2, []string{`--temperature "60C"`, "temperature coefficient"}},
		// BCS model: T <= Tc/2 = 4.625 K for niobium (qfactor.NiobiumBCS).
		{[]string{"--mode", "TM010", "--radius", "20mm", "--length", "40mm", "--wall", "niobium", "--superconducting", "--temperature", "300K"}, 2, []string{`--temperature "300K"`, "4.625 K"}},
		{with("--mode", "TE011", "--roughness", ""), 2, []string{`--roughness ""`, "empty"}},
		{with("--mode", "TE011", "--roughness", "-1um"), 2, []string{`--roughness "-1um"`, "must be between"}},
		{with("--mode", "TE011", "--plating", "", "--plating-thickness", "5um"), 2, []string{`--plating ""`, "empty"}},
		{with("--mode", "TE011", "--format", "xml"), 2, []string{`--format "xml"`, "table|json"}},
		{with("--mode", "TE011", "extra"), 2, []string{"extra"}},
	})
}
