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
// factor: (0, +-1) at a zero of J_n, (+-1, 0) at a zero of J'_n, moved to
// first order from the exact zero to its float64 rounding.
type march struct {
	n       int
	nu, nu2 float64 // n and n^2
	// The current point, a float64. A zero found lies at xh + lo with
	// |lo| <= ulp(xh)/2; the march moves its known state there to the
	// point xh itself, so that rounding the zeros does not accumulate.
	xh    float64
	y, dy float64 // J_n(xh) and J'_n(xh), up to one positive factor
	prime bool    // whether the next zero sought is one of J'_n
	j, jp []float64
	e     expansion
}

const (
	// startOffset places the start of a march of order n >= 1 at
	// x0 = n - startOffset n^(1/3) (but not below n/2), where J_n is about
	// Ai(2.5) / max Ai ~ 0.03 of its first maximum (DLMF 10.19.8).
	startOffset = 2.0
	// maxRatio bounds a step h against its expansion point x0: the Taylor
	// series about x0 converges for |h| < x0, and terms shrink at least
	// like maxRatio^k. Longer steps (to the first zero of orders below
	// about 50, and to the first few zeros of orders 0 and 1) are split
	// into substeps that find no zero.
	maxRatio = 0.25
	// substepShare is the largest share of the way to a first
	// approximation g that a substep covers. The asymptotic
	// approximations, the only ones met where substeps happen, lie within
	// half the distance from the zero z to the point before it (see
	// TestAsymptoticGuess), so z - x0 > (g - x0)/1.5 and a substep of 0.6
	// (g - x0) stops short of z.
	substepShare = 0.6
	// maxReach bounds the polished zero, in units of the distance to the
	// first approximation, where the series was truncated to coefTol;
	// beyond reexpandAt the zero is polished again from a new expansion,
	// so the tail of a truncated series, which grows like s^terms, stays
	// below 1.1^40 coefTol < 1e-16.
	maxReach   = 1.25
	reexpandAt = 0.1
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
		// Start left of the turning point x = n, where J_n is still
		// small and increasing: j'_{n,1} >= n (DLMF 10.21.3), so no zero
		// lies below. There an error in J'_n/J_n amounts to adding a
		// multiple of Y_n proportional to J_n(x0)^2, which marching
		// right, where J_n grows and Y_n decays, makes small
		// (about 2e-3 of its size for a start at x = n; derived from the
		// Wronskian, DLMF 10.5.2, and DLMF 10.19.8).
		mr.xh = math.Max(mr.nu-startOffset*math.Cbrt(mr.nu), mr.nu/2)
		mr.y, mr.dy = 1, logDerivative(n, mr.xh)
		mr.prime = true
	}
	s := math.Max(math.Abs(mr.y), math.Abs(mr.dy))
	mr.y, mr.dy = mr.y/s, mr.dy/s
	return mr
}

// logDerivative returns J'_n(x)/J_n(x) for 0 < x < n, as
// n/x - J_{n+1}(x)/J_n(x) (DLMF 10.6.2), with the ratio from the
// continued fraction of DLMF 10.10.1 evaluated by backward recurrence of
// ratios, rho_k = J_{k+1}/J_k = 1/(2(k+1)/x - rho_{k+1}) (DLMF 10.6.1).
// J_k is the minimal solution of the recurrence for k > x, so the backward
// recurrence is stable and the neglected tail rho_{N+1} shrinks the error
// by about prod rho_k^2 (Gautschi 1967); startTail terms beyond n make
// that product negligible for x <= n - 2 n^(1/3) (derived from
// rho_k ~ exp(-arccosh(k/x))).
func logDerivative(n int, x float64) float64 {
	fn := float64(n)
	last := n + startTail(fn)
	r := 2 / x
	var rho float64
	for k := last; k >= n; k-- {
		rho = 1 / (float64(k+1)*r - rho)
	}
	return fn/x - rho
}

// startTail returns the number of continued-fraction terms beyond the
// order n used by logDerivative: 40 + 6 n^(1/3).
func startTail(n float64) int { return 40 + int(6*math.Cbrt(n)) }

// run appends zeros until the lists hold at least nj zeros of J_n and njp
// of J'_n. The zeros found do not depend on how many are asked for.
func (mr *march) run(nj, njp int) {
	for len(mr.j) < nj || len(mr.jp) < njp {
		mr.next()
	}
}

