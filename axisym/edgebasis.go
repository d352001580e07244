package axisym

import (
	"fmt"
	"math"
	"sort"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/physics/bessel"
)

// Experimental, unexported: an edge-conditioned Galerkin form of the
// junction equations (n = 0, closed bodies of homogeneous circular
// sections, a strict step at every junction).
//
// At a junction of aperture radius a the transverse electric field on the
// aperture is expanded in K functions that carry Meixner's edge condition
// at the 270-degree edge r = a (Meixner 1972: E across the edge ~ rho^-1/3,
// E along it ~ rho^2/3):
//
//	phi_k(r) = c_k x (1 - x^2)^nu P_k^(1,nu)(1 - 2 x^2),  x = r/a,
//
// nu = -1/3 for TM0 (E_r) and +2/3 for TE0 (E_phi), P^(1,nu) Jacobi
// polynomials (the Galerkin aperture-field method with edge-conditioned
// basis functions: R. Mittra and S. W. Lee, Analytical Techniques in the
// Theory of Guided Waves, Macmillan 1971, ch. 4; R. E. Collin, Field
// Theory of Guided Waves, 2nd ed., IEEE Press 1991, sec. 1.3 on the edge
// condition; as recalled). Their projections on the modes J1(kc r) of
// either adjacent guide are in closed form by the finite Hankel integral
//
//	int_0^1 x^2 (1-x^2)^nu P_k^(1,nu)(1-2x^2) J1(z x) dx
//	    = 2^nu Gamma(k+nu+1)/k! z^(-nu-1) J_(2k+nu+2)(z)
//
// (a Sonine-Bateman type integral, recalled; checked against mpmath
// quadrature by testdata/gen_edgebasis.py and against Gauss-Legendre
// quadrature in TestEdgeOverlapQuadrature). The junction unknowns are the
// K coefficients; the junction matrix is the sum over the two sections of
// P^T diag(b11) P, as in system, now with P of many rows (the modes of each
// section) and K columns, so the modal sums are cheap.
//
// The modal sums converge slowly (terms ~ m^(-7/3): the static field of
// the edge). Each section's line susceptance is therefore split into the
// first two terms of its expansion about f = 0 for a long line, s_m + k0^2
// s2_m (TM: eps_r/kc + k0^2 eps_r^2 mu_r/(2 kc^3); TE: -kc/mu_r + k0^2
// eps_r/(2 kc); derived from alpha^2 = kc^2 - k0^2 eps_r mu_r), and the
// rest: sum_m s_m P P^T and sum_m s2_m P P^T are constant matrices summed
// once over many modes, their tails removed by Richardson elimination in
// the number of modes with the exponents the terms' decay predicts
// (edgeTailExponents), applied to means of the partial sums over windows
// (M/2, M] that scale with M (so a power-law tail stays one, while the
// oscillating parts from the wide guide average out); the rest falls as
// m^(-19/3) and is summed over a few dynamic modes. The model's
// derivative in f is sum over the dynamic modes of b11' P P^T plus k0^2
// times a positive semi-definite tail, so the junction matrix still
// increases with f and the Wittrick-Williams count of system.count holds.

// edgeOpts are the truncation parameters of the edge-conditioned model.
type edgeOpts struct {
	k      int // basis functions per junction
	dyn    int // dynamic modes in the widest section
	static int // modes of the static sums per unit ratio R/a
}

