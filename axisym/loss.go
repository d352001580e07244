package axisym

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/physics/quad"
)

// PartKind names a kind of metal surface of a body.
type PartKind uint8

const (
	// Side is the outer cylindrical wall of a section.
	Side PartKind = iota + 1
	// Inner is the inner conductor of a coaxial section.
	Inner
	// EndA is the end plate at z = 0, EndB the one at the far end.
	EndA
	EndB
	// Step is the flat metal face around the aperture of a junction, on
	// the side of the wider section.
	Step
)

// String returns the kind's name.
func (k PartKind) String() string {
	switch k {
	case Side:
		return "side"
	case Inner:
		return "inner"
	case EndA:
		return "end A"
	case EndB:
		return "end B"
	case Step:
		return "step"
	}
	return fmt.Sprintf("PartKind(%d)", uint8(k))
}

// Part is one metal surface: a kind and the section it belongs to (counted
// from 1; for Step, the junction between sections Section and Section+1;
// for end plates, the first or last section).
type Part struct {
	Kind    PartKind
	Section int
}

// Factor is the geometry factor of one surface for one resonance,
//
//	G = omega W / ((1/2) int_part |H_tan|^2 dS)   (ohm),
//
// W the stored energy, so that a surface resistance Rs on the part adds
// Rs/G to 1/Q0 (Padamsee, Knobloch and Hays, RF Superconductivity for
// Accelerators, 2nd ed., ch. 1; the same definition as qfactor.Geometry).
// G is +Inf for a part that carries no current.
type Factor struct {
	Part Part
	G    float64
}

// Loss holds what a resonance's unloaded Q needs from its fields: the
// geometry factor of every metal surface, and for every section the share
// of the electric and of the magnetic stored energy in it (the filling
// factors that weight each medium's loss tangents).
type Loss struct {
	Factors        []Factor
	FillE, FillM   []float64 // per section, each summing to 1
	StoredEnergyJ  float64   // W for the normalisation used (for checks)
	ElectricShareJ float64   // W_e, equal to W/2 at resonance (for checks)
	// Axis samples E_z on the axis r = 0 (TM0 only, for the same
	// normalisation as StoredEnergyJ) at quadrature nodes along the body,
	// for Accelerating; empty for TE0 and for a body with a coaxial
	// section (no free axis).
	Axis      []AxisSample
	Frequency float64 // Hz
	// Field is the matched field itself, for sampling (Field.At).
	Field *Field
	// Layers gives, for a section with radial layers, each layer's share
	// of the stored energies (its filling factors; they sum to the
	// section's FillE and FillM); nil for a homogeneous section, and nil
	// altogether for a body without layers.
	Layers [][]LayerShare
}

// Field is the matched field of one resonance in the r-z half plane, for
// the normalisation of its Loss (stored energy Loss.StoredEnergyJ).
type Field struct {
	fam      cavity.Family
	omega    float64
	sections []fieldSection
}

type fieldSection struct {
	z0, length   float64
	inner, outer float64
	eps, mu      float64 // absolute
	g            guide
	lines        []lineField
	// A radially layered section: its modes (nil pieces: a mode not
	// carried) and layers (outer radii, relative permittivities).
	modes       []lmode
	radii, epsr []float64
}

// shape returns mode m's transverse functions e_m(r) and h_m(r) and its
// axial coefficient ax: E_z = ax I_m/omega (TM0) or H_z = -ax V_m/omega
// (TE0), as in At.
func (fd *Field) shape(sc *fieldSection, m int, r float64) (e, h, ax float64) {
	if sc.modes != nil {
		ps := sc.modes[m].pieces
		if ps == nil {
			return 0, 0, 0
		}
		l := layerAt(sc.radii, r)
		p := ps[l]
		f, g := p.fg(r)
		if fd.fam == cavity.TM {
			ax = p.cH * g / (physics.VacuumPermittivity * sc.epsr[l])
		} else {
			ax = p.cE * g / physics.VacuumPermeability
		}
		return p.cE * f, p.cH * f, ax
	}
	e = modeAt(sc.g, m, r)
	if kc := sc.g.kc[m]; kc > 0 {
		ax = sc.g.norm[m] * kc * sc.g.z(m, 0, kc*r)
	}
	if fd.fam == cavity.TM {
		ax /= sc.eps
	} else {
		ax /= sc.mu
	}
	return e, e, ax
}

