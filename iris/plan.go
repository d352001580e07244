package iris

import (
	"errors"
	"fmt"
	"math"

	"cylcav/axisym"
	"cylcav/cavity"
	"cylcav/filter"
)

// Method is how a coupling is realised and computed.
type Method uint8

const (
	// NoMethod: no method of this package applies (a source-load or
	// source-to-inner coupling, a coupling of the opposite kind to what a
	// hole gives, an n >= 1 mode in line).
	NoMethod Method = iota
	// ModeMatching: a centred iris between in-line cells, from the split
	// pair of the two cells solved by package axisym.
	ModeMatching
	// PortMatching: a centred end iris to a circular waveguide port, from
	// the port solver (PortFunc).
	PortMatching
	// BetheThick: an off-axis hole in a common side wall by Bethe's
	// polarisabilities with the thickness correction exp(-alpha t)
	// (filter.SizeHole: Bethe 1944; Cohn 1952; Matthaei, Young and Jones
	// 1964, sec. 5.10).
	BetheThick
)

// String names the method for people.
func (m Method) String() string {
	switch m {
	case ModeMatching:
		return "mode matching (axisymmetric pair)"
	case PortMatching:
		return "mode matching (open port)"
	case BetheThick:
		return "Bethe + thickness correction"
	}
	return "none"
}

// Key names the method for programs.
func (m Method) Key() string {
	switch m {
	case ModeMatching:
		return "mode_matching_pair"
	case PortMatching:
		return "mode_matching_port"
	case BetheThick:
		return "bethe_thick_wall"
	}
	return "none"
}

// Coupling is the realisation of one coupling of a design.
type Coupling struct {
	// Kind is "main" (k_i,i+1), "port" (Qext of resonator 1 or N) or
	// "cross" (any other coupling; source and load are 0 and N+1).
	Kind     string
	From, To int
	// Required is the bandpass k (signed) for main and cross couplings
	// and the external Q for ports.
	Required float64
	Method   Method
	// Radius is the iris or hole radius, m, Thickness the wall's, m; Where
	// says where it sits, for people.
	Radius, Thickness float64
	Where             string
	// Achieved is the k (or Qext) of the realisation; Change the
	// convergence estimate of k or Qext (mode matching and ports; NaN for
	// Bethe);
	// RadiusChange the resulting radius uncertainty, m (pairs; NaN
	// otherwise).
	Achieved, Change, RadiusChange float64
	// Iterations is the number of solves after the bracket.
	Iterations int
	// Isolation is the pair's isolation (Point.Isolation); Monotone whether
	// the k-versus-radius curve was monotone.
	Isolation float64
	Monotone  bool
	// Shift is the relative detuning this iris causes in each cavity it
	// opens into (mode matching and ports; 0 otherwise).
	Shift float64
	// F0 is the loaded end cavity's resonant frequency for ports, Hz.
	F0 float64
	// Extension is the effective length the iris adds to each cavity it
	// opens into (p > 0): the closed cavity that resonates at the loaded
	// frequency is this much longer, m (see Realise).
	Extension float64
	// Hole is the Bethe result for BetheThick.
	Hole *filter.HoleCoupling
	// Err says why no realisation is given (nil when one is).
	Err error

	slope float64 // d ln k / d ln r at the radius (pairs)
}

// Status is the verdict on one coupling.
type Status uint8

const (
	// Valid: the method holds for this realisation.
	Valid Status = iota
	// Outside: a number was computed but the method's limits are broken;
	// the number is not to be built from.
	Outside
	// Unrealised: no method here gives a number (see the reasons).
	Unrealised
)

// String returns "valid", "outside range" or "not realised".
func (s Status) String() string {
	switch s {
	case Valid:
		return "valid"
	case Outside:
		return "outside range"
	}
	return "not realised"
}

// Limits of the mode-matching verdict.
const (
	// MaxRelChange is the largest convergence estimate of k, relative to
	// k, accepted (common practice: 1 % of k, well inside the tuning range
	// a filter's screws cover).
	MaxRelChange = 0.01
	// MinIsolation is the least distance from the pair to any other
	// resonance of its family in units of the split: the two-resonator
	// formula (Hong and Lancaster 2001, sec. 8.2) neglects the rest. In
	// the whole-chain test (TestChainAgainstModel) pairs 15 to 22 splits
	// from their neighbours give a chain whose k is about 5 % below the
	// pair's, an error of about 0.8/isolation; 10 keeps it under about
	// 8 % (common practice: within a tuning screw's reach).
	MinIsolation = 10.0
	// MaxShift is the largest detuning of a cavity by one iris accepted:
	// the whole-chain test covers detunings of 0.6 to 0.8 % per iris; up
	// to 2 % the effective-length model is taken to hold (common practice
	// caution), beyond it the whole filter body should be solved.
	MaxShift = 0.02
)

