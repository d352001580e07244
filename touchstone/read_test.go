package touchstone

import (
	"bytes"
	"encoding/json"
	"errors"
	"math"
	"math/cmplx"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// skrfTol: scikit-rf reads the same decimal text with numpy; MA and DB
// files go through trigonometry and powers of ten on both sides, which
// differ by a few ulps.
const skrfTol = 1e-12

func readFile(t *testing.T, name string) *Data {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("testdata", name))
	if err != nil {
		t.Fatal(err)
	}
	d, err := Read(bytes.NewReader(b), PortsFromName(name))
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return d
}

// TestReadAgainstScikitRF compares Read with scikit-rf 0.15.4 reading the
// same files (touchstone/testdata/gen_skrf.py).
func TestReadAgainstScikitRF(t *testing.T) {
	b, err := os.ReadFile("testdata/skrf_read.json")
	if err != nil {
		t.Fatal(err)
	}
	var ref struct {
		Files map[string]struct {
			Ports int
			Z0    []float64 `json:"z0_ohm"`
			F     []float64 `json:"f_hz"`
			S     [][][2]float64
		}
	}
	if err := json.Unmarshal(b, &ref); err != nil {
		t.Fatal(err)
	}
	if len(ref.Files) != 4 {
		t.Fatalf("skrf_read.json has %d files, want 4", len(ref.Files))
	}
	for name, want := range ref.Files {
		d := readFile(t, name)
		if d.Ports != want.Ports || len(d.Freq) != len(want.F) {
			t.Fatalf("%s: %d ports, %d points; scikit-rf %d, %d", name, d.Ports, len(d.Freq), want.Ports, len(want.F))
		}
		for i, z := range want.Z0 {
			if d.Z0[i] != z {
				t.Errorf("%s: Z0[%d] = %v, want %v", name, i, d.Z0[i], z)
			}
		}
		for k, f := range want.F {
			if math.Abs(d.Freq[k]-f) > skrfTol*f {
				t.Errorf("%s: f[%d] = %v, want %v", name, k, d.Freq[k], f)
			}
			for p := range want.S {
				w := complex(want.S[p][k][0], want.S[p][k][1])
				if cmplx.Abs(d.S[p][k]-w) > skrfTol*math.Max(1, cmplx.Abs(w)) {
					t.Errorf("%s: S[%d][%d] = %v, want %v", name, p, k, d.S[p][k], w)
				}
			}
		}
	}
	// Version 2.0 variant (scikit-rf 0.15 cannot read it): same numbers as filter.s2p.
	v1, v2 := readFile(t, "filter.s2p"), readFile(t, "variant_v2.s2p")
	if v2.Version != "2.0" || len(v2.Freq) != len(v1.Freq) {
		t.Fatalf("variant_v2.s2p: version %q, %d points; want 2.0, %d", v2.Version, len(v2.Freq), len(v1.Freq))
	}
	for p := range v1.S {
		for k := range v1.Freq {
			if v1.Freq[k] != v2.Freq[k] || cmplx.Abs(v1.S[p][k]-v2.S[p][k]) > skrfTol {
				t.Fatalf("variant_v2.s2p: point %d S[%d] = %v, filter.s2p %v", k, p, v2.S[p][k], v1.S[p][k])
			}
		}
	}
}

// TestRoundTripExact: what Write writes, Read reads back exactly: the
// frequencies bit for bit (shortest round-trip form), the S-parameters as
// the written decimals (rounded to 12 significant digits).
func TestRoundTripExact(t *testing.T) {
	d := readFile(t, "filter.s2p")
	d.Comments = []string{"round trip"}
	var buf bytes.Buffer
	if err := Write(&buf, d); err != nil {
		t.Fatal(err)
	}
	got, err := Read(bytes.NewReader(buf.Bytes()), 2)
	if err != nil {
		t.Fatal(err)
	}
	round := func(x float64) float64 {
		v, _ := strconv.ParseFloat(strconv.FormatFloat(x, 'e', 11, 64), 64)
		return v
	}
	for k := range d.Freq {
		if got.Freq[k] != d.Freq[k] {
			t.Fatalf("f[%d] = %v, want %v", k, got.Freq[k], d.Freq[k])
		}
		for p := range d.S {
			w := complex(round(real(d.S[p][k])), round(imag(d.S[p][k])))
			if got.S[p][k] != w {
				t.Fatalf("S[%d][%d] = %v, want %v", p, k, got.S[p][k], w)
			}
		}
	}
	// The file cylcav filter wrote is RI with 12 digits: reading it and
	// writing it again gives the same data lines byte for byte.
	orig, _ := os.ReadFile("testdata/filter.s2p")
	data := func(b []byte) string {
		var keep []string
		for _, l := range strings.Split(string(b), "\n") {
			if !strings.HasPrefix(l, "!") {
				keep = append(keep, l)
			}
		}
		return strings.Join(keep, "\n")
	}
	if data(buf.Bytes()) != data(orig) {
		t.Error("rewriting filter.s2p changed its option or data lines")
	}
}

