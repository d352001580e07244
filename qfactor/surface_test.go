package qfactor

import (
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"strings"
	"testing"

	"cylcav/physics"
)

// Tolerances for the surface-resistance tests.
const (
	// roundingTol covers a few roundings in closed forms evaluated two ways.
	roundingTol = 1e-14
	// odeTol is the agreement of the layered closed form with the RK4
	// integration of the field equations (20000 steps over at most a few
	// skin depths: step error (h/delta)^4 ~ 1e-16 per step).
	odeTol = 1e-9
	// bookRoundingTol covers values printed to 3 significant digits.
	bookRoundingTol = 5e-3
)

func near(a, b, tol float64) bool {
	if a == b {
		return true
	}
	return math.Abs(a-b) <= tol*math.Max(math.Abs(a), math.Abs(b))
}

func mustConductor(t testing.TB, name string) physics.Conductor {
	t.Helper()
	c, err := physics.LookupConductor(name)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// TestSkinEffectPozar checks the classical model against textbook numbers.
func TestSkinEffectPozar(t *testing.T) {
	// Pozar, Microwave Engineering, 4th ed., sec. 6.4, example of a
	// PTFE-filled copper TE011 cavity at 5 GHz: sigma = 5.813e7 S/m gives
	// Rs = 1.84e-2 ohm (recalled from memory; printed to 3 digits).
	if got, want := SurfaceResistance(5e9, 5.813e7, 1), 1.84e-2; !near(got, want, bookRoundingTol) {
		t.Errorf("SurfaceResistance(5 GHz, copper) = %g, want %g", got, want)
	}
	// Skin depth of copper at 10 GHz, 0.66 um (Pozar, 4th ed., sec. 1.4 and
	// its table of skin depths; recalled from memory, 2 digits).
	if got, want := SkinDepth(10e9, 5.813e7, 1), 0.66e-6; !near(got, want, 1e-2) {
		t.Errorf("SkinDepth(10 GHz, copper) = %g, want %g", got, want)
	}
}

// TestSkinEffectIdentities checks Rs = 1/(sigma delta) (Pozar sec. 1.7),
// Rs proportional to sqrt(f mu/sigma), and delta proportional to
// 1/sqrt(f mu sigma), on seeded random inputs.
func TestSkinEffectIdentities(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for range 1000 {
		f := math.Pow(10, 6+6*rng.Float64())
		sigma := math.Pow(10, 5+4*rng.Float64())
		mu := 1 + 100*rng.Float64()
		rs, d := SurfaceResistance(f, sigma, mu), SkinDepth(f, sigma, mu)
		if got := rs * sigma * d; !near(got, 1, roundingTol) {
			t.Errorf("Rs sigma delta at f=%g sigma=%g mu=%g = %g, want 1", f, sigma, mu, got)
		}
		if got, want := SurfaceResistance(4*f, sigma, mu), 2*rs; !near(got, want, roundingTol) {
			t.Errorf("SurfaceResistance(4f) = %g, want 2 Rs(f) = %g", got, want)
		}
		if got, want := SkinDepth(f, 4*sigma, mu), d/2; !near(got, want, roundingTol) {
			t.Errorf("SkinDepth(4 sigma) = %g, want delta/2 = %g", got, want)
		}
	}
}

// TestConductivityTemperature checks the linear model against the
// temperature dependence of handbook resistivities: the ratio rho(100 C)/
// rho(20 C) from the CRC Handbook, 97th ed., Electrical resistivity of pure
// metals (recalled from memory: Cu 1.678 at 293 K, 1.725 at 300 K, 2.402 at
// 400 K; Ag 1.587, 1.629, 2.241; Al 2.650, 2.733, 3.87 uohm cm), linearly
// interpolated to 373 K. Tolerance: the curvature of rho(T) and the
// interpolation, about 1 %.
func TestConductivityTemperature(t *testing.T) {
	const curvatureTol = 0.02
	interp := func(r300, r400 float64) float64 { return r300 + (373.15-300)/100*(r400-r300) }
	for _, tc := range []struct {
		name string
		want float64 // rho(373 K)/rho(293 K)
	}{
		{"copper", interp(1.725, 2.402) / 1.678},
		{"silver", interp(1.629, 2.241) / 1.587},
		{"aluminium", interp(2.733, 3.87) / 2.650},
	} {
		c := mustConductor(t, tc.name)
		s, err := Conductivity(c, physics.ZeroCelsius+100)
		if err != nil {
			t.Fatal(err)
		}
		if got := c.Conductivity / s; !near(got, tc.want, curvatureTol) {
			t.Errorf("rho(100 C)/rho(20 C) of %s = %.4f, want %.4f", tc.name, got, tc.want)
		}
	}
	cu := mustConductor(t, "copper")
	for _, temp := range []float64{0, 293.15} {
		if s, err := Conductivity(cu, temp); err != nil || s != cu.Conductivity {
			t.Errorf("Conductivity(copper, %g) = %g, %v, want %g", temp, s, err, cu.Conductivity)
		}
	}
	// IACS copper at 60 C: rho = rho20 (1 + 0.00393 * 40) (IACS definition of alpha).
	if s, _ := Conductivity(cu, physics.ZeroCelsius+60); !near(s, 58e6/(1+0.00393*40), roundingTol) {
		t.Errorf("Conductivity(copper, 60 C) = %g, want %g", s, 58e6/(1+0.00393*40))
	}
	for _, tc := range []struct {
		c    physics.Conductor
		temp float64
		want string
	}{
		{cu, 4.2, "the linear resistivity model holds from -50.00 C to 200.0 C, got 4.200 K"},
		{cu, physics.ZeroCelsius + 300, "got 300.0 C"},
		{cu, math.NaN(), "linear resistivity model"},
		{physics.Conductor{Name: "user", Conductivity: 5e7}, 330, "no resistivity temperature coefficient"},
		{physics.Conductor{Name: "user", Conductivity: 5e7, Alpha: 0.009, AlphaKnown: true, TMin: 10, TMax: 400}, 20, "non-positive resistivity"},
		{physics.Conductor{}, 0, `conductor "user": conductivity must be finite and > 0 S/m, got 0 S/m`},
		{physics.Conductor{Name: "x", Conductivity: math.Inf(1)}, 0, "conductivity must be finite"},
	} {
		_, err := Conductivity(tc.c, tc.temp)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("Conductivity(%q, %g) error %v, want it to contain %q", tc.c.Name, tc.temp, err, tc.want)
		}
	}
}

