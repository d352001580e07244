package modechart

import (
	"cmp"
	"math"
	"slices"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Label is an on-line label as placed by ModeLines.Layout, in canvas
// coordinates.
type Label struct {
	// Line is the index of the labelled line in ModeLines.Lines.
	Line int
	Text string
	// At is the centre of the text, on the line.
	At vg.Point
	// Box is the text's bounding box with its halo margin.
	Box vg.Rectangle
}

// Label placement constants.
const (
	// labelCandidates is the number of positions tried along each line.
	labelCandidates = 41
	// haloPad is the white margin around a label's text.
	haloPad = vg.Length(1.6)
	// edgePad keeps labels this far inside the axes.
	edgePad = vg.Length(2)
	// avoidPad widens each Avoid rectangle, so a point (the design marker)
	// keeps labels clear of its glyph.
	avoidPad = vg.Length(6)
	// emphasisWeight is the cost of covering an emphasised line (wanted,
	// crossing or near) with another line's label, against 1 for an
	// ordinary line.
	emphasisWeight = 6
)

func (ml *ModeLines) labelStyle(l ChartLine) text.Style {
	if l.Role == Wanted {
		return ml.Bold(ml.LabelSize*1.2, ml.LabelColor(l.Kind, l.Role))
	}
	if l.Role != Ordinary {
		return ml.Bold(ml.LabelSize, ml.LabelColor(l.Kind, l.Role))
	}
	return ml.Text(ml.LabelSize, ml.LabelColor(l.Kind, l.Role))
}

// Layout places the line names on data canvas c of plot plt by a
// deterministic greedy method: lines are taken in order of emphasis
// (wanted, crossing, near, then the rest from the lowest intercept up); for
// each, labelCandidates positions along its visible part, from the middle
// outwards, are tried as centres of the (horizontal) label; a position is
// admissible when the label's box lies inside the axes, overlaps no label
// already placed and no Avoid rectangle; among admissible positions the one
// covering the fewest other lines (emphasised lines weigh emphasisWeight)
// wins, ties going to the more central. Lines with no admissible position
// stay unlabelled. The result is in placement order.
func (ml *ModeLines) Layout(c draw.Canvas, plt *plot.Plot) []Label {
	area := vg.Rectangle{
		Min: vg.Point{X: c.Min.X + edgePad, Y: c.Min.Y + edgePad},
		Max: vg.Point{X: c.Max.X - edgePad, Y: c.Max.Y - edgePad},
	}
	trX, trY := plt.Transforms(&c)
	w := float64(c.Max.X - c.Min.X)
	invX := func(x vg.Length) float64 {
		return plt.X.Min + float64(x-c.Min.X)/w*(plt.X.Max-plt.X.Min)
	}
	var blocked []vg.Rectangle
	for _, r := range ml.Avoid {
		blocked = append(blocked, vg.Rectangle{
			Min: vg.Point{X: trX(r.XMin) - avoidPad, Y: trY(r.YMin) - avoidPad},
			Max: vg.Point{X: trX(r.XMax) + avoidPad, Y: trY(r.YMax) + avoidPad},
		})
	}

	order := make([]int, len(ml.Lines))
	for i := range order {
		order[i] = i
	}
	slices.SortStableFunc(order, func(a, b int) int {
		return cmp.Compare(ml.Lines[b].Role, ml.Lines[a].Role)
	})

	// covers returns the weighted number of lines other than skip that
	// pass through box b. Lines rise with X, so line j crosses b exactly
	// when y_j(left edge) <= top and y_j(right edge) >= bottom.
	covers := func(b vg.Rectangle, skip int) int {
		xl, xr := invX(b.Min.X), invX(b.Max.X)
		n := 0
		for j, l := range ml.Lines {
			if j == skip {
				continue
			}
			yl, yr := trY(ml.y(l, xl)), trY(ml.y(l, xr))
			if yl <= b.Max.Y && yr >= b.Min.Y {
				if l.Role != Ordinary {
					n += emphasisWeight
				} else {
					n++
				}
			}
		}
		return n
	}

	fracs := candidateFractions()
	var placed []Label
	for _, i := range order {
		l := ml.Lines[i]
		pts := ml.path(l, c, plt)
		if len(pts) < 2 {
			continue
		}
		sty := ml.labelStyle(l)
		tr := sty.Rectangle(l.Label)
		cum := make([]vg.Length, len(pts))
		for k := 1; k < len(pts); k++ {
			cum[k] = cum[k-1] + dist(pts[k-1], pts[k])
		}
		total := cum[len(cum)-1]
		if total <= 0 {
			continue
		}
		best, bestScore := Label{}, math.MaxInt
		for _, f := range fracs {
			p := pointAlong(pts, cum, vg.Length(f)*total)
			box := vg.Rectangle{
				Min: vg.Point{X: p.X + tr.Min.X - haloPad, Y: p.Y + tr.Min.Y - haloPad},
				Max: vg.Point{X: p.X + tr.Max.X + haloPad, Y: p.Y + tr.Max.Y + haloPad},
			}
			if !inside(box, area) || overlapsAny(box, blocked) || overlapsLabels(box, placed) {
				continue
			}
			if s := covers(box, i); s < bestScore {
				best, bestScore = Label{Line: i, Text: l.Label, At: p, Box: box}, s
				if s == 0 {
					break
				}
			}
		}
		if bestScore < math.MaxInt {
			placed = append(placed, best)
		}
	}
	return placed
}

// candidateFractions returns positions along a line as fractions of its
// visible length, from the middle outwards: 0.5, 0.5±d, 0.5±2d, ...
func candidateFractions() []float64 {
	const lo, hi = 0.04, 0.96
	half := labelCandidates / 2
	d := (hi - lo) / float64(2*half)
	out := []float64{0.5}
	for k := 1; k <= half; k++ {
		out = append(out, 0.5+float64(k)*d, 0.5-float64(k)*d)
	}
	return out
}

func dist(a, b vg.Point) vg.Length {
	return vg.Length(math.Hypot(float64(b.X-a.X), float64(b.Y-a.Y)))
}

// pointAlong returns the point at arc length s along the polyline.
func pointAlong(pts []vg.Point, cum []vg.Length, s vg.Length) vg.Point {
	k, _ := slices.BinarySearch(cum, s)
	if k <= 0 {
		return pts[0]
	}
	if k >= len(pts) {
		return pts[len(pts)-1]
	}
	seg := cum[k] - cum[k-1]
	if seg <= 0 {
		return pts[k]
	}
	t := (s - cum[k-1]) / seg
	return vg.Point{X: pts[k-1].X + t*(pts[k].X-pts[k-1].X), Y: pts[k-1].Y + t*(pts[k].Y-pts[k-1].Y)}
}

func inside(b, area vg.Rectangle) bool {
	return b.Min.X >= area.Min.X && b.Max.X <= area.Max.X && b.Min.Y >= area.Min.Y && b.Max.Y <= area.Max.Y
}

func overlaps(a, b vg.Rectangle) bool {
	return a.Min.X < b.Max.X && b.Min.X < a.Max.X && a.Min.Y < b.Max.Y && b.Min.Y < a.Max.Y
}

func overlapsAny(b vg.Rectangle, rs []vg.Rectangle) bool {
	for _, r := range rs {
		if overlaps(b, r) {
			return true
		}
	}
	return false
}

func overlapsLabels(b vg.Rectangle, ls []Label) bool {
	for _, l := range ls {
		if overlaps(b, l.Box) {
			return true
		}
	}
	return false
}
