package physics

import (
	"errors"
	"fmt"
	"math"
)

// Medium is a homogeneous fill: the one value every package uses for what
// is inside a cavity. Values are SI. It is isotropic unless EpsRParallel is
// set: then it is a uniaxial crystal (sapphire, for instance) with its optic
// (c) axis along the cavity's axis z, EpsR holding the permittivity for a
// field perpendicular to that axis and EpsRParallel the one for a field
// along it (see Uniaxial).
//
// The zero value is vacuum: a zero EpsR or MuR means 1 (see Eps and Mu, the
// only place that default lives), and zero loss tangents mean no loss. To
// the accuracy of any cavity calculation here vacuum is also dry air; the
// library row "air" (LookupDielectric) has its small excess permittivity.
type Medium struct {
	// Name is a label for people ("air", "ptfe", "user"); "" means vacuum.
	Name string
	// EpsR is the relative permittivity (real part); zero means 1. For a
	// uniaxial medium it is eps_perp, for a field perpendicular to the
	// cavity axis z.
	EpsR float64
	// EpsRParallel is, for a uniaxial crystal with its c axis along the
	// cavity axis z, the relative permittivity for a field along z
	// (eps_par); zero means isotropic (eps_par = eps_perp = EpsR). The loss
	// tangents, the temperature coefficient and the permeability are then
	// taken to be the same for both directions.
	EpsRParallel float64
	// MuR is the relative permeability (real part); zero means 1.
	MuR float64
	// TanDelta is the electric loss tangent, imaginary over real part of
	// eps, at TanDeltaFreq.
	TanDelta float64
	// TanDeltaFreq is the frequency at which TanDelta was measured, in Hz;
	// zero means not stated.
	TanDeltaFreq float64
	// TanDeltaM is the magnetic loss tangent, imaginary over real part of
	// mu (zero for non-magnetic fills).
	TanDeltaM float64
	// TCEps is the temperature coefficient of permittivity (1/eps) d eps/dT
	// near 20 C, in 1/K; meaningful only when TCEpsKnown is true.
	TCEps      float64
	TCEpsKnown bool
}

// Limits of a Medium accepted by Validate. The permittivity and
// permeability limits reject typing slips, not physics: a relative
// permeability below 1 occurs in magnetised ferrites above resonance and in
// diamagnetic media. The loss models that use a Medium (package qfactor) are
// first order in the loss tangent, so their relative error is of the order
// of tan delta and results beyond about 0.01 are estimates.
const (
	MinEpsR, MaxEpsR = 1, 1e4
	MinMuR, MaxMuR   = 1e-3, 1e5
	MaxTanDelta      = 1.0
)

// Eps returns the relative permittivity, EpsR with zero meaning 1.
func (m Medium) Eps() float64 { return orOne(m.EpsR) }

// EpsPar returns the relative permittivity for a field along the cavity
// axis z: EpsRParallel for a uniaxial medium, Eps otherwise.
func (m Medium) EpsPar() float64 {
	if m.EpsRParallel == 0 {
		return m.Eps()
	}
	return m.EpsRParallel
}

// Uniaxial reports whether the medium is a uniaxial crystal, one whose
// EpsRParallel is set and differs from Eps.
func (m Medium) Uniaxial() bool { return m.EpsRParallel != 0 && m.EpsRParallel != m.Eps() }

// ErrUniaxial matches (errors.Is) every refusal of a uniaxial fill by a
// model that holds for isotropic fills only (RequireIsotropic, cavity's
// ModelHolds); such errors are made by UniaxialError.
var ErrUniaxial = errors.New("uniaxial fill not supported")

// UniaxialError returns an error with the formatted message that matches
// ErrUniaxial.
func UniaxialError(format string, a ...any) error {
	return &uniaxialError{fmt.Sprintf(format, a...)}
}

type uniaxialError struct{ msg string }

func (e *uniaxialError) Error() string        { return e.msg }
func (e *uniaxialError) Is(target error) bool { return target == ErrUniaxial }

// RequireIsotropic returns nil for an isotropic medium and, for a uniaxial
// one, an error saying that model (for example "the D/L optimiser") holds
// for isotropic fills only: the one refusal every model that does not
// support a uniaxial fill gives.
func (m Medium) RequireIsotropic(model string) error {
	if !m.Uniaxial() {
		return nil
	}
	return UniaxialError("%s holds for isotropic fills only, not the uniaxial fill %s (eps_perp %g, eps_par %g)", model, m.Label(), m.Eps(), m.EpsPar())
}

