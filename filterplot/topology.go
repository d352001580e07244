package filterplot

import (
	"errors"
	"fmt"
	"image/color"
	"math"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"cylcav/figure"
	"cylcav/filter"
)

// The topology diagram: the resonators of a design as numbered circles,
// source and load as squares, and every non-zero coupling of the folded
// (or cascaded) matrix as a line labelled with its normalised value.

// TopologyZero is the magnitude below which a matrix entry is taken as no
// coupling: synthesis leaves rounding of about 1e-13 where the pattern has
// zeros (package filter), far below any coupling.
const TopologyZero = filter.MatrixZero

// TopologyNode is one node of the diagram: Index 0 is the source, N+1 the
// load, 1..N the resonators. X and Y are its place in layout units (one
// unit between neighbouring resonators).
type TopologyNode struct {
	Index int
	Label string
	X, Y  float64
	// Port is true for the source and the load.
	Port bool
	// Self is the diagonal entry M_ii of a resonator (its detuning); zero
	// when it is synchronously tuned (|M_ii| < TopologyZero).
	Self float64
}

// TopologyLink is one coupling: nodes From < To and the matrix entry M.
type TopologyLink struct {
	From, To int
	M        float64
	// Cross is true for a coupling off the main line S-1-2-...-N-L.
	Cross bool
	// Bend is the height of the arc the link is drawn as, in layout units,
	// perpendicular to the straight line (zero: straight). Links between
	// non-neighbours on one row are arcs so that they pass beside the
	// nodes between them.
	Bend float64
}

// Topology is the diagram of a design's couplings, computed by NewTopology
// and drawn by Figure.
type Topology struct {
	Title string
	Nodes []TopologyNode
	Links []TopologyLink
	// Form names the topology ("folded canonical form", "cascaded
	// triplets 1-2-3").
	Form  string
	Notes []string
}

// NewTopology lays out the coupling matrix of design d. Without cross
// couplings, and for cascaded triplets and quadruplets, the nodes stand on
// one row (S, 1, ..., N, L) and the cross couplings arc above it. A folded
// matrix with cross couplings is drawn folded: resonators 1..N/2 on the
// upper row left to right, the rest on the lower row right to left (for
// odd N the middle resonator at the right end between the rows), source
// and load at the left ends, so that the couplings i-(N+1-i) are the
// rungs between the rows.
func NewTopology(d *filter.Design) (*Topology, error) {
	if d == nil || d.Folded == nil || d.Spec.Order < 1 {
		return nil, errors.New("filterplot: topology diagram needs a synthesised design (from Synthesize)")
	}
	n := d.Order()
	if r, c := d.Folded.Dims(); r != n+2 || c != n+2 {
		return nil, fmt.Errorf("filterplot: coupling matrix is %dx%d, want %dx%d", r, c, n+2, n+2)
	}
	m := func(i, j int) float64 {
		if i > j {
			i, j = j, i
		}
		v := d.Folded.At(i, j)
		if math.Abs(v) < TopologyZero {
			return 0
		}
		return v
	}
	t := &Topology{Form: d.Topology.Description()}
	t.Title = fmt.Sprintf("Coupling topology, %d resonators (%s)", n, t.Form)
	cross := false
	for i := 0; i < n+2; i++ {
		for j := i + 2; j < n+2; j++ {
			if m(i, j) != 0 {
				cross = true
			}
		}
	}
	oneRow := !cross || d.Topology.Size == 3 || d.Topology.Size == 4
	t.Nodes = make([]TopologyNode, n+2)
	for i := range t.Nodes {
		nd := TopologyNode{Index: i, Label: strconv.Itoa(i)}
		switch i {
		case 0:
			nd.Label, nd.Port = "S", true
		case n + 1:
			nd.Label, nd.Port = "L", true
		default:
			nd.Self = m(i, i)
		}
		nd.X, nd.Y = float64(i), 0
		t.Nodes[i] = nd
	}
	if !oneRow {
		h := n / 2 // resonators on the upper row
		mid := n%2 == 1
		for i := 1; i <= n; i++ {
			nd := &t.Nodes[i]
			switch {
			case i <= h:
				nd.X, nd.Y = float64(i), 1
			case mid && i == h+1:
				nd.X, nd.Y = float64(h+1), 0.5
			default:
				nd.X, nd.Y = float64(n+1-i), 0
			}
		}
		if n == 1 {
			t.Nodes[1].X, t.Nodes[1].Y = 1, 0.5
		}
		t.Nodes[0].X, t.Nodes[0].Y = 0, 1
		t.Nodes[n+1].X, t.Nodes[n+1].Y = 0, 0
	}
	for i := 0; i < n+2; i++ {
		for j := i + 1; j < n+2; j++ {
			v := m(i, j)
			if v == 0 {
				continue
			}
			l := TopologyLink{From: i, To: j, M: v, Cross: j != i+1}
			a, b := t.Nodes[i], t.Nodes[j]
			if span := math.Abs(a.X - b.X); a.Y == b.Y && span > 1.5 {
				// An arc away from the other row (up on one row).
				l.Bend = 0.22 + 0.14*span
				if !oneRow && a.Y == 0 {
					l.Bend = -l.Bend
				}
			}
			t.Links = append(t.Links, l)
		}
	}
	t.Notes = []string{
		fmt.Sprintf("Circles: resonators; squares: source S and load L. Each line is a coupling, labelled with its normalised coupling-matrix entry M_ij (k_ij = FBW·M_ij, FBW = %.5g %%); dashed red: a negative cross coupling, solid blue: a positive one.", 100*d.FBW),
	}
	if d.Topology.Size == 0 && cross {
		t.Notes = append(t.Notes, "Folded form: the resonators run along the upper row and back along the lower one; couplings between the rows other than the turn at the right end are cross couplings.")
	}
	for _, nd := range t.Nodes {
		if nd.Self != 0 {
			t.Notes = append(t.Notes, "A number beside a resonator is its self-coupling M_ii (tuned off f0).")
			break
		}
	}
	return t, nil
}

