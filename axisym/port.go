package axisym

import (
	"fmt"
	"math"
	"math/cmplx"
	"sort"

	"cylcav/cavity"
	"cylcav/physics"
)

// Radiation holds one resonance of an open body that radiates into its
// pipes: a complex resonant frequency f = F + j FImag (time dependence
// exp(j 2 pi f t), so FImag > 0 is the decay) and its external Q.
type Radiation struct {
	Family cavity.Family
	// F is the real part of the complex resonant frequency in Hz.
	F float64
	// FImag is the imaginary part in Hz: the field decays as
	// exp(-2 pi FImag t).
	FImag float64
	// Qext is the external Q, F / (2 FImag): the Q of the power radiated
	// into all open ends (every other loss left out).
	Qext float64
	// Start is the resonance of the shorted body (Body.Shorted) from which
	// Muller's iteration started, in Hz.
	Start float64
}

// maxPortJump bounds how far PortQ's root may lie from its start, relative
// (a guard, not a model limit: a resonance with Qext near 1 moves less).
const maxPortJump = 0.25

// PortQ returns the resonant frequency f0 (Hz) and external Q of the
// resonance of family fam of open body b nearest fNear (Hz), for modes
// waveguide modes in the widest section (0: DefaultModes). It is the
// complex resonant frequency f of the matched model (Muller's method on
// the determinant of the complex junction matrix, from fNear), with
// f0 = Re f and Qext = Re f / (2 Im f) (the definition of Q from the decay
// of the free oscillation; Pozar, Microwave Engineering, 4th ed., sec.
// 6.1 and 6.7). Qext counts the power radiated into every open end; a
// resonance below the cutoff (Body.Radiates false) is trapped, its Qext
// infinite, and PortQ refuses it with an error. The same Qext follows,
// to order 1/Qext, from the group delay of the reflection at a single
// port, Qext = omega0 tau(omega0) / 4 (Kajfez, Q Factor, 1994, ch. 2;
// PortS11 gives the reflection; TestPortQGroupDelay).
//
// A root whose real part lies more than maxPortJump (relative) from fNear
// is refused: the iteration has left the resonance it started at.
func PortQ(b Body, fam cavity.Family, fNear float64, modes int) (f0, qext float64, err error) {
	if err := b.Validate(); err != nil {
		return 0, 0, err
	}
	if !b.Open() {
		return 0, 0, fmt.Errorf("axisym: PortQ needs a body with an open end (a pipe); this one is closed")
	}
	if !(fNear > 0) || math.IsInf(fNear, 0) {
		return 0, 0, fmt.Errorf("axisym: starting frequency must be positive and finite, got %g Hz", fNear)
	}
	if !b.Radiates(fam, fNear) {
		return 0, 0, fmt.Errorf("axisym: %g Hz is below the %v0 cutoff %g Hz of the open ends: a resonance there is trapped (no external Q)",
			fNear, fam, b.Cutoff(fam))
	}
	cs, err := newComplexSystem(b, fam, fNear, modes)
	if err != nil {
		return 0, 0, err
	}
	f, err := cs.muller(complex(fNear, 0))
	if err != nil {
		return 0, 0, err
	}
	if !(imag(f) > 0) {
		return 0, 0, fmt.Errorf("axisym: the root near %g Hz has Im f = %g Hz, not a decaying resonance", fNear, imag(f))
	}
	if !b.Radiates(fam, real(f)) {
		return 0, 0, fmt.Errorf("axisym: the iteration from %g Hz ended below the cutoff, at %g Hz", fNear, real(f))
	}
	if math.Abs(real(f)-fNear) > maxPortJump*fNear {
		return 0, 0, fmt.Errorf("axisym: the iteration from %g Hz ended at %g Hz, more than %g %% away: not the resonance near the start (start closer to it)",
			fNear, real(f), 100*maxPortJump)
	}
	return real(f), real(f) / (2 * imag(f)), nil
}