func TestReadFormats(t *testing.T) {
	// Hand-worked values: MA 0.5 at 90 deg is 0.5j; DB -6.0206 dB at 180 deg is -0.5.
	const small = 1e-5 // -6.0206 dB is 0.5 to 5 digits
	for _, c := range []struct {
		name, text string
		ports      int
		f          float64
		s11        complex128
		z0         float64
	}{
		{"default GHz MA", "# \n1 0.5 90\n", 1, 1e9, 0.5i, 50},
		{"DB kHz", "#khz s db r 75\n2.5 -6.0206 180\n", 1, 2500, -0.5, 75},
		{"RI Hz, comment", "! c\n# HZ S RI R 50 ! trailing\n100 0.1 -0.2 ! point\n", 1, 100, 0.1 - 0.2i, 50},
		{"two-port inferred", "# MHZ S RI\n3 1 0 2 0 3 0 4 0\n", 0, 3e6, 1, 50},
	} {
		d, err := Read(strings.NewReader(c.text), c.ports)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if d.Freq[0] != c.f || cmplx.Abs(d.S[0][0]-c.s11) > small || d.Z0[0] != c.z0 {
			t.Errorf("%s: f %v S11 %v Z0 %v, want %v %v %v", c.name, d.Freq[0], d.S[0][0], d.Z0[0], c.f, c.s11, c.z0)
		}
	}
	// Two-port order of version 1.1: N11 N21 N12 N22.
	d, err := Read(strings.NewReader("# HZ S RI\n1 1 0 2 0 3 0 4 0\n"), 2)
	if err != nil {
		t.Fatal(err)
	}
	if d.Param(2, 1)[0] != 2 || d.Param(1, 2)[0] != 3 || d.Param(2, 2)[0] != 4 {
		t.Errorf("two-port order: S21 %v S12 %v S22 %v, want 2 3 4", d.Param(2, 1)[0], d.Param(1, 2)[0], d.Param(2, 2)[0])
	}
	// Noise data after the network data of a two-port file is skipped.
	d, err = Read(strings.NewReader("# HZ S RI\n1 1 0 2 0 3 0 4 0\n2 1 0 2 0 3 0 4 0\n1 2 0.5 10 0.3\n2 2 0.5 10 0.3\n"), 2)
	if err != nil || len(d.Freq) != 2 {
		t.Errorf("noise data: %v, %d points", err, len(d.Freq))
	}
}

