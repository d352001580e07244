package physics

import (
	"math"
	"strings"
	"testing"
)

func TestLibraryRowsComplete(t *testing.T) {
	for _, c := range Conductors() {
		if c.Name == "" || c.Name != strings.ToLower(c.Name) || c.Description == "" || c.Source == "" {
			t.Errorf("conductor %q: name must be lower case and description and source non-empty: %+v", c.Name, c)
		}
		if !(c.Conductivity >= 1e6 && c.Conductivity <= 1e8) {
			t.Errorf("conductor %q: conductivity %g S/m outside metals' 1e6..1e8", c.Name, c.Conductivity)
		}
		if c.MuR != 1 {
			t.Errorf("conductor %q: MuR = %g, want 1 (ferromagnetic rows are flagged instead)", c.Name, c.MuR)
		}
		if !c.AlphaKnown || !(c.Alpha > 0 && c.Alpha < 0.01) {
			t.Errorf("conductor %q: alpha = %g (known %v), want known and in (0, 0.01) 1/K", c.Name, c.Alpha, c.AlphaKnown)
		}
		if !(c.Expansion > 0 && c.Expansion < 30e-6) {
			t.Errorf("conductor %q: expansion = %g 1/K, want in (0, 30e-6)", c.Name, c.Expansion)
		}
		if c.Ferromagnetic && c.Note == "" {
			t.Errorf("conductor %q is ferromagnetic but has no note", c.Name)
		}
	}
	for _, d := range Dielectrics() {
		if d.Name == "" || d.Name != strings.ToLower(d.Name) || d.Description == "" || d.Source == "" {
			t.Errorf("dielectric %q: name must be lower case and description and source non-empty: %+v", d.Name, d)
		}
		if !(d.EpsR >= 1 && d.EpsR < 20) || !(d.TanDelta >= 0 && d.TanDelta < 1e-2) || d.MuR != 1 || d.TanDeltaM != 0 {
			t.Errorf("dielectric %q: implausible values %+v", d.Name, d)
		}
		if d.TanDelta > 0 && d.TanDeltaFreq == 0 {
			t.Errorf("dielectric %q: tan delta %g without its frequency", d.Name, d.TanDelta)
		}
	}
}

// TestLibraryRequiredRows checks that the rows the design asks for exist
// (issue 3: conductors and dielectrics to be covered).
func TestLibraryRequiredRows(t *testing.T) {
	for _, n := range []string{"copper", "ofhc", "silver", "gold", "aluminium", "al6061", "al6063", "brass",
		"phosphor bronze", "invar", "ss304", "ss316", "niobium"} {
		if _, err := LookupConductor(n); err != nil {
			t.Errorf("LookupConductor(%q): %v", n, err)
		}
	}
	for _, n := range []string{"vacuum", "air", "ptfe", "polyethylene", "polystyrene", "fused silica",
		"sapphire", "sapphire-cold", "alumina"} {
		if _, err := LookupDielectric(n); err != nil {
			t.Errorf("LookupDielectric(%q): %v", n, err)
		}
	}
}

// TestLibraryNamesUnique checks that no folded name or alias maps to two rows.
func TestLibraryNamesUnique(t *testing.T) {
	seen := map[string]string{}
	for _, c := range Conductors() {
		for _, n := range append([]string{c.Name}, c.Aliases...) {
			if prev, ok := seen[normName(n)]; ok {
				t.Errorf("conductor name %q of %q clashes with %q", n, c.Name, prev)
			}
			seen[normName(n)] = c.Name
		}
	}
	seen = map[string]string{}
	for _, d := range Dielectrics() {
		for _, n := range append([]string{d.Name}, d.Aliases...) {
			if prev, ok := seen[normName(n)]; ok {
				t.Errorf("dielectric name %q of %q clashes with %q", n, d.Name, prev)
			}
			seen[normName(n)] = d.Name
		}
	}
}

// TestLibraryIsCopy checks that callers cannot change the library.
func TestLibraryIsCopy(t *testing.T) {
	a := Conductors()
	a[0].Conductivity = 1
	a[0].Aliases[0] = "changed"
	b := Conductors()
	if b[0].Conductivity == 1 || b[0].Aliases[0] == "changed" {
		t.Errorf("Conductors() shares state between calls")
	}
}

// TestIACS checks the definition: 100 % IACS is 1/58 ohm mm^2/m at 20 C.
func TestIACS(t *testing.T) {
	cu, err := LookupConductor("copper")
	if err != nil {
		t.Fatal(err)
	}
	if got, want := cu.Resistivity(), 1.0/58*1e-6; !closeRel(got, want, unitTol) {
		t.Errorf("copper.Resistivity() = %g, want %g", got, want)
	}
	if got := cu.IACS(); got != 1 {
		t.Errorf("copper.IACS() = %g, want 1", got)
	}
}

