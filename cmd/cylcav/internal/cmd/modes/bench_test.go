package modes

import (
	"io"
	"runtime"
	"runtime/metrics"
	"testing"
	"time"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
)

// benchModes is the number of modes each benchmark lists: enough that the
// fixed costs (the header, the enumeration's per-n tables) are small
// against the per-mode ones.
const benchModes = 200_000

// benchmarkModes runs `cylcav modes --count benchModes` in the given format
// into io.Discard and reports the bytes and allocations per listed mode
// (B/mode, allocs/mode), the figures issue 9 item 15 bounds (100 B/mode).
//
// live-B/mode is the memory the run holds: the largest live heap the
// garbage collector measured during the runs (runtime/metrics
// "/gc/heap/live:bytes", sampled every 100 us) less the live heap before,
// per listed mode. B/mode is every byte allocated (runtime.MemStats
// TotalAlloc), most of it short-lived strings of one row.
func benchmarkModes(b *testing.B, format cmdutil.Format) {
	opts := &Options{
		IO:     cmdutil.Test(io.Discard, io.Discard),
		Cavity: cavity.Cavity{Radius: 0.025, Length: 0.05},
		Count:  benchModes, Digits: DefaultDigits, Format: format,
	}
	runtime.GC()
	base := liveHeap()
	peak := make(chan uint64)
	stop := make(chan struct{})
	go func() {
		var m uint64
		t := time.NewTicker(100 * time.Microsecond)
		defer t.Stop()
		for {
			select {
			case <-stop:
				peak <- m
				return
			case <-t.C:
				m = max(m, liveHeap())
			}
		}
	}()
	var before, after runtime.MemStats
	runtime.ReadMemStats(&before)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if err := runModes(opts); err != nil {
			b.Fatal(err)
		}
	}
	b.StopTimer()
	runtime.ReadMemStats(&after)
	runtime.GC() // one more measurement at the end of the last run
	close(stop)
	top := max(<-peak, liveHeap())
	b.ReportMetric(float64(top-min(top, base))/benchModes, "live-B/mode")
	n := float64(b.N) * benchModes
	b.ReportMetric(float64(after.TotalAlloc-before.TotalAlloc)/n, "B/mode")
	b.ReportMetric(float64(after.Mallocs-before.Mallocs)/n, "allocs/mode")
}

// liveHeap returns the live heap at the end of the last garbage collection.
func liveHeap() uint64 {
	s := []metrics.Sample{{Name: "/gc/heap/live:bytes"}}
	metrics.Read(s)
	return s[0].Value.Uint64()
}

func BenchmarkModesTable(b *testing.B) { benchmarkModes(b, cmdutil.Table) }
func BenchmarkModesJSON(b *testing.B)  { benchmarkModes(b, cmdutil.JSON) }
func BenchmarkModesCSV(b *testing.B)   { benchmarkModes(b, cmdutil.CSV) }
