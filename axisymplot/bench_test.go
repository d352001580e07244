package axisymplot

import (
	"testing"

	"cylcav/axisym"
	"cylcav/cavity"
)

// BenchmarkFieldMap200 samples a 200 x 200 field map of the lowest TM0
// resonance of a three-section body (about 20 modes per section).
func BenchmarkFieldMap200(b *testing.B) {
	body := axisym.Body{Sections: []axisym.Section{
		{Length: 0.01, Radius: 0.01}, {Length: 0.02, Radius: 0.02}, {Length: 0.01, Radius: 0.01},
	}}
	r, err := axisym.Solve(body, axisym.Request{MaxFrequency: 7e9, Modes: 14, Losses: true, Families: []cavity.Family{cavity.TM}})
	if err != nil || len(r) == 0 || r[0].Loss == nil {
		b.Fatal(r, err)
	}
	for b.Loop() {
		if _, err := NewFieldMap(body, r[0].Loss, FieldMapOptions{Points: 200}); err != nil {
			b.Fatal(err)
		}
	}
}
