package report_test

import (
	"os"
	"path/filepath"
	"regexp"
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
// datasheet is embedded, so it prints and displays the same everywhere
// (clitest.CheckPDFFonts).
func TestPDFFontsEmbedded(t *testing.T) {
	for _, f := range sheets(t) {
		clitest.CheckPDFFonts(t, f[1])
	}
}

var (
	// htmlSection matches a numbered section heading of the HTML datasheet.
	htmlSection = regexp.MustCompile(`<h2><span class="num">(\d+)</span>([^<]+)</h2>`)
	// pdfSection matches the same heading in pdftotext -layout output: the
	// number and the title alone on a line at the left margin.
	pdfSection = regexp.MustCompile(`(?m)^ {0,2}(\d{1,2}) +([A-Z][A-Za-z -]+)$`)
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
// at least minPageFill of its text area (clitest.PDFPageFills).
func TestPDFNoNearEmptyPage(t *testing.T) {
	for name, f := range sheets(t) {
		fills := clitest.PDFPageFills(t, f[1])
		if len(fills) < 4 {
			t.Errorf("%s: %d pages, want at least 4", name, len(fills))
		}
		for i, fill := range fills {
			if fill < minPageFill {
				t.Errorf("%s page %d of %d: content fills %.0f %% of the page, want at least %.0f %%", name, i+1, len(fills), 100*fill, 100*minPageFill)
			}
		}
	}
}
