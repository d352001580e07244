package cavity

import (
	"math"
	"testing"

	"cylcav/physics"
)

// fillTol is the agreement of the closed-form filling factors with the
// numerical integration of the mode fields: composite Simpson's rule on
// 300 x 300 intervals of smooth fields errs by about 1e-10 relative.
const fillTol = 1e-8

// simpson2 integrates f(r, z) r dr dz over [0, rb] x [z1, z2] by composite
// Simpson's rule (Abramowitz & Stegun 25.4.6) in each direction.
func simpson2(f func(r, z float64) float64, rb, z1, z2 float64) float64 {
	const n = 300
	hr, hz := rb/n, (z2-z1)/n
	w := func(i int) float64 {
		switch {
		case i == 0 || i == n:
			return 1
		case i%2 == 1:
			return 4
		}
		return 2
	}
	s := 0.0
	for i := 0; i <= n; i++ {
		r := float64(i) * hr
		for j := 0; j <= n; j++ {
			z := z1 + float64(j)*hz
			s += w(i) * w(j) * f(r, z) * r
		}
	}
	return s * hr * hz / 9
}

// TestFillingFactorsQuadrature checks the filling factors of TE011 and
// TE012 cavities, empty and PTFE-filled, against the fields of ModeField
// integrated numerically over the bulb and the cavity (the azimuthal
// integral, 2 pi, cancels in every ratio).
func TestFillingFactorsQuadrature(t *testing.T) {
	for _, tc := range []struct {
		mode string
		c    Cavity
		b    Bulb
	}{
		{"TE011", Cavity{Radius: 0.14, Length: 0.28}, Bulb{Radius: 0.08, Length: 0.15}},
		{"TE011", Cavity{Radius: 0.02, Length: 0.03, Fill: physics.Medium{EpsR: 2.08}}, Bulb{Radius: 0.005, Length: 0.03}},
		{"TE012", Cavity{Radius: 0.05, Length: 0.12}, Bulb{Radius: 0.05, Length: 0.02}},
		{"TE021", Cavity{Radius: 0.05, Length: 0.05}, Bulb{Radius: 0.02, Length: 0.04}},
	} {
		m, err := ParseMode(tc.mode)
		if err != nil {
			t.Fatal(err)
		}
		got, err := tc.c.FillingFactors(m, tc.b)
		if err != nil {
			t.Fatal(err)
		}
		mf, err := tc.c.ModeField(m)
		if err != nil {
			t.Fatal(err)
		}
		at := func(r, z float64) Field { return mf.At(Point{Rho: r, Z: z}) }
		h2 := func(r, z float64) float64 { return at(r, z).H.Norm2() }
		hz2 := func(r, z float64) float64 { h := at(r, z).H.Z; return h * h }
		hz := func(r, z float64) float64 { return at(r, z).H.Z }
		e2 := func(r, z float64) float64 { return at(r, z).E.Norm2() }
		z1, z2 := (tc.c.Length-tc.b.Length)/2, (tc.c.Length+tc.b.Length)/2
		hAll := simpson2(h2, tc.c.Radius, 0, tc.c.Length)
		eAll := simpson2(e2, tc.c.Radius, 0, tc.c.Length)
		// The energy normalisation of ModeField (1 J) as a cross-check of
		// the quadrature: (1/4) integral (mu |H|^2 + eps |E|^2) dV = 1.
		if w := 2 * math.Pi * (mf.Mu()*hAll + mf.Eps()*eAll) / 4; math.Abs(w-1) > fillTol {
			t.Errorf("%s: quadrature energy %g J, want 1 J", tc.mode, w)
		}
		vb := math.Pi * tc.b.Radius * tc.b.Radius * tc.b.Length
		hzInt := 2 * math.Pi * simpson2(hz, tc.b.Radius, z1, z2)
		want := Filling{
			MagneticZ: simpson2(hz2, tc.b.Radius, z1, z2) / hAll,
			Magnetic:  simpson2(h2, tc.b.Radius, z1, z2) / hAll,
			Electric:  simpson2(e2, tc.b.Radius, z1, z2) / eAll,
			Maser:     hzInt * hzInt / (vb * 2 * math.Pi * hAll),
		}
		for _, k := range []struct {
			name      string
			got, want float64
		}{{"magnetic z", got.MagneticZ, want.MagneticZ}, {"magnetic", got.Magnetic, want.Magnetic},
			{"electric", got.Electric, want.Electric}, {"maser", got.Maser, want.Maser}} {
			if math.Abs(k.got-k.want) > fillTol*math.Max(k.want, 1e-3) {
				t.Errorf("%s %s: %s filling factor %.12g, quadrature %.12g", tc.mode, tc.c.Fill.Label(), k.name, k.got, k.want)
			}
		}
	}
	// The whole cavity as the bulb: every energy fraction is 1 except the
	// z part.
	c := Cavity{Radius: 0.1, Length: 0.2}
	f, err := c.FillingFactors(Mode{Family: TE, N: 0, M: 1, P: 1}, Bulb{Radius: 0.1, Length: 0.2})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(f.Magnetic-1) > 1e-12 || math.Abs(f.Electric-1) > 1e-12 || !(f.MagneticZ < 1) {
		t.Errorf("whole-cavity bulb: %+v", f)
	}
	for _, bad := range []struct {
		m Mode
		b Bulb
	}{{Mode{Family: TM, N: 0, M: 1, P: 0}, Bulb{0.01, 0.01}}, {Mode{Family: TE, N: 1, M: 1, P: 1}, Bulb{0.01, 0.01}},
		{Mode{Family: TE, N: 0, M: 1, P: 1}, Bulb{0.2, 0.01}}, {Mode{Family: TE, N: 0, M: 1, P: 1}, Bulb{0.01, 0}}} {
		if _, err := c.FillingFactors(bad.m, bad.b); err == nil {
			t.Errorf("FillingFactors(%v, %+v): no error", bad.m, bad.b)
		}
	}
}
