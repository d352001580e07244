package axisym

import (
	"math"
	"sort"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// transverseTol is the agreement required for test group 2 of the issue:
// both sides bracket their roots far below it.
const transverseTol = 1e-9

// transverseRoots returns every root below fmax of the transverse-resonance
// condition of a cylinder of radius a made of two full-radius layers
// (length l1, fill m1 and l2, m2) between metal plates, for the n = 0 mode
// of family fam and radial index 1..mmax. Along z each mode is a
// transmission line shorted at both ends, and at the interface the
// admittances looking left and right add to zero (Collin, Field Theory of
// Guided Waves, 2nd ed., sec. 6.x transverse resonance; Harrington,
// Time-Harmonic Electromagnetic Fields, sec. 4.x, as recalled). Written
// without poles, with c_i = cos(beta_i l_i) and s_i = sin(beta_i l_i)/beta_i
// (both even in beta_i, so real below cutoff too):
//
//	TE: mu2 c1 s2 + mu1 c2 s1 = 0
//	TM: eps1 c1 beta2^2 s2 + eps2 c2 beta1^2 s1 = 0
//
// The roots are found by a dense scan and bisection, independently of the
// solver's count.
func transverseRoots(fam cavity.Family, a, l1, l2 float64, m1, m2 physics.Medium, fmax float64, mmax int) []float64 {
	var zeros []float64
	if fam == cavity.TE {
		zeros = []float64{3.8317059702075123, 7.0155866698156188, 10.173468135062722, 13.323691936314223, 16.470630050877633, 19.615858510468243, 22.760084380592772, 25.903672087618382} // j_{1,m}, A&S Table 9.5 (recalled)
	} else {
		zeros = []float64{2.4048255576957728, 5.5200781102863106, 8.6537279129110122, 11.791534439014281, 14.930917708487786, 18.071063967910922, 21.211636629879258, 24.352471530749302} // j_{0,m}, A&S Table 9.5 (recalled)
	}
	cs := func(b2, l float64) (c, s float64) {
		if b2 >= 0 {
			b := math.Sqrt(b2)
			if b == 0 {
				return 1, l
			}
			return math.Cos(b * l), math.Sin(b*l) / b
		}
		al := math.Sqrt(-b2)
		return math.Cosh(al * l), math.Sinh(al*l) / al
	}
	var roots []float64
	for m := range mmax {
		kc := zeros[m] / a
		F := func(f float64) float64 {
			k0 := 2 * math.Pi * f / physics.SpeedOfLight
			b1 := k0*k0*m1.Eps()*m1.Mu() - kc*kc
			b2 := k0*k0*m2.Eps()*m2.Mu() - kc*kc
			c1, s1 := cs(b1, l1)
			c2, s2 := cs(b2, l2)
			if fam == cavity.TE {
				return m2.Mu()*c1*s2 + m1.Mu()*c2*s1
			}
			return m1.Eps()*c1*b2*s2 + m2.Eps()*c2*b1*s1
		}
		const steps = 200000
		prev, fp := F(fmax/steps), fmax/steps
		for i := 2; i <= steps; i++ {
			f := fmax * float64(i) / steps
			v := F(f)
			if v == 0 || (v < 0) != (prev < 0) {
				lo, hi := fp, f
				for hi-lo > 1e-15*hi {
					mid := 0.5 * (lo + hi)
					if (F(mid) < 0) == (prev < 0) {
						lo = mid
					} else {
						hi = mid
					}
				}
				roots = append(roots, 0.5*(lo+hi))
			}
			prev, fp = v, f
		}
	}
	sort.Float64s(roots)
	return roots
}

// TestTwoFills is test group 2: two sections of one radius with different
// fills (a full-radius dielectric disc against an end plate) against the
// transverse-resonance closed form.
func TestTwoFills(t *testing.T) {
	const a, l1, l2 = 0.015, 0.0073, 0.0211
	m1 := physics.Medium{Name: "disc", EpsR: 9.6}
	m2 := physics.Medium{}
	b := Body{Sections: []Section{{Length: l1, Radius: a, Fill: m1}, {Length: l2, Radius: a, Fill: m2}}}
	const fmax = 24e9
	got, err := Solve(b, Request{MaxFrequency: fmax, Modes: 6})
	if err != nil {
		t.Fatal(err)
	}
	for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
		want := transverseRoots(fam, a, l1, l2, m1, m2, fmax, 8)
		if math.Sqrt(physics.Medium{EpsR: 9.6}.Eps())*2*math.Pi*fmax/physics.SpeedOfLight*a > 24.3 {
			t.Fatal("fmax too high for the eight radial indices of transverseRoots")
		}
		var g []float64
		for _, r := range got {
			if r.Family == fam {
				g = append(g, r.Frequency)
			}
		}
		if len(g) != len(want) {
			t.Fatalf("%v0: %d resonances below %g Hz, want %d (transverse resonance)", fam, len(g), fmax, len(want))
		}
		for i := range want {
			if d := math.Abs(g[i]-want[i]) / want[i]; d > transverseTol {
				t.Errorf("%v0 #%d = %.15g Hz, want %.15g Hz (transverse resonance), rel. error %.2g", fam, i+1, g[i], want[i], d)
			}
		}
		if len(want) < 5 {
			t.Errorf("%v0: only %d resonances; choose a higher fmax for a meaningful test", fam, len(want))
		}
	}
}
