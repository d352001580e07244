package axisym

import (
	"errors"
	"math"
	"sort"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/physics/bessel"
)

// coaxList returns the n = 0 resonances below fmax of a closed coaxial
// cavity (inner radius a, outer b, length l, fill m) in closed form: the
// TEM modes f = p c / (2 l n), p >= 1 (Pozar, Microwave Engineering, 4th
// ed., sec. 6.2, the short-circuited lambda/2 line), and the TM0mp
// (p >= 0) and TE0mp (p >= 1) modes with kc = x_m/a, x_m the roots of the
// cross products J0(x)Y0(cx) - J0(cx)Y0(x) and J1(x)Y1(cx) - J1(cx)Y1(x),
// c = b/a (Marcuvitz, Waveguide Handbook, sec. 2.4; A&S Table 9.7), from
// bessel.CrossZeros, whose own tests compare them with mpmath.
func coaxList(fam cavity.Family, a, b, l float64, m physics.Medium, fmax float64) []float64 {
	scale := physics.SpeedOfLight / (2 * math.Pi * m.Index())
	var out []float64
	order, p0 := 1, 1
	if fam == cavity.TM {
		order, p0 = 0, 0
		for p := 1; ; p++ {
			f := scale * float64(p) * math.Pi / l
			if f >= fmax {
				break
			}
			out = append(out, f)
		}
	}
	for _, x := range bessel.CrossZeros(order, b/a, 60) {
		kc := x / a
		for p := p0; ; p++ {
			beta := float64(p) * math.Pi / l
			f := scale * math.Sqrt(kc*kc+beta*beta)
			if f >= fmax {
				break
			}
			out = append(out, f)
		}
	}
	sort.Float64s(out)
	return out
}

// TestCoaxial is test group 3: a full-length coaxial section, alone and cut
// into pieces of one cross-section, gives the closed-form TEM, TM0 and TE0
// lists.
func TestCoaxial(t *testing.T) {
	const a, b, l = 0.004, 0.015, 0.05
	m := physics.Medium{EpsR: 2.1}
	const fmax = 25e9
	for _, cuts := range [][]float64{nil, {0.37}, {0.21, 0.64}} {
		var body Body
		z := 0.0
		for _, u := range append(cuts, 1) {
			body.Sections = append(body.Sections, Section{Length: (u - z) * l, Radius: b, InnerRadius: a, Fill: m})
			z = u
		}
		got, err := Solve(body, Request{MaxFrequency: fmax, Modes: 8})
		if err != nil {
			t.Fatal(err)
		}
		for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
			want := coaxList(fam, a, b, l, m, fmax)
			var g []float64
			for _, r := range got {
				if r.Family == fam {
					g = append(g, r.Frequency)
					if r.HasOrigin {
						t.Errorf("coaxial body: %v0 #%d has a label %v; want none", fam, r.Index, r.Origin)
					}
				}
			}
			if len(g) != len(want) {
				t.Errorf("cuts %v: %v0: %d resonances below %g Hz, want %d (closed form)", cuts, fam, len(g), fmax, len(want))
				continue
			}
			for i := range want {
				if d := math.Abs(g[i]-want[i]) / want[i]; d > closedTol {
					t.Errorf("cuts %v: %v0 #%d = %.15g Hz, want %.15g Hz (closed form), rel. error %.2g", cuts, fam, i+1, g[i], want[i], d)
				}
			}
		}
	}
}

// TestUncontainedJunction checks the refusal for a junction whose aperture
// is not one side's cross-section.
func TestUncontainedJunction(t *testing.T) {
	b := Body{Sections: []Section{
		{Length: 0.01, Radius: 0.01, InnerRadius: 0.002},
		{Length: 0.01, Radius: 0.012, InnerRadius: 0.004},
	}}
	if _, err := Solve(b, Request{MaxFrequency: 10e9}); err == nil || !errorsIs(err) {
		t.Errorf("Solve = %v, want an error wrapping ErrNotImplemented", err)
	}
}

func errorsIs(err error) bool { return errors.Is(err, ErrNotImplemented) }
