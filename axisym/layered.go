package axisym

import (
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/physics/bessel"
	"cylcav/physics/quad"
)

// Layer is one radial layer of a layered Section: the medium between the
// previous layer's outer radius (or the inner conductor, or the axis) and
// Radius.
type Layer struct {
	// Radius is the outer radius of the layer in metres.
	Radius float64
	// Medium fills the layer; the zero value is vacuum. Only isotropic,
	// non-magnetic media (mu_r = 1) are solved so far.
	Medium physics.Medium
}

// MaxLayers bounds the layers of one section that Validate accepts.
const MaxLayers = 20

// layerTol is the relative tolerance within which the last layer's radius
// must equal the section's radius (a radius typed in other units may round).
const layerTol = 1e-12

// validateLayers checks the layers of s (called by Section.validate).
func (s Section) validateLayers() error {
	if len(s.Layers) == 0 {
		return nil
	}
	if len(s.Layers) > MaxLayers {
		return fmt.Errorf("at most %d layers, got %d", MaxLayers, len(s.Layers))
	}
	if s.Fill != (physics.Medium{}) {
		return fmt.Errorf("fill must be left empty when the section has layers (each layer has its medium), got %s", s.Fill.Label())
	}
	prev := s.InnerRadius
	for i, l := range s.Layers {
		lo, what := prev, "the previous layer's radius"
		if i == 0 {
			what = "the axis"
			if s.InnerRadius != 0 {
				what = "the inner conductor radius"
			}
		}
		hi := s.Radius
		if !(l.Radius > lo && l.Radius <= hi*(1+layerTol)) {
			return fmt.Errorf("layer %d: outer radius must be above %s (%g m) and at most the section radius %g m, got %g m",
				i+1, what, lo, hi, l.Radius)
		}
		if i == len(s.Layers)-1 && math.Abs(l.Radius-s.Radius) > layerTol*s.Radius {
			return fmt.Errorf("layer %d: the last layer's outer radius must equal the section radius %g m, got %g m",
				i+1, s.Radius, l.Radius)
		}
		if err := l.Medium.Validate(); err != nil {
			return fmt.Errorf("layer %d: medium: %w", i+1, err)
		}
		if err := l.Medium.RequireIsotropic("a layered section"); err != nil {
			return fmt.Errorf("layer %d: medium: %w", i+1, err)
		}
		if l.Medium.Mu() != 1 {
			return fmt.Errorf("layer %d: medium: relative permeability %g in a layer: %w (layers must have mu_r = 1)",
				i+1, l.Medium.Mu(), ErrNotImplemented)
		}
		prev = l.Radius
	}
	return nil
}

// maxIndex returns the largest refractive index in the section.
func (s Section) maxIndex() float64 {
	if len(s.Layers) == 0 {
		return s.Fill.Index()
	}
	n := 0.0
	for _, l := range s.Layers {
		n = max(n, l.Medium.Index())
	}
	return n
}

// layeredGuide is the n = 0 mode set of one family of a radially layered
// (circular or coaxial) waveguide at one frequency.
//
// In layer i (relative permittivity eps_i, mu_r = 1) the field function
// u(r) (E_phi for TE0, H_phi for TM0) satisfies Bessel's equation of order 1
// with kc_i^2 = k0^2 eps_i - beta^2, so it is a J1/Y1 combination where
// kc_i^2 > 0 and an I1/K1 combination where kc_i^2 < 0 (the field decays
// or grows radially, as outside a guiding rod). Continuity of the
// tangential fields at each layer radius (derived from Maxwell's curl
// equations for fields independent of phi):
//
//	TE0: E_phi = u and H_z ~ W = (1/r) d(r u)/dr continuous;
//	TM0: H_phi = u and E_z ~ W/eps continuous.
//
// Wall: TE0 u(a) = 0, TM0 W(a) = 0; an inner conductor gives the same.
// Writing y = r u, both are Sturm-Liouville problems in -beta^2 (derived):
// TE0 -(y'/r)' - k0^2 eps y/r = -beta^2 y/r with y = 0 at the wall; TM0
// -(y'/(eps r))' - k0^2 y/r = -beta^2 y/(eps r) with y' = 0 there. So the
// modes are orthogonal with weight 1 (TE0, int u_m u_n r dr) and 1/eps
// (TM0, int u_m u_n / eps r dr), beta_m^2 are simple and increase with
// frequency (Hellmann-Feynman: d beta^2/d k0^2 = int eps u^2 / int u^2 for
// TE0 and int u^2 / int u^2/eps for TM0), and the number of modes with
// beta_m^2 > beta^2 is, by Sturm's oscillation theorem with the Pruefer
// angle (Coddington and Levinson, Theory of Ordinary Differential
// Equations, 1955, ch. 8), the number of zeros of the solution regular at
// the axis (or satisfying the inner-conductor condition) in the open
// interval, plus for TM0 one when u W < 0 at the wall. Counted exactly: in a
// J/Y layer from the Bessel phase (J1 = M cos theta, Y1 = M sin theta,
// DLMF 10.18.3) and in an I/K layer, where a solution has at most one zero,
// from the signs at its ends.
//
// The modes are normalised so that int e_m h_n dS = delta_mn with e = h =
// c u (TE0) and h = c u, e = c u / eps (TM0; derived): the modal
// admittances are then beta/(omega mu0) and omega eps0/beta, the forms of
// lineSusceptance with eps = mu = 1.
type layeredGuide struct {
	fam          cavity.Family
	inner, outer float64
	radii, eps   []float64
	n            int     // modes kept
	onlyProp     bool    // find only the propagating modes (a section without junctions needs only its poles)
	k0           float64 // frequency of the cached modes (wavenumber, rad/m)
	modes        []lmode
}

