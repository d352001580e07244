// Package resonances implements `cylcav resonances`: read a measured sweep
// (Touchstone), find every resonance in it, fit each by the linear
// fractional (Q-circle) method and print f0, loaded Q, couplings and
// unloaded Q with their uncertainties; optionally plot the sweep and each
// fit.
package resonances

import (
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"cylcav/benchplot"
	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/figure"
	"cylcav/measure"
	"cylcav/physics"
	"cylcav/qfactor"
	"cylcav/touchstone"
)

// Options are the validated inputs of `cylcav resonances`.
type Options struct {
	IO     *cmdutil.IOStreams
	Format cmdutil.Format

	File  string // the sweep file
	Empty string // the empty cavity's sweep (--empty); File is then the filled one
	// Disc, when set (--sample-thickness), makes the filled sweep the
	// cavity with a full-diameter disc of that thickness on one end plate,
	// measured by measure.MeasureDiscFill instead of a complete fill.
	Disc     *measure.DiscSpec
	Settings measure.Settings

	// Identify is set when the cavity's nominal size was given: the modes
	// are then named (measure.Identify).
	Identify bool
	Ident    measure.IdentifySettings

	// Hint, when set (--mode-hint), replaces the drawn size: the starting
	// cavity comes from measure.CavityFromHint.
	Hint     *measure.ModeHint
	hintText string // --mode-hint as given
	hinted   *measure.HintSearch

	// Walls, when set (--wall), gives each identified mode's model Q0 for
	// the wall diagnosis.
	Walls *qfactor.WallSet

	Plot     string // whole-sweep plot file, "" for none
	FitPlots string // BASE.EXT: one plot per resonance, BASE-1.EXT, ...
	Page     figure.Page
	Force    bool
}

