package axisym

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"cylcav/cavity"
	"cylcav/physics"
)

// Request says which resonances Solve looks for. The zero value of every
// field but MaxFrequency is a documented default.
type Request struct {
	// Order is the azimuthal order n of the fields (cos n phi). n = 0 is
	// solved for every body; n >= 1 (TE_n and TM_n coupled at steps,
	// hybrid.go) for closed bodies of homogeneous circular sections, without
	// losses or fields; other bodies are an error wrapping ErrNotImplemented.
	Order int
	// MaxFrequency is the upper end of the search, in Hz: every resonance
	// below it is returned.
	MaxFrequency float64
	// Modes is the number of waveguide modes of each family kept in the
	// widest section; narrower sections keep proportionally fewer (the
	// relative-convergence rule), and every section keeps at least the modes
	// that propagate in it at MaxFrequency plus two. Zero means DefaultModes.
	// For Order >= 1 the count applies to each of TE_n and TM_n.
	Modes int
	// Families lists the families to solve (cavity.TE for TE0, cavity.TM for
	// TM0); nil means both.
	Families []cavity.Family
	// Losses asks for each resonance's Loss (geometry factors of every
	// metal surface and filling factors), from the matched fields.
	Losses bool
	// EdgeBasis asks, for Order 0, for the edge-conditioned junctions
	// (edgebasis.go: the aperture field in basis functions that carry
	// Meixner's edge condition), which converge exponentially in the
	// number of basis functions instead of as N^-2 in the number of modes:
	// about 1e-9 where the default gives 1e-4 (see the package doc). It
	// applies to closed bodies of homogeneous circular sections with a
	// step at every junction; for any other body, or family, Solve uses
	// the default method (Resonance.EdgeBasis says which gave each
	// resonance). With Losses, Modes then sets the number of dynamic
	// modes of the widest section in the coarse model (1.5 times that in
	// the fine one) from which the fields are summed; the frequencies do
	// not depend on it.
	EdgeBasis bool
}

// Resonance is one resonance of a body.
type Resonance struct {
	// Family is TE (TE0: E_phi, H_r, H_z) or TM (TM0: E_r, E_z, H_phi).
	// For Order >= 1, where TE_n and TM_n couple at steps, it is the family
	// of Origin, the label, not of the field.
	Family cavity.Family
	// Index counts the resonances of the family from 1 in frequency order
	// (for Order >= 1: all resonances of that order).
	Index int
	// Frequency is the resonant frequency in Hz, computed with 1.5 times
	// the requested number of modes.
	Frequency float64
	// Change is the convergence estimate in Hz: how far the frequency moved
	// when the number of modes per section grew by half. +Inf when the
	// resonance had no partner in the smaller model.
	Change float64
	// Coarse is the frequency of the same resonance in the smaller model
	// (two thirds of the modes), in Hz, so Change = |Frequency - Coarse|;
	// zero when there was no partner.
	Coarse float64
	// Origin is the mode of the enclosing cylinder (Body.Enclosing) that
	// this resonance continues from: the Index-th mode of the same family
	// and order there. HasOrigin is false, and Origin the zero Mode, for a
	// body with a coaxial section: an inner conductor that may join both
	// end plates changes the topology, and with it the static modes, so
	// the continuation from the empty cylinder is not defined.
	Origin    cavity.Mode
	HasOrigin bool
	// OriginTied is true when the enclosing cylinder has another mode of the
	// family at the same frequency as Origin, so the label could be either.
	OriginTied bool
	// Loss holds the geometry and filling factors when Request.Losses was
	// set; nil otherwise. LossErr says why Loss is nil when it was asked
	// for (a field the solver does not yet give, wrapping
	// ErrNotImplemented).
	Loss    *Loss
	LossErr error
	// CoarseLoss is the Loss of the smaller model (two thirds of the
	// modes), when both have one: the change of a Q0 between the two is
	// its convergence estimate, which matters here, since wall losses next
	// to a step edge converge only as about N^(-1/3) (see the package doc).
	CoarseLoss *Loss
	// EdgeBasis is true when the resonance came from the edge-conditioned
	// model (Request.EdgeBasis); Coarse is then that of its coarser model
	// (edgeCoarse).
	EdgeBasis bool
}

// DefaultModes is the default number of modes in the widest section: the
// five lowest TM0 resonances of an invented five-section body then change
// by 3e-6 to 1e-4 relative when the count grows by half (see the package
// doc).
const DefaultModes = 40

// Limits of Solve. MaxModes is the most modes one section may keep (the
// Bessel-root core's range); MaxResonances bounds the list, which rejects a
// maximum frequency far above the lowest modes.
const (
	MaxModes      = cavity.MaxIndex
	MaxResonances = cavity.MaxIndex
)

