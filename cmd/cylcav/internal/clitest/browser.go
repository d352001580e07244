package clitest

import (
	"bytes"
	"context"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"
)

// Checks of the datasheets as readers see them: the poppler tools (Debian
// package poppler-utils) for the PDF, headless Chromium (Debian package
// chromium) for the HTML. Each skips its test when the tool is missing.

// Chromium is the browser the datasheet tests run.
const Chromium = "chromium"

// Poppler returns the output of a poppler tool (pdffonts, pdftotext,
// pdftoppm), skipping the test when the tool is not installed.
func Poppler(t *testing.T, tool string, args ...string) string {
	t.Helper()
	if _, err := exec.LookPath(tool); err != nil {
		t.Skipf("%s not found: install poppler-utils (apt-get install -y poppler-utils) to check the PDF datasheet", tool)
	}
	out, err := exec.Command(tool, args...).Output()
	if err != nil {
		t.Fatalf("%s %s: %v", tool, strings.Join(args, " "), err)
	}
	return string(out)
}

// CheckPDFFonts checks with pdffonts that the PDF at path lists fonts and
// embeds every one, so it prints and displays the same everywhere.
func CheckPDFFonts(t *testing.T, path string) {
	t.Helper()
	lines := strings.Split(strings.TrimSpace(Poppler(t, "pdffonts", path)), "\n")
	// A header line, a rule, then one line per font; the column "emb" is
	// the fifth from the right (emb sub uni object ID).
	if len(lines) < 3 {
		t.Errorf("%s: pdffonts lists no font:\n%s", path, strings.Join(lines, "\n"))
		return
	}
	for _, l := range lines[2:] {
		fs := strings.Fields(l)
		if len(fs) < 6 || fs[len(fs)-5] != "yes" {
			t.Errorf("%s: font not embedded: %s", path, l)
		}
	}
}

// ChromiumArgs are the flags for a quiet, self-contained headless run.
func ChromiumArgs(profile string, extra ...string) []string {
	return append([]string{"--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
		"--disable-background-networking", "--disable-component-update", "--disable-sync", "--hide-scrollbars",
		"--user-data-dir=" + profile}, extra...)
}

// probe wraps a page with a script that records errors from the start and,
// once loaded, writes the number of SVG charts, how many have no visible
// size, and the errors into the DOM.
func probe(page string) string {
	head := `<script>window.__errs=[];addEventListener('error',function(e){__errs.push(String(e.message))});` +
		`(function(){var ce=console.error;console.error=function(){__errs.push(Array.prototype.join.call(arguments,' '));ce.apply(console,arguments)}})();</script>`
	tail := `<script>addEventListener('load',function(){var s=document.querySelectorAll('svg'),bad=0;` +
		`for(var i=0;i<s.length;i++){var r=s[i].getBoundingClientRect();if(!(r.width>100&&r.height>100))bad++}` +
		`var p=document.createElement('pre');p.textContent='PROBE svgs='+s.length+' hidden='+bad+' errors='+JSON.stringify(__errs);` +
		`document.body.appendChild(p)});</script>`
	page = strings.Replace(page, "<head>", "<head>"+head, 1)
	return strings.Replace(page, "</body>", tail+"</body>", 1)
}

var probeRE = regexp.MustCompile(`PROBE svgs=(\d+) hidden=(\d+) errors=(\[.*?\])`)

// ChromiumProbe opens page (an HTML document), written as dir/name, in
// headless Chromium and returns the number of SVG charts, the number of
// them without a visible size, and the page's errors as a JSON list ("[]"
// for none). The caller skips when Chromium is missing (HaveChromium).
func ChromiumProbe(t *testing.T, dir, name, page string) (svgs, hidden int, errs string) {
	t.Helper()
	path := filepath.Join(dir, name)
	if err := os.WriteFile(path, []byte(probe(page)), 0o644); err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithTimeout(context.Background(), 60*time.Second)
	defer cancel()
	cmd := exec.CommandContext(ctx, Chromium, ChromiumArgs(filepath.Join(dir, "profile-"+name), "--virtual-time-budget=3000", "--dump-dom", "file://"+path)...)
	var out, errOut bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errOut
	if err := cmd.Run(); err != nil {
		t.Fatalf("chromium --dump-dom: %v\n%s", err, errOut.String())
	}
	m := probeRE.FindStringSubmatch(out.String())
	if m == nil {
		t.Fatalf("%s: no probe result in the DOM dump (%d bytes)", name, out.Len())
	}
	svgs, _ = strconv.Atoi(m[1])
	hidden, _ = strconv.Atoi(m[2])
	return svgs, hidden, m[3]
}