// NewCmdResonances returns `cylcav resonances`. runF, when not nil,
// receives the options instead of the default run (for tests).
func NewCmdResonances(io *cmdutil.IOStreams, runF func(*Options) error) *cobra.Command {
	opts := &Options{IO: io}
	var geo *cmdutil.GeometryFlags
	var walls *cmdutil.WallFlags
	var hint string
	var sampleT, sampleTErr float64
	cmd := &cobra.Command{
		Use:   "resonances SWEEP.s1p|SWEEP.s2p [flags]",
		Short: "Find and fit the resonances of a measured sweep: f0, loaded Q, coupling, Q0",
		Long: `Read a sweep measured on a network analyser, as a Touchstone 1.1 or 2.0
file (one port: reflection, S11; two ports: transmission, S21 with S11 and
S22), find every resonance in it, and fit each with the linear fractional
(Q-circle) method of Kajfez (1994), which removes the cable delay and a
coupling loss.

For each resonance it prints the resonant frequency f0, the loaded Q, the
coupling coefficient of each port (reflection: from the circle's diameter;
transmission: from the S11 and S22 circles), the unloaded Q0 = QL(1 + sum
beta), each with its standard uncertainty from the fit residuals, and the
loaded Q from the 3 dB bandwidth of the magnitude with a check of whether
the two agree (they differ when leakage, cable delay or coupling loss
distort the magnitude; trust the fit then).

Resonances are peaks of |S21| standing --min-height dB above the
background (default 10 dB) or dips of |S11| (default 1 dB). Each fit uses
the points within --window half-power bandwidths of the peak (default 3).

With the cavity's nominal size (--diameter or --radius, --length, and
--fill when filled) each resonance is also given its mode: the effective
D and L are fitted to the measured frequencies (or, with --fit-fill, the
fill's permittivity with D and L held), every resonance goes to the
nearest mode of the fitted cavity, a TE0mp/TM1mp pair split in two is
resolved by Q (TE0mp has the higher Q) and its splitting printed, and a
resonance that matches no mode within 0.3 % is flagged (a coupling
structure's own resonance, or a cavity far from its drawing).

With the size, each named mode's Q0 also gives the conductivity of smooth
uniform walls that would explain it, its spread across modes, and a TE0mp
vs TM comparison that points at the end-plate joints; with --wall METAL,
the model's Q0 and the equivalent RMS roughness of that metal under
--roughness-model (a mode losing more than any roughness explains is
marked so).

Without the drawn size, --mode-hint MODE@FREQ names the mode of one
resonance (the one nearest FREQ, within 2 %), e.g. TE011@10.36GHz: the
ratio D/L between 0.2 and 5 that puts modes nearest the most other
resonances (discounting the matches a dense spectrum gives by chance)
starts the same fit. It says when another ratio fits about as well; then
give a second resonance's mode by measuring with a different coupling, or
the drawn size.

With --empty EMPTY, the main sweep is the same cavity completely filled
with a dielectric (nominal value from --fill): the empty sweep gives the
effective D and L (and, with --wall, the wall diagnosis); the filled sweep,
identified in that cavity, gives the fill's eps_r = (f_empty/f_filled)^2
and loss tangent from the two Q0 values of each mode found in both, with
their uncertainties (fits and wall model; the dimensions cancel).

With --sample-thickness T as well, the main sweep is the cavity with a
dielectric disc of its full diameter and thickness T lying on one end
plate (nominal permittivity from --fill): each TE0mp mode identified in the
empty sweep is paired with the loaded resonance nearest the disc model's
prediction, and eps_r is the root of the transverse-resonance equation of
the layered cavity that gives the measured frequency ratio; tan delta
follows from the loaded Q0, the disc's electric filling factor and the
wall Q scaled from the empty Q0. The budget adds the fitted D and L and
--sample-thickness-tol (the thickness's standard uncertainty).

--plot writes the sweep with the resonances numbered (and their modes,
when named); --fit-plots BASE.EXT
writes one plot per resonance (BASE-1.EXT, BASE-2.EXT, ...): measured
points against the fitted curve, in dB and in the complex plane. The file
type follows the extension: .png, .svg or .pdf. Existing files are
replaced only with --force.`,
		Example: `  # The invented bench sweep shipped with cylcav (five resonances, 4-6 GHz;
  # run from the source tree)
  $ cylcav resonances testdata/measure/wide.s2p
  testdata/measure/wide.s2p: 4001 points, transmission (2-port), 5 resonances
  ...
  5  5.83000033 ± 0.00000027  2871.78 ± 0.77  0.120018 ± 0.000011    0.1000190 ± 0.0000099  3503.67 ± 0.94  2857    agrees

  # The same as CSV; add --plot sweep.svg --fit-plots fit.svg for pictures
  $ cylcav resonances testdata/measure/wide.s2p --format csv

  # Name the modes of a stainless test cavity drawn as D = 40 mm, L = 31 mm,
  # and compare its walls with stainless steel 304
  $ cylcav resonances testdata/measure/modes.s2p --diameter 40mm --length 31mm --wall ss304
  ...
  Effective cavity: D = 40.0768 ± 0.0074 mm, L = 30.8473 ± 0.0096 mm (drawn 40.0000 mm, 31.0000 mm); RMS residual 266 ppm.
  Resonances 8 (TE011) and 7 (TM111): a degenerate pair split by 40.00 MHz; the higher Q is taken as TE011.
  ...
  Mean 2.0 % IACS (1.15 MS/m), spread 0.6 % IACS across 8 modes; TE0mp modes 2.6 %, TM modes 1.4 %.

  # The same cavity without its drawing: only the TE011 resonance is known
  $ cylcav resonances testdata/measure/modes.s2p --mode-hint TE011@10.36GHz

  # Measure a fill: the same cavity empty and completely filled with PTFE
  $ cylcav resonances testdata/measure/modes_filled.s2p --empty testdata/measure/modes.s2p --diameter 40mm --length 31mm --fill ptfe
  ...
  Mean over 8 modes (weighted): eps_r = 2.07999899 ± 0.00000090, tan delta = 3.85 ± 0.15 e-4 (uncertainty of the best mode: the wall-model term is common to all).

  # Measure a 2 mm ceramic disc lying on one end plate of a TE01p test cavity
  $ cylcav resonances testdata/measure/disc_loaded.s2p --empty testdata/measure/disc_empty.s2p --diameter 36mm --length 26mm --fill eps=9.5 --sample-thickness 2mm --sample-thickness-tol 10um
  ...
  Mean over 2 modes (weighted): eps_r = 9.900 ± 0.082, tan delta = 4.97 ± 0.19 e-4 (uncertainty of the best mode: the wall-model term is common to all).`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := opts.parse(cmd, args, geo, walls, hint); err != nil {
				return err
			}
			if sampleT > 0 {
				opts.Disc = &measure.DiscSpec{Thickness: sampleT, ThicknessErr: sampleTErr, NominalEps: opts.Ident.Nominal.Fill.Eps()}
				if !(sampleT < opts.Ident.Nominal.Length) {
					return cmdutil.Usagef("--sample-thickness %s must be less than the cavity length %s", cmdutil.Text(cmd.Flags(), "sample-thickness"), cmdutil.Text(cmd.Flags(), "length"))
				}
				if !(sampleTErr < sampleT/2) {
					// A standard uncertainty this large makes the
					// linearised budget meaningless (the thickness could
					// be zero within two sigma).
					return cmdutil.FlagError("sample-thickness-tol", cmdutil.Text(cmd.Flags(), "sample-thickness-tol"),
						fmt.Errorf("must be below half the --sample-thickness %s", cmdutil.Text(cmd.Flags(), "sample-thickness")))
				}
			}
			if runF != nil {
				return runF(opts)
			}
			return runResonances(opts)
		},
	}
	f := cmd.Flags()
	checkFormat := cmdutil.FormatFlag(cmd, &opts.Format)
	cmdutil.DecibelVar(f, &opts.Settings.Find.MinHeight, "min-height", "smallest peak height (dip depth) above the background, e.g. 20dB (default 10 dB peaks, 1 dB dips)", 0.1, 200)
	cmdutil.NumberVar(f, &opts.Settings.Window, "window", "half width of each fitted window, in half-power bandwidths", 1, 20)
	cmdutil.SetDefault(f, "window", "3")
	geo = cmdutil.AddGeometryFlags(cmd, cmdutil.Geometry{
		Diameter: "nominal inside diameter, to name the modes, e.g. 40mm",
		Radius:   "nominal inside radius, to name the modes, e.g. 20mm",
		Length:   "nominal inside length, to name the modes, e.g. 31mm",
		Fill:     "fill dielectric: library name or eps=...,tand=... (default vacuum)",
	})
	walls = cmdutil.AddWallFlags(cmd)
	f.StringVar(&opts.Empty, "empty", "", "sweep of the same cavity empty: the main sweep is then the cavity completely filled, and the fill is measured (needs --diameter, --length, --fill)")
	cmdutil.LengthVar(f, &sampleT, "sample-thickness", "with --empty: the main sweep has a full-diameter dielectric disc of this thickness on one end plate, e.g. 2mm", cavity.MinSize, cavity.MaxSize)
	cmdutil.LengthVar(f, &sampleTErr, "sample-thickness-tol", "standard uncertainty of --sample-thickness, e.g. 10um (default 0: left out of the budget)", 1e-9, cavity.MaxSize)
	cmdutil.Needs(cmd, "sample-thickness", "empty")
	cmdutil.Needs(cmd, "sample-thickness-tol", "sample-thickness")
	f.StringVar(&hint, "mode-hint", "", "without the drawn size: the mode of one resonance, MODE@FREQ, e.g. TE011@10.36GHz")
	f.BoolVar(&opts.Ident.FitFill, "fit-fill", false, "fit the fill's permittivity with D and L held, instead of D and L")
	f.StringVar(&opts.Plot, "plot", "", "write the sweep with the fitted resonances to this file (.png, .svg, .pdf)")
	f.StringVar(&opts.FitPlots, "fit-plots", "", "write one plot per resonance to BASE-1.EXT, BASE-2.EXT, ... (.png, .svg, .pdf)")
	cmdutil.IntVar(f, &opts.Page.DPI, "dpi", figure.DefaultDPI, "resolution of PNG output, dots per inch", figure.MinDPI, figure.MaxDPI)
	f.BoolVar(&opts.Force, "force", false, "replace output files that exist")
	cmdutil.Needs(cmd, "dpi", "plot", "fit-plots")
	cmdutil.Needs(cmd, "force", "plot", "fit-plots")
	cmd.PreRunE = func(*cobra.Command, []string) error { return checkFormat() }
	return cmd
}

