package modechart

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"path/filepath"
	"strings"

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
	return 0, fmt.Errorf("modechart: unknown image format %q; use png, svg or pdf", s)
}

// FormatOf returns the format named by a file name's extension
// (chart.png, chart.SVG, sheet.pdf).
func FormatOf(path string) (Format, error) {
	ext := filepath.Ext(path)
	if ext == "" {
		return 0, fmt.Errorf("modechart: file name %q has no extension; end it in .png, .svg or .pdf", path)
	}
	f, err := ParseFormat(ext)
	if err != nil {
		return 0, fmt.Errorf("modechart: file name %q: unknown extension %q; use .png, .svg or .pdf", path, ext)
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
			return pg, fmt.Errorf("modechart: page %s must be in %g..%g in, got %g in",
				d.name, MinPage/vg.Inch, MaxPage/vg.Inch, d.v/vg.Inch)
		}
	}
	if pg.DPI < MinDPI || pg.DPI > MaxDPI {
		return pg, fmt.Errorf("modechart: resolution must be in %d..%d dpi, got %d", MinDPI, MaxDPI, pg.DPI)
	}
	px := float64(pg.Width/vg.Inch) * float64(pg.Height/vg.Inch) * float64(pg.DPI*pg.DPI)
	if px > MaxPixels {
		return pg, fmt.Errorf("modechart: %.0f megapixels at %d dpi is above the %g megapixel limit; lower the dpi",
			px/1e6, pg.DPI, MaxPixels/1e6)
	}
	return pg, nil
}

// Drawer draws itself on a canvas. *plot.Plot, *Figure and *ChartPlot are
// Drawers.
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
		c = vgpdf.New(pg.Width, pg.Height)
	default:
		return fmt.Errorf("modechart: unknown image format %v; use PNG, SVG or PDF", f)
	}
	d.Draw(draw.New(c))
	var buf bytes.Buffer
	if _, err := c.WriteTo(&buf); err != nil {
		return fmt.Errorf("modechart: encoding %v: %w", f, err)
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

// Encode is Render into a new byte slice.
func Encode(d Drawer, f Format, pg Page) ([]byte, error) {
	var buf bytes.Buffer
	if err := Render(&buf, d, f, pg); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
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
