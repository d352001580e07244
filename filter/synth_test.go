package filter

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// Invented test scenario: a filter at 10 GHz, 100 MHz wide; normalised
// results do not depend on it.
const (
	tf0 = 10e9
	tbw = 100e6
)

// matTol bounds the difference between two computations of the same
// normalised response or matrix: the synthesis reproduces its polynomials to
// about 1e-13 (N <= 30), so 1e-11 leaves two orders of margin.
const matTol = 1e-11

// randomSpec draws a Chebyshev specification: order 1..12, return loss
// 10..30 dB, up to N zeros (non-canonical or fully canonical).
func randomSpec(rng *rand.Rand) Spec {
	n := 1 + rng.IntN(12)
	nz := rng.IntN(n + 1)
	return Spec{F0: tf0, BW: tbw, Order: n, ReturnLoss: 10 + 20*rng.Float64(), Zeros: randomZeros(rng, nz)}
}

// omegaResponse evaluates a normalised matrix at lowpass frequencies.
func omegaResponse(m mat.Matrix, ws []float64, loss []float64) (s11, s21, s22 []complex128) {
	ev := newEvaluator(m, loss)
	for _, w := range ws {
		a, b, c, _ := ev.at(w)
		s11 = append(s11, a)
		s21 = append(s21, b)
		s22 = append(s22, c)
	}
	return
}

func testOmegas(rng *rand.Rand, k int) []float64 {
	ws := make([]float64, k)
	for i := range ws {
		ws[i] = -4 + 8*rng.Float64()
	}
	return ws
}

// TestMatrixMatchesPolynomials: the transversal and the folded matrices
// reproduce S11 = F/(EpsR E) and S21 = P/(Eps E) (complex values, signs
// included), and S22 = S11 (Cameron's convention for P).
func TestMatrixMatchesPolynomials(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for trial := 0; trial < 200; trial++ {
		sp := randomSpec(rng)
		d, err := Synthesize(sp)
		if err != nil {
			t.Fatalf("Synthesize(%+v): %v", sp, err)
		}
		ws := testOmegas(rng, 20)
		for _, m := range []*mat.Dense{d.Transversal, d.Folded} {
			s11, s21, s22 := omegaResponse(m, ws, nil)
			for i, w := range ws {
				p11, p21 := d.polyS(w)
				if cmplx.Abs(s11[i]-p11) > matTol || cmplx.Abs(s21[i]-p21) > matTol || cmplx.Abs(s22[i]-p11) > matTol {
					t.Fatalf("order %d zeros %v at Omega %v: matrix S11, S21, S22 = %v, %v, %v; want %v, %v, %v",
						sp.Order, sp.Zeros, w, s11[i], s21[i], s22[i], p11, p21, p11)
				}
			}
		}
	}
}

// TestLossless: |S11|^2 + |S21|^2 = 1 and S11 S21* + S21 S22* = 0 for the
// lossless networks (energy conservation and unitarity of S, a physical law
// independent of the synthesis), on random designs up to MaxOrder.
func TestLossless(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 14))
	for trial := 0; trial < 100; trial++ {
		sp := randomSpec(rng)
		if trial%10 == 0 {
			sp.Order = 13 + rng.IntN(MaxOrder-12)
			sp.Zeros = randomZeros(rng, rng.IntN(sp.Order+1))
		}
		d, err := Synthesize(sp)
		if err != nil {
			t.Fatalf("Synthesize(%+v): %v", sp, err)
		}
		ws := testOmegas(rng, 30)
		s11, s21, s22 := omegaResponse(d.Folded, ws, nil)
		for i, w := range ws {
			p := sq(s11[i]) + sq(s21[i])
			o := s11[i]*cmplx.Conj(s21[i]) + s21[i]*cmplx.Conj(s22[i])
			if math.Abs(p-1) > matTol || cmplx.Abs(o) > matTol {
				t.Errorf("order %d zeros %v at Omega %v: |S11|^2+|S21|^2 = %v, S11 S21* + S21 S22* = %v; want 1, 0", sp.Order, sp.Zeros, w, p, o)
			}
		}
	}
}