// lmode is one mode: its beta^2 and its function on each layer.
type lmode struct {
	beta2  float64
	pieces []piece
}

// Kinds of radial function on a piece.
const (
	kindJY  = iota // a J1(k r) + b Y1(k r), p2 = k^2
	kindIK         // a I1(s r) + b K1(s r), p2 = -s^2
	kindPow        // a r + b / r, p2 = 0
)

// piece is a mode's function on lo < r < hi: f = a F1 + b F2 of the kind,
// and the transverse fields e = cE f, h = cH f.
type piece struct {
	lo, hi float64
	kind   int
	k, p2  float64 // k (or s) and the signed square kc^2
	a, b   float64
	cE, cH float64
}

// fg returns f(r) and G(r) = (1/r) d(r f)/dr (DLMF 10.6.2 and 10.29.2:
// (x Z1)' = x Z0 for J and Y, (x I1)' = x I0, (x K1)' = -x K0).
func (p piece) fg(r float64) (f, g float64) {
	if r == 0 { // on the axis (b = 0 there): J1, I1 and r vanish, J0 = I0 = 1
		if p.kind == kindPow {
			return 0, 2 * p.a
		}
		return 0, p.a * p.k
	}
	f1, g1, f2, g2 := basis(p.kind, p.k, r)
	return p.a*f1 + p.b*f2, p.a*g1 + p.b*g2
}

func basis(kind int, k, r float64) (f1, g1, f2, g2 float64) {
	switch kind {
	case kindJY:
		x := k * r
		return math.J1(x), k * math.J0(x), math.Y1(x), k * math.Y0(x)
	case kindIK:
		x := k * r
		return bessel.I1(x), k * bessel.I0(x), bessel.K1(x), -k * bessel.K0(x)
	}
	return r, 2, 1 / r, 0
}

// kindOf returns the kind, k and kc^2 of a layer reaching out to hi.
// Within powTol of kc^2 = 0 (relative to 1/hi^2) the power solutions stand
// in for the Bessel ones, an error of order powTol.
func kindOf(kc2, hi float64) (int, float64) {
	switch {
	case math.Abs(kc2)*hi*hi < powTol:
		return kindPow, 0
	case kc2 > 0:
		return kindJY, math.Sqrt(kc2)
	}
	return kindIK, math.Sqrt(-kc2)
}

const powTol = 1e-14

// newLayeredGuide returns the guide of section sec keeping count modes
// (computed at the first call of at).
func newLayeredGuide(fam cavity.Family, sec Section, count int) *layeredGuide {
	lg := &layeredGuide{fam: fam, inner: sec.InnerRadius, outer: sec.Radius, n: count, k0: -1}
	for _, l := range sec.Layers {
		lg.radii = append(lg.radii, l.Radius)
		lg.eps = append(lg.eps, l.Medium.Eps())
	}
	lg.radii[len(lg.radii)-1] = sec.Radius
	return lg
}

