package report_test

import (
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
)

// The PDF datasheet is checked as a reader sees it, with the poppler tools
// (Debian package poppler-utils): pdffonts lists the fonts, pdftotext the
// text of each page and the boxes it fills.

// minPageFill is the least part of a page's text area (from the top
// margin down to the footer) a datasheet page must fill: a page less than
// a quarter full (a stray bullet, a lone caption) reads as a layout fault
// (common practice in typesetting, which avoids such widow pages).
const minPageFill = 0.25

// Page geometry of the PDF datasheet, points (1 mm = 72/25.4 pt): the text
// area starts 15 mm from the top; the footer starts 20 mm from the bottom.
const (
	pageTop    = 15 * 72 / 25.4
	pageFooter = 20 * 72 / 25.4
)

// poppler returns the output of a poppler tool, skipping the test when the
// tool is not installed (clitest.Poppler).
func poppler(t *testing.T, tool string, args ...string) string {
	t.Helper()
	return clitest.Poppler(t, tool, args...)
}

// sheets writes the demo datasheet and one for an accelerator cavity
// (TM010 at 1.3 GHz in copper: fewer modes near the band, other tables)
// and returns the HTML and PDF paths of each.
func sheets(t *testing.T) map[string][2]string {
	t.Helper()
	dir := t.TempDir()
	out := map[string][2]string{}
	for name, flags := range map[string][]string{
		"demo":  nil,
		"tm010": {"--mode", "TM010", "--freq", "1.3GHz", "--wall", "copper"},
	} {
		html, pdf := filepath.Join(dir, name+".html"), filepath.Join(dir, name+".pdf")
		if r := clitest.Run(t, append([]string{"report", "-o", html, "--pdf", pdf}, flags...)...); r.Code != 0 {
			t.Fatalf("report %s: exit %d, %s", name, r.Code, r.Stderr)
		}
		out[name] = [2]string{html, pdf}
	}
	return out
}

// TestPDFFontsEmbedded checks with pdffonts that every font of the PDF
// datasheet is embedded, so it prints and displays the same everywhere.
func TestPDFFontsEmbedded(t *testing.T) {
	for name, f := range sheets(t) {
		lines := strings.Split(strings.TrimSpace(poppler(t, "pdffonts", f[1])), "\n")
		// A header line, a rule, then one line per font; the column
		// "emb" is the fourth from the right (emb sub uni object ID).
		if len(lines) < 3 {
			t.Errorf("%s: pdffonts lists no font:\n%s", name, strings.Join(lines, "\n"))
			continue
		}
		for _, l := range lines[2:] {
			fs := strings.Fields(l)
			if len(fs) < 6 || fs[len(fs)-5] != "yes" {
				t.Errorf("%s: font not embedded: %s", name, l)
			}
		}
	}
}

var (
	// htmlSection matches a numbered section heading of the HTML datasheet.
	htmlSection = regexp.MustCompile(`<h2><span class="num">(\d+)</span>([^<]+)</h2>`)
	// pdfSection matches the same heading in pdftotext -layout output: the
	// number and the title alone on a line at the left margin.
	pdfSection = regexp.MustCompile(`(?m)^ {0,2}(\d{1,2}) +([A-Z][A-Za-z -]+)$`)
	// bboxPage and bboxBlock read pdftotext -bbox-layout output.
	bboxPage  = regexp.MustCompile(`<page width="[\d.]+" height="([\d.]+)">`)
	bboxBlock = regexp.MustCompile(`<block xMin="[\d.]+" yMin="([\d.]+)" xMax="[\d.]+" yMax="([\d.]+)">`)
)

// TestPDFSectionOrder checks that the PDF datasheet has the sections of the
// HTML one, each once, in the same order.
func TestPDFSectionOrder(t *testing.T) {
	for name, f := range sheets(t) {
		html, err := os.ReadFile(f[0])
		if err != nil {
			t.Fatal(err)
		}
		var want []string
		for _, m := range htmlSection.FindAllStringSubmatch(string(html), -1) {
			want = append(want, m[1]+" "+m[2])
		}
		var got []string
		text := strings.ReplaceAll(poppler(t, "pdftotext", "-layout", f[1], "-"), "\f", "\n")
		for _, m := range pdfSection.FindAllStringSubmatch(text, -1) {
			got = append(got, m[1]+" "+m[2])
		}
		if len(want) < 9 || strings.Join(got, " | ") != strings.Join(want, " | ") {
			t.Errorf("%s: PDF sections\n  %s\nwant the HTML ones\n  %s", name, strings.Join(got, " | "), strings.Join(want, " | "))
		}
	}
}

// TestPDFNoNearEmptyPage checks that every page of the PDF datasheet fills
// at least minPageFill of its text area: the lowest text on the page (a
// chart's caption lies under the chart) measured from the top margin,
// against the height down to the footer.
func TestPDFNoNearEmptyPage(t *testing.T) {
	for name, f := range sheets(t) {
		pages := strings.Split(poppler(t, "pdftotext", "-bbox-layout", f[1], "-"), "<page ")[1:]
		if len(pages) < 4 {
			t.Errorf("%s: %d pages, want at least 4", name, len(pages))
		}
		for i, pg := range pages {
			m := bboxPage.FindStringSubmatch("<page " + pg)
			if m == nil {
				t.Fatalf("%s page %d: no page size in pdftotext output", name, i+1)
			}
			h, _ := strconv.ParseFloat(m[1], 64)
			bottom := 0.0
			for _, b := range bboxBlock.FindAllStringSubmatch(pg, -1) {
				y0, _ := strconv.ParseFloat(b[1], 64)
				y1, _ := strconv.ParseFloat(b[2], 64)
				if y0 < h-pageFooter {
					bottom = max(bottom, y1)
				}
			}
			if fill := (bottom - pageTop) / (h - pageFooter - pageTop); fill < minPageFill {
				t.Errorf("%s page %d of %d: content fills %.0f %% of the page, want at least %.0f %%", name, i+1, len(pages), 100*fill, 100*minPageFill)
			}
		}
	}
}
