// Package stack implements `cylcav stack`: the resonances of an
// axisymmetric cavity made of coaxial cylindrical sections, read from a
// geometry file, by axial mode matching (package axisym).
//
// The geometry file is YAML. YAML was chosen over TOML because a cavity is
// a list of sections, which YAML writes as a plain list with comments, and
// because the decoder used, go.yaml.in/yaml/v3 (maintained by the YAML
// organisation, the continuation of gopkg.in/yaml.v3), gives the line of
// every key and value, so each error can name file, line and key.
package stack

import (
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"cylcav/axisym"
	"cylcav/axisymplot"
	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/figure"
	"cylcav/physics"
)

// Options are the parsed and validated arguments of `cylcav stack`.
type Options struct {
	IO *cmdutil.IOStreams

	// File is the geometry file's name as given, Geometry its content.
	File     string
	Geometry Geometry
	// FMax is the upper end of the search in Hz, FMaxText the --fmax value
	// as typed (for messages).
	FMax     float64
	FMaxText string
	// Modes is the number of modes in the widest section (0: the default).
	Modes int
	// Families are the families to solve.
	Families []cavity.Family
	// Order is the azimuthal order n (--order; 0: TE0 and TM0 apart; n >= 1:
	// TE_n and TM_n coupled at steps, frequencies and labels only).
	Order  int
	Format cmdutil.Format
	// Walls, when not nil (--wall given, or walls in the file), adds Q0
	// and its parts: with --wall the side surface of the wall set covers
	// side walls, inner conductors and step faces, EndA and EndB the end
	// plates; the file may give each kind of surface its own metal.
	Walls *axisym.Walls
	// Beta, when > 0 (--beta given), adds the accelerator figures of TM0
	// resonances for a particle at speed Beta c on the axis.
	Beta float64
	// FieldMap, when not empty (--field-map), is the file (PNG, SVG or PDF
	// by its extension) for the field map of resonance number MapIndex (the
	// # column), written atomically; Force replaces an existing file.
	FieldMap  string
	MapFormat figure.Format
	MapIndex  int
	Force     bool
	// Pair, when not nil (--pair I,J), names two resonances (the # column)
	// split from two equal coupled resonators; the output adds their
	// coupling coefficient (axisym.CouplingOf).
	Pair *[2]int
	// Extrapolate (--extrapolate) adds each resonance extrapolated to
	// infinitely many modes (axisym.Extrapolate) with its error estimate.
	Extrapolate bool
	// EdgeBasis (--edge-basis) solves n = 0 with the edge-conditioned
	// junctions (axisym.Request.EdgeBasis) where the body allows them.
	EdgeBasis bool
	// Bulb (--bulb-diameter, --bulb-length, --bulb-centre) adds the
	// filling factors of a storage bulb on the axis (see bulb.go).
	Bulb BulbOptions
	// Beam (--bunch-freq, --harmonic-window) gives every resonance its
	// nearest beam harmonic (see beam.go).
	Beam BeamOptions
}

// Flag limits: a particle slower than minBeta c gains no meaningful energy
// in a cavity of any practical size (its transit-time factor is zero to
// rounding); maxMapIndex is far above the resonances any listing holds.
const (
	minBeta     = 1e-3
	maxMapIndex = 1000000
)

