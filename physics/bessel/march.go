package bessel

import (
	"fmt"
	"math"
)

// A march walks along the positive real axis through the zeros of J_n and
// J'_n of one order n in increasing order, alternating between the two
// kinds: for n >= 1, j'_{n,1} < j_{n,1} < j'_{n,2} < j_{n,2} < ... (DLMF
// 10.21.3), and for n = 0 (x = 0 excluded) j_{0,1} < j'_{0,1} < j_{0,2} <
// ... (j'_{0,m} = j_{1,m}, DLMF 10.6.3, with DLMF 10.21.2).
//
// At each step it expands the solution about the current point with
// expansion.expand, takes a first approximation of the next zero from
// guess, and polishes it with a fifth-order (Schroeder) iteration whose
// derivatives come from Bessel's equation. The zero found becomes the next
// expansion point, with value and slope known exactly up to a positive
// factor: (0, +-1) at a zero of J_n, (+-1, 0) at a zero of J'_n.
type march struct {
	n       int
	nu, nu2 float64 // n and n^2
	// The current point is x = xh + xl, a double-double, so that rounding
	// x to float64 at every step does not accumulate along the march.
	xh, xl float64
	y, dy  float64 // J_n(x) and J'_n(x), up to one positive factor
	prime  bool    // whether the next zero sought is one of J'_n
	j, jp  []float64
	e      expansion
}

const (
	// maxRatio bounds a step h against its expansion point x0: the Taylor
	// series about x0 converges for |h| < x0, and terms shrink at least
	// like maxRatio^k. Steps longer than this (only below x = 12 or so,
	// for orders n < 6) are split into substeps that find no zero.
	maxRatio = 0.25
	// maxReach bounds the polished zero, in units of the distance to the
	// first approximation (which is where the series was truncated to
	// coefTol): the tail error grows like maxReach^terms, at most a few
	// hundred times coefTol, still far below rounding.
	maxReach = 1.25
	// polishTol ends the polish: a fifth-order step whose Newton part r
	// satisfies |r| < polishTol*h leaves an error of order (r/h)^5 h, below
	// 1e-17 h.
	polishTol = 3e-4
	// maxPolish bounds the polish iterations; two suffice everywhere in
	// the tested range (one for most zeros).
	maxPolish = 8
)

// newMarch returns a march for order n >= 0 positioned below the first
// zero of J_n and J'_n, with room for count zeros of each kind.
func newMarch(n, count int) *march {
	mr := &march{
		n:   n,
		nu:  float64(n),
		nu2: float64(n) * float64(n),
		j:   make([]float64, 0, count+1),
		jp:  make([]float64, 0, count+1),
	}
	if n == 0 {
		// Start at x = 1 < j_{0,1} = 2.40...; J'_0 = -J_1 (DLMF 10.6.3).
		mr.xh = 1
		mr.y, mr.dy = math.J0(1), -math.J1(1)
		mr.prime = false
	} else {
		// Start at x = n: J_n increases on (0, j'_{n,1}] and
		// j'_{n,1} >= n (DLMF 10.21.3), so no zero lies below.
		mr.xh = mr.nu
		jn, jn1 := forwardPair(n, mr.nu)
		mr.y, mr.dy = jn, jn-jn1 // J'_n = (n/x) J_n - J_{n+1}, DLMF 10.6.2
		mr.prime = true
	}
	s := math.Max(math.Abs(mr.y), math.Abs(mr.dy))
	mr.y, mr.dy = mr.y/s, mr.dy/s
	return mr
}

// forwardPair returns J_n(x) and J_{n+1}(x) for x >= n > 0 by forward
// recurrence J_{k+1} = (2k/x) J_k - J_{k-1} (DLMF 10.6.1) from math.J0 and
// math.J1; for k <= x the recurrence is stable (Gautschi 1967, Section 5),
// which is also how math.Jn evaluates this case.
func forwardPair(n int, x float64) (jn, jn1 float64) {
	a, b := math.J0(x), math.J1(x)
	r := 2 / x
	for k := 1; k <= n; k++ {
		a, b = b, float64(k)*r*b-a
	}
	return a, b
}