func (opts *Options) parse(cmd *cobra.Command, args []string, geo *cmdutil.GeometryFlags, walls *cmdutil.WallFlags, hint string) error {
	if err := cmdutil.RejectEmptyFlags(cmd); err != nil {
		return err
	}
	if cmd.Flags().Changed("mode-hint") {
		for _, name := range []string{"diameter", "radius", "length", "empty", "fit-fill"} {
			if cmd.Flags().Changed(name) {
				return cmdutil.Usagef("--mode-hint replaces the drawn size; leave out --%s", name)
			}
		}
		h, err := parseHint(hint)
		if err != nil {
			return err
		}
		fill, err := geo.Fill()
		if err != nil {
			return err
		}
		opts.Hint, opts.hintText, opts.Identify, opts.Ident.Nominal.Fill = &h, hint, true, fill
	} else if geo.Changed("diameter") || geo.Changed("radius") || geo.Changed("length") || geo.Changed("fill") {
		c, err := geo.Cavity()
		if err != nil {
			return err
		}
		opts.Identify, opts.Ident.Nominal = true, c
	} else if opts.Ident.FitFill {
		return cmdutil.Usagef("--fit-fill needs the cavity's size: give --diameter (or --radius) and --length")
	}
	if opts.Empty != "" {
		switch {
		case !opts.Identify:
			return cmdutil.Usagef("--empty needs the cavity's size: give --diameter (or --radius) and --length")
		case !geo.Changed("fill") || !(opts.Ident.Nominal.Fill.Eps() > 1):
			return cmdutil.Usagef("--empty needs the nominal fill of the filled sweep, with eps_r > 1: give --fill, e.g. --fill ptfe or --fill eps=2.1")
		case opts.Ident.FitFill:
			return cmdutil.Usagef("--empty fits the fill already; leave out --fit-fill")
		}
	}
	for _, name := range []string{"wall", "end-wall", "end-wall-a", "end-wall-b", "roughness", "roughness-model", "temperature", "plating", "plating-thickness", "superconducting", "residual"} {
		if !cmd.Flags().Changed(name) {
			continue
		}
		if !opts.Identify {
			return cmdutil.Usagef("--%s needs the cavity's size: give --diameter (or --radius) and --length", name)
		}
		ws, err := walls.Walls()
		if err != nil {
			return err
		}
		opts.Walls = &ws
		break
	}
	if opts.Format == cmdutil.CSV {
		// The CSV has one row per resonance: the fill and the wall
		// diagnosis, results for the cavity, would be dropped unsaid.
		switch {
		case opts.Empty != "":
			return cmdutil.Usagef("--empty measures the fill, shown in table and JSON output; with --format csv (one row per resonance) it would be lost: use --format json")
		case opts.Walls != nil:
			return cmdutil.Usagef("--wall gives the wall diagnosis, shown in table and JSON output; with --format csv (one row per resonance) it would be lost: use --format json or leave out the wall flags")
		}
	}
	opts.File = args[0]
	for _, p := range []struct{ flag, path string }{{"plot", opts.Plot}, {"fit-plots", opts.FitPlots}} {
		if p.path == "" {
			continue
		}
		if _, err := figure.FormatOf(p.path); err != nil {
			return cmdutil.FlagError(p.flag, p.path, err)
		}
	}
	if opts.Plot != "" {
		// The fit plots' names depend on the resonances found: they are
		// checked with the plot once the sweep is analysed, before any
		// file is written.
		if err := cmdutil.CheckFiles(opts.Force, cmdutil.File{Flag: "plot", Path: opts.Plot}); err != nil {
			return err
		}
	}
	return nil
}

// parseHint parses --mode-hint MODE@FREQ.
func parseHint(v string) (measure.ModeHint, error) {
	mode, freq, ok := strings.Cut(v, "@")
	if !ok {
		return measure.ModeHint{}, cmdutil.FlagError("mode-hint", v, errors.New("want MODE@FREQ, e.g. TE011@10.36GHz"))
	}
	m, err := cavity.ParseMode(mode)
	if err != nil {
		return measure.ModeHint{}, cmdutil.FlagError("mode-hint", v, err)
	}
	f, err := cmdutil.FrequencyOf(strings.TrimSpace(freq))
	if err != nil {
		return measure.ModeHint{}, cmdutil.FlagError("mode-hint", v, err)
	}
	if !(f >= 1e6 && f <= 1e13) {
		return measure.ModeHint{}, cmdutil.FlagError("mode-hint", v, errors.New("the frequency must be between 1 MHz and 10 THz"))
	}
	return measure.ModeHint{Mode: m, F: f}, nil
}

// readSweep reads the sweep file; a missing or malformed file is bad
// input, reported as FILE:LINE: message.
func readSweep(name string) (*touchstone.Data, error) {
	fh, err := os.Open(name)
	if err != nil {
		return nil, cmdutil.Usagef("cannot read the sweep: %v", err)
	}
	defer fh.Close()
	d, err := touchstone.Read(fh, touchstone.PortsFromName(name))
	if err != nil {
		var pe *touchstone.ParseError
		if errors.As(err, &pe) && pe.Line > 0 {
			return nil, cmdutil.Usagef("%s:%d: %s", name, pe.Line, pe.Msg)
		}
		return nil, cmdutil.Usagef("%s: %v", name, err)
	}
	return d, nil
}

func runResonances(opts *Options) error {
	d, err := readSweep(opts.File)
	if err != nil {
		return err
	}
	rs, err := measure.Analyze(d, opts.Settings)
	if err != nil {
		return fmt.Errorf("%s: %w", opts.File, err)
	}
	var id *measure.Identification
	var wd *measure.WallDiagnosis
	var fill *fillResult
	if opts.Empty != "" {
		// The empty sweep gives the effective D and L and the walls; the
		// filled sweep, identified in that cavity, the fill.
		dE, err := readSweep(opts.Empty)
		if err != nil {
			return cmdutil.Usagef("--empty: %v", err)
		}
		rsE, err := measure.Analyze(dE, opts.Settings)
		if err != nil {
			return fmt.Errorf("%s: %w", opts.Empty, err)
		}
		emptySet := opts.Ident
		emptySet.Nominal.Fill = physics.Medium{}
		idE, err := identify(opts.Empty, rsE, emptySet)
		if err != nil {
			return err
		}
		if wd, err = diagnose(opts, rsE, idE); err != nil {
			return fmt.Errorf("%s: %w", opts.Empty, err)
		}
		if opts.Disc != nil {
			f, err := measure.MeasureDiscFill(rsE, *idE, rs, *opts.Disc)
			if err != nil {
				return fmt.Errorf("%s and %s: %w", opts.Empty, opts.File, err)
			}
			fill = &fillResult{empty: idE, Fill: f, disc: opts.Disc}
		} else {
			nominalFill := opts.Ident.Nominal.Fill
			opts.Ident.Nominal = idE.Cavity
			opts.Ident.Nominal.Fill = nominalFill
			opts.Ident.FitFill = true
			if id, err = identify(opts.File, rs, opts.Ident); err != nil {
				return err
			}
			f, err := measure.MeasureFill(rsE, *idE, rs, *id)
			if err != nil {
				return fmt.Errorf("%s and %s: %w", opts.Empty, opts.File, err)
			}
			fill = &fillResult{empty: idE, Fill: f}
		}
	} else if opts.Identify {
		if opts.Hint != nil {
			if err := startFromHint(opts, rs); err != nil {
				return err
			}
		}
		if id, err = identify(opts.File, rs, opts.Ident); err != nil {
			return err
		}
		if opts.Ident.FitFill && id.Cavity.Fill.Eps() < 1 {
			return fmt.Errorf("%s: with --fit-fill the fitted permittivity is %.6g, below vacuum's 1: the cavity is larger than drawn, not filled; fit D and L instead (leave out --fit-fill)", opts.File, id.Cavity.Fill.Eps())
		}
		if wd, err = diagnose(opts, rs, id); err != nil {
			return fmt.Errorf("%s: %w", opts.File, err)
		}
	}
	if err := cmdutil.CheckFiles(opts.Force, plotFiles(opts, rs)...); err != nil {
		return err
	}
	files, err := renderPlots(opts, d, rs, id)
	if err != nil {
		return err
	}
	if err := cmdutil.WriteFiles(opts.Force, files...); err != nil {
		return err
	}
	switch opts.Format {
	case cmdutil.JSON:
		o := toJSON(opts.File, d, rs, id)
		o.Walls = wallsJSON(wd)
		o.Fill = fill.json()
		if h := opts.hinted; h != nil && o.Cavity != nil {
			o.Cavity.HintIndex, o.Cavity.HintAmbiguous = h.Hinted+1, &h.Ambiguous
		}
		return cmdutil.WriteJSON(opts.IO.Out, o)
	case cmdutil.CSV:
		return writeCSV(opts, rs, id)
	}
	if err := writeTable(opts, d, rs, id); err != nil {
		return err
	}
	if err := writeWalls(opts, wd); err != nil {
		return err
	}
	if err := writeFill(opts, fill); err != nil {
		return err
	}
	for _, f := range files {
		fmt.Fprintf(opts.IO.Out, "wrote %s\n", f.Path)
	}
	return nil
}

