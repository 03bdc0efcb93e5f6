package picker

import (
	"errors"
	"math"
	"testing"

	"biasbin/solver"
)

// TestWindowRule: the one window rule. A relative band is ±Frac of the
// design point (never below 0), an absolute band ignores it; the design
// point is the target where one is given, else the nominal point; the zero
// rule is ±10 % IC, ±20 % VCE; a band that is no window is refused.
func TestWindowRule(t *testing.T) {
	op := solver.OperatingPoint{IC_A: 1e-3, VCE_V: 5}
	c := CentreOf(2e-3, 0, op)
	if c.IC_A != 2e-3 || c.ICOf != CentreTarget || c.VCE_V != 5 || c.VCEOf != CentreNominal {
		t.Errorf("centre %+v: want the 2 mA target and the nominal 5 V", c)
	}
	w := WindowRule{IC: Band{Relative: true, Frac: 0.1}, VCE: Band{Min: 4, Max: 8}}.At(c)
	if math.Abs(w.ICMin_A-1.8e-3) > 1e-15 || math.Abs(w.ICMax_A-2.2e-3) > 1e-15 || w.VCEMin_V != 4 || w.VCEMax_V != 8 {
		t.Errorf("window %+v", w)
	}
	if d := (WindowRule{}).At(c); math.Abs(d.ICMin_A-1.8e-3) > 1e-15 || math.Abs(d.VCEMin_V-4) > 1e-12 || math.Abs(d.VCEMax_V-6) > 1e-12 {
		t.Errorf("default window %+v: want ±10 %% IC, ±20 %% VCE", d)
	}
	if lo, _ := (Band{Relative: true, Frac: 1.5}).Around(1); lo != 0 {
		t.Errorf("a 150 %% band starts at %g, want 0", lo)
	}
	for _, bad := range []WindowRule{
		{IC: Band{Relative: true, Frac: 0}, VCE: Band{Relative: true, Frac: 0.2}},
		{IC: Band{Relative: true, Frac: 1}, VCE: Band{Relative: true, Frac: 0.2}},
		{IC: Band{Relative: true, Frac: 0.1}, VCE: Band{Min: 8, Max: 4}},
		{IC: Band{Min: -1, Max: 1}, VCE: Band{Relative: true, Frac: 0.2}},
	} {
		var ie *InputError
		if err := bad.Check(); !errors.As(err, &ie) {
			t.Errorf("%+v: err %v, want an InputError", bad, err)
		}
	}
}
