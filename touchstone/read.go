package touchstone

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"math/cmplx"
	"strconv"
	"strings"
)

// ParseError is a malformed Touchstone file: what is wrong and on which
// line (counted from 1; 0 when the fault is the file as a whole, such as a
// file with no data).
type ParseError struct {
	Line int
	Msg  string
}

func (e *ParseError) Error() string {
	if e.Line > 0 {
		return fmt.Sprintf("line %d: %s", e.Line, e.Msg)
	}
	return e.Msg
}

// maxLine is the longest line Read accepts, in bytes: far beyond any real
// file (a two-port line is under 200 bytes), small enough to bound memory.
const maxLine = 1 << 20

// format is the data format of the option line.
type format int

const (
	formatMA format = iota // magnitude, angle in degrees (the default of both versions)
	formatDB               // 20 log10 magnitude, angle in degrees
	formatRI               // real, imaginary
)

// parser holds the state of one Read.
type parser struct {
	ports     int // 0 until known
	v2        bool
	line      int
	optionSet bool
	unit      float64
	form      format
	r         float64
	ref       []float64 // [Reference] values, v2
	refOpen   bool      // [Reference] still collecting values on later lines
	order2112 bool      // two-port order N11 N21 N12 N22 (v1.1 always)
	orderSet  bool
	nFreq     int // [Number of Frequencies], v2; -1 unset
	section   string
	noise     bool
	rec       []float64 // numbers of the record being collected (v2)
	recLine   int
	d         *Data
}

// Read reads a one- or two-port Touchstone file of version 1.1 or 2.0.
// ports is the port count the file name states (see PortsFromName), or 0
// to take it from the file: a version 2.0 file states it, and in a version
// 1.1 file a first data line of 3 numbers means one port and of 9 numbers
// two ports. A malformed file gives a *ParseError with the line number;
// non-ascending frequencies, a port count that does not match, files of
// more than two ports and Y/Z/H/G parameters are errors too.
func Read(r io.Reader, ports int) (*Data, error) {
	if ports > 2 {
		return nil, &ParseError{Msg: fmt.Sprintf("%d-port files are not supported (only one- and two-port)", ports)}
	}
	if ports < 0 {
		return nil, &ParseError{Msg: fmt.Sprintf("port count must be >= 0, got %d", ports)}
	}
	p := &parser{ports: ports, unit: 1e9, form: formatMA, r: 50, nFreq: -1, d: &Data{Version: "1.1"}}
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 0, 4096), maxLine)
	first := true
	for sc.Scan() {
		p.line++
		text := sc.Text()
		if i := strings.IndexByte(text, '!'); i >= 0 {
			p.d.Comments = append(p.d.Comments, strings.TrimSpace(text[i+1:]))
			text = text[:i]
		}
		text = strings.TrimSpace(text)
		if text == "" {
			continue
		}
		if first {
			first = false
			if kw, _ := keyword(text); kw == "version" {
				p.v2 = true
			}
		}
		var err error
		var stop bool
		switch {
		case p.section == "information":
			if kw, _ := keyword(text); kw == "end information" {
				p.section = ""
			}
		case p.refOpen && text[0] != '[' && text[0] != '#':
			err = p.reference(strings.Fields(text))
		case text[0] == '[':
			stop, err = p.keywordLine(text)
		case text[0] == '#':
			err = p.option(text)
		default:
			err = p.data(text)
		}
		if err != nil {
			return nil, err
		}
		if stop {
			break
		}
	}
	if err := sc.Err(); err != nil {
		if err == bufio.ErrTooLong {
			return nil, &ParseError{Line: p.line + 1, Msg: fmt.Sprintf("line longer than %d bytes", maxLine)}
		}
		return nil, err
	}
	return p.finish()
}

func (p *parser) errorf(format string, a ...any) error {
	return &ParseError{Line: p.line, Msg: fmt.Sprintf(format, a...)}
}

// keyword splits a version 2.0 keyword line "[Name] argument" into the
// lower-case name and the argument.
func keyword(text string) (name, arg string) {
	if !strings.HasPrefix(text, "[") {
		return "", ""
	}
	end := strings.IndexByte(text, ']')
	if end < 0 {
		return "", ""
	}
	return strings.ToLower(strings.Join(strings.Fields(text[1:end]), " ")), strings.TrimSpace(text[end+1:])
}