// Judge is the one verdict on a coupling's realisation: Unrealised with
// the reason when no number was given, Outside with every broken limit
// (mode matching and ports: convergence of k or Qext above MaxRelChange,
// a detuning above MaxShift, and for pairs an isolation below
// MinIsolation; Bethe: every limit of filter.HoleCoupling.Problems), Valid
// otherwise.
func Judge(c Coupling) (Status, []string) {
	if c.Err != nil || c.Method == NoMethod {
		msg := "no method applies"
		if c.Err != nil {
			msg = c.Err.Error()
		}
		return Unrealised, []string{msg}
	}
	var out []string
	switch c.Method {
	case ModeMatching, PortMatching:
		what := "k"
		if c.Method == PortMatching {
			what = "Qext"
		}
		if !(c.Change <= MaxRelChange*math.Abs(c.Achieved)) {
			out = append(out, fmt.Sprintf("%s changes by %.2g (%.2g %% of %s) when the modes grow by half, more than %g %%: raise the mode count", what, c.Change, 100*c.Change/math.Abs(c.Achieved), what, 100*MaxRelChange))
		}
		if math.Abs(c.Shift) > MaxShift {
			out = append(out, fmt.Sprintf("the iris detunes each cavity it opens into by %.3g %%, more than %g %%: beyond the range where the corrected lengths were checked; solve the whole filter body", 100*c.Shift, 100*MaxShift))
		}
		if c.Method == ModeMatching && c.Isolation < MinIsolation {
			out = append(out, fmt.Sprintf("another resonance lies %.3g splits from the pair, less than %g: the two-resonator formula does not hold", c.Isolation, MinIsolation))
		}
	case BetheThick:
		if c.Hole != nil {
			out = append(out, c.Hole.Problems...)
		}
	}
	if len(out) > 0 {
		return Outside, out
	}
	return Valid, nil
}

// Trusted reports, per cavity, whether its corrected dimensions can be
// built from: every iris on its end plates was sized (Tuning.Complete) and
// is Valid by Judge. Cross-coupling holes do not enter the corrected
// dimensions and are not looked at. It is the one verdict on a corrected
// cavity that every output uses.
func (p *Plan) Trusted() []bool {
	ok := make([]bool, len(p.Cavities))
	for i, c := range p.Cavities {
		ok[i] = c.Complete
	}
	n := len(p.Cavities)
	for _, c := range p.Couplings {
		if c.Kind == "cross" {
			continue
		}
		if st, _ := Judge(c); st == Valid {
			continue
		}
		for _, r := range []int{c.From, c.To} {
			if r >= 1 && r <= n {
				ok[r-1] = false
			}
		}
	}
	return ok
}

// Tuning is one cavity of an in-line filter with the detuning of its irises
// and the dimension that restores its frequency.
type Tuning struct {
	Resonator int
	// F is the resonator's own frequency f_i, Hz.
	F float64
	// Radius and Length are the closed cavity's, m (package filter's
	// realisation).
	Radius, Length float64
	// Extension is the summed effective length of the irises on its two
	// end plates, m (p > 0; see Realise), and Shift the relative detuning
	// they cause in the corrected cavity (for TM0m0, the summed detunings
	// of its irises). Complete is false when an iris could not be sized,
	// so that both lack its part.
	Extension, Shift float64
	Complete         bool
	// CorrectedRadius and CorrectedLength are the dimensions with which the
	// loaded cavity resonates at F (see Realise): the length changed for
	// p > 0, the radius for TM0m0 (whose frequency does not depend on the
	// length).
	CorrectedRadius, CorrectedLength float64
}

// Options are the inputs of Realise besides the design.
type Options struct {
	// Wall is the wall thickness at every iris and hole, m.
	Wall float64
	// Modes is the mode count of the solver (0: axisym.DefaultModes).
	Modes int
	// Port is the port solver; nil: the end irises are not sized (their
	// rows carry an error wrapping ErrNoPortSolver).
	Port PortFunc
	// PortRadius is the port guide radius, m (0: the end cell's radius).
	PortRadius float64
}

