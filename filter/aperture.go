package filter

import (
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics"
)

// Small-aperture coupling of two cavities (Bethe's theory).
//
// A hole of radius r0 in a thin conducting wall, small against the
// wavelength, scatters like an electric dipole normal to the wall and a
// magnetic dipole in its plane, driven by the fields that the closed wall
// would carry at the hole (H. A. Bethe, "Theory of diffraction by small
// holes", Phys. Rev. 66 (1944) 163-182; R. E. Collin, Foundations for
// Microwave Engineering, 2nd ed., IEEE Press 2001, sec. 4.13; D. M. Pozar,
// Microwave Engineering, 4th ed., Wiley 2012, sec. 4.8):
//
//	p = eps alpha_e E_n n,   m = -alpha_m H_t,
//	alpha_e = 2 r0^3 / 3,    alpha_m = 4 r0^3 / 3   (circular hole),
//
// radiating on the far side in the presence of the closed wall, with the
// negatives on the near side. With two cavities on either side of the hole
// the dipoles are driven by the difference of the two sides' fields.
//
// Coupling coefficient (derived here, with the even/odd-mode definition of
// k of Hong & Lancaster 2001, sec. 8.2; Collin, Foundations, ch. 7, treats
// a cavity coupled to a waveguide through a small hole by the same dipole
// expansion; section numbers recalled from memory). Expanding each cavity's
// field in its own mode (the cavity is the closed wall the dipoles radiate
// against) gives, for a magnetic dipole m on the wall of a cavity whose mode
// field H_n is normalised to integral |H_n|^2 dV = 1,
//
//	h (k_n^2 - k^2) = k^2 m . H_n(r0),
//
// and for an electric dipole p, e (k_n^2 - k^2) = k^2 p . E_n(r0) / eps
// (derived from the mode-expansion projections of Maxwell's equations).
// For two mirror-image cavities the combination whose fields have equal
// H_t and E_n on both sides (a perfectly conducting symmetry plane) does
// not excite the hole and stays at the single-cavity frequency; the other
// (a magnetic symmetry plane) is shifted to
//
//	f_odd / f_0 = 1 - (mu alpha_m |H_t|^2 - eps alpha_e |E_n|^2) / (2 W) + O(k^2),
//
// which is also what the small-obstacle perturbation formula
// df/f = -(E* . p + mu H* . m)/(4 W) gives for the self-consistent dipoles
// 2 alpha_m H_t and -2 eps alpha_e E_n (the independent route of the tests).
// Hong & Lancaster's k = (f_e^2 - f_o^2)/(f_e^2 + f_o^2) is then, to first
// order,
//
//	k = (mu alpha_m H_t1 . H_t2 - eps alpha_e E_n1 E_n2) / (2 sqrt(W1 W2)),
//
// with peak field phasors at the hole and W = (1/4) integral (eps |E|^2 +
// mu |H|^2) dV the stored energy of each cavity. A positive k is
// magnetic (inductive) coupling, a negative one electric (capacitive); the
// two parts oppose each other where both fields reach the hole.
//
// Wall thickness. A hole in a wall of thickness t is a short circular
// waveguide below cutoff; the field that crosses it is attenuated by
// exp(-A alpha t), alpha = sqrt((x/r0)^2 - k^2), with x = j'_11 = 1.8412
// (TE11, lambda_c = 3.41 r0) for the magnetic and x = j_01 = 2.4048
// (TM01, lambda_c = 2.61 r0) for the electric dipole (the standard
// correction: S. B. Cohn, "Microwave coupling by large apertures", Proc.
// IRE 40 (1952) 696-699; Matthaei, Young & Jones 1964, sec. 5.10, whose
// far-below-cutoff value for the magnetic case is 32.0 dB per unit t/d;
// section and value recalled from memory). A is an empirical constant
// fitted to measurements (Cohn 1952; refined thickness corrections are
// given by N. A. McDonald, "Electric and magnetic coupling through small
// apertures in shield walls of any thickness", IEEE Trans. Microwave
// Theory Tech. 20 (1972) 689-695, which cylcav does not implement). cylcav
// uses A = 1, the plain attenuation of the hole's lowest mode, unless told
// otherwise (Hole.A): an empirical choice, so coupling through thick walls
// should be confirmed by a field solver or measurement. The hole is
// assumed filled with the cavity's fill.

