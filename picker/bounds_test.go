package picker

import (
	"math"
	"math/rand/v2"
	"testing"

	"biasbin/solver"
	"biasbin/solver/eseries"
)

// TestBoundsHoldOnRandomBuilds checks every closed-form bound the search
// uses against the exact self-heated solution of random builds (the
// reference is solver.SolveSelfHeated itself, the function whose results
// the bounds must stay below or above): VBE within vbeBounds, R_TH above
// rthFloor, the divider's utilization above dividerPowerBound and the
// beta term above betaFloor, for builds whose nominal and hFE-max points
// are active with VCE above the 0.7 V floor (the builds the search bounds).
func TestBoundsHoldOnRandomBuilds(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E24, 10, 1e6, 0.01, 0.25, 100, 1000), Transistors: benchTransistors(6)}
	st.Transistors[2].Sheet.VAF_V = 0 // one without Early effect
	checked := 0
	for _, vcc := range []float64{5, 12, 30} {
		s, err := normalize(Request{VCC_V: vcc, IC_A: 1e-3})
		if err != nil {
			t.Fatal(err)
		}
		e, _ := newEvaluator(s, st)
		rng := rand.New(rand.NewPCG(uint64(vcc), 1))
		n := len(e.vs.levels)
		for range 6000 {
			di := rng.IntN(len(e.devs))
			lv := [nPos]int{rng.IntN(n), rng.IntN(n), rng.IntN(n), rng.IntN(n)}
			a := e.newTuple(di, lv)
			if !a.ok || a.op.Region != solver.Active || a.op.VCE_V < 0.7 {
				continue
			}
			dv := &e.devs[di]
			hi, err := e.solveAt(dv, dv.hi, a.r)
			if err != nil || hi.Region != solver.Active || hi.VCE_V < 0.7 {
				continue
			}
			e.betaSpread(a, &counters{})
			if !a.betaOK {
				continue
			}
			checked++
			op, r := a.op, a.r
			ic := op.IC_A
			vbeLo, vbeHi := e.vbeBounds(dv, ic, ic)
			if op.VBE_V < vbeLo || op.VBE_V > vbeHi {
				t.Errorf("VBE %.6g outside [%.6g, %.6g] (vcc %g, %v)", op.VBE_V, vbeLo, vbeHi, vcc, r)
			}
			rth := r[iR1] * r[iR2] / (r[iR1] + r[iR2])
			if f := e.rthFloor(r[iR2], math.Abs(op.VB_V), op.IB_A); f > rth*(1+1e-12) {
				t.Errorf("R_TH floor %.6g above R_TH %.6g (%v)", f, rth, r)
			}
			u := math.Max(op.P_W[solver.R1]/e.vs.levels[lv[iR1]].allowHot_W, op.P_W[solver.R2]/e.vs.levels[lv[iR2]].allowHot_W)
			if f := e.dividerPowerBound(lv[iR2], math.Abs(op.VB_V), math.Abs(op.VB_V)); f > u*(1+1e-9) {
				t.Errorf("divider bound %.6g above the divider's utilization %.6g (%v)", f, u, r)
			}
			if f := e.betaFloor(dv, rth, r[iRE], r[iRC], ic, ic, vbeHi); f > math.Abs(a.beta) {
				t.Errorf("beta floor %.6g above the beta term %.6g (vcc %g, %v, VCE %.3g)", f, math.Abs(a.beta), vcc, r, op.VCE_V)
			}
		}
	}
	if checked < 1000 {
		t.Fatalf("only %d builds checked", checked)
	}
}
