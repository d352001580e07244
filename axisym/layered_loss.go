package axisym

import (
	"math"

	"cylcav/cavity"
	"cylcav/physics"
)

// LayerShare is one radial layer's share of a resonance's stored energy.
type LayerShare struct {
	// Medium fills the layer; Radius is its outer radius (m).
	Medium physics.Medium
	Radius float64
	// FillE and FillM are the layer's shares of the body's electric and
	// magnetic stored energy (the layer's electric and magnetic filling
	// factors; over every layer and section each sums to 1).
	FillE, FillM float64
}

// layeredResult is what losses needs from one layered section.
type layeredResult struct {
	we, wm []float64 // per layer, J
	side   float64   // int |H_t|^2 dz on the outer wall (per unit length of circumference)
	inner  float64   // the same on the inner conductor
	endA   float64   // int |H_t|^2 dS over the cross-section at z = 0
	endB   float64   // the same at z = length
	stepA  float64   // int |H_t|^2 dS over the step face at z = 0 (outside the aperture)
	stepB  float64   // the same at z = length
	axis   []AxisSample
}

// layeredSection computes the energies and wall integrals of one layered
// section whose modes are ms (pieces per layer; normalised as in
// layeredGuide) and whose modal lines carry lf, by the radial integrals of
// every pair of modes on each layer (cross terms do not vanish: the
// modes are orthogonal with weight 1 or 1/eps, not with the weights eps
// and 1 of the electric and magnetic energies) and the z-quadrature q of
// the products of their line voltages and currents:
//
//	TE0: E_phi = sum c u_m V_m, H_r = -sum c u_m I_m,
//	     H_z = -sum c G_m V_m/(omega mu0);
//	TM0: H_phi = sum c u_m I_m, E_r = sum c u_m V_m/eps_r,
//	     E_z = sum c G_m I_m/(omega eps0 eps_r),
//
// G = (1/r) d(r u)/dr (derived from Maxwell's curl equations, as in
// Field.At), W_e = (1/4) int eps |E|^2 dV, W_m = (1/4) int mu0 |H|^2 dV.
// The radial integrals: A = int r u_m u_n dr by Lommel's integral
// (pieceIntegral), and int r G_m G_n dr = [r u_m G_n] + kc_n^2 A, from
// (r u)' = r G and G' = -kc^2 u (DLMF 10.6.2, 10.29.2; derived, so that
// Lommel's form serves both). apA and apB are the apertures (inner,
// outer) of the junctions at z = 0 and z = l where this section is the
// wider one (nil otherwise): the step face is the cross-section minus the
// aperture.
func layeredSection(fam cavity.Family, ms []lmode, eps []float64, lf []lineField, act []int, q []zPoint,
	omega, inner, outer, length float64, apA, apB []float64, wantAxis bool) layeredResult {
	eps0, mu0 := physics.VacuumPermittivity, physics.VacuumPermeability
	na := len(act)
	nl := len(eps)
	res := layeredResult{we: make([]float64, nl), wm: make([]float64, nl)}
	if na == 0 {
		return res
	}
	// z integrals of the products of line voltages and of currents.
	zvv, zii := make([]float64, na*na), make([]float64, na*na)
	v, cur := make([]float64, na), make([]float64, na)
	// Wall field shapes: TE0 H_z = -sum sG V/(omega mu0), TM0 H_phi = sum sF I.
	wallShape := func(r float64) []float64 {
		s := make([]float64, na)
		for a, m := range act {
			p := pieceAt(ms[m].pieces, r)
			f, g := p.fg(r)
			if fam == cavity.TE {
				s[a] = p.cE * g / (omega * mu0)
			} else {
				s[a] = p.cH * f
			}
		}
		return s
	}
	sOut := wallShape(outer)
	var sIn []float64
	if inner > 0 {
		sIn = wallShape(inner)
	}
	var axShape []float64
	if wantAxis {
		axShape = make([]float64, na)
		for a, m := range act {
			p := ms[m].pieces[0]
			var g0 float64
			switch p.kind {
			case kindPow:
				g0 = 2 * p.a
			default:
				g0 = p.a * p.k // J0(0) = I0(0) = 1; b = 0 on the axis
			}
			axShape[a] = p.cH * g0 / (omega * eps0 * eps[0])
		}
	}
	for _, pt := range q {
		for a, m := range act {
			v[a], cur[a] = lf[m].at(pt.z)
		}
		for a := range na {
			wa, wi := pt.w*v[a], pt.w*cur[a]
			ra, ri := zvv[a*na:(a+1)*na], zii[a*na:(a+1)*na]
			for b := range na {
				ra[b] += wa * v[b]
				ri[b] += wi * cur[b]
			}
		}
		if wantAxis {
			var ez float64
			for a := range na {
				ez += axShape[a] * cur[a]
			}
			res.axis = append(res.axis, AxisSample{Z: pt.z, W: pt.w, Ez: ez})
		}
	}
	quad := func(s []float64, z []float64) float64 {
		var x float64
		for a := range na {
			for b := range na {
				x += s[a] * z[a*na+b] * s[b]
			}
		}
		return x
	}
	if fam == cavity.TE {
		res.side = quad(sOut, zvv)
		if sIn != nil {
			res.inner = quad(sIn, zvv)
		}
	} else {
		res.side = quad(sOut, zii)
		if sIn != nil {
			res.inner = quad(sIn, zii)
		}
	}
	// Per layer: radial matrices and the energies.
	hgram := make([]float64, na*na) // int h_m h_n dS over the cross-section
	for L := range nl {
		lo, hi := ms[act[0]].pieces[L].lo, ms[act[0]].pieces[L].hi
		A, B := layerMatrices(ms, act, L, lo, hi, true)
		er := eps[L]
		var we, wm float64
		for a, m := range act {
			pa := ms[m].pieces[L]
			for b, n := range act {
				pb := ms[n].pieces[L]
				k := a*na + b
				ee, hh := pa.cE*pb.cE, pa.cH*pb.cH
				hgram[k] += 2 * math.Pi * hh * A[k]
				if fam == cavity.TE {
					we += ee * A[k] * zvv[k]
					wm += hh*A[k]*zii[k] + ee*B[k]*zvv[k]/sq(omega*mu0)
				} else {
					wm += hh * A[k] * zii[k]
					we += ee*A[k]*zvv[k] + hh*B[k]*zii[k]/sq(omega*eps0*er)
				}
			}
		}
		res.we[L] = eps0 * er / 4 * 2 * math.Pi * we
		res.wm[L] = mu0 / 4 * 2 * math.Pi * wm
	}
	endI := func(z float64) []float64 {
		out := make([]float64, na)
		for a, m := range act {
			_, out[a] = lf[m].at(z)
		}
		return out
	}
	iA, iB := endI(0), endI(length)
	res.endA, res.endB = quad(iA, hgram), quad(iB, hgram)
	if apA != nil {
		res.stepA = res.endA - quad(iA, apertureGram(ms, act, apA[0], apA[1]))
	}
	if apB != nil {
		res.stepB = res.endB - quad(iB, apertureGram(ms, act, apB[0], apB[1]))
	}
	return res
}

