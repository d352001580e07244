package filter_test

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	filtercmd "cylcav/cmd/cylcav/internal/cmd/filter"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/figure/rendertest"
	bandpass "cylcav/filter"
)

// Tolerances.
const (
	// relTol is the relative agreement of values that the command derives
	// from each other by one or two floating-point operations (k = FBW M,
	// Qext = 1/(FBW M^2), the frequency mapping round trip).
	relTol = 1e-12
	// cavityTol is the relative agreement of a printed cavity's resonant
	// frequency, recomputed from its printed D and L, with the frequency it
	// was sized for: the sizing solves to rounding (package cavity).
	cavityTol = 1e-9
	// touchstoneTol bounds ||S11|^2 + |S21|^2 - 1| of a lossless response
	// read back from a Touchstone file written with 12 significant digits.
	touchstoneTol = 1e-10
	// cohnTol is the relative agreement of Cohn's dissipation-loss estimate
	// with the exact response for an odd-order 0.01 dB Chebyshev filter
	// below 1 dB of loss: 1 % (filter.CohnLoss documentation; Cohn 1959
	// is first order in 1/Q0).
	cohnTol = 0.01
)

// run runs `cylcav filter args...` in-process.
func run(t testing.TB, args ...string) clitest.Result {
	t.Helper()
	return clitest.Run(t, append([]string{"filter"}, args...)...)
}

// mustRun runs `cylcav filter args...` and fails the test unless it
// succeeds.
func mustRun(t testing.TB, args ...string) string {
	t.Helper()
	r := run(t, args...)
	if r.Code != 0 {
		t.Fatalf("cylcav filter %s: exit %d, stderr %q", strings.Join(args, " "), r.Code, r.Stderr)
	}
	return r.Stdout
}

// The invented scenario of these tests: a channel filter for a 10 GHz
// beacon receiver, 200 MHz wide, 20 dB return loss, two transmission zeros,
// rejections of 40 dB at 10.25 GHz and 35 dB at 9.75 GHz.
var scenario = []string{"--f0", "10GHz", "--bw", "200MHz", "--return-loss", "20dB",
	"--reject", "40dB@10.25GHz,35dB@9.75GHz", "--zeros", "9.8GHz,10.18GHz"}

func args(extra ...string) []string { return append(slices.Clone(scenario), extra...) }

func decode(t *testing.T, out string) map[string]any {
	t.Helper()
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("output is not JSON: %v\n%s", err, out)
	}
	return m
}

func floats(t *testing.T, v any) []float64 {
	t.Helper()
	xs, ok := v.([]any)
	if !ok {
		t.Fatalf("%v is not a JSON array", v)
	}
	out := make([]float64, len(xs))
	for i, x := range xs {
		out[i] = x.(float64)
	}
	return out
}

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

