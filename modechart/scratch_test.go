package modechart

import (
	"image"
	"image/png"
	"os"
	"testing"

	"cylcav/cavity"
)

func TestScratch(t *testing.T) {
	te011 := cavity.Mode{Family: cavity.TE, N: 0, M: 1, P: 1}
	cav := cavity.Cavity{Radius: 0.0198, Length: 0.0396}
	for _, ax := range []Axes{Squared, Linear} {
		ch, err := New(Spec{Wanted: te011, Cavity: cav, Tuning: 0.02, DiameterTol: 20e-6, LengthTol: 20e-6, Clearance: 0.03, Axes: ax})
		if err != nil {
			t.Fatal(err)
		}
		f, err := ch.Figure(DefaultTheme())
		if err != nil {
			t.Fatal(err)
		}
		b, err := Encode(f, PNG, Page{DPI: 110})
		if err != nil {
			t.Fatal(err)
		}
		os.WriteFile("/tmp/scratch_"+ax.String()+".png", b, 0o644)
		t.Log(len(ch.Lines))
	}
}

func TestScratchGrey(t *testing.T) {
	f, _ := os.Open("/tmp/scratch_squared.png")
	img, _ := png.Decode(f)
	g := image.NewGray(img.Bounds())
	for y := img.Bounds().Min.Y; y < img.Bounds().Max.Y; y++ {
		for x := img.Bounds().Min.X; x < img.Bounds().Max.X; x++ {
			g.Set(x, y, img.At(x, y))
		}
	}
	o, _ := os.Create("/tmp/scratch_grey.png")
	png.Encode(o, g)
	o.Close()
}
