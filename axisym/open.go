package axisym

import (
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics"
)

// End says how a Body ends at z = 0 (Body.EndA) or at its far end
// (Body.EndB). The zero value is a metal plate.
type End uint8

const (
	// Plate is a flat metal end plate.
	Plate End = iota
	// Pipe is a semi-infinite pipe of the end section's cross-section and
	// fill (a beam pipe, or the feeding waveguide of a port): the end
	// section's modal lines run on to infinity. Below the pipe's lowest
	// cutoff of a family (Body.Cutoff) every mode of the pipe is
	// evanescent and a resonance is trapped, a real resonance; above it
	// the resonance radiates into the pipe (Body.Radiates).
	Pipe
)

// String returns the end's name as the geometry file writes it.
func (e End) String() string {
	switch e {
	case Plate:
		return "plate"
	case Pipe:
		return "pipe"
	}
	return fmt.Sprintf("End(%d)", uint8(e))
}

// validateEnds reports whether both ends are known kinds.
func (b Body) validateEnds() error {
	for _, e := range []struct {
		name string
		e    End
	}{{"end A", b.EndA}, {"end B", b.EndB}} {
		if e.e != Plate && e.e != Pipe {
			return fmt.Errorf("axisym: %s must be a plate or a pipe, got %v", e.name, e.e)
		}
	}
	if b.Open() {
		// The pipe's cutoff, the trapped count and the complex port
		// frequencies all assume homogeneous sections.
		for i, s := range b.Sections {
			if len(s.Layers) > 0 {
				return fmt.Errorf("axisym: section %d: radial layers in a body with an open end (pipe): %w (close both ends with plates)", i+1, ErrNotImplemented)
			}
		}
	}
	return nil
}

// Open reports whether either end of b is a pipe.
func (b Body) Open() bool { return b.EndA == Pipe || b.EndB == Pipe }

// Cutoff returns the lowest cutoff frequency, in Hz, of family fam (TE0 or
// TM0) among the pipes at the open ends of b: j_{1,1}/a (TE0) or
// j_{0,1}/a (TM0) over 2 pi sqrt(eps mu) for a circular pipe of radius a,
// the lowest cross-product root for a coaxial one, and 0 for TM0 of a
// coaxial pipe (its TEM mode propagates at every frequency). It is +Inf for
// a body with no open end. (Marcuvitz, Waveguide Handbook, 1951, sec. 2.4,
// as recalled.)
func (b Body) Cutoff(fam cavity.Family) float64 {
	fc := math.Inf(1)
	if len(b.Sections) == 0 {
		return fc
	}
	for _, e := range []struct {
		end End
		sec Section
	}{{b.EndA, b.Sections[0]}, {b.EndB, b.Sections[len(b.Sections)-1]}} {
		if e.end != Pipe {
			continue
		}
		g := newGuide(fam, e.sec.InnerRadius, e.sec.Radius, 1)
		fc = math.Min(fc, g.kc[0]*physics.SpeedOfLight/(2*math.Pi*e.sec.Fill.Index()))
	}
	return fc
}

// Radiates reports whether a resonance of family fam at frequency f (Hz)
// of body b radiates into an open end: f at or above Body.Cutoff. It is the
// one verdict of trapped against radiating that Solve, Radiating, PortQ and
// the commands use. A body with plates at both ends never radiates.
func (b Body) Radiates(fam cavity.Family, f float64) bool {
	return f >= b.Cutoff(fam)
}

// Shorted returns b without its open end sections and with metal plates at
// both ends: the closed body whose aperture into each pipe is shorted, the
// starting point from which Radiating seeks each radiating resonance. It
// returns an empty body when nothing is left.
func (b Body) Shorted() Body {
	s := b.Sections
	if b.EndA == Pipe && len(s) > 0 {
		s = s[1:]
	}
	if b.EndB == Pipe && len(s) > 0 {
		s = s[:len(s)-1]
	}
	return Body{Sections: append([]Section(nil), s...)}
}

