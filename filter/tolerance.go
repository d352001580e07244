package filter

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"sync"

	"gonum.org/v1/gonum/mat"

	"cylcav/cavity"
)

// Tolerance and yield of a realised filter: machining errors of every
// cavity (diameter, length) and coupling (hole radius, or a stated relative
// error) mapped through first-order sensitivities onto the coupling matrix,
// a seeded parallel Monte Carlo of the response and of the one
// specification verdict (Design.Check, Overall), the linearised spread for
// comparison, and the tuning each resonator's screw must cover.

// Machining is the machining tolerance of a filter: each value is the
// half-width +-t of the drawing tolerance, which the Monte Carlo takes as
// three standard deviations of a normal distribution (common practice: a
// capable machining process holds a drawing tolerance at +-3 sigma).
type Machining struct {
	// Diameter and Length are the tolerances of every cavity's D and L, m.
	Diameter, Length float64
	// Hole is the tolerance of every sized coupling hole's radius, m; it
	// is used for the main-line couplings that Realise sized as holes.
	Hole float64
	// Coupling is the relative tolerance of every other coupling (a
	// fraction: 0.02 = +-2 %): main-line couplings that were not sized as
	// holes, cross couplings and the two port couplings M_S1, M_NL. It is
	// a stated sensitivity, not derived from a geometry.
	Coupling float64
}

// Validate reports whether every tolerance is finite and >= 0, and one of
// them > 0.
func (t Machining) Validate() error {
	for _, v := range []struct {
		name string
		x    float64
	}{{"diameter", t.Diameter}, {"length", t.Length}, {"hole radius", t.Hole}, {"relative coupling", t.Coupling}} {
		if !(v.x >= 0) || math.IsInf(v.x, 0) {
			return fmt.Errorf("filter: %s tolerance must be finite and >= 0, got %g", v.name, v.x)
		}
	}
	if t.Coupling >= 1 {
		return fmt.Errorf("filter: relative coupling tolerance must be below 1 (100 %%), got %g", t.Coupling)
	}
	if t.Diameter == 0 && t.Length == 0 && t.Hole == 0 && t.Coupling == 0 {
		return errors.New("filter: every tolerance is zero; give at least one")
	}
	return nil
}

// ErrorSource is one source of machining error and its effect on the
// coupling matrix: dM/dx for the entries it moves (first order).
type ErrorSource struct {
	// Name says what is machined, e.g. "D3" (diameter of cavity 3), "L3",
	// "hole 2-3", "k 2-3" (a coupling with a relative tolerance),
	// "port in".
	Name string
	// Sigma is the standard deviation of the error, in the unit of x (m
	// for a dimension, 1 for a relative coupling error): the tolerance / cavity.DefaultSigmas (3).
	Sigma float64
	// Entries are the matrix entries (i, j) (i <= j) that x moves, with
	// DM the derivative dM_ij/dx.
	Entries []Entry
	// DfDx is, for a cavity dimension, d f_i / dx in Hz/m (the resonator's
	// own frequency; zero for couplings).
	DfDx float64
	// Resonator is the resonator (1..N) whose frequency x moves, 0 for a
	// coupling.
	Resonator int
}

// Entry is one coupling-matrix entry and a derivative.
type Entry struct {
	I, J int
	DM   float64
}