// epsAt returns the relative permittivity and permeability at radius r
// of section k.
func (fd *Field) epsAt(k int, r float64) (er, mr float64) {
	sc := &fd.sections[k]
	if sc.modes != nil {
		return sc.epsr[layerAt(sc.radii, r)], 1
	}
	return sc.eps / physics.VacuumPermittivity, sc.mu / physics.VacuumPermeability
}

// Magnitudes returns |E| and |H| on the grid rs x zs (indexed [iz][ir]),
// NaN at points in metal, with the same values as At. The modal sums
// separate into a factor of r and one of z in each section, so each mode's
// Bessel functions are evaluated once per radius and its line voltage and
// current once per axial position: O(modes (len(rs) + len(zs)) +
// modes len(rs) len(zs)) multiplications.
func (fd *Field) Magnitudes(rs, zs []float64) (e, h [][]float64) {
	e, h = make([][]float64, len(zs)), make([][]float64, len(zs))
	type rcache struct{ em, hm, ax []float64 } // per radius: e_m(r), h_m(r), axial coefficient (shape)
	cache := make([][]rcache, len(fd.sections))
	for k := range fd.sections {
		sc := &fd.sections[k]
		cache[k] = make([]rcache, len(rs))
		for ir, r := range rs {
			if r < sc.inner || r > sc.outer {
				continue
			}
			em, hm, ax := make([]float64, len(sc.lines)), make([]float64, len(sc.lines)), make([]float64, len(sc.lines))
			for m := range sc.lines {
				em[m], hm[m], ax[m] = fd.shape(sc, m, r)
			}
			cache[k][ir] = rcache{em, hm, ax}
		}
	}
	for iz, z := range zs {
		e[iz], h[iz] = make([]float64, len(rs)), make([]float64, len(rs))
		k := fd.section(z)
		if k < 0 {
			for ir := range rs {
				e[iz][ir], h[iz][ir] = math.NaN(), math.NaN()
			}
			continue
		}
		sc := fd.sections[k]
		v, i := make([]float64, len(sc.lines)), make([]float64, len(sc.lines))
		for m, lf := range sc.lines {
			v[m], i[m] = lf.at(z - sc.z0)
		}
		for ir := range rs {
			c := cache[k][ir]
			if c.em == nil {
				e[iz][ir], h[iz][ir] = math.NaN(), math.NaN()
				continue
			}
			var e1, e2, h1, h2 float64
			for m := range sc.lines {
				if fd.fam == cavity.TM {
					e1 += c.em[m] * v[m]
					e2 += c.ax[m] * i[m]
					h1 += c.hm[m] * i[m]
				} else {
					e1 += c.em[m] * v[m]
					h1 -= c.hm[m] * i[m]
					h2 -= c.ax[m] * v[m]
				}
			}
			if fd.fam == cavity.TM {
				e2 /= fd.omega
			} else {
				h2 /= fd.omega
			}
			e[iz][ir], h[iz][ir] = math.Hypot(e1, e2), math.Hypot(h1, h2)
		}
	}
	return e, h
}

// section returns the index of the section holding z (the right-hand one
// on a junction plane), or -1 outside the body.
func (fd *Field) section(z float64) int {
	for k, sc := range fd.sections {
		last := k == len(fd.sections)-1
		if z >= sc.z0 && (z < sc.z0+sc.length || (last && z <= sc.z0+sc.length)) {
			return k
		}
	}
	return -1
}

