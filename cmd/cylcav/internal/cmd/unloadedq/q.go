// Package q implements `cylcav q`: the unloaded Q of one mode from wall and
// fill losses, with each loss's share, loaded Q and bandwidth for a given
// coupling, and the accelerator figures of TM0mp modes.
package unloadedq

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/physics"
	"cylcav/qfactor"
)

// Options holds the validated input of `cylcav q`. Every field is set by
// NewCmdQ's RunE before runQ sees it.
type Options struct {
	IO     *cmdutil.IOStreams
	Format cmdutil.Format

	Mode   cavity.Mode
	Cavity cavity.Cavity // dimensions and fill (vacuum when --fill is absent)

	// Walls are the side wall, end plate A (z = 0) and end plate B (z = d).
	Walls qfactor.WallSet

	// Coupling holds the coupling coefficient of each port (--beta), QExt
	// the external Q of each port (--qext); at most one is set.
	Coupling []float64
	QExt     []float64

	// Speed is the particle speed as a fraction of c for TM0mp figures.
	Speed float64
}

// Cautions printed with accelerator figures (cmdutil.CautionRF) and with
// cryogenic walls.
const (
	cautionCryogenic = "cryogenic liquids and cold surfaces cause cold burns and can displace breathing air; vent and relieve pressure as local codes require"
	indexConvention  = "n azimuthal (cos n phi), m radial (m-th Bessel zero), p axial (half-wavelengths along the length)"
	maxPorts         = 2
)

