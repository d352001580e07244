package qfactor

import (
	"testing"

	"cylcav/physics"
)

// TestConductivityAtModelLimits checks that the linear resistivity model is
// accepted exactly at its stated limits, -50 C and +200 C, however the user
// types them (the C and F conversions round), and refused just outside.
// Reference: rho(T) = rho20 (1 + alpha (T - 20 C)) with the IACS alpha
// 0.00393 1/K (IEC 1913, recalled from memory).
func TestConductivityAtModelLimits(t *testing.T) {
	cu, err := physics.LookupConductor("copper")
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		in string
		dT float64 // T - 20 C, K
	}{
		{"-50C", -70}, {"-58F", -70}, {"223.15K", -70},
		{"200C", 180}, {"392F", 180}, {"473.15K", 180},
	} {
		T, err := physics.ParseTemperature(tc.in)
		if err != nil {
			t.Fatal(err)
		}
		got, err := Conductivity(cu, T)
		if err != nil {
			t.Errorf("Conductivity(copper, %s): %v, want accepted", tc.in, err)
			continue
		}
		want := 58e6 / (1 + 0.00393*tc.dT)
		if !near(got, want, 1e-12) {
			t.Errorf("Conductivity(copper, %s) = %g, want %g", tc.in, got, want)
		}
	}
	for _, in := range []string{"-50.01C", "200.01C"} {
		T, _ := physics.ParseTemperature(in)
		if _, err := Conductivity(cu, T); err == nil {
			t.Errorf("Conductivity(copper, %s): no error, want refused", in)
		}
	}
}
