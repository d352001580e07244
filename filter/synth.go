package filter

import (
	"fmt"
	"math"
	"math/cmplx"
	"slices"

	"gonum.org/v1/gonum/mat"
)

// Design is a synthesised bandpass filter: its prototype, the polynomials of
// its lossless response, and its normalised coupling matrices.
//
// Polynomial convention (Cameron 1999; Cameron, Kudsia & Mansour 2007,
// ch. 6): in the complex lowpass variable s = j Omega,
//
//	S11(s) = F(s) / (EpsR E(s)),   S21(s) = P(s) / (Eps E(s)),
//
// with F and E monic of degree N, P of degree len(Zeros) with leading
// coefficient +-1, multiplied by j when N - len(Zeros) is even (which makes
// the S-matrix unitary with S22 = S11 here); the overall sign of P is the one
// that makes M_NL of the folded matrix positive. E is strictly Hurwitz and
// EpsR = 1 unless the response is fully canonical (len(Zeros) = N). |F|^2/EpsR^2 + |P|^2/Eps^2 = |E|^2 on the
// imaginary axis. Coefficients are stored in ascending powers of s.
//
// The coupling matrices follow the convention of Response; rows and
// columns are ordered source (0), resonators 1..N, load (N+1), and they are
// normalised to unit bandwidth (bandpass coupling k_ij = FBW M_ij,
// Qext = 1/(FBW M_S1^2)).
type Design struct {
	// Spec is the specification with defaults filled in: Order set, and
	// for Chebyshev both ReturnLoss and Ripple.
	Spec Spec
	// FBW is the fractional bandwidth BW/F0.
	FBW float64

	// G holds the lowpass element values g_0..g_{N+1} of an all-pole design
	// (no Zeros), nil otherwise.
	G []float64
	// K holds the main-line bandpass coupling coefficients
	// k_{i,i+1} = FBW M_{i,i+1}, i = 1..N-1 (N-1 values), read from Folded
	// (for all-pole designs identical to Couplings(G, FBW)). Cross couplings
	// are FBW times the other off-diagonal entries of Folded.
	K []float64
	// QextIn and QextOut are the external quality factors of the first and
	// last resonator, 1/(FBW M_S1^2) and 1/(FBW M_NL^2).
	QextIn, QextOut float64

	// Zeros are the finite transmission zeros (normalised Omega), as given.
	Zeros []float64
	// RealPairs are the real-axis zero pairs s = -+sigma (normalised), as
	// given in Spec.RealPairs, for group-delay equalisation (pairs.go).
	RealPairs []float64
	// ReflectionZeros are the N real frequencies (normalised Omega) where
	// the lossless S11 vanishes, ascending.
	ReflectionZeros []float64
	// Poles are the N roots of E(s), in the left half s-plane.
	Poles []complex128
	// Eps and EpsR are the polynomial normalisation constants.
	Eps, EpsR float64
	// F, P and E are the polynomials of the lossless response, ascending
	// powers of s.
	F, P, E []complex128

	// Transversal is the (N+2)x(N+2) transversal coupling matrix: every
	// resonator coupled to source and load only (plus M_SL when canonical),
	// resonators ordered by ascending resonant frequency -M_kk, M_Lk > 0.
	Transversal *mat.Dense
	// Folded is the same network reduced to the folded canonical form
	// (see InFoldedPattern), M_S1, M_NL and the main line non-negative.
	// A design from Rearranged, FromMatrix or a matrix file holds its own
	// matrix here, in the pattern Topology names.
	Folded *mat.Dense
	// Topology is the coupling pattern of Folded; the zero value is the
	// folded canonical form.
	Topology Topology
}

// MatrixZero is the magnitude below which an entry of a synthesised
// coupling matrix is rounding left by the plane rotations (about 1e-13;
// see the package documentation), not a coupling: Entry returns it as 0,
// and the outputs print and draw it as no coupling.
const MatrixZero = 1e-9

// Entry returns M_ij of the folded matrix as the outputs show it: read from
// the upper triangle, so that the printed matrix is exactly symmetric (the
// rotations leave the two triangles apart by rounding) and k = FBW M holds
// for the printed values, with |M| < MatrixZero set to 0.
func (d *Design) Entry(i, j int) float64 {
	if i > j {
		i, j = j, i
	}
	v := d.Folded.At(i, j)
	if math.Abs(v) < MatrixZero {
		return 0
	}
	return v
}

