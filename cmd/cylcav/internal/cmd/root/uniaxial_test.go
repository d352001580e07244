package root_test

import (
	"encoding/json"
	"math"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
	"cylcav/physics"
)

// TestUniaxialFill: a uniaxial fill (--fill sapphire) gets uniaxial
// frequencies from modes and size, and every model that holds for
// isotropic fills only refuses it with exit status 2 before any output.
//
// The hand calculation (Krupka et al. 1999 values of the library row,
// recalled from memory; j_{0,1} = 2.404825558 and j'_{0,1} = 3.831705970
// from DLMF Table 10.21.1): TM010 of a 20 mm diameter sees eps_par alone,
// f = c j01 / (2 pi a sqrt(eps_par)); TE011 of a 20 x 12 mm cavity sees
// eps_perp alone, f = c sqrt((j'01/a)^2 + (pi/L)^2) / (2 pi sqrt(eps_perp)).
// TE011 and TM111 are no longer degenerate: TM111 sees eps_par too.
func TestUniaxialFill(t *testing.T) {
	const tol = 1e-9 // the 10-digit Bessel zeros
	const a, l, ep, ez = 0.010, 0.012, 9.3899, 11.5867
	c0 := physics.SpeedOfLight
	want := map[string]float64{
		"TM010": c0 * 2.404825558 / (2 * math.Pi * a * math.Sqrt(ez)),
		"TE011": c0 * math.Hypot(3.831705970/a, math.Pi/l) / (2 * math.Pi * math.Sqrt(ep)),
	}
	r := clitest.Run(t, "modes", "--diameter", "20mm", "--length", "12mm", "--fill", "sapphire", "--count", "12", "--format", "json")
	if r.Code != 0 {
		t.Fatalf("modes: exit %d: %s", r.Code, r.Stderr)
	}
	var out struct {
		Cavity struct {
			EpsR    float64 `json:"eps_r"`
			EpsRPar float64 `json:"eps_r_parallel"`
		} `json:"cavity"`
		Modes []struct {
			Mode           string   `json:"mode"`
			FHz            float64  `json:"f_hz"`
			DegenerateWith []string `json:"degenerate_with"`
		} `json:"modes"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
		t.Fatalf("modes JSON: %v\n%s", err, r.Stdout)
	}
	if out.Cavity.EpsR != ep || out.Cavity.EpsRPar != ez {
		t.Errorf("modes JSON cavity eps %g/%g, want %g/%g", out.Cavity.EpsR, out.Cavity.EpsRPar, ep, ez)
	}
	seen := 0
	for _, m := range out.Modes {
		if w, ok := want[m.Mode]; ok {
			seen++
			if math.Abs(m.FHz-w) > tol*w {
				t.Errorf("modes: %s at %.10g Hz, want %.10g Hz (by hand)", m.Mode, m.FHz, w)
			}
		}
		if len(m.DegenerateWith) != 0 {
			t.Errorf("modes: %s listed as degenerate with %v in a uniaxial fill", m.Mode, m.DegenerateWith)
		}
	}
	if seen != len(want) {
		t.Errorf("modes: found %d of the hand-calculated modes in\n%s", seen, r.Stdout)
	}
	// size inverts the same condition: TM010 at the hand frequency needs
	// the 10 mm radius back.
	r = clitest.Run(t, "size", "--mode", "TM010", "--freq", "3.3709GHz", "--length", "12mm", "--fill", "sapphire", "--format", "json")
	var sz struct {
		RadiusM float64 `json:"radius_m"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &sz); r.Code != 0 || err != nil {
		t.Fatalf("size: exit %d, %v: %s", r.Code, err, r.Stderr)
	}
	if wantR := a * want["TM010"] / 3.3709e9; math.Abs(sz.RadiusM-wantR) > tol*wantR {
		t.Errorf("size: radius %.10g m, want %.10g m", sz.RadiusM, wantR)
	}

	refuse := []string{"isotropic fills only"}
	clitest.CheckBadInput(t, "q", []clitest.BadCase{
		{Args: []string{"--diameter", "20mm", "--length", "12mm", "--fill", "sapphire", "--mode", "TM010", "--wall", "copper"}, Code: 2, Want: []string{"TE modes only"}},
	})
	clitest.CheckBadInput(t, "modes", []clitest.BadCase{
		{Args: []string{"--diameter", "20mm", "--length", "12mm", "--fill", "sapphire", "--wall", "copper"}, Code: 2, Want: refuse},
	})
	clitest.CheckBadInput(t, "chart", []clitest.BadCase{
		{Args: []string{"--fill", "sapphire", "-o", t.TempDir() + "/c.svg"}, Code: 2, Want: append(refuse, "mode chart")},
	})
	clitest.CheckBadInput(t, "design", []clitest.BadCase{
		{Args: []string{"--mode", "TE011", "--freq", "10GHz", "--fill", "sapphire", "--wall", "copper"}, Code: 2, Want: append(refuse, "optimiser")},
	})
	clitest.CheckBadInput(t, "clearance", []clitest.BadCase{
		{Args: []string{"--diameter", "20mm", "--length", "12mm", "--fill", "sapphire", "--mode", "TE011"}, Code: 2, Want: refuse},
	})
	clitest.CheckBadInput(t, "tune", []clitest.BadCase{
		{Args: []string{"--mode", "TE011", "--diameter", "20mm", "--length-range", "8mm:10mm", "--fill", "sapphire"}, Code: 2, Want: refuse},
	})
}
