// Package design is the single-cavity design flow: a scenario (the design
// problem with its wall metal, fill and analysis settings) is optimised by
// cavity.Optimize, analysed by cavity.Analyze, its unloaded Q broken down by
// package qfactor, and the result given the cautions a designer should read.
// `cylcav design` prints a Result and `cylcav report` makes a datasheet of
// one; both run the same Scenario.Run. Demo is the built-in invented
// scenario.
package design

import (
	"fmt"
	"math"
	"strings"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/qfactor"
)

// Scenario is a complete single-cavity design request. Demo gives the
// built-in one; commands build theirs from flags.
type Scenario struct {
	// Title names the scenario; it is set for the built-in demo only.
	Title string
	// Spec is the library problem. Run fills in Spec.Q from Wall and Fill
	// when Wall is set, and Spec.Fill from Fill: a Spec.Fill given here is
	// ignored.
	Spec cavity.DesignSpec
	// Wall is the wall metal; nil means no Q0.
	Wall *physics.Conductor
	// Fill is the fill of the cavity (zero value: vacuum), the one place a
	// scenario holds it: its Medium is the cavity's fill in Run, in the
	// Result's Design and in the Result's Scenario.Spec.Fill; its
	// description and source are for a datasheet.
	Fill physics.Dielectric
	// TempGiven records whether a temperature range was asked for.
	TempGiven bool
	// Settings are the settings of the analysis of the optimum (the
	// machining tolerance, the curve points).
	Settings cavity.AnalysisSettings
	// TOperate is the operating set-point in kelvin: the design frequency
	// holds there, the printed operating dimensions hold there, and the
	// walls are at it for Q0. Zero means the middle of the temperature
	// range, or 20 C without one.
	TOperate float64
	// TMachine is the machining temperature in kelvin (zero means 20 C):
	// the machining dimensions are the operating ones carried to it.
	TMachine float64
	// Side and Axial are the metals whose thermal strain sets the diameter
	// and the length (physics.Conductor.Strain); a metal with no expansion
	// data at all is taken not to expand, and the output says so.
	Side, Axial physics.Conductor
	// Superconductor, when not nil, makes the walls superconducting
	// niobium at the operating temperature (qfactor.Surface); Wall must
	// then be niobium.
	Superconductor *qfactor.BCS
	// Accel, when not nil, asks for the accelerator figures (accel.go).
	Accel *Accelerator
	// Bulb, when not nil, asks for the filling factors of a central
	// storage bulb (a TE0mp mode; cavity.Cavity.FillingFactors).
	Bulb *cavity.Bulb
}

// TemperatureError is a temperature that the thermal data of a metal or
// a fill do not cover: Flag names the flag behind it (temp,
// operating-temp or machining-temp), With the flag of the data.
type TemperatureError struct {
	Flag string
	T    float64 // kelvin
	With string
	Err  error
}

func (e *TemperatureError) Error() string {
	return fmt.Sprintf("--%s %s with %s: %v", e.Flag, physics.FormatTemperature(e.T, 4), e.With, e.Err)
}

func (e *TemperatureError) Unwrap() error { return e.Err }

// roomTemperature is 20 C in kelvin, the default machining temperature.
const roomTemperature = physics.ZeroCelsius + 20

// expands reports whether a metal has any expansion data.
func expands(c physics.Conductor) bool {
	_, _, ok := c.StrainRange()
	return ok
}

// Temps returns the operating and machining temperatures with their
// defaults applied.
func (s Scenario) Temps() (operate, machine float64) {
	operate, machine = s.TOperate, s.TMachine
	if operate == 0 {
		operate = roomTemperature
		if th := s.Spec.Thermal; th.TMin != 0 || th.TMax != 0 {
			operate = 0.5 * (th.TMin + th.TMax)
		}
	}
	if machine == 0 {
		machine = roomTemperature
	}
	return operate, machine
}

