package filter

import (
	"fmt"
	"math"
)

// MaxOrder is the highest filter order (number of resonators) the package
// synthesises. Above it the polynomial root finding of the generalised
// Chebyshev synthesis is no longer checked, and no practical cavity filter
// needs more.
const MaxOrder = 30

// Ripple and return-loss limits of the Chebyshev prototypes. A ripple of
// 3 dB (return loss 3.02 dB) is the widest that still reads as a passband; a
// return loss above 80 dB (ripple below 4.3e-8 dB) is beyond any realisable
// tuning and makes the pole polynomial needlessly ill-conditioned.
const (
	MaxRipple     = 3.0  // dB
	MaxReturnLoss = 80.0 // dB
)

// dbPerNeper20 is 20 log10(e) = 8.6859 dB per neper; half of it, 4.343,
// appears in Cohn's loss estimate. 40 log10(e) = 17.3718 is the constant that
// Matthaei, Young & Jones (1964) print rounded as 17.37 in eq. (4.05-2).
const dbPerNeper20 = 20 / math.Ln10

// ReturnLossFromRipple returns the return loss in dB at the ripple peaks of a
// lossless equal-ripple passband whose insertion-loss ripple is ripple dB:
// RL = -10 log10(1 - 10^(-ripple/10)) (power conservation |S11|^2 + |S21|^2 = 1
// with |S21|^2 = 10^(-ripple/10) at the peaks).
//
// Special cases are:
//
//	ReturnLossFromRipple(0) = +Inf
//	ReturnLossFromRipple(x) = NaN for x < 0 or NaN
func ReturnLossFromRipple(ripple float64) float64 {
	if !(ripple >= 0) {
		return math.NaN()
	}
	return -10 * math.Log10(-math.Expm1(-ripple*math.Ln10/10))
}

// RippleFromReturnLoss is the inverse of ReturnLossFromRipple:
// ripple = -10 log10(1 - 10^(-RL/10)) dB. The relation is symmetric in the
// two quantities.
//
// Special cases are:
//
//	RippleFromReturnLoss(+Inf) = 0
//	RippleFromReturnLoss(x) = NaN for x < 0 or NaN
func RippleFromReturnLoss(returnLoss float64) float64 {
	return ReturnLossFromRipple(returnLoss)
}

// minReturnLoss is the return loss of the widest allowed ripple, MaxRipple.
var minReturnLoss = ReturnLossFromRipple(MaxRipple)

func checkOrder(n int) error {
	if n < 1 || n > MaxOrder {
		return fmt.Errorf("filter: order must be in 1..%d, got %d", MaxOrder, n)
	}
	return nil
}

func checkRipple(ripple float64) error {
	if !(ripple > 0 && ripple <= MaxRipple) {
		return fmt.Errorf("filter: passband ripple must be in (0, %g] dB, got %g dB", MaxRipple, ripple)
	}
	return nil
}

func checkReturnLoss(rl float64) error {
	if !(rl >= minReturnLoss && rl <= MaxReturnLoss) {
		return fmt.Errorf("filter: return loss must be in [%.4f, %g] dB, got %g dB", minReturnLoss, MaxReturnLoss, rl)
	}
	return nil
}

// ButterworthG returns the element values g_0, g_1, ..., g_{n+1} of the
// maximally flat lowpass prototype of order n with 3.01 dB attenuation at the
// normalised band edge Omega = 1 (Matthaei, Young & Jones 1964, eq. (4.05-1)):
//
//	g_0 = g_{n+1} = 1,  g_k = 2 sin((2k-1) pi / (2n)),  k = 1..n.
//
// n must be in 1..MaxOrder; otherwise an error is returned. The values are
// exact to rounding (about 1e-16 relative).
func ButterworthG(n int) ([]float64, error) {
	if err := checkOrder(n); err != nil {
		return nil, err
	}
	g := make([]float64, n+2)
	g[0], g[n+1] = 1, 1
	for k := 1; k <= n; k++ {
		g[k] = 2 * math.Sin(float64(2*k-1)*math.Pi/float64(2*n)) // MYJ eq. (4.05-1)
	}
	return g, nil
}

// ChebyshevG returns the element values g_0, ..., g_{n+1} of the equal-ripple
// lowpass prototype of order n with passband ripple ripple dB, the band edge
// Omega = 1 being the edge of the ripple band (Matthaei, Young & Jones 1964,
// eq. (4.05-2)):
//
//	beta  = ln coth(ripple / 17.37),  gamma = sinh(beta / (2n)),
//	a_k   = sin((2k-1) pi / (2n)),     b_k  = gamma^2 + sin^2(k pi / n),
//	g_1   = 2 a_1 / gamma,             g_k  = 4 a_{k-1} a_k / (b_{k-1} g_{k-1}),
//	g_{n+1} = 1 for n odd, coth^2(beta/4) for n even.
//
// The constant 17.37 is 40 log10(e) = 17.3718, used here unrounded (the
// printed tables of MYJ Table 4.05-2 used 17.37 and differ from these values
// by up to about 1.5e-4). n must be in 1..MaxOrder and ripple in
// (0, MaxRipple] dB; otherwise an error is returned. The values are exact to
// rounding (about 1e-15 relative).
func ChebyshevG(n int, ripple float64) ([]float64, error) {
	if err := checkOrder(n); err != nil {
		return nil, err
	}
	if err := checkRipple(ripple); err != nil {
		return nil, err
	}
	beta := -math.Log(math.Tanh(ripple / (2 * dbPerNeper20))) // ln coth(L_Ar/17.37), MYJ (4.05-2)
	gamma := math.Sinh(beta / float64(2*n))
	a := func(k int) float64 { return math.Sin(float64(2*k-1) * math.Pi / float64(2*n)) }
	b := func(k int) float64 {
		s := math.Sin(float64(k) * math.Pi / float64(n))
		return gamma*gamma + s*s
	}
	g := make([]float64, n+2)
	g[0] = 1
	g[1] = 2 * a(1) / gamma
	for k := 2; k <= n; k++ {
		g[k] = 4 * a(k-1) * a(k) / (b(k-1) * g[k-1])
	}
	if n%2 == 1 {
		g[n+1] = 1
	} else {
		t := 1 / math.Tanh(beta/4)
		g[n+1] = t * t
	}
	return g, nil
}