// relTol is the relative width to which each resonance of the truncated
// model is bracketed: a few units in the last place, far below the
// truncation error.
const relTol = 1e-14

// ErrNotImplemented is wrapped by the errors Solve returns for bodies or
// requests the solver does not handle yet.
var ErrNotImplemented = errors.New("not implemented")

// ErrLimit is wrapped by the errors of a request beyond the solver's
// limits (more than MaxResonances resonances, or a section needing more
// than MaxModes modes, below the maximum frequency): the request is too
// large for the body, which a caller reports as bad input.
var ErrLimit = errors.New("beyond the solver's limits")

// limitErrorf returns an error wrapping ErrLimit with the message only
// (errors.Is finds ErrLimit; the text does not repeat it).
func limitErrorf(format string, a ...any) error {
	return &limitError{msg: fmt.Sprintf(format, a...)}
}

type limitError struct{ msg string }

func (e *limitError) Error() string        { return e.msg }
func (e *limitError) Is(target error) bool { return target == ErrLimit }

// Solve returns every resonance of body b of azimuthal order r.Order below
// r.MaxFrequency, sorted by frequency (TE0 before TM0 at equal frequency),
// each with its convergence estimate and the enclosing-cylinder mode it
// continues from.
//
// Method: axial mode matching with modal admittances (see system); the
// resonances of the truncated model are counted exactly below any frequency
// by the Wittrick-Williams algorithm (Wittrick and Williams 1971), so none
// is missed, isolated by bisection on the count, and refined by a secant
// iteration on the last pivot kept inside the count's bracket. Accuracy is
// that of the truncation, given by Change; the root of the truncated model
// is found to relTol. A body of one section, or of sections of one radius,
// has no truncation error: its frequencies are the closed-form ones.
//
// For a body with an open end (Body.Open) Solve returns the trapped
// resonances only, those below the pipes' cutoff (Body.Cutoff), with no
// enclosing-cylinder label; Radiating finds those above it.
//
// Errors: an invalid body (Body.Validate), a maximum frequency that is not
// positive and finite, more than MaxResonances resonances below it or a
// section that would need more than MaxModes modes (these two wrap
// ErrLimit), and, wrapping ErrNotImplemented, an order n >= 1 for a body
// that is open, coaxial, layered or uniaxial (see solveHybrid), or a
// junction where neither
// cross-section lies inside the other (for example two coaxial sections
// whose inner and outer radii both grow).
func Solve(b Body, r Request) ([]Resonance, error) {
	if err := b.Validate(); err != nil {
		return nil, err
	}
	if r.Order < 0 || r.Order > cavity.MaxIndex {
		return nil, fmt.Errorf("axisym: azimuthal order n must be in 0..%d, got %d", cavity.MaxIndex, r.Order)
	}
	if !(r.MaxFrequency > 0) || math.IsInf(r.MaxFrequency, 0) {
		return nil, fmt.Errorf("axisym: maximum frequency must be positive and finite, got %g Hz", r.MaxFrequency)
	}
	modes := r.Modes
	if modes == 0 {
		modes = DefaultModes
	}
	if modes < 1 || modes > MaxModes {
		return nil, fmt.Errorf("axisym: modes must be in 1..%d, got %d", MaxModes, modes)
	}
	if r.Order != 0 {
		return solveHybrid(b, r, modes) // hybrid.go
	}
	fams := r.Families
	if fams == nil {
		fams = []cavity.Family{cavity.TE, cavity.TM}
	}
	var out []Resonance
	for _, fam := range fams {
		if fam != cavity.TE && fam != cavity.TM {
			return nil, fmt.Errorf("axisym: unknown family %v", fam)
		}
		if err := b.requireIsotropicFor(fam); err != nil {
			return nil, err
		}
		if r.EdgeBasis && edgeApplies(b, fam) == nil {
			c, f := edgeCoarse, edgeFine
			if r.Losses {
				// The fields need the modes (the frequencies do not).
				c.dyn, f.dyn = max(c.dyn, modes), max(f.dyn, (3*modes+1)/2)
			}
			res, err := edgePair(b, fam, r.MaxFrequency, c, f, r.Losses)
			if err != nil {
				return nil, err
			}
			origins, ties := labels(b.Enclosing(), fam, len(res))
			for i := range res {
				res[i].Origin, res[i].OriginTied, res[i].HasOrigin = origins[i], ties[i], true
			}
			out = append(out, res...)
			continue
		}
		// The smaller model searches a little beyond the limit so that a
		// resonance just below it still has a partner.
		coarse, coarseLoss, err := resonances(b, fam, r.MaxFrequency*(1+estimateMargin), modes, r.Losses)
		if err != nil {
			return nil, err
		}
		fine, losses, err := resonances(b, fam, r.MaxFrequency, (3*modes+1)/2, r.Losses)
		if err != nil {
			return nil, err
		}
		coax := b.Open() // an open body has no enclosing-cylinder label either
		for _, s := range b.Sections {
			coax = coax || s.InnerRadius != 0
		}
		var origins []cavity.Mode
		var ties []bool
		if !coax {
			origins, ties = labels(b.Enclosing(), fam, len(fine))
		}
		for i, f := range fine {
			change, cf := math.Inf(1), 0.0
			if i < len(coarse) {
				change, cf = math.Abs(f-coarse[i]), coarse[i]
			}
			r := Resonance{Family: fam, Index: i + 1, Frequency: f, Change: change, Coarse: cf}
			if losses != nil {
				r.Loss, r.LossErr = losses[i].loss, losses[i].err
				if i < len(coarseLoss) && r.Loss != nil {
					r.CoarseLoss = coarseLoss[i].loss
				}
			}
			if !coax {
				r.Origin, r.OriginTied, r.HasOrigin = origins[i], ties[i], true
			}
			out = append(out, r)
		}
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].Frequency < out[j].Frequency })
	return out, nil
}

