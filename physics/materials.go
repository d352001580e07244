package physics

import (
	"fmt"
	"math"
	"strings"
)

// IACSConductivity is the conductivity of the International Annealed Copper
// Standard, 100 % IACS, in S/m: a resistivity of exactly 1/58 ohm mm^2/m at
// 20 C, so 58e6 S/m (IEC 1913; US Bureau of Standards Circular 31, 1914,
// recalled from memory). The rounded resistivity 1.7241 uohm cm gives
// 5.8001e7 S/m; the definition is 1/58 exactly.
const IACSConductivity = 58e6

// Default range of the linear resistivity model rho(T) = rho20 (1 + alpha
// (T - 20 C)) for normal metals, used when a Conductor leaves TMin and TMax
// zero: -50 C to +200 C. Over this range the resistivity of copper,
// aluminium and silver is linear in T to about 1 % (common practice; it
// bends below about 100 K where the phonon part falls faster than linearly).
const (
	DefaultLinearTMin = ZeroCelsius - 50  // kelvin
	DefaultLinearTMax = ZeroCelsius + 200 // kelvin
)

// Conductor is a wall metal at 20 C. Values are SI. Every library row names
// its Source; rows built from user values say "user input".
type Conductor struct {
	Name        string   // canonical library name, lower case ("copper"), or "user"
	Aliases     []string // other accepted names, lower case
	Description string   // one line for people

	// Conductivity is sigma at 20 C, in S/m.
	Conductivity float64
	// Alpha is the temperature coefficient of resistivity at 20 C, in 1/K,
	// for the linear model rho(T) = rho20 (1 + Alpha (T - 293.15 K)); it is
	// meaningful only when AlphaKnown is true.
	Alpha      float64
	AlphaKnown bool
	// TMin and TMax bound the linear model, in kelvin; both zero means
	// DefaultLinearTMin..DefaultLinearTMax.
	TMin, TMax float64
	// MuR is the relative permeability of the wall metal; zero means 1.
	MuR float64
	// Expansion is the linear thermal expansion coefficient near 20 C, in
	// 1/K; zero means unknown.
	Expansion float64
	// Contraction is the published integrated thermal contraction at low
	// temperatures (see Strain); the zero value means none.
	Contraction Contraction
	// ElectronDensity is the conduction-electron density n in m^-3 of the
	// free-electron model, used to estimate the electron mean free path for
	// the anomalous-skin-effect check; zero means unknown.
	ElectronDensity float64
	// Ferromagnetic marks metals whose microwave wall permeability is above
	// 1 and not modelled (MuR = 1 is then a lower bound on Rs).
	Ferromagnetic bool
	// Note is a caution for users, or empty.
	Note string
	// Source names where each value comes from: the book, table or paper,
	// "recalled from memory" where true, or "user input".
	Source string
}

// Mu returns the relative permeability of the wall metal, MuR with zero
// meaning 1.
func (c Conductor) Mu() float64 { return orOne(c.MuR) }

// Resistivity returns 1/Conductivity at 20 C, in ohm m.
func (c Conductor) Resistivity() float64 { return 1 / c.Conductivity }

// IACS returns the conductivity at 20 C as a fraction of IACSConductivity
// (1 = 100 % IACS).
func (c Conductor) IACS() float64 { return c.Conductivity / IACSConductivity }

// Dielectric is a row of the fill library: a Medium (name, permittivity,
// permeability, loss tangents at the stated frequency, temperature
// coefficient) with the aliases, description, note and source that go with
// it. Its Medium is the cavity fill (see cavity.Cavity).
type Dielectric struct {
	Medium               // Name is the canonical library name, lower case ("ptfe"), or "user"
	Aliases     []string // other accepted names, lower case
	Description string   // one line for people

	// Note is a caution for users, or empty.
	Note string
	// Source names where each value comes from: the book, table or paper,
	// "recalled from memory" where true, or "user input".
	Source string
}