// TestConductorsAgainstPozar compares the pure metals with an independent
// table: Pozar, Microwave Engineering, 4th ed., Appendix F (conductivities,
// recalled from memory). Handbook values of pure metals differ by up to about
// 10 % (gold most: film vs bulk), hence the tolerance; it catches slips of a
// digit or a decade.
func TestConductorsAgainstPozar(t *testing.T) {
	const handbookSpread = 0.12
	for _, tc := range []struct {
		name string
		want float64 // S/m, Pozar 4th ed. App. F (recalled from memory)
	}{
		{"copper", 5.813e7},
		{"silver", 6.173e7},
		{"gold", 4.098e7},
		{"aluminium", 3.816e7},
	} {
		c, err := LookupConductor(tc.name)
		if err != nil {
			t.Fatal(err)
		}
		if !closeRel(c.Conductivity, tc.want, handbookSpread) {
			t.Errorf("%s conductivity = %g S/m, want %g S/m within %g", tc.name, c.Conductivity, tc.want, handbookSpread)
		}
	}
	// Ordering known from every handbook: Ag > Cu > Au > Al > brass > stainless.
	order := []string{"silver", "copper", "gold", "aluminium", "brass", "ss304"}
	for i := 1; i < len(order); i++ {
		a, _ := LookupConductor(order[i-1])
		b, _ := LookupConductor(order[i])
		if !(a.Conductivity > b.Conductivity) {
			t.Errorf("conductivity of %s (%g) should exceed %s (%g)", a.Name, a.Conductivity, b.Name, b.Conductivity)
		}
	}
}

// TestDielectricsPhysics checks physical facts independent of the table:
// sapphire is positive uniaxial with eps_par > eps_perp (Krupka et al.
// 1999), and the derived permittivity of dry air agrees with the measured
// value 1.00058986 at 0 C and 101.325 kPa (CRC Handbook, 97th ed.,
// Permittivity of gases, recalled from memory), scaled to 20 C by the ideal
// gas density. Tolerance: the radio refractivity constant 77.6 K/hPa is a fit
// for frequencies up to tens of GHz and the CRC value is at 900 kHz; they
// differ by a few percent in eps - 1.
func TestDielectricsPhysics(t *testing.T) {
	// Both rows positive uniaxial, and eps falls on cooling (Krupka et al.
	// 1999, recalled from memory).
	warm, _ := LookupDielectric("sapphire")
	cold, _ := LookupDielectric("sapphire-cold")
	for _, d := range []Dielectric{warm, cold} {
		if !d.Uniaxial() || !(d.EpsPar() > d.Eps()) {
			t.Errorf("%s eps_par = %g, want > eps_perp = %g", d.Name, d.EpsPar(), d.Eps())
		}
	}
	if !(cold.Eps() < warm.Eps() && cold.EpsPar() < warm.EpsPar()) {
		t.Errorf("sapphire eps cold %g/%g, want below warm %g/%g", cold.Eps(), cold.EpsPar(), warm.Eps(), warm.EpsPar())
	}
	air, _ := LookupDielectric("air")
	const airTol = 0.05
	want := 5.8986e-4 * ZeroCelsius / (ZeroCelsius + 20)
	if got := air.EpsR - 1; !closeRel(got, want, airTol) {
		t.Errorf("air eps - 1 = %g, want %g within %g", got, want, airTol)
	}
	// The derived TCEps, checked by a central finite difference of the
	// Smith-Weintraub refractivity (an independent route).
	// A step of 0.01 K leaves a truncation error of about (h/T)^2 ~ 1e-9
	// relative and a rounding error of about 1e-16/(6e-4 h/T) ~ 1e-8
	// (eps - 1 is only 6e-4); fdTol allows for both.
	const h, fdTol = 0.01, 1e-6
	n := func(T float64) float64 { return 1 + 77.6e-6*1013.25/T }
	fd := (n(293.15+h)*n(293.15+h) - n(293.15-h)*n(293.15-h)) / (2 * h) / air.EpsR
	if !closeRel(air.TCEps, fd, fdTol) {
		t.Errorf("air TCEps = %g, want %g (finite difference)", air.TCEps, fd)
	}
}

