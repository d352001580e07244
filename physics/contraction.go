package physics

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"
)

// This file holds the thermal contraction of the wall metals: the relative
// length change of a metal between a reference temperature and any other,
// from published cryogenic data where a row has them and from the
// room-temperature linear expansion coefficient (Conductor.Expansion)
// elsewhere.
//
// A linear coefficient is wrong far below room temperature: the expansion
// coefficient falls towards zero on cooling (Debye T^3 plus an electronic
// term linear in T), so alpha (T - 293 K) overstates the contraction of
// niobium and of copper from 293 K to 4 K by about 50 %.
// Below DefaultLinearTMin (-50 C) only integrated data are used.

// StrainReference is the temperature to which the published integrated
// contraction data are referred, 293 K (Marquardt, Le & Radebaugh 2000;
// Ekin 2006, Appendix A6.4).
const StrainReference = 293.0 // kelvin

// TemperatureTolerance is the slack, in kelvin, of every range check on a
// temperature. A temperature typed in Celsius or Fahrenheit is converted by
// adding 273.15, which rounds: "-50C" becomes 223.14999999999998 K while the
// constant ZeroCelsius - 50 is 223.15 K, one unit in the last place apart.
// 1e-9 K is far below any meaningful temperature difference and far above
// that rounding (about 3e-14 K near room temperature).
const TemperatureTolerance = 1e-9

// TemperatureIn reports whether t lies in [lo, hi] to TemperatureTolerance.
// Every range check on a temperature uses it, so that a limit typed in any
// unit is accepted exactly at the limit.
//
// Special cases are:
//
//	TemperatureIn(NaN, lo, hi) = false
func TemperatureIn(t, lo, hi float64) bool {
	return t >= lo-TemperatureTolerance && t <= hi+TemperatureTolerance
}

// contractionKind selects the form of a Contraction's data.
type contractionKind uint8

const (
	// nistPoly is the NIST integrated-expansion fit
	// 1e5 (L - L293)/L293 = a + b T + c T^2 + d T^3 + e T^4 for T > TLow,
	// and the constant f below TLow.
	nistPoly contractionKind = iota + 1
	// nistLogAlpha is the NIST fit of the expansion coefficient
	// log10(1e6 alpha) = sum_i c_i (log10 T)^i, integrated (derived).
	nistLogAlpha
	// table is a table of integrated contraction (L293 - LT)/L293 in
	// percent at tabulated temperatures, interpolated monotonically.
	table
)

// Contraction is the published low-temperature thermal contraction of one
// wall metal: integrated data over [TMin, TMax] kelvin with their source.
// The zero value means no data. Values are built by the library rows of
// Conductors; Conductor.Strain evaluates them.
type Contraction struct {
	// Label names the data in a few words for output ("NIST fit 4-300 K").
	Label string
	// Source names the publication the data come from.
	Source string
	// TMin and TMax bound the data, in kelvin.
	TMin, TMax float64
	// FitError is the stated error of the fit or table relative to the
	// measured data, as a fraction (0.05 for 5 %).
	FitError float64

	kind  contractionKind
	coef  []float64    // fit coefficients (see contractionKind)
	tLow  float64      // nistPoly: below tLow the fit is the constant fLow
	fLow  float64      // nistPoly: the constant, in 1e-5
	nodes [][2]float64 // table: (T in K, contraction in %), ascending T
}

// Known reports whether c holds data.
func (c Contraction) Known() bool { return c.kind != 0 }

// strain returns (L(T) - L293)/L293 for T in [TMin, TMax].
func (c Contraction) strain(T float64) float64 {
	switch c.kind {
	case nistPoly:
		if T < c.tLow {
			return 1e-5 * c.fLow
		}
		p := c.coef
		return 1e-5 * (p[0] + T*(p[1]+T*(p[2]+T*(p[3]+T*p[4])))) // NIST fit form, Marquardt et al. 2000
	case nistLogAlpha:
		// ln(L/L293) = -integral_T^293 alpha dT' with alpha = (1/L) dL/dT
		// (definition of the instantaneous coefficient; derived).
		return math.Expm1(-integrate(c.alpha, T, StrainReference))
	case table:
		return -0.01 * pchip(c.nodes, T)
	}
	panic("physics: strain of a Contraction without data")
}

