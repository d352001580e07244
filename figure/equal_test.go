package figure

import (
	"math"
	"testing"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// equalTol is the relative difference of the two axes' scales accepted
// after equalRanges: its second pass corrects for the tick labels that the
// first pass's ranges bring, and a third would move them by far less
// than a point on a data area of hundreds (derived).
const equalTol = 1e-3

// TestEqualRanges: the ranges equalRanges returns, measured against the
// data area gonum/plot itself lays out for them (plot.DataCanvas), have one
// data unit equally long on both axes; they contain the original ranges,
// share their centres, and leave the plot's ranges untouched.
func TestEqualRanges(t *testing.T) {
	for _, tc := range []struct {
		name           string
		x0, x1, y0, y1 float64
		w, h           vg.Length
	}{
		{"wide data, wide page", 0, 10, -0.5, 0.5, 400, 200},
		{"tall data, wide page", -0.1, 0.1, -2, 3, 500, 150},
		{"square data, tall page", -1, 1, -1, 1, 200, 500},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := plot.New()
			p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = tc.x0, tc.x1, tc.y0, tc.y1
			c := draw.New(vgimg.New(tc.w, tc.h))
			x0, x1, y0, y1 := equalRanges(p, c)
			if p.X.Min != tc.x0 || p.X.Max != tc.x1 || p.Y.Min != tc.y0 || p.Y.Max != tc.y1 {
				t.Errorf("plot ranges changed to %g..%g, %g..%g", p.X.Min, p.X.Max, p.Y.Min, p.Y.Max)
			}
			if x0 > tc.x0 || x1 < tc.x1 || y0 > tc.y0 || y1 < tc.y1 {
				t.Errorf("ranges %g..%g, %g..%g do not contain the data's", x0, x1, y0, y1)
			}
			if math.Abs((x0+x1)-(tc.x0+tc.x1)) > 1e-12 || math.Abs((y0+y1)-(tc.y0+tc.y1)) > 1e-12 {
				t.Errorf("centres moved: %g..%g, %g..%g", x0, x1, y0, y1)
			}
			p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = x0, x1, y0, y1
			da := p.DataCanvas(c)
			sx, sy := (x1-x0)/float64(da.Size().X), (y1-y0)/float64(da.Size().Y)
			if math.Abs(sx-sy) > equalTol*sy {
				t.Errorf("scales %.6g and %.6g data units per point", sx, sy)
			}
		})
	}
}
