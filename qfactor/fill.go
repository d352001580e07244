package qfactor

import (
	"fmt"
	"math"
)

// Fill holds the loss tangents of a homogeneous fill occupying the whole
// cavity. Its permittivity and permeability (the real parts) belong to the
// cavity.Cavity; Fill carries only the losses.
//
// The zero value is a lossless fill.
type Fill struct {
	TanDelta  float64 // electric loss tangent, imaginary over real part of eps
	TanDeltaM float64 // magnetic loss tangent, imaginary over real part of mu
}

// MaxTanDelta is the largest loss tangent Fill accepts. The perturbation
// model behind Q is first order in the loss tangent: its relative error is
// of the order of tan delta, so results beyond about 0.01 are estimates.
const MaxTanDelta = 1.0

// Validate reports whether both loss tangents lie in 0..MaxTanDelta.
func (f Fill) Validate() error {
	for _, q := range []struct {
		name string
		v    float64
	}{{"electric loss tangent tand", f.TanDelta}, {"magnetic loss tangent tandm", f.TanDeltaM}} {
		if math.IsNaN(q.v) || q.v < 0 || q.v > MaxTanDelta {
			return fmt.Errorf("qfactor: %s must be in 0..%g, got %g", q.name, MaxTanDelta, q.v)
		}
	}
	return nil
}

// Q returns the Q of a full fill,
//
//	1/Q_fill = tan delta_e + tan delta_m,
//
// the same for every mode. The electric term is Pozar's Q_d = 1/tan delta
// (Pozar 2012, sec. 6.3, eq. (6.48) as recalled from memory); the magnetic
// term is derived the same way: the fill dissipates omega eps_i |E|^2/2 and
// omega mu_i |H|^2/2 per unit volume (eps_i, mu_i the imaginary parts), and
// at resonance the time-averaged electric and magnetic energies are equal,
// each half of W, so P_fill = omega W (tan delta_e + tan delta_m).
//
// Q returns +Inf for a lossless fill and an error when a loss tangent is
// outside 0..MaxTanDelta.
func (f Fill) Q() (float64, error) {
	if err := f.Validate(); err != nil {
		return 0, err
	}
	return inv(f.TanDelta + f.TanDeltaM), nil
}

// Combine returns the Q of several independent losses acting together,
// 1/Q = sum of 1/Q_i (Pozar 2012, sec. 6.3, eq. (6.49) as recalled from
// memory, for Q0 = 1/(1/Q_wall + 1/Q_fill)). Infinite terms contribute
// nothing; the result is +Inf when every term is. Combine with no argument
// returns +Inf.
func Combine(q ...float64) float64 {
	s := 0.0
	for _, v := range q {
		s += 1 / v
	}
	return inv(s)
}
