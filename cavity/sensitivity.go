package cavity

// Sensitivity holds the first derivatives of a mode's resonant frequency.
type Sensitivity struct {
	// DfDD and DfDL are the partial derivatives of f with respect to the
	// diameter and the length, Hz/m:
	//
	//	df/dD = -f (1 - s)/D,  df/dL = -f s/L,  s = (beta/k)^2
	//
	// (derived by differentiating f = c/(2 pi n) sqrt((2x/D)^2 + (p pi/L)^2),
	// Pozar, Microwave Engineering, 4th ed., sec. 6.4).
	DfDD, DfDL float64
	// AxialShare is s = (beta/k)^2, the share of k^2 carried by the axial
	// wavenumber: 0 for TM_nm0, near 1 for long-wavelength axial modes.
	AxialShare float64
	// TempCoeff is (1/f) df/dT in 1/K and DfDT = f TempCoeff in Hz/K for
	// the Thermal coefficients given:
	//
	//	(1/f) df/dT = -[(1 - s) alpha_r + s alpha_z] - tau_eps / 2.
	//
	// With alpha_r = alpha_z = alpha this is the homogeneous-metal law
	// df/f = -alpha dT (every dimension scales, f ~ 1/size); the mixed form
	// follows from DfDD and DfDL (derived); -tau_eps/2 is the fill's part
	// (f ~ 1/sqrt(eps)), the familiar tau_f = -alpha - tau_eps/2 of the
	// dielectric-resonator literature (D. Kajfez and P. Guillon, eds.,
	// Dielectric Resonators, Artech House 1986, the chapter on temperature
	// stability; recalled from memory). Linear in the coefficients, valid
	// for small temperature changes.
	TempCoeff, DfDT float64
}

// Sensitivity returns the frequency sensitivities of mode m of cavity c
// (see the Sensitivity type). Only the coefficients of th are used. Errors:
// an invalid cavity, mode or thermal description.
func (c Cavity) Sensitivity(m Mode, th Thermal) (Sensitivity, error) {
	if err := c.Validate(); err != nil {
		return Sensitivity{}, err
	}
	if err := m.Validate(); err != nil {
		return Sensitivity{}, err
	}
	if err := (Thermal{AlphaRadial: th.AlphaRadial, AlphaAxial: th.AlphaAxial}).Validate(); err != nil {
		return Sensitivity{}, err
	}
	if err := checkFillDrift(c.Fill, Thermal{}); err != nil {
		return Sensitivity{}, err
	}
	f := c.Frequency(m)
	_, beta, k := c.Wavenumbers(m)
	s := (beta / k) * (beta / k)
	out := Sensitivity{
		DfDD:       -f * (1 - s) / c.Diameter(),
		DfDL:       -f * s / c.Length,
		AxialShare: s,
		TempCoeff:  -((1-s)*th.AlphaRadial + s*th.AlphaAxial) - c.Fill.EpsTempCoeff()/2,
	}
	out.DfDT = f * out.TempCoeff
	return out, nil
}
