// Package tune implements `cylcav tune`: the exact tuning curve of a cavity
// with a movable end plate, with the clearance along it, and the shift of a
// small tuning sphere or screw tip from Slater's perturbation theorem.
package tune

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/physics"
)

// Options holds the parsed flags of `cylcav tune`.
type Options struct {
	IO *cmdutil.IOStreams

	Mode            cavity.Mode
	Cavity          cavity.Cavity // Length unused
	LMin, LMax      float64
	Steps           int
	CountDegenerate bool
	// SphereRadius > 0 asks for the shift of a metal sphere at SphereAt.
	SphereRadius float64
	SphereAt     cavity.Point
	// SphereText and AtText are --sphere and --at as given, for error
	// messages.
	SphereText, AtText string
	Format             cmdutil.Format
}

// NewCmdTune returns `cylcav tune`. runF, when not nil, replaces the run
// step (for tests of flag parsing).
func NewCmdTune(io *cmdutil.IOStreams, runF func(*Options) error) *cobra.Command {
	opts := &Options{IO: io}
	var sphere *cmdutil.Quantity
	var lrangeText, modeText func() string
	var checkFormat func() error
	var geo *cmdutil.GeometryFlags
	cmd := &cobra.Command{
		Use:   "tune --mode MODE (--diameter D | --radius A) --length-range LO:HI [flags]",
		Short: "Show the tuning curve of a movable end plate, with the clearance along it",
		Long: `Show how a wanted mode tunes as one end plate moves: the exact frequency,
its slope df/dL and the spurious-mode clearance at evenly spaced lengths,
the exact worst clearance anywhere on the range, and every mode that crosses
the wanted one inside it. The clearance leaves out the exact TE0mp/TM1mp
companion unless --count-degenerate is given.

With --sphere R --at RHO,PHI,Z the frequency shift of a small metal sphere
of radius R centred at that point (PHI in degrees, Z from end plate A) is
added, from Slater's perturbation theorem; a point on a wall (RHO = radius,
or Z = 0 or Z = length) models a screw tip as a hemisphere on that wall, and
a point on the corner between the side wall and an end plate as a quarter
sphere. For a mode with n >= 1 (cos and sin polarisations), and for TE0mp
with its companion TM1mp, the object splits the degenerate set: the output
lists its eigen-shifts (degenerate perturbation theory), which do not depend
on the azimuth PHI in a round cavity. The formula holds for R much smaller than the wavelength and than the distance
to the other walls; the output says when it does not.

Mode index convention: TE_nmp / TM_nmp, n azimuthal, m radial, p axial.`,
		Example: `  # A 40 mm TE011 cavity tuned from 28 mm to 32 mm long
  $ cylcav tune --mode TE011 --diameter 40mm --length-range 28mm:32mm --steps 8

  # With a 1 mm tuning-screw tip on the side wall half way along
  $ cylcav tune --mode TE011 --diameter 40mm --length-range 28mm:32mm \
      --sphere 1mm --at 20mm,0,15mm`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			var err error
			if err := opts.Mode.EndPlateTuning(); err != nil {
				return cmdutil.FlagError("mode", modeText(), err)
			}
			if opts.Cavity.Radius, err = geo.Radius(); err != nil {
				return err
			}
			// The mode chart reaches D/L in MinDesignRatio..MaxDesignRatio.
			if D := opts.Cavity.Diameter(); !(D/opts.LMax >= cavity.MinDesignRatio && D/opts.LMin <= cavity.MaxDesignRatio) {
				return cmdutil.FlagError("length-range", lrangeText(), fmt.Errorf("with diameter %s both ends must be between %s and %s (D/L %g..%g)",
					physics.FormatLength(D, 4), physics.FormatLength(D/cavity.MaxDesignRatio, 4), physics.FormatLength(D/cavity.MinDesignRatio, 4),
					cavity.MinDesignRatio, cavity.MaxDesignRatio))
			}
			if opts.Cavity.Fill, err = geo.Fill(); err != nil {
				return err
			}
			opts.Cavity.Length = opts.LMin
			if err := opts.Cavity.Validate(); err != nil {
				return cmdutil.Usagef("%v", err)
			}
			if cmd.Flags().Changed("sphere") {
				opts.SphereText, opts.AtText = sphere.Text(), cmdutil.Text(cmd.Flags(), "at")
			}
			if err := checkFormat(); err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return runTune(opts)
		},
	}
	f := cmd.Flags()
	modeText = cmdutil.ModeVar(f, &opts.Mode, "mode", "wanted mode, e.g. TE011 (required)").Text
	geo = cmdutil.AddGeometryFlags(cmd, cmdutil.Geometry{
		Diameter:    "inside diameter, e.g. 40mm",
		Radius:      "inside radius (instead of --diameter)",
		Fill:        "fill dielectric: a library name (air, ptfe, ...) or eps=2.1 (default vacuum)",
		CobraChecks: true,
	})
	lr := cmdutil.LengthRangeVar(f, &opts.LMin, &opts.LMax, "length-range", "end-plate spacing range LO:HI, e.g. 28mm:32mm (required)", cavity.MinSize, cavity.MaxSize)
	lrangeText = lr.Text
	cmdutil.IntVar(f, &opts.Steps, "steps", 10, "number of steps between the ends of the range", 1, cavity.MaxTuneSteps)
	f.BoolVar(&opts.CountDegenerate, "count-degenerate", false, "count the exact TE0mp/TM1mp companion in the clearance")
	sphere = cmdutil.LengthVar(f, &opts.SphereRadius, "sphere", "radius of a small metal sphere or screw tip, e.g. 1mm", cavity.MinSize, cavity.MaxSize)
	cmdutil.PointVar(f, &opts.SphereAt, "at", "its centre RHO,PHI,Z (PHI in degrees, Z from end plate A), e.g. 20mm,0,15mm")
	cmdutil.Needs(cmd, "sphere", "at")
	cmdutil.Needs(cmd, "at", "sphere")
	checkFormat = cmdutil.FormatFlag(cmd, &opts.Format)
	_ = cmd.MarkFlagRequired("mode")
	_ = cmd.MarkFlagRequired("length-range")
	return cmd
}

