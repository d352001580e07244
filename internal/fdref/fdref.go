// Package fdref is an independent reference for the tests of the
// axisymmetric solvers: the lowest eigenvalue k^2 of the n = 0 TE
// (E_phi) and TM (H_phi) problems of a body of revolution by finite
// differences (TE0) and cell-centred finite volumes (TM0) on a square grid,
// with Richardson extrapolation in the step.
//
// It shares nothing with the mode-matching solver (no Bessel functions, no
// modal expansion, no junction model): a body is a list of Slabs, each a
// piece of the field region between two metal radii, and the tests that
// compare the two build both descriptions from the same numbers. The
// package is for tests; no command uses it.
//
// The scalar problems (Jackson, Classical Electrodynamics, 3rd ed., sec.
// 8.7, for the n = 0 fields, as recalled). TE0: E_phi = u obeys
// (1/r)(r u_r)_r - u/r^2 + u_zz + eps k^2 u = 0, u = 0 on the axis and on
// metal. Multiplied by r the five-point operator is symmetric, A u = k^2 R u
// with R = diag(r eps) and
//
//	(A u)_ij = -[r_{i+1/2}(u_{i+1,j} - u_ij) - r_{i-1/2}(u_ij - u_{i-1,j})]/h^2
//	           + u_ij/r_i - r_i (u_{i,j+1} - 2 u_ij + u_{i,j-1})/h^2,
//
// eps at a node the mean of the four grid cells around it (a finite-volume
// lumping; derived). TM0: H_phi = u makes the Rayleigh quotient
//
//	k^2 = min int [ (1/r) (d(r u)/dr)^2 + r (du/dz)^2 ] dr dz / int r u^2 dr dz
//
// stationary (vacuum; the curl-curl form); E_t = 0 on metal is its natural
// boundary condition, so metal faces carry no term; u ~ r at the axis gives
// the axis cell the term 2 h u^2 (derived: the integral of
// (1/r)(d(r u)/dr)^2 over the half cell with u linear in r); faces between
// cells give r (du)^2 (z faces) and (d(r u))^2/r_face (r faces).
//
// The far end of the last slab is a metal plate, or a magnetic plane (the
// even half of a mirror-symmetric body): for TE0 a row of unknowns on the
// plane with the ghost u_{nz+1} = u_{nz-1} and the row halved, which keeps
// A symmetric (LeVeque, Finite Difference Methods for Ordinary and Partial
// Differential Equations, SIAM 2007, sec. 2.12, as recalled); for TM0 u = 0
// on the plane half a cell away, the term 2 r u^2 in that cell (derived:
// r (u/(h/2))^2 over the half cell).
//
// The lowest eigenvalue comes from inverse iteration with a banded Cholesky
// factor of A and the Rayleigh quotient (Golub and Van Loan, Matrix
// Computations, 4th ed., sec. 4.3.5 and 8.2.2).
package fdref

import (
	"fmt"
	"math"
)

// Slab is a piece of the field region along z: Length long, between the
// metal radii Inner (0: the axis) and Outer. At the plane between two slabs
// the field lives only where both have it (the rest of the plane is a metal
// step face).
type Slab struct {
	Length, Inner, Outer float64 // m
}

// Far is the boundary at the far end of the last slab.
type Far int

const (
	// Plate is a metal plate (also the odd half of a mirror-symmetric TE0
	// body, or the electric-wall half of a TM0 one).
	Plate Far = iota
	// Magnetic is a magnetic plane: the even half of a mirror-symmetric
	// TE0 body, or the magnetic-wall half of a TM0 one.
	Magnetic
)

// Problem is one grid problem. Step must divide every length and radius;
// Eps (relative permittivity at (r, z); nil is vacuum) is used by TE0 only.
type Problem struct {
	Slabs []Slab
	Step  float64
	Far   Far
	Eps   func(r, z float64) float64
}

// rows returns the number of grid steps along each slab and checks that
// Step divides every dimension.
func (p Problem) steps() ([]int, error) {
	h := p.Step
	fit := func(x float64) (int, bool) {
		n := math.Round(x / h)
		return int(n), math.Abs(x-n*h) <= 1e-9*h
	}
	var out []int
	for i, s := range p.Slabs {
		n, ok1 := fit(s.Length)
		_, ok2 := fit(s.Inner)
		_, ok3 := fit(s.Outer)
		if !ok1 || !ok2 || !ok3 || n == 0 || !(s.Outer > s.Inner) {
			return nil, fmt.Errorf("fdref: slab %d (%+v) does not fit a grid of step %g", i+1, s, h)
		}
		out = append(out, n)
	}
	if len(out) == 0 {
		return nil, fmt.Errorf("fdref: no slabs")
	}
	return out, nil
}