// Layout sizes of the diagram.
var (
	topoNode  = vg.Points(12)  // node radius at full size
	topoLabel = vg.Points(8.5) // coupling value font size
)

// Colours of the diagram.
var (
	topoNodeFill = color.NRGBA{R: 0xe9, G: 0xf0, B: 0xf6, A: 0xff} // a pale blue, under the numbers
	topoPortFill = figure.Ink
)

// Figure draws the diagram in theme th: one panel with hidden axes, equal
// scales (a circle is round), the legend and the notes below.
func (t *Topology) Figure(th figure.Theme) (*figure.Figure, error) {
	if len(t.Nodes) < 3 {
		return nil, errors.New("filterplot: topology diagram has no resonator")
	}
	p := plot.New()
	p.BackgroundColor = th.Background
	p.HideAxes()
	xmin, xmax, ymin, ymax := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for _, nd := range t.Nodes {
		xmin, xmax = math.Min(xmin, nd.X), math.Max(xmax, nd.X)
		ymin, ymax = math.Min(ymin, nd.Y), math.Max(ymax, nd.Y)
	}
	for _, l := range t.Links {
		a, b := t.Nodes[l.From], t.Nodes[l.To]
		y := (a.Y+b.Y)/2 + l.Bend
		ymin, ymax = math.Min(ymin, y), math.Max(ymax, y)
	}
	const pad = 0.55
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = xmin-pad, xmax+pad, ymin-pad, ymax+pad
	p.Add(&topologyPlotter{t: t, th: th})
	fig := figure.NewFigure(th, t.Title)
	fig.Panels = []*plot.Plot{p}
	fig.Legend.Add("main-line coupling", figure.LineThumb{LineStyle: linkStyle(th, TopologyLink{M: 1})})
	fig.Legend.Add("cross coupling > 0", figure.LineThumb{LineStyle: linkStyle(th, TopologyLink{M: 1, Cross: true})})
	fig.Legend.Add("cross coupling < 0", figure.LineThumb{LineStyle: linkStyle(th, TopologyLink{M: -1, Cross: true})})
	fig.Legend.Add("resonator", figure.GlyphThumb{GlyphStyle: draw.GlyphStyle{Color: figure.Blue, Radius: vg.Points(4), Shape: draw.RingGlyph{}}})
	fig.Legend.Add("source, load", figure.BoxThumb{Fill: topoPortFill})
	fig.Notes = append(fig.Notes, t.Notes...)
	return fig, nil
}

// linkStyle is the line of a coupling: main line ink, positive cross
// couplings blue, negative ones red and dashed.
func linkStyle(th figure.Theme, l TopologyLink) draw.LineStyle {
	switch {
	case !l.Cross:
		return draw.LineStyle{Color: figure.Ink, Width: 2 * th.LineWidth}
	case l.M < 0:
		return draw.LineStyle{Color: figure.Red, Width: 1.6 * th.LineWidth, Dashes: figure.Dashed()}
	}
	return draw.LineStyle{Color: figure.Blue, Width: 1.6 * th.LineWidth}
}

// topologyPlotter draws the nodes and links (a plot.Plotter).
type topologyPlotter struct {
	t  *Topology
	th figure.Theme
}

// topoMaxUnit is the largest spacing of neighbouring nodes on the page:
// a short filter is drawn compact in the middle, not stretched across.
const topoMaxUnit = 1.3 * vg.Inch

