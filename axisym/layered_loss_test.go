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
	"cylcav/qfactor"
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
	cu, err := physics.LookupConductor("copper")
	if err != nil {
		t.Fatal(err)
	}
	cuSet := qfactor.WallSet{Side: qfactor.Surface{Conductor: cu}, EndA: qfactor.Surface{Conductor: cu}, EndB: qfactor.Surface{Conductor: cu}}
	var worst [4]float64 // FillE, FillM, part share, Q (relative)
	defer func() {
		t.Logf("worst relative deviation: FillE %.2g, FillM %.2g, part share of the wall loss %.2g, Q %.2g", worst[0], worst[1], worst[2], worst[3])
	}()
	note := func(k int, d float64) float64 {
		worst[k] = max(worst[k], d)
		return d
	}
	for _, w := range rows {
		b := rodBody(w.a, w.b, w.eps, w.l)
		b.Sections[0].Layers[0].Medium.TanDelta = tand
		res, ok := solved[w.name]
		if !ok {
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
		// Unloaded's per-medium breakdown: the rod alone (vacuum outside).
		u, err := l.Unloaded(b, Walls{Set: cuSet})
		if err != nil {
			t.Fatal(err)
		}
		if len(u.Media) != 1 || u.Media[0].Section != 1 || u.Media[0].Layer != 1 {
			t.Errorf("%s %v %g Hz: Unloaded.Media = %+v, want the rod alone", w.name, w.fam, w.f, u.Media)
		} else if m := u.Media[0]; note(3, math.Abs(m.Q*w.pe*tand-1)) > lossTol || math.Abs(m.Q/u.QFill-1) > 1e-14 {
			t.Errorf("%s %v %g Hz: rod Q = %.15g (QFill %.15g), want 1/(p_e tan delta) = %.15g (mpmath)", w.name, w.fam, w.f, m.Q, u.QFill, 1/(w.pe*tand))
		}
		if math.Abs(l.ElectricShareJ/l.StoredEnergyJ-0.5) > lossTol {
			t.Errorf("%s %v %g Hz: W_e/W = %.15g, want 1/2", w.name, w.fam, w.f, l.ElectricShareJ/l.StoredEnergyJ)
		}
	}
}

