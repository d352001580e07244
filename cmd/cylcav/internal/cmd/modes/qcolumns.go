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
	"strconv"

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
