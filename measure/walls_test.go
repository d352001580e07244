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

// roughTol is the relative agreement required between the equivalent
// roughness found by bisection and the truth or the closed-form inverse:
// the bisection stops at 1e-10 in log(roughness); the rest is rounding in
// the Q model (derived).
const roughTol = 1e-7

// TestEquivalentRoughness: unloaded Qs computed by package qfactor for
// brass walls of 0.8 um RMS roughness under each roughness model give back
// 0.8 um (and no spread) when diagnosed against smooth brass walls under
// that model; for Hammerstad-Bekkadal the value also matches the
// closed-form inverse of K = 1 + (2/pi) atan(1.4 (r/delta)^2),
// r = delta sqrt(tan(pi (K - 1)/2) / 1.4) (derived from Hammerstad and
// Bekkadal 1975) with K = QWall(smooth)/QWall(measured). Qs above the
// smooth model and below what any roughness gives are verdicts, not
// numbers.
func TestEquivalentRoughness(t *testing.T) {
	const rough = 0.8e-6
	for _, model := range []qfactor.RoughnessModel{qfactor.HammerstadBekkadal, qfactor.Groiss} {
		t.Run(model.String(), func(t *testing.T) {
			c, modes, walls, smoothQ := wallCase(t)
			for _, s := range []*qfactor.Surface{&walls.Side, &walls.EndA, &walls.EndB} {
				s.RoughnessModel = model
			}
			rw := walls
			for _, s := range []*qfactor.Surface{&rw.Side, &rw.EndA, &rw.EndB} {
				s.Roughness = rough
			}
			idx := make([]int, len(modes))
			q0 := make([]float64, len(modes))
			errs := make([]float64, len(modes))
			for i, m := range modes {
				u, err := qfactor.UnloadedQ(c, m, rw.At(nil))
				if err != nil {
					t.Fatal(err)
				}
				idx[i], q0[i], errs[i] = i, u.Q0, u.Q0*1e-3
			}
			d, err := DiagnoseWalls(c, idx, modes, q0, errs, &walls)
			if err != nil {
				t.Fatal(err)
			}
			if d.RoughModel != model || math.Abs(d.RoughMean-rough) > roughTol*rough || d.RoughSpread > roughTol*rough {
				t.Errorf("model %v, mean %.6g m, spread %.3g m; want %v, %g m, 0", d.RoughModel, d.RoughMean, d.RoughSpread, model, rough)
			}
			for i, mw := range d.Modes {
				if mw.Rough != RoughFound || math.Abs(mw.Roughness-rough) > roughTol*rough {
					t.Errorf("%v: %v, %.8g m, want %g m", mw.Mode, mw.Rough, mw.Roughness, rough)
				}
				if model == qfactor.HammerstadBekkadal {
					k := smoothQ[i] / q0[i]
					delta := qfactor.SkinDepth(mw.F, walls.Side.Conductor.Conductivity, 1)
					want := delta * math.Sqrt(math.Tan(math.Pi*(k-1)/2)/1.4)
					if math.Abs(mw.Roughness-want) > roughTol*want {
						t.Errorf("%v: %.8g m, closed-form inverse %.8g m", mw.Mode, mw.Roughness, want)
					}
				}
				// The uncertainty against a direct central difference.
				up, err := DiagnoseWalls(c, []int{0}, []cavity.Mode{mw.Mode}, []float64{mw.Q0 + mw.Q0Err}, []float64{0}, &walls)
				if err != nil {
					t.Fatal(err)
				}
				dn, err := DiagnoseWalls(c, []int{0}, []cavity.Mode{mw.Mode}, []float64{mw.Q0 - mw.Q0Err}, []float64{0}, &walls)
				if err != nil {
					t.Fatal(err)
				}
				want := (dn.Modes[0].Roughness - up.Modes[0].Roughness) / 2
				if math.Abs(mw.RoughnessErr-want) > 1e-6*want {
					t.Errorf("%v: roughness uncertainty %.6g m, by differences %.6g m", mw.Mode, mw.RoughnessErr, want)
				}
			}
			// Better than smooth, and worse than any roughness (K > 2).
			d, err = DiagnoseWalls(c, []int{0, 1}, modes[:2], []float64{smoothQ[0] * 1.01, smoothQ[1] / 2.5}, []float64{1, 1}, &walls)
			if err != nil {
				t.Fatal(err)
			}
			if d.Modes[0].Rough != RoughSmoother || d.Modes[0].Roughness != 0 || d.Modes[1].Rough != RoughBeyond || !math.IsNaN(d.Modes[1].Roughness) || !math.IsNaN(d.RoughMean) {
				t.Errorf("verdicts %v (%g m), %v (%g m), mean %g; want smoother (0), beyond (NaN), NaN", d.Modes[0].Rough, d.Modes[0].Roughness, d.Modes[1].Rough, d.Modes[1].Roughness, d.RoughMean)
			}
		})
	}
}
