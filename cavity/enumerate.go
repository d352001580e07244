package cavity

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"sort"

	"cylcav/physics/bessel"
)

// Resonance is one resonant mode of a cavity and its frequency in Hz.
type Resonance struct {
	Mode      Mode
	Frequency float64 // Hz
}

// Degeneracy returns the number of field patterns (polarisations) of the
// mode: 2 for n >= 1, 1 for n = 0. See Mode.Degeneracy.
func (r Resonance) Degeneracy() int { return r.Mode.Degeneracy() }

// Companion returns the mode that shares this resonance's frequency exactly
// in every cylinder (TE0mp with TM1mp). See Mode.Companion.
func (r Resonance) Companion() (Mode, bool) { return r.Mode.Companion() }

// String returns the mode label and frequency, as in "TE011 7.9036e+09 Hz".
func (r Resonance) String() string {
	return fmt.Sprintf("%v %.5g Hz", r.Mode, r.Frequency)
}

// Compare orders resonances the way Modes and Lowest list them: by
// frequency, then (for equal frequencies, such as the exact pairs TE0mp and
// TM1mp) TE before TM, then by n, m and p ascending. It returns -1, 0 or +1.
func (r Resonance) Compare(s Resonance) int {
	if c := cmp.Compare(r.Frequency, s.Frequency); c != 0 {
		return c
	}
	if c := cmp.Compare(r.Mode.Family, s.Mode.Family); c != 0 {
		return c
	}
	if c := cmp.Compare(r.Mode.N, s.Mode.N); c != 0 {
		return c
	}
	if c := cmp.Compare(r.Mode.M, s.Mode.M); c != 0 {
		return c
	}
	return cmp.Compare(r.Mode.P, s.Mode.P)
}

// MaxModes is the largest number of listed modes Modes and Lowest will
// produce: about 10^7 field patterns, and about 0.6 GB of working memory
// while sorting. Requests beyond it fail with an error naming the limit
// instead of exhausting memory.
const MaxModes = 5_000_000

// Modes returns every resonant mode of c whose frequency f, as computed by
// Frequency, satisfies f <= fmax (Hz): the limit is inclusive.
//
// The list is complete and duplicate-free: each TE_nmp and TM_nmp appears
// once, and the two polarisations of a mode with n >= 1 are one entry
// (Resonance.Degeneracy counts them). It is sorted by frequency; equal
// frequencies, which the exact pairs TE0mp and TM1mp always have, are
// ordered as by Resonance.Compare (TE before TM, then n, m, p). Frequencies
// are those of Frequency, bit for bit.
//
// Method: for each azimuthal order n the zeros of J_n and J'_n below the
// largest admissible transverse wavenumber come from physics/bessel in one
// table per order (count first estimated from Debye's phase, DLMF 10.19.6,
// then grown if short); the axial indices p of each (n, m) follow in closed
// form; a stable radix sort on the frequencies orders the list. The cost is
// O(N) in the number N of modes listed plus the root tables, O(N^(2/3)):
// about 5 ms of CPU for N = 6e4 (1.2e5 field patterns) on a 2-core
// virtual machine (BenchmarkModes1e5).
//
// Modes returns an error if c is invalid, if fmax is not finite and > 0,
// if the list would exceed MaxModes entries, or if it would need an index
// above MaxIndex. A cavity with no mode at or below fmax gives an empty,
// non-nil slice.
func (c Cavity) Modes(fmax float64) ([]Resonance, error) {
	e, err := c.enumerate(fmax, MaxModes)
	if err != nil {
		return nil, err
	}
	return e.list(c), nil
}

// Count returns the number of modes Modes(fmax) would list and the number
// of field patterns among them (each mode counted Degeneracy times, the
// quantity Weyl's law estimates), without building the list. Errors are
// those of Modes, except that the MaxModes limit does not apply to counts
// (the index limit MaxIndex still does).
func (c Cavity) Count(fmax float64) (modes, fields int, err error) {
	e, err := c.enumerate(fmax, math.MaxInt)
	if err != nil {
		return 0, 0, err
	}
	return e.total, e.fields, nil
}

