// Package axisym finds the resonances of axisymmetric cavities built from
// coaxial cylindrical sections stacked along z between two ends, each a
// metal plate or a semi-infinite pipe (Body, Section, End), by axial mode
// matching on the Bessel-root core.
//
// # Scope
//
// Implemented: azimuthal order n = 0, TE0 and TM0 separately, circular and
// coaxial sections (an inner conductor, as in a re-entrant post or a
// coaxial line), each homogeneously filled with a physics.Medium or made of
// radial layers of isotropic, non-magnetic media (Section.Layers), metal
// end plates and metal step faces, wherever at each junction one
// cross-section lies inside the other. Not yet implemented, each an error
// wrapping ErrNotImplemented rather than a number: n >= 1 for open,
// coaxial, layered or uniaxial bodies, and the losses and fields of any
// body for n >= 1, junctions whose aperture is neither side's
// cross-section, layers with mu_r != 1, layered sections next to an open end,
// accurate wall losses next to step edges (see Losses), the wall Q of a
// radiating resonance and peak surface fields. Open ends (beam pipes and
// feeding waveguides to infinity) and radially layered fills (TE0 and TM0
// of a dielectric rod or puck in a can, with their losses, filling factors
// per layer and fields) are implemented: see Open ends and Layered
// sections. Azimuthal order n >= 1 (TE_n and TM_n coupled at every step)
// is implemented for closed bodies of homogeneous circular sections,
// frequencies and labels only: see Order n >= 1.
//
// # Method
//
// Each section is a bundle of modal transmission lines, one per waveguide
// mode (cutoffs j_{0,m}/a for TM0 and j_{1,m}/a for TE0 of a circular
// guide; the TEM mode and the roots of the Bessel cross products,
// bessel.CrossZeros, for a coaxial one). At a junction the transverse field on the aperture is
// expanded in the narrower section's modes and is zero on the step face;
// the overlap integrals with the wider section's modes are Lommel
// integrals in closed form (DLMF 10.22.5). Adding the sections' modal
// admittance matrices through these projections gives the junction matrix
// B(f), whose singularity is the resonance (the generalised-admittance form
// of mode matching: Wexler 1967; Patzelt and Arndt 1982).
//
// B(f) is real, symmetric and, by Foster's reactance theorem, increasing in
// f between the poles where a section closed by metal at both ends
// resonates. The Wittrick-Williams algorithm (1971) therefore counts the
// resonances of the truncated model below any f exactly: the poles passed
// (closed-form section resonances) plus the inertia of B(f) from an
// elimination. Solve isolates every resonance by bisection on that count
// (none can be missed), then refines it by a safeguarded secant iteration
// to 1e-14 relative.
//
// The number of modes per section follows the radius (the
// relative-convergence rule for steps: Lee, Jones and Campbell 1971;
// Mittra, Itoh and Li 1972), at least the propagating modes plus two.
//
// # Edge-conditioned junctions
//
// With Request.EdgeBasis (stack --edge-basis), for closed bodies of
// homogeneous circular sections with a step at every junction, each
// junction's unknowns are not the narrow guide's modal voltages but the
// coefficients of K aperture functions that carry the edge singularity
// (edgebasis.go; the Galerkin aperture-field method with edge-conditioned
// basis functions of Mittra and Lee 1971): three families
// x (1 - x^2)^nu P_k^(1,nu)(1 - 2x^2), x = r/a, whose exponents nu follow
// the terms of the field at the 270-degree edge, rho^(tau - 1) for TM0
// and rho^tau for TE0 with tau the roots of
// w cot(pi tau) + n cot(pi tau/2) = 0 (w, n the permittivities of the wide
// and narrow side for TM0, the reciprocal permeabilities for TE0; 2/3 and
// 4/3 in one medium, Meixner 1972; 0.6046 and 1.3955 for the five-section
// body's vacuum-to-eps 2.1 steps), and tau = 2. The projections on every
// mode J1(kc r) of either guide are closed forms (a finite Hankel integral,
// z^(-nu-1) J_(2k+nu+2)(z), fractional orders by Miller's recurrence or
// Hankel's expansion, checked against mpmath), so the modal sums of the
// aperture admittance run over thousands of modes at little cost: the
// first two terms of each line's susceptance about f = 0 are summed once
// over 800 R/a modes per section with a Richardson tail, the rest over 40
// (or 1.5 Modes with losses). Each junction's basis is orthonormalised
// against its static matrix, dropping near-dependent directions. The
// junction matrix keeps its symmetry and its growth with f, so the
// Wittrick-Williams count works unchanged (tests: the same number of
// resonances as the default path on every body tried). Resonances use 12
// functions per junction; Change is the shift from a coarser model with 9
// (and fewer modes) plus 2e-9 of the frequency (edgeFloor: the fine
// model's own truncation of the modal sums, which the shift can miss when
// the two models happen to agree closely). In a short section (a thin
// iris) every mode with alpha l below 18 stays in the dynamic sums, since
// the static split takes each line as long. Losses and fields come from the modal voltages P c
// of each section, as in the default path.
//
// # Layered sections
//
// A layered section's modes depend on frequency (their cutoffs move with
// it), so at every frequency the model evaluates, each layered section's
// first N modes are found afresh (layeredGuide): beta^2 by bisection on an
// exact Sturm count of the modes above a trial beta^2 (zeros of the
// shooting solution, counted from the Bessel phase in J/Y layers and from
// end signs in I/K layers) and Illinois refinement of the wall value, the
// overlaps with the neighbours by Lommel's integral per layer. TE0 modes
// are orthogonal with weight 1, TM0 modes with weight 1/eps (derived;
// TestLayeredOverlap checks the Gram matrix to 1e-10).
//
// The Wittrick-Williams count rests on B(f) increasing with f. With
// layered sections the truncated B(f) also changes through the
// frequency-dependent overlaps, and that it still increases is not proven
// here. The count is kept for bracketing, and TestLayeredNoneMissed checks
// it by brute force on the puck example: on 600 frequencies it never
// falls, and the sign of det B(f) (-1)^J0(f) from an independent LU
// changes between grid points exactly as often (mod 2) as resonances are
// listed there. A section without junctions (a full-length rod) needs only
// its closed-section resonances, whose count is exact (beta_m^2 increases
// with frequency).
//
// Losses and fields of layered sections (layered_loss.go) come from the
// same matched line voltages and currents as those of homogeneous ones,
// with each mode's radial function per layer. The layered modes are not
// orthogonal with the weights of the stored energies (eps for W_e, 1 for
// the end-plate H of TM0), so the energies are full quadratic forms: per
// layer, the radial integrals of every pair of modes by Lommel's integral
// (int r G_m G_n dr, G = (1/r)(r u)', from int r u_m u_n dr and the end
// values, derived), times the z-integrals of the products of their line
// amplitudes. Loss.Layers gives each layer's filling factors, Loss.Q0 and
// Loss.Unloaded weight each layer's loss tangents by them, and
// Unloaded.Media lists every filled region with its p_e and own Q.
// Tests: a full-length rod in a can against the closed-form energy
// integrals of the two-layer TE0 and TM0 modes (mpmath, testdata/
// gen_rodloss.py: the rod's filling factors, each wall's geometry factor,
// the wall and dielectric Q, 14 resonances, to 4e-14, bound 1e-8); layers
// of one medium against the homogeneous solver on stepped and coaxial
// bodies (Q0, every geometry factor, filling factors and the field at
// sample points, to 8e-13, bound 1e-9); the puck's p_e against Slater's
// perturbation relation p_e = -2 (eps/f) df/d eps by a Richardson-improved
// central difference of Solve's frequency (TE01-delta-like mode: 6e-12,
// bound 1e-9; lowest TM0: 3.4e-7, within its relative change 6e-6, with
// fields singular at the puck's edges; 1.1e-7 with twice the modes).
// The wall Q of TE0 resonances by the surface integral against Wheeler's
// incremental-inductance rule (TestWheelerLayered): a full-length rod to
// 5e-10; the puck, whose truncated model obeys the rule only as the modes
// grow, to 1.3e-7 and 3e-6 for its two lowest TE0 resonances with 40
// modes (1.2e-8 and 2e-7 with 80).
// BenchmarkPuckQ0: the puck's lowest TE0 resonance with its fields and Q0
// in about 0.3 s, nearly all in finding the layered modes.
//
// # Accuracy
//
// A body without steps (one section, or several of one cross-section) has
// no truncation error: Solve returns the closed-form frequencies (tests to
// 1e-10 against package cavity, to 1e-10 against the TEM, TM0 and TE0
// lists of a coaxial cavity, and to 1e-9 against the transverse-resonance
// equation of a two-layer fill). Where a resonance of the body coincides
// exactly with one of a closed section (an equal-radius piece a whole
// number of half guide wavelengths long) the junction matrix is near a pole
// and the bracket holds to about 1e-8.
//
// With steps, independent finite-difference (TE0, E_phi) and finite-volume
// (TM0, H_phi) solutions written in the tests and extrapolated to zero
// step agree with Solve to 1.5e-5 (TE0) and 1.4e-5 (TM0) on a stepped body
// and to 1.5e-5 and 9e-6 on a re-entrant post, within their stated
// accuracy.
//
// A full-length dielectric rod in a can (two layers, eps_r 10 and 38, 44
// TE0 and TM0 resonances) matches the two-layer characteristic equation
// solved with mpmath (testdata/gen_rod.py) to 5e-15 (test bound 1e-9).
// No published table of a dielectric resonator in a cavity was at hand:
// the TE01-delta-like resonance of an invented puck on a support in a can
// (examples/puck-in-can.yaml) meets a finite-difference solution with
// varying permittivity, extrapolated to zero step, to 9e-8 (its stated
// accuracy 7e-7); its change when the modes grow by half is 2e-8. Speed:
// the five lowest TE0 resonances of that puck take about 0.9 s
// (BenchmarkPuckFiveTE0), almost all in finding the layered modes afresh
// at each frequency.
//
// With steps the field is singular at each 270-degree edge (Meixner's edge
// condition), and the frequency converges algebraically in the number N of
// modes. On a stepped test body the observed order is 2.0 for TE0 and TM0
// alike (differences shrink by 3.95 per doubling from N = 40 to 320; test
// TestConvergenceRate). A Galerkin estimate from the edge singularity alone
// gives order 4/3; the faster observed rate is not explained here and the
// test asserts the observed one. Each Resonance carries Change, the shift
// when N grows by half, which bounds the error at order 2 (tested against a
// model with four times the modes). With DefaultModes the five lowest TM0
// resonances of an invented five-section body change by 3e-6 to 1e-4
// relative: 1e-8 accuracy with steps is out of reach of plain truncation.
//
// Extrapolate applies Richardson's rule in the mode count: three models
// with N, 2N and 4N modes in every section (each section's count doubled
// exactly, since the error depends on the ratio of the counts at each
// junction and counts rounded afresh make the sequence irregular: with
// 40, 60, 90, 135, 202 modes the five-section body's differences change
// sign), the observed order fitted and the distance from the order-2
// extrapolation reported as the error. On the five-section body the
// fitted order drifts from 1.9 to 2.4 as N grows, a sign of further terms
// in the error, so the gain is about tenfold rather than to round-off:
// estimates of 4e-8..3e-7 relative from N = 30, 4e-9..9e-8 from N = 60,
// 2e-10..2.3e-8 from N = 120 (finest model 480 modes); 1e-8 for all five
// lowest resonances is not reached (TestExtrapolateStepped checks the
// estimates against an extrapolation from twice the modes). Cost
// (BenchmarkFiveLowestExtrapolated, N = 40): about 0.8 s wall on the shared
// machine, against 50 ms for Solve.
// Speed: BenchmarkFiveLowest (those five TM0 resonances with their
// estimates, two models of 40 and 60 modes in the widest section, roots to
// 1e-14) takes about 22 ms of CPU on one core of a shared 2-core virtual
// machine (45 ms wall time under load).
//
// The edge-conditioned junctions (Request.EdgeBasis) converge
// exponentially in the number K of aperture functions per junction: on
// the five-section body's TM0 list the change from K to K+3 is at most
// 6e-5 (K = 3), 1e-8 (K = 9), 9.5e-10 (K = 12) and 8e-12 (K = 15); on the
// stepped body 1.8e-7 (K = 3), 3.9e-13 (K = 6); TE0 alike
// (TestEdgeConvergence). With the exponents of the dielectric wedge
// (above) in place of 2/3 the five-section body converged only
// algebraically in K. Against the default path extrapolated from N = 120
// (models of 120, 240, 480 modes) the edge model agrees within
// Extrapolate's error plus 2e-9: the stepped body to 3.6e-10, 2.6e-10
// (TM0) and 3.5e-11 (TE0), the five-section body to 1.9e-8 .. 5e-10 (TM0,
// within the stated 68 .. 165 Hz) and 4.4e-10, 6e-10 (TE0). Against the
// finite-difference and finite-volume references of the stepped body
// 1.8e-5 (TE0) and 1.1e-5 (TM0), within their stated 5.3e-5 and 3.3e-5.
// Solve with EdgeBasis gives the five lowest TM0 resonances of the
// five-section body with changes of 7.3e-9 .. 2.8e-9 (shifts of 5.3e-9 ..
// 8e-10 plus the floor); a model with 15 functions, 480 dynamic and 12800
// static modes per unit R/a confirms errors of 1e-11 .. 4.7e-10
// (TestEdgeFiveLowest); on the nosed-cell and iris-pair examples errors
// of 4e-13 .. 8e-11 (TestEdgeExampleBodies); on a thin iris, a small
// hole, dielectric on either side of a step and the five-section body to
// 20 GHz (36 resonances) errors up to 6.3e-9, each within its change,
// the same number of resonances as the default path and agreement with
// it within three times its change (TestEdgeAgainstDefault). BenchmarkFiveLowestEdgeSolve
// (the same five with their estimates, two models) takes about 18 ms on
// one core (go test -cpu 1; BenchmarkFiveLowest 23 ms in the same run):
// the target of 1e-8 in under 50 ms is met this way. Wall-loss
// geometry factors from these fields converge in the number of modes
// summed, as in the default path (TestEdgeSolveRequest: G within twice
// the larger change of the two paths).
//
// # Losses
//
// With Request.Losses each resonance carries its Loss: the geometry factor
// G of every metal surface (side walls, inner conductors, both end plates
// and every step face, from (1/2) int |H_tan|^2 dS of the matched fields)
// and the share of the electric and magnetic energy in each section; Loss.Q0
// turns them into Q0 with a surface resistance per part (from
// qfactor.Surface) and each section's loss tangents. For a body without
// steps the factors are exact (one section: qfactor's closed forms to
// 1e-10; TE0 of a two-layer body: Wheeler's incremental-inductance rule to
// 1e-8). Next to a step edge |H_tan|^2 ~ rho^(-2/3), and the surface
// integral of the truncated series converges only as about N^(-1/3): on
// the stepped test body the wall Q is 7.8 % high at N = 40 (60 in the
// fine model) and 6.1 % at N = 80; extrapolated at that rate it meets
// Wheeler's value to 5e-4 (TestWheelerStepped). CoarseLoss lets a caller
// show that change. Where a resonance coincides with a resonance of a
// closed section the fields are not given (LossErr wraps
// ErrNotImplemented).
//
// Loss.Field samples the matched field anywhere in the r-z half plane
// (Field.At; tested by integrating its energy density over the body against
// the modal energies) and on grids (Field.Magnitudes, separated in r and z:
// a 200 x 200 map of a three-section body in about 10 ms,
// axisymplot.BenchmarkFieldMap200), the input of the field maps that
// package axisymplot draws.
//
// For TM0 resonances of bodies with a free axis, Loss.Accelerating gives
// the accelerating voltage V and transit-time factor T for a particle
// speed beta c and R/Q in both conventions (V^2/(omega W), "linac", and
// V^2/(2 omega W), "circuit"), and Loss.G the geometry factor (tested
// against the pillbox closed forms to 1e-10). Peak surface fields are not
// given: at a sharp step edge the model's E is infinite (Meixner), so a
// peak would be a number of the truncation, not of the cavity.
//
// # Open ends
//
// Either end of a Body may be a Pipe: a semi-infinite pipe of the end
// section's cross-section and fill (Body.EndA, Body.EndB; the zero value is
// a plate). The end section's modal lines then run on to infinity, and
// seen from its junction each is its own characteristic admittance. Below
// the lowest cutoff of the pipes for a family (Body.Cutoff) every pipe mode
// is evanescent: the admittance is reactive, -alpha/mu_r (TE) or
// eps_r/alpha (TM) in the scaling of the closed lines, increasing with f as
// Foster's theorem requires, with no pole; so the junction matrix stays
// real and the Wittrick-Williams count stays exact, and Solve finds every
// trapped resonance below the cutoff as before. Body.Radiates is the one
// verdict, trapped or radiating, that every caller uses; Solve stops just
// below the cutoff. The field of a trapped resonance decays into the pipe
// as exp(-alpha |z|); stored energy, the pipe-wall loss (part of the end
// section's side wall) and the axial integral of the accelerating voltage
// run on until the slowest mode has fallen by e^-40, and an open end has no
// plate loss. Tested against the closed solver with plates moved 0.14 m
// into the pipes, where the field has decayed by e^-25 or more: the
// frequencies agree to 1e-12, every geometry factor to 1e-9, T and R/Q to
// 1e-7 and 1e-6 (TestTrappedLongStub).
//
// Above the cutoff the resonance radiates into the pipe and its frequency
// is complex. The junction matrix is continued to complex frequency with
// the outgoing wave exp(-j beta z) in each pipe (beta on the branch that is
// positive above cutoff and -j alpha below it), and PortQ finds its zero
// by Muller's method (1956) on the determinant (kept as mantissa and
// exponent: a thin iris's many nearly shorted modes underflow a float64),
// scaled by a fixed diagonal taken off the real axis and multiplied by a
// factor even in beta l of every propagating line of a closed section to
// remove their poles (sin z / z for TE; z sin z for TM, whose lines also
// have a pole at their own cutoff, where a TM0m0 cell resonates, so a
// line within 10 % of cutoff in k^2 is included), from a starting
// frequency (which may be a closed TM0m0 resonance: the third start is
// moved off the real axis; TestPortQTM010ThinIris); f0 = Re f and
// Qext = Re f / (2 Im f). Radiating lists these resonances, each started
// from a resonance of the shorted body (Body.Shorted: the pipes' sections
// removed, their apertures closed by metal); unlike the trapped list it is
// not proven complete. PortS11 gives the reflection of the lowest mode of
// the pipe at end A; its group delay peaks at 4 Qext / omega0 (Kajfez).
// Tests: PortS11 of a short at distance d is -exp(-2 j beta d) to 1e-12;
// Qext from the complex frequency and from the group delay agree to
// 2e-7..1.6e-5 for Qext of 1e4 to 3e5 (TestPortQGroupDelay); through a
// thick centred iris Qext grows as exp(2 alpha t), alpha the closed-form
// attenuation of the iris's TE01 mode, to 3.5e-4 (TestPortQEvanescentIris);
// through a small centred hole scaled with its wall (TM010 cell fed from a
// TM01 guide) Qext falls as r0^-6, Bethe's small-aperture law (a dipole of
// polarizability proportional to r0^3), observed slope -5.966 from r0 = 1
// to 1.5 mm (TestPortQBetheScaling); the absolute Bethe constant is
// checked in package iris (TestQextBetheLimitTM010: 0.8 % at r0/a =
// 0.05 in a thin wall, the departure falling as (r0/a)^2).
// BenchmarkPortQ (a TE011 cavity fed through an iris, default modes):
// about 2.7 ms.
//
// Walls gives each kind of metal surface its own qfactor.Surface (a
// qfactor.WallSet for the side walls and end plates, and optionally the
// step faces and inner conductors), and Loss.Unloaded turns a resonance's
// Loss into Q0 with the Q of every surface (tested against qfactor.WallQ
// with three different metals to 1e-9).
//
// # Coupling
//
// CouplingOf turns the two resonances that a pair of equal coupled
// resonators splits into (the even and odd resonance of two cells joined
// by an iris) into the coupling coefficient k = (fh^2 - fl^2)/(fh^2 +
// fl^2) (Hong and Lancaster 2001, sec. 8.2), with its convergence estimate
// from the smaller model. Tested against the physics of a thick iris: k
// falls as exp(-alpha t) with the iris thickness t, alpha the closed-form
// attenuation of the iris guide's lowest TE0 mode, to 1e-3
// (TestCouplingEvanescentIris; observed 1e-4). For TE0 cells a centred
// hole sits where the tangential H of the end wall vanishes, so Bethe's
// small-hole dipole term is zero and k does not follow his r^3 law there.
//
// # Labels
//
// Each resonance is labelled with the mode of the enclosing vacuum cylinder
// (largest radius, total length) of the same family and the same place in
// frequency order: modes of one symmetry class do not cross under a
// generic deformation (von Neumann and Wigner 1929), so this is the mode it
// continues from. A body that is itself mirror-symmetric in z has even and
// odd classes that may cross; the label is then only the place in order.
// A body with a coaxial section has no label: an inner conductor joining
// both end plates changes the topology (and adds TEM resonances).
//
// # Order n >= 1
//
// For n >= 1 the TE_nm and TM_nm modes of neighbouring circular sections
// couple at every step, and Solve matches both families in one junction
// matrix (hybrid.go, whose comment has the derivation): the coupling
// integrals are closed-form Bessel expressions from Green's identity,
// Stokes' theorem and Lommel's integral; a TE mode of the narrow guide
// excites TM modes of the wide one (n pi J_n(kw a) J_n(kq a) N N'), a TM
// mode of the narrow guide no TE mode of the wide one, and at equal radius
// the families do not couple. Both families' lines are scaled by the
// free-space impedance so that the matrix stays real symmetric and
// increasing in f, and the Wittrick-Williams count adds the closed-section
// poles of both (offset: the TM unknowns). Each resonance is labelled with
// the mode of order n of the enclosing cylinder at its place in the
// order-n list (TE and TM together; Family is the label's family).
//
// Tests: one section (and one cut into three) reproduces every TE_nmp and
// TM_nmp of order 1 and 2 below 30 GHz of package cavity's closed form
// (34 and 30 resonances, worst 4.6e-15; bound 1e-10); two sections of one
// radius with different fills (eps 6.5, mu 1.3) meet the
// transverse-resonance equation of each mode solved by scan and bisection
// in the test (44 resonances, worst 3.8e-15; bound 1e-9); the coupling
// integrals meet Gauss-Legendre quadrature of the field components to
// 1e-9, and the Gram matrix of one guide is the identity; the count never
// falls on a 3000-point grid and the sign of det B (-1)^J0 from an
// independent pivoted LU changes exactly where resonances are listed
// (TestHybridNoneMissed). On a stepped cell with beam-pipe stubs (radii
// 9, 15, 30, 9 mm) the five lowest order-1 resonances converge at the
// observed order 1.9 to 2.15 from N = 20, 40, 80 (TestHybridConvergence),
// as for n = 0, and Change bounds the error against 120 modes. An
// independent finite-integration (staggered-grid) solution of the n = 1
// vector problem written in the tests (hybrid_fd_test.go: second order on
// a closed cylinder against the closed form; free of spurious modes, its
// inertia counting the same resonances), on grids of 1, 0.5 and 0.25 mm
// and extrapolated with the observed order (1.3 and 1.5: the re-entrant
// edges), meets the two lowest order-1 resonances of a three-section
// stepped body to 1.7e-5 and 2.3e-5 and the lowest order-2 one to 2.0e-5
// (bound 2e-4; TestHybridFD); without
// the TE-TM cross term they would differ by 1.8e-2 and 5.6e-2. Slater's
// perturbation theorem with package cavity's closed-form fields gives the
// shift of seven order-1 resonances when a ring of the wall is pushed in
// to 1.3e-4 (TestHybridSlater). Speed: the five lowest order-1
// resonances of that cell with their estimates (40 and 60 modes per
// family in the widest section) take about 95 ms on one core of a shared
// 2-core virtual machine (BenchmarkHybridFiveLowest; the same for TM0 of
// the five-section body, BenchmarkFiveLowest: 23 ms), most of it
// assembling the coupled junction matrix, whose wide-section blocks are
// dense in both families. ExtrapolateOrder is Extrapolate for n >= 1:
// on that cell the extrapolations from N = 20 and N = 40 agree within
// their estimates (4e-8 to 1.4e-7 relative), 18 to 60 times closer than
// the finest model alone (TestHybridExtrapolate). Losses, fields and
// transverse R/Q for n >= 1 are not computed (with Request.Losses each
// LossErr wraps ErrNotImplemented).
//
// # References
//
//   - A. Wexler, "Solution of waveguide discontinuities by modal analysis",
//     IEEE Trans. MTT-15 (1967) 508-517.
//   - R. Patzelt and F. Arndt, "Double-plane steps in rectangular waveguides
//     and their application for transformers, irises, and filters", IEEE
//     Trans. MTT-30 (1982) 771-776 (the generalised scattering and
//     admittance formulation used for circular steps and irises).
//   - W. H. Wittrick and F. W. Williams, "A general algorithm for computing
//     natural frequencies of elastic structures", Q. J. Mech. Appl. Math. 24
//     (1971) 263-284.
//   - S. W. Lee, W. R. Jones and J. J. Campbell, "Convergence of numerical
//     solutions of iris-type discontinuity problems", IEEE Trans. MTT-19
//     (1971) 528-536; R. Mittra, T. Itoh and T.-S. Li, "Analytical and
//     numerical studies of the relative convergence phenomenon arising in
//     the solution of an integral equation by the moment method", IEEE
//     Trans. MTT-20 (1972) 96-104.
//   - T. Itoh (ed.), Numerical Techniques for Microwave and Millimeter-Wave
//     Passive Structures, Wiley 1989, ch. 9 (mode matching).
//   - J. Meixner, "The behavior of electromagnetic fields at edges", IEEE
//     Trans. AP-20 (1972) 442-446.
//   - R. Mittra and S. W. Lee, Analytical Techniques in the Theory of
//     Guided Waves, Macmillan 1971, ch. 4 (aperture fields with the edge
//     condition built in; as recalled); R. E. Collin, Field Theory of
//     Guided Waves, 2nd ed., IEEE Press 1991, sec. 1.3 (the edge
//     condition); J. Van Bladel, Singular Electromagnetic Fields and
//     Sources, Oxford 1991, ch. 4 (wedges with dielectrics; as recalled).
//   - DLMF: NIST Digital Library of Mathematical Functions, sec. 10.22
//     (Lommel's integrals), 10.21 (zeros), 10.6 (recurrences).
//   - N. Marcuvitz, Waveguide Handbook, McGraw-Hill 1951, sec. 2.2 and
//     2.4 (TE and TM modes of order n of a circular guide); R. E. Collin,
//     Field Theory of Guided Waves, 2nd ed., IEEE Press 1991, ch. 5; W. J.
//     English, "The circular waveguide step-discontinuity mode
//     transducer", IEEE Trans. MTT-21 (1973) 633-636 (TE-TM coupling at
//     a circular step; details recalled, the formulas here derived).
//   - J.-S. Hong and M. J. Lancaster, Microstrip Filters for RF/Microwave
//     Applications, Wiley 2001, sec. 8.2 (coupling coefficient from the
//     split pair).
//   - L. F. Richardson, "The approximate arithmetical solution by finite
//     differences of physical problems", Phil. Trans. R. Soc. A 210 (1911)
//     307-357; P. J. Roache, Verification and Validation in Computational
//     Science and Engineering, Hermosa 1998 (observed order).
//   - DLMF sec. 10.25-10.40 (modified Bessel functions: series 10.25.2,
//     10.31.1; integral 10.32.9; large-argument forms 10.40.1-2), 10.18
//     (Bessel phase), 10.22.5 (Lommel's integrals, used for modified
//     functions too), 3.5 (Gauss-Legendre quadrature).
//   - E. A. Coddington and N. Levinson, Theory of Ordinary Differential
//     Equations, McGraw-Hill 1955, ch. 8 (Sturm oscillation, Pruefer
//     angle).
//   - D. Kajfez and P. Guillon (eds.), Dielectric Resonators, Artech House
//     1986 (the TE01-delta mode of a puck in a cavity; background only, no
//     values taken).
//   - C. F. Dowell and P. Jarratt (1971), the Illinois modification of
//     regula falsi, BIT 11, 168-174.
//   - H. A. Bethe, "Theory of diffraction by small holes", Phys. Rev. 66
//     (1944) 163-182.
//   - D. E. Muller, "A method for solving algebraic equations using an
//     automatic computer", Math. Tables Aids Comput. 10 (1956) 208-215.
//   - D. Kajfez, Q Factor, Vector Fields 1994, ch. 2 (external Q and the
//     group delay of the reflection at resonance); D. M. Pozar, Microwave
//     Engineering, 4th ed., Wiley 2012, sec. 6.1 and 6.7 (Q from the
//     complex frequency; external Q of a coupled resonator).
//
// Bibliographic details were recalled from memory.
package axisym
