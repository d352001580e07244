package report_test

import (
	"encoding/json"
	"fmt"
	"html"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/physics"
)

// cellFlags describe a 2 K superconducting TM010 cell in flags, the way a
// user asks for it (the invented scenario of the issue).
var cellFlags = []string{"--mode", "TM010", "--freq", "1.3GHz", "--wall", "niobium", "--superconducting", "--temperature", "2K",
	"--ratio-range", "1.5:1.6", "--gradient", "15MV/m", "--beam-current", "2mA", "--sync-phase", "-10deg",
	"--hom-max", "4GHz", "--bunch-freq", "650MHz", "--tolerance", "0.02mm", "--samples", "2000"}

var chartsRE = regexp.MustCompile(`\(HTML datasheet, (\d+) charts\)`)

// TestSuperconductingDatasheet writes the 2 K datasheet of a
// superconducting cell from flags, checks that it shows the figures of the
// same library call as `cylcav design --format json` (power, heat load,
// coupling, the mode table) with the cautions, opens it in headless
// Chromium (every chart laid out, no script error) and reads the PDF back
// with pdftotext.
func TestSuperconductingDatasheet(t *testing.T) {
	dir := t.TempDir()
	sheet, pdf := filepath.Join(dir, "cell.html"), filepath.Join(dir, "cell.pdf")
	r := clitest.Run(t, append([]string{"report", "-o", sheet, "--pdf", pdf}, cellFlags...)...)
	if r.Code != 0 {
		t.Fatalf("report: exit %d, stderr %q", r.Code, r.Stderr)
	}
	b, err := os.ReadFile(sheet)
	if err != nil {
		t.Fatal(err)
	}
	page := html.UnescapeString(string(b))
	d := clitest.Run(t, append([]string{"design", "--format", "json"}, cellFlags...)...)
	if d.Code != 0 {
		t.Fatalf("design: exit %d, stderr %q", d.Code, d.Stderr)
	}
	var out struct {
		Accelerator struct {
			DissipatedW float64 `json:"dissipated_w"`
			WallPlugW   float64 `json:"wall_plug_w"`
			Coupling    struct {
				QExt            float64 `json:"q_ext"`
				ForwardDetunedW float64 `json:"forward_detuned_w"`
			} `json:"beam_coupling"`
			HOMs []struct {
				Mode string `json:"mode"`
			} `json:"hom"`
		} `json:"accelerator"`
		Bench struct {
			WarmAirHz float64 `json:"f_warm_air_hz"`
		} `json:"bench"`
	}
	if err := json.Unmarshal([]byte(d.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	a := out.Accelerator
	for _, want := range []string{
		"Operating figures",
		"RF power dissipated", physics.FormatSI(a.DissipatedW, "W", 4),
		"Heat load at the 2.000 K bath", physics.FormatSI(a.WallPlugW, "W", 4),
		"External Q", fmt.Sprintf("%.4g", a.Coupling.QExt), physics.FormatSI(a.Coupling.ForwardDetunedW, "W", 4),
		"Frequency on the bench, in air", physics.FormatFrequency(out.Bench.WarmAirHz, 7),
		"BCS part", "Residual part", "quench guide", "field-emission guide", "guides, not limits",
		"cylcav stack --beta", "Radiation:", "Cryogenic operation", "R/Q⊥", "NEAR",
	} {
		if !strings.Contains(page, want) {
			t.Errorf("datasheet lacks %q", want)
		}
	}
	if len(a.HOMs) < 10 || strings.Count(page, "dipole</td>") == 0 {
		t.Errorf("mode table: %d modes in JSON, dipoles in the page: %d", len(a.HOMs), strings.Count(page, "dipole</td>"))
	}

	// In Chromium: every chart has a size and no error is logged.
	if _, err := exec.LookPath(chromium); err != nil {
		t.Log("chromium not found on PATH: the browser check is skipped (install the Debian package chromium)")
	} else {
		m := chartsRE.FindStringSubmatch(r.Stdout)
		if m == nil {
			t.Fatalf("report output %q names no chart count", r.Stdout)
		}
		got := runProbe(t, dir, "probe.html", string(b))
		if got[0] != m[1] || got[1] != "0" || got[2] != "[]" {
			t.Errorf("in Chromium: %s SVG charts, %s without visible size, errors %s; want %s, 0, []", got[0], got[1], got[2], m[1])
		}
	}

	// The PDF carries the same section.
	if _, err := exec.LookPath("pdftotext"); err != nil {
		t.Log("pdftotext not found: the PDF text check is skipped (install poppler-utils)")
		return
	}
	txt, err := exec.Command("pdftotext", pdf, "-").Output()
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"Operating figures", "Heat load at the 2.000 K bath", "External Q", "Monopole and dipole modes"} {
		if !strings.Contains(string(txt), want) {
			t.Errorf("PDF text lacks %q", want)
		}
	}
}

// TestCellDemo: --demo cell reports the built-in invented cell scenario.
func TestCellDemo(t *testing.T) {
	sheet := filepath.Join(t.TempDir(), "cell.html")
	r := clitest.Run(t, "report", "--demo", "cell", "-o", sheet)
	if r.Code != 0 || !strings.Contains(r.Stdout, "demo scenario, TM010 at 1.300000 GHz") {
		t.Fatalf("report --demo cell: exit %d, stdout %q, stderr %q", r.Code, r.Stdout, r.Stderr)
	}
	b, _ := os.ReadFile(sheet)
	if !strings.Contains(string(b), "fictional Harrow Fen") {
		t.Error("the cell demo datasheet does not carry its title")
	}
}

// TestAccelBadInput: the superconducting and accelerator flags refuse bad
// values and combinations with one line and exit status 2.
func TestAccelBadInput(t *testing.T) {
	o := filepath.Join(t.TempDir(), "x.html")
	base := []string{"-o", o, "--mode", "TM010", "--freq", "1.3GHz", "--wall", "niobium"}
	with := func(extra ...string) []string { return append(append([]string{}, base...), extra...) }
	clitest.CheckBadInput(t, "report", []clitest.BadCase{
		{Args: with("--superconducting"), Code: 2, Want: []string{"--superconducting needs the wall temperature"}},
		{Args: with("--superconducting", "--temperature", "8K"), Code: 2, Want: []string{"--temperature", "Tc/2"}},
		{Args: []string{"-o", o, "--mode", "TM010", "--freq", "1.3GHz", "--wall", "copper", "--superconducting", "--temperature", "2K"}, Code: 2, Want: []string{"--wall", "niobium"}},
		{Args: with("--temperature", "2K", "--operating-temp", "2K"), Code: 2, Want: []string{"same set-point"}},
		{Args: with("--residual", "5nohm"), Code: 2, Want: []string{"--residual needs --superconducting"}},
		{Args: with("--beam-current", "1mA"), Code: 2, Want: []string{"--beam-current needs --gradient"}},
		{Args: with("--gradient", "15"), Code: 2, Want: []string{"--gradient", "no unit"}},
		{Args: with("--gradient", "15MV/m", "--beam-current", "1mA", "--sync-phase", "95deg"), Code: 2, Want: []string{"--sync-phase"}},
		{Args: with("--particle-speed", "1.2"), Code: 2, Want: []string{"--particle-speed", "between"}},
		{Args: with("--bunch-freq", "650MHz"), Code: 2, Want: []string{"--bunch-freq needs --hom-max"}},
		{Args: []string{"-o", o, "--mode", "TE011", "--freq", "10GHz", "--wall", "copper", "--gradient", "5MV/m"}, Code: 2, Want: []string{"TM0mp"}},
		{Args: []string{"-o", o, "--demo", "nope"}, Code: 2, Want: []string{"--demo", "link or cell"}},
		{Args: []string{"-o", o, "--demo", "cell", "--mode", "TM010"}, Code: 2, Want: []string{"--demo takes no other"}},
	})
	if _, err := os.Stat(o); err == nil {
		t.Error("a refused request left an output file")
	}
}
