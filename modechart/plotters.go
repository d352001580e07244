package modechart

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"cylcav/figure"
)

// ChartLine is the copied data of one mode-chart line in chart units: on
// squared axes Y = A + B·X, on linear axes Y = sqrt(A + B·X²), with A and B
// the line's Intercept and Slope divided by the square of the unit.
type ChartLine struct {
	Label string
	Kind  Kind
	Role  Role
	A, B  float64
}

// ModeLines is a plotter that draws the lines of a mode chart, clipped to
// the axes, with their names placed on them by Layout.
type ModeLines struct {
	// Lines are the chart's lines in chart units.
	Lines []ChartLine
	// Axes tells straight lines (Squared) from curves (Linear).
	Axes Axes
	// Range is the chart's extent in chart units; the lines are drawn
	// over it.
	XMin, XMax, YMin, YMax float64
	// Avoid are rectangles in data coordinates (the operating box, the
	// clearance band, the design point) that labels must not cover.
	Avoid []Rect

	// Theme gives the line styles (Theme.ModeLine) and the label font.
	figure.Theme

	// Samples is the number of segments of a curve on linear axes.
	Samples int
}

// Rect is an axis-aligned rectangle in data coordinates.
type Rect struct{ XMin, XMax, YMin, YMax float64 }

// NewModeLines returns the plotter of chart ch in the default theme. It
// rejects a chart with no lines.
func NewModeLines(ch *Chart) (*ModeLines, error) {
	if ch == nil || len(ch.Lines) == 0 {
		return nil, &RangeError{Edge: Top, Msg: "the chart has no mode lines; raise the top of the chart"}
	}
	u := ch.Units.Scale()
	ml := &ModeLines{
		Lines: make([]ChartLine, len(ch.Lines)),
		Axes:  ch.Axes,
		XMin:  ch.X(ch.RatioMin), XMax: ch.X(ch.RatioMax),
		YMin: ch.Y(ch.FDMin), YMax: ch.Y(ch.FDMax),
		Theme:   figure.DefaultTheme(),
		Samples: 160,
	}
	for i, l := range ch.Lines {
		a, b := l.Intercept/(u*u), l.Slope/(u*u)
		if math.IsNaN(a) || math.IsInf(a, 0) || math.IsNaN(b) || math.IsInf(b, 0) {
			return nil, fmt.Errorf("modechart: line %s has a non-finite coefficient", l.Label())
		}
		ml.Lines[i] = ChartLine{Label: l.Label(), Kind: l.Kind(), Role: l.Role, A: a, B: b}
	}
	return ml, nil
}

// y returns the line's chart Y at chart X.
func (ml *ModeLines) y(l ChartLine, x float64) float64 {
	if ml.Axes == Squared {
		return l.A + l.B*x
	}
	return math.Sqrt(l.A + l.B*x*x)
}

// x returns the chart X at which the line reaches chart Y, or NaN when it
// never does.
func (ml *ModeLines) x(l ChartLine, y float64) float64 {
	if l.B == 0 {
		return math.NaN()
	}
	if ml.Axes == Squared {
		return (y - l.A) / l.B
	}
	d := y*y - l.A
	if d < 0 {
		return math.NaN()
	}
	return math.Sqrt(d / l.B)
}

// visible returns the X span of the line inside the chart, and false when
// it misses the chart. Lines rise monotonically with X.
func (ml *ModeLines) visible(l ChartLine, xmin, xmax, ymin, ymax float64) (x0, x1 float64, ok bool) {
	x0, x1 = xmin, xmax
	if y := ml.y(l, x0); y > ymax {
		return 0, 0, false
	} else if y < ymin {
		if l.B == 0 {
			return 0, 0, false
		}
		x0 = ml.x(l, ymin)
	}
	if y := ml.y(l, x1); y > ymax {
		x1 = ml.x(l, ymax)
	} else if y < ymin {
		return 0, 0, false
	}
	if !(x0 < x1) {
		return 0, 0, false
	}
	return x0, x1, true
}

// path returns the canvas polyline of line l.
func (ml *ModeLines) path(l ChartLine, c draw.Canvas, plt *plot.Plot) []vg.Point {
	x0, x1, ok := ml.visible(l, plt.X.Min, plt.X.Max, plt.Y.Min, plt.Y.Max)
	if !ok {
		return nil
	}
	trX, trY := plt.Transforms(&c)
	n := 1
	if ml.Axes == Linear && l.B != 0 {
		n = max(ml.Samples, 2)
	}
	pts := make([]vg.Point, 0, n+1)
	for i := 0; i <= n; i++ {
		x := x0 + (x1-x0)*float64(i)/float64(n)
		if i == n {
			x = x1
		}
		y := math.Min(math.Max(ml.y(l, x), plt.Y.Min), plt.Y.Max)
		pts = append(pts, vg.Point{X: trX(x), Y: trY(y)})
	}
	return pts
}

// Plot implements plot.Plotter: lines from ordinary to wanted (emphasis on
// top), then the labels of Layout on white halos.
func (ml *ModeLines) Plot(c draw.Canvas, plt *plot.Plot) {
	for _, role := range []Role{Ordinary, Near, Crossing, Wanted} {
		for _, l := range ml.Lines {
			if l.Role != role {
				continue
			}
			if pts := ml.path(l, c, plt); len(pts) > 1 {
				c.StrokeLines(ml.ModeLine(l.Kind, l.Role), c.ClipLinesXY(pts)...)
			}
		}
	}
	halo := color.NRGBA{R: 0xff, G: 0xff, B: 0xff, A: 0xe6}
	for _, lb := range ml.Layout(c, plt) {
		c.SetColor(halo)
		c.Fill(lb.Box.Path())
		c.FillText(ml.labelStyle(ml.Lines[lb.Line]), lb.At, lb.Text)
	}
}

// DataRange implements plot.DataRanger: the chart's extent.
func (ml *ModeLines) DataRange() (xmin, xmax, ymin, ymax float64) {
	return ml.XMin, ml.XMax, ml.YMin, ml.YMax
}

// Thumbnail draws an ordinary TE line sample.
func (ml *ModeLines) Thumbnail(c *draw.Canvas) {
	figure.LineThumb{LineStyle: ml.ModeLine(KindTE, Ordinary)}.Thumbnail(c)
}
