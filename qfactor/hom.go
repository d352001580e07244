package qfactor

import (
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics"
)

// HOMKind says how a mode couples to a beam on or near the axis.
type HOMKind int

const (
	// Monopole modes (n = 0) have an axial electric field on the axis and
	// change the particle's energy (TE0mp do not: their E_z vanishes).
	Monopole HOMKind = iota
	// Dipole modes (n = 1) kick a particle that passes off the axis
	// sideways.
	Dipole
)

// String returns "monopole" or "dipole".
func (k HOMKind) String() string {
	if k == Dipole {
		return "dipole"
	}
	return "monopole"
}

// HOM is one row of the higher-order-mode table.
type HOM struct {
	Mode      cavity.Mode
	Frequency float64 // Hz
	Kind      HOMKind
	// ROverQ is the longitudinal R/Q of a monopole mode in the linac
	// convention, V^2/(omega U), ohm, for the particle speed of the
	// table (Accel.ROverQLinac); zero for TE0mp and for dipoles.
	ROverQ float64
	// TransitTime is the transit-time factor of a TM0mp mode
	// (Accel.TransitTime); NaN for other modes.
	TransitTime float64
	// ROverQTransverse is the transverse R/Q of a dipole mode, ohm (see
	// TransverseROverQ); zero for TE1mp, NaN for monopoles.
	ROverQTransverse float64
	// Q0 is the unloaded Q with the table's walls.
	Q0 float64
	// Harmonic is the beam harmonic h nearest the mode (h = round(f/fb))
	// and Offset = f - h fb, Hz, when a bunch frequency is given; Near
	// marks |Offset| <= window f.
	Harmonic int
	Offset   float64
	Near     bool
}

// HOMOptions are the settings of HOMTable.
type HOMOptions struct {
	// Speed is the particle speed as a fraction of c, 0 < Speed <= 1.
	Speed float64
	// MaxFrequency is the highest frequency listed, Hz.
	MaxFrequency float64
	// Walls give Q0 of every mode.
	Walls WallSet
	// Bunch is the bunch repetition frequency, Hz; 0 flags nothing.
	Bunch float64
	// Window is the half-width, as a fraction of the mode frequency,
	// within which a mode counts as near a beam harmonic; 0 means
	// DefaultHarmonicWindow.
	Window float64
}

// DefaultHarmonicWindow is the default half-width of the band around a beam
// harmonic in which a mode is flagged: 0.5 % of its frequency. This is our
// choice, not a standard: wider than the scatter of the frequencies of
// machined cells and the tuning range of a cell, so that a mode flagged
// nowhere stays clear after manufacture.
const DefaultHarmonicWindow = 0.005

// MaxHOMModes bounds the table: a request that lists more modes is an
// error (raise the limit only with care; the table is for people).
const MaxHOMModes = 2000

