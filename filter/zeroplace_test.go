package filter

import (
	"math"
	"testing"
)

// handExample is a published hand choice of zeros: order, return loss and
// zeros (normalised Omega).
type handExample struct {
	name   string
	order  int
	rl     float64
	zeros  []float64
	inner  []float64 // inner edges of the rejection regions, Omega
	source string
}

// handExamples are three textbook designs whose zeros were chosen by hand.
// The values are recalled from memory (marked so at each); the test does
// not depend on their exact figures, only on them being a designer's
// choice: the mask is what the hand design itself achieves.
var handExamples = []handExample{
	{
		name: "4-2 asymmetric", order: 4, rl: 22, zeros: []float64{1.3217, 1.8082},
		inner:  []float64{1.3, -2.0},
		source: "R. J. Cameron, IEEE T-MTT 47(4) 1999, the (4-2) asymmetric example, and CKM 2007 ch. 8 (recalled from memory)",
	},
	{
		name: "6-pole quasi-elliptic", order: 6, rl: ReturnLossFromRipple(0.1), zeros: []float64{-1.8, 1.8},
		inner:  []float64{1.7, -1.7},
		source: "J.-S. Hong, M. J. Lancaster 2001, sec. 10.2, 6-pole quasi-elliptic design with Omega_a = 1.80, 0.1 dB ripple (recalled from memory)",
	},
	{
		name: "8-4 symmetric", order: 8, rl: 23, zeros: []float64{-1.8082, -1.3217, 1.3217, 1.8082},
		inner:  []float64{1.25, -1.25},
		source: "CKM 2007 ch. 8, symmetric 8th-degree example with two zero pairs (recalled from memory; the exact figures may differ)",
	},
}

