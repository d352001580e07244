package axisym

import (
	"testing"

	"cylcav/cavity"
)

func TestTmpExtrapTM(t *testing.T) {
	for _, m := range []int{60, 120} {
		r, _ := Extrapolate(fiveSections(), cavity.TM, 10e9, m)
		for _, e := range r {
			t.Logf("TM %d %d %.12g models %.12g order %.3g err %.3g", m, e.Index, e.Frequency, e.Models, e.Order, e.Error)
		}
	}
}
