package figure

import (
	"bytes"
	"fmt"
	"image/color"
	"io"
	"math"
	"path/filepath"
	"strings"

	xfont "golang.org/x/image/font"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgpdf"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Format is an output file format for plots.
type Format uint8

// The supported formats.
const (
	// PNG is a raster image at Page.DPI.
	PNG Format = iota + 1
	// SVG is scalable vector graphics; text stays text (fonts are named,
	// not embedded) with sans-serif fallbacks after Liberation Sans.
	SVG
	// PDF is a one-page vector PDF with the fonts embedded.
	PDF
)

// String returns the lower-case format name, "png", "svg" or "pdf".
func (f Format) String() string {
	switch f {
	case PNG:
		return "png"
	case SVG:
		return "svg"
	case PDF:
		return "pdf"
	}
	return fmt.Sprintf("Format(%d)", uint8(f))
}

// ParseFormat parses a format name with or without a leading dot, in any
// case: "png", ".SVG", "pdf".
func ParseFormat(s string) (Format, error) {
	switch strings.ToLower(strings.TrimPrefix(strings.TrimSpace(s), ".")) {
	case "png":
		return PNG, nil
	case "svg":
		return SVG, nil
	case "pdf":
		return PDF, nil
	}
	return 0, fmt.Errorf("figure: unknown image format %q; use png, svg or pdf", s)
}

// FormatOf returns the format named by a file name's extension
// (chart.png, chart.SVG, sheet.pdf).
func FormatOf(path string) (Format, error) {
	ext := filepath.Ext(path)
	if ext == "" {
		return 0, fmt.Errorf("figure: file name %q has no extension; end it in .png, .svg or .pdf", path)
	}
	f, err := ParseFormat(ext)
	if err != nil {
		return 0, fmt.Errorf("figure: file name %q: unknown extension %q; use .png, .svg or .pdf", path, ext)
	}
	return f, nil
}

// Page is the size and resolution of a rendered figure. The zero value means
// DefaultWidth by DefaultHeight at DefaultDPI.
type Page struct {
	// Width and Height are the page size; both zero means the default,
	// otherwise each must be in [MinPage, MaxPage].
	Width, Height vg.Length
	// DPI is the raster resolution of PNG output in dots per inch, in
	// [MinDPI, MaxDPI]; zero means DefaultDPI. Vector formats ignore it.
	DPI int
}

// Page limits and defaults.
const (
	DefaultWidth  = 8 * vg.Inch
	DefaultHeight = 6 * vg.Inch
	DefaultDPI    = 150
	MinPage       = 1 * vg.Inch
	MaxPage       = 40 * vg.Inch
	MinDPI        = 36
	MaxDPI        = 1200
	// MaxPixels bounds the raster size (width times height in pixels) so a
	// typing slip in the DPI cannot exhaust memory: 100 megapixels.
	MaxPixels = 100e6
)

// resolve fills defaults and checks the limits.
func (pg Page) resolve() (Page, error) {
	if pg.Width == 0 && pg.Height == 0 {
		pg.Width, pg.Height = DefaultWidth, DefaultHeight
	}
	if pg.DPI == 0 {
		pg.DPI = DefaultDPI
	}
	for _, d := range []struct {
		name string
		v    vg.Length
	}{{"width", pg.Width}, {"height", pg.Height}} {
		if math.IsNaN(float64(d.v)) || d.v < MinPage || d.v > MaxPage {
			return pg, fmt.Errorf("figure: page %s must be in %g..%g in, got %g in",
				d.name, MinPage/vg.Inch, MaxPage/vg.Inch, d.v/vg.Inch)
		}
	}
	if pg.DPI < MinDPI || pg.DPI > MaxDPI {
		return pg, fmt.Errorf("figure: resolution must be in %d..%d dpi, got %d", MinDPI, MaxDPI, pg.DPI)
	}
	px := float64(pg.Width/vg.Inch) * float64(pg.Height/vg.Inch) * float64(pg.DPI*pg.DPI)
	if px > MaxPixels {
		return pg, fmt.Errorf("figure: %.0f megapixels at %d dpi is above the %g megapixel limit; lower the dpi",
			px/1e6, pg.DPI, MaxPixels/1e6)
	}
	return pg, nil
}

// Drawer draws itself on a canvas. *plot.Plot and *Figure are Drawers.
type Drawer interface {
	Draw(draw.Canvas)
}

// Render draws d on a page of the given size and writes it to w in format f.
// The output is deterministic: the same drawing gives the same bytes (the
// PDF creation and modification dates, which the PDF writer takes from the
// clock, are replaced by the fixed date FixedPDFDate).
func Render(w io.Writer, d Drawer, f Format, pg Page) error {
	pg, err := pg.resolve()
	if err != nil {
		return err
	}
	var c vg.CanvasWriterTo
	switch f {
	case PNG:
		c = vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(pg.Width, pg.Height), vgimg.UseDPI(pg.DPI))}
	case SVG:
		c = vgsvg.New(pg.Width, pg.Height)
	case PDF:
		c = &pdfCanvas{Canvas: vgpdf.New(pg.Width, pg.Height)}
	default:
		return fmt.Errorf("figure: unknown image format %v; use PNG, SVG or PDF", f)
	}
	d.Draw(draw.New(c))
	var buf bytes.Buffer
	if _, err := c.WriteTo(&buf); err != nil {
		return fmt.Errorf("figure: encoding %v: %w", f, err)
	}
	out := buf.Bytes()
	switch f {
	case SVG:
		out = fixSVGFonts(out)
	case PDF:
		out = fixPDFDates(out)
	}
	_, err = w.Write(out)
	return err
}

