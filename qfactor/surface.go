package qfactor

import (
	"fmt"
	"math"
	"math/cmplx"
	"strings"

	"cylcav/physics"
)

// This file turns a wall material into a surface resistance Rs: classical
// skin effect, the linear temperature model of resistivity, surface
// roughness, a plated layer over a base metal, superconducting niobium by
// the BCS approximation, and a check for the anomalous skin effect. Surface
// is the single entry point for the command line and the other packages.

// roomTemperature is 20 C in kelvin, the reference temperature of the
// material library.
const roomTemperature = physics.ZeroCelsius + 20

// SkinDepth returns the classical skin depth
//
//	delta = sqrt(2 / (omega mu_r mu0 sigma)),  omega = 2 pi f,
//
// in metres, of a good conductor with conductivity sigma (S/m) and relative
// permeability muR at frequency f (Hz) (Pozar, Microwave Engineering, 4th
// ed., sec. 1.4, plane waves in a good conductor; Ramo, Whinnery & Van Duzer, Fields and
// Waves in Communication Electronics, 3rd ed., ch. 3).
//
// Domain: f, sigma, muR > 0 and finite; the model assumes sigma >> omega
// eps0 and an electron mean free path much shorter than delta (see
// AnomalyParameter). Outside the domain the result is NaN, Inf or 0 as the
// arithmetic gives; Surface checks its inputs and returns errors instead.
func SkinDepth(f, sigma, muR float64) float64 {
	return math.Sqrt(2 / (2 * math.Pi * f * muR * physics.VacuumPermeability * sigma)) // Pozar sec. 1.4
}

// SurfaceResistance returns the classical surface resistance
//
//	Rs = sqrt(omega mu_r mu0 / (2 sigma)) = 1/(sigma delta),
//
// in ohm, of a smooth, thick good conductor (Pozar, Microwave Engineering,
// 4th ed., sec. 1.7; Ramo, Whinnery & Van Duzer, 3rd ed., ch. 3). The
// domain is that of SkinDepth. Accuracy: exact within the local, classical
// model (to rounding, about 1e-16 relative).
func SurfaceResistance(f, sigma, muR float64) float64 {
	return math.Sqrt(2 * math.Pi * f * muR * physics.VacuumPermeability / (2 * sigma)) // Pozar sec. 1.7
}

// Conductivity returns the conductivity of c at the temperature t (kelvin)
// by the linear resistivity model
//
//	rho(T) = rho20 (1 + alpha (T - 293.15 K))
//
// (the usual handbook model around 20 C, e.g. CRC Handbook of Chemistry and
// Physics, 97th ed., recalled from memory). t = 0 means 20 C and returns
// c.Conductivity unchanged.
//
// It returns an error when c.Conductivity is not finite and > 0; when t lies
// outside the conductor's range [TMin, TMax] (by default -50 C to +200 C,
// physics.DefaultLinearTMin..DefaultLinearTMax; the model fails at cryogenic
// temperatures, where the measured conductivity should be given instead);
// and when t differs from 20 C but the conductor has no known alpha.
func Conductivity(c physics.Conductor, t float64) (float64, error) {
	name := c.Name
	if name == "" {
		name = "user"
	}
	if !(c.Conductivity > 0) || math.IsInf(c.Conductivity, 0) {
		return 0, fmt.Errorf("qfactor: conductor %q: conductivity must be finite and > 0 S/m, got %g S/m", name, c.Conductivity)
	}
	if t == 0 || t == roomTemperature {
		return c.Conductivity, nil
	}
	lo, hi := c.TMin, c.TMax
	if lo == 0 && hi == 0 {
		lo, hi = physics.DefaultLinearTMin, physics.DefaultLinearTMax
	}
	if !physics.TemperatureIn(t, lo, hi) { // a limit typed in C or F converts with rounding
		return 0, fmt.Errorf("qfactor: conductor %q: the linear resistivity model holds from %s to %s, got %s; for a cold wall give the conductivity measured at its temperature (sigma=...) and no wall temperature",
			name, physics.FormatTemperature(lo, 4), physics.FormatTemperature(hi, 4), physics.FormatTemperature(t, 4))
	}
	if !c.AlphaKnown {
		return 0, fmt.Errorf("qfactor: conductor %q has no resistivity temperature coefficient; give alpha=... or leave the wall temperature at 20 C", name)
	}
	rho := (1 + c.Alpha*(t-roomTemperature)) / c.Conductivity // linear model, CRC Handbook (recalled)
	if !(rho > 0) {
		return 0, fmt.Errorf("qfactor: conductor %q: the linear model gives a non-positive resistivity at %s (alpha = %g 1/K)", name, physics.FormatTemperature(t, 4), c.Alpha)
	}
	return 1 / rho, nil
}

