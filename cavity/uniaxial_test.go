package cavity

import (
	"errors"
	"math"
	"strings"
	"testing"

	"cylcav/physics"
)

// uniaxial is a crystal as two isotropic media, one per axis, for the
// tests' independent routes.
type uniaxial struct{ Perp, Par, Both physics.Medium }

// sapphire returns the library's sapphire row and its two axes as
// isotropic media.
func sapphire(t *testing.T) uniaxial {
	t.Helper()
	d, err := physics.LookupDielectric("sapphire")
	if err != nil {
		t.Fatal(err)
	}
	if !d.Medium.Uniaxial() {
		t.Fatalf("library sapphire is not uniaxial: %+v", d.Medium)
	}
	perp, par := d.Medium, d.Medium
	perp.EpsRParallel = 0
	par.EpsR, par.EpsRParallel = d.Medium.EpsRParallel, 0
	return uniaxial{Perp: perp, Par: par, Both: d.Medium}
}

// freq returns Frequency of mode m of c filled with md.
func freq(c Cavity, md physics.Medium, m Mode) float64 { c.Fill = md; return c.Frequency(m) }

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
		got := freq(c, s.Both, m)
		if w := iso(tc.want, m); math.Abs(got-w) > 1e-13*w {
			t.Errorf("%s: %.12g Hz, isotropic cavity with eps %g: %.12g Hz", tc.mode, got, tc.want.Eps(), w)
		}
	}
	for _, name := range []string{"TM011", "TM112", "TE011"} {
		m, _ := ParseMode(name)
		same := s.Both
		same.EpsRParallel = same.EpsR
		got := freq(c, same, m)
		if w := iso(s.Perp, m); math.Abs(got-w) > 1e-13*w {
			t.Errorf("isotropic crystal %s: %.12g Hz, want %.12g Hz", name, got, w)
		}
	}
}

// TestUniaxialMaxwell checks the TM_nmp frequency (p >= 1) against
// Maxwell's equations in the crystal, an independent route: the field
// E_z = J_n(kc r) cos(n phi) cos(beta z), E_t = -(eps_par/eps_perp)
// (beta/kc^2) grad_t[J_n cos(n phi)] sin(beta z) (div D = 0, derived) must
// satisfy curl curl E = k0^2 eps E with k0 = omega/c0 from
// Frequency. The curl curl is taken numerically by central
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
		f := freq(c, s.Both, m)
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

// TestUniaxialByHand works three modes of a sapphire-filled cavity by hand
// from the resonance conditions (TE: k0^2 eps_perp = kc^2 + beta^2; TM:
// k0^2 = kc^2/eps_par + beta^2/eps_perp), with the Bessel zeros typed from
// DLMF Table 10.21.1 (j_{0,1} = 2.404825558, j'_{0,1} = j_{1,1} =
// 3.831705970, 10 digits), and checks that the mode list (Lowest) gives
// the same frequencies as Frequency for a uniaxial fill.
func TestUniaxialByHand(t *testing.T) {
	const tol = 1e-9 // the 10-digit zeros
	s := sapphire(t)
	c := Cavity{Radius: 0.010, Length: 0.012, Fill: s.Both}
	ep, ez := 9.3899, 11.5867 // the library row (Krupka et al. 1999, recalled)
	if s.Both.Eps() != ep || s.Both.EpsPar() != ez {
		t.Fatalf("library sapphire eps %g/%g, want %g/%g", s.Both.Eps(), s.Both.EpsPar(), ep, ez)
	}
	j01, jp01 := 2.404825558, 3.831705970
	k := func(kcsq, betasq float64, te bool) float64 {
		if te {
			return math.Sqrt((kcsq + betasq) / ep)
		}
		return math.Sqrt(kcsq/ez + betasq/ep)
	}
	beta1 := math.Pi / c.Length
	for _, tc := range []struct {
		mode string
		k0   float64
	}{
		{"TE011", k(math.Pow(jp01/c.Radius, 2), beta1*beta1, true)},
		{"TM010", k(math.Pow(j01/c.Radius, 2), 0, false)},
		{"TM011", k(math.Pow(j01/c.Radius, 2), beta1*beta1, false)},
	} {
		m, _ := ParseMode(tc.mode)
		want := physics.SpeedOfLight * tc.k0 / (2 * math.Pi)
		if got := c.Frequency(m); math.Abs(got-want) > tol*want {
			t.Errorf("%s: Frequency = %.10g Hz, want %.10g Hz (by hand)", tc.mode, got, want)
		}
	}
	list, err := c.Lowest(40)
	if err != nil {
		t.Fatal(err)
	}
	for i, r := range list {
		if f := c.Frequency(r.Mode); f != r.Frequency {
			t.Errorf("Lowest: %s at %.12g Hz, Frequency gives %.12g Hz", r.Mode, r.Frequency, f)
		}
		if i > 0 && list[i-1].Frequency > r.Frequency {
			t.Errorf("Lowest not ascending at %s", r.Mode)
		}
	}
	// Every mode up to the 40th must be listed: count by brute force over
	// the indices.
	top := list[len(list)-1].Frequency
	n := 0
	for _, fam := range []Family{TE, TM} {
		for nn := 0; nn <= 12; nn++ {
			for mm := 1; mm <= 8; mm++ {
				for p := 0; p <= 12; p++ {
					m := Mode{Family: fam, N: nn, M: mm, P: p}
					if m.Validate() != nil {
						continue
					}
					if c.Frequency(m) <= top {
						n++
					}
				}
			}
		}
	}
	if n != len(list) {
		t.Errorf("Lowest lists %d modes up to %.6g Hz, brute force counts %d", len(list), top, n)
	}
	// A negative crystal (eps_par < eps_perp) takes the other branch of
	// the TE0 roots.
	neg := Cavity{Radius: 0.010, Length: 0.012, Fill: physics.Medium{Name: "negative", EpsR: 4, EpsRParallel: 2}}
	nl, err := neg.Lowest(30)
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range nl {
		if f := neg.Frequency(r.Mode); f != r.Frequency {
			t.Errorf("negative crystal: %s at %.12g Hz, Frequency gives %.12g Hz", r.Mode, r.Frequency, f)
		}
	}
}

