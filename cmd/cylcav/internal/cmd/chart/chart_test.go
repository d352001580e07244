package chart_test

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/spf13/cobra"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/chart"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/figure"
	"cylcav/figure/rendertest"
	"cylcav/modechart"
)

// parse runs `chart` with runF capturing the options.
func parse(t *testing.T, args ...string) (*chart.Options, error) {
	t.Helper()
	var got *chart.Options
	var out, errOut bytes.Buffer
	cmd := chart.NewCmdChart(cmdutil.Test(&out, &errOut), func(o *chart.Options) error {
		got = o
		return nil
	})
	cmd.SetArgs(args)
	cmd.SetOut(&out)
	cmd.SetErr(&errOut)
	// As root.Main does: a typed flag's own error is a usage error.
	cmd.SetFlagErrorFunc(func(_ *cobra.Command, err error) error {
		return &cmdutil.UsageError{Err: cmdutil.FlagValueError(err)}
	})
	err := cmd.Execute()
	return got, err
}

func TestWritesEveryFormat(t *testing.T) {
	dir := t.TempDir()
	for _, ext := range []string{"png", "svg", "pdf"} {
		path := filepath.Join(dir, "chart."+ext)
		r := clitest.Run(t, "chart", "--diameter", "39.6mm", "--length", "39.6mm", "--mode", "TE011",
			"--tuning", "2%", "--tolerance", "0.02mm", "--min-clearance", "3%", "--dpi", "72", "-o", path)
		if r.Code != 0 {
			t.Fatalf("%s: exit %d, stderr %q", ext, r.Code, r.Stderr)
		}
		out := r.Stdout
		b, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		switch ext {
		case "png":
			rendertest.PNG(t, b, 576, 432) // 8 x 6 in at 72 dpi
		case "svg":
			rendertest.SVG(t, b)
		case "pdf":
			rendertest.PDF(t, b)
		}
		for _, want := range []string{"wrote " + path, "required 3 %: NOT met: TE212 crosses at D/L 0.8504, TM012 crosses at D/L 1.096",
			"companion on the same line: TM111", "n azimuthal, m radial, p axial"} {
			if !strings.Contains(out, want) {
				t.Errorf("%s: output lacks %q:\n%s", ext, want, out)
			}
		}
	}
}

// TestForce checks that an existing file is replaced only with --force and
// that a failed run leaves no file.
func TestForce(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "c.svg")
	if err := os.WriteFile(path, []byte("keep"), 0o644); err != nil {
		t.Fatal(err)
	}
	r := clitest.Run(t, "chart", "-o", path)
	if r.Code != 2 || !strings.Contains(r.Stderr, "--force") {
		t.Errorf("existing file: exit %d, stderr %q; want 2 and a hint to use --force", r.Code, r.Stderr)
	}
	if b, _ := os.ReadFile(path); string(b) != "keep" {
		t.Error("existing file changed without --force")
	}
	if r := clitest.Run(t, "chart", "-o", path, "--force"); r.Code != 0 {
		t.Fatalf("--force: exit %d, stderr %q", r.Code, r.Stderr)
	}
	if b, _ := os.ReadFile(path); !bytes.Contains(b, []byte("<svg")) {
		t.Error("--force did not replace the file")
	}
	bad := filepath.Join(dir, "bad.png")
	if r := clitest.Run(t, "chart", "--mode", "TM010", "--diameter", "40mm", "--length", "30mm", "--tuning", "1%", "-o", bad); r.Code != 2 {
		t.Errorf("untunable TM010: exit %d, want 2", r.Code)
	}
	if _, err := os.Stat(bad); err == nil {
		t.Error("a failed run left a file")
	}
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if strings.HasPrefix(e.Name(), ".") {
			t.Errorf("temporary file %s left behind", e.Name())
		}
	}
}

// TestSizeFirst checks --mode --freq --ratio: the cavity is sized by the
// library, so the design point sits at the asked ratio and frequency
// (Pozar, Microwave Engineering, 4th ed., sec. 6.4: the PTFE-filled TE011
// cavity with D = L at 5 GHz has a = 2.74 cm, recalled from memory).
func TestSizeFirst(t *testing.T) {
	o, err := parse(t, "--mode", "TE011", "--freq", "5GHz", "--ratio", "1", "--fill", "eps=2.08", "-o", "x.svg",
		"--units", "mhz-in", "--axes", "linear", "--max-fd", "20000")
	if err != nil {
		t.Fatal(err)
	}
	c := o.Spec.Cavity
	if a := math.Round(c.Radius*1e4) / 1e2; a != 2.74 {
		t.Errorf("sized radius = %.4f cm, want 2.74 cm", c.Radius*100)
	}
	if r := c.Diameter() / c.Length; math.Abs(r-1) > 1e-12 {
		t.Errorf("sized D/L = %.15g, want 1", r)
	}
	if f := c.Frequency(o.Spec.Wanted); math.Abs(f-5e9) > 5e9*1e-12 {
		t.Errorf("sized frequency = %.12g Hz, want 5e9", f)
	}
	if o.Spec.Units != modechart.MHzIn || o.Spec.Axes != modechart.Linear || o.Format != figure.SVG {
		t.Errorf("units %v axes %v format %v", o.Spec.Units, o.Spec.Axes, o.Format)
	}
	// --max-fd is in the chosen units: 20000 MHz·in = 20000 x 25400 Hz·m.
	if want := 20000 * 25400.0; math.Abs(o.Spec.MaxFD-want) > want*1e-15 {
		t.Errorf("MaxFD = %g Hz·m, want %g", o.Spec.MaxFD, want)
	}
}

