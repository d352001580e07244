// Package materials implements `cylcav materials`: the wall-metal and fill
// library with the source of every row.
package materials

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/physics"
)

// Kind selects which part of the library to list.
type Kind string

// The kinds; All (the zero value) lists both.
const (
	All        Kind = ""
	Conductor  Kind = "conductor"
	Dielectric Kind = "dielectric"
)

// Options are the validated inputs of `cylcav materials`.
type Options struct {
	IO     *cmdutil.IOStreams
	Kind   Kind
	Format cmdutil.Format
}

// NewCmdMaterials returns `cylcav materials`. runF, when not nil, replaces
// the default run function (for tests).
func NewCmdMaterials(io *cmdutil.IOStreams, runF func(*Options) error) *cobra.Command {
	opts := &Options{IO: io}
	cmd := &cobra.Command{
		Use:   "materials",
		Short: "List the wall metals and fill dielectrics with their sources",
		Long: `List the material library: wall metals (conductivity at 20 C, resistivity
temperature coefficient, permeability, thermal expansion) and fill
dielectrics (permittivity, loss tangent and the frequency it holds at,
temperature coefficient of permittivity where known), each row with its
source. Use a name from the NAME column with --wall or --fill, or give
your own values (--wall sigma=5.8e7, --wall iacs=61%, --fill eps=2.08,tand=4e-4).

Values recalled from handbooks say so in their source; measured values of
your own stock are better.`,
		Example: `  # everything, as tables with numbered sources
  $ cylcav materials

  # only the fill dielectrics, as JSON (SI units, snake_case keys)
  $ cylcav materials --kind dielectric --format json

  # the wall metals as CSV for a spreadsheet
  $ cylcav materials --kind conductor --format csv`,
		Args: cobra.NoArgs,
	}
	checkFormat := cmdutil.FormatFlag(cmd, &opts.Format)
	cmdutil.EnumVar(cmd.Flags(), &opts.Kind, "kind", "", "list only one kind: conductor|dielectric", "kind",
		cmdutil.Choice[Kind]{Word: "conductor", Value: Conductor, Also: []string{"conductors", "wall"}},
		cmdutil.Choice[Kind]{Word: "dielectric", Value: Dielectric, Also: []string{"dielectrics", "fill"}})
	_ = cmd.RegisterFlagCompletionFunc("kind", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return []string{"conductor", "dielectric"}, cobra.ShellCompDirectiveNoFileComp
	})
	cmd.RunE = func(cmd *cobra.Command, args []string) error {
		if err := checkFormat(); err != nil {
			return err
		}
		if runF != nil {
			return runF(opts)
		}
		return runMaterials(opts)
	}
	return cmd
}

// conductorJSON is one wall-metal row of the JSON output. Unknown values are
// null.
type conductorJSON struct {
	Name              string   `json:"name"`
	Aliases           []string `json:"aliases"`
	Description       string   `json:"description"`
	ConductivitySPerM float64  `json:"conductivity_s_per_m"`
	IACSFraction      float64  `json:"iacs_fraction"`
	AlphaPerK         *float64 `json:"alpha_per_k"`
	LinearTMinK       float64  `json:"linear_t_min_k"`
	LinearTMaxK       float64  `json:"linear_t_max_k"`
	MuR               float64  `json:"mu_r"`
	ExpansionPerK     *float64 `json:"expansion_per_k"`
	// ContractionSource names the published cryogenic contraction data
	// (physics.Conductor.Strain), null without; StrainMinK..StrainMaxK is
	// the range of the thermal strain model, null without any data.
	ContractionSource    *string  `json:"contraction_source"`
	StrainMinK           *float64 `json:"strain_min_k"`
	StrainMaxK           *float64 `json:"strain_max_k"`
	ElectronDensityPerM3 *float64 `json:"electron_density_per_m3"`
	Ferromagnetic        bool     `json:"ferromagnetic"`
	Note                 string   `json:"note"`
	Source               string   `json:"source"`
}

