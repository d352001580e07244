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
	"strconv"
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

	// Q0 is one unloaded Q for every resonator (--q0), zero for none.
	Q0 float64

	// Span is the half-width of the sweep in normalised Omega; Points the
	// number of frequencies of the Touchstone sweep.
	Span   float64
	Points int

	Touchstone string
	Plot       string
	PlotFormat figure.Format
	DPI        int
	Force      bool
}

// NewCmdFilter returns `cylcav filter`. runF, if not nil, replaces the
// command's work (tests use it to inspect the parsed options).
func NewCmdFilter(ios *cmdutil.IOStreams, runF func(*Options) error) *cobra.Command {
	opts := &Options{IO: ios}
	var (
		f0, bw, reject, rl, ripple, zeros, response string
		mode, ratio, q0, holes, holeT, span         string
		order                                       int
	)
	var walls *cmdutil.WallFlags
	var geo *cmdutil.GeometryFlags
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
delay (.png, .svg or .pdf). Existing files are replaced only with --force;
no file is written when anything fails.

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
  $ cylcav filter --f0 2.45GHz --bw 80MHz --order 5 --ripple 0.01dB --q0 3000 --span 5x`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			changed := cmd.Flags().Changed
			if err := opts.parseSpec(changed, f0, bw, order, reject, rl, ripple, zeros, response); err != nil {
				return err
			}
			if err := opts.parseCavities(changed, walls, geo, mode, ratio, q0, holes, holeT); err != nil {
				return err
			}
			if err := opts.parseOutput(span); err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return runFilter(opts)
		},
	}
	f := cmd.Flags()
	f.StringVar(&f0, "f0", "", "centre frequency (geometric), e.g. 10GHz (required)")
	f.StringVar(&bw, "bw", "", "passband width f2 - f1, e.g. 200MHz or 2% of f0 (required)")
	f.IntVar(&order, "order", 0, fmt.Sprintf("number of resonators, 1..%d (or give --reject)", bandpass.MaxOrder))
	f.StringVar(&reject, "reject", "", "rejections ATT@FREQ[,...], e.g. 40dB@10.25GHz,35dB@9.75GHz")
	f.StringVar(&rl, "return-loss", "", fmt.Sprintf("passband return loss, e.g. 20dB (default %g dB)", bandpass.DefaultReturnLoss))
	f.StringVar(&ripple, "ripple", "", "passband ripple instead of --return-loss, e.g. 0.01dB")
	f.StringVar(&zeros, "zeros", "", "transmission zeros outside the passband, e.g. 10.18GHz,9.8GHz")
	f.StringVar(&response, "response", "chebyshev", "response family: chebyshev|butterworth")
	f.StringVar(&mode, "mode", "", "cavity mode of every resonator, e.g. TE011 (default TE011 with --wall/--fill)")
	geo = cmdutil.AddGeometryFlags(cmd, cmdutil.Geometry{
		Fill: "fill: library name (air, ptfe, ...) or eps=...,tand=... (default vacuum)",
	})
	walls = cmdutil.AddWallFlags(cmd)
	f.StringVar(&ratio, "ratio", "", "D/L of every cavity (default: the design optimiser's, largest clearance)")
	f.StringVar(&holes, "holes", "", "size the main-line couplings as circular holes in the common end|side wall (Bethe)")
	f.StringVar(&holeT, "hole-thickness", "", "wall thickness at the holes, e.g. 0.5mm (default 0, thin wall)")
	f.StringVar(&q0, "q0", "", "unloaded Q of every resonator, without cavities, e.g. 5000 (default lossless)")
	f.StringVar(&opts.Touchstone, "touchstone", "", "write the response as a Touchstone 1.1 file, e.g. filter.s2p")
	f.StringVar(&opts.Plot, "plot", "", "write the response plot: .png, .svg or .pdf")
	f.StringVar(&span, "span", "3x", "frequency range: N bandwidths around f0 (Omega -N..N), widened to show every rejection and zero")
	f.IntVar(&opts.Points, "points", DefaultPoints, fmt.Sprintf("number of frequencies of the Touchstone sweep, 2..%d", maxPoints))
	f.IntVar(&opts.DPI, "dpi", figure.DefaultDPI, "resolution of a PNG plot, dots per inch")
	f.BoolVar(&opts.Force, "force", false, "replace existing --touchstone and --plot files")
	cmdutil.Needs(cmd, "points", "touchstone")
	cmdutil.Needs(cmd, "dpi", "plot")
	cmdutil.Needs(cmd, "force", "touchstone", "plot")
	cmdutil.Needs(cmd, "hole-thickness", "holes")
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

// parseSpec validates the specification flags into opts.Spec.
func (opts *Options) parseSpec(changed func(string) bool, f0S, bwS string, order int, rejectS, rlS, rippleS, zerosS, responseS string) error {
	s := &opts.Spec
	if f0S == "" {
		return cmdutil.Usagef("--f0 is required, e.g. --f0 10GHz")
	}
	f0, err := cmdutil.Frequency("f0", f0S, cmdutil.MinFrequency, cmdutil.MaxFrequency)
	if err != nil {
		return err
	}
	s.F0 = f0
	if bwS == "" {
		return cmdutil.Usagef("--bw is required, e.g. --bw 200MHz or --bw 2%%")
	}
	bw, err := parseBandwidth(bwS, f0)
	if err != nil {
		return err
	}
	if bandpass.ModelFBWError(f0, bw) != nil {
		return cmdutil.FlagError("bw", bwS, fmt.Errorf("a fractional bandwidth of %.4g %% is above %g %% of f0, where the narrowband coupling-matrix model (frequency-invariant couplings) stops holding; a wider filter needs couplings modelled with their frequency dependence",
			100*bw/f0, 100*bandpass.MaxModelFBW))
	}
	s.BW = bw
	f1, f2 := bandpass.BandpassFrequency(-1, f0, bw), bandpass.BandpassFrequency(1, f0, bw)
	band := fmt.Sprintf("%s..%s", physics.FormatFrequency(f1, 6), physics.FormatFrequency(f2, 6))

	switch strings.ToLower(strings.TrimSpace(responseS)) {
	case "chebyshev":
		s.Family = bandpass.Chebyshev
	case "butterworth":
		s.Family = bandpass.Butterworth
	default:
		return cmdutil.FlagError("response", responseS, errors.New("unknown response; use chebyshev or butterworth"))
	}

	if changed("order") {
		if order < 1 || order > bandpass.MaxOrder {
			return cmdutil.FlagError("order", strconv.Itoa(order), fmt.Errorf("must be between 1 and %d", bandpass.MaxOrder))
		}
		s.Order = order
	}
	if rejectS != "" {
		for _, item := range strings.Split(rejectS, ",") {
			r, err := parseRejection(item, f0, bw, band)
			if err != nil {
				return err
			}
			s.Rejections = append(s.Rejections, r)
		}
	}
	if s.Order == 0 && len(s.Rejections) == 0 {
		return cmdutil.Usagef("give --order N (1..%d) or --reject ATT@FREQ (e.g. --reject 40dB@10.3GHz) to choose the order from", bandpass.MaxOrder)
	}

	if rlS != "" && rippleS != "" {
		return cmdutil.Usagef("give --return-loss or --ripple, not both (they fix the same ripple level)")
	}
	minRL := bandpass.ReturnLossFromRipple(bandpass.MaxRipple)
	if rlS != "" {
		v, err := decibels("return-loss", rlS, minRL, bandpass.MaxReturnLoss)
		if err != nil {
			return err
		}
		s.ReturnLoss = v
	}
	if rippleS != "" {
		v, err := decibels("ripple", rippleS, bandpass.RippleFromReturnLoss(bandpass.MaxReturnLoss), bandpass.MaxRipple)
		if err != nil {
			return err
		}
		s.Ripple = v
	}
	if s.Family == bandpass.Butterworth && (rlS != "" || rippleS != "" || zerosS != "") {
		return cmdutil.Usagef("--response butterworth has no ripple and no finite transmission zeros; drop --return-loss, --ripple and --zeros or use --response chebyshev")
	}

	if zerosS != "" {
		for _, item := range strings.Split(zerosS, ",") {
			fz, err := cmdutil.Frequency("zeros", strings.TrimSpace(item), cmdutil.MinFrequency, cmdutil.MaxFrequency)
			if err != nil {
				return err
			}
			w := bandpass.LowpassOmega(fz, f0, bw)
			if math.Abs(w) <= 1 {
				return cmdutil.FlagError("zeros", strings.TrimSpace(item), fmt.Errorf("lies in the passband %s; transmission zeros must lie outside it", band))
			}
			opts.ZerosHz = append(opts.ZerosHz, fz)
			s.Zeros = append(s.Zeros, w)
		}
		limit := bandpass.MaxOrder
		if s.Order != 0 {
			limit = s.Order
		}
		if len(s.Zeros) > limit {
			return cmdutil.FlagError("zeros", zerosS, fmt.Errorf("%d transmission zeros for order %d; at most %d (%d without a source-load coupling)", len(s.Zeros), limit, limit, limit-1))
		}
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

// parseBandwidth parses --bw as a frequency or as a percentage of f0 and
// checks minFBW f0 <= bw < f0.
func parseBandwidth(v string, f0 float64) (float64, error) {
	t := strings.TrimSpace(v)
	var bw float64
	if strings.HasSuffix(t, "%") {
		frac, err := physics.ParseFraction(t)
		if err != nil {
			return 0, cmdutil.FlagError("bw", v, err)
		}
		bw = frac * f0
	} else {
		var err error
		if bw, err = cmdutil.ParseFrequency("bw", t); err != nil {
			return 0, err
		}
	}
	if !(bw/f0 >= minFBW && bw < f0) { // bw/f0 is correctly rounded: 100 kHz at 10 GHz is exactly minFBW
		return 0, cmdutil.FlagError("bw", v, fmt.Errorf("must be between %s (%g %% of --f0) and the centre frequency --f0 %s",
			cmdutil.TrimZeros(physics.FormatFrequency(minFBW*f0, 4)), minFBW*100, cmdutil.TrimZeros(physics.FormatFrequency(f0, 6))))
	}
	return bw, nil
}

// parseRejection parses one ATT@FREQ item of --reject.
func parseRejection(item string, f0, bw float64, band string) (bandpass.Rejection, error) {
	it := strings.TrimSpace(item)
	a, fr, ok := strings.Cut(it, "@")
	if !ok {
		return bandpass.Rejection{}, cmdutil.FlagError("reject", it, errors.New("want ATTENUATION@FREQUENCY, e.g. 40dB@10.3GHz"))
	}
	att, err := physics.ParseDecibel(a)
	if err != nil {
		return bandpass.Rejection{}, cmdutil.FlagError("reject", it, err)
	}
	if !(att > 0 && att <= maxAttenuation) {
		return bandpass.Rejection{}, cmdutil.FlagError("reject", it, fmt.Errorf("attenuation must be > 0 dB and <= %g dB", maxAttenuation))
	}
	f, err := cmdutil.FrequencyOf(fr)
	if err != nil {
		return bandpass.Rejection{}, cmdutil.FlagError("reject", it, err)
	}
	if !(f >= cmdutil.MinFrequency && f <= cmdutil.MaxFrequency) {
		return bandpass.Rejection{}, cmdutil.FlagError("reject", it, fmt.Errorf("frequency must be between %s and %s",
			physics.FormatFrequency(cmdutil.MinFrequency, 4), physics.FormatFrequency(cmdutil.MaxFrequency, 4)))
	}
	if math.Abs(bandpass.LowpassOmega(f, f0, bw)) <= 1 {
		return bandpass.Rejection{}, cmdutil.FlagError("reject", it, fmt.Errorf("frequency lies in the passband %s; rejections must lie outside it", band))
	}
	return bandpass.Rejection{F: f, Attenuation: att}, nil
}

// decibels parses a dB flag and checks lo <= v <= hi (lo > 0 excluded
// values are reported with the range).
func decibels(flag, v string, lo, hi float64) (float64, error) {
	x, err := physics.ParseDecibel(v)
	if err != nil {
		return 0, cmdutil.FlagError(flag, v, err)
	}
	if !(x >= lo && x <= hi) {
		return 0, cmdutil.FlagError(flag, v, fmt.Errorf("must be between %.4g dB and %g dB", lo, hi))
	}
	return x, nil
}

// parseCavities validates the realisation flags.
func (opts *Options) parseCavities(changed func(string) bool, walls *cmdutil.WallFlags, geo *cmdutil.GeometryFlags, modeS, ratioS, q0S, holesS, holeTS string) error {
	wallGiven := walls.Given()
	opts.Cavities = changed("mode") || wallGiven || changed("fill") || changed("ratio") || changed("holes")
	if q0S != "" {
		if opts.Cavities {
			return cmdutil.Usagef("--q0 sets the unloaded Q without cavities; drop it, or drop --mode, --wall, --fill, --ratio and --holes to use it")
		}
		v, err := cmdutil.Number("q0", q0S, 1, maxQ0)
		if err != nil {
			return err
		}
		opts.Q0 = v
	}
	if !wallGiven {
		for _, fl := range []string{"end-wall", "end-wall-a", "end-wall-b", "temperature", "roughness", "roughness-model", "plating", "plating-thickness", "superconducting", "residual"} {
			if changed(fl) {
				return cmdutil.Usagef("--%s describes the cavity walls; %s", fl, wallHint(changed))
			}
		}
	}
	if changed("hole-thickness") && holesS == "" {
		return cmdutil.Usagef("--hole-thickness needs --holes end|side")
	}
	if !opts.Cavities {
		return nil
	}
	opts.Mode = cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}
	if modeS != "" {
		m, err := cavity.ParseMode(modeS)
		if err != nil {
			return cmdutil.FlagError("mode", modeS, err)
		}
		if err := m.Validate(); err != nil {
			return cmdutil.FlagError("mode", modeS, err)
		}
		opts.Mode = m
	}
	// --fill given empty counts as absent (vacuum), as this command's other
	// string flags do.
	opts.Fill = physics.Medium{}
	if geo.Text("fill") != "" {
		f, err := geo.Fill()
		if err != nil {
			return err
		}
		opts.Fill = f
	}
	if ratioS != "" {
		r, err := cmdutil.Number("ratio", ratioS, cavity.MinDesignRatio, cavity.MaxDesignRatio)
		if err != nil {
			return err
		}
		opts.Ratio = r
	}
	if wallGiven {
		s, err := walls.Walls()
		if err != nil {
			return err
		}
		opts.Walls = &s
	}
	switch strings.ToLower(strings.TrimSpace(holesS)) {
	case "":
	case "end":
		opts.Hole = &bandpass.Hole{Wall: bandpass.EndWall}
	case "side":
		opts.Hole = &bandpass.Hole{Wall: bandpass.SideWall}
	default:
		return cmdutil.FlagError("holes", holesS, errors.New("unknown wall; use end (cavities stacked on one axis) or side (cavities side by side)"))
	}
	if opts.Hole != nil && holeTS != "" {
		t, err := cmdutil.Length("hole-thickness", holeTS, 0, maxHoleThickness)
		if err != nil {
			return err
		}
		opts.Hole.Thickness = t
	}
	return nil
}

// wallHint advises the --wall a wall flag needs, one that the wall flags
// given accept: the superconducting model (--superconducting, --residual)
// is niobium's and needs a temperature, so those flags get niobium; the
// others a normal metal.
func wallHint(changed func(string) bool) string {
	if changed("superconducting") || changed("residual") {
		return "give --wall niobium too, the only superconducting wall modelled (e.g. --wall niobium --superconducting --temperature 2K)"
	}
	return "give --wall too (e.g. --wall copper)"
}

// parseOutput validates --span, --points, --touchstone, --plot and --dpi.
func (opts *Options) parseOutput(spanS string) error {
	t := strings.TrimSpace(spanS)
	t = strings.TrimSuffix(strings.TrimSuffix(t, "x"), "X")
	v, err := physics.ParseNumber(t)
	if err != nil || !(v > 1 && v <= bandpass.MaxSpan) {
		return cmdutil.FlagError("span", spanS, fmt.Errorf("want a number of bandwidths above 1 and at most %g, e.g. 3x", bandpass.MaxSpan))
	}
	opts.Span = v
	if opts.Points < 2 || opts.Points > maxPoints {
		return cmdutil.FlagError("points", strconv.Itoa(opts.Points), fmt.Errorf("must be between 2 and %d", maxPoints))
	}
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
	if opts.DPI < figure.MinDPI || opts.DPI > figure.MaxDPI {
		return cmdutil.FlagError("dpi", strconv.Itoa(opts.DPI), fmt.Errorf("must be between %d and %d", figure.MinDPI, figure.MaxDPI))
	}
	if opts.Touchstone != "" && opts.Plot != "" && filepath.Clean(opts.Touchstone) == filepath.Clean(opts.Plot) {
		return cmdutil.Usagef("--touchstone and --plot name the same file %s", opts.Touchstone)
	}
	var files []cmdutil.File
	if opts.Touchstone != "" {
		files = append(files, cmdutil.File{Flag: "touchstone", Path: opts.Touchstone})
	}
	if opts.Plot != "" {
		files = append(files, cmdutil.File{Flag: "plot", Path: opts.Plot})
	}
	return cmdutil.CheckFiles(opts.Force, files...)
}
