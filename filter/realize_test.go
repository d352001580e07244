package filter

import (
	"fmt"
	"math"
	"reflect"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/physics/bessel"
	"cylcav/qfactor"
)

// Tests of the physical realisation on invented filters. External sources:
//   - the resonant frequency of a cylinder, checked through
//     cavity.Cavity.Frequency (Pozar 4th ed. sec. 6.4; tested in package
//     cavity against published tables);
//   - the TE_0mp wall Q in Pozar's closed form (Pozar 4th ed. sec. 6.4,
//     written out here independently of package qfactor) with the
//     classical surface resistance Rs = sqrt(omega mu0 / (2 sigma)) (Pozar
//     sec. 1.7) and copper at sigma = 5.813e7 S/m (Pozar, Appendix F,
//     recalled from memory);
//   - the completeness of the spurious list against a brute-force
//     enumeration of every (n, m, p) below generous bounds;
//   - the resonator frequency set by a diagonal coupling against the S21
//     peak of a one-resonator network evaluated by Response.

const copperSigma = 5.813e7 // S/m, Pozar Appendix F (recalled from memory)

// Tolerances of the realisation tests.
const (
	// realRoundTol: one value computed twice along equivalent routes of a
	// few operations (a frequency against its own target, a group delay
	// against its formula): an ulp or two.
	realRoundTol = 1e-15
	// realSizeTol: a cavity sized by cavity.Size and its frequency computed
	// again by Frequency (sqrt, hypot and divisions, a few ulp each).
	realSizeTol = 1e-14
	// realRouteTol: two closed forms of the same quantity (Pozar's Q
	// against qfactor's, the optimiser's cavity against Size's): a few
	// thousand ulp.
	realRouteTol = 1e-12
)

// copperWalls are smooth walls of conductivity copperSigma at 20 C; the
// tests compare with the classical Rs = sqrt(pi f mu0 / sigma) (Pozar sec.
// 1.7) computed here.
func copperWalls() *qfactor.WallSet {
	w := qfactor.SameWalls(qfactor.Surface{Conductor: physics.Conductor{Name: "user", Conductivity: copperSigma}})
	return &w
}

// invented4 is an invented 4-cavity TE011 channel filter: 10.7 GHz, 40 MHz
// wide, 20 dB return loss, one rejection requirement above the band.
func invented4(t testing.TB) *Design {
	t.Helper()
	d, err := Synthesize(Spec{F0: 10.7e9, BW: 40e6, Order: 4, ReturnLoss: 20,
		Rejections: []Rejection{{F: 10.8e9, Attenuation: 40}}})
	if err != nil {
		t.Fatal(err)
	}
	return d
}

// pozarTE0mpQ is Pozar's closed form of the wall Q of TE_nmp for n = 0
// with uniform walls (Pozar 4th ed. sec. 6.4):
// Q = (ka)^3 eta a d / (4 x^2 Rs [a d/2 + (beta a^2/x)^2]).
func pozarTE0mpQ(c cavity.Cavity, m cavity.Mode, rs float64) float64 {
	kc, beta, k := c.Wavenumbers(m)
	x := kc * c.Radius
	a, d := c.Radius, c.Length
	// eta = sqrt(mu0/eps0); the CODATA value of Z0 differs from it by
	// 3e-12 because mu0 and eps0 are rounded measured values.
	eta := math.Sqrt(physics.VacuumPermeability / physics.VacuumPermittivity)
	return math.Pow(k*a, 3) * eta * a * d / (4 * x * x * rs * (a*d/2 + math.Pow(beta*a*a/x, 2)))
}

