package filter

import (
	"errors"
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"cylcav/cmd/cylcav/internal/cmdutil"
	bandpass "cylcav/filter"
	"cylcav/physics"
)

// The filter as a manufactured part: machining tolerance and yield with
// the screw tuning range (--tolerance), temperature drift (--temp) and
// power handling (--power). Each needs the cavities.

// Limits of the manufacturing flags.
const (
	// DefaultSamples is the default --samples.
	DefaultSamples = 2000
	// maxTolerance bounds --tolerance and its companions: 1 mm is far
	// beyond any filter's machining.
	maxTolerance = 1e-3 // m
	// minPower and maxPower bound --power, W.
	minPower = 1e-6
	maxPower = 1e9
	// minTemp and maxTemp bound --temp (the metals' data set the real
	// range, checked by the library).
	minTemp = 1.0  // K
	maxTemp = 1000 // K
)

// FabOptions are the parsed manufacturing flags.
type FabOptions struct {
	// Tolerance is set when --tolerance (or a companion) is given.
	Tolerance  bool
	Machining  bandpass.Machining
	Samples    int
	Seed       uint64
	ReturnLoss float64 // production return loss, dB; zero: the design's

	// Drift is set when --temp is given.
	Drift     bool
	TempLo    float64 // K
	TempHi    float64
	Rod       *physics.Conductor
	Reference float64 // K
	TempText  string  // --temp as given

	// Power is the input power, W; zero: no power analysis. Pressure is
	// the air pressure, Pa; zero: sea level.
	Power, Pressure float64
}

type fabFlags struct {
	tol, tolLen float64
	rod         physics.Conductor
	fs          *pflag.FlagSet
}

// addFabFlags registers the manufacturing flags on cmd.
func addFabFlags(cmd *cobra.Command, opts *Options) *fabFlags {
	f := cmd.Flags()
	fl := &fabFlags{fs: f}
	o := &opts.Fab
	cmdutil.LengthVar(f, &fl.tol, "tolerance", "machining tolerance +-t of every cavity's diameter and length (3 sigma), e.g. 0.01mm: yield, spread and tuning range", 0, maxTolerance)
	cmdutil.LengthVar(f, &fl.tolLen, "tolerance-length", "machining tolerance of the lengths if different from --tolerance", 0, maxTolerance)
	cmdutil.LengthVar(f, &o.Machining.Hole, "hole-tolerance", "tolerance +-t of every sized hole radius (with --holes), e.g. 0.01mm", 0, maxTolerance)
	cmdutil.FractionVar(f, &o.Machining.Coupling, "coupling-tolerance", "relative tolerance of every coupling not sized as a hole (ports, cross, main line without --holes), e.g. 2%", 0, 0.5)
	cmdutil.IntVar(f, &o.Samples, "samples", DefaultSamples, fmt.Sprintf("Monte Carlo samples, 2..%d", bandpass.MaxSamples), 2, bandpass.MaxSamples)
	f.Uint64Var(&o.Seed, "seed", 1, "Monte Carlo seed (same seed, same samples on any number of cores)")
	cmdutil.DecibelVar(f, &o.ReturnLoss, "accept-return-loss", "return loss a built filter must meet for yield and drift verdicts (default: the design's), e.g. 18dB", 0.1, bandpass.MaxReturnLoss)
	cmdutil.TemperatureRangeVar(f, &o.TempLo, &o.TempHi, "temp", "operating temperature range LO:HI for the drift, e.g. -20C:60C (body metal: --wall's)", minTemp, maxTemp)
	cmdutil.ConductorVar(f, &fl.rod, "rod-metal", "metal of the rods or spacers that set the cavity lengths (default: the body, --wall), e.g. invar")
	cmdutil.TemperatureVar(f, &o.Reference, "machining-temp", "temperature at which the dimensions hold (default 20C)", minTemp, maxTemp)
	cmdutil.PowerVar(f, &o.Power, "power", "input power for the stored energy, peak fields and air breakdown margin, e.g. 200W", minPower, maxPower)
	cmdutil.PressureVar(f, &o.Pressure, "pressure", "air pressure in the cavities for the breakdown field (default 1atm), e.g. 70kPa", bandpass.MinPressure, bandpass.MaxPressure)
	for _, c := range []string{"tolerance-length", "hole-tolerance", "coupling-tolerance", "samples", "seed"} {
		cmdutil.Needs(cmd, c, "tolerance", "tolerance-length", "hole-tolerance", "coupling-tolerance")
	}
	cmdutil.Needs(cmd, "rod-metal", "temp")
	cmdutil.Needs(cmd, "pressure", "power")
	cmdutil.Needs(cmd, "machining-temp", "temp")
	cmdutil.Needs(cmd, "accept-return-loss", "tolerance", "tolerance-length", "hole-tolerance", "coupling-tolerance", "temp")
	return fl
}

