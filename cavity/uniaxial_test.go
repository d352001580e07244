package cavity

import (
	"math"
	"testing"

	"cylcav/physics"
)

// sapphire returns the library's sapphire rows as a uniaxial crystal.
func sapphire(t *testing.T) Uniaxial {
	t.Helper()
	perp, err := physics.LookupDielectric("sapphire-perp")
	if err != nil {
		t.Fatal(err)
	}
	par, err := physics.LookupDielectric("sapphire-par")
	if err != nil {
		t.Fatal(err)
	}
	return Uniaxial{Perp: perp.Medium, Par: par.Medium}
}

// TestUniaxialLimits: TE modes see eps_perp alone and TM0m0 modes eps_par
// alone, so both equal the isotropic cavity (Cavity.Frequency) filled with
// that one permittivity; an isotropic "crystal" gives the isotropic
// cavity for every mode.
func TestUniaxialLimits(t *testing.T) {
	s := sapphire(t)
	c := Cavity{Radius: 0.01, Length: 0.012}
	iso := func(md physics.Medium, m Mode) float64 { cc := c; cc.Fill = md; return cc.Frequency(m) }
	for _, tc := range []struct {
		mode string
		want physics.Medium
	}{{"TE011", s.Perp}, {"TE111", s.Perp}, {"TE213", s.Perp}, {"TM010", s.Par}, {"TM120", s.Par}} {
		m, _ := ParseMode(tc.mode)
		got, err := c.UniaxialFrequency(m, s)
		if err != nil {
			t.Fatal(err)
		}
		if w := iso(tc.want, m); math.Abs(got-w) > 1e-13*w {
			t.Errorf("%s: %.12g Hz, isotropic cavity with eps %g: %.12g Hz", tc.mode, got, tc.want.Eps(), w)
		}
	}
	for _, name := range []string{"TM011", "TM112", "TE011"} {
		m, _ := ParseMode(name)
		got, _ := c.UniaxialFrequency(m, Uniaxial{Perp: s.Perp, Par: s.Perp})
		if w := iso(s.Perp, m); math.Abs(got-w) > 1e-13*w {
			t.Errorf("isotropic crystal %s: %.12g Hz, want %.12g Hz", name, got, w)
		}
	}
	if _, err := (Cavity{Radius: 0.01, Length: 0.01, Fill: s.Perp}).UniaxialFrequency(Mode{Family: TE, N: 0, M: 1, P: 1}, s); err == nil {
		t.Error("a crystal in a filled cavity: no error")
	}
}

// TestUniaxialMaxwell checks the TM_nmp frequency (p >= 1) against
// Maxwell's equations in the crystal, an independent route: the field
// E_z = J_n(kc r) cos(n phi) cos(beta z), E_t = -(eps_par/eps_perp)
// (beta/kc^2) grad_t[J_n cos(n phi)] sin(beta z) (div D = 0, derived) must
// satisfy curl curl E = k0^2 eps E with k0 = omega/c0 from
// UniaxialFrequency. The curl curl is taken numerically by central
// differences in Cartesian coordinates at interior points; the residual
// relative to k0^2 eps |E| must be at the level of the difference error
// (step h = 2e-5 a: truncation about h^2, rounding about 1e-16/h^2).
func TestUniaxialMaxwell(t *testing.T) {
	const resTol = 1e-5
	s := sapphire(t)
	c := Cavity{Radius: 0.01, Length: 0.013}
	ep, ez := s.Perp.Eps(), s.Par.Eps()
	for _, name := range []string{"TM011", "TM112", "TM021"} {
		m, _ := ParseMode(name)
		f, err := c.UniaxialFrequency(m, s)
		if err != nil {
			t.Fatal(err)
		}
		k0 := 2 * math.Pi * f / physics.SpeedOfLight
		kc, beta, _ := c.Wavenumbers(m)
		n := float64(m.N)
		// E in Cartesian components at (x, y, z).
		field := func(x, y, z float64) [3]float64 {
			r, phi := math.Hypot(x, y), math.Atan2(y, x)
			u := kc * r
			jn := math.Jn(m.N, u)
			jp := besselJPrime(m.N, u)
			// grad_t psi in (r, phi) components.
			gr, gphi := kc*jp*math.Cos(n*phi), -n*kc*besselJOverX(m.N, u)*math.Sin(n*phi)
			amp := -(ez / ep) * beta / (kc * kc) * math.Sin(beta*z)
			er, ephi := amp*gr, amp*gphi
			return [3]float64{er*math.Cos(phi) - ephi*math.Sin(phi), er*math.Sin(phi) + ephi*math.Cos(phi), jn * math.Cos(n*phi) * math.Cos(beta*z)}
		}
		h := 2e-5 * c.Radius
		// d/dx_i of component j by central differences.
		deriv := func(g func(x, y, z float64) [3]float64, p [3]float64, i int) [3]float64 {
			a, b := p, p
			a[i] += h
			b[i] -= h
			fa, fb := g(a[0], a[1], a[2]), g(b[0], b[1], b[2])
			return [3]float64{(fa[0] - fb[0]) / (2 * h), (fa[1] - fb[1]) / (2 * h), (fa[2] - fb[2]) / (2 * h)}
		}
		curl := func(g func(x, y, z float64) [3]float64) func(x, y, z float64) [3]float64 {
			return func(x, y, z float64) [3]float64 {
				p := [3]float64{x, y, z}
				dx, dy, dz := deriv(g, p, 0), deriv(g, p, 1), deriv(g, p, 2)
				return [3]float64{dy[2] - dz[1], dz[0] - dx[2], dx[1] - dy[0]}
			}
		}
		cc := curl(curl(field))
		for _, p := range [][3]float64{{0.003, 0.001, 0.004}, {-0.002, 0.005, 0.009}, {0.006, -0.004, 0.002}} {
			e := field(p[0], p[1], p[2])
			got := cc(p[0], p[1], p[2])
			want := [3]float64{k0 * k0 * ep * e[0], k0 * k0 * ep * e[1], k0 * k0 * ez * e[2]}
			scale := k0 * k0 * ez * math.Sqrt(e[0]*e[0]+e[1]*e[1]+e[2]*e[2])
			for i := range got {
				if math.Abs(got[i]-want[i]) > resTol*scale {
					t.Errorf("%s at %v: (curl curl E)_%d = %.8g, k0^2 eps E = %.8g", name, p, i, got[i], want[i])
				}
			}
		}
		// The isotropic formula with either permittivity fails the check:
		// the test can tell.
		kIso := 2 * math.Pi * (func() float64 { cc := c; cc.Fill = s.Perp; return cc.Frequency(m) }()) / physics.SpeedOfLight
		if math.Abs(kIso-k0) < 1e-3*k0 {
			t.Errorf("%s: uniaxial and isotropic-perp frequencies coincide; the check would not discriminate", name)
		}
	}
}
