package physics

import (
	"math"
	"strings"
	"testing"
)

// TestMediumQ checks the fill Q 1/Q = tan delta_e + tan delta_m against
// Pozar, Microwave Engineering, 4th ed., sec. 6.4 (the PTFE example:
// Q_d = 1/tan delta = 2500; recalled from memory) and against the sum rule.
func TestMediumQ(t *testing.T) {
	for _, tc := range []struct {
		m    Medium
		want float64
		src  string
	}{
		{Medium{TanDelta: 4e-4}, 2500, "Pozar sec. 6.4 example, PTFE: Q_d = 1/tan delta = 2500"},
		{Medium{TanDelta: 1e-4, TanDeltaM: 4e-4}, 2000, "1/Q = tan delta_e + tan delta_m"},
		{Medium{}, math.Inf(1), "lossless fill"},
	} {
		got := tc.m.Q()
		if got != tc.want && math.Abs(got-tc.want) > 1e-12*tc.want {
			t.Errorf("Medium%+v.Q() = %g, want %g (%s)", tc.m, got, tc.want, tc.src)
		}
	}
}

// TestMediumDefaults checks that the zero value is vacuum: eps_r = mu_r = 1,
// index 1, lossless, valid.
func TestMediumDefaults(t *testing.T) {
	var m Medium
	if m.Eps() != 1 || m.Mu() != 1 || m.Index() != 1 || !math.IsInf(m.Q(), 1) || m.Validate() != nil {
		t.Errorf("zero Medium: Eps %g, Mu %g, Index %g, Q %g, Validate %v; want 1, 1, 1, +Inf, nil",
			m.Eps(), m.Mu(), m.Index(), m.Q(), m.Validate())
	}
	// Index = sqrt(eps mu): PTFE (eps 2.08) has n = 1.44222 (sqrt(2.08)
	// = 1.4422205..., by hand).
	p := Medium{EpsR: 2.08}
	if got := p.Index(); math.Abs(got-1.4422205101855958) > 1e-15 {
		t.Errorf("Medium{EpsR: 2.08}.Index() = %.17g, want 1.4422205101855958", got)
	}
	if got := (Medium{EpsR: 4, MuR: 9}).Index(); got != 6 {
		t.Errorf("Medium{EpsR: 4, MuR: 9}.Index() = %g, want 6", got)
	}
}

func TestMediumValidate(t *testing.T) {
	for _, tc := range []struct {
		m    Medium
		want string
	}{
		{Medium{EpsR: 2.08, MuR: 1, TanDelta: 4e-4, TanDeltaFreq: 10e9}, ""},
		{Medium{EpsR: 0.9}, "eps_r must be in 1..10000, got 0.9"},
		{Medium{EpsR: 2e4}, "eps_r must be in 1..10000, got 20000"},
		{Medium{MuR: math.NaN()}, "mu_r must be in 0.001..100000, got NaN"},
		{Medium{TanDelta: -1e-3}, "electric loss tangent tand must be in 0..1, got -0.001"},
		{Medium{TanDeltaM: 2}, "magnetic loss tangent tandm must be in 0..1, got 2"},
		{Medium{TanDelta: math.NaN()}, "electric loss tangent tand must be in 0..1, got NaN"},
		{Medium{TanDeltaFreq: -1}, "loss-tangent frequency must be finite and >= 0 Hz, got -1 Hz"},
		{Medium{TCEps: math.Inf(1)}, "temperature coefficient of eps must be finite"},
	} {
		err := tc.m.Validate()
		switch {
		case tc.want == "" && err != nil:
			t.Errorf("Medium%+v.Validate() = %v, want nil", tc.m, err)
		case tc.want != "" && (err == nil || !strings.Contains(err.Error(), tc.want)):
			t.Errorf("Medium%+v.Validate() = %v, want an error containing %q", tc.m, err, tc.want)
		}
	}
}