// Order returns the number of resonators N.
func (d *Design) Order() int { return d.Spec.Order }

// Coupling returns the bandpass coupling FBW * M_ij between rows i and j of
// the folded matrix (0 = source, N+1 = load). i and j outside 0..N+1 give
// NaN.
func (d *Design) Coupling(i, j int) float64 {
	n := d.Spec.Order + 2
	if i < 0 || j < 0 || i >= n || j >= n {
		return math.NaN()
	}
	return d.FBW * d.Folded.At(i, j)
}

// Synthesize designs the filter of spec:
//
//  1. choose the order (Spec.MinOrder) when Spec.Order is 0;
//  2. all-pole designs: the prototype element values (ButterworthG,
//     ChebyshevG) and the coupled-resonator values (Couplings);
//  3. the filtering function: Butterworth, or the generalised Chebyshev
//     function with the prescribed zeros (Cameron 1999), giving the
//     reflection zeros, Eps, EpsR and the polynomials F, P and E;
//  4. the transversal coupling matrix from the residues of the admittance
//     parameters (Cameron, Kudsia & Mansour 2007, ch. 8; Cameron 2003);
//  5. its reduction to the folded canonical form by plane rotations
//     (Cameron 1999; Cameron, Kudsia & Mansour 2007, sec. 8.3);
//  6. a self-check: the folded matrix response must reproduce the target
//     response at the reflection zeros, ripple peaks and transmission
//     zeros, else an error reports the lost accuracy.
//
// Invalid specifications give an error naming the offending value and the
// valid range. The folded matrix reproduces the polynomial response to
// about 1e-13 for N <= 12 and better than 1e-12 up to MaxOrder (checked
// against selfCheckTol on every call).
func Synthesize(spec Spec) (*Design, error) {
	s, err := spec.normalized()
	if err != nil {
		return nil, err
	}
	if s.Order == 0 {
		n, err := s.minOrder()
		if err != nil {
			return nil, err
		}
		s.Order = n
	}
	n := s.Order
	if err := checkZerosP(n, s.Zeros, s.RealPairs); err != nil {
		return nil, err
	}
	d := &Design{Spec: s, FBW: s.BW / s.F0, Zeros: slices.Clone(s.Zeros), RealPairs: slices.Clone(s.RealPairs)}
	s.Zeros = d.Zeros
	d.Spec.Zeros = d.Zeros
	d.Spec.Rejections = slices.Clone(spec.Rejections)

	var fr []float64    // reflection zeros
	var er []complex128 // E roots in Omega (upper half plane)
	var eps, epsR float64 = 1, 1
	a := 0 // P is multiplied by j^a
	nz := len(s.Zeros) + 2*len(s.RealPairs)
	if (n-nz)%2 == 0 {
		a = 1
	}
	switch s.Family {
	case Butterworth:
		if d.G, err = ButterworthG(n); err != nil {
			return nil, err
		}
		// |S21|^2 = 1/(1 + Omega^2N) (MYJ sec. 4.03): F = s^N, P = j^a,
		// Eps = 1, and the left-half-plane roots of 1 + (s/j)^2N, the poles
		// s_k = exp(j pi (2k+N-1)/(2N)) (derived).
		fr = make([]float64, n)
		er = make([]complex128, n)
		for k := 1; k <= n; k++ {
			sk := cmplx.Exp(complex(0, math.Pi*float64(2*k+n-1)/float64(2*n)))
			er[k-1] = sk / 1i // Omega = s/j
		}
	case Chebyshev:
		if nz == 0 {
			if d.G, err = ChebyshevG(n, s.Ripple); err != nil {
				return nil, err
			}
		}
		fr = reflectionZerosP(n, s.Zeros, s.RealPairs)
		eps, epsR = chebyshevEps(n, fr, s.Zeros, s.RealPairs, s.ReturnLoss)
		if er, err = chebyshevPoles(fr, s.Zeros, s.RealPairs, eps, epsR); err != nil {
			return nil, err
		}
	}
	d.ReflectionZeros = fr
	d.Eps, d.EpsR = eps, epsR
	d.Poles = make([]complex128, n)
	for k, z := range er {
		d.Poles[k] = 1i * z
	}
	slices.SortFunc(d.Poles, func(x, y complex128) int { return cmpComplex(x, y) })
	d.E = polyFromRoots(d.Poles)
	jr := make([]complex128, n)
	for k, r := range fr {
		jr[k] = complex(0, r)
	}
	d.F = polyFromRoots(jr)
	jz := make([]complex128, 0, nz)
	for _, z := range s.Zeros {
		jz = append(jz, complex(0, z))
	}
	for _, sg := range s.RealPairs {
		jz = append(jz, complex(-sg, 0), complex(sg, 0))
	}
	d.P = polyFromRoots(jz)
	if a == 1 {
		for k := range d.P {
			d.P[k] *= 1i
		}
	}

	t, err := transversal(fr, s.Zeros, s.RealPairs, er, eps, epsR, a)
	if err != nil {
		return nil, err
	}
	d.Transversal = denseFrom(t)
	fold(t)
	alignSigns(t)
	if t[n][n+1] < 0 {
		// Make M_NL positive too: negating the load row of the folded
		// matrix, the source row of the transversal matrix and P changes
		// the sign of S21 consistently in all three (a reference-plane
		// choice; Cameron's P is defined up to this sign).
		for i := 0; i <= n; i++ {
			t[i][n+1], t[n+1][i] = -t[i][n+1], -t[n+1][i]
		}
		for i := 1; i < n+2; i++ {
			d.Transversal.Set(0, i, -d.Transversal.At(0, i))
			d.Transversal.Set(i, 0, -d.Transversal.At(i, 0))
		}
		for k := range d.P {
			d.P[k] = -d.P[k]
		}
	}
	d.Folded = denseFrom(t)

	d.K = make([]float64, n-1)
	for i := 1; i < n; i++ {
		d.K[i-1] = d.FBW * t[i][i+1]
	}
	d.QextIn = 1 / (d.FBW * t[0][1] * t[0][1])
	d.QextOut = 1 / (d.FBW * t[n][n+1] * t[n][n+1])
	if err := d.selfCheck(); err != nil {
		return nil, err
	}
	return d, nil
}

