package physics_test

import (
	"fmt"

	"cylcav/physics"
)

// A designer types the size of an invented test cavity in millimetres and
// inches; the library works in metres.
func ExampleParseLength() {
	for _, s := range []string{"54.8 mm", "2.157in", "0.4 um"} {
		m, err := physics.ParseLength(s)
		if err != nil {
			fmt.Println(err)
			continue
		}
		fmt.Printf("%s = %.6g m\n", s, m)
	}
	_, err := physics.ParseLength("5 furlong")
	fmt.Println(err)
	// Output:
	// 54.8 mm = 0.0548 m
	// 2.157in = 0.0547878 m
	// 0.4 um = 4e-07 m
	// invalid length "5 furlong": unknown unit "furlong"; use m, cm, mm, um, nm, in or mil
}

func ExampleFormatFrequency() {
	fmt.Println(physics.FormatFrequency(4.589664e9, 5))
	fmt.Println(physics.FormatFrequency(915e6, 4))
	fmt.Println(physics.FormatLength(6.6e-7, 2), physics.FormatLength(0.025, 4))
	// Output:
	// 4.5897 GHz
	// 915.0 MHz
	// 660 nm 25.00 mm
}

func ExampleParseRange() {
	lo, hi, err := physics.ParseRange("-20C:60C", physics.ParseTemperature)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.2f K to %.2f K\n", lo, hi)
	// Output:
	// 253.15 K to 333.15 K
}

// An invented workshop measured its 6061 stock at 41 % IACS.
func ExampleParseConductor() {
	c, err := physics.ParseConductor("al6061,iacs=41%")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s: %.4g S/m, alpha %.3g 1/K\n", c.Name, c.Conductivity, c.Alpha)
	_, err = physics.ParseConductor("sigma=-5")
	fmt.Println(err)
	// Output:
	// al6061-t6: 2.378e+07 S/m, alpha 0.00291 1/K
	// conductor: sigma must be between 1000 and 1e+12 S/m, got -5 S/m
}
