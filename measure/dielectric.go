package measure

import (
	"fmt"
	"math"
)

// DielectricInput is an empty and a completely filled measurement of the
// same resonance (same mode, same cavity), each with its standard
// uncertainty.
type DielectricInput struct {
	FEmpty, FEmptyErr     float64 // resonant frequency of the empty (air or vacuum) cavity, Hz
	FFilled, FFilledErr   float64 // resonant frequency with the cavity completely filled, Hz
	Q0Empty, Q0EmptyErr   float64 // unloaded Q, empty
	Q0Filled, Q0FilledErr float64 // unloaded Q, filled

	// RsExponentErr is the standard uncertainty of the exponent a in
	// Rs ~ f^a of the walls (a = 1/2 for the classical skin effect;
	// roughness makes it larger); 0 means 0.1.
	RsExponentErr float64
}

// BudgetTerm is one input's contribution (one standard deviation) to the
// uncertainty of the results.
type BudgetTerm struct {
	Input          string
	EpsR, TanDelta float64
}

// DielectricResult is the measured fill.
type DielectricResult struct {
	EpsR, EpsRErr         float64
	TanDelta, TanDeltaErr float64
	Budget                []BudgetTerm
}

// MeasureDielectric returns the relative permittivity and loss tangent of
// a fill from an empty and a completely filled measurement of the same
// mode (non-magnetic fill, empty cavity's own fill lossless, vacuum
// permittivity in the empty cavity):
//
//	eps_r = (f_empty / f_filled)^2
//
// since every mode's frequency is inversely proportional to the fill's
// refractive index (Pozar, Microwave Engineering, 4th ed., sec. 6.4); the
// cavity's dimensions cancel, so they add no uncertainty (a gap between
// fill and wall would: the method needs a complete fill). The fill's Q is
// 1/tan(delta) (Pozar eq. (6.52)), and with the wall Q scaling as
// eta/Rs with eta = eta0/sqrt(eps_r) and Rs ~ f^a (derived: the mode's
// fields keep their shape, its frequency falls by sqrt(eps_r)),
//
//	tan(delta) = 1/Q0_filled - eps_r^((1-a)/2) / Q0_empty,  a = 1/2.
//
// The uncertainty budget propagates each input's standard uncertainty to
// first order (partial derivatives by central differences), including the
// exponent a; the terms add in quadrature. A negative loss tangent within
// its uncertainty is returned as computed; beyond three standard
// deviations it is an error (the two Q values are inconsistent).
func MeasureDielectric(in DielectricInput) (DielectricResult, error) {
	for _, v := range []struct {
		name string
		x    float64
	}{{"empty frequency", in.FEmpty}, {"filled frequency", in.FFilled}, {"empty Q0", in.Q0Empty}, {"filled Q0", in.Q0Filled}} {
		if !(v.x > 0) || math.IsInf(v.x, 0) {
			return DielectricResult{}, fmt.Errorf("measure: %s must be > 0 and finite, got %g", v.name, v.x)
		}
	}
	if !(in.FFilled < in.FEmpty) {
		return DielectricResult{}, fmt.Errorf("measure: the filled frequency %g Hz must be below the empty %g Hz (a fill with eps_r > 1)", in.FFilled, in.FEmpty)
	}
	aErr := in.RsExponentErr
	if aErr == 0 {
		aErr = 0.1
	}
	x := [5]float64{in.FEmpty, in.FFilled, in.Q0Empty, in.Q0Filled, 0.5}
	sig := [5]float64{in.FEmptyErr, in.FFilledErr, in.Q0EmptyErr, in.Q0FilledErr, aErr}
	names := [5]string{"empty frequency", "filled frequency", "empty Q0", "filled Q0", "wall model (Rs ~ f^a, a = 0.5)"}
	eval := func(x [5]float64) (eps, tand float64) { return dielectricAt(x[0], x[1], x[2], x[3], x[4]) }
	eps, tand := eval(x)
	r := DielectricResult{EpsR: eps, TanDelta: tand}
	var ve, vt float64
	for i := range x {
		h := 1e-6 * math.Max(math.Abs(x[i]), 1e-3)
		xp, xm := x, x
		xp[i] += h
		xm[i] -= h
		ep, tp := eval(xp)
		em, tm := eval(xm)
		te := (ep - em) / (2 * h) * sig[i]
		tt := (tp - tm) / (2 * h) * sig[i]
		r.Budget = append(r.Budget, BudgetTerm{Input: names[i], EpsR: math.Abs(te), TanDelta: math.Abs(tt)})
		ve += te * te
		vt += tt * tt
	}
	r.EpsRErr, r.TanDeltaErr = math.Sqrt(ve), math.Sqrt(vt)
	if tand < -3*r.TanDeltaErr {
		return r, fmt.Errorf("measure: loss tangent %.3g is negative beyond its uncertainty %.2g: the filled Q0 is higher than the walls alone allow; check the two measurements", tand, r.TanDeltaErr)
	}
	return r, nil
}

// dielectricAt evaluates eps_r and tan(delta) for the inputs and the wall
// exponent a (see MeasureDielectric).
func dielectricAt(fe, ff, qe, qf, a float64) (eps, tand float64) {
	eps = sq(fe / ff)
	tand = 1/qf - math.Pow(eps, (1-a)/2)/qe
	return eps, tand
}