// At returns the field amplitudes at radius r and axial position z (m,
// from end plate A): for TM0 E_r, E_z and H_phi, for TE0 E_phi, H_r and
// H_z, as (e1, e2, h1, h2) = (E_r, E_z, H_phi, 0) or (E_phi, 0, H_r, H_z),
// in V/m and A/m. E and H are in time quadrature (the j of the phasors is
// dropped). ok is false outside the body (in metal). The components are
// the modal sums
//
//	E_t = sum e_m(r) V_m(z),  H_t = sum (z x e_m) I_m(z),
//	E_z = sum norm kc Z0(kc r) I_m/(omega eps) (TM),
//	H_z = -sum norm kc Z0(kc r) V_m/(omega mu) (TE)
//
// (Collin, Field Theory of Guided Waves, 2nd ed., ch. 5, as recalled; the
// axial parts from (1/x)(x Z1)' = Z0, DLMF 10.6.2). A point on a junction
// plane takes the section to its right.
func (fd *Field) At(r, z float64) (e1, e2, h1, h2 float64, ok bool) {
	for k := range fd.sections {
		sc := &fd.sections[k]
		last := k == len(fd.sections)-1
		if z < sc.z0 || (z >= sc.z0+sc.length && !last) || z > sc.z0+sc.length {
			continue
		}
		if r < sc.inner || r > sc.outer {
			return 0, 0, 0, 0, false
		}
		zz := z - sc.z0
		for m, lf := range sc.lines {
			v, i := lf.at(zz)
			if v == 0 && i == 0 {
				continue
			}
			em, hm, axial := fd.shape(sc, m, r)
			if fd.fam == cavity.TM {
				e1 += em * v
				e2 += axial * i / fd.omega
				h1 += hm * i
			} else {
				e1 += em * v
				h1 -= hm * i
				h2 -= axial * v / fd.omega
			}
		}
		return e1, e2, h1, h2, true
	}
	return 0, 0, 0, 0, false
}

// AxisSample is one quadrature node of the axial field: position z (m
// from end plate A), weight w (m) and E_z (V/m).
type AxisSample struct{ Z, W, Ez float64 }

// Accel holds the accelerator figures of a TM0 resonance for a particle
// moving along the axis at speed beta c.
type Accel struct {
	// V is the accelerating voltage |int E_z(0, z) exp(j omega z/(beta c)) dz|
	// in volts for the stored energy W of the Loss, and T = V / int |E_z| dz
	// the transit-time factor (Wangler, RF Linear Accelerators, 2nd ed.,
	// ch. 2, as recalled).
	V, T float64
	// RoverQLinac is V^2/(omega W) (the "linac" convention) and
	// RoverQCircuit V^2/(2 omega W) (the "circuit" convention), in ohm.
	RoverQLinac, RoverQCircuit float64
}

// Accelerating returns the accelerator figures for particle speed beta c,
// 0 < beta <= 1. It fails for a Loss without axis samples (TE0, or a body
// with an inner conductor) and for beta out of range.
func (l Loss) Accelerating(beta float64) (Accel, error) {
	if len(l.Axis) == 0 {
		return Accel{}, fmt.Errorf("axisym: no axial field (TE0 resonance or a body with an inner conductor)")
	}
	if !(beta > 0 && beta <= 1) {
		return Accel{}, fmt.Errorf("axisym: particle speed beta must be in (0, 1], got %g", beta)
	}
	omega := 2 * math.Pi * l.Frequency
	kz := omega / (beta * physics.SpeedOfLight)
	var c, s, abs float64
	for _, a := range l.Axis {
		sn, cs := math.Sincos(kz * a.Z)
		c += a.W * a.Ez * cs
		s += a.W * a.Ez * sn
		abs += a.W * math.Abs(a.Ez)
	}
	v := math.Hypot(c, s)
	return Accel{
		V: v, T: v / abs,
		RoverQLinac:   v * v / (omega * l.StoredEnergyJ),
		RoverQCircuit: v * v / (2 * omega * l.StoredEnergyJ),
	}, nil
}

// G returns the geometry factor of the whole wall, Q0 Rs for walls with one
// surface resistance and no fill loss: the harmonic sum of the parts.
func (l Loss) G() float64 {
	var inv float64
	for _, f := range l.Factors {
		inv += 1 / f.G
	}
	return 1 / inv
}

