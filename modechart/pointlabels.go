package modechart

import (
	"errors"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"cylcav/figure"
)

// PointLabel is a text to be placed next to a data point.
type PointLabel struct {
	X, Y float64
	Text string
	// Bold sets the text in bold (the wanted mode).
	Bold bool
}

// PointLabels is a plotter that names data points (drawn by another
// plotter), placing each text beside its point where it collides with no
// other label, no other point and stays inside the axes.
type PointLabels struct {
	// Labels are the points and texts, copied.
	Labels []PointLabel
	// Theme gives the font (LabelSize) and colour.
	figure.Theme
	// Offset is the gap between a point and its label; MarkerRadius the
	// radius of the points' markers, kept free of labels.
	Offset, MarkerRadius vg.Length
}

// NewPointLabels returns the plotter for the given labels in the default
// theme. It rejects an empty list and NaN or infinite coordinates.
func NewPointLabels(ls []PointLabel) (*PointLabels, error) {
	if len(ls) == 0 {
		return nil, errors.New("modechart: no point labels")
	}
	for _, l := range ls {
		if math.IsNaN(l.X) || math.IsInf(l.X, 0) || math.IsNaN(l.Y) || math.IsInf(l.Y, 0) {
			return nil, errors.New("modechart: point label coordinate is NaN or infinite")
		}
	}
	return &PointLabels{
		Labels:       append([]PointLabel(nil), ls...),
		Theme:        figure.DefaultTheme(),
		Offset:       vg.Points(3),
		MarkerRadius: vg.Points(4),
	}, nil
}

func (pl *PointLabels) style(l PointLabel) text.Style {
	if l.Bold {
		return pl.Bold(pl.LabelSize*1.15, figure.Ink)
	}
	return pl.Text(pl.LabelSize*1.1, color.Gray{Y: 0x22})
}

// Layout places the labels on data canvas c of plot plt, in input order
// (put the important ones first): for each, eight positions around its
// point are tried (right, left, above, below, then the diagonals) and the
// first whose box lies inside the axes and clear of placed labels and of
// every point's marker wins. Labels with no such position are left out.
func (pl *PointLabels) Layout(c draw.Canvas, plt *plot.Plot) []Label {
	trX, trY := plt.Transforms(&c)
	area := vg.Rectangle{
		Min: vg.Point{X: c.Min.X + edgePad, Y: c.Min.Y + edgePad},
		Max: vg.Point{X: c.Max.X - edgePad, Y: c.Max.Y - edgePad},
	}
	pts := make([]vg.Point, len(pl.Labels))
	var markers []vg.Rectangle
	for i, l := range pl.Labels {
		pts[i] = vg.Point{X: trX(l.X), Y: trY(l.Y)}
		r := pl.MarkerRadius
		markers = append(markers, vg.Rectangle{
			Min: vg.Point{X: pts[i].X - r, Y: pts[i].Y - r},
			Max: vg.Point{X: pts[i].X + r, Y: pts[i].Y + r},
		})
	}
	var placed []Label
	for i, l := range pl.Labels {
		sty := pl.style(l)
		w := sty.Width(l.Text) + 2*haloPad
		h := sty.Rectangle(l.Text).Size().Y + 2*haloPad
		p := pts[i]
		g := pl.MarkerRadius + pl.Offset
		// Box centres for the eight positions.
		cands := []vg.Point{
			{X: p.X + g + w/2, Y: p.Y},
			{X: p.X - g - w/2, Y: p.Y},
			{X: p.X, Y: p.Y + g + h/2},
			{X: p.X, Y: p.Y - g - h/2},
			{X: p.X + g + w/2, Y: p.Y + g/2 + h/2},
			{X: p.X + g + w/2, Y: p.Y - g/2 - h/2},
			{X: p.X - g - w/2, Y: p.Y + g/2 + h/2},
			{X: p.X - g - w/2, Y: p.Y - g/2 - h/2},
		}
		for _, q := range cands {
			box := vg.Rectangle{
				Min: vg.Point{X: q.X - w/2, Y: q.Y - h/2},
				Max: vg.Point{X: q.X + w/2, Y: q.Y + h/2},
			}
			if !inside(box, area) || overlapsAny(box, markers) || overlapsLabels(box, placed) {
				continue
			}
			placed = append(placed, Label{Line: i, Text: l.Text, At: q, Box: box})
			break
		}
	}
	return placed
}

// Plot implements plot.Plotter.
func (pl *PointLabels) Plot(c draw.Canvas, plt *plot.Plot) {
	halo := color.NRGBA{R: 0xff, G: 0xff, B: 0xff, A: 0xd0}
	for _, lb := range pl.Layout(c, plt) {
		c.SetColor(halo)
		c.Fill(lb.Box.Path())
		c.FillText(pl.style(pl.Labels[lb.Line]), lb.At, lb.Text)
	}
}

// DataRange implements plot.DataRanger.
func (pl *PointLabels) DataRange() (xmin, xmax, ymin, ymax float64) {
	xmin, ymin = math.Inf(1), math.Inf(1)
	xmax, ymax = math.Inf(-1), math.Inf(-1)
	for _, l := range pl.Labels {
		xmin, xmax = math.Min(xmin, l.X), math.Max(xmax, l.X)
		ymin, ymax = math.Min(ymin, l.Y), math.Max(ymax, l.Y)
	}
	return
}