// estimateMargin widens the search of the smaller model used for the
// convergence estimate (common practice: well above any truncation error).
const estimateMargin = 0.05

// ModeCounts returns the number of modes of family fam that Solve keeps in
// each section of b for a search up to fmax with modes in the widest
// section (the relative-convergence rule: counts proportional to the
// radial width outer - inner, so that every section resolves the same
// finest radial detail at a step; Lee, Jones and Campbell 1971; Mittra, Itoh and Li 1972), raised
// where needed to the propagating modes plus two. It returns an error when
// a section would need more than MaxModes.
func ModeCounts(b Body, fam cavity.Family, fmax float64, modes int) ([]int, error) {
	var wmax float64
	for _, s := range b.Sections {
		wmax = max(wmax, s.Radius-s.InnerRadius)
	}
	counts := make([]int, len(b.Sections))
	for i, s := range b.Sections {
		w := s.Radius - s.InnerRadius
		// The tolerance keeps a ratio that is whole in exact arithmetic
		// (12.000000000000002) from rounding up.
		n := int(math.Ceil(float64(modes)*w/wmax - 1e-9))
		// Modes with kc < k: McMahon's expansion (DLMF 10.21.19) puts
		// j_{0,m} near (m - 1/4) pi and j_{1,m} near (m + 1/4) pi, and the
		// cross-product roots of a coaxial guide of width w near m pi/w
		// (DLMF 10.21.49, as recalled), so fewer than k w/pi + 2 of them
		// lie below k (plus the TEM mode).
		k := 2 * math.Pi * fmax / physics.SpeedOfLight * s.maxIndex()
		guess := int(k*w/math.Pi) + 3
		if guess > MaxModes {
			return nil, limitErrorf("axisym: section %d propagates about %d modes at %s, more than the %d the solver keeps; lower the maximum frequency",
				i+1, guess, physics.FormatFrequency(fmax, 4), MaxModes)
		}
		prop := 0
		for _, kc := range newGuide(fam, s.InnerRadius, s.Radius, guess).kc {
			if kc < k {
				prop++
			}
		}
		if len(s.Layers) > 0 {
			prop = layeredPropagating(fam, s, fmax)
		}
		n = max(n, prop+2, 1)
		if n > MaxModes {
			return nil, limitErrorf("axisym: section %d would need %d modes, more than %d; lower the mode count or the maximum frequency", i+1, n, MaxModes)
		}
		counts[i] = n
	}
	return counts, nil
}

// lossResult is the Loss of one resonance or why there is none.
type lossResult struct {
	loss *Loss
	err  error
}

// resonances returns the resonant frequencies of family fam below fmax of
// the model with modes in the widest section, in increasing order, and,
// if withLoss, their losses.
func resonances(b Body, fam cavity.Family, fmax float64, modes int, withLoss bool) ([]float64, []lossResult, error) {
	counts, err := ModeCounts(b, fam, fmax, modes)
	if err != nil {
		return nil, nil, err
	}
	return resonancesWith(b, fam, fmax, counts, withLoss)
}

