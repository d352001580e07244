package physics

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// Expected values below come from the definitions of the units, all exact:
// the SI prefixes (BIPM, The International System of Units, 9th ed., 2019,
// Table 7); the international inch, 0.0254 m (international yard and pound
// agreement, 1959) and the mil, 0.001 in; the Celsius offset 273.15 K (SI
// Brochure, 9th ed., sec. 2.3.1) and the Fahrenheit scale, t_F = 9/5 t_C + 32.

// unitTol allows the one or two roundings of a number times a scale factor
// (a few ulp).
const unitTol = 1e-15

// roundTripTol is the relative error allowed after printing with
// roundTripDigits significant digits and parsing again: half a unit in the
// last printed digit plus the scaling roundings.
const (
	roundTripDigits = 15
	roundTripTol    = 1e-14
)

// kelvinTol is the absolute error allowed in kelvin: the offset 273.15 and
// the Fahrenheit factor 5/9 are not exact in binary, so a temperature near
// 300 K carries a few ulp (about 6e-14 K each).
const kelvinTol = 1e-12

// kelvinRoundTripTol is the absolute error allowed after printing a
// temperature below 300 K with roundTripDigits significant digits and
// parsing it again: half a unit in the 15th digit of a value up to 300
// (1.5e-13) plus the Celsius offset's roundings.
const kelvinRoundTripTol = 1e-11

func closeRel(a, b, tol float64) bool {
	if a == b {
		return true
	}
	return math.Abs(a-b) <= tol*math.Max(math.Abs(a), math.Abs(b))
}

func TestParseLength(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want float64 // metres, from the unit definitions
	}{
		{"0.038", 0.038},
		{"38mm", 0.038},
		{"38 mm", 0.038},
		{"  38MM ", 0.038},
		{"3.8cm", 0.038},
		{"1m", 1},
		{"1.5in", 1.5 * 0.0254},
		{`2"`, 2 * 0.0254},
		{"10 mil", 10 * 25.4e-6},
		{"0.4um", 0.4e-6},
		{"0.4 µm", 0.4e-6},
		{"0.4μm", 0.4e-6},
		{"400nm", 400e-9},
		{"-3mm", -0.003},
		{"+5e-3", 5e-3},
		{"5E-3m", 5e-3},
		{".5mm", 0.5e-3},
		{"5.mm", 5e-3},
		{"0", 0},
	} {
		got, err := ParseLength(tc.in)
		if err != nil {
			t.Errorf("ParseLength(%q) error %v", tc.in, err)
			continue
		}
		if !closeRel(got, tc.want, unitTol) {
			t.Errorf("ParseLength(%q) = %g, want %g", tc.in, got, tc.want)
		}
	}
}

// errCase is an input that must fail with an error containing every want
// substring.
type errCase struct {
	in   string
	want []string
}

func checkErrors(t *testing.T, name string, parse func(string) (float64, error), cases []errCase) {
	t.Helper()
	for _, tc := range cases {
		got, err := parse(tc.in)
		if err == nil {
			t.Errorf("%s(%q) = %g, want error", name, tc.in, got)
			continue
		}
		for _, w := range tc.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("%s(%q) error %q, want it to contain %q", name, tc.in, err, w)
			}
		}
	}
}

func TestParseLengthErrors(t *testing.T) {
	checkErrors(t, "ParseLength", ParseLength, []errCase{
		{"5 furlong", []string{`invalid length "5 furlong"`, `unknown unit "furlong"`, "m, cm, mm, um, nm, in or mil"}},
		{"", []string{"empty"}},
		{"   ", []string{"empty"}},
		{"mm", []string{"no number"}},
		{"NaN", []string{"not a finite number"}},
		{"-Inf mm", []string{"not a finite number"}},
		{"inf", []string{"not a finite number"}},
		{"1e999", []string{"out of range"}},
		{"0x10", []string{"unknown unit"}},
		{"1_000", []string{"unknown unit"}},
		{"5 5mm", []string{"unknown unit"}},
		{"5mmm", []string{"unknown unit"}},
		{"5 km", []string{"unknown unit"}},
	})
	// 1e308 in is 2.54e306 m: finite, so accepted.
	if v, err := ParseLength("1e308 in"); err != nil || !closeRel(v, 2.54e306, unitTol) {
		t.Errorf("ParseLength(%q) = %g, %v, want 2.54e306", "1e308 in", v, err)
	}
	// 1.7e308 GHz overflows after scaling.
	checkErrors(t, "ParseFrequency", ParseFrequency, []errCase{{"1.7e308 GHz", []string{"out of range"}}})
}