// TestRoughnessLimits checks the published limit behaviour of both models:
// K = 1 for a smooth surface and K -> 2 for a very rough one (Hammerstad &
// Bekkadal 1975; Groiss et al. 1996), and that K grows with roughness.
func TestRoughnessLimits(t *testing.T) {
	const limitTol = 1e-5 // Groiss at rms = 1000 delta: 1 - exp(-(5e-4)^1.6) = 5.2e-6
	delta := 1e-6
	rng := rand.New(rand.NewPCG(5, 6))
	for _, m := range []RoughnessModel{HammerstadBekkadal, Groiss} {
		if k, err := RoughnessFactor(m, 0, delta); err != nil || k != 1 {
			t.Errorf("RoughnessFactor(%v, 0) = %g, %v, want 1", m, k, err)
		}
		if k, _ := RoughnessFactor(m, 1e-3*delta, delta); math.Abs(k-1) > limitTol {
			t.Errorf("RoughnessFactor(%v, delta/1000) = %g, want 1", m, k)
		}
		if k, _ := RoughnessFactor(m, 1e3*delta, delta); math.Abs(k-2) > limitTol {
			t.Errorf("RoughnessFactor(%v, 1000 delta) = %g, want 2", m, k)
		}
		prev := 1.0
		for _, r := range sortedRandom(rng, 200) {
			k, _ := RoughnessFactor(m, r*delta, delta)
			if k < prev || k > 2 {
				t.Errorf("RoughnessFactor(%v, %g delta) = %g, want in [%g, 2]", m, r, k, prev)
			}
			prev = k
		}
		if p, err := ParseRoughnessModel(strings.ToUpper(m.String())); err != nil || p != m {
			t.Errorf("ParseRoughnessModel(%q) = %v, %v, want %v", m.String(), p, err, m)
		}
	}
	// Both formulas at rms = delta, evaluated with Python 3's math module
	// from the published expressions (a typo check):
	// 1 + (2/pi) atan(1.4) = 1.6051369134225069 and
	// 1 + exp(-0.5^1.6) = 1.7190121825285036.
	for _, tc := range []struct {
		m    RoughnessModel
		want float64
	}{{HammerstadBekkadal, 1.6051369134225069}, {Groiss, 1.7190121825285036}} {
		if k, _ := RoughnessFactor(tc.m, delta, delta); !near(k, tc.want, roundingTol) {
			t.Errorf("RoughnessFactor(%v, delta) = %.16g, want %.16g", tc.m, k, tc.want)
		}
	}
	for _, tc := range []struct {
		m          RoughnessModel
		rms, delta float64
		want       string
	}{
		{HammerstadBekkadal, -1e-6, 1e-6, "roughness must be finite and >= 0 m, got -1e-06 m"},
		{Groiss, math.NaN(), 1e-6, "roughness must be finite"},
		{Groiss, 1e-6, 0, "skin depth must be finite and > 0 m, got 0 m"},
		{RoughnessModel(7), 1e-6, 1e-6, "unknown roughness model 7"},
	} {
		if _, err := RoughnessFactor(tc.m, tc.rms, tc.delta); err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("RoughnessFactor(%v, %g, %g) error %v, want %q", tc.m, tc.rms, tc.delta, err, tc.want)
		}
	}
	if _, err := ParseRoughnessModel("smooth"); err == nil || !strings.Contains(err.Error(), "use hammerstad or groiss") {
		t.Errorf("ParseRoughnessModel(smooth) error %v", err)
	}
	if s := RoughnessModel(9).String(); s != "RoughnessModel(9)" {
		t.Errorf("RoughnessModel(9).String() = %q", s)
	}
}

