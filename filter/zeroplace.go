package filter

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/optimize"
)

// Transmission zeros chosen from the mask: instead of asking for zero
// positions, PlaceZeros searches, for N = 1, 2, ..., for the fewest
// resonators (and then the fewest zeros) whose generalised Chebyshev
// response meets every rejection region of the specification's mask.

// DefaultMaxPlacedZeros is the largest number of finite transmission zeros
// PlaceZeros tries when PlaceOptions.MaxZeros is 0. Each zero is one cross
// coupling of the folded network; more than six is rare in a cavity filter
// (common practice) and the search cost grows with every zero.
const DefaultMaxPlacedZeros = 6

// placeMarginTarget is the margin (dB) over every rejection region that a
// placement is optimised for before the search stops improving it: enough
// to survive rounding in the synthesis; the verdict itself is Design.Check.
const placeMarginTarget = 0.01

// Bounds of the search variable p of one zero, |Omega| = 1 + exp(p): from
// 1.005 (a zero closer to the band edge needs couplings of extreme
// precision and costs the return loss its accuracy) to 1 + e^6 = 404
// (beyond every band of interest of a filter under MaxModelFBW).
const (
	placePMin = -5.3
	placePMax = 6.0
)

// PlaceOptions bounds the search of PlaceZeros. The zero value of each
// field is its documented default.
type PlaceOptions struct {
	// MaxOrder is the largest order tried, 1..MaxOrder; 0 means MaxOrder.
	MaxOrder int
	// MaxZeros is the largest number of finite zeros tried, 0..N-2; 0
	// means DefaultMaxPlacedZeros. At most N-2 zeros are placed, so that
	// the folded network needs no coupling from a port to an inner
	// resonator.
	MaxZeros int
	// Q0 is the unloaded Q of every resonator for the acceptance check
	// (Design.Check with losses); 0 means lossless. The search itself
	// uses the lossless prototype, so with losses a candidate whose
	// margin the losses eat is rejected and the search goes on.
	Q0 float64
}

// Placement is the outcome of PlaceZeros.
type Placement struct {
	// Order is the number of resonators, Zeros the transmission zeros
	// (normalised Omega, ascending).
	Order int
	Zeros []float64
	// Margin is the least attenuation above the requirement over all the
	// rejection regions of the mask (lossless prototype), dB.
	Margin float64
	// Symmetric is true when the mask is symmetric in Omega and the search
	// was restricted to mirrored zero pairs.
	Symmetric bool
	// Design is the synthesised filter and Checks its pass/fail table
	// (Design.Check, lossless or with PlaceOptions.Q0); Overall(Checks)
	// is Met.
	Design *Design
	Checks []Check
	// Evaluations counts the evaluations of the margin over the mask
	// regions (one per region) of the whole search.
	Evaluations int
}

