package cavity

import (
	"errors"
	"fmt"
	"math"

	"cylcav/physics"
)

// Objective selects what Optimize maximises.
type Objective uint8

const (
	// MaxClearance maximises the clearance of the wanted mode (the zero
	// value).
	MaxClearance Objective = iota
	// MaxQ maximises the unloaded Q subject to DesignSpec.MinClearance.
	MaxQ
)

// String returns "clearance" or "q".
func (o Objective) String() string {
	switch o {
	case MaxClearance:
		return "clearance"
	case MaxQ:
		return "q"
	}
	return fmt.Sprintf("Objective(%d)", uint8(o))
}

// Thermal describes how a cavity's dimensions and fill change with
// temperature. By default the model is linear: D(T) = D0 (1 + AlphaRadial
// (T - TRef)), L(T) = L0 (1 + AlphaAxial (T - TRef)); SizeRadial and
// SizeAxial, when set, replace it with any measured law (for example the
// integrated cryogenic contraction of physics.Conductor.SizeRatio). The
// fill's permittivity follows its own temperature coefficient
// (physics.Medium.EpsAt); Thermal describes only the metal. The zero value
// is a cavity that does not change and no temperature range.
type Thermal struct {
	// AlphaRadial is the linear expansion coefficient of the side wall
	// (it sets the diameter) at TRef, 1/K. The sensitivities use it.
	AlphaRadial float64
	// AlphaAxial is that of whatever sets the length (end spacers, the
	// tuning rod), 1/K.
	AlphaAxial float64
	// TMin and TMax bound the operating temperature range in K; both zero
	// means no range (only the sensitivities use the coefficients).
	TMin, TMax float64
	// TRef is the temperature at which the design frequency holds, K; zero
	// means the middle of TMin..TMax.
	TRef float64
	// SizeRadial and SizeAxial, when not nil, return D(T)/D(TRef) and
	// L(T)/L(TRef) over TMin..TMax, in place of the linear model. They
	// must return 1 at TRef.
	SizeRadial, SizeAxial func(T float64) float64
}

// hasRange reports whether a temperature range is set.
func (t Thermal) hasRange() bool { return t.TMin != 0 || t.TMax != 0 }

// ref returns the reference temperature.
func (t Thermal) ref() float64 {
	if t.TRef != 0 {
		return t.TRef
	}
	return 0.5 * (t.TMin + t.TMax)
}

// sizes returns D(T)/D(TRef) and L(T)/L(TRef).
func (t Thermal) sizes(T float64) (radial, axial float64) {
	dT := T - t.ref()
	radial, axial = 1+t.AlphaRadial*dT, 1+t.AlphaAxial*dT // linear model
	if t.SizeRadial != nil {
		radial = t.SizeRadial(T)
	}
	if t.SizeAxial != nil {
		axial = t.SizeAxial(T)
	}
	return radial, axial
}

// Validate reports whether the coefficients are finite and within +-1e-3
// 1/K, and the range, if any, is ordered within 1..3000 K with a positive
// reference temperature and every size factor finite and > 0 at both ends.
func (t Thermal) Validate() error {
	for _, q := range []struct {
		name string
		v    float64
	}{{"radial expansion coefficient", t.AlphaRadial}, {"axial expansion coefficient", t.AlphaAxial}} {
		if !(math.Abs(q.v) <= 1e-3) {
			return fmt.Errorf("cavity: %s must be within +-1e-3 1/K, got %g 1/K", q.name, q.v)
		}
	}
	if !t.hasRange() {
		return nil
	}
	if !(t.TMin >= 1 && t.TMax <= 3000 && t.TMin <= t.TMax) {
		return fmt.Errorf("cavity: temperature range must satisfy 1 K <= TMin <= TMax <= 3000 K, got %g K..%g K", t.TMin, t.TMax)
	}
	if r := t.TRef; r != 0 && !(r >= 1 && r <= 3000) {
		return fmt.Errorf("cavity: reference temperature must be in 1..3000 K, got %g K", r)
	}
	for _, T := range []float64{t.TMin, t.TMax} {
		dT := T - t.ref()
		r, a := t.sizes(T)
		if !(r > 0 && a > 0) || math.IsInf(r, 0) || math.IsInf(a, 0) {
			return fmt.Errorf("cavity: the thermal model breaks down %g K away from the reference temperature", dT)
		}
	}
	return nil
}

