// Package measure turns a measured network-analyser sweep into resonances:
// it finds them in a wide sweep (FindPeaks), fits each one's complex
// response with the linear fractional (Q-circle) method (FitCircle), and
// combines the fits of a one-port or two-port measurement into the
// resonant frequency, loaded Q, coupling coefficients and unloaded Q with
// their uncertainties (Analyze).
//
// # The fit
//
// Near an isolated resonance any linear passive network seen through
// lossy, delaying cables has a response of the linear fractional form
//
//	S(t) = (a1 t + a2) / (a3 t + 1),   t = f/fL - fL/f,
//
// in which fL is a guess of the resonant frequency (Kajfez 1994, who uses
// the narrow-band t = 2 (f - fL)/fL, equal to first order; the exact
// lumped detuning, with fL moved onto the fitted f0 and the fit repeated,
// makes the model exact for a lumped resonator: derived).
// S traces a circle in the complex plane as f sweeps. Multiplying out gives
// an equation linear in the complex unknowns a1, a2, a3,
//
//	a1 t + a2 - a3 t S = S,
//
// solved by weighted least squares; the weights 1/|a3 t + 1|^2 are
// updated from the previous solution so that the minimised quantity is the
// distance between measured and fitted S (Kajfez 1994, sec. III; Kajfez
// 2011, ch. 5). From a3 (derived: expand 1 + j QL (t - t0) and divide by
// its constant term) 1/a3 = -t0 - j/QL, so
//
//	QL = 1 / |Im(1/a3)|,   f0/fL - fL/f0 = t0,   t0 = -Re(1/a3).
//
// The detuned point (t -> infinity) is a1/a3, and the circle's diameter is
// the distance from it to S(t0).
//
// Cable delay tau multiplies S by exp(-j 2 pi f tau), which bends the
// circle; the fit removes it by minimising the fit's residual over tau
// (a grid, then golden-section refinement), as Kajfez 2011 ch. 6 removes
// the uncoupled line length.
//
// # Coupling and unloaded Q
//
// Reflection (one port): the diameter d, divided by the detuned magnitude
// |S_d| to undo a coupling loss modelled as a matched attenuator (derived),
// gives beta = d / (2 - d) and Q0 = QL (1 + beta) (Kajfez 2011, ch. 2:
// an ideal reflection circle has diameter 2 beta / (1 + beta)).
//
// Transmission (two ports): the reflection circles of S11 and S22 have
// diameters d1 = 2 beta1 / (1 + beta1 + beta2) and d2 likewise (Kajfez
// 2011, ch. 2), which solve to (derived)
//
//	beta1 = d1 / (2 - d1 - d2),  beta2 = d2 / (2 - d1 - d2),  Q0 = 2 QL / (2 - d1 - d2),
//
// with QL and f0 taken from the S21 fit.
//
// # Uncertainties
//
// The residual variance sigma^2 = sum |S_i - S(t_i)|^2 / (N - 3) and the
// normal matrix of the final weighted fit give the covariance of a1, a2, a3
// (complex least squares with circular noise: Cov(a) = sigma^2 M^-1), and
// each derived quantity's standard uncertainty follows by linear
// propagation with a numerical gradient. They are conditional on the
// fitted cable delay and assume uncorrelated noise; systematic errors of
// the analyser's calibration are not in them.
//
// # The 3 dB check
//
// The loaded Q is also estimated from the half-power bandwidth of the
// magnitude (transmission: |S21|^2 at half its peak; reflection: |S|^2
// half way between its minimum and the detuned value), the common bench
// method. It ignores phase, so background leakage, cable delay and
// coupling loss bias it; Analyze reports when it disagrees with the fit.
//
// # Modes, walls and fills
//
// Identify names the mode of each resonance by fitting the effective
// cavity to the measured frequencies; DiagnoseWalls turns each identified
// mode's Q0 into an effective wall conductivity; MeasureDielectric gives a
// full fill's permittivity and loss tangent from an empty and a filled
// measurement. Their formulas and sources are on each function.
//
// References:
//   - D. Kajfez, "Linear fractional curve fitting for measurement of high Q
//     factors", IEEE Trans. Microwave Theory Tech. 42(7), 1149-1153, 1994.
//   - D. Kajfez, Q Factor Measurements Using MATLAB, Artech House, 2011.
//   - E. L. Ginzton, Microwave Measurements, McGraw-Hill, 1957, ch. 9
//     (the Q circle).
//   - D. M. Pozar, Microwave Engineering, 4th ed., Wiley, 2012, secs. 1.7,
//     6.3, 6.4 and 6.7 (surface resistance, Q of a filled cavity, the
//     circular cavity's modes and currents).
//   - P. Soille, Morphological Image Analysis, 2nd ed., Springer, 2003,
//     sec. 4.3 (the opening, for the background).
package measure