// Sources used below (all recalled from memory on this machine; none was
// read from a file here):
const (
	srcIACS  = "IACS definition (IEC 1913; US Bureau of Standards Circular 31, 1914; recalled from memory): 1/58 ohm mm^2/m and alpha = 0.00393 1/K at 20 C; CTE " + srcCRCte
	srcCRCrm = "recalled from memory, CRC Handbook of Chemistry and Physics, 97th ed., Electrical resistivity of pure metals (293 K; alpha derived from the 273 K and 293 K entries) and Thermal expansion of the elements"
	srcCRCte = "recalled from memory, CRC Handbook of Chemistry and Physics, 97th ed., Thermal expansion of the elements"
	srcAMe   = "n: recalled from memory, Ashcroft & Mermin, Solid State Physics (1976), Table 1.1"
	srcASMcu = "recalled from memory, ASM Handbook Vol. 2 (1990), Properties of Wrought Copper and Copper Alloys"
	srcASMal = "recalled from memory, ASM Handbook Vol. 2 (1990), Properties of Wrought Aluminum and Aluminum Alloys"
	srcASMss = "recalled from memory, ASM Handbook Vol. 1 (1990), Wrought Stainless Steels"
	srcASMle = "recalled from memory, ASM Handbook Vol. 2 (1990), Low-Expansion Alloys"
	srcMatt  = "alpha derived by Matthiessen's rule from the base metal: alpha_alloy = alpha_base rho_base/rho_alloy (an estimate, good to about 20 %)"
	srcPozar = "recalled from memory, Pozar, Microwave Engineering, 4th ed. (2012), Appendix G (dielectric constants and loss tangents at 10 GHz)"
	srcKrupk = "recalled from memory, Krupka et al., Meas. Sci. Technol. 10, 387 (1999), room temperature near 10 GHz; tan delta given to its order of magnitude"
	// srcKrupkCold: the same paper's values near 4.2 K.
	srcKrupkCold = "recalled from memory, Krupka et al., Meas. Sci. Technol. 10, 387 (1999), near 4.2 K; tan delta given to its order of magnitude"
)

