package filter

import (
	"math"
	"testing"
)

// mapTol is the relative error of the frequency mapping round trip
// (LowpassOmega of BandpassFrequency): a few rounding steps.
const mapTol = 1e-12

// sweepDesign is the invented scenario of the sweep tests: a six-resonator
// 20 dB Chebyshev filter at 10 GHz, 200 MHz wide, with zeros at 9.8 and
// 10.18 GHz and rejections of 40 dB at 10.25 GHz and 35 dB at 9.75 GHz.
func sweepDesign(t testing.TB) *Design {
	t.Helper()
	const f0, bw = 10e9, 200e6
	d, err := Synthesize(Spec{F0: f0, BW: bw, Order: 6, ReturnLoss: 20,
		Zeros:      []float64{LowpassOmega(9.8e9, f0, bw), LowpassOmega(10.18e9, f0, bw)},
		Rejections: []Rejection{{F: 10.25e9, Attenuation: 40}, {F: 9.75e9, Attenuation: 35}}})
	if err != nil {
		t.Fatal(err)
	}
	return d
}

func TestSweepRange(t *testing.T) {
	d := sweepDesign(t)
	s := d.Spec
	// Span 5 covers every zero (|Omega| <= 2.1) and rejection (|Omega| <=
	// 2.56): the range maps back to exactly -5..5.
	lo, hi, err := SweepRange(d, 5)
	if err != nil {
		t.Fatal(err)
	}
	if w := LowpassOmega(lo, s.F0, s.BW); math.Abs(w+5) > 5*mapTol {
		t.Errorf("LowpassOmega(lo) = %v, want -5", w)
	}
	if w := LowpassOmega(hi, s.F0, s.BW); math.Abs(w-5) > 5*mapTol {
		t.Errorf("LowpassOmega(hi) = %v, want 5", w)
	}
	// Geometric centring (derived from f1 f2 = f0^2 of the mapping).
	if g := math.Sqrt(lo * hi); math.Abs(g-s.F0) > mapTol*s.F0 {
		t.Errorf("sqrt(lo hi) = %v, want f0 = %v", g, s.F0)
	}
	// Span 1.5 does not reach the rejection at 10.25 GHz (Omega 2.47): the
	// range widens to 1.15 times the outermost Omega on each side.
	lo, hi, err = SweepRange(d, 1.5)
	if err != nil {
		t.Fatal(err)
	}
	wantHi := sweepMargin * LowpassOmega(10.25e9, s.F0, s.BW)
	wantLo := sweepMargin * LowpassOmega(9.75e9, s.F0, s.BW)
	if w := LowpassOmega(hi, s.F0, s.BW); math.Abs(w-wantHi) > 5*mapTol {
		t.Errorf("widened LowpassOmega(hi) = %v, want %v", w, wantHi)
	}
	if w := LowpassOmega(lo, s.F0, s.BW); math.Abs(w-wantLo) > 5*mapTol {
		t.Errorf("widened LowpassOmega(lo) = %v, want %v", w, wantLo)
	}
	for _, span := range []float64{1, 0.5, -3, math.NaN(), MaxSpan * 2} {
		if _, _, err := SweepRange(d, span); err == nil {
			t.Errorf("SweepRange(d, %v) = nil error, want a range error", span)
		}
	}
	if _, _, err := SweepRange(nil, 3); err == nil {
		t.Error("SweepRange(nil, 3) = nil error, want an error")
	}
}

func TestSweep(t *testing.T) {
	fs, err := Sweep(1e9, 2e9, 11)
	if err != nil {
		t.Fatal(err)
	}
	if len(fs) != 11 || fs[0] != 1e9 || fs[10] != 2e9 {
		t.Fatalf("Sweep(1e9, 2e9, 11) = %v, want 11 points from 1e9 to 2e9", fs)
	}
	for i := 1; i < len(fs); i++ {
		if step := fs[i] - fs[i-1]; math.Abs(step-1e8) > 1e-6 {
			t.Errorf("Sweep step %d = %v, want 1e8", i, step)
		}
	}
	for _, c := range []struct {
		lo, hi float64
		n      int
	}{{0, 1e9, 10}, {2e9, 1e9, 10}, {1e9, math.Inf(1), 10}, {1e9, 2e9, 1}, {1e9, 2e9, MaxSweepPoints + 1}, {math.NaN(), 1e9, 10}} {
		if _, err := Sweep(c.lo, c.hi, c.n); err == nil {
			t.Errorf("Sweep(%v, %v, %d) = nil error, want an error", c.lo, c.hi, c.n)
		}
	}
}