// Sensitivities returns the sources of machining error of realisation r of
// design d under tolerance t, each with its first-order effect on the
// folded coupling matrix:
//
//   - cavity i diameter and length: df_i/dD and df_i/dL from
//     cavity.Cavity.ErrorSource (derived there from f(D, L)), and
//     dM_ii = -(dOmega/df) df with dOmega/df = (1 + f0^2/f_i^2)/bw, since
//     resonator i resonates at Omega_i = -M_ii (see Realise; derived);
//   - a sized hole between i and i+1: dk/dr0 by a central difference of
//     CouplingThrough (Bethe's theory with the thickness correction, the
//     model that sized it) over +-1e-4 r0, and dM = dk/dr0 / FBW;
//   - every other coupling (main line not sized, cross, ports): a relative
//     error e with dM_ij/de = M_ij (the stated Machining.Coupling).
//
// A coupling's dependence on the cavity dimensions (second order beside its
// own hole or setting) is left out.
func Sensitivities(d *Design, r *Realisation, t Machining) ([]ErrorSource, error) {
	if d == nil || d.Folded == nil || r == nil || len(r.Cavities) != d.Spec.Order {
		return nil, errors.New("filter: tolerance analysis needs a synthesised design and its realisation")
	}
	if err := t.Validate(); err != nil {
		return nil, err
	}
	n := d.Spec.Order
	f0, bw := d.Spec.F0, d.Spec.BW
	var out []ErrorSource
	for _, c := range r.Cavities {
		s, err := c.Cavity.Sensitivity(r.Mode, cavity.Thermal{})
		if err != nil {
			return nil, fmt.Errorf("filter: sensitivity of cavity %d: %w", c.Resonator, err)
		}
		dwdf := (1 + (f0/c.F)*(f0/c.F)) / bw
		i := c.Resonator
		if t.Diameter > 0 {
			out = append(out, ErrorSource{Name: fmt.Sprintf("D%d", i), Sigma: t.Diameter / cavity.DefaultSigmas, Resonator: i, DfDx: s.DfDD,
				Entries: []Entry{{i, i, -dwdf * s.DfDD}}})
		}
		if t.Length > 0 {
			out = append(out, ErrorSource{Name: fmt.Sprintf("L%d", i), Sigma: t.Length / cavity.DefaultSigmas, Resonator: i, DfDx: s.DfDL,
				Entries: []Entry{{i, i, -dwdf * s.DfDL}}})
		}
	}
	sized := map[int]Aperture{}
	for _, a := range r.Apertures {
		if a.Sized {
			sized[a.From] = a
		}
	}
	for i := 0; i <= n; i++ {
		for j := i + 1; j <= n+1; j++ {
			m := d.Folded.At(i, j)
			if math.Abs(m) <= crossCouplingTol {
				continue
			}
			if a, ok := sized[i]; ok && j == i+1 && i >= 1 {
				if t.Hole == 0 {
					continue
				}
				h := a.Hole
				dr := 1e-4 * h.Radius
				c1, c2 := r.Cavities[i-1].Cavity, r.Cavities[i].Cavity
				h.Radius = a.Radius + dr
				hp, err := CouplingThrough(c1, c2, r.Mode, h)
				if err != nil {
					return nil, err
				}
				h.Radius = a.Radius - dr
				hm, err := CouplingThrough(c1, c2, r.Mode, h)
				if err != nil {
					return nil, err
				}
				dk := (math.Abs(hp.K) - math.Abs(hm.K)) / (2 * dr) // central difference, O(dr^2)
				out = append(out, ErrorSource{Name: fmt.Sprintf("hole %d-%d", i, j), Sigma: t.Hole / cavity.DefaultSigmas,
					Entries: []Entry{{i, j, math.Copysign(dk/d.FBW, m)}}})
				continue
			}
			if t.Coupling == 0 {
				continue
			}
			name := fmt.Sprintf("k %d-%d", i, j)
			switch {
			case i == 0 && j == n+1:
				name = "k S-L"
			case i == 0:
				name = "port in"
			case j == n+1:
				name = "port out"
			}
			out = append(out, ErrorSource{Name: name, Sigma: t.Coupling / cavity.DefaultSigmas, Entries: []Entry{{i, j, m}}})
		}
	}
	return out, nil
}

// perturbed returns the folded matrix moved by sum_k x_k dM_k.
func perturbed(base []float64, n int, sens []ErrorSource, x []float64, dst []float64) {
	copy(dst, base)
	for k, s := range sens {
		for _, e := range s.Entries {
			v := e.DM * x[k]
			dst[e.I*n+e.J] += v
			if e.I != e.J {
				dst[e.J*n+e.I] += v
			}
		}
	}
}