// fracJ fills out[j] = J_(alpha+j)(z), j = 0..len(out)-1, for 0 <= alpha < 1
// and z > 0: Hankel's asymptotic expansion (DLMF 10.17.3) for large z, else
// Miller's backward recurrence (DLMF 3.6(iii) and 10.74(iv), as recalled)
// normalised by Neumann's expansion (z/2)^alpha = sum_k (alpha+2k)
// Gamma(alpha+k)/k! J_(alpha+2k)(z) (G. N. Watson, A Treatise on the
// Theory of Bessel Functions, 2nd ed., 1944, sec. 5.2, as recalled; the
// test checks the result against mpmath).
func fracJ(alpha, z float64, out []float64) {
	n := len(out)
	top := alpha + float64(n)
	if z > 25+top*top {
		// The phase of order alpha + j is that of alpha less j pi/2.
		c, sn := math.Cos(z-alpha*math.Pi/2-math.Pi/4), math.Sin(z-alpha*math.Pi/2-math.Pi/4)
		amp := math.Sqrt(2 / (math.Pi * z))
		for j := range out {
			p, q := hankelPQ(alpha+float64(j), z)
			var cj, sj float64
			switch j % 4 {
			case 0:
				cj, sj = c, sn
			case 1:
				cj, sj = sn, -c
			case 2:
				cj, sj = -c, -sn
			case 3:
				cj, sj = -sn, c
			}
			out[j] = amp * (p*cj - q*sj)
		}
		return
	}
	start := int(math.Max(z, float64(n))+14*math.Cbrt(z+1)) + 30
	if start%2 == 1 {
		start++
	}
	var jp1, j0 float64 = 0, 1e-300
	sum := 0.0
	// g = Gamma(alpha+k)/k! for k = mu/2, from the top down:
	// g(k-1) = g(k) k / (alpha+k-1).
	kt := start / 2
	g := math.Exp(lgamma(alpha+float64(kt)) - lgamma(float64(kt)+1))
	for mu := start; mu >= 0; mu-- {
		// j0 = J_(alpha+mu) (unscaled)
		if mu < n {
			out[mu] = j0
		}
		if mu%2 == 0 {
			k := mu / 2
			if k < kt {
				g *= float64(k+1) / (alpha + float64(k))
				kt = k
			}
			c := (alpha + float64(mu)) * g
			if mu == 0 {
				c = math.Gamma(alpha + 1) // alpha Gamma(alpha), also for alpha = 0
			}
			sum += c * j0
		}
		if mu == 0 {
			break
		}
		jm1 := 2*(alpha+float64(mu))/z*j0 - jp1
		jp1, j0 = j0, jm1
		if math.Abs(j0) > 1e250 {
			s := 1e-250
			jp1 *= s
			j0 *= s
			sum *= s
			for i := mu - 1; i < n; i++ {
				if i >= 0 {
					out[i] *= s
				}
			}
		}
	}
	scale := math.Pow(z/2, alpha) / sum
	for i := range out {
		out[i] *= scale
	}
}

func lgamma(x float64) float64 {
	v, _ := math.Lgamma(x)
	return v
}

// hankelPQ returns the sums P and Q of Hankel's expansion (DLMF 10.17.3),
// J_nu(z) ~ sqrt(2/(pi z)) (P cos w - Q sin w), w = z - nu pi/2 - pi/4,
// for z much larger than nu^2.
func hankelPQ(nu, z float64) (p, q float64) {
	mu := 4 * nu * nu
	p = 1
	term := 1.0
	prev := math.MaxFloat64
	r := 1 / (8 * z)
	for k := 1; k < 60; k++ {
		term *= (mu - float64((2*k-1)*(2*k-1))) * r / float64(k)
		if math.Abs(term) > prev {
			break
		}
		prev = math.Abs(term)
		switch k % 4 {
		case 1:
			q += term
		case 2:
			p -= term
		case 3:
			q -= term
		case 0:
			p += term
		}
		if prev < 1e-17 {
			break
		}
	}
	return p, q
}

// circularZeros returns the first count zeros of J_n (n = 0 or 1): the
// project's root finder up to cavity.MaxIndex, McMahon's expansion (DLMF
// 10.21.19, four terms) beyond, where it is exact to rounding.
func circularZeros(n, count int) []float64 {
	first := bessel.JZeros(n, min(count, cavity.MaxIndex))
	out := make([]float64, count)
	copy(out, first)
	mu := float64(4 * n * n)
	for m := len(first); m < count; m++ {
		b := (float64(m+1) + float64(n)/2 - 0.25) * math.Pi
		e := 8 * b
		out[m] = b - (mu-1)/e - 4*(mu-1)*(7*mu-31)/(3*e*e*e) -
			32*(mu-1)*(83*mu*mu-982*mu+3779)/(15*e*e*e*e*e)
	}
	return out
}