// TestUniaxialRefused: the models that assume an isotropic fill refuse a
// uniaxial one (TM modes of the per-mode models; the whole-cavity models
// always) and accept TE modes, whose fields are those of eps_perp.
func TestUniaxialRefused(t *testing.T) {
	s := sapphire(t)
	c := Cavity{Radius: 0.010, Length: 0.012, Fill: s.Both}
	te, tm := Mode{Family: TE, N: 0, M: 1, P: 1}, Mode{Family: TM, N: 0, M: 1, P: 0}
	if _, err := c.ModeField(te); err != nil {
		t.Errorf("ModeField(TE011) in sapphire: %v", err)
	}
	if _, err := c.ModeField(tm); err == nil || !strings.Contains(err.Error(), "TE modes only") {
		t.Errorf("ModeField(TM010) in sapphire: error %v, want a refusal", err)
	}
	// Size solves the uniaxial condition for every constraint: the sized
	// cavity resonates on target by Frequency, and keeps the constraint.
	tm1 := Mode{Family: TM, N: 0, M: 1, P: 1}
	for _, m := range []Mode{te, tm1, {Family: TM, N: 1, M: 1, P: 1}} {
		for _, by := range []Constraint{ByRatio(1.3), ByDiameter(0.012), ByLength(0.009)} {
			sz, err := Size(m, 10e9, s.Both, by)
			if err != nil {
				t.Errorf("Size(%s, %s) in sapphire: %v", m, by, err)
				continue
			}
			if f := sz.Frequency(m); math.Abs(f-10e9) > 1e-12*10e9 {
				t.Errorf("Size(%s, %s) in sapphire resonates at %.12g Hz", m, by, f)
			}
		}
	}
	// The least diameter of a TM mode is that of the TM cut-off with
	// eps_par: 2 j01 c/(2 pi f sqrt(eps_par)) (by hand, TM0m0 limit).
	_, err := Size(tm1, 10e9, s.Both, ByDiameter(0.001))
	least := 2 * 2.404825558 * physics.SpeedOfLight / (2 * math.Pi * 10e9 * math.Sqrt(s.Both.EpsPar()))
	if err == nil || !strings.Contains(err.Error(), shortLength(least)) {
		t.Errorf("Size(TM011, 1 mm) error %v, want the least diameter %s", err, shortLength(least))
	}
	if _, err := c.ModeField(tm); err == nil || !errors.Is(err, physics.ErrUniaxial) {
		t.Errorf("ModeField(TM010) error %v, want one matching physics.ErrUniaxial", err)
	}
	if _, err := c.Clearance(te, ClearanceOptions{}); err == nil || !strings.Contains(err.Error(), "isotropic fills only") {
		t.Errorf("Clearance in sapphire: error %v, want a refusal", err)
	}
	if _, err := Optimize(DesignSpec{Mode: te, Frequency: 10e9, Fill: s.Both}); err == nil || !strings.Contains(err.Error(), "optimiser") {
		t.Errorf("Optimize in sapphire: error %v, want a refusal", err)
	}
}
