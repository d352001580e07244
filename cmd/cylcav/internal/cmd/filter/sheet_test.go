package filter_test

import (
	"bytes"
	"encoding/json"
	"html"
	"image/png"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/datasheet"
	"cylcav/figure/rendertest"
)

// The filter datasheet (--datasheet), checked as a reader sees it.

// channel is the invented scenario of the datasheet tests: a 10 GHz
// channel filter 100 MHz wide, 23 dB return loss, the order chosen for two
// rejections (one transmission zero above the band), and a rejection far
// above the band that the model cannot check; TE011 copper cavities, with
// the three manufacturing analyses. Its verdicts cover pass, fail (the
// cavities' spurious resonances sit in both rejection bands), outside the
// model and info.
var channel = []string{"--f0", "10GHz", "--bw", "100MHz", "--return-loss", "23dB",
	"--reject", "40dB@10.12GHz,35dB@9.88GHz,30dB@12.5GHz", "--zeros", "10.11GHz",
	"--mode", "TE011", "--wall", "copper", "--ratio", "1.2",
	"--tolerance", "5um", "--samples", "300", "--accept-return-loss", "18dB",
	"--temp", "10C:30C", "--rod-metal", "invar", "--power", "200W"}

// sheet runs `cylcav filter args... --datasheet dir/name` and returns the
// file's path and contents.
func sheet(t *testing.T, name string, args ...string) (string, []byte) {
	t.Helper()
	path := filepath.Join(t.TempDir(), name)
	r := clitest.Run(t, append(append([]string{"filter"}, args...), "--datasheet", path)...)
	if r.Code != 0 {
		t.Fatalf("filter --datasheet %s: exit %d, %s", name, r.Code, r.Stderr)
	}
	if !strings.Contains(r.Stdout, "wrote "+path) {
		t.Errorf("the output does not list %s:\n%s", path, r.Stdout)
	}
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return path, b
}

var (
	headingRE = regexp.MustCompile(`<h2><span class="num">(\d+)</span>([^<]+)</h2>`)
	remoteRE  = regexp.MustCompile(`(?i)(src|href)\s*=\s*["']?\s*(https?:|//)`)
)

// headings returns the section headings of an HTML datasheet, in order.
func headings(s string) []string {
	var out []string
	for _, m := range headingRE.FindAllStringSubmatch(s, -1) {
		out = append(out, html.UnescapeString(m[2]))
	}
	return out
}

// checkSelfContained checks that an HTML datasheet loads nothing from
// elsewhere, runs no script and balances its elements.
func checkSelfContained(t *testing.T, s string) {
	t.Helper()
	if m := remoteRE.FindString(s); m != "" {
		t.Errorf("datasheet loads a remote resource: %s", m)
	}
	if strings.Contains(s, "<script") || strings.Contains(s, "<link") || strings.Contains(s, "@import") {
		t.Error("datasheet has a script, a link or an import")
	}
	for _, el := range []string{"table", "figure", "svg", "ul", "h2"} {
		if o, c := strings.Count(s, "<"+el+">")+strings.Count(s, "<"+el+" "), strings.Count(s, "</"+el+">"); o != c {
			t.Errorf("<%s> opened %d times, closed %d times", el, o, c)
		}
	}
}

