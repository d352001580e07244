package cmdutil

import (
	"errors"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"cylcav/cavity"
	"cylcav/physics"
)

// Geometry describes the cavity flags of one command: which of --diameter,
// --radius, --length and --fill it has and their help texts, the default of
// --fill, and how a missing or doubled size is reported. The zero value
// registers no flag.
type Geometry struct {
	// Diameter, Radius, Length and Fill are the help texts of the flags; a
	// flag with an empty help text is not registered.
	Diameter, Radius, Length, Fill string

	// FillDefault is the default of --fill, read like a given value when
	// --fill is absent ("air"). Empty means vacuum: --fill is read only
	// when given.
	FillDefault string

	// CobraChecks has cobra require exactly one of --diameter and --radius,
	// and --length when registered, before the command runs, in cobra's
	// words. Otherwise Radius and Cavity report those with SizeErrors.
	CobraChecks bool

	// SizeErrors word the usage errors of Radius and Cavity; an empty field
	// takes the default wording (see SizeErrors).
	SizeErrors SizeErrors
}

// SizeErrors are the messages of the usage errors for a missing or doubled
// cavity size. The defaults are "give either --diameter or --radius, not
// both", "--diameter or --radius is required, e.g. --diameter 50mm" and
// "--length is required, e.g. --length 50mm".
type SizeErrors struct {
	Both, NoSize, NoLength string
}

func (e SizeErrors) both() error {
	return sizeError(e.Both, "give either --diameter or --radius, not both")
}

func (e SizeErrors) noSize() error {
	return sizeError(e.NoSize, "--diameter or --radius is required, e.g. --diameter 50mm")
}

func (e SizeErrors) noLength() error {
	return sizeError(e.NoLength, "--length is required, e.g. --length 50mm")
}

func sizeError(msg, def string) error {
	if msg == "" {
		msg = def
	}
	return &UsageError{Err: errors.New(msg)}
}

// GeometryFlags are the cavity flags registered by AddGeometryFlags. The
// sizes are typed flags (LengthVar): a bad value is refused while the
// command line is parsed. Its methods read them after parsing; every error
// is a usage error naming the flag, the value and the valid range.
type GeometryFlags struct {
	flags                    *pflag.FlagSet
	geo                      Geometry
	fill                     string
	d, r, l                  float64
	diameter, radius, length *Quantity
}

// AddGeometryFlags registers the cavity flags that g names on cmd.
func AddGeometryFlags(cmd *cobra.Command, g Geometry) *GeometryFlags {
	gf := &GeometryFlags{flags: cmd.Flags(), geo: g}
	f := cmd.Flags()
	if g.Diameter != "" {
		gf.diameter = LengthVar(f, &gf.d, "diameter", g.Diameter, 2*cavity.MinSize, 2*cavity.MaxSize)
	}
	if g.Radius != "" {
		gf.radius = LengthVar(f, &gf.r, "radius", g.Radius, cavity.MinSize, cavity.MaxSize)
	}
	if g.Length != "" {
		gf.length = LengthVar(f, &gf.l, "length", g.Length, cavity.MinSize, cavity.MaxSize)
	}
	if g.Fill != "" {
		f.StringVar(&gf.fill, "fill", g.FillDefault, g.Fill)
	}
	if g.CobraChecks {
		cmd.MarkFlagsMutuallyExclusive("diameter", "radius")
		cmd.MarkFlagsOneRequired("diameter", "radius")
		if g.Length != "" {
			_ = cmd.MarkFlagRequired("length")
		}
	}
	return gf
}

// FlagSet returns the flags the geometry flags belong to.
func (gf *GeometryFlags) FlagSet() *pflag.FlagSet { return gf.flags }

// Changed reports whether the flag name was given on the command line (an
// empty value counts: it is rejected when read, never taken as absent).
func (gf *GeometryFlags) Changed(name string) bool { return gf.flags.Changed(name) }

// Text returns the value of the geometry flag name as given ("" for a flag
// that is not one of them), for error messages that quote it.
func (gf *GeometryFlags) Text(name string) string {
	q := map[string]*Quantity{"diameter": gf.diameter, "radius": gf.radius, "length": gf.length}[name]
	switch {
	case name == "fill":
		return gf.fill
	case q != nil:
		return q.Text()
	}
	return ""
}

// Diameter returns --diameter in metres, between 2 cavity.MinSize and
// 2 cavity.MaxSize.
func (gf *GeometryFlags) Diameter() (float64, error) { return gf.d, nil }

// Length returns --length in metres, between cavity.MinSize and
// cavity.MaxSize.
func (gf *GeometryFlags) Length() (float64, error) { return gf.l, nil }

// Radius returns the cavity radius in metres: half of --diameter (see
// Diameter) or --radius, between cavity.MinSize and cavity.MaxSize. Exactly
// one of the two must be given.
func (gf *GeometryFlags) Radius() (float64, error) {
	set := gf.flags.Changed
	switch {
	case set("diameter") && set("radius"):
		return 0, gf.geo.SizeErrors.both()
	case set("diameter"):
		d, err := gf.Diameter()
		return d / 2, err
	case set("radius"):
		return gf.r, nil
	}
	return 0, gf.geo.SizeErrors.noSize()
}

// Cavity reads the whole cavity: the radius (Radius), --length (required)
// and the fill (Fill), in that order.
func (gf *GeometryFlags) Cavity() (c cavity.Cavity, err error) {
	if c.Radius, err = gf.Radius(); err != nil {
		return c, err
	}
	if !gf.flags.Changed("length") {
		return c, gf.geo.SizeErrors.noLength()
	}
	if c.Length, err = gf.Length(); err != nil {
		return c, err
	}
	c.Fill, err = gf.Fill()
	return c, err
}

// Fill reads --fill (or its default, Geometry.FillDefault) and returns the
// medium, named by its library name or "user" for values given as eps=...
// (see Dielectric). With nothing to read it returns the zero Medium
// (vacuum, no name).
func (gf *GeometryFlags) Fill() (physics.Medium, error) {
	d, err := gf.Dielectric()
	return d.Medium, err
}

// Dielectric reads --fill (or its default, Geometry.FillDefault) with
// physics.ParseDielectric, which checks its Medium against
// physics.Medium.Validate, and returns the whole material row (with its
// description and source, for a datasheet). With nothing to read it
// returns the zero Dielectric, whose Medium is vacuum.
func (gf *GeometryFlags) Dielectric() (physics.Dielectric, error) {
	if !gf.flags.Changed("fill") && gf.geo.FillDefault == "" {
		return physics.Dielectric{}, nil
	}
	spec := gf.fill
	d, err := physics.ParseDielectric(spec)
	if err != nil {
		return physics.Dielectric{}, FlagError("fill", spec, err)
	}
	return d, nil
}
