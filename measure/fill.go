package measure

import (
	"fmt"
	"math"

	"cylcav/cavity"
)

// FillMode is the fill measured at one mode present in both sweeps.
type FillMode struct {
	Mode            cavity.Mode
	FEmpty, FFilled float64 // Hz
	Result          DielectricResult
	// FillE is the sample's electric filling factor, the fraction of the
	// mode's electric energy in it: 1 for a complete fill.
	FillE float64
}

// Fill is the fill measured from an empty and a filled sweep of the same
// cavity over every mode identified in both.
type Fill struct {
	Modes []FillMode
	// EpsR and TanDelta are the means over Modes weighted by 1/err^2.
	// Their uncertainties are those of the best single mode, not the
	// weighted-mean error: the wall-model term of the budget is common to
	// every mode and does not average out (derived).
	EpsR, EpsRErr         float64
	TanDelta, TanDeltaErr float64
}

// combine sets the means over f.Modes and their uncertainties (see Fill):
// inverse-variance weights (Taylor, An Introduction to Error Analysis, 2nd
// ed., sec. 7.2), the best single mode's error.
func (f *Fill) combine() {
	var we, se, wt, st float64
	f.EpsRErr, f.TanDeltaErr = math.Inf(1), math.Inf(1)
	for _, m := range f.Modes {
		r := m.Result
		we += 1 / (r.EpsRErr * r.EpsRErr)
		se += r.EpsR / (r.EpsRErr * r.EpsRErr)
		wt += 1 / (r.TanDeltaErr * r.TanDeltaErr)
		st += r.TanDelta / (r.TanDeltaErr * r.TanDeltaErr)
		f.EpsRErr = math.Min(f.EpsRErr, r.EpsRErr)
		f.TanDeltaErr = math.Min(f.TanDeltaErr, r.TanDeltaErr)
	}
	f.EpsR, f.TanDelta = se/we, st/wt
}

// MeasureFill pairs the modes matched and resolved in both the empty
// sweep (resonances empty, identification idEmpty) and the filled one, and
// measures the fill at each with MeasureDielectric. Errors: no mode is
// identified in both sweeps, or the measurement at a mode fails (the error
// names the mode).
func MeasureFill(empty []Resonance, idEmpty Identification, filled []Resonance, idFilled Identification) (Fill, error) {
	find := func(id Identification, m cavity.Mode) int {
		for i, a := range id.Assign {
			if a.Matched && !a.Unresolved && a.Mode == m {
				return i
			}
		}
		return -1
	}
	var out Fill
	for i, a := range idEmpty.Assign {
		if !a.Matched || a.Unresolved {
			continue
		}
		j := find(idFilled, a.Mode)
		if j < 0 {
			continue
		}
		e, f := empty[i], filled[j]
		r, err := MeasureDielectric(DielectricInput{
			FEmpty: e.F0, FEmptyErr: e.F0Err, FFilled: f.F0, FFilledErr: f.F0Err,
			Q0Empty: e.Q0, Q0EmptyErr: e.Q0Err, Q0Filled: f.Q0, Q0FilledErr: f.Q0Err,
		})
		if err != nil {
			return Fill{}, fmt.Errorf("%v: %w", a.Mode, err)
		}
		out.Modes = append(out.Modes, FillMode{Mode: a.Mode, FEmpty: e.F0, FFilled: f.F0, Result: r, FillE: 1})
	}
	if len(out.Modes) == 0 {
		return Fill{}, fmt.Errorf("no mode is identified in both sweeps, so the fill cannot be measured")
	}
	out.combine()
	return out, nil
}