// TestLayeredSameMediumLoss checks that a section split into layers of
// one medium gives the homogeneous section's Loss: frequencies, every
// part's geometry factor, the filling factors, Q0 with a loss tangent and
// the field at sample points, the filling factors of a bulb, and for TM0
// the transit-time factor and R/Q, to 1e-9 (an identity: the layered guide's
// modes are then the homogeneous guide's, found by another route). The
// bodies have steps on both sides of the layered section (narrow and
// wide), so junction, step-face and end-plate integrals all take part.
func TestLayeredSameMediumLoss(t *testing.T) {
	const tol = 1e-9
	fill := physics.Medium{EpsR: 2.1, TanDelta: 3e-4}
	split := func(s Section, radii ...float64) Section {
		s.Fill = physics.Medium{}
		for _, r := range radii {
			s.Layers = append(s.Layers, Layer{Radius: r, Medium: fill})
		}
		return s
	}
	for _, tc := range []struct {
		name  string
		body  Body
		layer func(Body) Body
	}{
		{"narrow layered", Body{Sections: []Section{
			{Length: 0.006, Radius: 0.012},
			{Length: 0.005, Radius: 0.008, Fill: fill},
			{Length: 0.008, Radius: 0.012},
		}}, func(b Body) Body {
			b.Sections[1] = split(b.Sections[1], 0.003, 0.008)
			return b
		}},
		{"wide layered", Body{Sections: []Section{
			{Length: 0.007, Radius: 0.012, Fill: fill},
			{Length: 0.003, Radius: 0.005},
			{Length: 0.006, Radius: 0.012, Fill: fill},
		}}, func(b Body) Body {
			b.Sections[0] = split(b.Sections[0], 0.004, 0.009, 0.012)
			b.Sections[2] = split(b.Sections[2], 0.006, 0.012)
			return b
		}},
		{"coaxial layered", Body{Sections: []Section{
			{Length: 0.008, Radius: 0.012, InnerRadius: 0.003, Fill: fill},
			{Length: 0.006, Radius: 0.012},
		}}, func(b Body) Body {
			b.Sections[0] = split(b.Sections[0], 0.007, 0.012)
			return b
		}},
	} {
		req := Request{MaxFrequency: 22e9, Losses: true, Modes: 12}
		hom, err := Solve(tc.body, req)
		if err != nil {
			t.Fatal(err)
		}
		lb := tc.layer(Body{Sections: append([]Section(nil), tc.body.Sections...)})
		lay, err := Solve(lb, req)
		if err != nil {
			t.Fatal(err)
		}
		if len(hom) != len(lay) || len(hom) < 4 {
			t.Fatalf("%s: %d resonances layered, %d homogeneous", tc.name, len(lay), len(hom))
		}
		var worst float64
		check := func(what string, got, want, scale float64) {
			d := math.Abs(got-want) / scale
			worst = max(worst, d)
			if d > tol {
				t.Errorf("%s: %s = %.15g, want %.15g (homogeneous)", tc.name, what, got, want)
			}
		}
		for i, h := range hom {
			y := lay[i]
			if y.Family != h.Family || h.Loss == nil || y.Loss == nil {
				t.Fatalf("%s #%d: %v/%v, losses %v / %v", tc.name, i, y.Family, h.Family, y.LossErr, h.LossErr)
			}
			id := h.Family.String() + " " + strconv.Itoa(h.Index)
			check(id+" f", y.Frequency, h.Frequency, h.Frequency)
			hl, yl := h.Loss, y.Loss
			if len(hl.Factors) != len(yl.Factors) {
				t.Fatalf("%s %s: parts %v, want %v", tc.name, id, yl.Factors, hl.Factors)
			}
			inv := 1 / hl.G()
			for k, fc := range hl.Factors {
				if yl.Factors[k].Part != fc.Part {
					t.Fatalf("%s %s: part %v, want %v", tc.name, id, yl.Factors[k].Part, fc.Part)
				}
				check(id+" 1/G "+fc.Part.Kind.String(), 1/yl.Factors[k].G, 1/fc.G, inv)
			}
			for s := range hl.FillE {
				check(id+" FillE", yl.FillE[s], hl.FillE[s], 1)
				check(id+" FillM", yl.FillM[s], hl.FillM[s], 1)
				if ls := yl.Layers[s]; ls != nil {
					var se, sm float64
					for _, x := range ls {
						se += x.FillE
						sm += x.FillM
					}
					check(id+" sum of layers' FillE", se, yl.FillE[s], 1)
					check(id+" sum of layers' FillM", sm, yl.FillM[s], 1)
				}
			}
			fills := make([]physics.Medium, len(tc.body.Sections))
			for s, sec := range tc.body.Sections {
				fills[s] = sec.Fill
			}
			rs := func(Part) float64 { return 0.01 }
			qh, _, _ := hl.Q0(rs, fills)
			qy, _, _ := yl.Q0(rs, make([]physics.Medium, len(fills)))
			check(id+" Q0", qy, qh, qh)
			if tc.name == "narrow layered" { // a bulb across the layer radius 3 mm
				bulb := cavity.Bulb{Radius: 0.004, Length: 0.006}
				fh, err1 := hl.Filling(tc.body, bulb, RegionSettings{Centre: 0.0085})
				fy, err2 := yl.Filling(lb, bulb, RegionSettings{Centre: 0.0085})
				if err1 != nil || err2 != nil {
					t.Fatalf("%s %s: Filling: %v, %v", tc.name, id, err1, err2)
				}
				// To the quadrature's tolerance (DefaultRegionTol 1e-9).
				for k, x := range [][2]float64{{fy.MagneticZ, fh.MagneticZ}, {fy.Magnetic, fh.Magnetic}, {fy.Electric, fh.Electric}, {fy.Maser, fh.Maser}} {
					check(id+" bulb filling factor "+strconv.Itoa(k), x[0], x[1], 1e-1)
				}
			}
			if len(hl.Axis) > 0 { // TM0 with a free axis: the accelerator figures
				ah, err1 := hl.Accelerating(1)
				ay, err2 := yl.Accelerating(1)
				if err1 != nil || err2 != nil {
					t.Fatalf("%s %s: Accelerating: %v, %v", tc.name, id, err1, err2)
				}
				check(id+" T", ay.T, ah.T, 1)
				check(id+" R/Q", ay.RoverQLinac, ah.RoverQLinac, ah.RoverQLinac)
			}
			// Fields: the same for the same stored energy, up to the null
			// vector's sign, on a grid.
			nh, ny := 1/math.Sqrt(hl.StoredEnergyJ), 1/math.Sqrt(yl.StoredEnergyJ)
			var fh, fy [][4]float64
			var scale float64
			length := tc.body.Length()
			for iz := range 9 {
				for ir := range 7 {
					z, r := length*(float64(iz)+0.3)/9, 0.012*(float64(ir)+0.1)/7
					a1, a2, a3, a4, ok1 := hl.Field.At(r, z)
					b1, b2, b3, b4, ok2 := yl.Field.At(r, z)
					if ok1 != ok2 {
						t.Fatalf("%s %s: At(%g, %g) inside %v, want %v", tc.name, id, r, z, ok2, ok1)
					}
					fh = append(fh, [4]float64{a1 * nh, a2 * nh, a3 * nh, a4 * nh})
					fy = append(fy, [4]float64{b1 * ny, b2 * ny, b3 * ny, b4 * ny})
					scale = max(scale, math.Abs(a1*nh), math.Abs(a2*nh), math.Abs(a3*nh)*376.73, math.Abs(a4*nh)*376.73)
				}
			}
			var dot float64
			for k := range fh {
				for c := range 4 {
					dot += fh[k][c] * fy[k][c]
				}
			}
			sign := math.Copysign(1, dot)
			for k := range fh {
				for c := range 4 {
					z0 := 1.0
					if c >= 2 {
						z0 = 376.73 // H compared as Z0 H (V/m)
					}
					check(id+" field", sign*fy[k][c]*z0, fh[k][c]*z0, scale)
				}
			}
		}
		t.Logf("%s: %d resonances, worst relative deviation %.2g", tc.name, len(hom), worst)
	}
}

