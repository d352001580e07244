package cavity

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"sync"
	"sync/atomic"

	"cylcav/physics"
)

// Distribution is the statistical model of a machining error.
type Distribution uint8

const (
	// Normal errors have standard deviation tolerance / Sigmas (the zero
	// value).
	Normal Distribution = iota
	// Uniform errors are spread evenly over -tolerance..+tolerance.
	Uniform
)

// String returns "normal" or "uniform".
func (d Distribution) String() string {
	switch d {
	case Normal:
		return "normal"
	case Uniform:
		return "uniform"
	}
	return fmt.Sprintf("Distribution(%d)", uint8(d))
}

// Tolerance describes a Monte Carlo machining-tolerance run. The zero
// value of each optional field is the documented default.
type Tolerance struct {
	// Diameter and Length are the machining tolerances +-t, m (>= 0).
	Diameter, Length float64
	// Distribution of each error; Diameter and Length errors are
	// independent.
	Distribution Distribution
	// Sigmas is k in tolerance = k sigma for Normal; zero means
	// DefaultSigmas (a tolerance read as a 3-sigma limit, common practice
	// in machining).
	Sigmas float64
	// Samples is the number of cavities drawn, 1..MaxSamples.
	Samples int
	// Seed selects the pseudo-random sequence. A run is reproducible for
	// a given seed whatever the number of workers.
	Seed uint64
	// CountDegenerate counts the exact companion in the clearance.
	CountDegenerate bool
	// Workers is the number of goroutines; zero means
	// runtime.GOMAXPROCS(0).
	Workers int
	// Progress, if not nil, is called with the number of samples done and
	// the total as chunks finish, from one goroutine at a time.
	Progress func(done, total int)
}

// Monte Carlo limits and defaults.
const (
	DefaultSigmas = 3
	MaxSamples    = 10_000_000
	// MonteCarloChunk is the number of samples drawn from one generator.
	// Chunk i uses a PCG generator (math/rand/v2) seeded with (Seed, i),
	// so the samples do not depend on which worker draws them.
	MonteCarloChunk = 4096
	// boxSigmas bounds the normal errors for which the clearance is
	// evaluated from a precomputed mode list; rarer draws (probability
	// about 1e-15 each) take the slow, always exact path.
	boxSigmas = 8
)

// Spread is the result of MonteCarlo.
type Spread struct {
	Samples int
	// Nominal is the wanted frequency of the nominal cavity, Hz.
	Nominal float64
	// Mean and Std are the sample mean and standard deviation (n - 1
	// denominator) of the wanted frequency, Hz; P01 and P99 its 1st and
	// 99th percentiles (linear interpolation between order statistics,
	// Hyndman & Fan 1996 definition 7); Min and Max its extremes.
	Mean, Std, P01, P99, Min, Max float64
	// LinearStd is the standard deviation predicted by linearising f:
	// sqrt((df/dD sigma_D)^2 + (df/dL sigma_L)^2), Hz.
	LinearStd float64
	// SigmaD and SigmaL are the standard deviations of the drawn errors,
	// m (tolerance/Sigmas for Normal, tolerance/sqrt 3 for Uniform).
	SigmaD, SigmaL float64
	// NominalClearance is the clearance of the nominal cavity and
	// WorstClearance the smallest over the samples, with WorstMode the
	// mode that sets it.
	NominalClearance, WorstClearance float64
	WorstMode                        Mode
}

