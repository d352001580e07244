package axisym

import (
	"math"
	"testing"
)

// fieldTol is the agreement between the stored energies from sampling the
// field on a 2-D Gauss grid and from the modal sums: the truncated field
// is smooth inside each section, so the grid integrates it to about 1e-9.
const fieldTol = 1e-7

// TestFieldEnergy integrates (eps/4)|E|^2 and (mu/4)|H|^2 of Field.At over
// every section by Gauss quadrature in r and z and compares with the
// energies of the modal sums (orthonormal modes, no cross terms): an
// independent route that checks every component of At, and W_e = W_m.
func TestFieldEnergy(t *testing.T) {
	for _, b := range identityBodies() {
		got, err := Solve(b, Request{MaxFrequency: 7e9, Modes: 10, Losses: true})
		if err != nil {
			t.Fatal(err)
		}
		for _, r := range got {
			if r.Loss == nil {
				t.Fatalf("%v0 #%d: %v", r.Family, r.Index, r.LossErr)
			}
			fd := r.Loss.Field
			var we, wm float64
			for _, sc := range fd.sections {
				zs := zRule(sc.length, sc.g.kc, sq(fd.omega)*sc.eps*sc.mu)
				for _, zp := range zs {
					z := sc.z0 + zp.z
					// Keep the node inside this section (At takes the
					// right-hand section on a plane).
					if zp.z == 0 || zp.z == sc.length {
						continue
					}
					e := gauss(func(rr float64) float64 {
						e1, e2, _, _, ok := fd.At(rr, z)
						if !ok {
							t.Fatalf("point (%g, %g) outside the body", rr, z)
						}
						return (e1*e1 + e2*e2) * rr
					}, sc.inner, sc.outer, 24)
					h := gauss(func(rr float64) float64 {
						_, _, h1, h2, _ := fd.At(rr, z)
						return (h1*h1 + h2*h2) * rr
					}, sc.inner, sc.outer, 24)
					we += sc.eps / 4 * 2 * math.Pi * e * zp.w
					wm += sc.mu / 4 * 2 * math.Pi * h * zp.w
				}
			}
			w := r.Loss.StoredEnergyJ
			if d := math.Abs(we+wm-w) / w; d > fieldTol {
				t.Errorf("%v0 #%d: W from At %.12g J, from the modes %.12g J", r.Family, r.Index, we+wm, w)
			}
			if d := math.Abs(we-wm) / w; d > fieldTol {
				t.Errorf("%v0 #%d: W_e %.12g J, W_m %.12g J from At", r.Family, r.Index, we, wm)
			}
		}
	}
}

// TestMagnitudes checks the separated grid evaluation against At.
func TestMagnitudes(t *testing.T) {
	b := identityBodies()[2]
	got, err := Solve(b, Request{MaxFrequency: 7e9, Modes: 10, Losses: true})
	if err != nil || len(got) == 0 {
		t.Fatal(got, err)
	}
	for _, r := range got {
		fd := r.Loss.Field
		rs := []float64{0.001, 0.0035, 0.01, 0.019}
		zs := []float64{0.001, 0.015, 0.025, 0.0299}
		e, h := fd.Magnitudes(rs, zs)
		for iz, z := range zs {
			for ir, rr := range rs {
				e1, e2, h1, h2, ok := fd.At(rr, z)
				if !ok {
					if !math.IsNaN(e[iz][ir]) {
						t.Errorf("(%g, %g): in metal, Magnitudes %g, want NaN", rr, z, e[iz][ir])
					}
					continue
				}
				we, wh := math.Hypot(e1, e2), math.Hypot(h1, h2)
				if math.Abs(e[iz][ir]-we) > 1e-12*we || math.Abs(h[iz][ir]-wh) > 1e-12*wh {
					t.Errorf("(%g, %g): Magnitudes %g, %g, At %g, %g", rr, z, e[iz][ir], h[iz][ir], we, wh)
				}
			}
		}
	}
}
