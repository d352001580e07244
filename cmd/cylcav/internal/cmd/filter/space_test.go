package filter_test

import (
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	bandpass "cylcav/filter"
)

// TestPlaceZerosCommand: --place-zeros chooses the order and zeros, the
// verdict is pass, and the order is below the all-pole order of the same
// mask (the command without --place-zeros, an independent route through
// the closed-form order selection).
func TestPlaceZerosCommand(t *testing.T) {
	spec := []string{"--f0", "10GHz", "--bw", "100MHz", "--return-loss", "22dB", "--reject", "40dB@10.08GHz,30dB@9.93GHz", "--format", "json"}
	m := decode(t, mustRun(t, append(slices.Clone(spec), "--place-zeros")...))
	p, ok := m["zero_placement"].(map[string]any)
	if !ok {
		t.Fatalf("no zero_placement in %v", m)
	}
	if m["verdict"] != "pass" || m["topology"] != "folded" {
		t.Errorf("verdict %v, topology %v", m["verdict"], m["topology"])
	}
	n := int(m["order"].(float64))
	if int(p["order"].(float64)) != n || m["order_from_rejections"] != true {
		t.Errorf("placement order %v, design order %d", p["order"], n)
	}
	all := decode(t, mustRun(t, spec...))
	if na := int(all["order"].(float64)); n >= na {
		t.Errorf("placed order %d, all-pole order %d: the zeros should save resonators", n, na)
	}
	if z := floats(t, p["zeros_normalised"]); !slices.Equal(z, floats(t, m["transmission_zeros_normalised"])) {
		t.Errorf("placement zeros %v differ from the design's", z)
	}
}

// TestTopologyCommand: the design carried into cascaded triplets keeps
// every check value and the group delay of the folded design (to 1e-9
// relative), its matrix has exact zeros off the triplet pattern, and each
// triplet's zero is one of the design's zeros.
func TestTopologyCommand(t *testing.T) {
	base := []string{"--f0", "10GHz", "--bw", "100MHz", "--order", "5", "--zeros-norm", "-1.7,1.4",
		"--reject", "20dB@10.07GHz,20dB@9.92GHz", "--q0", "5000", "--format", "json"}
	f := decode(t, mustRun(t, base...))
	c := decode(t, mustRun(t, append(slices.Clone(base), "--topology", "triplets")...))
	if c["topology"] != "triplets" {
		t.Fatalf("topology %v", c["topology"])
	}
	for _, key := range []string{"insertion_loss_db", "group_delay_f0_s", "group_delay_passband_variation_s"} {
		a, b := f[key].(float64), c[key].(float64)
		if math.Abs(a-b) > 1e-9*math.Abs(a) {
			t.Errorf("%s: folded %g, triplets %g", key, a, b)
		}
	}
	fc, cc := f["checks"].([]any), c["checks"].([]any)
	for i := range fc {
		a := fc[i].(map[string]any)["achieved_db"].(float64)
		b := cc[i].(map[string]any)["achieved_db"].(float64)
		if math.Abs(a-b) > 1e-9*math.Abs(a) {
			t.Errorf("check %d: folded %g, triplets %g", i, a, b)
		}
	}
	top, _ := bandpass.CascadeTopology("triplets", 5, 2)
	for i, row := range c["coupling_matrix"].([]any) {
		for j, v := range row.([]any) {
			if !top.Allowed(i, j) && v.(float64) != 0 {
				t.Errorf("entry (%d,%d) = %v off the triplet pattern", i, j, v)
			}
		}
	}
	tz := floats(t, c["triplet_zeros_normalised"])
	slices.Sort(tz)
	for i, z := range []float64{-1.7, 1.4} {
		if math.Abs(tz[i]-z) > 1e-9 {
			t.Errorf("triplet zeros %v, want [-1.7 1.4]", tz)
		}
	}
}

// TestZerosNormAndPairs: zeros given in normalised frequency give the same
// design as the same zeros in Hz, and a real-axis pair flattens the delay.
func TestZerosNormAndPairs(t *testing.T) {
	const f0, bw = 10e9, 100e6
	hz := func(w float64) string {
		return bandpassHz(bandpass.BandpassFrequency(w, f0, bw))
	}
	base := []string{"--f0", "10GHz", "--bw", "100MHz", "--order", "6", "--format", "json"}
	a := decode(t, mustRun(t, append(slices.Clone(base), "--zeros-norm", "-1.5,1.8")...))
	b := decode(t, mustRun(t, append(slices.Clone(base), "--zeros", hz(-1.5)+","+hz(1.8))...))
	za, zb := floats(t, a["transmission_zeros_normalised"]), floats(t, b["transmission_zeros_normalised"])
	for i := range za {
		if math.Abs(za[i]-zb[i]) > 1e-9 {
			t.Errorf("zeros %v (normalised) vs %v (Hz)", za, zb)
		}
	}
	p := decode(t, mustRun(t, append(slices.Clone(base), "--zeros-norm", "-1.5,1.8", "--delay-pairs", "1.2")...))
	if got := floats(t, p["real_axis_zero_pairs_normalised"]); len(got) != 1 || got[0] != 1.2 {
		t.Errorf("pairs %v", got)
	}
	if p["verdict"] != "pass" {
		t.Errorf("verdict %v", p["verdict"])
	}
	if dv, d0 := p["group_delay_passband_variation_s"].(float64), a["group_delay_passband_variation_s"].(float64); dv >= d0 {
		t.Errorf("delay variation with the pair %g s, without %g s", dv, d0)
	}
}

// bandpassHz prints a frequency in Hz for a flag, to 15 digits.
func bandpassHz(f float64) string {
	return strconvFloat(f) + "Hz"
}

