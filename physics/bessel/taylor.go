package bessel

import "math"

// This file holds the local solver: a Taylor expansion of a solution of
// Bessel's equation about a point, computed from the equation itself, in
// the manner of Glaser, Liu and Rokhlin (2007), Section 3.

// maxTerms bounds the number of Taylor coefficients of one expansion. The
// steps taken by the march need about 20 to 40 (terms shrink like
// maxRatio^k and like h^k/k!, see expansion.expand); the cap is a guard.
const maxTerms = 72

const (
	// coefTol is the relative size, against |y(x0)| + h|y'(x0)|, below
	// which two consecutive scaled coefficients end the series. 2^-60 is
	// about 9e-19: the truncation then moves a zero by well under an ulp.
	coefTol = 0x1p-60
	// minTerms is the index before which the series is never cut, so that
	// an accidental small coefficient (c_2 = 0 at a zero of y with x0 = n,
	// say) cannot end it early.
	minTerms = 6
)

// expansion is the Taylor polynomial y(x0 + h s) = sum_k c[k] s^k of a
// solution y of Bessel's equation of order n about x0, in the scaled
// variable s = (x - x0)/h.
type expansion struct {
	h     float64
	terms int  // number of coefficients in use
	ok    bool // whether the series reached coefTol within maxTerms
	c     [maxTerms]float64
}

// coefTables holds the k-dependent factors of the coefficient recurrence of
// expansion.expand, computed once at package initialisation and never
// modified afterwards: ninv = -1/((k+1)(k+2)), nk2 = -k^2/((k+1)(k+2)),
// nlead = -(2k+1)/(k+2) and k2 = k+2.
var coefTables = func() (t [maxTerms]struct{ ninv, nk2, nlead, k2 float64 }) {
	for k := range t {
		d := float64((k + 1) * (k + 2))
		t[k].ninv = -1 / d
		t[k].nk2 = -float64(k*k) / d
		t[k].nlead = -float64(2*k+1) / float64(k+2)
		t[k].k2 = float64(k + 2)
	}
	return t
}()

// expand sets e to the expansion about x0 > 0 of the solution with
// y(x0) = y0, y'(x0) = y1, in the variable s = (x - x0)/h, keeping terms
// until they fall below the relative size coefTol, and returns y and y'
// (with respect to x) at s = 1, summed as the terms are made. The first
// skipCheck coefficients are made without testing for the end, which
// saves work when the caller knows about how many are needed.
//
// Derived from Bessel's equation, DLMF 10.2.1,
//
//	x^2 y'' + x y' + (x^2 - n^2) y = 0:
//
// with x = x0 + t and y = sum a_k t^k, the coefficient of t^k gives
//
//	x0^2 (k+2)(k+1) a_{k+2} + x0 (k+1)(2k+1) a_{k+1}
//	    + (k^2 + x0^2 - n^2) a_k + 2 x0 a_{k-1} + a_{k-2} = 0,
//
// and in scaled form c_k = a_k h^k, with u = h/x0,
//
//	c_{k+2} = -(2k+1)/(k+2) u c_{k+1}
//	          - [u^2 (k^2 + x0^2 - n^2) c_k + 2 h^2 u c_{k-1} + h^2 u^2 c_{k-2}] / ((k+1)(k+2)).
//
// The only singular point of the equation in the finite plane is x = 0,
// so the series converges for |t| < x0 (Glaser, Liu and Rokhlin 2007,
// Section 3.1); the march keeps h <= maxRatio x0.
func (e *expansion) expand(nu2, x0, h, y0, y1 float64, skipCheck int) (y, dy float64) {
	e.h = h
	u := h / x0
	u2 := u * u
	nu := math.Sqrt(nu2)
	e0 := u2 * (x0 - nu) * (x0 + nu) // u^2 (x0^2 - n^2), exact near x0 = n
	r := 2 * h * h * u
	q := h * h * u2
	c := &e.c
	c[0] = y0
	c[1] = y1 * h
	tol := (math.Abs(c[0]) + math.Abs(c[1])) * coefTol
	tol2 := tol * tol
	var cm1, cm2 float64 // c_{k-1}, c_{k-2}
	ck, ck1 := c[0], c[1]
	// p = sum c_i and dp = sum i c_i over the coefficients made so far.
	p, dp := ck+ck1, ck1
	k := 0
	// Unchecked part, two coefficients per pass.
	lim := min(skipCheck, maxTerms-2) &^ 1
	for ; k < lim; k += 2 {
		f, g := &coefTables[k], &coefTables[k+1]
		// The terms in c_k, c_{k-1}, c_{k-2} are ready before c_{k+1}
		// is, so the chain from one coefficient to the next is a single
		// multiply-add.
		c2 := (f.nk2*u2+f.ninv*e0)*ck + f.ninv*(r*cm1+q*cm2) + f.nlead*u*ck1
		c3 := (g.nk2*u2+g.ninv*e0)*ck1 + g.ninv*(r*ck+q*cm1) + g.nlead*u*c2
		c[k+2], c[k+3] = c2, c3
		p += c2 + c3
		dp += f.k2*c2 + g.k2*c3
		cm2, cm1, ck, ck1 = ck, ck1, c2, c3
	}
	for ; k < maxTerms-2; k++ {
		f := &coefTables[k]
		rest := (f.nk2*u2+f.ninv*e0)*ck + f.ninv*(r*cm1+q*cm2)
		cn := f.nlead*u*ck1 + rest
		c[k+2] = cn
		p += cn
		dp += f.k2 * cn
		cm2, cm1 = cm1, ck
		ck, ck1 = ck1, cn
		if k >= minTerms && cn*cn+ck*ck < tol2 {
			e.terms, e.ok = k+3, true
			return p, dp / h
		}
	}
	e.terms, e.ok = maxTerms, false
	return p, dp / h
}

// eval returns y and y' (with respect to x) at x0 + h s by Horner's rule.
func (e *expansion) eval(s float64) (y, dy float64) {
	c := e.c[:e.terms]
	p := c[len(c)-1]
	var dp float64
	for k := len(c) - 2; k >= 0; k-- {
		dp = dp*s + p
		p = p*s + c[k]
	}
	return p, dp / e.h
}
