package filter

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/mat"

	"cylcav/physics"
)

// TestStoredEnergy checks StoredEnergy against two physical laws:
//
//   - one resonator between two ports, matched at resonance: the stored
//     energy is W = Q_L P_diss / omega0 with Q_L = 1/(2 FBW m^2) (both
//     ports load it) and P_diss = 2 p (the load and the source's own
//     conductance each take p at match) (definition of loaded Q);
//   - a lossless filter at a reflection zero (all power through): the
//     total stored energy equals p times the group delay of S21 (the
//     energy theorem for a lossless matched two-port; e.g. Pozar,
//     Microwave Engineering, sec. 5.9 on group delay; recalled from
//     memory).
func TestStoredEnergy(t *testing.T) {
	const f0, bw, m, p = 5e9, 50e6, 1.0, 100.0
	one := &Design{Spec: Spec{F0: f0, BW: bw, Order: 1}, FBW: bw / f0,
		Folded: mat.NewDense(3, 3, []float64{0, m, 0, m, 0, m, 0, m, 0})}
	w, err := one.StoredEnergy(nil, f0, p)
	if err != nil {
		t.Fatal(err)
	}
	ql := 1 / (2 * (bw / f0) * m * m)
	if want := ql * 2 * p / (2 * math.Pi * f0); math.Abs(w[0]-want)/want > 1e-13 {
		t.Errorf("single resonator: W = %g J, want Q_L 2p/omega0 = %g J", w[0], want)
	}
	d, _ := tolDesign(t)
	for _, z := range d.ReflectionZeros {
		f := BandpassFrequency(z, d.Spec.F0, d.Spec.BW)
		ws, err := d.StoredEnergy(nil, f, p)
		if err != nil {
			t.Fatal(err)
		}
		sum := 0.0
		for _, x := range ws {
			sum += x
		}
		pts, err := d.Response([]float64{f}, nil)
		if err != nil {
			t.Fatal(err)
		}
		if want := p * pts[0].GroupDelay; math.Abs(sum-want)/want > 1e-9 {
			t.Errorf("reflection zero %.6g GHz: sum W = %.10g J, p tau = %.10g J", f/1e9, sum, want)
		}
	}
}

// TestPeakFieldTE011 checks the peak electric field of a TE011 cavity at
// 1 J against the closed form: E_phi = A J1(kc rho) sin(beta z) with
// (1/2) integral eps |E|^2 dV = W gives A^2 = 4 W/(eps pi L a^2 J0(x)^2)
// at x = j'_01 (Lommel's integral, DLMF 10.22.5; derived), and the peak is
// A max J1 = 0.58186522 A (the first maximum of J1, at 1.84118378: DLMF
// table 10.21.1, j'_{1,1}; J1 there from math.J1).
func TestPeakFieldTE011(t *testing.T) {
	_, r := tolDesign(t)
	c := r.Cavities[0].Cavity
	e1, h1, err := peakFields(c, r.Mode)
	if err != nil {
		t.Fatal(err)
	}
	const x = 3.831705970207512
	a, l := c.Radius, c.Length
	amp := math.Sqrt(4 / (physics.VacuumPermittivity * math.Pi * l * a * a * math.J0(x) * math.J0(x)))
	want := amp * math.J1(1.841183781340659)
	if rel := math.Abs(e1-want) / want; rel > 1e-4 {
		t.Errorf("peak E at 1 J = %.8g V/m, closed form %.8g V/m (rel %.2g)", e1, want, rel)
	}
	if !(h1 > 0) {
		t.Errorf("wall H = %g", h1)
	}
}

// TestPowerHandling checks the breakdown margin against its definition and
// the pressure scaling.
func TestPowerHandling(t *testing.T) {
	d, r := tolDesign(t)
	res, err := PowerHandling(d, r, PowerSpec{Power: 100})
	if err != nil {
		t.Fatal(err)
	}
	half, err := PowerHandling(d, r, PowerSpec{Power: 100, Pressure: SeaLevelPressure / 2})
	if err != nil {
		t.Fatal(err)
	}
	for i, x := range res.Resonators {
		if math.Abs(x.Margin-AirBreakdown/x.EPeak) > 1e-12*x.Margin {
			t.Errorf("resonator %d: margin %g, want %g", i+1, x.Margin, AirBreakdown/x.EPeak)
		}
		if rel := half.Resonators[i].MaxPower / x.MaxPower; math.Abs(rel-0.25) > 1e-12 {
			t.Errorf("resonator %d: half pressure scales the power limit by %g, want 1/4", i+1, rel)
		}
		if !(x.Energy > 0) || math.Abs(x.F/d.Spec.F0-1) > d.FBW {
			t.Errorf("resonator %d: energy %g J", i+1, x.Energy)
		}
	}
	if _, err := PowerHandling(d, r, PowerSpec{Power: 100, Pressure: 1000}); err == nil {
		t.Error("1 kPa: no error, want the pressure range")
	}
}
