package iris

import (
	"errors"
	"fmt"
	"math"

	"cylcav/axisym"
	"cylcav/cavity"
	"cylcav/physics"
)

// PortFunc returns the resonant frequency f0 and external Q of the
// resonance of family fam nearest fNear of body b, whose last section is
// an open circular waveguide running to infinity (the port), with modes
// waveguide modes in the widest section. It is the signature of the
// open-end solver of package axisym (axisym.PortQ); this package takes it
// as a value so that tests can give a model port.
type PortFunc func(b axisym.Body, fam cavity.Family, fNear float64, modes int) (f0, qext float64, err error)

// ErrNoPortSolver is wrapped when end irises are asked for without a port
// solver (a nil PortFunc): the external Q through an iris needs an open
// end's complex resonance, such as axisym.PortQ gives.
var ErrNoPortSolver = errors.New("end-iris sizing needs a port solver (an open-end solver such as axisym.PortQ); none was given")

// Port is an end cell fed through a centred iris from a circular waveguide
// port on its axis.
type Port struct {
	// Cell is the end cavity (its Radius, Length and Fill) and Mode its
	// TE0mp or TM0mp mode; Wall and Modes as in Pair.
	Pair
	// GuideRadius is the radius of the port waveguide, m; zero means the
	// cell's radius.
	GuideRadius float64
	// Solve is the port solver; nil makes every call an error wrapping
	// ErrNoPortSolver.
	Solve PortFunc

	noChange bool // skip the convergence estimate (Realise makes it once, at the end)
}

// Body returns the port body with an iris of radius r: cell, iris, port
// guide (length one cell radius, then running on to infinity: EndB is
// axisym.Pipe).
func (p Port) Body(r float64) axisym.Body {
	g := p.GuideRadius
	if g == 0 {
		g = p.Radius
	}
	return axisym.Body{Sections: []axisym.Section{
		{Length: p.Length, Radius: p.Radius, Fill: p.Fill},
		{Length: p.Wall, Radius: r, Fill: p.Fill},
		{Length: p.Radius, Radius: g, Fill: p.Fill},
	}, EndB: axisym.Pipe}
}

// PortPoint is the end cell solved at one iris radius.
type PortPoint struct {
	Radius float64 // m
	// F0 is the loaded cell's resonant frequency, Hz, and Shift its
	// relative shift from the closed cell.
	F0, Shift float64
	// Qext is the external Q through the iris (the port solver's, from the
	// group delay of the port's reflection at resonance: Qext = omega0
	// tau/4, J. B. Ness, IEEE Trans. MTT 46 (1998) 343-351).
	Qext float64
}

// At solves the end cell with an iris of radius r.
func (p Port) At(r float64) (PortPoint, error) {
	if p.Solve == nil {
		return PortPoint{}, fmt.Errorf("iris: %w", ErrNoPortSolver)
	}
	if err := p.Pair.Validate(); err != nil {
		return PortPoint{}, err
	}
	g := p.GuideRadius
	if g == 0 {
		g = p.Radius
	}
	if !(r >= cavity.MinSize && r < p.Radius && r < g) {
		return PortPoint{}, fmt.Errorf("iris: port iris radius must be in %g m..min(cell radius, guide radius) %g m (exclusive), got %g m", cavity.MinSize, math.Min(p.Radius, g), r)
	}
	fc := p.Cell().Frequency(p.Mode)
	return p.atNear(r, fc)
}

// atNear is At with the solver started from fNear (Hz).
func (p Port) atNear(r, fNear float64) (PortPoint, error) {
	fc := p.Cell().Frequency(p.Mode)
	f0, q, err := p.Solve(p.Body(r), p.Mode.Family, fNear, p.Modes)
	if err != nil {
		return PortPoint{}, err
	}
	return PortPoint{Radius: r, F0: f0, Shift: f0/fc - 1, Qext: q}, nil
}

// PortSized is a port iris found for a wanted external Q.
type PortSized struct {
	PortPoint
	Target     float64
	Iterations int
	// QextChange is the convergence estimate of Qext: its change at the
	// found radius when the solver keeps two thirds of the modes (as
	// axisym.Solve's Change).
	QextChange float64
}

