package filter

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"math"
	"math/cmplx"
	"strconv"
	"strings"
	"testing"
)

// tsFile is a two-port file as read back by readTouchstone.
type tsFile struct {
	comments []string
	option   []string
	freq     []float64
	s        [][4]complex128 // S11 S21 S12 S22
}

// readTouchstone is a small independent reader of Touchstone 1.1 two-port
// files (RI, MA or DB data; frequency units HZ/KHZ/MHZ/GHZ), following the
// published specification rather than the writer's code.
func readTouchstone(r io.Reader) (*tsFile, error) {
	ts := &tsFile{}
	unit := 1.0
	format := "MA"
	sc := bufio.NewScanner(r)
	for sc.Scan() {
		line := sc.Text()
		if i := strings.Index(line, "!"); i >= 0 {
			ts.comments = append(ts.comments, strings.TrimSpace(line[i+1:]))
			line = line[:i]
		}
		f := strings.Fields(line)
		if len(f) == 0 {
			continue
		}
		if f[0] == "#" {
			if ts.option != nil {
				return nil, fmt.Errorf("second option line")
			}
			ts.option = f[1:]
			for _, w := range f[1:] {
				switch strings.ToUpper(w) {
				case "HZ":
					unit = 1
				case "KHZ":
					unit = 1e3
				case "MHZ":
					unit = 1e6
				case "GHZ":
					unit = 1e9
				case "RI", "MA", "DB":
					format = strings.ToUpper(w)
				}
			}
			continue
		}
		if ts.option == nil {
			return nil, fmt.Errorf("data before the option line")
		}
		if len(f) != 9 {
			return nil, fmt.Errorf("two-port data line has %d fields, want 9", len(f))
		}
		v := make([]float64, 9)
		for i, x := range f {
			var err error
			if v[i], err = strconv.ParseFloat(x, 64); err != nil {
				return nil, err
			}
		}
		var s [4]complex128
		for k := 0; k < 4; k++ {
			a, b := v[1+2*k], v[2+2*k]
			switch format {
			case "RI":
				s[k] = complex(a, b)
			case "MA":
				s[k] = cmplx.Rect(a, b*math.Pi/180)
			case "DB":
				s[k] = cmplx.Rect(math.Pow(10, a/20), b*math.Pi/180)
			}
		}
		ts.freq = append(ts.freq, v[0]*unit)
		ts.s = append(ts.s, s)
	}
	return ts, sc.Err()
}

func TestTouchstoneRoundTrip(t *testing.T) {
	d, err := Synthesize(Spec{F0: 11.2e9, BW: 80e6, Order: 5, ReturnLoss: 24, Zeros: []float64{1.6, -2.2}})
	if err != nil {
		t.Fatal(err)
	}
	var freqs []float64
	for i := 0; i <= 200; i++ {
		freqs = append(freqs, 11.0e9+float64(i)*2e6)
	}
	freqs = append(freqs, BandpassFrequency(1.6, 11.2e9, 80e6)+1e9) // above the sweep, still ascending
	pts, err := d.Response(freqs, []float64{4000, 4000, 4000, 4000, 4000})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := WriteTouchstone(&buf, pts, d.Summary()); err != nil {
		t.Fatal(err)
	}
	ts, err := readTouchstone(bytes.NewReader(buf.Bytes()))
	if err != nil {
		t.Fatal(err)
	}
	if got := strings.Join(ts.option, " "); got != "HZ S RI R 50" {
		t.Errorf("option line %q, want %q", got, "HZ S RI R 50")
	}
	all := strings.Join(ts.comments, "\n")
	for _, want := range []string{"order 5", "S21 = S12 = -2j[A^-1](N+1,0)", "S11 = -1 - 2j[A^-1](0,0)", "N11 N21 N12 N22"} {
		if !strings.Contains(all, want) {
			t.Errorf("comments lack %q:\n%s", want, all)
		}
	}
	if len(ts.freq) != len(pts) {
		t.Fatalf("read %d points, wrote %d", len(ts.freq), len(pts))
	}
	// rtTol: 12 significant digits written.
	const rtTol = 1e-11
	for i, p := range pts {
		if !close(ts.freq[i], p.F, rtTol) {
			t.Errorf("point %d: f = %v, want %v", i, ts.freq[i], p.F)
		}
		want := [4]complex128{p.S11, p.S21, p.S21, p.S22}
		for k := range want {
			if cmplx.Abs(ts.s[i][k]-want[k]) > rtTol*math.Max(1e-3, cmplx.Abs(want[k])) {
				t.Errorf("point %d S[%d] = %v, want %v", i, k, ts.s[i][k], want[k])
			}
		}
	}
	if strings.Count(buf.String(), "\n#") != 1 || !strings.HasPrefix(buf.String(), "! ") {
		t.Errorf("file layout: header must be comment lines then one option line:\n%s", buf.String()[:200])
	}
}

func TestTouchstoneErrors(t *testing.T) {
	p := []Point{{F: 2e9}, {F: 1e9}}
	for _, c := range []struct {
		pts      []Point
		comments []string
		want     string
	}{
		{nil, nil, "at least one frequency"},
		{p, nil, "strictly ascending"},
		{[]Point{{F: 0}}, nil, "frequency must be > 0 Hz"},
		{[]Point{{F: 1e9, S21: cmplx.NaN()}}, nil, "non-finite"},
		{[]Point{{F: 1e9}}, []string{"two\nlines"}, "line break"},
	} {
		err := WriteTouchstone(io.Discard, c.pts, c.comments)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("WriteTouchstone error = %v, want one containing %q", err, c.want)
		}
	}
}

// TestTouchstoneFrequencyDigits: every frequency reads back as exactly the
// float64 written, and the response recomputed at the frequency as read
// equals the data to the 12 digits written. The filter is 50 kHz wide at
// 10 GHz (FBW 5e-6), where Omega = (f0/bw)(f/f0 - f0/f) amplifies a
// relative frequency error by 2 f0/bw = 4e5: a frequency printed with 12
// digits (rounding up to 5e-12 relative) moves Omega by up to 2e-6 and the
// steep skirt's S21 by far more than 12 digits allow.
func TestTouchstoneFrequencyDigits(t *testing.T) {
	const f0, bw = 10e9, 50e3
	d, err := Synthesize(Spec{F0: f0, BW: bw, Order: 8, ReturnLoss: 26})
	if err != nil {
		t.Fatal(err)
	}
	lo, hi := BandpassFrequency(-3, f0, bw), BandpassFrequency(3, f0, bw)
	fs, err := Sweep(lo, hi, 1001)
	if err != nil {
		t.Fatal(err)
	}
	pts, err := d.Response(fs, nil)
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := WriteTouchstone(&buf, pts, nil); err != nil {
		t.Fatal(err)
	}
	ts, err := readTouchstone(&buf)
	if err != nil {
		t.Fatal(err)
	}
	again, err := d.Response(ts.freq, nil)
	if err != nil {
		t.Fatal(err)
	}
	// dataTol: 12 significant digits written for |S| <= 1.
	const dataTol = 1e-11
	bad := 0
	for i, p := range again {
		if ts.freq[i] != fs[i] {
			t.Errorf("point %d: frequency read back %v Hz, written %v Hz", i, ts.freq[i], fs[i])
		}
		if e := cmplx.Abs(ts.s[i][1] - p.S21); e > dataTol && bad < 5 {
			bad++
			t.Errorf("point %d at %v Hz: S21 in the file %v, at the frequency as read %v (|diff| %.3g)", i, ts.freq[i], ts.s[i][1], p.S21, e)
		}
	}
}