func sq(z complex128) float64 { return real(z)*real(z) + imag(z)*imag(z) }

// TestEqualRipple: the lossless return loss equals the specification at
// every ripple peak, and the passband has N reflection zeros. The peaks are
// located on the folded-matrix response itself by a scan and golden-section
// search, not from the synthesis' own ripple-peak formula.
func TestEqualRipple(t *testing.T) {
	// rippleTol: golden-section search to 1e-9 in Omega on a smooth maximum
	// leaves an error of order 1e-18 in |S11|; 1e-8 dB covers the matrix
	// rounding.
	const rippleTol = 1e-8
	rng := rand.New(rand.NewPCG(15, 16))
	for trial := 0; trial < 60; trial++ {
		sp := randomSpec(rng)
		if sp.Order < 2 {
			continue
		}
		d, err := Synthesize(sp)
		if err != nil {
			t.Fatal(err)
		}
		ev := newEvaluator(d.Folded, nil)
		mag := func(w float64) float64 { s11, _, _, _ := ev.at(w); return cmplx.Abs(s11) }
		const m = 4000
		var peaks []float64
		minima := 0
		prev2, prev := mag(-1), mag(-1+2.0/m)
		for i := 2; i <= m; i++ {
			w := -1 + 2*float64(i)/m
			cur := mag(w)
			if prev > prev2 && prev >= cur {
				peaks = append(peaks, golden(func(x float64) float64 { return -mag(x) }, w-4.0/m, w))
			}
			if prev < prev2 && prev <= cur {
				minima++
			}
			prev2, prev = prev, cur
		}
		if len(peaks) != sp.Order-1 || minima != sp.Order {
			t.Errorf("order %d zeros %v: %d interior ripple peaks and %d minima of |S11|, want %d and %d", sp.Order, sp.Zeros, len(peaks), minima, sp.Order-1, sp.Order)
			continue
		}
		peaks = append(peaks, -1, 1)
		for _, w := range peaks {
			rl := -20 * math.Log10(mag(w))
			if math.Abs(rl-d.Spec.ReturnLoss) > rippleTol {
				t.Errorf("order %d zeros %v: return loss at ripple peak Omega = %v is %.12f dB, want %.12f dB", sp.Order, sp.Zeros, w, rl, d.Spec.ReturnLoss)
			}
		}
	}
}

// golden minimises f on [a, b] by golden-section search to 1e-12.
func golden(f func(float64) float64, a, b float64) float64 {
	r := (math.Sqrt(5) - 1) / 2
	c, d := b-r*(b-a), a+r*(b-a)
	fc, fd := f(c), f(d)
	for b-a > 1e-12 {
		if fc < fd {
			b, d, fd = d, c, fc
			c = b - r*(b-a)
			fc = f(c)
		} else {
			a, c, fc = c, d, fd
			d = a + r*(b-a)
			fd = f(d)
		}
	}
	return (a + b) / 2
}

// TestTransmissionZeros: |S21| = 0 at every prescribed zero, evaluated
// through the bandpass mapping at the zero's frequency in hertz.
func TestTransmissionZeros(t *testing.T) {
	// tzTol: mapping to hertz and back moves Omega by ~1e-16 relative; the
	// slope of S21 near a zero is O(1).
	const tzTol = 1e-10
	rng := rand.New(rand.NewPCG(17, 18))
	for trial := 0; trial < 100; trial++ {
		sp := randomSpec(rng)
		d, err := Synthesize(sp)
		if err != nil {
			t.Fatal(err)
		}
		fs := make([]float64, len(d.Zeros))
		for i, z := range d.Zeros {
			fs[i] = BandpassFrequency(z, tf0, tbw)
		}
		pts, err := d.Response(fs, nil)
		if err != nil {
			t.Fatal(err)
		}
		for i, p := range pts {
			if a := cmplx.Abs(p.S21); a > tzTol {
				t.Errorf("order %d zeros %v: |S21| at zero %v (%v Hz) = %v, want 0", sp.Order, sp.Zeros, d.Zeros[i], p.F, a)
			}
		}
	}
}

