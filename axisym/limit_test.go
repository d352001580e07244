package axisym

import (
	"errors"
	"testing"

	"cylcav/cavity"
)

// TestErrLimit: a request beyond the solver's limits wraps ErrLimit, so a
// command can report it as bad input, and an ordinary request does not.
// A closed cylinder of radius a = 2 m and length d = 3 m has far more than
// MaxResonances TE0 resonances below 10.5 GHz: the TE0mp frequencies fill
// the quarter disc of radius k in the (j'_{0m}/a, p pi/d) plane, about
// (pi/4) k^2 a d / pi^2 ~ 2.3e4 of them (k = 220 /m; derived, order of
// magnitude); a 20 mm section at 10.5 THz propagates about k a / pi ~ 1400
// modes, more than MaxModes.
func TestErrLimit(t *testing.T) {
	for _, tc := range []struct {
		name string
		b    Body
		fmax float64
		want bool
	}{
		{"many resonances", Body{Sections: []Section{{Length: 3, Radius: 2}}}, 10.5e9, true},
		{"many modes", Body{Sections: []Section{{Length: 0.03, Radius: 0.02}}}, 10.5e12, true},
		{"ordinary", Body{Sections: []Section{{Length: 0.03, Radius: 0.02}}}, 10.5e9, false},
	} {
		_, err := Solve(tc.b, Request{MaxFrequency: tc.fmax, Families: []cavity.Family{cavity.TE}})
		if got := errors.Is(err, ErrLimit); got != tc.want {
			t.Errorf("%s: errors.Is(%v, ErrLimit) = %v, want %v", tc.name, err, got, tc.want)
		}
		// The same for the dipoles (order 1, hybrid.go).
		_, err = Solve(tc.b, Request{Order: 1, MaxFrequency: tc.fmax})
		if got := errors.Is(err, ErrLimit); got != tc.want {
			t.Errorf("%s, n = 1: errors.Is(%v, ErrLimit) = %v, want %v", tc.name, err, got, tc.want)
		}
	}
}
