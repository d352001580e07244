package filter

import (
	"fmt"
	"math"
	"math/cmplx"

	"gonum.org/v1/gonum/mat"
)

// Point is the response of a filter at one frequency.
//
// S-parameters are for a reciprocal two-port (S12 = S21), normalised to the
// port reference impedance, in the convention of Response.
type Point struct {
	F     float64 // frequency, Hz
	Omega float64 // normalised lowpass frequency, LowpassOmega(F, f0, bw)

	S11, S21, S22 complex128

	// GroupDelay is the group delay of S21, -d arg(S21)/d omega, in
	// seconds, from the analytic derivative of the network matrix. It is
	// NaN where S21 is exactly zero.
	GroupDelay float64
}

// S11DB returns 20 log10 |S11| (-Inf where S11 = 0).
func (p Point) S11DB() float64 { return db(p.S11) }

// S21DB returns 20 log10 |S21| (-Inf where S21 = 0).
func (p Point) S21DB() float64 { return db(p.S21) }

// S22DB returns 20 log10 |S22|.
func (p Point) S22DB() float64 { return db(p.S22) }

// ReturnLoss returns -20 log10 |S11| in dB.
func (p Point) ReturnLoss() float64 { return -db(p.S11) }

// InsertionLoss returns -20 log10 |S21| in dB.
func (p Point) InsertionLoss() float64 { return -db(p.S21) }

// S11Deg returns the phase of S11 in degrees, in (-180, 180].
func (p Point) S11Deg() float64 { return deg(p.S11) }

// S21Deg returns the phase of S21 in degrees, in (-180, 180].
func (p Point) S21Deg() float64 { return deg(p.S21) }

// S22Deg returns the phase of S22 in degrees, in (-180, 180].
func (p Point) S22Deg() float64 { return deg(p.S22) }

func db(z complex128) float64  { return 20 * math.Log10(cmplx.Abs(z)) }
func deg(z complex128) float64 { return cmplx.Phase(z) * 180 / math.Pi }

// evaluator solves the network equations of one coupling matrix at many
// frequencies, reusing its work space.
//
// When every resonator has the same loss (or none) it uses the modal form
// (derived): with the resonator block M_rr = V diag(mu) V^T (gonum
// mat.EigenSym) the Schur complement of A onto the two ports is
//
//	C(Omega) = M_pp - j I - sum_k u_k u_k^T / (Omega - j d + mu_k),
//	u_k = (sum_i V_ik M_S,i , sum_i V_ik M_L,i),
//
// and [A^-1] restricted to the ports is C^-1, so each frequency costs O(N)
// instead of an O(N^3) factorisation. Otherwise, and within modalMinDist of
// a lossless modal resonance, it factorises A.
type evaluator struct {
	n     int
	m     []float64 // n*n coupling matrix
	loss  []float64 // per resonator, f0/(bw Q0)
	a     []complex128
	x0    []complex128
	xl    []complex128
	piv   []int
	pivok bool

	modal         bool
	d             float64   // common loss
	mu, us, ul    []float64 // eigenvalues and port projections
	mss, msl, mll float64

	// The complex modal form for unequal losses (fastresponse.go).
	cmodal   bool
	lam      []complex128
	cus, cul []complex128
}

func newEvaluator(m mat.Matrix, loss []float64) *evaluator {
	n, _ := m.Dims()
	e := &evaluator{n: n, m: make([]float64, n*n), loss: loss,
		a: make([]complex128, n*n), x0: make([]complex128, n), xl: make([]complex128, n), piv: make([]int, n)}
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			e.m[i*n+j] = m.At(i, j)
		}
	}
	e.initModal()
	return e
}

