package filter

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"

	"gonum.org/v1/gonum/mat"
)

// Polynomials are slices of coefficients in ascending powers.

// polyFromRoots returns the monic polynomial prod (x - r_k).
func polyFromRoots(roots []complex128) []complex128 {
	p := make([]complex128, 1, len(roots)+1)
	p[0] = 1
	for _, r := range roots {
		p = append(p, 0)
		for k := len(p) - 1; k >= 1; k-- {
			p[k] = p[k-1] - r*p[k]
		}
		p[0] = -r * p[0]
	}
	return p
}

// prodEvalReal returns p(z) and p'(z) of the monic p = prod (z - r_k) with
// real roots r_k, evaluated in product form, which keeps full relative
// accuracy near clustered roots where the monomial form loses it.
func prodEvalReal(roots []float64, z complex128) (v, d complex128) {
	v = 1
	for _, r := range roots {
		w := z - complex(r, 0)
		d = d*w + v
		v *= w
	}
	return v, d
}

// companionRoots returns the roots of the polynomial p (complex
// coefficients, ascending, p[len-1] != 0) as the eigenvalues of its
// companion matrix. Complex coefficients are handled through the real
// 2n x 2n embedding [[Re C, -Im C], [Im C, Re C]], whose eigenvalues are the
// roots of p together with their complex conjugates; both sets are returned
// (2n values) when any coefficient is complex, n values otherwise.
// The eigenvalues come from gonum's mat.Eigen (LAPACK dgeev).
func companionRoots(p []complex128) ([]complex128, error) {
	n := len(p) - 1
	if n < 1 {
		return nil, errors.New("filter: internal: polynomial of degree < 1 has no roots")
	}
	lead := p[n]
	if lead == 0 {
		return nil, errors.New("filter: internal: zero leading coefficient")
	}
	isReal := true
	for _, c := range p {
		if imag(c) != 0 {
			isReal = false
			break
		}
	}
	// Companion matrix C: first row -p[n-1-k]/lead, ones on the subdiagonal.
	cc := make([]complex128, n*n)
	for k := 0; k < n; k++ {
		cc[k] = -p[n-1-k] / lead
	}
	for i := 1; i < n; i++ {
		cc[i*n+i-1] = 1
	}
	var a *mat.Dense
	if isReal {
		a = mat.NewDense(n, n, nil)
		for i := 0; i < n; i++ {
			for j := 0; j < n; j++ {
				a.Set(i, j, real(cc[i*n+j]))
			}
		}
	} else {
		a = mat.NewDense(2*n, 2*n, nil)
		for i := 0; i < n; i++ {
			for j := 0; j < n; j++ {
				re, im := real(cc[i*n+j]), imag(cc[i*n+j])
				a.Set(i, j, re)
				a.Set(i+n, j+n, re)
				a.Set(i, j+n, -im)
				a.Set(i+n, j, im)
			}
		}
	}
	var eig mat.Eigen
	if !eig.Factorize(a, mat.EigenNone) {
		return nil, errors.New("filter: internal: companion eigenvalue iteration did not converge")
	}
	return eig.Values(nil), nil
}

// aberth refines the simultaneous approximations z of all roots of a
// polynomial by the Aberth-Ehrlich iteration (O. Aberth, "Iteration methods
// for finding all zeros of a polynomial simultaneously", Math. Comp. 27
// (1973) 339-344), f returning the value and derivative at a point. It
// stops when every correction is below 4 eps |z_k| (plus a tiny absolute
// floor); if that does not happen in 100 sweeps it accepts the result when
// every Newton correction |f/f'| is below accept relative to max(1, |z_k|),
// and reports an error otherwise.
func aberth(f func(z complex128) (v, d complex128), z []complex128, accept float64) error {
	const eps = 0x1p-52
	for it := 0; it < 100; it++ {
		done := true
		for k := range z {
			v, d := f(z[k])
			if v == 0 {
				continue
			}
			if d == 0 {
				d = complex(eps, 0) // step off a critical point
			}
			ratio := v / d
			var sum complex128
			for j := range z {
				if j != k {
					sum += 1 / (z[k] - z[j])
				}
			}
			w := ratio / (1 - ratio*sum)
			if cmplx.IsNaN(w) || cmplx.IsInf(w) {
				return fmt.Errorf("filter: internal: root iteration produced %v", w)
			}
			z[k] -= w
			if cmplx.Abs(w) > 4*eps*cmplx.Abs(z[k])+1e-300 {
				done = false
			}
		}
		if done {
			return nil
		}
	}
	// Rounding can keep the last bit toggling; accept if the residual
	// corrections are at the level of a few ulps.
	for k := range z {
		v, d := f(z[k])
		if v != 0 && !(cmplx.Abs(v/d) <= accept*math.Max(1, cmplx.Abs(z[k]))) {
			return fmt.Errorf("filter: internal: polynomial root iteration did not converge (step %.2g at %v)", cmplx.Abs(v/d), z[k])
		}
	}
	return nil
}
