// Package bessel computes the positive zeros j_{n,m} of the Bessel
// functions of the first kind J_n and j'_{n,m} of their derivatives J'_n,
// for integer orders n >= 0. In a circular waveguide or cavity of radius a
// the TM_nm modes have cutoff wavenumber j_{n,m}/a and the TE_nm modes
// j'_{n,m}/a, so these numbers fix every mode of a cylindrical resonator.
//
// The entry points are JZeros and JPrimeZeros, and Zeros, which returns
// both lists from one computation.
//
// For coaxial guides of radii a < b = c a, CrossZeros and CrossPrimeZeros
// return the roots x of the cross products J_n(x)Y_n(cx) - J_n(cx)Y_n(x)
// (TM_nm cutoff k_c = x/a) and J'_n(x)Y'_n(cx) - J'_n(cx)Y'_n(x) (TE_nm);
// see "Cross products" below.
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
// Against a 30-digit mpmath table (physics/bessel/testdata) every zero of the
// table n = 0..200, m = 1..200 is within 1 ulp (relative error at most
// 2.3e-16), and about 93% of them are correctly rounded. The tests hold
// the error to 1e-15. The position is carried without drift: j_{0,200000}
// and j_{1,200000} agree with McMahon's expansion to the last bit. For
// orders and counts beyond the table (tested to n = 1000 with m = 1000,
// and n = 20000) J_n and J'_n, evaluated independently by math.Jn, vanish
// at the zeros to rounding.
//
// # Cross products
//
// Method (cross.go, phase.go). In the modulus-phase form J_n = M cos θ,
// Y_n = M sin θ, J'_n = N cos φ, Y'_n = N sin φ (DLMF 10.18.4, 10.18.5)
// the cross products are M(x)M(cx) sin(θ(cx) - θ(x)) and
// N(x)N(cx) sin(φ(cx) - φ(x)), so each root is a level of a phase
// difference: the m-th TM root is where θ(cx) - θ(x) = m π, the m-th TE
// root where φ(cx) - φ(x) = (m-1) π (n >= 1) or m π (n = 0). The levels
// follow from Sturm's oscillation theorem for the radial eigenproblem on
// [a, b], of which the roots are the eigenvalues (derived in cross.go), so
// the phase difference counts the roots below any x: none can be skipped
// or repeated, and its sign brackets each root. A priori bounds from the
// Rayleigh quotient keep every iterate inside the root's interval.
//
//  1. Values: at each point J_n, J'_n, Y_n, Y'_n come from J_0, J_1, Y_0,
//     Y_1 (for x >= 25 all four from one sine and cosine and Hankel's
//     expansions, DLMF 10.17.3; below, the math package) and recurrence in
//     the order: forward for Y, forward for J when x >= n, otherwise
//     Miller's backward recurrence for J_n/J_{n-1} with the size from the
//     Wronskian (DLMF 10.5.4), scaled so that no order or argument
//     overflows. The multiple of 2π in θ is fixed by the
//     Debye phase (DLMF 10.19.6); φ - θ in (0, π) by the Wronskian.
//  2. First approximation: for the first root of an order, the thin-annulus
//     value sqrt((Kπ/(c-1))^2 + (2n/(1+c))^2) for c < 3, else j_{n,m}/c or
//     j'_{n,m}/c (the outer circle alone); for the next ones a second-order
//     step of the phase difference by π, then polynomial extrapolation in m.
//  3. Polish: Halley's method on the phase difference, with the first two
//     derivatives from DLMF 10.18.8 and Bessel's equation, inside the
//     bracket (bisection when a step leaves it). Points close to the last
//     full evaluation come from the Taylor series of Bessel's equation
//     about it (taylor.go), so a root costs about 1.2 full evaluations at x
//     and at c x. The rounding of c x is carried exactly (FMA) into the
//     phase.
//
// The lowest TE root of each order n >= 1 (level 0) of a thin line is a
// special case: there φ(cx) - φ(x) is of order c - 1, and a difference of
// two phases would lose digits like 1/(c-1). For c x - x <= 2 it is formed
// instead from the solution of Bessel's equation with value 1 and slope 0
// at x, expanded to c x (derived in cross.go), without cancellation.
//
// Accuracy: against the 30-digit mpmath table (physics/bessel/testdata: c = 1.1,
// 1.5, 2, 3.5, 10, 100 with n up to 99 and m up to 100, and the first
// roots at c = 1.001; 1,425 roots) the largest relative error is 2.8e-16,
// and 89% of the roots are correctly rounded; the tests hold 1e-14. The
// table of 100 x 100 roots (n = 0..99, m = 1..100) of one ratio costs 5.6
// to 7.9 ms of CPU time for TM and 5.9 to 9.0 ms for TE over those six
// ratios (c = 100 the dearest), 0.6 to 1.0 times the zero table of
// BenchmarkTable measured alongside on the same (shared, loaded) machine;
// see BenchmarkCrossTable. A root costs about 1.2 full evaluations at x and
// at c x; a full evaluation costs O(n).
//
// References:
//   - DLMF: NIST Digital Library of Mathematical Functions, release 1.1.x,
//     https://dlmf.nist.gov/, chapters 9 (Airy functions) and 10 (Bessel
//     functions): 10.2.1 (Bessel's equation), 10.5 (Wronskians),
//     10.6.1-10.6.3 (recurrences and derivatives), 10.17 (Hankel's
//     expansions), 10.9.30 (Nicholson's
//     formula), 10.18 (modulus and phase), 10.19.6 (Debye), 10.21 (zeros;
//     10.21(x) zeros of cross products).
//   - M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions,
//     NBS AMS 55, 1964, Section 9.5 and Table 9.5 (zeros of J_n and J'_n;
//     McMahon-type expansions of the zeros of cross products, and Table
//     9.7 of them).
//   - E. A. Coddington and N. Levinson, Theory of Ordinary Differential
//     Equations, McGraw-Hill, 1955, Chapter 8 (Sturm's oscillation
//     theorem, the Prüfer angle).
//   - W. Gautschi, Computational aspects of three-term recurrence
//     relations, SIAM Review 9(1), 24-82, 1967 (Miller's algorithm).
//   - A. Glaser, X. Liu and V. Rokhlin, A fast algorithm for the
//     calculation of the roots of special functions, SIAM J. Sci. Comput.
//     29(4), 1420-1438, 2007.
//   - F. W. J. Olver, The asymptotic expansion of Bessel functions of large
//     order, Phil. Trans. R. Soc. Lond. A 247, 328-368, 1954.
//   - J. McMahon, On the roots of the Bessel and certain related functions,
//     Annals of Mathematics 9, 23-30, 1894.
//   - A. S. Householder, The Numerical Treatment of a Single Nonlinear
//     Equation, McGraw-Hill, 1970 (Schroeder's higher-order iterations).
//   - T. J. Dekker, A floating-point technique for extending the available
//     precision, Numer. Math. 18, 224-242, 1971; D. E. Knuth, The Art of
//     Computer Programming, vol. 2, Section 4.2.2 (error-free sums).
package bessel