// SphereOutput is the JSON form of a sphere or screw perturbation.
type SphereOutput struct {
	RadiusM float64 `json:"radius_m"`
	RhoM    float64 `json:"rho_m"`
	PhiDeg  float64 `json:"phi_deg"`
	ZM      float64 `json:"z_m"`
	OnWall  bool    `json:"on_wall"`
	Contact string  `json:"contact"`
	LengthM float64 `json:"length_m"`
	// Patterns is the degenerate set the object splits, and ShiftsHz and
	// ShiftsPct its eigen-shifts, ascending.
	Patterns  []string  `json:"patterns"`
	ShiftsHz  []float64 `json:"shifts_hz"`
	ShiftsPct []float64 `json:"shifts_pct"`
	// Dominant names, per shift, the pattern with the largest weight.
	Dominant             []string `json:"dominant_patterns"`
	RadiusOverWavelength float64  `json:"radius_over_wavelength"`
	RadiusOverWallGap    float64  `json:"radius_over_wall_gap"`
	Valid                bool     `json:"valid"`
}

// Point is the JSON form of one tuning point.
type Point struct {
	LengthM      float64 `json:"length_m"`
	FHz          float64 `json:"f_hz"`
	DfDLHzPerM   float64 `json:"df_dl_hz_per_m"`
	ClearancePct float64 `json:"clearance_pct"`
	Limiting     string  `json:"limiting_mode"`
}

// Crossing is the JSON form of a mode crossing.
type Crossing struct {
	Mode    string  `json:"mode"`
	LengthM float64 `json:"length_m"`
	FHz     float64 `json:"f_hz"`
}

// Output is the JSON document of `cylcav tune`.
type Output struct {
	Mode              string        `json:"mode"`
	DiameterM         float64       `json:"diameter_m"`
	Points            []Point       `json:"points"`
	WorstClearancePct float64       `json:"worst_clearance_pct"`
	WorstLengthM      float64       `json:"worst_length_m"`
	WorstMode         string        `json:"worst_mode"`
	Crossings         []Crossing    `json:"crossings"`
	Degenerate        []string      `json:"degenerate"`
	Sphere            *SphereOutput `json:"sphere,omitempty"`
}

func runTune(opts *Options) error {
	tc, err := opts.Cavity.Tune(opts.Mode, opts.LMin, opts.LMax, opts.Steps, opts.CountDegenerate)
	if err != nil {
		return cmdutil.Usagef("%v", err)
	}
	var sph *SphereOutput
	if opts.SphereRadius > 0 {
		// The perturbation at the middle of the tuning range.
		c := opts.Cavity
		c.Length = 0.5 * (opts.LMin + opts.LMax)
		p, err := c.SphereShift(opts.Mode, opts.SphereAt, opts.SphereRadius)
		if err != nil {
			return cmdutil.Usagef("--sphere %q --at %q: %v", opts.SphereText, opts.AtText, err)
		}
		sph = &SphereOutput{
			RadiusM: opts.SphereRadius, RhoM: opts.SphereAt.Rho, PhiDeg: opts.SphereAt.Phi * 180 / math.Pi, ZM: opts.SphereAt.Z,
			OnWall: p.Contact != cavity.Free, Contact: p.Contact.String(), LengthM: c.Length, ShiftsHz: p.Shift,
			RadiusOverWavelength: p.RadiusOverWavelength, RadiusOverWallGap: p.RadiusOverWallGap, Valid: p.Valid,
		}
		for i, pt := range p.Patterns {
			sph.Patterns = append(sph.Patterns, pt.String())
			sph.ShiftsPct = append(sph.ShiftsPct, 100*p.Relative[i])
			sph.Dominant = append(sph.Dominant, p.Dominant(i).String())
		}
	}
	o := Output{Mode: tc.Mode.String(), DiameterM: tc.Diameter, WorstClearancePct: 100 * tc.Worst,
		WorstLengthM: tc.WorstLength, WorstMode: tc.WorstMode.String(), Crossings: []Crossing{}, Degenerate: []string{}, Sphere: sph}
	for _, p := range tc.Points {
		o.Points = append(o.Points, Point{LengthM: p.Length, FHz: p.Frequency, DfDLHzPerM: p.DfDL, ClearancePct: 100 * p.Clearance, Limiting: p.Limiting.String()})
	}
	for _, c := range tc.Crossings {
		o.Crossings = append(o.Crossings, Crossing{Mode: c.Mode.String(), LengthM: c.Length, FHz: c.Frequency})
	}
	if comp, ok := opts.Mode.Companion(); ok && !opts.CountDegenerate {
		o.Degenerate = append(o.Degenerate, comp.String())
	}
	switch opts.Format {
	case cmdutil.JSON:
		return cmdutil.WriteJSON(opts.IO.Out, o)
	case cmdutil.CSV:
		rows := make([][]string, len(o.Points))
		for i, p := range o.Points {
			rows[i] = []string{g(p.LengthM), g(p.FHz), g(p.DfDLHzPerM), g(p.ClearancePct), p.Limiting}
		}
		return cmdutil.WriteCSV(opts.IO.Out, []string{"length_m", "f_hz", "df_dl_hz_per_m", "clearance_pct", "limiting_mode"}, rows)
	}
	return writeTable(opts, tc, o)
}

