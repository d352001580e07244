package qfactor

import (
	"fmt"
	"math"

	"cylcav/cavity"
)

// Part is one part of a cavity wall: the side wall or one of the two end
// plates.
type Part int

const (
	SideWall  Part = iota // the cylindrical side wall, r = a
	EndPlateA             // end plate A, z = 0
	EndPlateB             // end plate B, z = d
)

// Parts lists the wall parts in the order side wall, end plate A, end
// plate B, the order of every table.
func Parts() [3]Part { return [3]Part{SideWall, EndPlateA, EndPlateB} }

// String returns the part's name for people, as printed in tables:
// "side wall (r = a)", "end plate A (z = 0)" or "end plate B (z = d)".
func (p Part) String() string {
	switch p {
	case SideWall:
		return "side wall (r = a)"
	case EndPlateA:
		return "end plate A (z = 0)"
	case EndPlateB:
		return "end plate B (z = d)"
	}
	return fmt.Sprintf("Part(%d)", int(p))
}

// Limits of a Surface accepted by WallSet.Validate. They reject typing
// slips, not physics: the wall temperature runs up to a glowing cavity,
// the roughness up to a coarse cast surface, the plating up to a thick
// electroformed layer, and the residual resistance far above that of any
// superconducting surface.
const (
	MaxWallTemperature  = 2000.0 // K
	MaxRoughness        = 1e-3   // m, RMS
	MaxPlatingThickness = 0.1    // m
	MaxResidual         = 1.0    // ohm
)

// WallSet is the metal surfaces of a closed cylindrical cavity: its side
// wall and its two end plates, each a Surface with its own metal,
// roughness, plating, temperature and superconducting state. It is the
// single description of a cavity's walls that every package and command
// uses.
type WallSet struct {
	Side, EndA, EndB Surface
}

// SameWalls returns the WallSet whose three parts are all s.
func SameWalls(s Surface) WallSet { return WallSet{Side: s, EndA: s, EndB: s} }

// Surface returns the surface of part p. It panics for an unknown part.
func (w WallSet) Surface(p Part) Surface {
	switch p {
	case SideWall:
		return w.Side
	case EndPlateA:
		return w.EndA
	case EndPlateB:
		return w.EndB
	}
	panic(fmt.Sprintf("qfactor: unknown wall part %d", int(p)))
}

// Setting names the setting of a Surface that a WallError is about, so
// that a caller can point at the input that set it.
type Setting int

const (
	SettingMetal            Setting = iota // the wall metal (Surface.Conductor)
	SettingTemperature                     // Surface.Temperature
	SettingRoughness                       // Surface.Roughness
	SettingPlating                         // Surface.Plating (its metal, or plating with a superconductor)
	SettingPlatingThickness                // Surface.Plating.Thickness
	SettingResidual                        // Surface.Superconductor.Residual
)

// WallError is a validation error of one setting of one wall part.
type WallError struct {
	Part    Part
	Setting Setting
	Err     error
}

func (e *WallError) Error() string { return fmt.Sprintf("%s: %v", e.Part, e.Err) }

// Unwrap returns the underlying error.
func (e *WallError) Unwrap() error { return e.Err }

// Validate reports whether every part of w is a surface the models of this
// package hold for, checking the parts in the order of Parts. The first
// problem is returned as a *WallError naming the part and the setting.
// The rules, for each part:
//
//   - Temperature is 0 (meaning 20 C) or in (0, MaxWallTemperature] K;
//     Roughness in [0, MaxRoughness]; a Plating thickness in
//     [0, MaxPlatingThickness].
//   - A superconducting part (Superconductor not nil) is niobium (the BCS
//     parameters are niobium's), is not plated, has a temperature given in
//     (0, Tc/2] (the range of the BCS approximation) and a residual
//     resistance in [0, MaxResidual].
//   - A normal part has a conductivity at its temperature by the linear
//     resistivity model (Conductivity: the temperature within the metal's
//     range and its coefficient known), and so has its plating metal.
func (w WallSet) Validate() error {
	for _, p := range Parts() {
		if set, err := w.Surface(p).validate(); err != nil {
			return &WallError{Part: p, Setting: set, Err: err}
		}
	}
	return nil
}

