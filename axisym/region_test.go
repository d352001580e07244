package axisym

import (
	"errors"
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// regionTol is the agreement asked of Loss.Filling with the closed forms
// and the independent integration: the quadrature stops at
// DefaultRegionTol, and the fields of bodies whose sections share one
// radius are exact (one radial mode), so only rounding and the
// quadrature's tolerance remain.
const regionTol = 1e-8

// TestFillingHomogeneous checks Loss.Filling on a one-section body
// against the closed forms of cavity.Cavity.FillingFactors (DLMF 10.22
// integrals), for several TE0 resonances and bulbs, centred and not.
func TestFillingHomogeneous(t *testing.T) {
	b := Body{Sections: []Section{{Length: 0.03, Radius: 0.02, Fill: physics.Medium{EpsR: 2.1}}}}
	res, err := Solve(b, Request{MaxFrequency: 12e9, Families: []cavity.Family{cavity.TE, cavity.TM}, Losses: true})
	if err != nil {
		t.Fatal(err)
	}
	c := cavity.Cavity{Radius: 0.02, Length: 0.03, Fill: physics.Medium{EpsR: 2.1}}
	n := 0
	for _, r := range res {
		for _, bulb := range []cavity.Bulb{{Radius: 0.012, Length: 0.02}, {Radius: 0.02, Length: 0.03}, {Radius: 0.005, Length: 0.004}} {
			got, err := r.Loss.Filling(b, bulb, RegionSettings{})
			if err != nil {
				t.Fatal(err)
			}
			if r.Family == cavity.TM {
				if got.MagneticZ != 0 || got.Maser != 0 {
					t.Errorf("%v: TM0 resonance has H_z filling %g, maser %g; want 0", r.Origin, got.MagneticZ, got.Maser)
				}
				continue
			}
			want, err := c.FillingFactors(r.Origin, bulb)
			if err != nil {
				t.Fatal(err)
			}
			n++
			for _, q := range []struct {
				name      string
				got, want float64
			}{{"MagneticZ", got.MagneticZ, want.MagneticZ}, {"Magnetic", got.Magnetic, want.Magnetic},
				{"Electric", got.Electric, want.Electric}, {"Maser", got.Maser, want.Maser}} {
				if math.Abs(q.got-q.want) > regionTol*math.Max(q.want, 1e-3) {
					t.Errorf("%v, bulb %+v: %s = %.12g, want %.12g (closed form)", r.Origin, bulb, q.name, q.got, q.want)
				}
			}
		}
	}
	if n < 3 {
		t.Fatalf("only %d TE0 checks; want several", n)
	}
}

// layeredTE0 is an independent model of the TE0m resonances of a body
// whose sections all have radius a (layers along z): E_phi = J1(kc r)
// e(z) with kc = j'_0m/a, and in each layer d2e/dz2 = -(k0^2 eps_r - kc^2) e,
// e and e' continuous at the interfaces (non-magnetic layers; the
// transverse-resonance picture, Pozar, Microwave Engineering, 4th ed.,
// sec. 6.7), e(0) = 0. H_z = kc J0(kc r) e / (omega mu) and |H_r| =
// J1(kc r) |e'| / (omega mu) (Maxwell's curl equations, derived). eAt
// returns e and e' at z.
type layeredTE0 struct {
	k0, kc float64
	secs   []Section
}

func (m layeredTE0) eAt(z float64) (e, de float64) {
	e, de = 0, 1
	z0 := 0.0
	for _, s := range m.secs {
		d := math.Min(z-z0, s.Length)
		b2 := m.k0*m.k0*s.Fill.Eps() - m.kc*m.kc
		var c, sn, q float64 // e(z0+d) = c e + sn de, de(z0+d) = q e + c de
		switch {
		case b2 > 0:
			b := math.Sqrt(b2)
			c, sn, q = math.Cos(b*d), math.Sin(b*d)/b, -b*math.Sin(b*d)
		case b2 < 0:
			a := math.Sqrt(-b2)
			c, sn, q = math.Cosh(a*d), math.Sinh(a*d)/a, a*math.Sinh(a*d)
		default:
			c, sn, q = 1, d, 0
		}
		e, de = c*e+sn*de, q*e+c*de
		if z-z0 <= s.Length {
			break
		}
		z0 += s.Length
	}
	return e, de
}

// TestFillingDielectricInCan checks Loss.Filling on dielectric-loaded
// cans (a disc on one end plate; a disc on each end plate around a
// central vacuum gap, a bulb in the gap, as in a maser loaded to shrink
// it) against an independent integration of layeredTE0's fields: radial
// integrals in closed form (DLMF 10.22.5, as in cavity.FillingFactors),
// axial ones by a 4000-panel midpoint rule of e(z) and e'(z). The same
// model's e(L) = 0 checks the solver's frequency.
func TestFillingDielectricInCan(t *testing.T) {
	const a = 0.015
	sapph := physics.Medium{EpsR: 9.4}
	for _, tc := range []struct {
		name string
		secs []Section
		bulb cavity.Bulb
		zc   float64
	}{
		{"disc on plate A", []Section{{Length: 0.006, Radius: a, Fill: physics.Medium{EpsR: 9.6}}, {Length: 0.02, Radius: a}},
			cavity.Bulb{Radius: 0.008, Length: 0.01}, 0.016},
		{"discs on both plates", []Section{{Length: 0.004, Radius: a, Fill: sapph}, {Length: 0.018, Radius: a}, {Length: 0.004, Radius: a, Fill: sapph}},
			cavity.Bulb{Radius: 0.01, Length: 0.012}, 0},
	} {
		b := Body{Sections: tc.secs}
		res, err := Solve(b, Request{MaxFrequency: 20e9, Families: []cavity.Family{cavity.TE}, Losses: true})
		if err != nil {
			t.Fatal(err)
		}
		if len(res) == 0 {
			t.Fatalf("%s: no TE0 resonance", tc.name)
		}
		r := res[0]
		got, err := r.Loss.Filling(b, tc.bulb, RegionSettings{Centre: tc.zc})
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		x := 3.831705970207512 // j'_01 (A&S Table 9.5)
		m := layeredTE0{k0: 2 * math.Pi * r.Frequency / physics.SpeedOfLight, kc: x / a, secs: tc.secs}
		L := b.Length()
		if e, de := m.eAt(L); math.Abs(e) > 1e-9*math.Abs(de)*L {
			t.Errorf("%s: independent model e(L) = %g (e' = %g): the solver's %g Hz is not its resonance", tc.name, e, de, r.Frequency)
		}
		zc := tc.zc
		if zc == 0 {
			zc = L / 2
		}
		z1, z2 := zc-tc.bulb.Length/2, zc+tc.bulb.Length/2
		// Radial integrals over the bulb and the can (J1(x) = 0 at r = a).
		u := m.kc * tc.bulb.Radius
		bb := tc.bulb.Radius * tc.bulb.Radius / 2
		rz := bb * (math.J0(u)*math.J0(u) + math.J1(u)*math.J1(u))
		rr := bb * (math.J1(u)*math.J1(u) - math.J0(u)*math.Jn(2, u))
		r1 := tc.bulb.Radius * math.J1(u) / m.kc
		tot := a * a / 2 * math.J0(x) * math.J0(x)
		// Axial integrals, midpoint rule on each layer and on each piece
		// of the bulb in a layer (so the bulb's ends are panel ends).
		const n = 4000
		mid := func(lo, hi, eps float64) (e2, d2, ee2, e1 float64) {
			h := (hi - lo) / n
			for i := range n {
				e, de := m.eAt(lo + (float64(i)+0.5)*h)
				e2 += e * e * h
				d2 += de * de * h
				ee2 += eps * e * e * h
				e1 += e * h
			}
			return
		}
		var ez2, ed2, eps2, bz2, bd2, beps2, bz1 float64
		zs := 0.0
		for _, s := range tc.secs {
			a1, a2, a3, _ := mid(zs, zs+s.Length, s.Fill.Eps())
			ez2, ed2, eps2 = ez2+a1, ed2+a2, eps2+a3
			if lo, hi := math.Max(z1, zs), math.Min(z2, zs+s.Length); hi > lo {
				b1, b2, b3, b4 := mid(lo, hi, s.Fill.Eps())
				bz2, bd2, beps2, bz1 = bz2+b1, bd2+b2, beps2+b3, bz1+b4
			}
			zs += s.Length
		}
		kc2 := m.kc * m.kc
		hTot := kc2*tot*ez2 + tot*ed2
		want := cavity.Filling{
			MagneticZ: kc2 * rz * bz2 / hTot,
			Magnetic:  (kc2*rz*bz2 + rr*bd2) / hTot,
			Electric:  rr * beps2 / (tot * eps2),
			Maser:     sq(2*math.Pi*m.kc*r1*bz1) / (math.Pi * tc.bulb.Radius * tc.bulb.Radius * tc.bulb.Length * 2 * math.Pi * hTot),
		}
		// The midpoint rule's relative error is about (h k)^2/24 with h
		// the panel and k the largest axial wavenumber, below 1e-7 here.
		const midTol = 1e-6
		for _, q := range []struct {
			name      string
			got, want float64
		}{{"MagneticZ", got.MagneticZ, want.MagneticZ}, {"Magnetic", got.Magnetic, want.Magnetic},
			{"Electric", got.Electric, want.Electric}, {"Maser", got.Maser, want.Maser}} {
			if math.Abs(q.got-q.want) > midTol*q.want {
				t.Errorf("%s: %s = %.9g, want %.9g (independent integration)", tc.name, q.name, q.got, q.want)
			}
		}
		t.Logf("%s: f %.6g GHz, %+v", tc.name, r.Frequency/1e9, got)
	}
}

// TestFillingErrors checks the refusals of Loss.Filling.
func TestFillingErrors(t *testing.T) {
	b := Body{Sections: []Section{{Length: 0.01, Radius: 0.02}, {Length: 0.01, Radius: 0.008}}}
	res, err := Solve(b, Request{MaxFrequency: 25e9, Families: []cavity.Family{cavity.TE}, Losses: true})
	if err != nil || len(res) == 0 {
		t.Fatalf("solve: %v, %d resonances", err, len(res))
	}
	l := *res[0].Loss
	for _, tc := range []struct {
		bulb cavity.Bulb
		s    RegionSettings
	}{
		{cavity.Bulb{Radius: 0, Length: 0.01}, RegionSettings{}},
		{cavity.Bulb{Radius: 0.01, Length: 0.01}, RegionSettings{}},               // wider than section 2
		{cavity.Bulb{Radius: 0.005, Length: 0.01}, RegionSettings{Centre: 0.018}}, // past the end
		{cavity.Bulb{Radius: 0.005, Length: 0.01}, RegionSettings{Tol: 0.5}},
	} {
		if _, err := l.Filling(b, tc.bulb, tc.s); err == nil {
			t.Errorf("Filling(%+v, %+v) = nil error, want an error", tc.bulb, tc.s)
		}
	}
	if _, err := (Loss{}).Filling(b, cavity.Bulb{Radius: 0.005, Length: 0.01}, RegionSettings{}); err == nil {
		t.Error("Filling without fields: nil error")
	}
}

func BenchmarkFilling(b *testing.B) {
	body := Body{Sections: []Section{{Length: 0.004, Radius: 0.015, Fill: physics.Medium{EpsR: 9.4}}, {Length: 0.018, Radius: 0.015}, {Length: 0.004, Radius: 0.015, Fill: physics.Medium{EpsR: 9.4}}}}
	res, err := Solve(body, Request{MaxFrequency: 20e9, Families: []cavity.Family{cavity.TE}, Losses: true})
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := res[0].Loss.Filling(body, cavity.Bulb{Radius: 0.01, Length: 0.012}, RegionSettings{}); err != nil {
			b.Fatal(err)
		}
	}
}

