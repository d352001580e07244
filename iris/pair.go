package iris

import (
	"errors"
	"fmt"
	"math"

	"cylcav/axisym"
	"cylcav/cavity"
	"cylcav/physics"
)

// Pair is two equal closed cylindrical cells on one axis joined by a
// centred circular iris in the wall between them: the body whose split
// resonance pair gives the coupling of two in-line resonators.
type Pair struct {
	// Radius and Length are each cell's inner radius and length, m.
	Radius, Length float64
	// Fill is the medium of both cells and the iris (zero value: vacuum).
	Fill physics.Medium
	// Mode is the cell mode the pair splits from: a TE0mp or TM0mp mode
	// (azimuthal order 0; the iris is centred, so the body stays
	// axisymmetric).
	Mode cavity.Mode
	// Wall is the thickness of the wall the iris pierces, m (at least
	// cavity.MinSize: the solver needs a section there).
	Wall float64
	// Modes is the number of waveguide modes in the widest section of the
	// mode-matching model; zero means axisym.DefaultModes.
	Modes int
}

// Cell returns the closed cell of the pair.
func (p Pair) Cell() cavity.Cavity {
	return cavity.Cavity{Radius: p.Radius, Length: p.Length, Fill: p.Fill}
}

// Body returns the axisymmetric body of the pair with an iris of radius r:
// cell, iris (length Wall, radius r), cell.
func (p Pair) Body(r float64) axisym.Body {
	return axisym.Body{Sections: []axisym.Section{
		{Length: p.Length, Radius: p.Radius, Fill: p.Fill},
		{Length: p.Wall, Radius: r, Fill: p.Fill},
		{Length: p.Length, Radius: p.Radius, Fill: p.Fill},
	}}
}

// Validate checks the pair: a valid cell and n = 0 mode, a wall of at least
// cavity.MinSize, a mode count in 0..axisym.MaxModes.
func (p Pair) Validate() error {
	if err := p.Mode.Validate(); err != nil {
		return err
	}
	if p.Mode.N != 0 {
		return fmt.Errorf("iris: %s has azimuthal order %d; a centred iris is solved exactly only for TE0mp and TM0mp modes (n = 0)", p.Mode, p.Mode.N)
	}
	if err := p.Cell().Validate(); err != nil {
		return fmt.Errorf("iris: cell: %w", err)
	}
	if err := p.Fill.RequireIsotropic("iris: the axisymmetric iris model"); err != nil {
		return err
	}
	if !(p.Wall >= cavity.MinSize && p.Wall <= cavity.MaxSize) {
		return fmt.Errorf("iris: wall thickness must be in %g..%g m, got %g m", cavity.MinSize, cavity.MaxSize, p.Wall)
	}
	if p.Modes < 0 || p.Modes > axisym.MaxModes {
		return fmt.Errorf("iris: modes must be in 0..%d (0: %d), got %d", axisym.MaxModes, axisym.DefaultModes, p.Modes)
	}
	return nil
}

// Point is the pair solved at one iris radius.
type Point struct {
	// Radius is the iris radius, m.
	Radius float64
	// K is the coupling coefficient (Hong and Lancaster 2001, sec. 8.2)
	// and KChange its convergence estimate (axisym.CouplingOf).
	K, KChange float64
	// Low and High are the two resonances of the pair, Hz.
	Low, High float64
	// Self is the frequency of one cell loaded by the iris,
	// sqrt(2 fl^2 fh^2 / (fl^2 + fh^2)) (derived below), and Shift its
	// relative shift from the closed cell, Self/f_cell - 1.
	Self, Shift float64
	// Isolation is the distance from the pair to the nearest other
	// resonance of the family, divided by the split High - Low (where none
	// lies above the pair within the search, the distance to the search
	// limit: a lower bound; +Inf for an exactly degenerate pair's
	// neighbours below when there are none).
	Isolation float64
}

// ErrNoPair is wrapped when the body has no resonance pair where the cell
// mode splits (for example an iris so large that the cells are no longer
// two resonators).
var ErrNoPair = errors.New("no split pair")

// searchMargin is how far above the closed cell's frequency the solver
// searches for the upper member of the pair (common practice: well above
// any split of a usable coupling, |k| < 10 %); the search doubles it when
// the pair is not complete.
const searchMargin = 0.15

