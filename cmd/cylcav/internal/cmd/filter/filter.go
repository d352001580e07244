// Package filter implements `cylcav filter`: a coupled-cavity bandpass
// filter from its specification to the coupling matrix, the cavities that
// realise it, the predicted response with losses, a Touchstone file and a
// response plot.
package filter

import (
	"errors"
	"fmt"
	"math"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/figure"
	bandpass "cylcav/filter"
	"cylcav/physics"
	"cylcav/qfactor"
)

// Limits of the flags.
const (
	// maxAttenuation bounds a rejection requirement: far beyond anything a
	// filter can be measured to.
	maxAttenuation = 300.0 // dB
	// maxPoints bounds --points (a Touchstone file of a few megabytes).
	maxPoints = 100001
	// DefaultPoints is the number of frequencies of the Touchstone sweep.
	DefaultPoints = 1001
	// maxQ0 bounds --q0.
	maxQ0 = 1e12
	// maxHoleThickness bounds --hole-thickness.
	maxHoleThickness = 0.1 // m
)

// FieldSolverNote is printed with every output of the command.
const FieldSolverNote = "Couplings that Bethe's small-aperture theory does not cover, or that lie outside its validity (ports, cross couplings, large or thick holes), must be realised by a field solver or by measurement."

// ConventionNote states the sign convention of the matrix and the
// S-parameters.
const ConventionNote = "Sign convention: M is the normalised N+2 matrix (rows S, 1..N, L); k_ij = FBW*M_ij, Qext = 1/(FBW*M_S1^2); " +
	"M_S1, M_NL and the main line M_i,i+1 are >= 0, cross couplings keep their sign (negative = the opposite kind of coupling); " +
	"A = Omega*W - j*R - j*Delta + M, S21 = -2j[A^-1]_(N+1,0), S11 = -1 - 2j[A^-1]_(0,0), Delta_ii = f0/(bw*Q0_i)."

// Options are the parsed and validated flags of `cylcav filter`.
type Options struct {
	IO     *cmdutil.IOStreams
	Format cmdutil.Format

	// Spec is the filter specification (Order 0: chosen from Rejections).
	Spec bandpass.Spec
	// ZerosHz are the transmission zeros as given, Hz (Spec.Zeros holds
	// them normalised).
	ZerosHz []float64

	// Cavities is true when the filter is realised as cavities (any of
	// --mode, --wall, --fill, --ratio or --holes given).
	Cavities bool
	Mode     cavity.Mode
	// Fill is the medium in the cavities (vacuum by default).
	Fill physics.Medium
	// Ratio is D/L of every cavity; zero means the design optimiser's D/L
	// for the largest spurious-free clearance.
	Ratio float64
	// Walls are the side wall, end plate A and end plate B; nil means
	// perfectly conducting walls.
	Walls *qfactor.WallSet
	// Hole, when not nil, sizes the main-line couplings as holes.
	Hole *bandpass.Hole
	// Iris, when not nil, sizes every coupling as an iris (iris.go).
	Iris *IrisOptions

	// Q0 is one unloaded Q for every resonator (--q0), zero for none.
	Q0 float64

	// Span is the half-width of the sweep in normalised Omega; Points the
	// number of frequencies of the Touchstone sweep.
	Span   float64
	Points int

	// Space holds the flags of zero placement, normalised and real-axis
	// zeros, topologies and matrix files (space.go).
	Space SpaceOptions

	Touchstone string
	Plot       string
	// Datasheet is the datasheet file (.html or .pdf), empty for none.
	Datasheet  string
	PlotFormat figure.Format
	DPI        int
	Force      bool

	// Fab holds the manufacturing analyses (fab.go).
	Fab FabOptions
}

