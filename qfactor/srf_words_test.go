package qfactor

import "testing"

// TestMarginWords checks the words printed for a peak field against its
// guide on both sides of the guide: below it the margin guide/peak, on or
// above it the factor peak/guide with "AT OR ABOVE" (a field 15 times the
// guide must never read "0.07x below").
func TestMarginWords(t *testing.T) {
	l := FieldLimits{Quench: 0.2, FieldEmission: 40e6}
	for _, c := range []struct {
		bpk, epk     float64
		quench, emit string
	}{
		{0.1, 20e6, "2.00x below", "2.00x below"},
		{3.0, 600e6, "AT OR ABOVE (15x)", "AT OR ABOVE (15x)"},
		{0.2, 40e6, "AT OR ABOVE (1x)", "AT OR ABOVE (1x)"},
	} {
		m := Margins{Bpk: c.bpk, Epk: c.epk, Limits: l, BMargin: l.Quench / c.bpk, EMargin: l.FieldEmission / c.epk,
			AboveQuench: c.bpk >= l.Quench, Emitted: c.epk >= l.FieldEmission}
		if got := m.QuenchWords(); got != c.quench {
			t.Errorf("Bpk %g T: %q, want %q", c.bpk, got, c.quench)
		}
		if got := m.EmissionWords(); got != c.emit {
			t.Errorf("Epk %g V/m: %q, want %q", c.epk, got, c.emit)
		}
	}
}
