package figure

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg/draw"
)

// Runs splits the polyline (xs[i], ys[i]·scale) where the scaled y is NaN
// or infinite into runs of at least two points, in order; a single finite
// point between two gaps is dropped (it would draw nothing). It returns an
// error when xs and ys differ in length.
func Runs(xs, ys []float64, scale float64) ([]plotter.XYs, error) {
	if len(xs) != len(ys) {
		return nil, fmt.Errorf("figure: %d x values but %d y values", len(xs), len(ys))
	}
	var out []plotter.XYs
	var cur plotter.XYs
	flush := func() {
		if len(cur) >= 2 {
			out = append(out, cur)
		}
		cur = nil
	}
	for i := range xs {
		y := ys[i] * scale
		if math.IsNaN(y) || math.IsInf(y, 0) {
			flush()
			continue
		}
		cur = append(cur, plotter.XY{X: xs[i], Y: y})
	}
	flush()
	return out, nil
}

// AddCurve draws (x, y·scale) on p as lines in style sty, broken where the
// scaled y is not finite (see Runs), and returns the runs drawn.
func AddCurve(p *plot.Plot, xs, ys []float64, scale float64, sty draw.LineStyle) ([]plotter.XYs, error) {
	runs, err := Runs(xs, ys, scale)
	if err != nil {
		return nil, err
	}
	for _, r := range runs {
		l, err := plotter.NewLine(r)
		if err != nil {
			return nil, err
		}
		l.LineStyle = sty
		p.Add(l)
	}
	return runs, nil
}
