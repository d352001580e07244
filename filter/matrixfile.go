package filter

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"math"
	"slices"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/mat"

	"cylcav/physics"
)

// A coupling matrix given by the user, in a plain text file of this
// project's own design ("coupling-matrix text"): one statement per line,
// '#' starts a comment, blank lines are ignored, words are separated by
// spaces, keywords in lower case:
//
//	centre 10 GHz               centre frequency f0 (a unit is required)
//	bandwidth 100 MHz           passband width f2 - f1
//	resonators 4                N, 1..MaxOrder
//	return-loss 20 dB           passband requirement of the checks (optional, default DefaultReturnLoss)
//	reject 40 dB from 10.2 GHz  a rejection (optional, repeatable; "to F" bounds it)
//	q0 3000                     unloaded Q of every resonator (optional)
//	m S 1 1.0352                one entry M_ij, normalised; rows S, 1..N, L
//
// Each entry is given once for the pair (i, j) (the matrix is symmetric;
// giving M_ji too is an error), unlisted entries are zero, and the values
// are the normalised couplings of Response (k_ij = FBW M_ij,
// Qext = 1/(FBW M_S1^2)). centre, bandwidth, resonators and at least the
// port couplings are required.

// MatrixFile is a parsed coupling-matrix text.
type MatrixFile struct {
	// Spec holds the centre, bandwidth, order, return loss and rejections.
	Spec Spec
	// M is the (N+2)x(N+2) matrix.
	M *mat.Dense
	// Q0 is the unloaded Q of every resonator, 0 when not given.
	Q0 float64
}

// ParseMatrixFile reads a coupling-matrix text. Errors name the line, the
// offending text and the valid range.
func ParseMatrixFile(r io.Reader) (*MatrixFile, error) {
	sc := bufio.NewScanner(r)
	f := &MatrixFile{}
	type entry struct {
		i, j int
		v    float64
		line int
	}
	var entries []entry
	var rawEntries [][3]string
	var entryLines []int
	seen := map[string]int{}
	line := 0
	for sc.Scan() {
		line++
		text := sc.Text()
		if k := strings.IndexByte(text, '#'); k >= 0 {
			text = text[:k]
		}
		w := strings.Fields(text)
		if len(w) == 0 {
			continue
		}
		bad := func(format string, a ...any) error {
			return fmt.Errorf("line %d: %s", line, fmt.Sprintf(format, a...))
		}
		key := w[0]
		if key != "m" && key != "reject" {
			if prev, ok := seen[key]; ok {
				return nil, bad("%q given twice (first on line %d)", key, prev)
			}
			seen[key] = line
		}
		rest := strings.Join(w[1:], "")
		switch key {
		case "centre", "bandwidth":
			v, err := physics.ParseFrequency(rest)
			if err != nil || !(v > 0) || !strings.HasSuffix(strings.ToLower(rest), "hz") {
				return nil, bad("%s %q: want a frequency > 0 with its unit, e.g. 10GHz", key, strings.Join(w[1:], " "))
			}
			if key == "centre" {
				f.Spec.F0 = v
			} else {
				f.Spec.BW = v
			}
		case "resonators":
			n, err := strconv.Atoi(rest)
			if err != nil || n < 1 || n > MaxOrder {
				return nil, bad("resonators %q: want a whole number 1..%d", rest, MaxOrder)
			}
			f.Spec.Order = n
		case "return-loss":
			v, err := physics.ParseDecibel(strings.TrimSuffix(rest, "dB") + "dB")
			if err != nil || checkReturnLoss(v) != nil {
				return nil, bad("return-loss %q: want a level in dB between %.4g and %g", strings.Join(w[1:], " "), ReturnLossFromRipple(MaxRipple), MaxReturnLoss)
			}
			f.Spec.ReturnLoss = v
		case "q0":
			v, err := strconv.ParseFloat(rest, 64)
			if err != nil || !(v >= 1 && v <= 1e12) {
				return nil, bad("q0 %q: want a number between 1 and 1e12", rest)
			}
			f.Q0 = v
		case "reject":
			// reject ATT dB from F [to END]
			s := strings.Join(w[1:], " ")
			att, from, end, err := parseReject(s)
			if err != nil {
				return nil, bad("reject %q: %v", s, err)
			}
			f.Spec.Rejections = append(f.Spec.Rejections, Rejection{F: from, Attenuation: att, End: end})
		case "m":
			if len(w) != 4 {
				return nil, bad("%q: want m ROW COL VALUE, e.g. m S 1 1.0352", strings.Join(w, " "))
			}
			rawEntries = append(rawEntries, [3]string{w[1], w[2], w[3]})
			entryLines = append(entryLines, line)
		default:
			return nil, bad("unknown keyword %q; use centre, bandwidth, resonators, return-loss, reject, q0 or m", key)
		}
	}
	if err := sc.Err(); err != nil {
		return nil, err
	}
	for _, k := range []string{"centre", "bandwidth", "resonators"} {
		if _, ok := seen[k]; !ok {
			return nil, fmt.Errorf("the %q line is missing", k)
		}
	}
	n := f.Spec.Order
	index := func(s string) (int, bool) {
		switch s {
		case "S", "s":
			return 0, true
		case "L", "l":
			return n + 1, true
		}
		k, err := strconv.Atoi(s)
		if err != nil || k < 1 || k > n {
			return 0, false
		}
		return k, true
	}
	given := map[[2]int]int{}
	for k, e := range rawEntries {
		ln := entryLines[k]
		i, ok1 := index(e[0])
		j, ok2 := index(e[1])
		if !ok1 || !ok2 {
			return nil, fmt.Errorf("line %d: entry %s %s: rows and columns are S, 1..%d or L", ln, e[0], e[1], n)
		}
		v, err := strconv.ParseFloat(e[2], 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("line %d: entry %s %s value %q: want a finite number", ln, e[0], e[1], e[2])
		}
		key := [2]int{min(i, j), max(i, j)}
		if prev, ok := given[key]; ok {
			return nil, fmt.Errorf("line %d: entry %s %s already given on line %d (the matrix is symmetric: give each pair once)", ln, e[0], e[1], prev)
		}
		given[key] = ln
		entries = append(entries, entry{i, j, v, ln})
	}
	m := mat.NewDense(n+2, n+2, nil)
	for _, e := range entries {
		m.Set(e.i, e.j, e.v)
		m.Set(e.j, e.i, e.v)
	}
	f.M = m
	if m.At(0, 0) != 0 || m.At(n+1, n+1) != 0 {
		return nil, errors.New("the source and load have no self coupling: m S S and m L L must be 0")
	}
	return f, nil
}

