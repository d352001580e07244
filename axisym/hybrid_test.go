package axisym

import (
	"errors"
	"math"
	"sort"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// orderList returns the TE_nmp and TM_nmp modes of order n of c below fmax
// from package cavity's enumeration (closed form: zeros of J_n and J'_n
// from physics/bessel; Pozar, Microwave Engineering, 4th ed., sec. 6.4),
// in frequency order.
func orderList(t *testing.T, c cavity.Cavity, n int, fmax float64) []cavity.Resonance {
	t.Helper()
	all, err := c.Modes(fmax)
	if err != nil {
		t.Fatal(err)
	}
	var out []cavity.Resonance
	for _, r := range all {
		if r.Mode.N == n {
			out = append(out, r)
		}
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].Frequency < out[j].Frequency })
	return out
}

// TestHybridOneSection: a body of one section (and the same cylinder cut
// into three equal-radius pieces of different lengths) has every TE_nmp
// and TM_nmp of order n = 1, 2 below the limit at the closed-form
// frequency of package cavity to 1e-10, none missing, none extra, each
// labelled with its own mode (test group 1 of issue 11 for n >= 1).
func TestHybridOneSection(t *testing.T) {
	c := cavity.Cavity{Radius: 0.020, Length: 0.033}
	fill := physics.Medium{EpsR: 1}
	bodies := map[string]Body{
		"one section": {Sections: []Section{{Length: c.Length, Radius: c.Radius, Fill: fill}}},
		"three cuts": {Sections: []Section{
			{Length: 0.010, Radius: c.Radius}, {Length: 0.0131, Radius: c.Radius}, {Length: 0.0099, Radius: c.Radius}}},
	}
	const fmax = 30e9
	for _, n := range []int{1, 2} {
		want := orderList(t, c, n, fmax)
		if len(want) < 20 {
			t.Fatalf("n = %d: only %d closed-form modes below %g Hz; the test wants a long list", n, len(want), fmax)
		}
		for name, b := range bodies {
			got, err := Solve(b, Request{Order: n, MaxFrequency: fmax, Modes: 8})
			if err != nil {
				t.Fatalf("%s, n = %d: %v", name, n, err)
			}
			if len(got) != len(want) {
				t.Fatalf("%s, n = %d: %d resonances below %g Hz, want %d (closed form)", name, n, len(got), fmax, len(want))
			}
			for i, w := range want {
				g := got[i]
				if d := math.Abs(g.Frequency-w.Frequency) / w.Frequency; d > closedTol {
					t.Errorf("%s, n = %d, #%d: %.15g Hz, want %.15g Hz (%v, closed form), rel. error %.2g",
						name, n, i+1, g.Frequency, w.Frequency, w.Mode, d)
				}
				if !g.OriginTied && g.Origin != w.Mode {
					t.Errorf("%s, n = %d, #%d: label %v, want %v", name, n, i+1, g.Origin, w.Mode)
				}
			}
		}
	}
}

// TestHybridCouplingQuadrature checks the closed-form coupling of two
// circular guides of order n (derived in hybrid.go with Green's identity
// and Stokes' theorem) against direct quadrature of the field components
// e_r e'_r + e_phi e'_phi over the narrow disc (phi integrals pi), and the
// Gram matrix of one guide against the identity: the closed forms and the
// normalisation are independent of the quadrature, which uses the field
// components written out in hybrid.go.
func TestHybridCouplingQuadrature(t *testing.T) {
	for _, n := range []int{1, 2, 3} {
		w := newHybridGuide(n, 0.030, 6, 6)
		g := newHybridGuide(n, 0.017, 5, 5)
		for _, c := range []struct {
			name string
			w, g hybridGuide
		}{{"step", w, g}, {"gram", w, newHybridGuide(n, 0.030, 6, 6)}} {
			var m []float64
			if c.name == "gram" {
				// Force the general formulas by a radius that differs in the
				// last bit from w's (the equal-radius branch is the identity).
				c.g.radius = math.Nextafter(c.g.radius, 0)
			}
			m = hybridCoupling(c.w, c.g)
			ng := len(c.g.kc)
			for i := range c.w.kc {
				for j := range c.g.kc {
					q := quadCoupling(c.w, i, c.g, j)
					if c.name == "gram" {
						want := 0.0
						if i == j {
							want = 1
						}
						if math.Abs(q-want) > 1e-9 {
							t.Errorf("n = %d gram [%d][%d]: quadrature %.12g, want %g", n, i, j, q, want)
						}
					}
					if math.Abs(m[i*ng+j]-q) > 1e-9 {
						t.Errorf("n = %d %s [%d][%d]: closed form %.12g, quadrature %.12g", n, c.name, i, j, m[i*ng+j], q)
					}
				}
			}
		}
	}
}

