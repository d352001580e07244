package cavity

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"cylcav/physics"
)

// Constraint is the one dimension a sizing fixes besides the mode and the
// frequency: the ratio D/L of diameter to length, the diameter or the
// length. Build one with ByRatio, ByDiameter or ByLength; the zero value
// fixes nothing and Size rejects it.
type Constraint struct {
	kind  constraintKind
	value float64
}

type constraintKind uint8

const (
	byNone constraintKind = iota
	byRatio
	byDiameter
	byLength
)

// ByRatio fixes the ratio D/L = 2a/d of diameter to length (dimensionless,
// the abscissa of the classical mode chart).
func ByRatio(r float64) Constraint { return Constraint{byRatio, r} }

// ByDiameter fixes the diameter 2a in metres.
func ByDiameter(D float64) Constraint { return Constraint{byDiameter, D} }

// ByLength fixes the length d in metres.
func ByLength(L float64) Constraint { return Constraint{byLength, L} }

// String returns the constraint for people, as in "D/L = 1",
// "diameter 50 mm" or "length 20 mm".
func (c Constraint) String() string {
	switch c.kind {
	case byRatio:
		return fmt.Sprintf("D/L = %g", c.value)
	case byDiameter, byLength:
		return c.Name() + " " + shortLength(c.value)
	}
	return "no constraint"
}

// Value returns the fixed quantity (dimensionless for a ratio, metres
// otherwise).
func (c Constraint) Value() float64 { return c.value }

// Name returns "ratio", "diameter", "length", or "none" for the zero value.
func (c Constraint) Name() string {
	switch c.kind {
	case byRatio:
		return "ratio"
	case byDiameter:
		return "diameter"
	case byLength:
		return "length"
	}
	return "none"
}

// Ratio limits accepted by ByRatio in Size: from a long thin tube (D/L =
// 0.001) to a thin pill box (D/L = 1000).
const (
	MinRatio = 1e-3
	MaxRatio = 1e3
)

// ErrInfeasible marks a sizing target that no cavity can meet (a mode cut
// off at the given diameter, a length too short for p half-wavelengths, a
// diameter that fixes a TM_nm0 frequency elsewhere, or dimensions outside
// MinSize..MaxSize). Test with errors.Is; the message says what would work.
var ErrInfeasible = errors.New("sizing target cannot be met")

// infeasible returns an error wrapping ErrInfeasible with a message.
func infeasible(format string, a ...any) error {
	return &sizeError{msg: fmt.Sprintf(format, a...)}
}

type sizeError struct{ msg string }

func (e *sizeError) Error() string        { return "cavity: " + e.msg }
func (e *sizeError) Is(target error) bool { return target == ErrInfeasible }

