package cmdutil

import (
	"fmt"
	"math"
	"strings"

	"cylcav/physics"
)

// Limits of the frequency flags (--freq, --fmax, --f0, ...): wider than any
// cavity cylcav can hold (cavity.MinSize..MaxSize), narrow enough to catch
// unit slips.
const (
	MinFrequency = 1e3  // Hz
	MaxFrequency = 1e14 // Hz
)

// The rule for bare numbers, the same for every flag with a unit: a length
// or frequency other than zero must carry its unit. A bare "176.5" for a
// diameter (176.5 m in SI) or "200" for a bandwidth (200 Hz) is far more
// often a slip than a wish, so it is refused with exit status 2 and a hint
// showing both readings:
//
//	--diameter "176.5": a bare number needs a unit: as SI it reads 176.5 m (write 176.5m), or did you mean 176.5mm?
//
// Zero needs no unit. Temperatures always need one (physics.ParseTemperature);
// dimensionless flags (ratios, counts) take bare numbers.

// siUnit is the SI unit of each kind, as written after a number.
var siUnit = map[string]string{"length": "m", "frequency": "Hz"}

// bare applies the rule above to the value of a flag of the given kind
// ("length" or "frequency"), whose SI reading is printed by format.
func bare(flag, value, kind string, format func(float64, int) string) error {
	if err := bareError(value, kind, format); err != nil {
		return FlagError(flag, value, err)
	}
	return nil
}

// bareError is bare's error without the flag.
func bareError(value, kind string, format func(float64, int) string) error {
	v, ok := physics.BareNumber(value)
	if !ok || v == 0 {
		return nil
	}
	return fmt.Errorf("a bare number needs a unit: as SI it reads %s (write %s%s), or did you mean %s?",
		TrimZeros(format(v, 6)), strings.TrimSpace(value), siUnit[kind], physics.UnitHint(kind, v))
}

// ParseLength parses a length flag value with the rule for bare numbers;
// errors name the flag and the value.
func ParseLength(flag, value string) (float64, error) {
	if err := bare(flag, value, "length", physics.FormatLength); err != nil {
		return 0, err
	}
	v, err := physics.ParseLength(value)
	if err != nil {
		return 0, FlagError(flag, value, err)
	}
	return v, nil
}

// ParseFrequency parses a frequency flag value with the rule for bare
// numbers; errors name the flag and the value.
func ParseFrequency(flag, value string) (float64, error) {
	if err := bare(flag, value, "frequency", physics.FormatFrequency); err != nil {
		return 0, err
	}
	v, err := physics.ParseFrequency(value)
	if err != nil {
		return 0, FlagError(flag, value, err)
	}
	return v, nil
}

// Length parses the value of a length flag (50mm, 1.97in, 0) into metres
// and checks that it lies in [min, max]. Errors name the flag, the value and
// the valid range, and exit with status 2.
func Length(flag, value string, min, max float64) (float64, error) {
	v, err := ParseLength(flag, value)
	if err != nil {
		return 0, err
	}
	if math.IsNaN(v) || v < min || v > max {
		return 0, FlagError(flag, value, fmt.Errorf("must be between %s and %s",
			TrimZeros(physics.FormatLength(min, 4)), TrimZeros(physics.FormatLength(max, 4))))
	}
	return v, nil
}

// TrimZeros drops the trailing zeros of a quantity formatted by package
// physics ("25.0000 mm" -> "25 mm", "5.00000 GHz" -> "5 GHz") for header
// lines, where columns need not align. Anything else is returned as is.
func TrimZeros(s string) string {
	v, unit, ok := strings.Cut(s, " ")
	if !ok || !strings.Contains(v, ".") {
		return s
	}
	return strings.TrimRight(strings.TrimRight(v, "0"), ".") + " " + unit
}