// PlaceZeros chooses the order and the transmission zeros of a generalised
// Chebyshev filter so that it meets the rejection regions of spec's mask
// with the fewest resonators: for N = 1, 2, ... and, at each N, for
// nz = 0, 1, ..., min(N-2, MaxZeros) zeros, and each split of the zeros
// between the two sides of the passband, the zero positions maximise the
// least margin min_g (A_g,min - A_g,req) over the regions g inside the model
// range (the least attenuation of a region located exactly as in
// Spec.MinOrder). The first (N, nz) whose best placement has a positive
// margin is synthesised, and accepted when Design.Check (the one verdict of
// the package, lossless response) says Met; else the search goes on.
//
// The maximisation is the Nelder-Mead simplex method of gonum's optimize
// package (J. A. Nelder, R. Mead, "A simplex method for function
// minimization", Comput. J. 7 (1965) 308-313) on the variables
// p_i = ln(|Omega_i| - 1), clamped to placePMin..placePMax, of a sampled
// margin (quickMargin); the least margin is not smooth, which a simplex
// method tolerates. The searches of the splits and starts of one (N, nz)
// run in parallel. Starting zeros
// sit at the inner edges of the regions of their side. When the mask is
// symmetric in Omega (each region above mirrored by one below with the same
// attenuation; an open region's outer end, the end of the band of interest,
// may differ) only mirrored pairs +-Omega_i are tried (derived: the margin
// of a mirrored mask is invariant under Omega -> -Omega of the zeros, and
// a mirrored placement halves the search).
//
// spec must be Chebyshev with no Order and no Zeros and at least one
// rejection inside the model range; its return loss (or ripple) is kept.
func PlaceZeros(spec Spec, opt PlaceOptions) (*Placement, error) {
	if spec.Family != Chebyshev {
		return nil, errors.New("filter: zero placement needs the Chebyshev family")
	}
	if spec.Order != 0 {
		return nil, fmt.Errorf("filter: zero placement chooses the order; got order %d", spec.Order)
	}
	if len(spec.Zeros) != 0 {
		return nil, fmt.Errorf("filter: zero placement chooses the zeros; got %d zeros", len(spec.Zeros))
	}
	maxN := opt.MaxOrder
	if maxN == 0 {
		maxN = MaxOrder
	}
	if maxN < 1 || maxN > MaxOrder {
		return nil, fmt.Errorf("filter: largest order of the zero placement must be 1..%d, got %d", MaxOrder, maxN)
	}
	maxZ := opt.MaxZeros
	if maxZ == 0 {
		maxZ = DefaultMaxPlacedZeros
	}
	if opt.Q0 < 0 || math.IsNaN(opt.Q0) {
		return nil, fmt.Errorf("filter: unloaded Q of the zero placement must be > 0 (0 for lossless), got %g", opt.Q0)
	}
	if maxZ < 0 || maxZ > MaxOrder-2 {
		return nil, fmt.Errorf("filter: largest number of placed zeros must be 0..%d, got %d", MaxOrder-2, maxZ)
	}
	ns, err := spec.normalized()
	if err != nil {
		return nil, err
	}
	var regions []MaskRegion
	for _, g := range ns.mask().Regions {
		if !g.OutsideModel {
			regions = append(regions, g)
		}
	}
	if len(regions) == 0 {
		return nil, errors.New("filter: zero placement needs at least one rejection inside the band of interest")
	}
	pl := &placer{spec: ns, regions: regions}
	sym := pl.symmetric()
	for n := 1; n <= maxN; n++ {
		for nz := 0; nz <= min(n-2, maxZ) || nz == 0; nz++ {
			if sym && nz%2 == 1 {
				continue
			}
			zeros, margin := pl.best(n, nz, sym)
			if !(margin > 0) {
				continue
			}
			s := spec
			s.Order, s.Zeros = n, zeros
			d, err := Synthesize(s)
			if err != nil {
				continue
			}
			var q0 []float64
			if opt.Q0 > 0 {
				q0 = make([]float64, n)
				for i := range q0 {
					q0[i] = opt.Q0
				}
			}
			checks, err := d.Check(q0, nil)
			if err != nil {
				return nil, err
			}
			if Overall(checks) != Met {
				continue
			}
			return &Placement{Order: n, Zeros: zeros, Margin: margin, Symmetric: sym, Design: d, Checks: checks, Evaluations: int(pl.evals.Load())}, nil
		}
	}
	return nil, fmt.Errorf("filter: no placement of up to %d transmission zeros meets the rejections with at most %d resonators", maxZ, maxN)
}

// placer holds the state of one PlaceZeros search.
type placer struct {
	spec    Spec // normalised, Order and Zeros unset
	regions []MaskRegion
	evals   atomic.Int64
}

// omegaRange returns the region's bounds in normalised Omega, inner edge
// first.
func (pl *placer) omegaRange(g MaskRegion) (inner, outer float64) {
	lo, hi := LowpassOmega(g.Low, pl.spec.F0, pl.spec.BW), LowpassOmega(g.High, pl.spec.F0, pl.spec.BW)
	if g.Above {
		return lo, hi
	}
	return hi, lo
}

