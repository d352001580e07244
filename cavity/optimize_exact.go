package cavity

import (
	"math"
	"slices"
)

// This file holds the exact machinery behind Optimize: the clearance of a
// wanted mode as a function of s = (D/L)^2 (the lower envelope of the
// distances of every other mode's chart line), its level sets, and its
// exact maximum. Everything here is derived from the chart relation
// documented at chartMode (clearance.go).

// line is c0 + c1 s.
type line struct{ c0, c1 float64 }

func (l line) at(s float64) float64 { return l.c0 + l.c1*s }

// affine maps a nominal s to a visited s' = a s + b (a > 0).
type affine struct{ a, b float64 }

func (f affine) at(s float64) float64  { return f.a*s + f.b }
func (f affine) inv(t float64) float64 { return (t - f.b) / f.a }

var identity = affine{1, 0}

// path is the set of ratios a cavity of nominal s visits while it is tuned
// and while its temperature changes: every s' in [lo(s), hi(s)]. Both ends
// are affine in s (derived: the union over temperature of the tuning
// intervals, see newPath in optimize.go).
type path struct {
	lo, hi affine
	// lamLo and lamHi are set when the path has no temperature part: then
	// g_w(lo(s)) = lamLo g_w(s) and g_w(hi(s)) = lamHi g_w(s) exactly
	// (derived), and every branch shares the denominator g_w(s).
	lamLo, lamHi float64
	common       bool
}

func (p path) identity() bool { return p.lo == identity && p.hi == identity }

// branch is the squared frequency ratio of one mode along one end of the
// path: rho^2(s) = num(s) / den(s), both positive on the domain.
type branch struct{ num, den line }

func (b branch) rho(s float64) float64 { return math.Sqrt(b.num.at(s) / b.den.at(s)) }

// drho returns d rho / ds.
func (b branch) drho(s float64) float64 {
	n, d := b.num.at(s), b.den.at(s)
	r := math.Sqrt(n / d)
	return (b.num.c1*d - n*b.den.c1) / (2 * r * d * d)
}

// newBranch returns the branch of mode m against wanted w along the map f.
// With common set, the denominator is g_w(s) and the numerator is divided by
// lam, which is exact algebra (g_w(f(s)) = lam g_w(s)).
func newBranch(m, w chartMode, f affine, lam float64, common bool) branch {
	num := line{m.gx + m.gp*f.b, m.gp * f.a}
	if common {
		return branch{num: line{num.c0 / lam, num.c1 / lam}, den: line{w.gx, w.gp}}
	}
	return branch{num: num, den: line{w.gx + w.gp*f.b, w.gp * f.a}}
}

// envelope is the clearance C(s) = min_k H_k(s) of a wanted mode against a
// list of modes along a path, where H_k(s) is the smallest |rho_k - 1| over
// the path of nominal s.
type envelope struct {
	w      chartMode
	modes  []chartMode
	lo, hi []branch // per mode: the path's low and high ends
	path   path
}

func newEnvelope(w chartMode, modes []chartMode, p path) *envelope {
	e := &envelope{w: w, modes: modes, path: p, lo: make([]branch, len(modes)), hi: make([]branch, len(modes))}
	for k, m := range modes {
		e.lo[k] = newBranch(m, w, p.lo, p.lamLo, p.common)
		e.hi[k] = newBranch(m, w, p.hi, p.lamHi, p.common)
	}
	return e
}

// h returns H_k(s): zero when the path of s carries mode k across the
// wanted mode, otherwise the smaller distance at the path's two ends (each
// rho_k is monotone in s', so the ends bound it).
func (e *envelope) h(k int, s float64) float64 {
	r1 := e.lo[k].rho(s) - 1
	if e.path.identity() {
		return math.Abs(r1)
	}
	r2 := e.hi[k].rho(s) - 1
	if (r1 <= 0) != (r2 <= 0) || r1 == 0 || r2 == 0 {
		return 0
	}
	return math.Min(math.Abs(r1), math.Abs(r2))
}

// at returns C(s) and the index of the limiting mode (-1 and +Inf when the
// list is empty), over the modes in idx (all modes when idx is nil).
func (e *envelope) at(s float64, idx []int) (float64, int) {
	v, arg := math.Inf(1), -1
	if idx == nil {
		for k := range e.modes {
			if x := e.h(k, s); x < v {
				v, arg = x, k
			}
		}
		return v, arg
	}
	for _, k := range idx {
		if x := e.h(k, s); x < v {
			v, arg = x, k
		}
	}
	return v, arg
}

