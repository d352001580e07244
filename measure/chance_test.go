package measure

import (
	"math"
	"testing"

	"cylcav/cavity"
)

// TestChanceMatches checks the formula on a hand-made case: resonances at
// 9 and 11 GHz with tol 0.003 widen to [9/1.06, 11*1.06] GHz, whose log
// width is ln(11*1.06^2/9); three model frequencies inside it and one far
// outside give Chance = 2 * 2 * 0.003 * 3 / that width (worked by hand).
func TestChanceMatches(t *testing.T) {
	const tol = 0.003
	got := chanceMatches([]float64{9e9, 11e9}, []float64{8.6e9, 10e9, 11.5e9, 30e9}, tol)
	want := 2 * 2 * tol * 3 / math.Log(11*1.06*1.06/9)
	if math.Abs(got-want) > 1e-12*want {
		t.Errorf("chanceMatches = %.15g, want %.15g", got, want)
	}
}

// TestByChance: the resonances of a 40 x 31 mm cavity (package cavity's
// closed forms) named with the right drawing are not a chance naming;
// named with a drawing 20 times too wide (a unit slip) they are, though
// every resonance then "matches" some mode of the dense spectrum.
func TestByChance(t *testing.T) {
	truth := cavity.Cavity{Radius: 0.02, Length: 0.031}
	var f0, q0 []float64
	for _, name := range []string{"TM010", "TM011", "TE111", "TM110", "TM012", "TE112", "TE011", "TE211"} {
		m, err := cavity.ParseMode(name)
		if err != nil {
			t.Fatal(err)
		}
		f0, q0 = append(f0, truth.Frequency(m)), append(q0, math.NaN())
	}
	for _, tc := range []struct {
		radius float64
		want   bool
	}{{0.02, false}, {0.4, true}} {
		id, err := Identify(f0, q0, IdentifySettings{Nominal: cavity.Cavity{Radius: tc.radius, Length: 0.031}})
		if err != nil {
			t.Fatal(err)
		}
		if id.ByChance() != tc.want {
			t.Errorf("drawn radius %g m: ByChance = %v (Chance %.2g of %d), want %v", tc.radius, id.ByChance(), id.Chance, len(f0), tc.want)
		}
	}
}