// checkFab checks the manufacturing flags against the others.
func (opts *Options) checkFab(changed func(string) bool, fl *fabFlags) error {
	o := &opts.Fab
	o.Tolerance = changed("tolerance") || changed("tolerance-length") || changed("hole-tolerance") || changed("coupling-tolerance")
	o.Drift = changed("temp")
	if !o.Tolerance && !o.Drift && !changed("power") {
		return nil
	}
	if !opts.Cavities {
		for _, n := range []string{"tolerance", "tolerance-length", "hole-tolerance", "coupling-tolerance", "temp", "power"} {
			if changed(n) {
				return cmdutil.Usagef("--%s needs the cavities: add --mode, --wall, --fill, --ratio or --holes", n)
			}
		}
	}
	if o.Tolerance {
		o.Machining.Diameter, o.Machining.Length = fl.tol, fl.tol
		if changed("tolerance-length") {
			o.Machining.Length = fl.tolLen
		}
		if changed("hole-tolerance") && opts.Hole == nil {
			return cmdutil.Usagef("--hole-tolerance needs --holes (the holes it applies to)")
		}
		if err := o.Machining.Validate(); err != nil {
			return cmdutil.Usagef("--tolerance: %v", strings.TrimPrefix(err.Error(), "filter: "))
		}
	}
	if changed("accept-return-loss") {
		if opts.Spec.Family != bandpass.Chebyshev {
			return cmdutil.Usagef("--accept-return-loss applies to a Chebyshev design (--response chebyshev)")
		}
		rl := opts.Spec.ReturnLoss
		if changed("ripple") {
			rl = bandpass.ReturnLossFromRipple(opts.Spec.Ripple)
		}
		if rl == 0 {
			rl = bandpass.DefaultReturnLoss
		}
		if o.ReturnLoss > rl {
			return cmdutil.FlagError("accept-return-loss", cmdutil.Text(fl.fs, "accept-return-loss"),
				fmt.Errorf("must be at most the design's return loss %.4g dB (a built filter is judged against a lower level than it was designed to)", rl))
		}
	}
	if o.Drift {
		if opts.Walls == nil {
			return cmdutil.Usagef("--temp needs the body metal: give --wall (its expansion data are used)")
		}
		if changed("rod-metal") {
			r := fl.rod
			o.Rod = &r
		}
		o.TempText = cmdutil.Text(fl.fs, "temp")
		if !changed("machining-temp") {
			o.Reference = physics.ZeroCelsius + 20
		}
	}
	return nil
}

// FabResult holds the manufacturing analyses that were asked for.
type FabResult struct {
	Yield  *bandpass.YieldResult
	Screws []bandpass.ScrewTuning
	Drift  *bandpass.DriftResult
	Power  *bandpass.PowerResult
}

// maskFrequencies are the points at which the spread of the response is
// reported: the band edges, f0 and every rejection frequency.
func maskFrequencies(d *bandpass.Design) []float64 {
	s := d.Spec
	fs := []float64{bandpass.BandpassFrequency(-1, s.F0, s.BW), s.F0, bandpass.BandpassFrequency(1, s.F0, s.BW)}
	for _, r := range s.Rejections {
		fs = append(fs, r.F)
	}
	return fs
}

