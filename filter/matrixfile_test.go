package filter

import (
	"bytes"
	"math"
	"math/cmplx"
	"strings"
	"testing"
)

// TestMatrixFileRoundTrip: a cascaded-triplet design written as
// coupling-matrix text and read back gives the same response (to 1e-13),
// the same verdicts, and its transmission zeros found from the matrix
// (matrixZeros, the real roots of the S21 cofactor) are the designed ones.
func TestMatrixFileRoundTrip(t *testing.T) {
	const f0, bw = 10e9, 100e6
	spec := Spec{F0: f0, BW: bw, Order: 5, ReturnLoss: 22, Zeros: []float64{-1.7, 1.4},
		Rejections: []Rejection{{F: BandpassFrequency(1.35, f0, bw), Attenuation: 20}, {F: BandpassFrequency(-1.6, f0, bw), Attenuation: 20}}}
	d, err := Synthesize(spec)
	if err != nil {
		t.Fatal(err)
	}
	top, _ := CascadeTopology("triplets", 5, 2)
	r, err := d.Rearranged(top)
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := WriteMatrixFile(&buf, r, 4000, []string{"round trip"}); err != nil {
		t.Fatal(err)
	}
	mf, err := ParseMatrixFile(&buf)
	if err != nil {
		t.Fatalf("%v\n%s", err, buf.String())
	}
	if mf.Q0 != 4000 || len(mf.Spec.Rejections) != 2 {
		t.Errorf("q0 %g, rejections %v", mf.Q0, mf.Spec.Rejections)
	}
	g, err := FromMatrix(mf.M, mf.Spec)
	if err != nil {
		t.Fatal(err)
	}
	for i, z := range []float64{-1.7, 1.4} {
		if len(g.Zeros) != 2 || math.Abs(g.Zeros[i]-z) > 1e-9 {
			t.Fatalf("zeros from the matrix %v, want [-1.7 1.4]", g.Zeros)
		}
	}
	freqs := []float64{9.9e9, 9.95e9, 10e9, 10.03e9, 10.1e9}
	a, _ := r.Response(freqs, []float64{4000, 4000, 4000, 4000, 4000})
	b, err := g.Response(freqs, []float64{4000, 4000, 4000, 4000, 4000})
	if err != nil {
		t.Fatal(err)
	}
	for i := range a {
		if e := cmplx.Abs(a[i].S21 - b[i].S21); e > 1e-13 {
			t.Errorf("S21 differs by %g at %g Hz", e, freqs[i])
		}
	}
	c1, _ := r.Check(nil, nil)
	c2, err := g.Check(nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	if Overall(c1) != Met || Overall(c2) != Met || len(c1) != len(c2) {
		t.Errorf("verdicts differ: %v vs %v", Overall(c1), Overall(c2))
	}
	for i := range c1 {
		if math.Abs(c1[i].Achieved-c2[i].Achieved) > 1e-6 {
			t.Errorf("check %s: %g vs %g", c1[i].Name, c1[i].Achieved, c2[i].Achieved)
		}
	}
}

// TestParseMatrixFileErrors: each bad line is refused naming the line and
// the valid range.
func TestParseMatrixFileErrors(t *testing.T) {
	head := "centre 10 GHz\nbandwidth 100 MHz\nresonators 2\n"
	for _, c := range []struct{ text, want string }{
		{"centre 10\n", "line 1: centre \"10\""},
		{"resonators 99\n", "1..30"},
		{head + "m S 1 1\nm 1 S 2\n", "line 5: entry 1 S already given on line 4"},
		{head + "m S 3 1\n", "rows and columns are S, 1..2 or L"},
		{head + "m S 1 x\n", "want a finite number"},
		{head + "colour red\n", "unknown keyword \"colour\""},
		{head + "q0 0\n", "between 1 and 1e12"},
		{head + "reject 40 dB at 10.2GHz\n", "ATT dB from F"},
		{head + "return-loss 200 dB\n", "between"},
		{"bandwidth 1 MHz\nresonators 2\n", "\"centre\" line is missing"},
		{head + "centre 9 GHz\n", "given twice"},
	} {
		_, err := ParseMatrixFile(strings.NewReader(c.text))
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: got %v, want an error with %q", c.text, err, c.want)
		}
	}
}
