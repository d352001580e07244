// Package clitest runs the cylcav command line in-process for the tests of
// the commands: the whole tree through root.Main, with the streams captured,
// so a test sees exactly what a user sees (standard output, standard error,
// exit status). It is imported by external test packages (package x_test);
// a command's internal tests cannot import it, since root imports every
// command.
package clitest

import (
	"bytes"
	"regexp"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/cmd/root"
	"cylcav/cmd/cylcav/internal/cmdutil"
)

// Result is what one run of the command line left behind.
type Result struct {
	Stdout, Stderr string
	// Code is the exit status: 0 on success, 2 for bad input, 1 otherwise.
	Code int
}

// Run runs `cylcav args...` in-process and returns its output and exit
// status.
func Run(t testing.TB, args ...string) Result {
	t.Helper()
	var out, errOut bytes.Buffer
	code := root.Main(cmdutil.Test(&out, &errOut), args)
	return Result{Stdout: out.String(), Stderr: errOut.String(), Code: code}
}

// BadCase is one command line that must fail.
type BadCase struct {
	// Args follow the command name.
	Args []string
	// Code is the exit status wanted: 2 for bad input, 1 for an impossible
	// request.
	Code int
	// Want are strings the error line must contain.
	Want []string
}

// CheckBadInput runs `cylcav command args...` for each case and checks the
// failure contract: the wanted exit status, nothing on standard output, and
// one line on standard error containing every string of Want.
func CheckBadInput(t *testing.T, command string, cases []BadCase) {
	t.Helper()
	for _, tc := range cases {
		args := append([]string{command}, tc.Args...)
		r := Run(t, args...)
		line := strings.Join(args, " ")
		if r.Code != tc.Code || r.Stdout != "" || strings.Count(r.Stderr, "\n") != 1 {
			t.Errorf("cylcav %s: exit %d, stdout %.80q, stderr %q; want exit %d, no output and one line on stderr", line, r.Code, r.Stdout, r.Stderr, tc.Code)
		}
		for _, w := range tc.Want {
			if !strings.Contains(r.Stderr, w) {
				t.Errorf("cylcav %s: stderr %q, want it to contain %q", line, r.Stderr, w)
			}
		}
	}
}

// prompt matches a command line of a worked example.
var prompt = regexp.MustCompile(`^\s*\$ cylcav (.*)$`)

// CheckExamples runs the worked examples of a command's help text (lines
// "  $ cylcav ...", one line each, arguments split on white space) and checks that each
// succeeds and that the output lines shown under it appear, in order, in
// the real output; a line "..." skips any number of lines. It fails when
// the text has no example.
func CheckExamples(t *testing.T, example string) {
	t.Helper()
	lines := strings.Split(example, "\n")
	ran := 0
	for i := 0; i < len(lines); i++ {
		m := prompt.FindStringSubmatch(lines[i])
		if m == nil {
			continue
		}
		r := Run(t, strings.Fields(m[1])...)
		if r.Code != 0 {
			t.Errorf("example %q: exit %d, stderr %q", m[1], r.Code, r.Stderr)
			continue
		}
		ran++
		got := strings.Split(r.Stdout, "\n")
		k := 0
		for i+1 < len(lines) && strings.TrimSpace(lines[i+1]) != "" && !prompt.MatchString(lines[i+1]) {
			i++
			want := strings.TrimPrefix(lines[i], "  ")
			if strings.TrimSpace(want) == "..." {
				continue
			}
			for k < len(got) && got[k] != want {
				k++
			}
			if k == len(got) {
				t.Errorf("example %q: output lacks %q (in order); got:\n%s", m[1], want, r.Stdout)
				break
			}
		}
	}
	if ran == 0 {
		t.Error("help text has no worked example")
	}
}
