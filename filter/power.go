package filter

import (
	"errors"
	"fmt"
	"math"

	"cylcav/cavity"
)

// Power handling of a realised filter: the energy stored in each resonator
// for a given input power across the passband, the peak fields of each
// cavity's mode at that energy, and the margin against air breakdown.

// AirBreakdown is the breakdown field of dry air at sea level (101.325 kPa)
// in a uniform field, V/m: about 3 MV/m (common practice; the usual
// textbook value, recalled from memory). RF breakdown of air at microwave
// frequencies and centimetre gaps is of the same order; humidity, surface
// finish, sharp edges and pulse length change it, so the margin is a
// first estimate only.
const AirBreakdown = 3e6

// SeaLevelPressure is the standard atmosphere, Pa.
const SeaLevelPressure = 101325.0

// MinPressure and MaxPressure bound PowerSpec.Pressure: the breakdown
// field is scaled in proportion to the pressure (Paschen's similarity law
// far to the right of the Paschen minimum, pressure times gap large;
// recalled from memory), which fails as the pressure falls toward the
// Paschen minimum and the multipaction regime; below 10 kPa no estimate is
// given.
const (
	MinPressure = 10e3
	MaxPressure = 300e3
)

// PowerSpec asks for the power handling of a filter.
type PowerSpec struct {
	// Power is the power available from the source at the input port, W.
	Power float64
	// Pressure is the air pressure in the cavities, Pa; zero means
	// SeaLevelPressure.
	Pressure float64
}

// ResonatorPower is the power handling of one resonator.
type ResonatorPower struct {
	Resonator int
	// Energy is the largest time-averaged stored energy over the passband
	// scan, J, reached at F (Hz).
	Energy, F float64
	// EPeak is the largest peak |E| anywhere in the cavity at that energy,
	// V/m; HWall the largest peak |H| on its walls, A/m.
	EPeak, HWall float64
	// Margin is Breakdown/EPeak (> 1: below breakdown), and MaxPower the
	// input power at which EPeak reaches the breakdown field,
	// Power Margin^2 (the fields scale with the square root of power).
	Margin, MaxPower float64
}

// PowerResult is the outcome of PowerHandling.
type PowerResult struct {
	Power    float64 // W
	Pressure float64 // Pa
	// Breakdown is the breakdown field used, V/m: AirBreakdown scaled by
	// Pressure/SeaLevelPressure.
	Breakdown float64
	// Resonators holds one entry per resonator.
	Resonators []ResonatorPower
	// Limit is the least MaxPower, W, and Worst its resonator.
	Limit float64
	Worst int
	// Cautions are the warnings for people that go with the figures.
	Cautions []string
}

// PowerCautions are printed with every power-handling result.
var PowerCautions = []string{
	"The breakdown field is a common-practice figure for dry air in a uniform field; sharp edges, tuning screws, burrs, humidity, contamination and long pulses lower it: keep a generous margin and test at power.",
	"In vacuum or at low pressure (space, evacuated filters) multipaction can occur at far lower power; it needs its own analysis and is not estimated here.",
	"High RF power is dangerous: follow local safety codes and licensed practice for exposure, interlocks and high-power testing.",
}

// fieldGrid is the number of sample intervals per dimension of the peak
// field search: the peaks of these Bessel-sine patterns are smooth maxima,
// so a grid of a/128 and L/128 misses them by less than 1e-4 relative
// (quadratic in the step; TestPeakFieldTE011 compares with the closed form).
const fieldGrid = 128

// peakFields returns the largest peak |E| anywhere in cavity c and the
// largest peak |H| on its walls for mode m at a stored energy of 1 J
// (cavity.ModeField's scaling), by sampling on a grid (fieldGrid) over
// rho, z and, for n >= 1, eight azimuths over a half period.
func peakFields(c cavity.Cavity, m cavity.Mode) (e1, h1 float64, err error) {
	mf, err := c.ModeField(m)
	if err != nil {
		return 0, 0, err
	}
	phis := []float64{0}
	if m.N > 0 {
		phis = nil
		for k := 0; k < 8; k++ {
			phis = append(phis, float64(k)*math.Pi/float64(8*m.N))
		}
	}
	for _, phi := range phis {
		for i := 0; i <= fieldGrid; i++ {
			rho := c.Radius * float64(i) / fieldGrid
			for j := 0; j <= fieldGrid; j++ {
				z := c.Length * float64(j) / fieldGrid
				f := mf.At(cavity.Point{Rho: rho, Phi: phi, Z: z})
				e1 = math.Max(e1, math.Sqrt(f.E.Norm2()))
				if i == fieldGrid || j == 0 || j == fieldGrid {
					h1 = math.Max(h1, math.Sqrt(f.H.Norm2()))
				}
			}
		}
	}
	return e1, h1, nil
}

