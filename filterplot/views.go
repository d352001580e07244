package filterplot

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"cylcav/figure"
	"cylcav/filter"
)

// Two further views of a response: the passband insertion loss at a
// magnified scale, and a wide view with marked frequencies (the cavities'
// spurious resonances).

// Marker is a frequency marked on a wide view: a vertical line with a
// label at the top. Alarm draws it in red (a spurious resonance in the
// passband or in a rejection band), otherwise grey.
type Marker struct {
	F     float64 // Hz
	Label string
	Alarm bool
}

// passbandMargin is how far beyond each band edge the passband view
// reaches, as a fraction of the bandwidth: enough to see the edges fall.
const passbandMargin = 0.12

// PassbandFigure draws |S21| in dB across the passband of d (from
// passbandMargin bandwidths below f1 to as far above f2) with the unloaded
// Qs q0 (one per resonator; empty for lossless) and without losses, at a
// scale that shows the insertion loss and its rounding at the band edges.
// points is the number of frequencies (zero: DefaultPlotPoints).
func PassbandFigure(th figure.Theme, d *filter.Design, q0 []float64, points int) (*figure.Figure, error) {
	if d == nil || d.Folded == nil || d.Spec.Order < 1 {
		return nil, errors.New("filterplot: passband view needs a synthesised design (from Synthesize)")
	}
	if points == 0 {
		points = DefaultPlotPoints
	}
	s := d.Spec
	f1, f2 := filter.BandpassFrequency(-1, s.F0, s.BW), filter.BandpassFrequency(1, s.F0, s.BW)
	lo, hi := f1-passbandMargin*s.BW, f2+passbandMargin*s.BW
	fs, err := filter.Sweep(lo, hi, points)
	if err != nil {
		return nil, err
	}
	fs = append(fs, f1, s.F0, f2)
	slices.Sort(fs)
	fs = slices.Compact(fs)
	lossy, err := d.Response(fs, q0)
	if err != nil {
		return nil, err
	}
	ideal, err := d.Response(fs, nil)
	if err != nil {
		return nil, err
	}
	sc, fu := figure.FrequencyUnit(hi)
	x := make([]float64, len(fs))
	yl, yi := make([]float64, len(fs)), make([]float64, len(fs))
	worst := 0.0 // the deepest |S21| in the passband, dB (<= 0)
	for i, f := range fs {
		x[i] = f / sc
		yl[i], yi[i] = lossy[i].S21DB(), ideal[i].S21DB()
		if f >= f1 && f <= f2 {
			worst = math.Min(worst, math.Min(yl[i], yi[i]))
		}
	}
	// The axis reaches 60 % below the deepest passband value, at least
	// 0.5 dB, so that the edges' roll-off shows.
	bottom := math.Min(-0.5, 1.6*worst)
	top := math.Max(0.05, -0.08*bottom)
	p := th.NewPlot("", "frequency   ["+fu+"]", "|S21|   [dB]")
	r, err := figure.NewRegion(f1/sc, f2/sc, bottom, top)
	if err != nil {
		return nil, err
	}
	r.Fill, r.LineStyle, r.NoRange = passbandFill, draw.LineStyle{}, true
	p.Add(r)
	clip := bottom - 0.2*(top-bottom)
	ls := th.Series(0)
	is := th.Series(1)
	if err := addLine(p, x, clampBelow(yi, clip), is); err != nil {
		return nil, err
	}
	if err := addLine(p, x, clampBelow(yl, clip), ls); err != nil {
		return nil, err
	}
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = lo/sc, hi/sc, bottom, top
	p.Y.Tick.Marker = figure.Ticks{N: 8}
	fig := figure.NewFigure(th, "Passband insertion loss")
	fig.Panels = []*plot.Plot{p}
	lossless := true
	for _, q := range q0 {
		if !math.IsInf(q, 1) {
			lossless = false
		}
	}
	if lossless {
		fig.Legend.Add("|S21| (lossless: no finite Q0)", figure.LineThumb{LineStyle: ls})
	} else {
		fig.Legend.Add("|S21| with the unloaded Q0", figure.LineThumb{LineStyle: ls})
	}
	fig.Legend.Add("|S21| lossless", figure.LineThumb{LineStyle: is})
	fig.Legend.Add("passband", figure.BoxThumb{Fill: passbandFill})
	fig.Notes = []string{fmt.Sprintf("Magnified |S21| from %g bandwidths below f1 to as far above f2; the difference between the curves is the dissipation in the resonators.", passbandMargin)}
	return fig, nil
}

