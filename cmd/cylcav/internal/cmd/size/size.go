// Package size implements `cylcav size`: the dimensions that put a chosen
// mode at a target frequency.
package size

import (
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/physics"
)

// Options are the parsed and validated flags of `cylcav size`.
type Options struct {
	IO *cmdutil.IOStreams

	Mode      cavity.Mode
	Frequency float64 // Hz
	Fill      physics.Medium
	By        cavity.Constraint
	// FreqText, ByFlag and ByValue are --freq as given and the
	// constraint's flag and text as given, for error messages.
	FreqText, ByFlag, ByValue string

	Format cmdutil.Format
}

// NewCmdSize returns `cylcav size`. runF, if not nil, replaces the
// command's work (tests use it to inspect the parsed options).
func NewCmdSize(ios *cmdutil.IOStreams, runF func(*Options) error) *cobra.Command {
	opts := &Options{IO: ios}
	var freq, ratio *cmdutil.Quantity
	var r float64 // --ratio
	var checkFormat func() error
	var geo *cmdutil.GeometryFlags
	cmd := &cobra.Command{
		Use:   "size --mode MODE --freq F (--ratio R | --diameter D | --length L) [--fill SPEC]",
		Short: "Find the cavity dimensions that put a mode at a target frequency",
		Long: `Find the radius and length of a closed circular cylinder in which a chosen
TE or TM mode resonates at a target frequency, given one more dimension:
the ratio R = D/L of diameter to length, the diameter, or the length.

Index convention: TE_nmp and TM_nmp with n azimuthal (cos n phi), m radial
(m-th zero of J'_n for TE, of J_n for TM), p axial (half-wavelengths along
the length). TE modes need p >= 1. For p = 0 (TM010, TM110, ...) the
frequency does not depend on the length: with --length any length works,
and a --diameter fixes the frequency by itself.

A target that cannot be met (a diameter below the mode's cutoff, a length
shorter than p half-wavelengths) is an error that names the least value
that works. --fill takes a material name (ptfe, alumina, ...) or values
eps=2.08[,mu=1]; the default is vacuum.`,
		Example: `  # A PTFE-filled TE011 cavity for 5 GHz with D = L
  $ cylcav size --mode TE011 --freq 5GHz --ratio 1 --fill ptfe
  TE011 at 5 GHz, D/L = 1, fill ptfe (eps_r 2.08, mu_r 1)
  n azimuthal, m radial, p axial
  radius    27.4008 mm
  diameter  54.8016 mm
  length    54.8016 mm
  D/L       1

  # The same mode in air, in a 40 mm diameter, as JSON
  $ cylcav size --mode TE011 --freq 10GHz --diameter 40mm --format json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			var err error
			fl := cmd.Flags()
			if !fl.Changed("mode") {
				return cmdutil.Usagef("missing --mode, the mode to size (e.g. --mode TE011)")
			}
			if !fl.Changed("freq") {
				return cmdutil.Usagef("missing --freq, the target resonant frequency (e.g. --freq 5GHz)")
			}
			opts.FreqText = freq.Text()
			var given []string
			for _, name := range []string{"ratio", "diameter", "length"} {
				if fl.Changed(name) {
					given = append(given, "--"+name)
				}
			}
			switch len(given) {
			case 0:
				return cmdutil.Usagef("missing the second dimension: give one of --ratio (D/L), --diameter or --length")
			case 1:
			default:
				return cmdutil.Usagef("%s given; give exactly one of --ratio, --diameter or --length", strings.Join(given, " and "))
			}
			switch given[0] {
			case "--ratio":
				opts.By, opts.ByFlag, opts.ByValue = cavity.ByRatio(r), "ratio", ratio.Text()
			case "--diameter":
				var d float64
				if d, err = geo.Diameter(); err != nil {
					return err
				}
				opts.By, opts.ByFlag, opts.ByValue = cavity.ByDiameter(d), "diameter", geo.Text("diameter")
			case "--length":
				var l float64
				if l, err = geo.Length(); err != nil {
					return err
				}
				opts.By, opts.ByFlag, opts.ByValue = cavity.ByLength(l), "length", geo.Text("length")
			}
			if opts.Fill, err = geo.Fill(); err != nil {
				return err
			}
			if err := checkFormat(); err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return runSize(opts)
		},
	}
	fl := cmd.Flags()
	cmdutil.ModeVar(fl, &opts.Mode, "mode", "mode to size: TE011, TM010, TE(12,3,1), ...")
	freq = cmdutil.FrequencyVar(fl, &opts.Frequency, "freq", "target resonant frequency (e.g. 5GHz)", cmdutil.MinFrequency, cmdutil.MaxFrequency)
	ratio = cmdutil.NumberVar(fl, &r, "ratio", "fix the ratio D/L of diameter to length", cavity.MinRatio, cavity.MaxRatio)
	geo = cmdutil.AddGeometryFlags(cmd, cmdutil.Geometry{
		Diameter: "fix the inner diameter D (e.g. 40mm)",
		Length:   "fix the inner length L (e.g. 30mm)",
		Fill:     "fill: material name or eps=E[,mu=M] (default vacuum)",
	})
	checkFormat = cmdutil.FormatFlag(cmd, &opts.Format)
	_ = cmd.RegisterFlagCompletionFunc("mode", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return []string{"TE011", "TE111", "TM010", "TM011", "TE013", "TM110"}, cobra.ShellCompDirectiveNoFileComp
	})
	return cmd
}

// Result is the output of `cylcav size`; JSON keys and CSV headers are the
// snake_case names. New quantities are new fields here and in writeCSV.
type Result struct {
	Mode      string  `json:"mode"`
	FHz       float64 `json:"f_hz"`
	RadiusM   float64 `json:"radius_m"`
	DiameterM float64 `json:"diameter_m"`
	LengthM   float64 `json:"length_m"`
	RatioDL   float64 `json:"ratio_d_over_l"`
	EpsR      float64 `json:"eps_r"`
	// EpsRParallel is eps_par of a uniaxial fill (eps_r is then
	// eps_perp); absent for an isotropic fill.
	EpsRParallel float64 `json:"eps_r_parallel,omitempty"`
	MuR          float64 `json:"mu_r"`
}

func runSize(opts *Options) error {
	c, err := cavity.Size(opts.Mode, opts.Frequency, opts.Fill, opts.By)
	if errors.Is(err, cavity.ErrInfeasible) {
		// The target is the pair (frequency, constraint): name both flags.
		return cmdutil.Usagef("--freq %q with --%s %q: %w", opts.FreqText, opts.ByFlag, opts.ByValue, err)
	}
	if err != nil {
		return err
	}
	res := Result{
		Mode: opts.Mode.String(), FHz: opts.Frequency,
		RadiusM: c.Radius, DiameterM: c.Diameter(), LengthM: c.Length, RatioDL: c.Diameter() / c.Length,
		EpsR: c.Fill.Eps(), EpsRParallel: c.Fill.UniaxialPar(), MuR: c.Fill.Mu(),
	}
	w := opts.IO.Out
	switch opts.Format {
	case cmdutil.JSON:
		return cmdutil.WriteJSON(w, res)
	case cmdutil.CSV:
		g := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
		head := []string{"mode", "f_hz", "radius_m", "diameter_m", "length_m", "ratio_d_over_l", "eps_r", "mu_r"}
		row := []string{res.Mode, g(res.FHz), g(res.RadiusM), g(res.DiameterM), g(res.LengthM), g(res.RatioDL), g(res.EpsR), g(res.MuR)}
		if res.EpsRParallel != 0 {
			head, row = append(head, "eps_r_parallel"), append(row, g(res.EpsRParallel))
		}
		return cmdutil.WriteCSV(w, head, [][]string{row})
	}
	return writeTable(w, opts, c, res)
}

func writeTable(w io.Writer, opts *Options, c cavity.Cavity, res Result) error {
	name := c.Fill.Label()
	fill := fmt.Sprintf("fill %s (%s, mu_r %g)", name, c.Fill.EpsText(), res.MuR)
	if name == "user" {
		fill = fmt.Sprintf("fill %s, mu_r %g", c.Fill.EpsText(), res.MuR)
	}
	by := opts.By.String()
	if _, err := fmt.Fprintf(w, "%s at %s, %s, %s\nn azimuthal, m radial, p axial\n",
		res.Mode, cmdutil.TrimZeros(physics.FormatFrequency(res.FHz, 6)), by, fill); err != nil {
		return err
	}
	t := cmdutil.NewTable(w)
	t.Row("radius", physics.FormatLength(c.Radius, 6))
	t.Row("diameter", physics.FormatLength(c.Diameter(), 6))
	t.Row("length", physics.FormatLength(c.Length, 6))
	t.Row("D/L", strconv.FormatFloat(res.RatioDL, 'g', 6, 64))
	if err := t.Flush(); err != nil {
		return err
	}
	if opts.Mode.P == 0 {
		_, err := fmt.Fprintf(w, "note: %s has p = 0; its frequency does not depend on the length, so any length works\n", res.Mode)
		return err
	}
	return nil
}