func TestParseFrequency(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want float64 // Hz, from the SI prefixes
	}{
		{"4.5897GHz", 4.5897e9},
		{"4.5897 ghz", 4.5897e9},
		{"4.5897 GHZ", 4.5897e9},
		{"1300 MHz", 1.3e9},
		{"1300 mhz", 1.3e9}, // megahertz: there is no millihertz
		{"10kHz", 1e4},
		{"50 Hz", 50},
		{"0.3THz", 3e11},
		{"2.5e9", 2.5e9},
		{"-1GHz", -1e9},
	} {
		got, err := ParseFrequency(tc.in)
		if err != nil {
			t.Errorf("ParseFrequency(%q) error %v", tc.in, err)
			continue
		}
		if !closeRel(got, tc.want, unitTol) {
			t.Errorf("ParseFrequency(%q) = %g, want %g", tc.in, got, tc.want)
		}
	}
	checkErrors(t, "ParseFrequency", ParseFrequency, []errCase{
		{"5 G", []string{`unknown unit "G"`, "Hz, kHz, MHz, GHz or THz"}},
		{"", []string{"empty"}},
		{"GHz", []string{"no number"}},
		{"nan GHz", []string{"not a finite number"}},
	})
}

func TestParseTemperature(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want float64 // kelvin: T = t_C + 273.15, t_C = (t_F - 32) 5/9
	}{
		{"20C", 293.15},
		{"20 °C", 293.15},
		{"20degC", 293.15},
		{"20c", 293.15},
		{"-20C", 253.15},
		{"293.15K", 293.15},
		{"4.2 K", 4.2},
		{"68F", 293.15},
		{"-40F", 233.15}, // -40 F = -40 C
		{"32 °F", 273.15},
		{"0K", 0},
	} {
		got, err := ParseTemperature(tc.in)
		if err != nil {
			t.Errorf("ParseTemperature(%q) error %v", tc.in, err)
			continue
		}
		if math.Abs(got-tc.want) > kelvinTol {
			t.Errorf("ParseTemperature(%q) = %.15g, want %.15g", tc.in, got, tc.want)
		}
	}
	checkErrors(t, "ParseTemperature", ParseTemperature, []errCase{
		{"20", []string{"plain number is ambiguous", "20C"}},
		{"-300C", []string{"below absolute zero"}},
		{"-1K", []string{"below absolute zero"}},
		{"20 R", []string{`unknown unit "R"`}},
		{"", []string{"empty"}},
	})
}

// TestParseNumber: plain numbers parse as strconv.ParseFloat would read
// them (exact decimal conversion); anything after the number is an error.
func TestParseNumber(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want float64
	}{
		{"1", 1}, {" 1.5 ", 1.5}, {"-2e-3", -2e-3}, {"+7", 7}, {".5", 0.5}, {"5.", 5}, {"1e308", 1e308},
	} {
		if got, err := ParseNumber(tc.in); err != nil || got != tc.want {
			t.Errorf("ParseNumber(%q) = %g, %v, want %g", tc.in, got, err, tc.want)
		}
	}
	checkErrors(t, "ParseNumber", ParseNumber, []errCase{
		{"", []string{"empty"}},
		{"abc", []string{"no number"}},
		{"1abc", []string{`unexpected "abc"`}},
		{"1,", []string{`unexpected ","`}},
		{"1:2", []string{`unexpected ":2"`}},
		{"0x10", []string{`unexpected "x10"`}},
		{"2 mm", []string{`unexpected "mm"`}},
		{"NaN", []string{"not a finite number"}},
		{"-Inf", []string{"not a finite number"}},
		{"1e400", []string{"out of range"}},
	})
}

