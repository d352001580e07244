package modes

// This file adds the unloaded-Q columns q_wall, q_fill and q0 to every mode
// when --wall is given (issue 3). The wall flags and their parsing are the
// ones of `cylcav q` (cmdutil.WallFlags); the numbers come from
// qfactor.UnloadedQAll, with the wall surface resistance evaluated at each
// mode's own frequency.

import (
	"encoding/json"
	"fmt"
	"math"
	"slices"
	"strconv"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/qfactor"
)

// parseWalls returns the wall set of the wall flags, or nil when --wall is
// absent (no Q columns). Errors are usage errors.
func parseWalls(w *cmdutil.WallFlags) (*qfactor.WallSet, error) {
	if !w.Given() {
		return nil, nil
	}
	walls, err := w.Walls()
	if err != nil {
		return nil, err
	}
	return &walls, nil
}

// QValue is a Q in the JSON output: null when infinite (no loss).
type QValue float64

// MarshalJSON encodes +Inf (and NaN) as null.
func (v QValue) MarshalJSON() ([]byte, error) {
	f := float64(v)
	if math.IsInf(f, 0) || math.IsNaN(f) {
		return []byte("null"), nil
	}
	return json.Marshal(f)
}

// addQ fills the Q fields of rows (one per resonance of list) when opts has
// a Loss. Warnings of the surface models (anomalous skin effect, ...) go to
// the error stream once each.
func addQ(opts *Options, list []cavity.Resonance, rows []Row) error {
	if opts.Walls == nil {
		return nil
	}
	warn := func(s string) { fmt.Fprintf(opts.IO.ErrOut, "cylcav: note: %s\n", s) }
	us, err := qfactor.UnloadedQAll(opts.Cavity, list, opts.Walls.At(warn))
	if err != nil {
		return err
	}
	checks := make([][]qfactor.Warning, len(us))
	for i, u := range us {
		w, f, q0 := QValue(u.Wall.QWall), QValue(u.QFill), QValue(u.Q0)
		rows[i].QWall, rows[i].QFill, rows[i].Q0 = &w, &f, &q0
		checks[i] = qfactor.Validity(opts.Cavity, *opts.Walls, u)
	}
	for _, c := range qfactor.Condense(checks) {
		warn(fmt.Sprintf("%s: %s", list[c.First].Mode, c.Text("listed modes")))
	}
	return nil
}

func qCSV(v *QValue) string {
	if v == nil || math.IsInf(float64(*v), 0) {
		return ""
	}
	return strconv.FormatFloat(float64(*v), 'g', -1, 64)
}

func qTable(v *QValue) string {
	switch {
	case v == nil:
		return ""
	case math.IsInf(float64(*v), 0):
		return "inf"
	case *v >= 1e7:
		return fmt.Sprintf("%.4e", float64(*v))
	}
	return strconv.FormatFloat(float64(*v), 'f', 0, 64)
}

// qColumns are appended to columns when the rows carry Q values.
var qColumns = []column{
	{"q_wall", "Q_wall", func(r Row) string { return qCSV(r.QWall) }, func(r Row) string { return qTable(r.QWall) }},
	{"q_fill", "Q_fill", func(r Row) string { return qCSV(r.QFill) }, func(r Row) string { return qTable(r.QFill) }},
	{"q0", "Q0", func(r Row) string { return qCSV(r.Q0) }, func(r Row) string { return qTable(r.Q0) }},
}

// columnsFor returns the columns to print for rows: with the Q columns when
// the rows carry Q values.
func columnsFor(rows []Row) []column {
	if len(rows) > 0 && rows[0].QWall != nil {
		return append(slices.Clip(columns), qColumns...)
	}
	return columns
}

// headerFor returns the CSV header for rows.
func headerFor(rows []Row) []string {
	cols := columnsFor(rows)
	h := make([]string, len(cols))
	for i, c := range cols {
		h[i] = c.key
	}
	return h
}
