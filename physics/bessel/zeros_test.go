package bessel

import (
	"bufio"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// How the expected values were computed.
//
// The reference tables physics/bessel/testdata/jzeros.tsv and jpzeros.tsv hold
// j_{n,m} and j'_{n,m} for n = 0..200, m = 1..200, computed with mpmath
// 1.2.1 (Debian python3-mpmath), mpmath.besseljzero(n, m, derivative) at
// mp.dps = 30 and printed to 20 significant digits, by
// physics/bessel/testdata/gen_zeros.py (mpmath counts x = 0 as the first zero of
// J'_0; the script shifts it away). Parsing a 20-digit decimal rounds it
// correctly to float64, so the table is exact to half an ulp.
//
// The spot values of A&S Table 9.5 are recalled from memory (not read from
// the printed page) to 10 decimals; some recalled 10th decimals are off by
// a unit, so they are compared to 1e-9.
//
// Beyond the table (orders and counts up to 1000) the zeros are checked by
// an independent evaluation: math.Jn, which for x >= n uses forward
// recurrence from math.J0 and math.J1, must vanish at j_{n,m}, and
// J'_n = (J_{n-1} - J_{n+1})/2 (DLMF 10.6.1) at j'_{n,m}. The interlacing
// inequalities of DLMF 10.21 show that no zero is skipped or repeated.

const (
	// tableTol is the relative error allowed against the 30-digit table:
	// 2 ulp is about 4.4e-16; the measured maximum is given in doc.go.
	tableTol = 1e-15
	// veryCloseTol is 2 ulp (2 * 2^-52 relative), for values that must
	// agree but may round differently.
	veryCloseTol = 4.5e-16
	// identityTol bounds the implied relative position error
	// |f(x)| / (|f'(x)| x) of a zero x of f = J_n or J'_n, with f and f'
	// from math.Jn. math.Jn itself is accurate to some ulp of the
	// amplitude of J_n (its forward recurrence loses up to about
	// sqrt(n) ulp), which the bound must absorb.
	identityTol = 1e-14
	// printedTol is the absolute tolerance for the A&S Table 9.5 values:
	// the table prints 10 decimals, but these were recalled from memory
	// and the 10th decimal of some is off by one or more units.
	printedTol = 1e-9
)

// tolerance reports whether a and b agree to within relative error e.
func tolerance(a, b, e float64) bool {
	if a == b {
		return true
	}
	d := math.Abs(a - b)
	if b != 0 {
		e *= math.Abs(b)
	}
	return d < e
}

// close reports agreement to tableTol, veryclose to veryCloseTol.
func close(a, b float64) bool     { return tolerance(a, b, tableTol) }
func veryclose(a, b float64) bool { return tolerance(a, b, veryCloseTol) }

// refTable is a reference table: ref[n][m-1] is the m-th zero of order n.
type refTable [][]float64

const (
	refJ, refJPrime  = "jzeros.tsv", "jpzeros.tsv"
	refOrders        = 201 // n = 0..200
	refZerosPerOrder = 200 // m = 1..200
)

// readRef reads a table written by physics/bessel/testdata/gen_zeros.py.
func readRef(t testing.TB, name string) refTable {
	t.Helper()
	path := filepath.Join("testdata", name)
	f, err := os.Open(path)
	if err != nil {
		t.Fatalf("reference table: %v", err)
	}
	defer f.Close()
	tab := make(refTable, refOrders)
	sc := bufio.NewScanner(f)
	line := 0
	for sc.Scan() {
		line++
		s := sc.Text()
		if s == "" || strings.HasPrefix(s, "#") {
			continue
		}
		fields := strings.Split(s, "\t")
		if len(fields) != 3 {
			t.Fatalf("%s:%d: want 3 fields, got %d", path, line, len(fields))
		}
		n, err1 := strconv.Atoi(fields[0])
		m, err2 := strconv.Atoi(fields[1])
		v, err3 := strconv.ParseFloat(fields[2], 64)
		if err1 != nil || err2 != nil || err3 != nil || n < 0 || n >= refOrders || m != len(tab[n])+1 {
			t.Fatalf("%s:%d: bad row %q", path, line, s)
		}
		tab[n] = append(tab[n], v)
	}
	if err := sc.Err(); err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	for n, row := range tab {
		if len(row) != refZerosPerOrder {
			t.Fatalf("%s: order %d has %d zeros, want %d", path, n, len(row), refZerosPerOrder)
		}
	}
	return tab
}

// table computes the zeros of the reference range with Zeros.
func table() (j, jp [][]float64) {
	j = make([][]float64, refOrders)
	jp = make([][]float64, refOrders)
	for n := range refOrders {
		j[n], jp[n] = Zeros(n, refZerosPerOrder)
	}
	return j, jp
}

// tableSeparate computes the same with JZeros and JPrimeZeros.
func tableSeparate() (j, jp [][]float64) {
	j = make([][]float64, refOrders)
	jp = make([][]float64, refOrders)
	for n := range refOrders {
		j[n], jp[n] = JZeros(n, refZerosPerOrder), JPrimeZeros(n, refZerosPerOrder)
	}
	return j, jp
}

func TestZerosTable(t *testing.T) {
	wantJ, wantJP := readRef(t, refJ), readRef(t, refJPrime)
	gotJ, gotJP := table()
	sepJ, sepJP := tableSeparate()
	var worst float64
	var worstAt string
	for n := range refOrders {
		for i := range refZerosPerOrder {
			for _, c := range []struct {
				name      string
				got, want float64
			}{
				{"Zeros j", gotJ[n][i], wantJ[n][i]},
				{"Zeros j'", gotJP[n][i], wantJP[n][i]},
				{"JZeros", sepJ[n][i], wantJ[n][i]},
				{"JPrimeZeros", sepJP[n][i], wantJP[n][i]},
			} {
				if !close(c.got, c.want) {
					t.Errorf("%s(%d, %d) = %.17g, want %.17g", c.name, n, i+1, c.got, c.want)
				}
				if e := math.Abs(c.got-c.want) / c.want; e > worst {
					worst, worstAt = e, fmt.Sprintf("%s(%d, %d)", c.name, n, i+1)
				}
			}
		}
	}
	t.Logf("largest relative error against mpmath: %.3g at %s", worst, worstAt)
}

// TestEntryPointsAgree checks that JZeros and JPrimeZeros return, to the
// last bit, what Zeros returns, and that a zero does not depend on how
// many were asked for.
func TestEntryPointsAgree(t *testing.T) {
	for _, n := range []int{0, 1, 2, 5, 17, 200, 1000} {
		j, jp := Zeros(n, 60)
		gotJ, gotJP := JZeros(n, 60), JPrimeZeros(n, 60)
		shortJ, shortJP := Zeros(n, 2)
		for i := range j {
			if gotJ[i] != j[i] {
				t.Errorf("JZeros(%d, 60)[%d] = %.17g, want %.17g (Zeros)", n, i, gotJ[i], j[i])
			}
			if gotJP[i] != jp[i] {
				t.Errorf("JPrimeZeros(%d, 60)[%d] = %.17g, want %.17g (Zeros)", n, i, gotJP[i], jp[i])
			}
		}
		for i, c := range []struct {
			name      string
			got, want float64
		}{
			{"JZeros(n, 3)[2]", JZeros(n, 3)[2], j[2]},
			{"JPrimeZeros(n, 1)[0]", JPrimeZeros(n, 1)[0], jp[0]},
			{"Zeros(n, 2) j[1]", shortJ[1], j[1]},
			{"Zeros(n, 2) jp[1]", shortJP[1], jp[1]},
		} {
			if c.got != c.want {
				t.Errorf("case %d, n = %d: %s = %.17g, want %.17g (Zeros(n, 60))", i, n, c.name, c.got, c.want)
			}
		}
		if len(gotJ) != 60 || cap(gotJ) != 60 || len(gotJP) != 60 || cap(gotJP) != 60 {
			t.Errorf("JZeros/JPrimeZeros(%d, 60): len, cap = %d, %d / %d, %d, want 60", n, len(gotJ), cap(gotJ), len(gotJP), cap(gotJP))
		}
	}
}

// A&S Table 9.5 (Abramowitz and Stegun 1964), zeros to 10 decimals.
// Recalled from memory, not read from the printed table. A recalled
// j_{3,5} that was wrong in the 6th decimal has been dropped.
var (
	asJ = map[int][]float64{
		0: {2.4048255577, 5.5200781103, 8.6537279129, 11.7915344391, 14.9309177086},
		1: {3.8317059702, 7.0155866698, 10.1734681351, 13.3236919363, 16.4706300509},
		2: {5.1356223018, 8.4172441404, 11.6198411721, 14.7959517824, 17.9598194950},
		3: {6.3801618952, 9.7610231299, 13.0152007217, 16.2234661603},
		4: {7.5883424345, 11.0647094885, 14.3725366716},
		5: {8.7714838160, 12.3386041975, 15.7001740797},
	}
	asJPrime = map[int][]float64{
		0: {3.8317059702, 7.0155866698, 10.1734681351, 13.3236919363},
		1: {1.8411837813, 5.3314427735, 8.5363163663, 11.7060049026},
		2: {3.0542369282, 6.7061331942, 9.9694678231},
		3: {4.2011889412, 8.0152365984, 11.3459243107},
	}
)

func TestAbramowitzStegunTable95(t *testing.T) {
	for n, want := range asJ {
		got := JZeros(n, len(want))
		for i := range want {
			if math.Abs(got[i]-want[i]) > printedTol {
				t.Errorf("j(%d, %d) = %.12f, want %.10f (A&S Table 9.5)", n, i+1, got[i], want[i])
			}
		}
	}
	for n, want := range asJPrime {
		got := JPrimeZeros(n, len(want))
		for i := range want {
			if math.Abs(got[i]-want[i]) > printedTol {
				t.Errorf("j'(%d, %d) = %.12f, want %.10f (A&S Table 9.5)", n, i+1, got[i], want[i])
			}
		}
	}
}

func TestSpecialCases(t *testing.T) {
	// j'_{0,1} and j'_{1,1} from mpmath 1.2.1 besseljzero(0, 2, 1) and
	// besseljzero(1, 1, 1) (mp.dps = 30, rounded to 17 digits; the same
	// values as jpzeros.tsv).
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"JPrimeZeros(0, 1)[0]", JPrimeZeros(0, 1)[0], 3.8317059702075123},
		{"JPrimeZeros(1, 1)[0]", JPrimeZeros(1, 1)[0], 1.8411837813406593},
		// J'_0 = -J_1 (DLMF 10.6.3), so j'_{0,m} = j_{1,m}.
		{"JPrimeZeros(0, 5)[4]", JPrimeZeros(0, 5)[4], JZeros(1, 5)[4]},
	} {
		if !veryclose(c.got, c.want) {
			t.Errorf("%s = %.17g, want %.17g", c.name, c.got, c.want)
		}
	}
	for _, n := range []int{0, 3} {
		if z := JZeros(n, 0); z == nil || len(z) != 0 {
			t.Errorf("JZeros(%d, 0) = %#v, want empty non-nil", n, z)
		}
		if z := JPrimeZeros(n, 0); z == nil || len(z) != 0 {
			t.Errorf("JPrimeZeros(%d, 0) = %#v, want empty non-nil", n, z)
		}
		if j, jp := Zeros(n, 0); j == nil || len(j) != 0 || jp == nil || len(jp) != 0 {
			t.Errorf("Zeros(%d, 0) = %#v, %#v, want empty non-nil", n, j, jp)
		}
	}
}

