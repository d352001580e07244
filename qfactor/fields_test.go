package qfactor_test

// This file checks the closed forms of wallq.go and accel.go by an
// independent route: the fields of each mode are written out component by
// component (Pozar, Microwave Engineering, 4th ed., sec. 6.4, standing-wave
// form of the circular-waveguide TE_nm and TM_nm fields; Harrington,
// Time-Harmonic Electromagnetic Fields, 1961, ch. 5), verified to satisfy
// Maxwell's curl equations and the boundary conditions by finite
// differences, and then integrated numerically with gonum's Gauss-Legendre
// rule (gonum.org/v1/gonum/integrate/quad, v0.17.0):
//
//	W      = (eps/2) integral |E|^2 dV          (twice the mean electric energy)
//	P_part = (Rs_part/2) integral |H_tan|^2 dS   (each wall part)
//	Q      = omega W / sum P_part
//
// Nothing here uses the closed forms: the integrals run over r, phi and z
// with the Bessel functions of the standard library (math.Jn).

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/qfactor"
)

// field is one polarisation of a TE_nmp or TM_nmp mode: the axial field
// varies as cos(n phi). The phasors are E = j e, H = h for TE and E = e,
// H = j h for TM, with e and h real; at returns e and h.
type field struct {
	fam            cavity.Family
	n              int
	a, d           float64
	kc, beta       float64
	omega, eps, mu float64
}

func newField(c cavity.Cavity, m cavity.Mode) field {
	epsR, muR := c.Fill.Eps(), c.Fill.Mu()
	f := field{
		fam: m.Family, n: m.N, a: c.Radius, d: c.Length,
		kc:   m.Root() / c.Radius,
		beta: float64(m.P) * math.Pi / c.Length,
		eps:  epsR * physics.VacuumPermittivity,
		mu:   muR * physics.VacuumPermeability,
	}
	f.omega = math.Hypot(f.kc, f.beta) / math.Sqrt(f.eps*f.mu)
	return f
}

// jOverT returns J_n(t)/t, with its limit at t = 0.
func jOverT(n int, t float64) float64 {
	if t == 0 {
		if n == 1 {
			return 0.5
		}
		return 0
	}
	return math.Jn(n, t) / t
}

// at returns the components (rho, phi, z) of e and h at (r, phi, z).
func (f field) at(r, phi, z float64) (e, h [3]float64) {
	n := float64(f.n)
	t := f.kc * r
	j := math.Jn(f.n, t)
	jp := 0.5 * (math.Jn(f.n-1, t) - math.Jn(f.n+1, t)) // J'_n, DLMF 10.6.1
	jot := jOverT(f.n, t)
	cs, sn := math.Cos(n*phi), math.Sin(n*phi)
	sz, cz := math.Sin(f.beta*z), math.Cos(f.beta*z)
	if f.fam == cavity.TE {
		// Pozar sec. 6.4 TE fields, standing wave, h_z = J_n cos(n phi) sin(beta z).
		wm := f.omega * f.mu / f.kc
		e[0] = wm * n * jot * sn * sz
		e[1] = wm * jp * cs * sz
		h[0] = f.beta / f.kc * jp * cs * cz
		h[1] = -f.beta / f.kc * n * jot * sn * cz
		h[2] = j * cs * sz
		return e, h
	}
	// Pozar sec. 6.4 TM fields, standing wave, e_z = J_n cos(n phi) cos(beta z).
	we := f.omega * f.eps / f.kc
	e[0] = -f.beta / f.kc * jp * cs * sz
	e[1] = f.beta / f.kc * n * jot * sn * sz
	e[2] = j * cs * cz
	h[0] = -we * n * jot * sn * cz
	h[1] = -we * jp * cs * cz
	return e, h
}

