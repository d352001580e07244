package figure

import (
	"image/color"

	xfont "golang.org/x/image/font"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// RGB is an opaque colour written 0xRRGGBB. It implements color.Color, so
// the palette below is made of constants.
type RGB uint32

// RGBA implements color.Color.
func (c RGB) RGBA() (r, g, b, a uint32) {
	r = uint32(c>>16&0xff) * 0x101
	g = uint32(c>>8&0xff) * 0x101
	b = uint32(c&0xff) * 0x101
	return r, g, b, 0xffff
}

// The cylcav palette. The hues come from the colour-blind-safe qualitative
// schemes of P. Tol, "Colour Schemes", SRON/EPS/TN/09-002 (2021), sets
// "bright" and "vibrant"; every pair used together on one chart also differs
// in lightness, line width or dash pattern, so the charts stay readable in
// greyscale and for readers with any common colour-vision deficiency.
const (
	// Ink is the near-black of axes, text and the wanted mode.
	Ink RGB = 0x1a1a1a
	// Blue marks ordinary TE lines (Tol bright blue).
	Blue RGB = 0x4477aa
	// Purple marks ordinary TM lines (Tol bright purple).
	Purple RGB = 0xaa3377
	// Green marks TE0mp/TM1mp degenerate pairs (Tol bright green).
	Green RGB = 0x228833
	// Red marks spurious modes that cross the operating box (Tol vibrant
	// red).
	Red RGB = 0xcc3311
	// Orange marks spurious modes within the required clearance (Tol
	// vibrant orange).
	Orange RGB = 0xee7733
	// DarkOrange is Orange darkened for text on white (contrast >= 4.5:1).
	DarkOrange RGB = 0xa84a10
	// Teal is the sixth series colour (Tol vibrant teal).
	Teal RGB = 0x009988
	// Sand fills the operating box (Tol bright yellow, used translucent).
	Sand RGB = 0xccbb44
	// GridGrey is the colour of grid lines.
	GridGrey RGB = 0xdddddd
)

// Dash patterns in points, for draw.LineStyle.Dashes; each call returns a
// new slice, so a style can be changed without touching another's. Solid
// is nil.

// Dashed is a plain dash: 5 pt on, 2.5 pt off.
func Dashed() []vg.Length { return []vg.Length{vg.Points(5), vg.Points(2.5)} }

// DashDotted is a long dash and a dot.
func DashDotted() []vg.Length {
	return []vg.Length{vg.Points(7), vg.Points(2), vg.Points(1.5), vg.Points(2)}
}

// Dotted is a row of dots.
func Dotted() []vg.Length { return []vg.Length{vg.Points(1.2), vg.Points(2.2)} }

// LongDashed is a long dash: 9 pt on, 3 pt off.
func LongDashed() []vg.Length { return []vg.Length{vg.Points(9), vg.Points(3)} }

// DashDotDotted is a dash and two dots.
func DashDotDotted() []vg.Length {
	return []vg.Length{vg.Points(5), vg.Points(2), vg.Points(1.2), vg.Points(2), vg.Points(1.2), vg.Points(2)}
}

// Theme is the look of every cylcav plot: fonts, sizes, colours and line
// styles. The zero value is not useful; start from DefaultTheme and change
// fields. A Theme holds no references that plots mutate, so one value may
// style any number of plots, concurrently.
type Theme struct {
	// Font is the typeface of all text (size is set per use).
	Font font.Font
	// TitleSize, AxisSize, TickSize, LegendSize and LabelSize are the font
	// sizes of the plot title, axis titles, tick labels, legend entries
	// and on-line mode labels.
	TitleSize, AxisSize, TickSize, LegendSize, LabelSize font.Length

	// Background fills the page; Grid styles the major grid lines; Axis
	// styles the axis lines and tick marks.
	Background color.Color
	Grid       draw.LineStyle
	Axis       draw.LineStyle

	// LineWidth is the width of an ordinary data line; emphasised lines
	// are multiples of it.
	LineWidth vg.Length
}

// DefaultTheme returns the cylcav look: Liberation Sans (metric-compatible
// with the common sans-serif faces, so SVG text measures the same in a
// browser), 11 pt axis titles, 9.5 pt ticks, light solid grid, white page.
func DefaultTheme() Theme {
	return Theme{
		Font:       font.Font{Typeface: "Liberation", Variant: "Sans"},
		TitleSize:  font.Points(12.5),
		AxisSize:   font.Points(11),
		TickSize:   font.Points(9.5),
		LegendSize: font.Points(9),
		LabelSize:  font.Points(7.5),
		Background: color.White,
		Grid:       draw.LineStyle{Color: GridGrey, Width: vg.Points(0.5)},
		Axis:       draw.LineStyle{Color: Ink, Width: vg.Points(0.8)},
		LineWidth:  vg.Points(0.9),
	}
}

// Text returns a plain-text style of the theme's font at the given size and
// colour, centred on its anchor.
func (th Theme) Text(size font.Length, c color.Color) text.Style {
	f := th.Font
	f.Size = size
	return text.Style{
		Color:   c,
		Font:    f,
		XAlign:  draw.XCenter,
		YAlign:  draw.YCenter,
		Handler: plot.DefaultTextHandler,
	}
}

// Bold returns Text in the bold weight.
func (th Theme) Bold(size font.Length, c color.Color) text.Style {
	s := th.Text(size, c)
	s.Font.Weight = xfont.WeightBold
	return s
}

// NewPlot returns an empty plot in the theme: title, axis titles (write
// the unit in them, as "Frequency (GHz)"), fonts, axis lines, a light grid
// under the data and white background. The axis ranges are left to the
// plotters added later.
func (th Theme) NewPlot(title, xLabel, yLabel string) *plot.Plot {
	p := plot.New()
	p.BackgroundColor = th.Background
	p.Title.Text = title
	p.Title.TextStyle = th.Bold(th.TitleSize, Ink)
	p.Title.TextStyle.YAlign = draw.YTop
	p.Title.Padding = vg.Points(6)
	for _, ax := range []*plot.Axis{&p.X, &p.Y} {
		ax.LineStyle = th.Axis
		ax.Padding = 0
		ax.Tick.LineStyle = th.Axis
		ax.Tick.Length = vg.Points(4)
		ax.Label.TextStyle = th.Text(th.AxisSize, Ink)
		ax.Label.Padding = vg.Points(4)
		ax.Tick.Label = th.Text(th.TickSize, Ink)
		ax.Tick.Marker = Ticks{}
	}
	p.X.Label.Text = xLabel
	p.X.Label.TextStyle.YAlign = draw.YBottom
	p.X.Tick.Label.YAlign = draw.YTop
	p.Y.Label.Text = yLabel
	p.Y.Label.TextStyle.YAlign = draw.YBottom
	p.Y.Tick.Label.XAlign = draw.XRight
	p.Y.Tick.Label.YAlign = draw.YCenter
	g := plotter.NewGrid()
	g.Vertical = th.Grid
	g.Horizontal = th.Grid
	p.Add(g)
	return p
}

// Series returns the style of the i-th data series of a multi-series plot
// (i >= 0; the scheme repeats after six). Neighbouring series differ in
// colour, lightness and dash pattern, so they stay apart in greyscale:
// ink solid, blue dashed, red dash-dot, green dotted, purple long dash,
// teal dash-dot-dot. The first series is drawn wider.
func (th Theme) Series(i int) draw.LineStyle {
	styles := [...]struct {
		c    color.Color
		dash []vg.Length
		w    float64
	}{
		{Ink, nil, 1.8},
		{Blue, Dashed(), 1.4},
		{Red, DashDotted(), 1.4},
		{Green, Dotted(), 1.6},
		{Purple, LongDashed(), 1.3},
		{Teal, DashDotDotted(), 1.3},
	}
	if i < 0 {
		i = 0
	}
	s := styles[i%len(styles)]
	return draw.LineStyle{Color: s.c, Width: vg.Length(s.w) * th.LineWidth, Dashes: s.dash}
}

// Marker returns the glyph style of the i-th point series: filled circle,
// open square, triangle, cross, ring, plus, in the colours of Series(i).
func (th Theme) Marker(i int) draw.GlyphStyle {
	shapes := [...]draw.GlyphDrawer{
		draw.CircleGlyph{}, draw.BoxGlyph{}, draw.TriangleGlyph{},
		draw.CrossGlyph{}, draw.RingGlyph{}, draw.PlusGlyph{},
	}
	if i < 0 {
		i = 0
	}
	return draw.GlyphStyle{
		Color:  th.Series(i).Color,
		Radius: vg.Points(3),
		Shape:  shapes[i%len(shapes)],
	}
}
