// Package clearance implements `cylcav clearance`: the spurious-mode
// clearance of a wanted mode in a given cavity.
package clearance

import (
	"fmt"

	"github.com/spf13/cobra"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/physics"
)

// Options holds the parsed flags of `cylcav clearance`.
type Options struct {
	IO *cmdutil.IOStreams

	Mode   cavity.Mode
	Cavity cavity.Cavity
	Window cavity.ClearanceOptions
	// WindowText is --window as given, for error messages.
	WindowText string
	Format     cmdutil.Format
}

// NewCmdClearance returns `cylcav clearance`. runF, when not nil, replaces
// the run step (for tests of flag parsing).
func NewCmdClearance(io *cmdutil.IOStreams, runF func(*Options) error) *cobra.Command {
	opts := &Options{IO: io}
	var window *cmdutil.Window
	var checkFormat func() error
	var geo *cmdutil.GeometryFlags
	cmd := &cobra.Command{
		Use:   "clearance --mode MODE (--diameter D | --radius A) --length L [flags]",
		Short: "Show the spurious-mode clearance of a wanted mode",
		Long: `Show how far every other resonance lies from a wanted mode of a cavity.

The clearance is the smallest |f_i - f_w| / f_w over all other modes i. The
exact companion of the wanted mode (TE0mp with TM1mp, equal in every
cylinder) is left out and listed as degenerate: it needs suppression by a
mode trap or a non-contacting plunger gap, not by the choice of D/L. Give
--count-degenerate to count it (the clearance is then zero).

Also shown: the nearest spurious mode below and above, the spurious-free
window between them, and every mode within --window (a percentage of the
wanted frequency, or a frequency such as 500MHz).

Mode index convention: TE_nmp / TM_nmp, n azimuthal, m radial, p axial.`,
		Example: `  # An air-filled TE011 cavity 40 mm across and 30 mm long
  $ cylcav clearance --mode TE011 --diameter 40mm --length 30mm --fill air --window 15%

  # The same cavity filled with PTFE, as JSON
  $ cylcav clearance --mode TE011 --diameter 40mm --length 30mm --fill ptfe --format json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			var err error
			if opts.Cavity, err = geo.Cavity(); err != nil {
				return err
			}
			opts.WindowText = window.String()
			if err := checkFormat(); err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return runClearance(opts)
		},
	}
	f := cmd.Flags()
	cmdutil.ModeVar(f, &opts.Mode, "mode", "wanted mode, e.g. TE011 (required)")
	geo = cmdutil.AddGeometryFlags(cmd, cmdutil.Geometry{
		Diameter:    "inside diameter, e.g. 40mm",
		Radius:      "inside radius (instead of --diameter)",
		Length:      "inside length between the end plates, e.g. 30mm (required)",
		Fill:        "fill dielectric: a library name (air, ptfe, ...) or eps=2.1,tand=3e-4 (default vacuum)",
		CobraChecks: true,
	})
	window = cmdutil.WindowVar(f, &opts.Window, "window", "10%", "list modes within this distance: a percentage or a frequency")
	f.BoolVar(&opts.Window.CountDegenerate, "count-degenerate", false, "count the exact TE0mp/TM1mp companion in the clearance")
	checkFormat = cmdutil.FormatFlag(cmd, &opts.Format)
	_ = cmd.MarkFlagRequired("mode")
	return cmd
}

func runClearance(opts *Options) error {
	if f := opts.Cavity.Frequency(opts.Mode); opts.Window.WindowHz > cavity.MaxWindow*f {
		return cmdutil.FlagError("window", opts.WindowText, fmt.Errorf("must be between 0 Hz and %g times the wanted frequency (%s)",
			cavity.MaxWindow, physics.FormatFrequency(cavity.MaxWindow*f, 5)))
	}
	cl, err := opts.Cavity.Clearance(opts.Mode, opts.Window)
	if err != nil {
		return cmdutil.Usagef("%v", err)
	}
	switch opts.Format {
	case cmdutil.JSON:
		return cmdutil.WriteJSON(opts.IO.Out, JSON(cl))
	case cmdutil.CSV:
		rows := [][]string{}
		for _, nb := range cl.InWindow {
			rows = append(rows, []string{nb.Mode.String(), g(nb.Frequency), g(nb.Offset), g(100 * nb.Relative)})
		}
		return cmdutil.WriteCSV(opts.IO.Out, []string{"mode", "f_hz", "offset_hz", "offset_pct"}, rows)
	}
	return writeTable(opts, cl)
}

func g(v float64) string { return fmt.Sprintf("%.10g", v) }

// WindowMode is the JSON form of a mode in the window.
type WindowMode struct {
	Mode      string  `json:"mode"`
	FHz       float64 `json:"f_hz"`
	OffsetPct float64 `json:"offset_pct"`
}

// Output is the JSON document of `cylcav clearance`.
type Output struct {
	Mode         string             `json:"mode"`
	FHz          float64            `json:"f_hz"`
	ClearancePct float64            `json:"clearance_pct"`
	Below        *cmdutil.Neighbour `json:"below"`
	Above        *cmdutil.Neighbour `json:"above"`
	Degenerate   []string           `json:"degenerate"`
	InWindow     []WindowMode       `json:"in_window"`
}

// JSON returns the JSON document for a clearance.
func JSON(cl cavity.Clearance) Output {
	o := Output{
		Mode: cl.Mode.String(), FHz: cl.Frequency, ClearancePct: 100 * cl.Value,
		Below: cmdutil.NeighbourJSON(cl.Below), Above: cmdutil.NeighbourJSON(cl.Above),
		Degenerate: cmdutil.DegenerateJSON(cl.Degenerate), InWindow: []WindowMode{},
	}
	for _, nb := range cl.InWindow {
		o.InWindow = append(o.InWindow, WindowMode{Mode: nb.Mode.String(), FHz: nb.Frequency, OffsetPct: 100 * nb.Relative})
	}
	return o
}

func writeTable(opts *Options, cl cavity.Clearance) error {
	w := opts.IO.Out
	c := opts.Cavity
	fmt.Fprintf(w, "Cavity: D = %s, L = %s, D/L = %.4f, fill %s (eps_r %.4g)\n",
		physics.FormatLength(c.Diameter(), 5), physics.FormatLength(c.Length, 5), c.Diameter()/c.Length, c.Fill.Label(), c.Fill.Eps())
	fmt.Fprintf(w, "Wanted mode %s at %s (n azimuthal, m radial, p axial)\n", cl.Mode, physics.FormatFrequency(cl.Frequency, 7))
	fmt.Fprintf(w, "Clearance: %.3f %% (set by %s)\n", 100*cl.Value, cl.Limiting)
	fmt.Fprint(w, cmdutil.FormatNeighbours(cl))
	if len(cl.InWindow) > 0 {
		win := max(opts.Window.Window, opts.Window.WindowHz/cl.Frequency)
		fmt.Fprintf(w, "\nModes within +-%.4g %%:\n", 100*win)
		t := cmdutil.NewTable(w, "mode", "f", "offset", "offset %")
		for _, nb := range cl.InWindow {
			t.Row(nb.Mode.String(), physics.FormatFrequency(nb.Frequency, 7), signed(physics.FormatFrequency(abs(nb.Offset), 5), nb.Offset), fmt.Sprintf("%+.3f", 100*nb.Relative))
		}
		return t.Flush()
	}
	return nil
}

func signed(s string, v float64) string {
	if v < 0 {
		return "-" + s
	}
	return "+" + s
}

func abs(v float64) float64 {
	if v < 0 {
		return -v
	}
	return v
}
