package modes

// This file writes the mode list as it goes (issue 9 item 15): a row is
// made, printed and dropped, so the memory held per listed mode is the
// resonance list's own (cavity.Resonance, 40 bytes) and not a row of
// strings per mode. The output is byte for byte what printing whole
// slices of rows gave before (the golden CLI tests and the baseline runs
// compare it).

import (
	"bufio"
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"strconv"

	"cylcav/cavity"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/physics"
	"cylcav/qfactor"
)

// qChunk is the number of modes whose unloaded Q is computed in one call
// of qfactor.UnloadedQAll: large enough that its per-call tables (Bessel
// zeros per azimuthal order) cost little per mode, small enough that the
// results held at once are a few hundred kilobytes.
const qChunk = 4096

// rowSource makes the output rows of a resonance list one at a time, with
// their Q values when the options carry a Loss.
type rowSource struct {
	opts *Options
	list []cavity.Resonance
	rs   qfactor.ResistancesAt
	us   []qfactor.Unloaded // Q values of list[base:base+len(us)]
	base int

	// checks are the model-validity warnings raised so far, condensed as
	// qfactor.Condense does (the first mode that raised each check and
	// how many did), gathered on the first pass over the list only.
	checks map[qfactor.Check]*qfactor.Condensed
	done   int // modes whose validity has been checked
}

func newRowSource(opts *Options, list []cavity.Resonance) *rowSource {
	src := &rowSource{opts: opts, list: list}
	if opts.Walls != nil {
		src.rs = opts.Walls.At(src.warn)
	}
	return src
}

// warn prints a note of the Q models on the error stream.
func (s *rowSource) warn(text string) {
	fmt.Fprintf(s.opts.IO.ErrOut, "cylcav: note: %s\n", text)
}

// withQ reports whether the rows carry the Q columns.
func (s *rowSource) withQ() bool { return s.opts.Walls != nil }

// row returns row i; rows must be asked for in order.
func (s *rowSource) row(i int) (Row, error) {
	r := RowOf(s.opts.Cavity, s.list[i])
	if !s.withQ() {
		return r, nil
	}
	if i < s.base || i >= s.base+len(s.us) {
		end := min(i+qChunk, len(s.list))
		us, err := qfactor.UnloadedQAll(s.opts.Cavity, s.list[i:end], s.rs)
		if err != nil {
			return r, err
		}
		s.us, s.base = us, i
	}
	if i == s.done {
		s.check(i, s.us[i-s.base])
		s.done++
	}
	u := s.us[i-s.base]
	w, f, q0 := QValue(u.Wall.QWall), QValue(u.QFill), QValue(u.Q0)
	r.QWall, r.QFill, r.Q0 = &w, &f, &q0
	return r, nil
}

// check adds the validity warnings of mode i's Q result u.
func (s *rowSource) check(i int, u qfactor.Unloaded) {
	for _, c := range qfactor.Condense([][]qfactor.Warning{qfactor.Validity(s.opts.Cavity, *s.opts.Walls, u)}) {
		if s.checks == nil {
			s.checks = make(map[qfactor.Check]*qfactor.Condensed)
		}
		if have, ok := s.checks[c.Check]; ok {
			have.Count++
			continue
		}
		c.First = i
		s.checks[c.Check] = &c
	}
}

// warnChecks prints the validity warnings once each, in qfactor.Condense's
// order of checks, naming the first mode that raised each: the same lines
// as condensing the warnings of the whole list at once.
func (s *rowSource) warnChecks(warn func(string)) {
	if len(s.checks) == 0 {
		return
	}
	// Condense orders the checks; one list per check keeps them apart.
	var firsts [][]qfactor.Warning
	var all []*qfactor.Condensed
	for _, c := range s.checks {
		firsts = append(firsts, []qfactor.Warning{c.Warning})
		all = append(all, c)
	}
	for _, o := range qfactor.Condense(firsts) {
		c := all[o.First]
		warn(fmt.Sprintf("%s: %s", s.list[c.First].Mode, c.Text("listed modes")))
	}
}

// cols returns the output columns.
func (s *rowSource) cols() []column {
	if s.withQ() {
		return append(columns[:len(columns):len(columns)], qColumns...)
	}
	return columns
}

// write prints the list in the options' format through a buffered writer.
func write(opts *Options, list []cavity.Resonance, what string) error {
	bw := bufio.NewWriter(opts.IO.Out)
	src := newRowSource(opts, list)
	var err error
	switch opts.Format {
	case cmdutil.JSON:
		err = writeJSON(bw, opts.Cavity, src)
	case cmdutil.CSV:
		err = writeCSV(bw, src)
	default:
		err = writeTable(bw, opts, src, what)
	}
	if ferr := bw.Flush(); err == nil {
		err = ferr
	}
	if err == nil {
		src.warnChecks(src.warn)
	}
	return err
}

