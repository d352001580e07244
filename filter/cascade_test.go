package filter

import (
	"math"
	"math/cmplx"
	"slices"
	"testing"
)

// TestRearrangeCascades: the folded matrices of designs carried into
// cascaded triplets and quadruplets keep their response (|S11|, |S21| and
// the phase of S21 to 1e-12 at 401 frequencies, and the group delay), the
// entries the topology does not allow are exact zeros, and each triplet
// realises one of the design's zeros (BlockZeros, from the node equations,
// an independent route).
func TestRearrangeCascades(t *testing.T) {
	cases := []struct {
		n     int
		zeros []float64
		topo  string
	}{
		{3, []float64{1.8}, "triplets"},
		{5, []float64{-1.7, 1.4}, "triplets"},
		{6, []float64{1.5, 2.2}, "triplets"},
		{7, []float64{-2.1, -1.5, 1.3}, "triplets"},
		{4, []float64{-1.9, 1.9}, "quadruplets"},
		{6, []float64{-1.6, 1.45}, "quadruplets"},
		{7, []float64{-1.9, -1.4, 1.4, 1.9}, "quadruplets"},
		{8, []float64{-2.5, -1.3, 1.5, 2.2}, "quadruplets"},
	}
	const f0, bw = 10e9, 100e6
	freqs := make([]float64, 401)
	for i := range freqs {
		freqs[i] = BandpassFrequency(-4+8*float64(i)/400, f0, bw)
	}
	for _, c := range cases {
		d, err := Synthesize(Spec{F0: f0, BW: bw, Order: c.n, ReturnLoss: 22, Zeros: c.zeros})
		if err != nil {
			t.Fatal(err)
		}
		top, err := CascadeTopology(c.topo, c.n, len(c.zeros))
		if err != nil {
			t.Fatal(err)
		}
		r, err := d.Rearranged(top)
		if err != nil {
			t.Fatalf("N=%d %v %s: %v", c.n, c.zeros, c.topo, err)
		}
		m := r.Folded
		for i := 0; i < c.n+2; i++ {
			for j := 0; j < c.n+2; j++ {
				if m.At(i, j) != m.At(j, i) {
					t.Errorf("%s N=%d: not symmetric at (%d,%d)", c.topo, c.n, i, j)
				}
				if !top.Allowed(i, j) && m.At(i, j) != 0 {
					t.Errorf("%s N=%d: entry (%d,%d) = %g, want an exact zero", c.topo, c.n, i, j, m.At(i, j))
				}
			}
		}
		a, err := d.Response(freqs, nil)
		if err != nil {
			t.Fatal(err)
		}
		b, err := r.Response(freqs, nil)
		if err != nil {
			t.Fatal(err)
		}
		worst := 0.0
		for i := range a {
			worst = math.Max(worst, math.Abs(cmplx.Abs(a[i].S11)-cmplx.Abs(b[i].S11)))
			worst = math.Max(worst, cmplx.Abs(a[i].S21-b[i].S21))
			// The delay is compared away from the zeros, where S21
			// vanishes and its phase is undefined.
			if tau := math.Abs(a[i].GroupDelay-b[i].GroupDelay) / math.Abs(a[i].GroupDelay); cmplx.Abs(a[i].S21) > 1e-6 && tau > 1e-9 {
				t.Errorf("%s N=%d: group delay differs by %g relative at %g Hz", c.topo, c.n, tau, freqs[i])
			}
		}
		if worst > 1e-12 {
			t.Errorf("%s N=%d: response changed by %g", c.topo, c.n, worst)
		}
		if bz := BlockZeros(m, top); bz != nil {
			slices.Sort(bz)
			for k := range bz {
				if math.Abs(bz[k]-c.zeros[k]) > 1e-9 {
					t.Errorf("%s N=%d: triplet zeros %v, want %v", c.topo, c.n, bz, c.zeros)
					break
				}
			}
		}
		checks, err := r.Check(nil, nil)
		if err != nil || Overall(checks) != Met {
			t.Errorf("%s N=%d: rearranged design fails its checks (%v)", c.topo, c.n, err)
		}
		t.Logf("%s N=%d zeros %v: %s, response change %.2g", c.topo, c.n, c.zeros, top.Description(), worst)
	}
}

// TestCascadeTopologyErrors: impossible requests name the limits.
func TestCascadeTopologyErrors(t *testing.T) {
	for _, c := range []struct {
		name  string
		n, nz int
	}{
		{"triplets", 4, 2}, {"triplets", 5, 0}, {"quadruplets", 6, 3}, {"quadruplets", 6, 4}, {"ring", 6, 2},
	} {
		if _, err := CascadeTopology(c.name, c.n, c.nz); err == nil {
			t.Errorf("CascadeTopology(%q, %d, %d): want an error", c.name, c.n, c.nz)
		}
	}
}

// TestRearrangeQuadrupletPair: a real-axis zero pair (group-delay
// equalisation) is realised by a quadruplet too, with the response
// unchanged and the pattern exact.
func TestRearrangeQuadrupletPair(t *testing.T) {
	const f0, bw = 10e9, 100e6
	for _, c := range []struct {
		n            int
		zeros, pairs []float64
	}{
		{4, nil, []float64{1.2}},
		{7, []float64{-1.8, 1.8}, []float64{1.0}},
	} {
		d, err := Synthesize(Spec{F0: f0, BW: bw, Order: c.n, ReturnLoss: 20, Zeros: c.zeros, RealPairs: c.pairs})
		if err != nil {
			t.Fatal(err)
		}
		top, err := CascadeTopology("quadruplets", c.n, len(c.zeros)+2*len(c.pairs))
		if err != nil {
			t.Fatal(err)
		}
		r, err := d.Rearranged(top)
		if err != nil {
			t.Fatalf("N=%d: %v", c.n, err)
		}
		for i := 0; i < c.n+2; i++ {
			for j := 0; j < c.n+2; j++ {
				if !top.Allowed(i, j) && r.Folded.At(i, j) != 0 {
					t.Errorf("N=%d: entry (%d,%d) = %g", c.n, i, j, r.Folded.At(i, j))
				}
			}
		}
		freqs := []float64{9.9e9, 9.96e9, 10e9, 10.02e9, 10.06e9}
		a, _ := d.Response(freqs, nil)
		b, _ := r.Response(freqs, nil)
		for i := range a {
			if e := cmplx.Abs(a[i].S21 - b[i].S21); e > 1e-12 {
				t.Errorf("N=%d: S21 changed by %g", c.n, e)
			}
		}
	}
}

// BenchmarkRearrangeTriplets times carrying a 7-resonator folded matrix
// with three zeros into cascaded triplets.
func BenchmarkRearrangeTriplets(b *testing.B) {
	d, err := Synthesize(Spec{F0: 10e9, BW: 100e6, Order: 7, ReturnLoss: 22, Zeros: []float64{-2.1, -1.5, 1.3}})
	if err != nil {
		b.Fatal(err)
	}
	top, _ := CascadeTopology("triplets", 7, 3)
	for b.Loop() {
		if _, err := d.Rearranged(top); err != nil {
			b.Fatal(err)
		}
	}
}