func TestJSONKeys(t *testing.T) {
	m := decode(t, mustRun(t, args("--format", "json")...))
	for _, k := range []string{"order", "f0_hz", "bw_hz", "return_loss_db", "transmission_zeros_hz", "coupling_matrix",
		"k", "qext_in", "qext_out", "insertion_loss_db", "cavities", "spurious", "checks",
		"g", "cohn_insertion_loss_db", "convention", "notes", "pass", "warnings", "cross_couplings"} {
		if _, ok := m[k]; !ok {
			t.Errorf("JSON lacks key %q", k)
		}
	}
	n := int(m["order"].(float64))
	if n != 5 {
		t.Errorf("order = %d, want 5 (the smallest meeting the rejections; see filter.Spec.MinOrder)", n)
	}
	fbw := m["bw_hz"].(float64) / m["f0_hz"].(float64)
	rows := m["coupling_matrix"].([]any)
	if len(rows) != n+2 {
		t.Fatalf("coupling_matrix has %d rows, want N+2 = %d", len(rows), n+2)
	}
	M := make([][]float64, n+2)
	for i, r := range rows {
		M[i] = floats(t, r)
		if len(M[i]) != n+2 {
			t.Fatalf("coupling_matrix row %d has %d entries, want %d", i, len(M[i]), n+2)
		}
	}
	for i := range M {
		for j := range M {
			if M[i][j] != M[j][i] {
				t.Errorf("coupling_matrix[%d][%d] = %v, [%d][%d] = %v, want symmetric", i, j, M[i][j], j, i, M[j][i])
			}
		}
	}
	// k_{i,i+1} = FBW M_{i,i+1} and Qext = 1/(FBW M_S1^2) (Hong & Lancaster
	// 2001, sec. 8.1, with the normalisation of package filter).
	k := floats(t, m["k"])
	for i, v := range k {
		if want := fbw * M[i+1][i+2]; relErr(v, want) > relTol {
			t.Errorf("k[%d] = %v, want FBW*M = %v", i, v, want)
		}
	}
	if q, want := m["qext_in"].(float64), 1/(fbw*M[0][1]*M[0][1]); relErr(q, want) > relTol {
		t.Errorf("qext_in = %v, want 1/(FBW M_S1^2) = %v", q, want)
	}
	if q, want := m["qext_out"].(float64), 1/(fbw*M[n][n+1]*M[n][n+1]); relErr(q, want) > relTol {
		t.Errorf("qext_out = %v, want 1/(FBW M_NL^2) = %v", q, want)
	}
	zs := floats(t, m["transmission_zeros_hz"])
	if len(zs) != 2 || relErr(zs[0], 9.8e9) > relTol || relErr(zs[1], 10.18e9) > relTol {
		t.Errorf("transmission_zeros_hz = %v, want [9.8e9 10.18e9]", zs)
	}
	if c := m["cavities"].([]any); len(c) != 0 {
		t.Errorf("cavities = %v without --mode/--wall, want []", c)
	}
	if m["cohn_insertion_loss_db"] != nil {
		t.Errorf("cohn_insertion_loss_db = %v for a lossless design with zeros, want null", m["cohn_insertion_loss_db"])
	}
	checks := m["checks"].([]any)
	if len(checks) != 4 {
		t.Fatalf("%d checks, want return loss, ripple and two rejections", len(checks))
	}
	for _, c := range checks {
		c := c.(map[string]any)
		for _, key := range []string{"name", "required_db", "achieved_db", "pass", "stated"} {
			if _, ok := c[key]; !ok {
				t.Errorf("check %v lacks key %q", c, key)
			}
		}
	}
	if m["pass"] != true {
		t.Errorf("pass = %v for the lossless scenario, want true", m["pass"])
	}
	if notes := m["notes"].([]any); len(notes) == 0 || !strings.Contains(notes[0].(string), "field solver") {
		t.Errorf("notes = %v, want the field-solver note", notes)
	}
}

// TestCavities checks the realised cavities against the closed form of the
// TE011 resonance, f = c/(2 pi) sqrt((j'_01/a)^2 + (pi/L)^2) (Pozar,
// Microwave Engineering, 4th ed., sec. 6.4; j'_01 = 3.8317059702075123,
// DLMF Table 10.21.1, recalled from memory).
func TestCavities(t *testing.T) {
	m := decode(t, mustRun(t, args("--mode", "TE011", "--wall", "copper", "--format", "json")...))
	const c0 = 299792458.0 // m/s, exact (SI)
	const jp01 = 3.8317059702075123
	cavs := m["cavities"].([]any)
	if len(cavs) != int(m["order"].(float64)) {
		t.Fatalf("%d cavities, want one per resonator (%v)", len(cavs), m["order"])
	}
	q0 := m["q0"].([]any)
	for i, c := range cavs {
		c := c.(map[string]any)
		a, l, f := c["diameter_m"].(float64)/2, c["length_m"].(float64), c["f_hz"].(float64)
		got := c0 / (2 * math.Pi) * math.Hypot(jp01/a, math.Pi/l)
		if relErr(got, f) > cavityTol {
			t.Errorf("cavity %d: f(D = %v m, L = %v m) = %v Hz, want %v Hz", i+1, 2*a, l, got, f)
		}
		q, ok := c["q0"].(float64)
		// Copper TE011 near 10 GHz: Q0 of order 2e4..4e4 (common practice).
		if !ok || q < 1e4 || q > 6e4 {
			t.Errorf("cavity %d: q0 = %v, want a copper TE011 value near 3e4", i+1, c["q0"])
		}
		if q0[i].(float64) != q {
			t.Errorf("q0[%d] = %v, want the cavity's %v", i, q0[i], q)
		}
	}
	sp := m["spurious"].([]any)
	var companion, inStop bool
	for _, s := range sp {
		s := s.(map[string]any)
		companion = companion || (s["mode"] == "TM111" && s["companion"] == true)
		inStop = inStop || s["in_rejection_band"] == true
	}
	if !companion {
		t.Error("spurious list lacks the TM111 companion of TE011")
	}
	if !inStop {
		t.Error("no spurious mode flagged in a rejection band, want TE211 below 9.75 GHz among others")
	}
	// Lossy midband insertion loss above the lossless one.
	if il, il0 := m["insertion_loss_db"].(float64), m["lossless_insertion_loss_db"].(float64); !(il > il0) {
		t.Errorf("insertion_loss_db = %v, want above the lossless %v", il, il0)
	}
}

