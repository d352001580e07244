package qfactor_test

import (
	"math"
	"strings"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/qfactor"
)

// has reports whether ws holds a warning of check c.
func has(ws []qfactor.Warning, c qfactor.Check) bool {
	for _, w := range ws {
		if w.Check == c {
			return true
		}
	}
	return false
}

// validity runs UnloadedQ and Validity for mode m of c with walls w; the
// zero WallSet stands for perfectly conducting walls.
func validity(t *testing.T, c cavity.Cavity, m cavity.Mode, w qfactor.WallSet) (qfactor.Unloaded, []qfactor.Warning) {
	t.Helper()
	rs := w.At(nil)
	if w.Side.Conductor.Conductivity == 0 {
		rs = fixed(qfactor.SurfaceResistances{})
	}
	u, err := qfactor.UnloadedQ(c, m, rs)
	if err != nil {
		t.Fatal(err)
	}
	return u, qfactor.Validity(c, w, u)
}

func metal(sigma float64) qfactor.WallSet {
	return qfactor.SameWalls(qfactor.Surface{Conductor: physics.Conductor{Name: "user", Conductivity: sigma}})
}

// TestValidityThickSkin checks the skin-depth warning against the test's
// own skin depth, delta = sqrt(2/(omega mu0 sigma)) (Pozar sec. 1.4), and
// min(radius, length). TM010's frequency does not depend on the length
// (Pozar sec. 6.4), so the length sets the ratio alone: invented cavities
// of radius 50 mm in a poor conductor (sigma = 1e6 S/m) at ratios 2 % and
// 0.5 %.
func TestValidityThickSkin(t *testing.T) {
	tm010 := mode("TM010")
	const a, sigma = 0.05, 1e6
	f := cavity.Cavity{Radius: a, Length: a}.Frequency(tm010)
	delta := skinDepth(f, sigma)
	for _, ratio := range []float64{0.02, 0.011, 0.009, 0.005} {
		c := cavity.Cavity{Radius: a, Length: delta / ratio}
		_, ws := validity(t, c, tm010, metal(sigma))
		want := delta/math.Min(a, c.Length) > qfactor.MaxSkinRatio
		if has(ws, qfactor.ThickSkin) != want {
			t.Errorf("delta/min(a, d) = %.4g: ThickSkin warning %v, want %v (%q)", delta/math.Min(a, c.Length), !want, want, texts(ws))
		}
	}
	// Perfectly conducting walls (the zero WallSet) have no skin depth.
	c := cavity.Cavity{Radius: a, Length: 1e-4}
	if _, ws := validity(t, c, tm010, qfactor.WallSet{}); len(ws) != 0 {
		t.Errorf("Validity(zero WallSet) = %q, want none", texts(ws))
	}
}

// TestValidityLowQ checks the Q0 warning against Harrington's closed form
// for TM010 with uniform walls, Q = a d / (delta (a + d)) (Harrington 1961,
// ch. 5), with the test's own skin depth, on lengths that put Q on either
// side of MinValidQ; and against the fill's Q = 1/tan delta (Pozar sec. 6.3).
// (A wall Q below 100 comes with a skin depth near 1 % of the cavity, so
// the ThickSkin warning may come too; only LowQ is checked here.)
func TestValidityLowQ(t *testing.T) {
	tm010 := mode("TM010")
	const a, sigma = 0.05, 1e5
	f := cavity.Cavity{Radius: a, Length: a}.Frequency(tm010)
	delta := skinDepth(f, sigma)
	for _, q := range []float64{80, 99, 101, 120} {
		d := q * delta * a / (a - q*delta) // solves a d/(delta (a+d)) = q
		c := cavity.Cavity{Radius: a, Length: d}
		closed := a * d / (delta * (a + d))
		_, ws := validity(t, c, tm010, metal(sigma))
		if want := closed < qfactor.MinValidQ; has(ws, qfactor.LowQ) != want {
			t.Errorf("closed-form Q = %.4g: LowQ warning %v, want %v (%q)", closed, !want, want, texts(ws))
		}
	}
	for _, tc := range []struct {
		tand float64
		want bool
	}{{0.02, true}, {0.005, false}} { // Q_fill = 50 and 200
		c := cavity.Cavity{Radius: a, Length: a, Fill: physics.Medium{EpsR: 2, TanDelta: tc.tand}}
		if _, ws := validity(t, c, tm010, qfactor.WallSet{}); has(ws, qfactor.LowQ) != tc.want {
			t.Errorf("lossy fill, 1/tan delta = %g: LowQ warning %v, want %v", 1/tc.tand, !tc.want, tc.want)
		}
	}
}

