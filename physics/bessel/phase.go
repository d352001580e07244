package bessel

import "math"

// This file holds the modulus-phase form of the Bessel functions of integer
// order n at a point t > 0 (DLMF 10.18.4, 10.18.5):
//
//	J_n(t)  = M(t) cos θ(t),   Y_n(t)  = M(t) sin θ(t),
//	J'_n(t) = N(t) cos φ(t),   Y'_n(t) = N(t) sin φ(t),
//
// with M, N > 0 and the phases θ, φ continuous in t. The cross products of
// cross.go are products of moduli times the sine of a phase difference, so
// their roots are where a phase difference is a multiple of π, and the
// phases count the roots.
//
// Branches: θ(t) -> -π/2 as t -> 0+ (J_n > 0 and Y_n < 0 below their first
// zeros, DLMF 10.21(i)), and φ - θ lies in (0, π) for every t, because
// M N sin(φ - θ) = J_n Y'_n - J'_n Y_n = 2/(π t) > 0 (the Wronskian, DLMF
// 10.5.2).

// phase is the modulus-phase data of J_n and Y_n at one point t.
type phase struct {
	// θ(t) = frac + 2π turns, with frac in (-π, π] and turns an integer
	// held as a float64, so that a difference of phases at two points is
	// formed without rounding the multiples of 2π.
	turns, frac float64
	gap         float64 // φ(t) - θ(t), in (0, π)
	dth, ddth   float64 // θ'(t) = 2/(π t M^2) (DLMF 10.18.8) and θ''(t)
	dph, ddph   float64 // φ'(t) = 2(t^2-n^2)/(π t^3 N^2) (DLMF 10.18.8) and φ''(t)
}

const (
	// scaleExp bounds the forward recurrence of Y_k and the backward
	// recurrence of J_k: past scaleBig = 2^scaleExp the values are scaled
	// by scaleSmall = 2^-scaleExp and the exponent is counted, so that no
	// order or argument overflows.
	scaleExp   = 600
	scaleBig   = 0x1p600
	scaleSmall = 0x1p-600
	// millerTail is the number of orders beyond n at which the backward
	// recurrence for J_n(t)/J_{n-1}(t), t < n, starts, plus millerTailCbrt
	// n^(1/3): the start error is damped by prod (J_k/J_{k-1})^2 over the
	// tail, below 1e-17 for t <= n (derived from J_k/J_{k-1} ~
	// exp(-arccosh(k/t)), as for logDerivative in march.go).
	millerTail     = 40
	millerTailCbrt = 8
	// millerDamp shortens the tail well below the turning point: there
	// every J_k/J_{k-1}, k > n, is below exp(-arccosh(n/t)), so a tail of
	// millerDamp/arccosh(n/t) orders damps the start error by
	// exp(-2 millerDamp) < 1e-17 (derived as above).
	millerDamp = 20
)

// rawBessel holds J_n, J'_n, Y_n, Y'_n at a point t, all four multiplied
// by one positive factor 2^-e (which cancels from every phase and every
// logarithmic derivative), and s = 2^-2e, the factor by which the
// Wronskian 2/(π t) is multiplied. Where Y_n is large (t < n) the factor
// brings it near 1; s may then underflow to 0, which makes the phase
// derivatives at t 0, their correct value to double precision.
type rawBessel struct {
	t, j, dj, y, dy, s float64
}