// TestCohn compares the midband loss of an odd-order all-pole filter with
// Cohn's estimate (S. B. Cohn, Proc. IRE 47 (1959) 1342).
func TestCohn(t *testing.T) {
	m := decode(t, mustRun(t, "--f0", "2.45GHz", "--bw", "80MHz", "--order", "5", "--ripple", "0.01dB", "--q0", "3000", "--format", "json"))
	il := m["insertion_loss_db"].(float64)
	il0 := m["lossless_insertion_loss_db"].(float64)
	cohn := m["cohn_insertion_loss_db"].(float64)
	if relErr(cohn-il0, il-il0) > cohnTol {
		t.Errorf("Cohn dissipation = %v dB, want the exact %v dB within %g", cohn-il0, il-il0, cohnTol)
	}
	// MYJ Table 4.05-2(a), n = 5, 0.01 dB ripple: 0.7563 1.3049 1.5773
	// (recalled from memory; the table is rounded to 4 decimals).
	g := floats(t, m["g"])
	for i, want := range []float64{1, 0.7563, 1.3049, 1.5773, 1.3049, 0.7563, 1} {
		if math.Abs(g[i]-want) > 1.5e-4 {
			t.Errorf("g%d = %v, want %v (MYJ)", i, g[i], want)
		}
	}
	if cs := m["cavities"].([]any); len(cs) != 0 {
		t.Errorf("cavities = %v with --q0 only, want []", cs)
	}
	for i, q := range m["q0"].([]any) {
		if q.(float64) != 3000 {
			t.Errorf("q0[%d] = %v, want 3000", i, q)
		}
	}
}

func TestTable(t *testing.T) {
	out := mustRun(t, args("--mode", "TE011", "--wall", "copper")...)
	for _, want := range []string{"Specification", "order N = 5 (the smallest that meets every rejection band)", "Transmission zeros",
		"Coupling matrix M, folded", "k1,2", "Qext in =", "insertion loss at f0", "Cavities: TE011",
		"Spurious modes", "exact companion", "Coupling realisation", "Specification check", "rejection from 10.2500 GHz",
		"Sign convention", "n azimuthal, m radial, p axial", filtercmd.FieldSolverNote} {
		if !strings.Contains(out, want) {
			t.Errorf("table output lacks %q", want)
		}
	}
	// The matrix rows are aligned: every row of the matrix block has the
	// same length.
	block := out[strings.Index(out, "Coupling matrix"):]
	lines := strings.Split(block, "\n")[1:9] // header + 7 rows (N = 5)
	for _, l := range lines[1:] {
		if len(l) != len(lines[0]) {
			t.Errorf("matrix row %q has length %d, header %d", l, len(l), len(lines[0]))
		}
	}
}

// readTouchstone parses a Touchstone 1.1 two-port file: it checks the
// comment lines, a single option line before the data, nine columns per
// data line and ascending frequencies, and returns the comment text and
// the data rows.
func readTouchstone(t *testing.T, b []byte) (comments string, rows [][9]float64) {
	t.Helper()
	sc := bufio.NewScanner(bytes.NewReader(b))
	option := ""
	for sc.Scan() {
		line := sc.Text()
		switch {
		case strings.HasPrefix(line, "!"):
			if option != "" {
				t.Errorf("comment after the option line: %q", line)
			}
			comments += line + "\n"
		case strings.HasPrefix(line, "#"):
			if option != "" {
				t.Errorf("second option line %q", line)
			}
			option = line
		default:
			if option == "" {
				t.Fatalf("data line %q before the option line", line)
			}
			fs := strings.Fields(line)
			if len(fs) != 9 {
				t.Fatalf("data line has %d columns, want 9: %q", len(fs), line)
			}
			var r [9]float64
			for i, f := range fs {
				v, err := strconv.ParseFloat(f, 64)
				if err != nil {
					t.Fatalf("data line %q: %v", line, err)
				}
				r[i] = v
			}
			if len(rows) > 0 && !(r[0] > rows[len(rows)-1][0]) {
				t.Fatalf("frequency %v does not ascend after %v", r[0], rows[len(rows)-1][0])
			}
			rows = append(rows, r)
		}
	}
	// Touchstone 1.1: "# <frequency unit> <parameter> <format> R <n>".
	if option != "# HZ S RI R 50" {
		t.Errorf("option line = %q, want \"# HZ S RI R 50\"", option)
	}
	return comments, rows
}

