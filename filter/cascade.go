package filter

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"

	"gonum.org/v1/gonum/mat"
)

// Topologies beyond the folded form: the folded matrix of a design carried
// by an orthogonal similarity transform of its inner resonators into a
// network of cascaded triplets (each realising one transmission zero) or
// cascaded quadruplets (each realising a pair).

// Topology is a coupling pattern of an (N+2)x(N+2) matrix: which entries may
// be non-zero.
type Topology struct {
	// Name is "folded", "triplets", "quadruplets" or "given" (a matrix
	// from the user, FromMatrix).
	Name string
	// Order is N.
	Order int
	// Blocks holds, for triplets and quadruplets, the first resonator of
	// each block (1-based): triplet a spans a..a+2 with the cross coupling
	// a-(a+2); quadruplet a spans a..a+3 with the cross coupling a-(a+3)
	// and the diagonals a-(a+2), (a+1)-(a+3).
	Blocks []int
	// Size is 3 for triplets, 4 for quadruplets, 0 for folded, -1 for a
	// given matrix (every entry allowed).
	Size int
}

// Allowed reports whether entry (i, j) may be non-zero: the diagonal, the
// main line S-1-...-N-L and the cross couplings of the blocks (folded: the
// pattern of InFoldedPattern).
func (t Topology) Allowed(i, j int) bool {
	n := t.Order
	if i < 0 || j < 0 || i > n+1 || j > n+1 {
		return false
	}
	switch t.Size {
	case 0:
		return InFoldedPattern(n, i, j)
	case -1:
		return true
	}
	if i > j {
		i, j = j, i
	}
	if j-i <= 1 {
		return true
	}
	if i == 0 || j == n+1 {
		return false
	}
	for _, a := range t.Blocks {
		switch {
		case i == a && j == a+t.Size-1:
			return true
		case t.Size == 4 && j-i == 2 && i >= a && j <= a+3:
			return true
		}
	}
	return false
}

// Description names the topology for people: "cascaded triplets 1-2-3,
// 3-4-5".
func (t Topology) Description() string {
	switch t.Size {
	case 0:
		return "folded canonical form"
	case -1:
		return "as given"
	}
	var parts []string
	for _, a := range t.Blocks {
		var r []string
		for k := 0; k < t.Size; k++ {
			r = append(r, fmt.Sprint(a+k))
		}
		parts = append(parts, strings.Join(r, "-"))
	}
	kind := "triplets"
	if t.Size == 4 {
		kind = "quadruplets"
	}
	return "cascaded " + kind + " " + strings.Join(parts, ", ")
}

// CascadeTopology returns the pattern of name ("folded", "triplets" or
// "quadruplets") for order n and nz finite transmission zeros. Triplets
// chain on shared resonators, 1-2-3, 3-4-5, ..., one per zero (needs
// 2 nz + 1 <= N); quadruplets chain the same way, 1-2-3-4, 4-5-6-7, ...,
// one per pair of zeros (nz even, 3 nz/2 + 1 <= N). Chained blocks keep
// the shortest path from source to load at N - nz resonators, which
// allows nz finite zeros (the minimum-path rule, Cameron, Kudsia &
// Mansour 2007, ch. 8; recalled from memory).
func CascadeTopology(name string, n, nz int) (Topology, error) {
	t := Topology{Name: name, Order: n}
	switch name {
	case "folded":
		return t, nil
	case "triplets":
		if nz < 1 || 2*nz+1 > n {
			return t, fmt.Errorf("filter: cascaded triplets need 1 to %d transmission zeros for order %d (one triplet per zero, 2 nz + 1 <= N), got %d", (n-1)/2, n, nz)
		}
		t.Size = 3
		for k := 0; k < nz; k++ {
			t.Blocks = append(t.Blocks, 1+2*k)
		}
	case "quadruplets":
		if nz < 2 || nz%2 != 0 || 3*nz/2+1 > n {
			return t, fmt.Errorf("filter: cascaded quadruplets need an even number of transmission zeros, 2 to %d for order %d (one quadruplet per pair, 3 nz/2 + 1 <= N), got %d", 2*((n-1)/3), n, nz)
		}
		t.Size = 4
		for k := 0; k < nz/2; k++ {
			t.Blocks = append(t.Blocks, 1+3*k)
		}
	default:
		return t, fmt.Errorf("filter: unknown topology %q; use folded, triplets or quadruplets", name)
	}
	return t, nil
}

// cascadeTol is the largest forbidden entry, relative to the largest entry
// of the matrix, at which the transform counts as converged and the
// forbidden entries are set to exact zeros: rounding level.
const cascadeTol = 1e-14

