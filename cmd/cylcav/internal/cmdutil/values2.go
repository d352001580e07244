package cmdutil

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"cylcav/cavity"
	"cylcav/physics"
)

// More typed flags (see values.go): levels in decibels, whole numbers with
// a range, multiples ("3x"), words from a fixed list, a frequency or a
// percentage of another frequency, and lists of frequencies and of levels
// at frequencies. Like the others, each Set parses with the one unit
// parser and checks the flag's own range; what depends on other flags
// (a passband, a centre frequency) is checked by the command after parsing.

// DecibelVar defines a level flag in decibels (20dB, or a bare 20) stored
// in p, valid in [lo, hi].
func DecibelVar(fs *pflag.FlagSet, p *float64, name, usage string, lo, hi float64) *Quantity {
	show := func(v float64) string { return fmt.Sprintf("%.4g dB", v) }
	return addQuantity(fs, &Quantity{p: p, kind: "dB", parse: physics.ParseDecibel, lo: lo, hi: hi, show: show}, name, usage)
}

// Integer is a flag value holding a whole number in a range. Its Type is
// "int", so HardenFlags takes decimal digits only.
type Integer struct {
	p      *int
	text   string
	lo, hi int
}

func (n *Integer) String() string { return strconv.Itoa(*n.p) }
func (n *Integer) Type() string   { return "int" }

// Set parses s (decimal digits) and checks the range.
func (n *Integer) Set(s string) error {
	v, err := strconv.Atoi(s)
	if err != nil {
		return err // FlagValueError words it ("not a whole number")
	}
	if v < n.lo || v > n.hi {
		return ValueErrorf("must be between %d and %d", n.lo, n.hi)
	}
	*n.p, n.text = v, s
	return nil
}

// IntVar defines a whole-number flag stored in p, valid in [lo, hi], with
// the default value def.
func IntVar(fs *pflag.FlagSet, p *int, name string, def int, usage string, lo, hi int) *Integer {
	*p = def
	n := &Integer{p: p, lo: lo, hi: hi}
	fs.Var(n, name, usage)
	return n
}

// Times is a flag value holding a multiple of something ("3x", or a bare
// 3), valid above lo and at most hi.
type Times struct {
	p      *float64
	text   string
	what   string // "bandwidths"
	lo, hi float64
}

func (t *Times) String() string { return t.text }
func (t *Times) Type() string   { return "multiple" }

// Set parses s as a number with an optional "x" and checks lo < v <= hi.
func (t *Times) Set(s string) error {
	n := strings.TrimSpace(s)
	n = strings.TrimSuffix(strings.TrimSuffix(n, "x"), "X")
	v, err := physics.ParseNumber(n)
	if err != nil || !(v > t.lo && v <= t.hi) {
		return ValueErrorf("want a number of %s above %g and at most %g, e.g. 3x", t.what, t.lo, t.hi)
	}
	*t.p, t.text = v, s
	return nil
}

// TimesVar defines a multiple flag (a number of what, "3x") stored in p,
// valid above lo and at most hi, with the default def (as given).
func TimesVar(fs *pflag.FlagSet, p *float64, name, def, usage, what string, lo, hi float64) *Times {
	t := &Times{p: p, what: what, lo: lo, hi: hi}
	fs.Var(t, name, usage)
	SetDefault(fs, name, def)
	return t
}

// Choice is one word an Enum flag accepts, the value it stands for, an
// optional note shown in the error ("end (cavities stacked on one
// axis)"), and other words accepted for it but not shown (plurals).
type Choice[T any] struct {
	Word  string
	Value T
	Note  string
	Also  []string
}

// Enum is a flag value holding one of a fixed list of words, matched
// without regard to case and surrounding space.
type Enum[T any] struct {
	p       *T
	text    string
	what    string
	choices []Choice[T]
}

func (e *Enum[T]) String() string { return e.text }
func (e *Enum[T]) Type() string   { return "word" }

