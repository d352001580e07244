package bessel

import (
	"fmt"
	"math"
)

// CrossZeros returns the first count positive roots x_{n,1} < x_{n,2} <
// ... < x_{n,count} of the Bessel cross product
//
//	J_n(x) Y_n(c x) - J_n(c x) Y_n(x) = 0        (DLMF §10.21(x), A&S Section 9.5)
//
// for order n >= 0 and radius ratio c > 1, in ascending order. In a coaxial
// guide of inner radius a and outer radius b = c a the TM_nm mode has cutoff
// wavenumber k_c = x_{n,m}/a. The TEM mode of the coaxial line (n = 0,
// k_c = 0) is not a root of the cross product, which tends to (2/π) ln c as
// x -> 0, and is not returned: callers list it separately.
//
// Accuracy: against a 30-digit reference for c from 1.001 to 100, n up to
// 99 and m up to 100, the largest relative error is 2.8e-16 (the tests
// hold 1e-14). No root is skipped or repeated: the m-th root is the unique
// solution of θ_n(c x) - θ_n(x) = m π, a strictly increasing function
// (see the comment above crossRoots). Cost: about 0.4 us plus 5 ns per
// unit of n per root (measured), the first root of an order a few times
// that.
//
// Special cases are:
//
//	CrossZeros(n, c, 0) = []float64{} (empty, non-nil)
//	CrossZeros(n, c, count) panics if n < 0, count < 0, or c is not a finite number > 1
//
// Like JZeros, invalid arguments are programmer errors; callers that take
// them from users validate them first.
func CrossZeros(n int, c float64, count int) []float64 {
	checkCross("CrossZeros", n, c, count)
	return crossRoots(n, c, count, false)
}

// CrossPrimeZeros returns the first count positive roots x'_{n,1} <
// x'_{n,2} < ... < x'_{n,count} of the cross product of derivatives
//
//	J'_n(x) Y'_n(c x) - J'_n(c x) Y'_n(x) = 0    (DLMF §10.21(x), A&S Section 9.5)
//
// for order n >= 0 and radius ratio c > 1, in ascending order. In a coaxial
// guide of inner radius a and outer radius b = c a the TE_nm mode has cutoff
// wavenumber k_c = x'_{n,m}/a. For n >= 1 the first root is the TE_n1 mode
// near 2n/(1+c) (k_c near 2/(a+b) for TE11); for n = 0, x = 0 (a constant
// field, no mode) is excluded, and since J'_0 = -J_1 (DLMF 10.6.3),
// CrossPrimeZeros(0, c, count) equals CrossZeros(1, c, count) to rounding.
//
// Accuracy and cost: as for CrossZeros.
//
// Special cases are:
//
//	CrossPrimeZeros(n, c, 0) = []float64{} (empty, non-nil)
//	CrossPrimeZeros(n, c, count) panics if n < 0, count < 0, or c is not a finite number > 1
func CrossPrimeZeros(n int, c float64, count int) []float64 {
	checkCross("CrossPrimeZeros", n, c, count)
	return crossRoots(n, c, count, true)
}

// checkCross panics with a message naming the function, the argument and
// its valid range when an argument is out of its domain.
func checkCross(fn string, n int, c float64, count int) {
	check(fn, n, count)
	if !(c > 1) || math.IsInf(c, 1) {
		panic(fmt.Sprintf("bessel: %s: radius ratio c must be a finite number > 1, got %v", fn, c))
	}
}

