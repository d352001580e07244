package filter

import (
	"bytes"
	"errors"
	"fmt"
	"math"
	"os"
	"strings"

	"github.com/spf13/cobra"

	"cylcav/cmd/cylcav/internal/cmdutil"
	bandpass "cylcav/filter"
	"cylcav/physics"
)

// More of the design space (issue 12 section 3): zeros placed from the
// mask, zeros in normalised frequency, real-axis zero pairs, topologies
// beyond the folded form, and the analysis of a coupling matrix from a
// file. Kept apart from filter.go and run.go, which only call in here.

// maxNormZero bounds --zeros-norm: far beyond any band of interest of a
// filter under the model's 10 % bandwidth (Omega = 4 at 10 % at f0 +- 20 %).
const maxNormZero = 1000.0

// SpaceOptions are the parsed flags of this part of the command.
type SpaceOptions struct {
	// ZerosNorm are zeros given in normalised Omega (--zeros-norm), Pairs
	// the sigma of real-axis zero pairs (--delay-pairs).
	ZerosNorm, Pairs []float64
	// Place chooses the order and zeros from the mask (--place-zeros);
	// MaxZeros bounds the number tried (0: the library default).
	Place    bool
	MaxZeros int
	// Topology is "folded", "triplets" or "quadruplets" (--topology).
	Topology string
	// MatrixPath and Matrix: the coupling-matrix text to analyse
	// (--matrix), read before the command runs.
	MatrixPath string
	Matrix     *bandpass.MatrixFile
	// SavePath is the coupling-matrix text to write (--save-matrix).
	SavePath string
}

// SpaceResult is what this part computed.
type SpaceResult struct {
	// Placement is the zero placement (nil without --place-zeros).
	Placement *bandpass.Placement
	// TripletZeros are the zeros each triplet realises (normalised), nil
	// for other topologies.
	TripletZeros []float64
	saved        []byte
}

// spaceFlags are the flag values kept for messages.
type spaceFlags struct {
	zerosNorm *cmdutil.NumberList
}

// addSpaceFlags defines the flags of this part.
func addSpaceFlags(cmd *cobra.Command, opts *Options) *spaceFlags {
	f := cmd.Flags()
	sp := &opts.Space
	sf := &spaceFlags{}
	sf.zerosNorm = cmdutil.NumberListVar(f, &sp.ZerosNorm, "zeros-norm",
		"transmission zeros in normalised frequency Omega = (f0/bw)(f/f0 - f0/f), |Omega| > 1, e.g. -1.8,1.35", -maxNormZero, maxNormZero, bandpass.MaxOrder, "zero")
	cmdutil.NumberListVar(f, &sp.Pairs, "delay-pairs",
		"real-axis zero pairs s = -+sigma (normalised sigma) that flatten the group delay, e.g. 1.1", 1e-3, bandpass.MaxPairSigma, bandpass.MaxOrder/2, "pair")
	f.BoolVar(&sp.Place, "place-zeros", false, "choose the order and the transmission zeros that meet --reject with the fewest resonators")
	cmdutil.IntVar(f, &sp.MaxZeros, "max-zeros", 0, fmt.Sprintf("with --place-zeros: most zeros to try, 1..%d (default %d)", bandpass.MaxOrder-2, bandpass.DefaultMaxPlacedZeros), 1, bandpass.MaxOrder-2)
	cmdutil.EnumVar(f, &sp.Topology, "topology", "folded", "coupling topology: folded|triplets|quadruplets", "topology",
		cmdutil.Choice[string]{Word: "folded", Value: "folded", Note: "folded canonical form"},
		cmdutil.Choice[string]{Word: "triplets", Value: "triplets", Note: "cascaded triplets, one per zero"},
		cmdutil.Choice[string]{Word: "quadruplets", Value: "quadruplets", Note: "cascaded quadruplets, one per pair of zeros"})
	f.StringVar(&sp.MatrixPath, "matrix", "", "analyse the coupling matrix in this text file instead of designing one (see examples/*.cmx)")
	f.StringVar(&sp.SavePath, "save-matrix", "", "write the coupling matrix as text that --matrix reads, e.g. design.cmx")
	cmdutil.Needs(cmd, "max-zeros", "place-zeros")
	_ = cmd.RegisterFlagCompletionFunc("topology", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return []string{"folded", "triplets", "quadruplets"}, cobra.ShellCompDirectiveNoFileComp
	})
	return sf
}

// specFlags are the flags a matrix file replaces.
var specFlags = []string{"f0", "bw", "order", "reject", "return-loss", "ripple", "response", "zeros",
	"zeros-norm", "delay-pairs", "place-zeros", "topology"}

