package cavity

import (
	"errors"
	"fmt"
	"math"
	"slices"
)

// TuningPoint is one point of a tuning curve.
type TuningPoint struct {
	Length    float64 // end-plate spacing, m
	Frequency float64 // wanted-mode frequency, Hz
	DfDL      float64 // slope df/dL, Hz/m
	Clearance float64 // clearance there, fraction
	Limiting  Mode    // the mode that sets it
}

// Crossing is a mode that passes through the wanted mode's frequency as
// the end plate moves.
type Crossing struct {
	Mode      Mode
	Length    float64 // where the two frequencies are equal, m
	Frequency float64 // Hz
}

// TuningCurve is the result of Cavity.Tune.
type TuningCurve struct {
	Mode     Mode
	Diameter float64 // m
	Points   []TuningPoint
	// Worst is the smallest clearance anywhere on the range (not only at
	// the points), at WorstLength, set by WorstMode. It is zero when a
	// mode crosses the wanted one.
	Worst       float64
	WorstLength float64
	WorstMode   Mode
	// Crossings lists every mode that crosses the wanted one inside the
	// range, by increasing length.
	Crossings []Crossing
}

// MaxTuneSteps bounds the number of steps of a tuning curve.
const MaxTuneSteps = 100000

// Tune returns the exact tuning curve of mode w in a cavity of c's radius
// and fill whose end plate moves so that the length runs over lMin..lMax
// (c.Length is ignored): the frequency, its slope and the clearance at
// steps+1 evenly spaced lengths, the exact worst clearance over the whole
// range, and every mode crossing.
//
// Method: f(L) is the resonance formula (Pozar, Microwave Engineering, 4th
// ed., sec. 6.4) and df/dL = -f (beta/k)^2 / L (derived; see Sensitivity).
// On the mode chart the end-plate motion is a segment of s = (D/L)^2, along
// which each ratio f_i/f_w is monotone (see chartMode), so the smallest
// |f_i/f_w - 1| of each mode over the range is at an end of the segment or
// zero where it crosses; crossings solve a linear equation in s (derived).
// Errors: invalid cavity radius, fill or mode, a mode an end plate does
// not tune (p = 0; see EndPlateTuning), lengths outside
// MinSize..MaxSize or lMin > lMax, D/L outside MinDesignRatio..MaxDesignRatio
// anywhere on the range, more than MaxChartModes modes near the wanted one,
// steps outside 1..MaxTuneSteps.
func (c Cavity) Tune(w Mode, lMin, lMax float64, steps int, countDegenerate bool) (TuningCurve, error) {
	c.Length = lMin
	if err := c.Validate(); err != nil {
		return TuningCurve{}, err
	}
	if err := w.Validate(); err != nil {
		return TuningCurve{}, err
	}
	if err := w.EndPlateTuning(); err != nil {
		return TuningCurve{}, err
	}
	if err := checkSize("maximum length", lMax); err != nil {
		return TuningCurve{}, err
	}
	if lMin > lMax {
		return TuningCurve{}, fmt.Errorf("cavity: length range must have min <= max, got %g m..%g m", lMin, lMax)
	}
	if steps < 1 || steps > MaxTuneSteps {
		return TuningCurve{}, fmt.Errorf("cavity: tuning steps must be in 1..%d, got %d", MaxTuneSteps, steps)
	}
	D := c.Diameter()
	if r0, r1 := D/lMax, D/lMin; !(r0 >= MinDesignRatio && r1 <= MaxDesignRatio) {
		return TuningCurve{}, fmt.Errorf("cavity: D/L over the tuning range must stay in %g..%g (the reach of the mode chart), got %.6g..%.6g", MinDesignRatio, MaxDesignRatio, r0, r1)
	}
	full := interval{sq(D / lMax), sq(D / lMin)}
	wc := newChartMode(w)
	env, _, err := boundedEnvelope(wc, newPath(0, 0, 1, 1), full, countDegenerate)
	if err != nil {
		return TuningCurve{}, err
	}
	out := TuningCurve{Mode: w, Diameter: D, Worst: math.Inf(1)}
	for i := 0; i <= steps; i++ {
		L := lMin + (lMax-lMin)*float64(i)/float64(steps)
		if i == steps {
			L = lMax
		}
		cc := c
		cc.Length = L
		f := cc.Frequency(w)
		_, beta, k := cc.Wavenumbers(w)
		v, kk := env.at(sq(D/L), nil)
		pt := TuningPoint{Length: L, Frequency: f, DfDL: -f * sq(beta/k) / L, Clearance: v}
		if kk >= 0 {
			pt.Limiting = env.modes[kk].mode
		}
		out.Points = append(out.Points, pt)
	}
	// Exact worst case over the segment: the same computation as Reach.
	sp, err := spanClearance(wc, full, 0, countDegenerate)
	if err != nil {
		return TuningCurve{}, err
	}
	out.Worst, out.WorstMode, out.WorstLength = sp.worst, sp.worstMode, D/math.Sqrt(sp.worstS)
	for i, o := range sp.modes {
		if o.Crosses {
			L := D / math.Sqrt(sp.crossS[i])
			cc := c
			cc.Length = L
			out.Crossings = append(out.Crossings, Crossing{Mode: o.Mode, Length: L, Frequency: cc.Frequency(w)})
		}
	}
	slices.SortFunc(out.Crossings, func(a, b Crossing) int { return cmpFloat(a.Length, b.Length) })
	return out, nil
}