// sortedRandom returns n log-uniform values in [1e-3, 1e3], ascending.
func sortedRandom(rng *rand.Rand, n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = math.Pow(10, -3+6*float64(i)/float64(n)+6*rng.Float64()/float64(n))
	}
	return v
}

// layeredODE computes the surface impedance of a layer over a thick base by
// integrating the field equations dE/dz = -j omega mu H, dH/dz = -sigma E
// (Maxwell's curl equations for E_x, H_y in a good conductor) with
// fourth-order Runge-Kutta from the interface, where the base presents its
// half-space impedance E/H = Z2, up to the surface: Zs = E(0)/H(0). It is an
// independent route to the transmission-line closed form.
func layeredODE(f, sigma1, mu1, t, sigma2, mu2 float64) complex128 {
	const steps = 20000
	jwm := complex(0, 2*math.Pi*f*mu1*physics.VacuumPermeability)
	s := complex(sigma1, 0)
	deriv := func(e, h complex128) (complex128, complex128) { return -jwm * h, -s * e }
	e, h := wallImpedance(f, sigma2, mu2), complex(1, 0)
	dz := complex(-t/steps, 0)
	for range steps {
		k1e, k1h := deriv(e, h)
		k2e, k2h := deriv(e+dz/2*k1e, h+dz/2*k1h)
		k3e, k3h := deriv(e+dz/2*k2e, h+dz/2*k2h)
		k4e, k4h := deriv(e+dz*k3e, h+dz*k3h)
		e += dz / 6 * (k1e + 2*k2e + 2*k3e + k4e)
		h += dz / 6 * (k1h + 2*k2h + 2*k3h + k4h)
	}
	return e / h
}