// RoughnessModel selects the surface-roughness correction of Rs. The zero
// value is HammerstadBekkadal.
type RoughnessModel int

const (
	// HammerstadBekkadal is K = 1 + (2/pi) atan(1.4 (Delta/delta)^2)
	// (E. O. Hammerstad and O. Bekkadal, Microstrip Handbook, ELAB report
	// STF44 A74169, University of Trondheim, 1975).
	HammerstadBekkadal RoughnessModel = iota
	// Groiss is K = 1 + exp(-(delta/(2 Delta))^1.6) (S. Groiss, I. Bardi,
	// O. Biro, K. Preis and K. R. Richter, Parameters of lossy cavity
	// resonators calculated by the finite element method, IEEE Trans. Magn.
	// 32(3), 894-897, 1996).
	Groiss
)

// String returns the name accepted by ParseRoughnessModel.
func (m RoughnessModel) String() string {
	switch m {
	case HammerstadBekkadal:
		return "hammerstad"
	case Groiss:
		return "groiss"
	}
	return fmt.Sprintf("RoughnessModel(%d)", int(m))
}

// ParseRoughnessModel returns the model named s, ignoring case:
// "hammerstad" (also "hammerstad-bekkadal", "hb") or "groiss".
func ParseRoughnessModel(s string) (RoughnessModel, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "hammerstad", "hammerstad-bekkadal", "hb":
		return HammerstadBekkadal, nil
	case "groiss":
		return Groiss, nil
	}
	return 0, fmt.Errorf("unknown roughness model %q; use hammerstad or groiss", s)
}

// RoughnessFactor returns the factor K >= 1 by which surface roughness of
// RMS height rms (m) raises the surface resistance of a metal with skin
// depth delta (m), by the chosen model:
//
//	Hammerstad-Bekkadal (1975): K = 1 + (2/pi) atan(1.4 (rms/delta)^2)
//	Groiss et al. (1996):       K = 1 + exp(-(delta/(2 rms))^1.6)
//
// Both give 1 for a smooth surface (rms << delta) and tend to 2 for a rough
// one (rms >> delta). They are empirical fits for random roughness; their
// accuracy is of the order of 10 % in K (common practice). It returns an
// error for rms < 0, delta <= 0, either not finite, or an unknown model.
func RoughnessFactor(model RoughnessModel, rms, delta float64) (float64, error) {
	if !(rms >= 0) || math.IsInf(rms, 0) {
		return 0, fmt.Errorf("qfactor: RMS roughness must be finite and >= 0 m, got %g m", rms)
	}
	if !(delta > 0) || math.IsInf(delta, 0) {
		return 0, fmt.Errorf("qfactor: skin depth must be finite and > 0 m, got %g m", delta)
	}
	if rms == 0 {
		return 1, nil
	}
	r := rms / delta
	switch model {
	case HammerstadBekkadal:
		return 1 + 2/math.Pi*math.Atan(1.4*r*r), nil // Hammerstad & Bekkadal 1975
	case Groiss:
		return 1 + math.Exp(-math.Pow(1/(2*r), 1.6)), nil // Groiss et al. 1996
	}
	return 0, fmt.Errorf("qfactor: unknown roughness model %d; use HammerstadBekkadal or Groiss", int(model))
}

// wallImpedance returns the surface impedance (1+j)/(sigma delta) of a
// thick conductor (Pozar sec. 1.7: Zs = (1+j) Rs).
func wallImpedance(f, sigma, muR float64) complex128 {
	rs := SurfaceResistance(f, sigma, muR)
	return complex(rs, rs)
}

