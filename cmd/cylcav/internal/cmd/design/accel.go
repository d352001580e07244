package design

import (
	"fmt"
	"io"
	"math"
	"strconv"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/design"
	"cylcav/physics"
	"cylcav/qfactor"
)

// SplitOut is the JSON form of the superconducting Q0 split.
type SplitOut struct {
	RsBCSOhm      float64  `json:"rs_bcs_side_ohm"`
	RsResidualOhm float64  `json:"rs_residual_side_ohm"`
	QBCS          float64  `json:"q_bcs"`
	QResidual     float64  `json:"q_residual"`
	QNormal       *float64 `json:"q_normal"`
}

// BenchOut is the JSON form of the bench figures.
type BenchOut struct {
	OperatingTempK float64 `json:"operating_temp_k"`
	MachiningTempK float64 `json:"machining_temp_k"`
	ColdHz         float64 `json:"f_cold_vacuum_hz"`
	WarmVacuumHz   float64 `json:"f_warm_vacuum_hz"`
	WarmAirHz      float64 `json:"f_warm_air_hz"`
	AirEps         float64 `json:"air_eps_r"`
}

// FillingOut is the JSON form of the filling factors of a storage bulb.
type FillingOut struct {
	BulbDiameterM float64 `json:"bulb_diameter_m"`
	BulbLengthM   float64 `json:"bulb_length_m"`
	MagneticZ     float64 `json:"magnetic_z_fraction"`
	Magnetic      float64 `json:"magnetic_fraction"`
	Electric      float64 `json:"electric_fraction"`
	Maser         float64 `json:"maser_filling_factor"`
}

func fillingJSON(f *cavity.Filling) *FillingOut {
	if f == nil {
		return nil
	}
	return &FillingOut{BulbDiameterM: 2 * f.Bulb.Radius, BulbLengthM: f.Bulb.Length, MagneticZ: f.MagneticZ, Magnetic: f.Magnetic, Electric: f.Electric, Maser: f.Maser}
}

// HOMOut is one row of the higher-order-mode table in JSON and CSV.
type HOMOut struct {
	Mode                string   `json:"mode"`
	Kind                string   `json:"kind"`
	FHz                 float64  `json:"f_hz"`
	ROverQOhm           float64  `json:"r_over_q_linac_ohm"`
	TransitTime         *float64 `json:"transit_time"`
	ROverQTransverseOhm *float64 `json:"r_over_q_transverse_ohm"`
	Q0                  float64  `json:"q0"`
	Harmonic            *int     `json:"beam_harmonic"`
	OffsetHz            *float64 `json:"harmonic_offset_hz"`
	NearHarmonic        bool     `json:"near_harmonic"`
	// BeamDrivable is qfactor.HOM.Drivable: near a harmonic, not the
	// operating mode, and with R/Q or transverse R/Q (the table's NEAR).
	BeamDrivable bool `json:"beam_drivable"`
}

// AccelOut is the JSON form of the accelerator figures.
type AccelOut struct {
	ParticleSpeed      float64 `json:"particle_speed_beta"`
	TransitTime        float64 `json:"transit_time"`
	ROverQLinacOhm     float64 `json:"r_over_q_linac_ohm"`
	ROverQCircuitOhm   float64 `json:"r_over_q_circuit_ohm"`
	GOhm               float64 `json:"g_ohm"`
	EpkOverEacc        float64 `json:"epk_over_eacc"`
	BpkOverEaccTPerVpm float64 `json:"bpk_over_eacc_t_per_v_per_m"`

	GradientVPerM  *float64 `json:"gradient_v_per_m,omitempty"`
	VoltageV       *float64 `json:"voltage_v,omitempty"`
	StoredEnergyJ  *float64 `json:"stored_energy_j,omitempty"`
	DissipatedW    *float64 `json:"dissipated_w,omitempty"`
	BathK          *float64 `json:"bath_k,omitempty"`
	WallPlugW      *float64 `json:"wall_plug_w,omitempty"`
	SpecificWPerW  *float64 `json:"specific_power_w_per_w,omitempty"`
	TechnicalEff   *float64 `json:"technical_efficiency,omitempty"`
	EpkVPerM       *float64 `json:"epk_v_per_m,omitempty"`
	BpkT           *float64 `json:"bpk_t,omitempty"`
	QuenchGuideT   *float64 `json:"quench_guide_t,omitempty"`
	EmissionGuideV *float64 `json:"field_emission_guide_v_per_m,omitempty"`

	Coupling *CouplingOut `json:"beam_coupling,omitempty"`
	HOMs     []HOMOut     `json:"hom,omitempty"`
	Notes    []string     `json:"notes"`
}

