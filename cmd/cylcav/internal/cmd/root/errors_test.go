package root_test

import (
	"io"
	"regexp"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/root"
	"cylcav/cmd/cylcav/internal/cmdutil"
)

// Patterns of what an error line must not hold (issue 9 item 14).
var (
	// packagePrefix is a Go package name used as a message prefix.
	packagePrefix = regexp.MustCompile(`\b(cavity|qfactor|modechart|filter|filterplot|figure|physics|bessel|quad|design|datasheet|axisym|axisymplot|iris|measure|benchplot|touchstone): `)
	// longNumber is a number printed with more digits than any user unit
	// needs (a float64 printed in full: 0.036564799999999998).
	longNumber = regexp.MustCompile(`\d\.?\d{9,}`)
	// longQuote is a quoted value of more than 80 characters.
	longQuote = regexp.MustCompile(`"[^"]{81,}"`)
	// quoted is a quoted value (the user's own digits are no fault).
	quoted = regexp.MustCompile(`"(?:[^"\\]|\\.)*"`)
	// flagName is a flag named in a message.
	flagName = regexp.MustCompile(`--([a-z][a-z0-9-]*)`)
)

// TestErrorMessages runs bad command lines across the commands and checks
// the rules every error line keeps: the wanted exit status (the same
// condition gives the same status in every command: a diameter below the
// mode's cut-off is 2 in size, design, report and chart alike), one line
// on standard error and nothing on standard output, the wanted words (the
// flag and the value in the user's units), no Go package prefix, no number
// with more digits than a user unit needs, no quoted value longer than 80
// characters, and no advice naming a flag the command does not have.
func TestErrorMessages(t *testing.T) {
	long := strings.Repeat("x", 200)
	cases := []struct {
		args []string
		code int
		want []string
	}{
		// A diameter below the cut-off of the mode, in four commands.
		{[]string{"size", "--mode", "TE011", "--freq", "10GHz", "--diameter", "10mm"}, 2, []string{"--diameter", "must exceed 36.5648 mm"}},
		{[]string{"design", "--mode", "TE011", "--freq", "10GHz", "--max-diameter", "10mm"}, 2, []string{`--max-diameter "10mm"`, "must exceed 36.5648 mm"}},
		{[]string{"report", "-o", "x.html", "--mode", "TE011", "--freq", "10GHz", "--max-diameter", "10mm"}, 2, []string{`--max-diameter "10mm"`, "must exceed 36.5648 mm"}},
		{[]string{"chart", "--mode", "TE011", "--freq", "10GHz", "--diameter", "10mm", "-o", "x.svg"}, 2, []string{"--diameter", "must exceed 36.5648 mm"}},
		// A mode with p = 0 cannot be tuned by an end plate, in two commands.
		{[]string{"design", "--mode", "TM010", "--freq", "1.3GHz", "--tuning", "1%"}, 2, []string{`--tuning "1%"`, "p = 0"}},
		{[]string{"chart", "--mode", "TM010", "--diameter", "176mm", "--length", "100mm", "--tuning", "1%", "-o", "x.svg"}, 2, []string{`--tuning "1%"`, "p = 0"}},
		// Requests no D/L meets: status 1, sizes in millimetres.
		{[]string{"design", "--mode", "TE011", "--freq", "10GHz", "--max-length", "1mm"}, 1, []string{"length <= 1 mm", "10 GHz"}},
		{[]string{"design", "--mode", "TE011", "--freq", "10GHz", "--min-clearance", "50%"}, 1, []string{"clearance of 50 %"}},
		// Ranges speak as typed.
		{[]string{"design", "--mode", "TE011", "--freq", "10GHz", "--temp", "20C:10C"}, 2, []string{`--temp "20C:10C"`, "low end 20C is above high end 10C"}},
		{[]string{"tune", "--mode", "TE011", "--diameter", "40mm", "--length-range", "32mm:28mm"}, 2, []string{"--length-range", "low end 32mm"}},
		// Chart ranges in the f·D unit of --units, naming the flag.
		{[]string{"chart", "--diameter", "40mm", "--length", "30mm", "--min-fd", "100", "-o", "x.svg"}, 2, []string{`--min-fd "100"`, "GHz·cm"}},
		{[]string{"chart", "--diameter", "40mm", "--length", "30mm", "--max-fd", "0.0001", "-o", "x.svg"}, 2, []string{`--max-fd "0.0001"`, "raise"}},
		{[]string{"chart", "--diameter", "40mm", "--length", "30mm", "--units", "ghz-mm", "--min-fd", "1000", "-o", "x.svg"}, 2, []string{"GHz·mm"}},
		// Enumeration limits name the flag that sets them.
		{[]string{"modes", "--diameter", "1m", "--length", "1m", "--fmax", "100GHz"}, 2, []string{`--fmax "100GHz"`, "lower --fmax"}},
		// Library validation reaches the user without package prefixes.
		{[]string{"q", "--mode", "TM010", "--diameter", "200mm", "--length", "100mm", "--wall", "copper", "--temperature", "1000K"}, 2, []string{`--temperature "1000K"`, "200.0 C"}},
		{[]string{"modes", "--diameter", "40mm", "--length", "30mm", "--fill", "eps=0.5"}, 2, []string{`--fill "eps=0.5"`}},
		// The packages of stack and resonances too (found by the user
		// pass: "axisym: coupling: ..." and a drawn size with no mode,
		// "measure: ... 1.2794220913651512e+10 Hz").
		{[]string{"stack", "../../../../../examples/iris-pair.yaml", "--fmax", "12GHz", "--pair", "1,3"}, 2, []string{`--pair "1,3"`, "neighbours in their family"}},
		{[]string{"stack", "../../../../../examples/nosed-cell.yaml", "--fmax", "10THz"}, 2, []string{`--fmax "10THz"`, "too high for", "lower the maximum frequency"}},
		{[]string{"resonances", "../../../../../testdata/measure/modes.s2p", "--diameter", "1mm", "--length", "31mm"}, 2, []string{"D = 1 mm", "12.79 GHz"}},
		// Long values are quoted cut short.
		{[]string{"q", "--mode", "TE011", "--diameter", "40mm", "--length", "30mm", "--wall", long}, 2, []string{`--wall "xxxxxxxx`, `"...`}},
		{[]string{"size", "--mode", "TE" + strings.Repeat("1", 120), "--freq", "10GHz", "--ratio", "1"}, 2, []string{"--mode"}},
		{[]string{"modes", "--diameter", long, "--length", "30mm"}, 2, []string{"--diameter"}},
	}
	tree := root.NewCmdRoot(cmdutil.Test(io.Discard, io.Discard))
	for _, tc := range cases {
		line := "cylcav " + strings.Join(tc.args, " ")
		if len(line) > 120 {
			line = line[:120] + "..."
		}
		r := clitest.Run(t, tc.args...)
		if r.Code != tc.code || r.Stdout != "" || strings.Count(r.Stderr, "\n") != 1 || !strings.HasPrefix(r.Stderr, "cylcav: ") {
			t.Errorf("%s: exit %d, stdout %.60q, stderr %q; want exit %d and one line on stderr", line, r.Code, r.Stdout, r.Stderr, tc.code)
			continue
		}
		for _, w := range tc.want {
			if !strings.Contains(r.Stderr, w) {
				t.Errorf("%s: stderr %q, want it to contain %q", line, r.Stderr, w)
			}
		}
		if m := packagePrefix.FindString(r.Stderr); m != "" {
			t.Errorf("%s: stderr %q has the package prefix %q", line, r.Stderr, m)
		}
		if m := longNumber.FindString(quoted.ReplaceAllString(r.Stderr, `""`)); m != "" {
			t.Errorf("%s: stderr %q has the long number %s", line, r.Stderr, m)
		}
		if longQuote.MatchString(r.Stderr) || len(r.Stderr) > 600 {
			t.Errorf("%s: stderr %q quotes a value of more than 80 characters", line, r.Stderr)
		}
		sub, _, err := tree.Find(tc.args)
		if err != nil {
			t.Fatal(err)
		}
		for _, m := range flagName.FindAllStringSubmatch(r.Stderr, -1) {
			if sub.Flags().Lookup(m[1]) == nil && m[1] != "help" {
				t.Errorf("%s: stderr %q names --%s, which %s does not have", line, r.Stderr, m[1], sub.Name())
			}
		}
	}
}