// parseReject reads "ATT dB from F [to END]".
func parseReject(s string) (att, from, end float64, err error) {
	w := strings.Fields(s)
	k := slices.Index(w, "from")
	if k < 1 {
		return 0, 0, 0, errors.New(`want "ATT dB from F [to END]", e.g. 40 dB from 10.2 GHz`)
	}
	att, err = physics.ParseDecibel(strings.TrimSuffix(strings.Join(w[:k], ""), "dB") + "dB")
	if err != nil || !(att > 0 && att <= 300) {
		return 0, 0, 0, errors.New("the attenuation must be > 0 dB and <= 300 dB")
	}
	rest := w[k+1:]
	t := slices.Index(rest, "to")
	fs := rest
	if t >= 0 {
		fs = rest[:t]
		if end, err = physics.ParseFrequency(strings.Join(rest[t+1:], "")); err != nil {
			return 0, 0, 0, fmt.Errorf("end frequency: %v", err)
		}
	}
	if from, err = physics.ParseFrequency(strings.Join(fs, "")); err != nil {
		return 0, 0, 0, fmt.Errorf("frequency: %v", err)
	}
	return att, from, end, nil
}

// FromMatrix returns a design for analysis of the coupling matrix m given
// by the user: spec supplies the centre, bandwidth, return-loss requirement
// and rejections (Order is set to N, Zeros are ignored). The design has
// Folded = m (Topology "given"), K, QextIn and QextOut read from it, and
// Zeros the real transmission zeros of m outside the passband within the
// band of interest (matrixZeros); it has no polynomials, so it serves
// Response, Check, Delay, SweepRange and Realise but is not a synthesis
// result. The matrix must be symmetric and finite (see Response).
func FromMatrix(m mat.Matrix, spec Spec) (*Design, error) {
	n, err := checkMatrix(m)
	if err != nil {
		return nil, err
	}
	spec.Order = n
	spec.Zeros = nil
	spec.Family = Chebyshev
	s, err := spec.normalized()
	if err != nil {
		return nil, err
	}
	if m.At(0, 1) == 0 || m.At(n, n+1) == 0 {
		return nil, errors.New("filter: the matrix needs the couplings M_S1 and M_NL (the ports to the first and last resonator)")
	}
	c := symmetrized(mat.DenseCopyOf(m))
	d := &Design{Spec: s, FBW: s.BW / s.F0, Folded: c, Topology: Topology{Name: "given", Order: n, Size: -1}}
	d.K = make([]float64, n-1)
	for i := 1; i < n; i++ {
		d.K[i-1] = d.FBW * c.At(i, i+1)
	}
	d.QextIn = 1 / (d.FBW * c.At(0, 1) * c.At(0, 1))
	d.QextOut = 1 / (d.FBW * c.At(n, n+1) * c.At(n, n+1))
	lo, hi := ModelRange(s.F0)
	d.Zeros = matrixZeros(c, LowpassOmega(lo, s.F0, s.BW), LowpassOmega(hi, s.F0, s.BW))
	d.Spec.Zeros = d.Zeros
	return d, nil
}

