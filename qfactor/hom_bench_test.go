package qfactor

import (
	"testing"

	"cylcav/physics"
)

// BenchmarkHOMTable lists the monopole and dipole modes of a 1.3 GHz
// niobium pillbox up to 10 GHz at 2 K (about 90 modes), as
// `cylcav design --hom-max 10GHz` does.
func BenchmarkHOMTable(b *testing.B) {
	c, _ := pillbox13()
	nb, _ := physics.LookupConductor("niobium")
	bcs := NiobiumBCS()
	w := SameWalls(Surface{Conductor: nb, Temperature: 2, Superconductor: &bcs})
	o := HOMOptions{Speed: 1, MaxFrequency: 10e9, Walls: w, Bunch: 650e6}
	for i := 0; i < b.N; i++ {
		if _, err := HOMTable(c, o); err != nil {
			b.Fatal(err)
		}
	}
}
