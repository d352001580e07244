package tune_test

import (
	"slices"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
)

func TestBadInputMain(t *testing.T) {
	base := []string{"--mode", "TE011", "--diameter", "40mm"}
	with := func(extra ...string) []string { return append(append([]string{}, base...), extra...) }
	ok := slices.Clip(with("--length-range", "28mm:32mm")) // each append copies
	clitest.CheckBadInput(t, "tune", []clitest.BadCase{
		{Args: with("--length-range", "3mm:0.5mm"), Code: 2, Want: []string{`--length-range "3mm:0.5mm"`, "above high end"}},
		{Args: with("--length-range", "a:b"), Code: 2, Want: []string{`--length-range "a:b"`, "no number"}},
		{Args: with("--length-range", "1mm:"), Code: 2, Want: []string{`--length-range "1mm:"`, "empty"}},
		{Args: with("--length-range", ":2"), Code: 2, Want: []string{`--length-range ":2"`, "empty"}},
		{Args: with("--length-range", "28mm"), Code: 2, Want: []string{`--length-range "28mm"`, "LO:HI"}},
		{Args: with("--length-range", "0:30mm"), Code: 2, Want: []string{`--length-range "0:30mm"`, "must be between"}},
		// The mode chart reaches D/L 0.01..100 (cavity.MinDesignRatio..MaxDesignRatio):
		// 0.4 mm..4 m for a 40 mm diameter.
		{Args: with("--length-range", "1mm:1000m"), Code: 2, Want: []string{`--length-range "1mm:1000m"`, "400.0 um and 4.000 m"}},
		{Args: with(), Code: 2, Want: []string{`"length-range"`, "not set"}},
		{Args: []string{"--mode", "TE011", "--diameter", "", "--length-range", "28mm:32mm"}, Code: 2, Want: []string{`--diameter ""`, "empty"}},
		{Args: []string{"--mode", "TE010", "--diameter", "40mm", "--length-range", "28mm:32mm"}, Code: 2, Want: []string{`--mode "TE010"`, "p >= 1"}},
		{Args: append(ok, "--steps", "0"), Code: 2, Want: []string{`--steps "0"`, "between 1 and 100000"}},
		{Args: append(ok, "--steps", "-1"), Code: 2, Want: []string{`--steps "-1"`, "between 1 and 100000"}},
		{Args: append(ok, "--steps", "1e3"), Code: 2, Want: []string{`--steps "1e3"`, "not a whole number"}},
		{Args: append(ok, "--sphere", "1mm"), Code: 2, Want: []string{"--sphere needs --at"}},
		{Args: append(ok, "--sphere", "", "--at", "20mm,0,15mm"), Code: 2, Want: []string{`--sphere ""`, "empty"}},
		{Args: append(ok, "--sphere", "1mm", "--at", ""), Code: 2, Want: []string{`--at ""`, "RHO,PHI,Z"}},
		{Args: append(ok, "--sphere", "1mm", "--at", "20mm,x,15mm"), Code: 2, Want: []string{`--at "20mm,x,15mm"`, "degrees"}},
		{Args: append(ok, "--sphere", "1mm", "--at", "20,0,15mm"), Code: 2, Want: []string{`--at "20"`, "needs a unit", "20mm"}},
		{Args: append(ok, "--sphere", "1mm", "--at", "20mm,0,xx"), Code: 2, Want: []string{`--at "xx"`, "invalid length"}},
		{Args: append(ok, "--steps", "1000000"), Code: 2, Want: []string{`--steps "1000000"`, "between 1 and 100000"}},
		{Args: append(ok, "--sphere", "1mm", "--at", "30mm,0,15mm"), Code: 2, Want: []string{`--at "30mm,0,15mm"`, "inside the cavity"}},
		{Args: append(ok, "--sphere", "30mm", "--at", "20mm,0,15mm"), Code: 2, Want: []string{`--sphere "30mm"`, "does not fit"}},
		{Args: append(ok, "--fill", "unobtainium"), Code: 2, Want: []string{`--fill "unobtainium"`, "available"}},
		{Args: append(ok, "--format", "xml"), Code: 2, Want: []string{`--format "xml"`}},
		{Args: append(ok, "extra"), Code: 2, Want: []string{"extra"}},
	})
}
