package cmdutil

import (
	"errors"
	"fmt"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"
)

// Rules every command's flags follow, applied once to the whole command
// tree by HardenFlags (root.NewCmdRoot calls it) so that no command can
// forget them:
//
//   - a flag that takes one value may be given once: a repeated --freq is
//     refused, never silently replaced by the last value. List flags
//     (pflag slices and arrays) may repeat;
//   - an integer flag takes decimal digits with an optional sign: "010",
//     "0x10", "0b11" and "1_0" are refused (pflag reads them as octal,
//     hexadecimal, binary and with digit separators);
//   - a flag that has no effect without another (Needs) is refused when
//     given alone (CheckNeeds, run by the root before each command).

// valueError is the error of a flag value's Set; FlagValueError prints it
// as `--flag "value": message`, quoting item instead of the whole value
// when set (an item of a list).
type valueError struct {
	msg     string
	item    string
	hasItem bool
}

func (e *valueError) Error() string { return e.msg }

// ValueErrorf returns an error for the Set method of a pflag.Value, worded
// without the flag and value, which FlagValueError adds.
func ValueErrorf(format string, a ...any) error {
	return &valueError{msg: fmt.Sprintf(format, a...)}
}

// ItemErrorf is ValueErrorf for one item of a list flag's value: the error
// line quotes the item, `--zeros "9.99GHz": ...`, not the whole list.
func ItemErrorf(item, format string, a ...any) error {
	return &valueError{msg: fmt.Sprintf(format, a...), item: item, hasItem: true}
}

// strictValue wraps a flag's value with the rules above.
type strictValue struct {
	pflag.Value
	given   []string
	integer bool
	repeat  bool
}

// strictBool is a strictValue of a boolean flag: IsBoolFlag keeps it
// usable without a value (--force). Only boolean flags get the method:
// pflag takes any value with it for a boolean and then prints a default
// "0" in the help ("(default 40) (default 0)").
type strictBool struct{ *strictValue }

func (v strictBool) IsBoolFlag() bool { return true }

func (v *strictValue) Set(s string) error {
	if len(v.given) > 0 && !v.repeat {
		return ValueErrorf("given twice (first %s); give it once", quoteValue(v.given[0]))
	}
	if v.integer && !isDecimalInteger(s) {
		return ValueErrorf("not a whole number in decimal digits (no leading zero, 0x, 0b or _)")
	}
	v.given = append(v.given, s)
	return v.Value.Set(s)
}

// isDecimalInteger reports whether s is [+-] digits with no leading zero
// (except "0" itself).
func isDecimalInteger(s string) bool {
	s = strings.TrimPrefix(strings.TrimPrefix(s, "+"), "-")
	if s == "" || (len(s) > 1 && s[0] == '0') {
		return false
	}
	for _, c := range s {
		if c < '0' || c > '9' {
			return false
		}
	}
	return true
}

// HardenFlags applies the rules above to every flag of cmd and its
// subcommands. Call it once, after every command and flag is defined.
func HardenFlags(cmd *cobra.Command) {
	harden := func(f *pflag.Flag) {
		switch f.Value.(type) {
		case *strictValue, strictBool:
			return
		}
		t := f.Value.Type()
		sv := &strictValue{
			Value:   f.Value,
			integer: strings.HasPrefix(t, "int") || strings.HasPrefix(t, "uint"),
			repeat:  strings.HasSuffix(t, "Slice") || strings.HasSuffix(t, "Array"),
		}
		if b, ok := f.Value.(interface{ IsBoolFlag() bool }); ok && b.IsBoolFlag() {
			f.Value = strictBool{sv}
			return
		}
		f.Value = sv
	}
	cmd.LocalFlags().VisitAll(harden)
	cmd.PersistentFlags().VisitAll(harden)
	cmd.Flags().VisitAll(harden)
	for _, sub := range cmd.Commands() {
		HardenFlags(sub)
	}
}

const (
	needsKey   = "cylcav_needs"
	needsEgKey = "cylcav_needs_example"
)

// NeedsExample sets the example command-line fragment that CheckNeeds
// shows when the flag name is given without the flag it needs (a fragment
// that, added, makes the command line valid: "--wall niobium
// --superconducting --temperature 2K").
func NeedsExample(cmd *cobra.Command, name, example string) {
	f := cmd.Flags().Lookup(name)
	if f == nil {
		panic("cmdutil.NeedsExample: no flag --" + name)
	}
	if f.Annotations == nil {
		f.Annotations = map[string][]string{}
	}
	f.Annotations[needsEgKey] = []string{example}
}

// Needs records that the flag name has no effect unless one of anyOf is
// given too; CheckNeeds refuses it alone. Both must be flags of cmd.
func Needs(cmd *cobra.Command, name string, anyOf ...string) {
	f := cmd.Flags().Lookup(name)
	if f == nil {
		panic("cmdutil.Needs: no flag --" + name)
	}
	for _, o := range anyOf {
		if cmd.Flags().Lookup(o) == nil {
			panic("cmdutil.Needs: no flag --" + o)
		}
	}
	if f.Annotations == nil {
		f.Annotations = map[string][]string{}
	}
	f.Annotations[needsKey] = append(f.Annotations[needsKey], anyOf...)
}

// CheckNeeds returns a usage error naming both flags for the first flag
// (in name order) given without any of the flags it needs.
func CheckNeeds(cmd *cobra.Command) error {
	var err error
	fs := cmd.Flags()
	fs.Visit(func(f *pflag.Flag) {
		need := f.Annotations[needsKey]
		if err != nil || len(need) == 0 {
			return
		}
		for _, n := range need {
			if fs.Changed(n) {
				return
			}
		}
		names := make([]string, len(need))
		for i, n := range need {
			names[i] = "--" + n
		}
		list := strings.Join(names, " or ")
		eg := ""
		if e := f.Annotations[needsEgKey]; len(e) > 0 {
			eg = ", e.g. " + e[0]
		}
		err = Usagef("--%s needs %s (alone it has no effect; leave it out or give %s too%s)", f.Name, list, list, eg)
	})
	return err
}

// errValueTooLong is the limit of a quoted value in an error message.
const maxQuoted = 80

// quoteValue quotes a flag value for an error message, cut to maxQuoted
// characters with "..." so that a pasted file does not flood the terminal.
func quoteValue(s string) string {
	if r := []rune(s); len(r) > maxQuoted {
		return fmt.Sprintf("%q...", string(r[:maxQuoted]))
	}
	return fmt.Sprintf("%q", s)
}

// IsValueError reports whether err, a flag parsing error, comes from a
// value's own check (ValueErrorf), which already says what is valid.
func IsValueError(err error) bool {
	_, ok := asValueError(err)
	return ok
}

// asValueError reports whether err (the cause of a pflag InvalidValueError)
// is a valueError.
func asValueError(err error) (*valueError, bool) {
	var ve *valueError
	ok := errors.As(err, &ve)
	return ve, ok
}