// NewCmdStack returns `cylcav stack`. runF, if not nil, replaces the
// command's work (tests use it to inspect the parsed options).
func NewCmdStack(ios *cmdutil.IOStreams, runF func(*Options) error) *cobra.Command {
	opts := &Options{IO: ios}
	var pair string
	var checkFormat func() error
	var walls *cmdutil.WallFlags
	cmd := &cobra.Command{
		Use:   "stack FILE --fmax F [--family te|tm|both] [--order N] [--modes N]",
		Short: "Resonances of a cavity made of stacked coaxial sections (axial mode matching)",
		Long: fmt.Sprintf(`List the azimuthally symmetric (n = 0) resonances below --fmax of a cavity
made of circular cylindrical sections stacked along z between two ends
(metal plates, or pipes to infinity: see end_a and end_b below), every
change of radius a flat metal step. TE0 (E_phi) and TM0
(E_r, E_z) resonances are solved separately by axial mode matching; the
count of resonances below any frequency is exact for the model, so none is
missed. Each resonance is labelled with the mode of the enclosing cylinder
(largest radius, total length) it continues from (not for a body with an
open end or a coaxial section), and carries a
convergence estimate: how far it moved when the number of waveguide modes
grew by half.

The geometry file is YAML:

  title: two cells and an iris    # optional
  sections:                       # from the end plate at z = 0
    - length: 20mm                # lengths: m, cm, mm, um, in, mil
      radius: 15mm
      fill: vacuum                # optional: material name or eps=E[,tand=T]
    - length: 2mm
      radius: 4mm
      start: 20mm                 # optional check: z of the left face
    - length: 5mm                 # radial layers instead of fill:
      radius: 15mm
      layers:                     # innermost first, the last at the radius
        - {radius: 6mm, fill: eps=38}
        - {radius: 15mm}          # fill: vacuum when not given

Top-level keys: %s.
end_a and end_b (the ends at z = 0 and at the far end) are plate (the default: a metal end plate) or pipe: a
semi-infinite pipe of the end section's cross-section and fill, as a beam
pipe or a feeding waveguide. Below the pipe's lowest cutoff of a family
every resonance is trapped (a real resonance, found with the same exact
count); above it a resonance radiates into the pipe: it is listed with
its external Q (Qext = Re f / (2 Im f) of the complex resonant frequency,
found by Muller's method from the resonance of the body with the pipes
shorted at their apertures; that list is not proven complete). An open
end has no plate loss. walls gives a metal per kind of surface (side,
steps, inner, plate_a, plate_b; side required, the others default to it),
used for Q0 at 20 C without --wall:

  walls:
    side: copper
    plate_b: silver

Keys per section: %s. inner_radius > 0 makes a
coaxial section (a post or inner conductor); at each junction one
cross-section must lie inside the other. A section with layers (n = 0
only; isotropic, non-magnetic layers; both ends plates) gives Q0, field
maps and bulb filling factors like a homogeneous one. Not solved yet (an error says
so): other junctions. A body with a
coaxial section has no "continues from" label.

--order N (default 0) lists the resonances of azimuthal order n = N
instead (N = 1: the dipole modes of a cell). For n >= 1 the TE_n and TM_n
waveguide modes of each section couple at every step and are solved
together, with the same exact count (none missed); each resonance is
labelled with the TE_nmp or TM_nmp mode of the enclosing cylinder at the
same place in the order-n list. Only closed bodies of homogeneous
circular sections (no inner conductor, no layers, no pipe ends), and
frequencies only: --wall, --beta, --field-map, --bulb-*, --pair and
--family te|tm are refused with --order >= 1, and walls in the file are
not used; --extrapolate works as for n = 0.

--modes sets the waveguide modes kept in the widest section (default %d);
narrower sections keep proportionally fewer. JSON and CSV give SI values.

With --wall (a metal, as in 'cylcav q'; --end-wall and the other wall
flags apply too) each resonance gains Q0 from the matched fields, with the
wall loss on every surface (side walls, inner conductors and step faces
take the --wall metal) and each section's (or layer's) loss tangents,
plus the change of Q0 when the modes grew by half. A table below lists,
for every region filled with something other than vacuum (a section's
fill or one layer), its electric filling factor p_e (its share of the
electric energy) and the Q of its loss tangents alone, Q = 1/(p_e tand +
p_m tandm); JSON gives them per resonance under "dielectrics". Bodies without steps give exact Q0;
next to a step edge the wall loss converges slowly, so there Q0 is an
estimate (high by about its change or more).

With --beta B (a particle speed over c; the axis must be free, so a body
with an inner conductor is refused) TM0 resonances gain the transit-time
factor T and R/Q in both conventions, labelled: V^2/(omega W) ("linac") and V^2/(2 omega W)
("circuit"). Peak surface fields are not given: at a sharp step edge the
model's field is infinite.

--field-map FILE writes |E| and |H| of resonance --map (the # column,
default 1) in the r-z half plane, the body outlined, as PNG, SVG or PDF by
the file's extension; --force replaces an existing file.

--extrapolate adds each frequency extrapolated to infinitely many modes
(Richardson's rule on models with N, 2N and 4N modes per section, the
order fitted) and its error estimate; about 15 times the work. With
steps it gains about a factor ten in accuracy; where the three models
do not converge regularly it says so and gives nothing.

--pair I,J names two resonances (the # column) that two equal coupled
resonators split into, such as the even and odd TE011 resonances of two
cells joined by an iris: the output adds their coupling coefficient
k = (fh^2 - fl^2)/(fh^2 + fl^2) and its change when the modes grew by
half (table and JSON; with CSV it is refused). Which two resonances form
the pair is for you to say: they are the two that continue from one mode
of each cell; they must be neighbours in one family.

--bulb-diameter D --bulb-length L (optionally --bulb-centre Z, the
distance of the bulb's centre from the first end plate; default half-way)
add the filling factors of a storage bulb on the axis to every resonance:
the fractions of the mode's magnetic energy along z, of all its magnetic
energy and of its electric energy inside the bulb, and the maser filling
factor eta', from the matched fields (a dielectric-loaded can included).
The bulb must lie inside circular sections (no inner conductor) and within
the body; where it reaches into a dielectric fill or layer, its electric
fraction is weighted by that eps_r.

--bunch-freq F gives every resonance its nearest beam harmonic and flags
a TM0 resonance NEAR within --harmonic-window (default 0.5 %%) of one (a
TE0 resonance has no E_z for the beam to drive). With --beta or
--bunch-freq the output says that dipole (n = 1) modes are listed with
--order 1 but their transverse R/Q is not computed for stacked bodies.`,
			strings.Join(topKeys, ", "), strings.Join(sectionKeys, ", "), axisym.DefaultModes),
		Example: `  # A nosed accelerating cell in copper: Q0 and R/Q for beta = 1
  $ cylcav stack examples/nosed-cell.yaml --fmax 3.5GHz --wall copper --beta 1
  ...

  # The same cell's dipole (n = 1) resonances, labelled TE11p/TM11p
  $ cylcav stack examples/nosed-cell.yaml --fmax 9GHz --order 1
  ...

  # A dielectric puck in a copper can: Q0, wall and dielectric Q, the puck's filling factor
  $ cylcav stack examples/puck-in-can.yaml --fmax 9GHz --wall copper
  ...

  # The field map of the re-entrant cavity's lowest resonance
  $ cylcav stack examples/reentrant.yaml --fmax 4GHz --field-map reentrant.svg --force
  ...

  # Two TE011 cells joined by an iris: the coupling of the TE011 pair
  $ cylcav stack examples/iris-pair.yaml --fmax 12GHz --family te --pair 1,2
  ...

  # A nosed cell with beam pipes to infinity (walls from the file): trapped and radiating TM0
  $ cylcav stack examples/nosed-cell-open.yaml --fmax 16GHz --family tm --beta 1
  ...

  # A TE011 cavity fed through an iris from a circular waveguide: its external Q
  $ cylcav stack examples/fed-cell.yaml --fmax 10.5GHz --family te
  ...

  # A dielectric disc on the end plate of a copper can, TE0 only, with Q0, as CSV
  $ cylcav stack examples/disc-in-can.yaml --fmax 15GHz --family te --wall copper --format csv

  # The filling factors of a maser's storage bulb in a disc-loaded can
  $ cylcav stack examples/loaded-maser.yaml --fmax 12GHz --family te --bulb-diameter 20mm --bulb-length 12mm
  ...`,
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) != 1 {
				return cmdutil.Usagef("give one geometry file (e.g. cylcav stack examples/iris-pair.yaml --fmax 12GHz), got %d arguments", len(args))
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.File = args[0]
			var err error
			if !cmd.Flags().Changed("fmax") {
				return cmdutil.Usagef("missing --fmax, the upper end of the search (e.g. --fmax 12GHz)")
			}
			if err := checkFormat(); err != nil {
				return err
			}
			opts.FMaxText = cmdutil.Text(cmd.Flags(), "fmax")
			if cmd.Flags().Changed("field-map") && opts.FieldMap == "" {
				return cmdutil.FlagError("field-map", opts.FieldMap, errors.New("empty file name; name a .png, .svg or .pdf file"))
			}
			if opts.FieldMap != "" {
				if opts.MapFormat, err = figure.FormatOf(opts.FieldMap); err != nil {
					return cmdutil.FlagError("field-map", opts.FieldMap, err)
				}
				if err := cmdutil.CheckFiles(opts.Force, cmdutil.File{Flag: "field-map", Path: opts.FieldMap}); err != nil {
					return err
				}
			} else if cmd.Flags().Changed("map") {
				return cmdutil.Usagef("--map needs --field-map FILE")
			}
			if cmd.Flags().Changed("pair") {
				p, err := parsePair(pair)
				if err != nil {
					return cmdutil.FlagError("pair", pair, err)
				}
				if opts.Format == cmdutil.CSV {
					return cmdutil.Usagef("--pair gives one number for the body, shown in table and JSON output; drop it or use --format json")
				}
				opts.Pair = &p
			}
			if err := checkOrder(cmd, opts.Order); err != nil {
				return err
			}
			if opts.EdgeBasis && opts.Order != 0 {
				return cmdutil.FlagError("edge-basis", "true", fmt.Errorf("applies to --order 0 only, got --order %d", opts.Order))
			}
			if opts.Extrapolate && opts.Modes > axisym.MaxModes/4 {
				return cmdutil.FlagError("modes", strconv.Itoa(opts.Modes), fmt.Errorf("must be at most %d with --extrapolate (its finest model keeps four times as many)", axisym.MaxModes/4))
			}
			if walls.Given() {
				ws, err := walls.Walls()
				if err != nil {
					return err
				}
				opts.Walls = &axisym.Walls{Set: ws}
			}
			data, err := os.ReadFile(opts.File)
			if err != nil {
				return cmdutil.Usagef("geometry file: %v", err)
			}
			if opts.Geometry, err = ParseGeometry(opts.File, data); err != nil {
				return &cmdutil.UsageError{Err: err}
			}
			if err := checkBulb(opts.Bulb, opts.Geometry.Body); err != nil {
				return err
			}
			if err := opts.Geometry.Body.FieldsAvailable(); err != nil {
				// Q0, R/Q, field maps and filling factors all come from the
				// matched fields: refuse each request for them, rather than
				// print a column of dashes.
				for _, f := range []string{"field-map", "bulb-diameter", "wall", "beta"} {
					if cmd.Flags().Changed(f) {
						return cmdutil.Usagef("--%s needs the fields of %s: %v", f, opts.File, err)
					}
				}
				if opts.Geometry.Walls != nil {
					return cmdutil.Usagef("%s: walls: Q0 needs the fields of the body: %v; remove the walls key to list the frequencies", opts.File, err)
				}
			}
			// An end plate's metal for an end that is a pipe would be
			// ignored.
			b := opts.Geometry.Body
			for _, e := range []struct {
				flag, ends string
				pipe       bool
			}{{"end-wall-a", "end_a is a pipe", b.EndA == axisym.Pipe}, {"end-wall-b", "end_b is a pipe", b.EndB == axisym.Pipe},
				{"end-wall", "both ends are pipes", b.EndA == axisym.Pipe && b.EndB == axisym.Pipe}} {
				if e.pipe && cmd.Flags().Changed(e.flag) {
					return cmdutil.Usagef("--%s sets an end plate's metal, but in %s %s: leave it out", e.flag, opts.File, e.ends)
				}
			}
			if cmd.Flags().Changed("beta") {
				// T and R/Q need the axis free for the beam: with an inner
				// conductor they would be a column of dashes.
				for i, sec := range opts.Geometry.Body.Sections {
					if sec.InnerRadius > 0 {
						return cmdutil.Usagef("--beta needs a free axis for the beam, but section %d of %s has an inner conductor (inner_radius %s)",
							i+1, opts.File, lengthText(sec.InnerRadius))
					}
				}
			}
			if opts.Geometry.Walls != nil && opts.Order == 0 {
				if opts.Walls != nil {
					return cmdutil.Usagef("%s gives walls and so does --wall: give the metals in one place", opts.File)
				}
				opts.Walls = opts.Geometry.Walls
			}
			if runF != nil {
				return runF(opts)
			}
			return runStack(opts)
		},
	}
	fl := cmd.Flags()
	cmdutil.FrequencyVar(fl, &opts.FMax, "fmax", "list every resonance below this frequency (e.g. 12GHz)", cmdutil.MinFrequency, cmdutil.MaxFrequency)
	cmdutil.EnumVar(fl, &opts.Families, "family", "both", "te (TE0: E_phi), tm (TM0: E_r, E_z) or both", "family",
		cmdutil.Choice[[]cavity.Family]{Word: "te", Value: []cavity.Family{cavity.TE}},
		cmdutil.Choice[[]cavity.Family]{Word: "tm", Value: []cavity.Family{cavity.TM}},
		cmdutil.Choice[[]cavity.Family]{Word: "both", Value: []cavity.Family{cavity.TE, cavity.TM}})
	cmdutil.NumberVar(fl, &opts.Beta, "beta", "particle speed over c for the accelerator figures of TM0 resonances, 0.001..1 (e.g. 1)", minBeta, 1)
	fl.StringVar(&opts.FieldMap, "field-map", "", "write the field map of resonance --map to this file (.png, .svg or .pdf)")
	cmdutil.IntVar(fl, &opts.MapIndex, "map", 1, "resonance number (the # column) of the field map", 1, maxMapIndex)
	fl.BoolVar(&opts.Force, "force", false, "replace the field-map file if it exists")
	cmdutil.Needs(cmd, "force", "field-map")
	fl.StringVar(&pair, "pair", "", "two resonances (the # column, e.g. 1,2) split from two coupled resonators: add their coupling coefficient")
	fl.BoolVar(&opts.Extrapolate, "extrapolate", false, "add each frequency extrapolated to infinitely many modes, with its error estimate")
	fl.BoolVar(&opts.EdgeBasis, "edge-basis", false, "n = 0: match at each step with aperture fields that carry the edge singularity (about 1e-9 instead of 1e-4; closed bodies of homogeneous circular sections with a step at every junction, else the default method with a warning)")
	cmdutil.IntVar(fl, &opts.Order, "order", 0, fmt.Sprintf("azimuthal order n of the resonances, 0..%d (1: dipole modes; n >= 1 for closed bodies of circular sections, frequencies only)", maxOrder), 0, maxOrder)
	cmdutil.IntVar(fl, &opts.Modes, "modes", 0, fmt.Sprintf("waveguide modes in the widest section, 2..%d (default %d)", axisym.MaxModes, axisym.DefaultModes), 2, axisym.MaxModes)
	addBulbFlags(cmd, &opts.Bulb)
	addBeamFlags(cmd, &opts.Beam)
	walls = cmdutil.AddWallFlags(cmd)
	checkFormat = cmdutil.FormatFlag(cmd, &opts.Format)
	return cmd
}

