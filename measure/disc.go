package measure

import (
	"errors"
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/physics/quad"
)

// ErrDiscMode is wrapped by the disc model's error for a mode it does not
// handle (anything but TE0mp).
var ErrDiscMode = errors.New("not implemented")

// DiscPoint is one TE0mp resonance of a cavity with a dielectric disc of
// its full diameter lying on one end plate (see DiscResonance).
type DiscPoint struct {
	F float64 // resonant frequency, Hz
	// G is the geometry factor of all the metal walls together, ohm:
	// Q_wall = G/Rs for walls of one metal.
	G float64
	// FillE is the disc's electric filling factor: the fraction of the
	// mode's electric energy inside the disc.
	FillE float64
}

// maxDiscEps bounds the permittivity the disc inversion searches.
const maxDiscEps = 1000

// DiscResonance returns the TE0mp resonance m of a closed cylinder of
// radius a and length l with a dielectric disc of thickness t and relative
// permittivity epsR (non-magnetic) filling its whole cross-section on one
// end plate, the rest vacuum. The disc keeps the fields separable:
// E_phi = J1(kc r) e(z) with kc = j'_0m / a, and in each layer
// d2e/dz2 = -(k0^2 eps_r - kc^2) e with e and e' continuous at the disc's face
// and e = 0 on both end plates: the transverse-resonance condition of the
// layered guide (R. E. Collin, Field Theory of Guided Waves, 2nd ed., IEEE
// Press, 1991, ch. 5 and 8; recalled from memory). The p-th root in k0 of
// e(l) = 0, shooting from e(0) = 0, e'(0) = 1, is the resonance (Sturm's
// oscillation theorem: the roots are simple and ordered); it is bracketed
// by a scan and refined by bisection to rounding.
//
// With H_z = kc J0(kc r) e / (omega mu0) and H_r = J1(kc r) e' / (omega
// mu0) (Maxwell's curl equations; J1(j'_0m) = 0 and the radial integrals
// of DLMF 10.22.5), the geometry factor of the walls and the disc's filling
// factor are (derived; checked in the tests against the closed forms of an
// empty cavity and against the mode-matching solver of package axisym):
//
//	G = omega^3 mu0^2 eps0 (a^2/2) int eps_r e^2 dz / (a kc^2 int e^2 dz + (a^2/2)(e'(0)^2 + e'(l)^2))
//	FillE = int_disc eps_r e^2 dz / int eps_r e^2 dz
//
// the z integrals by composite Gauss-Legendre quadrature.
//
// Errors: a mode other than TE0mp (wrapping ErrDiscMode), dimensions not
// positive, a disc not thinner than the cavity, epsR < 1.
func DiscResonance(a, l, t, epsR float64, m cavity.Mode) (DiscPoint, error) {
	if err := m.Validate(); err != nil {
		return DiscPoint{}, err
	}
	if m.Family != cavity.TE || m.N != 0 {
		return DiscPoint{}, fmt.Errorf("measure: the disc model handles TE0mp modes only (E parallel to the disc), got %s: %w", m, ErrDiscMode)
	}
	if !(a > 0) || !(l > 0) || !(t > 0) || math.IsInf(a+l+t, 0) {
		return DiscPoint{}, fmt.Errorf("measure: radius, length and disc thickness must be > 0 and finite, got %g m, %g m, %g m", a, l, t)
	}
	if !(t < l) {
		return DiscPoint{}, fmt.Errorf("measure: the disc (%g m) must be thinner than the cavity is long (%g m)", t, l)
	}
	if !(epsR >= 1) || epsR > maxDiscEps {
		return DiscPoint{}, fmt.Errorf("measure: disc permittivity must be in 1..%d, got %g", maxDiscEps, epsR)
	}
	kc := m.Root() / a
	ly := []layer{{t, epsR}, {l - t, 1}}
	k0, err := discK0(ly, kc, l, epsR, m)
	if err != nil {
		return DiscPoint{}, err
	}
	// Integrals of e^2 over each layer.
	var ie, iee float64 // int e^2, int eps e^2
	var idisc float64
	z0 := 0.0
	for i, y := range ly {
		panels := 8 + int(math.Ceil(math.Sqrt(math.Abs(k0*k0*y.eps-kc*kc))*y.d/(math.Pi/4)))
		var s float64
		for _, q := range quad.Composite(z0, z0+y.d, panels, 8) {
			e, _ := shoot(ly, kc, k0, q.X)
			s += q.W * e * e
		}
		ie += s
		iee += y.eps * s
		if i == 0 {
			idisc = y.eps * s
		}
		z0 += y.d
	}
	_, d1 := shoot(ly, kc, k0, l)
	omega := k0 * physics.SpeedOfLight
	mu0, eps0 := physics.VacuumPermeability, physics.VacuumPermittivity
	g := omega * omega * omega * mu0 * mu0 * eps0 * (a * a / 2) * iee / (a*kc*kc*ie + a*a/2*(1+d1*d1))
	return DiscPoint{F: omega / (2 * math.Pi), G: g, FillE: idisc / iee}, nil
}

