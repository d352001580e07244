package filterplot

import (
	"errors"
	"fmt"
	"image/color"
	"math"
	"slices"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"cylcav/figure"
	"cylcav/filter"
)

// Response plots: |S21| and |S11| in dB with the specification mask, and the
// group delay of S21, drawn through package figure (figure.Render writes
// the figure as PNG, SVG or PDF).

// DefaultPlotPoints is the number of uniformly spaced frequencies of a
// response plot when PlotOptions.Points is zero (the exact band edges,
// centre and transmission zeros are added to them).
const DefaultPlotPoints = 2001

// PlotOptions selects what a response plot shows. The zero value of each
// field is a documented default.
type PlotOptions struct {
	// Lo and Hi are the frequency range, Hz; both zero means
	// filter.SweepRange(d, filter.DefaultSpan).
	Lo, Hi float64
	// Points is the number of uniformly spaced frequencies, 2..
	// filter.MaxSweepPoints; zero means DefaultPlotPoints.
	Points int
	// Q0 holds one unloaded Q per resonator (+Inf allowed), or is empty
	// for the lossless response.
	Q0 []float64
	// Title is the figure title; empty means one made from the design
	// (family, order, f0, bandwidth, zeros).
	Title string
	// Notes are extra lines printed under the legend, after the plot's own
	// note on the model and the losses.
	Notes []string
}

// RejectionMask is the drawn form of one region of the specification mask
// (Spec.Mask): |S21| must stay at or below Level dB from F outwards to Edge
// (Edge > F above the band, Edge < F below it), the end of the region's
// band of interest or of the plot, whichever is nearer; Edge = F for a
// rejection outside the model range, which is not checked.
type RejectionMask struct {
	F     float64 // Hz, the stated frequency
	Edge  float64 // Hz, the edge of the plot on the same side of the band
	Level float64 // dB, minus the required attenuation
}

// ResponsePlot is the data of a response plot, computed by NewResponsePlot
// and drawn by Figure. All frequencies are in Hz.
type ResponsePlot struct {
	Title string
	// F holds the frequencies, ascending; S21DB and S11DB are
	// 20 log10 |S| there (-Inf where S vanishes exactly), GroupDelay the
	// group delay of S21 in seconds (NaN where S21 = 0).
	F, S21DB, S11DB, GroupDelay []float64
	// Lo and Hi are the frequency range drawn.
	Lo, Hi float64
	// Passband holds the band edges f1 and f2.
	Passband [2]float64
	// ReturnLoss is the return-loss requirement in dB, drawn as the line
	// |S11| = -ReturnLoss across the passband; zero for a Butterworth
	// design, which has none.
	ReturnLoss float64
	// Rejections are the rejection requirements of the specification.
	Rejections []RejectionMask
	// Zeros are the transmission zeros of the design inside Lo..Hi.
	Zeros []float64
	// DBMin is the bottom of the dB axis (dB, < 0) and DBMax its top;
	// DelayMax is the top of the group-delay axis, s (its bottom is 0).
	DBMin, DBMax, DelayMax float64
	// Lossless is true when the response has no finite unloaded Q.
	Lossless bool
	// Notes are printed under the legend.
	Notes []string
}

// dbFloorMin is the least depth of the dB axis: stopbands are read to at
// least -80 dB (common practice for cavity filter plots).
const dbFloorMin = 80.0

// dbFloorExtra is how far the dB axis reaches below the deepest requirement
// (rejection or return loss), so that the margin on it can be read.
const dbFloorExtra = 20.0

// delayHeadroom is the top of the group-delay axis as a multiple of the
// largest passband delay; beyond the passband the delay is clipped (the
// spikes at lossy transmission zeros would flatten the passband detail).
const delayHeadroom = 1.4

