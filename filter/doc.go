// Package filter synthesises and analyses coupled-resonator bandpass
// filters: from a passband specification to the lowpass prototype, the
// coupling coefficients and external Q, the generalised Chebyshev
// polynomials with prescribed transmission zeros, the N+2 coupling matrix
// in transversal and folded form, and the response with finite unloaded Q.
// It is pure mathematics on normalised quantities plus the frequency
// mapping; the physical cavities that realise a design live elsewhere
// (Response takes one unloaded Q per resonator so that a cavity model can
// supply them).
//
// # Synthesis chain
//
//  1. Specification (Spec): centre f0 and bandwidth bw (geometric centre,
//     f2 - f1 = bw, f1 f2 = f0^2), Chebyshev return loss or ripple (or the
//     Butterworth response), the order or the stopband rejections it must
//     meet, and the finite transmission zeros in the normalised lowpass
//     frequency Omega = (f0/bw)(f/f0 - f0/f) (LowpassOmega).
//  2. Mask and order (Spec.Mask, Spec.MinOrder, ButterworthOrder,
//     ChebyshevOrder): the one mask of pass and fail, each rejection a
//     region from its frequency outwards to the end of the band of
//     interest f0 (1 -+ ModelOffset); the order meets every region, its
//     least attenuation located exactly (lobes between and beyond the
//     zeros); the closed forms of Matthaei, Young & Jones sec. 4.03 for
//     all-pole responses.
//  3. All-pole prototypes (ButterworthG, ChebyshevG): the element values of
//     MYJ sec. 4.05; the direct-coupled bandpass values
//     k_{i,i+1} = FBW/sqrt(g_i g_{i+1}), Qext = g_0 g_1/FBW and
//     g_N g_{N+1}/FBW (Couplings, Hong & Lancaster sec. 8.1), and the chain
//     matrix (AllPoleMatrix).
//  4. Filtering function: Cameron's generalised Chebyshev function
//     C_N = cosh(sum arccosh x_n) with up to N real transmission zeros
//     (Characteristic builds its numerator by Cameron's recursion). Its
//     reflection zeros, the constants Eps and EpsR, and the polynomials
//     F, P, E of S11 = F/(EpsR E), S21 = P/(Eps E) follow (Design).
//  5. Transversal matrix: the residues of the short-circuit admittances
//     y21, y22 at their real poles give an N+2 matrix with every resonator
//     coupled only to source and load (CKM ch. 8).
//  6. Folded canonical form: plane rotations among the resonators reduce the
//     transversal matrix to the folded pattern (InFoldedPattern), which
//     maps onto a two-row cavity layout with cross couplings between facing
//     cavities (CKM sec. 8.3).
//  7. Analysis (Response, Design.Check, Overall, Design.Delay, DelayLoss,
//     CohnLoss): S11, S21, S22, group delay with per-resonator unloaded Q,
//     the specification pass/fail table (the cavities' spurious resonances
//     and the model's range included), the group delay at f0 and across
//     the passband, and the first-order midband loss estimates from the
//     group delay and by Cohn; SweepRange and Sweep choose the frequencies,
//     WriteTouchstone exports the response. Package filterplot draws it
//     with the regions of Design.Mask; this package imports no plotting.
//  8. Physical realisation (Realise): one cavity per resonator for the
//     chosen mode, sized at the resonator's own frequency (the diagonal
//     M_ii detunes it to the bandpass image of Omega = -M_ii), its Q0 from
//     package qfactor, the spurious resonances of each cavity design near
//     the band with warnings for the exact TE0mp/TM1mp companion and for
//     modes in a stopband; main-line couplings as circular holes sized by
//     Bethe's small-aperture theory with the thickness correction
//     (SizeHole, CouplingThrough), each checked against the theory's
//     validity limits; cross couplings and port Qext listed for a field
//     solver or measurement.
//  9. More of the design space: PlaceZeros chooses the order and the
//     transmission zeros from the mask (Nelder-Mead, gonum optimize;
//     verdict by Design.Check); Spec.RealPairs adds real-axis zero pairs
//     for group-delay equalisation; Design.Rearranged carries the folded
//     matrix into cascaded triplets or quadruplets (CascadeTopology,
//     Rearrange); ParseMatrixFile, WriteMatrixFile and FromMatrix analyse a
//     coupling matrix given as text.
//
// # Conventions
//
// The coupling matrix M is (N+2)x(N+2), row 0 the source, rows 1..N the
// resonators, row N+1 the load, normalised to unit bandwidth (bandpass
// coupling k_ij = FBW M_ij, FBW = bw/f0, Qext = 1/(FBW M_S1^2)). The network
// matrix is
//
//	A(Omega) = Omega W - j R - j Delta + M,
//	W = diag(0, 1, ..., 1, 0),  R = diag(1, 0, ..., 0, 1),
//	Delta = diag(0, f0/(bw Q0_1), ..., f0/(bw Q0_N), 0),
//
// and the scattering parameters (shunt resonators coupled by admittance
// inverters, unit terminations) are
//
//	S21 = S12 = -2j [A^-1]_{N+1,0},
//	S11 = -1 - 2j [A^-1]_{0,0},  S22 = -1 - 2j [A^-1]_{N+1,N+1}.
//
// In the lowpass variable s = j Omega the lossless response of a Design is
// S11 = F(s)/(EpsR E(s)), S21 = P(s)/(Eps E(s)), with F, E monic and P
// monic times j when N - nz is even (Cameron's rule), its overall sign
// chosen so that the folded matrix has M_NL > 0. Far from the band S11 -> +1.
// Transmission zeros at Omega > 1 lie above the passband.
//
// Sign choices in the folded matrix: M_S1, M_NL and every main-line
// coupling M_{i,i+1} are made non-negative; cross couplings keep the signs
// the reduction gives them (a negative coupling is the opposite kind,
// e.g. capacitive against inductive). For an all-pole design the folded
// matrix equals AllPoleMatrix(G).
//
// # Accuracy
//
// Reflection zeros come from the phase form of C_N by bisection (to the last
// bit); poles from the companion matrix of F/EpsR + j P/Eps (gonum mat.Eigen)
// polished by the Aberth iteration in product form; the transversal
// eigenvalues by bisection on two monotonic branch-phase equations that
// separate the nearly degenerate eigenvalue pairs of high orders. The folded
// matrix reproduces the polynomial response to about 1e-13 up to N = 30
// (each Synthesize call checks it). Response evaluates a matrix in O(N) per
// frequency through its modal decomposition: real when all resonators share
// one Q0, complex orthogonal (fastresponse.go) when they do not; an LU
// factorisation, the reference, takes over near a modal resonance or where
// the complex decomposition is refused.
//
// Manufacture (tolerance.go, drift.go, power.go): machining tolerance and
// yield through first-order sensitivities and Design.Check (Yield), the
// Slater screw that covers the tuning range (ScrewTunings), temperature
// drift from the metals' strain data (Drift), and the stored energy, peak
// fields and air breakdown margin at an input power (PowerHandling).
//
// References:
//   - G. L. Matthaei, L. Young, E. M. T. Jones, Microwave Filters,
//     Impedance-Matching Networks, and Coupling Structures, McGraw-Hill 1964
//     (MYJ): sec. 4.03 (attenuation and order), sec. 4.05 and Tables 4.05-1,
//     4.05-2 (element values).
//   - J.-S. Hong, M. J. Lancaster, Microstrip Filters for RF/Microwave
//     Applications, Wiley 2001: sec. 3.2 (frequency transformation), sec. 8.1
//     (coupled-resonator design equations, general coupling matrix, lossy
//     resonators).
//   - R. J. Cameron, "General coupling matrix synthesis methods for Chebyshev
//     filtering functions", IEEE Trans. Microwave Theory Tech. 47(4) (1999)
//     433-442.
//   - R. J. Cameron, "Advanced coupling matrix synthesis techniques for
//     microwave filters", IEEE Trans. Microwave Theory Tech. 51(1) (2003)
//     1-10.
//   - R. J. Cameron, C. M. Kudsia, R. R. Mansour, Microwave Filters for
//     Communication Systems, Wiley 2007 (CKM): ch. 6 (generalised Chebyshev
//     polynomials), ch. 8 (N+2 coupling matrix, transversal matrix,
//     sec. 8.3 reduction to the folded form).
//   - S. B. Cohn, "Direct-coupled-resonator filters", Proc. IRE 45 (1957)
//     187-196.
//   - R. P. Brent, Algorithms for Minimization without Derivatives,
//     Prentice-Hall 1973, ch. 5 (golden-section search on a bracket).
//   - S. B. Cohn, "Dissipation loss in multiple-coupled-resonator filters",
//     Proc. IRE 47 (1959) 1342-1348.
//   - O. Aberth, "Iteration methods for finding all zeros of a polynomial
//     simultaneously", Math. Comp. 27 (1973) 339-344.
//   - J. A. Nelder, R. Mead, "A simplex method for function minimization",
//     Comput. J. 7 (1965) 308-313 (the search of PlaceZeros).
//   - Touchstone File Format Specification, version 1.1 (EIA/IBIS Open
//     Forum, 2002).
//   - H. A. Bethe, "Theory of diffraction by small holes", Phys. Rev. 66
//     (1944) 163-182 (polarisabilities of a small circular hole).
//   - R. E. Collin, Foundations for Microwave Engineering, 2nd ed., IEEE
//     Press 2001: sec. 4.13 (aperture coupling), ch. 7 (cavities coupled
//     through small holes); section numbers recalled from memory.
//   - D. M. Pozar, Microwave Engineering, 4th ed., Wiley 2012: sec. 4.8
//     (aperture coupling, alpha_e = 2 r0^3/3, alpha_m = 4 r0^3/3), sec. 6.7
//     (cavity perturbations); section numbers recalled from memory.
//   - S. B. Cohn, "Microwave coupling by large apertures", Proc. IRE 40
//     (1952) 696-699, and MYJ sec. 5.10 (thickness correction of a hole).
//   - N. A. McDonald, "Electric and magnetic coupling through small
//     apertures in shield walls of any thickness", IEEE Trans. Microwave
//     Theory Tech. 20 (1972) 689-695.
//   - NIST Digital Library of Mathematical Functions, https://dlmf.nist.gov/,
//     10.21 (zeros of J_n and J'_n: the cutoff of a coupling hole's
//     below-cutoff circular guide).
//   - J. B. Ness, "A unified approach to the design, measurement, and tuning
//     of coupled-resonator filters", IEEE Trans. Microwave Theory Tech.
//     46(4) (1998) 343-351 (reflected group delay 4 Qext/omega0).
package filter
