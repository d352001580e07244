package filterplot

import (
	"bytes"
	"flag"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"cylcav/figure"
	"cylcav/figure/rendertest"
	"cylcav/filter"
)

var regenPlot = flag.Bool("regen", false, "rewrite testdata/response_golden.svg")

// Tolerances of the plot tests.
const (
	// mapTol is the relative error of the frequency mapping round trip
	// (LowpassOmega of BandpassFrequency): a few rounding steps.
	mapTol = 1e-12
	// unitaryTol bounds ||S11|^2 + |S21|^2 - 1| of a lossless design read
	// back from dB values: rounding in log10 and pow, far below the 1e-9 of
	// Synthesize's self-check.
	unitaryTol = 1e-9
	// delayTol is the relative error accepted for the group delay of one
	// resonator at its centre against the closed form: the response is
	// evaluated through the N+2 matrix, rounding only.
	delayTol = 1e-9
)

// plotDesign is the invented scenario of the plot tests: a six-resonator
// 20 dB Chebyshev filter at 10 GHz, 200 MHz wide, with zeros at 9.8 and
// 10.18 GHz and rejections of 40 dB at 10.25 GHz and 35 dB at 9.75 GHz.
func plotDesign(t testing.TB) *filter.Design {
	t.Helper()
	const f0, bw = 10e9, 200e6
	d, err := filter.Synthesize(filter.Spec{F0: f0, BW: bw, Order: 6, ReturnLoss: 20,
		Zeros:      []float64{filter.LowpassOmega(9.8e9, f0, bw), filter.LowpassOmega(10.18e9, f0, bw)},
		Rejections: []filter.Rejection{{F: 10.25e9, Attenuation: 40}, {F: 9.75e9, Attenuation: 35}}})
	if err != nil {
		t.Fatal(err)
	}
	return d
}

func uniformQ(n int, q float64) []float64 {
	out := make([]float64, n)
	for i := range out {
		out[i] = q
	}
	return out
}

func TestResponsePlotMask(t *testing.T) {
	d := plotDesign(t)
	s := d.Spec
	rp, err := NewResponsePlot(d, PlotOptions{})
	if err != nil {
		t.Fatal(err)
	}
	lo, hi, _ := filter.SweepRange(d, filter.DefaultSpan)
	if rp.Lo != lo || rp.Hi != hi {
		t.Errorf("default range = %v..%v, want SweepRange(d, %v) = %v..%v", rp.Lo, rp.Hi, filter.DefaultSpan, lo, hi)
	}
	f1, f2 := filter.BandpassFrequency(-1, s.F0, s.BW), filter.BandpassFrequency(1, s.F0, s.BW)
	if rp.Passband != [2]float64{f1, f2} {
		t.Errorf("Passband = %v, want %v..%v", rp.Passband, f1, f2)
	}
	// Band edges are f0 (sqrt(1 + x^2) -+ x), x = bw/(2 f0) (derived from
	// f2 - f1 = bw, f1 f2 = f0^2): 9.900499... and 10.100499... GHz.
	x := s.BW / (2 * s.F0)
	if w := s.F0 * (math.Hypot(1, x) + x); math.Abs(f2-w) > mapTol*w {
		t.Errorf("f2 = %v, want %v", f2, w)
	}
	if rp.ReturnLoss != 20 {
		t.Errorf("ReturnLoss = %v, want 20", rp.ReturnLoss)
	}
	want := []RejectionMask{{F: 10.25e9, Edge: hi, Level: -40}, {F: 9.75e9, Edge: lo, Level: -35}}
	if !slices.Equal(rp.Rejections, want) {
		t.Errorf("Rejections = %+v, want %+v", rp.Rejections, want)
	}
	// dB floor: deepest requirement 40 dB + 20 = 60 < 80, so -80 dB.
	if rp.DBMin != -80 {
		t.Errorf("DBMin = %v, want -80", rp.DBMin)
	}
	if len(rp.Zeros) != 2 || math.Abs(rp.Zeros[0]-9.8e9) > 1e-3 || math.Abs(rp.Zeros[1]-10.18e9) > 1e-3 {
		t.Errorf("Zeros = %v, want [9.8e9 10.18e9]", rp.Zeros)
	}
	// The grid holds the uniform points plus the exact band edges, centre
	// and zeros, ascending.
	if !slices.IsSorted(rp.F) {
		t.Error("plot frequencies are not ascending")
	}
	if got := len(rp.F); got != DefaultPlotPoints+5 {
		t.Errorf("len(F) = %d, want %d uniform + 5 exact points", got, DefaultPlotPoints)
	}
	for _, f := range []float64{f1, s.F0, f2, rp.Zeros[0], rp.Zeros[1]} {
		if !slices.Contains(rp.F, f) {
			t.Errorf("plot frequencies lack the exact point %v", f)
		}
	}
	// Lossless: |S11|^2 + |S21|^2 = 1 at every point (energy conservation),
	// read back from the dB values.
	if !rp.Lossless {
		t.Error("Lossless = false for a plot without Q0")
	}
	for i := range rp.F {
		p := math.Pow(10, rp.S11DB[i]/10) + math.Pow(10, rp.S21DB[i]/10)
		if math.Abs(p-1) > unitaryTol {
			t.Fatalf("|S11|^2 + |S21|^2 at %v Hz = %v, want 1", rp.F[i], p)
		}
	}
	// Deeper requirements push the floor: 70 dB -> 70 + 20 = 90 dB.
	d.Spec.Rejections = []filter.Rejection{{F: 10.4e9, Attenuation: 70}}
	rp, err = NewResponsePlot(d, PlotOptions{Points: 101})
	if err != nil {
		t.Fatal(err)
	}
	if rp.DBMin != -90 {
		t.Errorf("DBMin with a 70 dB rejection = %v, want -90", rp.DBMin)
	}
	if rp.Rejections[0].Edge != rp.Hi {
		t.Errorf("rejection edge = %v, want the top of the range %v", rp.Rejections[0].Edge, rp.Hi)
	}
}

