package measure

import (
	"bytes"
	"encoding/json"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"cylcav/touchstone"
)

// recoverSigmas: a synthetic truth must lie within this many of the fit's
// stated standard uncertainties. Four keeps a correct Gaussian estimate
// from failing more than about once in 10^4 checks, and still catches an
// uncertainty understated by a factor of two or more.
const recoverSigmas = 4

// wideTol is the relative tolerance for the resonances of the wide sweep:
// their windows also hold the tails of the neighbouring resonances and the
// leakage, which the single-resonance model does not include; at the
// generator's spacings (closest pair 15 bandwidths apart) these shift QL by
// up to about 1 % (estimated from the tail's size, 1/(2*15), over the
// window).
const wideTol = 0.02

// lowNoiseAgree is the largest relative difference between the 3 dB and
// the fitted QL accepted for the low-noise sweeps: half-power points
// interpolated linearly between points 0.1 bandwidth apart are good to a
// fraction of a percent (common practice).
const lowNoiseAgree = 0.01

type truth struct {
	F0    float64 `json:"f0_hz"`
	Q0    float64 `json:"q0"`
	QL    float64 `json:"ql"`
	Beta  float64 `json:"beta"`
	Beta1 float64 `json:"beta1"`
	Beta2 float64 `json:"beta2"`
	Sigma float64 `json:"sigma"`
	Res   []truth `json:"resonances"`
}

func loadTruth(t *testing.T) map[string]truth {
	t.Helper()
	b, err := os.ReadFile("../testdata/measure/truth.json")
	if err != nil {
		t.Fatal(err)
	}
	m := map[string]truth{}
	if err := json.Unmarshal(b, &m); err != nil {
		t.Fatal(err)
	}
	return m
}

func readSweep(t testing.TB, name string) *touchstone.Data {
	t.Helper()
	fh, err := os.Open(filepath.Join("..", "testdata", "measure", name))
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	d, err := touchstone.Read(fh, touchstone.PortsFromName(name))
	if err != nil {
		t.Fatal(err)
	}
	return d
}

func within(t *testing.T, what string, got, gotErr, want float64) {
	t.Helper()
	if !(math.Abs(got-want) <= recoverSigmas*gotErr) {
		t.Errorf("%s = %.8g +- %.2g, want %.8g (off by %.1f sigma)", what, got, gotErr, want, math.Abs(got-want)/gotErr)
	}
}

// TestFitSynthetic recovers f0, QL, the couplings and Q0 of the single
// resonances made by testdata/measure/gen_sweeps.py (numpy; lumped
// resonators with coupling loss, cable delay and noise) within the fit's
// stated uncertainty.
func TestFitSynthetic(t *testing.T) {
	tr := loadTruth(t)
	for _, name := range []string{"refl_under.s1p", "refl_over.s1p", "refl_clean.s1p", "trans_weak.s2p", "trans_strong.s2p"} {
		want := tr[name]
		rs, err := Analyze(readSweep(t, name), Settings{})
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if len(rs) != 1 {
			t.Fatalf("%s: %d resonances, want 1", name, len(rs))
		}
		r := rs[0]
		if r.Problem != "" {
			t.Fatalf("%s: %s", name, r.Problem)
		}
		within(t, name+" f0", r.F0, r.F0Err, want.F0)
		within(t, name+" QL", r.QL, r.QLErr, want.QL)
		within(t, name+" Q0", r.Q0, r.Q0Err, want.Q0)
		if strings.HasSuffix(name, ".s1p") {
			within(t, name+" beta", r.Beta1, r.Beta1Err, want.Beta)
		} else {
			within(t, name+" beta1", r.Beta1, r.Beta1Err, want.Beta1)
			within(t, name+" beta2", r.Beta2, r.Beta2Err, want.Beta2)
		}
		if want.Sigma <= 1e-4 {
			if d := math.Abs(r.Q3dB-r.QL) / r.QL; !(d <= lowNoiseAgree) || !r.Agree {
				t.Errorf("%s: 3 dB QL %.6g vs fit %.6g (%.2g apart, agree %v), want agreement at low noise", name, r.Q3dB, r.QL, d, r.Agree)
			}
		}
	}
}

