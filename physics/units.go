package physics

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// This file holds the one parser and the one printer for user units. The
// library works in SI throughout; only the command-line edge converts.
//
// Common rules of every Parse function below:
//   - leading and trailing white space is ignored, and white space between
//     the number and its unit is allowed ("38mm", "38 mm");
//   - the number is a decimal with an optional sign, fraction and exponent
//     ("-1.5e-3"); hexadecimal, underscores, "NaN" and "Inf" are rejected,
//     and so is any value that overflows to infinity after scaling;
//   - unit names are matched without regard to case, so "GHz", "ghz" and
//     "GHZ" are the same (no supported unit differs from another only by
//     case: there is no millihertz or megametre); the micro sign may be
//     written u, µ (U+00B5) or μ (U+03BC);
//   - negative values are returned as numbers: whether a negative length
//     makes sense is for the caller to decide (a temperature below absolute
//     zero is the one exception: it is rejected).

// unit is one accepted unit: its spellings (lower case, micro as "u") and
// its factor to the SI base unit.
type unit struct {
	names  []string
	factor float64
}

// splitNumber splits s (already trimmed) into a leading decimal number and
// the rest, trimmed. It accepts [+-] digits [. digits] [(e|E) [+-] digits]
// with at least one digit in the mantissa. ok is false when s does not start
// with such a number.
func splitNumber(s string) (num, rest string, ok bool) {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for i < len(s) && s[i] >= '0' && s[i] <= '9' {
		i++
		digits++
	}
	if i < len(s) && s[i] == '.' {
		i++
		for i < len(s) && s[i] >= '0' && s[i] <= '9' {
			i++
			digits++
		}
	}
	if digits == 0 {
		return "", s, false
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		k := j
		for k < len(s) && s[k] >= '0' && s[k] <= '9' {
			k++
		}
		if k > j { // an exponent needs at least one digit
			i = k
		}
	}
	return s[:i], strings.TrimSpace(s[i:]), true
}

// normUnit lower-cases a unit and writes the micro sign as "u".
func normUnit(u string) string {
	u = strings.ToLower(u)
	if strings.ContainsAny(u, "µμ") {
		u = strings.NewReplacer("µ", "u", "μ", "u").Replace(u)
	}
	return u
}

// parseNumber parses the leading number of s and returns it with the unit
// text that follows. what names the quantity for error messages.
func parseNumber(what, s string) (v float64, unitText string, err error) {
	t := strings.TrimSpace(s)
	if t == "" {
		return 0, "", fmt.Errorf("invalid %s %q: empty", what, s)
	}
	num, rest, ok := splitNumber(t)
	if !ok {
		l := strings.ToLower(strings.TrimLeft(t, "+-"))
		if strings.HasPrefix(l, "nan") || strings.HasPrefix(l, "inf") {
			return 0, "", fmt.Errorf("invalid %s %q: not a finite number", what, s)
		}
		return 0, "", fmt.Errorf("invalid %s %q: no number at the start", what, s)
	}
	v, err = strconv.ParseFloat(num, 64)
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, "", fmt.Errorf("invalid %s %q: number out of range", what, s)
	}
	return v, rest, nil
}

// parseWithUnits parses a number followed by one of units. plain is the
// factor used for a bare number (0 means a bare number is an error). list is
// the human list of units for error messages.
func parseWithUnits(what, s string, units []unit, plain float64, list string) (float64, error) {
	v, u, err := parseNumber(what, s)
	if err != nil {
		return 0, err
	}
	var factor float64
	if u == "" {
		if plain == 0 {
			return 0, fmt.Errorf("invalid %s %q: no unit; use %s", what, s, list)
		}
		factor = plain
	} else {
		nu := normUnit(u)
	search:
		for _, un := range units {
			for _, name := range un.names {
				if name == nu {
					factor = un.factor
					break search
				}
			}
		}
		if factor == 0 {
			return 0, fmt.Errorf("invalid %s %q: unknown unit %q; use %s", what, s, u, list)
		}
	}
	r := v * factor
	if math.IsInf(r, 0) {
		return 0, fmt.Errorf("invalid %s %q: number out of range", what, s)
	}
	return r, nil
}