// handMask builds the mask the hand design meets: a rejection from each
// inner edge outwards at the level the hand design achieves there, less
// 0.1 dB.
func handMask(t testing.TB, ex handExample) Spec {
	t.Helper()
	const f0, bw = 10e9, 100e6
	s := Spec{F0: f0, BW: bw, ReturnLoss: ex.rl}
	for _, w := range ex.inner {
		s.Rejections = append(s.Rejections, Rejection{F: BandpassFrequency(w, f0, bw), Attenuation: 1})
	}
	h := s
	h.Order, h.Zeros = ex.order, ex.zeros
	d, err := Synthesize(h)
	if err != nil {
		t.Fatalf("%s: %v", ex.name, err)
	}
	checks, err := d.Check(nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	k := 0
	for _, c := range checks {
		if c.Name == "rejection" {
			s.Rejections[k].Attenuation = math.Floor(10*(c.Achieved-0.1)) / 10
			k++
		}
	}
	return s
}

// TestPlaceZerosHandExamples: on three published hand designs the
// optimiser never needs more resonators than the hand choice, and its
// design meets the mask by Design.Check.
func TestPlaceZerosHandExamples(t *testing.T) {
	for _, ex := range handExamples {
		s := handMask(t, ex)
		p, err := PlaceZeros(s, PlaceOptions{})
		if err != nil {
			t.Fatalf("%s: %v", ex.name, err)
		}
		t.Logf("%s (%s): mask %+v; hand N = %d zeros %v; placed N = %d zeros %.5f margin %.3g dB, %d evaluations",
			ex.name, ex.source, s.Rejections, ex.order, ex.zeros, p.Order, p.Zeros, p.Margin, p.Evaluations)
		if p.Order > ex.order {
			t.Errorf("%s: placement needs N = %d, the hand choice %d", ex.name, p.Order, ex.order)
		}
		if Overall(p.Checks) != Met {
			t.Errorf("%s: placed design does not meet the mask", ex.name)
		}
	}
}

// TestPlaceZerosSymmetric: for a mask symmetric in Omega the zeros come
// out in mirrored pairs (exactly, to the last bit), and the design meets
// the mask.
func TestPlaceZerosSymmetric(t *testing.T) {
	const f0, bw = 10e9, 200e6
	s := Spec{F0: f0, BW: bw, ReturnLoss: 20, Rejections: []Rejection{
		{F: BandpassFrequency(1.4, f0, bw), Attenuation: 45},
		{F: BandpassFrequency(-1.4, f0, bw), Attenuation: 45},
	}}
	p, err := PlaceZeros(s, PlaceOptions{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("N = %d, zeros %v, margin %.3g dB", p.Order, p.Zeros, p.Margin)
	if !p.Symmetric || len(p.Zeros) == 0 || len(p.Zeros)%2 != 0 {
		t.Fatalf("want mirrored zeros, got symmetric=%v zeros %v", p.Symmetric, p.Zeros)
	}
	for i, z := range p.Zeros {
		if z != -p.Zeros[len(p.Zeros)-1-i] {
			t.Errorf("zero %d = %v is not mirrored by %v", i, z, p.Zeros[len(p.Zeros)-1-i])
		}
	}
	if Overall(p.Checks) != Met {
		t.Error("placed design does not meet the mask")
	}
	// An all-pole design of the same mask needs more resonators (the
	// closed form of MinOrder, an independent route).
	nAllPole, err := s.MinOrder()
	if err != nil {
		t.Fatal(err)
	}
	if p.Order >= nAllPole {
		t.Errorf("zeros should save resonators: placed N = %d, all-pole N = %d", p.Order, nAllPole)
	}
}

// TestPlaceZerosAllPoleBound: the placement never needs more resonators
// than the all-pole order of Spec.MinOrder (nz = 0 is one of its
// candidates), on asymmetric masks.
func TestPlaceZerosAllPoleBound(t *testing.T) {
	const f0, bw = 5e9, 50e6
	for _, rj := range [][]Rejection{
		{{F: BandpassFrequency(1.6, f0, bw), Attenuation: 30}},
		{{F: BandpassFrequency(3, f0, bw), Attenuation: 60}, {F: BandpassFrequency(-1.3, f0, bw), Attenuation: 25}},
	} {
		s := Spec{F0: f0, BW: bw, ReturnLoss: 25, Rejections: rj}
		n, err := s.MinOrder()
		if err != nil {
			t.Fatal(err)
		}
		p, err := PlaceZeros(s, PlaceOptions{})
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("all-pole N = %d; placed N = %d zeros %v", n, p.Order, p.Zeros)
		if p.Order > n {
			t.Errorf("placed N = %d > all-pole N = %d", p.Order, n)
		}
	}
}

// TestPlaceZerosErrors: invalid requests name the problem.
func TestPlaceZerosErrors(t *testing.T) {
	base := Spec{F0: 10e9, BW: 100e6, Rejections: []Rejection{{F: 10.2e9, Attenuation: 30}}}
	for _, c := range []struct {
		s   Spec
		opt PlaceOptions
	}{
		{Spec{F0: 10e9, BW: 100e6, Family: Butterworth, Rejections: base.Rejections}, PlaceOptions{}},
		{func() Spec { s := base; s.Order = 4; return s }(), PlaceOptions{}},
		{func() Spec { s := base; s.Zeros = []float64{2}; return s }(), PlaceOptions{}},
		{base, PlaceOptions{MaxOrder: 99}},
		{base, PlaceOptions{MaxZeros: -1}},
		{Spec{F0: 10e9, BW: 100e6, Rejections: []Rejection{{F: 13e9, Attenuation: 30}}}, PlaceOptions{}},
		{Spec{F0: 10e9, BW: 100e6, Rejections: []Rejection{{F: 10.06e9, Attenuation: 200}}}, PlaceOptions{MaxOrder: 5}},
	} {
		if _, err := PlaceZeros(c.s, c.opt); err == nil {
			t.Errorf("PlaceZeros(%+v, %+v): want an error", c.s, c.opt)
		}
	}
}

// BenchmarkPlaceZeros times the placement for the 4-2 asymmetric and the
// 8-4 symmetric hand examples' masks.
func BenchmarkPlaceZeros(b *testing.B) {
	for _, k := range []int{0, 2} {
		ex := handExamples[k]
		s := handMask(b, ex)
		b.Run(ex.name, func(b *testing.B) {
			for b.Loop() {
				if _, err := PlaceZeros(s, PlaceOptions{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// TestPlaceZerosLossy: with a low unloaded Q the acceptance check (with
// the losses) can need more than the lossless placement, never less, and
// the placed design meets the mask with the losses by Design.Check.
func TestPlaceZerosLossy(t *testing.T) {
	s := handMask(t, handExamples[0])
	lossless, err := PlaceZeros(s, PlaceOptions{})
	if err != nil {
		t.Fatal(err)
	}
	lossy, err := PlaceZeros(s, PlaceOptions{Q0: 300})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("lossless N = %d, Q0 = 300: N = %d zeros %v", lossless.Order, lossy.Order, lossy.Zeros)
	if lossy.Order < lossless.Order {
		t.Errorf("lossy placement N = %d below the lossless %d", lossy.Order, lossless.Order)
	}
	if Overall(lossy.Checks) != Met || len(lossy.Checks) <= len(lossless.Checks) {
		t.Errorf("lossy checks: %v, %d lines", Overall(lossy.Checks), len(lossy.Checks))
	}
}
