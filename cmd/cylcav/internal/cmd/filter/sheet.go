package filter

import (
	"bytes"
	"errors"
	"path/filepath"
	"strings"

	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/datasheet"
	"cylcav/figure"
)

// The filter datasheet (--datasheet): one self-contained HTML file or a
// PDF, assembled by datasheet.FromFilter from what the command computed.

// sheetFormat is the format of the --datasheet file, from its extension.
func sheetFormat(path string) (pdf bool, err error) {
	switch strings.ToLower(filepath.Ext(path)) {
	case ".html", ".htm":
		return false, nil
	case ".pdf":
		return true, nil
	}
	return false, errors.New("the file name must end in .html (one self-contained HTML file) or .pdf")
}

// buildSheet renders the datasheet of r with the manufacturing results fab
// (nil when none was asked for) into r.sheet.
func (r *Result) buildSheet(fab *FabResult) error {
	opts := r.Opts
	if opts.Datasheet == "" {
		return nil
	}
	in := datasheet.Filter{
		Design: r.Design, OrderChosen: r.OrderChosen,
		Realisation: r.Realisation, Shape: r.Shape, FillLabel: opts.Fill.Label(),
		Irises: r.Irises, Q0: r.Q0,
		InsertionLoss: r.InsertionLoss, LosslessLoss: r.LosslessLoss, Delay: r.Delay,
		Checks: r.Checks, Sweep: r.Sweep,
		Warnings: r.Warnings, Notes: []string{ConventionNote, FieldSolverNote},
	}
	if opts.Iris != nil {
		in.IrisWall = opts.Iris.Wall
	}
	if fab != nil {
		in.Yield, in.Screws, in.Drift, in.Power = fab.Yield, fab.Screws, fab.Drift, fab.Power
	}
	sh, err := datasheet.FromFilter(in, figure.DefaultTheme())
	if err != nil {
		return err
	}
	sh.Version = cmdutil.Version
	var b bytes.Buffer
	if pdf, _ := sheetFormat(opts.Datasheet); pdf {
		err = sh.WritePDF(&b)
	} else {
		err = sh.WriteHTML(&b)
	}
	if err != nil {
		return err
	}
	r.sheet = b.Bytes()
	return nil
}