func TestTouchstone(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "ch1.s2p")
	mustRun(t, args("--touchstone", path, "--points", "401")...)
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	comments, rows := readTouchstone(t, b)
	if len(rows) != 401 {
		t.Errorf("%d data lines, want --points 401", len(rows))
	}
	for _, want := range []string{"field solver", "S21 = S12 = -2j", "unloaded Q0 per resonator: infinite"} {
		if !strings.Contains(comments, want) {
			t.Errorf("Touchstone comments lack %q", want)
		}
	}
	// Lossless and reciprocal: S12 = S21, |S11|^2 + |S21|^2 = 1 (energy
	// conservation).
	for _, r := range rows {
		if r[3] != r[5] || r[4] != r[6] {
			t.Fatalf("S12 != S21 at %v Hz", r[0])
		}
		if p := r[1]*r[1] + r[2]*r[2] + r[3]*r[3] + r[4]*r[4]; math.Abs(p-1) > touchstoneTol {
			t.Fatalf("|S11|^2 + |S21|^2 at %v Hz = %v, want 1", r[0], p)
		}
	}
	// The sweep is SweepRange(d, 3): Omega from -3 to +3 (no rejection or
	// zero lies beyond |Omega| = 3/1.15).
	lo, hi := rows[0][0], rows[len(rows)-1][0]
	if w := bandpass.LowpassOmega(lo, 10e9, 200e6); math.Abs(w+3) > 1e-9 {
		t.Errorf("first frequency at Omega = %v, want -3", w)
	}
	if w := bandpass.LowpassOmega(hi, 10e9, 200e6); math.Abs(w-3) > 1e-9 {
		t.Errorf("last frequency at Omega = %v, want 3", w)
	}
}

func TestPlotFiles(t *testing.T) {
	dir := t.TempDir()
	for _, name := range []string{"r.png", "r.svg", "r.pdf"} {
		path := filepath.Join(dir, name)
		out := mustRun(t, args("--plot", path, "--q0", "8000", "--dpi", "72")...)
		if !strings.Contains(out, "wrote "+path) {
			t.Errorf("output does not report writing %s", path)
		}
		b, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		switch filepath.Ext(name) {
		case ".png":
			rendertest.PNG(t, b, 576, 432) // 8 x 6 in at 72 dpi
		case ".svg":
			rendertest.SVG(t, b)
			if !bytes.Contains(b, []byte("field solver")) {
				t.Errorf("%s lacks the field-solver note", name)
			}
		case ".pdf":
			rendertest.PDF(t, b)
		}
	}
}

func TestDeterministic(t *testing.T) {
	dir := t.TempDir()
	a := args("--mode", "TE011", "--wall", "copper", "--touchstone", filepath.Join(dir, "f.s2p"),
		"--plot", filepath.Join(dir, "f.svg"), "--points", "101", "--force")
	out1 := mustRun(t, a...)
	s1, _ := os.ReadFile(filepath.Join(dir, "f.s2p"))
	p1, _ := os.ReadFile(filepath.Join(dir, "f.svg"))
	out2 := mustRun(t, a...)
	s2, _ := os.ReadFile(filepath.Join(dir, "f.s2p"))
	p2, _ := os.ReadFile(filepath.Join(dir, "f.svg"))
	if out1 != out2 {
		t.Error("two runs print different output")
	}
	if !bytes.Equal(s1, s2) || len(s1) == 0 {
		t.Error("two runs write different Touchstone files")
	}
	if !bytes.Equal(p1, p2) || len(p1) == 0 {
		t.Error("two runs write different plots")
	}
	j1 := mustRun(t, args("--format", "json")...)
	j2 := mustRun(t, args("--format", "json")...)
	if j1 != j2 {
		t.Error("two JSON runs differ")
	}
}

