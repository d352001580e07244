package filter

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/qfactor"
)

// Physical realisation of a synthesised design: one closed circular
// cavity per resonator, its unloaded Q, the spurious resonances of the
// cavity near the band, the coupling holes between neighbouring cavities
// and the coupling values that must be realised otherwise.

// DefaultSpuriousWindow is the half-width of the spurious search window,
// as a fraction of f0, used when RealiseOptions.Window is zero (common
// practice: a cavity filter's spurious-free range is usually quoted within
// some +-20 % of the band).
const DefaultSpuriousWindow = 0.2

// MaxSpuriousWindow is the largest RealiseOptions.Window (the window must
// stay above 0 Hz).
const MaxSpuriousWindow = 0.95

// sameCavityTol is the relative difference of resonant frequency below
// which two resonators count as the same cavity design: synthesis leaves
// diagonal couplings of symmetric designs at rounding level (about 1e-13),
// which moves a frequency by far less.
const sameCavityTol = 1e-12

// crossCouplingTol is the magnitude of a normalised coupling-matrix entry
// below which it counts as absent (a cross coupling) or zero (a diagonal
// entry): the folded matrix holds rounding of about 1e-13 where the
// pattern has zeros.
const crossCouplingTol = 1e-9

// Stopband is a frequency band in which the filter must reject: Low..High
// in Hz (0 < Low < High), with the attenuation required there (dB, 0 when
// not stated).
type Stopband struct {
	Low, High   float64 // Hz
	Attenuation float64 // dB
	// Derived is true for a band read from a spot rejection of the
	// specification (see RealiseOptions.Stopbands).
	Derived bool
}

// contains reports whether f lies in the closed band.
func (s Stopband) contains(f float64) bool { return f >= s.Low && f <= s.High }

// RealiseOptions selects the cavities that realise a design. The zero value
// of each optional field is its documented default; Shape is required.
type RealiseOptions struct {
	// Mode is the resonant mode of every cavity; the zero value means
	// TE011.
	Mode cavity.Mode
	// Shape fixes the dimension besides the frequency: cavity.ByRatio(D/L)
	// (to use the optimiser's answer pass cavity.ByRatio(opt.Ratio) of a
	// cavity.Design), cavity.ByDiameter or cavity.ByLength. With a fixed
	// diameter every cavity keeps it and resonators tuned apart differ in
	// length only, as when they are tuned by an end plate.
	Shape cavity.Constraint
	// Fill is the homogeneous medium in the cavities, with its loss
	// tangents (zero value: lossless vacuum).
	Fill physics.Medium
	// Walls are the side wall and end plates of every cavity, each
	// evaluated at its cavity's frequency; nil means perfectly conducting
	// walls, so that Q0 comes from the fill alone (+Inf with no loss).
	Walls *qfactor.WallSet
	// Window is the half-width of the spurious search window as a fraction
	// of f0, in (0, MaxSpuriousWindow]; zero means DefaultSpuriousWindow.
	// The window is widened to hold every stopband and rejection frequency.
	Window float64
	// Stopbands are rejection bands stated besides the specification's
	// spot rejections. Each spot rejection of the Spec inside the model
	// range is added as its region of the mask (Spec.Mask: from F away
	// from the passband to the end of the band of interest; common
	// practice, a rejection quoted at one frequency is meant to hold
	// beyond it), marked Derived. Design.Check turns a spurious resonance
	// in such a region into a failed rejection.
	Stopbands []Stopband
	// Hole, when not nil, places the coupling holes between neighbouring
	// cavities (the same wall and position for all; Radius ignored): each
	// main-line coupling is then sized by Bethe's theory (SizeHole). When
	// nil the couplings are listed for a field solver.
	Hole *Hole
}

// CavityDesign is the cavity of one resonator.
type CavityDesign struct {
	Resonator int // 1..N
	// SelfCoupling is the diagonal entry M_ii of the folded matrix
	// (normalised); zero for a synchronously tuned resonator (entries of
	// magnitude up to 1e-9, synthesis rounding, are taken as zero).
	SelfCoupling float64
	// F is the resonator's own resonant frequency, Hz (see Realise).
	F      float64
	Cavity cavity.Cavity
	// Q0 is the unloaded Q of the wanted mode (walls and fill); Loss holds
	// its breakdown.
	Q0   float64
	Loss qfactor.Unloaded
	// Validity holds the warnings of qfactor.Validity on Loss: where the
	// loss models stop holding for this cavity (nil when they hold).
	Validity []qfactor.Warning
}