// TestUniaxialFill: a uniaxial section is refused for TM0 (error matching
// physics.ErrUniaxial) and solved for TE0, whose frequency is then that of
// the isotropic fill eps_perp (E_phi is perpendicular to the c axis).
func TestUniaxialFill(t *testing.T) {
	uni := physics.Medium{EpsR: 9.4, EpsRParallel: 11.6}
	b := Body{Sections: []Section{{Length: 0.004, Radius: 0.015, Fill: uni}, {Length: 0.02, Radius: 0.015}}}
	if _, err := Solve(b, Request{MaxFrequency: 10e9, Families: []cavity.Family{cavity.TM}}); !errors.Is(err, physics.ErrUniaxial) {
		t.Errorf("TM0 with a uniaxial section: error %v, want one matching physics.ErrUniaxial", err)
	}
	got, err := Solve(b, Request{MaxFrequency: 10e9, Families: []cavity.Family{cavity.TE}})
	if err != nil {
		t.Fatal(err)
	}
	iso := b
	iso.Sections = []Section{{Length: 0.004, Radius: 0.015, Fill: physics.Medium{EpsR: 9.4}}, {Length: 0.02, Radius: 0.015}}
	want, err := Solve(iso, Request{MaxFrequency: 10e9, Families: []cavity.Family{cavity.TE}})
	if err != nil {
		t.Fatal(err)
	}
	if len(got) != len(want) || len(got) == 0 || got[0].Frequency != want[0].Frequency {
		t.Errorf("TE0 with a uniaxial section: %d resonances, want %d equal to the eps_perp fill's", len(got), len(want))
	}
}
