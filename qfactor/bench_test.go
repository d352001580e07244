package qfactor_test

import (
	"testing"

	"cylcav/cavity"
	"cylcav/qfactor"
)

// benchCavity and benchFmax give about 10^4 listed modes: a 100 mm by
// 80 mm copper cavity up to 46.5 GHz.
var (
	benchCavity = cavity.Cavity{Radius: 0.050, Length: 0.080}
	benchFmax   = 46.5e9
)

func benchModes(b *testing.B) []cavity.Resonance {
	res, err := benchCavity.Modes(benchFmax)
	if err != nil {
		b.Fatal(err)
	}
	return res
}

// BenchmarkUnloadedQAll computes Q_wall, Q_fill and Q0 of every mode below
// benchFmax with copper Rs evaluated at each mode's frequency.
func BenchmarkUnloadedQAll(b *testing.B) {
	res := benchModes(b)
	rs := func(f float64) (qfactor.SurfaceResistances, error) {
		return qfactor.Uniform(qfactor.SurfaceResistance(f, 5.8e7, 1)), nil
	}
	c := benchCavity
	c.Fill.TanDelta = 1e-4
	for b.Loop() {
		if _, err := qfactor.UnloadedQAll(c, res, rs); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(len(res)), "modes")
}

// BenchmarkModesAndQ includes the enumeration itself, the full cost of a
// mode table with Q columns.
func BenchmarkModesAndQ(b *testing.B) {
	rs := fixed(qfactor.Uniform(0.05))
	for b.Loop() {
		res, err := benchCavity.Modes(benchFmax)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := qfactor.UnloadedQAll(benchCavity, res, rs); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkWallQ(b *testing.B) {
	c := cavity.Cavity{Radius: 0.02, Length: 0.04}
	m := cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}
	rs := qfactor.SurfaceResistances{Side: 0.02, EndA: 0.02, EndB: 0.03}
	for b.Loop() {
		if _, err := qfactor.WallQ(c, m, rs); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkAcceleration(b *testing.B) {
	c := cavity.Cavity{Radius: 0.03825, Length: 0.050}
	m := cavity.Mode{Family: cavity.TM, N: 0, M: 1, P: 0}
	for b.Loop() {
		if _, err := qfactor.Acceleration(c, m, 1); err != nil {
			b.Fatal(err)
		}
	}
}