// discK0 returns the free-space wavenumber of resonance m of the layered
// cavity ly (length l, radial wavenumber kc, largest eps_r epsR).
func discK0(ly []layer, kc, l, epsR float64, m cavity.Mode) (float64, error) {
	kEmpty := math.Hypot(kc, float64(m.P)*math.Pi/l)
	if epsR == 1 {
		return kEmpty, nil
	}
	lo := kc / math.Sqrt(epsR) // below: no oscillation in either layer
	hi := kEmpty * (1 + 1e-9)  // a fill only lowers the resonances
	step := math.Pi / (16 * math.Sqrt(epsR) * l)
	k0, found := nthRoot(func(k float64) float64 { e, _ := shoot(ly, kc, k, l); return e }, lo, hi, step, m.P)
	if !found {
		return 0, fmt.Errorf("measure: %s of the disc-loaded cavity not found below the empty cavity's frequency", m)
	}
	return k0, nil
}

// layer is one slab of the layered cavity: thickness and eps_r.
type layer struct{ d, eps float64 }

// shoot returns e(z) and e'(z) of the layered problem for wavenumber k0,
// from e(0) = 0, e'(0) = 1 (the transfer matrix of each layer).
func shoot(ly []layer, kc, k0, z float64) (e, de float64) {
	e, de = 0, 1
	z0 := 0.0
	for _, y := range ly {
		d := math.Min(z-z0, y.d)
		if d <= 0 {
			break
		}
		b2 := k0*k0*y.eps - kc*kc
		var c, s, q float64 // e(z0+d) = c e + s e', e'(z0+d) = q e + c e'
		switch {
		case b2 > 0:
			b := math.Sqrt(b2)
			c, s, q = math.Cos(b*d), math.Sin(b*d)/b, -b*math.Sin(b*d)
		case b2 < 0:
			al := math.Sqrt(-b2)
			c, s, q = math.Cosh(al*d), math.Sinh(al*d)/al, al*math.Sinh(al*d)
		default:
			c, s, q = 1, d, 0
		}
		e, de = c*e+s*de, q*e+c*de
		z0 += y.d
	}
	return e, de
}

// nthRoot returns the n-th sign change of f on [lo, hi], scanned with the
// given step and refined by bisection to rounding.
func nthRoot(f func(float64) float64, lo, hi, step float64, n int) (float64, bool) {
	count := 0
	x0, f0 := lo, f(lo)
	for x0 < hi {
		x1 := math.Min(x0+step, hi)
		f1 := f(x1)
		if f1 == 0 || (f0 < 0) != (f1 < 0) {
			count++
			if count == n {
				a, b, fa := x0, x1, f0
				for range 200 {
					mid := (a + b) / 2
					if mid <= a || mid >= b {
						break
					}
					fm := f(mid)
					if (fm < 0) == (fa < 0) && fm != 0 {
						a, fa = mid, fm
					} else {
						b = mid
					}
				}
				return (a + b) / 2, true
			}
		}
		x0, f0 = x1, f1
	}
	return 0, false
}