// curl returns the curl of the vector field g (cylindrical components) at
// (r, phi, z) by central differences.
func curl(g func(r, phi, z float64) [3]float64, r, phi, z, dr, dz float64) [3]float64 {
	const dphi = 1e-5
	d := func(i, axis int) float64 {
		var p, m [3]float64
		switch axis {
		case 0:
			p, m = g(r+dr, phi, z), g(r-dr, phi, z)
			if i == 1 { // d(r A_phi)/dr
				return ((r+dr)*p[1] - (r-dr)*m[1]) / (2 * dr)
			}
			return (p[i] - m[i]) / (2 * dr)
		case 1:
			p, m = g(r, phi+dphi, z), g(r, phi-dphi, z)
			return (p[i] - m[i]) / (2 * dphi)
		default:
			p, m = g(r, phi, z+dz), g(r, phi, z-dz)
			return (p[i] - m[i]) / (2 * dz)
		}
	}
	return [3]float64{
		d(2, 1)/r - d(1, 2),
		d(0, 2) - d(2, 0),
		(d(1, 0) - d(0, 1)) / r,
	}
}

// maxwellTol is the agreement asked of the finite-difference curls, relative
// to the largest field term: central differences with steps 1e-5 of the
// scale have truncation error ~1e-10 (kc a)^3 and rounding ~1e-11.
const maxwellTol = 1e-6

// wallTol is the size, relative to the field scale, allowed of a field
// component that vanishes on a wall: the Bessel factor there is J_n or
// J'_n at its zero, zero to about 1e-14, and sin(p pi) is about 1e-16 p.
const wallTol = 1e-12

// TestFieldsSolveMaxwell checks the test's own field expressions: at random
// interior points curl E = -j omega mu H and curl H = j omega eps E, and on
// the walls E_tan = 0 and H_normal = 0. This makes the quadrature below a
// check against real solutions of Maxwell's equations.
func TestFieldsSolveMaxwell(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, m := range spreadModes() {
		for _, aspect := range []float64{0.35, 1, 2.6} {
			c := cavity.Cavity{Radius: 0.02, Length: 0.02 * aspect, Fill: physics.Medium{EpsR: 2.1, MuR: 1.3}}
			f := newField(c, m)
			// With the phasor conventions of field: TE has curl e = -omega mu h,
			// curl h = -omega eps e; TM has curl e = omega mu h, curl h = omega eps e.
			s := 1.0
			if m.Family == cavity.TE {
				s = -1
			}
			eOf := func(r, phi, z float64) [3]float64 { e, _ := f.at(r, phi, z); return e }
			hOf := func(r, phi, z float64) [3]float64 { _, h := f.at(r, phi, z); return h }
			eMax, hMax := maxNorm(f, true), maxNorm(f, false)
			scaleE := f.omega * f.mu * hMax
			scaleH := f.omega * f.eps * eMax
			scale := eMax + hMax
			for range 5 {
				r := c.Radius * (0.05 + 0.9*rng.Float64())
				phi := 2 * math.Pi * rng.Float64()
				z := c.Length * rng.Float64()
				e, h := f.at(r, phi, z)
				ce := curl(eOf, r, phi, z, 1e-5*c.Radius, 1e-5*c.Length)
				ch := curl(hOf, r, phi, z, 1e-5*c.Radius, 1e-5*c.Length)
				for i := range 3 {
					if d := math.Abs(ce[i] - s*f.omega*f.mu*h[i]); d > maxwellTol*scaleE {
						t.Errorf("%s aspect %g: (curl e)[%d] = %g, want %g", m, aspect, i, ce[i], s*f.omega*f.mu*h[i])
					}
					if d := math.Abs(ch[i] - s*f.omega*f.eps*e[i]); d > maxwellTol*scaleH {
						t.Errorf("%s aspect %g: (curl h)[%d] = %g, want %g", m, aspect, i, ch[i], s*f.omega*f.eps*e[i])
					}
				}
				// Boundary conditions on the walls.
				eS, hS := f.at(c.Radius, phi, z)
				eA, hA := f.at(r, phi, 0)
				eB, hB := f.at(r, phi, c.Length)
				for _, v := range []struct {
					what string
					got  float64
				}{
					{"side E_phi", eS[1]}, {"side E_z", eS[2]}, {"side H_r", hS[0]},
					{"end A E_r", eA[0]}, {"end A E_phi", eA[1]}, {"end A H_z", hA[2]},
					{"end B E_r", eB[0]}, {"end B E_phi", eB[1]}, {"end B H_z", hB[2]},
				} {
					if math.Abs(v.got) > wallTol*scale {
						t.Errorf("%s aspect %g: %s = %g, want 0", m, aspect, v.what, v.got)
					}
				}
			}
		}
	}
}

