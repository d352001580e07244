package filter_test

import (
	"fmt"
	"math"
	"strings"

	"cylcav/filter"
)

// round4 formats x with four decimals, without a "-0.0000".
func round4(x float64) string {
	s := fmt.Sprintf("%.4f", x)
	if s == "-0.0000" {
		s = "0.0000"
	}
	return s
}

// An invented scenario: a six-cavity channel filter for a 11.45 GHz
// downlink, 60 MHz wide, 22 dB return loss, with one transmission zero on
// each side of the band (11.395 GHz and 11.52 GHz) to steepen the skirts.
func ExampleSynthesize() {
	const f0, bw = 11.45e9, 60e6
	spec := filter.Spec{
		F0: f0, BW: bw, Order: 6, ReturnLoss: 22,
		Zeros: []float64{
			filter.LowpassOmega(11.395e9, f0, bw),
			filter.LowpassOmega(11.52e9, f0, bw),
		},
	}
	d, err := filter.Synthesize(spec)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("zeros (normalised): %.4f %.4f\n", d.Zeros[0], d.Zeros[1])
	fmt.Printf("Qext in %.2f, out %.2f\n", d.QextIn, d.QextOut)
	fmt.Print("k:")
	for _, k := range d.K {
		fmt.Printf(" %.5f", k)
	}
	fmt.Println()
	fmt.Println("folded coupling matrix (S, 1..6, L):")
	n := d.Order() + 2
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			fmt.Printf("%8s", round4(d.Folded.At(i, j)))
		}
		fmt.Println()
	}
	// Output:
	// zeros (normalised): -1.8378 2.3262
	// Qext in 176.39, out 176.39
	// k: 0.00458 0.00322 0.00335 0.00321 0.00458
	// folded coupling matrix (S, 1..6, L):
	//   0.0000  1.0401  0.0000  0.0000  0.0000  0.0000  0.0000  0.0000
	//   1.0401 -0.0036  0.8743  0.0000  0.0000  0.0000  0.0000  0.0000
	//   0.0000  0.8743 -0.0044  0.6154  0.0000 -0.0634  0.0000  0.0000
	//   0.0000  0.0000  0.6154 -0.0189  0.6397 -0.0592  0.0000  0.0000
	//   0.0000  0.0000  0.0000  0.6397  0.1047  0.6126  0.0000  0.0000
	//   0.0000  0.0000 -0.0634 -0.0592  0.6126 -0.0044  0.8743  0.0000
	//   0.0000  0.0000  0.0000  0.0000  0.0000  0.8743 -0.0036  1.0401
	//   0.0000  0.0000  0.0000  0.0000  0.0000  0.0000  1.0401  0.0000
}

// The MYJ element values of a five-pole 0.1 dB Chebyshev prototype and
// the coupled-resonator values for 20 % bandwidth (the numbers of the
// Hong & Lancaster hairpin example).
func ExampleCouplings() {
	g, _ := filter.ChebyshevG(5, 0.1)
	k, qIn, qOut, _ := filter.Couplings(g, 0.2)
	fmt.Printf("g: %.4f\n", g)
	fmt.Printf("k: %.4f\n", k)
	fmt.Printf("Qext: %.3f %.3f\n", qIn, qOut)
	// Output:
	// g: [1.0000 1.1468 1.3712 1.9750 1.3712 1.1468 1.0000]
	// k: [0.1595 0.1215 0.1215 0.1595]
	// Qext: 5.734 5.734
}

// Choosing the order from a rejection requirement: an invented 3.5 GHz
// filter, 100 MHz wide, 20 dB return loss, that must reject 45 dB at
// 3.62 GHz, with and without a transmission zero at 3.6 GHz.
func ExampleSpec_MinOrder() {
	const f0, bw = 3.5e9, 100e6
	spec := filter.Spec{F0: f0, BW: bw, ReturnLoss: 20,
		Rejections: []filter.Rejection{{F: 3.62e9, Attenuation: 45}}}
	n, _ := spec.MinOrder()
	fmt.Println("all-pole order:", n)
	spec.Zeros = []float64{filter.LowpassOmega(3.6e9, f0, bw)}
	n, _ = spec.MinOrder()
	fmt.Println("order with a zero at 3.6 GHz:", n)
	// Output:
	// all-pole order: 6
	// order with a zero at 3.6 GHz: 5
}

