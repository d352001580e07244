package physics

import "math"

// User units of the accelerator inputs: gradient, current and phase. The
// common rules of units.go apply (case, white space, sign).

var gradientUnits = []unit{
	{[]string{"v/m"}, 1},
	{[]string{"kv/m"}, 1e3},
	{[]string{"mv/m"}, 1e6}, // megavolt: millivolt per metre is no gradient anyone types
	{[]string{"gv/m"}, 1e9},
}

const gradientList = "V/m, kV/m, MV/m or GV/m"

// ParseGradient parses an accelerating gradient (an electric field) and
// returns it in V/m. Accepted units: V/m, kV/m, MV/m (megavolt per metre),
// GV/m in any case. A plain number is an error (write 15MV/m).
//
// Special cases are:
//
//	ParseGradient("15 MV/m") = 1.5e7, nil
//	ParseGradient("15") = error (no unit)
func ParseGradient(s string) (float64, error) {
	return parseWithUnits("gradient", s, gradientUnits, 0, gradientList)
}

var currentUnits = []unit{
	{[]string{"a"}, 1},
	{[]string{"ma"}, 1e-3}, // milliampere
	{[]string{"ua"}, 1e-6},
	{[]string{"na"}, 1e-9},
}

const currentList = "A, mA, uA or nA"

// ParseCurrent parses an electric current and returns it in amperes.
// Accepted units: A, mA (milliampere), uA (also µA), nA in any case. A
// plain number is an error (write 5mA).
func ParseCurrent(s string) (float64, error) {
	return parseWithUnits("current", s, currentUnits, 0, currentList)
}

var angleUnits = []unit{
	{[]string{"deg", "°"}, math.Pi / 180},
	{[]string{"rad"}, 1},
}

// ParseAngle parses an angle and returns it in radians. Accepted units:
// deg (also °) and rad. A plain number is an error (write -30deg).
func ParseAngle(s string) (float64, error) {
	return parseWithUnits("angle", s, angleUnits, 0, "deg or rad")
}
