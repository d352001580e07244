package cavity

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"cylcav/physics"
)

// TestSizePozar checks the worked design of a PTFE-filled copper TE011
// cavity with d = 2a at 5 GHz in Pozar, Microwave Engineering, 4th ed.,
// sec. 6.4 (Example 6.4 there; recalled from memory): eps_r = 2.08,
// k = 151.0 m^-1, a = 2.74 cm, d = 5.48 cm. Pozar works with c = 3e8 m/s;
// the check rescales k to that value and compares the dimensions to the
// printed three digits (with exact c they move by 0.07 %, well inside).
func TestSizePozar(t *testing.T) {
	m := Mode{TE, 0, 1, 1}
	fill := physics.Medium{EpsR: 2.08}
	c, err := Size(m, 5e9, fill, ByRatio(1)) // d = 2a means D/L = 1
	if err != nil {
		t.Fatal(err)
	}
	_, _, k := c.Wavenumbers(m)
	kPozar := k * physics.SpeedOfLight / 3e8
	if got := math.Round(kPozar*10) / 10; got != 151.0 {
		t.Errorf("k = %.4f m^-1 (c = 3e8), want 151.0 (Pozar)", kPozar)
	}
	if got := math.Round(c.Radius*1e4) / 1e2; got != 2.74 {
		t.Errorf("a = %.4f cm, want 2.74 cm (Pozar)", c.Radius*100)
	}
	if got := math.Round(c.Length*1e4) / 1e2; got != 5.48 {
		t.Errorf("d = %.4f cm, want 5.48 cm (Pozar)", c.Length*100)
	}
	if c.Fill.EpsR != 2.08 {
		t.Errorf("fill eps_r = %g, want 2.08", c.Fill.EpsR)
	}
}

// TestSizeRoundTrip sizes random modes by each kind of constraint and
// checks, through Frequency, that the cavity resonates at the target and
// honours the constraint.
func TestSizeRoundTrip(t *testing.T) {
	// sizeTol: a few ulps through sqrt, hypot and the frequency formula.
	const sizeTol = 1e-14
	rng := rand.New(rand.NewPCG(11, 12))
	for range 300 {
		m := randomMode(rng, 9)
		f := 1e9 * math.Exp(5*rng.Float64())
		fill := physics.Medium{EpsR: 1 + 9*rng.Float64(), MuR: 1}
		k := 2 * math.Pi * f * fill.Index() / physics.SpeedOfLight
		var by Constraint
		switch rng.IntN(3) {
		case 0:
			by = ByRatio(math.Exp(4 * (rng.Float64() - 0.5)))
		case 1:
			by = ByDiameter(2 * m.Root() / k * (1.01 + rng.Float64()))
		default:
			by = ByLength(float64(max(m.P, 1)) * math.Pi / k * (1.01 + rng.Float64()))
		}
		c, err := Size(m, f, fill, by)
		if by.Name() == "diameter" && m.P == 0 {
			if !errors.Is(err, ErrInfeasible) {
				t.Errorf("Size(%v, diameter) error = %v, want ErrInfeasible for p = 0", m, err)
			}
			continue
		}
		if err != nil {
			t.Errorf("Size(%v, %g Hz, %+v, %v) error: %v", m, f, fill, by, err)
			continue
		}
		if got := c.Frequency(m); relErr(got, f) > sizeTol {
			t.Errorf("Size(%v, %g Hz, %v): resonates at %.17g Hz, want %.17g", m, f, by, got, f)
		}
		var got float64
		switch by.Name() {
		case "ratio":
			got = c.Diameter() / c.Length
		case "diameter":
			got = c.Diameter()
		case "length":
			got = c.Length
		}
		if relErr(got, by.Value()) > sizeTol {
			t.Errorf("Size(%v, %v): %s = %.17g, want %.17g", m, by, by.Name(), got, by.Value())
		}
	}
}