// nominalAt is at(s, nil) for the identity path, where every branch shares
// the denominator g_w(s): one division for all modes (the Monte Carlo hot
// loop).
func (e *envelope) nominalAt(s float64) (float64, int) {
	inv := 1 / e.w.g(s)
	v, arg := math.Inf(1), -1
	for k, m := range e.modes {
		if x := math.Abs(math.Sqrt(m.g(s)*inv) - 1); x < v {
			v, arg = x, k
		}
	}
	return v, arg
}

// interval is a closed range [lo, hi] of s; lo == hi is a single point.
type interval struct{ lo, hi float64 }

// notch returns the open interval of nominal s over which H_k(s) < b, or
// ok = false when there is none. Because rho_k is monotone, {s' : |rho_k(s')
// - 1| < b} is an open interval (ta, tb); the path [lo(s), hi(s)] meets it
// when lo(s) < tb and hi(s) > ta, i.e. hi^-1(ta) < s < lo^-1(tb) (derived).
func (e *envelope) notch(k int, b float64) (interval, bool) {
	ta, tb, ok := levelSet(e.modes[k], e.w, b)
	if !ok {
		return interval{}, false
	}
	lo, hi := math.Inf(-1), math.Inf(1)
	if !math.IsInf(ta, -1) {
		lo = e.path.hi.inv(ta)
	}
	if !math.IsInf(tb, 1) {
		hi = e.path.lo.inv(tb)
	}
	return interval{lo, hi}, lo < hi
}

// levelSet returns the open interval (ta, tb) of s' >= 0 on which
// |rho(s') - 1| < b for rho^2 = (m.gx + m.gp s') / (w.gx + w.gp s'), with
// infinite ends where it is unbounded; ok is false when it is empty. The
// ends solve rho^2 = (1 -+ b)^2, a linear equation in s' (derived).
func levelSet(m, w chartMode, b float64) (ta, tb float64, ok bool) {
	f0 := m.gx / w.gx // rho^2 at s' = 0
	var fInf float64  // rho^2 as s' -> Inf
	switch {
	case w.gp > 0:
		fInf = m.gp / w.gp
	case m.gp > 0:
		fInf = math.Inf(1)
	default:
		fInf = f0
	}
	lo2, hi2 := (1-b)*(1-b), (1+b)*(1+b)
	if b >= 1 {
		lo2 = math.Inf(-1)
	}
	// solve rho^2 = v for s'.
	solve := func(v float64) float64 { return (v*w.gx - m.gx) / (m.gp - v*w.gp) }
	inside := func(v float64) bool { return v > lo2 && v < hi2 }
	slope := m.gp*w.gx - m.gx*w.gp // sign of d rho^2 / ds'
	switch {
	case slope == 0:
		if inside(f0) {
			return math.Inf(-1), math.Inf(1), true
		}
		return 0, 0, false
	case slope > 0: // increasing from f0 to fInf
		if fInf <= lo2 || f0 >= hi2 {
			return 0, 0, false
		}
		ta, tb = math.Inf(-1), math.Inf(1)
		if f0 <= lo2 {
			ta = solve(lo2)
		}
		if fInf > hi2 {
			tb = solve(hi2)
		}
	default: // decreasing from f0 to fInf
		if f0 <= lo2 || fInf >= hi2 {
			return 0, 0, false
		}
		ta, tb = math.Inf(-1), math.Inf(1)
		if f0 >= hi2 {
			ta = solve(hi2)
		}
		if fInf < lo2 {
			tb = solve(lo2)
		}
	}
	return ta, tb, ta < tb
}