// TE0 returns the lowest k^2 (1/m^2) of the TE0 problem by finite
// differences on the grid nodes.
func TE0(p Problem) (float64, error) {
	ns, err := p.steps()
	if err != nil {
		return 0, err
	}
	h := p.Step
	// lo, hi: the metal radii at node row j (rows 0 and nz are end planes).
	var lo, hi []float64
	lo, hi = append(lo, 0), append(hi, 0)
	for si, s := range p.Slabs {
		for k := range ns[si] {
			a, b := s.Inner, s.Outer
			if k == 0 && si > 0 {
				a, b = max(a, p.Slabs[si-1].Inner), min(b, p.Slabs[si-1].Outer)
			}
			if k > 0 || si > 0 {
				lo, hi = append(lo, a), append(hi, b)
			}
		}
	}
	nz := len(lo) // rows 1..nz-1 are interior; row nz is the far plane
	last := p.Slabs[len(p.Slabs)-1]
	lo, hi = append(lo, last.Inner), append(hi, last.Outer)
	jmax := nz - 1
	if p.Far == Magnetic {
		jmax = nz
	}
	idx := make([][]int, jmax+1)
	n, w := 0, 0
	for j := 1; j <= jmax; j++ {
		i0 := int(math.Round(lo[j]/h)) + 1
		m := int(math.Round(hi[j]/h)) - 1
		idx[j] = make([]int, max(m+1, 0))
		for i := range idx[j] {
			idx[j][i] = -1
		}
		for i := i0; i <= m; i++ {
			idx[j][i] = n
			n++
		}
		w = max(w, m)
	}
	at := func(i, j int) int {
		if j < 1 || j > jmax || i < 0 || i >= len(idx[j]) {
			return -1
		}
		return idx[j][i]
	}
	m := newBanded(n, w)
	for j := 1; j <= jmax; j++ {
		half := 1.0
		if j == nz {
			half = 0.5
		}
		for i := range idx[j] {
			q0 := idx[j][i]
			if q0 < 0 {
				continue
			}
			r := float64(i) * h
			rp, rm := r+h/2, r-h/2
			m.mass[q0] = half * r
			if p.Eps != nil {
				z := float64(j) * h
				m.mass[q0] *= (p.Eps(r-h/2, z-h/2) + p.Eps(r+h/2, z-h/2) + p.Eps(r-h/2, z+h/2) + p.Eps(r+h/2, z+h/2)) / 4
			}
			m.add(q0, q0, half*((rp+rm)/(h*h)+1/r+2*r/(h*h)))
			if q := at(i-1, j); q >= 0 {
				m.add(q0, q, -half*rm/(h*h))
			}
			if q := at(i, j-1); q >= 0 {
				m.add(q0, q, -r/(h*h)) // on the magnetic plane: the halved ghost pair 2 r/h^2
			}
		}
	}
	return m.lowest()
}

// TM0 returns the lowest k^2 (1/m^2) of the TM0 problem of a vacuum body by
// cell-centred finite volumes.
func TM0(p Problem) (float64, error) {
	ns, err := p.steps()
	if err != nil {
		return 0, err
	}
	if p.Eps != nil {
		return 0, fmt.Errorf("fdref: TM0 is for vacuum bodies")
	}
	h := p.Step
	var lo, hi []float64 // the metal radii of cell row j
	for si, s := range p.Slabs {
		for range ns[si] {
			lo, hi = append(lo, s.Inner), append(hi, s.Outer)
		}
	}
	nz := len(lo)
	idx := make([][]int, nz)
	n, w := 0, 0
	for j := range nz {
		i0 := int(math.Round(lo[j] / h))
		mm := int(math.Round(hi[j] / h))
		idx[j] = make([]int, mm)
		for i := range idx[j] {
			idx[j][i] = -1
		}
		for i := i0; i < mm; i++ {
			idx[j][i] = n
			n++
		}
		w = max(w, mm)
	}
	at := func(i, j int) int {
		if j < 0 || j >= nz || i < 0 || i >= len(idx[j]) {
			return -1
		}
		return idx[j][i]
	}
	m := newBanded(n, w)
	rc := func(i int) float64 { return (float64(i) + 0.5) * h }
	for j := range nz {
		for i := range idx[j] {
			p0 := idx[j][i]
			if p0 < 0 {
				continue
			}
			r := rc(i)
			m.mass[p0] = r * h * h
			if i == 0 {
				m.add(p0, p0, 2*h)
			}
			// r face to the cell at i+1: (r_{i+1} u_{i+1} - r_i u_i)^2 / r_f.
			if q := at(i+1, j); q >= 0 {
				rf := float64(i+1) * h
				r1 := rc(i + 1)
				m.add(p0, p0, r*r/rf)
				m.add(q, q, r1*r1/rf)
				m.add(q, p0, -r*r1/rf)
			}
			// z face to the cell at j+1: r (u_{j+1} - u_j)^2.
			if q := at(i, j+1); q >= 0 {
				m.add(p0, p0, r)
				m.add(q, q, r)
				m.add(q, p0, -r)
			}
			if p.Far == Magnetic && j == nz-1 {
				m.add(p0, p0, 2*r)
			}
		}
	}
	return m.lowest()
}

