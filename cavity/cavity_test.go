package cavity

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"cylcav/physics"
)

// routeTol is the agreement asked of one quantity computed by two exact
// routes that round differently (a closed form against the mode list, the
// chart algebra against real cavities, a crossing against both
// frequencies): a few thousand ulp of double precision, far below any
// physical effect.
const routeTol = 1e-12

// randomMode draws a valid mode with indices up to max from rng.
func randomMode(rng *rand.Rand, max int) Mode {
	m := Mode{Family: TM, N: rng.IntN(max + 1), M: 1 + rng.IntN(max), P: rng.IntN(max + 1)}
	if rng.IntN(2) == 0 {
		m.Family = TE
		m.P = 1 + rng.IntN(max)
	}
	return m
}

// TestModeChart checks the mode-chart identity (derived from the
// resonance formula of Pozar, sec. 6.4, and the basis of the classical
// mode chart): for every mode, (f D)^2 is linear in (D/L)^2,
//
//	(f D)^2 = (c x/pi)^2/(eps_r mu_r) + (c p/2)^2/(eps_r mu_r) (D/L)^2,
//
// with slope independent of the Bessel zero. Modes, sizes and fills are
// drawn from a seeded source; for each, three lengths must give three
// collinear points with the predicted slope and intercept.
func TestModeChart(t *testing.T) {
	// chartTol: (fD)^2 carries a few ulps from f; differences of nearly
	// equal squares lose a few digits more.
	const chartTol = 1e-12
	rng := rand.New(rand.NewPCG(20240601, 7))
	c0 := physics.SpeedOfLight
	for range 500 {
		m := randomMode(rng, 12)
		fill := physics.Medium{EpsR: 1 + 20*rng.Float64(), MuR: 0.5 + rng.Float64()}
		D := 0.002 + 0.2*rng.Float64()
		em := fill.EpsR * fill.MuR
		slope := (c0 * float64(m.P) / 2) * (c0 * float64(m.P) / 2) / em
		x := m.Root()
		intercept := (c0 * x / math.Pi) * (c0 * x / math.Pi) / em
		for range 3 {
			L := 0.002 + 0.3*rng.Float64()
			c := Cavity{Radius: D / 2, Length: L, Fill: fill}
			f := c.Frequency(m)
			got := (f * D) * (f * D)
			want := intercept + slope*(D/L)*(D/L)
			if e := relErr(got, want); e > chartTol {
				t.Errorf("(fD)^2 for %v, D = %g, L = %g, fill %+v = %.15g, want %.15g", m, D, L, fill, got, want)
			}
		}
	}
}

// TestWavenumbers checks k = 2 pi f sqrt(mu_r eps_r)/c and k^2 = kc^2 +
// beta^2 (Pozar, sec. 6.4) on random modes.
func TestWavenumbers(t *testing.T) {
	const tol = 4e-16 * 8 // a few ulps
	rng := rand.New(rand.NewPCG(3, 4))
	for range 200 {
		m := randomMode(rng, 20)
		c := Cavity{Radius: 0.001 + 0.1*rng.Float64(), Length: 0.001 + 0.1*rng.Float64(), Fill: physics.Medium{EpsR: 1 + 10*rng.Float64()}}
		kc, beta, k := c.Wavenumbers(m)
		if e := relErr(kc, m.Root()/c.Radius); e > tol {
			t.Errorf("kc(%v) = %g, want %g", m, kc, m.Root()/c.Radius)
		}
		if e := relErr(beta, float64(m.P)*math.Pi/c.Length); e > tol && m.P > 0 {
			t.Errorf("beta(%v) = %g, want %g", m, beta, float64(m.P)*math.Pi/c.Length)
		}
		want := 2 * math.Pi * c.Frequency(m) * math.Sqrt(c.Fill.EpsR) / physics.SpeedOfLight
		if e := relErr(k, want); e > tol {
			t.Errorf("k(%v) = %.17g, want %.17g from Frequency", m, k, want)
		}
	}
}

func TestCavityValidate(t *testing.T) {
	for _, tc := range []struct {
		c    Cavity
		want string // "" for valid
	}{
		{Cavity{Radius: 0.025, Length: 0.05}, ""},
		{Cavity{Radius: 0.025, Length: 0.05, Fill: physics.Medium{EpsR: 2.08, MuR: 1}}, ""},
		{Cavity{Radius: 0, Length: 0.05}, "cavity: radius must be in 1e-06..1000 m, got 0 m"},
		{Cavity{Radius: -0.003, Length: 0.05}, "cavity: radius must be in 1e-06..1000 m, got -0.003 m"},
		{Cavity{Radius: 0.025, Length: math.Inf(1)}, "cavity: length must be in 1e-06..1000 m, got +Inf m"},
		{Cavity{Radius: math.NaN(), Length: 0.05}, "got NaN m"},
		{Cavity{Radius: 0.025, Length: 0.05, Fill: physics.Medium{EpsR: 0.9}}, "cavity: eps_r must be in 1..10000, got 0.9"},
		{Cavity{Radius: 0.025, Length: 0.05, Fill: physics.Medium{MuR: math.NaN()}}, "cavity: mu_r must be in 0.001..100000, got NaN"},
	} {
		err := tc.c.Validate()
		if (tc.want == "") != (err == nil) || (err != nil && !strings.Contains(err.Error(), tc.want)) {
			t.Errorf("%+v.Validate() = %v, want %q", tc.c, err, tc.want)
		}
	}
}

func BenchmarkFrequency(b *testing.B) {
	c := Cavity{Radius: 0.025, Length: 0.05}
	m := Mode{TE, 0, 1, 1}
	for b.Loop() {
		c.Frequency(m)
	}
}

// TestFrequencyOfRoot checks that FrequencyOfRoot with a mode's own zero
// is Frequency bit for bit, on seeded random cavities and modes.
func TestFrequencyOfRoot(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for range 300 {
		c := Cavity{Radius: 0.001 + 0.1*rng.Float64(), Length: 0.001 + 0.1*rng.Float64(), Fill: physics.Medium{EpsR: 1 + 5*rng.Float64()}}
		m := Mode{TM, rng.IntN(6), 1 + rng.IntN(5), rng.IntN(4)}
		if rng.IntN(2) == 0 {
			m = Mode{TE, rng.IntN(6), 1 + rng.IntN(5), 1 + rng.IntN(3)}
		}
		if got, want := c.FrequencyOfRoot(m.Root(), m.P), c.Frequency(m); got != want {
			t.Errorf("FrequencyOfRoot(%v) = %.17g, want Frequency = %.17g", m, got, want)
		}
	}
}