// besselRaw returns J_n, J'_n, Y_n, Y'_n of order n >= 0 at t > 0.
//
// Method: J_0, J_1, Y_0, Y_1 from hankel01 for t >= hankelMin, else from
// the math package; Y_{n-1}, Y_n by
// forward recurrence (DLMF 10.6.1), stable for Y at every t (Gautschi
// 1967). For t >= n, J_{n-1} and J_n by forward recurrence as well (the
// order stays below the argument, where the recurrence is neutral, as in
// math.Jn). For t < n, where forward recurrence of J is unstable, the
// ratio J_n/J_{n-1} comes from backward recurrence started millerTail
// orders above n (Miller's algorithm; Gautschi 1967) and the size of
// J_{n-1} from the Wronskian J_n Y_{n-1} - J_{n-1} Y_n = 2/(π t) (DLMF
// 10.5.4), which loses little to cancellation because there J_{n-1}|Y_n|
// exceeds J_n|Y_{n-1}|. Derivatives from C'_n = C_{n-1} - (n/t) C_n (DLMF
// 10.6.2). The cost is O(n) for t >= n and O(n^(1/3)) more for t < n.
func besselRaw(n int, t float64) rawBessel {
	fn := float64(n)
	r := 2 / t
	var j0, j1, y0, y1 float64
	switch {
	case t >= hankelMin:
		j0, j1, y0, y1 = hankel01(t)
	case t >= fn:
		j0, j1 = math.J0(t), math.J1(t)
		y0, y1 = math.Y0(t), math.Y1(t)
	default:
		// Below the turning point J comes from Miller's algorithm and
		// the Wronskian; J_0 and J_1 are not needed (n >= 1 here).
		y0, y1 = math.Y0(t), math.Y1(t)
	}
	if n == 0 {
		// J'_0 = -J_1, Y'_0 = -Y_1 (DLMF 10.6.3).
		return rawBessel{t: t, j: j0, dj: -j1, y: y0, dy: -y1, s: 1}
	}
	ya, yb := y0, y1 // Y_{k-1}, Y_k (scaled by 2^-e)
	e := 0
	if t >= fn {
		// J and Y together: two independent chains in one loop.
		ja, jb := j0, j1
		for k := 1; k < n; k++ {
			f := float64(k) * r
			ja, jb = jb, math.FMA(f, jb, -ja)
			ya, yb = yb, math.FMA(f, yb, -ya)
		}
		return rawBessel{t: t, j: jb, dj: ja - fn/t*jb, y: yb, dy: ya - fn/t*yb, s: 1}
	}
	for k := 1; k < n; k++ {
		ya, yb = yb, math.FMA(float64(k)*r, yb, -ya)
		if math.Abs(yb) > scaleBig {
			ya, yb = ya*scaleSmall, yb*scaleSmall
			e += scaleExp
		}
	}
	tail := millerTail + int(millerTailCbrt*math.Cbrt(fn))
	if a := math.Acosh(fn / t); a > 0 {
		tail = min(tail, 2+int(millerDamp/a))
	}
	top := n + tail
	fk1, fk := 0.0, 1.0 // f_{k+1}, f_k for k = top
	for k := top; k >= n; k-- {
		fk1, fk = fk, math.FMA(float64(k)*r, fk, -fk1) // f_{k-1}
		if math.Abs(fk) > scaleBig {
			fk1, fk = fk1*scaleSmall, fk*scaleSmall
		}
	}
	rho := fk1 / fk // J_n / J_{n-1}
	// J_{n-1} 2^e from the Wronskian with the scaled Y.
	ja := 2 / (math.Pi * t * (rho*ya - yb))
	jb := rho * ja
	dj, dy := ja-fn/t*jb, ya-fn/t*yb
	// Scale all four by 2^-(e+g), J twice more by 2^-e, so that the
	// largest, Y_n or Y'_n, lies near 1 and squares cannot overflow.
	_, g := math.Frexp(math.Max(math.Abs(yb), math.Abs(dy)))
	yb, dy = math.Ldexp(yb, -g), math.Ldexp(dy, -g)
	jb, dj = math.Ldexp(jb, -2*e-g), math.Ldexp(dj, -2*e-g)
	return rawBessel{t: t, j: jb, dj: dj, y: yb, dy: dy, s: math.Ldexp(1, -2*(e+g))}
}

// besselPhase returns the modulus-phase data of order n >= 0 at t > 0.
func besselPhase(n int, t float64) phase {
	return besselRaw(n, t).phase(n, true)
}

