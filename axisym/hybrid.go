package axisym

import (
	"fmt"
	"math"
	"sort"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/physics/bessel"
)

// This file solves azimuthal order n >= 1 (hybrid: TE_n and TM_n coupled at
// every step) for closed bodies of homogeneous circular sections.
//
// # Modes of order n >= 1 of a circular guide of radius b
//
// One polarisation is kept (the other, rotated by pi/(2n), has the same
// frequencies). With the potentials
//
//	TE_nm: psi = J_n(kc r) cos(n phi), kc = j'_{n,m}/b, d psi/dr = 0 at r = b
//	TM_nm: chi = J_n(kc r) sin(n phi), kc = j_{n,m}/b,  chi = 0 at r = b
//
// the transverse electric fields are e_TE = N z x grad psi and e_TM = N
// grad chi (Marcuvitz, Waveguide Handbook, 1951, sec. 2.2 and 2.4, as
// recalled; Collin, Field Theory of Guided Waves, 2nd ed., ch. 5):
//
//	e_TE = N ( (n/r) J_n sin(n phi),  kc J_n' cos(n phi) )   (r, phi)
//	e_TM = N ( kc J_n' sin(n phi),    (n/r) J_n cos(n phi) )
//
// so both families have E_r ~ sin(n phi) and E_phi ~ cos(n phi): they are
// one symmetry class and couple wherever the cross-section changes. Green's
// first identity with the boundary conditions gives int |grad psi|^2 dS =
// kc^2 int psi^2 dS, and with int cos^2(n phi) dphi = pi (n >= 1) and
// DLMF 10.22.5 (Lommel) at the zeros,
//
//	TE: 1/N^2 = kc^2 pi b^2/2 (1 - n^2/x^2) J_n(x)^2,  x = j'_{n,m}
//	TM: 1/N^2 = kc^2 pi b^2/2 J_n'(x)^2,               x = j_{n,m}
//
// TE and TM modes of one guide are orthogonal: int (z x grad psi).grad chi
// dS is the circulation of psi grad chi around r = b (Stokes), and chi = 0
// there. (Derived; TestHybridCouplingQuadrature checks every case by
// quadrature.)
//
// # Coupling of a narrow guide (radius a) into a wide one (radius b >= a)
//
// M[i][j] = int over the narrow disc of e_wide,i . e_narrow,j dS (V_wide =
// M V_narrow; I_narrow = M^T I_wide: Wexler 1967). Derived with Green's
// first identity and Stokes' theorem on the disc r < a, L(p, q) = int_0^a
// J_n(p r) J_n(q r) r dr in Lommel's closed form (DLMF 10.22.5):
//
//	TE(wide) . TE(narrow): N N' kq^2 pi L(kw, kq)   (d psi_narrow/dr = 0 at a)
//	TM(wide) . TM(narrow): N N' kw^2 pi L(kw, kq)   (chi_narrow = 0 at a)
//	TE(wide) . TM(narrow): 0
//	TM(wide) . TE(narrow): N N' n pi J_n(kw a) J_n(kq a)
//
// The zero: e_TE(wide) = z x grad psi is divergence-free, so its product
// with grad chi_narrow integrates to the boundary term chi_narrow e.n,
// which vanishes. The last: (z x grad psi).grad chi = z.curl(psi grad
// chi), whose integral is the circulation of psi_narrow d chi_wide/dphi
// around r = a, n pi J_n(kq a) J_n(kw a). So a TE mode of the narrow guide
// excites TM modes of the wide one at a step, and a TM mode of the narrow
// guide excites no TE mode of the wide one: the known result that a TE11
// wave meeting a circular step excites TM1m modes of the larger guide
// (as recalled from the classic circular-step analyses, for example
// W. J. English, IEEE Trans. MTT-21 (1973) 633-636, in the Wexler
// formulation; the formulas here are derived, not copied). At a = b,
// J_n(kw b) = 0 for every TM mode of the wide guide, so the cross term
// vanishes: sections of equal radius do not couple TE and TM. The cross
// term matters: set to zero, it moves the lowest order-1 resonances of a
// stepped body by 2 to 6 %, and the finite-integration reference of
// TestHybridFD then disagrees; with it they agree to 2e-5.
//
// # Junction matrix and count
//
// The lines are those of n = 0 (lineSusceptance): Y0 = beta/(omega mu) for
// TE and omega eps/beta for TM, but now both families meet in one junction
// matrix, so they must carry one scale: both are multiplied by the free-
// space impedance eta0 (TE: b/k0, TM: b k0 with b from lineSusceptance).
// The matrix eta0 B(omega) is real symmetric for lossless lines and B
// increases with omega (Foster's reactance theorem for the lossless
// reciprocal network seen from the junction apertures); a positive scale
// leaves the inertia unchanged, so the Wittrick-Williams count J = J0 +
// pos(B) - offset holds for the combined system, J0 counting the poles of
// both families' lines (TE_nmp, p >= 1, and TM_nmp, p >= 0, of every
// section shorted at its ends). Near f = 0 the TE lines give a large
// negative block and the TM lines a small positive one, and the Schur
// complement of the TM block, B_MM - B_ME B_EE^-1 B_EM, stays positive, so
// pos(B) -> number of TM unknowns: that is the offset (derived; checked
// against an evaluation near zero by TestHybridOffset and by brute force
// in TestHybridNoneMissed).

