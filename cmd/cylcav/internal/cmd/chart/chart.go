// Package chart implements `cylcav chart`: the mode chart of a cavity as a
// PNG, SVG or PDF image, with the wanted mode, the operating box and the
// spurious modes near it emphasised.
package chart

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"
	"gonum.org/v1/plot/vg"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/figure"
	"cylcav/modechart"
	"cylcav/physics"
)

// Options are the parsed and validated flags of `cylcav chart`.
type Options struct {
	IO *cmdutil.IOStreams

	// Spec is the chart, with the cavity sized already when Sized.
	Spec modechart.Spec
	// Sized records that the cavity came from --freq and a constraint,
	// described by SizedBy ("D/L = 1").
	Sized   bool
	SizedBy string
	Output  string
	Format  figure.Format
	Page    figure.Page
	Force   bool

	// MinFDText and MaxFDText are --min-fd and --max-fd as given ("" when
	// absent), for error messages.
	MinFDText, MaxFDText string
}

// NewCmdChart returns `cylcav chart`. runF, if not nil, replaces the
// command's work (tests use it to inspect the parsed options).
func NewCmdChart(ios *cmdutil.IOStreams, runF func(*Options) error) *cobra.Command {
	opts := &Options{IO: ios}
	var (
		units, axes               string
		freq, ratio, maxFD, minFD float64
		width, height             float64
		tol, tolLen               float64
		tuningText                func() string
		ratioRange                *cmdutil.Range
		geo                       *cmdutil.GeometryFlags
	)
	cmd := &cobra.Command{
		Use:   "chart (--diameter D --length L | --mode MODE --freq F --ratio R) -o FILE [flags]",
		Short: "Draw the mode chart of a cavity (PNG, SVG or PDF)",
		Long: `Draw the mode chart of a closed circular cylinder: every TE and TM mode as a
line of (f·D)² against (D/L)², straight lines from

  (f·D)² = (c·x_nm/π)²/(εr·μr) + (c·p/2)²/(εr·μr) · (D/L)²

with x_nm = j'_nm (TE) or j_nm (TM) (Pozar, Microwave Engineering, sec. 6.4),
or with --axes linear f·D against D/L. TE modes are solid lines, TM modes
dashed, and each exactly degenerate pair TE0mp/TM1mp is one dash-dot line
named with both modes. Mode names sit on their lines where they fit without
overlapping.

With --mode and a cavity (--diameter and --length, or --freq with --ratio,
--diameter or --length to size it first) the chart marks the design point,
draws the wanted mode thick, and draws the reachable set: the stretch of
the wanted mode's line that the cavity visits when tuned (--tuning, one end
plate moved, +-t of its own frequency) within the worst-case machining
tolerance (--tolerance), with the clearance band around it. Spurious modes
whose lines cross the wanted one on that stretch are drawn wide red; those
within --min-clearance of it there, medium orange. The worst-case clearance
and the offending modes are the same as those of design and report for the
same inputs. Without --mode the cavity's D/L is a dashed vertical line.

The file type follows the extension of -o: .png (at --dpi), .svg or .pdf.
An existing file is replaced only with --force.

Mode index convention: TE_nmp / TM_nmp, n azimuthal, m radial, p axial.`,
		Example: `  # The chart of a 39.6 mm x 39.6 mm TE011 cavity, tunable by +-2 %,
  # machined to +-0.02 mm, with 3 % required clearance
  $ cylcav chart --diameter 39.6mm --length 39.6mm --mode TE011 \
      --tuning 2% --tolerance 0.02mm --min-clearance 3% -o chart.png
  wrote chart.png (PNG, 1200 x 900 px at 150 dpi): 50 mode lines, D/L 0.5..3
  ...

  # Size a PTFE-filled TE011 cavity for 5 GHz with D = L first, chart in
  # GHz·mm on linear axes as SVG
  $ cylcav chart --mode TE011 --freq 5GHz --ratio 1 --fill ptfe \
      --units ghz-mm --axes linear -o chart.svg`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			fl := cmd.Flags()
			s := &opts.Spec
			var err error
			var fillV physics.Medium
			if fillV, err = geo.Fill(); err != nil {
				return err
			}
			if err := parseCavity(geo, opts, fillV, freq, ratio); err != nil {
				return err
			}
			if !fl.Changed("mode") && (fl.Changed("tuning") || fl.Changed("tolerance") || fl.Changed("tolerance-length") || fl.Changed("min-clearance")) {
				return cmdutil.Usagef("--tuning, --tolerance and --min-clearance need --mode (the wanted mode) and a cavity")
			}
			if s.RatioMin == s.RatioMax {
				return cmdutil.FlagError("ratio-range", ratioRange.Text(), fmt.Errorf("want LO < HI, both between %g and %g", modechart.MinRatio, modechart.MaxRatio))
			}
			if s.Units, err = modechart.ParseUnits(units); err != nil {
				return cmdutil.FlagError("units", units, errors.New("unknown units; use ghz-cm, ghz-mm or mhz-in"))
			}
			if s.Axes, err = modechart.ParseAxes(axes); err != nil {
				return cmdutil.FlagError("axes", axes, errors.New("unknown axes; use squared or linear"))
			}
			u := s.Units.Scale()
			if fl.Changed("max-fd") {
				s.MaxFD = maxFD * u
				opts.MaxFDText = cmdutil.Text(fl, "max-fd")
			}
			if fl.Changed("min-fd") {
				s.MinFD = minFD * u
				opts.MinFDText = cmdutil.Text(fl, "min-fd")
			}
			if err := cmdutil.CheckTunable("tuning", tuningText(), s.Wanted, s.Tuning); err != nil {
				return err
			}
			if fl.Changed("tolerance") {
				s.DiameterTol, s.LengthTol = tol, tol
			}
			if fl.Changed("tolerance-length") {
				s.LengthTol = tolLen
			}
			if opts.Output == "" {
				return cmdutil.Usagef("missing -o/--output, the image file to write (.png, .svg or .pdf)")
			}
			if opts.Format, err = figure.FormatOf(opts.Output); err != nil {
				return cmdutil.FlagError("output", opts.Output, errors.New("the file name must end in .png, .svg or .pdf"))
			}
			if err := cmdutil.CheckFiles(opts.Force, cmdutil.File{Flag: "output", Path: opts.Output}); err != nil {
				return err
			}
			opts.Page.Width, opts.Page.Height = vg.Length(width/0.0254)*vg.Inch, vg.Length(height/0.0254)*vg.Inch
			if runF != nil {
				return runF(opts)
			}
			return runChart(opts)
		},
	}
	f := cmd.Flags()
	cmdutil.ModeVar(f, &opts.Spec.Wanted, "mode", "wanted mode, e.g. TE011 (emphasised, with the design point)")
	geo = cmdutil.AddGeometryFlags(cmd, cmdutil.Geometry{
		Diameter: "inside diameter D of the cavity, e.g. 39.6mm",
		Length:   "inside length L of the cavity, e.g. 39.6mm",
		Fill:     "fill: material name (air, ptfe, ...) or eps=E[,mu=M] (default vacuum)",
	})
	cmdutil.FrequencyVar(f, &freq, "freq", "size the cavity first: wanted frequency, with --ratio, --diameter or --length", cmdutil.MinFrequency, cmdutil.MaxFrequency)
	cmdutil.NumberVar(f, &ratio, "ratio", "with --freq: the ratio D/L of the sized cavity", modechart.MinRatio, modechart.MaxRatio)
	ratioRange = cmdutil.NumberRangeVar(f, &opts.Spec.RatioMin, &opts.Spec.RatioMax, "ratio-range", "D/L range of the chart, LO:HI", modechart.MinRatio, modechart.MaxRatio)
	cmdutil.SetDefault(f, "ratio-range", "0.5:3")
	cmdutil.NumberVar(f, &maxFD, "max-fd", "top of the chart as f·D in --units (default 1.5 x the design's f·D)", 1e-9, 1e12)
	cmdutil.NumberVar(f, &minFD, "min-fd", "bottom of the chart as f·D in --units (default 0)", 0, 1e12)
	f.StringVar(&units, "units", "ghz-cm", "unit of f·D: ghz-cm|ghz-mm|mhz-in")
	f.StringVar(&axes, "axes", "squared", "axes: squared ((f·D)² vs (D/L)², straight lines) | linear (f·D vs D/L)")
	tuningText = cmdutil.FractionVar(f, &opts.Spec.Tuning, "tuning", "tuning range by one end plate, e.g. 2% for +-2 %", 0, cavity.MaxTuning).Text
	cmdutil.LengthVar(f, &tol, "tolerance", "machining tolerance +-t of diameter and length, e.g. 0.02mm", 0, 1)
	cmdutil.LengthVar(f, &tolLen, "tolerance-length", "machining tolerance of the length if different from --tolerance", 0, 1)
	cmdutil.FractionVar(f, &opts.Spec.Clearance, "min-clearance", "required clearance, e.g. 3%: modes this close to the wanted one on the reachable set are emphasised", 0, 0.99)
	f.StringVarP(&opts.Output, "output", "o", "", "image file to write: .png, .svg or .pdf")
	f.BoolVar(&opts.Force, "force", false, "replace the output file if it exists")
	cmdutil.IntVar(f, &opts.Page.DPI, "dpi", figure.DefaultDPI, "resolution of PNG output, dots per inch", figure.MinDPI, figure.MaxDPI)
	// Page limits in metres (1 in = 0.0254 m exactly).
	pmin, pmax := inches(figure.MinPage), inches(figure.MaxPage)
	cmdutil.LengthVar(f, &width, "width", "page width", pmin, pmax)
	cmdutil.SetDefault(f, "width", "8in")
	cmdutil.LengthVar(f, &height, "height", "page height", pmin, pmax)
	cmdutil.SetDefault(f, "height", "6in")
	_ = cmd.RegisterFlagCompletionFunc("units", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return []string{"ghz-cm", "ghz-mm", "mhz-in"}, cobra.ShellCompDirectiveNoFileComp
	})
	_ = cmd.RegisterFlagCompletionFunc("axes", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return []string{"squared", "linear"}, cobra.ShellCompDirectiveNoFileComp
	})
	return cmd
}