// DiscInput is an empty and a disc-loaded measurement of the same TE0mp
// resonance of one cavity, with the dimensions and every standard
// uncertainty.
type DiscInput struct {
	Mode                    cavity.Mode
	Radius, RadiusErr       float64 // cavity radius, m
	Length, LengthErr       float64 // cavity length, m
	Thickness, ThicknessErr float64 // disc thickness, m
	FEmpty, FEmptyErr       float64 // Hz
	FFilled, FFilledErr     float64 // Hz, with the disc
	Q0Empty, Q0EmptyErr     float64
	Q0Filled, Q0FilledErr   float64
	// RsExponentErr is the standard uncertainty of the exponent a of
	// Rs ~ f^a (0 means 0.1), as in DielectricInput.
	RsExponentErr float64
}

// DiscResult is the disc's permittivity and loss tangent (with the
// budget), its electric filling factor and the wall Q of the loaded
// cavity inferred from the empty one.
type DiscResult struct {
	DielectricResult
	FillE float64
	QWall float64
}

// MeasureDisc returns the relative permittivity and loss tangent of a
// dielectric disc of the cavity's full diameter lying on one end plate,
// from the empty and the loaded measurement of one TE0mp resonance
// (DiscResonance's model). eps_r solves
//
//	F(eps_r) / F(1) = f_filled / f_empty
//
// by bisection (the ratio falls monotonically with eps_r: the Rayleigh
// quotient), so that the dimensions enter only through the shape of the
// model, not its scale. The loss tangent follows from the filling-factor
// relation 1/Q0 = FillE tan(delta) + 1/Q_wall (J. Krupka, Meas. Sci.
// Technol. 17, R55 (2006), sec. 2; recalled from memory), with the wall Q
// of the loaded cavity scaled from the measured empty Q0 by the model:
//
//	Q_wall = Q0_empty (G(eps_r)/G(1)) (f_empty/f_filled)^a,  Rs ~ f^a, a = 1/2,
//
// which assumes walls of one metal and the empty cavity's loss all in its
// walls. The uncertainty budget propagates each input (both frequencies
// and Q0s, the radius, length and thickness, and the exponent a) to first
// order by central differences; the terms add in quadrature. An input
// whose uncertainty is NaN (unknown, such as the radius fitted from as
// many resonances as unknowns) has a NaN term, left out of the totals.
//
// Errors: the model's (DiscResonance), f_filled not below f_empty, a
// permittivity above the search range, a loss tangent negative beyond
// three standard deviations.
func MeasureDisc(in DiscInput) (DiscResult, error) {
	for _, v := range []struct {
		name string
		x    float64
	}{{"empty frequency", in.FEmpty}, {"filled frequency", in.FFilled}, {"empty Q0", in.Q0Empty}, {"filled Q0", in.Q0Filled}} {
		if !(v.x > 0) || math.IsInf(v.x, 0) {
			return DiscResult{}, fmt.Errorf("measure: %s must be > 0 and finite, got %g", v.name, v.x)
		}
	}
	if !(in.FFilled < in.FEmpty) {
		return DiscResult{}, fmt.Errorf("measure: the loaded frequency %g Hz must be below the empty %g Hz (a disc with eps_r > 1)", in.FFilled, in.FEmpty)
	}
	if _, err := DiscResonance(in.Radius, in.Length, in.Thickness, 1, in.Mode); err != nil {
		return DiscResult{}, err
	}
	aErr := in.RsExponentErr
	if aErr == 0 {
		aErr = 0.1
	}
	x := [8]float64{in.FEmpty, in.FFilled, in.Q0Empty, in.Q0Filled, 0.5, in.Radius, in.Length, in.Thickness}
	sig := [8]float64{in.FEmptyErr, in.FFilledErr, in.Q0EmptyErr, in.Q0FilledErr, aErr, in.RadiusErr, in.LengthErr, in.ThicknessErr}
	names := [8]string{"empty frequency", "filled frequency", "empty Q0", "filled Q0", "wall model (Rs ~ f^a, a = 0.5)", "cavity radius", "cavity length", "disc thickness"}
	eval := func(x [8]float64) (discEval, error) { return discAt(in.Mode, x) }
	c, err := eval(x)
	if err != nil {
		return DiscResult{}, err
	}
	r := DiscResult{DielectricResult: DielectricResult{EpsR: c.eps, TanDelta: c.tand}, FillE: c.fill, QWall: c.qwall}
	var ve, vt float64
	for i := range x {
		if sig[i] == 0 {
			r.Budget = append(r.Budget, BudgetTerm{Input: names[i]})
			continue
		}
		if math.IsNaN(sig[i]) {
			// Unknown (a fit with no redundancy): shown as NaN, left out
			// of the totals.
			r.Budget = append(r.Budget, BudgetTerm{Input: names[i], EpsR: math.NaN(), TanDelta: math.NaN()})
			continue
		}
		h := 1e-5 * math.Abs(x[i])
		if i == 4 {
			h = 1e-4
		}
		xp, xm := x, x
		xp[i] += h
		xm[i] -= h
		p, err1 := eval(xp)
		m, err2 := eval(xm)
		if err := errors.Join(err1, err2); err != nil {
			return DiscResult{}, fmt.Errorf("measure: uncertainty of %s: %w", names[i], err)
		}
		te := (p.eps - m.eps) / (2 * h) * sig[i]
		tt := (p.tand - m.tand) / (2 * h) * sig[i]
		r.Budget = append(r.Budget, BudgetTerm{Input: names[i], EpsR: math.Abs(te), TanDelta: math.Abs(tt)})
		ve += te * te
		vt += tt * tt
	}
	r.EpsRErr, r.TanDeltaErr = math.Sqrt(ve), math.Sqrt(vt)
	if r.TanDelta < -3*r.TanDeltaErr {
		return r, fmt.Errorf("measure: loss tangent %.3g is negative beyond its uncertainty %.2g: the loaded Q0 is higher than the walls alone allow; check the two measurements", r.TanDelta, r.TanDeltaErr)
	}
	return r, nil
}

