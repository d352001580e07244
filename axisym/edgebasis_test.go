package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics/quad"
)

// TestFracJ checks the fractional-order Bessel sequence against mpmath
// (testdata/gen_edgebasis.py, output in testdata/edgebasis.txt), to the
// rounding of the phase at large z.
func TestFracJ(t *testing.T) {
	ref := map[float64][4]float64{
		0.3:   {0.30852075392328576, 0.02790848083755312, 5.491982466769812e-08, 5.0908361205818165e-37},
		2.0:   {0.5569696769191377, 0.44706309823122414, 0.0022090970434085174, 5.1834942014984627e-20},
		17.0:  {-0.16651797293338347, 0.08718957592267357, -0.07822919532352006, 0.022936790704350323},
		150.0: {-0.05675482253138432, -0.03242629058390639, -0.03780049329465004, 0.02347908762177857},
		900.0: {0.02517838843067384, -0.008534982131729507, -0.008123443934080668, 0.02648974389932313},
	}
	out := make([]float64, 21)
	for z, want := range ref {
		fracJ(2.0/3, z, out)
		for i, j := range []int{0, 1, 5, 20} {
			tol := 1e-15 * math.Max(z, 10) * math.Max(math.Abs(want[i]), 1e-3)
			if math.Abs(want[i]) < 1e-5 {
				tol = 1e-13 * math.Abs(want[i])
			}
			if d := math.Abs(out[j] - want[i]); d > tol {
				t.Errorf("J_(2/3+%d)(%g) = %.16g, want %.16g", j, z, out[j], want[i])
			}
		}
	}
}

// jacobiP returns the Jacobi polynomial P_n^(a,b)(x) by its three-term
// recurrence (DLMF 18.9.2).
func jacobiP(n int, a, b, x float64) float64 {
	p0, p1 := 1.0, 0.5*(a-b+(a+b+2)*x)
	if n == 0 {
		return p0
	}
	for k := 2; k <= n; k++ {
		fk := float64(k)
		c := 2*fk + a + b
		a1 := 2 * fk * (fk + a + b) * (c - 2)
		a2 := (c - 1) * (a*a - b*b)
		a3 := (c - 2) * (c - 1) * c
		a4 := 2 * (fk + a - 1) * (fk + b - 1) * c
		p0, p1 = p1, ((a2+a3*x)*p1-a4*p0)/a1
	}
	return p1
}

// TestEdgeOverlapQuadrature checks the closed-form projections of the edge
// basis (edgeProjection: the finite Hankel integral and fracJ) against
// Gauss-Legendre quadrature of the defining integral, with x = 1 - s^3,
// which makes (1 - x)^nu dx smooth for the one-medium exponents (3 nu
// whole). The basis scale is free, so the test compares the ratio to the
// quadrature over the mode's normalisation, which must not depend on the
// mode.
func TestEdgeOverlapQuadrature(t *testing.T) {
	const radius, a = 0.02, 0.013
	vac := Section{Length: 1, Radius: radius}
	nodes := quad.Composite(0, 1, 40, 20)
	for _, fam := range []cavity.Family{cavity.TM, cavity.TE} {
		nus := edgeFamilies(fam, vac, vac)
		const k, count = 9, 40
		p, kc := edgeProjection(fam, nus, radius, a, count, k)
		// Columns: the k/3 functions of each family in turn, by degree.
		for j := range k {
			nu := nus[j/3]
			deg := j % 3
			ratio := math.NaN()
			for m := range count {
				var sum float64
				for _, nd := range nodes {
					s := nd.X
					x := 1 - s*s*s
					// (1-x^2)^nu = s^(3 nu) (1+x)^nu, dx = 3 s^2 ds.
					w := 3 * math.Pow(s, 3*nu+2) * math.Pow(1+x, nu)
					sum += nd.W * w * x * x * jacobiP(deg, 1, nu, 1-2*x*x) * math.J1(kc[m]*a*x)
				}
				if math.Abs(sum) < 1e-6 {
					continue
				}
				// The normalised mode: norm = 1/(sqrt(pi) R |J_0 or J_1|)
				// at the zero (the Lommel integral, DLMF 10.22.5).
				x0 := kc[m] * radius
				jn := math.J1(x0)
				if fam == cavity.TE {
					jn = math.J0(x0)
				}
				r := p[m*k+j] * math.Sqrt(math.Pi) * radius * math.Abs(jn) / sum
				if math.IsNaN(ratio) {
					ratio = r
					continue
				}
				if math.Abs(r/ratio-1) > 1e-9 {
					t.Errorf("%v0 function %d (nu %.3f) mode %d: ratio %.12g, mode 1 %.12g", fam, j, nu, m+1, r, ratio)
				}
			}
		}
	}
}

