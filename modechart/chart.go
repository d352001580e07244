package modechart

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"cylcav/cavity"
	"cylcav/physics"
)

// Axes selects the coordinates of a mode chart.
type Axes uint8

const (
	// Squared plots (f·D)² against (D/L)², where every mode is a straight
	// line. It is the zero value and the default.
	Squared Axes = iota
	// Linear plots f·D against D/L, where every mode with p >= 1 is a
	// hyperbola-like curve and every TM mn0 mode a horizontal line.
	Linear
)

// String returns "squared" or "linear".
func (a Axes) String() string {
	switch a {
	case Squared:
		return "squared"
	case Linear:
		return "linear"
	}
	return fmt.Sprintf("Axes(%d)", uint8(a))
}

// ParseAxes parses "squared" or "linear" (any case).
func ParseAxes(s string) (Axes, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "squared":
		return Squared, nil
	case "linear":
		return Linear, nil
	}
	return 0, fmt.Errorf("modechart: unknown axes %q; use squared or linear", s)
}

// Units is the unit of the product f·D on a mode chart's vertical axis.
type Units uint8

const (
	// GHzCm is GHz·cm (1e7 Hz·m); the zero value and the default.
	GHzCm Units = iota
	// GHzMm is GHz·mm (1e6 Hz·m).
	GHzMm
	// MHzIn is MHz·in (25400 Hz·m, with 1 in = 0.0254 m exactly).
	MHzIn
)

// Scale returns the size of one unit in Hz·m.
func (u Units) Scale() float64 {
	switch u {
	case GHzMm:
		return 1e9 * 1e-3
	case MHzIn:
		return 1e6 * 0.0254
	}
	return 1e9 * 1e-2
}

// String returns the unit as printed on axes: "GHz·cm", "GHz·mm", "MHz·in".
func (u Units) String() string {
	switch u {
	case GHzMm:
		return "GHz·mm"
	case MHzIn:
		return "MHz·in"
	}
	return "GHz·cm"
}

// format prints a product f·D given in Hz·m in the unit u, to four
// significant digits: "61.37 GHz·cm".
func (u Units) format(fd float64) string {
	return strconv.FormatFloat(fd/u.Scale(), 'g', 4, 64) + " " + u.String()
}

// Edge names the end of the chart's f·D axis that a RangeError is about.
type Edge int

// The ends of the f·D axis.
const (
	Bottom Edge = iota
	Top
)

// RangeError says that the chart's f·D range (Spec.MinFD, Spec.MaxFD, or
// the default top) cannot draw the chart, and which end to move. Its text
// gives f·D in the spec's Units.
type RangeError struct {
	Edge Edge
	Msg  string
}

func (e *RangeError) Error() string { return "modechart: " + e.Msg }

// Flag returns the unit's command-line spelling: ghz-cm, ghz-mm, mhz-in.
func (u Units) Flag() string {
	switch u {
	case GHzMm:
		return "ghz-mm"
	case MHzIn:
		return "mhz-in"
	}
	return "ghz-cm"
}

// ParseUnits parses ghz-cm, ghz-mm or mhz-in (any case; "·", "." or "*"
// may replace the hyphen).
func ParseUnits(s string) (Units, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	t = strings.NewReplacer("·", "-", ".", "-", "*", "-", " ", "-").Replace(t)
	for _, u := range []Units{GHzCm, GHzMm, MHzIn} {
		if t == u.Flag() {
			return u, nil
		}
	}
	return 0, fmt.Errorf("modechart: unknown units %q; use ghz-cm, ghz-mm or mhz-in", s)
}

