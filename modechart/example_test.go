package modechart_test

import (
	"bytes"
	"fmt"
	"image/png"
	"log"

	"cylcav/cavity"
	"cylcav/figure"
	"cylcav/modechart"
	"cylcav/physics"
)

// A reference cavity for an invented 10 GHz test bench: TE011 in an
// air-filled cylinder 39.6 mm across and 39.6 mm long, tuned ±2 % by one
// end plate, machined to ±0.02 mm, needing 3 % clearance. The chart names
// the spurious modes that cross the operating box and those that come
// within the clearance.
func ExampleNew() {
	ch, err := modechart.New(modechart.Spec{
		Wanted:      cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1},
		Cavity:      cavity.Cavity{Radius: 0.0198, Length: 0.0396},
		Tuning:      0.02,
		DiameterTol: 20e-6,
		LengthTol:   20e-6,
		Clearance:   0.03,
	})
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("wanted line: %s\n", ch.Lines[ch.Wanted].Label())
	fmt.Printf("design point: D/L = %.3f, f·D = %.2f %s\n", ch.Design.Ratio, ch.Design.FD/ch.Units.Scale(), ch.Units)
	for _, l := range ch.Spurious() {
		fmt.Printf("%-8s %v\n", l.Label(), l.Role)
	}
	// Output:
	// wanted line: TE011/TM111
	// design point: D/L = 1.000, f·D = 39.52 GHz·cm
	// TM012    crossing
	// TE212    crossing
}

// Render draws any figure, here a plain mode chart of a PTFE-filled
// cylinder, as PNG at a chosen resolution (or SVG, or PDF).
func ExampleRender() {
	ch, err := modechart.New(modechart.Spec{Fill: physics.Medium{EpsR: 2.08}, Units: modechart.GHzMm})
	if err != nil {
		log.Fatal(err)
	}
	fig, err := ch.Figure(figure.DefaultTheme())
	if err != nil {
		log.Fatal(err)
	}
	var buf bytes.Buffer
	if err := figure.Render(&buf, fig, figure.PNG, figure.Page{DPI: 100}); err != nil {
		log.Fatal(err)
	}
	cfg, err := png.DecodeConfig(&buf)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("%d x %d pixels\n", cfg.Width, cfg.Height)
	// Output:
	// 800 x 600 pixels
}