// Invert returns the port iris radius that gives Qext = target: the
// external Q falls as the iris opens, so it is bracketed on portCurve
// radii spaced in log r over the curve range (CurveLow..CurveHigh of the
// smaller of the cell and guide radii), in increasing order, each solve
// started from the previous resonance, and refined by the Illinois regula
// falsi on ln Qext against ln r. A radius where the port solver fails (an
// iris too small for it to resolve Qext, a solve that does not converge)
// or jumps by more than maxPortJump to another resonance breaks the scan:
// no bracket spans it, and when no bracket is found the last failure is
// in the error. Errors wrap ErrNoPortSolver without a
// solver and ErrUnreachable when no radius of the range gives the target.
func (p Port) Invert(target float64) (PortSized, error) {
	if p.Solve == nil {
		return PortSized{}, fmt.Errorf("iris: %w", ErrNoPortSolver)
	}
	if !(target > 0) || math.IsInf(target, 0) {
		return PortSized{}, fmt.Errorf("iris: external Q to realise must be > 0 and finite, got %g", target)
	}
	g := p.GuideRadius
	if g == 0 {
		g = p.Radius
	}
	if err := p.Pair.Validate(); err != nil {
		return PortSized{}, err
	}
	rmax := CurveHigh * math.Min(p.Radius, g)
	rmin := CurveLow * p.Radius
	var prev PortPoint
	have := false
	var lastErr error
	fNear := p.Cell().Frequency(p.Mode)
	for i := range portCurve {
		r := rmin * math.Pow(rmax/rmin, float64(i)/float64(portCurve-1))
		pt, err := p.atNear(r, fNear)
		if err == nil && math.Abs(pt.F0/fNear-1) > maxPortJump {
			err = fmt.Errorf("iris: the port solver went from %s to %s at iris radius %s: another resonance",
				physics.FormatFrequency(fNear, 6), physics.FormatFrequency(pt.F0, 6), physics.FormatLength(r, 4))
		}
		if err != nil {
			// A small iris whose Qext the port solver cannot resolve (no
			// decaying root), or a failed solve: no bracket spans it.
			lastErr, have = fmt.Errorf("at iris radius %s: %w", physics.FormatLength(r, 4), err), false
			continue
		}
		fNear = pt.F0 // the next, larger iris starts from here
		if have && (prev.Qext-target)*(pt.Qext-target) <= 0 {
			var last PortPoint
			start := prev.F0
			x, it, err := illinois(prev.Radius, prev.Qext, pt.Radius, pt.Qext, target, func(r float64) (float64, error) {
				q, err := p.atNear(r, start)
				last = q
				return q.Qext, err
			})
			if err != nil {
				return PortSized{}, err
			}
			switch x {
			case prev.Radius:
				last = prev
			case pt.Radius:
				last = pt
			}
			out := PortSized{PortPoint: last, Target: target, Iterations: it, QextChange: math.Inf(1)}
			if !p.noChange {
				out.QextChange = p.qextChange(last)
			}
			return out, nil
		}
		prev, have = pt, true
	}
	if lastErr != nil {
		return PortSized{}, fmt.Errorf("iris: no port iris bracketed Qext = %.4g; the port solver failed %w", target, lastErr)
	}
	return PortSized{}, fmt.Errorf("iris: %w: Qext = %.4g is not reached by a centred port iris of radius %s..%s in a %s wall",
		ErrUnreachable, target, physics.FormatLength(rmin, 3), physics.FormatLength(rmax, 3), physics.FormatLength(p.Wall, 3))
}

// portCurve is the number of radii of the port bracket scan.
const portCurve = 10

// maxPortJump is the largest relative move of the port resonance from one
// radius of the scan to the next accepted as the same resonance (common
// practice: far beyond the detuning of a usable iris).
const maxPortJump = 0.1

// modes is the mode count in use (Modes, or axisym.DefaultModes).
func (p Port) modes() int {
	if p.Modes == 0 {
		return axisym.DefaultModes
	}
	return p.Modes
}

// near finds the port iris radius for Qext = target starting from the
// radius r0 of a nearby end cell, whose resonance was at f0: a secant on
// ln Qext against ln r, the first step with slope -6 (Qext goes as the
// inverse square of the coupling, and a small centred hole's electric
// dipole couples as r^3, Bethe 1944; TE0 cells fall faster; only the
// start of the secant), for the later passes of Realise. It fails (the caller then scans) when a
// solve fails, jumps to another resonance or the secant does not converge.
func (p Port) near(target, r0, f0 float64) (PortSized, error) {
	if p.Solve == nil {
		return PortSized{}, fmt.Errorf("iris: %w", ErrNoPortSolver)
	}
	if !(r0 > 0) || !(f0 > 0) {
		return PortSized{}, errNoStart
	}
	var last PortPoint
	eval := func(x float64) (float64, error) {
		r := math.Exp(x)
		if !(r >= cavity.MinSize && r < 0.99*p.Radius) {
			return 0, fmt.Errorf("iris: secant left the cell at %g m", r)
		}
		pt, err := p.atNear(r, f0)
		if err != nil {
			return 0, err
		}
		if math.Abs(pt.F0/f0-1) > maxPortJump || !(pt.Qext > 0) {
			return 0, fmt.Errorf("iris: port solver left the resonance at %g m", r)
		}
		last = pt
		return math.Log(pt.Qext / target), nil
	}
	x0 := math.Log(r0)
	y0, err := eval(x0)
	if err != nil {
		return PortSized{}, err
	}
	x1 := x0 + y0/6
	for it := 1; it <= 30; it++ {
		y1, err := eval(x1)
		if err != nil {
			return PortSized{}, err
		}
		if math.Abs(y1) <= 1e-10 || math.Abs(x1-x0) <= radiusTol {
			out := PortSized{PortPoint: last, Target: target, Iterations: it, QextChange: math.Inf(1)}
			if !p.noChange {
				out.QextChange = p.qextChange(last)
			}
			return out, nil
		}
		if y1 == y0 {
			break
		}
		x0, y0, x1 = x1, y1, x1-y1*(x1-x0)/(y1-y0)
	}
	return PortSized{}, fmt.Errorf("iris: the secant from %g m did not converge", r0)
}

// qextChange is the convergence estimate of Qext at pt: its change when
// the solver keeps two thirds of the modes (+Inf when that solve fails).
func (p Port) qextChange(pt PortPoint) float64 {
	coarse := p
	coarse.Modes = (2*p.modes() + 2) / 3
	c, err := coarse.atNear(pt.Radius, pt.F0)
	if err != nil {
		return math.Inf(1)
	}
	return math.Abs(c.Qext - pt.Qext)
}