// Row is one resonance as printed; JSON keys and CSV headers are the
// snake_case names.
type Row struct {
	Index         int      `json:"index"`
	Family        string   `json:"family"`
	FamilyIndex   int      `json:"family_index"`
	FHz           float64  `json:"f_hz"`
	ChangeHz      *float64 `json:"change_hz"`      // null: no partner in the smaller model
	ContinuesFrom string   `json:"continues_from"` // "" for a body with a coaxial section or open ends
	LabelTied     bool     `json:"label_tied"`
	// For a body with an open end: "trapped" (below the pipe cutoff, a
	// real resonance) or "radiating" (above it: FHz is the real part of the
	// complex resonant frequency, FImagHz its imaginary part and QExt the
	// external Q); empty for a closed body.
	Status  string   `json:"status,omitempty"`
	FImagHz *float64 `json:"f_imag_hz,omitempty"`
	QExt    *float64 `json:"q_ext,omitempty"`
	// QExtChange is the change of QExt when the modes grew by half.
	QExtChange *float64 `json:"q_ext_change,omitempty"`
	// With --wall: Q0, the change of Q0 when the modes grew by half (its
	// convergence estimate), and the wall and fill Q; null when the fields
	// are not available (QNote says why).
	Q0       *float64 `json:"q0,omitempty"`
	Q0Change *float64 `json:"q0_change,omitempty"`
	QWall    *float64 `json:"q_wall,omitempty"`
	QFill    *float64 `json:"q_fill,omitempty"` // absent with Q0 given: no fill loss
	QNote    string   `json:"q_note,omitempty"`
	// With --wall: every region filled with something other than vacuum
	// (a section's fill or one layer), with its filling factors and Q.
	Dielectrics []DielectricRow `json:"dielectrics,omitempty"`
	// With --beta, TM0 resonances of a body with a free axis: the
	// transit-time factor and R/Q in both conventions, V^2/(omega W)
	// ("linac") and V^2/(2 omega W) ("circuit"), in ohm.
	T             *float64 `json:"transit_time_factor,omitempty"`
	RoverQLinac   *float64 `json:"r_over_q_linac_ohm,omitempty"`
	RoverQCircuit *float64 `json:"r_over_q_circuit_ohm,omitempty"`
	// With --extrapolate: the frequency extrapolated to infinitely many
	// modes, its error estimate and the observed order (null order: the
	// models agree to rounding); all null when the convergence was not
	// regular.
	FExtrapolatedHz      *float64 `json:"f_extrapolated_hz,omitempty"`
	ExtrapolationErrorHz *float64 `json:"extrapolation_error_hz,omitempty"`
	ExtrapolationOrder   *float64 `json:"extrapolation_order,omitempty"`
	// With --bulb-diameter: the bulb's filling factors.
	Bulb *BulbRow `json:"bulb,omitempty"`
	// With --bunch-freq: the nearest beam harmonic.
	Harmonic *HarmonicRow `json:"harmonic,omitempty"`
}