func TestLayeredImpedance(t *testing.T) {
	ag, al := mustConductor(t, "silver"), mustConductor(t, "aluminium")
	au, cu := mustConductor(t, "gold"), mustConductor(t, "copper")
	ss := mustConductor(t, "ss304")
	// Independent route: RK4 integration of the field equations.
	rng := rand.New(rand.NewPCG(7, 8))
	pairs := [][2]physics.Conductor{{ag, al}, {au, cu}, {cu, ss}, {ss, cu}, {ag, ag}}
	for i := range 40 {
		p := pairs[i%len(pairs)]
		f := math.Pow(10, 7+4*rng.Float64())
		mu2 := 1.0
		if i%7 == 3 {
			mu2 = 50 // a magnetic base
		}
		d1 := SkinDepth(f, p[0].Conductivity, 1)
		th := d1 * 4 * rng.Float64()
		got := layeredImpedance(f, p[0].Conductivity, 1, th, p[1].Conductivity, mu2)
		want := layeredODE(f, p[0].Conductivity, 1, th, p[1].Conductivity, mu2)
		if cmplx.Abs(got-want) > odeTol*cmplx.Abs(want) {
			t.Errorf("layeredImpedance(%s on %s, f=%g, t=%.3g delta) = %v, want %v (ODE)", p[0].Name, p[1].Name, f, th/d1, got, want)
		}
	}
	// Limits: zero plating is the base metal, thick plating the plating metal.
	for _, f := range []float64{1e6, 1e9, 1e11} {
		rsAg, rsAl := SurfaceResistance(f, ag.Conductivity, 1), SurfaceResistance(f, al.Conductivity, 1)
		if got := real(layeredImpedance(f, ag.Conductivity, 1, 0, al.Conductivity, 1)); !near(got, rsAl, roundingTol) {
			t.Errorf("Rs(no silver on aluminium, %g Hz) = %g, want aluminium %g", f, got, rsAl)
		}
		d := SkinDepth(f, ag.Conductivity, 1)
		for _, n := range []float64{25, 1e6} {
			if got := real(layeredImpedance(f, ag.Conductivity, 1, n*d, al.Conductivity, 1)); !near(got, rsAg, roundingTol) {
				t.Errorf("Rs(%g skin depths of silver on aluminium, %g Hz) = %g, want silver %g", n, f, got, rsAg)
			}
		}
		// Common practice: plating of 5 skin depths acts as solid plating
		// metal to better than 1 %.
		if got := real(layeredImpedance(f, ag.Conductivity, 1, 5*d, al.Conductivity, 1)); !near(got, rsAg, 1e-2) {
			t.Errorf("Rs(5 skin depths of silver on aluminium) = %g, want silver %g within 1 %%", got, rsAg)
		}
	}
}