// Conductors returns the wall-metal library, in a fixed order. Each call
// returns a fresh copy.
//
// Accuracy: handbook values for the named grade at 20 C; real parts vary
// with temper, purity and surface finish by several percent (alloys by more),
// which is why users can give measured values through ParseConductor.
func Conductors() []Conductor {
	const (
		nCu = 8.47e28 // conduction electrons per m^3, Ashcroft & Mermin Table 1.1 (recalled)
		nAg = 5.86e28
		nAu = 5.90e28
		nAl = 18.1e28
	)
	return []Conductor{
		{
			Name: "copper", Aliases: []string{"cu", "annealed-copper"},
			Description:  "annealed copper, 100 % IACS",
			Conductivity: IACSConductivity, Alpha: 0.00393, AlphaKnown: true,
			MuR: 1, Expansion: 16.5e-6, Contraction: contractionNISTCopper(), ElectronDensity: nCu,
			Source: srcIACS + "; " + srcAMe,
		},
		{
			Name: "ofhc-copper", Aliases: []string{"ofhc", "ofe", "c10100", "c10200", "oxygen-free-copper"},
			Description:  "oxygen-free high-conductivity copper (C10100/C10200), 101 % IACS",
			Conductivity: 1.01 * IACSConductivity, Alpha: 0.00397, AlphaKnown: true,
			MuR: 1, Expansion: 17.0e-6, Contraction: contractionNISTCopper(), ElectronDensity: nCu,
			Source: srcASMcu + " (101 % IACS minimum); alpha = 0.00393 scaled by Matthiessen's rule (derived); " + srcAMe,
		},
		{
			Name: "silver", Aliases: []string{"ag"},
			Description:  "pure silver",
			Conductivity: 1 / 1.587e-8, Alpha: 0.0038, AlphaKnown: true,
			MuR: 1, Expansion: 18.9e-6, ElectronDensity: nAg,
			Source: srcCRCrm + "; " + srcAMe,
		},
		{
			Name: "gold", Aliases: []string{"au"},
			Description:  "pure gold",
			Conductivity: 1 / 2.214e-8, Alpha: 0.0037, AlphaKnown: true,
			MuR: 1, Expansion: 14.2e-6, ElectronDensity: nAu,
			Note:   "electroplated gold is often 70-90 % of this conductivity",
			Source: srcCRCrm + "; " + srcAMe,
		},
		{
			Name: "aluminium", Aliases: []string{"al", "aluminum", "pure-aluminium", "al99.99"},
			Description:  "pure aluminium (99.99 %)",
			Conductivity: 1 / 2.65e-8, Alpha: 0.0044, AlphaKnown: true,
			MuR: 1, Expansion: 23.1e-6, ElectronDensity: nAl,
			Source: srcCRCrm + "; " + srcAMe,
		},
		{
			Name: "al6061-t6", Aliases: []string{"al6061", "6061", "6061-t6", "aluminium-6061", "aluminum-6061"},
			Description:  "aluminium alloy 6061-T6, 43 % IACS",
			Conductivity: 0.43 * IACSConductivity, Alpha: 0.0044 * 2.65e-8 * 0.43 * IACSConductivity, AlphaKnown: true,
			MuR: 1, Expansion: 23.6e-6, Contraction: contractionNIST6061(), ElectronDensity: nAl,
			Source: srcASMal + "; " + srcMatt + " (pure aluminium)",
		},
		{
			Name: "al6063-t6", Aliases: []string{"al6063", "6063", "6063-t6", "aluminium-6063", "aluminum-6063"},
			Description:  "aluminium alloy 6063-T6, 53 % IACS",
			Conductivity: 0.53 * IACSConductivity, Alpha: 0.0044 * 2.65e-8 * 0.53 * IACSConductivity, AlphaKnown: true,
			MuR: 1, Expansion: 23.4e-6, ElectronDensity: nAl,
			Source: srcASMal + "; " + srcMatt + " (pure aluminium)",
		},
		{
			Name: "brass", Aliases: []string{"c26000", "cartridge-brass", "brass70-30"},
			Description:  "cartridge brass C26000 (70 Cu / 30 Zn), 28 % IACS",
			Conductivity: 0.28 * IACSConductivity, Alpha: 0.00393 * 0.28, AlphaKnown: true,
			MuR: 1, Expansion: 19.9e-6, ElectronDensity: nCu,
			Source: srcASMcu + "; " + srcMatt + " (annealed copper)",
		},
		{
			Name: "phosphor-bronze", Aliases: []string{"c51000", "phosphor-bronze-a"},
			Description:  "phosphor bronze C51000 (5 % Sn), 15 % IACS",
			Conductivity: 0.15 * IACSConductivity, Alpha: 0.00393 * 0.15, AlphaKnown: true,
			MuR: 1, Expansion: 17.8e-6, ElectronDensity: nCu,
			Source: srcASMcu + "; " + srcMatt + " (annealed copper)",
		},
		{
			Name: "invar", Aliases: []string{"invar36", "fe-36ni", "feni36"},
			Description:  "Fe-36Ni low-expansion alloy",
			Conductivity: 1 / 8.2e-7, Alpha: 0.0012, AlphaKnown: true,
			MuR: 1, Expansion: 1.3e-6, Contraction: contractionNISTInvar(), Ferromagnetic: true,
			Note:   "ferromagnetic: the microwave wall permeability is above 1 and not modelled, so Rs is underestimated; plate invar cavities with copper or silver",
			Source: srcASMle + "; alpha recalled from memory, approximate",
		},
		{
			Name: "ss304", Aliases: []string{"304", "stainless-304", "aisi304"},
			Description:  "austenitic stainless steel 304, annealed",
			Conductivity: 1 / 72e-8, Alpha: (116.0/72 - 1) / 630, AlphaKnown: true,
			MuR: 1, Expansion: 17.3e-6, Contraction: contractionNIST304(),
			Note:   "cold work and welds can make 304 weakly ferromagnetic, which raises Rs",
			Source: srcASMss + " (72 uohm cm at 20 C); alpha derived from the 20 C and 650 C (116 uohm cm) entries",
		},
		{
			Name: "ss316", Aliases: []string{"316", "stainless-316", "aisi316"},
			Description:  "austenitic stainless steel 316, annealed",
			Conductivity: 1 / 74e-8, Alpha: (116.0/74 - 1) / 630, AlphaKnown: true,
			MuR: 1, Expansion: 15.9e-6, Contraction: contractionNIST304(),
			Note:   "cold work can make 316 weakly ferromagnetic, which raises Rs",
			Source: srcASMss + " (74 uohm cm at 20 C); alpha derived from the 20 C and 650 C (116 uohm cm) entries",
		},
		{
			Name: "niobium", Aliases: []string{"nb"},
			Description:  "niobium, normal state at room temperature",
			Conductivity: 1 / 14.5e-8, Alpha: 1 / 293.15, AlphaKnown: true,
			MuR: 1, Expansion: 7.3e-6, Contraction: contractionEkinNiobium(),
			Note:   "normal-state values; for the superconducting state below 9.25 K use the BCS surface model",
			Source: "recalled from memory, Padamsee, Knobloch & Hays, RF Superconductivity for Accelerators, 2nd ed. (2008) (rho(300 K) about 14.5 uohm cm; literature spans 14-15.2); alpha derived as 1/T, the high-temperature Bloch-Grueneisen limit rho proportional to T (approximate, about 20 %); CTE " + srcCRCte,
		},
	}
}