// thermalFlag names the flags behind one temperature, for errors.
type thermalFlag struct {
	flag string  // "temp", "operating-temp" or "machining-temp"
	T    float64 // kelvin
}

// SetThermal fills s.Spec.Thermal from the metals, the range in
// s.Spec.Thermal.TMin..TMax and the set-point: the size laws are the
// metals' integrated strain (physics.Conductor.SizeRatio), the
// coefficients the local ones at the set-point. sideFlag and axialFlag
// name the flags behind s.Side and s.Axial for errors. It returns a
// *TemperatureError when a temperature lies outside the data of a metal
// (or the fill's coefficient) that must describe it.
func (s *Scenario) SetThermal(sideFlag, axialFlag string) error {
	th := &s.Spec.Thermal
	operate, machine := s.Temps()
	var used []thermalFlag
	if th.TMin != 0 || th.TMax != 0 {
		used = append(used, thermalFlag{"temp", th.TMin}, thermalFlag{"temp", th.TMax})
		th.TRef = operate
	}
	used = append(used, thermalFlag{"operating-temp", operate}, thermalFlag{"machining-temp", machine})
	for _, b := range []struct {
		metal physics.Conductor
		flag  string
	}{{s.Side, sideFlag}, {s.Axial, axialFlag}} {
		if !expands(b.metal) {
			continue
		}
		for _, u := range used {
			if _, err := b.metal.Strain(u.T); err != nil {
				return &TemperatureError{Flag: u.flag, T: u.T, With: "--" + b.flag, Err: err}
			}
		}
	}
	if s.Fill.TCEpsKnown && s.Fill.TCEps != 0 {
		for _, u := range used {
			if !physics.TemperatureIn(u.T, physics.DefaultLinearTMin, physics.DefaultLinearTMax) {
				return &TemperatureError{Flag: u.flag, T: u.T, With: "--fill " + s.Fill.Name, Err: fmt.Errorf("the fill's temperature coefficient is a room-temperature value, valid from %s to %s",
					physics.FormatTemperature(physics.DefaultLinearTMin, 4), physics.FormatTemperature(physics.DefaultLinearTMax, 4))}
			}
		}
	}
	var err error
	if th.AlphaRadial, err = s.Side.ExpansionAt(operate); err != nil {
		return err
	}
	if th.AlphaAxial, err = s.Axial.ExpansionAt(operate); err != nil {
		return err
	}
	th.SizeRadial, th.SizeAxial = sizeLaw(s.Side, operate), sizeLaw(s.Axial, operate)
	return nil
}

// sizeLaw returns T -> L(T)/L(ref) of a metal, or nil (no expansion) for a
// metal without data. The temperatures were checked by setThermal; NaN
// marks any other, which cavity.Thermal.Validate refuses.
func sizeLaw(c physics.Conductor, ref float64) func(float64) float64 {
	if !expands(c) {
		return func(float64) float64 { return 1 }
	}
	return func(T float64) float64 {
		r, err := c.SizeRatio(T, ref)
		if err != nil {
			return math.NaN()
		}
		return r
	}
}

// Machined returns cavity c (at the operating temperature) carried to the
// machining temperature.
func (s Scenario) Machined(c cavity.Cavity) cavity.Cavity {
	operate, machine := s.Temps()
	c.Radius *= sizeLaw(s.Side, operate)(machine)
	c.Length *= sizeLaw(s.Axial, operate)(machine)
	return c
}

// Result is the optimum with its analysis, Q breakdown and cautions.
type Result struct {
	Scenario Scenario
	Design   cavity.Design
	Analysis cavity.Analysis
	// Machined is the design's cavity at the machining temperature
	// (Design.Cavity holds at the operating temperature).
	Machined cavity.Cavity
	// Unloaded is the Q breakdown at the design; nil without a wall.
	Unloaded *qfactor.Unloaded
	// Split is Q0 split into its BCS, residual and normal-metal parts; nil
	// unless the walls are superconducting.
	Split *qfactor.SuperconductingQ
	// Accel holds the accelerator figures; nil unless Scenario.Accel.
	Accel *AccelResult
	// Filling holds the filling factors of Scenario.Bulb; nil without.
	Filling *cavity.Filling
	// Bench holds the warm bench figures of a cold vacuum cavity; nil
	// unless the cavity operates cryogenically or Scenario.Accel is set.
	Bench *Bench
	// Cautions are plain sentences for people about this design; the
	// outputs of `cylcav design` add the general RF caution after them.
	Cautions []string
}

