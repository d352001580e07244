package root_test

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/root"
	"cylcav/cmd/cylcav/internal/cmdutil"
)

// cheapCommands are the commands FuzzMain runs: each finishes in
// milliseconds whatever its flags, once the flags below are left out.
// design and tune (an optimiser, a curve over the mode chart) and the
// commands that write files are not fuzzed here.
var cheapCommands = map[string]bool{
	"version": true, "materials": true, "modes": true, "size": true, "q": true, "clearance": true,
}

// slowFlags can ask for millions of modes (modes --count 5000000 takes
// seconds and a gigabyte); they are left out of the fuzzed vectors.
var slowFlags = []string{"--count", "--fmax"}

// FuzzMain runs the command line in-process on argument vectors (one
// argument per line of the input) and checks the exit-status contract of
// every command: no panic; status 0, 1 or 2; on failure nothing on standard
// output and one line on standard error. The seed corpus runs with go test.
func FuzzMain(f *testing.F) {
	for _, seed := range []string{
		"version",
		"materials\n--kind\nconductor\n--format\ncsv",
		"materials\n--kind\n",
		"modes\n--diameter\n50mm\n--length\n50mm",
		"modes\n--diameter\n-3mm\n--length\n50mm",
		"modes\n--radius\nNaN\n--length\n1e400",
		"modes\n--diameter\n50mm\n--radius\n25mm\n--length\n50mm",
		"modes\n--diameter\n5 furlong\n--length\n50mm\n--format\nxml",
		"modes\n--diameter\n50mm\n--length\n50mm\n--wall\ncopper\n--fill\neps=2.08,tand=4e-4",
		"modes\n--diameter\n50mm\n--length\n50mm\n--wall\nsigma=\n--fill\neps=0.5",
		"size\n--mode\nTE011\n--freq\n5GHz\n--ratio\n1\n--fill\nptfe",
		"size\n--mode\nTE010\n--freq\n10GHzz\n--ratio\n1abc",
		"size\n--mode\nTM(1,2)\n--freq\n1e400\n--diameter\n1nm",
		"q\n--mode\nTE011\n--diameter\n54.8016mm\n--length\n54.8016mm\n--fill\neps=2.08,tand=4e-4\n--wall\nsigma=5.813e7",
		"q\n--mode\nTM010\n--radius\n38.25mm\n--length\n40mm\n--wall\nofhc\n--particle-speed\n0.8\n--beta\n1,1\n--format\njson",
		"q\n--mode\nTM010\n--radius\n38mm\n--length\n40mm\n--wall\nniobium\n--superconducting\n--temperature\n2K",
		"q\n--mode\nTE011\n--radius\n20mm\n--length\n40mm\n--wall\ncopper\n--temperature\n-300C\n--roughness\n-1um",
		"q\n--mode\nTE011\n--radius\n20mm\n--length\n40mm\n--wall\niacs=500%\n--plating\nsilver",
		"clearance\n--mode\nTE011\n--diameter\n40mm\n--length\n30mm\n--window\n15%",
		"clearance\n--mode\nTE011\n--diameter\n40mm\n--length\n30mm\n--window\n-1GHz",
		"clearance\n--mode\nTX011\n--diameter\n\n--length\n30mm\nextra",
	} {
		f.Add(seed)
	}
	f.Fuzz(func(t *testing.T, in string) {
		args := strings.Split(in, "\n")
		if !cheapCommands[args[0]] {
			return
		}
		for _, a := range args {
			for _, s := range slowFlags {
				if strings.HasPrefix(a, s) {
					return
				}
			}
			if strings.Contains(a, "(") {
				return // separated labels reach index 1000: slow listings
			}
		}
		r := clitest.Run(t, args...)
		switch r.Code {
		case 0:
		case 1, 2:
			if r.Stdout != "" {
				t.Errorf("cylcav %q: exit %d with standard output %.100q, want none", args, r.Code, r.Stdout)
			}
			if e := r.Stderr; !strings.HasPrefix(e, "cylcav: ") || strings.Count(e, "\n") != 1 {
				t.Errorf("cylcav %q: exit %d, stderr %q, want one line starting \"cylcav: \"", args, r.Code, e)
			}
		default:
			t.Errorf("cylcav %q: exit %d, want 0, 1 or 2", args, r.Code)
		}
	})
}

