package cmdutil

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"
)

// Format is an output format chosen with --format.
type Format string

// The output formats. Table is for people (aligned, friendly units); JSON
// and CSV are for programs (stable snake_case keys, SI base units).
const (
	Table Format = "table"
	JSON  Format = "json"
	CSV   Format = "csv"
)

// FormatFlag registers --format on cmd, accepting the given formats (the
// first is the default), and returns a function that validates the value
// after parsing.
func FormatFlag(cmd *cobra.Command, f *Format, allowed ...Format) func() error {
	if len(allowed) == 0 {
		allowed = []Format{Table, JSON, CSV}
	}
	*f = allowed[0]
	names := make([]string, len(allowed))
	for i, a := range allowed {
		names[i] = string(a)
	}
	list := strings.Join(names, "|")
	cmd.Flags().StringVar((*string)(f), "format", string(allowed[0]), "output format: "+list)
	_ = cmd.RegisterFlagCompletionFunc("format", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return names, cobra.ShellCompDirectiveNoFileComp
	})
	return func() error {
		// Words are matched in any case, as the EnumVar flags' are
		// (--family TE): "JSON" is json.
		given := *f
		for _, a := range allowed {
			if strings.EqualFold(strings.TrimSpace(string(given)), string(a)) {
				*f = a
				return nil
			}
		}
		*f = given
		return FlagError("format", string(*f), fmt.Errorf("unknown format; use %s", list))
	}
}

// WriteJSON writes v as indented JSON followed by a newline.
func WriteJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(v)
}

// WriteCSV writes a header row and the rows as RFC 4180 CSV.
func WriteCSV(w io.Writer, header []string, rows [][]string) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(header); err != nil {
		return err
	}
	if err := cw.WriteAll(rows); err != nil {
		return err
	}
	return cw.Error()
}

// TableWriter prints aligned columns for people. Numeric columns are
// right-aligned by padding in the caller's format strings; the writer only
// aligns on cell boundaries.
type TableWriter struct {
	tw *tabwriter.Writer
}

// NewTable returns a table writer on w with the given header.
func NewTable(w io.Writer, header ...string) *TableWriter {
	t := &TableWriter{tw: tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)}
	if len(header) > 0 {
		t.Row(header...)
	}
	return t
}

// Row adds one row of cells.
func (t *TableWriter) Row(cells ...string) {
	fmt.Fprintln(t.tw, strings.Join(cells, "\t"))
}

// Flush writes the aligned table.
func (t *TableWriter) Flush() error { return t.tw.Flush() }

// JSONNumber is a float64 that encodes NaN and ±Inf (a quantity that is
// undefined or infinite, such as the Q of a lossless part) as null, which
// encoding/json refuses to write as a number.
type JSONNumber float64

// MarshalJSON encodes v, NaN and ±Inf as null.
func (v JSONNumber) MarshalJSON() ([]byte, error) {
	f := float64(v)
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return []byte("null"), nil
	}
	return json.Marshal(f)
}
