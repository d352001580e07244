package modechart

import (
	"fmt"
	"image/color"
	"slices"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"cylcav/figure"
	"cylcav/physics"
)

// Plot returns the chart's panel in theme th: grid, clearance band,
// operating box, mode lines with on-line labels and the design point. The
// ModeLines plotter is returned too, so callers can inspect its label
// layout.
func (ch *Chart) Plot(th figure.Theme) (*plot.Plot, *ModeLines, error) {
	ml, err := NewModeLines(ch)
	if err != nil {
		return nil, nil, err
	}
	ml.Theme = th
	p := th.NewPlot("", ch.XLabel(), ch.YLabel())
	p.X.Min, p.X.Max = ml.XMin, ml.XMax
	p.Y.Min, p.Y.Max = ml.YMin, ml.YMax

	if ch.HasDesign {
		band, seg, err := ch.reachPlotters()
		if err != nil {
			return nil, nil, err
		}
		xmin, xmax, ymin, ymax := band.DataRange()
		ml.Avoid = append(ml.Avoid,
			Rect{xmin, xmax, ymin, ymax},
			Rect{ch.X(ch.Design.Ratio), ch.X(ch.Design.Ratio), ch.Y(ch.Design.FD), ch.Y(ch.Design.FD)})
		p.Add(band, seg, ml)
		for _, g := range designGlyphs() {
			s, err := plotter.NewScatter(plotter.XYs{{X: ch.X(ch.Design.Ratio), Y: ch.Y(ch.Design.FD)}})
			if err != nil {
				return nil, nil, err
			}
			s.GlyphStyle = g
			p.Add(s)
		}
	} else {
		p.Add(ml)
	}
	if ch.MarkRatio != 0 {
		x := ch.X(ch.MarkRatio)
		l, err := plotter.NewLine(plotter.XYs{{X: x, Y: ml.YMin}, {X: x, Y: ml.YMax}})
		if err != nil {
			return nil, nil, err
		}
		l.LineStyle = markStyle()
		p.Add(l)
	}
	// Keep the axes exactly on the chart's range.
	p.X.Min, p.X.Max = ml.XMin, ml.XMax
	p.Y.Min, p.Y.Max = ml.YMin, ml.YMax
	return p, ml, nil
}

// reachSamples is the number of points along the wanted line that draw
// the reachable set (the line is straight on squared axes, a gentle curve
// on linear ones).
const reachSamples = 33

// Colours of the reachable set and its clearance band.
var (
	reachFill = color.NRGBA{R: 0xcc, G: 0xbb, B: 0x44, A: 0xa0}
	bandFill  = color.NRGBA{R: 0xcc, G: 0xbb, B: 0x44, A: 0x38}
)

func reachStyle() draw.LineStyle {
	return draw.LineStyle{Color: reachFill, Width: vg.Points(7)}
}

func bandStyle() draw.LineStyle {
	return draw.LineStyle{Color: figure.Ink, Width: vg.Points(0.6), Dashes: figure.Dotted()}
}

// reachPlotters returns the reachable set as a wide band along the wanted
// line over the reachable D/L span, and the clearance band f·D (1 ±
// Clearance) around it (the region a spurious line must not enter).
func (ch *Chart) reachPlotters() (*plotter.Polygon, *plotter.Line, error) {
	r := ch.Reach
	w := ch.Lines[ch.Wanted]
	c := ch.Clearance
	var seg, upper, lower plotter.XYs
	for i := range reachSamples {
		t := float64(i) / (reachSamples - 1)
		x := ch.X(r.RatioLo) + t*(ch.X(r.RatioHi)-ch.X(r.RatioLo))
		fd := w.FD(ch.RatioAt(x))
		seg = append(seg, plotter.XY{X: x, Y: ch.Y(fd)})
		upper = append(upper, plotter.XY{X: x, Y: ch.Y(fd * (1 + c))})
		lower = append(lower, plotter.XY{X: x, Y: ch.Y(fd * (1 - c))})
	}
	slices.Reverse(lower)
	band, err := plotter.NewPolygon(append(upper, lower...))
	if err != nil {
		return nil, nil, err
	}
	band.Color = bandFill
	band.LineStyle = bandStyle()
	if c == 0 {
		band.LineStyle.Width = 0
	}
	line, err := plotter.NewLine(seg)
	if err != nil {
		return nil, nil, err
	}
	line.LineStyle = reachStyle()
	return band, line, nil
}

// markStyle is the vertical line at a cavity's D/L.
func markStyle() draw.LineStyle {
	return draw.LineStyle{Color: figure.Ink, Width: vg.Points(1.2), Dashes: figure.LongDashed()}
}

// designGlyphs is the design-point marker: an ink dot in a white ring, seen
// on any line colour.
func designGlyphs() []draw.GlyphStyle {
	return []draw.GlyphStyle{
		{Color: color.White, Radius: vg.Points(5.2), Shape: draw.CircleGlyph{}},
		{Color: figure.Ink, Radius: vg.Points(3.4), Shape: draw.CircleGlyph{}},
	}
}

