package modechart

import (
	"bytes"
	"flag"
	"math"
	"os"
	"path/filepath"
	"testing"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/recorder"
	"gonum.org/v1/plot/vg/vgimg"

	"cylcav/cavity"
	"cylcav/figure"
	"cylcav/figure/rendertest"
	"cylcav/physics"
)

var regen = flag.Bool("regen", false, "rewrite the golden files in modechart/testdata")

// onLineTol is how far (in points) a label's centre may lie from its line:
// the centre is interpolated on the drawn polyline, so only rounding.
const onLineTol = 0.05

// layoutCase is a chart and page for the label-layout checks.
type layoutCase struct {
	name string
	spec Spec
	w, h vg.Length
}

func layoutCases() []layoutCase {
	d := designSpec()
	lin := designSpec()
	lin.Axes = Linear
	mm := designSpec()
	mm.Units = MHzIn
	dense := designSpec()
	dense.MaxFD = 1.2e9 // about 200 lines
	ptfe := Spec{RatioMin: 0.4, RatioMax: 2.5, Fill: physics.Medium{EpsR: 2.08}, Units: GHzMm, Axes: Linear}
	return []layoutCase{
		{"design squared", d, 8 * vg.Inch, 6 * vg.Inch},
		{"design linear", lin, 8 * vg.Inch, 6 * vg.Inch},
		{"design mhz-in small page", mm, 4 * vg.Inch, 3 * vg.Inch},
		{"dense", dense, 8 * vg.Inch, 6 * vg.Inch},
		{"ptfe no design", ptfe, 6 * vg.Inch, 6 * vg.Inch},
	}
}

// dataCanvas returns the data area of plot p drawn alone on a w x h canvas
// (the same area p.Draw gives its plotters).
func dataCanvas(p *plot.Plot, w, h vg.Length) draw.Canvas {
	c := draw.New(vgimg.New(w, h))
	return p.DataCanvas(c)
}

// TestLabelLayout checks the geometry of the on-line labels: every label
// inside the axes, no two overlapping, each centred on its own line, none
// over the design point or the operating box, and the wanted line labelled.
func TestLabelLayout(t *testing.T) {
	for _, lc := range layoutCases() {
		ch, err := New(lc.spec)
		if err != nil {
			t.Fatalf("%s: %v", lc.name, err)
		}
		p, ml, err := ch.Plot(figure.DefaultTheme())
		if err != nil {
			t.Fatalf("%s: %v", lc.name, err)
		}
		dc := dataCanvas(p, lc.w, lc.h)
		labels := ml.Layout(dc, p)
		if len(labels) == 0 {
			t.Fatalf("%s: no labels placed", lc.name)
		}
		trX, trY := p.Transforms(&dc)
		wantedLabelled := false
		for i, a := range labels {
			if !inside(a.Box, dc.Rectangle) {
				t.Errorf("%s: label %q box %v outside the axes %v", lc.name, a.Text, a.Box, dc.Rectangle)
			}
			for _, b := range labels[i+1:] {
				if overlaps(a.Box, b.Box) {
					t.Errorf("%s: labels %q %v and %q %v overlap", lc.name, a.Text, a.Box, b.Text, b.Box)
				}
			}
			if a.Text != ch.Lines[a.Line].Label() {
				t.Errorf("%s: label text %q on line %s", lc.name, a.Text, ch.Lines[a.Line].Label())
			}
			// Centre on the line: invert the x transform, evaluate the
			// line, transform back.
			l := ml.Lines[a.Line]
			x := p.X.Min + float64(a.At.X-dc.Min.X)/float64(dc.Max.X-dc.Min.X)*(p.X.Max-p.X.Min)
			if l.B == 0 {
				// Horizontal line: any x, check y.
				if d := math.Abs(float64(trY(ml.y(l, x)) - a.At.Y)); d > onLineTol {
					t.Errorf("%s: label %q centre %.3f pt off its line", lc.name, a.Text, d)
				}
			} else {
				// Distance to the line along y, scaled by the slope to a
				// perpendicular distance bound.
				dy := float64(trY(ml.y(l, x)) - a.At.Y)
				x2 := x + (p.X.Max-p.X.Min)*1e-6
				slope := float64(trY(ml.y(l, x2))-trY(ml.y(l, x))) / float64(trX(x2)-trX(x))
				if d := math.Abs(dy) / math.Sqrt(1+slope*slope); d > onLineTol {
					t.Errorf("%s: label %q centre %.3f pt off its line", lc.name, a.Text, d)
				}
			}
			if ch.HasDesign {
				for _, r := range ml.Avoid {
					box := vg.Rectangle{Min: vg.Point{X: trX(r.XMin), Y: trY(r.YMin)}, Max: vg.Point{X: trX(r.XMax), Y: trY(r.YMax)}}
					if overlaps(a.Box, box) {
						t.Errorf("%s: label %q covers the operating box or design point", lc.name, a.Text)
					}
				}
			}
			if a.Line == ch.Wanted {
				wantedLabelled = true
			}
		}
		if ch.Wanted >= 0 && !wantedLabelled {
			t.Errorf("%s: wanted line %s has no label", lc.name, ch.Lines[ch.Wanted].Label())
		}
		// Determinism of the layout itself.
		again := ml.Layout(dc, p)
		if len(again) != len(labels) {
			t.Errorf("%s: second layout placed %d labels, first %d", lc.name, len(again), len(labels))
		} else {
			for i := range again {
				if again[i] != labels[i] {
					t.Errorf("%s: layout not deterministic at label %d: %+v vs %+v", lc.name, i, again[i], labels[i])
					break
				}
			}
		}
	}
}

