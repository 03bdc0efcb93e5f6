package picker

import (
	"math"
	"math/rand/v2"
	"testing"

	"biasbin/solver/eseries"
)

func TestDbgBetaFloor(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E24, 10, 1e6, 0.01, 0.25, 100, 1000), Transistors: benchTransistors(6)}
	for _, vcc := range []float64{5, 12, 30} {
		s, _ := normalize(Request{VCC_V: vcc, IC_A: 1e-3})
		e, _ := newEvaluator(s, st)
		rng := rand.New(rand.NewPCG(1, 1))
		n := len(e.vs.levels)
		viol, tot, minRatio := 0, 0, math.Inf(1)
		for range 30000 {
			di := rng.IntN(len(e.devs))
			lv := [4]int{rng.IntN(n), rng.IntN(n), rng.IntN(n), rng.IntN(n)}
			a := e.newTuple(di, lv)
			if !a.ok || a.op.Region != 1 || a.op.VCE_V < 0.7 {
				continue
			}
			e.betaSpread(a, &counters{})
			if !a.betaOK {
				continue
			}
			dv := &e.devs[di]
			hi, err := e.solveAt(dv, dv.hi, a.r)
			if err != nil || hi.Region != 1 || hi.VCE_V < 0.7 {
				continue
			}
			r := a.r
			rth := r[0] * r[1] / (r[0] + r[1])
			_, vh := e.vbeBounds(&e.devs[di], a.op.IC_A, a.op.IC_A)
			lb := e.betaFloor(&e.devs[di], rth, r[3], r[2], a.op.IC_A, a.op.IC_A, vh)
			tot++
			if lb > 0 {
				minRatio = math.Min(minRatio, math.Abs(a.beta)/lb)
			}
			if lb > math.Abs(a.beta) {
				viol++
				if viol < 4 {
					t.Logf("viol vcc %g: %v B %g lb %g ic %g vce %g", vcc, r, a.beta, lb, a.op.IC_A, a.op.VCE_V)
				}
			}
		}
		t.Logf("vcc %g: %d of %d violate; min B/lb %.4g", vcc, viol, tot, minRatio)
	}
}