// Q0 returns the unloaded Q of the resonance,
//
//	1/Q0 = sum over parts Rs(part)/G(part)
//	       + sum over sections (tan delta_e FillE + tan delta_m FillM),
//
// the wall term from the definition of G and the fill term from the
// dissipated power 2 omega (tan delta_e W_e + tan delta_m W_m) of each
// medium (Pozar, Microwave Engineering, 4th ed., sec. 6.3, extended
// per region; derived), with rs giving each part's surface resistance in
// ohm at the resonance (from qfactor.Surface.Resistance) and fills the
// sections' media. A section with radial layers takes its layers' media
// and filling factors from l.Layers instead (its entry of fills is not
// used). It also returns the wall and fill parts of 1/Q0.
func (l Loss) Q0(rs func(Part) float64, fills []physics.Medium) (q0, invWall, invFill float64) {
	for _, f := range l.Factors {
		if r := rs(f.Part); r != 0 && !math.IsInf(f.G, 1) {
			invWall += r / f.G
		}
	}
	for i, m := range fills {
		if i < len(l.Layers) && l.Layers[i] != nil {
			continue // a layered section: its layers' media below
		}
		invFill += m.TanDelta*l.FillE[i] + m.TanDeltaM*l.FillM[i]
	}
	for _, ls := range l.Layers {
		for _, y := range ls {
			invFill += y.Medium.TanDelta*y.FillE + y.Medium.TanDeltaM*y.FillM
		}
	}
	return 1 / (invWall + invFill), invWall, invFill
}

// poleTol is the smallest |sin(beta l)| for which a section's field is
// taken from its end voltages; closer to a closed-section resonance the
// section's own standing wave is not fixed by the junctions.
const poleTol = 1e-7