// Dielectrics returns the fill library, in a fixed order. Each call returns
// a fresh copy.
//
// Accuracy: eps_r to about 1 % and tan delta to its first digit for the
// named material near 10 GHz and room temperature; commercial grades differ.
func Dielectrics() []Dielectric {
	// Dry air at 20 C and 101.325 kPa: radio refractivity N = 77.6 P/T
	// (P in hPa, T in K; Smith & Weintraub, Proc. IRE 41, 1035 (1953),
	// recalled from memory), eps = n^2 (derived).
	nAir := 1 + 77.6e-6*1013.25/(ZeroCelsius+20)
	epsAir := nAir * nAir
	return []Dielectric{
		{
			Medium:      Medium{Name: "vacuum", EpsR: 1, MuR: 1, TCEpsKnown: true},
			Aliases:     []string{"vac", "none"},
			Description: "vacuum",
			Source:      "definition",
		},
		{
			Medium: Medium{Name: "air", EpsR: epsAir, MuR: 1,
				// n-1 = 77.6e-6 P/T, so at constant pressure dn/dT = -(n-1)/T
				// and d eps/dT = 2 n dn/dT (derived).
				TCEps: -2 * nAir * (nAir - 1) / (ZeroCelsius + 20) / epsAir, TCEpsKnown: true},
			Aliases:     []string{"dry-air", "air-vented"},
			Description: "dry air, 20 C, 101.325 kPa, vented (constant pressure)",
			Note:        "humidity raises eps: about +1e-4 at 20 C and 60 % relative humidity",
			Source:      "eps derived from the Smith-Weintraub radio refractivity N = 77.6 P/T (Proc. IRE 41, 1035, 1953; recalled from memory); TC derived for an ideal gas at constant pressure; loss negligible",
		},
		{
			Medium:      Medium{Name: "ptfe", EpsR: 2.08, TanDelta: 4e-4, TanDeltaFreq: 10e9, MuR: 1},
			Aliases:     []string{"polytetrafluoroethylene"},
			Description: "PTFE",
			Note:        "phase transitions near 19 C and 30 C change eps by a few tenths of a percent",
			Source:      srcPozar,
		},
		{
			Medium:      Medium{Name: "polyethylene", EpsR: 2.25, TanDelta: 4e-4, TanDeltaFreq: 10e9, MuR: 1},
			Aliases:     []string{"pe"},
			Description: "polyethylene",
			Source:      srcPozar,
		},
		{
			Medium:      Medium{Name: "polystyrene", EpsR: 2.54, TanDelta: 3.3e-4, TanDeltaFreq: 10e9, MuR: 1},
			Aliases:     []string{"ps"},
			Description: "polystyrene",
			Source:      srcPozar,
		},
		{
			Medium:      Medium{Name: "fused-silica", EpsR: 3.78, TanDelta: 1e-4, TanDeltaFreq: 10e9, MuR: 1},
			Aliases:     []string{"silica", "fused-quartz", "sio2"},
			Description: "fused silica (amorphous SiO2)",
			Source:      srcPozar,
		},
		{
			// Uniaxial: EpsR is eps_perp, EpsRParallel eps_par (c axis
			// along the cavity axis z).
			Medium:      Medium{Name: "sapphire", EpsR: 9.3899, EpsRParallel: 11.5867, TanDelta: 1e-5, TanDeltaFreq: 10e9, MuR: 1},
			Aliases:     []string{"al2o3-crystal", "sapphire-300k"},
			Description: "single-crystal sapphire near 296 K, uniaxial, c axis along the cavity axis",
			Note:        "eps_perp 9.3899 for a field across the c axis, eps_par 11.5867 along it; TE modes see eps_perp only; tan delta falls by orders of magnitude when cooled",
			Source:      srcKrupk,
		},
		{
			Medium:      Medium{Name: "sapphire-cold", EpsR: 9.2725, EpsRParallel: 11.3486, TanDelta: 1e-8, TanDeltaFreq: 10e9, MuR: 1},
			Aliases:     []string{"sapphire-4k"},
			Description: "single-crystal sapphire near 4.2 K, uniaxial, c axis along the cavity axis",
			Note:        "eps_perp 9.2725, eps_par 11.3486 near 4.2 K; tan delta of order 1e-9 to 1e-8 depends strongly on the crystal",
			Source:      srcKrupkCold,
		},
		{
			Medium:      Medium{Name: "alumina", EpsR: 9.8, TanDelta: 1e-4, TanDeltaFreq: 10e9, MuR: 1},
			Aliases:     []string{"alumina-99.5", "al2o3"},
			Description: "polycrystalline alumina, 99.5 %",
			Note:        "grades differ by about 0.2 in eps and a factor of 3 in tan delta",
			Source:      srcKrupk + "; Pozar, Microwave Engineering, 4th ed., Appendix G lists 9.5-10 (recalled from memory)",
		},
		{
			// N = 77.6 P/T is proportional to the number density P/(k T)
			// of an ideal gas, which a sealed rigid cavity keeps constant:
			// eps does not change with T (derived). The walls' expansion
			// lowers the density by 3 alpha dT, a coefficient of about
			// 3e-8 1/K for copper, neglected.
			Medium:      Medium{Name: "air-sealed", EpsR: epsAir, MuR: 1, TCEps: 0, TCEpsKnown: true},
			Aliases:     []string{"sealed-air", "dry-air-sealed"},
			Description: "dry air sealed at 20 C, 101.325 kPa (constant density)",
			Note:        "the pressure inside follows the temperature (ideal gas): mind the seal and window ratings",
			Source:      "eps derived from the Smith-Weintraub radio refractivity N = 77.6 P/T (Proc. IRE 41, 1035, 1953; recalled from memory); TC zero at constant density (ideal gas, derived)",
		},
	}
}

