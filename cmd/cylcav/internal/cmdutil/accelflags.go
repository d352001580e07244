package cmdutil

import (
	"errors"
	"fmt"
	"math"

	"github.com/spf13/cobra"

	"cylcav/cavity"
	"cylcav/design"
	"cylcav/physics"
	"cylcav/qfactor"
)

// accelFlags are the design flags of superconducting walls, of an
// accelerating cavity and of a storage bulb: --temperature,
// --superconducting, --residual, --particle-speed, --gradient,
// --beam-current, --sync-phase, --hom-max, --bunch-freq,
// --harmonic-window, --bulb-diameter and --bulb-length. Each value with a
// unit is a typed flag (values.go): bad values exit with status 2 while
// the command line is parsed.
type accelFlags struct {
	temperature, residual, speed, gradient, current, phase float64
	homMax, bunch, window, bulbD, bulbL                    float64
	superconducting                                        bool
	temperatureText                                        func() string
}

// accelFlagNames are the flags that ask for the accelerator figures.
var accelFlagNames = []string{"particle-speed", "gradient", "beam-current", "sync-phase", "hom-max", "bunch-freq", "harmonic-window"}

// Limits of the accelerator flags: they catch unit slips, not physics.
const (
	maxGradient = 1e9  // V/m
	maxCurrent  = 1e3  // A
	maxPhase    = 89.0 // degrees from the crest
)

func addAccelFlags(cmd *cobra.Command) *accelFlags {
	a := &accelFlags{}
	f := cmd.Flags()
	a.temperatureText = TemperatureVar(f, &a.temperature, "temperature", "wall temperature, the operating set-point (same as --operating-temp), e.g. 2K", 1, 3000).Text
	f.BoolVar(&a.superconducting, "superconducting", false, "niobium walls in the superconducting state (BCS model; needs --wall niobium and a temperature, e.g. --temperature 2K)")
	ResistanceVar(f, &a.residual, "residual", "residual surface resistance with --superconducting, e.g. 10nohm (default 10 nohm)", 0, qfactor.MaxResidual)
	NumberVar(f, &a.speed, "particle-speed", "particle speed as a fraction of c for the accelerator figures, e.g. 1 or 0.8 (default 1; needs a TM0mp mode)", 1e-3, 1)
	addQuantity(f, &Quantity{p: &a.gradient, kind: "gradient", parse: physics.ParseGradient, lo: 1, hi: maxGradient,
		show: func(v float64) string { return physics.FormatSI(v, "V/m", 4) }},
		"gradient", "accelerating gradient Eacc = V/L, e.g. 15MV/m: dissipated power, heat load, peak-field margins")
	addQuantity(f, &Quantity{p: &a.current, kind: "current", parse: physics.ParseCurrent, lo: 1e-9, hi: maxCurrent,
		show: func(v float64) string { return physics.FormatSI(v, "A", 4) }},
		"beam-current", "average beam current for the matched input coupling, e.g. 1mA")
	addQuantity(f, &Quantity{p: &a.phase, kind: "angle", parse: physics.ParseAngle, lo: -maxPhase * math.Pi / 180, hi: maxPhase * math.Pi / 180,
		show: func(v float64) string { return fmt.Sprintf("%gdeg", math.Round(v*180/math.Pi)) }},
		"sync-phase", "synchronous phase from the crest, e.g. -30deg (default 0deg)")
	FrequencyVar(f, &a.homMax, "hom-max", "list monopole and dipole modes up to this frequency, e.g. 4GHz", MinFrequency, MaxFrequency)
	FrequencyVar(f, &a.bunch, "bunch-freq", "bunch repetition frequency: flag modes near its harmonics, e.g. 650MHz", MinFrequency, MaxFrequency)
	FractionVar(f, &a.window, "harmonic-window", "half-width of the band flagged around each beam harmonic, e.g. 0.5% (default 0.5 %)", 1e-6, 0.1)
	LengthVar(f, &a.bulbD, "bulb-diameter", "diameter of a central storage bulb for its filling factors (TE0mp modes), e.g. 120mm", cavity.MinSize, cavity.MaxSize)
	LengthVar(f, &a.bulbL, "bulb-length", "length of the storage bulb, centred between the end plates, e.g. 150mm", cavity.MinSize, cavity.MaxSize)
	Needs(cmd, "residual", "superconducting")
	Needs(cmd, "beam-current", "gradient")
	Needs(cmd, "sync-phase", "beam-current")
	Needs(cmd, "bunch-freq", "hom-max")
	Needs(cmd, "harmonic-window", "bunch-freq")
	Needs(cmd, "bulb-diameter", "bulb-length")
	Needs(cmd, "bulb-length", "bulb-diameter")
	NeedsExample(cmd, "residual", "--wall niobium --superconducting --temperature 2K")
	return a
}