// TestFoldedPattern: the raw output of the rotation sequence has no entry
// outside the folded pattern (to 1e-10 of the largest entry), and keeps the
// transversal response.
func TestFoldedPattern(t *testing.T) {
	const patternTol = 1e-10
	rng := rand.New(rand.NewPCG(19, 20))
	for trial := 0; trial < 200; trial++ {
		sp := randomSpec(rng)
		if trial%20 == 0 {
			sp.Order = 13 + rng.IntN(MaxOrder-12)
			sp.Zeros = randomZeros(rng, rng.IntN(sp.Order+1))
		}
		d, err := Synthesize(sp)
		if err != nil {
			t.Fatal(err)
		}
		n := sp.Order
		m := make([][]float64, n+2)
		scale := 0.0
		for i := range m {
			m[i] = mat.Row(nil, i, d.Transversal)
			for _, v := range m[i] {
				scale = math.Max(scale, math.Abs(v))
			}
		}
		fold(m)
		for i := range m {
			for j := range m {
				if !InFoldedPattern(n, i, j) && math.Abs(m[i][j]) > patternTol*scale {
					t.Errorf("order %d zeros %v: folded entry (%d,%d) = %v, want 0", n, sp.Zeros, i, j, m[i][j])
				}
			}
		}
		// The cross couplings the zero count rules out are absent too:
		// S-L only when canonical, 1-L only with N-1 or N zeros.
		nz := len(sp.Zeros)
		if nz < n && math.Abs(d.Folded.At(0, n+1)) > patternTol*scale {
			t.Errorf("order %d with %d zeros: M_SL = %v, want 0", n, nz, d.Folded.At(0, n+1))
		}
		if nz < n-1 && n > 1 && math.Abs(d.Folded.At(1, n+1)) > patternTol*scale {
			t.Errorf("order %d with %d zeros: M_1L = %v, want 0", n, nz, d.Folded.At(1, n+1))
		}
	}
}

// TestSymmetricResponse: zeros placed symmetrically about Omega = 0 give a
// folded matrix that couples only rows of opposite parity, M_ij = 0 for
// i + j even: a zero diagonal (synchronous tuning) and, for even N, no
// diagonal cross couplings (i + j = N+2), for odd N no couplings across
// the fold (i + j = N+1). Derived: with D = diag((-1)^i), a matrix with
// D M D = -M gives |S21(-Omega)| = |S21(Omega)|, so a symmetric response
// has such a realisation (Cameron 1999 shows the even-N case); the test
// checks that the reduction finds it.
func TestSymmetricResponse(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	for trial := 0; trial < 50; trial++ {
		n := 2 + rng.IntN(15)
		var z []float64
		for k := 0; k < rng.IntN(n/2+1); k++ {
			v := 1.05 + 3*rng.Float64()
			z = append(z, v, -v)
		}
		if len(z) > n {
			z = z[:n-n%2]
		}
		d, err := Synthesize(Spec{F0: tf0, BW: tbw, Order: n, ReturnLoss: 15 + 10*rng.Float64(), Zeros: z})
		if err != nil {
			t.Fatal(err)
		}
		for i := 0; i < n+2; i++ {
			for j := i; j < n+2; j++ {
				if (i+j)%2 == 0 && math.Abs(d.Folded.At(i, j)) > matTol {
					t.Errorf("order %d zeros %v: M(%d,%d) = %v, want 0 for a symmetric response", n, z, i, j, d.Folded.At(i, j))
				}
			}
		}
	}
}

