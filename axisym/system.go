package axisym

import (
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics"
)

// system is the mode-matched model of a body for one family (TE0 or TM0)
// with a fixed number of modes per section.
//
// Each section is a bundle of uncoupled transmission lines, one per
// waveguide mode, shorted where it meets an end plate. Each junction between
// sections carries as unknowns the modal voltages of the narrower section's
// modes (the aperture field; the step face is metal). The junction
// equations B(omega) V = 0, with B the sum over sections of T^T Y T (T maps
// junction voltages to the section's modal voltages: the identity on the
// narrow side, the overlap matrix M on the wide side), is the
// generalised-admittance form of axial mode matching (Wexler 1967; Patzelt
// and Arndt 1982; Itoh (ed.) 1989, ch. 9).
type system struct {
	fam     cavity.Family
	lines   []lines
	joins   []join
	ndof    int
	offset  int        // see count
	layers  layerState // radially layered sections (layered_system.go)
	static  []float64  // constant part of the junction matrix (edgebasis.go), or nil
	static2 []float64  // its part proportional to k0^2 (edgebasis.go)
}

// lines is one section's set of modal transmission lines.
type lines struct {
	kc       []float64 // transverse wavenumbers, rad/m
	eps, mu  float64   // relative permittivity and permeability
	length   float64   // m
	b11, b12 []float64 // scratch: driving-point and transfer susceptance per mode
	open     bool      // an open end section: the lines run on into the pipe (open.go)
	beta2    []float64 // layered section: beta^2 per mode at the current frequency (else nil)
	sub      []float64 // static b11 per mode held in system.static (edgebasis.go), or nil
	sub2     []float64 // its k0^2 coefficient, held in system.static2
}

// join is one junction between sections i (left) and i+1 (right).
type join struct {
	off, n int       // offset and number of unknowns (modes of the narrower side)
	left   []float64 // T of the left section (len(kc) x n, row-major), nil = identity
	right  []float64 // T of the right section, nil = identity
}

// newSystem builds the model of b for family fam with counts[i] modes in
// section i. It returns an error wrapping ErrNotImplemented when at some
// junction neither cross-section lies inside the other (the aperture would
// need a third region).
func newSystem(b Body, fam cavity.Family, counts []int) (*system, error) {
	s := &system{fam: fam}
	guides := make([]guide, len(b.Sections))
	for i, sec := range b.Sections {
		n := counts[i]
		guides[i] = newGuide(fam, sec.InnerRadius, sec.Radius, n)
		s.lines = append(s.lines, lines{
			kc:     guides[i].kc,
			eps:    sec.Fill.Eps(),
			mu:     sec.Fill.Mu(),
			length: sec.Length,
			b11:    make([]float64, n),
			b12:    make([]float64, n),
		})
	}
	for i := 0; i+1 < len(b.Sections); i++ {
		gl, gr := guides[i], guides[i+1]
		j := join{off: s.ndof}
		// The unknowns are the modes of the side whose cross-section is the
		// aperture; for one cross-section, the side with fewer modes.
		switch {
		case contains(gr, gl) && (!contains(gl, gr) || len(gl.kc) <= len(gr.kc)):
			j.n = len(gl.kc)
			j.right = coupling(gr, gl)
		case contains(gl, gr):
			j.n = len(gr.kc)
			j.left = coupling(gl, gr)
		default:
			return nil, fmt.Errorf("axisym: sections %d and %d: neither cross-section lies inside the other (%g..%g m against %g..%g m): %w",
				i+1, i+2, gl.inner, gl.outer, gr.inner, gr.outer, ErrNotImplemented)
		}
		s.ndof += j.n
		s.joins = append(s.joins, j)
	}
	s.markOpen(b)
	s.initLayers(b, guides)
	return s, nil
}