// Set looks s up among the words.
func (e *Enum[T]) Set(s string) error {
	w := strings.ToLower(strings.TrimSpace(s))
	for _, c := range e.choices {
		if w == c.Word || slices.Contains(c.Also, w) {
			*e.p, e.text = c.Value, s
			return nil
		}
	}
	return ValueErrorf("unknown %s; use %s", e.what, e.Words())
}

// Words lists the accepted words with their notes: "a, b or c".
func (e *Enum[T]) Words() string {
	var b strings.Builder
	for i, c := range e.choices {
		switch {
		case i == 0:
		case i == len(e.choices)-1:
			b.WriteString(" or ")
		default:
			b.WriteString(", ")
		}
		b.WriteString(c.Word)
		if c.Note != "" {
			b.WriteString(" (" + c.Note + ")")
		}
	}
	return b.String()
}

// EnumVar defines a flag taking one of the words of choices, stored as its
// value in p; what names the kind of word in the error ("unknown what;
// use ..."). A non-empty def is the default, parsed as a given value.
func EnumVar[T any](fs *pflag.FlagSet, p *T, name, def, usage, what string, choices ...Choice[T]) *Enum[T] {
	e := &Enum[T]{p: p, what: what, choices: choices}
	fs.Var(e, name, usage)
	if def != "" {
		SetDefault(fs, name, def)
	}
	return e
}

// FrequencyOrFraction is a flag value holding a frequency (200MHz) or a
// percentage of a reference frequency given by another flag (2%).
type FrequencyOrFraction struct {
	text     string
	hz, frac float64
	relative bool
}

func (v *FrequencyOrFraction) String() string { return v.text }
func (v *FrequencyOrFraction) Type() string   { return "frequency|percent" }

// Text returns the value as given.
func (v *FrequencyOrFraction) Text() string { return v.text }

// Set parses s as a percentage when it ends in "%", else as a frequency.
func (v *FrequencyOrFraction) Set(s string) error {
	t := strings.TrimSpace(s)
	var err error
	if v.relative = strings.HasSuffix(t, "%"); v.relative {
		v.frac, err = physics.ParseFraction(t)
	} else {
		v.hz, err = parseFrequency(t)
	}
	if err != nil {
		return ValueErrorf("%v", err)
	}
	v.text = s
	return nil
}

// Of returns the frequency in hertz, a percentage taken of ref.
func (v *FrequencyOrFraction) Of(ref float64) float64 {
	if v.relative {
		return v.frac * ref
	}
	return v.hz
}

// FrequencyOrFractionVar defines a flag taking a frequency or a
// percentage of another frequency; the command resolves it with Of and
// checks its range, which depends on the reference.
func FrequencyOrFractionVar(fs *pflag.FlagSet, name, usage string) *FrequencyOrFraction {
	v := &FrequencyOrFraction{}
	fs.Var(v, name, usage)
	return v
}

// FrequencyList is a flag value holding a comma-separated list of
// frequencies, each in [lo, hi], stored in hertz.
type FrequencyList struct {
	p      *[]float64
	text   string
	items  []string
	lo, hi float64
}

func (l *FrequencyList) String() string { return l.text }
func (l *FrequencyList) Type() string   { return "frequencies" }

// Text returns the value as given.
func (l *FrequencyList) Text() string { return l.text }

// Items returns the items as given, trimmed, in the order of the values.
func (l *FrequencyList) Items() []string { return l.items }

// Set parses each item of s; an error quotes the item.
func (l *FrequencyList) Set(s string) error {
	var vs []float64
	var items []string
	for _, item := range strings.Split(s, ",") {
		it := strings.TrimSpace(item)
		v, err := parseFrequency(it)
		if err != nil {
			return ItemErrorf(it, "%v", err)
		}
		if math.IsNaN(v) || v < l.lo || v > l.hi {
			return ItemErrorf(it, "must be between %s and %s", showFrequency(l.lo), showFrequency(l.hi))
		}
		vs, items = append(vs, v), append(items, it)
	}
	*l.p, l.items, l.text = vs, items, s
	return nil
}