// YieldOptions selects a Monte Carlo run.
type YieldOptions struct {
	Machining Machining
	// Samples is the number of filters drawn (>= 2).
	Samples int
	// Seed seeds the generator: sample k draws from PCG(Seed, k), so the
	// result does not depend on Workers.
	Seed uint64
	// Workers is the number of goroutines; zero means GOMAXPROCS.
	Workers int
	// Freqs are the frequencies (Hz) at which the spread of the response
	// is gathered (the mask points, or a sweep).
	Freqs []float64
	// Verdict runs the specification check (Design.Check) on every sample
	// for the yield and the spread of each check line; without it only the
	// response at Freqs and the tuning are gathered.
	Verdict bool
	// ReturnLoss is the passband return loss (dB) the built filter must
	// meet, at most the design's; zero means the design's own. A design
	// meets its return loss exactly at the ripple peaks, so any machining
	// error fails it: a mask for production states a lower level than the
	// design's (the design's margin).
	ReturnLoss float64
	// Spurious are the cavities' other resonances for Design.Check (nil
	// for none), as Realisation.Spurious.
	Spurious []Spurious
	// Progress, if not nil, is called with the samples done so far (from
	// one goroutine at a time).
	Progress func(done, total int)
}

// MaxSamples bounds YieldOptions.Samples.
const MaxSamples = 1000000

// Scatter is the distribution of one quantity over the samples.
type Scatter struct {
	Nominal   float64 // the value of the design as drawn
	Mean, Std float64 // over the samples
	Min, Max  float64
	// Linear is the linearised standard deviation
	// sqrt(sum_k (dy/dx_k)^2 sigma_k^2) (central differences on the
	// matrix; NaN where it was not computed).
	Linear float64
}

// PointSpread is the spread of the response at one frequency.
type PointSpread struct {
	F            float64 // Hz
	S11DB, S21DB Scatter // dB
}

// LineSpread is the spread of one line of Design.Check over the samples.
type LineSpread struct {
	Check // the line of the nominal design
	// Scatter of Achieved over the samples whose line was evaluated.
	Scatter Scatter
	// Met is the fraction of samples that met this line.
	Met float64
	// P05, P50 and P95 are percentiles of Achieved.
	P05, P50, P95 float64
}

// TuningNeed is the frequency range one resonator's tuning must cover to
// bring every sample back to its design frequency.
type TuningNeed struct {
	Resonator int
	// Low and High are the least and greatest frequency error of the
	// resonator over the samples, Hz (machined minus design); the tuning
	// must move it by -High..-Low.
	Low, High float64
	// Span is High - Low, Hz.
	Span float64
}

// YieldResult is the outcome of a Monte Carlo run.
type YieldResult struct {
	Samples int
	Seed    uint64
	// Machining is the tolerance drawn; ReturnLoss the production return
	// loss judged (dB; zero: the design's).
	Machining  Machining
	ReturnLoss float64
	// Sources are the error sources with their sensitivities.
	Sources []ErrorSource
	// Yield is the fraction of samples whose whole check (Overall) is Met,
	// YieldStd its binomial standard error sqrt(p (1 - p)/n); Outside the
	// fraction that is OutsideModel. NaN without YieldOptions.Verdict.
	Yield, YieldStd, Outside float64
	// Lines holds one spread per line of the nominal Check (empty without
	// Verdict).
	Lines []LineSpread
	// Points holds the response spread at YieldOptions.Freqs.
	Points []PointSpread
	// Tuning holds one entry per resonator.
	Tuning []TuningNeed
}

// welford accumulates mean and variance (Welford's algorithm, Knuth TAOCP
// vol. 2, sec. 4.2.2) and the extremes.
type welford struct {
	n           float64
	mean, m2    float64
	min, max    float64
	initialised bool
}

