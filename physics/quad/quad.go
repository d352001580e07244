// Package quad holds the one Gauss-Legendre quadrature of the project:
// the n-point rule on [-1, 1] and composite rules of equal panels on an
// interval, used wherever a library package integrates fields (stored
// energies, filling factors, tuning integrals).
package quad

import (
	"math"
	"sync"
)

// Node is one node of a rule on an interval: position X and weight W.
type Node struct{ X, W float64 }

var (
	mu    sync.Mutex
	cache = map[int][2][]float64{}
)

// GaussLegendre returns the n nodes (ascending) and weights of the
// Gauss-Legendre rule on [-1, 1], exact for polynomials of degree up to
// 2n - 1, by Newton's method on the three-term recurrence of the Legendre
// polynomials from Tricomi's initial guesses (DLMF 3.5(v), 18.9.1; Press et
// al., Numerical Recipes, 3rd ed., sec. 4.6). Rules are computed once per
// n and shared: the caller must not modify the slices.
func GaussLegendre(n int) (x, w []float64) {
	mu.Lock()
	defer mu.Unlock()
	if c, ok := cache[n]; ok {
		return c[0], c[1]
	}
	x, w = make([]float64, n), make([]float64, n)
	for i := range (n + 1) / 2 {
		z := math.Cos(math.Pi * (float64(i) + 0.75) / (float64(n) + 0.5))
		var dp float64
		for range 100 {
			p1, p2 := 1.0, 0.0
			for j := 1; j <= n; j++ {
				p1, p2 = ((2*float64(j)-1)*z*p1-(float64(j)-1)*p2)/float64(j), p1
			}
			dp = float64(n) * (z*p1 - p2) / (z*z - 1)
			dz := p1 / dp
			z -= dz
			if math.Abs(dz) < 1e-16 {
				break
			}
		}
		x[i], x[n-1-i] = -z, z
		w[i] = 2 / ((1 - z*z) * dp * dp)
		w[n-1-i] = w[i]
	}
	cache[n] = [2][]float64{x, w}
	return x, w
}

// Rule returns the n-point Gauss-Legendre rule mapped to [lo, hi].
func Rule(lo, hi float64, n int) []Node {
	return Composite(lo, hi, 1, n)
}

// Composite returns the composite rule of panels equal panels on [lo, hi],
// each with the n-point Gauss-Legendre rule.
func Composite(lo, hi float64, panels, n int) []Node {
	x, w := GaussLegendre(n)
	h := (hi - lo) / float64(panels)
	out := make([]Node, 0, panels*n)
	for p := range panels {
		c := lo + (float64(p)+0.5)*h
		for k := range x {
			out = append(out, Node{c + x[k]*h/2, w[k] * h / 2})
		}
	}
	return out
}