// losses computes the Loss of the resonance at f of the model s (b the
// body it models) from the matched fields: the null vector of the junction
// matrix gives the aperture voltages, and each modal line's voltage and
// current follow along its section (see lineField).
func (s *system) losses(b Body, f float64) (Loss, error) {
	omega := 2 * math.Pi * f
	n := s.ndof
	if n == 0 && s.layers.any {
		// eval is not called below. A lone section's guide keeps only the
		// propagating modes, and a TM0 resonance with beta = 0 sits on
		// that count's edge: find them all here.
		lg := s.layers.guides[0]
		only := lg.onlyProp
		lg.onlyProp, lg.k0 = false, -1
		s.refreshLayers(omega / physics.SpeedOfLight)
		lg.onlyProp, lg.k0 = only, -1
	}
	// beta2 returns beta^2 of mode m of section ln (k2 the medium's k^2).
	beta2 := func(ln *lines, m int, k2 float64) float64 {
		if ln.beta2 != nil {
			return ln.beta2[m]
		}
		return k2 - ln.kc[m]*ln.kc[m]
	}
	var v []float64
	single := -1 // for a one-section body: the resonant mode's index
	if n > 0 {
		a := make([]float64, n*n)
		s.eval(f, a)
		sym := mat.NewSymDense(n, nil)
		for i := range n {
			for j := i; j < n; j++ {
				sym.SetSym(i, j, a[i*n+j])
			}
		}
		var eig mat.EigenSym
		if !eig.Factorize(sym, true) {
			return Loss{}, fmt.Errorf("axisym: eigen decomposition of the junction matrix failed at %g Hz", f)
		}
		vals := eig.Values(nil)
		var vecs mat.Dense
		eig.VectorsTo(&vecs)
		best := 0
		for i := range vals {
			if math.Abs(vals[i]) < math.Abs(vals[best]) {
				best = i
			}
		}
		v = mat.Col(nil, best, &vecs)
	}
	type sectionField struct {
		v1, v2 []float64 // modal end voltages
	}
	fields := make([]sectionField, len(s.lines))
	for i := range s.lines {
		ln := &s.lines[i]
		nm := len(ln.kc)
		v1, v2 := make([]float64, nm), make([]float64, nm)
		if i > 0 {
			project(v1, s.joins[i-1], s.joins[i-1].right, v)
		}
		if i < len(s.joins) {
			project(v2, s.joins[i], s.joins[i].left, v)
		}
		fields[i] = sectionField{v1, v2}
	}
	if n == 0 {
		// One section: the resonance is one closed-cylinder mode.
		ln := s.lines[0]
		k2 := sq(omega/physics.SpeedOfLight) * ln.eps * ln.mu
		bestd := math.Inf(1)
		for m := range ln.kc {
			b2 := beta2(&ln, m, k2)
			if b2 < -1e-9*k2 {
				continue
			}
			t := math.Sqrt(math.Max(b2, 0)) * ln.length / math.Pi
			if d := math.Abs(t - math.Round(t)); d < bestd && (s.fam == cavity.TM || math.Round(t) >= 1) {
				bestd, single = d, m
			}
		}
		if single < 0 {
			return Loss{}, fmt.Errorf("axisym: no closed-cylinder mode at %g Hz", f)
		}
	}
	var l Loss
	var we, wm float64
	weSec, wmSec := make([]float64, len(s.lines)), make([]float64, len(s.lines))
	var parts []Part
	var surf []float64 // (1/2) int |H_t|^2 dS per part
	add := func(p Part, x float64) {
		parts = append(parts, p)
		surf = append(surf, x/2)
	}
	coax := false
	for _, sec := range b.Sections {
		coax = coax || sec.InnerRadius > 0
	}
	fd := &Field{fam: s.fam, omega: omega}
	layerW := make([][2][]float64, len(s.lines)) // layered sections: W_e and W_m per layer
	z0 := 0.0
	for i := range s.lines {
		ln := &s.lines[i]
		sec := b.Sections[i]
		eps := physics.VacuumPermittivity * ln.eps
		mu := physics.VacuumPermeability * ln.mu
		k2 := omega * omega * eps * mu
		var lf []lineField
		for m := range ln.kc {
			var fl lineField
			var err error
			b2 := beta2(ln, m, k2)
			if n == 0 {
				if m != single {
					fl = lineField{}
				} else {
					fl = closedField(s.fam, b2, ln.length, omega, eps, mu)
				}
			} else if math.IsInf(b2, -1) {
				fl = lineField{} // a layered mode not found: cut off far below
			} else if ln.open {
				fl = openLineField(s.fam, b2, ln.length, omega, eps, mu, fields[i].v1[m], fields[i].v2[m], i == 0)
			} else {
				fl, err = newLineField(s.fam, b2, ln.length, omega, eps, mu, fields[i].v1[m], fields[i].v2[m])
				if err != nil {
					return Loss{}, fmt.Errorf("axisym: section %d at %g Hz: %w", i+1, f, err)
				}
			}
			lf = append(lf, fl)
		}
		g := newGuide(s.fam, sec.InnerRadius, sec.Radius, len(ln.kc))
		fd.sections = append(fd.sections, fieldSection{
			z0: z0, length: ln.length, inner: sec.InnerRadius, outer: sec.Radius,
			eps: eps, mu: mu, g: g, lines: lf,
		})
		if lg := s.layers.guides[i]; lg != nil {
			x := s.layeredLosses(b, i, lg, lf, omega, z0, coax)
			fs := &fd.sections[len(fd.sections)-1]
			fs.modes, fs.radii, fs.epsr = x.modes, lg.radii, lg.eps
			add(Part{Side, i + 1}, 2*math.Pi*sec.Radius*x.side)
			if sec.InnerRadius > 0 {
				add(Part{Inner, i + 1}, 2*math.Pi*sec.InnerRadius*x.inner)
			}
			if i == 0 && b.EndA != Pipe {
				add(Part{EndA, 1}, x.endA)
			}
			if i == len(s.lines)-1 && b.EndB != Pipe {
				add(Part{EndB, i + 1}, x.endB)
			}
			if x.hasStepA {
				add(Part{Step, i}, x.stepA)
			}
			if x.hasStepB {
				add(Part{Step, i + 1}, x.stepB)
			}
			l.Axis = append(l.Axis, x.axis...)
			layerW[i] = [2][]float64{x.we, x.wm}
			for k := range x.we {
				weSec[i] += x.we[k]
				wmSec[i] += x.wm[k]
			}
			we += weSec[i]
			wm += wmSec[i]
			z0 += ln.length
			continue
		}
		// Energies per mode (orthonormal modes: no cross terms), by
		// quadrature along z.
		q := zRule(ln.length, ln.kc, k2)
		if ln.open {
			q = openRule(ln.length, ln.kc, k2, i == 0)
		}
		wall := map[float64]float64{} // r -> int |H_t(r, z)|^2 dz
		radii := []float64{sec.Radius}
		if sec.InnerRadius > 0 {
			radii = append(radii, sec.InnerRadius)
		}
		for _, pt := range q {
			hs := make([]float64, len(radii))
			var ez float64
			for m, kc := range ln.kc {
				V, I := lf[m].at(pt.z)
				if s.fam == cavity.TE {
					weSec[i] += eps / 4 * V * V * pt.w
					wmSec[i] += mu / 4 * (I*I + kc*kc*V*V/(omega*omega*mu*mu)) * pt.w
					if kc > 0 {
						for ri, r := range radii {
							hs[ri] += -g.norm[m] * kc * g.z(m, 0, kc*r) * V / (omega * mu)
						}
					}
				} else {
					wmSec[i] += mu / 4 * I * I * pt.w
					weSec[i] += eps / 4 * (V*V + kc*kc*I*I/(omega*omega*eps*eps)) * pt.w
					// E_z = (1/(j omega eps)) (1/r) d(r H_phi)/dr and
					// (1/x) d(x Z1)/dx = Z0 (DLMF 10.6.2) give, on the
					// axis of a circular section (Z0(0) = 1),
					// E_z = sum norm kc I/(omega eps).
					if !coax {
						ez += g.norm[m] * kc * I / (omega * eps)
					}
					for ri, r := range radii {
						hs[ri] += modeAt(g, m, r) * I
					}
				}
			}
			for ri, r := range radii {
				wall[r] += hs[ri] * hs[ri] * pt.w
			}
			if s.fam == cavity.TM && !coax {
				l.Axis = append(l.Axis, AxisSample{Z: z0 + pt.z, W: pt.w, Ez: ez})
			}
		}
		add(Part{Side, i + 1}, 2*math.Pi*sec.Radius*wall[sec.Radius])
		if sec.InnerRadius > 0 {
			add(Part{Inner, i + 1}, 2*math.Pi*sec.InnerRadius*wall[sec.InnerRadius])
		}
		if i == 0 && b.EndA != Pipe {
			var x float64
			for m := range ln.kc {
				_, I := lf[m].at(0)
				x += I * I
			}
			add(Part{EndA, 1}, x)
		}
		if i == len(s.lines)-1 && b.EndB != Pipe {
			var x float64
			for m := range ln.kc {
				_, I := lf[m].at(ln.length)
				x += I * I
			}
			add(Part{EndB, i + 1}, x)
		}
		// Step faces on this section's side of its junctions when it is the
		// wider one: the part of its cross-section outside the aperture,
		// int |H_t|^2 dS = I^T (1 - G_ap) I, G_ap the Gram matrix of its
		// modes over the aperture.
		for _, sd := range []struct {
			j, other int
			z        float64
			wide     bool
		}{
			{i - 1, i - 1, 0, i > 0 && s.joins[i-1].right != nil},
			{i, i + 1, ln.length, i < len(s.joins) && s.joins[i].left != nil},
		} {
			if !sd.wide {
				continue
			}
			o := b.Sections[sd.other]
			if o.Radius == sec.Radius && o.InnerRadius == sec.InnerRadius {
				continue // one cross-section: no face
			}
			if s.static != nil && o.Radius >= sec.Radius {
				continue // edge basis (edgebasis.go): T on both sides; the face is on the wider one
			}
			I := make([]float64, len(ln.kc))
			for m := range ln.kc {
				_, I[m] = lf[m].at(sd.z)
			}
			var x float64
			for p := range ln.kc {
				for r := range ln.kc {
					gram := 2 * math.Pi * g.norm[p] * g.norm[r] * radial(g, p, g, r, o.InnerRadius, o.Radius)
					if p == r {
						gram--
					}
					x -= I[p] * gram * I[r]
				}
			}
			add(Part{Step, sd.j + 1}, x)
		}
		we += weSec[i]
		wm += wmSec[i]
		z0 += ln.length
	}
	w := we + wm
	l.StoredEnergyJ, l.ElectricShareJ, l.Frequency, l.Field = w, we, f, fd
	for k, p := range parts {
		l.Factors = append(l.Factors, Factor{Part: p, G: omega * w / surf[k]})
	}
	l.FillE, l.FillM = make([]float64, len(s.lines)), make([]float64, len(s.lines))
	for i := range s.lines {
		l.FillE[i], l.FillM[i] = weSec[i]/we, wmSec[i]/wm
		if x := layerW[i]; x[0] != nil {
			if l.Layers == nil {
				l.Layers = make([][]LayerShare, len(s.lines))
			}
			for k, ly := range b.Sections[i].Layers {
				l.Layers[i] = append(l.Layers[i], LayerShare{Medium: ly.Medium, Radius: ly.Radius, FillE: x[0][k] / we, FillM: x[1][k] / wm})
			}
		}
	}
	return l, nil
}

