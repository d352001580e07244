package filter

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// ladder computes S11 and S21 of the lowpass prototype ladder g_0..g_{N+1}
// by cascading ABCD matrices (Pozar, Microwave Engineering, sec. 4.4): g_1
// a shunt capacitor, g_2 a series inductor, alternating (MYJ sec. 4.04,
// Fig. 4.04-1), source resistance g_0; g_{N+1} is the load resistance if
// g_N is a shunt capacitor and the load conductance if g_N is a series
// inductor (MYJ sec. 4.04). delta[k-1] adds
// the dissipation of element k, s -> s + delta (the lossy resonator of
// Response). This is an independent route to the all-pole response: no
// coupling matrix, no polynomials.
func ladder(g []float64, omega float64, delta []float64) (s11, s21 complex128) {
	n := len(g) - 2
	a, b, c, d := complex(1, 0), complex(0, 0), complex(0, 0), complex(1, 0)
	for k := 1; k <= n; k++ {
		s := complex(0, omega)
		if delta != nil {
			s += complex(delta[k-1], 0)
		}
		x := s * complex(g[k], 0)
		if k%2 == 1 { // shunt admittance x: [[1,0],[x,1]]
			a += b * x
			c += d * x
		} else { // series impedance x: [[1,x],[0,1]]
			b += a * x
			d += c * x
		}
	}
	rs := g[0]
	rl := g[n+1]
	if n%2 == 0 {
		rl = 1 / g[n+1]
	}
	zs, zl := complex(rs, 0), complex(rl, 0)
	den := a*zl + b + c*zs*zl + d*zs
	s21 = 2 * complex(math.Sqrt(rs*rl), 0) / den
	zin := (a*zl + b) / (c*zl + d)
	s11 = (zin - zs) / (zin + zs)
	return s11, s21
}

// TestLadderMatchesMatrix: the coupling-matrix response of the all-pole
// design equals the ABCD ladder of the same prototype, lossless and with a
// different unloaded Q in every resonator, in |S11|, |S21| and group delay
// (the ladder's delay by a central difference of its phase).
func TestLadderMatchesMatrix(t *testing.T) {
	// gdTol: central difference with h = 1e-5 in Omega has an O(h^2)
	// truncation error, about 1e-9 relative for these smooth responses.
	const gdTol = 1e-7
	rng := rand.New(rand.NewPCG(31, 32))
	for trial := 0; trial < 40; trial++ {
		n := 1 + rng.IntN(14)
		sp := Spec{F0: tf0, BW: tbw, Order: n}
		if trial%4 == 3 {
			sp.Family = Butterworth
		} else {
			sp.ReturnLoss = 10 + 20*rng.Float64()
		}
		d, err := Synthesize(sp)
		if err != nil {
			t.Fatal(err)
		}
		var q0, delta []float64
		if trial%2 == 1 {
			for i := 0; i < n; i++ {
				q := 500 + 20000*rng.Float64()
				q0 = append(q0, q)
				delta = append(delta, tf0/(tbw*q))
			}
		}
		var freqs []float64
		for i := 0; i < 25; i++ {
			freqs = append(freqs, BandpassFrequency(-3+6*rng.Float64(), tf0, tbw))
		}
		pts, err := d.Response(freqs, q0)
		if err != nil {
			t.Fatal(err)
		}
		for _, p := range pts {
			l11, l21 := ladder(d.G, p.Omega, delta)
			if math.Abs(cmplx.Abs(p.S11)-cmplx.Abs(l11)) > matTol || math.Abs(cmplx.Abs(p.S21)-cmplx.Abs(l21)) > matTol {
				t.Errorf("%v N=%d Q0=%v at Omega %v: |S11|, |S21| = %v, %v; want %v, %v (ABCD ladder)", sp.Family, n, q0 != nil, p.Omega,
					cmplx.Abs(p.S11), cmplx.Abs(p.S21), cmplx.Abs(l11), cmplx.Abs(l21))
			}
			const h = 1e-5
			_, lp := ladder(d.G, p.Omega+h, delta)
			_, lm := ladder(d.G, p.Omega-h, delta)
			tauN := -cmplx.Phase(lp/lm) / (2 * h) // -d phase/d Omega
			want := tauN * (1 + (tf0/p.F)*(tf0/p.F)) / tbw / (2 * math.Pi)
			if math.Abs(p.GroupDelay-want) > gdTol*math.Abs(want) {
				t.Errorf("%v N=%d at Omega %v: group delay %v s, want %v s (ladder, central difference)", sp.Family, n, p.Omega, p.GroupDelay, want)
			}
		}
	}
}