// parseCavity fills opts.Spec.Cavity from --diameter and --length, or by
// sizing --mode at --freq with one of --ratio, --diameter, --length.
func parseCavity(geo *cmdutil.GeometryFlags, opts *Options, fill physics.Medium, f, ratio float64) error {
	s := &opts.Spec
	changed := geo.Changed
	fs := geo.FlagSet()
	if changed("freq") {
		if !changed("mode") {
			return cmdutil.Usagef("--freq sizes the cavity for the wanted mode: give --mode too (e.g. --mode TE011)")
		}
		var given []string
		for _, n := range []string{"ratio", "diameter", "length"} {
			if changed(n) {
				given = append(given, n)
			}
		}
		if len(given) != 1 {
			return cmdutil.Usagef("--freq needs exactly one of --ratio, --diameter or --length to size the cavity; got %d", len(given))
		}
		var by cavity.Constraint
		var flag, val string
		switch given[0] {
		case "ratio":
			by, flag, val = cavity.ByRatio(ratio), "ratio", cmdutil.Text(fs, "ratio")
		case "diameter":
			d, err := geo.Diameter()
			if err != nil {
				return err
			}
			by, flag, val = cavity.ByDiameter(d), "diameter", geo.Text("diameter")
		case "length":
			l, err := geo.Length()
			if err != nil {
				return err
			}
			by, flag, val = cavity.ByLength(l), "length", geo.Text("length")
		}
		c, err := cavity.Size(s.Wanted, f, fill, by)
		if errors.Is(err, cavity.ErrInfeasible) {
			return cmdutil.Usagef("--freq %q with --%s %q: %w", cmdutil.Text(fs, "freq"), flag, val, err)
		}
		if err != nil {
			return err
		}
		s.Cavity, opts.Sized, opts.SizedBy = c, true, by.String()
		return nil
	}
	if changed("ratio") {
		return cmdutil.Usagef("--ratio sizes the cavity together with --freq and --mode; to chart a given cavity use --diameter and --length")
	}
	switch {
	case changed("diameter") && changed("length"):
		d, err := geo.Diameter()
		if err != nil {
			return err
		}
		l, err := geo.Length()
		if err != nil {
			return err
		}
		s.Cavity = cavity.Cavity{Radius: d / 2, Length: l, Fill: fill}
	case changed("diameter") || changed("length"):
		return cmdutil.Usagef("give both --diameter and --length (or --freq with one of them to size the cavity)")
	default:
		// No cavity: a plain chart of the fill.
		s.Fill = fill
	}
	return nil
}

