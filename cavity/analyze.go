package cavity

import (
	"fmt"
	"math"
	"slices"
)

// AnalysisSettings selects what Analyze computes about a design. The zero
// value gives the sensitivities, the tuning lengths, the thermal drift and
// trade-off curves of DefaultCurvePoints points, and no Monte Carlo.
type AnalysisSettings struct {
	// CurvePoints is the number of grid points of the trade-off curves
	// (exact breakpoints are added); zero means DefaultCurvePoints.
	CurvePoints int

	// Tolerance, when Tolerance.Samples > 0, runs MonteCarlo at the design
	// (Tolerance.Progress, when not nil, receives its progress).
	Tolerance Tolerance
}

// DefaultCurvePoints is the number of grid points of the trade-off curves
// when AnalysisSettings.CurvePoints is zero.
const DefaultCurvePoints = 121

// Analysis is what Analyze finds about a design.
type Analysis struct {
	// Settings are the settings used, defaults filled in.
	Settings AnalysisSettings

	Sensitivity Sensitivity
	// TunedLength holds the lengths at f (1 - Tuning) and f (1 + Tuning);
	// zero without tuning.
	TunedLength [2]float64
	// Drift holds f(TMin) - f and f(TMax) - f in Hz; zero without a range.
	Drift [2]float64
	// Spread is the Monte Carlo result; nil without a tolerance.
	Spread *Spread
	Curve  TradeOff
	// Reach is the reachable set over the tuning range, the temperature
	// range and the worst-case machining tolerance (Settings.Tolerance's
	// Diameter and Length as +- limits), with the worst-case clearance and
	// the offending modes: Cavity.Reach, the one verdict that design, the
	// mode chart and the datasheet print.
	Reach Reach
}

// TradeOff holds the curves of a design problem against D/L, for plotting:
// parallel slices, sorted by Ratio, with the exact breakpoints (mode
// crossings, the optimum) among the grid points. Q0 is NaN everywhere when
// no Q function was given.
type TradeOff struct {
	Ratio          []float64 // D/L
	Diameter       []float64 // m, for the design frequency
	Length         []float64 // m
	Clearance      []float64 // at the nominal dimensions, fraction
	WorstClearance []float64 // along the tuning and temperature path, fraction
	Q0             []float64
}

// Analyze computes the sensitivities of the design's wanted mode, the
// reachable set with its worst-case clearance (Cavity.Reach, tolerance
// included), the lengths at the ends of its tuning range, its drift at the ends of its
// temperature range, the Monte Carlo spread of its machining tolerance and
// the trade-off curves of its problem over the allowed D/L range.
//
// Method: the sensitivities are those of Cavity.Sensitivity; a tuned
// length is L = D / sqrt((1+t)^2 (s + a0) - a0) with s = (D/L)^2 and
// a0 = gx_w/gp_w (derived from the chart relation, as in Optimize); the
// drift evaluates the frequency of the expanded cavity with the fill's
// permittivity changed by its temperature coefficient (the linear model
// of Thermal); the spread is Cavity.MonteCarlo; the curves evaluate the
// clearance envelope of Optimize at the grid points and at the exact mode
// crossings (see Optimize for its accuracy).
//
// d is normally a result of Optimize, whose problem and envelope Analyze
// reuses; for any other Design it solves them again from d.Spec.
//
// Errors: invalid settings name the field and its range; errors of the Q
// function and of MonteCarlo are returned.
func Analyze(d Design, set AnalysisSettings) (Analysis, error) {
	if set.CurvePoints == 0 {
		set.CurvePoints = DefaultCurvePoints
	}
	if set.CurvePoints < 2 || set.CurvePoints > 100000 {
		return Analysis{}, fmt.Errorf("cavity: curve points must be in 2..100000, got %d", set.CurvePoints)
	}
	p, envW, s := d.prob, d.env, d.s
	if p == nil || envW == nil {
		var err error
		if p, err = newProblem(d.Spec); err != nil {
			return Analysis{}, err
		}
		if envW, _, err = p.envelope(p.path); err != nil {
			return Analysis{}, err
		}
		s = d.Ratio * d.Ratio
	}
	spec := p.spec
	a := Analysis{Settings: set}
	var err error
	op := d.Spec.Operation()
	op.DiameterTol, op.LengthTol = set.Tolerance.Diameter, set.Tolerance.Length
	if a.Reach, err = d.Cavity.Reach(op); err != nil {
		return Analysis{}, err
	}
	if a.Sensitivity, err = d.Cavity.Sensitivity(spec.Mode, spec.Thermal); err != nil {
		return Analysis{}, err
	}
	if spec.Tuning > 0 {
		D := d.Cavity.Diameter()
		for i, t := range []float64{-spec.Tuning, spec.Tuning} {
			lam := (1 + t) * (1 + t)
			a.TunedLength[i] = D / math.Sqrt(lam*(s+p.a0)-p.a0)
		}
	}
	if th := spec.Thermal; th.hasRange() {
		for i, T := range []float64{th.TMin, th.TMax} {
			dT := T - th.ref()
			c := d.Cavity
			r, z := th.sizes(T)
			c.Radius *= r
			c.Length *= z
			c.Fill.EpsR = spec.Fill.EpsAt(dT)
			a.Drift[i] = c.Frequency(spec.Mode) - d.Cavity.Frequency(spec.Mode)
		}
	}
	if set.Tolerance.Samples > 0 {
		sp, err := d.Cavity.MonteCarlo(spec.Mode, set.Tolerance)
		if err != nil {
			return Analysis{}, err
		}
		a.Spread = &sp
	}
	if a.Curve, err = p.curve(envW, s, set.CurvePoints); err != nil {
		return Analysis{}, err
	}
	return a, nil
}

