package datasheet

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"strings"
	"time"

	"codeberg.org/go-fonts/liberation/liberationsansbold"
	"codeberg.org/go-fonts/liberation/liberationsansregular"
	"codeberg.org/go-pdf/fpdf"
	"golang.org/x/image/font/sfnt"
	"gonum.org/v1/plot/vg"

	"cylcav/figure"
)

// PDF page layout, mm (A4 portrait).
const (
	pdfMargin = 15.0
	pdfLineH  = 4.3 // body text line height
	pdfCellH  = 3.9 // table text line height
	pdfPad    = 1.2 // cell padding
	// pdfChartDPI is the resolution of the chart images in the PDF: sharp
	// in print, a few hundred kilobytes per chart.
	pdfChartDPI = 200
	// pdfMinChartScale is the least a chart is shrunk to fit the rest of a
	// page before it moves to the next one: at 0.6 of the text width the
	// mode labels stay readable in print, and the page above is not left
	// half empty.
	pdfMinChartScale = 0.6
	// pdfCaptionH is the room kept under a chart for its caption, mm.
	pdfCaptionH = 10.0
	// pdfFooter is the room kept above the bottom margin for the footer, mm.
	pdfFooter = 5.0
)

// pdfFont is the family of every text in the PDF datasheet: Liberation
// Sans, embedded (regular and bold) so that the page looks the same in any
// viewer and on any printer.
const pdfFont = "LiberationSans"

// pdfDate is the fixed creation date of every PDF datasheet, so the same
// design gives the same bytes.
var pdfDate = time.Date(2000, 1, 1, 0, 0, 0, 0, time.UTC)