// edgeFamilies returns the exponents nu of the three basis families of a
// junction between a narrow section and a wide one. Near the 270-degree
// edge the field is a sum of terms rho^(tau_n - 1) (TM0: E across the
// edge, from a potential) or rho^(tau_n) (TE0: E_phi along it), with tau_n
// the roots of
//
//	w cot(pi tau) + n cot(pi tau / 2) = 0
//
// for the wide section filling 180 degrees and the narrow one 90 degrees
// around the edge, (w, n) = (eps_wide, eps_narrow) for TM0 (continuity of
// the potential and of eps times its normal derivative) and (1/mu_wide,
// 1/mu_narrow) for TE0 (Meixner 1972; J. Van Bladel, Singular
// Electromagnetic Fields and Sources, Oxford 1991, ch. 4, for the
// dielectric wedge; the equation derived here). In one medium tau_n = 2n/3.
// The families are the two roots in (1/2, 1) and (1, 3/2) and tau = 2 (a
// root for any media); with the factor (1 - x^2)^nu times polynomials in
// x^2 they cover the exponents tau_n + integers up to tau = 2.
func edgeFamilies(fam cavity.Family, wide, narrow Section) [3]float64 {
	w, n := wide.Fill.Eps(), narrow.Fill.Eps()
	shift := -1.0
	if fam == cavity.TE {
		w, n = 1/wide.Fill.Mu(), 1/narrow.Fill.Mu()
		shift = 0
	}
	f := func(t float64) float64 {
		return w/math.Tan(math.Pi*t) + n/math.Tan(math.Pi*t/2)
	}
	root := func(lo, hi float64) float64 { // f(lo) > 0 > f(hi)
		for range 200 {
			mid := 0.5 * (lo + hi)
			if mid == lo || mid == hi {
				break
			}
			if f(mid) > 0 {
				lo = mid
			} else {
				hi = mid
			}
		}
		return 0.5 * (lo + hi)
	}
	return [3]float64{root(0.5, 1) + shift, root(1, 1.5) + shift, 2 + shift}
}

// edgeTailExponents returns the exponents p of the tails M^-p of the static
// sums of a junction with families nus: the family of exponent nu projects
// on mode m as m^(-nu-1) times a bounded factor (from Hankel's expansion),
// and the static line is ~ 1/m (TM) or ~ m (TE), so the terms of the sums
// fall as m^(-nu_i-nu_j-3) (TM) or m^(-nu_i-nu_j-1) (TE) (derived). The
// four smallest distinct ones are returned.
func edgeTailExponents(fam cavity.Family, nus [3]float64) []float64 {
	add := 2.0
	if fam == cavity.TE {
		add = 0
	}
	var ps []float64
	for i := range nus {
		for j := i; j < len(nus); j++ {
			ps = append(ps, nus[i]+nus[j]+add)
		}
	}
	sort.Float64s(ps)
	out := ps[:1]
	for _, p := range ps[1:] {
		if p-out[len(out)-1] > 1e-6 && len(out) < 4 {
			out = append(out, p)
		}
	}
	return out
}