// readMatrix reads --matrix before the specification flags are checked; it
// reports whether a matrix was given (the specification then comes from
// the file).
func (opts *Options) readMatrix(changed func(string) bool) (bool, error) {
	sp := &opts.Space
	if !changed("matrix") {
		return false, nil
	}
	for _, name := range specFlags {
		if changed(name) {
			return true, cmdutil.Usagef("--%s cannot be combined with --matrix: the matrix file states the centre, bandwidth, order and requirements", name)
		}
	}
	data, err := os.ReadFile(sp.MatrixPath)
	if err != nil {
		return true, cmdutil.FlagError("matrix", sp.MatrixPath, fmt.Errorf("cannot read the file: %v", errors.Unwrap(err)))
	}
	mf, err := bandpass.ParseMatrixFile(bytes.NewReader(data))
	if err != nil {
		return true, cmdutil.FlagError("matrix", sp.MatrixPath, err)
	}
	if err := bandpass.ModelFBWError(mf.Spec.F0, mf.Spec.BW); err != nil {
		return true, cmdutil.FlagError("matrix", sp.MatrixPath, errors.New(strings.TrimPrefix(err.Error(), "filter: ")))
	}
	sp.Matrix = mf
	opts.Spec = mf.Spec
	if !changed("q0") && mf.Q0 > 0 && !changed("mode") {
		opts.Q0 = mf.Q0
	}
	return true, nil
}

// checkSpace checks the flags of this part after the specification flags
// and completes opts.Spec.
func (opts *Options) checkSpace(changed func(string) bool, sf *spaceFlags) error {
	sp := &opts.Space
	s := &opts.Spec
	if sp.SavePath != "" {
		if err := cmdutil.CheckFiles(opts.Force, cmdutil.File{Flag: "save-matrix", Path: sp.SavePath}); err != nil {
			return err
		}
	}
	if sp.Matrix != nil {
		return nil
	}
	if s.Family == bandpass.Butterworth && (changed("zeros-norm") || changed("delay-pairs") || sp.Place) {
		return cmdutil.Usagef("--response butterworth has no finite transmission zeros; drop --zeros-norm, --delay-pairs and --place-zeros or use --response chebyshev")
	}
	items := strings.Split(sf.zerosNorm.String(), ",")
	for i, w := range sp.ZerosNorm {
		if math.Abs(w) <= 1 {
			return cmdutil.FlagError("zeros-norm", strings.TrimSpace(items[i]), errors.New("lies in the passband -1..1; transmission zeros need |Omega| > 1"))
		}
		s.Zeros = append(s.Zeros, w)
	}
	s.RealPairs = sp.Pairs
	if sp.Place {
		for _, name := range []string{"order", "zeros", "zeros-norm"} {
			if changed(name) {
				return cmdutil.Usagef("--place-zeros chooses the order and the zeros; drop --%s", name)
			}
		}
		if changed("delay-pairs") {
			return cmdutil.Usagef("--place-zeros places zeros on the frequency axis only; drop --delay-pairs (add them to the placed design with --zeros-norm and --order)")
		}
		if len(s.Rejections) == 0 {
			return cmdutil.Usagef("--place-zeros needs --reject, the rejections to meet")
		}
		return nil
	}
	nz := len(s.Zeros) + 2*len(s.RealPairs)
	limit := bandpass.MaxOrder
	if s.Order != 0 {
		limit = s.Order
	}
	if nz > limit {
		return cmdutil.Usagef("%d transmission zeros in all (--zeros, --zeros-norm, and two per --delay-pairs value) for order %d; at most %d", nz, limit, limit)
	}
	return nil
}