// computeFab runs the manufacturing analyses of opts on result r.
func computeFab(opts *Options, r *Result) (*FabResult, error) {
	o := opts.Fab
	if !o.Tolerance && !o.Drift && o.Power == 0 {
		return nil, nil
	}
	d, re := r.Design, r.Realisation
	out := &FabResult{}
	if o.Tolerance {
		p := cmdutil.NewProgress(opts.IO, "tolerance")
		y, err := bandpass.Yield(d, re, bandpass.YieldOptions{Machining: o.Machining, Samples: o.Samples, Seed: o.Seed,
			Freqs: maskFrequencies(d), Verdict: true, ReturnLoss: o.ReturnLoss, Spurious: re.Spurious, Progress: p.Update})
		p.Done()
		if err != nil {
			return nil, err
		}
		out.Yield = y
		if out.Screws, err = bandpass.ScrewTunings(re, y.Tuning); err != nil {
			return nil, err
		}
	}
	if o.Drift {
		dr, err := bandpass.Drift(d, re, bandpass.DriftSpec{Body: opts.Walls.Side.Conductor, Rod: o.Rod, Reference: o.Reference,
			Low: o.TempLo, High: o.TempHi, ReturnLoss: o.ReturnLoss, Spurious: re.Spurious})
		if err != nil {
			// The metals' data set the range: a temperature outside it is
			// the user's input.
			return nil, cmdutil.FlagError("temp", o.TempText, errors.New(strings.TrimPrefix(err.Error(), "filter: ")))
		}
		out.Drift = dr
	}
	if o.Power > 0 {
		pw, err := bandpass.PowerHandling(d, re, bandpass.PowerSpec{Power: o.Power, Pressure: o.Pressure})
		if err != nil {
			return nil, err
		}
		out.Power = pw
	}
	return out, nil
}

