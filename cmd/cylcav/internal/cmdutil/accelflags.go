package cmdutil

import (
	"errors"
	"fmt"

	"github.com/spf13/pflag"

	"cylcav/cavity"
	"cylcav/design"
	"cylcav/physics"
	"cylcav/qfactor"
)

// accelFlags are the design flags of superconducting walls and of an
// accelerating cavity: --temperature, --superconducting, --residual,
// --particle-speed, --gradient, --beam-current, --sync-phase, --hom-max,
// --bunch-freq and --harmonic-window.
type accelFlags struct {
	temperature, residual, speed, gradient, current, phase string
	homMax, bunch, window, bulbD, bulbL                    string
	superconducting                                        bool
}

// accelFlagNames are the flags that ask for the accelerator figures.
var accelFlagNames = []string{"particle-speed", "gradient", "beam-current", "sync-phase", "hom-max", "bunch-freq", "harmonic-window"}

func addAccelFlags(f *pflag.FlagSet) *accelFlags {
	a := &accelFlags{}
	f.StringVar(&a.temperature, "temperature", "", "wall temperature, the operating set-point (same as --operating-temp), e.g. 2K")
	f.BoolVar(&a.superconducting, "superconducting", false, "niobium walls in the superconducting state (BCS model; needs --wall niobium and a temperature, e.g. --temperature 2K)")
	f.StringVar(&a.residual, "residual", "", "residual surface resistance with --superconducting, e.g. 10nohm (default 10 nohm)")
	f.StringVar(&a.speed, "particle-speed", "", "particle speed as a fraction of c for the accelerator figures, e.g. 1 or 0.8 (default 1; needs a TM0mp mode)")
	f.StringVar(&a.gradient, "gradient", "", "accelerating gradient Eacc = V/L, e.g. 15MV/m: dissipated power, heat load, peak-field margins")
	f.StringVar(&a.current, "beam-current", "", "average beam current for the matched input coupling, e.g. 1mA (needs --gradient)")
	f.StringVar(&a.phase, "sync-phase", "", "synchronous phase from the crest, e.g. -30deg (default 0deg; needs --beam-current)")
	f.StringVar(&a.homMax, "hom-max", "", "list monopole and dipole modes up to this frequency, e.g. 4GHz")
	f.StringVar(&a.bunch, "bunch-freq", "", "bunch repetition frequency: flag modes near its harmonics, e.g. 650MHz (needs --hom-max)")
	f.StringVar(&a.window, "harmonic-window", "", "half-width of the band flagged around each beam harmonic, e.g. 0.5% (default 0.5 %)")
	f.StringVar(&a.bulbD, "bulb-diameter", "", "diameter of a central storage bulb for its filling factors (TE0mp modes), e.g. 120mm")
	f.StringVar(&a.bulbL, "bulb-length", "", "length of the storage bulb, centred between the end plates (needs --bulb-diameter), e.g. 150mm")
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
	v, err := physics.ParseTemperature(a.temperature)
	if err != nil {
		return FlagError("temperature", a.temperature, err)
	}
	if !(v >= 1 && v <= 3000) {
		return FlagError("temperature", a.temperature, fmt.Errorf("must be between 1 K and 3000 K"))
	}
	s.TOperate = v
	return nil
}