// DielectricRow is one filled region's share of a resonance
// (axisym.MediumQ).
type DielectricRow struct {
	Section  int     `json:"section"`
	Layer    int     `json:"layer"`  // 0: the section's fill; else the layer, innermost 1
	Medium   string  `json:"medium"` // its name ("user" for values given as eps=...)
	EpsR     float64 `json:"eps_r"`
	TanDelta float64 `json:"tan_delta"`
	// FillE and FillM are the electric and magnetic filling factors; Q
	// that of the region's loss tangents alone (null: no loss tangent).
	FillE float64  `json:"electric_filling_factor"`
	FillM float64  `json:"magnetic_filling_factor"`
	Q     *float64 `json:"q_dielectric,omitempty"`
}

// PairRow is the coupling coefficient of the pair named by --pair.
type PairRow struct {
	Pair    [2]int   `json:"pair"` // the # column of the two resonances
	Family  string   `json:"family"`
	K       float64  `json:"k"`
	KChange *float64 `json:"k_change"` // null: no partner in the smaller model
}

// parsePair reads "I,J": two different resonance numbers >= 1.
func parsePair(s string) ([2]int, error) {
	a, b, ok := strings.Cut(s, ",")
	i, err1 := strconv.Atoi(strings.TrimSpace(a))
	j, err2 := strconv.Atoi(strings.TrimSpace(b))
	if !ok || err1 != nil || err2 != nil || i < 1 || j < 1 || i == j {
		return [2]int{}, fmt.Errorf("must be two different resonance numbers (the # column, >= 1) as I,J, e.g. 1,2")
	}
	return [2]int{i, j}, nil
}