// HaveChromium skips the test when Chromium is not on the PATH.
func HaveChromium(t *testing.T) {
	t.Helper()
	if _, err := exec.LookPath(Chromium); err != nil {
		t.Skip("chromium not found on PATH: install the Debian package chromium to run this test")
	}
}

// ChromiumScreenshot takes a screenshot of the HTML file at path
// (width x height pixels) into shot with console logging on, fails the
// test on any console message of the page, and returns the number of dark
// samples (every fourth pixel in each direction) as a measure of ink.
func ChromiumScreenshot(t *testing.T, dir, path, shot string, width, height int) int {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 60*time.Second)
	defer cancel()
	cmd := exec.CommandContext(ctx, Chromium, ChromiumArgs(filepath.Join(dir, "profile-shot"),
		"--enable-logging=stderr", "--v=0", "--screenshot="+shot, "--window-size="+strconv.Itoa(width)+","+strconv.Itoa(height), "file://"+path)...)
	var errOut bytes.Buffer
	cmd.Stderr = &errOut
	if err := cmd.Run(); err != nil {
		t.Fatalf("chromium --screenshot: %v\n%s", err, errOut.String())
	}
	for _, line := range strings.Split(errOut.String(), "\n") {
		if strings.Contains(line, ":CONSOLE") {
			t.Errorf("console message from the page: %s", line)
		}
	}
	return DarkSamples(t, shot)
}

// DarkSamples returns the number of dark pixels among every fourth pixel
// in each direction of the PNG file at path.
func DarkSamples(t *testing.T, path string) int {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatalf("%s does not decode as PNG: %v", path, err)
	}
	dark := 0
	bnd := img.Bounds()
	for y := bnd.Min.Y; y < bnd.Max.Y; y += 4 {
		for x := bnd.Min.X; x < bnd.Max.X; x += 4 {
			if r, g, b, _ := img.At(x, y).RGBA(); r+g+b < 3*0x4000 {
				dark++
			}
		}
	}
	return dark
}

// Page geometry of the PDF datasheets, points (1 mm = 72/25.4 pt): the
// text area starts 15 mm from the top; the footer starts 20 mm from the
// bottom.
const (
	pdfPageTop    = 15 * 72 / 25.4
	pdfPageFooter = 20 * 72 / 25.4
)

var (
	// bboxPage and bboxBlock read pdftotext -bbox-layout output.
	bboxPage  = regexp.MustCompile(`<page width="[\d.]+" height="([\d.]+)">`)
	bboxBlock = regexp.MustCompile(`<block xMin="[\d.]+" yMin="([\d.]+)" xMax="[\d.]+" yMax="([\d.]+)">`)
)

// PDFPageFills returns, for each page of the PDF datasheet at path, the
// part of its text area that is used: the lowest text on the page (a
// chart's caption lies under the chart) measured from the top margin,
// against the height down to the footer (pdftotext -bbox-layout).
func PDFPageFills(t *testing.T, path string) []float64 {
	t.Helper()
	var out []float64
	pages := strings.Split(Poppler(t, "pdftotext", "-bbox-layout", path, "-"), "<page ")[1:]
	for i, pg := range pages {
		m := bboxPage.FindStringSubmatch("<page " + pg)
		if m == nil {
			t.Fatalf("%s page %d: no page size in pdftotext output", path, i+1)
		}
		h, _ := strconv.ParseFloat(m[1], 64)
		bottom := 0.0
		for _, b := range bboxBlock.FindAllStringSubmatch(pg, -1) {
			y0, _ := strconv.ParseFloat(b[1], 64)
			y1, _ := strconv.ParseFloat(b[2], 64)
			if y0 < h-pdfPageFooter {
				bottom = max(bottom, y1)
			}
		}
		out = append(out, (bottom-pdfPageTop)/(h-pdfPageFooter-pdfPageTop))
	}
	return out
}