// CouplingOut is the JSON form of the matched beam coupling.
type CouplingOut struct {
	CurrentA          float64 `json:"beam_current_a"`
	PhaseRad          float64 `json:"sync_phase_rad"`
	PBeamW            float64 `json:"p_beam_w"`
	PCavityW          float64 `json:"p_cavity_w"`
	Beta              float64 `json:"coupling_beta"`
	QExt              float64 `json:"q_ext"`
	QLoaded           float64 `json:"q_loaded"`
	BandwidthHz       float64 `json:"bandwidth_hz"`
	DetuningHz        float64 `json:"detuning_hz"`
	ForwardDetunedW   float64 `json:"forward_detuned_w"`
	ForwardTunedW     float64 `json:"forward_tuned_w"`
	ReflectedTunedW   float64 `json:"reflected_tuned_w"`
	ForwardBeamOffW   float64 `json:"forward_beam_off_w"`
	ReflectedBeamOffW float64 `json:"reflected_beam_off_w"`
	TripReflectedW    float64 `json:"trip_reflected_w"`
	TripVoltageV      float64 `json:"trip_voltage_v"`
}

func ptr(v float64) *float64 { return &v }

func finite(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}

// HOMRows returns the JSON/CSV rows of a higher-order-mode table of a
// design operating in mode operating.
func HOMRows(hs []qfactor.HOM, bunch float64, operating cavity.Mode) []HOMOut {
	out := make([]HOMOut, len(hs))
	for i, h := range hs {
		o := HOMOut{Mode: h.Mode.String(), Kind: h.Kind.String(), FHz: h.Frequency, ROverQOhm: h.ROverQ,
			TransitTime: finite(h.TransitTime), ROverQTransverseOhm: finite(h.ROverQTransverse), Q0: h.Q0, NearHarmonic: h.Near,
			BeamDrivable: h.Drivable(operating)}
		if bunch > 0 {
			k := h.Harmonic
			o.Harmonic, o.OffsetHz = &k, ptr(h.Offset)
		}
		out[i] = o
	}
	return out
}

func splitJSON(s *qfactor.SuperconductingQ) *SplitOut {
	if s == nil {
		return nil
	}
	return &SplitOut{RsBCSOhm: s.RsBCS.Side, RsResidualOhm: s.RsResidual.Side, QBCS: s.QBCS, QResidual: s.QResidual, QNormal: finite(s.QNormal)}
}

func benchJSON(b *design.Bench) *BenchOut {
	if b == nil {
		return nil
	}
	return &BenchOut{OperatingTempK: b.Operate, MachiningTempK: b.Machine, ColdHz: b.Cold, WarmVacuumHz: b.WarmVacuum, WarmAirHz: b.WarmAir, AirEps: b.Air.Medium.Eps()}
}

func accelJSON(r design.Result) *AccelOut {
	a := r.Accel
	if a == nil {
		return nil
	}
	f := a.Figures
	o := &AccelOut{ParticleSpeed: f.Speed, TransitTime: f.TransitTime, ROverQLinacOhm: f.ROverQLinac, ROverQCircuitOhm: f.ROverQCircuit,
		GOhm: f.G, EpkOverEacc: f.EpkOverEacc, BpkOverEaccTPerVpm: f.BpkOverEacc, Notes: a.Notes}
	if d := a.Dissipation; d != nil {
		o.GradientVPerM, o.VoltageV, o.StoredEnergyJ, o.DissipatedW = ptr(d.Gradient), ptr(d.Voltage), ptr(d.Energy), ptr(d.Power)
	}
	if h := a.Heat; h != nil {
		o.BathK, o.WallPlugW, o.SpecificWPerW, o.TechnicalEff = ptr(h.Bath), ptr(h.WallPlug), ptr(h.Specific), ptr(h.Efficiency)
	}
	if m := a.Margins; m != nil {
		o.EpkVPerM, o.BpkT, o.QuenchGuideT, o.EmissionGuideV = ptr(m.Epk), ptr(m.Bpk), ptr(m.Limits.Quench), ptr(m.Limits.FieldEmission)
	}
	if k := a.Coupling; k != nil {
		b := r.Scenario.Accel.Beam
		o.Coupling = &CouplingOut{CurrentA: b.Current, PhaseRad: b.Phase, PBeamW: k.PBeam, PCavityW: k.PCavity, Beta: k.Beta, QExt: k.QExt, QLoaded: k.QLoaded,
			BandwidthHz: k.Bandwidth, DetuningHz: k.Detuning, ForwardDetunedW: k.ForwardDetuned, ForwardTunedW: k.ForwardTuned, ReflectedTunedW: k.ReflectedTuned,
			ForwardBeamOffW: k.ForwardBeamOff, ReflectedBeamOffW: k.ReflectedBeamOff, TripReflectedW: k.TripReflected, TripVoltageV: k.TripVoltage}
	}
	if a.HOMs != nil {
		o.HOMs = HOMRows(a.HOMs, r.Scenario.Accel.Bunch, r.Design.Spec.Mode)
	}
	return o
}

