package figure

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"

	"cylcav/figure/rendertest"
)

// demoFigure is a page that uses every part of the layer: a bold title, two
// panels with a shared x axis, a shaded region, a curve with a gap, a
// legend of every thumbnail kind, and notes with characters outside ASCII.
func demoFigure(t testing.TB) *Figure {
	t.Helper()
	th := DefaultTheme()
	f := NewFigure(th, "Demo figure: ε and μ, f·D ≥ 3 GHz·cm")
	top := th.NewPlot("", "x   [1]", "sin x   [1]")
	bot := th.NewPlot("", "x   [1]", "cos x   [1]")
	var xs, s, c []float64
	for i := 0; i <= 200; i++ {
		x := 10 * float64(i) / 200
		xs = append(xs, x)
		s = append(s, math.Sin(x))
		c = append(c, math.Cos(x))
	}
	s[100] = math.NaN() // a gap
	r, err := NewRegion(2, 3, -1, 1)
	if err != nil {
		t.Fatal(err)
	}
	r.Fill = Sand
	top.Add(r)
	if _, err := AddCurve(top, xs, s, 1, th.Series(0)); err != nil {
		t.Fatal(err)
	}
	if _, err := AddCurve(bot, xs, c, 1, th.Series(1)); err != nil {
		t.Fatal(err)
	}
	f.Panels = append(f.Panels, top, bot)
	f.Legend.Add("sin x", LineThumb{LineStyle: th.Series(0)})
	f.Legend.Add("cos x", LineThumb{LineStyle: th.Series(1)})
	f.Legend.Add("a region", BoxThumb{Fill: Sand, LineStyle: r.LineStyle})
	f.Legend.Add("a marker", GlyphThumb{GlyphStyle: th.Marker(2)})
	f.Notes = []string{"Notes wrap at the page width; εr, μr, π and ≤ are spelled out in PDF text."}
	return f
}

// TestFormats renders the demo figure in every format, checks each file is
// valid (PNG decodes at the requested resolution, SVG parses as XML, PDF
// has its header, trailer and a valid cross-reference offset) and that
// rendering twice gives the same bytes.
func TestFormats(t *testing.T) {
	pg := Page{Width: 6 * vg.Inch, Height: 4.5 * vg.Inch, DPI: 100}
	for _, f := range []Format{PNG, SVG, PDF} {
		a, err := Encode(demoFigure(t), f, pg)
		if err != nil {
			t.Fatalf("%v: %v", f, err)
		}
		b, err := Encode(demoFigure(t), f, pg)
		if err != nil {
			t.Fatalf("%v: %v", f, err)
		}
		if !bytes.Equal(a, b) {
			t.Errorf("%v: two renders of the same figure differ (%d and %d bytes)", f, len(a), len(b))
		}
		switch f {
		case PNG:
			rendertest.PNG(t, a, 600, 450) // 6 x 4.5 in at 100 dpi
		case SVG:
			rendertest.SVG(t, a)
			if !bytes.Contains(a, []byte("Liberation Sans,Arial,Helvetica,sans-serif")) {
				t.Error("SVG fonts lack the sans-serif fallbacks")
			}
		case PDF:
			rendertest.PDF(t, a)
			if !bytes.Contains(a, []byte("/CreationDate (D:"+FixedPDFDate)) {
				t.Error("PDF creation date not fixed")
			}
			checkPDFXref(t, a)
		}
	}
}

// checkPDFXref checks that the startxref offset points at the xref table,
// which the date rewrite must not disturb.
func checkPDFXref(t *testing.T, b []byte) {
	t.Helper()
	i := bytes.LastIndex(b, []byte("startxref"))
	if i < 0 {
		t.Fatal("PDF has no startxref")
	}
	var off int
	if _, err := fmt.Sscan(string(b[i+len("startxref"):]), &off); err != nil {
		t.Fatalf("PDF startxref: %v", err)
	}
	if off <= 0 || off >= len(b) || !bytes.HasPrefix(b[off:], []byte("xref")) {
		t.Errorf("PDF startxref %d does not point at the xref table", off)
	}
}

func TestEncodeAs(t *testing.T) {
	p := DefaultTheme().NewPlot("a plot", "x [1]", "y [1]")
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = 0, 1, 0, 1
	b, err := EncodeAs(p, "plot.svg", Page{Width: 3 * vg.Inch, Height: 2 * vg.Inch})
	if err != nil || !bytes.Contains(b, []byte("<svg")) {
		t.Errorf("EncodeAs(plot.svg) = %d bytes, %v; want an SVG", len(b), err)
	}
	if _, err := EncodeAs(p, "plot.bmp", Page{}); err == nil {
		t.Error("EncodeAs(plot.bmp): no error")
	}
}

func TestPageErrors(t *testing.T) {
	f := demoFigure(t)
	for _, c := range []struct {
		pg   Page
		want string
	}{
		{Page{DPI: 5}, "36..1200 dpi, got 5"},
		{Page{Width: 100 * vg.Inch, Height: 2 * vg.Inch}, "width must be in 1..40 in, got 100 in"},
		{Page{Width: 40 * vg.Inch, Height: 40 * vg.Inch, DPI: 1200}, "megapixel limit"},
	} {
		if _, err := Encode(f, PNG, c.pg); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("Encode(%+v) error = %v, want one containing %q", c.pg, err, c.want)
		}
	}
	if _, err := Encode(f, Format(9), Page{}); err == nil {
		t.Error("Encode with an unknown format: no error")
	}
}

func TestFormatOf(t *testing.T) {
	for _, c := range []struct {
		path string
		want Format
		err  string
	}{
		{"chart.png", PNG, ""}, {"a/b/Chart.SVG", SVG, ""}, {"sheet.pdf", PDF, ""},
		{"chart", 0, "no extension"}, {"chart.jpg", 0, `unknown extension ".jpg"`},
	} {
		got, err := FormatOf(c.path)
		if c.err != "" {
			if err == nil || !strings.Contains(err.Error(), c.err) {
				t.Errorf("FormatOf(%q) error = %v, want %q", c.path, err, c.err)
			}
			continue
		}
		if err != nil || got != c.want {
			t.Errorf("FormatOf(%q) = %v, %v, want %v", c.path, got, err, c.want)
		}
	}
}

func TestInlineSVG(t *testing.T) {
	svg, err := Encode(demoFigure(t), SVG, Page{})
	if err != nil {
		t.Fatal(err)
	}
	in := InlineSVG(svg, "Demo <figure>")
	if bytes.Contains(in, []byte("<?xml")) || !bytes.HasPrefix(in, []byte("<svg")) {
		t.Errorf("inline SVG starts %q, want <svg without the XML declaration", in[:20])
	}
	head := string(in[:bytes.IndexByte(in, '>')])
	if strings.Contains(head, `width="`) || strings.Contains(head, ` height="`) || !strings.Contains(head, "viewBox=") {
		t.Errorf("inline SVG start tag %q: want no width/height and a viewBox", head)
	}
	if !bytes.Contains(in, []byte("<title>Demo &lt;figure&gt;</title>")) {
		t.Error("inline SVG lacks the escaped title")
	}
	if err := xml.Unmarshal(in, new(struct{})); err != nil {
		t.Errorf("inline SVG is not well-formed: %v", err)
	}
}
