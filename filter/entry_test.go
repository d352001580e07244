package filter

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestEntry checks Design.Entry on random designs: exactly symmetric, 0
// wherever the folded canonical form has no coupling (entries (i, j) with
// j > N+1-i off the main line and the anti-diagonal band; Cameron 1999, the
// folded form's pattern), every main-line coupling M_i,i+1 kept (a
// coupling below MatrixZero would be no filter), and the response of the
// printed matrix equal to the design's to 1e-9 (the zeroed entries are
// rounding, not couplings).
func TestEntry(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	for trial := 0; trial < 50; trial++ {
		sp := randomSpec(rng)
		d, err := Synthesize(sp)
		if err != nil {
			t.Fatalf("Synthesize(%+v): %v", sp, err)
		}
		n := sp.Order
		printed := mat.DenseCopyOf(d.Folded)
		for i := 0; i < n+2; i++ {
			for j := 0; j < n+2; j++ {
				if d.Entry(i, j) != d.Entry(j, i) {
					t.Fatalf("Entry(%d,%d) != Entry(%d,%d)", i, j, j, i)
				}
				if j == i+1 && d.Entry(i, j) == 0 {
					t.Errorf("order %d: main-line M_%d,%d zeroed", n, i, j)
				}
				if j > i+1 && i+j > n+2 && d.Entry(i, j) != 0 {
					t.Errorf("order %d: M_%d,%d = %g outside the folded pattern", n, i, j, d.Entry(i, j))
				}
				printed.Set(i, j, d.Entry(i, j))
			}
		}
		ws := testOmegas(rng, 20)
		a11, a21, _ := omegaResponse(d.Folded, ws, nil)
		b11, b21, _ := omegaResponse(printed, ws, nil)
		for k := range ws {
			if math.Abs(sq(a21[k])-sq(b21[k])) > 1e-9 || math.Abs(sq(a11[k])-sq(b11[k])) > 1e-9 {
				t.Errorf("order %d at Omega %g: |S21|^2 %g vs printed %g", n, ws[k], sq(a21[k]), sq(b21[k]))
			}
		}
	}
}