// TestEdgeFamilies checks the edge exponents: 2/3 (one medium, Meixner
// 1972) and, for a dielectric on the wide side, that the root satisfies
// eps_w cot(pi tau) + eps_n cot(pi tau/2) = 0 (the value 0.6045503520 was
// found with mpmath's findroot, not a published table).
func TestEdgeFamilies(t *testing.T) {
	vac := Section{Length: 1, Radius: 1}
	if got := edgeFamilies(cavity.TM, vac, vac); math.Abs(got[0]+1.0/3) > 1e-14 || math.Abs(got[1]-1.0/3) > 1e-14 || got[2] != 1 {
		t.Errorf("TM0 one medium: %v, want -1/3, 1/3, 1", got)
	}
	if got := edgeFamilies(cavity.TE, vac, vac); math.Abs(got[0]-2.0/3) > 1e-14 || math.Abs(got[1]-4.0/3) > 1e-14 || got[2] != 2 {
		t.Errorf("TE0 one medium: %v, want 2/3, 4/3, 2", got)
	}
	diel := vac
	diel.Fill.EpsR = 2.1
	if got := edgeFamilies(cavity.TM, diel, vac); math.Abs(got[0]+1-0.604550352049933) > 1e-12 {
		t.Errorf("TM0 eps 2.1 wide: tau = %.15g, want 0.604550352049933", got[0]+1)
	}
}

// edgeRef are reference resonances (Hz) from the mode-matching path of
// this package extrapolated in N (Extrapolate, N = 120, models with 120,
// 240 and 480 modes in the widest section; run once and recorded, with
// the error Extrapolate states), an independent discretisation: the
// aperture field in the narrow guide's modes, no edge basis.
var edgeRef = []struct {
	name     string
	body     func() Body
	fam      cavity.Family
	fmax     float64
	ref, err []float64
}{
	{"stepped", stepped, cavity.TM, 12e9, []float64{6074134657.8, 9721050842.81}, []float64{4.19, 5.28}},
	{"stepped", stepped, cavity.TE, 12e9, []float64{11569262146.2}, []float64{1.54}},
	{"fiveSections", fiveSections, cavity.TE, 10e9, []float64{6437531678.65, 8932410924.85}, []float64{1.49, 12.3}},
	{"fiveSections", fiveSections, cavity.TM, 10e9,
		[]float64{2915427518.5, 6000656813.33, 6527572440.63, 8301198786.3, 9631806758.65},
		[]float64{68, 64.7, 28.1, 1.5, 165}},
}

// TestEdgeConvergence is deliverable 1 of the edge-conditioned path: the
// resonances converge fast in the number K of basis functions per junction
// (K = 3, 6, 9, 12, 15; three families, so K/3 functions each), with
// 240 dynamic modes and 6400 static ones; the K = 12 and K = 15 models
// agree to 1e-10, and K = 15 meets the reference within its stated error
// plus 2e-9 relative (the modal truncation of the new path, see
// TestEdgeModalTruncation).
func TestEdgeConvergence(t *testing.T) {
	if testing.Short() {
		t.Skip("five models per body")
	}
	for _, c := range edgeRef {
		var prev []float64
		for _, k := range []int{3, 6, 9, 12, 15} {
			f, err := edgeResonances(c.body(), c.fam, c.fmax, edgeOpts{k: k, dyn: 240, static: 6400})
			if err != nil || len(f) != len(c.ref) {
				t.Fatalf("%s %v0 K = %d: %v %v", c.name, c.fam, k, f, err)
			}
			for i := range f {
				d := math.NaN()
				if prev != nil {
					d = math.Abs(f[i]-prev[i]) / f[i]
				}
				t.Logf("%s %v0 #%d K = %2d: %.12g Hz, change %.2g, against reference %.2g", c.name, c.fam, i+1, k, f[i], d, (f[i]-c.ref[i])/c.ref[i])
				if k == 15 {
					if d > 1e-10 {
						t.Errorf("%s %v0 #%d: K = 12 -> 15 changes by %.2g", c.name, c.fam, i+1, d)
					}
					if e := math.Abs(f[i] - c.ref[i]); e > c.err[i]+2e-9*c.ref[i] {
						t.Errorf("%s %v0 #%d: %.12g Hz, reference %.12g +- %.3g Hz", c.name, c.fam, i+1, f[i], c.ref[i], c.err[i])
					}
				}
			}
			prev = f
		}
	}
}