// bruteModes lists every mode of c with lo <= f <= hi by trying every
// index below bounds that are checked to be generous enough.
func bruteModes(t *testing.T, c cavity.Cavity, lo, hi float64) []cavity.Resonance {
	t.Helper()
	const nMax, mMax, pMax = 40, 20, 30
	for _, m := range []cavity.Mode{{Family: cavity.TM, N: nMax, M: 1, P: 0}, {Family: cavity.TM, N: 0, M: mMax, P: 0}, {Family: cavity.TM, N: 0, M: 1, P: pMax}} {
		if c.Frequency(m) <= hi {
			t.Fatalf("brute-force bound too small: %s at %g Hz <= %g Hz", m, c.Frequency(m), hi)
		}
	}
	var out []cavity.Resonance
	scale := physics.SpeedOfLight / (2 * math.Pi * c.Fill.Index())
	for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
		for n := 0; n < nMax; n++ {
			roots := bessel.JZeros(n, mMax)
			if fam == cavity.TE {
				roots = bessel.JPrimeZeros(n, mMax)
				if n == 0 {
					roots = bessel.JZeros(1, mMax) // j'_0m = j_1m, DLMF 10.6.3
				}
			}
			for m := 1; m < mMax; m++ {
				for p := 0; p < pMax; p++ {
					md := cavity.Mode{Family: fam, N: n, M: m, P: p}
					if md.Validate() != nil {
						continue
					}
					// Pozar sec. 6.4, evaluated here; the exact value of
					// Frequency decides at the window edges.
					f := scale * math.Hypot(roots[m-1]/c.Radius, float64(p)*math.Pi/c.Length)
					if f < lo*(1-1e-9) || f > hi*(1+1e-9) {
						continue
					}
					if f := c.Frequency(md); f >= lo && f <= hi {
						out = append(out, cavity.Resonance{Mode: md, Frequency: f})
					}
				}
			}
		}
	}
	return out
}