// NewResponsePlot computes the response of design d for a plot: |S21|,
// |S11| and group delay over opts' frequency range at the uniform grid plus
// the exact band edges, centre and transmission zeros, and the mask of the
// specification (return-loss line, rejection segments). The dB axis reaches
// down to the deeper of -80 dB and 20 dB below the deepest requirement,
// rounded to 10 dB; the delay axis to 1.4 times the largest passband delay.
// Errors: a nil design, a bad range, point count or Q0.
func NewResponsePlot(d *filter.Design, opts PlotOptions) (*ResponsePlot, error) {
	if d == nil || d.Folded == nil || d.Spec.Order < 1 {
		return nil, errors.New("filterplot: response plot needs a synthesised design (from Synthesize)")
	}
	s := d.Spec
	lo, hi := opts.Lo, opts.Hi
	if lo == 0 && hi == 0 {
		var err error
		if lo, hi, err = filter.SweepRange(d, filter.DefaultSpan); err != nil {
			return nil, err
		}
	}
	n := opts.Points
	if n == 0 {
		n = DefaultPlotPoints
	}
	fs, err := filter.Sweep(lo, hi, n)
	if err != nil {
		return nil, err
	}
	f1, f2 := filter.BandpassFrequency(-1, s.F0, s.BW), filter.BandpassFrequency(1, s.F0, s.BW)
	extra := []float64{f1, s.F0, f2}
	rp := &ResponsePlot{Lo: lo, Hi: hi, Passband: [2]float64{f1, f2}, DBMax: 3, Lossless: true}
	for _, z := range d.Zeros {
		fz := filter.BandpassFrequency(z, s.F0, s.BW)
		if fz >= lo && fz <= hi {
			extra = append(extra, fz)
			rp.Zeros = append(rp.Zeros, fz)
		}
	}
	slices.Sort(rp.Zeros)
	for _, f := range extra {
		if f > lo && f < hi {
			fs = append(fs, f)
		}
	}
	slices.Sort(fs)
	fs = slices.Compact(fs)
	pts, err := d.Response(fs, opts.Q0)
	if err != nil {
		return nil, err
	}
	for _, q := range opts.Q0 {
		if !math.IsInf(q, 1) {
			rp.Lossless = false
		}
	}
	rp.F = fs
	rp.S21DB = make([]float64, len(pts))
	rp.S11DB = make([]float64, len(pts))
	rp.GroupDelay = make([]float64, len(pts))
	maxDelay := 0.0
	for i, p := range pts {
		rp.S21DB[i], rp.S11DB[i], rp.GroupDelay[i] = p.S21DB(), p.S11DB(), p.GroupDelay
		if p.F >= f1 && p.F <= f2 && !math.IsNaN(p.GroupDelay) {
			maxDelay = math.Max(maxDelay, p.GroupDelay)
		}
	}
	mask := d.Mask() // the specification mask that Check and MinOrder use
	rp.ReturnLoss = mask.ReturnLoss
	deepest := rp.ReturnLoss
	for _, g := range mask.Regions {
		edge := math.Min(g.High, hi)
		if !g.Above {
			edge = math.Max(g.Low, lo)
		}
		if g.OutsideModel {
			edge = g.F // not checkable: the marker only
		}
		rp.Rejections = append(rp.Rejections, RejectionMask{F: g.F, Edge: edge, Level: -g.Attenuation})
		deepest = math.Max(deepest, g.Attenuation)
	}
	floor := math.Max(dbFloorMin, deepest+dbFloorExtra)
	rp.DBMin = -10 * math.Ceil(floor/10)
	if !(maxDelay > 0) {
		maxDelay = 1 / s.BW // a scale for the axis only (never reached for N >= 1)
	}
	rp.DelayMax = delayHeadroom * maxDelay
	rp.Title = opts.Title
	if rp.Title == "" {
		rp.Title = plotTitle(d)
	}
	rp.Notes = append(rp.Notes, rp.lossNote(opts.Q0, d.Spec.Order, d.Topology.Description()))
	rp.Notes = append(rp.Notes, opts.Notes...)
	return rp, nil
}

// plotTitle describes the design in one line.
func plotTitle(d *filter.Design) string {
	s := d.Spec
	fs, fu := figure.FrequencyUnit(s.F0)
	t := fmt.Sprintf("%d-resonator %s bandpass filter, f0 = %s %s, bw = %s",
		s.Order, familyName(s.Family), trimFloat(s.F0/fs, 6), fu, plainFrequency(s.BW))
	switch len(d.Zeros) {
	case 0:
	case 1:
		t += ", 1 transmission zero"
	default:
		t += fmt.Sprintf(", %d transmission zeros", len(d.Zeros))
	}
	return t
}

func familyName(f filter.Family) string {
	if f == filter.Butterworth {
		return "Butterworth"
	}
	return "Chebyshev"
}