// normName folds a material name for lookup: lower case, without spaces,
// hyphens, underscores, dots and percent signs ("Al 6061-T6" -> "al6061t6").
func normName(s string) string {
	var b strings.Builder
	for _, r := range strings.ToLower(s) {
		switch r {
		case ' ', '-', '_', '.', '%', '\t':
			continue
		}
		b.WriteRune(r)
	}
	return b.String()
}

// LookupConductor returns the library conductor whose name or alias matches
// name, ignoring case, spaces, hyphens, underscores, dots and percent signs.
// The error for an unknown name lists the available names.
func LookupConductor(name string) (Conductor, error) {
	lib := Conductors()
	key := normName(name)
	for _, c := range lib {
		if normName(c.Name) == key {
			return c, nil
		}
		for _, a := range c.Aliases {
			if normName(a) == key {
				return c, nil
			}
		}
	}
	names := make([]string, len(lib))
	for i, c := range lib {
		names[i] = c.Name
	}
	return Conductor{}, fmt.Errorf("unknown conductor %q; available: %s (or give values, e.g. sigma=5.8e7)", name, strings.Join(names, ", "))
}

// LookupDielectric returns the library dielectric whose name or alias
// matches name, with the same folding as LookupConductor. The error for an
// unknown name lists the available names.
func LookupDielectric(name string) (Dielectric, error) {
	lib := Dielectrics()
	key := normName(name)
	for _, d := range lib {
		if normName(d.Name) == key {
			return d, nil
		}
		for _, a := range d.Aliases {
			if normName(a) == key {
				return d, nil
			}
		}
	}
	names := make([]string, len(lib))
	for i, d := range lib {
		names[i] = d.Name
	}
	return Dielectric{}, fmt.Errorf("unknown dielectric %q; available: %s (or give values, e.g. eps=2.08,tand=4e-4)", name, strings.Join(names, ", "))
}

