package filter

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"cylcav/touchstone"
)

// ReferenceImpedance is the port reference impedance, in ohm, written on the
// option line of Touchstone files. The normalised coupling-matrix response
// is referenced to the port terminations, which are taken to be this value.
const ReferenceImpedance = 50.0

// conventionLines state the convention of every file WriteTouchstone writes.
var conventionLines = []string{
	"S-parameters of a normalised N+2 coupling matrix M (rows: source 0, resonators 1..N, load N+1):",
	"A = Omega*W - j*R - j*Delta + M, Omega = (f0/bw)(f/f0 - f0/f), W = diag(0,1,..,1,0), R = diag(1,0,..,0,1),",
	"Delta_ii = f0/(bw*Q0_i); S21 = S12 = -2j[A^-1](N+1,0), S11 = -1 - 2j[A^-1](0,0), S22 = -1 - 2j[A^-1](N+1,N+1).",
	"Data (Touchstone 1.1, RI): frequency in Hz, then S11 S21 S12 S22 (two-port order N11 N21 N12 N22) as real, imaginary pairs.",
}

// WriteTouchstone writes pts as a Touchstone version 1.1 two-port file
// (.s2p) to w through touchstone.Write: the comment lines (each prefixed
// "! "), the statement of the S-parameter convention, the option line
// "# HZ S RI R 50", then one line per point with the frequency in hertz and
// the pairs S11 S21 S12 S22 as real and imaginary parts (the two-port order
// N11 N21 N12 N22 of Touchstone 1.1). RI is used rather than dB/angle so
// that a zero of S21 (a transmission zero hit exactly) is written exactly.
//
// The frequencies must be strictly ascending and every value finite;
// comment lines must not contain line breaks. Each frequency is written in
// the shortest form that reads back as exactly the same float64 (at most 17
// significant digits, strconv's round-trip formatting), so that the data
// belong to the frequency as printed: a narrow filter's response changes
// by many parts in 1e12 between two frequencies 1e-12 apart. The
// S-parameters are written with 12 significant digits.
func WriteTouchstone(w io.Writer, pts []Point, comments []string) error {
	d := &touchstone.Data{
		Ports:    2,
		Z0:       []float64{ReferenceImpedance, ReferenceImpedance},
		Freq:     make([]float64, len(pts)),
		S:        make([][]complex128, 4),
		Comments: append(append([]string(nil), comments...), conventionLines...),
	}
	for i := range d.S {
		d.S[i] = make([]complex128, len(pts))
	}
	for k, p := range pts {
		d.Freq[k] = p.F
		d.S[0][k], d.S[1][k], d.S[2][k], d.S[3][k] = p.S11, p.S21, p.S21, p.S22 // reciprocal: S12 = S21
	}
	if err := touchstone.Write(w, d); err != nil {
		return fmt.Errorf("filter: %w", err)
	}
	return nil
}

// Summary returns a few lines describing the design, for file headers and
// logs: family, order, centre frequency, bandwidth, return loss and ripple,
// transmission zeros (normalised and in hertz), external Q and main-line
// couplings.
func (d *Design) Summary() []string {
	s := d.Spec
	g := func(x float64) string { return strconv.FormatFloat(x, 'g', 8, 64) }
	lines := []string{
		fmt.Sprintf("cylcav filter design: %s, order %d, f0 = %s Hz, bw = %s Hz (fractional %s)",
			s.Family, s.Order, g(s.F0), g(s.BW), g(d.FBW)),
	}
	if s.Family == Chebyshev {
		lines = append(lines, fmt.Sprintf("return loss %s dB, ripple %s dB (lossless prototype)", g(s.ReturnLoss), g(s.Ripple)))
	}
	if len(d.Zeros) > 0 {
		zs := make([]string, len(d.Zeros))
		for i, z := range d.Zeros {
			zs[i] = fmt.Sprintf("%s (%s Hz)", g(z), g(BandpassFrequency(z, s.F0, s.BW)))
		}
		lines = append(lines, "transmission zeros, normalised: "+strings.Join(zs, ", "))
	}
	ks := make([]string, len(d.K))
	for i, k := range d.K {
		ks[i] = g(k)
	}
	lines = append(lines, fmt.Sprintf("Qext in %s, out %s; main-line k: %s", g(d.QextIn), g(d.QextOut), strings.Join(ks, " ")))
	return lines
}