// NewCmdFilter returns `cylcav filter`. runF, if not nil, replaces the
// command's work (tests use it to inspect the parsed options).
func NewCmdFilter(ios *cmdutil.IOStreams, runF func(*Options) error) *cobra.Command {
	opts := &Options{IO: ios}
	var fl flags
	var fabfl *fabFlags
	var walls *cmdutil.WallFlags
	var geo *cmdutil.GeometryFlags
	var sf *spaceFlags
	var ifl *irisFlags
	cmd := &cobra.Command{
		Use:   "filter --f0 F --bw B (--order N | --reject ATT@F[,...]) [flags]",
		Short: "Design a coupled-cavity bandpass filter: coupling matrix, cavities, response",
		Long: `Design a bandpass filter of coupled cavity resonators, from its
specification to the numbers a designer builds it from:

  1. the order: given (--order) or the smallest that meets the rejections
     (--reject), for the Chebyshev response of the given return loss or
     ripple, or the Butterworth response;
  2. the lowpass prototype (g values, Matthaei, Young & Jones sec. 4.05) and
     the generalised Chebyshev polynomials with the transmission zeros of
     --zeros (Cameron's recursion, IEEE T-MTT 47(4), 1999);
  3. the N+2 coupling matrix, transversal then folded, and the physical
     couplings k = FBW*M and external Q of the end resonators;
  4. with --mode/--wall/--fill/--ratio: one closed cylindrical cavity per
     resonator at its own frequency, its unloaded Q0, the cavity's spurious
     modes near the band, and, with --holes, the coupling holes by Bethe's
     small-aperture theory;
  5. the response with the cavities' Q0 (or --q0): midband insertion loss
     with the first-order estimates (from the group delay at f0, and Cohn's
     for all-pole designs), the group delay, and the pass/fail table of the
     specification.

The passband runs from f1 to f2 with f2 - f1 = bw and f1*f2 = f0^2. A
rejection "40dB@10.3GHz" asks for 40 dB at every frequency from 10.3 GHz
outwards to the end of the band of interest, f0 -+ 20 %: the order and the
check find the least attenuation there exactly, lobes between and beyond the
transmission zeros included. A spurious resonance of the cavities inside a
rejection band fails that rejection. Beyond f0 -+ 20 %, or beyond the
cavities' first spurious resonance, the coupling-matrix model does not hold:
such a rejection is reported as not checked. The --return-loss (or --ripple)
requirement is checked on the designed (lossless) response; the effect of
the losses (lossy return loss, rounding of the band edges) is shown apart.
Transmission zeros are given in Hz and mapped to
Omega = (f0/bw)(f/f0 - f0/f); at most N (N-1 with a plain folded network, N
adds a source-load coupling).

The coupling-matrix model is a narrowband model: a bandwidth above 10 % of
f0 is refused (exit status 2).

Without --mode, --wall, --fill, --ratio and --holes no cavities are sized and
the response is lossless unless --q0 gives an unloaded Q. With only --wall
(or --fill) the mode is TE011. Without --ratio each cavity takes the D/L that
the design optimiser ('cylcav design') finds for the largest spurious-free
clearance of the mode at f0.

--touchstone writes the response as a Touchstone 1.1 .s2p file (RI, 50 ohm,
Hz); --plot draws |S21|, |S11| with the specification mask and the group
delay (.png, .svg or .pdf). --datasheet writes the filter's datasheet, as
one self-contained HTML file (.html) or as a PDF (.pdf): the specification
with the verdict of every mask line, the topology diagram, the coupling
matrix, the resonators, the coupling realisation, the response charts
(mask, passband loss, the wide view with the cavities' spurious modes),
the tolerance, temperature and power results that were asked for, and the
cautions. Existing files are replaced only with --force; no file is written
when anything fails.

Mode index convention: TE_nmp / TM_nmp, n azimuthal, m radial, p axial.`,
		Example: `  # A channel filter for an invented 10 GHz beacon receiver:
  # 200 MHz wide, 20 dB return loss, order chosen for the rejections,
  # TE011 copper cavities, with the response plot and a Touchstone file
  $ cylcav filter --f0 10GHz --bw 200MHz --return-loss 20dB \
      --reject 40dB@10.25GHz,35dB@9.75GHz --zeros 9.8GHz,10.18GHz \
      --mode TE011 --wall copper --plot response.png --touchstone ch1.s2p

  # A 5th-order 0.01 dB ripple Chebyshev filter, lossless, as JSON
  $ cylcav filter --f0 2.45GHz --bw 80MHz --order 5 --ripple 0.01dB --format json

  # The same with Q0 = 3000 per resonator, over 5 bandwidths
  $ cylcav filter --f0 2.45GHz --bw 80MHz --order 5 --ripple 0.01dB --q0 3000 --span 5x

  # As a manufactured part: yield at +-5 um against 18 dB, the screw tuning
  # range, the drift from 10 C to 30 C with invar rods, and 200 W of input
  $ cylcav filter --f0 10GHz --bw 100MHz --return-loss 23dB --order 6 \
      --mode TE011 --wall copper --ratio 1.2 --tolerance 0.005mm \
      --accept-return-loss 18dB --temp 10C:30C --rod-metal invar --power 200W

  # Its datasheet, as one HTML file (or .pdf)
  $ cylcav filter --f0 10GHz --bw 100MHz --return-loss 23dB --order 6 \
      --mode TE011 --wall copper --ratio 1.2 --tolerance 0.005mm --power 200W \
      --datasheet channel.html`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			changed := cmd.Flags().Changed
			fromFile, err := opts.readMatrix(changed)
			if err != nil {
				return err
			}
			if !fromFile {
				if err := opts.checkSpec(changed, &fl); err != nil {
					return err
				}
			}
			if err := opts.checkSpace(changed, sf); err != nil {
				return err
			}
			if err := opts.checkCavities(changed, walls, geo, &fl); err != nil {
				return err
			}
			if err := opts.checkIris(changed, ifl); err != nil {
				return err
			}
			if err := opts.checkFab(changed, fabfl); err != nil {
				return err
			}
			if err := opts.checkOutput(); err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return runFilter(opts)
		},
	}
	f := cmd.Flags()
	s := &opts.Spec
	cmdutil.FrequencyVar(f, &s.F0, "f0", "centre frequency (geometric), e.g. 10GHz (required)", cmdutil.MinFrequency, cmdutil.MaxFrequency)
	fl.bw = cmdutil.FrequencyOrFractionVar(f, "bw", "passband width f2 - f1, e.g. 200MHz or 2% of f0 (required)")
	cmdutil.IntVar(f, &s.Order, "order", 0, fmt.Sprintf("number of resonators, 1..%d (or give --reject)", bandpass.MaxOrder), 1, bandpass.MaxOrder)
	cmdutil.LevelListVar(f, &fl.reject, "reject", "rejections ATT@FREQ[:END][,...]: from FREQ outwards, to END when given, e.g. 40dB@10.25GHz:10.6GHz,35dB@9.75GHz", maxAttenuation)
	cmdutil.DecibelVar(f, &s.ReturnLoss, "return-loss", fmt.Sprintf("passband return loss, e.g. 20dB (default %g dB)", bandpass.DefaultReturnLoss),
		bandpass.ReturnLossFromRipple(bandpass.MaxRipple), bandpass.MaxReturnLoss)
	cmdutil.DecibelVar(f, &s.Ripple, "ripple", "passband ripple instead of --return-loss, e.g. 0.01dB",
		bandpass.RippleFromReturnLoss(bandpass.MaxReturnLoss), bandpass.MaxRipple)
	fl.zeros = cmdutil.FrequencyListVar(f, &opts.ZerosHz, "zeros", "transmission zeros outside the passband, e.g. 10.18GHz,9.8GHz", cmdutil.MinFrequency, cmdutil.MaxFrequency)
	cmdutil.EnumVar(f, &s.Family, "response", "chebyshev", "response family: chebyshev|butterworth", "response",
		cmdutil.Choice[bandpass.Family]{Word: "chebyshev", Value: bandpass.Chebyshev},
		cmdutil.Choice[bandpass.Family]{Word: "butterworth", Value: bandpass.Butterworth})
	cmdutil.ModeVar(f, &opts.Mode, "mode", "cavity mode of every resonator, e.g. TE011 (default TE011 with --wall/--fill)")
	geo = cmdutil.AddGeometryFlags(cmd, cmdutil.Geometry{
		Fill: "fill: library name (air, ptfe, ...) or eps=...,tand=... (default vacuum)",
	})
	walls = cmdutil.AddWallFlags(cmd)
	cmdutil.NumberVar(f, &opts.Ratio, "ratio", "D/L of every cavity (default: the design optimiser's, largest clearance)", cavity.MinDesignRatio, cavity.MaxDesignRatio)
	cmdutil.EnumVar(f, &fl.holes, "holes", "", "size the main-line couplings as circular holes in the common end|side wall (Bethe)", "wall",
		cmdutil.Choice[bandpass.Wall]{Word: "end", Value: bandpass.EndWall, Note: "cavities stacked on one axis"},
		cmdutil.Choice[bandpass.Wall]{Word: "side", Value: bandpass.SideWall, Note: "cavities side by side"})
	cmdutil.LengthVar(f, &fl.holeT, "hole-thickness", "wall thickness at the holes, e.g. 0.5mm (default 0, thin wall)", 0, maxHoleThickness)
	cmdutil.NumberVar(f, &opts.Q0, "q0", "unloaded Q of every resonator, without cavities, e.g. 5000 (default lossless)", 1, maxQ0)
	f.StringVar(&opts.Touchstone, "touchstone", "", "write the response as a Touchstone 1.1 file, e.g. filter.s2p")
	f.StringVar(&opts.Plot, "plot", "", "write the response plot: .png, .svg or .pdf")
	f.StringVar(&opts.Datasheet, "datasheet", "", "write the filter datasheet: .html (one self-contained file) or .pdf")
	cmdutil.TimesVar(f, &opts.Span, "span", "3x", "frequency range: N bandwidths around f0 (Omega -N..N), widened to show every rejection and zero",
		"bandwidths", 1, bandpass.MaxSpan)
	cmdutil.IntVar(f, &opts.Points, "points", DefaultPoints, fmt.Sprintf("number of frequencies of the Touchstone sweep, 2..%d", maxPoints), 2, maxPoints)
	cmdutil.IntVar(f, &opts.DPI, "dpi", figure.DefaultDPI, "resolution of a PNG plot, dots per inch", figure.MinDPI, figure.MaxDPI)
	f.BoolVar(&opts.Force, "force", false, "replace existing --touchstone, --plot and --datasheet files")
	cmdutil.Needs(cmd, "points", "touchstone")
	cmdutil.Needs(cmd, "dpi", "plot")
	sf = addSpaceFlags(cmd, opts)
	cmdutil.Needs(cmd, "force", "touchstone", "plot", "datasheet", "save-matrix")
	cmdutil.Needs(cmd, "hole-thickness", "holes")
	ifl = addIrisFlags(cmd)
	fabfl = addFabFlags(cmd, opts)
	validFormat := cmdutil.FormatFlag(cmd, &opts.Format, cmdutil.Table, cmdutil.JSON)
	cmd.PreRunE = func(c *cobra.Command, _ []string) error {
		if err := cmdutil.RejectEmptyFlags(c); err != nil {
			return err
		}
		return validFormat()
	}
	_ = cmd.RegisterFlagCompletionFunc("response", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return []string{"chebyshev", "butterworth"}, cobra.ShellCompDirectiveNoFileComp
	})
	_ = cmd.RegisterFlagCompletionFunc("holes", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return []string{"end", "side"}, cobra.ShellCompDirectiveNoFileComp
	})
	return cmd
}

