package axisym

import (
	"math"

	"cylcav/cavity"
	"cylcav/physics/bessel"
)

// guide is the set of azimuthally symmetric (n = 0) modes of one family
// kept for a circular (inner = 0) or coaxial waveguide cross-section.
//
// The transverse electric field of mode m is e_m(r) = norm_m Z_m(kc_m r),
// along r for TM (from -grad of the potential) and along phi for TE, with
// the cylinder function of order 1
//
//	Z(x) = J1(x)                                  circular guide
//	Z(x) = J1(x) Y0(kc a) - Y1(x) J0(kc a)        coaxial TM0m
//	Z(x) = J1(x) Y1(kc a) - Y1(x) J1(kc a)        coaxial TE0m
//
// (Marcuvitz, Waveguide Handbook, 1951, sec. 2.4, as recalled; the TM form
// is -d/dr of J0(kc r) Y0(kc a) - Y0(kc r) J0(kc a), DLMF 10.6.3), so that
// E_z vanishes on both conductors for TM and E_phi for TE. The cutoffs are
// kc = j_{0,m}/b (TM) and j_{1,m}/b (TE) for a circular guide of radius b,
// and x_m/a for a coaxial one, x_m the roots of the cross products
// J0(x)Y0(cx) - J0(cx)Y0(x) (TM) and J1(x)Y1(cx) - J1(cx)Y1(x) (TE),
// c = b/a (bessel.CrossZeros). A coaxial TM set starts with the TEM mode,
// kc = 0 and e(r) = norm/r.
type guide struct {
	fam          cavity.Family
	inner, outer float64
	kc           []float64
	ca, cb       []float64 // Z_nu = ca J_nu + cb Y_nu for every order nu
	norm         []float64
	tem          bool // mode 0 is TEM
}

// newGuide returns the first count modes of family fam of the cross-section
// inner < r < outer (inner = 0 for a circular guide).
func newGuide(fam cavity.Family, inner, outer float64, count int) guide {
	g := guide{fam: fam, inner: inner, outer: outer}
	order := 0
	if fam == cavity.TE {
		order = 1
	}
	switch {
	case inner == 0:
		for _, x := range bessel.JZeros(order, count) {
			g.kc = append(g.kc, x/outer)
			g.ca = append(g.ca, 1)
			g.cb = append(g.cb, 0)
		}
	default:
		n := count
		if fam == cavity.TM {
			g.tem = true
			g.kc, g.ca, g.cb = append(g.kc, 0), append(g.ca, 0), append(g.cb, 0)
			n--
		}
		for _, x := range bessel.CrossZeros(order, outer/inner, n) {
			k := x / inner
			ya, ja := math.Y0(x), math.J0(x)
			if order == 1 {
				ya, ja = math.Y1(x), math.J1(x)
			}
			// Scale the pair to unit size; the normalisation fixes the rest.
			s := math.Hypot(ya, ja)
			g.kc = append(g.kc, k)
			g.ca = append(g.ca, ya/s)
			g.cb = append(g.cb, -ja/s)
		}
	}
	g.norm = make([]float64, len(g.kc))
	for m := range g.kc {
		g.norm[m] = 1 / math.Sqrt(2*math.Pi*radial(g, m, g, m, inner, outer))
	}
	return g
}

// z returns the cylinder function Z_nu(x) of mode m.
func (g guide) z(m, nu int, x float64) float64 {
	j := math.Jn(nu, x)
	if g.cb[m] == 0 {
		return g.ca[m] * j
	}
	return g.ca[m]*j + g.cb[m]*math.Yn(nu, x)
}

// radial returns int_lo^hi r f_i(r) h_j(r) dr for the unnormalised mode
// functions f_i = Z(kc_i r) of g and h_j of h (1/r for a TEM mode), in closed
// form:
//
//   - two Bessel-type modes with p != q: Lommel's integral for cylinder
//     functions of order 1 (DLMF 10.22.5),
//     [r (p Z2(p r) W1(q r) - q Z1(p r) W2(q r)) / (p^2 - q^2)];
//   - equal wavenumbers (to lommelTie): the equal-argument form (DLMF
//     10.22.5, second part), [r^2/4 (2 Z1 W1 - Z0 W2 - Z2 W0)];
//   - a TEM mode and a Bessel-type one: int Z1(q r) dr = [-Z0(q r)/q]
//     (DLMF 10.6.3, Z0' = -Z1);
//   - two TEM modes: ln(hi/lo).
//
// Derived from the cited identities; the tests check every case by
// quadrature.
func radial(g guide, i int, h guide, j int, lo, hi float64) float64 {
	p, q := g.kc[i], h.kc[j]
	ti, tj := g.tem && i == 0, h.tem && j == 0
	switch {
	case ti && tj:
		return math.Log(hi / lo)
	case ti:
		return -(h.z(j, 0, q*hi) - h.z(j, 0, q*lo)) / q
	case tj:
		return -(g.z(i, 0, p*hi) - g.z(i, 0, p*lo)) / p
	}
	if math.Abs(p-q) <= lommelTie*math.Max(p, q) {
		k := 0.5 * (p + q)
		f := func(r float64) float64 {
			if r == 0 {
				return 0
			}
			x := k * r
			return r * r / 4 * (2*g.z(i, 1, x)*h.z(j, 1, x) - g.z(i, 0, x)*h.z(j, 2, x) - g.z(i, 2, x)*h.z(j, 0, x))
		}
		return f(hi) - f(lo)
	}
	f := func(r float64) float64 {
		if r == 0 {
			return 0
		}
		return r * (p*g.z(i, 2, p*r)*h.z(j, 1, q*r) - q*g.z(i, 1, p*r)*h.z(j, 2, q*r)) / (p*p - q*q)
	}
	return f(hi) - f(lo)
}

// lommelTie is the relative distance of two wavenumbers below which radial
// uses the equal-argument form: it balances the cancellation of the general
// form (about 1e-16/tie) against the first-order error of the limit (about
// tie).
const lommelTie = 1e-8

// contains reports whether the cross-section of g lies inside that of w
// (so that g's modes can carry the aperture field of a junction).
func contains(w, g guide) bool {
	return g.inner >= w.inner && g.outer <= w.outer
}

// coupling returns the matrix M (len(w.kc) x len(g.kc), row-major) of
// overlap integrals
//
//	M[i][j] = 2 pi int e_w,i(r) e_g,j(r) r dr
//
// over the cross-section of g, which must lie inside that of w (contains).
// Matching the transverse electric field, zero on the metal face around
// the aperture, gives V_w = M V_g; matching the magnetic field on the
// aperture gives I_g = M^T I_w (Wexler 1967; Patzelt and Arndt 1982). For
// one cross-section the modes coincide and M is the (truncated) identity.
func coupling(w, g guide) []float64 {
	nw, ng := len(w.kc), len(g.kc)
	m := make([]float64, nw*ng)
	if w.inner == g.inner && w.outer == g.outer {
		for i := range min(nw, ng) {
			m[i*ng+i] = 1
		}
		return m
	}
	for i := range w.kc {
		for j := range g.kc {
			m[i*ng+j] = 2 * math.Pi * w.norm[i] * g.norm[j] * radial(w, i, g, j, g.inner, g.outer)
		}
	}
	return m
}