// NewCmdQ returns `cylcav q`. runF, when not nil, receives the options
// instead of runQ (for tests).
func NewCmdQ(io *cmdutil.IOStreams, runF func(*Options) error) *cobra.Command {
	opts := &Options{IO: io}
	var geo *cmdutil.GeometryFlags
	var walls *cmdutil.WallFlags
	cmd := &cobra.Command{
		Use:   "q --mode MODE (--diameter D | --radius R) --length L --wall SPEC [flags]",
		Short: "Unloaded Q, loss shares, loaded Q and accelerator figures of one mode",
		Long: `Compute the unloaded Q of one resonant mode of a closed circular cylinder
from the losses in its side wall, its two end plates and its fill:

  1/Q0 = 1/Q_wall + 1/Q_fill,  1/Q_wall = sum over the wall parts of Rs/G_part

The side wall, end plate A (z = 0) and end plate B (z = d) may each be a
different metal. Each loss's share of the total is printed. With a
coupling (--beta or --qext) the loaded Q and the 3 dB bandwidth follow. For
TM0mp modes the accelerator figures are added: transit-time factor, R/Q in
the linac convention V^2/(omega W) and in the circuit convention
V^2/(2 omega W), shunt impedance, geometry factor, Epk/Eacc and Bpk/Eacc.

Mode index convention: ` + indexConvention + `.

Wall specs: a library name (see 'cylcav materials') or key=value pairs:
sigma=5.8e7, iacs=61%, rho=1.72e-8, mur=1, alpha=0.0039. Fill specs: a
library name or eps=2.08,tand=4e-4[,tandm=...,mu=...].
--temperature, --roughness and --plating apply to every wall part.
A Q with no loss behind it prints as "infinite" and as null in JSON.`,
		Example: `  # PTFE-filled copper TE011 cavity (a textbook design at 5 GHz)
  $ cylcav q --mode TE011 --diameter 54.8016mm --length 54.8016mm \
      --fill eps=2.08,tand=4e-4 --wall sigma=5.813e7

  # Aluminium body with brass end plates, at 60 C, rough, critically coupled
  $ cylcav q --mode TE012 --radius 30mm --length 70mm --wall al6061 \
      --end-wall brass --temperature 60C --roughness 0.8um --beta 1

  # Copper pillbox accelerating cell, particle at 0.8 c, JSON
  $ cylcav q --mode TM010 --radius 38.25mm --length 40mm --wall ofhc \
      --particle-speed 0.8 --format json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := opts.parse(cmd, geo, walls); err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return runQ(opts)
		},
	}
	f := cmd.Flags()
	cmdutil.ModeVar(f, &opts.Mode, "mode", "mode label, e.g. TE011, TM010, TE(12,3,1) (required)")
	geo = cmdutil.AddGeometryFlags(cmd, cmdutil.Geometry{
		Diameter: "inside diameter, e.g. 54.8mm",
		Radius:   "inside radius, e.g. 27.4mm",
		Length:   "inside length between the end plates, e.g. 54.8mm (required)",
		Fill:     "fill dielectric: library name or eps=...,tand=... (default vacuum)",
	})
	walls = cmdutil.AddWallFlags(cmd)
	cmdutil.NumberListVar(f, &opts.Coupling, "beta", "coupling coefficient of each port, e.g. 0.8 or 1,1 (two ports)", 0, 1e6, maxPorts, "port")
	cmdutil.NumberListVar(f, &opts.QExt, "qext", "external Q of each port, e.g. 5000 or 4000,4000", 1, 1e15, maxPorts, "port")
	cmdutil.NumberVar(f, &opts.Speed, "particle-speed", "particle speed as a fraction of c, for TM0mp accelerator figures", 1e-6, 1)
	cmdutil.SetDefault(f, "particle-speed", "1")
	validFormat := cmdutil.FormatFlag(cmd, &opts.Format, cmdutil.Table, cmdutil.JSON)
	cmd.PreRunE = func(*cobra.Command, []string) error { return validFormat() }
	return cmd
}

// parse validates the flags into opts. Every error is a usage error naming
// the flag, the value and the valid range.
func (opts *Options) parse(cmd *cobra.Command, geo *cmdutil.GeometryFlags, walls *cmdutil.WallFlags) error {
	// A flag given with an empty value is an error below, never "absent".
	set := cmd.Flags().Changed
	if !set("mode") {
		return cmdutil.Usagef("--mode is required, e.g. --mode TE011")
	}
	m := opts.Mode
	var err error
	if opts.Cavity, err = geo.Cavity(); err != nil {
		return err
	}

	if !walls.Given() {
		return cmdutil.Usagef("--wall is required, e.g. --wall copper or --wall sigma=5.8e7")
	}
	if opts.Walls, err = walls.Walls(); err != nil {
		return err
	}

	if set("beta") && set("qext") {
		return cmdutil.Usagef("give either --beta or --qext, not both")
	}
	if set("particle-speed") && (m.Family != cavity.TM || m.N != 0) {
		return cmdutil.FlagError("particle-speed", cmdutil.Text(cmd.Flags(), "particle-speed"), fmt.Errorf("accelerator figures exist for TM0mp modes only, not %s", m))
	}
	return nil
}

// result is everything runQ prints.
type result struct {
	opts       *Options
	u          qfactor.Unloaded
	delta      [3]float64 // skin depth per wall part, NaN where undefined
	sc         []scRs     // the superconducting parts' Rs split, in part order
	ql, bw     float64
	accel      *qfactor.Accel
	warnings   []string
	cautions   []string
	hasLoading bool
}

func runQ(opts *Options) error {
	r := result{opts: opts}
	m, c := opts.Mode, opts.Cavity
	rs := opts.Walls.At(func(w string) { r.warnings = append(r.warnings, w) })
	u, err := qfactor.UnloadedQ(c, m, rs)
	if err != nil {
		return err
	}
	r.u = u
	for _, w := range qfactor.Validity(c, opts.Walls, u) {
		r.warnings = append(r.warnings, w.Text)
	}
	f := u.Wall.Frequency
	r.delta = opts.Walls.SkinDepths(f)
	for _, p := range qfactor.Parts() {
		s := opts.Walls.Surface(p)
		if s.Superconductor == nil {
			continue
		}
		b, res, err := s.SuperconductingParts(f)
		if err != nil {
			return err
		}
		r.sc = append(r.sc, scRs{Part: partKey(p), name: p.String(), TemperatureK: number(s.Temperature), BCS: number(b), Residual: number(res)})
	}
	switch {
	case len(opts.Coupling) > 0:
		r.ql, err = qfactor.LoadedByCoupling(u.Q0, opts.Coupling...)
		r.hasLoading = true
	case len(opts.QExt) > 0:
		r.ql, err = qfactor.LoadedByExternalQ(u.Q0, opts.QExt...)
		r.hasLoading = true
	}
	if err != nil {
		return err
	}
	if r.hasLoading {
		r.bw = qfactor.Bandwidth(f, r.ql)
	}
	if m.Family == cavity.TM && m.N == 0 {
		a, err := qfactor.Acceleration(c, m, opts.Speed)
		if err != nil {
			return err
		}
		r.accel = &a
		r.cautions = append(r.cautions, cmdutil.CautionRF)
	}
	if opts.Walls.Side.Superconductor != nil {
		r.cautions = append(r.cautions, cautionCryogenic)
	}
	if ft := c.Fill.TanDeltaFreq; ft > 0 && c.Fill.TanDelta > 0 && (f/ft > 2 || ft/f > 2) {
		r.warnings = append(r.warnings, fmt.Sprintf("the fill's loss tangent is stated at %s and used at %s; loss tangents vary with frequency",
			physics.FormatFrequency(ft, 4), physics.FormatFrequency(f, 4)))
	}
	if opts.Format == cmdutil.JSON {
		return cmdutil.WriteJSON(opts.IO.Out, r.json())
	}
	return r.table(opts.IO.Out)
}

// number is a float64 that encodes NaN and infinities as JSON null.
// number encodes NaN and Inf as null (cmdutil.JSONNumber).
type number = cmdutil.JSONNumber

type shareJSON struct {
	Side number `json:"side"`
	EndA number `json:"end_a"`
	EndB number `json:"end_b"`
	Fill number `json:"fill"`
}

// partKey names wall part p in JSON.
func partKey(p qfactor.Part) string {
	switch p {
	case qfactor.EndPlateA:
		return "end_a"
	case qfactor.EndPlateB:
		return "end_b"
	}
	return "side"
}

// scRs is the split of one superconducting wall part's Rs.
type scRs struct {
	Part         string `json:"part"`
	name         string
	TemperatureK number `json:"temperature_k"`
	BCS          number `json:"rs_bcs_ohm"`
	Residual     number `json:"rs_residual_ohm"`
}

type outJSON struct {
	Mode            string `json:"mode"`
	IndexConvention string `json:"index_convention"`
	RadiusM         number `json:"radius_m"`
	LengthM         number `json:"length_m"`
	EpsR            number `json:"eps_r"`
	// EpsRParallel is eps_par of a uniaxial fill (eps_r is then
	// eps_perp); absent for an isotropic fill.
	EpsRParallel    float64    `json:"eps_r_parallel,omitempty"`
	MuR             number     `json:"mu_r"`
	TanDelta        number     `json:"tan_delta"`
	TanDeltaM       number     `json:"tan_delta_m"`
	FHz             number     `json:"f_hz"`
	SkinDepthM      number     `json:"skin_depth_m"`
	SkinDepthEndAM  number     `json:"skin_depth_end_a_m"`
	SkinDepthEndBM  number     `json:"skin_depth_end_b_m"`
	RsSide          number     `json:"rs_side_ohm"`
	RsEndA          number     `json:"rs_end_a_ohm"`
	RsEndB          number     `json:"rs_end_b_ohm"`
	LossShare       *shareJSON `json:"loss_share"`
	Superconducting []scRs     `json:"superconducting,omitempty"`
	QWall           number     `json:"q_wall"`
	QSide           number     `json:"q_side"`
	QEndA           number     `json:"q_end_a"`
	QEndB           number     `json:"q_end_b"`
	QFill           number     `json:"q_fill"`
	Q0              number     `json:"q0"`
	G               number     `json:"g_ohm"`
	Coupling        []float64  `json:"coupling_beta,omitempty"`
	QExt            []float64  `json:"q_ext,omitempty"`
	QLoaded         *number    `json:"q_loaded,omitempty"`
	BandwidthHz     *number    `json:"bandwidth_hz,omitempty"`

	ParticleSpeed   *number     `json:"particle_speed_c,omitempty"`
	TransitTime     *number     `json:"transit_time_factor,omitempty"`
	TransitTimePeak *number     `json:"transit_time_factor_peak,omitempty"`
	NoGain          *bool       `json:"no_gain,omitempty"`
	ModesBelow      []belowJSON `json:"modes_below,omitempty"`
	ModesBelowCount *int        `json:"modes_below_count,omitempty"`
	ROverQLinac     *number     `json:"r_over_q_linac_ohm,omitempty"`
	ROverQCircuit   *number     `json:"r_over_q_circuit_ohm,omitempty"`
	ShuntLinac      *number     `json:"shunt_impedance_linac_ohm,omitempty"`
	ShuntCircuit    *number     `json:"shunt_impedance_circuit_ohm,omitempty"`
	EpkOverEacc     *number     `json:"epk_over_eacc,omitempty"`
	BpkOverEaccMTMV *number     `json:"bpk_over_eacc_mt_per_mv_m,omitempty"`

	Warnings []string `json:"warnings"`
	Cautions []string `json:"cautions"`
}

// belowJSON is a mode that resonates below the accelerating one.
type belowJSON struct {
	Mode string `json:"mode"`
	FHz  number `json:"f_hz"`
}

func ptr(v float64) *number { n := number(v); return &n }

func (r *result) json() outJSON {
	o, u := r.opts, r.u
	out := outJSON{
		Mode:            o.Mode.String(),
		IndexConvention: indexConvention,
		RadiusM:         number(o.Cavity.Radius),
		LengthM:         number(o.Cavity.Length),
		EpsR:            number(o.Cavity.Fill.Eps()),
		EpsRParallel:    o.Cavity.Fill.UniaxialPar(),
		MuR:             number(o.Cavity.Fill.Mu()),
		TanDelta:        number(o.Cavity.Fill.TanDelta),
		TanDeltaM:       number(o.Cavity.Fill.TanDeltaM),
		FHz:             number(u.Wall.Frequency),
		SkinDepthM:      number(r.delta[0]),
		SkinDepthEndAM:  number(r.delta[1]),
		SkinDepthEndBM:  number(r.delta[2]),
		RsSide:          number(u.Wall.Rs.Side),
		RsEndA:          number(u.Wall.Rs.EndA),
		RsEndB:          number(u.Wall.Rs.EndB),
		QWall:           number(u.Wall.QWall),
		QSide:           number(u.Wall.QSide),
		QEndA:           number(u.Wall.QEndA),
		QEndB:           number(u.Wall.QEndB),
		QFill:           number(u.QFill),
		Q0:              number(u.Q0),
		G:               number(u.Wall.Geometry.Total()),
		Superconducting: r.sc,
		Coupling:        o.Coupling,
		QExt:            o.QExt,
		Warnings:        append([]string{}, r.warnings...),
		Cautions:        append([]string{}, r.cautions...),
	}
	if !math.IsInf(u.Q0, 1) {
		out.LossShare = &shareJSON{number(u.Share.Side), number(u.Share.EndA), number(u.Share.EndB), number(u.Share.Fill)}
	}
	if r.hasLoading {
		out.QLoaded, out.BandwidthHz = ptr(r.ql), ptr(r.bw)
	}
	if a := r.accel; a != nil {
		out.ParticleSpeed = ptr(a.Speed)
		out.TransitTime = ptr(a.TransitTime)
		out.TransitTimePeak = ptr(a.TransitTimePeak)
		noGain, n := a.NoGain, a.BelowCount
		out.NoGain, out.ModesBelowCount = &noGain, &n
		for _, b := range a.Below {
			out.ModesBelow = append(out.ModesBelow, belowJSON{Mode: b.Mode.String(), FHz: number(b.Frequency)})
		}
		if !a.NoGain {
			out.ROverQLinac = ptr(a.ROverQLinac)
			out.ROverQCircuit = ptr(a.ROverQCircuit)
			out.ShuntLinac = ptr(a.ShuntLinac(u.Q0))
			out.ShuntCircuit = ptr(a.ShuntCircuit(u.Q0))
			out.EpkOverEacc = ptr(a.EpkOverEacc)
			out.BpkOverEaccMTMV = ptr(a.BpkOverEacc * 1e9)
		}
	}
	return out
}

// fmtQ prints a Q for people: "infinite (no loss)" for +Inf.
func fmtQ(q float64) string {
	if math.IsInf(q, 1) {
		return "infinite (no loss)"
	}
	if q >= 1e7 {
		return fmt.Sprintf("%.4e", q)
	}
	return strconv.FormatFloat(q, 'f', 0, 64)
}

func fmtShare(s float64, lossless bool) string {
	if lossless {
		return "-"
	}
	return fmt.Sprintf("%.2f %%", 100*s)
}

func wallName(s qfactor.Surface) string {
	name := s.Conductor.Name
	if name == "user" {
		name = fmt.Sprintf("sigma = %.4g S/m", s.Conductor.Conductivity)
	}
	if s.Plating != nil {
		name = fmt.Sprintf("%s over %s", s.Plating.Metal.Name, name)
	}
	if s.Superconductor != nil {
		name += " (superconducting, BCS)"
	}
	return name
}

func (r *result) table(w io.Writer) error {
	o, u := r.opts, r.u
	lossless := math.IsInf(u.Q0, 1)
	fmt.Fprintf(w, "Mode %s: index convention %s\n", o.Mode, indexConvention)
	fill := o.Cavity.Fill.Label()
	if fill == "user" {
		fill = "user values"
	}
	fmt.Fprintf(w, "Cavity: radius %s, length %s; fill %s (%s, mu_r %g, tan delta %g",
		physics.FormatLength(o.Cavity.Radius, 6), physics.FormatLength(o.Cavity.Length, 6), fill, o.Cavity.Fill.EpsText(), o.Cavity.Fill.Mu(), o.Cavity.Fill.TanDelta)
	if o.Cavity.Fill.TanDeltaM > 0 {
		fmt.Fprintf(w, ", magnetic tan delta %g", o.Cavity.Fill.TanDeltaM)
	}
	fmt.Fprintln(w, ")")
	temp := "20 C"
	if t := o.Walls.Side.Temperature; t != 0 {
		temp = physics.FormatTemperature(t, 4)
	}
	fmt.Fprintf(w, "Resonant frequency: %s; wall temperature %s\n\n", physics.FormatFrequency(u.Wall.Frequency, 7), temp)

	t := cmdutil.NewTable(w, "LOSS", "MATERIAL", "SKIN DEPTH", "RS", "PARTIAL Q", "SHARE")
	rs := [3]float64{u.Wall.Rs.Side, u.Wall.Rs.EndA, u.Wall.Rs.EndB}
	pq := [3]float64{u.Wall.QSide, u.Wall.QEndA, u.Wall.QEndB}
	sh := [3]float64{u.Share.Side, u.Share.EndA, u.Share.EndB}
	for i, p := range qfactor.Parts() {
		d := "-"
		if !math.IsNaN(r.delta[i]) {
			d = physics.FormatLength(r.delta[i], 4)
		}
		t.Row(p.String(), wallName(o.Walls.Surface(p)), d, physics.FormatSI(rs[i], "ohm", 4), fmtQ(pq[i]), fmtShare(sh[i], lossless))
	}
	t.Row("fill", fill, "-", "-", fmtQ(u.QFill), fmtShare(u.Share.Fill, lossless))
	if err := t.Flush(); err != nil {
		return err
	}
	if len(r.sc) > 0 {
		fmt.Fprintln(w, "\nSuperconducting surface resistance, BCS approximation plus residual:")
		t = cmdutil.NewTable(w, "PART", "TEMPERATURE", "RS BCS", "RS RESIDUAL", "RS")
		for _, s := range r.sc {
			t.Row(s.name, physics.FormatTemperature(float64(s.TemperatureK), 4), physics.FormatSI(float64(s.BCS), "ohm", 4),
				physics.FormatSI(float64(s.Residual), "ohm", 4), physics.FormatSI(float64(s.BCS+s.Residual), "ohm", 4))
		}
		if err := t.Flush(); err != nil {
			return err
		}
	}
	fmt.Fprintln(w)
	t = cmdutil.NewTable(w)
	t.Row("Q_wall", fmtQ(u.Wall.QWall))
	t.Row("Q_fill", fmtQ(u.QFill))
	t.Row("Q0 (unloaded)", fmtQ(u.Q0))
	t.Row("G (geometry factor, Q_wall Rs for uniform walls)", physics.FormatSI(u.Wall.Geometry.Total(), "ohm", 5))
	if r.hasLoading {
		how := ""
		if len(o.Coupling) > 0 {
			how = "coupling beta " + joinFloats(o.Coupling)
		} else {
			how = "external Q " + joinFloats(o.QExt)
		}
		t.Row("Q_L (loaded, "+how+")", fmtQ(r.ql))
		t.Row("3 dB bandwidth", physics.FormatFrequency(r.bw, 5))
	}
	if err := t.Flush(); err != nil {
		return err
	}
	if a := r.accel; a != nil {
		fmt.Fprintf(w, "\nAccelerator figures (on axis, particle speed %g c, Eacc = V/length):\n", a.Speed)
		t = cmdutil.NewTable(w)
		t.Row("transit-time factor T = V / integral |Ez| dz", fmt.Sprintf("%.5f", a.TransitTime))
		t.Row("transit-time factor V / (E0 L), E0 peak on-axis |Ez|", fmt.Sprintf("%.5f", a.TransitTimePeak))
		if !a.NoGain {
			t.Row("R/Q, linac convention V^2/(omega W)", physics.FormatSI(a.ROverQLinac, "ohm", 5))
			t.Row("R/Q, circuit convention V^2/(2 omega W)", physics.FormatSI(a.ROverQCircuit, "ohm", 5))
			t.Row("shunt impedance, linac convention (R/Q) Q0", shunt(a.ShuntLinac(u.Q0)))
			t.Row("shunt impedance, circuit convention (R/Q) Q0", shunt(a.ShuntCircuit(u.Q0)))
			t.Row("Epk/Eacc", fmt.Sprintf("%.4f", a.EpkOverEacc))
			t.Row("Bpk/Eacc", fmt.Sprintf("%.4f mT/(MV/m)", a.BpkOverEacc*1e9))
		}
		if err := t.Flush(); err != nil {
			return err
		}
		for _, l := range accelNotes(a, o.Mode) {
			fmt.Fprintf(w, "  %s\n", l)
		}
	}
	if len(r.warnings) > 0 {
		fmt.Fprintln(w, "\nNotes:")
		for _, x := range r.warnings {
			fmt.Fprintf(w, "  - %s\n", x)
		}
	}
	for _, c := range r.cautions {
		fmt.Fprintf(w, "\nCaution: %s.\n", c)
	}
	return nil
}

func shunt(v float64) string {
	if math.IsInf(v, 1) {
		return "infinite (no loss)"
	}
	return physics.FormatSI(v, "ohm", 5)
}

func joinFloats(v []float64) string {
	s := make([]string, len(v))
	for i, x := range v {
		s[i] = strconv.FormatFloat(x, 'g', -1, 64)
	}
	return strings.Join(s, ",")
}

// accelNotes says what the accelerator figures rest on: the gain that R/Q
// uses, a speed that gains nothing, and the modes below the accelerating
// one.
func accelNotes(a *qfactor.Accel, m cavity.Mode) []string {
	var out []string
	if a.NoGain {
		out = append(out, fmt.Sprintf("No net energy gain at %g c: T = %.3g is below %g, so Eacc is about zero and R/Q, shunt impedance, Epk/Eacc and Bpk/Eacc are not given (they would be meaningless).",
			a.Speed, a.TransitTime, qfactor.MinTransitTime))
	} else {
		out = append(out, "R/Q and the shunt impedance use the gain V itself (V = T times the integral of |Ez| = (V/(E0 L)) times E0 L); Eacc = V/L.")
	}
	if a.BelowCount > 0 {
		var names []string
		for _, b := range a.Below {
			names = append(names, b.Mode.String()+" at "+physics.FormatFrequency(b.Frequency, 6))
		}
		more := ""
		if a.BelowCount > len(a.Below) {
			more = fmt.Sprintf(", and %d more", a.BelowCount-len(a.Below))
		}
		verb, them := "resonates", "it"
		if a.BelowCount > 1 {
			verb, them = "resonate", "them"
		}
		out = append(out, fmt.Sprintf("%s is not the lowest mode of this cavity: %s%s %s below it; a beam or coupler can excite %s.", m, strings.Join(names, ", "), more, verb, them))
	}
	return out
}