// Valid ranges of user values (chosen to reject typing slips, not physics).
const (
	minSigma, maxSigma = 1e3, 1e12   // S/m: from poor alloys to cryogenic pure copper
	minRho, maxRho     = 1e-12, 1e-3 // ohm m, the reciprocal span
	minIACS, maxIACS   = 1e-4, 2.0   // fraction: 0.01 % to 200 % IACS (use sigma beyond)
	minMu, maxMu       = 1e-3, 1e5
	maxAlpha           = 0.01 // 1/K, |alpha|
	minCTE, maxCTE     = -1e-4, 1e-3
	minEps, maxEps     = MinEpsR, MaxEpsR
	maxCoef            = 0.01 // 1/K, |tceps|
	maxTanFreq         = 1e15 // Hz
)

// specField is one key=value pair of a material spec.
type specField struct{ key, value string }

// splitSpec splits "name,key=value,..." into an optional leading name and
// the fields. Keys are lower-cased; duplicates are an error.
func splitSpec(kind, spec string) (name string, fields []specField, err error) {
	if strings.TrimSpace(spec) == "" {
		return "", nil, fmt.Errorf("%s: empty specification; give a library name or key=value pairs", kind)
	}
	seen := map[string]bool{}
	for i, part := range strings.Split(spec, ",") {
		part = strings.TrimSpace(part)
		k, v, ok := strings.Cut(part, "=")
		if !ok {
			if i == 0 && part != "" {
				name = part
				continue
			}
			return "", nil, fmt.Errorf("%s %q: field %q is not key=value", kind, spec, part)
		}
		k = strings.ToLower(strings.TrimSpace(k))
		v = strings.TrimSpace(v)
		if seen[k] {
			return "", nil, fmt.Errorf("%s %q: key %q given twice", kind, spec, k)
		}
		seen[k] = true
		fields = append(fields, specField{k, v})
	}
	return name, fields, nil
}

// rangeErr formats the common out-of-range error.
func rangeErr(kind, key string, lo, hi float64, unit string, got float64) error {
	return fmt.Errorf("%s: %s must be between %g and %g%s, got %g%s", kind, key, lo, hi, unit, got, unit)
}