// TestPlatedSurface checks that plating behaves as expected at low and high
// frequency through the Surface entry point: 2 um of silver on aluminium is
// invisible at 1 MHz (skin depth 64 um) and is solid silver at 10 GHz (skin
// depth 0.63 um); 0.5 um of gold on copper is invisible at 10 MHz.
func TestPlatedSurface(t *testing.T) {
	ag, al := mustConductor(t, "silver"), mustConductor(t, "aluminium")
	au, cu := mustConductor(t, "gold"), mustConductor(t, "copper")
	for _, tc := range []struct {
		top, base physics.Conductor
		t, f      float64
		want      physics.Conductor
		tol       float64
	}{
		{ag, al, 2e-6, 1e6, al, 2e-3},
		{ag, al, 2e-6, 10e9, ag, 1e-3},
		{au, cu, 0.5e-6, 10e6, cu, 1e-3},
		{au, cu, 10e-6, 10e9, au, 1e-12},
	} {
		s := Surface{Conductor: tc.base, Plating: &Plating{Metal: tc.top, Thickness: tc.t}}
		got, w, err := s.Resistance(tc.f)
		if err != nil || len(w) != 0 {
			t.Fatalf("Resistance: %v %v", err, w)
		}
		if want := SurfaceResistance(tc.f, tc.want.Conductivity, 1); !near(got, want, tc.tol) {
			t.Errorf("Rs(%g um %s on %s at %g Hz) = %g, want %s %g within %g", tc.t*1e6, tc.top.Name, tc.base.Name, tc.f, got, tc.want.Name, want, tc.tol)
		}
		if d, _ := s.SkinDepth(tc.f); !near(d, SkinDepth(tc.f, tc.top.Conductivity, 1), roundingTol) {
			t.Errorf("SkinDepth of plated surface = %g, want that of %s", d, tc.top.Name)
		}
	}
	// The plated Rs lies between the two metals for thin layers.
	s := Surface{Conductor: al, Plating: &Plating{Metal: ag, Thickness: 1e-6}}
	got, _, _ := s.Resistance(100e6)
	if lo, hi := SurfaceResistance(100e6, ag.Conductivity, 1), SurfaceResistance(100e6, al.Conductivity, 1); !(got > lo && got < hi) {
		t.Errorf("Rs(1 um silver on aluminium, 100 MHz) = %g, want between %g and %g", got, lo, hi)
	}
	// Errors.
	for _, th := range []float64{-1e-6, math.Inf(1), math.NaN()} {
		s := Surface{Conductor: al, Plating: &Plating{Metal: ag, Thickness: th}}
		if _, _, err := s.Resistance(1e9); err == nil || !strings.Contains(err.Error(), "plating thickness must be finite and >= 0 m") {
			t.Errorf("Resistance with plating %g m: error %v", th, err)
		}
	}
	bad := Surface{Conductor: physics.Conductor{}, Plating: &Plating{Metal: ag, Thickness: 1e-6}}
	if _, _, err := bad.Resistance(1e9); err == nil {
		t.Errorf("Resistance with a zero base conductor: no error")
	}
}

// TestSurfaceClassical checks the composition of temperature, roughness and
// the classical model, and the input checks.
func TestSurfaceClassical(t *testing.T) {
	cu := mustConductor(t, "copper")
	f := 5e9
	s := Surface{Conductor: cu, Temperature: physics.ZeroCelsius + 60, Roughness: 0.4e-6, RoughnessModel: Groiss}
	got, w, err := s.Resistance(f)
	if err != nil || len(w) != 0 {
		t.Fatalf("Resistance: %v %v", err, w)
	}
	sigma := 58e6 / (1 + 0.00393*40)
	k, _ := RoughnessFactor(Groiss, 0.4e-6, SkinDepth(f, sigma, 1))
	if want := k * SurfaceResistance(f, sigma, 1); !near(got, want, roundingTol) {
		t.Errorf("Rs(copper, 60 C, 0.4 um Groiss, 5 GHz) = %g, want %g", got, want)
	}
	if d, _ := s.SkinDepth(f); !near(d, SkinDepth(f, sigma, 1), roundingTol) {
		t.Errorf("SkinDepth = %g, want %g", d, SkinDepth(f, sigma, 1))
	}
	// Zero-value MuR means 1.
	u := Surface{Conductor: physics.Conductor{Conductivity: 5.813e7}}
	if rs, _, err := u.Resistance(5e9); err != nil || !near(rs, SurfaceResistance(5e9, 5.813e7, 1), roundingTol) {
		t.Errorf("Rs(user conductor with zero MuR) = %g, %v", rs, err)
	}
	for _, tc := range []struct {
		s    Surface
		f    float64
		want string
	}{
		{Surface{Conductor: cu}, 0, "frequency must be finite and > 0 Hz, got 0 Hz"},
		{Surface{Conductor: cu}, math.NaN(), "frequency must be finite"},
		{Surface{Conductor: cu}, math.Inf(1), "frequency must be finite"},
		{Surface{Conductor: cu, Roughness: -1}, 1e9, "roughness must be finite and >= 0 m"},
		{Surface{Conductor: cu, Temperature: 77}, 1e9, "linear resistivity model"},
		{Surface{Conductor: physics.Conductor{Name: "odd", Conductivity: 1e7, MuR: -1}}, 1e9, "mu_r must be finite and > 0"},
		{Surface{Conductor: cu, Roughness: 1e-6, RoughnessModel: 5}, 1e9, "unknown roughness model"},
	} {
		if _, _, err := tc.s.Resistance(tc.f); err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("Resistance(%g) error %v, want %q", tc.f, err, tc.want)
		}
	}
	if _, err := (Surface{Conductor: cu}).SkinDepth(-1); err == nil {
		t.Errorf("SkinDepth(-1): no error")
	}
}

