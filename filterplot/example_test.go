package filterplot_test

import (
	"bytes"
	"fmt"

	"cylcav/figure"
	"cylcav/filter"
	"cylcav/filterplot"
)

// An invented scenario: a four-cavity 1.5 GHz filter, 30 MHz wide, 22 dB
// return loss, that must reject 30 dB at 1.55 GHz; Q0 = 4000 per
// cavity. The plot shows it over five bandwidths, as SVG.
func ExampleNewResponsePlot() {
	const f0, bw = 1.5e9, 30e6
	d, err := filter.Synthesize(filter.Spec{F0: f0, BW: bw, Order: 4, ReturnLoss: 22,
		Rejections: []filter.Rejection{{F: 1.55e9, Attenuation: 30}}})
	if err != nil {
		fmt.Println(err)
		return
	}
	lo, hi, err := filter.SweepRange(d, 5)
	if err != nil {
		fmt.Println(err)
		return
	}
	rp, err := filterplot.NewResponsePlot(d, filterplot.PlotOptions{Lo: lo, Hi: hi, Q0: []float64{4000, 4000, 4000, 4000}})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("range %.4f..%.4f GHz, passband %.4f..%.4f GHz\n", rp.Lo/1e9, rp.Hi/1e9, rp.Passband[0]/1e9, rp.Passband[1]/1e9)
	fmt.Printf("return-loss line at -%g dB; rejection: %g dB from %.3f GHz to %.4f GHz\n",
		rp.ReturnLoss, -rp.Rejections[0].Level, rp.Rejections[0].F/1e9, rp.Rejections[0].Edge/1e9)
	fmt.Printf("axes: %g..%g dB, group delay 0..%.1f ns\n", rp.DBMin, rp.DBMax, rp.DelayMax*1e9)
	fig, err := rp.Figure(figure.DefaultTheme())
	if err != nil {
		fmt.Println(err)
		return
	}
	var svg bytes.Buffer
	if err := figure.Render(&svg, fig, figure.SVG, figure.Page{}); err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(bytes.HasPrefix(bytes.TrimSpace(svg.Bytes()), []byte("<?xml")))
	// Output:
	// range 1.4269..1.5769 GHz, passband 1.4851..1.5151 GHz
	// return-loss line at -22 dB; rejection: 30 dB from 1.550 GHz to 1.5769 GHz
	// axes: -80..3 dB, group delay 0..47.6 ns
	// true
}
