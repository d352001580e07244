package cmdutil

import (
	"fmt"
	"math"
	"strings"

	"github.com/spf13/pflag"

	"cylcav/cavity"
	"cylcav/physics"
)

// Neighbour is the JSON form of a neighbouring mode.
type Neighbour struct {
	Mode      string  `json:"mode"`
	FHz       float64 `json:"f_hz"`
	OffsetHz  float64 `json:"offset_hz"`
	OffsetPct float64 `json:"offset_pct"`
}

// NeighbourJSON converts a neighbour (nil stays nil).
func NeighbourJSON(nb *cavity.Neighbour) *Neighbour {
	if nb == nil {
		return nil
	}
	return &Neighbour{Mode: nb.Mode.String(), FHz: nb.Frequency, OffsetHz: nb.Offset, OffsetPct: 100 * nb.Relative}
}

// DegenerateJSON lists the companion labels (never null).
func DegenerateJSON(ms []cavity.Mode) []string {
	out := []string{}
	for _, m := range ms {
		out = append(out, m.String())
	}
	return out
}

// FormatNeighbours returns the lines for the nearest modes, the
// spurious-free window and the companion, as `cylcav clearance` and
// `cylcav design` print them.
func FormatNeighbours(cl cavity.Clearance) string {
	var b strings.Builder
	line := func(label string, nb *cavity.Neighbour) {
		if nb == nil {
			fmt.Fprintf(&b, "  %s: none\n", label)
			return
		}
		fmt.Fprintf(&b, "  %s: %s at %s (%s, %+.3f %%)\n", label, nb.Mode, physics.FormatFrequency(nb.Frequency, 7),
			signed(physics.FormatFrequency(math.Abs(nb.Offset), 5), nb.Offset), 100*nb.Relative)
	}
	line("nearest below", cl.Below)
	line("nearest above", cl.Above)
	lo := "0 Hz"
	if cl.Below != nil {
		lo = physics.FormatFrequency(cl.FreeLow, 7)
	}
	fmt.Fprintf(&b, "  spurious-free window: %s .. %s\n", lo, physics.FormatFrequency(cl.FreeHigh, 7))
	for _, m := range cl.Degenerate {
		fmt.Fprintf(&b, "  degenerate companion: %s (same frequency in every cylinder; suppress it with a mode trap or a plunger gap)\n", m)
	}
	return b.String()
}

func signed(s string, v float64) string {
	if v < 0 {
		return "-" + s
	}
	return "+" + s
}

// Window is a flag value holding the window of a clearance listing: a
// percentage of the wanted frequency (10%, or the fraction 0.1) or a
// frequency (anything ending in Hz, 500MHz), stored in a
// cavity.ClearanceOptions. A frequency's upper limit depends on the wanted
// frequency and is checked by the command.
type Window struct {
	o    *cavity.ClearanceOptions
	text string
}

func (w *Window) String() string { return w.text }
func (w *Window) Type() string   { return "percent|frequency" }

// Set parses s as a frequency when it ends in Hz, else as a percentage.
func (w *Window) Set(s string) error {
	const want = "want a percentage such as 10% or a frequency such as 500MHz"
	if strings.HasSuffix(strings.ToLower(strings.TrimSpace(s)), "hz") {
		v, err := FrequencyOf(s)
		if err != nil {
			return ValueErrorf("%s: %v", want, err)
		}
		if !(v >= 0) {
			return ValueErrorf("must be between 0 Hz and %g times the wanted frequency", cavity.MaxWindow)
		}
		w.o.Window, w.o.WindowHz, w.text = 0, v, s
		return nil
	}
	v, err := physics.ParseFraction(s)
	if err != nil {
		return ValueErrorf("%s: %v", want, err)
	}
	if !(v >= 0 && v <= cavity.MaxWindow) {
		return ValueErrorf("must be between 0%% and %g%%", 100*cavity.MaxWindow)
	}
	w.o.Window, w.o.WindowHz, w.text = v, 0, s
	return nil
}

// WindowVar defines a clearance window flag stored in o, with the default
// def (as given).
func WindowVar(fs *pflag.FlagSet, o *cavity.ClearanceOptions, name, def, usage string) *Window {
	w := &Window{o: o}
	fs.Var(w, name, usage)
	SetDefault(fs, name, def)
	return w
}