// TestResponsePlotSingleResonator checks the group delay of a one-resonator
// (N = 1 Butterworth) filter at f0 against the closed form 1/(pi bw): its
// lowpass S21 = 1/(1 + j Omega) has d arg/d Omega = -1 at Omega = 0, and
// dOmega/df = 2/bw at f0 (derived; equivalently 2 Q_L/omega0 with
// Q_L = f0/bw, the loaded Q of a resonance of 3 dB width bw, Pozar,
// Microwave Engineering, 4th ed., sec. 6.1, recalled from memory).
func TestResponsePlotSingleResonator(t *testing.T) {
	const f0, bw = 2.45e9, 50e6
	d, err := filter.Synthesize(filter.Spec{F0: f0, BW: bw, Order: 1, Family: filter.Butterworth})
	if err != nil {
		t.Fatal(err)
	}
	rp, err := NewResponsePlot(d, PlotOptions{Points: 11})
	if err != nil {
		t.Fatal(err)
	}
	i := slices.Index(rp.F, f0)
	if i < 0 {
		t.Fatal("plot frequencies lack f0")
	}
	want := 1 / (math.Pi * bw)
	if got := rp.GroupDelay[i]; math.Abs(got-want) > delayTol*want {
		t.Errorf("group delay at f0 = %v s, want %v s", got, want)
	}
	if got := rp.DelayMax; math.Abs(got-delayHeadroom*want) > delayTol*want {
		t.Errorf("DelayMax = %v s, want %v x %v s", got, delayHeadroom, want)
	}
	if rp.ReturnLoss != 0 {
		t.Errorf("Butterworth ReturnLoss mask = %v, want 0 (none)", rp.ReturnLoss)
	}
	// The band edges of a Butterworth response are its 3.0103 dB points
	// (MYJ sec. 4.03): |S21|^2 = 1/2.
	for _, f := range rp.Passband {
		j := slices.Index(rp.F, f)
		if got := rp.S21DB[j]; math.Abs(got+10*math.Log10(2)) > 1e-9 {
			t.Errorf("|S21| at the band edge %v Hz = %v dB, want -3.0103 dB", f, got)
		}
	}
}

func TestResponsePlotLossy(t *testing.T) {
	d := plotDesign(t)
	q := uniformQ(6, 8000)
	rp, err := NewResponsePlot(d, PlotOptions{Q0: q, Points: 201, Title: "invented", Notes: []string{"extra"}})
	if err != nil {
		t.Fatal(err)
	}
	if rp.Lossless {
		t.Error("Lossless = true with Q0 = 8000")
	}
	if rp.Title != "invented" {
		t.Errorf("Title = %q, want the given one", rp.Title)
	}
	if len(rp.Notes) != 2 || !strings.Contains(rp.Notes[0], "Q0 = 8000") || rp.Notes[1] != "extra" {
		t.Errorf("Notes = %q, want the loss note then the given note", rp.Notes)
	}
	// Passivity: a lossy network returns less than it receives.
	for i := range rp.F {
		if p := math.Pow(10, rp.S11DB[i]/10) + math.Pow(10, rp.S21DB[i]/10); p > 1+unitaryTol {
			t.Fatalf("|S11|^2 + |S21|^2 at %v Hz = %v, want <= 1", rp.F[i], p)
		}
	}
	q[2] = 0
	if _, err := NewResponsePlot(d, PlotOptions{Q0: q}); err == nil {
		t.Error("NewResponsePlot with Q0 = 0 = nil error, want an error")
	}
}

