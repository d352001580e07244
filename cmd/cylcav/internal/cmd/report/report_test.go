package report_test

import (
	"bytes"
	"encoding/json"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/report"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/figure/rendertest"
	"cylcav/physics"
)

// demo writes the demo datasheet (HTML and PDF) into a temporary folder.
func demo(t *testing.T) (html, pdf string) {
	t.Helper()
	dir := t.TempDir()
	html, pdf = filepath.Join(dir, "sheet.html"), filepath.Join(dir, "sheet.pdf")
	r := clitest.Run(t, "report", "-o", html, "--pdf", pdf)
	if r.Code != 0 {
		t.Fatalf("report: exit %d, stderr %q", r.Code, r.Stderr)
	}
	if !strings.Contains(r.Stdout, "wrote "+html) || !strings.Contains(r.Stdout, "demo scenario") {
		t.Errorf("report output = %q", r.Stdout)
	}
	return html, pdf
}

// TestDemoDatasheet checks the content and form of the demo datasheet:
// every section the issue asks for, four inline charts, no script and no
// external resource, balanced elements, and the same bytes on a second run.
func TestDemoDatasheet(t *testing.T) {
	html, pdf := demo(t)
	b, err := os.ReadFile(html)
	if err != nil {
		t.Fatal(err)
	}
	s := string(b)
	for _, want := range []string{
		"<!DOCTYPE html>", "Demo scenario", "Dimensions and tolerances", "Mode chart", "Modes near the band",
		"Spurious-mode clearance", "Unloaded Q", "Sensitivities", "Machining tolerance", "Tuning",
		"Materials and their sources", "Source:", "Index convention", "n is the azimuthal index",
		"m the radial index", "p the axial index", "RF burns", "High voltage", "multipaction", "Cryogenics",
		"local codes", "licensed practice", "@media print", "@page", "TE011/TM111",
	} {
		if !strings.Contains(s, want) {
			t.Errorf("datasheet lacks %q", want)
		}
	}
	if n := strings.Count(s, "<svg"); n != 4 {
		t.Errorf("datasheet has %d inline SVG charts, want 4", n)
	}
	// The RF caution stands once, in the safety notes: the one-line form
	// that `cylcav design` adds to its cautions is not repeated here.
	if n := strings.Count(strings.ToLower(s), "high rf power"); n != 1 {
		t.Errorf("datasheet mentions high RF power %d times, want once (the safety note)", n)
	}
	for _, el := range []string{"table", "figure", "svg", "section", "ul"} {
		if o, c := strings.Count(s, "<"+el), strings.Count(s, "</"+el+">"); o != c {
			t.Errorf("<%s> opened %d times, closed %d times", el, o, c)
		}
	}
	if strings.Contains(s, "<script") {
		t.Error("datasheet contains a script")
	}
	if m := regexp.MustCompile(`(?i)(src|href)\s*=\s*"(https?:|//)`).FindString(s); m != "" {
		t.Errorf("datasheet loads an external resource: %s", m)
	}
	p, err := os.ReadFile(pdf)
	if err != nil {
		t.Fatal(err)
	}
	rendertest.PDF(t, p)
	if n := bytes.Count(p, []byte("/Type /Page\n")); n < 4 {
		t.Errorf("PDF datasheet has %d pages, want at least 4", n)
	}
	html2, pdf2 := demo(t)
	for _, pair := range [][2]string{{html, html2}, {pdf, pdf2}} {
		a, _ := os.ReadFile(pair[0])
		b, _ := os.ReadFile(pair[1])
		if !bytes.Equal(a, b) {
			t.Errorf("%s differs between two runs", filepath.Ext(pair[0]))
		}
	}
}

