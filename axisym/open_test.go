package axisym

import (
	"errors"
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// beamPipeCell is an invented TM010 cell of radius 40 mm and gap 30 mm with
// noses and beam pipes of radius 8 mm, the pipe stubs pipeLen long.
func beamPipeCell(pipeLen float64, ends End) Body {
	return Body{Sections: []Section{
		{Length: pipeLen, Radius: 0.008},
		{Length: 0.006, Radius: 0.014},
		{Length: 0.030, Radius: 0.040},
		{Length: 0.006, Radius: 0.014},
		{Length: pipeLen, Radius: 0.008},
	}, EndA: ends, EndB: ends}
}

// TestCutoffClosedForm checks Body.Cutoff and Body.Radiates against the
// closed-form cutoffs of a circular pipe: j_{0,1} = 2.404825557695773 and
// j'_{0,1} = j_{1,1} = 3.831705970207512 (A&S Table 9.5, recalled), over
// 2 pi a sqrt(eps_r).
func TestCutoffClosedForm(t *testing.T) {
	b := beamPipeCell(0.01, Pipe)
	c := physics.SpeedOfLight
	for _, tc := range []struct {
		fam cavity.Family
		j   float64
	}{{cavity.TM, 2.404825557695773}, {cavity.TE, 3.831705970207512}} {
		want := tc.j * c / (2 * math.Pi * 0.008)
		if got := b.Cutoff(tc.fam); math.Abs(got-want) > 1e-12*want {
			t.Errorf("Cutoff(%v) = %.15g, want %.15g", tc.fam, got, want)
		}
		if fc := b.Cutoff(tc.fam); b.Radiates(tc.fam, fc*(1-1e-12)) || !b.Radiates(tc.fam, fc) {
			t.Errorf("Radiates(%v) does not switch at the cutoff", tc.fam)
		}
	}
	closed := beamPipeCell(0.01, Plate)
	if !math.IsInf(closed.Cutoff(cavity.TM), 1) || closed.Radiates(cavity.TM, 1e12) {
		t.Error("a closed body has a cutoff")
	}
	// A pipe filled with eps_r = 4 has half the cutoff.
	filled := Body{Sections: []Section{{Length: 0.01, Radius: 0.008, Fill: physics.Medium{EpsR: 4}}}, EndB: Pipe}
	want := 2.404825557695773 * c / (2 * math.Pi * 0.008) / 2
	if got := filled.Cutoff(cavity.TM); math.Abs(got-want) > 1e-12*want {
		t.Errorf("filled Cutoff = %.15g, want %.15g", got, want)
	}
	// A coaxial pipe carries TEM at every frequency.
	coax := Body{Sections: []Section{{Length: 0.01, Radius: 0.008, InnerRadius: 0.002}}, EndA: Pipe}
	if coax.Cutoff(cavity.TM) != 0 {
		t.Errorf("coaxial pipe TM cutoff = %g, want 0", coax.Cutoff(cavity.TM))
	}
}

// TestTrappedLongStub checks the evanescent termination of an open end by
// an independent route: the closed solver with the pipes cut by metal
// plates far inside them. The field there has decayed by exp(-alpha l)
// with alpha about 290/m (TM01 of an 8 mm pipe at 3 GHz) and 470/m (TE01),
// so at l = 0.15 m the closed body's resonances, geometry factors and
// accelerator figures must equal the open body's to rounding (the plates'
// own factors aside).
func TestTrappedLongStub(t *testing.T) {
	open := beamPipeCell(0.010, Pipe)
	closed := beamPipeCell(0.150, Plate)
	for _, fam := range []cavity.Family{cavity.TM, cavity.TE} {
		fmax := open.Cutoff(fam) * 1.2 // the open solve stops at the cutoff
		req := Request{MaxFrequency: fmax, Families: []cavity.Family{fam}, Losses: true}
		ro, err := Solve(open, req)
		if err != nil {
			t.Fatal(err)
		}
		req.MaxFrequency = open.Cutoff(fam)
		rc, err := Solve(closed, req)
		if err != nil {
			t.Fatal(err)
		}
		// The long closed stubs add their own resonances only above the
		// pipe's cutoff; below it the lists must agree one to one.
		if len(ro) == 0 || len(ro) != len(rc) {
			t.Fatalf("%v: %d trapped resonances, closed long-stub body has %d", fam, len(ro), len(rc))
		}
		for i := range ro {
			// The plates at 0.15 m stand for the open pipe only where the
			// field has decayed there: alpha l > 25 (a shift below e^-50).
			kc, k := 2*math.Pi*open.Cutoff(fam)/physics.SpeedOfLight, 2*math.Pi*ro[i].Frequency/physics.SpeedOfLight
			if math.Sqrt(kc*kc-k*k)*0.140 < 25 {
				t.Logf("%v #%d at %.6g GHz: too near the cutoff for the long-stub check", fam, i+1, ro[i].Frequency/1e9)
				continue
			}
			if ro[i].HasOrigin {
				t.Errorf("%v #%d: an open body has no enclosing-cylinder label", fam, i+1)
			}
			if open.Radiates(fam, ro[i].Frequency) {
				t.Errorf("%v #%d at %g Hz above the cutoff", fam, i+1, ro[i].Frequency)
			}
			if d := math.Abs(ro[i].Frequency-rc[i].Frequency) / rc[i].Frequency; d > 1e-12 {
				t.Errorf("%v #%d: open %.15g Hz, long stub %.15g Hz (rel %.1e)", fam, i+1, ro[i].Frequency, rc[i].Frequency, d)
			}
			lo, lc := ro[i].Loss, rc[i].Loss
			if lo == nil || lc == nil {
				t.Fatalf("%v #%d: no loss: %v %v", fam, i+1, ro[i].LossErr, rc[i].LossErr)
			}
			// Every factor of the open body matches the closed body's part
			// (the pipe wall of the open body is the long stub's side);
			// the closed body's far plates carry nothing that counts.
			gc := map[Part]float64{}
			for _, f := range lc.Factors {
				gc[f.Part] = f.G
			}
			for _, f := range lo.Factors {
				if f.Part.Kind == EndA || f.Part.Kind == EndB {
					t.Errorf("%v #%d: open end has a plate factor %v", fam, i+1, f.Part)
				}
				if d := math.Abs(f.G-gc[f.Part]) / gc[f.Part]; d > 1e-9 {
					t.Errorf("%v #%d %v: G open %.12g, long stub %.12g (rel %.1e)", fam, i+1, f.Part, f.G, gc[f.Part], d)
				}
			}
			if fam == cavity.TM {
				ao, err1 := lo.Accelerating(1)
				ac, err2 := lc.Accelerating(1)
				if err1 != nil || err2 != nil {
					t.Fatal(err1, err2)
				}
				// The axial integral is a quadrature over quarter periods
				// with cancellation for the higher modes (T < 0.3): 1e-6.
				if d := math.Abs(ao.RoverQLinac-ac.RoverQLinac) / ac.RoverQLinac; d > 1e-6 {
					t.Errorf("TM #%d R/Q open %.12g, long stub %.12g", i+1, ao.RoverQLinac, ac.RoverQLinac)
				}
				if d := math.Abs(ao.T - ac.T); d > 1e-7 {
					t.Errorf("TM #%d T open %.12g, long stub %.12g", i+1, ao.T, ac.T)
				}
			}
		}
		t.Logf("%v: %d trapped below %.6g GHz; lowest %.9g GHz", fam, len(ro), open.Cutoff(fam)/1e9, ro[0].Frequency/1e9)
	}
}

// TestOpenPipeNoTrapped checks that a uniform pipe, open at one or both
// ends, traps nothing: its spectrum below cutoff is empty (a waveguide
// with a short at one end has no mode below its cutoff).
func TestOpenPipeNoTrapped(t *testing.T) {
	for _, b := range []Body{
		{Sections: []Section{{Length: 0.05, Radius: 0.01}}, EndA: Pipe},
		{Sections: []Section{{Length: 0.05, Radius: 0.01}}, EndA: Pipe, EndB: Pipe},
		{Sections: []Section{{Length: 0.05, Radius: 0.01}, {Length: 0.05, Radius: 0.01}}, EndB: Pipe},
	} {
		r, err := Solve(b, Request{MaxFrequency: 50e9})
		if err != nil {
			t.Fatal(err)
		}
		if len(r) != 0 {
			t.Errorf("uniform pipe %+v: %d trapped resonances, want 0 (first %g Hz)", b, len(r), r[0].Frequency)
		}
	}
}

// TestOpenSusceptanceFoster checks the evanescent termination of an open
// line: it is the long-line limit of lineSusceptance (coth -> 1) and it
// increases with frequency below the cutoff, as Foster's reactance theorem
// requires of a lossless one-port (the property the exact count rests on).
func TestOpenSusceptanceFoster(t *testing.T) {
	const kc, eps, mu = 300.0, 2.0, 1.5
	for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
		prev := math.Inf(-1)
		for i := 1; i < 200; i++ {
			k2 := sq(kc * float64(i) / 200) // k^2 eps mu, below the cutoff kc^2
			b := openSusceptance(fam, k2-kc*kc, eps, mu)
			if !(b > prev) {
				t.Errorf("%v: susceptance not increasing at k^2 = %g: %g after %g", fam, k2, b, prev)
			}
			prev = b
			long, _, poles := lineSusceptance(fam, k2-kc*kc, 1.0, eps, mu)
			if poles != 0 || math.Abs(long-b) > 1e-12*math.Abs(b) {
				t.Errorf("%v: long line %g (poles %d), open %g", fam, long, poles, b)
			}
		}
	}
}