func norm(v [3]float64) float64 { return math.Sqrt(v[0]*v[0] + v[1]*v[1] + v[2]*v[2]) }

// maxNorm returns a coarse maximum of |e| (electric) or |h| over a grid.
func maxNorm(f field, electric bool) float64 {
	best := 0.0
	for i := 1; i <= 12; i++ {
		for j := range 12 {
			for k := range 12 {
				e, h := f.at(f.a*float64(i)/12, 2*math.Pi*float64(j)/12, f.d*float64(k)/11)
				v := h
				if electric {
					v = e
				}
				best = math.Max(best, norm(v))
			}
		}
	}
	return best
}

// quadN is the Gauss-Legendre order per dimension. The integrands are
// J_n(kc r)^2 (kc a <= 16 here), trigonometric in phi with n <= 5 and in z
// with p <= 4; with 32, 40 or 48 points every quadrature figure below agreed
// with the closed forms to better than 1e-12 when the test was written, so
// 40 leaves a wide margin under closedFormTol.
const quadN = 40

func integrate(f func(float64) float64, lo, hi float64) float64 {
	return quad.Fixed(f, lo, hi, quadN, legendreN, 0)
}

// legendreN is gonum's quad.Legendre rule of quadN points, computed once:
// the nested integrals would otherwise recompute the nodes for every inner
// call.
var legendreN = newCachedRule(quadN)

// cachedRule holds the nodes and weights of a quad.Legendre rule on [-1, 1]
// and maps them to any interval.
type cachedRule struct{ x, w []float64 }

func newCachedRule(n int) cachedRule {
	r := cachedRule{x: make([]float64, n), w: make([]float64, n)}
	quad.Legendre{}.FixedLocations(r.x, r.w, -1, 1)
	return r
}

// FixedLocations implements quad.FixedLocationer.
func (r cachedRule) FixedLocations(x, weight []float64, min, max float64) {
	h, mid := (max-min)/2, (max+min)/2
	for i := range x {
		x[i] = mid + h*r.x[i]
		weight[i] = h * r.w[i]
	}
}

// numeric holds the quadrature results for one mode.
type numeric struct {
	omega            float64
	we, wm           float64 // (eps/2) int |E|^2 dV and (mu/2) int |H|^2 dV
	side, endA, endB float64 // int |H_tan|^2 dS over each part
}

// quadrature integrates the fields of m in c.
func quadrature(c cavity.Cavity, m cavity.Mode) numeric {
	f := newField(c, m)
	a, d := c.Radius, c.Length
	var nu numeric
	nu.omega = f.omega
	// One triple integral for |E|^2, one for |H|^2.
	vol := func(electric bool) float64 {
		return integrate(func(z float64) float64 {
			return integrate(func(phi float64) float64 {
				return integrate(func(r float64) float64 {
					e, h := f.at(r, phi, z)
					v := h
					if electric {
						v = e
					}
					return (v[0]*v[0] + v[1]*v[1] + v[2]*v[2]) * r
				}, 0, a)
			}, 0, 2*math.Pi)
		}, 0, d)
	}
	sumE, sumH := vol(true), vol(false)
	nu.we = f.eps / 2 * sumE
	nu.wm = f.mu / 2 * sumH
	nu.side = integrate(func(z float64) float64 {
		return integrate(func(phi float64) float64 {
			_, h := f.at(a, phi, z)
			return (h[1]*h[1] + h[2]*h[2]) * a
		}, 0, 2*math.Pi)
	}, 0, d)
	end := func(z float64) float64 {
		return integrate(func(phi float64) float64 {
			return integrate(func(r float64) float64 {
				_, h := f.at(r, phi, z)
				return (h[0]*h[0] + h[1]*h[1]) * r
			}, 0, a)
		}, 0, 2*math.Pi)
	}
	nu.endA, nu.endB = end(0), end(d)
	return nu
}

