package cavity

import (
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"cylcav/physics"
)

// Tolerances of the optimiser tests.
const (
	// optRatioTol is the relative accuracy asked of the optimum D/L.
	optRatioTol = 1e-9
	// optClearTol is the absolute accuracy asked of the optimum clearance.
	optClearTol = 1e-9
)

// bruteClearance is the clearance of w at D/L = r computed the slow,
// independent way: a real cavity and Cavity.Clearance (Modes), no chart.
func bruteClearance(t testing.TB, w Mode, r float64) float64 {
	c := Cavity{Radius: 0.01, Length: 0.02 / r}
	cl, err := c.Clearance(w, ClearanceOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return cl.Value
}

// bruteOptimum maximises bruteClearance over [lo, hi] by a dense
// geometric scan and golden-section refinement around the best point
// (test only: it assumes the maximum is resolved by the scan).
func bruteOptimum(t testing.TB, w Mode, lo, hi float64, n int) (r, c float64) {
	best, bi := math.Inf(-1), 0
	xs := make([]float64, n+1)
	for i := range xs {
		xs[i] = lo * math.Pow(hi/lo, float64(i)/float64(n))
		if v := bruteClearance(t, w, xs[i]); v > best {
			best, bi = v, i
		}
	}
	a, b := xs[max(bi-1, 0)], xs[min(bi+1, n)]
	const g = 0.3819660112501051
	x1, x2 := a+g*(b-a), b-g*(b-a)
	f1, f2 := bruteClearance(t, w, x1), bruteClearance(t, w, x2)
	for range 120 {
		if f1 >= f2 {
			b, x2, f2 = x2, x1, f1
			x1 = a + g*(b-a)
			f1 = bruteClearance(t, w, x1)
		} else {
			a, x1, f1 = x1, x2, f2
			x2 = b - g*(b-a)
			f2 = bruteClearance(t, w, x2)
		}
	}
	r, c = xs[bi], best
	if f1 > c {
		r, c = x1, f1
	}
	if f2 > c {
		r, c = x2, f2
	}
	return r, c
}

func mustMode(t testing.TB, s string) Mode {
	m, err := ParseMode(s)
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// TestOptimizeMatchesBruteForce compares the exact optimiser with a dense
// scan plus golden-section refinement of Cavity.Clearance, an independent
// route (real cavities, Modes, no chart algebra).
func TestOptimizeMatchesBruteForce(t *testing.T) {
	for _, tc := range []struct {
		mode   string
		lo, hi float64
	}{
		{"TE011", 0.5, 3}, {"TE011", 0.2, 5}, {"TM010", 0.2, 5}, {"TE012", 0.5, 3},
		{"TE111", 0.5, 3}, {"TM011", 0.3, 4}, {"TE021", 0.5, 2}, {"TM110", 0.5, 3},
	} {
		w := mustMode(t, tc.mode)
		d, err := Optimize(DesignSpec{Mode: w, Frequency: 10e9, RatioMin: tc.lo, RatioMax: tc.hi})
		if err != nil {
			t.Fatalf("Optimize(%s, %g..%g): %v", tc.mode, tc.lo, tc.hi, err)
		}
		br, bc := bruteOptimum(t, w, tc.lo, tc.hi, 1500)
		name := fmt.Sprintf("Optimize(%s, D/L %g..%g)", tc.mode, tc.lo, tc.hi)
		if math.Abs(d.Clearance.Value-bc) > optClearTol {
			t.Errorf("%s clearance = %.12g, want %.12g (brute force)", name, d.Clearance.Value, bc)
		}
		// The brute-force clearance at the optimiser's ratio must be the
		// optimum too (this also covers plateaus, where the ratio is not
		// unique).
		if got := bruteClearance(t, w, d.Ratio); math.Abs(got-bc) > optClearTol {
			t.Errorf("%s: brute clearance at the returned D/L %.12g = %.12g, want %.12g", name, d.Ratio, got, bc)
		}
		if d.Plateau[1] == d.Plateau[0] && math.Abs(d.Ratio-br) > optRatioTol*br {
			t.Errorf("%s ratio = %.12g, want %.12g (brute force)", name, d.Ratio, br)
		}
	}
}

// readOptimum reads cavity/testdata/optimum.txt, written by
// cavity/testdata/gen_optimum.py (mpmath 1.3.0, 30 digits): one "name
// value" a line, # for comments. It fails the test when a value the tests
// use is missing.
func readOptimum(t *testing.T) map[string]float64 {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("testdata", "optimum.txt"))
	if err != nil {
		t.Fatal(err)
	}
	out := map[string]float64{}
	for i, line := range strings.Split(string(b), "\n") {
		f := strings.Fields(line)
		if len(f) == 0 || strings.HasPrefix(f[0], "#") {
			continue
		}
		v, err := strconv.ParseFloat(f[1], 64)
		if len(f) != 2 || err != nil {
			t.Fatalf("optimum.txt line %d: %q", i+1, line)
		}
		out[f[0]] = v
	}
	for _, k := range []string{"te011_opt_ratio", "te011_opt_clearance", "te112_cross_ratio", "tm210_cross_ratio", "tm012_cross_ratio"} {
		if _, ok := out[k]; !ok {
			t.Fatalf("optimum.txt has no %s", k)
		}
	}
	return out
}

// TestOptimizeTE011Reference checks the air-filled TE011 optimum against
// the closed-form crossing of TE112 and TE311 evaluated with mpmath 1.3.0
// at 30 digits (cavity/testdata/gen_optimum.py).
func TestOptimizeTE011Reference(t *testing.T) {
	ref := readOptimum(t)
	wantRatio, wantClear := ref["te011_opt_ratio"], ref["te011_opt_clearance"]
	for _, fill := range []physics.Medium{{}, {EpsR: 2.08}} {
		d, err := Optimize(DesignSpec{Mode: mustMode(t, "TE011"), Frequency: 10e9, Fill: fill})
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(d.Ratio-wantRatio) > optRatioTol*wantRatio {
			t.Errorf("Optimize(TE011, eps %g) ratio = %.15g, want %.15g", fill.EpsR, d.Ratio, wantRatio)
		}
		if math.Abs(d.Clearance.Value-wantClear) > optClearTol {
			t.Errorf("Optimize(TE011, eps %g) clearance = %.15g, want %.15g", fill.EpsR, d.Clearance.Value, wantClear)
		}
		if d.AtRangeEdge || d.Limit != NoLimit {
			t.Errorf("Optimize(TE011) edge = %v, %q, want an interior optimum", d.AtRangeEdge, d.Limit)
		}
		if f := d.Cavity.Frequency(d.Spec.Mode); math.Abs(f-10e9) > routeTol*10e9 {
			t.Errorf("Optimize(TE011) cavity resonates at %.15g Hz, want 1e10 Hz", f)
		}
	}
}

// TestTE011ModeChart checks the optimum against the classical mode chart
// around TE011. Common practice (recalled from memory, e.g. the TE011
// design of Pozar's sec. 6.4 uses D/L = 1): TE011 cavities are built with
// D/L of about 1 to 1.5, between the crossings of the TE011 line with the
// steeper p = 2 lines (TM012 at D/L = 1.096, TE112 at 1.235) and the flat
// TM210 line (2.177); crossing ratios from cavity/testdata/gen_optimum.py.
func TestTE011ModeChart(t *testing.T) {
	ref := readOptimum(t)
	tm012Cross, te112Cross, tm210Cross := ref["tm012_cross_ratio"], ref["te112_cross_ratio"], ref["tm210_cross_ratio"]
	w := mustMode(t, "TE011")
	d, err := Optimize(DesignSpec{Mode: w, Frequency: 10e9, RatioMin: 0.2, RatioMax: 5})
	if err != nil {
		t.Fatal(err)
	}
	if !(d.Ratio > 1 && d.Ratio < 1.5) {
		t.Errorf("TE011 optimum D/L = %g, want within the customary 1..1.5", d.Ratio)
	}
	if !(d.Ratio > te112Cross && d.Ratio < tm210Cross) {
		t.Errorf("TE011 optimum D/L = %g, want between the TE112 (%g) and TM210 (%g) crossings", d.Ratio, te112Cross, tm210Cross)
	}
	if d.Clearance.Below == nil || d.Clearance.Below.Mode != mustMode(t, "TM110") {
		t.Errorf("TE011 optimum nearest below = %v, want TM110", d.Clearance.Below)
	}
	// At the optimum TE311 and TE112 are tied above; rounding picks one.
	if a := d.Clearance.Above; a == nil || a.Mode != mustMode(t, "TE311") && a.Mode != mustMode(t, "TE112") {
		t.Errorf("TE011 optimum nearest above = %v, want TE311 or TE112 (tied)", a)
	}
	if len(d.Clearance.Degenerate) != 1 || d.Clearance.Degenerate[0] != mustMode(t, "TM111") {
		t.Errorf("TE011 degenerate = %v, want [TM111]", d.Clearance.Degenerate)
	}
	// No crossing between the TE112 and TM210 crossings; the crossings at
	// their ends are where the chart puts them.
	D := d.Cavity.Diameter()
	tc, err := d.Cavity.Tune(w, D/(tm210Cross*(1-1e-6)), D/(te112Cross*(1+1e-6)), 10, false)
	if err != nil {
		t.Fatal(err)
	}
	if len(tc.Crossings) != 0 {
		t.Errorf("TE011 crossings for D/L in %g..%g = %v, want none", te112Cross, tm210Cross, tc.Crossings)
	}
	tc, err = d.Cavity.Tune(w, D/2.5, D/1.0, 10, false)
	if err != nil {
		t.Fatal(err)
	}
	want := map[Mode]float64{mustMode(t, "TM210"): tm210Cross, mustMode(t, "TE112"): te112Cross, mustMode(t, "TM012"): tm012Cross}
	if len(tc.Crossings) != len(want) {
		t.Errorf("TE011 crossings for D/L in 1..2.5 = %v, want %v", tc.Crossings, want)
	}
	for _, c := range tc.Crossings {
		r, ok := want[c.Mode]
		if got := D / c.Length; !ok || math.Abs(got-r) > routeTol*r {
			t.Errorf("TE011 crossing with %s at D/L = %.15g, want %.15g", c.Mode, got, r)
		}
	}
}

// TestOptimizeFillScaling: with a homogeneous fill every frequency scales
// by 1/sqrt(eps_r mu_r) (Pozar sec. 6.4), so the optimum D/L is the same and
// the dimensions scale. Pozar's TE011 example (a PTFE-filled cavity at
// 5 GHz, eps_r = 2.08; recalled from memory) is the filled case.
func TestOptimizeFillScaling(t *testing.T) {
	w := mustMode(t, "TE011")
	air, err := Optimize(DesignSpec{Mode: w, Frequency: 5e9})
	if err != nil {
		t.Fatal(err)
	}
	ptfe, err := Optimize(DesignSpec{Mode: w, Frequency: 5e9, Fill: physics.Medium{EpsR: 2.08}})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(ptfe.Ratio-air.Ratio) > routeTol*air.Ratio {
		t.Errorf("PTFE optimum D/L = %.15g, want the air one %.15g", ptfe.Ratio, air.Ratio)
	}
	if got, want := ptfe.Cavity.Diameter(), air.Cavity.Diameter()/math.Sqrt(2.08); math.Abs(got-want) > routeTol*want {
		t.Errorf("PTFE optimum D = %.15g m, want %.15g m", got, want)
	}
}

// TestOptimizeTuningAndTemperature checks the path constraint by brute
// force: Cavity.Clearance on real cavities sampled along the tuning path
// (at the temperature extremes and the reference).
func TestOptimizeTuningAndTemperature(t *testing.T) {
	w := mustMode(t, "TE011")
	th := Thermal{AlphaRadial: 23e-6, AlphaAxial: 1.3e-6, TMin: 253.15, TMax: 333.15}
	spec := DesignSpec{Mode: w, Frequency: 10e9, RatioMin: 0.8, RatioMax: 2.5, Tuning: 0.01, Thermal: th}
	d, err := Optimize(spec)
	if err != nil {
		t.Fatal(err)
	}
	pathMin := func(c Cavity) float64 {
		v := math.Inf(1)
		for _, T := range []float64{th.TMin, th.ref(), th.TMax} {
			dT := T - th.ref()
			ct := c
			ct.Radius *= 1 + th.AlphaRadial*dT
			ct.Length *= 1 + th.AlphaAxial*dT
			f0 := ct.Frequency(w)
			for i := 0; i <= 200; i++ {
				tt := -spec.Tuning + 2*spec.Tuning*float64(i)/200
				// Length that tunes to f0 (1 + tt) at this diameter.
				k := 2 * math.Pi * f0 * (1 + tt) / 299792458.0 * ct.Fill.Index()
				kc := w.Root() / ct.Radius
				cl := ct
				cl.Length = math.Pi / math.Sqrt(k*k-kc*kc)
				cc, err := cl.Clearance(w, ClearanceOptions{})
				if err != nil {
					t.Fatal(err)
				}
				v = math.Min(v, cc.Value)
			}
		}
		return v
	}
	got := pathMin(d.Cavity)
	// Sampling can only miss the worst point, never go below it.
	if got < d.WorstClearance-routeTol || got > d.WorstClearance+samplingGap {
		t.Errorf("sampled path clearance at the optimum = %.12g, want just above %.12g", got, d.WorstClearance)
	}
	// No other ratio does better by more than the sampling error.
	p, _ := newProblem(spec)
	for i := 0; i <= 24; i++ {
		r := spec.RatioMin * math.Pow(spec.RatioMax/spec.RatioMin, float64(i)/24)
		if v := pathMin(p.cavityAt(r * r)); v > d.WorstClearance+optClearTol {
			t.Errorf("path clearance at D/L = %g is %.9g, above the optimum %.9g", r, v, d.WorstClearance)
		}
	}
	if d.WorstClearance >= d.Clearance.Value {
		t.Errorf("worst path clearance %g, want below the nominal %g", d.WorstClearance, d.Clearance.Value)
	}
}

// TestOptimizeInfeasible: an unreachable clearance is an InfeasibleError
// naming the best achievable.
func TestOptimizeInfeasible(t *testing.T) {
	_, err := Optimize(DesignSpec{Mode: mustMode(t, "TE011"), Frequency: 10e9, MinClearance: 0.2})
	var ie *InfeasibleError
	if !errors.As(err, &ie) || !errors.Is(err, ErrInfeasible) {
		t.Fatalf("Optimize(min clearance 20 %%) error = %v, want *InfeasibleError", err)
	}
	want := readOptimum(t)["te011_opt_clearance"] // cavity/testdata/optimum.txt
	if math.Abs(ie.Clearance-want) > optClearTol {
		t.Errorf("InfeasibleError.Clearance = %.12g, want %.12g", ie.Clearance, want)
	}
	// Size limits that exclude every ratio.
	_, err = Optimize(DesignSpec{Mode: mustMode(t, "TE011"), Frequency: 10e9, MaxDiameter: 0.03})
	if !errors.As(err, &ie) {
		t.Errorf("Optimize(D <= 30 mm at 10 GHz) error = %v, want *InfeasibleError (cutoff is 36.6 mm)", err)
	}
}

// TestOptimizeSizeLimit: a binding diameter limit puts the optimum on the
// edge with that diameter exactly.
func TestOptimizeSizeLimit(t *testing.T) {
	// The free optimum at 10 GHz has D = 42.07 mm (D/L = 1.388); below it,
	// down to the TE112 crossing, the clearance rises with D/L.
	d, err := Optimize(DesignSpec{Mode: mustMode(t, "TE011"), Frequency: 10e9, MaxDiameter: 0.0419})
	if err != nil {
		t.Fatal(err)
	}
	if !d.AtRangeEdge || d.Limit != LimitDiameter || math.Abs(d.Cavity.Diameter()-0.0419) > 1e-12 {
		t.Errorf("Optimize(D <= 41.9 mm) = D %.15g m, edge %v %q, want D = 0.0419 m on the max-diameter edge", d.Cavity.Diameter(), d.AtRangeEdge, d.Limit)
	}
	d, err = Optimize(DesignSpec{Mode: mustMode(t, "TE011"), Frequency: 10e9, MaxLength: 0.025, Tuning: 0.01})
	if err != nil {
		t.Fatal(err)
	}
	a, err := Analyze(d, AnalysisSettings{})
	if err != nil {
		t.Fatal(err)
	}
	if a.TunedLength[0] > 0.025*(1+routeTol) {
		t.Errorf("Optimize(L <= 25 mm, tuning 1 %%) longest tuned length = %.15g m, want <= 0.025 m", a.TunedLength[0])
	}
}

// TestOptimizeMaxQ uses a synthetic Q function with a known peak at
// D/L = 1.1 (inside TE011's TM012 notch) and checks the constrained
// optimum against a brute-force scan of the feasible set.
func TestOptimizeMaxQ(t *testing.T) {
	q := func(c Cavity) (float64, error) {
		x := math.Log(c.Diameter() / c.Length / 1.1)
		return 1e4 * math.Exp(-x*x), nil
	}
	w := mustMode(t, "TE011")
	d, err := Optimize(DesignSpec{Mode: w, Frequency: 10e9, Objective: MaxQ, Q: q})
	if err != nil {
		t.Fatal(err)
	}
	// Golden-section search ends at 1e-10 relative in s; 1e-8 in D/L
	// leaves a wide margin.
	const maxQRatioTol = 1e-8
	if math.Abs(d.Ratio-1.1) > maxQRatioTol {
		t.Errorf("Optimize(max Q, no clearance) D/L = %.12g, want 1.1", d.Ratio)
	}
	const need = 0.03
	d, err = Optimize(DesignSpec{Mode: w, Frequency: 10e9, Objective: MaxQ, Q: q, MinClearance: need})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(d.Clearance.Value-need) > optClearTol || d.Limit != LimitMinClearance {
		t.Errorf("Optimize(max Q, clearance >= 3 %%) clearance = %.12g (%q), want exactly 0.03 on the min-clearance bound", d.Clearance.Value, d.Limit)
	}
	best := 0.0
	for i := 0; i <= 4000; i++ {
		r := 0.5 * math.Pow(6, float64(i)/4000)
		if bruteClearance(t, w, r) >= need {
			x := math.Log(r / 1.1)
			best = math.Max(best, 1e4*math.Exp(-x*x))
		}
	}
	// The scan approaches the maximum from below: with 4000 points over
	// D/L 0.5..3 the step is 0.045 % and the Q0 it can miss is below
	// scanGap relative.
	const scanGap = 1e-4
	if d.Q0 < best*(1-routeTol) || d.Q0 > best*(1+scanGap) {
		t.Errorf("Optimize(max Q) Q0 = %.12g, want the feasible maximum %.12g (scan)", d.Q0, best)
	}
	// A Q floor above the peak is infeasible.
	_, err = Optimize(DesignSpec{Mode: w, Frequency: 10e9, Q: q, MinQ: 2e4})
	var ie *InfeasibleError
	// The error reports the best of the qSamples bracketing samples, within
	// bracketTol of the peak 1e4.
	const bracketTol = 1e-3
	if !errors.As(err, &ie) || math.Abs(ie.Q0-1e4) > bracketTol*1e4 {
		t.Errorf("Optimize(min Q 2e4) error = %v, want *InfeasibleError with Q0 about 1e4", err)
	}
}

// TestOptimizePlateau: TM010 has constant-ratio neighbours (TM110), so its
// best clearance, j_11/j_01 - 1, holds over a band of D/L.
func TestOptimizePlateau(t *testing.T) {
	const (
		j01 = 2.404825557695772768621631879 // DLMF Table 10.21.1 / A&S Table 9.5 (recalled from memory)
		j11 = 3.831705970207512315614435886 // same
	)
	d, err := Optimize(DesignSpec{Mode: mustMode(t, "TM010"), Frequency: 3e9, RatioMin: 0.2, RatioMax: 5})
	if err != nil {
		t.Fatal(err)
	}
	const plateauTol = 1e-13 // a ratio of two zeros each good to 1 ulp, minus 1
	if want := j11/j01 - 1; math.Abs(d.Clearance.Value-want) > plateauTol {
		t.Errorf("Optimize(TM010) clearance = %.15g, want %.15g", d.Clearance.Value, want)
	}
	if !(d.Plateau[0] < d.Ratio && d.Ratio < d.Plateau[1]) || d.Plateau[1] != 5 {
		t.Errorf("Optimize(TM010) ratio %g plateau %v, want a plateau reaching 5 around the ratio", d.Ratio, d.Plateau)
	}
}

func TestOptimizeValidation(t *testing.T) {
	w := mustMode(t, "TE011")
	for _, spec := range []DesignSpec{
		{Mode: w},
		{Mode: w, Frequency: -1},
		{Mode: w, Frequency: 1e10, RatioMin: 3, RatioMax: 1},
		{Mode: w, Frequency: 1e10, RatioMin: 1e-4, RatioMax: 1},
		{Mode: w, Frequency: 1e10, MinClearance: 2},
		{Mode: w, Frequency: 1e10, Objective: MaxQ},
		{Mode: w, Frequency: 1e10, Tuning: 0.9},
		{Mode: mustMode(t, "TM010"), Frequency: 1e10, Tuning: 0.01},
		{Mode: w, Frequency: 1e10, Thermal: Thermal{AlphaRadial: 1}},
		{Mode: w, Frequency: 1e10, Thermal: Thermal{TMin: 300, TMax: 200}},
		{Mode: w, Frequency: 1e10, MaxDiameter: -1},
	} {
		if _, err := Optimize(spec); err == nil || errors.Is(err, ErrInfeasible) {
			t.Errorf("Optimize(%+v) error = %v, want an input error", spec, err)
		}
	}
}

// TestTradeOffCurve checks the curves against the brute-force clearance.
func TestTradeOffCurve(t *testing.T) {
	w := mustMode(t, "TE011")
	d, err := Optimize(DesignSpec{Mode: w, Frequency: 10e9})
	if err != nil {
		t.Fatal(err)
	}
	a, err := Analyze(d, AnalysisSettings{CurvePoints: 41})
	if err != nil {
		t.Fatal(err)
	}
	c := a.Curve
	if len(c.Ratio) < 41 || len(c.Clearance) != len(c.Ratio) || len(c.Q0) != len(c.Ratio) {
		t.Fatalf("curve lengths %d, %d, %d, want equal and >= 41", len(c.Ratio), len(c.Clearance), len(c.Q0))
	}
	for i, r := range c.Ratio {
		if i > 0 && r <= c.Ratio[i-1] {
			t.Errorf("curve ratios not increasing at %d: %g after %g", i, r, c.Ratio[i-1])
		}
		if want := bruteClearance(t, w, r); math.Abs(c.Clearance[i]-want) > routeTol {
			t.Errorf("curve clearance(D/L = %g) = %.15g, want %.15g", r, c.Clearance[i], want)
		}
		if !math.IsNaN(c.Q0[i]) {
			t.Errorf("curve Q0 without a Q function = %g, want NaN", c.Q0[i])
		}
	}
}

func ExampleOptimize() {
	// An invented 24 GHz TE011 wavemeter cavity, air filled, D/L 0.5..3.
	m, _ := ParseMode("TE011")
	d, err := Optimize(DesignSpec{Mode: m, Frequency: 24e9})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("D = %.3f mm, L = %.3f mm, D/L = %.4f\n", 1e3*d.Cavity.Diameter(), 1e3*d.Cavity.Length, d.Ratio)
	fmt.Printf("clearance %.2f %%, nearest below %s, companion %v\n",
		100*d.Clearance.Value, d.Clearance.Below.Mode, d.Clearance.Degenerate)
	// Output:
	// D = 17.529 mm, L = 12.629 mm, D/L = 1.3880
	// clearance 7.36 %, nearest below TM110, companion [TM111]
}

// BenchmarkOptimizeTE011 and BenchmarkOptimizeTM010 time the optimum and
// its cheapest analysis (two-point curves), the work one Optimize call did
// before the analysis became a step of its own.
func BenchmarkOptimizeTE011(b *testing.B) {
	spec := DesignSpec{Mode: Mode{TE, 0, 1, 1}, Frequency: 10e9, RatioMin: 0.2, RatioMax: 5}
	for b.Loop() {
		d, err := Optimize(spec)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := Analyze(d, AnalysisSettings{CurvePoints: 2}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkOptimizeTM010(b *testing.B) {
	spec := DesignSpec{Mode: Mode{TM, 0, 1, 0}, Frequency: 10e9, RatioMin: 0.2, RatioMax: 5}
	for b.Loop() {
		d, err := Optimize(spec)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := Analyze(d, AnalysisSettings{CurvePoints: 2}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkOptimizeOnly times the optimum alone, as a caller who wants
// only D and L pays for it: the demo's TE011 problem with tuning and a
// temperature range.
func BenchmarkOptimizeOnly(b *testing.B) {
	spec := DesignSpec{
		Mode: Mode{TE, 0, 1, 1}, Frequency: 10.5e9, RatioMin: 0.8, RatioMax: 2.5, Tuning: 0.005,
		Thermal: Thermal{AlphaRadial: 23e-6, AlphaAxial: 1.3e-6, TMin: 253.15, TMax: 333.15},
	}
	for b.Loop() {
		if _, err := Optimize(spec); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkAnalyzeMonteCarlo times the analysis of that design with a
// 2e4-sample tolerance run, the part Optimize no longer pays for.
func BenchmarkAnalyzeMonteCarlo(b *testing.B) {
	spec := DesignSpec{
		Mode: Mode{TE, 0, 1, 1}, Frequency: 10.5e9, RatioMin: 0.8, RatioMax: 2.5, Tuning: 0.005,
		Thermal: Thermal{AlphaRadial: 23e-6, AlphaAxial: 1.3e-6, TMin: 253.15, TMax: 333.15},
	}
	d, err := Optimize(spec)
	if err != nil {
		b.Fatal(err)
	}
	set := AnalysisSettings{Tolerance: Tolerance{Diameter: 10e-6, Length: 10e-6, Samples: 20000, Seed: 1}}
	for b.Loop() {
		if _, err := Analyze(d, set); err != nil {
			b.Fatal(err)
		}
	}
}
