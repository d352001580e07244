package measure

import (
	"fmt"
	"math"
	"slices"
	"sort"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/optimize"

	"cylcav/cavity"
)

// IdentifySettings tunes Identify.
type IdentifySettings struct {
	// Nominal is the cavity as drawn: radius, length and fill.
	Nominal cavity.Cavity

	// FitFill fits the fill's relative permittivity with the radius and
	// length held at Nominal, instead of fitting the radius and length
	// with the fill held. The two cannot be fitted together: every
	// frequency depends on a, d and eps_r only through a sqrt(eps_r) and
	// d sqrt(eps_r) (Pozar, Microwave Engineering, 4th ed., sec. 6.4).
	FitFill bool

	// MatchTol is the largest relative difference between a measured
	// frequency and its mode's fitted frequency for the assignment to be
	// accepted; 0 means 0.3 %, several times the frequency scatter that
	// coupling holes, probes and machining usually leave (common practice).
	MatchTol float64
}

// Assignment is the mode given to one measured resonance.
type Assignment struct {
	// Mode is the cavity mode; for a resonance at a TE0mp/TM1mp pair it
	// is TE0mp or TM1mp as resolved by Q (see Identification.Pairs), or
	// TE0mp with Unresolved set when the pair showed only one resonance.
	Mode       cavity.Mode
	Unresolved bool

	Predicted float64 // the mode's frequency in the fitted cavity, Hz
	Residual  float64 // (measured - Predicted) / Predicted

	// Matched is false when no mode of the cavity lies within MatchTol
	// (a resonance of the coupling structure, a higher-order mode of a
	// port, or a cavity far from its drawing); Mode is then the nearest.
	Matched bool
}

// Pair is a TE0mp/TM1mp pair whose degeneracy the real cavity has lifted
// (by a tuning screw, end-plate tilt or ellipticity): both resonances
// measured.
type Pair struct {
	TE, TM int     // indices of the TE0mp and TM1mp resonances
	Split  float64 // f(TE0mp) - f(TM1mp), Hz
}

// Identification is the result of Identify.
type Identification struct {
	// Cavity is the fitted effective cavity; RadiusErr, LengthErr (with
	// FitFill false) or EpsErr (with FitFill true) are the standard
	// uncertainties of the fitted values from the residual scatter.
	Cavity                       cavity.Cavity
	RadiusErr, LengthErr, EpsErr float64

	// RMS is the root mean square of the matched relative residuals.
	RMS float64

	Assign []Assignment // one per measured resonance, in input order
	Pairs  []Pair

	// Chance is the number of resonances expected within MatchTol of a
	// mode of the fitted cavity by chance alone (see ByChance).
	Chance float64
}

// ByChance is the one verdict on a naming that a dense spectrum makes
// meaningless: the resonances expected to match a mode by chance
// (Chance) are at least half of those matched, as when a drawn size
// far too large (4000mm for 40mm) gives thousands of modes in the band.
// Chance = N min(1, 2 tol n / ln(f2/f1)) for N resonances and the n
// distinct mode frequencies of the fitted cavity between f1 and f2, the
// measured band widened by the assignment's capture 20 tol on each side:
// n frequencies spread over the band put a random frequency within tol of
// one with that probability (derived, as for CavityFromHint's score; the
// threshold of one half is our choice).
func (id Identification) ByChance() bool {
	matched := 0
	for _, a := range id.Assign {
		if a.Matched {
			matched++
		}
	}
	return matched > 0 && id.Chance >= 0.5*float64(matched)
}

// chanceMatches returns Identification.Chance for the measured
// frequencies f0, the fitted model frequencies fs (one per slot) and the
// match tolerance tol.
func chanceMatches(f0, fs []float64, tol float64) float64 {
	if len(f0) == 0 {
		return 0
	}
	lo, hi := slices.Min(f0)/(1+20*tol), slices.Max(f0)*(1+20*tol)
	n := 0
	for _, f := range fs {
		if f >= lo && f <= hi {
			n++
		}
	}
	return float64(len(f0)) * math.Min(1, 2*tol*float64(n)/math.Log(hi/lo))
}

// slot is one distinct frequency of the model: a mode, or the TE0mp and
// TM1mp pair that share it.
type slot struct {
	modes []cavity.Mode
}

