package design

import (
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/qfactor"
)

// This file is the accelerator side of the design flow: superconducting
// walls, the operating figures at a gradient, the beam coupling, the
// higher-order-mode table and the bench figures of a cold cavity.

// Accelerator is the accelerator part of a scenario. Its mode must be a
// TM0mp mode (an axial electric field on the axis).
type Accelerator struct {
	// Speed is the particle speed as a fraction of c, 0 < Speed <= 1.
	Speed float64
	// Gradient is the accelerating gradient Eacc = V/L, V/m; zero means
	// none (no power, heat load, margins or beam coupling).
	Gradient float64
	// Beam, when not nil, is matched by the input coupling (needs a
	// gradient).
	Beam *qfactor.Beam
	// HOMMax is the highest frequency of the higher-order-mode table, Hz;
	// zero means no table.
	HOMMax float64
	// Bunch is the bunch repetition frequency for the harmonic flags of the
	// table, Hz; zero flags nothing. Window is the flag's half-width as a
	// fraction (zero: qfactor.DefaultHarmonicWindow).
	Bunch, Window float64
}

// Bench is what a technician measures on the bench at the machining
// temperature, for a cavity designed to work cold in vacuum.
type Bench struct {
	Operate, Machine float64 // K
	// Cold is the design frequency, in vacuum at the operating temperature.
	Cold float64
	// WarmVacuum is the frequency of the machined cavity in vacuum at the
	// machining temperature, WarmAir that in the bench air (Air), Hz.
	WarmVacuum, WarmAir float64
	Air                 physics.Dielectric
	// Machined is the cavity at the machining temperature (vacuum).
	Machined cavity.Cavity
}

// AccelResult holds the accelerator figures of a design.
type AccelResult struct {
	Figures qfactor.Accel
	// Dissipation is the RF loss at the gradient; nil without a gradient
	// or Q0, and nil (with a note) when superconducting walls' peak
	// magnetic field is above the quench guide (Margins.AboveQuench), where
	// the BCS Q0 does not hold; so are Heat and Coupling then.
	Dissipation *qfactor.Dissipation
	// Heat is the heat load at the bath; nil unless the walls are
	// superconducting and a gradient is given.
	Heat *qfactor.HeatLoad
	// Margins are the peak-field margins; nil unless superconducting with
	// a gradient.
	Margins *qfactor.Margins
	// Coupling is the matched beam coupling; nil without a beam.
	Coupling *qfactor.BeamCoupling
	// HOMs is the higher-order-mode table; nil without HOMMax.
	HOMs []qfactor.HOM
	// HOMWindow is the harmonic window used.
	HOMWindow float64
	// Notes are statements of the model's scope for people.
	Notes []string
}

// NotAvailableAxisymmetric is the statement every accelerator output
// carries: the closed cylinder is the only body modelled so far.
const NotAvailableAxisymmetric = "These figures are for a closed pillbox with no beam holes. Beam pipes and nose cones lower R/Q and raise the peak-field ratios; cylcav stack --beta gives T and R/Q of the monopoles of a body of stacked sections (closed by end plates, or trapped below the cutoff of open beam pipes) and --order 1 the frequencies of its dipoles, but not their transverse R/Q or the peak surface fields: use a field solver for those."

// CautionRadiation is the caution of every design with an accelerating
// gradient.
const CautionRadiation = "Radiation: at high gradient, field emission accelerates electrons that make X-rays (bremsstrahlung) and dark current, and any beam makes radiation; operate only behind shielding with radiation monitoring, under the local radiation-protection codes and licensed practice."

// CautionHighPower is the caution of a design with a beam coupling.
const CautionHighPower = "High RF power: kilowatts to megawatts at the input coupler can burn, ignite and arc, leaks are an RF exposure hazard, and multipaction and breakdown can occur in the cavity and coupler; all of the power returns to the source when the beam trips or the cavity quenches, so protect the transmitter with a circulator and interlocks, and follow local codes and licensed practice."

