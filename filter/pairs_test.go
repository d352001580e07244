package filter

import (
	"math"
	"math/cmplx"
	"os"
	"strconv"
	"strings"
	"testing"
)

// s21At evaluates the lossless S21 = -2j [A^-1]_{N+1,0} of the matrix m at
// a complex normalised frequency omega, by Gaussian elimination with
// partial pivoting written here (an independent route from the package's
// evaluator, which takes real frequencies only).
func s21At(m interface{ At(i, j int) float64 }, n int, omega complex128) complex128 {
	sz := n + 2
	a := make([][]complex128, sz)
	for i := range a {
		a[i] = make([]complex128, sz+1)
		for j := 0; j < sz; j++ {
			a[i][j] = complex(m.At(i, j), 0)
		}
		if i >= 1 && i <= n {
			a[i][i] += omega
		}
	}
	a[0][0] -= 1i
	a[sz-1][sz-1] -= 1i
	a[0][sz] = 1 // solve A x = e_0
	for c := 0; c < sz; c++ {
		p := c
		for r := c + 1; r < sz; r++ {
			if cmplx.Abs(a[r][c]) > cmplx.Abs(a[p][c]) {
				p = r
			}
		}
		a[c], a[p] = a[p], a[c]
		for r := c + 1; r < sz; r++ {
			f := a[r][c] / a[c][c]
			for j := c; j <= sz; j++ {
				a[r][j] -= f * a[c][j]
			}
		}
	}
	x := make([]complex128, sz)
	for r := sz - 1; r >= 0; r-- {
		s := a[r][sz]
		for j := r + 1; j < sz; j++ {
			s -= a[r][j] * x[j]
		}
		x[r] = s / a[r][r]
	}
	return -2i * x[sz-1]
}

// TestRealAxisPairs: designs with real-axis zero pairs have S21 = 0 at
// s = -+sigma (Omega = +-j sigma, relative to |S21| nearby below 1e-10),
// and at the real zeros; their lossless return loss touches the
// specified value at every ripple peak (equiripple to 1e-9 dB) and meets it
// by Design.Check; and a pair flattens the passband group delay against the
// same design without it (the purpose of such zeros, Cameron, Kudsia &
// Mansour 2007, ch. 6, recalled).
func TestRealAxisPairs(t *testing.T) {
	const f0, bw = 10e9, 100e6
	for _, c := range []struct {
		n            int
		zeros, pairs []float64
	}{
		{6, nil, []float64{1.3}},
		{8, []float64{-1.6, 1.6}, []float64{1.1}},
		{8, []float64{1.5}, []float64{0.9}},
		{10, []float64{-1.4, 1.4}, []float64{0.8, 1.6}},
	} {
		spec := Spec{F0: f0, BW: bw, Order: c.n, ReturnLoss: 22, Zeros: c.zeros, RealPairs: c.pairs}
		d, err := Synthesize(spec)
		if err != nil {
			t.Fatalf("%+v: %v", c, err)
		}
		n := c.n
		for _, sg := range c.pairs {
			for _, w := range []complex128{complex(0, sg), complex(0, -sg)} {
				at := cmplx.Abs(s21At(d.Folded, n, w))
				near := cmplx.Abs(s21At(d.Folded, n, w+complex(0.3, 0)))
				if at > 1e-10*near {
					t.Errorf("N=%d pair %g: |S21(Omega=%v)| = %g, nearby %g", n, sg, w, at, near)
				}
			}
		}
		for _, z := range c.zeros {
			if at := cmplx.Abs(s21At(d.Folded, n, complex(z, 0))); at > 1e-10 {
				t.Errorf("N=%d: |S21| = %g at the zero %g", n, at, z)
			}
		}
		pk := ripplePeaks(n, c.zeros, c.pairs...)
		pts, err := d.Response(func() []float64 {
			var f []float64
			for _, w := range pk {
				f = append(f, BandpassFrequency(w, f0, bw))
			}
			return f
		}(), nil)
		if err != nil {
			t.Fatal(err)
		}
		for _, p := range pts {
			if math.Abs(p.ReturnLoss()-22) > 1e-9 {
				t.Errorf("N=%d pairs %v: return loss %.12g dB at the ripple peak Omega = %g, want 22", n, c.pairs, p.ReturnLoss(), p.Omega)
			}
		}
		checks, err := d.Check(nil, nil)
		if err != nil || Overall(checks) != Met {
			t.Errorf("N=%d pairs %v: checks fail (%v)", n, c.pairs, err)
		}
		g1, err := d.Delay(nil)
		if err != nil {
			t.Fatal(err)
		}
		spec.RealPairs = nil
		d0, err := Synthesize(spec)
		if err != nil {
			t.Fatal(err)
		}
		g0, _ := d0.Delay(nil)
		t.Logf("N=%d zeros %v pairs %v: delay variation %.4g ns (without the pairs %.4g ns)", n, c.zeros, c.pairs, g1.Variation()*1e9, g0.Variation()*1e9)
		if g1.Variation() >= g0.Variation() {
			t.Errorf("N=%d: pairs %v do not flatten the delay: %g vs %g s", n, c.pairs, g1.Variation(), g0.Variation())
		}
	}
}

