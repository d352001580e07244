// Package qfactor computes the losses of a closed circular-cylindrical
// cavity: the surface resistance of its walls, the unloaded Q of every TE_nmp
// and TM_nmp mode from wall and fill losses, the loaded Q and bandwidth for a
// given coupling, and the accelerator figures of merit of TM0mp modes.
//
// Index convention, as everywhere in cylcav: n azimuthal (cos n phi), m
// radial (m-th zero of J_n or J'_n), p axial (half-wavelengths along the
// length).
//
// # Wall Q with different walls
//
// The side wall (r = a), end plate A (z = 0) and end plate B (z = d) each
// have their own surface resistance (SurfaceResistances). For every mode
// the package computes the partial geometry factors G_side, G_A, G_B, each
// the ratio omega W / (1/2 integral |H_tan|^2 dS) over one wall part, so that
//
//	1/Q_wall = Rs_side/G_side + Rs_A/G_A + Rs_B/G_B
//
// The uniform-wall closed forms are Harrington's and Pozar's; the split over
// wall parts is derived here from the same fields (see WallQ) and checked in
// the tests by numerical quadrature of the mode fields.
//
// # Wall set
//
// WallSet holds the three wall parts of a cavity, each a Surface (metal,
// roughness, plating, temperature, superconducting state). Its Validate is
// the one place the rules on wall surfaces live (a *WallError names the
// part and the setting), Resistances gives the three Rs at a frequency, At
// turns it into a ResistancesAt, and Q0Constraint gives the D/L optimiser of
// package cavity its Q0 function.
//
// # Fill, unloaded, loaded
//
// A full homogeneous fill (the cavity's physics.Medium) with electric and
// magnetic loss tangents has 1/Q_fill = tan delta_e + tan delta_m, and
// 1/Q0 = 1/Q_wall + 1/Q_fill; UnloadedQ reads the loss tangents from the
// cavity's fill.
// Loaded Q and the 3 dB bandwidth follow from a coupling coefficient or an
// external Q. A Q with no loss behind it is math.Inf(1).
//
// Surface resistances may depend on frequency: UnloadedQ and UnloadedQAll
// take a ResistancesAt function and evaluate it at each mode's own
// frequency, so a whole mode list gets its Q in one call (about half a
// microsecond a mode).
//
// # Where the models stop holding
//
// Validity is the one verdict on a Q0 result: a skin depth above
// MaxSkinRatio of the cavity, a Q0 below MinValidQ, and wall metals with
// mu_r != 1 each give a Warning; every command that prints Q0 prints them.
//
// # Accelerator figures
//
// For TM0mp modes, Acceleration gives the transit-time factor of an on-axis
// particle of speed beta c, R/Q in the linac convention V^2/(omega W) and
// in the circuit convention V^2/(2 omega W), the geometry factor and the
// peak surface fields per accelerating gradient; the shunt impedance is
// R/Q times Q0.
//
// # Surface resistance
//
// Surface turns a wall material into Rs: the classical skin effect at the
// wall temperature (linear resistivity model, -50 C to +200 C by default),
// a roughness factor (Hammerstad-Bekkadal or Groiss), a plated layer over a
// base metal (layered surface impedance in transmission-line form),
// superconducting niobium (BCS approximation plus residual resistance, for
// T <= Tc/2), and warnings where the anomalous skin effect makes the
// classical model wrong (cryogenic copper).
//
// References:
//   - R. F. Harrington, Time-Harmonic Electromagnetic Fields, McGraw-Hill,
//     1961, ch. 5, the circular-cavity section (mode fields and the Q of
//     TM_nmp and TE_nmp modes with uniform walls; section number recalled
//     from memory as 5-4).
//   - D. M. Pozar, Microwave Engineering, 4th ed., Wiley, 2012: sec. 6.1
//     (unloaded, external and loaded Q; coupling coefficient), sec. 6.3 (Q of
//     a lossy fill, Q_d = 1/tan delta and 1/Q = 1/Q_c + 1/Q_d, eqs.
//     (6.48)-(6.49) as recalled from memory), sec. 6.4 (circular cavity:
//     field components and the closed-form Q_c of TE_nmp modes; its worked
//     example of a PTFE-filled copper TE011 cavity at 5 GHz) and sec. 1.7
//     (surface resistance of a good conductor). Equation numbers in this
//     package are recalled from memory and may be off by an edition.
//   - T. P. Wangler, RF Linear Accelerators, 2nd ed., Wiley-VCH, 2008,
//     ch. 2 (energy gain, transit-time factor) and ch. 5 (pillbox cavity,
//     shunt impedance, R/Q).
//   - H. Padamsee, J. Knobloch and T. Hays, RF Superconductivity for
//     Accelerators, 2nd ed., Wiley-VCH, 2008, ch. 1-2 (geometry factor,
//     R/Q, peak surface fields of the pillbox cavity).
//   - NIST Digital Library of Mathematical Functions, https://dlmf.nist.gov/,
//     10.22.5 (integral of J_n^2 t) and 10.6.2 (J'_n recurrence).
//   - S. Ramo, J. R. Whinnery and T. Van Duzer, Fields and Waves in
//     Communication Electronics, 3rd ed., Wiley, 1994, ch. 3 (skin effect,
//     surface impedance, layered conductors).
//   - D. M. Pozar, Microwave Engineering, 4th ed., sec. 1.4 (skin depth; plane waves in a good conductor)
//     and sec. 2.7 (input impedance of a lossy line, used for the layered
//     wall).
//   - E. O. Hammerstad and O. Bekkadal, Microstrip Handbook, ELAB report
//     STF44 A74169, University of Trondheim, 1975 (roughness factor).
//   - S. Groiss, I. Bardi, O. Biro, K. Preis and K. R. Richter, Parameters
//     of lossy cavity resonators calculated by the finite element method,
//     IEEE Trans. Magn. 32(3), 894-897, 1996 (roughness factor).
//   - H. Padamsee, J. Knobloch and T. Hays, RF Superconductivity for
//     Accelerators, 2nd ed., 2008, ch. 5 (BCS surface resistance of
//     niobium, approximate formula; recalled from memory).
//   - A. B. Pippard, Proc. R. Soc. Lond. A 191, 385 (1947), and G. E. H.
//     Reuter and E. H. Sondheimer, Proc. R. Soc. Lond. A 195, 336 (1948)
//     (anomalous skin effect).
//   - N. W. Ashcroft and N. D. Mermin, Solid State Physics, 1976, ch. 1-2
//     (free-electron mean free path).
//   - CRC Handbook of Chemistry and Physics, 97th ed., 2016, Electrical
//     resistivity of pure metals (the linear resistivity model of
//     Conductivity; recalled from memory).
package qfactor