func (w *welford) add(x float64) {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return
	}
	if !w.initialised {
		w.min, w.max, w.initialised = x, x, true
	}
	w.n++
	d := x - w.mean
	w.mean += d / w.n
	w.m2 += d * (x - w.mean)
	w.min = math.Min(w.min, x)
	w.max = math.Max(w.max, x)
}

// merge adds the accumulator o (Chan, Golub & LeVeque's pairwise update,
// "Algorithms for computing the sample variance", Amer. Statist. 37 (1983)
// 242-247).
func (w *welford) merge(o welford) {
	if o.n == 0 {
		return
	}
	if w.n == 0 {
		*w = o
		return
	}
	n := w.n + o.n
	d := o.mean - w.mean
	w.mean += d * o.n / n
	w.m2 += o.m2 + d*d*w.n*o.n/n
	w.n = n
	w.min = math.Min(w.min, o.min)
	w.max = math.Max(w.max, o.max)
}

func (w welford) spread(nominal, linear float64) Scatter {
	s := Scatter{Nominal: nominal, Mean: math.NaN(), Std: math.NaN(), Min: math.NaN(), Max: math.NaN(), Linear: linear}
	if w.n > 0 {
		s.Mean, s.Min, s.Max = w.mean, w.min, w.max
	}
	if w.n > 1 {
		s.Std = math.Sqrt(w.m2 / (w.n - 1))
	}
	return s
}