// StoredEnergy returns the time-averaged energy stored in each resonator
// (J, index i-1 for resonator i) of the coupling matrix of design d with
// unloaded Qs q0 at frequency f (Hz), for power p (W) available from the
// source at the input port and a matched load:
//
//	W_i = 2 p |[A^-1]_{i,0}|^2 dOmega/domega,
//	dOmega/domega = (1 + f0^2/f^2) / (2 pi bw)
//
// (derived: with the node admittance matrix j A of Response, a source of
// EMF e and unit conductance, p = |e|^2/8 in peak phasors, the node
// voltages are v = -j A^-1 e_0 e, and a shunt resonator of susceptance
// B(omega) = Omega stores (|v|^2/4) dB/domega (Foster's reactance theorem);
// the single-resonator limit is W = Q_L 2p/omega0, the check of
// TestStoredEnergy, and the sum over the resonators of a lossless filter
// at a reflection zero equals p times the group delay). The same result
// is given by C. Ernst and V. Postoyalko, "Prediction of peak internal
// fields in direct-coupled-cavity filters", IEEE Trans. Microwave Theory
// Tech. 51(1) (2003) 64-73 (recalled from memory).
func (d *Design) StoredEnergy(q0 []float64, f, p float64) ([]float64, error) {
	if d == nil || d.Folded == nil {
		return nil, errors.New("filter: stored energy needs a synthesised design")
	}
	if !(f > 0) || math.IsInf(f, 0) || !(p > 0) || math.IsInf(p, 0) {
		return nil, fmt.Errorf("filter: stored energy needs a frequency and a power > 0 and finite, got %g Hz, %g W", f, p)
	}
	ev, err := d.evaluator(q0)
	if err != nil {
		return nil, err
	}
	return resonatorEnergy(ev, d.Spec.F0, d.Spec.BW, f, p), nil
}

func resonatorEnergy(ev *evaluator, f0, bw, f, p float64) []float64 {
	ev.atLU(LowpassOmega(f, f0, bw))
	dw := (1 + (f0/f)*(f0/f)) / (2 * math.Pi * bw)
	out := make([]float64, ev.n-2)
	for i := range out {
		x := ev.x0[i+1]
		out[i] = 2 * p * (real(x)*real(x) + imag(x)*imag(x)) * dw
	}
	return out
}

// PowerHandling returns the power handling of realisation r of design d:
// each resonator's stored energy (StoredEnergy with the cavities' Q0) at
// its maximum over the passband (the exact ripple peaks and reflection
// zeros plus 64 N uniform points in Omega, as Design.Check samples it; the
// maximum usually lies near a band edge), the peak fields of the cavity's
// mode at that energy (cavity.ModeField, scaled by sqrt(W/1 J)), and the
// margin against the breakdown field of air, AirBreakdown scaled by the
// pressure. A dielectric fill or vacuum adds a caution: the figure then is
// only the field, not a breakdown margin.
func PowerHandling(d *Design, r *Realisation, ps PowerSpec) (*PowerResult, error) {
	if d == nil || d.Folded == nil || r == nil || len(r.Cavities) != d.Spec.Order {
		return nil, errors.New("filter: power handling needs a synthesised design and its realisation")
	}
	if !(ps.Power > 0) || math.IsInf(ps.Power, 0) {
		return nil, fmt.Errorf("filter: input power must be > 0 W and finite, got %g W", ps.Power)
	}
	pr := ps.Pressure
	if pr == 0 {
		pr = SeaLevelPressure
	}
	if !(pr >= MinPressure && pr <= MaxPressure) {
		return nil, fmt.Errorf("filter: pressure must be %g..%g Pa for the breakdown estimate, got %g Pa", float64(MinPressure), float64(MaxPressure), pr)
	}
	ev, err := d.evaluator(r.Q0())
	if err != nil {
		return nil, err
	}
	res := &PowerResult{Power: ps.Power, Pressure: pr, Breakdown: AirBreakdown * pr / SeaLevelPressure, Limit: math.Inf(1)}
	n := d.Spec.Order
	best := make([]ResonatorPower, n)
	for _, w := range d.passbandGrid() {
		f := BandpassFrequency(w, d.Spec.F0, d.Spec.BW)
		for i, e := range resonatorEnergy(ev, d.Spec.F0, d.Spec.BW, f, ps.Power) {
			if e > best[i].Energy {
				best[i].Energy, best[i].F = e, f
			}
		}
	}
	for i, c := range r.Cavities {
		e1, h1, err := peakFields(c.Cavity, r.Mode)
		if err != nil {
			return nil, fmt.Errorf("filter: fields of cavity %d: %w", c.Resonator, err)
		}
		b := best[i]
		b.Resonator = c.Resonator
		s := math.Sqrt(b.Energy)
		b.EPeak, b.HWall = e1*s, h1*s
		b.Margin = res.Breakdown / b.EPeak
		b.MaxPower = ps.Power * b.Margin * b.Margin
		if b.MaxPower < res.Limit {
			res.Limit, res.Worst = b.MaxPower, b.Resonator
		}
		res.Resonators = append(res.Resonators, b)
	}
	if f := r.Cavities[0].Cavity.Fill; f.Eps() > airEpsMax || f.Mu() != 1 {
		res.Cautions = append(res.Cautions, fmt.Sprintf("The cavities are filled with %s, not air: the air breakdown margin does not apply; use the fill's own dielectric strength.", fillName(f.Name)))
	}
	res.Cautions = append(res.Cautions, PowerCautions...)
	return res, nil
}

func fillName(s string) string {
	if s == "" {
		return "a dielectric"
	}
	return s
}

// airEpsMax is the largest relative permittivity taken as air (dry air at
// sea level has eps_r = 1.0006; common practice).
const airEpsMax = 1.001
