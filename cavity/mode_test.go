package cavity

import (
	"strings"
	"testing"
)

// Label conventions: TE_nmp / TM_nmp with n azimuthal, m radial, p axial,
// printed TE011 (all indices below 10) or TE(12,3,1); the textbook form
// (Pozar, Microwave Engineering, 4th ed., sec. 6.4) is the compact one.
func TestParseMode(t *testing.T) {
	for _, tc := range []struct {
		in    string
		want  Mode
		label string
	}{
		{"TE011", Mode{TE, 0, 1, 1}, "TE011"},
		{"TM010", Mode{TM, 0, 1, 0}, "TM010"},
		{"te111", Mode{TE, 1, 1, 1}, "TE111"},
		{"  tM021 ", Mode{TM, 0, 2, 1}, "TM021"},
		{"TE_011", Mode{TE, 0, 1, 1}, "TE011"},
		{"TE(12,3,1)", Mode{TE, 12, 3, 1}, "TE(12,3,1)"},
		{"TM(0,1,0)", Mode{TM, 0, 1, 0}, "TM010"},
		{"TE 12 3 1", Mode{TE, 12, 3, 1}, "TE(12,3,1)"},
		{"TE(1, 10, 2)", Mode{TE, 1, 10, 2}, "TE(1,10,2)"},
		{"TM(1000,1000,1000)", Mode{TM, 1000, 1000, 1000}, "TM(1000,1000,1000)"},
		{"TM 9;9;9", Mode{TM, 9, 9, 9}, "TM999"},
	} {
		got, err := ParseMode(tc.in)
		if err != nil {
			t.Errorf("ParseMode(%q) error: %v", tc.in, err)
			continue
		}
		if got != tc.want {
			t.Errorf("ParseMode(%q) = %+v, want %+v", tc.in, got, tc.want)
		}
		if s := got.String(); s != tc.label {
			t.Errorf("ParseMode(%q).String() = %q, want %q", tc.in, s, tc.label)
		}
	}
}

func TestParseModeErrors(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"TE010", `invalid mode "TE010": TE modes need p >= 1; did you mean TE011 or TM010?`},
		{"TE(12,3,0)", `invalid mode "TE(12,3,0)": TE modes need p >= 1; did you mean TE(12,3,1) or TM(12,3,0)?`},
		{"TM000", `invalid mode "TM000": radial index m must be in 1..1000, got 0`},
		{"TM(1001,1,0)", `index "1001" is not an integer in 0..1000`},
		{"TX011", "the family must be TE or TM"},
		{"HE111", "the family must be TE or TM"},
		{"", "want a label such as TE011"},
		{"T", "want a label such as TE011"},
		{"TE01", "want three indices"},
		{"TE0111", "want three indices"},
		{"TE(1,2,3", "unbalanced parenthesis"},
		{"TE(1,a,3)", `index "a" is not an integer`},
		{"TE(1,-2,3)", `index "-2" is not an integer`},
		{"TE(1,2)", "want three indices"},
	} {
		_, err := ParseMode(tc.in)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("ParseMode(%q) error = %v, want it to contain %q", tc.in, err, tc.want)
		}
	}
}

func TestModeValidate(t *testing.T) {
	for _, tc := range []struct {
		m  Mode
		ok bool
	}{
		{Mode{TE, 0, 1, 1}, true},
		{Mode{TM, 0, 1, 0}, true},
		{Mode{TE, 0, 1, 0}, false},
		{Mode{TM, -1, 1, 0}, false},
		{Mode{TM, 0, 0, 0}, false},
		{Mode{TM, 0, 1, -1}, false},
		{Mode{TM, MaxIndex + 1, 1, 0}, false},
		{Mode{0, 0, 1, 1}, false},
		{Mode{3, 0, 1, 1}, false},
	} {
		if err := tc.m.Validate(); (err == nil) != tc.ok {
			t.Errorf("%+v.Validate() = %v, want ok = %v", tc.m, err, tc.ok)
		}
	}
}

// Degeneracy: two polarisations cos(n phi), sin(n phi) for n >= 1, one for
// n = 0 (Pozar, sec. 6.4; Harrington, sec. 5.3).
func TestDegeneracy(t *testing.T) {
	for _, tc := range []struct {
		m    Mode
		want int
	}{
		{Mode{TM, 0, 1, 0}, 1}, {Mode{TE, 0, 1, 1}, 1}, {Mode{TE, 1, 1, 1}, 2}, {Mode{TM, 7, 2, 3}, 2},
	} {
		if got := tc.m.Degeneracy(); got != tc.want {
			t.Errorf("%v.Degeneracy() = %d, want %d", tc.m, got, tc.want)
		}
	}
	// TM110 has no companion: TE010 does not exist.
	if c, ok := (Mode{TM, 1, 1, 0}).Companion(); ok {
		t.Errorf("TM110.Companion() = %v, true; want none", c)
	}
}

// FuzzParseMode checks that ParseMode never panics, that whatever it
// accepts is a valid mode, and that printing and parsing again gives the
// same mode (round trip). The seed corpus runs as an ordinary test.
func FuzzParseMode(f *testing.F) {
	for _, s := range []string{"TE011", "TM010", "te111", "TE(12,3,1)", "TM 1 2 3", "TE010", "TM000",
		"TE(1,2,3", "TX011", "", "TE_021", "tm(1000,1000,1000)", "TE(+1,2,3)", "TE\u00e9011", "TM(0,1,0)"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		m, err := ParseMode(s)
		if err != nil {
			if err.Error() == "" {
				t.Errorf("ParseMode(%q): empty error text", s)
			}
			return
		}
		if err := m.Validate(); err != nil {
			t.Errorf("ParseMode(%q) = %+v, which fails Validate: %v", s, m, err)
		}
		back, err := ParseMode(m.String())
		if err != nil || back != m {
			t.Errorf("ParseMode(%q) = %+v; ParseMode(%q) = %+v, %v; want the same mode", s, m, m.String(), back, err)
		}
	})
}
