package bessel

import "math"

// This file holds J_0, J_1, Y_0 and Y_1 together for large arguments, the
// starting values of the recurrences of phase.go. For t >= hankelMin they
// share one sine and cosine and four short series, about a third of the
// cost of math.J0, J1, Y0 and Y1 called one by one.

const (
	// hankelMin is the smallest argument of hankel01: there the first
	// neglected term of the series, which bounds the remainder (DLMF
	// 10.17(iii) for real argument and order 0 or 1), is below 2e-17
	// (derived: the terms a_k(ν) t^-k shrink by about k/(2t) per term).
	hankelMin = 25
	// hankelTerms is the number of terms a_0 .. a_{hankelTerms-1} kept.
	hankelTerms = 26
)

// hankelCoef holds (-1)^floor(k/2) a_k(ν) of DLMF 10.17.1 for ν = 0 and 1,
// computed once at package initialisation and never modified afterwards:
// a_0 = 1, a_{k+1} = a_k (4ν^2 - (2k+1)^2) / (8 (k+1)).
var hankelCoef = func() (c [2][hankelTerms]float64) {
	for nu := range 2 {
		mu := float64(4 * nu * nu)
		a := 1.0
		for k := range hankelTerms {
			s := 1.0
			if (k/2)%2 == 1 {
				s = -1
			}
			c[nu][k] = s * a
			a *= (mu - float64((2*k+1)*(2*k+1))) / float64(8*(k+1))
		}
	}
	return c
}()

// hankel01 returns J_0(t), J_1(t), Y_0(t), Y_1(t) for t >= hankelMin from
// Hankel's expansions (DLMF 10.17.3, 10.17.4):
//
//	J_ν = sqrt(2/(π t)) (P_ν cos ω - Q_ν sin ω),
//	Y_ν = sqrt(2/(π t)) (P_ν sin ω + Q_ν cos ω),   ω = t - ν π/2 - π/4,
//
// P_ν = Σ (-1)^k a_{2k}(ν) t^-2k, Q_ν = Σ (-1)^k a_{2k+1}(ν) t^-(2k+1). For
// ν = 1, ω is ω_0 - π/2, so one sine and cosine of t serve all four. The
// error is a few units of 1e-16 of the amplitude sqrt(2/(π t))
// (TestHankel01 compares with the math package).
func hankel01(t float64) (j0, j1, y0, y1 float64) {
	u := 1 / t
	u2 := u * u
	c0, c1 := &hankelCoef[0], &hankelCoef[1]
	// Horner in u^2 from the last even and odd terms.
	const last = hankelTerms - 2 // even index
	p0, q0 := c0[last], c0[last+1]
	p1, q1 := c1[last], c1[last+1]
	for k := last - 2; k >= 0; k -= 2 {
		p0 = p0*u2 + c0[k]
		q0 = q0*u2 + c0[k+1]
		p1 = p1*u2 + c1[k]
		q1 = q1*u2 + c1[k+1]
	}
	q0 *= u
	q1 *= u
	s, c := math.Sincos(t)
	// cos ω_0 and sin ω_0 with ω_0 = t - π/4.
	co := (c + s) * (1 / math.Sqrt2)
	so := (s - c) * (1 / math.Sqrt2)
	amp := math.Sqrt(2 / (math.Pi * t))
	// ν = 0.
	j0 = amp * (p0*co - q0*so)
	y0 = amp * (p0*so + q0*co)
	// ν = 1: cos ω_1 = sin ω_0, sin ω_1 = -cos ω_0.
	j1 = amp * (p1*so + q1*co)
	y1 = amp * (-p1*co + q1*so)
	return j0, j1, y0, y1
}