// FrequencyListVar defines a list flag of frequencies (9.8GHz,10.18GHz)
// stored in hertz in p, each valid in [lo, hi].
func FrequencyListVar(fs *pflag.FlagSet, p *[]float64, name, usage string, lo, hi float64) *FrequencyList {
	l := &FrequencyList{p: p, lo: lo, hi: hi}
	fs.Var(l, name, usage)
	return l
}

// LevelAt is a level in decibels at a frequency, one item "40dB@10.3GHz"
// of a LevelList, with the item as given (trimmed) for later messages.
type LevelAt struct {
	DB, Hz float64
	Text   string
}

// LevelList is a flag value holding a comma-separated list of
// LEVEL@FREQUENCY items, each level above 0 dB and at most maxDB, each
// frequency between MinFrequency and MaxFrequency.
type LevelList struct {
	p     *[]LevelAt
	text  string
	maxDB float64
}

func (l *LevelList) String() string { return l.text }
func (l *LevelList) Type() string   { return "levels" }

// Text returns the value as given.
func (l *LevelList) Text() string { return l.text }

// Set parses each item of s; an error quotes the item.
func (l *LevelList) Set(s string) error {
	var vs []LevelAt
	for _, item := range strings.Split(s, ",") {
		it := strings.TrimSpace(item)
		v, err := l.parse(it)
		if err != nil {
			return err
		}
		vs = append(vs, v)
	}
	*l.p, l.text = vs, s
	return nil
}

func (l *LevelList) parse(it string) (LevelAt, error) {
	a, fr, ok := strings.Cut(it, "@")
	if !ok {
		return LevelAt{}, ItemErrorf(it, "want ATTENUATION@FREQUENCY, e.g. 40dB@10.3GHz")
	}
	db, err := physics.ParseDecibel(a)
	if err != nil {
		return LevelAt{}, ItemErrorf(it, "%v", err)
	}
	if !(db > 0 && db <= l.maxDB) {
		return LevelAt{}, ItemErrorf(it, "attenuation must be > 0 dB and <= %g dB", l.maxDB)
	}
	f, err := parseFrequency(fr)
	if err != nil {
		return LevelAt{}, ItemErrorf(it, "%v", err)
	}
	if !(f >= MinFrequency && f <= MaxFrequency) {
		return LevelAt{}, ItemErrorf(it, "frequency must be between %s and %s",
			physics.FormatFrequency(MinFrequency, 4), physics.FormatFrequency(MaxFrequency, 4))
	}
	return LevelAt{DB: db, Hz: f, Text: it}, nil
}

// LevelListVar defines a list flag of attenuations at frequencies
// (40dB@10.25GHz,35dB@9.75GHz) stored in p, each level above 0 dB and at
// most maxDB.
func LevelListVar(fs *pflag.FlagSet, p *[]LevelAt, name, usage string, maxDB float64) *LevelList {
	l := &LevelList{p: p, maxDB: maxDB}
	fs.Var(l, name, usage)
	return l
}

// NumberList is a flag value holding a comma-separated list of at most max
// dimensionless numbers, each in [lo, hi] (one value per port: "0.8" or
// "1,1").
type NumberList struct {
	p      *[]float64
	text   string
	lo, hi float64
	max    int
	per    string // "port": "give one value per port, at most 2 ports"
}

func (l *NumberList) String() string { return l.text }
func (l *NumberList) Type() string   { return "numbers" }

