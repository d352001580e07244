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