// WideFigure draws |S21| and |S11| of d with the unloaded Qs q0 from lo to
// hi (Hz) with the rejection requirements of the specification and the
// markers as labelled vertical lines, and notes under the legend. The coupling-matrix response knows nothing of the markers: a
// spurious resonance shows only as its marker.
func WideFigure(th figure.Theme, d *filter.Design, q0 []float64, lo, hi float64, points int, markers []Marker, notes []string) (*figure.Figure, error) {
	if d == nil || d.Folded == nil || d.Spec.Order < 1 {
		return nil, errors.New("filterplot: wide view needs a synthesised design (from Synthesize)")
	}
	rp, err := NewResponsePlot(d, PlotOptions{Lo: lo, Hi: hi, Points: points, Q0: q0})
	if err != nil {
		return nil, err
	}
	sc, fu := figure.FrequencyUnit(hi)
	x := make([]float64, len(rp.F))
	for i, f := range rp.F {
		x[i] = f / sc
	}
	p := th.NewPlot("", "frequency   ["+fu+"]", "|S21|, |S11|   [dB]")
	r, err := figure.NewRegion(rp.Passband[0]/sc, rp.Passband[1]/sc, rp.DBMin, rp.DBMax)
	if err != nil {
		return nil, err
	}
	r.Fill, r.LineStyle, r.NoRange = passbandFill, draw.LineStyle{}, true
	p.Add(r)
	// The rejection requirements, as on the response plot.
	req := draw.LineStyle{Color: figure.Red, Width: vg.Points(1.2), Dashes: []vg.Length{vg.Points(6), vg.Points(2.5)}}
	for _, m := range rp.Rejections {
		a, b := math.Min(m.F, m.Edge)/sc, math.Max(m.F, m.Edge)/sc
		if !(b > a) {
			continue // outside the model: not checked, nothing to draw
		}
		r, err := figure.NewRegion(a, b, m.Level, rp.DBMax)
		if err != nil {
			return nil, err
		}
		r.Fill, r.LineStyle, r.NoRange = maskFill, draw.LineStyle{}, true
		p.Add(r)
		if err := addLine(p, []float64{a, b}, []float64{m.Level, m.Level}, req); err != nil {
			return nil, err
		}
	}
	clip := rp.DBMin - 0.1*(rp.DBMax-rp.DBMin)
	s21, s11 := th.Series(0), th.Series(1)
	if err := addLine(p, x, clampBelow(rp.S11DB, clip), s11); err != nil {
		return nil, err
	}
	if err := addLine(p, x, clampBelow(rp.S21DB, clip), s21); err != nil {
		return nil, err
	}
	alarm := draw.LineStyle{Color: figure.Red, Width: 1.3 * th.LineWidth, Dashes: figure.Dotted()}
	quiet := draw.LineStyle{Color: figure.Teal, Width: 1.3 * th.LineWidth, Dashes: figure.Dotted()}
	var ms []Marker
	for _, m := range markers {
		if m.F >= lo && m.F <= hi {
			ms = append(ms, m)
		}
	}
	slices.SortFunc(ms, func(a, b Marker) int {
		switch {
		case a.F < b.F:
			return -1
		case a.F > b.F:
			return 1
		}
		return 0
	})
	p.Add(&markerPlotter{ms: ms, th: th, alarm: alarm, quiet: quiet, scale: sc})
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = lo/sc, hi/sc, rp.DBMin, rp.DBMax
	p.Y.Tick.Marker = figure.Ticks{N: 8}
	fig := figure.NewFigure(th, "Wide view with the cavities' spurious resonances")
	fig.Panels = []*plot.Plot{p}
	fig.Legend.Add("|S21|", figure.LineThumb{LineStyle: s21})
	fig.Legend.Add("|S11|", figure.LineThumb{LineStyle: s11})
	fig.Legend.Add("passband", figure.BoxThumb{Fill: passbandFill})
	if len(rp.Rejections) > 0 {
		fig.Legend.Add("rejection limit", figure.BoxThumb{Fill: maskFill}, figure.LineThumb{LineStyle: req})
	}
	hasAlarm, hasQuiet := false, false
	for _, m := range ms {
		hasAlarm = hasAlarm || m.Alarm
		hasQuiet = hasQuiet || !m.Alarm
	}
	if hasQuiet {
		fig.Legend.Add("spurious resonance", figure.LineThumb{LineStyle: quiet})
	}
	if hasAlarm {
		fig.Legend.Add("spurious resonance in the passband or a rejection band", figure.LineThumb{LineStyle: alarm})
	}
	fig.Notes = notes
	return fig, nil
}

// markerPlotter draws labelled vertical lines; labels that would overlap
// their left neighbour step down a line.
type markerPlotter struct {
	ms           []Marker
	th           figure.Theme
	alarm, quiet draw.LineStyle
	scale        float64
}

// Plot implements plot.Plotter.
func (mp *markerPlotter) Plot(c draw.Canvas, plt *plot.Plot) {
	trX, _ := plt.Transforms(&c)
	var lastEnd []vg.Length // right end of the last label on each text line
	for _, m := range mp.ms {
		x := trX(m.F / mp.scale)
		sty := mp.quiet
		if m.Alarm {
			sty = mp.alarm
		}
		c.StrokeLine2(sty, x, c.Min.Y, x, c.Max.Y)
		ts := mp.th.Text(mp.th.LabelSize, sty.Color)
		ts.XAlign, ts.YAlign = draw.XLeft, draw.YTop
		w := ts.Rectangle(m.Label).Size().X
		h := ts.Rectangle(m.Label).Size().Y
		line := 0
		for line < len(lastEnd) && lastEnd[line] > x {
			line++
		}
		if line == len(lastEnd) {
			lastEnd = append(lastEnd, 0)
		}
		lx := x + vg.Points(2)
		if lx+w > c.Max.X {
			lx = x - vg.Points(2) - w
		}
		y := c.Max.Y - vg.Points(2) - vg.Length(line)*(h+vg.Points(1))
		box := []vg.Point{{X: lx - 1, Y: y - h}, {X: lx + w + 1, Y: y - h}, {X: lx + w + 1, Y: y}, {X: lx - 1, Y: y}}
		c.FillPolygon(mp.th.Background, box)
		c.FillText(ts, vg.Point{X: lx, Y: y}, m.Label)
		lastEnd[line] = lx + w + vg.Points(3)
	}
}