// phase returns the modulus-phase data of order n from the values at t;
// gap, dph and ddph only with prime set (the TE roots need them).
//
// θ is the principal value of atan2(Y_n, J_n) for t <= n, where J_n > 0
// and Y_n < 0 (t lies below j_{n,1} and y_{n,1}, DLMF 10.21.3); for t > n
// the multiple of 2π is the one that brings it nearest to the Debye phase
// sqrt(t^2-n^2) - n arccos(n/t) - π/4 (DLMF 10.19.6), which is within 0.8
// of θ for every n and t > n (TestPhaseContinuous checks the unwrapped θ
// for continuity). φ - θ = atan2(2/(π t), J_n J'_n + Y_n Y'_n), with the
// sine part exact from the Wronskian (DLMF 10.5.2). Second derivatives
// come from Bessel's equation (DLMF 10.2.1).
func (b rawBessel) phase(n int, prime bool) phase {
	fn := float64(n)
	t := b.t
	var p phase
	p.frac = math.Atan2(b.y, b.j)
	if t > fn {
		debye := math.Sqrt((t-fn)*(t+fn)) - fn*math.Acos(fn/t) - math.Pi/4
		p.turns = math.Round((debye - p.frac) / (2 * math.Pi))
	}
	w := b.s * 2 / (math.Pi * t) // J~ Y~' - J~' Y~ = 2^-2e 2/(π t)
	mm := b.j*b.j + b.y*b.y      // M~^2 = 2^-2e M^2
	half := b.j*b.dj + b.y*b.dy
	p.dth = w / mm // 2/(π t M^2)
	p.ddth = -p.dth * (1/t + 2*half/mm)
	if !prime {
		return p
	}
	p.gap = math.Atan2(w, half)
	// φ' and φ'' with N^2 and (N^2)' from J'' = -J'/t - (1 - n^2/t^2) J.
	q := (t - fn) * (t + fn) / (t * t) // 1 - n^2/t^2
	d2j := -b.dj/t - q*b.j
	d2y := -b.dy/t - q*b.y
	nn := b.dj*b.dj + b.dy*b.dy
	lnn := 2 * (b.dj*d2j + b.dy*d2y) / nn
	base := w / (t * nn) // 2/(π t^2 N^2)
	tq := t * q          // (t^2 - n^2)/t
	p.dph = base * tq
	p.ddph = base * (2 - 3*q - tq*lnn)
	return p
}

// near holds the last point at which J_n and Y_n were evaluated in full
// (besselRaw, whose cost grows with n) and the Taylor expansions of
// Bessel's equation about it, from which values close by come at the cost
// of a few terms (taylor.go). Values are only ever expanded from a full
// evaluation, never from other expanded values, so no error accumulates.
type near struct {
	ok    bool
	b     rawBessel
	reach float64
	j, y  expansion
}

// nearReach and nearShare bound the step over which values come from a
// Taylor expansion: the iteration for a root ends with steps far below
// them, which cost a few terms, while the step from one root to the next
// costs as much by Taylor series as by a full evaluation (measured), so
// the bounds are short: |h| <= 1/16, |h| <= t/100 (well inside the disc of
// convergence, |h| < t), and |h| <= t/(n+1), the scale on which J_n and
// Y_n change below the turning point.
const (
	nearReach = 0x1p-4
	nearShare = 0.01
)

// phaseAt returns the modulus-phase data of order n (with the TE parts if
// prime is set) at t + dt, with dt a
// correction below the rounding of t, from a Taylor expansion about the
// last full evaluation when t is within reach of it, else from a new full
// evaluation (which becomes the base), corrected to first order in dt.
func (nr *near) phaseAt(n int, t, dt float64, prime bool) phase {
	if h := t - nr.b.t; nr.ok && math.Abs(h) <= nr.reach {
		return nr.expanded(n, h+dt).phase(n, prime)
	}
	p := nr.full(n, t).phase(n, prime)
	if dt != 0 {
		p.frac += p.dth * dt
		p.gap += (p.dph - p.dth) * dt
	}
	return p
}

// rawAt returns the values of order n at t, expanded or in full as
// phaseAt does.
func (nr *near) rawAt(n int, t float64) rawBessel {
	if h := t - nr.b.t; nr.ok && math.Abs(h) <= nr.reach {
		return nr.expanded(n, h)
	}
	return nr.full(n, t)
}

// full evaluates at t with besselRaw and makes t the base.
func (nr *near) full(n int, t float64) rawBessel {
	nr.b = besselRaw(n, t)
	nr.ok = true
	nr.reach = math.Min(nearReach, math.Min(nearShare, 1/float64(n+1))*t)
	return nr.b
}

// expanded returns the values at the base point plus h, or evaluates in
// full at that point if a series did not reach its tolerance.
func (nr *near) expanded(n int, h float64) rawBessel {
	if h == 0 {
		return nr.b
	}
	nu2 := float64(n) * float64(n)
	out := nr.b
	out.t = nr.b.t + h
	// J_n underflows to 0 after scaling far below the turning point;
	// it then stays 0.
	jok := true
	if nr.b.j != 0 || nr.b.dj != 0 {
		out.j, out.dj = nr.j.expand(nu2, nr.b.t, h, nr.b.j, nr.b.dj, 0)
		jok = nr.j.ok
	}
	out.y, out.dy = nr.y.expand(nu2, nr.b.t, h, nr.b.y, nr.b.dy, 0)
	if !jok || !nr.y.ok {
		return besselRaw(n, out.t)
	}
	return out
}
