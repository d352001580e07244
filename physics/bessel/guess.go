package bessel

import "math"

// This file holds the first approximations from which the march polishes
// each zero: published asymptotic expansions for the first few zeros of an
// order and polynomial extrapolation along the zeros already found for the
// rest.

// guess returns a first approximation of the next zero the march seeks:
// j_{n,m} or j'_{n,m} with m one more than the number already found. With
// uniform set, or for the first formulaZeros zeros of a kind, it uses an
// asymptotic expansion; otherwise it extrapolates the zeros of the same kind
// already found, which is cheaper and, from m = 5 on, closer.
func (mr *march) guess(uniform bool) float64 {
	found := mr.j
	if mr.prime {
		found = mr.jp
	}
	m := len(found) + 1
	if uniform || m <= formulaZeros {
		return mr.asymptotic(m)
	}
	// The zeros are smooth in m, and the degree grows as the history does.
	return extrapolate(found[len(found)-extrapDepth(m):])
}

// extrapolate returns the next member of the smooth sequence z (3, 4 or 5
// terms) by polynomial extrapolation through all of them:
// z_next ~ sum_i (-1)^i binom(d+1, i+1) z_{last-i}, Newton's
// backward-difference formula with the (d+1)-th difference set to 0.
func extrapolate(z []float64) float64 {
	switch len(z) {
	case 3:
		return 3*z[2] - 3*z[1] + z[0]
	case 4:
		return 4*z[3] - 6*z[2] + 4*z[1] - z[0]
	default:
		return 5*z[4] - 10*z[3] + 10*z[2] - 5*z[1] + z[0]
	}
}

const (
	// formulaZeros is how many zeros of each kind come from asymptotic
	// formulas before extrapolation takes over.
	formulaZeros = 4
)

// extrapDepth returns how many previous zeros the extrapolation for the
// m-th zero uses (m > formulaZeros): 3 (quadratic) while the history is
// short and near the turning point, where high differences are large, then
// 4 (cubic), then 5 (quartic).
func extrapDepth(m int) int {
	switch {
	case m <= 7:
		return 3
	case m == 8:
		return 4
	default:
		return 5
	}
}

// asymptotic returns an approximation of the m-th zero of J_n (mr.prime
// false) or J'_n (mr.prime true) from published expansions, good to about
// 1e-3 relative or better at every n and m:
//   - n = 0: McMahon's expansion for large m (DLMF 10.21.19 and its
//     counterpart for j', DLMF 10.21.20), which is accurate for order 0
//     already at m = 1;
//   - n >= 1, m = 1: the large-order expansions of DLMF 10.21.40;
//   - n >= 1, m >= 2: the leading term of Olver's uniform expansion (DLMF
//     10.21.41, 10.21.42), with the Airy-function zeros a_m and a'_m.
func (mr *march) asymptotic(m int) float64 {
	nu := mr.nu
	if mr.n == 0 {
		if mr.prime {
			// j'_{0,m} is McMahon's (m+1)-th zero of J'_0 when x = 0
			// counts as the first: beta = (m + 1 - 3/4) pi.
			return mcMahonPrime(0, (float64(m)+0.25)*math.Pi)
		}
		return mcMahon(0, (float64(m)-0.25)*math.Pi)
	}
	if m == 1 {
		c := math.Cbrt(nu) // DLMF 10.21.40, nu^(1/3)
		if mr.prime {
			return nu + 0.8086165*c + 0.072490/c - 0.05097/nu + 0.0094/(nu*c*c)
		}
		return nu + 1.8557571*c + 1.033150/c - 0.00397/nu - 0.0908/(nu*c*c) + 0.043/(nu*nu*c)
	}
	var a float64
	if mr.prime {
		a = airyPrimeZero(m)
	} else {
		a = airyZero(m)
	}
	// DLMF 10.21.41 (10.21.42 for j'): j ~ nu z(zeta) with
	// zeta = nu^(-2/3) a, where by DLMF 10.20.3
	// (2/3)(-zeta)^(3/2) = sqrt(z^2-1) - arcsec z; multiplied by nu,
	// sqrt(x^2 - nu^2) - nu arccos(nu/x) = (2/3)(-a)^(3/2) at x = nu z.
	return debyePhaseInverse(nu, 2.0/3.0*math.Pow(-a, 1.5))
}

