// Package filterplot draws the response of a coupled-resonator filter from
// package filter: |S21| and |S11| in dB with the specification mask
// (return-loss line, rejection regions, transmission zeros) and the group
// delay of S21, as a figure of package figure (which writes it as PNG, SVG
// or PDF).
//
// Keeping the plot here leaves package filter free of plotting, fonts and
// PDF: a program that only synthesises filters does not link them.
//
// References:
//   - R. J. Cameron, C. M. Kudsia, R. R. Mansour, Microwave Filters for
//     Communication Systems, Wiley 2007, ch. 8 (the N+2 coupling matrix
//     whose response is drawn).
//   - J.-S. Hong, M. J. Lancaster, Microstrip Filters for RF/Microwave
//     Applications, Wiley 2001, sec. 3.2 (the lowpass-to-bandpass mapping
//     Omega = (f0/bw)(f/f0 - f0/f)).
package filterplot