// TestAllPoleMatchesPrototype: the whole polynomial route (Cameron's
// function without zeros, transversal residues, rotations) gives exactly
// the chain matrix of the MYJ element values, and K, Qext equal the
// Hong & Lancaster design values from G; the same for Butterworth.
func TestAllPoleMatchesPrototype(t *testing.T) {
	for _, fam := range []Family{Chebyshev, Butterworth} {
		for n := 1; n <= MaxOrder; n++ {
			sp := Spec{F0: tf0, BW: tbw, Order: n, Family: fam}
			if fam == Chebyshev {
				sp.Ripple = 0.1
			}
			d, err := Synthesize(sp)
			if err != nil {
				t.Fatal(err)
			}
			ap, _ := AllPoleMatrix(d.G)
			for i := 0; i < n+2; i++ {
				for j := 0; j < n+2; j++ {
					if math.Abs(ap.At(i, j)-d.Folded.At(i, j)) > matTol {
						t.Errorf("%v order %d: folded M(%d,%d) = %v, want %v (AllPoleMatrix)", fam, n, i, j, d.Folded.At(i, j), ap.At(i, j))
					}
				}
			}
			k, qi, qo, err := Couplings(d.G, d.FBW)
			if err != nil {
				t.Fatal(err)
			}
			for i := range k {
				if !close(k[i], d.K[i], matTol) {
					t.Errorf("%v order %d: K[%d] = %v, want %v (Couplings)", fam, n, i, d.K[i], k[i])
				}
			}
			if !close(qi, d.QextIn, matTol) || !close(qo, d.QextOut, matTol) {
				t.Errorf("%v order %d: Qext = %v, %v; want %v, %v", fam, n, d.QextIn, d.QextOut, qi, qo)
			}
		}
	}
}

// TestPolesScipy compares the poles (roots of E) of the classical Chebyshev
// design with scipy.signal.cheby1 (SciPy 1.10.1, cheby1_poles.tsv).
func TestPolesScipy(t *testing.T) {
	// poleTol: scipy's closed-form poles and ours agree to rounding.
	const poleTol = 1e-12
	want := map[ellipKey][]complex128{}
	for _, r := range readTSV(t, "cheby1_poles.tsv") {
		k := ellipKey{atoi(t, r[0]), atof(t, r[1]), 0}
		want[k] = append(want[k], complex(atof(t, r[2]), atof(t, r[3])))
	}
	for k, w := range want {
		d, err := Synthesize(Spec{F0: tf0, BW: tbw, Order: k.n, Ripple: k.rp})
		if err != nil {
			t.Fatal(err)
		}
		comparePoles(t, "cheby1", k, d.Poles, w, poleTol)
	}
}

func comparePoles(t *testing.T, what string, k ellipKey, got, want []complex128, tol float64) {
	t.Helper()
	if len(got) != len(want) {
		t.Errorf("%s %v: %d poles, want %d", what, k, len(got), len(want))
		return
	}
	used := make([]bool, len(want))
	for _, g := range got {
		best, bi := math.Inf(1), -1
		for i, w := range want {
			if d := cmplx.Abs(g - w); !used[i] && d < best {
				best, bi = d, i
			}
		}
		used[bi] = true
		if best > tol*math.Max(1, cmplx.Abs(g)) {
			t.Errorf("%s %v: pole %v, nearest scipy pole %v (distance %.2g)", what, k, g, want[bi], best)
		}
	}
}