// Walls returns the scenario's wall set at the operating temperature:
// the wall metal on every part, smooth, superconducting when
// s.Superconductor is set. ok is false without a wall metal.
func (s Scenario) Walls() (w qfactor.WallSet, ok bool) {
	if s.Wall == nil {
		return qfactor.WallSet{}, false
	}
	operate, _ := s.Temps()
	return qfactor.SameWalls(qfactor.Surface{Conductor: *s.Wall, Temperature: operate, Superconductor: s.Superconductor}), true
}

// ModeQ returns the unloaded-Q function of mode m with the scenario's
// walls (Walls) and the cavity's fill. The walls must be valid (WallQ).
func (s Scenario) ModeQ(m cavity.Mode) func(cavity.Cavity) (float64, error) {
	w, _ := s.Walls()
	return qfactor.Q0Constraint(m, w)
}

// validateAccel checks the accelerator request against the scenario.
func (s Scenario) validateAccel() error {
	a := s.Accel
	m := s.Spec.Mode
	if m.Family != cavity.TM || m.N != 0 {
		return fmt.Errorf("the accelerator figures need a TM0mp mode (an axial electric field on the axis), got %s", m)
	}
	if math.IsNaN(a.Speed) || a.Speed <= 0 || a.Speed > 1 {
		return fmt.Errorf("particle speed must be in 0 < beta <= 1, got %g", a.Speed)
	}
	if a.Beam != nil && a.Gradient == 0 {
		return fmt.Errorf("a beam coupling needs an accelerating gradient")
	}
	if (a.Gradient > 0 || a.Beam != nil) && s.Wall == nil {
		return fmt.Errorf("the power at a gradient needs the wall metal (Q0)")
	}
	return nil
}

// accel computes the accelerator figures of result r.
func (s Scenario) accel(r Result) (*AccelResult, error) {
	a := s.Accel
	c := r.Design.Cavity
	m := s.Spec.Mode
	fig, err := qfactor.Acceleration(c, m, a.Speed)
	if err != nil {
		return nil, err
	}
	out := &AccelResult{Figures: fig, Notes: []string{NotAvailableAxisymmetric}}
	w, hasWalls := s.Walls()
	if fig.NoGain && (a.Gradient > 0 || a.Beam != nil) {
		return nil, fmt.Errorf("%s gives almost no gain at beta = %g (transit-time factor %.3g): no gradient can be held", m, a.Speed, fig.TransitTime)
	}
	if a.Gradient > 0 && r.Unloaded != nil {
		if s.Superconductor != nil {
			operate, _ := s.Temps()
			lim, err := qfactor.NiobiumLimits(operate, s.Superconductor.Tc)
			if err != nil {
				return nil, err
			}
			mg, err := qfactor.FieldMargins(fig, a.Gradient, lim)
			if err != nil {
				return nil, err
			}
			out.Margins = &mg
		}
		// Above the quench guide the walls are not in the low-field
		// superconducting state that the BCS surface resistance (and so
		// Q0) describes: no power, heat load or coupling from it.
		powered := out.Margins == nil || !out.Margins.AboveQuench
		if !powered {
			out.Notes = append(out.Notes, fmt.Sprintf("dissipated power, heat load and beam coupling are not given: the peak surface magnetic field %.4g mT at this gradient is above the quench guide %.4g mT, where the BCS surface resistance (low field, superconducting state) and so Q0 do not hold",
				out.Margins.Bpk*1e3, out.Margins.Limits.Quench*1e3))
		}
		var d qfactor.Dissipation
		if powered {
			var err error
			if d, err = qfactor.Dissipated(fig, c.Length, r.Unloaded.Q0, a.Gradient); err != nil {
				return nil, err
			}
			out.Dissipation = &d
		}
		if powered && s.Superconductor != nil {
			operate, _ := s.Temps()
			h, err := qfactor.Refrigeration(d.Power, operate, 0)
			if err != nil {
				return nil, err
			}
			out.Heat = &h
		}
		if powered && a.Beam != nil {
			k, err := qfactor.MatchBeam(fig.Frequency, d.Voltage, fig.ROverQLinac, r.Unloaded.Q0, *a.Beam)
			if err != nil {
				return nil, err
			}
			out.Coupling = &k
		}
	}
	if a.HOMMax > 0 && hasWalls {
		out.HOMWindow = a.Window
		if out.HOMWindow == 0 {
			out.HOMWindow = qfactor.DefaultHarmonicWindow
		}
		h, err := qfactor.HOMTable(c, qfactor.HOMOptions{Speed: a.Speed, MaxFrequency: a.HOMMax, Walls: w, Bunch: a.Bunch, Window: a.Window})
		if err != nil {
			return nil, err
		}
		out.HOMs = h
	}
	return out, nil
}

