package picker

import (
	"testing"

	"biasbin/solver/eseries"
)

func TestSmoke(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E12, 100, 100e3, 0.05, 0.25, 20, 1000), Transistors: []Transistor{smallNPN(1, 100, 300)}}
	for _, ex := range []bool{false, true} {
		res, err := Pick(st, Request{VCC_V: 12, IC_A: 1e-3, Exhaustive: ex, Top: 5})
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("exhaustive=%v evaluated=%d solved=%d considered=%d", ex, res.Evaluated, res.Solved, res.Considered)
		for _, c := range res.Candidates {
			t.Logf("%s %.4f %+v r1=%g r2=%g rc=%g re=%g ic=%.4g vce=%.3g fail=%v", c.ID, c.Score, c.Terms, c.Positions["r1"].Ohm, c.Positions["r2"].Ohm, c.Positions["rc"].Ohm, c.Positions["re"].Ohm, c.Nominal.IC_A, c.Nominal.VCE_V, c.Failing)
		}
	}
}
