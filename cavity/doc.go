// Package cavity models the resonant modes of a closed circular cylinder:
// radius a, length d, perfectly conducting walls, homogeneous fill
// (eps_r, mu_r).
//
// # Modes and the index convention
//
// The modes are TE_nmp (n >= 0, m >= 1, p >= 1) and TM_nmp (n >= 0, m >= 1,
// p >= 0), with
//
//   - n the azimuthal index: fields vary as cos(n phi) or sin(n phi);
//   - m the radial index: the m-th positive zero of J'_n (TE) or J_n (TM);
//   - p the axial index: half-wavelengths along the length.
//
// A mode resonates at
//
//	f = c / (2 pi sqrt(mu_r eps_r)) * sqrt((x/a)^2 + (p pi/d)^2)
//
// with x = j'_nm for TE and x = j_nm for TM (Pozar, sec. 6.4; Harrington,
// sec. 5.3). Modes with n >= 1 come in two polarisations (Degeneracy 2).
// TE0mp and TM1mp (p >= 1) resonate at exactly the same frequency in every
// cylinder because J'_0 = -J_1 (DLMF 10.6.3); cylcav computes both from the
// same float64 root, so their frequencies are bit-equal, and reports each
// as the Companion of the other.
//
// Labels print as TE011 or TM010, and as TE(12,3,1) when an index reaches
// 10; ParseMode reads both forms.
//
// # What the package does
//
//   - Cavity.Frequency and Cavity.Wavenumbers: one mode.
//   - Cavity.Modes(fmax): every mode with f <= fmax, sorted by frequency
//     with ties in a fixed order (Resonance.Compare); Cavity.Lowest(k): the
//     k lowest; Cavity.Count: how many, with and without polarisations.
//   - Size: the dimensions that put a mode at a target frequency given one
//     of the ratio D/L, the diameter or the length.
//   - Cavity.Clearance: the spectrum around a wanted mode; Cavity.Reach: the
//     reachable set of a cavity in operation (end-plate tuning, temperature
//     range, worst-case machining tolerance) and its exact worst-case
//     clearance and offending modes, the one verdict every command prints.
//   - Mode.EndPlateTuning: whether an end plate tunes a mode (not for
//     p = 0); Cavity.Tune: the tuning curve; Cavity.SphereShift: the Slater
//     eigen-shifts of the degenerate set under a small sphere or screw tip.
//
// All quantities are SI (m, Hz, rad/m). Bessel zeros come from
// physics/bessel; their accuracy (about 1e-14 relative) bounds that of
// every frequency here.
//
// References:
//   - D. M. Pozar, Microwave Engineering, 4th ed., Wiley (2012), sec. 6.4
//     (circular cavity resonators) and its TE011 design example, sec. 6.7
//     (cavity perturbations; EndPlateShift); section numbers recalled from
//     memory.
//   - R. F. Harrington, Time-Harmonic Electromagnetic Fields, McGraw-Hill
//     (1961), sec. 5.3 (circular cavity).
//   - NIST Digital Library of Mathematical Functions, https://dlmf.nist.gov,
//     secs. 10.2 (power series, for J_n(x)/x at x = 0), 10.6 (J'_0 = -J_1
//     and J'_n), 10.19 (Debye's expansions, used to size the zero tables),
//     10.21 (zeros: ordering and interlacing), 10.22 (integrals of J_n^2,
//     for the field normalisation of ModeField).
//   - IEEE Std 754-2008, sec. 5.10 (the bit patterns of positive floats
//     order like their values; used by the sort in Modes).
//   - H. Weyl, Das asymptotische Verteilungsgesetz der Eigenwerte linearer
//     partieller Differentialgleichungen, Math. Ann. 71, 441 (1912): the
//     mode count N(f) ~ 8 pi V f^3 / (3 c^3) used as a test.
//   - J. C. Slater, Microwave electronics, Rev. Mod. Phys. 18, 441 (1946),
//     and L. C. Maier, J. C. Slater, Field strength measurements in
//     resonant cavities, J. Appl. Phys. 23, 68 (1952): the perturbation
//     theorem behind SphereShift and EndPlateShift.
//   - G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed., Johns
//     Hopkins (2013), sec. 8.5: the cyclic Jacobi method that gives
//     SphereShift the eigen-shifts of a degenerate set.
//   - D. Kajfez, P. Guillon (eds.), Dielectric Resonators, Artech House
//     (1986): tau_f = -alpha - tau_eps/2 (Sensitivity).
//   - T. F. Chan, G. H. Golub, R. J. LeVeque, Updating formulae and a
//     pairwise algorithm for computing sample variances (1979); B. P.
//     Welford, Technometrics 4, 419 (1962); R. J. Hyndman, Y. Fan, Sample
//     quantiles in statistical packages, Am. Stat. 50, 361 (1996);
//     C. A. R. Hoare, Algorithm 65: Find, Comm. ACM 4, 321 (1961)
//     (MonteCarlo statistics).
//   - W. H. Press et al., Numerical Recipes, 3rd ed., Cambridge (2007),
//     secs. 4.6 (Gauss-Legendre), 5.6 (quadratic roots), 10.2 (golden
//     section).
//
// Design (Optimize, Clearance, Tune, MonteCarlo) works on the mode chart:
// for a homogeneous fill every frequency ratio depends on s = (D/L)^2 alone,
// so the clearance is a lower envelope of monotone curves whose maximum is
// found exactly from their crossings (see optimize_exact.go).
//
// Optimize returns the optimum and the bound that holds it, nothing more;
// Analyze is the second step that builds on it (sensitivities, tuned
// lengths, thermal drift, Monte Carlo spread, trade-off curves), with its
// own AnalysisSettings, so a caller who wants D and L pays for nothing
// else. The shape follows gonum's optimize package: problem (DesignSpec),
// result (Design), and the settings of the analysis apart from the problem.
package cavity