// feasible returns the parts of ivs on which C(s) >= b: the intervals minus
// every notch at level b. The result is exact (notch ends are closed-form)
// and sorted; isolated points where two notches touch are kept.
func (e *envelope) feasible(ivs []interval, b float64) []interval {
	var notches []interval
	for k := range e.modes {
		if n, ok := e.notch(k, b); ok {
			notches = append(notches, n)
		}
	}
	slices.SortFunc(notches, func(a, b interval) int { return cmpFloat(a.lo, b.lo) })
	// Merge overlapping open notches. Touching ones (a.hi == b.lo) stay
	// apart: the shared point is feasible.
	var merged []interval
	for _, n := range notches {
		if len(merged) > 0 && n.lo < merged[len(merged)-1].hi {
			merged[len(merged)-1].hi = math.Max(merged[len(merged)-1].hi, n.hi)
			continue
		}
		merged = append(merged, n)
	}
	var out []interval
	for _, iv := range ivs {
		cur := iv.lo
		for _, n := range merged {
			if n.hi <= cur {
				continue
			}
			if n.lo >= iv.hi {
				break
			}
			if n.lo >= cur {
				out = append(out, interval{cur, n.lo})
			}
			cur = n.hi
			if cur > iv.hi {
				break
			}
		}
		if cur <= iv.hi {
			out = append(out, interval{cur, iv.hi})
		}
	}
	return out
}

