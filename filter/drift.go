package filter

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"cylcav/cavity"
	"cylcav/physics"
)

// Temperature drift of a realised filter: each cavity's frequency moves
// with the thermal expansion of the metal of its body (the diameter) and
// of the part that sets its length (the body itself, or a spacer or rod of
// another metal), and with the fill's permittivity; the whole response is
// recomputed at both ends of a temperature range and judged by the one
// specification check (Design.Check).

// DriftSpec describes the thermal build of a filter.
type DriftSpec struct {
	// Body is the metal of the cavity bodies: it sets every diameter, and
	// every length when Rod is nil.
	Body physics.Conductor
	// Rod, when not nil, is the metal of the spacers or rods that set the
	// cavity lengths (an end plate held by rods of another metal).
	Rod *physics.Conductor
	// Reference is the temperature (K) at which the cavities have their
	// designed dimensions; zero means physics.StrainReference (20 C).
	Reference float64
	// Low and High are the ends of the operating range, K (Low < High).
	Low, High float64
	// ReturnLoss is the production return loss of the mask, as in
	// YieldOptions (zero: the design's).
	ReturnLoss float64
	// Spurious are the cavities' other resonances for Design.Check (at the
	// reference temperature), as Realisation.Spurious.
	Spurious []Spurious
}

// DriftEnd is the filter at one end of the temperature range.
type DriftEnd struct {
	T float64 // K
	// F holds each resonator's frequency, Hz, and Shift F minus its
	// frequency at the reference temperature, Hz.
	F, Shift []float64
	// Checks is Design.Check of the filter at T, Verdict its Overall.
	Checks  []Check
	Verdict Verdict
}

// DriftResult is the outcome of Drift.
type DriftResult struct {
	Reference float64 // K
	// DfDT holds each resonator's df/dT at the reference temperature, Hz/K
	// (cavity.Cavity.Sensitivity with the local expansion coefficients).
	DfDT []float64
	// Low and High are the filter at the two ends.
	Low, High DriftEnd
}

// Drift computes the temperature drift of realisation r of design d.
//
// At temperature T each cavity's diameter is scaled by
// Body.SizeRatio(T, Reference) and its length by the same ratio of the
// length-setting metal (physics.Conductor.SizeRatio: published contraction
// data over their range, else the linear expansion coefficient over
// -50..200 C; outside the data's range it is an error, never an
// extrapolation), the fill's permittivity follows its linear temperature
// coefficient (physics.Medium.EpsAt), and the frequency is the exact mode
// frequency of the scaled cavity. The resonator's detuning enters the
// matrix as M_ii = -Omega(f_i) (see Realise). The couplings are kept: a
// coupling coefficient is dimensionless, and a uniform expansion of a
// body and its irises leaves it unchanged (first order; a rod of another
// metal changes the coupling of end-wall irises at second order only);
// Q0 is kept at its reference value (the wall conductivity's temperature
// dependence is left out: a few per cent in Q0 over +-50 K for copper,
// common practice).
//
// DfDT is the linear rate at the reference temperature,
// cavity.Cavity.Sensitivity with alpha_r and alpha_z the local expansion
// coefficients (physics.Conductor.ExpansionAt), for comparison with the
// exact end values.
//
// Errors: invalid input, a temperature outside the data of either metal,
// or, for a fill with a temperature coefficient, outside -50..200 C (the
// coefficient is a linear model stated near 20 C).
func Drift(d *Design, r *Realisation, ds DriftSpec) (*DriftResult, error) {
	if d == nil || d.Folded == nil || r == nil || len(r.Cavities) != d.Spec.Order {
		return nil, errors.New("filter: drift needs a synthesised design and its realisation")
	}
	t0 := ds.Reference
	if t0 == 0 {
		t0 = physics.StrainReference
	}
	if !(ds.Low < ds.High) || !(ds.Low > 0) || math.IsInf(ds.High, 0) {
		return nil, fmt.Errorf("filter: temperature range must have 0 < low < high, got %g..%g K", ds.Low, ds.High)
	}
	if r.Cavities[0].Cavity.Fill.TCEpsKnown {
		// The fill's coefficient is stated near 20 C (physics.Medium.TCEps):
		// the linear model is used over the metals' linear range only.
		for _, T := range []float64{ds.Low, ds.High} {
			if !physics.TemperatureIn(T, physics.DefaultLinearTMin, physics.DefaultLinearTMax) {
				return nil, fmt.Errorf("filter: the fill's temperature coefficient is a linear model stated near 20 C, used from %s to %s only; got %s",
					physics.FormatTemperature(physics.DefaultLinearTMin, 4), physics.FormatTemperature(physics.DefaultLinearTMax, 4), physics.FormatTemperature(T, 4))
			}
		}
	}
	rod := ds.Body
	if ds.Rod != nil {
		rod = *ds.Rod
	}
	md, err := productionDesign(d, ds.ReturnLoss)
	if err != nil {
		return nil, err
	}
	res := &DriftResult{Reference: t0}
	ar, err := ds.Body.ExpansionAt(t0)
	if err != nil {
		return nil, fmt.Errorf("filter: body metal: %w", err)
	}
	az, err := rod.ExpansionAt(t0)
	if err != nil {
		return nil, fmt.Errorf("filter: rod metal: %w", err)
	}
	for _, c := range r.Cavities {
		s, err := c.Cavity.Sensitivity(r.Mode, cavity.Thermal{AlphaRadial: ar, AlphaAxial: az})
		if err != nil {
			return nil, err
		}
		res.DfDT = append(res.DfDT, s.DfDT)
	}
	q0 := r.Q0()
	end := func(T float64) (DriftEnd, error) {
		rb, err := ds.Body.SizeRatio(T, t0)
		if err != nil {
			return DriftEnd{}, fmt.Errorf("filter: body metal: %w", err)
		}
		rz, err := rod.SizeRatio(T, t0)
		if err != nil {
			return DriftEnd{}, fmt.Errorf("filter: rod metal: %w", err)
		}
		e := DriftEnd{T: T}
		m := mat.DenseCopyOf(d.Folded)
		for _, c := range r.Cavities {
			cv := c.Cavity
			cv.Radius *= rb
			cv.Length *= rz
			if cv.Fill.TCEpsKnown {
				cv.Fill.EpsR = cv.Fill.EpsAt(T - t0)
			}
			f := cv.Frequency(r.Mode)
			e.F = append(e.F, f)
			e.Shift = append(e.Shift, f-c.F)
			m.Set(c.Resonator, c.Resonator, -LowpassOmega(f, d.Spec.F0, d.Spec.BW))
		}
		td := md
		td.Folded = m
		if e.Checks, err = td.Check(q0, ds.Spurious); err != nil {
			return DriftEnd{}, err
		}
		e.Verdict = Overall(e.Checks)
		return e, nil
	}
	if res.Low, err = end(ds.Low); err != nil {
		return nil, err
	}
	if res.High, err = end(ds.High); err != nil {
		return nil, err
	}
	return res, nil
}
