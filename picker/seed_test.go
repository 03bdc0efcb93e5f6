package picker

import (
	"fmt"
	"math"
	"testing"

	"biasbin/solver"
	"biasbin/solver/eseries"
)

// TestSeedsPassOnPairWalls: on a wall with pairs, the hand-method seeds
// of every topology put passing builds in the pool, so the search starts
// with a finite threshold. The stock is every E96 value 10 Ω–1 MΩ
// (IEC 60063:2015, Table 1) with six transistor types, at 0.1, 1 and
// 10 mA on 12 V. A seed's search for the first level at or under the target
// current used to stop at a saturated tuple: deep in saturation a stiff
// divider pulls the emitter, and so the collector, up to the supply and
// IC is small (common practice: a saturated stage's IC is set by its
// collector load, not by its base drive), so R1 came out at 5 Ω and every
// seed failed. At 10 mA a split-supply seed's RE came out at 10 Ω: with
// the smallest RE a base current of about (|VEE| − VBE)/RB heats the
// junction past Tj max (common practice: the junction's rise is P·θJA),
// the tuple cannot be solved, and a tuple that cannot be solved read as
// under the target.
func TestSeedsPassOnPairWalls(t *testing.T) {
	if testing.Short() {
		t.Skip("builds an E96 pair wall")
	}
	st := Stock{Resistors: seriesStock(eseries.E96, 10, 1e6, 0.01, 0.25, 100, 1000), Transistors: benchTransistors(6)}
	for _, topo := range []solver.Topology{solver.Divider, solver.CollectorFeedback, solver.SplitSupply} {
		for _, ic := range []float64{0.1e-3, 1e-3, 10e-3} {
			t.Run(fmt.Sprintf("%v/%gmA", topo, ic*1e3), func(t *testing.T) {
				req := Request{Topology: topo, VCC_V: 12, IC_A: ic, Top: 10, Pairs: true}
				if topo == solver.SplitSupply {
					req.VEE_V = -12
				}
				s, err := normalize(req)
				if err != nil {
					t.Fatal(err)
				}
				e, _ := newEvaluator(s, st, topo)
				p := newPool(s.pool, true)
				var cnt counters
				planFor(e).seed(p, &cnt)
				if thr := p.threshold(); math.IsInf(thr, 1) {
					passing := 0
					for _, it := range p.items {
						if len(it.failing) == 0 {
							passing++
						}
					}
					t.Errorf("after the seeds %d of %d pool builds pass (pool size %d): the threshold is +Inf", passing, len(p.items), s.pool)
				}
			})
		}
	}
}

// TestSaturatedTupleNeverBounds: a divider tuple driven into saturation
// by a small R1 has a smaller IC than the active tuples at larger R1
// (common practice: in saturation the collector load sets IC), so the
// level searches must not read it as "under the target": icAtMost and
// icUnder are false for it.
func TestSaturatedTupleNeverBounds(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E12, 10, 1e6, 0.05, 0.25, 100, 1000), Transistors: benchTransistors(1)}
	e := newTestEvaluator(t, st, Request{VCC_V: 12, IC_A: 0.1e-3})
	lvl := func(ohm float64) int {
		i := e.vs.levelAtOrAbove(ohm)
		if got := e.vs.levels[i].ohm; math.Abs(got-ohm) > 1e-9*ohm {
			t.Fatalf("no level at %g Ω (nearest %g)", ohm, got)
		}
		return i
	}
	// R2 82 kΩ, RC 47 kΩ, RE 12 kΩ: R1 10 Ω saturates, R1 680 kΩ is active
	sat := e.newTuple(0, [maxPos]int{lvl(10), lvl(82e3), lvl(47e3), lvl(12e3)})
	act := e.newTuple(0, [maxPos]int{lvl(680e3), lvl(82e3), lvl(47e3), lvl(12e3)})
	if !sat.ok || sat.op.Region != solver.Saturation {
		t.Fatalf("R1 10 Ω: region %v (ok %v), want saturation", sat.op.Region, sat.ok)
	}
	if !act.ok || act.op.Region != solver.Active {
		t.Fatalf("R1 680 kΩ: region %v (ok %v), want active", act.op.Region, act.ok)
	}
	if sat.op.IC_A >= act.op.IC_A {
		t.Fatalf("saturated IC %g A not under the active one %g A: the case this test guards is gone", sat.op.IC_A, act.op.IC_A)
	}
	if sat.icAtMost(act.op.IC_A) || sat.icUnder(act.op.IC_A*2) {
		t.Errorf("a saturated tuple (IC %g A) reads as under a current", sat.op.IC_A)
	}
	if !act.icAtMost(act.op.IC_A) || !act.icUnder(act.op.IC_A*1.01) {
		t.Errorf("an active tuple (IC %g A) does not read as under a larger current", act.op.IC_A)
	}
}