func TestParseFractionDecibelCoefficient(t *testing.T) {
	for _, tc := range []struct {
		name  string
		parse func(string) (float64, error)
		in    string
		want  float64
	}{
		{"ParseFraction", ParseFraction, "3%", 0.03},
		{"ParseFraction", ParseFraction, "3 %", 0.03},
		{"ParseFraction", ParseFraction, "0.03", 0.03},
		{"ParseFraction", ParseFraction, "61%", 0.61},
		{"ParseFraction", ParseFraction, "-2%", -0.02},
		{"ParseDecibel", ParseDecibel, "40dB", 40},
		{"ParseDecibel", ParseDecibel, "40 db", 40},
		{"ParseDecibel", ParseDecibel, "-0.5", -0.5},
		{"ParseCoefficient", ParseCoefficient, "-350ppm", -350e-6},
		{"ParseCoefficient", ParseCoefficient, "17 ppm/K", 17e-6},
		{"ParseCoefficient", ParseCoefficient, "0.00393/K", 0.00393},
		{"ParseCoefficient", ParseCoefficient, "0.00393 1/C", 0.00393},
		{"ParseCoefficient", ParseCoefficient, "3.9e-3", 3.9e-3},
		{"ParseConductivity", ParseConductivity, "5.8e7", 5.8e7},
		{"ParseConductivity", ParseConductivity, "5.8e7 S/m", 5.8e7},
		{"ParseConductivity", ParseConductivity, "58MS/m", 5.8e7},
		{"ParseConductivity", ParseConductivity, "58000 kS/m", 5.8e7},
		{"ParseResistivity", ParseResistivity, "1.72e-8", 1.72e-8},
		{"ParseResistivity", ParseResistivity, "1.72e-8 ohm m", 1.72e-8},
		{"ParseResistivity", ParseResistivity, "1.72e-8 Ω·m", 1.72e-8},
		{"ParseResistivity", ParseResistivity, "1.72 µΩ·cm", 1.72e-8},
		{"ParseResistivity", ParseResistivity, "1.72uohmcm", 1.72e-8},
		{"ParseResistivity", ParseResistivity, "17.2 nohm m", 1.72e-8},
		{"ParseResistivity", ParseResistivity, "1.72e-6 ohm-cm", 1.72e-8},
	} {
		got, err := tc.parse(tc.in)
		if err != nil {
			t.Errorf("%s(%q) error %v", tc.name, tc.in, err)
			continue
		}
		if !closeRel(got, tc.want, unitTol) {
			t.Errorf("%s(%q) = %g, want %g", tc.name, tc.in, got, tc.want)
		}
	}
	checkErrors(t, "ParseFraction", ParseFraction, []errCase{{"3 ppm", []string{"unknown unit"}}})
	checkErrors(t, "ParseDecibel", ParseDecibel, []errCase{{"40 dBm", []string{"unknown unit", "dB"}}})
	checkErrors(t, "ParseResistivity", ParseResistivity, []errCase{{"1 ohm", []string{"unknown unit", "ohm m"}}})
	checkErrors(t, "ParseConductivity", ParseConductivity, []errCase{{"1 S", []string{"unknown unit", "S/m"}}})
}

