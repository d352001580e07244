package filter

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

func checkG(g []float64) error {
	n := len(g) - 2
	if n < 1 || n > MaxOrder {
		return fmt.Errorf("filter: need element values g_0..g_{N+1} with N in 1..%d, got %d values", MaxOrder, len(g))
	}
	for i, v := range g {
		if !(v > 0) || math.IsInf(v, 0) {
			return fmt.Errorf("filter: element value g_%d must be > 0 and finite, got %g", i, v)
		}
	}
	return nil
}

func checkFBW(fbw float64) error {
	if !(fbw > 0 && fbw < 1) {
		return fmt.Errorf("filter: fractional bandwidth must be in (0, 1), got %g", fbw)
	}
	return nil
}

// Couplings returns the design values of an all-pole direct-coupled
// resonator bandpass filter from its lowpass prototype element values
// g = [g_0, ..., g_{N+1}] and fractional bandwidth fbw = BW/f0
// (Hong & Lancaster 2001, sec. 8.1, design equations of the coupled-resonator
// filter; the same relations in inverter form are Cohn 1957):
//
//	k_{i,i+1} = fbw / sqrt(g_i g_{i+1}),  i = 1..N-1,
//	Qext_in   = g_0 g_1 / fbw,
//	Qext_out  = g_N g_{N+1} / fbw.
//
// k has N-1 entries, k[0] = k_{1,2}. The relations are exact for
// frequency-independent couplings with the mapping of LowpassOmega; for real
// cavities they are the usual narrow-band approximation.
// g must hold 3..MaxOrder+2 positive finite values and fbw must be in (0, 1).
func Couplings(g []float64, fbw float64) (k []float64, qIn, qOut float64, err error) {
	if err := checkG(g); err != nil {
		return nil, 0, 0, err
	}
	if err := checkFBW(fbw); err != nil {
		return nil, 0, 0, err
	}
	n := len(g) - 2
	k = make([]float64, n-1)
	for i := 1; i < n; i++ {
		k[i-1] = fbw / math.Sqrt(g[i]*g[i+1]) // Hong & Lancaster 2001, sec. 8.1
	}
	qIn = g[0] * g[1] / fbw    // Hong & Lancaster 2001, sec. 8.1
	qOut = g[n] * g[n+1] / fbw // Hong & Lancaster 2001, sec. 8.1
	return k, qIn, qOut, nil
}

// AllPoleMatrix returns the normalised (N+2)x(N+2) coupling matrix of the
// all-pole prototype g = [g_0, ..., g_{N+1}]: the source (index 0), the N
// resonators and the load (index N+1) in a chain with
//
//	M_{i,i+1} = M_{i+1,i} = 1 / sqrt(g_i g_{i+1}),  i = 0..N,
//
// and every other entry zero (Cameron, Kudsia & Mansour 2007, ch. 8;
// the bandpass values of Couplings are fbw times these, and
// Qext = 1/(fbw M_{S1}^2)). The matrix is in the convention of Response.
func AllPoleMatrix(g []float64) (*mat.Dense, error) {
	if err := checkG(g); err != nil {
		return nil, err
	}
	n := len(g)
	m := mat.NewDense(n, n, nil)
	for i := 0; i+1 < n; i++ {
		v := 1 / math.Sqrt(g[i]*g[i+1])
		m.Set(i, i+1, v)
		m.Set(i+1, i, v)
	}
	return m, nil
}
