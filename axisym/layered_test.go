package axisym

import (
	"bufio"
	"errors"
	"math"
	"os"
	"sort"
	"strconv"
	"strings"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// rodBody is a full-length dielectric rod of radius b and permittivity eps
// in a can of radius a and length l.
func rodBody(a, b, eps, l float64) Body {
	return Body{Sections: []Section{{Length: l, Radius: a, Layers: []Layer{
		{Radius: b, Medium: physics.Medium{EpsR: eps}}, {Radius: a},
	}}}}
}

// TestLayeredRodMpmath checks every TE0 and TM0 resonance below a limit of
// a full-length dielectric rod in a can against the two-layer
// characteristic equation solved with mpmath at 30 digits
// (testdata/gen_rod.py, rod.tsv): the list must match one to one (none
// missed, none extra), each frequency to rodTol.
func TestLayeredRodMpmath(t *testing.T) {
	// rodTol: issue 11, test group 4 (a body without steps has no
	// truncation error; the roots are refined to about 1e-14).
	const rodTol = 1e-9
	f, err := os.Open("testdata/rod.tsv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	type key struct {
		name string
		fam  cavity.Family
	}
	want := map[key][]float64{}
	geo := map[string][5]float64{}
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "#") || line == "" {
			continue
		}
		fs := strings.Split(line, "\t")
		var v [5]float64
		for i := range v {
			v[i], _ = strconv.ParseFloat(fs[i+1], 64)
		}
		geo[fs[0]] = v
		fam := cavity.TE
		if fs[6] == "TM" {
			fam = cavity.TM
		}
		x, err := strconv.ParseFloat(fs[8], 64)
		if err != nil {
			t.Fatal(err)
		}
		want[key{fs[0], fam}] = append(want[key{fs[0], fam}], x)
	}
	if len(want) != 4 {
		t.Fatalf("expected 2 cases x 2 families, got %d", len(want))
	}
	for k, ref := range want {
		sort.Float64s(ref)
		g := geo[k.name]
		body := rodBody(g[0], g[1], g[2], g[3])
		res, err := Solve(body, Request{MaxFrequency: g[4], Families: []cavity.Family{k.fam}})
		if err != nil {
			t.Fatal(err)
		}
		if len(res) != len(ref) {
			got := []float64{}
			for _, r := range res {
				got = append(got, r.Frequency)
			}
			t.Errorf("%s %v: %d resonances, mpmath %d\n got %v\nwant %v", k.name, k.fam, len(res), len(ref), got, ref)
			continue
		}
		worst := 0.0
		for i, r := range res {
			d := math.Abs(r.Frequency-ref[i]) / ref[i]
			worst = max(worst, d)
			if !(d <= rodTol) {
				t.Errorf("%s %v%d: %.12g Hz, mpmath %.12g Hz (rel %.2g)", k.name, k.fam, i+1, r.Frequency, ref[i], d)
			}
		}
		t.Logf("%s %v: %d resonances, worst relative difference %.2g", k.name, k.fam, len(res), worst)
	}
}

// TestLayeredValidate checks the errors of layered sections.
func TestLayeredValidate(t *testing.T) {
	ok := rodBody(0.01, 0.004, 10, 0.008)
	if err := ok.Validate(); err != nil {
		t.Fatal(err)
	}
	bad := []struct {
		name   string
		layers []Layer
		inner  float64
		fill   physics.Medium
		want   string
	}{
		{"decreasing", []Layer{{Radius: 0.005}, {Radius: 0.004}, {Radius: 0.01}}, 0, physics.Medium{}, "layer 2: outer radius must be above"},
		{"outside", []Layer{{Radius: 0.004}, {Radius: 0.011}}, 0, physics.Medium{}, "layer 2: outer radius"},
		{"short", []Layer{{Radius: 0.004}, {Radius: 0.009}}, 0, physics.Medium{}, "must equal the section radius"},
		{"inner", []Layer{{Radius: 0.004}, {Radius: 0.01}}, 0.005, physics.Medium{}, "inner conductor radius"},
		{"fill", []Layer{{Radius: 0.004}, {Radius: 0.01}}, 0, physics.Medium{EpsR: 2}, "fill must be left empty"},
		{"medium", []Layer{{Radius: 0.004, Medium: physics.Medium{EpsR: -3}}, {Radius: 0.01}}, 0, physics.Medium{}, "layer 1: medium"},
		{"magnetic", []Layer{{Radius: 0.004, Medium: physics.Medium{MuR: 2}}, {Radius: 0.01}}, 0, physics.Medium{}, "not implemented"},
	}
	for _, c := range bad {
		b := Body{Sections: []Section{{Length: 0.01, Radius: 0.01}, {Length: 0.01, Radius: 0.01, InnerRadius: c.inner, Fill: c.fill, Layers: c.layers}}}
		err := b.Validate()
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.Contains(err.Error(), "section 2") {
			t.Errorf("%s: got %v, want an error naming section 2 with %q", c.name, err, c.want)
		}
	}
	b := rodBody(0.01, 0.004, 10, 0.008)
	b.Sections[0].Layers[0].Medium.MuR = 2
	if err := b.Validate(); !errors.Is(err, ErrNotImplemented) {
		t.Errorf("magnetic layer: %v", err)
	}
}
