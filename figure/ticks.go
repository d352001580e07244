package figure

import (
	"math"
	"strconv"

	"gonum.org/v1/plot"
)

// Ticks is a plot.Ticker that puts about N labelled major ticks (default 7)
// at "nice" values, 1, 2 or 5 times a power of ten apart, with unlabelled
// minor ticks between them (5 per interval after a step of 1 or 5, 4 after a
// step of 2), by P. S. Heckbert's loose labelling method ("Nice numbers for
// graph labels", in Graphics Gems, Academic Press 1990, pp. 61-63). Labels
// carry just enough decimals to tell the ticks apart.
type Ticks struct {
	N int
}

// Ticks implements plot.Ticker.
func (t Ticks) Ticks(min, max float64) []plot.Tick {
	n := t.N
	if n < 2 {
		n = 7
	}
	if !(max > min) || math.IsInf(min, 0) || math.IsInf(max, 0) {
		return nil
	}
	step := niceNum((max-min)/float64(n-1), true) // Heckbert 1990, "loose" labels
	exp := math.Floor(math.Log10(step))
	frac := step / math.Pow(10, exp)
	minors := 5
	if math.Abs(frac-2) < 1e-9 {
		minors = 4
	}
	decimals := int(math.Max(0, -exp))
	first := math.Ceil(min/step - 1e-9)
	last := math.Floor(max/step + 1e-9)
	var out []plot.Tick
	for k := first; k <= last; k++ {
		v := k * step
		if math.Abs(v) < step*1e-9 {
			v = 0
		}
		out = append(out, plot.Tick{Value: v, Label: strconv.FormatFloat(v, 'f', decimals, 64)})
	}
	// Minor ticks over the whole range, skipping major positions.
	sub := step / float64(minors)
	for k := math.Ceil(min/sub - 1e-9); k*sub <= max+sub*1e-9; k++ {
		if int64(math.Round(k))%int64(minors) == 0 {
			continue
		}
		out = append(out, plot.Tick{Value: k * sub})
	}
	return out
}

// niceNum returns a nice number (1, 2 or 5 times a power of ten) near x:
// rounded when round is true, else the smallest not below x (Heckbert 1990).
func niceNum(x float64, round bool) float64 {
	exp := math.Floor(math.Log10(x))
	f := x / math.Pow(10, exp)
	var nf float64
	if round {
		switch {
		case f < 1.5:
			nf = 1
		case f < 3:
			nf = 2
		case f < 7:
			nf = 5
		default:
			nf = 10
		}
	} else {
		switch {
		case f <= 1:
			nf = 1
		case f <= 2:
			nf = 2
		case f <= 5:
			nf = 5
		default:
			nf = 10
		}
	}
	return nf * math.Pow(10, exp)
}

// FrequencyUnit picks the unit of a frequency axis whose values reach f
// (Hz): the largest of Hz, kHz, MHz and GHz not above f, returned as its
// size in Hz and its name. Frequencies below 1 kHz, including zero,
// negative and NaN ones, give Hz; those from 1 THz up stay in GHz.
func FrequencyUnit(f float64) (scale float64, name string) {
	switch {
	case f >= 1e9:
		return 1e9, "GHz"
	case f >= 1e6:
		return 1e6, "MHz"
	case f >= 1e3:
		return 1e3, "kHz"
	}
	return 1, "Hz"
}