// MonteCarlo draws tol.Samples cavities whose diameter and length deviate
// from c's by independent random machining errors and reports the spread
// of the wanted mode's frequency and the worst clearance met.
//
// The run is split into chunks of MonteCarloChunk samples, each with its
// own PCG generator seeded from (tol.Seed, chunk index), run in parallel
// on tol.Workers goroutines; chunk results are combined in chunk order
// (Chan, Golub & LeVeque 1979 pairwise update for the variance), so the
// result is bit-for-bit the same for any number of workers. The clearance
// of each sample is exact (the mode list is complete for the range of D/L
// the errors can reach).
//
// Errors: invalid cavity, mode or tolerance (negative, or so large that a
// dimension could reach zero), Samples outside 1..MaxSamples.
func (c Cavity) MonteCarlo(w Mode, tol Tolerance) (Spread, error) {
	if err := c.Validate(); err != nil {
		return Spread{}, err
	}
	if err := w.Validate(); err != nil {
		return Spread{}, err
	}
	if tol.Samples < 1 || tol.Samples > MaxSamples {
		return Spread{}, fmt.Errorf("cavity: Monte Carlo samples must be in 1..%d, got %d", MaxSamples, tol.Samples)
	}
	if tol.Sigmas == 0 {
		tol.Sigmas = DefaultSigmas
	}
	if !(tol.Sigmas >= 0.5 && tol.Sigmas <= 10) {
		return Spread{}, fmt.Errorf("cavity: tolerance sigmas must be in 0.5..10, got %g", tol.Sigmas)
	}
	var box float64 // half-width of the box in units of the tolerance
	var sd, sl float64
	switch tol.Distribution {
	case Normal:
		sd, sl = tol.Diameter/tol.Sigmas, tol.Length/tol.Sigmas
		box = boxSigmas / tol.Sigmas
	case Uniform:
		sd, sl = tol.Diameter/math.Sqrt(3), tol.Length/math.Sqrt(3)
		box = 1
	default:
		return Spread{}, fmt.Errorf("cavity: unknown tolerance distribution %d; use Normal or Uniform", tol.Distribution)
	}
	D0, L0 := c.Diameter(), c.Length
	for _, q := range []struct {
		name   string
		t, dim float64
	}{{"diameter", tol.Diameter, D0}, {"length", tol.Length, L0}} {
		if !(q.t >= 0) || math.IsInf(q.t, 0) {
			return Spread{}, fmt.Errorf("cavity: %s tolerance must be finite and >= 0 m, got %g m", q.name, q.t)
		}
		if q.t*box >= 0.5*q.dim {
			return Spread{}, fmt.Errorf("cavity: %s tolerance %g m is too large for a %s of %g m (must be below %g m)", q.name, q.t, q.name, q.dim, 0.5*q.dim/box)
		}
	}
	workers := tol.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	// The clearance envelope over the box of reachable D/L.
	bd, bl := tol.Diameter*box, tol.Length*box
	sBox := interval{sq((D0 - bd) / (L0 + bl)), sq((D0 + bd) / (L0 - bl))}
	wc := newChartMode(w)
	env, _, err := boundedEnvelope(wc, newPath(0, 0, 1, 1), sBox, tol.CountDegenerate)
	if err != nil {
		return Spread{}, err
	}
	nominalC, _ := env.at(sq(D0/L0), nil)
	sens, err := c.Sensitivity(w, Thermal{})
	if err != nil {
		return Spread{}, err
	}

	n := tol.Samples
	chunks := (n + MonteCarloChunk - 1) / MonteCarloChunk
	freqs := make([]float64, n)
	stats := make([]mcChunk, chunks)
	K := physics.SpeedOfLight / (2 * math.Pi * c.Fill.Index())
	var next atomic.Int64
	done := make(chan int, chunks)
	var wg sync.WaitGroup
	for range min(workers, chunks) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				ci := int(next.Add(1) - 1)
				if ci >= chunks {
					return
				}
				lo := ci * MonteCarloChunk
				hi := min(lo+MonteCarloChunk, n)
				stats[ci] = runChunk(freqs[lo:hi], tol, uint64(ci), sd, sl, D0, L0, K, wc, env, sBox)
				done <- hi - lo
			}
		}()
	}
	finished := 0
	for range chunks {
		finished += <-done
		if tol.Progress != nil {
			tol.Progress(finished, n)
		}
	}
	wg.Wait()

	out := Spread{
		Samples: n, Nominal: c.Frequency(w), SigmaD: sd, SigmaL: sl,
		LinearStd:        math.Hypot(sens.DfDD*sd, sens.DfDL*sl),
		NominalClearance: nominalC, WorstClearance: math.Inf(1),
		Min: math.Inf(1), Max: math.Inf(-1),
	}
	var total mcChunk
	for i := range stats {
		st := &stats[i]
		if st.err != nil {
			return Spread{}, st.err
		}
		total.merge(st)
		out.Min, out.Max = math.Min(out.Min, st.min), math.Max(out.Max, st.max)
		if st.worst < out.WorstClearance {
			out.WorstClearance, out.WorstMode = st.worst, st.worstMode
		}
	}
	out.Mean = total.mean
	if n > 1 {
		out.Std = math.Sqrt(total.m2 / float64(n-1))
	}
	out.P01 = percentile(freqs, 0.01)
	out.P99 = percentile(freqs, 0.99)
	return out, nil
}

