package bessel_test

import (
	"fmt"
	"math"

	"cylcav/physics/bessel"
)

func ExampleJZeros() {
	// The first three zeros of J_0: the TM01, TM02 and TM03 modes of a
	// circular guide.
	for _, x := range bessel.JZeros(0, 3) {
		fmt.Printf("%.6f\n", x)
	}
	// Output:
	// 2.404826
	// 5.520078
	// 8.653728
}

func ExampleJPrimeZeros() {
	// The first two zeros of J'_1; x = 0 does not count.
	fmt.Printf("%.6f\n", bessel.JPrimeZeros(1, 2))
	// Output:
	// [1.841184 5.331443]
}

func ExampleZeros() {
	// Cutoff frequencies f = c j / (2 pi a) of the lowest TE and TM modes
	// of an invented air-filled circular guide of radius a = 12 mm.
	const (
		c = 299792458.0 // speed of light in vacuum, m/s (exact, SI)
		a = 0.012       // radius, m
	)
	j, jp := bessel.Zeros(1, 1)
	fmt.Printf("TE11 cutoff %.3f GHz (j'_11 = %.4f)\n", c*jp[0]/(2*math.Pi*a)/1e9, jp[0])
	fmt.Printf("TM11 cutoff %.3f GHz (j_11 = %.4f)\n", c*j[0]/(2*math.Pi*a)/1e9, j[0])
	// Output:
	// TE11 cutoff 7.321 GHz (j'_11 = 1.8412)
	// TM11 cutoff 15.235 GHz (j_11 = 3.8317)
}

func ExampleCrossZeros() {
	// Cutoff frequencies f = c x / (2 pi a) of the lowest modes of an
	// invented air-filled coaxial line, inner radius a = 3 mm, outer
	// radius b = 7 mm. The TEM mode (cutoff 0) is not a root.
	const (
		c = 299792458.0 // speed of light in vacuum, m/s (exact, SI)
		a = 0.003       // inner radius, m
		b = 0.007       // outer radius, m
	)
	te := bessel.CrossPrimeZeros(1, b/a, 1)
	tm := bessel.CrossZeros(0, b/a, 1)
	fmt.Printf("TE11 cutoff %.3f GHz (x = %.5f)\n", c*te[0]/(2*math.Pi*a)/1e9, te[0])
	fmt.Printf("TM01 cutoff %.3f GHz (x = %.5f)\n", c*tm[0]/(2*math.Pi*a)/1e9, tm[0])
	// Output:
	// TE11 cutoff 9.745 GHz (x = 0.61272)
	// TM01 cutoff 37.148 GHz (x = 2.33569)
}

func ExampleCrossPrimeZeros() {
	// TE roots of order 0 are the TM roots of order 1 (J'_0 = -J_1).
	fmt.Printf("%.6f\n", bessel.CrossPrimeZeros(0, 2, 3))
	fmt.Printf("%.6f\n", bessel.CrossZeros(1, 2, 3))
	// Output:
	// [3.196578 6.312350 9.444465]
	// [3.196578 6.312350 9.444465]
}