// Spec describes a mode chart. The zero value is a valid spec: an empty
// (air) cavity over D/L from DefaultRatioMin to DefaultRatioMax, squared
// axes in GHz·cm, no wanted mode and no design point.
type Spec struct {
	// RatioMin and RatioMax bound D/L (diameter over length). Both zero
	// means DefaultRatioMin..DefaultRatioMax; otherwise they must satisfy
	// MinRatio <= RatioMin < RatioMax <= MaxRatio.
	RatioMin, RatioMax float64

	// MaxFD is the top of the chart as a product f·D in Hz·m, so modes
	// whose lines enter the chart below it are drawn. Zero means 1.5 times
	// the reference f·D: the design point's, else the wanted mode's at
	// the geometric middle of the ratio range, else TE011's there.
	MaxFD float64
	// MinFD is the bottom of the chart as f·D in Hz·m, 0 <= MinFD < MaxFD;
	// zero (the default) starts the chart at zero. Lines wholly below it
	// are left out.
	MinFD float64

	// Fill is the medium inside the cavity; the zero value is vacuum. With
	// a design cavity it must be the zero value or have the cavity fill's
	// permittivity and permeability; the cavity's fill is used.
	Fill physics.Medium

	Axes  Axes
	Units Units

	// Wanted is the operating mode; the zero Mode (no family) means none.
	Wanted cavity.Mode

	// Cavity, when its Radius is not zero, is the design: the design point
	// is at its D/L and the wanted mode's f·D. Without a wanted mode the
	// chart only marks the cavity's D/L (Chart.MarkRatio) with a vertical
	// line, along which every mode's f·D can be read.
	Cavity cavity.Cavity

	// Tuning is the half-width of the tuning range as a fraction of the
	// design frequency (0.02 for ±2 %), reached by moving one end plate:
	// 0 <= Tuning < 0.5. Needs a design and a wanted mode with p >= 1.
	Tuning float64

	// DiameterTol and LengthTol are the ± worst-case machining
	// tolerances in m, which widen the reachable set. They must be >= 0
	// and less than a tenth of the dimension.
	DiameterTol, LengthTol float64

	// Thermal is the temperature range and expansion of the design (zero:
	// none), which widens the reachable set as in cavity.Operation.
	Thermal cavity.Thermal

	// Clearance is the required spurious-mode clearance as a fraction of
	// the wanted frequency (0.03 for 3 %), 0 <= Clearance < 1: modes
	// within it of the wanted mode somewhere on the reachable set are
	// marked Near.
	Clearance float64
	// CountDegenerate counts the exact companion as a spurious mode.
	CountDegenerate bool
}

// Ratio limits and defaults.
const (
	DefaultRatioMin = 0.5
	DefaultRatioMax = 3.0
	MinRatio        = 0.01
	MaxRatio        = 100.0
	// MaxLines bounds the number of lines of one chart; a request past it
	// fails with advice to lower MaxFD.
	MaxLines = 5000
)

// Line is one straight line of the squared mode chart: the mode (or the
// TE0mp/TM1mp pair, which share every point) with
//
//	(f·D)² = Intercept + Slope·(D/L)²
//
// in (Hz·m)², where Intercept = (c x/π)²/(εr μr) and Slope =
// (c p/2)²/(εr μr) (derived from the resonance condition of Pozar,
// Microwave Engineering, 4th ed., sec. 6.4, circular cavity resonators,
// with a = D/2; Pozar draws the same lines as the mode chart of that
// section; section number recalled from memory).
type Line struct {
	// Modes holds the mode, or the TE0mp and TM1mp pair in that order.
	Modes []cavity.Mode
	// Root is the transverse root x: j'_nm (TE) or j_nm (TM).
	Root float64
	// P is the axial index.
	P int
	// Intercept and Slope define the line, in (Hz·m)².
	Intercept, Slope float64
	// Role is the line's meaning on this chart.
	Role Role
}

// Kind returns KindPair for a TE0mp/TM1mp pair, else the mode's family.
func (l Line) Kind() Kind {
	if len(l.Modes) > 1 {
		return KindPair
	}
	if l.Modes[0].Family == cavity.TM {
		return KindTM
	}
	return KindTE
}

// Label returns the line's name: "TE012" or "TE011/TM111" for a pair.
func (l Line) Label() string {
	s := make([]string, len(l.Modes))
	for i, m := range l.Modes {
		s[i] = m.String()
	}
	return strings.Join(s, "/")
}

// Has reports whether the line carries mode m.
func (l Line) Has(m cavity.Mode) bool {
	return slices.Contains(l.Modes, m)
}

