package cmdutil

import (
	"fmt"
	"math"
	"strings"

	"github.com/spf13/pflag"

	"cylcav/cavity"
	"cylcav/physics"
)

// Typed flags (issue 10 item 7): each flag with a unit binds straight into
// a float64 (SI) or a cavity.Mode of the command's options through a
// pflag.Value whose Set parses with the one unit parser (ParseLength,
// ParseFrequency, package physics) and checks the flag's range. A bad value
// is refused while the command line is parsed, with exit status 2 and the
// line `--flag "value": what is wrong and the valid range, in user units`
// (FlagValueError), so a command's RunE holds no parsing of its own. The
// text as given stays available (Text) for messages that quote it later.

// Quantity is a flag value holding a physical quantity in SI units.
type Quantity struct {
	p      *float64
	text   string
	kind   string // Type(): "length", "frequency", ...
	parse  func(string) (float64, error)
	lo, hi float64
	show   func(float64) string // a range end in user units
	// symmetric ranges (lo = -hi) are stated as "within +-hi".
	symmetric bool
}

// String returns the value as given ("" when not given).
func (q *Quantity) String() string { return q.text }

// Type names the kind of quantity, for help texts.
func (q *Quantity) Type() string { return q.kind }

// Text returns the value as given.
func (q *Quantity) Text() string { return q.text }

// Set parses s, checks the range and stores the value.
func (q *Quantity) Set(s string) error {
	v, err := q.parse(s)
	if err != nil {
		switch q.kind { // the unit cannot be the slip: state the range
		case "number":
			return ValueErrorf("%v; want a number between %s and %s", err, q.show(q.lo), q.show(q.hi))
		case "dB":
			return ValueErrorf("%v; want a level between %s and %s", err, q.show(q.lo), q.show(q.hi))
		}
		return ValueErrorf("%v", err)
	}
	if math.IsNaN(v) || v < q.lo || v > q.hi {
		if q.symmetric {
			return ValueErrorf("must be within +-%s", q.show(q.hi))
		}
		return ValueErrorf("must be between %s and %s", q.show(q.lo), q.show(q.hi))
	}
	*q.p, q.text = v, s
	return nil
}

func showLength(v float64) string    { return TrimZeros(physics.FormatLength(v, 4)) }
func showFrequency(v float64) string { return TrimZeros(physics.FormatFrequency(v, 4)) }
func showPercent(v float64) string   { return fmt.Sprintf("%.6g%%", 100*v) }
func showNumber(v float64) string    { return fmt.Sprintf("%g", v) }
func showTemperature(v float64) string {
	return TrimZeros(physics.FormatTemperature(v, 5))
}

// LengthOf and FrequencyOf parse a length or a frequency that is part of
// a flag's value (an item of a list, an end of a range) with the rule for
// bare numbers; the error does not name the flag, which the caller adds.
func LengthOf(s string) (float64, error) { return parseLength(s) }

// FrequencyOf: see LengthOf.
func FrequencyOf(s string) (float64, error) { return parseFrequency(s) }

// parseLength and parseFrequency apply the rule for bare numbers.
func parseLength(s string) (float64, error) {
	if err := bareError(s, "length", physics.FormatLength); err != nil {
		return 0, err
	}
	return physics.ParseLength(s)
}

func parseFrequency(s string) (float64, error) {
	if err := bareError(s, "frequency", physics.FormatFrequency); err != nil {
		return 0, err
	}
	return physics.ParseFrequency(s)
}

func addQuantity(fs *pflag.FlagSet, q *Quantity, name, usage string) *Quantity {
	fs.Var(q, name, usage)
	return q
}

// LengthVar defines a length flag (50mm, 1.97in, 0) stored in metres in p,
// valid in [lo, hi].
func LengthVar(fs *pflag.FlagSet, p *float64, name, usage string, lo, hi float64) *Quantity {
	return addQuantity(fs, &Quantity{p: p, kind: "length", parse: parseLength, lo: lo, hi: hi, show: showLength}, name, usage)
}

// FrequencyVar defines a frequency flag (10GHz, 915 MHz) stored in hertz
// in p, valid in [lo, hi].
func FrequencyVar(fs *pflag.FlagSet, p *float64, name, usage string, lo, hi float64) *Quantity {
	return addQuantity(fs, &Quantity{p: p, kind: "frequency", parse: parseFrequency, lo: lo, hi: hi, show: showFrequency}, name, usage)
}

// TemperatureVar defines a temperature flag (20C, 2K) stored in kelvin in
// p, valid in [lo, hi].
func TemperatureVar(fs *pflag.FlagSet, p *float64, name, usage string, lo, hi float64) *Quantity {
	return addQuantity(fs, &Quantity{p: p, kind: "temperature", parse: physics.ParseTemperature, lo: lo, hi: hi, show: showTemperature}, name, usage)
}