// checkFillDrift reports whether the fill's permittivity stays positive and
// its linear temperature model within +-1e-3 1/K over th's range.
func checkFillDrift(fill physics.Medium, th Thermal) error {
	tc := fill.EpsTempCoeff()
	if !(math.Abs(tc) <= 1e-3) {
		return fmt.Errorf("cavity: temperature coefficient of eps must be within +-1e-3 1/K, got %g 1/K", tc)
	}
	if !th.hasRange() {
		return nil
	}
	for _, T := range []float64{th.TMin, th.TMax} {
		if dT := T - th.ref(); !(fill.EpsAt(dT) > 0) {
			return fmt.Errorf("cavity: the fill's permittivity model breaks down %g K away from the reference temperature", dT)
		}
	}
	return nil
}

// ratioScale returns the factor kappa(T) = (D(T)/D(TRef))/(L(T)/L(TRef))
// by which D/L changes from the reference temperature to T (derived).
func (t Thermal) ratioScale(T float64) float64 {
	r, a := t.sizes(T)
	return r / a
}

// DesignSpec is a design problem for Optimize. Zero values of optional
// fields mean "no constraint" or the stated default.
type DesignSpec struct {
	Mode      Mode           // wanted mode
	Frequency float64        // wanted frequency at the reference temperature, Hz
	Fill      physics.Medium // homogeneous fill

	// RatioMin and RatioMax bound D/L; both zero means DefaultRatioMin..
	// DefaultRatioMax. They must lie in MinDesignRatio..MaxDesignRatio.
	RatioMin, RatioMax float64

	Objective Objective
	// MinClearance is the least acceptable clearance (fraction, 0.03 for
	// 3 %), held along the whole tuning and temperature path. Zero means
	// none for MaxClearance; MaxQ treats it as the constraint.
	MinClearance float64
	// MinQ is the least acceptable unloaded Q; zero means none. It needs Q.
	MinQ float64
	// Q returns the unloaded Q of the wanted mode of a cavity. It is needed
	// by MaxQ and MinQ and optional otherwise (it fills Design.Q0 and the
	// Q0 curve). Package cavity does not compute Q; callers pass a closure
	// (package qfactor provides one).
	Q func(Cavity) (float64, error)

	// MaxDiameter and MaxLength bound the size, m; zero means none.
	// MaxLength holds at the longest point of the tuning path.
	MaxDiameter, MaxLength float64

	// Tuning is the tuning range as a fraction: the wanted mode must be
	// tunable over f (1 +- Tuning) by moving one end plate (the diameter
	// fixed), keeping the clearance along the whole path. Zero means none.
	// It needs p >= 1.
	Tuning float64

	// Thermal gives the expansion coefficients and the temperature range;
	// the clearance must then hold over the range too.
	Thermal Thermal

	// CountDegenerate counts the exact companion as a spurious mode (see
	// ClearanceOptions).
	CountDegenerate bool
}

// Operation returns how a design of this spec is used, for Cavity.Reach:
// its mode, tuning, temperature range, required clearance and companion
// rule, with no machining tolerance (Analyze adds the tolerance of its
// settings).
func (spec DesignSpec) Operation() Operation {
	return Operation{
		Mode: spec.Mode, Tuning: spec.Tuning, Thermal: spec.Thermal,
		MinClearance: spec.MinClearance, CountDegenerate: spec.CountDegenerate,
	}
}

// Default and limiting ratio ranges of Optimize.
const (
	DefaultRatioMin = 0.5
	DefaultRatioMax = 3.0
	MinDesignRatio  = 0.01
	MaxDesignRatio  = 100.0
	MaxTuning       = 0.5
)

// Limit names the bound that holds a design's optimum, if any.
type Limit string

// The bounds that can hold an optimum.
const (
	NoLimit           Limit = ""
	LimitRatioMin     Limit = "ratio-min"
	LimitRatioMax     Limit = "ratio-max"
	LimitDiameter     Limit = "max-diameter"
	LimitLength       Limit = "max-length"
	LimitTuning       Limit = "tuning"
	LimitMinQ         Limit = "min-q"
	LimitMinClearance Limit = "min-clearance"
)

