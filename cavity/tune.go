package cavity

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"cylcav/physics/quad"
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
// Errors: invalid cavity radius, fill or mode, a uniaxial fill (the
// chart lines hold for isotropic fills only), a mode an end plate does
// not tune (p = 0; see EndPlateTuning), lengths outside
// MinSize..MaxSize or lMin > lMax, D/L outside MinDesignRatio..MaxDesignRatio
// anywhere on the range, more than MaxChartModes modes near the wanted one,
// steps outside 1..MaxTuneSteps.
func (c Cavity) Tune(w Mode, lMin, lMax float64, steps int, countDegenerate bool) (TuningCurve, error) {
	c.Length = lMin
	if err := c.Validate(); err != nil {
		return TuningCurve{}, err
	}
	if err := c.Fill.RequireIsotropic("cavity: the tuning curve (its clearance is read from the mode chart)"); err != nil {
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

// Pattern is one field pattern of a mode. A mode with n >= 1 has two,
// polarised as cos(n phi) and sin(n phi) in Ez (TM) or Hz (TE), with the
// same frequency; a mode with n = 0 has one (Sin false).
type Pattern struct {
	Mode Mode
	Sin  bool
}

// String returns "TE011", "TM111 cos" or "TM111 sin".
func (p Pattern) String() string {
	switch {
	case p.Mode.N == 0:
		return p.Mode.String()
	case p.Sin:
		return p.Mode.String() + " sin"
	}
	return p.Mode.String() + " cos"
}

// Contact says where a small metal object touches the cavity.
type Contact uint8

// The contacts of a sphere: free inside, a hemisphere on one wall, a
// quarter sphere in the corner between the side wall and an end plate.
const (
	Free Contact = iota
	OnWall
	InCorner
)

// String returns "free sphere", "hemisphere on a wall" or "quarter sphere
// in a corner".
func (c Contact) String() string {
	switch c {
	case Free:
		return "free sphere"
	case OnWall:
		return "hemisphere on a wall"
	case InCorner:
		return "quarter sphere in a corner"
	}
	return fmt.Sprintf("Contact(%d)", uint8(c))
}

// Dominant returns the pattern with the largest weight in the perturbed
// resonance k (its largest eigenvector component).
func (p Perturbation) Dominant(k int) Pattern {
	best := 0
	for i, x := range p.Vectors[k] {
		if math.Abs(x) > math.Abs(p.Vectors[k][best]) {
			best = i
		}
	}
	return p.Patterns[best]
}

// Perturbation is the frequency shift of a small metal object: the
// eigen-shifts of the degenerate set of field patterns at the wanted
// frequency.
type Perturbation struct {
	// Patterns is the degenerate set: every field pattern of the cavity at
	// the wanted mode's frequency (to 1e-12 relative). One pattern for a
	// TM0mp mode; two (cos and sin) for n >= 1; three for TE0mp with its
	// companion TM1mp; more where other modes coincide by accident.
	Patterns []Pattern
	// Relative holds the eigen-shifts Delta f / f of the set, ascending,
	// and Shift the same in Hz. The object splits the set into these
	// frequencies; for a free sphere or one on a wall they do not depend on
	// the azimuth of the object in a round cavity (rotation symmetry).
	Relative, Shift []float64
	// Vectors[k] is the unit eigenvector of Relative[k]: the weights of
	// Patterns in the perturbed resonance (the sign is arbitrary).
	Vectors [][]float64
	// RadiusOverWavelength is r0 / lambda in the fill and
	// RadiusOverWallGap r0 / (distance from the centre to the nearest wall
	// not touched); both must be small for the formula to hold.
	RadiusOverWavelength, RadiusOverWallGap float64
	// Valid is true when r0 <= 0.05 lambda and r0 <= 0.2 times the gap,
	// the limits this package uses for "small" (first-order error then
	// below a few per cent; common practice).
	Valid bool
	// Contact says whether the object is a free sphere, a hemisphere on a
	// wall (a screw tip) or a quarter sphere in the corner.
	Contact Contact
}

// degenerateTol is the relative frequency difference below which two
// modes count as degenerate: the exact pairs are bit-equal, and 1e-12 is
// far below any splitting a physical object causes.
const degenerateTol = 1e-12

// SphereShift returns the frequency shifts of the degenerate set of mode m
// when a small perfectly conducting sphere of radius r0 is centred at p,
// from Slater's perturbation theorem (J. C. Slater, "Microwave
// electronics", Rev. Mod. Phys. 18, 441, 1946; L. C. Maier and J. C.
// Slater, "Field strength measurements in resonant cavities", J. Appl.
// Phys. 23, 68, 1952) with the quasi-static dipole moments of a conducting
// sphere (electric 4 pi eps r0^3 E, magnetic -2 pi r0^3 H), extended to a
// degenerate set by first-order degenerate perturbation theory (Harrington,
// Time-Harmonic Electromagnetic Fields, 1961, sec. 7.2; any text on
// degenerate perturbation theory): the shifts are the eigenvalues of
//
//	M_ij = -pi r0^3 (eps E_i . E_j - mu H_i . H_j / 2) / W,
//
// E_i, H_i the unperturbed peak fields at p of the patterns of the set,
// each normalised to the stored energy W (ModeField's convention, in which
// E and H of every pattern share one phase convention so M is real and
// symmetric). For one pattern this is Slater's formula. A point on one
// wall is a hemispherical boss there (a screw tip): by its image in the
// wall, a whole sphere in the wall field of which half lies in the cavity,
// so M is halved (derived). A point on the corner between the side wall
// and an end plate is a quarter sphere: images in both walls make a whole
// sphere, a quarter of it in the cavity, so M is quartered (derived; E
// vanishes there and only H, along the edge, remains).
//
// The eigenvalues come from the cyclic Jacobi method (Golub and Van Loan,
// Matrix Computations, 4th ed., sec. 8.5), exact to rounding for these
// small matrices.
//
// Validity: r0 much smaller than the wavelength and than the distance to
// every other wall, so that the field is uniform over the sphere and its
// images do not interact; see Perturbation.Valid. Errors: invalid input, a
// sphere that does not fit inside the cavity, or a degenerate set that
// cannot be listed (more than MaxModes modes below the wanted one).
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
	var out Perturbation
	factor := 1.0
	switch {
	case onSide && onEnd:
		out.Contact, factor = InCorner, 0.25
	case onSide || onEnd:
		out.Contact, factor = OnWall, 0.5
	}
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
	set, err := c.degenerateSet(m)
	if err != nil {
		return Perturbation{}, err
	}
	fields := make([]Field, len(set))
	for i, pt := range set {
		f, err := c.ModeField(pt.Mode)
		if err != nil {
			return Perturbation{}, err
		}
		q := p
		if pt.Sin {
			// sin(n phi) = cos(n (phi - pi/(2n))): the sin pattern is the
			// cos pattern turned by a quarter period in phi.
			q.Phi -= math.Pi / (2 * float64(pt.Mode.N))
		}
		fields[i] = f.At(q)
	}
	n := len(set)
	a := make([][]float64, n)
	for i := range a {
		a[i] = make([]float64, n)
		for j := range a[i] {
			ei, ej, hi, hj := fields[i].E, fields[j].E, fields[i].H, fields[j].H
			ee := ei.Rho*ej.Rho + ei.Phi*ej.Phi + ei.Z*ej.Z
			hh := hi.Rho*hj.Rho + hi.Phi*hj.Phi + hi.Z*hj.Z
			a[i][j] = -factor * math.Pi * r0 * r0 * r0 * (mf.eps*ee - mf.mu*hh/2) // W = 1 J
		}
	}
	vals, vecs := jacobiEigen(a)
	// An eigenvalue below rounding of the largest is zero (a pattern the
	// object does not see, such as the polarisation with a node there).
	scale := math.Max(math.Abs(vals[0]), math.Abs(vals[len(vals)-1]))
	for k, v := range vals {
		if math.Abs(v) <= 1e-13*scale {
			vals[k] = 0
		}
	}
	f := mf.omega / (2 * math.Pi)
	out.Patterns, out.Relative, out.Vectors = set, vals, vecs
	for _, v := range vals {
		out.Shift = append(out.Shift, v*f)
	}
	lambda := 2 * math.Pi / (mf.omega * math.Sqrt(mf.eps*mf.mu))
	out.RadiusOverWavelength, out.RadiusOverWallGap = r0/lambda, r0/gap
	out.Valid = out.RadiusOverWavelength <= 0.05 && out.RadiusOverWallGap <= 0.2
	return out, nil
}

// degenerateSet returns every field pattern of c at the frequency of m
// (within degenerateTol), m's own first.
func (c Cavity) degenerateSet(m Mode) ([]Pattern, error) {
	f := c.Frequency(m)
	res, err := c.Modes(f * (1 + degenerateTol))
	if err != nil {
		return nil, fmt.Errorf("cavity: listing the modes degenerate with %s: %w", m, err)
	}
	set := []Pattern{{Mode: m}}
	if m.N > 0 {
		set = append(set, Pattern{Mode: m, Sin: true})
	}
	for _, r := range res {
		if r.Mode == m || r.Frequency < f*(1-degenerateTol) {
			continue
		}
		set = append(set, Pattern{Mode: r.Mode})
		if r.Mode.N > 0 {
			set = append(set, Pattern{Mode: r.Mode, Sin: true})
		}
	}
	return set, nil
}

// jacobiEigen returns the eigenvalues of the symmetric matrix a, ascending,
// and the unit eigenvectors (vecs[k] belongs to vals[k]), by the cyclic
// Jacobi method (Golub and Van Loan, Matrix Computations, 4th ed., sec.
// 8.5.2-8.5.3, algorithms 8.5.1 and 8.5.2). Sweeps run until the
// off-diagonal part is below 1e-15 of the Frobenius norm (quadratic
// convergence: a handful of sweeps for n <= 8). a is overwritten.
func jacobiEigen(a [][]float64) (vals []float64, vecs [][]float64) {
	n := len(a)
	v := make([][]float64, n)
	for i := range v {
		v[i] = make([]float64, n)
		v[i][i] = 1
	}
	var norm float64
	for i := range a {
		for j := range a[i] {
			norm += a[i][j] * a[i][j]
		}
	}
	for range 100 {
		var off float64
		for i := range n {
			for j := i + 1; j < n; j++ {
				off += 2 * a[i][j] * a[i][j]
			}
		}
		if off <= 1e-30*norm || off == 0 {
			break
		}
		for p := range n {
			for q := p + 1; q < n; q++ {
				if a[p][q] == 0 {
					continue
				}
				// Symmetric Schur decomposition (Golub and Van Loan alg. 8.5.1).
				tau := (a[q][q] - a[p][p]) / (2 * a[p][q])
				t := 1 / (math.Abs(tau) + math.Sqrt(1+tau*tau))
				if tau < 0 {
					t = -t
				}
				cs := 1 / math.Sqrt(1+t*t)
				sn := t * cs
				for k := range n {
					akp, akq := a[k][p], a[k][q]
					a[k][p], a[k][q] = cs*akp-sn*akq, sn*akp+cs*akq
				}
				for k := range n {
					apk, aqk := a[p][k], a[q][k]
					a[p][k], a[q][k] = cs*apk-sn*aqk, sn*apk+cs*aqk
				}
				for k := range n {
					vkp, vkq := v[k][p], v[k][q]
					v[k][p], v[k][q] = cs*vkp-sn*vkq, sn*vkp+cs*vkq
				}
			}
		}
	}
	idx := make([]int, n)
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(x, y int) int { return cmpFloat(a[x][x], a[y][y]) })
	for _, k := range idx {
		vals = append(vals, a[k][k])
		vec := make([]float64, n)
		for i := range n {
			vec[i] = v[i][k]
		}
		vecs = append(vecs, vec)
	}
	return vals, vecs
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
	nodes, weights := quad.GaussLegendre(48)
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
