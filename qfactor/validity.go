package qfactor

import (
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics"
)

// Check is one way the loss models of this package can stop holding for a
// particular cavity, mode and wall set.
type Check int

const (
	// ThickSkin: the skin depth of a wall is not small against the cavity.
	ThickSkin Check = iota + 1
	// LowQ: Q0 is not much greater than 1.
	LowQ
	// MagneticWall: a wall metal has a relative permeability other than 1.
	MagneticWall
)

// Limits of the validity checks.
//
// The surface-resistance perturbation behind WallQ takes the fields of the
// lossless cavity and neglects terms of relative order delta/l (the field
// penetrating a wall adds stored energy in a layer of depth delta and moves
// the effective wall by about delta; l is the smallest cavity dimension)
// and of relative order 1/Q (the resonance is shifted and the fields are
// changed by the loss); the fill's loss is first order in tan delta, that
// is also in 1/Q_fill (Harrington 1961, ch. 5; Pozar 2012, sec. 6.3-6.4,
// where each formula is derived under Q >> 1 and delta << a, d). We warn
// where those neglected terms can exceed 1 % (our choice: the percent
// level is where the printed Q0 starts to carry an error of its own, next
// to the 10 % of the roughness models and the real surface's 10-30 %).
const (
	// MaxSkinRatio is the largest skin depth, as a fraction of the smaller
	// of the radius and the length, without a ThickSkin warning.
	MaxSkinRatio = 0.01
	// MinValidQ is the smallest Q0 without a LowQ warning.
	MinValidQ = 100.0
)

// Warning is a finding of Validity: which check failed and a sentence for
// people.
type Warning struct {
	Check Check
	Text  string
}

// Validity returns the warnings that apply to the unloaded-Q result u of
// cavity c with walls w (as from UnloadedQ with w.At), in the order
// ThickSkin, LowQ, MagneticWall; nil when the models hold. It is the one
// place these verdicts are made; every command that prints Q0 prints them.
// A zero WallSet stands for perfectly conducting walls (no wall checks).
//
//   - ThickSkin: the largest classical skin depth of the wall parts (the
//     exposed metal; superconducting parts have none) at the mode's
//     frequency exceeds MaxSkinRatio times min(radius, length).
//   - LowQ: Q0 < MinValidQ.
//   - MagneticWall: a wall metal (or a plating, or a base metal under a
//     plating) has mu_r != 1. Rs grows as sqrt(mu_r) (Pozar 2012, sec.
//     1.7), but the permeability that a magnetic metal shows at microwave
//     frequencies is not its low-frequency value (it falls toward 1 above
//     ferromagnetic resonance and depends on the magnetisation), so Q_wall
//     is uncertain by up to a factor sqrt(mu_r).
func Validity(c cavity.Cavity, w WallSet, u Unloaded) []Warning {
	var out []Warning
	f := u.Wall.Frequency
	l := math.Min(c.Radius, c.Length)
	worst, part := 0.0, SideWall
	for i, d := range w.SkinDepths(f) {
		if d > worst {
			worst, part = d, Parts()[i]
		}
	}
	if worst > MaxSkinRatio*l {
		out = append(out, Warning{ThickSkin, fmt.Sprintf(
			"the skin depth of the %s, %s at %s, is %.3g %% of the smallest cavity dimension (%s), above the %g %% to which the surface-resistance model holds; Q0 is approximate",
			part, physics.FormatLength(worst, 3), physics.FormatFrequency(f, 4), 100*worst/l, physics.FormatLength(l, 3), 100*MaxSkinRatio)})
	}
	if u.Q0 < MinValidQ {
		out = append(out, Warning{LowQ, fmt.Sprintf(
			"Q0 = %.3g is not much greater than 1: the loss models are first order in 1/Q and hold for Q0 >= %g; the printed Q0 is an estimate",
			u.Q0, MinValidQ)})
	}
	seen := map[string]bool{}
	for _, p := range Parts() {
		s := w.Surface(p)
		metals := []physics.Conductor{s.Conductor}
		if s.Plating != nil {
			metals = append(metals, s.Plating.Metal)
		}
		for _, m := range metals {
			key := fmt.Sprint(m.Name, m.Mu())
			if mu := m.Mu(); mu != 1 && s.Superconductor == nil && !seen[key] {
				seen[key] = true
				name := "the wall metal " + m.Name
				if m.Name == "" || m.Name == "user" {
					name = "the wall metal given by its values"
				}
				out = append(out, Warning{MagneticWall, fmt.Sprintf(
					"%s has mu_r = %g: its microwave permeability is uncertain (it falls toward 1 above ferromagnetic resonance), so Q_wall may be off by up to a factor sqrt(mu_r) = %.3g",
					name, mu, math.Sqrt(mu))})
			}
		}
	}
	return out
}

// Condensed is one check of Condense: its first warning, the index of the
// result that raised it first, and how many results raised it.
type Condensed struct {
	Warning
	First, Count int
}

// Condense condenses the Validity warnings of several results (the modes
// of one cavity, or the cavities of a filter), given in the caller's
// order: one Condensed for each check that any result raised, in check
// order.
func Condense(lists [][]Warning) []Condensed {
	var out []Condensed
	for _, c := range []Check{ThickSkin, LowQ, MagneticWall} {
		cd := Condensed{First: -1}
		for i, ws := range lists {
			for _, x := range ws {
				if x.Check == c {
					if cd.Count == 0 {
						cd.Warning, cd.First = x, i
					}
					cd.Count++
					break
				}
			}
		}
		if cd.Count > 0 {
			out = append(out, cd)
		}
	}
	return out
}

// Text returns the warning's text, followed by "(and N more of the
// <what>)" when more results than the first raised it.
func (c Condensed) Text(what string) string {
	if c.Count > 1 {
		return fmt.Sprintf("%s (and %d more of the %s)", c.Warning.Text, c.Count-1, what)
	}
	return c.Warning.Text
}