func TestReadErrors(t *testing.T) {
	for _, c := range []struct {
		text  string
		ports int
		line  int
		want  string
	}{
		{"# HZ S RI\n1 0 0\n1 0 0\n", 1, 3, "strictly ascending"},
		{"# HZ S RI\n2 0 0\n1 0 0\n", 1, 3, "strictly ascending"},
		{"# HZ S RI\n1 0 0\n", 2, 2, "a 2-port line has 9"},
		{"# HZ S RI\n1 0 0 0 0\n", 0, 2, "first data line has 5 numbers"},
		{"# HZ S RI\n1 0 x\n", 1, 2, `field 3 "x"`},
		{"# HZ S RI\n1 0 NaN\n", 1, 2, "not a finite number"},
		{"1 0 0\n", 1, 1, "before the option line"},
		{"# HZ Y RI\n1 0 0\n", 1, 1, "Y-parameters are not supported"},
		{"# HZ S XX\n", 1, 1, `unknown field "XX"`},
		{"# HZ S RI R\n", 1, 1, "R needs"},
		{"# HZ S RI R -5\n", 1, 1, "> 0 ohm"},
		{"! only comments\n", 1, 0, "no network data"},
		{"# HZ S RI\n[Number of Ports] 1\n", 1, 2, "version 1.1 file"},
		{"[Version] 2.0\n# HZ S RI\n[Number of Ports] 3\n", 0, 3, "3-port files are not supported"},
		{"[Version] 2.0\n# HZ S RI\n[Number of Ports] 2\n[Number of Frequencies] 1\n[Network Data]\n", 0, 5, "Two-Port Data Order"},
		{"[Version] 2.0\n# HZ S RI\n[Number of Ports] 1\n[Number of Frequencies] 2\n[Network Data]\n1 0 0\n", 0, 0, "is 2, the file has 1"},
		{"[Version] 2.0\n# HZ S RI\n[Number of Ports] 1\n[Number of Frequencies] 1\n[Network Data]\n1 0\n", 0, 6, "record has 2 of 3"},
		{"[Version] 2.0\n# HZ S RI\n[Number of Ports] 2\n", 1, 3, "file name says 1"},
		{"[Version] 2.0\n[Bogus] 1\n", 0, 2, "unknown keyword [bogus]"},
		{"[Version] 3.0\n", 0, 1, "not supported"},
	} {
		_, err := Read(strings.NewReader(c.text), c.ports)
		var pe *ParseError
		if !errors.As(err, &pe) || pe.Line != c.line || !strings.Contains(pe.Msg, c.want) {
			t.Errorf("Read(%q) error = %v, want line %d and %q", c.text, err, c.line, c.want)
		}
	}
	if _, err := Read(strings.NewReader(""), 4); err == nil || !strings.Contains(err.Error(), "4-port") {
		t.Errorf("Read(ports 4) error = %v, want a refusal", err)
	}
}

func TestPortsFromName(t *testing.T) {
	for name, want := range map[string]int{"a.s1p": 1, "dir/b.S2P": 2, "c.s10p": 10, "d.txt": 0, "e.sp": 0, "s2p": 0} {
		if got := PortsFromName(name); got != want {
			t.Errorf("PortsFromName(%q) = %d, want %d", name, got, want)
		}
	}
}

func TestWriteErrors(t *testing.T) {
	ok := func() *Data {
		return &Data{Ports: 1, Z0: []float64{50}, Freq: []float64{1, 2}, S: [][]complex128{{0, 0}}}
	}
	for _, c := range []struct {
		mod  func(*Data)
		want string
	}{
		{func(d *Data) { d.Freq = []float64{2, 1} }, "strictly ascending"},
		{func(d *Data) { d.Freq, d.S[0] = nil, nil }, "at least one frequency"},
		{func(d *Data) { d.S[0][1] = cmplx.NaN() }, "non-finite"},
		{func(d *Data) { d.Comments = []string{"a\nb"} }, "line break"},
		{func(d *Data) { d.Z0[0] = 0 }, "reference impedance"},
		{func(d *Data) { d.Ports = 3 }, "only 1 and 2"},
	} {
		d := ok()
		c.mod(d)
		if err := Write(&bytes.Buffer{}, d); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("Write error = %v, want one containing %q", err, c.want)
		}
	}
}

// FuzzRead: Read never panics, and whatever it accepts is a valid sweep
// that Write can write and Read reads back to the same point count.
func FuzzRead(f *testing.F) {
	for _, name := range []string{"variant_ri_khz.s1p", "variant_v2.s2p"} {
		b, _ := os.ReadFile(filepath.Join("testdata", name))
		f.Add(string(b[:min(len(b), 2000)]), 0)
	}
	f.Add("# HZ S RI\n1 1 0 2 0 3 0 4 0\n1 2 0.5 10 0.3\n", 2)
	f.Add("[Version] 2.0\n# HZ S RI\n[Number of Ports] 1\n[Reference] \n 50\n[Number of Frequencies] 1\n[Network Data]\n1\n0 0\n[End]\n", 0)
	f.Fuzz(func(t *testing.T, text string, ports int) {
		d, err := Read(strings.NewReader(text), ports)
		if err != nil {
			return
		}
		if err := d.Validate(); err != nil {
			t.Fatalf("Read accepted an invalid sweep: %v", err)
		}
		if d.Z0[0] != d.Z0[len(d.Z0)-1] {
			return
		}
		var buf bytes.Buffer
		if err := Write(&buf, &Data{Ports: d.Ports, Z0: d.Z0, Freq: d.Freq, S: d.S}); err != nil {
			t.Fatalf("Write of a read sweep: %v", err)
		}
		back, err := Read(&buf, d.Ports)
		if err != nil || len(back.Freq) != len(d.Freq) {
			t.Fatalf("read back: %v", err)
		}
	})
}
