package cmdutil

import (
	"errors"
	"fmt"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"cylcav/cavity"
	"cylcav/design"
	"cylcav/physics"
)

// ScenarioFlags are the flags of a single-cavity design request, shared by
// `cylcav design` and `cylcav report` so the two read them alike.
type ScenarioFlags struct {
	flags *pflag.FlagSet
	geo   *GeometryFlags
	acc   *accelFlags
	names map[string]bool

	wall                                     physics.Conductor
	objective                                cavity.Objective
	tolDist                                  cavity.Distribution
	demo                                     func() (design.Scenario, error) // the built-in scenario of --demo
	mode                                     cavity.Mode
	freq, maxD, maxL, tuning, minClear, minQ float64
	ratioLo, ratioHi, tempLo, tempHi         float64
	operating, machining                     float64
	alphaSide, alphaAxial, tol, tolLen       float64
	maxDText, tuningText                     func() string
	samples                                  int
	seed                                     uint64
	countDeg                                 bool
}

// Limits of the scenario's temperatures and expansion coefficients.
const (
	minScenarioT = 1    // K
	maxScenarioT = 3000 // K
	maxAlpha     = 1e-3 // 1/K
)

// showKelvin prints a temperature limit in kelvin ("3000 K").
func showKelvin(v float64) string { return fmt.Sprintf("%g K", v) }

// AddScenarioFlags defines the design-request flags on cmd.
func AddScenarioFlags(cmd *cobra.Command) *ScenarioFlags {
	f := cmd.Flags()
	sf := &ScenarioFlags{flags: f, names: map[string]bool{}}
	before := map[string]bool{}
	f.VisitAll(func(fl *pflag.Flag) { before[fl.Name] = true })
	ModeVar(f, &sf.mode, "mode", "wanted mode, e.g. TE011")
	FrequencyVar(f, &sf.freq, "freq", "wanted frequency, e.g. 10GHz", 1e3, 1e15)
	sf.geo = AddGeometryFlags(cmd, Geometry{
		Fill: "fill dielectric: a library name (air, ptfe, ...) or eps=2.1,tand=3e-4,tceps=-350ppm (default vacuum)",
	})
	ConductorVar(f, &sf.wall, "wall", "wall metal for Q0: a library name (copper, silver, aluminium, ...) or sigma=5.8e7,cte=17e-6")
	NumberRangeVar(f, &sf.ratioLo, &sf.ratioHi, "ratio-range", "allowed D/L range LO:HI", cavity.MinDesignRatio, cavity.MaxDesignRatio)
	SetDefault(f, "ratio-range", "0.5:3")
	EnumVar(f, &sf.objective, "objective", "clearance", "what to maximise: clearance|q", "objective",
		Choice[cavity.Objective]{Word: "clearance", Value: cavity.MaxClearance},
		Choice[cavity.Objective]{Word: "q", Value: cavity.MaxQ})
	FractionVar(f, &sf.minClear, "min-clearance", "least clearance, e.g. 3% (required with --objective q)", 0, 1)
	NumberVar(f, &sf.minQ, "min-q", "least unloaded Q0 (needs --wall)", 1, 1e12)
	sf.maxDText = LengthVar(f, &sf.maxD, "max-diameter", "largest allowed inside diameter", cavity.MinSize, cavity.MaxSize).Text
	LengthVar(f, &sf.maxL, "max-length", "largest allowed inside length (at the longest tuning position)", cavity.MinSize, cavity.MaxSize)
	sf.tuningText = FractionVar(f, &sf.tuning, "tuning", "tuning range by one end plate, e.g. 2% for +-2 %", 0, cavity.MaxTuning).Text
	temp := TemperatureRangeVar(f, &sf.tempLo, &sf.tempHi, "temp", "operating temperature range LO:HI, e.g. -20C:60C or 2K:300K", minScenarioT, maxScenarioT)
	temp.q.show = showKelvin
	TemperatureVar(f, &sf.operating, "operating-temp", "set-point where the design frequency holds and the walls' Q0 is taken (default: middle of --temp, else 20C)", minScenarioT, maxScenarioT).show = showKelvin
	TemperatureVar(f, &sf.machining, "machining-temp", "temperature at which the machining dimensions are given (default 20C)", minScenarioT, maxScenarioT).show = showKelvin
	CoefficientVar(f, &sf.alphaSide, "alpha-side", "linear expansion coefficient of the side wall, -50 C..200 C only (default: the wall metal's data), e.g. 23ppm", maxAlpha)
	CoefficientVar(f, &sf.alphaAxial, "alpha-axial", "expansion coefficient of what sets the length (default: --alpha-side), e.g. 1.3ppm", maxAlpha)
	LengthVar(f, &sf.tol, "tolerance", "machining tolerance +-t of diameter and length, e.g. 0.02mm", 0, 1)
	LengthVar(f, &sf.tolLen, "tolerance-length", "machining tolerance of the length if different from --tolerance", 0, 1)
	EnumVar(f, &sf.tolDist, "tolerance-dist", "normal", "distribution of machining errors: normal (tolerance = 3 sigma) | uniform", "distribution",
		Choice[cavity.Distribution]{Word: "normal", Value: cavity.Normal},
		Choice[cavity.Distribution]{Word: "uniform", Value: cavity.Uniform})
	IntVar(f, &sf.samples, "samples", 200000, "Monte Carlo samples for the tolerance analysis", 1, cavity.MaxSamples)
	f.Uint64Var(&sf.seed, "seed", 1, "Monte Carlo seed (same seed, same result on any number of cores)")
	f.BoolVar(&sf.countDeg, "count-degenerate", false, "count the exact TE0mp/TM1mp companion in the clearance")
	sf.acc = addAccelFlags(cmd)
	f.VisitAll(func(fl *pflag.Flag) {
		if !before[fl.Name] {
			sf.names[fl.Name] = true
		}
	})
	for _, mc := range []string{"samples", "seed", "tolerance-dist"} {
		Needs(cmd, mc, "tolerance", "tolerance-length")
	}
	EnumVar(f, &sf.demo, "demo", "link", "built-in invented scenario used when no design flag is given: link (TE011 reference cavity of a microwave link) | cell (superconducting TM010 accelerator cell at 2 K)", "demo scenario",
		Choice[func() (design.Scenario, error)]{Word: "link", Value: design.Demo},
		Choice[func() (design.Scenario, error)]{Word: "cell", Value: design.DemoCell})
	return sf
}

