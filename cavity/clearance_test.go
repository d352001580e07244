package cavity

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"cylcav/physics"
)

// Bessel zeros for independent frequencies, from Abramowitz & Stegun,
// Handbook of Mathematical Functions, Table 9.5 (recalled from memory;
// the digits agree with mpmath 1.3.0 besseljzero).
const (
	jp01 = 3.83170597020751 // j'_{0,1} = j_{1,1}
	jp21 = 3.05423692822714
	j01  = 2.40482555769577
)

// TestClearancePozarPTFE: the PTFE-filled TE011 cavity of Pozar's worked
// example (Microwave Engineering, 4th ed., sec. 6.4: 5 GHz, eps_r = 2.08,
// d = 2a, a = 2.74 cm; recalled from memory). Every neighbour frequency is
// recomputed here from the tabulated zeros with the chart relation
// (kD)^2 = 4x^2 + (p pi D/L)^2 at D/L = 1.
func TestClearancePozarPTFE(t *testing.T) {
	const eps = 2.08
	c := Cavity{Radius: 0.0274, Length: 0.0548, Fill: physics.Medium{EpsR: eps}}
	f := func(x float64, p int) float64 {
		return math.Sqrt(4*x*x+float64(p*p)*math.Pi*math.Pi) / (2 * 0.0274) / (2 * math.Pi * math.Sqrt(eps)) * 299792458
	}
	fw := f(jp01, 1)
	const exampleRounding = 0.002 // a = 2.74 cm is rounded to 3 digits
	if math.Abs(fw-5e9) > exampleRounding*5e9 {
		t.Fatalf("Pozar cavity f(TE011) = %g Hz, want 5 GHz to the example's rounding", fw)
	}
	cl, err := c.Clearance(mustMode(t, "TE011"), ClearanceOptions{Window: 0.1})
	if err != nil {
		t.Fatal(err)
	}
	// Nearest below TM012 (x = j_01, p = 2), above TE212 (j'_21, p = 2).
	below, above := f(j01, 2), f(jp21, 2)
	const tableTol = 1e-12 // the table digits above are good to 1e-14
	if cl.Below == nil || cl.Below.Mode != mustMode(t, "TM012") || math.Abs(cl.Below.Frequency-below) > tableTol*below {
		t.Errorf("Pozar PTFE cavity nearest below = %+v, want TM012 at %.12g Hz", cl.Below, below)
	}
	if cl.Above == nil || cl.Above.Mode != mustMode(t, "TE212") || math.Abs(cl.Above.Frequency-above) > tableTol*above {
		t.Errorf("Pozar PTFE cavity nearest above = %+v, want TE212 at %.12g Hz", cl.Above, above)
	}
	if want := 1 - below/fw; math.Abs(cl.Value-want) > routeTol || cl.Limiting != mustMode(t, "TM012") {
		t.Errorf("Pozar PTFE clearance = %.12g (%s), want %.12g (TM012)", cl.Value, cl.Limiting, want)
	}
	if len(cl.Degenerate) != 1 || cl.Degenerate[0] != mustMode(t, "TM111") {
		t.Errorf("Pozar PTFE degenerate = %v, want [TM111]", cl.Degenerate)
	}
	// Within +-10 %: TM012 (-4.5 %), TM110 (-7.5 %), TE212 (+5.8 %),
	// TE311 (+8.3 %).
	var got []string
	for _, nb := range cl.InWindow {
		got = append(got, nb.Mode.String())
	}
	if want := []string{"TM110", "TM012", "TE212", "TE311"}; !slices.Equal(got, want) {
		t.Errorf("Pozar PTFE modes within 10 %% = %v, want %v", got, want)
	}
	if cl.FreeLow != cl.Below.Frequency || cl.FreeHigh != cl.Above.Frequency {
		t.Errorf("spurious-free window %g..%g, want %g..%g", cl.FreeLow, cl.FreeHigh, cl.Below.Frequency, cl.Above.Frequency)
	}
}

