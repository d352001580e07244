package datasheet_test

import (
	"bytes"
	"math"
	"strconv"
	"strings"
	"testing"

	"cylcav/cavity"
	"cylcav/datasheet"
	"cylcav/figure"
	"cylcav/figure/rendertest"
	"cylcav/filter"
)

// filterInput is an invented channel filter: six TE011 cavities (D/L 1.2,
// perfectly conducting walls, Q0 = 8000 each for the response), 10 GHz,
// 100 MHz wide, a zero at 10.11 GHz, bounded rejections on both sides.
// With cavities false the realisation is left out.
func filterInput(t testing.TB, cavities bool) datasheet.Filter {
	t.Helper()
	const f0, bw = 10e9, 100e6
	d, err := filter.Synthesize(filter.Spec{F0: f0, BW: bw, Order: 6, ReturnLoss: 23,
		Zeros:      []float64{filter.LowpassOmega(10.11e9, f0, bw)},
		Rejections: []filter.Rejection{{F: 10.12e9, Attenuation: 40, End: 10.3e9}, {F: 9.88e9, Attenuation: 35, End: 9.7e9}}})
	if err != nil {
		t.Fatal(err)
	}
	in := datasheet.Filter{Design: d, Q0: []float64{8000, 8000, 8000, 8000, 8000, 8000}, Notes: []string{"a standing note"}}
	var sp []filter.Spurious
	if cavities {
		te011, err := cavity.ParseMode("TE011")
		if err != nil {
			t.Fatal(err)
		}
		rz, err := filter.Realise(d, filter.RealiseOptions{Mode: te011, Shape: cavity.ByRatio(1.2)})
		if err != nil {
			t.Fatal(err)
		}
		in.Realisation, in.Shape, in.FillLabel = rz, "D/L = 1.2", "vacuum"
		sp = rz.Spurious
	}
	if in.Checks, err = d.Check(in.Q0, sp); err != nil {
		t.Fatal(err)
	}
	mid, err := d.Response([]float64{f0}, in.Q0)
	if err != nil {
		t.Fatal(err)
	}
	in.InsertionLoss = mid[0].InsertionLoss()
	if in.Delay, err = d.Delay(in.Q0); err != nil {
		t.Fatal(err)
	}
	if lo, hi, err := filter.SweepRange(d, 3); err != nil {
		t.Fatal(err)
	} else {
		in.Sweep = [2]float64{lo, hi}
	}
	return in
}

// TestFromFilterVerdicts: the verdict table holds one row per line of
// Design.Check, in order, with that line's verdict, and a failing line is
// emphasised; the overall key figure is filter.Overall's.
func TestFromFilterVerdicts(t *testing.T) {
	in := filterInput(t, true)
	sh, err := datasheet.FromFilter(in, figure.DefaultTheme())
	if err != nil {
		t.Fatal(err)
	}
	var vt *datasheet.Table
	for _, s := range sh.Sections {
		for _, b := range s.Blocks {
			if b.Table != nil && strings.HasPrefix(b.Table.Caption, "Verdict per mask line") {
				vt = b.Table
			}
		}
	}
	if vt == nil {
		t.Fatal("no verdict table")
	}
	if len(vt.Rows) != len(in.Checks) {
		t.Fatalf("%d verdict rows for %d check lines", len(vt.Rows), len(in.Checks))
	}
	failed := 0
	for i, c := range in.Checks {
		want := c.Verdict.String()
		if c.Info {
			want = "info"
		}
		if got := vt.Rows[i][len(vt.Rows[i])-1]; got != want {
			t.Errorf("row %d (%s): verdict %q, want %q", i, c.Name, got, want)
		}
		if vt.IsEmph(i) != (!c.Info && c.Verdict != filter.Met) {
			t.Errorf("row %d (%s): emphasis %v for verdict %v", i, c.Name, vt.IsEmph(i), c.Verdict)
		}
		if !c.Info && c.Verdict != filter.Met {
			failed++
		}
	}
	if failed == 0 {
		t.Error("the scenario should fail a line (TE112 of D/L 1.2 cavities lies in the lower rejection band)")
	}
	for _, kv := range sh.Facts {
		if kv.Key == "Specification" && kv.Value != "FAIL" {
			t.Errorf("key figure Specification = %q, want FAIL", kv.Value)
		}
	}
}

// TestFromFilterCharts: with cavities the sheet has four charts (topology,
// response, passband, wide view); without them three, and the wide view is
// replaced by a note saying why. Both render to HTML and PDF.
func TestFromFilterCharts(t *testing.T) {
	for _, cav := range []bool{true, false} {
		sh, err := datasheet.FromFilter(filterInput(t, cav), figure.DefaultTheme())
		if err != nil {
			t.Fatal(err)
		}
		var ids []string
		for _, c := range sh.Charts() {
			ids = append(ids, c.ID)
		}
		want := "topology response passband wide"
		if !cav {
			want = "topology response passband"
		}
		if got := strings.Join(ids, " "); got != want {
			t.Errorf("cavities %v: charts %q, want %q", cav, got, want)
		}
		var h, p bytes.Buffer
		if err := sh.WriteHTML(&h); err != nil {
			t.Fatal(err)
		}
		if note := "Wide view with spurious resonances: omitted"; strings.Contains(h.String(), note) == cav {
			t.Errorf("cavities %v: the note %q present = %v", cav, note, !cav)
		}
		if err := sh.WritePDF(&p); err != nil {
			t.Fatal(err)
		}
		rendertest.PDF(t, p.Bytes())
	}
	if _, err := datasheet.FromFilter(datasheet.Filter{}, figure.DefaultTheme()); err == nil {
		t.Error("FromFilter without a design gave no error")
	}
}

// TestFromFilterMatrix: the coupling-matrix table is the folded matrix to
// four decimals, symmetric, with the synthesis rounding set as 0.
func TestFromFilterMatrix(t *testing.T) {
	in := filterInput(t, false)
	sh, err := datasheet.FromFilter(in, figure.DefaultTheme())
	if err != nil {
		t.Fatal(err)
	}
	var mt *datasheet.Table
	for _, s := range sh.Sections {
		if s.Heading == datasheet.SecMatrix {
			mt = s.Blocks[0].Table
		}
	}
	n := in.Design.Order()
	if mt == nil || len(mt.Rows) != n+2 || len(mt.Header) != n+3 {
		t.Fatalf("matrix table %+v", mt)
	}
	for i := 0; i < n+2; i++ {
		for j := 0; j < n+2; j++ {
			cell := strings.Replace(mt.Rows[i][j+1], "−", "-", 1)
			a, b := min(i, j), max(i, j)
			v := in.Design.Folded.At(a, b)
			if math.Abs(v) < 1e-9 {
				v = 0
			}
			if want := strconv.FormatFloat(v, 'f', 4, 64); cell != want {
				t.Errorf("M[%d][%d] = %s, want %s", i, j, cell, want)
			}
		}
	}
}

// BenchmarkFromFilter: the filter datasheet of the channel scenario with
// cavities, assembled (charts computed) and written as HTML, then as PDF.
func BenchmarkFromFilter(b *testing.B) {
	in := filterInput(b, true)
	for _, kind := range []string{"html", "pdf"} {
		b.Run(kind, func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				sh, err := datasheet.FromFilter(in, figure.DefaultTheme())
				if err != nil {
					b.Fatal(err)
				}
				var w bytes.Buffer
				if kind == "html" {
					err = sh.WriteHTML(&w)
				} else {
					err = sh.WritePDF(&w)
				}
				if err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