// TestMatrixCommand: the example matrix file is analysed; a design saved
// with --save-matrix and read back with --matrix gives the same checks;
// the example's zeros are where the file's cross coupling puts them.
func TestMatrixCommand(t *testing.T) {
	ex := filepath.Join("..", "..", "..", "..", "..", "examples", "beacon-quadruplet.cmx")
	m := decode(t, mustRun(t, "--matrix", ex, "--format", "json"))
	if m["verdict"] != "pass" || m["topology"] != "given" || int(m["order"].(float64)) != 4 {
		t.Errorf("example: verdict %v topology %v order %v", m["verdict"], m["topology"], m["order"])
	}
	if z := floats(t, m["transmission_zeros_normalised"]); len(z) != 2 || math.Abs(z[0]+2.2) > 1e-3 || math.Abs(z[1]-2.2) > 1e-3 {
		t.Errorf("example zeros %v, want about -+2.2 (the design's)", z)
	}
	dir := t.TempDir()
	path := filepath.Join(dir, "d.cmx")
	design := []string{"--f0", "10GHz", "--bw", "100MHz", "--return-loss", "22dB", "--reject", "40dB@10.08GHz,30dB@9.93GHz",
		"--place-zeros", "--topology", "triplets", "--format", "json"}
	a := decode(t, mustRun(t, append(slices.Clone(design), "--save-matrix", path)...))
	if _, err := os.Stat(path); err != nil {
		t.Fatal(err)
	}
	b := decode(t, mustRun(t, "--matrix", path, "--format", "json"))
	ac, bc := a["checks"].([]any), b["checks"].([]any)
	if len(ac) != len(bc) || a["verdict"] != b["verdict"] {
		t.Fatalf("checks differ: %v vs %v", a["verdict"], b["verdict"])
	}
	for i := range ac {
		x := ac[i].(map[string]any)["achieved_db"].(float64)
		y := bc[i].(map[string]any)["achieved_db"].(float64)
		if math.Abs(x-y) > 1e-8*math.Abs(x) {
			t.Errorf("check %d: design %g, from the file %g", i, x, y)
		}
	}
	// --save-matrix refuses to replace a file without --force.
	if r := run(t, append(slices.Clone(design), "--save-matrix", path)...); r.Code != 2 {
		t.Errorf("existing --save-matrix without --force: exit %d", r.Code)
	}
}

// TestBadInputSpace: the flags of this part refuse bad values with the
// flag, the value and the valid range, exit status 2.
func TestBadInputSpace(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.cmx")
	if err := os.WriteFile(bad, []byte("centre 10 GHz\nbandwidth 100 MHz\nresonators 2\nm S 1 1\nm 1 S 1\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	wide := filepath.Join(dir, "wide.cmx")
	if err := os.WriteFile(wide, []byte("centre 10 GHz\nbandwidth 2 GHz\nresonators 1\nm S 1 1\nm 1 L 1\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	spec := []string{"--f0", "10GHz", "--bw", "100MHz"}
	with := func(extra ...string) []string { return append(slices.Clone(spec), extra...) }
	clitest.CheckBadInput(t, "filter", []clitest.BadCase{
		{Args: with("--order", "4", "--zeros-norm", "2,0.5"), Code: 2, Want: []string{`--zeros-norm "0.5"`, "|Omega| > 1"}},
		{Args: with("--order", "4", "--zeros-norm", "x"), Code: 2, Want: []string{`--zeros-norm "x"`, "between -1000 and 1000"}},
		{Args: with("--order", "4", "--delay-pairs", "0"), Code: 2, Want: []string{`--delay-pairs "0"`, "between 0.001 and 100"}},
		{Args: with("--order", "4", "--delay-pairs", "1,1,1"), Code: 2, Want: []string{"6 transmission zeros", "at most 4"}},
		{Args: with("--order", "4", "--topology", "ring"), Code: 2, Want: []string{`--topology "ring"`, "folded", "triplets", "quadruplets"}},
		{Args: with("--order", "4", "--topology", "triplets"), Code: 2, Want: []string{`--topology "triplets"`, "1 to 1 transmission zeros for order 4"}},
		{Args: with("--order", "7", "--zeros-norm", "1.8", "--delay-pairs", "1.2", "--topology", "triplets"), Code: 2, Want: []string{`--topology "triplets"`, "real-axis zero pairs need quadruplets"}},
		{Args: with("--reject", "40dB@10.1GHz", "--place-zeros", "--max-zeros", "99"), Code: 2, Want: []string{`--max-zeros "99"`, "between 1 and 28"}},
		{Args: with("--order", "4", "--max-zeros", "2"), Code: 2, Want: []string{"--max-zeros needs --place-zeros"}},
		{Args: with("--order", "4", "--reject", "40dB@10.1GHz", "--place-zeros"), Code: 2, Want: []string{"--place-zeros chooses the order", "--order"}},
		{Args: with("--place-zeros"), Code: 2, Want: []string{"--reject"}},
		{Args: []string{"--matrix", filepath.Join(dir, "none.cmx")}, Code: 2, Want: []string{"--matrix", "none.cmx", "cannot read the file"}},
		{Args: []string{"--matrix", bad}, Code: 2, Want: []string{"--matrix", "line 5", "already given on line 4"}},
		{Args: []string{"--matrix", wide}, Code: 2, Want: []string{"--matrix", "above 10 %"}},
		{Args: with("--matrix", bad), Code: 2, Want: []string{"--f0 cannot be combined with --matrix"}},
	})
}

func strconvFloat(f float64) string { return strconv.FormatFloat(f, 'g', 15, 64) }
