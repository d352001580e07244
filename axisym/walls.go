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
}

// Unloaded returns the unloaded Q of the resonance of body b described by
// l, with the walls w: each part's surface resistance at the resonant
// frequency (qfactor.Surface.Resistance) over its geometry factor, plus
// each section's loss tangents weighted by its filling factors (Loss.Q0).
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