// shoot solves the layered radial equation for beta2 from the axis (or the
// inner conductor) to the wall. It returns the count of modes with
// beta_m^2 > beta2, the wall value whose sign change marks a mode (u for
// TE0, W for TM0; an entire function of beta2, derived: the start is
// normalised as u ~ r/2 at the axis), and, if keep, the pieces (cE = cH = 1).
func (lg *layeredGuide) shoot(k0, beta2 float64, keep bool) (count int, end float64, pieces []piece) {
	lo := lg.inner
	var u, w float64 // u and W = (1/r)(r u)' at lo
	if lo > 0 {
		if lg.fam == cavity.TE {
			u, w = 0, 1
		} else {
			u, w = 1, 0
		}
	}
	zeros := 0
	for i, hi := range lg.radii {
		kc2 := k0*k0*lg.eps[i] - beta2
		kind, k := kindOf(kc2, hi)
		if i > 0 && lg.fam == cavity.TM {
			w *= lg.eps[i] / lg.eps[i-1] // W/eps is continuous
		}
		var a, b float64
		if lo == 0 {
			b = 0
			switch kind {
			case kindJY, kindIK:
				a = 1 / k
			default:
				a = 0.5
			}
		}
		var f1lo, f2lo float64
		if lo > 0 {
			var g1, g2 float64
			f1lo, g1, f2lo, g2 = basis(kind, k, lo)
			det := f1lo*g2 - f2lo*g1
			a = (u*g2 - f2lo*w) / det
			b = (f1lo*w - g1*u) / det
		}
		f1, g1, f2, g2 := basis(kind, k, hi)
		un, wn := a*f1+b*f2, a*g1+b*g2
		switch kind {
		case kindJY:
			alpha := math.Atan2(b, a)
			var c1 float64
			if lo == 0 {
				c1 = (-math.Pi/2 - alpha - math.Pi/2) / math.Pi
			} else {
				c1 = (besselPhase(k*lo, f1lo, f2lo) - alpha - math.Pi/2) / math.Pi
				if u == 0 {
					c1 = math.Round(c1) // a zero at lo itself is not inside
				}
			}
			c2 := (besselPhase(k*hi, f1, f2) - alpha - math.Pi/2) / math.Pi
			zeros += int(math.Floor(c2) - math.Floor(c1))
		default:
			s0 := math.Copysign(1, a) // sign just off the axis
			if lo > 0 {
				s0 = u
				if u == 0 {
					s0 = w
				}
			}
			if un != 0 && math.Signbit(un) != math.Signbit(s0) {
				zeros++
			}
		}
		if keep {
			pieces = append(pieces, piece{lo: lo, hi: hi, kind: kind, k: k, p2: kc2, a: a, b: b, cE: 1, cH: 1})
		}
		lo, u, w = hi, un, wn
	}
	if lg.fam == cavity.TE {
		return zeros, u, pieces
	}
	if u*w < 0 {
		zeros++
	}
	return zeros, w, pieces
}

// besselPhase returns the continuous phase theta_1(x) of J1 + i Y1 (DLMF
// 10.18.3), from atan2 and the large-argument form x - 3 pi/4 (DLMF
// 10.18.18), which stays within pi/4 of it for every x > 0; j1 and y1 are
// J1(x) and Y1(x).
func besselPhase(x, j1, y1 float64) float64 {
	t := math.Atan2(y1, j1)
	return t + 2*math.Pi*math.Round((x-0.75*math.Pi-t)/(2*math.Pi))
}

// at computes the modes at free-space wavenumber k0 (cached).
func (lg *layeredGuide) at(k0 float64) {
	if k0 == lg.k0 {
		return
	}
	lg.k0 = k0
	emax, emin := 0.0, math.Inf(1)
	for _, e := range lg.eps {
		emax, emin = max(emax, e), min(emin, e)
	}
	w := lg.outer - lg.inner
	scale := k0*k0*emax + 1/(w*w)
	hi := k0 * k0 * emax * (1 + 1e-12)
	lo := min(k0*k0*emin, 0) - sq(float64(lg.n+1)*math.Pi/w)
	clo, _, _ := lg.shoot(k0, lo, false)
	for clo < lg.n {
		lo -= 4 * (scale + math.Abs(lo))
		clo, _, _ = lg.shoot(k0, lo, false)
	}
	chi, ehi, _ := lg.shoot(k0, hi, false)
	_, elo, _ := lg.shoot(k0, lo, false)
	lg.modes = lg.modes[:0]
	n := lg.n
	if lg.onlyProp {
		c0, _, _ := lg.shoot(k0, 0, false)
		lg.n = min(n, c0)
		defer func() { lg.n = n }()
	}
	lg.isolate(bpoint{lo, clo, elo}, bpoint{hi, chi, ehi}, scale)
	// isolate appends from high beta2 down; order by mode index.
	for i, m := range lg.modes {
		lg.modes[i] = lg.mode(m.beta2)
	}
}

