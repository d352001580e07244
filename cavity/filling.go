package cavity

import (
	"fmt"
	"math"
)

// Bulb is a cylindrical region on the axis of a cavity, centred half-way
// between the end plates: the storage bulb of a maser or the sample of a
// resonance experiment.
type Bulb struct {
	Radius, Length float64 // m
}

// Filling holds the filling factors of a bulb in a TE0mp mode (see
// Cavity.FillingFactors).
type Filling struct {
	Mode Mode
	Bulb Bulb
	// MagneticZ is the fraction of the mode's magnetic energy that is in
	// the z component of H inside the bulb:
	// integral_bulb |H_z|^2 dV / integral_cavity |H|^2 dV.
	MagneticZ float64
	// Magnetic is the fraction of the whole magnetic energy inside the
	// bulb (all components).
	Magnetic float64
	// Electric is the fraction of the electric energy inside the bulb,
	// integral_bulb |E|^2 dV / integral_cavity |E|^2 dV: it scales the loss
	// of a lossy bulb wall and the frequency pull of its permittivity.
	Electric float64
	// Maser is the filling factor of the hydrogen maser,
	// eta' = (integral_bulb H_z dV)^2 / (V_bulb integral_cavity |H|^2 dV)
	// (D. Kleppner et al., Phys. Rev. 138, A972 (1965); J. Vanier and
	// C. Audoin, The Quantum Physics of Atomic Frequency Standards, 1989,
	// ch. 6; recalled from memory): the atoms move through the whole bulb
	// and see the average of H_z.
	Maser float64
}

// FillingFactors returns the filling factors of a bulb of radius b.Radius
// and length b.Length centred on the axis of cavity c, half-way between the
// end plates, in the TE0mp mode m (n = 0, the azimuthally uniform modes in
// which H_z is strongest on the axis, TE011 above all).
//
// With the TE0mp fields of a homogeneous fill (see ModeField),
// H_z = H0 J0(kc r) sin(beta z), H_r = -(beta/kc) H0 J1(kc r) cos(beta z),
// E_phi = (omega mu/kc) H0 J1(kc r) sin(beta z), and z1, z2 the ends of the
// bulb, the integrals are closed forms (derived):
//
//	integral_0^b J0(kc r)^2 r dr = (b^2/2)(J0(u)^2 + J1(u)^2),  u = kc b
//	integral_0^b J1(kc r)^2 r dr = (b^2/2)(J1(u)^2 - J0(u) J2(u))
//	integral_0^b J0(kc r) r dr   = b J1(u)/kc
//
// (DLMF 10.22.5 and 10.22.1, recalled from memory), with
// integral sin^2(beta z) dz = (z2 - z1)/2 - [sin(2 beta z)/(4 beta)] and
// the cavity's totals from u = x = j'_0m (J1(x) = 0). The ratios do not
// depend on the fill's permittivity (a homogeneous fill scales omega only).
// A bulb with a different permittivity from the fill changes the fields;
// that needs the mode-matching solver: axisym's Loss.Filling handles
// dielectric layers along z (discs on the end plates).
//
// Errors: an invalid cavity or mode, a mode other than TE0mp, a bulb not
// inside the cavity (0 < Radius <= c.Radius, 0 < Length <= c.Length).
func (c Cavity) FillingFactors(m Mode, b Bulb) (Filling, error) {
	if err := c.Validate(); err != nil {
		return Filling{}, err
	}
	if err := m.Validate(); err != nil {
		return Filling{}, err
	}
	if m.Family != TE || m.N != 0 {
		return Filling{}, fmt.Errorf("cavity: filling factors are given for TE0mp modes (H_z on the axis), got %s", m)
	}
	if !(b.Radius > 0 && b.Radius <= c.Radius) {
		return Filling{}, fmt.Errorf("cavity: bulb radius must be > 0 and at most the cavity radius %g m, got %g m", c.Radius, b.Radius)
	}
	if !(b.Length > 0 && b.Length <= c.Length) {
		return Filling{}, fmt.Errorf("cavity: bulb length must be > 0 and at most the cavity length %g m, got %g m", c.Length, b.Length)
	}
	kc, beta, _ := c.Wavenumbers(m)
	x := m.Root()
	u := kc * b.Radius
	j0, j1 := math.J0(u), math.J1(u)
	j2 := math.Jn(2, u)
	bb := b.Radius * b.Radius / 2
	rz := bb * (j0*j0 + j1*j1) // integral_0^b J0^2 r dr
	rr := bb * (j1*j1 - j0*j2) // integral_0^b J1^2 r dr
	r1 := b.Radius * j1 / kc   // integral_0^b J0 r dr
	jx := math.J0(x)
	a2 := c.Radius * c.Radius / 2
	totR := a2 * jx * jx // integral_0^a J0^2 r dr = integral_0^a J1^2 r dr at J1(x) = 0

	z1, z2 := (c.Length-b.Length)/2, (c.Length+b.Length)/2
	sin2 := b.Length/2 - (math.Sin(2*beta*z2)-math.Sin(2*beta*z1))/(4*beta) // integral sin^2
	cos2 := b.Length - sin2                                                 // integral cos^2
	sin1 := (math.Cos(beta*z1) - math.Cos(beta*z2)) / beta                  // integral sin
	half := c.Length / 2                                                    // integral of sin^2 or cos^2 over the cavity

	g := beta / kc
	hTotal := totR*half + g*g*totR*half // |H|^2 over the cavity, per 2 pi H0^2
	f := Filling{Mode: m, Bulb: b}
	f.MagneticZ = rz * sin2 / hTotal
	f.Magnetic = (rz*sin2 + g*g*rr*cos2) / hTotal
	f.Electric = rr * sin2 / (totR * half)
	vb := math.Pi * b.Radius * b.Radius * b.Length
	hz := 2 * math.Pi * r1 * sin1 // integral_bulb H_z dV per H0
	f.Maser = hz * hz / (vb * 2 * math.Pi * hTotal)
	return f, nil
}
