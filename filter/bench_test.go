package filter

import "testing"

// benchSpec is the benchmark filter of issue 6: order 12 with four
// transmission zeros (asymmetric), 20 dB return loss.
var benchSpec = Spec{F0: 10e9, BW: 200e6, Order: 12, ReturnLoss: 20, Zeros: []float64{-1.6, -1.25, 1.2, 1.45}}

// BenchmarkSynthesize12x4 times the whole chain from the specification to
// the folded coupling matrix, including the self-check.
func BenchmarkSynthesize12x4(b *testing.B) {
	for b.Loop() {
		if _, err := Synthesize(benchSpec); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkResponse1e4 times a 10^4-point response of that filter with an
// unloaded Q per resonator (S11, S21, S22 and the analytic group delay).
func BenchmarkResponse1e4(b *testing.B) {
	d, err := Synthesize(benchSpec)
	if err != nil {
		b.Fatal(err)
	}
	freqs := make([]float64, 10000)
	for i := range freqs {
		freqs[i] = 9.5e9 + float64(i)*1e5
	}
	q0 := make([]float64, 12)
	for i := range q0 {
		q0[i] = 8000
	}
	b.ResetTimer()
	for b.Loop() {
		if _, err := d.Response(freqs, q0); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkSynthesize30 times the largest all-pole synthesis.
func BenchmarkSynthesize30(b *testing.B) {
	s := Spec{F0: 10e9, BW: 200e6, Order: 30, ReturnLoss: 20}
	for b.Loop() {
		if _, err := Synthesize(s); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkResponse1e4Mixed is BenchmarkResponse1e4 with a different Q0 in
// every resonator (the complex modal path of fastresponse.go; the LU
// reference is BenchmarkResponse1e4MixedLU).
func BenchmarkResponse1e4Mixed(b *testing.B) {
	d, err := Synthesize(benchSpec)
	if err != nil {
		b.Fatal(err)
	}
	freqs := make([]float64, 10000)
	for i := range freqs {
		freqs[i] = 9.5e9 + float64(i)*1e5
	}
	q0 := make([]float64, 12)
	for i := range q0 {
		q0[i] = 8000 + 100*float64(i)
	}
	b.ResetTimer()
	for b.Loop() {
		if _, err := d.Response(freqs, q0); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkCheck12x4 times the specification check of that filter with
// losses and two rejection regions (each searched from F to the end of the
// band of interest with exact minima), and the order selection for it.
func BenchmarkCheck12x4(b *testing.B) {
	s := benchSpec
	s.Rejections = []Rejection{{F: 10.13e9, Attenuation: 60}, {F: 9.87e9, Attenuation: 60}}
	d, err := Synthesize(s)
	if err != nil {
		b.Fatal(err)
	}
	q0 := make([]float64, 12)
	for i := range q0 {
		q0[i] = 8000
	}
	b.Run("check", func(b *testing.B) {
		for b.Loop() {
			if _, err := d.Check(q0, nil); err != nil {
				b.Fatal(err)
			}
		}
	})
	s.Order = 0
	b.Run("minorder", func(b *testing.B) {
		for b.Loop() {
			if _, err := s.MinOrder(); err != nil {
				b.Fatal(err)
			}
		}
	})
}
