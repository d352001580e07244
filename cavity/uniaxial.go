package cavity

import (
	"math"

	"cylcav/physics"
)

// radiusFor returns the radius that turns mode family f of c into the modes
// of the isotropic formula of Frequency with the fill's eps_perp: c.Radius,
// except for TM modes in a uniaxial fill (physics.Medium.Uniaxial, c axis
// along z), where it is c.Radius sqrt(eps_par/eps_perp).
//
// TE_nmp modes have no E_z, so their field lies in the plane perpendicular
// to the c axis and sees eps_perp alone:
//
//	(omega/c0)^2 eps_perp = kc^2 + beta^2.
//
// TM_nmp modes have E_z (parallel) and E_t (perpendicular); from
// div D = 0 and the wave equation of E_z in the crystal,
//
//	(omega/c0)^2 = kc^2/eps_par + beta^2/eps_perp
//
// (the extraordinary waves of a uniaxial medium with the optic axis along
// the guide: Collin, Field Theory of Guided Waves, 2nd ed., 1991, ch. 3 on
// anisotropic media; recalled from memory, derived again here and checked
// in the tests by the curl-curl equation of the fields), with kc = x/a,
// beta = p pi/d. Multiplying by eps_perp gives the isotropic formula with
// eps_perp and kc = x/a', a' = a sqrt(eps_par/eps_perp) (derived). TM0m0
// modes (beta = 0) see eps_par alone.
func (c Cavity) radiusFor(f Family) float64 {
	if f != TM || !c.Fill.Uniaxial() {
		return c.Radius
	}
	return c.Radius * radiusScale(c.Fill, f)
}

// radiusScale returns the factor of radiusFor: sqrt(eps_par/eps_perp) for
// TM modes in a uniaxial fill, 1 otherwise.
func radiusScale(fill physics.Medium, f Family) float64 {
	if f != TM || !fill.Uniaxial() {
		return 1
	}
	return math.Sqrt(fill.EpsPar() / fill.Eps())
}

// ModelHolds returns nil when a model that assumes an isotropic fill (named
// by model, for the error) holds for mode m of c: always for an isotropic
// fill, and for TE modes of a uniaxial one, whose fields have no E_z and so
// are those of the isotropic cavity filled with eps_perp (see radiusFor).
// For a TM mode in a uniaxial fill it returns an error saying so: the one
// refusal of every per-mode model that does not support that case.
func (c Cavity) ModelHolds(m Mode, model string) error {
	if m.Family == TE || !c.Fill.Uniaxial() {
		return nil
	}
	return physics.UniaxialError("cavity: %s of %s holds for TE modes only in a uniaxial fill (%s, eps_perp %g, eps_par %g)", model, m, c.Fill.Label(), c.Fill.Eps(), c.Fill.EpsPar())
}

// Companion returns the mode that resonates at exactly the frequency of m
// in c: Mode.Companion (TE0mp with TM1mp) for an isotropic fill, and none
// in a uniaxial fill, where TM1mp sees eps_par and TE0mp does not
// (radiusFor).
func (c Cavity) Companion(m Mode) (Mode, bool) {
	if c.Fill.Uniaxial() {
		return Mode{}, false
	}
	return m.Companion()
}