// The roots as phase levels.
//
// With the modulus-phase form of phase.go,
//
//	J_n(x) Y_n(cx) - J_n(cx) Y_n(x)     = M(x) M(cx) sin(θ(cx) - θ(x)),
//	J'_n(x) Y'_n(cx) - J'_n(cx) Y'_n(x) = N(x) N(cx) sin(φ(cx) - φ(x))
//
// (derived from DLMF 10.18.4, 10.18.5), so the roots are where
// Φ(x) = θ(cx) - θ(x) or Ψ(x) = φ(cx) - φ(x) is a multiple of π. Which
// multiple belongs to which root follows from the radial eigenproblem: a
// root x is an eigenvalue of the regular Sturm-Liouville problem
// (r u')' + (x^2 r - n^2/r) u = 0 on [1, c] with u = 0 (TM) or u' = 0 (TE)
// at both ends, whose k-th eigenfunction (k = 0, 1, ...) has exactly k
// zeros inside (Sturm's oscillation theorem; Coddington and Levinson 1955,
// Chapter 8). The solution with the left boundary condition is
//
//	TM: u(r) = M(x) M(xr) sin(θ(xr) - θ(x))
//	TE: u(r) = N(x) M(xr) sin(θ(xr) - φ(x))
//
// and, θ being increasing, its zeros inside are the multiples of π passed
// by θ(xr) - θ(x) (or - φ(x)) as r runs from 1 to c. Counting them
// (derived; with φ - θ in (0, π) for TE) gives:
//
//	TM: the m-th root (k = m-1 zeros) is where Φ(x) = m π;
//	TE: the root with k zeros is where Ψ(x) = k π: for n >= 1 the m-th
//	    root has k = m-1; for n = 0, k = 0 is x = 0 and the m-th root has
//	    k = m.
//
// Each level is reached exactly once for x > 0, and below (above) the root
// the phase difference lies below (above) it, so its sign brackets the
// root and the number of roots below any x is a count of the multiples of
// π below Φ(x) or Ψ(x) (crossCount). For TM this is also plain from Φ'(x)
// = (2/(π x)) (1/M(cx)^2 - 1/M(x)^2) > 0 (DLMF 10.18.8), M being
// decreasing by Nicholson's formula (DLMF 10.9.30).
//
// Bounds (derived, Rayleigh quotient and the min-max principle with
// 1 <= r <= c): the eigenvalue λ = x^2 with k zeros satisfies
//
//	μ/c + n^2/c^2 <= λ <= c μ + n^2,   μ = (K π/(c-1))^2,
//
// with K = k+1 for TM (Dirichlet) and K = k for TE (Neumann). The
// search keeps every iterate inside these bounds and inside the bracket
// set by the sign of the phase difference, so it cannot leave the root's
// interval whatever the first approximation.

// crossRoots returns the first count roots of the TM (prime false) or TE
// (prime true) cross product.
func crossRoots(n int, c float64, count int, prime bool) []float64 {
	roots := make([]float64, 0, count)
	cr := crossRoot{n: n, c: c, prime: prime}
	for m := 1; m <= count; m++ {
		roots = append(roots, cr.find(m, roots))
	}
	return roots
}

// crossRoot finds roots of one order, ratio and kind.
type crossRoot struct {
	n     int
	c     float64
	prime bool
	// f1, f2 are the first and second derivatives of the phase
	// difference at the last point evaluated, used for the first
	// approximation of the next root.
	f1, f2 float64
	// The last full evaluations at x and at c x, from which nearby
	// values are expanded.
	nx, nc near
	u      expansion // scratch for the short-span TE form
}

const (
	// acceptTol ends the Halley iteration: a step d is taken without a
	// further evaluation when κ^2 d^3 <= acceptTol x, κ = |F''/F'| + 1/x
	// being the scale on which the phase difference F bends; the
	// neglected term of a third-order step is of that order, so the
	// root is then exact to about acceptTol relative.
	acceptTol = 1e-18
	// maxCrossIter bounds the iterations for one root. With the bracket
	// halved whenever the Halley step leaves it, 64 bisections alone
	// would reach rounding; about two evaluations per root are used.
	maxCrossIter = 200
	// shortSpan bounds c x - x for the short-span form of the TE root at
	// level 0 (see eval): a Taylor step that loses no digits (its terms
	// stay below e^2 times the sum).
	shortSpan = 2
	// guessHistory is how many previous roots the polynomial
	// extrapolation for the next one uses at most (quartic).
	guessHistory = 5
)