// puckWith is puckBody with the puck's permittivity eps and loss
// tangent 1e-4.
func puckWith(eps float64) Body {
	b := puckBody()
	b.Sections[1].Layers[0].Medium = physics.Medium{EpsR: eps, TanDelta: 1e-4}
	return b
}

// TestPuckFillingPerturbation checks the puck's electric filling factor
// against the frequency's derivative with respect to its permittivity.
// For a change d eps of the permittivity of a region holding the share
// p_e of the electric energy, with mu unchanged, the cavity perturbation
// formula (Slater, Microwave Electronics, 1950; Harrington, Time-Harmonic
// Electromagnetic Fields, 1961, sec. 7-2) gives
//
//	d omega / omega = -(1/4) int d eps |E|^2 dV / W = -(1/2) p_e d eps/eps
//
// (W = 2 W_e at resonance, W_e = (1/4) int eps |E|^2 dV), exact for the
// derivative, so p_e = -2 (eps/f) df/d eps. The derivative is a central
// difference of Solve's frequencies at eps (1 +- h), with h and h/2
// combined by Richardson extrapolation (error O(h^4)); what is left is the
// root tolerance over h, about 1e-9, and the truncation of the model
// (the fields and the frequency of the same truncated model need not obey
// the relation exactly: for TE0 the gap is about 1e-11; for TM0, with
// fields singular at the puck's edges, about 3e-7, within the model's
// relative change of frequency, 6e-6).
func TestPuckFillingPerturbation(t *testing.T) {
	const eps, h, tol = 38.0, 2e-4, 1e-9
	for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
		solve := func(e float64, losses bool) Resonance {
			res, err := Solve(puckWith(e), Request{MaxFrequency: 7e9, Losses: losses, Families: []cavity.Family{fam}})
			if err != nil || len(res) == 0 {
				t.Fatalf("eps %g: %v (%d resonances)", e, err, len(res))
			}
			return res[0]
		}
		r := solve(eps, true)
		if r.Loss == nil {
			t.Fatal(r.LossErr)
		}
		pe := r.Loss.Layers[1][0].FillE
		d := func(h float64) float64 {
			fp, fm := solve(eps*(1+h), false).Frequency, solve(eps*(1-h), false).Frequency
			return -2 * eps / r.Frequency * (fp - fm) / (2 * h * eps)
		}
		d1, d2 := d(h), d(h/2)
		fd := (4*d2 - d1) / 3
		t.Logf("%v: f %.10g Hz, p_e %.12f, -2 (eps/f) df/deps %.12f (h: %.12f, h/2: %.12f), difference %.2g", fam, r.Frequency, pe, fd, d1, d2, pe-fd)
		// TM0's fields are singular at the puck's edges (E_z jumps across its
		// side wall): there the truncated model obeys the relation only to its
		// truncation error, bounded by the frequency's relative change.
		lim := tol
		if fam == cavity.TM {
			lim = max(tol, r.Change/r.Frequency)
		}
		if math.Abs(pe-fd) > lim {
			t.Errorf("%v: puck p_e = %.12f, want -2 (eps/f) df/d eps = %.12f (Slater's perturbation relation, finite difference)", fam, pe, fd)
		}
	}
}

