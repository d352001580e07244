package axisym

import (
	"fmt"
	"math"
)

// Coupling is the coupling coefficient of two equal resonators joined by an
// aperture (for example two TE011 cells and an iris), from the pair of
// resonances of the whole body that their two equal resonances split into.
type Coupling struct {
	// K is the magnitude of the coupling coefficient,
	// (fh^2 - fl^2) / (fh^2 + fl^2) with fh the higher and fl the lower
	// frequency of the pair.
	K float64
	// Change is the convergence estimate of K: |K - K of the smaller model|
	// (both frequencies with two thirds of the modes); +Inf when either
	// resonance had no partner there.
	Change float64
}

// CouplingOf returns the coupling coefficient of two synchronously tuned
// resonators from the two resonances a and b of the coupled pair (the even
// and the odd resonance of a body mirror-symmetric in z):
//
//	k = (fh^2 - fl^2) / (fh^2 + fl^2),
//
// fh and fl the higher and lower of the two frequencies (J.-S. Hong and
// M. J. Lancaster, Microstrip Filters for RF/Microwave Applications, Wiley
// 2001, sec. 8.2, the synchronously tuned pair; recalled from memory). The
// formula holds for either kind of coupling, electric or magnetic; K is the
// magnitude, since the sign depends on the reference planes chosen for the
// two resonators. The pair must be of one family: TE0 and TM0 resonances do
// not couple at n = 0, so a mixed pair is an error; so is a pair that is
// not adjacent in its family's frequency order (Index differing by one),
// since a resonance between them would belong to the coupled system and
// the two-resonator formula would not hold.
//
// The formula assumes that the pair comes from two equal resonators and
// that the other resonances are far away compared with the split; which
// two resonances of a body form such a pair is the caller's knowledge (for
// two cells joined by an iris, the two that continue from one cell mode).
func CouplingOf(a, b Resonance) (Coupling, error) {
	if a.Family != b.Family {
		return Coupling{}, fmt.Errorf("axisym: coupling: a %v0 and a %v0 resonance do not couple at n = 0", a.Family, b.Family)
	}
	if d := a.Index - b.Index; d != 1 && d != -1 {
		return Coupling{}, fmt.Errorf("axisym: coupling: the two resonances of a pair are neighbours in their family, got %v0 numbers %d and %d", a.Family, a.Index, b.Index)
	}
	if !(a.Frequency > 0 && b.Frequency > 0) {
		return Coupling{}, fmt.Errorf("axisym: coupling: frequencies must be positive, got %g Hz and %g Hz", a.Frequency, b.Frequency)
	}
	c := Coupling{K: splitCoupling(a.Frequency, b.Frequency), Change: math.Inf(1)}
	if a.Coarse > 0 && b.Coarse > 0 {
		c.Change = math.Abs(c.K - splitCoupling(a.Coarse, b.Coarse))
	}
	return c, nil
}

// splitCoupling is |f1^2 - f2^2| / (f1^2 + f2^2) (Hong and Lancaster
// 2001, sec. 8.2), written as |f1 - f2| (f1 + f2) / (f1^2 + f2^2) so
// that the small difference is formed once, from the frequencies
// themselves.
func splitCoupling(f1, f2 float64) float64 {
	return math.Abs(f1-f2) * (f1 + f2) / (f1*f1 + f2*f2)
}