// WritePDF writes the datasheet to out as an A4 PDF document with the
// sections of the HTML one, in the same order: text in Liberation Sans
// with the fonts embedded, tables with wrapped cells, charts as PNG images
// at pdfChartDPI (shrunk to at most pdfMinChartScale to finish a page
// rather than leave it half empty), page numbers in the footer. The output
// is deterministic.
func (sh *Sheet) WritePDF(out io.Writer) error {
	pdf := fpdf.New("P", "mm", "A4", "")
	pdf.AddUTF8FontFromBytes(pdfFont, "", liberationsansregular.TTF)
	pdf.AddUTF8FontFromBytes(pdfFont, "B", liberationsansbold.TTF)
	glyphs, err := sfnt.Parse(liberationsansregular.TTF)
	if err != nil {
		return fmt.Errorf("datasheet: PDF font: %w", err)
	}
	pdf.SetCreationDate(pdfDate)
	pdf.SetModificationDate(pdfDate)
	pdf.SetCatalogSort(true)
	pdf.SetCompression(true)
	pdf.SetCreator("cylcav "+sh.Version, false)
	pdf.SetTitle(sh.Title, true)
	pdf.SetMargins(pdfMargin, pdfMargin, pdfMargin)
	pdf.SetAutoPageBreak(true, pdfMargin+pdfFooter)
	pdf.AliasNbPages("{nb}")
	w := &pdfWriter{pdf: pdf, glyphs: glyphs}
	pdf.SetFooterFunc(func() {
		pdf.SetY(-pdfMargin)
		pdf.SetFont(pdfFont, "", 7.5)
		pdf.SetTextColor(90, 90, 90)
		pdf.CellFormat(0, 4, w.t(fmt.Sprintf("cylcav %s datasheet: %s", sh.Version, sh.Headline)), "", 0, "L", false, 0, "")
		pdf.CellFormat(0, 4, fmt.Sprintf("page %d of {nb}", pdf.PageNo()), "", 0, "R", false, 0, "")
		pdf.SetTextColor(0, 0, 0)
	})
	pdf.AddPage()
	w.width, _ = pdf.GetPageSize()
	w.width -= 2 * pdfMargin

	// Title block.
	pdf.SetFont(pdfFont, "", 8)
	pdf.SetTextColor(90, 90, 90)
	pdf.CellFormat(0, 4, w.t(strings.ToUpper(sh.Kind)), "", 1, "L", false, 0, "")
	pdf.SetTextColor(0, 0, 0)
	pdf.SetFont(pdfFont, "B", 15)
	pdf.MultiCell(0, 6.5, w.t(sh.Title), "", "L", false)
	pdf.SetFont(pdfFont, "", 10.5)
	pdf.MultiCell(0, 5.5, w.t(sh.Headline), "", "L", false)
	if n := sh.Notice; n != nil {
		pdf.Ln(1)
		pdf.SetFillColor(243, 241, 230)
		pdf.SetFont(pdfFont, "", 8.5)
		pdf.MultiCell(0, 4.2, w.t(n.Text()), "", "L", true)
	}
	y := pdf.GetY() + 1.5
	pdf.SetLineWidth(0.6)
	pdf.Line(pdfMargin, y, pdfMargin+w.width, y)
	pdf.SetLineWidth(0.2)
	pdf.SetY(y + 2)

	facts := Table{Header: []string{"Key figure", "Value", "Key figure", "Value"}}
	for i := 0; i < len(sh.Facts); i += 2 {
		row := []string{sh.Facts[i].Key, sh.Facts[i].Value, "", ""}
		if i+1 < len(sh.Facts) {
			row[2], row[3] = sh.Facts[i+1].Key, sh.Facts[i+1].Value
		}
		facts.add(false, row...)
	}
	w.table(facts)

	// The numbered sections of the HTML datasheet, in the same order. A
	// heading is kept with the start of what follows it; the sections at
	// the end made of text alone (the convention and the cautions of a
	// cavity datasheet) are kept on one page when they fit on one, so
	// that the document does not end on a page with a stray bullet.
	charts := map[*Chart]int{}
	for i, c := range sh.Charts() {
		charts[c] = i
	}
	tail := len(sh.Sections) // the first section of the trailing text-only run
	for tail > 0 && w.textOnly(sh.Sections[tail-1]) {
		tail--
	}
	for i, sec := range sh.Sections {
		next := 0.0
		if i >= tail {
			for k := i; k < len(sh.Sections); k++ {
				if k > i {
					next += headingH
				}
				next += w.textHeight(sh.Sections[k])
			}
		} else if len(sec.Blocks) > 0 {
			next = w.blockStart(sec.Blocks[0])
		}
		w.heading(fmt.Sprintf("%d  %s", i+1, sec.Heading), next)
		for j, b := range sec.Blocks {
			switch {
			case b.Table != nil:
				w.table(*b.Table)
			case b.Chart != nil:
				if err := w.chart(b.Chart, charts[b.Chart]); err != nil {
					return err
				}
			case b.Note != "":
				w.note(b.Note)
			case b.Para != "":
				w.para(b.Para)
			case b.List != nil:
				if j > 0 {
					pdf.Ln(1)
				}
				if b.List.Lead != "" {
					w.para(b.List.Lead)
				}
				for _, item := range b.List.Items {
					w.bullet(item)
				}
			case b.Materials != nil:
				w.materials(b.Materials)
			}
		}
	}
	if err := pdf.Error(); err != nil {
		return fmt.Errorf("datasheet: PDF: %w", err)
	}
	if err := pdf.Output(out); err != nil {
		return fmt.Errorf("datasheet: PDF: %w", err)
	}
	return nil
}

type pdfWriter struct {
	pdf   *fpdf.Fpdf
	width float64 // text width, mm
	// glyphs is the embedded regular face, to look up which characters it
	// can draw.
	glyphs *sfnt.Font
	buf    sfnt.Buffer
}

// t returns s with every character the embedded font cannot draw replaced
// by its ASCII spelling from figure.WinAnsi ("->" for an arrow), or '?'
// when there is none, so the PDF never shows an empty box.
func (w *pdfWriter) t(s string) string {
	var b strings.Builder
	for _, r := range s {
		if g, err := w.glyphs.GlyphIndex(&w.buf, r); r < 0x80 || (err == nil && g != 0) {
			b.WriteRune(r)
			continue
		}
		x := figure.WinAnsi(string(r))
		for i := 0; i < len(x); i++ {
			if x[i] >= 0x80 {
				x = "?"
				break
			}
		}
		b.WriteString(x)
	}
	return b.String()
}