func cmpFloat(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

// optimum is the exact maximum of C over a set of intervals.
type optimum struct {
	value float64 // max C
	s     float64 // where it is attained
	mode  int     // limiting mode index, -1 when none
}

// gridPoints is the number of trial points of maximise's first stage. Any
// number >= 0 gives the exact answer; more points only raise the first
// lower bound, which shrinks the candidate regions of the second stage.
const gridPoints = 48

// maximise returns the exact maximum of C(s) over ivs (sorted, disjoint).
//
// Method (derived): every H_k is non-increasing, then zero, then
// non-decreasing in s, so the maximum of min_k H_k lies at an interval end
// or where a non-increasing H_i meets a non-decreasing H_j. (1) A grid gives
// a lower bound L. (2) The exact level set {C >= L} (feasible) leaves small
// intervals I around the maxima. (3) On each I every H_k is monotone and
// follows one path end with rho_k on one side of 1, so H_i = H_j is either
// rho_i = rho_j or rho_i + rho_j = 2: a polynomial equation of degree <= 4
// in s whose real roots are isolated exactly (Sturm-free: by the roots of
// its derivatives) and polished by Newton's method on the unsquared
// equation. Only modes that can reach the envelope on I take part: those
// whose smallest value on I is at most min_k (largest value of H_k on I).
// The answer is exact to rounding: about 1e-15 relative in s and C unless
// two crossing curves are tangent.
func (e *envelope) maximise(ivs []interval) optimum {
	best := optimum{value: math.Inf(-1), mode: -1}
	try := func(s float64, idx []int) {
		v, k := e.at(s, idx)
		if v > best.value {
			best = optimum{v, s, k}
		}
	}
	var total float64
	for _, iv := range ivs {
		total += math.Log(iv.hi / iv.lo)
	}
	for _, iv := range ivs {
		try(iv.lo, nil)
		try(iv.hi, nil)
		n := 0
		if total > 0 {
			n = int(math.Ceil(gridPoints * math.Log(iv.hi/iv.lo) / total))
		}
		for i := 1; i < n; i++ {
			try(iv.lo*math.Pow(iv.hi/iv.lo, float64(i)/float64(n)), nil)
		}
	}
	if len(e.modes) == 0 || math.IsInf(best.value, 1) || best.value <= 0 {
		return best
	}
	for _, iv := range e.feasible(ivs, best.value) {
		e.refine(iv, &best)
	}
	return best
}

// refine searches one interval I of {C >= current best} for crossings.
func (e *envelope) refine(iv interval, best *optimum) {
	if iv.hi <= iv.lo {
		v, k := e.at(iv.lo, nil)
		if v > best.value {
			*best = optimum{v, iv.lo, k}
		}
		return
	}
	// Upper bound of C on I and the modes that can reach it.
	ub := math.Inf(1)
	hLo := make([]float64, len(e.modes))
	hHi := make([]float64, len(e.modes))
	for k := range e.modes {
		hLo[k], hHi[k] = e.h(k, iv.lo), e.h(k, iv.hi)
		ub = math.Min(ub, math.Max(hLo[k], hHi[k]))
	}
	var idx []int
	for k := range e.modes {
		if math.Min(hLo[k], hHi[k]) <= ub {
			idx = append(idx, k)
		}
	}
	for _, s := range []float64{iv.lo, iv.hi} {
		if v, k := e.at(s, idx); v > best.value {
			*best = optimum{v, s, k}
		}
	}
	// Each reaching mode's active branch on I: the path end nearer the
	// crossing (fixed across I, since H_k > 0 there), and its side of 1.
	type active struct {
		b    branch
		side float64 // sign of rho - 1
		dec  bool    // H non-increasing on I
		inc  bool    // H non-decreasing on I
	}
	mid := 0.5 * (iv.lo + iv.hi)
	act := make([]active, len(idx))
	for n, k := range idx {
		b := e.lo[k]
		if !e.path.identity() && math.Abs(e.hi[k].rho(mid)-1) < math.Abs(e.lo[k].rho(mid)-1) {
			b = e.hi[k]
		}
		a := active{b: b, side: math.Copysign(1, b.rho(mid)-1)}
		a.dec = hHi[k] <= hLo[k]
		a.inc = hHi[k] >= hLo[k]
		act[n] = a
	}
	var roots []float64
	for i := range act {
		for j := range act {
			if i == j || !act[i].dec || !act[j].inc {
				continue
			}
			if act[i].dec && act[i].inc && act[j].dec && act[j].inc && j < i {
				continue // both constant: one ordering suffices
			}
			bi, bj := act[i].b, act[j].b
			roots = roots[:0]
			if act[i].side == act[j].side {
				roots = equalRoots(bi, bj, iv, roots)
			} else {
				roots = sumRoots(bi, bj, iv, roots)
			}
			for _, s := range roots {
				quick := math.Abs(bi.rho(s) - 1)
				if quick <= best.value {
					continue
				}
				if v, k := e.at(s, idx); v > best.value {
					*best = optimum{v, s, k}
				}
			}
		}
	}
}

// equalRoots appends the roots in iv of rho_1(s) = rho_2(s), i.e. of
// num1 den2 - num2 den1 = 0, a quadratic.
func equalRoots(b1, b2 branch, iv interval, out []float64) []float64 {
	p := sub(mul(b1.num, b2.den), mul(b2.num, b1.den))
	f := func(s float64) (float64, float64) { return b1.rho(s) - b2.rho(s), b1.drho(s) - b2.drho(s) }
	return polish(polyRoots(p[:3], iv, out), f, iv)
}

// sumRoots appends the roots in iv of rho_1(s) + rho_2(s) = 2. Squaring
// twice (derived): with N_k, D_k the numerators and denominators,
//
//	16 N1 D1 D2^2 = (4 D1 D2 + N1 D2 - N2 D1)^2,
//
// a quartic, or with a common denominator D the quadratic
//
//	4 N1 N2 = (4 D - N1 - N2)^2.
//
// Spurious roots of the squared forms are dropped by checking the
// unsquared equation after polishing.
func sumRoots(b1, b2 branch, iv interval, out []float64) []float64 {
	var p [5]float64
	if b1.den == b2.den {
		d := b1.den
		e := line{4*d.c0 - b1.num.c0 - b2.num.c0, 4*d.c1 - b1.num.c1 - b2.num.c1}
		a := mul(e, e)
		c := mul(b1.num, b2.num)
		for i := range 3 {
			p[i] = a[i] - 4*c[i]
		}
	} else {
		d12 := mul(b1.den, b2.den)
		// 4 D1 D2 + N1 D2 - N2 D1
		t := sub(mul(b1.num, b2.den), mul(b2.num, b1.den))
		var r [3]float64
		for i := range 3 {
			r[i] = 4*d12[i] + t[i]
		}
		rr := mul3(r, r)
		l := mul3(mul(b1.num, b1.den), mul(b2.den, b2.den))
		for i := range 5 {
			p[i] = rr[i] - 16*l[i]
		}
	}
	n := len(out)
	f := func(s float64) (float64, float64) { return b1.rho(s) + b2.rho(s) - 2, b1.drho(s) + b2.drho(s) }
	out = polish(polyRoots(p[:], iv, out), f, iv)
	// Keep only true roots of the unsquared equation.
	k := n
	for _, s := range out[n:] {
		if v, _ := f(s); math.Abs(v) <= 1e-9 {
			out[k] = s
			k++
		}
	}
	return out[:k]
}

func mul(a, b line) [3]float64 {
	return [3]float64{a.c0 * b.c0, a.c0*b.c1 + a.c1*b.c0, a.c1 * b.c1}
}

func sub(a, b [3]float64) [3]float64 { return [3]float64{a[0] - b[0], a[1] - b[1], a[2] - b[2]} }

func mul3(a, b [3]float64) [5]float64 {
	var r [5]float64
	for i := range 3 {
		for j := range 3 {
			r[i+j] += a[i] * b[j]
		}
	}
	return r
}

// polish applies up to four Newton steps on the unsquared equation f to
// each root in out, keeping a step only when it lowers |f| and stays in iv.
func polish(out []float64, f func(float64) (float64, float64), iv interval) []float64 {
	for i, s := range out {
		v, d := f(s)
		for range 4 {
			if v == 0 || d == 0 {
				break
			}
			t := s - v/d
			if !(t >= iv.lo && t <= iv.hi) {
				break
			}
			vt, dt := f(t)
			if math.Abs(vt) >= math.Abs(v) {
				break
			}
			s, v, d = t, vt, dt
		}
		out[i] = s
	}
	return out
}

// polyRoots appends the real roots in iv of the polynomial with
// coefficients c (c[0] + c[1] s + ...), degree <= 4. Roots are isolated by
// the real roots of the derivative (recursively): between consecutive
// critical points the polynomial is monotone, and a sign change there is
// bisected to adjacent floating-point numbers. Critical points where the
// polynomial nearly vanishes (double roots) are appended too.
func polyRoots(c []float64, iv interval, out []float64) []float64 {
	d := len(c) - 1
	for d >= 0 && c[d] == 0 {
		d--
	}
	switch {
	case d <= 0:
		return out
	case d == 1:
		if s := -c[0] / c[1]; s >= iv.lo && s <= iv.hi {
			out = append(out, s)
		}
		return out
	case d == 2:
		return quadRoots(c[2], c[1], c[0], iv, out)
	}
	der := make([]float64, d)
	for i := 1; i <= d; i++ {
		der[i-1] = float64(i) * c[i]
	}
	crit := polyRoots(der, iv, nil)
	slices.Sort(crit)
	pts := append(append([]float64{iv.lo}, crit...), iv.hi)
	eval := func(s float64) (v, mag float64) {
		for i := d; i >= 0; i-- {
			v = v*s + c[i]
			mag = mag*math.Abs(s) + math.Abs(c[i])
		}
		return v, mag
	}
	for i := 0; i+1 < len(pts); i++ {
		u, w := pts[i], pts[i+1]
		fu, _ := eval(u)
		fw, _ := eval(w)
		if fu == 0 {
			out = append(out, u)
			continue
		}
		if (fu < 0) == (fw < 0) || fw == 0 {
			continue
		}
		for range 200 {
			m := 0.5 * (u + w)
			if m <= u || m >= w {
				break
			}
			fm, _ := eval(m)
			if (fm < 0) == (fu < 0) {
				u, fu = m, fm
			} else {
				w = m
			}
		}
		out = append(out, u)
	}
	if fe, _ := eval(iv.hi); fe == 0 {
		out = append(out, iv.hi)
	}
	for _, s := range crit {
		if v, mag := eval(s); math.Abs(v) <= 1e-12*mag {
			out = append(out, s)
		}
	}
	return out
}

// quadRoots appends the real roots in iv of a s^2 + b s + c = 0, computed
// without cancellation (Press et al., Numerical Recipes, 3rd ed., sec.
// 5.6, eq. (5.6.4)). A slightly negative discriminant from rounding
// (relative size below 1e-12) is taken as a double root.
func quadRoots(a, b, c float64, iv interval, out []float64) []float64 {
	if a == 0 {
		if b != 0 {
			if s := -c / b; s >= iv.lo && s <= iv.hi {
				out = append(out, s)
			}
		}
		return out
	}
	disc := b*b - 4*a*c
	if disc < 0 {
		if -disc > 1e-12*(b*b+math.Abs(4*a*c)) {
			return out
		}
		disc = 0
	}
	q := -0.5 * (b + math.Copysign(math.Sqrt(disc), b))
	add := func(s float64) {
		if s >= iv.lo && s <= iv.hi {
			out = append(out, s)
		}
	}
	if q == 0 {
		add(0)
		return out
	}
	add(q / a)
	if r := c / q; r != q/a {
		add(r)
	}
	return out
}
