package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// recede returns b with every metal surface moved by s into the metal:
// radii grow, inner radii shrink, the end plates move out and each step
// face moves into the narrower section (which shortens by s while the
// wider one grows by s).
func recede(b Body, s float64) Body {
	out := Body{Sections: append([]Section(nil), b.Sections...)}
	for i := range out.Sections {
		out.Sections[i].Radius += s
		if ls := out.Sections[i].Layers; len(ls) > 0 { // the outer layer reaches the wall
			ls = append([]Layer(nil), ls...)
			ls[len(ls)-1].Radius += s
			out.Sections[i].Layers = ls
		}
		if out.Sections[i].InnerRadius > 0 {
			out.Sections[i].InnerRadius -= s
		}
	}
	out.Sections[0].Length += s
	out.Sections[len(out.Sections)-1].Length += s
	for i := 0; i+1 < len(b.Sections); i++ {
		l, r := b.Sections[i], b.Sections[i+1]
		switch {
		case l.Radius == r.Radius && l.InnerRadius == r.InnerRadius:
		case l.Radius < r.Radius: // face on the right (wider) side
			out.Sections[i+1].Length += s
			out.Sections[i].Length -= s
		default:
			out.Sections[i].Length += s
			out.Sections[i+1].Length -= s
		}
	}
	return out
}

// wheelerInvQ returns 1/Q_wall for a uniform surface resistance rs by
// Wheeler's incremental-inductance rule: the surface reactance of a good
// conductor equals its resistance, as if every wall had receded by half a
// skin depth, so 1/Q = -(2/f) (delta/2) df/ds with delta = 2 rs/(omega
// mu0) (H. A. Wheeler, "Formulas for the skin effect", Proc. IRE 30 (1942)
// 412-424). It holds as a frequency shift only where no electric field
// meets the walls, which is the case for every TE0 mode (E = E_phi only,
// tangential to every surface). df/ds comes from central differences of
// the resonance of the same truncated model.
func wheelerInvQ(t *testing.T, b Body, idx int, fmax float64, modes int, rs float64) (invQ, f float64) {
	t.Helper()
	const h = 1e-7 // relative step; see wheelerTol
	size := b.Length()
	// The same mode counts for every step: the relative-convergence rule
	// would otherwise round them differently.
	counts, err := ModeCounts(b, cavity.TE, fmax, modes)
	if err != nil {
		t.Fatal(err)
	}
	at := func(s float64) float64 {
		r, _, err := resonancesWith(recede(b, s), cavity.TE, fmax, counts, false)
		if err != nil || len(r) <= idx {
			t.Fatalf("recede %g: %v %v", s, r, err)
		}
		return r[idx]
	}
	f = at(0)
	ds := h * size
	dfds := (at(ds) - at(-ds)) / (2 * ds)
	omega := 2 * math.Pi * f
	delta := 2 * rs / (omega * physics.VacuumPermeability)
	return -delta / f * dfds, f
}

// wheelerTol is the agreement of test group 7 (1e-6) for bodies whose
// model is exact (no steps); the central difference with h = 1e-7 is good
// to about 1e-8 relative (root precision 1e-14 divided by the step, and
// h^2 truncation).
const wheelerTol = 1e-6

// TestWheeler is test group 7: the wall Q of TE0 resonances from the
// surface integral of the matched fields against Wheeler's rule.
func TestWheeler(t *testing.T) {
	const rs = 0.026 // ohm, copper near 10 GHz (order of magnitude only; cancels in the comparison)
	for _, tc := range []struct {
		name  string
		b     Body
		fmax  float64
		modes int
		tol   float64
	}{
		{"one section", Body{Sections: []Section{{Length: 0.03, Radius: 0.02}}}, 14e9, 6, wheelerTol},
		{"two fills", Body{Sections: []Section{
			{Length: 0.0073, Radius: 0.015, Fill: physics.Medium{EpsR: 9.6}},
			{Length: 0.0211, Radius: 0.015},
		}}, 16e9, 6, wheelerTol},
	} {
		got, err := Solve(tc.b, Request{MaxFrequency: tc.fmax, Modes: tc.modes, Losses: true, Families: []cavity.Family{cavity.TE}})
		if err != nil {
			t.Fatal(err)
		}
		if len(got) == 0 {
			t.Fatalf("%s: no TE0 resonance", tc.name)
		}
		for i, r := range got {
			if r.Loss == nil {
				t.Fatalf("%s: TE0 #%d: %v", tc.name, i+1, r.LossErr)
			}
			_, invWall, _ := r.Loss.Q0(func(Part) float64 { return rs }, nil)
			want, f := wheelerInvQ(t, tc.b, i, tc.fmax, (3*tc.modes+1)/2, rs)
			if math.Abs(f-r.Frequency) > 1e-13*f {
				t.Fatalf("%s: TE0 #%d model mismatch: %g vs %g Hz", tc.name, i+1, f, r.Frequency)
			}
			if d := math.Abs(invWall-want) / want; d > tc.tol {
				t.Errorf("%s: TE0 #%d at %.6g GHz: Q_wall = %.10g (surface integral), %.10g (Wheeler), rel. difference %.2g",
					tc.name, i+1, f/1e9, 1/invWall, 1/want, d)
			} else {
				t.Logf("%s: TE0 #%d: Q_wall %.8g, Wheeler %.8g, rel. difference %.2g", tc.name, i+1, 1/invWall, 1/want, d)
			}
		}
	}
}