// alpha returns the NIST fit of the linear expansion coefficient, 1/K.
func (c Contraction) alpha(T float64) float64 {
	x := math.Log10(T)
	s := 0.0
	for i := len(c.coef) - 1; i >= 0; i-- {
		s = s*x + c.coef[i]
	}
	return 1e-6 * math.Pow(10, s) // NIST form: log10(alpha / 1e-6 K^-1) = sum c_i x^i
}

// integrate returns the integral of f over [a, b] by composite Simpson's
// rule with simpsonIntervals intervals (Abramowitz & Stegun 25.4.6). For
// the smooth expansion-coefficient fits over at most 300 K the step is
// under 0.3 K and the error below 1e-10 relative.
func integrate(f func(float64) float64, a, b float64) float64 {
	const simpsonIntervals = 1000
	h := (b - a) / simpsonIntervals
	s := f(a) + f(b)
	for i := 1; i < simpsonIntervals; i++ {
		w := 2.0
		if i%2 == 1 {
			w = 4
		}
		s += w * f(a+float64(i)*h)
	}
	return s * h / 3
}

// pchip interpolates the table nodes at x by the monotone piecewise cubic
// Hermite interpolant of Fritsch & Carlson (SIAM J. Numer. Anal. 17, 238,
// 1980), with the derivative formula of Fritsch & Butland (SIAM J. Sci.
// Stat. Comput. 5, 300, 1984) as used by Moler, Numerical Computing with
// MATLAB, 2004, sec. 3.4. A monotone table gives a monotone curve without
// overshoot between the nodes. x must lie within the nodes.
func pchip(nodes [][2]float64, x float64) float64 {
	n := len(nodes)
	k := sort.Search(n-1, func(i int) bool { return nodes[i+1][0] >= x })
	if k > n-2 {
		k = n - 2
	}
	slope := func(i int) float64 { // secant slope of interval i
		return (nodes[i+1][1] - nodes[i][1]) / (nodes[i+1][0] - nodes[i][0])
	}
	width := func(i int) float64 { return nodes[i+1][0] - nodes[i][0] }
	deriv := func(i int) float64 {
		if i == 0 || i == n-1 {
			// One-sided three-point end formula, shape-preserving
			// (Moler sec. 3.4).
			j, s := 0, 1.0
			if i == n-1 {
				j, s = n-2, -1
			}
			h0, h1 := width(j), width(j+int(s))
			d0, d1 := slope(j), slope(j+int(s))
			d := ((2*h0+h1)*d0 - h0*d1) / (h0 + h1)
			if math.Signbit(d) != math.Signbit(d0) {
				return 0
			}
			if math.Signbit(d0) != math.Signbit(d1) && math.Abs(d) > math.Abs(3*d0) {
				return 3 * d0
			}
			return d
		}
		d0, d1 := slope(i-1), slope(i)
		if d0*d1 <= 0 {
			return 0
		}
		h0, h1 := width(i-1), width(i)
		w1, w2 := 2*h1+h0, h1+2*h0
		return (w1 + w2) / (w1/d0 + w2/d1)
	}
	h := width(k)
	t := (x - nodes[k][0]) / h
	y0, y1 := nodes[k][1], nodes[k+1][1]
	m0, m1 := deriv(k)*h, deriv(k+1)*h
	t2, t3 := t*t, t*t*t
	return (2*t3-3*t2+1)*y0 + (t3-2*t2+t)*m0 + (-2*t3+3*t2)*y1 + (t3-t2)*m1 // cubic Hermite basis
}

// Sources of the contraction data.
const (
	srcNISTfit = "NIST cryogenic material properties database, integrated linear expansion fit (L-L293)/L293 (E. D. Marquardt, J. P. Le and R. Radebaugh, Cryogenic Material Properties Database, 11th Int. Cryocooler Conf., 2000; trc.nist.gov/cryogenics/materials)"
	srcNISTcu  = "NIST cryogenic material properties database, OFHC copper linear expansion coefficient fit, 4-300 K (Marquardt, Le & Radebaugh 2000), integrated from T to 293 K (derived)"
	srcEkinNb  = "recalled from memory, J. W. Ekin, Experimental Techniques for Low-Temperature Measurements, Oxford University Press, 2006, Appendix A6.4 (niobium row: 4, 40, 77, 100, 150, 200, 250 K), interpolated by monotone cubic (derived)"
)