// hybridField returns N (e_r, e_phi) without the angular factors of mode i
// of g at radius r (see hybrid.go): TE ((n/r) J_n, kc J_n'), TM (kc J_n',
// (n/r) J_n).
func hybridField(g hybridGuide, i int, r float64) (er, ephi float64) {
	k, n := g.kc[i], g.n
	x := k * r
	j := math.Jn(n, x)
	jp := 0.5 * (math.Jn(n-1, x) - math.Jn(n+1, x))
	if i < g.te {
		return g.norm[i] * float64(n) / r * j, g.norm[i] * k * jp
	}
	return g.norm[i] * k * jp, g.norm[i] * float64(n) / r * j
}

// quadCoupling integrates pi int_0^a (e_r e'_r + e_phi e'_phi) r dr by
// composite Gauss-Legendre quadrature (5 points on 400 panels). The
// angular factors: TE e_r ~ sin, e_phi ~ cos; TM the same, so every
// product carries pi.
func quadCoupling(w hybridGuide, i int, g hybridGuide, j int) float64 {
	xs := [5]float64{-0.9061798459386640, -0.5384693101056831, 0, 0.5384693101056831, 0.9061798459386640}
	ws := [5]float64{0.2369268850561891, 0.4786286704993665, 0.5688888888888889, 0.4786286704993665, 0.2369268850561891}
	a := g.radius
	const panels = 400
	h := a / panels
	var s float64
	for p := range panels {
		for k, x := range xs {
			r := h*float64(p) + h/2*(1+x)
			wr, wp := hybridField(w, i, r)
			gr, gp := hybridField(g, j, r)
			s += ws[k] * h / 2 * r * (wr*gr + wp*gp)
		}
	}
	return math.Pi * s
}

// TestHybridRefuses: n >= 1 for open, coaxial and layered bodies is not
// implemented and says so; a family filter is refused (the families
// couple); Losses gives a LossErr wrapping ErrNotImplemented.
func TestHybridRefuses(t *testing.T) {
	closed := Body{Sections: []Section{{Length: 0.02, Radius: 0.01}}}
	for name, b := range map[string]Body{
		"open":    {Sections: closed.Sections, EndB: Pipe},
		"coaxial": {Sections: []Section{{Length: 0.02, Radius: 0.01, InnerRadius: 0.003}}},
		"layered": {Sections: []Section{{Length: 0.02, Radius: 0.01, Layers: []Layer{
			{Radius: 0.004, Medium: physics.Medium{EpsR: 10}}, {Radius: 0.01}}}}},
	} {
		_, err := Solve(b, Request{Order: 1, MaxFrequency: 20e9})
		if !errors.Is(err, ErrNotImplemented) {
			t.Errorf("%s: err = %v, want ErrNotImplemented", name, err)
		}
	}
	if _, err := Solve(closed, Request{Order: 1, MaxFrequency: 20e9, Families: []cavity.Family{cavity.TE}}); err == nil {
		t.Error("a family filter with n = 1 was accepted")
	}
	r, err := Solve(closed, Request{Order: 1, MaxFrequency: 30e9, Losses: true})
	if err != nil || len(r) == 0 {
		t.Fatal(len(r), err)
	}
	for _, x := range r {
		if x.Loss != nil || !errors.Is(x.LossErr, ErrNotImplemented) {
			t.Errorf("%v: Loss %v, LossErr %v; want nil and ErrNotImplemented", x.Origin, x.Loss, x.LossErr)
		}
	}
}