func TestLookup(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"Copper", "copper"}, {"CU", "copper"}, {"ofhc", "ofhc-copper"}, {"OFHC Copper", "ofhc-copper"},
		{"al6061", "al6061-t6"}, {"Al 6061-T6", "al6061-t6"}, {"AL6063", "al6063-t6"}, {"aluminum", "aluminium"},
		{"SS304", "ss304"}, {"stainless_316", "ss316"}, {"nb", "niobium"}, {"Phosphor Bronze", "phosphor-bronze"},
	} {
		c, err := LookupConductor(tc.in)
		if err != nil || c.Name != tc.want {
			t.Errorf("LookupConductor(%q) = %q, %v, want %q", tc.in, c.Name, err, tc.want)
		}
	}
	for _, tc := range []struct{ in, want string }{
		{"PTFE", "ptfe"}, {"polytetrafluoroethylene", "ptfe"}, {"Fused Silica", "fused-silica"}, {"Alumina 99.5%", "alumina"},
		{"sapphire_4k", "sapphire-cold"},
	} {
		d, err := LookupDielectric(tc.in)
		if err != nil || d.Name != tc.want {
			t.Errorf("LookupDielectric(%q) = %q, %v, want %q", tc.in, d.Name, err, tc.want)
		}
	}
	if _, err := LookupConductor("unobtainium"); err == nil || !strings.Contains(err.Error(), "available: copper, ofhc-copper") {
		t.Errorf("LookupConductor(unknown) error %v, want a list of names", err)
	}
	if _, err := LookupDielectric("sapphire-perp"); err == nil || !strings.Contains(err.Error(), "sapphire, sapphire-cold") {
		t.Errorf("LookupDielectric(sapphire-perp) error %v, want the uniaxial rows listed", err)
	}
}

func TestParseConductor(t *testing.T) {
	for _, tc := range []struct {
		spec         string
		name         string
		sigma, mur   float64
		alpha        float64
		alphaKnown   bool
		cte          float64
		sourcePrefix string
	}{
		{"sigma=5.813e7", "user", 5.813e7, 1, 0, false, 0, "user input"},
		{"sigma=58MS/m", "user", 5.8e7, 1, 0, false, 0, "user input"},
		{"iacs=61%", "user", 0.61 * 58e6, 1, 0, false, 0, "user input"},
		{"iacs=0.61", "user", 0.61 * 58e6, 1, 0, false, 0, "user input"},
		{"rho=1.72e-8", "user", 1 / 1.72e-8, 1, 0, false, 0, "user input"},
		{"rho = 1.72 uohm cm, mur=1.5", "user", 1 / 1.72e-8, 1.5, 0, false, 0, "user input"},
		{"sigma=5.8e7,mur=1,alpha=0.0039,cte=17e-6", "user", 5.8e7, 1, 0.0039, true, 17e-6, "user input"},
		{"SIGMA=5.8e7,Alpha=3900ppm,CTE=17ppm", "user", 5.8e7, 1, 0.0039, true, 17e-6, "user input"},
		{"copper", "copper", 58e6, 1, 0.00393, true, 16.5e-6, "IACS"},
		{"copper,sigma=5e9", "copper", 5e9, 1, 0.00393, true, 16.5e-6, "IACS"},
	} {
		c, err := ParseConductor(tc.spec)
		if err != nil {
			t.Errorf("ParseConductor(%q) error %v", tc.spec, err)
			continue
		}
		if c.Name != tc.name || !closeRel(c.Conductivity, tc.sigma, unitTol) || c.MuR != tc.mur ||
			!closeRel(c.Alpha, tc.alpha, unitTol) || c.AlphaKnown != tc.alphaKnown || !closeRel(c.Expansion, tc.cte, unitTol) ||
			!strings.HasPrefix(c.Source, tc.sourcePrefix) {
			t.Errorf("ParseConductor(%q) = %+v, want name %s sigma %g mur %g alpha %g (%v) cte %g source %q...",
				tc.spec, c, tc.name, tc.sigma, tc.mur, tc.alpha, tc.alphaKnown, tc.cte, tc.sourcePrefix)
		}
	}
	if c, _ := ParseConductor("copper,sigma=5e9"); !strings.HasSuffix(c.Source, "; user input: sigma") {
		t.Errorf("ParseConductor(copper,sigma=5e9).Source = %q, want it to end in the user keys", c.Source)
	}
	for _, tc := range []errCase{
		{"sigma=-5", []string{"sigma must be between 1000 and 1e+12 S/m, got -5 S/m"}},
		{"sigma=0", []string{"sigma must be between"}},
		{"sigma=NaN", []string{"sigma", "not a finite number"}},
		{"sigma=5e7 ohm", []string{"sigma", "unknown unit"}},
		{"iacs=61", []string{"iacs must be between 0.01 % and 200 %", "write 61%"}},
		{"rho=0", []string{"rho must be between"}},
		{"mur=0", []string{"mur must be between"}},
		{"sigma=5e7,mur=2mm", []string{"plain number", "mm"}},
		{"sigma=5e7,alpha=0.5", []string{"alpha must be between"}},
		{"sigma=5e7,cte=1", []string{"cte must be between"}},
		{"sigma=5e7,iacs=50%", []string{"only one of sigma, iacs and rho"}},
		{"sigma=5e7,sigma=6e7", []string{`key "sigma" given twice`}},
		{"sigma=5e7,foo=1", []string{`unknown key "foo"`, "sigma, iacs, rho, mur, alpha or cte"}},
		{"mur=1", []string{"library name or one of sigma, iacs, rho"}},
		{"", []string{"empty"}},
		{"unobtainium", []string{"unknown conductor", "available:"}},
		{"sigma=5e7,copper", []string{`field "copper" is not key=value`}},
	} {
		_, err := ParseConductor(tc.in)
		if err == nil {
			t.Errorf("ParseConductor(%q) gave no error", tc.in)
			continue
		}
		for _, w := range tc.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("ParseConductor(%q) error %q, want it to contain %q", tc.in, err, w)
			}
		}
	}
}