// BenchmarkFiveLowestEdge solves the five lowest TM0 resonances of the
// five-section body with the edge-conditioned model and its convergence
// estimate (edgeSolve: two models, edgeCoarse and edgeFine).
func BenchmarkFiveLowestEdge(b *testing.B) {
	body := fiveSections()
	for b.Loop() {
		f, _, err := edgeSolve(body, cavity.TM, 10e9)
		if err != nil || len(f) != 5 {
			b.Fatal(f, err)
		}
	}
}

// TestEdgeFiveLowest is deliverable 2: the five lowest TM0 resonances of
// the five-section body by edgeSolve are within 1e-8 relative by the
// path's own estimate (the change from the coarse model), and a much
// larger model (15 functions per junction, 480 dynamic and 12800 static
// modes) confirms that the estimate bounds the true error.
func TestEdgeFiveLowest(t *testing.T) {
	if testing.Short() {
		t.Skip("reference model with 12800 static modes")
	}
	f, change, err := edgeSolve(fiveSections(), cavity.TM, 10e9)
	if err != nil || len(f) != 5 {
		t.Fatal(f, err)
	}
	ref, err := edgeResonances(fiveSections(), cavity.TM, 10e9, edgeOpts{k: 15, dyn: 480, static: 12800})
	if err != nil || len(ref) != 5 {
		t.Fatal(ref, err)
	}
	for i := range f {
		e := math.Abs(f[i] - ref[i])
		t.Logf("TM0 #%d: %.12g Hz, estimate %.2g, error against the large model %.2g", i+1, f[i], change[i]/f[i], e/f[i])
		if change[i] > 1e-8*f[i] {
			t.Errorf("TM0 #%d: estimate %.2g relative, want <= 1e-8", i+1, change[i]/f[i])
		}
		if e > change[i] {
			t.Errorf("TM0 #%d: error %.3g Hz exceeds the estimate %.3g Hz", i+1, e, change[i])
		}
	}
}

// BenchmarkFiveLowestEdgeSolve is BenchmarkFiveLowest through Solve with
// Request.EdgeBasis (default modes: 40 and 60 dynamic modes).
func BenchmarkFiveLowestEdgeSolve(b *testing.B) {
	body := fiveSections()
	for b.Loop() {
		r, err := Solve(body, Request{MaxFrequency: 10e9, Families: []cavity.Family{cavity.TM}, EdgeBasis: true})
		if err != nil || len(r) != 5 || !r[0].EdgeBasis {
			b.Fatal(len(r), err)
		}
	}
}

