package picker

import (
	"testing"

	"biasbin/solver/eseries"
)

// TestResistorVoltageIsAHardLimit: at a 200 V supply the divider's upper
// resistor carries most of the rail. 0805-class ⅛ W chips are good for
// 150 V (REFERENCE.md §16, common practice), 120 V with the 80 % margin
// (REFERENCE.md §3). The best build on lines stated at 500 V puts more
// than 120 V across a resistor; on the chips, no listed build does so
// without naming it as a failure.
func TestResistorVoltageIsAHardLimit(t *testing.T) {
	hv := smallNPN(1, 60, 240)
	hv.Sheet.VCEO_V, hv.Sheet.PD25_W, hv.Sheet.ICMax_A = 400, 1, 0.5
	req := Request{VCC_V: 200, IC_A: 1e-3, Top: 3, ShowFailing: true}
	const chipLimit_V = 120.0

	chips := Stock{Resistors: seriesStock(eseries.E6, 1e3, 10e6, 0.05, 0.125, 10, 1000), Transistors: []Transistor{hv}}
	axial := Stock{Resistors: append([]Resistor(nil), chips.Resistors...), Transistors: chips.Transistors}
	for i := range axial.Resistors {
		axial.Resistors[i].LEV_V = 500
	}

	res, err := Pick(axial, req)
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Candidates) == 0 {
		t.Fatal("no build on 500 V parts")
	}
	if v := highestVoltage(res.Candidates[0]); v <= chipLimit_V {
		t.Fatalf("the best 500 V build carries only %.1f V: the test does not reach the chips' limit", v)
	}

	res, err = Pick(chips, req)
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Candidates) == 0 {
		t.Fatal("no build listed")
	}
	for _, c := range res.Candidates {
		named := false
		for _, f := range c.Failing {
			if f.Kind == FailVoltage {
				named = f.VoltageAllowed_V == chipLimit_V && f.Voltage_V > chipLimit_V
			}
		}
		if v := highestVoltage(c); v > chipLimit_V && !named {
			t.Errorf("%s: %.1f V across a 150 V chip without a voltage failure: %+v", c.ID, v, c.Failing)
		}
	}
}

// highestVoltage is the largest worst-case voltage across any resistor.
func highestVoltage(c Candidate) float64 {
	v := 0.0
	for _, pl := range c.Worst.Dissipation.Resistor {
		v = max(v, pl.Voltage_V)
	}
	return v
}