// FD returns the product f·D in Hz·m of the line's mode at the ratio D/L = r.
func (l Line) FD(r float64) float64 {
	return math.Sqrt(l.Intercept + l.Slope*r*r)
}

// Ratio returns the D/L at which the line reaches f·D = fd, and false when
// it never does (fd below the intercept, or a horizontal TM mn0 line).
func (l Line) Ratio(fd float64) (float64, bool) {
	d := fd*fd - l.Intercept
	if l.Slope == 0 || d < 0 {
		return 0, false
	}
	return math.Sqrt(d / l.Slope), true
}

// Point is a point of the chart in physical coordinates: the ratio D/L and
// the product f·D in Hz·m.
type Point struct {
	Ratio, FD float64
}

// Reach is the reachable set of a design on the chart: the segment of
// the wanted mode's line over the D/L span of cavity.Reach (every state of
// the wanted mode lies on its own line), with the f·D at its ends.
type Reach struct {
	cavity.Reach
	FDLo, FDHi float64 // Hz·m, the wanted line's f·D at RatioLo and RatioHi
}

// Chart is a mode chart as data: every TE and TM mode of a filled cylinder
// whose line enters the chart, with its role, the axes and ranges, and the
// optional design point and operating box. Build it with New.
type Chart struct {
	Axes  Axes
	Units Units
	// RatioMin..RatioMax is the D/L range; FDMin..FDMax the f·D range in
	// Hz·m.
	RatioMin, RatioMax float64
	FDMin, FDMax       float64
	// Fill is the medium the chart is drawn for.
	Fill physics.Medium

	// Lines are sorted by intercept, then slope, then label.
	Lines []Line
	// Wanted is the index in Lines of the wanted mode's line, or -1.
	Wanted int

	// MarkRatio is the D/L of a cavity given without a wanted mode, drawn
	// as a vertical line; zero means none.
	MarkRatio float64

	// HasDesign reports whether Design, Reach and Cavity are set.
	HasDesign bool
	Design    Point
	// Reach is the reachable set and its worst-case clearance, computed
	// by cavity.Cavity.Reach: the verdict the chart draws and lists.
	Reach Reach
	// Cavity is the design cavity and DesignFreq the wanted mode's
	// frequency in it, in Hz.
	Cavity     cavity.Cavity
	DesignFreq float64
	// DiameterTol and LengthTol are Spec's tolerances in m.
	DiameterTol, LengthTol float64
	Clearance              float64
	// Tuning is Spec.Tuning, kept for captions.
	Tuning float64
	// WantedMode is Spec.Wanted.
	WantedMode cavity.Mode
}