// plotFiles names the files --plot and --fit-plots will write for the
// resonances rs (contents not yet rendered), for cmdutil.CheckFiles.
func plotFiles(opts *Options, rs []measure.Resonance) []cmdutil.File {
	var out []cmdutil.File
	if opts.Plot != "" {
		out = append(out, cmdutil.File{Flag: "plot", Path: opts.Plot})
	}
	if opts.FitPlots != "" {
		for i, r := range rs {
			if r.Main == nil || r.Problem != "" {
				continue
			}
			out = append(out, cmdutil.File{Flag: "fit-plots", Path: fitPlotPath(opts.FitPlots, i+1)})
		}
	}
	return out
}

// fitPlotPath is the file of the fit plot of resonance i (from 1):
// BASE-i.EXT for --fit-plots BASE.EXT.
func fitPlotPath(base string, i int) string {
	ext := filepath.Ext(base)
	return fmt.Sprintf("%s-%d%s", strings.TrimSuffix(base, ext), i, ext)
}

// renderPlots renders every requested plot in memory, so that a failure
// leaves no file behind.
func renderPlots(opts *Options, d *touchstone.Data, rs []measure.Resonance, id *measure.Identification) ([]cmdutil.File, error) {
	th := figure.DefaultTheme()
	name, main := "S21", func() []complex128 { return nil }
	if d.Ports == 1 {
		name = "S11"
		main = func() []complex128 { return d.Param(1, 1) }
	} else {
		main = func() []complex128 { return d.Param(2, 1) }
	}
	var out []cmdutil.File
	if opts.Plot != "" {
		sp, err := benchplot.NewSweepPlot(d.Freq, main(), name, rs)
		if err != nil {
			return nil, err
		}
		if id != nil {
			if err := sp.SetModes(id); err != nil {
				return nil, err
			}
		}
		fig, err := sp.Figure(th)
		if err != nil {
			return nil, err
		}
		b, err := figure.EncodeAs(fig, opts.Plot, opts.Page)
		if err != nil {
			return nil, err
		}
		out = append(out, cmdutil.File{Flag: "plot", Path: opts.Plot, Data: b})
	}
	if opts.FitPlots != "" {
		for i, r := range rs {
			if r.Main == nil || r.Problem != "" {
				continue
			}
			fp, err := benchplot.NewFitPlot(d.Freq, main(), name, *r.Main, i+1)
			if err != nil {
				return nil, err
			}
			fig, err := fp.Figure(th)
			if err != nil {
				return nil, err
			}
			path := fitPlotPath(opts.FitPlots, i+1)
			b, err := figure.EncodeAs(fig, path, opts.Page)
			if err != nil {
				return nil, err
			}
			out = append(out, cmdutil.File{Flag: "fit-plots", Path: path, Data: b})
		}
	}
	return out, nil
}

// number is a float64 that encodes NaN and infinities as JSON null.
// number encodes NaN and Inf as null (cmdutil.JSONNumber).
type number = cmdutil.JSONNumber

type resonanceJSON struct {
	Index      int    `json:"index"`
	F0Hz       number `json:"f0_hz"`
	F0ErrHz    number `json:"f0_err_hz"`
	QL         number `json:"ql"`
	QLErr      number `json:"ql_err"`
	Beta1      number `json:"beta1"`
	Beta1Err   number `json:"beta1_err"`
	Beta2      number `json:"beta2"`
	Beta2Err   number `json:"beta2_err"`
	Q0         number `json:"q0"`
	Q0Err      number `json:"q0_err"`
	Q3dB       number `json:"ql_3db"`
	Agree      bool   `json:"ql_3db_agrees"`
	DelayS     number `json:"cable_delay_s"`
	Residual   number `json:"fit_residual"`
	Points     int    `json:"fit_points"`
	PeakHeight number `json:"peak_height_db"`
	Problem    string `json:"problem"`

	*modeJSON
}

type modeJSON struct {
	Mode        string `json:"mode"`
	Unresolved  bool   `json:"pair_unresolved"`
	Matched     bool   `json:"matched"`
	PredictedHz number `json:"model_f_hz"`
	Residual    number `json:"model_residual"`
}

type cavityJSON struct {
	DiameterM    number     `json:"diameter_m"`
	DiameterErrM number     `json:"diameter_err_m"`
	LengthM      number     `json:"length_m"`
	LengthErrM   number     `json:"length_err_m"`
	EpsR         number     `json:"eps_r"`
	EpsRErr      number     `json:"eps_r_err"`
	RMSResidual  number     `json:"rms_residual"`
	Pairs        []pairJSON `json:"split_pairs"`
	// ChanceMatches is the number of resonances expected to match a mode
	// by chance; NamesByChance the verdict measure.Identification.ByChance
	// (the mode names are then not meaningful).
	ChanceMatches number `json:"chance_matches"`
	NamesByChance bool   `json:"names_by_chance"`

	// With --mode-hint: the hinted resonance (1-based) and whether
	// another ratio D/L fits about as well.
	HintIndex     int   `json:"hint_index,omitempty"`
	HintAmbiguous *bool `json:"hint_ambiguous,omitempty"`
}

