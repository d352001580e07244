package benchplot

import (
	"bytes"
	"math"
	"math/cmplx"
	"os"
	"strings"
	"testing"

	"cylcav/cavity"
	"cylcav/figure"
	"cylcav/figure/rendertest"
	"cylcav/measure"
	"cylcav/touchstone"
)

func wide(t *testing.T) (*touchstone.Data, []measure.Resonance) {
	t.Helper()
	fh, err := os.Open("../testdata/measure/wide.s2p")
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	d, err := touchstone.Read(fh, 2)
	if err != nil {
		t.Fatal(err)
	}
	rs, err := measure.Analyze(d, measure.Settings{})
	if err != nil {
		t.Fatal(err)
	}
	return d, rs
}

func TestSweepPlot(t *testing.T) {
	d, rs := wide(t)
	sp, err := NewSweepPlot(d.Freq, d.Param(2, 1), "S21", rs)
	if err != nil {
		t.Fatal(err)
	}
	fig, err := sp.Figure(figure.DefaultTheme())
	if err != nil {
		t.Fatal(err)
	}
	var a, b bytes.Buffer
	for _, buf := range []*bytes.Buffer{&a, &b} {
		if err := figure.Render(buf, fig, figure.SVG, figure.Page{}); err != nil {
			t.Fatal(err)
		}
	}
	rendertest.SVG(t, a.Bytes())
	if !bytes.Equal(a.Bytes(), b.Bytes()) {
		t.Error("rendering twice gave different SVG")
	}
	// Every fitted resonance is numbered on the plot.
	for _, n := range []string{">1<", ">5<"} {
		if !strings.Contains(a.String(), n) {
			t.Errorf("sweep plot lacks the label %s", n)
		}
	}
	if _, err := NewSweepPlot(d.Freq[:1], d.Param(2, 1)[:1], "S21", nil); err == nil {
		t.Error("NewSweepPlot of one point: no error")
	}
	s := append([]complex128(nil), d.Param(2, 1)...)
	s[3] = cmplx.NaN()
	if _, err := NewSweepPlot(d.Freq, s, "S21", nil); err == nil {
		t.Error("NewSweepPlot with NaN: no error")
	}
}

func TestFitPlot(t *testing.T) {
	d, rs := wide(t)
	r := rs[0]
	fp, err := NewFitPlot(d.Freq, d.Param(1, 1), "S11", *r.Port1, 1)
	if err != nil {
		t.Fatal(err)
	}
	if len(fp.F) != r.Port1.Points {
		t.Errorf("plot has %d measured points, the fit used %d", len(fp.F), r.Port1.Points)
	}
	// The plotted fitted curve is the fit: at the window's points it lies
	// within a few residuals of the measurement.
	for i, f := range fp.F {
		if e := cmplx.Abs(fp.Fit.Model(f) - fp.S[i]); e > 5*r.Port1.Residual+1e-12 {
			t.Errorf("point %d: |model - measured| = %.3g, residual %.3g", i, e, r.Port1.Residual)
		}
	}
	fig, err := fp.Figure(figure.DefaultTheme())
	if err != nil {
		t.Fatal(err)
	}
	// The complex plane (second panel) is drawn with equal scales, so the
	// circle is round (figure's TestEqualRanges checks the scales).
	if len(fig.Panels) != 2 || len(fig.Equal) != 1 || fig.Equal[0] != fig.Panels[1] {
		t.Errorf("%d panels, equal-scale panels %v; want the complex plane", len(fig.Panels), fig.Equal)
	}
	var buf bytes.Buffer
	if err := figure.Render(&buf, fig, figure.PNG, figure.Page{DPI: 50}); err != nil {
		t.Fatal(err)
	}
	rendertest.PNG(t, buf.Bytes(), int(math.Round(8*50)), int(math.Round(6*50)))
	if _, err := NewFitPlot(d.Freq, d.Param(1, 1), "S11", measure.Circle{Lo: 1, Hi: 2}, 1); err == nil {
		t.Error("NewFitPlot with an empty window: no error")
	}
}

// TestSweepPlotModes: with the modes named by measure.Identify on the
// synthetic sweep of testdata/measure/gen_modes.py, each mode the
// generator made appears on the plot under its number, and the coupling
// loop, which is no cavity mode, is marked "?".
func TestSweepPlotModes(t *testing.T) {
	fh, err := os.Open("../testdata/measure/modes.s2p")
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	d, err := touchstone.Read(fh, 2)
	if err != nil {
		t.Fatal(err)
	}
	rs, err := measure.Analyze(d, measure.Settings{})
	if err != nil {
		t.Fatal(err)
	}
	f0, q0 := make([]float64, len(rs)), make([]float64, len(rs))
	for i, r := range rs {
		f0[i], q0[i] = r.F0, r.Q0
	}
	id, err := measure.Identify(f0, q0, measure.IdentifySettings{Nominal: cavity.Cavity{Radius: 20e-3, Length: 31e-3}})
	if err != nil {
		t.Fatal(err)
	}
	sp, err := NewSweepPlot(d.Freq, d.Param(2, 1), "S21", rs)
	if err != nil {
		t.Fatal(err)
	}
	if err := sp.SetModes(&measure.Identification{Assign: id.Assign[1:]}); err == nil {
		t.Error("SetModes with one assignment short: no error")
	}
	if err := sp.SetModes(&id); err != nil {
		t.Fatal(err)
	}
	fig, err := sp.Figure(figure.DefaultTheme())
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := figure.Render(&buf, fig, figure.SVG, figure.Page{}); err != nil {
		t.Fatal(err)
	}
	rendertest.SVG(t, buf.Bytes())
	// modes_truth.json, in resonance order; the loop is resonance 3.
	for _, want := range []string{"TM010", "TE111", ">?<", "TM011", "TE211", "TM110", "TM111", "TE011", "TE112", ">9<"} {
		if !strings.Contains(buf.String(), want) {
			t.Errorf("sweep plot lacks %s", want)
		}
	}
}
