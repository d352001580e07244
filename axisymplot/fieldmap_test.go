package axisymplot

import (
	"bytes"
	"math"
	"testing"

	"cylcav/axisym"
	"cylcav/cavity"
	"cylcav/figure"
	"cylcav/figure/rendertest"
)

// pillbox returns the TM010 resonance of a closed cylinder with its field.
func pillbox(t *testing.T) (axisym.Body, axisym.Resonance) {
	t.Helper()
	b := axisym.Body{Sections: []axisym.Section{{Length: 0.03, Radius: 0.04}}}
	r, err := axisym.Solve(b, axisym.Request{MaxFrequency: 3.5e9, Modes: 4, Losses: true, Families: []cavity.Family{cavity.TM}})
	if err != nil || len(r) != 1 || r[0].Loss == nil {
		t.Fatal(r, err)
	}
	return b, r[0]
}

// TestPillboxMap checks the numbers of a map before its pixels: for TM010
// of a closed cylinder |E| = |J0(j01 r/a)| and |H| = |J1(j01 r/a)|/max J1,
// uniform in z (Pozar, Microwave Engineering, 4th ed., sec. 6.4).
func TestPillboxMap(t *testing.T) {
	b, r := pillbox(t)
	fm, err := NewFieldMap(b, r.Loss, FieldMapOptions{Points: 40})
	if err != nil {
		t.Fatal(err)
	}
	const j01 = 2.404825557695773 // A&S Table 9.5 (recalled)
	const tol = 1e-12             // the field is exact for one section
	var h1max float64
	for _, rr := range fm.R {
		h1max = math.Max(h1max, math.J1(j01*rr/0.04))
	}
	for iz := range fm.Z {
		for ir, rr := range fm.R {
			x := j01 * rr / 0.04
			e := math.Abs(math.J0(x)) / math.J0(j01*fm.R[0]/0.04)
			h := math.J1(x) / h1max
			if math.Abs(fm.E[iz][ir]-e) > tol || math.Abs(fm.H[iz][ir]-h) > tol {
				t.Fatalf("(%g, %g): E = %g, H = %g, want %g, %g", rr, fm.Z[iz], fm.E[iz][ir], fm.H[iz][ir], e, h)
			}
		}
	}
	if _, err := NewFieldMap(b, nil, FieldMapOptions{}); err == nil {
		t.Error("NewFieldMap without a field: no error")
	}
	if _, err := NewFieldMap(b, r.Loss, FieldMapOptions{Points: 1}); err == nil {
		t.Error("NewFieldMap with 1 point: no error")
	}
}

// TestRender renders a stepped body's map in every format and checks
// validity and byte-for-byte determinism.
func TestRender(t *testing.T) {
	b := axisym.Body{Sections: []axisym.Section{
		{Length: 0.01, Radius: 0.01}, {Length: 0.02, Radius: 0.02}, {Length: 0.01, Radius: 0.01, InnerRadius: 0.002},
	}}
	r, err := axisym.Solve(b, axisym.Request{MaxFrequency: 8e9, Modes: 12, Losses: true, Families: []cavity.Family{cavity.TM}})
	if err != nil || len(r) == 0 || r[0].Loss == nil {
		t.Fatal(r, err)
	}
	fm, err := NewFieldMap(b, r[0].Loss, FieldMapOptions{Points: 50, Title: "test map"})
	if err != nil {
		t.Fatal(err)
	}
	fig, err := fm.Figure(figure.DefaultTheme())
	if err != nil {
		t.Fatal(err)
	}
	pg := figure.Page{Width: 4 * 72, Height: 4 * 72, DPI: 72}
	for _, f := range []figure.Format{figure.PNG, figure.SVG, figure.PDF} {
		a, err := figure.Encode(fig, f, pg)
		if err != nil {
			t.Fatal(err)
		}
		b2, err := figure.Encode(fig, f, pg)
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(a, b2) {
			t.Errorf("%v: two renderings differ", f)
		}
		switch f {
		case figure.PNG:
			rendertest.PNG(t, a, 288, 288)
		case figure.SVG:
			rendertest.SVG(t, a)
		case figure.PDF:
			rendertest.PDF(t, a)
		}
	}
}
