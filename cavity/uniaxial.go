package cavity

import (
	"fmt"
	"math"

	"cylcav/physics"
)

// Uniaxial is a uniaxial crystal (sapphire, for instance) filling the whole
// cavity with its optic (c) axis along the cylinder's axis z: Perp holds
// the permittivity and losses for a field perpendicular to the c axis, Par
// for a field parallel to it (the library rows "sapphire-perp" and
// "sapphire-par"). Only the permittivities enter the frequency; both media
// must be non-magnetic.
type Uniaxial struct {
	Perp, Par physics.Medium
}

// UniaxialFrequency returns the resonant frequency in Hz of mode m of a
// cavity of c's size filled with the uniaxial crystal u (c-axis along z).
// c.Fill must be vacuum (the crystal is the fill).
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
// beta = p pi/d. TM0m0 modes (beta = 0) see eps_par alone.
//
// Errors: an invalid cavity, mode or medium; a magnetic medium; a
// non-vacuum c.Fill.
func (c Cavity) UniaxialFrequency(m Mode, u Uniaxial) (float64, error) {
	if err := c.Validate(); err != nil {
		return 0, err
	}
	if err := m.Validate(); err != nil {
		return 0, err
	}
	if c.Fill.Eps() != 1 || c.Fill.Mu() != 1 {
		return 0, fmt.Errorf("cavity: a uniaxial crystal is the cavity's fill; leave Cavity.Fill vacuum, got %s", c.Fill.Label())
	}
	for _, md := range []physics.Medium{u.Perp, u.Par} {
		if err := md.Validate(); err != nil {
			return 0, err
		}
		if md.Mu() != 1 {
			return 0, fmt.Errorf("cavity: the uniaxial model is for non-magnetic crystals, got mu_r = %g", md.Mu())
		}
	}
	kc, beta, _ := c.Wavenumbers(m)
	ep, ez := u.Perp.Eps(), u.Par.Eps()
	var k0sq float64
	if m.Family == TE {
		k0sq = (kc*kc + beta*beta) / ep
	} else {
		k0sq = kc*kc/ez + beta*beta/ep
	}
	return physics.SpeedOfLight * math.Sqrt(k0sq) / (2 * math.Pi), nil
}
