package figure

import (
	"errors"
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Region is a plotter that shades a rectangle given in data coordinates and
// outlines it: the operating box of a mode chart, a clearance band, or a
// forbidden region of a filter's specification mask. Parts outside the
// axes are clipped.
type Region struct {
	// XMin, XMax, YMin, YMax are the corners in data coordinates.
	XMin, XMax, YMin, YMax float64

	// Fill is the fill colour; nil means no fill.
	Fill color.Color

	// LineStyle is the outline style; zero width means no outline.
	draw.LineStyle

	// NoRange, when true, keeps the region from widening the axes (a mask
	// that should be clipped to the data rather than extend the plot).
	NoRange bool
	// FullHeight, when true, ignores YMin and YMax and spans the whole
	// height of the axes (a band of x values).
	FullHeight bool
}

// NewRegion returns a region with corners (xmin, ymin) and (xmax, ymax),
// no fill and a thin ink outline. It rejects NaN and infinite corners and
// min > max.
func NewRegion(xmin, xmax, ymin, ymax float64) (*Region, error) {
	for _, v := range []float64{xmin, xmax, ymin, ymax} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, errors.New("figure: region corner is NaN or infinite")
		}
	}
	if xmin > xmax || ymin > ymax {
		return nil, fmt.Errorf("figure: region corners out of order: x %g..%g, y %g..%g", xmin, xmax, ymin, ymax)
	}
	return &Region{
		XMin: xmin, XMax: xmax, YMin: ymin, YMax: ymax,
		LineStyle: draw.LineStyle{Color: Ink, Width: vg.Points(0.8)},
	}, nil
}

// Plot implements plot.Plotter.
func (r *Region) Plot(c draw.Canvas, plt *plot.Plot) {
	trX, trY := plt.Transforms(&c)
	x0, x1 := trX(r.XMin), trX(r.XMax)
	y0, y1 := trY(r.YMin), trY(r.YMax)
	if r.FullHeight {
		y0, y1 = c.Min.Y, c.Max.Y
	}
	poly := []vg.Point{{X: x0, Y: y0}, {X: x1, Y: y0}, {X: x1, Y: y1}, {X: x0, Y: y1}}
	if r.Fill != nil {
		if p := c.ClipPolygonXY(poly); len(p) > 0 {
			c.FillPolygon(r.Fill, p)
		}
	}
	if r.Width > 0 {
		ring := append(poly[:4:4], poly[0])
		c.StrokeLines(r.LineStyle, c.ClipLinesXY(ring)...)
	}
}

// DataRange implements plot.DataRanger.
func (r *Region) DataRange() (xmin, xmax, ymin, ymax float64) {
	if r.NoRange {
		return math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	}
	return r.XMin, r.XMax, r.YMin, r.YMax
}

// Thumbnail implements plot.Thumbnailer.
func (r *Region) Thumbnail(c *draw.Canvas) {
	BoxThumb{Fill: r.Fill, LineStyle: r.LineStyle}.Thumbnail(c)
}
