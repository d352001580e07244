package cmdutil

import (
	"strings"
	"testing"

	"github.com/spf13/pflag"

	"cylcav/cavity"
)

// TestTypedValues parses flags through the typed values and checks the SI
// value (exact unit factors: 1 in = 25.4 mm, 0 C = 273.15 K by definition)
// and, for bad values, that the error names the flag, the value and the
// range in user units.
func TestTypedValues(t *testing.T) {
	var (
		l, f, temp, frac, num, ohm, lo, hi, tlo, thi float64
		m                                            cavity.Mode
	)
	newSet := func() *pflag.FlagSet {
		fs := pflag.NewFlagSet("t", pflag.ContinueOnError)
		fs.SetOutput(&strings.Builder{})
		LengthVar(fs, &l, "length", "", 1e-6, 1)
		FrequencyVar(fs, &f, "freq", "", MinFrequency, MaxFrequency)
		TemperatureVar(fs, &temp, "temp", "", 1, 2000)
		FractionVar(fs, &frac, "tuning", "", 0, 0.5)
		NumberVar(fs, &num, "ratio", "", 0.01, 100)
		ResistanceVar(fs, &ohm, "residual", "", 0, 1)
		LengthRangeVar(fs, &lo, &hi, "length-range", "", 1e-6, 1)
		TemperatureRangeVar(fs, &tlo, &thi, "temp-range", "", 1, 2000)
		ModeVar(fs, &m, "mode", "")
		return fs
	}
	if err := newSet().Parse([]string{"--length", "2in", "--freq", "915 MHz", "--temp", "20C", "--tuning", "2%",
		"--ratio", "1.5", "--residual", "10nohm", "--length-range", "28mm:32mm", "--temp-range", "-20C:60C", "--mode", "TE(0,1,1)"}); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"length", l, 0.0508}, {"freq", f, 915e6}, {"temp", temp, 293.15}, {"tuning", frac, 0.02}, {"ratio", num, 1.5},
		{"residual", ohm, 1e-8}, {"length-range lo", lo, 0.028}, {"length-range hi", hi, 0.032},
		{"temp-range lo", tlo, 253.15}, {"temp-range hi", thi, 333.15},
	} {
		if !(abs(c.got-c.want) <= 1e-12*c.want) {
			t.Errorf("--%s = %v, want %v", c.name, c.got, c.want)
		}
	}
	if m.String() != "TE011" {
		t.Errorf("--mode = %v, want TE011", m)
	}
	for _, tc := range []struct {
		args []string
		want []string
	}{
		{[]string{"--length", "2m"}, []string{`--length "2m"`, "must be between 1 um and 1 m"}},
		{[]string{"--length", "176.5"}, []string{`--length "176.5"`, "did you mean 176.5mm?"}},
		{[]string{"--freq", "200"}, []string{`--freq "200"`, "did you mean 200MHz?"}},
		{[]string{"--temp", "20"}, []string{`--temp "20"`, "ambiguous"}},
		{[]string{"--tuning", "60%"}, []string{`--tuning "60%"`, "must be between 0% and 50%"}},
		{[]string{"--ratio", "1abc"}, []string{`--ratio "1abc"`, "between 0.01 and 100"}},
		{[]string{"--residual", "0x10"}, []string{`--residual "0x10"`}},
		{[]string{"--length-range", "32mm:28mm"}, []string{`--length-range "32mm:28mm"`, "low end 32mm is above high end 28mm"}},
		{[]string{"--length-range", "1mm:2m"}, []string{"both ends must be between 1 um and 1 m"}},
		{[]string{"--mode", "TE010"}, []string{`--mode "TE010"`, "p >= 1"}},
	} {
		err := newSet().Parse(tc.args)
		if err == nil {
			t.Errorf("%v: no error", tc.args)
			continue
		}
		msg := FlagValueError(err).Error()
		for _, w := range tc.want {
			if !strings.Contains(msg, w) {
				t.Errorf("%v: error %q, want it to contain %q", tc.args, msg, w)
			}
		}
	}
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}