// hybridGuide holds the modes of order n kept for a circular guide of
// radius b: TE first (kc = j'_{n,m}/b), then TM (kc = j_{n,m}/b).
type hybridGuide struct {
	n      int
	radius float64
	kc     []float64
	te     int // modes 0..te-1 are TE, the rest TM
	norm   []float64
}

func newHybridGuide(n int, radius float64, nte, ntm int) hybridGuide {
	g := hybridGuide{n: n, radius: radius, te: nte}
	for _, x := range bessel.JPrimeZeros(n, nte) {
		j := math.Jn(n, x)
		g.kc = append(g.kc, x/radius)
		g.norm = append(g.norm, 1/(x/radius*math.Sqrt(math.Pi*radius*radius/2*(1-float64(n*n)/(x*x)))*math.Abs(j)))
	}
	for _, x := range bessel.JZeros(n, ntm) {
		jp := besselJnPrime(n, x)
		g.kc = append(g.kc, x/radius)
		g.norm = append(g.norm, 1/(x/radius*math.Sqrt(math.Pi*radius*radius/2)*math.Abs(jp)))
	}
	return g
}

// besselJnPrime returns J_n'(x) = (J_{n-1}(x) - J_{n+1}(x))/2 (DLMF 10.6.1).
func besselJnPrime(n int, x float64) float64 {
	return 0.5 * (math.Jn(n-1, x) - math.Jn(n+1, x))
}

// lommelN returns int_0^a J_n(p r) J_n(q r) r dr in closed form (DLMF
// 10.22.5): a (q J_n(pa) J_n'(qa) - p J_n'(pa) J_n(qa)) / (p^2 - q^2), and
// for p = q (to lommelTie) a^2/2 (J_n'(pa)^2 + (1 - n^2/(pa)^2) J_n(pa)^2).
func lommelN(n int, p, q, a float64) float64 {
	if math.Abs(p-q) <= lommelTie*math.Max(p, q) {
		k := 0.5 * (p + q)
		x := k * a
		j, jp := math.Jn(n, x), besselJnPrime(n, x)
		return a * a / 2 * (jp*jp + (1-float64(n*n)/(x*x))*j*j)
	}
	jpA, jqA := math.Jn(n, p*a), math.Jn(n, q*a)
	return a * (q*jpA*besselJnPrime(n, q*a) - p*besselJnPrime(n, p*a)*jqA) / (p*p - q*q)
}

