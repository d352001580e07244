package design

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/cmdutil"
)

func run(t *testing.T, args ...string) (string, error) {
	t.Helper()
	var out, errOut bytes.Buffer
	cmd := NewCmdDesign(cmdutil.Test(&out, &errOut), nil)
	cmd.SetArgs(args)
	cmd.SetOut(&out)
	cmd.SetErr(&errOut)
	cmd.SilenceUsage, cmd.SilenceErrors = true, true
	err := cmd.Execute()
	return out.String(), err
}

func TestDesignDemo(t *testing.T) {
	out, err := run(t)
	if err != nil {
		t.Fatal(err)
	}
	first, _, _ := strings.Cut(out, "\n")
	if !strings.HasPrefix(first, "Demo scenario (no flags given):") {
		t.Errorf("first line = %q, want it to say this is the demo scenario", first)
	}
	for _, want := range []string{"diameter D =", "Clearance:", "TM111", "Q0 =", "df/dT", "percentile", "n azimuthal"} {
		if !strings.Contains(out, want) {
			t.Errorf("demo output lacks %q:\n%s", want, out)
		}
	}
}

func TestDesignJSON(t *testing.T) {
	out, err := run(t, "--mode", "TE011", "--freq", "10GHz", "--wall", "copper", "--tolerance", "0.02mm", "--samples", "2000", "--format", "json")
	if err != nil {
		t.Fatal(err)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("design --format json output is not JSON: %v\n%s", err, out)
	}
	for _, k := range []string{"mode", "f_hz", "diameter_m", "length_m", "ratio_d_over_l", "clearance_pct", "at_range_edge", "below", "above", "degenerate", "q0", "sensitivity", "tolerance"} {
		if _, ok := m[k]; !ok {
			t.Errorf("design JSON lacks key %q", k)
		}
	}
	sens := m["sensitivity"].(map[string]any)
	for _, k := range []string{"df_dd_hz_per_m", "df_dl_hz_per_m", "df_dt_hz_per_k"} {
		if _, ok := sens[k]; !ok {
			t.Errorf("design JSON sensitivity lacks key %q", k)
		}
	}
}

func TestDesignCSV(t *testing.T) {
	out, err := run(t, "--mode", "TM010", "--freq", "3GHz", "--format", "csv")
	if err != nil {
		t.Fatal(err)
	}
	if !strings.HasPrefix(out, "ratio_d_over_l,diameter_m,length_m,clearance_pct,worst_clearance_pct,q0\n") {
		t.Errorf("design CSV header = %q", strings.SplitN(out, "\n", 2)[0])
	}
}

// TestDesignErrors: bad input exits with 2, an impossible request with 1.
func TestDesignErrors(t *testing.T) {
	for _, tc := range []struct {
		args   []string
		status int
		want   string
	}{
		{[]string{"--mode", "TE010", "--freq", "10GHz"}, 2, "--mode"},
		{[]string{"--mode", "TE011"}, 2, "--mode and --freq"},
		{[]string{"--mode", "TE011", "--freq", "10GHz", "--ratio-range", "3:1"}, 2, "--ratio-range"},
		{[]string{"--mode", "TE011", "--freq", "10GHz", "--objective", "q"}, 2, "--wall"},
		{[]string{"--mode", "TM010", "--freq", "10GHz", "--tuning", "1%"}, 2, "p = 0"},
		{[]string{"--mode", "TE011", "--freq", "10GHz", "--min-clearance", "20%"}, 1, "best clearance"},
	} {
		_, err := run(t, tc.args...)
		if got := cmdutil.ExitStatus(err); got != tc.status || err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("design %v: status %d, error %v; want status %d mentioning %q", tc.args, got, err, tc.status, tc.want)
		}
	}
}

func TestDemoIsLibraryCall(t *testing.T) {
	s, err := Demo()
	if err != nil {
		t.Fatal(err)
	}
	r, err := s.Run(nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Unloaded == nil || r.Design.Spread == nil || len(r.Cautions) == 0 {
		t.Errorf("Demo().Run = %+v, want Q breakdown, spread and cautions", r)
	}
}
