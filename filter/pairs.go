package filter

import (
	"fmt"
	"math"
)

// Pairs of real-axis transmission zeros, s = -+sigma in the lowpass
// variable s = j Omega (Omega = +-j sigma), for group-delay equalisation.
// Cameron's generalised Chebyshev synthesis takes them like the zeros on
// the imaginary axis: x_n(Omega) of the filtering function with the
// complex Omega_n = +-j sigma, the conjugate terms of a pair adding to a
// real phase (Cameron 1999; Cameron, Kudsia & Mansour 2007, ch. 6, complex
// transmission zeros; recalled from memory). P(s) gains the real factor
// s^2 - sigma^2, whose roots are symmetric about the imaginary axis as the
// unitarity of the S-matrix needs, and in Omega the real polynomial
// P_O(Omega) gains Omega^2 + sigma^2 (P(j Omega) = j^(a+nz) P_O(Omega) with
// nz counting every finite zero, derived), so the transversal synthesis,
// which needs only real F_O and P_O on the real axis, applies unchanged.
// Such zeros do not null the transmission anywhere on the real frequency
// axis: they flatten the group delay in the passband and cost rejection.

// MaxPairSigma bounds sigma of a real-axis pair: a pair far from the origin
// acts like two zeros at infinity (no effect on the passband).
const MaxPairSigma = 100.0

// checkZerosP validates the finite zeros of order n: the real-frequency
// zeros and the real-axis pairs (each counting two).
func checkZerosP(n int, zeros, pairs []float64) error {
	if len(pairs) == 0 {
		return checkZeros(n, zeros)
	}
	for i, sg := range pairs {
		if !(sg > 0 && sg <= MaxPairSigma) {
			return fmt.Errorf("filter: real-axis zero pair %d: sigma must be > 0 and <= %g (normalised), got %g", i+1, MaxPairSigma, sg)
		}
	}
	if len(zeros)+2*len(pairs) > n {
		return fmt.Errorf("filter: %d transmission zeros and %d real-axis pairs (%d zeros) for order %d; at most N = %d zeros in all",
			len(zeros), len(pairs), len(zeros)+2*len(pairs), n, n)
	}
	return checkZeros(n, zeros)
}

// prodEvalZ returns P_O(z) and P_O'(z) of the monic real polynomial with
// the real roots zeros and the root pairs +-j sigma, in product form.
func prodEvalZ(zeros, pairs []float64, z complex128) (v, d complex128) {
	v, d = prodEvalReal(zeros, z)
	for _, sg := range pairs {
		q := z*z + complex(sg*sg, 0)
		v, d = v*q, d*q+v*2*z
	}
	return v, d
}

// chebAttP is ChebyshevAttenuation with real-axis pairs, for validated
// arguments.
func chebAttP(n int, ripple float64, zeros, pairs []float64, omega float64) float64 {
	lc := logAbsC(n, zeros, omega, pairs...)
	x := math.Log(math.Expm1(ripple*math.Ln10/10)) + 2*lc
	if x > 700 {
		return 10 * x / math.Ln10
	}
	return 10 * math.Log1p(math.Exp(x)) / math.Ln10
}
