package design_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"cylcav/cavity"
	"cylcav/design"
	"cylcav/physics"
)

func mustMode(t *testing.T, s string) cavity.Mode {
	t.Helper()
	m, err := cavity.ParseMode(s)
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// TestDemoRun: the demo scenario is library data and runs through the
// library alone, giving the Q breakdown, the tolerance spread and the
// design's own cautions (the outputs add the general RF caution).
func TestDemoRun(t *testing.T) {
	s, err := design.Demo()
	if err != nil {
		t.Fatal(err)
	}
	if s.Title == "" || s.Wall == nil || !s.TempGiven || s.Settings.Tolerance.Samples == 0 {
		t.Fatalf("Demo() = %+v, want a titled scenario with a wall, a temperature range and a tolerance", s)
	}
	r, err := s.Run(nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Unloaded == nil || r.Analysis.Spread == nil || len(r.Cautions) == 0 {
		t.Errorf("Demo().Run = %+v, want Q breakdown, spread and cautions", r)
	}
	for _, c := range r.Cautions {
		if strings.Contains(strings.ToLower(c), "high rf power") {
			t.Errorf("Demo().Run cautions include the general RF caution %q", c)
		}
	}
}

// TestRunIsOptimizeThenAnalyze: Run gives the optimum of cavity.Optimize
// and the analysis of cavity.Analyze for its spec, with Q0 from the wall.
func TestRunIsOptimizeThenAnalyze(t *testing.T) {
	cu, err := physics.LookupConductor("copper")
	if err != nil {
		t.Fatal(err)
	}
	s := design.Scenario{
		Spec:     cavity.DesignSpec{Mode: mustMode(t, "TE011"), Frequency: 10e9, Tuning: 0.01},
		Wall:     &cu,
		Settings: cavity.AnalysisSettings{CurvePoints: 5},
	}
	r, err := s.Run(nil)
	if err != nil {
		t.Fatal(err)
	}
	spec := s.Spec
	spec.Q = design.QFunc(spec.Mode, cu, 0)
	d, err := cavity.Optimize(spec)
	if err != nil {
		t.Fatal(err)
	}
	a, err := cavity.Analyze(d, s.Settings)
	if err != nil {
		t.Fatal(err)
	}
	if r.Design.Cavity != d.Cavity || r.Design.Q0 != d.Q0 || r.Analysis.TunedLength != a.TunedLength || len(r.Analysis.Curve.Ratio) != len(a.Curve.Ratio) {
		t.Errorf("Run = %+v / %+v, want Optimize then Analyze: %+v / %+v", r.Design.Cavity, r.Analysis.TunedLength, d.Cavity, a.TunedLength)
	}
	if r.Unloaded == nil || r.Unloaded.Q0 != d.Q0 {
		t.Errorf("Run Q breakdown = %+v, want Q0 %g", r.Unloaded, d.Q0)
	}
}

// TestRunOneFill checks that a scenario holds its fill once: Run sizes
// the cavity with Scenario.Fill whatever Spec.Fill says, and the Result
// carries that fill everywhere. The designed cavity must resonate at the
// asked frequency with that fill, by cavity.Frequency (Pozar, Microwave
// Engineering, 4th ed., sec. 6.4: f scales as 1/sqrt(eps_r mu_r)).
func TestRunOneFill(t *testing.T) {
	ptfe, err := physics.LookupDielectric("ptfe")
	if err != nil {
		t.Fatal(err)
	}
	te011 := mustMode(t, "TE011")
	run := func(spec physics.Medium) design.Result {
		t.Helper()
		s := design.Scenario{Spec: cavity.DesignSpec{Mode: te011, Frequency: 10e9, Fill: spec}, Fill: ptfe}
		r, err := s.Run(nil)
		if err != nil {
			t.Fatal(err)
		}
		return r
	}
	want := run(physics.Medium{})
	if f := want.Design.Cavity.Frequency(te011); math.Abs(f-10e9) > oneFillFreqTol*10e9 {
		t.Errorf("TE011 of the PTFE-filled design = %.12g Hz, want 10 GHz", f)
	}
	for _, spec := range []physics.Medium{{}, ptfe.Medium, {Name: "other", EpsR: 9.8, TanDelta: 1e-4}} {
		r := run(spec)
		if r.Design.Cavity != want.Design.Cavity || r.Design.Cavity.Fill != ptfe.Medium {
			t.Errorf("Spec.Fill %+v: cavity %+v, want %+v filled with Scenario.Fill", spec, r.Design.Cavity, want.Design.Cavity)
		}
		if r.Design.Spec.Fill != ptfe.Medium || r.Scenario.Spec.Fill != ptfe.Medium {
			t.Errorf("Spec.Fill %+v: result's fills %+v (design) and %+v (scenario), want Scenario.Fill %+v",
				spec, r.Design.Spec.Fill, r.Scenario.Spec.Fill, ptfe.Medium)
		}
	}
}

// oneFillFreqTol is the relative error of the optimiser's cavity at its
// design frequency: cavity.Size is exact to a few ulp.
const oneFillFreqTol = 1e-12

// TestCautions checks each caution against a fact found another way:
// TE0mp and TM1mp are degenerate in every cylinder (j'_0m = j_1m, Pozar,
// Microwave Engineering, 4th ed., sec. 6.7); an optimum forced onto a
// diameter limit (TE011's unconstrained optimum at 10 GHz has D = 42.07
// mm, so D <= 41.9 mm binds; TestOptimizeSizeLimit in package cavity); a fill whose loss tangent alone gives Q_d = 1/tan d
// (Pozar eq. 6.46) far below the wall Q of copper; no wall metal.
func TestCautions(t *testing.T) {
	cu, err := physics.LookupConductor("copper")
	if err != nil {
		t.Fatal(err)
	}
	lossy := physics.Dielectric{Medium: physics.Medium{Name: "lossy", EpsR: 2, TanDelta: 1e-2}}
	for _, tc := range []struct {
		name string
		s    design.Scenario
		want string
	}{
		{"degenerate companion", design.Scenario{Spec: cavity.DesignSpec{Mode: mustMode(t, "TE011"), Frequency: 10e9}}, "TM111 resonates at exactly the frequency of TE011"},
		{"range edge", design.Scenario{Spec: cavity.DesignSpec{Mode: mustMode(t, "TE011"), Frequency: 10e9, MaxDiameter: 0.0419}}, "edge of the allowed D/L range (max-diameter"},
		{"lossy fill", design.Scenario{Spec: cavity.DesignSpec{Mode: mustMode(t, "TE011"), Frequency: 10e9}, Wall: &cu, Fill: lossy}, "The fill's loss dominates Q0"},
		{"no wall", design.Scenario{Spec: cavity.DesignSpec{Mode: mustMode(t, "TM010"), Frequency: 3e9}}, "Q0 not computed"},
	} {
		r, err := tc.s.Run(nil)
		if err != nil {
			t.Errorf("%s: Run error = %v", tc.name, err)
			continue
		}
		if !strings.Contains(strings.Join(r.Cautions, "\n"), tc.want) {
			t.Errorf("%s: cautions %q, want one containing %q", tc.name, r.Cautions, tc.want)
		}
	}
	// And no caution that does not hold: TM010 has no exact companion,
	// and with a wall there is no "no wall" caution.
	r, err := design.Scenario{Spec: cavity.DesignSpec{Mode: mustMode(t, "TM010"), Frequency: 3e9}, Wall: &cu}.Run(nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range r.Cautions {
		if strings.Contains(c, "resonates at exactly") || strings.Contains(c, "Q0 not computed") {
			t.Errorf("TM010 with copper walls: unexpected caution %q", c)
		}
	}
	if q := r.Unloaded; q == nil || math.IsNaN(q.Q0) {
		t.Errorf("TM010 with copper walls: Q breakdown %+v, want Q0", q)
	}
}

func ExampleScenario_Run() {
	// The built-in demo: a TE011 reference cavity for an invented 10.5 GHz
	// link, aluminium body, invar end spacers.
	s, err := design.Demo()
	if err != nil {
		fmt.Println(err)
		return
	}
	s.Settings.Tolerance.Samples = 2000 // fewer samples than the demo, for speed
	r, err := s.Run(nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	d := r.Design
	fmt.Printf("%s at %.1f GHz: D = %.3f mm, L = %.3f mm\n", d.Spec.Mode, d.Spec.Frequency/1e9, 1e3*d.Cavity.Diameter(), 1e3*d.Cavity.Length)
	fmt.Printf("clearance %.2f %%, Q0 %.0f\n", 100*d.Clearance.Value, d.Q0)
	// Output:
	// TE011 at 10.5 GHz: D = 40.244 mm, L = 28.450 mm
	// clearance 7.30 %, Q0 22789
}