// Radiating returns the radiating resonances of family fam of open body
// b with real frequency between the cutoff (Body.Cutoff) and fmax (Hz),
// each found by PortQ's iteration from one resonance of the shorted body
// (Body.Shorted: the open end sections removed, the apertures closed by
// metal) above the cutoff. Iterations that end on the same root, below
// the cutoff, beyond fmax or on no decaying root are dropped. Unlike the
// trapped resonances of Solve, this list is not proven complete: a
// resonance of the open body that continues from no resonance of the
// shorted one (for example a strongly radiating one) is missed.
func Radiating(b Body, fam cavity.Family, fmax float64, modes int) ([]Radiation, error) {
	if err := b.Validate(); err != nil {
		return nil, err
	}
	fc := b.Cutoff(fam)
	if !b.Open() || fmax <= fc {
		return nil, nil
	}
	sh := b.Shorted()
	if len(sh.Sections) == 0 {
		return nil, nil
	}
	starts, err := Solve(sh, Request{MaxFrequency: fmax, Modes: modes, Families: []cavity.Family{fam}})
	if err != nil {
		return nil, err
	}
	var out []Radiation
	for _, s := range starts {
		if s.Frequency <= fc {
			continue
		}
		cs, err := newComplexSystem(b, fam, s.Frequency, modes)
		if err != nil {
			return nil, err
		}
		f, err := cs.muller(complex(s.Frequency, 0))
		if err != nil || !(imag(f) > 0) || real(f) <= fc || real(f) > fmax {
			continue
		}
		dup := false
		for _, o := range out {
			dup = dup || cmplx.Abs(complex(o.F, o.FImag)-f) <= 1e-8*real(f)
		}
		if !dup {
			out = append(out, Radiation{Family: fam, F: real(f), FImag: imag(f), Qext: real(f) / (2 * imag(f)), Start: s.Frequency})
		}
	}
	sort.Slice(out, func(i, j int) bool { return out[i].F < out[j].F })
	return out, nil
}

// PortS11 returns the reflection coefficient at real frequency f (Hz) of
// the lowest mode of family fam in the pipe at end A of b (the port), the
// reference plane at the junction of the first section with the second;
// every other mode of that pipe and every mode of a pipe at end B is
// terminated by its own characteristic admittance (no wave comes in).
// The lowest port mode must propagate at f. The model is lossless, so
// |S11| = 1 to rounding and the resonance shows in the phase: its group
// delay tau = -d arg S11 / d omega peaks at 4 Qext / omega0 (Kajfez, Q
// Factor, 1994, ch. 2; derived for one port). The incident wave a
// enters through the port line's characteristic admittance Y0 as the
// source term 2 Y0 a of the junction equations, and S11 = V1/a - 1 with
// V1 the port mode's voltage at the reference plane (derived; the test
// checks -exp(-2 j beta d) for a short at distance d).
func PortS11(b Body, fam cavity.Family, f float64, modes int) (complex128, error) {
	if err := b.Validate(); err != nil {
		return 0, err
	}
	if b.EndA != Pipe {
		return 0, fmt.Errorf("axisym: the port is the pipe at end A, which is a plate here")
	}
	if len(b.Sections) < 2 {
		return 0, fmt.Errorf("axisym: a port needs a junction: give at least two sections")
	}
	g := newGuide(fam, b.Sections[0].InnerRadius, b.Sections[0].Radius, 1)
	fc := g.kc[0] * physics.SpeedOfLight / (2 * math.Pi * b.Sections[0].Fill.Index())
	if !(f > fc) || math.IsInf(f, 0) {
		return 0, fmt.Errorf("axisym: the port's lowest %v0 mode propagates above %g Hz, got %g Hz", fam, fc, f)
	}
	cs, err := newComplexSystem(b, fam, f, modes)
	if err != nil {
		return 0, err
	}
	s := cs.s
	n := s.ndof
	a := make([]complex128, n*n)
	cs.eval(complex(f, 0), a)
	// The source: B v = -2 j y0 T^T e1 (scaled as the susceptances).
	ln := s.lines[0]
	k := 2 * math.Pi * f / physics.SpeedOfLight
	beta := branchBeta(complex(k*k*ln.eps*ln.mu-ln.kc[0]*ln.kc[0], 0))
	y0 := complex(1/ln.mu, 0) * beta
	if fam == cavity.TM {
		y0 = complex(ln.eps, 0) / beta
	}
	j := s.joins[0]
	rhs := make([]complex128, n)
	for c := range j.n {
		t := 1.0
		if j.left != nil {
			t = j.left[0*j.n+c]
		} else if c != 0 {
			t = 0
		}
		rhs[j.off+c] = -2i * y0 * complex(t, 0)
	}
	v, err := solveComplex(a, rhs, n)
	if err != nil {
		return 0, fmt.Errorf("axisym: port reflection at %g Hz: %w", f, err)
	}
	var v1 complex128
	for c := range j.n {
		t := 1.0
		if j.left != nil {
			t = j.left[0*j.n+c]
		} else if c != 0 {
			t = 0
		}
		v1 += complex(t, 0) * v[j.off+c]
	}
	return v1 - 1, nil
}