// Design is the result of Optimize.
type Design struct {
	Spec   DesignSpec // the problem, defaults filled in
	Cavity Cavity     // recommended dimensions
	Ratio  float64    // D/L

	// Clearance is the spectrum at the nominal dimensions: clearance,
	// nearest modes, companion.
	Clearance Clearance
	// Reach is the reachable set of the design over its tuning and
	// temperature range with its worst-case clearance and offending modes:
	// Cavity.Reach of spec.Operation(). Analysis.Reach adds the machining
	// tolerance.
	Reach Reach
	// WorstClearance is Reach.Worst (equal to Clearance.Value without
	// tuning or temperature range), and WorstMode the mode that sets it.
	WorstClearance float64
	WorstMode      Mode

	// AtRangeEdge is true when the optimum sits on an end of the allowed
	// D/L range (the given range narrowed by the size limits and the
	// tuning); Limit names the bound that holds it (also min-q and
	// min-clearance, which are not range ends).
	AtRangeEdge bool
	Limit       Limit
	// AllowedRatio is the allowed D/L range.
	AllowedRatio [2]float64
	// Plateau is the D/L range over which the optimal clearance is
	// attained; its ends are equal when the optimum is a single point.
	Plateau [2]float64

	Q0 float64 // NaN without a Q function

	// prob and env are the validated problem and the clearance envelope
	// along its path, kept for Analyze; nil in a Design not made by
	// Optimize, which Analyze then rebuilds from Spec.
	prob *problem
	env  *envelope
	s    float64 // (D/L)^2 exactly as optimised
}

// InfeasibleError reports a design problem with no solution and what was
// achievable instead. It matches ErrInfeasible under errors.Is.
type InfeasibleError struct {
	Need       string  // the requirement that cannot be met
	Achievable string  // what the allowed range offers instead
	Ratio      float64 // D/L of the best achievable point, or NaN
	Clearance  float64 // best achievable clearance, or NaN
	Q0         float64 // best achievable Q0, or NaN
}

// Error returns "cavity: no design meets <Need>; <Achievable>".
func (e *InfeasibleError) Error() string {
	return "cavity: no design meets " + e.Need + "; " + e.Achievable
}

// Is reports whether target is ErrInfeasible.
func (e *InfeasibleError) Is(target error) bool { return target == ErrInfeasible }

// problem is a validated DesignSpec with its derived quantities.
type problem struct {
	spec  DesignSpec
	w     chartMode
	kf    float64 // wavenumber in the fill at the design frequency, rad/m
	a0    float64 // gx_w / gp_w, or 0 when p = 0
	path  path
	full  interval // user ratio range, as s
	kmin  float64
	kmax  float64
	limLo Limit
	limHi Limit
}

