package filter_test

import (
	"encoding/json"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
)

// irisArgs is an invented 4-pole 10 GHz filter, 0.5 % wide, in TE011
// cavities on one axis with 0.5 mm walls.
var irisArgs = []string{"filter", "--f0", "10GHz", "--bw", "50MHz", "--order", "4", "--mode", "TE011", "--ratio", "1.2", "--iris-wall", "0.5mm"}

// TestIrisTable: the iris table lists both ports, the three irises and the
// corrected cavities, each with its method and verdict.
func TestIrisTable(t *testing.T) {
	r := clitest.Run(t, irisArgs...)
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	for _, want := range []string{"Irises and holes (TE011 cavities on one axis, walls 500.000 um, solver modes 40)",
		"S-1", "1-2", "2-3", "3-4", "4-L", "mode matching (axisymmetric pair)", "mode matching (open port)",
		"Cavities with the irises in place", "L corrected"} {
		if !strings.Contains(r.Stdout, want) {
			t.Errorf("output lacks %q:\n%s", want, r.Stdout)
		}
	}
}

// TestIrisJSON: the JSON form carries every coupling with its method,
// radius and verdict, the corrected cavities and the k-versus-radius curve.
func TestIrisJSON(t *testing.T) {
	r := clitest.Run(t, append(append([]string{}, irisArgs...), "--format", "json")...)
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	var out struct {
		Irises struct {
			Wall      float64 `json:"wall_m"`
			Couplings []struct {
				Kind    string   `json:"kind"`
				Method  string   `json:"method"`
				Radius  *float64 `json:"radius_m"`
				K       *float64 `json:"k_required"`
				Reached *float64 `json:"achieved"`
				Verdict string   `json:"verdict"`
			} `json:"couplings"`
			Cavities []struct {
				L     float64  `json:"length_m"`
				LC    *float64 `json:"corrected_length_m"`
				Valid bool     `json:"corrected_valid"`
			} `json:"cavities"`
			Curves []struct {
				Points []struct {
					R float64 `json:"radius_m"`
					K float64 `json:"k"`
				} `json:"points"`
			} `json:"k_radius_curves"`
		} `json:"irises"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	ir := out.Irises
	if ir.Wall != 0.0005 || len(ir.Couplings) != 5 || len(ir.Cavities) != 4 || len(ir.Curves) != 1 || len(ir.Curves[0].Points) < 2 {
		t.Fatalf("irises: %+v", ir)
	}
	for _, c := range ir.Couplings {
		if c.Radius == nil || c.Reached == nil || c.Verdict != "valid" || c.Method == "none" {
			t.Errorf("coupling %+v: want a valid realisation with its radius and achieved value", c)
			continue
		}
		if c.Kind == "main" && (c.K == nil || *c.Reached-*c.K > 1e-7**c.K || *c.K-*c.Reached > 1e-7**c.K) {
			t.Errorf("coupling %+v: achieved k differs from the required", c)
		}
	}
	for i, c := range ir.Cavities {
		// TE011 irises load the cavity (frequency falls), so the
		// corrected cavity is shorter.
		if !c.Valid || c.LC == nil || !(*c.LC < c.L) {
			t.Errorf("cavity %d: corrected length %v m (valid %v), want one below %g m", i+1, c.LC, c.Valid, c.L)
		}
	}
}

// TestIrisOutsideRangeNoNumber: a realisation outside its method's range
// prints no number (here the port irises of a 1 % wide filter through
// 2 mm walls detune the end cavities by more than iris.MaxShift): the
// radius is "-" in the table and null in JSON, and so are the corrected
// dimensions of the cavities they open into.
func TestIrisOutsideRangeNoNumber(t *testing.T) {
	args := []string{"filter", "--f0", "10GHz", "--bw", "100MHz", "--order", "4", "--mode", "TE011", "--ratio", "1.2", "--iris-wall", "2mm", "--format", "json"}
	r := clitest.Run(t, args...)
	if r.Code != 0 {
		t.Fatalf("exit %d: %s", r.Code, r.Stderr)
	}
	var out struct {
		Irises struct {
			Couplings []struct {
				Kind    string   `json:"kind"`
				Radius  *float64 `json:"radius_m"`
				Verdict string   `json:"verdict"`
				Reasons []string `json:"reasons"`
			} `json:"couplings"`
			Cavities []struct {
				LC    *float64 `json:"corrected_length_m"`
				Valid bool     `json:"corrected_valid"`
			} `json:"cavities"`
		} `json:"irises"`
	}
	if err := json.Unmarshal([]byte(r.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	ports := 0
	for _, c := range out.Irises.Couplings {
		if c.Kind != "port" {
			continue
		}
		ports++
		if c.Verdict != "outside_range" || c.Radius != nil || len(c.Reasons) == 0 {
			t.Errorf("port %+v: want outside_range with no radius and a reason", c)
		}
	}
	cv := out.Irises.Cavities
	if ports != 2 || len(cv) != 4 || cv[0].Valid || cv[0].LC != nil || cv[3].LC != nil || !cv[1].Valid || cv[1].LC == nil {
		t.Errorf("ports %d, cavities %+v: want no corrected length at the ends only", ports, cv)
	}
}

// TestIrisBadInput: the iris flags refuse bad values and combinations
// with one line and exit status 2.
func TestIrisBadInput(t *testing.T) {
	spec := []string{"--f0", "10GHz", "--bw", "100MHz", "--order", "3"}
	with := func(extra ...string) []string { return append(append([]string{}, spec...), extra...) }
	clitest.CheckBadInput(t, "filter", []clitest.BadCase{
		{Args: with("--iris-wall", "0mm"), Code: 2, Want: []string{`--iris-wall "0mm"`, "between"}},
		{Args: with("--iris-wall", "2"), Code: 2, Want: []string{`--iris-wall "2"`, "needs a unit"}},
		{Args: with("--iris-wall", "2mm", "--iris-modes", "2"), Code: 2, Want: []string{`--iris-modes "2"`, "between 4 and"}},
		{Args: with("--iris-modes", "60"), Code: 2, Want: []string{"--iris-modes needs --iris-wall"}},
		{Args: with("--iris-port-radius", "10mm"), Code: 2, Want: []string{"--iris-port-radius needs --iris-wall"}},
		{Args: with("--iris-wall", "2mm", "--mode", "TE111"), Code: 2, Want: []string{`--mode "TE111"`, "TE0mp or TM0mp"}},
		{Args: with("--iris-wall", "2mm", "--holes", "end"), Code: 2, Want: []string{"--holes", "--iris-wall", "not both"}},
	})
}
