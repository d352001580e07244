package measure

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/qfactor"
)

func wallCase(t *testing.T) (cavity.Cavity, []cavity.Mode, qfactor.WallSet, []float64) {
	t.Helper()
	brass, err := physics.LookupConductor("brass")
	if err != nil {
		t.Fatal(err)
	}
	walls := qfactor.SameWalls(qfactor.Surface{Conductor: brass})
	c := cavity.Cavity{Radius: 20.04e-3, Length: 30.85e-3}
	var modes []cavity.Mode
	for _, s := range []string{"TM010", "TE111", "TM011", "TE211", "TM110", "TM111", "TE011", "TE112"} {
		m, err := cavity.ParseMode(s)
		if err != nil {
			t.Fatal(err)
		}
		modes = append(modes, m)
	}
	q0 := make([]float64, len(modes))
	for i, m := range modes {
		u, err := qfactor.UnloadedQ(c, m, walls.At(nil))
		if err != nil {
			t.Fatal(err)
		}
		q0[i] = u.Q0
	}
	return c, modes, walls, q0
}

// TestDiagnoseWalls: unloaded Qs computed by package qfactor for smooth
// brass walls through a WallSet give back brass's conductivity (the
// materials table, % IACS at 20 C) through the reference-wall route of
// DiagnoseWalls, for every mode, with no end-plate warning.
func TestDiagnoseWalls(t *testing.T) {
	c, modes, walls, q0 := wallCase(t)
	brass, _ := physics.LookupConductor("brass")
	idx := make([]int, len(modes))
	errs := make([]float64, len(modes))
	for i := range idx {
		idx[i], errs[i] = i, q0[i]*1e-3
	}
	d, err := DiagnoseWalls(c, idx, modes, q0, errs, &walls)
	if err != nil {
		t.Fatal(err)
	}
	// iacsTol: both routes evaluate the same closed forms with different
	// surface resistances; rounding only.
	const iacsTol = 1e-9
	for _, mw := range d.Modes {
		if math.Abs(mw.IACS-brass.IACS()) > iacsTol || math.Abs(mw.ModelIACS-brass.IACS()) > iacsTol {
			t.Errorf("%v: IACS %.12g (model %.12g), want %.12g", mw.Mode, mw.IACS, mw.ModelIACS, brass.IACS())
		}
		// The uncertainty by a central difference (derived formula checked
		// by an independent route).
		h := mw.Q0 * 1e-6
		up, _ := DiagnoseWalls(c, []int{0}, []cavity.Mode{mw.Mode}, []float64{mw.Q0 + h}, []float64{0}, nil)
		dn, _ := DiagnoseWalls(c, []int{0}, []cavity.Mode{mw.Mode}, []float64{mw.Q0 - h}, []float64{0}, nil)
		want := (up.Modes[0].IACS - dn.Modes[0].IACS) / (2 * h) * mw.Q0Err
		if math.Abs(mw.IACSErr-want) > 1e-6*want {
			t.Errorf("%v: IACS uncertainty %.6g, by differences %.6g", mw.Mode, mw.IACSErr, want)
		}
	}
	if d.Joint || d.Spread > iacsTol {
		t.Errorf("uniform walls: joint %v, spread %g", d.Joint, d.Spread)
	}
	// A poor end-plate contact: TM modes lose 30 % more than the model.
	for i, m := range modes {
		if m.Family == cavity.TM {
			q0[i] *= 0.7
		}
	}
	d, err = DiagnoseWalls(c, idx, modes, q0, errs, &walls)
	if err != nil {
		t.Fatal(err)
	}
	if !d.Joint || !(d.TM < 0.6*d.TE0) {
		t.Errorf("TM Q 30 %% low: joint %v, TE0 %.3g, TM %.3g", d.Joint, d.TE0, d.TM)
	}
}
