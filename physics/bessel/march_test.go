package bessel

import (
	"math"
	"testing"
)

// Tests of the parts of the march: the first approximations, the start
// values, and the recovery from a first approximation outside the basin of
// the polish. The true zeros come from Zeros, which TestZerosTable checks
// against mpmath.

// basinTol is the largest distance from the true zero, as a fraction of
// the distance to the nearer neighbouring zero of the other kind, that a
// first approximation may have. Within that distance the polish converges
// to the right zero (the target behaves like a sine between its extrema,
// and the fifth-order step converges from within half a quarter period).
const basinTol = 0.5

// neighbours returns the zeros of the other kind around the m-th zero
// (1-based) of J_n (prime false) or J'_n (prime true); lo is the start of
// the march, start, when the zero is the first of the alternation.
func neighbours(n, m int, prime bool, j, jp []float64, start float64) (lo, hi float64) {
	lo = start
	i := m - 1
	switch {
	case prime && n >= 1: // j_{n,m-1} < j'_{n,m} < j_{n,m}
		if i > 0 {
			lo = j[i-1]
		}
		return lo, j[i]
	case prime: // n = 0: j_{0,m} < j'_{0,m} < j_{0,m+1}
		return j[i], j[i+1]
	case n >= 1: // j'_{n,m} < j_{n,m} < j'_{n,m+1}
		return jp[i], jp[i+1]
	default: // j'_{0,m-1} < j_{0,m} < j'_{0,m}
		if i > 0 {
			lo = jp[i-1]
		}
		return lo, jp[i]
	}
}

// TestAsymptoticGuess checks that the asymptotic first approximations,
// used for m <= formulaZeros and as the fallback for every m, fall within
// the basin of the polish over the table range, and within half the
// distance from the zero to the point the march seeks it from (which
// substepShare relies on).
func TestAsymptoticGuess(t *testing.T) {
	const count = 200
	for n := 0; n <= 200; n++ {
		j, jp := Zeros(n, count+1)
		mr := newMarch(n, 0)
		start := mr.xh
		for _, prime := range []bool{false, true} {
			mr.prime = prime
			for m := 1; m <= count; m++ {
				z := j[m-1]
				if prime {
					z = jp[m-1]
				}
				lo, hi := neighbours(n, m, prime, j, jp, start)
				g := mr.asymptotic(m)
				if d := math.Abs(g - z); d > basinTol*math.Min(z-lo, hi-z) {
					t.Errorf("asymptotic(n=%d, m=%d, prime=%v) = %v, want within %v of %v (neighbours %v, %v)",
						n, m, prime, g, basinTol, z, lo, hi)
				}
			}
		}
	}
}

// TestMarchRecovers feeds the march first approximations outside the basin
// and checks that it rejects them and then finds the right zero from the
// asymptotic one.
func TestMarchRecovers(t *testing.T) {
	for _, n := range []int{0, 1, 7, 150} {
		jp := JPrimeZeros(n, 40)
		mr := newMarch(n, 40)
		for len(mr.j) < 30 {
			mr.next()
		}
		// The march now seeks j'_{n,31} (n >= 1) or j'_{0,30} (n = 0).
		want, other := jp[30], jp[31]
		if n == 0 {
			want, other = jp[29], jp[30]
		}
		for _, bad := range []float64{
			mr.xh - 1,          // behind the march
			other,              // the zero after next of the same kind
			(want + other) / 2, // between the next two zeros of the kind
		} {
			if mr.seek(bad) {
				t.Fatalf("n = %d: seek(%v) accepted a zero, want rejection (next zero %v)", n, bad, want)
			}
		}
		if !mr.seek(mr.guess(true)) {
			t.Fatalf("n = %d: seek(asymptotic guess) failed", n)
		}
		got := mr.jp[len(mr.jp)-1]
		if !veryclose(got, want) {
			t.Errorf("n = %d: zero after recovery = %.17g, want %.17g", n, got, want)
		}
	}
}