// pdfCanvas works around three limits of the PDF writer. (1) With more
// than one face it registers each face under its full name but asks for
// styled faces with a style suffix ("undefined font"); (2) it stores every
// embedded font file under one name, so a second face is drawn with the
// glyphs of the first; (3) it writes its font catalogue in map order, so a
// document with two faces comes out in either order, unless a
// process-wide default of the writer is changed (which cylcav never does:
// it would race with any other PDF made at the same time). Every text of
// the page is therefore drawn in one face, the regular weight of the
// first typeface used (Liberation Sans in the default theme), and bold is
// simulated by overstriking the text a fraction of a point to the right
// (the usual fake-bold of PDF work). A page then holds exactly one font,
// whose catalogue has one order. Layout is unchanged: text is measured
// with the real faces before it reaches the canvas.
type pdfCanvas struct {
	*vgpdf.Canvas
	// face is the one face of the page, set by the first text drawn; its
	// size is replaced by each text's own.
	face  font.Font
	fixed bool
}

// FillString implements vg.Canvas.
func (c *pdfCanvas) FillString(f font.Face, pt vg.Point, s string) {
	s = WinAnsi(s)
	if !c.fixed {
		c.face = font.Font{Typeface: f.Font.Typeface, Variant: f.Font.Variant}
		c.fixed = true
	}
	bold := f.Font.Weight >= xfont.WeightSemiBold
	reg := c.face
	reg.Size = f.Font.Size
	if f.Font != reg {
		f = font.DefaultCache.Lookup(reg, reg.Size)
	}
	c.Canvas.FillString(f, pt, s)
	if bold {
		c.Canvas.FillString(f, vg.Point{X: pt.X + reg.Size*0.035, Y: pt.Y}, s)
	}
}

// SetColor implements vg.Canvas. The PDF writer takes the colour's
// premultiplied components as the colour and applies the alpha again, so a
// translucent white prints grey; translucent colours are handed over with
// straight (non-premultiplied) components.
func (c *pdfCanvas) SetColor(clr color.Color) {
	if clr != nil {
		if _, _, _, a := clr.RGBA(); a != 0 && a != 0xffff {
			clr = straightAlpha(color.NRGBAModel.Convert(clr).(color.NRGBA))
		}
	}
	c.Canvas.SetColor(clr)
}

// straightAlpha is an NRGBA colour whose RGBA method returns the straight
// components, as the PDF writer expects.
type straightAlpha color.NRGBA

// RGBA returns the straight (not premultiplied) components and the alpha.
func (s straightAlpha) RGBA() (r, g, b, a uint32) {
	return uint32(s.R) * 0x101, uint32(s.G) * 0x101, uint32(s.B) * 0x101, uint32(s.A) * 0x101
}

// cp1252High maps the characters of code page 1252 in 0x80..0x9f (Unicode
// Consortium mapping file WINDOWS/CP1252.TXT) to their bytes.
var cp1252High = map[rune]byte{
	'€': 0x80, '‚': 0x82, 'ƒ': 0x83, '„': 0x84, '…': 0x85, '†': 0x86, '‡': 0x87,
	'ˆ': 0x88, '‰': 0x89, 'Š': 0x8a, '‹': 0x8b, 'Œ': 0x8c, 'Ž': 0x8e,
	'‘': 0x91, '’': 0x92, '“': 0x93, '”': 0x94, '•': 0x95, '–': 0x96, '—': 0x97,
	'˜': 0x98, '™': 0x99, 'š': 0x9a, '›': 0x9b, 'œ': 0x9c, 'ž': 0x9e, 'Ÿ': 0x9f,
}

// cp1252Spell spells the characters cylcav prints that code page 1252
// lacks.
var cp1252Spell = map[rune]string{
	'ε': "eps", 'μ': "\xb5", 'π': "pi", '≥': ">=", '≤': "<=", '−': "-", '≈': "~",
	'σ': "sigma", 'δ': "delta", 'λ': "lambda", 'Ω': "ohm", 'φ': "phi", 'β': "beta",
	'∞': "inf", '′': "'", '→': "->",
}

