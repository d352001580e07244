package filter

import (
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"cylcav/cavity"
)

// polyAttenuation is the lossless insertion loss (dB) of the generalised
// Chebyshev prototype at omega computed from the polynomials of Cameron's
// recursion (Characteristic: C_N = num/den in monomial form), an
// independent route to the cosh form of ChebyshevAttenuation and to the
// coupling matrix: L_A = 10 log10(1 + eps^2 C_N^2), eps^2 = 10^(ripple/10) - 1
// (Cameron 1999).
func polyAttenuation(t *testing.T, n int, ripple float64, zeros []float64) func(omega float64) float64 {
	t.Helper()
	num, den, err := Characteristic(n, zeros)
	if err != nil {
		t.Fatal(err)
	}
	eps2 := math.Expm1(ripple * math.Ln10 / 10)
	return func(omega float64) float64 {
		horner := func(p []float64) float64 {
			v := 0.0
			for i := len(p) - 1; i >= 0; i-- {
				v = v*omega + p[i]
			}
			return v
		}
		c := horner(num) / horner(den)
		return 10 * math.Log10(1+eps2*c*c)
	}
}

// denseMin is the least of f over m+1 frequencies spaced uniformly from a to
// b (Hz), and where.
func denseMin(f func(hz float64) float64, a, b float64, m int) (at, min float64) {
	min = math.Inf(1)
	for i := 0; i <= m; i++ {
		x := a + (b-a)*float64(i)/float64(m)
		if v := f(x); v < min {
			at, min = x, v
		}
	}
	return at, min
}

// issueExamples are the two specifications of issue 9 whose order was
// chosen from the single rejection frequency: a 11.2 GHz filter with zeros
// at 11.29 and 11.31 GHz (57 dB from 11.30 GHz, 10 dB from 11.10 GHz), and a
// 10 GHz filter with a zero at 10.0753 GHz (40 dB from 10.0763 GHz).
func issueExamples() []Spec {
	om := func(f0, bw float64, fs ...float64) []float64 {
		var w []float64
		for _, f := range fs {
			w = append(w, LowpassOmega(f, f0, bw))
		}
		return w
	}
	return []Spec{
		{F0: 11.2e9, BW: 0.01 * 11.2e9, ReturnLoss: 22, Zeros: om(11.2e9, 0.112e9, 11.29e9, 11.31e9),
			Rejections: []Rejection{{F: 11.30e9, Attenuation: 57}, {F: 11.10e9, Attenuation: 10}}},
		{F0: 10e9, BW: 100e6, ReturnLoss: 20, Zeros: om(10e9, 100e6, 10.0753e9),
			Rejections: []Rejection{{F: 10.0763e9, Attenuation: 40}}},
	}
}

// TestMinOrderWholeBand: the order meets each rejection over its whole
// region (from F to the end of the band of interest, lobes beyond the zeros
// included). The reference is a dense grid of the polynomial form of the
// prototype (polyAttenuation), not the code under test: at the chosen order
// every grid value meets the requirement, and at one order less some grid
// value misses it. For the issue's examples this gives N = 6 for both (the
// single-frequency reading gave 5 and 4).
func TestMinOrderWholeBand(t *testing.T) {
	// gridPoints: 200001 frequencies per region resolve the lobes (tens of
	// MHz wide) to well under 1e-3 dB.
	const gridPoints = 200000
	for k, sp := range issueExamples() {
		n, err := sp.MinOrder()
		if err != nil {
			t.Fatal(err)
		}
		if n != 6 {
			t.Errorf("example %d: MinOrder = %d, want 6 (issue 9, confirmed by the dense grid below)", k+1, n)
		}
		ripple := RippleFromReturnLoss(sp.ReturnLoss)
		m, _ := sp.Mask()
		meets := func(order int) bool {
			ok := true
			att := polyAttenuation(t, order, ripple, sp.Zeros)
			for _, g := range m.Regions {
				_, a := denseMin(func(f float64) float64 {
					return att(LowpassOmega(f, sp.F0, sp.BW))
				}, g.Low, g.High, gridPoints)
				ok = ok && a >= g.Attenuation
			}
			return ok
		}
		if !meets(n) || meets(n-1) {
			t.Errorf("example %d: dense grid says order %d meets: %v, order %d meets: %v; want true, false", k+1, n, meets(n), n-1, meets(n-1))
		}
	}
}

