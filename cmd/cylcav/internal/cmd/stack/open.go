package stack

import (
	"fmt"
	"math"
	"sort"
	"strconv"

	"cylcav/axisym"
	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/physics"
)

// Status words of a resonance of a body with an open end.
const (
	statusTrapped   = "trapped"
	statusRadiating = "radiating"
)

// addRadiating adds the radiating resonances of an open body
// (axisym.Radiating, with 1.5 times the modes as Solve's listed model, the
// change from the smaller model as the convergence estimate) to the rows
// of the trapped ones, sorted by frequency and renumbered. It returns the
// rows and the resonances aligned with them (the zero Resonance for a
// radiating row).
func addRadiating(opts *Options, rows []Row, res []axisym.Resonance) ([]Row, []axisym.Resonance, error) {
	b := opts.Geometry.Body
	modes := opts.Modes
	if modes == 0 {
		modes = axisym.DefaultModes
	}
	for _, fam := range opts.Families {
		fine, err := axisym.Radiating(b, fam, opts.FMax, (3*modes+1)/2)
		if err != nil {
			return nil, nil, solveError(opts, err)
		}
		coarse, err := axisym.Radiating(b, fam, opts.FMax*1.05, modes)
		if err != nil {
			return nil, nil, solveError(opts, err)
		}
		for _, r := range fine {
			row := Row{Family: fam.String() + "0", FHz: r.F, Status: statusRadiating}
			fi, q := r.FImag, r.Qext
			row.FImagHz, row.QExt = &fi, &q
			best, qc := math.Inf(1), 0.0
			for _, c := range coarse {
				if d := math.Abs(c.F - r.F); d < best {
					best, qc = d, math.Abs(c.Qext-r.Qext)
				}
			}
			// A partner further than a tenth of the distance to the cutoff
			// is another resonance.
			if best < 0.1*(r.F-b.Cutoff(fam)) {
				row.ChangeHz, row.QExtChange = &best, &qc
			}
			if opts.Walls != nil {
				row.QNote = "radiates into the open end: Q0 of the walls not computed (its fields are complex); Qext given"
			}
			rows = append(rows, row)
			res = append(res, axisym.Resonance{Family: fam, Frequency: r.F})
		}
	}
	idx := make([]int, len(rows))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(i, j int) bool { return rows[idx[i]].FHz < rows[idx[j]].FHz })
	outRows, outRes := make([]Row, len(rows)), make([]axisym.Resonance, len(rows))
	for k, i := range idx {
		outRows[k], outRes[k] = rows[i], res[i]
		outRows[k].Index = k + 1
	}
	return outRows, outRes, nil
}

// refuseRadiating returns a usage error when resonance idx (the # column,
// from 1) radiates: it has no real field to map or pair.
func refuseRadiating(flag, value string, rows []Row, idx ...int) error {
	for _, i := range idx {
		if i >= 1 && i <= len(rows) && rows[i-1].Status == statusRadiating {
			return cmdutil.FlagError(flag, value, fmt.Errorf("resonance %d radiates into an open end; only trapped resonances have a real field", i))
		}
	}
	return nil
}

// endsLine is the table's line on the ends of the body and the cutoffs of
// its pipes, or "" for a closed body.
func endsLine(b axisym.Body, fams []cavity.Family) string {
	if !b.Open() {
		return ""
	}
	s := fmt.Sprintf("ends: A (z = 0) %v, B %v; pipe cutoff", b.EndA, b.EndB)
	for i, fam := range fams {
		if i > 0 {
			s += ","
		}
		s += fmt.Sprintf(" %v0 %s", fam, physics.FormatFrequency(b.Cutoff(fam), 6))
	}
	return s + "; below it a resonance is trapped, above it it radiates into the pipe (Qext)"
}

// cutoffJSON is the cutoff of each family in the JSON output, for an open
// body.
type cutoffJSON struct {
	TE0Hz *float64 `json:"te0_hz,omitempty"`
	TM0Hz *float64 `json:"tm0_hz,omitempty"`
}

func cutoffs(b axisym.Body, fams []cavity.Family) *cutoffJSON {
	if !b.Open() {
		return nil
	}
	c := &cutoffJSON{}
	for _, fam := range fams {
		v := b.Cutoff(fam)
		if fam == cavity.TE {
			c.TE0Hz = &v
		} else {
			c.TM0Hz = &v
		}
	}
	return c
}

// qextText prints an external Q for the table with its change when the
// modes grew by half.
func qextText(q, change *float64) string {
	if q == nil {
		return "-"
	}
	if change == nil {
		return strconv.FormatFloat(*q, 'g', 3, 64) + " (change unknown)"
	}
	return strconv.FormatFloat(*q, 'f', 0, 64) + " (change " + strconv.FormatFloat(*change, 'g', 2, 64) + ")"
}