// TestValidityMagneticWall checks the warning for a user wall metal with
// mu_r != 1, and that the factor it states is the ratio of the test's own
// classical Rs = sqrt(omega mu_r mu0/(2 sigma)) (Pozar sec. 1.7) with and
// without the permeability.
func TestValidityMagneticWall(t *testing.T) {
	te011 := mode("TE011")
	c := cavity.Cavity{Radius: 0.02, Length: 0.04}
	for _, tc := range []struct {
		spec string
		want bool
	}{{"sigma=1e7,mur=50", true}, {"sigma=1e7,mur=1", false}, {"sigma=1e7", false}} {
		m, err := physics.ParseConductor(tc.spec)
		if err != nil {
			t.Fatal(err)
		}
		w := qfactor.WallSet{Side: qfactor.Surface{Conductor: physics.Conductor{Name: "copper", Conductivity: 5.8e7}}, EndA: qfactor.Surface{Conductor: m}, EndB: qfactor.Surface{Conductor: m}}
		u, ws := validity(t, c, te011, w)
		if has(ws, qfactor.MagneticWall) != tc.want {
			t.Errorf("end plates %q: MagneticWall warning %v, want %v (%q)", tc.spec, !tc.want, tc.want, texts(ws))
		}
		if !tc.want {
			continue
		}
		f := u.Wall.Frequency
		ratio := math.Sqrt(2*math.Pi*f*m.MuR*physics.VacuumPermeability/(2*m.Conductivity)) / classicalRs(f, m.Conductivity)
		if relErr(u.Wall.Rs.EndA/classicalRs(f, m.Conductivity), ratio) > veryclose {
			t.Errorf("Rs(mu_r = %g)/Rs(1) = %g, want %g", m.MuR, u.Wall.Rs.EndA/classicalRs(f, m.Conductivity), ratio)
		}
		if n := strings.Count(strings.Join(texts(ws), "\n"), "mu_r = 50"); n != 1 {
			t.Errorf("warnings %q mention mu_r = 50 %d times, want once (two end plates, one metal)", texts(ws), n)
		}
		if !strings.Contains(strings.Join(texts(ws), "\n"), "sqrt(mu_r) = 7.07") {
			t.Errorf("warnings %q do not state the factor sqrt(50) = 7.07 (Rs ratio %.4g)", texts(ws), ratio)
		}
	}
}

func texts(ws []qfactor.Warning) []string {
	out := make([]string, len(ws))
	for i, w := range ws {
		out[i] = w.Text
	}
	return out
}

func TestCondense(t *testing.T) {
	a := qfactor.Warning{Check: qfactor.LowQ, Text: "a"}
	b := qfactor.Warning{Check: qfactor.LowQ, Text: "b"}
	s := qfactor.Warning{Check: qfactor.ThickSkin, Text: "s"}
	got := qfactor.Condense([][]qfactor.Warning{{a}, nil, {s, b}, {b}})
	want := []qfactor.Condensed{{Warning: s, First: 2, Count: 1}, {Warning: a, First: 0, Count: 3}}
	if len(got) != 2 || got[0] != want[0] || got[1] != want[1] {
		t.Errorf("Condense = %+v, want %+v (check order, first of each, counts)", got, want)
	}
	if got[0].Text("modes") != "s" || got[1].Text("modes") != "a (and 2 more of the modes)" {
		t.Errorf("Text = %q, %q; want %q, %q", got[0].Text("modes"), got[1].Text("modes"), "s", "a (and 2 more of the modes)")
	}
	if got := qfactor.Condense(nil); got != nil {
		t.Errorf("Condense(nil) = %v, want nil", got)
	}
}