// edgeProjection returns P (count x k, row-major): P[m][j] = 2 pi int_0^a
// e_m(r) phi_j(r) r dr for the first count normalised modes e_m of family
// fam of a circular guide of radius radius and the k basis functions of an
// aperture of radius a <= radius (k/3 of each family of edgeFamilies,
// rounded up from the first), scaled so that P[m][j] = 2 pi a norm_m
// sqrt(2(2i+nu+2)) z^(-nu-1) J_(2i+nu+2)(z), z = kc_m a, for the i-th
// function of the family of exponent nu. Also the cutoffs.
func edgeProjection(fam cavity.Family, nus [3]float64, radius, a float64, count, k int) (p, kc []float64) {
	order := 0
	if fam == cavity.TE {
		order = 1
	}
	zs := circularZeros(order, count)
	kc = make([]float64, count)
	p = make([]float64, count*k)
	var per [3]int
	for j := range k {
		per[j%3]++
	}
	var seq [3][]float64
	for f, nu := range nus {
		shift := int(math.Floor(nu + 2))
		seq[f] = make([]float64, shift+2*per[f]+1)
	}
	for m, x := range zs {
		kc[m] = x / radius
		var jn float64 // |J at the zero| for the norm
		if fam == cavity.TE {
			jn = math.J0(x)
		} else {
			jn = math.J1(x)
		}
		norm := 1 / (math.Sqrt(math.Pi) * radius * math.Abs(jn))
		z := kc[m] * a
		col := 0
		lz := math.Log(z)
		for f, nu := range nus {
			ord := nu + 2
			shift := math.Floor(ord)
			alpha := ord - shift
			top := ord + float64(2*per[f])
			zp := math.Exp((-nu - 1) * lz)
			if z > 25+top*top {
				// Hankel's expansion for just the orders needed, each
				// phase that of ord less i pi (DLMF 10.17.3).
				w := z - ord*math.Pi/2 - math.Pi/4
				c, sn := math.Cos(w), math.Sin(w)
				amp := math.Sqrt(2 / (math.Pi * z))
				for i := range per[f] {
					pp, qq := hankelPQ(ord+float64(2*i), z)
					jv := amp * (pp*c - qq*sn)
					if i%2 == 1 {
						jv = -jv
					}
					p[m*k+col] = 2 * math.Pi * a * norm * math.Sqrt(2*(2*float64(i)+ord)) * zp * jv
					col++
				}
				continue
			}
			fracJ(alpha, z, seq[f])
			for i := range per[f] {
				p[m*k+col] = 2 * math.Pi * a * norm * math.Sqrt(2*(2*float64(i)+ord)) * zp * seq[f][int(shift)+2*i]
				col++
			}
		}
	}
	return p, kc
}

// staticLine is the f -> 0 limit of b11 for a long line (lineSusceptance):
// TM eps_r/kc, TE -kc/mu_r.
func staticLine(fam cavity.Family, kc, eps, mu float64) float64 {
	if fam == cavity.TE {
		return -kc / mu
	}
	return eps / kc
}

// staticLine2 is the coefficient of k0^2 in the expansion of b11 of a long
// line about f = 0 (from alpha^2 = kc^2 - k0^2 eps mu; derived): TM
// eps^2 mu/(2 kc^3), TE eps/(2 kc).
func staticLine2(fam cavity.Family, kc, eps, mu float64) float64 {
	if fam == cavity.TE {
		return eps / (2 * kc)
	}
	return eps * eps * mu / (2 * kc * kc * kc)
}

// richardsonTail sums the partial sums part (at M, 2M, 4M, ...) to
// infinity, eliminating tails M^-p for each p of tail in turn.
func richardsonTail(part [][]float64, tail []float64) []float64 {
	for _, pw := range tail {
		q := math.Exp2(pw) - 1
		for l := 0; l+1 < len(part); l++ {
			for e := range part[l] {
				part[l][e] = part[l+1][e] + (part[l+1][e]-part[l][e])/q
			}
		}
		part = part[:len(part)-1]
	}
	return part[0]
}