// Rearrange carries the coupling matrix m (source-1 and N-load the only
// port couplings, as in the folded form) into topology t by an orthogonal
// similarity transform M' = Q M Q^T of the inner resonators 2..N-1, which
// leaves the response unchanged (Q orthogonal, the ports untouched;
// Cameron, Kudsia & Mansour 2007, ch. 8). The entries t does not allow are
// exact zeros in the result, and the result is exactly symmetric.
//
// Method (derived; the published route is a fixed sequence of plane
// rotations with closed-form angles, Cameron 2003 and CKM ch. 9, which is
// not reproduced here): a Gauss-Newton iteration on the orthogonal group.
// With Q = I + G + ..., G skew, the forbidden entries change to first order
// by (G M - M G)_ij; each step solves that linear least-squares problem for
// G (minimum norm, by SVD), applies the exactly orthogonal Cayley transform
// Q = (I - G/2)^-1 (I + G/2), and halves the step while the forbidden
// entries do not shrink. It converges quadratically once near a solution;
// from the given matrix first, then from seeded random rotations of it
// (several solutions exist: the blocks may realise the zeros in different
// orders). An error says when no start converges.
func Rearrange(m mat.Matrix, t Topology) (*mat.Dense, error) {
	n, err := checkMatrix(m)
	if err != nil {
		return nil, err
	}
	if n != t.Order {
		return nil, fmt.Errorf("filter: topology of order %d for a matrix of order %d", t.Order, n)
	}
	w := mat.DenseCopyOf(m)
	scale := 0.0
	for i := 0; i < n+2; i++ {
		for j := 0; j < n+2; j++ {
			scale = math.Max(scale, math.Abs(w.At(i, j)))
		}
	}
	// Ports: only S-1, N-L and S-L may be coupled (entries at rounding
	// level, as the folded reduction leaves them, count as zero).
	for j := 2; j <= n; j++ {
		for _, v := range [][2]int{{0, j}, {n + 1, j - 1}} {
			if math.Abs(w.At(v[0], v[1])) > 1e-12*scale {
				return nil, errors.New("filter: rearranging needs a matrix whose source couples to resonator 1 only and whose load couples to resonator N only, as the folded form of a design with at most N-2 zeros")
			}
			w.Set(v[0], v[1], 0)
			w.Set(v[1], v[0], 0)
		}
	}
	var forb [][2]int
	for i := 1; i <= n; i++ {
		for j := i + 1; j <= n; j++ {
			if !t.Allowed(i, j) {
				forb = append(forb, [2]int{i, j})
			}
		}
	}
	if len(forb) == 0 {
		return symmetrized(w), nil
	}
	var gens [][2]int
	for p := 2; p < n; p++ {
		for q := p + 1; q < n; q++ {
			gens = append(gens, [2]int{p, q})
		}
	}
	rng := rand.New(rand.NewPCG(1, 2))
	for start := 0; start < 40; start++ {
		x := mat.DenseCopyOf(w)
		if start > 0 {
			a := mat.NewDense(n+2, n+2, nil)
			for _, g := range gens {
				v := math.Pi * (2*rng.Float64() - 1)
				a.Set(g[0], g[1], v)
				a.Set(g[1], g[0], -v)
			}
			x = cayley(x, a)
		}
		if gaussNewton(x, forb, gens, scale) {
			for _, f := range forb {
				x.Set(f[0], f[1], 0)
				x.Set(f[1], f[0], 0)
			}
			return symmetrized(x), nil
		}
	}
	return nil, fmt.Errorf("filter: could not carry the matrix into %s (no start of the iteration converged); the zeros may not be realisable by that topology", t.Description())
}

// symmetrized copies the upper triangle of x to the lower one.
func symmetrized(x *mat.Dense) *mat.Dense {
	n, _ := x.Dims()
	for i := 0; i < n; i++ {
		for j := i + 1; j < n; j++ {
			x.Set(j, i, x.At(i, j))
		}
	}
	return x
}