// validate checks one surface for WallSet.Validate.
func (s Surface) validate() (Setting, error) {
	if t := s.Temperature; !(t >= 0 && t <= MaxWallTemperature) {
		return SettingTemperature, fmt.Errorf("wall temperature must be above 0 K and at most %g K, got %g K", MaxWallTemperature, t)
	}
	if r := s.Roughness; !(r >= 0 && r <= MaxRoughness) {
		return SettingRoughness, fmt.Errorf("RMS roughness must be between 0 and %g m, got %g m", MaxRoughness, r)
	}
	if p := s.Plating; p != nil && !(p.Thickness >= 0 && p.Thickness <= MaxPlatingThickness) {
		return SettingPlatingThickness, fmt.Errorf("plating thickness must be between 0 and %g m, got %g m", MaxPlatingThickness, p.Thickness)
	}
	if b := s.Superconductor; b != nil {
		if s.Plating != nil {
			return SettingPlating, fmt.Errorf("a plated superconducting surface is not modelled; for bulk or thick-film niobium give no plating")
		}
		if s.Temperature == 0 {
			return SettingTemperature, fmt.Errorf("a superconducting surface needs its temperature, e.g. 2 K")
		}
		if !(s.Temperature <= b.Tc/2) {
			return SettingTemperature, fmt.Errorf("the BCS model of superconducting niobium holds from 0 K to Tc/2 = %g K", b.Tc/2)
		}
		if !(b.Residual >= 0 && b.Residual <= MaxResidual) {
			return SettingResidual, fmt.Errorf("residual resistance must be between 0 and %g ohm, got %g ohm", MaxResidual, b.Residual)
		}
		if s.Conductor.Name != "niobium" {
			return SettingMetal, fmt.Errorf("the superconducting model holds for niobium walls only; this wall part is %s", s.Conductor.Name)
		}
		return 0, nil
	}
	if _, err := Conductivity(s.Conductor, s.Temperature); err != nil {
		return SettingTemperature, err
	}
	if p := s.Plating; p != nil {
		if _, err := Conductivity(p.Metal, s.Temperature); err != nil {
			return SettingPlating, err
		}
	}
	return 0, nil
}

// Resistances returns the surface resistance of each part at frequency f
// (Hz), by Surface.Resistance, with the warnings of the surface models in
// part order (a warning names its metal, not the part). An error names the
// part.
func (w WallSet) Resistances(f float64) (SurfaceResistances, []string, error) {
	var v [3]float64
	var warns []string
	for i, p := range Parts() {
		rs, ws, err := w.Surface(p).Resistance(f)
		if err != nil {
			return SurfaceResistances{}, nil, fmt.Errorf("%s: %w", p, err)
		}
		v[i] = rs
		warns = append(warns, ws...)
	}
	return SurfaceResistances{Side: v[0], EndA: v[1], EndB: v[2]}, warns, nil
}

// At returns the surface resistances of w as a ResistancesAt, for UnloadedQ and
// UnloadedQAll. Each distinct warning of the surface models goes to warn
// once, in the order met; warn may be nil to drop them.
func (w WallSet) At(warn func(string)) ResistancesAt {
	seen := map[string]bool{}
	return func(f float64) (SurfaceResistances, error) {
		rs, warns, err := w.Resistances(f)
		if err != nil {
			return SurfaceResistances{}, err
		}
		for _, x := range warns {
			if !seen[x] && warn != nil {
				seen[x] = true
				warn(x)
			}
		}
		return rs, nil
	}
}

// Q0Constraint returns the unloaded-Q function of mode m for walls w, in
// the shape cavity.DesignSpec.Q takes: for a cavity it returns UnloadedQ's
// Q0, wall loss from w at the mode's frequency and fill loss from the
// cavity's fill. Warnings of the surface models are dropped (the caller
// gets them once from w.Resistances at the design frequency).
func Q0Constraint(m cavity.Mode, w WallSet) func(cavity.Cavity) (float64, error) {
	rs := w.At(nil)
	return func(c cavity.Cavity) (float64, error) {
		u, err := UnloadedQ(c, m, rs)
		return u.Q0, err
	}
}

// SkinDepths returns the classical skin depth of each part at frequency f,
// in part order, NaN where it is not defined (a superconducting part) or
// cannot be computed.
func (w WallSet) SkinDepths(f float64) [3]float64 {
	var d [3]float64
	for i, p := range Parts() {
		d[i] = math.NaN()
		if s := w.Surface(p); s.Superconductor == nil {
			if v, err := s.SkinDepth(f); err == nil {
				d[i] = v
			}
		}
	}
	return d
}