// FractionVar defines a percentage flag (2%, or the fraction 0.02) stored
// as a fraction in p, valid in [lo, hi]. It is the one parser of every
// percentage flag, so all of them take the same forms and state their
// range the same way.
func FractionVar(fs *pflag.FlagSet, p *float64, name, usage string, lo, hi float64) *Quantity {
	return addQuantity(fs, &Quantity{p: p, kind: "percent", parse: physics.ParseFraction, lo: lo, hi: hi, show: showPercent}, name, usage)
}

// NumberVar defines a dimensionless flag (a ratio D/L) stored in p, valid
// in [lo, hi].
func NumberVar(fs *pflag.FlagSet, p *float64, name, usage string, lo, hi float64) *Quantity {
	return addQuantity(fs, &Quantity{p: p, kind: "number", parse: physics.ParseNumber, lo: lo, hi: hi, show: showNumber}, name, usage)
}

// ResistanceVar defines a resistance flag (10nohm) stored in ohms in p,
// valid in [lo, hi].
func ResistanceVar(fs *pflag.FlagSet, p *float64, name, usage string, lo, hi float64) *Quantity {
	show := func(v float64) string { return physics.FormatSI(v, "ohm", 4) }
	return addQuantity(fs, &Quantity{p: p, kind: "resistance", parse: physics.ParseResistance, lo: lo, hi: hi, show: show}, name, usage)
}

// Range is a flag value "LO:HI" of two quantities of one kind, each end
// with its own unit (physics.ParseRange), both in [min, max].
type Range struct {
	lo, hi *float64
	text   string
	q      Quantity // the kind, parser and limits of each end
}

func (r *Range) String() string { return r.text }
func (r *Range) Type() string   { return "range" }

// Text returns the value as given.
func (r *Range) Text() string { return r.text }

// Set parses s as LO:HI and checks both ends.
func (r *Range) Set(s string) error {
	lo, hi, err := physics.ParseRange(s, r.q.parse)
	if err != nil {
		return ValueErrorf("%v", err)
	}
	if !(lo >= r.q.lo && hi <= r.q.hi) {
		return ValueErrorf("both ends must be between %s and %s", r.q.show(r.q.lo), r.q.show(r.q.hi))
	}
	*r.lo, *r.hi, r.text = lo, hi, s
	return nil
}

// LengthRangeVar defines a length range flag (28mm:32mm) stored in metres.
func LengthRangeVar(fs *pflag.FlagSet, lo, hi *float64, name, usage string, min, max float64) *Range {
	r := &Range{lo: lo, hi: hi, q: Quantity{kind: "length", parse: parseLength, lo: min, hi: max, show: showLength}}
	fs.Var(r, name, usage)
	return r
}

// NumberRangeVar defines a dimensionless range flag (0.5:3).
func NumberRangeVar(fs *pflag.FlagSet, lo, hi *float64, name, usage string, min, max float64) *Range {
	r := &Range{lo: lo, hi: hi, q: Quantity{kind: "number", parse: physics.ParseNumber, lo: min, hi: max, show: showNumber}}
	fs.Var(r, name, usage)
	return r
}

// TemperatureRangeVar defines a temperature range flag (-20C:60C) stored
// in kelvin.
func TemperatureRangeVar(fs *pflag.FlagSet, lo, hi *float64, name, usage string, min, max float64) *Range {
	r := &Range{lo: lo, hi: hi, q: Quantity{kind: "temperature", parse: physics.ParseTemperature, lo: min, hi: max, show: showTemperature}}
	fs.Var(r, name, usage)
	return r
}

// ModeValue is a flag value holding a mode label (TE011, TM(1,2,0)),
// parsed and checked by cavity.ParseMode.
type ModeValue struct {
	p    *cavity.Mode
	text string
}

func (m *ModeValue) String() string { return m.text }
func (m *ModeValue) Type() string   { return "mode" }

// Text returns the value as given.
func (m *ModeValue) Text() string { return m.text }

// Set parses s as a mode label.
func (m *ModeValue) Set(s string) error {
	v, err := cavity.ParseMode(strings.TrimSpace(s))
	if err != nil {
		return ValueErrorf("%v", err)
	}
	*m.p, m.text = v, s
	return nil
}

// ModeVar defines a mode flag stored in p.
func ModeVar(fs *pflag.FlagSet, p *cavity.Mode, name, usage string) *ModeValue {
	m := &ModeValue{p: p}
	fs.Var(m, name, usage)
	return m
}

// SetDefault gives the flag name of fs its default value, parsed by the
// flag's own Set as a given value would be, and shows it in the help. The
// flag stays "not given" (Changed is false). It panics on a default that
// does not parse: that is a programming error.
func SetDefault(fs *pflag.FlagSet, name, value string) {
	f := fs.Lookup(name)
	if err := f.Value.Set(value); err != nil {
		panic("cmdutil.SetDefault: --" + name + ": " + err.Error())
	}
	f.DefValue = value
}

// Text returns the value of the flag name of fs as given on the command
// line (its default when not given), for messages that quote it.
func Text(fs *pflag.FlagSet, name string) string { return fs.Lookup(name).Value.String() }