// Bessel zeros of the lowest modes of a circular hole seen as a waveguide:
// j'_11 (TE11) and j_01 (TM01) (DLMF 10.21(i); values recalled from memory
// to 17 significant digits and checked in the tests against package
// physics/bessel to 1e-15).
const (
	holeTE11Root = 1.8411837813406593
	holeTM01Root = 2.4048255576957728
)

// Validity limits of Bethe's small-aperture theory as used here (common
// practice: the theory is the first term of an expansion in k r0, in the
// field variation over the hole, and in the coupling itself).
const (
	// MaxHoleRadiusPerWavelength is the largest r0/lambda (lambda in the
	// fill) accepted as "small": r0 <= lambda/10, k r0 <= 0.63.
	MaxHoleRadiusPerWavelength = 0.1
	// MinHoleEdgeDistance is the least distance from the hole centre to the
	// nearest edge of its wall (corner with the other wall), in hole radii:
	// the field must be the undisturbed plane-wall field over the hole.
	MinHoleEdgeDistance = 2.0
	// MaxHoleRadiusPerCurvature is the largest r0/a for a hole in the
	// curved side wall, which Bethe's theory treats as plane (the wall
	// departs from its tangent plane by r0^2/(2a) <= 0.1 r0 over the hole).
	MaxHoleRadiusPerCurvature = 0.2
	// MaxBetheCoupling is the largest |k| accepted from the first-order
	// theory; beyond it the hole perturbs the fields it is driven by.
	MaxBetheCoupling = 0.05
)

// MagneticPolarisability returns the magnetic polarisability alpha_m =
// 4 r0^3 / 3 (m^3) of a circular hole of radius r0 (m) in an infinitely
// thin plane conducting wall (Bethe 1944; Collin, Foundations for Microwave
// Engineering, 2nd ed., sec. 4.13; Pozar, Microwave Engineering, 4th ed.,
// sec. 4.8; section numbers recalled from memory). It is the first term of an expansion in k r0 and holds for
// r0 much smaller than the wavelength. It returns NaN for r0 < 0 or NaN.
func MagneticPolarisability(r0 float64) float64 {
	if !(r0 >= 0) {
		return math.NaN()
	}
	return 4 * r0 * r0 * r0 / 3 // Bethe 1944; Pozar 2012 sec. 4.8
}

// ElectricPolarisability returns the electric polarisability alpha_e =
// 2 r0^3 / 3 (m^3) of a circular hole of radius r0 (m) in an infinitely
// thin plane conducting wall (Bethe 1944; Collin, Foundations for Microwave
// Engineering, 2nd ed., sec. 4.13, where it carries a minus sign in a
// convention with P = -eps alpha_e E_n; Pozar, Microwave Engineering, 4th
// ed., sec. 4.8). Domain and accuracy as for MagneticPolarisability.
func ElectricPolarisability(r0 float64) float64 {
	if !(r0 >= 0) {
		return math.NaN()
	}
	return 2 * r0 * r0 * r0 / 3 // Bethe 1944; Pozar 2012 sec. 4.8
}

// thicknessFactor is exp(-a t sqrt((x/r0)^2 - k^2)) (Cohn 1952; MYJ 1964
// sec. 5.10), 1 when the hole is at or above cutoff (x/r0 <= k).
func thicknessFactor(x, r0, t, k, a float64) float64 {
	if t == 0 {
		return 1
	}
	kc := x / r0
	if kc <= k {
		return 1
	}
	return math.Exp(-a * t * math.Sqrt((kc-k)*(kc+k)))
}

func checkThickness(r0, t, lambda, a float64) error {
	switch {
	case !(r0 > 0) || math.IsInf(r0, 0):
		return fmt.Errorf("filter: hole radius must be > 0 m and finite, got %g m", r0)
	case !(t >= 0) || math.IsInf(t, 0):
		return fmt.Errorf("filter: wall thickness must be >= 0 m and finite, got %g m", t)
	case !(lambda > 0):
		return fmt.Errorf("filter: wavelength must be > 0 m, got %g m", lambda)
	case !(a > 0) || math.IsInf(a, 0):
		return fmt.Errorf("filter: thickness constant A must be > 0 and finite, got %g", a)
	}
	return nil
}

