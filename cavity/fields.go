package cavity

import (
	"fmt"
	"math"

	"cylcav/physics"
)

// Point is a point inside a cavity in cylindrical coordinates: Rho (m) from
// the axis, Phi (rad) from the plane of the cos(n phi) polarisation, and Z
// (m) from end plate A at z = 0 (end plate B is at z = Length).
type Point struct{ Rho, Phi, Z float64 }

// Vector is a field vector in cylindrical components (rho, phi, z).
type Vector struct{ Rho, Phi, Z float64 }

// Norm2 returns the squared length of v.
func (v Vector) Norm2() float64 { return v.Rho*v.Rho + v.Phi*v.Phi + v.Z*v.Z }

// Field is the complex field of a mode at a point, in the form
//
//	E(r, t) = Re{E e^{j omega t}},  H(r, t) = Re{j H e^{j omega t}},
//
// with E and H real vectors: the magnetic field lags the electric by a
// quarter period everywhere, so both are stored as real peak amplitudes.
// Units: V/m and A/m.
type Field struct{ E, H Vector }

// ModeField evaluates the fields of one mode of one cavity. Build it with
// Cavity.ModeField; the zero value is not usable.
type ModeField struct {
	mode      Mode
	kc, beta  float64
	omega     float64
	eps, mu   float64 // absolute permittivity and permeability of the fill
	amplitude float64 // E0 (TM) or H0 (TE)
	radius    float64
	length    float64
}

// ModeField returns the field of mode m of cavity c, polarised as cos(n phi)
// in Ez (TM) or Hz (TE), scaled to a time-averaged stored energy of 1 J:
//
//	W = (1/4) integral (eps |E|^2 + mu |H|^2) dV = 1 J.
//
// Field expressions (derived from Maxwell's equations with standing waves
// in z; they agree with Pozar, Microwave Engineering, 4th ed., sec. 6.4 and
// with Harrington, Time-Harmonic Electromagnetic Fields, sec. 5.3, up to
// the phase convention): with psi = J_n(kc rho) cos(n phi), kc = x/a,
// beta = p pi/L, k^2 = kc^2 + beta^2 = omega^2 mu eps,
//
//	TE_nmp: Hz = H0 psi sin(beta z), H_t = (beta/kc^2) H0 grad_t psi cos(beta z),
//	        E_t = -(omega mu/kc^2) H0 (z x grad_t psi) sin(beta z);
//	TM_nmp: Ez = E0 psi cos(beta z), E_t = -(beta/kc^2) E0 grad_t psi sin(beta z),
//	        H_t = -(omega eps/kc^2) E0 (z x grad_t psi) cos(beta z).
//
// The amplitude follows from the radial integrals (DLMF 10.22.5 and the
// Lommel integral, DLMF 10.22.37 as recalled from memory; checked here by
// quadrature in the tests): integral_0^a J_n(kc rho)^2 rho d rho equals
// (a^2/2) J'_n(x)^2 at x = j_nm and (a^2/2)(1 - n^2/x^2) J_n(x)^2 at
// x = j'_nm. Errors: invalid cavity or mode.
func (c Cavity) ModeField(m Mode) (ModeField, error) {
	if err := c.Validate(); err != nil {
		return ModeField{}, err
	}
	if err := m.Validate(); err != nil {
		return ModeField{}, err
	}
	if err := c.ModelHolds(m, "the field model"); err != nil {
		return ModeField{}, err
	}
	epsR, muR := c.Fill.Eps(), c.Fill.Mu()
	kc, beta, _ := c.Wavenumbers(m)
	mf := ModeField{
		mode: m, kc: kc, beta: beta,
		omega:  2 * math.Pi * c.Frequency(m),
		eps:    epsR * physics.VacuumPermittivity,
		mu:     muR * physics.VacuumPermeability,
		radius: c.Radius, length: c.Length,
	}
	x := kc * c.Radius
	a2 := c.Radius * c.Radius
	azim := math.Pi // integral of cos^2(n phi) over a turn
	if m.N == 0 {
		azim = 2 * math.Pi
	}
	axial := c.Length / 2 // integral of sin^2 or cos^2(beta z)
	if m.P == 0 {
		axial = c.Length
	}
	var w float64 // stored energy for unit amplitude
	if m.Family == TE {
		// W = (eps/2) integral |E|^2; integral |grad psi|^2 dA = kc^2
		// integral psi^2 dA since d psi/d rho = 0 on the wall (derived).
		jn := math.Jn(m.N, x)
		radial := a2 / 2 * (1 - float64(m.N*m.N)/(x*x)) * jn * jn
		g := mf.omega * mf.mu / (kc * kc)
		w = mf.eps / 2 * g * g * kc * kc * radial * azim * axial
	} else {
		// W = (mu/2) integral |H|^2; psi = 0 on the wall (derived).
		jp := besselJPrime(m.N, x)
		radial := a2 / 2 * jp * jp
		g := mf.omega * mf.eps / (kc * kc)
		w = mf.mu / 2 * g * g * kc * kc * radial * azim * axial
	}
	mf.amplitude = 1 / math.Sqrt(w)
	return mf, nil
}