var lengthUnits = []unit{
	{[]string{"m"}, 1},
	{[]string{"cm"}, 1e-2},
	{[]string{"mm"}, 1e-3},
	{[]string{"um"}, 1e-6},
	{[]string{"nm"}, 1e-9},
	{[]string{"in", `"`}, 0.0254}, // international inch, exact since 1959
	{[]string{"mil"}, 0.0254e-3},  // one thousandth of an inch, exact
}

const lengthList = "m, cm, mm, um, nm, in or mil"

// ParseLength parses a length and returns it in metres.
//
// Accepted units: m, cm, mm, um (also µm, μm), nm, in (also "), mil
// (1 mil = 0.001 in = 25.4 um; the inch is exactly 0.0254 m). A plain number
// is metres. See the common rules at the top of this file (case, white
// space, sign).
//
// Special cases are:
//
//	ParseLength("") = error (empty)
//	ParseLength("NaN"), ParseLength("Inf") = error (not a finite number)
//	ParseLength("1e400 m") = error (out of range)
//	ParseLength("-3mm") = -0.003, nil (sign kept; the caller checks range)
func ParseLength(s string) (float64, error) {
	return parseWithUnits("length", s, lengthUnits, 1, lengthList)
}

var frequencyUnits = []unit{
	{[]string{"hz"}, 1},
	{[]string{"khz"}, 1e3},
	{[]string{"mhz"}, 1e6},
	{[]string{"ghz"}, 1e9},
	{[]string{"thz"}, 1e12},
}

const frequencyList = "Hz, kHz, MHz, GHz or THz"

// ParseFrequency parses a frequency and returns it in hertz.
//
// Accepted units: Hz, kHz, MHz, GHz, THz in any case ("mhz" is megahertz:
// millihertz is not supported). A plain number is hertz. See the common
// rules at the top of this file.
//
// Special cases are:
//
//	ParseFrequency("") = error (empty)
//	ParseFrequency("5 G") = error (unknown unit "G")
//	ParseFrequency("-1GHz") = -1e9, nil (sign kept; the caller checks range)
func ParseFrequency(s string) (float64, error) {
	return parseWithUnits("frequency", s, frequencyUnits, 1, frequencyList)
}

// ParseTemperature parses a temperature and returns it in kelvin.
//
// Accepted units: K; C, °C or degC (Celsius, T = t + 273.15 K exactly);
// F, °F or degF (Fahrenheit, T = (t - 32) 5/9 + 273.15 K), in any case. A
// plain number is rejected as ambiguous: write "20C" or "293.15K".
//
// Special cases are:
//
//	ParseTemperature("20") = error (no unit)
//	ParseTemperature("-300C") = error (below absolute zero)
//	ParseTemperature("-20C") = 253.15, nil
func ParseTemperature(s string) (float64, error) {
	const list = "K, C or F (for example 20C, 293.15K)"
	v, u, err := parseNumber("temperature", s)
	if err != nil {
		return 0, err
	}
	var k float64
	switch normUnit(u) {
	case "":
		return 0, fmt.Errorf("invalid temperature %q: a plain number is ambiguous; use %s", s, list)
	case "k":
		k = v
	case "c", "°c", "degc":
		k = v + ZeroCelsius
	case "f", "°f", "degf":
		k = (v-32)*5/9 + ZeroCelsius
	default:
		return 0, fmt.Errorf("invalid temperature %q: unknown unit %q; use %s", s, u, list)
	}
	if math.IsInf(k, 0) {
		return 0, fmt.Errorf("invalid temperature %q: number out of range", s)
	}
	if k < 0 {
		return 0, fmt.Errorf("invalid temperature %q: below absolute zero (%g K)", s, k)
	}
	return k, nil
}