func TestLogDerivative(t *testing.T) {
	// J'_n(x)/J_n(x) computed with mpmath 1.2.1, mp.dps = 30:
	// besselj(n, x, 1)/besselj(n, x). The tolerance allows for the
	// cancellation in n/x - J_{n+1}/J_n (a factor of up to 5 here) on
	// top of a few ulp from the recurrence.
	const tol = 1e-14
	for _, c := range []struct {
		n       int
		x, want float64
	}{
		{1, 0.5, 1.873677226691419014},
		{10, 5, 1.7609164621625186669},
		{200, 188, 0.38077141973943373128},
		{1000, 980, 0.21396435475570885728},
	} {
		if got := logDerivative(c.n, c.x); !tolerance(got, c.want, tol) {
			t.Errorf("logDerivative(%d, %v) = %.17g, want %.17g", c.n, c.x, got, c.want)
		}
	}
}

func TestDebyePhaseInverse(t *testing.T) {
	// debyePhaseInverse stops Newton's method at a step below 1e-9
	// relative; the iteration converges quadratically, so the last step
	// bounds the error, and psi amplifies it by at most psi' x / psi,
	// which is of order 1 here.
	const debyeTol = 1e-8
	for _, nu := range []float64{0, 0.5, 1, 10, 1000} {
		for _, phi := range []float64{1e-3, 0.1, 1, 10, 1e3, 1e5} {
			x := debyePhaseInverse(nu, phi)
			got := math.Sqrt(x*x-nu*nu) - nu*math.Acos(nu/x)
			if nu == 0 {
				got = x
			}
			if !tolerance(got, phi, debyeTol) {
				t.Errorf("psi(debyePhaseInverse(%v, %v) = %v) = %v, want %v", nu, phi, x, got, phi)
			}
		}
	}
}

func TestAiryZeros(t *testing.T) {
	// a_5, a_6, a'_5, a'_6 from DLMF Table 9.9.1, checked with mpmath
	// 1.2.1 airyaizero; the asymptotic forms of DLMF 9.9.6, 9.9.7 with two
	// correction terms are good to about 1e-8 there.
	const airyTol = 1e-7
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"airyZero(5)", airyZero(5), -7.944133587120853},
		{"airyZero(6)", airyZero(6), -9.022650853340980},
		{"airyPrimeZero(5)", airyPrimeZero(5), -7.372177255047770},
		{"airyPrimeZero(6)", airyPrimeZero(6), -8.488486734019722},
	} {
		if !tolerance(c.got, c.want, airyTol) {
			t.Errorf("%s = %.16g, want %.16g", c.name, c.got, c.want)
		}
	}
}

// TestCorrectionOrder checks the fifth order of one polishing step: from
// a distance delta of a zero it must land within about delta^5, far
// closer than Newton's delta^2. The zeros are j_{7,2} = 14.821268727013171
// and j'_{7,2} = 12.932386237089577 (mpmath 1.2.1 besseljzero, 30 digits,
// rounded), and J_7, J'_7 come from math.Jn.
func TestCorrectionOrder(t *testing.T) {
	const n = 7
	// jnFloor is the floor of the expected error: math.Jn and the rounded
	// reference zeros are good to a few ulp of x ~ 15, about 1e-14.
	const jnFloor = 1e-14
	for _, c := range []struct {
		prime bool
		zero  float64
	}{
		{false, 14.821268727013171},
		{true, 12.932386237089577},
	} {
		for _, delta := range []float64{0.2, -0.1, 0.03} {
			x := c.zero + delta
			y0 := math.Jn(n, x)
			y1 := (math.Jn(n-1, x) - math.Jn(n+1, x)) / 2
			d, r := correction(c.prime, n*n, x, y0, y1)
			got := math.Abs(x + d - c.zero)
			want := math.Max(math.Pow(math.Abs(delta), 5), jnFloor)
			if got > want {
				t.Errorf("correction(prime=%v) from zero%+g: error %.3g, want <= %.3g (Newton step error %.3g)",
					c.prime, delta, got, want, math.Abs(x+r-c.zero))
			}
		}
	}
}