// TestLadderScipy: the ladder built from ChebyshevG reproduces
// |H(jw)|^2 of scipy.signal.cheby1 (SciPy 1.10.1, mag.tsv), tying the MYJ
// element values to an outside reference.
func TestLadderScipy(t *testing.T) {
	for _, r := range readTSV(t, "mag.tsv") {
		if r[0] != "cheby1" {
			continue
		}
		n, rp, w, m2 := atoi(t, r[1]), atof(t, r[2]), atof(t, r[4]), atof(t, r[5])
		g, err := ChebyshevG(n, rp)
		if err != nil {
			t.Fatal(err)
		}
		_, s21 := ladder(g, w, nil)
		if got := sq(s21); math.Abs(got-m2) > matTol {
			t.Errorf("ladder(ChebyshevG(%d, %v)) at w = %v: |S21|^2 = %.15g, want %.15g (scipy cheby1)", n, rp, w, got, m2)
		}
	}
}

// TestGroupDelayDifference: the analytic group delay of a design with
// asymmetric zeros and loss equals a central difference of the phase of S21
// computed by Response itself.
func TestGroupDelayDifference(t *testing.T) {
	d, err := Synthesize(Spec{F0: tf0, BW: tbw, Order: 6, ReturnLoss: 23, Zeros: []float64{1.25, 1.6, -2.1}})
	if err != nil {
		t.Fatal(err)
	}
	q0 := []float64{3000, 3500, 4000, 4500, 5000, 8000}
	for _, w := range []float64{-2.5, -1, -0.7, 0, 0.4, 0.99, 1.4, 3} {
		f := BandpassFrequency(w, tf0, tbw)
		h := f * 1e-9
		pts, err := d.Response([]float64{f - h, f, f + h}, q0)
		if err != nil {
			t.Fatal(err)
		}
		want := -cmplx.Phase(pts[2].S21/pts[0].S21) / (2 * h) / (2 * math.Pi)
		if math.Abs(pts[1].GroupDelay-want) > 1e-6*math.Abs(want) {
			t.Errorf("group delay at Omega %v = %v s, want %v s (central difference)", w, pts[1].GroupDelay, want)
		}
	}
}

// TestCohnLoss: the midband insertion loss of the lossy all-pole design
// agrees with Cohn's first-order estimate (Cohn 1959) while the loss is
// small.
func TestCohnLoss(t *testing.T) {
	// cohnTol: Cohn's formula is first order in f0/(bw Q0) and assumes a
	// matched midband; for odd N, or even N with small ripple, and losses
	// below 1 dB, the exact result stays within 1 % (measured here; even
	// N with 0.5 dB ripple, where the midband is a ripple peak, deviates by
	// 10 %, see CohnLoss).
	const cohnTol = 0.01
	for _, c := range []struct {
		n      int
		ripple float64
		fbw    float64
		q0     float64
	}{
		{5, 0.1, 0.01, 5000}, {3, 0.01, 0.02, 8000}, {7, 0.0436, 0.005, 20000}, {4, 0.01, 0.01, 4000},
	} {
		d, err := Synthesize(Spec{F0: 1e9, BW: c.fbw * 1e9, Order: c.n, Ripple: c.ripple})
		if err != nil {
			t.Fatal(err)
		}
		q := make([]float64, c.n)
		for i := range q {
			q[i] = c.q0
		}
		est, err := CohnLoss(d.G, c.fbw, []float64{c.q0})
		if err != nil {
			t.Fatal(err)
		}
		// For even N the lossless midband loss is the ripple itself;
		// Cohn's figure is the dissipation on top of it.
		pts, _ := d.Response([]float64{1e9}, q)
		lossless, _ := d.Response([]float64{1e9}, nil)
		got := pts[0].InsertionLoss() - lossless[0].InsertionLoss()
		if math.Abs(got-est) > cohnTol*est {
			t.Errorf("N=%d %v dB FBW %v Q0 %v: midband dissipation loss %.4f dB, want %.4f dB (Cohn 1959)", c.n, c.ripple, c.fbw, c.q0, got, est)
		}
	}
	if _, err := CohnLoss([]float64{1, 1, 1}, 0.01, []float64{100, 200}); err == nil {
		t.Errorf("CohnLoss with 2 Q values for N = 1: no error")
	}
}

