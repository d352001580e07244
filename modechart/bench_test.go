package modechart

import (
	"io"
	"testing"

	"cylcav/figure"
)

// bench200 returns the spec of a chart with about 200 mode lines (the demo
// design with its top raised) and checks the count.
func bench200(b *testing.B) Spec {
	s := designSpec()
	s.MaxFD = 9.4e8
	ch, err := New(s)
	if err != nil {
		b.Fatal(err)
	}
	if n := len(ch.Lines); n < 190 || n > 215 {
		b.Fatalf("benchmark chart has %d lines, want about 200", n)
	}
	b.Cleanup(func() { b.ReportMetric(float64(len(ch.Lines)), "lines") })
	return s
}

// BenchmarkNew200 builds the chart data: the mode list, the lines and
// their roles.
func BenchmarkNew200(b *testing.B) {
	s := bench200(b)
	b.ResetTimer()
	for b.Loop() {
		if _, err := New(s); err != nil {
			b.Fatal(err)
		}
	}
}

func benchRender(b *testing.B, f figure.Format) {
	s := bench200(b)
	b.ResetTimer()
	for b.Loop() {
		ch, err := New(s)
		if err != nil {
			b.Fatal(err)
		}
		fig, err := ch.Figure(figure.DefaultTheme())
		if err != nil {
			b.Fatal(err)
		}
		if err := figure.Render(io.Discard, fig, f, figure.Page{}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkRender200PNG builds and renders a 200-line chart to PNG at
// 8 x 6 in and 150 dpi (label layout included).
func BenchmarkRender200PNG(b *testing.B) { benchRender(b, figure.PNG) }

// BenchmarkRender200SVG builds and renders a 200-line chart to SVG.
func BenchmarkRender200SVG(b *testing.B) { benchRender(b, figure.SVG) }

// BenchmarkRender200PDF builds and renders a 200-line chart to PDF.
func BenchmarkRender200PDF(b *testing.B) { benchRender(b, figure.PDF) }
