package measure

import (
	"fmt"
	"math"
	"math/cmplx"
)

// Circle is the linear fractional fit of one resonance's complex response
// (see the package documentation): S(f) = exp(-j 2 pi f Delay) (a1 t + a2)/(a3 t + 1)
// with t = f/fL - fL/f and fL the fitted f0.
type Circle struct {
	F0, F0Err float64    // resonant frequency and its standard uncertainty, Hz
	QL, QLErr float64    // loaded Q and its standard uncertainty
	Delay     float64    // cable delay removed, s
	Detuned   complex128 // S far from resonance (t -> infinity), delay removed
	Resonant  complex128 // S at f0, delay removed

	// Diameter is |Resonant - Detuned| / |Detuned|, the circle's diameter
	// normalised by the detuned magnitude, and DiameterErr its uncertainty.
	Diameter, DiameterErr float64

	Residual float64 // RMS distance between measured and fitted S
	Points   int     // points used
	Lo, Hi   float64 // the fitted window, Hz

	fL float64
	a  [3]complex128
}

// Model returns the fitted response at f, cable delay included.
func (c *Circle) Model(f float64) complex128 {
	t := f/c.fL - c.fL/f
	return cmplx.Exp(complex(0, -2*math.Pi*f*c.Delay)) * (c.a[0]*complex(t, 0) + c.a[1]) / (c.a[2]*complex(t, 0) + 1)
}

// minFitPoints is the fewest points FitCircle accepts: three complex
// unknowns and the delay need some redundancy for a residual.
const minFitPoints = 8

// reweights is the number of weight updates of the linear fractional fit;
// the weights converge in two or three (Kajfez 1994, sec. III).
const reweights = 4

// FitSettings tunes FitCircle. The zero value fits f0, QL and the circle
// with no cable delay.
type FitSettings struct {
	// MaxDelay bounds the cable delay searched, s; 0 fixes it at zero.
	MaxDelay float64

	// Fixed, when set, takes f0 and QL as known (fGuess and qGuess of
	// FitCircle) and fits only the circle's position and size: the
	// reflection circles of a transmission measurement, whose f0 and QL
	// the S21 fit gives. A small reflection circle on a large detuned
	// point (a weak coupling) is otherwise easily mistaken for a delay.
	Fixed bool
}

// FitCircle fits the linear fractional model to the sweep s over f
// (ascending, the window around one resonance). fGuess and qGuess are
// rough values of the resonant frequency and loaded Q (from FindPeaks);
// they scale the problem and need not be accurate unless set.Fixed.
func FitCircle(f []float64, s []complex128, fGuess, qGuess float64, set FitSettings) (Circle, error) {
	maxDelay := set.MaxDelay
	if len(f) != len(s) {
		return Circle{}, fmt.Errorf("measure: %d frequencies and %d S values", len(f), len(s))
	}
	if len(f) < minFitPoints {
		return Circle{}, fmt.Errorf("measure: resonance near %g Hz has %d points, the fit needs at least %d: sweep with a finer step", fGuess, len(f), minFitPoints)
	}
	if !(fGuess > 0) || !(qGuess > 0) {
		return Circle{}, fmt.Errorf("measure: guesses must be > 0, got f %g Hz, Q %g", fGuess, qGuess)
	}
	w := &workspace{f: f, s: s, q: qGuess, sc: make([]complex128, len(s)), x: make([]float64, len(f)), wt: make([]float64, len(f))}
	w.centre(fGuess)
	// While the delay is searched two weight updates rank the delays; the
	// final fit uses all of them.
	w.reweights = 2
	if set.Fixed {
		// 1 + j QL t with t0 = 0 in the scaled variable x = QL t: b3 = j.
		w.fixed, w.b3 = true, 1i
	}
	tau := 0.0
	if maxDelay > 0 {
		tau = w.searchDelay(maxDelay)
	}
	w.reweights = reweights
	b, sigma2, minv, err := w.solve(tau)
	if err != nil {
		return Circle{}, err
	}
	if !set.Fixed {
		// Recentre t on the fitted f0 so that the lumped model holds
		// exactly (t0 = 0); two passes move fL by far less than the
		// uncertainty of f0.
		for it := 0; it < 2; it++ {
			rel, _, _, _, _ := w.derived([6]float64{real(b[0]), imag(b[0]), real(b[1]), imag(b[1]), real(b[2]), imag(b[2])})
			if !(math.Abs(rel) < 0.5) {
				break
			}
			w.centre(w.fL * (1 + rel))
			if b, sigma2, minv, err = w.solve(tau); err != nil {
				return Circle{}, err
			}
		}
	}
	return w.circle(b, sigma2, minv, tau)
}