// Spurious is another resonance of a cavity design near the band.
type Spurious struct {
	Mode cavity.Mode
	F    float64 // Hz
	// Offset is F - f0 (Hz) and Relative (F - f0)/f0, f0 the filter's
	// centre frequency.
	Offset, Relative float64
	// Resonators lists the resonators (1..N) whose cavity has this
	// resonance: all of them for a synchronously tuned filter, whose
	// cavities are identical so that their spurious resonances coincide.
	Resonators []int
	// Companion marks the exact TE0mp/TM1mp companion of the wanted mode,
	// which resonates at the wanted frequency in every cylinder.
	Companion bool
	// InPassband is true when F lies in the passband f1..f2.
	InPassband bool
	// Stopband is the index in Realisation.Stopbands of the first band
	// holding F, or -1.
	Stopband int
}

// SpuriousGroup is one spurious mode of the cavities near the band, its
// resonances merged over the resonators: those of a filter with detuned
// resonators lie at slightly different frequencies, listed as one range.
type SpuriousGroup struct {
	Mode       cavity.Mode
	FMin, FMax float64 // Hz
	Resonators []int   // sorted, each once
	Companion  bool
	InPassband bool // any of its resonances lies in the passband
	// Stopband is the first rejection band holding one of its
	// resonances, or -1.
	Stopband int
}

// Alarm reports whether the mode lies in the passband or a rejection band
// (the wanted mode's exact companion, which every cylinder has at f0, is
// reported as such instead).
func (g SpuriousGroup) Alarm() bool {
	return !g.Companion && (g.InPassband || g.Stopband >= 0)
}

// Where says where the mode lies, in the words every output uses.
func (g SpuriousGroup) Where() string {
	switch {
	case g.Companion:
		return "exact companion of the wanted mode"
	case g.InPassband:
		return "IN THE PASSBAND"
	case g.Stopband >= 0:
		return "IN A REJECTION BAND"
	}
	return "outside the passband and the rejection bands"
}

// SpuriousGroups merges rz.Spurious by mode, in the order each mode first
// appears there.
func (rz *Realisation) SpuriousGroups() []SpuriousGroup {
	var out []SpuriousGroup
	index := map[cavity.Mode]int{}
	for _, sp := range rz.Spurious {
		i, ok := index[sp.Mode]
		if !ok {
			index[sp.Mode] = len(out)
			out = append(out, SpuriousGroup{Mode: sp.Mode, FMin: sp.F, FMax: sp.F, Companion: sp.Companion, Stopband: -1})
			i = len(out) - 1
		}
		g := &out[i]
		g.FMin, g.FMax = math.Min(g.FMin, sp.F), math.Max(g.FMax, sp.F)
		g.Resonators = append(g.Resonators, sp.Resonators...)
		g.InPassband = g.InPassband || sp.InPassband
		if g.Stopband < 0 {
			g.Stopband = sp.Stopband
		}
	}
	for i := range out {
		slices.Sort(out[i].Resonators)
		out[i].Resonators = slices.Compact(out[i].Resonators)
	}
	return out
}

// Aperture is the realisation of one main-line coupling k_{i,i+1}.
type Aperture struct {
	From, To int // resonators, To = From + 1
	// Required is the bandpass coupling coefficient FBW M_{i,i+1}.
	Required float64
	// Sized is true when a hole was sized by Bethe's theory (see
	// HoleCoupling, and Valid for the theory's limits). The embedded
	// HoleCoupling is the zero value otherwise.
	Sized bool
	HoleCoupling
	// Note says, for people, how the coupling must be realised when it was
	// not sized or lies outside Bethe's range.
	Note string
}

// Valid reports whether a hole was sized and lies inside every validity
// limit of Bethe's theory.
func (a Aperture) Valid() bool { return a.Sized && a.HoleCoupling.Valid() }