// operating reads --temperature into s.TOperate (before the thermal
// model is set up); --operating-temp and --temperature name the same
// set-point, so only one may be given.
func (a *accelFlags) operating(s *design.Scenario, set func(string) bool) error {
	if !set("temperature") {
		return nil
	}
	if set("operating-temp") {
		return Usagef("--temperature and --operating-temp name the same set-point; give one")
	}
	s.TOperate = a.temperature
	return nil
}

// apply reads the superconducting, accelerator and bulb flags into s
// (after the wall metal and the temperatures), with the rules between
// them and the mode.
func (a *accelFlags) apply(s *design.Scenario, set func(string) bool) error {
	if a.superconducting {
		if s.Wall == nil {
			return Usagef("--superconducting needs --wall niobium")
		}
		if !set("temperature") && !set("operating-temp") && !set("temp") {
			return Usagef("--superconducting needs the wall temperature, e.g. --temperature 2K")
		}
		bcs := qfactor.NiobiumBCS()
		if set("residual") {
			bcs.Residual = a.residual
		}
		s.Superconductor = &bcs
		if ok, why := s.WallQ(); !ok {
			var we *qfactor.WallError
			if errors.As(why, &we) {
				switch we.Setting {
				case qfactor.SettingMetal:
					return FlagError("wall", s.Wall.Name, we.Err)
				case qfactor.SettingTemperature:
					op, _ := s.Temps()
					return FlagError("temperature", physics.FormatTemperature(op, 4), we.Err)
				}
			}
			return Usagef("--superconducting: %v", why)
		}
	}
	if set("bulb-diameter") {
		if m := s.Spec.Mode; m.Family != cavity.TE || m.N != 0 {
			return Usagef("--bulb-diameter and --bulb-length need a TE0mp mode (H_z on the axis, e.g. TE011); --mode is %s", m)
		}
		s.Bulb = &cavity.Bulb{Radius: a.bulbD / 2, Length: a.bulbL}
	}
	given := ""
	for _, n := range accelFlagNames {
		if given == "" && set(n) {
			given = n
		}
	}
	if given == "" {
		return nil
	}
	if m := s.Spec.Mode; m.Family != cavity.TM || m.N != 0 {
		return Usagef("--%s needs a TM0mp mode (an axial electric field on the axis), as do all the accelerator flags (--gradient, --beam-current, --hom-max, ...); --mode is %s", given, m)
	}
	acc := &design.Accelerator{Speed: 1}
	if set("particle-speed") {
		acc.Speed = a.speed
	}
	if set("gradient") {
		if s.Wall == nil {
			return Usagef("--gradient needs --wall (the power at a gradient needs Q0)")
		}
		acc.Gradient = a.gradient
	}
	if set("beam-current") {
		acc.Beam = &qfactor.Beam{Current: a.current, Phase: a.phase}
	}
	if set("hom-max") {
		if s.Wall == nil {
			return Usagef("--hom-max needs --wall (each mode's Q0)")
		}
		if f := s.Spec.Frequency; !(a.homMax >= f && a.homMax <= 20*f) {
			return FlagError("hom-max", physics.FormatFrequency(a.homMax, 6), fmt.Errorf("must be between --freq and 20 times it (%s .. %s)", physics.FormatFrequency(f, 4), physics.FormatFrequency(20*f, 4)))
		}
		acc.HOMMax = a.homMax
	}
	acc.Bunch, acc.Window = a.bunch, a.window
	s.Accel = acc
	return nil
}
