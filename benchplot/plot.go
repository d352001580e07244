package benchplot

import (
	"fmt"
	"math"
	"math/cmplx"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"cylcav/figure"
	"cylcav/measure"
)

// dbFloor is the lowest level drawn, dB: a zero of the measured magnitude
// (a point exactly at a notch) would otherwise be -Inf.
const dbFloor = -200.0

func db(v complex128) float64 { return math.Max(20*math.Log10(cmplx.Abs(v)), dbFloor) }

// SweepPlot is a whole measured sweep with its fitted resonances.
type SweepPlot struct {
	F    []float64    // frequencies, Hz, ascending
	S    []complex128 // the measured parameter at F
	Name string       // the parameter's name, "S21" or "S11"
	Res  []measure.Resonance

	// Modes, when not nil, holds the mode named for each resonance of Res
	// (measure.Identify), "" where none was; it is drawn under the number.
	Modes []string
}

// SetModes labels the resonances with the modes of id (one Assignment
// per resonance of Res): the mode where it matched, "?" where it did not;
// a TE0mp/TM1mp pair that showed one resonance gets both names.
func (sp *SweepPlot) SetModes(id *measure.Identification) error {
	if len(id.Assign) != len(sp.Res) {
		return fmt.Errorf("benchplot: %d mode assignments for %d resonances", len(id.Assign), len(sp.Res))
	}
	sp.Modes = make([]string, len(sp.Res))
	for i, a := range id.Assign {
		switch {
		case !a.Matched:
			sp.Modes[i] = "?"
		case a.Unresolved:
			c, _ := a.Mode.Companion()
			sp.Modes[i] = a.Mode.String() + "/" + c.String()
		default:
			sp.Modes[i] = a.Mode.String()
		}
	}
	return nil
}

// NewSweepPlot copies the sweep and the resonances. It rejects an empty
// sweep, mismatched lengths and non-finite values.
func NewSweepPlot(f []float64, s []complex128, name string, res []measure.Resonance) (*SweepPlot, error) {
	if len(f) < 2 || len(f) != len(s) {
		return nil, fmt.Errorf("benchplot: a sweep needs at least 2 points and one S value per frequency, got %d and %d", len(f), len(s))
	}
	for i := range f {
		if math.IsNaN(f[i]) || math.IsInf(f[i], 0) || cmplx.IsNaN(s[i]) || cmplx.IsInf(s[i]) {
			return nil, fmt.Errorf("benchplot: point %d is not finite", i+1)
		}
	}
	return &SweepPlot{F: append([]float64(nil), f...), S: append([]complex128(nil), s...), Name: name,
		Res: append([]measure.Resonance(nil), res...)}, nil
}