// design synthesises the filter, places its zeros or reads it from the
// matrix file, and carries it into the topology asked for.
func (r *Result) design() (*bandpass.Design, error) {
	opts := r.Opts
	sp := opts.Space
	var d *bandpass.Design
	var err error
	switch {
	case sp.Matrix != nil:
		r.OrderChosen = false
		if d, err = bandpass.FromMatrix(sp.Matrix.M, opts.Spec); err != nil {
			return nil, cmdutil.FlagError("matrix", sp.MatrixPath, errors.New(strings.TrimPrefix(err.Error(), "filter: ")))
		}
	case sp.Place:
		// With --q0 the acceptance check includes the losses; the
		// cavities' Q0 is not known before they are sized.
		p, err := bandpass.PlaceZeros(opts.Spec, bandpass.PlaceOptions{MaxZeros: sp.MaxZeros, Q0: opts.Q0})
		if err != nil {
			return nil, cmdutil.Usagef("--place-zeros: %v", strings.TrimPrefix(err.Error(), "filter: "))
		}
		r.Space.Placement = p
		r.OrderChosen = true
		d = p.Design
	default:
		if d, err = bandpass.Synthesize(opts.Spec); err != nil {
			// Every synthesis error is a consequence of the specification.
			return nil, cmdutil.Usagef("specification: %v", strings.TrimPrefix(err.Error(), "filter: "))
		}
	}
	if sp.Topology != "" && sp.Topology != "folded" && sp.Matrix == nil {
		nz := len(d.Zeros) + 2*len(d.RealPairs)
		top, err := bandpass.CascadeTopology(sp.Topology, d.Order(), nz)
		if err != nil {
			return nil, cmdutil.FlagError("topology", sp.Topology, errors.New(strings.TrimPrefix(err.Error(), "filter: ")))
		}
		if d, err = d.Rearranged(top); err != nil {
			return nil, cmdutil.FlagError("topology", sp.Topology, errors.New(strings.TrimPrefix(err.Error(), "filter: ")))
		}
		r.Space.TripletZeros = bandpass.BlockZeros(d.Folded, top)
	}
	if sp.SavePath != "" {
		var b bytes.Buffer
		q0 := opts.Q0
		if err := bandpass.WriteMatrixFile(&b, d, q0, []string{"coupling matrix written by cylcav filter", "read it back with: cylcav filter --matrix " + sp.SavePath}); err != nil {
			return nil, err
		}
		r.Space.saved = b.Bytes()
	}
	return d, nil
}

// spaceFiles returns the output files of this part.
func (r *Result) spaceFiles() []cmdutil.File {
	if r.Opts.Space.SavePath == "" {
		return nil
	}
	return []cmdutil.File{{Flag: "save-matrix", Path: r.Opts.Space.SavePath, Data: r.Space.saved}}
}

// writeSpace prints the topology, the real-axis pairs and the placement.
func (r *Result) writeSpace(b *strings.Builder) {
	d := r.Design
	s := d.Spec
	ff := func(f float64) string { return physics.FormatFrequency(f, 6) }
	if len(d.RealPairs) > 0 {
		fmt.Fprintf(b, "\nReal-axis zero pairs (group-delay equalisation; no null on the frequency axis)\n")
		for _, sg := range d.RealPairs {
			fmt.Fprintf(b, "  s = -+%.6g (normalised)\n", sg)
		}
	}
	if p := r.Space.Placement; p != nil {
		fmt.Fprintf(b, "\nZero placement (--place-zeros): N = %d with %d zeros meets every rejection band\n", p.Order, len(p.Zeros))
		fmt.Fprintf(b, "  least margin over the rejection bands %s dB (lossless), %d mask evaluations", dbText(p.Margin), p.Evaluations)
		if p.Symmetric {
			fmt.Fprintf(b, "; symmetric mask: mirrored pairs")
		}
		fmt.Fprintf(b, "\n")
	}
	if len(r.Space.TripletZeros) > 0 {
		fmt.Fprintf(b, "\nTriplets and the zero each realises\n")
		t := cmdutil.NewTable(b, "  triplet", "zero", "Omega")
		for i, a := range d.Topology.Blocks {
			z := r.Space.TripletZeros[i]
			t.Row(fmt.Sprintf("  %d-%d-%d", a, a+1, a+2), ff(bandpass.BandpassFrequency(z, s.F0, s.BW)), fmt.Sprintf("%+.6f", z))
		}
		_ = t.Flush()
	}
	if r.Opts.Space.Matrix != nil {
		fmt.Fprintf(b, "\nMatrix from %s: its real transmission zeros are listed above\n", r.Opts.Space.MatrixPath)
	}
}

// PlacementOut is the JSON form of a zero placement.
type PlacementOut struct {
	Order     int       `json:"order"`
	Zeros     []float64 `json:"zeros_normalised"`
	MarginDB  float64   `json:"margin_db"`
	Symmetric bool      `json:"symmetric_mask"`
}

// spaceJSON fills the JSON fields of this part.
func (r *Result) spaceJSON(o *Output) {
	d := r.Design
	o.Topology = d.Topology.Name
	if o.Topology == "" {
		o.Topology = "folded"
	}
	o.RealPairs = append([]float64{}, d.RealPairs...)
	o.TripletZeros = append([]float64{}, r.Space.TripletZeros...)
	if p := r.Space.Placement; p != nil {
		o.Placement = &PlacementOut{Order: p.Order, Zeros: p.Zeros, MarginDB: p.Margin, Symmetric: p.Symmetric}
	}
	if r.Opts.Space.Matrix != nil {
		path := r.Opts.Space.MatrixPath
		o.MatrixFile = &path
	}
}

// matrixTitle names the coupling matrix's form for the table.
func matrixTitle(d *bandpass.Design) string {
	return d.Topology.Description()
}