// ButterworthAttenuation returns the insertion loss in dB of the lossless
// Butterworth prototype of order n at the normalised lowpass frequency omega:
// L_A = 10 log10(1 + omega^(2n)) (Matthaei, Young & Jones 1964, sec. 4.03,
// with 3.01 dB at omega = 1). It is symmetric in omega. n must be in
// 1..MaxOrder.
func ButterworthAttenuation(n int, omega float64) (float64, error) {
	if err := checkOrder(n); err != nil {
		return 0, err
	}
	if math.IsNaN(omega) {
		return 0, fmt.Errorf("filter: normalised frequency is NaN")
	}
	x := 2 * float64(n) * math.Log(math.Abs(omega)) // ln omega^(2n)
	if x > 700 {
		return 10 * x / math.Ln10, nil
	}
	return 10 * math.Log1p(math.Exp(x)) / math.Ln10, nil
}

// ButterworthOrder returns the smallest order n whose Butterworth prototype
// (3.01 dB at the band edge) has at least attenuation dB of insertion loss at
// the normalised stopband frequency omegaS (|omegaS| > 1):
// n >= log10(10^(A/10) - 1) / (2 log10 |omegaS|), from Matthaei, Young & Jones
// 1964, sec. 4.03. attenuation must be > 0 dB and finite; an order above
// MaxOrder is an error.
func ButterworthOrder(omegaS, attenuation float64) (int, error) {
	w := math.Abs(omegaS)
	if !(w > 1) || math.IsInf(w, 0) {
		return 0, fmt.Errorf("filter: stopband frequency must satisfy 1 < |Omega| < Inf (normalised), got %g", omegaS)
	}
	if !(attenuation > 0) || math.IsInf(attenuation, 0) {
		return 0, fmt.Errorf("filter: required attenuation must be > 0 dB and finite, got %g dB", attenuation)
	}
	x := math.Log10(math.Expm1(attenuation*math.Ln10/10)) / (2 * math.Log10(w)) // MYJ sec. 4.03
	return orderFromReal(x)
}

// ChebyshevOrder returns the smallest order n of the classical Chebyshev
// prototype with passband ripple ripple dB that has at least attenuation dB
// of insertion loss at the normalised stopband frequency omegaS:
// n >= arccosh(sqrt((10^(A/10) - 1)/(10^(L_Ar/10) - 1))) / arccosh |omegaS|
// (Matthaei, Young & Jones 1964, sec. 4.03). An order above
// MaxOrder is an error. For prescribed transmission zeros use Spec.MinOrder.
func ChebyshevOrder(omegaS, attenuation, ripple float64) (int, error) {
	w := math.Abs(omegaS)
	if !(w > 1) || math.IsInf(w, 0) {
		return 0, fmt.Errorf("filter: stopband frequency must satisfy 1 < |Omega| < Inf (normalised), got %g", omegaS)
	}
	if !(attenuation > 0) || math.IsInf(attenuation, 0) {
		return 0, fmt.Errorf("filter: required attenuation must be > 0 dB and finite, got %g dB", attenuation)
	}
	if err := checkRipple(ripple); err != nil {
		return 0, err
	}
	num := math.Expm1(attenuation * math.Ln10 / 10)
	den := math.Expm1(ripple * math.Ln10 / 10)
	r := math.Sqrt(num / den)
	if r <= 1 {
		return 1, nil
	}
	x := math.Acosh(r) / math.Acosh(w) // MYJ sec. 4.03
	return orderFromReal(x)
}

// orderTol absorbs rounding in the closed-form order formulas, so that a
// specification met exactly by order n is not rounded up to n+1.
const orderTol = 1e-9

func orderFromReal(x float64) (int, error) {
	n := math.Ceil(x - orderTol)
	if n < 1 {
		n = 1
	}
	if n > MaxOrder {
		return 0, fmt.Errorf("filter: specification needs order %.0f, above the maximum %d", n, MaxOrder)
	}
	return int(n), nil
}

// LowpassOmega maps the frequency f (Hz) to the normalised lowpass frequency
// Omega = (f0/bw)(f/f0 - f0/f) of a bandpass filter of centre f0 and
// bandwidth bw (the lowpass-to-bandpass transformation, Hong & Lancaster
// 2001, sec. 3.2): the passband edges f1 < f2 with f2 - f1 = bw and
// f1 f2 = f0^2 map to -1 and +1, so f0 is the geometric centre.
// It returns NaN for f <= 0.
func LowpassOmega(f, f0, bw float64) float64 {
	if !(f > 0) {
		return math.NaN()
	}
	return (f0 / bw) * (f/f0 - f0/f)
}

// BandpassFrequency is the inverse of LowpassOmega: the positive frequency f
// (Hz) with LowpassOmega(f, f0, bw) = omega,
// f = f0 (x + sqrt(x^2 + 1)) with x = omega bw / (2 f0) (derived by solving the
// quadratic).
func BandpassFrequency(omega, f0, bw float64) float64 {
	x := omega * bw / (2 * f0)
	if x >= 0 {
		return f0 * (x + math.Hypot(x, 1))
	}
	return f0 / (math.Hypot(x, 1) - x) // same root, without cancellation
}