// Optimize solves a design problem: it returns the D/L (and so D and L for
// the design frequency) that maximises the clearance of the wanted mode,
// or, for MaxQ, the unloaded Q subject to a minimum clearance, under the
// optional constraints of spec. It returns the optimum and the bound that
// holds it, nothing more: the sensitivities, tuning lengths, thermal
// drift, Monte Carlo spread and trade-off curves built on it are a second
// call, Analyze, so a caller who wants the optimum pays for nothing else.
// The shape follows gonum's optimize package: the problem (DesignSpec),
// the method (the exact envelope search below), the result (Design), and
// the analysis settings (AnalysisSettings) apart from the problem.
//
// Method (derived from the mode chart, Pozar, Microwave Engineering, 4th
// ed., sec. 6.4): with a homogeneous fill every frequency ratio f_i/f_w
// depends on s = (D/L)^2 alone and is monotone in it, so the clearance is a
// lower envelope of finitely many V-shaped curves whose maxima lie at range
// ends or at pairwise crossings, found as roots of polynomials of degree
// <= 4 (see maximise in optimize_exact.go). Tuning by one end plate at fixed
// D and thermal expansion with different radial and axial coefficients turn
// each nominal s into an interval of visited s' with affine ends (derived),
// handled exactly the same way. Only modes whose ratio comes within the
// attained clearance of 1 somewhere on the range can matter; they are
// listed rigorously by Modes at the range ends. The fill's temperature
// coefficient moves every frequency together and so does not change any
// ratio; it enters the drift and the sensitivities of Analyze.
//
// Accuracy: for MaxClearance, D/L and the clearance are exact to about
// 1e-15 relative (far inside the 1e-9 asked of it) beyond the accuracy of
// the Bessel zeros. For MaxQ the feasible set is exact and Q0 is maximised
// on it by golden-section search to 1e-10 relative in D/L, assuming Q0 has
// no feature narrower than a 1/64 of the range (wall Q is smooth in D/L).
// A MinQ constraint's boundary is found by bisection to 1e-13 relative
// under the same assumption.
//
// Errors: invalid input names the field and its range; a wanted mode with
// more than MaxChartModes modes near it is refused; a problem with no
// solution gives *InfeasibleError saying what was achievable.
func Optimize(spec DesignSpec) (Design, error) {
	if err := spec.Fill.RequireIsotropic("cavity: the D/L optimiser"); err != nil {
		return Design{}, err
	}
	p, err := newProblem(spec)
	if err != nil {
		return Design{}, err
	}
	spec = p.spec
	allowed, err := p.allowed()
	if err != nil {
		return Design{}, err
	}
	ivs := []interval{allowed}
	if spec.MinQ > 0 {
		ivs, err = p.qFeasible(ivs)
		if err != nil {
			return Design{}, err
		}
	}
	envW, _, err := p.envelope(p.path)
	if err != nil {
		return Design{}, err
	}
	var s float64
	var limit Limit
	plateau := [2]float64{}
	switch spec.Objective {
	case MaxClearance:
		opt := envW.maximise(ivs)
		if spec.MinClearance > 0 && opt.value < spec.MinClearance {
			return Design{}, p.clearanceShortfall(opt, spec.MinClearance)
		}
		s = opt.s
		// A plateau of the optimum: prefer the Q0 maximum on it, else its
		// geometric centre.
		level := opt.value * (1 - 1e-12)
		for _, iv := range envW.feasible(ivs, level) {
			if s >= iv.lo && s <= iv.hi && iv.hi > iv.lo*(1+1e-9) {
				if spec.Q != nil {
					s, _, err = p.maxQ(iv)
					if err != nil {
						return Design{}, err
					}
				} else {
					s = math.Sqrt(iv.lo * iv.hi)
				}
				plateau = [2]float64{math.Sqrt(iv.lo), math.Sqrt(iv.hi)}
			}
		}
		if plateau[0] == 0 {
			plateau = [2]float64{math.Sqrt(s), math.Sqrt(s)}
		}
	case MaxQ:
		feas := envW.feasible(ivs, spec.MinClearance)
		if len(feas) == 0 {
			opt := envW.maximise(ivs)
			return Design{}, p.clearanceShortfall(opt, spec.MinClearance)
		}
		bestQ := math.Inf(-1)
		for _, iv := range feas {
			si, qi, err := p.maxQ(iv)
			if err != nil {
				return Design{}, err
			}
			if qi > bestQ {
				bestQ, s = qi, si
			}
		}
		plateau = [2]float64{math.Sqrt(s), math.Sqrt(s)}
		for _, iv := range feas {
			if s == iv.lo || s == iv.hi {
				limit = LimitMinClearance
			}
		}
	}
	d := Design{Spec: spec, Ratio: math.Sqrt(s), Plateau: plateau, AllowedRatio: [2]float64{math.Sqrt(allowed.lo), math.Sqrt(allowed.hi)}}
	switch {
	case s <= allowed.lo:
		d.AtRangeEdge, d.Limit = true, p.limLo
	case s >= allowed.hi:
		d.AtRangeEdge, d.Limit = true, p.limHi
	default:
		d.Limit = limit
		if spec.MinQ > 0 {
			for _, iv := range ivs {
				if s == iv.lo || s == iv.hi {
					d.Limit = LimitMinQ
				}
			}
		}
	}
	d.Cavity = p.cavityAt(s)
	if err := d.Cavity.Validate(); err != nil {
		return Design{}, fmt.Errorf("cavity: the optimum D/L = %.6g gives dimensions out of range: %w", d.Ratio, err)
	}
	d.Clearance, err = d.Cavity.Clearance(spec.Mode, ClearanceOptions{CountDegenerate: spec.CountDegenerate})
	if err != nil {
		return Design{}, err
	}
	if d.Reach, err = d.Cavity.Reach(spec.Operation()); err != nil {
		return Design{}, err
	}
	d.WorstClearance, d.WorstMode = d.Reach.Worst, d.Reach.WorstMode
	d.Q0 = math.NaN()
	if spec.Q != nil {
		if d.Q0, err = spec.Q(d.Cavity); err != nil {
			return Design{}, err
		}
	}
	d.prob, d.env, d.s = p, envW, s
	return d, nil
}