func cmpComplex(x, y complex128) int {
	switch {
	case imag(x) < imag(y):
		return -1
	case imag(x) > imag(y):
		return 1
	case real(x) < real(y):
		return -1
	case real(x) > real(y):
		return 1
	}
	return 0
}

// chebyshevEps returns Eps and EpsR for the generalised Chebyshev response
// with return loss rl dB at the ripple peaks (Cameron, Kudsia & Mansour 2007,
// ch. 6):
//
//	Eps = (1/sqrt(10^(RL/10) - 1)) |P(s)/F(s)| at s = j   (EpsR = 1),
//
// and, fully canonical, with rho the same expression,
// Eps = sqrt(1 + rho^2), EpsR = Eps/rho (= Eps/sqrt(Eps^2 - 1)).
func chebyshevEps(n int, fr, zeros, pairs []float64, rl float64) (eps, epsR float64) {
	e1 := 1 / math.Sqrt(math.Expm1(rl*math.Ln10/10))
	f1, _ := prodEvalReal(fr, 1)
	p1, _ := prodEvalZ(zeros, pairs, 1)
	rho := e1 * cmplx.Abs(p1) / cmplx.Abs(f1)
	if len(zeros)+2*len(pairs) < n {
		return rho, 1
	}
	eps = math.Sqrt(1 + rho*rho)
	return eps, eps / rho
}

