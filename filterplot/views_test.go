package filterplot

import (
	"bytes"
	"testing"

	"cylcav/figure"
	"cylcav/figure/rendertest"
)

// TestPassbandFigure: the passband view holds 0 dB and the midband
// insertion loss with Q0 = 2000 (from Design.Response) and renders; a nil
// design is an error.
func TestPassbandFigure(t *testing.T) {
	d := plotDesign(t)
	fig, err := PassbandFigure(figure.DefaultTheme(), d, uniformQ(6, 2000), 401)
	if err != nil {
		t.Fatal(err)
	}
	p := fig.Panels[0]
	pts, err := d.Response([]float64{d.Spec.F0}, uniformQ(6, 2000))
	if err != nil {
		t.Fatal(err)
	}
	if il := pts[0].InsertionLoss(); !(p.Y.Min < -il && p.Y.Max > 0) {
		t.Errorf("axis %g..%g dB does not hold the midband loss -%g dB and 0 dB", p.Y.Min, p.Y.Max, il)
	}
	svg, err := figure.Encode(fig, figure.SVG, figure.Page{})
	if err != nil {
		t.Fatal(err)
	}
	rendertest.SVG(t, svg)
	if _, err := PassbandFigure(figure.DefaultTheme(), nil, nil, 0); err == nil {
		t.Error("nil design: no error")
	}
}

// TestWideFigure: markers inside the range are drawn with their labels,
// markers outside it are dropped, and the legend tells alarm markers from
// the others only when there are some.
func TestWideFigure(t *testing.T) {
	d := plotDesign(t)
	ms := []Marker{{F: 9.5e9, Label: "TE112"}, {F: 10.4e9, Label: "TM012", Alarm: true}, {F: 20e9, Label: "FARAWAY"}}
	fig, err := WideFigure(figure.DefaultTheme(), d, uniformQ(6, 8000), 9e9, 11e9, 401, ms, []string{"a note"})
	if err != nil {
		t.Fatal(err)
	}
	svg, err := figure.Encode(fig, figure.SVG, figure.Page{})
	if err != nil {
		t.Fatal(err)
	}
	rendertest.SVG(t, svg)
	for _, w := range []string{">TE112<", ">TM012<", "spurious resonance in the passband or a rejection band", "a note"} {
		if !bytes.Contains(svg, []byte(w)) {
			t.Errorf("SVG lacks %q", w)
		}
	}
	if bytes.Contains(svg, []byte("FARAWAY")) {
		t.Error("a marker outside the range is drawn")
	}
	fig, err = WideFigure(figure.DefaultTheme(), d, nil, 9e9, 11e9, 401, ms[:1], nil)
	if err != nil {
		t.Fatal(err)
	}
	svg, _ = figure.Encode(fig, figure.SVG, figure.Page{})
	if bytes.Contains(svg, []byte("in the passband or a rejection band")) {
		t.Error("the alarm legend entry is shown without an alarm marker")
	}
}
