package filter

import (
	"fmt"
	"math"
	"slices"
)

// The specification mask: the regions and levels of the response plane that
// decide pass or fail. Spec.Mask is the one place they are made; order
// selection (Spec.MinOrder), the pass/fail table (Design.Check), the
// stopbands that Realise checks the cavities' spurious modes against, and
// the response plot all read it.

// ModelOffset is the largest fractional offset |f/f0 - 1| at which the
// coupling-matrix model is used for a verdict: the band of interest of a
// rejection ends at f0 (1 + ModelOffset) above the passband and at
// f0 (1 - ModelOffset) below it. The model couples ideal resonators through
// frequency-independent inverters; real irises, holes and probes change
// their coupling with frequency, and waveguide cavities do not follow the
// lumped resonator's frequency law, so the predicted stopband drifts from a
// real filter's as the offset grows; a cavity's own spurious modes (which
// the model leaves out) usually begin within the same distance. The value,
// 20 %, is common practice for coupled-cavity filters (the spurious-free
// range is usually quoted within some +-20 % of the band; it equals
// DefaultSpuriousWindow so that Realise searches the same range).
const ModelOffset = 0.2

// MaxModelFBW is the largest fractional bandwidth bw/f0 for which the
// coupling-matrix model is offered as a design of a coupled-cavity filter:
// the frequency-invariant couplings and the lowpass-to-bandpass mapping
// are narrowband approximations, commonly taken to hold up to about 10 %
// bandwidth (common practice; wider filters need couplings modelled with
// their frequency dependence). The library computes any bandwidth below
// f0; commands refuse wider ones (see ModelFBWError).
const MaxModelFBW = 0.1

// ModelFBWError returns an error when the fractional bandwidth bw/f0 exceeds
// MaxModelFBW, nil otherwise.
func ModelFBWError(f0, bw float64) error {
	if fbw := bw / f0; fbw > MaxModelFBW {
		return fmt.Errorf("filter: fractional bandwidth %.4g %% is above %g %%, the limit of the narrowband coupling-matrix model (frequency-invariant couplings)", 100*fbw, 100*MaxModelFBW)
	}
	return nil
}

// ModelRange returns the frequency range lo..hi (Hz) of the band of interest
// of a filter centred on f0: f0 (1 -+ ModelOffset).
func ModelRange(f0 float64) (lo, hi float64) {
	return f0 * (1 - ModelOffset), f0 * (1 + ModelOffset)
}

// MaskRegion is one rejection requirement as a region of the response
// plane: the insertion loss must be at least Attenuation dB at every
// frequency from F outwards to the end of the band of interest, that is on
// Low..High (Hz, Low = F above the passband, High = F below it).
type MaskRegion struct {
	// Rejection is the index of the requirement in Spec.Rejections.
	Rejection int
	// F is the stated frequency, Hz: the inner edge of the region.
	F float64
	// Low and High bound the region, Hz. For a region outside the model
	// range Low = High = F.
	Low, High float64
	// Attenuation is the required insertion loss, dB.
	Attenuation float64
	// Above is true for a region above the passband.
	Above bool
	// Bounded is true when the region ends at the rejection's End rather
	// than at the end of the band of interest.
	Bounded bool
	// OutsideModel is true when F lies beyond the model range (ModelRange):
	// the coupling-matrix model does not predict the response there, so
	// the requirement cannot be checked.
	OutsideModel bool
}

// Mask is the specification as regions of the response plane.
type Mask struct {
	// Passband holds the band edges f1 and f2, Hz.
	Passband [2]float64
	// ReturnLoss is the return loss required across the passband, dB;
	// zero for a Butterworth response, which states none.
	ReturnLoss float64
	// Model is the band of interest, Hz (ModelRange).
	Model [2]float64
	// Regions holds one region per rejection requirement, in the order of
	// Spec.Rejections.
	Regions []MaskRegion
}

// Mask returns the mask of specification s: the passband and its return
// loss, and one region per rejection reaching from the rejection frequency
// outwards to the end of the band of interest (ModelRange), since a
// rejection quoted at one frequency is meant to hold beyond it (common
// practice). Errors: an invalid specification (the order may be 0).
func (s Spec) Mask() (Mask, error) {
	ns, err := s.normalized()
	if err != nil {
		return Mask{}, err
	}
	return ns.mask(), nil
}