// Plot implements plot.Plotter: links first, their labels, then the nodes
// over them. The layout is scaled on its own, the rows at most as far
// apart as the columns, and centred on the canvas (the plot's axes are
// hidden and only bound the layout).
func (tp *topologyPlotter) Plot(c draw.Canvas, plt *plot.Plot) {
	x0, x1, y0, y1 := plt.X.Min, plt.X.Max, plt.Y.Min, plt.Y.Max
	w, h := c.Max.X-c.Min.X, c.Max.Y-c.Min.Y
	ux := min(w/vg.Length(x1-x0), topoMaxUnit)
	uy := min(h/vg.Length(y1-y0), ux)
	cx, cy := (c.Min.X+c.Max.X)/2, (c.Min.Y+c.Max.Y)/2
	at := func(x, y float64) vg.Point {
		return vg.Point{X: cx + ux*vg.Length(x-(x0+x1)/2), Y: cy + uy*vg.Length(y-(y0+y1)/2)}
	}
	// The node radius shrinks for long filters so that neighbours never
	// touch: at most 30 % of the spacing of neighbouring nodes (and of the
	// rows, for a folded layout).
	unit := ux
	for _, nd := range tp.t.Nodes {
		if nd.Y != 0 {
			unit = min(ux, uy)
			break
		}
	}
	r := topoNode
	if lim := 0.3 * unit; lim < r {
		r = lim
	}
	scale := float64(r / topoNode)
	labelSize := topoLabel * vg.Length(math.Max(0.75, scale))
	th := tp.th
	type label struct {
		at  vg.Point
		txt string
		clr color.Color
	}
	var labels []label
	for _, l := range tp.t.Links {
		a, b := tp.t.Nodes[l.From], tp.t.Nodes[l.To]
		sty := linkStyle(th, l)
		var pts []vg.Point
		var mid vg.Point
		if l.Bend == 0 {
			pts = []vg.Point{at(a.X, a.Y), at(b.X, b.Y)}
			mid = at((a.X+b.X)/2, (a.Y+b.Y)/2)
		} else {
			// A quadratic Bezier through the apex at mid-span, Bend above
			// the chord (the control point sits at twice the apex height).
			cx, cy := (a.X+b.X)/2, (a.Y+b.Y)/2+2*l.Bend
			const steps = 40
			for k := 0; k <= steps; k++ {
				s := float64(k) / steps
				x := (1-s)*(1-s)*a.X + 2*s*(1-s)*cx + s*s*b.X
				y := (1-s)*(1-s)*a.Y + 2*s*(1-s)*cy + s*s*b.Y
				pts = append(pts, at(x, y))
			}
			mid = at(cx, (a.Y+b.Y)/2+l.Bend)
		}
		c.StrokeLines(sty, pts)
		labels = append(labels, label{mid, strconv.FormatFloat(l.M, 'f', 4, 64), sty.Color})
	}
	// Value labels on a white patch, so that crossing lines do not hide
	// them.
	for _, lb := range labels {
		sty := th.Text(labelSize, lb.clr)
		rect := sty.Rectangle(lb.txt)
		w, h := rect.Size().X+vg.Points(3), rect.Size().Y+vg.Points(1)
		box := []vg.Point{
			{X: lb.at.X - w/2, Y: lb.at.Y - h/2}, {X: lb.at.X + w/2, Y: lb.at.Y - h/2},
			{X: lb.at.X + w/2, Y: lb.at.Y + h/2}, {X: lb.at.X - w/2, Y: lb.at.Y + h/2},
		}
		c.FillPolygon(color.White, box)
		c.FillText(sty, lb.at, lb.txt)
	}
	rim := draw.LineStyle{Color: figure.Blue, Width: 1.4 * th.LineWidth}
	for _, nd := range tp.t.Nodes {
		pt := at(nd.X, nd.Y)
		if nd.Port {
			s := r * 0.9
			sq := []vg.Point{{X: pt.X - s, Y: pt.Y - s}, {X: pt.X + s, Y: pt.Y - s}, {X: pt.X + s, Y: pt.Y + s}, {X: pt.X - s, Y: pt.Y + s}}
			c.FillPolygon(topoPortFill, sq)
			c.FillText(th.Bold(th.AxisSize*vg.Length(math.Max(0.7, scale)), color.White), pt, nd.Label)
			continue
		}
		var circ vg.Path
		circ.Move(vg.Point{X: pt.X + r, Y: pt.Y})
		circ.Arc(pt, r, 0, 2*math.Pi)
		circ.Close()
		c.SetColor(topoNodeFill)
		c.Fill(circ)
		c.SetLineStyle(rim)
		c.Stroke(circ)
		c.FillText(th.Bold(th.AxisSize*vg.Length(math.Max(0.7, scale)), figure.Ink), pt, nd.Label)
		if nd.Self != 0 {
			// Away from every link: above a node of the upper row, right of
			// the turning node of an odd folded layout, below the others
			// (arcs of a one-row layout run above it).
			sty := th.Text(labelSize, figure.DarkOrange)
			at := vg.Point{X: pt.X, Y: pt.Y - r - vg.Points(1)}
			sty.YAlign = draw.YTop
			switch {
			case nd.Y == 1:
				at.Y, sty.YAlign = pt.Y+r+vg.Points(1), draw.YBottom
			case nd.Y == 0.5:
				at, sty.XAlign, sty.YAlign = vg.Point{X: pt.X + r + vg.Points(3), Y: pt.Y}, draw.XLeft, draw.YCenter
			}
			c.FillText(sty, at, "M"+nd.Label+nd.Label+" "+strconv.FormatFloat(nd.Self, 'f', 4, 64))
		}
	}
}
