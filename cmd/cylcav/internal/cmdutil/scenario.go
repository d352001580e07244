package cmdutil

import (
	"errors"
	"fmt"
	"math"
	"strconv"

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

	wall, objective                          string
	temp, alphaSide, alphaAxial, tol, tolLen string
	tolDist, operating, machining, demo      string
	mode                                     cavity.Mode
	freq, maxD, maxL, tuning, minClear, minQ float64
	ratioLo, ratioHi                         float64
	maxDText, tuningText                     func() string
	samples                                  int
	seed                                     uint64
	countDeg                                 bool
}

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
	f.StringVar(&sf.wall, "wall", "", "wall metal for Q0: a library name (copper, silver, aluminium, ...) or sigma=5.8e7,cte=17e-6")
	NumberRangeVar(f, &sf.ratioLo, &sf.ratioHi, "ratio-range", "allowed D/L range LO:HI", cavity.MinDesignRatio, cavity.MaxDesignRatio)
	SetDefault(f, "ratio-range", "0.5:3")
	f.StringVar(&sf.objective, "objective", "clearance", "what to maximise: clearance|q")
	FractionVar(f, &sf.minClear, "min-clearance", "least clearance, e.g. 3% (required with --objective q)", 0, 1)
	NumberVar(f, &sf.minQ, "min-q", "least unloaded Q0 (needs --wall)", 1, 1e12)
	sf.maxDText = LengthVar(f, &sf.maxD, "max-diameter", "largest allowed inside diameter", cavity.MinSize, cavity.MaxSize).Text
	LengthVar(f, &sf.maxL, "max-length", "largest allowed inside length (at the longest tuning position)", cavity.MinSize, cavity.MaxSize)
	sf.tuningText = FractionVar(f, &sf.tuning, "tuning", "tuning range by one end plate, e.g. 2% for +-2 %", 0, cavity.MaxTuning).Text
	f.StringVar(&sf.temp, "temp", "", "operating temperature range LO:HI, e.g. -20C:60C or 2K:300K")
	f.StringVar(&sf.operating, "operating-temp", "", "set-point where the design frequency holds and the walls' Q0 is taken (default: middle of --temp, else 20C)")
	f.StringVar(&sf.machining, "machining-temp", "", "temperature at which the machining dimensions are given (default 20C)")
	f.StringVar(&sf.alphaSide, "alpha-side", "", "linear expansion coefficient of the side wall, -50 C..200 C only (default: the wall metal's data), e.g. 23ppm")
	f.StringVar(&sf.alphaAxial, "alpha-axial", "", "expansion coefficient of what sets the length (default: --alpha-side), e.g. 1.3ppm")
	f.StringVar(&sf.tol, "tolerance", "", "machining tolerance +-t of diameter and length, e.g. 0.02mm")
	f.StringVar(&sf.tolLen, "tolerance-length", "", "machining tolerance of the length if different from --tolerance")
	f.StringVar(&sf.tolDist, "tolerance-dist", "normal", "distribution of machining errors: normal (tolerance = 3 sigma) | uniform")
	f.IntVar(&sf.samples, "samples", 200000, "Monte Carlo samples for the tolerance analysis")
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
	f.StringVar(&sf.demo, "demo", "link", "built-in invented scenario used when no design flag is given: link (TE011 reference cavity of a microwave link) | cell (superconducting TM010 accelerator cell at 2 K)")
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
		switch sf.demo {
		case "link":
			return design.Demo()
		case "cell":
			return design.DemoCell()
		}
		return design.Scenario{}, FlagError("demo", sf.demo, fmt.Errorf("unknown demo scenario; use link|cell"))
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
		c, err := physics.ParseConductor(sf.wall)
		if err != nil {
			return s, FlagError("wall", sf.wall, err)
		}
		s.Wall = &c
	}
	sp.RatioMin, sp.RatioMax = sf.ratioLo, sf.ratioHi
	switch sf.objective {
	case "clearance":
		sp.Objective = cavity.MaxClearance
	case "q":
		sp.Objective = cavity.MaxQ
	default:
		return s, FlagError("objective", sf.objective, fmt.Errorf("unknown objective; use clearance|q"))
	}
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
		a, err := coefficient("alpha-side", sf.alphaSide)
		if err != nil {
			return s, err
		}
		s.Side = physics.Conductor{Name: "user (--alpha-side)", Expansion: a, Source: "user input"}
		s.Axial, sideFlag, axialFlag = s.Side, "alpha-side", "alpha-side"
	}
	if set("alpha-axial") {
		a, err := coefficient("alpha-axial", sf.alphaAxial)
		if err != nil {
			return s, err
		}
		s.Axial = physics.Conductor{Name: "user (--alpha-axial)", Expansion: a, Source: "user input"}
		axialFlag = "alpha-axial"
	}
	if set("temp") {
		tlo, thi, err := physics.ParseRange(sf.temp, physics.ParseTemperature)
		if err != nil {
			return s, FlagError("temp", sf.temp, err)
		}
		if !(tlo >= 1 && thi <= 3000) {
			return s, FlagError("temp", sf.temp, fmt.Errorf("both ends must be between 1 K and 3000 K"))
		}
		th.TMin, th.TMax = tlo, thi
		s.TempGiven = true
	}
	for _, t := range []struct {
		flag, value string
		dst         *float64
	}{{"operating-temp", sf.operating, &s.TOperate}, {"machining-temp", sf.machining, &s.TMachine}} {
		if !set(t.flag) {
			continue
		}
		v, err := physics.ParseTemperature(t.value)
		if err != nil {
			return s, FlagError(t.flag, t.value, err)
		}
		if !(v >= 1 && v <= 3000) {
			return s, FlagError(t.flag, t.value, fmt.Errorf("must be between 1 K and 3000 K"))
		}
		*t.dst = v
	}
	if err := sf.acc.operating(&s, set); err != nil {
		return s, err
	}
	if s.TempGiven && s.TOperate != 0 && !physics.TemperatureIn(s.TOperate, th.TMin, th.TMax) {
		return s, FlagError("operating-temp", sf.operating, fmt.Errorf("must lie within --temp %s", sf.temp))
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
			if t.Diameter, err = Length("tolerance", sf.tol, 0, 1); err != nil {
				return s, err
			}
			t.Length = t.Diameter
		}
		if set("tolerance-length") {
			if t.Length, err = Length("tolerance-length", sf.tolLen, 0, 1); err != nil {
				return s, err
			}
		}
		switch sf.tolDist {
		case "normal":
			t.Distribution = cavity.Normal
		case "uniform":
			t.Distribution = cavity.Uniform
		default:
			return s, FlagError("tolerance-dist", sf.tolDist, fmt.Errorf("unknown distribution; use normal|uniform"))
		}
		if sf.samples < 1 || sf.samples > cavity.MaxSamples {
			return s, FlagError("samples", strconv.Itoa(sf.samples), fmt.Errorf("must be between 1 and %d", cavity.MaxSamples))
		}
		t.Samples, t.Seed = sf.samples, sf.seed
	}
	sp.CountDegenerate = sf.countDeg
	return s, nil
}

func coefficient(flag, value string) (float64, error) {
	v, err := physics.ParseCoefficient(value)
	if err != nil {
		return 0, FlagError(flag, value, err)
	}
	if !(math.Abs(v) <= 1e-3) {
		return 0, FlagError(flag, value, fmt.Errorf("must be within +-1000 ppm/K"))
	}
	return v, nil
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