// banded is a symmetric banded matrix A of half-bandwidth w, stored by
// rows (band[p*(w+1) + p-q] holds A[p][q] for p-w <= q <= p), and the
// diagonal mass matrix of A u = lambda M u.
type banded struct {
	n, w int
	band []float64
	mass []float64
}

func newBanded(n, w int) *banded {
	return &banded{n: n, w: w, band: make([]float64, n*(w+1)), mass: make([]float64, n)}
}

// add adds v to A[p][q] (and so to A[q][p]); p and q in either order.
func (m *banded) add(p, q int, v float64) {
	if q > p {
		p, q = q, p
	}
	m.band[p*(m.w+1)+p-q] += v
}

// lowest returns the lowest eigenvalue of A u = lambda M u by inverse
// iteration with the banded Cholesky factor A = L L^T.
func (m *banded) lowest() (float64, error) {
	n, w, band := m.n, m.w, m.band
	if n == 0 {
		return 0, fmt.Errorf("fdref: no unknowns on this grid")
	}
	for p := range n {
		for q := max(0, p-w); q <= p; q++ {
			s := band[p*(w+1)+p-q]
			for k := max(0, p-w, q-w); k < q; k++ {
				s -= band[p*(w+1)+p-k] * band[q*(w+1)+q-k]
			}
			if q == p {
				if !(s > 0) {
					return 0, fmt.Errorf("fdref: the operator is not positive definite (pivot %g at %d)", s, p)
				}
				band[p*(w+1)] = math.Sqrt(s)
			} else {
				band[p*(w+1)+p-q] = s / band[q*(w+1)]
			}
		}
	}
	solve := func(b []float64) {
		for p := range n {
			s := b[p]
			for k := max(0, p-w); k < p; k++ {
				s -= band[p*(w+1)+p-k] * b[k]
			}
			b[p] = s / band[p*(w+1)]
		}
		for p := n - 1; p >= 0; p-- {
			s := b[p]
			for k := p + 1; k <= min(n-1, p+w); k++ {
				s -= band[k*(w+1)+k-p] * b[k]
			}
			b[p] = s / band[p*(w+1)]
		}
	}
	x := make([]float64, n)
	for p := range x {
		x[p] = 1
	}
	y := make([]float64, n)
	var lambda float64
	for range 500 {
		for p := range y {
			y[p] = m.mass[p] * x[p]
		}
		solve(y) // y = A^-1 M x
		// Rayleigh quotient x^T M x / x^T M y estimates lambda since A y = M x.
		var num, den, s float64
		for p := range y {
			num += x[p] * m.mass[p] * x[p]
			den += x[p] * m.mass[p] * y[p]
			s += y[p] * y[p]
		}
		next := num / den
		s = math.Sqrt(s)
		for p := range x {
			x[p] = y[p] / s
		}
		if math.Abs(next-lambda) <= 1e-14*next {
			return next, nil
		}
		lambda = next
	}
	return lambda, nil
}

// Richardson extrapolates the eigenvalues lam[i] on the steps hs[i] to
// zero step, assuming the error falls as h^order, from the successive pairs
// (hs[0], hs[1]) and (hs[1], hs[2]): coarse and fine (Richardson 1911).
// Near a 270-degree metal edge the field goes as rho^(2/3) (Meixner 1972),
// so order is 4/3 for bodies with steps and 2 for smooth ones (Strang and
// Fix, An Analysis of the Finite Element Method, ch. 8, as recalled).
func Richardson(hs, lam [3]float64, order float64) (coarse, fine float64) {
	ex := func(i int) float64 {
		a, c := math.Pow(hs[i], order), math.Pow(hs[i+1], order)
		return (lam[i+1]*a - lam[i]*c) / (a - c)
	}
	return ex(0), ex(1)
}

// Safety widens the difference of successive Richardson extrapolations
// into a stated accuracy (common practice for Richardson estimates).
const Safety = 3