// TestEllipticScipy: a generalised Chebyshev design whose transmission
// zeros are those of scipy.signal.ellip (N-1 finite zeros for odd N, N for
// even N, i.e. fully canonical) is that elliptic filter: same poles and the
// same |S21|^2 as scipy's freqs_zpk (SciPy 1.10.1, ellip_zpk.tsv, mag.tsv).
func TestEllipticScipy(t *testing.T) {
	// ellipTol: scipy evaluates the elliptic functions iteratively; its
	// zeros and poles agree with ours to about 1e-12.
	const ellipTol = 1e-10
	zeros := ellipZeros(t)
	poles := map[ellipKey][]complex128{}
	for _, r := range readTSV(t, "ellip_zpk.tsv") {
		if r[3] == "p" {
			k := ellipKey{atoi(t, r[0]), atof(t, r[1]), atof(t, r[2])}
			poles[k] = append(poles[k], complex(atof(t, r[4]), atof(t, r[5])))
		}
	}
	designs := map[ellipKey]*Design{}
	for k, z := range zeros {
		d, err := Synthesize(Spec{F0: tf0, BW: tbw, Order: k.n, Ripple: k.rp, Zeros: z})
		if err != nil {
			t.Fatalf("elliptic %v: %v", k, err)
		}
		designs[k] = d
		comparePoles(t, "ellip", k, d.Poles, poles[k], ellipTol)
		if canonical := len(z) == k.n; canonical {
			// Even-order elliptic filters keep the stopband minimum rs at
			// infinity, carried by the source-load coupling alone.
			_, s21, _ := omegaResponse(d.Folded, []float64{1e9}, nil)
			if got := -20 * math.Log10(cmplx.Abs(s21[0])); math.Abs(got-k.rs) > 1e-6 {
				t.Errorf("ellip %v: attenuation at infinity = %.9f dB, want rs = %v dB (scipy's design value)", k, got, k.rs)
			}
		} else if d.Folded.At(0, k.n+1) != 0 {
			t.Errorf("ellip %v: %d zeros, M_SL = %v, want 0", k, len(z), d.Folded.At(0, k.n+1))
		}
	}
	for _, r := range readTSV(t, "mag.tsv") {
		if r[0] != "ellip" {
			continue
		}
		k := ellipKey{atoi(t, r[1]), atof(t, r[2]), atof(t, r[3])}
		w, m2 := atof(t, r[4]), atof(t, r[5])
		_, s21, _ := omegaResponse(designs[k].Folded, []float64{w}, nil)
		if got := sq(s21[0]); math.Abs(got-m2) > ellipTol {
			t.Errorf("ellip %v at w = %v: |S21|^2 = %.15g, want %.15g (scipy freqs_zpk)", k, w, got, m2)
		}
	}
}

// TestCameronFourTwo is the (4-2) asymmetric example of Cameron, Kudsia &
// Mansour (2007, ch. 6-8) and Cameron (2003): order 4, 22 dB return loss,
// transmission zeros at s = +j1.3217 and +j1.8082.
func TestCameronFourTwo(t *testing.T) {
	d, err := Synthesize(Spec{F0: tf0, BW: tbw, Order: 4, ReturnLoss: 22, Zeros: []float64{1.3217, 1.8082}})
	if err != nil {
		t.Fatal(err)
	}
	// eps = 1.1548 is printed with the example: RECALLED FROM MEMORY, four
	// decimals. epsTol: half a unit of the fourth decimal plus the effect
	// of the zeros being printed to four decimals, which moves eps by up to
	// 1.05e-4 (perturbation of the zeros by +-5e-5).
	const epsTol = 0.5e-4 + 1.05e-4
	if math.Abs(d.Eps-1.1548) > epsTol {
		t.Errorf("Eps = %.6f, want 1.1548 (CKM (4-2) example, recalled from memory)", d.Eps)
	}
	// P(s) = j (s^2 - j3.1299 s - 2.3899) up to sign: its coefficients
	// are sums and products of the zeros (N - nz = 2 even, so times j).
	p := d.P
	sgn := imag(p[2])
	if math.Abs(math.Abs(sgn)-1) > 1e-15 || !close(real(p[1])*sgn, 3.1299, 1e-15) || !close(imag(p[0])*sgn, -1.3217*1.8082, 1e-15) {
		t.Errorf("P = %v, want +-j(s^2 - j3.1299 s - 2.3899)", p)
	}
	if d.EpsR != 1 || d.Folded.At(0, 5) != 0 {
		t.Errorf("EpsR = %v, M_SL = %v; want 1, 0 (2 zeros < N)", d.EpsR, d.Folded.At(0, 5))
	}
}

