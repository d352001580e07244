package rendertest

import (
	"bytes"
	"image"
	"image/png"
	"runtime"
	"testing"
)

// recorder is a testing.TB that records failures instead of failing. The
// checks call only Helper, Errorf and Fatalf; the embedded nil TB panics on
// anything else.
type recorder struct {
	testing.TB
	failed bool
}

func (r *recorder) Helper()               {}
func (r *recorder) Errorf(string, ...any) { r.failed = true }
func (r *recorder) Fatalf(string, ...any) { r.failed = true; runtime.Goexit() }

// fails reports whether check fails.
func fails(check func(testing.TB)) bool {
	r := &recorder{}
	done := make(chan struct{})
	go func() { defer close(done); check(r) }()
	<-done
	return r.failed
}

func TestChecks(t *testing.T) {
	var img bytes.Buffer
	if err := png.Encode(&img, image.NewGray(image.Rect(0, 0, 4, 3))); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name  string
		check func(testing.TB)
		fail  bool
	}{
		{"PNG 4x3", func(tb testing.TB) { PNG(tb, img.Bytes(), 4, 3) }, false},
		{"PNG wrong size", func(tb testing.TB) { PNG(tb, img.Bytes(), 3, 4) }, true},
		{"PNG garbage", func(tb testing.TB) { PNG(tb, []byte("GIF89a"), 4, 3) }, true},
		{"SVG", func(tb testing.TB) { SVG(tb, []byte(`<svg xmlns="http://www.w3.org/2000/svg"><g/></svg>`)) }, false},
		{"SVG unclosed", func(tb testing.TB) { SVG(tb, []byte(`<svg><g></svg>`)) }, true},
		{"SVG other root", func(tb testing.TB) { SVG(tb, []byte(`<html/>`)) }, true},
		{"PDF", func(tb testing.TB) { PDF(tb, []byte("%PDF-1.4\n...\n%%EOF\n")) }, false},
		{"PDF no trailer", func(tb testing.TB) { PDF(tb, []byte("%PDF-1.4\n...\n")) }, true},
		{"PDF no header", func(tb testing.TB) { PDF(tb, []byte("...\n%%EOF")) }, true},
	} {
		if got := fails(c.check); got != c.fail {
			t.Errorf("%s: failed = %v, want %v", c.name, got, c.fail)
		}
	}
}