// layeredThick is the thickness, in skin depths of the top layer, beyond
// which tanh(gamma t) is 1 to double precision (|tanh(z) - 1| ~ 2 exp(-2 Re
// z) < 1e-17 for Re z > 20); it also keeps cmplx.Tanh from overflowing.
const layeredThick = 20

// layeredImpedance returns the surface impedance of a layer of thickness t
// (m) and conductivity sigma1, permeability mu1, over a thick base metal
// sigma2, mu2, at frequency f, by the transmission-line form
//
//	Zs = Z1 (Z2 + Z1 tanh(gamma1 t)) / (Z1 + Z2 tanh(gamma1 t)),
//	Z_i = (1+j)/(sigma_i delta_i),  gamma1 = (1+j)/delta1
//
// (input impedance of a lossy line of length t terminated in Z2, Pozar,
// Microwave Engineering, 4th ed., sec. 2.7, applied to the plane-wave
// fields in a layered conductor as in Ramo, Whinnery & Van Duzer, 3rd ed.,
// ch. 3). Displacement current in the metals is neglected, as in SkinDepth.
func layeredImpedance(f, sigma1, mu1, t, sigma2, mu2 float64) complex128 {
	z1 := wallImpedance(f, sigma1, mu1)
	z2 := wallImpedance(f, sigma2, mu2)
	d1 := SkinDepth(f, sigma1, mu1)
	if t/d1 > layeredThick {
		return z1
	}
	th := cmplx.Tanh(complex(t/d1, t/d1))   // gamma1 t = (1+j) t/delta1
	return z1 * (z2 + z1*th) / (z1 + z2*th) // Pozar sec. 2.7 (lossy line input impedance)
}

// BCS holds the parameters of the common approximation to the BCS surface
// resistance of a superconductor,
//
//	Rs(T, f) = A (f/fref)^2 exp(-Delta/(k_B T)) / T + Rres
//
// (Padamsee, Knobloch & Hays, RF Superconductivity for Accelerators, 2nd ed.
// 2008, ch. 5, for niobium; recalled from memory). It holds for T < Tc/2 and
// f far below the gap frequency 2 Delta/h; Resistance returns an error
// outside (we take f <= (2 Delta/h)/10).
type BCS struct {
	Tc           float64 // critical temperature, K
	Gap          float64 // Delta/k_B, K
	A            float64 // prefactor, ohm K, at RefFrequency
	RefFrequency float64 // fref, Hz
	Residual     float64 // residual resistance Rres, ohm
}

// NiobiumBCS returns the BCS parameters commonly used for clean bulk niobium
// (Padamsee, Knobloch & Hays 2008, ch. 5, recalled from memory): Tc =
// 9.25 K, Delta/k_B = 17.67 K (Delta/(k_B Tc) = 1.91), A = 2e-4 ohm K at
// fref = 1.5 GHz, and a residual resistance of 10 nohm, a typical value for
// a well-prepared cavity (common practice; measured values range from about
// 1 to 30 nohm, so set Residual to your own). Rs at 2 K and 1.3 GHz is then
// about 11 nohm (BCS part) + 10 nohm.
func NiobiumBCS() BCS {
	return BCS{Tc: 9.25, Gap: 17.67, A: 2e-4, RefFrequency: 1.5e9, Residual: 10e-9}
}

// GapFrequency returns 2 Delta/h in Hz, the frequency at which photons
// break Cooper pairs (about 740 GHz for niobium).
func (b BCS) GapFrequency() float64 {
	return 2 * b.Gap * physics.Boltzmann / physics.Planck
}

// Resistance returns the surface resistance, BCS part plus residual, in ohm,
// at temperature t (K) and frequency f (Hz). It returns an error when the
// parameters are not finite and positive (Residual may be zero), when t is
// not in (0, Tc/2], or when f is not in (0, GapFrequency/10].
func (b BCS) Resistance(t, f float64) (float64, error) {
	bcs, res, err := b.ResistanceParts(t, f)
	return bcs + res, err
}