// At solves the pair with an iris of radius r (0 < r < Radius).
//
// The cell mode is the q-th of its family in the closed cell (frequency
// order, n = 0); two cells that do not touch have every resonance twice,
// and as the iris opens each doubled resonance splits into an even and an
// odd one without crossing others of its class, so the pair is the
// (2q-1)-th and 2q-th resonance of the family of the body (continuation,
// as in axisym's labels: von Neumann and Wigner 1929). Their spacing gives
// k = (fh^2 - fl^2)/(fh^2 + fl^2) (axisym.CouplingOf; Hong and Lancaster
// 2001, sec. 8.2).
//
// The loaded frequency of one cell: in the coupled-resonator circuit of
// Hong and Lancaster (sec. 8.2, magnetic coupling, two resonators L, C
// with mutual inductance Lm) the pair resonates at 1/f^2 = 4 pi^2 (L -+ Lm) C,
// so each resonator's own frequency 1/(2 pi sqrt(L C)) is
// f_self^2 = 2 fl^2 fh^2 / (fl^2 + fh^2); the same holds for electric
// coupling, (C -+ Cm) (derived). Shift = f_self / f_cell - 1 is the
// detuning one iris causes in the cell it opens into.
func (p Pair) At(r float64) (Point, error) {
	if err := p.Validate(); err != nil {
		return Point{}, err
	}
	if !(r >= cavity.MinSize && r < p.Radius) {
		return Point{}, fmt.Errorf("iris: iris radius must be in %g m..cell radius %g m (exclusive), got %g m", cavity.MinSize, p.Radius, r)
	}
	return p.at(r)
}

// cellIndex returns the place q (from 1) of the pair's mode among the
// closed cell's modes of its family with n = 0, and the cell's frequency.
func (p Pair) cellIndex() (int, float64, error) {
	c := p.Cell()
	fc := c.Frequency(p.Mode)
	list, err := c.Modes(fc * (1 + 1e-9))
	if err != nil {
		return 0, 0, err
	}
	q := 0
	for _, m := range list {
		if m.Mode.N == 0 && m.Mode.Family == p.Mode.Family {
			q++
			if m.Mode == p.Mode {
				return q, fc, nil
			}
		}
	}
	return 0, 0, fmt.Errorf("iris: %s not found among the cell's modes", p.Mode)
}

func (p Pair) at(r float64) (Point, error) {
	q, fc, err := p.cellIndex()
	if err != nil {
		return Point{}, err
	}
	b := p.Body(r)
	margin := searchMargin
	for range 4 {
		res, err := axisym.Solve(b, axisym.Request{MaxFrequency: fc * (1 + margin), Modes: p.Modes, Families: []cavity.Family{p.Mode.Family}})
		if err != nil {
			return Point{}, err
		}
		if len(res) < 2*q {
			margin *= 2
			continue
		}
		lo, hi := res[2*q-2], res[2*q-1]
		c, err := axisym.CouplingOf(lo, hi)
		if err != nil {
			return Point{}, err
		}
		pt := Point{Radius: r, K: c.K, KChange: c.Change, Low: lo.Frequency, High: hi.Frequency, Isolation: math.Inf(1)}
		split := hi.Frequency - lo.Frequency
		if 2*q-3 >= 0 {
			pt.Isolation = (lo.Frequency - res[2*q-3].Frequency) / split
		}
		if 2*q < len(res) {
			pt.Isolation = math.Min(pt.Isolation, (res[2*q].Frequency-hi.Frequency)/split)
		} else {
			// Nothing found up to the search limit: a lower bound.
			pt.Isolation = math.Min(pt.Isolation, (fc*(1+margin)-hi.Frequency)/split)
		}
		fl2, fh2 := lo.Frequency*lo.Frequency, hi.Frequency*hi.Frequency
		pt.Self = math.Sqrt(2 * fl2 * fh2 / (fl2 + fh2)) // derived, see At
		pt.Shift = pt.Self/fc - 1
		return pt, nil
	}
	return Point{}, fmt.Errorf("iris: %w: the body with a %s iris has fewer than %d %v0 resonances below %s", ErrNoPair,
		physics.FormatLength(r, 4), 2*q, p.Mode.Family, physics.FormatFrequency(fc*(1+margin), 6))
}