// TestCompletionNeedsShell: the completion command writes a script for a
// known shell and is a usage error (status 2, one line) otherwise.
func TestCompletionNeedsShell(t *testing.T) {
	for _, tc := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"completion", "bash"}, 0, ""},
		{[]string{"completion"}, 2, "completion needs a shell"},
		{[]string{"completion", "tcsh"}, 2, `unknown command "tcsh"`},
	} {
		r := clitest.Run(t, tc.args...)
		if r.Code != tc.code || !strings.Contains(r.Stderr, tc.want) {
			t.Errorf("cylcav %q: exit %d, stderr %q; want exit %d and %q", tc.args, r.Code, r.Stderr, tc.code, tc.want)
		}
		if r.Code == 0 && !strings.Contains(r.Stdout, "bash completion") {
			t.Errorf("cylcav %q: stdout %.80q, want a bash completion script", tc.args, r.Stdout)
		}
		if r.Code != 0 && (r.Stdout != "" || strings.Count(r.Stderr, "\n") != 1) {
			t.Errorf("cylcav %q: stdout %.80q, stderr %q; want no output and one line", tc.args, r.Stdout, r.Stderr)
		}
	}
}

// TestUnwritableStdout runs commands whose standard output is /dev/full
// (every write fails with ENOSPC, Linux) and checks that each fails with
// status 1 and says so: `cylcav design >/dev/full` exited 0 before.
func TestUnwritableStdout(t *testing.T) {
	full, err := os.OpenFile("/dev/full", os.O_WRONLY, 0)
	if err != nil {
		t.Skip("no /dev/full:", err)
	}
	defer full.Close()
	for _, args := range [][]string{
		{"design"},
		{"design", "--format", "json"},
		{"version"},
		{"materials"},
		{"modes", "--diameter", "50mm", "--length", "50mm"},
		{"size", "--mode", "TE011", "--freq", "5GHz", "--ratio", "1"},
		{"design", "--help"},
	} {
		var errOut bytes.Buffer
		code := root.Main(cmdutil.Test(full, &errOut), args)
		if code != 1 || !strings.Contains(errOut.String(), "no space left on device") {
			t.Errorf("cylcav %s >/dev/full: exit %d, stderr %q; want exit 1 and the write error", strings.Join(args, " "), code, errOut.String())
		}
	}
}

// TestOutputsAllOrNone checks that the commands writing two files write
// both or neither: a second path that cannot be written (an existing file
// without --force, a missing directory, a device) is refused with status 2
// before anything is written, and the first file is not left behind.
func TestOutputsAllOrNone(t *testing.T) {
	dir := t.TempDir()
	existing := filepath.Join(dir, "old.pdf")
	if err := os.WriteFile(existing, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	fifo := filepath.Join(dir, "pipe.pdf")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Skip("mkfifo:", err)
	}
	html := filepath.Join(dir, "x.html")
	s2p := filepath.Join(dir, "f.s2p")
	filter := []string{"filter", "--f0", "10GHz", "--bw", "100MHz", "--order", "3", "--touchstone", s2p}
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{"report", "-o", html, "--pdf", existing}, "--pdf"},
		{[]string{"report", "-o", html, "--pdf", filepath.Join(dir, "nodir", "x.pdf")}, "does not exist"},
		{[]string{"report", "-o", html, "--pdf", fifo, "--force"}, "not a regular file (a named pipe)"},
		{append(filter, "--plot", filepath.Join(dir, "nodir", "p.svg")), "--plot"},
		{append(filter, "--plot", fifo, "--force"), "not a regular file"},
		{[]string{"chart", "--diameter", "40mm", "--length", "30mm", "-o", filepath.Join(dir, "nodir", "c.svg")}, "--output"},
	} {
		r := clitest.Run(t, tc.args...)
		if r.Code != 2 || !strings.Contains(r.Stderr, tc.want) {
			t.Errorf("cylcav %s: exit %d, stderr %q; want exit 2 naming %q", strings.Join(tc.args, " "), r.Code, r.Stderr, tc.want)
		}
		if es, _ := os.ReadDir(dir); len(es) != 2 {
			t.Errorf("cylcav %s: left %d files in the directory, want only old.pdf and pipe.pdf", strings.Join(tc.args, " "), len(es))
		}
	}
}

