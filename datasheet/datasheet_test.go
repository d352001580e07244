package datasheet_test

import (
	"bytes"
	"regexp"
	"strings"
	"testing"

	"cylcav/cavity"
	"cylcav/datasheet"
	"cylcav/design"
	"cylcav/figure"
	"cylcav/figure/rendertest"
)

// sample is a sheet of another kind than a cavity design, built from
// sections alone, as a filter datasheet would be.
func sample() *datasheet.Sheet {
	t := datasheet.Table{Caption: "Couplings", Header: []string{"Pair", "k"}, Rows: [][]string{{"1–2", "0.0123"}, {"2–3", "<0.01 & rising"}}, Emph: []bool{false, true}, Num: []bool{false, true}}
	return &datasheet.Sheet{
		Version: "test", Kind: "Filter datasheet", Title: "A sample", Headline: "four resonators at 10 GHz",
		Notice: &datasheet.Notice{Lead: "Sample", Parts: []datasheet.Span{{Text: "made by "}, {Text: "a test", Code: true}}},
		Facts:  []datasheet.KV{{Key: "Order", Value: "4"}},
		Sections: []datasheet.Section{
			{Heading: "Couplings", Blocks: []datasheet.Block{{Table: &t}, {Note: "k = FBW M"}}},
			{Heading: "Notes", Blocks: []datasheet.Block{{Para: "A paragraph."}, {List: &datasheet.List{Lead: "Mind:", Class: "cautions", Items: []string{"one", "two"}}}}},
			{Heading: "Materials", Blocks: []datasheet.Block{{Materials: []datasheet.Material{{Role: "Wall", Name: "copper", Source: "a handbook"}}}}},
		},
		Method: "Sample method.",
	}
}

// TestSectionsHTML: the HTML numbers the sections 1, 2, 3 in order, sets
// every block, escapes text and balances its elements.
func TestSectionsHTML(t *testing.T) {
	var b bytes.Buffer
	if err := sample().WriteHTML(&b); err != nil {
		t.Fatal(err)
	}
	s := b.String()
	heads := regexp.MustCompile(`<h2><span class="num">(\d+)</span>([^<]*)</h2>`).FindAllStringSubmatch(s, -1)
	want := [][2]string{{"1", "Couplings"}, {"2", "Notes"}, {"3", "Materials"}}
	if len(heads) != len(want) {
		t.Fatalf("HTML has %d section headings, want %d:\n%s", len(heads), len(want), s)
	}
	for i, h := range heads {
		if h[1] != want[i][0] || h[2] != want[i][1] {
			t.Errorf("heading %d = %s %q, want %s %q", i, h[1], h[2], want[i][0], want[i][1])
		}
	}
	for _, w := range []string{
		`<p class="kind">Filter datasheet</p>`, `<strong>Sample.</strong> made by <code>a test</code>`,
		`<td class="num">&lt;0.01 &amp; rising</td>`, `<tr class="emph">`, `<p class="note">k = FBW M</p>`,
		`<p>A paragraph.</p>`, "<p>Mind:</p>\n<ul class=\"cautions\"><li>one</li><li>two</li></ul>",
		`<p class="src"><strong>Source:</strong> a handbook</p>`, `<footer>Made by cylcav test. Sample method.</footer>`,
	} {
		if !strings.Contains(s, w) {
			t.Errorf("HTML lacks %q", w)
		}
	}
	for _, el := range []string{"table", "section", "ul", "h2", "p"} {
		if o, c := strings.Count(s, "<"+el+">")+strings.Count(s, "<"+el+" "), strings.Count(s, "</"+el+">"); o != c {
			t.Errorf("<%s> opened %d times, closed %d times", el, o, c)
		}
	}
}

// TestSectionsPDF: the PDF of the same sheet is a valid PDF, the same
// bytes twice.
func TestSectionsPDF(t *testing.T) {
	var a, b bytes.Buffer
	if err := sample().WritePDF(&a); err != nil {
		t.Fatal(err)
	}
	rendertest.PDF(t, a.Bytes())
	if err := sample().WritePDF(&b); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a.Bytes(), b.Bytes()) {
		t.Error("two PDFs of the same sheet differ")
	}
}

func TestNoticeText(t *testing.T) {
	n := &datasheet.Notice{Lead: "Demo scenario", Parts: []datasheet.Span{{Text: "made by "}, {Text: "cylcav report", Code: true}, {Text: "."}}}
	if got, want := n.Text(), "Demo scenario. made by 'cylcav report'."; got != want {
		t.Errorf("Notice.Text() = %q, want %q", got, want)
	}
}

