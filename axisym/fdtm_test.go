package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// fdTM0 returns the lowest k^2 (1/m^2) of the TM0 (H_phi) problem of a
// vacuum body of sections (circular or coaxial) by a cell-centred finite
// volume scheme on a square grid of step h, which must divide every radius
// and length.
//
// H_phi = u(r, z) makes the Rayleigh quotient
//
//	k^2 = min int [ (1/r) (d(r u)/dr)^2 + r (du/dz)^2 ] dr dz / int r u^2 dr dz
//
// stationary (the curl-curl form of Maxwell's equations for n = 0 TM
// fields; Jackson, Classical Electrodynamics, 3rd ed., sec. 8.7, as
// recalled); E_t = 0 on metal is its natural boundary condition, so metal
// faces carry no term, and u ~ r at the axis gives the axis cell the term
// 2 h u^2 (derived: int_0^{h/2} (1/r)(d(r u)/dr)^2 dr with u linear in r).
// Faces between cells give r (du)^2 (z faces) and (d(r u))^2/r_face (r
// faces). The lowest eigenvalue comes from inverse iteration with a banded
// Cholesky factor.
func fdTM0(secs []Section, h float64) float64 {
	// Cells: centre r_i = (i + 1/2) h, z_j = (j + 1/2) h.
	var nz int
	var lo, hi []float64
	for _, s := range secs {
		n := int(math.Round(s.Length / h))
		for range n {
			lo, hi = append(lo, s.InnerRadius), append(hi, s.Radius)
		}
		nz += n
	}
	idx := make([][]int, nz)
	n, w := 0, 0
	for j := range nz {
		i0 := int(math.Round(lo[j] / h))
		m := int(math.Round(hi[j] / h))
		idx[j] = make([]int, m)
		for i := range idx[j] {
			idx[j][i] = -1
		}
		for i := i0; i < m; i++ {
			idx[j][i] = n
			n++
		}
		w = max(w, m)
	}
	at := func(i, j int) int {
		if j < 0 || j >= nz || i < 0 || i >= len(idx[j]) {
			return -1
		}
		return idx[j][i]
	}
	band := make([]float64, n*(w+1))
	mass := make([]float64, n)
	addA := func(p, q int, v float64) { // symmetric entry, p >= q
		band[p*(w+1)+p-q] += v
	}
	rc := func(i int) float64 { return (float64(i) + 0.5) * h }
	for j := range nz {
		for i := range idx[j] {
			p := idx[j][i]
			if p < 0 {
				continue
			}
			r := rc(i)
			mass[p] = r * h * h
			if i == 0 {
				addA(p, p, 2*h)
			}
			// r face to the cell at i+1: (r_{i+1} u_{i+1} - r_i u_i)^2 / r_f.
			if q := at(i+1, j); q >= 0 {
				rf := float64(i+1) * h
				r1 := rc(i + 1)
				addA(p, p, r*r/rf)
				addA(q, q, r1*r1/rf)
				addA(q, p, -r*r1/rf) // q > p: same row j, larger i
			}
			// z face to the cell at j+1: r (u_{j+1} - u_j)^2.
			if q := at(i, j+1); q >= 0 {
				addA(p, p, r)
				addA(q, q, r)
				addA(q, p, -r)
			}
		}
	}
	// Banded Cholesky and inverse iteration, as in fdTE0.
	for p := range n {
		for q := max(0, p-w); q <= p; q++ {
			s := band[p*(w+1)+p-q]
			for k := max(0, p-w, q-w); k < q; k++ {
				s -= band[p*(w+1)+p-k] * band[q*(w+1)+q-k]
			}
			if q == p {
				band[p*(w+1)] = math.Sqrt(s)
			} else {
				band[p*(w+1)+p-q] = s / band[q*(w+1)]
			}
		}
	}
	solve := func(b []float64) {
		for p := range n {
			s := b[p]
			for k := max(0, p-w); k < p; k++ {
				s -= band[p*(w+1)+p-k] * b[k]
			}
			b[p] = s / band[p*(w+1)]
		}
		for p := n - 1; p >= 0; p-- {
			s := b[p]
			for k := p + 1; k <= min(n-1, p+w); k++ {
				s -= band[k*(w+1)+k-p] * b[k]
			}
			b[p] = s / band[p*(w+1)]
		}
	}
	x := make([]float64, n)
	for p := range x {
		x[p] = 1
	}
	y := make([]float64, n)
	var lambda float64
	for range 500 {
		for p := range y {
			y[p] = mass[p] * x[p]
		}
		solve(y)
		var num, den float64
		for p := range y {
			num += x[p] * mass[p] * x[p]
			den += x[p] * mass[p] * y[p]
		}
		next := num / den
		var s float64
		for _, v := range y {
			s += v * v
		}
		s = math.Sqrt(s)
		for p := range x {
			x[p] = y[p] / s
		}
		if math.Abs(next-lambda) <= 1e-14*next {
			lambda = next
			break
		}
		lambda = next
	}
	return lambda
}

// TestTMFiniteDifference is test group 5 for TM0: the lowest TM0
// resonance of a closed cylinder (a check of the scheme against the closed
// form) and of a re-entrant body and the stepped body against the
// extrapolated finite-volume solution (exponent 4/3, as in
// TestSteppedFiniteDifference).
func TestTMFiniteDifference(t *testing.T) {
	if testing.Short() {
		t.Skip("finite volumes on up to 48000 cells")
	}
	for _, tc := range []struct {
		name string
		b    Body
		p    float64
	}{
		{"cylinder", Body{Sections: []Section{{Length: 0.03, Radius: 0.02}}}, 2},
		{"re-entrant", Body{Sections: []Section{{Length: 0.02, Radius: 0.02, InnerRadius: 0.004}, {Length: 0.01, Radius: 0.02}}}, 4.0 / 3},
		{"stepped", stepped(), 4.0 / 3},
	} {
		hs := []float64{0.02 / 60, 0.02 / 90, 0.02 / 120}
		var lam [3]float64
		for i, h := range hs {
			lam[i] = fdTM0(tc.b.Sections, h)
		}
		extrap := func(i int) float64 {
			a, c := math.Pow(hs[i], tc.p), math.Pow(hs[i+1], tc.p)
			return (lam[i+1]*a - lam[i]*c) / (a - c)
		}
		ex1, ex2 := extrap(0), extrap(1)
		fd := physics.SpeedOfLight * math.Sqrt(ex2) / (2 * math.Pi)
		acc := fdSafety*math.Abs(ex2-ex1)/ex2/2 + 1e-7
		got, err := Solve(tc.b, Request{MaxFrequency: 8e9, Modes: 60, Families: []cavity.Family{cavity.TM}})
		if err != nil || len(got) == 0 {
			t.Fatal(got, err)
		}
		d := math.Abs(got[0].Frequency-fd) / fd
		t.Logf("%s: finite volumes %.9g Hz (accuracy %.2g), mode matching %.9g Hz, rel. difference %.2g", tc.name, fd, acc, got[0].Frequency, d)
		if d > acc+got[0].Change/fd {
			t.Errorf("%s: TM0 #1 = %.9g Hz, want %.9g Hz (finite volumes, accuracy %.2g), rel. difference %.2g",
				tc.name, got[0].Frequency, fd, acc, d)
		}
	}
}