// TestFlagRules checks the rules every command's flags follow
// (cmdutil.HardenFlags, cmdutil.Needs): integers in decimal digits only
// (pflag reads "010" as octal 8), a single-valued flag given once, and a
// flag that needs a companion refused alone, each with status 2 and a
// message naming the flag(s).
func TestFlagRules(t *testing.T) {
	cav := []string{"--diameter", "50mm", "--length", "50mm"}
	modes := func(a ...string) []string { return append(append([]string{"modes"}, cav...), a...) }
	flt := []string{"filter", "--f0", "10GHz", "--bw", "100MHz", "--order", "3"}
	with := func(base []string, a ...string) []string { return append(append([]string{}, base...), a...) }
	for _, tc := range []struct {
		args []string
		want []string
	}{
		{modes("--count", "010"), []string{`--count "010"`, "decimal"}},
		{modes("--count", "0x10"), []string{`--count "0x10"`}},
		{modes("--count", "0b11"), []string{`--count "0b11"`}},
		{modes("--count", "1_0"), []string{`--count "1_0"`}},
		{[]string{"design", "--mode", "TE011", "--freq", "10GHz", "--tolerance", "0.02mm", "--seed", "007"}, []string{`--seed "007"`}},
		{[]string{"modes", "--diameter", "50mm", "--diameter", "40mm", "--length", "50mm"}, []string{`--diameter "40mm"`, "given twice", `"50mm"`}},
		{[]string{"size", "--mode", "TE011", "--freq", "5GHz", "--freq", "6GHz", "--ratio", "1"}, []string{"--freq", "given twice"}},
		{modes("--roughness", "1um"), []string{"--roughness needs --wall"}},
		{modes("--wall", "copper", "--roughness-model", "groiss"), []string{"--roughness-model needs --roughness"}},
		{modes("--wall", "copper", "--plating-thickness", "5um"), []string{"--plating-thickness needs --plating"}},
		{[]string{"q", "--mode", "TE011", "--diameter", "50mm", "--length", "50mm", "--wall", "copper", "--residual", "5nohm"}, []string{"--residual needs --superconducting"}},
		{[]string{"design", "--mode", "TE011", "--freq", "10GHz", "--samples", "5"}, []string{"--samples needs --tolerance or --tolerance-length"}},
		{[]string{"report", "-o", "x.html", "--mode", "TE011", "--freq", "10GHz", "--seed", "5"}, []string{"--seed needs --tolerance"}},
		{with(flt, "--points", "11"), []string{"--points needs --touchstone"}},
		{with(flt, "--dpi", "100"), []string{"--dpi needs --plot"}},
		{with(flt, "--force"), []string{"--force needs --touchstone or --plot"}},
		{with(flt, "--temperature", "2K"), []string{"--temperature needs --wall"}},
		{[]string{"tune", "--mode", "TE011", "--diameter", "40mm", "--length-range", "28mm:32mm", "--at", "1mm,0,1mm"}, []string{"--at needs --sphere"}},
		// Found by the user pass: alone these did nothing.
		{[]string{"stack", "examples/iris-pair.yaml", "--fmax", "12GHz", "--force"}, []string{"--force needs --field-map"}},
		{[]string{"resonances", "testdata/measure/wide.s2p", "--dpi", "100"}, []string{"--dpi needs --plot or --fit-plots"}},
	} {
		r := clitest.Run(t, tc.args...)
		ok := r.Code == 2 && r.Stdout == "" && strings.Count(r.Stderr, "\n") == 1
		for _, w := range tc.want {
			ok = ok && strings.Contains(r.Stderr, w)
		}
		if !ok {
			t.Errorf("cylcav %s: exit %d, stderr %q; want exit 2 and one line containing %q", strings.Join(tc.args, " "), r.Code, r.Stderr, tc.want)
		}
	}
}

