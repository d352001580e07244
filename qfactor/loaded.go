package qfactor

import (
	"fmt"
	"math"
)

// LoadedByCoupling returns the loaded Q of a resonator of unloaded Q q0
// coupled to one or more ports with coupling coefficients beta_i = Q0/Qext_i:
//
//	Q_L = Q0 / (1 + beta_1 + beta_2 + ...)
//
// (Pozar 2012, sec. 6.1 and 6.6: 1/Q_L = 1/Q0 + 1/Q_e and the coupling
// coefficient g = Q0/Q_e; the sum over ports is the same relation with one
// external Q per port). beta = 1 on one port is critical coupling. With no
// beta the result is q0.
//
// q0 must be > 0 (+Inf allowed; the result is then +Inf, since a finite
// external Q of a lossless resonator is an infinite beta: use
// LoadedByExternalQ) and each beta finite and >= 0; otherwise an error.
func LoadedByCoupling(q0 float64, beta ...float64) (float64, error) {
	if err := checkQ0(q0); err != nil {
		return 0, err
	}
	s := 1.0
	for i, b := range beta {
		if math.IsNaN(b) || math.IsInf(b, 0) || b < 0 {
			return 0, fmt.Errorf("qfactor: coupling coefficient beta of port %d must be finite and >= 0, got %g", i+1, b)
		}
		s += b
	}
	return q0 / s, nil
}

// LoadedByExternalQ returns the loaded Q of a resonator of unloaded Q q0
// coupled to ports of external Q qext_i:
//
//	1/Q_L = 1/Q0 + 1/Qext_1 + 1/Qext_2 + ...
//
// (Pozar 2012, sec. 6.1). q0 must be > 0 and each qext > 0; +Inf is allowed
// for both (no loss, an uncoupled port). Otherwise an error.
func LoadedByExternalQ(q0 float64, qext ...float64) (float64, error) {
	if err := checkQ0(q0); err != nil {
		return 0, err
	}
	s := 1 / q0
	for i, q := range qext {
		if math.IsNaN(q) || q <= 0 {
			return 0, fmt.Errorf("qfactor: external Q of port %d must be > 0, got %g", i+1, q)
		}
		s += 1 / q
	}
	return inv(s), nil
}

// Bandwidth returns the 3 dB (half-power) bandwidth in Hz of a resonance at
// frequency f with loaded Q ql, f/Q_L (Pozar 2012, sec. 6.1: the fractional
// half-power bandwidth is 1/Q). It is 0 for an infinite Q.
func Bandwidth(f, ql float64) float64 { return f / ql }

// Coupling returns the coupling coefficient beta = Q0/Qext of a port (Pozar
// 2012, sec. 6.6).
func Coupling(q0, qext float64) float64 { return q0 / qext }

func checkQ0(q0 float64) error {
	if math.IsNaN(q0) || q0 <= 0 {
		return fmt.Errorf("qfactor: unloaded Q must be > 0, got %g", q0)
	}
	return nil
}