// ParseConductor returns a conductor from a library name ("copper", "cu",
// "ofhc", "al6061", ...; see LookupConductor) or from user values, as
// comma-separated key=value pairs with an optional library name first whose
// values they override:
//
//	sigma=5.8e7     conductivity at 20 C (S/m; "58MS/m" also works), 1e3..1e12 S/m
//	iacs=61%        conductivity in % IACS ("0.61" also works), 0.01 %..200 %
//	rho=1.72e-8     resistivity at 20 C (ohm m; "1.72uohm cm" also works), 1e-12..1e-3 ohm m
//	mur=1           relative wall permeability, 0.001..1e5 (default 1)
//	alpha=0.0039    resistivity temperature coefficient (1/K or ppm/K), |alpha| <= 0.01
//	cte=17e-6       linear expansion coefficient (1/K or ppm/K), -1e-4..1e-3;
//	                it replaces a library row's cryogenic contraction data,
//	                so Strain then holds from -50 C to 200 C only
//
// At most one of sigma, iacs and rho may be given, and one is required
// without a library name. Rows built from values have Name "user" and Source
// "user input"; a library row with overrides keeps its name and appends
// "; user input: <keys>" to its Source. Errors name the key, the value and
// the valid range.
func ParseConductor(spec string) (Conductor, error) {
	const kind = "conductor"
	name, fields, err := splitSpec(kind, spec)
	if err != nil {
		return Conductor{}, err
	}
	var c Conductor
	if name != "" {
		if c, err = LookupConductor(name); err != nil {
			return Conductor{}, err
		}
	} else {
		c = Conductor{Name: "user", Description: "user values", MuR: 1, Source: "user input"}
	}
	var keys []string
	haveSigma := ""
	for _, f := range fields {
		var v float64
		switch f.key {
		case "sigma", "iacs", "rho":
			if haveSigma != "" {
				return Conductor{}, fmt.Errorf("%s %q: give only one of sigma, iacs and rho (got %s and %s)", kind, spec, haveSigma, f.key)
			}
			haveSigma = f.key
			switch f.key {
			case "sigma":
				if v, err = ParseConductivity(f.value); err != nil {
					return Conductor{}, fmt.Errorf("%s: sigma: %w", kind, err)
				}
				if !(v >= minSigma && v <= maxSigma) {
					return Conductor{}, rangeErr(kind, "sigma", minSigma, maxSigma, " S/m", v)
				}
			case "iacs":
				if v, err = ParseFraction(f.value); err != nil {
					return Conductor{}, fmt.Errorf("%s: iacs: %w", kind, err)
				}
				if !(v >= minIACS && v <= maxIACS) {
					return Conductor{}, fmt.Errorf("%s: iacs must be between %g %% and %g %% (write 61%% or 0.61), got %q = %g %%", kind, minIACS*100, maxIACS*100, f.value, v*100)
				}
				v *= IACSConductivity
			case "rho":
				if v, err = ParseResistivity(f.value); err != nil {
					return Conductor{}, fmt.Errorf("%s: rho: %w", kind, err)
				}
				if !(v >= minRho && v <= maxRho) {
					return Conductor{}, rangeErr(kind, "rho", minRho, maxRho, " ohm m", v)
				}
				v = 1 / v
			}
			c.Conductivity = v
		case "mur", "mu":
			if v, err = parseBare(kind, f.key, f.value); err != nil {
				return Conductor{}, err
			}
			if !(v >= minMu && v <= maxMu) {
				return Conductor{}, rangeErr(kind, f.key, minMu, maxMu, "", v)
			}
			c.MuR = v
		case "alpha":
			if v, err = ParseCoefficient(f.value); err != nil {
				return Conductor{}, fmt.Errorf("%s: alpha: %w", kind, err)
			}
			if !(math.Abs(v) <= maxAlpha) {
				return Conductor{}, rangeErr(kind, "alpha", -maxAlpha, maxAlpha, " 1/K", v)
			}
			c.Alpha, c.AlphaKnown = v, true
		case "cte":
			if v, err = ParseCoefficient(f.value); err != nil {
				return Conductor{}, fmt.Errorf("%s: cte: %w", kind, err)
			}
			if !(v >= minCTE && v <= maxCTE) {
				return Conductor{}, rangeErr(kind, "cte", minCTE, maxCTE, " 1/K", v)
			}
			c.Expansion = v
			c.Contraction = Contraction{} // the library's data describe the library metal, not this one
		default:
			return Conductor{}, fmt.Errorf("%s %q: unknown key %q; use sigma, iacs, rho, mur, alpha or cte", kind, spec, f.key)
		}
		keys = append(keys, f.key)
	}
	if name == "" && haveSigma == "" {
		return Conductor{}, fmt.Errorf("%s %q: give a library name or one of sigma, iacs, rho (e.g. sigma=5.8e7)", kind, spec)
	}
	if name != "" && len(keys) > 0 {
		c.Source += "; user input: " + strings.Join(keys, ", ")
	}
	return c, nil
}

// parseBare parses a plain number for key, rejecting units, NaN and Inf.
func parseBare(kind, key, s string) (float64, error) {
	v, u, err := parseNumber(key, s)
	if err != nil {
		return 0, fmt.Errorf("%s: %w", kind, err)
	}
	if u != "" {
		return 0, fmt.Errorf("%s: %s %q: a plain number is expected, got unit %q", kind, key, s, u)
	}
	return v, nil
}

