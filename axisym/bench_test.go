package axisym

import (
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// fiveSections is an invented five-section body: beam-pipe stubs, noses and
// a cell, with a low-permittivity ring in the middle.
func fiveSections() Body {
	return Body{Sections: []Section{
		{Length: 0.012, Radius: 0.008},
		{Length: 0.006, Radius: 0.014},
		{Length: 0.020, Radius: 0.030, Fill: physics.Medium{EpsR: 2.1}},
		{Length: 0.006, Radius: 0.014},
		{Length: 0.012, Radius: 0.008},
	}}
}

// BenchmarkFiveLowest solves the five lowest n = 0 resonances (TM0) of a
// five-section body with the default mode count and its convergence
// estimate (two models: 40 and 60 modes in the widest section).
func BenchmarkFiveLowest(b *testing.B) {
	body := fiveSections()
	for b.Loop() {
		r, err := Solve(body, Request{MaxFrequency: 10e9, Families: []cavity.Family{cavity.TM}})
		if err != nil || len(r) < 5 {
			b.Fatal(len(r), err)
		}
	}
}
