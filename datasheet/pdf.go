package datasheet

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"strings"
	"time"

	"codeberg.org/go-pdf/fpdf"
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
)

// pdfDate is the fixed creation date of every PDF datasheet, so the same
// design gives the same bytes.
var pdfDate = time.Date(2000, 1, 1, 0, 0, 0, 0, time.UTC)

// WritePDF writes the datasheet to out as an A4 PDF document with the
// same sections, in the same order, as the HTML one: core Helvetica text
// (code page 1252, see figure.WinAnsi), tables with wrapped cells,
// charts as PNG images at pdfChartDPI, page numbers in the footer. The
// output is deterministic.
func (sh *Sheet) WritePDF(out io.Writer) error {
	pdf := fpdf.New("P", "mm", "A4", "")
	pdf.SetCreationDate(pdfDate)
	pdf.SetModificationDate(pdfDate)
	pdf.SetCatalogSort(true)
	pdf.SetCompression(true)
	pdf.SetCreator("cylcav "+sh.Version, false)
	pdf.SetTitle(figure.WinAnsi(sh.Title), false)
	pdf.SetMargins(pdfMargin, pdfMargin, pdfMargin)
	pdf.SetAutoPageBreak(true, pdfMargin+5)
	pdf.AliasNbPages("{nb}")
	pdf.SetFooterFunc(func() {
		pdf.SetY(-pdfMargin)
		pdf.SetFont("Helvetica", "", 7.5)
		pdf.SetTextColor(90, 90, 90)
		pdf.CellFormat(0, 4, figure.WinAnsi(fmt.Sprintf("cylcav %s datasheet: %s", sh.Version, sh.Headline)), "", 0, "L", false, 0, "")
		pdf.CellFormat(0, 4, fmt.Sprintf("page %d of {nb}", pdf.PageNo()), "", 0, "R", false, 0, "")
		pdf.SetTextColor(0, 0, 0)
	})
	w := &pdfWriter{pdf: pdf}
	pdf.AddPage()
	w.width, _ = pdf.GetPageSize()
	w.width -= 2 * pdfMargin

	// Title block.
	pdf.SetFont("Helvetica", "", 8)
	pdf.SetTextColor(90, 90, 90)
	pdf.CellFormat(0, 4, w.t(strings.ToUpper(sh.Kind)), "", 1, "L", false, 0, "")
	pdf.SetTextColor(0, 0, 0)
	pdf.SetFont("Helvetica", "B", 15)
	pdf.MultiCell(0, 6.5, w.t(sh.Title), "", "L", false)
	pdf.SetFont("Helvetica", "", 10.5)
	pdf.MultiCell(0, 5.5, w.t(sh.Headline), "", "L", false)
	if n := sh.Notice; n != nil {
		pdf.Ln(1)
		pdf.SetFillColor(243, 241, 230)
		pdf.SetFont("Helvetica", "", 8.5)
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

	// The sections in order, numbered as in the HTML datasheet. A section
	// that opens with a chart starts on a new page unless the chart fits
	// below its heading.
	charts := map[*Chart]int{}
	for i, c := range sh.Charts() {
		charts[c] = i
	}
	for i, sec := range sh.Sections {
		if len(sec.Blocks) > 0 && sec.Blocks[0].Chart != nil {
			w.need(w.chartHeight(sec.Blocks[0].Chart) + 14)
		}
		w.heading(fmt.Sprintf("%d  %s", i+1, sec.Heading))
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
}

func (w *pdfWriter) t(s string) string { return figure.WinAnsi(s) }

// latin1 rewrites s with runes up to U+00FF only, for the line breaker,
// which measures runes as code points of the font's code page: characters
// outside Latin-1 become their WinAnsi spelling, and the few code page
// 1252 extras (dashes, curly quotes) their ASCII look-alikes.
func latin1(s string) string {
	var b strings.Builder
	for _, r := range s {
		if r <= 0xff {
			b.WriteRune(r)
			continue
		}
		x := figure.WinAnsi(string(r))
		switch {
		case len(x) == 1 && x[0] >= 0xa0:
			b.WriteRune(rune(x[0]))
		case len(x) == 1 && x[0] >= 0x80:
			b.WriteString(ascii1252[x[0]])
		default:
			b.WriteString(x)
		}
	}
	return b.String()
}

// ascii1252 are ASCII stand-ins for the code page 1252 characters in
// 0x80..0x9f.
var ascii1252 = map[byte]string{
	0x80: "EUR", 0x85: "...", 0x91: "'", 0x92: "'", 0x93: "\"", 0x94: "\"", 0x95: "*", 0x96: "-", 0x97: "-", 0x99: "(TM)",
}

// need starts a new page unless h mm remain above the bottom margin.
func (w *pdfWriter) need(h float64) {
	_, ph := w.pdf.GetPageSize()
	if w.pdf.GetY()+h > ph-pdfMargin-5 {
		w.pdf.AddPage()
	}
}

func (w *pdfWriter) heading(s string) {
	w.need(30)
	p := w.pdf
	p.Ln(3)
	p.SetFont("Helvetica", "B", 11.5)
	p.SetTextColor(0x1a, 0x1a, 0x1a)
	p.CellFormat(0, 6, w.t(s), "", 1, "L", false, 0, "")
	y := p.GetY()
	p.SetDrawColor(180, 180, 180)
	p.Line(pdfMargin, y, pdfMargin+w.width, y)
	p.SetDrawColor(0, 0, 0)
	p.Ln(1.5)
}

func (w *pdfWriter) para(s string) {
	w.pdf.SetFont("Helvetica", "", 9)
	w.pdf.MultiCell(0, pdfLineH, w.t(s), "", "L", false)
	w.pdf.Ln(1)
}

func (w *pdfWriter) note(s string) {
	if s == "" {
		return
	}
	w.pdf.SetFont("Helvetica", "", 7.8)
	w.pdf.SetTextColor(85, 85, 85)
	w.pdf.MultiCell(0, 3.6, w.t(s), "", "L", false)
	w.pdf.SetTextColor(0, 0, 0)
	w.pdf.Ln(1)
}

func (w *pdfWriter) bullet(s string) {
	p := w.pdf
	p.SetFont("Helvetica", "", 9)
	x := p.GetX()
	p.CellFormat(4, pdfLineH, "\x95", "", 0, "L", false, 0, "")
	p.MultiCell(w.width-4, pdfLineH, w.t(s), "", "L", false)
	p.SetX(x)
	p.Ln(0.6)
}

// chartHeight returns the height in mm of chart c with its caption.
func (w *pdfWriter) chartHeight(c *Chart) float64 {
	return w.width*float64(c.Page.Height)/float64(c.Page.Width) + 10
}

// chart places chart c, the i-th of the sheet, as a PNG image across the
// text width, with its caption.
func (w *pdfWriter) chart(c *Chart, i int) error {
	pg := c.Page
	pg.DPI = pdfChartDPI
	// The PDF writer orders images by pixel width and breaks ties in map
	// order; one extra pixel per chart keeps the output reproducible.
	pg.Width += vg.Length(i) * vg.Inch / pdfChartDPI
	img, err := figure.Encode(c.Figure, figure.PNG, pg)
	if err != nil {
		return err
	}
	ratio := float64(pg.Height) / float64(pg.Width)
	h := w.width * ratio
	w.need(h + 10)
	p := w.pdf
	opt := fpdf.ImageOptions{ImageType: "PNG"}
	id := fmt.Sprintf("chart%d", i)
	p.RegisterImageOptionsReader(id, opt, bytes.NewReader(img))
	y := p.GetY() + 1
	p.ImageOptions(id, pdfMargin, y, w.width, h, false, opt, 0, "")
	p.SetY(y + h + 1)
	p.SetFont("Helvetica", "B", 8)
	p.CellFormat(p.GetStringWidth(w.t(c.Title+". "))+0.5, 3.8, w.t(c.Title+". "), "", 0, "L", false, 0, "")
	p.SetFont("Helvetica", "", 8)
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
	p.SetFont("Helvetica", "", size)
	// Natural width of each column: its widest cell, header included.
	nat := make([]float64, n)
	for j, h := range t.Header {
		p.SetFont("Helvetica", "B", size)
		nat[j] = p.GetStringWidth(w.t(h)) + 2*pdfPad
	}
	p.SetFont("Helvetica", "", size)
	for _, r := range t.Rows {
		for j := 0; j < n && j < len(r); j++ {
			nat[j] = math.Max(nat[j], p.GetStringWidth(w.t(r[j]))+2*pdfPad)
		}
	}
	widths := fitColumns(nat, w.width)
	if t.Caption != "" {
		w.need(3 * pdfCellH * 2)
		p.SetFont("Helvetica", "B", 8.5)
		p.MultiCell(0, 4.2, w.t(t.Caption), "", "L", false)
	}
	header := func() {
		p.SetFont("Helvetica", "B", 7.2)
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
		p.SetFont("Helvetica", style, size)
		lines := make([][]string, n)
		maxL := 1
		for j := 0; j < n; j++ {
			txt := ""
			if j < len(r) {
				txt = latin1(r[j])
			}
			lines[j] = p.SplitText(txt, widths[j]-2*pdfPad)
			if len(lines[j]) == 0 {
				lines[j] = []string{""}
			}
			for k := range lines[j] {
				lines[j][k] = w.t(lines[j][k])
			}
			maxL = max(maxL, len(lines[j]))
		}
		h := float64(maxL)*pdfCellH + 2*pdfPad
		_, ph := p.GetPageSize()
		if p.GetY()+h > ph-pdfMargin-5 {
			p.AddPage()
			header()
		}
		p.SetFont("Helvetica", style, size)
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