type pairJSON struct {
	TE      int    `json:"te_index"`
	TM      int    `json:"tm_index"`
	SplitHz number `json:"split_hz"`
}

type outJSON struct {
	File       string          `json:"file"`
	Kind       string          `json:"kind"`
	Points     int             `json:"points"`
	Cavity     *cavityJSON     `json:"fitted_cavity,omitempty"`
	Walls      *wallJSON       `json:"walls,omitempty"`
	Fill       *fillJSON       `json:"fill,omitempty"`
	Resonances []resonanceJSON `json:"resonances"`
}

func rowJSON(i int, r measure.Resonance) resonanceJSON {
	j := resonanceJSON{Index: i + 1, F0Hz: number(r.F0), F0ErrHz: number(r.F0Err), QL: number(r.QL), QLErr: number(r.QLErr),
		Beta1: number(r.Beta1), Beta1Err: number(r.Beta1Err), Beta2: number(r.Beta2), Beta2Err: number(r.Beta2Err),
		Q0: number(r.Q0), Q0Err: number(r.Q0Err), Q3dB: number(r.Q3dB), Agree: r.Agree,
		DelayS: number(math.NaN()), Residual: number(math.NaN()), PeakHeight: number(r.Peak.Height), Problem: r.Problem}
	if r.Main != nil {
		j.DelayS, j.Residual, j.Points = number(r.Main.Delay), number(r.Main.Residual), r.Main.Points
	}
	return j
}

func toJSON(file string, d *touchstone.Data, rs []measure.Resonance, id *measure.Identification) outJSON {
	o := outJSON{File: file, Kind: rs[0].Kind.String(), Points: len(d.Freq)}
	for i, r := range rs {
		j := rowJSON(i, r)
		if id != nil {
			a := id.Assign[i]
			j.modeJSON = &modeJSON{Mode: a.Mode.String(), Unresolved: a.Unresolved, Matched: a.Matched,
				PredictedHz: number(a.Predicted), Residual: number(a.Residual)}
		}
		o.Resonances = append(o.Resonances, j)
	}
	if id != nil {
		c := id.Cavity
		o.Cavity = &cavityJSON{DiameterM: number(c.Diameter()), DiameterErrM: number(2 * id.RadiusErr),
			LengthM: number(c.Length), LengthErrM: number(id.LengthErr), EpsR: number(c.Fill.Eps()), EpsRErr: number(id.EpsErr),
			RMSResidual: number(id.RMS), Pairs: []pairJSON{}, ChanceMatches: number(id.Chance), NamesByChance: id.ByChance()}
		for _, p := range id.Pairs {
			o.Cavity.Pairs = append(o.Cavity.Pairs, pairJSON{TE: p.TE + 1, TM: p.TM + 1, SplitHz: number(p.Split)})
		}
	}
	return o
}

func hasNaN(v []float64) bool {
	for _, x := range v {
		if math.IsNaN(x) {
			return true
		}
	}
	return false
}

var csvHeader = []string{"index", "f0_hz", "f0_err_hz", "ql", "ql_err", "beta1", "beta1_err", "beta2", "beta2_err",
	"q0", "q0_err", "ql_3db", "ql_3db_agrees", "cable_delay_s", "fit_residual", "fit_points", "peak_height_db", "problem"}

func writeCSV(opts *Options, rs []measure.Resonance, id *measure.Identification) error {
	g := func(v number) string {
		if math.IsNaN(float64(v)) {
			return ""
		}
		return strconv.FormatFloat(float64(v), 'g', 10, 64)
	}
	var rows [][]string
	for i, r := range rs {
		j := rowJSON(i, r)
		rows = append(rows, []string{strconv.Itoa(j.Index), g(j.F0Hz), g(j.F0ErrHz), g(j.QL), g(j.QLErr), g(j.Beta1), g(j.Beta1Err),
			g(j.Beta2), g(j.Beta2Err), g(j.Q0), g(j.Q0Err), g(j.Q3dB), strconv.FormatBool(j.Agree), g(j.DelayS), g(j.Residual),
			strconv.Itoa(j.Points), g(j.PeakHeight), j.Problem})
		if id != nil {
			a := id.Assign[i]
			rows[i] = append(rows[i], a.Mode.String(), strconv.FormatBool(a.Unresolved), strconv.FormatBool(a.Matched),
				g(number(a.Predicted)), g(number(a.Residual)))
		}
	}
	header := csvHeader
	if id != nil {
		header = append(append([]string(nil), csvHeader...), "mode", "pair_unresolved", "matched", "model_f_hz", "model_residual")
	}
	return cmdutil.WriteCSV(opts.IO.Out, header, rows)
}

// pm formats v +- e with e to two significant digits and v to the same
// last decimal place (scaled by 1/scale).
func pm(v, e, scale float64) string {
	if math.IsNaN(v) {
		return "-"
	}
	v, e = v/scale, e/scale
	if !(e > 0) || math.IsInf(e, 0) {
		return strconv.FormatFloat(v, 'g', 6, 64)
	}
	dec := max(0, 1-int(math.Floor(math.Log10(e))))
	dec = min(dec, 12)
	return fmt.Sprintf("%.*f ± %.*f", dec, v, dec, e)
}