// centre sets fL and the scaled detuning x = q (f/fL - fL/f).
func (w *workspace) centre(fL float64) {
	w.fL = fL
	for i, f := range w.f {
		w.x[i] = w.q * (f/fL - fL/f)
	}
}

type workspace struct {
	f  []float64
	s  []complex128
	fL float64
	q  float64 // scale of t: x = q t
	sc []complex128
	x  []float64
	wt []float64

	reweights int // weight updates per solve

	fixed bool       // b3 known: fit b1, b2 only
	b3    complex128 // the known b3 when fixed
}

// searchDelay minimises the fit residual over the delay: a grid of
// delayGrid points over [-max, max], then golden-section search between
// the neighbours of the best grid point.
func (w *workspace) searchDelay(max float64) float64 {
	const delayGrid = 41
	// A phase ramp on a nearly constant |S| is itself an arc of a circle
	// (centred on the origin), which the linear fractional model fits with
	// a low QL; a delay whose fit puts QL outside qRange of the guess is
	// taken as such a false fit and refused.
	const qRange = 4
	cost := func(tau float64) float64 {
		b, s2, _, err := w.solve(tau)
		if err != nil {
			return math.Inf(1)
		}
		ql := 1 / math.Abs(imag(1/(b[2]*complex(w.q, 0))))
		if !(ql > w.q/qRange && ql < w.q*qRange) {
			return math.Inf(1)
		}
		return s2
	}
	step := 2 * max / (delayGrid - 1)
	best, bestC := 0.0, cost(0)
	for i := 0; i < delayGrid; i++ {
		tau := -max + float64(i)*step
		if c := cost(tau); c < bestC {
			best, bestC = tau, c
		}
	}
	half := step
	lo, hi := best-half, best+half
	const invPhi = 0.6180339887498949 // (sqrt 5 - 1)/2
	a, b := hi-invPhi*(hi-lo), lo+invPhi*(hi-lo)
	ca, cb := cost(a), cost(b)
	for i := 0; i < 40 && hi-lo > 1e-6*step; i++ {
		if ca < cb {
			hi, b, cb = b, a, ca
			a = hi - invPhi*(hi-lo)
			ca = cost(a)
		} else {
			lo, a, ca = a, b, cb
			b = lo + invPhi*(hi-lo)
			cb = cost(b)
		}
	}
	if tau := (lo + hi) / 2; cost(tau) < bestC {
		best, bestC = tau, cost(tau)
	}
	// A small circle on a large detuned point (a weak coupling) makes the
	// basin of the true delay far narrower than the grid step. There the
	// phase of S is almost the delay's ramp alone: its regression line
	// (the slope method of Kajfez 2011 ch. 6) starts a fixed-point
	// iteration that regresses the phase of S over the fitted circle.
	starts := []float64{best}
	if tau0, ok := w.phaseDelay(nil); ok && math.Abs(tau0) <= max {
		starts = append(starts, tau0)
	}
	for _, tau := range starts {
		for it := 0; it < 20; it++ {
			b, _, _, err := w.solve(tau)
			if err != nil {
				break
			}
			d, ok := w.phaseDelay(&b)
			if !ok || math.IsNaN(d) {
				break
			}
			tau += d
			if math.Abs(d) < 1e-9*step {
				break
			}
		}
		if math.Abs(tau) <= max {
			if c := cost(tau); c < bestC {
				best, bestC = tau, c
			}
		}
	}
	return best
}

// phaseDelay returns the delay of the least-squares line through the
// unwrapped phase of S over the window, tau = -slope / (2 pi); with a
// circle b (fitted after removing the delay in w.sc), of the phase of the
// remaining ratio w.sc / circle, the correction to that delay.
func (w *workspace) phaseDelay(b *[3]complex128) (float64, bool) {
	n := len(w.f)
	var sf, sp, sff, sfp float64
	prev, off := 0.0, 0.0
	for i, f := range w.f {
		v := w.s[i]
		if b != nil {
			x := complex(w.x[i], 0)
			v = w.sc[i] / ((b[0]*x + b[1]) / (b[2]*x + 1))
		}
		ph := cmplx.Phase(v)
		if i > 0 {
			for ph+off-prev > math.Pi {
				off -= 2 * math.Pi
			}
			for ph+off-prev < -math.Pi {
				off += 2 * math.Pi
			}
		}
		ph += off
		prev = ph
		x := f - w.fL
		sf += x
		sp += ph
		sff += x * x
		sfp += x * ph
	}
	den := float64(n)*sff - sf*sf
	if den == 0 {
		return 0, false
	}
	return -(float64(n)*sfp - sf*sp) / den / (2 * math.Pi), true
}

