package filter

import (
	"errors"
	"fmt"
	"math"
	"slices"
)

// Sweep defaults and limits.
const (
	// DefaultSpan is the half-width of the default frequency range in the
	// normalised lowpass frequency: Omega from -DefaultSpan to +DefaultSpan
	// (three bandwidths around f0 for a narrow band).
	DefaultSpan = 3.0
	// MaxSpan is the largest span SweepRange accepts.
	MaxSpan = 1000.0
	// MaxSweepPoints bounds the number of points of a sweep.
	MaxSweepPoints = 1000001
)

// sweepMargin is the factor by which SweepRange reaches beyond the outermost
// rejection frequency or transmission zero (in Omega), so that the point
// and the response around it are both inside the range.
const sweepMargin = 1.15

// SweepRange returns the frequency range lo..hi (Hz) that covers the
// normalised lowpass frequencies -span..+span of design d (span > 1, at most
// MaxSpan; span 3 shows three bandwidths), widened to hold every rejection
// frequency and transmission zero of the design with a margin of 15 % in
// Omega. The range is geometrically centred on f0 (LowpassOmega maps
// lo and hi to -span and +span before any widening).
func SweepRange(d *Design, span float64) (lo, hi float64, err error) {
	if d == nil || d.Spec.Order < 1 {
		return 0, 0, errors.New("filter: SweepRange needs a synthesised design (from Synthesize)")
	}
	if !(span > 1 && span <= MaxSpan) {
		return 0, 0, fmt.Errorf("filter: sweep span must be > 1 and <= %g (normalised Omega, 1 = the band edge), got %g", MaxSpan, span)
	}
	wlo, whi := -span, span
	ws := slices.Clone(d.Zeros)
	for _, r := range d.Spec.Rejections {
		ws = append(ws, LowpassOmega(r.F, d.Spec.F0, d.Spec.BW))
	}
	for _, w := range ws {
		wlo = math.Min(wlo, sweepMargin*w)
		whi = math.Max(whi, sweepMargin*w)
	}
	return BandpassFrequency(wlo, d.Spec.F0, d.Spec.BW), BandpassFrequency(whi, d.Spec.F0, d.Spec.BW), nil
}

// Sweep returns n frequencies (Hz) spaced uniformly from lo to hi, both
// included: 0 < lo < hi, 2 <= n <= MaxSweepPoints. The last value is hi
// exactly.
func Sweep(lo, hi float64, n int) ([]float64, error) {
	if !(lo > 0) || !(hi > lo) || math.IsInf(hi, 0) {
		return nil, fmt.Errorf("filter: sweep needs 0 < lo < hi < Inf Hz, got %g..%g Hz", lo, hi)
	}
	if n < 2 || n > MaxSweepPoints {
		return nil, fmt.Errorf("filter: sweep needs 2..%d points, got %d", MaxSweepPoints, n)
	}
	fs := make([]float64, n)
	for i := range fs {
		fs[i] = lo + (hi-lo)*float64(i)/float64(n-1)
	}
	fs[n-1] = hi
	return fs, nil
}
