package qfactor

import (
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics"
)

// SurfaceResistances holds the surface resistance Rs, in ohm, of each part
// of the cavity wall at one frequency: the numbers WallQ takes, as
// WallSet.Resistances gives them for a wall set. The permeability of the
// wall metal enters only through Rs.
//
// The zero value is a lossless (perfectly conducting) cavity.
type SurfaceResistances struct {
	Side float64 // cylindrical side wall, r = a
	EndA float64 // end plate A, z = 0
	EndB float64 // end plate B, z = d
}

// Uniform returns SurfaceResistances with the same surface resistance rs on every part.
func Uniform(rs float64) SurfaceResistances { return SurfaceResistances{Side: rs, EndA: rs, EndB: rs} }

// Validate reports whether every surface resistance is finite and >= 0.
func (w SurfaceResistances) Validate() error {
	for _, q := range []struct {
		name string
		v    float64
	}{{"side-wall", w.Side}, {"end-plate A", w.EndA}, {"end-plate B", w.EndB}} {
		if math.IsNaN(q.v) || math.IsInf(q.v, 0) || q.v < 0 {
			return fmt.Errorf("qfactor: %s surface resistance must be finite and >= 0 ohm, got %g ohm", q.name, q.v)
		}
	}
	return nil
}

// Geometry holds the partial geometry factors of one mode, in ohm: for each
// wall part,
//
//	G_part = omega W / ((1/2) integral over the part of |H_tan|^2 dS)
//
// where W is the stored energy. They depend only on the shape, the mode and
// the fill, not on the wall metal, and give the wall Q as
//
//	1/Q_wall = Rs_side/G_side + Rs_A/G_A + Rs_B/G_B.
//
// EndA and EndB are equal for every mode (the field is symmetric about
// z = d/2 in magnitude); both are kept so that sums read like the walls.
type Geometry struct {
	Side, EndA, EndB float64
}

// Total returns the geometry factor G of the whole wall, the product Q Rs of
// a cavity whose walls all have the same Rs:
//
//	G = omega mu integral |H|^2 dV / integral |H_tan|^2 dS
//
// (Padamsee, Knobloch & Hays 2008, ch. 1, with mu = mu_r mu0 of the fill),
// the harmonic sum of the partial factors.
func (g Geometry) Total() float64 {
	return 1 / (1/g.Side + 1/g.EndA + 1/g.EndB)
}

// Share holds the fraction of a cavity's loss in each place. The parts add
// up to 1; all are zero when there is no loss at all.
type Share struct {
	Side, EndA, EndB, Fill float64
}

// WallLoss is the wall-loss breakdown of one mode.
type WallLoss struct {
	Mode      cavity.Mode
	Frequency float64            // resonant frequency, Hz
	Rs        SurfaceResistances // surface resistances used, ohm
	Geometry  Geometry           // partial geometry factors, ohm

	// QWall is the Q from wall loss alone; +Inf when every Rs is zero.
	QWall float64
	// QSide, QEndA and QEndB are the partial Qs omega W / P_part of each
	// wall part (1/QWall is their reciprocal sum); +Inf where Rs is zero.
	QSide, QEndA, QEndB float64
	// Share is the fraction of the wall loss in each part (Fill is zero).
	Share Share
}

// WallQ returns the wall-loss Q of mode m of cavity c whose side wall and end
// plates have the surface resistances rs, with each part's share of the loss.
//
// It holds for every mode that exists: TE_nmp with n >= 0, m >= 1, p >= 1
// and TM_nmp with n >= 0, m >= 1, p >= 0, in a homogeneous fill (c.Fill).
// Each of the two polarisations cos(n phi), sin(n phi) of a mode with n >= 1 has the same Q and the same shares. An invalid cavity, mode or Rs is
// an error.
//
// The method is the usual surface-resistance perturbation (Harrington 1961,
// ch. 5; Pozar 2012, sec. 6.4): fields of the lossless cavity, stored
// energy W and loss P = (Rs/2) integral |H_tan|^2 dS over each wall part,
// Q = omega W / P. With k = omega sqrt(mu eps), eta = sqrt(mu/eps),
// k_c = x/a, beta = p pi/d and x the Bessel zero of the mode (see
// GeometryFactors):
//
//	TM_nmp:  G_side = k eta a / 2,   G_A = G_B = k eta d / 2 (p >= 1), k eta d (p = 0)
//	TE_nmp:  G_side = k eta a^3 k^2 (x^2 - n^2) / (2 x^4 [1 + (n beta a / x^2)^2])
//	         G_A = G_B = k eta d k^2 / (2 beta^2)
//
// With equal Rs everywhere these reduce to the published uniform-wall forms:
// TM_nm0 Q = a d / (delta (a + d)) and TM_nmp (p >= 1)
// Q delta/lambda = sqrt(x^2 + (p pi a/d)^2) / (2 pi (1 + 2a/d)) (Harrington
// 1961, ch. 5, circular cavity, for mu = mu_w = mu0), and TE_nmp Pozar's
// closed form (Pozar 2012, sec. 6.4)
//
//	Q_c = (ka)^3 eta a d (1 - (n/x)^2) /
//	      (4 x^2 Rs {(a d/2)[1 + (beta a n/x^2)^2] + (beta a^2/x)^2 (1 - (n/x)^2)})
//
// The split over side wall and each end plate with its own Rs is derived
// here from the same fields (the azimuthal integral, pi for n >= 1 and 2 pi
// for n = 0, multiplies W and every wall integral alike and cancels in both Q
// and the shares) and is checked in the tests by numerical quadrature of the
// mode fields, to 1e-8.
//
// Accuracy: a few ulp for the stated model. The model itself holds when the
// skin depth is much smaller than the radius and the length, Q >> 1, and
// the walls are smooth on the scale of the skin depth (see the surface
// models for roughness).
func WallQ(c cavity.Cavity, m cavity.Mode, rs SurfaceResistances) (WallLoss, error) {
	if err := c.Validate(); err != nil {
		return WallLoss{}, err
	}
	if err := m.Validate(); err != nil {
		return WallLoss{}, err
	}
	if err := c.ModelHolds(m, "the wall-loss model"); err != nil {
		return WallLoss{}, err
	}
	if err := rs.Validate(); err != nil {
		return WallLoss{}, err
	}
	x := m.Root()
	w := wallQ(c, m, x, rs)
	w.Frequency = c.FrequencyOfRoot(x, m.P)
	return w, nil
}