func sq(x float64) float64 { return x * x }

// mcChunk is the summary of one chunk of samples.
type mcChunk struct {
	n         float64
	mean, m2  float64
	min, max  float64
	worst     float64
	worstMode Mode
	err       error
}

// merge adds b to a (Chan, Golub & LeVeque 1979, "Updating formulae and a
// pairwise algorithm for computing sample variances").
func (a *mcChunk) merge(b *mcChunk) {
	if b.n == 0 {
		return
	}
	n := a.n + b.n
	d := b.mean - a.mean
	a.mean += d * b.n / n
	a.m2 += b.m2 + d*d*a.n*b.n/n
	a.n = n
}

// runChunk draws one chunk into f and summarises it.
func runChunk(f []float64, tol Tolerance, ci uint64, sd, sl, D0, L0, K float64, w chartMode, env *envelope, box interval) mcChunk {
	rng := rand.New(rand.NewPCG(tol.Seed, ci))
	st := mcChunk{min: math.Inf(1), max: math.Inf(-1), worst: math.Inf(1)}
	for i := range f {
		var eD, eL float64
		if tol.Distribution == Uniform {
			eD = tol.Diameter * (2*rng.Float64() - 1)
			eL = tol.Length * (2*rng.Float64() - 1)
		} else {
			eD = sd * rng.NormFloat64()
			eL = sl * rng.NormFloat64()
		}
		D, L := D0+eD, L0+eL
		// f = c/(2 pi n) sqrt((2x/D)^2 + (p pi/L)^2), Pozar sec. 6.4.
		fi := K * math.Sqrt(w.gx/(D*D)+w.gp/(L*L))
		f[i] = fi
		// Welford's running mean and sum of squares (Welford 1962).
		st.n++
		d := fi - st.mean
		st.mean += d / st.n
		st.m2 += d * (fi - st.mean)
		st.min, st.max = math.Min(st.min, fi), math.Max(st.max, fi)
		s := sq(D / L)
		var v float64
		var m Mode
		if s >= box.lo && s <= box.hi {
			var k int
			v, k = env.nominalAt(s)
			if k >= 0 {
				m = env.modes[k].mode
			}
		} else {
			var err error
			if D <= 0 || L <= 0 {
				st.err = fmt.Errorf("cavity: a Monte Carlo sample reached a non-positive dimension (D = %g m, L = %g m)", D, L)
				return st
			}
			if v, m, err = clearanceAtRatio(w.mode, s, tol.CountDegenerate); err != nil {
				st.err = err
				return st
			}
		}
		if v < st.worst {
			st.worst, st.worstMode = v, m
		}
	}
	return st
}

// percentile returns the q-quantile of x by linear interpolation between
// order statistics (Hyndman & Fan 1996, definition 7). It reorders x.
func percentile(x []float64, q float64) float64 {
	h := q * float64(len(x)-1)
	lo := int(math.Floor(h))
	a := selectK(x, lo)
	if lo+1 >= len(x) {
		return a
	}
	// The next order statistic is the minimum of the upper part.
	b := math.Inf(1)
	for _, v := range x[lo+1:] {
		b = math.Min(b, v)
	}
	return a + (h-float64(lo))*(b-a)
}

// selectK reorders x so that x[k] is the k-th smallest value, every value
// before it is <= x[k] and every one after is >= x[k] (Hoare's quickselect
// with a median-of-three pivot; C. A. R. Hoare, "Algorithm 65: Find",
// Comm. ACM 4, 321, 1961), and returns x[k]. Expected time O(len(x)).
func selectK(x []float64, k int) float64 {
	lo, hi := 0, len(x)-1
	for lo < hi {
		mid := lo + (hi-lo)/2
		// median of three as pivot
		if x[mid] < x[lo] {
			x[mid], x[lo] = x[lo], x[mid]
		}
		if x[hi] < x[lo] {
			x[hi], x[lo] = x[lo], x[hi]
		}
		if x[hi] < x[mid] {
			x[hi], x[mid] = x[mid], x[hi]
		}
		pivot := x[mid]
		i, j := lo, hi
		for i <= j {
			for x[i] < pivot {
				i++
			}
			for x[j] > pivot {
				j--
			}
			if i <= j {
				x[i], x[j] = x[j], x[i]
				i++
				j--
			}
		}
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return x[k]
		}
	}
	return x[k]
}