func newProblem(spec DesignSpec) (*problem, error) {
	if err := spec.Mode.Validate(); err != nil {
		return nil, err
	}
	if !(spec.Frequency > 0) || math.IsInf(spec.Frequency, 0) {
		return nil, fmt.Errorf("cavity: design frequency must be finite and > 0 Hz, got %g Hz", spec.Frequency)
	}
	if err := checkFill(spec.Fill); err != nil {
		return nil, err
	}
	if spec.RatioMin == 0 && spec.RatioMax == 0 {
		spec.RatioMin, spec.RatioMax = DefaultRatioMin, DefaultRatioMax
	}
	if !(spec.RatioMin >= MinDesignRatio && spec.RatioMax <= MaxDesignRatio && spec.RatioMin <= spec.RatioMax) {
		return nil, fmt.Errorf("cavity: D/L range must satisfy %g <= min <= max <= %g, got %g..%g", MinDesignRatio, MaxDesignRatio, spec.RatioMin, spec.RatioMax)
	}
	switch spec.Objective {
	case MaxClearance, MaxQ:
	default:
		return nil, fmt.Errorf("cavity: unknown objective %d; use MaxClearance or MaxQ", spec.Objective)
	}
	if !(spec.MinClearance >= 0 && spec.MinClearance <= 1) {
		return nil, fmt.Errorf("cavity: minimum clearance must be in 0..1 (a fraction; 0.03 is 3 %%), got %g", spec.MinClearance)
	}
	if !(spec.MinQ >= 0) || math.IsInf(spec.MinQ, 0) {
		return nil, fmt.Errorf("cavity: minimum Q must be finite and >= 0, got %g", spec.MinQ)
	}
	if (spec.Objective == MaxQ || spec.MinQ > 0) && spec.Q == nil {
		return nil, errors.New("cavity: maximising Q0 or a minimum Q0 needs a Q function (give the wall material)")
	}
	for _, q := range []struct {
		name string
		v    float64
	}{{"maximum diameter", spec.MaxDiameter}, {"maximum length", spec.MaxLength}} {
		if q.v != 0 && !(q.v >= MinSize && q.v <= MaxSize) {
			return nil, fmt.Errorf("cavity: %s must be in %g..%g m (or 0 for none), got %g m", q.name, MinSize, MaxSize, q.v)
		}
	}
	if !(spec.Tuning >= 0 && spec.Tuning <= MaxTuning) {
		return nil, fmt.Errorf("cavity: tuning range must be in 0..%g (a fraction; 0.02 is +-2 %%), got %g", MaxTuning, spec.Tuning)
	}
	if spec.Tuning > 0 {
		if err := spec.Mode.EndPlateTuning(); err != nil {
			return nil, err
		}
	}
	if err := spec.Thermal.Validate(); err != nil {
		return nil, err
	}
	if err := checkFillDrift(spec.Fill, spec.Thermal); err != nil {
		return nil, err
	}
	p := &problem{spec: spec, w: newChartMode(spec.Mode)}
	p.kf = 2 * math.Pi * spec.Frequency * spec.Fill.Index() / physics.SpeedOfLight
	if p.w.gp > 0 {
		p.a0 = p.w.gx / p.w.gp
	}
	p.kmin, p.kmax = 1, 1
	if th := spec.Thermal; th.hasRange() {
		k1, k2 := th.ratioScale(th.TMin), th.ratioScale(th.TMax)
		p.kmin, p.kmax = math.Min(1, math.Min(k1, k2)), math.Max(1, math.Max(k1, k2))
	}
	p.path = newPath(p.a0, spec.Tuning, p.kmin, p.kmax)
	p.full = interval{spec.RatioMin * spec.RatioMin, spec.RatioMax * spec.RatioMax}
	return p, nil
}

// newPath returns the path of visited ratios (derived). At temperature T
// the nominal s becomes kappa(T)^2 s; tuning the wanted mode to f (1 + t)
// at fixed D then moves s' to (1+t)^2 (s' + a0) - a0 with a0 = gx_w/gp_w,
// because (k D)^2 = gx_w + gp_w s' must grow by (1+t)^2. Both maps are
// increasing, so the union over T and t is [lo(s), hi(s)] with
//
//	lo(s) = (1-X)^2 kmin^2 s + ((1-X)^2 - 1) a0,
//	hi(s) = (1+X)^2 kmax^2 s + ((1+X)^2 - 1) a0.
func newPath(a0, x, kmin, kmax float64) path {
	lamLo, lamHi := (1-x)*(1-x), (1+x)*(1+x)
	p := path{
		lo: affine{lamLo * kmin * kmin, (lamLo - 1) * a0},
		hi: affine{lamHi * kmax * kmax, (lamHi - 1) * a0},
	}
	if x == 0 {
		p.lo.b, p.hi.b = 0, 0
	}
	if kmin == 1 && kmax == 1 {
		p.common, p.lamLo, p.lamHi = true, lamLo, lamHi
	}
	return p
}