// TestNiobiumBCS compares the BCS approximation with values recalled from
// Padamsee, Knobloch & Hays, RF Superconductivity for Accelerators, 2nd ed.
// (2008): R_BCS of niobium at 1.3 GHz is about 15 nohm at 2 K (10-20) and
// about 700 nohm at 4.2 K (600-800) (recalled from memory; quoted values vary
// with material preparation). The approximation is good to tens of percent,
// hence the loose factor.
func TestNiobiumBCS(t *testing.T) {
	const looseFactor = 1.5
	nb := NiobiumBCS()
	nb.Residual = 0
	for _, tc := range []struct{ t, want float64 }{{2, 15e-9}, {4.2, 700e-9}} {
		got, err := nb.Resistance(tc.t, 1.3e9)
		if err != nil {
			t.Fatal(err)
		}
		if !(got > tc.want/looseFactor && got < tc.want*looseFactor) {
			t.Errorf("R_BCS(Nb, %g K, 1.3 GHz) = %g, want %g within a factor %g", tc.t, got, tc.want, looseFactor)
		}
	}
	// Gap frequency of niobium about 700-750 GHz (Padamsee et al., recalled).
	if g := nb.GapFrequency(); !(g > 650e9 && g < 800e9) {
		t.Errorf("GapFrequency(Nb) = %g, want 650-800 GHz", g)
	}
	// f^2 scaling, 1/T exp(-Delta/kT) temperature law and the residual.
	r1, _ := nb.Resistance(2, 1e9)
	if r2, _ := nb.Resistance(2, 3e9); !near(r2, 9*r1, roundingTol) {
		t.Errorf("R_BCS(3 GHz) = %g, want 9 R_BCS(1 GHz) = %g", r2, 9*r1)
	}
	r3, _ := nb.Resistance(4, 1e9)
	if want := r1 * 2 / 4 * math.Exp(-nb.Gap/4+nb.Gap/2); !near(r3, want, roundingTol) {
		t.Errorf("R_BCS(4 K) = %g, want %g", r3, want)
	}
	withRes := NiobiumBCS()
	if r, _ := withRes.Resistance(2, 1e9); !near(r, r1+10e-9, roundingTol) {
		t.Errorf("R(2 K) with residual = %g, want %g", r, r1+10e-9)
	}
	for _, tc := range []struct {
		b       BCS
		temp, f float64
		want    string
	}{
		{nb, 5, 1e9, "0 < T <= Tc/2 = 4.625 K, got 5 K"},
		{nb, 0, 1e9, "0 < T <= Tc/2"},
		{nb, 2, 100e9, "0 < f <= 73.64 GHz"},
		{nb, 2, 0, "0 < f"},
		{BCS{Tc: 9.25, Gap: 17.67, A: 2e-4, RefFrequency: 1.5e9, Residual: -1}, 2, 1e9, "residual resistance must be finite and >= 0"},
		{BCS{Tc: 9.25, Gap: 17.67, RefFrequency: 1.5e9}, 2, 1e9, "BCS A must be finite and > 0"},
	} {
		if _, err := tc.b.Resistance(tc.temp, tc.f); err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("Resistance(%g K, %g Hz) error %v, want %q", tc.temp, tc.f, err, tc.want)
		}
	}
	// Through Surface.
	nbc := mustConductor(t, "niobium")
	sc := NiobiumBCS()
	s := Surface{Conductor: nbc, Temperature: 2, Superconductor: &sc, Roughness: 1e-6}
	rs, w, err := s.Resistance(1.3e9)
	if want, _ := sc.Resistance(2, 1.3e9); err != nil || rs != want {
		t.Errorf("Surface(Nb, 2 K).Resistance(1.3 GHz) = %g, %v, want %g", rs, err, want)
	}
	if len(w) != 1 || !strings.Contains(w[0], "roughness correction not applied") {
		t.Errorf("warnings = %q, want the roughness note", w)
	}
	if _, _, err := (Surface{Conductor: nbc, Superconductor: &sc}).Resistance(1.3e9); err == nil || !strings.Contains(err.Error(), "Tc/2") {
		t.Errorf("superconductor at 20 C: error %v", err)
	}
	if _, err := (Surface{Conductor: nbc, Temperature: 2, Superconductor: &sc}).SkinDepth(1.3e9); err == nil {
		t.Errorf("SkinDepth of a superconductor: no error")
	}
	p := Surface{Conductor: mustConductor(t, "copper"), Temperature: 2, Superconductor: &sc, Plating: &Plating{Metal: nbc, Thickness: 2e-6}}
	if _, _, err := p.Resistance(1.3e9); err == nil || !strings.Contains(err.Error(), "plated superconducting surface is not modelled") {
		t.Errorf("plated superconductor: error %v", err)
	}
}