// spreadModes is the spread of modes checked by quadrature: n up to 5, m up
// to 3, p up to 4, both families, including the p = 0 TM modes.
func spreadModes() []cavity.Mode {
	var ms []cavity.Mode
	for _, n := range []int{0, 1, 2, 5} {
		for _, mm := range []int{1, 3} {
			ms = append(ms,
				cavity.Mode{Family: cavity.TM, N: n, M: mm, P: 0},
				cavity.Mode{Family: cavity.TM, N: n, M: mm, P: 2},
				cavity.Mode{Family: cavity.TE, N: n, M: mm, P: 1},
				cavity.Mode{Family: cavity.TE, N: n, M: mm, P: 4},
			)
		}
	}
	ms = append(ms,
		cavity.Mode{Family: cavity.TM, N: 0, M: 1, P: 1},
		cavity.Mode{Family: cavity.TM, N: 3, M: 2, P: 4},
		cavity.Mode{Family: cavity.TE, N: 4, M: 2, P: 3},
	)
	return ms
}

// closedFormTol is the agreement asked between the closed forms and the
// quadrature: the quadrature is good to about 1e-13 (see quadN), the closed
// forms to a few ulp; 1e-8 is the requirement with a wide margin.
const closedFormTol = 1e-8

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

// TestWallQQuadrature compares WallQ and GeometryFactors with the
// quadrature of the mode fields for the spread of modes, three aspect
// ratios, a dielectric and magnetic fill, and a different metal on each
// wall part (surface resistances from a seeded source).
func TestWallQQuadrature(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	aspects := []float64{0.3, 1.1, 3.7}
	for i, m := range spreadModes() {
		aspect := aspects[i%len(aspects)]
		c := cavity.Cavity{Radius: 0.013, Length: 0.013 * aspect, Fill: physics.Medium{EpsR: 1 + 3*rng.Float64(), MuR: 1 + rng.Float64()}}
		rs := qfactor.SurfaceResistances{Side: 0.01 + 0.05*rng.Float64(), EndA: 0.01 + 0.05*rng.Float64(), EndB: 0.01 + 0.05*rng.Float64()}
		nu := quadrature(c, m)

		// Resonance: mean electric and magnetic energies agree.
		if e := relErr(nu.wm, nu.we); e > closedFormTol {
			t.Errorf("%s: magnetic energy = %g, want electric %g", m, nu.wm, nu.we)
		}
		w := nu.we
		pS, pA, pB := rs.Side/2*nu.side, rs.EndA/2*nu.endA, rs.EndB/2*nu.endB
		total := pS + pA + pB
		wantQ := nu.omega * w / total

		got, err := qfactor.WallQ(c, m, rs)
		if err != nil {
			t.Fatalf("WallQ(%s) error: %v", m, err)
		}
		// GeometryFactors is the same computation without the wall metal;
		// it must agree with WallQ's Geometry to the last bit.
		if g, err := qfactor.GeometryFactors(c, m); err != nil || g != got.Geometry {
			t.Errorf("GeometryFactors(%s) = %+v, %v, want %+v (WallQ)", m, g, err, got.Geometry)
		}
		checks := []struct {
			what      string
			got, want float64
		}{
			{"QWall", got.QWall, wantQ},
			{"Share.Side", got.Share.Side, pS / total},
			{"Share.EndA", got.Share.EndA, pA / total},
			{"Share.EndB", got.Share.EndB, pB / total},
			{"QSide", got.QSide, nu.omega * w / pS},
			{"Frequency", got.Frequency, nu.omega / (2 * math.Pi)},
			{"Geometry.Side", got.Geometry.Side, nu.omega * w / (nu.side / 2)},
			{"Geometry.EndA", got.Geometry.EndA, nu.omega * w / (nu.endA / 2)},
			{"Geometry.EndB", got.Geometry.EndB, nu.omega * w / (nu.endB / 2)},
			{"Geometry.Total", got.Geometry.Total(), nu.omega * w / ((nu.side + nu.endA + nu.endB) / 2)},
		}
		for _, ch := range checks {
			if relErr(ch.got, ch.want) > closedFormTol {
				t.Errorf("WallQ(%s, d/a = %g).%s = %.12g, want %.12g (quadrature)", m, aspect, ch.what, ch.got, ch.want)
			}
		}
	}
}

