package bessel

import "fmt"

// JZeros returns the first count positive zeros j_{n,1} < j_{n,2} < ... <
// j_{n,count} of the Bessel function of the first kind J_n, in ascending
// order. They fix the cutoff and resonant frequencies of TM modes of a
// circular guide or cavity.
//
// Accuracy: relative error at most 2 ulp (about 4.4e-16) against a
// 30-digit reference for 0 <= n <= 200, 1 <= m <= 200; J_n vanishes at
// every zero returned to rounding for orders and counts up to at least
// 1000. Cost: O(n + count), about 0.1 us per zero.
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
	mr.run(count)
	return mr.j[:count:count]
}

// JPrimeZeros returns the first count positive zeros j'_{n,1} < j'_{n,2}
// < ... < j'_{n,count} of J'_n, the derivative of the Bessel function of
// the first kind, in ascending order, with x = 0 excluded: j'_{0,1} =
// 3.8317..., the first zero of J_1 (J'_0 = -J_1), and j'_{1,1} = 1.8411....
// They fix the cutoff and resonant frequencies of TE modes of a circular
// guide or cavity.
//
// Accuracy: as for JZeros.
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
	mr.run(count)
	return mr.jp[:count:count]
}

// Zeros returns the first count zeros of J_n and of J'_n together: j is
// JZeros(n, count) and jp is JPrimeZeros(n, count). Both come out of one
// march along the axis, so Zeros costs about as much as either of them
// alone; it is the call to use for tables of TE and TM modes.
//
// Special cases are as for JZeros and JPrimeZeros.
func Zeros(n, count int) (j, jp []float64) {
	check("Zeros", n, count)
	if count == 0 {
		return []float64{}, []float64{}
	}
	mr := newMarch(n, count)
	mr.run(count)
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
