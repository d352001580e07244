package filter

import (
	"math"
	"testing"

	"cylcav/physics"
)

// TestScrewTunings checks the screw of each resonator by independent
// routes: Slater's small-sphere shift grows as r0^3 (Slater 1946; Harrington
// 1961 sec. 7.2, as recalled), so the returned radius must give a shift of
// magnitude Span to the cube-law accuracy; the screw of a TE011 cavity
// sits on the side wall near mid-length, where the magnetic wall field is
// largest and a boss raises the frequency; and Valid must follow the
// published limits written out here, r0/lambda <= 0.05 (lambda the free
// wavelength at f0) and r0 no more than 0.2 of the gap to the opposite
// wall, with lambda computed here from f0 and the fill.
func TestScrewTunings(t *testing.T) {
	d, r := tolDesign(t)
	var needs []TuningNeed
	for i := range r.Cavities {
		span := 0.6e6 * math.Pow(2, float64(i)) // 0.6 .. 19 MHz: both sides of the limits
		needs = append(needs, TuningNeed{Resonator: i + 1, Low: -span / 2, High: span / 2, Span: span})
	}
	st, err := ScrewTunings(r, needs)
	if err != nil {
		t.Fatal(err)
	}
	valid := map[bool]int{}
	for i, s := range st {
		valid[s.Valid]++
		c := r.Cavities[i].Cavity
		if !s.OnSide || math.Abs(s.At.Z-c.Length/2) > c.Length/8 || !(s.PerCube > 0) {
			t.Errorf("resonator %d: screw at %+v (side %v), shift per r0^3 %g: want the side wall near mid-length, raising f", i+1, s.At, s.OnSide, s.PerCube)
		}
		if d := math.Abs(math.Abs(s.Shift)-s.Span) / s.Span; d > 0.02 {
			t.Errorf("resonator %d: shift %g Hz at the returned radius, want the span %g Hz (difference %.2g)", i+1, s.Shift, s.Span, d)
		}
		lambda := physics.SpeedOfLight / (d.Spec.F0 * math.Sqrt(c.Fill.Eps()*c.Fill.Mu()))
		if d := math.Abs(s.RadiusOverWavelength - s.Radius/lambda); d > 1e-3*s.RadiusOverWavelength {
			t.Errorf("resonator %d: r0/lambda %g, want %g", i+1, s.RadiusOverWavelength, s.Radius/lambda)
		}
		gap := 2 * c.Radius // a boss on the side wall faces the opposite side wall
		want := s.Radius/lambda <= 0.05 && s.Radius/gap <= 0.2
		if s.Valid != want {
			t.Errorf("resonator %d: r0 = %g m, Valid %v, want %v (r0/lambda %.3g, r0/gap %.3g)", i+1, s.Radius, s.Valid, want, s.Radius/lambda, s.Radius/gap)
		}
	}
	if valid[true] == 0 || valid[false] == 0 {
		t.Errorf("the spans should give screws on both sides of the limits, got %v", valid)
	}
}