// contractionNIST304 is the NIST fit for austenitic stainless steel; NIST
// gives the one fit for 304, 304L, 310 and 316 (data 4-300 K, fit error 5 %).
func contractionNIST304() Contraction {
	return Contraction{
		Label:  "NIST cryogenic fit, 4-300 K",
		Source: srcNISTfit + ", 304 stainless (the same fit as 304L, 310 and 316)",
		TMin:   4, TMax: 300, FitError: 0.05,
		kind: nistPoly, coef: []float64{-2.9554e2, -3.9811e-1, 9.2683e-3, -2.0261e-5, 1.7127e-8},
		tLow: 23, fLow: -300.04,
	}
}

// contractionNIST6061 is the NIST fit for 6061-T6 aluminium (data 4-300 K,
// fit error 4 %; the same fit as 3003-F and 5083-O).
func contractionNIST6061() Contraction {
	return Contraction{
		Label:  "NIST cryogenic fit, 4-300 K",
		Source: srcNISTfit + ", 6061-T6 aluminium",
		TMin:   4, TMax: 300, FitError: 0.04,
		kind: nistPoly, coef: []float64{-4.1277e2, -3.0389e-1, 8.7696e-3, -9.9821e-6, 0},
		tLow: 18, fLow: -415.45,
	}
}

// contractionNISTInvar is the NIST fit for Fe-36Ni (data 4-300 K, fit error
// 5 %).
func contractionNISTInvar() Contraction {
	return Contraction{
		Label:  "NIST cryogenic fit, 4-300 K",
		Source: srcNISTfit + ", invar Fe-36Ni",
		TMin:   4, TMax: 300, FitError: 0.05,
		kind: nistPoly, coef: []float64{-5.265e1, 1.009e-1, 8.395e-4, -1.973e-6, 8.794e-11},
		tLow: 80, fLow: -40,
	}
}

// contractionNISTCopper is the NIST OFHC copper expansion-coefficient fit
// (4-300 K), integrated.
func contractionNISTCopper() Contraction {
	return Contraction{
		Label:  "NIST cryogenic expansion fit integrated, 4-300 K",
		Source: srcNISTcu,
		TMin:   4, TMax: 300, FitError: 0.01,
		kind: nistLogAlpha,
		coef: []float64{-17.9081289, 67.131914, -118.809316, 109.9845997, -53.8696089, 13.30247491, -1.30843441},
	}
}

// contractionEkinNiobium is Ekin's table for niobium, in percent
// contraction from 293 K (recalled from memory; see srcEkinNb).
func contractionEkinNiobium() Contraction {
	return Contraction{
		Label:  "Ekin 2006 table A6.4 (recalled), 4-293 K",
		Source: srcEkinNb,
		TMin:   4, TMax: StrainReference, FitError: 0.02,
		kind: table,
		nodes: [][2]float64{
			{4, 0.143}, {40, 0.142}, {77, 0.130}, {100, 0.121},
			{150, 0.094}, {200, 0.064}, {250, 0.031}, {StrainReference, 0},
		},
	}
}

// ErrNoExpansion is returned by Conductor.Strain for a metal with neither
// contraction data nor a linear expansion coefficient.
var ErrNoExpansion = errors.New("no thermal expansion data")

// StrainRange returns the temperatures, in kelvin, over which c.Strain
// holds. With contraction data it runs from 0 K (the contraction is
// complete below the lowest tabulated temperature; see Strain) to
// DefaultLinearTMax; without, it is the range of the linear model,
// DefaultLinearTMin..DefaultLinearTMax. ok is false when c has neither data
// nor an expansion coefficient.
func (c Conductor) StrainRange() (lo, hi float64, ok bool) {
	switch {
	case c.Contraction.Known():
		return 0, DefaultLinearTMax, true
	case c.Expansion != 0:
		return DefaultLinearTMin, DefaultLinearTMax, true
	}
	return 0, 0, false
}

