package filter

import "math"

// InFoldedPattern reports whether entry (i, j) of an (N+2)x(N+2) coupling
// matrix (0 = source, 1..N resonators, N+1 = load) may be non-zero in the
// folded canonical form produced by Synthesize:
//
//	|i - j| <= 1                 self couplings and the main line S-1-2-...-N-L,
//	i + j = N + 1                the cross couplings S-L, 1-N, 2-(N-1), ...,
//	i + j = N + 2                the diagonal cross couplings 1-L, 2-N, 3-(N-1), ...
//
// For symmetric responses the entries with i + j = N + 2 and the diagonal
// vanish; 1-L is non-zero only with N-1 or N finite zeros and S-L only in
// the fully canonical case (N finite zeros). Indices outside 0..N+1 report
// false.
func InFoldedPattern(order, i, j int) bool {
	n := order
	if i < 0 || j < 0 || i > n+1 || j > n+1 {
		return false
	}
	d := i - j
	return d >= -1 && d <= 1 || i+j == n+1 || i+j == n+2
}

// rotate applies the similarity rotation M <- R M R^T in the plane (p, q)
// chosen to annihilate M[r][q] (and M[q][r]) into M[r][p], r not in {p, q}
// (Cameron 1999; Cameron, Kudsia & Mansour 2007, sec. 8.3: a plane rotation
// with pivot [p, q] and angle theta_r = -arctan(M_rq / M_rp)). The new
// M[r][p] is sqrt(M_rp^2 + M_rq^2) >= 0. A rotation is orthogonal, so the
// eigenvalues and the response of the network are unchanged.
func rotate(m [][]float64, r, p, q int) {
	x, y := m[r][p], m[r][q]
	h := math.Hypot(x, y)
	if h == 0 || y == 0 {
		return
	}
	c, s := x/h, -y/h
	// Rows p and q.
	for j := range m {
		mp, mq := m[p][j], m[q][j]
		m[p][j] = c*mp - s*mq
		m[q][j] = s*mp + c*mq
	}
	// Columns p and q.
	for i := range m {
		mp, mq := m[i][p], m[i][q]
		m[i][p] = c*mp - s*mq
		m[i][q] = s*mp + c*mq
	}
}

// fold reduces a symmetric (N+2)x(N+2) coupling matrix, in place, to the
// folded canonical form of InFoldedPattern by plane rotations among the
// resonator indices 1..N only (source and load rows are never mixed, so the
// terminations and the response are preserved).
//
// Sequence (derived, after the outside-in, alternating row/column scheme of
// Cameron 1999 and Cameron, Kudsia & Mansour 2007, sec. 8.3): for
// r = 0, 1, 2, ...
//
//	row r:        annihilate M[r][k],     k = r+2 .. N-r,    pivot [r+1, k];
//	column N+1-r: annihilate M[k][N+1-r], k = r+2 .. N-r-1,  pivot [k, N-r].
//
// Each step only mixes indices that later steps no longer touch, and every
// pair of entries a rotation mixes outside the target row is a pair of
// zeros, so annihilated entries stay zero up to rounding. The number of
// rotations is about N^2/2 and the cost O(N^3).
func fold(m [][]float64) {
	n := len(m) - 2
	for r := 0; ; r++ {
		work := false
		for k := r + 2; k <= n-r; k++ {
			rotate(m, r, r+1, k)
			work = true
		}
		c := n + 1 - r
		for k := r + 2; k <= n-r-1; k++ {
			rotate(m, c, n-r, k)
			work = true
		}
		if !work {
			return
		}
	}
}