// TestFindWide finds the five resonances of the wide two-port sweep (a
// sloping leakage background, noise) and fits each.
func TestFindWide(t *testing.T) {
	want := loadTruth(t)["wide.s2p"].Res
	rs, err := Analyze(readSweep(t, "wide.s2p"), Settings{})
	if err != nil {
		t.Fatal(err)
	}
	if len(rs) != len(want) {
		for _, r := range rs {
			t.Logf("found %.6g Hz", r.Peak.F)
		}
		t.Fatalf("%d resonances, want %d", len(rs), len(want))
	}
	for i, w := range want {
		r := rs[i]
		if r.Problem != "" {
			t.Errorf("resonance %d: %s", i, r.Problem)
			continue
		}
		if math.Abs(r.F0-w.F0) > w.F0/w.QL/10 {
			t.Errorf("resonance %d: f0 = %.9g Hz, want %.9g Hz", i, r.F0, w.F0)
		}
		for _, c := range []struct {
			what      string
			got, want float64
		}{{"QL", r.QL, w.QL}, {"Q0", r.Q0, w.Q0}, {"beta1", r.Beta1, w.Beta1}, {"beta2", r.Beta2, w.Beta2}} {
			if math.Abs(c.got-c.want) > wideTol*c.want {
				t.Errorf("resonance %d at %.4g Hz: %s = %.5g, want %.5g", i, w.F0, c.what, c.got, c.want)
			}
		}
	}
}

func TestNoResonance(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	n := 2001
	f := make([]float64, n)
	mag := make([]float64, n)
	for i := range f {
		f[i] = 1e9 + float64(i)*1e5
		mag[i] = 1e-4 * math.Hypot(rng.NormFloat64(), rng.NormFloat64()) // complex Gaussian noise floor
	}
	_, err := FindPeaks(f, mag, FindSettings{})
	if err == nil || !strings.Contains(err.Error(), "no resonance") {
		t.Errorf("FindPeaks(noise) error = %v, want no resonance", err)
	}
	if _, err := FindPeaks(f[:3], mag[:3], FindSettings{}); err == nil {
		t.Error("FindPeaks of 3 points: no error")
	}
	if _, err := FitCircle(f[:5], make([]complex128, 5), 1e9, 1000, FitSettings{}); err == nil || !strings.Contains(err.Error(), "finer step") {
		t.Errorf("FitCircle of 5 points error = %v", err)
	}
}

// benchSweep is a two-port sweep of 20,001 points with 20 resonances
// (weakly coupled, Q0 3000..8000) on leakage, with noise and cable delay,
// written as a Touchstone file. The formula is the lumped resonator of
// gen_sweeps.py; it serves the benchmark and a count check, not a
// reference value.
func benchSweep(tb testing.TB) []byte {
	rng := rand.New(rand.NewPCG(3, 4))
	const n, nres = 20001, 20
	d := &touchstone.Data{Ports: 2, Z0: []float64{50, 50}, Freq: make([]float64, n), S: make([][]complex128, 4)}
	for p := range d.S {
		d.S[p] = make([]complex128, n)
	}
	for i := range d.Freq {
		d.Freq[i] = 4e9 + float64(i)*1e5
	}
	for i, f := range d.Freq {
		ramp := cmplx.Exp(complex(0, -2*math.Pi*f*5e-9))
		s21 := complex(3e-4, 0) * cmplx.Exp(complex(0, -2*math.Pi*f*0.7e-9))
		s11, s22 := complex(1, 0), complex(1, 0)
		for k := 0; k < nres; k++ {
			f0 := 4.05e9 + float64(k)*0.095e9
			q0 := 3000 + 250*float64(k)
			u := f/f0 - f0/f
			den := complex(1.1, q0*u)
			s21 += ramp * complex(2*0.05, 0) / den
			s11 -= complex(0.1, 0) / den
			s22 -= complex(0.1, 0) / den
		}
		noise := func() complex128 { return complex(2e-5*rng.NormFloat64(), 2e-5*rng.NormFloat64()) }
		d.S[0][i] = ramp*ramp*s11 + noise()
		d.S[1][i] = s21 + noise()
		d.S[2][i] = d.S[1][i]
		d.S[3][i] = ramp*ramp*s22 + noise()
	}
	var b bytes.Buffer
	if err := touchstone.Write(&b, d); err != nil {
		tb.Fatal(err)
	}
	return b.Bytes()
}

func TestBenchSweep(t *testing.T) {
	d, err := touchstone.Read(bytes.NewReader(benchSweep(t)), 2)
	if err != nil {
		t.Fatal(err)
	}
	rs, err := Analyze(d, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	if len(rs) != 20 {
		t.Fatalf("%d resonances, want 20", len(rs))
	}
	for k, r := range rs {
		q0 := 3000 + 250*float64(k)
		if r.Problem != "" || math.Abs(r.Q0-q0) > wideTol*q0 {
			t.Errorf("resonance %d: Q0 = %.5g (%s), want %.5g", k, r.Q0, r.Problem, q0)
		}
	}
}

// BenchmarkReadAndAnalyze reads a 20,001-point two-port Touchstone file and
// finds and fits its 20 resonances.
func BenchmarkReadAndAnalyze(b *testing.B) {
	file := benchSweep(b)
	b.ResetTimer()
	for b.Loop() {
		d, err := touchstone.Read(bytes.NewReader(file), 2)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := Analyze(d, Settings{}); err != nil {
			b.Fatal(err)
		}
	}
}