// symmetric reports whether every region has a mirror image in Omega on the
// other side of the passband with the same attenuation (relative 1e-9 on
// the inner edge, the bounded outer edge and the level).
func (pl *placer) symmetric() bool {
	near := func(a, b float64) bool { return math.Abs(a-b) <= 1e-9*math.Max(math.Abs(a), math.Abs(b)) }
	used := make([]bool, len(pl.regions))
	for i, g := range pl.regions {
		if used[i] {
			continue
		}
		gi, go_ := pl.omegaRange(g)
		found := false
		for j := i + 1; j < len(pl.regions); j++ {
			h := pl.regions[j]
			if used[j] || h.Above == g.Above || h.Bounded != g.Bounded || !near(h.Attenuation, g.Attenuation) {
				continue
			}
			hi, ho := pl.omegaRange(h)
			if near(hi, -gi) && (!g.Bounded || near(ho, -go_)) {
				used[i], used[j], found = true, true, true
				break
			}
		}
		if !found {
			return false
		}
	}
	return true
}

// margin returns the least margin (dB) of order n with the given zeros over
// the regions: min_g (least attenuation on g - required).
func (pl *placer) margin(n int, zeros []float64) float64 {
	s := pl.spec
	s.Zeros = zeros
	m := math.Inf(1)
	for _, g := range pl.regions {
		a, err := s.regionMinimum(n, g)
		pl.evals.Add(1)
		if err != nil || math.IsNaN(a) {
			return math.Inf(-1)
		}
		m = math.Min(m, a-g.Attenuation)
	}
	return m
}

// quickMargin is margin for the search: the least attenuation of each
// region from quickSamples samples per segment between the zeros (spaced
// uniformly in ln|Omega| as in bandMinimum), each local minimum refined by
// quickGolden golden-section steps (the bracket shrinks to 1e-6 of its
// width), with the attenuation evaluated without argument checks. The
// placement found is then judged by margin (exact minima) and
// Design.Check.
func (pl *placer) quickMargin(n int, zeros []float64) float64 {
	s := pl.spec
	att := func(w float64) float64 { return chebAttP(n, s.Ripple, zeros, nil, w) }
	m := math.Inf(1)
	for _, g := range pl.regions {
		pl.evals.Add(1)
		a, b := LowpassOmega(g.Low, s.F0, s.BW), LowpassOmega(g.High, s.F0, s.BW)
		nodes := []float64{a, b}
		for _, z := range zeros {
			if z > a && z < b {
				nodes = append(nodes, z)
			}
		}
		slices.Sort(nodes)
		best := math.Inf(1)
		for k := 0; k+1 < len(nodes); k++ {
			u, v := nodes[k], nodes[k+1]
			lu, lv := math.Log(math.Abs(u)), math.Log(math.Abs(v))
			sign := math.Copysign(1, u+v)
			xs := make([]float64, quickSamples)
			ys := make([]float64, quickSamples)
			for i := range xs {
				xs[i] = sign * math.Exp(lu+(lv-lu)*float64(i)/float64(quickSamples-1))
				ys[i] = att(xs[i])
				best = math.Min(best, ys[i])
			}
			for i := 1; i+1 < quickSamples; i++ {
				if ys[i] <= ys[i-1] && ys[i] <= ys[i+1] {
					best = math.Min(best, goldenSteps(att, xs[i-1], xs[i+1], quickGolden))
				}
			}
		}
		m = math.Min(m, best-g.Attenuation)
	}
	return m
}

// quickSamples and quickGolden set the resolution of quickMargin.
const (
	quickSamples = 48
	quickGolden  = 30
)

// goldenSteps is goldenMin with a fixed number of steps; it returns the
// least value seen.
func goldenSteps(f func(float64) float64, a, b float64, steps int) float64 {
	const r = 0.6180339887498949
	c, d := b-r*(b-a), a+r*(b-a)
	fc, fd := f(c), f(d)
	for i := 0; i < steps; i++ {
		if fc <= fd {
			b, d, fd = d, c, fc
			c = b - r*(b-a)
			fc = f(c)
		} else {
			a, c, fc = c, d, fd
			d = a + r*(b-a)
			fd = f(d)
		}
	}
	return math.Min(fc, fd)
}