func TestPanics(t *testing.T) {
	for _, c := range []struct {
		name string
		f    func()
		want string
	}{
		{"JZeros(-1, 3)", func() { JZeros(-1, 3) }, "bessel: JZeros: order n must be >= 0, got -1"},
		{"JZeros(0, -2)", func() { JZeros(0, -2) }, "bessel: JZeros: count must be >= 0, got -2"},
		{"JPrimeZeros(-4, 1)", func() { JPrimeZeros(-4, 1) }, "bessel: JPrimeZeros: order n must be >= 0, got -4"},
		{"JPrimeZeros(2, -1)", func() { JPrimeZeros(2, -1) }, "bessel: JPrimeZeros: count must be >= 0, got -1"},
		{"Zeros(-1, 0)", func() { Zeros(-1, 0) }, "bessel: Zeros: order n must be >= 0, got -1"},
	} {
		func() {
			defer func() {
				r := recover()
				if r != c.want {
					t.Errorf("%s panicked with %v, want %q", c.name, r, c.want)
				}
			}()
			c.f()
		}()
	}
}

// checkInterlacing checks, over the given table, the inequalities (DLMF
// 10.21.2, 10.21.3 and the monotony of j_{nu,m}, j'_{nu,m} in nu, DLMF
// 10.21(iv)):
//
//	j_{n,m} < j_{n+1,m} < j_{n,m+1}
//	j'_{n,m} < j'_{n+1,m} < j'_{n,m+1}               (n >= 1)
//	j'_{1,m} < j'_{0,m} = j_{1,m} < j'_{1,m+1}        (n = 0, x = 0 excluded)
//	j'_{n,m} < j_{n,m} < j'_{n,m+1}                  (n >= 1)
//	j_{0,m} < j'_{0,m} < j_{0,m+1}
//
// Together they place every zero between two others, so a skipped or
// repeated zero breaks one of them.
func checkInterlacing(t *testing.T, what string, j, jp [][]float64) {
	t.Helper()
	orders, count := len(j), len(j[0])
	bad := 0
	less := func(a, b float64, format string, args ...any) {
		if !(a < b) && bad < 20 {
			bad++
			t.Errorf("%s: want %s: %.17g >= %.17g", what, fmt.Sprintf(format, args...), a, b)
		}
	}
	for n := range orders {
		for i := range count - 1 {
			m := i + 1
			if n+1 < orders {
				less(j[n][i], j[n+1][i], "j(%d,%d) < j(%d,%d)", n, m, n+1, m)
				less(j[n+1][i], j[n][i+1], "j(%d,%d) < j(%d,%d)", n+1, m, n, m+1)
				if n >= 1 {
					less(jp[n][i], jp[n+1][i], "j'(%d,%d) < j'(%d,%d)", n, m, n+1, m)
					less(jp[n+1][i], jp[n][i+1], "j'(%d,%d) < j'(%d,%d)", n+1, m, n, m+1)
				} else {
					less(jp[1][i], jp[0][i], "j'(1,%d) < j'(0,%d)", m, m)
					less(jp[0][i], jp[1][i+1], "j'(0,%d) < j'(1,%d)", m, m+1)
				}
			}
			if n >= 1 {
				less(jp[n][i], j[n][i], "j'(%d,%d) < j(%d,%d)", n, m, n, m)
				less(j[n][i], jp[n][i+1], "j(%d,%d) < j'(%d,%d)", n, m, n, m+1)
			} else {
				less(j[0][i], jp[0][i], "j(0,%d) < j'(0,%d)", m, m)
				less(jp[0][i], j[0][i+1], "j'(0,%d) < j(0,%d)", m, m+1)
			}
		}
	}
}

