package qfactor

import (
	"fmt"
	"math"
)

// This file holds the operating figures of a superconducting accelerating
// cavity: the unloaded Q split into its BCS and residual parts, the RF power
// dissipated at an accelerating gradient, the heat load it puts on the
// helium bath with the refrigerator power it costs, and the margins of the
// peak surface fields against the niobium limits.

// SuperconductingQ is the unloaded Q of a mode split by the origin of the
// surface resistance: 1/Q0 = 1/QBCS + 1/QResidual + 1/QNormal + 1/QFill.
type SuperconductingQ struct {
	// RsBCS and RsResidual are the BCS and residual parts of each wall
	// part's Rs, ohm; zero on a normal-metal part.
	RsBCS, RsResidual SurfaceResistances
	// RsNormal is the Rs of each normal-metal part, ohm; zero on a
	// superconducting part.
	RsNormal SurfaceResistances
	// QBCS, QResidual and QNormal are the partial Qs of the three kinds of
	// wall loss (+Inf where there is none); QFill that of the fill and Q0
	// the total, as in Unloaded.
	QBCS, QResidual, QNormal, QFill, Q0 float64
}

// SplitSuperconducting splits the unloaded Q u of a mode, computed with
// the walls w (UnloadedQ with w.At), into its BCS, residual and normal-metal
// parts. The partial Qs use u's geometry factors,
//
//	1/Q_X = sum over parts Rs_X,part / G_part,
//
// the same sum UnloadedQ makes (Padamsee, Knobloch & Hays, RF
// Superconductivity for Accelerators, 2nd ed. 2008, ch. 1: Q0 = G/Rs; the
// split of Rs into R_BCS + R_res is their ch. 5), with the parts of each
// superconducting surface from Surface.SuperconductingParts. An error of the
// surface models is returned.
func SplitSuperconducting(u Unloaded, w WallSet) (SuperconductingQ, error) {
	f := u.Wall.Frequency
	g := [3]float64{u.Wall.Geometry.Side, u.Wall.Geometry.EndA, u.Wall.Geometry.EndB}
	var bcs, res, nrm [3]float64
	for i, p := range Parts() {
		s := w.Surface(p)
		if s.Superconductor != nil {
			b, r, err := s.SuperconductingParts(f)
			if err != nil {
				return SuperconductingQ{}, fmt.Errorf("%s: %w", p, err)
			}
			bcs[i], res[i] = b, r
			continue
		}
		r, _, err := s.Resistance(f)
		if err != nil {
			return SuperconductingQ{}, fmt.Errorf("%s: %w", p, err)
		}
		nrm[i] = r
	}
	sum := func(rs [3]float64) float64 { return rs[0]/g[0] + rs[1]/g[1] + rs[2]/g[2] }
	walls := func(rs [3]float64) SurfaceResistances {
		return SurfaceResistances{Side: rs[0], EndA: rs[1], EndB: rs[2]}
	}
	return SuperconductingQ{
		RsBCS: walls(bcs), RsResidual: walls(res), RsNormal: walls(nrm),
		QBCS: inv(sum(bcs)), QResidual: inv(sum(res)), QNormal: inv(sum(nrm)),
		QFill: u.QFill, Q0: u.Q0,
	}, nil
}

// Dissipation is the RF loss of an accelerating mode held at a gradient.
type Dissipation struct {
	Gradient float64 // accelerating gradient Eacc = V/d, V/m
	Voltage  float64 // accelerating voltage V = Eacc d, V
	Energy   float64 // stored energy U = V^2 / (omega (R/Q)_linac), J
	Power    float64 // wall and fill loss P = V^2 / ((R/Q)_linac Q0), W
}

// Dissipated returns the RF power dissipated in the cavity of a when its
// accelerating gradient is eacc (V/m), with unloaded Q q0:
//
//	V = Eacc d,  U = V^2 / (omega (R/Q)),  P = V^2 / ((R/Q) Q0) = omega U / Q0,
//
// with R/Q in the linac convention, V^2/(omega U) (Accel.ROverQLinac;
// Padamsee, Knobloch & Hays 2008, ch. 1 and 2; Wangler, RF Linear
// Accelerators, 2nd ed. 2008, sec. 2.5). The circuit convention,
// half as large, gives the same power as V^2/(2 (R/Q)_circuit Q0). d is the
// cavity length (Eacc = V/d, Padamsee et al. 2008, ch. 1). Errors: a mode
// with no gain (a.NoGain or R/Q not > 0), eacc or q0 not finite and > 0,
// length not > 0.
func Dissipated(a Accel, length, q0, eacc float64) (Dissipation, error) {
	if !(a.ROverQLinac > 0) || math.IsInf(a.ROverQLinac, 0) {
		return Dissipation{}, fmt.Errorf("qfactor: %s gives no accelerating voltage at beta = %g; no gradient can be held", a.Mode, a.Speed)
	}
	if !(length > 0) || math.IsInf(length, 0) {
		return Dissipation{}, fmt.Errorf("qfactor: cavity length must be finite and > 0 m, got %g m", length)
	}
	if !(q0 > 0) || math.IsInf(q0, 0) {
		return Dissipation{}, fmt.Errorf("qfactor: unloaded Q must be finite and > 0, got %g", q0)
	}
	if !(eacc > 0) || math.IsInf(eacc, 0) {
		return Dissipation{}, fmt.Errorf("qfactor: accelerating gradient must be finite and > 0 V/m, got %g V/m", eacc)
	}
	v := eacc * length
	omega := 2 * math.Pi * a.Frequency
	return Dissipation{
		Gradient: eacc,
		Voltage:  v,
		Energy:   v * v / (omega * a.ROverQLinac),
		Power:    v * v / (a.ROverQLinac * q0), // Padamsee et al. 2008, ch. 2
	}, nil
}