// GeometryFactors returns the partial geometry factors of mode m of cavity
// c: the wall Q of each part for Rs = 1 ohm on that part alone (see Geometry
// and WallQ for the formulas and their sources). An invalid cavity or mode
// is an error.
func GeometryFactors(c cavity.Cavity, m cavity.Mode) (Geometry, error) {
	if err := c.Validate(); err != nil {
		return Geometry{}, err
	}
	if err := m.Validate(); err != nil {
		return Geometry{}, err
	}
	if err := c.ModelHolds(m, "the wall-loss model"); err != nil {
		return Geometry{}, err
	}
	return geometry(c, m, m.Root()), nil
}

// wallQ is WallQ for validated input and the mode's Bessel zero x, without
// the frequency (the caller sets it from cavity.Cavity.Frequency or from a
// mode list, the one implementation of the resonance formula).
func wallQ(c cavity.Cavity, m cavity.Mode, x float64, rs SurfaceResistances) WallLoss {
	g := geometry(c, m, x)
	w := WallLoss{Mode: m, Rs: rs, Geometry: g}
	side, a, b := rs.Side/g.Side, rs.EndA/g.EndA, rs.EndB/g.EndB
	w.QSide, w.QEndA, w.QEndB = inv(side), inv(a), inv(b)
	total := side + a + b
	w.QWall = inv(total)
	if total > 0 {
		w.Share = Share{Side: side / total, EndA: a / total, EndB: b / total}
	}
	return w
}

// inv returns 1/x, +Inf for x = 0.
func inv(x float64) float64 {
	if x == 0 {
		return math.Inf(1)
	}
	return 1 / x
}

// geometry returns the partial geometry factors of mode m with Bessel zero
// x (formulas in WallQ: Harrington 1961, ch. 5 and Pozar 2012, sec. 6.4 for
// the uniform sum; per part derived).
func geometry(c cavity.Cavity, m cavity.Mode, x float64) Geometry {
	epsR, muR := c.Fill.Eps(), c.Fill.Mu()
	a, d := c.Radius, c.Length
	beta := float64(m.P) * math.Pi / d
	k := math.Hypot(x/a, beta)
	// omega mu = k eta; computed from mu0 (not Z0) to stay consistent with
	// the mu0 in Rs to the last digit.
	ke := k * physics.SpeedOfLight / math.Sqrt(epsR*muR) * muR * physics.VacuumPermeability
	var g Geometry
	if m.Family == cavity.TM {
		// Derived: W = (mu/2)(omega eps)^2 zeta d/2 nu pi a^2 J'_n(x)^2/(2 kc^2),
		// P_side = (Rs/2)(omega eps)^2 J'_n(x)^2 nu pi a zeta d/(2 kc^2),
		// P_end = (Rs/2)(omega eps)^2 J'_n(x)^2 nu pi a^2/(2 kc^2),
		// zeta = 2 for p = 0 (integral of cos^2 over the length is d, not d/2).
		g.Side = ke * a / 2
		zeta := 1.0
		if m.P == 0 {
			zeta = 2
		}
		g.EndA = ke * zeta * d / 2
	} else {
		// Derived: W = (mu/2)(d/2) nu pi (x^2-n^2) J_n(x)^2 k^2/(2 kc^4),
		// P_side = (Rs/2) a (d/2) nu pi J_n(x)^2 [1 + (n beta/(kc^2 a))^2],
		// P_end = (Rs/2)(beta/kc^2)^2 nu pi (x^2-n^2) J_n(x)^2/2.
		n := float64(m.N)
		x2 := x * x
		t := n * beta * a / x2
		g.Side = ke * a * a * a * k * k * (x - n) * (x + n) / (2 * x2 * x2 * (1 + t*t))
		g.EndA = ke * d * k * k / (2 * beta * beta)
	}
	g.EndB = g.EndA
	return g
}