func TestRealiseFourCavityTE011(t *testing.T) {
	d := invented4(t)
	te011 := cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}
	r, err := Realise(d, RealiseOptions{Shape: cavity.ByRatio(1.2), Walls: copperWalls()})
	if err != nil {
		t.Fatal(err)
	}
	if r.Mode != te011 || len(r.Cavities) != 4 {
		t.Fatalf("Realise: mode %s, %d cavities; want TE011 (default), 4", r.Mode, len(r.Cavities))
	}
	for i, cd := range r.Cavities {
		c := cd.Cavity
		// Synchronous design: every resonator at f0 (the diagonal holds
		// synthesis rounding of about 1e-16, which Realise treats as 0).
		if cd.SelfCoupling != 0 || cd.F != d.Spec.F0 {
			t.Errorf("cavity %d: M_ii = %g, f = %g Hz; want 0, f0 = %g Hz", i+1, cd.SelfCoupling, cd.F, d.Spec.F0)
		}
		if f := c.Frequency(te011); apRel(f, d.Spec.F0) > realSizeTol {
			t.Errorf("cavity %d: TE011 frequency = %.15g Hz, want %.15g Hz", i+1, f, d.Spec.F0)
		}
		if ratio := c.Diameter() / c.Length; apRel(ratio, 1.2) > 1e-14 {
			t.Errorf("cavity %d: D/L = %.15g, want 1.2", i+1, ratio)
		}
		// Q0 against Pozar's closed form (independent of package qfactor)
		// and against qfactor.UnloadedQ itself.
		rs := math.Sqrt(math.Pi * d.Spec.F0 * physics.VacuumPermeability / copperSigma)
		if want := pozarTE0mpQ(c, te011, rs); apRel(cd.Q0, want) > realRouteTol {
			t.Errorf("cavity %d: Q0 = %.12g, want %.12g (Pozar sec. 6.4 closed form)", i+1, cd.Q0, want)
		}
		u, err := qfactor.UnloadedQ(c, te011, copperWalls().At(nil))
		if err != nil {
			t.Fatal(err)
		}
		if cd.Q0 != u.Q0 || cd.Loss.Q0 != u.Q0 {
			t.Errorf("cavity %d: Q0 = %v, want qfactor.UnloadedQ = %v", i+1, cd.Q0, u.Q0)
		}
	}
	if q := r.Q0(); len(q) != 4 || q[2] != r.Cavities[2].Q0 {
		t.Errorf("Realisation.Q0() = %v", q)
	}

	// Spurious list: window f0 (1 +- 0.2), complete against brute force.
	lo, hi := d.Spec.F0*0.8, d.Spec.F0*1.2
	if r.Window != [2]float64{lo, hi} {
		t.Errorf("window = %v, want [%g %g]", r.Window, lo, hi)
	}
	want := bruteModes(t, r.Cavities[0].Cavity, lo, hi)
	want = slices.DeleteFunc(want, func(x cavity.Resonance) bool { return x.Mode == te011 })
	slices.SortFunc(want, func(a, b cavity.Resonance) int { return a.Compare(b) })
	if len(r.Spurious) != len(want) {
		t.Fatalf("Realise: %d spurious modes in the window, brute force finds %d: %v", len(r.Spurious), len(want), want)
	}
	for i, s := range r.Spurious {
		if s.Mode != want[i].Mode || s.F != want[i].Frequency {
			t.Errorf("spurious %d = %s at %g Hz, want %s at %g Hz", i, s.Mode, s.F, want[i].Mode, want[i].Frequency)
		}
		if !slices.Equal(s.Resonators, []int{1, 2, 3, 4}) {
			t.Errorf("spurious %s: resonators %v, want 1..4 (identical cavities)", s.Mode, s.Resonators)
		}
		if s.Offset != s.F-d.Spec.F0 || s.Relative != (s.F-d.Spec.F0)/d.Spec.F0 {
			t.Errorf("spurious %s: offset %g Hz, relative %g", s.Mode, s.Offset, s.Relative)
		}
		wantCompanion := s.Mode == cavity.Mode{Family: cavity.TM, N: 1, M: 1, P: 1}
		if s.Companion != wantCompanion || (wantCompanion && (!s.InPassband || apRel(s.F, d.Spec.F0) > realRoundTol)) {
			t.Errorf("spurious %s at %g Hz: companion %v, in passband %v; want companion %v", s.Mode, s.F, s.Companion, s.InPassband, wantCompanion)
		}
		// The derived stopband from the 40 dB rejection at 10.8 GHz runs to
		// the window edge.
		if inStop := s.F >= 10.8e9; (s.Stopband == 0) != inStop {
			t.Errorf("spurious %s at %g Hz: stopband %d, want in stopband 0: %v", s.Mode, s.F, s.Stopband, inStop)
		}
	}
	if len(r.Stopbands) != 1 || r.Stopbands[0] != (Stopband{Low: 10.8e9, High: hi, Attenuation: 40, Derived: true}) {
		t.Errorf("stopbands = %+v, want the band read from the rejection at 10.8 GHz", r.Stopbands)
	}
	if len(r.Warnings) == 0 || !strings.Contains(r.Warnings[0], "TM111 resonates at exactly the frequency of TE011") || !strings.Contains(r.Warnings[0], "mode trap") {
		t.Errorf("first warning = %q, want the TM111 companion needing a mode trap", r.Warnings)
	}

	// Ports and couplings: nothing sized without a hole geometry.
	for k, p := range r.Ports {
		wantQ := []float64{d.QextIn, d.QextOut}[k]
		if p.Qext != wantQ || apRel(p.GroupDelay, 4*wantQ/(2*math.Pi*d.Spec.F0)) > realRoundTol || !strings.Contains(p.Note, "field solver") {
			t.Errorf("port %d = %+v, want Qext %g, group delay 4 Qext/omega0 and a field-solver note", k+1, p, wantQ)
		}
	}
	if len(r.Apertures) != 3 || len(r.Cross) != 0 {
		t.Fatalf("%d apertures, %d cross couplings; want 3, 0", len(r.Apertures), len(r.Cross))
	}
	for i, a := range r.Apertures {
		if a.From != i+1 || a.To != i+2 || a.Required != d.K[i] || a.Sized || !strings.Contains(a.Note, "field solver") {
			t.Errorf("aperture %d = %+v, want k = %g unsized with a field-solver note", i+1, a, d.K[i])
		}
	}
}

