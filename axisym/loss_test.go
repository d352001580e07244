package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/qfactor"
)

// gTol is the agreement required between the geometry factors from the
// matched fields of a one-section body and the closed forms of package
// qfactor (Harrington 1961 ch. 5; Pozar 2012 sec. 6.4): the quadrature
// along z is exact to rounding for these fields.
const gTol = 1e-10

// TestOneSectionQ is the Q part of test group 1: a one-section body's
// geometry factors (side wall, each end plate) equal qfactor's closed forms
// for every n = 0 mode below the limit.
func TestOneSectionQ(t *testing.T) {
	c := cavity.Cavity{Radius: 0.02, Length: 0.03, Fill: physics.Medium{EpsR: 2.1}}
	fmax := 4 * c.Frequency(cavity.Mode{Family: cavity.TM, M: 1})
	b := Body{Sections: []Section{{Length: c.Length, Radius: c.Radius, Fill: c.Fill}}}
	got, err := Solve(b, Request{MaxFrequency: fmax, Modes: 6, Losses: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(got) < 8 {
		t.Fatalf("only %d resonances", len(got))
	}
	for _, r := range got {
		if r.Loss == nil {
			t.Fatalf("%v: no loss: %v", r.Origin, r.LossErr)
		}
		want, err := qfactor.GeometryFactors(c, r.Origin)
		if err != nil {
			t.Fatal(err)
		}
		for _, f := range r.Loss.Factors {
			var w float64
			switch f.Part.Kind {
			case Side:
				w = want.Side
			case EndA:
				w = want.EndA
			case EndB:
				w = want.EndB
			default:
				t.Fatalf("unexpected part %v", f.Part)
			}
			if d := math.Abs(f.G-w) / w; d > gTol {
				t.Errorf("%v: G(%v) = %.15g ohm, want %.15g ohm (qfactor closed form)", r.Origin, f.Part.Kind, f.G, w)
			}
		}
		if d := math.Abs(r.Loss.ElectricShareJ/r.Loss.StoredEnergyJ - 0.5); d > gTol {
			t.Errorf("%v: W_e/W = %.15g, want 1/2", r.Origin, r.Loss.ElectricShareJ/r.Loss.StoredEnergyJ)
		}
	}
}