// Plan is the realisation of every coupling of a design.
type Plan struct {
	Mode      cavity.Mode
	Couplings []Coupling
	Cavities  []Tuning
	// Curves are the k-versus-radius curves of the distinct pairs of the
	// closed cavities (the start of the iteration), in the order first
	// used.
	Curves []Curve
	// Passes is the number of sizing passes (see Realise), Change the
	// largest relative change of a corrected cavity dimension in the last
	// pass and Converged whether it fell below DimensionTol.
	Passes    int
	Change    float64
	Converged bool
}

// Curve is one k-versus-radius curve and the couplings sized on it.
type Curve struct {
	Pair   Pair
	Points []Point
	Used   []int // indices of Plan.Couplings
}

// Limits of the sizing passes of Realise.
const (
	// DimensionTol is the relative change of every corrected cavity
	// dimension below which the passes stop (common practice: far below
	// machining tolerances, 0.3 um on 30 mm).
	DimensionTol = 1e-5
	// MaxPasses bounds the passes.
	MaxPasses = 8
)

// Realise sizes every coupling of design d whose cavities rz realises
// (filter.Realise), for cavities on one axis joined by centred irises
// (main line, ports) and off-axis holes in a common side wall for the
// cross couplings, and the cavity dimensions that keep each resonator on
// its frequency with the irises in place.
//
// Main line: the pair of cavities i and i+1 (their mean radius and length
// where they differ) solved over CurvePoints radii from CurveLow to
// CurveHigh of the cell radius, and the curve inverted (Pair.Invert).
// Ports: Port.Invert with opts.Port. Cross couplings between resonators:
// filter.SizeHole on the side wall at the position of the strongest
// coupling; a coupling of the sign a hole cannot give (the main line is
// taken as the kind the irises give, magnetic for a hole in a TE0
// cavity's side wall) and couplings involving source or load are
// Unrealised.
//
// Cavities: each iris loads the cavities it opens into. For p > 0 its
// effect is an effective extension of each cavity's length (the closed
// cavity resonating at the loaded frequency, Point.Self or the port's f0,
// is longer by Extension: the reference-plane shift of the iris seen as
// an inverter between two lines, as in the direct-coupled cavity filters
// of Matthaei, Young and Jones, ch. 8, derived here from the pair), and
// the extensions of the irises on a cavity's two end plates add; the
// cavity is made shorter by their sum than the closed cavity resonating
// at f_i. (Adding the frequency shifts instead is wrong at first order
// in the shift over the cavity's length sensitivity: about 5 % of a two-
// iris cavity's detuning in the tests.) For TM0m0, whose frequency does
// not depend on the length, the summed relative shifts set the radius.
// An iris's k and extension depend on the cavities' dimensions, so the
// sizing is repeated on the corrected cavities (each later pass starts
// every iris from its last radius: a secant on ln k against ln r, the
// curve and bracket again if that fails) until every dimension changes by
// less than DimensionTol (at most MaxPasses passes).
//
// Errors: a nil design or realisation, a mode with n != 0, an invalid
// wall thickness or mode count. Couplings that cannot be sized are rows
// with Err set, not errors.
func Realise(d *filter.Design, rz *filter.Realisation, opts Options) (*Plan, error) {
	if d == nil || rz == nil || d.Folded == nil || len(rz.Cavities) != d.Spec.Order {
		return nil, errors.New("iris: Realise needs a synthesised design and its realisation")
	}
	mode := rz.Mode
	if mode.N != 0 {
		return nil, fmt.Errorf("iris: in-line irises need a TE0mp or TM0mp mode (n = 0), got %s", mode)
	}
	if !(opts.Wall >= cavity.MinSize && opts.Wall <= cavity.MaxSize) {
		return nil, fmt.Errorf("iris: wall thickness must be in %g..%g m, got %g m", cavity.MinSize, cavity.MaxSize, opts.Wall)
	}
	if opts.Modes < 0 || opts.Modes > axisym.MaxModes {
		return nil, fmt.Errorf("iris: modes must be in 0..%d (0: %d), got %d", axisym.MaxModes, axisym.DefaultModes, opts.Modes)
	}
	n := d.Spec.Order
	cells := make([]cavity.Cavity, n)
	for i, c := range rz.Cavities {
		cells[i] = c.Cavity
	}
	var first []Curve
	var pl *Plan
	hist := make([]fixHist, n)
	portCells := make([]cavity.Cavity, n)
	for pass := 1; pass <= MaxPasses; pass++ {
		copy(portCells, cells) // the cavities this pass sizes on
		next, err := sizePass(d, rz, cells, opts, pl)
		if err != nil {
			return nil, err
		}
		if first == nil {
			first = next.Curves
		}
		next.Curves, next.Passes = first, pass
		change := 0.0
		for i := range next.Cavities {
			t := &next.Cavities[i]
			cur := cells[i]
			// g is the fixed-point image of the tuning dimension: the
			// closed cavity for f_i with the irises' loading taken off.
			var img cavity.Cavity
			if mode.P == 0 {
				// TM0m0: the radius, from the summed frequency shifts.
				img, err = resize(mode, t.F/(1+t.Shift), cur)
			} else {
				// The length that resonates at f_i, less the irises'
				// effective extensions.
				img, err = resize(mode, t.F, cur)
				img.Length -= t.Extension
			}
			if err != nil {
				return nil, fmt.Errorf("iris: corrected cavity %d: %w", i+1, err)
			}
			x, g := dimOf(mode, cur), dimOf(mode, img)
			h := x - g
			next := g
			if hs := hist[i]; pass > 1 && h != hs.h && x != hs.x {
				// Secant on x - g(x) from the last two passes, when it
				// stays near the plain step.
				if sx := x - h*(x-hs.x)/(h-hs.h); math.Abs(sx-g) <= 10*math.Abs(h) {
					next = sx
				}
			}
			hist[i] = fixHist{x, h}
			nc := setDim(mode, cur, next)
			if err := nc.Validate(); err != nil {
				return nil, fmt.Errorf("iris: corrected cavity %d: %w", i+1, err)
			}
			change = math.Max(change, math.Abs(next/x-1))
			if mode.P != 0 {
				loaded := nc
				loaded.Length += t.Extension
				t.Shift = loaded.Frequency(mode)/nc.Frequency(mode) - 1
			}
			t.CorrectedRadius, t.CorrectedLength = nc.Radius, nc.Length
			cells[i] = nc
		}
		next.Change = change
		pl = next
		if change <= DimensionTol {
			pl.Converged = true
			break
		}
	}
	// The ports' convergence estimates, once, on the cavities of the last
	// pass.
	for k := range pl.Couplings {
		c := &pl.Couplings[k]
		if c.Kind != "port" || c.Err != nil {
			continue
		}
		res := c.To
		if c.To == n+1 {
			res = c.From
		}
		cell := portCells[res-1]
		p := Port{Pair: Pair{Radius: cell.Radius, Length: cell.Length, Fill: cell.Fill, Mode: mode, Wall: opts.Wall, Modes: opts.Modes},
			GuideRadius: opts.PortRadius, Solve: opts.Port}
		c.Change = p.qextChange(PortPoint{Radius: c.Radius, F0: c.F0, Qext: c.Achieved})
	}
	return pl, nil
}