// chebyshevPoles returns the N roots, in the upper half Omega-plane, of
// E(j Omega) for the generalised Chebyshev response: the roots of
// H(Omega) = F(Omega)^2/EpsR^2 + P(Omega)^2/Eps^2 (real polynomials F, P
// with the reflection and transmission zeros as roots) that lie in the upper
// half plane (left half s-plane). Starting values are the eigenvalues of the
// companion matrix of F/EpsR + j P/Eps in its real 2N x 2N embedding, which
// are the roots of H (the alternating-pole relation, Cameron, Kudsia &
// Mansour 2007, ch. 6); they are refined by the Aberth iteration with H
// evaluated in product form, which keeps full accuracy to N = 30.
func chebyshevPoles(fr, zeros, pairs []float64, eps, epsR float64) ([]complex128, error) {
	n := len(fr)
	frc := make([]complex128, n)
	for k, r := range fr {
		frc[k] = complex(r, 0)
	}
	zc := make([]complex128, 0, len(zeros)+2*len(pairs))
	for _, z := range zeros {
		zc = append(zc, complex(z, 0))
	}
	for _, sg := range pairs {
		zc = append(zc, complex(0, sg), complex(0, -sg))
	}
	fp := polyFromRoots(frc)
	pp := polyFromRoots(zc)
	g := make([]complex128, n+1)
	for k := range fp {
		g[k] += fp[k] / complex(epsR, 0)
	}
	for k := range pp {
		g[k] += 1i * pp[k] / complex(eps, 0)
	}
	z, err := companionRoots(g)
	if err != nil {
		return nil, err
	}
	h := func(x complex128) (complex128, complex128) {
		f, df := prodEvalReal(fr, x)
		p, dp := prodEvalZ(zeros, pairs, x)
		ie := complex(1/(epsR*epsR), 0)
		ip := complex(1/(eps*eps), 0)
		return f*f*ie + p*p*ip, 2 * (f*df*ie + p*dp*ip)
	}
	if err := aberth(h, z, rootAccept); err != nil {
		return nil, err
	}
	var up []complex128
	for _, x := range z {
		if imag(x) > 0 {
			up = append(up, x)
		}
	}
	if len(up) != n {
		return nil, fmt.Errorf("filter: internal: found %d poles in the left half plane, want %d", len(up), n)
	}
	return up, nil
}

// rootAccept is the relative Newton step at which pole iterations that did
// not settle to the last bit are still accepted (clustered roots toggle in
// the last bits).
const rootAccept = 1e-12