// TestClearanceCompanion: counting the exact companion makes the clearance
// zero; the lowest mode has nothing below.
func TestClearanceCompanion(t *testing.T) {
	c := Cavity{Radius: 0.02, Length: 0.03}
	cl, err := c.Clearance(mustMode(t, "TE011"), ClearanceOptions{CountDegenerate: true})
	if err != nil {
		t.Fatal(err)
	}
	if cl.Value != 0 || cl.Limiting != mustMode(t, "TM111") {
		t.Errorf("Clearance(TE011, count degenerate) = %g (%s), want 0 (TM111)", cl.Value, cl.Limiting)
	}
	// TE111 is the lowest mode for D/L < 2.03 (TE111 and TM010 cross there).
	c = Cavity{Radius: 0.02, Length: 0.08}
	cl, err = c.Clearance(mustMode(t, "TE111"), ClearanceOptions{WindowHz: 1e9})
	if err != nil {
		t.Fatal(err)
	}
	if cl.Below != nil || cl.FreeLow != 0 || len(cl.Degenerate) != 0 {
		t.Errorf("Clearance(TE111, the lowest mode) below %v, free low %g, degenerate %v, want none", cl.Below, cl.FreeLow, cl.Degenerate)
	}
	for _, nb := range cl.InWindow {
		if math.Abs(nb.Offset) > 1e9 {
			t.Errorf("mode %s at offset %g Hz listed in a 1 GHz window", nb.Mode, nb.Offset)
		}
	}
	if _, err := c.Clearance(mustMode(t, "TE011"), ClearanceOptions{Window: -1}); err == nil {
		t.Errorf("Clearance(window -1) error = nil, want an error")
	}
}

// TestEnvelopeLevelSets checks the closed-form notches and feasible sets
// against direct evaluation at seeded random points, with and without a
// tuning and temperature path.
func TestEnvelopeLevelSets(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	w := newChartMode(mustMode(t, "TE011"))
	for _, pa := range []path{newPath(0, 0, 1, 1), newPath(w.gx/w.gp, 0.02, 0.999, 1.002)} {
		full := interval{0.5 * 0.5, 3 * 3}
		env, _, err := boundedEnvelope(w, pa, full, false)
		if err != nil {
			t.Fatal(err)
		}
		for _, b := range []float64{0.01, 0.03, 0.06} {
			feas := env.feasible([]interval{full}, b)
			for range 2000 {
				s := full.lo + (full.hi-full.lo)*rng.Float64()
				v, _ := env.at(s, nil)
				in := false
				for _, iv := range feas {
					if s >= iv.lo && s <= iv.hi {
						in = true
					}
				}
				if in != (v >= b) && math.Abs(v-b) > routeTol {
					t.Errorf("feasible(%g) membership of s = %g is %v, but C(s) = %g", b, s, in, v)
				}
			}
		}
	}
}

// TestPolyRoots checks the root isolation on polynomials with known roots.
func TestPolyRoots(t *testing.T) {
	// Near-double roots are ill-conditioned: found to about sqrt(eps) =
	// 1e-8 (rootFoundTol), and a candidate returned near them may sit a
	// little further off (rootNearTol).
	const rootFoundTol, rootNearTol = 1e-7, 1e-6
	for _, tc := range []struct {
		roots []float64
	}{{[]float64{0.3, 1.7}}, {[]float64{0.5, 0.6, 2.5, 4}}, {[]float64{1, 1.000001, 3}}, {[]float64{2}}} {
		// Expand prod (s - r).
		c := []float64{1}
		for _, r := range tc.roots {
			n := make([]float64, len(c)+1)
			for i, a := range c {
				n[i+1] += a
				n[i] -= r * a
			}
			c = n
		}
		got := polyRoots(c, interval{0, 10}, nil)
		// Every root is found; near-double roots are ill-conditioned (about
		// sqrt(eps) = 1e-8) and may come with an extra candidate near them,
		// which the callers tolerate (candidates are only evaluated).
		for _, r := range tc.roots {
			found := false
			for _, g := range got {
				found = found || math.Abs(g-r) <= rootFoundTol
			}
			if !found {
				t.Errorf("polyRoots(%v) = %v, want a root at %g", c, got, r)
			}
		}
		for _, g := range got {
			near := false
			for _, r := range tc.roots {
				near = near || math.Abs(g-r) <= rootNearTol
			}
			if !near {
				t.Errorf("polyRoots(%v) returned %g, which is no root", c, g)
			}
		}
	}
}
