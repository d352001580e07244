package design_test

import (
	"encoding/csv"
	"encoding/json"
	"strconv"
	"strings"
	"testing"

	"cylcav/cmd/cylcav/internal/clitest"
)

var cell = []string{"design", "--mode", "TM010", "--freq", "1.3GHz", "--wall", "niobium", "--superconducting", "--temperature", "2K",
	"--ratio-range", "1.5:1.6", "--hom-max", "4GHz", "--bunch-freq", "650MHz"}

// TestHOMTableFormats: the JSON and CSV forms of the mode table list the
// same modes with the same numbers (one library table, two printers).
func TestHOMTableFormats(t *testing.T) {
	j := clitest.Run(t, append(cell, "--format", "json")...)
	c := clitest.Run(t, append(cell, "--format", "csv", "--csv-table", "hom")...)
	if j.Code != 0 || c.Code != 0 {
		t.Fatalf("exit %d / %d: %s %s", j.Code, c.Code, j.Stderr, c.Stderr)
	}
	var out struct {
		Accelerator struct {
			HOMs []struct {
				Mode string  `json:"mode"`
				FHz  float64 `json:"f_hz"`
				Q0   float64 `json:"q0"`
			} `json:"hom"`
		} `json:"accelerator"`
		QSuperconducting *struct {
			QBCS float64 `json:"q_bcs"`
		} `json:"q_superconducting"`
	}
	if err := json.Unmarshal([]byte(j.Stdout), &out); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(strings.NewReader(c.Stdout)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	hs := out.Accelerator.HOMs
	if len(rows) != len(hs)+1 || len(hs) < 10 || out.QSuperconducting == nil {
		t.Fatalf("%d CSV rows for %d JSON modes (split %v)", len(rows), len(hs), out.QSuperconducting)
	}
	for i, h := range hs {
		f, _ := strconv.ParseFloat(rows[i+1][2], 64)
		if rows[i+1][0] != h.Mode || f != h.FHz {
			t.Errorf("row %d: CSV %v, JSON %+v", i, rows[i+1], h)
		}
	}
	clitest.CheckBadInput(t, "design", []clitest.BadCase{
		{Args: append(cell[1:], "--csv-table", "hom"), Code: 2, Want: []string{"--csv-table hom needs --format csv"}},
		{Args: []string{"--mode", "TM010", "--freq", "1.3GHz", "--format", "csv", "--csv-table", "hom"}, Code: 2, Want: []string{"--hom-max"}},
		{Args: append(cell[1:], "--format", "csv", "--csv-table", "modes"), Code: 2, Want: []string{"--csv-table", "tradeoff|hom"}},
	})
}
