// Package modes implements `cylcav modes`: the resonant modes of a closed
// circular cylinder, sorted by frequency.
package modes

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/physics"
	"cylcav/qfactor"
)

// DefaultCount is the number of modes listed when neither --fmax nor
// --count is given.
const DefaultCount = 20

// DefaultDigits is the number of significant digits of table frequencies:
// 4.5897 GHz, 100 kHz steps at 10 GHz.
const DefaultDigits = 5

// Options are the parsed and validated flags of `cylcav modes`.
type Options struct {
	IO *cmdutil.IOStreams

	// Cavity is the cavity; its fill's Name is a library name, "user" for
	// values given as eps=..., or "" for the default (vacuum).
	Cavity cavity.Cavity
	// FMax, when > 0, lists every mode at or below it (Hz); otherwise
	// Count modes are listed.
	FMax  float64
	Count int
	// FMaxText is --fmax as given, for error messages.
	FMaxText string
	// Digits is the number of significant digits of the frequencies in
	// the table (JSON and CSV always carry full precision).
	Digits int

	// Walls, when not nil (--wall given), adds q_wall, q_fill and q0
	// columns.
	Walls *qfactor.WallSet

	Format cmdutil.Format
}

// NewCmdModes returns `cylcav modes`. runF, if not nil, replaces the
// command's work (tests use it to inspect the parsed options).
func NewCmdModes(ios *cmdutil.IOStreams, runF func(*Options) error) *cobra.Command {
	opts := &Options{IO: ios}
	var fmax *cmdutil.Quantity
	var checkFormat func() error
	var geo *cmdutil.GeometryFlags
	var walls *cmdutil.WallFlags
	cmd := &cobra.Command{
		Use:   "modes (--diameter D | --radius A) --length L [--fill SPEC] [--fmax F | --count K]",
		Short: "List the resonant modes of a cylindrical cavity, sorted by frequency",
		Long: fmt.Sprintf(`List the TE and TM resonant modes of a closed circular cylinder with
perfectly conducting walls, sorted by frequency: every mode up to --fmax,
or the lowest --count modes (default %d when neither is given).

Index convention: TE_nmp and TM_nmp with n azimuthal (cos n phi), m radial
(m-th zero of J'_n for TE, of J_n for TM), p axial (half-wavelengths along
the length). A mode with n >= 1 has two polarisations (degeneracy 2) and
is listed once. TE0mp and TM1mp always resonate together and are listed
as degenerate with each other, TE first. --count counts listed modes;
modes tied exactly with the last one are listed too.

--fill takes a material name (ptfe, alumina, ...) or values
eps=2.08[,mu=1]; the default is vacuum. Lengths take m, cm, mm, um, in or
mil; frequencies Hz, kHz, MHz or GHz; a bare number needs a unit. Table output
uses friendly units, frequencies to --digits significant digits (default
5); JSON and CSV use hertz and metres at full precision.

With --wall (a metal, as in 'cylcav q') each mode gains its unloaded Q:
q_wall from the wall loss, q_fill from the loss tangent of --fill (e.g.
--fill eps=2.08,tand=4e-4), and q0; a Q with no loss behind it is "inf" in
the table, empty in CSV and null in JSON. See 'cylcav q' for one mode in
detail.`, DefaultCount),
		Example: `  # The 14 lowest modes of an empty (vacuum) 50 mm x 50 mm cavity
  $ cylcav modes --diameter 50mm --length 50mm --count 14
  cavity: radius 25 mm, diameter 50 mm, length 50 mm, fill vacuum (eps_r 1, mu_r 1)
  modes TE_nmp / TM_nmp: n azimuthal, m radial, p axial; the 14 lowest
  #   mode   family  n  m  p  f           degeneracy  degenerate with
  1   TM010  TM      0  1  0  4.5897 GHz  1
  2   TE111  TE      1  1  1  4.6190 GHz  2
  3   TM011  TM      0  1  1  5.4821 GHz  1
  ...
  12  TE012  TE      0  1  2  9.4567 GHz  1           TM112
  13  TM112  TM      1  1  2  9.4567 GHz  2           TE012
  14  TE113  TE      1  1  3  9.6559 GHz  2

  # Every mode up to 8 GHz of a PTFE-filled cavity, as JSON
  $ cylcav modes --radius 27.4mm --length 54.8mm --fill ptfe --fmax 8GHz --format json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			var err error
			if opts.Cavity, err = geo.Cavity(); err != nil {
				return err
			}
			fl := cmd.Flags()
			switch {
			case fl.Changed("fmax") && fl.Changed("count"):
				return cmdutil.Usagef("--fmax and --count both given; give one of them")
			case fl.Changed("fmax"):
				opts.FMaxText = fmax.Text()
			case fl.Changed("count"):
			default:
				opts.Count = DefaultCount
			}
			if opts.Walls, err = parseWalls(walls); err != nil {
				return err
			}
			if err := checkFormat(); err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return runModes(opts)
		},
	}
	geo = cmdutil.AddGeometryFlags(cmd, cmdutil.Geometry{
		Diameter: "inner diameter D = 2a (e.g. 50mm)",
		Radius:   "inner radius a (instead of --diameter)",
		Length:   "inner length L between the end plates (e.g. 50mm)",
		Fill:     "fill: material name or eps=E[,mu=M] (default vacuum)",
		SizeErrors: cmdutil.SizeErrors{
			Both:     "--diameter and --radius both given; give one of them",
			NoSize:   "missing the cavity size: give --diameter or --radius (e.g. --diameter 50mm)",
			NoLength: "missing --length, the cavity length between the end plates (e.g. --length 50mm)",
		},
	})
	fl := cmd.Flags()
	fmax = cmdutil.FrequencyVar(fl, &opts.FMax, "fmax", "list every mode at or below this frequency (e.g. 12GHz)", cmdutil.MinFrequency, cmdutil.MaxFrequency)
	cmdutil.IntVar(fl, &opts.Count, "count", DefaultCount, "list this many of the lowest modes", 1, cavity.MaxModes)
	cmdutil.IntVar(fl, &opts.Digits, "digits", DefaultDigits, "significant digits of the frequencies in the table", 3, 17)
	walls = cmdutil.AddWallFlags(cmd)
	checkFormat = cmdutil.FormatFlag(cmd, &opts.Format)
	return cmd
}

func runModes(opts *Options) error {
	var (
		list []cavity.Resonance
		err  error
		what string
	)
	if opts.FMax > 0 {
		list, err = opts.Cavity.Modes(opts.FMax)
		what = "every mode up to " + cmdutil.TrimZeros(physics.FormatFrequency(opts.FMax, 6))
		if err != nil {
			return cmdutil.FlagError("fmax", opts.FMaxText, fmt.Errorf("%w; give a lower --fmax", err))
		}
	} else {
		list, err = opts.Cavity.Lowest(opts.Count)
		what = fmt.Sprintf("the %d lowest", opts.Count)
		if len(list) > opts.Count {
			what += fmt.Sprintf(" and %d tied with the last", len(list)-opts.Count)
		}
		if err != nil {
			return cmdutil.FlagError("count", strconv.Itoa(opts.Count), fmt.Errorf("%w; give a smaller --count", err))
		}
	}
	return write(opts, list, what)
}

// Row is one mode as printed. JSON keys and CSV headers are the snake_case
// names in columns; a new per-mode quantity is a new field here plus one
// entry in columns.
type Row struct {
	Mode           string   `json:"mode"`
	Family         string   `json:"family"`
	N              int      `json:"n"`
	M              int      `json:"m"`
	P              int      `json:"p"`
	FHz            float64  `json:"f_hz"`
	Degeneracy     int      `json:"degeneracy"`
	DegenerateWith []string `json:"degenerate_with"`

	// QWall, QFill and Q0 are set with --wall (see addQ); null in JSON
	// where a loss is zero.
	QWall *QValue `json:"q_wall,omitempty"`
	QFill *QValue `json:"q_fill,omitempty"`
	Q0    *QValue `json:"q0,omitempty"`
}

// Rows converts resonances to output rows in the same order (see RowOf).
func Rows(list []cavity.Resonance) []Row {
	rows := make([]Row, len(list))
	for i, r := range list {
		rows[i] = RowOf(r)
	}
	return rows
}

// RowOf converts one resonance to its output row. DegenerateWith lists the
// modes that share the frequency exactly in every cylinder (TE0mp with
// TM1mp); it is empty, never nil, otherwise.
func RowOf(r cavity.Resonance) Row {
	row := Row{
		Mode: r.Mode.String(), Family: r.Mode.Family.String(),
		N: r.Mode.N, M: r.Mode.M, P: r.Mode.P,
		FHz: r.Frequency, Degeneracy: r.Degeneracy(),
		DegenerateWith: []string{},
	}
	if c, ok := r.Companion(); ok {
		row.DegenerateWith = append(row.DegenerateWith, c.String())
	}
	return row
}

// column is one output column: its CSV header (equal to the JSON key), its
// table header and how each output kind prints a row.
type column struct {
	key, title string
	csv        func(Row) string
	table      func(Row) string
}

// columns are the output columns in order. The table prints f_hz with
// Options.Digits significant digits (see writeTable).
var columns = []column{
	{"mode", "mode", func(r Row) string { return r.Mode }, nil},
	{"family", "family", func(r Row) string { return r.Family }, nil},
	{"n", "n", func(r Row) string { return strconv.Itoa(r.N) }, nil},
	{"m", "m", func(r Row) string { return strconv.Itoa(r.M) }, nil},
	{"p", "p", func(r Row) string { return strconv.Itoa(r.P) }, nil},
	{"f_hz", "f", func(r Row) string { return strconv.FormatFloat(r.FHz, 'g', -1, 64) },
		func(r Row) string { return physics.FormatFrequency(r.FHz, DefaultDigits) }},
	{"degeneracy", "degeneracy", func(r Row) string { return strconv.Itoa(r.Degeneracy) }, nil},
	{"degenerate_with", "degenerate with", func(r Row) string { return strings.Join(r.DegenerateWith, ";") },
		func(r Row) string { return strings.Join(r.DegenerateWith, ", ") }},
}

// Header returns the CSV header: the JSON keys of Row in column order.
func Header() []string {
	h := make([]string, len(columns))
	for i, c := range columns {
		h[i] = c.key
	}
	return h
}

// cavityJSON is the "cavity" object of the JSON output.
type cavityJSON struct {
	RadiusM float64 `json:"radius_m"`
	LengthM float64 `json:"length_m"`
	EpsR    float64 `json:"eps_r"`
	MuR     float64 `json:"mu_r"`
}

// DescribeCavity returns the one-line description of a cavity used in
// table headers: dimensions in friendly units and the fill.
func DescribeCavity(c cavity.Cavity) string {
	f := c.Fill
	name := f.Label()
	fill := fmt.Sprintf("fill %s (eps_r %s, mu_r %s)", name, num(f.Eps()), num(f.Mu()))
	if name == "user" {
		fill = fmt.Sprintf("fill eps_r %s, mu_r %s", num(f.Eps()), num(f.Mu()))
	}
	return fmt.Sprintf("radius %s, diameter %s, length %s, %s",
		cmdutil.TrimZeros(physics.FormatLength(c.Radius, 6)), cmdutil.TrimZeros(physics.FormatLength(c.Diameter(), 6)),
		cmdutil.TrimZeros(physics.FormatLength(c.Length, 6)), fill)
}

func num(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }
