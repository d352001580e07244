package measure

import (
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/qfactor"
)

// ModeWall is the wall diagnosis of one identified resonance.
type ModeWall struct {
	Index int         // index of the resonance in the caller's list
	Mode  cavity.Mode // its mode
	F     float64     // its measured frequency, Hz

	Q0, Q0Err float64 // measured unloaded Q and standard uncertainty
	QWall     float64 // measured wall Q: 1/QWall = 1/Q0 - 1/Q_fill

	// IACS is the conductivity of a smooth uniform wall that would give
	// QWall, as a fraction of 100 % IACS, and IACSErr its standard
	// uncertainty from Q0Err.
	IACS, IACSErr float64

	// ModelQ0 is the unloaded Q of the mode for the walls given to
	// DiagnoseWalls (NaN when none were given), and ModelIACS the smooth
	// uniform conductivity that gives the same wall Q.
	ModelQ0, ModelIACS float64

	// Roughness is the RMS roughness that, applied to every wall part of
	// the walls given to DiagnoseWalls under their roughness model, gives
	// QWall, and RoughnessErr its standard uncertainty from Q0Err; m. It is
	// NaN without walls and when Rough is not RoughFound.
	Roughness, RoughnessErr float64
	Rough                   RoughVerdict
}

// RoughVerdict says whether an equivalent roughness could be found.
type RoughVerdict int

const (
	RoughNone     RoughVerdict = iota // no walls given
	RoughFound                        // Roughness holds the equivalent RMS roughness
	RoughSmoother                     // the measured wall Q is at or above the smooth walls' model
	RoughBeyond                       // more loss than any roughness gives under the model
	RoughNoEffect                     // roughness does not change these walls' model (superconducting)
)

// String describes the verdict for people.
func (v RoughVerdict) String() string {
	switch v {
	case RoughFound:
		return "found"
	case RoughSmoother:
		return "smoother than the model"
	case RoughBeyond:
		return "beyond the roughness model"
	case RoughNoEffect:
		return "roughness has no effect"
	}
	return "no walls"
}

// WallDiagnosis compares the measured unloaded Q of each identified mode
// with the model: see DiagnoseWalls.
type WallDiagnosis struct {
	Modes []ModeWall

	// Mean and Spread are the mean and standard deviation of IACS across
	// the modes.
	Mean, Spread float64

	// TE0 and TM are the mean IACS of the TE0mp modes (purely azimuthal
	// wall currents, none crossing the joint between side wall and end
	// plate) and of the TM modes (axial side-wall currents that cross the
	// joint); NaN when there is none of the kind.
	TE0, TM float64

	// RoughMean and RoughSpread are the mean and standard deviation of the
	// equivalent roughness over the modes where it was found (NaN when
	// none), m; RoughModel is the walls' roughness model.
	RoughMean, RoughSpread float64
	RoughModel             qfactor.RoughnessModel

	// Joint is set when the TM modes show a lower conductivity than the
	// TE0mp modes by more than jointTol plus three standard errors: the
	// signature of a poor electrical contact at the end plates.
	Joint bool
}

// jointTol is the relative TE0mp-TM difference of effective conductivity
// below which no contact problem is reported: the model's wall Q is good
// to a few percent for real surfaces (roughness, plating, the
// coupling holes' own loss; common practice), which is about 5 % in Q and
// 10 % in conductivity.
const jointTol = 0.10