// BenchmarkPuckQ0 solves the lowest TE0 resonance of the puck (the
// TE01-delta-like mode; DefaultModes, two models for the convergence
// estimate) with its fields, and its Q0 with copper walls and the puck's
// loss tangent.
func BenchmarkPuckQ0(b *testing.B) {
	body := puckWith(38)
	cu, err := physics.LookupConductor("copper")
	if err != nil {
		b.Fatal(err)
	}
	walls := Walls{Set: qfactor.WallSet{Side: qfactor.Surface{Conductor: cu}, EndA: qfactor.Surface{Conductor: cu}, EndB: qfactor.Surface{Conductor: cu}}}
	for b.Loop() {
		res, err := Solve(body, Request{MaxFrequency: 5e9, Losses: true, Families: []cavity.Family{cavity.TE}})
		if err != nil || len(res) != 1 || res[0].Loss == nil {
			b.Fatal(len(res), err)
		}
		if _, err := res[0].Loss.Unloaded(body, walls); err != nil {
			b.Fatal(err)
		}
	}
}

// TestWheelerLayered is test group 7 for layered bodies: the wall Q of TE0
// resonances from the surface integral of the matched fields against
// Wheeler's incremental-inductance rule (wheelerInvQ), on a full-length
// rod (exact model: to wheelerTol) and on the puck. There the layers
// change at the junctions and the truncated model obeys the rule only as
// the modes grow: the gap was 2.3e-6, 1.3e-7 and 1.2e-8 for the lowest
// resonance and 9e-5, 3e-6 and 2e-7 for the next with 16, 40 and 80
// modes; the test keeps 40 and bounds the gap by 1e-5 (observed).
func TestWheelerLayered(t *testing.T) {
	const rs = 0.026
	for _, tc := range []struct {
		name  string
		b     Body
		fmax  float64
		modes int
		tol   float64
	}{
		{"rod", rodBody(0.012, 0.003, 38, 0.006), 12e9, 8, wheelerTol},
		{"puck", puckBody(), 8e9, 40, 1e-5},
	} {
		got, err := Solve(tc.b, Request{MaxFrequency: tc.fmax, Modes: tc.modes, Losses: true, Families: []cavity.Family{cavity.TE}})
		if err != nil || len(got) == 0 {
			t.Fatalf("%s: %v (%d resonances)", tc.name, err, len(got))
		}
		for i, r := range got {
			if r.Loss == nil {
				t.Fatalf("%s: TE0 #%d: %v", tc.name, i+1, r.LossErr)
			}
			_, invWall, _ := r.Loss.Q0(func(Part) float64 { return rs }, nil)
			want, f := wheelerInvQ(t, tc.b, i, tc.fmax, (3*tc.modes+1)/2, rs)
			if math.Abs(f-r.Frequency) > 1e-13*f {
				t.Fatalf("%s: TE0 #%d model mismatch: %g vs %g Hz", tc.name, i+1, f, r.Frequency)
			}
			d := math.Abs(invWall-want) / want
			if d > tc.tol {
				t.Errorf("%s: TE0 #%d at %.6g GHz: Q_wall = %.10g (surface integral), %.10g (Wheeler), rel. difference %.2g",
					tc.name, i+1, f/1e9, 1/invWall, 1/want, d)
			} else {
				t.Logf("%s: TE0 #%d: Q_wall %.8g, Wheeler %.8g, rel. difference %.2g", tc.name, i+1, 1/invWall, 1/want, d)
			}
		}
	}
}