// writeHOMCSV writes the higher-order-mode table as CSV, each number in
// the shortest form that reads back exactly.
func writeHOMCSV(w io.Writer, hs []qfactor.HOM, bunch float64, operating cavity.Mode) error {
	g := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
	opt := func(v *float64) string {
		if v == nil {
			return ""
		}
		return g(*v)
	}
	var rows [][]string
	for _, h := range HOMRows(hs, bunch, operating) {
		harm, off := "", ""
		if h.Harmonic != nil {
			harm, off = fmt.Sprint(*h.Harmonic), g(*h.OffsetHz)
		}
		rows = append(rows, []string{h.Mode, h.Kind, g(h.FHz), g(h.ROverQOhm), opt(h.TransitTime), opt(h.ROverQTransverseOhm), g(h.Q0), harm, off, fmt.Sprint(h.NearHarmonic), fmt.Sprint(h.BeamDrivable)})
	}
	return cmdutil.WriteCSV(w, []string{"mode", "kind", "f_hz", "r_over_q_linac_ohm", "transit_time", "r_over_q_transverse_ohm", "q0", "beam_harmonic", "harmonic_offset_hz", "near_harmonic", "beam_drivable"}, rows)
}

func mw(v float64) string { return physics.FormatSI(v, "W", 4) }