func writeTable(opts *Options, d *touchstone.Data, rs []measure.Resonance, id *measure.Identification) error {
	w := opts.IO.Out
	kind := rs[0].Kind
	fmt.Fprintf(w, "%s: %d points, %s (%d-port), %d resonances\n", opts.File, len(d.Freq), kind, d.Ports, len(rs))
	header := []string{"#", "f0 (GHz)", "QL", "beta1"}
	if kind == measure.Transmission {
		header = append(header, "beta2")
	}
	header = append(header, "Q0", "QL 3dB", "3 dB check")
	if id != nil {
		header = append(header, "mode", "vs model (ppm)")
	}
	t := cmdutil.NewTable(w, header...)
	var problems []string
	for i, r := range rs {
		row := []string{strconv.Itoa(i + 1)}
		if r.Problem != "" {
			row = append(row, strconv.FormatFloat(r.Peak.F/1e9, 'f', 6, 64)+" (peak)", "-", "-")
			if kind == measure.Transmission {
				row = append(row, "-")
			}
			row = append(row, "-", "-", "not fitted, see below")
			if id != nil {
				row = append(row, "-", "-")
			}
			t.Row(row...)
			problems = append(problems, fmt.Sprintf("resonance %d: %s", i+1, r.Problem))
			continue
		}
		row = append(row, pm(r.F0, r.F0Err, 1e9), pm(r.QL, r.QLErr, 1), pm(r.Beta1, r.Beta1Err, 1))
		if kind == measure.Transmission {
			row = append(row, pm(r.Beta2, r.Beta2Err, 1))
		}
		check := "agrees"
		switch {
		case math.IsNaN(r.Q3dB):
			check = "no half-power points in the window"
		case !r.Agree:
			check = fmt.Sprintf("differs by %+.1f %%: trust the fit", 100*(r.Q3dB-r.QL)/r.QL)
		}
		row = append(row, pm(r.Q0, r.Q0Err, 1), strconv.FormatFloat(r.Q3dB, 'f', 0, 64), check)
		if id != nil {
			a := id.Assign[i]
			switch {
			case !a.Matched:
				row = append(row, "none (nearest "+a.Mode.String()+")", fmt.Sprintf("%+.0f", 1e6*a.Residual))
			case a.Unresolved:
				row = append(row, a.Mode.String()+"/"+companion(a.Mode), fmt.Sprintf("%+.0f", 1e6*a.Residual))
			default:
				row = append(row, a.Mode.String(), fmt.Sprintf("%+.0f", 1e6*a.Residual))
			}
		}
		t.Row(row...)
	}
	if err := t.Flush(); err != nil {
		return err
	}
	for _, p := range problems {
		fmt.Fprintln(w, p)
	}
	if id != nil {
		c := id.Cavity
		if opts.Ident.FitFill {
			fmt.Fprintf(w, "Fitted fill: eps_r = %s with D = %s, L = %s held; RMS residual %.0f ppm.\n",
				pm(c.Fill.Eps(), id.EpsErr, 1), physics.FormatLength(c.Diameter(), 6), physics.FormatLength(c.Length, 6), 1e6*id.RMS)
		} else {
			from := "drawn"
			if opts.hinted != nil {
				from = fmt.Sprintf("started from %s at resonance %d:", opts.Hint.Mode, opts.hinted.Hinted+1)
			}
			fmt.Fprintf(w, "Effective cavity: D = %s mm, L = %s mm (%s %s, %s); RMS residual %.0f ppm.\n",
				pm(c.Diameter(), 2*id.RadiusErr, 1e-3), pm(c.Length, id.LengthErr, 1e-3), from,
				physics.FormatLength(opts.Ident.Nominal.Diameter(), 6), physics.FormatLength(opts.Ident.Nominal.Length, 6), 1e6*id.RMS)
		}
		if id.ByChance() {
			fmt.Fprintf(w, "Caution: about %.1f of the matches are expected by chance: the fitted cavity's modes are so dense in the band that any frequency lies near one, so the mode names and the fit mean nothing; check the drawn size and its units.\n", id.Chance)
		}
		if h := opts.hinted; h != nil {
			fmt.Fprintf(w, "Mode hint: %d of %d resonances near a mode of the start (%.1f expected by chance).\n", h.Near, len(id.Assign), h.Chance)
			if h.Ambiguous {
				fmt.Fprintf(w, "Caution: D/L = %.3f (D = %s, L = %s) fits the resonances about as well; the naming is not certain. Give the drawn size or a second resonance's mode.\n",
					h.Alternative.Diameter()/h.Alternative.Length, physics.FormatLength(h.Alternative.Diameter(), 5), physics.FormatLength(h.Alternative.Length, 5))
			}
		}
		for _, p := range id.Pairs {
			fmt.Fprintf(w, "Resonances %d (%s) and %d (%s): a degenerate pair split by %s; the higher Q is taken as %s.\n",
				p.TE+1, id.Assign[p.TE].Mode, p.TM+1, id.Assign[p.TM].Mode, physics.FormatFrequency(p.Split, 4), id.Assign[p.TE].Mode)
		}
		unmatched := 0
		for _, a := range id.Assign {
			if !a.Matched {
				unmatched++
			}
		}
		if unmatched > 0 {
			fmt.Fprintf(w, "%d resonance(s) match no cavity mode within %.1f %%: coupling structures, port modes, or a cavity far from its drawing.\n", unmatched, 100*matchTol(opts.Ident))
		}
		fmt.Fprintln(w, "Mode index convention: n azimuthal (cos n phi), m radial (m-th Bessel zero), p axial (half-wavelengths along the length).")
	}
	fmt.Fprintln(w, "Uncertainties are one standard deviation from the fit residuals (noise only; not the analyser's calibration).")
	return nil
}

// companion names the mode that shares m's frequency (TE0mp with TM1mp).
func companion(m cavity.Mode) string {
	if c, ok := m.Companion(); ok {
		return c.String()
	}
	return "?"
}

func matchTol(s measure.IdentifySettings) float64 {
	if s.MatchTol == 0 {
		return 0.003
	}
	return s.MatchTol
}

// diagnose runs measure.DiagnoseWalls on the matched, resolved resonances;
// nil when there is none.
func diagnose(opts *Options, rs []measure.Resonance, id *measure.Identification) (*measure.WallDiagnosis, error) {
	var idx []int
	var modes []cavity.Mode
	var q0, q0e []float64
	for i, a := range id.Assign {
		if !a.Matched || a.Unresolved || rs[i].Problem != "" {
			continue
		}
		idx = append(idx, i)
		modes = append(modes, a.Mode)
		q0, q0e = append(q0, rs[i].Q0), append(q0e, rs[i].Q0Err)
	}
	if len(idx) == 0 {
		return nil, nil
	}
	d, err := measure.DiagnoseWalls(id.Cavity, idx, modes, q0, q0e, opts.Walls)
	if err != nil {
		return nil, err
	}
	return &d, nil
}

type modeWallJSON struct {
	Index        int    `json:"index"`
	Mode         string `json:"mode"`
	Q0           number `json:"q0"`
	QWall        number `json:"q_wall"`
	IACS         number `json:"iacs_fraction"`
	IACSErr      number `json:"iacs_fraction_err"`
	ModelQ0      number `json:"model_q0"`
	ModelIACS    number `json:"model_iacs_fraction"`
	Conductivity number `json:"conductivity_s_per_m"`
	// With --wall: the equivalent RMS roughness and what was found
	// (found, smoother, beyond, no_effect).
	Roughness    *number `json:"roughness_m,omitempty"`
	RoughnessErr *number `json:"roughness_err_m,omitempty"`
	RoughVerdict string  `json:"roughness_verdict,omitempty"`
}

