package cavity

import (
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"testing"
)

// TestMonteCarloLinearSpread: for small tolerances the frequency is linear
// in the errors, so the sample standard deviation must match the
// linearised one. With n samples the relative standard error of a sample
// standard deviation is about 1/sqrt(2n) (normal data); mcStdTol allows
// six of those.
func TestMonteCarloLinearSpread(t *testing.T) {
	const n = 20000
	mcStdTol := 6 / math.Sqrt(2*n)
	c := Cavity{Radius: 0.021, Length: 0.0303}
	w := mustMode(t, "TE011")
	for _, dist := range []Distribution{Normal, Uniform} {
		sp, err := c.MonteCarlo(w, Tolerance{Diameter: 1e-6, Length: 2e-6, Distribution: dist, Samples: n, Seed: 7})
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(sp.Std/sp.LinearStd-1) > mcStdTol {
			t.Errorf("MonteCarlo(%v) std = %.6g Hz, want %.6g Hz (linearised)", dist, sp.Std, sp.LinearStd)
		}
		if math.Abs(sp.Mean-sp.Nominal) > 6*sp.LinearStd/math.Sqrt(n) {
			t.Errorf("MonteCarlo(%v) mean = %.12g Hz, want %.12g Hz within 6 standard errors", dist, sp.Mean, sp.Nominal)
		}
		if dist == Normal {
			// 1st and 99th percentiles of a normal: mean -+ 2.326348 sigma
			// (standard normal quantile, recalled from memory).
			for _, q := range []struct{ got, want float64 }{
				{sp.P01, sp.Nominal - 2.326348*sp.LinearStd}, {sp.P99, sp.Nominal + 2.326348*sp.LinearStd},
			} {
				if math.Abs(q.got-q.want) > 0.1*sp.LinearStd {
					t.Errorf("MonteCarlo(normal) percentile = %.12g Hz, want %.12g Hz", q.got, q.want)
				}
			}
		}
		// Micrometre errors move D/L by about 1e-4 relative, and the
		// clearance by less than that times the chart slopes (< 10).
		const umClearanceShift = 1e-3
		if math.Abs(sp.WorstClearance-sp.NominalClearance) > umClearanceShift {
			t.Errorf("MonteCarlo(%v) worst clearance = %g, want near the nominal %g for um tolerances", dist, sp.WorstClearance, sp.NominalClearance)
		}
	}
}

// samplingGap is how far above the exact worst clearance of a range a
// sampled minimum may stay: the samples (or grid points) nearest the worst
// end of the range miss it by a step whose clearance change is below
// 2e-4 for the ranges used here.
const samplingGap = 2e-4

// TestMonteCarloWorstClearance checks the worst sampled clearance against
// a direct evaluation at the sampled extremes: with a uniform diameter
// tolerance only, D/L spans a known interval, and the worst clearance over
// the samples cannot be below the exact worst over that interval.
func TestMonteCarloWorstClearance(t *testing.T) {
	c := Cavity{Radius: 0.021, Length: 0.0303}
	w := mustMode(t, "TE011")
	tol := 0.5e-3
	sp, err := c.MonteCarlo(w, Tolerance{Diameter: tol, Distribution: Uniform, Samples: 5000, Seed: 3})
	if err != nil {
		t.Fatal(err)
	}
	lo := bruteClearance(t, w, (c.Diameter()-tol)/c.Length)
	hi := bruteClearance(t, w, (c.Diameter()+tol)/c.Length)
	exact := math.Min(lo, hi) // no crossing in between at this size
	if sp.WorstClearance < exact-routeTol || sp.WorstClearance > exact+samplingGap {
		t.Errorf("MonteCarlo worst clearance = %.9g, want just above %.9g", sp.WorstClearance, exact)
	}
}