// TestFilterDatasheetHTML: the channel filter's HTML datasheet has every
// section in order, four inline charts (topology, response, passband,
// wide view), the manufacturing tables, the cautions, and nothing remote;
// a second run gives the same bytes.
func TestFilterDatasheetHTML(t *testing.T) {
	_, b := sheet(t, "ch.html", channel...)
	s := string(b)
	want := []string{datasheet.SecSpec, datasheet.SecTopology, datasheet.SecMatrix, datasheet.SecResonators, datasheet.SecRealisation,
		datasheet.SecResponse, datasheet.SecManufacture, datasheet.SecCautions, datasheet.SecConventions}
	if got := headings(s); strings.Join(got, "|") != strings.Join(want, "|") {
		t.Errorf("sections\n  %q\nwant\n  %q", got, want)
	}
	if n := strings.Count(s, "<svg"); n != 4 {
		t.Errorf("%d inline SVG charts, want 4", n)
	}
	for _, id := range []string{`id="topology"`, `id="response"`, `id="passband"`, `id="wide"`} {
		if !strings.Contains(s, "<figure "+id) {
			t.Errorf("no chart %s", id)
		}
	}
	for _, w := range []string{
		"Verdict per mask line", "Coupling matrix M, normalised", "Physical couplings", "Qext input",
		"Cavities: TE011", "Tuning needed", "Screw tip radius", "Spurious resonances of the cavities",
		"Coupling realisation", "Machining tolerance: Monte Carlo, 300 samples", "Yield as machined",
		"Temperature drift", "Specification at the ends of the temperature range", "Power handling at 200",
		"multipaction", "High RF power", "local codes", "licensed practice", "Mode index convention",
		"Wide view with the cavities", "TM012", "TE112", "@media print",
	} {
		if !strings.Contains(s, w) {
			t.Errorf("datasheet lacks %q", w)
		}
	}
	checkSelfContained(t, s)
	_, b2 := sheet(t, "ch.html", channel...)
	if !bytes.Equal(b, b2) {
		t.Error("two runs give different HTML datasheets")
	}
}

// verdictRows reads the verdict column of the table "Verdict per mask
// line" of an HTML datasheet.
func verdictRows(t *testing.T, s string) (names, verdicts []string) {
	t.Helper()
	i := strings.Index(s, "<caption>Verdict per mask line")
	if i < 0 {
		t.Fatal("no verdict table")
	}
	tbl := s[i:]
	tbl = tbl[:strings.Index(tbl, "</table>")]
	row := regexp.MustCompile(`(?s)<tr[^>]*>(.*?)</tr>`)
	cell := regexp.MustCompile(`(?s)<td[^>]*>(.*?)</td>`)
	for _, r := range row.FindAllStringSubmatch(tbl, -1) {
		cs := cell.FindAllStringSubmatch(r[1], -1)
		if len(cs) == 0 {
			continue // the header row
		}
		names = append(names, html.UnescapeString(cs[0][1]))
		verdicts = append(verdicts, html.UnescapeString(cs[len(cs)-1][1]))
	}
	return names, verdicts
}

// TestFilterDatasheetVerdicts: the verdict of every mask line on the
// datasheet is the one of the JSON output for the same flags (the verdict
// of Design.Check, reached through the command's JSON form), line by line,
// for the channel filter (pass, fail, outside the model, info) and for a
// filter whose order is too low for its rejection.
func TestFilterDatasheetVerdicts(t *testing.T) {
	jsonWord := map[string]string{"pass": "pass", "fail": "fail", "outside_model": "outside model", "info": "info"}
	for name, args := range map[string][]string{
		"channel": channel[:16], // without the manufacturing flags
		"short":   {"--f0", "10GHz", "--bw", "100MHz", "--order", "3", "--reject", "60dB@10.12GHz"},
	} {
		r := clitest.Run(t, append(append([]string{"filter"}, args...), "--format", "json")...)
		if r.Code != 0 {
			t.Fatalf("%s: json exit %d: %s", name, r.Code, r.Stderr)
		}
		var out struct {
			Checks []struct {
				Name    string `json:"name"`
				Verdict string `json:"verdict"`
			} `json:"checks"`
		}
		if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
			t.Fatal(err)
		}
		_, b := sheet(t, name+".html", args...)
		names, got := verdictRows(t, string(b))
		if len(got) != len(out.Checks) {
			t.Fatalf("%s: %d verdict rows, JSON has %d checks", name, len(got), len(out.Checks))
		}
		seen := map[string]bool{}
		for i, c := range out.Checks {
			if w := jsonWord[c.Verdict]; got[i] != w || !strings.HasPrefix(names[i], c.Name) {
				t.Errorf("%s line %d: datasheet %q %q, JSON %q %q", name, i, names[i], got[i], c.Name, c.Verdict)
			}
			seen[c.Verdict] = true
		}
		if name == "channel" && len(seen) != 4 {
			t.Errorf("channel: verdicts %v, want all four kinds", seen)
		}
	}
}