// flags are the values of the flags that checkSpec and checkCavities
// turn into Options.
type flags struct {
	bw     *cmdutil.FrequencyOrFraction
	reject []cmdutil.LevelAt
	zeros  *cmdutil.FrequencyList
	holes  bandpass.Wall
	holeT  float64
}

// checkSpec checks the specification flags against each other and
// completes opts.Spec (their own ranges were checked while parsing).
func (opts *Options) checkSpec(changed func(string) bool, fl *flags) error {
	s := &opts.Spec
	if !changed("f0") {
		return cmdutil.Usagef("--f0 is required, e.g. --f0 10GHz")
	}
	f0 := s.F0
	if !changed("bw") {
		return cmdutil.Usagef("--bw is required, e.g. --bw 200MHz or --bw 2%%")
	}
	bw := fl.bw.Of(f0)
	if !(bw/f0 >= minFBW && bw < f0) { // bw/f0 is correctly rounded: 100 kHz at 10 GHz is exactly minFBW
		return cmdutil.FlagError("bw", fl.bw.Text(), fmt.Errorf("must be between %s (%g %% of --f0) and the centre frequency --f0 %s",
			cmdutil.TrimZeros(physics.FormatFrequency(minFBW*f0, 4)), minFBW*100, cmdutil.TrimZeros(physics.FormatFrequency(f0, 6))))
	}
	if bandpass.ModelFBWError(f0, bw) != nil {
		return cmdutil.FlagError("bw", fl.bw.Text(), fmt.Errorf("a fractional bandwidth of %.4g %% is above %g %% of f0, where the narrowband coupling-matrix model (frequency-invariant couplings) stops holding; a wider filter needs couplings modelled with their frequency dependence",
			100*bw/f0, 100*bandpass.MaxModelFBW))
	}
	s.BW = bw
	f1, f2 := bandpass.BandpassFrequency(-1, f0, bw), bandpass.BandpassFrequency(1, f0, bw)
	band := fmt.Sprintf("%s..%s", physics.FormatFrequency(f1, 6), physics.FormatFrequency(f2, 6))

	for _, r := range fl.reject {
		if math.Abs(bandpass.LowpassOmega(r.Hz, f0, bw)) <= 1 {
			return cmdutil.FlagError("reject", r.Text, fmt.Errorf("frequency lies in the passband %s; rejections must lie outside it", band))
		}
		s.Rejections = append(s.Rejections, bandpass.Rejection{F: r.Hz, Attenuation: r.DB, End: r.End})
	}
	if s.Order == 0 && len(s.Rejections) == 0 {
		return cmdutil.Usagef("give --order N (1..%d) or --reject ATT@FREQ (e.g. --reject 40dB@10.3GHz) to choose the order from", bandpass.MaxOrder)
	}
	if changed("return-loss") && changed("ripple") {
		return cmdutil.Usagef("give --return-loss or --ripple, not both (they fix the same ripple level)")
	}
	if s.Family == bandpass.Butterworth && (changed("return-loss") || changed("ripple") || changed("zeros")) {
		return cmdutil.Usagef("--response butterworth has no ripple and no finite transmission zeros; drop --return-loss, --ripple and --zeros or use --response chebyshev")
	}

	s.Zeros = nil
	for i, fz := range opts.ZerosHz {
		w := bandpass.LowpassOmega(fz, f0, bw)
		if math.Abs(w) <= 1 {
			return cmdutil.FlagError("zeros", fl.zeros.Items()[i], fmt.Errorf("lies in the passband %s; transmission zeros must lie outside it", band))
		}
		s.Zeros = append(s.Zeros, w)
	}
	limit := bandpass.MaxOrder
	if s.Order != 0 {
		limit = s.Order
	}
	if len(s.Zeros) > limit {
		return cmdutil.FlagError("zeros", fl.zeros.Text(), fmt.Errorf("%d transmission zeros for order %d; at most %d (%d without a source-load coupling)", len(s.Zeros), limit, limit, limit-1))
	}
	return nil
}

