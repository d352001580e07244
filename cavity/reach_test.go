package cavity

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"testing"
)

// TestOptimizeWideTuning: a tuning range whose finite-length limit lies
// inside the allowed D/L range (for TE011 above about 2.0 %, derived from
// s > a0 (1/(1-X)^2 - 1) with a0 = 4 j'_{01}^2 / pi^2 and s = 0.25) must
// still give a design, not fail on listing an endless cylinder. The tuned
// lengths are checked by an independent route: the resonance formula
// (Cavity.Frequency) at each end of the tuning path.
func TestOptimizeWideTuning(t *testing.T) {
	w := mustMode(t, "TE011")
	const f = 10e9
	// tunedTol: the tuned lengths come from the chart's closed form, whose
	// s is rounded near the MinDesignRatio limit; 1e-9 is far below any
	// machining tolerance.
	const tunedTol = 1e-9
	for _, x := range []float64{0.03, 0.05, 0.2, 0.3} {
		d, err := Optimize(DesignSpec{Mode: w, Frequency: f, Tuning: x})
		if err != nil {
			t.Errorf("Optimize(TE011, 10 GHz, tuning +-%g) error = %v, want a design", x, err)
			continue
		}
		a, err := Analyze(d, AnalysisSettings{CurvePoints: 2})
		if err != nil {
			t.Errorf("Analyze(TE011, 10 GHz, tuning +-%g) error = %v", x, err)
			continue
		}
		for i, want := range []float64{f * (1 - x), f * (1 + x)} {
			c := d.Cavity
			c.Length = a.TunedLength[i]
			if got := c.Frequency(w); math.Abs(got-want) > tunedTol*want {
				t.Errorf("tuning +-%g: Frequency(L = %g m) = %.12g Hz, want %.12g Hz", x, c.Length, got, want)
			}
			if r := c.Diameter() / c.Length; r < MinDesignRatio*(1-tunedTol) {
				t.Errorf("tuning +-%g: tuned D/L = %g, want >= %g", x, r, MinDesignRatio)
			}
		}
	}
	// Beyond the range: an InfeasibleError, not a listing failure.
	_, err := Optimize(DesignSpec{Mode: w, Frequency: f, Tuning: 0.45})
	if !errors.Is(err, ErrInfeasible) {
		t.Errorf("Optimize(TE011, tuning +-45 %%) error = %v, want ErrInfeasible", err)
	}
}

// TestChartReach: a wanted mode with more than MaxChartModes modes near it
// is refused with an error naming the limit (before listing millions of
// modes), by Optimize and by Tune alike; a low-order mode is not.
func TestChartReach(t *testing.T) {
	for _, s := range []string{"TE(0,1,100)", "TE(50,50,50)", "TM(0,30,0)"} {
		w := mustMode(t, s)
		_, err := Optimize(DesignSpec{Mode: w, Frequency: 10e9})
		if err == nil || errors.Is(err, ErrInfeasible) || !strings.Contains(err.Error(), strconv.Itoa(MaxChartModes)) {
			t.Errorf("Optimize(%s) error = %v, want the MaxChartModes limit", s, err)
		}
		c := Cavity{Radius: 0.5}
		if w.P == 0 {
			if _, err := c.Tune(w, 0.5, 2, 4, false); !errors.Is(err, ErrNotTunable) {
				t.Errorf("Tune(%s) error = %v, want ErrNotTunable", s, err)
			}
			continue
		}
		if _, err := c.Tune(w, 0.5, 2, 4, false); err == nil || !strings.Contains(err.Error(), strconv.Itoa(MaxChartModes)) {
			t.Errorf("Tune(%s) error = %v, want the MaxChartModes limit", s, err)
		}
	}
	if _, err := Optimize(DesignSpec{Mode: mustMode(t, "TE(5,5,5)"), Frequency: 10e9}); err != nil {
		t.Errorf("Optimize(TE(5,5,5)) error = %v, want a design", err)
	}
}

// TestTuneRatioReach: a length range that takes D/L outside
// MinDesignRatio..MaxDesignRatio is an error naming that range.
func TestTuneRatioReach(t *testing.T) {
	c := Cavity{Radius: 0.02}
	w := mustMode(t, "TE011")
	for _, l := range [][2]float64{{1e-6, 0.03}, {0.03, 1000}, {1e-6, 1000}} {
		_, err := c.Tune(w, l[0], l[1], 4, false)
		if err == nil || !strings.Contains(err.Error(), "D/L over the tuning range") {
			t.Errorf("Tune(D = 40 mm, L %g..%g m) error = %v, want the D/L range error", l[0], l[1], err)
		}
	}
	if _, err := c.Tune(w, 0.028, 0.032, 4, false); err != nil {
		t.Errorf("Tune(D = 40 mm, L 28..32 mm) error = %v, want none", err)
	}
}