// Perturbation is the frequency shift of a small metal object.
type Perturbation struct {
	// Relative is the fractional shift Delta f / f; Shift is Delta f in Hz.
	Relative, Shift float64
	// RadiusOverWavelength is r0 / lambda in the fill and
	// RadiusOverWallGap r0 / (distance from the centre to the nearest wall
	// not touched); both must be small for the formula to hold.
	RadiusOverWavelength, RadiusOverWallGap float64
	// Valid is true when r0 <= 0.05 lambda and r0 <= 0.2 times the gap,
	// the limits this package uses for "small" (first-order error then
	// below a few per cent; common practice).
	Valid bool
	// OnWall is true for a hemispherical boss on a wall (a screw tip), false
	// for a free sphere.
	OnWall bool
}

// SphereShift returns the frequency shift of mode m when a small perfectly
// conducting sphere of radius r0 is centred at p, from Slater's
// perturbation theorem (J. C. Slater, "Microwave electronics", Rev. Mod.
// Phys. 18, 441, 1946; L. C. Maier and J. C. Slater, "Field strength
// measurements in resonant cavities", J. Appl. Phys. 23, 68, 1952) with the
// quasi-static dipole moments of a conducting sphere (electric 4 pi eps r0^3
// E, magnetic -2 pi r0^3 H):
//
//	Delta omega / omega = -pi r0^3 (eps |E|^2 - mu |H|^2 / 2) / W,
//
// E and H the unperturbed peak fields at p and W the time-averaged stored
// energy. A point on a wall (rho = a, z = 0 or z = L) is a hemispherical
// boss there, the usual model of a tuning-screw tip: by images in the
// wall the shift is half that of a whole sphere in the wall field (derived).
//
// Validity: r0 much smaller than the wavelength and than the distance to
// every other wall, so that the field is uniform over the sphere and its
// images do not interact; see Perturbation.Valid. Errors: invalid input, a
// sphere that does not fit inside the cavity.
func (c Cavity) SphereShift(m Mode, p Point, r0 float64) (Perturbation, error) {
	mf, err := c.ModeField(m)
	if err != nil {
		return Perturbation{}, err
	}
	if err := c.checkPoint(p); err != nil {
		return Perturbation{}, err
	}
	if !(r0 > 0) || math.IsInf(r0, 0) {
		return Perturbation{}, fmt.Errorf("cavity: sphere radius must be finite and > 0 m, got %g m", r0)
	}
	const onTol = 1e-9
	onSide := math.Abs(p.Rho-c.Radius) <= onTol*c.Radius
	onEnd := p.Z <= onTol*c.Length || math.Abs(p.Z-c.Length) <= onTol*c.Length
	out := Perturbation{OnWall: onSide || onEnd}
	// Distance to the walls the object does not sit on.
	gap := math.Inf(1)
	if !onSide {
		gap = math.Min(gap, c.Radius-p.Rho)
	}
	if !onEnd {
		gap = math.Min(gap, math.Min(p.Z, c.Length-p.Z))
	} else {
		gap = math.Min(gap, c.Length) // the opposite end plate
	}
	if onSide {
		gap = math.Min(gap, 2*c.Radius)
	}
	if gap <= r0 {
		return Perturbation{}, fmt.Errorf("cavity: a sphere of radius %g m at (rho = %g m, z = %g m) does not fit: the nearest wall is %g m away", r0, p.Rho, p.Z, gap)
	}
	fd := mf.At(p)
	rel := -math.Pi * r0 * r0 * r0 * (mf.eps*fd.E.Norm2() - mf.mu*fd.H.Norm2()/2) / 1 // W = 1 J
	if out.OnWall {
		rel /= 2
	}
	f := mf.omega / (2 * math.Pi)
	lambda := 2 * math.Pi / (mf.omega * math.Sqrt(mf.eps*mf.mu))
	out.Relative, out.Shift = rel, rel*f
	out.RadiusOverWavelength, out.RadiusOverWallGap = r0/lambda, r0/gap
	out.Valid = out.RadiusOverWavelength <= 0.05 && out.RadiusOverWallGap <= 0.2
	return out, nil
}

