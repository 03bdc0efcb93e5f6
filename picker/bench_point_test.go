package picker

import (
	"math/rand/v2"
	"slices"
	"testing"

	"biasbin/solver"
)

// TestBenchPointsHold: a build passes only if the board on the bench at
// 25 °C, with marked values and the transistor at hFE min, typical or max,
// is forward-active with VCE at least VCE(sat) + margin (common practice:
// a stage is brought up and measured at room temperature, whatever
// ambient it will later see). Each point is solved here on its own with
// solver.ModelFor and solver.SolveSelfHeated, over random builds for
// ambient ranges below, around and above 25 °C: the picker names a bench
// point among a build's reasons exactly when one breaks, and the cold
// range gives builds whose corners all hold while a bench point breaks.
func TestBenchPointsHold(t *testing.T) {
	onlyBench := 0
	for _, amb := range [][2]float64{{-40, 0}, {0, 50}, {35, 70}} {
		e := newTestEvaluator(t, mixedStock(), Request{VCC_V: 9, IC_A: 2e-3, AmbientMin_C: amb[0], AmbientMax_C: amb[1]})
		rng := rand.New(rand.NewPCG(uint64(amb[0]+100), 5))
		n := len(e.vs.levels)
		for range 3000 {
			c := combo{dev: rng.IntN(len(e.devs)), lv: [nPos]int{rng.IntN(n), rng.IntN(n), rng.IntN(n), rng.IntN(n)}}
			for i := range nPos {
				c.val[i] = e.vs.levels[c.lv[i]].values[0]
			}
			tp := e.newTuple(c.dev, c.lv)
			if !tp.ok {
				continue
			}
			e.betaSpread(tp, &counters{})
			if !tp.betaOK {
				continue
			}
			b := e.build(c)
			ev := e.finish(c, b, tp, 0)
			dev := b.Device
			broken := false
			for _, h := range []float64{dev.HFEMin, solver.TypicalHFE(dev), dev.HFEMax} {
				m, err := solver.ModelFor(dev, h)
				if err != nil {
					t.Fatal(err)
				}
				var marked [solver.NumSlots]float64
				op, err := solver.SolveSelfHeated(b.Resolve(marked, 1, 25), m, 25, solver.ThermalResistance(dev), dev.TjMax_C)
				if err != nil || op.Region != solver.Active || op.VCE_V < dev.VCESat_V+solver.DefaultVCEMargin_V {
					broken = true
				}
			}
			named := slices.ContainsFunc(ev.failing, func(f Failure) bool { return f.Kind == FailBench })
			if named != broken {
				t.Fatalf("ambient %v, %v: bench point broken %v, picker's reasons %+v", amb, b.Resistors, broken, ev.failing)
			}
			if named && len(ev.failing) == 1 {
				onlyBench++
			}
		}
	}
	if onlyBench == 0 {
		t.Error("no build failed on its bench points alone; the test shows nothing")
	}
	t.Logf("%d builds failed on their bench points alone", onlyBench)
}
