package cmdutil

import (
	"math"
	"strings"
	"testing"

	"github.com/spf13/cobra"

	"cylcav/physics"
)

// geometryCmd returns a command with the geometry flags of g whose run
// records the flags, parsed from args.
func geometryCmd(t *testing.T, g Geometry, args ...string) (*GeometryFlags, error) {
	t.Helper()
	var gf *GeometryFlags
	cmd := &cobra.Command{Use: "x", SilenceUsage: true, SilenceErrors: true, RunE: func(*cobra.Command, []string) error { return nil }}
	gf = AddGeometryFlags(cmd, g)
	cmd.SetArgs(args)
	return gf, cmd.Execute()
}

var allFlags = Geometry{Diameter: "d", Radius: "a", Length: "L", Fill: "fill"}

func TestGeometryCavity(t *testing.T) {
	for _, tc := range []struct {
		args     []string
		radius   float64 // m
		length   float64 // m
		epsR     float64
		fillName string
	}{
		// 50 mm diameter: radius 25 mm; the default fill is vacuum.
		{[]string{"--diameter", "50mm", "--length", "40mm"}, 0.025, 0.04, 1, "vacuum"},
		{[]string{"--radius", "2cm", "--length", "0.03m", "--fill", "eps=2.5"}, 0.02, 0.03, 2.5, "user"},
		// PTFE: eps_r 2.08 (physics material library).
		{[]string{"--radius", "2cm", "--length", "3cm", "--fill", "ptfe"}, 0.02, 0.03, 2.08, "ptfe"},
	} {
		gf, err := geometryCmd(t, allFlags, tc.args...)
		if err != nil {
			t.Fatal(err)
		}
		c, err := gf.Cavity()
		if err != nil {
			t.Errorf("Cavity(%q) error %v", tc.args, err)
			continue
		}
		if !nearly(c.Radius, tc.radius) || !nearly(c.Length, tc.length) || c.Fill.Eps() != tc.epsR || c.Fill.Label() != tc.fillName {
			t.Errorf("Cavity(%q) = %+v, fill %q; want radius %g m, length %g m, eps_r %g, fill %q",
				tc.args, c, c.Fill.Label(), tc.radius, tc.length, tc.epsR, tc.fillName)
		}
	}
}

// lengthTol is the relative agreement of parsed lengths: the parser scales
// by powers of ten, exact but for one rounding.
const lengthTol = 1e-15

func nearly(got, want float64) bool { return math.Abs(got-want) <= lengthTol*math.Abs(want) }

func TestGeometryErrors(t *testing.T) {
	custom := allFlags
	custom.SizeErrors = SizeErrors{Both: "both!", NoSize: "no size!", NoLength: "no length!"}
	for _, tc := range []struct {
		g    Geometry
		args []string
		want string
	}{
		{allFlags, []string{"--diameter", "50mm", "--radius", "25mm", "--length", "1cm"}, "give either --diameter or --radius, not both"},
		{allFlags, []string{"--length", "1cm"}, "--diameter or --radius is required"},
		{allFlags, []string{"--radius", "1cm"}, "--length is required"},
		{custom, []string{"--diameter", "50mm", "--radius", "25mm", "--length", "1cm"}, "both!"},
		{custom, []string{"--length", "1cm"}, "no size!"},
		{custom, []string{"--radius", "1cm"}, "no length!"},
		// 2 cavity.MaxSize = 2000 m is the largest diameter.
		{allFlags, []string{"--diameter", "3000m", "--length", "1cm"}, `--diameter "3000m": must be between`},
		{allFlags, []string{"--radius", "", "--length", "1cm"}, `--radius "": `},
		{allFlags, []string{"--radius", "1cm", "--length", "-1cm"}, `--length "-1cm": must be between`},
		{allFlags, []string{"--radius", "1cm", "--length", "1cm", "--fill", ""}, `--fill "": dielectric: empty`},
		{allFlags, []string{"--radius", "1cm", "--length", "1cm", "--fill", "eps=0.5"}, `--fill "eps=0.5"`},
	} {
		// A bad size is refused while parsing (typed flag), the rest
		// when the cavity is read.
		gf, err := geometryCmd(t, tc.g, tc.args...)
		if err != nil {
			err = &UsageError{Err: FlagValueError(err)}
		} else {
			_, err = gf.Cavity()
		}
		if err == nil || !IsUsage(err) || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("Cavity(%q) error = %v, want a usage error containing %q", tc.args, err, tc.want)
		}
	}
}

// TestGeometryCobraChecks: with CobraChecks the size flags are checked
// before the command runs.
func TestGeometryCobraChecks(t *testing.T) {
	g := allFlags
	g.CobraChecks = true
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{"--length", "1cm"}, "[diameter radius]"},
		{[]string{"--diameter", "2cm", "--radius", "1cm", "--length", "1cm"}, "[diameter radius]"},
		{[]string{"--radius", "1cm"}, `"length"`},
	} {
		if _, err := geometryCmd(t, g, tc.args...); err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%q: error %v, want cobra's error naming %s", tc.args, err, tc.want)
		}
	}
}

func TestGeometryFill(t *testing.T) {
	// No --fill and no default: the zero Medium, no name, labelled vacuum.
	gf, err := geometryCmd(t, Geometry{Fill: "fill"})
	if err != nil {
		t.Fatal(err)
	}
	if f, err := gf.Fill(); err != nil || f != (physics.Medium{}) || f.Name != "" {
		t.Errorf("Fill() without --fill = %+v, %v; want the zero medium and no name", f, err)
	}
	if f, err := gf.Fill(); err != nil || f.Label() != "vacuum" || f.Eps() != 1 || f.Mu() != 1 {
		t.Errorf("Fill() without --fill = %+v, %v; want vacuum", f, err)
	}
	// A default is read like a given value.
	gf, err = geometryCmd(t, Geometry{Fill: "fill", FillDefault: "air"})
	if err != nil {
		t.Fatal(err)
	}
	if f, err := gf.Fill(); err != nil || f.Name != "air" || !(f.EpsR > 1) {
		t.Errorf("Fill() with default air = %+v, %v; want air (eps_r just above 1)", f, err)
	}
	// Loss tangents are kept.
	gf, err = geometryCmd(t, Geometry{Fill: "fill"}, "--fill", "eps=2.08,tand=4e-4")
	if err != nil {
		t.Fatal(err)
	}
	if d, err := gf.Fill(); err != nil || d.EpsR != 2.08 || d.TanDelta != 4e-4 || gf.Text("fill") != "eps=2.08,tand=4e-4" {
		t.Errorf("Fill(eps=2.08,tand=4e-4) = %+v, %v", d, err)
	}
}

func TestTrimZeros(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"25.0000 mm", "25 mm"}, {"5.00000 GHz", "5 GHz"}, {"4.5897 GHz", "4.5897 GHz"},
		{"27.4010 mm", "27.401 mm"}, {"100 kHz", "100 kHz"}, {"1.5", "1.5"},
	} {
		if got := TrimZeros(tc.in); got != tc.want {
			t.Errorf("TrimZeros(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}