// CrossCoupling is a coupling outside the main line (source and load count
// as 0 and N+1): a cross coupling of the folded matrix or a direct
// source-load coupling. Its realisation depends on the layout and is left
// to a field solver or measurement.
type CrossCoupling struct {
	From, To int
	// M is the normalised matrix entry and K = FBW M the bandpass coupling.
	M, K float64
	Note string
}

// Port is the coupling of a filter port to its end resonator.
type Port struct {
	Resonator int     // 1 or N
	Qext      float64 // external Q to realise
	// GroupDelay is the group delay of the reflection from the port with
	// only that resonator present, at its resonance: 4 Qext / (2 pi f_i)
	// (J. B. Ness, "A unified approach to the design, measurement, and
	// tuning of coupled-resonator filters", IEEE Trans. Microwave Theory
	// Tech. 46(4) (1998) 343-351; recalled from memory), the usual target
	// when the port coupling is set by measurement.
	GroupDelay float64 // s
	Note       string
}

// Realisation is the physical realisation of a design.
type Realisation struct {
	Mode  cavity.Mode
	Shape cavity.Constraint
	// Cavities holds one cavity per resonator, in order.
	Cavities []CavityDesign
	// Window is the searched band, Hz; Stopbands the stated and derived
	// rejection bands the spurious list was checked against.
	Window    [2]float64
	Stopbands []Stopband
	// Spurious lists every other resonance of each distinct cavity design
	// inside Window, by frequency (the wanted mode itself is left out).
	Spurious []Spurious
	// Apertures holds the N-1 main-line couplings.
	Apertures []Aperture
	// Cross holds the couplings outside the main line.
	Cross []CrossCoupling
	// Ports are the input (resonator 1) and output (resonator N) couplings.
	Ports [2]Port
	// Warnings are findings for people, in a fixed order: the exact
	// companion, the wanted mode's second polarisation, spurious
	// resonances in the passband, then in a stopband, then the holes
	// (outside Bethe's range or unreachable).
	Warnings []string
	// WallWarnings are the warnings of the wall surface models
	// (qfactor.WallSet.Resistances: a ferromagnetic metal, the anomalous
	// skin effect, ...), each once, in the order met.
	WallWarnings []string
}

// Q0 returns the unloaded Q of each resonator, in order, as
// Design.Response and Design.Check take them.
func (r *Realisation) Q0() []float64 {
	q := make([]float64, len(r.Cavities))
	for i, c := range r.Cavities {
		q[i] = c.Q0
	}
	return q
}