// TestAccelerationQuadrature checks the accelerator figures of TM0mp modes
// against quadrature: the on-axis voltage by integrating E_z(0,z) times
// cos and sin of omega z/(beta c), the stored energy by the volume integral,
// and the peak surface fields by a search over the walls.
func TestAccelerationQuadrature(t *testing.T) {
	cases := []struct {
		m      cavity.Mode
		aspect float64
		speed  float64
	}{
		{cavity.Mode{Family: cavity.TM, N: 0, M: 1, P: 0}, 0.7, 1},
		{cavity.Mode{Family: cavity.TM, N: 0, M: 1, P: 0}, 1.9, 0.45},
		{cavity.Mode{Family: cavity.TM, N: 0, M: 2, P: 0}, 0.5, 0.8},
		{cavity.Mode{Family: cavity.TM, N: 0, M: 1, P: 1}, 1.3, 1},
		{cavity.Mode{Family: cavity.TM, N: 0, M: 1, P: 2}, 2.5, 0.9},
		{cavity.Mode{Family: cavity.TM, N: 0, M: 3, P: 4}, 3.1, 0.6},
		{cavity.Mode{Family: cavity.TM, N: 0, M: 2, P: 3}, 0.4, 1},
	}
	for _, tc := range cases {
		c := cavity.Cavity{Radius: 0.05, Length: 0.05 * tc.aspect}
		f := newField(c, tc.m)
		nu := quadrature(c, tc.m)
		kappa := f.omega / (tc.speed * physics.SpeedOfLight)
		re := integrate(func(z float64) float64 { e, _ := f.at(0, 0, z); return e[2] * math.Cos(kappa*z) }, 0, c.Length)
		im := integrate(func(z float64) float64 { e, _ := f.at(0, 0, z); return e[2] * math.Sin(kappa*z) }, 0, c.Length)
		v := math.Hypot(re, im)
		// integral of |E_z| on the axis, split at the zeros of cos(p pi z/d)
		// so that every piece is smooth.
		v0, lo := 0.0, 0.0
		for k := 0; k <= tc.m.P; k++ {
			hi := c.Length
			if k < tc.m.P {
				hi = c.Length * (float64(k) + 0.5) / float64(tc.m.P)
			}
			v0 += integrate(func(z float64) float64 { e, _ := f.at(0, 0, z); return math.Abs(e[2]) }, lo, hi)
			lo = hi
		}
		w := nu.we
		e0 := 1.0 // |E_z(0,0)| of field, by construction J_0(0) = 1

		// Peak surface fields: end plates over r, side wall over z.
		epk := peak(func(r float64) float64 { e, _ := f.at(r, 0, 0); return norm(e) }, 0, c.Radius)
		epk = math.Max(epk, peak(func(z float64) float64 { e, _ := f.at(c.Radius, 0, z); return norm(e) }, 0, c.Length))
		hpk := peak(func(r float64) float64 { _, h := f.at(r, 0, 0); return norm(h) }, 0, c.Radius)
		hpk = math.Max(hpk, peak(func(z float64) float64 { _, h := f.at(c.Radius, 0, z); return norm(h) }, 0, c.Length))
		eacc := v / c.Length
		// Peak on-axis field, found by search (Wangler's E0).
		e0pk := peak(func(z float64) float64 { e, _ := f.at(0, 0, z); return math.Abs(e[2]) }, 0, c.Length)

		got, err := qfactor.Acceleration(c, tc.m, tc.speed)
		if err != nil {
			t.Fatalf("Acceleration(%s) error: %v", tc.m, err)
		}
		checks := []struct {
			what      string
			got, want float64
			tol       float64
		}{
			{"Gap", got.Gap, v / e0, closedFormTol},
			{"TransitTime", got.TransitTime, v / v0, closedFormTol},
			{"TransitTimePeak", got.TransitTimePeak, v / (e0pk * c.Length), peakTol},
			{"ROverQLinac", got.ROverQLinac, v * v / (f.omega * w), closedFormTol},
			{"ROverQCircuit", got.ROverQCircuit, v * v / (2 * f.omega * w), closedFormTol},
			{"EpkOverEacc", got.EpkOverEacc, epk / eacc, peakTol},
			{"BpkOverEacc", got.BpkOverEacc, physics.VacuumPermeability * hpk / eacc, peakTol},
		}
		for _, ch := range checks {
			if relErr(ch.got, ch.want) > ch.tol {
				t.Errorf("Acceleration(%s, d/a = %g, beta = %g).%s = %.12g, want %.12g", tc.m, tc.aspect, tc.speed, ch.what, ch.got, ch.want)
			}
		}
	}
}

