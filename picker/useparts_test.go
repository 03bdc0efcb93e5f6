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
	e := newTestEvaluator(t, st, Request{VCC_V: 12, IC_A: 10e-3, Pairs: true})
	w := e.s.w
	rng := rand.New(rand.NewPCG(7, 1))
	n := len(e.vs.levels)
	checked, paired, tight := 0, 0, 0
	for range 20000 {
		lv := [maxPos]int{rng.IntN(n), rng.IntN(n), rng.IntN(n), rng.IntN(n)}
		tp, c, d, ok := activeBuild(e, rng, lv)
		if !ok {
			continue
		}
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

// TestREUseWindowHolds checks bound QU-RE (reUseWindow) and its pieces
// (qPointUseWindow, qPointUseFloor with RE's coefficient) against the
// score's own terms of random divider and split-supply builds on a wall
// with pairs at 1 and 10 mA: RE carries IE ≥ IC, so w_QPoint·q +
// w_Utilization·U + w_Parts·(RE's extra part) is at least the floor, and
// the build's IC lies in the window of any room it fits in. source: the
// terms' definitions (doc.go): q ≥ |IC − IC_t|/IC_t, U is at least RE's
// dissipation IE²·RE over its own allowance (solver.EvalDissipation), a
// pair's allowance is at most the best pair's at its level and a
// single's the best single's.
func TestREUseWindowHolds(t *testing.T) {
	var lines []Resistor
	for i, v := range []float64{100, 220, 470, 1e3, 2.2e3, 4.7e3, 10e3, 47e3} {
		rated := []float64{0.125, 0.25, 0.6}[i%3]
		lines = append(lines, Resistor{ID: int64(100 + i), Ohm: v, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: rated, Qty: 10, Bin: "B"})
	}
	// an eighth-watt 1.1 kΩ beside the quarter-watt 2.2 kΩ‖2.2 kΩ: one
	// level holding a single that runs hot and a pair that does not
	lines = append(lines, Resistor{ID: 200, Ohm: 1.1e3, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: 0.125, Qty: 10, Bin: "B"})
	st := Stock{Resistors: lines, Transistors: []Transistor{smallNPN(1, 100, 300)}}
	checked, onlyPair, narrower := 0, 0, 0
	// near draws half the builds of a case from these ohms per position
	// (RB, RC, RE): split-supply builds near the target at 10 mA, whose
	// RE runs hot as a single
	type near [3][2]float64
	for _, cs := range []struct {
		req  Request
		near near
	}{
		{Request{VCC_V: 12, IC_A: 10e-3, Pairs: true}, near{}},
		{Request{VCC_V: 12, IC_A: 1e-3, Pairs: true}, near{}},
		{Request{Topology: solver.SplitSupply, VCC_V: 12, VEE_V: -12, IC_A: 10e-3, Pairs: true}, near{{50, 500}, {50, 250}, {1000, 1250}}},
		{Request{Topology: solver.SplitSupply, VCC_V: 9, VEE_V: -9, IC_A: 1e-3, Pairs: true}, near{}},
	} {
		req := cs.req
		e := newTestEvaluator(t, st, req)
		w, it := e.s.w, e.s.icT
		rng := rand.New(rand.NewPCG(11, uint64(req.IC_A*1e6)))
		n := len(e.vs.levels)
		for range 20000 {
			lv := [maxPos]int{rng.IntN(n), rng.IntN(n), rng.IntN(n), rng.IntN(n)}
			if cs.near[0][1] > 0 && rng.IntN(2) == 0 {
				for i, r := range cs.near {
					a, b := e.vs.levelAtOrAbove(r[0]), e.vs.levelAtOrAbove(r[1])
					lv[i] = a + rng.IntN(b-a)
				}
			}
			tp, c, d, ok := activeBuild(e, rng, lv)
			if !ok {
				continue
			}
			re, ic := lv[e.lay.re], tp.op.IC_A
			l := &e.vs.levels[re]
			pair := e.vs.values[c.val[e.lay.re]].lines[1] >= 0
			extra, allow := 0.0, l.allowHotOne_W
			if pair {
				extra, allow = 1, l.allowHotPair_W
			}
			uRE := d.Resistor[solver.RE].Utilization
			// the part's coefficient at the build's own choice
			k := l.ohm / allow
			if k*ic*ic > uRE*(1+1e-9) {
				t.Fatalf("%v: RE's coefficient %.6g gives %.6g over its utilization %.6g", req.Topology, k, k*ic*ic, uRE)
			}
			qIC := w.QPoint * math.Abs(ic-it) / it
			pair2 := qIC + w.Utilization*k*ic*ic
			if lo, hi := e.qPointUseWindow(k, pair2*(1+1e-9)); ic < lo*(1-1e-9) || ic > hi*(1+1e-9) {
				t.Errorf("%v: IC %.6g outside qPointUseWindow [%.6g, %.6g] of its own terms %.6g", req.Topology, ic, lo, hi, pair2)
			}
			exact := w.QPoint*tp.q + w.Utilization*d.MaxUtilization + w.Parts*extra
			for _, grow := range []float64{1, 1.01, 1.5} {
				room := exact * grow * (1 + 1e-9)
				ru := e.reUseWindow(re, room)
				switch {
				case ic < ru.icLo*(1-1e-9) || ic > ru.icHi*(1+1e-9):
					t.Errorf("%v: IC %.6g outside bound QU-RE's window [%.6g, %.6g] (room %.6g, RE %g Ω, pair %v)", req.Topology, ic, ru.icLo, ru.icHi, room, l.ohm, pair)
				case ru.floor > exact*(1+1e-9):
					t.Errorf("%v: bound QU-RE's floor %.6g over the terms %.6g (RE %g Ω, pair %v)", req.Topology, ru.floor, exact, l.ohm, pair)
				case ru.parts > w.Parts*extra:
					t.Errorf("%v: bound QU-RE's parts %.6g over RE's %.6g (RE %g Ω)", req.Topology, ru.parts, w.Parts*extra, l.ohm)
				case ru.coef*ic*ic > uRE*(1+1e-9):
					t.Errorf("%v: bound QU-RE's coefficient gives %.6g over RE's utilization %.6g (RE %g Ω, pair %v)", req.Topology, ru.coef*ic*ic, uRE, l.ohm, pair)
				}
				// and the window split supply narrows with it: the
				// build's IC in it, its VCE part within its delta
				within := e.boundsWithin(room, room/w.QPoint)
				vcePart := math.Abs(tp.op.VCE_V-tp.vceT) / e.span
				if _, ok := e.reWindow(&within, re); !ok || ic < within.icLo*(1-1e-9) || ic > within.icHi*(1+1e-9) || vcePart > within.delta*(1+1e-9) {
					t.Errorf("%v: IC %.6g, VCE part %.6g outside reWindow's [%.6g, %.6g], %.6g (ok %v, room %.6g)", req.Topology, ic, vcePart, within.icLo, within.icHi, within.delta, ok, room)
				}
				if ru.parts > 0 && !l.pairOnly {
					onlyPair++ // a single stocked there, yet only a pair fits
				}
				if grow == 1 {
					if within := e.boundsWithin(room, room/w.QPoint); ru.icHi-ru.icLo < 0.5*(within.icHi-within.icLo) {
						narrower++
					}
				}
			}
			checked++
		}
	}
	if checked < 4000 || onlyPair == 0 || narrower < checked/10 {
		t.Fatalf("fixture too weak: %d builds checked, only a pair fits at %d, the window under half the QPoint term's at %d", checked, onlyPair, narrower)
	}
	t.Logf("%d builds checked; only a pair fits in RE at %d; the window under half the QPoint term's at %d", checked, onlyPair, narrower)
}

// TestQPointUseWindowIsTheSublevelSet checks qPointUseWindow against a
// dense scan of the sum it bounds, w_QPoint·|IC − IC_t|/IC_t +
// w_Utilization·coef·IC², for parts from cool to several times over their
// allowance at the target (where the sum is least under IC_t) and rooms
// from none to wide: every scanned IC whose sum fits lies in the window,
// and the window ends where the sum reaches the room (or at 0 A). source:
// the window's definition (doc.go, bound QU-RE): the sum is convex in IC,
// so the IC where it is at most the room are an interval.
func TestQPointUseWindowIsTheSublevelSet(t *testing.T) {
	e := newTestEvaluator(t, Stock{Transistors: []Transistor{smallNPN(1, 100, 300)}}, Request{VCC_V: 12, IC_A: 10e-3})
	w, it := e.s.w, e.s.icT
	f := func(coef, ic float64) float64 {
		return w.QPoint*math.Abs(ic-it)/it + w.Utilization*coef*ic*ic
	}
	underTarget := 0
	for _, uAtTarget := range []float64{0, 0.05, 0.9, 3, 3.99, 4.01, 4.2, 8, 20, 100} {
		coef := uAtTarget / (it * it)
		// and a room just over the sum's least
		least := math.Inf(1)
		for k := 0; k <= 200000; k++ {
			least = min(least, f(coef, 3*it*float64(k)/200000))
		}
		for _, room := range []float64{0, 0.01, 0.2, 1, 2.2, 5, 30, least * 1.001} {
			lo, hi := e.qPointUseWindow(coef, room)
			fits := 0
			for k := 0; k <= 200000; k++ {
				ic := 3 * it * float64(k) / 200000
				if f(coef, ic) > room {
					continue
				}
				fits++
				if ic < lo*(1-1e-9) || ic > hi*(1+1e-9) {
					t.Errorf("U(IC_t) %g, room %g: IC %.6g fits (sum %.6g) outside [%.6g, %.6g]", uAtTarget, room, ic, f(coef, ic), lo, hi)
					break
				}
			}
			if fits == 0 {
				if lo <= hi && f(coef, (lo+hi)/2) > room*(1+1e-9) {
					t.Errorf("U(IC_t) %g, room %g: nothing fits, yet the window is [%.6g, %.6g]", uAtTarget, room, lo, hi)
				}
				continue
			}
			// the ends are where the sum reaches the room (tight)
			for _, end := range []float64{lo, hi} {
				if end > 0 && math.Abs(f(coef, end)-room) > 1e-9*max(room, 1) {
					t.Errorf("U(IC_t) %g, room %g: the window [%.6g, %.6g] ends where the sum is %.6g", uAtTarget, room, lo, hi, f(coef, end))
				}
			}
			if hi < it {
				underTarget++
			}
		}
	}
	if underTarget == 0 {
		t.Fatal("fixture too weak: no window lies under IC_t")
	}
}

// activeBuild solves the level tuple lv of the first device and, when
// its nominal point is active, draws one value per level and returns the
// build's dissipation (solver.EvalDissipation, the score's own).
func activeBuild(e *evaluator, rng *rand.Rand, lv [maxPos]int) (*tuple, combo, solver.Dissipation, bool) {
	tp := e.newTuple(0, lv)
	if !tp.ok || tp.op.Region != solver.Active {
		return nil, combo{}, solver.Dissipation{}, false
	}
	c := combo{lv: lv}
	for i := range e.lay.n {
		vs := e.vs.levels[lv[i]].values
		c.val[i] = vs[rng.IntN(len(vs))]
	}
	return tp, c, solver.EvalDissipation(e.build(c), tp.op, e.s.ambMax, e.s.lim), true
}