// TestFromDesignSections: a cavity design without a wall metal has no Q
// section and no Q chart; with one it has both, and the sections keep
// their order.
func TestFromDesignSections(t *testing.T) {
	te011, err := cavity.ParseMode("TE011")
	if err != nil {
		t.Fatal(err)
	}
	headings := func(s design.Scenario) ([]string, int) {
		t.Helper()
		r, err := s.Run(nil)
		if err != nil {
			t.Fatal(err)
		}
		sh, err := datasheet.FromDesign(r, figure.DefaultTheme())
		if err != nil {
			t.Fatal(err)
		}
		var hs []string
		for _, sec := range sh.Sections {
			hs = append(hs, sec.Heading)
		}
		return hs, len(sh.Charts())
	}
	s := design.Scenario{Spec: cavity.DesignSpec{Mode: te011, Frequency: 10e9}, Settings: cavity.AnalysisSettings{CurvePoints: 11}}
	hs, n := headings(s)
	want := "Dimensions and tolerances|Mode chart|Modes near the band|Spurious-mode clearance|Sensitivities and tolerance spread|Tuning|Materials and their sources|Index convention|Cautions"
	if got := strings.Join(hs, "|"); got != want || n != 3 {
		t.Errorf("no wall: sections %q and %d charts, want %q and 3", got, n, want)
	}
	d, err := design.Demo()
	if err != nil {
		t.Fatal(err)
	}
	d.Settings.Tolerance.Samples = 500
	hs, n = headings(d)
	want = "Dimensions and tolerances|Mode chart|Modes near the band|Spurious-mode clearance|Unloaded Q|Sensitivities and tolerance spread|Tuning|Materials and their sources|Index convention|Cautions"
	if got := strings.Join(hs, "|"); got != want || n != 4 {
		t.Errorf("demo: sections %q and %d charts, want %q and 4", got, n, want)
	}
}

// TestNoEmptySection: every section of the cavity datasheets shows
// something a reader can see (a table with rows, a chart, a note, a
// paragraph, a list or materials), for the link demo and for the TM010
// cell demo, whose mode an end plate does not tune: its tuning section
// says so instead of standing empty.
func TestNoEmptySection(t *testing.T) {
	demos := map[string]func() (design.Scenario, error){"link": design.Demo, "cell": design.DemoCell}
	for name, demo := range demos {
		s, err := demo()
		if err != nil {
			t.Fatal(err)
		}
		s.Settings.Tolerance.Samples = 500
		r, err := s.Run(nil)
		if err != nil {
			t.Fatal(err)
		}
		sh, err := datasheet.FromDesign(r, figure.DefaultTheme())
		if err != nil {
			t.Fatal(err)
		}
		for _, sec := range sh.Sections {
			visible := false
			for _, b := range sec.Blocks {
				if (b.Table != nil && len(b.Table.Rows) > 0) || b.Chart != nil || b.Note != "" || b.Para != "" ||
					(b.List != nil && len(b.List.Items) > 0) || len(b.Materials) > 0 {
					visible = true
				}
			}
			if !visible {
				t.Errorf("%s demo: section %q shows nothing", name, sec.Heading)
			}
		}
	}
}

// TestCellOperatingModeRow: in the cell datasheet's mode table the
// operating mode TM010 sits on the second harmonic of the 650 MHz bunch
// frequency by design (1.3 GHz); it is labelled as the operating mode,
// never flagged NEAR like a mode the beam could drive.
func TestCellOperatingModeRow(t *testing.T) {
	s, err := design.DemoCell()
	if err != nil {
		t.Fatal(err)
	}
	s.Settings.Tolerance.Samples = 500
	r, err := s.Run(nil)
	if err != nil {
		t.Fatal(err)
	}
	sh, err := datasheet.FromDesign(r, figure.DefaultTheme())
	if err != nil {
		t.Fatal(err)
	}
	// The Q note of a superconducting cell speaks of the residual
	// resistance, not of the normal-metal roughness allowance.
	qNote := ""
	for _, sec := range sh.Sections {
		if sec.Heading == "Unloaded Q" {
			for _, b := range sec.Blocks {
				qNote += b.Note
			}
		}
	}
	if strings.Contains(qNote, "10–30 %") || !strings.Contains(qNote, "residual resistance") {
		t.Errorf("superconducting Q note %q", qNote)
	}
	// The key figure Q0 (about 1.2e10) to four significant digits: a
	// superconducting Q0 is known to a few per cent at best.
	for _, kv := range sh.Facts {
		if kv.Key == "Unloaded Q0" && !strings.Contains(kv.Value, "e+10") {
			t.Errorf("Unloaded Q0 key figure %q, want four digits in scientific notation", kv.Value)
		}
	}
	found := false
	for _, sec := range sh.Sections {
		for _, b := range sec.Blocks {
			if b.Table == nil {
				continue
			}
			for _, row := range b.Table.Rows {
				if len(row) < 8 || row[0] != "TM010" {
					continue
				}
				found = true
				if last := row[len(row)-1]; !strings.HasPrefix(last, "operating mode: 2 ×") {
					t.Errorf("TM010 harmonic cell %q, want 'operating mode: 2 × ...'", last)
				}
			}
		}
	}
	if !found {
		t.Error("no TM010 row in the cell datasheet's mode table")
	}
}