// MagneticThicknessFactor returns the factor by which a wall of thickness t
// (m) reduces the magnetic coupling through a circular hole of radius r0
// (m) at wavelength lambda (m, in the medium filling the hole):
//
//	exp(-a t sqrt((j'_11/r0)^2 - (2 pi/lambda)^2)),
//
// the attenuation of the hole's TE11 mode (cutoff wavelength 3.41 r0) over
// the length t (Cohn 1952; Matthaei, Young & Jones 1964, sec. 5.10); a is
// the empirical constant of the correction, 1 in the plain form (see the
// package notes on Hole.A). It is 1 at t = 0 and for a hole at or above
// cutoff (r0 >= 0.293 lambda), where the correction no longer applies.
// Errors: r0 not > 0, t < 0, lambda not > 0, a not > 0.
func MagneticThicknessFactor(r0, t, lambda, a float64) (float64, error) {
	if err := checkThickness(r0, t, lambda, a); err != nil {
		return 0, err
	}
	return thicknessFactor(holeTE11Root, r0, t, 2*math.Pi/lambda, a), nil
}

// ElectricThicknessFactor is MagneticThicknessFactor for the electric
// coupling, attenuated by the hole's TM01 mode (x = j_01 = 2.4048, cutoff
// wavelength 2.61 r0).
func ElectricThicknessFactor(r0, t, lambda, a float64) (float64, error) {
	if err := checkThickness(r0, t, lambda, a); err != nil {
		return 0, err
	}
	return thicknessFactor(holeTM01Root, r0, t, 2*math.Pi/lambda, a), nil
}

// Wall selects the common wall an inter-cavity hole pierces.
type Wall uint8

const (
	// EndWall is a common end plate: the cavities are stacked on one axis
	// and the hole sits at radius Position*a on the plate between them. It
	// is the zero value.
	EndWall Wall = iota
	// SideWall is a common side wall: the cavities stand side by side with
	// parallel axes and the hole sits at height Position*L in the wall
	// between them (treated as plane; see MaxHoleRadiusPerCurvature).
	SideWall
)

// String returns "end wall" or "side wall".
func (w Wall) String() string {
	switch w {
	case EndWall:
		return "end wall"
	case SideWall:
		return "side wall"
	}
	return fmt.Sprintf("Wall(%d)", uint8(w))
}

// Hole is a circular coupling hole in the common wall of two cavities. The
// zero value of each optional field is its documented default.
type Hole struct {
	Wall Wall
	// Position places the hole centre on its wall as a fraction: rho/a on
	// an end wall (0 = on the axis), z/L on a side wall. Zero means "where
	// the thin-wall coupling per r0^3 is strongest" (found by
	// CouplingThrough and SizeHole, which report the value used; the middle
	// of the wall among equal maxima); set a small positive value such as
	// 1e-12 to ask for the axis itself.
	Position float64
	// Phi is the azimuth of the hole centre, rad, measured from the plane
	// of the cos(n phi) polarisation (see cavity.ModeField); it matters
	// only for modes with n >= 1.
	Phi float64
	// Radius is the hole radius r0, m (ignored by SizeHole, which finds it).
	Radius float64
	// Thickness is the wall thickness t at the hole, m; zero is the thin
	// wall of Bethe's theory.
	Thickness float64
	// A is the empirical constant of the thickness correction; zero means 1
	// (HoleCoupling reports the value used).
	A float64
}

// HoleCoupling is the coupling of two cavities through one Hole.
type HoleCoupling struct {
	Hole // as used: Position resolved when it was zero

	// K is the coupling coefficient Magnetic + Electric, > 0 when the
	// magnetic part dominates.
	K float64
	// Magnetic (>= 0) and Electric (<= 0) are the two parts of K, each with
	// its thickness factor applied.
	Magnetic, Electric float64
	// MagneticFactor and ElectricFactor are the thickness factors (1 for a
	// thin wall).
	MagneticFactor, ElectricFactor float64
	// Wavelength is the wavelength in the fill at the geometric mean of
	// the two cavities' frequencies, m.
	Wavelength float64
	// Problems lists, for people, every validity limit of Bethe's theory
	// the hole breaks (empty when it lies inside all of them).
	Problems []string
}