// hybridCoupling returns M (len(w.kc) x len(g.kc), row-major) for the
// narrow guide g inside the wide guide w (see the file comment). For equal
// radii it is the truncated identity of each family.
func hybridCoupling(w, g hybridGuide) []float64 {
	nw, ng := len(w.kc), len(g.kc)
	m := make([]float64, nw*ng)
	if w.radius == g.radius {
		for i := range min(w.te, g.te) {
			m[i*ng+i] = 1
		}
		for i := range min(nw-w.te, ng-g.te) {
			m[(w.te+i)*ng+g.te+i] = 1
		}
		return m
	}
	a, n := g.radius, g.n
	for i, kw := range w.kc {
		wTE := i < w.te
		for j, kq := range g.kc {
			gTE := j < g.te
			var v float64
			switch {
			case wTE && gTE:
				v = kq * kq * math.Pi * lommelN(n, kw, kq, a)
			case !wTE && !gTE:
				v = kw * kw * math.Pi * lommelN(n, kw, kq, a)
			case !wTE && gTE:
				v = float64(n) * math.Pi * math.Jn(n, kw*a) * math.Jn(n, kq*a)
			}
			m[i*ng+j] = w.norm[i] * g.norm[j] * v
		}
	}
	return m
}

// hybridSystem is the mode-matched model of a closed body of circular
// sections for one azimuthal order n >= 1, both families together. It
// reuses the junction bookkeeping, assembly and elimination of system.
type hybridSystem struct {
	sys    system // joins, ndof and offset; fam unused
	guides []hybridGuide
	lines  []lines
}

// hybridCounts returns the TE and TM mode counts of each section: modes in
// the widest section, proportionally fewer in narrower ones (the
// relative-convergence rule, as ModeCounts), each raised to the modes that
// propagate at fmax plus two. The propagation bound uses the largest
// refractive index of the body in every section, so that sections of one
// radius keep the same modes (their coupling is then the exact identity).
func hybridCounts(b Body, n int, fmax float64, modes int) (te, tm []int, err error) {
	rmax, idx := b.MaxRadius(), 1.0
	for _, s := range b.Sections {
		idx = max(idx, s.Fill.Index())
	}
	k := 2 * math.Pi * fmax / physics.SpeedOfLight * idx
	for i, s := range b.Sections {
		base := int(math.Ceil(float64(modes)*s.Radius/rmax - 1e-9))
		// j_{n,m} > (m - 1/4) pi and j'_{n,m} > (m - 1/2) pi for n >= 1
		// (McMahon, DLMF 10.21.19, and the interlacing j'_{n,m} > j_{n-1,m}),
		// so fewer than k a/pi + 2 zeros lie below k a.
		guess := int(k*s.Radius/math.Pi) + 3
		if guess > MaxModes {
			return nil, nil, limitErrorf("axisym: section %d propagates about %d modes at %s, more than the %d the solver keeps; lower the maximum frequency",
				i+1, guess, physics.FormatFrequency(fmax, 4), MaxModes)
		}
		jz, jpz := bessel.Zeros(n, guess)
		below := func(z []float64) int {
			c := 0
			for _, x := range z {
				if x/s.Radius < k {
					c++
				}
			}
			return c
		}
		nte, ntm := max(base, below(jpz)+2, 1), max(base, below(jz)+2, 1)
		if nte > MaxModes || ntm > MaxModes {
			return nil, nil, limitErrorf("axisym: section %d would need %d modes, more than %d; lower the mode count or the maximum frequency", i+1, max(nte, ntm), MaxModes)
		}
		te, tm = append(te, nte), append(tm, ntm)
	}
	return te, tm, nil
}

