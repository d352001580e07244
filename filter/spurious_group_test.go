package filter

import (
	"testing"

	"cylcav/cavity"
)

// TestSpuriousGroups checks the merge of per-cavity spurious resonances by
// mode against a list built by hand: ranges, sorted distinct resonators,
// the passband flag taken from any member, the first rejection band, and
// the alarm and wording that follow.
func TestSpuriousGroups(t *testing.T) {
	te112 := cavity.Mode{Family: cavity.TE, N: 1, M: 1, P: 2}
	tm111 := cavity.Mode{Family: cavity.TM, N: 1, M: 1, P: 1}
	tm110 := cavity.Mode{Family: cavity.TM, N: 1, M: 1, P: 0}
	rz := &Realisation{Spurious: []Spurious{
		{Mode: te112, F: 10.3e9, Resonators: []int{3, 1}, Stopband: -1},
		{Mode: tm111, F: 10.0e9, Resonators: []int{1, 2}, Companion: true, InPassband: true, Stopband: -1},
		{Mode: te112, F: 10.2e9, Resonators: []int{2, 1}, Stopband: 1},
		{Mode: tm110, F: 9.1e9, Resonators: []int{4}, InPassband: false, Stopband: -1},
		{Mode: te112, F: 10.25e9, Resonators: []int{4}, InPassband: true, Stopband: 0},
	}}
	want := []struct {
		mode   cavity.Mode
		lo, hi float64
		res    []int
		stop   int
		alarm  bool
		where  string
	}{
		{te112, 10.2e9, 10.3e9, []int{1, 2, 3, 4}, 1, true, "IN THE PASSBAND"},
		{tm111, 10.0e9, 10.0e9, []int{1, 2}, -1, false, "exact companion of the wanted mode"},
		{tm110, 9.1e9, 9.1e9, []int{4}, -1, false, "outside the passband and the rejection bands"},
	}
	got := rz.SpuriousGroups()
	if len(got) != len(want) {
		t.Fatalf("%d groups, want %d: %+v", len(got), len(want), got)
	}
	for i, w := range want {
		g := got[i]
		if g.Mode != w.mode || g.FMin != w.lo || g.FMax != w.hi || g.Stopband != w.stop || g.Alarm() != w.alarm || g.Where() != w.where {
			t.Errorf("group %d = %+v (alarm %v, %q), want %+v", i, g, g.Alarm(), g.Where(), w)
		}
		if len(g.Resonators) != len(w.res) {
			t.Errorf("group %d resonators %v, want %v", i, g.Resonators, w.res)
			continue
		}
		for k := range w.res {
			if g.Resonators[k] != w.res[k] {
				t.Errorf("group %d resonators %v, want %v", i, g.Resonators, w.res)
				break
			}
		}
	}
	rej := SpuriousGroup{Stopband: 2}
	if !rej.Alarm() || rej.Where() != "IN A REJECTION BAND" {
		t.Errorf("a mode in a rejection band: alarm %v, %q", rej.Alarm(), rej.Where())
	}
}