func TestParseRange(t *testing.T) {
	for _, tc := range []struct {
		in     string
		parse  func(string) (float64, error)
		lo, hi float64
	}{
		{"0.5:3", ParseLength, 0.5, 3},
		{"38mm:42mm", ParseLength, 0.038, 0.042},
		{"38mm : 1.7in", ParseLength, 0.038, 1.7 * 0.0254},
		{"-20C:60C", ParseTemperature, 253.15, 333.15},
		{"-0.03:0.03", ParseFraction, -0.03, 0.03},
		{"-3%:3%", ParseFraction, -0.03, 0.03},
		{"5GHz:5GHz", ParseFrequency, 5e9, 5e9},
	} {
		lo, hi, err := ParseRange(tc.in, tc.parse)
		if err != nil {
			t.Errorf("ParseRange(%q) error %v", tc.in, err)
			continue
		}
		if !closeRel(lo, tc.lo, unitTol) || !closeRel(hi, tc.hi, unitTol) {
			t.Errorf("ParseRange(%q) = %g, %g, want %g, %g", tc.in, lo, hi, tc.lo, tc.hi)
		}
	}
	for _, tc := range []errCase{
		{"5", []string{"want LO:HI"}},
		{"1:2:3", []string{"want LO:HI"}},
		{"3:1", []string{"low end 3 is above high end 1"}},
		{"1mm:5furlong", []string{"high end", `unknown unit "furlong"`}},
		{":5", []string{"low end", "empty"}},
	} {
		_, _, err := ParseRange(tc.in, ParseLength)
		if err == nil {
			t.Errorf("ParseRange(%q) gave no error", tc.in)
			continue
		}
		for _, w := range tc.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("ParseRange(%q) error %q, want it to contain %q", tc.in, err, w)
			}
		}
	}
}

func TestFormat(t *testing.T) {
	for _, tc := range []struct {
		got, want string
	}{
		{FormatFrequency(4.58967e9, 5), "4.5897 GHz"},
		{FormatFrequency(5e9, 5), "5.0000 GHz"},
		{FormatFrequency(999.996e6, 5), "1.0000 GHz"}, // rounds up into the next unit
		{FormatFrequency(999.994e6, 5), "999.99 MHz"},
		{FormatFrequency(-1.5e3, 3), "-1.50 kHz"},
		{FormatFrequency(0.5, 2), "0.50 Hz"},
		{FormatFrequency(0, 5), "0 Hz"},
		{FormatFrequency(2e15, 3), "2000 THz"},
		{FormatFrequency(math.NaN(), 3), "NaN Hz"},
		{FormatFrequency(math.Inf(1), 3), "+Inf Hz"},
		{FormatLength(0.025, 4), "25.00 mm"},
		{FormatLength(0.0548016, 6), "54.8016 mm"},
		{FormatLength(6.6e-7, 2), "660 nm"},
		{FormatLength(2.09e-6, 3), "2.09 um"},
		{FormatLength(1.5, 3), "1.50 m"},
		{FormatLength(0, 3), "0 m"},
		{FormatSI(0.0184, "ohm", 3), "18.4 mohm"},
		{FormatSI(1.09e-8, "ohm", 3), "10.9 nohm"},
		{FormatSI(29351, "", 5), "29.351 k"},
		{FormatTemperature(293.15, 3), "20.0 C"},
		{FormatTemperature(333.15, 3), "60.0 C"},
		{FormatTemperature(223.15, 3), "-50.0 C"},
		{FormatTemperature(4.2, 3), "4.20 K"},
		{FormatTemperature(ZeroCelsius, 3), "0 C"},
	} {
		if tc.got != tc.want {
			t.Errorf("Format = %q, want %q", tc.got, tc.want)
		}
	}
}

// TestRoundTrip prints random values and parses them back. The values are
// log-uniform over many decades from a seeded source.
func TestRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for range 2000 {
		v := math.Pow(10, -12+30*rng.Float64())
		if rng.IntN(2) == 0 {
			v = -v
		}
		for _, p := range []struct {
			name   string
			format func(float64, int) string
			parse  func(string) (float64, error)
		}{
			{"Frequency", FormatFrequency, ParseFrequency},
			{"Length", FormatLength, ParseLength},
		} {
			s := p.format(v, roundTripDigits)
			got, err := p.parse(s)
			if err != nil {
				t.Fatalf("Parse%s(Format%s(%g)) = error %v (printed %q)", p.name, p.name, v, err, s)
			}
			if !closeRel(got, v, roundTripTol) {
				t.Errorf("Parse%s(Format%s(%g)) = %g (printed %q), want %g", p.name, p.name, v, got, s, v)
			}
		}
		k := 300 * rng.Float64()
		s := FormatTemperature(k, roundTripDigits)
		got, err := ParseTemperature(s)
		if err != nil || math.Abs(got-k) > kelvinRoundTripTol {
			t.Errorf("ParseTemperature(FormatTemperature(%g)) = %g, %v (printed %q), want %g", k, got, err, s, k)
		}
	}
}