// next finds the next zero the march stops at and appends it.
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
	tg := g - mr.xh
	if !(tg > 0) {
		return false
	}
	for tg > maxRatio*mr.xh {
		// Substep: advance to a point short of the zero, by at most
		// maxRatio x0 and at most substepShare of the way. The step is
		// rounded so that xh + h is exact.
		h := math.Min(maxRatio*mr.xh, substepShare*tg)
		x := mr.xh + h
		h = x - mr.xh
		y, dy := mr.e.expand(mr.nu2, mr.xh, h, mr.y, mr.dy, 0)
		if !mr.e.ok {
			return false
		}
		tg -= h
		s := math.Max(math.Abs(y), math.Abs(dy))
		mr.xh, mr.y, mr.dy = x, y/s, dy/s
	}
	x0 := mr.xh
	h := tg
	s, y, dy, ok := mr.polish(h)
	if ok && math.Abs(s-1) > reexpandAt {
		// The first approximation was off by more than the series was
		// sized for: expand again with the zero just found as the
		// approximation.
		h *= s
		s, y, dy, ok = mr.polish(h)
	}
	t := h * s
	if !ok || math.Abs(t-tg) > 0.5*tg {
		return false
	}
	// Sign pattern: the companion value at the new zero must have the
	// sign that follows from the previous one (a skipped zero flips it).
	// At the m-th zero of J'_n, J_n has the sign (-1)^(m-1) (n >= 1) or
	// (-1)^m (n = 0); at the m-th zero of J_n, J'_n has the sign (-1)^m;
	// with J_n > 0 near the start of the march.
	sign := dy
	if mr.prime {
		sign = y
		m := len(mr.jp) + 1
		want := m%2 == 1
		if mr.n == 0 {
			want = !want
		}
		if (y > 0) != want {
			return false
		}
	} else {
		m := len(mr.j) + 1
		if (dy > 0) != (m%2 == 0) {
			return false
		}
	}
	sign = math.Copysign(1, sign)
	// The zero is x0 + t with t = h*s = tt + tl exactly; as a
	// double-double hi + lo, hi is the zero rounded to float64.
	tt := t
	tl := math.FMA(h, s, -tt)
	hi, lo := twoSum(x0, tt)
	hi, lo = fastTwoSum(hi, lo+tl)
	// Move the state known at the zero X = hi + lo to hi, to first order
	// in lo (|lo| <= ulp(hi)/2; the neglected terms are far below
	// rounding): y(hi) = y(X) - lo y'(X), y'(hi) = y'(X) - lo y''(X),
	// with y'' from Bessel's equation (DLMF 10.2.1); at a zero of J_n
	// the change of slope, lo/X relative, is below rounding.
	mr.xh = hi
	if mr.prime {
		mr.jp = append(mr.jp, hi)
		mr.y, mr.dy = sign, lo*(1-mr.nu2/(hi*hi))*sign // y'' = -(1 - n^2/x^2) y at y' = 0
	} else {
		mr.j = append(mr.j, hi)
		mr.y, mr.dy = -lo*sign, sign
	}
	mr.prime = !mr.prime
	return true
}

// polish expands the solution about the current point in the variable
// s = (x - xh)/h and iterates from s = 1 towards the nearest zero of the
// kind sought. It reports whether the iteration converged to an s in
// (0, maxReach], and returns s with y and y' at the last point evaluated,
// a final correction short of s (close enough for their signs).
func (mr *march) polish(h float64) (s, y, dy float64, ok bool) {
	x0 := mr.xh
	s = 1
	y, dy = mr.e.expand(mr.nu2, x0, h, mr.y, mr.dy, mr.e.terms-4)
	if !mr.e.ok {
		return s, y, dy, false
	}
	for i := range maxPolish {
		if i > 0 {
			y, dy = mr.e.eval(s)
		}
		d, r := correction(mr.prime, mr.nu2, x0+h*s, y, dy)
		s += d / h
		if math.Abs(r) < polishTol*h {
			return s, y, dy, s > 0 && s <= maxReach
		}
	}
	return s, y, dy, false
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
// the series (Schroeder's method; Householder 1970) gives the
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
// exactly (Knuth, TAOCP vol. 2, Section 4.2.2).
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