// Mode returns the mode whose field f evaluates.
func (f ModeField) Mode() Mode { return f.mode }

// Omega returns the angular resonant frequency, rad/s.
func (f ModeField) Omega() float64 { return f.omega }

// Eps returns the fill's absolute permittivity, F/m.
func (f ModeField) Eps() float64 { return f.eps }

// Mu returns the fill's absolute permeability, H/m.
func (f ModeField) Mu() float64 { return f.mu }

// At returns the field at p (see Field). Points outside the cavity give
// the analytic continuation of the expressions, not a physical field.
func (f ModeField) At(p Point) Field {
	n := float64(f.mode.N)
	u := f.kc * p.Rho
	jn := math.Jn(f.mode.N, u)
	jp := besselJPrime(f.mode.N, u)
	jOver := besselJOverX(f.mode.N, u) // J_n(u)/u
	cs, sn := math.Cos(n*p.Phi), math.Sin(n*p.Phi)
	cz, sz := math.Cos(f.beta*p.Z), math.Sin(f.beta*p.Z)
	A := f.amplitude
	// grad_t psi = (kc J'_n cos, -n J_n/rho sin); z x grad_t psi =
	// (n J_n/rho sin, kc J'_n cos). n J_n/rho = n kc J_n(u)/u.
	gRho, gPhi := f.kc*jp*cs, -n*f.kc*jOver*sn
	if f.mode.Family == TE {
		g := f.omega * f.mu / (f.kc * f.kc)
		h := f.beta / (f.kc * f.kc)
		return Field{
			E: Vector{Rho: -g * A * (-gPhi) * sz, Phi: -g * A * gRho * sz},
			H: Vector{Rho: h * A * gRho * cz, Phi: h * A * gPhi * cz, Z: A * jn * cs * sz},
		}
	}
	g := f.omega * f.eps / (f.kc * f.kc)
	e := f.beta / (f.kc * f.kc)
	return Field{
		E: Vector{Rho: -e * A * gRho * sz, Phi: -e * A * gPhi * sz, Z: A * jn * cs * cz},
		H: Vector{Rho: -g * A * (-gPhi) * cz, Phi: -g * A * gRho * cz},
	}
}

// besselJPrime returns J'_n(x) = (J_{n-1}(x) - J_{n+1}(x))/2 (DLMF 10.6.1),
// with J'_0 = -J_1 (DLMF 10.6.3).
func besselJPrime(n int, x float64) float64 {
	if n == 0 {
		return -math.J1(x)
	}
	return 0.5 * (math.Jn(n-1, x) - math.Jn(n+1, x))
}

// besselJOverX returns J_n(x)/x, with its limit at x = 0: 1/2 for n = 1 and
// 0 for n >= 2 (from the power series, DLMF 10.2.2). For n = 0 the value
// is only ever multiplied by n = 0.
func besselJOverX(n int, x float64) float64 {
	if math.Abs(x) < 1e-150 {
		if n == 1 {
			return 0.5
		}
		return 0
	}
	return math.Jn(n, x) / x
}

// checkPoint validates a point of cavity c.
func (c Cavity) checkPoint(p Point) error {
	if math.IsNaN(p.Rho+p.Phi+p.Z) || math.IsInf(p.Rho+p.Phi+p.Z, 0) {
		return fmt.Errorf("cavity: point coordinates must be finite, got rho = %g m, phi = %g rad, z = %g m", p.Rho, p.Phi, p.Z)
	}
	if p.Rho < 0 || p.Rho > c.Radius*(1+1e-12) || p.Z < -c.Length*1e-12 || p.Z > c.Length*(1+1e-12) {
		return fmt.Errorf("cavity: point (rho = %g m, z = %g m) must lie inside the cavity: 0 <= rho <= %g m, 0 <= z <= %g m", p.Rho, p.Z, c.Radius, c.Length)
	}
	return nil
}
