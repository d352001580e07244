// Package iris realises the couplings of a coupled-cavity filter as holes
// you can machine: centred circular irises between in-line TE0mp or TM0mp
// cavities solved exactly by the axisymmetric mode-matching solver
// (package axisym), the end irises to circular waveguide ports through a
// port function (external Q), and off-axis holes for cross couplings by
// Bethe's small-aperture theory with the wall-thickness correction
// (package filter), each with one verdict (Judge) on where its method
// holds. It sits above axisym and filter in the package graph.
//
// # In-line irises (Pair)
//
// Two equal cells joined by a centred iris of radius r in a wall of
// thickness t form an axisymmetric body; the cell mode splits into an even
// and an odd resonance, and k = (fh^2 - fl^2)/(fh^2 + fl^2) (Hong and
// Lancaster 2001, sec. 8.2; axisym.CouplingOf) with its convergence
// estimate. Pair.Curve samples k on log-spaced radii (CurveLow..CurveHigh
// of the cell radius); Pair.Invert brackets each wanted k on the curve and
// refines it by regula falsi with the Illinois weighting on ln k against
// ln r, each step a new solve, to a radius bracket of 1e-9 (k to about
// 1e-8). The convergence estimate of k becomes a radius uncertainty
// through the curve's slope.
//
// Each cell's own frequency with the iris in place is
// f_self^2 = 2 fl^2 fh^2/(fl^2 + fh^2) (the coupled-resonator circuit of
// Hong and Lancaster, sec. 8.2, derived; it equals the middle resonance
// of a chain of three such cells to 1e-6..1e-4). For p > 0 the iris acts
// as an effective extension of each cell's length (the closed cell that
// resonates at f_self is longer by Extension), and the extensions of the
// irises on a cavity's two end plates add: Realise makes each cavity
// shorter by their sum than the closed cavity at f_i, and repeats the
// sizing on the corrected cavities until no length moves by more than
// DimensionTol (a secant per cavity; each iris restarts from its last
// radius). Adding the frequency shifts instead would leave a two-iris
// cavity mistuned by about 5 % of its detuning (the length sensitivity
// of the frequency is not constant over that range); for TM0m0, whose
// frequency does not depend on the length, the summed shifts set the
// radius.
//
// # Ports (Port)
//
// An end cell with a centred iris opening into a circular waveguide that
// runs to infinity: the port function (axisym.PortQ) gives the complex
// resonance, f0 and Qext = Re f/(2 Im f), the same, to order 1/Qext, as
// the group-delay definition Qext = omega0 tau/4 (Ness 1998; Kajfez 1994).
// Port.Invert scans radii upwards, brackets the wanted Qext between two
// consecutive solves of one resonance and refines it like Pair.Invert.
//
// # Off-axis holes
//
// Cross couplings between resonators are holes in the side wall shared
// by the two cavities (a folded layout, cavities side by side), sized by
// filter.SizeHole: Bethe's polarisabilities (Bethe 1944) with the
// attenuation exp(-alpha t) of the hole's lowest TE11 (magnetic) or TM01
// (electric) mode over the wall thickness (S. B. Cohn, Proc. IRE 40
// (1952) 696-699; Matthaei, Young and Jones 1964, sec. 5.10; the refined
// correction of N. A. McDonald, IEEE Trans. MTT 20 (1972) 689-695, is not
// implemented). A cross coupling of the sign a hole cannot give (the main
// line taken as the kind the irises give) and couplings to source or load
// besides the end resonators are rows without a number.
//
// # Accuracy
//
//   - TestPairFiniteDifference: k of two TE011 cells (a = l = 12 mm) through
//     a 6 mm iris in a 2 mm wall against finite differences of the even and
//     odd half problems written in the test, extrapolated to zero step:
//     k = 0.0081417 against 0.0081397, 2.4e-4 relative, within the finite
//     differences' stated accuracy (3.2e-4).
//   - TestPairFiniteVolumeTM010: the same for two TM010 cells (a = 12 mm,
//     l = 8 mm) through a 5 mm iris in a 1 mm wall, against cell-centred
//     finite volumes of the electric- and magnetic-plane half problems:
//     k = 0.0388532 against 0.0388456, 1.9e-4 relative, within the stated
//     accuracy (2.6e-4).
//   - TestBetheLimitTM010: two TM010 cells through a small centred iris in
//     a 1 um wall meet Bethe's electric small-hole coupling as the iris
//     shrinks: departures 7.3 %, 2.3 % and 0.9 % at r/a = 0.2, 0.1, 0.05
//     (Bethe's theory is first order in k r and in the field's variation
//     over the hole). For TE0 cells the centred hole has no dipole term,
//     so that limit is checked with TM010.
//   - TestQextBetheLimitTM010: the port's Qext of a TM010 cell (a = 20
//     mm, l = 10 mm) fed through a centred iris from a TM01 guide of
//     radius 30 mm, extrapolated to zero wall thickness from 1 and 2 um,
//     against Bethe's small-hole Qext (derived in the test: the hole's
//     electric dipole radiating into the guide's TM01 mode): ratios
//     1.147, 1.0375 and 1.0079 at r/a = 0.2, 0.1, 0.05, the departure
//     falling as (r/a)^2. TestDipoleModePowerFreeSpace checks the guide
//     mode's dipole power against free-space radiation (0.2 % at k b =
//     400); TestQextCentredHoleTE011: a centred hole on a TE011 cell has
//     no dipole term, and its Qext falls as r^-9.9 (r^-10 expected).
//   - TestChainAgainstModel: 3- and 4-cavity in-line TE011 and TM010
//     filters built from the sized irises and corrected dimensions and
//     solved as one closed body resonate within 0.053 bandwidths of the
//     coupling-matrix model f0/sqrt(1 + lambda(K)); the TE011 chain's k is
//     about 5 % below the pairs' (the pairs lie 13 to 22 splits from their
//     next resonance, which the two-resonator formula neglects).
//   - TestRealiseSixPole: every iris and port iris of a 6-pole filter
//     reproduces its k and Qext when solved again on the corrected
//     cavities (1e-5); the corrected cavities resonate at f_i/(1 + shift).
//
// Speed: BenchmarkSixPole, all seven couplings of a 6-pole in-line TE011
// filter with its corrected lengths (the first pass: one shared curve of
// 10 radii, five inversions, two port scans; then about three passes of
// secant steps; mirror-image couplings sized once), about 0.6 s of CPU
// (about 1 s wall on the loaded shared 2-core machine).
//
// # References
//
//   - J.-S. Hong and M. J. Lancaster, Microstrip Filters for RF/Microwave
//     Applications, Wiley 2001, sec. 8.2.
//   - H. A. Bethe, "Theory of diffraction by small holes", Phys. Rev. 66
//     (1944) 163-182.
//   - S. B. Cohn, "Microwave coupling by large apertures", Proc. IRE 40
//     (1952) 696-699.
//   - G. L. Matthaei, L. Young and E. M. T. Jones, Microwave Filters,
//     Impedance-Matching Networks, and Coupling Structures, McGraw-Hill
//     1964, sec. 5.10.
//   - J. B. Ness, "A unified approach to the design, measurement, and
//     tuning of coupled-resonator filters", IEEE Trans. MTT 46 (1998)
//     343-351.
//   - C. F. Dowell and P. Jarratt, BIT 11 (1971) 168-174 (the Illinois
//     method).
//
// Bibliographic details were recalled from memory.
package iris