// newEdgeSystem builds the edge-conditioned model of b for family fam.
func newEdgeSystem(b Body, fam cavity.Family, fmax float64, o edgeOpts) (*system, error) {
	if err := edgeApplies(b, fam); err != nil {
		return nil, err
	}
	counts, err := ModeCounts(b, fam, fmax, o.dyn)
	if err != nil {
		return nil, err
	}
	// The static split takes a line as long (coth(alpha l) = 1, no
	// transfer): a short section keeps every mode with alpha l below
	// edgeShort dynamic, alpha ~ (m - 1/4) pi / R (DLMF 10.21.19).
	for i, sec := range b.Sections {
		// The rest after the static split falls as (k/kc)^4: keep modes
		// to kc = edgeAbove k dynamic (kc ~ m pi / R).
		k := 2 * math.Pi * fmax / physics.SpeedOfLight * sec.maxIndex()
		counts[i] = max(counts[i], int(edgeAbove*k*sec.Radius/math.Pi)+1)
		if n := int(edgeShort*sec.Radius/(math.Pi*sec.Length)) + 1; n > counts[i] {
			if n > edgeMaxDynamic {
				return nil, fmt.Errorf("axisym: edge basis: section %d is too short for its radius (%g m against %g m): it would need %d modes: %w",
					i+1, sec.Length, sec.Radius, n, ErrNotImplemented)
			}
			counts[i] = n
		}
	}
	s := &system{fam: fam}
	s.layers.guides = make([]*layeredGuide, len(b.Sections)) // none layered
	for i, sec := range b.Sections {
		s.lines = append(s.lines, lines{
			eps: sec.Fill.Eps(), mu: sec.Fill.Mu(), length: sec.Length,
			b11: make([]float64, counts[i]), b12: make([]float64, counts[i]),
		})
	}
	nj := len(b.Sections) - 1
	s.ndof = nj * o.k
	for j := range nj {
		s.joins = append(s.joins, join{off: j * o.k, n: o.k})
	}
	// Each section's projections on the raw basis of each of its junctions
	// (raw[i][side], side 0 the left junction), and the static sums.
	raw := make([][2][]float64, len(b.Sections))
	stat := make([][]float64, nj)
	stat2 := make([][]float64, nj)
	for j := range stat {
		stat[j] = make([]float64, o.k*o.k)
		stat2[j] = make([]float64, o.k*o.k)
	}
	for i, sec := range b.Sections {
		ln := &s.lines[i]
		ln.sub = make([]float64, counts[i])
		ln.sub2 = make([]float64, counts[i])
		for side, jn := range []int{i - 1, i} {
			if jn < 0 || jn >= nj {
				continue
			}
			wide, narrow := b.Sections[jn], b.Sections[jn+1]
			if wide.Radius < narrow.Radius {
				wide, narrow = narrow, wide
			}
			a := narrow.Radius
			nus := edgeFamilies(fam, wide, narrow)
			tail := edgeTailExponents(fam, nus)
			tail2 := make([]float64, len(tail))
			for t, p := range tail {
				tail2[t] = p + 2 // the k0^2 terms fall faster by kc^-2
			}
			big := max(int(float64(o.static)*sec.Radius/a), 2*counts[i])
			// Static sums to big/2^(L-1), ..., big/2, big modes, and
			// their tail by repeated Richardson elimination.
			levels := len(tail) + 1
			big = (big + 1<<levels - 1) >> levels << levels
			p, kc := edgeProjection(fam, nus, sec.Radius, a, big, o.k)
			ln.kc = kc[:counts[i]]
			raw[i][side] = p[:counts[i]*o.k]
			// Each level's value is the mean of the partial sums over
			// (M/2, M]: a window that scales with M keeps a power-law
			// tail a power law of the same exponent, while the
			// oscillating parts of the sums (the wide guide's modes
			// do not fit the aperture) average out.
			part := make([][]float64, levels)
			part2 := make([][]float64, levels)
			full := make([]float64, o.k*o.k)
			full2 := make([]float64, o.k*o.k)
			acc := make([]float64, o.k*o.k)
			acc2 := make([]float64, o.k*o.k)
			next := big >> (levels - 1)
			lv := 0
			for m := range big {
				sm := staticLine(fam, kc[m], ln.eps, ln.mu)
				sm2 := staticLine2(fam, kc[m], ln.eps, ln.mu)
				row := p[m*o.k : (m+1)*o.k]
				for r := range o.k {
					g, g2 := sm*row[r], sm2*row[r]
					for c := r; c < o.k; c++ {
						full[r*o.k+c] += g * row[c]
						full2[r*o.k+c] += g2 * row[c]
					}
				}
				if m+1 > next/2 {
					for e := range acc {
						acc[e] += full[e]
						acc2[e] += full2[e]
					}
				}
				if m+1 == next {
					w := float64(next - next/2)
					part[lv], part2[lv] = make([]float64, len(acc)), make([]float64, len(acc))
					for e := range acc {
						part[lv][e], part2[lv][e] = acc[e]/w, acc2[e]/w
					}
					clear(acc)
					clear(acc2)
					lv++
					next *= 2
				}
			}
			sum, sum2 := richardsonTail(part, tail), richardsonTail(part2, tail2)
			for r := range o.k {
				for c := r; c < o.k; c++ {
					v, v2 := sum[r*o.k+c], sum2[r*o.k+c]
					stat[jn][r*o.k+c] += v
					stat2[jn][r*o.k+c] += v2
					if c != r {
						stat[jn][c*o.k+r] += v
						stat2[jn][c*o.k+r] += v2
					}
				}
			}
			for m := range counts[i] {
				ln.sub[m] = staticLine(fam, kc[m], ln.eps, ln.mu)
				ln.sub2[m] = staticLine2(fam, kc[m], ln.eps, ln.mu)
			}
		}
	}
	// Orthonormalise each junction's basis against its static matrix
	// (definite: positive for TM0, negative for TE0), dropping directions
	// whose eigenvalue is below edgeRank of the largest: the families
	// overlap more and more as k grows, and a Galerkin model on the kept
	// subspace is as valid as on the whole.
	sign := 1.0
	if fam == cavity.TE {
		sign = -1
	}
	ws := make([][]float64, nj)
	dims := make([]int, nj)
	for j := range nj {
		for i := range stat[j] {
			stat[j][i] *= sign
		}
		vals, vecs := symEigen(stat[j], o.k)
		top := 0.0
		for _, v := range vals {
			top = max(top, v)
		}
		var w []float64 // o.k x kept, row-major (filled column by column)
		var keep []int
		for c, v := range vals {
			if v > edgeRank*top {
				keep = append(keep, c)
			}
		}
		w = make([]float64, o.k*len(keep))
		for cc, c := range keep {
			sc := 1 / math.Sqrt(vals[c])
			for r := range o.k {
				w[r*len(keep)+cc] = vecs[r*o.k+c] * sc
			}
		}
		ws[j], dims[j] = w, len(keep)
	}
	s.ndof = 0
	for j := range nj {
		s.joins[j].off, s.joins[j].n = s.ndof, dims[j]
		s.ndof += dims[j]
	}
	s.static = make([]float64, s.ndof*s.ndof)
	s.static2 = make([]float64, s.ndof*s.ndof)
	for j := range nj {
		off, d := s.joins[j].off, dims[j]
		for r := range d {
			s.static[(off+r)*s.ndof+off+r] = sign
		}
		// W^T stat2 W.
		t := matMul(stat2[j], ws[j], o.k, o.k, d)
		for r := range d {
			for c := range d {
				var v float64
				for l := range o.k {
					v += ws[j][l*d+r] * t[l*d+c]
				}
				s.static2[(off+r)*s.ndof+off+c] = v
			}
		}
	}
	for i := range b.Sections {
		for side, jn := range []int{i - 1, i} {
			if jn < 0 || jn >= nj {
				continue
			}
			t := matMul(raw[i][side], ws[jn], len(raw[i][side])/o.k, o.k, dims[jn])
			if side == 0 {
				s.joins[jn].right = t
			} else {
				s.joins[jn].left = t
			}
		}
	}
	return s, nil
}

