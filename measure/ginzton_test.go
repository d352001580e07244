package measure

import (
	"math"
	"math/cmplx"
	"testing"

	"cylcav/touchstone"
)

// ginztonTol is the relative agreement required between Analyze and the
// half-power construction on a noise-free sweep: the crossings are
// interpolated linearly between points 1/400 of a loaded bandwidth
// apart, which leaves an error of order (1/400)^2 (derived), far below
// this; the rest is the fit's convergence.
const ginztonTol = 1e-4

// TestGinztonHalfPowerPoints checks the reflection fit against the
// textbook construction of the Q circle (E. L. Ginzton, Microwave
// Measurements, McGraw-Hill, 1957, ch. 9; also D. Kajfez, Q Factor
// Measurements Using MATLAB, Artech House, 2011, ch. 2), by a route that
// shares nothing with the linear fractional fit. No published worked
// example with numbers was at hand, so the check is against the closed
// form. A parallel resonator coupled to a matched line has, at the
// detuned-open reference, the normalised input admittance
//
//	y = g + j b = (1 + j Q0 x) / beta,   x = f/f0 - f0/f,
//
// and the construction reads three Q factors off the sweep from where the
// locus of y crosses three arcs:
//
//	|b| = g      unloaded Q:  Q0   = 2 / (x2 - x1)
//	|b| = g + 1  loaded Q:    QL   = 2 / (x2 - x1)
//	|b| = 1      external Q:  Qext = 2 / (x2 - x1)
//
// with x1, x2 the detunings of the two crossings; and the reflection
// coefficient at resonance gives beta = (1 - |G0|)/(1 + |G0|) undercoupled,
// its inverse overcoupled. The test finds the crossings on the sampled
// reflection (y = (1 - G)/(1 + G)) and checks Analyze's QL, beta and Q0,
// and the identities QL = Q0/(1 + beta), Qext = Q0/beta, 1/QL = 1/Q0 + 1/Qext.
func TestGinztonHalfPowerPoints(t *testing.T) {
	for _, tc := range []struct {
		name     string
		q0, beta float64
		over     bool
	}{
		{"undercoupled", 8000, 0.45, false},
		{"critical-ish", 12000, 0.9, false},
		{"overcoupled", 5000, 2.6, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			const f0 = 9.4e9
			ql := tc.q0 / (1 + tc.beta)
			bw := f0 / ql
			// 8 loaded bandwidths each side, 400 points per bandwidth
			n := 16*400 + 1
			d := &touchstone.Data{Ports: 1, Z0: []float64{50}, Freq: make([]float64, n), S: [][]complex128{make([]complex128, n)}}
			for i := range d.Freq {
				f := f0 - 8*bw + float64(i)*bw/400
				x := f/f0 - f0/f
				y := complex(1, tc.q0*x) / complex(tc.beta, 0)
				d.Freq[i] = f
				d.S[0][i] = (1 - y) / (1 + y)
			}
			// The construction, from the sampled reflection alone.
			g0 := cmplx.Abs(d.S[0][n/2])
			beta := (1 - g0) / (1 + g0)
			if tc.over {
				beta = 1 / beta
			}
			q := func(arc func(g, b float64) float64) float64 {
				var xs []float64
				for i := 1; i < n; i++ {
					ya := (1 - d.S[0][i-1]) / (1 + d.S[0][i-1])
					yb := (1 - d.S[0][i]) / (1 + d.S[0][i])
					ha, hb := arc(real(ya), imag(ya)), arc(real(yb), imag(yb))
					if ha*hb < 0 {
						fa, fb := d.Freq[i-1], d.Freq[i]
						f := fa + (fb-fa)*ha/(ha-hb)
						xs = append(xs, f/f0-f0/f)
					}
				}
				if len(xs) != 2 {
					t.Fatalf("%d crossings, want 2", len(xs))
				}
				return 2 / (xs[1] - xs[0])
			}
			qU := q(func(g, b float64) float64 { return math.Abs(b) - g })
			qL := q(func(g, b float64) float64 { return math.Abs(b) - g - 1 })
			qE := q(func(g, b float64) float64 { return math.Abs(b) - 1 })

			// The construction itself against the closed forms.
			rel := func(what string, got, want float64) {
				t.Helper()
				if !(math.Abs(got-want) <= ginztonTol*math.Abs(want)) {
					t.Errorf("%s = %.8g, want %.8g", what, got, want)
				}
			}
			rel("construction Q0", qU, tc.q0)
			rel("construction QL", qL, ql)
			rel("construction Qext", qE, tc.q0/tc.beta)
			rel("construction 1/QL", 1/qL, 1/qU+1/qE)
			rel("beta from |G0|", beta, tc.beta)

			rs, err := Analyze(d, Settings{MaxDelay: -1})
			if err != nil {
				t.Fatal(err)
			}
			if len(rs) != 1 {
				t.Fatalf("%d resonances, want 1", len(rs))
			}
			r := rs[0]
			if r.Problem != "" {
				t.Fatal(r.Problem)
			}
			rel("fitted f0", r.F0, f0)
			rel("fitted QL vs construction", r.QL, qL)
			rel("fitted Q0 vs construction", r.Q0, qU)
			rel("fitted beta vs |G0|", r.Beta1, beta)
			rel("fitted Q0/beta vs construction Qext", r.Q0/r.Beta1, qE)
		})
	}
}