// Lowest returns the k lowest resonances of c in the order of Modes, where k
// counts listed modes (a mode with two polarisations counts once). Modes
// whose frequency equals that of the k-th exactly are included too, so the
// result never splits a tie such as TE011/TM111 and may hold more than k
// entries. k must be in 1..MaxModes.
func (c Cavity) Lowest(k int) ([]Resonance, error) {
	if k < 1 || k > MaxModes {
		return nil, fmt.Errorf("cavity: number of modes must be in 1..%d, got %d", MaxModes, k)
	}
	if err := c.Validate(); err != nil {
		return nil, err
	}
	// Start at the lowest resonance any cylinder can have, TM010 or TE111,
	// and raise the limit until at least k modes lie below it: by the cube
	// root of the missing factor (Weyl's law, N ~ f^3) but at most 25 % a
	// step, since just above a cutoff the count rises much faster than f^3.
	// A limit that fails (index or listing limit) or overshoots k by far is
	// bisected against the last limit that gave too few.
	s := c.scale()
	lo := math.Min(frequency(s, bessel.JZeros(0, 1)[0], c.radiusFor(TM), 0, c.Length),
		frequency(s, bessel.JPrimeZeros(1, 1)[0], c.Radius, 1, c.Length))
	hi := math.Inf(1)
	f := lo
	for iter := 0; ; iter++ {
		e, err := c.enumerate(f, MaxModes)
		switch {
		case err != nil && (hi-lo <= 1e-12*lo || iter > 500):
			return nil, err
		case err != nil || (e.total > 4*k+1000 && hi-lo > 1e-3*lo):
			hi = f
		case e.total < k:
			lo = f
		default:
			all := e.list(c)
			end := k
			for end < len(all) && all[end].Frequency == all[k-1].Frequency {
				end++
			}
			return slices.Clone(all[:end]), nil
		}
		if math.IsInf(hi, 1) {
			n := 1.0
			if e != nil {
				n = math.Max(1, float64(e.total))
			}
			f = lo * math.Min(math.Max(math.Cbrt(float64(k)/n), 1.05), 1.25)
		} else {
			f = math.Sqrt(lo * hi)
		}
	}
}

// rootRange is one transverse root x (j_nm or j'_nm) of a family and the
// range of axial indices whose modes lie at or below the limit.
type rootRange struct {
	x          float64
	radius     float64 // the family's radius (Cavity.radiusFor)
	family     Family
	n, m       int
	pmin, pmax int
}

// enumeration is the result of enumerate: the roots with modes below the
// limit, the frequency scale c/(2 pi sqrt(mu_r eps_r)) and the counts.
type enumeration struct {
	scale         float64
	roots         []rootRange
	total, fields int
}