// lineSusceptance returns the normalised driving-point and transfer
// susceptances of one modal line of length l with propagation constant
// squared beta2 = k^2 - kc^2, and the number of resonances below the current
// frequency of that line shorted at both ends (the poles of b11).
//
// For a line of characteristic admittance Y0 the admittance matrix with
// currents into both ports is Y11 = -j Y0 cot(beta l), Y12 = j Y0 csc(beta l)
// (Pozar, Microwave Engineering, 4th ed., sec. 4.3, as recalled; Collin,
// Field Theory of Guided Waves, 2nd ed., ch. 5). With Y0 = beta/(omega mu)
// for TE and omega eps/beta for TM, and B = Im Y scaled by the positive
// factor omega mu0 (TE) or 1/(omega eps0) (TM), which leaves the signs of
// the eigenvalues alone:
//
//	TE: b11 = -beta cot(beta l)/mu_r,  b12 = beta csc(beta l)/mu_r
//	TM: b11 = -eps_r cot(beta l)/beta, b12 = eps_r csc(beta l)/beta
//
// continued analytically to beta = -j alpha below cutoff (coth and csch).
// Shorted at both ends the line resonates at beta l = p pi, p >= 1 for TE
// and p >= 0 for TM: the TE0mp and TM0mp modes of the closed section.
func lineSusceptance(fam cavity.Family, beta2, l, eps, mu float64) (b11, b12 float64, poles int) {
	if beta2 <= 0 {
		alpha := math.Sqrt(-beta2)
		x := alpha * l
		coth, csch := 1/math.Tanh(x), 1/math.Sinh(x)
		if fam == cavity.TE {
			if x == 0 {
				return -1 / (l * mu), 1 / (l * mu), 0 // beta cot(beta l) -> 1/l
			}
			return -alpha * coth / mu, alpha * csch / mu, 0
		}
		if x == 0 {
			return math.Inf(-1), math.Inf(1), 1
		}
		return eps * coth / alpha, -eps * csch / alpha, 0
	}
	beta := math.Sqrt(beta2)
	t := beta * l / math.Pi
	p := math.Floor(t)
	// Reduce the argument once so that the pole count and the sign of the
	// cotangent come from the same number.
	x := math.Pi * (t - p) // in [0, pi)
	cot := math.Cos(x) / math.Sin(x)
	csc := 1 / math.Sin(x)
	if int64(p)%2 == 1 {
		csc = -csc // sin(x + p pi) = (-1)^p sin x
	}
	poles = int(p)
	if fam == cavity.TE {
		return -beta * cot / mu, beta * csc / mu, poles
	}
	return -eps * cot / beta, eps * csc / beta, poles + 1
}

// eval assembles the junction matrix at frequency f into a (ndof x ndof,
// row-major, upper triangle used) and returns the number of closed-section
// resonances below f (the Wittrick-Williams J0).
func (s *system) eval(f float64, a []float64) (j0 int) {
	clear(a)
	k0 := 2 * math.Pi * f / physics.SpeedOfLight
	if s.static != nil {
		copy(a, s.static)
		for i, v := range s.static2 {
			a[i] += k0 * k0 * v
		}
	}
	s.refreshLayers(k0)
	for i := range s.lines {
		ln := &s.lines[i]
		k2 := k0 * k0 * ln.eps * ln.mu
		for m, kc := range ln.kc {
			beta2 := k2 - kc*kc
			if ln.beta2 != nil {
				beta2 = ln.beta2[m]
			}
			b11, b12, poles := lineSusceptance(s.fam, beta2, ln.length, ln.eps, ln.mu)
			if ln.open {
				b11, b12, poles = openSusceptance(s.fam, beta2, ln.eps, ln.mu), 0, 0
			}
			if ln.sub != nil {
				b11 -= ln.sub[m] + k0*k0*ln.sub2[m]
			}
			ln.b11[m], ln.b12[m] = b11, b12
			j0 += poles
		}
		s.addLine(a, i, ln)
	}
	return j0
}

// addLine adds section i's line ln (its driving-point and transfer
// susceptances) to a, between the junctions on either side of it (none at
// a plate or an open end).
func (s *system) addLine(a []float64, i int, ln *lines) {
	var jl, jr *join
	var tl, tr []float64
	if i > 0 {
		jl = &s.joins[i-1]
		tl = jl.right
	}
	if i < len(s.joins) {
		jr = &s.joins[i]
		tr = jr.left
	}
	if jl != nil {
		s.add(a, jl, jl, tl, tl, ln.b11)
	}
	if jr != nil {
		s.add(a, jr, jr, tr, tr, ln.b11)
	}
	if jl != nil && jr != nil {
		s.add(a, jl, jr, tl, tr, ln.b12)
	}
}

