package stack_test

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/cmd/cylcav/internal/cmd/stack"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/figure/rendertest"
	"cylcav/qfactor"
)

// inRepo runs the test from the repository root so the examples/ paths
// of the help text resolve.
func inRepo(t *testing.T) {
	t.Helper()
	t.Chdir(filepath.Join("..", "..", "..", "..", ".."))
}

func TestExamples(t *testing.T) {
	inRepo(t)
	// The field-map example writes reentrant.svg in the working directory.
	t.Cleanup(func() { os.Remove("reentrant.svg") })
	cmd := stack.NewCmdStack(&cmdutil.IOStreams{}, nil)
	clitest.CheckExamples(t, cmd.Example)
	for _, f := range []string{"iris-pair", "disc-in-can", "nosed-cell"} {
		if r := clitest.Run(t, "stack", "examples/"+f+".yaml", "--fmax", "12GHz"); r.Code != 0 {
			t.Errorf("examples/%s.yaml: exit %d, %s", f, r.Code, r.Stderr)
		}
	}
	// The layered puck: its TE01-delta-like resonance (axisym's
	// TestPuckFiniteDifference checks the value).
	if r := clitest.Run(t, "stack", "examples/puck-in-can.yaml", "--fmax", "5GHz"); r.Code != 0 || !strings.Contains(r.Stdout, "4.5150718") {
		t.Errorf("examples/puck-in-can.yaml: exit %d, %s%s", r.Code, r.Stdout, r.Stderr)
	}
}