func TestBadInput(t *testing.T) {
	for _, c := range []struct {
		args []string
		want string // in the error line
	}{
		{[]string{"--f0", "10GHz", "--bw", "12GHz", "--order", "3"}, "--bw"},
		{[]string{"--f0", "10GHz", "--bw", "0Hz", "--order", "3"}, "--bw"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--zeros", "10.05GHz"}, "passband"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--zeros", "10.3GHz,10.4GHz,9.7GHz,9.6GHz"}, "at most 3"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "31"}, "between 1 and 30"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "0"}, "--order"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz"}, "--order N"},
		{[]string{"--bw", "200MHz", "--order", "3"}, "--f0"},
		{[]string{"--f0", "10Gz", "--bw", "200MHz", "--order", "3"}, "unknown unit"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--reject", "40dB@10.05GHz"}, "passband"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--reject", "40dB10.5GHz"}, "ATTENUATION@FREQUENCY"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--reject", "40dB@10.5Gz"}, "unknown unit"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--reject", "-3dB@10.5GHz"}, "attenuation"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--reject", "300dB@10.15GHz"}, "order above the maximum"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--return-loss", "20dB", "--ripple", "0.1dB"}, "not both"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--return-loss", "20dBm"}, "--return-loss"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--ripple", "5dB"}, "--ripple"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--response", "elliptic"}, "--response"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--response", "butterworth", "--zeros", "10.3GHz"}, "butterworth"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--span", "1"}, "--span"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--points", "1"}, "--points"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--q0", "1000", "--wall", "copper"}, "--q0"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--q0", "-5"}, "--q0"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--mode", "TE010"}, "--mode"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--wall", "unobtainium"}, "--wall"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--temperature", "20C"}, "--wall"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--holes", "top"}, "--holes"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--hole-thickness", "1mm"}, "--holes"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--format", "csv"}, "--format"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "abc"}, "--order"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--dpi", "5"}, "--dpi"},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--fill="}, `--fill ""`},
		{[]string{"--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--zeros", ""}, `--zeros ""`},
		{[]string{"--f0", "10GHz", "--bw", "", "--order", "3"}, `--bw ""`},
	} {
		dir := t.TempDir()
		ts, pl := filepath.Join(dir, "x.s2p"), filepath.Join(dir, "x.png")
		a := append(slices.Clone(c.args), "--touchstone", ts, "--plot", pl)
		r := run(t, a...)
		if r.Code != 2 {
			t.Errorf("cylcav filter %s: exit %d, want 2 (stderr %q)", strings.Join(c.args, " "), r.Code, r.Stderr)
			continue
		}
		if r.Stdout != "" {
			t.Errorf("cylcav filter %s printed %q on stdout, want nothing", strings.Join(c.args, " "), r.Stdout)
		}
		if strings.Count(r.Stderr, "\n") != 1 || !strings.Contains(r.Stderr, c.want) {
			t.Errorf("cylcav filter %s: stderr %q, want one line naming %q", strings.Join(c.args, " "), r.Stderr, c.want)
		}
		for _, p := range []string{ts, pl} {
			if _, err := os.Stat(p); err == nil {
				t.Errorf("cylcav filter %s wrote %s despite the error", strings.Join(c.args, " "), p)
			}
		}
	}
	// File names with the wrong extension.
	for _, c := range [][]string{{"--touchstone", "x.s3p"}, {"--plot", "x.gif"}, {"--touchstone", "same.s2p", "--plot", "same.s2p"}} {
		if r := run(t, args(c...)...); r.Code != 2 {
			t.Errorf("cylcav filter ... %s: exit %d, want 2 (%q)", strings.Join(c, " "), r.Code, r.Stderr)
		}
	}
}