// room returns the height in mm left above the footer of the page.
func (w *pdfWriter) room() float64 {
	_, ph := w.pdf.GetPageSize()
	return ph - pdfMargin - pdfFooter - w.pdf.GetY()
}

// need starts a new page unless h mm remain above the footer.
func (w *pdfWriter) need(h float64) {
	if h > w.room() {
		w.pdf.AddPage()
	}
}

// headingH is the height of a section heading with its rule and spacing.
const headingH = 3 + 6 + 1.5

// heading starts a section, on a new page unless the heading and the
// first next mm of what follows fit on this one.
func (w *pdfWriter) heading(s string, next float64) {
	w.need(headingH + next)
	p := w.pdf
	p.Ln(3)
	p.SetFont(pdfFont, "B", 11.5)
	p.SetTextColor(0x1a, 0x1a, 0x1a)
	p.CellFormat(0, 6, w.t(s), "", 1, "L", false, 0, "")
	y := p.GetY()
	p.SetDrawColor(180, 180, 180)
	p.Line(pdfMargin, y, pdfMargin+w.width, y)
	p.SetDrawColor(0, 0, 0)
	p.Ln(1.5)
}

// paraHeight returns the height in mm of paragraph s.
func (w *pdfWriter) paraHeight(s string) float64 {
	w.pdf.SetFont(pdfFont, "", 9)
	return float64(len(w.pdf.SplitText(w.t(s), w.width)))*pdfLineH + 1
}

func (w *pdfWriter) para(s string) {
	w.pdf.SetFont(pdfFont, "", 9)
	w.pdf.MultiCell(0, pdfLineH, w.t(s), "", "L", false)
	w.pdf.Ln(1)
}

// noteHeight returns the height in mm of note s.
func (w *pdfWriter) noteHeight(s string) float64 {
	w.pdf.SetFont(pdfFont, "", 7.8)
	return float64(len(w.pdf.SplitText(w.t(s), w.width)))*3.6 + 1
}

func (w *pdfWriter) note(s string) {
	if s == "" {
		return
	}
	w.pdf.SetFont(pdfFont, "", 7.8)
	w.pdf.SetTextColor(85, 85, 85)
	w.pdf.MultiCell(0, 3.6, w.t(s), "", "L", false)
	w.pdf.SetTextColor(0, 0, 0)
	w.pdf.Ln(1)
}

// bulletText is the font size of a bullet's text, pt, and bulletIndent
// the room of the bullet sign, mm.
const (
	bulletText   = 9
	bulletIndent = 4
	bulletGap    = 0.6
)

// bulletsHeight returns the height in mm of the bullet list items.
func (w *pdfWriter) bulletsHeight(items []string) float64 {
	h := 0.0
	for _, s := range items {
		h += w.bulletHeight(s)
	}
	return h
}

func (w *pdfWriter) bulletHeight(s string) float64 {
	w.pdf.SetFont(pdfFont, "", bulletText)
	return float64(len(w.pdf.SplitText(w.t(s), w.width-bulletIndent)))*pdfLineH + bulletGap
}

// bullet writes one list item, never split across two pages.
func (w *pdfWriter) bullet(s string) {
	w.need(w.bulletHeight(s))
	p := w.pdf
	p.SetFont(pdfFont, "", bulletText)
	x := p.GetX()
	p.CellFormat(bulletIndent, pdfLineH, "•", "", 0, "L", false, 0, "")
	p.MultiCell(w.width-bulletIndent, pdfLineH, w.t(s), "", "L", false)
	p.SetX(x)
	p.Ln(bulletGap)
}

// chartMin returns the least height in mm chart c takes with its caption
// (shrunk to pdfMinChartScale).
func (w *pdfWriter) chartMin(c *Chart) float64 {
	h := w.width * float64(c.Page.Height) / float64(c.Page.Width)
	return pdfMinChartScale*h + pdfCaptionH
}

// tableStart is the height of a table's header and first row, the least
// of a table kept with its heading.
func (w *pdfWriter) tableStart() float64 { return 2*(pdfCellH+2) + pdfCellH }

