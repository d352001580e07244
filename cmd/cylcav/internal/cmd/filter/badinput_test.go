package filter_test

import (
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
)

// TestBadInputFlags: every flag of the command refuses a bad value with one
// line naming the flag, quoting the value (the item, for a list) and
// stating the valid range, and exit status 2. The ranges are the command's
// own limits (filter.MaxOrder, MaxReturnLoss, MaxRipple, MaxSpan,
// figure.MinDPI..MaxDPI, cmdutil.MinFrequency..MaxFrequency).
func TestBadInputFlags(t *testing.T) {
	spec := []string{"--f0", "10GHz", "--bw", "200MHz"}
	with := func(extra ...string) []string { return append(append([]string{}, spec...), extra...) }
	o3 := func(extra ...string) []string { return with(append([]string{"--order", "3"}, extra...)...) }
	clitest.CheckBadInput(t, "filter", []clitest.BadCase{
		{Args: []string{"--f0", "1Hz", "--bw", "1%", "--order", "3"}, Code: 2, Want: []string{`--f0 "1Hz"`, "between 1 kHz and 100 THz"}},
		{Args: []string{"--f0", "10", "--bw", "1%", "--order", "3"}, Code: 2, Want: []string{`--f0 "10"`, "needs a unit", "10GHz"}},
		{Args: []string{"--f0", "10GHz", "--bw", "x%", "--order", "3"}, Code: 2, Want: []string{`--bw "x%"`, "no number"}},
		{Args: []string{"--f0", "10GHz", "--bw", "200", "--order", "3"}, Code: 2, Want: []string{`--bw "200"`, "needs a unit"}},
		{Args: []string{"--f0", "10GHz", "--bw", "1Hz", "--order", "3"}, Code: 2, Want: []string{`--bw "1Hz"`, "between 100 kHz", "--f0 10 GHz"}},
		{Args: []string{"--f0", "10GHz", "--bw", "15%", "--order", "3"}, Code: 2, Want: []string{`--bw "15%"`, "above 10 % of f0"}},
		{Args: with("--order", "99"), Code: 2, Want: []string{`--order "99"`, "between 1 and 30"}},
		{Args: with("--order", "3.5"), Code: 2, Want: []string{`--order "3.5"`, "whole number"}},
		{Args: with("--reject", "40dB@10.3GHz,0dB@10.4GHz"), Code: 2, Want: []string{`--reject "0dB@10.4GHz"`, "> 0 dB and <= 300 dB"}},
		{Args: with("--reject", "40dB@10.3GHz, 30dB@xx"), Code: 2, Want: []string{`--reject "30dB@xx"`, `invalid frequency "xx"`}},
		{Args: with("--reject", "40dB@10.3"), Code: 2, Want: []string{`--reject "40dB@10.3"`, "needs a unit"}},
		{Args: with("--reject", "40dB@1Hz"), Code: 2, Want: []string{`--reject "40dB@1Hz"`, "between 1.000 kHz and 100.0 THz"}},
		{Args: with("--reject", "xdB@10.3GHz"), Code: 2, Want: []string{`--reject "xdB@10.3GHz"`, `invalid level "xdB"`}},
		{Args: with("--reject", "40dB@10.3GHz", "--reject", "40dB@10.4GHz"), Code: 2, Want: []string{`--reject "40dB@10.4GHz"`, "given twice"}},
		{Args: o3("--return-loss", "2dB"), Code: 2, Want: []string{`--return-loss "2dB"`, "between 3.021 dB and 80 dB"}},
		{Args: o3("--return-loss", "abc"), Code: 2, Want: []string{`--return-loss "abc"`, "no number"}},
		{Args: o3("--ripple", "0dB"), Code: 2, Want: []string{`--ripple "0dB"`, "between 4.343e-08 dB and 3 dB"}},
		{Args: o3("--response", "elliptic"), Code: 2, Want: []string{`--response "elliptic"`, "use chebyshev or butterworth"}},
		{Args: o3("--zeros", "11GHz, 10.01GHz"), Code: 2, Want: []string{`--zeros "10.01GHz"`, "passband 9.90050 GHz..10.1005 GHz"}},
		{Args: o3("--zeros", "11GHz,1Hz"), Code: 2, Want: []string{`--zeros "1Hz"`, "between 1 kHz and 100 THz"}},
		{Args: o3("--zeros", "11"), Code: 2, Want: []string{`--zeros "11"`, "needs a unit"}},
		{Args: o3("--mode", "XX"), Code: 2, Want: []string{`--mode "XX"`, "TE or TM"}},
		{Args: o3("--q0", "0"), Code: 2, Want: []string{`--q0 "0"`, "between 1 and 1e+12"}},
		{Args: o3("--q0", "abc"), Code: 2, Want: []string{`--q0 "abc"`, "between 1 and 1e+12"}},
		{Args: o3("--ratio", "1000"), Code: 2, Want: []string{`--ratio "1000"`, "between 0.01 and 100"}},
		{Args: o3("--ratio", "x"), Code: 2, Want: []string{`--ratio "x"`, "between 0.01 and 100"}},
		{Args: o3("--holes", "top"), Code: 2, Want: []string{`--holes "top"`, "use end (cavities stacked on one axis) or side (cavities side by side)"}},
		{Args: o3("--holes", "end", "--hole-thickness", "1m"), Code: 2, Want: []string{`--hole-thickness "1m"`, "between 0 m and 100 mm"}},
		{Args: o3("--holes", "end", "--hole-thickness", "1"), Code: 2, Want: []string{`--hole-thickness "1"`, "needs a unit", "1mm"}},
		{Args: o3("--span", "0.5x"), Code: 2, Want: []string{`--span "0.5x"`, "above 1 and at most 1000"}},
		{Args: o3("--span", "abc"), Code: 2, Want: []string{`--span "abc"`, "above 1 and at most 1000"}},
		{Args: o3("--points", "1000000", "--touchstone", "x.s2p"), Code: 2, Want: []string{`--points "1000000"`, "between 2 and 100001"}},
		{Args: o3("--dpi", "5000", "--plot", "x.png"), Code: 2, Want: []string{`--dpi "5000"`, "between 36 and 1200"}},
		{Args: o3("--dpi", "0x10", "--plot", "x.png"), Code: 2, Want: []string{`--dpi "0x10"`, "whole number"}},
		// A wall flag alone is refused by the central companion check,
		// with the hint of the wall the flag needs.
		{Args: o3("--superconducting"), Code: 2, Want: []string{"--superconducting needs --wall", "--wall niobium"}},
		{Args: o3("--residual", "5nohm"), Code: 2, Want: []string{"--residual needs --superconducting"}},
		{Args: o3("--roughness-model", "groiss"), Code: 2, Want: []string{"--roughness-model needs --roughness"}},
		{Args: o3("--plating-thickness", "5um"), Code: 2, Want: []string{"--plating-thickness needs --plating"}},
	})
}
