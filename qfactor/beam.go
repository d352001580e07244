package qfactor

import (
	"fmt"
	"math"
)

// Beam is a bunched beam crossing an accelerating cavity.
type Beam struct {
	// Current is the average beam current, A (> 0). For bunches short
	// compared with the RF period the RF component of the beam current is
	// twice this.
	Current float64
	// Phase is the synchronous phase in radians, measured from the crest
	// of the accelerating voltage (0 = on crest; proton linacs run at
	// about -30 degrees, i.e. -pi/6). |Phase| < pi/2.
	Phase float64
}

// BeamCoupling is the input coupling of a cavity matched to a beam, with
// the powers a transmitter must deliver.
type BeamCoupling struct {
	Frequency float64 // resonant frequency, Hz
	Voltage   float64 // accelerating voltage V, V
	Q0        float64 // unloaded Q

	// PCavity is the RF loss in the cavity, V^2/((R/Q) Q0), W; PBeam the
	// power given to the beam, V I cos(phi), W.
	PCavity, PBeam float64

	// Beta is the coupling coefficient Q0/Qext that matches the loaded
	// cavity, 1 + PBeam/PCavity; QExt = Q0/Beta, QLoaded = Q0/(1+Beta),
	// Bandwidth = f/QLoaded (full width at half power), Hz.
	Beta, QExt, QLoaded, Bandwidth float64

	// Detuning is the magnitude of the cavity detuning, Hz, that cancels
	// the reactive part of the beam loading (zero on crest); TuningAngle
	// its tuning angle psi, rad, tan psi = 2 QL Detuning / f.
	Detuning, TuningAngle float64

	// ForwardDetuned is the forward power at the optimum coupling with the
	// optimum detuning, PCavity + PBeam, W, with nothing reflected.
	ForwardDetuned float64
	// ForwardTuned and ReflectedTuned are the forward and reflected power
	// at the optimum coupling with the cavity left on resonance, W.
	ForwardTuned, ReflectedTuned float64

	// ForwardBeamOff and ReflectedBeamOff are the forward and reflected
	// power that hold the same voltage with no beam, cavity on
	// resonance, W.
	ForwardBeamOff, ReflectedBeamOff float64
	// TripReflected is the reflected power, W, and TripVoltage the cavity
	// voltage, V, in the steady state after the beam is lost with the
	// forward power and the detuning kept at their beam-on values.
	TripReflected, TripVoltage float64
}

// ForwardPower returns the forward power needed to hold voltage v in a
// cavity with RF loss pc = V^2/((R/Q) Q0) (W), coupling coefficient beta,
// tuning angle psi (rad, |tan psi| = 2 QL |f_cavity - f_rf|/f; its sign is
// that which cancels the reactive beam loading when opposite to phi) and a
// beam of power pb = V I cos(phi) (W) at synchronous phase phi:
//
//	P_f = pc (1+beta)^2/(4 beta) [(1 + b)^2 + (tan psi + b tan phi)^2],
//	b = pb / (pc (1+beta))
//
// (the steady state of the cavity as a parallel resonant circuit driven by
// the generator and the beam current, Padamsee, Knobloch & Hays, RF
// Superconductivity for Accelerators, 2nd ed. 2008, the chapter on the
// input coupler and beam loading; Wangler, RF Linear Accelerators, 2nd ed.
// 2008, the section on beam loading; chapter numbers recalled from memory).
// The reflected power is P_f - pc - pb.
func ForwardPower(pc, pb, beta, psi, phi float64) float64 {
	b := pb / (pc * (1 + beta))
	x := math.Tan(psi) + b*math.Tan(phi)
	return pc * (1 + beta) * (1 + beta) / (4 * beta) * ((1+b)*(1+b) + x*x)
}

// MatchBeam returns the coupling that matches a cavity of accelerating
// voltage v (V), R/Q in the linac convention rq (ohm), unloaded Q q0 and
// resonant frequency f (Hz) to the beam b, and the powers of ForwardPower
// at that coupling:
//
//	beta_opt = 1 + PBeam/PCavity,  Qext = Q0/beta_opt,
//	tan psi_opt = -b tan phi with b = PBeam/(PCavity (1+beta))
//
// (Padamsee, Knobloch & Hays 2008 and Wangler 2008, as in ForwardPower:
// with both chosen the generator sees a matched load and P_f = PCavity +
// PBeam). For PBeam >> PCavity, Qext -> V/((R/Q) I cos phi).
//
// Errors: f, v, rq, q0 not finite and > 0; a current not finite and > 0;
// |phase| >= pi/2 (the beam would not take power).
func MatchBeam(f, v, rq, q0 float64, b Beam) (BeamCoupling, error) {
	for _, p := range []struct {
		name, unit string
		v          float64
	}{{"frequency", "Hz", f}, {"accelerating voltage", "V", v}, {"R/Q", "ohm", rq}, {"unloaded Q", "", q0}, {"beam current", "A", b.Current}} {
		if !(p.v > 0) || math.IsInf(p.v, 0) {
			return BeamCoupling{}, fmt.Errorf("qfactor: %s must be finite and > 0 %s, got %g", p.name, p.unit, p.v)
		}
	}
	if !(math.Abs(b.Phase) < math.Pi/2) {
		return BeamCoupling{}, fmt.Errorf("qfactor: synchronous phase must lie strictly between -90 and +90 degrees from the crest, got %g degrees", b.Phase*180/math.Pi)
	}
	pc := v * v / (rq * q0)
	pb := v * b.Current * math.Cos(b.Phase)
	beta := 1 + pb/pc
	k := BeamCoupling{Frequency: f, Voltage: v, Q0: q0, PCavity: pc, PBeam: pb, Beta: beta}
	k.QExt = q0 / beta
	k.QLoaded = q0 / (1 + beta)
	k.Bandwidth = Bandwidth(f, k.QLoaded)
	bl := pb / (pc * (1 + beta))
	k.TuningAngle = -math.Atan(bl * math.Tan(b.Phase))
	k.Detuning = math.Abs(math.Tan(k.TuningAngle)) * f / (2 * k.QLoaded)
	k.ForwardDetuned = ForwardPower(pc, pb, beta, k.TuningAngle, b.Phase)
	k.ForwardTuned = ForwardPower(pc, pb, beta, 0, b.Phase)
	k.ReflectedTuned = k.ForwardTuned - pc - pb
	k.ForwardBeamOff = ForwardPower(pc, 0, beta, 0, 0)
	k.ReflectedBeamOff = k.ForwardBeamOff - pc
	// After a trip: forward power P held, detuning psi kept, no beam:
	// P = (V'^2/R)(1+beta)^2 (1 + tan^2 psi)/(4 beta), so V' follows.
	t := math.Tan(k.TuningAngle)
	scale := (1 + beta) * (1 + beta) * (1 + t*t) / (4 * beta) // P_f per unit V'^2/R
	pc2 := k.ForwardDetuned / scale
	k.TripVoltage = v * math.Sqrt(pc2/pc)
	k.TripReflected = k.ForwardDetuned - pc2
	return k, nil
}