// level returns the multiple of π that the phase difference reaches at
// the m-th root.
func (cr *crossRoot) level(m int) int {
	if cr.prime && cr.n >= 1 {
		return m - 1
	}
	return m
}

// eval returns F(x) = (phase difference) - K π and its first two
// derivatives.
func (cr *crossRoot) eval(x float64, k int) (f, f1, f2 float64) {
	c := cr.c
	t := c * x
	dt := math.FMA(c, x, -t) // c x = t + dt exactly
	b1 := cr.nx.rawAt(cr.n, x)
	p1 := b1.phase(cr.n, cr.prime)
	p2 := cr.nc.phaseAt(cr.n, t, dt, cr.prime)
	// 2π (turns2 - turns1) - K π = π (2 Δturns - K), an exact integer
	// multiple of π.
	d := (p2.frac - p1.frac) + float64(2*(int(p2.turns)-int(p1.turns))-k)*math.Pi
	if cr.prime {
		f = d + (p2.gap - p1.gap)
		f1 = c*p2.dph - p1.dph
		f2 = c*c*p2.ddph - p1.ddph
	} else {
		f = d
		f1 = c*p2.dth - p1.dth
		f2 = c*c*p2.ddth - p1.ddth
	}
	if h := (c - 1) * x; cr.prime && k == 0 && math.Abs(f) < 1 && c-1 <= maxRatio && h <= shortSpan {
		// The TE root at level 0 of a thin annulus, near it: φ(cx) -
		// φ(x) is small, and the difference of two phases would lose digits
		// like 1/(c-1). Instead (derived): with u1, u2 the solutions
		// of Bessel's equation with u1 = 1, u1' = 0 and u2 = 0, u2' = 1
		// at x, every solution moves as y'(x+h) = y(x) u1'(x+h) +
		// y'(x) u2'(x+h), so
		//   N(x)N(cx) sin(φ(cx)-φ(x)) = J'(x)Y'(cx) - J'(cx)Y'(x) = -W u1'(x+h),
		//   N(x)N(cx) cos(φ(cx)-φ(x)) = u1'(x+h) (J J' + Y Y')(x) + u2'(x+h) N(x)^2,
		// with W = 2/(π x) (DLMF 10.5.2); both without cancellation.
		// c - 1 is exact (Sterbenz), and h is c x - x to rounding.
		nu2 := float64(cr.n) * float64(cr.n)
		_, du1 := cr.u.expand(nu2, x, h, 1, 0, 0)
		_, du2 := cr.u.expand(nu2, x, h, 0, 1, 0)
		w := b1.s * 2 / (math.Pi * x)
		sn := -w * du1
		cs := du1*(b1.j*b1.dj+b1.y*b1.dy) + du2*(b1.dj*b1.dj+b1.dy*b1.dy)
		// |f| < 1 from the phases, whose error is far smaller, keeps
		// the atan2 on its principal branch.
		f = math.Atan2(sn, cs)
	}
	return f, f1, f2
}

// bounds returns the a priori interval [lo, hi] of the root at level k π
// (see the comment above crossRoots; the level is the K of the bounds).
func (cr *crossRoot) bounds(k int) (lo, hi float64) {
	c, fn := cr.c, float64(cr.n)
	mu := float64(k) * math.Pi / (c - 1)
	mu *= mu
	lo = math.Sqrt(mu/c + fn*fn/(c*c))
	hi = math.Sqrt(c*mu + fn*fn)
	// Widen by a few ulp against rounding in the bounds themselves.
	return lo * (1 - 1e-15), hi * (1 + 1e-15)
}

