package cavity

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"cylcav/physics"
)

// bruteZeros finds the zeros of f on (lo, hi] by scanning in steps of h and
// bisecting each sign change. It is the slow, obvious method, used only to
// check the enumeration.
func bruteZeros(f func(float64) float64, lo, hi, h float64) []float64 {
	var out []float64
	x, fx := lo, f(lo)
	for x < hi {
		y := math.Min(x+h, hi)
		fy := f(y)
		if fx != 0 && (fx < 0) != (fy < 0) {
			a, b, fa := x, y, fx
			for b-a > 1e-15*b {
				mid := 0.5 * (a + b)
				fm := f(mid)
				if (fm < 0) == (fa < 0) {
					a, fa = mid, fm
				} else {
					b = mid
				}
			}
			out = append(out, 0.5*(a+b))
		}
		x, fx = y, fy
	}
	return out
}

// TestModesBruteForce checks that Modes is complete and duplicate-free
// against an independent enumeration: zeros of J_n and of
// J'_n = (J_{n-1} - J_{n+1})/2 (DLMF 10.6.1; J'_0 = -J_1, DLMF 10.6.3) found
// by scanning Go's math.Jn, and every axial index tried.
func TestModesBruteForce(t *testing.T) {
	// bruteTol: bisection to 1e-15 relative plus math.Jn's accuracy near
	// the zeros (Go's jn.go: within a few ulps there for x >= n).
	const bruteTol = 1e-12
	c := Cavity{Radius: 0.03, Length: 0.045, Fill: physics.Medium{EpsR: 2.1}}
	const fmax = 2.5e10
	s := physics.SpeedOfLight / (2 * math.Pi * math.Sqrt(2.1))
	xmax := fmax / s * c.Radius
	want := map[Mode]float64{}
	for n := 0; float64(n) <= xmax; n++ {
		jn := func(x float64) float64 { return math.Jn(n, x) }
		djn := func(x float64) float64 {
			if n == 0 {
				return -math.J1(x)
			}
			return (math.Jn(n-1, x) - math.Jn(n+1, x)) / 2
		}
		for _, fam := range []Family{TE, TM} {
			f, pmin := jn, 0
			if fam == TE {
				f, pmin = djn, 1
			}
			for i, x := range bruteZeros(f, 0.1, xmax+1, 0.01) {
				for p := pmin; ; p++ {
					fr := s * math.Hypot(x/c.Radius, float64(p)*math.Pi/c.Length)
					if fr > fmax {
						break
					}
					if math.Abs(fr-fmax) < 1e-9*fmax {
						t.Fatalf("brute force: %v%d%d%d lies at the limit; choose another fmax", fam, n, i+1, p)
					}
					want[Mode{fam, n, i + 1, p}] = fr
				}
			}
		}
	}
	got, err := c.Modes(fmax)
	if err != nil {
		t.Fatal(err)
	}
	seen := map[Mode]bool{}
	for _, r := range got {
		if seen[r.Mode] {
			t.Errorf("Modes(%g) lists %v twice", fmax, r.Mode)
		}
		seen[r.Mode] = true
		w, ok := want[r.Mode]
		if !ok {
			t.Errorf("Modes(%g) lists %v at %g Hz, which brute force does not find", fmax, r.Mode, r.Frequency)
			continue
		}
		if e := relErr(r.Frequency, w); e > bruteTol {
			t.Errorf("f(%v) = %.15g, want %.15g (brute force)", r.Mode, r.Frequency, w)
		}
	}
	for m := range want {
		if !seen[m] {
			t.Errorf("Modes(%g) misses %v at %g Hz", fmax, m, want[m])
		}
	}
	if len(want) < 300 {
		t.Fatalf("brute force found only %d modes; the test cavity is too small to mean much", len(want))
	}
	if !slices.IsSortedFunc(got, Resonance.Compare) {
		t.Errorf("Modes(%g) is not sorted by Resonance.Compare", fmax)
	}
}

// TestWeyl checks the total number of field patterns (modes counted with
// their polarisations) against Weyl's law for the electromagnetic field in
// a cavity, N(f) ~ 8 pi V f^3 / (3 c^3) (Weyl 1912; for the
// electromagnetic case see Balian & Bloch, Ann. Phys. 64, 271 (1971), whose
// result, recalled from memory, is that the surface term of order f^2
// cancels between TE and TM, leaving corrections of relative order 1/f^2).
// The ratio must approach 1 as f grows. The test prints the ratios with -v.
func TestWeyl(t *testing.T) {
	c := Cavity{Radius: 0.4, Length: 0.9} // an invented, roughly cubic cavity
	weyl := func(f float64) float64 {
		return 8 * math.Pi * c.Volume() * f * f * f / (3 * physics.SpeedOfLight * physics.SpeedOfLight * physics.SpeedOfLight)
	}
	// Frequencies where Weyl predicts about 1e3, 1e4, 1e5 and 1e6 modes.
	freqs := []float64{}
	for _, n := range []float64{1e3, 1e4, 1e5, 1e6} {
		freqs = append(freqs, math.Cbrt(n/weyl(1)))
	}
	// Limits on |N/Weyl - 1| at each frequency: generous bounds that a
	// wrong count (a missing family, lost polarisations, a factor in V)
	// would break by far; the measured deviations are printed.
	limits := []float64{0.10, 0.04, 0.015, 0.005}
	prev := math.Inf(1)
	for i, f := range freqs {
		_, fields, err := c.Count(f)
		if err != nil {
			t.Fatal(err)
		}
		ratio := float64(fields) / weyl(f)
		dev := math.Abs(ratio - 1)
		t.Logf("f = %.4g Hz: N = %d, Weyl = %.6g, ratio = %.5f", f, fields, weyl(f), ratio)
		if dev > limits[i] {
			t.Errorf("N(%.4g Hz)/Weyl = %.5f, want within %g of 1", f, ratio, limits[i])
		}
		if dev > prev {
			t.Errorf("|N/Weyl - 1| grew from %.3g to %.3g at %.4g Hz; want it to shrink as f grows", prev, dev, f)
		}
		prev = dev
	}
}

