package picker

import (
	"math"
	"testing"

	"biasbin/solver"
	"biasbin/solver/eseries"
)

// TestEmitterBand: the picked builds give the emitter resistor a slice of
// the supply. Without a band of the user's the first build's emitter sits
// at 5 % to 20 % of the supply (common practice: about a tenth of VCC
// across RE); with a band given, in that band. The term is soft: the
// first build may trade a sliver outside the band for a steadier build,
// so the check allows 1 % of the supply beyond either edge. The stock
// (E24 1 %, 100 Ω–220 kΩ) holds a value within 5 % of any resistance, so
// builds inside the band exist.
func TestEmitterBand(t *testing.T) {
	st := mixedStock()
	cases := []struct {
		name   string
		req    Request
		lo, hi float64 // band as fractions of |VCC| or volts
		volts  bool
	}{
		{"12 V npn default band", Request{VCC_V: 12, IC_A: 1e-3}, DefaultVEMinFrac, DefaultVEMaxFrac, false},
		{"24 V npn default band", Request{VCC_V: 24, IC_A: 2e-3}, DefaultVEMinFrac, DefaultVEMaxFrac, false},
		{"9 V pnp default band", Request{VCC_V: -9, IC_A: 0.5e-3}, DefaultVEMinFrac, DefaultVEMaxFrac, false},
		{"12 V npn band 1..1.3 V", Request{VCC_V: 12, IC_A: 1e-3, VEMin_V: 1, VEMax_V: 1.3}, 1, 1.3, true},
		{"15 V npn band 3..3.5 V", Request{VCC_V: 15, IC_A: 1e-3, VEMin_V: 3, VEMax_V: 3.5}, 3, 3.5, true},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			res, err := Pick(st, c.req)
			if err != nil {
				t.Fatal(err)
			}
			if len(res.Candidates) == 0 {
				t.Fatal("no build")
			}
			first := res.Candidates[0]
			lo, hi := c.lo, c.hi
			if !c.volts {
				lo, hi = lo*math.Abs(c.req.VCC_V), hi*math.Abs(c.req.VCC_V)
			}
			// The voltage across RE (a PNP stage on a positive supply reads
			// VE against its collector-side rail, so VE itself is not it).
			ve := first.Nominal.V_V[solver.RE]
			slack := 0.01 * math.Abs(c.req.VCC_V)
			if ve < lo-slack || ve > hi+slack {
				t.Errorf("first build's emitter at %.3g V, want %.3g..%.3g V (RE %g, IC %.3g A)",
					ve, lo, hi, first.Positions["re"].Ohm, first.Nominal.IC_A)
			}
			if first.Terms.Emitter > 0.01 {
				t.Errorf("emitter term %g: more than 1 %% of the supply outside the band", first.Terms.Emitter)
			}
		})
	}
}

// TestEmitterTermCounts: with the emitter weight at 0 the picker may drift
// outside the band for a steadier build; with the default weight the
// first build's score is never better for it (the term only adds). The
// same stock and request, E12 5 %, both ways.
func TestEmitterTermCounts(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E12, 100, 100e3, 0.05, 0.25, 10, 100), Transistors: mixedStock().Transistors[:1]}
	base := Request{VCC_V: 12, IC_A: 1e-3}
	with, err := Pick(st, base)
	if err != nil {
		t.Fatal(err)
	}
	w := DefaultWeights()
	w.Emitter = 0
	base.Weights = w
	without, err := Pick(st, base)
	if err != nil {
		t.Fatal(err)
	}
	a, b := with.Candidates[0], without.Candidates[0]
	if b.Score > a.Score+1e-12 {
		t.Errorf("ignoring the emitter term scored worse: %g > %g", b.Score, a.Score)
	}
	want := a.Score - DefaultWeights().Emitter*a.Terms.Emitter
	sum := 2*a.Terms.QPoint + a.Terms.Beta + a.Terms.Headroom + 0.25*a.Terms.Utilization + a.Terms.Yield
	if math.Abs(want-sum) > 1e-9 {
		t.Errorf("score %g less the emitter term is %g, but the other weighted terms add to %g", a.Score, want, sum)
	}
}