// EndPlateShift returns the frequency shift d f of mode m when end plate B
// moves inward by delta (the length becomes L - delta), from Slater's
// theorem for a removed volume Delta V (Slater 1946; Pozar, Microwave
// Engineering, 4th ed., sec. 6.7, cavity perturbations):
//
//	Delta omega / omega = integral_DeltaV (mu |H|^2 - eps |E|^2) dV / (4 W),
//
// with the unperturbed fields on the plate (the slab is thin) integrated
// numerically over the plate (Gauss-Legendre in rho, trapezoid in phi,
// both exact to rounding for these smooth integrands). This is an
// independent route to Sensitivity.DfDL: first order in delta, the two
// agree. Errors: invalid cavity or mode, delta not finite.
func (c Cavity) EndPlateShift(m Mode, delta float64) (float64, error) {
	mf, err := c.ModeField(m)
	if err != nil {
		return 0, err
	}
	if math.IsNaN(delta) || math.IsInf(delta, 0) {
		return 0, fmt.Errorf("cavity: end-plate motion must be finite, got %g m", delta)
	}
	nodes, weights := gaussLegendre(48)
	nphi := 4*m.N + 8
	var sum float64
	for i, x := range nodes {
		rho := c.Radius * (x + 1) / 2
		wr := weights[i] * c.Radius / 2 * rho
		for j := range nphi {
			phi := 2 * math.Pi * float64(j) / float64(nphi)
			fd := mf.At(Point{Rho: rho, Phi: phi, Z: c.Length})
			sum += wr * (2 * math.Pi / float64(nphi)) * (mf.mu*fd.H.Norm2() - mf.eps*fd.E.Norm2())
		}
	}
	// 4 W = 4 J for the normalised field.
	return mf.omega / (2 * math.Pi) * delta * sum / 4, nil
}

// gaussLegendre returns the n nodes and weights of Gauss-Legendre
// quadrature on [-1, 1], computed by Newton's method on the Legendre
// recurrence (Press et al., Numerical Recipes, 3rd ed., sec. 4.6, routine
// gauleg).
func gaussLegendre(n int) (x, w []float64) {
	x, w = make([]float64, n), make([]float64, n)
	for i := range (n + 1) / 2 {
		z := math.Cos(math.Pi * (float64(i) + 0.75) / (float64(n) + 0.5))
		var pp float64
		for range 100 {
			p1, p2 := 1.0, 0.0
			for j := 0; j < n; j++ {
				p3 := p2
				p2 = p1
				p1 = ((2*float64(j)+1)*z*p2 - float64(j)*p3) / float64(j+1)
			}
			pp = float64(n) * (z*p1 - p2) / (z*z - 1)
			z1 := z
			z = z1 - p1/pp
			if math.Abs(z-z1) < 1e-15 {
				break
			}
		}
		x[i], x[n-1-i] = -z, z
		w[i] = 2 / ((1 - z*z) * pp * pp)
		w[n-1-i] = w[i]
	}
	return x, w
}

// ErrNotTunable is matched by errors.Is for every NotTunableError.
var ErrNotTunable = errors.New("cavity: an end plate does not tune this mode")

// NotTunableError says that moving an end plate does not tune a mode.
type NotTunableError struct{ Mode Mode }

// Error says why, and what tunes the mode instead.
func (e *NotTunableError) Error() string {
	return fmt.Sprintf("%s has p = 0: its fields and frequency do not depend on the length (df/dL = 0), so an end plate does not tune it; tune it with a plunger, screw or dielectric in its strong field (Slater perturbation) or change the diameter", e.Mode)
}

// Is reports whether target is ErrNotTunable.
func (e *NotTunableError) Is(target error) bool { return target == ErrNotTunable }

// EndPlateTuning is the one verdict on whether moving an end plate tunes
// mode m: nil for p >= 1, a *NotTunableError for p = 0 (TM0m0 and every
// TMnm0: f = c x / (2 pi a sqrt(eps_r mu_r)) holds for any length; Pozar,
// Microwave Engineering, 4th ed., sec. 6.4, with p = 0). Tune, Optimize
// with a tuning range, Reach with a tuning range, the mode chart and the
// datasheet all use it. It panics on an invalid mode.
func (m Mode) EndPlateTuning() error {
	if err := m.Validate(); err != nil {
		panic(err)
	}
	if m.P == 0 {
		return &NotTunableError{Mode: m}
	}
	return nil
}
