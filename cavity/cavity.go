package cavity

import (
	"fmt"
	"math"

	"cylcav/physics"
	"cylcav/physics/bessel"
)

// Cavity is a closed circular cylinder of radius Radius and length Length
// (metres) with perfectly conducting walls, homogeneously filled with the
// medium Fill.
//
// The zero Fill is vacuum, so Cavity{Radius: a, Length: d} is an empty
// cavity.
type Cavity struct {
	Radius, Length float64
	Fill           physics.Medium
}

// Size limits accepted by Validate. They exclude typing slips (a length in
// micrometres entered as metres) while covering every practical cavity from
// millimetre-wave resonators to large accelerator cells.
const (
	MinSize = 1e-6 // m
	MaxSize = 1e3  // m
)

// Validate reports whether the cavity's dimensions and fill are finite and
// physical: MinSize <= Radius, Length <= MaxSize, and the fill as in
// physics.Medium.Validate.
func (c Cavity) Validate() error {
	if err := checkSize("radius", c.Radius); err != nil {
		return err
	}
	if err := checkSize("length", c.Length); err != nil {
		return err
	}
	return checkFill(c.Fill)
}

// checkFill is physics.Medium.Validate with this package's error prefix.
func checkFill(m physics.Medium) error {
	if err := m.Validate(); err != nil {
		return fmt.Errorf("cavity: %w", err)
	}
	return nil
}

func checkSize(name string, v float64) error {
	if !(v >= MinSize && v <= MaxSize) {
		return fmt.Errorf("cavity: %s must be in %g..%g m, got %g m", name, MinSize, MaxSize, v)
	}
	return nil
}

// Diameter returns 2 Radius.
func (c Cavity) Diameter() float64 { return 2 * c.Radius }

// Volume returns the cavity volume pi a^2 d in m^3.
func (c Cavity) Volume() float64 { return math.Pi * c.Radius * c.Radius * c.Length }

// Root returns the Bessel zero x that sets the transverse wavenumber x/a of
// mode m: j'_{n,m} (the m-th positive zero of J'_n) for TE and j_{n,m} (the
// m-th positive zero of J_n) for TM. Accuracy is that of package
// physics/bessel (relative error below about 1e-14).
//
// Because J'_0 = -J_1 (DLMF 10.6.3), j'_{0,m} = j_{1,m}; Root returns the
// very same float64 for TE0mp and TM1mp (both from JZeros(1, ...)), so the
// two modes have bit-identical frequencies everywhere in cylcav.
//
// Root costs O(m) (the zeros of one order come as a table). It panics if m
// is not a valid mode; call m.Validate first on user input.
func (m Mode) Root() float64 {
	if err := m.Validate(); err != nil {
		panic(err)
	}
	return root(m.Family, m.N, m.M)
}

// root returns j'_{n,m} (TE) or j_{n,m} (TM) for valid indices.
func root(f Family, n, m int) float64 {
	if f == TE {
		if n == 0 {
			return bessel.JZeros(1, m)[m-1] // j'_{0,m} = j_{1,m}, DLMF 10.6.3
		}
		return bessel.JPrimeZeros(n, m)[m-1]
	}
	return bessel.JZeros(n, m)[m-1]
}

// scale returns c / (2 pi sqrt(mu_r eps_r)) (eps_perp for a uniaxial
// fill), the factor that turns a total
// wavenumber in rad/m into a frequency in Hz.
func (c Cavity) scale() float64 {
	return physics.SpeedOfLight / (2 * math.Pi * c.Fill.Index())
}

// frequency is the single implementation of the resonance formula
//
//	f = c / (2 pi sqrt(mu_r eps_r)) * sqrt((x/a)^2 + (p pi/d)^2)
//
// (Pozar, Microwave Engineering, 4th ed., sec. 6.4, resonant frequencies
// of the TE_nmp and TM_nmp modes; Harrington, Time-Harmonic Electromagnetic
// Fields, sec. 5.3). Every frequency in this package goes through it, so equal
// inputs give bit-equal outputs; the explicit float64 conversions forbid
// fused multiply-adds (Go spec, "Arithmetic operators"), which could
// otherwise round differently at different call sites.
func frequency(scale, x, radius float64, p int, length float64) float64 {
	kc := x / radius
	beta := float64(p) * math.Pi / length
	return scale * math.Sqrt(float64(kc*kc)+float64(beta*beta))
}

// Frequency returns the resonant frequency in Hz of mode m:
//
//	f = c / (2 pi sqrt(mu_r eps_r)) * sqrt((x/a)^2 + (p pi/d)^2)
//
// with x = j'_nm for TE and j_nm for TM (Pozar, Microwave Engineering, 4th
// ed., sec. 6.4; Harrington, Time-Harmonic Electromagnetic Fields, sec.
// 5.3). The value is bit-identical to the one Modes and Lowest list for the
// same mode. Relative accuracy is about 1e-15 beyond that of the Bessel
// zero. It panics if m is not a valid mode (see Mode.Validate); the cavity
// itself is not checked.
//
// A uniaxial fill (physics.Medium.Uniaxial, c axis along z) is exact too:
// TE modes have no E_z, so their field lies across the c axis and sees
// eps_perp (EpsR) alone; TM modes obey
//
//	(omega/c0)^2 = kc^2/eps_par + beta^2/eps_perp,
//
// which is the formula above with eps_perp and the radius of radiusFor (see
// uniaxial.go for the source).
func (c Cavity) Frequency(m Mode) float64 {
	return frequency(c.scale(), m.Root(), c.radiusFor(m.Family), m.P, c.Length)
}

// FrequencyOfRoot returns the resonant frequency in Hz of the mode whose
// Bessel zero is x (Mode.Root) and whose axial index is p, by the same
// formula as Frequency: Frequency(m) == FrequencyOfRoot(m.Root(), m.P) bit
// for bit. It lets a caller that has the zero already (a loss or field
// computation) skip looking it up again. x and p are not checked.
func (c Cavity) FrequencyOfRoot(x float64, p int) float64 {
	return frequency(c.scale(), x, c.Radius, p, c.Length)
}

// Wavenumbers returns, for mode m in cavity c, the transverse wavenumber
// kc = x/a, the axial wavenumber beta = p pi/d and the total wavenumber
// k = sqrt(kc^2 + beta^2) in the fill, all in rad/m (Pozar, Microwave
// Engineering, 4th ed., sec. 6.4). The free-space wavenumber is k divided
// by sqrt(mu_r eps_r), and k = 2 pi f sqrt(mu_r eps_r)/c at the resonance.
// It panics if m is not a valid mode.
func (c Cavity) Wavenumbers(m Mode) (kc, beta, k float64) {
	kc = m.Root() / c.Radius
	beta = float64(m.P) * math.Pi / c.Length
	return kc, beta, math.Sqrt(float64(kc*kc) + float64(beta*beta))
}