func (e *evaluator) initModal() {
	n := e.n
	r := n - 2
	if len(e.loss) > 0 {
		for _, d := range e.loss {
			if d != e.loss[0] {
				e.initComplexModal()
				return
			}
		}
		e.d = e.loss[0]
	}
	b := mat.NewSymDense(r, nil)
	for i := 0; i < r; i++ {
		for j := i; j < r; j++ {
			b.SetSym(i, j, 0.5*(e.m[(i+1)*n+j+1]+e.m[(j+1)*n+i+1]))
		}
	}
	var es mat.EigenSym
	if !es.Factorize(b, true) {
		return
	}
	e.mu = es.Values(nil)
	var v mat.Dense
	es.VectorsTo(&v)
	e.us = make([]float64, r)
	e.ul = make([]float64, r)
	for k := 0; k < r; k++ {
		for i := 0; i < r; i++ {
			e.us[k] += v.At(i, k) * e.m[i+1]
			e.ul[k] += v.At(i, k) * e.m[(n-1)*n+i+1]
		}
	}
	e.mss, e.msl, e.mll = e.m[0], 0.5*(e.m[n-1]+e.m[(n-1)*n]), e.m[n*n-1]
	e.modal = true
}

// modalMinDist is the smallest modal denominator |Omega - j d + mu_k|
// (|Re| + |Im|, normalised units, where couplings are of order 1) at which
// the modal form is used: nearer a lossless eigenvalue the 1/z terms of the
// 2x2 determinant cancel and cost digits (measured: 1e-13 in S and 1e-10
// relative in dS21/dOmega at 1.5 modalMinDist), so the full factorisation
// takes over.
const modalMinDist = 1e-2

// atModal evaluates the modal form; ok is false near a lossless modal
// resonance (see modalMinDist).
func (e *evaluator) atModal(omega float64) (s11, s21, s22, ds21 complex128, ok bool) {
	var c11, c12, c22, d11, d12, d22 complex128
	for k, mu := range e.mu {
		z := complex(omega+mu, -e.d)
		if abs1(z) < modalMinDist {
			return 0, 0, 0, 0, false
		}
		iz := 1 / z
		iz2 := iz * iz
		a, b := complex(e.us[k], 0), complex(e.ul[k], 0)
		c11 += a * a * iz
		c12 += a * b * iz
		c22 += b * b * iz
		d11 += a * a * iz2
		d12 += a * b * iz2
		d22 += b * b * iz2
	}
	c11 = complex(e.mss, -1) - c11
	c12 = complex(e.msl, 0) - c12
	c22 = complex(e.mll, -1) - c22
	det := c11*c22 - c12*c12
	if det == 0 {
		return 0, 0, 0, 0, false
	}
	x11, x12, x22 := c22/det, -c12/det, c11/det // C^-1, symmetric
	s11 = -1 - 2i*x11
	s21 = -2i * x12
	s22 = -1 - 2i*x22
	// d(C^-1)/dOmega = -C^-1 (dC/dOmega) C^-1 with dC/dOmega = D.
	t := x12*(d11*x11+d12*x12) + x22*(d12*x11+d22*x12) // (X D X)_{21}
	ds21 = 2i * t
	return s11, s21, s22, ds21, true
}

// at solves A x = e_0 and A y = e_{N+1} with
// A = Omega W - j R - j Delta + M and returns S11, S21, S22 and dS21/dOmega.
func (e *evaluator) at(omega float64) (s11, s21, s22, ds21 complex128) {
	if e.modal {
		var ok bool
		if s11, s21, s22, ds21, ok = e.atModal(omega); ok {
			e.pivok = true
			return
		}
	}
	if e.cmodal {
		var ok bool
		if s11, s21, s22, ds21, ok = e.atComplexModal(omega); ok {
			e.pivok = true
			return
		}
	}
	return e.atLU(omega)
}