// zerosOf maps search variables to zeros: with sym, p holds one variable
// per mirrored pair; else the first `above` variables are zeros above the
// passband, the rest below. The result is ascending.
func zerosOf(p []float64, above int, sym bool) []float64 {
	mag := func(x float64) float64 { return 1 + math.Exp(math.Max(placePMin, math.Min(placePMax, x))) }
	var z []float64
	for i, x := range p {
		w := mag(x)
		switch {
		case sym:
			z = append(z, w, -w)
		case i < above:
			z = append(z, w)
		default:
			z = append(z, -w)
		}
	}
	slices.Sort(z)
	return z
}

// best returns the best zeros found for order n with nz zeros and their
// margin.
func (pl *placer) best(n, nz int, sym bool) ([]float64, float64) {
	if nz == 0 {
		return nil, pl.margin(n, nil)
	}
	bestM := math.Inf(-1)
	var bestZ []float64
	splits := []int{nz / 2}
	if !sym {
		splits = splits[:0]
		for k := 0; k <= nz; k++ {
			splits = append(splits, k)
		}
	}
	// Every split and start is an independent simplex search; they run in
	// parallel (one per CPU) and the best is picked in a fixed order, so
	// the result does not depend on the scheduling.
	dim := nz
	if sym {
		dim = nz / 2
	}
	type task struct {
		above int
		x0    []float64
		m     float64
		z     []float64
	}
	var tasks []*task
	for _, above := range splits {
		for _, x0 := range pl.starts(dim, above, sym) {
			tasks = append(tasks, &task{above: above, x0: x0, m: math.Inf(-1)})
		}
	}
	sem := make(chan struct{}, max(1, runtime.GOMAXPROCS(0)))
	var wg sync.WaitGroup
	for _, tk := range tasks {
		wg.Add(1)
		sem <- struct{}{}
		go func() {
			defer wg.Done()
			defer func() { <-sem }()
			f := func(p []float64) float64 { return -pl.quickMargin(n, zerosOf(p, tk.above, sym)) }
			res, err := optimize.Minimize(optimize.Problem{Func: f}, tk.x0, &optimize.Settings{
				FuncEvaluations: 150 * (dim + 1),
				Converger:       &optimize.FunctionConverge{Absolute: 1e-4, Relative: 1e-6, Iterations: 40},
			}, &optimize.NelderMead{SimplexSize: 0.5})
			if res == nil || err != nil && res.X == nil {
				return
			}
			tk.z = zerosOf(res.X, tk.above, sym)
			tk.m = pl.margin(n, tk.z)
		}()
	}
	wg.Wait()
	for _, tk := range tasks {
		if tk.m > bestM {
			bestM, bestZ = tk.m, tk.z
		}
	}
	return bestZ, bestM
}

// starts returns the starting points of the simplex search: the zeros of
// each side spread from the inner edge of the nearest region of that side
// outwards (to 1.5 times its distance from the band edge), or at
// |Omega| = 2 where no region lies on that side; a second start spreads
// them over the whole first region.
func (pl *placer) starts(dim, above int, sym bool) [][]float64 {
	edge := func(up bool) (inner, outer float64) {
		inner, outer = math.Inf(1), 0
		for _, g := range pl.regions {
			if g.Above != up {
				continue
			}
			a, b := pl.omegaRange(g)
			if math.Abs(a) < inner {
				inner, outer = math.Abs(a), math.Abs(b)
			}
		}
		if math.IsInf(inner, 1) {
			return 2, 3
		}
		return inner, outer
	}
	var out [][]float64
	for _, spread := range []float64{0.5, 1} {
		x := make([]float64, dim)
		side := func(up bool, idx []int) {
			in, ou := edge(up)
			lo := math.Log(in - 1)
			hi := math.Log(in - 1 + spread*(ou-in))
			for k, i := range idx {
				t := (float64(k) + 0.5) / float64(len(idx))
				x[i] = lo + t*(hi-lo)
			}
		}
		var up, dn []int
		for i := 0; i < dim; i++ {
			if sym || i < above {
				up = append(up, i)
			} else {
				dn = append(dn, i)
			}
		}
		side(true, up)
		side(false, dn)
		out = append(out, x)
	}
	return out
}
