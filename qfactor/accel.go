package qfactor

import (
	"fmt"
	"math"
	"math/cmplx"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/physics/bessel"
)

// Accel holds the accelerator figures of merit of a TM0mp mode for a
// particle crossing the cavity on its axis, from end plate A to end plate B,
// at constant speed. Beam holes are ignored (a closed pillbox).
//
// Every figure is a ratio, independent of the field level and of the wall
// metal; multiply R/Q by Q0 for the shunt impedance.
type Accel struct {
	Mode      cavity.Mode
	Frequency float64 // Hz
	Speed     float64 // particle speed as a fraction of c (beta)

	// Gap is the on-axis voltage per unit peak on-axis field,
	// V/E0 = |integral_0^d E_z(0,z) exp(j omega z/(beta c)) dz| / E0, in m.
	Gap float64
	// TransitTime is T = V / integral_0^d |E_z(0,z)| dz. For p = 0 this is
	// Wangler's transit-time factor (Wangler 2008, ch. 2), V/(E0 d); for
	// p >= 1 the field integral vanishes and the absolute value keeps T the
	// ratio of the gain to the gain of a field with the same |E_z| always in
	// phase (derived extension; T = pi/4 for a synchronous particle,
	// omega d/(beta c) = p pi).
	TransitTime float64
	// TransitTimePeak is V / (E0 d), E0 the peak on-axis field |E_z|:
	// Wangler's normalisation for every p (Wangler 2008, ch. 2). It equals
	// TransitTime for p = 0 and is 2/pi times it for p >= 1. The R/Q and
	// shunt impedance use neither: they use the gain V itself, which is
	// TransitTime times the field integral and TransitTimePeak times E0 d.
	TransitTimePeak float64
	// NoGain is true when the particle gains (almost) nothing crossing the
	// cavity: TransitTime below MinTransitTime. Then Eacc = V/d is almost
	// zero and the ratios to it (EpkOverEacc, BpkOverEacc) and R/Q mean
	// nothing; print that instead of the numbers.
	NoGain bool
	// Below lists the lowest modes of the cavity that resonate below the
	// accelerating mode (at most MaxBelow of them) and BelowCount how many
	// there are in all (cavity.Cavity.ModesBelow). For TM010 an empty list
	// means it is the fundamental mode; otherwise a beam or a coupler can
	// excite a lower mode, which no choice of drive frequency avoids.
	Below      []cavity.Resonance
	BelowCount int
	// ROverQLinac is R/Q in the linac convention, V^2/(omega W), ohm
	// (Wangler 2008, ch. 5; Padamsee et al. 2008, ch. 1).
	ROverQLinac float64
	// ROverQCircuit is R/Q in the circuit convention, V^2/(2 omega W), ohm,
	// half the linac value (the resonator's equivalent parallel resistance
	// over Q).
	ROverQCircuit float64
	// G is the geometry factor Q_wall Rs for uniform walls, ohm (see
	// Geometry.Total).
	G float64
	// EpkOverEacc is the peak surface electric field over the accelerating
	// gradient Eacc = V/d (Padamsee et al. 2008, ch. 1). It and BpkOverEacc
	// are +Inf at a particle speed for which the gain cancels (V = 0).
	EpkOverEacc float64
	// BpkOverEacc is the peak surface magnetic flux density mu0 Hpk over
	// Eacc, in T/(V/m) (multiply by 1e9 for mT/(MV/m)). mu0 Hpk is the field
	// the wall sees whatever the fill.
	BpkOverEacc float64
}

// MinTransitTime is the transit-time factor (V over the field integral)
// below which Acceleration reports NoGain: a gain under 0.1 % of the
// in-phase gain, where the ratios to Eacc exceed 1000 times their in-phase
// values and the closed-pillbox model (no beam holes, whose fringe fields
// change V by more than that) no longer fixes them (common practice: such
// a speed is simply not accelerated).
const MinTransitTime = 1e-3

// MaxBelow is the most modes Accel.Below lists.
const MaxBelow = 5

// ShuntLinac returns the shunt impedance in the linac convention,
// R = V^2/P = (R/Q)_linac Q0, in ohm (Wangler 2008, ch. 5).
func (a Accel) ShuntLinac(q0 float64) float64 { return a.ROverQLinac * q0 }

// ShuntCircuit returns the shunt impedance in the circuit convention,
// V^2/(2P) = (R/Q)_circuit Q0, in ohm.
func (a Accel) ShuntCircuit(q0 float64) float64 { return a.ROverQCircuit * q0 }