// pairRow computes the coupling coefficient of the pair opts.Pair.
func pairRow(opts *Options, res []axisym.Resonance) (*PairRow, error) {
	p := *opts.Pair
	flag := fmt.Sprintf("%d,%d", p[0], p[1])
	if p[0] > len(res) || p[1] > len(res) {
		return nil, cmdutil.FlagError("pair", flag, fmt.Errorf("there are %d resonances below --fmax", len(res)))
	}
	a, b := res[p[0]-1], res[p[1]-1]
	c, err := axisym.CouplingOf(a, b)
	if err != nil {
		return nil, cmdutil.FlagError("pair", flag, err)
	}
	row := &PairRow{Pair: p, Family: a.Family.String() + "0", K: c.K}
	if !math.IsInf(c.Change, 0) {
		row.KChange = &c.Change
	}
	return row, nil
}

func runStack(opts *Options) error {
	if opts.EdgeBasis {
		for _, fam := range familiesFor(opts) {
			if err := axisym.EdgeBasisApplies(opts.Geometry.Body, fam); err != nil {
				fmt.Fprintf(opts.IO.ErrOut, "warning: --edge-basis: %v; %v0 resonances use the default method\n", err, fam)
			}
		}
	}
	res, err := axisym.Solve(opts.Geometry.Body, axisym.Request{
		Order: opts.Order, MaxFrequency: opts.FMax, Modes: opts.Modes, Families: familiesFor(opts),
		Losses:    opts.Walls != nil || opts.Beta > 0 || opts.FieldMap != "" || opts.Bulb.Diameter > 0,
		EdgeBasis: opts.EdgeBasis,
	})
	if err != nil {
		return solveError(opts, err)
	}
	rows := make([]Row, len(res))
	for i, r := range res {
		row := Row{
			Index: i + 1, Family: familyText(opts.Order, r.Family), FamilyIndex: r.Index, FHz: r.Frequency,
			LabelTied: r.OriginTied,
		}
		if r.HasOrigin {
			row.ContinuesFrom = r.Origin.String()
		}
		if !math.IsInf(r.Change, 0) {
			c := r.Change
			row.ChangeHz = &c
		}
		if opts.Walls != nil {
			if err := addQ(&row, r, *opts.Walls, opts.Geometry.Body); err != nil {
				return err
			}
		}
		if opts.Beta > 0 && r.Loss != nil && len(r.Loss.Axis) > 0 {
			if a, err := r.Loss.Accelerating(opts.Beta); err == nil {
				row.T, row.RoverQLinac, row.RoverQCircuit = &a.T, &a.RoverQLinac, &a.RoverQCircuit
			}
		}
		if opts.Bulb.Diameter > 0 {
			if row.Bulb, err = bulbRow(opts.Bulb, opts.Geometry.Body, r); err != nil {
				return err
			}
		}
		if opts.Beam.Bunch > 0 {
			if row.Harmonic, err = harmonicRow(opts.Beam, r, row.Family); err != nil {
				return err
			}
		}
		if opts.Geometry.Body.Open() {
			row.Status = statusTrapped
		}
		rows[i] = row
	}
	if opts.Extrapolate {
		if err := addExtrapolation(opts, res, rows); err != nil {
			return err
		}
	}
	if opts.Geometry.Body.Open() {
		if rows, res, err = addRadiating(opts, rows, res); err != nil {
			return err
		}
	}
	var pr *PairRow
	if opts.Pair != nil {
		p := *opts.Pair
		if err := refuseRadiating("pair", fmt.Sprintf("%d,%d", p[0], p[1]), rows, p[0], p[1]); err != nil {
			return err
		}
		if pr, err = pairRow(opts, res); err != nil {
			return err
		}
	}
	if opts.FieldMap != "" {
		if err := refuseRadiating("map", strconv.Itoa(opts.MapIndex), rows, opts.MapIndex); err != nil {
			return err
		}
		if err := writeMap(opts, res); err != nil {
			return err
		}
	}
	switch opts.Format {
	case cmdutil.JSON:
		return cmdutil.WriteJSON(opts.IO.Out, struct {
			File       string      `json:"file"`
			Title      string      `json:"title"`
			Order      int         `json:"n"`
			Sections   int         `json:"sections"`
			LengthM    float64     `json:"length_m"`
			MaxRadiusM float64     `json:"max_radius_m"`
			FMaxHz     float64     `json:"fmax_hz"`
			EndA       string      `json:"end_a"`
			EndB       string      `json:"end_b"`
			Cutoff     *cutoffJSON `json:"pipe_cutoff,omitempty"`
			Resonances []Row       `json:"resonances"`
			Coupling   *PairRow    `json:"coupling,omitempty"`
			Dipoles    string      `json:"dipoles,omitempty"`
		}{opts.File, opts.Geometry.Title, opts.Order, len(opts.Geometry.Body.Sections), opts.Geometry.Body.Length(),
			opts.Geometry.Body.MaxRadius(), opts.FMax, opts.Geometry.Body.EndA.String(), opts.Geometry.Body.EndB.String(),
			cutoffs(opts.Geometry.Body, opts.Families), rows, pr, dipolesJSON(opts)})
	case cmdutil.CSV:
		open := opts.Geometry.Body.Open()
		var out [][]string
		for _, r := range rows {
			change := ""
			if r.ChangeHz != nil {
				change = strconv.FormatFloat(*r.ChangeHz, 'g', -1, 64)
			}
			cells := []string{strconv.Itoa(r.Index), r.Family, strconv.Itoa(r.FamilyIndex),
				strconv.FormatFloat(r.FHz, 'g', -1, 64), change, r.ContinuesFrom, strconv.FormatBool(r.LabelTied)}
			if opts.Walls != nil {
				cells = append(cells, csvQ(r.Q0), csvQ(r.Q0Change), csvQ(r.QWall), csvQ(r.QFill))
			}
			if opts.Beta > 0 {
				cells = append(cells, csvQ(r.T), csvQ(r.RoverQLinac), csvQ(r.RoverQCircuit))
			}
			if opts.Extrapolate {
				cells = append(cells, csvQ(r.FExtrapolatedHz), csvQ(r.ExtrapolationErrorHz), csvQ(r.ExtrapolationOrder))
			}
			if opts.Bulb.Diameter > 0 {
				cells = append(cells, bulbCells(r.Bulb)...)
			}
			if opts.Beam.Bunch > 0 {
				cells = append(cells, harmonicCells(r.Harmonic)...)
			}
			if open {
				cells = append(cells, r.Status, csvQ(r.FImagHz), csvQ(r.QExt), csvQ(r.QExtChange))
			}
			out = append(out, cells)
		}
		header := []string{"index", "family", "family_index", "f_hz", "change_hz", "continues_from", "label_tied"}
		if opts.Walls != nil {
			header = append(header, "q0", "q0_change", "q_wall", "q_fill")
		}
		if opts.Beta > 0 {
			header = append(header, "transit_time_factor", "r_over_q_linac_ohm", "r_over_q_circuit_ohm")
		}
		if opts.Extrapolate {
			header = append(header, "f_extrapolated_hz", "extrapolation_error_hz", "extrapolation_order")
		}
		if opts.Bulb.Diameter > 0 {
			header = append(header, bulbHeader...)
		}
		if opts.Beam.Bunch > 0 {
			header = append(header, harmonicHeader...)
		}
		if open {
			header = append(header, "status", "f_imag_hz", "q_ext", "q_ext_change")
		}
		return cmdutil.WriteCSV(opts.IO.Out, header, out)
	}
	return writeTable(opts.IO.Out, opts, rows, pr)
}