// TestDielectricMedium checks that every library row and a parsed user fill
// give a valid Medium directly, with the row's name.
func TestDielectricMedium(t *testing.T) {
	for _, d := range Dielectrics() {
		if err := d.Medium.Validate(); err != nil {
			t.Errorf("Dielectrics() row %q: Medium.Validate() = %v", d.Name, err)
		}
		if d.Medium.Name != d.Name {
			t.Errorf("Dielectrics() row %q: Medium.Name = %q", d.Name, d.Medium.Name)
		}
	}
	d, err := ParseDielectric("eps=2.08,tand=4e-4")
	if err != nil {
		t.Fatal(err)
	}
	want := Medium{Name: "user", EpsR: 2.08, MuR: 1, TanDelta: 4e-4}
	if d.Medium != want {
		t.Errorf("ParseDielectric(eps=2.08,tand=4e-4).Medium = %+v, want %+v", d.Medium, want)
	}
}

// TestConductorMu checks the wall metal's zero-means-1 permeability.
func TestConductorMu(t *testing.T) {
	if got := (Conductor{}).Mu(); got != 1 {
		t.Errorf("Conductor{}.Mu() = %g, want 1", got)
	}
	if got := (Conductor{MuR: 2.5}).Mu(); got != 2.5 {
		t.Errorf("Conductor{MuR: 2.5}.Mu() = %g, want 2.5", got)
	}
}

// TestEpsAt checks the fill's linear temperature model against its
// definition, eps(T) = eps (1 + tc dT), and that an unknown coefficient
// leaves the permittivity unchanged.
func TestEpsAt(t *testing.T) {
	m := Medium{EpsR: 9.8, TCEps: -50e-6, TCEpsKnown: true}
	if got, want := m.EpsAt(40), 9.8*(1-50e-6*40); got != want {
		t.Errorf("EpsAt(40) = %v, want %v", got, want)
	}
	m.TCEpsKnown = false
	if got := m.EpsAt(40); got != 9.8 {
		t.Errorf("EpsAt(40) with unknown coefficient = %v, want 9.8", got)
	}
	if got := (Medium{}).EpsAt(-300); got != 1 {
		t.Errorf("vacuum EpsAt(-300) = %v, want 1", got)
	}
}

// TestMediumUniaxial: EpsRParallel zero means isotropic; a uniaxial medium
// must be non-magnetic and its eps_par in range; RequireIsotropic refuses
// it; ParseDielectric reads epspar.
func TestMediumUniaxial(t *testing.T) {
	iso := Medium{EpsR: 2}
	if iso.Uniaxial() || iso.EpsPar() != 2 || iso.RequireIsotropic("x") != nil {
		t.Errorf("isotropic medium: Uniaxial %v, EpsPar %g", iso.Uniaxial(), iso.EpsPar())
	}
	u := Medium{EpsR: 9.4, EpsRParallel: 11.6}
	if !u.Uniaxial() || u.EpsPar() != 11.6 || u.Validate() != nil {
		t.Errorf("uniaxial medium: Uniaxial %v, EpsPar %g, Validate %v", u.Uniaxial(), u.EpsPar(), u.Validate())
	}
	if err := u.RequireIsotropic("the model"); err == nil || !strings.Contains(err.Error(), "the model holds for isotropic fills only") {
		t.Errorf("RequireIsotropic: %v", err)
	}
	if err := (Medium{EpsR: 9, EpsRParallel: 11, MuR: 2}).Validate(); err == nil {
		t.Error("magnetic uniaxial medium validated")
	}
	if err := (Medium{EpsR: 9, EpsRParallel: 0.5}).Validate(); err == nil {
		t.Error("eps_par 0.5 validated")
	}
	d, err := ParseDielectric("eps=9.4,epspar=11.6")
	if err != nil || d.EpsPar() != 11.6 || d.Eps() != 9.4 {
		t.Errorf("ParseDielectric(eps=9.4,epspar=11.6) = %+v, %v", d.Medium, err)
	}
}