// discEval is the disc measurement at one set of inputs.
type discEval struct{ eps, tand, fill, qwall float64 }

// discAt evaluates MeasureDisc's formulas at x = (f_empty, f_filled,
// Q0_empty, Q0_filled, a, radius, length, thickness).
func discAt(m cavity.Mode, x [8]float64) (discEval, error) {
	fe, ff, qe, qf, a, rad, l, t := x[0], x[1], x[2], x[3], x[4], x[5], x[6], x[7]
	p1, err := DiscResonance(rad, l, t, 1, m)
	if err != nil {
		return discEval{}, err
	}
	want := ff / fe
	kc := m.Root() / rad
	ratio := func(eps float64) (float64, error) {
		k, err := discK0([]layer{{t, eps}, {l - t, 1}}, kc, l, eps, m)
		return k * physics.SpeedOfLight / (2 * math.Pi) / p1.F, err
	}
	rmax, err := ratio(maxDiscEps)
	if err != nil {
		return discEval{}, err
	}
	if want <= rmax {
		return discEval{}, fmt.Errorf("measure: the frequency ratio %.6g needs a disc permittivity above %d; check the thickness and the mode", want, maxDiscEps)
	}
	lo, hi := 1.0, float64(maxDiscEps)
	for range 200 {
		mid := (lo + hi) / 2
		if mid <= lo || mid >= hi {
			break
		}
		r, err := ratio(mid)
		if err != nil {
			return discEval{}, err
		}
		if r > want {
			lo = mid
		} else {
			hi = mid
		}
	}
	eps := (lo + hi) / 2
	p, err := DiscResonance(rad, l, t, eps, m)
	if err != nil {
		return discEval{}, err
	}
	qw := qe * (p.G / p1.G) * math.Pow(fe/ff, a)
	tand := (1/qf - 1/qw) / p.FillE
	return discEval{eps: eps, tand: tand, fill: p.FillE, qwall: qw}, nil
}

