package cmdutil

import (
	"github.com/spf13/pflag"

	"cylcav/physics"
)

// PowerVar defines a power flag (200W, 2.5kW) stored in watts in p, valid
// in [lo, hi].
func PowerVar(fs *pflag.FlagSet, p *float64, name, usage string, lo, hi float64) *Quantity {
	return addQuantity(fs, &Quantity{p: p, kind: "power", parse: physics.ParsePower, lo: lo, hi: hi,
		show: func(v float64) string { return physics.FormatSI(v, "W", 4) }}, name, usage)
}

// PressureVar defines a pressure flag (70kPa, 1atm) stored in pascals in p,
// valid in [lo, hi].
func PressureVar(fs *pflag.FlagSet, p *float64, name, usage string, lo, hi float64) *Quantity {
	return addQuantity(fs, &Quantity{p: p, kind: "pressure", parse: physics.ParsePressure, lo: lo, hi: hi,
		show: func(v float64) string { return physics.FormatSI(v, "Pa", 4) }}, name, usage)
}