// list returns the modes of e sorted as by Resonance.Compare.
//
// The roots come in the order (family, n, m) and each ladder in p
// ascending, so a stable sort by frequency alone leaves ties in Compare's
// order. The sort works on the IEEE 754 bit patterns of the frequencies,
// which order like the values for positive floats (IEEE 754-2008, sec.
// 5.10): an LSD radix sort on the upper four bytes (one byte per pass,
// skipping bytes all keys share) orders the modes to about 1e-6 relative,
// then a stable insertion sort on the full key finishes the few modes
// closer than that. Both steps are stable; the whole is O(N) unless very
// many modes lie within 1e-6 of each other.
func (e *enumeration) list(c Cavity) []Resonance {
	// item is a sort key (the frequency's bits) and a reference to the
	// mode: root index << 10 | p, as p <= MaxIndex < 1024.
	type item struct{ key, ref uint64 }
	n := e.total
	a, b := make([]item, 0, n), make([]item, n)
	var hist [8][256]uint32 // byte histograms; only the upper four are used
	for i, r := range e.roots {
		for p := r.pmin; p <= r.pmax; p++ {
			k := math.Float64bits(frequency(e.scale, r.x, r.radius, p, c.Length))
			a = append(a, item{k, uint64(i)<<10 | uint64(p)})
			for d := 4; d < 8; d++ {
				hist[d][byte(k>>(8*d))]++
			}
		}
	}
	for d := 4; d < 8 && n > 0; d++ {
		h := &hist[d]
		shift := 8 * uint(d)
		if h[byte(a[0].key>>shift)] == uint32(n) {
			continue // every key has the same byte here
		}
		var sum uint32
		for i, cnt := range h {
			h[i] = sum
			sum += cnt
		}
		for _, it := range a {
			dg := byte(it.key >> shift)
			b[h[dg]] = it
			h[dg]++
		}
		a, b = b, a
	}
	for i := 1; i < n; i++ {
		for j := i; j > 0 && a[j-1].key > a[j].key; j-- {
			a[j-1], a[j] = a[j], a[j-1]
		}
	}
	out := make([]Resonance, n)
	for i, it := range a {
		r := &e.roots[it.ref>>10]
		out[i] = Resonance{
			Mode:      Mode{r.family, r.n, r.m, int(it.ref & 1023)},
			Frequency: math.Float64frombits(it.key),
		}
	}
	return out
}