type wallJSON struct {
	Mean         number `json:"mean_iacs_fraction"`
	Spread       number `json:"spread_iacs_fraction"`
	TE0          number `json:"te0_iacs_fraction"`
	TM           number `json:"tm_iacs_fraction"`
	JointSuspect bool   `json:"end_plate_contact_suspect"`
	// With --wall: the roughness model and the equivalent roughness's
	// mean and spread over the modes where it was found.
	RoughModel  string         `json:"roughness_model,omitempty"`
	RoughMean   *number        `json:"mean_roughness_m,omitempty"`
	RoughSpread *number        `json:"spread_roughness_m,omitempty"`
	Modes       []modeWallJSON `json:"modes"`
}

func wallsJSON(wd *measure.WallDiagnosis) *wallJSON {
	if wd == nil {
		return nil
	}
	o := &wallJSON{Mean: number(wd.Mean), Spread: number(wd.Spread), TE0: number(wd.TE0), TM: number(wd.TM), JointSuspect: wd.Joint}
	num := func(v float64) *number { n := number(v); return &n }
	withWalls := len(wd.Modes) > 0 && wd.Modes[0].Rough != measure.RoughNone
	if withWalls {
		o.RoughModel, o.RoughMean, o.RoughSpread = wd.RoughModel.String(), num(wd.RoughMean), num(wd.RoughSpread)
	}
	for _, m := range wd.Modes {
		mj := modeWallJSON{Index: m.Index + 1, Mode: m.Mode.String(), Q0: number(m.Q0), QWall: number(m.QWall),
			IACS: number(m.IACS), IACSErr: number(m.IACSErr), ModelQ0: number(m.ModelQ0), ModelIACS: number(m.ModelIACS),
			Conductivity: number(m.IACS * physics.IACSConductivity)}
		if withWalls {
			mj.Roughness, mj.RoughnessErr, mj.RoughVerdict = num(m.Roughness), num(m.RoughnessErr), roughKey(m.Rough)
		}
		o.Modes = append(o.Modes, mj)
	}
	return o
}

// roughKey is the stable JSON name of a roughness verdict.
func roughKey(v measure.RoughVerdict) string {
	switch v {
	case measure.RoughFound:
		return "found"
	case measure.RoughSmoother:
		return "smoother"
	case measure.RoughBeyond:
		return "beyond"
	case measure.RoughNoEffect:
		return "no_effect"
	}
	return ""
}

// roughCell is the table cell of one mode's equivalent roughness, in um.
func roughCell(m measure.ModeWall) string {
	switch m.Rough {
	case measure.RoughFound:
		return pm(m.Roughness, m.RoughnessErr, 1e-6)
	case measure.RoughSmoother:
		return "0 (Q above smooth)"
	case measure.RoughBeyond:
		return "beyond model"
	}
	return "n/a"
}

func writeWalls(opts *Options, wd *measure.WallDiagnosis) error {
	if wd == nil {
		return nil
	}
	w := opts.IO.Out
	fmt.Fprintln(w)
	fmt.Fprintln(w, "Walls: the conductivity of a smooth uniform wall that gives each measured Q0 (fill loss removed):")
	header := []string{"#", "mode", "Q0", "conductivity (% IACS)"}
	if opts.Walls != nil {
		header = append(header, "model Q0 (--wall)", "model (% IACS)", "RMS roughness (um, "+wd.RoughModel.String()+")")
	}
	t := cmdutil.NewTable(w, header...)
	for _, m := range wd.Modes {
		row := []string{strconv.Itoa(m.Index + 1), m.Mode.String(), pm(m.Q0, m.Q0Err, 1), pm(100*m.IACS, 100*m.IACSErr, 1)}
		if opts.Walls != nil {
			row = append(row, strconv.FormatFloat(m.ModelQ0, 'f', 0, 64), strconv.FormatFloat(100*m.ModelIACS, 'f', 1, 64), roughCell(m))
		}
		t.Row(row...)
	}
	if err := t.Flush(); err != nil {
		return err
	}
	fmt.Fprintf(w, "Mean %.1f %% IACS (%.3g MS/m), spread %.1f %% IACS across %d modes", 100*wd.Mean, wd.Mean*physics.IACSConductivity/1e6, 100*wd.Spread, len(wd.Modes))
	if !math.IsNaN(wd.TE0) && !math.IsNaN(wd.TM) {
		fmt.Fprintf(w, "; TE0mp modes %.1f %%, TM modes %.1f %%", 100*wd.TE0, 100*wd.TM)
	}
	fmt.Fprintln(w, ".")
	if wd.Joint {
		fmt.Fprintln(w, "The TM modes, whose wall currents cross the joints between side wall and end plates, lose clearly more than the TE0mp modes, whose currents do not: suspect the end-plate contact (clean, flatten or tighten the joints).")
	}
	if opts.Walls != nil {
		found := 0
		for _, m := range wd.Modes {
			if m.Rough == measure.RoughFound {
				found++
			}
		}
		if found > 0 {
			fmt.Fprintf(w, "Equivalent RMS roughness of the --wall metal under the %s model: mean %.3g um, spread %.2g um across %d modes.\n",
				wd.RoughModel, 1e6*wd.RoughMean, 1e6*wd.RoughSpread, found)
		}
		if found < len(wd.Modes) {
			fmt.Fprintln(w, "Roughness raises the surface resistance by at most a factor of 2 in these models: a mode losing more than that is not explained by roughness (contacts, coupling loss, a poorer metal), and one above the smooth model needs a better metal than --wall.")
		}
	}
	fmt.Fprintln(w, "Roughness, plating and the coupling structures' own loss all lower the effective conductivity; it is a figure of merit of the walls as built, not the metal's bulk value.")
	return nil
}

// startFromHint sets the starting cavity from --mode-hint.
func startFromHint(opts *Options, rs []measure.Resonance) error {
	f0 := make([]float64, 0, len(rs))
	for _, r := range rs {
		f0 = append(f0, r.F0)
	}
	if hasNaN(f0) {
		return fmt.Errorf("%s: a resonance could not be fitted, so the modes cannot be named; see the table without --mode-hint", opts.File)
	}
	h, err := measure.CavityFromHint(f0, *opts.Hint, opts.Ident.Nominal.Fill)
	if err != nil {
		// the hint does not fit this sweep: bad input
		return cmdutil.FlagError("mode-hint", opts.hintText, err)
	}
	opts.hinted, opts.Ident.Nominal = &h, h.Cavity
	return nil
}

// identify names the modes of the fitted resonances rs of file.
// nominalMargin is how far above the highest resonance measure.Identify
// takes the nominal cavity's modes as candidates.
const nominalMargin = 1.2

