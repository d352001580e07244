package modechart

import (
	"bytes"
	"fmt"
	"image/png"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"

	"cylcav/cavity"
)

// TestFrequencyUnit checks the axis unit at and around each SI prefix step
// (BIPM, The International System of Units, 9th ed., Table 7: k = 1e3,
// M = 1e6, G = 1e9).
func TestFrequencyUnit(t *testing.T) {
	for _, c := range []struct {
		f     float64
		scale float64
		name  string
	}{
		{0, 1, "Hz"}, {math.NaN(), 1, "Hz"}, {999, 1, "Hz"},
		{1e3, 1e3, "kHz"}, {999e3, 1e3, "kHz"},
		{1e6, 1e6, "MHz"}, {915e6, 1e6, "MHz"},
		{1e9, 1e9, "GHz"}, {24e9, 1e9, "GHz"}, {3e12, 1e9, "GHz"},
	} {
		scale, name := FrequencyUnit(c.f)
		if scale != c.scale || name != c.name {
			t.Errorf("FrequencyUnit(%g) = %g, %q, want %g, %q", c.f, scale, name, c.scale, c.name)
		}
	}
}

// TestTicks checks the nice-number ticks (Heckbert 1990): majors are
// multiples of a 1-2-5 step inside the range, labelled, and about N of
// them; minors lie between them.
func TestTicks(t *testing.T) {
	for _, c := range []struct {
		min, max float64
		step     float64 // hand-computed from Heckbert's rules
	}{
		{0, 9, 2},         // 9/6 = 1.5, not below 1.5, so 2
		{0, 100, 20},      // 100/6 = 16.7 -> 2 x 10
		{0.25, 9, 1},      // 8.75/6 = 1.46 -> 1
		{1800, 4000, 500}, // 2200/6 = 367 -> 5 x 100
		{-0.3, 0.7, 0.2},  // 1/6 = 0.167 -> 2 x 0.1
	} {
		// Tick values are built as multiples of the step, so they carry a
		// few roundings: tickEdgeTol (absolute, for ranges of order 1 to
		// 4000) at the range ends and tickStepTol (relative) in the step.
		const tickEdgeTol, tickStepTol = 1e-12, 1e-9
		ticks := Ticks{}.Ticks(c.min, c.max)
		var majors []float64
		for _, tk := range ticks {
			if tk.Value < c.min-tickEdgeTol || tk.Value > c.max+tickEdgeTol {
				t.Errorf("Ticks(%g, %g): tick %g outside the range", c.min, c.max, tk.Value)
			}
			if tk.Label != "" {
				majors = append(majors, tk.Value)
			}
		}
		if len(majors) < 3 || len(majors) > 11 {
			t.Errorf("Ticks(%g, %g): %d major ticks, want 3..11", c.min, c.max, len(majors))
		}
		for i := 1; i < len(majors); i++ {
			if d := majors[i] - majors[i-1]; math.Abs(d-c.step) > tickStepTol*c.step {
				t.Errorf("Ticks(%g, %g): step %g, want %g", c.min, c.max, d, c.step)
			}
		}
	}
	if got := (Ticks{}).Ticks(1, 1); got != nil {
		t.Errorf("Ticks(1, 1) = %v, want none", got)
	}
}

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
	f, err := TradeOffFigure(DefaultTheme(), "trade-off", d)
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
	if _, err := TradeOffFigure(DefaultTheme(), "", bad); err == nil || !strings.Contains(err.Error(), "increase strictly") {
		t.Errorf("repeated ratio: error = %v", err)
	}
	bad = d
	bad.Chosen = 7
	if _, err := TradeOffFigure(DefaultTheme(), "", bad); err == nil || !strings.Contains(err.Error(), "outside") {
		t.Errorf("chosen outside: error = %v", err)
	}
	if _, err := TradeOffFigure(DefaultTheme(), "", TradeOffCurves{Ratio: []float64{1}}); err == nil {
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
	f, err := TuningFigure(DefaultTheme(), "tuning", d)
	if err != nil {
		t.Fatal(err)
	}
	checkPNG(t, "tuning", f)
	d.Range = [2]float64{0.02, 0.031}
	if _, err := TuningFigure(DefaultTheme(), "", d); err == nil || !strings.Contains(err.Error(), "tuning range") {
		t.Errorf("range outside: error = %v", err)
	}

	var qs []ModeQ
	for i, m := range []cavity.Mode{te011, tm111, tm010, {Family: cavity.TE, N: 1, M: 1, P: 1}} {
		qs = append(qs, ModeQ{Mode: m, Frequency: c.Frequency(m), Q0: 10000 + 3000*float64(i), Wanted: i == 0})
	}
	qf, err := QFigure(DefaultTheme(), "Q", qs)
	if err != nil {
		t.Fatal(err)
	}
	checkPNG(t, "Q", qf)
	qs[1].Q0 = math.Inf(1)
	if _, err := QFigure(DefaultTheme(), "", qs); err == nil || !strings.Contains(err.Error(), "TM111") {
		t.Errorf("infinite Q0: error = %v", err)
	}
}

