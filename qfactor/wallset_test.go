package qfactor_test

import (
	"errors"
	"math"
	"strings"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/qfactor"
)

func lookupMetal(t *testing.T, name string) physics.Conductor {
	t.Helper()
	c, err := physics.LookupConductor(name)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

func TestPartNames(t *testing.T) {
	want := []string{"side wall (r = a)", "end plate A (z = 0)", "end plate B (z = d)"}
	for i, p := range qfactor.Parts() {
		if p.String() != want[i] {
			t.Errorf("Parts()[%d].String() = %q, want %q", i, p.String(), want[i])
		}
	}
}

// TestWallSetValidate checks each rule of WallSet.Validate, and checks the
// verdict by an independent route: a set that Validate accepts must give a
// finite surface resistance on every part from Surface.Resistance (whose
// own input checks are separate code), and for the temperature rules the
// limit is recomputed from the model's published range (the linear model's
// -50 C..+200 C, physics.DefaultLinearTMin..Max; BCS T <= Tc/2).
func TestWallSetValidate(t *testing.T) {
	cu := lookupMetal(t, "copper")
	nb := lookupMetal(t, "niobium")
	ag := lookupMetal(t, "silver")
	bcs := qfactor.NiobiumBCS()
	hiRes := bcs
	hiRes.Residual = 2                                         // ohm, above MaxResidual
	user := physics.Conductor{Name: "user", Conductivity: 1e7} // no alpha
	cold := physics.DefaultLinearTMin - 1
	hot := physics.DefaultLinearTMax + 1
	for _, tc := range []struct {
		name string
		w    qfactor.WallSet
		part qfactor.Part
		set  qfactor.Setting
		want string // "" when valid
	}{
		{"copper at 20 C", qfactor.SameWalls(qfactor.Surface{Conductor: cu}), 0, 0, ""},
		{"copper at the linear model's ends", qfactor.WallSet{
			Side: qfactor.Surface{Conductor: cu, Temperature: physics.DefaultLinearTMin},
			EndA: qfactor.Surface{Conductor: cu, Temperature: physics.DefaultLinearTMax},
			EndB: qfactor.Surface{Conductor: cu}}, 0, 0, ""},
		{"copper below the linear model", qfactor.WallSet{Side: qfactor.Surface{Conductor: cu}, EndA: qfactor.Surface{Conductor: cu}, EndB: qfactor.Surface{Conductor: cu, Temperature: cold}},
			qfactor.EndPlateB, qfactor.SettingTemperature, "linear resistivity model"},
		{"copper above the linear model", qfactor.SameWalls(qfactor.Surface{Conductor: cu, Temperature: hot}),
			qfactor.SideWall, qfactor.SettingTemperature, "linear resistivity model"},
		{"user metal warm, no alpha", qfactor.WallSet{Side: qfactor.Surface{Conductor: cu, Temperature: 330}, EndA: qfactor.Surface{Conductor: user, Temperature: 330}, EndB: qfactor.Surface{Conductor: cu, Temperature: 330}},
			qfactor.EndPlateA, qfactor.SettingTemperature, "temperature coefficient"},
		{"too hot", qfactor.SameWalls(qfactor.Surface{Conductor: cu, Temperature: 2500}), qfactor.SideWall, qfactor.SettingTemperature, "at most 2000 K"},
		{"negative temperature", qfactor.SameWalls(qfactor.Surface{Conductor: cu, Temperature: -1}), qfactor.SideWall, qfactor.SettingTemperature, "above 0 K"},
		{"rough", qfactor.SameWalls(qfactor.Surface{Conductor: cu, Roughness: 2e-3}), qfactor.SideWall, qfactor.SettingRoughness, "roughness"},
		{"NaN roughness", qfactor.SameWalls(qfactor.Surface{Conductor: cu, Roughness: math.NaN()}), qfactor.SideWall, qfactor.SettingRoughness, "roughness"},
		{"silver plating", qfactor.SameWalls(qfactor.Surface{Conductor: cu, Plating: &qfactor.Plating{Metal: ag, Thickness: 5e-6}}), 0, 0, ""},
		{"thick plating", qfactor.SameWalls(qfactor.Surface{Conductor: cu, Plating: &qfactor.Plating{Metal: ag, Thickness: 1}}), qfactor.SideWall, qfactor.SettingPlatingThickness, "plating thickness"},
		{"user plating warm", qfactor.SameWalls(qfactor.Surface{Conductor: cu, Temperature: 330, Plating: &qfactor.Plating{Metal: user, Thickness: 5e-6}}), qfactor.SideWall, qfactor.SettingPlating, "temperature coefficient"},
		{"superconducting niobium at 2 K", qfactor.SameWalls(qfactor.Surface{Conductor: nb, Temperature: 2, Superconductor: &bcs}), 0, 0, ""},
		{"superconducting niobium at Tc/2", qfactor.SameWalls(qfactor.Surface{Conductor: nb, Temperature: bcs.Tc / 2, Superconductor: &bcs}), 0, 0, ""},
		{"superconducting niobium above Tc/2", qfactor.SameWalls(qfactor.Surface{Conductor: nb, Temperature: math.Nextafter(bcs.Tc/2, 10), Superconductor: &bcs}), qfactor.SideWall, qfactor.SettingTemperature, "Tc/2"},
		{"superconducting without temperature", qfactor.SameWalls(qfactor.Surface{Conductor: nb, Superconductor: &bcs}), qfactor.SideWall, qfactor.SettingTemperature, "needs its temperature"},
		{"superconducting copper", qfactor.WallSet{Side: qfactor.Surface{Conductor: nb, Temperature: 2, Superconductor: &bcs}, EndA: qfactor.Surface{Conductor: nb, Temperature: 2, Superconductor: &bcs}, EndB: qfactor.Surface{Conductor: cu, Temperature: 2, Superconductor: &bcs}},
			qfactor.EndPlateB, qfactor.SettingMetal, "niobium walls only"},
		{"plated superconductor", qfactor.SameWalls(qfactor.Surface{Conductor: nb, Temperature: 2, Superconductor: &bcs, Plating: &qfactor.Plating{Metal: ag, Thickness: 1e-6}}), qfactor.SideWall, qfactor.SettingPlating, "plated superconducting"},
		{"residual too high", qfactor.SameWalls(qfactor.Surface{Conductor: nb, Temperature: 2, Superconductor: &hiRes}), qfactor.SideWall, qfactor.SettingResidual, "residual"},
	} {
		err := tc.w.Validate()
		if tc.want == "" {
			if err != nil {
				t.Errorf("%s: Validate() = %v, want nil", tc.name, err)
				continue
			}
			// Independent route: every part has a finite Rs at 1.3 GHz.
			rs, _, err := tc.w.Resistances(1.3e9)
			if err != nil || !(rs.Side > 0 && rs.EndA > 0 && rs.EndB > 0) || math.IsInf(rs.Side+rs.EndA+rs.EndB, 0) {
				t.Errorf("%s: Validate() = nil but Resistances(1.3 GHz) = %+v, %v", tc.name, rs, err)
			}
			continue
		}
		var we *qfactor.WallError
		if !errors.As(err, &we) || we.Part != tc.part || we.Setting != tc.set || !strings.Contains(err.Error(), tc.want) ||
			!strings.HasPrefix(err.Error(), tc.part.String()) {
			t.Errorf("%s: Validate() = %v (%+v), want a WallError of part %v, setting %d, containing %q", tc.name, err, we, tc.part, tc.set, tc.want)
		}
	}
}

// TestWallSetResistances checks the three Rs of a mixed wall set against
// the test's own classical formula (Pozar, Microwave Engineering, 4th ed.,
// sec. 1.7, classicalRs) for copper at 20 C (sigma = 5.8e7 S/m, the IACS
// definition) and brass (sigma from the library row).
func TestWallSetResistances(t *testing.T) {
	cu := lookupMetal(t, "copper")
	brass := lookupMetal(t, "brass")
	w := qfactor.WallSet{Side: qfactor.Surface{Conductor: cu}, EndA: qfactor.Surface{Conductor: brass}, EndB: qfactor.Surface{Conductor: cu}}
	const f = 10e9
	rs, warns, err := w.Resistances(f)
	if err != nil {
		t.Fatal(err)
	}
	want := qfactor.SurfaceResistances{Side: classicalRs(f, 5.8e7), EndA: classicalRs(f, brass.Conductivity), EndB: classicalRs(f, 5.8e7)}
	for _, c := range []struct {
		name      string
		got, want float64
	}{{"side", rs.Side, want.Side}, {"end A", rs.EndA, want.EndA}, {"end B", rs.EndB, want.EndB}} {
		if relErr(c.got, c.want) > veryclose {
			t.Errorf("Resistances(10 GHz) %s = %.15g ohm, want %.15g ohm (Pozar sec. 1.7)", c.name, c.got, c.want)
		}
	}
	if len(warns) != 0 {
		t.Errorf("Resistances(10 GHz) warnings = %q, want none for room-temperature copper and brass", warns)
	}
	// At() gives the same values and each distinct warning once: a copper
	// wall with a measured cryogenic conductivity (sigma = 3e9 S/m, an
	// invented value typical of 4 K) is in the anomalous regime at 10 GHz.
	cold := qfactor.SameWalls(qfactor.Surface{Conductor: physics.Conductor{Name: "user", Conductivity: 3e9, ElectronDensity: 8.47e28}})
	var got []string
	at := cold.At(func(s string) { got = append(got, s) })
	for range 3 {
		if _, err := at(f); err != nil {
			t.Fatal(err)
		}
	}
	if len(got) != 1 || !strings.Contains(got[0], "anomalous skin effect") {
		t.Errorf("At(...) warnings over three calls = %q, want one anomalous-skin-effect warning", got)
	}
}

// TestQ0Constraint checks the optimiser's Q0 function against Pozar's
// PTFE-filled copper TE011 example (Pozar, Microwave Engineering, 4th ed.,
// sec. 6.4; Q0 about 2304 with sigma = 5.813e7 S/m and the dimensions of
// TestPozarTE011Example), computed by the independent route
// 1/Q0 = Rs/G + tan delta with the test's own Rs.
func TestQ0Constraint(t *testing.T) {
	te011 := mode("TE011")
	c := cavity.Cavity{Radius: 0.0274008, Length: 0.0548016, Fill: physics.Medium{EpsR: 2.08, TanDelta: 4e-4}}
	w := qfactor.SameWalls(qfactor.Surface{Conductor: physics.Conductor{Name: "user", Conductivity: 5.813e7}})
	q0, err := qfactor.Q0Constraint(te011, w)(c)
	if err != nil {
		t.Fatal(err)
	}
	g, err := qfactor.GeometryFactors(c, te011)
	if err != nil {
		t.Fatal(err)
	}
	want := 1 / (classicalRs(c.Frequency(te011), 5.813e7)/g.Total() + 4e-4)
	if relErr(q0, want) > veryclose {
		t.Errorf("Q0Constraint(TE011, copper)(Pozar cavity) = %.10g, want %.10g", q0, want)
	}
	// The issue-3 figure for this cavity, Q0 about 2304 (to 1e-4).
	if relErr(q0, 2304) > 1e-4 {
		t.Errorf("Q0Constraint(...) = %.6g, want about 2304 (Pozar sec. 6.4 example)", q0)
	}
	// An invalid cavity is an error, not a number.
	if _, err := qfactor.Q0Constraint(te011, w)(cavity.Cavity{Radius: -1, Length: 1}); err == nil {
		t.Error("Q0Constraint(...)(radius -1) error = nil, want an error")
	}
}

// TestSuperconductingParts checks the split of a superconducting Rs into
// its BCS and residual parts: the BCS part against the test's own
// evaluation of the approximation A (f/fref)^2 exp(-Delta/T)/T with the
// niobium parameters of Padamsee, Knobloch & Hays 2008, ch. 5 (recalled
// from memory: A = 2e-4 ohm K at 1.5 GHz, Delta/k_B = 17.67 K; about
// 11 nohm at 2 K and 1.3 GHz), the residual part against the set value,
// the sum against Resistance, and the temperature law of the BCS part
// (ratio at 1.8 K and 2 K = (2/1.8) exp(17.67 (1/2 - 1/1.8))).
func TestSuperconductingParts(t *testing.T) {
	nb := lookupMetal(t, "niobium")
	bcs := qfactor.NiobiumBCS()
	bcs.Residual = 5e-9
	const f = 1.3e9
	at := func(temp float64) (float64, float64, float64) {
		s := qfactor.Surface{Conductor: nb, Temperature: temp, Superconductor: &bcs}
		b, r, err := s.SuperconductingParts(f)
		if err != nil {
			t.Fatal(err)
		}
		rs, _, err := s.Resistance(f)
		if err != nil {
			t.Fatal(err)
		}
		return b, r, rs
	}
	b2, r2, rs2 := at(2)
	want := 2e-4 * (1.3 / 1.5) * (1.3 / 1.5) * math.Exp(-17.67/2) / 2
	if relErr(b2, want) > veryclose {
		t.Errorf("BCS part at 2 K, 1.3 GHz = %.6g ohm, want %.6g ohm (Padamsee et al. ch. 5)", b2, want)
	}
	if math.Abs(b2-11e-9) > 0.5e-9 {
		t.Errorf("BCS part at 2 K, 1.3 GHz = %.3g ohm, want about 11 nohm (Padamsee et al. ch. 5, recalled)", b2)
	}
	if r2 != 5e-9 {
		t.Errorf("residual part = %g ohm, want the set 5e-9 ohm", r2)
	}
	if rs2 != b2+r2 {
		t.Errorf("Resistance = %.17g ohm, want BCS + residual = %.17g ohm", rs2, b2+r2)
	}
	b18, _, _ := at(1.8)
	if law := (2 / 1.8) * math.Exp(17.67*(1/2.0-1/1.8)); relErr(b18/b2, law) > veryclose {
		t.Errorf("BCS part ratio 1.8 K / 2 K = %.10g, want %.10g", b18/b2, law)
	}
	if _, _, err := (qfactor.Surface{Conductor: nb}).SuperconductingParts(f); err == nil {
		t.Error("SuperconductingParts(normal niobium) error = nil, want an error")
	}
}