// apply reads the superconducting and accelerator flags into s (after the
// wall metal and the temperatures).
func (a *accelFlags) apply(s *design.Scenario, set func(string) bool) error {
	switch {
	case a.superconducting:
		if s.Wall == nil {
			return Usagef("--superconducting needs --wall niobium")
		}
		if !set("temperature") && !set("operating-temp") && !set("temp") {
			return Usagef("--superconducting needs the wall temperature, e.g. --temperature 2K")
		}
		bcs := qfactor.NiobiumBCS()
		if set("residual") {
			r, err := parseOhm(a.residual)
			if err != nil {
				return FlagError("residual", a.residual, err)
			}
			bcs.Residual = r
		}
		s.Superconductor = &bcs
		if ok, why := s.WallQ(); !ok {
			var we *qfactor.WallError
			if errors.As(why, &we) {
				switch we.Setting {
				case qfactor.SettingMetal:
					return FlagError("wall", s.Wall.Name, we.Err)
				case qfactor.SettingResidual:
					return FlagError("residual", a.residual, we.Err)
				case qfactor.SettingTemperature:
					op, _ := s.Temps()
					return FlagError("temperature", physics.FormatTemperature(op, 4), we.Err)
				}
			}
			return Usagef("--superconducting: %v", why)
		}
	case set("residual"):
		return Usagef("--residual needs --superconducting")
	}
	if set("bulb-diameter") || set("bulb-length") {
		if !set("bulb-diameter") || !set("bulb-length") {
			return Usagef("--bulb-diameter and --bulb-length go together")
		}
		if m := s.Spec.Mode; m.Family != cavity.TE || m.N != 0 {
			return Usagef("--bulb-diameter and --bulb-length need a TE0mp mode (H_z on the axis, e.g. TE011); --mode is %s", m)
		}
		d, err := Length("bulb-diameter", a.bulbD, cavity.MinSize, cavity.MaxSize)
		if err != nil {
			return err
		}
		l, err := Length("bulb-length", a.bulbL, cavity.MinSize, cavity.MaxSize)
		if err != nil {
			return err
		}
		s.Bulb = &cavity.Bulb{Radius: d / 2, Length: l}
	}
	given := false
	for _, n := range accelFlagNames {
		given = given || set(n)
	}
	if !given {
		return nil
	}
	if m := s.Spec.Mode; m.Family != cavity.TM || m.N != 0 {
		return Usagef("--gradient, --beam-current, --hom-max and the other accelerator flags need a TM0mp mode (an axial electric field on the axis); --mode is %s", m)
	}
	acc := &design.Accelerator{Speed: 1}
	var err error
	if set("particle-speed") {
		if acc.Speed, err = Number("particle-speed", a.speed, 1e-3, 1); err != nil {
			return err
		}
	}
	if set("gradient") {
		if acc.Gradient, err = quantity("gradient", a.gradient, physics.ParseGradient, 1, 1e9, "V/m"); err != nil {
			return err
		}
		if s.Wall == nil {
			return Usagef("--gradient needs --wall (the power at a gradient needs Q0)")
		}
	}
	if set("beam-current") {
		if !set("gradient") {
			return Usagef("--beam-current needs --gradient")
		}
		b := &qfactor.Beam{}
		if b.Current, err = quantity("beam-current", a.current, physics.ParseCurrent, 1e-9, 1e3, "A"); err != nil {
			return err
		}
		if set("sync-phase") {
			if b.Phase, err = quantity("sync-phase", a.phase, physics.ParseAngle, -1.5533430342749532, 1.5533430342749532, "rad (±89 deg)"); err != nil {
				return err
			}
		}
		acc.Beam = b
	} else if set("sync-phase") {
		return Usagef("--sync-phase needs --beam-current")
	}
	if set("hom-max") {
		if acc.HOMMax, err = Frequency("hom-max", a.homMax, s.Spec.Frequency, 20*s.Spec.Frequency); err != nil {
			return err
		}
		if s.Wall == nil {
			return Usagef("--hom-max needs --wall (each mode's Q0)")
		}
	}
	if set("bunch-freq") {
		if !set("hom-max") {
			return Usagef("--bunch-freq needs --hom-max")
		}
		if acc.Bunch, err = Frequency("bunch-freq", a.bunch, MinFrequency, MaxFrequency); err != nil {
			return err
		}
	}
	if set("harmonic-window") {
		if !set("bunch-freq") {
			return Usagef("--harmonic-window needs --bunch-freq")
		}
		if acc.Window, err = fraction("harmonic-window", a.window, 1e-6, 0.1); err != nil {
			return err
		}
	}
	s.Accel = acc
	return nil
}

// quantity parses value with parse and checks that it lies in [lo, hi]
// (SI units, named by unit in the error).
func quantity(flag, value string, parse func(string) (float64, error), lo, hi float64, unit string) (float64, error) {
	v, err := parse(value)
	if err != nil {
		return 0, FlagError(flag, value, err)
	}
	if !(v >= lo && v <= hi) {
		return 0, FlagError(flag, value, fmt.Errorf("must be between %g and %g %s", lo, hi, unit))
	}
	return v, nil
}