// project sets dst = T v_j (T nil: the identity) for junction j.
func project(dst []float64, j join, t []float64, v []float64) {
	vj := v[j.off : j.off+j.n]
	if t == nil {
		copy(dst, vj)
		return
	}
	for m := range dst {
		var x float64
		for c, vc := range vj {
			x += t[m*j.n+c] * vc
		}
		dst[m] = x
	}
}

func sq(x float64) float64 { return x * x }

// modeAt returns the normalised transverse field e_m(r) of guide g.
func modeAt(g guide, m int, r float64) float64 {
	if g.tem && m == 0 {
		return g.norm[m] / r
	}
	return g.norm[m] * g.z(m, 1, g.kc[m]*r)
}

// lineField is the voltage and current along one modal line of a section
// (the j of the phasors dropped: V and I are in quadrature), from its end
// voltages v1 (z = 0) and v2 (z = l):
//
//	V(z) = [v1 S(l - z) + v2 S(z)] / S(l),  V'(z) = [-v1 C(l - z) + v2 C(z)] / S(l)
//
// with S(x) = sin(beta x)/beta and C(x) = cos(beta x), continued to
// sinh(alpha x)/alpha and cosh(alpha x) below cutoff, and I = V'/(omega mu)
// for TE, I = omega eps V'/beta^2 for TM (from the modal line equations
// V' = -j beta Z_w I with Z_w = omega mu/beta and beta/(omega eps); Collin,
// Field Theory of Guided Waves, 2nd ed., ch. 5, as recalled).
type lineField struct {
	fam            cavity.Family
	beta2, l       float64
	v1, v2         float64
	iScale         float64 // I = iScale V'
	closed         bool    // a single closed section: V = sin, I = cos form
	omega, eps, mu float64
	tail           int8 // open end section: -1 field decays towards -z, +1 towards +z (open.go)
}

