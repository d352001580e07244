package cavity

import (
	"math"
	"testing"
)

// TestAnalyzeDrift checks the thermal drift by an independent route, the
// scaling law: when the diameter and the length expand alike by (1 + alpha
// dT) and the fill does not change, every frequency is divided by that
// factor (Pozar, Microwave Engineering, 4th ed., eq. 6.40: f is
// proportional to 1/size at fixed eps and mu).
func TestAnalyzeDrift(t *testing.T) {
	const alpha = 17e-6 // 1/K, a copper-like coefficient; any value will do
	th := Thermal{AlphaRadial: alpha, AlphaAxial: alpha, TMin: 250, TMax: 350}
	d, err := Optimize(DesignSpec{Mode: mustMode(t, "TE011"), Frequency: 10e9, Thermal: th})
	if err != nil {
		t.Fatal(err)
	}
	a, err := Analyze(d, AnalysisSettings{CurvePoints: 2})
	if err != nil {
		t.Fatal(err)
	}
	// driftTol: the drift is a difference of two frequencies near 1e10 Hz,
	// each good to a few ulp; 1e-5 Hz is 1e-15 relative.
	const driftTol = 1e-5
	f := d.Cavity.Frequency(d.Spec.Mode)
	for i, T := range []float64{th.TMin, th.TMax} {
		want := f/(1+alpha*(T-300)) - f
		if math.Abs(a.Drift[i]-want) > driftTol {
			t.Errorf("Analyze drift at %g K = %.9g Hz, want %.9g Hz (scaling law)", T, a.Drift[i], want)
		}
	}
	if a.Spread != nil || a.TunedLength != [2]float64{} {
		t.Errorf("Analyze without tolerance or tuning: spread %v, tuned lengths %v, want nil and zero", a.Spread, a.TunedLength)
	}
}

// TestAnalyzeRebuilt: a Design not made by Optimize (built from its
// fields) gives the same analysis as Optimize's own result, through the
// problem solved again from the spec.
func TestAnalyzeRebuilt(t *testing.T) {
	spec := DesignSpec{Mode: mustMode(t, "TE011"), Frequency: 10e9, Tuning: 0.01,
		Thermal: Thermal{AlphaRadial: 23e-6, AlphaAxial: 1.3e-6, TMin: 253.15, TMax: 333.15}}
	d, err := Optimize(spec)
	if err != nil {
		t.Fatal(err)
	}
	set := AnalysisSettings{CurvePoints: 11, Tolerance: Tolerance{Diameter: 2e-5, Length: 2e-5, Samples: 500, Seed: 7}}
	want, err := Analyze(d, set)
	if err != nil {
		t.Fatal(err)
	}
	bare := Design{Spec: d.Spec, Cavity: d.Cavity, Ratio: d.Ratio}
	got, err := Analyze(bare, set)
	if err != nil {
		t.Fatal(err)
	}
	// rebuildTol: the rebuilt (D/L)^2 is Ratio*Ratio, which may differ
	// from the optimiser's s in the last bit.
	const rebuildTol = 1e-12
	for i := range 2 {
		if math.Abs(got.TunedLength[i]-want.TunedLength[i]) > rebuildTol*want.TunedLength[i] {
			t.Errorf("rebuilt tuned length %d = %.15g m, want %.15g m", i, got.TunedLength[i], want.TunedLength[i])
		}
		if got.Drift[i] != want.Drift[i] {
			t.Errorf("rebuilt drift %d = %g Hz, want %g Hz", i, got.Drift[i], want.Drift[i])
		}
	}
	if got.Spread == nil || *got.Spread != *want.Spread {
		t.Errorf("rebuilt spread = %+v, want %+v", got.Spread, want.Spread)
	}
	if len(got.Curve.Ratio) != len(want.Curve.Ratio) {
		t.Fatalf("rebuilt curve has %d points, want %d", len(got.Curve.Ratio), len(want.Curve.Ratio))
	}
	for i := range got.Curve.Ratio {
		if math.Abs(got.Curve.WorstClearance[i]-want.Curve.WorstClearance[i]) > rebuildTol {
			t.Errorf("rebuilt curve point %d: worst clearance %.15g, want %.15g", i, got.Curve.WorstClearance[i], want.Curve.WorstClearance[i])
		}
	}
}

func TestAnalyzeValidation(t *testing.T) {
	d, err := Optimize(DesignSpec{Mode: mustMode(t, "TE011"), Frequency: 10e9})
	if err != nil {
		t.Fatal(err)
	}
	for _, set := range []AnalysisSettings{{CurvePoints: 1}, {CurvePoints: -3}, {CurvePoints: 100001}} {
		if _, err := Analyze(d, set); err == nil {
			t.Errorf("Analyze(%+v) error = nil, want an input error", set)
		}
	}
	if _, err := Analyze(d, AnalysisSettings{Tolerance: Tolerance{Diameter: -1, Samples: 10}}); err == nil {
		t.Errorf("Analyze(negative tolerance) error = nil, want MonteCarlo's input error")
	}
}
