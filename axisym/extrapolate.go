package axisym

import (
	"fmt"
	"math"

	"cylcav/cavity"
)

// Extrapolation is one resonance frequency extrapolated in the number of
// modes (Extrapolate).
type Extrapolation struct {
	Family cavity.Family
	// Index counts the resonances of the family from 1 in frequency order.
	Index int
	// Models are the frequencies of the three models, with N, 2N and 4N
	// modes in every section (N of each section from ModeCounts), in Hz.
	Models [3]float64
	// Regular is false when the three do not converge monotonically at an
	// algebraic order between minExtrapOrder and maxExtrapOrder; Frequency
	// and Error are then the finest model's and its last change.
	Regular bool
	// Order is the observed order p: the differences shrink by 2^p per
	// doubling. NaN when not Regular or when the models agree to rounding.
	Order float64
	// Frequency is the extrapolated frequency in Hz.
	Frequency float64
	// Error is the estimate of its error in Hz: how far the extrapolation
	// with the observed order lies from the one with order 2 (the order
	// observed on stepped bodies; see the package doc).
	Error float64
}

// Bounds on the observed order for which Extrapolate trusts Richardson's
// rule: the order observed with steps is 2 (package doc, group 8); outside
// 1..4 the three models are not in the asymptotic range.
const (
	minExtrapOrder = 1.0
	maxExtrapOrder = 4.0
)

// exactTol is the relative change below which the models agree to
// rounding (a body without steps has no truncation error).
const exactTol = 1e-12

// Extrapolate returns the resonances of family fam of body b below fmax
// extrapolated to infinitely many modes by Richardson's rule (L. F.
// Richardson, Phil. Trans. R. Soc. A 210 (1911) 307-357; the observed-order
// form as in P. J. Roache, Verification and Validation in Computational
// Science and Engineering, Hermosa 1998, ch. 5; recalled from memory) from
// three models with N, 2N and 4N modes in every section, N from
// ModeCounts(b, fam, fmax, modes). Doubling every section's count keeps
// their ratios exactly, which matters: the truncation error with steps
// depends on the ratio of the counts at each junction (relative
// convergence), and counts rounded afresh at each N make the sequence
// irregular.
//
// With the differences d1 = f(2N) - f(N), d2 = f(4N) - f(2N) of one sign,
// the observed order is p = log2(d1/d2) and the extrapolation f(4N) +
// d2/(2^p - 1); the error estimate is its distance from the extrapolation
// at order 2. Costs: the 4N model dominates (dense elimination, about
// 64 times the work of N).
//
// Errors: those of Solve; modes zero means DefaultModes, and 4 times a
// section's count must not exceed MaxModes.
func Extrapolate(b Body, fam cavity.Family, fmax float64, modes int) ([]Extrapolation, error) {
	if err := b.Validate(); err != nil {
		return nil, err
	}
	if fam != cavity.TE && fam != cavity.TM {
		return nil, fmt.Errorf("axisym: unknown family %v", fam)
	}
	if !(fmax > 0) || math.IsInf(fmax, 0) {
		return nil, fmt.Errorf("axisym: maximum frequency must be positive and finite, got %g Hz", fmax)
	}
	if modes == 0 {
		modes = DefaultModes
	}
	if modes < 1 || 4*modes > MaxModes {
		return nil, fmt.Errorf("axisym: modes must be in 1..%d for extrapolation (four times as many in the finest model), got %d", MaxModes/4, modes)
	}
	counts, err := ModeCounts(b, fam, fmax*(1+estimateMargin), modes)
	if err != nil {
		return nil, err
	}
	models, err := threeModels(fmax, func(shift int, lim float64) ([]float64, error) {
		c, err := doubled(counts, shift)
		if err != nil {
			return nil, err
		}
		f, _, err := resonancesWith(b, fam, lim, c, false)
		return f, err
	})
	if err != nil {
		return nil, err
	}
	return extrapolations(models, func(int) cavity.Family { return fam }), nil
}

// threeModels solves a body three times, with every section's mode count
// shifted left by 0, 1 and 2 (N, 2N, 4N), the finest model up to fmax and
// the coarser ones a little beyond, so that a resonance just below fmax has
// its partners.
func threeModels(fmax float64, solve func(shift int, lim float64) ([]float64, error)) ([3][]float64, error) {
	var models [3][]float64
	for i := range models {
		lim := fmax
		if i < 2 {
			lim *= 1 + estimateMargin
		}
		f, err := solve(i, lim)
		if err != nil {
			return models, err
		}
		models[i] = f
	}
	return models, nil
}

// doubled returns counts shifted left by shift, refusing a section that
// would need more than MaxModes.
func doubled(counts []int, shift int) ([]int, error) {
	c := make([]int, len(counts))
	for j, n := range counts {
		c[j] = n << shift
		if c[j] > MaxModes {
			return nil, limitErrorf("axisym: section %d would need %d modes in the finest model, more than %d; lower the mode count", j+1, c[j], MaxModes)
		}
	}
	return c, nil
}

// extrapolations lists the finest model's resonances, each extrapolated
// from the three models where all three have it, with family fam(k).
func extrapolations(models [3][]float64, fam func(k int) cavity.Family) []Extrapolation {
	out := make([]Extrapolation, len(models[2]))
	for k, f2 := range models[2] {
		e := Extrapolation{Family: fam(k), Index: k + 1, Order: math.NaN(), Frequency: f2, Error: math.Inf(1)}
		e.Models[2] = f2
		if k < len(models[0]) && k < len(models[1]) {
			e.Models[0], e.Models[1] = models[0][k], models[1][k]
			e.richardson()
		}
		out[k] = e
	}
	return out
}

// richardson fills Regular, Order, Frequency and Error from Models.
func (e *Extrapolation) richardson() {
	f0, f1, f2 := e.Models[0], e.Models[1], e.Models[2]
	d1, d2 := f1-f0, f2-f1
	e.Frequency, e.Error = f2, math.Abs(d2)
	if math.Abs(d1) <= exactTol*f2 && math.Abs(d2) <= exactTol*f2 {
		e.Regular = true // no truncation error: the models agree
		return
	}
	if d1*d2 <= 0 {
		return
	}
	p := math.Log2(d1 / d2)
	if !(p >= minExtrapOrder && p <= maxExtrapOrder) {
		return
	}
	fit := f2 + d2/(math.Exp2(p)-1)
	two := f2 + d2/3
	e.Regular, e.Order, e.Frequency, e.Error = true, p, fit, math.Abs(fit-two)
}