// add adds Ta^T diag(d) Tb to the block (ja, jb) of a (upper triangle only
// on diagonal blocks); a nil T is the identity.
func (s *system) add(a []float64, ja, jb *join, ta, tb, d []float64) {
	n := s.ndof
	diag := ja == jb
	switch {
	case ta == nil && tb == nil:
		for r := range ja.n {
			a[(ja.off+r)*n+jb.off+r] += d[r]
		}
	case ta == nil:
		for r := range ja.n {
			row := a[(ja.off+r)*n+jb.off : (ja.off+r)*n+jb.off+jb.n]
			tr := tb[r*jb.n : (r+1)*jb.n]
			for c := range row {
				row[c] += d[r] * tr[c]
			}
		}
	case tb == nil:
		for r := range ja.n {
			row := a[(ja.off+r)*n+jb.off : (ja.off+r)*n+jb.off+jb.n]
			for c := range row {
				row[c] += ta[c*ja.n+r] * d[c]
			}
		}
	default:
		// Row m of Ta and Tb at a time, so the inner loop runs along a row.
		for m, dm := range d {
			tam := ta[m*ja.n : (m+1)*ja.n]
			tbm := tb[m*jb.n : (m+1)*jb.n]
			for r, x := range tam {
				g := x * dm
				if g == 0 {
					continue
				}
				c0 := 0
				if diag {
					c0 = r
				}
				row := a[(ja.off+r)*n+jb.off : (ja.off+r)*n+jb.off+jb.n]
				for c := c0; c < jb.n; c++ {
					row[c] += g * tbm[c]
				}
			}
		}
	}
}

// inertia factors the symmetric matrix a (upper triangle, overwritten) as
// L D L^T by Gaussian elimination without interchanges, the form Wittrick
// and Williams (1971) use for their sign count, and returns the number of
// positive and negative pivots and the last pivot. The matrix is block
// tridiagonal (junction i couples only to i-1 and i+1), so each pivot's
// elimination touches only its own and the next junction: cost O(n w^2)
// for bandwidth w.
func (s *system) inertia(a []float64) (pos, neg int, last float64) {
	n := s.ndof
	for ji, jn := range s.joins {
		end := jn.off + jn.n
		if ji+1 < len(s.joins) {
			end += s.joins[ji+1].n
		}
		for p := jn.off; p < jn.off+jn.n; p++ {
			d := a[p*n+p]
			switch {
			case d > 0:
				pos++
			case d < 0:
				neg++
			default:
				d = math.SmallestNonzeroFloat64 // exactly singular: count as positive
				pos++
			}
			last = d
			rowp := a[p*n : p*n+n]
			for i := p + 1; i < end; i++ {
				g := rowp[i] / d
				if g == 0 {
					continue
				}
				rowi := a[i*n : i*n+n]
				for j := i; j < end; j++ {
					rowi[j] -= g * rowp[j]
				}
			}
		}
	}
	return pos, neg, last
}

// count returns the number of resonances of the modelled body with
// frequency below f (the Wittrick-Williams count), and the last pivot of
// the factorisation, a smooth function of f between its poles that changes
// sign at a resonance.
//
// Wittrick and Williams (1971) count the eigenvalues below f of a system
// described by a dynamic stiffness matrix K(f) whose eigenvalues decrease
// with f as J = J0 + s{K}, J0 the eigenvalues of the system with all
// junction unknowns clamped and s the number of negative eigenvalues of K
// (Sylvester's law of inertia lets the pivots of an elimination stand in
// for the eigenvalues). Here the junction susceptance B increases with f
// (Foster's reactance theorem), so K = -B; clamped junction voltages leave
// each section a closed cylinder, whose resonances are the poles counted by
// lineSusceptance. Hence J = J0 + pos(B) - offset, where the constant
// offset makes J vanish near f = 0 (see calibrate): 0 for TE0, whose
// voltages are the natural unknowns; the number of unknowns for TM0
// without a coaxial section (B -> 0+ as f -> 0, every eigenvalue starts
// positive); and with TEM lines, whose susceptance tends to -infinity and
// whose p = 0 pole sits at f = 0, whatever the calibration finds. Derived;
// the tests check it against the closed-form mode lists of a cylinder cut
// by junctions that change nothing and of a coaxial cavity.
func (s *system) count(f float64, a []float64) (j int, last float64) {
	j0 := s.eval(f, a)
	pos, _, last := s.inertia(a)
	return j0 + pos - s.offset, last
}

// calibrate sets the offset of count from an evaluation at a frequency far
// below any resonance of the body: a thousandth of the lowest resonance of
// a closed cylinder that encloses it, scaled down by the largest
// refractive index (a lower bound for the body's TE0 and TM0 resonances
// other than lumped, re-entrant ones, which the factor of a thousand
// covers for gaps down to about 1e-6 of the body's size).
func (s *system) calibrate(b Body, a []float64) {
	n := 1.0
	for _, sec := range b.Sections {
		n = max(n, sec.maxIndex())
	}
	f := 1e-3 * physics.SpeedOfLight / (2 * n * (b.Length() + 2*b.MaxRadius()))
	s.offset = 0
	j, _ := s.count(f, a)
	s.offset = j
}