// TestEdgeSolveRequest checks Solve with EdgeBasis: the five-section body's
// TM0 and TE0 lists come from the edge model, with estimates below 1e-8
// and the labels of the default path; the default path's frequencies lie
// within their own Change of them (order-2 truncation); Loss is present
// and its G agrees with the default path's within twice the larger of the
// two paths' changes of G from their coarse models (both from fields of
// 40 and 60 modes; G converges slowly, see the package doc); a body the edge
// model does not handle (a coaxial section) falls back to the default.
func TestEdgeSolveRequest(t *testing.T) {
	body := fiveSections()
	edge, err := Solve(body, Request{MaxFrequency: 10e9, EdgeBasis: true, Losses: true})
	if err != nil {
		t.Fatal(err)
	}
	old, err := Solve(body, Request{MaxFrequency: 10e9, Losses: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(edge) != len(old) {
		t.Fatalf("%d resonances with the edge basis, %d without", len(edge), len(old))
	}
	for i, e := range edge {
		o := old[i]
		if !e.EdgeBasis || e.Family != o.Family || e.Origin != o.Origin || e.Index != o.Index {
			t.Errorf("#%d: edge %+v against default %+v", i, e, o)
			continue
		}
		if e.Change > 1e-8*e.Frequency {
			t.Errorf("%v0 #%d: estimate %.2g relative", e.Family, e.Index, e.Change/e.Frequency)
		}
		if d := math.Abs(e.Frequency - o.Frequency); d > o.Change {
			t.Errorf("%v0 #%d: default %.12g Hz (change %.3g) against edge %.12g Hz", e.Family, e.Index, o.Frequency, o.Change, e.Frequency)
		}
		if e.Loss == nil || o.Loss == nil {
			t.Errorf("%v0 #%d: no loss: %v", e.Family, e.Index, e.LossErr)
			continue
		}
		if e.CoarseLoss == nil || o.CoarseLoss == nil {
			t.Errorf("%v0 #%d: no coarse loss", e.Family, e.Index)
			continue
		}
		// G converges slowly in the modes of the fields (package doc);
		// each path's estimate is its change from the coarse model.
		ce := math.Abs(e.Loss.G() - e.CoarseLoss.G())
		co := math.Abs(o.Loss.G() - o.CoarseLoss.G())
		d := math.Abs(e.Loss.G() - o.Loss.G())
		if d > 2*max(ce, co) {
			t.Errorf("%v0 #%d: G %.8g (edge, change %.2g) against %.8g (default, change %.2g)", e.Family, e.Index, e.Loss.G(), ce, o.Loss.G(), co)
		}
		t.Logf("%v0 #%d: %.12g Hz (estimate %.2g), default %.12g Hz (change %.2g); G %.8g (change %.2g) against %.8g (change %.2g)",
			e.Family, e.Index, e.Frequency, e.Change/e.Frequency, o.Frequency, o.Change/o.Frequency, e.Loss.G(), ce, o.Loss.G(), co)
	}
	coax := Body{Sections: []Section{{Length: 0.02, Radius: 0.02, InnerRadius: 0.004}, {Length: 0.01, Radius: 0.02}}}
	r, err := Solve(coax, Request{MaxFrequency: 8e9, EdgeBasis: true, Families: []cavity.Family{cavity.TM}})
	if err != nil || len(r) == 0 || r[0].EdgeBasis {
		t.Errorf("coaxial body: %v %v, want the default path", r, err)
	}
}

// TestEdgeExampleBodies checks the estimate of Solve with EdgeBasis on the
// bodies of examples/nosed-cell.yaml (TM0, steps 8/14/40 mm) and
// examples/iris-pair.yaml (TE0, a 6 mm iris between 20 mm cells) against
// a much larger model (15 functions per junction, 480 dynamic and 12800
// static modes per unit R/a): the error is within the reported change.
func TestEdgeExampleBodies(t *testing.T) {
	if testing.Short() {
		t.Skip("large reference models")
	}
	nosed := Body{Sections: []Section{
		{Length: 0.015, Radius: 0.008}, {Length: 0.006, Radius: 0.014}, {Length: 0.030, Radius: 0.040},
		{Length: 0.006, Radius: 0.014}, {Length: 0.015, Radius: 0.008},
	}}
	for _, c := range []struct {
		name string
		b    Body
		fam  cavity.Family
		fmax float64
	}{
		{"nosed cell", nosed, cavity.TM, 8e9},
		{"iris pair", irisPair(0.040, 0.020, 0.006, 0.002), cavity.TE, 10.5e9},
	} {
		got, err := Solve(c.b, Request{MaxFrequency: c.fmax, Families: []cavity.Family{c.fam}, EdgeBasis: true})
		if err != nil || len(got) == 0 {
			t.Fatal(got, err)
		}
		ref, err := edgeResonances(c.b, c.fam, c.fmax, edgeOpts{k: 15, dyn: 480, static: 12800})
		if err != nil || len(ref) != len(got) {
			t.Fatal(ref, err)
		}
		for i, r := range got {
			e := math.Abs(r.Frequency - ref[i])
			t.Logf("%s %v0 #%d: %.12g Hz, change %.2g, error against the large model %.2g", c.name, c.fam, i+1, r.Frequency, r.Change/r.Frequency, e/r.Frequency)
			if !r.EdgeBasis || e > r.Change {
				t.Errorf("%s %v0 #%d: error %.3g Hz, change %.3g Hz (edge basis %v)", c.name, c.fam, i+1, e, r.Change, r.EdgeBasis)
			}
		}
	}
}
