package axisym

import (
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/physics/quad"
)

// RegionSettings tunes Loss.Filling. The zero value gives the defaults.
type RegionSettings struct {
	// Centre is the z of the bulb's centre, m from end plate A; 0 means
	// half-way along the body.
	Centre float64
	// Tol is the relative change between two successive refinements of the
	// quadrature at which it stops; 0 means DefaultRegionTol.
	Tol float64
}

// DefaultRegionTol is the default relative convergence of Loss.Filling's
// quadrature: far below the truncation error of the matched fields
// (Resonance.Change) that it integrates.
const DefaultRegionTol = 1e-9

// maxRegionLevels bounds the doublings of the quadrature panels (the
// finest rule has 2^maxRegionLevels times the panels of the first).
const maxRegionLevels = 6

// Filling returns the filling factors of a storage bulb, the cylinder
// r <= bulb.Radius, |z - Centre| <= bulb.Length/2 on the axis of body b,
// for the resonance whose matched fields l holds (Request.Losses), with
// the same definitions as cavity.Cavity.FillingFactors:
//
//	MagneticZ = W_m(H_z, bulb) / W_m,  Magnetic = W_m(bulb) / W_m,
//	Electric  = W_e(bulb) / W_e,
//	Maser     = (integral_bulb H_z dV)^2 / (V_bulb integral_body mu_r |H|^2 dV)
//
// with W_m = (1/4) integral mu |H|^2 dV and W_e = (1/4) integral eps |E|^2
// dV (time averages of the peak fields), so that energies, not squared
// fields, are compared: in a dielectric-loaded can the electric energy in
// the dielectric counts eps_r times. For a homogeneous fill these are the
// ratios of cavity.Cavity.FillingFactors (and the tests check that); for a
// non-magnetic fill Maser is the hydrogen maser's eta' (Kleppner et al.
// 1965, as there). The totals are the solver's stored energies
// (Loss.StoredEnergyJ, Loss.ElectricShareJ), exact for the truncated
// model; the bulb's integrals are composite 8-point Gauss-Legendre rules
// on Field.At (nodes: Abramowitz and Stegun Table 25.4), panels split at
// every section boundary and doubled until every ratio changes by less
// than s.Tol (derived; checked in the tests against the closed forms and
// an independent midpoint rule). TM0 resonances have no H_z: MagneticZ
// and Maser are 0. Mode is left zero: the caller labels the resonance
// (Resonance.Origin).
//
// Errors: l without fields, a body with an open end (wrapping
// ErrNotImplemented), a bulb with a radius or length that is not
// positive, a bulb not inside the body (every section it
// overlaps must be circular, with a radius at least the bulb's, and the
// bulb must end inside the body), a tolerance outside (0, 1e-2], and a
// quadrature that does not converge.
func (l Loss) Filling(b Body, bulb cavity.Bulb, s RegionSettings) (cavity.Filling, error) {
	if l.Field == nil {
		return cavity.Filling{}, fmt.Errorf("axisym: the resonance has no fields (solve with Request.Losses)")
	}
	if err := b.Validate(); err != nil {
		return cavity.Filling{}, err
	}
	if b.Open() {
		return cavity.Filling{}, fmt.Errorf("axisym: bulb filling factors need a body closed by end plates at both ends (an open pipe's field runs on to infinity): %w", ErrNotImplemented)
	}
	if len(b.Sections) != len(l.Field.sections) {
		return cavity.Filling{}, fmt.Errorf("axisym: the body has %d sections, the fields %d: not the body solved", len(b.Sections), len(l.Field.sections))
	}
	if !(bulb.Radius > 0) || !(bulb.Length > 0) || math.IsInf(bulb.Radius, 0) || math.IsInf(bulb.Length, 0) {
		return cavity.Filling{}, fmt.Errorf("axisym: bulb radius and length must be > 0 and finite, got %g m and %g m", bulb.Radius, bulb.Length)
	}
	tol := s.Tol
	if tol == 0 {
		tol = DefaultRegionTol
	}
	if !(tol > 0 && tol <= 1e-2) {
		return cavity.Filling{}, fmt.Errorf("axisym: region quadrature tolerance must be in (0, 0.01], got %g", tol)
	}
	length := b.Length()
	zc := s.Centre
	if zc == 0 {
		zc = length / 2
	}
	z1, z2 := zc-bulb.Length/2, zc+bulb.Length/2
	if z1 < 0 || z2 > length*(1+1e-12) {
		return cavity.Filling{}, fmt.Errorf("axisym: bulb from z = %g m to %g m is not inside the body (0 to %g m)", z1, z2, length)
	}
	z2 = math.Min(z2, length)
	// The pieces of the bulb in each section it overlaps.
	type piece struct{ z1, z2, r float64 }
	var pieces []piece
	z0 := 0.0
	for i, sec := range b.Sections {
		lo, hi := math.Max(z1, z0), math.Min(z2, z0+sec.Length)
		if hi > lo {
			if sec.InnerRadius > 0 || bulb.Radius > sec.Radius*(1+1e-12) {
				return cavity.Filling{}, fmt.Errorf("axisym: bulb of radius %g m does not fit section %d (radius %g m, inner radius %g m)", bulb.Radius, i+1, sec.Radius, sec.InnerRadius)
			}
			pieces = append(pieces, piece{lo, hi, math.Min(bulb.Radius, sec.Radius)})
		}
		z0 += sec.Length
	}
	te := l.Field.fam == cavity.TE
	// Panels to start with: a quarter wavelength in the fastest medium
	// per panel in z and r, at least two.
	omega := l.Field.omega
	var nmax float64
	for _, sec := range b.Sections {
		nmax = math.Max(nmax, sec.maxIndex())
	}
	k := omega / physics.SpeedOfLight * nmax
	startPanels := func(w float64) int { return max(2, int(math.Ceil(k*w/(math.Pi/2)))) }
	// integrate returns int mu_r |H_z|^2, int mu_r |H|^2, int eps_r |E|^2
	// and int H_z over the bulb (dV = 2 pi r dr dz) with the panels of
	// the first rule multiplied by m.
	integrate := func(m int) (acc [4]float64) {
		for _, p := range pieces {
			k := l.Field.section((p.z1 + p.z2) / 2)
			// Radial panels split at the layer radii, where E_r (TM0)
			// jumps and the fields' derivatives do.
			var rr []quad.Node
			lo := 0.0
			for _, ly := range b.Sections[k].Layers {
				if hi := math.Min(ly.Radius, p.r); hi > lo {
					rr = append(rr, quad.Composite(lo, hi, m*startPanels(hi-lo), 8)...)
					lo = hi
				}
			}
			if lo < p.r {
				rr = append(rr, quad.Composite(lo, p.r, m*startPanels(p.r-lo), 8)...)
			}
			nz := m * startPanels(p.z2-p.z1)
			for _, zq := range quad.Composite(p.z1, p.z2, nz, 8) {
				for _, rq := range rr {
					er, mr := l.Field.epsAt(k, rq.X)
					e1, e2, h1, h2, ok := l.Field.At(rq.X, zq.X)
					if !ok {
						continue
					}
					w := 2 * math.Pi * rq.X * rq.W * zq.W
					hz := 0.0
					if te {
						hz = h2
					}
					acc[0] += w * mr * hz * hz
					acc[1] += w * mr * (h1*h1 + h2*h2)
					acc[2] += w * er * (e1*e1 + e2*e2)
					acc[3] += w * hz
				}
			}
		}
		return acc
	}
	mu0, eps0 := physics.VacuumPermeability, physics.VacuumPermittivity
	wm := l.StoredEnergyJ - l.ElectricShareJ
	we := l.ElectricShareJ
	vb := math.Pi * bulb.Radius * bulb.Radius * (z2 - z1)
	ratios := func(a [4]float64) [4]float64 {
		hTot := 4 * wm / mu0 // integral mu_r |H|^2 dV
		return [4]float64{
			a[0] / hTot,
			a[1] / hTot,
			eps0 * a[2] / (4 * we),
			a[3] * a[3] / (vb * hTot),
		}
	}
	prev := ratios(integrate(1))
	for lev, m := 1, 2; lev <= maxRegionLevels; lev, m = lev+1, 2*m {
		cur := ratios(integrate(m))
		done := true
		for i := range cur {
			if math.Abs(cur[i]-prev[i]) > tol*math.Max(math.Abs(cur[i]), 1e-300) && math.Abs(cur[i]) > 1e-15 {
				done = false
			}
		}
		prev = cur
		if done {
			return cavity.Filling{Bulb: bulb, MagneticZ: cur[0], Magnetic: cur[1], Electric: cur[2], Maser: cur[3]}, nil
		}
	}
	return cavity.Filling{}, fmt.Errorf("axisym: the bulb's field integrals did not converge to %g in %d refinements", tol, maxRegionLevels)
}