// belowCutoff is the relative distance below the cutoff at which the real
// search of an open body stops: there the evanescent termination of the
// lowest pipe mode is still finite in floating point and far above any
// root bracket.
const belowCutoff = 1e-9

// markOpen flags the modal lines of the open end sections of b in s.
func (s *system) markOpen(b Body) {
	if len(s.lines) == 0 {
		return
	}
	if b.EndA == Pipe {
		s.lines[0].open = true
	}
	if b.EndB == Pipe {
		s.lines[len(s.lines)-1].open = true
	}
}

// openSusceptance returns the normalised driving-point susceptance of one
// modal line of an open end section, which continues as the pipe to
// infinity, below the mode's cutoff (beta2 = k^2 - kc^2 < 0): the line's
// characteristic admittance, continued to beta = -j alpha,
//
//	TE: b11 = -alpha/mu_r,  TM: b11 = eps_r/alpha,
//
// in the scaling of lineSusceptance (its l -> infinity limit: coth -> 1).
// Both increase with frequency, as Foster's reactance theorem requires of
// a lossless termination (alpha falls as f rises), and the line has no
// resonance of its own (no pole): the Wittrick-Williams count of system
// stays exact below the cutoff. Derived; TestTrappedLongStub checks it
// against plates moved far into the pipe.
func openSusceptance(fam cavity.Family, beta2, eps, mu float64) (b11 float64) {
	alpha := math.Sqrt(math.Max(-beta2, 0))
	if fam == cavity.TE {
		return -alpha / mu
	}
	return eps / alpha
}

// openTail is the extent of the field kept beyond an open end section's
// junction, in decay lengths 1/alpha of its slowest mode: the amplitude
// falls to e^-40 (4e-18) there, so the stored energy, the pipe-wall loss
// and the axial voltage miss a part below 1e-30 of theirs.
const openTail = 40

// openLineField is the field of one modal line of an open end section
// below its cutoff: the wave decays away from the junction into the pipe,
// V(z) = v2 exp(alpha (z - l)) for the section at end A (junction at
// z = l), V(z) = v1 exp(-alpha z) at end B (junction at z = 0), with the
// current from V' as in lineField.
func openLineField(fam cavity.Family, beta2, l, omega, eps, mu, v1, v2 float64, endA bool) lineField {
	f := lineField{fam: fam, beta2: beta2, l: l, v1: v1, v2: v2, omega: omega, eps: eps, mu: mu, tail: 1}
	if endA {
		f.tail = -1
	}
	if fam == cavity.TE {
		f.iScale = 1 / (omega * mu)
	} else {
		f.iScale = omega * eps / beta2
	}
	return f
}

// atTail is lineField.at for an open end section; z may lie beyond the
// section, in the pipe.
func (f lineField) atTail(z float64) (v, i float64) {
	a := math.Sqrt(math.Max(-f.beta2, 0))
	if f.tail < 0 {
		v = f.v2 * math.Exp(a*(z-f.l))
		return v, f.iScale * a * v
	}
	v = f.v1 * math.Exp(-a*z)
	return v, -f.iScale * a * v
}

// openRule is the quadrature rule of an open end section: zRule over the
// section and the pipe beyond it, openTail decay lengths of the slowest
// mode from the junction, in the section's coordinates (z < 0 in the pipe
// at end A, z > l at end B).
func openRule(l float64, kc []float64, k2 float64, endA bool) []zPoint {
	amin := math.Inf(1)
	for _, k := range kc {
		amin = math.Min(amin, math.Sqrt(math.Max(k*k-k2, 0)))
	}
	ext := l
	if amin > 0 {
		ext = math.Max(l, openTail/amin)
	}
	q := zRule(ext, kc, k2)
	if endA {
		for i := range q {
			q[i].z += l - ext
		}
	}
	return q
}