// ResistanceParts returns the two parts of Resistance separately: the BCS
// part A (f/fref)^2 exp(-Delta/(k_B T))/T, which falls steeply as the wall
// is cooled, and the residual resistance, which does not. Errors are those
// of Resistance.
func (b BCS) ResistanceParts(t, f float64) (bcs, residual float64, err error) {
	for _, p := range []struct {
		name string
		v    float64
	}{{"Tc", b.Tc}, {"gap", b.Gap}, {"A", b.A}, {"reference frequency", b.RefFrequency}} {
		if !(p.v > 0) || math.IsInf(p.v, 0) {
			return 0, 0, fmt.Errorf("qfactor: BCS %s must be finite and > 0, got %g", p.name, p.v)
		}
	}
	if !(b.Residual >= 0) || math.IsInf(b.Residual, 0) {
		return 0, 0, fmt.Errorf("qfactor: residual resistance must be finite and >= 0 ohm, got %g ohm", b.Residual)
	}
	if !(t > 0 && t <= b.Tc/2) {
		return 0, 0, fmt.Errorf("qfactor: the BCS approximation needs 0 < T <= Tc/2 = %g K, got %g K", b.Tc/2, t)
	}
	if fmax := b.GapFrequency() / 10; !(f > 0 && f <= fmax) {
		return 0, 0, fmt.Errorf("qfactor: the BCS approximation needs 0 < f <= %s (a tenth of the gap frequency), got %s",
			physics.FormatFrequency(fmax, 4), physics.FormatFrequency(f, 4))
	}
	r := f / b.RefFrequency
	return b.A * r * r * math.Exp(-b.Gap/t) / t, b.Residual, nil // Padamsee et al. 2008, ch. 5
}

// MeanFreePath returns the free-electron (Drude-Sommerfeld) estimate of the
// conduction-electron mean free path, in metres,
//
//	l = sigma hbar k_F / (n e^2),  k_F = (3 pi^2 n)^(1/3),
//
// for conductivity sigma (S/m) and conduction-electron density n (m^-3)
// (Ashcroft & Mermin, Solid State Physics, 1976, ch. 1-2, eqs. (1.6) and
// (2.21) as recalled from memory: sigma = n e^2 tau/m, v_F = hbar k_F/m).
// For copper at 20 C it gives about 38 nm. Accuracy: a free-electron
// estimate, good to a few tens of percent for the noble metals and
// aluminium.
func MeanFreePath(sigma, n float64) float64 {
	hbar := physics.Planck / (2 * math.Pi)
	e := physics.ElementaryCharge
	kF := math.Cbrt(3 * math.Pi * math.Pi * n)
	return sigma * hbar * kF / (n * e * e)
}

// AnomalyParameter returns the anomalous-skin-effect parameter of Reuter and
// Sondheimer,
//
//	alpha = (3/2) (l/delta)^2 = (3/4) omega mu0 sigma l^2,
//
// for mean free path l and classical skin depth delta (G. E. H. Reuter and
// E. H. Sondheimer, Proc. R. Soc. Lond. A 195, 336 (1948); A. B. Pippard,
// Proc. R. Soc. Lond. A 191, 385 (1947)). The classical skin effect holds
// for alpha << 1; for alpha >~ 1 the true Rs exceeds the classical one, and
// in the extreme anomalous limit it varies as sigma^(-1/3) instead of
// sigma^(-1/2).
func AnomalyParameter(l, delta float64) float64 {
	r := l / delta
	return 1.5 * r * r // Reuter & Sondheimer 1948
}

// AnomalyThreshold is the anomaly parameter above which Surface warns that
// the classical Rs is too low. 0.1 (l about delta/4) is our conservative
// choice, not a published criterion: there the anomalous Rs departs from the
// classical one by a few percent (Reuter & Sondheimer 1948, figures, as
// recalled from memory).
const AnomalyThreshold = 0.1

// Plating is a metal layer of given thickness over the base conductor of a
// Surface.
type Plating struct {
	Metal     physics.Conductor
	Thickness float64 // m, >= 0
}

