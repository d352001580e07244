package clearance_test

import (
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
)

func TestBadInputMain(t *testing.T) {
	cav := []string{"--diameter", "40mm", "--length", "30mm"}
	with := func(extra ...string) []string { return append(extra, cav...) }
	clitest.CheckBadInput(t, "clearance", []clitest.BadCase{
		{Args: with("--mode", "TX011"), Code: 2, Want: []string{`--mode "TX011"`, "TE or TM"}},
		{Args: with("--mode", "TE010"), Code: 2, Want: []string{`--mode "TE010"`, "did you mean TE011 or TM010?"}},
		{Args: with("--mode", "TE0"), Code: 2, Want: []string{`--mode "TE0"`, "three indices"}},
		{Args: with("--mode", "TM(1,2)"), Code: 2, Want: []string{`--mode "TM(1,2)"`, "three indices"}},
		{Args: with("--mode", ""), Code: 2, Want: []string{`--mode ""`}},
		{Args: cav, Code: 2, Want: []string{`"mode"`, "not set"}},
		{Args: []string{"--mode", "TE011", "--diameter", "40mm"}, Code: 2, Want: []string{`"length"`, "not set"}},
		{Args: []string{"--mode", "TE011", "--length", "30mm"}, Code: 2, Want: []string{"diameter", "radius", "required"}},
		{Args: []string{"--mode", "TE011", "--diameter", "40mm", "--radius", "20mm", "--length", "30mm"}, Code: 2, Want: []string{"diameter", "radius"}},
		{Args: []string{"--mode", "TE011", "--diameter", "", "--length", "30mm"}, Code: 2, Want: []string{`--diameter ""`, "empty"}},
		{Args: []string{"--mode", "TE011", "--diameter", "0", "--length", "30mm"}, Code: 2, Want: []string{`--diameter "0"`, "must be between"}},
		{Args: []string{"--mode", "TE011", "--diameter", "-3mm", "--length", "30mm"}, Code: 2, Want: []string{`--diameter "-3mm"`, "must be between"}},
		{Args: []string{"--mode", "TE011", "--radius", "Inf", "--length", "30mm"}, Code: 2, Want: []string{`--radius "Inf"`, "not a finite number"}},
		{Args: []string{"--mode", "TE011", "--diameter", "40mm", "--length", "5 furlong"}, Code: 2, Want: []string{`--length "5 furlong"`, "unknown unit"}},
		{Args: with("--mode", "TE011", "--window", ""), Code: 2, Want: []string{`--window ""`, "empty"}},
		{Args: with("--mode", "TE011", "--window", "-5%"), Code: 2, Want: []string{`--window "-5%"`, "between 0% and 1000%"}},
		{Args: with("--mode", "TE011", "--window", "500"), Code: 2, Want: []string{`--window "500"`, "between 0% and 1000%"}},
		{Args: with("--mode", "TE011", "--window", "xHz"), Code: 2, Want: []string{`--window "xHz"`, "a percentage such as 10% or a frequency"}},
		{Args: with("--mode", "TE011", "--window", "5%", "--window", "6%"), Code: 2, Want: []string{`--window "6%"`, "given twice"}},
		{Args: with("--mode", "TE011", "--window", "2000%"), Code: 2, Want: []string{`--window "2000%"`, "between 0% and 1000%"}},
		{Args: with("--mode", "TE011", "--window", "-1GHz"), Code: 2, Want: []string{`--window "-1GHz"`, "10 times the wanted frequency"}},
		{Args: with("--mode", "TE011", "--window", "10GHzz"), Code: 2, Want: []string{`--window "10GHzz"`, "unknown unit"}},
		// 10 x f(TE011) of this cavity = 104.18 GHz (its frequency, 10.418 GHz, from `cylcav modes`).
		{Args: with("--mode", "TE011", "--window", "1e20Hz"), Code: 2, Want: []string{`--window "1e20Hz"`, "104.18 GHz"}},
		{Args: with("--mode", "TE011", "--fill", ""), Code: 2, Want: []string{`--fill ""`, "empty"}},
		{Args: with("--mode", "TE011", "--fill", "eps=0.5"), Code: 2, Want: []string{`--fill "eps=0.5"`, "between 1 and 10000"}},
		{Args: with("--mode", "TE011", "--format", "xml"), Code: 2, Want: []string{`--format "xml"`}},
		{Args: with("--mode", "TE011", "extra"), Code: 2, Want: []string{"extra"}},
	})
}
