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
	// when Wall is set.
	Spec cavity.DesignSpec
	// Wall is the wall metal; nil means no Q0.
	Wall *physics.Conductor
	// Fill is the library row of the fill, with its description and source
	// for a datasheet; its Medium is Spec.Fill.
	Fill physics.Dielectric
	// TempGiven records whether a temperature range was asked for.
	TempGiven bool
	// Settings are the settings of the analysis of the optimum (the
	// machining tolerance, the curve points).
	Settings cavity.AnalysisSettings
}

// Result is the optimum with its analysis, Q breakdown and cautions.
type Result struct {
	Scenario Scenario
	Design   cavity.Design
	Analysis cavity.Analysis
	// Unloaded is the Q breakdown at the design; nil without a wall.
	Unloaded *qfactor.Unloaded
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
	return Scenario{
		Title: "TE011 reference cavity for the fictional Kestrel Point to Marrow Hill 10.5 GHz link (aluminium body, invar end spacers)",
		Spec: cavity.DesignSpec{
			Mode:      m,
			Frequency: 10.5e9,
			Fill:      air.Medium,
			RatioMin:  0.8, RatioMax: 2.5,
			Tuning: 0.005,
			Thermal: cavity.Thermal{
				AlphaRadial: wall.Expansion, AlphaAxial: invar.Expansion, TauEps: air.TCEps,
				TMin: tmin, TMax: tmax,
			},
		},
		Settings: cavity.AnalysisSettings{
			Tolerance: cavity.Tolerance{Diameter: 10e-6, Length: 10e-6, Samples: 200000, Seed: 1},
		},
		Wall:      &wall,
		Fill:      air,
		TempGiven: true,
	}, nil
}

// QFunc returns the unloaded-Q function of mode m for walls of metal wall
// (at 20 C, smooth) and the loss tangents of the cavity's fill, built on
// package qfactor.
func QFunc(m cavity.Mode, wall physics.Conductor) func(cavity.Cavity) (float64, error) {
	return qfactor.Q0Constraint(m, walls(wall))
}

// walls returns the wall set of metal wall on every part, at 20 C and
// smooth.
func walls(wall physics.Conductor) qfactor.WallSet {
	return qfactor.SameWalls(qfactor.Surface{Conductor: wall})
}

func unloaded(c cavity.Cavity, m cavity.Mode, wall physics.Conductor) (qfactor.Unloaded, error) {
	return qfactor.UnloadedQ(c, m, walls(wall).At(nil))
}

// Run solves the scenario: the optimum (cavity.Optimize), its analysis
// with s.Settings (cavity.Analyze), the Q breakdown at the design when a
// wall is given, and the cautions. progress, when not nil, receives the
// Monte Carlo progress. Errors of the optimisation are returned as they
// are (an impossible request is a *cavity.InfeasibleError).
func (s Scenario) Run(progress func(done, total int)) (Result, error) {
	spec := s.Spec
	if s.Wall != nil {
		spec.Q = QFunc(spec.Mode, *s.Wall)
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
	r := Result{Scenario: s, Design: d, Analysis: a}
	if s.Wall != nil {
		u, err := unloaded(d.Cavity, spec.Mode, *s.Wall)
		if err != nil {
			return Result{}, err
		}
		r.Unloaded = &u
	}
	r.Cautions = Cautions(r)
	return r, nil
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
	if d.AtRangeEdge {
		out = append(out, fmt.Sprintf("The optimum sits on the edge of the allowed D/L range (%s, D/L = %.4g); relaxing that limit may give more clearance.", d.Limit, d.Ratio))
	} else if d.Limit == cavity.LimitMinQ || d.Limit == cavity.LimitMinClearance {
		out = append(out, fmt.Sprintf("The optimum is held by the %s constraint.", d.Limit))
	}
	if d.Plateau[1] > d.Plateau[0]*(1+1e-9) {
		out = append(out, fmt.Sprintf("The best clearance holds over a whole band, D/L = %.4g..%.4g; the design takes %s on it.",
			d.Plateau[0], d.Plateau[1], plateauChoice(spec)))
	}
	if spec.Tuning > 0 || r.Scenario.TempGiven {
		if d.WorstClearance < d.Clearance.Value*(1-1e-9) {
			out = append(out, fmt.Sprintf("Over the tuning and temperature range the clearance falls to %.3f %% (%s), from %.3f %% at the nominal size.", 100*d.WorstClearance, d.WorstMode, 100*d.Clearance.Value))
		}
	}
	if r.Scenario.TempGiven {
		th := spec.Thermal
		if th.AlphaRadial == 0 && th.AlphaAxial == 0 {
			out = append(out, "A temperature range was given but no expansion coefficients (give --wall or --alpha-side/--alpha-axial): the drift shown is zero.")
		}
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