// DiscSample evaluates MeasureDisc's eps_r and tan(delta) for the inputs
// in (uncertainties ignored) and the wall exponent a of Rs ~ f^a, for a
// Monte Carlo of the inputs.
func DiscSample(in DiscInput, a float64) (epsR, tanDelta float64, err error) {
	c, err := discAt(in.Mode, [8]float64{in.FEmpty, in.FFilled, in.Q0Empty, in.Q0Filled, a, in.Radius, in.Length, in.Thickness})
	return c.eps, c.tand, err
}

// DiscSpec describes the disc of MeasureDiscFill: its thickness and
// that thickness's standard uncertainty (m), and its nominal relative
// permittivity, which only picks the loaded resonance of each mode.
type DiscSpec struct {
	Thickness, ThicknessErr float64
	NominalEps              float64
}

// MeasureDiscFill measures a full-diameter disc lying on one end plate
// from the empty sweep (resonances empty, identified in idEmpty, whose
// fitted cavity and its uncertainties give the dimensions) and the loaded
// sweep (resonances filled), at every TE0mp mode matched in the empty
// sweep: its loaded resonance is the one nearest the frequency the disc
// model (DiscResonance) predicts with the nominal permittivity, each
// loaded resonance taken once; MeasureDisc gives eps_r and tan(delta).
// The means are weighted as in MeasureFill. A nominal permittivity far
// from the truth can pick the wrong loaded resonance: the mode's
// residual (the loaded frequency against the model at the measured
// eps_r) is then no help, so give a nominal value within about 20 %.
//
// Errors: no TE0mp mode matched in the empty sweep, no loaded resonance
// left for one, or a failed measurement at a mode (the error names it).
func MeasureDiscFill(empty []Resonance, idEmpty Identification, filled []Resonance, d DiscSpec) (Fill, error) {
	c := idEmpty.Cavity
	var out Fill
	used := make([]bool, len(filled))
	for i, a := range idEmpty.Assign {
		if !a.Matched || a.Mode.Family != cavity.TE || a.Mode.N != 0 || empty[i].Problem != "" {
			continue
		}
		p, err := DiscResonance(c.Radius, c.Length, d.Thickness, d.NominalEps, a.Mode)
		if err != nil {
			return Fill{}, fmt.Errorf("%v: %w", a.Mode, err)
		}
		j := -1
		for k, f := range filled {
			if used[k] || f.Problem != "" {
				continue
			}
			if j < 0 || math.Abs(f.F0-p.F) < math.Abs(filled[j].F0-p.F) {
				j = k
			}
		}
		if j < 0 {
			return Fill{}, fmt.Errorf("%v: no loaded resonance left to pair with it", a.Mode)
		}
		used[j] = true
		e, f := empty[i], filled[j]
		r, err := MeasureDisc(DiscInput{
			Mode: a.Mode, Radius: c.Radius, RadiusErr: idEmpty.RadiusErr, Length: c.Length, LengthErr: idEmpty.LengthErr,
			Thickness: d.Thickness, ThicknessErr: d.ThicknessErr,
			FEmpty: e.F0, FEmptyErr: e.F0Err, FFilled: f.F0, FFilledErr: f.F0Err,
			Q0Empty: e.Q0, Q0EmptyErr: e.Q0Err, Q0Filled: f.Q0, Q0FilledErr: f.Q0Err,
		})
		if err != nil {
			return Fill{}, fmt.Errorf("%v: %w", a.Mode, err)
		}
		out.Modes = append(out.Modes, FillMode{Mode: a.Mode, FEmpty: e.F0, FFilled: f.F0, Result: r.DielectricResult, FillE: r.FillE})
	}
	if len(out.Modes) == 0 {
		return Fill{}, fmt.Errorf("no TE0mp mode is identified in the empty sweep, so the disc cannot be measured (the disc model needs TE0mp modes)")
	}
	out.combine()
	return out, nil
}
