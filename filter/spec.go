package filter

import (
	"fmt"
	"math"

	"cylcav/physics"
)

// Family selects the lowpass prototype response.
type Family int

const (
	// Chebyshev is the (generalised) Chebyshev response: equal ripple in
	// the passband, with or without prescribed finite transmission zeros.
	// It is the zero value.
	Chebyshev Family = iota
	// Butterworth is the maximally flat all-pole response with 3.01 dB
	// insertion loss at the band edges.
	Butterworth
)

// String returns "chebyshev" or "butterworth".
func (f Family) String() string {
	switch f {
	case Chebyshev:
		return "chebyshev"
	case Butterworth:
		return "butterworth"
	}
	return fmt.Sprintf("Family(%d)", int(f))
}

// DefaultReturnLoss is the passband return loss, in dB, of a Chebyshev Spec
// that gives neither ReturnLoss nor Ripple (common practice for cavity
// filters).
const DefaultReturnLoss = 20.0

// Rejection is one stopband requirement: at least Attenuation dB of
// insertion loss from frequency F (Hz), which must lie outside the
// passband, outwards to End, or to the end of the band of interest
// (ModelRange) when End is 0. End, when given, lies on the far side of F
// from the passband.
type Rejection struct {
	F           float64 // Hz
	Attenuation float64 // dB, > 0
	End         float64 // Hz; 0: to the end of the band of interest
}

// Spec is the specification of a bandpass filter.
//
// The passband runs from f1 to f2 with f2 - f1 = BW and f1 f2 = F0^2
// (LowpassOmega maps them to -1 and +1). Transmission zeros are given in the
// normalised lowpass frequency Omega (convert hertz with LowpassOmega);
// a zero at Omega > 1 lies above the passband.
//
// The zero value of every optional field is a documented default: Family
// Chebyshev; Order 0 = the smallest order that meets Rejections;
// ReturnLoss = Ripple = 0 = DefaultReturnLoss; no Zeros = all-pole.
type Spec struct {
	F0     float64 // centre frequency, Hz, > 0
	BW     float64 // passband width, Hz, 0 < BW < F0
	Family Family

	// Order is the number of resonators, 1..MaxOrder, or 0 to choose the
	// smallest order that meets Rejections (see MinOrder).
	Order int

	// ReturnLoss (dB, at the ripple peaks of the lossless response) or
	// Ripple (dB of insertion-loss ripple) fixes the Chebyshev ripple
	// level; give at most one. Both must be zero for Butterworth.
	ReturnLoss float64
	Ripple     float64

	// Zeros are the finite transmission zeros, normalised Omega, each with
	// |Omega| > 1; at most Order-1 of them with a plain folded network, or
	// exactly Order for the fully canonical response, which adds a direct
	// source-load coupling. Symmetric or asymmetric placements are both
	// allowed. Chebyshev only.
	Zeros []float64

	// RealPairs are pairs of real-axis transmission zeros s = -+sigma
	// (normalised, each sigma in (0, MaxPairSigma]) for group-delay
	// equalisation; each pair counts as two of the at most Order finite
	// zeros. Chebyshev only (see pairs.go).
	RealPairs []float64

	// Rejections are the stopband requirements, checked by Design.Check and
	// used by MinOrder when Order is 0.
	Rejections []Rejection
}

// normalized checks s and returns a copy with defaults filled in
// (ReturnLoss and Ripple both set for Chebyshev). The order is not chosen
// here.
func (s Spec) normalized() (Spec, error) {
	if !(s.F0 > 0) || math.IsInf(s.F0, 0) {
		return s, fmt.Errorf("filter: centre frequency must be > 0 Hz and finite, got %g Hz", s.F0)
	}
	if !(s.BW > 0 && s.BW < s.F0) {
		return s, fmt.Errorf("filter: bandwidth must be > 0 Hz and < f0 = %g Hz, got %g Hz", s.F0, s.BW)
	}
	if s.Order != 0 {
		if err := checkOrder(s.Order); err != nil {
			return s, err
		}
	}
	switch s.Family {
	case Chebyshev:
		switch {
		case s.ReturnLoss != 0 && s.Ripple != 0:
			return s, fmt.Errorf("filter: give return loss (%g dB) or ripple (%g dB), not both", s.ReturnLoss, s.Ripple)
		case s.ReturnLoss != 0:
			if err := checkReturnLoss(s.ReturnLoss); err != nil {
				return s, err
			}
			s.Ripple = RippleFromReturnLoss(s.ReturnLoss)
		case s.Ripple != 0:
			if err := checkRipple(s.Ripple); err != nil {
				return s, err
			}
			s.ReturnLoss = ReturnLossFromRipple(s.Ripple)
			if s.ReturnLoss > MaxReturnLoss {
				return s, fmt.Errorf("filter: passband ripple must be >= %.3g dB (return loss <= %g dB), got %g dB",
					RippleFromReturnLoss(MaxReturnLoss), MaxReturnLoss, s.Ripple)
			}
		default:
			s.ReturnLoss = DefaultReturnLoss
			s.Ripple = RippleFromReturnLoss(DefaultReturnLoss)
		}
		limit := MaxOrder
		if s.Order != 0 {
			limit = s.Order
		}
		if err := checkZerosP(limit, s.Zeros, s.RealPairs); err != nil {
			return s, err
		}
	case Butterworth:
		if s.ReturnLoss != 0 || s.Ripple != 0 {
			return s, fmt.Errorf("filter: a Butterworth response has 3.01 dB loss at the band edges; return loss (%g dB) and ripple (%g dB) must be 0", s.ReturnLoss, s.Ripple)
		}
		if len(s.Zeros)+len(s.RealPairs) != 0 {
			return s, fmt.Errorf("filter: transmission zeros need the Chebyshev family, got %d zeros with Butterworth", len(s.Zeros)+2*len(s.RealPairs))
		}
	default:
		return s, fmt.Errorf("filter: unknown response family %d; use Chebyshev or Butterworth", int(s.Family))
	}
	for i, r := range s.Rejections {
		if !(r.F > 0) || math.IsInf(r.F, 0) {
			return s, fmt.Errorf("filter: rejection %d: frequency must be > 0 Hz and finite, got %g Hz", i+1, r.F)
		}
		if w := LowpassOmega(r.F, s.F0, s.BW); math.Abs(w) <= 1 {
			f1, f2 := BandpassFrequency(-1, s.F0, s.BW), BandpassFrequency(1, s.F0, s.BW)
			return s, fmt.Errorf("filter: rejection %d: frequency %g Hz lies in the passband %g..%g Hz", i+1, r.F, f1, f2)
		}
		if !(r.Attenuation > 0) || math.IsInf(r.Attenuation, 0) {
			return s, fmt.Errorf("filter: rejection %d: attenuation must be > 0 dB and finite, got %g dB", i+1, r.Attenuation)
		}
		if e := r.End; e != 0 && (math.IsNaN(e) || math.IsInf(e, 0) || (r.F > s.F0) != (e > r.F) || e <= 0) {
			return s, fmt.Errorf("filter: rejection %d: the band from %s must end farther from the passband, got an end at %s", i+1, physics.FormatFrequency(r.F, 6), physics.FormatFrequency(e, 6))
		}
	}
	if s.Order == 0 && len(s.Rejections) == 0 {
		return s, fmt.Errorf("filter: give an order (1..%d) or at least one rejection requirement to choose it from", MaxOrder)
	}
	return s, nil
}