// Curve solves the pair at n radii spaced evenly in log r from lo to hi
// (0 < lo < hi < Radius, n >= 2): the k-versus-radius curve.
func (p Pair) Curve(lo, hi float64, n int) ([]Point, error) {
	if err := p.Validate(); err != nil {
		return nil, err
	}
	if !(lo >= cavity.MinSize && hi > lo && hi < p.Radius) || n < 2 {
		return nil, fmt.Errorf("iris: curve needs %g m <= lo < hi < radius %g m and n >= 2, got %g m, %g m, %d", cavity.MinSize, p.Radius, lo, hi, n)
	}
	out := make([]Point, n)
	for i := range out {
		r := lo * math.Pow(hi/lo, float64(i)/float64(n-1))
		if i == n-1 {
			r = hi
		}
		pt, err := p.at(r)
		if err != nil {
			return nil, err
		}
		out[i] = pt
	}
	return out, nil
}

// Default range of the curve, as fractions of the cell radius: from a hole
// that barely couples to an iris that leaves a narrow ring (common
// practice for irises; beyond 0.9 a the cells stop being two resonators).
const (
	CurveLow    = 0.05
	CurveHigh   = 0.9
	CurvePoints = 10
)

// Sized is an iris radius found for a wanted coupling.
type Sized struct {
	Point
	// Target is the wanted k.
	Target float64
	// Iterations is the number of secant steps after the bracket.
	Iterations int
	// RadiusChange is the convergence estimate of the radius, m: KChange
	// divided by the slope dk/dr of the curve at the root.
	RadiusChange float64
	// Monotone is false when the curve was not monotone between its ends
	// (the first radius reaching the target is returned).
	Monotone bool

	slope float64 // d ln k / d ln r at the root, from the last two solves or the curve
}

// radiusTol is the relative width of the final radius bracket: far below
// any machining tolerance and below the solver's truncation (KChange).
const radiusTol = 1e-9

// ErrUnreachable is wrapped when no radius of the curve's range realises a
// coupling.
var ErrUnreachable = errors.New("coupling not reachable")

// Invert returns the iris radius at which the pair couples with |k| =
// target, from the curve (as returned by Curve, radii increasing).
//
// Method: the first bracket of the curve where k crosses the target
// (monotone bracketing), then regula falsi with the Illinois weighting
// (Dowell and Jarratt 1971) on ln k against ln r (k grows like a power of r
// for small irises, nearly a straight line there), each step a new solve of
// the pair, until the bracket is radiusTol wide or k matches to 1e-10.
// Errors wrap ErrUnreachable when the target lies outside the curve's
// range of k.
func (p Pair) Invert(curve []Point, target float64) (Sized, error) {
	if !(target > 0) || math.IsInf(target, 0) {
		return Sized{}, fmt.Errorf("iris: coupling to realise must be > 0 and finite, got %g", target)
	}
	if len(curve) < 2 {
		return Sized{}, errors.New("iris: Invert needs a curve of at least two points")
	}
	mono := true
	for i := 1; i < len(curve); i++ {
		if curve[i].K < curve[i-1].K {
			mono = false
		}
	}
	j := -1
	for i := 1; i < len(curve); i++ {
		if (curve[i-1].K-target)*(curve[i].K-target) <= 0 {
			j = i
			break
		}
	}
	if j < 0 {
		kmin, kmax := math.Inf(1), 0.0
		for _, c := range curve {
			kmin, kmax = math.Min(kmin, c.K), math.Max(kmax, c.K)
		}
		return Sized{}, fmt.Errorf("iris: %w: k = %.4g lies outside %.3g..%.3g, the range of a centred iris of radius %s..%s in a %s wall",
			ErrUnreachable, target, kmin, kmax, physics.FormatLength(curve[0].Radius, 3), physics.FormatLength(curve[len(curve)-1].Radius, 3), physics.FormatLength(p.Wall, 3))
	}
	s := Sized{Target: target, Monotone: mono}
	var best Point
	r, it, err := illinois(curve[j-1].Radius, curve[j-1].K, curve[j].Radius, curve[j].K, target, func(r float64) (float64, error) {
		pt, err := p.at(r)
		best = pt
		return pt.K, err
	})
	if err != nil {
		return Sized{}, err
	}
	s.Iterations = it
	switch r {
	case curve[j-1].Radius:
		best = curve[j-1]
	case curve[j].Radius:
		best = curve[j]
	}
	s.Point = best
	// Slope from the curve's bracketing segment, as a power law:
	// dk/dr = n k / r with n = d ln k / d ln r.
	c0, c1 := curve[j-1], curve[j]
	if n := math.Log(c1.K/c0.K) / math.Log(c1.Radius/c0.Radius); n != 0 && !math.IsNaN(n) {
		s.RadiusChange = best.KChange * best.Radius / math.Abs(n*best.K)
		s.slope = n
	} else {
		s.RadiusChange = math.Inf(1)
	}
	return s, nil
}