// Figure returns the chart as a page: title, the panel of Plot, a legend
// of the line styles present, and notes with the index convention, the
// line equation and its source, and the design.
func (ch *Chart) Figure(th figure.Theme) (*figure.Figure, error) {
	p, ml, err := ch.Plot(th)
	if err != nil {
		return nil, err
	}
	f := figure.NewFigure(th, ch.Title())
	f.Panels = []*plot.Plot{p}

	present := map[Kind]bool{}
	roles := map[Role]bool{}
	for _, l := range ch.Lines {
		if l.Role == Ordinary {
			present[l.Kind()] = true
		}
		roles[l.Role] = true
	}
	if present[KindTE] {
		f.Legend.Add("TE mode", figure.LineThumb{LineStyle: ml.ModeLine(KindTE, Ordinary)})
	}
	if present[KindTM] {
		f.Legend.Add("TM mode", figure.LineThumb{LineStyle: ml.ModeLine(KindTM, Ordinary)})
	}
	if present[KindPair] {
		f.Legend.Add("TE0mp/TM1mp pair (one line)", figure.LineThumb{LineStyle: ml.ModeLine(KindPair, Ordinary)})
	}
	if ch.Wanted >= 0 {
		l := ch.Lines[ch.Wanted]
		f.Legend.Add("wanted: "+l.Label(), figure.LineThumb{LineStyle: ml.ModeLine(l.Kind(), Wanted)})
	}
	if roles[Crossing] {
		f.Legend.Add("spurious, crosses the wanted mode", figure.LineThumb{LineStyle: ml.ModeLine(KindTE, Crossing)})
	}
	if roles[Near] || (ch.HasDesign && ch.Clearance > 0) {
		f.Legend.Add(fmt.Sprintf("spurious, within %s clearance", pct(ch.Clearance)), figure.LineThumb{LineStyle: ml.ModeLine(KindTE, Near)})
	}
	if ch.HasDesign {
		f.Legend.Add(ch.reachCaption(), figure.LineThumb{LineStyle: reachStyle()})
		if ch.Clearance > 0 {
			f.Legend.Add(fmt.Sprintf("clearance band ±%s", pct(ch.Clearance)),
				figure.BoxThumb{Fill: bandFill, LineStyle: bandStyle()})
		}
		thumbs := []plot.Thumbnailer{}
		for _, g := range designGlyphs() {
			thumbs = append(thumbs, figure.GlyphThumb{GlyphStyle: g})
		}
		f.Legend.Add(fmt.Sprintf("design point, D/L = %.4g", ch.Design.Ratio), thumbs...)
	}

	if ch.MarkRatio != 0 {
		f.Legend.Add(fmt.Sprintf("this cavity, D/L = %.4g", ch.MarkRatio), figure.LineThumb{LineStyle: markStyle()})
	}

	f.Notes = append(f.Notes,
		"Modes TE_nmp, TM_nmp: n azimuthal, m radial, p axial index.  Each line: (f·D)² = [(c·x_nm/π)² + (c·p/2)²·(D/L)²] / (εr·μr),  x = j'_nm (TE), j_nm (TM)  (Pozar, Microwave Engineering, sec. 6.4).")
	if ch.HasDesign {
		c := ch.Cavity
		if ch.MarkRatio != 0 {
			f.Legend.Add(fmt.Sprintf("this cavity, D/L = %.4g", ch.MarkRatio), figure.LineThumb{LineStyle: markStyle()})
		}

		f.Notes = append(f.Notes, fmt.Sprintf("Design: D = %s, L = %s, %v at %s%s.",
			physics.FormatLength(c.Diameter(), 5), physics.FormatLength(c.Length, 5),
			ch.WantedMode, physics.FormatFrequency(ch.DesignFreq, 6), fillNote(ch.Fill)))
	} else if ch.MarkRatio != 0 {
		c := ch.Cavity
		f.Notes = append(f.Notes, fmt.Sprintf("Cavity: D = %s, L = %s%s; read each mode's f·D where its line meets the D/L mark.",
			physics.FormatLength(c.Diameter(), 5), physics.FormatLength(c.Length, 5), fillNote(ch.Fill)))
	} else if ch.Fill.Eps() != 1 || ch.Fill.Mu() != 1 {
		if ch.MarkRatio != 0 {
			f.Legend.Add(fmt.Sprintf("this cavity, D/L = %.4g", ch.MarkRatio), figure.LineThumb{LineStyle: markStyle()})
		}

		f.Notes = append(f.Notes, "Fill:"+strings.TrimPrefix(fillNote(ch.Fill), ",")+".")
	}
	return f, nil
}

// Title returns the chart's title.
func (ch *Chart) Title() string {
	t := "Mode chart of a closed circular cylinder"
	if ch.HasDesign {
		t += fmt.Sprintf(": %v at %s", ch.WantedMode, physics.FormatFrequency(ch.DesignFreq, 5))
	}
	return t
}

func (ch *Chart) reachCaption() string {
	span := ch.Reach.Operation.Span()
	if span == "" {
		return "operating point"
	}
	return "reachable set: " + span
}

func fillNote(fill physics.Medium) string {
	eps, mu := fill.Eps(), fill.Mu()
	switch {
	case eps == 1 && mu == 1:
		return ", empty (vacuum)"
	case mu == 1:
		return fmt.Sprintf(", fill εr = %.6g", eps)
	}
	return fmt.Sprintf(", fill εr = %.6g, μr = %.6g", eps, mu)
}

// pct prints a fraction as a percentage with up to three significant
// digits: 0.03 -> "3 %".
func pct(f float64) string {
	return fmt.Sprintf("%.3g %%", 100*f)
}
