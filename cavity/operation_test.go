package cavity

import (
	"errors"
	"math"
	"slices"
	"testing"
)

// bruteReach samples the dimensions of a cavity in operation densely and
// computes the clearance of every sample with Cavity.Clearance (a complete
// mode listing, no mode-chart algebra): machining errors over a grid of
// D in D0 +- dD and L in L0 +- dL, temperatures over TMin..TMax in the
// linear expansion model, and tuning over +-X of each sample's own
// frequency, the tuned length solved from the resonance formula
// (k (1 + t))^2 = kc^2 + (p pi / L)^2 (Pozar, Microwave Engineering, 4th
// ed., sec. 6.4). It returns the smallest clearance found, its mode, and
// the smallest distance of every mode that came within window of the
// wanted one (TM1mp filed under its companion TE0mp, as Reach does), with
// the modes seen on both sides of the wanted one (a crossing).
func bruteReach(t *testing.T, c Cavity, op Operation, n int, window float64) (float64, Mode, map[Mode]float64, map[Mode]bool) {
	t.Helper()
	w := op.Mode
	worst, worstMode := math.Inf(1), Mode{}
	near := map[Mode]float64{}
	side := map[Mode]int{}
	cross := map[Mode]bool{}
	grid := func(lo, hi float64, i, n int) float64 {
		if n == 1 {
			return lo
		}
		return lo + (hi-lo)*float64(i)/float64(n-1)
	}
	th := op.Thermal
	tLo, tHi := th.ref(), th.ref()
	if th.hasRange() {
		tLo, tHi = th.TMin, th.TMax
	}
	for i := range n {
		D := grid(c.Diameter()-op.DiameterTol, c.Diameter()+op.DiameterTol, i, n)
		for j := range n {
			L := grid(c.Length-op.LengthTol, c.Length+op.LengthTol, j, n)
			for k := range n {
				dT := grid(tLo, tHi, k, n) - th.ref()
				built := Cavity{Radius: D / 2 * (1 + th.AlphaRadial*dT), Length: L * (1 + th.AlphaAxial*dT)}
				kc, _, k0 := built.Wavenumbers(w)
				for l := range 4 * n {
					x := grid(-op.Tuning, op.Tuning, l, 4*n)
					kt := k0 * (1 + x)
					tuned := built
					if op.Tuning > 0 {
						tuned.Length = float64(w.P) * math.Pi / math.Sqrt(kt*kt-kc*kc)
					}
					cl, err := tuned.Clearance(w, ClearanceOptions{Window: window, CountDegenerate: op.CountDegenerate})
					if err != nil {
						t.Fatal(err)
					}
					if cl.Value < worst {
						worst, worstMode = cl.Value, cl.Limiting
					}
					for _, nb := range cl.InWindow {
						m := nb.Mode
						if comp, ok := m.Companion(); ok && m.Family == TM && comp != w {
							m = comp
						}
						if v, ok := near[m]; !ok || math.Abs(nb.Relative) < v {
							near[m] = math.Abs(nb.Relative)
						}
						s := 1
						if nb.Relative < 0 {
							s = 2
						}
						side[m] |= s
						if side[m] == 3 {
							cross[m] = true
						}
					}
				}
			}
		}
	}
	return worst, worstMode, near, cross
}

