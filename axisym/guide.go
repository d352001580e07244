package axisym

import (
	"math"

	"cylcav/cavity"
	"cylcav/physics/bessel"
)

// cutoffs returns the transverse wavenumbers kc (rad/m) of the first count
// azimuthally symmetric (n = 0) modes of family fam in a circular guide of
// radius a: j_{0,m}/a for TM0m and j'_{0,m}/a = j_{1,m}/a for TE0m
// (Pozar, Microwave Engineering, 4th ed., sec. 3.4; J'_0 = -J_1, DLMF
// 10.6.3).
func cutoffs(fam cavity.Family, a float64, count int) []float64 {
	var z []float64
	if fam == cavity.TE {
		z = bessel.JZeros(1, count)
	} else {
		z = bessel.JZeros(0, count)
	}
	kc := make([]float64, count)
	for i, x := range z {
		kc[i] = x / a
	}
	return kc
}

// norm returns the factor N that makes the transverse electric mode function
// e(r) = N J1(kc r) of an n = 0 mode of a circular guide of radius a
// orthonormal, 2 pi int_0^a e(r)^2 r dr = 1. For TM0m (e along r, from
// -grad J0(kc r)) kc a = j_{0,m} and for TE0m (e along phi) kc a = j_{1,m};
// with DLMF 10.22.5 at equal arguments,
//
//	int_0^a r J1(kc r)^2 dr = (a^2/2) [J1(kc a)^2 - J0(kc a) J2(kc a)],
//
// which is (a^2/2) J1(j_{0,m})^2 for TM and (a^2/2) J0(j_{1,m})^2 for TE
// (J2 = -J0 at a zero of J1, DLMF 10.6.1). Derived; the test checks the
// normalisation by quadrature.
func norm(fam cavity.Family, kc, a float64) float64 {
	x := kc * a
	var v float64
	if fam == cavity.TE {
		v = math.J0(x)
	} else {
		v = math.J1(x)
	}
	return 1 / (math.Sqrt(math.Pi) * a * math.Abs(v))
}

// lommel returns int_0^a r J1(p r) J1(q r) dr by Lommel's integral (DLMF
// 10.22.5, nu = 1),
//
//	[r (p J2(p r) J1(q r) - q J1(p r) J2(q r)) / (p^2 - q^2)]_0^a,
//
// and its limit for p = q (same equation, equal arguments). Closer than
// lommelTie the general form loses digits to cancellation, so the limit is
// used; the error of either is then about 1e-8 relative.
func lommel(p, q, a float64) float64 {
	if math.Abs(p-q) <= lommelTie*math.Max(p, q) {
		x := 0.5 * (p + q) * a
		j1 := math.J1(x)
		return a * a / 2 * (j1*j1 - math.J0(x)*math.Jn(2, x))
	}
	pa, qa := p*a, q*a
	return a * (p*math.Jn(2, pa)*math.J1(qa) - q*math.J1(pa)*math.Jn(2, qa)) / (p*p - q*q)
}

// lommelTie is the relative distance of p and q below which lommel uses the
// equal-argument limit: it balances the cancellation of the general form
// (about 1e-16/tie) against the first-order error of the limit (about tie).
const lommelTie = 1e-8

// coupling returns the matrix M (nb x na, row-major) of overlap integrals
//
//	M[i][j] = 2 pi int_0^a e_b,i(r) e_a,j(r) r dr
//
// between the n = 0 modes of family fam of a wide guide of radius b (cutoffs
// kb) and a narrow one of radius a <= b (cutoffs ka), over the aperture
// r < a. Matching the transverse electric field, zero on the step face,
// gives V_b = M V_a; matching the magnetic field on the aperture gives
// I_a = M^T I_b (Wexler 1967; Patzelt and Arndt 1982). With a = b the modes
// coincide and M is the identity (truncated).
func coupling(fam cavity.Family, kb, ka []float64, b, a float64) []float64 {
	nb, na := len(kb), len(ka)
	m := make([]float64, nb*na)
	if a == b {
		for i := range min(nb, na) {
			m[i*na+i] = 1
		}
		return m
	}
	for i, q := range kb {
		nq := norm(fam, q, b)
		for j, p := range ka {
			m[i*na+j] = 2 * math.Pi * nq * norm(fam, p, a) * lommel(p, q, a)
		}
	}
	return m
}
