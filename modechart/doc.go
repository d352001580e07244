// Package modechart draws the mode chart of a closed circular-cylindrical
// cavity and the other pictures of a cavity design, and holds the plotting
// layer every cylcav image shares.
//
// The chart is data first: New lists every TE and TM mode whose line enters
// the chart, each as the straight line
//
//	(f·D)² = (c x/π)²/(εr μr) + (c p/2)²/(εr μr) · (D/L)²
//
// (x = j'_nm for TE, j_nm for TM), merges the exactly degenerate pairs
// TE0mp/TM1mp into one line, and classifies the lines against a design's
// operating box (tuning range times D/L tolerance) and required clearance.
// The alternative axes plot f·D against D/L. Labels are placed on the lines
// by a deterministic greedy method (ModeLines.Layout) that keeps them inside
// the axes and apart from each other.
//
// The plotting layer, used by the mode chart, the design plots of this
// package and by the filter response plots: Theme (fonts, the palette and
// the line-style scheme, readable in greyscale and by colour-blind
// readers), Figure and Legend (stacked panels with a legend and notes), the
// Region plotter (shaded boxes and masks), and Render/Encode, which write
// any Drawer (a *plot.Plot or a *Figure) as PNG at a chosen resolution, SVG
// or PDF, byte-for-byte reproducibly.
//
// The index convention, used everywhere in cylcav: n azimuthal, m radial,
// p axial.
//
// References:
//   - D. M. Pozar, Microwave Engineering, 4th ed., Wiley 2012, sec. 6.4
//     (circular cavity resonators and their mode chart).
//   - R. F. Harrington, Time-Harmonic Electromagnetic Fields, McGraw-Hill
//     1961, sec. 5.3 (resonant frequencies of the circular cavity).
//   - DLMF 10.6.3 (J'_0 = -J_1, hence TE0mp and TM1mp coincide).
//   - P. Tol, Colour Schemes, SRON/EPS/TN/09-002, issue 3.2 (2021)
//     (colour-blind-safe qualitative palettes).
//   - ISO 32000-1:2008, sec. 7.9.4 (PDF date strings).
package modechart