// curve builds the trade-off curves over the user's ratio range, with n
// grid points.
func (p *problem) curve(envW *envelope, sOpt float64, n int) (TradeOff, error) {
	env0 := envW
	if !p.path.identity() {
		var err error
		if env0, _, err = p.envelope(newPath(p.a0, 0, 1, 1)); err != nil {
			return TradeOff{}, err
		}
	}
	full := p.full
	ss := make([]float64, 0, n+len(env0.modes)+1)
	for i := range n {
		ss = append(ss, full.lo*math.Pow(full.hi/full.lo, float64(i)/float64(n-1)))
	}
	ss[n-1] = full.hi
	ss = append(ss, sOpt)
	// Exact breakpoints: where a mode crosses the wanted one (the
	// clearance is zero there), rho_k(s) = 1, a linear equation. Their
	// clearance is set to zero without evaluating the envelope, which keeps
	// the curve O(CurvePoints * modes) rather than O(modes^2) for
	// high-order modes with thousands of neighbours.
	crossing := map[float64]bool{}
	for _, m := range env0.modes {
		if d := m.gp - p.w.gp; d != 0 {
			if s := (p.w.gx - m.gx) / d; s > full.lo && s < full.hi {
				ss = append(ss, s)
				crossing[s] = true
			}
		}
	}
	slices.Sort(ss)
	ss = slices.Compact(ss)
	t := TradeOff{
		Ratio: make([]float64, len(ss)), Diameter: make([]float64, len(ss)), Length: make([]float64, len(ss)),
		Clearance: make([]float64, len(ss)), WorstClearance: make([]float64, len(ss)), Q0: make([]float64, len(ss)),
	}
	for i, s := range ss {
		c := p.cavityAt(s)
		t.Ratio[i] = math.Sqrt(s)
		t.Diameter[i], t.Length[i] = c.Diameter(), c.Length
		if crossing[s] {
			// A mode meets the wanted one here, on the nominal path and
			// so on every path through it.
			t.Clearance[i], t.WorstClearance[i] = 0, 0
		} else {
			t.Clearance[i], _ = env0.at(s, nil)
			t.WorstClearance[i] = t.Clearance[i]
		}
		if envW != env0 && !crossing[s] {
			if envW.path.lo.at(s) >= minPathS {
				t.WorstClearance[i], _ = envW.at(s, nil)
			} else {
				t.WorstClearance[i] = 0 // the tuning path needs L > D/MinDesignRatio
			}
		}
		t.Q0[i] = math.NaN()
		if p.spec.Q != nil {
			q, err := p.qAt(s)
			if err != nil {
				return TradeOff{}, err
			}
			t.Q0[i] = q
		}
	}
	return t, nil
}
