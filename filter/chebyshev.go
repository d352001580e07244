package filter

import (
	"fmt"
	"math"
	"math/cmplx"
)

// The generalised Chebyshev filtering function of order N with finite
// transmission zeros Omega_1..Omega_nz (nz <= N, the remaining N - nz at
// infinity) is (Cameron 1999; Cameron, Kudsia & Mansour 2007, ch. 6)
//
//	C_N(Omega) = cosh( sum_{n=1..N} arccosh x_n(Omega) ),
//	x_n(Omega) = (Omega - 1/Omega_n) / (1 - Omega/Omega_n)   (x_n = Omega for Omega_n = Inf).
//
// In the passband |Omega| <= 1 every x_n lies in [-1, 1], so
// C_N = cos theta(Omega) with theta = sum arccos x_n, which falls
// monotonically from N pi at Omega = -1 to 0 at Omega = +1 (derived:
// dx_n/dOmega = (1 - 1/Omega_n^2)/(1 - Omega/Omega_n)^2 > 0 for |Omega_n| > 1).
// The N reflection zeros (C_N = 0) are where theta = (k - 1/2) pi and the
// N+1 ripple peaks (|C_N| = 1, the band edges included) where theta = k pi.
// Outside the passband |x_n| >= 1 and |C_N| = cosh(sum arccosh |x_n|).

// checkZeros validates finite transmission zeros for order n.
func checkZeros(n int, zeros []float64) error {
	if len(zeros) > n {
		return fmt.Errorf("filter: %d finite transmission zeros for order %d; at most N = %d (N-1 without a source-load coupling)", len(zeros), n, n)
	}
	for i, z := range zeros {
		if math.IsNaN(z) || math.IsInf(z, 0) {
			return fmt.Errorf("filter: transmission zero %d must be finite, got %g", i+1, z)
		}
		if math.Abs(z) <= 1 {
			return fmt.Errorf("filter: transmission zero %d at normalised frequency %g lies in the passband; zeros need |Omega| > 1", i+1, z)
		}
	}
	return nil
}

// xn is Cameron's x_n(Omega) for the zero z (Cameron 1999).
func xn(omega, z float64) float64 {
	return (omega - 1/z) / (1 - omega/z)
}

// theta returns sum_n arccos x_n(omega) for |omega| <= 1 (derived phase form
// of C_N, see above); the N - len(zeros) - 2 len(pairs) zeros at infinity
// contribute arccos(omega) each, and each pair of real-axis zeros
// s = -+sigma (Omega = +-j sigma) contributes 2 Re arccos x(omega) with the
// complex x of Omega_n = j sigma (the two terms are complex conjugates, so
// their sum is real; it falls monotonically from 2 pi at omega = -1 to 0
// at omega = +1, checked in the tests).
func theta(n int, zeros, pairs []float64, omega float64) float64 {
	acos := func(x float64) float64 { return math.Acos(math.Max(-1, math.Min(1, x))) }
	t := float64(n-len(zeros)-2*len(pairs)) * acos(omega)
	for _, z := range zeros {
		t += acos(xn(omega, z))
	}
	for _, sg := range pairs {
		t += 2 * real(cmplx.Acos(xnc(omega, sg)))
	}
	return t
}

// xnc is Cameron's x_n(Omega) for the complex zero Omega_n = j sigma.
func xnc(omega, sigma float64) complex128 {
	z := complex(0, sigma)
	w := complex(omega, 0)
	return (w - 1/z) / (1 - w/z)
}

