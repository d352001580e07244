package modechart

import (
	"bytes"
	"image/png"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"

	"cylcav/cavity"
	"cylcav/figure"
)

func TestTradeOffFigure(t *testing.T) {
	n := 50
	d := TradeOffCurves{Chosen: 1.4, MinClearance: 0.03, MinQ: 18000}
	for i := 0; i < n; i++ {
		r := 0.8 + 1.7*float64(i)/float64(n-1)
		d.Ratio = append(d.Ratio, r)
		d.Clearance = append(d.Clearance, 0.07*math.Abs(math.Sin(3*r)))
		d.WorstClearance = append(d.WorstClearance, 0.06*math.Abs(math.Sin(3*r)))
		d.Q0 = append(d.Q0, 23000-2000*(r-1)*(r-1))
	}
	d.Q0[10] = math.NaN() // a gap in the curve is allowed
	f, err := TradeOffFigure(figure.DefaultTheme(), "trade-off", d)
	if err != nil {
		t.Fatal(err)
	}
	if len(f.Panels) != 2 {
		t.Errorf("panels = %d, want clearance and Q0", len(f.Panels))
	}
	checkPNG(t, "trade-off", f)
	bad := d
	bad.Ratio = append([]float64(nil), d.Ratio...)
	bad.Ratio[5] = bad.Ratio[4]
	if _, err := TradeOffFigure(figure.DefaultTheme(), "", bad); err == nil || !strings.Contains(err.Error(), "increase strictly") {
		t.Errorf("repeated ratio: error = %v", err)
	}
	bad = d
	bad.Chosen = 7
	if _, err := TradeOffFigure(figure.DefaultTheme(), "", bad); err == nil || !strings.Contains(err.Error(), "outside") {
		t.Errorf("chosen outside: error = %v", err)
	}
	if _, err := TradeOffFigure(figure.DefaultTheme(), "", TradeOffCurves{Ratio: []float64{1}}); err == nil {
		t.Error("one point: no error")
	}
}

func TestTuningAndQFigures(t *testing.T) {
	c := cavity.Cavity{Radius: 0.02, Length: 0.03}
	tc, err := c.Tune(te011, 0.028, 0.032, 40, false)
	if err != nil {
		t.Fatal(err)
	}
	d := TuningCurves{Wanted: "TE011", Design: 0.03, Range: [2]float64{0.029, 0.031}}
	other := cavity.Mode{Family: cavity.TE, N: 3, M: 1, P: 1}
	s := Series{Name: other.String()}
	for _, p := range tc.Points {
		d.Length = append(d.Length, p.Length)
		d.Freq = append(d.Freq, p.Frequency)
		d.Clearance = append(d.Clearance, p.Clearance)
		s.Y = append(s.Y, cavity.Cavity{Radius: c.Radius, Length: p.Length}.Frequency(other))
	}
	d.Others = []Series{s}
	f, err := TuningFigure(figure.DefaultTheme(), "tuning", d)
	if err != nil {
		t.Fatal(err)
	}
	checkPNG(t, "tuning", f)
	d.Range = [2]float64{0.02, 0.031}
	if _, err := TuningFigure(figure.DefaultTheme(), "", d); err == nil || !strings.Contains(err.Error(), "tuning range") {
		t.Errorf("range outside: error = %v", err)
	}

	var qs []ModeQ
	for i, m := range []cavity.Mode{te011, tm111, tm010, {Family: cavity.TE, N: 1, M: 1, P: 1}} {
		qs = append(qs, ModeQ{Mode: m, Frequency: c.Frequency(m), Q0: 10000 + 3000*float64(i), Wanted: i == 0})
	}
	qf, err := QFigure(figure.DefaultTheme(), "Q", qs)
	if err != nil {
		t.Fatal(err)
	}
	checkPNG(t, "Q", qf)
	qs[1].Q0 = math.Inf(1)
	if _, err := QFigure(figure.DefaultTheme(), "", qs); err == nil || !strings.Contains(err.Error(), "TM111") {
		t.Errorf("infinite Q0: error = %v", err)
	}
}

// TestPointLabels checks the point-label layout: inside the axes, clear
// of each other and of every marker.
func TestPointLabels(t *testing.T) {
	th := figure.DefaultTheme()
	p := th.NewPlot("", "x", "y")
	var ls []PointLabel
	for i := 0; i < 30; i++ {
		x := float64(i % 6)
		y := float64(i / 6)
		ls = append(ls, PointLabel{X: x, Y: y, Text: "TM0" + string(rune('0'+i%10)) + "1"})
	}
	pl, err := NewPointLabels(ls)
	if err != nil {
		t.Fatal(err)
	}
	p.Add(pl)
	p.X.Min, p.X.Max = -0.5, 5.5
	p.Y.Min, p.Y.Max = -0.5, 4.5
	dc := dataCanvas(p, 6*vg.Inch, 4*vg.Inch)
	got := pl.Layout(dc, p)
	if len(got) < len(ls)/2 {
		t.Errorf("placed %d of %d labels on a sparse grid", len(got), len(ls))
	}
	trX, trY := p.Transforms(&dc)
	for i, a := range got {
		if !inside(a.Box, dc.Rectangle) {
			t.Errorf("label %q outside the axes", a.Text)
		}
		for _, b := range got[i+1:] {
			if overlaps(a.Box, b.Box) {
				t.Errorf("labels %q and %q overlap", a.Text, b.Text)
			}
		}
		for _, l := range ls {
			c := vg.Point{X: trX(l.X), Y: trY(l.Y)}
			if overlaps(a.Box, vg.Rectangle{Min: vg.Point{X: c.X - 3, Y: c.Y - 3}, Max: vg.Point{X: c.X + 3, Y: c.Y + 3}}) {
				t.Errorf("label %q covers the point (%g, %g)", a.Text, l.X, l.Y)
			}
		}
	}
	if _, err := NewPointLabels([]PointLabel{{X: math.NaN(), Text: "x"}}); err == nil {
		t.Error("NaN point: no error")
	}
	if _, err := NewPointLabels(nil); err == nil {
		t.Error("no points: no error")
	}
}

func TestPlotterContract(t *testing.T) {
	if _, err := NewModeLines(&Chart{}); err == nil {
		t.Error("NewModeLines of an empty chart: no error")
	}
}

// TestModeLineStyles checks that the wanted line of every kind is solid and
// over twice as wide as an ordinary one, so it stands out in greyscale.
func TestModeLineStyles(t *testing.T) {
	ml := &ModeLines{Theme: figure.DefaultTheme()}
	for _, k := range []Kind{KindTE, KindTM, KindPair} {
		o, w := ml.ModeLine(k, Ordinary), ml.ModeLine(k, Wanted)
		if w.Width <= 2*o.Width || w.Dashes != nil {
			t.Errorf("wanted %v line: width %v dashes %v, want solid and over twice %v", k, w.Width, w.Dashes, o.Width)
		}
	}
}

func checkPNG(t *testing.T, name string, d figure.Drawer) {
	t.Helper()
	b, err := figure.Encode(d, figure.PNG, figure.Page{Width: 5 * vg.Inch, Height: 4 * vg.Inch, DPI: 72})
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	if _, err := png.Decode(bytes.NewReader(b)); err != nil {
		t.Errorf("%s: PNG does not decode: %v", name, err)
	}
}