// DiagnoseWalls derives the effective wall conductivity of each identified
// mode from its measured unloaded Q. For mode m of cavity c (the fitted
// effective cavity; its fill's loss tangent sets Q_fill) the wall Q is
// 1/QWall = 1/Q0 - 1/Q_fill (Pozar, Microwave Engineering, 4th ed., sec.
// 6.3), and since the wall Q of a smooth wall is G/Rs with
// Rs = sqrt(omega mu0 / (2 sigma)) (Pozar sec. 1.7; G the geometry factor
// of package qfactor), the conductivity of a uniform smooth wall giving
// QWall is (derived)
//
//	sigma_eff = sigma_IACS (QWall / Q_IACS)^2,
//
// with Q_IACS the wall Q of the mode for 100 % IACS walls. walls, when not
// nil, gives each mode's model Q0 through qfactor.WallSet for comparison.
// modes[i], q0[i] and q0Err[i] describe resonance index[i] of the caller.
//
// With walls, each mode also gets the equivalent RMS roughness: the one
// roughness which, set on every part of walls under the roughness model of
// its side wall, makes the model's wall Q equal QWall (see
// equivalentRoughness).
func DiagnoseWalls(c cavity.Cavity, index []int, modes []cavity.Mode, q0, q0Err []float64, walls *qfactor.WallSet) (WallDiagnosis, error) {
	if len(modes) != len(q0) || len(q0) != len(q0Err) || len(index) != len(q0) {
		return WallDiagnosis{}, fmt.Errorf("measure: DiagnoseWalls needs one index, mode, Q0 and uncertainty per resonance")
	}
	if len(modes) == 0 {
		return WallDiagnosis{}, fmt.Errorf("measure: no identified resonance to diagnose the walls")
	}
	if walls != nil {
		if err := walls.Validate(); err != nil {
			return WallDiagnosis{}, err
		}
	}
	qFill := c.Fill.Q()
	d := WallDiagnosis{TE0: math.NaN(), TM: math.NaN(), RoughMean: math.NaN(), RoughSpread: math.NaN()}
	if walls != nil {
		d.RoughModel = walls.Side.RoughnessModel
	}
	var rough []float64
	var te0, tm []float64
	var sum float64
	for k, m := range modes {
		f := c.Frequency(m)
		rsIACS := qfactor.SurfaceResistance(f, physics.IACSConductivity, 1)
		ref, err := qfactor.WallQ(c, m, qfactor.Uniform(rsIACS))
		if err != nil {
			return WallDiagnosis{}, err
		}
		mw := ModeWall{Index: index[k], Mode: m, F: f, Q0: q0[k], Q0Err: q0Err[k], ModelQ0: math.NaN(), ModelIACS: math.NaN(),
			Roughness: math.NaN(), RoughnessErr: math.NaN()}
		inv := 1/q0[k] - 1/qFill
		if !(inv > 0) {
			return WallDiagnosis{}, fmt.Errorf("measure: resonance %d (%v): measured Q0 %.4g is not below the fill's own Q %.4g; the fill's loss tangent is too high for this Q", index[k]+1, m, q0[k], qFill)
		}
		mw.QWall = 1 / inv
		r := mw.QWall / ref.QWall
		mw.IACS = r * r
		// d(IACS)/d(Q0) = 2 r / Q_IACS * dQWall/dQ0, dQWall/dQ0 = (QWall/Q0)^2 (derived)
		mw.IACSErr = 2 * r / ref.QWall * sq(mw.QWall/q0[k]) * q0Err[k]
		if walls != nil {
			u, err := qfactor.UnloadedQ(c, m, walls.At(nil))
			if err != nil {
				return WallDiagnosis{}, err
			}
			mw.ModelQ0 = u.Q0
			mw.ModelIACS = sq(u.Wall.QWall / ref.QWall)
			// QWall's uncertainty: dQWall/dQ0 = (QWall/Q0)^2 (derived)
			dq := sq(mw.QWall/q0[k]) * q0Err[k]
			if mw.Roughness, mw.Rough, err = equivalentRoughness(c, m, *walls, mw.QWall); err != nil {
				return WallDiagnosis{}, err
			}
			if mw.Rough == RoughFound {
				lo, vlo, err := equivalentRoughness(c, m, *walls, mw.QWall+dq)
				if err != nil {
					return WallDiagnosis{}, err
				}
				hi, vhi, err := equivalentRoughness(c, m, *walls, mw.QWall-dq)
				if err != nil {
					return WallDiagnosis{}, err
				}
				if vlo == RoughSmoother {
					lo = 0
				}
				if vlo != RoughBeyond && vhi == RoughFound {
					mw.RoughnessErr = (hi - lo) / 2
				}
				rough = append(rough, mw.Roughness)
			}
		}
		d.Modes = append(d.Modes, mw)
		sum += mw.IACS
		switch {
		case m.Family == cavity.TE && m.N == 0:
			te0 = append(te0, mw.IACS)
		case m.Family == cavity.TM:
			tm = append(tm, mw.IACS)
		}
	}
	n := float64(len(d.Modes))
	d.Mean = sum / n
	if n > 1 {
		var ss float64
		for _, mw := range d.Modes {
			ss += sq(mw.IACS - d.Mean)
		}
		d.Spread = math.Sqrt(ss / (n - 1))
	}
	mean := func(v []float64) (m, se float64) {
		if len(v) == 0 {
			return math.NaN(), math.NaN()
		}
		var s, ss float64
		for _, x := range v {
			s += x
		}
		m = s / float64(len(v))
		for _, x := range v {
			ss += sq(x - m)
		}
		if len(v) > 1 {
			se = math.Sqrt(ss / float64(len(v)-1) / float64(len(v)))
		}
		return m, se
	}
	if len(rough) > 0 {
		d.RoughMean, d.RoughSpread = meanSD(rough)
	}
	var seTE, seTM float64
	d.TE0, seTE = mean(te0)
	d.TM, seTM = mean(tm)
	if len(te0) > 0 && len(tm) > 0 {
		d.Joint = d.TE0-d.TM > jointTol*d.TE0+3*math.Hypot(seTE, seTM)
	}
	return d, nil
}