func TestInterlacing(t *testing.T) {
	j, jp := table()
	checkInterlacing(t, "Zeros", j, jp)
	j, jp = tableSeparate()
	checkInterlacing(t, "JZeros, JPrimeZeros", j, jp)
	// The reference table itself must obey the same inequalities.
	checkInterlacing(t, "mpmath table", readRef(t, refJ), readRef(t, refJPrime))
}

// residualJ returns |J_n(x)| / (|J'_n(x)| x): the relative distance from x
// to the zero of J_n next to it, to first order, with J_n and J'_n from
// math.Jn and DLMF 10.6.1.
func residualJ(n int, x float64) float64 {
	f := math.Jn(n, x)
	df := (math.Jn(n-1, x) - math.Jn(n+1, x)) / 2
	return math.Abs(f) / (math.Abs(df) * x)
}

// residualJPrime returns |J'_n(x)| / (|J_n^(2)(x)| x) likewise, with the
// second derivative J_n^(2) = -J'_n/x - (1 - n^2/x^2) J_n from Bessel's
// equation (DLMF 10.2.1).
func residualJPrime(n int, x float64) float64 {
	jn := math.Jn(n, x)
	df := (math.Jn(n-1, x) - math.Jn(n+1, x)) / 2
	fn := float64(n)
	d2 := -df/x - (1-fn*fn/(x*x))*jn
	return math.Abs(df) / (math.Abs(d2) * x)
}