// TestRealiseStopbandWarning checks the warning for a spurious resonance
// inside a stated stopband, and its absence for a band between two.
func TestRealiseStopbandWarning(t *testing.T) {
	d, err := Synthesize(Spec{F0: 10.7e9, BW: 40e6, Order: 4, ReturnLoss: 20})
	if err != nil {
		t.Fatal(err)
	}
	base := RealiseOptions{Shape: cavity.ByRatio(1.2)}
	r0, err := Realise(d, base)
	if err != nil {
		t.Fatal(err)
	}
	// The first spurious above the band other than the companion.
	var s, next Spurious
	for i, x := range r0.Spurious {
		if x.F > d.Spec.F0 {
			s, next = x, r0.Spurious[i+1]
			break
		}
	}
	if s.Mode == (cavity.Mode{}) {
		t.Fatal("no spurious mode above the band")
	}
	opts := base
	opts.Stopbands = []Stopband{{Low: s.F - 1e6, High: s.F + 1e6, Attenuation: 50}}
	r, err := Realise(d, opts)
	if err != nil {
		t.Fatal(err)
	}
	var hits []string
	for _, w := range r.Warnings {
		if strings.Contains(w, "lies in the stopband") {
			hits = append(hits, w)
		}
	}
	if len(hits) != 1 || !strings.Contains(hits[0], "spurious "+s.Mode.String()) || !strings.Contains(hits[0], "stated, 50 dB") {
		t.Errorf("stopband around %s at %g Hz: warnings %q, want one naming it", s.Mode, s.F, hits)
	}
	opts.Stopbands = []Stopband{{Low: s.F + 1e3, High: next.F - 1e3}}
	r, err = Realise(d, opts)
	if err != nil {
		t.Fatal(err)
	}
	for _, w := range r.Warnings {
		if strings.Contains(w, "lies in the stopband") {
			t.Errorf("stopband between %s and %s: unexpected warning %q", s.Mode, next.Mode, w)
		}
	}
	// The window widens to hold a stopband beyond it.
	opts.Stopbands = []Stopband{{Low: 14e9, High: 15e9}}
	r, err = Realise(d, opts)
	if err != nil {
		t.Fatal(err)
	}
	if r.Window[1] != 15e9 || r.Spurious[len(r.Spurious)-1].F > 15e9 {
		t.Errorf("window = %v, last spurious at %g Hz; want the window to end at 15 GHz", r.Window, r.Spurious[len(r.Spurious)-1].F)
	}
}

// peakS21 returns the frequency of the largest |S21| of the one-resonator
// network [[0 m 0] [m mii m] [0 m 0]] by golden-section search.
func peakS21(t *testing.T, mii, f0, bw float64) float64 {
	const m = 0.05
	a := mat.NewDense(3, 3, []float64{0, m, 0, m, mii, m, 0, m, 0})
	s21 := func(f float64) float64 {
		p, err := Response(a, f0, bw, []float64{f}, nil)
		if err != nil {
			t.Fatal(err)
		}
		return real(p[0].S21)*real(p[0].S21) + imag(p[0].S21)*imag(p[0].S21)
	}
	lo, hi := f0-3*bw, f0+3*bw
	const g = 0.6180339887498949
	x1, x2 := hi-g*(hi-lo), lo+g*(hi-lo)
	for hi-lo > 1e-8*bw {
		if s21(x1) > s21(x2) {
			hi, x2 = x2, x1
			x1 = hi - g*(hi-lo)
		} else {
			lo, x1 = x1, x2
			x2 = lo + g*(hi-lo)
		}
	}
	return 0.5 * (lo + hi)
}