// solve runs the reweighted linear least squares at delay tau and returns
// the parameters b (in the scaled variable x = q t), the residual variance
// per complex point and the inverse normal matrix.
func (w *workspace) solve(tau float64) (b [3]complex128, sigma2 float64, minv [3][3]complex128, err error) {
	for i, f := range w.f {
		w.sc[i] = w.s[i] * cmplx.Exp(complex(0, 2*math.Pi*f*tau))
		w.wt[i] = 1
	}
	if w.fixed {
		return w.solveFixed()
	}
	for it := 0; it < w.reweights; it++ {
		var m [3][3]complex128
		var r [3]complex128
		for i, x := range w.x {
			row := [3]complex128{complex(x, 0), 1, -complex(x, 0) * w.sc[i]}
			wt := complex(w.wt[i], 0)
			for j := 0; j < 3; j++ {
				cj := cmplx.Conj(row[j]) * wt
				for k := 0; k < 3; k++ {
					m[j][k] += cj * row[k]
				}
				r[j] += cj * w.sc[i]
			}
		}
		minv, err = inverse3(m)
		if err != nil {
			return b, 0, minv, err
		}
		for j := 0; j < 3; j++ {
			b[j] = minv[j][0]*r[0] + minv[j][1]*r[1] + minv[j][2]*r[2]
		}
		for i, x := range w.x {
			d := b[2]*complex(x, 0) + 1
			w.wt[i] = 1 / (real(d)*real(d) + imag(d)*imag(d))
		}
	}
	var ss float64
	for i, x := range w.x {
		e := (b[0]*complex(x, 0)+b[1])/(b[2]*complex(x, 0)+1) - w.sc[i]
		ss += real(e)*real(e) + imag(e)*imag(e)
	}
	return b, ss / float64(len(w.x)-3), minv, nil
}

// solveFixed solves for b1, b2 with b3 = w.b3 known: b1 x + b2 = S (b3 x + 1),
// weighted by 1/|b3 x + 1|^2, which makes the fit residual the distance
// between measured and fitted S. minv has zeros in the row and column of b3.
func (w *workspace) solveFixed() (b [3]complex128, sigma2 float64, minv [3][3]complex128, err error) {
	var m [2][2]complex128
	var r [2]complex128
	for i, x := range w.x {
		den := w.b3*complex(x, 0) + 1
		wt := complex(1/(real(den)*real(den)+imag(den)*imag(den)), 0)
		row := [2]complex128{complex(x, 0), 1}
		y := w.sc[i] * den
		for j := 0; j < 2; j++ {
			cj := cmplx.Conj(row[j]) * wt
			m[j][0] += cj * row[0]
			m[j][1] += cj * row[1]
			r[j] += cj * y
		}
	}
	det := m[0][0]*m[1][1] - m[0][1]*m[1][0]
	if cmplx.Abs(det) == 0 {
		return b, 0, minv, fmt.Errorf("measure: the sweep does not determine a resonance circle (singular fit)")
	}
	minv[0][0], minv[0][1] = m[1][1]/det, -m[0][1]/det
	minv[1][0], minv[1][1] = -m[1][0]/det, m[0][0]/det
	b[0] = minv[0][0]*r[0] + minv[0][1]*r[1]
	b[1] = minv[1][0]*r[0] + minv[1][1]*r[1]
	b[2] = w.b3
	var ss float64
	for i, x := range w.x {
		e := (b[0]*complex(x, 0)+b[1])/(b[2]*complex(x, 0)+1) - w.sc[i]
		ss += real(e)*real(e) + imag(e)*imag(e)
	}
	return b, ss / float64(len(w.x)-2), minv, nil
}

// inverse3 inverts a complex 3x3 matrix by Gauss-Jordan elimination with
// partial pivoting.
func inverse3(m [3][3]complex128) ([3][3]complex128, error) {
	var inv [3][3]complex128
	for i := range inv {
		inv[i][i] = 1
	}
	scale := 0.0
	for i := range m {
		for j := range m[i] {
			scale = math.Max(scale, cmplx.Abs(m[i][j]))
		}
	}
	for c := 0; c < 3; c++ {
		p := c
		for r := c + 1; r < 3; r++ {
			if cmplx.Abs(m[r][c]) > cmplx.Abs(m[p][c]) {
				p = r
			}
		}
		// singularTol: relative pivot size below which the points do not
		// determine a circle (all on a line or a point).
		const singularTol = 1e-14
		if cmplx.Abs(m[p][c]) <= singularTol*scale {
			return inv, fmt.Errorf("measure: the sweep does not determine a resonance circle (singular fit)")
		}
		m[c], m[p] = m[p], m[c]
		inv[c], inv[p] = inv[p], inv[c]
		d := 1 / m[c][c]
		for k := 0; k < 3; k++ {
			m[c][k] *= d
			inv[c][k] *= d
		}
		for r := 0; r < 3; r++ {
			if r == c {
				continue
			}
			g := m[r][c]
			for k := 0; k < 3; k++ {
				m[r][k] -= g * m[c][k]
				inv[r][k] -= g * inv[c][k]
			}
		}
	}
	return inv, nil
}

