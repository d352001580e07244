package touchstone

import (
	"bufio"
	"fmt"
	"io"
	"strconv"
	"strings"
)

// Write writes d as a Touchstone version 1.1 file to w: the comment lines
// (each prefixed "! "), the option line "# HZ S RI R <Z0>", then one line
// per frequency with the frequency in hertz and the S-parameters as real
// and imaginary parts (for two ports in the order N11 N21 N12 N22 of
// version 1.1). RI is used rather than dB/angle so that a zero (a
// transmission zero hit exactly) is written exactly. Each frequency is
// written in the shortest form that reads back as exactly the same float64
// (strconv's round-trip formatting), so that the data belong to the
// frequency as printed; the S-parameters are written with 12 significant
// digits.
//
// d must pass Validate, every port must have the same reference impedance
// (version 1.1 has one), and comments must not contain line breaks.
func Write(w io.Writer, d *Data) error {
	if err := d.Validate(); err != nil {
		return err
	}
	for _, z := range d.Z0 {
		if z != d.Z0[0] {
			return fmt.Errorf("touchstone: version 1.1 needs one reference impedance for all ports, got %v ohm", d.Z0)
		}
	}
	for i, c := range d.Comments {
		if strings.ContainsAny(c, "\r\n") {
			return fmt.Errorf("touchstone: Touchstone comment %d contains a line break", i+1)
		}
	}
	bw := bufio.NewWriter(w)
	for _, c := range d.Comments {
		fmt.Fprintf(bw, "! %s\n", c)
	}
	fmt.Fprintf(bw, "# HZ S RI R %s\n", strconv.FormatFloat(d.Z0[0], 'g', -1, 64))
	order := []int{0}
	if d.Ports == 2 {
		order = []int{0, 2, 1, 3} // S11 S21 S12 S22
	}
	num := func(x float64) string { return strconv.FormatFloat(x, 'e', 11, 64) }
	for k, f := range d.Freq {
		bw.WriteString(strconv.FormatFloat(f, 'e', -1, 64)) // exact round trip
		for _, idx := range order {
			s := d.S[idx][k]
			bw.WriteByte(' ')
			bw.WriteString(num(real(s)))
			bw.WriteByte(' ')
			bw.WriteString(num(imag(s)))
		}
		bw.WriteByte('\n')
	}
	return bw.Flush()
}