// peakTol is the agreement asked of the peak fields found by a grid and
// golden-section search: near a smooth maximum the value error is the
// square of the position error, so rounding (~1e-16) in the position gives
// ~1e-8 in the value at worst; 1e-7 leaves a margin.
const peakTol = 1e-7

// peak returns the maximum of g over [lo, hi]: a grid of 2000 intervals,
// then golden-section refinement of the best bracket (the value converges
// quadratically, so to rounding).
func peak(g func(float64) float64, lo, hi float64) float64 {
	const n = 2000
	best, bi := math.Inf(-1), 0
	for i := 0; i <= n; i++ {
		if v := g(lo + (hi-lo)*float64(i)/n); v > best {
			best, bi = v, i
		}
	}
	a := lo + (hi-lo)*float64(max(bi-1, 0))/n
	b := lo + (hi-lo)*float64(min(bi+1, n))/n
	const gr = 0.6180339887498949
	for range 80 {
		x1, x2 := b-gr*(b-a), a+gr*(b-a)
		if g(x1) > g(x2) {
			b = x2
		} else {
			a = x1
		}
	}
	return math.Max(best, g((a+b)/2))
}

// TestAccelerationNoGainAndBelow: at a speed where the on-axis gain of a
// pillbox TM010 cancels (d = beta lambda: sin(pi d/(beta lambda)) = 0,
// Wangler 2008, ch. 2) Acceleration says NoGain instead of letting
// Epk/Eacc run to millions; and a TM010 cell longer than about 2.03 radii
// lists TE111 below it, exactly when the resonance formula puts TE111
// lower (Cavity.Frequency of both modes).
func TestAccelerationNoGainAndBelow(t *testing.T) {
	tm010 := cavity.Mode{Family: cavity.TM, N: 0, M: 1, P: 0}
	te111 := cavity.Mode{Family: cavity.TE, N: 1, M: 1, P: 1}
	a := 0.05
	lambda := 2 * math.Pi * a / tm010.Root() // TM010: k = j01/a, independent of d
	for _, tc := range []struct {
		d, speed float64
		noGain   bool
	}{
		{lambda, 1, true},
		{0.5 * lambda, 0.5, true},
		{0.5 * lambda, 1, false},
		{0.999 * lambda, 1, false}, // T = 1.0005e-3, just above the limit
	} {
		c := cavity.Cavity{Radius: a, Length: tc.d}
		got, err := qfactor.Acceleration(c, tm010, tc.speed)
		if err != nil {
			t.Fatal(err)
		}
		x := math.Pi * tc.d / (tc.speed * lambda)
		T := math.Abs(math.Sin(x) / x) // Wangler 2008, ch. 2, pillbox transit-time factor
		want := T < qfactor.MinTransitTime
		if got.NoGain != want {
			t.Errorf("d = %g lambda, beta = %g: NoGain = %v, want %v (T = %g)", tc.d/lambda, tc.speed, got.NoGain, want, T)
		}
		if want != tc.noGain {
			t.Errorf("d = %g lambda, beta = %g: test case expects NoGain = %v, but T = %g", tc.d/lambda, tc.speed, tc.noGain, T)
		}
		below := c.Frequency(te111) < c.Frequency(tm010)
		hasTE111 := false
		for _, b := range got.Below {
			hasTE111 = hasTE111 || b.Mode == te111
			if b.Frequency >= got.Frequency {
				t.Errorf("d = %g m: %v at %g Hz listed below TM010 at %g Hz", tc.d, b.Mode, b.Frequency, got.Frequency)
			}
		}
		if hasTE111 != below || (got.BelowCount > 0) != below {
			t.Errorf("d = %g m: Below = %v (count %d), want TE111 listed = %v", tc.d, got.Below, got.BelowCount, below)
		}
	}
}