// newLineField returns the field of a line with end voltages v1 and v2; it
// fails, wrapping ErrNotImplemented, when the line is at one of its own
// closed resonances (the standing wave is then not fixed by its ends).
func newLineField(fam cavity.Family, beta2, l, omega, eps, mu, v1, v2 float64) (lineField, error) {
	f := lineField{fam: fam, beta2: beta2, l: l, v1: v1, v2: v2, omega: omega, eps: eps, mu: mu}
	if beta2 > 0 {
		if math.Abs(math.Sin(math.Sqrt(beta2)*l)) < poleTol {
			return f, fmt.Errorf("a resonance that coincides with a resonance of the closed section: fields %w", ErrNotImplemented)
		}
	}
	if fam == cavity.TE {
		f.iScale = 1 / (omega * mu)
	} else {
		if math.Abs(beta2)*l*l < poleTol {
			return f, fmt.Errorf("a TM mode at its cutoff in the section: fields %w", ErrNotImplemented)
		}
		f.iScale = omega * eps / beta2
	}
	return f, nil
}

// closedField is the resonant mode of a single closed section: TE V =
// sin(beta z), I = beta cos(beta z)/(omega mu); TM I = cos(beta z), V =
// beta sin(beta z)/(omega eps) (Pozar, Microwave Engineering, 4th ed.,
// sec. 6.4).
func closedField(fam cavity.Family, beta2, l, omega, eps, mu float64) lineField {
	return lineField{fam: fam, beta2: math.Max(beta2, 0), l: l, closed: true, omega: omega, eps: eps, mu: mu}
}