func identify(file string, rs []measure.Resonance, set measure.IdentifySettings) (*measure.Identification, error) {
	f0 := make([]float64, 0, len(rs))
	q0 := make([]float64, 0, len(rs))
	for _, r := range rs {
		f0, q0 = append(f0, r.F0), append(q0, r.Q0)
	}
	if hasNaN(f0) {
		return nil, fmt.Errorf("%s: a resonance could not be fitted, so the modes cannot be named; see the table without --diameter", file)
	}
	if fmax := slices.Max(append(f0, 0)); fmax > 0 {
		// The size is bad input when the drawn cavity has no mode near
		// the measured band (a unit slip: 1mm for 40mm).
		if ms, err := set.Nominal.Modes(fmax * nominalMargin); err == nil && len(ms) == 0 {
			return nil, cmdutil.Usagef("the drawn cavity (D = %s, L = %s) has no mode below %s, %g times the highest resonance of %s: check --diameter (--radius) and --length and their units",
				cmdutil.TrimZeros(physics.FormatLength(set.Nominal.Diameter(), 6)), cmdutil.TrimZeros(physics.FormatLength(set.Nominal.Length, 6)),
				cmdutil.TrimZeros(physics.FormatFrequency(fmax*nominalMargin, 4)), nominalMargin, file)
		}
	}
	id, err := measure.Identify(f0, q0, set)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", file, err)
	}
	return &id, nil
}

// fillResult is the fill measured from the empty and filled sweeps, with
// the empty sweep's identification for the header.
type fillResult struct {
	empty *measure.Identification
	measure.Fill
	disc *measure.DiscSpec // nil for a complete fill
}

type fillModeJSON struct {
	Mode        string `json:"mode"`
	FEmptyHz    number `json:"f_empty_hz"`
	FFilledHz   number `json:"f_filled_hz"`
	EpsR        number `json:"eps_r"`
	EpsRErr     number `json:"eps_r_err"`
	TanDelta    number `json:"tan_delta"`
	TanDeltaErr number `json:"tan_delta_err"`
	// FillE is the sample's electric filling factor (1: complete fill).
	FillE number `json:"electric_filling_factor"`
}

type fillJSON struct {
	EpsR        number         `json:"eps_r"`
	EpsRErr     number         `json:"eps_r_err"`
	TanDelta    number         `json:"tan_delta"`
	TanDeltaErr number         `json:"tan_delta_err"`
	EmptyDM     number         `json:"empty_diameter_m"`
	EmptyLM     number         `json:"empty_length_m"`
	Modes       []fillModeJSON `json:"modes"`
	// DiscThicknessM is the disc's thickness with --sample-thickness.
	DiscThicknessM *number `json:"disc_thickness_m,omitempty"`
}

func (fr *fillResult) json() *fillJSON {
	if fr == nil {
		return nil
	}
	o := &fillJSON{EpsR: number(fr.EpsR), EpsRErr: number(fr.EpsRErr), TanDelta: number(fr.TanDelta), TanDeltaErr: number(fr.TanDeltaErr),
		EmptyDM: number(fr.empty.Cavity.Diameter()), EmptyLM: number(fr.empty.Cavity.Length)}
	for _, m := range fr.Modes {
		o.Modes = append(o.Modes, fillModeJSON{Mode: m.Mode.String(), FEmptyHz: number(m.FEmpty), FFilledHz: number(m.FFilled),
			EpsR: number(m.Result.EpsR), EpsRErr: number(m.Result.EpsRErr), TanDelta: number(m.Result.TanDelta), TanDeltaErr: number(m.Result.TanDeltaErr),
			FillE: number(m.FillE)})
	}
	if fr.disc != nil {
		t := number(fr.disc.Thickness)
		o.DiscThicknessM = &t
	}
	return o
}

func writeFill(opts *Options, fr *fillResult) error {
	if fr == nil {
		return nil
	}
	w := opts.IO.Out
	c := fr.empty.Cavity
	fmt.Fprintln(w)
	fmt.Fprintf(w, "Fill, from %s (empty: D = %s mm, L = %s mm) and %s (filled):\n", opts.Empty,
		pm(c.Diameter(), 2*fr.empty.RadiusErr, 1e-3), pm(c.Length, fr.empty.LengthErr, 1e-3), opts.File)
	t := cmdutil.NewTable(w, "mode", "f empty (GHz)", "f filled (GHz)", "eps_r", "tan delta")
	best := 0
	for i, m := range fr.Modes {
		t.Row(m.Mode.String(), strconv.FormatFloat(m.FEmpty/1e9, 'f', 6, 64), strconv.FormatFloat(m.FFilled/1e9, 'f', 6, 64),
			pm(m.Result.EpsR, m.Result.EpsRErr, 1), pm(1e4*m.Result.TanDelta, 1e4*m.Result.TanDeltaErr, 1)+" e-4")
		if m.Result.TanDeltaErr < fr.Modes[best].Result.TanDeltaErr {
			best = i
		}
	}
	if err := t.Flush(); err != nil {
		return err
	}
	fmt.Fprintf(w, "Mean over %d modes (weighted): eps_r = %s, tan delta = %s e-4 (uncertainty of the best mode: the wall-model term is common to all).\n",
		len(fr.Modes), pm(fr.EpsR, fr.EpsRErr, 1), pm(1e4*fr.TanDelta, 1e4*fr.TanDeltaErr, 1))
	b := fr.Modes[best]
	fmt.Fprintf(w, "Uncertainty budget at %v (one standard deviation each):\n", b.Mode)
	bt := cmdutil.NewTable(w, "  input", "eps_r", "tan delta")
	for _, x := range b.Result.Budget {
		bt.Row("  "+x.Input, strconv.FormatFloat(x.EpsR, 'e', 1, 64), strconv.FormatFloat(x.TanDelta, 'e', 1, 64))
	}
	if err := bt.Flush(); err != nil {
		return err
	}
	if fr.disc != nil {
		fmt.Fprintf(w, "Disc of thickness %s on one end plate, full diameter (TE0mp modes, transverse-resonance model); its electric filling factor:", physics.FormatLength(fr.disc.Thickness, 4))
		for _, m := range fr.Modes {
			fmt.Fprintf(w, " %v %.4f", m.Mode, m.FillE)
		}
		fmt.Fprintln(w, ".")
		fmt.Fprintln(w, "The model needs the disc flat on the plate and touching the side wall all round; a gap at the rim lowers the apparent eps_r.")
		return nil
	}
	fmt.Fprintln(w, "The method needs a complete fill: a gap between the sample and the walls lowers the apparent eps_r.")
	return nil
}