// complexSystem is the junction matrix of system continued to complex
// frequency, with the open end sections terminated by their pipes'
// outgoing waves.
type complexSystem struct {
	s     *system
	scale []float64 // fixed diagonal scaling of the determinant
	pole  [][]bool  // per line and mode: multiply the determinant by sin(beta l)
	a     []complex128
}

// newComplexSystem builds the model of b for family fam with the mode
// counts Solve uses up to f0.
func newComplexSystem(b Body, fam cavity.Family, f0 float64, modes int) (*complexSystem, error) {
	if modes == 0 {
		modes = DefaultModes
	}
	if modes < 1 || modes > MaxModes {
		return nil, fmt.Errorf("axisym: modes must be in 1..%d, got %d", MaxModes, modes)
	}
	if fam != cavity.TE && fam != cavity.TM {
		return nil, fmt.Errorf("axisym: unknown family %v", fam)
	}
	counts, err := ModeCounts(b, fam, f0, modes)
	if err != nil {
		return nil, err
	}
	s, err := newSystem(b, fam, counts)
	if err != nil {
		return nil, err
	}
	cs := &complexSystem{s: s, a: make([]complex128, s.ndof*s.ndof)}
	// Lines of closed sections that propagate at f0 have poles (their
	// closed resonances) near the roots; the determinant is multiplied by
	// sin(beta l) of each to remove them.
	k := 2 * math.Pi * f0 / physics.SpeedOfLight
	for _, ln := range s.lines {
		p := make([]bool, len(ln.kc))
		for m, kc := range ln.kc {
			p[m] = !ln.open && k*k*ln.eps*ln.mu > kc*kc
			if s.fam == cavity.TM && !ln.open {
				// The TM line's p = 0 pole at its own cutoff (beta = 0)
				// is removed too when that cutoff is within nearCutoff
				// of f0 (in k^2): a TM0m0 cell resonates there.
				p[m] = p[m] || kc*kc-k*k*ln.eps*ln.mu < nearCutoff*k*k*ln.eps*ln.mu
			}
		}
		cs.pole = append(cs.pole, p)
	}
	// The scaling is taken off the real axis (Im f = scaleOffset f0), where
	// no closed line's pole lies: at the closed resonance of a TM0m0 cell,
	// a usual starting frequency, the cell line's beta = 0 pole would make
	// the diagonal of every row it reaches huge, and the scaled
	// determinant underflow.
	cs.eval(complex(f0, scaleOffset*f0), cs.a)
	cs.scale = make([]float64, s.ndof)
	for i := range cs.scale {
		d := cmplx.Abs(cs.a[i*s.ndof+i])
		if !(d > 0) || math.IsInf(d, 0) || math.IsNaN(d) {
			d = 1
		}
		cs.scale[i] = 1 / math.Sqrt(d)
	}
	return cs, nil
}