// ParseFraction parses a fraction given either as a percentage ("3%",
// "3 %") or as a plain fraction ("0.03"); both return 0.03. It is used for
// clearance windows and for conductivity in % IACS. The sign is kept; range
// checks are the caller's job.
//
// Special cases are:
//
//	ParseFraction("61%") = 0.61, nil
//	ParseFraction("61") = 61, nil (a plain number is a fraction, not a percentage)
//	ParseFraction("3 ppm") = error (unknown unit)
func ParseFraction(s string) (float64, error) {
	return parseWithUnits("fraction", s, []unit{{[]string{"%"}, 0.01}}, 1, "% or a plain fraction")
}

// ParseNumber parses a plain dimensionless number ("1.5", "-2e-3", " 7 ")
// under the common rules at the top of this file: nothing may follow the
// number, so "1abc", "1," and "0x10" are errors, as are NaN, Inf and values
// that overflow. The sign is kept; range checks are the caller's job.
//
// Special cases are:
//
//	ParseNumber("") = error (empty)
//	ParseNumber("1e400") = error (out of range)
//	ParseNumber("2 mm") = error (unexpected "mm" after the number)
func ParseNumber(s string) (float64, error) {
	v, u, err := parseNumber("number", s)
	if err != nil {
		return 0, err
	}
	if u != "" {
		return 0, fmt.Errorf("invalid number %q: unexpected %q after the number", s, u)
	}
	return v, nil
}

// ParseDecibel parses a level in decibels ("40dB", "40 dB", "-0.5db") and
// returns the number of decibels (not a linear ratio). A plain number is
// taken as decibels.
func ParseDecibel(s string) (float64, error) {
	return parseWithUnits("level", s, []unit{{[]string{"db"}, 1}}, 1, "dB")
}

var conductivityUnits = []unit{
	{[]string{"s/m"}, 1},
	{[]string{"ks/m"}, 1e3},
	{[]string{"ms/m"}, 1e6}, // MS/m: there is no millisiemens per metre here
}

// ParseConductivity parses an electrical conductivity and returns it in
// S/m. Accepted units: S/m, kS/m, MS/m in any case ("ms/m" is megasiemens
// per metre). A plain number is S/m.
func ParseConductivity(s string) (float64, error) {
	return parseWithUnits("conductivity", s, conductivityUnits, 1, "S/m, kS/m or MS/m")
}

var resistivityUnits = []unit{
	{[]string{"ohmm", "ωm"}, 1},
	{[]string{"ohmcm", "ωcm"}, 1e-2},
	{[]string{"uohmm", "uωm"}, 1e-6},
	{[]string{"uohmcm", "uωcm"}, 1e-8},
	{[]string{"nohmm", "nωm"}, 1e-9},
}

// ParseResistivity parses an electrical resistivity and returns it in
// ohm m. Accepted units: ohm m, ohm cm, uohm m, uohm cm, nohm m; "ohm" may
// be written Ω (U+03A9 or U+2126) and the product sign may be a space, "*",
// ".", "-" or "·" or left out ("1.72 µΩ·cm", "1.72uohmcm", "17.2 nohm m"). A plain
// number is ohm m.
func ParseResistivity(s string) (float64, error) {
	const list = "ohm m, ohm cm, uohm m, uohm cm or nohm m"
	v, u, err := parseNumber("resistivity", s)
	if err != nil {
		return 0, err
	}
	if u == "" {
		return v, nil
	}
	nu := strings.NewReplacer(" ", "", "*", "", ".", "", "·", "", "-", "").Replace(normUnit(u)) // Ω lower-cases to ω
	for _, un := range resistivityUnits {
		for _, name := range un.names {
			if name == nu {
				return v * un.factor, nil
			}
		}
	}
	return 0, fmt.Errorf("invalid resistivity %q: unknown unit %q; use %s", s, u, list)
}

// ParseCoefficient parses a temperature coefficient (of resistivity,
// permittivity, or thermal expansion) and returns it in 1/K. Accepted forms:
// a plain number or one with "/K", "1/K" or "/C" (per kelvin), or "ppm",
// "ppm/K" or "ppm/C" (parts per million per kelvin): "-350ppm" and
// "-3.5e-4" both give -3.5e-4.
func ParseCoefficient(s string) (float64, error) {
	return parseWithUnits("coefficient", s, []unit{
		{[]string{"/k", "1/k", "/c", "1/c"}, 1},
		{[]string{"ppm", "ppm/k", "ppm/c"}, 1e-6},
	}, 1, "1/K or ppm/K")
}