// TestHongLancasterExample is the five-pole hairpin design example of
// Hong & Lancaster (2001, ch. 5): Chebyshev 0.1 dB ripple, FBW = 0.2, with
// Qe1 = Qen = 5.734, M12 = M45 = 0.159, M23 = M34 = 0.122 as printed
// (RECALLED FROM MEMORY). The design equations are those of their sec. 8.1.
func TestHongLancasterExample(t *testing.T) {
	g, err := ChebyshevG(5, 0.1)
	if err != nil {
		t.Fatal(err)
	}
	k, qi, qo, err := Couplings(g, 0.2)
	if err != nil {
		t.Fatal(err)
	}
	// Printed to three decimals; the printed g values behind them carry
	// up to 1e-4 of their own rounding.
	const hlTol = 0.6e-3
	want := []float64{0.159, 0.122, 0.122, 0.159}
	for i := range want {
		if math.Abs(k[i]-want[i]) > hlTol {
			t.Errorf("Couplings(0.1 dB, N=5, FBW 0.2): k[%d] = %.5f, want %.3f (Hong & Lancaster, recalled from memory)", i, k[i], want[i])
		}
	}
	if math.Abs(qi-5.734) > hlTol || math.Abs(qo-5.734) > hlTol {
		t.Errorf("Couplings: Qext = %.5f, %.5f; want 5.734 (Hong & Lancaster, recalled from memory)", qi, qo)
	}
}

// TestMinOrderWithZeros: with transmission zeros the chosen order meets the
// rejections and the order below does not, judged on the synthesised
// matrix response.
func TestMinOrderWithZeros(t *testing.T) {
	sp := Spec{F0: tf0, BW: tbw, ReturnLoss: 20, Zeros: []float64{1.4, -1.8},
		Rejections: []Rejection{{F: BandpassFrequency(1.35, tf0, tbw), Attenuation: 45}, {F: BandpassFrequency(-2.5, tf0, tbw), Attenuation: 40}}}
	n, err := sp.MinOrder()
	if err != nil {
		t.Fatal(err)
	}
	rej := func(order int) (ok bool) {
		s := sp
		s.Order = order
		d, err := Synthesize(s)
		if err != nil {
			t.Fatal(err)
		}
		cs, err := d.Check(nil, nil)
		if err != nil {
			t.Fatal(err)
		}
		ok = true
		for _, c := range cs {
			ok = ok && c.Pass
		}
		return ok
	}
	if !rej(n) || rej(n-1) {
		t.Errorf("MinOrder = %d: passes %v at N, %v at N-1; want true, false", n, rej(n), rej(n-1))
	}
	d, err := Synthesize(sp)
	if err != nil || d.Order() != n {
		t.Errorf("Synthesize with Order 0 chose %v (err %v), want %d", d, err, n)
	}
	// Without zeros MinOrder is the closed form.
	sp.Zeros = nil
	sp.Rejections = sp.Rejections[:1]
	n, _ = sp.MinOrder()
	want, _ := ChebyshevOrder(1.35, 45, RippleFromReturnLoss(20))
	if n != want {
		t.Errorf("MinOrder without zeros = %d, want %d (ChebyshevOrder)", n, want)
	}
}

