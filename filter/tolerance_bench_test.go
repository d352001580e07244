package filter

import "testing"

// BenchmarkYield1e4x1000 times the Monte Carlo of the target:
// 10^4 samples of the 6-pole tolerance design with a 1,000-point response
// each (unequal Q0 from the copper cavities), on every core.
func BenchmarkYield1e4x1000(b *testing.B) {
	d, r := tolDesign(b)
	freqs, _ := Sweep(9.8e9, 10.2e9, 1000)
	for b.Loop() {
		if _, err := Yield(d, r, YieldOptions{Machining: Machining{Diameter: 10e-6, Length: 10e-6, Coupling: 0.01},
			Samples: 10000, Seed: 1, Freqs: freqs}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkYieldVerdict1e3 times 10^3 samples with the specification check
// (Design.Check) of every sample, the yield.
func BenchmarkYieldVerdict1e3(b *testing.B) {
	d, r := tolDesign(b)
	for b.Loop() {
		if _, err := Yield(d, r, YieldOptions{Machining: Machining{Diameter: 10e-6, Length: 10e-6, Coupling: 0.01},
			Samples: 1000, Seed: 1, Verdict: true, ReturnLoss: 17}); err != nil {
			b.Fatal(err)
		}
	}
}
