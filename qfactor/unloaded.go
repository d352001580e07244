package qfactor

import (
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics/bessel"
)

// ResistancesAt gives the surface resistance of each wall part, in ohm,
// at frequency f in Hz. It lets one call evaluate frequency-dependent
// surface models at every mode's own frequency; WallSet.At gives the one
// of a wall set.
type ResistancesAt func(f float64) (SurfaceResistances, error)

// Unloaded is the unloaded-Q breakdown of one mode: wall and fill losses.
type Unloaded struct {
	Wall  WallLoss // wall Q, partial Qs, geometry factors, frequency
	QFill float64  // Q of the fill loss, +Inf for a lossless fill
	// Q0 is the unloaded Q, 1/Q0 = 1/Q_wall + 1/Q_fill; +Inf when there is
	// no loss at all.
	Q0 float64
	// Share is the fraction of the total loss in each wall part and in the
	// fill; all zero when there is no loss.
	Share Share
}

// UnloadedQ returns the unloaded Q of mode m of cavity c:
//
//	1/Q0 = 1/Q_wall + 1/Q_fill
//
// (Pozar 2012, sec. 6.3, eq. (6.49) as recalled from memory), with Q_wall
// from WallQ for the surface resistances rs(f) at the mode's frequency f and
// Q_fill = c.Fill.Q() from the loss tangents of the cavity's fill. Invalid
// input, or an error from rs, is an error.
func UnloadedQ(c cavity.Cavity, m cavity.Mode, rs ResistancesAt) (Unloaded, error) {
	if err := c.Validate(); err != nil {
		return Unloaded{}, err
	}
	if err := m.Validate(); err != nil {
		return Unloaded{}, err
	}
	if err := c.ModelHolds(m, "the unloaded-Q model"); err != nil {
		return Unloaded{}, err
	}
	x := m.Root()
	return unloaded(c, m, x, c.FrequencyOfRoot(x, m.P), rs, c.Fill.Q())
}

// UnloadedQAll returns UnloadedQ for each resonance in res (as listed by
// cavity.Cavity.Modes or Lowest), in the same order. The surface
// resistances are evaluated at each resonance's Frequency, which is also the
// frequency reported, so the results line up with the list bit for bit.
// Bessel zeros are computed once per family and azimuthal index, so this is
// much faster than calling UnloadedQ in a loop for a long list. An invalid
// mode or frequency, or an error from rs, stops the run and is returned.
func UnloadedQAll(c cavity.Cavity, res []cavity.Resonance, rs ResistancesAt) ([]Unloaded, error) {
	if err := c.Validate(); err != nil {
		return nil, err
	}
	qf := c.Fill.Q()
	// Largest radial index per family and azimuthal order, then one table of
	// Bessel zeros per (family, n): index 2n for TE, 2n+1 for TM.
	var most []int
	for _, r := range res {
		if err := r.Mode.Validate(); err != nil {
			return nil, err
		}
		if err := c.ModelHolds(r.Mode, "the unloaded-Q model"); err != nil {
			return nil, err
		}
		if !(r.Frequency > 0) || math.IsInf(r.Frequency, 0) {
			return nil, fmt.Errorf("qfactor: frequency of %s must be finite and > 0 Hz, got %g Hz", r.Mode, r.Frequency)
		}
		k := slot(r.Mode)
		if k >= len(most) {
			most = append(most, make([]int, k+1-len(most))...)
		}
		most[k] = max(most[k], r.Mode.M)
	}
	roots := make([][]float64, len(most))
	for k, mm := range most {
		switch {
		case mm == 0:
		case k%2 == 0:
			roots[k] = bessel.JPrimeZeros(k/2, mm)
		default:
			roots[k] = bessel.JZeros(k/2, mm)
		}
	}
	out := make([]Unloaded, len(res))
	for i, r := range res {
		u, err := unloaded(c, r.Mode, roots[slot(r.Mode)][r.Mode.M-1], r.Frequency, rs, qf)
		if err != nil {
			return nil, err
		}
		out[i] = u
	}
	return out, nil
}

// slot returns the index of m's Bessel-zero table in UnloadedQAll.
func slot(m cavity.Mode) int {
	if m.Family == cavity.TE {
		return 2 * m.N
	}
	return 2*m.N + 1
}

// unloaded is UnloadedQ for validated input, Bessel zero x, resonant
// frequency f and fill Q qf.
func unloaded(c cavity.Cavity, m cavity.Mode, x, f float64, rs ResistancesAt, qf float64) (Unloaded, error) {
	w, err := rs(f)
	if err != nil {
		return Unloaded{}, fmt.Errorf("qfactor: surface resistance of %s at %.6g Hz: %w", m, f, err)
	}
	if err := w.Validate(); err != nil {
		return Unloaded{}, err
	}
	u := Unloaded{Wall: wallQ(c, m, x, w), QFill: qf}
	u.Wall.Frequency = f
	u.Q0 = Combine(u.Wall.QWall, qf)
	side, a, b, fl := 1/u.Wall.QSide, 1/u.Wall.QEndA, 1/u.Wall.QEndB, 1/qf
	if total := side + a + b + fl; total > 0 {
		u.Share = Share{Side: side / total, EndA: a / total, EndB: b / total, Fill: fl / total}
	}
	return u, nil
}