// Demo returns the built-in demo scenario: a temperature-stable TE011
// reference cavity for the invented 10.5 GHz "Kestrel Point to Marrow Hill"
// microwave link. An aluminium body with invar end spacers, air filled,
// tunable by +-0.5 %, qualified over -20 C..+60 C, machined to +-0.01 mm.
func Demo() (Scenario, error) {
	wall, err := physics.LookupConductor("aluminium")
	if err != nil {
		return Scenario{}, err
	}
	invar, err := physics.LookupConductor("invar")
	if err != nil {
		return Scenario{}, err
	}
	air, err := physics.LookupDielectric("air")
	if err != nil {
		return Scenario{}, err
	}
	m, err := cavity.ParseMode("TE011")
	if err != nil {
		return Scenario{}, err
	}
	tmin, _ := physics.ParseTemperature("-20C")
	tmax, _ := physics.ParseTemperature("60C")
	s := Scenario{
		Title: "TE011 reference cavity for the fictional Kestrel Point to Marrow Hill 10.5 GHz link (aluminium body, invar end spacers)",
		Spec: cavity.DesignSpec{
			Mode:      m,
			Frequency: 10.5e9,
			RatioMin:  0.8, RatioMax: 2.5,
			Tuning:  0.005,
			Thermal: cavity.Thermal{TMin: tmin, TMax: tmax},
		},
		Settings: cavity.AnalysisSettings{
			Tolerance: cavity.Tolerance{Diameter: 10e-6, Length: 10e-6, Samples: 200000, Seed: 1},
		},
		Wall:      &wall,
		Fill:      air,
		TempGiven: true,
		Side:      wall,
		Axial:     invar,
	}
	if err := s.SetThermal("wall", "wall"); err != nil {
		return Scenario{}, err
	}
	return s, nil
}

// QFunc returns the unloaded-Q function of mode m for smooth walls of
// metal wall at temperature t (kelvin; 0 means 20 C) and the loss tangents
// of the cavity's fill, built on package qfactor.
func QFunc(m cavity.Mode, wall physics.Conductor, t float64) func(cavity.Cavity) (float64, error) {
	return qfactor.Q0Constraint(m, walls(wall, t))
}

// walls returns the wall set of metal wall on every part, at temperature t
// (kelvin; 0 means 20 C) and smooth.
func walls(wall physics.Conductor, t float64) qfactor.WallSet {
	return qfactor.SameWalls(qfactor.Surface{Conductor: wall, Temperature: t})
}

// WallQ reports whether Q0 can be computed with the walls at the operating
// temperature, and if not, why (the resistivity model does not hold there;
// for superconducting walls, qfactor.WallSet.Validate's reason).
func (s Scenario) WallQ() (ok bool, why error) {
	w, ok := s.Walls()
	if !ok {
		return false, nil
	}
	if s.Superconductor != nil {
		if err := w.Validate(); err != nil {
			return false, err
		}
		return true, nil
	}
	operate, _ := s.Temps()
	if _, err := qfactor.Conductivity(*s.Wall, operate); err != nil {
		return false, err
	}
	return true, nil
}