// cavityAt returns the cavity with the wanted mode at the design frequency
// and D/L = sqrt(s): D = sqrt(gx_w + gp_w s) / k (derived from the chart
// relation), L = D / sqrt(s).
func (p *problem) cavityAt(s float64) Cavity {
	D := math.Sqrt(p.w.g(s)) / p.kf
	return Cavity{Radius: D / 2, Length: D / math.Sqrt(s), Fill: p.spec.Fill}
}

// allowed returns the user's s range narrowed by the size limits and by
// the tuning path's need for a finite length (all half-lines in s, derived
// from D(s) and L(s) of cavityAt).
func (p *problem) allowed() (interval, error) {
	iv := p.full
	p.limLo, p.limHi = LimitRatioMin, LimitRatioMax
	raise := func(s float64, l Limit) {
		if s > iv.lo {
			iv.lo, p.limLo = s, l
		}
	}
	lower := func(s float64, l Limit) {
		if s < iv.hi {
			iv.hi, p.limHi = s, l
		}
	}
	spec, w := p.spec, p.w
	rangeText := fmt.Sprintf("D/L in %.4g..%.4g", spec.RatioMin, spec.RatioMax)
	lamLo := (1 - spec.Tuning) * (1 - spec.Tuning)
	if spec.Tuning > 0 {
		// The lowest tuned frequency needs s' = lamLo (s + a0) - a0 >=
		// minPathS (a tuned length of at most 1/MinDesignRatio diameters).
		raise(((minPathS+p.a0)/lamLo-p.a0)*(1+1e-12), LimitTuning)
	}
	if spec.MaxDiameter > 0 {
		K := p.kf * p.kf * spec.MaxDiameter * spec.MaxDiameter
		switch {
		case K <= w.gx:
			return interval{}, &InfeasibleError{
				Need:       "diameter <= " + shortLength(spec.MaxDiameter),
				Achievable: fmt.Sprintf("%s at %s needs a diameter above %s (its cutoff diameter) at any D/L", spec.Mode, shortFrequency(spec.Frequency), shortLength(math.Sqrt(w.gx)/p.kf)),
				Ratio:      math.NaN(), Clearance: math.NaN(), Q0: math.NaN(),
			}
		case w.gp > 0:
			lower((K-w.gx)/w.gp, LimitDiameter)
		}
	}
	if spec.MaxLength > 0 {
		// g_w(s) <= K lamLo (s + a0) - K a0 at the longest tuned length.
		K := p.kf * p.kf * spec.MaxLength * spec.MaxLength
		a := w.gp - K*lamLo
		b := K*(lamLo-1)*p.a0 - w.gx
		switch {
		case a < 0:
			raise(b/a, LimitLength)
		case a > 0:
			lower(b/a, LimitLength)
		case b < 0:
			iv.hi = -1
		}
		if iv.hi < iv.lo || a >= 0 && b < 0 {
			return interval{}, &InfeasibleError{
				Need:       "length <= " + shortLength(spec.MaxLength),
				Achievable: fmt.Sprintf("%s at %s needs more length than that over %s%s", spec.Mode, shortFrequency(spec.Frequency), rangeText, tuningText(spec.Tuning)),
				Ratio:      math.NaN(), Clearance: math.NaN(), Q0: math.NaN(),
			}
		}
	}
	if iv.hi < iv.lo {
		return interval{}, &InfeasibleError{
			Need:       "the size and tuning limits together",
			Achievable: fmt.Sprintf("they leave no D/L in %.4g..%.4g: the lower limit (%s) needs D/L >= %.6g, the upper (%s) D/L <= %.6g", spec.RatioMin, spec.RatioMax, p.limLo, math.Sqrt(math.Max(iv.lo, 0)), p.limHi, math.Sqrt(math.Max(iv.hi, 0))),
			Ratio:      math.NaN(), Clearance: math.NaN(), Q0: math.NaN(),
		}
	}
	return iv, nil
}

