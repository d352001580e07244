// Package report implements `cylcav report`: the datasheet of a cavity
// design as one self-contained HTML file (tables and inline SVG charts,
// printable to PDF from a browser), and optionally a PDF datasheet. The
// datasheet is assembled and rendered by library package datasheet; this
// command parses the flags and writes the files.
//
// It takes the same flags as `cylcav design` (cmdutil.ScenarioFlags) and
// solves the same problem through the same library call
// (design.Scenario.Run); with none of them it reports the built-in demo
// scenario (design.Demo).
package report

import (
	"bytes"
	"fmt"
	"strings"

	"github.com/spf13/cobra"

	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/datasheet"
	"cylcav/design"
	"cylcav/figure"
)

// Options are the parsed flags of `cylcav report`.
type Options struct {
	IO *cmdutil.IOStreams
	// Scenario is the design problem, parsed from the design flags.
	Scenario design.Scenario
	// Output is the HTML file; PDF, when not empty, the PDF datasheet.
	Output, PDF string
	Force       bool
}

// NewCmdReport returns `cylcav report`. runF, if not nil, replaces the
// command's work (tests use it to inspect the parsed options).
func NewCmdReport(ios *cmdutil.IOStreams, runF func(*Options) error) *cobra.Command {
	opts := &Options{IO: ios}
	var scenario *cmdutil.ScenarioFlags
	cmd := &cobra.Command{
		Use:   "report [design flags] -o FILE.html [--pdf FILE.pdf] [--force]",
		Short: "Write the datasheet of a design: one HTML file with charts (demo with no design flags)",
		Long: `Write the datasheet of a cavity design as one self-contained HTML file: the
dimensions and tolerances, the modes near the band, the Q0 breakdown, the
clearance, the sensitivities and thermal drift, the tolerance spread, the
tuning curve, the materials with their sources, the index convention and
the cautions, with the mode chart, the design trade-off (clearance and Q0
against D/L), the tuning curve and Q0 against frequency as inline SVG
charts. The file needs nothing else to display and prints cleanly to PDF
from a browser (A4 or Letter). --pdf also writes a PDF datasheet directly.

The design flags are those of 'cylcav design' and mean the same; the design
is solved by the same library call. With superconducting walls or the
accelerator flags (--superconducting, --temperature, --gradient,
--beam-current, --hom-max, ...) the datasheet gains the section
"Operating figures": the Q0 split, the bench frequencies
and dimensions to machine, the figures at the gradient with the heat load
and field margins, the beam coupling and the mode table, with the cautions
on cryogenics, high power and radiation. With no design flag the built-in demo
scenario is reported, and the datasheet says so.

Files are written whole or not at all; an existing file is replaced only
with --force.

Mode index convention: TE_nmp / TM_nmp, n azimuthal, m radial, p axial.`,
		Example: `  # The datasheet of the built-in demo scenario
  $ cylcav report -o datasheet.html
  wrote datasheet.html (HTML datasheet, 4 charts): demo scenario, TE011 at 10.5 GHz, D = 40.2443 mm, L = 28.4503 mm

  # The built-in superconducting TM010 cell at 2 K (invented scenario)
  $ cylcav report --demo cell -o cell.html

  # A copper TE011 cavity at 10 GHz, +-1 % tuning, as HTML and PDF
  $ cylcav report --mode TE011 --freq 10GHz --wall copper --tuning 1% \
      --tolerance 0.02mm -o sheet.html --pdf sheet.pdf`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if opts.Output == "" {
				return cmdutil.Usagef("missing -o/--output, the HTML file to write (e.g. -o datasheet.html)")
			}
			if !strings.HasSuffix(strings.ToLower(opts.Output), ".html") && !strings.HasSuffix(strings.ToLower(opts.Output), ".htm") {
				return cmdutil.FlagError("output", opts.Output, fmt.Errorf("the datasheet is HTML: end the file name in .html"))
			}
			if opts.PDF != "" && !strings.HasSuffix(strings.ToLower(opts.PDF), ".pdf") {
				return cmdutil.FlagError("pdf", opts.PDF, fmt.Errorf("end the file name in .pdf"))
			}
			files := []cmdutil.File{{Flag: "output", Path: opts.Output}}
			if opts.PDF != "" {
				files = append(files, cmdutil.File{Flag: "pdf", Path: opts.PDF})
			}
			if err := cmdutil.CheckFiles(opts.Force, files...); err != nil {
				return err
			}
			sc, err := scenario.Scenario()
			if err != nil {
				return err
			}
			opts.Scenario = sc
			if runF != nil {
				return runF(opts)
			}
			return runReport(opts)
		},
	}
	// The design command's flags, defined in one place for both commands;
	// design's --format has no meaning here.
	scenario = cmdutil.AddScenarioFlags(cmd)
	cmd.Flags().StringVarP(&opts.Output, "output", "o", "", "HTML datasheet to write (.html)")
	cmd.Flags().StringVar(&opts.PDF, "pdf", "", "also write a PDF datasheet (.pdf)")
	cmd.Flags().BoolVar(&opts.Force, "force", false, "replace existing files")
	return cmd
}

func runReport(opts *Options) error {
	r, err := cmdutil.RunScenario(opts.IO, opts.Scenario)
	if err != nil {
		return err // an impossible design exits with status 1
	}
	sh, err := datasheet.FromDesign(r, figure.DefaultTheme())
	if err != nil {
		return err
	}
	sh.Version = cmdutil.Version
	if opts.Scenario.Title != "" {
		sh.Notice = &datasheet.Notice{Lead: "Demo scenario", Parts: []datasheet.Span{
			{Text: "This datasheet was made by "}, {Text: "cylcav report", Code: true},
			{Text: " from a built-in invented scenario (no design flags, or --demo). Give the flags of "},
			{Text: "cylcav design", Code: true}, {Text: " to report your own design."},
		}}
	}
	var html, pdf bytes.Buffer
	if err := sh.WriteHTML(&html); err != nil {
		return err
	}
	if opts.PDF != "" {
		if err := sh.WritePDF(&pdf); err != nil {
			return err
		}
	}
	// Both files are rendered before either is written, and WriteFiles
	// writes both or neither.
	files := []cmdutil.File{{Flag: "output", Path: opts.Output, Data: html.Bytes()}}
	if opts.PDF != "" {
		files = append(files, cmdutil.File{Flag: "pdf", Path: opts.PDF, Data: pdf.Bytes()})
	}
	if err := cmdutil.WriteFiles(opts.Force, files...); err != nil {
		return err
	}
	what := "design"
	if opts.Scenario.Title != "" {
		what = "demo scenario"
	}
	extra := ""
	if opts.PDF != "" {
		extra = " and " + opts.PDF + " (PDF datasheet)"
	}
	_, err = fmt.Fprintf(opts.IO.Out, "wrote %s (HTML datasheet, %d charts)%s: %s, %s\nmode index convention: n azimuthal, m radial, p axial\n",
		opts.Output, len(sh.Charts()), extra, what, sh.Headline)
	return err
}