// minFBW is the least fractional bandwidth bw/f0 that --bw accepts. Below
// about 1e-6 the band edges f0 -+ bw/2 differ from f0 in the last few of
// the 16 significant digits of a float64, and the lossless response
// computed at them loses its ripple (a 3-pole design at 10 GHz with
// bw = 10 Hz reports its own ripple as not met); 1e-5 keeps four digits in
// hand. No cavity filter comes near it: Q0 would have to exceed 1e5 / N.
const minFBW = 1e-5

// checkCavities checks the realisation flags against each other and
// completes the cavities of opts (the wall flags' companions were checked
// by cmdutil.CheckNeeds before the command ran).
func (opts *Options) checkCavities(changed func(string) bool, walls *cmdutil.WallFlags, geo *cmdutil.GeometryFlags, fl *flags) error {
	wallGiven := walls.Given()
	opts.Cavities = changed("mode") || wallGiven || changed("fill") || changed("ratio") || changed("holes") || changed("iris-wall")
	if changed("q0") && opts.Cavities {
		return cmdutil.Usagef("--q0 sets the unloaded Q without cavities; drop it, or drop --mode, --wall, --fill, --ratio and --holes to use it")
	}
	if !opts.Cavities {
		return nil
	}
	if !changed("mode") {
		opts.Mode = cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}
	}
	// Vacuum unless --fill is given (an empty --fill is refused before).
	var err error
	if opts.Fill, err = geo.Fill(); err != nil {
		return err
	}
	if wallGiven {
		s, err := walls.Walls()
		if err != nil {
			return err
		}
		opts.Walls = &s
	}
	if changed("holes") {
		opts.Hole = &bandpass.Hole{Wall: fl.holes, Thickness: fl.holeT}
	}
	return nil
}