// TestCoaxialPipeTraps checks that a coaxial open end traps no TM0
// resonance (its TEM mode propagates at every frequency, Cutoff 0) while
// TE0 resonances below its TE01 cutoff stay trapped.
func TestCoaxialPipeTraps(t *testing.T) {
	b := Body{Sections: []Section{
		{Length: 0.01, Radius: 0.008, InnerRadius: 0.003},
		{Length: 0.03, Radius: 0.02},
	}, EndA: Pipe}
	r, err := Solve(b, Request{MaxFrequency: 20e9})
	if err != nil {
		t.Fatal(err)
	}
	for _, x := range r {
		if x.Family == cavity.TM || b.Radiates(x.Family, x.Frequency) {
			t.Errorf("%v resonance at %g Hz listed as trapped", x.Family, x.Frequency)
		}
	}
	t.Logf("%d TE0 resonances trapped below %g Hz", len(r), b.Cutoff(cavity.TE))
}

// TestLayersRefusedWithOpenEnd checks that a layered section in a body with
// a pipe end is refused (the cutoff and the trapped count assume
// homogeneous sections) rather than solved with the wrong pipe.
func TestLayersRefusedWithOpenEnd(t *testing.T) {
	layered := Section{Length: 0.005, Radius: 0.012, Layers: []Layer{
		{Radius: 0.006, Medium: physics.Medium{EpsR: 38}},
		{Radius: 0.012},
	}}
	closed := Body{Sections: []Section{{Length: 0.01, Radius: 0.012}, layered}}
	if err := closed.Validate(); err != nil {
		t.Fatalf("closed layered body: %v", err)
	}
	for _, ends := range [][2]End{{Pipe, Plate}, {Plate, Pipe}} {
		b := closed
		b.EndA, b.EndB = ends[0], ends[1]
		if err := b.Validate(); !errors.Is(err, ErrNotImplemented) {
			t.Errorf("ends %v: got %v, want ErrNotImplemented", ends, err)
		}
	}
}
