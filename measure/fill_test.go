package measure

import (
	"math"
	"testing"

	"cylcav/cavity"
)

// TestMeasureFill checks the pairing of modes across the two sweeps and
// the weighted mean by an independent route: each mode's result is
// MeasureDielectric's on that mode alone, and the mean is recomputed here
// from those with weights 1/err^2 (the definition of the weighted mean).
// A mode unmatched in either sweep, or unresolved, takes no part.
func TestMeasureFill(t *testing.T) {
	te011 := cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}
	tm010 := cavity.Mode{Family: cavity.TM, N: 0, M: 1, P: 0}
	te111 := cavity.Mode{Family: cavity.TE, N: 1, M: 1, P: 1}
	const eps = 2.08
	res := func(f, q float64) Resonance { return Resonance{F0: f, F0Err: f * 1e-7, Q0: q, Q0Err: q * 0.01} }
	empty := []Resonance{res(10e9, 20000), res(7e9, 15000), res(9e9, 18000)}
	filled := []Resonance{res(9e9/math.Sqrt(eps), 2200), res(10e9/math.Sqrt(eps), 2400), res(7e9/math.Sqrt(eps), 2300)}
	idE := Identification{Assign: []Assignment{{Mode: te011, Matched: true}, {Mode: tm010, Matched: true}, {Mode: te111, Matched: false}}}
	idF := Identification{Assign: []Assignment{{Mode: te111, Matched: true}, {Mode: te011, Matched: true}, {Mode: tm010, Matched: true}}}
	got, err := MeasureFill(empty, idE, filled, idF)
	if err != nil {
		t.Fatal(err)
	}
	if len(got.Modes) != 2 || got.Modes[0].Mode != te011 || got.Modes[1].Mode != tm010 {
		t.Fatalf("MeasureFill modes = %+v, want TE011 and TM010 (TE111 is unmatched in the empty sweep)", got.Modes)
	}
	var we, se, wt, st float64
	for k, pair := range [][2]int{{0, 1}, {1, 2}} {
		e, f := empty[pair[0]], filled[pair[1]]
		r, err := MeasureDielectric(DielectricInput{FEmpty: e.F0, FEmptyErr: e.F0Err, FFilled: f.F0, FFilledErr: f.F0Err,
			Q0Empty: e.Q0, Q0EmptyErr: e.Q0Err, Q0Filled: f.Q0, Q0FilledErr: f.Q0Err})
		if err != nil {
			t.Fatal(err)
		}
		if got.Modes[k].Result.EpsR != r.EpsR || got.Modes[k].Result.TanDelta != r.TanDelta {
			t.Errorf("mode %v: result %+v, want MeasureDielectric's %+v", got.Modes[k].Mode, got.Modes[k].Result, r)
		}
		if math.Abs(r.EpsR-eps) > 1e-12 {
			t.Errorf("mode %v: eps_r = %.15g, want %g = (f_empty/f_filled)^2 (Pozar sec. 6.4)", got.Modes[k].Mode, r.EpsR, eps)
		}
		we, se = we+1/(r.EpsRErr*r.EpsRErr), se+r.EpsR/(r.EpsRErr*r.EpsRErr)
		wt, st = wt+1/(r.TanDeltaErr*r.TanDeltaErr), st+r.TanDelta/(r.TanDeltaErr*r.TanDeltaErr)
	}
	if math.Abs(got.EpsR-se/we) > 1e-15*got.EpsR || math.Abs(got.TanDelta-st/wt) > 1e-12*math.Abs(got.TanDelta) {
		t.Errorf("means eps_r %.15g, tan delta %.6g; want %.15g, %.6g", got.EpsR, got.TanDelta, se/we, st/wt)
	}
	idF.Assign[1].Unresolved, idF.Assign[2].Matched = true, false
	if _, err := MeasureFill(empty, idE, filled, idF); err == nil {
		t.Error("MeasureFill with no mode identified in both sweeps: no error")
	}
}