// Figure draws the sweep in dB over frequency, each fitted resonance
// marked at its f0 and numbered from 1 in the order of Res, with its mode
// under the number when Modes is set.
func (sp *SweepPlot) Figure(th figure.Theme) (*figure.Figure, error) {
	scale, unit := figure.FrequencyUnit(sp.F[len(sp.F)-1])
	p := th.NewPlot("", "Frequency ("+unit+")", "|"+sp.Name+"| (dB)")
	xs := make([]float64, len(sp.S))
	ys := make([]float64, len(sp.S))
	for i, v := range sp.S {
		xs[i], ys[i] = sp.F[i]/scale, db(v)
	}
	if _, err := figure.AddCurve(p, xs, ys, 1, th.Series(0)); err != nil {
		return nil, err
	}
	// Labels of resonances closer than labelGap of the span to the
	// previous one are stacked a level higher, so that neighbours (a split
	// TE0mp/TM1mp pair) stay readable.
	const labelGap = 0.03
	span := sp.F[len(sp.F)-1] - sp.F[0]
	var pts plotter.XYs
	var levels [][]int // indices into pts by level
	var labels []string
	prev, level := math.Inf(-1), 0
	for i, r := range sp.Res {
		if math.IsNaN(r.F0) {
			continue
		}
		k := nearest(sp.F, r.F0)
		if r.F0-prev < labelGap*span {
			level++
		} else {
			level = 0
		}
		prev = r.F0
		for len(levels) <= level {
			levels = append(levels, nil)
		}
		levels[level] = append(levels[level], len(pts))
		pts = append(pts, plotter.XY{X: r.F0 / scale, Y: ys[k]})
		lab := strconv.Itoa(i + 1)
		if sp.Modes != nil && sp.Modes[i] != "" {
			lab += "\n" + sp.Modes[i]
		}
		labels = append(labels, lab)
	}
	fig := figure.NewFigure(th, "Measured sweep and fitted resonances")
	fig.Legend.Add("|"+sp.Name+"| measured", figure.LineThumb{LineStyle: th.Series(0)})
	if len(pts) > 0 {
		sc, err := plotter.NewScatter(pts)
		if err != nil {
			return nil, err
		}
		sc.GlyphStyle = th.Marker(2)
		p.Add(sc)
		lines := 1
		if sp.Modes != nil {
			lines = 2
		}
		for lv, idx := range levels {
			var xy plotter.XYLabels
			for _, j := range idx {
				xy.XYs = append(xy.XYs, pts[j])
				xy.Labels = append(xy.Labels, labels[j])
			}
			lb, err := plotter.NewLabels(xy)
			if err != nil {
				return nil, err
			}
			sty := th.Text(th.TickSize, figure.Ink)
			sty.XAlign, sty.YAlign = draw.XCenter, draw.YBottom
			for i := range lb.TextStyle {
				lb.TextStyle[i] = sty
			}
			h := sty.Rectangle("0").Size().Y
			lb.Offset = vg.Point{Y: vg.Points(5) + vg.Length(lv*lines)*h*1.1}
			p.Add(lb)
		}
		what := "fitted resonance (numbered as in the table)"
		if sp.Modes != nil {
			what = "fitted resonance: number as in the table, identified mode (? = no cavity mode)"
		}
		fig.Legend.Add(what, figure.GlyphThumb{GlyphStyle: th.Marker(2)})
	}
	fig.Panels = []*plot.Plot{p}
	return fig, nil
}

func nearest(f []float64, x float64) int {
	k := 0
	for i := range f {
		if math.Abs(f[i]-x) < math.Abs(f[k]-x) {
			k = i
		}
	}
	return k
}

// FitPlot is one fitted resonance: the measured points of its window and
// the fitted model.
type FitPlot struct {
	F     []float64
	S     []complex128
	Name  string // "S11", "S21"
	Fit   measure.Circle
	Index int // number of the resonance in the table, from 1
}

// NewFitPlot copies the measured points of the fit's window [c.Lo, c.Hi]
// out of the sweep f, s.
func NewFitPlot(f []float64, s []complex128, name string, c measure.Circle, index int) (*FitPlot, error) {
	if len(f) != len(s) {
		return nil, fmt.Errorf("benchplot: %d frequencies and %d S values", len(f), len(s))
	}
	fp := &FitPlot{Name: name, Fit: c, Index: index}
	for i := range f {
		if f[i] >= c.Lo && f[i] <= c.Hi {
			if cmplx.IsNaN(s[i]) || cmplx.IsInf(s[i]) {
				return nil, fmt.Errorf("benchplot: point %d is not finite", i+1)
			}
			fp.F = append(fp.F, f[i])
			fp.S = append(fp.S, s[i])
		}
	}
	if len(fp.F) < 2 {
		return nil, fmt.Errorf("benchplot: the fit's window %g..%g Hz holds %d points of the sweep", c.Lo, c.Hi, len(fp.F))
	}
	return fp, nil
}

// fitCurvePoints is the number of points of the drawn fitted curve.
const fitCurvePoints = 400