func writeTable(w io.Writer, opts *Options, rows []Row, pr *PairRow) error {
	b := opts.Geometry.Body
	title := opts.Geometry.Title
	if title == "" {
		title = opts.File
	}
	length := cmdutil.TrimZeros(physics.FormatLength(b.Length(), 6))
	radius := cmdutil.TrimZeros(physics.FormatLength(b.MaxRadius(), 6))
	fmt.Fprintf(w, "body: %s, %d sections, length %s, largest radius %s\n", title, len(b.Sections), length, radius)
	method := "by axial mode matching; change: shift when the modes grow by half"
	if opts.EdgeBasis {
		method = "by axial mode matching, with edge-conditioned aperture fields at the steps where the body allows\n" +
			"(--edge-basis); change: there, shift from 9 to 12 aperture functions per step plus 2e-9 of f, else when the modes grow by half"
	}
	fmt.Fprintf(w, "n = %d resonances below %s %s\n",
		opts.Order, cmdutil.TrimZeros(physics.FormatFrequency(opts.FMax, 6)), method)
	if opts.Order > 0 {
		writeOrderNote(w, opts)
	}
	coax := false
	for _, s := range b.Sections {
		coax = coax || s.InnerRadius != 0
	}
	if l := endsLine(b, opts.Families); l != "" {
		fmt.Fprintln(w, l)
	}
	switch {
	case b.Open():
		fmt.Fprintln(w, "continues from: not given for a body with an open end")
	case coax:
		fmt.Fprintln(w, "continues from: not given for a body with a coaxial section")
	default:
		fmt.Fprintf(w, "continues from: mode of the enclosing cylinder (radius %s, length %s) at the same place in order\n",
			radius, length)
	}
	if len(rows) == 0 {
		fmt.Fprintln(w, "no resonance below that frequency")
		return nil
	}
	header := []string{"#", "family", "k", "f", "change", "continues from"}
	if opts.Walls != nil {
		header = append(header, "Q0", "Q0 change", "Q wall", "Q fill")
	}
	if opts.Beta > 0 {
		header = append(header, "T", "R/Q linac", "R/Q circuit")
	}
	if opts.Extrapolate {
		header = append(header, "f extrapolated", "error")
	}
	if opts.Bulb.Diameter > 0 {
		header = append(header, "bulb Hz^2", "H^2", "E^2", "eta'")
	}
	if opts.Beam.Bunch > 0 {
		header = append(header, "beam harmonic")
	}
	if b.Open() {
		header = append(header, "end", "Qext")
	}
	t := cmdutil.NewTable(w, header...)
	var notes []string
	for _, r := range rows {
		change := "unknown"
		if r.ChangeHz != nil {
			change = physics.FormatFrequency(*r.ChangeHz, 2)
		}
		label := r.ContinuesFrom
		if label == "" {
			label = "-"
		}
		if r.LabelTied {
			label += " (tied)"
		}
		k := strconv.Itoa(r.FamilyIndex)
		if r.Status == statusRadiating {
			k = "-" // radiating resonances are not counted
		}
		cells := []string{strconv.Itoa(r.Index), r.Family, k, physics.FormatFrequency(r.FHz, digits(r)), change, label}
		if opts.Walls != nil {
			fill := qText(r.QFill)
			if r.Q0 != nil && r.QFill == nil {
				fill = "inf" // no fill loss
			}
			cells = append(cells, qText(r.Q0), qText(r.Q0Change), qText(r.QWall), fill)
			if r.QNote != "" {
				notes = append(notes, fmt.Sprintf("#%d: %s", r.Index, r.QNote))
			}
		}
		if opts.Beta > 0 {
			cells = append(cells, numText(r.T, 4, ""), numText(r.RoverQLinac, 4, " ohm"), numText(r.RoverQCircuit, 4, " ohm"))
		}
		if opts.Extrapolate {
			if r.Status == statusRadiating {
				cells = append(cells, "-", "-") // the extrapolation is of the real (trapped) model only
			} else if r.FExtrapolatedHz == nil {
				cells = append(cells, "irregular", "-")
			} else {
				cells = append(cells, physics.FormatFrequency(*r.FExtrapolatedHz, extrapDigits(*r.FExtrapolatedHz, *r.ExtrapolationErrorHz)),
					physics.FormatFrequency(*r.ExtrapolationErrorHz, 2))
			}
		}
		if opts.Bulb.Diameter > 0 {
			cells = append(cells, bulbText(r.Bulb)...)
		}
		if opts.Beam.Bunch > 0 {
			cells = append(cells, harmonicText(r.Harmonic, opts.Beam.Bunch))
		}
		if b.Open() {
			cells = append(cells, r.Status, qextText(r.QExt, r.QExtChange))
		}
		t.Row(cells...)
	}
	if err := t.Flush(); err != nil {
		return err
	}
	if err := writeDielectrics(w, rows); err != nil {
		return err
	}
	if opts.Extrapolate {
		fmt.Fprintln(w, "f extrapolated: Richardson's rule on N, 2N and 4N modes per section, the order fitted; error: its")
		fmt.Fprintln(w, "distance from the order-2 extrapolation (irregular: the three models did not converge regularly)")
		if b.Open() {
			fmt.Fprintln(w, "radiating resonances are not extrapolated (-): only the trapped ones, real resonances of the model")
		}
	}
	if opts.Bulb.Diameter > 0 {
		writeBulbNote(w, opts.Bulb, b)
	}
	if pr != nil {
		change := "unknown"
		if pr.KChange != nil {
			change = strconv.FormatFloat(*pr.KChange, 'g', 2, 64)
		}
		fmt.Fprintf(w, "coupling coefficient of #%d and #%d (%s): k = %s, change %s; k = (fh^2 - fl^2)/(fh^2 + fl^2) of the pair\n",
			pr.Pair[0], pr.Pair[1], pr.Family, strconv.FormatFloat(pr.K, 'g', kDigits(pr), 64), change)
	}
	if opts.Beta > 0 {
		fmt.Fprintf(w, "T, R/Q: TM0 only, particle speed %g c on the axis; R/Q linac = V^2/(omega W), circuit = V^2/(2 omega W)\n", opts.Beta)
		fmt.Fprintln(w, "peak surface fields: not given; at a sharp step edge the model's E is infinite (Meixner's edge condition)")
		if b.Open() {
			fmt.Fprintln(w, "open ends: the axial integral runs into the pipes until the field has fallen by e^-40")
		}
		fmt.Fprintln(w, "caution: cells driven at high RF power carry high voltages and heat their walls; these are design")
		fmt.Fprintln(w, "estimates: follow local codes and licensed practice")
	}
	if opts.Beta > 0 || opts.Beam.Bunch > 0 {
		writeBeamNote(w, opts.Beam)
	}
	if opts.Walls != nil {
		if opts.Geometry.Walls != nil {
			fmt.Fprintf(w, "Q: walls of %s per surface (20 C, smooth); no loss at an open end; next to a step edge the wall loss\n", opts.File)
		} else {
			fmt.Fprintln(w, "Q: side walls, inner conductors and step faces of the --wall metal; next to a step edge the wall loss")
		}
		fmt.Fprintln(w, "converges slowly with the modes (Q0 change), so with steps Q0 is an estimate, high by about that change or more")
		for _, n := range notes {
			fmt.Fprintln(w, "note "+n)
		}
	}
	return nil
}