// Valid reports whether the hole lies inside every validity limit.
func (h HoleCoupling) Valid() bool { return len(h.Problems) == 0 }

// wallFields holds the fields of one cavity's mode at a point of a wall,
// for a stored energy of 1 J: the tangential magnetic field (two
// components) and the normal electric field.
type wallFields struct {
	ht   [2]float64
	en   float64
	mu   float64
	eps  float64
	freq float64
}

// holeSide evaluates the mode field of c at the hole position pos on wall w.
func holeSide(mf cavity.ModeField, c cavity.Cavity, w Wall, pos, phi float64) wallFields {
	var wf wallFields
	wf.mu, wf.eps, wf.freq = mf.Mu(), mf.Eps(), mf.Omega()/(2*math.Pi)
	if w == EndWall {
		f := mf.At(cavity.Point{Rho: pos * c.Radius, Phi: phi, Z: 0})
		wf.ht = [2]float64{f.H.Rho, f.H.Phi}
		wf.en = f.E.Z
		return wf
	}
	f := mf.At(cavity.Point{Rho: c.Radius, Phi: phi, Z: pos * c.Length})
	wf.ht = [2]float64{f.H.Phi, f.H.Z}
	wf.en = f.E.Rho
	return wf
}

// holeGeometry is the per-r0^3 coupling of a hole position: the magnetic
// and electric coefficients (k = gm r0^3 Tm - ge r0^3 Te), derived above.
type holeGeometry struct {
	gm, ge float64
}

func holeCoefficients(s1, s2 wallFields) holeGeometry {
	// k = (mu alpha_m H_t1.H_t2 - eps alpha_e E_n1 E_n2) / (2 sqrt(W1 W2)),
	// W1 = W2 = 1 J (derived above; Bethe 1944 polarisabilities).
	ht := s1.ht[0]*s2.ht[0] + s1.ht[1]*s2.ht[1]
	mu := math.Sqrt(s1.mu * s2.mu)
	eps := math.Sqrt(s1.eps * s2.eps)
	return holeGeometry{gm: mu * (4.0 / 3) * ht / 2, ge: eps * (2.0 / 3) * s1.en * s2.en / 2}
}

// holePair is the validated pair of cavities and the mode, with their
// field evaluators.
type holePair struct {
	c1, c2   cavity.Cavity
	m        cavity.Mode
	f1, f2   cavity.ModeField
	k        float64      // wavenumber in the fill at the mean frequency, rad/m
	lambda   float64      // wavelength in the fill, m
	position float64      // resolved hole position
	coef     holeGeometry // coupling per r0^3 at the resolved position
}

func newHolePair(c1, c2 cavity.Cavity, m cavity.Mode, h Hole) (*holePair, error) {
	f1, err := c1.ModeField(m)
	if err != nil {
		return nil, err
	}
	f2, err := c2.ModeField(m)
	if err != nil {
		return nil, err
	}
	if f1.Eps() != f2.Eps() || f1.Mu() != f2.Mu() {
		return nil, fmt.Errorf("filter: coupled cavities must share their fill, got eps_r = %g, %g and mu_r = %g, %g",
			f1.Eps()/physics.VacuumPermittivity, f2.Eps()/physics.VacuumPermittivity, f1.Mu()/physics.VacuumPermeability, f2.Mu()/physics.VacuumPermeability)
	}
	switch {
	case h.Wall != EndWall && h.Wall != SideWall:
		return nil, fmt.Errorf("filter: unknown hole wall %d; use EndWall or SideWall", uint8(h.Wall))
	case !(h.Position >= 0 && h.Position < 1):
		return nil, fmt.Errorf("filter: hole position must be in [0, 1) (rho/a on an end wall, z/L on a side wall; 0 = strongest coupling), got %g", h.Position)
	case math.IsNaN(h.Phi) || math.IsInf(h.Phi, 0):
		return nil, fmt.Errorf("filter: hole azimuth must be finite, got %g rad", h.Phi)
	case !(h.Thickness >= 0) || math.IsInf(h.Thickness, 0):
		return nil, fmt.Errorf("filter: wall thickness must be >= 0 m and finite, got %g m", h.Thickness)
	case !(h.A >= 0) || math.IsInf(h.A, 0):
		return nil, fmt.Errorf("filter: thickness constant A must be >= 0 (0 means 1) and finite, got %g", h.A)
	}
	p := &holePair{c1: c1, c2: c2, m: m, f1: f1, f2: f2}
	f := math.Sqrt(f1.Omega() * f2.Omega() / (4 * math.Pi * math.Pi))
	p.lambda = physics.SpeedOfLight / (f * c1.Fill.Index())
	p.k = 2 * math.Pi / p.lambda
	p.position = h.Position
	if p.position == 0 {
		p.position = p.strongest(h)
	}
	p.coef = p.coefficients(h.Wall, p.position, h.Phi)
	return p, nil
}

