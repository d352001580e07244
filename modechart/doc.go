// Package modechart draws the mode chart of a closed circular-cylindrical
// cavity and the other pictures of a cavity design (trade-off, tuning and
// Q-versus-frequency figures), through the shared plotting layer of
// package figure.
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
// The mode-chart styles (ModeLines.ModeLine: family by dash, role by
// colour and width) use the palette of package figure.
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
package modechart