// run appends zeros until both lists hold count entries (the last zero of
// the kind that comes later in the alternation may then be one extra).
func (mr *march) run(count int) {
	for len(mr.j) < count || len(mr.jp) < count {
		mr.next()
	}
}

// next finds the next zero in the alternation and appends it.
func (mr *march) next() {
	g := mr.guess(false)
	if !mr.seek(g) {
		// The first approximation fell outside the basin of the polish.
		// Never seen in the tested range; retry from the uniform
		// asymptotic approximation before giving up.
		if !mr.seek(mr.guess(true)) {
			kind, m := "J", len(mr.j)+1
			if mr.prime {
				kind, m = "J'", len(mr.jp)+1
			}
			panic(fmt.Sprintf("bessel: internal error: zero %d of %s_%d not found near %v", m, kind, mr.n, g))
		}
	}
}

// seek takes substeps towards the first approximation g of the next zero
// while it is out of reach of one expansion, then polishes the zero and,
// if it passes the checks, records it and moves the march onto it. It
// reports false, leaving the march at the last substep point, when the
// polish fails: no convergence, a zero far from g, or a zero with the
// wrong sign pattern (one skipped).
func (mr *march) seek(g float64) bool {
	tg := (g - mr.xh) - mr.xl
	if !(tg > 0) {
		return false
	}
	// The state is known at x = xh + xl; move it to xh to first order in
	// xl (|xl| <= ulp(xh)/2, so the neglected terms are far below
	// rounding). From here on the current point is the double xh.
	if xl := mr.xl; xl != 0 {
		x := mr.xh + xl
		d2 := -mr.dy/x - (1-mr.nu2/(x*x))*mr.y // Bessel's equation, DLMF 10.2.1
		mr.y -= xl * mr.dy
		mr.dy -= xl * d2
		mr.xl = 0
	}
	for tg > maxRatio*mr.xh {
		// Substep: advance to a point short of the zero, by at most
		// maxRatio x0 and at most 3/4 of the way.
		h := math.Min(maxRatio*mr.xh, 0.75*tg)
		y, dy := mr.e.expand(mr.nu2, mr.xh, h, mr.y, mr.dy, 0)
		x := mr.xh + h // the new point is this double; y, dy belong to it up to rounding of x
		tg -= x - mr.xh
		s := math.Max(math.Abs(y), math.Abs(dy))
		mr.xh, mr.y, mr.dy = x, y/s, dy/s
	}
	x0, y0, y1 := mr.xh, mr.y, mr.dy
	h := tg
	s := 1.0
	y, dy := mr.e.expand(mr.nu2, x0, h, y0, y1, mr.e.terms-4)
	if !mr.e.ok {
		return false
	}
	converged := false
	for i := range maxPolish {
		if i > 0 {
			y, dy = mr.e.eval(s)
		}
		d, r := correction(mr.prime, mr.nu2, x0+h*s, y, dy)
		s += d / h
		if math.Abs(r) < polishTol*h {
			converged = true
			break
		}
	}
	t := h * s
	if !converged || !(s > 0) || !(s <= maxReach) || math.Abs(t-tg) > 0.5*tg {
		return false
	}
	// Sign pattern: the companion value at the new zero must have the
	// sign that follows from the previous one (a skipped zero flips it).
	// At the m-th zero of J'_n, J_n has the sign (-1)^(m-1) (n >= 1) or
	// (-1)^m (n = 0); at the m-th zero of J_n, J'_n has the sign (-1)^m;
	// with J_n > 0 near the start of the march.
	if mr.prime {
		m := len(mr.jp) + 1
		want := m%2 == 1
		if mr.n == 0 {
			want = !want
		}
		if (y > 0) != want {
			return false
		}
		mr.jp = append(mr.jp, 0)
		mr.y, mr.dy = math.Copysign(1, y), 0
	} else {
		m := len(mr.j) + 1
		if (dy > 0) != (m%2 == 0) {
			return false
		}
		mr.j = append(mr.j, 0)
		mr.y, mr.dy = 0, math.Copysign(1, dy)
	}
	// New point x0 + t as a double-double: t = h*s exactly as tt + tl,
	// then x0 + tt + tl.
	tt := t
	tl := math.FMA(h, s, -tt)
	hi, lo := twoSum(x0, tt)
	hi, lo = fastTwoSum(hi, lo+tl)
	mr.xh, mr.xl = hi, lo
	if mr.prime {
		mr.jp[len(mr.jp)-1] = hi
	} else {
		mr.j[len(mr.j)-1] = hi
	}
	mr.prime = !mr.prime
	return true
}