func tuningText(x float64) string {
	if x == 0 {
		return ""
	}
	return fmt.Sprintf(" with +-%.4g %% tuning", 100*x)
}

// minPathS is the smallest s = (D/L)^2 a tuning or thermal path may visit:
// D/L >= MinDesignRatio, a tuned length of at most 1/MinDesignRatio
// diameters, where chartModes can still list the mode chart (nearer s = 0,
// an endless cylinder, the axial index outgrows MaxIndex). There the modes
// crowd towards the wanted one and the clearance tends to zero, so the
// limit never hides an optimum.
const minPathS = MinDesignRatio * MinDesignRatio

// envelope builds the clearance envelope along path pa over the user's
// whole ratio range (see boundedEnvelope).
func (p *problem) envelope(pa path) (*envelope, optimum, error) {
	full := p.full
	if pa.lo.at(full.lo) < minPathS {
		// The tuning path's finite-length limit cuts the range.
		full.lo = math.Max(full.lo, pa.lo.inv(minPathS)*(1+1e-12))
		if full.lo > full.hi {
			full.lo = full.hi
		}
	}
	return boundedEnvelope(p.w, pa, full, p.spec.CountDegenerate)
}

// boundedEnvelope returns the clearance envelope of the wanted mode w along
// path pa over the nominal range full, with a mode list that is complete
// for it, and the envelope's maximum there. Starting from a small bound b,
// the modes within 1+b of w at the ends of the visited range are listed
// and the envelope maximised; an excluded mode has |rho - 1| > b
// everywhere (rho is monotone), so when the maximum is <= b no excluded
// mode can touch the envelope. Otherwise b grows to the maximum found and
// the list is rebuilt (the second round always succeeds unless the first
// list was empty).
func boundedEnvelope(w chartMode, pa path, full interval, countDegenerate bool) (*envelope, optimum, error) {
	ext := interval{pa.lo.at(full.lo), pa.hi.at(full.hi)}
	b := 0.05
	for range 12 {
		modes, err := chartModes(w.mode, ext.lo, ext.hi, b, countDegenerate)
		if err != nil {
			return nil, optimum{}, err
		}
		env := newEnvelope(w, modes, pa)
		opt := env.maximise([]interval{full})
		if opt.value <= b {
			return env, opt, nil
		}
		if math.IsInf(opt.value, 1) {
			b *= 4
		} else {
			b = opt.value * (1 + 1e-9)
		}
	}
	return nil, optimum{}, fmt.Errorf("cavity: could not bound the clearance of %s over D/L %.4g..%.4g", w.mode, math.Sqrt(full.lo), math.Sqrt(full.hi))
}

// clearanceShortfall explains that no allowed D/L reaches the clearance
// need, giving the best achievable.
func (p *problem) clearanceShortfall(opt optimum, need float64) error {
	e := &InfeasibleError{
		Need:      fmt.Sprintf("a clearance of %.4g %%%s%s", 100*need, tuningText(p.spec.Tuning), p.tempText()),
		Ratio:     math.Sqrt(opt.s),
		Clearance: opt.value,
		Q0:        math.NaN(),
	}
	e.Achievable = fmt.Sprintf("the best clearance of %s in the allowed D/L range is %.4g %% at D/L = %.6g", p.spec.Mode, 100*opt.value, e.Ratio)
	if math.IsInf(opt.s, 0) || opt.s == 0 {
		e.Achievable = "no allowed D/L remains"
	}
	return e
}

func (p *problem) tempText() string {
	if th := p.spec.Thermal; th.hasRange() {
		return fmt.Sprintf(" over %.5g K..%.5g K", th.TMin, th.TMax)
	}
	return ""
}

// qAt returns Q0 of the design at s.
func (p *problem) qAt(s float64) (float64, error) {
	q, err := p.spec.Q(p.cavityAt(s))
	if err != nil {
		return 0, fmt.Errorf("cavity: Q0 at D/L = %.6g: %w", math.Sqrt(s), err)
	}
	if math.IsNaN(q) {
		return 0, fmt.Errorf("cavity: Q function returned NaN at D/L = %.6g", math.Sqrt(s))
	}
	return q, nil
}