// Yield runs the Monte Carlo of realisation r of design d: each sample
// draws every error source of Sensitivities as a normal variable of
// standard deviation tolerance/3 (cavity.DefaultSigmas), moves the folded matrix by the
// first-order sensitivities, and evaluates the response with the
// realisation's Q0 at opts.Freqs and, with opts.Verdict, the
// specification check Design.Check and its Overall verdict (the one
// verdict of the package; a sample passes when it is Met). Samples are
// spread over opts.Workers goroutines; sample k uses its own generator
// PCG(Seed, k), so the samples are the same for any number of workers
// (sums over them may differ in the last digits; percentiles do not).
//
// The linearised spread of the response at opts.Freqs comes from central
// differences of the response with respect to each source (step sigma/10)
// and is reported beside the Monte Carlo spread; for small tolerances the
// two agree within sampling error (TestYieldLinearAgrees).
//
// The yield is that of the filter as machined, before tuning; TuningNeed
// gives the frequency range a tuning element must cover.
func Yield(d *Design, r *Realisation, opts YieldOptions) (*YieldResult, error) {
	sens, err := Sensitivities(d, r, opts.Machining)
	if err != nil {
		return nil, err
	}
	if opts.Samples < 2 || opts.Samples > MaxSamples {
		return nil, fmt.Errorf("filter: samples must be 2..%d, got %d", MaxSamples, opts.Samples)
	}
	for i, f := range opts.Freqs {
		if !(f > 0) || math.IsInf(f, 0) {
			return nil, fmt.Errorf("filter: frequency %d must be > 0 Hz and finite, got %g Hz", i+1, f)
		}
	}
	workers := opts.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = min(workers, opts.Samples)
	n := d.Spec.Order
	nn := n + 2
	q0 := r.Q0()
	loss, err := lossTerms(n, d.Spec.F0, d.Spec.BW, q0)
	if err != nil {
		return nil, err
	}
	base := make([]float64, nn*nn)
	for i := 0; i < nn; i++ {
		for j := 0; j < nn; j++ {
			base[i*nn+j] = d.Folded.At(i, j)
		}
	}
	omegas := make([]float64, len(opts.Freqs))
	for i, f := range opts.Freqs {
		omegas[i] = LowpassOmega(f, d.Spec.F0, d.Spec.BW)
	}
	res := &YieldResult{Samples: opts.Samples, Seed: opts.Seed, Machining: opts.Machining, ReturnLoss: opts.ReturnLoss, Sources: sens,
		Yield: math.NaN(), YieldStd: math.NaN(), Outside: math.NaN()}

	// Nominal response and check.
	nomEv := newEvaluator(d.Folded, loss)
	nom11 := make([]float64, len(omegas))
	nom21 := make([]float64, len(omegas))
	for i, w := range omegas {
		s11, s21, _, _ := nomEv.at(w)
		nom11[i], nom21[i] = db(s11), db(s21)
	}
	var nomChecks []Check
	md, err := productionDesign(d, opts.ReturnLoss)
	if err != nil {
		return nil, err
	}
	if opts.Verdict {
		if nomChecks, err = md.Check(q0, opts.Spurious); err != nil {
			return nil, err
		}
	}

	// Linearised spread.
	lin11 := make([]float64, len(omegas))
	lin21 := make([]float64, len(omegas))
	{
		x := make([]float64, len(sens))
		mp := make([]float64, nn*nn)
		mm := make([]float64, nn*nn)
		for k, s := range sens {
			h := s.Sigma / 10
			x[k] = h
			perturbed(base, nn, sens, x, mp)
			x[k] = -h
			perturbed(base, nn, sens, x, mm)
			x[k] = 0
			ep := newEvaluator(mat.NewDense(nn, nn, mp), loss)
			em := newEvaluator(mat.NewDense(nn, nn, mm), loss)
			for i, w := range omegas {
				p11, p21, _, _ := ep.at(w)
				m11, m21, _, _ := em.at(w)
				g11 := (db(p11) - db(m11)) / (2 * h) * s.Sigma
				g21 := (db(p21) - db(m21)) / (2 * h) * s.Sigma
				lin11[i] += g11 * g11
				lin21[i] += g21 * g21
			}
		}
		for i := range lin11 {
			lin11[i], lin21[i] = math.Sqrt(lin11[i]), math.Sqrt(lin21[i])
		}
	}

	type acc struct {
		s11, s21 []welford
		lines    []welford
		achieved [][]float64 // per line, per sample of this worker
		met      []int
		pass     int
		outside  int
		flo, fhi []float64
		err      error
	}
	accs := make([]acc, workers)
	var mu sync.Mutex
	done := 0
	var wg sync.WaitGroup
	for wk := 0; wk < workers; wk++ {
		wg.Add(1)
		go func(wk int) {
			defer wg.Done()
			a := &accs[wk]
			a.s11 = make([]welford, len(omegas))
			a.s21 = make([]welford, len(omegas))
			a.lines = make([]welford, len(nomChecks))
			a.achieved = make([][]float64, len(nomChecks))
			a.met = make([]int, len(nomChecks))
			a.flo = make([]float64, n)
			a.fhi = make([]float64, n)
			for i := range a.flo {
				a.flo[i], a.fhi[i] = math.Inf(1), math.Inf(-1)
			}
			x := make([]float64, len(sens))
			mbuf := make([]float64, nn*nn)
			df := make([]float64, n)
			sd := md
			for k := wk; k < opts.Samples; k += workers {
				rng := rand.New(rand.NewPCG(opts.Seed, uint64(k)))
				for j, s := range sens {
					x[j] = s.Sigma * rng.NormFloat64()
				}
				for i := range df {
					df[i] = 0
				}
				for j, s := range sens {
					if s.Resonator > 0 {
						df[s.Resonator-1] += s.DfDx * x[j]
					}
				}
				for i, v := range df {
					a.flo[i] = math.Min(a.flo[i], v)
					a.fhi[i] = math.Max(a.fhi[i], v)
				}
				perturbed(base, nn, sens, x, mbuf)
				m := mat.NewDense(nn, nn, slices.Clone(mbuf))
				ev := newEvaluator(m, loss)
				for i, w := range omegas {
					s11, s21 := ev.s11s21(w)
					a.s11[i].add(db2(s11))
					a.s21[i].add(db2(s21))
				}
				if opts.Verdict {
					sd.Folded = m
					checks, err := sd.Check(q0, opts.Spurious)
					if err != nil {
						a.err = err
						return
					}
					if len(checks) != len(nomChecks) {
						a.err = errors.New("filter: check table changed shape under perturbation")
						return
					}
					for i, c := range checks {
						a.lines[i].add(c.Achieved)
						a.achieved[i] = append(a.achieved[i], c.Achieved)
						if c.Verdict == Met {
							a.met[i]++
						}
					}
					switch Overall(checks) {
					case Met:
						a.pass++
					case OutsideModel:
						a.outside++
					}
				}
				if opts.Progress != nil {
					mu.Lock()
					done++
					opts.Progress(done, opts.Samples)
					mu.Unlock()
				}
			}
		}(wk)
	}
	wg.Wait()
	for _, a := range accs {
		if a.err != nil {
			return nil, a.err
		}
	}
	tot := accs[0]
	for _, a := range accs[1:] {
		for i := range tot.s11 {
			tot.s11[i].merge(a.s11[i])
			tot.s21[i].merge(a.s21[i])
		}
		for i := range tot.lines {
			tot.lines[i].merge(a.lines[i])
			tot.achieved[i] = append(tot.achieved[i], a.achieved[i]...)
			tot.met[i] += a.met[i]
		}
		tot.pass += a.pass
		tot.outside += a.outside
		for i := range tot.flo {
			tot.flo[i] = math.Min(tot.flo[i], a.flo[i])
			tot.fhi[i] = math.Max(tot.fhi[i], a.fhi[i])
		}
	}
	ns := float64(opts.Samples)
	for i, f := range opts.Freqs {
		res.Points = append(res.Points, PointSpread{F: f,
			S11DB: tot.s11[i].spread(nom11[i], lin11[i]),
			S21DB: tot.s21[i].spread(nom21[i], lin21[i])})
	}
	if opts.Verdict {
		res.Yield = float64(tot.pass) / ns
		res.YieldStd = math.Sqrt(res.Yield * (1 - res.Yield) / ns)
		res.Outside = float64(tot.outside) / ns
		for i, c := range nomChecks {
			ls := LineSpread{Check: c, Scatter: tot.lines[i].spread(c.Achieved, math.NaN()), Met: float64(tot.met[i]) / ns,
				P05: math.NaN(), P50: math.NaN(), P95: math.NaN()}
			v := slices.DeleteFunc(tot.achieved[i], func(x float64) bool { return math.IsNaN(x) || math.IsInf(x, 0) })
			if len(v) > 0 {
				slices.Sort(v)
				ls.P05, ls.P50, ls.P95 = percentile(v, 0.05), percentile(v, 0.5), percentile(v, 0.95)
			}
			res.Lines = append(res.Lines, ls)
		}
	}
	for i := 0; i < n; i++ {
		lo, hi := tot.flo[i], tot.fhi[i]
		if math.IsInf(lo, 0) {
			lo, hi = 0, 0
		}
		res.Tuning = append(res.Tuning, TuningNeed{Resonator: i + 1, Low: lo, High: hi, Span: hi - lo})
	}
	return res, nil
}