// fixHist is one pass of a cavity's dimension iteration: the dimension
// and its distance from the fixed-point image.
type fixHist struct{ x, h float64 }

// dimOf returns the dimension that tunes a cavity in mode: the length for
// p > 0, the radius for TM0m0.
func dimOf(mode cavity.Mode, c cavity.Cavity) float64 {
	if mode.P == 0 {
		return c.Radius
	}
	return c.Length
}

// setDim returns c with its tuning dimension set to x.
func setDim(mode cavity.Mode, c cavity.Cavity, x float64) cavity.Cavity {
	if mode.P == 0 {
		c.Radius = x
	} else {
		c.Length = x
	}
	return c
}

// resize returns the cavity like c that resonates, closed, at f in mode:
// the length changed for p > 0, the radius for TM0m0.
func resize(mode cavity.Mode, f float64, c cavity.Cavity) (cavity.Cavity, error) {
	by := cavity.ByDiameter(2 * c.Radius)
	if mode.P == 0 {
		by = cavity.ByLength(c.Length)
	}
	return cavity.Size(mode, f, c.Fill, by)
}

// sizePass sizes every coupling on the cavities cells; prev, when not nil,
// is the previous pass, whose radii start the irises' secant iterations.
func sizePass(d *filter.Design, rz *filter.Realisation, cells []cavity.Cavity, opts Options, prev *Plan) (*Plan, error) {
	mode := rz.Mode
	n := d.Spec.Order
	fill := cells[0].Fill
	pl := &Plan{Mode: mode}
	shifts := make([]float64, n)
	exts := make([]float64, n)
	complete := make([]bool, n)
	for i := range complete {
		complete[i] = true
	}
	// extension returns the effective length an iris adds to a cell of
	// radius a and length l that it detunes to fl: the length of the closed
	// cell resonating at fl, less l (p > 0; 0 for TM0m0).
	extension := func(a, l, fl float64) (float64, error) {
		if mode.P == 0 {
			return 0, nil
		}
		c, err := cavity.Size(mode, fl, fill, cavity.ByDiameter(2*a))
		if err != nil {
			return 0, err
		}
		return c.Length - l, nil
	}
	prevRow := func(kind string, from, to int) *Coupling {
		if prev == nil {
			return nil
		}
		for k := range prev.Couplings {
			c := &prev.Couplings[k]
			if c.Kind == kind && c.From == from && c.To == to && c.Err == nil {
				return c
			}
		}
		return nil
	}
	type sizedErr struct {
		s   Sized
		err error
	}
	type portErr struct {
		s   PortSized
		err error
	}
	memo := map[pairKey]sizedErr{}
	portMemo := map[pairKey]portErr{}
	pairOf := func(i, j int) Pair {
		a, b := cells[i-1], cells[j-1]
		return Pair{Radius: 0.5 * (a.Radius + b.Radius), Length: 0.5 * (a.Length + b.Length), Fill: fill, Mode: mode, Wall: opts.Wall, Modes: opts.Modes}
	}
	curveOf := func(p Pair, row int) ([]Point, error) {
		for k := range pl.Curves {
			if pl.Curves[k].Pair == p {
				pl.Curves[k].Used = append(pl.Curves[k].Used, row)
				return pl.Curves[k].Points, nil
			}
		}
		pts, err := p.Curve(CurveLow*p.Radius, CurveHigh*p.Radius, CurvePoints)
		if err != nil {
			return nil, err
		}
		pl.Curves = append(pl.Curves, Curve{Pair: p, Points: pts, Used: []int{row}})
		return pts, nil
	}
	port := func(res int, q float64) {
		c := cells[res-1]
		row := Coupling{Kind: "port", From: 0, To: res, Required: q, Method: PortMatching, Thickness: opts.Wall,
			Where: fmt.Sprintf("centred in the outer end plate of cavity %d", res), Change: math.NaN(), RadiusChange: math.NaN(), Monotone: true}
		if res == n && n > 1 {
			row.From, row.To = res, n+1
		}
		p := Port{Pair: Pair{Radius: c.Radius, Length: c.Length, Fill: fill, Mode: mode, Wall: opts.Wall, Modes: opts.Modes},
			GuideRadius: opts.PortRadius, Solve: opts.Port, noChange: true}
		var s PortSized
		err := errNoStart
		key := keyOf(p.Pair, q)
		if m, ok := portMemo[key]; ok {
			s, err = m.s, m.err
		} else {
			if pr := prevRow(row.Kind, row.From, row.To); pr != nil {
				s, err = p.near(q, pr.Radius, pr.F0)
			}
			if err != nil {
				s, err = p.Invert(q)
			}
			portMemo[key] = portErr{s, err}
		}
		if err != nil {
			row.Err = err
			complete[res-1] = false
		} else {
			row.Radius, row.Achieved, row.Iterations, row.Shift, row.Change = s.Radius, s.Qext, s.Iterations, s.Shift, s.QextChange
			row.F0 = s.F0
			row.Extension, err = extension(c.Radius, c.Length, s.F0)
			if err != nil {
				row.Err = err
				complete[res-1] = false
			} else {
				shifts[res-1] += s.Shift
				exts[res-1] += row.Extension
			}
		}
		pl.Couplings = append(pl.Couplings, row)
	}
	port(1, d.QextIn)
	for i := 1; i < n; i++ {
		k := d.Coupling(i, i+1)
		row := Coupling{Kind: "main", From: i, To: i + 1, Required: k, Method: ModeMatching, Thickness: opts.Wall,
			Where: fmt.Sprintf("centred in the wall between cavities %d and %d", i, i+1)}
		p := pairOf(i, i+1)
		var s Sized
		err := errNoStart
		key := keyOf(p, math.Abs(k))
		if m, ok := memo[key]; ok {
			// A symmetric design repeats its couplings: the same pair and
			// k give the same iris.
			s, err = m.s, m.err
		} else {
			if pr := prevRow(row.Kind, row.From, row.To); pr != nil {
				s, err = p.near(math.Abs(k), pr.Radius, pr.slope)
			}
			if err != nil {
				var pts []Point
				pts, err = curveOf(p, len(pl.Couplings))
				if err == nil {
					s, err = p.Invert(pts, math.Abs(k))
				}
			}
			memo[key] = sizedErr{s, err}
		}
		if err == nil {
			row.Radius, row.Achieved, row.Change, row.RadiusChange = s.Radius, s.K, s.KChange, s.RadiusChange
			row.Iterations, row.Isolation, row.Monotone, row.Shift = s.Iterations, s.Isolation, s.Monotone, s.Shift
			row.slope = s.slope
			row.Extension, err = extension(p.Radius, p.Length, s.Self)
		}
		if err == nil {
			shifts[i-1] += s.Shift
			shifts[i] += s.Shift
			exts[i-1] += row.Extension
			exts[i] += row.Extension
		} else {
			row.Err = err
			complete[i-1], complete[i] = false, false
		}
		pl.Couplings = append(pl.Couplings, row)
	}
	if n > 1 {
		port(n, d.QextOut)
	}
	for i := 0; i < n+2; i++ {
		for j := i + 2; j < n+2; j++ {
			m := d.Folded.At(i, j)
			if math.Abs(m) <= 1e-9 || (i == 0 && j == 1) || (i == n && j == n+1) {
				continue
			}
			pl.Couplings = append(pl.Couplings, crossHole(d, rz, cells, i, j, opts.Wall))
		}
	}
	for i, c := range cells {
		pl.Cavities = append(pl.Cavities, Tuning{Resonator: i + 1, F: rz.Cavities[i].F, Radius: rz.Cavities[i].Cavity.Radius,
			Length: rz.Cavities[i].Cavity.Length, Shift: shifts[i], Extension: exts[i], Complete: complete[i],
			CorrectedRadius: c.Radius, CorrectedLength: c.Length})
	}
	return pl, nil
}