// Strain returns the thermal strain (L(T) - L(293 K))/L(293 K) of the metal
// at temperature T (kelvin): negative below 293 K. With published data
// (c.Contraction) it is the data over their range; below the lowest
// tabulated temperature (4 K) the value there, since the expansion
// coefficient vanishes as T^3 (Debye) plus an electronic term in T and the
// contraction below 4 K is below 1e-8 (copper: alpha = 3.10e-11 T^3 +
// 2.78e-10 T 1/K below 8 K, A sensitive dilatometer for use at low
// temperatures, Can. J. Phys. 42, 835, 1964); above the data, up to DefaultLinearTMax, the value at the
// top of the data continued with the room-temperature coefficient
// c.Expansion. Without data it is the linear model c.Expansion (T - 293 K)
// over DefaultLinearTMin..DefaultLinearTMax.
//
// Frequencies depend on ratios of lengths at two temperatures; use
// SizeRatio for those.
//
// It returns an error naming the range when T lies outside StrainRange, and
// ErrNoExpansion when the metal has no data at all.
func (c Conductor) Strain(T float64) (float64, error) {
	lo, hi, ok := c.StrainRange()
	if !ok {
		return 0, fmt.Errorf("conductor %q: %w (give cte=...)", c.label(), ErrNoExpansion)
	}
	if !TemperatureIn(T, lo, hi) {
		if c.Contraction.Known() {
			return 0, fmt.Errorf("conductor %q: thermal contraction data hold up to %s, got %s", c.label(), FormatTemperature(hi, 4), FormatTemperature(T, 4))
		}
		var cold []string
		for _, m := range Conductors() {
			if m.Contraction.Known() {
				cold = append(cold, m.Name)
			}
		}
		return 0, fmt.Errorf("conductor %q: only a room-temperature expansion coefficient is known, which holds from %s to %s; got %s (cryogenic contraction data exist for %s)",
			c.label(), FormatTemperature(lo, 4), FormatTemperature(hi, 4), FormatTemperature(T, 4), strings.Join(cold, ", "))
	}
	d := c.Contraction
	if !d.Known() {
		return c.Expansion * (T - StrainReference), nil // linear model near room temperature
	}
	switch {
	case T < d.TMin:
		return d.strain(d.TMin), nil
	case T > d.TMax:
		return d.strain(d.TMax) + c.Expansion*(T-d.TMax), nil
	}
	return d.strain(T), nil
}

// SizeRatio returns L(T)/L(T0) for the metal: the factor by which a length
// of it changes from temperature T0 to T, both in kelvin, from Strain
// (derived: (1 + Strain(T))/(1 + Strain(T0))).
func (c Conductor) SizeRatio(T, T0 float64) (float64, error) {
	s, err := c.Strain(T)
	if err != nil {
		return 0, err
	}
	s0, err := c.Strain(T0)
	if err != nil {
		return 0, err
	}
	return (1 + s) / (1 + s0), nil
}

// label returns the name used in errors.
func (c Conductor) label() string {
	if c.Name == "" {
		return "user"
	}
	return c.Name
}

// ExpansionAt returns the local linear expansion coefficient
// (1/L) dL/dT of the metal at temperature T (kelvin), in 1/K: the
// derivative of Strain by central differences over +-0.01 K, divided by
// 1 + Strain (derived; the step error is below 1e-9 relative for these
// smooth data, the rounding error below 1e-12 1/K). Zero for a metal
// without any expansion data. Errors are those of Strain.
func (c Conductor) ExpansionAt(T float64) (float64, error) {
	if _, _, ok := c.StrainRange(); !ok {
		return 0, nil
	}
	s, err := c.Strain(T)
	if err != nil {
		return 0, err
	}
	const h = 0.01 // K
	lo, hi, _ := c.StrainRange()
	a, b := math.Max(T-h, lo), math.Min(T+h, hi)
	sa, err := c.Strain(a)
	if err != nil {
		return 0, err
	}
	sb, err := c.Strain(b)
	if err != nil {
		return 0, err
	}
	return (sb - sa) / (b - a) / (1 + s), nil
}
