package unloadedq_test

import (
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
)

// TestBadInputMain: flags given empty are errors, not "absent"; plain
// numbers take nothing after them; temperatures outside the wall model
// name --temperature and the model's range.
func TestBadInputMain(t *testing.T) {
	cu := []string{"--radius", "20mm", "--length", "40mm", "--wall", "copper"}
	with := func(extra ...string) []string { return append(extra, cu...) }
	clitest.CheckBadInput(t, "q", []clitest.BadCase{
		{Args: with("--mode", ""), Code: 2, Want: []string{`--mode ""`, "TE011"}},
		{Args: with("--mode", "TX011"), Code: 2, Want: []string{`--mode "TX011"`, "TE or TM"}},
		{Args: with("--mode", "TE010"), Code: 2, Want: []string{`--mode "TE010"`, "p >= 1"}},
		{Args: with("--mode", "TM(1,2)"), Code: 2, Want: []string{`--mode "TM(1,2)"`, "three indices"}},
		{Args: []string{"--mode", "TE011", "--diameter", "", "--length", "40mm", "--wall", "copper"}, Code: 2, Want: []string{`--diameter ""`, "empty"}},
		{Args: []string{"--mode", "TE011", "--diameter", "1e9m", "--length", "40mm", "--wall", "copper"}, Code: 2, Want: []string{`--diameter "1e9m"`, "must be between"}},
		{Args: []string{"--mode", "TE011", "--radius", "20mm", "--length", "", "--wall", "copper"}, Code: 2, Want: []string{`--length ""`, "empty"}},
		{Args: []string{"--mode", "TE011", "--radius", "20mm", "--length", "40mm", "--wall", ""}, Code: 2, Want: []string{`--wall ""`, "empty"}},
		{Args: []string{"--mode", "TE011", "--radius", "20mm", "--length", "40mm", "--wall", "sigma=abc"}, Code: 2, Want: []string{`--wall "sigma=abc"`, "no number"}},
		{Args: with("--mode", "TE011", "--fill", ""), Code: 2, Want: []string{`--fill ""`, "empty"}},
		{Args: with("--mode", "TE011", "--fill", "eps=0.5"), Code: 2, Want: []string{`--fill "eps=0.5"`, "between 1 and 10000"}},
		{Args: with("--mode", "TE011", "--fill", "eps=2,tand=-1"), Code: 2, Want: []string{"tand must be between 0 and 1"}},
		{Args: with("--mode", "TE011", "--beta", ""), Code: 2, Want: []string{`--beta ""`, "empty"}},
		{Args: with("--mode", "TE011", "--beta", "1abc"), Code: 2, Want: []string{`--beta "1abc"`, `unexpected "abc"`, "between 0 and"}},
		{Args: with("--mode", "TE011", "--qext", ""), Code: 2, Want: []string{`--qext ""`, "empty"}},
		{Args: with("--mode", "TE011", "--qext", "1e400"), Code: 2, Want: []string{`--qext "1e400"`, "out of range"}},
		{Args: with("--mode", "TM010", "--particle-speed", "0.5,"), Code: 2, Want: []string{`--particle-speed "0.5,"`, "between 1e-06 and 1"}},
		{Args: with("--mode", "TM010", "--particle-speed", "NaN"), Code: 2, Want: []string{`--particle-speed "NaN"`, "not a finite number"}},
		{Args: with("--mode", "TE011", "--end-wall", ""), Code: 2, Want: []string{`--end-wall ""`, "empty"}},
		{Args: with("--mode", "TE011", "--end-wall-a", "unobtainium"), Code: 2, Want: []string{`--end-wall-a "unobtainium"`, "available"}},
		{Args: with("--mode", "TE011", "--temperature", ""), Code: 2, Want: []string{`--temperature ""`, "empty"}},
		{Args: with("--mode", "TE011", "--temperature", "-300C"), Code: 2, Want: []string{`--temperature "-300C"`, "below absolute zero"}},
		// Linear resistivity model of copper: -50 C..200 C (physics.Conductors).
		{Args: with("--mode", "TE011", "--temperature", "4K"), Code: 2, Want: []string{`--temperature "4K"`, "-50.00 C to 200.0 C"}},
		{Args: with("--mode", "TE011", "--temperature", "500C"), Code: 2, Want: []string{`--temperature "500C"`, "-50.00 C to 200.0 C"}},
		{Args: with("--mode", "TE011", "--temperature", "60C", "--end-wall", "sigma=1e7"), Code: 2, Want: []string{`--temperature "60C"`, "temperature coefficient"}},
		// BCS model: T <= Tc/2 = 4.625 K for niobium (qfactor.NiobiumBCS).
		{Args: []string{"--mode", "TM010", "--radius", "20mm", "--length", "40mm", "--wall", "niobium", "--superconducting", "--temperature", "300K"}, Code: 2, Want: []string{`--temperature "300K"`, "4.625 K"}},
		{Args: with("--mode", "TE011", "--roughness", ""), Code: 2, Want: []string{`--roughness ""`, "empty"}},
		{Args: with("--mode", "TE011", "--roughness", "-1um"), Code: 2, Want: []string{`--roughness "-1um"`, "must be between"}},
		{Args: with("--mode", "TE011", "--plating", "", "--plating-thickness", "5um"), Code: 2, Want: []string{`--plating ""`, "empty"}},
		{Args: with("--mode", "TE011", "--format", "xml"), Code: 2, Want: []string{`--format "xml"`, "table|json"}},
		{Args: with("--mode", "TE011", "extra"), Code: 2, Want: []string{"extra"}},
	})
}

// TestBadInputTyped: --beta, --qext and --particle-speed are refused while
// the command line is parsed, naming the flag, quoting the value (the
// item, for a list of ports) and stating the range (beta 0..1e6, Qext
// 1..1e15, at most 2 ports, particle speed 1e-6..1 of c).
func TestBadInputTyped(t *testing.T) {
	cu := []string{"--radius", "20mm", "--length", "40mm", "--wall", "copper"}
	with := func(extra ...string) []string { return append(extra, cu...) }
	clitest.CheckBadInput(t, "q", []clitest.BadCase{
		{Args: with("--mode", "TE011", "--beta", "-1"), Code: 2, Want: []string{`--beta "-1"`, "between 0 and 1e+06"}},
		{Args: with("--mode", "TE011", "--beta", "1, x"), Code: 2, Want: []string{`--beta "x"`, "between 0 and 1e+06"}},
		{Args: with("--mode", "TE011", "--beta", "1,2,3"), Code: 2, Want: []string{`--beta "1,2,3"`, "at most 2 ports"}},
		{Args: with("--mode", "TE011", "--qext", "0"), Code: 2, Want: []string{`--qext "0"`, "between 1 and 1e+15"}},
		{Args: with("--mode", "TE011", "--qext", "1000,abc"), Code: 2, Want: []string{`--qext "abc"`, "between 1 and 1e+15"}},
		{Args: with("--mode", "TE011", "--beta", "1", "--qext", "1000"), Code: 2, Want: []string{"--beta or --qext, not both"}},
		{Args: with("--mode", "TM010", "--particle-speed", "1.5"), Code: 2, Want: []string{`--particle-speed "1.5"`, "between 1e-06 and 1"}},
		{Args: with("--mode", "TE011", "--particle-speed", "0.5"), Code: 2, Want: []string{`--particle-speed "0.5"`, "TM0mp modes only"}},
	})
}