// TestRealiseSelfCoupling checks an asymmetric design: each cavity is
// sized for its own frequency f_i = f0 (sqrt(1 + (M_ii FBW/2)^2) -
// M_ii FBW/2), which is where a lone resonator with that diagonal entry
// transmits (S21 peak of the network of Response).
func TestRealiseSelfCoupling(t *testing.T) {
	d, err := Synthesize(Spec{F0: 10.7e9, BW: 40e6, Order: 4, ReturnLoss: 20, Zeros: []float64{1.6}})
	if err != nil {
		t.Fatal(err)
	}
	te011 := cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}
	r, err := Realise(d, RealiseOptions{Mode: te011, Shape: cavity.ByDiameter(0.037), Hole: &Hole{Thickness: 0.5e-3}})
	if err != nil {
		t.Fatal(err)
	}
	detuned := 0
	for i, cd := range r.Cavities {
		mii := d.Folded.At(i+1, i+1)
		if math.Abs(mii) <= crossCouplingTol {
			mii = 0 // synthesis rounding, see RealiseOptions
		}
		x := mii * d.FBW / 2
		want := d.Spec.F0 * (math.Sqrt(1+x*x) - x)
		if cd.SelfCoupling != mii || apRel(cd.F, want) > 1e-15 {
			t.Errorf("resonator %d: M_ii = %g, f = %.15g Hz; want %g, %.15g Hz", i+1, cd.SelfCoupling, cd.F, mii, want)
		}
		if pk := peakS21(t, mii, d.Spec.F0, d.Spec.BW); math.Abs(pk-cd.F) > 1e-6*d.Spec.BW {
			t.Errorf("resonator %d: S21 peak of the lone resonator at %.9g Hz, want f_i = %.9g Hz", i+1, pk, cd.F)
		}
		if f := cd.Cavity.Frequency(te011); apRel(f, cd.F) > realSizeTol || cd.Cavity.Diameter() != 0.037 {
			t.Errorf("resonator %d: cavity %+v resonates at %.15g Hz, want %.15g Hz with D = 37 mm", i+1, cd.Cavity, f, cd.F)
		}
		if math.Abs(mii) > 1e-6 {
			detuned++
		}
	}
	if detuned == 0 {
		t.Fatalf("asymmetric design has no detuned resonator: diagonal %v", mat.Formatted(d.Folded))
	}
	// Every resonator appears in the spurious lists of its own design.
	seen := map[int]bool{}
	for _, s := range r.Spurious {
		for _, i := range s.Resonators {
			seen[i] = true
			if !s.Companion {
				continue
			}
			if apRel(s.F, r.Cavities[i-1].F) > realRoundTol {
				t.Errorf("companion of resonator %d at %g Hz, want its own f_i = %g Hz", i, s.F, r.Cavities[i-1].F)
			}
		}
	}
	if len(seen) != 4 {
		t.Errorf("spurious lists cover resonators %v, want 1..4", seen)
	}
	// Cross couplings: every entry outside the main line, and only those.
	n := d.Order()
	var want []CrossCoupling
	for i := 0; i < n+2; i++ {
		for j := i + 2; j < n+2; j++ {
			if m := d.Folded.At(i, j); math.Abs(m) > crossCouplingTol {
				want = append(want, CrossCoupling{From: i, To: j, M: m, K: d.FBW * m})
			}
		}
	}
	if len(want) == 0 || len(r.Cross) != len(want) {
		t.Fatalf("cross couplings %+v, want %+v", r.Cross, want)
	}
	for i, c := range r.Cross {
		if c.From != want[i].From || c.To != want[i].To || c.M != want[i].M || c.K != want[i].K || !strings.Contains(c.Note, "field solver") {
			t.Errorf("cross coupling %d = %+v, want %+v with a field-solver note", i, c, want[i])
		}
	}
	// Holes between slightly different cavities reproduce k.
	for _, a := range r.Apertures {
		if !a.Sized {
			t.Errorf("aperture %d-%d not sized: %s", a.From, a.To, a.Note)
			continue
		}
		h := a.Hole
		back, err := CouplingThrough(r.Cavities[a.From-1].Cavity, r.Cavities[a.To-1].Cavity, te011, h)
		if err != nil {
			t.Fatal(err)
		}
		if apRel(back.K, math.Abs(a.Required)) > 1e-10 {
			t.Errorf("aperture %d-%d: radius %g m gives k = %.10g, want %.10g", a.From, a.To, a.Radius, back.K, a.Required)
		}
	}
}