func (p *holePair) coefficients(w Wall, pos, phi float64) holeGeometry {
	return holeCoefficients(holeSide(p.f1, p.c1, w, pos, phi), holeSide(p.f2, p.c2, w, pos, phi))
}

// holeGridPoints is the number of grid points of the search for the
// strongest coupling position; the best grid point is refined by golden
// section to 1e-10.
const holeGridPoints = 400

// holeAxisPosition stands for the axis of an end wall (Position 0 means
// "strongest"); the field there equals the axis field to rounding.
const holeAxisPosition = 1e-12

// strongest returns the position in [0, 1) that maximises |k|/r0^3 of a
// thin-wall hole; among equal maxima (within 1e-9 relative, e.g. a
// field independent of z) the one nearest the middle of the wall.
func (p *holePair) strongest(h Hole) float64 {
	g := func(x float64) float64 {
		c := p.coefficients(h.Wall, x, h.Phi)
		return math.Abs(c.gm - c.ge)
	}
	vals := make([]float64, holeGridPoints)
	best := 0.0
	for i := range vals {
		vals[i] = g(float64(i) / holeGridPoints)
		best = math.Max(best, vals[i])
	}
	bestX := 0.0
	for i, v := range vals {
		x := float64(i) / holeGridPoints
		if v >= best*(1-1e-9) && math.Abs(x-0.5) < math.Abs(bestX-0.5) {
			bestX = x
		}
	}
	// Golden-section refinement over the neighbouring grid cells; the grid
	// point is kept when the refinement finds nothing better (a plateau).
	lo := math.Max(0, bestX-1.0/holeGridPoints)
	hi := math.Min(1-1e-12, bestX+1.0/holeGridPoints)
	const invPhi = 0.6180339887498949 // (sqrt 5 - 1)/2
	a, b := hi-invPhi*(hi-lo), lo+invPhi*(hi-lo)
	ga, gb := g(a), g(b)
	for hi-lo > 1e-10 {
		if ga > gb {
			hi, b, gb = b, a, ga
			a = hi - invPhi*(hi-lo)
			ga = g(a)
		} else {
			lo, a, ga = a, b, gb
			b = lo + invPhi*(hi-lo)
			gb = g(b)
		}
	}
	x := 0.5 * (lo + hi)
	if g(bestX) >= g(x) {
		x = bestX
	}
	if x <= 0 {
		// The axis: Position 0 means "strongest", so report a tiny
		// positive position, which evaluates the axis field.
		x = holeAxisPosition
	}
	return x
}

// couple evaluates the coupling of a hole of radius r0 at the resolved
// position.
func (p *holePair) couple(h Hole, r0 float64) HoleCoupling {
	h.Position = p.position
	h.Radius = r0
	a := h.A
	if a == 0 {
		a = 1
	}
	h.A = a
	hc := HoleCoupling{Hole: h, Wavelength: p.lambda}
	hc.K, hc.Magnetic, hc.Electric, hc.MagneticFactor, hc.ElectricFactor = p.k3(r0, h.Thickness, a)
	hc.Problems = p.problems(hc)
	return hc
}