// Surface is one wall surface: a conductor at a temperature, possibly rough,
// possibly plated, or a superconductor. The zero value of each optional field
// is its documented default.
type Surface struct {
	// Conductor is the wall metal (the base metal under a plating).
	Conductor physics.Conductor
	// Temperature is the wall temperature in kelvin; zero means 20 C. For a
	// normal metal it must lie in the conductor's linear-model range
	// (default -50 C..+200 C) unless it is 20 C; for a superconductor it
	// must be in (0, Tc/2].
	Temperature float64
	// Roughness is the RMS surface roughness in metres; zero means smooth.
	// It applies to the top metal (the plating when plated).
	Roughness float64
	// RoughnessModel selects the correction; the zero value is
	// HammerstadBekkadal.
	RoughnessModel RoughnessModel
	// Plating, when not nil, is a layer over Conductor.
	Plating *Plating
	// Superconductor, when not nil, makes the surface superconducting: Rs
	// comes from the BCS approximation and Conductor serves only as a label.
	// It cannot be combined with Plating.
	Superconductor *BCS
}

// temperature returns the wall temperature with the zero default applied.
func (s Surface) temperature() float64 {
	if s.Temperature == 0 {
		return roomTemperature
	}
	return s.Temperature
}

// checkFrequency rejects frequencies that are not finite and > 0.
func checkFrequency(f float64) error {
	if !(f > 0) || math.IsInf(f, 0) {
		return fmt.Errorf("qfactor: frequency must be finite and > 0 Hz, got %g Hz", f)
	}
	return nil
}

// top returns the exposed metal and its conductivity at the wall
// temperature.
func (s Surface) top() (physics.Conductor, float64, error) {
	c := s.Conductor
	if s.Plating != nil {
		c = s.Plating.Metal
	}
	if m := c.Mu(); !(m > 0) || math.IsInf(m, 0) {
		return c, 0, fmt.Errorf("qfactor: conductor %q: mu_r must be finite and > 0, got %g", c.Name, m)
	}
	sigma, err := Conductivity(c, s.temperature())
	return c, sigma, err
}

// SkinDepth returns the classical skin depth of the exposed metal (the
// plating when plated) at the wall temperature and frequency f (Hz). It
// returns an error for a superconducting surface, where the skin depth is
// not defined, and for invalid inputs as Resistance does.
func (s Surface) SkinDepth(f float64) (float64, error) {
	if err := checkFrequency(f); err != nil {
		return 0, err
	}
	if s.Superconductor != nil {
		return 0, fmt.Errorf("qfactor: skin depth is not defined for a superconducting surface")
	}
	c, sigma, err := s.top()
	if err != nil {
		return 0, err
	}
	return SkinDepth(f, sigma, c.Mu()), nil
}

// SuperconductingParts returns, for a superconducting surface, the BCS
// part and the residual part of its Rs at frequency f (Hz) and the wall
// temperature (see BCS.ResistanceParts); they add up to Resistance. It
// returns an error for a normal-metal surface and for inputs Resistance
// refuses.
func (s Surface) SuperconductingParts(f float64) (bcs, residual float64, err error) {
	if s.Superconductor == nil {
		return 0, 0, fmt.Errorf("qfactor: surface %q is not superconducting", s.Conductor.Name)
	}
	if err := checkFrequency(f); err != nil {
		return 0, 0, err
	}
	return s.Superconductor.ResistanceParts(s.temperature(), f)
}

