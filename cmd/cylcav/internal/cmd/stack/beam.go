package stack

import (
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"cylcav/axisym"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/physics"
	"cylcav/qfactor"
)

// BeamOptions are the beam-harmonic flags of `cylcav stack`: Bunch is the
// bunch repetition frequency (Hz, 0: none) and Window the half-width of the
// band flagged around each harmonic (fraction; 0: the default).
type BeamOptions struct {
	Bunch, Window float64
}

// HarmonicRow is a resonance's nearest beam harmonic (qfactor.BeamHarmonic).
type HarmonicRow struct {
	Harmonic int     `json:"beam_harmonic"`
	OffsetHz float64 `json:"harmonic_offset_hz"`
	// Near is the proximity verdict of qfactor.BeamHarmonic for any
	// family; the table flags only TM0 resonances NEAR (a TE0 one has no
	// E_z for the beam to drive).
	Near bool `json:"near_harmonic"`
	// Drivable is Near for a TM0 or an order n >= 1 resonance (the
	// table's NEAR); a TE0 one is never drivable.
	Drivable bool `json:"beam_drivable"`
}

// dipoleNote says what the stacked-body solver gives and does not give an
// accelerator user about dipoles: printed (and in JSON) with --beta or
// --bunch-freq, so that the missing transverse R/Q is stated, not silent.
const dipoleNote = "dipole (n = 1) modes of a closed body of circular sections are listed with --order 1 (frequencies and labels), " +
	"but their transverse R/Q is not computed for stacked bodies; use 'cylcav design --hom-max' for the closed pillbox or a 3-D field solver"

// addBeamFlags registers --bunch-freq and --harmonic-window.
func addBeamFlags(cmd *cobra.Command, b *BeamOptions) {
	fl := cmd.Flags()
	cmdutil.FrequencyVar(fl, &b.Bunch, "bunch-freq", "bunch repetition frequency: give every resonance its nearest beam harmonic and flag those near one, e.g. 650MHz", cmdutil.MinFrequency, cmdutil.MaxFrequency)
	cmdutil.FractionVar(fl, &b.Window, "harmonic-window", "half-width of the band flagged around each beam harmonic, e.g. 0.5% (default 0.5 %)", 1e-6, 0.1)
	cmdutil.Needs(cmd, "harmonic-window", "bunch-freq")
}

// harmonicRow returns the nearest beam harmonic of resonance r, whose
// family column is family: a TE0 resonance (E_phi only, no E_z anywhere)
// cannot be driven by the beam; a TM0 one can, and so can one of order
// n >= 1 (a dipole: its transverse R/Q is not computed, so it is not
// ruled out).
func harmonicRow(b BeamOptions, r axisym.Resonance, family string) (*HarmonicRow, error) {
	h, off, near, err := qfactor.BeamHarmonic(r.Frequency, b.Bunch, b.Window)
	if err != nil {
		return nil, err
	}
	return &HarmonicRow{Harmonic: h, OffsetHz: off, Near: near, Drivable: near && family != "TE0"}, nil
}

// harmonicText is the table cell of a resonance's beam harmonic: NEAR for
// a resonance the beam can drive (HarmonicRow.Drivable); a TE0 one (E_phi
// only) reads "(near, R/Q 0)" whatever its frequency.
func harmonicText(r *HarmonicRow, bunch float64) string {
	if r == nil {
		return "-"
	}
	s := fmt.Sprintf("%d x %s, %s", r.Harmonic, cmdutil.TrimZeros(physics.FormatFrequency(bunch, 6)), signedHz(r.OffsetHz))
	switch {
	case r.Drivable:
		s = "NEAR " + s
	case r.Near:
		s += " (near, R/Q 0)" // a TE0 resonance, as design's mode table words it
	}
	return s
}

func signedHz(x float64) string {
	if x >= 0 {
		return "+" + physics.FormatFrequency(x, 4)
	}
	return "-" + physics.FormatFrequency(-x, 4)
}

// writeBeamNote explains the harmonic column and states what is known of dipoles.
func writeBeamNote(w io.Writer, b BeamOptions) {
	if b.Bunch > 0 {
		win := b.Window
		if win == 0 {
			win = qfactor.DefaultHarmonicWindow
		}
		which := "--harmonic-window"
		if b.Window == 0 {
			which = "our default window, not a standard"
		}
		fmt.Fprintf(w, "beam harmonic: nearest harmonic of the %s bunch frequency; NEAR within %.3g %% of the resonance frequency\n",
			cmdutil.TrimZeros(physics.FormatFrequency(b.Bunch, 6)), 100*win)
		fmt.Fprintf(w, "(%s); a NEAR TM0 resonance with R/Q, or a NEAR dipole, can be driven by the beam: damp or move it; a TE0 resonance has\n", which)
		fmt.Fprintln(w, "no E_z anywhere, so a beam along the axis does not drive it: near a harmonic it reads (near, R/Q 0), never NEAR")
	}
	fmt.Fprintln(w, "note: "+dipoleNote)
}

// harmonicHeader and harmonicCells are the CSV columns of the beam harmonic.
var harmonicHeader = []string{"beam_harmonic", "harmonic_offset_hz", "near_harmonic", "beam_drivable"}

func harmonicCells(r *HarmonicRow) []string {
	if r == nil {
		return []string{"", "", "", ""}
	}
	return []string{fmt.Sprint(r.Harmonic), fmt.Sprint(r.OffsetHz), fmt.Sprint(r.Near), fmt.Sprint(r.Drivable)}
}

// dipolesJSON is the JSON statement on dipoles, given with the accelerator
// flags.
func dipolesJSON(opts *Options) string {
	if opts.Beta > 0 || opts.Beam.Bunch > 0 {
		return dipoleNote
	}
	return ""
}