// derived are the quantities of the fit as functions of the six real
// parameters (Re, Im of b1, b2, b3 in the scaled variable); f0 is returned
// as (f0 - fL)/fL.
func (w *workspace) derived(p [6]float64) (f0, ql, diam float64, det, res complex128) {
	b1, b2, b3 := complex(p[0], p[1]), complex(p[2], p[3]), complex(p[4], p[5])
	a3 := b3 * complex(w.q, 0) // back to t = x/q
	g := 1 / a3
	t0 := -real(g)
	ql = 1 / math.Abs(imag(g))
	// f0/fL - fL/f0 = t0 (derived); f0 is returned as its offset from fL,
	// relative, written to keep its digits when t0 is tiny.
	f0 = (t0 + t0*t0/(math.Sqrt(t0*t0+4)+2)) / 2
	x0 := complex(w.q*t0, 0)
	det = b1 / b3
	res = (b1*x0 + b2) / (b3*x0 + 1)
	diam = cmplx.Abs(res-det) / cmplx.Abs(det)
	return
}

func (w *workspace) circle(b [3]complex128, sigma2 float64, minv [3][3]complex128, tau float64) (Circle, error) {
	p := [6]float64{real(b[0]), imag(b[0]), real(b[1]), imag(b[1]), real(b[2]), imag(b[2])}
	rel, ql, diam, det, res := w.derived(p)
	f0 := w.fL * (1 + rel)
	if math.IsNaN(f0) || math.IsInf(ql, 0) || cmplx.Abs(det) == 0 {
		return Circle{}, fmt.Errorf("measure: the sweep near %g Hz does not fit a resonance", w.fL)
	}
	if f0 < w.f[0] || f0 > w.f[len(w.f)-1] {
		return Circle{}, fmt.Errorf("measure: fitted resonance %g Hz lies outside the window %g..%g Hz", f0, w.f[0], w.f[len(w.f)-1])
	}
	// Real covariance of p from the complex one (circular noise):
	// Cov(Re bk, Re bl) = Cov(Im bk, Im bl) = s2/2 Re Minv_kl,
	// Cov(Re bk, Im bl) = -s2/2 Im Minv_kl (derived).
	var cov [6][6]float64
	for k := 0; k < 3; k++ {
		for l := 0; l < 3; l++ {
			h := minv[k][l] * complex(sigma2/2, 0)
			cov[2*k][2*l] = real(h)
			cov[2*k+1][2*l+1] = real(h)
			cov[2*k][2*l+1] = -imag(h)
			cov[2*k+1][2*l] = imag(h)
		}
	}
	var g [3][6]float64
	for i := range p {
		h := 1e-7 * math.Max(math.Hypot(p[i&^1], p[i|1]), 1e-9) // scale of the complex parameter
		pp, pm := p, p
		pp[i] += h
		pm[i] -= h
		f1, q1, d1, _, _ := w.derived(pp)
		f2, q2, d2, _, _ := w.derived(pm)
		g[0][i] = (f1 - f2) / (2 * h)
		g[1][i] = (q1 - q2) / (2 * h)
		g[2][i] = (d1 - d2) / (2 * h)
	}
	var v [3]float64
	for q := 0; q < 3; q++ {
		for i := 0; i < 6; i++ {
			for j := 0; j < 6; j++ {
				v[q] += g[q][i] * cov[i][j] * g[q][j]
			}
		}
	}
	c := Circle{
		F0: f0, F0Err: w.fL * math.Sqrt(v[0]), QL: ql, QLErr: math.Sqrt(v[1]),
		Diameter: diam, DiameterErr: math.Sqrt(v[2]),
		Delay: tau, Detuned: det, Resonant: res,
		Residual: math.Sqrt(sigma2), Points: len(w.f), Lo: w.f[0], Hi: w.f[len(w.f)-1], fL: w.fL,
		a: [3]complex128{b[0] * complex(w.q, 0), b[1], b[2] * complex(w.q, 0)},
	}
	return c, nil
}