// TestMonteCarloReproducible: one seed gives bit-identical results for any
// number of workers and any GOMAXPROCS.
func TestMonteCarloReproducible(t *testing.T) {
	c := Cavity{Radius: 0.021, Length: 0.0303}
	w := mustMode(t, "TE011")
	tol := Tolerance{Diameter: 20e-6, Length: 20e-6, Samples: 3*MonteCarloChunk + 123, Seed: 42}
	run := func(procs, workers int) Spread {
		old := runtime.GOMAXPROCS(procs)
		defer runtime.GOMAXPROCS(old)
		tt := tol
		tt.Workers = workers
		sp, err := c.MonteCarlo(w, tt)
		if err != nil {
			t.Fatal(err)
		}
		return sp
	}
	ref := run(1, 0)
	for _, pw := range [][2]int{{2, 0}, {2, 3}, {1, 5}} {
		if got := run(pw[0], pw[1]); got != ref {
			t.Errorf("MonteCarlo(GOMAXPROCS %d, workers %d) = %+v, want %+v", pw[0], pw[1], got, ref)
		}
	}
	tol.Seed = 43
	if other, _ := c.MonteCarlo(w, tol); other.Mean == ref.Mean {
		t.Errorf("MonteCarlo with another seed gave the same mean %.15g", ref.Mean)
	}
	var calls, last int
	tol.Progress = func(done, total int) {
		calls++
		if done < last || total != tol.Samples {
			t.Errorf("progress(%d, %d) after %d, want increasing done and total %d", done, total, last, tol.Samples)
		}
		last = done
	}
	if _, err := c.MonteCarlo(w, tol); err != nil {
		t.Fatal(err)
	}
	if calls != 4 || last != tol.Samples {
		t.Errorf("progress called %d times ending at %d, want 4 calls ending at %d", calls, last, tol.Samples)
	}
}

// TestSelectK compares quickselect and the percentile with sorting on
// seeded random data with ties.
func TestSelectK(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{1, 2, 3, 10, 101, 1000} {
		x := make([]float64, n)
		for i := range x {
			x[i] = float64(rng.IntN(n/2 + 1))
		}
		sorted := slices.Clone(x)
		slices.Sort(sorted)
		for _, k := range []int{0, n / 3, n / 2, n - 1} {
			y := slices.Clone(x)
			if got := selectK(y, k); got != sorted[k] {
				t.Errorf("selectK(n=%d, k=%d) = %g, want %g", n, k, got, sorted[k])
			}
		}
		for _, q := range []float64{0.01, 0.5, 0.99} {
			h := q * float64(n-1)
			lo := int(math.Floor(h))
			want := sorted[lo]
			if lo+1 < n {
				want += (h - float64(lo)) * (sorted[lo+1] - sorted[lo])
			}
			if got := percentile(slices.Clone(x), q); math.Abs(got-want) > routeTol*math.Abs(want) {
				t.Errorf("percentile(n=%d, %g) = %g, want %g", n, q, got, want)
			}
		}
	}
}

func TestMonteCarloValidation(t *testing.T) {
	c := Cavity{Radius: 0.021, Length: 0.0303}
	w := mustMode(t, "TE011")
	for _, tol := range []Tolerance{
		{Diameter: 1e-5},
		{Diameter: -1e-5, Samples: 10},
		{Diameter: 0.01, Samples: 10},
		{Samples: MaxSamples + 1},
		{Samples: 10, Sigmas: 100},
		{Samples: 10, Distribution: 9},
	} {
		if _, err := c.MonteCarlo(w, tol); err == nil {
			t.Errorf("MonteCarlo(%+v) error = nil, want an input error", tol)
		}
	}
}

func BenchmarkMonteCarlo1e6(b *testing.B) {
	c := Cavity{Radius: 0.021, Length: 0.0303}
	w := Mode{TE, 0, 1, 1}
	tol := Tolerance{Diameter: 20e-6, Length: 20e-6, Samples: 1_000_000, Seed: 1}
	for b.Loop() {
		if _, err := c.MonteCarlo(w, tol); err != nil {
			b.Fatal(err)
		}
	}
}
