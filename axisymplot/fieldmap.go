// Package axisymplot draws the field maps of resonances found by package
// axisym: |E| and |H| in the r-z half plane with the body's outline,
// through the shared plotting layer (package figure), so figure.Render
// writes them as PNG, SVG or PDF.
package axisymplot

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/palette/moreland"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"cylcav/axisym"
	"cylcav/figure"
	"cylcav/physics"
)

// DefaultPoints is the number of samples along each axis of a field map
// when FieldMapOptions.Points is zero.
const DefaultPoints = 160

// MaxPoints bounds the samples per axis (the map costs points^2 field
// evaluations).
const MaxPoints = 1000

// FieldMapOptions selects what a field map shows; the zero value of each
// field is a documented default.
type FieldMapOptions struct {
	// Points is the number of samples along r and along z, 2..MaxPoints;
	// zero means DefaultPoints.
	Points int
	// Title is the figure title; empty means none.
	Title string
	// Notes are extra lines under the maps.
	Notes []string
}

// FieldMap holds |E| and |H| sampled on a regular grid of the r-z half
// plane, normalised to their largest sampled values; NaN marks points in
// metal.
type FieldMap struct {
	Title  string
	Notes  []string
	R, Z   []float64   // sample positions, m
	E, H   [][]float64 // [iz][ir], each in 0..1 or NaN
	Body   axisym.Body // for the outline
	Length float64     // total length, m
}

// NewFieldMap samples the field of a resonance (its Loss, from
// axisym.Request.Losses) of body b. It fails for a Loss without a field
// and for Points out of range.
func NewFieldMap(b axisym.Body, l *axisym.Loss, opt FieldMapOptions) (*FieldMap, error) {
	if l == nil || l.Field == nil {
		return nil, errors.New("axisymplot: the resonance has no field (solve with Request.Losses)")
	}
	n := opt.Points
	if n == 0 {
		n = DefaultPoints
	}
	if n < 2 || n > MaxPoints {
		return nil, fmt.Errorf("axisymplot: points per axis must be in 2..%d, got %d", MaxPoints, n)
	}
	fm := &FieldMap{Title: opt.Title, Notes: opt.Notes, Body: b, Length: b.Length()}
	rmax := b.MaxRadius()
	// Cell centres, so that no sample sits on a wall or junction plane.
	for i := range n {
		fm.R = append(fm.R, rmax*(float64(i)+0.5)/float64(n))
		fm.Z = append(fm.Z, fm.Length*(float64(i)+0.5)/float64(n))
	}
	fm.E, fm.H = l.Field.Magnitudes(fm.R, fm.Z)
	var emax, hmax float64
	for iz := range fm.Z {
		for ir := range fm.R {
			if e := fm.E[iz][ir]; !math.IsNaN(e) {
				emax, hmax = math.Max(emax, e), math.Max(hmax, fm.H[iz][ir])
			}
		}
	}
	for iz := range fm.Z {
		for ir := range fm.R {
			if emax > 0 {
				fm.E[iz][ir] /= emax
			}
			if hmax > 0 {
				fm.H[iz][ir] /= hmax
			}
		}
	}
	return fm, nil
}

// grid adapts one map to plotter.GridXYZ: columns along z (the x axis, in
// mm), rows along r (mm).
type grid struct {
	fm *FieldMap
	v  [][]float64
}

func (g grid) Dims() (c, r int)        { return len(g.fm.Z), len(g.fm.R) }
func (g grid) Z(c, r int) float64      { return g.v[c][r] }
func (g grid) X(c int) float64         { return g.fm.Z[c] * 1e3 }
func (g grid) Y(r int) float64         { return g.fm.R[r] * 1e3 }
func (g grid) Min() (float64, float64) { return 0, 1 }

var _ plotter.GridXYZ = grid{}