// Realise builds the physical cavities of design d.
//
// Each resonator i is a closed cylinder resonating in opts.Mode at its own
// frequency
//
//	f_i = f0 (sqrt(1 + (M_ii FBW/2)^2) - M_ii FBW/2),
//
// the bandpass image of Omega_i = -M_ii (BandpassFrequency): in the
// network matrix A = Omega W - j R + M of Response resonator i alone
// resonates where Omega + M_ii = 0 (derived), so a diagonal entry of an
// asymmetric design detunes that resonator, and its cavity is sized for
// f_i, not f0. Synchronously tuned designs (all-pole and symmetric ones)
// have every f_i = f0. The cavity comes from cavity.Size with opts.Shape
// and its Q0 from qfactor.UnloadedQ (wall loss from opts.Walls, fill loss
// from the loss tangents of opts.Fill), checked by qfactor.Validity.
//
// Spurious resonances: every other mode of each distinct cavity design
// inside the search window, from cavity.Cavity.Modes (complete to the
// accuracy of the Bessel zeros), each marked when it lies in the passband
// or in a stopband. Identical cavities have identical spurious
// resonances, which then add up in a multi-cavity filter instead of being
// suppressed by the other cavities; the list is per design. The exact
// companion (TM1mp of a TE0mp filter and the reverse) resonates at f_i in
// every cylinder and needs a mode trap or another suppression: a warning
// always says so. Whether a listed mode shows in the response depends on
// how the holes and ports couple it, which is not modelled.
//
// Couplings: each main-line k_{i,i+1} = FBW M_{i,i+1} is sized as a hole by
// SizeHole when opts.Hole is set (warnings when the hole breaks Bethe's
// validity limits or cannot reach k); cross couplings and the port
// couplings (Qext) are listed as values that a field solver or
// measurement must realise, since no published small-aperture method is
// applied to them here.
//
// Errors: a nil or unsynthesised design, an invalid mode, fill, loss,
// wall set (qfactor.WallSet.Validate), window or stopband, a missing
// Shape, a cavity that cannot be sized, or a surface resistance that
// cannot be computed at a cavity's frequency.
func Realise(d *Design, opts RealiseOptions) (*Realisation, error) {
	if d == nil || d.Folded == nil || d.Spec.Order < 1 {
		return nil, errors.New("filter: Realise needs a synthesised design (from Synthesize)")
	}
	n := d.Spec.Order
	if r, c := d.Folded.Dims(); r != n+2 || c != n+2 {
		return nil, fmt.Errorf("filter: folded matrix is %dx%d, want %dx%d for order %d", r, c, n+2, n+2, n)
	}
	mode := opts.Mode
	if mode == (cavity.Mode{}) {
		mode = cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}
	}
	if err := mode.Validate(); err != nil {
		return nil, err
	}
	if err := opts.Fill.RequireIsotropic("filter: the realisation (apertures and spurious modes)"); err != nil {
		return nil, err
	}
	if opts.Shape.Name() == "none" {
		return nil, errors.New("filter: Realise needs a cavity shape: cavity.ByRatio(D/L), cavity.ByDiameter(m) or cavity.ByLength(m)")
	}
	var ws qfactor.WallSet // the zero WallSet: perfectly conducting (qfactor.Validity)
	if opts.Walls != nil {
		ws = *opts.Walls
		if err := ws.Validate(); err != nil {
			return nil, fmt.Errorf("filter: walls: %w", err)
		}
	}
	w := opts.Window
	if w == 0 {
		w = DefaultSpuriousWindow
	}
	if !(w > 0 && w <= MaxSpuriousWindow) {
		return nil, fmt.Errorf("filter: spurious search window must be in (0, %g] (fraction of f0), got %g", MaxSpuriousWindow, opts.Window)
	}
	f0, bw := d.Spec.F0, d.Spec.BW
	for i, s := range opts.Stopbands {
		if !(s.Low > 0) || !(s.High > s.Low) || math.IsInf(s.High, 0) {
			return nil, fmt.Errorf("filter: stopband %d must have 0 < low < high < Inf Hz, got %g..%g Hz", i+1, s.Low, s.High)
		}
		if !(s.Attenuation >= 0) || math.IsInf(s.Attenuation, 0) {
			return nil, fmt.Errorf("filter: stopband %d: attenuation must be >= 0 dB and finite, got %g dB", i+1, s.Attenuation)
		}
	}

	r := &Realisation{Mode: mode, Shape: opts.Shape}
	walls := func(float64) (qfactor.SurfaceResistances, error) { return qfactor.SurfaceResistances{}, nil }
	if opts.Walls != nil {
		walls = ws.At(func(w string) { r.WallWarnings = append(r.WallWarnings, w) })
	}

	// Cavities.
	r.Cavities = make([]CavityDesign, n)
	for i := 1; i <= n; i++ {
		mii := d.Folded.At(i, i)
		if math.Abs(mii) <= crossCouplingTol {
			mii = 0 // synthesis rounding: the resonator is at f0
		}
		fi := BandpassFrequency(-mii, f0, bw) // Omega_i = -M_ii (derived above)
		c, err := cavity.Size(mode, fi, opts.Fill, opts.Shape)
		if err != nil {
			return nil, fmt.Errorf("filter: cavity of resonator %d at %s: %w", i, physics.FormatFrequency(fi, 6), err)
		}
		u, err := qfactor.UnloadedQ(c, mode, walls)
		if err != nil {
			return nil, fmt.Errorf("filter: unloaded Q of resonator %d: %w", i, err)
		}
		r.Cavities[i-1] = CavityDesign{Resonator: i, SelfCoupling: mii, F: fi, Cavity: c, Q0: u.Q0, Loss: u,
			Validity: qfactor.Validity(c, ws, u)}
	}

	// Window and stopbands: the mask's rejection regions (Spec.Mask) are the
	// derived stopbands, and the window holds them all.
	mask := d.Spec.mask()
	lo, hi := f0*(1-w), f0*(1+w)
	for _, s := range opts.Stopbands {
		lo, hi = math.Min(lo, s.Low), math.Max(hi, s.High)
	}
	for _, g := range mask.Regions {
		lo, hi = math.Min(lo, g.Low), math.Max(hi, g.High)
	}
	r.Window = [2]float64{lo, hi}
	r.Stopbands = slices.Clone(opts.Stopbands)
	for i := range r.Stopbands {
		r.Stopbands[i].Derived = false
	}
	for _, g := range mask.Regions {
		if g.OutsideModel {
			continue
		}
		r.Stopbands = append(r.Stopbands, Stopband{Low: g.Low, High: g.High, Attenuation: g.Attenuation, Derived: true})
	}
	f1, f2 := BandpassFrequency(-1, f0, bw), BandpassFrequency(1, f0, bw)

	// Spurious resonances per distinct cavity design.
	var groups [][]int // resonator indices (0-based) sharing a design
	for i := range r.Cavities {
		placed := false
		for g, members := range groups {
			if math.Abs(r.Cavities[members[0]].F-r.Cavities[i].F) <= sameCavityTol*f0 {
				groups[g] = append(groups[g], i)
				placed = true
				break
			}
		}
		if !placed {
			groups = append(groups, []int{i})
		}
	}
	companion, hasCompanion := mode.Companion()
	for _, members := range groups {
		c := r.Cavities[members[0]].Cavity
		modes, err := c.Modes(hi)
		if err != nil {
			return nil, fmt.Errorf("filter: modes of the cavity of resonator %d up to %s: %w", members[0]+1, physics.FormatFrequency(hi, 6), err)
		}
		res := make([]int, len(members))
		for k, i := range members {
			res[k] = i + 1
		}
		for _, m := range modes {
			if m.Frequency < lo || m.Mode == mode {
				continue
			}
			s := Spurious{
				Mode: m.Mode, F: m.Frequency,
				Offset: m.Frequency - f0, Relative: (m.Frequency - f0) / f0,
				Resonators: res,
				Companion:  hasCompanion && m.Mode == companion,
				InPassband: m.Frequency >= f1 && m.Frequency <= f2,
				Stopband:   -1,
			}
			for k, sb := range r.Stopbands {
				if sb.contains(m.Frequency) {
					s.Stopband = k
					break
				}
			}
			r.Spurious = append(r.Spurious, s)
		}
	}
	slices.SortStableFunc(r.Spurious, func(a, b Spurious) int {
		if a.F != b.F {
			if a.F < b.F {
				return -1
			}
			return 1
		}
		return a.Resonators[0] - b.Resonators[0]
	})

	// Couplings.
	r.Apertures = make([]Aperture, n-1)
	var holeWarnings []string
	for i := 1; i < n; i++ {
		a, warn := realiseAperture(d, r, i, opts.Hole)
		r.Apertures[i-1] = a
		holeWarnings = append(holeWarnings, warn...)
	}
	for i := 0; i < n+2; i++ {
		for j := i + 2; j < n+2; j++ {
			m := d.Folded.At(i, j)
			if math.Abs(m) <= crossCouplingTol {
				continue
			}
			r.Cross = append(r.Cross, CrossCoupling{From: i, To: j, M: m, K: d.FBW * m,
				Note: fmt.Sprintf("%s coupling (normalised M = %.6g, k = %.6g): its realisation depends on the layout; realise it with a field solver or by measurement", couplingName(i, j, n), m, d.FBW*m)})
		}
	}
	for k, p := range []struct {
		res  int
		qext float64
	}{{1, d.QextIn}, {n, d.QextOut}} {
		fi := r.Cavities[p.res-1].F
		r.Ports[k] = Port{Resonator: p.res, Qext: p.qext, GroupDelay: 4 * p.qext / (2 * math.Pi * fi), // Ness 1998
			Note: fmt.Sprintf("realise Qext = %.6g at resonator %d (iris or probe to the port) with a field solver or by measurement: reflected group delay %.4g ns at %s with the other resonators detuned",
				p.qext, p.res, 4*p.qext/(2*math.Pi*fi)*1e9, physics.FormatFrequency(fi, 6))}
	}

	r.Warnings = append(r.warnings(mode, hasCompanion, companion), holeWarnings...)
	return r, nil
}