// TestRealiseHoleWarnings: holes sized outside Bethe's range warn and send
// the user to a field solver; holes inside it do not.
func TestRealiseHoleWarnings(t *testing.T) {
	d := invented4(t)
	r, err := Realise(d, RealiseOptions{Shape: cavity.ByRatio(1.2), Hole: &Hole{Thickness: 1e-3}})
	if err != nil {
		t.Fatal(err)
	}
	for _, a := range r.Apertures {
		if !a.Sized || a.Valid() {
			t.Fatalf("aperture %d-%d: sized %v, valid %v; want a sized hole outside Bethe's range (k = %.4g needs a large hole)", a.From, a.To, a.Sized, a.Valid(), a.Required)
		}
	}
	found := false
	for _, w := range r.Warnings {
		if strings.HasPrefix(w, "aperture 1-2: hole radius") && strings.Contains(w, "is not small against the") && strings.Contains(w, "realise k = ") && strings.Contains(w, "field solver") {
			found = true
		}
	}
	if !found {
		t.Errorf("warnings %q, want one for aperture 1-2 not small against the wavelength", r.Warnings)
	}
	// A narrow filter needs small couplings: holes inside the range.
	dn, err := Synthesize(Spec{F0: 10.7e9, BW: 2e6, Order: 4, ReturnLoss: 20})
	if err != nil {
		t.Fatal(err)
	}
	r, err = Realise(dn, RealiseOptions{Shape: cavity.ByRatio(1.2), Hole: &Hole{}})
	if err != nil {
		t.Fatal(err)
	}
	for _, a := range r.Apertures {
		if !a.Sized || !a.Valid() || a.Note != "" {
			t.Errorf("narrow filter aperture %d-%d: sized %v, problems %q, note %q; want a valid hole", a.From, a.To, a.Sized, a.Problems, a.Note)
		}
	}
	for _, w := range r.Warnings {
		if strings.HasPrefix(w, "aperture") {
			t.Errorf("narrow filter: unexpected warning %q", w)
		}
	}
}

func TestRealiseTE111Polarisation(t *testing.T) {
	d := invented4(t)
	r, err := Realise(d, RealiseOptions{Mode: cavity.Mode{Family: cavity.TE, N: 1, M: 1, P: 1}, Shape: cavity.ByRatio(1)})
	if err != nil {
		t.Fatal(err)
	}
	if len(r.Warnings) == 0 || !strings.Contains(r.Warnings[0], "TE111 has two polarisations") {
		t.Errorf("TE111 warnings = %q, want the second polarisation first (no companion)", r.Warnings)
	}
	for _, s := range r.Spurious {
		if s.Companion {
			t.Errorf("TE111 has no exact companion, got %s", s.Mode)
		}
	}
}

func TestRealiseErrors(t *testing.T) {
	d := invented4(t)
	shape := cavity.ByRatio(1.2)
	hot := qfactor.SameWalls(qfactor.Surface{Conductor: physics.Conductor{Name: "user", Conductivity: copperSigma}, Temperature: 3000})
	for _, c := range []struct {
		name string
		d    *Design
		opts RealiseOptions
		want string
	}{
		{"nil design", nil, RealiseOptions{Shape: shape}, "needs a synthesised design"},
		{"no shape", d, RealiseOptions{}, "needs a cavity shape"},
		{"bad mode", d, RealiseOptions{Shape: shape, Mode: cavity.Mode{Family: cavity.TE, M: 1}}, "TE modes need p >= 1"},
		{"bad window", d, RealiseOptions{Shape: shape, Window: 2}, "spurious search window must be in (0, 0.95]"},
		{"negative window", d, RealiseOptions{Shape: shape, Window: -0.1}, "got -0.1"},
		{"bad stopband", d, RealiseOptions{Shape: shape, Stopbands: []Stopband{{Low: 12e9, High: 11e9}}}, "stopband 1 must have 0 < low < high"},
		{"bad attenuation", d, RealiseOptions{Shape: shape, Stopbands: []Stopband{{Low: 11e9, High: 12e9, Attenuation: math.NaN()}}}, "attenuation must be >= 0 dB"},
		{"bad loss", d, RealiseOptions{Shape: shape, Fill: physics.Medium{TanDelta: -1}}, "loss tangent"},
		{"bad fill", d, RealiseOptions{Shape: shape, Fill: physics.Medium{EpsR: 0.5}}, "resonator 1"},
		{"infeasible", d, RealiseOptions{Shape: cavity.ByDiameter(0.01)}, "cut off"},
		{"walls error", d, RealiseOptions{Shape: shape, Walls: &hot}, "filter: walls: side wall (r = a): wall temperature must be above 0 K and at most 2000 K"},
	} {
		_, err := Realise(c.d, c.opts)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error = %v, want one containing %q", c.name, err, c.want)
		}
	}
}

