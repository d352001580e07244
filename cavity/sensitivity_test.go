package cavity

import (
	"math"
	"testing"

	"cylcav/physics"
)

// sensTol is the agreement asked of the analytic derivatives and central
// differences with a relative step of 1e-5: the truncation error is about
// (1e-5)^2 and the rounding error about 1e-16/1e-5, both far below it.
const sensTol = 1e-8

// TestSensitivityFiniteDifference checks df/dD, df/dL and df/dT against
// central differences of Frequency (an independent route through the
// resonance formula and the linear thermal model).
func TestSensitivityFiniteDifference(t *testing.T) {
	th := Thermal{AlphaRadial: 23e-6, AlphaAxial: 1.3e-6}
	const tauEps = -100e-6 // the fill's (1/eps) d eps/dT, 1/K
	for _, tc := range []struct {
		mode string
		c    Cavity
	}{
		{"TE011", Cavity{Radius: 0.02, Length: 0.03}},
		{"TM010", Cavity{Radius: 0.05, Length: 0.02, Fill: physics.Medium{EpsR: 9.8}}},
		{"TE113", Cavity{Radius: 0.011, Length: 0.07, Fill: physics.Medium{EpsR: 2.08}}},
		{"TM212", Cavity{Radius: 0.03, Length: 0.01}},
	} {
		m := mustMode(t, tc.mode)
		tc.c.Fill.TCEps, tc.c.Fill.TCEpsKnown = tauEps, true
		s, err := tc.c.Sensitivity(m, th)
		if err != nil {
			t.Fatal(err)
		}
		f := tc.c.Frequency(m)
		h := 1e-5
		dD := tc.c.Diameter() * h
		up, dn := tc.c, tc.c
		up.Radius += dD / 2
		dn.Radius -= dD / 2
		fdD := (up.Frequency(m) - dn.Frequency(m)) / (2 * dD)
		dL := tc.c.Length * h
		up, dn = tc.c, tc.c
		up.Length += dL
		dn.Length -= dL
		fdL := (up.Frequency(m) - dn.Frequency(m)) / (2 * dL)
		at := func(dT float64) float64 {
			c := tc.c
			c.Radius *= 1 + th.AlphaRadial*dT
			c.Length *= 1 + th.AlphaAxial*dT
			c.Fill.EpsR = c.Fill.Eps() * (1 + tauEps*dT) // the definition of the coefficient
			return c.Frequency(m)
		}
		fdT := (at(0.01) - at(-0.01)) / 0.02
		for _, q := range []struct {
			name      string
			got, want float64
		}{{"df/dD", s.DfDD, fdD}, {"df/dL", s.DfDL, fdL}, {"df/dT", s.DfDT, fdT}} {
			if math.Abs(q.got-q.want) > sensTol*math.Abs(f)*1e-3+sensTol*math.Abs(q.want) {
				t.Errorf("%s %s of %v = %.12g, want %.12g (central difference)", tc.mode, q.name, tc.c, q.got, q.want)
			}
		}
	}
}

// TestSensitivityHomogeneousMetal: with one expansion coefficient the
// cavity scales uniformly and df/f = -alpha dT (every length grows by
// 1 + alpha dT and f ~ 1/size).
func TestSensitivityHomogeneousMetal(t *testing.T) {
	const alpha = 16.5e-6
	c := Cavity{Radius: 0.02, Length: 0.03}
	for _, ms := range []string{"TE011", "TM010", "TE111", "TM023"} {
		s, err := c.Sensitivity(mustMode(t, ms), Thermal{AlphaRadial: alpha, AlphaAxial: alpha})
		if err != nil {
			t.Fatal(err)
		}
		const homogeneousTol = 1e-20 // a few ulp of alpha = 1.65e-5
		if math.Abs(s.TempCoeff+alpha) > homogeneousTol {
			t.Errorf("%s TempCoeff = %g, want %g", ms, s.TempCoeff, -alpha)
		}
	}
}