// percentile returns the p-quantile of sorted v by linear interpolation
// between order statistics (Hyndman & Fan 1996, definition 7).
func percentile(v []float64, p float64) float64 {
	h := p * float64(len(v)-1)
	i := int(math.Floor(h))
	if i+1 >= len(v) {
		return v[len(v)-1]
	}
	return v[i] + (h-float64(i))*(v[i+1]-v[i])
}

// ScrewTuning is the Slater model of the tuning screw of one resonator: a
// screw tip on a wall, taken as a hemispherical metal boss of radius r0,
// whose frequency shift is the first-order Slater perturbation
// cavity.Cavity.SphereShift, proportional to r0^3. The screw is placed
// where the wanted mode's shift per r0^3 is largest among points on end
// plate A (rho = 0 .. 0.94 a) and on the side wall (z = L/32 .. 31 L/32).
// Where the wall field is magnetic (TE011: the side wall at mid-length)
// the boss raises the frequency; where it is electric (TM010: the end
// plate's centre) it lowers it.
type ScrewTuning struct {
	TuningNeed
	// At is the screw position (Phi = 0) and OnSide is true on the side
	// wall, false on end plate A.
	At     cavity.Point
	OnSide bool
	// PerCube is the shift per r0^3 there, Hz/m^3 (positive: the boss
	// raises the frequency); zero when the mode puts no field on the walls.
	PerCube float64
	// Radius is the boss radius whose shift spans TuningNeed.Span, m;
	// Shift its shift, Hz (NaN when PerCube is zero).
	Radius, Shift float64
	// RadiusOverWavelength and Valid are those of the Slater model at
	// Radius (cavity.Perturbation): the model holds for r0 <= 0.05 lambda
	// and r0 <= 0.2 times the distance to the other walls.
	RadiusOverWavelength float64
	Valid                bool
}