// blockStart returns the least height in mm of the start of block b kept
// with a heading above it.
func (w *pdfWriter) blockStart(b Block) float64 {
	switch {
	case b.Table != nil:
		return w.tableStart()
	case b.Chart != nil:
		return w.chartMin(b.Chart)
	case b.Materials != nil:
		return w.tableStart() + pdfCellH*2 // a material's table has a caption
	}
	return w.textBlockHeight(b, 0)
}

// textOnly reports whether section s holds only text blocks (paragraphs,
// notes, lists), whose heights textHeight knows before they are set.
func (w *pdfWriter) textOnly(s Section) bool {
	for _, b := range s.Blocks {
		if b.Table != nil || b.Chart != nil || b.Materials != nil {
			return false
		}
	}
	return true
}

// textHeight returns the height in mm of the blocks of a text-only
// section.
func (w *pdfWriter) textHeight(s Section) float64 {
	h := 0.0
	for j, b := range s.Blocks {
		h += w.textBlockHeight(b, j)
	}
	return h
}

// textBlockHeight returns the height in mm of text block b, the j-th of its
// section (zero for a table, chart or materials block).
func (w *pdfWriter) textBlockHeight(b Block, j int) float64 {
	switch {
	case b.Para != "":
		return w.paraHeight(b.Para)
	case b.Note != "":
		return w.noteHeight(b.Note)
	case b.List != nil:
		h := w.bulletsHeight(b.List.Items)
		if j > 0 {
			h++
		}
		if b.List.Lead != "" {
			h += w.paraHeight(b.List.Lead)
		}
		return h
	}
	return 0
}

// chart places chart c, the i-th of the sheet, as a PNG image with its
// caption: across the text width where it fits, otherwise shrunk (centred) to the
// room left on the page when that is at least pdfMinChartScale of its
// size, otherwise at full width on a new page.
func (w *pdfWriter) chart(c *Chart, i int) error {
	id := fmt.Sprintf("chart%d", i)
	pg := c.Page
	pg.DPI = pdfChartDPI
	// The PDF writer orders images by pixel width and breaks ties in
	// map order; one extra pixel per chart keeps the output
	// reproducible.
	pg.Width += vg.Length(i) * vg.Inch / pdfChartDPI
	img, err := figure.Encode(c.Figure, figure.PNG, pg)
	if err != nil {
		return err
	}
	ratio := float64(pg.Height) / float64(pg.Width)
	wd, h := w.width, w.width*ratio
	if room := w.room() - pdfCaptionH - 1; h > room {
		if room >= pdfMinChartScale*h {
			wd, h = room/ratio, room
		} else {
			w.pdf.AddPage()
		}
	}
	p := w.pdf
	opt := fpdf.ImageOptions{ImageType: "PNG"}
	p.RegisterImageOptionsReader(id, opt, bytes.NewReader(img))
	y := p.GetY() + 1
	p.ImageOptions(id, pdfMargin+(w.width-wd)/2, y, wd, h, false, opt, 0, "")
	p.SetY(y + h + 1)
	p.SetFont(pdfFont, "B", 8)
	p.CellFormat(p.GetStringWidth(w.t(c.Title+". "))+0.5, 3.8, w.t(c.Title+". "), "", 0, "L", false, 0, "")
	p.SetFont(pdfFont, "", 8)
	p.MultiCell(0, 3.8, w.t(c.Caption), "", "L", false)
	p.Ln(2)
	return nil
}

// materials sets each material as a small table of its values and source.
func (w *pdfWriter) materials(ms []Material) {
	for _, m := range ms {
		t := Table{Caption: m.Role + ": " + m.Name, Header: []string{"Property", "Value"}}
		if m.Description != "" {
			t.add(false, "Description", m.Description)
		}
		for _, kv := range m.Values {
			t.add(false, kv.Key, kv.Value)
		}
		if m.Note != "" {
			t.add(false, "Note", m.Note)
		}
		t.add(false, "Source", m.Source)
		w.table(t)
	}
}

