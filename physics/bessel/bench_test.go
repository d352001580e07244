package bessel

import (
	"fmt"
	"testing"
)

// benchSink keeps the compiler from discarding benchmark results.
var benchSink float64

// BenchmarkTable computes the whole table of j_{n,m} and j'_{n,m} for
// n = 0..200, m = 1..200 (80,400 zeros) with Zeros.
func BenchmarkTable(b *testing.B) {
	for b.Loop() {
		for n := 0; n <= 200; n++ {
			j, jp := Zeros(n, 200)
			benchSink += j[199] + jp[199]
		}
	}
}

// BenchmarkTableSeparate computes the same table with one JZeros and one
// JPrimeZeros call per order: twice the work of BenchmarkTable.
func BenchmarkTableSeparate(b *testing.B) {
	for b.Loop() {
		for n := 0; n <= 200; n++ {
			benchSink += JZeros(n, 200)[199] + JPrimeZeros(n, 200)[199]
		}
	}
}

func BenchmarkJZeros0x1000(b *testing.B) {
	for b.Loop() {
		benchSink += JZeros(0, 1000)[999]
	}
}

func BenchmarkJZeros200x200(b *testing.B) {
	for b.Loop() {
		benchSink += JZeros(200, 200)[199]
	}
}

func BenchmarkJPrimeZeros200x200(b *testing.B) {
	for b.Loop() {
		benchSink += JPrimeZeros(200, 200)[199]
	}
}

// BenchmarkFirstZero is the cost of one low mode, as a cavity model asks
// for it: dominated by the start at x = n.
func BenchmarkJPrimeZeros200x1(b *testing.B) {
	for b.Loop() {
		benchSink += JPrimeZeros(200, 1)[0]
	}
}

// BenchmarkCrossTable computes the TM table of the coaxial mode solver:
// x_{n,m} for n = 0..99, m = 1..100 (10,000 roots) at c = 2, the order of
// the largest air-line ratios in use, with one CrossZeros call per order.
// The sub-benchmarks repeat it for the ratios of the reference table.
func BenchmarkCrossTable(b *testing.B) {
	for _, c := range []float64{2, 1.1, 1.5, 3.5, 10, 100} {
		b.Run(fmt.Sprintf("c=%v", c), func(b *testing.B) {
			for b.Loop() {
				for n := range 100 {
					benchSink += CrossZeros(n, c, 100)[99]
				}
			}
		})
	}
}

// BenchmarkCrossPrimeTable is BenchmarkCrossTable for the TE roots.
func BenchmarkCrossPrimeTable(b *testing.B) {
	for _, c := range []float64{2, 1.1, 1.5, 3.5, 10, 100} {
		b.Run(fmt.Sprintf("c=%v", c), func(b *testing.B) {
			for b.Loop() {
				for n := range 100 {
					benchSink += CrossPrimeZeros(n, c, 100)[99]
				}
			}
		})
	}
}

// BenchmarkCrossZeros is one root list: 100 TM roots of order 10, c = 2.
func BenchmarkCrossZeros(b *testing.B) {
	for b.Loop() {
		benchSink += CrossZeros(10, 2, 100)[99]
	}
}

// BenchmarkCrossFirst is the cost of one low mode, as a mode-matching
// solver asks for it: the first TE root of order 1, c = 2.3.
func BenchmarkCrossFirst(b *testing.B) {
	for b.Loop() {
		benchSink += CrossPrimeZeros(1, 2.3, 1)[0]
	}
}