// RoomTemperature is the temperature at which a refrigerator rejects its
// heat, 300 K, the usual reference of cryogenic efficiencies (common
// practice).
const RoomTemperature = 300.0

// TechnicalEfficiency is the fraction of the Carnot efficiency that a
// large helium refrigerator reaches at 2 K to 4.5 K: about 0.2 to 0.3
// (common practice; Padamsee, Knobloch & Hays 2008, ch. on cryogenics,
// recalled from memory). We take the lower end, 0.2: small plants do worse.
const TechnicalEfficiency = 0.2

// HeatLoad is the load an RF loss puts on the cryogenic plant.
type HeatLoad struct {
	Bath float64 // bath temperature, K
	// Load is the heat deposited in the bath, W (the RF loss; the static
	// load of the cryostat is not included).
	Load float64
	// Carnot is the least room-temperature work per watt removed at the
	// bath, (T_room - T_bath)/T_bath, W/W.
	Carnot float64
	// Specific is the room-temperature power per watt at the bath,
	// Carnot/Efficiency, W/W.
	Specific float64
	// Efficiency is the fraction of the Carnot efficiency assumed.
	Efficiency float64
	// WallPlug is Load times Specific, W.
	WallPlug float64
}

// Refrigeration returns the heat load of load watts deposited at bath
// temperature bath (K) and the room-temperature power that removes it:
//
//	W/Q = (T_room - T_bath) / T_bath / eta
//
// (the Carnot coefficient of performance of a refrigerator, any
// thermodynamics text, e.g. Zemansky & Dittman, Heat and Thermodynamics,
// ch. 7, divided by the technical efficiency eta, a fraction of Carnot;
// the use for SRF heat loads is Padamsee et al. 2008, ch. on cryogenics).
// eta = 0 means TechnicalEfficiency. Errors: bath not in (0, RoomTemperature),
// load < 0 or not finite, eta not in [0, 1].
func Refrigeration(load, bath, eta float64) (HeatLoad, error) {
	if !(bath > 0 && bath < RoomTemperature) {
		return HeatLoad{}, fmt.Errorf("qfactor: bath temperature must be above 0 K and below %g K, got %g K", RoomTemperature, bath)
	}
	if !(load >= 0) || math.IsInf(load, 0) {
		return HeatLoad{}, fmt.Errorf("qfactor: heat load must be finite and >= 0 W, got %g W", load)
	}
	if !(eta >= 0 && eta <= 1) {
		return HeatLoad{}, fmt.Errorf("qfactor: technical efficiency must be between 0 and 1, got %g", eta)
	}
	if eta == 0 {
		eta = TechnicalEfficiency
	}
	carnot := (RoomTemperature - bath) / bath
	h := HeatLoad{Bath: bath, Load: load, Carnot: carnot, Efficiency: eta, Specific: carnot / eta}
	h.WallPlug = load * h.Specific
	return h, nil
}

// FieldLimits are the guide values of the peak surface fields of a
// superconducting niobium cavity: not limits that guarantee or forbid
// operation, but the levels at which the usual trouble starts.
type FieldLimits struct {
	// Quench is the peak surface magnetic flux density at which the
	// niobium is expected to leave the superconducting state, T.
	Quench float64
	// QuenchSource says where Quench comes from.
	QuenchSource string
	// FieldEmission is the peak surface electric field above which field
	// emission usually sets in, V/m.
	FieldEmission float64
	// FieldEmissionSource says where FieldEmission comes from.
	FieldEmissionSource string
}