// Scenario returns the design request the flags give: the built-in demo
// scenario (design.Demo) when none of them is given, else the scenario
// they describe, validated (bad values are UsageErrors naming the flag).
func (sf *ScenarioFlags) Scenario() (design.Scenario, error) {
	demo := true
	sf.flags.Visit(func(f *pflag.Flag) {
		if sf.names[f.Name] {
			demo = false
		}
	})
	if demo {
		return sf.demo()
	}
	if sf.flags.Changed("demo") {
		return design.Scenario{}, Usagef("--demo takes no other design flags: it runs a built-in scenario")
	}
	return sf.parse()
}

func (sf *ScenarioFlags) parse() (design.Scenario, error) {
	var s design.Scenario
	sp := &s.Spec
	// A flag given with an empty value is an error below, never "absent".
	set := sf.flags.Changed
	if !set("mode") || !set("freq") {
		return s, Usagef("design needs --mode and --freq (or no flags at all for the demo scenario)")
	}
	var err error
	sp.Mode, sp.Frequency = sf.mode, sf.freq
	if s.Fill, err = sf.geo.Dielectric(); err != nil {
		return s, err
	}
	if set("wall") {
		c := sf.wall
		s.Wall = &c
	}
	sp.RatioMin, sp.RatioMax = sf.ratioLo, sf.ratioHi
	sp.Objective = sf.objective
	sp.MinClearance = sf.minClear
	if sp.Objective == cavity.MaxQ {
		if s.Wall == nil {
			return s, Usagef("--objective q needs --wall (the wall metal sets Q0)")
		}
		if !set("min-clearance") {
			return s, Usagef("--objective q needs --min-clearance (the clearance Q0 may not go below)")
		}
	}
	if set("min-q") {
		sp.MinQ = sf.minQ
		if s.Wall == nil {
			return s, Usagef("--min-q needs --wall (the wall metal sets Q0)")
		}
	}
	sp.MaxDiameter, sp.MaxLength, sp.Tuning = sf.maxD, sf.maxL, sf.tuning
	if set("max-diameter") {
		if err := checkCutoff(*sp); err != nil {
			return s, FlagError("max-diameter", sf.maxDText(), err)
		}
	}
	if err := CheckTunable("tuning", sf.tuningText(), sp.Mode, sp.Tuning); err != nil {
		return s, err
	}
	th := &sp.Thermal
	sideFlag, axialFlag := "wall", "wall"
	if s.Wall != nil {
		s.Side, s.Axial = *s.Wall, *s.Wall
	}
	if set("alpha-side") {
		s.Side = physics.Conductor{Name: "user (--alpha-side)", Expansion: sf.alphaSide, Source: "user input"}
		s.Axial, sideFlag, axialFlag = s.Side, "alpha-side", "alpha-side"
	}
	if set("alpha-axial") {
		s.Axial = physics.Conductor{Name: "user (--alpha-axial)", Expansion: sf.alphaAxial, Source: "user input"}
		axialFlag = "alpha-axial"
	}
	if set("temp") {
		th.TMin, th.TMax = sf.tempLo, sf.tempHi
		s.TempGiven = true
	}
	if set("operating-temp") {
		s.TOperate = sf.operating
	}
	if set("machining-temp") {
		s.TMachine = sf.machining
	}
	if err := sf.acc.operating(&s, set); err != nil {
		return s, err
	}
	if s.TempGiven && s.TOperate != 0 && !physics.TemperatureIn(s.TOperate, th.TMin, th.TMax) {
		return s, FlagError("operating-temp", Text(sf.flags, "operating-temp"), fmt.Errorf("must lie within --temp %s", Text(sf.flags, "temp")))
	}
	if err := s.SetThermal(sideFlag, axialFlag); err != nil {
		return s, Usagef("%v", err)
	}
	if err := th.Validate(); err != nil {
		return s, Usagef("%v", err)
	}
	if err := sf.acc.apply(&s, set); err != nil {
		return s, err
	}
	if ok, why := s.WallQ(); !ok && why != nil && (sp.Objective == cavity.MaxQ || sp.MinQ > 0) {
		op, _ := s.Temps()
		return s, Usagef("--objective q and --min-q need Q0 with the walls at the operating temperature %s, which the wall model does not give: %v", physics.FormatTemperature(op, 4), why)
	}
	if set("tolerance") || set("tolerance-length") {
		t := &s.Settings.Tolerance
		if set("tolerance") {
			t.Diameter, t.Length = sf.tol, sf.tol
		}
		if set("tolerance-length") {
			t.Length = sf.tolLen
		}
		t.Distribution, t.Samples, t.Seed = sf.tolDist, sf.samples, sf.seed
	}
	sp.CountDegenerate = sf.countDeg
	return s, nil
}