// writeFabTable prints the manufacturing analyses for people.
func writeFabTable(w io.Writer, f *FabResult) error {
	if f == nil {
		return nil
	}
	var b strings.Builder
	if y := f.Yield; y != nil {
		fmt.Fprintf(&b, "\nMachining tolerance: %d samples, seed %d, errors normal with tolerance = 3 sigma; first-order sensitivities\n", y.Samples, y.Seed)
		fmt.Fprintf(&b, "Yield against the specification as machined (before tuning): %.1f %% +- %.1f %%", 100*y.Yield, 100*y.YieldStd)
		if y.Outside > 0 {
			fmt.Fprintf(&b, " (%.1f %% not checkable: outside the model)", 100*y.Outside)
		}
		b.WriteString("\n")
		tw := tabwriter.NewWriter(&b, 0, 0, 2, ' ', tabwriter.AlignRight)
		fmt.Fprintln(tw, "check\tat\trequired dB\tnominal dB\tmean dB\tstd dB\t5 %\t95 %\tmet\t")
		for _, l := range y.Lines {
			at := ""
			if l.F > 0 {
				at = physics.FormatFrequency(l.F, 6)
			}
			fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%.1f %%\t\n", l.Name, at, num(l.Required), num(l.Achieved), num(l.Scatter.Mean), num(l.Scatter.Std),
				num(l.P05), num(l.P95), 100*l.Met)
		}
		tw.Flush()
		for _, l := range y.Lines {
			if !l.Info && l.Verdict != bandpass.Met {
				b.WriteString("The design itself does not meet every line (see the specification check above; a spurious resonance or the model range decides such a line for every sample): the yield counts that.\n")
				break
			}
		}
		b.WriteString("Spread of the response at the mask points (Monte Carlo std and the linearised std):\n")
		tw = tabwriter.NewWriter(&b, 0, 0, 2, ' ', tabwriter.AlignRight)
		fmt.Fprintln(tw, "f\tS21 dB\tstd\tlinear\tS11 dB\tstd\tlinear\t")
		for _, p := range y.Points {
			fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\t\n", physics.FormatFrequency(p.F, 6), num(p.S21DB.Nominal), num(p.S21DB.Std), num(p.S21DB.Linear),
				num(p.S11DB.Nominal), num(p.S11DB.Std), num(p.S11DB.Linear))
		}
		tw.Flush()
		b.WriteString("Tuning each resonator needs (range of its frequency error over the samples) and the screw (Slater, hemispherical tip):\n")
		tw = tabwriter.NewWriter(&b, 0, 0, 2, ' ', tabwriter.AlignRight)
		fmt.Fprintln(tw, "resonator\terror low\terror high\tspan\tscrew at\ttip radius\tSlater valid\t")
		for _, s := range f.Screws {
			at := fmt.Sprintf("end plate rho %s", physics.FormatLength(s.At.Rho, 3))
			if s.OnSide {
				at = fmt.Sprintf("side wall z %s", physics.FormatLength(s.At.Z, 3))
			}
			rad, valid := "-", "-"
			if !math.IsNaN(s.Radius) {
				rad, valid = physics.FormatLength(s.Radius, 3), yesNo(s.Valid)
			}
			fmt.Fprintf(tw, "%d\t%s\t%s\t%s\t%s\t%s\t%s\t\n", s.Resonator, physics.FormatFrequency(s.Low, 4), physics.FormatFrequency(s.High, 4),
				physics.FormatFrequency(s.Span, 4), at, rad, valid)
		}
		tw.Flush()
		b.WriteString("The Slater model holds for a tip radius up to 5 % of the wavelength and 20 % of the gap to the other walls; a deeper screw needs a field solver or measurement.\n")
	}
	if dr := f.Drift; dr != nil {
		fmt.Fprintf(&b, "\nTemperature drift (dimensions at %s; couplings and Q0 kept):\n", physics.FormatTemperature(dr.Reference, 5))
		tw := tabwriter.NewWriter(&b, 0, 0, 2, ' ', tabwriter.AlignRight)
		fmt.Fprintf(tw, "resonator\tdf/dT\tshift at %s\tshift at %s\t\n", physics.FormatTemperature(dr.Low.T, 5), physics.FormatTemperature(dr.High.T, 5))
		for i := range dr.DfDT {
			fmt.Fprintf(tw, "%d\t%s/K\t%s\t%s\t\n", i+1, physics.FormatFrequency(dr.DfDT[i], 4), physics.FormatFrequency(dr.Low.Shift[i], 4), physics.FormatFrequency(dr.High.Shift[i], 4))
		}
		tw.Flush()
		for _, e := range []bandpass.DriftEnd{dr.Low, dr.High} {
			fmt.Fprintf(&b, "Specification at %s: %s", physics.FormatTemperature(e.T, 5), e.Verdict)
			for _, c := range e.Checks {
				if !c.Info && c.Verdict != bandpass.Met {
					fmt.Fprintf(&b, "; %s %s", c.Name, num(c.Achieved))
					if c.F > 0 {
						fmt.Fprintf(&b, " dB at %s", physics.FormatFrequency(c.F, 6))
					} else {
						b.WriteString(" dB")
					}
				}
			}
			b.WriteString("\n")
		}
	}
	if p := f.Power; p != nil {
		fmt.Fprintf(&b, "\nPower handling at %s input (largest stored energy over the passband; breakdown field %s, air at %.4g kPa):\n",
			physics.FormatSI(p.Power, "W", 4), fieldText(p.Breakdown), p.Pressure/1e3)
		tw := tabwriter.NewWriter(&b, 0, 0, 2, ' ', tabwriter.AlignRight)
		fmt.Fprintln(tw, "resonator\tenergy\tat\tpeak E\twall H\tmargin\tpower limit\t")
		for _, r := range p.Resonators {
			fmt.Fprintf(tw, "%d\t%s\t%s\t%s\t%s\t%.3g x\t%s\t\n", r.Resonator, physics.FormatSI(r.Energy, "J", 4), physics.FormatFrequency(r.F, 6),
				fieldText(r.EPeak), physics.FormatSI(r.HWall, "A/m", 4), r.Margin, physics.FormatSI(r.MaxPower, "W", 4))
		}
		tw.Flush()
		fmt.Fprintf(&b, "Power limit (first estimate): %s, set by resonator %d.\n", physics.FormatSI(p.Limit, "W", 4), p.Worst)
		for _, c := range p.Cautions {
			fmt.Fprintf(&b, "CAUTION: %s\n", c)
		}
	}
	_, err := io.WriteString(w, b.String())
	return err
}

func num(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "-"
	}
	return fmt.Sprintf("%.4g", v)
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

func fieldText(v float64) string { return fmt.Sprintf("%.4g MV/m", v/1e6) }

// FabOut is the JSON form of the manufacturing analyses (SI units).
type FabOut struct {
	Tolerance *ToleranceOut `json:"tolerance,omitempty"`
	Drift     *DriftOut     `json:"drift,omitempty"`
	Power     *PowerOut     `json:"power,omitempty"`
}

