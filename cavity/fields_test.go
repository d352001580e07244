package cavity

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"cylcav/physics"
	"cylcav/physics/quad"
)

var fieldCases = []struct {
	mode string
	c    Cavity
}{
	{"TE011", Cavity{Radius: 0.02, Length: 0.03}},
	{"TE111", Cavity{Radius: 0.015, Length: 0.04, Fill: physics.Medium{EpsR: 2.08}}},
	{"TE213", Cavity{Radius: 0.03, Length: 0.05}},
	{"TE021", Cavity{Radius: 0.03, Length: 0.02}},
	{"TM010", Cavity{Radius: 0.05, Length: 0.02}},
	{"TM111", Cavity{Radius: 0.02, Length: 0.03}},
	{"TM212", Cavity{Radius: 0.025, Length: 0.03, Fill: physics.Medium{EpsR: 9.8}}},
	{"TM020", Cavity{Radius: 0.05, Length: 0.02}},
}

// curl returns the curl of F in cylindrical coordinates by central
// differences with step h (relative to the cavity size).
func curl(F func(Point) Vector, p Point, h float64) Vector {
	d := func(dp Point, comp func(Vector) float64, scale func(Point) float64) float64 {
		a := Point{p.Rho + dp.Rho, p.Phi + dp.Phi, p.Z + dp.Z}
		b := Point{p.Rho - dp.Rho, p.Phi - dp.Phi, p.Z - dp.Z}
		return (scale(a)*comp(F(a)) - scale(b)*comp(F(b))) / 2
	}
	one := func(Point) float64 { return 1 }
	rho := func(q Point) float64 { return q.Rho }
	rP, pP, zP := Point{Rho: h}, Point{Phi: h / p.Rho}, Point{Z: h}
	cr := func(v Vector) float64 { return v.Rho }
	cp := func(v Vector) float64 { return v.Phi }
	cz := func(v Vector) float64 { return v.Z }
	// (curl F)_rho = (1/rho) dFz/dphi - dFphi/dz, etc. (cylindrical curl).
	return Vector{
		Rho: d(pP, cz, one)/(h/p.Rho)/p.Rho - d(zP, cp, one)/h,
		Phi: d(zP, cr, one)/h - d(rP, cz, one)/h,
		Z:   (d(rP, cp, rho)/h - d(pP, cr, one)/(h/p.Rho)) / p.Rho,
	}
}

// TestFieldsSatisfyMaxwell checks curl e = omega mu h and curl h = omega eps
// e (the real form of Maxwell's equations for E = e, H = j h) at seeded
// random interior points, by central differences: an independent check of
// every sign and factor in ModeField.At. The difference error is about
// (h k)^2 ~ 1e-9 relative with h = 1e-5 of the size; fieldTol allows for it.
func TestFieldsSatisfyMaxwell(t *testing.T) {
	const fieldTol = 1e-6
	rng := rand.New(rand.NewPCG(11, 12))
	for _, tc := range fieldCases {
		m := mustMode(t, tc.mode)
		mf, err := tc.c.ModeField(m)
		if err != nil {
			t.Fatal(err)
		}
		E := func(p Point) Vector { return mf.At(p).E }
		H := func(p Point) Vector { return mf.At(p).H }
		h := 1e-5 * tc.c.Radius
		// Scale of the fields, for an absolute tolerance.
		var eMax, hMax float64
		for range 200 {
			p := Point{tc.c.Radius * rng.Float64(), 2 * math.Pi * rng.Float64(), tc.c.Length * rng.Float64()}
			f := mf.At(p)
			eMax, hMax = math.Max(eMax, math.Sqrt(f.E.Norm2())), math.Max(hMax, math.Sqrt(f.H.Norm2()))
		}
		for range 20 {
			p := Point{tc.c.Radius * (0.05 + 0.9*rng.Float64()), 2 * math.Pi * rng.Float64(), tc.c.Length * (0.05 + 0.9*rng.Float64())}
			f := mf.At(p)
			ce, ch := curl(E, p, h), curl(H, p, h)
			k := mf.Omega() * math.Sqrt(mf.Eps()*mf.Mu())
			for i, pair := range [][2]float64{
				{ce.Rho, mf.Omega() * mf.Mu() * f.H.Rho}, {ce.Phi, mf.Omega() * mf.Mu() * f.H.Phi}, {ce.Z, mf.Omega() * mf.Mu() * f.H.Z},
			} {
				if math.Abs(pair[0]-pair[1]) > fieldTol*k*eMax {
					t.Errorf("%s curl E[%d] at %+v = %g, want omega mu H = %g", tc.mode, i, p, pair[0], pair[1])
				}
			}
			for i, pair := range [][2]float64{
				{ch.Rho, mf.Omega() * mf.Eps() * f.E.Rho}, {ch.Phi, mf.Omega() * mf.Eps() * f.E.Phi}, {ch.Z, mf.Omega() * mf.Eps() * f.E.Z},
			} {
				if math.Abs(pair[0]-pair[1]) > fieldTol*k*hMax {
					t.Errorf("%s curl H[%d] at %+v = %g, want omega eps E = %g", tc.mode, i, p, pair[0], pair[1])
				}
			}
		}
	}
}

