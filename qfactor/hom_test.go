package qfactor

import (
	"math"
	"math/cmplx"
	"testing"

	"cylcav/cavity"
	"cylcav/physics"
)

// lorentzTol is the agreement of the transverse R/Q with the integrated
// Lorentz force: composite Simpson's rule on 4000 intervals of smooth
// fields has a truncation error near 1e-13 relative; 1e-9 leaves room.
const lorentzTol = 1e-9

// kickIntegral returns V_perp = integral (E_x + v (z x B)_x) e^{j k z} dz
// along the axis of cavity c for the field mf (stored energy 1 J), the
// transverse voltage beta c Delta p_x / q of a particle of speed beta c
// (Lorentz force on a straight path, phasor form). On the axis at phi = 0
// the x direction is rho-hat: (z x B)_x = -B_phi, with B = mu j H in the
// phase convention of cavity.Field.
func kickIntegral(c cavity.Cavity, mf cavity.ModeField, beta float64) complex128 {
	const n = 4000
	v := beta * physics.SpeedOfLight
	k := mf.Omega() / v
	h := c.Length / n
	var s complex128
	for i := 0; i <= n; i++ {
		z := float64(i) * h
		f := mf.At(cavity.Point{Rho: 0, Phi: 0, Z: z})
		integrand := (complex(f.E.Rho, 0) - complex(0, v*mf.Mu()*f.H.Phi)) * cmplx.Rect(1, k*z)
		w := 2.0
		switch {
		case i == 0 || i == n:
			w = 1
		case i%2 == 1:
			w = 4
		}
		s += complex(w, 0) * integrand
	}
	return s * complex(h/3, 0)
}

// TestTransverseROverQLorentz checks the transverse R/Q of dipole modes of
// a pillbox against the Lorentz force integrated along the axis through
// the fields of cavity.ModeField (stored energy 1 J): (R/Q)_perp =
// |V_perp|^2/(omega U). This route uses neither the Panofsky-Wenzel
// theorem nor the closed-form stored energy. TE1mp modes must give no
// kick at all.
func TestTransverseROverQLorentz(t *testing.T) {
	c, _ := pillbox13()
	for _, tc := range []struct {
		mode string
		beta float64
	}{{"TM110", 1}, {"TM110", 0.8}, {"TM111", 1}, {"TM121", 0.6}, {"TE111", 1}} {
		m, err := cavity.ParseMode(tc.mode)
		if err != nil {
			t.Fatal(err)
		}
		mf, err := c.ModeField(m)
		if err != nil {
			t.Fatal(err)
		}
		vp := kickIntegral(c, mf, tc.beta)
		want := cmplx.Abs(vp) * cmplx.Abs(vp) / mf.Omega()
		got, err := TransverseROverQ(c, m, tc.beta)
		if err != nil {
			t.Fatal(err)
		}
		if m.Family == cavity.TE {
			// Scale: the TM110 value; the integral must cancel to rounding.
			ref, _ := TransverseROverQ(c, cavity.Mode{Family: cavity.TM, N: 1, M: 1}, 1)
			if got != 0 || want > 1e-12*ref {
				t.Errorf("%s: R/Q_perp = %g, integrated %g ohm; want 0", tc.mode, got, want)
			}
			continue
		}
		if math.Abs(got-want) > lorentzTol*want {
			t.Errorf("%s beta %g: R/Q_perp = %.12g ohm, Lorentz integral %.12g ohm", tc.mode, tc.beta, got, want)
		}
	}
	if _, err := TransverseROverQ(c, cavity.Mode{Family: cavity.TM, N: 0, M: 1}, 1); err == nil {
		t.Error("TransverseROverQ(TM010): no error")
	}
}