// transversal builds the (N+2)x(N+2) transversal coupling matrix from the
// reflection zeros fr, transmission zeros tz, E roots er (upper half
// Omega-plane), Eps, EpsR and the j-power a of P.
//
// In the convention of Response the matrix gives the short-circuit
// admittances (the residue form of Cameron, Kudsia & Mansour 2007, ch. 8,
// and Cameron 2003, y21 = j K_inf + sum r21k/(s - j lambda_k))
//
//	y22(s) = sum_k M_Lk^2/(s - j lambda_k),
//	y21(s) = j M_SL + sum_k M_Sk M_Lk/(s - j lambda_k),  lambda_k = -M_kk.
//
// From S = (I - y)(I + y)^-1 with S11 = S22 = F/(EpsR E), S21 = P/(Eps E)
// and unitarity (derived):
//
//	y22 = (E - (-1)^N E*) / D,  y21 = -2 (P/Eps) / D,
//	D   = E + (-1)^N E* + 2 F/EpsR,
//
// E* the paraconjugate. On s = j Omega, with E_O(Omega) = prod(Omega - e_k)
// and the real polynomials F_O, P_O of the reflection and transmission
// zeros, D(j Omega) = 2 j^N (Re E_O + F_O/EpsR): the poles l_k of y22 and
// y21 are the N real roots of D_O = Re E_O + F_O/EpsR, and
// M_SL = -j^(a+nz-N-1) / (Eps (1 + 1/EpsR)) when nz = N (zero otherwise).
//
// Those roots come in pairs that draw exponentially close at the band
// edges as N grows (2.4e-5 apart at N = 30), where D_O' is small and a
// direct root search loses digits. So (derived) with
// G = F_O/EpsR + j P_O/Eps, whose modulus equals |E_O| on the real axis and
// whose roots g split into a set U in the upper and a set L in the lower
// half plane (E_O has the roots U and conj(L)), write E_O = |G| e^(j phi),
// G = |G| e^(j psi). Then D_O = 2|G| cos((phi+psi)/2) cos((phi-psi)/2), and
// every pole is a simple root of one of two phase equations:
//
//	A: phi + psi = arg(lead G) + 2 sum_{g in U} arg(Omega - g)       = pi (mod 2 pi),
//	B: phi - psi = -arg(lead G) + 2 sum_{g in L} arg(Omega - conj g) = pi (mod 2 pi).
//
// Each left side increases monotonically, by 2 pi per root in U (A) or L
// (B), so the |U| + |L| = N poles are found by bisection, one per odd
// multiple of pi, to the last bit. The residues follow from the same
// algebra as r22k = 1/u'(l_k) and r21k = +-j^(a+nz+1-N)/u'(l_k) (+ on
// branch A), with the slopes
//
//	u_A' = 2 sum_{g in U} Im g/|l - g|^2,  u_B' = 2 sum_{g in L} |Im g|/|l - g|^2,
//
// sums of positive terms. Then M_Lk = sqrt(r22k), M_Sk = r21k/M_Lk,
// M_kk = -l_k. The matrix is accurate to about 1e-14 up to N = 30.
func transversal(fr, tz, pairs []float64, er []complex128, eps, epsR float64, a int) ([][]float64, error) {
	n := len(fr)
	nz := len(tz) + 2*len(pairs)
	ieps := 1 / eps
	gEval := func(z complex128) (complex128, complex128) {
		f, df := prodEvalReal(fr, z)
		p, dp := prodEvalZ(tz, pairs, z)
		return f/complex(epsR, 0) + 1i*p*complex(ieps, 0), df/complex(epsR, 0) + 1i*dp*complex(ieps, 0)
	}
	// Split the roots of G: e is a root of G (set U) or conj(e) is (set L);
	// the one with the smaller Newton distance is the root.
	var up, lo []complex128 // U, and conj(L) (upper half plane)
	for _, e := range er {
		g1, d1 := gEval(e)
		g2, d2 := gEval(cmplx.Conj(e))
		if cmplx.Abs(g1/d1) <= cmplx.Abs(g2/d2) {
			up = append(up, e)
		} else {
			lo = append(lo, e)
		}
	}
	lead := complex(1/epsR, 0)
	if nz == n {
		lead += complex(0, ieps)
	}
	argLead := cmplx.Phase(lead)
	type pole struct {
		l, slope float64
		branchA  bool
	}
	var poles []pole
	for _, br := range []struct {
		roots []complex128
		shift float64
		isA   bool
	}{{up, argLead, true}, {lo, -argLead, false}} {
		rs := br.roots
		// v(x) = 2 sum arg(x - g) runs over (-2 pi |rs|, 0); solve
		// v(x) = pi - shift (mod 2 pi).
		v := func(x float64) float64 {
			s := 0.0
			for _, g := range rs {
				s += math.Atan2(-imag(g), x-real(g))
			}
			return 2 * s
		}
		t0 := math.Pi - br.shift
		t0 -= 2 * math.Pi * math.Ceil(t0/(2*math.Pi)) // largest target <= 0
		if t0 == 0 {
			t0 -= 2 * math.Pi
		}
		for m := 0; m < len(rs); m++ {
			target := t0 - 2*math.Pi*float64(m)
			if target <= -2*math.Pi*float64(len(rs)) {
				break
			}
			xlo, xhi := -1.0, 1.0
			for v(xlo) > target {
				xlo *= 2
			}
			for v(xhi) < target {
				xhi *= 2
			}
			for it := 0; it < 2100; it++ {
				mid := 0.5 * (xlo + xhi)
				if mid == xlo || mid == xhi {
					break
				}
				if v(mid) < target {
					xlo = mid
				} else {
					xhi = mid
				}
			}
			x := 0.5 * (xlo + xhi)
			slope := 0.0
			for _, g := range rs {
				dx, dy := x-real(g), imag(g)
				slope += 2 * dy / (dx*dx + dy*dy)
			}
			poles = append(poles, pole{x, slope, br.isA})
		}
	}
	if len(poles) != n {
		return nil, fmt.Errorf("filter: internal: found %d transversal eigenvalues, want %d", len(poles), n)
	}
	slices.SortFunc(poles, func(p, q pole) int { return cmpFloat(p.l, q.l) })
	sgn21 := jPow(a + nz + 1 - n)
	m := make([][]float64, n+2)
	for i := range m {
		m[i] = make([]float64, n+2)
	}
	for k, p := range poles {
		r22 := 1 / p.slope
		r21 := sgn21 * r22
		if !p.branchA {
			r21 = -r21
		}
		if !(r22 > 0) || math.IsInf(r22, 0) {
			return nil, fmt.Errorf("filter: internal: residue r22 = %g at lambda = %g is not positive", r22, p.l)
		}
		ml := math.Sqrt(r22)
		ms := r21 / ml
		i := k + 1
		m[i][i] = -p.l
		m[0][i], m[i][0] = ms, ms
		m[n+1][i], m[i][n+1] = ml, ml
	}
	if nz == n {
		msl := -jPow(a+nz-n-1) / (eps * (1 + 1/epsR))
		m[0][n+1], m[n+1][0] = msl, msl
	}
	return m, nil
}