// solveError reports an error of the solver: a body or request it does not
// handle (axisym.ErrNotImplemented) and a request beyond its limits
// (axisym.ErrLimit: too many resonances or modes below --fmax for this
// body) are bad input, exit status 2; anything else is a failure.
func solveError(opts *Options, err error) error {
	switch {
	case errors.Is(err, axisym.ErrNotImplemented):
		return &cmdutil.UsageError{Err: fmt.Errorf("%s: %w", opts.File, err)}
	case errors.Is(err, axisym.ErrLimit):
		return cmdutil.FlagError("fmax", opts.FMaxText, fmt.Errorf("too high for %s: %v", opts.File, strings.TrimPrefix(err.Error(), "axisym: ")))
	}
	return err
}

// addQ fills the Q columns of row from the resonance's losses
// (axisym.Loss.Unloaded).
func addQ(row *Row, r axisym.Resonance, walls axisym.Walls, b axisym.Body) error {
	if r.Loss == nil {
		row.QNote = "fields not available: " + r.LossErr.Error()
		return nil
	}
	u, err := r.Loss.Unloaded(b, walls)
	if err != nil {
		return err
	}
	q0, qw, qf := u.Q0, u.QWall, u.QFill
	for _, m := range u.Media {
		d := DielectricRow{Section: m.Section, Layer: m.Layer, Medium: m.Medium.Label(), EpsR: m.Medium.Eps(),
			TanDelta: m.Medium.TanDelta, FillE: m.FillE, FillM: m.FillM}
		if !math.IsInf(m.Q, 1) {
			q := m.Q
			d.Q = &q
		}
		row.Dielectrics = append(row.Dielectrics, d)
	}
	row.Q0, row.QWall = &q0, &qw
	if !math.IsInf(qf, 1) {
		row.QFill = &qf
	}
	if r.CoarseLoss != nil {
		if c, err := r.CoarseLoss.Unloaded(b, walls); err == nil {
			d := math.Abs(q0 - c.Q0)
			row.Q0Change = &d
		}
	}
	return nil
}

// digits returns the significant digits worth printing for a resonance:
// one beyond those its convergence estimate supports, 4 to 10.
func digits(r Row) int {
	if r.ChangeHz == nil {
		return 4
	}
	if *r.ChangeHz <= 0 {
		return 10
	}
	return min(max(int(math.Ceil(math.Log10(r.FHz / *r.ChangeHz)))+1, 4), 10)
}