// ToleranceOut is the JSON form of the Monte Carlo.
type ToleranceOut struct {
	Samples            int              `json:"samples"`
	Seed               uint64           `json:"seed"`
	ToleranceD         float64          `json:"tolerance_diameter_m"`
	ToleranceL         float64          `json:"tolerance_length_m"`
	ToleranceHole      float64          `json:"tolerance_hole_radius_m"`
	ToleranceCoupling  float64          `json:"tolerance_coupling_relative"`
	Distribution       string           `json:"distribution"`
	Yield              float64          `json:"yield"`
	YieldStd           float64          `json:"yield_std"`
	OutsideModel       float64          `json:"outside_model_fraction"`
	AcceptReturnLossDB *float64         `json:"accept_return_loss_db"`
	Lines              []LineSpreadOut  `json:"checks"`
	Points             []PointSpreadOut `json:"points"`
	Tuning             []TuningOut      `json:"tuning"`
}

// LineSpreadOut is one check line over the samples.
type LineSpreadOut struct {
	Name       string   `json:"name"`
	F          float64  `json:"f_hz"`
	RequiredDB *float64 `json:"required_db"`
	NominalDB  *float64 `json:"nominal_db"`
	MeanDB     *float64 `json:"mean_db"`
	StdDB      *float64 `json:"std_db"`
	MinDB      *float64 `json:"min_db"`
	MaxDB      *float64 `json:"max_db"`
	P05DB      *float64 `json:"p05_db"`
	P95DB      *float64 `json:"p95_db"`
	Met        float64  `json:"met_fraction"`
	Info       bool     `json:"info"`
}

// PointSpreadOut is the response spread at one frequency.
type PointSpreadOut struct {
	F           float64  `json:"f_hz"`
	S21DB       *float64 `json:"s21_db"`
	S21StdDB    *float64 `json:"s21_std_db"`
	S21LinearDB *float64 `json:"s21_linear_std_db"`
	S11DB       *float64 `json:"s11_db"`
	S11StdDB    *float64 `json:"s11_std_db"`
	S11LinearDB *float64 `json:"s11_linear_std_db"`
}

// TuningOut is one resonator's tuning range and screw.
type TuningOut struct {
	Resonator    int      `json:"resonator"`
	ErrorLow     float64  `json:"error_low_hz"`
	ErrorHigh    float64  `json:"error_high_hz"`
	Span         float64  `json:"span_hz"`
	ScrewOnSide  bool     `json:"screw_on_side_wall"`
	ScrewRho     float64  `json:"screw_rho_m"`
	ScrewZ       float64  `json:"screw_z_m"`
	ShiftPerCube float64  `json:"shift_per_radius_cubed_hz_per_m3"`
	TipRadius    *float64 `json:"tip_radius_m"`
	SlaterValid  bool     `json:"slater_valid"`
}

// DriftOut is the JSON form of the temperature drift.
type DriftOut struct {
	Reference float64       `json:"reference_k"`
	DfDT      []float64     `json:"df_dt_hz_per_k"`
	Ends      []DriftEndOut `json:"ends"`
}

// DriftEndOut is one end of the range.
type DriftEndOut struct {
	T       float64    `json:"t_k"`
	F       []float64  `json:"f_hz"`
	Shift   []float64  `json:"shift_hz"`
	Verdict string     `json:"verdict"`
	Pass    bool       `json:"pass"`
	Checks  []CheckOut `json:"checks"`
}

// PowerOut is the JSON form of the power handling.
type PowerOut struct {
	Power      float64             `json:"power_w"`
	Pressure   float64             `json:"pressure_pa"`
	Breakdown  float64             `json:"breakdown_v_per_m"`
	Resonators []ResonatorPowerOut `json:"resonators"`
	Limit      float64             `json:"power_limit_w"`
	Worst      int                 `json:"limiting_resonator"`
	Cautions   []string            `json:"cautions"`
}

// ResonatorPowerOut is one resonator's power handling.
type ResonatorPowerOut struct {
	Resonator int     `json:"resonator"`
	Energy    float64 `json:"energy_j"`
	F         float64 `json:"f_hz"`
	EPeak     float64 `json:"e_peak_v_per_m"`
	HWall     float64 `json:"h_wall_a_per_m"`
	Margin    float64 `json:"margin"`
	MaxPower  float64 `json:"power_limit_w"`
}

