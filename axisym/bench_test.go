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

// BenchmarkIrisPairCoupling solves the TE0 pair of two TE011 cells joined
// by a thick iris (default modes, with the smaller model) and its coupling
// coefficient.
func BenchmarkIrisPairCoupling(b *testing.B) {
	body := irisPair(0.040, 0.020, 0.006, 0.002)
	for b.Loop() {
		r, err := Solve(body, Request{MaxFrequency: 10.5e9, Families: []cavity.Family{cavity.TE}})
		if err != nil || len(r) != 2 {
			b.Fatal(len(r), err)
		}
		if _, err := CouplingOf(r[0], r[1]); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkFiveLowestExtrapolated extrapolates the TM0 resonances of the
// five-section body below 10 GHz from 40, 80 and 160 modes in the widest
// section (Extrapolate).
func BenchmarkFiveLowestExtrapolated(b *testing.B) {
	body := fiveSections()
	for b.Loop() {
		r, err := Extrapolate(body, cavity.TM, 10e9, DefaultModes)
		if err != nil || len(r) < 5 {
			b.Fatal(len(r), err)
		}
	}
}

// BenchmarkPortQ finds the complex resonant frequency and external Q of
// the TE011-like resonance of a cavity fed through a centred iris from a
// circular waveguide (PortQ, default modes, Muller from 9.88 GHz).
func BenchmarkPortQ(b *testing.B) {
	body := fedCell(0.010, 0.002)
	for b.Loop() {
		if _, _, err := PortQ(body, cavity.TE, 9.88e9, 0); err != nil {
			b.Fatal(err)
		}
	}
}