func TestSpecErrors(t *testing.T) {
	ok := Spec{F0: 1e9, BW: 10e6, Order: 4}
	mod := func(f func(*Spec)) Spec { s := ok; f(&s); return s }
	for _, c := range []struct {
		spec Spec
		want string
	}{
		{mod(func(s *Spec) { s.BW = 1e9 }), "bandwidth must be > 0 Hz and < f0 = 1e+09 Hz, got 1e+09 Hz"},
		{mod(func(s *Spec) { s.BW = 2e9 }), "bandwidth must be > 0 Hz and < f0"},
		{mod(func(s *Spec) { s.BW = -1 }), "bandwidth must be > 0 Hz"},
		{mod(func(s *Spec) { s.F0 = 0 }), "centre frequency must be > 0 Hz"},
		{mod(func(s *Spec) { s.Order = 31 }), "order must be in 1..30, got 31"},
		{mod(func(s *Spec) { s.Order = -2 }), "order must be in 1..30, got -2"},
		{mod(func(s *Spec) { s.Zeros = []float64{1.5, -0.5} }), "transmission zero 2 at normalised frequency -0.5 lies in the passband; zeros need |Omega| > 1"},
		{mod(func(s *Spec) { s.Zeros = []float64{1} }), "lies in the passband"},
		{mod(func(s *Spec) { s.Zeros = []float64{2, 3, 4, 5, 6} }), "5 finite transmission zeros for order 4; at most N = 4"},
		{mod(func(s *Spec) { s.Zeros = []float64{math.Inf(1)} }), "must be finite"},
		{mod(func(s *Spec) { s.Ripple = 5 }), "ripple must be in (0, 3] dB, got 5 dB"},
		{mod(func(s *Spec) { s.ReturnLoss = 2 }), "return loss must be in [3.0206, 80] dB, got 2 dB"},
		{mod(func(s *Spec) { s.ReturnLoss = 20; s.Ripple = 0.1 }), "not both"},
		{mod(func(s *Spec) { s.Family = Butterworth; s.Ripple = 0.1 }), "Butterworth"},
		{mod(func(s *Spec) { s.Family = Butterworth; s.Zeros = []float64{2} }), "need the Chebyshev family"},
		{mod(func(s *Spec) { s.Family = 7 }), "unknown response family 7"},
		{mod(func(s *Spec) { s.Order = 0 }), "give an order"},
		{mod(func(s *Spec) { s.Rejections = []Rejection{{F: 1e9, Attenuation: 30}} }), "rejection 1: frequency 1e+09 Hz lies in the passband"},
		{mod(func(s *Spec) { s.Rejections = []Rejection{{F: 2e9, Attenuation: -3}} }), "attenuation must be > 0 dB"},
		{mod(func(s *Spec) { s.Order = 0; s.Rejections = []Rejection{{F: 1.0001e9 + 5e6, Attenuation: 200}} }), "need an order above the maximum 30"},
	} {
		_, err := Synthesize(c.spec)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("Synthesize(%+v) error = %v, want one containing %q", c.spec, err, c.want)
		}
	}
}

// TestSpecDefaults: the zero values give a 20 dB Chebyshev design and the
// input spec is not modified.
func TestSpecDefaults(t *testing.T) {
	z := []float64{2, -3}
	sp := Spec{F0: 1e9, BW: 10e6, Order: 4, Zeros: z}
	d, err := Synthesize(sp)
	if err != nil {
		t.Fatal(err)
	}
	if d.Spec.ReturnLoss != DefaultReturnLoss || !close(d.Spec.Ripple, RippleFromReturnLoss(DefaultReturnLoss), 1e-15) || d.Spec.Family != Chebyshev {
		t.Errorf("defaults: %+v", d.Spec)
	}
	d.Zeros[0] = 99
	if z[0] != 2 || !slices.Equal(sp.Zeros, []float64{2, -3}) {
		t.Errorf("Synthesize aliases the caller's zeros: %v", z)
	}
	if Chebyshev.String() != "chebyshev" || Butterworth.String() != "butterworth" || Family(9).String() != "Family(9)" {
		t.Errorf("Family.String: %v %v %v", Chebyshev, Butterworth, Family(9))
	}
}
