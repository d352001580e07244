package modechart

import (
	"errors"
	"fmt"
	"image/color"
	"math"
	"slices"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"cylcav/cavity"
	"cylcav/figure"
)

// TradeOffCurves are a design problem's curves against D/L, as the design
// optimiser returns them: parallel slices sorted by Ratio.
type TradeOffCurves struct {
	// Ratio is D/L, strictly increasing.
	Ratio []float64
	// Clearance is the clearance at the nominal dimensions and
	// WorstClearance along the tuning and temperature path, as fractions
	// (nil or all NaN to leave one out).
	Clearance, WorstClearance []float64
	// Q0 is the unloaded Q of the wanted mode; nil or all NaN leaves the
	// Q0 panel out.
	Q0 []float64
	// Chosen is the D/L of the design, marked on every panel; zero means
	// none.
	Chosen float64
	// MinClearance (fraction) and MinQ draw the requirements as dashed
	// lines; zero means none.
	MinClearance, MinQ float64
}

// TradeOffFigure returns the trade-off page: clearance (%) against D/L with
// the requirement and the chosen design, and below it Q0 against D/L.
func TradeOffFigure(th figure.Theme, title string, d TradeOffCurves) (*figure.Figure, error) {
	n := len(d.Ratio)
	if n < 2 {
		return nil, fmt.Errorf("modechart: trade-off curves need at least 2 points, got %d", n)
	}
	for _, s := range [][]float64{d.Clearance, d.WorstClearance, d.Q0} {
		if s != nil && len(s) != n {
			return nil, fmt.Errorf("modechart: trade-off curves have %d ratios but a curve of %d points", n, len(s))
		}
	}
	if err := increasing("D/L", d.Ratio); err != nil {
		return nil, err
	}
	f := figure.NewFigure(th, title)
	top := th.NewPlot("", "D/L   (diameter over length)", "clearance   [%]")
	series := 0
	add := func(p *plot.Plot, name string, xs, ys []float64, scale float64, sty draw.LineStyle) error {
		segs, err := figure.AddCurve(p, xs, ys, scale, sty)
		if err != nil {
			return err
		}
		if len(segs) > 0 && name != "" {
			f.Legend.Add(name, figure.LineThumb{LineStyle: sty})
		}
		return nil
	}
	if hasFinite(d.Clearance) {
		if err := add(top, "clearance at nominal size", d.Ratio, d.Clearance, 100, th.Series(series)); err != nil {
			return nil, err
		}
		series++
	}
	if hasFinite(d.WorstClearance) && !slices.Equal(d.WorstClearance, d.Clearance) {
		if err := add(top, "worst clearance along tuning/temperature path", d.Ratio, d.WorstClearance, 100, th.Series(series)); err != nil {
			return nil, err
		}
	}
	if series == 0 && !hasFinite(d.WorstClearance) {
		return nil, errors.New("modechart: trade-off curves hold no finite clearance")
	}
	req := draw.LineStyle{Color: figure.Red, Width: vg.Points(1), Dashes: figure.LongDashed()}
	if d.MinClearance > 0 {
		if err := addHLine(top, d.Ratio[0], d.Ratio[n-1], 100*d.MinClearance, req); err != nil {
			return nil, err
		}
	}
	f.Panels = append(f.Panels, top)
	if hasFinite(d.Q0) {
		bot := th.NewPlot("", "D/L   (diameter over length)", "unloaded Q0")
		if err := add(bot, "unloaded Q0 of the wanted mode", d.Ratio, d.Q0, 1, th.Series(2)); err != nil {
			return nil, err
		}
		if d.MinQ > 0 {
			if err := addHLine(bot, d.Ratio[0], d.Ratio[n-1], d.MinQ, req); err != nil {
				return nil, err
			}
		}
		f.Panels = append(f.Panels, bot)
	}
	switch {
	case d.MinClearance > 0 && d.MinQ > 0 && hasFinite(d.Q0):
		f.Legend.Add(fmt.Sprintf("requirements: clearance >= %s, Q0 >= %.5g", pct(d.MinClearance), d.MinQ), figure.LineThumb{LineStyle: req})
	case d.MinClearance > 0:
		f.Legend.Add("required clearance >= "+pct(d.MinClearance), figure.LineThumb{LineStyle: req})
	case d.MinQ > 0 && hasFinite(d.Q0):
		f.Legend.Add(fmt.Sprintf("required Q0 >= %.5g", d.MinQ), figure.LineThumb{LineStyle: req})
	}
	stackPanels(f)
	if d.Chosen != 0 {
		if d.Chosen < d.Ratio[0] || d.Chosen > d.Ratio[n-1] {
			return nil, fmt.Errorf("modechart: chosen D/L %g lies outside the curves' range %g..%g", d.Chosen, d.Ratio[0], d.Ratio[n-1])
		}
		curves := [][]float64{d.Clearance, d.Q0}
		if !hasFinite(d.Clearance) {
			curves[0] = d.WorstClearance
		}
		scales := []float64{100, 1}
		for i, p := range f.Panels {
			y := interp(d.Ratio, curves[i], d.Chosen) * scales[i]
			if err := addMarker(p, d.Chosen, y); err != nil {
				return nil, err
			}
		}
		f.Legend.Add(fmt.Sprintf("chosen design, D/L = %.4g", d.Chosen), glyphThumbs()...)
	}
	return f, nil
}