// meanSD returns the mean and sample standard deviation of v (0 for one
// value).
func meanSD(v []float64) (m, sd float64) {
	for _, x := range v {
		m += x
	}
	m /= float64(len(v))
	if len(v) > 1 {
		var ss float64
		for _, x := range v {
			ss += sq(x - m)
		}
		sd = math.Sqrt(ss / float64(len(v)-1))
	}
	return m, sd
}

// equivalentRoughness returns the RMS roughness which, set on every part
// of walls (each part keeping its metal, plating and temperature, under
// the side wall's roughness model), makes the wall Q of mode m in c equal
// qWall. The wall Q of the model falls monotonically with the roughness
// (every model's factor K rises with it: see qfactor.RoughnessFactor), so
// bisection in log(roughness) over [roughLo, qfactor.MaxRoughness] finds
// it. The models saturate at K = 2, so a wall Q below the model's at
// MaxRoughness is RoughBeyond, not a number; one above the smooth walls'
// is RoughSmoother (and 0).
func equivalentRoughness(c cavity.Cavity, m cavity.Mode, walls qfactor.WallSet, qWall float64) (float64, RoughVerdict, error) {
	// roughLo is far below any skin depth of a normal metal at microwave
	// frequencies (0.1 um and up): the factor K is 1 there to 1e-12.
	const roughLo = 1e-12
	model := walls.Side.RoughnessModel
	at := func(r float64) (float64, error) {
		w := walls
		for _, s := range []*qfactor.Surface{&w.Side, &w.EndA, &w.EndB} {
			s.Roughness, s.RoughnessModel = r, model
		}
		u, err := qfactor.UnloadedQ(c, m, w.At(nil))
		if err != nil {
			return 0, err
		}
		return u.Wall.QWall, nil
	}
	smooth, err := at(0)
	if err != nil {
		return 0, RoughNone, err
	}
	rough, err := at(qfactor.MaxRoughness)
	if err != nil {
		return 0, RoughNone, err
	}
	switch {
	case !(rough < smooth*(1-1e-9)):
		return math.NaN(), RoughNoEffect, nil
	case qWall >= smooth:
		return 0, RoughSmoother, nil
	case qWall <= rough:
		return math.NaN(), RoughBeyond, nil
	}
	lo, hi := math.Log(roughLo), math.Log(qfactor.MaxRoughness)
	for i := 0; i < 100 && hi-lo > 1e-10; i++ {
		mid := (lo + hi) / 2
		q, err := at(math.Exp(mid))
		if err != nil {
			return 0, RoughNone, err
		}
		if q > qWall {
			lo = mid
		} else {
			hi = mid
		}
	}
	return math.Exp((lo + hi) / 2), RoughFound, nil
}