// checkOutput checks the output files.
func (opts *Options) checkOutput() error {
	if opts.Touchstone != "" && !strings.EqualFold(filepath.Ext(opts.Touchstone), ".s2p") {
		return cmdutil.FlagError("touchstone", opts.Touchstone, errors.New("a two-port Touchstone file name must end in .s2p"))
	}
	if opts.Plot != "" {
		f, err := figure.FormatOf(opts.Plot)
		if err != nil {
			return cmdutil.FlagError("plot", opts.Plot, errors.New("the file name must end in .png, .svg or .pdf"))
		}
		opts.PlotFormat = f
	}
	if opts.Datasheet != "" {
		if _, err := sheetFormat(opts.Datasheet); err != nil {
			return cmdutil.FlagError("datasheet", opts.Datasheet, err)
		}
	}
	var files []cmdutil.File
	if opts.Touchstone != "" {
		files = append(files, cmdutil.File{Flag: "touchstone", Path: opts.Touchstone})
	}
	if opts.Plot != "" {
		files = append(files, cmdutil.File{Flag: "plot", Path: opts.Plot})
	}
	if opts.Datasheet != "" {
		files = append(files, cmdutil.File{Flag: "datasheet", Path: opts.Datasheet})
	}
	// CheckFiles refuses two flags naming one file.
	return cmdutil.CheckFiles(opts.Force, files...)
}