// dielectricJSON is one fill row of the JSON output. Unknown values are null.
type dielectricJSON struct {
	Name           string   `json:"name"`
	Aliases        []string `json:"aliases"`
	Description    string   `json:"description"`
	EpsR           float64  `json:"eps_r"`
	TanDelta       float64  `json:"tan_delta"`
	TanDeltaFreqHz *float64 `json:"tan_delta_freq_hz"`
	MuR            float64  `json:"mu_r"`
	TanDeltaM      float64  `json:"tan_delta_m"`
	TCEpsPerK      *float64 `json:"tc_eps_per_k"`
	Note           string   `json:"note"`
	Source         string   `json:"source"`
}

// libraryJSON is the whole JSON output; a kind not listed is omitted.
type libraryJSON struct {
	Conductors  []conductorJSON  `json:"conductors,omitempty"`
	Dielectrics []dielectricJSON `json:"dielectrics,omitempty"`
}

func ptr(v float64, known bool) *float64 {
	if !known {
		return nil
	}
	return &v
}

func conductorRows() []conductorJSON {
	var rows []conductorJSON
	for _, c := range physics.Conductors() {
		lo, hi := c.TMin, c.TMax
		if lo == 0 && hi == 0 {
			lo, hi = physics.DefaultLinearTMin, physics.DefaultLinearTMax
		}
		rows = append(rows, conductorJSON{
			Name: c.Name, Aliases: c.Aliases, Description: c.Description,
			ConductivitySPerM: c.Conductivity, IACSFraction: c.IACS(),
			AlphaPerK: ptr(c.Alpha, c.AlphaKnown), LinearTMinK: lo, LinearTMaxK: hi,
			MuR: c.Mu(), ExpansionPerK: ptr(c.Expansion, c.Expansion != 0),
			ElectronDensityPerM3: ptr(c.ElectronDensity, c.ElectronDensity != 0),
			Ferromagnetic:        c.Ferromagnetic, Note: c.Note, Source: c.Source,
		})
		r := &rows[len(rows)-1]
		if c.Contraction.Known() {
			src := c.Contraction.Source
			r.ContractionSource = &src
		}
		if slo, shi, ok := c.StrainRange(); ok {
			r.StrainMinK, r.StrainMaxK = ptr(slo, true), ptr(shi, true)
		}
	}
	return rows
}

func dielectricRows() []dielectricJSON {
	var rows []dielectricJSON
	for _, d := range physics.Dielectrics() {
		rows = append(rows, dielectricJSON{
			Name: d.Name, Aliases: d.Aliases, Description: d.Description,
			EpsR: d.EpsR, TanDelta: d.TanDelta, TanDeltaFreqHz: ptr(d.TanDeltaFreq, d.TanDeltaFreq != 0),
			MuR: d.Mu(), TanDeltaM: d.TanDeltaM, TCEpsPerK: ptr(d.TCEps, d.TCEpsKnown),
			Note: d.Note, Source: d.Source,
		})
	}
	return rows
}

func runMaterials(opts *Options) error {
	var lib libraryJSON
	if opts.Kind != Dielectric {
		lib.Conductors = conductorRows()
	}
	if opts.Kind != Conductor {
		lib.Dielectrics = dielectricRows()
	}
	switch opts.Format {
	case cmdutil.JSON:
		return cmdutil.WriteJSON(opts.IO.Out, lib)
	case cmdutil.CSV:
		return writeCSV(opts, lib)
	}
	return writeTables(opts, lib)
}

// csvHeader is the CSV header: one row per material, kind first; columns
// that do not apply to a kind are empty.
var csvHeader = []string{"kind", "name", "aliases", "description",
	"conductivity_s_per_m", "iacs_fraction", "alpha_per_k", "linear_t_min_k", "linear_t_max_k", "mu_r", "expansion_per_k",
	"electron_density_per_m3", "ferromagnetic",
	"eps_r", "tan_delta", "tan_delta_freq_hz", "tan_delta_m", "tc_eps_per_k",
	"note", "source"}

