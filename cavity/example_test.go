package cavity_test

import (
	"fmt"

	"cylcav/cavity"
	"cylcav/physics"
)

// The sixth to ninth lowest modes of an invented air-filled test cavity,
// 50 mm in diameter and 50 mm long. TE011 and TM111 coincide exactly and
// are listed together, TE first.
func ExampleCavity_Lowest() {
	c := cavity.Cavity{Radius: 0.025, Length: 0.05}
	modes, err := c.Lowest(9)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, r := range modes[5:] {
		fmt.Printf("%v %.4f GHz x%d", r.Mode, r.Frequency/1e9, r.Degeneracy())
		if m, ok := r.Companion(); ok {
			fmt.Print(" degenerate with ", m)
		}
		fmt.Println()
	}
	// Output:
	// TM110 7.3130 GHz x2
	// TM012 7.5509 GHz x1
	// TE011 7.9036 GHz x1 degenerate with TM111
	// TM111 7.9036 GHz x2 degenerate with TE011
}

// All modes up to 6 GHz of an invented ceramic-filled pill box (checked
// with mpmath: TM010 3.0544 GHz, TM110 4.8667 GHz; the lowest TE mode,
// TE111, is at 8.316 GHz).
func ExampleCavity_Modes() {
	c := cavity.Cavity{Radius: 0.012, Length: 0.006, Fill: physics.Medium{EpsR: 9.8}}
	modes, err := c.Modes(6e9)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, r := range modes {
		fmt.Printf("%v %.3f GHz\n", r.Mode, r.Frequency/1e9)
	}
	// Output:
	// TM010 3.054 GHz
	// TM110 4.867 GHz
}

// Sizing the TE011 mode of an invented 11.2 GHz reference cavity with
// D/L = 1.2, and the error when the diameter is too small (values checked
// with mpmath: D = 36.3836 mm, L = 30.3197 mm, least diameter 32.6471 mm).
func ExampleSize() {
	te011, _ := cavity.ParseMode("TE011")
	c, err := cavity.Size(te011, 11.2e9, physics.Medium{}, cavity.ByRatio(1.2))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("D = %.2f mm, L = %.2f mm\n", c.Diameter()*1e3, c.Length*1e3)
	_, err = cavity.Size(te011, 11.2e9, physics.Medium{}, cavity.ByDiameter(0.03))
	fmt.Println(err)
	// Output:
	// D = 36.38 mm, L = 30.32 mm
	// cavity: diameter 30 mm is too small for TE011 at 11.2 GHz: the mode is cut off; the diameter must exceed 32.6471 mm
}

func ExampleParseMode() {
	for _, s := range []string{"TE011", "tm(12,3,0)", "TE010"} {
		m, err := cavity.ParseMode(s)
		if err != nil {
			fmt.Println(err)
			continue
		}
		fmt.Println(m, m.Degeneracy())
	}
	// Output:
	// TE011 1
	// TM(12,3,0) 2
	// invalid mode "TE010": TE modes need p >= 1; did you mean TE011 or TM010?
}

func ExampleAnalyze() {
	// The optimum first, then its analysis: an invented 12 GHz TE011
	// cavity tunable by +-1 %, machined to +-0.01 mm.
	m, _ := cavity.ParseMode("TE011")
	d, err := cavity.Optimize(cavity.DesignSpec{Mode: m, Frequency: 12e9, Tuning: 0.01})
	if err != nil {
		fmt.Println(err)
		return
	}
	a, err := cavity.Analyze(d, cavity.AnalysisSettings{
		Tolerance: cavity.Tolerance{Diameter: 10e-6, Length: 10e-6, Samples: 20000, Seed: 1},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("D = %.3f mm, L = %.3f mm\n", 1e3*d.Cavity.Diameter(), 1e3*d.Cavity.Length)
	fmt.Printf("tuned L %.3f..%.3f mm, df/dL = %.1f MHz/mm\n", 1e3*a.TunedLength[1], 1e3*a.TunedLength[0], a.Sensitivity.DfDL*1e-9)
	fmt.Printf("machining spread: std %.1f MHz\n", a.Spread.Std*1e-6)
	// Output:
	// D = 35.377 mm, L = 24.586 mm
	// tuned L 23.682..25.593 mm, df/dL = -126.0 MHz/mm
	// machining spread: std 0.9 MHz
}