func newHybridSystem(b Body, n int, te, tm []int) *hybridSystem {
	h := &hybridSystem{}
	for i, sec := range b.Sections {
		g := newHybridGuide(n, sec.Radius, te[i], tm[i])
		h.guides = append(h.guides, g)
		h.lines = append(h.lines, lines{
			kc:     g.kc,
			eps:    sec.Fill.Eps(),
			mu:     sec.Fill.Mu(),
			length: sec.Length,
			b11:    make([]float64, len(g.kc)),
			b12:    make([]float64, len(g.kc)),
		})
	}
	s := &h.sys
	tmDof := 0
	for i := 0; i+1 < len(h.guides); i++ {
		gl, gr := h.guides[i], h.guides[i+1]
		j := join{off: s.ndof}
		// Circular sections: one cross-section always holds the other.
		if gl.radius < gr.radius || gl.radius == gr.radius && len(gl.kc) <= len(gr.kc) {
			j.n = len(gl.kc)
			j.right = hybridCoupling(gr, gl)
			tmDof += len(gl.kc) - gl.te
		} else {
			j.n = len(gr.kc)
			j.left = hybridCoupling(gl, gr)
			tmDof += len(gr.kc) - gr.te
		}
		s.ndof += j.n
		s.joins = append(s.joins, j)
	}
	s.offset = tmDof
	return h
}

// eval assembles eta0 B(f) into a and returns J0, the poles of all lines
// below f (see system.eval, of which this is the two-family form).
func (h *hybridSystem) eval(f float64, a []float64) (j0 int) {
	clear(a)
	s := &h.sys
	k0 := 2 * math.Pi * f / physics.SpeedOfLight
	for i := range h.lines {
		ln := &h.lines[i]
		k2 := k0 * k0 * ln.eps * ln.mu
		te := h.guides[i].te
		for m, kc := range ln.kc {
			fam, scale := cavity.TE, 1/k0
			if m >= te {
				fam, scale = cavity.TM, k0
			}
			b11, b12, poles := lineSusceptance(fam, k2-kc*kc, ln.length, ln.eps, ln.mu)
			ln.b11[m], ln.b12[m] = b11*scale, b12*scale
			j0 += poles
		}
		s.addLine(a, i, ln)
	}
	return j0
}

// count is the Wittrick-Williams count of the hybrid model below f and
// the last pivot (see system.count).
func (h *hybridSystem) count(f float64, a []float64) (int, float64) {
	j0 := h.eval(f, a)
	if h.sys.ndof == 0 {
		return j0, math.NaN()
	}
	pos, _, last := h.sys.inertia(a)
	return j0 + pos - h.sys.offset, last
}

// hybridSupported refuses, wrapping ErrNotImplemented, the bodies the
// n >= 1 solver does not model: open ends, coaxial and layered sections,
// and uniaxial fills.
func (b Body) hybridSupported(n int) error {
	why := ""
	switch {
	case b.Open():
		why = "open ends (semi-infinite pipes)"
	default:
		for i, s := range b.Sections {
			switch {
			case s.InnerRadius != 0:
				why = fmt.Sprintf("coaxial sections (section %d has an inner conductor)", i+1)
			case len(s.Layers) > 0:
				why = fmt.Sprintf("radially layered sections (section %d)", i+1)
			case s.Fill.Uniaxial():
				why = fmt.Sprintf("uniaxial fills (section %d)", i+1)
			}
			if why != "" {
				break
			}
		}
	}
	if why == "" {
		return nil
	}
	return fmt.Errorf("axisym: azimuthal order n = %d is solved for closed bodies of homogeneous circular sections only, not for %s: %w", n, why, ErrNotImplemented)
}

// hybridResonances returns the resonant frequencies of order n below fmax
// of the model with modes of each family in the widest section.
func hybridResonances(b Body, n int, fmax float64, modes int) ([]float64, error) {
	te, tm, err := hybridCounts(b, n, fmax, modes)
	if err != nil {
		return nil, err
	}
	return hybridResonancesWith(b, n, fmax, te, tm)
}

