package unloadedq

// Tests of the unexported helpers; the command itself is tested through
// clitest in the external test package.

import (
	"math"
	"testing"
)

func TestNumberJSON(t *testing.T) {
	for _, tc := range []struct {
		v    float64
		want string
	}{{math.Inf(1), "null"}, {math.NaN(), "null"}, {2500, "2500"}, {0.5, "0.5"}} {
		b, err := number(tc.v).MarshalJSON()
		if err != nil || string(b) != tc.want {
			t.Errorf("number(%g).MarshalJSON() = %s, %v; want %s", tc.v, b, err, tc.want)
		}
	}
}
