package axisym

import (
	"bufio"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// TestLayeredRodLossMpmath checks the loss quantities of the resonances of
// a full-length dielectric rod in a can (one layered section, plates at
// both ends) against the closed-form energy integrals of the two-layer
// TE0 and TM0 modes evaluated with mpmath at 30 digits
// (testdata/gen_rodloss.py, rodloss.tsv: Lommel's integrals for J/Y and
// I/K written out, each checked there against mpmath.quad): the rod's
// electric and magnetic filling factors, the geometry factor of the side
// wall and of each end plate, the wall Q for one surface resistance and
// the dielectric Q = 1/(p_e tan delta) of the rod.
func TestLayeredRodLossMpmath(t *testing.T) {
	// lossTol: the brief's 1e-8 (a body without steps has no truncation
	// error; the modes and the resonance are refined to about 1e-14).
	const lossTol = 1e-8
	const tand, rs = 1e-4, 0.02
	f, err := os.Open("testdata/rodloss.tsv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	type row struct {
		fam               cavity.Family
		f, pe, pm, gs, ge float64
		a, b, eps, l      float64
		name              string
	}
	var rows []row
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "#") || line == "" {
			continue
		}
		fs := strings.Split(line, "\t")
		num := func(i int) float64 {
			v, err := strconv.ParseFloat(fs[i], 64)
			if err != nil {
				t.Fatal(err)
			}
			return v
		}
		r := row{name: fs[0], a: num(1), b: num(2), eps: num(3), l: num(4), f: num(7),
			pe: num(8), pm: num(9), gs: num(10), ge: num(11), fam: cavity.TE}
		if fs[5] == "TM" {
			r.fam = cavity.TM
		}
		rows = append(rows, r)
	}
	if len(rows) < 10 {
		t.Fatalf("rodloss.tsv: %d rows", len(rows))
	}
	solved := map[string][]Resonance{}
	var worst [4]float64 // FillE, FillM, part share, Q (relative)
	defer func() {
		t.Logf("worst relative deviation: FillE %.2g, FillM %.2g, part share of the wall loss %.2g, Q %.2g", worst[0], worst[1], worst[2], worst[3])
	}()
	note := func(k int, d float64) float64 {
		worst[k] = max(worst[k], d)
		return d
	}
	for _, w := range rows {
		res, ok := solved[w.name]
		if !ok {
			b := rodBody(w.a, w.b, w.eps, w.l)
			b.Sections[0].Layers[0].Medium.TanDelta = tand
			res, err = Solve(b, Request{MaxFrequency: 1.61e10, Losses: true})
			if err != nil {
				t.Fatal(err)
			}
			solved[w.name] = res
		}
		var got *Resonance
		for i := range res {
			if res[i].Family == w.fam && math.Abs(res[i].Frequency/w.f-1) < 1e-9 {
				got = &res[i]
			}
		}
		if got == nil {
			t.Errorf("%s %v %g Hz: not found", w.name, w.fam, w.f)
			continue
		}
		l := got.Loss
		if l == nil {
			t.Errorf("%s %v %g Hz: %v", w.name, w.fam, w.f, got.LossErr)
			continue
		}
		if len(l.Layers) != 1 || len(l.Layers[0]) != 2 {
			t.Fatalf("%s: Layers = %+v", w.name, l.Layers)
		}
		rod := l.Layers[0][0]
		if d := note(0, math.Abs(rod.FillE-w.pe)/w.pe); d > lossTol {
			t.Errorf("%s %v %g Hz: rod FillE = %.15g, want %.15g (mpmath)", w.name, w.fam, w.f, rod.FillE, w.pe)
		}
		if d := note(1, math.Abs(rod.FillM-w.pm)/w.pm); d > lossTol {
			t.Errorf("%s %v %g Hz: rod FillM = %.15g, want %.15g (mpmath)", w.name, w.fam, w.f, rod.FillM, w.pm)
		}
		// Each part's share of the wall loss, to lossTol of the whole
		// (a side wall far in the evanescent field carries almost none).
		inv := 1/w.gs + 2/w.ge
		for _, fc := range l.Factors {
			want := w.ge
			if fc.Part.Kind == Side {
				want = w.gs
			}
			if d := note(2, math.Abs(1/fc.G-1/want)/inv); d > lossTol {
				t.Errorf("%s %v %g Hz: %v G = %.15g, want %.15g (mpmath)", w.name, w.fam, w.f, fc.Part.Kind, fc.G, want)
			}
		}
		fills := []physics.Medium{{}}
		_, invWall, invFill := l.Q0(func(Part) float64 { return rs }, fills)
		if qw, want := 1/invWall, 1/(rs*inv); note(3, math.Abs(qw/want-1)) > lossTol {
			t.Errorf("%s %v %g Hz: wall Q = %.15g, want %.15g (mpmath)", w.name, w.fam, w.f, qw, want)
		}
		if qd, want := 1/invFill, 1/(w.pe*tand); note(3, math.Abs(qd/want-1)) > lossTol {
			t.Errorf("%s %v %g Hz: dielectric Q = %.15g, want 1/(p_e tan delta) = %.15g (mpmath)", w.name, w.fam, w.f, qd, want)
		}
		if math.Abs(l.ElectricShareJ/l.StoredEnergyJ-0.5) > lossTol {
			t.Errorf("%s %v %g Hz: W_e/W = %.15g, want 1/2", w.name, w.fam, w.f, l.ElectricShareJ/l.StoredEnergyJ)
		}
	}
}