func BenchmarkRealise(b *testing.B) {
	d := invented4(b)
	opts := RealiseOptions{Shape: cavity.ByRatio(1.2), Walls: copperWalls(), Hole: &Hole{Thickness: 1e-3}}
	for b.Loop() {
		if _, err := Realise(d, opts); err != nil {
			b.Fatal(err)
		}
	}
}

// An invented 4-cavity TE011 filter at 10.7 GHz, 40 MHz wide, in copper
// cavities with D/L = 1.2, realised with 1 mm coupling walls.
func ExampleRealise() {
	d, err := Synthesize(Spec{F0: 10.7e9, BW: 40e6, Order: 4, ReturnLoss: 20,
		Rejections: []Rejection{{F: 10.8e9, Attenuation: 40}}})
	if err != nil {
		fmt.Println(err)
		return
	}
	copper := qfactor.SameWalls(qfactor.Surface{Conductor: physics.Conductor{Name: "copper", Conductivity: 5.8e7}})
	r, err := Realise(d, RealiseOptions{Shape: cavity.ByRatio(1.2), Walls: &copper, Hole: &Hole{Thickness: 1e-3}})
	if err != nil {
		fmt.Println(err)
		return
	}
	c := r.Cavities[0]
	fmt.Printf("%d x %s: D = %s, L = %s, Q0 = %.0f\n", len(r.Cavities), r.Mode,
		physics.FormatLength(c.Cavity.Diameter(), 4), physics.FormatLength(c.Cavity.Length, 4), c.Q0)
	for _, s := range r.Spurious {
		if math.Abs(s.Relative) < 0.1 {
			fmt.Printf("spurious %s at %s (%+.1f %%) companion=%v stopband=%v\n", s.Mode, physics.FormatFrequency(s.F, 5), 100*s.Relative, s.Companion, s.Stopband >= 0)
		}
	}
	for _, a := range r.Apertures {
		fmt.Printf("hole %d-%d: k = %.5f, radius %s, inside Bethe's range: %v\n", a.From, a.To, a.Required, physics.FormatLength(a.Radius, 3), a.Valid())
	}
	fmt.Printf("Qext = %.2f, %d warnings\n", r.Ports[0].Qext, len(r.Warnings))
	// Output:
	// 4 x TE011: D = 38.08 mm, L = 31.74 mm, Q0 = 28688
	// spurious TE112 at 10.513 GHz (-1.8 %) companion=false stopband=false
	// spurious TM111 at 10.700 GHz (+0.0 %) companion=true stopband=false
	// spurious TM012 at 11.205 GHz (+4.7 %) companion=false stopband=true
	// spurious TE311 at 11.538 GHz (+7.8 %) companion=false stopband=true
	// hole 1-2: k = 0.00340, radius 5.29 mm, inside Bethe's range: false
	// hole 2-3: k = 0.00262, radius 4.90 mm, inside Bethe's range: false
	// hole 3-4: k = 0.00340, radius 5.29 mm, inside Bethe's range: false
	// Qext = 249.64, 9 warnings
}