// attenuation is the lossless prototype insertion loss (dB) of order n at
// normalised frequency omega for the normalised spec s.
func (s Spec) attenuation(n int, omega float64) (float64, error) {
	if s.Family == Butterworth {
		return ButterworthAttenuation(n, omega)
	}
	if len(s.RealPairs) > 0 {
		if err := checkZerosP(n, s.Zeros, s.RealPairs); err != nil {
			return 0, err
		}
		return chebAttP(n, s.Ripple, s.Zeros, s.RealPairs, omega), nil
	}
	return ChebyshevAttenuation(n, s.Ripple, s.Zeros, omega)
}

// MinOrder returns the smallest order whose lossless prototype meets every
// rejection requirement of s over its whole region of the mask (Spec.Mask):
// from the rejection frequency outwards to the end of the band of interest,
// lobes between and beyond the transmission zeros included. For each
// N = max(1, len(Zeros)), ..., MaxOrder the least prototype attenuation
// (ButterworthAttenuation, or ChebyshevAttenuation with the spec's zeros)
// on each region is located exactly (bandMinimum: bracketing on samples,
// then golden-section refinement) and compared with the requirement.
// Without zeros the attenuation grows outwards, so the result equals the
// closed forms ButterworthOrder and ChebyshevOrder at the rejection
// frequency. Rejections outside the model range (MaskRegion.OutsideModel)
// cannot be predicted and do not choose the order. The spec's Order field
// is ignored. It is an error if s is invalid, has no rejection requirement
// inside the model range, or needs an order above MaxOrder.
func (s Spec) MinOrder() (int, error) {
	s.Order = 0
	ns, err := s.normalized()
	if err != nil {
		return 0, err
	}
	return ns.minOrder()
}

// minOrder is MinOrder for a normalised spec.
func (ns Spec) minOrder() (int, error) {
	m := ns.mask()
	var regions []MaskRegion
	for _, g := range m.Regions {
		if !g.OutsideModel {
			regions = append(regions, g)
		}
	}
	if len(regions) == 0 {
		lo, hi := ModelRange(ns.F0)
		return 0, fmt.Errorf("filter: every rejection lies outside %s..%s (f0 -+ %g %%), where the coupling-matrix model does not hold, so none can choose the order; give the order",
			physics.FormatFrequency(lo, 6), physics.FormatFrequency(hi, 6), 100*ModelOffset)
	}
	lo := max(1, len(ns.Zeros)+2*len(ns.RealPairs))
	for n := lo; n <= MaxOrder; n++ {
		ok := true
		for _, g := range regions {
			a, err := ns.regionMinimum(n, g)
			if err != nil {
				return 0, err
			}
			if a < g.Attenuation-checkTol {
				ok = false
				break
			}
		}
		if ok {
			return n, nil
		}
	}
	return 0, fmt.Errorf("filter: the rejection requirements need an order above the maximum %d", MaxOrder)
}

// regionMinimum is the least lossless prototype attenuation (dB) of order n
// on mask region g.
func (ns Spec) regionMinimum(n int, g MaskRegion) (float64, error) {
	var err error
	att := func(w float64) float64 {
		a, e := ns.attenuation(n, w)
		if e != nil && err == nil {
			err = e
		}
		return a
	}
	_, a := bandMinimum(att, LowpassOmega(g.Low, ns.F0, ns.BW), LowpassOmega(g.High, ns.F0, ns.BW), ns.Zeros)
	return a, err
}