// Mask returns the mask of the design's specification (see Spec.Mask).
func (d *Design) Mask() Mask { return d.Spec.mask() }

// mask is Mask for a normalised spec.
func (s Spec) mask() Mask {
	m := Mask{
		Passband: [2]float64{BandpassFrequency(-1, s.F0, s.BW), BandpassFrequency(1, s.F0, s.BW)},
	}
	if s.Family == Chebyshev {
		m.ReturnLoss = s.ReturnLoss
	}
	lo, hi := ModelRange(s.F0)
	m.Model = [2]float64{lo, hi}
	for i, r := range s.Rejections {
		g := MaskRegion{Rejection: i, F: r.F, Attenuation: r.Attenuation, Above: r.F > s.F0}
		switch {
		case g.Above && r.F < hi:
			g.Low, g.High = r.F, hi
			if r.End > 0 && r.End < hi {
				g.High, g.Bounded = r.End, true
			}
		case !g.Above && r.F > lo:
			g.Low, g.High = lo, r.F
			if r.End > lo {
				g.Low, g.Bounded = r.End, true
			}
		default:
			g.Low, g.High, g.OutsideModel = r.F, r.F, true
		}
		m.Regions = append(m.Regions, g)
	}
	return m
}

// bandMinimum returns the smallest value of f on the interval between a
// and b (normalised Omega, both on the same side of the passband, |Omega| >
// 1) and where it is taken. breaks are points where f may be singular or
// have a sharp peak (transmission zeros); those inside the interval split
// it into segments.
//
// Method: each segment is sampled at bandSamples points spaced uniformly in
// ln|Omega|, so that a segment far into the stopband is covered as densely
// in relative terms as one near the band edge; every sample that is no
// larger than its neighbours brackets a local minimum, which golden-section
// search then refines to rounding (Brent 1973, "Algorithms for Minimization
// without Derivatives", ch. 5; the bracket shrinks by 0.618 per step).
// The ends of the interval count as candidates. A minimum is missed only if
// two minima fall between neighbouring samples; the lobes of a filter
// response between transmission zeros are far wider than 1/64 of the
// interval (the dense-grid tests of Check and MinOrder confirm the minima
// found).
func bandMinimum(f func(float64) float64, a, b float64, breaks []float64) (wmin, fmin float64) {
	if a > b {
		a, b = b, a
	}
	if a == b {
		return a, f(a)
	}
	nodes := []float64{a, b}
	for _, z := range breaks {
		if z > a && z < b {
			nodes = append(nodes, z)
		}
	}
	slices.Sort(nodes)
	nodes = slices.Compact(nodes)
	var xs []float64
	for k := 0; k+1 < len(nodes); k++ {
		u, v := nodes[k], nodes[k+1]
		lu, lv := math.Log(math.Abs(u)), math.Log(math.Abs(v))
		sign := math.Copysign(1, u+v)
		for i := 0; i < bandSamples; i++ {
			if k > 0 && i == 0 {
				continue // the shared node is the last point of the previous segment
			}
			t := float64(i) / float64(bandSamples-1)
			x := sign * math.Exp(lu+(lv-lu)*t)
			switch i {
			case 0:
				x = u
			case bandSamples - 1:
				x = v
			}
			xs = append(xs, x)
		}
	}
	return gridMinimum(f, xs)
}

// bandSamples is the number of samples per segment of bandMinimum: lobes
// of a response between two transmission zeros are smooth, and 64 samples
// put at least several points on each (a bracket needs three).
const bandSamples = 64

// goldenMin minimises f on [a, b] by golden-section search (Brent 1973,
// ch. 5) until the bracket is at rounding level, and returns the best point
// seen.
func goldenMin(f func(float64) float64, a, b float64) (x, y float64) {
	const r = 0.6180339887498949 // (sqrt 5 - 1)/2
	c, d := b-r*(b-a), a+r*(b-a)
	fc, fd := f(c), f(d)
	for i := 0; i < 200 && math.Abs(b-a) > 4e-16*math.Max(math.Abs(a), math.Abs(b)); i++ {
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
	if fc <= fd {
		return c, fc
	}
	return d, fd
}