// TestHOMTable checks the table's rows against the functions they come
// from, the mode list of package cavity, and the harmonic flags worked by
// hand.
func TestHOMTable(t *testing.T) {
	c, f := pillbox13()
	w := niobiumWalls(t, 2)
	const fb = 1.3e9 / 2 // bunches every second RF period
	rows, err := HOMTable(c, HOMOptions{Speed: 1, MaxFrequency: 3 * f, Walls: w, Bunch: fb})
	if err != nil {
		t.Fatal(err)
	}
	all, err := c.Modes(3 * f)
	if err != nil {
		t.Fatal(err)
	}
	want := 0
	for _, r := range all {
		if r.Mode.N <= 1 {
			want++
		}
	}
	if len(rows) != want || len(rows) < 5 {
		t.Fatalf("%d rows, want the %d modes with n <= 1", len(rows), want)
	}
	for i, h := range rows {
		if i > 0 && h.Frequency < rows[i-1].Frequency {
			t.Errorf("row %d out of frequency order", i)
		}
		u, err := UnloadedQ(c, h.Mode, w.At(nil))
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(h.Q0-u.Q0) > 1e-12*u.Q0 {
			t.Errorf("%s: Q0 %g, UnloadedQ %g", h.Mode, h.Q0, u.Q0)
		}
		switch {
		case h.Mode.N == 0 && h.Mode.Family == cavity.TM:
			a, _ := Acceleration(c, h.Mode, 1)
			if h.Kind != Monopole || h.ROverQ != a.ROverQLinac || h.TransitTime != a.TransitTime {
				t.Errorf("%s: %+v, Acceleration gives R/Q %g, T %g", h.Mode, h, a.ROverQLinac, a.TransitTime)
			}
		case h.Mode.N == 0:
			if h.Kind != Monopole || h.ROverQ != 0 {
				t.Errorf("%s: TE0mp must be a monopole with R/Q 0, got %+v", h.Mode, h)
			}
		default:
			if h.Kind != Dipole || h.ROverQ != 0 || math.IsNaN(h.ROverQTransverse) {
				t.Errorf("%s: dipole row %+v", h.Mode, h)
			}
		}
		// By hand: the nearest harmonic of 650 MHz and the 0.5 % window.
		k := math.Round(h.Frequency / fb)
		near := math.Abs(h.Frequency-k*fb) <= 0.005*h.Frequency
		if h.Harmonic != int(k) || h.Near != near {
			t.Errorf("%s at %g Hz: harmonic %d near %v, want %g %v", h.Mode, h.Frequency, h.Harmonic, h.Near, k, near)
		}
	}
	// TM010 sits on the second harmonic of 650 MHz exactly: flagged.
	if rows[0].Mode.String() != "TM010" || !rows[0].Near || rows[0].Harmonic != 2 {
		t.Errorf("first row %+v, want TM010 on harmonic 2", rows[0])
	}
	if _, err := HOMTable(c, HOMOptions{Speed: 1, MaxFrequency: 1e12, Walls: w}); err == nil {
		t.Error("HOMTable up to 1 THz: no error")
	}
}

// TestBeamHarmonic checks the one verdict on modes near beam harmonics by
// hand: a 650 MHz bunch train has lines at 1.3, 1.95, 2.6, ... GHz.
func TestBeamHarmonic(t *testing.T) {
	for _, tc := range []struct {
		f, bunch, win float64
		h             int
		off           float64
		near          bool
	}{
		{1.3e9, 650e6, 0, 2, 0, true},
		{3.254921e9, 650e6, 0, 5, 4.921e6, true},     // 4.921 MHz < 0.5 % of 3.25 GHz = 16.3 MHz
		{1.838478e9, 650e6, 0, 3, -111.522e6, false}, // 111.5 MHz > 9.2 MHz
		{1.838478e9, 650e6, 0.1, 3, -111.522e6, true},
		{100e6, 650e6, 0, 0, 100e6, false}, // below the first harmonic
	} {
		h, off, near, err := BeamHarmonic(tc.f, tc.bunch, tc.win)
		if err != nil {
			t.Fatal(err)
		}
		if h != tc.h || math.Abs(off-tc.off) > 1e-3 || near != tc.near {
			t.Errorf("BeamHarmonic(%g, %g, %g) = %d, %g, %v; want %d, %g, %v", tc.f, tc.bunch, tc.win, h, off, near, tc.h, tc.off, tc.near)
		}
	}
	for _, bad := range [][3]float64{{0, 650e6, 0}, {1e9, 0, 0}, {1e9, 650e6, 0.5}, {1e9, math.Inf(1), 0}} {
		if _, _, _, err := BeamHarmonic(bad[0], bad[1], bad[2]); err == nil {
			t.Errorf("BeamHarmonic(%v): nil error", bad)
		}
	}
}