// TestFilterDatasheetLossless: without cavities the datasheet has no
// realisation and no manufacturing section, omits the wide view with a
// stated note, and has three charts.
func TestFilterDatasheetLossless(t *testing.T) {
	_, b := sheet(t, "l.html", "--f0", "2.45GHz", "--bw", "80MHz", "--order", "5", "--ripple", "0.01dB")
	s := string(b)
	want := []string{datasheet.SecSpec, datasheet.SecTopology, datasheet.SecMatrix, datasheet.SecResonators,
		datasheet.SecResponse, datasheet.SecCautions, datasheet.SecConventions}
	if got := headings(s); strings.Join(got, "|") != strings.Join(want, "|") {
		t.Errorf("sections %q, want %q", got, want)
	}
	if n := strings.Count(s, "<svg"); n != 3 {
		t.Errorf("%d charts, want 3", n)
	}
	for _, w := range []string{"Wide view with spurious resonances: omitted", "No cavities were sized"} {
		if !strings.Contains(s, w) {
			t.Errorf("datasheet lacks %q", w)
		}
	}
	checkSelfContained(t, s)
}

// TestFilterDatasheetIrises: with --iris-wall the coupling realisation is
// the iris table with iris.Judge's verdict per coupling: the ports of this
// filter detune their cavities beyond the checked range and have no
// radius; the inter-cavity irises are valid with theirs.
func TestFilterDatasheetIrises(t *testing.T) {
	_, b := sheet(t, "i.html", "--f0", "10GHz", "--bw", "100MHz", "--order", "4", "--mode", "TE011", "--wall", "copper",
		"--ratio", "1.2", "--iris-wall", "2mm")
	s := string(b)
	for _, w := range []string{"Irises and holes (TE011 cavities on one axis, walls 2.00000 mm thick)", "L with irises",
		"mode matching (axisymmetric pair)", "mode matching (open port)", "outside range", "valid", "Couplings not valid as sized"} {
		if !strings.Contains(s, w) {
			t.Errorf("datasheet lacks %q", w)
		}
	}
	// The port rows carry no radius: "–" in the radius column.
	if !regexp.MustCompile(`<td>S–1</td><td class="num">Qext [0-9.]+</td><td>mode matching \(open port\)</td><td class="num">–</td>`).MatchString(s) {
		t.Error("the input port's row shows a radius although its verdict is not valid")
	}
	checkSelfContained(t, s)
}

// TestFilterDatasheetPDF: the PDF datasheet embeds its fonts (pdffonts),
// its first page renders with ink (pdftoppm), no page is nearly empty, and
// its section headings are those of the HTML datasheet, in order
// (pdftotext).
func TestFilterDatasheetPDF(t *testing.T) {
	path, b := sheet(t, "ch.pdf", channel...)
	rendertest.PDF(t, b)
	clitest.CheckPDFFonts(t, path)
	dir := t.TempDir()
	clitest.Poppler(t, "pdftoppm", "-png", "-r", "60", "-f", "1", "-l", "1", path, filepath.Join(dir, "p"))
	pngs, _ := filepath.Glob(filepath.Join(dir, "p*.png"))
	if len(pngs) != 1 {
		t.Fatalf("pdftoppm wrote %v, want one page", pngs)
	}
	if dark := inkSamples(t, pngs[0]); dark < 200 {
		t.Errorf("page 1 is nearly blank (%d dark samples)", dark)
	}
	// Every page fills at least a quarter of its text area (a page less
	// full, a stray bullet or a lone caption, reads as a layout fault:
	// common practice in typesetting, as for the cavity datasheet).
	fills := clitest.PDFPageFills(t, path)
	if len(fills) < 5 {
		t.Errorf("%d pages, want at least 5", len(fills))
	}
	for i, f := range fills {
		if f < 0.25 {
			t.Errorf("page %d of %d fills %.0f %% of its text area, want at least 25 %%", i+1, len(fills), 100*f)
		}
	}
	text := strings.ReplaceAll(clitest.Poppler(t, "pdftotext", "-layout", path, "-"), "\f", "\n")
	last := -1
	for i, h := range []string{datasheet.SecSpec, datasheet.SecTopology, datasheet.SecMatrix, datasheet.SecResonators, datasheet.SecRealisation,
		datasheet.SecResponse, datasheet.SecManufacture, datasheet.SecCautions, datasheet.SecConventions} {
		re := regexp.MustCompile(`(?m)^ {0,2}` + strconv.Itoa(i+1) + ` +` + regexp.QuoteMeta(strings.Split(h, ":")[0]))
		loc := re.FindStringIndex(text[last+1:])
		if loc == nil {
			t.Errorf("PDF lacks section %d %q after the previous one", i+1, h)
			continue
		}
		last += 1 + loc[0]
	}
}