// k3 returns the coupling of a hole of radius r0 in a wall of thickness t
// with thickness constant a at the resolved position: the total, its
// magnetic and electric parts and their thickness factors.
func (p *holePair) k3(r0, t, a float64) (k, mag, el, tm, te float64) {
	r3 := r0 * r0 * r0
	tm = thicknessFactor(holeTE11Root, r0, t, p.k, a)
	te = thicknessFactor(holeTM01Root, r0, t, p.k, a)
	mag, el = p.coef.gm*r3*tm, -p.coef.ge*r3*te
	return mag + el, mag, el, tm, te
}

// problems lists the validity limits hc breaks.
func (p *holePair) problems(hc HoleCoupling) []string {
	var out []string
	r0 := hc.Radius
	rs := func(v float64) string { return physics.FormatLength(v, 3) }
	if r := r0 / p.lambda; r > MaxHoleRadiusPerWavelength {
		out = append(out, fmt.Sprintf("hole radius %s is not small against the %s wavelength (r0/lambda = %.3g > %g)", rs(r0), rs(p.lambda), r, MaxHoleRadiusPerWavelength))
	}
	if cut := holeTE11Root / p.k; r0 >= cut {
		out = append(out, fmt.Sprintf("hole radius %s is above the cutoff radius %s of its TE11 mode: the hole propagates", rs(r0), rs(cut)))
	}
	// Distance from the hole centre to the nearest edge of its wall, in
	// the smaller of the two cavities.
	var edge float64
	if hc.Wall == EndWall {
		edge = (1 - hc.Position) * math.Min(p.c1.Radius, p.c2.Radius)
	} else {
		l := math.Min(p.c1.Length, p.c2.Length)
		edge = math.Min(hc.Position, 1-hc.Position) * l
		a := math.Min(p.c1.Radius, p.c2.Radius)
		if r := r0 / a; r > MaxHoleRadiusPerCurvature {
			out = append(out, fmt.Sprintf("hole radius %s is not small against the %s radius of the curved side wall (r0/a = %.3g > %g)", rs(r0), rs(a), r, MaxHoleRadiusPerCurvature))
		}
	}
	if edge < MinHoleEdgeDistance*r0 {
		out = append(out, fmt.Sprintf("hole centre is %s from the edge of the %s, less than %g hole radii (%s)", rs(edge), hc.Wall, MinHoleEdgeDistance, rs(MinHoleEdgeDistance*r0)))
	}
	if math.Abs(hc.K) > MaxBetheCoupling {
		out = append(out, fmt.Sprintf("coupling |k| = %.3g is above %g, beyond the first-order theory", math.Abs(hc.K), MaxBetheCoupling))
	}
	return out
}

// CouplingThrough returns the coupling coefficient of mode m between
// cavities c1 and c2 through the circular hole h (radius h.Radius > 0) in
// their common wall, from Bethe's small-aperture theory (Bethe 1944):
//
//	k = (mu alpha_m H_t1 . H_t2 T_m - eps alpha_e E_n1 E_n2 T_e) / (2 sqrt(W1 W2))
//
// with alpha_m = 4 r0^3/3, alpha_e = 2 r0^3/3, the fields of each cavity's
// mode (cavity.ModeField, stored energy W = 1 J) at the hole, and the
// thickness factors T_m, T_e (MagneticThicknessFactor,
// ElectricThicknessFactor); the derivation is in the notes at the top of
// this file (derived; checked in the tests against a closed form and an
// even/odd-mode perturbation with numerically integrated stored energy).
// The two cavities are taken as mirror images in the common wall; for
// slightly different cavities (an asymmetric filter) the product form is
// the first-order generalisation (derived). Positive k is magnetic.
//
// The result is exact within the theory for an infinitely thin wall; the
// theory itself is first order in k r0, the field variation over the hole
// and k; the validity limits broken are listed in HoleCoupling.Problems
// rather than returned as errors. Errors: invalid cavities or mode,
// different fills, a hole radius not > 0, or a hole field out of range.
func CouplingThrough(c1, c2 cavity.Cavity, m cavity.Mode, h Hole) (HoleCoupling, error) {
	if !(h.Radius > 0) || math.IsInf(h.Radius, 0) {
		return HoleCoupling{}, fmt.Errorf("filter: hole radius must be > 0 m and finite, got %g m", h.Radius)
	}
	p, err := newHolePair(c1, c2, m, h)
	if err != nil {
		return HoleCoupling{}, err
	}
	return p.couple(h, h.Radius), nil
}

