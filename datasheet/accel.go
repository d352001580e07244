package datasheet

import (
	"fmt"
	"math"

	"cylcav/design"
	"cylcav/physics"
)

// This file arranges the superconducting, bench and accelerator figures of
// a design (design.Result.Split, Bench and Accel) into the datasheet's
// section "Operating figures".

func watts(v float64) string { return physics.FormatSI(v, "W", 4) }

// accelSection returns the tables and notes of the accelerator section of
// result r; none when r has no superconducting, bench or accelerator
// figures.
func accelSection(r design.Result) ([]Table, []string) {
	var tables []Table
	var notes []string
	if s := r.Split; s != nil {
		t := Table{Caption: "Superconducting surface resistance and Q0 (BCS approximation with a residual resistance; Padamsee, Knobloch & Hays 2008)",
			Header: []string{"Part", "Surface resistance", "Partial Q"}, Num: []bool{false, true, true}}
		t.add(false, "BCS part (falls steeply on cooling)", ohm(s.RsBCS.Side), qSci(s.QBCS))
		t.add(false, "Residual part (does not)", ohm(s.RsResidual.Side), qSci(s.QResidual))
		if !math.IsInf(s.QNormal, 1) {
			t.add(false, "Normal-metal parts", ohm(s.RsNormal.Side), qSci(s.QNormal))
		}
		t.add(true, "Unloaded Q0", ohm(s.RsBCS.Side+s.RsResidual.Side), qSci(s.Q0))
		tables = append(tables, t)
	}
	if b := r.Bench; b != nil {
		t := Table{Caption: "On the bench: the machined cavity at " + temp(b.Machine) + " and cold in vacuum at " + temp(b.Operate),
			Header: []string{"Quantity", "Value", "Note"}}
		t.add(false, "Diameter to machine", length(b.Machined.Diameter()), "at "+temp(b.Machine))
		t.add(false, "Length to machine", length(b.Machined.Length), "at "+temp(b.Machine))
		t.add(true, "Frequency on the bench, in air", freq(b.WarmAir), fmt.Sprintf("dry air, εr = %.6f (Smith-Weintraub refractivity); humidity raises εr", b.Air.Medium.Eps()))
		t.add(false, "Frequency warm, in vacuum", freq(b.WarmVacuum), "thermal contraction from the published cryogenic data of the wall metal")
		t.add(true, "Frequency cold, in vacuum (design)", freq(b.Cold), "at "+temp(b.Operate))
		t.add(false, "Shift from the bench to operation", signedFreq(b.Cold-b.WarmAir), "")
		tables = append(tables, t)
	}
	if fl := r.Filling; fl != nil {
		t := Table{Caption: fmt.Sprintf("Storage bulb D = %s, L = %s on the axis, centred: fractions of the %v mode's energy inside it", length(2*fl.Bulb.Radius), length(fl.Bulb.Length), fl.Mode),
			Header: []string{"Quantity", "Value", "Note"}, Num: []bool{false, true, false}}
		t.add(true, "Magnetic energy along z", fmt.Sprintf("%.4f", fl.MagneticZ), "∫bulb |Hz|² / ∫cavity |H|²")
		t.add(false, "Magnetic energy, all components", fmt.Sprintf("%.4f", fl.Magnetic), "")
		t.add(false, "Electric energy", fmt.Sprintf("%.4f", fl.Electric), "scales the loss of the bulb wall")
		t.add(true, "Maser filling factor η′", fmt.Sprintf("%.4f", fl.Maser), "(∫bulb Hz dV)² / (V_bulb ∫cavity |H|² dV), Kleppner et al. 1965")
		tables = append(tables, t)
		notes = append(notes, "Filling factors hold for a bulb of the fill's own permittivity; dielectric layers along the axis (discs, plates) are solved by cylcav stack --bulb-diameter; a bulb wall of another permittivity around the axis is not modelled.")
	}
	a := r.Accel
	if a == nil {
		return tables, notes
	}
	f := a.Figures
	fig := Table{Caption: fmt.Sprintf("Accelerator figures of %v for a particle at β = %.4g on the axis (closed pillbox)", f.Mode, f.Speed),
		Header: []string{"Quantity", "Value", "Note"}}
	fig.add(false, "Transit-time factor T", fmt.Sprintf("%.4f", f.TransitTime), "Wangler 2008, ch. 2")
	fig.add(true, "R/Q (linac convention)", ohm(f.ROverQLinac), "V²/(ωU); the circuit convention V²/(2ωU) is half: "+ohm(f.ROverQCircuit))
	fig.add(false, "Geometry factor G", ohm(f.G), "Q0 = G/Rs for uniform walls")
	fig.add(false, "Epk/Eacc", fmt.Sprintf("%.4g", f.EpkOverEacc), "Eacc = V/L")
	fig.add(false, "Bpk/Eacc", fmt.Sprintf("%.4g mT/(MV/m)", f.BpkOverEacc*1e9), "")
	if d := a.Dissipation; d != nil {
		fig.add(false, "Accelerating gradient Eacc", physics.FormatSI(d.Gradient, "V/m", 4), "")
		fig.add(false, "Accelerating voltage V", physics.FormatSI(d.Voltage, "V", 4), "")
		fig.add(false, "Stored energy U", fmt.Sprintf("%.4g J", d.Energy), "")
		fig.add(true, "RF power dissipated", watts(d.Power), "P = V²/((R/Q) Q0), R/Q in the linac convention")
	}
	if h := a.Heat; h != nil {
		fig.add(true, "Heat load at the "+temp(h.Bath)+" bath", watts(h.Load), "RF loss only; the static load of the cryostat comes on top")
		fig.add(false, "Refrigerator power at room temperature", watts(h.WallPlug),
			fmt.Sprintf("%.0f W per W: Carnot %.0f W/W at %.0f %% of Carnot (common practice for large helium plants; small ones do worse)", h.Specific, h.Carnot, 100*h.Efficiency))
	}
	if m := a.Margins; m != nil {
		fig.add(false, "Peak surface magnetic field Bpk", fmt.Sprintf("%.4g mT", m.Bpk*1e3), fmt.Sprintf("%s the quench guide %.4g mT", m.QuenchWords(), m.Limits.Quench*1e3))
		fig.add(false, "Peak surface electric field Epk", fmt.Sprintf("%.4g MV/m", m.Epk*1e-6), fmt.Sprintf("%s the field-emission guide %.4g MV/m", m.EmissionWords(), m.Limits.FieldEmission*1e-6))
		notes = append(notes, "Quench guide: "+m.Limits.QuenchSource+". Field-emission guide: "+m.Limits.FieldEmissionSource+". Both are guides, not limits: real cavities quench at defects and emit from particles at lower fields.")
	}
	tables = append(tables, fig)
	if k := a.Coupling; k != nil {
		b := r.Scenario.Accel.Beam
		t := Table{Caption: fmt.Sprintf("Input coupling matched to a %s beam at %.4g° from the crest (Padamsee, Knobloch & Hays 2008; Wangler 2008)", physics.FormatSI(b.Current, "A", 4), b.Phase*180/math.Pi),
			Header: []string{"Quantity", "Value", "Note"}}
		t.add(false, "Beam power", watts(k.PBeam), "V I cos φs")
		t.add(true, "Coupling β", fmt.Sprintf("%.4g", k.Beta), "1 + P_beam/P_cavity")
		t.add(true, "External Q", qSci(k.QExt), "Q0/β")
		t.add(false, "Loaded Q", qSci(k.QLoaded), "Q0/(1 + β)")
		t.add(false, "Loaded bandwidth", physics.FormatFrequency(k.Bandwidth, 4), "f/QL, full width at half power")
		t.add(true, "Forward power, detuned", watts(k.ForwardDetuned), "detuned by "+physics.FormatFrequency(k.Detuning, 4)+" to cancel the reactive beam loading; nothing reflected")
		t.add(false, "Forward power, on resonance", watts(k.ForwardTuned), watts(k.ReflectedTuned)+" reflected")
		t.add(false, "Beam off, same gradient, on resonance", watts(k.ForwardBeamOff)+" forward", watts(k.ReflectedBeamOff)+" reflected")
		t.add(false, "Beam lost at full drive", watts(k.TripReflected)+" reflected", "the voltage rises to "+physics.FormatSI(k.TripVoltage, "V", 4))
		tables = append(tables, t)
	}
	if a.HOMs != nil {
		bunch := r.Scenario.Accel.Bunch
		head := []string{"Mode", "Kind", "Frequency", "R/Q (linac)", "T", "R/Q⊥", "Q0"}
		num := []bool{false, false, true, true, true, true, true}
		if bunch > 0 {
			head = append(head, "Beam harmonic")
			num = append(num, false)
		}
		t := Table{Caption: fmt.Sprintf("Monopole and dipole modes up to %s (R/Q at β = %.4g; R/Q⊥ = |dV/dx|²/(k²ωU) in Ω, Panofsky-Wenzel)", physics.FormatFrequency(r.Scenario.Accel.HOMMax, 4), f.Speed),
			Header: head, Num: num}
		for _, h := range a.HOMs {
			tt, rt := "–", "–"
			if !math.IsNaN(h.TransitTime) {
				tt = fmt.Sprintf("%.4f", h.TransitTime)
			}
			if !math.IsNaN(h.ROverQTransverse) {
				rt = ohm(h.ROverQTransverse)
			}
			row := []string{h.Mode.String(), h.Kind.String(), freq(h.Frequency), ohm(h.ROverQ), tt, rt, qSci(h.Q0)}
			if bunch > 0 {
				hs := fmt.Sprintf("%d × %s, %s", h.Harmonic, physics.FormatFrequency(bunch, 4), signedFreq(h.Offset))
				switch {
				case h.Mode == r.Design.Spec.Mode:
					hs = "operating mode: " + hs // on a harmonic by design
				case h.Near:
					hs = "NEAR: " + hs
				}
				row = append(row, hs)
			}
			t.add(h.Drivable(r.Design.Spec.Mode), row...)
		}
		tables = append(tables, t)
		if bunch > 0 {
			notes = append(notes, fmt.Sprintf("A mode is marked NEAR when it lies within %.3g %% of a harmonic of the %s bunch frequency (our default window, not a standard). TE modes give no longitudinal voltage and, with E_z = 0, no transverse kick either.", 100*a.HOMWindow, physics.FormatFrequency(bunch, 4)))
		}
	}
	notes = append(notes, a.Notes...)
	return tables, notes
}

// accelFacts returns the key figures of the operating figures for the top
// of the sheet: the bench frequency, the power and heat load at the
// gradient and the external Q.
func accelFacts(r design.Result) []KV {
	var out []KV
	if b := r.Bench; b != nil {
		out = append(out, KV{"On the bench (air, " + temp(b.Machine) + ")", freq(b.WarmAir)})
	}
	if a := r.Accel; a != nil {
		if d := a.Dissipation; d != nil {
			out = append(out, KV{"Dissipated at " + physics.FormatSI(d.Gradient, "V/m", 4), watts(d.Power)})
		}
		if k := a.Coupling; k != nil {
			out = append(out, KV{"External Q (matched)", qSci(k.QExt)})
		}
	}
	return out
}

// qSci formats a large Q in scientific notation.
func qSci(q float64) string {
	if math.IsInf(q, 1) {
		return "∞"
	}
	return minus(fmt.Sprintf("%.4g", q))
}