// at returns V(z) and I(z).
func (f lineField) at(z float64) (v, i float64) {
	if f.tail != 0 {
		return f.atTail(z)
	}
	if f.closed {
		b := math.Sqrt(f.beta2)
		if f.fam == cavity.TE {
			return math.Sin(b * z), b * math.Cos(b*z) / (f.omega * f.mu)
		}
		return b * math.Sin(b*z) / (f.omega * f.eps), math.Cos(b * z)
	}
	if f.iScale == 0 {
		return 0, 0
	}
	var s1, s2, c1, c2 float64 // S(l-z)/S(l), S(z)/S(l), C(l-z)/S(l), C(z)/S(l)
	switch {
	case f.beta2 > 0:
		b := math.Sqrt(f.beta2)
		sl := math.Sin(b*f.l) / b
		s1, s2 = math.Sin(b*(f.l-z))/b/sl, math.Sin(b*z)/b/sl
		c1, c2 = math.Cos(b*(f.l-z))/sl, math.Cos(b*z)/sl
	case f.beta2 < 0:
		a := math.Sqrt(-f.beta2)
		den := -math.Expm1(-2 * a * f.l) // 1 - e^{-2 a l}
		ratio := func(x float64) (sh, ch float64) {
			// sinh(a x)/sinh(a l) and a cosh(a x)/sinh(a l), without overflow.
			e := math.Exp(a * (x - f.l))
			return e * -math.Expm1(-2*a*x) / den, a * e * (1 + math.Exp(-2*a*x)) / den
		}
		s1, c1 = ratio(f.l - z)
		s2, c2 = ratio(z)
	default:
		s1, s2 = (f.l-z)/f.l, z/f.l
		c1, c2 = 1/f.l, 1/f.l
	}
	v = f.v1*s1 + f.v2*s2
	dv := -f.v1*c1 + f.v2*c2
	return v, f.iScale * dv
}

// zPoint is one node of a quadrature rule along a section.
type zPoint struct{ z, w float64 }

// zRule returns a composite 8-point Gauss-Legendre rule on [0, l] (nodes
// and weights: A&S Table 25.4, as recalled), with panels halving towards
// both ends down to a tenth of the decay length of the most evanescent
// mode and split so that no panel holds more than a quarter period of the
// most oscillatory one (or of the wavenumber k of the medium).
func zRule(l float64, kc []float64, k2 float64) []zPoint {
	b2s := make([]float64, len(kc))
	for m, k := range kc {
		b2s[m] = k2 - k*k
	}
	return zRuleBeta(l, b2s, k2)
}

// zRuleBeta is zRule for modes given by beta^2 (a layered section, k2 the
// largest k^2 of its media).
func zRuleBeta(l float64, beta2 []float64, k2 float64) []zPoint {
	var amax, bmax float64
	for _, b2 := range beta2 {
		if b2 < 0 {
			amax = math.Max(amax, math.Sqrt(-b2))
		} else {
			bmax = math.Max(bmax, math.Sqrt(b2))
		}
	}
	// The phase of a particle at the speed of light (Loss.Accelerating)
	// turns at k: resolve it too, also where every mode is evanescent.
	bmax = math.Max(bmax, math.Sqrt(k2))
	levels := 1
	if amax*l > 1 {
		levels = int(math.Ceil(math.Log2(10*amax*l))) + 1
	}
	// Distances from the nearer end: l/2, l/4, ..., then 0.
	var edges []float64
	for k := range levels {
		edges = append(edges, l/2*math.Pow(0.5, float64(k)))
	}
	edges = append(edges, 0)
	var pts []zPoint
	panel := func(lo, hi float64) {
		n := max(1, int(math.Ceil(bmax*(hi-lo)/(math.Pi/2))))
		for _, q := range quad.Composite(lo, hi, n, 8) {
			pts = append(pts, zPoint{q.X, q.W})
		}
	}
	for k := 0; k+1 < len(edges); k++ {
		panel(edges[k+1], edges[k])     // near z = 0
		panel(l-edges[k], l-edges[k+1]) // near z = l
	}
	return pts
}