// json returns the JSON form of f.
func (f *FabResult) json() *FabOut {
	if f == nil {
		return nil
	}
	o := &FabOut{}
	if y := f.Yield; y != nil {
		t := &ToleranceOut{Samples: y.Samples, Seed: y.Seed, Distribution: "normal, tolerance = 3 sigma",
			Yield: y.Yield, YieldStd: y.YieldStd, OutsideModel: y.Outside,
			Lines: []LineSpreadOut{}, Points: []PointSpreadOut{}, Tuning: []TuningOut{}}
		t.ToleranceD, t.ToleranceL = y.Machining.Diameter, y.Machining.Length
		t.ToleranceHole, t.ToleranceCoupling = y.Machining.Hole, y.Machining.Coupling
		if y.ReturnLoss > 0 {
			rl := y.ReturnLoss
			t.AcceptReturnLossDB = &rl
		}
		for _, l := range y.Lines {
			t.Lines = append(t.Lines, LineSpreadOut{Name: l.Name, F: l.F, RequiredDB: finite(l.Required), NominalDB: finite(l.Achieved),
				MeanDB: finite(l.Scatter.Mean), StdDB: finite(l.Scatter.Std), MinDB: finite(l.Scatter.Min), MaxDB: finite(l.Scatter.Max),
				P05DB: finite(l.P05), P95DB: finite(l.P95), Met: l.Met, Info: l.Info})
		}
		for _, p := range y.Points {
			t.Points = append(t.Points, PointSpreadOut{F: p.F, S21DB: finite(p.S21DB.Nominal), S21StdDB: finite(p.S21DB.Std), S21LinearDB: finite(p.S21DB.Linear),
				S11DB: finite(p.S11DB.Nominal), S11StdDB: finite(p.S11DB.Std), S11LinearDB: finite(p.S11DB.Linear)})
		}
		for _, s := range f.Screws {
			t.Tuning = append(t.Tuning, TuningOut{Resonator: s.Resonator, ErrorLow: s.Low, ErrorHigh: s.High, Span: s.Span,
				ScrewOnSide: s.OnSide, ScrewRho: s.At.Rho, ScrewZ: s.At.Z, ShiftPerCube: s.PerCube, TipRadius: finite(s.Radius), SlaterValid: s.Valid})
		}
		o.Tolerance = t
	}
	if dr := f.Drift; dr != nil {
		do := &DriftOut{Reference: dr.Reference, DfDT: dr.DfDT}
		for _, e := range []bandpass.DriftEnd{dr.Low, dr.High} {
			eo := DriftEndOut{T: e.T, F: e.F, Shift: e.Shift, Verdict: verdictKey(e.Verdict), Pass: e.Verdict == bandpass.Met, Checks: []CheckOut{}}
			for _, c := range e.Checks {
				eo.Checks = append(eo.Checks, checkOut(c))
			}
			do.Ends = append(do.Ends, eo)
		}
		o.Drift = do
	}
	if p := f.Power; p != nil {
		po := &PowerOut{Power: p.Power, Pressure: p.Pressure, Breakdown: p.Breakdown, Limit: p.Limit, Worst: p.Worst, Cautions: p.Cautions}
		for _, r := range p.Resonators {
			po.Resonators = append(po.Resonators, ResonatorPowerOut{Resonator: r.Resonator, Energy: r.Energy, F: r.F, EPeak: r.EPeak,
				HWall: r.HWall, Margin: r.Margin, MaxPower: r.MaxPower})
		}
		o.Power = po
	}
	return o
}

// checkOut is the JSON form of one check line (the spurious mode that
// fails a line is added by the caller that has it).
func checkOut(c bandpass.Check) CheckOut {
	co := CheckOut{Name: c.Name, Required: finite(c.Required), Achieved: finite(c.Achieved), AtLeast: c.AtLeast, Pass: c.Pass,
		Verdict: verdictKey(c.Verdict), Stated: !c.Info, Note: c.Note}
	if c.Info {
		co.Verdict = "info"
	}
	if c.F != 0 {
		co.F = finite(c.F)
	}
	if c.Band[1] > 0 {
		b := c.Band
		co.Band = &b
	}
	if c.Worst != 0 && !math.IsNaN(c.Achieved) {
		co.WorstF = finite(c.Worst)
	}
	return co
}
