package filterplot

import (
	"bytes"
	"math"
	"os"
	"testing"

	"cylcav/figure"
	"cylcav/figure/rendertest"
	"cylcav/filter"
)

// TestTopologyLinks: the diagram has one node per row of the N+2 matrix
// and one link per non-zero entry above the diagonal, labelled with that
// entry; the folded layout puts the cross couplings i-(N+1-i) between the
// rows (vertical rungs), the cascaded one puts every node on one row.
func TestTopologyLinks(t *testing.T) {
	d := plotDesign(t) // folded, 6 resonators, 2 zeros
	tp, err := NewTopology(d)
	if err != nil {
		t.Fatal(err)
	}
	n := d.Order()
	if len(tp.Nodes) != n+2 {
		t.Fatalf("%d nodes, want %d", len(tp.Nodes), n+2)
	}
	want := 0
	for i := 0; i < n+2; i++ {
		for j := i + 1; j < n+2; j++ {
			if math.Abs(d.Folded.At(i, j)) >= TopologyZero {
				want++
			}
		}
	}
	if len(tp.Links) != want {
		t.Errorf("%d links, want %d (the non-zero entries above the diagonal)", len(tp.Links), want)
	}
	for _, l := range tp.Links {
		if l.M != d.Folded.At(l.From, l.To) {
			t.Errorf("link %d-%d carries %g, matrix entry %g", l.From, l.To, l.M, d.Folded.At(l.From, l.To))
		}
		a, b := tp.Nodes[l.From], tp.Nodes[l.To]
		if l.From+l.To == n+1 && l.From >= 1 && (a.X != b.X || a.Y == b.Y) {
			t.Errorf("folded rung %d-%d is not vertical: (%g,%g)-(%g,%g)", l.From, l.To, a.X, a.Y, b.X, b.Y)
		}
	}
	// Cascaded triplets: one row.
	top, err := filter.CascadeTopology("triplets", n, len(d.Zeros))
	if err != nil {
		t.Fatal(err)
	}
	dt, err := d.Rearranged(top)
	if err != nil {
		t.Fatal(err)
	}
	tt, err := NewTopology(dt)
	if err != nil {
		t.Fatal(err)
	}
	for _, nd := range tt.Nodes {
		if nd.Y != 0 {
			t.Errorf("triplets: node %s off the row (y = %g)", nd.Label, nd.Y)
		}
	}
	arcs := 0
	for _, l := range tt.Links {
		if l.Cross && l.Bend == 0 {
			t.Errorf("triplets: cross coupling %d-%d drawn straight through the row", l.From, l.To)
		}
		if l.Bend != 0 {
			arcs++
		}
	}
	if arcs != len(d.Zeros) {
		t.Errorf("triplets: %d arcs, want one per zero (%d)", arcs, len(d.Zeros))
	}
	if _, err := NewTopology(nil); err == nil {
		t.Error("NewTopology(nil) gave no error")
	}
}

// TestTopologyFiles renders the diagram as PNG, SVG and PDF; the SVG holds
// the node numbers and a coupling value. CYLCAV_TOPOLOGY_PNG=path keeps
// the PNG for a look.
func TestTopologyFiles(t *testing.T) {
	tp, err := NewTopology(plotDesign(t))
	if err != nil {
		t.Fatal(err)
	}
	fig, err := tp.Figure(figure.DefaultTheme())
	if err != nil {
		t.Fatal(err)
	}
	pg := figure.Page{Width: 7.5 * 72, Height: 4 * 72}
	png, err := figure.Encode(fig, figure.PNG, pg)
	if err != nil {
		t.Fatal(err)
	}
	rendertest.PNG(t, png, 1125, 600)
	if p := os.Getenv("CYLCAV_TOPOLOGY_PNG"); p != "" {
		_ = os.WriteFile(p, png, 0o644)
	}
	svg, err := figure.Encode(fig, figure.SVG, pg)
	if err != nil {
		t.Fatal(err)
	}
	rendertest.SVG(t, svg)
	for _, w := range []string{">S<", ">L<", ">6<", "cross coupling &lt; 0"} {
		if !bytes.Contains(svg, []byte(w)) {
			t.Errorf("SVG lacks %q", w)
		}
	}
	pdf, err := figure.Encode(fig, figure.PDF, pg)
	if err != nil {
		t.Fatal(err)
	}
	rendertest.PDF(t, pdf)
}
