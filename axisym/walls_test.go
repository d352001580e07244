package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/qfactor"
)

func metalSurface(t *testing.T, name string) qfactor.Surface {
	t.Helper()
	c, err := physics.LookupConductor(name)
	if err != nil {
		t.Fatal(err)
	}
	return qfactor.Surface{Conductor: c}
}

// TestUnloadedPerSurface checks Loss.Unloaded with a different metal on
// the side wall and on each end plate of a one-section body against
// qfactor.WallQ, the closed-form wall Q of the cylinder with those three
// surface resistances (Pozar, Microwave Engineering, 4th ed., sec. 6.7),
// to 1e-9.
func TestUnloadedPerSurface(t *testing.T) {
	c := cavity.Cavity{Radius: 0.02, Length: 0.03}
	b := Body{Sections: []Section{{Length: c.Length, Radius: c.Radius}}}
	set := qfactor.WallSet{Side: metalSurface(t, "copper"), EndA: metalSurface(t, "silver"), EndB: metalSurface(t, "aluminium")}
	res, err := Solve(b, Request{MaxFrequency: 12e9, Losses: true})
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range res {
		u, err := r.Loss.Unloaded(b, Walls{Set: set})
		if err != nil {
			t.Fatal(err)
		}
		rs, _, err := set.Resistances(r.Frequency)
		if err != nil {
			t.Fatal(err)
		}
		want, err := qfactor.WallQ(c, r.Origin, rs)
		if err != nil {
			t.Fatal(err)
		}
		if d := math.Abs(u.Q0-want.QWall) / want.QWall; d > 1e-9 {
			t.Errorf("%v: Q0 %.12g, closed form %.12g (rel %.1e)", r.Origin, u.Q0, want.QWall, d)
		}
		var inv float64
		for _, p := range u.Parts {
			inv += 1 / p.Q
		}
		if d := math.Abs(1/inv-u.QWall) / u.QWall; d > 1e-12 {
			t.Errorf("%v: parts do not sum to the wall Q", r.Origin)
		}
	}
	// Steps and inner conductors take their own surface when given.
	w := Walls{Set: qfactor.SameWalls(metalSurface(t, "copper"))}
	st := metalSurface(t, "silver")
	w.Steps = &st
	if w.Surface(Step).Conductor.Name != st.Conductor.Name || w.Surface(Inner).Conductor.Name != "copper" {
		t.Errorf("Walls.Surface: steps %q, inner %q", w.Surface(Step).Conductor.Name, w.Surface(Inner).Conductor.Name)
	}
}

// TestUnloadedOpenEnd checks that an open end contributes no plate loss:
// the Q of a trapped resonance does not change with the metal given for
// the plate at an open end.
func TestUnloadedOpenEnd(t *testing.T) {
	b := beamPipeCell(0.01, Pipe)
	res, err := Solve(b, Request{MaxFrequency: 4e9, Families: []cavity.Family{cavity.TM}, Losses: true})
	if err != nil || len(res) == 0 {
		t.Fatal(len(res), err)
	}
	cu := qfactor.SameWalls(metalSurface(t, "copper"))
	odd := cu
	odd.EndA, odd.EndB = metalSurface(t, "ss304"), metalSurface(t, "ss304")
	u1, err1 := res[0].Loss.Unloaded(b, Walls{Set: cu})
	u2, err2 := res[0].Loss.Unloaded(b, Walls{Set: odd})
	if err1 != nil || err2 != nil {
		t.Fatal(err1, err2)
	}
	if u1.Q0 != u2.Q0 {
		t.Errorf("open-end Q0 depends on the plate metal: %g against %g", u1.Q0, u2.Q0)
	}
	t.Logf("TM010-like trapped resonance %.9g GHz: Q0 (copper) %.6g", res[0].Frequency/1e9, u1.Q0)
}
