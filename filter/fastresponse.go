package filter

import (
	"math"
	"math/cmplx"
)

// The modal form of the response for resonators of unequal loss.
//
// With unequal unloaded Q the resonator block of the network matrix,
// B = M_rr - j Delta_rr, is complex symmetric but not Hermitian, so the
// real eigendecomposition of the common-loss path does not apply. A complex
// symmetric matrix that is diagonalisable with no quasi-null eigenvectors
// has a complex orthogonal eigendecomposition B = V diag(lambda) V^T,
// V^T V = I (Horn & Johnson, Matrix Analysis, 2nd ed., Cambridge 2013,
// sec. 4.4, complex symmetric matrices; recalled from memory). It is found
// here by the cyclic Jacobi method with complex orthogonal plane rotations
// (c^2 + s^2 = 1, c and s complex), the real method of Golub & Van Loan,
// Matrix Computations, 4th ed., sec. 8.5, carried over unchanged to
// complex symmetric matrices (the formulas use only products, never
// conjugates). Then (Omega I + B)^-1 = V diag(1/(Omega + lambda)) V^T and
// the port Schur complement of the common-loss path holds with
//
//	C(Omega) = M_pp - j I - sum_k u_k u_k^T / (Omega + lambda_k),
//	u_k = (sum_i V_ik M_S,i , sum_i V_ik M_L,i)   (complex),
//
// (derived), so each frequency costs O(N). The rotations are not unitary:
// where one grows large (a nearly defective pair, two resonators of nearly
// equal frequency and very different loss) rounding is amplified, so the
// decomposition is refused and the LU path used when any rotation
// coefficient or the final residual exceeds the limits below. The LU path
// remains the reference; TestFastResponseMatchesLU holds the two to 1e-12
// on random seeded matrices.

// csymMaxRot is the largest |c| or |s| accepted in one complex orthogonal
// rotation: above it the pair is nearly defective and rounding would be
// amplified by about |c|^2.
const csymMaxRot = 10

// csymResidualTol is the largest relative residual
// max|B V - V diag(lambda)| / max|B| accepted for the decomposition.
const csymResidualTol = 1e-13

// csymSweeps bounds the Jacobi sweeps (quadratic convergence: a handful
// suffice for N <= MaxOrder).
const csymSweeps = 60

// csymEigen returns lambda and V (column k the k-th eigenvector, stored
// row-major r x r) with b = V diag(lambda) V^T, V^T V = I, for the complex
// symmetric r x r matrix b (row-major, overwritten). ok is false when the
// decomposition is refused (see csymMaxRot, csymResidualTol).
func csymEigen(b []complex128, r int) (lam, v []complex128, ok bool) {
	orig := append([]complex128(nil), b...)
	v = make([]complex128, r*r)
	for i := 0; i < r; i++ {
		v[i*r+i] = 1
	}
	scale := 0.0
	for _, x := range b {
		scale = math.Max(scale, cmplx.Abs(x))
	}
	if scale == 0 {
		scale = 1
	}
	converged := false
	for sweep := 0; sweep < csymSweeps; sweep++ {
		off := 0.0
		for p := 0; p < r; p++ {
			for q := p + 1; q < r; q++ {
				off += abs1(b[p*r+q])
			}
		}
		if off <= 1e-17*scale {
			converged = true
			break
		}
		for p := 0; p < r; p++ {
			for q := p + 1; q < r; q++ {
				bpq := b[p*r+q]
				if abs1(bpq) <= 1e-19*scale {
					continue
				}
				theta := (b[q*r+q] - b[p*r+p]) / (2 * bpq)
				sq := cmplx.Sqrt(theta*theta + 1)
				den := theta + sq
				if d2 := theta - sq; cmplx.Abs(d2) > cmplx.Abs(den) {
					den = d2
				}
				if den == 0 {
					return nil, nil, false
				}
				t := 1 / den
				c := 1 / cmplx.Sqrt(1+t*t)
				s := t * c
				if cmplx.Abs(c) > csymMaxRot || cmplx.Abs(s) > csymMaxRot || cmplx.IsNaN(c) || cmplx.IsNaN(s) {
					return nil, nil, false
				}
				b[p*r+p] -= t * bpq
				b[q*r+q] += t * bpq
				b[p*r+q], b[q*r+p] = 0, 0
				for k := 0; k < r; k++ {
					if k != p && k != q {
						bkp, bkq := b[k*r+p], b[k*r+q]
						np, nq := c*bkp-s*bkq, s*bkp+c*bkq
						b[k*r+p], b[p*r+k] = np, np
						b[k*r+q], b[q*r+k] = nq, nq
					}
					vkp, vkq := v[k*r+p], v[k*r+q]
					v[k*r+p], v[k*r+q] = c*vkp-s*vkq, s*vkp+c*vkq
				}
			}
		}
	}
	if !converged {
		return nil, nil, false
	}
	lam = make([]complex128, r)
	for i := range lam {
		lam[i] = b[i*r+i]
	}
	// Residual check on the original matrix.
	res := 0.0
	for i := 0; i < r; i++ {
		for k := 0; k < r; k++ {
			var s complex128
			for j := 0; j < r; j++ {
				s += orig[i*r+j] * v[j*r+k]
			}
			res = math.Max(res, cmplx.Abs(s-v[i*r+k]*lam[k]))
		}
	}
	if !(res <= csymResidualTol*scale*float64(r)) {
		return nil, nil, false
	}
	return lam, v, true
}