// New builds the chart of spec s. It returns an error naming the field, the
// value and the valid range when s is invalid, when the wanted mode cannot
// be tuned as asked, or when more than MaxLines lines would be drawn.
func New(s Spec) (*Chart, error) {
	if s.RatioMin == 0 && s.RatioMax == 0 {
		s.RatioMin, s.RatioMax = DefaultRatioMin, DefaultRatioMax
	}
	if !(s.RatioMin >= MinRatio && s.RatioMin < s.RatioMax && s.RatioMax <= MaxRatio) {
		return nil, fmt.Errorf("modechart: D/L range must satisfy %g <= min < max <= %g, got %g..%g",
			MinRatio, MaxRatio, s.RatioMin, s.RatioMax)
	}
	if s.Axes != Squared && s.Axes != Linear {
		return nil, fmt.Errorf("modechart: unknown axes %d; use Squared or Linear", s.Axes)
	}
	if s.Units > MHzIn {
		return nil, fmt.Errorf("modechart: unknown units %d; use GHzCm, GHzMm or MHzIn", s.Units)
	}
	hasWanted := s.Wanted.Family != 0
	if hasWanted {
		if err := s.Wanted.Validate(); err != nil {
			return nil, fmt.Errorf("modechart: wanted mode: %w", err)
		}
	}
	hasCavity := s.Cavity.Radius != 0
	hasDesign := hasCavity && hasWanted
	fill := s.Fill
	if hasCavity {
		if err := s.Cavity.Validate(); err != nil {
			return nil, fmt.Errorf("modechart: design %w", err)
		}
		cf := s.Cavity.Fill
		if fill != (physics.Medium{}) && (fill.Eps() != cf.Eps() || fill.Mu() != cf.Mu()) {
			return nil, fmt.Errorf("modechart: chart fill (eps_r %g, mu_r %g) differs from the design cavity's (eps_r %g, mu_r %g); give one",
				fill.Eps(), fill.Mu(), cf.Eps(), cf.Mu())
		}
		fill = cf
	} else if err := fill.Validate(); err != nil {
		return nil, fmt.Errorf("modechart: fill: cavity: %w", err)
	}
	if err := fill.RequireIsotropic("modechart: the mode chart"); err != nil {
		return nil, err
	}
	eps, mu := fill.Eps(), fill.Mu()
	if !hasDesign && (s.Tuning != 0 || s.DiameterTol != 0 || s.LengthTol != 0 || s.Clearance != 0) {
		return nil, fmt.Errorf("modechart: tuning, tolerances and clearance need a design: a cavity and a wanted mode")
	}
	for _, q := range []struct {
		name   string
		v, max float64
	}{{"tuning", s.Tuning, 0.5}, {"clearance", s.Clearance, 1}} {
		if math.IsNaN(q.v) || q.v < 0 || q.v >= q.max {
			return nil, fmt.Errorf("modechart: %s must be in [0, %g) as a fraction, got %g", q.name, q.max, q.v)
		}
	}
	if hasDesign {
		for _, q := range []struct {
			name   string
			v, dim float64
		}{{"diameter tolerance", s.DiameterTol, s.Cavity.Diameter()}, {"length tolerance", s.LengthTol, s.Cavity.Length}} {
			if math.IsNaN(q.v) || q.v < 0 || q.v >= q.dim/10 {
				return nil, fmt.Errorf("modechart: %s must be in [0, %g) m (a tenth of the dimension), got %g m", q.name, q.dim/10, q.v)
			}
		}
	}

	ch := &Chart{
		Axes: s.Axes, Units: s.Units,
		RatioMin: s.RatioMin, RatioMax: s.RatioMax,
		Fill:       fill,
		Wanted:     -1,
		Clearance:  s.Clearance,
		Tuning:     s.Tuning,
		WantedMode: s.Wanted,
	}
	n2 := eps * mu
	// lineOf builds the line of mode m; Pozar 4th ed., sec. 6.4 (derived,
	// see Line).
	lineOf := func(m cavity.Mode) Line {
		x := m.Root()
		if c, ok := m.Companion(); ok && m.Family == cavity.TE {
			// Use the TM1m root for the pair so both names share one
			// line to the last bit (j'_0m = j_1m, DLMF 10.6.3).
			x = c.Root()
		}
		cx := physics.SpeedOfLight * x / math.Pi
		cp := physics.SpeedOfLight * float64(m.P) / 2
		return Line{Modes: []cavity.Mode{m}, Root: x, P: m.P, Intercept: cx * cx / n2, Slope: cp * cp / n2}
	}

	if hasDesign {
		w := lineOf(s.Wanted)
		d := s.Cavity.Diameter()
		f0 := s.Cavity.Frequency(s.Wanted)
		ch.HasDesign = true
		ch.Design = Point{Ratio: d / s.Cavity.Length, FD: f0 * d}
		ch.Cavity, ch.DesignFreq = s.Cavity, f0
		ch.DiameterTol, ch.LengthTol = s.DiameterTol, s.LengthTol
		r, err := s.Cavity.Reach(cavity.Operation{
			Mode: s.Wanted, Tuning: s.Tuning,
			DiameterTol: s.DiameterTol, LengthTol: s.LengthTol,
			Thermal: s.Thermal, MinClearance: s.Clearance, CountDegenerate: s.CountDegenerate,
		})
		if err != nil {
			return nil, err
		}
		ch.Reach = Reach{Reach: r, FDLo: w.FD(r.RatioLo), FDHi: w.FD(r.RatioHi)}
	}

	if hasCavity && !hasWanted {
		ch.Cavity = s.Cavity
		ch.MarkRatio = s.Cavity.Diameter() / s.Cavity.Length
		if ch.MarkRatio < s.RatioMin || ch.MarkRatio > s.RatioMax {
			return nil, fmt.Errorf("modechart: the cavity's D/L %.4g lies outside the chart's D/L range %g..%g; widen the range",
				ch.MarkRatio, s.RatioMin, s.RatioMax)
		}
	}
	ch.FDMax = s.MaxFD
	if ch.FDMax == 0 {
		ref := cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}
		if hasWanted {
			ref = s.Wanted
		}
		fd := lineOf(ref).FD(math.Sqrt(s.RatioMin * s.RatioMax))
		if hasDesign {
			fd = ch.Design.FD
		}
		ch.FDMax = 1.5 * fd
	}
	if !(ch.FDMax > 0 && ch.FDMax < 1e12) {
		return nil, &RangeError{Edge: Top, Msg: fmt.Sprintf("the top of the chart must be above 0 and below %s, got %s", s.Units.format(1e12), s.Units.format(s.MaxFD))}
	}
	ch.FDMin = s.MinFD
	if !(ch.FDMin >= 0 && ch.FDMin < ch.FDMax) {
		return nil, &RangeError{Edge: Bottom, Msg: fmt.Sprintf("the bottom of the chart must be at least 0 and below the top %s, got %s", s.Units.format(ch.FDMax), s.Units.format(s.MinFD))}
	}
	if hasDesign && ch.Reach.FDLo*(1-ch.Clearance) < ch.FDMin {
		return nil, &RangeError{Edge: Bottom, Msg: fmt.Sprintf("the reachable set and clearance band reach down to f·D = %s, below the bottom of the chart %s; lower the bottom",
			s.Units.format(ch.Reach.FDLo*(1-ch.Clearance)), s.Units.format(ch.FDMin))}
	}
	if hasDesign && ch.Reach.FDHi > ch.FDMax {
		return nil, &RangeError{Edge: Top, Msg: fmt.Sprintf("the reachable set reaches f·D = %s, above the top of the chart %s; raise the top",
			s.Units.format(ch.Reach.FDHi), s.Units.format(ch.FDMax))}
	}
	if hasDesign && (ch.Reach.RatioLo < s.RatioMin || ch.Reach.RatioHi > s.RatioMax) {
		return nil, fmt.Errorf("modechart: the design's reachable D/L span %.4g..%.4g lies outside the chart's D/L range %g..%g; widen the range",
			ch.Reach.RatioLo, ch.Reach.RatioHi, s.RatioMin, s.RatioMax)
	}

	// Every mode whose line enters the chart: its lowest point is at
	// RatioMin, so these are the modes of a cavity with D = 1 m and
	// L = 1/RatioMin (whose frequency is f·D) at or below FDMax.
	ref := cavity.Cavity{Radius: 0.5, Length: 1 / s.RatioMin, Fill: fill}
	count, _, err := ref.Count(ch.FDMax)
	if err != nil {
		return nil, &RangeError{Edge: Top, Msg: fmt.Sprintf("listing modes up to f·D = %s: %v; lower the top of the chart", s.Units.format(ch.FDMax), err)}
	}
	if count > 2*MaxLines {
		return nil, &RangeError{Edge: Top, Msg: fmt.Sprintf("%d modes below the chart top %s exceed the %d-line limit; lower the top of the chart",
			count, s.Units.format(ch.FDMax), MaxLines)}
	}
	res, err := ref.Modes(ch.FDMax)
	if err != nil {
		return nil, fmt.Errorf("modechart: listing modes: %w", err)
	}
	lines := make([]Line, 0, len(res))
	seen := make(map[cavity.Mode]int, len(res))
	for _, r := range res {
		m := r.Mode
		if c, ok := m.Companion(); ok {
			if i, ok := seen[c]; ok {
				lines[i].Modes = append(lines[i].Modes, m)
				sortPair(lines[i].Modes)
				seen[m] = i
				continue
			}
		}
		l := lineOf(m)
		if l.FD(s.RatioMax) < ch.FDMin {
			continue // wholly below the chart
		}
		seen[m] = len(lines)
		lines = append(lines, l)
	}
	if len(lines) > MaxLines {
		return nil, fmt.Errorf("modechart: %d lines below the chart top %.4g Hz·m exceed the %d-line limit; lower the top of the chart",
			len(lines), ch.FDMax, MaxLines)
	}
	// Keep the pair's line on the TM1m root whichever name came first.
	for i := range lines {
		if len(lines[i].Modes) == 2 {
			t := lineOf(lines[i].Modes[1])
			lines[i].Root, lines[i].Intercept, lines[i].Slope = t.Root, t.Intercept, t.Slope
		}
	}
	slices.SortStableFunc(lines, func(a, b Line) int {
		if c := cmp.Compare(a.Intercept, b.Intercept); c != 0 {
			return c
		}
		if c := cmp.Compare(a.Slope, b.Slope); c != 0 {
			return c
		}
		return cmp.Compare(a.Label(), b.Label())
	})
	ch.Lines = lines
	if hasWanted {
		for i := range ch.Lines {
			if ch.Lines[i].Has(s.Wanted) {
				ch.Wanted = i
				ch.Lines[i].Role = Wanted
			}
		}
	}
	if hasDesign {
		ch.classify()
	}
	return ch, nil
}

