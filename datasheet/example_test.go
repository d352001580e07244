package datasheet_test

import (
	"bytes"
	"fmt"
	"strings"

	"cylcav/datasheet"
)

// A datasheet of any kind is sections of blocks; here an invented
// two-resonator filter, rendered to HTML (the section headings shown).
func ExampleSheet_WriteHTML() {
	k := datasheet.Table{Caption: "Coupling coefficients", Header: []string{"Pair", "k"}, Rows: [][]string{{"1–2", "0.0231"}}}
	sh := &datasheet.Sheet{
		Version: "0.1.0", Kind: "Filter datasheet", Title: "Two-pole 6 GHz filter", Headline: "f0 = 6 GHz, bw = 120 MHz",
		Sections: []datasheet.Section{
			{Heading: "Couplings", Blocks: []datasheet.Block{{Table: &k}, {Note: "k = FBW M"}}},
			{Heading: "Cautions", Blocks: []datasheet.Block{{List: &datasheet.List{Class: "safety", Items: datasheet.SafetyNotes()[:1]}}}},
		},
	}
	var b bytes.Buffer
	if err := sh.WriteHTML(&b); err != nil {
		fmt.Println(err)
		return
	}
	for _, line := range strings.Split(b.String(), "\n") {
		if strings.HasPrefix(line, "<h2>") {
			fmt.Println(line)
		}
	}
	// Output:
	// <h2><span class="num">1</span>Couplings</h2>
	// <h2><span class="num">2</span>Cautions</h2>
}