// initComplexModal sets up the complex modal form for unequal losses; on
// refusal the evaluator keeps to the LU path.
func (e *evaluator) initComplexModal() {
	n := e.n
	r := n - 2
	b := make([]complex128, r*r)
	for i := 0; i < r; i++ {
		for j := 0; j < r; j++ {
			b[i*r+j] = complex(0.5*(e.m[(i+1)*n+j+1]+e.m[(j+1)*n+i+1]), 0)
		}
		b[i*r+i] -= complex(0, e.loss[i])
	}
	lam, v, ok := csymEigen(b, r)
	if !ok {
		return
	}
	e.lam = lam
	e.cus = make([]complex128, r)
	e.cul = make([]complex128, r)
	for k := 0; k < r; k++ {
		for i := 0; i < r; i++ {
			e.cus[k] += v[i*r+k] * complex(e.m[i+1], 0)
			e.cul[k] += v[i*r+k] * complex(e.m[(n-1)*n+i+1], 0)
		}
	}
	e.mss, e.msl, e.mll = e.m[0], 0.5*(e.m[n-1]+e.m[(n-1)*n]), e.m[n*n-1]
	e.cmodal = true
}

// atComplexModal evaluates the complex modal form; ok is false within
// modalMinDist of a modal resonance, where the LU path takes over.
func (e *evaluator) atComplexModal(omega float64) (s11, s21, s22, ds21 complex128, ok bool) {
	var c11, c12, c22, d11, d12, d22 complex128
	w := complex(omega, 0)
	for k, l := range e.lam {
		z := w + l
		if abs1(z) < modalMinDist {
			return 0, 0, 0, 0, false
		}
		iz := 1 / z
		iz2 := iz * iz
		a, b := e.cus[k], e.cul[k]
		aa, ab, bb := a*a, a*b, b*b
		c11 += aa * iz
		c12 += ab * iz
		c22 += bb * iz
		d11 += aa * iz2
		d12 += ab * iz2
		d22 += bb * iz2
	}
	c11 = complex(e.mss, -1) - c11
	c12 = complex(e.msl, 0) - c12
	c22 = complex(e.mll, -1) - c22
	det := c11*c22 - c12*c12
	if det == 0 {
		return 0, 0, 0, 0, false
	}
	x11, x12, x22 := c22/det, -c12/det, c11/det
	s11 = -1 - 2i*x11
	s21 = -2i * x12
	s22 = -1 - 2i*x22
	t := x12*(d11*x11+d12*x12) + x22*(d12*x11+d22*x12)
	ds21 = 2i * t
	return s11, s21, s22, ds21, true
}

// recip is 1/z by the textbook formula conj(z)/|z|^2: no overflow guard,
// which the modal denominators (|z| >= modalMinDist, of order 1) never
// need, and several times cheaper than the scaled complex division.
func recip(z complex128) complex128 {
	re, im := real(z), imag(z)
	d := re*re + im*im
	return complex(re/d, -im/d)
}

// s11s21 returns S11 and S21 only (no S22, no derivative) by the cheapest
// path: the lean modal sums when the point is far enough from a modal
// resonance, else at. It is the inner loop of the Monte Carlo.
func (e *evaluator) s11s21(omega float64) (s11, s21 complex128) {
	var c11, c12, c22 complex128
	switch {
	case e.modal:
		for k, mu := range e.mu {
			z := complex(omega+mu, -e.d)
			if abs1(z) < modalMinDist {
				goto full
			}
			iz := recip(z)
			a, b := e.us[k], e.ul[k]
			c11 += complex(a*a, 0) * iz
			c12 += complex(a*b, 0) * iz
			c22 += complex(b*b, 0) * iz
		}
	case e.cmodal:
		w := complex(omega, 0)
		for k, l := range e.lam {
			z := w + l
			if abs1(z) < modalMinDist {
				goto full
			}
			iz := recip(z)
			a, b := e.cus[k], e.cul[k]
			c11 += a * a * iz
			c12 += a * b * iz
			c22 += b * b * iz
		}
	default:
		goto full
	}
	{
		c11 = complex(e.mss, -1) - c11
		c12 = complex(e.msl, 0) - c12
		c22 = complex(e.mll, -1) - c22
		det := c11*c22 - c12*c12
		if det != 0 {
			id := recip(det)
			return -1 - 2i*c22*id, 2i * c12 * id
		}
	}
full:
	s11, s21, _, _ = e.at(omega)
	return s11, s21
}

// db2 is 20 log10 |z| as 10 log10 |z|^2 (no square root).
func db2(z complex128) float64 {
	return 10 * math.Log10(real(z)*real(z)+imag(z)*imag(z))
}