// TestEnergyBalance checks W_e = W_m at every resonance of stepped and
// coaxial bodies, both families: the time-averaged electric and magnetic
// energies of a resonance are equal (Pozar, Microwave Engineering, 4th ed.,
// sec. 6.1), and the truncated model conserves complex power at every
// junction, so the balance holds to rounding.
func TestEnergyBalance(t *testing.T) {
	for _, b := range []Body{stepped(), fiveSections(), {Sections: []Section{
		{Length: 0.02, Radius: 0.02, InnerRadius: 0.003}, {Length: 0.01, Radius: 0.02},
	}}} {
		got, err := Solve(b, Request{MaxFrequency: 11e9, Modes: 20, Losses: true})
		if err != nil {
			t.Fatal(err)
		}
		for _, r := range got {
			if r.Loss == nil {
				t.Errorf("%v0 #%d: %v", r.Family, r.Index, r.LossErr)
				continue
			}
			if d := math.Abs(r.Loss.ElectricShareJ/r.Loss.StoredEnergyJ - 0.5); d > 1e-9 {
				t.Errorf("%v0 #%d at %g Hz: W_e/W = %.12g, want 1/2", r.Family, r.Index, r.Frequency, r.Loss.ElectricShareJ/r.Loss.StoredEnergyJ)
			}
		}
	}
}

// TestWheelerStepped compares the two routes on a stepped body. Wheeler's
// rule differentiates a frequency, which converges as N^-2; the surface
// integral samples |H_tan|^2 ~ rho^(-2/3) next to each 270-degree edge
// (Meixner 1972) with a truncated modal series and converges only as
// about N^(-1/3) (measured: differences 515, 404, 317 for N = 20..160,
// ratio 2^(1/3) per doubling). The test checks that rate and that the
// surface integral extrapolated with it meets Wheeler's value to
// steppedQTol.
func TestWheelerStepped(t *testing.T) {
	if testing.Short() {
		t.Skip("solves the stepped body with up to 120 modes")
	}
	const rs = 0.026
	var q [3]float64
	var wheeler float64
	for i, m := range []int{20, 40, 80} {
		got, err := Solve(stepped(), Request{MaxFrequency: 12e9, Modes: m, Losses: true, Families: []cavity.Family{cavity.TE}})
		if err != nil || len(got) == 0 || got[0].Loss == nil {
			t.Fatal(got, err)
		}
		_, inv, _ := got[0].Loss.Q0(func(Part) float64 { return rs }, nil)
		q[i] = 1 / inv
		if i == 2 {
			w, _ := wheelerInvQ(t, stepped(), 0, 12e9, (3*m+1)/2, rs)
			wheeler = 1 / w
		}
	}
	ratio := (q[0] - q[1]) / (q[1] - q[2])
	order := math.Log2(ratio)
	if !(order > 0.2 && order < 0.5) {
		t.Errorf("surface-integral Q converges at order %.3f (Q = %v), want about 1/3", order, q)
	}
	limit := q[2] - (q[1]-q[2])/(ratio-1)
	if d := math.Abs(limit-wheeler) / wheeler; d > steppedQTol {
		t.Errorf("extrapolated surface-integral Q %.6g, Wheeler %.6g: rel. difference %.2g, want <= %g", limit, wheeler, d, steppedQTol)
	}
	t.Logf("Q: surface integral %v, extrapolated %.6g, Wheeler %.6g", q, limit, wheeler)
}

// steppedQTol bounds the disagreement after extrapolation: the remaining
// higher-order terms of the slow series (measured 2e-3).
const steppedQTol = 1e-2