// WinAnsi re-encodes UTF-8 text in code page 1252 (WinAnsiEncoding, ISO
// 32000-1 Annex D), the encoding of the PDF writer's fonts, which pass
// bytes through unchanged. Characters outside the code page that cylcav
// prints are spelled out (ε as "eps", π as "pi", ≥ as ">="; μ becomes the
// micro sign); any other becomes '?'. Use it for text given directly to a
// PDF writer; Render applies it to PDF text itself.
func WinAnsi(s string) string {
	ascii := true
	for i := 0; i < len(s); i++ {
		if s[i] >= 0x80 {
			ascii = false
			break
		}
	}
	if ascii {
		return s
	}
	var b strings.Builder
	for _, r := range s {
		switch {
		case r < 0x80 || (r >= 0xa0 && r <= 0xff):
			b.WriteByte(byte(r))
		case cp1252High[r] != 0:
			b.WriteByte(cp1252High[r])
		case cp1252Spell[r] != "":
			b.WriteString(cp1252Spell[r])
		default:
			b.WriteByte('?')
		}
	}
	return b.String()
}

// Encode is Render into a new byte slice.
func Encode(d Drawer, f Format, pg Page) ([]byte, error) {
	var buf bytes.Buffer
	if err := Render(&buf, d, f, pg); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// EncodeAs is Encode in the format named by a file name's extension
// (chart.png, chart.svg, chart.pdf). It writes no file.
func EncodeAs(d Drawer, name string, pg Page) ([]byte, error) {
	f, err := FormatOf(name)
	if err != nil {
		return nil, err
	}
	return Encode(d, f, pg)
}

// FixedPDFDate is the creation and modification date written into every
// PDF, in the PDF date syntax (ISO 32000-1, sec. 7.9.4), so that renders are
// reproducible. It has the same length as any date the writer produces, so
// replacing it keeps the cross-reference offsets valid.
const FixedPDFDate = "20000101000000"

// fixPDFDates overwrites the 14 digits after every "/CreationDate (D:" and
// "/ModDate (D:" with FixedPDFDate, in place.
func fixPDFDates(b []byte) []byte {
	for _, key := range []string{"/CreationDate (D:", "/ModDate (D:"} {
		k := []byte(key)
		for off := 0; ; {
			i := bytes.Index(b[off:], k)
			if i < 0 {
				break
			}
			start := off + i + len(k)
			if start+len(FixedPDFDate) <= len(b) && allDigits(b[start:start+len(FixedPDFDate)]) {
				copy(b[start:], FixedPDFDate)
			}
			off = start
		}
	}
	return b
}

func allDigits(b []byte) bool {
	for _, c := range b {
		if c < '0' || c > '9' {
			return false
		}
	}
	return true
}

// fixSVGFonts appends generic fallbacks to the font families the SVG writer
// names, so a viewer without Liberation Sans uses a metric-compatible face
// (Arial, Helvetica) instead of its serif default.
func fixSVGFonts(b []byte) []byte {
	b = bytes.ReplaceAll(b, []byte("font-family:Liberation Sans;"),
		[]byte("font-family:Liberation Sans,Arial,Helvetica,sans-serif;"))
	b = bytes.ReplaceAll(b, []byte("font-family:Liberation Serif;"),
		[]byte("font-family:Liberation Serif,Times New Roman,Times,serif;"))
	return b
}

// InlineSVG turns an SVG document from Render into an element for inline use
// in HTML: it drops the XML declaration and the generator comment, removes
// the fixed width and height so the drawing scales with its container (the
// viewBox keeps the aspect ratio), and adds class="chart", role="img" and
// title as the accessible name (<title>) of the drawing.
func InlineSVG(svg []byte, title string) []byte {
	s := svg
	if i := bytes.Index(s, []byte("<svg")); i >= 0 {
		s = s[i:]
	}
	end := bytes.IndexByte(s, '>')
	if end < 0 {
		return svg
	}
	head := string(s[:end])
	head = dropAttr(head, "width")
	head = dropAttr(head, "height")
	var out bytes.Buffer
	out.WriteString(head)
	out.WriteString(` class="chart" role="img">`)
	if title != "" {
		out.WriteString("<title>")
		out.WriteString(htmlEscaper.Replace(title))
		out.WriteString("</title>")
	}
	out.Write(s[end+1:])
	return out.Bytes()
}

var htmlEscaper = strings.NewReplacer("&", "&amp;", "<", "&lt;", ">", "&gt;", `"`, "&quot;")

// dropAttr removes attribute name="..." from an element's start tag.
func dropAttr(tag, name string) string {
	for _, sep := range []string{" ", "\n", "\t"} {
		key := sep + name + `="`
		i := strings.Index(tag, key)
		if i < 0 {
			continue
		}
		j := strings.IndexByte(tag[i+len(key):], '"')
		if j < 0 {
			return tag
		}
		return tag[:i] + tag[i+len(key)+j+1:]
	}
	return tag
}