// correction returns the step d from x towards the nearest zero of y (prime
// false) or y' (prime true), where y solves Bessel's equation of order
// sqrt(nu2) with y(x) = y0, y'(x) = y1, and the Newton part r of that step.
//
// The higher derivatives follow from Bessel's equation (DLMF 10.2.1) and
// its derivatives (derived):
//
//	y''   = -y'/x - q y,                                   q = 1 - n^2/x^2
//	y'''  = -y''/x + y'/x^2 - q y' - 2n^2 y/x^3
//	y^(4) = -y'''/x + 2y''/x^2 - 2y'/x^3 - q y'' - 4n^2 y'/x^3 + 6n^2 y/x^4
//	y^(5) = -y^(4)/x + 3y'''/x^2 - 6y''/x^3 + 6y'/x^4 - q y'''
//	        - 6n^2 y''/x^3 + 18n^2 y'/x^4 - 24n^2 y/x^5
//
// For f(x + d) = f0 + f1 d + f2 d^2 + f3 d^3 + f4 d^4 + ..., reversion of
// the series (Householder 1970, Section 4.4; "Schroeder's method") gives the
// root d = r - A2 r^2 + (2A2^2 - A3) r^3 + (5A2A3 - 5A2^3 - A4) r^4 + O(r^5)
// with r = -f0/f1 and Ak = fk/f1: a fifth-order step.
func correction(prime bool, nu2, x, y0, y1 float64) (d, r float64) {
	ix := 1 / x
	ix2 := ix * ix
	ix3 := ix2 * ix
	ix4 := ix2 * ix2
	q := 1 - nu2*ix2
	y2 := -y1*ix - q*y0
	y3 := -y2*ix + y1*ix2 - q*y1 - 2*nu2*y0*ix3
	y4 := -y3*ix + 2*y2*ix2 - 2*y1*ix3 - q*y2 - 4*nu2*y1*ix3 + 6*nu2*y0*ix4
	var a2, a3, a4 float64
	if prime {
		y5 := -y4*ix + 3*y3*ix2 - 6*y2*ix3 + 6*y1*ix4 - q*y3 -
			6*nu2*y2*ix3 + 18*nu2*y1*ix4 - 24*nu2*y0*ix4*ix
		i1 := 1 / y2
		r = -y1 * i1
		a2, a3, a4 = y3*i1*(1.0/2), y4*i1*(1.0/6), y5*i1*(1.0/24)
	} else {
		i1 := 1 / y1
		r = -y0 * i1
		a2, a3, a4 = y2*i1*(1.0/2), y3*i1*(1.0/6), y4*i1*(1.0/24)
	}
	d = r + r*r*(-a2+r*((2*a2*a2-a3)+r*(5*a2*a3-5*a2*a2*a2-a4)))
	return d, r
}

// twoSum returns s = fl(a+b) and the rounding error e, a + b = s + e
// exactly (Knuth, TAOCP vol. 2, 4.2.2, Theorem B).
func twoSum(a, b float64) (s, e float64) {
	s = a + b
	bb := s - a
	e = (a - (s - bb)) + (b - bb)
	return s, e
}

// fastTwoSum is twoSum for |a| >= |b| (Dekker 1971).
func fastTwoSum(a, b float64) (s, e float64) {
	s = a + b
	e = b - (s - a)
	return s, e
}
