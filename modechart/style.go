package modechart

import (
	"image/color"

	"gonum.org/v1/plot/vg/draw"

	"cylcav/figure"
)

// Role is what a line means on a mode chart; it decides its style and the
// priority of its label.
type Role uint8

// The roles, in increasing order of emphasis.
const (
	// Ordinary is any mode away from the operating box.
	Ordinary Role = iota
	// Near is a spurious mode that comes within the required clearance
	// of the operating box without crossing it.
	Near
	// Crossing is a spurious mode whose line passes through the operating
	// box: it resonates inside the tuning range somewhere.
	Crossing
	// Wanted is the operating mode (with its exact companion, if any).
	Wanted
)

// String returns the role's name as used in legends.
func (r Role) String() string {
	switch r {
	case Ordinary:
		return "ordinary"
	case Near:
		return "near"
	case Crossing:
		return "crossing"
	case Wanted:
		return "wanted"
	}
	return "Role(?)"
}

// Kind is the family of a chart line: TE, TM, or a TE0mp/TM1mp pair that
// shares one line.
type Kind uint8

// The line kinds.
const (
	KindTE Kind = iota
	KindTM
	KindPair
)

// String returns "TE", "TM" or "TE0mp/TM1mp".
func (k Kind) String() string {
	switch k {
	case KindTE:
		return "TE"
	case KindTM:
		return "TM"
	case KindPair:
		return "TE0mp/TM1mp"
	}
	return "Kind(?)"
}

// ModeLine returns the line style of a mode-chart line of the given kind
// and role in the plotter's theme. Families are told apart by dash (TE solid, TM dashed, pairs
// dash-dot) and roles by colour and width: ordinary thin blue/purple/green,
// near medium orange, crossing wide red, wanted widest ink and always solid.
func (ml *ModeLines) ModeLine(k Kind, r Role) draw.LineStyle {
	var s draw.LineStyle
	switch k {
	case KindTM:
		s = draw.LineStyle{Color: figure.Purple, Dashes: figure.Dashed()}
	case KindPair:
		s = draw.LineStyle{Color: figure.Green, Dashes: figure.DashDotted()}
	default:
		s = draw.LineStyle{Color: figure.Blue}
	}
	s.Width = ml.LineWidth
	switch r {
	case Near:
		s.Color, s.Width = figure.Orange, 1.8*ml.LineWidth
	case Crossing:
		s.Color, s.Width = figure.Red, 2.2*ml.LineWidth
	case Wanted:
		// Always solid: the label names the family.
		s.Color, s.Width, s.Dashes = figure.Ink, 2.8*ml.LineWidth, nil
	}
	if r != Ordinary {
		// Wider lines need longer dashes to read as dashed.
		for i := range s.Dashes {
			s.Dashes[i] *= 1.5
		}
	}
	return s
}

// LabelColor returns the text colour of an on-line label for a line of the
// given kind and role: the line colour, darkened where the line colour is
// too light for small text on white.
func (ml *ModeLines) LabelColor(k Kind, r Role) color.Color {
	switch r {
	case Near:
		return figure.DarkOrange
	case Crossing:
		return figure.Red
	case Wanted:
		return figure.Ink
	}
	return ml.ModeLine(k, r).Color
}