// TestThetaPairMonotonic: the phase contribution of a real-axis pair falls
// monotonically from 2 pi to 0 across the passband (the property that
// lets the reflection zeros be found by bisection), and ln|C_N| from the
// phase form and the arccosh form meet at the band edge.
func TestThetaPairMonotonic(t *testing.T) {
	for _, sg := range []float64{0.2, 0.9, 2, 10} {
		prev := math.Inf(1)
		for i := 0; i <= 2000; i++ {
			w := -1 + 2*float64(i)/2000
			th := theta(2, nil, []float64{sg}, w)
			if th > prev {
				t.Fatalf("sigma %g: theta not decreasing at %g", sg, w)
			}
			prev = th
		}
		if a, b := theta(2, nil, []float64{sg}, -1), theta(2, nil, []float64{sg}, 1); math.Abs(a-2*math.Pi) > 1e-12 || math.Abs(b) > 1e-12 {
			t.Errorf("sigma %g: theta(-1) = %g, theta(1) = %g", sg, a, b)
		}
		in := logAbsC(4, []float64{1.5}, 1-1e-12, sg)
		out := logAbsC(4, []float64{1.5}, 1+1e-12, sg)
		if math.Abs(in-out) > 1e-5 {
			t.Errorf("sigma %g: ln|C| jumps at the band edge: %g vs %g", sg, in, out)
		}
	}
}

// TestRealAxisPairErrors: bad pairs are refused with the range.
func TestRealAxisPairErrors(t *testing.T) {
	for _, s := range []Spec{
		{F0: 1e9, BW: 1e7, Order: 4, RealPairs: []float64{0}},
		{F0: 1e9, BW: 1e7, Order: 4, RealPairs: []float64{1e3}},
		{F0: 1e9, BW: 1e7, Order: 4, Zeros: []float64{2, 3, 4}, RealPairs: []float64{1}},
		{F0: 1e9, BW: 1e7, Order: 4, Family: Butterworth, RealPairs: []float64{1}},
	} {
		if _, err := Synthesize(s); err == nil {
			t.Errorf("Synthesize(%+v): want an error", s)
		}
	}
}

// TestRealAxisPairsMpmath: the insertion loss of designs with real-axis
// pairs, from the prototype formula (chebAttP) and from the synthesised
// coupling matrix (Response), against mpmath at 50 digits evaluating
// Cameron's product form of C_N (testdata/pairs.tsv, made by
// testdata/gen_pairs_mpmath.py, which shares no branch choices with the
// phase form used here). Agreement: 1e-9 dB + 1e-9 relative.
func TestRealAxisPairsMpmath(t *testing.T) {
	data, err := os.ReadFile("testdata/pairs.tsv")
	if err != nil {
		t.Fatal(err)
	}
	const f0, bw = 10e9, 100e6
	designs := map[string]*Design{}
	rows := 0
	for _, line := range strings.Split(string(data), "\n") {
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		f := strings.Split(line, "\t")
		num := func(s string) float64 {
			v, err := strconv.ParseFloat(s, 64)
			if err != nil {
				t.Fatalf("%q: %v", line, err)
			}
			return v
		}
		list := func(s string) []float64 {
			if s == "-" {
				return nil
			}
			var out []float64
			for _, p := range strings.Split(s, ",") {
				out = append(out, num(p))
			}
			return out
		}
		n := int(num(f[1]))
		rl, zeros, pairs, w, want := num(f[2]), list(f[3]), list(f[4]), num(f[5]), num(f[6])
		d := designs[f[0]]
		if d == nil {
			if d, err = Synthesize(Spec{F0: f0, BW: bw, Order: n, ReturnLoss: rl, Zeros: zeros, RealPairs: pairs}); err != nil {
				t.Fatal(err)
			}
			designs[f[0]] = d
		}
		tol := 1e-9 + 1e-9*want
		if got := chebAttP(n, d.Spec.Ripple, zeros, pairs, w); math.Abs(got-want) > tol {
			t.Errorf("%s Omega=%g: prototype IL %.15g dB, mpmath %.15g dB", f[0], w, got, want)
		}
		p, err := d.Response([]float64{BandpassFrequency(w, f0, bw)}, nil)
		if err != nil {
			t.Fatal(err)
		}
		if got := p[0].InsertionLoss(); math.Abs(got-want) > tol {
			t.Errorf("%s Omega=%g: matrix IL %.15g dB, mpmath %.15g dB", f[0], w, got, want)
		}
		rows++
	}
	if rows < 60 {
		t.Fatalf("read only %d rows", rows)
	}
}
