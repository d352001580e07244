package chart_test

import (
	"path/filepath"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
)

// TestBadInputTyped: each value flag refuses a bad value with one line
// naming the flag, quoting the value and stating the valid range (the
// chart's D/L range modechart.MinRatio..MaxRatio, the page limits
// figure.MinPage..MaxPage, figure.MinDPI..MaxDPI), exit status 2.
func TestBadInputTyped(t *testing.T) {
	out := filepath.Join(t.TempDir(), "c.svg")
	sized := func(extra ...string) []string {
		return append([]string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "1", "-o", out}, extra...)
	}
	clitest.CheckBadInput(t, "chart", []clitest.BadCase{
		{Args: []string{"--mode", "TE011", "--freq", "5", "--ratio", "1", "-o", out}, Code: 2, Want: []string{`--freq "5"`, "needs a unit", "5GHz"}},
		{Args: []string{"--mode", "TE011", "--freq", "1Hz", "--ratio", "1", "-o", out}, Code: 2, Want: []string{`--freq "1Hz"`, "between 1 kHz and 100 THz"}},
		{Args: []string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "0", "-o", out}, Code: 2, Want: []string{`--ratio "0"`, "between 0.01 and 100"}},
		{Args: []string{"--mode", "TE011", "--freq", "5GHz", "--ratio", "x", "-o", out}, Code: 2, Want: []string{`--ratio "x"`, "between 0.01 and 100"}},
		{Args: sized("--ratio-range", "0.5:0.5"), Code: 2, Want: []string{`--ratio-range "0.5:0.5"`, "LO < HI", "between 0.01 and 100"}},
		{Args: sized("--ratio-range", "0:3"), Code: 2, Want: []string{`--ratio-range "0:3"`, "between 0.01 and 100"}},
		{Args: sized("--ratio-range", "a:3"), Code: 2, Want: []string{`--ratio-range "a:3"`, "low end"}},
		{Args: sized("--ratio-range", "3:1"), Code: 2, Want: []string{`--ratio-range "3:1"`, "above high end"}},
		{Args: sized("--max-fd", "0"), Code: 2, Want: []string{`--max-fd "0"`, "between 1e-09 and 1e+12"}},
		{Args: sized("--max-fd", "x"), Code: 2, Want: []string{`--max-fd "x"`, "between 1e-09 and 1e+12"}},
		{Args: sized("--min-fd", "-1"), Code: 2, Want: []string{`--min-fd "-1"`, "between 0 and 1e+12"}},
		{Args: sized("--dpi", "5"), Code: 2, Want: []string{`--dpi "5"`, "between 36 and 1200"}},
		{Args: sized("--width", "100in"), Code: 2, Want: []string{`--width "100in"`, "must be between"}},
		{Args: sized("--width", "8"), Code: 2, Want: []string{`--width "8"`, "needs a unit"}},
		{Args: sized("--height", "x"), Code: 2, Want: []string{`--height "x"`, "invalid length"}},
		{Args: []string{"--mode", "XX", "--diameter", "40mm", "--length", "40mm", "-o", out}, Code: 2, Want: []string{`--mode "XX"`, "TE or TM"}},
	})
}