// hybridResonancesWith is hybridResonances with the TE and TM mode counts
// of every section given.
func hybridResonancesWith(b Body, n int, fmax float64, te, tm []int) ([]float64, error) {
	h := newHybridSystem(b, n, te, tm)
	a := make([]float64, h.sys.ndof*h.sys.ndof)
	sv := &solver{countFn: func(f float64) (int, float64) { return h.count(f, a) }}
	jmax, gmax := sv.count(fmax)
	if jmax > MaxResonances {
		return nil, limitErrorf("axisym: %d resonances of order n = %d below %s, more than %d; lower the maximum frequency", jmax, n, physics.FormatFrequency(fmax, 4), MaxResonances)
	}
	sv.isolate(point{0, 0, 0}, point{fmax, jmax, gmax})
	return sv.out, nil
}

// solveHybrid is Solve for r.Order >= 1 (see the file comment): every
// resonance of order n below r.MaxFrequency, with its convergence estimate
// (1.5 times the modes against the requested count) and its label, the
// TE_nmp or TM_nmp mode of the enclosing cylinder at the same place in
// the frequency order of order n (TE_n and TM_n are one symmetry class).
// Family is the family of that label. Losses and fields are not computed:
// with r.Losses each LossErr wraps ErrNotImplemented.
func solveHybrid(b Body, r Request, modes int) ([]Resonance, error) {
	if err := b.hybridSupported(r.Order); err != nil {
		return nil, err
	}
	if r.Families != nil {
		te, tm := false, false
		for _, f := range r.Families {
			te, tm = te || f == cavity.TE, tm || f == cavity.TM
		}
		if !te || !tm || len(r.Families) != 2 {
			return nil, fmt.Errorf("axisym: for azimuthal order n = %d TE and TM couple at every step and are solved together: leave Families nil", r.Order)
		}
	}
	coarse, err := hybridResonances(b, r.Order, r.MaxFrequency*(1+estimateMargin), modes)
	if err != nil {
		return nil, err
	}
	fine, err := hybridResonances(b, r.Order, r.MaxFrequency, (3*modes+1)/2)
	if err != nil {
		return nil, err
	}
	top := 0.0
	if len(fine) > 0 {
		top = fine[len(fine)-1]
	}
	origins, ties, err := hybridLabels(b.Enclosing(), r.Order, len(fine), top)
	if err != nil {
		return nil, err
	}
	out := make([]Resonance, len(fine))
	for i, f := range fine {
		change, cf := math.Inf(1), 0.0
		if i < len(coarse) {
			change, cf = math.Abs(f-coarse[i]), coarse[i]
		}
		out[i] = Resonance{Family: origins[i].Family, Index: i + 1, Frequency: f, Change: change, Coarse: cf,
			Origin: origins[i], OriginTied: ties[i], HasOrigin: true}
		if r.Losses {
			out[i].LossErr = fmt.Errorf("axisym: losses and fields of order n = %d: %w", r.Order, ErrNotImplemented)
		}
	}
	return out, nil
}

