package axisym

import (
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics"
)

// layerState holds what the junction model needs for its layered sections:
// their mode sets, recomputed at every frequency (their cutoffs move with
// it), and the fixed pieces of the homogeneous sections next to them.
type layerState struct {
	guides []*layeredGuide // per section; nil for a homogeneous one
	homog  [][][]piece     // per section: homogeneous modes as pieces (nil if unused)
	any    bool
}

// initLayers prepares the layered sections of b (guides are the
// homogeneous guides newSystem built, used for their cross-sections and
// for the homogeneous neighbours' modes).
func (s *system) initLayers(b Body, guides []guide) {
	ls := &s.layers
	ls.guides = make([]*layeredGuide, len(b.Sections))
	ls.homog = make([][][]piece, len(b.Sections))
	for i, sec := range b.Sections {
		if len(sec.Layers) == 0 {
			continue
		}
		ls.any = true
		n := len(s.lines[i].kc)
		ls.guides[i] = newLayeredGuide(s.fam, sec, n)
		ls.guides[i].onlyProp = len(b.Sections) == 1
		// The layered normalisation makes the modal admittances those of
		// lineSusceptance with eps = mu = 1 (see layeredGuide).
		s.lines[i].eps, s.lines[i].mu = 1, 1
		s.lines[i].beta2 = make([]float64, n)
		for _, k := range []int{i - 1, i + 1} {
			if k < 0 || k >= len(b.Sections) || len(b.Sections[k].Layers) > 0 || ls.homog[k] != nil {
				continue
			}
			g := guides[k]
			ls.homog[k] = make([][]piece, len(g.kc))
			for m := range g.kc {
				ls.homog[k][m] = homogeneousPieces(g, m)
			}
		}
	}
}

// refreshLayers computes the layered sections' modes at wavenumber k0 and
// the overlap matrices of every junction next to one.
func (s *system) refreshLayers(k0 float64) {
	ls := &s.layers
	if !ls.any {
		return
	}
	for i, lg := range ls.guides {
		if lg == nil {
			continue
		}
		lg.at(k0)
		for m := range s.lines[i].beta2 {
			if m < len(lg.modes) {
				s.lines[i].beta2[m] = lg.modes[m].beta2
			} else {
				s.lines[i].beta2[m] = math.Inf(-1) // not found: cut off
			}
		}
	}
	pieces := func(i int) [][]piece {
		if lg := ls.guides[i]; lg != nil {
			ps := make([][]piece, len(lg.modes))
			for m := range lg.modes {
				ps[m] = lg.modes[m].pieces
			}
			return ps
		}
		return ls.homog[i]
	}
	for ji := range s.joins {
		j := &s.joins[ji]
		if ls.guides[ji] == nil && ls.guides[ji+1] == nil {
			continue
		}
		if j.left == nil { // the left section's modes are the unknowns
			ap := apertureOf(ls, s, ji)
			j.right = overlap(pieces(ji+1), pieces(ji), ap[0], ap[1])
		} else {
			ap := apertureOf(ls, s, ji+1)
			j.left = overlap(pieces(ji), pieces(ji+1), ap[0], ap[1])
		}
	}
}

// apertureOf returns the cross-section (inner, outer) of section i, read
// from its first mode's pieces.
func apertureOf(ls *layerState, s *system, i int) [2]float64 {
	var ps []piece
	if lg := ls.guides[i]; lg != nil {
		return [2]float64{lg.inner, lg.outer}
	}
	ps = ls.homog[i][0]
	return [2]float64{ps[0].lo, ps[len(ps)-1].hi}
}

// FieldsAvailable reports whether Solve computes the fields of b's
// resonances, and with them Loss (Q0 and its breakdown, filling factors,
// accelerator figures) and field maps: nil, or an error wrapping
// ErrNotImplemented that says why not. Every body that Validate accepts
// has its fields today (radial layers next to an open end, whose fields
// are not computed, are refused by Validate itself); commands still ask it
// before accepting a flag that needs fields.
func (b Body) FieldsAvailable() error {
	if b.Open() {
		for i, s := range b.Sections {
			if len(s.Layers) > 0 {
				return fmt.Errorf("axisym: section %d: fields of radial layers in a body with an open end: %w", i+1, ErrNotImplemented)
			}
		}
	}
	return nil
}

// layeredPropagating returns the number of modes of family fam that
// propagate in the layered section s at fmax.
func layeredPropagating(fam cavity.Family, s Section, fmax float64) int {
	lg := newLayeredGuide(fam, s, 1)
	return lg.propagating(2 * math.Pi * fmax / physics.SpeedOfLight)
}