// mcMahon returns McMahon's expansion of j_{nu,m} in beta =
// (m + nu/2 - 1/4) pi, DLMF 10.21.19, to the term in beta^-5, for
// mu = 4 nu^2.
func mcMahon(mu, beta float64) float64 {
	b := 8 * beta
	b2 := b * b
	return beta - (mu-1)/b*(1+4*(7*mu-31)/(3*b2)+32*(83*mu*mu-982*mu+3779)/(15*b2*b2))
}

// mcMahonPrime returns McMahon's expansion of j'_{nu,m} in beta' =
// (m + nu/2 - 3/4) pi, DLMF 10.21.20, to the term in beta'^-5, for
// mu = 4 nu^2.
func mcMahonPrime(mu, beta float64) float64 {
	b := 8 * beta
	b2 := b * b
	return beta - (mu+3)/b - 4*(7*mu*mu+82*mu-9)/(3*b*b2) -
		32*(83*mu*mu*mu+2075*mu*mu-3039*mu+3537)/(15*b*b2*b2)
}

// debyePhaseInverse returns, to about 1e-9 relative, the x > nu >= 0 at
// which psi(x) = sqrt(x^2 - nu^2) - nu arccos(nu/x) equals phi > 0.
//
// psi is increasing and convex on x > nu (psi' = sqrt(x^2-nu^2)/x), so
// Newton's method started above the root converges to it monotonically. Two
// upper bounds of the root give the start: psi(x) >= x - nu pi/2, and,
// writing x = nu sec(b), psi = nu (tan b - b) >= nu b^3/3, so that
// b <= (3 phi/nu)^(1/3) (both derived).
func debyePhaseInverse(nu, phi float64) float64 {
	if nu == 0 {
		return phi
	}
	x := phi + nu*math.Pi/2
	if b := math.Cbrt(3 * phi / nu); b < 1.5 {
		x = math.Min(x, nu/math.Cos(b))
	}
	for range 60 {
		w := math.Sqrt((x - nu) * (x + nu))
		f := w - nu*math.Acos(nu/x) - phi
		dx := f * x / w
		x -= dx
		if !(dx > 1e-9*x) {
			break
		}
	}
	return x
}

// Airy zeros a_1..a_4 and a'_1..a'_4 to 16 digits, from DLMF Table 9.9.1
// (A&S Table 10.13); checked against mpmath 1.2.1 airyaizero.
var (
	airyZeros      = [...]float64{-2.338107410459767, -4.087949444130971, -5.520559828095551, -6.786708090071759}
	airyPrimeZeros = [...]float64{-1.018792971647471, -3.248197582179837, -4.820099211178736, -6.163307355639487}
)

// airyZero returns a_m, the m-th zero of Ai, from the table above or from
// a_m = -T(3 pi (4m-1)/8) with T(t) ~ t^(2/3) (1 + 5/48 t^-2 - 5/36 t^-4),
// DLMF 9.9.6 and 9.9.18.
func airyZero(m int) float64 {
	if m <= len(airyZeros) {
		return airyZeros[m-1]
	}
	t := 3 * math.Pi * float64(4*m-1) / 8
	t2 := 1 / (t * t)
	return -math.Pow(t, 2.0/3) * (1 + t2*(5.0/48-t2*5.0/36))
}

// airyPrimeZero returns a'_m, the m-th zero of Ai', from the table above or
// from a'_m = -U(3 pi (4m-3)/8) with U(t) ~ t^(2/3) (1 - 7/48 t^-2 +
// 35/288 t^-4), DLMF 9.9.7 and 9.9.19.
func airyPrimeZero(m int) float64 {
	if m <= len(airyPrimeZeros) {
		return airyPrimeZeros[m-1]
	}
	t := 3 * math.Pi * float64(4*m-3) / 8
	t2 := 1 / (t * t)
	return -math.Pow(t, 2.0/3) * (1 - t2*(7.0/48-t2*35.0/288))
}