// TestAnomalousSkinEffect checks the mean free path against a published
// product and the warning on cryogenic copper.
func TestAnomalousSkinEffect(t *testing.T) {
	// Copper: rho lambda = 6.6e-16 ohm m^2 (D. Gall, J. Appl. Phys. 119,
	// 085101 (2016), first-principles value, recalled from memory), so
	// l(20 C) = 6.6e-16 * 5.8e7 = 38 nm. Tolerance: the free-electron model
	// and the recalled value agree to a few percent.
	const freeElectronTol = 0.1
	cu := mustConductor(t, "copper")
	if got, want := MeanFreePath(cu.Conductivity, cu.ElectronDensity), 6.6e-16*cu.Conductivity; !near(got, want, freeElectronTol) {
		t.Errorf("MeanFreePath(copper, 20 C) = %g, want %g", got, want)
	}
	if got, want := AnomalyParameter(2, 1), 6.0; got != want {
		t.Errorf("AnomalyParameter(2, 1) = %g, want %g", got, want)
	}
	// Room-temperature copper at 10 GHz: classical model fine.
	if _, w, err := (Surface{Conductor: cu}).Resistance(10e9); err != nil || len(w) != 0 {
		t.Errorf("copper at 20 C, 10 GHz: warnings %q, error %v, want none", w, err)
	}
	// Copper at 77 K (about 0.2 uohm cm, CRC Handbook, recalled) at 1 GHz
	// and copper of RRR 100 at 4 K (sigma = 100 x 5.8e7) at 10 GHz: anomalous.
	for _, tc := range []struct {
		spec string
		f    float64
	}{{"copper,rho=0.2uohm cm", 1e9}, {"copper,sigma=5.8e9", 10e9}, {"sigma=5.8e9", 10e9}} {
		c, err := physics.ParseConductor(tc.spec)
		if err != nil {
			t.Fatal(err)
		}
		_, w, err := Surface{Conductor: c}.Resistance(tc.f)
		if err != nil || len(w) != 1 || !strings.Contains(w[0], "anomalous skin effect") {
			t.Errorf("%s at %g Hz: warnings %q, error %v, want an anomalous-skin-effect warning", tc.spec, tc.f, w, err)
		}
		if c.Name == "user" && !strings.Contains(w[0], "copper's electron density") {
			t.Errorf("%s: warning %q should say the density was assumed", tc.spec, w[0])
		}
	}
	// Thin silver over cryogenic copper: the base carries current and warns.
	cold, _ := physics.ParseConductor("copper,sigma=5.8e9")
	s := Surface{Conductor: cold, Plating: &Plating{Metal: mustConductor(t, "silver"), Thickness: 10e-9}}
	if _, w, _ := s.Resistance(10e9); len(w) != 1 || !strings.Contains(w[0], "in copper") {
		t.Errorf("thin silver on cold copper: warnings %q, want one about the copper base", w)
	}
}