// TuningCurves are the tuning curve of a cavity with a movable end plate:
// the wanted mode's frequency and clearance against the length, and the
// frequencies of the other modes near it.
type TuningCurves struct {
	// Length is the cavity length in m, strictly increasing.
	Length []float64
	// Wanted names the wanted mode; Freq is its frequency in Hz.
	Wanted string
	Freq   []float64
	// Clearance is the clearance along the path as a fraction; nil leaves
	// the clearance panel out.
	Clearance []float64
	// Others are the frequency curves of nearby modes (NaN where a curve
	// is not wanted).
	Others []Series
	// Design is the design length in m, marked on the curves; zero means
	// none.
	Design float64
	// Range is the tuning range (the lengths at the two ends), shaded;
	// zeros mean none.
	Range [2]float64
}

// Series is a named curve.
type Series struct {
	Name string
	Y    []float64
}

// TuningFigure returns the tuning page: frequency against length for the
// wanted mode (thick) and its neighbours (thin, named at their ends), and
// the clearance along the path below.
func TuningFigure(th figure.Theme, title string, d TuningCurves) (*figure.Figure, error) {
	n := len(d.Length)
	if n < 2 {
		return nil, fmt.Errorf("modechart: tuning curve needs at least 2 points, got %d", n)
	}
	if err := increasing("length", d.Length); err != nil {
		return nil, err
	}
	if len(d.Freq) != n || (d.Clearance != nil && len(d.Clearance) != n) {
		return nil, fmt.Errorf("modechart: tuning curve has %d lengths but %d frequencies and %d clearances", n, len(d.Freq), len(d.Clearance))
	}
	fs, fu := figure.FrequencyUnit(slices.Max(d.Freq))
	mm := make([]float64, n)
	for i, l := range d.Length {
		mm[i] = l * 1e3
	}
	f := figure.NewFigure(th, title)
	top := th.NewPlot("", "cavity length L   [mm]", "resonant frequency   ["+fu+"]")
	var bot *plot.Plot
	if hasFinite(d.Clearance) {
		bot = th.NewPlot("", "cavity length L   [mm]", "clearance   [%]")
	}
	// The tuning range first, under the curves.
	if r := d.Range; r[0] != 0 || r[1] != 0 {
		lo, hi := math.Min(r[0], r[1]), math.Max(r[0], r[1])
		if lo < d.Length[0] || hi > d.Length[n-1] {
			return nil, fmt.Errorf("modechart: tuning range %g..%g m lies outside the curve's range %g..%g m", lo, hi, d.Length[0], d.Length[n-1])
		}
		band := color.NRGBA{R: 0xcc, G: 0xbb, B: 0x44, A: 0x50}
		for _, p := range []*plot.Plot{top, bot} {
			if p == nil {
				continue
			}
			reg, err := figure.NewRegion(lo*1e3, hi*1e3, 0, 1)
			if err != nil {
				return nil, err
			}
			reg.Fill, reg.LineStyle.Width, reg.NoRange, reg.FullHeight = band, 0, true, true
			p.Add(reg)
		}
		f.Legend.Add("tuning range", figure.BoxThumb{Fill: band})
	}
	var ends []PointLabel
	thin := draw.LineStyle{Color: figure.Blue, Width: th.LineWidth}
	for _, o := range d.Others {
		if len(o.Y) != n {
			return nil, fmt.Errorf("modechart: tuning curve has %d lengths but %s has %d points", n, o.Name, len(o.Y))
		}
		segs, err := figure.AddCurve(top, mm, o.Y, 1/fs, thin)
		if err != nil {
			return nil, err
		}
		if len(segs) > 0 {
			last := segs[len(segs)-1]
			p := last[len(last)-1]
			ends = append(ends, PointLabel{X: p.X, Y: p.Y, Text: o.Name})
		}
	}
	if len(d.Others) > 0 {
		f.Legend.Add("other modes", figure.LineThumb{LineStyle: thin})
	}
	wsty := draw.LineStyle{Color: figure.Ink, Width: 2.6 * th.LineWidth}
	segs, err := figure.AddCurve(top, mm, d.Freq, 1/fs, wsty)
	if err != nil {
		return nil, err
	}
	if len(segs) == 0 {
		return nil, errors.New("modechart: tuning curve holds no finite frequency")
	}
	f.Legend.Add("wanted: "+d.Wanted, figure.LineThumb{LineStyle: wsty})
	if len(ends) > 0 {
		pl, err := NewPointLabels(ends)
		if err != nil {
			return nil, err
		}
		pl.Theme = th
		top.Add(pl)
	}
	f.Panels = append(f.Panels, top)
	if bot != nil {
		if _, err := figure.AddCurve(bot, mm, d.Clearance, 100, th.Series(2)); err != nil {
			return nil, err
		}
		f.Legend.Add("clearance along the tuning path", figure.LineThumb{LineStyle: th.Series(2)})
		f.Panels = append(f.Panels, bot)
	}
	stackPanels(f)
	if d.Design != 0 {
		if d.Design < d.Length[0] || d.Design > d.Length[n-1] {
			return nil, fmt.Errorf("modechart: design length %g m lies outside the curve's range %g..%g m", d.Design, d.Length[0], d.Length[n-1])
		}
		ys := [][]float64{d.Freq, d.Clearance}
		sc := []float64{1 / fs, 100}
		for i, p := range f.Panels {
			if err := addMarker(p, d.Design*1e3, interp(d.Length, ys[i], d.Design)*sc[i]); err != nil {
				return nil, err
			}
		}
		f.Legend.Add(fmt.Sprintf("design, L = %.4g mm", d.Design*1e3), glyphThumbs()...)
	}
	return f, nil
}

