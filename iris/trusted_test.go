package iris

import (
	"errors"
	"testing"
)

// TestPlanTrusted: a cavity's corrected dimensions are trusted only when
// every iris on its end plates is valid and it is complete; an invalid
// cross-coupling hole does not matter (it takes no part in the lengths).
func TestPlanTrusted(t *testing.T) {
	good := Coupling{Kind: "main", Method: ModeMatching, Achieved: 0.01, Change: 1e-6, Isolation: 50}
	pl := &Plan{Cavities: make([]Tuning, 5)}
	for i := range pl.Cavities {
		pl.Cavities[i] = Tuning{Resonator: i + 1, Complete: true}
	}
	in := Coupling{Kind: "port", From: 0, To: 1, Err: errors.New("no bracket")}
	m12, m23, m34, m45 := good, good, good, good
	m12.From, m12.To = 1, 2
	m23.From, m23.To = 2, 3
	m34.From, m34.To = 3, 4
	m34.Change = 1e-3 // 10 % of k: outside range
	m45.From, m45.To = 4, 5
	out := Coupling{Kind: "port", From: 5, To: 6, Method: PortMatching, Achieved: 90, Change: 1e-3}
	cross := Coupling{Kind: "cross", From: 2, To: 4, Err: errors.New("not sized")}
	pl.Couplings = []Coupling{in, m12, m23, m34, m45, out, cross}
	pl.Cavities[1].Complete = false
	got := pl.Trusted()
	// 1: input port not realised; 2: incomplete; 3, 4: iris 3-4 outside
	// range; 5: every iris valid.
	want := []bool{false, false, false, false, true}
	for i := range want {
		if got[i] != want[i] {
			t.Errorf("cavity %d trusted = %v, want %v", i+1, got[i], want[i])
		}
	}
}