func sortPair(ms []cavity.Mode) {
	slices.SortFunc(ms, func(a, b cavity.Mode) int { return cmp.Compare(a.Family, b.Family) })
}

// classify sets the role of every spurious line from the reachable set's
// verdict (cavity.Reach.Offending): Crossing when the mode meets the wanted
// one somewhere on the set, Near when it comes within the required
// clearance there, Ordinary otherwise. A TE0mp/TM1mp pair is one line and
// one offender.
func (ch *Chart) classify() {
	role := map[cavity.Mode]Role{}
	for _, o := range ch.Reach.Offending {
		role[o.Mode] = Near
		if o.Crosses {
			role[o.Mode] = Crossing
		}
	}
	for i := range ch.Lines {
		l := &ch.Lines[i]
		if i == ch.Wanted {
			continue
		}
		l.Role = Ordinary
		for _, m := range l.Modes {
			if r, ok := role[m]; ok {
				l.Role = r
			}
		}
	}
}

// X returns the horizontal chart coordinate of the ratio D/L = r: r² on
// squared axes, r on linear axes.
func (ch *Chart) X(r float64) float64 {
	if ch.Axes == Squared {
		return r * r
	}
	return r
}

// Y returns the vertical chart coordinate of f·D (Hz·m): (f·D/u)² on
// squared axes and f·D/u on linear axes, u the chart's unit.
func (ch *Chart) Y(fd float64) float64 {
	v := fd / ch.Units.Scale()
	if ch.Axes == Squared {
		return v * v
	}
	return v
}

// RatioAt inverts X.
func (ch *Chart) RatioAt(x float64) float64 {
	if ch.Axes == Squared {
		return math.Sqrt(math.Max(0, x))
	}
	return x
}

// FDAt inverts Y.
func (ch *Chart) FDAt(y float64) float64 {
	if ch.Axes == Squared {
		return math.Sqrt(math.Max(0, y)) * ch.Units.Scale()
	}
	return y * ch.Units.Scale()
}

// XLabel returns the horizontal axis title with its unit.
func (ch *Chart) XLabel() string {
	if ch.Axes == Squared {
		return "(D/L)²   (diameter over length, squared)"
	}
	return "D/L   (diameter over length)"
}

// YLabel returns the vertical axis title with its unit.
func (ch *Chart) YLabel() string {
	if ch.Axes == Squared {
		return fmt.Sprintf("(f·D)²   [(%s)²]", ch.Units)
	}
	return fmt.Sprintf("f·D   [%s]", ch.Units)
}

// Spurious returns the lines with role Crossing or Near, in chart order.
func (ch *Chart) Spurious() []Line {
	var out []Line
	for _, l := range ch.Lines {
		if l.Role == Crossing || l.Role == Near {
			out = append(out, l)
		}
	}
	return out
}
