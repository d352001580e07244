package physics

// User units of RF power and gas pressure (the power-handling inputs of a
// filter). The common rules of units.go apply (case, white space, sign).

var powerUnits = []unit{
	{[]string{"w"}, 1},
	{[]string{"kw"}, 1e3},
	{[]string{"mw"}, 1e-3}, // milliwatt: cases fold, so megawatt is written 1000kW
	{[]string{"uw"}, 1e-6},
}

const powerList = "W, kW, mW or uW"

// ParsePower parses a power and returns it in watts. Accepted units: W, kW,
// mW (milliwatt; all units are case-insensitive, so a megawatt is written
// 1000kW), uW (also µW). A plain number is an error (write 200W).
//
//	ParsePower("200 W") = 200, nil
//	ParsePower("2.5kW") = 2500, nil
func ParsePower(s string) (float64, error) {
	return parseWithUnits("power", s, powerUnits, 0, powerList)
}

var pressureUnits = []unit{
	{[]string{"pa"}, 1},
	{[]string{"hpa"}, 1e2},
	{[]string{"kpa"}, 1e3},
	{[]string{"mpa"}, 1e6},    // megapascal (cases fold; no millipascal)
	{[]string{"bar"}, 1e5},    // 1 bar = 100 kPa exactly (SI brochure, 9th ed., table 8)
	{[]string{"mbar"}, 1e2},   // millibar = hPa
	{[]string{"atm"}, 101325}, // standard atmosphere, exact by definition (10th CGPM, 1954)
	{[]string{"torr"}, 101325.0 / 760},
}

const pressureList = "Pa, hPa, kPa, MPa, bar, mbar, atm or torr"

// ParsePressure parses a pressure and returns it in pascals. Accepted
// units: Pa, hPa, kPa, MPa (cases fold: MPa is megapascal), bar
// (100 kPa), mbar, atm (101 325 Pa), torr (atm/760). A plain number is an
// error (write 70kPa).
func ParsePressure(s string) (float64, error) {
	return parseWithUnits("pressure", s, pressureUnits, 0, pressureList)
}