// HOMTable lists every monopole (n = 0) and dipole (n = 1) mode of cavity c
// up to o.MaxFrequency, by frequency, with its R/Q (TM0mp: Acceleration;
// TM1mp: TransverseROverQ), its Q0 with the walls o.Walls (UnloadedQAll)
// and, with a bunch frequency, the nearest beam harmonic. Modes with
// n >= 2 have neither an axial field nor a transverse kick on the axis
// and are left out. Every mode is listed once; each n = 1 mode has two
// polarisations at its frequency.
//
// Errors: an invalid cavity, speed, wall set or frequency; more than
// MaxHOMModes modes; a Q0 the surface models cannot give (for a
// superconductor above a tenth of the gap frequency).
func HOMTable(c cavity.Cavity, o HOMOptions) ([]HOM, error) {
	if err := c.Validate(); err != nil {
		return nil, err
	}
	if err := c.Fill.RequireIsotropic("qfactor: the higher-order-mode table"); err != nil {
		return nil, err
	}
	if math.IsNaN(o.Speed) || o.Speed <= 0 || o.Speed > 1 {
		return nil, fmt.Errorf("qfactor: particle speed must be in 0 < beta <= 1 (fraction of c), got %g", o.Speed)
	}
	if !(o.MaxFrequency > 0) || math.IsInf(o.MaxFrequency, 0) {
		return nil, fmt.Errorf("qfactor: highest frequency of the mode table must be finite and > 0 Hz, got %g Hz", o.MaxFrequency)
	}
	if !(o.Bunch >= 0) || math.IsInf(o.Bunch, 0) {
		return nil, fmt.Errorf("qfactor: bunch frequency must be finite and >= 0 Hz, got %g Hz", o.Bunch)
	}
	win := o.Window
	if win == 0 {
		win = DefaultHarmonicWindow
	}
	if !(win > 0 && win < 0.5) {
		return nil, fmt.Errorf("qfactor: harmonic window must be between 0 and 50 %%, got %g", win)
	}
	if err := o.Walls.Validate(); err != nil {
		return nil, err
	}
	n, _, err := c.Count(o.MaxFrequency)
	if err != nil {
		return nil, err
	}
	if n > 4*MaxHOMModes {
		return nil, fmt.Errorf("qfactor: %d modes below %s; lower the highest frequency (at most %d monopole and dipole modes are listed)", n, physics.FormatFrequency(o.MaxFrequency, 4), MaxHOMModes)
	}
	all, err := c.Modes(o.MaxFrequency)
	if err != nil {
		return nil, err
	}
	var res []cavity.Resonance
	for _, r := range all {
		if r.Mode.N <= 1 {
			res = append(res, r)
		}
	}
	if len(res) > MaxHOMModes {
		return nil, fmt.Errorf("qfactor: %d monopole and dipole modes below %s, more than %d; lower the highest frequency", len(res), physics.FormatFrequency(o.MaxFrequency, 4), MaxHOMModes)
	}
	us, err := UnloadedQAll(c, res, o.Walls.At(nil))
	if err != nil {
		return nil, err
	}
	out := make([]HOM, len(res))
	for i, r := range res {
		h := HOM{Mode: r.Mode, Frequency: r.Frequency, Q0: us[i].Q0, TransitTime: math.NaN(), ROverQTransverse: math.NaN()}
		switch {
		case r.Mode.N == 0 && r.Mode.Family == cavity.TM:
			a, err := Acceleration(c, r.Mode, o.Speed)
			if err != nil {
				return nil, err
			}
			h.ROverQ, h.TransitTime = a.ROverQLinac, a.TransitTime
		case r.Mode.N == 1:
			h.Kind = Dipole
			if h.ROverQTransverse, err = TransverseROverQ(c, r.Mode, o.Speed); err != nil {
				return nil, err
			}
		}
		if o.Bunch > 0 {
			h.Harmonic, h.Offset, h.Near = beamHarmonic(r.Frequency, o.Bunch, win)
		}
		out[i] = h
	}
	return out, nil
}

// BeamHarmonic returns the beam harmonic h = round(f/bunch) nearest a
// mode at frequency f (Hz) for bunches repeating at bunch (Hz), the offset
// f - h bunch (Hz), and whether the mode is near it: |offset| <= window f,
// window a fraction (0 means DefaultHarmonicWindow). This is the one
// verdict on a mode near a beam harmonic; HOMTable and every command that
// flags modes use it. A beam's current has lines at every harmonic of the
// bunch frequency (Wangler 2008, ch. on beam loading), so a mode within
// its tuning and manufacturing scatter of one can be driven.
//
// Errors: f or bunch not positive and finite, window outside [0, 0.5).
func BeamHarmonic(f, bunch, window float64) (h int, offset float64, near bool, err error) {
	if !(f > 0) || math.IsInf(f, 0) || !(bunch > 0) || math.IsInf(bunch, 0) {
		return 0, 0, false, fmt.Errorf("qfactor: mode and bunch frequencies must be > 0 and finite, got %g Hz and %g Hz", f, bunch)
	}
	if window == 0 {
		window = DefaultHarmonicWindow
	}
	if !(window > 0 && window < 0.5) {
		return 0, 0, false, fmt.Errorf("qfactor: harmonic window must be between 0 and 50 %%, got %g", window)
	}
	h, offset, near = beamHarmonic(f, bunch, window)
	return h, offset, near, nil
}