// TestScaling checks that scaling every dimension by s divides every
// frequency by s (Maxwell's equations have no length scale; Pozar, sec.
// 6.7: f depends on a and d only through x/a and p pi/d): the whole list of
// the lowest modes is the same, in the same order, at frequencies divided
// by s.
func TestScaling(t *testing.T) {
	// scaleTol: a few ulps from the divisions x/a and p pi/d.
	const scaleTol = 1e-15 * 4
	rng := rand.New(rand.NewPCG(1, 2))
	for range 20 {
		c := Cavity{Radius: 0.005 + 0.05*rng.Float64(), Length: 0.005 + 0.1*rng.Float64(), Fill: physics.Medium{EpsR: 1 + 9*rng.Float64()}}
		s := math.Exp(3 * (rng.Float64() - 0.5))
		cs := Cavity{Radius: s * c.Radius, Length: s * c.Length, Fill: c.Fill}
		a, err := c.Lowest(200)
		if err != nil {
			t.Fatal(err)
		}
		b, err := cs.Lowest(200)
		if err != nil {
			t.Fatal(err)
		}
		if len(a) != len(b) {
			t.Fatalf("%+v scaled by %g: %d modes, want %d", c, s, len(b), len(a))
		}
		for i := range a {
			if a[i].Mode != b[i].Mode {
				t.Errorf("%+v scaled by %g: mode %d = %v, want %v", c, s, i, b[i].Mode, a[i].Mode)
			}
			if e := relErr(b[i].Frequency, a[i].Frequency/s); e > scaleTol {
				t.Errorf("%+v scaled by %g: f(%v) = %.17g, want %.17g", c, s, b[i].Mode, b[i].Frequency, a[i].Frequency/s)
			}
		}
	}
}

// TestCompanions checks that TE0mp and TM1mp coincide exactly (J'_0 = -J_1,
// DLMF 10.6.3), bit for bit, that each is reported as the other's
// companion, and that the pair is listed TE first.
func TestCompanions(t *testing.T) {
	c := Cavity{Radius: 0.021, Length: 0.033, Fill: physics.Medium{EpsR: 1.7}}
	modes, err := c.Modes(4e10)
	if err != nil {
		t.Fatal(err)
	}
	idx := map[Mode]int{}
	for i, r := range modes {
		idx[r.Mode] = i
	}
	pairs := 0
	for i, r := range modes {
		comp, ok := r.Companion()
		wantOK := (r.Mode.Family == TE && r.Mode.N == 0) || (r.Mode.Family == TM && r.Mode.N == 1 && r.Mode.P >= 1)
		if ok != wantOK {
			t.Errorf("%v.Companion() ok = %v, want %v", r.Mode, ok, wantOK)
		}
		if !ok {
			continue
		}
		j, found := idx[comp]
		if !found {
			t.Errorf("%v is listed but its companion %v is not", r.Mode, comp)
			continue
		}
		if modes[j].Frequency != r.Frequency {
			t.Errorf("f(%v) = %.17g, want %.17g = f(%v)", comp, modes[j].Frequency, r.Frequency, r.Mode)
		}
		if back, _ := comp.Companion(); back != r.Mode {
			t.Errorf("%v.Companion() = %v, want %v", comp, back, r.Mode)
		}
		if r.Mode.Family == TE {
			pairs++
			if j != i+1 {
				t.Errorf("%v at %d, companion %v at %d; want it right after", r.Mode, i, comp, j)
			}
		}
		if f1, f2 := c.Frequency(r.Mode), c.Frequency(comp); f1 != f2 {
			t.Errorf("Frequency(%v) = %.17g, want %.17g = Frequency(%v)", r.Mode, f1, f2, comp)
		}
	}
	if pairs < 5 {
		t.Fatalf("only %d TE0mp/TM1mp pairs below the limit; test too weak", pairs)
	}
}