// inkSamples counts the pixels, every fourth in each direction, of a PNG
// file that are clearly not white (small text at a low resolution renders
// grey).
func inkSamples(t *testing.T, path string) int {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	bnd := img.Bounds()
	for y := bnd.Min.Y; y < bnd.Max.Y; y += 4 {
		for x := bnd.Min.X; x < bnd.Max.X; x += 4 {
			if r, g, b, _ := img.At(x, y).RGBA(); r+g+b < 3*0xc000 {
				n++
			}
		}
	}
	return n
}

// TestFilterDatasheetInChromium opens the channel filter's datasheet in
// headless Chromium: four charts laid out with a visible size, no error
// logged, and a screenshot with ink.
func TestFilterDatasheetInChromium(t *testing.T) {
	clitest.HaveChromium(t)
	path, b := sheet(t, "ch.html", channel...)
	dir := t.TempDir()
	svgs, hidden, errs := clitest.ChromiumProbe(t, dir, "probe.html", string(b))
	if svgs != 4 || hidden != 0 || errs != "[]" {
		t.Errorf("in Chromium: %d SVG charts, %d without visible size, errors %s; want 4, 0, []", svgs, hidden, errs)
	}
	if dark := clitest.ChromiumScreenshot(t, dir, path, filepath.Join(dir, "shot.png"), 1200, 3000); dark < 500 {
		t.Errorf("screenshot is nearly blank (%d dark samples)", dark)
	}
}

// TestFilterDatasheetBadInput: a file name of another kind, a file that
// exists without --force, and two flags naming one file are refused with
// exit status 2 before any file is written.
func TestFilterDatasheetBadInput(t *testing.T) {
	dir := t.TempDir()
	base := []string{"--f0", "10GHz", "--bw", "100MHz", "--order", "4"}
	old := filepath.Join(dir, "old.html")
	if err := os.WriteFile(old, []byte("keep"), 0o644); err != nil {
		t.Fatal(err)
	}
	plot := filepath.Join(dir, "new.png")
	clitest.CheckBadInput(t, "filter", []clitest.BadCase{
		{Args: append(append([]string{}, base...), "--datasheet", filepath.Join(dir, "s.txt")), Code: 2, Want: []string{"--datasheet", "s.txt", ".html", ".pdf"}},
		{Args: append(append([]string{}, base...), "--plot", plot, "--datasheet", old), Code: 2, Want: []string{"--datasheet", "old.html", "--force"}},
		{Args: append(append([]string{}, base...), "--plot", filepath.Join(dir, "x.pdf"), "--datasheet", filepath.Join(dir, "x.pdf")), Code: 2, Want: []string{"name the same file"}},
	})
	if b, _ := os.ReadFile(old); string(b) != "keep" {
		t.Error("the existing datasheet was changed")
	}
	if _, err := os.Stat(plot); err == nil {
		t.Error("the plot was written although the datasheet was refused")
	}
	// With --force the existing file is replaced.
	r := clitest.Run(t, append(append([]string{"filter"}, base...), "--datasheet", old, "--force")...)
	if b, _ := os.ReadFile(old); r.Code != 0 || !strings.HasPrefix(string(b), "<!DOCTYPE html>") {
		t.Errorf("--force: exit %d, file starts %.20q", r.Code, b)
	}
}