// couplingName returns "cross 1-4", "source-load", "source-3" etc.
func couplingName(i, j, n int) string {
	name := func(k int) string {
		switch k {
		case 0:
			return "source"
		case n + 1:
			return "load"
		}
		return fmt.Sprint(k)
	}
	if i >= 1 && j <= n {
		return fmt.Sprintf("cross %d-%d", i, j)
	}
	return name(i) + "-" + name(j)
}

// realiseAperture sizes the hole of main-line coupling i-(i+1) and
// returns the warnings it raises.
func realiseAperture(d *Design, r *Realisation, i int, hole *Hole) (Aperture, []string) {
	k := d.Coupling(i, i+1)
	a := Aperture{From: i, To: i + 1, Required: k}
	switch {
	case hole == nil:
		a.Note = fmt.Sprintf("no hole geometry given: realise k = %.6g with a field solver or by measurement", k)
		return a, nil
	case math.Abs(k) <= crossCouplingTol*d.FBW:
		a.Note = "no coupling required"
		return a, nil
	}
	c1, c2 := r.Cavities[i-1].Cavity, r.Cavities[i].Cavity
	hc, err := SizeHole(c1, c2, r.Mode, *hole, k)
	if err != nil {
		a.Note = err.Error()
		return a, []string{fmt.Sprintf("aperture %d-%d: %s", i, i+1, a.Note)}
	}
	a.Sized, a.HoleCoupling = true, hc
	if hc.Valid() {
		return a, nil
	}
	a.Note = fmt.Sprintf("Bethe's theory is outside its range: realise k = %.4g with a field solver", k)
	warn := make([]string, len(hc.Problems))
	for j, p := range hc.Problems {
		warn[j] = fmt.Sprintf("aperture %d-%d: %s; %s", i, i+1, p, a.Note)
	}
	return a, warn
}