func (p *parser) keywordLine(text string) (stop bool, err error) {
	if !p.v2 {
		return false, p.errorf("keyword %q in a version 1.1 file (a version 2.0 file starts with [Version] 2.0)", text)
	}
	name, arg := keyword(text)
	if name == "" {
		return false, p.errorf("malformed keyword line %q: no closing ]", text)
	}
	if p.rec != nil && len(p.rec) > 0 {
		return false, p.errorf("keyword [%s] inside an unfinished data record", name)
	}
	switch name {
	case "version":
		if p.line > 0 && p.d.Version != "1.1" {
			return false, p.errorf("second [Version] line")
		}
		if arg != "2.0" && arg != "2.1" {
			return false, p.errorf("[Version] %q is not supported (1.1 without the keyword, or 2.0)", arg)
		}
		p.d.Version = "2.0"
	case "number of ports":
		n, err := strconv.Atoi(arg)
		if err != nil || n < 1 {
			return false, p.errorf("[Number of Ports] must be a positive integer, got %q", arg)
		}
		if n > 2 {
			return false, p.errorf("%d-port files are not supported (only one- and two-port)", n)
		}
		if p.ports != 0 && p.ports != n {
			return false, p.errorf("[Number of Ports] %d, but the file name says %d ports", n, p.ports)
		}
		p.ports = n
	case "two-port data order":
		switch arg {
		case "12_21":
			p.order2112 = false
		case "21_12":
			p.order2112 = true
		default:
			return false, p.errorf("[Two-Port Data Order] must be 12_21 or 21_12, got %q", arg)
		}
		p.orderSet = true
	case "number of frequencies":
		n, err := strconv.Atoi(arg)
		if err != nil || n < 1 {
			return false, p.errorf("[Number of Frequencies] must be a positive integer, got %q", arg)
		}
		p.nFreq = n
	case "number of noise frequencies":
		if n, err := strconv.Atoi(arg); err != nil || n < 1 {
			return false, p.errorf("[Number of Noise Frequencies] must be a positive integer, got %q", arg)
		}
	case "reference":
		if p.ports == 0 {
			return false, p.errorf("[Reference] before [Number of Ports]")
		}
		p.ref = p.ref[:0]
		p.refOpen = true
		return false, p.reference(strings.Fields(arg))
	case "matrix format":
		switch strings.ToLower(arg) {
		case "full":
		case "lower", "upper":
			if p.ports == 2 {
				return false, p.errorf("[Matrix Format] %s is not supported for two-port files (only Full)", arg)
			}
		default:
			return false, p.errorf("[Matrix Format] must be Full, Lower or Upper, got %q", arg)
		}
	case "mixed-mode order":
		return false, p.errorf("mixed-mode data is not supported")
	case "begin information":
		p.section = "information"
	case "network data":
		if !p.optionSet {
			return false, p.errorf("[Network Data] before the option line (# ...)")
		}
		if p.ports == 0 {
			return false, p.errorf("[Network Data] before [Number of Ports]")
		}
		if p.ports == 2 && !p.orderSet {
			return false, p.errorf("a two-port version 2.0 file needs [Two-Port Data Order] before [Network Data]")
		}
		if p.refOpen {
			return false, p.errorf("[Reference] has %d of %d values", len(p.ref), p.ports)
		}
		p.section = "network"
	case "noise data":
		p.section = "noise"
	case "end":
		return true, nil
	default:
		return false, p.errorf("unknown keyword [%s]", name)
	}
	return false, nil
}

func (p *parser) reference(fields []string) error {
	for _, f := range fields {
		v, err := number(f)
		if err != nil || !(v > 0) {
			return p.errorf("[Reference] impedance %q must be a number > 0 ohm", f)
		}
		if len(p.ref) == p.ports {
			return p.errorf("[Reference] has more than %d values", p.ports)
		}
		p.ref = append(p.ref, v)
	}
	p.refOpen = len(p.ref) < p.ports
	return nil
}

// option parses the option line "# <unit> <parameter> <format> R <n>"
// (Touchstone 1.1 sec. "Option line"; any order, any case, every field
// optional with defaults GHZ S MA R 50). Later option lines are ignored, as
// the specification says.
func (p *parser) option(text string) error {
	if p.optionSet {
		return nil
	}
	if p.v2 && p.d.Version != "2.0" {
		return p.errorf("option line before [Version]")
	}
	p.optionSet = true
	f := strings.Fields(text[1:])
	for i := 0; i < len(f); i++ {
		switch w := strings.ToUpper(f[i]); w {
		case "HZ":
			p.unit = 1
		case "KHZ":
			p.unit = 1e3
		case "MHZ":
			p.unit = 1e6
		case "GHZ":
			p.unit = 1e9
		case "S":
		case "Y", "Z", "H", "G":
			return p.errorf("%s-parameters are not supported (only S)", w)
		case "MA":
			p.form = formatMA
		case "DB":
			p.form = formatDB
		case "RI":
			p.form = formatRI
		case "R":
			if i+1 == len(f) {
				return p.errorf("option line: R needs the reference impedance after it")
			}
			i++
			v, err := number(f[i])
			if err != nil || !(v > 0) {
				return p.errorf("option line: reference impedance %q must be a number > 0 ohm", f[i])
			}
			p.r = v
		default:
			return p.errorf("option line: unknown field %q (units HZ KHZ MHZ GHZ, parameter S, format MA DB RI, R <ohm>)", f[i])
		}
	}
	return nil
}

// number parses a finite decimal number.
func number(s string) (float64, error) {
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return 0, err
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("not finite")
	}
	return v, nil
}

