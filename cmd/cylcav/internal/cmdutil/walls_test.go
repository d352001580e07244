package cmdutil

import (
	"math"
	"testing"
)

func TestParseOhm(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want float64
	}{{"10nohm", 10e-9}, {"0.02 mohm", 2e-5}, {"1e-8", 1e-8}, {"3uOhm", 3e-6}, {"2 ohm", 2}} {
		got, err := parseOhm(tc.in)
		if err != nil || math.Abs(got-tc.want) > 1e-15*tc.want {
			t.Errorf("parseOhm(%q) = %g, %v; want %g", tc.in, got, err, tc.want)
		}
	}
	for _, bad := range []string{"", "nohm", "ten ohm", "NaN", "1e999"} {
		if _, err := parseOhm(bad); err == nil {
			t.Errorf("parseOhm(%q) error = nil, want an error", bad)
		}
	}
}