// bench returns the bench figures of result r: the design's cavity carried
// to the machining temperature (Result.Machined, from the contraction
// data), its frequency in vacuum there and in the library's dry air at
// 20 C and 101.325 kPa (physics.LookupDielectric("air"), Smith-Weintraub
// refractivity). Both frequencies come from cavity.Cavity.Frequency of the
// machined cavity with its fill. It returns nil for a cavity not filled
// with vacuum (the bench then measures the fill itself).
func bench(r Result) (*Bench, error) {
	spec := r.Design.Spec
	if spec.Fill.Eps() != 1 || spec.Fill.Mu() != 1 {
		return nil, nil
	}
	air, err := physics.LookupDielectric("air")
	if err != nil {
		return nil, err
	}
	operate, machine := r.Scenario.Temps()
	mc := r.Machined
	inAir := mc
	inAir.Fill = air.Medium
	return &Bench{
		Operate: operate, Machine: machine,
		Cold:       r.Design.Cavity.Frequency(spec.Mode),
		WarmVacuum: mc.Frequency(spec.Mode),
		WarmAir:    inAir.Frequency(spec.Mode),
		Air:        air,
		Machined:   mc,
	}, nil
}

// DemoCell returns the built-in invented accelerator scenario: a 1.3 GHz
// TM010 pillbox test cell of bulk niobium for the fictional "Harrow Fen"
// electron test stand, operated superconducting at 2 K at 15 MV/m with a
// 2 mA beam 10 degrees off crest, bunches every second RF period, its
// length half a wavelength (D/L = 2 j01/pi), machined at 20 C to
// +-0.02 mm, with higher-order modes listed up to 4 GHz.
func DemoCell() (Scenario, error) {
	nb, err := physics.LookupConductor("niobium")
	if err != nil {
		return Scenario{}, err
	}
	m, err := cavity.ParseMode("TM010")
	if err != nil {
		return Scenario{}, err
	}
	ratio := 2 * 2.404825557695773 / math.Pi // d = lambda/2 at beta = 1 (j01, DLMF table 10.21.1)
	bcs := qfactor.NiobiumBCS()
	s := Scenario{
		Title: "TM010 superconducting test cell for the fictional Harrow Fen 1.3 GHz electron test stand (bulk niobium, 2 K)",
		Spec: cavity.DesignSpec{
			Mode: m, Frequency: 1.3e9,
			RatioMin: ratio, RatioMax: ratio,
		},
		Settings: cavity.AnalysisSettings{
			Tolerance: cavity.Tolerance{Diameter: 20e-6, Length: 20e-6, Samples: 20000, Seed: 1},
		},
		Wall:           &nb,
		TOperate:       2,
		Side:           nb,
		Axial:          nb,
		Superconductor: &bcs,
		Accel: &Accelerator{
			Speed: 1, Gradient: 15e6,
			Beam:   &qfactor.Beam{Current: 2e-3, Phase: -10 * math.Pi / 180},
			HOMMax: 4e9, Bunch: 650e6,
		},
	}
	if err := s.SetThermal("wall", "wall"); err != nil {
		return Scenario{}, err
	}
	return s, nil
}