// TestIdentityRandom checks J_n(j_{n,m}) = 0 and J'_n(j'_{n,m}) = 0 by an
// independent evaluation on seeded random orders and indices up to 1000.
func TestIdentityRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(20240601, 7))
	for range 40 {
		n := rng.IntN(1001)
		count := 1 + rng.IntN(1000)
		j, jp := Zeros(n, count)
		for range 5 {
			i := rng.IntN(count)
			if r := residualJ(n, j[i]); r > identityTol {
				t.Errorf("J_%d(j(%d, %d) = %.17g) / (J'_%d x) = %.3g, want <= %g", n, n, i+1, j[i], n, r, identityTol)
			}
			if r := residualJPrime(n, jp[i]); r > identityTol {
				t.Errorf("J'_%d(j'(%d, %d) = %.17g) / (J^(2)_%d x) = %.3g, want <= %g", n, n, i+1, jp[i], n, r, identityTol)
			}
		}
	}
}

// TestLargeOrder checks n = 1000, count = 1000 in full: ascending,
// interlaced, and zeros of math.Jn.
func TestLargeOrder(t *testing.T) {
	const n, count = 1000, 1000
	j, jp := Zeros(n, count)
	var worst float64
	for i := range count {
		if i > 0 && !(jp[i-1] < j[i-1] && j[i-1] < jp[i]) {
			t.Fatalf("order %d: want j'(%d) < j(%d) < j'(%d): %v, %v, %v", n, i, i, i+1, jp[i-1], j[i-1], jp[i])
		}
		worst = math.Max(worst, math.Max(residualJ(n, j[i]), residualJPrime(n, jp[i])))
	}
	if !(jp[count-1] < j[count-1]) {
		t.Errorf("order %d: want j'(%d) < j(%d): %v, %v", n, count, count, jp[count-1], j[count-1])
	}
	if worst > identityTol {
		t.Errorf("order %d: largest residual %.3g, want <= %g", n, worst, identityTol)
	}
	// The first zeros approach DLMF 10.21.40 as n grows; at n = 1000 the
	// neglected terms are below 1e-6.
	c := math.Cbrt(n)
	if want := n + 1.8557571*c + 1.033150/c; math.Abs(j[0]-want) > 1e-6*want {
		t.Errorf("j(%d, 1) = %v, want %v (DLMF 10.21.40)", n, j[0], want)
	}
	// McMahon's expansion (DLMF 10.21.19) is far from valid here; the
	// spacing of the last zeros follows from the Debye phase of DLMF
	// 10.19.6, psi(x) = sqrt(x^2-n^2) - n arccos(n/x), which advances by
	// pi from zero to zero: spacing ~ pi x/sqrt(x^2-n^2) (derived; its
	// error is of order n^2/x^4 relative).
	x := (j[count-1] + j[count-2]) / 2
	if d, want := j[count-1]-j[count-2], math.Pi*x/math.Sqrt(x*x-n*n); math.Abs(d-want) > 1e-4*want {
		t.Errorf("j(%d, %d) - j(%d, %d) = %v, want %v (Debye phase)", n, count, n, count-1, d, want)
	}
}