// progressSamples is the least number of Monte Carlo samples for which
// RunScenario shows a progress bar.
const progressSamples = 100000

// RunScenario solves s as design.Scenario.Run does, with a progress bar on
// io's error stream while a long tolerance analysis (progressSamples or
// more samples) runs; the bar shows on a terminal only.
func RunScenario(io *IOStreams, s design.Scenario) (design.Result, error) {
	var r design.Result
	var err error
	if s.Settings.Tolerance.Samples < progressSamples {
		r, err = s.Run(nil)
	} else {
		bar := NewProgress(io, "tolerance analysis")
		r, err = s.Run(bar.Update)
		bar.Done()
	}
	// A tolerance too large for the design found is bad input (exit 2).
	var te *cavity.ToleranceError
	if errors.As(err, &te) {
		flag := "tolerance"
		if te.Name == "length tolerance" {
			flag = "tolerance-length"
		}
		return r, Usagef("--%s %s: must be below a tenth of the designed dimension, %s", flag, physics.FormatLength(te.Value, 4), physics.FormatLength(te.Max, 4))
	}
	// So is a storage bulb larger than the cavity designed.
	var be *design.BulbError
	if errors.As(err, &be) {
		return r, Usagef("--bulb-diameter/--bulb-length: %v; the bulb must fit inside it", be)
	}
	return r, err
}

// checkCutoff tells whether the mode can exist at the design frequency in a
// diameter of at most sp.MaxDiameter, by the check `cylcav size --diameter`
// makes (cavity.Size), so that a diameter limit below the mode's cut-off
// is refused as a value out of range (exit status 2) in every command. A
// mode with p = 0 has one diameter for the frequency, whatever the length.
func checkCutoff(sp cavity.DesignSpec) error {
	if sp.Mode.P > 0 {
		_, err := cavity.Size(sp.Mode, sp.Frequency, sp.Fill, cavity.ByDiameter(sp.MaxDiameter))
		if errors.Is(err, cavity.ErrInfeasible) {
			return err
		}
		return nil
	}
	c, err := cavity.Size(sp.Mode, sp.Frequency, sp.Fill, cavity.ByRatio(1))
	if err == nil && c.Diameter() > sp.MaxDiameter {
		return fmt.Errorf("%s at %s needs a diameter of %s (p = 0: the diameter alone sets the frequency)",
			sp.Mode, TrimZeros(physics.FormatFrequency(sp.Frequency, 6)), TrimZeros(physics.FormatLength(c.Diameter(), 6)))
	}
	return nil
}

// CheckTunable refuses a tuning range (the flag and its text, the range as
// a fraction) for a mode that an end plate cannot tune
// (cavity.Mode.EndPlateTuning, the one verdict), in every command that has
// a tuning flag.
func CheckTunable(flag, value string, m cavity.Mode, tuning float64) error {
	if tuning > 0 {
		if err := m.EndPlateTuning(); err != nil {
			return FlagError(flag, value, err)
		}
	}
	return nil
}
