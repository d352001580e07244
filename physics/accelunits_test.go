package physics

import (
	"math"
	"testing"
)

// TestAccelUnits checks the gradient, current and angle parsers against
// the SI prefixes (BIPM, The International System of Units, 9th ed., 2019,
// table 7) and the degree, pi/180 rad (same, table 8).
func TestAccelUnits(t *testing.T) {
	for _, tc := range []struct {
		parse func(string) (float64, error)
		in    string
		want  float64
	}{
		{ParseGradient, "15MV/m", 15e6},
		{ParseGradient, "2.5 kV/m", 2500},
		{ParseGradient, "31.4 mv/m", 31.4e6},
		{ParseCurrent, "9.5mA", 9.5e-3},
		{ParseCurrent, "2 µA", 2e-6},
		{ParseCurrent, "0.1A", 0.1},
		{ParseAngle, "-30deg", -math.Pi / 6},
		{ParseAngle, "0.5rad", 0.5},
	} {
		got, err := tc.parse(tc.in)
		if err != nil || math.Abs(got-tc.want) > 1e-15*math.Abs(tc.want) {
			t.Errorf("parse(%q) = %g, %v; want %g", tc.in, got, err, tc.want)
		}
	}
	for _, bad := range []struct {
		parse func(string) (float64, error)
		in    string
	}{{ParseGradient, "15"}, {ParseGradient, "15 MV"}, {ParseCurrent, "5"}, {ParseCurrent, "5 mV"}, {ParseAngle, "-30"}, {ParseAngle, "NaN deg"}} {
		if v, err := bad.parse(bad.in); err == nil {
			t.Errorf("parse(%q) = %g, want an error", bad.in, v)
		}
	}
}