// holeScanPoints is the number of log-spaced radii scanned by SizeHole to
// bracket the first radius that reaches the wanted coupling.
const holeScanPoints = 256

// noFieldTol is the coupling per r0^3 at a position, relative to the
// strongest on the same wall, below which SizeHole reports that the mode
// puts no field there (rounding leaves about 1e-16 at a field null).
const noFieldTol = 1e-9

// SizeHole returns the hole radius r0 that realises the coupling
// coefficient |k| between cavities c1 and c2 for mode m through a hole
// placed as h (h.Radius is ignored), with the coupling it gives (see
// CouplingThrough).
//
// Method: |k(r0)| is scanned on holeScanPoints log-spaced radii from 1e-4
// to 1 times the cutoff radius j'_11/k of the hole's TE11 mode (a hole
// any larger propagates); the first bracket where |k| reaches the target
// is refined by bisection to 1e-12 relative. For a purely magnetic or
// purely electric hole |k(r0)| = g r0^3 T(r0) rises monotonically, so the
// root is unique; where both parts reach the hole the smallest radius is
// returned. Only the magnitude is matched: the sign of k (magnetic or
// electric) is reported in the result.
//
// Errors: invalid input as for CouplingThrough, k not finite or zero, a
// position where the mode puts no field on the wall, or a k that no hole
// below cutoff reaches (the message gives the largest k reachable); a
// field solver must realise such a coupling. A result outside Bethe's
// validity limits is not an error: see HoleCoupling.Problems.
func SizeHole(c1, c2 cavity.Cavity, m cavity.Mode, h Hole, k float64) (HoleCoupling, error) {
	if !(k != 0) || math.IsInf(k, 0) {
		return HoleCoupling{}, fmt.Errorf("filter: coupling to realise must be finite and nonzero, got %g", k)
	}
	p, err := newHolePair(c1, c2, m, h)
	if err != nil {
		return HoleCoupling{}, err
	}
	target := math.Abs(k)
	rc := holeTE11Root / p.k
	a := h.A
	if a == 0 {
		a = 1
	}
	kabs := func(r float64) float64 {
		k, _, _, _, _ := p.k3(r, h.Thickness, a)
		return math.Abs(k)
	}
	lo := rc * 1e-4
	if kabs(lo) >= target {
		// Extremely small radius still enough: solve the r0^3 law
		// directly (the thickness factor is then e^-(a t x/r0), which
		// only makes the radius larger; bisect from zero).
		lo = 0
	}
	prev := lo
	hi := math.NaN()
	best, bestR := 0.0, 0.0
	for i := 1; i <= holeScanPoints; i++ {
		r := rc * math.Pow(1e-4, 1-float64(i)/holeScanPoints)
		if i == holeScanPoints {
			r = rc * (1 - 1e-12)
		}
		v := kabs(r)
		if v > best {
			best, bestR = v, r
		}
		if v >= target {
			hi = r
			break
		}
		prev = r
	}
	if math.IsNaN(hi) {
		here := p.coef
		top := p.coefficients(h.Wall, p.strongest(h), h.Phi)
		if math.Abs(here.gm-here.ge) <= noFieldTol*math.Abs(top.gm-top.ge) {
			return HoleCoupling{}, fmt.Errorf("filter: %s puts no field on the %s at position %.4g; no hole there couples it (try position 0, the strongest)", m, h.Wall, p.position)
		}
		return HoleCoupling{}, fmt.Errorf("filter: no hole below cutoff on the %s at position %.4g realises k = %.4g for %s (the largest is %.3g at radius %s); realise it with a field solver",
			h.Wall, p.position, k, m, best, physics.FormatLength(bestR, 3))
	}
	lo = prev
	for i := 0; i < 200 && hi-lo > 1e-12*hi; i++ {
		mid := 0.5 * (lo + hi)
		if kabs(mid) >= target {
			hi = mid
		} else {
			lo = mid
		}
	}
	return p.couple(h, hi), nil
}
