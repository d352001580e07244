package bessel

import "fmt"

// JZeros returns the first count positive zeros j_{n,1} < j_{n,2} < ... <
// j_{n,count} of the Bessel function of the first kind J_n, in ascending
// order. They fix the cutoff and resonant frequencies of TM modes of a
// circular guide or cavity.
//
// Accuracy: within 1 ulp (relative error below 2.3e-16) of a 30-digit
// reference for 0 <= n <= 200, 1 <= m <= 200, correctly rounded for about
// 93% of them; J_n vanishes at every zero returned to rounding for orders
// and counts up to at least 1000. A zero does not depend on count, and
// JZeros(n, count) equals the first list of Zeros(n, count). Cost:
// O(n^(1/3) + count), about 0.2 us per zero.
//
// Special cases are:
//
//	JZeros(n, 0) = []float64{} (empty, non-nil)
//	JZeros(n, count) panics if n < 0 or count < 0
//
// Negative arguments are programmer errors, like a negative length in
// make; callers that take n or count from users validate them first.
func JZeros(n, count int) []float64 {
	check("JZeros", n, count)
	if count == 0 {
		return []float64{}
	}
	mr := newMarch(n, count)
	mr.run(count, 0)
	return mr.j[:count:count]
}

// JPrimeZeros returns the first count positive zeros j'_{n,1} < j'_{n,2}
// < ... < j'_{n,count} of J'_n, the derivative of the Bessel function of
// the first kind, in ascending order, with x = 0 excluded: j'_{0,1} =
// 3.8317..., the first zero of J_1 (J'_0 = -J_1), and j'_{1,1} = 1.8411....
// They fix the cutoff and resonant frequencies of TE modes of a circular
// guide or cavity.
//
// Accuracy: as for JZeros; JPrimeZeros(n, count) equals the second list
// of Zeros(n, count).
//
// Special cases are:
//
//	JPrimeZeros(n, 0) = []float64{} (empty, non-nil)
//	JPrimeZeros(n, count) panics if n < 0 or count < 0
func JPrimeZeros(n, count int) []float64 {
	check("JPrimeZeros", n, count)
	if count == 0 {
		return []float64{}
	}
	mr := newMarch(n, count)
	mr.run(0, count)
	return mr.jp[:count:count]
}

// Zeros returns the first count zeros of J_n and of J'_n together: j is
// JZeros(n, count) and jp is JPrimeZeros(n, count), equal to the last bit.
// All three walk through the zeros of both kinds, which alternate, so
// Zeros costs about as much as either of the others alone; it is the call
// to use for tables of TE and TM modes.
//
// Special cases are as for JZeros and JPrimeZeros.
func Zeros(n, count int) (j, jp []float64) {
	check("Zeros", n, count)
	if count == 0 {
		return []float64{}, []float64{}
	}
	mr := newMarch(n, count)
	mr.run(count, count)
	return mr.j[:count:count], mr.jp[:count:count]
}

// check panics with a message naming the function, the argument and its
// valid range when n or count is negative.
func check(fn string, n, count int) {
	if n < 0 {
		panic(fmt.Sprintf("bessel: %s: order n must be >= 0, got %d", fn, n))
	}
	if count < 0 {
		panic(fmt.Sprintf("bessel: %s: count must be >= 0, got %d", fn, count))
	}
}