// gaussNewton iterates on x in place; it reports convergence.
func gaussNewton(x *mat.Dense, forb, gens [][2]int, scale float64) bool {
	nn, _ := x.Dims()
	resid := func(y *mat.Dense) (*mat.VecDense, float64) {
		r := mat.NewVecDense(len(forb), nil)
		worst := 0.0
		for k, f := range forb {
			v := y.At(f[0], f[1])
			r.SetVec(k, -v)
			worst = math.Max(worst, math.Abs(v))
		}
		return r, worst
	}
	r, worst := resid(x)
	for it := 0; it < 200; it++ {
		if worst <= cascadeTol*scale {
			return true
		}
		// Jacobian: d M_ij / d g_pq = [i==p] M_qj - [i==q] M_pj - [j==q] M_ip + [j==p] M_iq.
		jac := mat.NewDense(len(forb), len(gens), nil)
		for c, g := range gens {
			p, q := g[0], g[1]
			for k, f := range forb {
				i, j := f[0], f[1]
				v := 0.0
				if i == p {
					v += x.At(q, j)
				}
				if i == q {
					v -= x.At(p, j)
				}
				if j == q {
					v -= x.At(i, p)
				}
				if j == p {
					v += x.At(i, q)
				}
				jac.Set(k, c, v)
			}
		}
		var svd mat.SVD
		if !svd.Factorize(jac, mat.SVDFull) {
			return false
		}
		rank := svd.Rank(1e-12)
		if rank == 0 {
			return false
		}
		var step mat.Dense
		svd.SolveTo(&step, r, rank)
		improved := false
		for h := 1.0; h > 1e-6; h /= 2 {
			a := mat.NewDense(nn, nn, nil)
			for c, g := range gens {
				v := h * step.At(c, 0)
				a.Set(g[0], g[1], v)
				a.Set(g[1], g[0], -v)
			}
			y := cayley(x, a)
			r2, w2 := resid(y)
			if w2 < worst {
				x.Copy(y)
				r, worst = r2, w2
				improved = true
				break
			}
		}
		if !improved {
			return worst <= cascadeTol*scale
		}
	}
	return worst <= cascadeTol*scale
}

// cayley returns Q x Q^T with the orthogonal Q = (I - a/2)^-1 (I + a/2) of
// the skew matrix a.
func cayley(x, a *mat.Dense) *mat.Dense {
	n, _ := x.Dims()
	lhs := mat.NewDense(n, n, nil)
	rhs := mat.NewDense(n, n, nil)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			v := a.At(i, j) / 2
			id := 0.0
			if i == j {
				id = 1
			}
			lhs.Set(i, j, id-v)
			rhs.Set(i, j, id+v)
		}
	}
	var q mat.Dense
	if err := q.Solve(lhs, rhs); err != nil {
		return mat.DenseCopyOf(x)
	}
	var t, out mat.Dense
	t.Mul(&q, x)
	out.Mul(&t, q.T())
	return &out
}

// BlockZeros returns the transmission zero each triplet of t realises in the
// matrix m (normalised Omega), in block order: for the triplet a, b = a+1,
// c = a+2 the transfer from a to c through b and directly vanishes where
// M_ac (Omega + M_bb) = M_ab M_bc (derived from the node equations of the
// three resonators, A = Omega W + M), that is
//
//	Omega_z = M_ab M_bc / M_ac - M_bb.
//
// It returns nil for other topologies.
func BlockZeros(m mat.Matrix, t Topology) []float64 {
	if t.Size != 3 {
		return nil
	}
	var z []float64
	for _, a := range t.Blocks {
		b, c := a+1, a+2
		z = append(z, m.At(a, b)*m.At(b, c)/m.At(a, c)-m.At(b, b))
	}
	return z
}

// Rearranged returns a copy of the design whose coupling matrix (the field
// Folded, which Response, Check, Delay and Realise read) is carried into
// topology t (Rearrange), with K, QextIn and QextOut read from it and
// Topology set.
func (d *Design) Rearranged(t Topology) (*Design, error) {
	if d == nil || d.Folded == nil {
		return nil, errors.New("filter: Rearranged needs a synthesised design (from Synthesize)")
	}
	if t.Size == 3 && len(d.RealPairs) > 0 {
		return nil, errors.New("filter: a triplet realises one zero on the frequency axis; real-axis zero pairs need quadruplets (or the folded form)")
	}
	m, err := Rearrange(d.Folded, t)
	if err != nil {
		return nil, err
	}
	c := *d
	c.Folded = m
	c.Topology = t
	n := d.Order()
	c.K = make([]float64, n-1)
	for i := 1; i < n; i++ {
		// The main line keeps non-negative signs: negate a resonator's
		// row and column where needed (a similarity with diag(+-1)).
		if m.At(i, i+1) < 0 {
			for j := 0; j < n+2; j++ {
				m.Set(i+1, j, -m.At(i+1, j))
			}
			for j := 0; j < n+2; j++ {
				m.Set(j, i+1, -m.At(j, i+1))
			}
		}
		c.K[i-1] = d.FBW * m.At(i, i+1)
	}
	c.QextIn = 1 / (d.FBW * m.At(0, 1) * m.At(0, 1))
	c.QextOut = 1 / (d.FBW * m.At(n, n+1) * m.At(n, n+1))
	return &c, nil
}