// solveTheta finds omega in [-1, 1] with theta(omega) = target, target in
// [0, N pi], by bisection to the last bit (theta is monotonic decreasing).
func solveTheta(n int, zeros, pairs []float64, target float64) float64 {
	lo, hi := -1.0, 1.0
	for i := 0; i < 200; i++ {
		mid := 0.5 * (lo + hi)
		if mid == lo || mid == hi {
			break
		}
		if theta(n, zeros, pairs, mid) > target {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi)
}

// reflectionZeros returns the N real reflection zeros (roots of C_N) of the
// generalised Chebyshev function, ascending, accurate to about 1e-15.
func reflectionZeros(n int, zeros []float64) []float64 { return reflectionZerosP(n, zeros, nil) }

// reflectionZerosP is reflectionZeros with pairs of real-axis zeros.
func reflectionZerosP(n int, zeros, pairs []float64) []float64 {
	r := make([]float64, n)
	for k := n; k >= 1; k-- {
		r[n-k] = solveTheta(n, zeros, pairs, (float64(k)-0.5)*math.Pi)
	}
	return r
}

// ripplePeaks returns the N+1 normalised frequencies in [-1, 1] where
// |C_N| = 1 (band edges included), ascending; pairs are the real-axis zero
// pairs (sigma values).
func ripplePeaks(n int, zeros []float64, pairs ...float64) []float64 {
	r := make([]float64, n+1)
	r[0], r[n] = -1, 1
	for k := n - 1; k >= 1; k-- {
		r[n-k] = solveTheta(n, zeros, pairs, float64(k)*math.Pi)
	}
	return r
}

// logAbsC returns ln |C_N(omega)| of the generalised Chebyshev function
// (-Inf at a reflection zero, +Inf at a transmission zero); pairs are the
// real-axis zero pairs (sigma values), each adding 2 Re arccosh x(omega)
// outside the passband (the conjugate terms; derived as for theta).
func logAbsC(n int, zeros []float64, omega float64, pairs ...float64) float64 {
	if math.Abs(omega) <= 1 {
		return math.Log(math.Abs(math.Cos(theta(n, zeros, pairs, omega))))
	}
	a := float64(n-len(zeros)-2*len(pairs)) * math.Acosh(math.Abs(omega))
	for _, z := range zeros {
		if omega == z {
			return math.Inf(1)
		}
		a += math.Acosh(math.Abs(xn(omega, z)))
	}
	for _, sg := range pairs {
		a += 2 * math.Abs(real(cmplx.Acosh(xnc(omega, sg))))
	}
	// ln cosh a without overflow.
	return a + math.Log1p(math.Exp(-2*a)) - math.Ln2
}

// ChebyshevAttenuation returns the insertion loss in dB of the lossless
// generalised Chebyshev prototype of order n, passband ripple ripple dB and
// finite transmission zeros zeros (normalised, |Omega| > 1; nil for the
// classical all-pole Chebyshev response) at the normalised frequency omega:
//
//	L_A = 10 log10(1 + eps^2 C_N(omega)^2),  eps^2 = 10^(ripple/10) - 1
//
// (Cameron 1999; Matthaei, Young & Jones 1964, sec. 4.03 for the
// all-pole case). It returns +Inf at a transmission zero and is accurate to
// about 1e-12 dB (relative) elsewhere, with no overflow far into the
// stopband.
func ChebyshevAttenuation(n int, ripple float64, zeros []float64, omega float64) (float64, error) {
	if err := checkOrder(n); err != nil {
		return 0, err
	}
	if err := checkRipple(ripple); err != nil {
		return 0, err
	}
	if err := checkZeros(n, zeros); err != nil {
		return 0, err
	}
	if math.IsNaN(omega) {
		return 0, fmt.Errorf("filter: normalised frequency is NaN")
	}
	lc := logAbsC(n, zeros, omega)
	// 10 log10(1 + e^(2 ln eps + 2 ln C))
	x := math.Log(math.Expm1(ripple*math.Ln10/10)) + 2*lc
	if x > 700 {
		return 10 * x / math.Ln10, nil
	}
	return 10 * math.Log1p(math.Exp(x)) / math.Ln10, nil
}

// Characteristic returns the numerator and denominator polynomials of the
// generalised Chebyshev filtering function, C_N(Omega) = num(Omega)/den(Omega),
// as real coefficients in ascending powers of Omega, built by Cameron's
// recursion (Cameron 1999, the recursive technique; Cameron, Kudsia & Mansour
// 2007, ch. 6):
//
//	U_0 = 1, V_0 = 0,
//	U_n = (Omega - 1/Omega_n) U_{n-1} + s_n (Omega^2 - 1) V_{n-1},
//	V_n = (Omega - 1/Omega_n) V_{n-1} + s_n U_{n-1},
//	s_n = sqrt(1 - 1/Omega_n^2),
//
// where V carries an implied factor sqrt(Omega^2 - 1); num = U_N and
// den = prod_n (1 - Omega/Omega_n) over the finite zeros. zeros lists the
// finite transmission zeros (|Omega| > 1, at most n); the others are at
// infinity. The coefficients agree with the expansion of prod(Omega - r_k)
// over the reflection zeros to about 4e-15 (n = 12) and 3e-13 (n = 30) of
// the largest coefficient, but the roots of a high-degree polynomial in
// monomial form are ill-conditioned, which is why Synthesize locates the
// reflection zeros from the equivalent phase form; this function is the
// reference for that (see the tests) and for readers who want the
// polynomial itself.
func Characteristic(n int, zeros []float64) (num, den []float64, err error) {
	if err := checkOrder(n); err != nil {
		return nil, nil, err
	}
	if err := checkZeros(n, zeros); err != nil {
		return nil, nil, err
	}
	u := make([]float64, n+3)
	v := make([]float64, n+3)
	u[0] = 1
	un := make([]float64, n+3)
	vn := make([]float64, n+3)
	for i := 0; i < n; i++ {
		c0, s := 0.0, 1.0 // zero at infinity: c = Omega, s = 1
		if i < len(zeros) {
			c0 = -1 / zeros[i]
			s = math.Sqrt(1 - 1/(zeros[i]*zeros[i]))
		}
		// c(Omega) = c0 + Omega; (Omega^2 - 1) multiplies V in the U update.
		clear(un)
		clear(vn)
		for k := 0; k <= i; k++ { // deg U_i = i, deg V_i <= i-1
			a, b := u[k], v[k]
			un[k] += c0*a - s*b
			un[k+1] += a
			un[k+2] += s * b
			vn[k] += c0*b + s*a
			vn[k+1] += b
		}
		u, un = un, u
		v, vn = vn, v
	}
	num = trimReal(u, n+1)
	den = []float64{1}
	for _, z := range zeros {
		den = mulReal(den, []float64{1, -1 / z})
	}
	return num, den, nil
}

func trimReal(p []float64, n int) []float64 {
	if len(p) > n {
		p = p[:n]
	}
	return p
}

func mulReal(a, b []float64) []float64 {
	c := make([]float64, len(a)+len(b)-1)
	for i, x := range a {
		for j, y := range b {
			c[i+j] += x * y
		}
	}
	return c
}