// beamHarmonic is BeamHarmonic on checked input.
func beamHarmonic(f, bunch, window float64) (int, float64, bool) {
	h := int(math.Round(f / bunch))
	off := f - float64(h)*bunch
	return h, off, math.Abs(off) <= window*f
}

// Drivable reports whether a beam can drive the row's mode to harm: it is
// near a beam harmonic (Near), it is not the operating mode, and it has a
// longitudinal or transverse R/Q. The design's warnings and the
// datasheet's highlighted rows use it.
func (h HOM) Drivable(operating cavity.Mode) bool {
	return h.Near && h.Mode != operating && (h.ROverQ > 0 || h.ROverQTransverse > 0)
}

// TransverseROverQ returns the transverse R/Q of the dipole mode m (n = 1)
// of cavity c for a particle of speed beta c travelling parallel to the
// axis, in ohm:
//
//	(R/Q)_perp = |dV/dx|^2 / (k^2 omega U),  k = omega/(beta c),
//
// where V(x) = |integral_0^d E_z(x, 0, z) exp(j k z) dz| is the
// longitudinal voltage at the offset x in the plane of the polarisation and
// U the stored energy. By the Panofsky-Wenzel theorem (W. K. H. Panofsky
// and W. A. Wenzel, Rev. Sci. Instrum. 27, 967 (1956)) the transverse
// voltage V_perp = beta c Delta p_perp / q equals (1/k) dV/dx, so
// (R/Q)_perp = V_perp^2/(omega U): at beta = 1 this is the definition
// (R/Q)_perp = |V(r)|^2/((k r)^2 omega U) for small r of Padamsee, Knobloch &
// Hays 2008 (chapter on higher-order modes, recalled from memory), in ohm;
// multiply by k for the form in ohm per metre that some authors use. The
// theorem holds here exactly because the tangential electric field
// vanishes on the end plates where the path enters and leaves.
//
// For TM1mp, E_z = E0 J1(kc r) cos(phi) cos(p pi z/d), so dV/dx = E0 (kc/2)
// |integral cos(p pi z/d) exp(j k z) dz| and U = eps k_m^2 a^2 J0(x)^2 pi
// d zeta/(8 kc^2), zeta = 2 for p = 0 and 1 otherwise, k_m the mode's
// wavenumber (derived from the fields of cavity.ModeField; checked in the
// tests by integrating the Lorentz force on a particle along the cavity).
// TE1mp modes have E_z = 0 everywhere and give 0.
//
// Errors: an invalid cavity or mode, a mode with n != 1, beta not in
// (0, 1].
func TransverseROverQ(c cavity.Cavity, m cavity.Mode, speed float64) (float64, error) {
	if err := c.Validate(); err != nil {
		return 0, err
	}
	if err := m.Validate(); err != nil {
		return 0, err
	}
	if err := c.ModelHolds(m, "the transverse R/Q"); err != nil {
		return 0, err
	}
	if m.N != 1 {
		return 0, fmt.Errorf("qfactor: the transverse R/Q is that of a dipole mode (n = 1), got %s", m)
	}
	if math.IsNaN(speed) || speed <= 0 || speed > 1 {
		return 0, fmt.Errorf("qfactor: particle speed must be in 0 < beta <= 1 (fraction of c), got %g", speed)
	}
	if m.Family == cavity.TE {
		return 0, nil
	}
	x := m.Root()
	epsR, muR := c.Fill.Eps(), c.Fill.Mu()
	eps := epsR * physics.VacuumPermittivity
	a, d := c.Radius, c.Length
	kc := x / a
	bz := float64(m.P) * math.Pi / d
	km := math.Hypot(kc, bz)
	omega := km * physics.SpeedOfLight / math.Sqrt(epsR*muR)
	kappa := omega / (speed * physics.SpeedOfLight)
	dv := kc / 2 * axialGain(kappa, bz, d) // dV/dx per unit E0
	zeta := 1.0
	if m.P == 0 {
		zeta = 2
	}
	j0 := math.J0(x)
	u := eps * km * km * a * a * j0 * j0 * math.Pi * d * zeta / (8 * kc * kc) // derived, see above
	return dv * dv / (kappa * kappa * omega * u), nil
}
