package bessel

import "testing"

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
