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

// Length parses the value of a length flag (50mm, 1.97in, 0.05) into metres
// and checks that it lies in [min, max]. Errors name the flag, the value and
// the valid range, and exit with status 2.
func Length(flag, value string, min, max float64) (float64, error) {
	v, err := physics.ParseLength(value)
	if err != nil {
		return 0, FlagError(flag, value, err)
	}
	if math.IsNaN(v) || v < min || v > max {
		return 0, FlagError(flag, value, fmt.Errorf("must be between %s and %s",
			physics.FormatLength(min, 4), physics.FormatLength(max, 4)))
	}
	return v, nil
}

// Frequency parses the value of a frequency flag (10GHz, 915 MHz, 1e9) into
// hertz and checks that it lies in [min, max].
func Frequency(flag, value string, min, max float64) (float64, error) {
	v, err := physics.ParseFrequency(value)
	if err != nil {
		return 0, FlagError(flag, value, err)
	}
	if math.IsNaN(v) || v < min || v > max {
		return 0, FlagError(flag, value, fmt.Errorf("must be between %s and %s",
			physics.FormatFrequency(min, 4), physics.FormatFrequency(max, 4)))
	}
	return v, nil
}

// Number parses a plain dimensionless flag value (physics.ParseNumber:
// nothing may follow the number) and checks that it lies in [min, max].
func Number(flag, value string, min, max float64) (float64, error) {
	v, err := physics.ParseNumber(value)
	if err != nil {
		return 0, FlagError(flag, value, fmt.Errorf("%w; want a number between %g and %g", err, min, max))
	}
	if v < min || v > max {
		return 0, FlagError(flag, value, fmt.Errorf("must be between %g and %g", min, max))
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
