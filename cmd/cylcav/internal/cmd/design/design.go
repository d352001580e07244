// Package design implements `cylcav design`: the D/L that puts a wanted
// mode on frequency with the widest spurious-mode clearance, with Q0,
// sensitivities, tolerance spread and cautions. The design flow itself is
// library package cylcav/design; this command parses its flags
// (cmdutil.ScenarioFlags) and formats its result. With no flags it runs
// the built-in demo scenario (design.Demo).
package design

import (
	"fmt"
	"io"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/design"
	"cylcav/physics"
)

// Options holds the parsed flags of `cylcav design`.
type Options struct {
	IO       *cmdutil.IOStreams
	Scenario design.Scenario
	Format   cmdutil.Format
	// HOMCSV selects the higher-order-mode table as the CSV output.
	HOMCSV bool
}

// NewCmdDesign returns `cylcav design`. runF, when not nil, replaces the
// run step (for tests of flag parsing).
func NewCmdDesign(io *cmdutil.IOStreams, runF func(*Options) error) *cobra.Command {
	opts := &Options{IO: io}
	var (
		checkFormat func() error
		scenario    *cmdutil.ScenarioFlags
		csvTable    string
	)
	cmd := &cobra.Command{
		Use:   "design [--mode MODE --freq F] [flags]",
		Short: "Choose D and L for the widest spurious-mode clearance (demo with no flags)",
		Long: `Choose the diameter D and length L that put a wanted mode on frequency with
the widest clearance from every other mode, or the highest unloaded Q0 that
keeps a minimum clearance, over an allowed range of D/L.

The clearance is the smallest |f_i - f_w| / f_w over all other modes; the
exact companion of the wanted mode (TE0mp with TM1mp) is reported apart as
needing suppression, unless --count-degenerate is given. The clearance must
hold along the whole tuning path (--tuning, one end plate moved) and over the
temperature range (--temp; the side wall and the end spacers may expand
differently). The optimum is exact, found from the crossings of the mode
chart's lines, not by a grid search; the output says when it sits on the
edge of the allowed range. Impossible requests exit with status 1 and say
what was achievable instead.

Temperatures: the design frequency holds at --operating-temp (default the
middle of --temp, else 20 C), where the walls' Q0 is taken; the dimensions
are also given at --machining-temp (default 20 C), so that a cavity
machined to them lands on frequency at the set-point. The metal's thermal
strain comes from published cryogenic contraction data (NIST fits for
copper, 6061-T6, 304/316 and invar; Ekin's table for niobium; see 'cylcav
materials') down to 0 K, and from a linear coefficient only between -50 C
and 200 C: a temperature outside the data exits with status 2. An air fill
is vented (--fill air, constant pressure) or sealed (--fill air-sealed,
constant density).

Superconducting walls: --superconducting with --wall niobium and the wall
temperature (--temperature 2K, the operating set-point) gives Q0 from the
BCS approximation with its BCS and residual parts. For a TM0mp mode the
accelerator flags add the transit-time factor, R/Q (linac convention,
V^2/(omega U)), G and the peak-field ratios; --gradient the dissipated
power, the heat load at the bath with the refrigerator power (common
practice: 20 % of Carnot) and the margins of the peak fields against the
niobium guides; --beam-current and --sync-phase the matched input coupling
(beta, Qext, loaded bandwidth, forward and reflected power with and without
detuning); --hom-max the monopole and dipole modes with R/Q, transverse R/Q,
T and Q0, flagged near the harmonics of --bunch-freq. A cold vacuum cavity
also gets its bench figures: the frequency of the machined cavity warm in
vacuum and in air. The figures hold for the closed pillbox; 'cylcav stack
--beta' gives T and R/Q of the monopoles of bodies with noses and steps.

With no flags at all, design runs a built-in demo scenario and says so on
its first line (--demo cell: the superconducting accelerator cell). --format
csv prints the trade-off curves (clearance and Q0 against D/L), or with
--csv-table hom the higher-order-mode table.

Mode index convention: TE_nmp / TM_nmp, n azimuthal, m radial, p axial.
Tolerances are read as 3-sigma limits of a normal distribution unless
--tolerance-dist uniform.`,
		Example: `  # The built-in demo scenario
  $ cylcav design

  # An air-filled copper TE011 cavity at 10 GHz, D/L between 0.5 and 3
  $ cylcav design --mode TE011 --freq 10GHz --fill air --wall copper --ratio-range 0.5:3

  # A niobium accelerator cell designed for 2 K, dimensions to machine at 20 C
  $ cylcav design --mode TM010 --freq 1.3GHz --wall niobium --temp 2K:300K --operating-temp 2K

  # A superconducting niobium TM010 cell at 2 K and 15 MV/m with a 2 mA beam
  $ cylcav design --mode TM010 --freq 1.3GHz --wall niobium --superconducting --temperature 2K --gradient 15MV/m --beam-current 2mA --ratio-range 1.5:1.6

  # Its monopole and dipole modes up to 4 GHz as CSV
  $ cylcav design --mode TM010 --freq 1.3GHz --wall niobium --superconducting --temperature 2K --hom-max 4GHz --ratio-range 1.5:1.6 --format csv --csv-table hom

  # Highest Q0 with at least 5 % clearance, +-1 % tuning, -20 C..60 C,
  # machined to +-0.02 mm, as JSON
  $ cylcav design --mode TE011 --freq 10GHz --wall copper --objective q \
      --min-clearance 5% --tuning 1% --temp -20C:60C --tolerance 0.02mm --format json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := checkFormat(); err != nil {
				return err
			}
			s, err := scenario.Scenario()
			if err != nil {
				return err
			}
			opts.Scenario = s
			switch csvTable {
			case "tradeoff":
			case "hom":
				if opts.Format != cmdutil.CSV {
					return cmdutil.Usagef("--csv-table hom needs --format csv")
				}
				if s.Accel == nil || s.Accel.HOMMax == 0 {
					return cmdutil.Usagef("--csv-table hom needs --hom-max, e.g. --hom-max 4GHz")
				}
				opts.HOMCSV = true
			default:
				return cmdutil.FlagError("csv-table", csvTable, fmt.Errorf("unknown table; use tradeoff|hom"))
			}
			if runF != nil {
				return runF(opts)
			}
			return runDesign(opts)
		},
	}
	scenario = cmdutil.AddScenarioFlags(cmd)
	checkFormat = cmdutil.FormatFlag(cmd, &opts.Format)
	cmd.Flags().StringVar(&csvTable, "csv-table", "tradeoff", "table written by --format csv: tradeoff (clearance and Q0 against D/L) | hom (the higher-order-mode table)")
	return cmd
}

func runDesign(opts *Options) error {
	r, err := cmdutil.RunScenario(opts.IO, opts.Scenario)
	if err != nil {
		return err // an InfeasibleError exits with status 1
	}
	switch opts.Format {
	case cmdutil.JSON:
		return cmdutil.WriteJSON(opts.IO.Out, JSON(r))
	case cmdutil.CSV:
		if opts.HOMCSV {
			return writeHOMCSV(opts.IO.Out, r.Accel.HOMs, opts.Scenario.Accel.Bunch, r.Design.Spec.Mode)
		}
		return writeCSV(opts.IO.Out, r.Analysis.Curve)
	}
	return WriteTable(opts.IO.Out, r)
}

// Sensitivity is the JSON form of the sensitivities.
type Sensitivity struct {
	DfDDHzPerM float64 `json:"df_dd_hz_per_m"`
	DfDLHzPerM float64 `json:"df_dl_hz_per_m"`
	DfDTHzPerK float64 `json:"df_dt_hz_per_k"`
}

// Tolerance is the JSON form of the Monte Carlo result.
type Tolerance struct {
	DiameterM          float64 `json:"diameter_tolerance_m"`
	LengthM            float64 `json:"length_tolerance_m"`
	Distribution       string  `json:"distribution"`
	Sigmas             float64 `json:"sigmas,omitempty"`
	Samples            int     `json:"samples"`
	Seed               uint64  `json:"seed"`
	MeanHz             float64 `json:"f_mean_hz"`
	StdHz              float64 `json:"f_std_hz"`
	P01Hz              float64 `json:"f_p01_hz"`
	P99Hz              float64 `json:"f_p99_hz"`
	LinearStdHz        float64 `json:"f_std_linear_hz"`
	WorstClearancePct  float64 `json:"worst_clearance_pct"`
	WorstClearanceMode string  `json:"worst_clearance_mode"`
}

// QBreakdown is the JSON form of the Q0 breakdown.
type QBreakdown struct {
	Wall      string   `json:"wall"`
	WallTempK float64  `json:"wall_temp_k"`
	QWall     float64  `json:"q_wall"`
	QFill     *float64 `json:"q_fill"`
	ShareSide float64  `json:"loss_share_side"`
	ShareEnds float64  `json:"loss_share_ends"`
	ShareFill float64  `json:"loss_share_fill"`
}

// Output is the JSON document of `cylcav design`.
type Output struct {
	Scenario string  `json:"scenario,omitempty"`
	Mode     string  `json:"mode"`
	FHz      float64 `json:"f_hz"`
	// DiameterM and LengthM hold at OperatingTempK; the machining
	// dimensions hold at MachiningTempK.
	OperatingTempK    float64 `json:"operating_temp_k"`
	DiameterM         float64 `json:"diameter_m"`
	LengthM           float64 `json:"length_m"`
	MachiningTempK    float64 `json:"machining_temp_k"`
	MachinedDiameterM float64 `json:"machined_diameter_m"`
	MachinedLengthM   float64 `json:"machined_length_m"`
	Ratio             float64 `json:"ratio_d_over_l"`
	ClearancePct      float64 `json:"clearance_pct"`
	WorstClearancePct float64 `json:"worst_clearance_pct"`
	WorstMode         string  `json:"worst_mode"`
	// WorstModes names every mode that ties for the worst case
	// (cavity.TieClearance), in mode order; WorstMode is the first.
	WorstModes []string `json:"worst_modes"`
	// Reach is the reachable D/L span (tuning, temperature and machining
	// tolerance) over which WorstClearancePct holds.
	ReachRatio [2]float64 `json:"reach_ratio_d_over_l"`
	// Offending lists the modes that cross the wanted one on the reachable
	// set or come within the required clearance of it.
	Offending   []Offender `json:"offending"`
	AtRangeEdge bool       `json:"at_range_edge"`
	// Limit names the bound that holds the optimum (a cavity.Limit); null
	// when none does.
	Limit        *string            `json:"limit"`
	Below        *cmdutil.Neighbour `json:"below"`
	Above        *cmdutil.Neighbour `json:"above"`
	Degenerate   []string           `json:"degenerate"`
	Q0           *float64           `json:"q0"`
	QBreakdown   *QBreakdown        `json:"q_breakdown,omitempty"`
	Sensitivity  Sensitivity        `json:"sensitivity"`
	TunedLengthM *[2]float64        `json:"tuned_length_m,omitempty"`
	DriftHz      *[2]float64        `json:"thermal_drift_hz,omitempty"`
	Tolerance    *Tolerance         `json:"tolerance"`
	// QSuperconducting, Bench and Accelerator are set for superconducting
	// walls, a cold vacuum cavity and an accelerator request.
	QSuperconducting *SplitOut   `json:"q_superconducting,omitempty"`
	Bench            *BenchOut   `json:"bench,omitempty"`
	Accelerator      *AccelOut   `json:"accelerator,omitempty"`
	Filling          *FillingOut `json:"filling,omitempty"`
	Cautions         []string    `json:"cautions"`
}

// Offender is the JSON form of a cavity.Offender.
type Offender struct {
	Mode         string  `json:"mode"`
	ClearancePct float64 `json:"clearance_pct"`
	Crosses      bool    `json:"crosses"`
	Ratio        float64 `json:"ratio_d_over_l"`
}

// OffendersJSON returns the JSON form of a reach's offending modes (an
// empty list, never null).
func OffendersJSON(r cavity.Reach) []Offender {
	out := []Offender{}
	for _, o := range r.Offending {
		out = append(out, Offender{Mode: o.Mode.String(), ClearancePct: 100 * o.Clearance, Crosses: o.Crosses, Ratio: o.Ratio})
	}
	return out
}

// JSON returns the JSON document of a result.
func JSON(r design.Result) Output {
	d, reach := r.Design, r.Analysis.Reach
	o := Output{
		Scenario: r.Scenario.Title,
		Mode:     d.Spec.Mode.String(), FHz: d.Spec.Frequency,
		DiameterM: d.Cavity.Diameter(), LengthM: d.Cavity.Length, Ratio: d.Ratio,
		MachinedDiameterM: r.Machined.Diameter(), MachinedLengthM: r.Machined.Length,
		ClearancePct: 100 * d.Clearance.Value, WorstClearancePct: 100 * reach.Worst,
		WorstMode: reach.WorstMode.String(), WorstModes: modeNames(reach.WorstModes), ReachRatio: [2]float64{reach.RatioLo, reach.RatioHi},
		Offending:   OffendersJSON(reach),
		AtRangeEdge: d.AtRangeEdge,
		Below:       cmdutil.NeighbourJSON(d.Clearance.Below), Above: cmdutil.NeighbourJSON(d.Clearance.Above),
		Degenerate:  cmdutil.DegenerateJSON(d.Clearance.Degenerate),
		Sensitivity: Sensitivity{DfDDHzPerM: r.Analysis.Sensitivity.DfDD, DfDLHzPerM: r.Analysis.Sensitivity.DfDL, DfDTHzPerK: r.Analysis.Sensitivity.DfDT},
		Cautions:    printedCautions(r),
	}
	o.OperatingTempK, o.MachiningTempK = r.Scenario.Temps()
	o.QSuperconducting, o.Bench, o.Accelerator = splitJSON(r.Split), benchJSON(r.Bench), accelJSON(r)
	o.Filling = fillingJSON(r.Filling)
	if d.Limit != cavity.NoLimit {
		l := string(d.Limit)
		o.Limit = &l
	}
	if !math.IsNaN(d.Q0) && !math.IsInf(d.Q0, 0) {
		q := d.Q0
		o.Q0 = &q
	}
	if u := r.Unloaded; u != nil {
		b := &QBreakdown{Wall: r.Scenario.Wall.Name, WallTempK: o.OperatingTempK, QWall: u.Wall.QWall, ShareSide: u.Share.Side, ShareEnds: u.Share.EndA + u.Share.EndB, ShareFill: u.Share.Fill}
		if !math.IsInf(u.QFill, 0) {
			q := u.QFill
			b.QFill = &q
		}
		o.QBreakdown = b
	}
	if d.Spec.Tuning > 0 {
		t := r.Analysis.TunedLength
		o.TunedLengthM = &t
	}
	if r.Scenario.TempGiven {
		t := r.Analysis.Drift
		o.DriftHz = &t
	}
	if sp := r.Analysis.Spread; sp != nil {
		t := r.Analysis.Settings.Tolerance
		o.Tolerance = &Tolerance{
			DiameterM: t.Diameter, LengthM: t.Length, Distribution: t.Distribution.String(),
			Samples: sp.Samples, Seed: t.Seed, MeanHz: sp.Mean, StdHz: sp.Std, P01Hz: sp.P01, P99Hz: sp.P99,
			LinearStdHz: sp.LinearStd, WorstClearancePct: 100 * sp.WorstClearance, WorstClearanceMode: sp.WorstMode.String(),
		}
		if t.Distribution == cavity.Normal {
			o.Tolerance.Sigmas = sigmas(t)
		}
	}
	return o
}

func sigmas(t cavity.Tolerance) float64 {
	if t.Sigmas == 0 {
		return cavity.DefaultSigmas
	}
	return t.Sigmas
}

func writeCSV(w io.Writer, c cavity.TradeOff) error {
	rows := make([][]string, len(c.Ratio))
	for i := range c.Ratio {
		q := ""
		if !math.IsNaN(c.Q0[i]) {
			q = g(c.Q0[i])
		}
		rows[i] = []string{g(c.Ratio[i]), g(c.Diameter[i]), g(c.Length[i]), g(100 * c.Clearance[i]), g(100 * c.WorstClearance[i]), q}
	}
	return cmdutil.WriteCSV(w, []string{"ratio_d_over_l", "diameter_m", "length_m", "clearance_pct", "worst_clearance_pct", "q0"}, rows)
}

func g(v float64) string { return strconv.FormatFloat(v, 'g', 10, 64) }

// WriteTable prints a result for people.
func WriteTable(w io.Writer, r design.Result) error {
	d := r.Design
	spec := d.Spec
	if r.Scenario.Title != "" {
		fmt.Fprintf(w, "Demo scenario (no flags given): %s\n\n", r.Scenario.Title)
	}
	operate, machine := r.Scenario.Temps()
	fmt.Fprintf(w, "Design: %s at %s with the cavity at %s, fill %s (mode indices: n azimuthal, m radial, p axial)\n",
		spec.Mode, physics.FormatFrequency(spec.Frequency, 7), physics.FormatTemperature(operate, 4), spec.Fill.Label())
	edge := "interior optimum"
	if r.RatioFixed() {
		edge = "fixed: the allowed range has zero width"
	} else if d.AtRangeEdge {
		edge = fmt.Sprintf("ON THE RANGE EDGE (%s)", d.Limit)
	} else if d.Limit != cavity.NoLimit {
		edge = fmt.Sprintf("held by %s", d.Limit)
	}
	if m := r.Machined; m != d.Cavity {
		fmt.Fprintf(w, "  diameter D = %s at %s (machining); %s at %s (operating)\n", physics.FormatLength(m.Diameter(), 6),
			physics.FormatTemperature(machine, 4), physics.FormatLength(d.Cavity.Diameter(), 6), physics.FormatTemperature(operate, 4))
		fmt.Fprintf(w, "  length   L = %s at %s (machining); %s at %s (operating)\n", physics.FormatLength(m.Length, 6),
			physics.FormatTemperature(machine, 4), physics.FormatLength(d.Cavity.Length, 6), physics.FormatTemperature(operate, 4))
	} else {
		fmt.Fprintf(w, "  diameter D = %s at %s\n", physics.FormatLength(d.Cavity.Diameter(), 6), physics.FormatTemperature(machine, 4))
		fmt.Fprintf(w, "  length   L = %s at %s\n", physics.FormatLength(d.Cavity.Length, 6), physics.FormatTemperature(machine, 4))
	}
	fmt.Fprintf(w, "  ratio  D/L = %.6f (allowed %.4g..%.4g; %s)\n", d.Ratio, d.AllowedRatio[0], d.AllowedRatio[1], edge)
	fmt.Fprintf(w, "\nClearance: %.3f %% (set by %s)", 100*d.Clearance.Value, d.Clearance.Limiting)
	if reach := r.Analysis.Reach; reach.Operation.Span() != "" || reach.Operation.MinClearance > 0 {
		fmt.Fprintf(w, "; %s", reach.Verdict())
	}
	fmt.Fprintln(w)
	fmt.Fprint(w, cmdutil.FormatNeighbours(d.Clearance))
	if u := r.Unloaded; u != nil {
		fmt.Fprintf(w, "\nUnloaded Q (%s walls at %s, smooth): Q0 = %s\n", r.Scenario.Wall.Name, physics.FormatTemperature(operate, 4), qOut(u.Q0))
		fmt.Fprintf(w, "  loss shares: side wall %.1f %%, end plates %.1f %%, fill %.1f %%\n",
			100*u.Share.Side, 100*(u.Share.EndA+u.Share.EndB), 100*u.Share.Fill)
	}
	writeAccelTable(w, r)
	s := r.Analysis.Sensitivity
	fmt.Fprintf(w, "\nSensitivities:\n")
	fmt.Fprintf(w, "  df/dD = %s per mm\n", signedF(s.DfDD*1e-3))
	fmt.Fprintf(w, "  df/dL = %s per mm\n", signedF(s.DfDL*1e-3))
	fmt.Fprintf(w, "  df/dT = %s per K (%.4g ppm/K) at %s%s\n", signedF(s.DfDT), 1e6*s.TempCoeff+0, physics.FormatTemperature(operate, 4), expansionText(r.Scenario))
	if spec.Tuning > 0 {
		fmt.Fprintf(w, "\nTuning +-%.4g %% by one end plate: L from %s (low end) to %s (high end)\n",
			100*spec.Tuning, physics.FormatLength(r.Analysis.TunedLength[0], 6), physics.FormatLength(r.Analysis.TunedLength[1], 6))
	}
	if r.Scenario.TempGiven {
		th := spec.Thermal
		fmt.Fprintf(w, "\nTemperature %s..%s: drift %s at the low end, %s at the high end, from %s at %s\n",
			physics.FormatTemperature(th.TMin, 4), physics.FormatTemperature(th.TMax, 4),
			signedF(r.Analysis.Drift[0]), signedF(r.Analysis.Drift[1]), physics.FormatFrequency(spec.Frequency, 7), physics.FormatTemperature(operate, 4))
		fmt.Fprintf(w, "  side wall: %s\n  length:    %s\n  fill:      %s\n", strainText(r.Scenario.Side), strainText(r.Scenario.Axial), fillTCText(r.Scenario.Fill))
	}
	if sp := r.Analysis.Spread; sp != nil {
		t := r.Analysis.Settings.Tolerance
		dist := "uniform"
		if t.Distribution == cavity.Normal {
			dist = fmt.Sprintf("normal, tolerance = %g sigma", sigmas(t))
		}
		fmt.Fprintf(w, "\nMachining tolerance D +-%s, L +-%s (%s), %d samples, seed %d:\n",
			physics.FormatLength(t.Diameter, 3), physics.FormatLength(t.Length, 3), dist, sp.Samples, t.Seed)
		fmt.Fprintf(w, "  f mean %s, std %s (linearised %s)\n", physics.FormatFrequency(sp.Mean, 8), physics.FormatFrequency(sp.Std, 4), physics.FormatFrequency(sp.LinearStd, 4))
		fmt.Fprintf(w, "  f 1st..99th percentile: %s .. %s\n", physics.FormatFrequency(sp.P01, 8), physics.FormatFrequency(sp.P99, 8))
		fmt.Fprintf(w, "  worst clearance among the samples: %.3f %% (%s)\n", 100*sp.WorstClearance, sp.WorstMode)
	}
	fmt.Fprintf(w, "\nCautions:\n")
	for _, c := range printedCautions(r) {
		fmt.Fprintf(w, "  - %s\n", c)
	}
	return nil
}

// printedCautions are the cautions design prints: the result's own, then
// the general caution for high RF power (cmdutil.CautionRF) as a sentence,
// unless the result already has the fuller one of a beam coupling
// (design.CautionHighPower), which covers it. The datasheet of `cylcav
// report` prints the result's own and, in place of the one-line RF
// caution, its fuller safety notes.
func printedCautions(r design.Result) []string {
	if slices.Contains(r.Cautions, design.CautionHighPower) {
		return slices.Clone(r.Cautions)
	}
	rf := strings.ToUpper(cmdutil.CautionRF[:1]) + cmdutil.CautionRF[1:] + "."
	return append(slices.Clone(r.Cautions), rf)
}

// expansionText says what df/dT assumes when no metal expands.
func expansionText(s design.Scenario) string {
	if !expands(s.Side) && !expands(s.Axial) {
		return "; ASSUMES WALLS THAT DO NOT EXPAND (no --wall, --alpha-side or --alpha-axial): the fill's part only"
	}
	return ""
}

// expands reports whether a metal has any thermal expansion data.
func expands(c physics.Conductor) bool {
	_, _, ok := c.StrainRange()
	return ok
}

// strainText names the thermal strain law of a metal.
func strainText(c physics.Conductor) string {
	switch {
	case !expands(c):
		return "no expansion data: taken not to expand"
	case c.Contraction.Known():
		return fmt.Sprintf("%s, integrated contraction data (%s; %.3g ppm/K above)", c.Name, c.Contraction.Label, 1e6*c.Expansion)
	}
	return fmt.Sprintf("%s, linear %.3g ppm/K (valid -50 C..200 C)", c.Name, 1e6*c.Expansion)
}

// fillTCText states the fill's temperature coefficient and what it
// assumes.
func fillTCText(f physics.Dielectric) string {
	switch {
	case f.Name == "" || f.Name == "vacuum":
		return "vacuum, no temperature coefficient"
	case !f.TCEpsKnown:
		return fmt.Sprintf("%s, temperature coefficient unknown: left out", f.Name)
	}
	return fmt.Sprintf("%s: %s; (1/eps) d eps/dT = %.3g ppm/K", f.Name, f.Description, 1e6*f.TCEps)
}

func signedF(v float64) string {
	if v < 0 {
		return "-" + physics.FormatFrequency(-v, 4)
	}
	return "+" + physics.FormatFrequency(v, 4)
}

// modeNames returns the labels of ms, never nil (an empty JSON list).
func modeNames(ms []cavity.Mode) []string {
	out := make([]string, 0, len(ms))
	for _, m := range ms {
		out = append(out, m.String())
	}
	return out
}

// qOut prints a Q whole, or with four significant digits from 1e7 up (a
// superconducting Q0 is known to a few per cent at best; every normal-metal
// Q stays below 1e7 and keeps its digits).
func qOut(q float64) string {
	if q >= 1e7 {
		return fmt.Sprintf("%.4g", q)
	}
	return fmt.Sprintf("%.0f", q)
}