// atLU is at by LU factorisation of the full matrix.
func (e *evaluator) atLU(omega float64) (s11, s21, s22, ds21 complex128) {
	n := e.n
	a := e.a
	for k, v := range e.m {
		a[k] = complex(v, 0)
	}
	a[0] -= 1i
	a[n*n-1] -= 1i
	for k := 1; k < n-1; k++ {
		d := 0.0
		if e.loss != nil {
			d = e.loss[k-1]
		}
		a[k*n+k] += complex(omega, -d)
	}
	// LU factorisation with partial pivoting.
	e.pivok = true
	for c := 0; c < n; c++ {
		p, best := c, abs1(a[c*n+c])
		for r := c + 1; r < n; r++ {
			if v := abs1(a[r*n+c]); v > best {
				p, best = r, v
			}
		}
		e.piv[c] = p
		if best == 0 {
			e.pivok = false
			nan := cmplx.NaN()
			return nan, nan, nan, nan
		}
		if p != c {
			for j := 0; j < n; j++ {
				a[c*n+j], a[p*n+j] = a[p*n+j], a[c*n+j]
			}
		}
		inv := 1 / a[c*n+c]
		for r := c + 1; r < n; r++ {
			f := a[r*n+c] * inv
			if f == 0 {
				continue
			}
			a[r*n+c] = f
			for j := c + 1; j < n; j++ {
				a[r*n+j] -= f * a[c*n+j]
			}
		}
	}
	e.solve(e.x0, 0)
	e.solve(e.xl, n-1)
	x, y := e.x0, e.xl
	s11 = -1 - 2i*x[0]   // derived: shunt-resonator form, see Response
	s21 = -2i * x[n-1]   // Cameron, Kudsia & Mansour 2007, ch. 8
	s22 = -1 - 2i*y[n-1] // as S11
	var sum complex128
	for k := 1; k < n-1; k++ {
		sum += x[k] * y[k]
	}
	ds21 = 2i * sum // dA^-1/dOmega = -A^-1 W A^-1 (derived)
	return
}

// abs1 is |Re z| + |Im z|, the cheap pivot size.
func abs1(z complex128) float64 { return math.Abs(real(z)) + math.Abs(imag(z)) }

func (e *evaluator) solve(x []complex128, unit int) {
	n := e.n
	a := e.a
	for i := range x {
		x[i] = 0
	}
	x[unit] = 1
	for c := 0; c < n; c++ {
		if p := e.piv[c]; p != c {
			x[c], x[p] = x[p], x[c]
		}
	}
	for r := 1; r < n; r++ {
		s := x[r]
		for j := 0; j < r; j++ {
			s -= a[r*n+j] * x[j]
		}
		x[r] = s
	}
	for r := n - 1; r >= 0; r-- {
		s := x[r]
		for j := r + 1; j < n; j++ {
			s -= a[r*n+j] * x[j]
		}
		x[r] = s / a[r*n+r]
	}
}

// matrixSymTol is the relative asymmetry accepted in a coupling matrix:
// rounding in a caller's own transformations, far below any physical
// coupling.
const matrixSymTol = 1e-9

func checkMatrix(m mat.Matrix) (int, error) {
	if m == nil {
		return 0, fmt.Errorf("filter: coupling matrix is nil")
	}
	r, c := m.Dims()
	if r != c || r < 3 || r > MaxOrder+2 {
		return 0, fmt.Errorf("filter: coupling matrix must be square (N+2)x(N+2) with N in 1..%d, got %dx%d", MaxOrder, r, c)
	}
	scale := 0.0
	for i := 0; i < r; i++ {
		for j := 0; j < r; j++ {
			v := m.At(i, j)
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return 0, fmt.Errorf("filter: coupling matrix entry (%d,%d) must be finite, got %g", i, j, v)
			}
			scale = math.Max(scale, math.Abs(v))
		}
	}
	for i := 0; i < r; i++ {
		for j := i + 1; j < r; j++ {
			if d := math.Abs(m.At(i, j) - m.At(j, i)); d > matrixSymTol*scale {
				return 0, fmt.Errorf("filter: coupling matrix must be symmetric, entries (%d,%d) = %g and (%d,%d) = %g differ", i, j, m.At(i, j), j, i, m.At(j, i))
			}
		}
	}
	return r - 2, nil
}

// lossTerms converts unloaded Q values to the normalised loss f0/(bw Q0).
func lossTerms(n int, f0, bw float64, q0 []float64) ([]float64, error) {
	if len(q0) == 0 {
		return nil, nil
	}
	if len(q0) != n {
		return nil, fmt.Errorf("filter: need one unloaded Q per resonator (%d) or none for a lossless response, got %d values", n, len(q0))
	}
	loss := make([]float64, n)
	for i, q := range q0 {
		if !(q > 0) {
			return nil, fmt.Errorf("filter: unloaded Q of resonator %d must be > 0 (+Inf for lossless), got %g", i+1, q)
		}
		loss[i] = f0 / (bw * q) // Cameron, Kudsia & Mansour 2007, ch. 8; Hong & Lancaster 2001, sec. 8.1
	}
	return loss, nil
}