// warnings collects the findings of r for people, in the documented order.
func (r *Realisation) warnings(mode cavity.Mode, hasCompanion bool, companion cavity.Mode) []string {
	var out []string
	if hasCompanion {
		out = append(out, fmt.Sprintf("%s resonates at exactly the frequency of %s in every cylinder (j'_0m = j_1m): suppress it with a mode trap or another mode-selective feature, or it shows as a spurious response in the passband", companion, mode))
	}
	if mode.Degeneracy() == 2 {
		out = append(out, fmt.Sprintf("%s has two polarisations at the same frequency: the holes and ports must couple only one (or both on purpose, as in a dual-mode filter), or the second resonates in the passband", mode))
	}
	ff := func(f float64) string { return physics.FormatFrequency(f, 6) }
	for _, s := range r.Spurious {
		if s.InPassband && !s.Companion {
			out = append(out, fmt.Sprintf("spurious %s at %s lies in the passband (cavities %s)", s.Mode, ff(s.F), resonatorList(s.Resonators)))
		}
	}
	for _, s := range r.Spurious {
		if s.Stopband < 0 {
			continue
		}
		sb := r.Stopbands[s.Stopband]
		how := "stated"
		if sb.Derived {
			how = "read from the rejection requirement at the band's inner edge"
		}
		out = append(out, fmt.Sprintf("spurious %s at %s (%+.2f %% from f0) lies in the stopband %s..%s (%s, %g dB): the filter will not reject there (cavities %s)",
			s.Mode, ff(s.F), 100*s.Relative, ff(sb.Low), ff(sb.High), how, sb.Attenuation, resonatorList(s.Resonators)))
	}
	return out
}

// resonatorList prints 1..N compactly: "1-4" for a run, "1, 3" otherwise.
func resonatorList(r []int) string {
	if len(r) > 1 && r[len(r)-1]-r[0] == len(r)-1 {
		return fmt.Sprintf("%d-%d", r[0], r[len(r)-1])
	}
	s := ""
	for i, v := range r {
		if i > 0 {
			s += ", "
		}
		s += fmt.Sprint(v)
	}
	return s
}