// Figure draws two panels: the magnitude in dB over frequency (measured
// points, fitted curve) and the complex plane with the cable delay
// removed, where the measured points lie on the fitted circle (for a
// reflection fit, the Q circle inside the unit circle of the Smith chart).
func (fp *FitPlot) Figure(th figure.Theme) (*figure.Figure, error) {
	c := fp.Fit
	scale, unit := figure.FrequencyUnit(c.Hi)
	mag := th.NewPlot("", "Frequency ("+unit+")", "|"+fp.Name+"| (dB)")
	var meas, circ plotter.XYs
	for i, f := range fp.F {
		meas = append(meas, plotter.XY{X: f / scale, Y: db(fp.S[i])})
		v := fp.S[i] * cmplx.Exp(complex(0, 2*math.Pi*f*c.Delay))
		circ = append(circ, plotter.XY{X: real(v), Y: imag(v)})
	}
	fx := make([]float64, fitCurvePoints)
	fy := make([]float64, fitCurvePoints)
	var fitC plotter.XYs
	for i := range fx {
		f := c.Lo + (c.Hi-c.Lo)*float64(i)/(fitCurvePoints-1)
		m := c.Model(f)
		fx[i], fy[i] = f/scale, db(m)
		v := m * cmplx.Exp(complex(0, 2*math.Pi*f*c.Delay))
		fitC = append(fitC, plotter.XY{X: real(v), Y: imag(v)})
	}
	sc, err := plotter.NewScatter(meas)
	if err != nil {
		return nil, err
	}
	sc.GlyphStyle = th.Marker(1)
	sc.GlyphStyle.Radius = vg.Points(1.8)
	mag.Add(sc)
	if _, err := figure.AddCurve(mag, fx, fy, 1, th.Series(2)); err != nil {
		return nil, err
	}

	plane := th.NewPlot("", "Re "+fp.Name+" (delay removed)", "Im "+fp.Name)
	if fp.Name == "S11" || fp.Name == "S22" {
		var unitCircle plotter.XYs
		for i := 0; i <= 360; i++ {
			a := float64(i) * math.Pi / 180
			unitCircle = append(unitCircle, plotter.XY{X: math.Cos(a), Y: math.Sin(a)})
		}
		l, err := plotter.NewLine(unitCircle)
		if err != nil {
			return nil, err
		}
		l.LineStyle = th.Grid
		plane.Add(l)
	}
	sc2, err := plotter.NewScatter(circ)
	if err != nil {
		return nil, err
	}
	sc2.GlyphStyle = sc.GlyphStyle
	plane.Add(sc2)
	l2, err := plotter.NewLine(fitC)
	if err != nil {
		return nil, err
	}
	l2.LineStyle = th.Series(2)
	plane.Add(l2)
	// Equal ranges on both axes around the data; the figure widens one of
	// them at draw time so that the circle is round (Figure.Equal).
	xmin, xmax, ymin, ymax := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for _, q := range [][]plotter.XY{circ, fitC} {
		for _, v := range q {
			xmin, xmax = math.Min(xmin, v.X), math.Max(xmax, v.X)
			ymin, ymax = math.Min(ymin, v.Y), math.Max(ymax, v.Y)
		}
	}
	half := 0.55 * math.Max(xmax-xmin, ymax-ymin)
	cx, cy := (xmin+xmax)/2, (ymin+ymax)/2
	plane.X.Min, plane.X.Max = cx-half, cx+half
	plane.Y.Min, plane.Y.Max = cy-half, cy+half

	title := fmt.Sprintf("Resonance %d: f0 = %.9g GHz, QL = %.6g", fp.Index, c.F0/1e9, c.QL)
	fig := figure.NewFigure(th, title)
	fig.Panels = []*plot.Plot{mag, plane}
	fig.Equal = []*plot.Plot{plane}
	fig.Legend.Add("measured", figure.GlyphThumb{GlyphStyle: sc.GlyphStyle})
	fig.Legend.Add("linear fractional fit (Kajfez 1994)", figure.LineThumb{LineStyle: th.Series(2)})
	fig.Notes = []string{fmt.Sprintf("%d points; RMS residual %.3g; cable delay removed %.4g ns", c.Points, c.Residual, c.Delay*1e9)}
	return fig, nil
}
