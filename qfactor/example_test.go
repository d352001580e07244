package qfactor_test

import (
	"fmt"
	"math"

	"cylcav/cavity"
	"cylcav/physics"
	"cylcav/qfactor"
)

// A TE011 test cavity, 40 mm across and 40 mm long, whose removable lid
// (end plate B) is brass with twice the surface resistance of the
// silver-plated body.
func ExampleWallQ() {
	c := cavity.Cavity{Radius: 0.020, Length: 0.040}
	m, _ := cavity.ParseMode("TE011")
	w, err := qfactor.WallQ(c, m, qfactor.SurfaceResistances{Side: 0.030, EndA: 0.030, EndB: 0.060})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("f = %.4f GHz, Q_wall = %.0f\n", w.Frequency/1e9, w.QWall)
	fmt.Printf("loss shares: side %.3f, end A %.3f, end B %.3f\n", w.Share.Side, w.Share.EndA, w.Share.EndB)
	fmt.Printf("G = %.1f ohm\n", w.Geometry.Total())
	// Output:
	// f = 9.8795 GHz, Q_wall = 24257
	// loss shares: side 0.799, end A 0.067, end B 0.134
	// G = 780.1 ohm
}

// An aluminium TE012 cavity, 60 mm across and 70 mm long, filled with a
// low-loss plastic (eps_r = 2.54, tan delta = 3e-4). The wall Rs follows
// the mode's frequency.
func ExampleUnloadedQ() {
	c := cavity.Cavity{Radius: 0.030, Length: 0.070, Fill: physics.Medium{EpsR: 2.54, TanDelta: 3e-4}}
	m, _ := cavity.ParseMode("TE012")
	rs := func(f float64) (qfactor.SurfaceResistances, error) {
		return qfactor.Uniform(qfactor.SurfaceResistance(f, 3.5e7, 1)), nil
	}
	u, err := qfactor.UnloadedQ(c, m, rs)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("f = %.4f GHz, Rs = %.4f ohm\n", u.Wall.Frequency/1e9, u.Wall.Rs.Side)
	fmt.Printf("Q_wall = %.0f, Q_fill = %.0f, Q0 = %.0f\n", u.Wall.QWall, u.QFill, u.Q0)
	fmt.Printf("fill share %.3f\n", u.Share.Fill)
	// Output:
	// f = 4.6736 GHz, Rs = 0.0230 ohm
	// Q_wall = 25303, Q_fill = 3333, Q0 = 2945
	// fill share 0.884
}

// A copper pillbox cell for a speed-of-light beam near 3 GHz: radius 38.25 mm,
// length 50 mm (half a wavelength).
func ExampleAcceleration() {
	c := cavity.Cavity{Radius: 0.03825, Length: 0.050}
	m, _ := cavity.ParseMode("TM010")
	a, err := qfactor.Acceleration(c, m, 1)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("f = %.4f GHz, T = %.4f\n", a.Frequency/1e9, a.TransitTime)
	fmt.Printf("R/Q linac convention = %.1f ohm, circuit convention = %.1f ohm\n", a.ROverQLinac, a.ROverQCircuit)
	fmt.Printf("G = %.1f ohm, Epk/Eacc = %.3f, Bpk/Eacc = %.3f mT/(MV/m)\n", a.G, a.EpkOverEacc, a.BpkOverEacc*1e9)
	q0 := a.G / 0.0143 // copper at 3 GHz: Rs about 14.3 mohm
	fmt.Printf("Q0 = %.0f, shunt impedance (linac) = %.2f Mohm\n", q0, a.ShuntLinac(q0)/1e6)
	// Output:
	// f = 2.9998 GHz, T = 0.6362
	// R/Q linac convention = 195.8 ohm, circuit convention = 97.9 ohm
	// G = 256.6 ohm, Epk/Eacc = 1.572, Bpk/Eacc = 3.051 mT/(MV/m)
	// Q0 = 17947, shunt impedance (linac) = 3.51 Mohm
}

// A resonator of unloaded Q 8000 at 2.45 GHz, coupled with beta = 0.8.
func ExampleLoadedByCoupling() {
	ql, err := qfactor.LoadedByCoupling(8000, 0.8)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("Q_L = %.0f, 3 dB bandwidth = %.0f kHz\n", ql, qfactor.Bandwidth(2.45e9, ql)/1e3)
	fmt.Println(math.IsInf(qfactor.Combine(math.Inf(1), math.Inf(1)), 1))
	// Output:
	// Q_L = 4444, 3 dB bandwidth = 551 kHz
	// true
}