// Run solves the scenario: the optimum (cavity.Optimize), its analysis
// with s.Settings (cavity.Analyze), the Q breakdown at the design when a
// wall is given, and the cautions. The cavity's fill is s.Fill; the
// Result's Scenario has it in Spec.Fill too. progress, when not nil,
// receives the Monte Carlo progress. Errors of the optimisation are
// returned as they are (an impossible request is a
// *cavity.InfeasibleError).
func (s Scenario) Run(progress func(done, total int)) (Result, error) {
	s.Spec.Fill = s.Fill.Medium
	spec := s.Spec
	operate, _ := s.Temps()
	wallQ, _ := s.WallQ()
	if wallQ {
		spec.Q = s.ModeQ(spec.Mode)
	}
	if s.Accel != nil {
		if err := s.validateAccel(); err != nil {
			return Result{}, err
		}
	}
	d, err := cavity.Optimize(spec)
	if err != nil {
		return Result{}, err
	}
	set := s.Settings
	set.Tolerance.Progress = progress
	a, err := cavity.Analyze(d, set)
	if err != nil {
		return Result{}, err
	}
	r := Result{Scenario: s, Design: d, Analysis: a, Machined: s.Machined(d.Cavity)}
	if wallQ {
		w, _ := s.Walls()
		u, err := qfactor.UnloadedQ(d.Cavity, spec.Mode, w.At(nil))
		if err != nil {
			return Result{}, err
		}
		r.Unloaded = &u
		if s.Superconductor != nil {
			sp, err := qfactor.SplitSuperconducting(u, w)
			if err != nil {
				return Result{}, err
			}
			r.Split = &sp
		}
	}
	if s.Accel != nil {
		if r.Accel, err = s.accel(r); err != nil {
			return Result{}, err
		}
	}
	if s.Bulb != nil {
		b := *s.Bulb
		if b.Radius > d.Cavity.Radius || b.Length > d.Cavity.Length {
			return Result{}, &BulbError{Bulb: b, Cavity: d.Cavity}
		}
		f, err := d.Cavity.FillingFactors(spec.Mode, b)
		if err != nil {
			return Result{}, err
		}
		r.Filling = &f
	}
	if s.Accel != nil || operate < cryogenicBelow {
		if r.Bench, err = bench(r); err != nil {
			return Result{}, err
		}
	}
	r.Cautions = Cautions(r)
	return r, nil
}

// wallQCaution says why Q0 was not computed with the walls at operate.
func wallQCaution(wall physics.Conductor, operate float64, why error) string {
	lo, hi := wall.TMin, wall.TMax
	if lo == 0 && hi == 0 {
		lo, hi = physics.DefaultLinearTMin, physics.DefaultLinearTMax
	}
	if physics.TemperatureIn(operate, lo, hi) {
		return "Q0 not computed: " + strings.TrimPrefix(why.Error(), "qfactor: ") + "."
	}
	return fmt.Sprintf("Q0 not computed: the walls operate at %s, outside %s..%s where the resistivity model of %s holds (for superconducting niobium give --superconducting; other cold normal metals are not modelled yet).",
		physics.FormatTemperature(operate, 4), physics.FormatTemperature(lo, 4), physics.FormatTemperature(hi, 4), wall.Name)
}

// cryogenicBelow is the temperature below which operation counts as
// cryogenic for the caution: -150 C (123 K), the usual boundary of
// cryogenics (common practice; NIST's definition).
const cryogenicBelow = physics.ZeroCelsius - 150

// CautionCryogenic is the caution printed wherever cold operation is.
const CautionCryogenic = "Cryogenic operation: liquid nitrogen and helium and cold surfaces cause severe cold burns, evaporating cryogens displace oxygen (asphyxiation) and over-pressurise closed volumes, and cooled air condenses oxygen-rich liquid; follow local codes and licensed practice, with relief devices and oxygen monitoring."

// RatioFixed reports whether the design's allowed D/L range has zero width
// (RatioMin == RatioMax, as for an accelerator cell whose length is set by
// the particle speed): the result is then that ratio, not an optimum, and
// sitting on the range's edge says nothing.
func (r Result) RatioFixed() bool {
	s := r.Design.Spec
	return s.RatioMin != 0 && s.RatioMin == s.RatioMax
}