func TestForce(t *testing.T) {
	dir := t.TempDir()
	ts, pl := filepath.Join(dir, "new.s2p"), filepath.Join(dir, "old.svg")
	if err := os.WriteFile(pl, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	r := run(t, args("--touchstone", ts, "--plot", pl)...)
	if r.Code != 2 || !strings.Contains(r.Stderr, "--force") {
		t.Errorf("existing plot without --force: exit %d, stderr %q; want 2 and a hint to --force", r.Code, r.Stderr)
	}
	if b, _ := os.ReadFile(pl); string(b) != "old" {
		t.Error("the existing plot was changed without --force")
	}
	if _, err := os.Stat(ts); err == nil {
		t.Error("the Touchstone file was written although the run was refused")
	}
	mustRun(t, args("--touchstone", ts, "--plot", pl, "--force")...)
	if b, _ := os.ReadFile(pl); !bytes.Contains(b, []byte("<svg")) {
		t.Error("--force did not replace the existing plot")
	}
	if _, err := os.Stat(ts); err != nil {
		t.Errorf("--force run did not write the Touchstone file: %v", err)
	}
	// A second path that cannot be written leaves nothing behind; a
	// missing directory is bad input, refused before anything is written.
	ts2 := filepath.Join(dir, "second.s2p")
	if r := run(t, args("--touchstone", ts2, "--plot", filepath.Join(dir, "missing", "p.svg"))...); r.Code != 2 {
		t.Errorf("plot into a missing directory: exit %d, want 2", r.Code)
	}
	if _, err := os.Stat(ts2); err == nil {
		t.Error("the Touchstone file was left behind after the plot failed")
	}
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if strings.HasPrefix(e.Name(), ".") {
			t.Errorf("temporary file %s left behind", e.Name())
		}
	}
}

func TestParse(t *testing.T) {
	var got *filtercmd.Options
	cmd := filtercmd.NewCmdFilter(cmdutil.Test(io.Discard, io.Discard), func(o *filtercmd.Options) error {
		got = o
		return nil
	})
	cmd.SetArgs([]string{"--f0", "10GHz", "--bw", "2%", "--order", "4", "--zeros", "10.3GHz", "--span", "5x", "--response", "Chebyshev"})
	cmd.SetOut(io.Discard)
	cmd.SetErr(io.Discard)
	if err := cmd.Execute(); err != nil {
		t.Fatal(err)
	}
	if got.Spec.BW != 0.02*10e9 {
		t.Errorf("--bw 2%% = %v Hz, want 2e8", got.Spec.BW)
	}
	if w := bandpass.LowpassOmega(10.3e9, 10e9, 2e8); got.Spec.Zeros[0] != w {
		t.Errorf("--zeros 10.3GHz = Omega %v, want LowpassOmega = %v", got.Spec.Zeros[0], w)
	}
	if got.Span != 5 || got.Points != filtercmd.DefaultPoints || got.Cavities {
		t.Errorf("span %v, points %d, cavities %v; want 5, %d, false", got.Span, got.Points, got.Cavities, filtercmd.DefaultPoints)
	}
}

// BenchmarkFilterCLI runs the whole command for a six-resonator filter with
// two zeros, copper TE011 cavities (D/L from the optimiser) and an SVG plot.
func BenchmarkFilterCLI(b *testing.B) {
	path := filepath.Join(b.TempDir(), "r.svg")
	a := []string{"--f0", "10GHz", "--bw", "200MHz", "--order", "6", "--return-loss", "20dB",
		"--zeros", "9.8GHz,10.18GHz", "--mode", "TE011", "--wall", "copper", "--plot", path, "--force"}
	b.ReportAllocs()
	for b.Loop() {
		if r := run(b, a...); r.Code != 0 {
			b.Fatalf("exit %d: %s", r.Code, r.Stderr)
		}
	}
}

// TestValidityWarnings checks that the filter realisation prints the
// library's validity warnings (qfactor.Validity, tested against independent
// routes there) once per kind, naming the first cavity: a lossy fill with
// Q_fill = 1/tan delta = 50 (Pozar sec. 6.3) and magnetic walls.
func TestValidityWarnings(t *testing.T) {
	v := decode(t, mustRun(t, "--f0", "10GHz", "--bw", "200MHz", "--order", "3", "--mode", "TE011",
		"--fill", "eps=2,tand=0.02", "--wall", "sigma=1e7,mur=50", "--format", "json"))
	ws := fmt.Sprint(v["warnings"])
	for _, w := range []string{"cavity 1: Q0 = ", "is not much greater than 1", "cavity 1: the wall metal given by its values has mu_r = 50", "(and 2 more of the cavities)"} {
		if !strings.Contains(ws, w) {
			t.Errorf("warnings %s lack %q", ws, w)
		}
	}
	if n := strings.Count(ws, "mu_r = 50"); n != 1 {
		t.Errorf("warnings %s mention mu_r = 50 %d times, want once", ws, n)
	}
}
