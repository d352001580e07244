// Package figure is the plotting layer every cylcav picture shares: the
// mode chart and design plots of package modechart, the filter response
// plots of package filterplot, and the charts of the datasheet.
//
// It holds Theme (fonts, the palette and the line-style scheme, readable in
// greyscale and by colour-blind readers), Figure and Legend (stacked panels
// with a legend and notes), the Region plotter (shaded boxes and masks),
// Ticks (nice-number axis ticks), Runs and AddCurve (curves broken at
// missing values), and Render/Encode, which write any Drawer (a *plot.Plot
// or a *Figure) as PNG at a chosen resolution, SVG or PDF, byte-for-byte
// reproducibly, plus WinAnsi for text handed straight to a PDF writer and
// InlineSVG for SVG inside HTML.
//
// Numerical packages never import figure; it imports no cylcav package.
//
// References:
//   - P. Tol, Colour Schemes, SRON/EPS/TN/09-002, issue 3.2 (2021)
//     (colour-blind-safe qualitative palettes).
//   - P. S. Heckbert, "Nice numbers for graph labels", in Graphics Gems,
//     Academic Press 1990, pp. 61-63 (axis ticks).
//   - ISO 32000-1:2008, sec. 7.9.4 (PDF date strings) and Annex D
//     (WinAnsiEncoding).
package figure
