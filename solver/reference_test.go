package solver_test

import (
	"math"
	"testing"

	"biasbin/solver"
)

// TestReferenceNgspiceResults are regression values recorded from ngspice
// decks (source: ngspice 39.3 run, REFERENCE.md §11): V_CC 15 V, R1 10 k,
// R2 5 k, R_C 1 k, R_E 1 k, IS = 1e-14, NF = 1, VAF = ∞, TNOM = 27 °C (the
// SPICE default used by those decks). ngspice printed 7 significant
// digits, so the tolerance is 2e-6 relative.
func TestReferenceNgspiceResults(t *testing.T) {
	s := stage(solver.Divider, 15, 0, R{solver.R1: 10e3, solver.R2: 5e3, solver.RC: 1e3, solver.RE: 1e3})
	model := func(bf, xtb float64) solver.Model {
		m := npnModel(1e-14, bf, 0, 0)
		m.TNOM_C, m.XTB = 27, xtb
		return m
	}
	type want struct {
		q quantity
		v float64
	}
	qP := quantity{"P", func(o solver.OperatingPoint) float64 { return o.PTransistor_W }}
	qVBE := quantity{"VBE", func(o solver.OperatingPoint) float64 { return o.VBE_V }}
	for _, c := range []struct {
		source string
		m      solver.Model
		tj     float64
		want   []want
	}{
		{"source: ngspice 39.3 run, REFERENCE.md §11, 27 °C, BF = 100", model(100, 0), 27,
			[]want{{qVB, 4.862358}, {qVC, 10.87073}, {qVE, 4.170561}, {qIC, 4.129268e-3}, {qVBE, 0.6917969}, {qP, 27.69537e-3}}},
		{"source: ngspice 39.3 run, REFERENCE.md §11, 27 °C, BF = 300", model(300, 0), 27,
			[]want{{qIC, 4.246148e-3}, {qVCE, 6.493550}}},
		{"source: ngspice 39.3 run, REFERENCE.md §11, XTB = 1.5, .temp 85", model(100, 1.5), 85,
			[]want{{qVC, 10.73732}, {qVE, 4.295380}}},
		{"source: ngspice 39.3 run, REFERENCE.md §11, XTB = 1.5, -40 °C (op loop)", model(100, 1.5), -40,
			[]want{{qVC, 11.04953}, {qVE, 4.008170}, {qIC, 3.950466e-3}}},
		{"source: ngspice 39.3 run, REFERENCE.md §11, XTB = 1.5, 125 °C (op loop)", model(100, 1.5), 125,
			[]want{{qVE, 4.377175}, {qIC, 4.348713e-3}}},
	} {
		op, err := solver.Solve(s, c.m, c.tj)
		if err != nil {
			t.Fatalf("%s: %v", c.source, err)
		}
		for _, w := range c.want {
			if got := w.q.get(op); math.Abs(got/w.v-1) > 2e-6 {
				t.Errorf("%s: %s = %.8g, ngspice %.7g", c.source, w.q.name, got, w.v)
			}
		}
	}
}