// qSamples is the number of Q0 samples per interval used to bracket the Q0
// maximum and the MinQ boundary.
const qSamples = 64

// maxQ returns the s in iv that maximises Q0, and Q0 there: the best of
// qSamples geometric samples, refined by golden-section search between its
// neighbours to 1e-10 relative (Press et al., Numerical Recipes, 3rd ed.,
// sec. 10.2).
func (p *problem) maxQ(iv interval) (float64, float64, error) {
	if iv.hi <= iv.lo {
		q, err := p.qAt(iv.lo)
		return iv.lo, q, err
	}
	n := qSamples
	xs := make([]float64, n+1)
	qs := make([]float64, n+1)
	best := 0
	for i := range xs {
		xs[i] = iv.lo * math.Pow(iv.hi/iv.lo, float64(i)/float64(n))
		if i == n {
			xs[i] = iv.hi
		}
		q, err := p.qAt(xs[i])
		if err != nil {
			return 0, 0, err
		}
		qs[i] = q
		if q > qs[best] {
			best = i
		}
	}
	a, b := xs[max(best-1, 0)], xs[min(best+1, n)]
	const g = 0.3819660112501051 // (3 - sqrt 5)/2
	x1, x2 := a+g*(b-a), b-g*(b-a)
	f1, err := p.qAt(x1)
	if err != nil {
		return 0, 0, err
	}
	f2, err := p.qAt(x2)
	if err != nil {
		return 0, 0, err
	}
	for b-a > 1e-10*a {
		if f1 >= f2 {
			b, x2, f2 = x2, x1, f1
			x1 = a + g*(b-a)
			if f1, err = p.qAt(x1); err != nil {
				return 0, 0, err
			}
		} else {
			a, x1, f1 = x1, x2, f2
			x2 = b - g*(b-a)
			if f2, err = p.qAt(x2); err != nil {
				return 0, 0, err
			}
		}
	}
	s, q := xs[best], qs[best]
	if f1 > q {
		s, q = x1, f1
	}
	if f2 > q {
		s, q = x2, f2
	}
	return s, q, nil
}

// qFeasible returns the parts of ivs where Q0 >= MinQ, with boundaries
// bisected to 1e-13 relative between qSamples geometric samples.
func (p *problem) qFeasible(ivs []interval) ([]interval, error) {
	var out []interval
	bestQ, bestS := math.Inf(-1), math.NaN()
	need := p.spec.MinQ
	for _, iv := range ivs {
		n := qSamples
		if iv.hi <= iv.lo {
			n = 0
		}
		var start float64
		in := false
		var prevS, prevQ float64
		for i := 0; i <= n; i++ {
			s := iv.lo
			if n > 0 {
				s = iv.lo * math.Pow(iv.hi/iv.lo, float64(i)/float64(n))
			}
			if i == n {
				s = iv.hi
			}
			q, err := p.qAt(s)
			if err != nil {
				return nil, err
			}
			if q > bestQ {
				bestQ, bestS = q, s
			}
			ok := q >= need
			if i > 0 && ok != in {
				x, err := p.bisectQ(prevS, s, prevQ >= need)
				if err != nil {
					return nil, err
				}
				if ok {
					start = x
				} else {
					out = append(out, interval{start, x})
				}
			} else if i == 0 && ok {
				start = s
			}
			in = ok
			prevS, prevQ = s, q
		}
		if in {
			out = append(out, interval{start, iv.hi})
		}
	}
	if len(out) == 0 {
		return nil, &InfeasibleError{
			Need:       fmt.Sprintf("Q0 >= %.6g", need),
			Achievable: fmt.Sprintf("the highest Q0 in the allowed D/L range is %.6g at D/L = %.6g", bestQ, math.Sqrt(bestS)),
			Ratio:      math.Sqrt(bestS), Clearance: math.NaN(), Q0: bestQ,
		}
	}
	return out, nil
}

// bisectQ finds the s in [a, b] where Q0 crosses MinQ; okA tells whether
// Q0(a) >= MinQ. The feasible side is returned.
func (p *problem) bisectQ(a, b float64, okA bool) (float64, error) {
	for b-a > 1e-13*a {
		m := 0.5 * (a + b)
		q, err := p.qAt(m)
		if err != nil {
			return 0, err
		}
		if (q >= p.spec.MinQ) == okA {
			a = m
		} else {
			b = m
		}
	}
	if okA {
		return a, nil
	}
	return b, nil
}