// inches converts a page length to metres.
func inches(l vg.Length) float64 { return float64(l/vg.Inch) * 0.0254 }

func runChart(opts *Options) error {
	ch, err := modechart.New(opts.Spec)
	if err != nil {
		// Every chart error is a consequence of the flags.
		return rangeError(opts, err, true)
	}
	fig, err := ch.Figure(figure.DefaultTheme())
	if err != nil {
		return rangeError(opts, err, false)
	}
	var b bytes.Buffer
	if err := figure.Render(&b, fig, opts.Format, opts.Page); err != nil {
		return err
	}
	if err := cmdutil.WriteFiles(opts.Force, cmdutil.File{Flag: "output", Path: opts.Output, Data: b.Bytes()}); err != nil {
		return err
	}
	return summary(opts.IO.Out, opts, ch)
}

// rangeError turns a modechart.RangeError into a usage error naming the
// flag that moves that end of the chart (--min-fd or --max-fd); any other
// error of New (fromNew) is a usage error as it is, and of Figure a
// failure.
func rangeError(opts *Options, err error, fromNew bool) error {
	var re *modechart.RangeError
	if !errors.As(err, &re) {
		if fromNew {
			return cmdutil.Usagef("%v", err)
		}
		return err
	}
	flag, text := "max-fd", opts.MaxFDText
	if re.Edge == modechart.Bottom {
		flag, text = "min-fd", opts.MinFDText
	}
	if text == "" {
		return cmdutil.Usagef("%s (give --%s in %s)", re.Msg, flag, opts.Spec.Units)
	}
	return cmdutil.FlagError(flag, text, errors.New(re.Msg))
}

