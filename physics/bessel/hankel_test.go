package bessel

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestHankel01 compares hankel01 with math.J0, J1, Y0 and Y1 on seeded
// random arguments from hankelMin to 1e6, relative to the amplitude
// sqrt(2/(π t)): both are accurate to some units of 1e-16 of it.
func TestHankel01(t *testing.T) {
	const tol = 2e-15
	rng := rand.New(rand.NewPCG(20261204, 3))
	var worst float64
	for i := range 20000 {
		x := hankelMin * math.Exp(rng.Float64()*math.Log(1e6/hankelMin))
		if i == 0 {
			x = hankelMin
		}
		j0, j1, y0, y1 := hankel01(x)
		amp := math.Sqrt(2 / (math.Pi * x))
		for _, c := range []struct {
			name      string
			got, want float64
		}{
			{"J0", j0, math.J0(x)}, {"J1", j1, math.J1(x)}, {"Y0", y0, math.Y0(x)}, {"Y1", y1, math.Y1(x)},
		} {
			e := math.Abs(c.got-c.want) / amp
			worst = math.Max(worst, e)
			if e > tol {
				t.Errorf("hankel01(%v): %s = %.17g, want %.17g (math.%s)", x, c.name, c.got, c.want, c.name)
			}
		}
	}
	t.Logf("largest difference from the math package: %.3g of the amplitude", worst)
}