// Identify assigns each measured resonance frequency f0[i] (Hz; with its
// unloaded Q q0[i], NaN when unknown, used to tell TE0mp from TM1mp) to a
// mode of the cavity, fitting the effective radius and length (or the
// fill's permittivity, with s.FitFill) to the matched frequencies by least
// squares on the relative residuals (Nelder-Mead, gonum optimize). The
// assignment and the fit alternate until the assignment no longer changes:
// each measured frequency goes to the nearest model frequency, nearest
// pairs first, each mode taking at most one resonance (a TE0mp/TM1mp pair
// two).
//
// A pair showing two resonances is resolved by Q: the one with the higher
// unloaded Q is TE0mp, whose wall currents are purely azimuthal and do not
// cross the joint between side wall and end plate, while TM1mp's do
// (common practice; Pozar sec. 6.7 for the TE01p currents).
//
// It needs at least two matched resonances of different modes (one with
// FitFill), and returns an error otherwise.
func Identify(f0, q0 []float64, s IdentifySettings) (Identification, error) {
	if len(f0) != len(q0) {
		return Identification{}, fmt.Errorf("measure: %d frequencies and %d Q values", len(f0), len(q0))
	}
	if err := s.Nominal.Validate(); err != nil {
		return Identification{}, err
	}
	if err := s.Nominal.Fill.RequireIsotropic("measure: mode identification"); err != nil {
		return Identification{}, err
	}
	tol := s.MatchTol
	if tol == 0 {
		tol = 0.003
	}
	fmax := 0.0
	for i, f := range f0 {
		if !(f > 0) || math.IsInf(f, 0) {
			return Identification{}, fmt.Errorf("measure: resonance %d: frequency must be > 0 Hz and finite, got %g Hz", i+1, f)
		}
		fmax = math.Max(fmax, f)
	}
	// Margin above the highest resonance so that modes pushed up by the
	// fit are still candidates.
	const modeMargin = 1.2
	modes, err := s.Nominal.Modes(fmax * modeMargin)
	if err != nil {
		return Identification{}, err
	}
	var slots []slot
	for i := 0; i < len(modes); i++ {
		sl := slot{modes: []cavity.Mode{modes[i].Mode}}
		if c, ok := modes[i].Mode.Companion(); ok && i+1 < len(modes) && modes[i+1].Mode == c {
			sl.modes = append(sl.modes, c)
			i++
		}
		slots = append(slots, sl)
	}
	if len(slots) == 0 {
		return Identification{}, fmt.Errorf("measure: the nominal cavity has no mode below %g Hz", fmax*modeMargin)
	}

	cav := func(x []float64) cavity.Cavity {
		c := s.Nominal
		if s.FitFill {
			c.Fill.EpsR = s.Nominal.Fill.Eps() * x[0]
		} else {
			c.Radius, c.Length = s.Nominal.Radius*x[0], s.Nominal.Length*x[1]
		}
		return c
	}
	nx := 2
	if s.FitFill {
		nx = 1
	}
	x := make([]float64, nx)
	for i := range x {
		x[i] = 1
	}
	assign := make([]int, len(f0)) // slot index or -1
	predict := func(c cavity.Cavity) []float64 {
		fs := make([]float64, len(slots))
		for j, sl := range slots {
			fs[j] = c.Frequency(sl.modes[0])
		}
		return fs
	}
	doAssign := func(fs []float64) []int {
		type cand struct {
			i, j int
			d    float64
		}
		var cs []cand
		for i, f := range f0 {
			for j, fp := range fs {
				if d := math.Abs(f-fp) / fp; d < 20*tol {
					cs = append(cs, cand{i, j, d})
				}
			}
		}
		sort.Slice(cs, func(a, b int) bool { return cs[a].d < cs[b].d })
		out := make([]int, len(f0))
		for i := range out {
			out[i] = -1
		}
		used := make([]int, len(slots))
		for _, c := range cs {
			if out[c.i] >= 0 || used[c.j] >= len(slots[c.j].modes) {
				continue
			}
			out[c.i] = c.j
			used[c.j]++
		}
		return out
	}
	for it := 0; it < 10; it++ {
		as := doAssign(predict(cav(x)))
		same := it > 0
		for i := range as {
			same = same && as[i] == assign[i]
		}
		assign = as
		if same {
			break
		}
		// Fit to the assignments near their modes at the current
		// parameters; a split TE0mp/TM1mp pair counts once, at the mean of
		// its two frequencies (the ideal cylinder's common frequency).
		obs := observations(f0, as, cav(x), slots, 20*tol)
		if len(obs) < nx {
			return Identification{}, fmt.Errorf("measure: only %d resonances lie near modes of the nominal cavity; identification needs at least %d of different modes", len(obs), nx)
		}
		cost := func(xv []float64) float64 {
			if xv[0] <= 0 || (nx == 2 && xv[1] <= 0) {
				return math.Inf(1)
			}
			c := cav(xv)
			var ss float64
			for _, o := range obs {
				fp := c.Frequency(slots[o.slot].modes[0])
				d := (o.f - fp) / fp
				ss += d * d
			}
			return ss
		}
		res, err := optimize.Minimize(optimize.Problem{Func: cost}, x, &optimize.Settings{}, &optimize.NelderMead{})
		if err != nil && res == nil {
			return Identification{}, fmt.Errorf("measure: fitting the cavity to the resonances: %w", err)
		}
		x = res.X
	}

	c := cav(x)
	out := Identification{Cavity: c, Assign: make([]Assignment, len(f0)), RadiusErr: math.NaN(), LengthErr: math.NaN(), EpsErr: math.NaN()}
	fs := predict(c)
	var ss float64
	var n int
	var matched []int
	for i, j := range assign {
		if j < 0 {
			// nearest slot, for the report
			j = 0
			for k := range fs {
				if math.Abs(f0[i]-fs[k]) < math.Abs(f0[i]-fs[j]) {
					j = k
				}
			}
		}
		a := Assignment{Mode: slots[j].modes[0], Predicted: fs[j], Residual: (f0[i] - fs[j]) / fs[j]}
		a.Matched = assign[i] >= 0 && math.Abs(a.Residual) <= tol
		if a.Matched {
			ss += a.Residual * a.Residual
			n++
			matched = append(matched, i)
		}
		out.Assign[i] = a
	}
	out.Chance = chanceMatches(f0, fs, tol)
	fin := observations(f0, matchedOnly(assign, out.Assign), c, slots, tol)
	ss, n = 0, len(fin)
	for _, o := range fin {
		fp := c.Frequency(slots[o.slot].modes[0])
		ss += sq((o.f - fp) / fp)
	}
	if n > 0 {
		out.RMS = math.Sqrt(ss / float64(n))
	}
	// Pairs: resolve by Q.
	for j, sl := range slots {
		if len(sl.modes) != 2 {
			continue
		}
		var idx []int
		for _, i := range matched {
			if assign[i] == j {
				idx = append(idx, i)
			}
		}
		te, tm := sl.modes[0], sl.modes[1]
		if te.Family != cavity.TE {
			te, tm = tm, te
		}
		switch len(idx) {
		case 1:
			out.Assign[idx[0]].Mode, out.Assign[idx[0]].Unresolved = te, true
		case 2:
			a, b := idx[0], idx[1]
			if math.IsNaN(q0[a]) || math.IsNaN(q0[b]) {
				out.Assign[a].Mode, out.Assign[a].Unresolved = te, true
				out.Assign[b].Mode, out.Assign[b].Unresolved = te, true
				continue
			}
			if q0[b] > q0[a] {
				a, b = b, a
			}
			out.Assign[a].Mode, out.Assign[b].Mode = te, tm
			out.Pairs = append(out.Pairs, Pair{TE: a, TM: b, Split: f0[a] - f0[b]})
		}
	}
	// Uncertainties: Gauss-Newton covariance s^2 (J^T J)^-1 of the
	// relative residuals at the optimum, J by central differences.
	if n > nx {
		r0 := func(xv []float64) []float64 {
			cc := cav(xv)
			r := make([]float64, len(fin))
			for k, o := range fin {
				fp := cc.Frequency(slots[o.slot].modes[0])
				r[k] = (o.f - fp) / fp
			}
			return r
		}
		J := mat.NewDense(len(fin), nx, nil)
		for p := 0; p < nx; p++ {
			const h = 1e-6
			xp := append([]float64(nil), x...)
			xm := append([]float64(nil), x...)
			xp[p] += h
			xm[p] -= h
			rp, rm := r0(xp), r0(xm)
			for k := range rp {
				J.Set(k, p, (rp[k]-rm[k])/(2*h))
			}
		}
		var jtj, cov mat.Dense
		jtj.Mul(J.T(), J)
		if err := cov.Inverse(&jtj); err == nil {
			s2 := ss / float64(n-nx)
			if s.FitFill {
				out.EpsErr = s.Nominal.Fill.Eps() * math.Sqrt(s2*cov.At(0, 0))
			} else {
				out.RadiusErr = s.Nominal.Radius * math.Sqrt(s2*cov.At(0, 0))
				out.LengthErr = s.Nominal.Length * math.Sqrt(s2*cov.At(1, 1))
			}
		}
	}
	return out, nil
}

// observation is one model frequency with its measured value: a matched
// resonance, or the mean of the two resonances of a split pair.
type observation struct {
	slot int
	f    float64
}

// observations groups the resonances assigned to slots (as[i] >= 0) whose
// relative distance from their slot's frequency in c is at most tol.
func observations(f0 []float64, as []int, c cavity.Cavity, slots []slot, tol float64) []observation {
	sum := map[int]float64{}
	cnt := map[int]int{}
	for i, j := range as {
		if j < 0 {
			continue
		}
		fp := c.Frequency(slots[j].modes[0])
		if math.Abs(f0[i]-fp)/fp <= tol {
			sum[j] += f0[i]
			cnt[j]++
		}
	}
	var out []observation
	for j := range slots {
		if cnt[j] > 0 {
			out = append(out, observation{slot: j, f: sum[j] / float64(cnt[j])})
		}
	}
	return out
}

// matchedOnly returns the slot assignment with unmatched resonances removed.
func matchedOnly(as []int, a []Assignment) []int {
	out := make([]int, len(as))
	for i, j := range as {
		out[i] = j
		if !a[i].Matched {
			out[i] = -1
		}
	}
	return out
}