// table draws t with column widths from its content, wrapping long cells,
// repeating the header after a page break.
func (w *pdfWriter) table(t Table) {
	p := w.pdf
	n := len(t.Header)
	if n == 0 {
		return
	}
	const size = 8
	p.SetFont(pdfFont, "", size)
	// Natural width of each column: its widest cell, header included.
	nat := make([]float64, n)
	for j, h := range t.Header {
		p.SetFont(pdfFont, "B", size)
		nat[j] = p.GetStringWidth(w.t(h)) + 2*pdfPad
	}
	p.SetFont(pdfFont, "", size)
	for _, r := range t.Rows {
		for j := 0; j < n && j < len(r); j++ {
			nat[j] = math.Max(nat[j], p.GetStringWidth(w.t(r[j]))+2*pdfPad)
		}
	}
	widths := fitColumns(nat, w.width)
	if t.Caption != "" {
		w.need(4.2 + w.tableStart())
		p.SetFont(pdfFont, "B", 8.5)
		p.MultiCell(0, 4.2, w.t(t.Caption), "", "L", false)
	}
	header := func() {
		p.SetFont(pdfFont, "B", 7.2)
		x, y := pdfMargin, p.GetY()
		for j, h := range t.Header {
			p.SetXY(x, y)
			p.CellFormat(widths[j], pdfCellH+1.2, w.t(strings.ToUpper(h)), "", 0, align(t, j), false, 0, "")
			x += widths[j]
		}
		y += pdfCellH + 1.2
		p.SetLineWidth(0.4)
		p.Line(pdfMargin, y, pdfMargin+w.width, y)
		p.SetLineWidth(0.2)
		p.SetXY(pdfMargin, y)
	}
	w.need(2 * (pdfCellH + 2))
	header()
	for i, r := range t.Rows {
		style := ""
		if t.IsEmph(i) {
			style = "B"
		}
		p.SetFont(pdfFont, style, size)
		lines := make([][]string, n)
		maxL := 1
		for j := 0; j < n; j++ {
			txt := ""
			if j < len(r) {
				txt = w.t(r[j])
			}
			lines[j] = p.SplitText(txt, widths[j]-2*pdfPad)
			if len(lines[j]) == 0 {
				lines[j] = []string{""}
			}
			maxL = max(maxL, len(lines[j]))
		}
		h := float64(maxL)*pdfCellH + 2*pdfPad
		if h > w.room() {
			p.AddPage()
			header()
		}
		p.SetFont(pdfFont, style, size)
		y := p.GetY()
		if style == "B" {
			p.SetFillColor(243, 241, 230)
			p.Rect(pdfMargin, y, w.width, h, "F")
		}
		x := pdfMargin
		for j := 0; j < n; j++ {
			for k, l := range lines[j] {
				p.SetXY(x, y+pdfPad+float64(k)*pdfCellH)
				p.CellFormat(widths[j], pdfCellH, l, "", 0, align(t, j), false, 0, "")
			}
			x += widths[j]
		}
		p.SetDrawColor(220, 220, 220)
		p.Line(pdfMargin, y+h, pdfMargin+w.width, y+h)
		p.SetDrawColor(0, 0, 0)
		p.SetXY(pdfMargin, y+h)
	}
	p.Ln(3)
}

func align(t Table, j int) string {
	if t.IsNum(j) {
		return "R"
	}
	return "L"
}

// fitColumns scales natural column widths to the total width: columns that
// fit keep their width and share out the spare room; when the natural
// widths exceed the total, the widest columns give way first.
func fitColumns(nat []float64, total float64) []float64 {
	sum := 0.0
	for _, v := range nat {
		sum += v
	}
	out := make([]float64, len(nat))
	if sum <= total {
		extra := (total - sum) / float64(len(nat))
		for i, v := range nat {
			out[i] = v + extra
		}
		return out
	}
	// Cap the widest columns at a common width c so the total fits:
	// sum(min(nat, c)) = total, solved by bisection.
	lo, hi := 0.0, total
	for it := 0; it < 60; it++ {
		c := (lo + hi) / 2
		s := 0.0
		for _, v := range nat {
			s += math.Min(v, c)
		}
		if s > total {
			hi = c
		} else {
			lo = c
		}
	}
	for i, v := range nat {
		out[i] = math.Min(v, lo)
	}
	// Give the rounding remainder to the last column.
	s := 0.0
	for _, v := range out {
		s += v
	}
	out[len(out)-1] += total - s
	return out
}