// ScrewTunings returns, for each resonator of realisation r, the screw
// position and the boss radius whose Slater shift spans the tuning range
// needs[i].Span (from Yield). Since the shift has one sign, a filter
// tuned this way is machined so that the screw sits part-way in at the
// design frequency; the span is what it must cover. The shift of the
// wanted mode is the eigen-shift whose eigenvector it dominates.
func ScrewTunings(r *Realisation, needs []TuningNeed) ([]ScrewTuning, error) {
	if r == nil || len(needs) != len(r.Cavities) {
		return nil, errors.New("filter: screw tuning needs the realisation and one tuning range per resonator")
	}
	out := make([]ScrewTuning, len(needs))
	for i, c := range r.Cavities {
		st := ScrewTuning{TuningNeed: needs[i], Radius: math.NaN(), Shift: math.NaN(), RadiusOverWavelength: math.NaN()}
		a, l := c.Cavity.Radius, c.Cavity.Length
		r0 := 1e-4 * min(a, l)
		var p cavity.Point
		for i := 0; i < 63; i++ {
			q, side := cavity.Point{Rho: a * float64(i) / 32}, false
			if i > 30 {
				q, side = cavity.Point{Rho: a, Z: l * float64(i-31) / 32}, true
				if i == 31 {
					continue
				}
			}
			pert, err := c.Cavity.SphereShift(r.Mode, q, r0)
			if err != nil {
				return nil, fmt.Errorf("filter: screw of resonator %d: %w", c.Resonator, err)
			}
			for k := range pert.Shift {
				if pert.Dominant(k).Mode == r.Mode {
					if v := pert.Shift[k] / (r0 * r0 * r0); math.Abs(v) > math.Abs(st.PerCube) {
						st.PerCube, p, st.At, st.OnSide = v, q, q, side
					}
					break
				}
			}
		}
		if st.PerCube != 0 && st.Span > 0 {
			rad := math.Cbrt(st.Span / math.Abs(st.PerCube))
			st.Radius = rad
			at, err := c.Cavity.SphereShift(r.Mode, p, rad)
			if err == nil {
				for k := range at.Shift {
					if at.Dominant(k).Mode == r.Mode {
						st.Shift = at.Shift[k]
						break
					}
				}
				st.RadiusOverWavelength, st.Valid = at.RadiusOverWavelength, at.Valid
			}
		}
		out[i] = st
	}
	return out, nil
}

// productionDesign returns a copy of d whose specification asks for the
// return loss rl (dB) instead of the design's (zero: unchanged), so that
// Design.Check judges a built filter against the production mask.
func productionDesign(d *Design, rl float64) (Design, error) {
	md := *d
	if rl == 0 {
		return md, nil
	}
	if d.Spec.Family != Chebyshev {
		return md, errors.New("filter: a production return loss applies to a Chebyshev design only")
	}
	if !(rl > 0 && rl <= d.Spec.ReturnLoss) {
		return md, fmt.Errorf("filter: production return loss must be > 0 dB and at most the design's %g dB, got %g dB", d.Spec.ReturnLoss, rl)
	}
	md.Spec.ReturnLoss = rl
	md.Spec.Ripple = RippleFromReturnLoss(rl)
	return md, nil
}