// branchBeta returns the propagation constant beta = sqrt(x), x = k^2 -
// kc^2, on the branch of an outgoing wave exp(-j beta z) (time dependence
// exp(j omega t)): beta > 0 above cutoff on the real axis, -j alpha below
// it, continued analytically into Im omega > 0 with the branch cut put on
// the positive imaginary axis of x, away from both.
func branchBeta(x complex128) complex128 {
	return cmplx.Exp(complex(0, -math.Pi/4)) * cmplx.Sqrt(1i*x)
}

// cotCsc returns cot z and csc z without overflow for large |Im z|.
func cotCsc(z complex128) (cot, csc complex128) {
	if imag(z) <= 0 {
		// e^{-jz} = e^{-j Re z} e^{Im z} is small.
		e := cmplx.Exp(-1i * z)
		e2 := e * e
		return 1i * (1 + e2) / (1 - e2), 2i * e / (1 - e2)
	}
	e := cmplx.Exp(1i * z)
	e2 := e * e
	return -1i * (1 + e2) / (1 - e2), -2i * e / (1 - e2)
}

// eval assembles the complex junction matrix (full, symmetric) at complex
// frequency f into a and returns the product of sin(beta l) over the pole
// lines (see newComplexSystem). The susceptances are those of
// lineSusceptance continued to complex beta; an open line's is -j times
// its characteristic admittance, -j beta/mu_r (TE) or -j eps_r/beta (TM),
// which is openSusceptance below cutoff and carries the radiated power
// above it.
func (cs *complexSystem) eval(f complex128, a []complex128) (sinProd complex128) {
	s := cs.s
	n := s.ndof
	clear(a)
	sinProd = 1
	k0 := 2 * math.Pi * f / complex(physics.SpeedOfLight, 0)
	b11 := make([][]complex128, len(s.lines))
	b12 := make([][]complex128, len(s.lines))
	for i, ln := range s.lines {
		b11[i], b12[i] = make([]complex128, len(ln.kc)), make([]complex128, len(ln.kc))
		eps, mu := complex(ln.eps, 0), complex(ln.mu, 0)
		for m, kc := range ln.kc {
			beta := branchBeta(k0*k0*eps*mu - complex(kc*kc, 0))
			if ln.open {
				if s.fam == cavity.TE {
					b11[i][m] = -1i * beta / mu
				} else {
					b11[i][m] = -1i * eps / beta
				}
				continue
			}
			z := beta * complex(ln.length, 0)
			cot, csc := cotCsc(z)
			if s.fam == cavity.TE {
				b11[i][m], b12[i][m] = -beta*cot/mu, beta*csc/mu
			} else {
				b11[i][m], b12[i][m] = -eps*cot/beta, eps*csc/beta
			}
			if cs.pole != nil && cs.pole[i][m] {
				sinProd *= poleFactor(s.fam, z)
			}
		}
	}
	for i := range s.lines {
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
			addComplex(a, n, jl, jl, tl, tl, b11[i])
		}
		if jr != nil {
			addComplex(a, n, jr, jr, tr, tr, b11[i])
		}
		if jl != nil && jr != nil {
			addComplex(a, n, jl, jr, tl, tr, b12[i])
			addComplex(a, n, jr, jl, tr, tl, b12[i])
		}
	}
	return sinProd
}

// poleFactor returns the factor that removes the poles of a closed line's
// susceptances from the determinant, as an even function of z = beta l
// (so of beta^2, and analytic in f: an odd factor such as sin z would put
// a square-root branch point at the line's cutoff, beta = 0). TE
// susceptances (-beta cot z / mu) have poles at z = p pi, p >= 1: sin z / z.
// TM ones (-eps cot z / beta) also at z = 0, the cutoff itself (the p = 0
// pole that lineSusceptance counts; a TM0m0 cell resonates there): z sin z.
func poleFactor(fam cavity.Family, z complex128) complex128 {
	if fam == cavity.TM {
		return z * cmplx.Sin(z)
	}
	if cmplx.Abs(z) < 1e-4 {
		return 1 - z*z/6
	}
	return cmplx.Sin(z) / z
}

