package axisym

import (
	"fmt"

	"cylcav/cavity"
)

// requireIsotropicFor refuses a uniaxial fill (physics.Medium with
// EpsRParallel set, c axis along z) in any section for the TM0 family,
// whose E_r and E_z see eps_perp and eps_par differently, which the
// modal solution of an isotropic section does not model. TE0 fields
// (E_phi only, perpendicular to the c axis) see eps_perp alone, which is
// Medium.Eps, so they are exact and pass. The error matches
// physics.ErrUniaxial.
func (b Body) requireIsotropicFor(fam cavity.Family) error {
	if fam != cavity.TM {
		return nil
	}
	for i, s := range b.Sections {
		if err := s.Fill.RequireIsotropic(fmt.Sprintf("the TM0 solution of section %d", i+1)); err != nil {
			return fmt.Errorf("%w; TE0 resonances are exact (E_phi sees eps_perp only): solve TE0 alone", err)
		}
	}
	return nil
}