// edgeResonances returns the resonances of family fam below fmax of the
// edge-conditioned model.
func edgeResonances(b Body, fam cavity.Family, fmax float64, o edgeOpts) ([]float64, error) {
	f, _, err := edgeModel(b, fam, fmax, o)
	return f, err
}

// edgeModel is edgeResonances that also returns the model, for the
// fields and losses (system.losses: the modal voltages of each section are
// the projections P c of the aperture field).
func edgeModel(b Body, fam cavity.Family, fmax float64, o edgeOpts) ([]float64, *system, error) {
	if err := b.Validate(); err != nil {
		return nil, nil, err
	}
	s, err := newEdgeSystem(b, fam, fmax, o)
	if err != nil {
		return nil, nil, err
	}
	sv := &solver{s: s, a: make([]float64, s.ndof*s.ndof)}
	s.calibrate(b, sv.a)
	jmax, gmax := sv.count(fmax)
	if jmax > MaxResonances {
		return nil, nil, fmt.Errorf("axisym: %d %v0 resonances below %g Hz, more than %d; lower the maximum frequency", jmax, fam, fmax, MaxResonances)
	}
	sv.isolate(point{0, 0, 0}, point{fmax, jmax, gmax})
	return sv.out, s, nil
}

// edgeShort is the attenuation alpha l (nepers) above which a mode of a
// section counts as on a long line: coth(alpha l) - 1 and csch(alpha l)
// are then below 2 exp(-2 edgeShort) = 5e-16. edgeMaxDynamic bounds the
// dynamic modes of a section (a body with thinner sections is refused).
// edgeAbove is how far above the wavenumber (as a multiple) the dynamic
// modes of every section reach (common practice; TestEdgeAgainstDefault).
const (
	edgeAbove      = 4
	edgeShort      = 18
	edgeMaxDynamic = 20000
)