func writeCSV(w io.Writer, src *rowSource) error {
	cols := src.cols()
	cw := csv.NewWriter(w)
	rec := make([]string, len(cols))
	for j, c := range cols {
		rec[j] = c.key
	}
	if err := cw.Write(rec); err != nil {
		return err
	}
	for i := range src.list {
		r, err := src.row(i)
		if err != nil {
			return err
		}
		for j, c := range cols {
			rec[j] = c.csv(r)
		}
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// writeJSON writes what cmdutil.WriteJSON writes for the object
// {cavity, index_convention, modes}, one mode at a time.
func writeJSON(w io.Writer, c cavity.Cavity, src *rowSource) error {
	cav, err := json.MarshalIndent(cavityJSON{RadiusM: c.Radius, LengthM: c.Length, EpsR: c.Fill.Eps(), EpsRParallel: c.Fill.UniaxialPar(), MuR: c.Fill.Mu()}, "  ", "  ")
	if err != nil {
		return err
	}
	conv, _ := json.Marshal("n azimuthal, m radial, p axial")
	var b bytes.Buffer
	b.WriteString("{\n  \"cavity\": ")
	b.Write(cav)
	b.WriteString(",\n  \"index_convention\": ")
	b.Write(conv)
	b.WriteString(",\n  \"modes\": [")
	if _, err := w.Write(b.Bytes()); err != nil {
		return err
	}
	for i := range src.list {
		r, err := src.row(i)
		if err != nil {
			return err
		}
		obj, err := json.MarshalIndent(r, "    ", "  ")
		if err != nil {
			return err
		}
		sep := ",\n    "
		if i == 0 {
			sep = "\n    "
		}
		if _, err := io.WriteString(w, sep); err != nil {
			return err
		}
		if _, err := w.Write(obj); err != nil {
			return err
		}
	}
	end := "\n  ]\n}\n"
	if len(src.list) == 0 {
		end = "]\n}\n"
	}
	_, err = io.WriteString(w, end)
	return err
}

// cells returns the table cells of row i (number, then one per column).
func (s *rowSource) cells(i int, cols []column, digits int, out []string) ([]string, error) {
	r, err := s.row(i)
	if err != nil {
		return nil, err
	}
	out = append(out[:0], strconv.Itoa(i+1))
	for _, c := range cols {
		switch {
		case c.key == "f_hz":
			out = append(out, physics.FormatFrequency(r.FHz, digits))
		case c.table != nil:
			out = append(out, c.table(r))
		default:
			out = append(out, c.csv(r))
		}
	}
	return out, nil
}

// writeTable prints the aligned table in two passes over the list: the
// first finds each column's width, the second prints. Cells are left
// aligned with two blanks between columns, and lines carry no trailing
// blanks, as cmdutil.TableWriter lays them out.
func writeTable(w io.Writer, opts *Options, src *rowSource, what string) error {
	if _, err := fmt.Fprintf(w, "cavity: %s\nmodes TE_nmp / TM_nmp: n azimuthal, m radial, p axial; %s\n",
		DescribeCavity(opts.Cavity), what); err != nil {
		return err
	}
	if len(src.list) == 0 {
		_, err := fmt.Fprintln(w, "no mode at or below the limit")
		return err
	}
	cols := src.cols()
	titles := []string{"#"}
	for _, c := range cols {
		titles = append(titles, c.title)
	}
	width := make([]int, len(titles))
	grow := func(cells []string) {
		for j, c := range cells {
			width[j] = max(width[j], len(c))
		}
	}
	grow(titles)
	// The Q values are computed once per pass, a chunk at a time.
	var cells []string
	var err error
	for i := range src.list {
		if cells, err = src.cells(i, cols, opts.Digits, cells); err != nil {
			return err
		}
		grow(cells)
	}
	var line []byte
	emit := func(cells []string) error {
		line = line[:0]
		for j, c := range cells {
			line = append(line, c...)
			if j < len(cells)-1 {
				for k := len(c); k < width[j]+2; k++ {
					line = append(line, ' ')
				}
			}
		}
		line = append(bytes.TrimRight(line, " "), '\n')
		_, err := w.Write(line)
		return err
	}
	if err := emit(titles); err != nil {
		return err
	}
	for i := range src.list {
		if cells, err = src.cells(i, cols, opts.Digits, cells); err != nil {
			return err
		}
		if err := emit(cells); err != nil {
			return err
		}
	}
	return nil
}