func TestBadFlags(t *testing.T) {
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"--diameter", "40mm", "-o", "x.png"}, "give both --diameter and --length"},
		{[]string{"--diameter", "40mm", "--length", "30mm"}, "missing -o/--output"},
		{[]string{"-o", "x.gif"}, `--output "x.gif": the file name must end in .png, .svg or .pdf`},
		{[]string{"-o", "x.png", "--dpi", "2"}, `--dpi "2": must be between 36 and 1200`},
		{[]string{"-o", "x.png", "--units", "ghz-in"}, "use ghz-cm, ghz-mm or mhz-in"},
		{[]string{"-o", "x.png", "--axes", "log"}, "use squared or linear"},
		{[]string{"-o", "x.png", "--ratio-range", "3:1"}, `--ratio-range "3:1"`},
		{[]string{"-o", "x.png", "--freq", "5GHz"}, "give --mode too"},
		{[]string{"-o", "x.png", "--mode", "TE011", "--freq", "5GHz"}, "exactly one of --ratio, --diameter or --length"},
		{[]string{"-o", "x.png", "--ratio", "1"}, "--ratio sizes the cavity together with --freq"},
		{[]string{"-o", "x.png", "--tuning", "2%"}, "need --mode"},
		{[]string{"-o", "x.png", "--mode", "TE011", "--diameter", "40mm", "--length", "30mm", "--tuning", "80%"}, `--tuning "80%"`},
		{[]string{"-o", "x.png", "--mode", "TE011", "--freq", "1GHz", "--diameter", "1mm"}, "--freq \"1GHz\" with --diameter \"1mm\""},
	} {
		_, err := parse(t, c.args...)
		if err == nil || !strings.Contains(err.Error(), c.want) || !cmdutil.IsUsage(err) {
			t.Errorf("chart %v: error %v, want a usage error containing %q", c.args, err, c.want)
		}
	}
}

func TestHelpHasExample(t *testing.T) {
	r := clitest.Run(t, "chart", "--help")
	if r.Code != 0 || !strings.Contains(r.Stdout, "$ cylcav chart --diameter 39.6mm") || !strings.Contains(r.Stdout, "n azimuthal, m radial, p axial") {
		t.Errorf("help lacks the worked example or the index convention:\n%s", r.Stdout)
	}
}

// TestAgreesWithDesign: given the same mode, frequency, tuning, tolerance
// and required clearance, chart and design print the same worst-case
// clearance sentence (the one library verdict, cavity.Reach). The first
// case is the example of the trust pass: a box-shaped operating region
// flagged TE112 within 7 % although the tuning path never comes closer
// than 7.231 % (design's exact worst case before and after the change);
// the second adds a machining tolerance that breaks the requirement.
func TestAgreesWithDesign(t *testing.T) {
	for _, tc := range []struct {
		extra []string
		want  string
	}{
		{[]string{"--min-clearance", "7%"}, "worst over tuning 7.231 % (TE112, TE311); required 7 %: met"},
		{[]string{"--min-clearance", "7.1%", "--tolerance", "0.05mm"}, "worst over tuning and machining tolerance 7.040 % (TE112); required 7.1 %: NOT met: TE112 7.040 %"},
	} {
		design := append([]string{"design", "--mode", "TE011", "--freq", "10GHz", "--tuning", "0.5%", "--samples", "1000"}, tc.extra...)
		if len(tc.extra) == 2 { // --samples needs --tolerance
			design = append([]string{"design", "--mode", "TE011", "--freq", "10GHz", "--tuning", "0.5%"}, tc.extra...)
		}
		r := clitest.Run(t, append(design, "--format", "json")...)
		if r.Code != 0 {
			t.Fatalf("design %v: exit %d, %s", tc.extra, r.Code, r.Stderr)
		}
		var d struct {
			D float64 `json:"diameter_m"`
			L float64 `json:"length_m"`
		}
		if err := json.Unmarshal([]byte(r.Stdout), &d); err != nil {
			t.Fatal(err)
		}
		table := clitest.Run(t, design...)
		path := filepath.Join(t.TempDir(), "c.svg")
		c := clitest.Run(t, append([]string{"chart", "--mode", "TE011", "--diameter", strconv.FormatFloat(d.D*1e3, 'g', 17, 64) + "mm",
			"--length", strconv.FormatFloat(d.L*1e3, 'g', 17, 64) + "mm", "--tuning", "0.5%", "-o", path}, tc.extra...)...)
		if c.Code != 0 {
			t.Fatalf("chart %v: exit %d, %s", tc.extra, c.Code, c.Stderr)
		}
		for name, out := range map[string]string{"design": table.Stdout, "chart": c.Stdout} {
			if !strings.Contains(out, tc.want) {
				t.Errorf("%s %v: output lacks %q:\n%s", name, tc.extra, tc.want, out)
			}
		}
	}
}