// TestPointLabels checks the point-label layout: inside the axes, clear
// of each other and of every marker.
func TestPointLabels(t *testing.T) {
	th := DefaultTheme()
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
	if _, err := NewRegion(0, 1, 0, math.Inf(1)); err == nil {
		t.Error("NewRegion with Inf: no error")
	}
	if _, err := NewRegion(2, 1, 0, 1); err == nil {
		t.Error("NewRegion with xmin > xmax: no error")
	}
	r, err := NewRegion(0, 1, 2, 3)
	if err != nil {
		t.Fatal(err)
	}
	if x0, x1, y0, y1 := r.DataRange(); x0 != 0 || x1 != 1 || y0 != 2 || y1 != 3 {
		t.Errorf("Region.DataRange = %g %g %g %g, want 0 1 2 3", x0, x1, y0, y1)
	}
	if _, err := NewModeLines(&Chart{}); err == nil {
		t.Error("NewModeLines of an empty chart: no error")
	}
}

// TestSeriesStylesDistinct checks that the six series styles differ in
// dash pattern or in width and lightness, so they stay apart in greyscale.
func TestSeriesStylesDistinct(t *testing.T) {
	th := DefaultTheme()
	type key struct {
		dash string
		grey uint8
	}
	seen := map[key]int{}
	for i := 0; i < 6; i++ {
		s := th.Series(i)
		r, g, b, _ := s.Color.RGBA()
		// ITU-R BT.601 luma, the usual greyscale conversion.
		y := uint8((299*r + 587*g + 114*b) / 1000 >> 8)
		k := key{dash: fmtDashes(s.Dashes), grey: y / 32}
		if j, dup := seen[k]; dup {
			t.Errorf("series %d and %d look alike in greyscale (dash %q, grey band %d)", j, i, k.dash, k.grey)
		}
		seen[k] = i
	}
	for _, k := range []Kind{KindTE, KindTM, KindPair} {
		o, w := th.ModeLine(k, Ordinary), th.ModeLine(k, Wanted)
		if w.Width <= 2*o.Width || w.Dashes != nil {
			t.Errorf("wanted %v line: width %v dashes %v, want solid and over twice %v", k, w.Width, w.Dashes, o.Width)
		}
	}
}

func fmtDashes(d []vg.Length) string { return fmt.Sprint(d) }

func checkPNG(t *testing.T, name string, d Drawer) {
	t.Helper()
	b, err := Encode(d, PNG, Page{Width: 5 * vg.Inch, Height: 4 * vg.Inch, DPI: 72})
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	if _, err := png.Decode(bytes.NewReader(b)); err != nil {
		t.Errorf("%s: PNG does not decode: %v", name, err)
	}
}