// addComplex adds Ta^T diag(d) Tb to the block (ja, jb) of the full matrix
// a (n x n); a nil T is the identity.
func addComplex(a []complex128, n int, ja, jb *join, ta, tb []float64, d []complex128) {
	col := func(t []float64, j *join, m, c int) float64 {
		if t == nil {
			if m == c {
				return 1
			}
			return 0
		}
		return t[m*j.n+c]
	}
	for m, dm := range d {
		if ta == nil && m >= ja.n || tb == nil && m >= jb.n {
			continue
		}
		for r := range ja.n {
			x := col(ta, ja, m, r)
			if x == 0 {
				continue
			}
			g := complex(x, 0) * dm
			row := a[(ja.off+r)*n+jb.off : (ja.off+r)*n+jb.off+jb.n]
			for c := range row {
				if y := col(tb, jb, m, c); y != 0 {
					row[c] += g * complex(y, 0)
				}
			}
		}
	}
}

// det returns the scaled determinant of the junction matrix at complex
// frequency f times the pole factor, as m 2^e (the determinant of a
// thin iris's many nearly shorted modes underflows a float64): an
// analytic function of f near the resonances, without the poles of closed
// sections, whose zeros are the complex resonant frequencies.
func (cs *complexSystem) det(f complex128) (m complex128, e int) {
	n := cs.s.ndof
	sp := cs.eval(f, cs.a)
	for i := range n {
		for j := range n {
			cs.a[i*n+j] *= complex(cs.scale[i]*cs.scale[j], 0)
		}
	}
	m, e = luDet(cs.a, n)
	return normExp(m*sp, e)
}

// normExp returns m 2^e as m' 2^e' with |Re m'|, |Im m'| < 1 and the
// larger at least 1/2 (m' = 0, e' = 0 for m = 0).
func normExp(m complex128, e int) (complex128, int) {
	_, er := math.Frexp(real(m))
	_, ei := math.Frexp(imag(m))
	x := max(er, ei)
	if m == 0 || cmplx.IsNaN(m) || cmplx.IsInf(m) {
		return m, 0
	}
	return complex(math.Ldexp(real(m), -x), math.Ldexp(imag(m), -x)), e + x
}

// ldexpC returns m 2^e.
func ldexpC(m complex128, e int) complex128 {
	return complex(math.Ldexp(real(m), e), math.Ldexp(imag(m), e))
}

// luDet returns the determinant of the n x n matrix a (overwritten) by
// Gaussian elimination with partial pivoting, as m 2^e.
func luDet(a []complex128, n int) (complex128, int) {
	d, e := complex(1, 0), 0
	for p := range n {
		piv := p
		for i := p + 1; i < n; i++ {
			if cmplx.Abs(a[i*n+p]) > cmplx.Abs(a[piv*n+p]) {
				piv = i
			}
		}
		if a[piv*n+p] == 0 {
			return 0, 0
		}
		if piv != p {
			for j := range n {
				a[p*n+j], a[piv*n+j] = a[piv*n+j], a[p*n+j]
			}
			d = -d
		}
		pp := a[p*n+p]
		d, e = normExp(d*pp, e)
		for i := p + 1; i < n; i++ {
			g := a[i*n+p] / pp
			if g == 0 {
				continue
			}
			for j := p; j < n; j++ {
				a[i*n+j] -= g * a[p*n+j]
			}
		}
	}
	return d, e
}