// edgeRank is the relative eigenvalue of the static matrix below which a
// direction of the basis is dropped (common practice: well above the
// rounding of the sums, about 1e-16 times their largest terms).
const edgeRank = 1e-12

// matMul returns a (n x k) times w (k x d), row-major.
func matMul(a, w []float64, n, k, d int) []float64 {
	out := make([]float64, n*d)
	for i := range n {
		for l := range k {
			x := a[i*k+l]
			if x == 0 {
				continue
			}
			row := out[i*d : (i+1)*d]
			wl := w[l*d : (l+1)*d]
			for c := range row {
				row[c] += x * wl[c]
			}
		}
	}
	return out
}

// symEigen returns the eigenvalues and eigenvectors (columns of an n x n
// row-major matrix) of the symmetric n x n matrix a (not modified), by the
// cyclic Jacobi method (Golub and Van Loan, Matrix Computations, 3rd ed.,
// sec. 8.4; as recalled).
func symEigen(a []float64, n int) (vals, vecs []float64) {
	m := append([]float64(nil), a...)
	v := make([]float64, n*n)
	for i := range n {
		v[i*n+i] = 1
	}
	for sweep := 0; sweep < 100; sweep++ {
		off := 0.0
		for p := range n {
			for q := p + 1; q < n; q++ {
				off += m[p*n+q] * m[p*n+q]
			}
		}
		if off == 0 {
			break
		}
		for p := range n {
			for q := p + 1; q < n; q++ {
				apq := m[p*n+q]
				if apq == 0 {
					continue
				}
				app, aqq := m[p*n+p], m[q*n+q]
				if math.Abs(apq) < 1e-300 || math.Abs(apq) <= 1e-18*math.Sqrt(math.Abs(app*aqq)) {
					m[p*n+q], m[q*n+p] = 0, 0
					continue
				}
				theta := (aqq - app) / (2 * apq)
				t := math.Copysign(1, theta) / (math.Abs(theta) + math.Sqrt(theta*theta+1))
				c := 1 / math.Sqrt(t*t+1)
				sn := t * c
				for k := range n {
					akp, akq := m[k*n+p], m[k*n+q]
					m[k*n+p] = c*akp - sn*akq
					m[k*n+q] = sn*akp + c*akq
				}
				for k := range n {
					apk, aqk := m[p*n+k], m[q*n+k]
					m[p*n+k] = c*apk - sn*aqk
					m[q*n+k] = sn*apk + c*aqk
				}
				for k := range n {
					vkp, vkq := v[k*n+p], v[k*n+q]
					v[k*n+p] = c*vkp - sn*vkq
					v[k*n+q] = sn*vkp + c*vkq
				}
			}
		}
	}
	vals = make([]float64, n)
	for i := range n {
		vals[i] = m[i*n+i]
	}
	return vals, v
}

// edgeCoarse and edgeFine are the two models of edgeSolve: basis functions
// per junction, dynamic modes in the widest section, static modes per unit
// R/a. Chosen on the five-section test body (TestEdgeFiveLowest): the fine
// model is within 5e-10 of a model with 15 functions, 480 dynamic and
// 12800 static modes, the coarse one within 6e-9.
var (
	edgeCoarse = edgeOpts{k: 9, dyn: 30, static: 400}
	edgeFine   = edgeOpts{k: 12, dyn: 40, static: 800}
)