// resonancesWith is resonances with the mode count of every section given.
func resonancesWith(b Body, fam cavity.Family, fmax float64, counts []int, withLoss bool) ([]float64, []lossResult, error) {
	s, err := newSystem(b, fam, counts)
	if err != nil {
		return nil, nil, err
	}
	if b.Radiates(fam, fmax) {
		// An open body: the real model holds below the pipe's cutoff only
		// (trapped resonances); Radiating finds the others.
		fmax = b.Cutoff(fam) * (1 - belowCutoff)
		if fmax <= 0 {
			return nil, nil, nil // a coaxial pipe's TEM mode: nothing is trapped
		}
	}
	sv := &solver{s: s, a: make([]float64, s.ndof*s.ndof)}
	s.calibrate(b, sv.a)
	jmax, gmax := sv.count(fmax)
	if jmax > MaxResonances {
		return nil, nil, limitErrorf("axisym: %d %v0 resonances below %s, more than %d; lower the maximum frequency", jmax, fam, physics.FormatFrequency(fmax, 4), MaxResonances)
	}
	sv.isolate(point{0, 0, 0}, point{fmax, jmax, gmax})
	if !withLoss {
		return sv.out, nil, nil
	}
	ls := make([]lossResult, len(sv.out))
	for i, f := range sv.out {
		l, err := s.losses(b, f)
		if err != nil {
			ls[i].err = err
			continue
		}
		ls[i].loss = &l
	}
	return sv.out, ls, nil
}

// point is one evaluation: frequency, count below it and last pivot.
type point struct {
	f float64
	j int
	g float64
}

type solver struct {
	s   *system
	a   []float64
	out []float64
	// countFn, when set, replaces s and a (the hybrid model, hybrid.go).
	countFn func(f float64) (int, float64)
}

func (sv *solver) count(f float64) (int, float64) {
	if sv.countFn != nil {
		return sv.countFn(f)
	}
	if sv.s.ndof == 0 {
		j := sv.s.eval(f, nil)
		return j - sv.s.offset, math.NaN()
	}
	return sv.s.count(f, sv.a)
}

func (sv *solver) at(f float64) point {
	j, g := sv.count(f)
	return point{f, j, g}
}

// isolate finds every resonance in (lo.f, hi.f] by bisection on the count.
func (sv *solver) isolate(lo, hi point) {
	switch d := hi.j - lo.j; {
	case d <= 0:
		return
	case d == 1:
		sv.out = append(sv.out, sv.refine(lo, hi))
		return
	case hi.f-lo.f <= relTol*hi.f:
		// Several resonances closer than the tolerance: a degenerate set.
		for range d {
			sv.out = append(sv.out, 0.5*(lo.f+hi.f))
		}
		return
	}
	mid := sv.at(0.5 * (lo.f + hi.f))
	sv.isolate(lo, mid)
	sv.isolate(mid, hi)
}

// refine narrows a bracket holding exactly one resonance (hi.j = lo.j + 1)
// to relTol by illinois on the last pivot; the count alone decides which
// side keeps the resonance.
func (sv *solver) refine(lo, hi point) float64 {
	return illinois(lo.f, hi.f, lo.g, hi.g, 300,
		func(lo, hi float64) bool { return hi-lo <= relTol*hi },
		func(x float64) (float64, bool) {
			p := sv.at(x)
			return p.g, p.j <= lo.j
		})
}

// labels returns, for k = 1..count, the k-th TE0 or TM0 mode of the closed
// cylinder c in frequency order, and whether another mode of that family
// shares its frequency (to 1e-12 relative).
//
// A resonance of a body keeps its place in the frequency order of its
// family while the body is deformed continuously from the enclosing
// cylinder, because modes of one symmetry class do not cross under a
// generic deformation (von Neumann and Wigner 1929). A body with its own
// mirror symmetry in z has even and odd classes that may cross; the label
// is then the one of the order, as documented in the package.
func labels(c cavity.Cavity, fam cavity.Family, count int) ([]cavity.Mode, []bool) {
	type entry struct {
		m cavity.Mode
		f float64
	}
	if count == 0 {
		return nil, nil
	}
	p0 := 1
	if fam == cavity.TM {
		p0 = 0
	}
	// The modes m = 1, p = p0..p0+count-1 are count modes, so the count
	// lowest lie at or below the last of them; candidates beyond are not
	// listed. The frequencies are cavity.Cavity.Frequency's.
	bound := c.Frequency(cavity.Mode{Family: fam, M: 1, P: p0 + count - 1}) * (1 + 1e-12)
	var list []entry
	for m := 1; m <= min(count, cavity.MaxIndex); m++ {
		if c.Frequency(cavity.Mode{Family: fam, M: m, P: p0}) > bound {
			break
		}
		for p := p0; p < p0+count && p <= cavity.MaxIndex; p++ {
			md := cavity.Mode{Family: fam, N: 0, M: m, P: p}
			f := c.Frequency(md)
			if f > bound {
				break
			}
			list = append(list, entry{md, f})
		}
	}
	sort.SliceStable(list, func(i, j int) bool { return list[i].f < list[j].f })
	modes := make([]cavity.Mode, count)
	ties := make([]bool, count)
	for i := range count {
		modes[i] = list[i].m
		tie := func(j int) bool {
			return j >= 0 && j < len(list) && math.Abs(list[j].f-list[i].f) <= 1e-12*list[i].f
		}
		ties[i] = tie(i-1) || tie(i+1)
	}
	return modes, ties
}