// TestDrawnLabelsInside records what the plot draws and checks that every
// drawn mode label lies inside the data area, so the geometry above is the
// geometry that reaches the page.
func TestDrawnLabelsInside(t *testing.T) {
	ch, err := New(designSpec())
	if err != nil {
		t.Fatal(err)
	}
	p, _, err := ch.Plot(figure.DefaultTheme())
	if err != nil {
		t.Fatal(err)
	}
	names := map[string]bool{}
	for _, l := range ch.Lines {
		names[l.Label()] = true
	}
	const w, h = 8 * vg.Inch, 6 * vg.Inch
	rec := new(recorder.Canvas)
	c := draw.NewCanvas(rec, w, h)
	p.Draw(c)
	dc := p.DataCanvas(draw.NewCanvas(new(recorder.Canvas), w, h))
	drawn := 0
	for _, a := range rec.Actions {
		fs, ok := a.(*recorder.FillString)
		if !ok || !names[fs.String] {
			continue
		}
		drawn++
		sty := figure.DefaultTheme().Text(fs.Size, figure.Ink)
		sty.Font = fs.Font
		right := fs.Point.X + sty.Width(fs.String)
		if !dc.Contains(fs.Point) || right > dc.Max.X {
			t.Errorf("label %q drawn at %v (to x = %v) outside the data area %v", fs.String, fs.Point, right, dc.Rectangle)
		}
	}
	if drawn == 0 {
		t.Error("no mode label drawn")
	}
}

func demoFigure(t testing.TB) *figure.Figure {
	t.Helper()
	ch, err := New(designSpec())
	if err != nil {
		t.Fatal(err)
	}
	f, err := ch.Figure(figure.DefaultTheme())
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// TestFormats renders the demo chart in every format, checks each file is
// valid (PNG decodes at the requested resolution, SVG parses as XML, PDF
// has its header and trailer) and that rendering twice gives the same
// bytes.
func TestFormats(t *testing.T) {
	pg := figure.Page{Width: 6 * vg.Inch, Height: 4.5 * vg.Inch, DPI: 100}
	for _, f := range []figure.Format{figure.PNG, figure.SVG, figure.PDF} {
		a, err := figure.Encode(demoFigure(t), f, pg)
		if err != nil {
			t.Fatalf("%v: %v", f, err)
		}
		b, err := figure.Encode(demoFigure(t), f, pg)
		if err != nil {
			t.Fatalf("%v: %v", f, err)
		}
		if !bytes.Equal(a, b) {
			t.Errorf("%v: two renders of the same chart differ (%d and %d bytes)", f, len(a), len(b))
		}
		switch f {
		case figure.PNG:
			rendertest.PNG(t, a, 600, 450) // 6 x 4.5 in at 100 dpi
		case figure.SVG:
			rendertest.SVG(t, a)
			if !bytes.Contains(a, []byte("TE011/TM111")) {
				t.Error("SVG lacks the wanted mode's label")
			}
			if !bytes.Contains(a, []byte("Liberation Sans,Arial,Helvetica,sans-serif")) {
				t.Error("SVG fonts lack the sans-serif fallbacks")
			}
		case figure.PDF:
			rendertest.PDF(t, a)
			if !bytes.Contains(a, []byte("/CreationDate (D:"+figure.FixedPDFDate)) {
				t.Error("PDF creation date not fixed")
			}
		}
	}
}

// TestGoldenSVG compares a small chart's SVG with
// modechart/testdata/chart_golden.svg exactly; run with -regen to rewrite it
// after an intended change (and look at it).
func TestGoldenSVG(t *testing.T) {
	ch, err := New(Spec{
		RatioMin: 0.7, RatioMax: 1.5, MaxFD: 4.6e8,
		Wanted:    te011,
		Cavity:    cavity.Cavity{Radius: 0.02, Length: 0.04},
		Tuning:    0.01,
		Clearance: 0.05,
	})
	if err != nil {
		t.Fatal(err)
	}
	f, err := ch.Figure(figure.DefaultTheme())
	if err != nil {
		t.Fatal(err)
	}
	got, err := figure.Encode(f, figure.SVG, figure.Page{Width: 5 * vg.Inch, Height: 4 * vg.Inch})
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join("testdata", "chart_golden.svg")
	if *regen {
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./modechart -run GoldenSVG -regen to create it)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("SVG differs from %s (%d bytes, want %d); if intended, rerun with -regen and view the file", path, len(got), len(want))
	}
}
