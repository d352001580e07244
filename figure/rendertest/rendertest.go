// Package rendertest checks that rendered chart files are valid, for the
// tests of every package that writes PNG, SVG or PDF through package
// figure.
package rendertest

import (
	"bytes"
	"encoding/xml"
	"errors"
	"image/png"
	"io"
	"testing"
)

// PNG fails t unless b decodes as a PNG image of w x h pixels.
func PNG(t testing.TB, b []byte, w, h int) {
	t.Helper()
	img, err := png.Decode(bytes.NewReader(b))
	if err != nil {
		t.Fatalf("PNG does not decode: %v", err)
	}
	if s := img.Bounds().Size(); s.X != w || s.Y != h {
		t.Errorf("PNG size = %dx%d, want %dx%d", s.X, s.Y, w, h)
	}
}

// SVG fails t unless b is well-formed XML to its end with an svg root.
func SVG(t testing.TB, b []byte) {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(b))
	root := ""
	for {
		tok, err := dec.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
		if se, ok := tok.(xml.StartElement); ok && root == "" {
			root = se.Name.Local
		}
	}
	if root != "svg" {
		t.Errorf("SVG root element = %q, want svg", root)
	}
}

// PDF fails t unless b starts with the %PDF- header and ends with the
// %%EOF trailer (ISO 32000-1, sec. 7.5.2 and 7.5.5).
func PDF(t testing.TB, b []byte) {
	t.Helper()
	if !bytes.HasPrefix(b, []byte("%PDF-")) {
		t.Errorf("PDF starts %q, want %%PDF-", b[:min(8, len(b))])
	}
	if !bytes.HasSuffix(bytes.TrimRight(b, "\r\n"), []byte("%%EOF")) {
		t.Errorf("PDF does not end in %%%%EOF")
	}
}