// TestMcMahon compares far zeros with McMahon's expansion (DLMF 10.21.19,
// 10.21.20), which at m = 20000 and small n has a neglected term of order
// beta^-7 < 1e-30 relative: an independent route to the same numbers after
// 20000 steps of the march.
func TestMcMahon(t *testing.T) {
	const m = 20000
	// Terms to beta^-5 of DLMF 10.21.19 and 10.21.20, mu = 4 n^2.
	mcMahonJ := func(n float64) float64 {
		mu, beta := 4*n*n, (m+n/2-0.25)*math.Pi
		b := 8 * beta
		return beta - (mu-1)/b - 4*(mu-1)*(7*mu-31)/(3*b*b*b) -
			32*(mu-1)*(83*mu*mu-982*mu+3779)/(15*b*b*b*b*b)
	}
	mcMahonJPrime := func(n float64, m int) float64 {
		mu, beta := 4*n*n, (float64(m)+n/2-0.75)*math.Pi
		b := 8 * beta
		return beta - (mu+3)/b - 4*(7*mu*mu+82*mu-9)/(3*b*b*b) -
			32*(83*mu*mu*mu+2075*mu*mu-3039*mu+3537)/(15*b*b*b*b*b)
	}
	for _, n := range []int{0, 1, 2, 5} {
		j, jp := Zeros(n, m)
		if want := mcMahonJ(float64(n)); !close(j[m-1], want) {
			t.Errorf("j(%d, %d) = %.17g, want %.17g (McMahon)", n, m, j[m-1], want)
		}
		// For n = 0, x = 0 is McMahon's first zero of J'_0.
		mm := m
		if n == 0 {
			mm = m + 1
		}
		if want := mcMahonJPrime(float64(n), mm); !close(jp[m-1], want) {
			t.Errorf("j'(%d, %d) = %.17g, want %.17g (McMahon)", n, m, jp[m-1], want)
		}
	}
}

// TestHighOrder checks the first zeros of an order far beyond the table,
// n = 20000, by math.Jn.
func TestHighOrder(t *testing.T) {
	const n = 20000
	j, jp := Zeros(n, 3)
	for i := range 3 {
		if r := residualJ(n, j[i]); r > identityTol {
			t.Errorf("J_%d(j(%d, %d) = %.17g) / (J'_%d x) = %.3g, want <= %g", n, n, i+1, j[i], n, r, identityTol)
		}
		if r := residualJPrime(n, jp[i]); r > identityTol {
			t.Errorf("J'_%d(j'(%d, %d) = %.17g) / (J^(2)_%d x) = %.3g, want <= %g", n, n, i+1, jp[i], n, r, identityTol)
		}
	}
}
