package modes

import (
	"runtime"
	"testing"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
)

// maxLiveBytesPerMode is issue 9 item 15's bound on the memory `cylcav
// modes` holds per listed mode. The resonance list itself takes 40 bytes a
// mode (cavity.Resonance); the bound leaves room for the enumeration's
// sort buffers, not for a row of strings per mode.
const maxLiveBytesPerMode = 100

// gcWriter discards what it is given, and every every-th write collects
// garbage and records the live heap (HeapAlloc right after runtime.GC is
// the memory still reachable).
type gcWriter struct {
	every, writes int
	peak          uint64
}

func (w *gcWriter) Write(p []byte) (int, error) {
	w.writes++
	if w.writes%w.every == 1 {
		runtime.GC()
		var m runtime.MemStats
		runtime.ReadMemStats(&m)
		w.peak = max(w.peak, m.HeapAlloc)
	}
	return len(p), nil
}

// TestModesMemory lists 100 000 modes in each format and checks the live
// heap while the output is written: the old code built every row (strings
// and slices, about 500 bytes a mode) before printing the first.
func TestModesMemory(t *testing.T) {
	if testing.Short() {
		t.Skip("lists 100 000 modes")
	}
	const n = 100_000
	for _, format := range []cmdutil.Format{cmdutil.Table, cmdutil.JSON, cmdutil.CSV} {
		runtime.GC()
		var m runtime.MemStats
		runtime.ReadMemStats(&m)
		w := &gcWriter{every: 40}
		opts := &Options{
			IO:     cmdutil.Test(w, w),
			Cavity: cavity.Cavity{Radius: 0.025, Length: 0.05},
			Count:  n, Digits: DefaultDigits, Format: format,
		}
		if err := runModes(opts); err != nil {
			t.Fatal(err)
		}
		if w.writes < 2*w.every {
			t.Fatalf("%s: only %d writes; the output was not streamed", format, w.writes)
		}
		perMode := float64(w.peak-min(w.peak, m.HeapAlloc)) / n
		t.Logf("%s: %.1f bytes live per listed mode", format, perMode)
		if perMode > maxLiveBytesPerMode {
			t.Errorf("%s: %.0f bytes live per listed mode while writing, want at most %d", format, perMode, maxLiveBytesPerMode)
		}
	}
}
