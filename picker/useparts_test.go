package picker

import (
	"math"
	"math/rand/v2"
	"testing"

	"biasbin/solver"
)

// TestPairedPositionsMatchExhaustive: bound U-P lets an open position be
// one part or a pair, each with its own best allowance, the pair with its
// extra part. On a wall of eighth-watt lines at 10 mA a single collector
// resistor runs hot, so some of the best builds put a pair there; the
// default search must give the exhaustive top 10. The bound has room to
// spare here (a single's allowance taken 0.3× too low still passes), so
// TestUseAndPartsFloorHolds is its sharp check. source: the ranking's
// definition (doc.go): the exhaustive search scores every build.
func TestPairedPositionsMatchExhaustive(t *testing.T) {
	if testing.Short() {
		t.Skip("exhaustive searches")
	}
	var lines []Resistor
	for i, v := range []float64{180, 390, 1.5e3, 4.7e3} {
		lines = append(lines, Resistor{ID: int64(100 + i), Ohm: v, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: 0.125, Qty: 10, Bin: "B"})
	}
	st := Stock{Resistors: lines, Transistors: []Transistor{smallNPN(1, 100, 300), smallNPN(2, 60, 240)}}
	for _, req := range []Request{
		{VCC_V: 12, IC_A: 10e-3, Top: 10, Pairs: true},
		{Topology: solver.SplitSupply, VCC_V: 12, VEE_V: -12, IC_A: 10e-3, Top: 10, Pairs: true},
	} {
		s, err := normalize(req)
		if err != nil {
			t.Fatal(err)
		}
		topo := s.topo // the request's topology, its default filled in
		fast, full, err := bothModes(st, req)
		if err != nil {
			t.Fatal(err)
		}
		if len(full.Candidates) != req.Top || len(fast.Candidates) != req.Top {
			t.Fatalf("%v: default %d builds, exhaustive %d", topo, len(fast.Candidates), len(full.Candidates))
		}
		paired := 0
		for i := range full.Candidates {
			a, b := fast.Candidates[i], full.Candidates[i]
			if a.ID != b.ID || a.Score != b.Score {
				t.Errorf("%v rank %d: default %s (%.6g), exhaustive %s (%.6g)", topo, i+1, a.ID, a.Score, b.ID, b.Score)
			}
			if b.Positions["rc"].Arrangement != "single" {
				paired++
			}
		}
		if paired == 0 {
			t.Errorf("%v: fixture too weak: no build of the top 10 has a pair for RC", topo)
		}
		t.Logf("%v: default solved %d tuples, exhaustive %d; RC paired in %d of 10", topo, fast.Solved, full.Solved, paired)
	}
}

// TestUseAndPartsFloorHolds checks bound U-P and the RC scan's floor per
// RC level against the score's own utilization and parts terms
// (solver.EvalDissipation, extraParts) of random divider builds on a wall
// with pairs. With every part's dissipation exact, w_Utilization·U +
// w_Parts·(extra parts of RC and R1) is at least useAndPartsFloor of the
// other parts' utilization and RC's and R1's powers, whichever of them
// are pairs (and so with R2 open too); and RC's utilization is at least levelUseFloor at the least
// IC of a build whose QPoint term is at most the build's own
// (boundsWithin). source: the terms' definitions (doc.go): a pair's
// allowance is at most the best of any value, a single's at most the best
// single's, and the QPoint term is at least |IC − IC_t|/IC_t.
func TestUseAndPartsFloorHolds(t *testing.T) {
	var lines []Resistor
	for i, v := range []float64{100, 220, 470, 1e3, 2.2e3, 4.7e3, 10e3} {
		rated := []float64{0.125, 0.25, 0.6}[i%3]
		lines = append(lines, Resistor{ID: int64(100 + i), Ohm: v, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: rated, Qty: 10, Bin: "B"})
	}
	st := Stock{Resistors: lines, Transistors: []Transistor{smallNPN(1, 100, 300)}}
	s, err := normalize(Request{VCC_V: 12, IC_A: 10e-3, Pairs: true})
	if err != nil {
		t.Fatal(err)
	}
	e, _ := newEvaluator(s, st, s.topo)
	w := e.s.w
	rng := rand.New(rand.NewPCG(7, 1))
	n := len(e.vs.levels)
	checked, paired, tight := 0, 0, 0
	for range 20000 {
		lv := [maxPos]int{rng.IntN(n), rng.IntN(n), rng.IntN(n), rng.IntN(n)}
		tp := e.newTuple(0, lv)
		if !tp.ok || tp.op.Region != solver.Active {
			continue
		}
		var c combo
		c.lv = lv
		for i := range e.lay.n {
			vs := e.vs.levels[lv[i]].values
			c.val[i] = vs[rng.IntN(len(vs))]
		}
		d := solver.EvalDissipation(e.build(c), tp.op, e.s.ambMax, e.s.lim)
		others := math.Max(math.Max(d.Resistor[solver.R2].Utilization, d.Resistor[solver.RE].Utilization), d.Transistor.Utilization)
		extra := 0.0
		for _, i := range []int{iR1, iRC} {
			if e.vs.values[c.val[i]].lines[1] >= 0 {
				extra++
				paired++
			}
		}
		got := w.Utilization*d.MaxUtilization + w.Parts*extra
		floor := e.useAndPartsFloor(others, tp.op.P_W[solver.RC], tp.op.P_W[solver.R1])
		if floor > got*(1+1e-12) {
			t.Errorf("U-P floor %.6g above the terms %.6g (levels %v, values %v)", floor, got, lv, c.val)
		}
		// the RC scan's per-level floor: RC's utilization with the least
		// IC of a build whose QPoint term is at most its own
		if f := e.levelUseFloor(lv[iRC], e.boundsWithin(1, tp.q).icLo); f > d.Resistor[solver.RC].Utilization*(1+1e-12) {
			t.Errorf("RC level floor %.6g above RC's utilization %.6g (levels %v, QPoint term %.4g)", f, d.Resistor[solver.RC].Utilization, lv, tp.q)
		}
		// with R2 open too (the divider's first R2 takes it so)
		others3 := math.Max(d.Resistor[solver.RE].Utilization, d.Transistor.Utilization)
		extra3 := extra
		if e.vs.values[c.val[iR2]].lines[1] >= 0 {
			extra3++
		}
		if f := e.useAndPartsFloor(others3, tp.op.P_W[solver.RC], tp.op.P_W[solver.R1], tp.op.P_W[solver.R2]); f > (w.Utilization*d.MaxUtilization+w.Parts*extra3)*(1+1e-12) {
			t.Errorf("U-P floor with R2 open %.6g above the terms %.6g (levels %v, values %v)", f, w.Utilization*d.MaxUtilization+w.Parts*extra3, lv, c.val)
		}
		if floor > w.Utilization*math.Max(others, math.Max(tp.op.P_W[solver.RC], tp.op.P_W[solver.R1])/e.vs.allowHotMax_W)*(1+1e-9) {
			tight++ // the choice raised the floor over the one without it
		}
		checked++
	}
	if checked < 2000 || paired == 0 || tight == 0 {
		t.Fatalf("fixture too weak: %d builds checked, %d pairs, the choice raised the floor on %d", checked, paired, tight)
	}
	t.Logf("%d builds checked (%d pairs in RC or R1); the choice raised the floor on %d", checked, paired, tight)
}
