package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/qfactor"
)

// accelTol is the agreement with the pillbox closed forms: the axial
// quadrature is exact to rounding for these fields.
const accelTol = 1e-10

// TestPillboxAccel checks the accelerator figures of the TM010 mode of a
// closed cylinder (a pillbox) against the closed forms: E_z = E0 J0(kc r)
// with E_z(0) = E0, V = E0 L sin(x)/x with x = omega L/(2 beta c) (Wangler,
// RF Linear Accelerators, 2nd ed., sec. 2.x and 5.x, as recalled), and
// W = (eps0/2) E0^2 pi a^2 L J1(j01)^2 (DLMF 10.22.37 for int r J0^2),
// so R/Q = V^2/(omega W); G against package qfactor's total geometry
// factor.
func TestPillboxAccel(t *testing.T) {
	c := cavity.Cavity{Radius: 0.04, Length: 0.03}
	b := Body{Sections: []Section{{Length: c.Length, Radius: c.Radius}}}
	got, err := Solve(b, Request{MaxFrequency: 3.5e9, Modes: 4, Losses: true, Families: []cavity.Family{cavity.TM}})
	if err != nil || len(got) != 1 || got[0].Loss == nil {
		t.Fatal(got, err)
	}
	l := got[0].Loss
	f := got[0].Frequency
	omega := 2 * math.Pi * f
	j01 := 2.404825557695773 // A&S Table 9.5 (recalled)
	e0 := math.Abs(l.Axis[0].Ez)
	w := physics.VacuumPermittivity / 2 * e0 * e0 * math.Pi * c.Radius * c.Radius * c.Length * sq(math.J1(j01))
	if d := math.Abs(w-l.StoredEnergyJ) / w; d > accelTol {
		t.Errorf("W = %.15g J, want %.15g J (closed form)", l.StoredEnergyJ, w)
	}
	for _, beta := range []float64{1, 0.6, 0.3} {
		a, err := l.Accelerating(beta)
		if err != nil {
			t.Fatal(err)
		}
		x := omega * c.Length / (2 * beta * physics.SpeedOfLight)
		tt := math.Sin(x) / x
		v := e0 * c.Length * math.Abs(tt)
		if d := math.Abs(a.V-v) / v; d > accelTol {
			t.Errorf("beta %g: V = %.15g V, want %.15g V", beta, a.V, v)
		}
		if d := math.Abs(a.T - math.Abs(tt)); d > accelTol {
			t.Errorf("beta %g: T = %.15g, want %.15g", beta, a.T, math.Abs(tt))
		}
		rq := v * v / (omega * w)
		if d := math.Abs(a.RoverQLinac-rq) / rq; d > accelTol {
			t.Errorf("beta %g: R/Q = %.15g ohm, want %.15g ohm", beta, a.RoverQLinac, rq)
		}
		if a.RoverQCircuit != a.RoverQLinac/2 {
			t.Errorf("circuit R/Q %g, want half of %g", a.RoverQCircuit, a.RoverQLinac)
		}
	}
	gw, err := qfactor.GeometryFactors(c, cavity.Mode{Family: cavity.TM, M: 1})
	if err != nil {
		t.Fatal(err)
	}
	if d := math.Abs(l.G()-gw.Total()) / gw.Total(); d > accelTol {
		t.Errorf("G = %.15g ohm, want %.15g ohm (qfactor)", l.G(), gw.Total())
	}
	if _, err := (Loss{}).Accelerating(1); err == nil {
		t.Error("Accelerating without an axis field: no error")
	}
}