// matrixZeros returns the real transmission zeros of the lossless network
// of m in wlo..whi outside the passband (|Omega| > 1), ascending: the real
// roots of det B(Omega), B the minor of A = Omega W - j R + M without the
// load row and the source column, which is real (the terminations R fall
// out with that row and column) and proportional to S21 (Cramer's rule,
// S21 = -2j [A^-1]_{L,S}). Sign changes on 4000 samples spaced uniformly in
// ln|Omega| per side are bisected to rounding; a double zero (no sign
// change) is not found.
func matrixZeros(m *mat.Dense, wlo, whi float64) []float64 {
	n, _ := m.Dims()
	b := mat.NewDense(n-1, n-1, nil)
	det := func(w float64) float64 {
		for i := 0; i < n-1; i++ {
			for j := 1; j < n; j++ {
				v := m.At(i, j)
				if i == j && i >= 1 && i <= n-2 {
					v += w
				}
				b.Set(i, j-1, v)
			}
		}
		return mat.Det(b)
	}
	var zs []float64
	for _, side := range []struct{ sign, far float64 }{{-1, -wlo}, {1, whi}} {
		if !(side.far > 1) {
			continue
		}
		const samples = 4000
		la, lb := math.Log(1+1e-9), math.Log(side.far)
		prevW := side.sign * math.Exp(la)
		prev := det(prevW)
		for k := 1; k <= samples; k++ {
			w := side.sign * math.Exp(la+(lb-la)*float64(k)/samples)
			v := det(w)
			if (v < 0) != (prev < 0) {
				x0, x1, f0 := prevW, w, prev
				for it := 0; it < 200; it++ {
					mid := 0.5 * (x0 + x1)
					if mid == x0 || mid == x1 {
						break
					}
					if fm := det(mid); (fm < 0) == (f0 < 0) {
						x0, f0 = mid, fm
					} else {
						x1 = mid
					}
				}
				zs = append(zs, 0.5*(x0+x1))
			}
			prevW, prev = w, v
		}
	}
	slices.Sort(zs)
	return zs
}

// WriteMatrixFile writes the design's coupling matrix as coupling-matrix
// text (see ParseMatrixFile) with its centre, bandwidth, return loss and
// rejections, and q0 when > 0; entries of magnitude below 1e-12 (rounding
// where the pattern has zeros) are left out. ParseMatrixFile reads it back
// to the last digit (values printed with 17 significant digits).
func WriteMatrixFile(w io.Writer, d *Design, q0 float64, comments []string) error {
	var b strings.Builder
	for _, c := range comments {
		fmt.Fprintf(&b, "# %s\n", c)
	}
	s := d.Spec
	n := d.Order()
	g := func(x float64) string { return strconv.FormatFloat(x, 'g', 17, 64) }
	fmt.Fprintf(&b, "centre %s Hz\nbandwidth %s Hz\nresonators %d\n", g(s.F0), g(s.BW), n)
	if s.Family == Chebyshev {
		fmt.Fprintf(&b, "return-loss %s dB\n", g(s.ReturnLoss))
	}
	for _, r := range s.Rejections {
		fmt.Fprintf(&b, "reject %s dB from %s Hz", g(r.Attenuation), g(r.F))
		if r.End != 0 {
			fmt.Fprintf(&b, " to %s Hz", g(r.End))
		}
		b.WriteString("\n")
	}
	if q0 > 0 {
		fmt.Fprintf(&b, "q0 %s\n", g(q0))
	}
	fmt.Fprintf(&b, "# topology: %s; normalised couplings, k = FBW*M, Qext = 1/(FBW*M_S1^2)\n", d.Topology.Description())
	name := func(i int) string {
		switch i {
		case 0:
			return "S"
		case n + 1:
			return "L"
		}
		return strconv.Itoa(i)
	}
	for i := 0; i < n+2; i++ {
		for j := i; j < n+2; j++ {
			v := d.Folded.At(i, j)
			if math.Abs(v) < 1e-12 {
				continue
			}
			fmt.Fprintf(&b, "m %s %s %s\n", name(i), name(j), g(v))
		}
	}
	_, err := io.WriteString(w, b.String())
	return err
}
