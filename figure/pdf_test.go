package figure

import (
	"bytes"
	"errors"
	"regexp"
	"sync"
	"testing"

	"codeberg.org/go-pdf/fpdf"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"

	"cylcav/figure/rendertest"
)

// pdfFontObject matches a font dictionary of a PDF ("/Type /Font", not the
// "/Type /FontDescriptor" that describes it; ISO 32000-1, sec. 9.6).
var pdfFontObject = regexp.MustCompile(`/Type /Font[^A-Za-z]`)

// twoFaceFigure is the demo figure with its second panel's axis titles in
// Liberation Serif, so the page asks for two typefaces.
func twoFaceFigure(t testing.TB) *Figure {
	t.Helper()
	f := demoFigure(t)
	for _, ts := range []*text.Style{&f.Panels[1].X.Label.TextStyle, &f.Panels[1].Y.Label.TextStyle} {
		ts.Font.Typeface, ts.Font.Variant = "Liberation", "Serif"
	}
	return f
}

// TestPDFOneFace checks that a page asking for two typefaces comes out as
// a PDF with one font (see pdfCanvas) and the same bytes on every render:
// the PDF writer lists its fonts in map order, so two fonts would come out
// in either order from run to run.
func TestPDFOneFace(t *testing.T) {
	pg := Page{Width: 6 * vg.Inch, Height: 4.5 * vg.Inch}
	first, err := Encode(twoFaceFigure(t), PDF, pg)
	if err != nil {
		t.Fatal(err)
	}
	rendertest.PDF(t, first)
	if n := len(pdfFontObject.FindAll(first, -1)); n != 1 {
		t.Errorf("PDF holds %d font dictionaries, want 1", n)
	}
	// Map order differs from run to run with probability 1/2 for two
	// entries; 20 renders miss a wrong order with probability 2^-19.
	for i := 0; i < 20; i++ {
		b, err := Encode(twoFaceFigure(t), PDF, pg)
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(b, first) {
			t.Fatalf("render %d of the same page differs from the first", i+2)
		}
	}
}

// TestPDFLeavesWriterDefaults checks that rendering a PDF changes no
// process-wide default of the PDF writer: a document made afterwards by
// anyone else starts with the writer's own default (catalogue sorting off).
func TestPDFLeavesWriterDefaults(t *testing.T) {
	if _, err := Encode(demoFigure(t), PDF, Page{}); err != nil {
		t.Fatal(err)
	}
	if fpdf.New("P", "mm", "A4", "").GetCatalogSort() {
		t.Error("after a PDF render, a new PDF writer sorts its catalogue by default: Render changed a process-wide default")
	}
}

// TestConcurrentPDF renders figures as PDF in several goroutines while
// others make PDF documents straight with the writer (as the datasheet
// does). Run it under the race detector:
//
//	go test -race -run ConcurrentPDF ./figure/
//
// Every render must still give the same bytes.
func TestConcurrentPDF(t *testing.T) {
	const workers = 4
	pg := Page{Width: 4 * vg.Inch, Height: 3 * vg.Inch}
	// No PDF is made before the goroutines start: the first render of the
	// process happens concurrently with the other documents.
	renders := make([][]byte, workers)
	errs := make([]error, 2*workers)
	var wg sync.WaitGroup
	for i := 0; i < workers; i++ {
		wg.Add(2)
		go func() {
			defer wg.Done()
			renders[i], errs[2*i] = Encode(demoFigure(t), PDF, pg)
		}()
		go func() {
			defer wg.Done()
			doc := fpdf.New("P", "mm", "A4", "")
			doc.SetCatalogSort(true)
			doc.AddPage()
			doc.SetFont("Helvetica", "", 10)
			doc.CellFormat(0, 5, "another PDF made at the same time", "", 1, "L", false, 0, "")
			var buf bytes.Buffer
			if errs[2*i+1] = doc.Output(&buf); errs[2*i+1] == nil && !bytes.HasPrefix(buf.Bytes(), []byte("%PDF-")) {
				errs[2*i+1] = errors.New("the other PDF lacks its header")
			}
		}()
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			t.Fatal(err)
		}
	}
	for i, b := range renders {
		rendertest.PDF(t, b)
		if !bytes.Equal(b, renders[0]) {
			t.Errorf("concurrent render %d differs from render 1", i+1)
		}
	}
}