// Acceleration returns the accelerator figures of the TM0mp mode m of
// cavity c for a particle of speed beta c on the axis.
//
// Only TM0mp modes (n = 0, any m >= 1, p >= 0) have an axial electric field
// on the axis; other modes are an error, as is a speed outside 0 < beta <= 1.
//
// With the fields of TM0mp (Harrington 1961, ch. 5; Pozar 2012, sec. 6.4),
// E_z = E0 J0(kc r) cos(beta_z z), kc = j_0m/a, beta_z = p pi/d:
//
//   - V/E0 = (d/2) |e^{j u+} sinc(u+) + e^{j u-} sinc(u-)|,
//     u± = (omega/(beta c) ± beta_z) d/2 (derived: the integral of
//     cos(beta_z z) e^{j kappa z} over 0..d, written with sinc so that the
//     synchronous case kappa = beta_z needs no special branch). For p = 0 it
//     is Wangler's pillbox T = sin(pi d/(beta lambda))/(pi d/(beta lambda))
//     times E0 d (Wangler 2008, ch. 2).
//   - W = eps k^2 zeta pi d a^2 J1(j_0m)^2 / (4 kc^2), zeta = 2 for p = 0
//     and 1 otherwise (derived from the fields; checked by quadrature).
//   - The surface E peaks at the centre of the end plates (|E_z| = E0) or,
//     for p >= 1, on the side wall, |E_r| = E0 (beta_z/kc) |J1(j_0m)|;
//     Epk = the larger.
//   - The surface H is azimuthal, (omega eps/kc) E0 |J1(kc r) cos(beta_z z)|;
//     it peaks on the end plates at kc r = j'_11 where |J1| has its global
//     maximum 0.5819 (j_0m > j'_11 for every m), so Hpk = (omega eps/kc) E0
//     J1(j'_11).
//
// Check values: the pillbox TM010 with d = lambda/2 and beta = 1 has
// G = 257 ohm, (R/Q)_linac = 196 ohm, Epk/Eacc = pi/2 and Bpk/Eacc =
// 3.05 mT/(MV/m) (Padamsee, Knobloch & Hays 2008, ch. 1, pillbox cavity
// figures, recalled from memory); the tests reproduce them.
//
// Accuracy: a few ulp plus the accuracy of math.J1 (about 1e-15 relative
// here).
func Acceleration(c cavity.Cavity, m cavity.Mode, speed float64) (Accel, error) {
	if err := c.Validate(); err != nil {
		return Accel{}, err
	}
	if err := m.Validate(); err != nil {
		return Accel{}, err
	}
	if err := c.ModelHolds(m, "the accelerator figures"); err != nil {
		return Accel{}, err
	}
	if m.Family != cavity.TM || m.N != 0 {
		return Accel{}, fmt.Errorf("qfactor: accelerator figures need a TM0mp mode (axial electric field on the axis), got %s", m)
	}
	if math.IsNaN(speed) || speed <= 0 || speed > 1 {
		return Accel{}, fmt.Errorf("qfactor: particle speed must be in 0 < beta <= 1 (fraction of c), got %g", speed)
	}
	x := m.Root()
	epsR, muR := c.Fill.Eps(), c.Fill.Mu()
	eps := epsR * physics.VacuumPermittivity
	a, d := c.Radius, c.Length
	kc := x / a
	bz := float64(m.P) * math.Pi / d
	k := math.Hypot(kc, bz)
	omega := k * physics.SpeedOfLight / math.Sqrt(epsR*muR)
	kappa := omega / (speed * physics.SpeedOfLight)

	// On-axis voltage per unit E0 (derived; see the doc comment).
	gap := axialGain(kappa, bz, d)
	v0 := d // integral of |cos(beta_z z)| over 0..d
	zeta := 2.0
	if m.P >= 1 {
		v0 = 2 * d / math.Pi
		zeta = 1
	}

	j1 := math.J1(x)
	w := eps * k * k * zeta * math.Pi * d * a * a * j1 * j1 / (4 * kc * kc) // stored energy per E0^2, derived

	epk := math.Max(1, bz/kc*math.Abs(j1))
	jp11 := bessel.JPrimeZeros(1, 1)[0]
	hpk := omega * eps / kc * math.J1(jp11)

	f := Accel{
		Mode:            m,
		Frequency:       c.FrequencyOfRoot(x, m.P),
		Speed:           speed,
		Gap:             gap,
		TransitTime:     gap / v0,
		TransitTimePeak: gap / d,
		G:               geometry(c, m, x).Total(),
		EpkOverEacc:     epk * d / gap,
		BpkOverEacc:     physics.VacuumPermeability * hpk * d / gap,
	}
	f.ROverQLinac = gap * gap / (omega * w)
	f.ROverQCircuit = f.ROverQLinac / 2
	f.NoGain = f.TransitTime < MinTransitTime
	below, n, err := c.ModesBelow(m, MaxBelow)
	if err != nil {
		return Accel{}, fmt.Errorf("qfactor: listing the modes below %s: %w", m, err)
	}
	f.Below, f.BelowCount = below, n
	return f, nil
}

// axialGain returns |integral_0^d cos(bz z) exp(j kappa z) dz|, the on-axis
// voltage per unit peak field of a field varying as cos(bz z) for a
// particle of wavenumber kappa = omega/(beta c) (derived: written with sinc
// so that the synchronous case kappa = bz needs no special branch; see
// Acceleration).
func axialGain(kappa, bz, d float64) float64 {
	up, um := (kappa+bz)*d/2, (kappa-bz)*d/2
	return d / 2 * cmplx.Abs(cmplx.Rect(sinc(up), up)+cmplx.Rect(sinc(um), um))
}

// sinc returns sin(x)/x, 1 at x = 0.
func sinc(x float64) float64 {
	if math.Abs(x) < 1e-4 {
		// Taylor series to x^4: truncation error below x^6/5040 < 2e-28.
		x2 := x * x
		return 1 - x2/6 + x2*x2/120
	}
	return math.Sin(x) / x
}
