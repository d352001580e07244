// Package benchplot draws measured sweeps and the resonances fitted by
// package measure, as figures of package figure (which writes them as PNG,
// SVG or PDF): the whole sweep in dB with each fitted resonance marked and
// numbered (NewSweepPlot), and one resonance's measured points against its
// fitted curve, in magnitude and in the complex plane, where the linear
// fractional fit is a circle (NewFitPlot).
//
// Keeping the plots here leaves package measure free of plotting, fonts
// and PDF.
//
// References:
//   - D. Kajfez, Q Factor Measurements Using MATLAB, Artech House, 2011,
//     ch. 2 (the Q circle in the reflection-coefficient plane).
package benchplot
