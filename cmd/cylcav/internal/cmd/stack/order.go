package stack

import (
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"cylcav/axisym"
	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
)

// maxOrder is the largest azimuthal order --order accepts: the Bessel-root
// core's order limit.
const maxOrder = cavity.MaxIndex

// hybridFamily is the family column of a resonance of order n >= 1, where
// TE_n and TM_n couple at every step (axisym, hybrid.go): the resonance
// belongs to neither alone; its label names the closed-cylinder mode it
// continues from.
const hybridFamily = "hybrid"

// orderRefused are the flags that need losses or fields, which the solver
// does not compute for n >= 1, and the flags that assume separate families.
var orderRefused = []string{"wall", "end-wall", "end-wall-a", "end-wall-b", "roughness", "roughness-model", "temperature",
	"plating", "plating-thickness", "superconducting", "residual", "beta", "field-map", "map", "bulb-diameter", "bulb-length", "bulb-centre", "pair"}

// checkOrder refuses, with --order >= 1, every flag whose figure is not
// computed for n >= 1 (one line, exit 2), and --family te or tm.
func checkOrder(cmd *cobra.Command, order int) error {
	if order == 0 {
		return nil
	}
	for _, f := range orderRefused {
		if fl := cmd.Flags().Lookup(f); fl != nil && fl.Changed {
			return cmdutil.Usagef("--%s is not available with --order %d: losses, fields and accelerator figures are computed for n = 0 only (drop --%s or use --order 0)", f, order, f)
		}
	}
	if fl := cmd.Flags().Lookup("family"); fl != nil && fl.Changed && fl.Value.String() != "both" {
		return cmdutil.Usagef("--family %s is not available with --order %d: TE%d and TM%d couple at every step and are solved together (drop --family)", fl.Value.String(), order, order, order)
	}
	return nil
}

// familiesFor is the Families field of the request: nil (both, coupled)
// for n >= 1.
func familiesFor(opts *Options) []cavity.Family {
	if opts.Order > 0 {
		return nil
	}
	return opts.Families
}

// familyText is the family column: TE0 or TM0 for n = 0, hybridFamily
// otherwise.
func familyText(order int, fam cavity.Family) string {
	if order > 0 {
		return hybridFamily
	}
	return fam.String() + "0"
}

// writeOrderNote explains the listing of order n >= 1.
func writeOrderNote(w io.Writer, opts *Options) {
	n := opts.Order
	fmt.Fprintf(w, "n = %d: TE%d and TM%d waveguide modes coupled at every step (family %q); k counts the order-%d resonances;\n", n, n, n, hybridFamily, n)
	fmt.Fprintf(w, "each has two polarisations (cos and sin %d phi) at the same frequency; Q0, fields and transverse R/Q not computed\n", n)
	if opts.Geometry.Walls != nil {
		fmt.Fprintf(w, "walls of %s: not used (no losses for n >= 1)\n", opts.File)
	}
}

// addOrderExtrapolation fills the extrapolation columns of rows for
// --order >= 1 (axisym.ExtrapolateOrder), matched by place in the list.
func addOrderExtrapolation(opts *Options, res []axisym.Resonance, rows []Row) error {
	ex, err := axisym.ExtrapolateOrder(opts.Geometry.Body, opts.Order, opts.FMax, opts.Modes)
	if err != nil {
		return err
	}
	for i, r := range res {
		setExtrapolation(&rows[i], r, ex)
	}
	return nil
}
