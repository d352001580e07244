package iris

import (
	"math"
	"sort"
	"testing"

	"gonum.org/v1/gonum/mat"

	"cylcav/axisym"
	"cylcav/cavity"
	"cylcav/filter"
)

// chainTol bounds the distance of each resonance of the closed in-line
// chain from the coupling-matrix model, in units of the bandwidth. The
// two-resonator reading of a split pair neglects the other resonances of
// the cells (the pair's next resonance lies some 20 to 30 splits away
// here, Point.Isolation), which moves k and the tuning by a few percent
// of k; a tenth of the bandwidth is within what a filter's tuning screws
// cover (common practice).
const chainTol = 0.1

// TestChainAgainstModel builds the whole in-line filter body of 3- and
// 4-pole all-pole designs in TE011 and TM010 cavities (closed at both
// ends, no ports) from the sized irises and corrected cavity dimensions
// and solves it with package axisym.
// Its resonances must be those of the coupling-matrix model of the
// design: for synchronously tuned resonators coupled by k_i,i+1, the
// eigenfrequencies f0/sqrt(1 + lambda) with lambda the eigenvalues of the
// coupling matrix K (Hong and Lancaster 2001, sec. 8.2, the coupled
// resonators' eigen-equation, as recalled). This checks k, the tuning of
// every cavity with its irises in place, and the extensions' additivity at
// once, by a route (the whole body) that the sizing never solves.
func TestChainAgainstModel(t *testing.T) {
	const wall = 0.002
	tm010 := cavity.Mode{Family: cavity.TM, M: 1, P: 0}
	for _, tc := range []struct {
		n    int
		mode cavity.Mode
		f0   float64
	}{{3, te011, 10e9}, {4, te011, 10e9}, {3, tm010, 3e9}, {4, tm010, 3e9}} {
		n, mode := tc.n, tc.mode
		d, err := filter.Synthesize(filter.Spec{F0: tc.f0, BW: tc.f0 / 100, Order: n, ReturnLoss: 20})
		if err != nil {
			t.Fatal(err)
		}
		rz, err := filter.Realise(d, filter.RealiseOptions{Mode: mode, Shape: cavity.ByRatio(1.2)})
		if err != nil {
			t.Fatal(err)
		}
		pl, err := Realise(d, rz, Options{Wall: wall})
		if err != nil {
			t.Fatal(err)
		}
		if !pl.Converged {
			t.Fatalf("%s n = %d: passes did not converge (change %g)", mode, n, pl.Change)
		}
		for _, c := range pl.Couplings {
			if c.Kind == "main" {
				t.Logf("%s n = %d, iris %d-%d: r = %.5g m, k = %.5g, isolation %.3g splits, detuning %.3g %%", mode, n, c.From, c.To, c.Radius, c.Achieved, c.Isolation, 100*c.Shift)
			}
		}
		var secs []axisym.Section
		for i, c := range pl.Cavities {
			secs = append(secs, axisym.Section{Length: c.CorrectedLength, Radius: c.CorrectedRadius})
			if i < n-1 {
				secs = append(secs, axisym.Section{Length: wall, Radius: pl.Couplings[i+1].Radius})
			}
		}
		res, err := axisym.Solve(axisym.Body{Sections: secs}, axisym.Request{MaxFrequency: 1.03 * tc.f0, Families: []cavity.Family{mode.Family}})
		if err != nil {
			t.Fatal(err)
		}
		if len(res) != n {
			t.Fatalf("%s n = %d: %d resonances below 1.03 f0, want %d", mode, n, len(res), n)
		}
		k := mat.NewSymDense(n, nil)
		for i := 1; i < n; i++ {
			k.SetSym(i-1, i, d.Coupling(i, i+1))
		}
		var eig mat.EigenSym
		if !eig.Factorize(k, false) {
			t.Fatal("eigen")
		}
		var want []float64
		for _, l := range eig.Values(nil) {
			want = append(want, d.Spec.F0/math.Sqrt(1+l))
		}
		sort.Float64s(want)
		for i, r := range res {
			dev := (r.Frequency - want[i]) / d.Spec.BW
			t.Logf("%s n = %d, #%d: chain %.6f GHz, model %.6f GHz, %+.3f bandwidths", mode, n, i+1, r.Frequency/1e9, want[i]/1e9, dev)
			if math.Abs(dev) > chainTol {
				t.Errorf("%s n = %d, resonance %d: %.6f GHz, model %.6f GHz (%.3f bandwidths off)", mode, n, i+1, r.Frequency/1e9, want[i]/1e9, dev)
			}
		}
	}
}
