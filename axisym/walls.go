package axisym

import (
	"fmt"
	"math"

	"cylcav/physics"
	"cylcav/qfactor"
)

// Walls gives the metal of every kind of surface of a Body. Set is the
// wall set of package qfactor (the project's one description of cavity
// walls): Set.Side covers the side walls, Set.EndA and Set.EndB the end
// plates (unused at an open end, which has no plate). Steps and Inner,
// when not nil, give the step faces and the inner conductors their own
// surface; nil means the side-wall surface.
type Walls struct {
	Set          qfactor.WallSet
	Steps, Inner *qfactor.Surface
}

// Surface returns the surface of the given kind of part.
func (w Walls) Surface(k PartKind) qfactor.Surface {
	switch k {
	case EndA:
		return w.Set.EndA
	case EndB:
		return w.Set.EndB
	case Step:
		if w.Steps != nil {
			return *w.Steps
		}
	case Inner:
		if w.Inner != nil {
			return *w.Inner
		}
	}
	return w.Set.Side
}

// PartQ is one metal surface's share of a resonance's wall loss.
type PartQ struct {
	Part Part
	// Rs is the part's surface resistance at the resonance (ohm), G its
	// geometry factor (ohm) and Q = G / Rs its own Q (+Inf for a part that
	// carries no current or has no loss).
	Rs, G, Q float64
}

// Unloaded is the unloaded Q of a resonance with its breakdown.
type Unloaded struct {
	// Q0 is the unloaded Q: 1/Q0 = 1/QWall + 1/QFill.
	Q0 float64
	// QWall is the Q of all wall losses, QFill that of the fills' loss
	// tangents (+Inf without fill loss).
	QWall, QFill float64
	// Parts lists every metal surface in the order of Loss.Factors.
	Parts []PartQ
	// Warnings are the surface models' notes (qfactor.Surface.Resistance).
	Warnings []string
	// Media lists every region filled with something other than vacuum
	// (a section's fill, or one layer of a layered section) with its
	// filling factors and its own Q.
	Media []MediumQ
}

// MediumQ is one filled region's share of a resonance's stored energy
// and of its fill loss.
type MediumQ struct {
	// Section counts from 1; Layer counts the layers of a layered section
	// from 1 (innermost first) and is 0 for a homogeneous section's fill.
	Section, Layer int
	Medium         physics.Medium
	// FillE and FillM are the region's electric and magnetic filling
	// factors (its shares of W_e and W_m).
	FillE, FillM float64
	// Q = 1/(tan delta FillE + tan delta_m FillM), the Q of the region's
	// loss alone (+Inf without loss tangents); 1/QFill is the sum of 1/Q
	// over Media.
	Q float64
}

// Unloaded returns the unloaded Q of the resonance of body b described by
// l, with the walls w: each part's surface resistance at the resonant
// frequency (qfactor.Surface.Resistance) over its geometry factor, plus
// each section's (or layer's) loss tangents weighted by its filling
// factors (Loss.Q0), with each filled region's share (Media).
// This is the one assembly of Q0 from a Loss that the commands use.
func (l Loss) Unloaded(b Body, w Walls) (Unloaded, error) {
	if len(l.FillE) != len(b.Sections) {
		return Unloaded{}, fmt.Errorf("axisym: the loss is of a body of %d sections, not of this one (%d)", len(l.FillE), len(b.Sections))
	}
	rs := map[PartKind]float64{}
	var u Unloaded
	seen := map[string]bool{}
	for _, k := range []PartKind{Side, Inner, EndA, EndB, Step} {
		r, warns, err := w.Surface(k).Resistance(l.Frequency)
		if err != nil {
			return Unloaded{}, fmt.Errorf("axisym: %v surface: %w", k, err)
		}
		rs[k] = r
		for _, m := range warns {
			if !seen[m] {
				seen[m] = true
				u.Warnings = append(u.Warnings, m)
			}
		}
	}
	fills := make([]physics.Medium, len(b.Sections))
	for i, s := range b.Sections {
		fills[i] = s.Fill
	}
	q0, iw, ifl := l.Q0(func(p Part) float64 { return rs[p.Kind] }, fills)
	u.Q0, u.QWall, u.QFill = q0, 1/iw, 1/ifl
	media := func(sec, layer int, m physics.Medium, fe, fm float64) {
		if m.Eps() == 1 && m.Mu() == 1 && m.TanDelta == 0 && m.TanDeltaM == 0 {
			return
		}
		u.Media = append(u.Media, MediumQ{Section: sec, Layer: layer, Medium: m, FillE: fe, FillM: fm,
			Q: 1 / (m.TanDelta*fe + m.TanDeltaM*fm)})
	}
	for i, s := range b.Sections {
		if i < len(l.Layers) && l.Layers[i] != nil {
			for k, y := range l.Layers[i] {
				media(i+1, k+1, y.Medium, y.FillE, y.FillM)
			}
			continue
		}
		media(i+1, 0, s.Fill, l.FillE[i], l.FillM[i])
	}
	for _, f := range l.Factors {
		r := rs[f.Part.Kind]
		q := math.Inf(1)
		if r > 0 && !math.IsInf(f.G, 1) {
			q = f.G / r
		}
		u.Parts = append(u.Parts, PartQ{Part: f.Part, Rs: r, G: f.G, Q: q})
	}
	return u, nil
}