// fuzzRoundTrip checks the fuzz properties shared by the parsers: no panic,
// finite on success, and a print-and-parse round trip.
func fuzzRoundTrip(t *testing.T, s string, parse func(string) (float64, error), format func(float64, int) string) {
	v, err := parse(s)
	if err != nil {
		if err.Error() == "" {
			t.Fatalf("parse(%q): empty error message", s)
		}
		return
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		t.Fatalf("parse(%q) = %g, want a finite value", s, v)
	}
	p := format(v, roundTripDigits)
	back, err := parse(p)
	if err != nil {
		t.Fatalf("parse(format(parse(%q))) failed on %q: %v", s, p, err)
	}
	// Subnormal values lose relative precision in the scaling; allow an
	// absolute 1e-300 there.
	if !closeRel(back, v, roundTripTol) && math.Abs(back-v) > 1e-300 {
		t.Fatalf("parse(format(%g)) = %g (printed %q), want %g", v, back, p, v)
	}
}

var fuzzSeeds = []string{
	"38mm", "38 MM", "1.5in", `2"`, "10mil", "0.4µm", "-3um", "400nm", "1", "0",
	"4.5897GHz", "1300 mhz", "10kHz", "0.3THz", "2.5e9", "-1e-3",
	"", " ", "NaN", "-Inf", "1e999", "1e-400mm", "0x1p3", "1_000", "5 furlong",
	"5 5mm", "e5", "+", "-", ".", "1e", "1e+", "..5", "µ", "1.7e308 GHz",
}

func FuzzParseLength(f *testing.F) {
	for _, s := range fuzzSeeds {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) { fuzzRoundTrip(t, s, ParseLength, FormatLength) })
}

func FuzzParseFrequency(f *testing.F) {
	for _, s := range fuzzSeeds {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) { fuzzRoundTrip(t, s, ParseFrequency, FormatFrequency) })
}

func FuzzParseTemperature(f *testing.F) {
	for _, s := range append(fuzzSeeds, "20C", "-20 °C", "68F", "4.2K", "-273.15C", "-459.67F") {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		v, err := ParseTemperature(s)
		if err != nil {
			return
		}
		if !(v >= 0) || math.IsInf(v, 0) {
			t.Fatalf("ParseTemperature(%q) = %g, want finite and >= 0 K", s, v)
		}
	})
}

func BenchmarkParseLength(b *testing.B) {
	for b.Loop() {
		if _, err := ParseLength("54.8016 mm"); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkParseFrequency(b *testing.B) {
	for b.Loop() {
		if _, err := ParseFrequency("4.5897GHz"); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkFormatFrequency(b *testing.B) {
	for b.Loop() {
		_ = FormatFrequency(4.58967e9, 5)
	}
}

// TestParseResistance checks the resistance units against their SI
// prefixes (exact powers of ten) and the common rules.
func TestParseResistance(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want float64
	}{
		{"10nohm", 10e-9}, {"10 nΩ", 10e-9}, {"10 nΩ", 10e-9}, {"0.02mohm", 0.02e-3},
		{"3 uohm", 3e-6}, {"3uOhm", 3e-6}, {"1e-8", 1e-8}, {"2 Ohm", 2}, {"0.02 mohm", 2e-5},
	} {
		if got, err := ParseResistance(tc.in); err != nil || !closeRel(got, tc.want, 1e-15) {
			t.Errorf("ParseResistance(%q) = %v, %v; want %v", tc.in, got, err, tc.want)
		}
	}
	for _, bad := range []string{"", "0x10", "1_0", "NaN", "5 furlong", "ohm", "nohm", "ten ohm", "1e999"} {
		if _, err := ParseResistance(bad); err == nil {
			t.Errorf("ParseResistance(%q) succeeded, want an error", bad)
		}
	}
}
