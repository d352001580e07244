package cavity

import (
	"fmt"
	"strconv"
	"strings"
	"unicode"
)

// Family is the field family of a resonant mode of a closed circular cylinder.
type Family uint8

const (
	// TE modes have no axial electric field (Ez = 0). Their transverse
	// wavenumber is j'_nm / a, from the zeros of J'_n.
	TE Family = iota + 1
	// TM modes have no axial magnetic field (Hz = 0). Their transverse
	// wavenumber is j_nm / a, from the zeros of J_n.
	TM
)

// String returns "TE" or "TM".
func (f Family) String() string {
	switch f {
	case TE:
		return "TE"
	case TM:
		return "TM"
	}
	return fmt.Sprintf("Family(%d)", uint8(f))
}

// Mode names one resonant mode TE_nmp or TM_nmp of a closed circular
// cylinder of radius a and length d.
//
// The index convention, used everywhere in cylcav:
//   - n is the azimuthal index: the fields vary as cos(n phi) or sin(n phi),
//     n >= 0;
//   - m is the radial index: the m-th zero of J_n (TM) or J'_n (TE), m >= 1;
//   - p is the axial index: the number of half-wavelengths along the length,
//     p >= 1 for TE and p >= 0 for TM.
//
// Mode labels print as TE011 when every index is below 10 and as
// TE(12,3,1) otherwise; ParseMode accepts both forms.
type Mode struct {
	Family  Family
	N, M, P int
}

// MaxIndex is the largest index a Mode may carry. It bounds the Bessel-root
// core (orders and zero counts up to 1000) with room to spare.
const MaxIndex = 1000

// Validate reports whether m names a mode that exists in a closed circular
// cylinder: n >= 0, m >= 1, p >= 1 for TE and p >= 0 for TM, and no index
// above MaxIndex. TE_nm0 does not exist: with no axial variation and Ez = 0
// the transverse electric field would have to vanish on both end plates
// everywhere, so the whole field vanishes (Pozar, Microwave Engineering,
// 4th ed., sec. 6.4). The error says what is wrong and, for TE_nm0, which
// existing modes were probably meant.
func (m Mode) Validate() error {
	switch m.Family {
	case TE, TM:
	default:
		return fmt.Errorf("invalid mode family %d: want TE or TM", uint8(m.Family))
	}
	bad := m.N < 0 || m.N > MaxIndex || m.M < 1 || m.M > MaxIndex || m.P < 0 || m.P > MaxIndex || m.Family == TE && m.P == 0
	if !bad {
		return nil // the label is formatted only for an error: long mode lists validate every entry
	}
	label := m.String()
	switch {
	case m.N < 0 || m.N > MaxIndex:
		return fmt.Errorf("invalid mode %q: azimuthal index n must be in 0..%d, got %d", label, MaxIndex, m.N)
	case m.M < 1 || m.M > MaxIndex:
		return fmt.Errorf("invalid mode %q: radial index m must be in 1..%d, got %d", label, MaxIndex, m.M)
	case m.P < 0 || m.P > MaxIndex:
		return fmt.Errorf("invalid mode %q: axial index p must be in 0..%d, got %d", label, MaxIndex, m.P)
	case m.Family == TE && m.P == 0:
		return fmt.Errorf("invalid mode %q: TE modes need p >= 1; did you mean %s or %s?",
			label, Mode{TE, m.N, m.M, 1}, Mode{TM, m.N, m.M, 0})
	}
	return nil
}

// String returns the mode label, TE011 or TM010 when every index is a single
// digit, and the separated form TE(12,3,1) otherwise.
func (m Mode) String() string {
	if m.N >= 0 && m.N < 10 && m.M >= 0 && m.M < 10 && m.P >= 0 && m.P < 10 {
		return fmt.Sprintf("%s%d%d%d", m.Family, m.N, m.M, m.P)
	}
	return fmt.Sprintf("%s(%d,%d,%d)", m.Family, m.N, m.M, m.P)
}

// ParseMode parses a mode label: TE011, tm010, TE(12,3,1) or TE 1 1 1 with
// separators. The family is case-insensitive. The compact form needs exactly
// three digits. The result is validated: TE010 is an error.
func ParseMode(s string) (Mode, error) {
	t := strings.TrimSpace(s)
	if len(t) < 2 {
		return Mode{}, fmt.Errorf("invalid mode %q: want a label such as TE011, TM010 or TE(12,3,1)", s)
	}
	var m Mode
	switch strings.ToUpper(t[:2]) {
	case "TE":
		m.Family = TE
	case "TM":
		m.Family = TM
	default:
		return Mode{}, fmt.Errorf("invalid mode %q: the family must be TE or TM, as in TE011 or TM010", s)
	}
	rest := strings.TrimSpace(t[2:])
	rest = strings.TrimPrefix(rest, "_")
	var idx []int
	if len(rest) == 3 && allDigits(rest) {
		for _, r := range rest {
			idx = append(idx, int(r-'0'))
		}
	} else {
		if strings.HasPrefix(rest, "(") {
			if !strings.HasSuffix(rest, ")") {
				return Mode{}, fmt.Errorf("invalid mode %q: unbalanced parenthesis; write TE(12,3,1)", s)
			}
			rest = rest[1 : len(rest)-1]
		}
		fields := strings.FieldsFunc(rest, func(r rune) bool { return r == ',' || r == ';' || unicode.IsSpace(r) })
		for _, f := range fields {
			v, err := strconv.Atoi(f)
			if err != nil || v < 0 || v > MaxIndex {
				return Mode{}, fmt.Errorf("invalid mode %q: index %q is not an integer in 0..%d", s, f, MaxIndex)
			}
			idx = append(idx, v)
		}
	}
	if len(idx) != 3 {
		return Mode{}, fmt.Errorf("invalid mode %q: want three indices n, m, p as in TE011 or TE(12,3,1)", s)
	}
	m.N, m.M, m.P = idx[0], idx[1], idx[2]
	if err := m.Validate(); err != nil {
		return Mode{}, err
	}
	return m, nil
}

func allDigits(s string) bool {
	for _, r := range s {
		if r < '0' || r > '9' {
			return false
		}
	}
	return s != ""
}

// Degeneracy returns the number of independent field patterns that share
// this mode's frequency because of rotational symmetry: 2 for n >= 1 (the
// cos(n phi) and sin(n phi) polarisations) and 1 for n = 0. The exact
// TE0mp/TM1mp coincidence is a different effect: see Companion.
func (m Mode) Degeneracy() int {
	if m.N == 0 {
		return 1
	}
	return 2
}

// Companion returns the mode that resonates at exactly the same frequency as
// m in every cylinder for a reason other than polarisation: TE0mp and TM1mp
// (p >= 1) coincide because j'_{0,m} = j_{1,m} (J'_0 = -J_1; DLMF 10.6.3).
// The second result is false when m has no such companion.
func (m Mode) Companion() (Mode, bool) {
	switch {
	case m.Family == TE && m.N == 0 && m.P >= 1:
		return Mode{TM, 1, m.M, m.P}, true
	case m.Family == TM && m.N == 1 && m.P >= 1:
		return Mode{TE, 0, m.M, m.P}, true
	}
	return Mode{}, false
}
