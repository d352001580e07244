package axisym

import (
	"fmt"

	"cylcav/cavity"
	"cylcav/physics"
)

// Section is one coaxial cylindrical piece of a Body: a length along z, an
// outer radius, an optional inner-conductor radius and the medium that fills
// it. Values are SI (metres).
type Section struct {
	// Length is the extent of the section along z.
	Length float64
	// Radius is the outer (metal wall) radius.
	Radius float64
	// InnerRadius is the radius of a coaxial inner conductor; zero means a
	// circular section with no inner conductor. A junction between two
	// coaxial sections where neither cross-section lies inside the other
	// is refused by Solve (ErrNotImplemented).
	InnerRadius float64
	// Fill is the homogeneous medium filling the section; the zero value is
	// vacuum. It must be left zero when Layers is set.
	Fill physics.Medium
	// Layers, when not empty, fills the section with radial layers instead
	// of Fill, innermost first, the last reaching out to Radius (see
	// Layer; layered.go).
	Layers []Layer
}

// Body is an axisymmetric cavity: sections stacked along z in order, the
// first starting at z = 0 on a metal end plate and the last ending on a
// metal end plate. Every change of radius between neighbours is a flat metal
// step face.
type Body struct {
	Sections []Section
	// EndA and EndB say how the body ends at z = 0 and at its far end: a
	// metal plate (the zero value) or a semi-infinite pipe of the end
	// section's cross-section (see End, open.go).
	EndA, EndB End
}

// MaxSections bounds the number of sections Validate accepts; it rejects
// runaway input, not any real cavity.
const MaxSections = 200

// Validate reports whether b is a body Solve can describe: at least one and
// at most MaxSections sections, each with cavity.MinSize <= Length, Radius
// <= cavity.MaxSize, InnerRadius zero or in cavity.MinSize..Radius
// (exclusive of Radius), and a valid Fill (physics.Medium.Validate). The
// error names the section (counted from 1 at z = 0), the quantity, the valid
// range and the value.
func (b Body) Validate() error {
	if len(b.Sections) == 0 {
		return fmt.Errorf("axisym: a body needs at least one section")
	}
	if len(b.Sections) > MaxSections {
		return fmt.Errorf("axisym: at most %d sections, got %d", MaxSections, len(b.Sections))
	}
	for i, s := range b.Sections {
		if err := s.validate(); err != nil {
			return fmt.Errorf("axisym: section %d: %w", i+1, err)
		}
	}
	return b.validateEnds()
}

func (s Section) validate() error {
	for _, q := range []struct {
		name string
		v    float64
	}{{"length", s.Length}, {"radius", s.Radius}} {
		if !(q.v >= cavity.MinSize && q.v <= cavity.MaxSize) {
			return fmt.Errorf("%s must be in %g..%g m, got %g m", q.name, cavity.MinSize, cavity.MaxSize, q.v)
		}
	}
	if s.InnerRadius != 0 && !(s.InnerRadius >= cavity.MinSize && s.InnerRadius < s.Radius) {
		return fmt.Errorf("inner radius must be 0 (no inner conductor) or in %g m..radius %g m (exclusive), got %g m",
			cavity.MinSize, s.Radius, s.InnerRadius)
	}
	if err := s.Fill.Validate(); err != nil {
		return fmt.Errorf("fill: %w", err)
	}
	return s.validateLayers()
}

// Length returns the total length of the body along z.
func (b Body) Length() float64 {
	var l float64
	for _, s := range b.Sections {
		l += s.Length
	}
	return l
}

// MaxRadius returns the largest outer radius of the body's sections.
func (b Body) MaxRadius() float64 {
	var r float64
	for _, s := range b.Sections {
		r = max(r, s.Radius)
	}
	return r
}

// Enclosing returns the vacuum closed cylinder of the body's largest radius
// and total length, the reference from which Solve labels resonances.
func (b Body) Enclosing() cavity.Cavity {
	return cavity.Cavity{Radius: b.MaxRadius(), Length: b.Length()}
}