// Cautions returns the warnings a designer should read about a result.
func Cautions(r Result) []string {
	var out []string
	d := r.Design
	spec := d.Spec
	for _, m := range d.Clearance.Degenerate {
		if spec.CountDegenerate {
			continue
		}
		out = append(out, fmt.Sprintf("%s resonates at exactly the frequency of %s in every cylinder; no D/L separates them. Suppress it: a mode trap, a non-contacting plunger with a gap (TE0mp has no wall current across it), or couplings on its field nulls.", m, spec.Mode))
	}
	if r.RatioFixed() {
		out = append(out, fmt.Sprintf("D/L is fixed at %.4g (the allowed range has zero width): the clearance and Q0 are those of this ratio, not an optimum.", d.Ratio))
	} else if d.AtRangeEdge {
		out = append(out, fmt.Sprintf("The optimum sits on the edge of the allowed D/L range (%s, D/L = %.4g); relaxing that limit may give more clearance.", d.Limit, d.Ratio))
	} else if d.Limit == cavity.LimitMinQ || d.Limit == cavity.LimitMinClearance {
		out = append(out, fmt.Sprintf("The optimum is held by the %s constraint.", d.Limit))
	}
	if d.Plateau[1] > d.Plateau[0]*(1+1e-9) {
		out = append(out, fmt.Sprintf("The best clearance holds over a whole band, D/L = %.4g..%.4g; the design takes %s on it.",
			d.Plateau[0], d.Plateau[1], plateauChoice(spec)))
	}
	reach := r.Analysis.Reach
	if span := reach.Operation.Span(); span != "" && reach.Worst < d.Clearance.Value*(1-1e-9) {
		out = append(out, fmt.Sprintf("Over the %s the clearance falls to %.3f %% (%s), from %.3f %% at the nominal size.", span, 100*reach.Worst, reach.WorstNames(), 100*d.Clearance.Value))
	}
	if !reach.Meets() {
		out = append(out, fmt.Sprintf("The clearance requirement is not met everywhere the cavity operates: %s.", reach.Verdict()))
	}
	sc := r.Scenario
	if !expands(sc.Side) && !expands(sc.Axial) {
		out = append(out, "No wall metal or expansion coefficient given (--wall, --alpha-side, --alpha-axial): df/dT and any drift assume walls that do not expand, so they show the fill's part only (zero for vacuum).")
	} else if !expands(sc.Side) || !expands(sc.Axial) {
		out = append(out, "One of the side wall and the length has no expansion data and is taken not to expand.")
	}
	operate, machine := sc.Temps()
	th := spec.Thermal
	if cold := math.Min(operate, machine); cold < cryogenicBelow || (sc.TempGiven && th.TMin < cryogenicBelow) {
		out = append(out, CautionCryogenic)
	}
	if sc.Wall != nil {
		if ok, why := sc.WallQ(); !ok {
			out = append(out, wallQCaution(*sc.Wall, operate, why))
		}
	}
	if r.Scenario.TempGiven {
		drift := math.Max(math.Abs(r.Analysis.Drift[0]), math.Abs(r.Analysis.Drift[1]))
		if spec.Tuning > 0 && drift > spec.Tuning*spec.Frequency {
			out = append(out, fmt.Sprintf("The thermal drift (up to %s) exceeds the tuning range (+-%s).", physics.FormatFrequency(drift, 4), physics.FormatFrequency(spec.Tuning*spec.Frequency, 4)))
		}
		if !spec.Fill.TCEpsKnown && spec.Fill.Eps() > 1 {
			out = append(out, fmt.Sprintf("The temperature coefficient of the fill %q is not known; its drift is left out.", spec.Fill.Label()))
		}
	}
	if sp := r.Analysis.Spread; sp != nil {
		if sp.WorstClearance < 0.5*sp.NominalClearance {
			out = append(out, fmt.Sprintf("Machining errors can bring %s within %.3f %% of the wanted mode (worst sample).", sp.WorstMode, 100*sp.WorstClearance))
		}
		if half := 0.5 * (sp.P99 - sp.P01); spec.Tuning > 0 && half > spec.Tuning*spec.Frequency {
			out = append(out, "The machining spread of the frequency is wider than the tuning range.")
		}
	}
	if u := r.Unloaded; u != nil {
		ws, _ := r.Scenario.Walls()
		for _, w := range qfactor.Validity(d.Cavity, ws, *u) {
			out = append(out, strings.ToUpper(w.Text[:1])+w.Text[1:]+".") // a sentence, as the other cautions
		}
	}
	if m := spec.Mode; m.Family == cavity.TM && m.N == 0 {
		// An accelerating (TM0mp) design: say when it is not the lowest mode.
		if below, n, err := d.Cavity.ModesBelow(m, 3); err == nil && n > 0 {
			names := make([]string, len(below))
			for i, b := range below {
				names[i] = fmt.Sprintf("%v at %s", b.Mode, physics.FormatFrequency(b.Frequency, 6))
			}
			out = append(out, fmt.Sprintf("%s is not the lowest mode of this cavity: %d mode(s) resonate below it (%s); a beam or coupler can excite them.", m, n, strings.Join(names, ", ")))
		}
	}
	if err := spec.Mode.EndPlateTuning(); err != nil {
		out = append(out, "Tuning: "+err.Error()+".")
	}
	if a := r.Accel; a != nil {
		if mg := a.Margins; mg != nil && (mg.AboveQuench || mg.Emitted) {
			if mg.AboveQuench {
				out = append(out, fmt.Sprintf("The peak surface magnetic field %.4g mT reaches the quench guide %.4g mT: the cavity is unlikely to hold this gradient.", mg.Bpk*1e3, mg.Limits.Quench*1e3))
			}
			if mg.Emitted {
				out = append(out, fmt.Sprintf("The peak surface electric field %.4g MV/m is above the usual field-emission onset %.4g MV/m: expect dark current and X-rays.", mg.Epk*1e-6, mg.Limits.FieldEmission*1e-6))
			}
		}
		if r.Scenario.Accel.Gradient > 0 {
			out = append(out, CautionRadiation)
		}
		if a.Coupling != nil {
			out = append(out, CautionHighPower)
		}
		for _, h := range a.HOMs {
			if h.Drivable(spec.Mode) {
				out = append(out, fmt.Sprintf("%v at %s lies within %.3g %% of beam harmonic %d (%s): a beam can drive it; damp or move it.", h.Mode, physics.FormatFrequency(h.Frequency, 7), 100*a.HOMWindow, h.Harmonic, physics.FormatFrequency(float64(h.Harmonic)*r.Scenario.Accel.Bunch, 7)))
			}
		}
	}
	if u := r.Unloaded; u != nil && u.Share.Fill > 0.5 {
		out = append(out, fmt.Sprintf("The fill's loss dominates Q0 (%.0f %% of the loss); a better wall metal will not help much.", 100*u.Share.Fill))
	}
	if r.Scenario.Wall == nil {
		out = append(out, "No wall metal given (--wall): Q0 not computed.")
	}
	return out
}

func plateauChoice(spec cavity.DesignSpec) string {
	if spec.Q != nil {
		return "the point of highest Q0"
	}
	return "the geometric centre"
}

// BulbError is the error of Scenario.Run for a storage bulb larger than
// the cavity it designed: the request is inconsistent with the design
// found, which a command reports as bad input against its bulb flags.
type BulbError struct {
	Bulb   cavity.Bulb
	Cavity cavity.Cavity
}

func (e *BulbError) Error() string {
	return fmt.Sprintf("the storage bulb (D = %s, L = %s) does not fit in the designed cavity (D = %s, L = %s)",
		physics.FormatLength(2*e.Bulb.Radius, 4), physics.FormatLength(e.Bulb.Length, 4), physics.FormatLength(e.Cavity.Diameter(), 6), physics.FormatLength(e.Cavity.Length, 6))
}