// hybridLabels returns the count lowest modes of order n (TE_nmp and
// TM_nmp together, in frequency order, TE before TM, then m, p at equal
// frequency, as package cavity lists them; frequencies from
// cavity.Cavity.Frequency) of the closed cylinder c, and whether another
// mode of order n shares each one's frequency (to 1e-12 relative). top is
// a first guess of the count-th frequency (the body's highest resonance);
// the bound grows until count modes lie below it.
func hybridLabels(c cavity.Cavity, n, count int, top float64) ([]cavity.Mode, []bool, error) {
	if count == 0 {
		return nil, nil, nil
	}
	type entry struct {
		m cavity.Mode
		f float64
	}
	var list []entry
	for bound := top * (1 + 1e-9); ; bound *= 1.5 {
		list = list[:0]
		k := 2 * math.Pi * bound / physics.SpeedOfLight * c.Fill.Index()
		guess := min(int(k*c.Radius/math.Pi)+3, cavity.MaxIndex)
		jz, jpz := bessel.Zeros(n, guess)
		for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
			zeros, p0 := jpz, 1
			if fam == cavity.TM {
				zeros, p0 = jz, 0
			}
			for mi, x := range zeros {
				if x/c.Radius > k {
					break
				}
				for p := p0; p <= cavity.MaxIndex; p++ {
					md := cavity.Mode{Family: fam, N: n, M: mi + 1, P: p}
					f := c.Frequency(md)
					if f > bound {
						break
					}
					list = append(list, entry{md, f})
				}
			}
		}
		if len(list) > count || guess >= cavity.MaxIndex || bound > 1e6*top {
			break
		}
	}
	if len(list) < count {
		return nil, nil, fmt.Errorf("axisym: labels: only %d modes of order %d in the enclosing cylinder within the index limits, need %d", len(list), n, count)
	}
	sort.SliceStable(list, func(i, j int) bool { return list[i].f < list[j].f })
	modes, ties := make([]cavity.Mode, count), make([]bool, count)
	for i := range count {
		modes[i] = list[i].m
		tie := func(j int) bool {
			return j >= 0 && j < len(list) && math.Abs(list[j].f-list[i].f) <= 1e-12*list[i].f
		}
		ties[i] = tie(i-1) || tie(i+1)
	}
	return modes, ties, nil
}

// ExtrapolateOrder is Extrapolate for azimuthal order n >= 1 (TE_n and TM_n
// together, hybrid.go): the resonances of order n of b below fmax from
// three models with N, 2N and 4N modes of each family in every section (N
// from the same rule as Solve with modes in the widest section; doubling
// keeps every ratio of counts), extrapolated by Richardson's rule with the
// observed order and the error estimate of Extrapolate. Family and Index
// of each entry are those of Solve's list for the same order (the label's
// family and the place in the order-n list). Errors: those of Solve for
// n >= 1, and 4 times a count above MaxModes.
func ExtrapolateOrder(b Body, n int, fmax float64, modes int) ([]Extrapolation, error) {
	if err := b.Validate(); err != nil {
		return nil, err
	}
	if n < 1 || n > cavity.MaxIndex {
		return nil, fmt.Errorf("axisym: azimuthal order n must be in 1..%d for ExtrapolateOrder (n = 0: Extrapolate), got %d", cavity.MaxIndex, n)
	}
	if err := b.hybridSupported(n); err != nil {
		return nil, err
	}
	if !(fmax > 0) || math.IsInf(fmax, 0) {
		return nil, fmt.Errorf("axisym: maximum frequency must be positive and finite, got %g Hz", fmax)
	}
	if modes == 0 {
		modes = DefaultModes
	}
	if modes < 1 || 4*modes > MaxModes {
		return nil, fmt.Errorf("axisym: modes must be in 1..%d for extrapolation (four times as many in the finest model), got %d", MaxModes/4, modes)
	}
	te, tm, err := hybridCounts(b, n, fmax*(1+estimateMargin), modes)
	if err != nil {
		return nil, err
	}
	models, err := threeModels(fmax, func(shift int, lim float64) ([]float64, error) {
		ct, err := doubled(te, shift)
		if err != nil {
			return nil, err
		}
		cm, err := doubled(tm, shift)
		if err != nil {
			return nil, err
		}
		return hybridResonancesWith(b, n, lim, ct, cm)
	})
	if err != nil {
		return nil, err
	}
	top := 0.0
	if k := len(models[2]); k > 0 {
		top = models[2][k-1]
	}
	origins, _, err := hybridLabels(b.Enclosing(), n, len(models[2]), top)
	if err != nil {
		return nil, err
	}
	return extrapolations(models, func(k int) cavity.Family { return origins[k].Family }), nil
}