// Resistance returns the surface resistance Rs in ohm at frequency f (Hz),
// with warnings for people where the model is doubtful.
//
// For a normal metal: the conductivity at the wall temperature (Conductivity),
// the classical Rs (SurfaceResistance) or, when plated, the real part of the
// layered surface impedance, times the roughness factor of the exposed metal
// (RoughnessFactor; for a plated wall this treats the roughness as that of the
// plating's surface, an approximation). Warnings are returned when the
// anomalous skin effect makes the classical model wrong (AnomalyParameter
// above AnomalyThreshold; the mean free path comes from MeanFreePath with
// the conductor's electron density, or copper's where unknown), and when a
// ferromagnetic metal carries the current.
//
// For a superconductor: BCS.Resistance at the wall temperature; roughness is
// not applied (a warning says so).
//
// Errors: f not finite and > 0; invalid conductor values; a temperature
// outside the model's range; a negative or non-finite plating thickness or
// roughness; plating combined with a superconductor.
func (s Surface) Resistance(f float64) (rs float64, warnings []string, err error) {
	if err := checkFrequency(f); err != nil {
		return 0, nil, err
	}
	if !(s.Roughness >= 0) || math.IsInf(s.Roughness, 0) {
		return 0, nil, fmt.Errorf("qfactor: RMS roughness must be finite and >= 0 m, got %g m", s.Roughness)
	}
	if s.Superconductor != nil {
		if s.Plating != nil {
			return 0, nil, fmt.Errorf("qfactor: a plated superconducting surface is not modelled; for bulk or thick-film niobium leave Plating nil")
		}
		rs, err := s.Superconductor.Resistance(s.temperature(), f)
		if err != nil {
			return 0, nil, err
		}
		if s.Roughness > 0 {
			warnings = append(warnings, "roughness correction not applied to a superconducting surface")
		}
		return rs, warnings, nil
	}
	c, sigma, err := s.top()
	if err != nil {
		return 0, nil, err
	}
	mu := c.Mu()
	delta := SkinDepth(f, sigma, mu)
	if s.Plating != nil {
		t := s.Plating.Thickness
		if !(t >= 0) || math.IsInf(t, 0) {
			return 0, nil, fmt.Errorf("qfactor: plating thickness must be finite and >= 0 m, got %g m", t)
		}
		base := s.Conductor
		if m := base.Mu(); !(m > 0) || math.IsInf(m, 0) {
			return 0, nil, fmt.Errorf("qfactor: conductor %q: mu_r must be finite and > 0, got %g", base.Name, m)
		}
		sigmaBase, err := Conductivity(base, s.temperature())
		if err != nil {
			return 0, nil, err
		}
		rs = real(layeredImpedance(f, sigma, mu, t, sigmaBase, base.Mu()))
		// The base carries current when the plating is thinner than a few
		// skin depths (field at the interface exp(-5) = 0.7 %).
		if t < 5*delta {
			warnings = append(warnings, anomalyWarning(base, sigmaBase, f)...)
			if base.Ferromagnetic {
				warnings = append(warnings, fmt.Sprintf("base metal %s under a %s plating of %.2g skin depths: %s", base.Name, c.Name, t/delta, base.Note))
			}
		}
	} else {
		rs = SurfaceResistance(f, sigma, mu)
	}
	if s.Roughness > 0 {
		k, err := RoughnessFactor(s.RoughnessModel, s.Roughness, delta)
		if err != nil {
			return 0, nil, err
		}
		rs *= k
	}
	warnings = append(anomalyWarning(c, sigma, f), warnings...)
	if c.Ferromagnetic {
		warnings = append([]string{fmt.Sprintf("%s: %s", c.Name, c.Note)}, warnings...)
	}
	return rs, warnings, nil
}

// copperElectronDensity is used for the mean free path of metals whose
// electron density is unknown (Ashcroft & Mermin 1976, Table 1.1, recalled
// from memory).
const copperElectronDensity = 8.47e28

// anomalyWarning returns a warning when the classical skin effect fails for
// metal c with conductivity sigma at frequency f, or nil.
func anomalyWarning(c physics.Conductor, sigma, f float64) []string {
	n, assumed := c.ElectronDensity, ""
	if !(n > 0) {
		n, assumed = copperElectronDensity, ", estimated with copper's electron density"
	}
	l := MeanFreePath(sigma, n)
	delta := SkinDepth(f, sigma, c.Mu())
	a := AnomalyParameter(l, delta)
	if !(a > AnomalyThreshold) {
		return nil
	}
	name := c.Name
	if name == "" {
		name = "user"
	}
	return []string{fmt.Sprintf("anomalous skin effect in %s: electron mean free path %s vs skin depth %s (Reuter-Sondheimer alpha = %.3g > %g%s); the classical Rs is too low and Q too high",
		name, physics.FormatLength(l, 3), physics.FormatLength(delta, 3), a, AnomalyThreshold, assumed)}
}