// EpsText returns the permittivity for people: "eps_r 2.08" for an
// isotropic medium, "uniaxial, c axis along z: eps_perp 9.39, eps_par
// 11.59" for a uniaxial one (%g format).
func (m Medium) EpsText() string {
	if !m.Uniaxial() {
		return fmt.Sprintf("eps_r %g", m.Eps())
	}
	return fmt.Sprintf("uniaxial, c axis along z: eps_perp %g, eps_par %g", m.Eps(), m.EpsPar())
}

// UniaxialPar returns eps_par of a uniaxial medium and 0 for an isotropic
// one: the value of the optional "eps_r_parallel" field of JSON output.
func (m Medium) UniaxialPar() float64 {
	if !m.Uniaxial() {
		return 0
	}
	return m.EpsPar()
}

// Mu returns the relative permeability, MuR with zero meaning 1.
func (m Medium) Mu() float64 { return orOne(m.MuR) }

func orOne(v float64) float64 {
	if v == 0 {
		return 1
	}
	return v
}

// Label returns Name, or "vacuum" for the unnamed (zero) medium, for
// people.
func (m Medium) Label() string {
	if m.Name == "" {
		return "vacuum"
	}
	return m.Name
}

// Index returns the refractive index sqrt(mu_r eps_r) of the medium (with
// eps_perp for a uniaxial one: the index a TE mode sees).
func (m Medium) Index() float64 { return math.Sqrt(m.Eps() * m.Mu()) }

// EpsTempCoeff returns the temperature coefficient of permittivity
// (1/eps) d eps/dT in 1/K when it is known, and 0 otherwise (a fill whose
// permittivity is taken not to change).
func (m Medium) EpsTempCoeff() float64 {
	if !m.TCEpsKnown {
		return 0
	}
	return m.TCEps
}

// EpsAt returns the relative permittivity dT kelvin away from the
// temperature at which EpsR holds, by the linear model
// eps(T) = eps (1 + TCEps dT) (the definition of TCEps; zero coefficient
// when it is not known).
func (m Medium) EpsAt(dT float64) float64 { return m.Eps() * (1 + m.EpsTempCoeff()*dT) }

// Validate reports whether the medium is physical: MinEpsR <= eps_r and
// eps_par <= MaxEpsR, a uniaxial medium non-magnetic and MinMuR <= mu_r <= MaxMuR (zero meaning 1), both loss tangents
// in 0..MaxTanDelta, and TanDeltaFreq and TCEps finite with TanDeltaFreq
// >= 0. The error names the quantity, the valid range and the value.
func (m Medium) Validate() error {
	for _, q := range []struct {
		name   string
		v      float64
		lo, hi float64
	}{
		{"eps_r", m.Eps(), MinEpsR, MaxEpsR},
		{"eps_par", m.EpsPar(), MinEpsR, MaxEpsR},
		{"mu_r", m.Mu(), MinMuR, MaxMuR},
		{"electric loss tangent tand", m.TanDelta, 0, MaxTanDelta},
		{"magnetic loss tangent tandm", m.TanDeltaM, 0, MaxTanDelta},
	} {
		if !(q.v >= q.lo && q.v <= q.hi) {
			return fmt.Errorf("%s must be in %g..%g, got %g", q.name, q.lo, q.hi, q.v)
		}
	}
	if m.Uniaxial() && m.Mu() != 1 {
		return fmt.Errorf("a uniaxial fill must be non-magnetic (mu_r 1), got mu_r %g", m.Mu())
	}
	if !(m.TanDeltaFreq >= 0) || math.IsInf(m.TanDeltaFreq, 0) {
		return fmt.Errorf("loss-tangent frequency must be finite and >= 0 Hz, got %g Hz", m.TanDeltaFreq)
	}
	if math.IsNaN(m.TCEps) || math.IsInf(m.TCEps, 0) {
		return fmt.Errorf("temperature coefficient of eps must be finite, got %g 1/K", m.TCEps)
	}
	return nil
}

// Q returns the Q of the medium filling a whole cavity,
//
//	1/Q_fill = tan delta_e + tan delta_m,
//
// the same for every mode. The electric term is Pozar's Q_d = 1/tan delta
// (Pozar, Microwave Engineering, 4th ed. (2012), sec. 6.3, eq. (6.48), as
// recalled from memory); the magnetic term is derived the same way: the
// fill dissipates omega eps_i |E|^2/2 and omega mu_i |H|^2/2 per unit volume
// (eps_i, mu_i the imaginary parts), and at resonance the time-averaged
// electric and magnetic energies are equal, each half of W, so
// P_fill = omega W (tan delta_e + tan delta_m).
//
// Special cases are:
//
//	Q = +Inf for a lossless medium
//
// Q does not validate; call Validate first on user input.
func (m Medium) Q() float64 {
	s := m.TanDelta + m.TanDeltaM
	if s == 0 {
		return math.Inf(1)
	}
	return 1 / s
}