// pairKey identifies a sizing: the pair (or port cell) and the target,
// rounded to 1e-12 relative, so that the mirror-image couplings of a
// symmetric design, equal but for rounding, are sized once.
type pairKey struct {
	p      Pair
	target float64
}

func keyOf(p Pair, target float64) pairKey {
	r := func(x float64) float64 {
		if x == 0 {
			return 0
		}
		e := math.Pow(10, math.Floor(math.Log10(math.Abs(x)))-12)
		return math.Round(x/e) * e
	}
	p.Radius, p.Length, p.Wall = r(p.Radius), r(p.Length), r(p.Wall)
	return pairKey{p, r(target)}
}

// errNoStart marks a row with no previous radius to start from.
var errNoStart = errors.New("iris: no previous radius")

// crossHole realises a coupling off the main line as a side-wall hole.
func crossHole(d *filter.Design, rz *filter.Realisation, cells []cavity.Cavity, i, j int, wall float64) Coupling {
	n := d.Spec.Order
	k := d.Coupling(i, j)
	row := Coupling{Kind: "cross", From: i, To: j, Required: k, Method: BetheThick, Thickness: wall, Change: math.NaN(), RadiusChange: math.NaN(), Monotone: true}
	if i == 0 || j == n+1 {
		row.Method = NoMethod
		row.Err = fmt.Errorf("a coupling to the source or load besides the end resonators needs a probe or a second port path; no method here realises it")
		return row
	}
	c1, c2 := cells[i-1], cells[j-1]
	hc, err := filter.SizeHole(c1, c2, rz.Mode, filter.Hole{Wall: filter.SideWall, Thickness: wall}, k)
	if err != nil {
		row.Method = NoMethod
		row.Err = err
		return row
	}
	if hc.K*k < 0 {
		row.Method = NoMethod
		kind := "electric"
		if hc.K > 0 {
			kind = "magnetic"
		}
		row.Err = fmt.Errorf("k = %.4g needs the opposite kind of coupling to the main line, and a side-wall hole gives %s coupling for %s; realise it with a probe or another structure (field solver)", k, kind, rz.Mode)
		return row
	}
	row.Radius, row.Achieved, row.Hole = hc.Radius, hc.K, &hc
	row.Where = fmt.Sprintf("side wall shared by cavities %d and %d (side by side: a folded layout), at z/L = %.3g", i, j, hc.Position)
	return row
}