// TestSizeCutoff checks the least diameter against the cutoff of the same
// transverse field in a circular waveguide, f_c = c x / (2 pi a
// sqrt(mu_r eps_r)) (Pozar, 4th ed., sec. 3.4): just above it the sizing
// works, just below it fails and names it. Likewise the least length is p
// half-wavelengths in the fill.
func TestSizeCutoff(t *testing.T) {
	m := Mode{TE, 0, 1, 1}
	const f = 10e9
	x := m.Root()
	dmin := 2 * x * physics.SpeedOfLight / (2 * math.Pi * f) // 36.5648 mm (mpmath: 2 j_{1,1} c/(2 pi f))
	if _, err := Size(m, f, physics.Medium{}, ByDiameter(dmin*1.0001)); err != nil {
		t.Errorf("Size(TE011, 10 GHz, diameter %g) error: %v", dmin*1.0001, err)
	}
	_, err := Size(m, f, physics.Medium{}, ByDiameter(dmin*0.9999))
	if !errors.Is(err, ErrInfeasible) || !strings.Contains(err.Error(), "the diameter must exceed 36.5648 mm") {
		t.Errorf("Size(TE011, 10 GHz, diameter %g) error = %v, want ErrInfeasible naming 36.5648 mm", dmin*0.9999, err)
	}
	lmin := physics.SpeedOfLight / f / 2 // one half-wavelength, 14.9896 mm
	if _, err := Size(m, f, physics.Medium{}, ByLength(lmin*1.0001)); err != nil {
		t.Errorf("Size(TE011, 10 GHz, length %g) error: %v", lmin*1.0001, err)
	}
	_, err = Size(m, f, physics.Medium{}, ByLength(lmin*0.9999))
	if !errors.Is(err, ErrInfeasible) || !strings.Contains(err.Error(), "the length must exceed 14.9896 mm") {
		t.Errorf("Size(TE011, 10 GHz, length %g) error = %v, want ErrInfeasible naming 14.9896 mm", lmin*0.9999, err)
	}
}

// TestSizeP0 checks the p = 0 cases: the frequency of TM_nm0 does not
// depend on the length (Pozar, sec. 6.4, with p = 0).
func TestSizeP0(t *testing.T) {
	m := Mode{TM, 0, 1, 0}
	const f = 2.45e9
	// Given a length, any length works and the radius is j_01 c/(2 pi f).
	want := m.Root() * physics.SpeedOfLight / (2 * math.Pi * f) // 46.8337 mm
	for _, L := range []float64{0.001, 0.05, 3} {
		c, err := Size(m, f, physics.Medium{}, ByLength(L))
		const p0Tol = 1e-15 // the same two operations as Size: a few ulp
		if err != nil || relErr(c.Radius, want) > p0Tol || c.Length != L {
			t.Errorf("Size(TM010, %g Hz, length %g) = %+v, %v; want radius %g, length %g", f, L, c, err, want, L)
		}
	}
	// Given a diameter, the frequency is fixed: an error naming both.
	// 93.6674 mm = 2 j_{0,1} c/(2 pi f), computed with mpmath 1.3.0.
	_, err := Size(m, f, physics.Medium{}, ByDiameter(0.05))
	// 4.5897 GHz: TM010 of the 25 mm radius cavity (cavity/testdata/modes.txt).
	for _, s := range []string{"p = 0", "diameter 50 mm gives 4.5897 GHz", "use diameter 93.6674 mm with any length"} {
		if !errors.Is(err, ErrInfeasible) || !strings.Contains(err.Error(), s) {
			t.Errorf("Size(TM010, 2.45 GHz, diameter 50 mm) error = %v, want ErrInfeasible containing %q", err, s)
		}
	}
}

func TestSizeErrors(t *testing.T) {
	te011 := Mode{TE, 0, 1, 1}
	for _, tc := range []struct {
		m    Mode
		f    float64
		fill physics.Medium
		by   Constraint
		want string
	}{
		{Mode{TE, 0, 1, 0}, 5e9, physics.Medium{}, ByRatio(1), `invalid mode "TE010"`},
		{te011, 0, physics.Medium{}, ByRatio(1), "frequency must be finite and > 0 Hz, got 0 Hz"},
		{te011, math.NaN(), physics.Medium{}, ByRatio(1), "got NaN Hz"},
		{te011, 5e9, physics.Medium{EpsR: 0.5}, ByRatio(1), "eps_r must be in 1..10000, got 0.5"},
		{te011, 5e9, physics.Medium{}, Constraint{}, "no sizing constraint"},
		{te011, 5e9, physics.Medium{}, ByRatio(0), "ratio D/L must be in 0.001..1000, got 0"},
		{te011, 5e9, physics.Medium{}, ByRatio(math.Inf(1)), "got +Inf"},
		{te011, 5e9, physics.Medium{}, ByDiameter(-0.01), "diameter must be finite and > 0 m, got -0.01 m"},
		{te011, 5e9, physics.Medium{}, ByLength(math.NaN()), "length must be finite and > 0 m, got NaN m"},
		{te011, 1, physics.Medium{}, ByRatio(1), "gives radius"},
	} {
		_, err := Size(tc.m, tc.f, tc.fill, tc.by)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("Size(%v, %g, %+v, %v) error = %v, want it to contain %q", tc.m, tc.f, tc.fill, tc.by, err, tc.want)
		}
	}
}
