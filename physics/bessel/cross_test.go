package bessel

import (
	"bufio"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// How the expected values were computed.
//
// The reference table physics/bessel/testdata/crosszeros.tsv holds the first roots
// (m = 1..8, 12, 20, 35, 60, 100) of both cross products for c = 1.1,
// 1.5, 2, 3.5, 10, 100 and n = 0, 1, 2, 3, 5, 10, 25, 50, 99, and the
// first three roots of a thin line (c = 1.001) for a few orders, written by
// physics/bessel/testdata/gen_cross.py: brackets from sign changes of the cross
// product on a fine grid in double precision (SciPy 1.10.1), refined with
// mpmath 1.2.1 findroot at mp.dps = 30 and printed to 20 significant
// digits. The method shares nothing with the Go code.
//
// No values of A&S Table 9.7 are used: they are not recalled reliably
// enough to be written down here.
//
// The identities are checked by independent routes: the cross products
// from math.Jn and math.Yn must vanish at the roots; the number of roots
// below x must equal the number of sign changes of the radial
// eigenfunction on [1, c] (Sturm's oscillation theorem), counted on a grid
// with math.Jn and math.Yn; the limits c -> 1 and c -> infinity and the
// McMahon-type expansions of A&S Section 9.5 must be approached.

const (
	// crossTableTol is the relative error allowed against the 30-digit
	// table: the requirement of the coaxial mode solver (issue 11). The
	// measured maximum is given in doc.go.
	crossTableTol = 1e-14
	// crossResidualTol bounds |f(x)| / (|f'(x)| x) at a root x, with f
	// the cross product from math.Jn and math.Yn (accurate to some ulp of
	// the amplitude, less near the turning point of large orders).
	crossResidualTol = 1e-13
	// mcMahonTol is the relative agreement with the McMahon-type
	// expansion of A&S 9.5 where its first neglected term, of order
	// β^-7, is below 1e-15 relative (β >= 300, μ <= 100).
	mcMahonTol = 1e-14
)

// crossRef is one row of the reference table.
type crossRef struct {
	prime bool
	c     float64
	cs    string
	n, m  int
	x     float64
}

// readCrossRef reads physics/bessel/testdata/crosszeros.tsv.
func readCrossRef(t testing.TB) []crossRef {
	t.Helper()
	path := filepath.Join("testdata", "crosszeros.tsv")
	f, err := os.Open(path)
	if err != nil {
		t.Fatalf("reference table: %v", err)
	}
	defer f.Close()
	var rows []crossRef
	sc := bufio.NewScanner(f)
	line := 0
	for sc.Scan() {
		line++
		s := sc.Text()
		if s == "" || strings.HasPrefix(s, "#") {
			continue
		}
		fl := strings.Split(s, "\t")
		if len(fl) != 5 || (fl[0] != "tm" && fl[0] != "te") {
			t.Fatalf("%s:%d: bad row %q", path, line, s)
		}
		c, err1 := strconv.ParseFloat(fl[1], 64)
		n, err2 := strconv.Atoi(fl[2])
		m, err3 := strconv.Atoi(fl[3])
		x, err4 := strconv.ParseFloat(fl[4], 64)
		if err1 != nil || err2 != nil || err3 != nil || err4 != nil || m < 1 {
			t.Fatalf("%s:%d: bad row %q", path, line, s)
		}
		rows = append(rows, crossRef{prime: fl[0] == "te", c: c, cs: fl[1], n: n, m: m, x: x})
	}
	if err := sc.Err(); err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	if len(rows) < 1000 {
		t.Fatalf("%s: %d rows, want the full table", path, len(rows))
	}
	return rows
}

func crossName(prime bool) string {
	if prime {
		return "CrossPrimeZeros"
	}
	return "CrossZeros"
}

func TestCrossTable(t *testing.T) {
	rows := readCrossRef(t)
	type key struct {
		prime bool
		c     float64
		n     int
	}
	got := map[key][]float64{}
	var worst float64
	var worstAt string
	for _, r := range rows {
		k := key{r.prime, r.c, r.n}
		if got[k] == nil {
			got[k] = crossRoots(r.n, r.c, 100, r.prime)
		}
		x := got[k][r.m-1]
		if !tolerance(x, r.x, crossTableTol) {
			t.Errorf("%s(%d, %s)[%d] = %.17g, want %.17g (mpmath)", crossName(r.prime), r.n, r.cs, r.m-1, x, r.x)
		}
		if e := math.Abs(x-r.x) / r.x; e > worst {
			worst, worstAt = e, fmt.Sprintf("%s(%d, %s) m = %d", crossName(r.prime), r.n, r.cs, r.m)
		}
	}
	t.Logf("%d roots; largest relative error against mpmath: %.3g at %s", len(rows), worst, worstAt)
}

// crossResidual returns |f(x)| / (|f'(x)| x) for the TM (prime false) or TE
// cross product f of order n and ratio c, from math.Jn and math.Yn, with
// derivatives from DLMF 10.6.1 and Bessel's equation (DLMF 10.2.1).
func crossResidual(n int, c, x float64, prime bool) float64 {
	// v returns C_n, C'_n, C''_n for C = J (y false) or Y at t.
	v := func(t float64, y bool) (f, d1, d2 float64) {
		fn := math.Jn
		if y {
			fn = math.Yn
		}
		f = fn(n, t)
		d1 = (fn(n-1, t) - fn(n+1, t)) / 2
		if n == 0 {
			d1 = -fn(1, t)
		}
		nu := float64(n)
		d2 = -d1/t - (1-nu*nu/(t*t))*f
		return f, d1, d2
	}
	j1, dj1, d2j1 := v(x, false)
	y1, dy1, d2y1 := v(x, true)
	j2, dj2, d2j2 := v(c*x, false)
	y2, dy2, d2y2 := v(c*x, true)
	var f, df float64
	if prime {
		f = dj1*dy2 - dj2*dy1
		df = d2j1*dy2 + c*dj1*d2y2 - c*d2j2*dy1 - dj2*d2y1
	} else {
		f = j1*y2 - j2*y1
		df = dj1*y2 + c*j1*dy2 - c*dj2*y1 - j2*dy1
	}
	return math.Abs(f) / (math.Abs(df) * x)
}

// TestCrossVanishes checks that the cross products, evaluated
// independently with math.Jn and math.Yn, vanish at the roots, on seeded
// random orders, ratios and indices.
func TestCrossVanishes(t *testing.T) {
	rng := rand.New(rand.NewPCG(20261204, 11))
	for range 60 {
		n := rng.IntN(21)
		c := 1 + math.Exp(rng.Float64()*math.Log(200)-math.Log(20)) // 1.05 .. 11
		count := 1 + rng.IntN(60)
		for _, prime := range []bool{false, true} {
			x := crossRoots(n, c, count, prime)
			for i, xi := range x {
				if r := crossResidual(n, c, xi, prime); r > crossResidualTol {
					t.Errorf("%s(%d, %v): root %d = %.17g has residual %.3g, want <= %g", crossName(prime), n, c, i+1, xi, r, crossResidualTol)
				}
				if i > 0 && !(x[i-1] < xi) {
					t.Errorf("%s(%d, %v): roots %d, %d = %v, %v not increasing", crossName(prime), n, c, i, i+1, x[i-1], xi)
				}
			}
		}
	}
}

// sturmCount returns the number of roots below x of the TM (prime false)
// or TE cross product of order n and ratio c, counted without the code
// under test: the solution u(r) of the radial equation (r u')' +
// (x^2 r - n^2/r) u = 0 with u(1) = 0 (TM) or u'(1) = 0 (TE) has, by
// Sturm's oscillation theorem and the Prüfer angle's growth with x^2, one
// zero in (1, c) per TM root below x; for TE the count is the number of
// zeros plus one if u(c) u'(c) < 0, less the root x = 0 for n = 0
// (derived in the comment above crossRoots). The zeros are counted as sign
// changes on a grid of perRoot points per half wave of u.
func sturmCount(n int, c, x float64, prime bool) int {
	const perRoot = 40
	a, b := math.Jn(n, x), math.Yn(n, x)
	if prime {
		a = (math.Jn(n-1, x) - math.Jn(n+1, x)) / 2
		b = (math.Yn(n-1, x) - math.Yn(n+1, x)) / 2
		if n == 0 {
			a, b = -math.J1(x), -math.Y1(x)
		}
	}
	// u(r) = a Y_n(x r) - b J_n(x r).
	u := func(r float64) float64 { return a*math.Yn(n, x*r) - b*math.Jn(n, x*r) }
	steps := int(perRoot*(c-1)*x/math.Pi) + perRoot
	h := (c - 1) / float64(steps)
	zeros := 0
	prev := u(1 + h/2)
	for i := 1; i < steps; i++ {
		v := u(1 + h/2 + float64(i)*h)
		if i == steps-1 {
			v = u(c)
		}
		if (v < 0) != (prev < 0) {
			zeros++
		}
		prev = v
	}
	if !prime {
		return zeros
	}
	ucc := u(c)
	du := x * (a*(math.Yn(n-1, x*c)-math.Yn(n+1, x*c))/2 - b*(math.Jn(n-1, x*c)-math.Jn(n+1, x*c))/2)
	if n == 0 {
		du = x * (-a*math.Y1(x*c) + b*math.J1(x*c))
	}
	if ucc*du < 0 {
		zeros++
	}
	if n == 0 {
		zeros--
	}
	return zeros
}

// TestCrossCount checks, between consecutive roots and beyond the last,
// that the number of roots below x equals the Sturm count of the radial
// eigenproblem, counted independently (sturmCount), and equals crossCount.
// A skipped or repeated root would break the equality.
func TestCrossCount(t *testing.T) {
	for _, c := range []float64{1.1, 1.5, 2, 3.5, 10} {
		for _, n := range []int{0, 1, 2, 5, 12} {
			for _, prime := range []bool{false, true} {
				x := crossRoots(n, c, 12, prime)
				for i := range x {
					// A point between root i and i+1 (or beyond the last):
					// i+1 roots lie below it.
					p := x[i] * 1.000001
					if i+1 < len(x) {
						p = (x[i] + x[i+1]) / 2
					}
					if got := sturmCount(n, c, p, prime); got != i+1 {
						t.Errorf("%s(%d, %v): Sturm count below %v = %d, want %d", crossName(prime), n, c, p, got, i+1)
					}
					if got := crossCount(n, c, p, prime); got != i+1 {
						t.Errorf("crossCount(%d, %v, %v, %v) = %d, want %d", n, c, p, prime, got, i+1)
					}
				}
				if got := crossCount(n, c, x[0]*0.999999, prime); got != 0 {
					t.Errorf("crossCount(%d, %v, %v, %v) = %d, want 0", n, c, x[0]*0.999999, prime, got)
				}
			}
		}
	}
}

// TestCrossOrdering checks inequalities that follow from the min-max
// principle for the radial eigenproblem (derived): a larger order n adds
// to the potential n^2/r^2, so x_{n,m} < x_{n+1,m} for TM, and for TE with
// n >= 1; Neumann eigenvalues lie below Dirichlet ones of the same index,
// so x'_{n,m} < x_{n,m} for n >= 1. J'_0 = -J_1 (DLMF 10.6.3) makes the TE
// roots of order 0 those of the TM roots of order 1.
func TestCrossOrdering(t *testing.T) {
	const count = 40
	for _, c := range []float64{1.1, 2, 10, 100} {
		tm := make([][]float64, 22)
		te := make([][]float64, 22)
		for n := range tm {
			tm[n] = CrossZeros(n, c, count)
			te[n] = CrossPrimeZeros(n, c, count)
		}
		for n := range len(tm) - 1 {
			for i := range count {
				if !(tm[n][i] < tm[n+1][i]) {
					t.Errorf("c = %v: want x(%d,%d) < x(%d,%d): %v, %v", c, n, i+1, n+1, i+1, tm[n][i], tm[n+1][i])
				}
				if n >= 1 && !(te[n][i] < te[n+1][i]) {
					t.Errorf("c = %v: want x'(%d,%d) < x'(%d,%d): %v, %v", c, n, i+1, n+1, i+1, te[n][i], te[n+1][i])
				}
				if n >= 1 && !(te[n][i] < tm[n][i]) {
					t.Errorf("c = %v: want x'(%d,%d) < x(%d,%d): %v, %v", c, n, i+1, n, i+1, te[n][i], tm[n][i])
				}
			}
		}
		for i := range count {
			if !tolerance(te[0][i], tm[1][i], 4e-16) {
				t.Errorf("c = %v: CrossPrimeZeros(0)[%d] = %.17g, want CrossZeros(1)[%d] = %.17g", c, i, te[0][i], i, tm[1][i])
			}
		}
	}
}

// mcMahonCross returns the McMahon-type expansion of the m-th root of the
// cross product (A&S Section 9.5, formulas for the zeros of
// J_ν(z)Y_ν(λz) - J_ν(λz)Y_ν(z) and of the cross product of derivatives;
// DLMF §10.21(x); recalled from memory, confirmed by this test):
//
//	x ~ β + p/β + (q - p^2)/β^3 + (r - 4pq + 2p^3)/β^5,
//
// β = K π/(c-1) with K the phase level of the root; for TM
// p = (μ-1)/(8c), q = 4(μ-1)(μ-25)(c^3-1)/(3(8c)^3(c-1)),
// r = 32(μ-1)(μ^2-114μ+1073)(c^5-1)/(5(8c)^5(c-1)); for TE
// p = (μ+3)/(8c), q = 4(μ^2+46μ-63)(c^3-1)/(3(8c)^3(c-1)),
// r = 32(μ^3+185μ^2-2053μ+1899)(c^5-1)/(5(8c)^5(c-1)); μ = 4n^2.
func mcMahonCross(n int, c float64, level int, prime bool) float64 {
	mu := 4 * float64(n) * float64(n)
	b := float64(level) * math.Pi / (c - 1)
	c8 := 8 * c
	q3 := (c*c*c - 1) / (3 * c8 * c8 * c8 * (c - 1))
	r5 := (c*c*c*c*c - 1) / (5 * c8 * c8 * c8 * c8 * c8 * (c - 1))
	var p, q, r float64
	if prime {
		p = (mu + 3) / c8
		q = 4 * (mu*mu + 46*mu - 63) * q3
		r = 32 * (mu*mu*mu + 185*mu*mu - 2053*mu + 1899) * r5
	} else {
		p = (mu - 1) / c8
		q = 4 * (mu - 1) * (mu - 25) * q3
		r = 32 * (mu - 1) * (mu*mu - 114*mu + 1073) * r5
	}
	b2 := b * b
	return b + p/b + (q-p*p)/(b*b2) + (r-4*p*q+2*p*p*p)/(b*b2*b2)
}

// TestCrossMcMahon compares roots with large β = K π/(c-1), where the
// expansion's first neglected term is below 1e-15 relative, and so checks
// the limit c -> 1 (parallel plates): x (c-1) -> m π for TM, (m-1) π for
// TE of order n >= 1.
func TestCrossMcMahon(t *testing.T) {
	for _, c := range []float64{1.001, 1.01, 1.1, 1.5} {
		for _, n := range []int{0, 1, 2, 5} {
			for _, prime := range []bool{false, true} {
				cr := crossRoot{n: n, c: c, prime: prime}
				x := crossRoots(n, c, 100, prime)
				for _, m := range []int{1, 2, 10, 100} {
					level := cr.level(m)
					if float64(level)*math.Pi/(c-1) < 300 {
						continue
					}
					want := mcMahonCross(n, c, level, prime)
					if !tolerance(x[m-1], want, mcMahonTol) {
						t.Errorf("%s(%d, %v)[%d] = %.17g, want %.17g (A&S 9.5 McMahon-type)", crossName(prime), n, c, m-1, x[m-1], want)
					}
				}
			}
		}
	}
}

// TestCrossThinTE checks the TE_n1 root of a thin annulus against the
// Rayleigh quotient of the constant trial function (derived): x^2 <=
// 2 n^2 ln c/(c^2-1), with equality approached as c -> 1 (the relative
// gap is of order (c-1)^2).
func TestCrossThinTE(t *testing.T) {
	// thinTol allows a few ulp of rounding in the root and the bound,
	// which at c = 1.001 lie only about 1e-14 apart.
	const thinTol = 1e-15
	for _, c := range []float64{1.001, 1.01, 1.1, 2, 10} {
		for _, n := range []int{1, 2, 7, 40} {
			x := CrossPrimeZeros(n, c, 1)[0]
			fn := float64(n)
			// c - 1 is exact, so the bound is accurate to a few ulp.
			bound := math.Sqrt(2 * fn * fn * math.Log1p(c-1) / ((c - 1) * (c + 1)))
			if !(x < bound*(1+thinTol)) {
				t.Errorf("CrossPrimeZeros(%d, %v)[0] = %v, want < %v (Rayleigh bound)", n, c, x, bound)
			}
			if d := (bound - x) / bound; c < 1.2 && d > (c-1)*(c-1) {
				t.Errorf("CrossPrimeZeros(%d, %v)[0] = %v: gap to the Rayleigh bound %v is %.3g, want <= (c-1)^2", n, c, x, bound, d)
			}
		}
	}
}

// TestCrossLargeRatio checks the limit c -> infinity, where the inner
// conductor vanishes and c x_{n,m} -> j_{n,m} (c x'_{n,m} -> j'_{n,m}),
// the roots of the outer circle alone. To first order (derived: expand
// J_n(cx) about its zero j and use the Wronskian, DLMF 10.5.2)
//
//	TM: c x - j  = -2 ε / (π j J'_n(j)^2),              ε = J_n(x)/Y_n(x),
//	TE: c x - j' = -2 ε' / (π j' (1 - n^2/j'^2) J_n(j')^2), ε' = J'_n(x)/Y'_n(x),
//
// with x = j/c; the neglected terms are smaller than the correction by a
// factor of order (c x - j)/j, below 1e-4 here.
func TestCrossLargeRatio(t *testing.T) {
	// near reports whether got is within 1e-4 of the first-order
	// correction want - j0 (plus rounding) of the limit j0.
	near := func(got, want, j0 float64) bool {
		return math.Abs(got-want) <= 1e-4*math.Abs(want-j0)+1e-15*j0
	}
	dj := func(n int, x float64) float64 { return (math.Jn(n-1, x) - math.Jn(n+1, x)) / 2 }
	dy := func(n int, x float64) float64 { return (math.Yn(n-1, x) - math.Yn(n+1, x)) / 2 }
	for _, c := range []float64{1e3, 1e4} {
		for _, n := range []int{1, 2, 4} {
			j, jp := Zeros(n, 3)
			tm, te := CrossZeros(n, c, 3), CrossPrimeZeros(n, c, 3)
			for i := range 3 {
				x := j[i] / c
				eps := math.Jn(n, x) / math.Yn(n, x)
				d := dj(n, j[i])
				want := j[i] - 2*eps/(math.Pi*j[i]*d*d)
				if !near(c*tm[i], want, j[i]) {
					t.Errorf("c x(%d, %d) at c = %v: %.17g, want %.17g (j = %.17g)", n, i+1, c, c*tm[i], want, j[i])
				}
				x = jp[i] / c
				eps = dj(n, x) / dy(n, x)
				jj := math.Jn(n, jp[i])
				fn := float64(n)
				want = jp[i] - 2*eps/(math.Pi*jp[i]*(1-fn*fn/(jp[i]*jp[i]))*jj*jj)
				if !near(c*te[i], want, jp[i]) {
					t.Errorf("c x'(%d, %d) at c = %v: %.17g, want %.17g (j' = %.17g)", n, i+1, c, c*te[i], want, jp[i])
				}
			}
		}
	}
}

// TestPhaseContinuous checks the unwrapping of θ in besselPhase: along a
// fine grid, θ must increase by about θ' times the step (a wrong multiple
// of 2π would jump by 2π), and φ - θ must stay in (0, π) (π itself where rounding reaches it).
func TestPhaseContinuous(t *testing.T) {
	for _, n := range []int{0, 1, 2, 7, 30, 99, 400} {
		const h = 0.01
		var prev phase
		for i := range 200000 {
			tt := 0.5 + float64(i)*h
			if tt > 3*float64(n)+60 {
				break
			}
			p := besselPhase(n, tt)
			if !(p.gap > 0 && p.gap <= math.Pi) {
				t.Fatalf("n = %d, t = %v: φ - θ = %v, want in (0, π] (π by rounding)", n, tt, p.gap)
			}
			if i > 0 {
				step := (p.frac - prev.frac) + 2*math.Pi*(p.turns-prev.turns)
				want := (p.dth + prev.dth) / 2 * h
				if !(step >= 0) || math.Abs(step-want) > 1e-3*h+1e-12 {
					t.Fatalf("n = %d: θ(%v) - θ(%v) = %v, want %v", n, tt, tt-h, step, want)
				}
			}
			prev = p
		}
	}
}

// TestCrossPrefix checks that a root does not depend on how many are asked
// for.
func TestCrossPrefix(t *testing.T) {
	for _, c := range []float64{1.1, 3.5, 100} {
		for _, n := range []int{0, 3, 60} {
			long := CrossZeros(n, c, 30)
			longP := CrossPrimeZeros(n, c, 30)
			for _, k := range []int{1, 2, 7} {
				short, shortP := CrossZeros(n, c, k), CrossPrimeZeros(n, c, k)
				for i := range k {
					if short[i] != long[i] || shortP[i] != longP[i] {
						t.Errorf("n = %d, c = %v: count %d gives %v, %v at %d, want %v, %v", n, c, k, short[i], shortP[i], i, long[i], longP[i])
					}
				}
			}
		}
	}
}

func TestCrossSpecialCases(t *testing.T) {
	if z := CrossZeros(0, 2, 0); z == nil || len(z) != 0 {
		t.Errorf("CrossZeros(0, 2, 0) = %#v, want empty non-nil", z)
	}
	if z := CrossPrimeZeros(4, 1.5, 0); z == nil || len(z) != 0 {
		t.Errorf("CrossPrimeZeros(4, 1.5, 0) = %#v, want empty non-nil", z)
	}
	for _, c := range []struct {
		name string
		f    func()
		want string
	}{
		{"CrossZeros(-1, 2, 3)", func() { CrossZeros(-1, 2, 3) }, "bessel: CrossZeros: order n must be >= 0, got -1"},
		{"CrossZeros(0, 2, -1)", func() { CrossZeros(0, 2, -1) }, "bessel: CrossZeros: count must be >= 0, got -1"},
		{"CrossZeros(0, 1, 3)", func() { CrossZeros(0, 1, 3) }, "bessel: CrossZeros: radius ratio c must be a finite number > 1, got 1"},
		{"CrossPrimeZeros(2, 0.5, 3)", func() { CrossPrimeZeros(2, 0.5, 3) }, "bessel: CrossPrimeZeros: radius ratio c must be a finite number > 1, got 0.5"},
		{"CrossPrimeZeros(2, NaN, 3)", func() { CrossPrimeZeros(2, math.NaN(), 3) }, "bessel: CrossPrimeZeros: radius ratio c must be a finite number > 1, got NaN"},
		{"CrossZeros(2, +Inf, 3)", func() { CrossZeros(2, math.Inf(1), 3) }, "bessel: CrossZeros: radius ratio c must be a finite number > 1, got +Inf"},
	} {
		func() {
			defer func() {
				if r := recover(); r != c.want {
					t.Errorf("%s panicked with %v, want %q", c.name, r, c.want)
				}
			}()
			c.f()
		}()
	}
}

// TestCrossParallelPlates checks the limit c -> 1 directly: the annulus
// becomes a parallel-plate guide of spacing b - a, where x (c-1) -> K π
// with K = m (TM) or m - 1 (TE, n >= 1). The McMahon-type expansion above
// puts the relative deviation at p (c-1)^2/(K π)^2 to leading order, with
// |p| <= (μ+3)/8; the test allows twice that.
func TestCrossParallelPlates(t *testing.T) {
	const c = 1 + 0x1p-20 // c - 1 exact
	for _, n := range []int{0, 1, 3, 10} {
		mu := 4 * float64(n) * float64(n)
		for _, prime := range []bool{false, true} {
			x := crossRoots(n, c, 5, prime)
			cr := crossRoot{n: n, c: c, prime: prime}
			for m := 1; m <= 5; m++ {
				k := float64(cr.level(m))
				if k == 0 {
					continue
				}
				got := x[m-1] * (c - 1) / (k * math.Pi)
				tol := 2*(mu+3)/8*(c-1)*(c-1)/(k*k*math.Pi*math.Pi) + 1e-15
				if math.Abs(got-1) > tol {
					t.Errorf("%s(%d, 1+2^-20)[%d] (c-1)/(%v π) = %.17g, want 1 within %.3g", crossName(prime), n, m-1, k, got, tol)
				}
			}
		}
	}
}