func TestCheck(t *testing.T) {
	sp := Spec{F0: tf0, BW: tbw, Order: 6, ReturnLoss: 22, Zeros: []float64{1.3, -1.7},
		Rejections: []Rejection{{F: BandpassFrequency(1.3, tf0, tbw), Attenuation: 25}, {F: BandpassFrequency(-3, tf0, tbw), Attenuation: 200}}}
	d, err := Synthesize(sp)
	if err != nil {
		t.Fatal(err)
	}
	cs, err := d.Check(nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	if len(cs) != 4 || cs[0].Name != "return loss" || cs[1].Name != "passband ripple" || cs[2].Name != "rejection" {
		t.Fatalf("Check rows: %+v", cs)
	}
	// Lossless: return loss and ripple met exactly (the minimum return
	// loss is the spec value at the ripple peaks), the 25 dB rejection
	// from the zero outwards is met (the lobe beyond it stays above), 200 dB
	// from Omega = -3 outwards is not: beyond the outermost zero the
	// attenuation grows outwards, so its minimum is at Omega = -3.
	if !cs[0].Pass || !close(cs[0].Achieved, 22, 1e-9) || !cs[1].Pass || !close(cs[1].Achieved, RippleFromReturnLoss(22), 1e-9) {
		t.Errorf("lossless passband checks: %+v, %+v", cs[0], cs[1])
	}
	if !cs[2].Pass || cs[3].Pass || cs[3].Verdict != NotMet || cs[3].Required != 200 || cs[3].F != sp.Rejections[1].F {
		t.Errorf("rejection checks: %+v, %+v", cs[2], cs[3])
	}
	want, _ := ChebyshevAttenuation(6, RippleFromReturnLoss(22), sp.Zeros, -3)
	if !close(cs[3].Achieved, want, 1e-9) {
		t.Errorf("rejection from Omega -3 = %v dB, want %v dB (ChebyshevAttenuation at -3)", cs[3].Achieved, want)
	}
	if Overall(cs) != NotMet {
		t.Errorf("Overall = %v, want fail", Overall(cs))
	}
	// With loss the ripple requirement still reads the design (lossless)
	// and passes; the wider spread of the lossy insertion loss is its own
	// information line, and so is the lossy return loss.
	q := []float64{2000, 2000, 2000, 2000, 2000, 2000}
	cl, err := d.Check(q, nil)
	if err != nil {
		t.Fatal(err)
	}
	if len(cl) != 6 || !cl[1].Pass || cl[1].Achieved != cs[1].Achieved {
		t.Fatalf("lossy ripple check %+v, want the lossless %v passing", cl[1], cs[1].Achieved)
	}
	if r := cl[3]; r.Name != "passband rounding with losses" || !r.Info || !math.IsNaN(r.Required) || r.Achieved <= cs[1].Achieved {
		t.Errorf("rounding line %+v, want an Info line above the lossless ripple %v", r, cs[1].Achieved)
	}
	if r := cl[2]; r.Name != "return loss with losses" || !r.Info {
		t.Errorf("lossy return-loss line %+v", r)
	}
	// Butterworth: 3.01 dB at the band edges, for information.
	b, _ := Synthesize(Spec{F0: tf0, BW: tbw, Order: 5, Family: Butterworth})
	cb, _ := b.Check(nil, nil)
	if !cb[0].Pass || !close(cb[0].Achieved, 10*math.Log10(2), 1e-9) || !cb[1].Pass || !cb[0].Info || !cb[1].Info {
		t.Errorf("Butterworth checks %+v", cb)
	}
}

func TestResponseErrors(t *testing.T) {
	d, _ := Synthesize(Spec{F0: tf0, BW: tbw, Order: 3})
	asym := mat.DenseCopyOf(d.Folded)
	asym.Set(1, 2, 0.5)
	iso := mat.NewDense(4, 4, []float64{0, 1, 0, 0, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0})
	for _, c := range []struct {
		err  error
		want string
	}{
		{second(Response(nil, tf0, tbw, []float64{tf0}, nil)), "nil"},
		{second(Response(mat.NewDense(2, 2, nil), tf0, tbw, []float64{tf0}, nil)), "(N+2)x(N+2)"},
		{second(Response(asym, tf0, tbw, []float64{tf0}, nil)), "must be symmetric"},
		{second(Response(d.Folded, tf0, 2*tf0, []float64{tf0}, nil)), "bandwidth must be > 0 Hz and < f0"},
		{second(Response(d.Folded, tf0, tbw, []float64{-1}, nil)), "frequency 1 must be > 0 Hz"},
		{second(Response(d.Folded, tf0, tbw, []float64{tf0}, []float64{100, 100})), "need one unloaded Q per resonator (3)"},
		{second(Response(d.Folded, tf0, tbw, []float64{tf0}, []float64{100, 0, 100})), "unloaded Q of resonator 2 must be > 0"},
		{second(Response(iso, tf0, tbw, []float64{tf0}, nil)), "singular"},
	} {
		if c.err == nil || !strings.Contains(c.err.Error(), c.want) {
			t.Errorf("Response error = %v, want one containing %q", c.err, c.want)
		}
	}
	// +Inf Q0 is lossless.
	a, _ := d.Response([]float64{tf0 * 1.001}, []float64{math.Inf(1), math.Inf(1), math.Inf(1)})
	b, _ := d.Response([]float64{tf0 * 1.001}, nil)
	if a[0].S21 != b[0].S21 {
		t.Errorf("Q0 = +Inf gives S21 %v, lossless %v", a[0].S21, b[0].S21)
	}
}

func TestPointMethods(t *testing.T) {
	p := Point{S11: complex(0, 0.1), S21: complex(-0.5, 0), S22: complex(0.1, 0)}
	if !close(p.S11DB(), -20, 1e-14) || !close(p.ReturnLoss(), 20, 1e-14) || !close(p.InsertionLoss(), 20*math.Log10(2), 1e-14) ||
		p.S11Deg() != 90 || p.S21Deg() != 180 || p.S22Deg() != 0 || !close(p.S22DB(), -20, 1e-14) || !close(p.S21DB(), -20*math.Log10(2), 1e-14) {
		t.Errorf("Point methods: %v %v %v %v %v %v", p.S11DB(), p.ReturnLoss(), p.InsertionLoss(), p.S11Deg(), p.S21Deg(), p.S22Deg())
	}
}

// TestModalMatchesLU: the O(N) modal evaluation used for equal losses
// agrees with the LU factorisation of the full network matrix, including
// the derivative behind the group delay, close to lossless resonances too.
func TestModalMatchesLU(t *testing.T) {
	// derivTol: the modal derivative loses digits near a lossless
	// resonance, 1e-10 relative at the switch-over (see modalMinDist).
	const derivTol = 1e-9
	rng := rand.New(rand.NewPCG(41, 42))
	for trial := 0; trial < 100; trial++ {
		sp := randomSpec(rng)
		d, err := Synthesize(sp)
		if err != nil {
			t.Fatal(err)
		}
		var loss []float64
		if trial%2 == 1 {
			l := 0.5 * rng.Float64()
			for i := 0; i < sp.Order; i++ {
				loss = append(loss, l)
			}
		}
		ev := newEvaluator(d.Folded, loss)
		if !ev.modal {
			t.Fatalf("order %d: modal form not set up", sp.Order)
		}
		ws := testOmegas(rng, 20)
		for _, mu := range ev.mu { // just outside the switch-over distance
			ws = append(ws, -mu+1.5*modalMinDist)
		}
		for _, w := range ws {
			a1, b1, c1, d1, ok := ev.atModal(w)
			if !ok {
				continue
			}
			a2, b2, c2, d2 := ev.atLU(w)
			if cmplx.Abs(a1-a2) > matTol || cmplx.Abs(b1-b2) > matTol || cmplx.Abs(c1-c2) > matTol || cmplx.Abs(d1-d2) > matTol+derivTol*cmplx.Abs(d2) {
				t.Errorf("order %d loss %v at Omega %v: modal %v %v %v %v, LU %v %v %v %v", sp.Order, loss != nil, w, a1, b1, c1, d1, a2, b2, c2, d2)
			}
		}
	}
}
