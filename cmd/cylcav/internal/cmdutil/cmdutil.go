// Package cmdutil holds what every cylcav command shares: the I/O streams,
// usage errors (exit status 2), output formats, unit-flag parsing, the
// cavity geometry flags (--diameter, --radius, --length, --fill), table,
// JSON and CSV printers, and the atomic file writer.
package cmdutil

import (
	"errors"
	"fmt"
	"io"
	"os"
	"regexp"
	"strconv"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"
	"golang.org/x/term"

	"cylcav/physics"
)

// IOStreams are the streams a command reads and writes. Commands never touch
// os.Stdout or os.Stderr directly, so tests can capture everything.
type IOStreams struct {
	In     io.Reader
	Out    io.Writer
	ErrOut io.Writer

	// ErrIsTerminal reports whether ErrOut is an interactive terminal; long
	// runs show progress there and stay quiet otherwise.
	ErrIsTerminal bool
}

// System returns the process's standard streams.
func System() *IOStreams {
	return &IOStreams{
		In:            os.Stdin,
		Out:           os.Stdout,
		ErrOut:        os.Stderr,
		ErrIsTerminal: term.IsTerminal(int(os.Stderr.Fd())),
	}
}

// Test returns streams that read nothing and write into the given buffers.
func Test(out, errOut io.Writer) *IOStreams {
	return &IOStreams{In: eofReader{}, Out: out, ErrOut: errOut}
}

type eofReader struct{}

func (eofReader) Read([]byte) (int, error) { return 0, io.EOF }

// UsageError is bad input from the user: an invalid flag value, a missing
// required flag, an impossible combination. The command exits with status 2.
type UsageError struct{ Err error }

func (e *UsageError) Error() string { return e.Err.Error() }
func (e *UsageError) Unwrap() error { return e.Err }

// Usagef returns a UsageError with a formatted message.
func Usagef(format string, a ...any) error {
	return &UsageError{Err: fmt.Errorf(format, a...)}
}

// FlagError returns a UsageError that names the flag and its value:
//
//	--diameter "-3mm": must be > 0 m
//
// A value longer than 80 characters is quoted cut short, ending in "...".
func FlagError(flag, value string, err error) error {
	return &UsageError{Err: fmt.Errorf("--%s %s: %w", flag, quoteValue(value), err)}
}

// FlagValueError rewrites the parser's error for a typed flag given a value
// of the wrong kind (an int, uint or bool flag) in the form of FlagError,
//
//	--count "abc": not a whole number
//
// and returns any other error unchanged.
func FlagValueError(err error) error {
	var ive *pflag.InvalidValueError
	if !errors.As(err, &ive) {
		return err
	}
	if ve, ok := asValueError(err); ok {
		value := ive.GetValue()
		if ve.hasItem {
			value = ve.item
		}
		return fmt.Errorf("--%s %s: %s", ive.GetFlag().Name, quoteValue(value), ve.msg)
	}
	var what string
	switch t := ive.GetFlag().Value.Type(); {
	case errors.Is(err, strconv.ErrRange):
		what = "number out of range"
	case strings.HasPrefix(t, "uint"):
		what = "not a whole number >= 0"
	case strings.HasPrefix(t, "int"):
		what = "not a whole number"
	case t == "bool":
		what = "not true or false"
	default:
		return err
	}
	return fmt.Errorf("--%s %s: %s", ive.GetFlag().Name, quoteValue(ive.GetValue()), what)
}

// CautionRF is the general caution for cavities driven at high RF power,
// as a clause: `cylcav q` prints it as "Caution: <clause>.", `cylcav
// design` as a sentence of its own.
const CautionRF = "high RF power can cause burns and harmful RF exposure, and breakdown and multipaction in the cavity; follow local codes and licensed practice"

// IsUsage reports whether err is, or wraps, a UsageError.
func IsUsage(err error) bool {
	var u *UsageError
	return errors.As(err, &u)
}

// ExitStatus maps a command's error to the process exit status: 0 on
// success, 2 for usage errors, 1 for everything else (an impossible design,
// a failed write).
func ExitStatus(err error) int {
	switch {
	case err == nil:
		return 0
	case IsUsage(err), errors.Is(err, physics.ErrUniaxial):
		// A uniaxial fill given to a model that does not support it is
		// bad input (the --fill value), whichever command meets it.
		return 2
	}
	return 1
}

// RejectEmptyFlags returns a UsageError for the first string-valued flag
// that was given with an empty value (--fill= or --zeros ""), so that an
// empty value is never mistaken for an absent flag.
func RejectEmptyFlags(cmd *cobra.Command) error {
	var err error
	cmd.Flags().Visit(func(f *pflag.Flag) {
		if err == nil && f.Value.Type() == "string" && f.Value.String() == "" {
			err = FlagError(f.Name, "", errors.New("empty value; give a value or leave the flag out"))
		}
	})
	return err
}

// CheckedWriter passes writes through to another writer and remembers the
// first error, so that a command whose output could not be written (a full
// disk, `cylcav design >/dev/full`) exits with status 1 even where its code
// does not look at the error of each print. root.Main wraps standard output
// in one.
type CheckedWriter struct {
	w   io.Writer
	err error
}

// NewCheckedWriter returns a CheckedWriter on w.
func NewCheckedWriter(w io.Writer) *CheckedWriter { return &CheckedWriter{w: w} }

// Write writes p to the underlying writer. After the first error it writes
// nothing more and returns that error.
func (c *CheckedWriter) Write(p []byte) (int, error) {
	if c.err != nil {
		return 0, c.err
	}
	n, err := c.w.Write(p)
	if err != nil {
		c.err = err
	}
	return n, err
}

// Err returns the first write error, or nil.
func (c *CheckedWriter) Err() error { return c.err }

// libraryPrefix matches the package prefix that a library error carries by
// Go convention ("cavity: ...", "qfactor: ..."), at the start of the text
// or after another message's colon.
var libraryPrefix = regexp.MustCompile(`(^|: )(cavity|qfactor|modechart|filter|filterplot|figure|physics|bessel|quad|design|datasheet|axisym|axisymplot|iris|measure|benchplot|touchstone): `)

// Message returns the text of err as a user reads it: without the package
// prefixes of library errors, which name Go packages, not anything the
// user typed, and with every quoted value longer than 80 characters cut
// short ("xxxx..."...), wherever in the chain it was quoted. root.Main
// prints every error through it.
func Message(err error) string {
	s := err.Error()
	for {
		t := libraryPrefix.ReplaceAllString(s, "$1")
		if t == s {
			break
		}
		s = t
	}
	return shortenQuotes(s)
}

// shortenQuotes cuts every quoted value in s ("...", Go escapes) longer
// than maxQuoted characters with quoteValue. Quotes pair from the left; a
// quote left open ends the scan.
func shortenQuotes(s string) string {
	var b strings.Builder
	for {
		i := strings.IndexByte(s, '"')
		if i < 0 {
			b.WriteString(s)
			return b.String()
		}
		j := i + 1
		for j < len(s) && s[j] != '"' {
			if s[j] == '\\' {
				j++
			}
			j++
		}
		if j >= len(s) {
			b.WriteString(s)
			return b.String()
		}
		b.WriteString(s[:i])
		q := s[i : j+1]
		if v, err := strconv.Unquote(q); err == nil {
			q = quoteValue(v)
		}
		b.WriteString(q)
		s = s[j+1:]
	}
}
