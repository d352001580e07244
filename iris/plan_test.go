package iris

import (
	"errors"
	"math"
	"testing"

	"cylcav/axisym"
	"cylcav/cavity"
	"cylcav/filter"
)

// invertTol is the relative accuracy of an inverted k: the radius
// bracket closes to radiusTol = 1e-9 relative and k grows about as r^6 for
// a TE011 pair (the curve's slope), so 1e-8.
const invertTol = 1e-8

// passTol is the relative accuracy of a k or Qext re-solved on the
// corrected cavities: the last pass sized the irises on cavities that
// differ from the corrected ones by at most DimensionTol, and k and Qext
// go as a few powers of the length.
const passTol = 1e-5

var te011 = cavity.Mode{Family: cavity.TE, M: 1, P: 1}

// sixPole is an invented 6-pole all-pole Chebyshev design at 10 GHz, 1 %
// wide, in TE011 cavities of D/L = 1.2.
func sixPole(t testing.TB) (*filter.Design, *filter.Realisation) {
	d, err := filter.Synthesize(filter.Spec{F0: 10e9, BW: 100e6, Order: 6, ReturnLoss: 20})
	if err != nil {
		t.Fatal(err)
	}
	rz, err := filter.Realise(d, filter.RealiseOptions{Mode: te011, Shape: cavity.ByRatio(1.2)})
	if err != nil {
		t.Fatal(err)
	}
	return d, rz
}

// TestInvert: the radius found for each k gives that k when the pair is
// solved again there (to invertTol), and a k
// outside the curve's range is refused with ErrUnreachable.
func TestInvert(t *testing.T) {
	p := Pair{Radius: 0.02, Length: 0.02, Mode: te011, Wall: 0.002}
	curve, err := p.Curve(CurveLow*p.Radius, CurveHigh*p.Radius, CurvePoints)
	if err != nil {
		t.Fatal(err)
	}
	for _, k := range []float64{1e-3, 5e-3, 2e-2, 5e-2} {
		s, err := p.Invert(curve, k)
		if err != nil {
			t.Fatal(err)
		}
		again, err := p.At(s.Radius)
		if err != nil {
			t.Fatal(err)
		}
		if d := math.Abs(again.K-k) / k; d > invertTol {
			t.Errorf("k = %g: radius %.9g m gives k = %.12g (rel. %.2g)", k, s.Radius, again.K, d)
		}
		if !s.Monotone || s.Iterations > 20 || !(s.RadiusChange > 0 && s.RadiusChange < 1e-3*s.Radius) {
			t.Errorf("k = %g: %+v", k, s)
		}
	}
	if _, err := p.Invert(curve, 0.5); !errors.Is(err, ErrUnreachable) {
		t.Errorf("k = 0.5: want ErrUnreachable, got %v", err)
	}
	if _, err := p.At(0.03); err == nil {
		t.Error("an iris wider than the cell: want an error")
	}
	bad := p
	bad.Mode = cavity.Mode{Family: cavity.TE, N: 1, M: 1, P: 1}
	if _, err := bad.At(0.005); err == nil {
		t.Error("TE111: want an error (n != 0)")
	}
}

// TestJudge checks each limit of the verdict on couplings written out by
// hand, with values either side of the limits (MaxRelChange, MaxShift,
// MinIsolation, Bethe's problems, a missing realisation).
func TestJudge(t *testing.T) {
	ok := Coupling{Method: ModeMatching, Achieved: 0.01, Change: 0.99e-4, Isolation: 10.1, Shift: -0.019}
	cases := []struct {
		name string
		c    Coupling
		want Status
	}{
		{"inside every limit", ok, Valid},
		{"k not converged", func() Coupling { c := ok; c.Change = 1.01e-4; return c }(), Outside},
		{"k change unknown", func() Coupling { c := ok; c.Change = math.NaN(); return c }(), Outside},
		{"not isolated", func() Coupling { c := ok; c.Isolation = 9.9; return c }(), Outside},
		{"large detuning", func() Coupling { c := ok; c.Shift = 0.021; return c }(), Outside},
		{"port inside", Coupling{Method: PortMatching, Achieved: 100, Change: 0.5, Shift: 0.01}, Valid},
		{"port not converged", Coupling{Method: PortMatching, Achieved: 100, Change: 1.5, Shift: 0.01}, Outside},
		{"bethe inside", Coupling{Method: BetheThick, Hole: &filter.HoleCoupling{}}, Valid},
		{"bethe outside", Coupling{Method: BetheThick, Hole: &filter.HoleCoupling{Problems: []string{"too big"}}}, Outside},
		{"no method", Coupling{Method: NoMethod}, Unrealised},
		{"error", Coupling{Method: ModeMatching, Err: ErrUnreachable}, Unrealised},
	}
	for _, c := range cases {
		if got, why := Judge(c.c); got != c.want || (got != Valid) != (len(why) > 0) {
			t.Errorf("%s: Judge = %v %q, want %v", c.name, got, why, c.want)
		}
	}
}