// apertureGram returns 2 pi int h_m h_n r dr over inner..outer (an
// aperture inside the section's cross-section).
func apertureGram(ms []lmode, act []int, inner, outer float64) []float64 {
	na := len(act)
	g := make([]float64, na*na)
	for L, p0 := range ms[act[0]].pieces {
		lo, hi := max(inner, p0.lo), min(outer, p0.hi)
		if hi <= lo {
			continue
		}
		A, _ := layerMatrices(ms, act, L, lo, hi, false)
		for a, m := range act {
			for b, n := range act {
				g[a*na+b] += 2 * math.Pi * ms[m].pieces[L].cH * ms[n].pieces[L].cH * A[a*na+b]
			}
		}
	}
	return g
}

// layerMatrices returns A = int_lo^hi r u_m u_n dr and (if withG) B = int
// r G_m G_n dr of the unnormalised functions of the active modes on piece
// L (lo..hi inside it): Lommel's closed form where well conditioned, with
// the end values computed once per mode, else pieceIntegral.
func layerMatrices(ms []lmode, act []int, L int, lo, hi float64, withG bool) (A, B []float64) {
	na := len(act)
	A = make([]float64, na*na)
	type ends struct{ flo, glo, fhi, ghi float64 }
	e := make([]ends, na)
	for a, m := range act {
		p := ms[m].pieces[L]
		if lo > 0 {
			e[a].flo, e[a].glo = p.fg(lo)
		}
		e[a].fhi, e[a].ghi = p.fg(hi)
	}
	for a, m := range act {
		pa := ms[m].pieces[L]
		for b := a; b < na; b++ {
			pb := ms[act[b]].pieces[L]
			var x float64
			if b != a && lommelOK(pa, pb, hi) {
				x = (hi*(e[a].fhi*e[b].ghi-e[a].ghi*e[b].fhi) - lo*(e[a].flo*e[b].glo-e[a].glo*e[b].flo)) / (pa.p2 - pb.p2)
			} else {
				x = pieceIntegral(pa, pb, lo, hi)
			}
			A[a*na+b], A[b*na+a] = x, x
		}
	}
	if !withG {
		return A, nil
	}
	B = make([]float64, na*na)
	for a := range na {
		for b := a; b < na; b++ {
			pb := ms[act[b]].pieces[L]
			// int r G_a G_b dr = [r u_a G_b] + kc_b^2 A_ab (symmetric in
			// exact arithmetic; the mean of both orders).
			pa := ms[act[a]].pieces[L]
			x1 := hi*e[a].fhi*e[b].ghi - lo*e[a].flo*e[b].glo + pb.p2*A[a*na+b]
			x2 := hi*e[b].fhi*e[a].ghi - lo*e[b].flo*e[a].glo + pa.p2*A[a*na+b]
			x := 0.5 * (x1 + x2)
			B[a*na+b], B[b*na+a] = x, x
		}
	}
	return A, B
}