// Response computes the two-port response of the (N+2)x(N+2) normalised
// coupling matrix m of a bandpass filter with centre f0 and bandwidth bw
// (Hz, 0 < bw < f0) at the frequencies freqs (Hz, each > 0; any order, the
// result keeps it).
//
// Convention. With the lowpass-to-bandpass mapping
// Omega = (f0/bw)(f/f0 - f0/f) (LowpassOmega) the network matrix is
//
//	A = Omega W - j R - j Delta + M,
//
// W = diag(0, 1, ..., 1, 0), R = diag(1, 0, ..., 0, 1) the unit source and
// load terminations, Delta = diag(0, d_1, ..., d_N, 0) with
// d_i = f0/(bw Q0_i) the loss of resonator i of unloaded quality factor Q0_i
// (Cameron, Kudsia & Mansour 2007, ch. 8; Hong & Lancaster 2001, sec. 8.1:
// s -> s + d_i), and
//
//	S21 = S12 = -2j [A^-1]_{N+1,0},
//	S11 = -1 - 2j [A^-1]_{0,0},   S22 = -1 - 2j [A^-1]_{N+1,N+1}.
//
// This is the network of shunt resonators coupled by admittance inverters
// of value M_ij and driven through unit conductances (derived from the node
// equations; S21 is the form of Cameron, Kudsia & Mansour, the sign of S11
// is the shunt-network one, S11 -> +1 far from the band). It matches the
// polynomial convention of Design: S11 = F/(EpsR E), S21 = P/(Eps E).
//
// The group delay -d arg S21/d omega = -Im(S21'/S21) (1 + f0^2/f^2)/(2 pi bw)
// uses the exact derivative dS21/dOmega = 2j [A^-1 W A^-1]_{N+1,0}
// (derived), not a finite difference.
//
// q0 gives one unloaded Q per resonator (+Inf allowed), or is empty for a
// lossless response. The cost is O(N) per frequency through a modal
// decomposition (real for a common Q0, complex orthogonal for unequal Q0,
// see fastresponse.go), and one complex LU factorisation of size N+2 where
// the decomposition is refused or a point lies near a modal resonance. Errors name the bad argument; a matrix that is singular at
// some frequency (a resonator isolated from both ports) is an error too.
func Response(m mat.Matrix, f0, bw float64, freqs, q0 []float64) ([]Point, error) {
	n, err := checkMatrix(m)
	if err != nil {
		return nil, err
	}
	if !(f0 > 0) || math.IsInf(f0, 0) {
		return nil, fmt.Errorf("filter: centre frequency must be > 0 Hz and finite, got %g Hz", f0)
	}
	if !(bw > 0 && bw < f0) {
		return nil, fmt.Errorf("filter: bandwidth must be > 0 Hz and < f0 = %g Hz, got %g Hz", f0, bw)
	}
	loss, err := lossTerms(n, f0, bw, q0)
	if err != nil {
		return nil, err
	}
	for i, f := range freqs {
		if !(f > 0) || math.IsInf(f, 0) {
			return nil, fmt.Errorf("filter: frequency %d must be > 0 Hz and finite, got %g Hz", i+1, f)
		}
	}
	ev := newEvaluator(m, loss)
	pts := make([]Point, len(freqs))
	for i, f := range freqs {
		w := LowpassOmega(f, f0, bw)
		s11, s21, s22, ds := ev.at(w)
		if !ev.pivok {
			return nil, fmt.Errorf("filter: coupling matrix network is singular at %g Hz (Omega = %g); is a resonator coupled to neither port?", f, w)
		}
		gd := math.NaN()
		if s21 != 0 {
			dOmegaDf := (1 + (f0/f)*(f0/f)) / bw
			gd = -imag(ds/s21) * dOmegaDf / (2 * math.Pi)
		}
		pts[i] = Point{F: f, Omega: w, S11: s11, S21: s21, S22: s22, GroupDelay: gd}
	}
	return pts, nil
}

// Response computes the response of the design's folded coupling matrix at
// freqs (Hz) with one unloaded Q per resonator in q0 (empty for lossless);
// see the package-level Response for the convention.
func (d *Design) Response(freqs, q0 []float64) ([]Point, error) {
	return Response(d.Folded, d.Spec.F0, d.Spec.BW, freqs, q0)
}