// edgeFloor is added, relative to the frequency, to the distance between
// the coarse and the fine model to form Change: the coarse model differs
// from the fine one mostly in the number of basis functions, and the fine
// model's own truncation of the modal sums (about 1e-10 to 1e-9) can
// exceed that distance when the two happen to agree closely. On the
// bodies of TestEdgeAgainstDefault the fine model's error against a much
// larger one exceeded the distance by at most 1e-9 relative; the floor
// keeps twice that (common practice: a safety factor of two).
const edgeFloor = 2e-9

// edgeSolve returns the resonances of family fam below fmax by the
// edge-conditioned model edgeFine, each with its convergence estimate: the
// distance from the coarser model edgeCoarse (searched a little beyond
// fmax so that every resonance has a partner; +Inf when none) plus
// edgeFloor of the frequency.
func edgeSolve(b Body, fam cavity.Family, fmax float64) (f, change []float64, err error) {
	r, err := edgePair(b, fam, fmax, edgeCoarse, edgeFine, false)
	if err != nil {
		return nil, nil, err
	}
	for _, x := range r {
		f, change = append(f, x.Frequency), append(change, x.Change)
	}
	return f, change, nil
}

// edgePair solves the two models coarse and fine and returns the fine
// model's resonances with Frequency, Change, Coarse and, if withLoss,
// Loss, LossErr and CoarseLoss set (the fields from the modal voltages P c
// of each section, system.losses).
func edgePair(b Body, fam cavity.Family, fmax float64, coarse, fine edgeOpts, withLoss bool) ([]Resonance, error) {
	cf, cs, err := edgeModel(b, fam, fmax*(1+estimateMargin), coarse)
	if err != nil {
		return nil, err
	}
	ff, fs, err := edgeModel(b, fam, fmax, fine)
	if err != nil {
		return nil, err
	}
	out := make([]Resonance, len(ff))
	for i, x := range ff {
		r := Resonance{Family: fam, Index: i + 1, Frequency: x, Change: math.Inf(1), EdgeBasis: true}
		if i < len(cf) {
			r.Change, r.Coarse = math.Abs(x-cf[i])+edgeFloor*x, cf[i]
		}
		if withLoss {
			if l, err := fs.losses(b, x); err != nil {
				r.LossErr = err
			} else {
				r.Loss = &l
				if i < len(cf) {
					if lc, err := cs.losses(b, cf[i]); err == nil {
						r.CoarseLoss = &lc
					}
				}
			}
		}
		out[i] = r
	}
	return out, nil
}

// EdgeBasisApplies returns nil when Solve with Request.EdgeBasis uses the
// edge-conditioned junctions for family fam of body b (see edgeApplies),
// else the reason, wrapping ErrNotImplemented.
func EdgeBasisApplies(b Body, fam cavity.Family) error { return edgeApplies(b, fam) }

// edgeApplies returns nil when the edge-conditioned model handles family
// fam of body b: a closed body of homogeneous, isotropic circular
// sections with a strict step at every junction; else the reason, wrapping
// ErrNotImplemented.
func edgeApplies(b Body, fam cavity.Family) error {
	if len(b.Sections) < 2 {
		return fmt.Errorf("axisym: edge basis: a body of one section has no junction: %w", ErrNotImplemented)
	}
	if b.Open() {
		return fmt.Errorf("axisym: edge basis: open body: %w", ErrNotImplemented)
	}
	if err := b.requireIsotropicFor(fam); err != nil {
		return err
	}
	for i, sec := range b.Sections {
		if sec.InnerRadius != 0 || len(sec.Layers) > 0 {
			return fmt.Errorf("axisym: edge basis: section %d is coaxial or layered: %w", i+1, ErrNotImplemented)
		}
		if i > 0 && sec.Radius == b.Sections[i-1].Radius {
			return fmt.Errorf("axisym: edge basis: sections %d and %d have one radius: %w", i, i+1, ErrNotImplemented)
		}
	}
	return nil
}