func TestFerromagneticWarning(t *testing.T) {
	inv, ag := mustConductor(t, "invar"), mustConductor(t, "silver")
	if _, w, _ := (Surface{Conductor: inv}).Resistance(10e9); len(w) != 1 || !strings.Contains(w[0], "ferromagnetic") {
		t.Errorf("invar wall: warnings %q, want the ferromagnetic note", w)
	}
	thick := Surface{Conductor: inv, Plating: &Plating{Metal: ag, Thickness: 10e-6}}
	if _, w, _ := thick.Resistance(10e9); len(w) != 0 {
		t.Errorf("10 um silver on invar at 10 GHz: warnings %q, want none", w)
	}
	thin := Surface{Conductor: inv, Plating: &Plating{Metal: ag, Thickness: 0.5e-6}}
	if _, w, _ := thin.Resistance(10e9); len(w) != 1 || !strings.Contains(w[0], "base metal invar") {
		t.Errorf("0.5 um silver on invar at 10 GHz: warnings %q, want the base-metal note", w)
	}
}

func BenchmarkSurfaceResistance(b *testing.B) {
	s := Surface{Conductor: mustConductor(b, "copper"), Temperature: 330, Roughness: 0.4e-6}
	for b.Loop() {
		if _, _, err := s.Resistance(5e9); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkSurfaceResistancePlated(b *testing.B) {
	s := Surface{Conductor: mustConductor(b, "aluminium"), Plating: &Plating{Metal: mustConductor(b, "silver"), Thickness: 1e-6}}
	for b.Loop() {
		if _, _, err := s.Resistance(5e9); err != nil {
			b.Fatal(err)
		}
	}
}

// An invented filter housing: 6061 aluminium, silver-plated 3 um thick,
// running warm at 60 C with 0.3 um RMS roughness, at 4.2 GHz.
func ExampleSurface_Resistance() {
	al, _ := physics.LookupConductor("al6061")
	ag, _ := physics.LookupConductor("silver")
	s := Surface{
		Conductor:   al,
		Plating:     &Plating{Metal: ag, Thickness: 3e-6},
		Temperature: physics.ZeroCelsius + 60,
		Roughness:   0.3e-6,
	}
	rs, warnings, err := s.Resistance(4.2e9)
	if err != nil {
		fmt.Println(err)
		return
	}
	d, _ := s.SkinDepth(4.2e9)
	fmt.Println("skin depth", physics.FormatLength(d, 3))
	fmt.Println("Rs", physics.FormatSI(rs, "ohm", 4), "warnings:", len(warnings))
	// Output:
	// skin depth 1.05 um
	// Rs 18.68 mohm warnings: 0
}

// Superconducting niobium at 2 K, 1.3 GHz, with the default residual
// resistance.
func ExampleBCS_Resistance() {
	nb := NiobiumBCS()
	rs, err := nb.Resistance(2, 1.3e9)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(physics.FormatSI(rs, "ohm", 3))
	_, err = nb.Resistance(6, 1.3e9)
	fmt.Println(err)
	// Output:
	// 20.9 nohm
	// qfactor: the BCS approximation needs 0 < T <= Tc/2 = 4.625 K, got 6 K
}
