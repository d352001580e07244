package measure

import (
	"math"
	"math/cmplx"
	"testing"

	"cylcav/touchstone"
)

// TestLongRoundTripDelay: a broad transmission resonance (QL 560 at
// 15 GHz, a fitted window near 160 MHz) measured through cables of 4 ns
// each way: the reflections see 8 ns, more than the inverse of the
// window. The lumped two-port model (Kajfez 2011, ch. 2; the model of
// gen_sweeps.py) with known beta1, beta2 and Q0 must come back; before
// the reflection fits searched delays beyond the window's inverse, beta1
// came out 70 % high.
func TestLongRoundTripDelay(t *testing.T) {
	const f0, q0, b1, b2, tau = 15e9, 637.0, 0.0827, 0.0491, 4e-9
	n := 4001
	d := &touchstone.Data{Version: "1.1", Ports: 2, Z0: []float64{50, 50}, Freq: make([]float64, n), S: make([][]complex128, 4)}
	for k := range d.S {
		d.S[k] = make([]complex128, n)
	}
	for i := range n {
		f := 14e9 + 2e9*float64(i)/float64(n-1)
		d.Freq[i] = f
		u := f/f0 - f0/f
		den := complex(1+b1+b2, q0*u)
		dl := cmplx.Exp(complex(0, -2*math.Pi*f*tau))
		s21 := 3.16e-4*cmplx.Exp(complex(0, -2*math.Pi*f*0.5e-9)) + dl*complex(2*math.Sqrt(b1*b2), 0)/den
		d.S[0][i] = 0.97 * dl * dl * (1 - complex(2*b1, 0)/den)
		d.S[1][i], d.S[2][i] = s21, s21
		d.S[3][i] = 0.97 * dl * dl * (1 - complex(2*b2, 0)/den)
	}
	res, err := Analyze(d, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	if len(res) != 1 {
		t.Fatalf("%d resonances, want 1", len(res))
	}
	r := res[0]
	// delayTol: noise-free data, but the leakage in S21 has its own delay
	// (0.5 ns, not 4 ns), which the one-delay model leaves as a slight
	// tilt of the background: 2e-3 in Q0 here.
	const delayTol = 5e-3
	if math.Abs(r.Beta1/b1-1) > delayTol || math.Abs(r.Beta2/b2-1) > delayTol || math.Abs(r.Q0/q0-1) > delayTol {
		t.Errorf("beta1 %.6g, beta2 %.6g, Q0 %.6g; want %g, %g, %g", r.Beta1, r.Beta2, r.Q0, b1, b2, q0)
	}
}
