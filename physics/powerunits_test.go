package physics

import (
	"math"
	"testing"
)

// TestParsePowerPressure checks the power and pressure units against their
// definitions: SI prefixes; 1 bar = 1e5 Pa and 1 atm = 101 325 Pa exactly,
// 1 torr = 1/760 atm (SI brochure, 9th ed., 2019, table 8 and the 10th
// CGPM, 1954).
func TestParsePowerPressure(t *testing.T) {
	for _, c := range []struct {
		s    string
		f    func(string) (float64, error)
		want float64
	}{
		{"200W", ParsePower, 200},
		{"2.5 kW", ParsePower, 2500},
		{"15mW", ParsePower, 0.015},
		{"3uW", ParsePower, 3e-6},
		{"101.325kPa", ParsePressure, 101325},
		{"1atm", ParsePressure, 101325},
		{"0.7 bar", ParsePressure, 70000},
		{"1013.25mbar", ParsePressure, 101325},
		{"1013.25 hPa", ParsePressure, 101325},
		{"760torr", ParsePressure, 101325},
		{"0.1MPa", ParsePressure, 1e5},
	} {
		got, err := c.f(c.s)
		if err != nil || math.Abs(got-c.want) > 1e-12*c.want {
			t.Errorf("%q: %g, %v; want %g", c.s, got, err, c.want)
		}
	}
	for _, s := range []string{"200", "3 furlong", "", "NaN W"} {
		if _, err := ParsePower(s); err == nil {
			t.Errorf("ParsePower(%q): no error", s)
		}
		if _, err := ParsePressure(s); err == nil {
			t.Errorf("ParsePressure(%q): no error", s)
		}
	}
}