// Size returns the cavity, filled with fill, in which mode m resonates at
// frequency f (Hz), with one more dimension fixed by by. It solves the
// resonance condition of Frequency,
//
//	k^2 = (x/a)^2 + (p pi/d)^2,  k = 2 pi f sqrt(mu_r eps_r) / c
//
// (Pozar, Microwave Engineering, 4th ed., sec. 6.4, whose worked example of
// a TE011 cavity with d = 2a is sized this way), for the free dimension:
//
//   - ByRatio(R), R = D/L = 2a/d: a = sqrt(x^2 + (p pi R/2)^2) / k and
//     d = 2a/R (derived); every mode and ratio has a solution.
//   - ByDiameter(D): a = D/2 and d = p pi / sqrt(k^2 - (x/a)^2) (derived).
//     The mode must be above cutoff, D > 2x/k; otherwise the error names
//     that least diameter. For p = 0 (TM_nm0) the frequency c x/(2 pi a
//     sqrt(mu_r eps_r)) does not depend on the length at all, so a fixed
//     diameter fixes the frequency: Size reports the frequency that
//     diameter gives and the diameter the target needs.
//   - ByLength(L): d = L and a = x / sqrt(k^2 - (p pi/L)^2) (derived). The
//     length must exceed p half-wavelengths in the fill, L > p pi/k, and the
//     error names that least length. For p = 0 any length works: the
//     result has radius x/k and the given length.
//
// Errors: an invalid mode or fill, f not finite and > 0, a constraint value
// not finite and > 0 (ratio in MinRatio..MaxRatio), or a target that
// cannot be met (errors.Is(err, ErrInfeasible)), including results outside
// MinSize..MaxSize. Accuracy: the returned cavity resonates at f to about
// 1e-15 relative beyond the accuracy of the Bessel zero.
func Size(m Mode, f float64, fill physics.Medium, by Constraint) (Cavity, error) {
	if err := m.Validate(); err != nil {
		return Cavity{}, err
	}
	if err := checkFill(fill); err != nil {
		return Cavity{}, err
	}
	if !(f > 0 && f <= math.MaxFloat64) {
		return Cavity{}, fmt.Errorf("cavity: frequency must be finite and > 0 Hz, got %g Hz", f)
	}
	v := by.value
	switch by.kind {
	case byNone:
		return Cavity{}, errors.New("cavity: no sizing constraint: give the ratio D/L, the diameter or the length")
	case byRatio:
		if !(v >= MinRatio && v <= MaxRatio) {
			return Cavity{}, fmt.Errorf("cavity: ratio D/L must be in %g..%g, got %g", MinRatio, MaxRatio, v)
		}
	default:
		if !(v > 0 && v <= math.MaxFloat64) {
			return Cavity{}, fmt.Errorf("cavity: %s must be finite and > 0 m, got %g m", by.Name(), v)
		}
	}
	x := m.Root()
	p := float64(m.P)
	k := 2 * math.Pi * f * fill.Index() / physics.SpeedOfLight
	label, freq := m.String(), shortFrequency(f)
	c := Cavity{Fill: fill}
	// sr is radiusFor's factor: the formulas above hold for the radius
	// a sr (sr = sqrt(eps_par/eps_perp) for TM modes in a uniaxial fill,
	// 1 otherwise; k is then taken with eps_perp).
	sr := radiusScale(fill, m.Family)
	switch by.kind {
	case byRatio:
		// Derived: with d = 2a/R, (p pi/d)^2 = (p pi R/(2a))^2, so
		// k^2 (a sr)^2 = x^2 + (p pi R sr/2)^2.
		c.Radius = math.Hypot(x, p*math.Pi*v*sr/2) / k / sr
		c.Length = 2 * c.Radius / v
	case byDiameter:
		a := v / 2
		kc := x / (a * sr)
		if m.P == 0 {
			f0 := frequency(physics.SpeedOfLight/(2*math.Pi*fill.Index()), x, a*sr, 0, 1)
			return Cavity{}, infeasible("%s has p = 0, so the diameter alone sets its frequency (the length does not enter): diameter %s gives %s, not %s; for %s use diameter %s with any length, or fix the length or the ratio D/L instead",
				label, shortLength(v), shortFrequency(f0), freq, freq, shortLength(2*x/k/sr))
		}
		if kc >= k {
			return Cavity{}, infeasible("diameter %s is too small for %s at %s: the mode is cut off; the diameter must exceed %s",
				shortLength(v), label, freq, shortLength(2*x/k/sr))
		}
		c.Radius = a
		c.Length = p * math.Pi / math.Sqrt((k-kc)*(k+kc))
	case byLength:
		beta := p * math.Pi / v
		if beta >= k {
			return Cavity{}, infeasible("length %s is too short for %s at %s: the length must exceed %s (p = %d half-wavelengths in the fill)",
				shortLength(v), label, freq, shortLength(p*math.Pi/k), m.P)
		}
		c.Radius = x / math.Sqrt((k-beta)*(k+beta)) / sr
		c.Length = v
	}
	if checkSize("radius", c.Radius) != nil || checkSize("length", c.Length) != nil {
		return Cavity{}, infeasible("%s at %s with %s gives radius %s and length %s; both must be in %s..%s",
			label, freq, by, shortLength(c.Radius), shortLength(c.Length), shortLength(MinSize), shortLength(MaxSize))
	}
	return c, nil
}

// shortFrequency and shortLength print values for error messages with six
// significant digits and no trailing zeros ("5 GHz", "27.4027 mm").
func shortFrequency(f float64) string { return trimZeros(physics.FormatFrequency(f, 6)) }
func shortLength(l float64) string    { return trimZeros(physics.FormatLength(l, 6)) }

func trimZeros(s string) string {
	num, unit, ok := strings.Cut(s, " ")
	if !ok || !strings.Contains(num, ".") {
		return s
	}
	num = strings.TrimRight(strings.TrimRight(num, "0"), ".")
	return num + " " + unit
}