// ParseRange parses a range "LO:HI" whose two ends are parsed by parse, for
// example ParseRange("38mm:42mm", ParseLength) or
// ParseRange("-20C:60C", ParseTemperature) (a leading minus belongs to the
// number; the colon is the only separator). Each end carries its own unit.
// It is an error when an end fails to parse or when lo > hi; lo == hi is
// allowed.
func ParseRange(s string, parse func(string) (float64, error)) (lo, hi float64, err error) {
	if strings.Count(s, ":") != 1 {
		return 0, 0, fmt.Errorf("invalid range %q: want LO:HI, for example 38mm:42mm", s)
	}
	a, b, _ := strings.Cut(s, ":")
	a, b = strings.TrimSpace(a), strings.TrimSpace(b)
	lo, err = parse(a)
	if err != nil {
		return 0, 0, fmt.Errorf("invalid range %q: low end: %w", s, err)
	}
	hi, err = parse(b)
	if err != nil {
		return 0, 0, fmt.Errorf("invalid range %q: high end: %w", s, err)
	}
	if lo > hi {
		return 0, 0, fmt.Errorf("invalid range %q: low end %s is above high end %s", s, a, b)
	}
	return lo, hi, nil
}

// scale is one printing unit: 10^pow of the base unit.
type scale struct {
	pow  int
	name string
}

var (
	frequencyScales = []scale{{0, "Hz"}, {3, "kHz"}, {6, "MHz"}, {9, "GHz"}, {12, "THz"}}
	lengthScales    = []scale{{-9, "nm"}, {-6, "um"}, {-3, "mm"}, {0, "m"}}
	siPrefixes      = []scale{{-15, "f"}, {-12, "p"}, {-9, "n"}, {-6, "u"}, {-3, "m"}, {0, ""}, {3, "k"}, {6, "M"}, {9, "G"}, {12, "T"}}
)

// formatScaled prints v rounded to digits significant digits in the largest
// scale not above it (the smallest scale for tiny values, the largest for
// huge ones) followed by a space and the scale name with suffix appended.
// Zero prints in the scale with pow zeroPow.
func formatScaled(v float64, digits int, scales []scale, zeroPow int, suffix string) string {
	digits = max(1, min(digits, 17))
	if math.IsNaN(v) || math.IsInf(v, 0) {
		for _, sc := range scales {
			if sc.pow == 0 {
				return strconv.FormatFloat(v, 'g', -1, 64) + " " + sc.name + suffix
			}
		}
	}
	if v == 0 {
		for _, sc := range scales {
			if sc.pow == zeroPow {
				return "0 " + sc.name + suffix
			}
		}
	}
	sign := ""
	if v < 0 {
		sign = "-"
	}
	// Round first, so that 999.996 MHz at 5 digits becomes 1.0000 GHz.
	e := strconv.FormatFloat(math.Abs(v), 'e', digits-1, 64)
	exp, _ := strconv.Atoi(e[strings.IndexByte(e, 'e')+1:])
	r, _ := strconv.ParseFloat(e, 64)
	sc := scales[0]
	for _, c := range scales[1:] {
		if exp >= c.pow {
			sc = c
		}
	}
	decimals := max(0, digits-1-(exp-sc.pow))
	m := r / math.Pow10(sc.pow)
	return sign + strconv.FormatFloat(m, 'f', decimals, 64) + " " + sc.name + suffix
}

// FormatFrequency prints a frequency in hertz with digits significant
// digits (clamped to 1..17) in the friendliest of Hz, kHz, MHz, GHz and THz,
// for example FormatFrequency(4.58967e9, 5) = "4.5897 GHz". Trailing zeros
// are kept so that columns align. Zero prints "0 Hz"; NaN and Inf print as
// "NaN Hz" and "+Inf Hz". The result parses back with ParseFrequency.
func FormatFrequency(hz float64, digits int) string {
	return formatScaled(hz, digits, frequencyScales, 0, "")
}