// writeAccelTable prints the superconducting, bench and accelerator
// figures for people.
func writeAccelTable(w io.Writer, r design.Result) {
	if s := r.Split; s != nil {
		fmt.Fprintf(w, "  superconducting split (BCS model, Padamsee et al. 2008): Rs = %s (BCS) + %s (residual) on every part;\n    Q_BCS = %.4g, Q_residual = %.4g", physics.FormatSI(s.RsBCS.Side, "ohm", 4), physics.FormatSI(s.RsResidual.Side, "ohm", 4), s.QBCS, s.QResidual)
		if !math.IsInf(s.QNormal, 1) {
			fmt.Fprintf(w, ", Q_normal-metal parts = %.4g", s.QNormal)
		}
		fmt.Fprintln(w)
	}
	if b := r.Bench; b != nil {
		fmt.Fprintf(w, "\nOn the bench (machined cavity at %s): %s in vacuum, %s in %s (eps_r = %.6f, Smith-Weintraub refractivity)\n",
			physics.FormatTemperature(b.Machine, 4), physics.FormatFrequency(b.WarmVacuum, 9), physics.FormatFrequency(b.WarmAir, 9), b.Air.Description, b.Air.Medium.Eps())
		fmt.Fprintf(w, "  cold in vacuum at %s: %s (shift warm air to cold vacuum %s)\n",
			physics.FormatTemperature(b.Operate, 4), physics.FormatFrequency(b.Cold, 9), signedF(b.Cold-b.WarmAir))
		fmt.Fprintf(w, "  humid air raises eps_r further (see the air row in 'cylcav materials'); measure dry or correct for humidity\n")
	}
	if fl := r.Filling; fl != nil {
		fmt.Fprintf(w, "\nStorage bulb D = %s, L = %s, centred (fractions of the mode's energy inside it):\n", physics.FormatLength(2*fl.Bulb.Radius, 4), physics.FormatLength(fl.Bulb.Length, 4))
		fmt.Fprintf(w, "  magnetic energy along z %.4f, all magnetic %.4f, electric %.4f; maser filling factor eta' = %.4f (Kleppner et al. 1965)\n", fl.MagneticZ, fl.Magnetic, fl.Electric, fl.Maser)
		fmt.Fprintf(w, "  for a bulb of the fill's own permittivity; dielectric discs along the axis: cylcav stack --bulb-diameter; a quartz bulb wall is not modelled\n")
	}
	a := r.Accel
	if a == nil {
		return
	}
	f := a.Figures
	fmt.Fprintf(w, "\nAccelerator figures of %s at beta = %.4g (closed pillbox):\n", f.Mode, f.Speed)
	fmt.Fprintf(w, "  transit-time factor T = %.4f; R/Q = %.4g ohm (linac, V^2/(omega U)) = 2 x %.4g ohm (circuit); G = %.4g ohm\n", f.TransitTime, f.ROverQLinac, f.ROverQCircuit, f.G)
	fmt.Fprintf(w, "  Epk/Eacc = %.4g; Bpk/Eacc = %.4g mT/(MV/m)\n", f.EpkOverEacc, f.BpkOverEacc*1e9)
	if d := a.Dissipation; d != nil {
		fmt.Fprintf(w, "  at Eacc = %s: V = %s, U = %.4g J, dissipated P = V^2/((R/Q) Q0) = %s\n", physics.FormatSI(d.Gradient, "V/m", 4), physics.FormatSI(d.Voltage, "V", 4), d.Energy, mw(d.Power))
	}
	if h := a.Heat; h != nil {
		fmt.Fprintf(w, "  heat load at the %s bath: %s; refrigerator about %s at room temperature (%.0f W/W: Carnot %.0f W/W at %.0f %% of Carnot, common practice; static load not included)\n",
			physics.FormatTemperature(h.Bath, 4), mw(h.Load), mw(h.WallPlug), h.Specific, h.Carnot, 100*h.Efficiency)
	}
	if m := a.Margins; m != nil {
		fmt.Fprintf(w, "  Bpk = %.4g mT: %s the quench guide %.4g mT (%s)\n", m.Bpk*1e3, m.QuenchWords(), m.Limits.Quench*1e3, m.Limits.QuenchSource)
		fmt.Fprintf(w, "  Epk = %.4g MV/m: %s the field-emission guide %.4g MV/m (%s)\n", m.Epk*1e-6, m.EmissionWords(), m.Limits.FieldEmission*1e-6, m.Limits.FieldEmissionSource)
		fmt.Fprintf(w, "  these guides are not limits: real cavities quench and emit at lower fields\n")
	}
	if k := a.Coupling; k != nil {
		b := r.Scenario.Accel.Beam
		fmt.Fprintf(w, "\nBeam coupling for %s at %.4g deg from crest (matched beam loading):\n", physics.FormatSI(b.Current, "A", 4), b.Phase*180/math.Pi)
		fmt.Fprintf(w, "  beam power %s, cavity loss %s; coupling beta = %.4g, Qext = %.4g, QL = %.4g, loaded bandwidth %s\n",
			mw(k.PBeam), mw(k.PCavity), k.Beta, k.QExt, k.QLoaded, physics.FormatFrequency(k.Bandwidth, 4))
		fmt.Fprintf(w, "  forward power %s with the cavity detuned by %s (nothing reflected); %s on resonance (%s reflected)\n",
			mw(k.ForwardDetuned), physics.FormatFrequency(k.Detuning, 4), mw(k.ForwardTuned), mw(k.ReflectedTuned))
		fmt.Fprintf(w, "  beam off, same gradient, on resonance: forward %s, reflected %s; beam lost at full drive: %s reflected, voltage rises to %s\n",
			mw(k.ForwardBeamOff), mw(k.ReflectedBeamOff), mw(k.TripReflected), physics.FormatSI(k.TripVoltage, "V", 4))
	}
	if a.HOMs != nil {
		bunch := r.Scenario.Accel.Bunch
		fmt.Fprintf(w, "\nMonopole and dipole modes up to %s (R/Q linac at beta = %.4g; transverse R/Q = |dV/dx|^2/(k^2 omega U), ohm):\n", physics.FormatFrequency(r.Scenario.Accel.HOMMax, 4), f.Speed)
		fmt.Fprintf(w, "  %-7s %-8s %16s %11s %7s %13s %11s  %s\n", "mode", "kind", "f", "R/Q", "T", "R/Q_perp", "Q0", "beam harmonic")
		for _, h := range a.HOMs {
			t, rt := "-", "-"
			if !math.IsNaN(h.TransitTime) {
				t = fmt.Sprintf("%.4f", h.TransitTime)
			}
			if !math.IsNaN(h.ROverQTransverse) {
				rt = fmt.Sprintf("%.4g ohm", h.ROverQTransverse)
			}
			harm := ""
			if bunch > 0 {
				harm = fmt.Sprintf("h = %d, %s", h.Harmonic, signedF(h.Offset))
				switch {
				case h.Mode == r.Design.Spec.Mode:
					harm += "  operating mode" // on a harmonic by design
				case h.Drivable(r.Design.Spec.Mode):
					harm += "  NEAR"
				case h.Near:
					// Near in frequency, but with no R/Q the beam cannot
					// drive it (qfactor.HOM.Drivable, the one verdict).
					harm += "  near, R/Q 0"
				}
			}
			fmt.Fprintf(w, "  %-7s %-8s %16s %11s %7s %13s %11.4g  %s\n", h.Mode, h.Kind, physics.FormatFrequency(h.Frequency, 9), fmt.Sprintf("%.4g ohm", h.ROverQ), t, rt, h.Q0, harm)
		}
	}
	for _, n := range a.Notes {
		fmt.Fprintf(w, "  note: %s\n", n)
	}
}