// TestRealiseFromOptimiser realises a design in the cavity shape chosen by
// the cavity optimiser (the value passed in as cavity.ByRatio(opt.Ratio)):
// the cavities are the optimiser's, since both size for the same mode and
// frequency.
func TestRealiseFromOptimiser(t *testing.T) {
	d := invented4(t)
	te011 := cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}
	opt, err := cavity.Optimize(cavity.DesignSpec{Mode: te011, Frequency: d.Spec.F0})
	if err != nil {
		t.Fatal(err)
	}
	r, err := Realise(d, RealiseOptions{Shape: cavity.ByRatio(opt.Ratio)})
	if err != nil {
		t.Fatal(err)
	}
	for _, cd := range r.Cavities {
		if apRel(cd.Cavity.Radius, opt.Cavity.Radius) > realRouteTol || apRel(cd.Cavity.Length, opt.Cavity.Length) > realRouteTol {
			t.Errorf("resonator %d: cavity %+v, want the optimiser's %+v", cd.Resonator, cd.Cavity, opt.Cavity)
		}
		if !math.IsInf(cd.Q0, 1) {
			t.Errorf("resonator %d: Q0 = %g with lossless walls and fill, want +Inf", cd.Resonator, cd.Q0)
		}
	}
	// The optimiser maximises the clearance, the distance to the nearest
	// mode other than the companion: no spurious mode may come nearer.
	for _, s := range r.Spurious {
		if !s.Companion && math.Abs(s.Relative) < opt.Clearance.Value*(1-1e-9) {
			t.Errorf("spurious %s at %+.4f %% from f0, inside the optimiser's clearance %.4f %%", s.Mode, 100*s.Relative, 100*opt.Clearance.Value)
		}
	}
}

// TestRealiseValidity checks that Realise gives each cavity the verdict of
// qfactor.Validity (tested against independent routes in package qfactor)
// and the wall models' warnings once. The fill's tan delta = 0.02 bounds
// Q0 by Q_fill = 1/tan delta = 50 (Pozar sec. 6.3), below
// qfactor.MinValidQ, so every cavity must carry the LowQ warning; the
// walls' mu_r = 50 must give MagneticWall.
func TestRealiseValidity(t *testing.T) {
	d := invented4(t)
	const note = "invented ferromagnetic test metal"
	walls := qfactor.SameWalls(qfactor.Surface{Conductor: physics.Conductor{
		Name: "user", Conductivity: 1e7, MuR: 50, Ferromagnetic: true, Note: note}})
	r, err := Realise(d, RealiseOptions{Shape: cavity.ByRatio(1.2), Fill: physics.Medium{EpsR: 2, TanDelta: 0.02}, Walls: &walls})
	if err != nil {
		t.Fatal(err)
	}
	for _, cd := range r.Cavities {
		if want := qfactor.Validity(cd.Cavity, walls, cd.Loss); !reflect.DeepEqual(cd.Validity, want) {
			t.Errorf("cavity %d: Validity = %v, want qfactor.Validity = %v", cd.Resonator, cd.Validity, want)
		}
		var checks []qfactor.Check
		for _, w := range cd.Validity {
			checks = append(checks, w.Check)
		}
		if !slices.Contains(checks, qfactor.LowQ) || !slices.Contains(checks, qfactor.MagneticWall) {
			t.Errorf("cavity %d (Q0 = %g): checks %v, want LowQ and MagneticWall", cd.Resonator, cd.Q0, checks)
		}
	}
	if len(r.WallWarnings) != 1 || !strings.Contains(r.WallWarnings[0], note) {
		t.Errorf("wall warnings = %q, want the ferromagnetic note once for the 4 cavities", r.WallWarnings)
	}

	// Perfectly conducting walls and a lossless fill: nothing to warn of.
	r, err = Realise(d, RealiseOptions{Shape: cavity.ByRatio(1.2)})
	if err != nil {
		t.Fatal(err)
	}
	for _, cd := range r.Cavities {
		if cd.Validity != nil || !math.IsInf(cd.Q0, 1) {
			t.Errorf("cavity %d, lossless: Q0 = %g, validity %v; want +Inf, none", cd.Resonator, cd.Q0, cd.Validity)
		}
	}
	if r.WallWarnings != nil {
		t.Errorf("lossless: wall warnings %q, want none", r.WallWarnings)
	}
}