// ModeQ is one mode's resonance and unloaded Q for the Q-versus-frequency
// plot.
type ModeQ struct {
	Mode      cavity.Mode
	Frequency float64 // Hz
	Q0        float64
	// Wanted marks the operating mode.
	Wanted bool
}

// QFigure returns the plot of unloaded Q0 against frequency for a set of
// modes of one cavity: TE as circles, TM as triangles, the wanted mode as
// the design marker, every point named where there is room.
func QFigure(th figure.Theme, title string, modes []ModeQ) (*figure.Figure, error) {
	if len(modes) == 0 {
		return nil, errors.New("modechart: no modes to plot")
	}
	fmax := 0.0
	for _, m := range modes {
		if !(m.Frequency > 0) || math.IsInf(m.Frequency, 0) || !(m.Q0 > 0) || math.IsInf(m.Q0, 0) {
			return nil, fmt.Errorf("modechart: mode %v: frequency %g Hz and Q0 %g must be finite and > 0", m.Mode, m.Frequency, m.Q0)
		}
		fmax = math.Max(fmax, m.Frequency)
	}
	fs, fu := figure.FrequencyUnit(fmax)
	p := th.NewPlot("", "resonant frequency   ["+fu+"]", "unloaded Q0")
	f := figure.NewFigure(th, title)
	groups := []struct {
		name string
		keep func(ModeQ) bool
		sty  []draw.GlyphStyle
	}{
		{"TE modes", func(m ModeQ) bool { return !m.Wanted && m.Mode.Family == cavity.TE },
			[]draw.GlyphStyle{{Color: figure.Blue, Radius: vg.Points(3.2), Shape: draw.CircleGlyph{}}}},
		{"TM modes", func(m ModeQ) bool { return !m.Wanted && m.Mode.Family == cavity.TM },
			[]draw.GlyphStyle{{Color: figure.Purple, Radius: vg.Points(3.6), Shape: draw.TriangleGlyph{}}}},
		{"wanted mode", func(m ModeQ) bool { return m.Wanted }, designGlyphs()},
	}
	var labels []PointLabel
	for _, g := range groups {
		var xys plotter.XYs
		for _, m := range modes {
			if g.keep(m) {
				xys = append(xys, plotter.XY{X: m.Frequency / fs, Y: m.Q0})
				labels = append(labels, PointLabel{X: m.Frequency / fs, Y: m.Q0, Text: m.Mode.String(), Bold: m.Wanted})
			}
		}
		if len(xys) == 0 {
			continue
		}
		var thumbs []plot.Thumbnailer
		for _, sty := range g.sty {
			s, err := plotter.NewScatter(xys)
			if err != nil {
				return nil, err
			}
			s.GlyphStyle = sty
			p.Add(s)
			thumbs = append(thumbs, figure.GlyphThumb{GlyphStyle: sty})
		}
		f.Legend.Add(g.name, thumbs...)
	}
	pl, err := NewPointLabels(labels)
	if err != nil {
		return nil, err
	}
	pl.Theme = th
	p.Add(pl)
	// Leave room above and below the points for their labels.
	p.Y.Min, p.Y.Max = padRange(p.Y.Min, p.Y.Max, 0.08)
	p.X.Min, p.X.Max = padRange(p.X.Min, p.X.Max, 0.04)
	f.Panels = []*plot.Plot{p}
	f.Notes = []string{"Modes TE_nmp, TM_nmp: n azimuthal, m radial, p axial index."}
	return f, nil
}