func TestResponsePlotErrors(t *testing.T) {
	d := plotDesign(t)
	for _, c := range []struct {
		name string
		d    *filter.Design
		o    PlotOptions
	}{
		{"nil design", nil, PlotOptions{}},
		{"empty design", &filter.Design{}, PlotOptions{}},
		{"reversed range", d, PlotOptions{Lo: 11e9, Hi: 9e9}},
		{"one point", d, PlotOptions{Points: 1}},
		{"wrong Q0 count", d, PlotOptions{Q0: []float64{1000}}},
	} {
		if _, err := NewResponsePlot(c.d, c.o); err == nil {
			t.Errorf("NewResponsePlot(%s) = nil error, want an error", c.name)
		}
	}
	var bad ResponsePlot
	if _, err := bad.Figure(figure.DefaultTheme()); err == nil {
		t.Error("Figure of an empty ResponsePlot = nil error, want an error")
	}
}

func TestClampBelow(t *testing.T) {
	got := clampBelow([]float64{0, -50, math.Inf(-1), math.NaN(), -200}, -100)
	want := []float64{0, -50, -100, math.NaN(), -100}
	for i := range want {
		if got[i] != want[i] && !(math.IsNaN(got[i]) && math.IsNaN(want[i])) {
			t.Errorf("clampBelow[%d] = %v, want %v", i, got[i], want[i])
		}
	}
}

// render draws the plot of the scenario with Q0 = 8000 in format f.
func render(t testing.TB, f figure.Format, points int) []byte {
	t.Helper()
	d := plotDesign(t)
	rp, err := NewResponsePlot(d, PlotOptions{Q0: uniformQ(6, 8000), Points: points})
	if err != nil {
		t.Fatal(err)
	}
	fig, err := rp.Figure(figure.DefaultTheme())
	if err != nil {
		t.Fatal(err)
	}
	b, err := figure.Encode(fig, f, figure.Page{})
	if err != nil {
		t.Fatal(err)
	}
	return b
}

func TestResponsePlotFiles(t *testing.T) {
	pngB := render(t, figure.PNG, 201)
	rendertest.PNG(t, pngB, 1200, 900) // 8 x 6 in at 150 dpi (figure defaults)
	svg := render(t, figure.SVG, 201)
	rendertest.SVG(t, svg)
	for _, want := range []string{"|S21|, transmission", "group delay of S21", "return-loss limit, -20 dB", "frequency   [GHz]"} {
		if !bytes.Contains(svg, []byte(want)) {
			t.Errorf("SVG lacks the text %q", want)
		}
	}
	pdf := render(t, figure.PDF, 201)
	rendertest.PDF(t, pdf)
	for _, f := range []figure.Format{figure.PNG, figure.SVG, figure.PDF} {
		if a, b := render(t, f, 201), render(t, f, 201); !bytes.Equal(a, b) {
			t.Errorf("two %v renders of the same plot differ", f)
		}
	}
}

// TestResponsePlotGolden compares the SVG of the scenario (201 points) with
// testdata/response_golden.svg exactly; run with -regen to rewrite
// it after an intended change of the drawing.
func TestResponsePlotGolden(t *testing.T) {
	got := render(t, figure.SVG, 201)
	path := filepath.Join("testdata", "response_golden.svg")
	if *regenPlot {
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test -run Golden -regen to create it)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("SVG differs from %s (%d bytes, want %d); if the change is intended, rerun with -regen", path, len(got), len(want))
	}
}

func BenchmarkResponsePlotSVG(b *testing.B) {
	d := plotDesign(b)
	q := uniformQ(6, 8000)
	b.ReportAllocs()
	for b.Loop() {
		rp, err := NewResponsePlot(d, PlotOptions{Q0: q})
		if err != nil {
			b.Fatal(err)
		}
		fig, err := rp.Figure(figure.DefaultTheme())
		if err != nil {
			b.Fatal(err)
		}
		if _, err := figure.Encode(fig, figure.SVG, figure.Page{}); err != nil {
			b.Fatal(err)
		}
	}
}

// TestResponsePlotDrawsMask: the plot draws the regions of the library's
// mask (Design.Mask), clipped to the plot: a region ends at the end of the
// band of interest when that lies inside the plot, and a rejection beyond
// the model range gets its marker only.
func TestResponsePlotDrawsMask(t *testing.T) {
	d := plotDesign(t)
	d.Spec.Rejections = []filter.Rejection{{F: 10.25e9, Attenuation: 40}, {F: 12.5e9, Attenuation: 50}}
	rp, err := NewResponsePlot(d, PlotOptions{Lo: 9e9, Hi: 13e9, Points: 101})
	if err != nil {
		t.Fatal(err)
	}
	m := d.Mask()
	want := []RejectionMask{{F: 10.25e9, Edge: m.Regions[0].High, Level: -40}, {F: 12.5e9, Edge: 12.5e9, Level: -50}}
	if !slices.Equal(rp.Rejections, want) || m.Regions[0].High != 12e9 {
		t.Errorf("Rejections = %+v, want %+v (mask %+v)", rp.Rejections, want, m.Regions)
	}
}