func g(v float64) string { return strconv.FormatFloat(v, 'g', 10, 64) }

func writeTable(opts *Options, tc cavity.TuningCurve, o Output) error {
	w := opts.IO.Out
	fmt.Fprintf(w, "Tuning %s (n azimuthal, m radial, p axial) in a cavity of diameter %s, fill %s, by moving one end plate\n",
		tc.Mode, physics.FormatLength(tc.Diameter, 6), opts.Cavity.Fill.Label())
	t := cmdutil.NewTable(w, "length", "D/L", "f", "df/dL per mm", "clearance %", "limited by")
	for _, p := range tc.Points {
		t.Row(physics.FormatLength(p.Length, 6), fmt.Sprintf("%.5f", tc.Diameter/p.Length), physics.FormatFrequency(p.Frequency, 8),
			physics.FormatFrequency(p.DfDL*1e-3, 5), fmt.Sprintf("%.3f", 100*p.Clearance), p.Limiting.String())
	}
	if err := t.Flush(); err != nil {
		return err
	}
	fmt.Fprintf(w, "Worst clearance on the range: %.3f %% at L = %s (%s)\n", 100*tc.Worst, physics.FormatLength(tc.WorstLength, 6), tc.WorstMode)
	if len(tc.Crossings) == 0 {
		fmt.Fprintln(w, "No mode crosses the wanted one inside the range.")
	}
	for _, c := range tc.Crossings {
		fmt.Fprintf(w, "Crossing: %s meets %s at L = %s (%s)\n", c.Mode, tc.Mode, physics.FormatLength(c.Length, 6), physics.FormatFrequency(c.Frequency, 7))
	}
	for _, d := range o.Degenerate {
		fmt.Fprintf(w, "Degenerate companion %s tunes with %s everywhere (not counted; suppress it by other means).\n", d, tc.Mode)
	}
	if s := o.Sphere; s != nil {
		kind := "metal sphere"
		switch s.Contact {
		case cavity.OnWall.String():
			kind = "screw tip (hemisphere on the wall)"
		case cavity.InCorner.String():
			kind = "screw tip in the corner (quarter sphere)"
		}
		fmt.Fprintf(w, "\nSlater perturbation at L = %s: %s of radius %s at rho %s, phi %.4g deg, z %s\n",
			physics.FormatLength(s.LengthM, 6), kind, physics.FormatLength(s.RadiusM, 4), physics.FormatLength(s.RhoM, 4), s.PhiDeg,
			physics.FormatLength(s.ZM, 4))
		if len(s.Patterns) == 1 {
			fmt.Fprintf(w, "  shift %s (%+.4g %%)\n", signedHz(s.ShiftsHz[0]), s.ShiftsPct[0])
		} else {
			fmt.Fprintf(w, "  the degenerate set %s splits into (independent of the azimuth of the object):\n", strings.Join(s.Patterns, ", "))
			for i := range s.ShiftsHz {
				fmt.Fprintf(w, "    %s (%+.4g %%), mostly %s\n", signedHz(s.ShiftsHz[i]), s.ShiftsPct[i], s.Dominant[i])
			}
		}
		if !s.Valid {
			fmt.Fprintf(w, "  Caution: outside the small-object limits (r0/lambda = %.3g, want <= 0.05; r0/gap = %.3g, want <= 0.2): treat the shift as a rough estimate.\n",
				s.RadiusOverWavelength, s.RadiusOverWallGap)
		}
	}
	return nil
}

func signedHz(v float64) string {
	if v < 0 {
		return "-" + physics.FormatFrequency(-v, 4)
	}
	return "+" + physics.FormatFrequency(v, 4)
}
