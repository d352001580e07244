package cavity

import (
	"math"
	"testing"
)

// TestThermalSizeLaws checks the measured-law path of Thermal two ways:
// size laws that repeat the linear model give the linear model's design to
// rounding, and for TM010 (f = c j01/(2 pi a), Pozar 4th ed. sec. 6.7) a
// nonlinear radial law gives the drift f (1/r(T) - 1) exactly.
func TestThermalSizeLaws(t *testing.T) {
	const aR, aZ = 23e-6, 1.3e-6
	lin := Thermal{AlphaRadial: aR, AlphaAxial: aZ, TMin: 253.15, TMax: 333.15, TRef: 293.15}
	laws := lin
	laws.SizeRadial = func(T float64) float64 { return 1 + aR*(T-293.15) }
	laws.SizeAxial = func(T float64) float64 { return 1 + aZ*(T-293.15) }
	w := mustMode(t, "TE011")
	run := func(spec DesignSpec) (Design, Analysis) {
		t.Helper()
		d, err := Optimize(spec)
		if err != nil {
			t.Fatal(err)
		}
		an, err := Analyze(d, AnalysisSettings{CurvePoints: 5})
		if err != nil {
			t.Fatal(err)
		}
		return d, an
	}
	a, aa := run(DesignSpec{Mode: w, Frequency: 10e9, Tuning: 0.01, Thermal: lin})
	b, ba := run(DesignSpec{Mode: w, Frequency: 10e9, Tuning: 0.01, Thermal: laws})
	if a.Ratio != b.Ratio || a.WorstClearance != b.WorstClearance || aa.Drift != ba.Drift {
		t.Errorf("size laws equal to the linear model: ratio %v, worst %v, drift %v; want %v, %v, %v",
			b.Ratio, b.WorstClearance, ba.Drift, a.Ratio, a.WorstClearance, aa.Drift)
	}

	// An invented nonlinear law: the radius shrinks by 0.15 % at 2 K
	// relative to 300 K, quadratically in T.
	r := func(T float64) float64 { return 1 - 0.0015*(1-(T/300)*(T/300)) }
	th := Thermal{TMin: 2, TMax: 300, TRef: 2, SizeRadial: func(T float64) float64 { return r(T) / r(2) }}
	_, d := run(DesignSpec{Mode: mustMode(t, "TM010"), Frequency: 1.3e9, Thermal: th})
	want := 1.3e9 * (r(2)/r(300) - 1)
	const freqTol = 1e-12 // relative, rounding of the frequency formula
	if d.Drift[0] != 0 || math.Abs(d.Drift[1]-want) > freqTol*1.3e9 {
		t.Errorf("TM010 drift = %v Hz, want [0 %g] Hz", d.Drift, want)
	}
	bad := th
	bad.SizeRadial = func(float64) float64 { return math.NaN() }
	if err := bad.Validate(); err == nil {
		t.Error("Validate accepts a size law that returns NaN")
	}
}