func cmpFloat(x, y float64) int {
	switch {
	case x < y:
		return -1
	case x > y:
		return 1
	}
	return 0
}

// jPow returns j^m for even m (+1 or -1).
func jPow(m int) float64 {
	if ((m%4)+4)%4 == 0 {
		return 1
	}
	return -1
}

func denseFrom(m [][]float64) *mat.Dense {
	n := len(m)
	d := mat.NewDense(n, n, nil)
	for i := range m {
		d.SetRow(i, m[i])
	}
	return d
}

// alignSigns makes M_S1 and every main-line coupling between resonators
// M_{i,i+1}, i = 1..N-1, non-negative by changing the sign of whole
// resonator rows and columns (a similarity transform with a diagonal +-1
// matrix, which leaves the response unchanged). The sign of M_NL then
// follows from the S21 polynomial convention.
func alignSigns(m [][]float64) {
	n := len(m) - 2
	for i := 0; i < n; i++ {
		if m[i][i+1] < 0 {
			r := i + 1
			for j := range m {
				m[r][j] = -m[r][j]
				m[j][r] = -m[j][r]
			}
		}
	}
}

// selfCheckTol bounds the deviation of |S|^2 between the folded-matrix
// response and the polynomial target that Synthesize accepts: about a
// thousand times the worst case seen in the tests (6e-13 at N = 30).
const selfCheckTol = 1e-9

// selfCheck compares |S21|^2 and |S11|^2 of the folded matrix with the
// polynomial response at the reflection zeros, the ripple peaks and near
// the transmission zeros.
func (d *Design) selfCheck() error {
	n := d.Spec.Order
	pts := slices.Clone(d.ReflectionZeros)
	if d.Spec.Family == Chebyshev {
		pts = append(pts, ripplePeaks(n, d.Zeros, d.RealPairs...)...)
	} else {
		pts = append(pts, -1, 0, 1)
	}
	for _, z := range d.Zeros {
		pts = append(pts, z*1.01, z)
	}
	ev := newEvaluator(d.Folded, nil)
	worst := 0.0
	for _, w := range pts {
		s11, s21, _, _ := ev.at(w)
		p11, p21 := d.polyS(w)
		worst = math.Max(worst, math.Abs(cmplx.Abs(s11)*cmplx.Abs(s11)-cmplx.Abs(p11)*cmplx.Abs(p11)))
		worst = math.Max(worst, math.Abs(cmplx.Abs(s21)*cmplx.Abs(s21)-cmplx.Abs(p21)*cmplx.Abs(p21)))
	}
	if !(worst < selfCheckTol) {
		return fmt.Errorf("filter: synthesis of order %d with %d transmission zeros lost numerical accuracy (|S|^2 off by %.2g); lower the order or move the zeros further from the passband", n, len(d.Zeros), worst)
	}
	return nil
}

// polyS evaluates S11 = F/(EpsR E) and S21 = P/(Eps E) at s = j omega in
// product form.
func (d *Design) polyS(omega float64) (s11, s21 complex128) {
	s := complex(0, omega)
	f := complex(1, 0)
	for _, r := range d.ReflectionZeros {
		f *= s - complex(0, r)
	}
	p := d.P[len(d.P)-1] // j^a, or -j^a after the sign choice of Synthesize
	for _, z := range d.Zeros {
		p *= s - complex(0, z)
	}
	for _, sg := range d.RealPairs {
		p *= s*s - complex(sg*sg, 0)
	}
	e := complex(1, 0)
	for _, r := range d.Poles {
		e *= s - r
	}
	return f / (complex(d.EpsR, 0) * e), p / (complex(d.Eps, 0) * e)
}