// bpoint is one shot: beta2, the count above it and the wall value.
type bpoint struct {
	x   float64
	c   int
	end float64
}

// isolate appends every mode with index <= n in (lo.x, hi.x), highest
// beta2 first, by bisection on the count.
func (lg *layeredGuide) isolate(lo, hi bpoint, scale float64) {
	if hi.c >= lg.n || lo.c <= hi.c {
		return
	}
	if lo.c-hi.c == 1 {
		lg.modes = append(lg.modes, lmode{beta2: lg.refine(lo, hi, scale)})
		return
	}
	if hi.x-lo.x <= 1e-15*scale {
		for range min(lo.c, lg.n) - hi.c {
			lg.modes = append(lg.modes, lmode{beta2: 0.5 * (lo.x + hi.x)})
		}
		return
	}
	c, e, _ := lg.shoot(lg.k0, 0.5*(lo.x+hi.x), false)
	mid := bpoint{0.5 * (lo.x + hi.x), c, e}
	lg.isolate(mid, hi, scale)
	lg.isolate(lo, mid, scale)
}

// refine narrows a bracket holding one mode (lo.c = hi.c + 1) by illinois
// on the wall value; the count decides the side.
func (lg *layeredGuide) refine(lo, hi bpoint, scale float64) float64 {
	return illinois(lo.x, hi.x, lo.end, hi.end, 200,
		// Stop at a few units in the last place of beta^2 itself (for the
		// highest modes far below scale's reach).
		func(lo, hi float64) bool {
			return hi-lo <= max(2e-16*scale, 4e-16*max(math.Abs(lo), math.Abs(hi)))
		},
		func(x float64) (float64, bool) {
			c, e, _ := lg.shoot(lg.k0, x, false)
			return e, c >= lo.c
		})
}

// mode returns the normalised mode with the given beta2.
func (lg *layeredGuide) mode(beta2 float64) lmode {
	_, _, ps := lg.shoot(lg.k0, beta2, true)
	var n2 float64
	for i, p := range ps {
		v := pieceIntegral(p, p, p.lo, p.hi)
		if lg.fam == cavity.TM {
			v /= lg.eps[i]
		}
		n2 += 2 * math.Pi * v
	}
	c := 1 / math.Sqrt(n2)
	for i := range ps {
		ps[i].cE, ps[i].cH = c, c
		if lg.fam == cavity.TM {
			ps[i].cE = c / lg.eps[i]
		}
	}
	return lmode{beta2: beta2, pieces: ps}
}

// propagating returns the number of modes with beta^2 > 0 at k0.
func (lg *layeredGuide) propagating(k0 float64) int {
	c, _, _ := lg.shoot(k0, 0, false)
	return c
}

// homogeneousPieces returns mode m of a homogeneous guide as one piece.
func homogeneousPieces(g guide, m int) []piece {
	p := piece{lo: g.inner, hi: g.outer, cE: g.norm[m], cH: g.norm[m]}
	if g.tem && m == 0 {
		p.kind, p.a, p.b = kindPow, 0, 1
		return []piece{p}
	}
	p.kind, p.k, p.p2, p.a, p.b = kindJY, g.kc[m], g.kc[m]*g.kc[m], g.ca[m], g.cb[m]
	return []piece{p}
}