// TestReachBruteForce checks Cavity.Reach against a dense sampling of the
// dimensions (bruteReach), an independent route through the mode solver.
// The reach's worst case sits at a corner of the sample grid (machining,
// temperature and tuning extremes) unless a mode crosses, so without a
// crossing the two agree to rounding; a crossing mode must be seen on both
// sides of the wanted one among the samples, and the worst case is then 0.
func TestReachBruteForce(t *testing.T) {
	// agreeTol: the sampled worst case and Reach's differ only by the
	// rounding of the tuned lengths (a square root and a division).
	const agreeTol = 1e-9
	te011, tm010 := mustMode(t, "TE011"), mustMode(t, "TM010")
	for _, tc := range []struct {
		name string
		c    Cavity
		op   Operation
	}{
		{"issue example, tuning only", Cavity{Radius: 0.0422595 / 2, Length: 0.0298984}, Operation{Mode: te011, Tuning: 0.005, MinClearance: 0.07}},
		{"tuning, tolerance, temperature", Cavity{Radius: 0.0422595 / 2, Length: 0.0298984}, Operation{Mode: te011, Tuning: 0.004, DiameterTol: 30e-6, LengthTol: 50e-6,
			Thermal: Thermal{AlphaRadial: 23e-6, AlphaAxial: 1.3e-6, TMin: 253.15, TMax: 333.15}, MinClearance: 0.0725}},
		{"tolerance only, TM010", Cavity{Radius: 0.05, Length: 0.03}, Operation{Mode: tm010, DiameterTol: 0.2e-3, LengthTol: 0.5e-3, MinClearance: 0.6}},
		{"crossing", Cavity{Radius: 0.0198, Length: 0.0396}, Operation{Mode: te011, Tuning: 0.02, DiameterTol: 20e-6, LengthTol: 20e-6, MinClearance: 0.03}},
	} {
		r, err := tc.c.Reach(tc.op)
		if err != nil {
			t.Fatalf("%s: Reach error = %v", tc.name, err)
		}
		n := 5
		window := math.Max(tc.op.MinClearance, r.Worst) * 1.5
		worst, mode, near, cross := bruteReach(t, tc.c, tc.op, n, window)
		crossing := len(cross) > 0
		switch {
		case crossing:
			if r.Worst != 0 {
				t.Errorf("%s: Reach worst = %g, want 0 (the samples see %v cross)", tc.name, r.Worst, cross)
			}
		case math.Abs(worst-r.Worst) > agreeTol*r.Worst:
			t.Errorf("%s: Reach worst = %.12g (%v), want %.12g (%v) from dense sampling", tc.name, r.Worst, r.WorstMode, worst, mode)
		}
		// Offending modes: every mode the samples bring within the
		// requirement, and those seen on both sides, and no other.
		var want []Mode
		for m, v := range near {
			if cross[m] || v < tc.op.MinClearance*(1-agreeTol) {
				want = append(want, m)
			}
		}
		var got []Mode
		for _, o := range r.Offending {
			got = append(got, o.Mode)
			if o.Crosses != cross[o.Mode] {
				t.Errorf("%s: %v Crosses = %v, want %v from the samples", tc.name, o.Mode, o.Crosses, cross[o.Mode])
			}
			if v, ok := near[o.Mode]; ok && !o.Crosses && math.Abs(v-o.Clearance) > agreeTol*v {
				t.Errorf("%s: %v clearance = %.12g, want %.12g from the samples", tc.name, o.Mode, o.Clearance, v)
			}
		}
		slices.SortFunc(want, compareModes)
		slices.SortFunc(got, compareModes)
		if !slices.Equal(got, want) {
			t.Errorf("%s: offending modes = %v, want %v from dense sampling", tc.name, got, want)
		}
		if r.Meets() != (len(want) == 0) {
			t.Errorf("%s: Meets() = %v with offenders %v", tc.name, r.Meets(), want)
		}
		// The modes that tie for the worst case: every mode whose sampled
		// smallest distance is within TieClearance of the sampled worst,
		// in mode order, the first of them being WorstMode.
		if !crossing {
			var ties []Mode
			for m, v := range near {
				if v <= worst+TieClearance {
					ties = append(ties, m)
				}
			}
			slices.SortFunc(ties, compareModes)
			if !slices.Equal(r.WorstModes, ties) || r.WorstMode != ties[0] {
				t.Errorf("%s: WorstModes = %v (WorstMode %v), want %v from dense sampling", tc.name, r.WorstModes, r.WorstMode, ties)
			}
		}
	}
}

// TestReachMatchesOptimize: the optimiser's reported worst case is the
// reach of its design, and without tolerance it equals the maximum of the
// clearance envelope the optimiser computed along its own path (the
// exact optimum of the example, 7.231 % from design before and
// after the change).
func TestReachMatchesOptimize(t *testing.T) {
	const envTol = 1e-12 // two float routes to the same closed form
	d, err := Optimize(DesignSpec{Mode: mustMode(t, "TE011"), Frequency: 10e9, Tuning: 0.005, MinClearance: 0.07})
	if err != nil {
		t.Fatal(err)
	}
	if math.Round(1e5*d.WorstClearance) != 7231 {
		t.Errorf("worst clearance = %.6f %%, want 7.231 %% (the issue's example)", 100*d.WorstClearance)
	}
	p, err := newProblem(d.Spec)
	if err != nil {
		t.Fatal(err)
	}
	_, opt, err := p.envelope(p.path)
	if err != nil {
		t.Fatal(err)
	}
	if relErr(d.WorstClearance, opt.value) > envTol {
		t.Errorf("Reach worst = %.15g, optimiser's envelope maximum %.15g", d.WorstClearance, opt.value)
	}
	if !d.Reach.Meets() {
		t.Errorf("Reach(%v) does not meet 7 %%: %s", d.Cavity, d.Reach.Verdict())
	}
}

// TestReachErrors: tuning a mode an end plate does not tune is the
// EndPlateTuning verdict; bad tolerances and tuning are refused.
func TestReachErrors(t *testing.T) {
	c := Cavity{Radius: 0.05, Length: 0.03}
	tm010 := mustMode(t, "TM010")
	if _, err := c.Reach(Operation{Mode: tm010, Tuning: 0.01}); !errors.Is(err, ErrNotTunable) {
		t.Errorf("Reach(TM010, tuning) error = %v, want ErrNotTunable", err)
	}
	for _, op := range []Operation{
		{Mode: tm010, DiameterTol: -1e-6},
		{Mode: tm010, LengthTol: 0.003},
		{Mode: tm010, Tuning: 0.6},
		{Mode: tm010, MinClearance: 1},
		{Mode: mustMode(t, "TE011"), Tuning: 0.45},
	} {
		if _, err := c.Reach(op); err == nil {
			t.Errorf("Reach(%+v) error = nil, want one", op)
		}
	}
}

// TestEndPlateTuning checks the verdict against the resonance formula: a
// mode is tunable by an end plate exactly when its frequency changes with
// the length (Cavity.Frequency at two lengths).
func TestEndPlateTuning(t *testing.T) {
	for _, s := range []string{"TM010", "TM020", "TM110", "TM(3,2,0)", "TE011", "TM011", "TE111", "TE(0,1,5)"} {
		m := mustMode(t, s)
		a := Cavity{Radius: 0.04, Length: 0.03}.Frequency(m)
		b := Cavity{Radius: 0.04, Length: 0.06}.Frequency(m)
		tunes := a != b
		if err := m.EndPlateTuning(); (err == nil) != tunes {
			t.Errorf("%s: EndPlateTuning() = %v, but f(L = 30 mm) = %g Hz, f(L = 60 mm) = %g Hz", s, err, a, b)
		}
	}
}