func TestParseDielectric(t *testing.T) {
	for _, tc := range []struct {
		spec              string
		name              string
		eps, tand, f, mu  float64
		tandm, tceps      float64
		tcKnown           bool
		sourceHasUserKeys bool
	}{
		{"eps=2.08", "user", 2.08, 0, 0, 1, 0, 0, false, false},
		{"eps=2.08,tand=4e-4", "user", 2.08, 4e-4, 0, 1, 0, 0, false, false},
		{"eps=2.08,tand=4e-4,f=10GHz,mu=1,tandm=0,tceps=-350ppm", "user", 2.08, 4e-4, 10e9, 1, 0, -350e-6, true, false},
		{"eps=12,mur=1.2,tandm=1e-3", "user", 12, 0, 0, 1.2, 1e-3, 0, false, false},
		{"ptfe", "ptfe", 2.08, 4e-4, 10e9, 1, 0, 0, false, false},
		{"ptfe,tand=2e-4", "ptfe", 2.08, 2e-4, 0, 1, 0, 0, false, true},
	} {
		d, err := ParseDielectric(tc.spec)
		if err != nil {
			t.Errorf("ParseDielectric(%q) error %v", tc.spec, err)
			continue
		}
		if d.Name != tc.name || d.EpsR != tc.eps || d.TanDelta != tc.tand || d.TanDeltaFreq != tc.f || d.MuR != tc.mu ||
			d.TanDeltaM != tc.tandm || !closeRel(d.TCEps, tc.tceps, unitTol) || d.TCEpsKnown != tc.tcKnown ||
			strings.Contains(d.Source, "user input: ") != tc.sourceHasUserKeys {
			t.Errorf("ParseDielectric(%q) = %+v, want %+v", tc.spec, d, tc)
		}
		if tc.name == "user" && d.Source != "user input" {
			t.Errorf("ParseDielectric(%q).Source = %q, want %q", tc.spec, d.Source, "user input")
		}
	}
	for _, tc := range []errCase{
		{"eps=0.5", []string{"eps must be between 1 and 10000, got 0.5"}},
		{"eps=2,tand=2", []string{"tand must be between 0 and 1, got 2"}},
		{"eps=2,tand=-1e-4", []string{"tand must be between"}},
		{"eps=2,tandm=5", []string{"tandm must be between"}},
		{"eps=2,mu=0", []string{"mu must be between"}},
		{"eps=2,f=0", []string{"f must be > 0 Hz"}},
		{"eps=2,tceps=1", []string{"tceps must be between"}},
		{"tand=1e-4", []string{"eps="}},
		{"eps=2,bogus=1", []string{`unknown key "bogus"`}},
		{"eps=inf", []string{"not a finite number"}},
		{"glass", []string{"unknown dielectric", "available: vacuum, air, ptfe"}},
	} {
		_, err := ParseDielectric(tc.in)
		if err == nil {
			t.Errorf("ParseDielectric(%q) gave no error", tc.in)
			continue
		}
		for _, w := range tc.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("ParseDielectric(%q) error %q, want it to contain %q", tc.in, err, w)
			}
		}
	}
}

// TestMatthiessenAlloys checks the derived alloy alphas by the rule they come
// from: the temperature-dependent part of rho (alpha rho) of an alloy equals
// that of its base metal.
func TestMatthiessenAlloys(t *testing.T) {
	const matthiessenTol = 1e-12 // a few roundings in the library's products
	for _, p := range [][2]string{{"al6061", "aluminium"}, {"al6063", "aluminium"}, {"brass", "copper"}, {"phosphor-bronze", "copper"}} {
		a, _ := LookupConductor(p[0])
		b, _ := LookupConductor(p[1])
		if got, want := a.Alpha*a.Resistivity(), b.Alpha*b.Resistivity(); !closeRel(got, want, matthiessenTol) || math.IsNaN(got) {
			t.Errorf("alpha rho of %s = %g, want %g (%s)", a.Name, got, want, b.Name)
		}
	}
}