// guess returns a first approximation of the m-th root given the roots
// found before it.
func (cr *crossRoot) guess(m int, prev []float64) float64 {
	h := len(prev)
	switch {
	case h >= 3:
		return extrapolate(prev[h-min(h, guessHistory):])
	case h >= 1:
		// The phase difference grows by π to the next root: a
		// second-order step with the derivatives at the last root.
		x := prev[h-1]
		f1, f2 := cr.f1, cr.f2
		if disc := f1*f1 + 2*f2*math.Pi; f1 > 0 && disc > 0 {
			return x + 2*math.Pi/(f1+math.Sqrt(disc))
		}
		if f1 > 0 {
			return x + math.Pi/f1
		}
		return 2 * x
	}
	// The first root: a thin annulus (c near 1) has k_c^2 near
	// (K π/(b-a))^2 + (2n/(a+b))^2 (derived from the parallel-plate limit
	// with the azimuthal wavenumber taken at the mean radius); a wide one
	// (c large) has c x near the zero of J_n or J'_n, the modes of the
	// outer circle alone (see TestLargeRatioLimit).
	if cr.c < 3 {
		b := float64(cr.level(m)) * math.Pi / (cr.c - 1)
		a := 2 * float64(cr.n) / (1 + cr.c)
		return math.Hypot(a, b)
	}
	if cr.prime {
		return JPrimeZeros(cr.n, m)[m-1] / cr.c
	}
	return JZeros(cr.n, m)[m-1] / cr.c
}

// find returns the m-th root, given the roots before it.
func (cr *crossRoot) find(m int, prev []float64) float64 {
	k := cr.level(m)
	lo, hi := cr.bounds(k)
	if len(prev) > 0 {
		lo = math.Max(lo, prev[len(prev)-1])
	}
	x := cr.guess(m, prev)
	if !(x > lo && x < hi) {
		x = mid(lo, hi)
	}
	for range maxCrossIter {
		f, f1, f2 := cr.eval(x, k)
		cr.f1, cr.f2 = f1, f2
		if f == 0 {
			return x
		}
		if f < 0 {
			lo = x
		} else {
			hi = x
		}
		if !(hi-lo > 2*ulp(hi)) {
			return lo + (hi-lo)/2
		}
		if f1 > 0 {
			// Halley's step (Householder 1970):
			// d = -f/f1 / (1 - f f2/(2 f1^2)), or Newton's where the
			// correction factor is far from 1.
			d := -f / f1
			if den := 1 + d*f2/(2*f1); den > 0.5 && den < 2 {
				d /= den
			}
			kappa := math.Abs(f2/f1) + 1/x
			xn := x + d
			if kappa*kappa*math.Abs(d*d*d) <= acceptTol*x {
				// Converged; a step that leaves the bracket does so
				// by rounding only.
				return math.Min(math.Max(xn, lo), hi)
			}
			if xn > lo && xn < hi {
				x = xn
				continue
			}
		}
		x = mid(lo, hi)
	}
	panic(fmt.Sprintf("bessel: internal error: cross-product root %d of order %d, ratio %v not found", m, cr.n, cr.c))
}

// mid returns a point inside (lo, hi): the arithmetic mean, or the
// geometric mean when the bracket spans more than a factor 4, which
// reaches a root far below hi in fewer halvings.
func mid(lo, hi float64) float64 {
	if lo > 0 && hi > 4*lo {
		return math.Sqrt(lo * hi)
	}
	return lo + (hi-lo)/2
}

// ulp returns the spacing of float64 numbers at x > 0.
func ulp(x float64) float64 {
	return math.Nextafter(x, math.Inf(1)) - x
}

// crossCount returns the number of roots of the TM (prime false) or TE
// (prime true) cross product in (0, x), x > 0, from the phase levels (see
// the comment above crossRoots): the number of levels K π, K >= 1 (TM and
// TE n = 0) or K >= 0 (TE n >= 1), lying below the phase difference.
func crossCount(n int, c, x float64, prime bool) int {
	cr := crossRoot{n: n, c: c, prime: prime}
	f, _, _ := cr.eval(x, 0) // phase difference itself
	q := int(math.Ceil(f/math.Pi)) - 1
	if prime && n >= 1 {
		q++
	}
	return max(q, 0)
}