// illinois finds x in [xa, xb] where v(x) = target, given v at both ends on
// opposite sides of the target: regula falsi with the Illinois weighting
// (Dowell and Jarratt 1971) on ln v against ln x, until the bracket is
// radiusTol wide or v matches to 1e-10 relative. It returns x, the number
// of evaluations, and the last evaluation's error. v must be positive.
func illinois(xa, va, xb, vb, target float64, v func(float64) (float64, error)) (float64, int, error) {
	ya, yb := math.Log(va/target), math.Log(vb/target)
	switch {
	case ya == 0:
		return xa, 0, nil
	case yb == 0:
		return xb, 0, nil
	}
	side, x := 0, xa
	it := 0
	for it = 1; it <= 100; it++ {
		la, lb := math.Log(xa), math.Log(xb)
		l := la - ya*(lb-la)/(yb-ya)
		if !(l > la && l < lb) {
			l = 0.5 * (la + lb)
		}
		x = math.Exp(l)
		val, err := v(x)
		if err != nil {
			return 0, it, err
		}
		if !(val > 0) {
			return 0, it, fmt.Errorf("iris: value %g at %g m is not positive", val, x)
		}
		y := math.Log(val / target)
		if math.Abs(y) <= 1e-10 {
			break
		}
		if (y < 0) == (ya < 0) {
			xa, ya = x, y
			if side == -1 {
				yb /= 2
			}
			side = -1
		} else {
			xb, yb = x, y
			if side == 1 {
				ya /= 2
			}
			side = 1
		}
		if xb-xa <= radiusTol*xb {
			break
		}
	}
	return x, it, nil
}

// near finds the radius of coupling target starting from the radius r0 of
// a nearby pair, with slope = d ln k / d ln r there: a secant iteration on
// ln k against ln r (no curve, no bracket), for the later passes of
// Realise, whose cavities change little. It fails (the caller then takes
// the curve) when a step leaves 0..0.99 of the cell radius or it does not
// converge in 30 solves.
func (p Pair) near(target, r0, slope float64) (Sized, error) {
	if !(slope > 0) || !(r0 > 0) {
		return Sized{}, errNoStart
	}
	var pts [2]Point
	eval := func(x float64) (float64, error) {
		r := math.Exp(x)
		if !(r >= cavity.MinSize && r < 0.99*p.Radius) {
			return 0, fmt.Errorf("iris: secant left the cell at %g m", r)
		}
		pt, err := p.at(r)
		if err != nil {
			return 0, err
		}
		if !(pt.K > 0) {
			return 0, fmt.Errorf("iris: no coupling at %g m", r)
		}
		pts[0], pts[1] = pts[1], pt
		return math.Log(pt.K / target), nil
	}
	x0 := math.Log(r0)
	y0, err := eval(x0)
	if err != nil {
		return Sized{}, err
	}
	x1 := x0 - y0/slope
	for it := 1; it <= 30; it++ {
		y1, err := eval(x1)
		if err != nil {
			return Sized{}, err
		}
		if math.Abs(y1) <= 1e-10 || math.Abs(x1-x0) <= radiusTol {
			best := pts[1]
			s := Sized{Point: best, Target: target, Iterations: it, Monotone: true, slope: slope}
			if y1 != y0 && x1 != x0 {
				s.slope = (y1 - y0) / (x1 - x0)
			}
			s.RadiusChange = best.KChange * best.Radius / math.Abs(s.slope*best.K)
			return s, nil
		}
		if y1 == y0 {
			break
		}
		x0, y0, x1 = x1, y1, x1-y1*(x1-x0)/(y1-y0)
	}
	return Sized{}, fmt.Errorf("iris: the secant from %g m did not converge", r0)
}