// TestOneSectionJSON checks the command end to end on a closed cylinder:
// the frequencies must be package cavity's closed forms (Pozar, Microwave
// Engineering, 4th ed., sec. 6.4) and the labels the modes themselves.
func TestOneSectionJSON(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "can.yaml")
	if err := os.WriteFile(file, []byte("sections:\n  - length: 30mm\n    radius: 20mm\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	r := clitest.Run(t, "stack", file, "--fmax", "14GHz", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	var out struct {
		Resonances []stack.Row `json:"resonances"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	c := cavity.Cavity{Radius: 0.02, Length: 0.03}
	if len(out.Resonances) == 0 {
		t.Fatal("no resonances")
	}
	for _, row := range out.Resonances {
		m, err := cavity.ParseMode(row.ContinuesFrom)
		if err != nil {
			t.Fatal(err)
		}
		want := c.Frequency(m)
		if d := (row.FHz - want) / want; d > 1e-10 || d < -1e-10 {
			t.Errorf("%s: f = %.12g Hz, want %.12g Hz (closed form)", row.ContinuesFrom, row.FHz, want)
		}
	}
}

func TestBadInput(t *testing.T) {
	dir := t.TempDir()
	write := func(name, text string) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	good := write("good.yaml", "sections:\n  - length: 30mm\n    radius: 20mm\n")
	reentrant, err := filepath.Abs(filepath.Join("..", "..", "..", "..", "..", "examples", "reentrant.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	fed, err := filepath.Abs(filepath.Join("..", "..", "..", "..", "..", "examples", "fed-cell.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name, text string
		want       []string
	}{
		{"unknown.yaml", "sections:\n  - length: 30mm\n    radius: 20mm\n    colour: red\n", []string{"unknown.yaml:4", "sections[1].colour", "unknown key"}},
		{"top.yaml", "sectons:\n  - length: 30mm\n", []string{"top.yaml:1", "sectons", "unknown key"}},
		{"zero.yaml", "sections:\n  - length: 0mm\n    radius: 20mm\n", []string{"zero.yaml:2", "sections[1].length", "> 0"}},
		{"neg.yaml", "sections:\n  - length: 3mm\n    radius: -20mm\n", []string{"neg.yaml:3", "sections[1].radius"}},
		{"inner.yaml", "sections:\n  - length: 3mm\n    radius: 2mm\n    inner_radius: 2mm\n", []string{"inner.yaml:2", "inner_radius", "below the radius"}},
		{"overlap.yaml", "sections:\n  - length: 3mm\n    radius: 2mm\n  - length: 3mm\n    radius: 4mm\n    start: 2mm\n", []string{"overlap.yaml:6", "sections[2].start", "overlaps"}},
		{"gap.yaml", "sections:\n  - length: 3mm\n    radius: 2mm\n  - length: 3mm\n    radius: 4mm\n    start: 4mm\n", []string{"gap.yaml:6", "gap"}},
		{"material.yaml", "sections:\n  - length: 3mm\n    radius: 2mm\n    fill: unobtainium\n", []string{"material.yaml:4", "sections[1].fill", "unknown dielectric"}},
		{"unit.yaml", "sections:\n  - length: 3 furlong\n    radius: 2mm\n", []string{"unit.yaml:2", "sections[1].length"}},
		{"dup.yaml", "sections:\n  - length: 3mm\n    length: 4mm\n    radius: 2mm\n", []string{"dup.yaml:3", "given twice"}},
		{"missing.yaml", "sections:\n  - length: 3mm\n", []string{"missing.yaml:2", "sections[1].radius", "missing"}},
		{"yaml.yaml", "sections: [\n", []string{"yaml.yaml:", "not valid YAML"}},
		{"layerkey.yaml", "sections:\n  - length: 5mm\n    radius: 12mm\n    layers:\n      - {radius: 6mm, fil: eps=38}\n", []string{"layerkey.yaml:5", "sections[1].layers[1].fil", "unknown key"}},
		{"layerlast.yaml", "sections:\n  - length: 5mm\n    radius: 12mm\n    layers:\n      - {radius: 6mm, fill: eps=38}\n      - {radius: 11mm}\n", []string{"layerlast.yaml:2", "layer 2", "section radius"}},
		{"layerorder.yaml", "sections:\n  - length: 5mm\n    radius: 12mm\n    layers:\n      - {radius: 6mm}\n      - {radius: 5mm}\n      - {radius: 12mm}\n", []string{"layerorder.yaml:2", "layer 2", "above the previous layer"}},
		{"layermat.yaml", "sections:\n  - length: 5mm\n    radius: 12mm\n    layers:\n      - {radius: 6mm, fill: unobtainium}\n      - {radius: 12mm}\n", []string{"layermat.yaml:5", "layers[1].fill", "unknown dielectric"}},
		{"layerradius.yaml", "sections:\n  - length: 5mm\n    radius: 12mm\n    layers:\n      - {fill: eps=3}\n", []string{"layerradius.yaml:5", "layers[1].radius", "missing"}},
		{"layeropen.yaml", "end_b: pipe\nsections:\n  - length: 5mm\n    radius: 12mm\n    layers:\n      - {radius: 6mm, fill: eps=38}\n      - {radius: 12mm}\n", []string{"layeropen.yaml", "radial layers in a body with an open end", "not implemented"}},
		{"coax.yaml", "sections:\n  - length: 30mm\n    radius: 20mm\n    inner_radius: 5mm\n  - length: 30mm\n    radius: 25mm\n    inner_radius: 8mm\n", []string{"coax.yaml", "sections 1 and 2", "not implemented"}},
		// Found by the user pass: a bare number was read as metres (30
		// for 30 mm made a 30 m body), unlike every length flag; a second
		// YAML document was ignored; a body too large for --fmax failed
		// with status 1 and an internal frequency.
		{"bare.yaml", "sections:\n  - length: 30\n    radius: 20mm\n", []string{"bare.yaml:2", "sections[1].length", "needs a unit", "30mm"}},
		{"barelayer.yaml", "sections:\n  - length: 5mm\n    radius: 12mm\n    layers:\n      - {radius: 0.006, fill: eps=38}\n      - {radius: 12mm}\n", []string{"barelayer.yaml:5", "layers[1].radius", "needs a unit"}},
		{"barestart.yaml", "sections:\n  - length: 3mm\n    radius: 2mm\n  - length: 3mm\n    radius: 4mm\n    start: 0.003\n", []string{"barestart.yaml:6", "sections[2].start", "needs a unit"}},
		{"twodocs.yaml", "sections:\n  - length: 30mm\n    radius: 20mm\n---\nsections:\n  - length: 3mm\n    radius: 2mm\n", []string{"twodocs.yaml:4", "second YAML document"}},
		{"huge.yaml", "sections:\n  - length: 3m\n    radius: 2m\n", []string{`--fmax "10GHz"`, "too high for", "huge.yaml", "more than 1000"}},
		{"platea.yaml", "end_a: pipe\nwalls:\n  side: copper\n  plate_a: silver\nsections:\n  - length: 10mm\n    radius: 20mm\n  - length: 40mm\n    radius: 18mm\n", []string{"platea.yaml:4", "walls.plate_a", "end_a is a pipe"}},
	}
	var bad []clitest.BadCase
	for _, c := range cases {
		bad = append(bad, clitest.BadCase{Args: []string{write(c.name, c.text), "--fmax", "10GHz"}, Code: 2, Want: c.want})
	}
	bad = append(bad,
		clitest.BadCase{Args: []string{good}, Code: 2, Want: []string{"--fmax"}},
		clitest.BadCase{Args: []string{good, "--fmax", "-1GHz"}, Code: 2, Want: []string{"--fmax"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--family", "hybrid"}, Code: 2, Want: []string{"--family", "te, tm or both"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--modes", "1"}, Code: 2, Want: []string{"--modes"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--beta", "0"}, Code: 2, Want: []string{"--beta", "between 0.001 and 1"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--beta", "0x1p-1"}, Code: 2, Want: []string{"--beta", "0x1p-1"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--field-map", "m.svg", "--map", "0"}, Code: 2, Want: []string{"--map", "between 1 and"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10"}, Code: 2, Want: []string{"--fmax", "needs a unit"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--modes", "010"}, Code: 2, Want: []string{"--modes", "decimal"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--field-map", filepath.Join(dir, "m.bmp")}, Code: 2, Want: []string{"--field-map"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--field-map", filepath.Join(dir, "m.svg"), "--map", "0"}, Code: 2, Want: []string{"--map"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--field-map", filepath.Join(dir, "m.svg"), "--map", "99"}, Code: 2, Want: []string{"--map", "resonances below --fmax"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--map", "2"}, Code: 2, Want: []string{"--map needs --field-map"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--extrapolate", "--modes", "300"}, Code: 2, Want: []string{"--modes", "--extrapolate"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--pair", "1"}, Code: 2, Want: []string{"--pair", "I,J"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--pair", "2,2"}, Code: 2, Want: []string{"--pair", "two different"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--pair", "1,99"}, Code: 2, Want: []string{"--pair", "resonances below --fmax"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--pair", "1,2", "--format", "csv"}, Code: 2, Want: []string{"--pair", "json"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--wall", "unobtainium"}, Code: 2, Want: []string{"--wall"}},
		clitest.BadCase{Args: []string{filepath.Join(dir, "nofile.yaml"), "--fmax", "10GHz"}, Code: 2, Want: []string{"nofile.yaml"}},
		clitest.BadCase{Args: []string{}, Code: 2, Want: []string{"one geometry file"}},
		// Found by the user pass: an empty --field-map was taken as none;
		// a plate metal for a pipe end was ignored; --beta on a body with
		// an inner conductor gave only dashes; --fmax too high for the
		// body was status 1; a percent limit read 9.999999999999999e-05%.
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--field-map", ""}, Code: 2, Want: []string{`--field-map ""`, "empty file name"}},
		clitest.BadCase{Args: []string{fed, "--fmax", "10.5GHz", "--wall", "copper", "--end-wall-a", "silver"}, Code: 2, Want: []string{"--end-wall-a", "end_a is a pipe"}},
		clitest.BadCase{Args: []string{reentrant, "--fmax", "6GHz", "--beta", "1"}, Code: 2, Want: []string{"--beta needs a free axis", "section 1", "inner conductor"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10THz"}, Code: 2, Want: []string{`--fmax "10THz"`, "too high for", "lower the maximum frequency"}},
		clitest.BadCase{Args: []string{good, "--fmax", "10GHz", "--bunch-freq", "650MHz", "--harmonic-window", "0%"}, Code: 2, Want: []string{`--harmonic-window "0%"`, "between 0.0001% and 10%"}},
	)
	clitest.CheckBadInput(t, "stack", bad)
	if r := clitest.Run(t, "stack", good, "--fmax", "10GHz", "--format", "csv"); r.Code != 0 || !strings.HasPrefix(r.Stdout, "index,family,family_index,f_hz") {
		t.Errorf("csv: exit %d, %q", r.Code, r.Stdout)
	}
}

// TestOneSectionQ0 checks --wall on a closed cylinder against package
// qfactor's closed-form wall Q (Harrington 1961 ch. 5; Pozar 2012 sec.
// 6.4) with the same surface resistance.
func TestOneSectionQ0(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "can.yaml")
	if err := os.WriteFile(file, []byte("sections:\n  - length: 30mm\n    radius: 20mm\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	r := clitest.Run(t, "stack", file, "--fmax", "12GHz", "--wall", "sigma=5.8e7", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	var out struct {
		Resonances []stack.Row `json:"resonances"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	c := cavity.Cavity{Radius: 0.02, Length: 0.03}
	for _, row := range out.Resonances {
		m, err := cavity.ParseMode(row.ContinuesFrom)
		if err != nil {
			t.Fatal(err)
		}
		f := c.Frequency(m)
		rs := qfactor.SurfaceResistance(f, 5.8e7, 1)
		want, err := qfactor.WallQ(c, m, qfactor.Uniform(rs))
		if err != nil {
			t.Fatal(err)
		}
		if row.Q0 == nil || math.Abs(*row.Q0-want.QWall)/want.QWall > 1e-9 {
			t.Errorf("%s: q0 = %v, want %.10g (closed form)", row.ContinuesFrom, row.Q0, want.QWall)
		}
	}
}

// TestBetaColumns checks that --beta adds the labelled R/Q columns for
// TM0 rows only (the values are tested in package axisym against the
// pillbox closed forms).
func TestBetaColumns(t *testing.T) {
	inRepo(t)
	r := clitest.Run(t, "stack", "examples/nosed-cell.yaml", "--fmax", "7GHz", "--beta", "1", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	var out struct {
		Resonances []stack.Row `json:"resonances"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	for _, row := range out.Resonances {
		has := row.RoverQLinac != nil && row.RoverQCircuit != nil && row.T != nil
		if has != (row.Family == "TM0") {
			t.Errorf("%s #%d: R/Q given %v, want it for TM0 only", row.Family, row.Index, has)
		}
		if has && math.Abs(*row.RoverQCircuit-*row.RoverQLinac/2) > 1e-12**row.RoverQLinac {
			t.Errorf("circuit R/Q %g, want half the linac value %g", *row.RoverQCircuit, *row.RoverQLinac)
		}
	}
}

// TestFieldMapFile checks that --field-map writes a valid image (the map's
// numbers are tested in package axisymplot) and refuses to replace a file
// without --force.
func TestFieldMapFile(t *testing.T) {
	inRepo(t)
	out := filepath.Join(t.TempDir(), "map.svg")
	r := clitest.Run(t, "stack", "examples/reentrant.yaml", "--fmax", "4GHz", "--field-map", out)
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	b, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	rendertest.SVG(t, b)
	if r := clitest.Run(t, "stack", "examples/reentrant.yaml", "--fmax", "4GHz", "--field-map", out); r.Code != 2 {
		t.Errorf("second write without --force: exit %d, want 2", r.Code)
	}
}

// TestPairJSON checks --pair on the iris-pair example: k must be the
// coupling coefficient of the two printed frequencies by the direct formula
// (Hong and Lancaster 2001, sec. 8.2), the pair's change must be small
// against k, and a pair from two families is refused.
func TestPairJSON(t *testing.T) {
	inRepo(t)
	r := clitest.Run(t, "stack", "examples/iris-pair.yaml", "--fmax", "12GHz", "--family", "te", "--pair", "2,1", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	var out struct {
		Resonances []stack.Row    `json:"resonances"`
		Coupling   *stack.PairRow `json:"coupling"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	if out.Coupling == nil || len(out.Resonances) < 2 {
		t.Fatalf("no coupling in %s", r.Stdout)
	}
	f1, f2 := out.Resonances[0].FHz, out.Resonances[1].FHz
	want := (f2*f2 - f1*f1) / (f2*f2 + f1*f1)
	// 1e-9: the squares' difference cancels about five digits of f.
	if c := out.Coupling; math.Abs(c.K-want) > 1e-9*want || c.KChange == nil || *c.KChange > 1e-2*c.K || c.Family != "TE0" {
		t.Errorf("coupling %+v, want k = %.10g from f = %.12g, %.12g Hz", *c, want, f1, f2)
	}
	if r := clitest.Run(t, "stack", "examples/iris-pair.yaml", "--fmax", "12GHz", "--pair", "6,7"); r.Code != 2 || !strings.Contains(r.Stderr, "--pair") {
		t.Errorf("a TM0/TE0 pair: exit %d, %s", r.Code, r.Stderr)
	}
}

// TestExtrapolateJSON checks --extrapolate end to end on a closed cylinder,
// where the extrapolation must keep package cavity's closed forms (Pozar,
// Microwave Engineering, 4th ed., sec. 6.4) to 1e-10 with no order (the
// models agree), and on the nosed cell, where every row carries an
// estimate smaller than its plain change (the extrapolation gains).
func TestExtrapolateJSON(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "can.yaml")
	if err := os.WriteFile(file, []byte("sections:\n  - length: 30mm\n    radius: 20mm\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	run := func(args ...string) []stack.Row {
		r := clitest.Run(t, append([]string{"stack"}, append(args, "--extrapolate", "--format", "json")...)...)
		if r.Code != 0 {
			t.Fatalf("exit %d: %s", r.Code, r.Stderr)
		}
		var out struct {
			Resonances []stack.Row `json:"resonances"`
		}
		if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
			t.Fatal(err)
		}
		if len(out.Resonances) == 0 {
			t.Fatal("no resonances")
		}
		return out.Resonances
	}
	c := cavity.Cavity{Radius: 0.02, Length: 0.03}
	for _, row := range run(file, "--fmax", "12GHz") {
		m, err := cavity.ParseMode(row.ContinuesFrom)
		if err != nil {
			t.Fatal(err)
		}
		want := c.Frequency(m)
		if row.FExtrapolatedHz == nil || math.Abs(*row.FExtrapolatedHz-want) > 1e-10*want || row.ExtrapolationOrder != nil {
			t.Errorf("%s: extrapolated %v (order %v), want %.12g Hz (closed form)", row.ContinuesFrom, row.FExtrapolatedHz, row.ExtrapolationOrder, want)
		}
	}
	inRepo(t)
	for _, row := range run("examples/nosed-cell.yaml", "--fmax", "9GHz") {
		if row.ExtrapolationErrorHz == nil || row.ChangeHz == nil || *row.ExtrapolationErrorHz >= *row.ChangeHz {
			t.Errorf("#%d: extrapolation error %v, change %v", row.Index, row.ExtrapolationErrorHz, row.ChangeHz)
		}
	}
}

// TestExtrapolateRadiating: with --extrapolate a radiating resonance of an
// open body shows "-" (not extrapolated: Extrapolate works on the real,
// trapped model), not "irregular", which would claim the three models
// were tried and did not converge (found by the user pass).
func TestExtrapolateRadiating(t *testing.T) {
	inRepo(t)
	r := clitest.Run(t, "stack", "examples/fed-cell.yaml", "--fmax", "10.5GHz", "--family", "te", "--extrapolate")
	if r.Code != 0 || !strings.Contains(r.Stdout, "radiating resonances are not extrapolated") {
		t.Fatalf("exit %d: %s%s", r.Code, r.Stdout, r.Stderr)
	}
	for _, line := range strings.Split(r.Stdout, "\n") {
		if strings.Contains(line, "radiating  ") && strings.Contains(line, "irregular") {
			t.Errorf("radiating row claims an irregular extrapolation: %q", line)
		}
	}
}

// TestPuckFields checks that a body with radially layered sections gets
// its fields: Q0 with its breakdown per filled region, a field map and a
// bulb's filling factors. The values are checked in package axisym (the
// rod against mpmath, the puck's p_e against Slater's perturbation
// relation); here the assembly: Q0 from the wall and region Qs, the
// puck's p_e of the TE01-delta-like mode (axisym's
// TestPuckFillingPerturbation: 0.97983547), and p_e over the regions
// below 1.
func TestPuckFields(t *testing.T) {
	inRepo(t)
	dir := t.TempDir()
	r := clitest.Run(t, "stack", "examples/puck-in-can.yaml", "--fmax", "9GHz", "--wall", "copper", "--format", "json",
		"--bulb-diameter", "4mm", "--bulb-length", "4mm", "--field-map", filepath.Join(dir, "puck.png"), "--map", "1")
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	var out struct {
		Resonances []stack.Row `json:"resonances"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	if len(out.Resonances) != 5 {
		t.Fatalf("%d resonances, want 5", len(out.Resonances))
	}
	for _, row := range out.Resonances {
		if row.Q0 == nil || row.QWall == nil || row.QFill == nil || row.Bulb == nil || len(row.Dielectrics) != 2 {
			t.Fatalf("#%d: Q0 %v, Q wall %v, Q fill %v, bulb %v, regions %+v, note %q", row.Index, row.Q0, row.QWall, row.QFill, row.Bulb, row.Dielectrics, row.QNote)
		}
		inv := 1 / *row.QWall
		var pe float64
		for _, d := range row.Dielectrics {
			inv += 1 / *d.Q
			pe += d.FillE
		}
		if math.Abs(*row.Q0*inv-1) > 1e-12 || pe >= 1 {
			t.Errorf("#%d: Q0 %g, want 1/(1/Q wall + sum 1/Q region) = %g; p_e sum %g", row.Index, *row.Q0, 1/inv, pe)
		}
	}
	if d := out.Resonances[0].Dielectrics[1]; d.Section != 2 || d.Layer != 1 || math.Abs(d.FillE-0.97983547) > 1e-8 {
		t.Errorf("#1: puck region %+v, want section 2 layer 1 with p_e 0.97983547", d)
	}
	if st, err := os.Stat(filepath.Join(dir, "puck.png")); err != nil || st.Size() == 0 {
		t.Errorf("field map: %v", err)
	}
}
