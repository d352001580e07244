package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// TestEdgeAgainstDefault solves a set of invented stepped bodies (a thin
// iris, a small hole, dielectric on either side of a step, a high
// permittivity, many resonances) by both paths: the lists have the same
// length (both counts are exact for their models), every edge-path
// frequency lies within its estimate of a larger model (18 functions per
// junction, 240 dynamic and 6400 static modes per unit R/a), and every edge-path
// frequency lies within three times the default path's change (its
// order-2 truncation error) plus 1e-9 of the default frequency.
func TestEdgeAgainstDefault(t *testing.T) {
	if testing.Short() {
		t.Skip("default path with 120 modes")
	}
	bodies := []struct {
		name string
		b    Body
		fmax float64
	}{
		{"thin iris", irisPair(0.040, 0.020, 0.006, 0.0002), 12e9},
		{"small hole", irisPair(0.030, 0.020, 0.002, 0.001), 12e9},
		{"dielectric narrow", Body{Sections: []Section{
			{Length: 0.01, Radius: 0.006, Fill: physics.Medium{EpsR: 10}},
			{Length: 0.02, Radius: 0.02},
			{Length: 0.005, Radius: 0.012, Fill: physics.Medium{EpsR: 3}},
		}}, 15e9},
		{"many", fiveSections(), 20e9},
	}
	for _, c := range bodies {
		for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
			edge, err := Solve(c.b, Request{MaxFrequency: c.fmax, Families: []cavity.Family{fam}, EdgeBasis: true})
			if err != nil {
				t.Fatal(c.name, err)
			}
			def, err := Solve(c.b, Request{MaxFrequency: c.fmax, Families: []cavity.Family{fam}, Modes: 80})
			if err != nil {
				t.Fatal(c.name, err)
			}
			if len(edge) != len(def) {
				t.Errorf("%s %v0: %d resonances by the edge path, %d by the default", c.name, fam, len(edge), len(def))
				continue
			}
			ref, err := edgeResonances(c.b, fam, c.fmax, edgeOpts{k: 18, dyn: 240, static: 6400})
			if err != nil || len(ref) != len(edge) {
				t.Fatal(c.name, ref, err)
			}
			worst, worstEst, worstRef := 0.0, 0.0, 0.0
			for i, e := range edge {
				d := math.Abs(e.Frequency - def[i].Frequency)
				worst = max(worst, d/e.Frequency)
				worstEst = max(worstEst, e.Change/e.Frequency)
				er := math.Abs(e.Frequency - ref[i])
				worstRef = max(worstRef, er/e.Frequency)
				if er > e.Change {
					t.Errorf("%s %v0 #%d: error %.3g Hz against a model with 18 functions exceeds the estimate %.3g Hz", c.name, fam, i+1, er, e.Change)
				}
				if !e.EdgeBasis || d > 3*def[i].Change+1e-9*e.Frequency {
					t.Errorf("%s %v0 #%d: edge %.12g Hz (change %.2g), default %.12g Hz (change %.3g)", c.name, fam, i+1, e.Frequency, e.Change, def[i].Frequency, def[i].Change)
				}
			}
			t.Logf("%s %v0: %d resonances, largest difference from the default %.2g, largest edge estimate %.2g, largest error against the large model %.2g", c.name, fam, len(edge), worst, worstEst, worstRef)
		}
	}
}
