package physics

// Physical constants in SI units, from the 2018 CODATA recommended values
// (E. Tiesinga et al., "CODATA recommended values of the fundamental physical
// constants: 2018", Rev. Mod. Phys. 93, 025010, 2021). Since the 2019 SI
// redefinition c, h, e and k_B are exact; mu0 and eps0 are measured.
const (
	// SpeedOfLight is the speed of light in vacuum c, in m/s (exact).
	SpeedOfLight = 299792458.0

	// VacuumPermeability is the magnetic constant mu0, in H/m
	// (CODATA 2018: 1.25663706212(19)e-6).
	VacuumPermeability = 1.25663706212e-6

	// VacuumPermittivity is the electric constant eps0, in F/m
	// (CODATA 2018: 8.8541878128(13)e-12).
	VacuumPermittivity = 8.8541878128e-12

	// VacuumImpedance is the characteristic impedance of vacuum Z0 = mu0 c,
	// in ohm (CODATA 2018: 376.730313668(57)).
	VacuumImpedance = 376.730313668

	// Boltzmann is the Boltzmann constant k_B, in J/K (exact).
	Boltzmann = 1.380649e-23

	// Planck is the Planck constant h, in J s (exact).
	Planck = 6.62607015e-34

	// ElementaryCharge is the elementary charge e, in C (exact).
	ElementaryCharge = 1.602176634e-19

	// ZeroCelsius is 0 degrees Celsius in kelvin (exact by definition).
	ZeroCelsius = 273.15
)