// TestBareNumbers checks the one rule for bare numbers (cmdutil.ParseLength,
// cmdutil.ParseFrequency): a length or frequency other than zero needs its
// unit, refused with status 2 and both readings; zero needs none. It also
// checks the lower bound of --bw (a fractional bandwidth below 1e-5).
func TestBareNumbers(t *testing.T) {
	for _, tc := range []struct {
		args []string
		want []string
	}{
		{[]string{"modes", "--diameter", "176.5", "--length", "50mm"}, []string{`--diameter "176.5"`, "176.5 m", "did you mean 176.5mm?"}},
		{[]string{"filter", "--f0", "10GHz", "--bw", "200", "--order", "3"}, []string{`--bw "200"`, "200 Hz", "did you mean 200MHz?"}},
		{[]string{"size", "--mode", "TE011", "--freq", "10", "--ratio", "1"}, []string{`--freq "10"`, "did you mean 10GHz?"}},
		{[]string{"size", "--mode", "TE011", "--freq", "10GHz", "--length", "0.03"}, []string{`--length "0.03"`, "30 mm", "write 0.03m"}},
		{[]string{"filter", "--f0", "10GHz", "--bw", "99kHz", "--order", "3"}, []string{`--bw "99kHz"`, "100 kHz"}},
		{[]string{"filter", "--f0", "10GHz", "--bw", "0.0009%", "--order", "3"}, []string{`--bw "0.0009%"`, "0.001 %"}},
	} {
		r := clitest.Run(t, tc.args...)
		ok := r.Code == 2 && r.Stdout == "" && strings.Count(r.Stderr, "\n") == 1
		for _, w := range tc.want {
			ok = ok && strings.Contains(r.Stderr, w)
		}
		if !ok {
			t.Errorf("cylcav %s: exit %d, stderr %q; want exit 2 and one line containing %q", strings.Join(tc.args, " "), r.Code, r.Stderr, tc.want)
		}
	}
	for _, args := range [][]string{
		{"design", "--mode", "TE011", "--freq", "10GHz", "--tolerance", "0"},
		{"filter", "--f0", "10GHz", "--bw", "100kHz", "--order", "3"},
	} {
		if r := clitest.Run(t, args...); r.Code != 0 {
			t.Errorf("cylcav %s: exit %d, stderr %q; want success", strings.Join(args, " "), r.Code, r.Stderr)
		}
	}
}

// TestHelpDefaults: no flag's help line states two defaults. Every flag is
// wrapped by cmdutil.HardenFlags; a wrapper of a non-boolean flag that
// answered IsBoolFlag made pflag print "(default 0)" after the usage's own
// default ("(default 40) (default 0)"; found by the user pass).
func TestHelpDefaults(t *testing.T) {
	for _, c := range []string{"stack", "filter", "resonances", "design", "modes", "report", "tune", "q", "size", "chart", "clearance"} {
		r := clitest.Run(t, c, "--help")
		if r.Code != 0 {
			t.Fatalf("%s --help: exit %d", c, r.Code)
		}
		for _, line := range strings.Split(r.Stdout, "\n") {
			if strings.HasPrefix(strings.TrimSpace(line), "-") && strings.Count(line, "(default ") > 1 {
				t.Errorf("%s --help: %q", c, line)
			}
		}
	}
}

// TestFormatAnyCase: --format takes its words in any case, as the word
// flags do (--family TE); found by the user pass (--format JSON was
// refused while --family TE was taken).
func TestFormatAnyCase(t *testing.T) {
	for _, f := range []string{"JSON", "Json", " json"} {
		r := clitest.Run(t, "modes", "--diameter", "40mm", "--length", "30mm", "--format", f)
		if r.Code != 0 || !strings.HasPrefix(r.Stdout, "{") {
			t.Errorf("--format %q: exit %d, stdout %.40q, stderr %q", f, r.Code, r.Stdout, r.Stderr)
		}
	}
	if r := clitest.Run(t, "modes", "--diameter", "40mm", "--length", "30mm", "--format", "XML"); r.Code != 2 || !strings.Contains(r.Stderr, `--format "XML"`) {
		t.Errorf("--format XML: exit %d, stderr %q", r.Code, r.Stderr)
	}
}