func (p *parser) data(text string) error {
	if p.v2 {
		switch p.section {
		case "network":
		case "noise":
			return nil // noise parameters are not used
		default:
			return p.errorf("data outside [Network Data]")
		}
	} else if !p.optionSet {
		return p.errorf("data before the option line (# ...)")
	}
	fields := strings.Fields(text)
	vals := make([]float64, len(fields))
	for i, f := range fields {
		v, err := number(f)
		if err != nil {
			return p.errorf("field %d %q is not a finite number", i+1, f)
		}
		vals[i] = v
	}
	if p.v2 {
		for _, v := range vals {
			if len(p.rec) == 0 {
				p.recLine = p.line
			}
			p.rec = append(p.rec, v)
			if len(p.rec) == 1+2*p.ports*p.ports {
				if err := p.record(p.rec); err != nil {
					return err
				}
				p.rec = p.rec[:0]
			}
		}
		return nil
	}
	// Version 1.1: one frequency per line for one- and two-port files.
	if p.noise {
		if len(vals) != 5 {
			return p.errorf("noise data line has %d numbers, want 5 (frequency, Fmin dB, |Gamma_opt|, angle, Rn)", len(vals))
		}
		return nil
	}
	if p.ports == 0 {
		switch len(vals) {
		case 3:
			p.ports = 1
		case 9:
			p.ports = 2
		default:
			return p.errorf("first data line has %d numbers: a one-port line has 3 and a two-port line 9 (files of more ports are not supported)", len(vals))
		}
	}
	n := len(p.d.Freq)
	if p.ports == 2 && len(vals) == 5 && n > 0 && vals[0]*p.unit <= p.d.Freq[n-1] {
		p.noise = true // Touchstone 1.1: noise data starts where the frequency drops
		return nil
	}
	if want := 1 + 2*p.ports*p.ports; len(vals) != want {
		return p.errorf("data line has %d numbers, a %d-port line has %d", len(vals), p.ports, want)
	}
	p.recLine = p.line
	return p.record(vals)
}

// record stores one frequency point: the frequency and 2*ports^2 numbers.
func (p *parser) record(v []float64) error {
	if p.d.S == nil {
		p.d.S = make([][]complex128, p.ports*p.ports)
	}
	f := v[0] * p.unit
	if !(f > 0) || math.IsInf(f, 0) {
		return &ParseError{Line: p.recLine, Msg: fmt.Sprintf("frequency %g Hz must be > 0 and finite", f)}
	}
	if n := len(p.d.Freq); n > 0 && !(f > p.d.Freq[n-1]) {
		return &ParseError{Line: p.recLine, Msg: fmt.Sprintf("frequency %g Hz does not exceed the previous one, %g Hz: frequencies must be strictly ascending", f, p.d.Freq[n-1])}
	}
	if p.v2 && p.nFreq > 0 && len(p.d.Freq) == p.nFreq {
		return &ParseError{Line: p.recLine, Msg: fmt.Sprintf("more data than [Number of Frequencies] %d", p.nFreq)}
	}
	p.d.Freq = append(p.d.Freq, f)
	n := p.ports
	for k := 0; k < n*n; k++ {
		a, b := v[1+2*k], v[2+2*k]
		var s complex128
		switch p.form {
		case formatRI:
			s = complex(a, b)
		case formatMA:
			s = cmplx.Rect(a, b*math.Pi/180)
		case formatDB:
			s = cmplx.Rect(math.Pow(10, a/20), b*math.Pi/180)
		}
		if cmplx.IsInf(s) || cmplx.IsNaN(s) {
			return &ParseError{Line: p.recLine, Msg: fmt.Sprintf("S-parameter %d is not finite", k+1)}
		}
		// Position k in the file's order -> index i*n+j.
		idx := k
		if n == 2 && (!p.v2 || p.order2112) && (k == 1 || k == 2) {
			idx = 3 - k // N11 N21 N12 N22
		}
		p.d.S[idx] = append(p.d.S[idx], s)
	}
	return nil
}

func (p *parser) finish() (*Data, error) {
	if len(p.rec) > 0 {
		return nil, &ParseError{Line: p.recLine, Msg: fmt.Sprintf("data record has %d of %d numbers", len(p.rec), 1+2*p.ports*p.ports)}
	}
	if p.refOpen {
		return nil, &ParseError{Msg: fmt.Sprintf("[Reference] has %d of %d values", len(p.ref), p.ports)}
	}
	if len(p.d.Freq) == 0 {
		return nil, &ParseError{Msg: "no network data in the file"}
	}
	if p.v2 && p.nFreq < 0 {
		return nil, &ParseError{Msg: "version 2.0 file without [Number of Frequencies]"}
	}
	if p.v2 && len(p.d.Freq) != p.nFreq {
		return nil, &ParseError{Msg: fmt.Sprintf("[Number of Frequencies] is %d, the file has %d", p.nFreq, len(p.d.Freq))}
	}
	p.d.Ports = p.ports
	p.d.Z0 = make([]float64, p.ports)
	for i := range p.d.Z0 {
		p.d.Z0[i] = p.r
		if len(p.ref) == p.ports {
			p.d.Z0[i] = p.ref[i]
		}
	}
	return p.d, nil
}
