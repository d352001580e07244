package stack

import (
	"fmt"
	"io"
	"strconv"

	"github.com/spf13/cobra"

	"cylcav/axisym"
	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/physics"
)

// BulbOptions are the storage-bulb flags of `cylcav stack`: a cylinder on
// the axis, Diameter by Length, centred at Centre (m from the first end
// plate; 0: half-way). Diameter 0 means no bulb.
type BulbOptions struct {
	Diameter, Length, Centre float64
}

// BulbRow is the filling factors of the bulb in one resonance (keys as in
// `cylcav design --format json`).
type BulbRow struct {
	MagneticZ float64 `json:"magnetic_z_fraction"`
	Magnetic  float64 `json:"magnetic_fraction"`
	Electric  float64 `json:"electric_fraction"`
	Maser     float64 `json:"maser_filling_factor"`
}

// addBulbFlags registers --bulb-diameter, --bulb-length and --bulb-centre.
func addBulbFlags(cmd *cobra.Command, b *BulbOptions) {
	fl := cmd.Flags()
	cmdutil.LengthVar(fl, &b.Diameter, "bulb-diameter", "diameter of a storage bulb on the axis: add its filling factors to every resonance (e.g. 20mm)", cavity.MinSize, cavity.MaxSize)
	cmdutil.LengthVar(fl, &b.Length, "bulb-length", "length of the storage bulb (e.g. 12mm)", cavity.MinSize, cavity.MaxSize)
	cmdutil.LengthVar(fl, &b.Centre, "bulb-centre", "z of the bulb's centre from the first end plate (default: half-way along the body)", cavity.MinSize, cavity.MaxSize)
	cmdutil.Needs(cmd, "bulb-diameter", "bulb-length")
	cmdutil.Needs(cmd, "bulb-length", "bulb-diameter")
	cmdutil.Needs(cmd, "bulb-centre", "bulb-diameter")
}

// checkBulb checks the bulb against the body before any work: it must lie
// inside the body's circular sections (axisym.Loss.Filling's rule).
func checkBulb(b BulbOptions, body axisym.Body) error {
	if b.Diameter == 0 {
		return nil
	}
	if body.Open() {
		return cmdutil.Usagef("--bulb-diameter needs a body closed by end plates at both ends; this one has an open pipe")
	}
	l := body.Length()
	zc := b.Centre
	if zc == 0 {
		zc = l / 2
	}
	if z1, z2 := zc-b.Length/2, zc+b.Length/2; z1 < 0 || z2 > l*(1+1e-12) {
		return cmdutil.Usagef("--bulb-length %s with its centre at %s runs from %s to %s, outside the body (0 to %s)",
			cmdutil.TrimZeros(physics.FormatLength(b.Length, 6)), cmdutil.TrimZeros(physics.FormatLength(zc, 6)), cmdutil.TrimZeros(physics.FormatLength(z1, 6)), cmdutil.TrimZeros(physics.FormatLength(z2, 6)), cmdutil.TrimZeros(physics.FormatLength(l, 6)))
	}
	z0 := 0.0
	for i, s := range body.Sections {
		if lo, hi := max(zc-b.Length/2, z0), min(zc+b.Length/2, z0+s.Length); hi > lo && (s.InnerRadius > 0 || b.Diameter/2 > s.Radius*(1+1e-12)) {
			return cmdutil.Usagef("--bulb-diameter %s does not fit section %d (radius %s%s), which the bulb overlaps",
				cmdutil.TrimZeros(physics.FormatLength(b.Diameter, 6)), i+1, cmdutil.TrimZeros(physics.FormatLength(s.Radius, 6)), map[bool]string{true: ", with an inner conductor", false: ""}[s.InnerRadius > 0])
		}
		z0 += s.Length
	}
	return nil
}

// bulbRow computes the filling factors of the bulb in resonance r.
func bulbRow(b BulbOptions, body axisym.Body, r axisym.Resonance) (*BulbRow, error) {
	if r.Loss == nil {
		return nil, nil
	}
	f, err := r.Loss.Filling(body, cavity.Bulb{Radius: b.Diameter / 2, Length: b.Length}, axisym.RegionSettings{Centre: b.Centre})
	if err != nil {
		return nil, err
	}
	return &BulbRow{MagneticZ: f.MagneticZ, Magnetic: f.Magnetic, Electric: f.Electric, Maser: f.Maser}, nil
}

// bulbHeader and bulbCells are the CSV columns of the bulb.
var bulbHeader = []string{"magnetic_z_fraction", "magnetic_fraction", "electric_fraction", "maser_filling_factor"}

func bulbCells(r *BulbRow) []string {
	if r == nil {
		return []string{"", "", "", ""}
	}
	g := func(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }
	return []string{g(r.MagneticZ), g(r.Magnetic), g(r.Electric), g(r.Maser)}
}

// bulbText is the table's cells of the bulb.
func bulbText(r *BulbRow) []string {
	if r == nil {
		return []string{"-", "-", "-", "-"}
	}
	g := func(x float64) string { return strconv.FormatFloat(x, 'f', 4, 64) }
	return []string{g(r.MagneticZ), g(r.Magnetic), g(r.Electric), g(r.Maser)}
}

// writeBulbNote explains the bulb columns under the table.
func writeBulbNote(w io.Writer, b BulbOptions, body axisym.Body) {
	zc := b.Centre
	if zc == 0 {
		zc = body.Length() / 2
	}
	fmt.Fprintf(w, "bulb D = %s, L = %s centred at z = %s: fractions of the mode's energy inside it: Hz^2 (magnetic energy along z),\n",
		cmdutil.TrimZeros(physics.FormatLength(b.Diameter, 6)), cmdutil.TrimZeros(physics.FormatLength(b.Length, 6)), cmdutil.TrimZeros(physics.FormatLength(zc, 6)))
	fmt.Fprintln(w, "H^2 (all magnetic), E^2 (electric, weighted by eps_r); eta' = (int Hz dV)^2/(V_bulb int |H|^2 dV), the maser filling")
	fmt.Fprintln(w, "factor (Kleppner et al. 1965); TM0 resonances have no Hz. The bulb's own wall (quartz) is not modelled.")
}