// Figure returns the field map as a figure: |E| above |H|, each
// normalised to its largest value, metal in grey, the body outlined.
func (fm *FieldMap) Figure(th figure.Theme) (*figure.Figure, error) {
	if len(fm.R) < 2 || len(fm.Z) < 2 {
		return nil, errors.New("axisymplot: empty field map")
	}
	fig := figure.NewFigure(th, fm.Title)
	pal := moreland.SmoothBlueRed().Palette(64)
	for _, m := range []struct {
		name string
		v    [][]float64
	}{{"|E| / max", fm.E}, {"|H| / max", fm.H}} {
		p := th.NewPlot("", "z   [mm]", "r   [mm]")
		hm := plotter.NewHeatMap(grid{fm, m.v}, pal)
		hm.Min, hm.Max = 0, 1
		hm.NaN = figure.RGB(0xb8b8b8)
		p.Add(hm)
		if err := outline(p, fm.Body); err != nil {
			return nil, err
		}
		if err := fills(p, fm.Body); err != nil {
			return nil, err
		}
		p.Title.Text = m.name
		p.X.Min, p.X.Max = 0, fm.Length*1e3
		p.Y.Min, p.Y.Max = 0, fm.Body.MaxRadius()*1e3
		fig.Panels = append(fig.Panels, p)
	}
	fig.Notes = append(fig.Notes, "colour: field magnitude over its largest sampled value, 0 (blue) to 1 (red); grey: metal")
	if filled(fm.Body) {
		fig.Notes = append(fig.Notes, "dashed: the edges of the dielectric fills and layers")
	}
	fig.Notes = append(fig.Notes, fm.Notes...)
	return fig, nil
}

// outline draws the metal boundary of the body in the r-z half plane
// (no end plate at an open end).
func outline(p *plot.Plot, b axisym.Body) error {
	sty := draw.LineStyle{Color: figure.Ink, Width: vg.Points(1)}
	var pts plotter.XYs
	z := 0.0
	if b.EndA != axisym.Pipe { // an open end has no plate to draw
		pts = append(pts, plotter.XY{X: 0, Y: 0})
	}
	for _, s := range b.Sections {
		pts = append(pts, plotter.XY{X: z * 1e3, Y: s.Radius * 1e3}, plotter.XY{X: (z + s.Length) * 1e3, Y: s.Radius * 1e3})
		z += s.Length
	}
	if b.EndB != axisym.Pipe {
		pts = append(pts, plotter.XY{X: z * 1e3, Y: 0})
	}
	l, err := plotter.NewLine(pts)
	if err != nil {
		return err
	}
	l.LineStyle = sty
	p.Add(l)
	z = 0
	for _, s := range b.Sections {
		if s.InnerRadius > 0 {
			in, err := plotter.NewLine(plotter.XYs{
				{X: z * 1e3, Y: s.InnerRadius * 1e3}, {X: (z + s.Length) * 1e3, Y: s.InnerRadius * 1e3},
			})
			if err != nil {
				return err
			}
			in.LineStyle = sty
			p.Add(in)
		}
		z += s.Length
	}
	return nil
}

// filled reports whether any section or layer of b holds a medium other
// than vacuum.
func filled(b axisym.Body) bool {
	for _, s := range b.Sections {
		if s.Fill != (physics.Medium{}) {
			return true
		}
		for _, l := range s.Layers {
			if l.Medium != (physics.Medium{}) {
				return true
			}
		}
	}
	return false
}

// fills draws a dashed rectangle around every filled section and every
// filled layer of b in the r-z half plane.
func fills(p *plot.Plot, b axisym.Body) error {
	sty := draw.LineStyle{Color: figure.Ink, Width: vg.Points(0.8), Dashes: []vg.Length{vg.Points(3), vg.Points(2)}}
	box := func(z0, z1, r0, r1 float64) error {
		l, err := plotter.NewLine(plotter.XYs{
			{X: z0 * 1e3, Y: r0 * 1e3}, {X: z0 * 1e3, Y: r1 * 1e3}, {X: z1 * 1e3, Y: r1 * 1e3},
			{X: z1 * 1e3, Y: r0 * 1e3}, {X: z0 * 1e3, Y: r0 * 1e3},
		})
		if err != nil {
			return err
		}
		l.LineStyle = sty
		p.Add(l)
		return nil
	}
	z := 0.0
	for _, s := range b.Sections {
		if s.Fill != (physics.Medium{}) {
			if err := box(z, z+s.Length, s.InnerRadius, s.Radius); err != nil {
				return err
			}
		}
		lo := s.InnerRadius
		for _, l := range s.Layers {
			if l.Medium != (physics.Medium{}) {
				if err := box(z, z+s.Length, lo, l.Radius); err != nil {
					return err
				}
			}
			lo = l.Radius
		}
		z += s.Length
	}
	return nil
}