// summary prints what was drawn: the file, the design and the spurious
// modes the chart emphasises.
func summary(w io.Writer, opts *Options, ch *modechart.Chart) error {
	var b strings.Builder
	size := fmt.Sprintf("%.4g x %.4g in", opts.Page.Width/vg.Inch, opts.Page.Height/vg.Inch)
	if opts.Format == figure.PNG {
		size = fmt.Sprintf("%d x %d px at %d dpi",
			int(float64(opts.Page.Width/vg.Inch)*float64(opts.Page.DPI)+0.5),
			int(float64(opts.Page.Height/vg.Inch)*float64(opts.Page.DPI)+0.5), opts.Page.DPI)
	}
	fmt.Fprintf(&b, "wrote %s (%s, %s): %d mode lines, D/L %g..%g, f·D %.4g..%.4g %s, %s axes\n",
		opts.Output, strings.ToUpper(opts.Format.String()), size, len(ch.Lines), ch.RatioMin, ch.RatioMax,
		ch.FDMin/ch.Units.Scale(), ch.FDMax/ch.Units.Scale(), ch.Units, ch.Axes)
	c := opts.Spec.Cavity
	if c.Radius != 0 {
		what := "cavity"
		if opts.Sized {
			what = "sized cavity (" + opts.SizedBy + ")"
		}
		fmt.Fprintf(&b, "%s: D = %s, L = %s, D/L = %.4g", what,
			physics.FormatLength(c.Diameter(), 6), physics.FormatLength(c.Length, 6), c.Diameter()/c.Length)
		if c.Fill.Name != "" {
			fmt.Fprintf(&b, ", fill %s", c.Fill.Name)
		}
		b.WriteString("\n")
	}
	if ch.HasDesign {
		fmt.Fprintf(&b, "wanted: %v at %s\n", ch.WantedMode, physics.FormatFrequency(ch.DesignFreq, 6))
		if comp, ok := ch.WantedMode.Companion(); ok {
			fmt.Fprintf(&b, "exact companion on the same line: %v (no D/L separates them; suppress it by other means)\n", comp)
		}
		fmt.Fprintf(&b, "reachable D/L %.4g..%.4g; clearance %s\n", ch.Reach.RatioLo, ch.Reach.RatioHi, ch.Reach.Verdict())
		if err := ch.WantedMode.EndPlateTuning(); err != nil {
			fmt.Fprintf(&b, "tuning: %v\n", err)
		}
	}
	b.WriteString("mode index convention: n azimuthal, m radial, p axial\n")
	_, err := io.WriteString(w, b.String())
	return err
}

func list(s []string) string {
	if len(s) == 0 {
		return "none"
	}
	return strings.Join(s, ", ")
}