func num(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

func optNum(p *float64) string {
	if p == nil {
		return ""
	}
	return num(*p)
}

func writeCSV(opts *Options, lib libraryJSON) error {
	var rows [][]string
	for _, c := range lib.Conductors {
		rows = append(rows, []string{"conductor", c.Name, strings.Join(c.Aliases, " "), c.Description,
			num(c.ConductivitySPerM), num(c.IACSFraction), optNum(c.AlphaPerK), num(c.LinearTMinK), num(c.LinearTMaxK),
			num(c.MuR), optNum(c.ExpansionPerK), optNum(c.ElectronDensityPerM3), strconv.FormatBool(c.Ferromagnetic),
			"", "", "", "", "", c.Note, c.Source})
	}
	for _, d := range lib.Dielectrics {
		rows = append(rows, []string{"dielectric", d.Name, strings.Join(d.Aliases, " "), d.Description,
			"", "", "", "", "", num(d.MuR), "", "", "",
			num(d.EpsR), num(d.TanDelta), optNum(d.TanDeltaFreqHz), num(d.TanDeltaM), optNum(d.TCEpsPerK),
			d.Note, d.Source})
	}
	return cmdutil.WriteCSV(opts.IO.Out, csvHeader, rows)
}

// sources numbers distinct source strings in order of first use.
type sources struct {
	list  []string
	index map[string]int
}

func (s *sources) ref(src string) string {
	if s.index == nil {
		s.index = map[string]int{}
	}
	i, ok := s.index[src]
	if !ok {
		s.list = append(s.list, src)
		i = len(s.list)
		s.index[src] = i
	}
	return fmt.Sprintf("[%d]", i)
}

func orDash(p *float64, f func(float64) string) string {
	if p == nil {
		return "-"
	}
	return f(*p)
}

// cold returns the table cell naming a metal's cryogenic contraction data
// with their source reference, or "-" (then the linear coefficient holds
// from -50 C only).
func cold(c conductorJSON, src *sources) string {
	if c.ContractionSource == nil {
		return "-"
	}
	return "to 0 K " + src.ref(*c.ContractionSource)
}

func writeTables(opts *Options, lib libraryJSON) error {
	out := opts.IO.Out
	var src sources
	if len(lib.Conductors) > 0 {
		fmt.Fprintln(out, "Wall metals (values at 20 C; linear resistivity model -50 C to +200 C; thermal strain from the CTE -50 C to +200 C, below -50 C from cold contraction data only)")
		t := cmdutil.NewTable(out, "NAME", "DESCRIPTION", "SIGMA", "IACS", "ALPHA (1/K)", "CTE (ppm/K)", "SOURCE", "COLD CONTRACTION")
		for _, c := range lib.Conductors {
			desc := c.Description
			if c.Ferromagnetic {
				desc += " (ferromagnetic)"
			}
			t.Row(c.Name, desc, physics.FormatSI(c.ConductivitySPerM, "S/m", 4),
				fmt.Sprintf("%.1f %%", 100*c.IACSFraction),
				orDash(c.AlphaPerK, func(v float64) string { return fmt.Sprintf("%.3g", v) }),
				orDash(c.ExpansionPerK, func(v float64) string { return fmt.Sprintf("%.3g", v*1e6) }),
				src.ref(c.Source), cold(c, &src))
		}
		if err := t.Flush(); err != nil {
			return err
		}
	}
	if len(lib.Dielectrics) > 0 {
		if len(lib.Conductors) > 0 {
			fmt.Fprintln(out)
		}
		fmt.Fprintln(out, "Fill dielectrics (room temperature)")
		t := cmdutil.NewTable(out, "NAME", "DESCRIPTION", "EPS_R", "TAN DELTA", "AT", "TC EPS (ppm/K)", "SOURCE")
		for _, d := range lib.Dielectrics {
			at := "-"
			if d.TanDeltaFreqHz != nil {
				at = physics.FormatFrequency(*d.TanDeltaFreqHz, 2)
			}
			t.Row(d.Name, d.Description, strconv.FormatFloat(d.EpsR, 'g', 6, 64), strconv.FormatFloat(d.TanDelta, 'g', 3, 64), at,
				orDash(d.TCEpsPerK, func(v float64) string { return fmt.Sprintf("%.3g", v*1e6) }),
				src.ref(d.Source))
		}
		if err := t.Flush(); err != nil {
			return err
		}
	}
	fmt.Fprintln(out, "\nSources:")
	for i, s := range src.list {
		fmt.Fprintf(out, "[%d] %s\n", i+1, s)
	}
	_, err := fmt.Fprintln(out, "\nNames accept aliases and ignore case (cu, ofhc, al6061, ss304, ptfe); give measured values with --wall sigma=... or --fill eps=...,tand=...")
	return err
}
