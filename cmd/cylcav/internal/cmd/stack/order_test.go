package stack_test

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/stack"
)

// TestOrderOne checks --order 1 on a closed cylinder of radius 20 mm and
// length 30 mm, one section: the order-1 resonances below 9 GHz are, in
// order, TE111, TM110 and TM111 at c x/(2 pi) sqrt((x/a)^2 + (p pi/d)^2)
// with x = j'_11 = 1.841183781340659 and j_11 = 3.831705970207512
// (A&S Tables 9.5 and 9.7, as recalled; Pozar, Microwave Engineering, 4th
// ed., sec. 6.4), to 1e-10, labelled with those modes, family "hybrid",
// n = 1 in the JSON; with --extrapolate the extrapolated values too.
func TestOrderOne(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "can.yaml")
	if err := os.WriteFile(file, []byte("sections:\n  - length: 30mm\n    radius: 20mm\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	const a, d, c = 0.020, 0.030, 299792458.0
	f := func(x float64, p int) float64 {
		return c / (2 * math.Pi) * math.Hypot(x/a, float64(p)*math.Pi/d)
	}
	want := []struct {
		label string
		f     float64
	}{
		{"TE111", f(1.841183781340659, 1)},
		{"TM110", f(3.831705970207512, 0)},
		{"TM111", f(3.831705970207512, 1)},
	}
	r := clitest.Run(t, "stack", file, "--fmax", "11GHz", "--order", "1", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	var out struct {
		Order      int         `json:"n"`
		Resonances []stack.Row `json:"resonances"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	if out.Order != 1 || len(out.Resonances) < len(want) {
		t.Fatalf("n = %d, %d resonances; want n = 1 and at least %d", out.Order, len(out.Resonances), len(want))
	}
	for i, w := range want {
		g := out.Resonances[i]
		if g.ContinuesFrom != w.label || g.Family != "hybrid" || math.Abs(g.FHz-w.f) > 1e-10*w.f {
			t.Errorf("#%d: %s %s %.12g Hz, want hybrid %s %.12g Hz (closed form)", i+1, g.Family, g.ContinuesFrom, g.FHz, w.label, w.f)
		}
	}
	// --extrapolate: no truncation error without steps, so the
	// extrapolated frequencies are the closed form too.
	ex := clitest.Run(t, "stack", file, "--fmax", "11GHz", "--order", "1", "--extrapolate", "--format", "json")
	if ex.Code != 0 {
		t.Fatalf("--extrapolate: exit %d: %s", ex.Code, ex.Stderr)
	}
	if err := json.Unmarshal([]byte(ex.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	for i, w := range want {
		g := out.Resonances[i]
		if g.FExtrapolatedHz == nil || math.Abs(*g.FExtrapolatedHz-w.f) > 1e-10*w.f {
			t.Errorf("--extrapolate #%d: %v, want %.12g Hz (closed form)", i+1, g.FExtrapolatedHz, w.f)
		}
	}
	tab := clitest.Run(t, "stack", file, "--fmax", "11GHz", "--order", "1")
	if tab.Code != 0 || !strings.Contains(tab.Stdout, "n = 1 resonances below") || !strings.Contains(tab.Stdout, "TM110") {
		t.Errorf("table: exit %d\n%s", tab.Code, tab.Stdout)
	}
}

// TestOrderRefused: with --order >= 1 the flags that need losses, fields
// or separate families exit 2 with one line naming the flag, as do a body
// with an open end or a coaxial section; a negative order is refused.
func TestOrderRefused(t *testing.T) {
	dir := t.TempDir()
	can := filepath.Join(dir, "can.yaml")
	coax := filepath.Join(dir, "coax.yaml")
	open := filepath.Join(dir, "open.yaml")
	for name, text := range map[string]string{
		can:  "sections:\n  - length: 30mm\n    radius: 20mm\n",
		coax: "sections:\n  - length: 30mm\n    radius: 20mm\n    inner_radius: 5mm\n",
		open: "end_b: pipe\nsections:\n  - length: 30mm\n    radius: 20mm\n  - length: 10mm\n    radius: 8mm\n",
	} {
		if err := os.WriteFile(name, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{can, "--wall", "copper"}, "--wall"},
		{[]string{can, "--beta", "1"}, "--beta"},
		{[]string{can, "--field-map", filepath.Join(dir, "m.png")}, "--field-map"},
		{[]string{can, "--bulb-diameter", "5mm", "--bulb-length", "5mm"}, "--bulb-diameter"},
		{[]string{can, "--family", "tm"}, "--family"},
		{[]string{coax}, "coaxial"},
		{[]string{open}, "open ends"},
	} {
		args := append([]string{"stack"}, tc.args...)
		args = append(args, "--fmax", "11GHz", "--order", "1")
		r := clitest.Run(t, args...)
		if r.Code != 2 || !strings.Contains(r.Stderr, tc.want) || strings.Count(strings.TrimSpace(r.Stderr), "\n") != 0 || r.Stdout != "" {
			t.Errorf("%v: exit %d, stderr %q, stdout %q; want exit 2, one line naming %s, no output", tc.args, r.Code, r.Stderr, r.Stdout, tc.want)
		}
	}
	if r := clitest.Run(t, "stack", can, "--fmax", "11GHz", "--order", "-1"); r.Code != 2 || !strings.Contains(r.Stderr, "--order") {
		t.Errorf("--order -1: exit %d, %q", r.Code, r.Stderr)
	}
}