// Niobium's guide values: the thermodynamic critical field at 0 K and the
// usual field-emission onset of a carefully cleaned surface.
const (
	// NiobiumBc0 is the thermodynamic critical field of pure niobium at
	// 0 K, about 200 mT (Padamsee, Knobloch & Hays 2008, ch. on the
	// critical RF magnetic field, recalled from memory; the superheating
	// field is somewhat higher, about 240 mT, and real cavities often
	// quench lower, near 150 to 180 mT, at defects).
	NiobiumBc0 = 0.200 // T
	// FieldEmissionOnset is the peak surface electric field at which field
	// emission commonly starts in a niobium cavity cleaned by high-pressure
	// water rinsing: about 40 MV/m (common practice; Padamsee et al. 2008,
	// ch. on field emission, recalled from memory). A single particle on the
	// surface can bring the onset far lower.
	FieldEmissionOnset = 40e6 // V/m
)

// NiobiumLimits returns the guide values for niobium walls at temperature
// t (K): the quench guide is the thermodynamic critical field
// Bc(T) = Bc(0) (1 - (T/Tc)^2) (the empirical two-fluid law, Tinkham,
// Introduction to Superconductivity, 2nd ed., sec. 1.1; Bc(0) =
// NiobiumBc0), the field-emission guide FieldEmissionOnset. tc is the
// critical temperature (BCS.Tc). Errors: t not in (0, tc).
func NiobiumLimits(t, tc float64) (FieldLimits, error) {
	if !(tc > 0) || !(t > 0 && t < tc) {
		return FieldLimits{}, fmt.Errorf("qfactor: the critical field needs 0 < T < Tc = %g K, got %g K", tc, t)
	}
	r := t / tc
	return FieldLimits{
		Quench:              NiobiumBc0 * (1 - r*r),
		QuenchSource:        fmt.Sprintf("thermodynamic critical field of niobium, Bc(0) = %g mT scaled by 1 − (T/Tc)² (Padamsee, Knobloch & Hays 2008; Tinkham 1996, sec. 1.1; recalled from memory)", NiobiumBc0*1e3),
		FieldEmission:       FieldEmissionOnset,
		FieldEmissionSource: "usual onset of field emission after high-pressure water rinsing (common practice; Padamsee, Knobloch & Hays 2008, recalled from memory)",
	}, nil
}

// Margins are the peak surface fields at a gradient and their margins to
// the guide values (guide over peak: above 1 is below the guide).
type Margins struct {
	Epk, Bpk             float64 // peak surface fields, V/m and T
	EMargin, BMargin     float64 // FieldEmission/Epk and Quench/Bpk
	Limits               FieldLimits
	AboveQuench, Emitted bool // Bpk >= Quench, Epk >= FieldEmission
}

// QuenchWords and EmissionWords state Bpk and Epk against their guides in
// words, from the verdicts AboveQuench and Emitted: "1.23x below" under
// the guide, "AT OR ABOVE (2.5x)" on or over it, so that no output reads
// "0.07x below" for a field far above its guide. Every command and the
// datasheet print these.
func (m Margins) QuenchWords() string { return marginWords(m.BMargin, m.AboveQuench) }

// EmissionWords: see QuenchWords.
func (m Margins) EmissionWords() string { return marginWords(m.EMargin, m.Emitted) }

func marginWords(margin float64, above bool) string {
	if above {
		return fmt.Sprintf("AT OR ABOVE (%.3gx)", 1/margin)
	}
	return fmt.Sprintf("%.2fx below", margin)
}

// FieldMargins returns the peak surface fields of the mode of a at
// gradient eacc (V/m), Epk = (Epk/Eacc) Eacc and Bpk = (Bpk/Eacc) Eacc
// (Padamsee et al. 2008, ch. 1), and their margins to the limits l.
// Errors: a mode with no gain, eacc not finite and > 0.
func FieldMargins(a Accel, eacc float64, l FieldLimits) (Margins, error) {
	if !(eacc > 0) || math.IsInf(eacc, 0) {
		return Margins{}, fmt.Errorf("qfactor: accelerating gradient must be finite and > 0 V/m, got %g V/m", eacc)
	}
	if math.IsInf(a.EpkOverEacc, 0) || math.IsInf(a.BpkOverEacc, 0) || math.IsNaN(a.EpkOverEacc+a.BpkOverEacc) {
		return Margins{}, fmt.Errorf("qfactor: %s gives no accelerating voltage at beta = %g; the peak fields per gradient are not defined", a.Mode, a.Speed)
	}
	m := Margins{Epk: a.EpkOverEacc * eacc, Bpk: a.BpkOverEacc * eacc, Limits: l}
	m.EMargin, m.BMargin = l.FieldEmission/m.Epk, l.Quench/m.Bpk
	m.AboveQuench, m.Emitted = m.Bpk >= l.Quench, m.Epk >= l.FieldEmission
	return m, nil
}