// enumerate finds every (family, n, m) with at least one mode at or below
// fmax and its axial index range, failing as soon as more than limit modes
// are counted. The roots come out ordered by family (TE first), n and m.
func (c Cavity) enumerate(fmax float64, limit int) (*enumeration, error) {
	if err := c.Validate(); err != nil {
		return nil, err
	}
	if !(fmax > 0 && fmax <= math.MaxFloat64) {
		return nil, fmt.Errorf("cavity: frequency limit must be finite and > 0 Hz, got %g Hz", fmax)
	}
	e := &enumeration{scale: c.scale()}
	// TE modes use the radius a, TM modes the radius of Cavity.radiusFor
	// (a again, unless the fill is uniaxial).
	a, aTM, d := c.Radius, c.radiusFor(TM), c.Length
	// Largest total wavenumber in the fill, and the largest transverse
	// root for p = 0 (TM) and for p = 1 (TE); Pozar, Microwave Engineering,
	// 4th ed., sec. 6.4: k^2 = (x/a)^2 + (p pi/d)^2.
	k := fmax / e.scale
	xTM := k * aTM
	xTE := math.Sqrt(math.Max(0, k*k-(math.Pi/d)*(math.Pi/d))) * a
	// below returns how many of the ascending roots z have their lowest
	// mode (axial index p) at or below fmax, for radius r.
	below := func(z []float64, r float64, p int) int {
		return sort.Search(len(z), func(i int) bool { return frequency(e.scale, z[i], r, p, d) > fmax })
	}

	// Zeros of each order below the limit: tm[n] from J_n (p >= 0),
	// te[n] from J'_n (p >= 1), one march of physics/bessel per order.
	var tm, te [][]float64
	for n := 0; ; n++ {
		// Every zero of J_n and J'_n (n >= 1) exceeds n (DLMF 10.21(i):
		// n <= j'_{n,1} < j_{n,1}), so an order above both limits has no
		// mode; and as j_{n,1}, j'_{n,1} grow with n, neither has any
		// higher order.
		if n >= 1 && float64(n) > xTM && float64(n) > xTE {
			break
		}
		if n > MaxIndex {
			return nil, fmt.Errorf("cavity: modes up to %s may need an azimuthal index n above %d", shortFrequency(fmax), MaxIndex)
		}
		count := zeroCount(n, math.Max(xTM, xTE)) + 2
		var j, jp []float64
		var iTM, iTE int
		for {
			count = min(count, MaxIndex+1)
			j, jp = bessel.Zeros(n, count)
			iTM, iTE = below(j, aTM, 0), below(jp, a, 1)
			if iTM < count && (iTE < count || n == 0) {
				break
			}
			if count > MaxIndex {
				return nil, fmt.Errorf("cavity: modes up to %s need a radial index m above %d (order n = %d)", shortFrequency(fmax), MaxIndex, n)
			}
			count *= 2
		}
		if n >= 1 && iTM == 0 && iTE == 0 {
			break
		}
		tm = append(tm, j[:iTM])
		te = append(te, jp[:iTE])
	}
	// j'_{0,m} = j_{1,m} (DLMF 10.6.3): TE0m takes its roots from the
	// table of J_1, as Mode.Root does, so that TE0mp and TM1mp get the same
	// root to the last bit.
	// The table of J_1 holds every root TE0 needs when aTM >= a (always
	// for an isotropic fill); a uniaxial fill with eps_par < eps_perp has
	// aTM < a and gets its own table.
	te[0] = nil
	switch {
	case aTM >= a && len(tm) > 1:
		te[0] = tm[1][:below(tm[1], a, 1)]
	case aTM < a:
		z := bessel.JZeros(1, zeroCount(1, xTE)+2)
		for below(z, a, 1) == len(z) && len(z) <= MaxIndex {
			z = bessel.JZeros(1, 2*len(z))
		}
		te[0] = z[:below(z, a, 1)]
	}

	add := func(f Family, n int, xs []float64, pmin int) error {
		r := c.radiusFor(f)
		for i, x := range xs {
			kc := x / r
			// Highest axial index from k^2 >= kc^2 + (p pi/d)^2, then
			// corrected against the computed frequency so that the list
			// matches f <= fmax with f as Frequency computes it.
			pf := math.Sqrt(math.Max(0, k*k-kc*kc)) * d / math.Pi
			pmax := int(math.Min(pf, MaxIndex+2))
			for pmax >= pmin && frequency(e.scale, x, r, pmax, d) > fmax {
				pmax--
			}
			for pmax <= MaxIndex && frequency(e.scale, x, r, pmax+1, d) <= fmax {
				pmax++
			}
			if pmax > MaxIndex {
				return fmt.Errorf("cavity: modes up to %s need an axial index p above %d (%s)", shortFrequency(fmax), MaxIndex, Mode{f, n, i + 1, MaxIndex + 1})
			}
			if pmax < pmin {
				continue
			}
			cnt := pmax - pmin + 1
			e.total += cnt
			e.fields += cnt * Mode{N: n}.Degeneracy()
			if e.total > limit {
				return fmt.Errorf("cavity: more than %d modes up to %s (the listing limit)", limit, shortFrequency(fmax))
			}
			e.roots = append(e.roots, rootRange{x: x, radius: r, family: f, n: n, m: i + 1, pmin: pmin, pmax: pmax})
		}
		return nil
	}
	for n, xs := range te {
		if err := add(TE, n, xs, 1); err != nil {
			return nil, err
		}
	}
	for n, xs := range tm {
		if err := add(TM, n, xs, 0); err != nil {
			return nil, err
		}
	}
	return e, nil
}

// zeroCount estimates the number of positive zeros of J_n or J'_n below x
// from Debye's phase (DLMF 10.19.6): the zeros of J_n lie near
// sqrt(x^2 - n^2) - n arccos(n/x) = (m - 1/4) pi, those of J'_n a quarter
// period earlier. The estimate is only a starting table size; the caller
// grows the table when it falls short.
func zeroCount(n int, x float64) int {
	nf := float64(n)
	if x <= nf {
		return 1
	}
	phase := math.Sqrt(x*x-nf*nf) - nf*math.Acos(nf/x)
	return int(math.Min(phase/math.Pi+0.75, MaxIndex+1))
}