// The response of an invented five-cavity filter at 7.2 GHz, 40 MHz wide,
// with an unloaded Q of 6000 in every cavity, and its specification check.
func ExampleDesign_Check() {
	d, err := filter.Synthesize(filter.Spec{F0: 7.2e9, BW: 40e6, Order: 5, ReturnLoss: 20,
		Rejections: []filter.Rejection{{F: 7.26e9, Attenuation: 40}, {F: 7.15e9, Attenuation: 30}}})
	if err != nil {
		fmt.Println(err)
		return
	}
	q0 := []float64{6000, 6000, 6000, 6000, 6000}
	pts, _ := d.Response([]float64{7.2e9}, q0)
	est, _ := filter.CohnLoss(d.G, d.FBW, q0)
	fmt.Printf("midband loss %.3f dB (Cohn estimate %.3f dB)\n", pts[0].InsertionLoss(), est)
	checks, _ := d.Check(q0, nil)
	for _, c := range checks {
		req := "(info)"
		if !math.IsNaN(c.Required) {
			rel := "<="
			if c.AtLeast {
				rel = ">="
			}
			req = fmt.Sprintf("%s %.2f dB", rel, c.Required)
		}
		at := ""
		if c.F != 0 {
			at = fmt.Sprintf(" from %.2f GHz", c.F/1e9)
		}
		v := c.Verdict.String()
		if c.Info {
			v = "info"
		}
		fmt.Printf("%-30s %-12s %6.2f dB  %s\n", c.Name+at, req, c.Achieved, v)
	}
	fmt.Println("overall:", filter.Overall(checks))
	// The ripple of the design is the requirement and is met; Q0 = 6000 at
	// 0.56 % bandwidth rounds the band edges by 0.65 dB, reported apart.

	// Output:
	// midband loss 0.845 dB (Cohn estimate 0.846 dB)
	// return loss                    >= 20.00 dB   20.00 dB  pass
	// passband ripple                <= 0.04 dB     0.04 dB  pass
	// return loss with losses        (info)        20.04 dB  info
	// passband rounding with losses  (info)         0.65 dB  info
	// rejection from 7.26 GHz        >= 40.00 dB   50.46 dB  pass
	// rejection from 7.15 GHz        >= 30.00 dB   42.34 dB  pass
	// overall: pass
}

// The header of a Touchstone file of an invented two-cavity filter.
func ExampleWriteTouchstone() {
	d, _ := filter.Synthesize(filter.Spec{F0: 1e9, BW: 50e6, Order: 2, ReturnLoss: 20})
	pts, _ := d.Response([]float64{0.95e9, 1e9, 1.05e9}, nil)
	var b strings.Builder
	if err := filter.WriteTouchstone(&b, pts, []string{"invented two-cavity example"}); err != nil {
		fmt.Println(err)
		return
	}
	data := 0
	for _, line := range strings.Split(strings.TrimSpace(b.String()), "\n") {
		if strings.HasPrefix(line, "!") || strings.HasPrefix(line, "#") {
			fmt.Println(line)
		} else {
			data++
		}
	}
	fmt.Println(data, "data lines")
	// Output:
	// ! invented two-cavity example
	// ! S-parameters of a normalised N+2 coupling matrix M (rows: source 0, resonators 1..N, load N+1):
	// ! A = Omega*W - j*R - j*Delta + M, Omega = (f0/bw)(f/f0 - f0/f), W = diag(0,1,..,1,0), R = diag(1,0,..,0,1),
	// ! Delta_ii = f0/(bw*Q0_i); S21 = S12 = -2j[A^-1](N+1,0), S11 = -1 - 2j[A^-1](0,0), S22 = -1 - 2j[A^-1](N+1,N+1).
	// ! Data (Touchstone 1.1, RI): frequency in Hz, then S11 S21 S12 S22 (two-port order N11 N21 N12 N22) as real, imaginary pairs.
	// # HZ S RI R 50
	// 3 data lines
}
