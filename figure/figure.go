package figure

import (
	"image/color"
	"slices"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Figure is a page of one or more plots stacked vertically with aligned data
// areas (a shared x axis reads straight down), a title above them, and a
// legend and notes below. It is the page layout of every cylcav image: the
// mode chart, the design trade-off, the tuning curve, and filter responses.
type Figure struct {
	// Title is drawn centred above the panels; empty means none.
	Title string
	// Panels are drawn top to bottom in equal heights.
	Panels []*plot.Plot
	// Legend is drawn under the panels, flowed into as many columns as fit.
	Legend Legend
	// Notes are small lines of text under the legend (index convention,
	// data source).
	Notes []string
	// Theme gives the title and note fonts.
	Theme Theme
	// Equal lists panels (among Panels) drawn with equal scales on both
	// axes, one data unit as long across as up, so that a circle in the
	// data is round on the page: the axis range that is short for its
	// side is widened about its centre at draw time.
	Equal []*plot.Plot
}

// NewFigure returns an empty figure in the theme with the given title.
func NewFigure(th Theme, title string) *Figure {
	return &Figure{Title: title, Theme: th, Legend: NewLegend(th)}
}

// Draw draws the figure on c, implementing Drawer.
func (f *Figure) Draw(c draw.Canvas) {
	th := f.Theme
	if th.Background != nil {
		c.SetColor(th.Background)
		c.Fill(c.Rectangle.Path())
	}
	margin := vg.Points(8)
	c = draw.Crop(c, margin, -margin, margin, -margin)
	if f.Title != "" {
		sty := th.Bold(th.TitleSize, Ink)
		sty.YAlign = draw.YTop
		c.FillText(sty, vg.Point{X: c.Center().X, Y: c.Max.Y}, f.Title)
		c.Max.Y -= sty.Rectangle(f.Title).Size().Y + vg.Points(6)
	}
	if len(f.Notes) > 0 {
		sty := th.Text(th.LegendSize*0.95, color.Gray{Y: 0x44})
		sty.XAlign = draw.XLeft
		sty.YAlign = draw.YBottom
		var lines []string
		for _, n := range f.Notes {
			lines = append(lines, wrap(sty, n, c.Size().X)...)
		}
		for i := len(lines) - 1; i >= 0; i-- {
			c.FillText(sty, vg.Point{X: c.Min.X, Y: c.Min.Y}, lines[i])
			c.Min.Y += sty.Rectangle(lines[i]).Size().Y + vg.Points(1.5)
		}
		c.Min.Y += vg.Points(4)
	}
	if len(f.Legend.Entries) > 0 {
		h := f.Legend.Height(c.Size().X)
		lc := c
		lc.Max.Y = lc.Min.Y + h
		f.Legend.Draw(lc)
		c.Min.Y += h + vg.Points(8)
	}
	if len(f.Panels) == 0 {
		return
	}
	rows := make([][]*plot.Plot, len(f.Panels))
	for i, p := range f.Panels {
		rows[i] = []*plot.Plot{p}
	}
	tiles := draw.Tiles{Rows: len(f.Panels), Cols: 1, PadY: vg.Points(12)}
	cs := plot.Align(rows, tiles, c)
	for i, p := range f.Panels {
		if slices.Contains(f.Equal, p) {
			drawEqual(p, cs[i][0])
			continue
		}
		p.Draw(cs[i][0])
	}
}

// drawEqual draws p on c with equal data scales on both axes (see
// equalRanges), restoring p's axis ranges afterwards so that drawing again
// at another size starts from the same ranges.
func drawEqual(p *plot.Plot, c draw.Canvas) {
	x0, x1, y0, y1 := p.X.Min, p.X.Max, p.Y.Min, p.Y.Max
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = equalRanges(p, c)
	p.Draw(c)
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = x0, x1, y0, y1
}

// equalRanges returns the axis ranges of p widened about their centres so
// that one data unit is as long on both axes of p's data area in c. The
// widened range can change the tick labels' width, and so the data area:
// two passes settle it. p's ranges are left as they were.
func equalRanges(p *plot.Plot, c draw.Canvas) (xMin, xMax, yMin, yMax float64) {
	x0, x1, y0, y1 := p.X.Min, p.X.Max, p.Y.Min, p.Y.Max
	defer func() { p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = x0, x1, y0, y1 }()
	xMin, xMax, yMin, yMax = x0, x1, y0, y1
	for pass := 0; pass < 2; pass++ {
		p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = xMin, xMax, yMin, yMax
		da := p.DataCanvas(c)
		w, h := float64(da.Size().X), float64(da.Size().Y)
		if !(w > 0 && h > 0 && x1 > x0 && y1 > y0) {
			break
		}
		xMin, xMax, yMin, yMax = x0, x1, y0, y1
		sx, sy := (x1-x0)/w, (y1-y0)/h // data units per point
		if sx > sy {
			cy, half := (y0+y1)/2, sx*h/2
			yMin, yMax = cy-half, cy+half
		} else {
			cx, half := (x0+x1)/2, sy*w/2
			xMin, xMax = cx-half, cx+half
		}
	}
	return xMin, xMax, yMin, yMax
}

// wrap breaks s at spaces into lines no wider than width in style sty; a
// single word wider than width gets a line of its own.
func wrap(sty text.Style, s string, width vg.Length) []string {
	words := strings.Fields(s)
	var out []string
	cur := ""
	for _, w := range words {
		try := w
		if cur != "" {
			try = cur + " " + w
		}
		if cur != "" && sty.Width(try) > width {
			out = append(out, cur)
			cur = w
			continue
		}
		cur = try
	}
	if cur != "" {
		out = append(out, cur)
	}
	return out
}

// LegendEntry is one legend item: a text and the thumbnails drawn before it
// (a line sample, a marker, a filled box; several overlay).
type LegendEntry struct {
	Text   string
	Thumbs []plot.Thumbnailer
}

// Legend is a key drawn as a grid of entries, flowed left to right into as
// many equal columns as the width allows.
type Legend struct {
	Entries []LegendEntry
	// TextStyle is the style of the entry texts; the alignment is ignored.
	TextStyle text.Style
	// ThumbWidth is the width of the thumbnail before each text.
	ThumbWidth vg.Length
}

// NewLegend returns an empty legend in the theme.
func NewLegend(th Theme) Legend {
	return Legend{TextStyle: th.Text(th.LegendSize, Ink), ThumbWidth: vg.Points(26)}
}

// Add appends an entry.
func (l *Legend) Add(txt string, thumbs ...plot.Thumbnailer) {
	l.Entries = append(l.Entries, LegendEntry{Text: txt, Thumbs: thumbs})
}

func (l *Legend) cell() (w, h vg.Length) {
	gap := vg.Points(6)
	for _, e := range l.Entries {
		r := l.TextStyle.Rectangle(e.Text)
		if x := r.Size().X; x > w {
			w = x
		}
		if y := r.Size().Y; y > h {
			h = y
		}
	}
	return l.ThumbWidth + gap + w + 2*gap, h + vg.Points(3)
}

func (l *Legend) columns(width vg.Length) int {
	cw, _ := l.cell()
	n := int(width / cw)
	if n < 1 {
		n = 1
	}
	if n > len(l.Entries) {
		n = len(l.Entries)
	}
	return n
}

// Height returns the height the legend needs at the given width.
func (l *Legend) Height(width vg.Length) vg.Length {
	if len(l.Entries) == 0 {
		return 0
	}
	n := l.columns(width)
	_, ch := l.cell()
	rows := (len(l.Entries) + n - 1) / n
	return vg.Length(rows) * ch
}

// Draw draws the legend from the top-left of c.
func (l *Legend) Draw(c draw.Canvas) {
	if len(l.Entries) == 0 {
		return
	}
	n := l.columns(c.Size().X)
	cw, ch := l.cell()
	// Spread the columns over the width.
	if n > 1 {
		cw = c.Size().X / vg.Length(n)
	}
	sty := l.TextStyle
	sty.XAlign = draw.XLeft
	sty.YAlign = draw.YCenter
	for i, e := range l.Entries {
		row, col := i/n, i%n
		x := c.Min.X + vg.Length(col)*cw
		yTop := c.Max.Y - vg.Length(row)*ch
		thumb := draw.Canvas{Canvas: c.Canvas, Rectangle: vg.Rectangle{
			Min: vg.Point{X: x, Y: yTop - ch + vg.Points(2)},
			Max: vg.Point{X: x + l.ThumbWidth, Y: yTop - vg.Points(1)},
		}}
		for _, t := range e.Thumbs {
			t.Thumbnail(&thumb)
		}
		c.FillText(sty, vg.Point{X: x + l.ThumbWidth + vg.Points(6), Y: yTop - ch/2}, e.Text)
	}
}

// LineThumb is a legend thumbnail: a horizontal line sample.
type LineThumb struct{ draw.LineStyle }

// Thumbnail implements plot.Thumbnailer.
func (t LineThumb) Thumbnail(c *draw.Canvas) {
	y := c.Center().Y
	c.StrokeLine2(t.LineStyle, c.Min.X, y, c.Max.X, y)
}

// GlyphThumb is a legend thumbnail: one marker in the middle.
type GlyphThumb struct{ draw.GlyphStyle }

// Thumbnail implements plot.Thumbnailer.
func (t GlyphThumb) Thumbnail(c *draw.Canvas) {
	c.DrawGlyphNoClip(t.GlyphStyle, c.Center())
}

// BoxThumb is a legend thumbnail: a filled, outlined box.
type BoxThumb struct {
	Fill color.Color
	draw.LineStyle
}

// Thumbnail implements plot.Thumbnailer.
func (t BoxThumb) Thumbnail(c *draw.Canvas) {
	r := vg.Rectangle{
		Min: vg.Point{X: c.Min.X + vg.Points(2), Y: c.Min.Y + vg.Points(1)},
		Max: vg.Point{X: c.Max.X - vg.Points(2), Y: c.Max.Y - vg.Points(1)},
	}
	if t.Fill != nil {
		c.SetColor(t.Fill)
		c.Fill(r.Path())
	}
	if t.Width > 0 {
		c.SetLineStyle(t.LineStyle)
		c.Stroke(r.Path())
	}
}