// TestFieldsBoundary: tangential E and normal H vanish on the perfectly
// conducting walls.
func TestFieldsBoundary(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, tc := range fieldCases {
		mf, err := tc.c.ModeField(mustMode(t, tc.mode))
		if err != nil {
			t.Fatal(err)
		}
		scaleE := math.Sqrt(mf.At(Point{0.5 * tc.c.Radius, 0.3, 0.4 * tc.c.Length}).E.Norm2()) + 1
		scaleH := math.Sqrt(mf.At(Point{0.5 * tc.c.Radius, 0.3, 0.4 * tc.c.Length}).H.Norm2()) + 1
		const tol = 1e-9
		for range 20 {
			phi := 2 * math.Pi * rng.Float64()
			side := mf.At(Point{tc.c.Radius, phi, tc.c.Length * rng.Float64()})
			if math.Abs(side.E.Phi) > tol*scaleE*1e3 || math.Abs(side.E.Z) > tol*scaleE*1e3 || math.Abs(side.H.Rho) > tol*scaleH*1e3 {
				t.Errorf("%s side wall fields E = %+v, H = %+v, want E_phi = E_z = H_rho = 0", tc.mode, side.E, side.H)
			}
			for _, z := range []float64{0, tc.c.Length} {
				end := mf.At(Point{tc.c.Radius * rng.Float64(), phi, z})
				if math.Abs(end.E.Rho) > tol*scaleE || math.Abs(end.E.Phi) > tol*scaleE || math.Abs(end.H.Z) > tol*scaleH {
					t.Errorf("%s end plate (z = %g) fields E = %+v, H = %+v, want E_rho = E_phi = H_z = 0", tc.mode, z, end.E, end.H)
				}
			}
		}
	}
}

// TestFieldsEnergy integrates the energy densities numerically
// (Gauss-Legendre in rho and z, trapezoid in phi) and checks
// (eps/4) int |E|^2 = (mu/4) int |H|^2 = 1/2 J: the normalisation of
// ModeField and, through it, the radial Bessel integrals it uses.
func TestFieldsEnergy(t *testing.T) {
	const energyTol = 1e-10
	x, wq := quad.GaussLegendre(40)
	for _, tc := range fieldCases {
		m := mustMode(t, tc.mode)
		mf, err := tc.c.ModeField(m)
		if err != nil {
			t.Fatal(err)
		}
		nphi := 4*m.N + 8
		var we, wm float64
		for i := range x {
			rho := tc.c.Radius * (x[i] + 1) / 2
			for j := range x {
				z := tc.c.Length * (x[j] + 1) / 2
				for k := range nphi {
					phi := 2 * math.Pi * float64(k) / float64(nphi)
					f := mf.At(Point{rho, phi, z})
					dv := wq[i] * tc.c.Radius / 2 * rho * wq[j] * tc.c.Length / 2 * 2 * math.Pi / float64(nphi)
					we += mf.Eps() / 4 * f.E.Norm2() * dv
					wm += mf.Mu() / 4 * f.H.Norm2() * dv
				}
			}
		}
		if math.Abs(we-0.5) > energyTol || math.Abs(wm-0.5) > energyTol {
			t.Errorf("%s energies W_e = %.15g J, W_m = %.15g J, want 0.5 J each", tc.mode, we, wm)
		}
	}
}

func ExampleCavity_ModeField() {
	// Peak fields of an invented 3 GHz TM010 cell, 1 J stored.
	m, _ := ParseMode("TM010")
	c := Cavity{Radius: 0.03825, Length: 0.05}
	mf, _ := c.ModeField(m)
	f := mf.At(Point{Rho: 0, Phi: 0, Z: 0.025})
	fmt.Printf("f = %.4f GHz, Ez on axis = %.4g MV/m\n", mf.Omega()/2/math.Pi/1e9, f.E.Z/1e6)
	// Output:
	// f = 2.9998 GHz, Ez on axis = 60.39 MV/m
}