func TestLowest(t *testing.T) {
	c := Cavity{Radius: 0.025, Length: 0.05}
	all, err := c.Modes(12e9)
	if err != nil {
		t.Fatal(err)
	}
	for k := 1; k <= 20; k++ {
		got, err := c.Lowest(k)
		if err != nil {
			t.Fatal(err)
		}
		// From modes.txt: TE011/TM111 are entries 8 and 9 (1-based),
		// TE012/TM112 entries 12 and 13; Lowest never splits them.
		want := k
		if k == 8 || k == 12 {
			want = k + 1
		}
		if len(got) != want {
			t.Errorf("len(Lowest(%d)) = %d, want %d", k, len(got), want)
			continue
		}
		if !slices.Equal(got, all[:want]) {
			t.Errorf("Lowest(%d) = %v, want %v", k, got, all[:want])
		}
	}
	// Lowest on a flat and on a long cavity, where the count grows as f^2
	// and as f, against Modes.
	for _, c := range []Cavity{{Radius: 0.2, Length: 0.002}, {Radius: 0.002, Length: 2}} {
		got, err := c.Lowest(500)
		if err != nil {
			t.Fatal(err)
		}
		ref, err := c.Modes(got[len(got)-1].Frequency)
		if err != nil {
			t.Fatal(err)
		}
		if len(got) < 500 || !slices.Equal(got, ref) {
			t.Errorf("%+v: Lowest(500) has %d modes; Modes up to its last frequency has %d or differs", c, len(got), len(ref))
		}
	}
}

func TestCount(t *testing.T) {
	for _, rc := range readReference(t) {
		n, fields, err := rc.cav.Count(rc.fmax)
		if err != nil {
			t.Fatal(err)
		}
		wantFields := 0
		for _, r := range rc.modes {
			wantFields += r.Degeneracy()
		}
		if n != len(rc.modes) || fields != wantFields {
			t.Errorf("%s: Count(%g) = %d, %d, want %d, %d", rc.name, rc.fmax, n, fields, len(rc.modes), wantFields)
		}
	}
}

func TestModesErrors(t *testing.T) {
	good := Cavity{Radius: 0.01, Length: 0.02}
	for _, tc := range []struct {
		c    Cavity
		fmax float64
		want string
	}{
		{good, 0, "frequency limit must be finite and > 0 Hz, got 0 Hz"},
		{good, -1e9, "got -1e+09 Hz"},
		{good, math.NaN(), "got NaN Hz"},
		{good, math.Inf(1), "got +Inf Hz"},
		{Cavity{Radius: -0.003, Length: 0.02}, 1e9, "radius must be in 1e-06..1000 m, got -0.003 m"},
		{Cavity{Radius: 0.01, Length: math.NaN()}, 1e9, "length must be in"},
		{Cavity{Radius: 0.01, Length: 0.02, Fill: physics.Medium{EpsR: 0.5}}, 1e9, "eps_r must be in 1..10000, got 0.5"},
		{good, 1e15, "index"},
		{Cavity{Radius: 1e-3, Length: 1000}, 2e11, "axial index p above 1000"},
		{Cavity{Radius: 1, Length: 1}, 3e10, fmt.Sprintf("more than %d modes", MaxModes)},
		{Cavity{Radius: 1e3, Length: 1e-6}, 1e11, "radial index m above 1000"},
		{Cavity{Radius: 1, Length: 1e-3}, 5.3e10, "azimuthal index n above 1000"},
	} {
		_, err := tc.c.Modes(tc.fmax)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%+v.Modes(%g) error = %v, want it to contain %q", tc.c, tc.fmax, err, tc.want)
		}
	}
	for _, k := range []int{0, -1, MaxModes + 1} {
		if _, err := good.Lowest(k); err == nil || !strings.Contains(err.Error(), fmt.Sprint(k)) {
			t.Errorf("Lowest(%d) error = %v, want one naming %d", k, err, k)
		}
	}
	// A cavity below its lowest mode has none: an empty, non-nil list.
	if got, err := good.Modes(1e9); err != nil || got == nil || len(got) != 0 {
		t.Errorf("Modes(1e9) = %v, %v; want an empty list", got, err)
	}
}

// BenchmarkModes1e5 lists an air cavity with about 1e5 field patterns
// (modes counted with polarisations) below the limit.
func BenchmarkModes1e5(b *testing.B) {
	c := Cavity{Radius: 0.1, Length: 0.2}
	const fmax = 3.95e10
	_, fields, err := c.Count(fmax)
	if err != nil {
		b.Fatal(err)
	}
	n := 0
	for b.Loop() {
		modes, err := c.Modes(fmax)
		if err != nil {
			b.Fatal(err)
		}
		n = len(modes)
	}
	b.ReportMetric(float64(n), "modes")
	b.ReportMetric(float64(fields), "fields")
}

// BenchmarkLowest1000 lists the lowest 1000 modes of a filled cavity.
func BenchmarkLowest1000(b *testing.B) {
	c := Cavity{Radius: 0.0274, Length: 0.0548, Fill: physics.Medium{EpsR: 2.08}}
	for b.Loop() {
		if _, err := c.Lowest(1000); err != nil {
			b.Fatal(err)
		}
	}
}
