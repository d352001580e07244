package axisym

import (
	"math"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// identityTol is the agreement of the identities below: the same model up
// to rounding, bracketed to relTol.
const identityTol = 1e-12

// reversed returns b with its sections in the opposite order (the body seen
// from the other end plate).
func reversed(b Body) Body {
	n := len(b.Sections)
	out := Body{Sections: make([]Section, n)}
	for i, s := range b.Sections {
		out.Sections[n-1-i] = s
	}
	return out
}

// scaled returns b with every dimension multiplied by k.
func scaled(b Body, k float64) Body {
	out := Body{Sections: make([]Section, len(b.Sections))}
	for i, s := range b.Sections {
		s.Length *= k
		s.Radius *= k
		s.InnerRadius *= k
		out.Sections[i] = s
	}
	return out
}

func identityBodies() []Body {
	return []Body{
		stepped(),
		fiveSections(),
		// A re-entrant post from the end plate at z = 0.
		{Sections: []Section{{Length: 0.02, Radius: 0.02, InnerRadius: 0.003}, {Length: 0.01, Radius: 0.02}}},
		// A coaxial line stepping into a wider coaxial line, then a gap.
		{Sections: []Section{
			{Length: 0.012, Radius: 0.01, InnerRadius: 0.004, Fill: physics.Medium{EpsR: 2.1}},
			{Length: 0.015, Radius: 0.018, InnerRadius: 0.002},
			{Length: 0.006, Radius: 0.018},
		}},
	}
}

// TestMirror checks that a body and its mirror image in z have the same
// resonances (Maxwell's equations are invariant under the reflection):
// the junction assembly treats a wider section on either side alike.
func TestMirror(t *testing.T) {
	for bi, b := range identityBodies() {
		r1, err1 := Solve(b, Request{MaxFrequency: 12e9, Modes: 16})
		r2, err2 := Solve(reversed(b), Request{MaxFrequency: 12e9, Modes: 16})
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		if len(r1) != len(r2) || len(r1) == 0 {
			t.Fatalf("body %d: %d resonances, mirrored %d", bi, len(r1), len(r2))
		}
		for i := range r1 {
			if d := math.Abs(r1[i].Frequency-r2[i].Frequency) / r1[i].Frequency; d > identityTol {
				t.Errorf("body %d: %v0 #%d = %.15g Hz, mirrored %.15g Hz", bi, r1[i].Family, r1[i].Index, r1[i].Frequency, r2[i].Frequency)
			}
		}
	}
}

// TestScaling checks that multiplying every dimension by k divides every
// frequency by k (the scale invariance of Maxwell's equations in
// loss-free media).
func TestScaling(t *testing.T) {
	const k = 2.5
	for bi, b := range identityBodies() {
		r1, err1 := Solve(b, Request{MaxFrequency: 12e9, Modes: 16})
		r2, err2 := Solve(scaled(b, k), Request{MaxFrequency: 12e9 / k, Modes: 16})
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		if len(r1) != len(r2) {
			t.Fatalf("body %d: %d resonances, scaled %d", bi, len(r1), len(r2))
		}
		for i := range r1 {
			if d := math.Abs(r1[i].Frequency-k*r2[i].Frequency) / r1[i].Frequency; d > identityTol {
				t.Errorf("body %d: %v0 #%d = %.15g Hz, scaled x%g %.15g Hz", bi, r1[i].Family, r1[i].Index, r1[i].Frequency, k, r2[i].Frequency)
			}
		}
	}
}

// TestCountComplete checks on a fine grid that the count never falls and
// steps only at the roots found: a count made non-monotone by rounding in
// the elimination would make the isolation miss or duplicate roots.
func TestCountComplete(t *testing.T) {
	b := fiveSections()
	for _, fam := range []cavity.Family{cavity.TE, cavity.TM} {
		f, _, err := resonances(b, fam, 12e9, 20, false)
		if err != nil {
			t.Fatal(err)
		}
		counts, _ := ModeCounts(b, fam, 12e9, 20)
		s, _ := newSystem(b, fam, counts)
		sv := &solver{s: s, a: make([]float64, s.ndof*s.ndof)}
		s.calibrate(b, sv.a)
		// The count must step by exactly one at each root and nowhere else
		// on a fine grid.
		prev := 0
		const steps = 4000
		k := 0
		for i := 1; i <= steps; i++ {
			x := 12e9 * float64(i) / steps
			j, _ := sv.count(x)
			for k < len(f) && f[k] < x {
				k++
			}
			if j != k {
				t.Fatalf("%v0: count below %g Hz = %d, want %d (roots %v)", fam, x, j, k, f)
			}
			if j < prev {
				t.Fatalf("%v0: count fell from %d to %d at %g Hz", fam, prev, j, x)
			}
			prev = j
		}
	}
}