// TestCheckRejectionMinimum: the rejection line of Check locates the least
// attenuation exactly. For the first example of issue 9 at N = 5 the
// attenuation from 11.30 GHz outwards falls to about 51.5 dB near
// 11.358 GHz (issue 9); Check must report a value no larger than any point
// of a dense polynomial-form grid (it is the true minimum) and within the
// grid's resolution of its least value, at the same frequency, and fail.
func TestCheckRejectionMinimum(t *testing.T) {
	// minTol: the exact minimum may lie below the grid's least value by
	// the grid's curvature error only (2e5 steps over 100 MHz: 500 Hz,
	// against a lobe some 30 MHz wide), and above it by rounding only.
	const minTol = 1e-6 // dB
	sp := issueExamples()[0]
	sp.Order = 5
	d, err := Synthesize(sp)
	if err != nil {
		t.Fatal(err)
	}
	cs, err := d.Check(nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	c := cs[2]
	if c.Name != "rejection" || c.F != 11.30e9 || c.Verdict != NotMet || c.Pass {
		t.Fatalf("rejection line %+v, want a failed rejection from 11.30 GHz", c)
	}
	_, hi := ModelRange(sp.F0)
	if c.Band != [2]float64{11.30e9, hi} {
		t.Errorf("band = %v, want 11.30 GHz..%v Hz", c.Band, hi)
	}
	ripple := RippleFromReturnLoss(22)
	att := polyAttenuation(t, 5, ripple, sp.Zeros)
	at, min := denseMin(func(f float64) float64 {
		return att(LowpassOmega(f, sp.F0, sp.BW))
	}, 11.30e9, 11.40e9, 200000)
	if c.Achieved > min+minTol || c.Achieved < min-1e-3 {
		t.Errorf("least attenuation = %.9f dB, want just below the dense-grid least %.9f dB", c.Achieved, min)
	}
	if math.Abs(c.Achieved-51.5) > 0.1 || math.Abs(c.Worst-11.358e9) > 1e6 || math.Abs(c.Worst-at) > 2e5 {
		t.Errorf("minimum %.4f dB at %.6g Hz, want about 51.5 dB at 11.358 GHz (issue 9; grid: %.6g Hz)", c.Achieved, c.Worst, at)
	}
	// The prototype form used by MinOrder finds the same minimum.
	g := d.Spec.mask().Regions[0]
	pa, err := d.Spec.regionMinimum(5, g)
	if err != nil || math.Abs(pa-c.Achieved) > 1e-7 {
		t.Errorf("prototype minimum %v dB (err %v), coupling-matrix minimum %v dB", pa, err, c.Achieved)
	}
	// Order 6 meets both lines.
	sp.Order = 6
	d6, _ := Synthesize(sp)
	c6, _ := d6.Check(nil, nil)
	if Overall(c6) != Met {
		t.Errorf("N = 6: %+v, want every line met", c6)
	}
}

// TestCheckSpuriousAndModel: a spurious resonance of the cavities inside a
// rejection region fails that line and names the mode (the response is
// evaluated up to it); a rejection beyond the first spurious resonance, or
// beyond the model range, is OutsideModel without an achieved value. The
// TE0mp/TM1mp companion at f0 takes no part.
func TestCheckSpuriousAndModel(t *testing.T) {
	sp := Spec{F0: 10e9, BW: 200e6, ReturnLoss: 20, Order: 5,
		Rejections: []Rejection{{F: 10.25e9, Attenuation: 40}, {F: 9.75e9, Attenuation: 35}, {F: 11.5e9, Attenuation: 60}, {F: 7e9, Attenuation: 60}}}
	d, err := Synthesize(sp)
	if err != nil {
		t.Fatal(err)
	}
	mode := func(s string) cavity.Mode { m, _ := cavity.ParseMode(s); return m }
	spur := []Spurious{
		{Mode: mode("TE211"), F: 8.51e9},
		{Mode: mode("TM110"), F: 8.69e9},
		{Mode: mode("TM111"), F: 10e9, Companion: true, InPassband: true},
		{Mode: mode("TE112"), F: 10.73e9},
	}
	cs, err := d.Check(nil, spur)
	if err != nil {
		t.Fatal(err)
	}
	up, down, far, farLow := cs[2], cs[3], cs[4], cs[5]
	if up.Verdict != NotMet || up.Spurious == nil || up.Spurious.Mode.String() != "TE112" || up.Band != [2]float64{10.25e9, 10.73e9} || !strings.Contains(up.Note, "TE112") {
		t.Errorf("rejection from 10.25 GHz: %+v, want a failure naming TE112 at 10.73 GHz", up)
	}
	if !(up.Achieved > 40) {
		t.Errorf("rejection from 10.25 GHz up to TE112: %v dB, want the (met) attenuation below the spurious", up.Achieved)
	}
	if down.Verdict != NotMet || down.Spurious == nil || down.Spurious.Mode.String() != "TM110" {
		t.Errorf("rejection from 9.75 GHz: %+v, want a failure naming TM110, the resonance nearest the passband", down)
	}
	if far.Verdict != OutsideModel || !math.IsNaN(far.Achieved) || far.Spurious == nil || far.Spurious.Mode.String() != "TE112" {
		t.Errorf("rejection from 11.5 GHz: %+v, want outside the model beyond TE112", far)
	}
	if farLow.Verdict != OutsideModel || !math.IsNaN(farLow.Achieved) {
		t.Errorf("rejection from 7 GHz: %+v, want outside the model", farLow)
	}
	if Overall(cs) != NotMet {
		t.Errorf("Overall = %v, want fail", Overall(cs))
	}
	// Without cavities the 11.5 GHz line is inside the model range (met);
	// 7 GHz lies beyond f0 - 20 % and stays OutsideModel, which the
	// overall verdict reports when nothing fails.
	cn, _ := d.Check(nil, nil)
	if cn[4].Verdict != Met || cn[5].Verdict != OutsideModel || !strings.Contains(cn[5].Note, "20 %") {
		t.Errorf("without cavities: %+v, %+v", cn[4], cn[5])
	}
	if Overall(cn) != OutsideModel {
		t.Errorf("Overall without cavities = %v, want outside model", Overall(cn))
	}
	// MinOrder ignores rejections it cannot predict, and refuses when no
	// other is left.
	only := Spec{F0: 10e9, BW: 200e6, Rejections: []Rejection{{F: 13e9, Attenuation: 60}}}
	if _, err := only.MinOrder(); err == nil || !strings.Contains(err.Error(), "outside") {
		t.Errorf("MinOrder with every rejection beyond the model: err %v", err)
	}
}

// TestCheckRoundingLadder: with losses, the rounding line of an all-pole
// design equals the spread of the insertion loss of the lossy ABCD ladder
// (an independent route: no coupling matrix) over a dense passband grid,
// and its ripple line still reads the lossless design.
func TestCheckRoundingLadder(t *testing.T) {
	// spreadTol: the refined extremes against 200001 grid points over the
	// band (curvature error below 1e-9 dB) and the ladder's agreement
	// with the matrix (matTol in |S21|).
	const spreadTol = 1e-7
	f0, bw, q := 7.2e9, 40e6, 6000.0
	d, err := Synthesize(Spec{F0: f0, BW: bw, Order: 5, ReturnLoss: 20})
	if err != nil {
		t.Fatal(err)
	}
	q0 := []float64{q, q, q, q, q}
	cs, err := d.Check(q0, nil)
	if err != nil {
		t.Fatal(err)
	}
	delta := make([]float64, 5)
	for i := range delta {
		delta[i] = f0 / (bw * q)
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for i := 0; i <= 200000; i++ {
		_, s21 := ladder(d.G, -1+2*float64(i)/200000, delta)
		il := -20 * math.Log10(cmplx.Abs(s21))
		lo, hi = math.Min(lo, il), math.Max(hi, il)
	}
	if r := cs[3]; math.Abs(r.Achieved-(hi-lo)) > spreadTol {
		t.Errorf("rounding with losses = %.9f dB, want %.9f dB (lossy ladder, dense grid)", r.Achieved, hi-lo)
	}
	if !cs[1].Pass || math.Abs(cs[1].Achieved-RippleFromReturnLoss(20)) > 1e-9 {
		t.Errorf("ripple line %+v, want the lossless ripple %v", cs[1], RippleFromReturnLoss(20))
	}
}

// TestDelayStats: the group delay at f0 and its passband extremes against
// the lossy ABCD ladder's phase (central difference, dense grid), and the
// one-resonator closed form 1/(pi bw) at f0 (see
// TestResponsePlotSingleResonator).
func TestDelayStats(t *testing.T) {
	// delayTol: central difference h = 1e-6 in Omega (O(h^2) ~ 1e-12
	// relative) and 20001 grid points over the band against the refined
	// extremes (curvature error ~1e-7 relative at the band-edge peaks).
	const delayTol = 1e-6
	f0, bw := 7.2e9, 40e6
	d, err := Synthesize(Spec{F0: f0, BW: bw, Order: 5, ReturnLoss: 20})
	if err != nil {
		t.Fatal(err)
	}
	q0 := []float64{3000, 3000, 3000, 3000, 3000}
	delta := make([]float64, 5)
	for i := range delta {
		delta[i] = f0 / (bw * q0[i])
	}
	g, err := d.Delay(q0)
	if err != nil {
		t.Fatal(err)
	}
	tau := func(w float64) float64 {
		const h = 1e-6
		_, lp := ladder(d.G, w+h, delta)
		_, lm := ladder(d.G, w-h, delta)
		f := BandpassFrequency(w, f0, bw)
		return -cmplx.Phase(lp/lm) / (2 * h) * (1 + (f0/f)*(f0/f)) / bw / (2 * math.Pi)
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for i := 0; i <= 20000; i++ {
		v := tau(-1 + 2*float64(i)/20000)
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	for _, c := range []struct {
		name      string
		got, want float64
	}{{"at f0", g.AtF0, tau(0)}, {"min", g.Min, lo}, {"max", g.Max, hi}} {
		if math.Abs(c.got-c.want) > delayTol*c.want {
			t.Errorf("group delay %s = %v s, want %v s (lossy ladder)", c.name, c.got, c.want)
		}
	}
	if g.Variation() != g.Max-g.Min || !(g.FMax > g.FMin || g.FMax < g.FMin) {
		t.Errorf("DelayStats %+v", g)
	}
	d1, _ := Synthesize(Spec{F0: f0, BW: bw, Order: 1, Family: Butterworth})
	g1, _ := d1.Delay(nil)
	if want := 1 / (math.Pi * bw); math.Abs(g1.AtF0-want) > 1e-12*want {
		t.Errorf("N = 1 delay at f0 = %v s, want 1/(pi bw) = %v s", g1.AtF0, want)
	}
}

// TestDelayLoss: the group-delay estimate of the midband dissipation loss
// equals Cohn's estimate for all-pole designs matched at f0 (odd-order
// Chebyshev, Butterworth), and for a design with transmission zeros agrees
// with the exact lossy response (Response) to first order.
func TestDelayLoss(t *testing.T) {
	// cohnEq: the two first-order forms are the same quantity for a
	// matched all-pole design (tau_Omega(0) = sum g/2), so they agree to
	// rounding.
	const cohnEq = 1e-9
	// firstOrder: at Q0 = 1e5 and 1 % bandwidth the loss is about 0.01 dB;
	// the second-order term is then some 1e-4 relative.
	const firstOrder = 2e-3
	for _, sp := range []Spec{
		{F0: 10e9, BW: 100e6, Order: 5, ReturnLoss: 20},
		{F0: 10e9, BW: 100e6, Order: 7, Ripple: 0.5},
		{F0: 10e9, BW: 100e6, Order: 4, Family: Butterworth},
	} {
		d, err := Synthesize(sp)
		if err != nil {
			t.Fatal(err)
		}
		g, _ := d.Delay(nil)
		q0 := []float64{4000}
		est, err := DelayLoss(sp.F0, g.AtF0, q0)
		if err != nil {
			t.Fatal(err)
		}
		cohn, _ := CohnLoss(d.G, d.FBW, q0)
		if math.Abs(est-cohn) > cohnEq*cohn {
			t.Errorf("%v N=%d: delay estimate %v dB, Cohn %v dB", sp.Family, sp.Order, est, cohn)
		}
	}
	d, err := Synthesize(Spec{F0: 10e9, BW: 100e6, Order: 6, ReturnLoss: 23, Zeros: []float64{1.25, 1.6, -2.1}})
	if err != nil {
		t.Fatal(err)
	}
	g, _ := d.Delay(nil)
	q := 1e5
	est, _ := DelayLoss(10e9, g.AtF0, []float64{q})
	q0 := []float64{q, q, q, q, q, q}
	lossy, _ := d.Response([]float64{10e9}, q0)
	lossless, _ := d.Response([]float64{10e9}, nil)
	exact := lossy[0].InsertionLoss() - lossless[0].InsertionLoss()
	if math.Abs(est-exact) > firstOrder*exact {
		t.Errorf("delay estimate %v dB, exact dissipation %v dB (Response)", est, exact)
	}
	for _, bad := range []struct {
		f0, tau float64
		q       []float64
	}{{0, 1e-9, []float64{100}}, {1e9, 0, []float64{100}}, {1e9, 1e-9, nil}, {1e9, 1e-9, []float64{-1}}} {
		if _, err := DelayLoss(bad.f0, bad.tau, bad.q); err == nil {
			t.Errorf("DelayLoss(%v, %v, %v): no error", bad.f0, bad.tau, bad.q)
		}
	}
}

// TestMaskRegions: regions reach from F outwards to the end of the band of
// interest, f0 (1 -+ ModelOffset); beyond it a rejection is OutsideModel.
func TestMaskRegions(t *testing.T) {
	sp := Spec{F0: 10e9, BW: 200e6, Order: 3, Rejections: []Rejection{{F: 10.3e9, Attenuation: 30}, {F: 9.5e9, Attenuation: 20}, {F: 12.5e9, Attenuation: 50}}}
	m, err := sp.Mask()
	if err != nil {
		t.Fatal(err)
	}
	want := []MaskRegion{
		{Rejection: 0, F: 10.3e9, Low: 10.3e9, High: 12e9, Attenuation: 30, Above: true},
		{Rejection: 1, F: 9.5e9, Low: 8e9, High: 9.5e9, Attenuation: 20},
		{Rejection: 2, F: 12.5e9, Low: 12.5e9, High: 12.5e9, Attenuation: 50, Above: true, OutsideModel: true},
	}
	for i, g := range m.Regions {
		if g != want[i] {
			t.Errorf("region %d = %+v, want %+v", i, g, want[i])
		}
	}
	if m.ReturnLoss != DefaultReturnLoss || m.Model != [2]float64{8e9, 12e9} {
		t.Errorf("mask %+v", m)
	}
	if ModelFBWError(10e9, 1e9) != nil || ModelFBWError(10e9, 1.01e9) == nil {
		t.Errorf("ModelFBWError at 10 %% and 10.1 %%: %v, %v", ModelFBWError(10e9, 1e9), ModelFBWError(10e9, 1.01e9))
	}
}

// TestCheckSpuriousAtF: a spurious resonance exactly at the rejection
// frequency fails the line with the attenuation there, not an empty band.
func TestCheckSpuriousAtF(t *testing.T) {
	d, err := Synthesize(Spec{F0: 10e9, BW: 200e6, Order: 4, Rejections: []Rejection{{F: 10.3e9, Attenuation: 20}}})
	if err != nil {
		t.Fatal(err)
	}
	m, _ := cavity.ParseMode("TE112")
	cs, err := d.Check(nil, []Spurious{{Mode: m, F: 10.3e9}})
	if err != nil {
		t.Fatal(err)
	}
	want, _ := ChebyshevAttenuation(4, RippleFromReturnLoss(DefaultReturnLoss), nil, LowpassOmega(10.3e9, 10e9, 200e6))
	if c := cs[2]; c.Verdict != NotMet || math.Abs(c.Worst-10.3e9) > 1e-12*10.3e9 || math.Abs(c.Achieved-want) > 1e-9 {
		t.Errorf("rejection with a spurious resonance at F: %+v, want a failure with %v dB at 10.3 GHz", c, want)
	}
}
