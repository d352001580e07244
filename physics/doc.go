// Package physics holds what every other cylcav package rests on: physical
// constants (CODATA 2018, in one file), the parser and printer for user units
// (lengths, frequencies, temperatures, conductivities), and the library of
// wall and fill materials with the source of every value.
//
// Everything inside is SI: metres, hertz, siemens per metre, ohms, kelvin.
// User units appear only at the command-line edge through ParseLength,
// ParseFrequency and friends, and through the matching Format functions.
//
// The Bessel-root core lives in the subpackage physics/bessel.
//
// References:
//   - E. Tiesinga et al., CODATA recommended values of the fundamental
//     physical constants: 2018, Rev. Mod. Phys. 93, 025010 (2021).
//   - BIPM, The International System of Units (SI Brochure), 9th ed., 2019
//     (prefixes, the Celsius scale); the international inch of 0.0254 m
//     (1959) for in and mil.
//   - International Annealed Copper Standard (IEC, 1913; US Bureau of
//     Standards Circular 31, 1914): 100 % IACS = 1/58 ohm mm^2/m at 20 C,
//     alpha = 0.00393 1/K.
//   - CRC Handbook of Chemistry and Physics, 97th ed., 2016: Electrical
//     resistivity of pure metals; Thermal expansion of the elements.
//   - ASM Handbook Vol. 1 (1990), Properties and Selection: Irons, Steels,
//     and High-Performance Alloys; Vol. 2 (1990), Properties and Selection:
//     Nonferrous Alloys and Special-Purpose Materials.
//   - N. W. Ashcroft and N. D. Mermin, Solid State Physics, 1976, Table 1.1
//     (free-electron densities).
//   - D. M. Pozar, Microwave Engineering, 4th ed., Wiley, 2012, Appendices F
//     and G (conductivities; dielectric constants and loss tangents).
//   - J. Krupka et al., Complex permittivity of some ultralow loss
//     dielectric crystals at cryogenic temperatures, Meas. Sci. Technol. 10,
//     387 (1999) (sapphire, alumina).
//   - E. K. Smith and S. Weintraub, The constants in the equation for
//     atmospheric refractive index at radio frequencies, Proc. IRE 41, 1035
//     (1953) (dry air).
//   - H. Padamsee, J. Knobloch and T. Hays, RF Superconductivity for
//     Accelerators, 2nd ed., Wiley-VCH, 2008 (niobium).
//   - E. D. Marquardt, J. P. Le and R. Radebaugh, Cryogenic Material
//     Properties Database, 11th International Cryocooler Conference, 2000,
//     and the NIST cryogenic material properties pages built on it
//     (integrated thermal contraction fits of 304/316 stainless, 6061-T6
//     aluminium and invar; the expansion-coefficient fit of OFHC copper).
//   - P. E. Bradley and R. Radebaugh, Properties of Selected Materials at
//     Cryogenic Temperatures, NIST, 2013 (tabulated values used in tests).
//   - J. W. Ekin, Experimental Techniques for Low-Temperature Measurements,
//     Oxford University Press, 2006, Appendix A6.4 (thermal contraction of
//     technical materials; niobium).
//   - F. N. Fritsch and R. E. Carlson, Monotone piecewise cubic
//     interpolation, SIAM J. Numer. Anal. 17, 238 (1980).
//
// The material values were recalled from memory from these sources, not
// read from them on the machine where they were entered; each row's Source
// says so, and users can give measured values instead (ParseConductor,
// ParseDielectric).
package physics
