package figure

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/plot/vg"
)

// TestFrequencyUnit checks the axis unit at and around each SI prefix step
// (BIPM, The International System of Units, 9th ed., Table 7: k = 1e3,
// M = 1e6, G = 1e9).
func TestFrequencyUnit(t *testing.T) {
	for _, c := range []struct {
		f     float64
		scale float64
		name  string
	}{
		{0, 1, "Hz"}, {math.NaN(), 1, "Hz"}, {999, 1, "Hz"},
		{1e3, 1e3, "kHz"}, {999e3, 1e3, "kHz"},
		{1e6, 1e6, "MHz"}, {915e6, 1e6, "MHz"},
		{1e9, 1e9, "GHz"}, {24e9, 1e9, "GHz"}, {3e12, 1e9, "GHz"},
	} {
		scale, name := FrequencyUnit(c.f)
		if scale != c.scale || name != c.name {
			t.Errorf("FrequencyUnit(%g) = %g, %q, want %g, %q", c.f, scale, name, c.scale, c.name)
		}
	}
}

// TestTicks checks the nice-number ticks (Heckbert 1990): majors are
// multiples of a 1-2-5 step inside the range, labelled, and about N of
// them; minors lie between them.
func TestTicks(t *testing.T) {
	for _, c := range []struct {
		min, max float64
		step     float64 // hand-computed from Heckbert's rules
	}{
		{0, 9, 2},         // 9/6 = 1.5, not below 1.5, so 2
		{0, 100, 20},      // 100/6 = 16.7 -> 2 x 10
		{0.25, 9, 1},      // 8.75/6 = 1.46 -> 1
		{1800, 4000, 500}, // 2200/6 = 367 -> 5 x 100
		{-0.3, 0.7, 0.2},  // 1/6 = 0.167 -> 2 x 0.1
	} {
		// Tick values are built as multiples of the step, so they carry a
		// few roundings: tickEdgeTol (absolute, for ranges of order 1 to
		// 4000) at the range ends and tickStepTol (relative) in the step.
		const tickEdgeTol, tickStepTol = 1e-12, 1e-9
		ticks := Ticks{}.Ticks(c.min, c.max)
		var majors []float64
		for _, tk := range ticks {
			if tk.Value < c.min-tickEdgeTol || tk.Value > c.max+tickEdgeTol {
				t.Errorf("Ticks(%g, %g): tick %g outside the range", c.min, c.max, tk.Value)
			}
			if tk.Label != "" {
				majors = append(majors, tk.Value)
			}
		}
		if len(majors) < 3 || len(majors) > 11 {
			t.Errorf("Ticks(%g, %g): %d major ticks, want 3..11", c.min, c.max, len(majors))
		}
		for i := 1; i < len(majors); i++ {
			if d := majors[i] - majors[i-1]; math.Abs(d-c.step) > tickStepTol*c.step {
				t.Errorf("Ticks(%g, %g): step %g, want %g", c.min, c.max, d, c.step)
			}
		}
	}
	if got := (Ticks{}).Ticks(1, 1); got != nil {
		t.Errorf("Ticks(1, 1) = %v, want none", got)
	}
}

func fmtDashes(d []vg.Length) string { return fmt.Sprint(d) }

func TestRegionContract(t *testing.T) {
	if _, err := NewRegion(0, 1, 0, math.Inf(1)); err == nil {
		t.Error("NewRegion with Inf: no error")
	}
	if _, err := NewRegion(2, 1, 0, 1); err == nil {
		t.Error("NewRegion with xmin > xmax: no error")
	}
	r, err := NewRegion(0, 1, 2, 3)
	if err != nil {
		t.Fatal(err)
	}
	if x0, x1, y0, y1 := r.DataRange(); x0 != 0 || x1 != 1 || y0 != 2 || y1 != 3 {
		t.Errorf("Region.DataRange = %g %g %g %g, want 0 1 2 3", x0, x1, y0, y1)
	}
	r.NoRange = true
	if x0, x1, _, _ := r.DataRange(); !math.IsInf(x0, 1) || !math.IsInf(x1, -1) {
		t.Errorf("Region.DataRange with NoRange = %g..%g, want an empty range", x0, x1)
	}
}

// TestSeriesStylesDistinct checks that the six series styles differ in
// dash pattern or in width and lightness, so they stay apart in greyscale.
func TestSeriesStylesDistinct(t *testing.T) {
	th := DefaultTheme()
	type key struct {
		dash string
		grey uint8
	}
	seen := map[key]int{}
	for i := 0; i < 6; i++ {
		s := th.Series(i)
		r, g, b, _ := s.Color.RGBA()
		// ITU-R BT.601 luma, the usual greyscale conversion.
		y := uint8((299*r + 587*g + 114*b) / 1000 >> 8)
		k := key{dash: fmt.Sprint(s.Dashes), grey: y / 32}
		if j, dup := seen[k]; dup {
			t.Errorf("series %d and %d look alike in greyscale (dash %q, grey band %d)", j, i, k.dash, k.grey)
		}
		seen[k] = i
	}
	// Each dash constructor returns a fresh slice.
	a, b := Dashed(), Dashed()
	a[0] = 0
	if b[0] != vg.Points(5) {
		t.Error("Dashed returns a shared slice")
	}
}

// TestRuns checks the split of a curve at missing values: runs {1,2} and
// {6,7} of the polyline below; the lone point 4 between two gaps is
// dropped, and the scale applies before the finiteness test.
func TestRuns(t *testing.T) {
	xs := []float64{1, 2, 3, 4, 5, 6, 7}
	ys := []float64{1, 2, math.NaN(), 4, math.Inf(1), 6, 7}
	rs, err := Runs(xs, ys, 10)
	if err != nil {
		t.Fatal(err)
	}
	if len(rs) != 2 || len(rs[0]) != 2 || len(rs[1]) != 2 || rs[0][0].X != 1 || rs[1][0].X != 6 || rs[1][1].Y != 70 {
		t.Errorf("Runs = %v, want [[{1 10} {2 20}] [{6 60} {7 70}]]", rs)
	}
	if rs, err := Runs([]float64{1, 2}, []float64{1e308, 1e308}, 10); err != nil || len(rs) != 0 {
		t.Errorf("Runs of values that overflow when scaled = %v, %v; want none", rs, err)
	}
	if _, err := Runs([]float64{1, 2}, []float64{1}, 1); err == nil {
		t.Error("Runs with 2 x and 1 y: no error")
	}
}