// TestSameDesignAsDesignCommand checks that report solves the problem of
// its design flags exactly as `cylcav design` does.
func TestSameDesignAsDesignCommand(t *testing.T) {
	flags := []string{"--mode", "TE011", "--freq", "10GHz", "--wall", "copper", "--ratio-range", "0.6:2.5",
		"--tuning", "1%", "--tolerance", "0.02mm", "--samples", "2000"}
	r := clitest.Run(t, append([]string{"design", "--format", "json"}, flags...)...)
	if r.Code != 0 {
		t.Fatalf("design: exit %d, %s", r.Code, r.Stderr)
	}
	var d struct {
		DiameterM float64 `json:"diameter_m"`
		LengthM   float64 `json:"length_m"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &d); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "s.html")
	if r := clitest.Run(t, append([]string{"report", "-o", path}, flags...)...); r.Code != 0 {
		t.Fatalf("report: exit %d, %s", r.Code, r.Stderr)
	}
	b, _ := os.ReadFile(path)
	s := string(b)
	for _, want := range []string{
		"D = " + physics.FormatLength(d.DiameterM, 6), "L = " + physics.FormatLength(d.LengthM, 6),
		"Cavity datasheet: TE011 at 10.00000 GHz", "copper",
	} {
		if !strings.Contains(s, want) {
			t.Errorf("datasheet lacks %q (design gave D = %g m, L = %g m)", want, d.DiameterM, d.LengthM)
		}
	}
	if strings.Contains(s, "Demo scenario") {
		t.Error("a datasheet of given flags says it is the demo")
	}
}

// TestNoWall checks a design without a wall metal: no Q section and no Q
// chart, and the caution that says why.
func TestNoWall(t *testing.T) {
	path := filepath.Join(t.TempDir(), "s.html")
	if r := clitest.Run(t, "report", "-o", path, "--mode", "TM010", "--freq", "2.45GHz"); r.Code != 0 {
		t.Fatalf("report: exit %d, %s", r.Code, r.Stderr)
	}
	b, _ := os.ReadFile(path)
	s := string(b)
	if n := strings.Count(s, "<svg"); n != 2 {
		t.Errorf("datasheet without a wall has %d charts, want 2 (no Q0 chart, and no tuning chart: an end plate does not tune TM010)", n)
	}
	if strings.Contains(s, "Unloaded Q</h2>") || !strings.Contains(s, "No wall metal given") {
		t.Error("datasheet without a wall: want no Q section and the caution about the missing wall")
	}
}

func TestReportErrors(t *testing.T) {
	dir := t.TempDir()
	html := filepath.Join(dir, "a.html")
	for _, c := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"report"}, 2, "missing -o/--output"},
		{[]string{"report", "-o", filepath.Join(dir, "a.txt")}, 2, "end the file name in .html"},
		{[]string{"report", "-o", html, "--pdf", filepath.Join(dir, "a.ps")}, 2, "end the file name in .pdf"},
		{[]string{"report", "-o", html, "--format", "json"}, 2, "unknown flag: --format"},
		{[]string{"report", "-o", html, "--mode", "TE011", "--freq", "ten"}, 2, `--freq "ten"`},
		{[]string{"report", "-o", html, "--mode", "TE011"}, 2, "needs --mode and --freq"},
		// No D/L in 0.9..1.0 gives 20 % clearance: an impossible design.
		{[]string{"report", "-o", html, "--mode", "TE011", "--freq", "10GHz", "--ratio-range", "0.9:1", "--min-clearance", "20%"}, 1, "no design meets"},
	} {
		r := clitest.Run(t, c.args...)
		if r.Code != c.code || !strings.Contains(r.Stderr, c.want) {
			t.Errorf("%v: exit %d, stderr %q; want %d and %q", c.args, r.Code, r.Stderr, c.code, c.want)
		}
	}
	if _, err := os.Stat(html); err == nil {
		t.Error("a failed run left a datasheet")
	}
	// An existing file is kept without --force, replaced with it.
	if err := os.WriteFile(html, []byte("keep"), 0o644); err != nil {
		t.Fatal(err)
	}
	if r := clitest.Run(t, "report", "-o", html); r.Code != 2 || !strings.Contains(r.Stderr, "--force") {
		t.Errorf("existing file: exit %d, stderr %q", r.Code, r.Stderr)
	}
	if b, _ := os.ReadFile(html); string(b) != "keep" {
		t.Error("existing datasheet replaced without --force")
	}
	if r := clitest.Run(t, "report", "-o", html, "--force"); r.Code != 0 {
		t.Errorf("--force: exit %d, %s", r.Code, r.Stderr)
	}
}

// TestFlagsAreDesigns checks that report offers every design flag but
// --format, with design's defaults.
func TestFlagsAreDesigns(t *testing.T) {
	var out bytes.Buffer
	r := report.NewCmdReport(cmdutil.Test(&out, &out), nil)
	for _, name := range []string{"mode", "freq", "fill", "wall", "ratio-range", "objective", "min-clearance", "min-q",
		"max-diameter", "tuning", "temp", "tolerance", "samples", "seed", "count-degenerate", "output", "pdf", "force"} {
		if r.Flags().Lookup(name) == nil {
			t.Errorf("report lacks --%s", name)
		}
	}
	if r.Flags().Lookup("format") != nil {
		t.Error("report offers --format, which has no meaning for it")
	}
	if f := r.Flags().Lookup("ratio-range"); f == nil || f.DefValue != "0.5:3" {
		t.Errorf("--ratio-range default = %v, want design's 0.5:3", f)
	}
}

// The browser helpers live in clitest, shared with the filter datasheet's
// tests.
const chromium = clitest.Chromium

// runProbe returns the probe's SVG count, hidden count and errors as text.
func runProbe(t *testing.T, dir, name, page string) []string {
	t.Helper()
	svgs, hidden, errs := clitest.ChromiumProbe(t, dir, name, page)
	return []string{strconv.Itoa(svgs), strconv.Itoa(hidden), errs}
}

// TestDatasheetInChromium opens the demo datasheet in headless Chromium:
// its four charts must be laid out with a visible size, the page must log
// no error, and a screenshot (kept in the test's temporary folder) must
// show ink. A page with a deliberate error checks that errors are seen.
func TestDatasheetInChromium(t *testing.T) {
	if _, err := exec.LookPath(chromium); err != nil {
		t.Skip("chromium not found on PATH: install the Debian package chromium to run this test")
	}
	html, _ := demo(t)
	b, err := os.ReadFile(html)
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()

	got := runProbe(t, dir, "probe.html", string(b))
	if got[0] != "4" || got[1] != "0" || got[2] != "[]" {
		t.Errorf("in Chromium: %s SVG charts, %s without visible size, errors %s; want 4, 0, []", got[0], got[1], got[2])
	}
	// The probe must see an error when there is one.
	bad := strings.Replace(string(b), "</body>", "<script>undefinedFunctionForTheTest()</script></body>", 1)
	if got := runProbe(t, dir, "bad.html", bad); got[2] == "[]" {
		t.Error("the probe missed a deliberate script error")
	}

	// Screenshot of the datasheet as shipped, with console logging on
	// (clitest.ChromiumScreenshot fails on any console message).
	shot := filepath.Join(dir, "datasheet.png")
	if dark := clitest.ChromiumScreenshot(t, dir, html, shot, 1000, 2400); dark < 500 {
		t.Errorf("screenshot is nearly blank (%d dark samples)", dark)
	}
	t.Logf("screenshot: %s", shot)
}

// TestOneWorstCase: the datasheet's clearance section, its tuning table and
// `design` with the same flags print the same worst-case clearance and
// mode (the one verdict, cavity.Reach). Before, the tuning table spanned
// the tuning range widened by half and disagreed with section 4.
func TestOneWorstCase(t *testing.T) {
	args := []string{"--mode", "TE011", "--freq", "10GHz", "--tuning", "1%", "--temp", "-20C:60C", "--alpha-side", "23ppm",
		"--tolerance", "0.02mm", "--samples", "1000"}
	path := filepath.Join(t.TempDir(), "s.html")
	if r := clitest.Run(t, append([]string{"report", "-o", path}, args...)...); r.Code != 0 {
		t.Fatalf("report: exit %d, %s", r.Code, r.Stderr)
	}
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	s := string(b)
	sec4 := regexp.MustCompile(`Worst over tuning, temperature and machining tolerance</td>\s*<td[^>]*>([0-9.]+ %), set by (\w+)`).FindStringSubmatch(s)
	tab := regexp.MustCompile(`over the reachable set \(tuning, temperature and machining tolerance\), as spacings at the nominal diameter; worst clearance ([0-9.]+ %) at L = [^(]*\((\w+)\)`).FindStringSubmatch(s)
	if sec4 == nil || tab == nil {
		t.Fatalf("datasheet lacks the worst case in section 4 (%v) or the tuning table (%v)", sec4, tab)
	}
	if sec4[1] != tab[1] || sec4[2] != tab[2] {
		t.Errorf("section 4 worst %s (%s), tuning table %s (%s); want the same", sec4[1], sec4[2], tab[1], tab[2])
	}
	d := clitest.Run(t, append([]string{"design"}, args...)...)
	want := "worst over tuning, temperature and machining tolerance " + strings.TrimSuffix(sec4[1], " %")
	if !strings.Contains(d.Stdout, want) || !strings.Contains(d.Stdout, "("+sec4[2]+")") {
		t.Errorf("design prints a different worst case from the datasheet's %s (%s):\n%s", sec4[1], sec4[2], d.Stdout)
	}
}
