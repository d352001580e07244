package qfactor

import (
	"math"
	"math/cmplx"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// handTol is the tolerance of results checked against a hand calculation
// from the published closed forms: both are a few dozen floating-point
// operations, so they agree to about 1e-14; 1e-9 leaves room for the order
// of operations and the Bessel functions.
const handTol = 1e-9

// niobiumWalls returns superconducting niobium walls at t kelvin with the
// default BCS parameters.
func niobiumWalls(t *testing.T, temp float64) WallSet {
	t.Helper()
	nb, err := physics.LookupConductor("niobium")
	if err != nil {
		t.Fatal(err)
	}
	bcs := NiobiumBCS()
	return SameWalls(Surface{Conductor: nb, Temperature: temp, Superconductor: &bcs})
}

// pillbox13 is the 1.3 GHz TM010 pillbox of length lambda/2.
func pillbox13() (cavity.Cavity, float64) {
	const f = 1.3e9
	x := 2.404825557695773 // j_01 (DLMF table 10.21.1)
	lambda := physics.SpeedOfLight / f
	return cavity.Cavity{Radius: x * physics.SpeedOfLight / (2 * math.Pi * f), Length: lambda / 2}, f
}

// TestDissipatedPillbox checks the RF loss and heat load of a 1.3 GHz
// niobium pillbox at 2 K and Eacc = 20 MV/m against a hand calculation
// from the published closed forms, written out here independently of the
// package: the pillbox TM010 fields (Wangler 2008, sec. 1.12 and 2.2: E_z =
// E0 J0(kc r), T = sin(pi d/lambda)/(pi d/lambda), U = eps0 pi d a^2
// J1(x)^2 E0^2/2), the wall Q = a d/(delta (a + d)) of Harrington (1961,
// ch. 5) written as G = omega mu0 a d/(2 (a + d)), the BCS Rs of
// Padamsee et al. (2008, ch. 5), P = V^2/((R/Q) Q0) and the Carnot
// refrigerator (T_room - T)/T divided by the technical efficiency.
func TestDissipatedPillbox(t *testing.T) {
	c, f := pillbox13()
	w := niobiumWalls(t, 2)
	m := cavity.Mode{Family: cavity.TM, N: 0, M: 1, P: 0}
	a, err := Acceleration(c, m, 1)
	if err != nil {
		t.Fatal(err)
	}
	u, err := UnloadedQ(c, m, w.At(nil))
	if err != nil {
		t.Fatal(err)
	}
	const eacc = 20e6 // V/m, the stated gradient
	dis, err := Dissipated(a, c.Length, u.Q0, eacc)
	if err != nil {
		t.Fatal(err)
	}
	heat, err := Refrigeration(dis.Power, 2, 0)
	if err != nil {
		t.Fatal(err)
	}

	// The hand calculation.
	x := 2.404825557695773
	omega := 2 * math.Pi * f
	d, r := c.Length, c.Radius
	tt := math.Sin(math.Pi/2) / (math.Pi / 2) // d = lambda/2, beta = 1
	e0 := eacc / tt                           // Eacc = V/d = E0 T
	v := e0 * d * tt
	j1 := math.J1(x)
	energy := physics.VacuumPermittivity * math.Pi * d * r * r * j1 * j1 * e0 * e0 / 2
	rq := v * v / (omega * energy)
	g := omega * physics.VacuumPermeability * r * d / (2 * (r + d))
	rs := 2e-4*(f/1.5e9)*(f/1.5e9)*math.Exp(-17.67/2)/2 + 10e-9
	q0 := g / rs
	p := v * v / (rq * q0)
	plug := p * (300 - 2) / 2 / 0.2

	for _, k := range []struct {
		name      string
		got, want float64
	}{
		{"R/Q (linac)", a.ROverQLinac, rq},
		{"Q0", u.Q0, q0},
		{"voltage", dis.Voltage, v},
		{"stored energy", dis.Energy, energy},
		{"dissipated power", dis.Power, p},
		{"wall-plug power", heat.WallPlug, plug},
		{"specific power", heat.Specific, 298 / 2 / 0.2},
	} {
		if rel := math.Abs(k.got-k.want) / k.want; rel > handTol {
			t.Errorf("%s = %.12g, hand calculation %.12g (rel. error %.2g)", k.name, k.got, k.want, rel)
		}
	}
	// Published magnitudes (Padamsee et al. 2008, ch. 1, pillbox figures,
	// recalled from memory): R/Q about 196 ohm, G about 257 ohm.
	if math.Abs(a.ROverQLinac-196)/196 > 0.01 || math.Abs(a.G-257)/257 > 0.01 {
		t.Errorf("R/Q = %.4g ohm, G = %.4g ohm; published pillbox values about 196 and 257 ohm", a.ROverQLinac, a.G)
	}
}

// TestSplitSuperconducting checks the BCS and residual partial Qs against
// G/Rs_BCS and G/R_res for uniform walls (Padamsee et al. 2008, ch. 1:
// Q0 = G/Rs), and that the parts add up to Q0.
func TestSplitSuperconducting(t *testing.T) {
	c, f := pillbox13()
	w := niobiumWalls(t, 2)
	m := cavity.Mode{Family: cavity.TM, N: 0, M: 1, P: 0}
	u, err := UnloadedQ(c, m, w.At(nil))
	if err != nil {
		t.Fatal(err)
	}
	s, err := SplitSuperconducting(u, w)
	if err != nil {
		t.Fatal(err)
	}
	g := u.Wall.Geometry.Total()
	rb := 2e-4 * (f / 1.5e9) * (f / 1.5e9) * math.Exp(-17.67/2) / 2 // Padamsee et al. ch. 5 form
	if rel := math.Abs(s.QBCS-g/rb) / (g / rb); rel > handTol {
		t.Errorf("Q_BCS = %.10g, want G/R_BCS = %.10g", s.QBCS, g/rb)
	}
	if rel := math.Abs(s.QResidual-g/10e-9) / (g / 10e-9); rel > handTol {
		t.Errorf("Q_res = %.10g, want G/R_res = %.10g", s.QResidual, g/10e-9)
	}
	if !math.IsInf(s.QNormal, 1) {
		t.Errorf("Q_normal = %g, want +Inf for all-niobium walls", s.QNormal)
	}
	if sum := 1/s.QBCS + 1/s.QResidual; math.Abs(sum*u.Q0-1) > handTol {
		t.Errorf("1/Q_BCS + 1/Q_res = %g, 1/Q0 = %g", sum, 1/u.Q0)
	}
	// A copper end plate lands in the normal part.
	cu, _ := physics.LookupConductor("copper")
	w.EndB = Surface{Conductor: cu}
	u2, err := UnloadedQ(c, m, w.At(nil))
	if err != nil {
		t.Fatal(err)
	}
	s2, err := SplitSuperconducting(u2, w)
	if err != nil {
		t.Fatal(err)
	}
	rcu := SurfaceResistance(f, cu.Conductivity, 1)
	if want := u2.Wall.Geometry.EndB / rcu; math.Abs(s2.QNormal-want)/want > handTol {
		t.Errorf("Q_normal with a copper end plate = %g, want G_B/Rs_Cu = %g", s2.QNormal, want)
	}
}

// TestNiobiumLimits checks the quench guide against Bc(0)(1 - (T/Tc)^2)
// worked by hand and the margins against their definition.
func TestNiobiumLimits(t *testing.T) {
	l, err := NiobiumLimits(2, 9.25)
	if err != nil {
		t.Fatal(err)
	}
	want := 0.2 * (1 - (2/9.25)*(2/9.25)) // 190.65 mT
	if math.Abs(l.Quench-want) > 1e-15 {
		t.Errorf("Bc(2 K) = %g T, want %g T", l.Quench, want)
	}
	c, _ := pillbox13()
	a, err := Acceleration(c, cavity.Mode{Family: cavity.TM, N: 0, M: 1, P: 0}, 1)
	if err != nil {
		t.Fatal(err)
	}
	mg, err := FieldMargins(a, 20e6, l)
	if err != nil {
		t.Fatal(err)
	}
	// Epk/Eacc = pi/2 for the lambda/2 pillbox (Padamsee et al. 2008,
	// ch. 1, recalled): Epk = 31.4 MV/m at 20 MV/m.
	if math.Abs(mg.Epk-math.Pi/2*20e6) > 1e-6*mg.Epk {
		t.Errorf("Epk = %g V/m, want pi/2 x 20 MV/m", mg.Epk)
	}
	if math.Abs(mg.BMargin*mg.Bpk-l.Quench) > 1e-15 || mg.AboveQuench || mg.Emitted {
		t.Errorf("margins %+v", mg)
	}
	if _, err := NiobiumLimits(10, 9.25); err == nil {
		t.Error("NiobiumLimits above Tc: no error")
	}
	if _, err := FieldMargins(a, 0, l); err == nil {
		t.Error("FieldMargins at zero gradient: no error")
	}
}

// circuitForward solves the steady state of the cavity as a parallel
// resonant circuit directly in complex numbers (the route the closed form
// of ForwardPower is derived by, done here numerically): shunt resistance
// R (circuit convention, R_linac/2), loaded resistance R/(1+beta), tuning
// angle psi, beam RF current 2 I at phase phi from the crest, generator
// current Ig with internal resistance R/beta; forward power |Ig|^2 R/(8 beta).
func circuitForward(rLinac, v, beta, psi, current, phi float64) float64 {
	r := rLinac / 2
	zl := complex(r/(1+beta), 0) / complex(1, math.Tan(psi))
	ib := cmplx.Rect(2*current, phi)
	ig := complex(v, 0)/zl + ib
	return cmplx.Abs(ig) * cmplx.Abs(ig) * r / (8 * beta)
}

// TestForwardPowerCircuit checks ForwardPower against the circuit solved
// in complex numbers for several couplings, detunings and phases, and
// that MatchBeam's optimum leaves nothing reflected.
func TestForwardPowerCircuit(t *testing.T) {
	const rLinac, v = 1e12, 10e6
	pc := v * v / rLinac
	for _, beta := range []float64{0.5, 1, 3, 1e4} {
		for _, psi := range []float64{-0.7, 0, 0.3} {
			for _, phi := range []float64{-math.Pi / 6, 0, 0.2} {
				const current = 1e-3
				pb := v * current * math.Cos(phi)
				got := ForwardPower(pc, pb, beta, psi, phi)
				want := circuitForward(rLinac, v, beta, psi, current, phi)
				if math.Abs(got-want) > handTol*want {
					t.Errorf("beta %g psi %g phi %g: P_f = %.12g, circuit %.12g", beta, psi, phi, got, want)
				}
			}
		}
	}
	k, err := MatchBeam(1.3e9, v, 200, 5e9, Beam{Current: 2e-3, Phase: -math.Pi / 6})
	if err != nil {
		t.Fatal(err)
	}
	if r := k.ForwardDetuned - k.PCavity - k.PBeam; math.Abs(r) > 1e-9*k.ForwardDetuned {
		t.Errorf("reflected power at the optimum = %g W, want 0", r)
	}
	// No other coupling or tuning needs less forward power.
	for _, db := range []float64{0.9, 1.1} {
		for _, dp := range []float64{-0.01, 0.01} {
			if p := ForwardPower(k.PCavity, k.PBeam, k.Beta*db, k.TuningAngle+dp, -math.Pi/6); p < k.ForwardDetuned {
				t.Errorf("beta x %g, psi %+g: P_f = %g W below the optimum %g W", db, dp, p, k.ForwardDetuned)
			}
		}
	}
	// Beam off at the same voltage, on resonance: P_r/P_f = ((beta-1)/(beta+1))^2
	// (Pozar 2012, sec. 6.6: reflection of a resonator of coupling beta).
	gamma := (k.Beta - 1) / (k.Beta + 1)
	if got := k.ReflectedBeamOff / k.ForwardBeamOff; math.Abs(got-gamma*gamma) > 1e-12 {
		t.Errorf("beam-off reflected fraction %g, want %g", got, gamma*gamma)
	}
	// After a trip the circuit with the same generator current and no
	// beam holds TripVoltage.
	r := 200 * 5e9 / 2
	zl := complex(r/(1+k.Beta), 0) / complex(1, math.Tan(k.TuningAngle))
	ig := complex(v, 0)/zl + cmplx.Rect(2*2e-3, -math.Pi/6)
	if vt := cmplx.Abs(ig * zl); math.Abs(vt-k.TripVoltage) > 1e-9*vt {
		t.Errorf("trip voltage %g V, circuit %g V", k.TripVoltage, vt)
	}
}

// TestMatchBeamWorkedExample checks the matched coupling of a 1.3 GHz
// nine-cell cavity against the published design values of the TESLA
// Technical Design Report (DESY 2001, part II, the main linac; all values
// recalled from memory, the same worked case that SRF texts such as
// Padamsee, Knobloch & Hays 2008 discuss): R/Q = 1036 ohm (linac),
// Eacc = 23.4 MV/m over 1.038 m, beam 9.5 mA on crest, Q0 = 1e10 give
// Qext about 2.5e6 (the report rounds it) and about 231 kW forward power
// per cavity. The tolerance, 2 %, covers the rounding of the published
// values.
func TestMatchBeamWorkedExample(t *testing.T) {
	const rounding = 0.02
	v := 23.4e6 * 1.038
	k, err := MatchBeam(1.3e9, v, 1036, 1e10, Beam{Current: 9.5e-3})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(k.QExt-2.5e6)/2.5e6 > rounding {
		t.Errorf("Qext = %.4g, published about 2.5e6", k.QExt)
	}
	if math.Abs(k.ForwardDetuned-231e3)/231e3 > rounding {
		t.Errorf("forward power = %.4g W, published about 231 kW", k.ForwardDetuned)
	}
	// Qext -> V/((R/Q) I) for PBeam >> PCavity (hand form); they differ
	// by the factor 1 - 1/beta, about 2.5e-4 here, so 1e-3.
	if want := v / (1036 * 9.5e-3); math.Abs(k.QExt-want)/want > 1e-3 {
		t.Errorf("Qext = %.8g, V/((R/Q) I) = %.8g", k.QExt, want)
	}
	if k.Detuning != 0 {
		t.Errorf("detuning on crest = %g Hz, want 0", k.Detuning)
	}
	for _, bad := range []Beam{{Current: 0}, {Current: 1e-3, Phase: math.Pi / 2}} {
		if _, err := MatchBeam(1.3e9, v, 1036, 1e10, bad); err == nil {
			t.Errorf("MatchBeam(%+v): no error", bad)
		}
	}
}