// pieceIntegral returns int_lo^hi r f(r) g(r) dr of two piece functions
// (without cE, cH), lo..hi inside both pieces. With kc^2 = p2 and q2 of f
// and g, (r (f g' - f' g))' = (p2 - q2) r f g for any solutions of Bessel's
// equation of order 1 (Lommel's integral, DLMF 10.22.5, in the form valid
// for modified functions too; derived), with f' = G - f/r so
// f g' - f' g = f G_g - G_f g. For equal functions ((r f')^2 + (p2 r^2 -
// 1) f^2)/(2 p2) (DLMF 10.22.5, second form). Near ties, and near p2 = 0,
// where these cancel, Gauss-Legendre quadrature (tested against both).
func pieceIntegral(f, g piece, lo, hi float64) float64 {
	same := f == g
	d := f.p2 - g.p2
	switch {
	case same && math.Abs(f.p2)*hi*hi >= 1e-2 && f.kind != kindPow:
		F := func(r float64) float64 {
			if r == 0 {
				return 0
			}
			u, w := f.fg(r)
			return (sq(r*w-u) + (f.p2*r*r-1)*u*u) / (2 * f.p2)
		}
		return F(hi) - F(lo)
	case !same && lommelOK(f, g, hi):
		F := func(r float64) float64 {
			if r == 0 {
				return 0
			}
			u, gu := f.fg(r)
			v, gv := g.fg(r)
			return r * (u*gv - gu*v) / d
		}
		return F(hi) - F(lo)
	}
	phase := (math.Sqrt(math.Abs(f.p2)) + math.Sqrt(math.Abs(g.p2))) * (hi - lo)
	n := min(20+int(0.5*phase), 600)
	x, wt := quad.GaussLegendre(n)
	half, mid := 0.5*(hi-lo), 0.5*(hi+lo)
	s := 0.0
	for i := range x {
		r := mid + half*x[i]
		u, _ := f.fg(r)
		v, _ := g.fg(r)
		s += wt[i] * r * u * v
	}
	return s * half
}

// overlap returns M[i][j] = 2 pi int h_w,i e_g,j r dr over g's
// cross-section (inner..outer of the aperture), for modes given as pieces:
// the breakpoints of both are merged and each interval is a pieceIntegral.
func overlap(w, g [][]piece, inner, outer float64) []float64 {
	nw, ng := len(w), len(g)
	m := make([]float64, nw*ng)
	if nw == 0 || ng == 0 {
		return m
	}
	// Breakpoints: the ends of every piece of the first mode of each side
	// (all modes of a side share them).
	pts := []float64{inner, outer}
	for _, side := range [][]piece{w[0], g[0]} {
		for _, p := range side {
			for _, r := range []float64{p.lo, p.hi} {
				if r > inner && r < outer {
					pts = append(pts, r)
				}
			}
		}
	}
	sortFloats(pts)
	find := func(ps []piece, r float64) piece {
		for _, p := range ps {
			if r >= p.lo && r <= p.hi {
				return p
			}
		}
		return ps[len(ps)-1]
	}
	for k := 0; k+1 < len(pts); k++ {
		lo, hi := pts[k], pts[k+1]
		if hi-lo <= 0 {
			continue
		}
		mid := 0.5 * (lo + hi)
		// Values at the interval's ends, once per mode, for Lommel's form.
		type ends struct {
			p                  piece
			flo, glo, fhi, ghi float64
		}
		at := func(ps []piece) ends {
			p := find(ps, mid)
			e := ends{p: p}
			if lo > 0 {
				e.flo, e.glo = p.fg(lo)
			}
			e.fhi, e.ghi = p.fg(hi)
			return e
		}
		gs := make([]ends, ng)
		for j := range g {
			gs[j] = at(g[j])
		}
		for i := range w {
			ew := at(w[i])
			pw := ew.p
			for j := range g {
				eg := gs[j]
				pg := eg.p
				var v float64
				if d := pw.p2 - pg.p2; lommelOK(pw, pg, hi) {
					v = (hi*(ew.fhi*eg.ghi-ew.ghi*eg.fhi) - lo*(ew.flo*eg.glo-ew.glo*eg.flo)) / d
				} else {
					v = pieceIntegral(pw, pg, lo, hi)
				}
				m[i*ng+j] += 2 * math.Pi * pw.cH * pg.cE * v
			}
		}
	}
	return m
}

func sortFloats(a []float64) {
	for i := 1; i < len(a); i++ {
		for j := i; j > 0 && a[j] < a[j-1]; j-- {
			a[j], a[j-1] = a[j-1], a[j]
		}
	}
}

// lommelOK reports whether Lommel's closed form for two different
// functions is well conditioned on an interval reaching out to hi (the
// difference of kc^2 not small against either, nor against 1/hi^2).
func lommelOK(f, g piece, hi float64) bool {
	if f == g {
		return false
	}
	d := math.Abs(f.p2 - g.p2)
	return d > 1e-3*max(math.Abs(f.p2), math.Abs(g.p2)) && d*hi*hi > 1e-2
}
