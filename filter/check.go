package filter

import (
	"fmt"
	"math"
	"slices"
)

// Check is one line of a specification check: a named requirement, the
// value required, the value achieved by the computed response, and whether
// it passes. Values are in dB. AtLeast tells the direction: true when the
// achieved value must be >= Required (return loss, rejection), false when
// it must be <= Required (ripple).
type Check struct {
	Name     string
	F        float64 // Hz for a spot requirement, 0 for a passband-wide one
	Required float64 // dB
	Achieved float64 // dB
	AtLeast  bool
	Pass     bool
}

// checkTol is the margin, in dB, by which an achieved value may miss the
// requirement and still pass: rounding only (the lossless design meets its
// return loss exactly at the ripple peaks).
const checkTol = 1e-9

// passbandSamples is the number of uniformly spaced passband samples per
// resonator used by Check, on top of the exact ripple peaks and reflection
// zeros.
const passbandSamples = 64

// Check evaluates the design with unloaded quality factors q0 (one per
// resonator, empty for lossless) against its specification and returns the
// pass/fail table, in this fixed order:
//
//  1. "return loss": the smallest passband return loss, required >= the
//     spec's ReturnLoss (Butterworth: >= 3.0103 dB, the band-edge value);
//  2. "passband ripple": the spread max - min of the passband insertion
//     loss, required <= the spec's Ripple (Butterworth: 3.0103 dB);
//  3. "rejection" at each Spec.Rejections frequency, in the given order:
//     the insertion loss, required >= its Attenuation.
//
// The passband is sampled at the exact ripple peaks and reflection zeros of
// the lossless response plus passbandSamples*N uniform points in Omega, so
// the lossless minimum return loss and maximum ripple are found exactly.
// With loss the ripple check measures the whole variation of insertion loss
// across the band (dissipation rounds the band edges), which is what a
// measured filter is held to.
func (d *Design) Check(q0 []float64) ([]Check, error) {
	n := d.Spec.Order
	var ws []float64
	ws = append(ws, d.ReflectionZeros...)
	if d.Spec.Family == Chebyshev {
		ws = append(ws, ripplePeaks(n, d.Zeros)...)
	} else {
		ws = append(ws, -1, 1)
	}
	m := passbandSamples * n
	for i := 0; i <= m; i++ {
		ws = append(ws, -1+2*float64(i)/float64(m))
	}
	slices.Sort(ws)
	freqs := make([]float64, len(ws))
	for i, w := range ws {
		freqs[i] = BandpassFrequency(w, d.Spec.F0, d.Spec.BW)
	}
	pts, err := d.Response(freqs, q0)
	if err != nil {
		return nil, err
	}
	minRL, minIL, maxIL := math.Inf(1), math.Inf(1), math.Inf(-1)
	for _, p := range pts {
		minRL = math.Min(minRL, p.ReturnLoss())
		il := p.InsertionLoss()
		minIL = math.Min(minIL, il)
		maxIL = math.Max(maxIL, il)
	}
	reqRL, reqRipple := d.Spec.ReturnLoss, d.Spec.Ripple
	if d.Spec.Family == Butterworth {
		reqRL = ReturnLossFromRipple(10 * math.Log10(2))
		reqRipple = 10 * math.Log10(2)
	}
	checks := []Check{
		{Name: "return loss", Required: reqRL, Achieved: minRL, AtLeast: true},
		{Name: "passband ripple", Required: reqRipple, Achieved: maxIL - minIL},
	}
	if len(d.Spec.Rejections) > 0 {
		rf := make([]float64, len(d.Spec.Rejections))
		for i, r := range d.Spec.Rejections {
			rf[i] = r.F
		}
		rp, err := d.Response(rf, q0)
		if err != nil {
			return nil, err
		}
		for i, r := range d.Spec.Rejections {
			checks = append(checks, Check{Name: "rejection", F: r.F, Required: r.Attenuation,
				Achieved: rp[i].InsertionLoss(), AtLeast: true})
		}
	}
	for i := range checks {
		c := &checks[i]
		if c.AtLeast {
			c.Pass = c.Achieved >= c.Required-checkTol
		} else {
			c.Pass = c.Achieved <= c.Required+checkTol
		}
	}
	return checks, nil
}

// CohnLoss returns Cohn's estimate of the midband insertion loss, in dB, of
// a direct-coupled resonator filter with lowpass element values
// g = [g_0, ..., g_{N+1}], fractional bandwidth fbw and unloaded quality
// factors q0 (one per resonator, or a single value for all):
//
//	IL(f0) ~= 4.343 sum_{i=1..N} g_i / (fbw Q0_i)  dB
//
// (S. B. Cohn, "Dissipation loss in multiple-coupled-resonator filters",
// Proc. IRE 47 (1959) 1342-1348; 4.343 = 10 log10 e), the dissipation
// loss on top of the lossless midband loss. It is first order in 1/Q0 and
// assumes a matched midband: against the exact response (Response) it is
// within 1 % for odd N, and for even N with ripple up to 0.01 dB, at losses
// below 1 dB; for even N it overestimates as the ripple grows (2 % at
// 0.1 dB, 10 % at 0.5 dB), the midband then being a ripple peak. It applies
// to all-pole designs (for which Design.G is set).
func CohnLoss(g []float64, fbw float64, q0 []float64) (float64, error) {
	if err := checkG(g); err != nil {
		return 0, err
	}
	if err := checkFBW(fbw); err != nil {
		return 0, err
	}
	n := len(g) - 2
	if len(q0) != 1 && len(q0) != n {
		return 0, fmt.Errorf("filter: need 1 or %d unloaded Q values, got %d", n, len(q0))
	}
	sum := 0.0
	for i := 1; i <= n; i++ {
		q := q0[0]
		if len(q0) == n {
			q = q0[i-1]
		}
		if !(q > 0) {
			return 0, fmt.Errorf("filter: unloaded Q of resonator %d must be > 0, got %g", i, q)
		}
		sum += g[i] / q
	}
	return dbPerNeper20 / 2 * sum / fbw, nil // Cohn 1959: 4.343 sum g_i/(fbw Q0)
}
