package fdref

import (
	"math"
	"testing"
)

// TestClosedCylinder checks both schemes on the one body with a closed
// form, a vacuum cylinder of radius a and length l: the lowest TE0 is
// TE011, k^2 = (j'_{0,1}/a)^2 + (pi/l)^2, and the lowest TM0 (for l < 2.03
// a) is TM010, k^2 = (j_{0,1}/a)^2, with j'_{0,1} = 3.831705970207512 and
// j_{0,1} = 2.404825557695773 (Abramowitz and Stegun, Table 9.5, recalled
// from memory). On a smooth problem the error falls as h^2, so Richardson
// extrapolation of order 2 must agree with the closed form to within
// Safety times the change between its two estimates. The half cylinder cut
// at l/2 gives the same eigenvalues: with a magnetic plane for TE011 (E_phi
// is even about the mid-plane for p = 1), with a metal plate for TM010 (no
// z dependence).
func TestClosedCylinder(t *testing.T) {
	const a, l = 0.02, 0.03
	hs := [3]float64{0.001, 0.0005, 0.00025}
	for _, c := range []struct {
		name  string
		solve func(Problem) (float64, error)
		slabs []Slab
		far   Far
		want  float64
	}{
		{"TE011", TE0, []Slab{{Length: l, Outer: a}}, Plate, math.Pow(3.831705970207512/a, 2) + math.Pow(math.Pi/l, 2)},
		{"TE011 half", TE0, []Slab{{Length: l / 2, Outer: a}}, Magnetic, math.Pow(3.831705970207512/a, 2) + math.Pow(math.Pi/l, 2)},
		{"TM010", TM0, []Slab{{Length: l, Outer: a}}, Plate, math.Pow(2.404825557695773/a, 2)},
		{"TM010 half", TM0, []Slab{{Length: l / 2, Outer: a}}, Plate, math.Pow(2.404825557695773/a, 2)},
	} {
		var lam [3]float64
		for i, h := range hs {
			var err error
			if lam[i], err = c.solve(Problem{Slabs: c.slabs, Step: h, Far: c.far}); err != nil {
				t.Fatal(err)
			}
		}
		coarse, fine := Richardson(hs, lam, 2)
		acc := Safety * math.Abs(fine-coarse)
		t.Logf("%s: grids %.8g %.8g %.8g, extrapolated %.10g (accuracy %.2g), closed form %.10g", c.name, lam[0], lam[1], lam[2], fine, acc/fine, c.want)
		if d := math.Abs(fine - c.want); d > acc || d > 1e-4*c.want {
			t.Errorf("%s: k^2 = %.10g, want %.10g (accuracy %.2g)", c.name, fine, c.want, acc)
		}
	}
}

// TestBadGrid checks that a step that does not divide the body is refused.
func TestBadGrid(t *testing.T) {
	if _, err := TE0(Problem{Slabs: []Slab{{Length: 0.01, Outer: 0.0075}}, Step: 0.002}); err == nil {
		t.Error("a step of 2 mm on a 7.5 mm radius: want an error")
	}
	if _, err := TM0(Problem{Step: 0.001}); err == nil {
		t.Error("no slabs: want an error")
	}
}