// ParseDielectric returns a dielectric from a library name ("ptfe",
// "sapphire", ...; see LookupDielectric) or from user values, as
// comma-separated key=value pairs with an optional library name first whose
// values they override:
//
//	eps=2.08        relative permittivity, 1..1e4 (required without a name);
//	                eps_perp of a uniaxial crystal
//	epspar=11.59    eps_par of a uniaxial crystal, c axis along the cavity
//	                axis (Medium.EpsRParallel), 1..1e4 (default: isotropic)
//	tand=4e-4       dielectric loss tangent, 0..1 (default 0)
//	f=10GHz         frequency at which tand holds (Hz or with a unit), > 0
//	mu=1            relative permeability (also mur), 0.001..1e5 (default 1)
//	tandm=0         magnetic loss tangent, 0..1 (default 0)
//	tceps=-350ppm   temperature coefficient of eps (1/K or ppm/K), |tceps| <= 0.01 1/K
//
// Rows built from values have Name "user" and Source "user input"; a
// library row with overrides keeps its name and appends "; user input:
// <keys>" to its Source. Errors name the key, the value and the valid range.
func ParseDielectric(spec string) (Dielectric, error) {
	const kind = "dielectric"
	name, fields, err := splitSpec(kind, spec)
	if err != nil {
		return Dielectric{}, err
	}
	var d Dielectric
	if name != "" {
		if d, err = LookupDielectric(name); err != nil {
			return Dielectric{}, err
		}
	} else {
		d = Dielectric{Medium: Medium{Name: "user", MuR: 1}, Description: "user values", Source: "user input"}
	}
	var keys []string
	haveEps := false
	for _, f := range fields {
		var v float64
		switch f.key {
		case "eps", "epsr":
			if v, err = parseBare(kind, f.key, f.value); err != nil {
				return Dielectric{}, err
			}
			if !(v >= minEps && v <= maxEps) {
				return Dielectric{}, rangeErr(kind, f.key, minEps, maxEps, "", v)
			}
			d.EpsR, haveEps = v, true
		case "epspar":
			// eps_par of a uniaxial crystal, c axis along the cavity axis
			// (Medium.EpsRParallel); eps is then eps_perp.
			if v, err = parseBare(kind, f.key, f.value); err != nil {
				return Dielectric{}, err
			}
			if !(v >= minEps && v <= maxEps) {
				return Dielectric{}, rangeErr(kind, f.key, minEps, maxEps, "", v)
			}
			d.EpsRParallel = v
		case "tand", "tandm":
			if v, err = parseBare(kind, f.key, f.value); err != nil {
				return Dielectric{}, err
			}
			if !(v >= 0 && v <= MaxTanDelta) {
				return Dielectric{}, rangeErr(kind, f.key, 0, MaxTanDelta, "", v)
			}
			if f.key == "tand" {
				d.TanDelta = v
				if name != "" {
					d.TanDeltaFreq = 0 // the library frequency no longer applies
				}
			} else {
				d.TanDeltaM = v
			}
		case "f", "freq":
			if v, err = ParseFrequency(f.value); err != nil {
				return Dielectric{}, fmt.Errorf("%s: %s: %w", kind, f.key, err)
			}
			if !(v > 0 && v <= maxTanFreq) {
				return Dielectric{}, fmt.Errorf("%s: %s must be > 0 Hz and <= %g Hz, got %g Hz", kind, f.key, maxTanFreq, v)
			}
			d.TanDeltaFreq = v
		case "mu", "mur":
			if v, err = parseBare(kind, f.key, f.value); err != nil {
				return Dielectric{}, err
			}
			if !(v >= minMu && v <= maxMu) {
				return Dielectric{}, rangeErr(kind, f.key, minMu, maxMu, "", v)
			}
			d.MuR = v
		case "tceps":
			if v, err = ParseCoefficient(f.value); err != nil {
				return Dielectric{}, fmt.Errorf("%s: tceps: %w", kind, err)
			}
			if !(math.Abs(v) <= maxCoef) {
				return Dielectric{}, rangeErr(kind, "tceps", -maxCoef, maxCoef, " 1/K", v)
			}
			d.TCEps, d.TCEpsKnown = v, true
		default:
			return Dielectric{}, fmt.Errorf("%s %q: unknown key %q; use eps, epspar, tand, f, mu, tandm or tceps", kind, spec, f.key)
		}
		keys = append(keys, f.key)
	}
	if name == "" && !haveEps {
		return Dielectric{}, fmt.Errorf("%s %q: give a library name or eps=... (e.g. eps=2.08,tand=4e-4)", kind, spec)
	}
	if name != "" && len(keys) > 0 {
		d.Source += "; user input: " + strings.Join(keys, ", ")
	}
	if err := d.Medium.Validate(); err != nil {
		return Dielectric{}, fmt.Errorf("%s %q: %w", kind, spec, err)
	}
	return d, nil
}