// TestRealiseSixPole sizes every coupling of a 6-pole in-line filter with
// the open-port solver: each iris reproduces its k (re-solved) and each
// port iris its Qext (axisym.PortQ again at the radius), each cavity's
// extension is the sum of its irises', the passes converged, and the
// corrected length resonates, closed, at f_i/(1 + shift) (the closed-form
// TE011 frequency of package cavity) to the passes' tolerance.
func TestRealiseSixPole(t *testing.T) {
	d, rz := sixPole(t)
	pl, err := Realise(d, rz, Options{Wall: 0.002, Port: axisym.PortQ})
	if err != nil {
		t.Fatal(err)
	}
	n := d.Spec.Order
	if !pl.Converged {
		t.Errorf("passes did not converge: %d passes, change %g", pl.Passes, pl.Change)
	}
	if len(pl.Couplings) != n+1 || len(pl.Curves) != 1 {
		t.Fatalf("%d couplings, %d curves; want %d and 1 (identical cavities share a curve)", len(pl.Couplings), len(pl.Curves), n+1)
	}
	ext := make([]float64, n)
	for _, c := range pl.Couplings {
		if c.Err != nil {
			t.Fatalf("%s %d-%d: %v", c.Kind, c.From, c.To, c.Err)
		}
		switch c.Kind {
		case "main":
			a, b := pl.Cavities[c.From-1], pl.Cavities[c.To-1]
			p := Pair{Radius: 0.5 * (a.CorrectedRadius + b.CorrectedRadius), Length: 0.5 * (a.CorrectedLength + b.CorrectedLength), Mode: te011, Wall: 0.002}
			pt, err := p.At(c.Radius)
			if err != nil {
				t.Fatal(err)
			}
			if d := math.Abs(pt.K-c.Required) / c.Required; d > passTol {
				t.Errorf("iris %d-%d: k = %.10g at %.6g m, want %.10g", c.From, c.To, pt.K, c.Radius, c.Required)
			}
			ext[c.From-1] += c.Extension
			ext[c.To-1] += c.Extension
		case "port":
			res := c.To
			if c.To == n+1 {
				res = c.From
			}
			tu := pl.Cavities[res-1]
			cd := cavity.Cavity{Radius: tu.CorrectedRadius, Length: tu.CorrectedLength}
			port := Port{Pair: Pair{Radius: cd.Radius, Length: cd.Length, Mode: te011, Wall: 0.002}}
			f0, q, err := axisym.PortQ(port.Body(c.Radius), cavity.TE, cd.Frequency(te011)*(1+c.Shift), 0)
			if err != nil {
				t.Fatal(err)
			}
			if d := math.Abs(q-c.Required) / c.Required; d > passTol {
				t.Errorf("port of cavity %d: Qext = %.10g, want %.10g", res, q, c.Required)
			}
			if d := math.Abs(f0/cd.Frequency(te011) - 1 - c.Shift); d > passTol {
				t.Errorf("port of cavity %d: shift %.6g, want %.6g", res, f0/cd.Frequency(te011)-1, c.Shift)
			}
			ext[res-1] += c.Extension
		}
	}
	for i, tu := range pl.Cavities {
		if !tu.Complete || math.Abs(tu.Extension-ext[i]) > 1e-15 {
			t.Errorf("cavity %d: extension %.6g m (complete %v), want %.6g m", i+1, tu.Extension, tu.Complete, ext[i])
		}
		c := cavity.Cavity{Radius: tu.CorrectedRadius, Length: tu.CorrectedLength}
		// DimensionTol on the length moves the frequency by at most as
		// much (the TE011 frequency's length sensitivity is below 1).
		if d := math.Abs(c.Frequency(te011)*(1+tu.Shift)/tu.F - 1); d > DimensionTol {
			t.Errorf("cavity %d: corrected cavity resonates at %.9g Hz, want %.9g Hz / (1 + %.4g)", i+1, c.Frequency(te011), tu.F, tu.Shift)
		}
	}
}

// TestRealiseWithoutPort: without a port solver the end irises are rows
// that say so (ErrNoPortSolver), not numbers, and the end cavities'
// detuning is marked incomplete.
func TestRealiseWithoutPort(t *testing.T) {
	d, rz := sixPole(t)
	pl, err := Realise(d, rz, Options{Wall: 0.002})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range pl.Couplings {
		if c.Kind != "port" {
			continue
		}
		if st, _ := Judge(c); !errors.Is(c.Err, ErrNoPortSolver) || st != Unrealised || c.Radius != 0 {
			t.Errorf("port row %+v: want an ErrNoPortSolver row with no radius", c)
		}
	}
	if pl.Cavities[0].Complete || pl.Cavities[5].Complete || !pl.Cavities[2].Complete {
		t.Errorf("completeness: %+v", pl.Cavities)
	}
	if _, err := Realise(d, rz, Options{Wall: 0}); err == nil {
		t.Error("zero wall: want an error")
	}
}

// BenchmarkSixPole sizes every coupling of the 6-pole in-line filter:
// the five irises (one shared k-versus-radius curve) and both port irises.
func BenchmarkSixPole(b *testing.B) {
	d, rz := sixPole(b)
	for b.Loop() {
		if _, err := Realise(d, rz, Options{Wall: 0.002, Port: axisym.PortQ}); err != nil {
			b.Fatal(err)
		}
	}
}