// FormatLength prints a length in metres with digits significant digits
// (clamped to 1..17): nm below 1 um, um below 1 mm (skin depths,
// roughness), mm below 1 m (cavity sizes), m above; for example
// FormatLength(0.025, 4) = "25.00 mm". Zero prints "0 m". The result parses
// back with ParseLength.
func FormatLength(m float64, digits int) string {
	return formatScaled(m, digits, lengthScales, 0, "")
}

// FormatSI prints v in unit with digits significant digits (clamped to
// 1..17) and an SI prefix from f (1e-15) to T (1e12), micro written "u";
// for example FormatSI(0.0184, "ohm", 3) = "18.4 mohm". Zero prints
// "0 "+unit.
func FormatSI(v float64, unit string, digits int) string {
	return formatScaled(v, digits, siPrefixes, 0, unit)
}

// FormatTemperature prints a temperature given in kelvin with digits
// significant digits (clamped to 1..17): in Celsius ("60.0 C") at or above
// -100 C (173.15 K), where the linear resistivity model of normal metals is
// used, and in kelvin ("4.20 K") below, where cryogenic work is reported in
// kelvin. The result parses back with ParseTemperature.
func FormatTemperature(k float64, digits int) string {
	digits = max(1, min(digits, 17))
	if k >= ZeroCelsius-100 {
		c := k - ZeroCelsius
		if c == 0 {
			return "0 C"
		}
		return formatPlain(c, digits) + " C"
	}
	if k == 0 {
		return "0 K"
	}
	return formatPlain(k, digits) + " K"
}

// formatPlain prints v with digits significant digits in fixed notation.
func formatPlain(v float64, digits int) string {
	e := strconv.FormatFloat(v, 'e', digits-1, 64)
	exp, _ := strconv.Atoi(e[strings.IndexByte(e, 'e')+1:])
	r, _ := strconv.ParseFloat(e, 64)
	return strconv.FormatFloat(r, 'f', max(0, digits-1-exp), 64)
}

// BareNumber reports whether s is a plain number with no unit after it
// ("176.5", " 2e9 "), and returns the number. It lets the command line
// apply its rule for bare numbers (a length or frequency other than zero
// must carry its unit) with the same number syntax as every Parse function.
func BareNumber(s string) (v float64, ok bool) {
	v, u, err := parseNumber("number", s)
	return v, err == nil && u == ""
}

// UnitHint writes a bare number v with the unit a person most likely meant
// for a quantity of the given kind, for the hint of an error message:
// lengths in millimetres ("176.5mm"); frequencies in megahertz from 100 up
// ("200MHz") and in gigahertz below ("2.45GHz"). Other kinds return "".
// These are common practice in microwave work, not a physical rule.
func UnitHint(kind string, v float64) string {
	num := strconv.FormatFloat(v, 'g', -1, 64)
	switch kind {
	case "length":
		return num + "mm"
	case "frequency":
		if math.Abs(v) >= 100 {
			return num + "MHz"
		}
		return num + "GHz"
	}
	return ""
}

var resistanceUnits = []unit{
	{[]string{"ohm", "ω"}, 1},
	{[]string{"mohm", "mω"}, 1e-3}, // milliohm: there is no megohm surface resistance
	{[]string{"uohm", "uω"}, 1e-6},
	{[]string{"nohm", "nω"}, 1e-9},
}

// ParseResistance parses a (surface) resistance and returns it in ohms.
// Accepted units: ohm, mohm (milliohm), uohm, nohm in any case, "ohm" also
// written Ω (U+03A9 or U+2126). A plain number is ohms. See the common
// rules at the top of this file.
//
// Special cases are:
//
//	ParseResistance("10nohm") = 1e-8, nil
//	ParseResistance("0x10") = error (no hexadecimal)
func ParseResistance(s string) (float64, error) {
	return parseWithUnits("resistance", strings.ReplaceAll(s, "\u2126", "\u03a9"), resistanceUnits, 1, "ohm, mohm, uohm or nohm")
}