// lossNote states the model (form: the matrix's topology, as
// filter.Topology.Description gives it) and the losses of the plotted
// response.
func (rp *ResponsePlot) lossNote(q0 []float64, n int, form string) string {
	model := "Response of the folded N+2 coupling matrix, Omega = (f0/bw)(f/f0 - f0/f)"
	if form != "folded canonical form" {
		model = "Response of the N+2 coupling matrix (" + form + "), Omega = (f0/bw)(f/f0 - f0/f)"
	}
	if rp.Lossless {
		return model + "; lossless (Q0 infinite)."
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, q := range q0 {
		lo, hi = math.Min(lo, q), math.Max(hi, q)
	}
	if lo == hi {
		return fmt.Sprintf("%s; unloaded Q0 = %s in each of the %d resonators.", model, trimFloat(lo, 5), n)
	}
	return fmt.Sprintf("%s; unloaded Q0 = %s..%s across the %d resonators.", model, trimFloat(lo, 5), trimFloat(hi, 5), n)
}

// plainFrequency prints f with up to 6 significant digits in its own unit,
// without trailing zeros ("200 MHz", "1.25 GHz").
func plainFrequency(f float64) string {
	sc, u := figure.FrequencyUnit(f)
	return trimFloat(f/sc, 6) + " " + u
}

// trimFloat prints x with up to digits significant digits and no trailing
// zeros.
func trimFloat(x float64, digits int) string {
	v, _ := strconv.ParseFloat(strconv.FormatFloat(x, 'g', digits, 64), 64)
	return strconv.FormatFloat(v, 'f', -1, 64)
}

// Colours of the mask: the requirement lines in the palette's red, the
// forbidden stopband region in a light wash of it, the passband in a light
// wash of sand.
var (
	maskFill     = color.NRGBA{R: 0xcc, G: 0x33, B: 0x11, A: 0x1c}
	passbandFill = color.NRGBA{R: 0xcc, G: 0xbb, B: 0x44, A: 0x33}
)

// Figure draws the plot in theme th: the upper panel |S21| and |S11| in dB
// with the specification mask (return-loss line across the passband, the
// forbidden region above each rejection level, transmission zeros marked
// on the frequency axis), the lower panel the group delay in ns; both over
// the same frequency axis with the passband shaded, a legend and notes
// below. Values beyond the axes are clipped.
func (rp *ResponsePlot) Figure(th figure.Theme) (*figure.Figure, error) {
	if len(rp.F) < 2 || len(rp.S21DB) != len(rp.F) || len(rp.S11DB) != len(rp.F) || len(rp.GroupDelay) != len(rp.F) {
		return nil, fmt.Errorf("filterplot: response plot needs at least 2 points in parallel slices, got %d frequencies", len(rp.F))
	}
	if !(rp.DBMin < rp.DBMax) || !(rp.DelayMax > 0) || !(rp.Hi > rp.Lo) {
		return nil, fmt.Errorf("filterplot: response plot axes are empty: %g..%g Hz, %g..%g dB, delay to %g s", rp.Lo, rp.Hi, rp.DBMin, rp.DBMax, rp.DelayMax)
	}
	fs, fu := figure.FrequencyUnit(rp.Hi)
	x := make([]float64, len(rp.F))
	for i, f := range rp.F {
		x[i] = f / fs
	}
	xlo, xhi := rp.Lo/fs, rp.Hi/fs
	fig := figure.NewFigure(th, rp.Title)
	xLabel := "frequency   [" + fu + "]"
	top := th.NewPlot("", xLabel, "|S21|, |S11|   [dB]")
	bot := th.NewPlot("", xLabel, "group delay of S21   [ns]")

	// Passband wash, under everything else.
	for _, pp := range []struct {
		p      *plot.Plot
		y0, y1 float64
	}{{top, rp.DBMin, rp.DBMax}, {bot, 0, rp.DelayMax * 1e9}} {
		r, err := figure.NewRegion(rp.Passband[0]/fs, rp.Passband[1]/fs, pp.y0, pp.y1)
		if err != nil {
			return nil, err
		}
		r.Fill, r.LineStyle, r.NoRange = passbandFill, draw.LineStyle{}, true
		pp.p.Add(r)
	}

	// Rejection masks: the forbidden region above each level.
	req := draw.LineStyle{Color: figure.Red, Width: vg.Points(1.2), Dashes: []vg.Length{vg.Points(6), vg.Points(2.5)}}
	rejGlyph := draw.GlyphStyle{Color: figure.Red, Radius: vg.Points(3.2), Shape: draw.TriangleGlyph{}}
	for _, m := range rp.Rejections {
		a, b := math.Min(m.F, m.Edge)/fs, math.Max(m.F, m.Edge)/fs
		r, err := figure.NewRegion(a, b, m.Level, rp.DBMax)
		if err != nil {
			return nil, err
		}
		r.Fill, r.LineStyle, r.NoRange = maskFill, draw.LineStyle{}, true
		top.Add(r)
		if err := addLine(top, []float64{a, b}, []float64{m.Level, m.Level}, req); err != nil {
			return nil, err
		}
		sc, err := plotter.NewScatter(plotter.XYs{{X: m.F / fs, Y: m.Level}})
		if err != nil {
			return nil, err
		}
		sc.GlyphStyle = rejGlyph
		top.Add(sc)
	}

	// Responses: S11 under S21.
	s21, s11 := th.Series(0), th.Series(1)
	clip := rp.DBMin - 0.1*(rp.DBMax-rp.DBMin) // below the axis: drawn off the bottom, clipped
	if err := addLine(top, x, clampBelow(rp.S11DB, clip), s11); err != nil {
		return nil, err
	}
	if err := addLine(top, x, clampBelow(rp.S21DB, clip), s21); err != nil {
		return nil, err
	}
	if rp.ReturnLoss > 0 {
		l := []float64{rp.Passband[0] / fs, rp.Passband[1] / fs}
		if err := addLine(top, l, []float64{-rp.ReturnLoss, -rp.ReturnLoss}, req); err != nil {
			return nil, err
		}
	}
	fig.Legend.Add("|S21|, transmission", figure.LineThumb{LineStyle: s21})
	fig.Legend.Add("|S11|, reflection", figure.LineThumb{LineStyle: s11})
	if rp.ReturnLoss > 0 {
		fig.Legend.Add(fmt.Sprintf("return-loss limit, -%s dB", trimFloat(rp.ReturnLoss, 4)), figure.LineThumb{LineStyle: req})
	}
	if len(rp.Rejections) > 0 {
		fig.Legend.Add("rejection limit, from the marker outwards",
			figure.BoxThumb{Fill: maskFill}, figure.LineThumb{LineStyle: req}, figure.GlyphThumb{GlyphStyle: rejGlyph})
	}
	if len(rp.Zeros) > 0 {
		zg := draw.GlyphStyle{Color: figure.Ink, Radius: vg.Points(3.4), Shape: draw.PyramidGlyph{}}
		var xys plotter.XYs
		for _, z := range rp.Zeros {
			xys = append(xys, plotter.XY{X: z / fs, Y: rp.DBMin + 0.035*(rp.DBMax-rp.DBMin)})
		}
		sc, err := plotter.NewScatter(xys)
		if err != nil {
			return nil, err
		}
		sc.GlyphStyle = zg
		top.Add(sc)
		fig.Legend.Add("transmission zero of the design", figure.GlyphThumb{GlyphStyle: zg})
	}
	fig.Legend.Add("passband", figure.BoxThumb{Fill: passbandFill})

	// The delay is alone in its panel: a solid line in a colour the mask
	// does not use.
	gd := draw.LineStyle{Color: figure.Purple, Width: 1.6 * th.LineWidth}
	ns := make([]float64, len(rp.GroupDelay))
	for i, v := range rp.GroupDelay {
		ns[i] = v * 1e9
	}
	if err := addLine(bot, x, ns, gd); err != nil {
		return nil, err
	}
	fig.Legend.Add("group delay of S21", figure.LineThumb{LineStyle: gd})

	top.X.Min, top.X.Max, top.Y.Min, top.Y.Max = xlo, xhi, rp.DBMin, rp.DBMax
	bot.X.Min, bot.X.Max, bot.Y.Min, bot.Y.Max = xlo, xhi, 0, rp.DelayMax*1e9
	top.Y.Tick.Marker = figure.Ticks{N: 8}
	fig.Panels = []*plot.Plot{top, bot}
	fig.Notes = rp.Notes
	return fig, nil
}

// clampBelow returns ys with every value below floor (and -Inf) replaced by
// floor, so that deep notches run off the bottom of the axes instead of
// breaking the line; NaN stays NaN.
func clampBelow(ys []float64, floor float64) []float64 {
	out := make([]float64, len(ys))
	for i, y := range ys {
		if y < floor {
			y = floor
		}
		out[i] = y
	}
	return out
}

// addLine adds the polyline (xs, ys) in style sty to p, split at NaN or
// infinite values (see figure.Runs).
func addLine(p *plot.Plot, xs, ys []float64, sty draw.LineStyle) error {
	_, err := figure.AddCurve(p, xs, ys, 1, sty)
	return err
}