// pieceAt returns the piece holding r (the inner one on a layer radius).
func pieceAt(ps []piece, r float64) piece {
	for _, p := range ps {
		if r <= p.hi {
			return p
		}
	}
	return ps[len(ps)-1]
}

// layerAt returns the index of the layer of radii holding r.
func layerAt(radii []float64, r float64) int {
	for i, h := range radii {
		if r <= h {
			return i
		}
	}
	return len(radii) - 1
}

// layeredLoss is layeredResult with the section's modes and step flags.
type layeredLoss struct {
	layeredResult
	modes              []lmode
	hasStepA, hasStepB bool
}

// layeredLosses computes the energies and wall integrals of layered
// section i (guide lg, at the frequency of the last refreshLayers) whose
// modal lines carry lf; z0 is the section's start, coax whether the body
// has an inner conductor (no axial field).
func (s *system) layeredLosses(b Body, i int, lg *layeredGuide, lf []lineField, omega, z0 float64, coax bool) layeredLoss {
	ln := &s.lines[i]
	sec := b.Sections[i]
	var out layeredLoss
	out.modes = make([]lmode, len(lf))
	copy(out.modes, lg.modes) // lg.modes is rewritten at the next frequency
	var act []int
	var b2s []float64
	emax := 0.0
	for _, e := range lg.eps {
		emax = max(emax, e)
	}
	for m := range lf {
		if out.modes[m].pieces != nil && (lf[m].closed || lf[m].iScale != 0) {
			act = append(act, m)
			b2s = append(b2s, out.modes[m].beta2)
		}
	}
	k0 := omega / physics.SpeedOfLight
	q := zRuleBeta(ln.length, b2s, k0*k0*emax)
	// Apertures of the junctions where this section is the wider one.
	var ap [2][]float64
	for side, sd := range []struct {
		other int
		wide  bool
	}{
		{i - 1, i > 0 && s.joins[i-1].right != nil},
		{i + 1, i < len(s.joins) && s.joins[i].left != nil},
	} {
		if !sd.wide {
			continue
		}
		o := b.Sections[sd.other]
		if o.Radius == sec.Radius && o.InnerRadius == sec.InnerRadius {
			continue
		}
		ap[side] = []float64{o.InnerRadius, o.Radius}
	}
	wantAxis := s.fam == cavity.TM && !coax
	out.layeredResult = layeredSection(s.fam, out.modes, lg.eps, lf, act, q, omega, sec.InnerRadius, sec.Radius, ln.length, ap[0], ap[1], wantAxis)
	out.hasStepA, out.hasStepB = ap[0] != nil, ap[1] != nil
	for k := range out.axis {
		out.axis[k].Z += z0
	}
	return out
}