// Set parses each item of s; an error about one item quotes it.
func (l *NumberList) Set(s string) error {
	parts := strings.Split(s, ",")
	if len(parts) > l.max {
		return ValueErrorf("give one value per %s, at most %d %ss", l.per, l.max, l.per)
	}
	vs := make([]float64, len(parts))
	for i, p := range parts {
		it := strings.TrimSpace(p)
		v, err := physics.ParseNumber(it)
		if err != nil {
			return ItemErrorf(it, "%v; want a number between %g and %g", err, l.lo, l.hi)
		}
		if !(v >= l.lo && v <= l.hi) {
			return ItemErrorf(it, "must be between %g and %g", l.lo, l.hi)
		}
		vs[i] = v
	}
	*l.p, l.text = vs, s
	return nil
}

// NumberListVar defines a list flag of at most max numbers, one per what
// ("port"), each in [lo, hi], stored in p.
func NumberListVar(fs *pflag.FlagSet, p *[]float64, name, usage string, lo, hi float64, max int, per string) *NumberList {
	l := &NumberList{p: p, lo: lo, hi: hi, max: max, per: per}
	fs.Var(l, name, usage)
	return l
}

// CoefficientVar defines a temperature coefficient flag (23ppm, 2.3e-5)
// stored in 1/K in p, valid within +-max.
func CoefficientVar(fs *pflag.FlagSet, p *float64, name, usage string, max float64) *Quantity {
	show := func(v float64) string { return fmt.Sprintf("%g ppm/K", v*1e6) }
	return addQuantity(fs, &Quantity{p: p, kind: "coefficient", parse: physics.ParseCoefficient, lo: -max, hi: max, show: show, symmetric: true}, name, usage)
}

// Conductor is a flag value holding a wall metal: a library name or
// key=value pairs, parsed by physics.ParseConductor.
type Conductor struct {
	p    *physics.Conductor
	text string
}

func (c *Conductor) String() string { return c.text }
func (c *Conductor) Type() string   { return "metal" }

// Set parses s as a wall metal.
func (c *Conductor) Set(s string) error {
	v, err := physics.ParseConductor(s)
	if err != nil {
		return ValueErrorf("%v", err)
	}
	*c.p, c.text = v, s
	return nil
}

// ConductorVar defines a wall-metal flag stored in p.
func ConductorVar(fs *pflag.FlagSet, p *physics.Conductor, name, usage string) *Conductor {
	c := &Conductor{p: p}
	fs.Var(c, name, usage)
	return c
}

// Point is a flag value holding a point in a cavity as RHO,PHI,Z: two
// lengths with their units and an azimuth in degrees (a bare number or
// "deg"), stored as a cavity.Point (PHI in radians). Whether the point
// lies in the cavity is the command's check.
type Point struct {
	p    *cavity.Point
	text string
}

func (pt *Point) String() string { return pt.text }
func (pt *Point) Type() string   { return "point" }

// Set parses s as RHO,PHI,Z; an error about one length quotes it.
func (pt *Point) Set(s string) error {
	parts := strings.Split(s, ",")
	if len(parts) != 3 {
		return ValueErrorf("want RHO,PHI,Z such as 20mm,0,15mm")
	}
	rho, err := parseLength(parts[0])
	if err != nil {
		return ItemErrorf(parts[0], "%v", err)
	}
	deg, err := physics.ParseNumber(strings.TrimSuffix(strings.TrimSpace(parts[1]), "deg"))
	if err != nil {
		return ValueErrorf("PHI %q is not a number of degrees", parts[1])
	}
	z, err := parseLength(parts[2])
	if err != nil {
		return ItemErrorf(parts[2], "%v", err)
	}
	*pt.p, pt.text = cavity.Point{Rho: rho, Phi: deg * math.Pi / 180, Z: z}, s
	return nil
}

// PointVar defines a point flag (20mm,0,15mm) stored in p.
func PointVar(fs *pflag.FlagSet, p *cavity.Point, name, usage string) *Point {
	pt := &Point{p: p}
	fs.Var(pt, name, usage)
	return pt
}