// solveComplex solves a x = b for the n x n matrix a (overwritten) by
// Gaussian elimination with partial pivoting.
func solveComplex(a, b []complex128, n int) ([]complex128, error) {
	x := append([]complex128(nil), b...)
	for p := range n {
		piv := p
		for i := p + 1; i < n; i++ {
			if cmplx.Abs(a[i*n+p]) > cmplx.Abs(a[piv*n+p]) {
				piv = i
			}
		}
		if a[piv*n+p] == 0 {
			return nil, fmt.Errorf("singular junction matrix")
		}
		if piv != p {
			for j := range n {
				a[p*n+j], a[piv*n+j] = a[piv*n+j], a[p*n+j]
			}
			x[p], x[piv] = x[piv], x[p]
		}
		pp := a[p*n+p]
		for i := p + 1; i < n; i++ {
			g := a[i*n+p] / pp
			if g == 0 {
				continue
			}
			for j := p; j < n; j++ {
				a[i*n+j] -= g * a[p*n+j]
			}
			x[i] -= g * x[p]
		}
	}
	for p := n - 1; p >= 0; p-- {
		s := x[p]
		for j := p + 1; j < n; j++ {
			s -= a[p*n+j] * x[j]
		}
		x[p] = s / a[p*n+p]
	}
	return x, nil
}

// nearCutoff is the relative distance in k^2 below f0 within which a
// closed TM line's cutoff (its p = 0 pole) is removed from the
// determinant (common practice: well beyond the detuning of a resonance
// by its openings, and few lines qualify).
const nearCutoff = 0.1

// scaleOffset is the relative imaginary part of the frequency at which
// newComplexSystem takes the determinant's diagonal scaling (any value
// well off the real axis and small against 1 serves; common practice).
const scaleOffset = 1e-3

// startOffset is the relative imaginary part given to the third starting
// point of Muller's iteration (small against the step 1e-4 between the
// starts; common practice).
const startOffset = 1e-7

// mullerTol is the relative step at which Muller's iteration stops.
const mullerTol = 1e-13

// muller finds a zero of det near x2 by Muller's method (D. E. Muller, "A
// method for solving algebraic equations using an automatic computer",
// Math. Tables Aids Comput. 10 (1956) 208-215): the parabola through the
// last three iterates, its root nearer the last one.
func (cs *complexSystem) muller(x2 complex128) (complex128, error) {
	if cs.s.ndof == 0 {
		return 0, fmt.Errorf("axisym: a body of one section has no junction and no resonance to follow")
	}
	h := complex(1e-4*real(x2), 0)
	x0, x1 := x2-h, x2+h
	// The third start is moved a little off the real axis: a usual start,
	// the closed resonance of a TM0m0 cell, is a pole of the cell line
	// (beta = 0), where the matrix cannot be evaluated.
	x2 += complex(0, startOffset*real(x2))
	m0, e0 := cs.det(x0)
	m1, e1 := cs.det(x1)
	m2, e2 := cs.det(x2)
	for it := 0; it < 100; it++ {
		// Muller's step is homogeneous in the three values: scale them
		// by a common power of two.
		top := max(e0, e1, e2)
		f0, f1, f2 := ldexpC(m0, e0-top), ldexpC(m1, e1-top), ldexpC(m2, e2-top)
		h1, h2 := x1-x0, x2-x1
		d1, d2 := (f1-f0)/h1, (f2-f1)/h2
		q := (d2 - d1) / (h2 + h1)
		bb := d2 + h2*q
		disc := cmplx.Sqrt(bb*bb - 4*f2*q)
		den := bb + disc
		if cmplx.Abs(bb-disc) > cmplx.Abs(den) {
			den = bb - disc
		}
		var dx complex128
		if den == 0 {
			dx = h2 // flat: step on
		} else {
			dx = -2 * f2 / den
		}
		x0, x1, x2 = x1, x2, x2+dx
		m0, e0, m1, e1 = m1, e1, m2, e2
		m2, e2 = cs.det(x2)
		if cmplx.IsNaN(m2) || cmplx.IsInf(m2) {
			return 0, fmt.Errorf("axisym: Muller's iteration left the range of the model at %v Hz", x2)
		}
		if cmplx.Abs(dx) <= mullerTol*cmplx.Abs(x2) || m2 == 0 {
			return x2, nil
		}
	}
	return 0, fmt.Errorf("axisym: Muller's iteration from %g Hz did not converge", real(x2))
}
