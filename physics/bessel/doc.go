// Package bessel computes the positive zeros j_{n,m} of the Bessel
// functions of the first kind J_n and j'_{n,m} of their derivatives J'_n,
// for integer orders n >= 0. In a circular waveguide or cavity of radius a
// the TM_nm modes have cutoff wavenumber j_{n,m}/a and the TE_nm modes
// j'_{n,m}/a, so these numbers fix every mode of a cylindrical resonator.
//
// The entry points are JZeros and JPrimeZeros, and Zeros, which returns
// both lists from one computation.
//
// # Method
//
// The zeros of one order are found in increasing order by a march along
// the real axis in the manner of Glaser, Liu and Rokhlin (2007), with no
// search for sign changes:
//
//  1. Start: at x0 = max(n - 2 n^(1/3), n/2), left of the first zero,
//     J'_n/J_n comes from the continued fraction for J_{n+1}/J_n (DLMF
//     10.10.1, 10.6.2); J_n is still small there, which damps any error of
//     the start along the march. For n = 0 the march starts at x0 = 1
//     with math.J0 and math.J1.
//  2. Expansion: about the current point x0 the solution of Bessel's
//     equation (DLMF 10.2.1) with the current value and slope is expanded
//     in a Taylor series whose coefficients follow from the equation by a
//     five-term recurrence. About 25 terms give full double precision over
//     a step of a quarter period.
//  3. First approximation of the next zero: for the first four zeros of
//     each kind, McMahon's expansion (DLMF 10.21.19, 10.21.20) for n = 0,
//     the large-order expansions DLMF 10.21.40 for m = 1, and otherwise the
//     leading term of Olver's uniform expansion (DLMF 10.21.41-10.21.43)
//     with the Airy zeros (DLMF 9.9); beyond that, polynomial extrapolation
//     of the zeros already found.
//  4. Polish: fifth-order Schroeder iteration on the Taylor polynomial,
//     with the higher derivatives taken from Bessel's equation. One
//     evaluation of the polynomial suffices for about 94% of the zeros of
//     the 201 x 200 table, two for the rest.
//  5. Move: the zero becomes the next expansion point, where the solution
//     is known exactly up to a factor (value 0 at a zero of J_n, slope 0 at
//     a zero of J'_n). The zero is formed as a double-double and its
//     rounding error is carried into the state, so rounding does not
//     accumulate along the march. The zeros of J_n and J'_n alternate
//     (DLMF 10.21.3) and the march stops at both, a quarter period apart,
//     whichever list is asked for, so the three entry points return the
//     same numbers to the last bit.
//
// Each zero found is checked against its first approximation and against
// the sign pattern of J_n and J'_n, so a zero cannot be skipped silently;
// a rejected approximation is replaced by the uniform asymptotic one,
// which lies within the basin of the polish for every zero of the table.
// The cost is O(n^(1/3)) for the start and O(1) per zero, about 0.1 us:
// the whole table of j_{n,m} and j'_{n,m} for n <= 200, m <= 200 (80,400
// numbers) takes under 10 ms (see BenchmarkTable).
//
// # Accuracy
//
// Against a 30-digit mpmath table (testdata/bessel) every zero of the
// table n = 0..200, m = 1..200 is within 1 ulp (relative error at most
// 2.3e-16), and about 93% of them are correctly rounded. The tests hold
// the error to 1e-15. The position is carried without drift: j_{0,200000}
// and j_{1,200000} agree with McMahon's expansion to the last bit. For
// orders and counts beyond the table (tested to n = 1000 with m = 1000,
// and n = 20000) J_n and J'_n, evaluated independently by math.Jn, vanish
// at the zeros to rounding.
//
// References:
//   - DLMF: NIST Digital Library of Mathematical Functions, release 1.1.x,
//     https://dlmf.nist.gov/, chapters 9 (Airy functions) and 10 (Bessel
//     functions): 10.2.1 (Bessel's equation), 10.6.1-10.6.3 (recurrences
//     and derivatives), 10.21 (zeros).
//   - M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions,
//     NBS AMS 55, 1964, Section 9.5 and Table 9.5 (zeros of J_n and J'_n).
//   - A. Glaser, X. Liu and V. Rokhlin, A fast algorithm for the
//     calculation of the roots of special functions, SIAM J. Sci. Comput.
//     29(4), 1420-1438, 2007.
//   - F. W. J. Olver, The asymptotic expansion of Bessel functions of large
//     order, Phil. Trans. R. Soc. Lond. A 247, 328-368, 1954.
//   - J. McMahon, On the roots of the Bessel and certain related functions,
//     Annals of Mathematics 9, 23-30, 1894.
//   - W. Gautschi, Computational aspects of three-term recurrence
//     relations, SIAM Review 9(1), 24-82, 1967.
//   - A. S. Householder, The Numerical Treatment of a Single Nonlinear
//     Equation, McGraw-Hill, 1970 (Schroeder's higher-order iterations).
//   - T. J. Dekker, A floating-point technique for extending the available
//     precision, Numer. Math. 18, 224-242, 1971; D. E. Knuth, The Art of
//     Computer Programming, vol. 2, Section 4.2.2 (error-free sums).
package bessel