// stackPanels readies the panels of a figure whose plots share the x axis:
// every y range padded so that markers at the extremes are not clipped, and
// the x-axis title kept on the bottom panel only.
func stackPanels(f *figure.Figure) {
	for _, p := range f.Panels {
		padY(p, 0.08)
	}
	if len(f.Panels) > 1 {
		f.Panels[0].X.Label.Text = ""
	}
}

// padY widens a plot's y range by frac of its span on each side, after the
// data have set it, so markers at the extremes are not clipped.
func padY(p *plot.Plot, frac float64) {
	p.Y.Min, p.Y.Max = padRange(p.Y.Min, p.Y.Max, frac)
}

func padRange(lo, hi, frac float64) (float64, float64) {
	d := hi - lo
	if d <= 0 {
		d = math.Max(math.Abs(hi), 1)
	}
	return lo - frac*d, hi + frac*d
}

func increasing(name string, xs []float64) error {
	for i, x := range xs {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return fmt.Errorf("modechart: %s[%d] is %g; want finite values", name, i, x)
		}
		if i > 0 && !(x > xs[i-1]) {
			return fmt.Errorf("modechart: %s must increase strictly; %s[%d] = %g follows %g", name, name, i, x, xs[i-1])
		}
	}
	return nil
}

func hasFinite(ys []float64) bool {
	for _, y := range ys {
		if !math.IsNaN(y) && !math.IsInf(y, 0) {
			return true
		}
	}
	return false
}

// interp returns y at x by linear interpolation on increasing xs (NaN
// outside or where y is NaN).
func interp(xs, ys []float64, x float64) float64 {
	if len(ys) != len(xs) {
		return math.NaN()
	}
	i, found := slices.BinarySearch(xs, x)
	if found {
		return ys[i]
	}
	if i == 0 || i == len(xs) {
		return math.NaN()
	}
	t := (x - xs[i-1]) / (xs[i] - xs[i-1])
	return ys[i-1] + t*(ys[i]-ys[i-1])
}

func addHLine(p *plot.Plot, x0, x1, y float64, sty draw.LineStyle) error {
	l, err := plotter.NewLine(plotter.XYs{{X: x0, Y: y}, {X: x1, Y: y}})
	if err != nil {
		return err
	}
	l.LineStyle = sty
	p.Add(l)
	return nil
}

// addMarker marks the design at (x, y) with the design glyphs; a NaN y
// (no curve there) is skipped.
func addMarker(p *plot.Plot, x, y float64) error {
	if math.IsNaN(y) || math.IsInf(y, 0) {
		return nil
	}
	for _, g := range designGlyphs() {
		s, err := plotter.NewScatter(plotter.XYs{{X: x, Y: y}})
		if err != nil {
			return err
		}
		s.GlyphStyle = g
		p.Add(s)
	}
	return nil
}

func glyphThumbs() []plot.Thumbnailer {
	var out []plot.Thumbnailer
	for _, g := range designGlyphs() {
		out = append(out, figure.GlyphThumb{GlyphStyle: g})
	}
	return out
}