// addExtrapolation fills the extrapolation columns of rows, matched to
// res by family and place in the family.
func addExtrapolation(opts *Options, res []axisym.Resonance, rows []Row) error {
	byFam := map[cavity.Family][]axisym.Extrapolation{}
	if opts.Order > 0 {
		return addOrderExtrapolation(opts, res, rows) // order.go
	}
	for _, fam := range opts.Families {
		ex, err := axisym.Extrapolate(opts.Geometry.Body, fam, opts.FMax, opts.Modes)
		if err != nil {
			return solveError(opts, err)
		}
		byFam[fam] = ex
	}
	for i, r := range res {
		setExtrapolation(&rows[i], r, byFam[r.Family])
	}
	return nil
}

// setExtrapolation fills row's extrapolation columns from the entry of ex
// with r's index, when that extrapolation is regular.
func setExtrapolation(row *Row, r axisym.Resonance, ex []axisym.Extrapolation) {
	if r.Index > len(ex) || !ex[r.Index-1].Regular {
		return
	}
	e := ex[r.Index-1]
	row.FExtrapolatedHz, row.ExtrapolationErrorHz = &e.Frequency, &e.Error
	if !math.IsNaN(e.Order) {
		row.ExtrapolationOrder = &e.Order
	}
}

// extrapDigits returns the significant digits of an extrapolated
// frequency worth printing: one beyond those its error supports, 4 to 12.
func extrapDigits(f, err float64) int {
	if err <= 0 {
		return 12
	}
	return min(max(int(math.Ceil(math.Log10(f/err)))+1, 4), 12)
}

// kDigits returns the significant digits of k worth printing: one beyond
// those its change supports, 3 to 8.
func kDigits(p *PairRow) int {
	if p.KChange == nil || p.K == 0 {
		return 3
	}
	if *p.KChange <= 0 {
		return 8
	}
	return min(max(int(math.Ceil(math.Log10(p.K / *p.KChange)))+1, 3), 8)
}

// qText prints an optional Q for the table: "-" when missing, "inf" for no
// loss.
func qText(q *float64) string {
	switch {
	case q == nil:
		return "-"
	case math.IsInf(*q, 1):
		return "inf"
	}
	return strconv.FormatFloat(*q, 'f', 0, 64)
}

// csvQ prints an optional Q for CSV: empty when missing or infinite.
func csvQ(q *float64) string {
	if q == nil || math.IsInf(*q, 0) {
		return ""
	}
	return strconv.FormatFloat(*q, 'g', -1, 64)
}

// numText prints an optional number with digits significant digits and a
// unit, or "-".
func numText(v *float64, digits int, unit string) string {
	if v == nil {
		return "-"
	}
	return strconv.FormatFloat(*v, 'g', digits, 64) + unit
}

// writeMap draws the field map of resonance opts.MapIndex and writes it.
func writeMap(opts *Options, res []axisym.Resonance) error {
	if opts.MapIndex > len(res) {
		return cmdutil.FlagError("map", strconv.Itoa(opts.MapIndex), fmt.Errorf("there are %d resonances below --fmax", len(res)))
	}
	r := res[opts.MapIndex-1]
	if r.Loss == nil {
		return fmt.Errorf("field map of resonance %d: %w", opts.MapIndex, r.LossErr)
	}
	title := fmt.Sprintf("%s0 resonance %d at %s", r.Family, r.Index, physics.FormatFrequency(r.Frequency, 7))
	if opts.Geometry.Title != "" {
		title = opts.Geometry.Title + ": " + title
	}
	fm, err := axisymplot.NewFieldMap(opts.Geometry.Body, r.Loss, axisymplot.FieldMapOptions{Title: title})
	if err != nil {
		return err
	}
	fig, err := fm.Figure(figure.DefaultTheme())
	if err != nil {
		return err
	}
	data, err := figure.Encode(fig, opts.MapFormat, figure.Page{})
	if err != nil {
		return err
	}
	return cmdutil.WriteFiles(opts.Force, cmdutil.File{Flag: "field-map", Path: opts.FieldMap, Data: data})
}

// writeDielectrics writes, with --wall, each filled region's electric
// filling factor and Q per resonance, one pair of columns per region.
func writeDielectrics(w io.Writer, rows []Row) error {
	var regions []DielectricRow
	for _, r := range rows {
		if len(r.Dielectrics) > len(regions) {
			regions = r.Dielectrics
		}
	}
	if len(regions) == 0 {
		return nil
	}
	name := func(d DielectricRow) string {
		if d.Layer == 0 {
			return fmt.Sprintf("s%d", d.Section)
		}
		return fmt.Sprintf("s%d.%d", d.Section, d.Layer)
	}
	fmt.Fprintln(w, "filled regions: p_e = electric energy in the region / all electric energy, Q = 1/(p_e tand + p_m tandm)")
	for _, d := range regions {
		where := fmt.Sprintf("section %d", d.Section)
		if d.Layer > 0 {
			where += fmt.Sprintf(", layer %d", d.Layer)
		}
		what := fmt.Sprintf("eps_r %g, tand %g", d.EpsR, d.TanDelta)
		if d.Medium != "user" {
			what = d.Medium + ", " + what
		}
		fmt.Fprintf(w, "  %s: %s: %s\n", name(d), where, what)
	}
	header := []string{"#"}
	for _, d := range regions {
		header = append(header, "p_e "+name(d), "Q "+name(d))
	}
	t := cmdutil.NewTable(w, header...)
	for _, r := range rows {
		if len(r.Dielectrics) == 0 {
			continue
		}
		cells := []string{strconv.Itoa(r.Index)}
		for _, d := range r.Dielectrics {
			cells = append(cells, strconv.FormatFloat(d.FillE, 'f', 4, 64), qText(d.Q))
		}
		t.Row(cells...)
	}
	return t.Flush()
}
