package picker

import (
	"math"
	"math/rand/v2"
	"testing"

	"biasbin/solver"
	"biasbin/solver/eseries"
)

// TestSumFloorsHoldWithPairs checks bound F-T (feedback_cells.go) against
// builds solved by solver.SolveSelfHeated (the reference), with their beta
// spread and dissipation (solver.EvalDissipation), on E24 10 Ω–1 MΩ with
// pairs at 1 and 10 mA:
//
//   - rfCell over the build's span of sums and block of RF levels: IC's
//     floor and IE's ceiling hold the build's, the QPoint-and-beta floor
//     and the transistor's utilization floor are at most the build's, and
//     rfCellSettles does not settle at the build's own terms;
//   - sumCell over the build's span, with an IC window holding its IC and
//     the threshold at its terms, is at most them;
//   - the RC scan (sumCellNext), from a level up to 60 below, reaches
//     the build's RC level at a threshold of its own terms, also with a
//     parts weight of 5 (a pair-only RC level's span is then nearly
//     always over, and the scan must stop at the span's singles).
//
// The floors are tight on such a wall (the spans are a few hundredths of
// a percent wide), so the test also counts how many lie within 0.01 of
// the build's terms: a floor raised by that much would be caught.
func TestSumFloorsHoldWithPairs(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E24, 10, 1e6, 0.01, 0.25, 100, 1000), Transistors: benchTransistors(3)}
	heavyParts := DefaultWeights()
	heavyParts.Parts = 5
	for _, tc := range []struct {
		ic float64
		w  Weights
	}{{1e-3, Weights{}}, {10e-3, Weights{}}, {10e-3, heavyParts}, {0.1e-3, Weights{}}} {
		ic := tc.ic
		req := Request{Topology: solver.CollectorFeedback, VCC_V: 12, IC_A: ic, Pairs: true, Weights: tc.w}
		e := newTestEvaluator(t, st, req)
		rng := rand.New(rand.NewPCG(5, uint64(ic*1e6+tc.w.Parts)))
		n := len(e.vs.levels)
		wt := e.s.w
		checked, tight, withHeadroom, hrTight := 0, 0, 0, 0
		// a plan per device: the grid's solves and the cells' floors are
		// the device's whatever the threshold; the spans' are taken
		// afresh for each check (resetSpans)
		plans := make([]*feedbackPlan, len(e.devs))
		for di := range plans {
			plans[di] = &feedbackPlan{e: e}
			plans[di].setGrid()
			plans[di].gridDev = di + 1
		}
		for range 1200 {
			di := rng.IntN(len(e.devs))
			lv := [maxPos]int{rng.IntN(n), rng.IntN(n), rng.IntN(n)}
			if tc.w.Parts > 1 {
				// singles alone: a pair's part would put the build over
				// every span
				sl := e.vs.singleLevels
				lv = [maxPos]int{sl[rng.IntN(len(sl))], sl[rng.IntN(len(sl))], sl[rng.IntN(len(sl))]}
			}
			a, ok := benchedTuple(e, di, lv)
			if !ok {
				continue
			}
			dv := &e.devs[di]
			vceLo, vceHi := e.targetBand(dv)
			c := a.c
			for i := range e.lay.n {
				c.val[i] = e.vs.levels[c.lv[i]].values[0]
			}
			u := solver.EvalDissipation(e.build(c), a.op, e.s.ambMax, e.s.lim).MaxUtilization
			// the headroom term from every worst-case corner
			// (solver.EvalWorstCaseWith), where bound F-T can take it;
			// elsewhere 0, which only makes the checks stricter
			h := 0.0
			if e.nearSaturation(dv, a.op.VCE_V) {
				h = 2 // the worst case cannot be solved (finish)
				if wc, err := solver.EvalWorstCaseWith(e.build(c), e.s.lim, solver.WorstCaseOptions{SkipCorners: true, SkipRSS: true}); err == nil {
					h = e.headroom(dv, wc)
				}
			}
			qb := wt.QPoint*a.q + wt.Beta*math.Abs(a.beta) + wt.Headroom*h
			uT := e.transistorUse(dv, a.op)
			all := qb + wt.Emitter*a.em + wt.Utilization*u + wt.Parts*e.extraParts(c)
			rf, rc, re := lv[fRF], lv[fRC], lv[fRE]
			var cnt counters
			f := plans[di]
			g := f.gridIndex(a.r[fRC] + a.r[fRE])
			cell := f.rfCell(di, g, rf, vceLo, vceHi, &cnt)
			if cell.ok {
				if cell.icLo > a.op.IC_A || cell.ieHi < a.op.IE_A || cell.qb > qb*(1+1e-9) || cell.use > uT*(1+1e-9) {
					t.Fatalf("%v: F-T over its cell: IC floor %g (IC %g), IE ceiling %g (IE %g), QPoint and beta floor %g (%g), transistor use floor %g (%g)",
						a.r, cell.icLo, a.op.IC_A, cell.ieHi, a.op.IE_A, cell.qb, qb, cell.use, uT)
				}
				// tight: the floor within 0.01 of the build's terms,
				// with or without the headroom parts
				if qb-cell.qb < 0.01 || qb-wt.Headroom*h-(cell.qb-cell.hr) < 0.01 {
					tight++
				}
				// the corner the headroom floor stands on: RF low, RC
				// and RE high (solver.Build.CornerStage), the supply
				// low, the hottest ambient, hFE max, VBE(on) and VAF low
				var high [solver.NumSlots]bool
				high[solver.RC], high[solver.RE] = true, true
				op, err := solver.SolveSelfHeated(e.build(c).CornerStage(high, false, true, true), dv.vceLow, e.s.ambMax, dv.thetaJA, dv.tjMax_C)
				if err == nil && op.Region == solver.Active {
					// cornerVCE at the build's own grid cell is that
					// corner's VCE, from above to within cornerSlack,
					// and within 0.1 % (the grid's cells are far
					// narrower)
					if v := f.cornerVCE(di, g, rf, &cnt); !(v >= op.VCE_V-cornerSlack*e.s.vcc && v <= op.VCE_V*1.001) {
						t.Fatalf("%v: cornerVCE %g, the corner's VCE %g", a.r, v, op.VCE_V)
					}
					if hc := wt.Headroom * e.headroomSat(dv, op.VCE_V); cell.hr > hc*(1+1e-9)+1e-12 {
						t.Fatalf("%v: F-T's headroom floor over its cell %g, the term at its corner %g", a.r, cell.hr, hc)
					}
				}
				if cell.hr > 0.05 {
					withHeadroom++
					if wt.Headroom*h-cell.hr < 0.01 {
						hrTight++
					}
				}
			}
			pf := e.partsFloor(rc) + e.partsFloor(re)
			if _, settles := f.rfCellSettles(di, g, rf, rc, re, pf, vceLo, vceHi, all*(1+1e-9)+1e-12, &cnt); settles {
				t.Fatalf("%v: F-T settles at the build's own terms %g", a.r, all)
			}
			for _, k := range []float64{1.1, 1.001} {
				resetSpans(f)
				bd := bounds{icLo: a.op.IC_A / k, icHi: a.op.IC_A * k, finite: true, thr: (qb+wt.Utilization*uT)*(1+1e-9) + 1e-12}
				s := f.sumCell(di, g>>sumCellShift, bd, vceLo, vceHi, &cnt)
				if s.qb > qb*(1+1e-9) || s.qbu > bd.thr {
					t.Fatalf("%v: F-T over its span (IC window ×/÷ %g): QPoint and beta floor %g (%g), with the transistor's use %g (%g)", a.r, k, s.qb, qb, s.qbu, bd.thr)
				}
				// the span's hull of RF levels holds the build's, also
				// the hull for builds with a pair's part at a threshold
				// one part's weight higher
				if h := s.hull[0]; rf < h[0] || rf > h[1] {
					t.Fatalf("%v: RF level %d outside its span's hull %v at the build's own terms", a.r, rf, h)
				}
				resetSpans(f)
				bd.thr += wt.Parts
				if h := f.sumCell(di, g>>sumCellShift, bd, vceLo, vceHi, &cnt).hull[1]; rf < h[0] || rf > h[1] {
					t.Fatalf("%v: RF level %d outside its span's hull with a pair's part %v at the build's own terms and one part", a.r, rf, h)
				}
				if k > 1.01 {
					continue
				}
				// the RC scan from below reaches the build's RC level
				bd.thr = all*(1+1e-9) + 1e-12
				resetSpans(f)
				r := max(0, rc-rng.IntN(60))
				for r < rc {
					if r = f.sumCellNext(di, r, n-1, re, bd, 0, 0, vceLo, vceHi, &cnt); r < rc {
						r++
					}
				}
				if r != rc {
					t.Fatalf("%v: the RC scan passes over RC level %d (to %d) at the build's own terms %g", a.r, rc, r, all)
				}
			}
			checked++
		}
		if checked < 200 || tight < checked/8 && ic >= 1e-3 || hrTight < checked/8 {
			t.Fatalf("IC %g A: %d builds checked, %d cell floors within 0.01 of the build's terms, %d with a headroom floor over 0.05 (%d of them within 0.01 of the build's headroom term): the test does not reach its cases", ic, checked, tight, withHeadroom, hrTight)
		}
		t.Logf("IC %g A: %d builds, %d cell floors within 0.01 of the build's terms, %d with a headroom floor over 0.05 (%d of them within 0.01 of the build's headroom term)", ic, checked, tight, withHeadroom, hrTight)
	}
}

// resetSpans forgets the spans' floors of f (sumCell's), which hold only
// for the window and threshold they were taken at.
func resetSpans(f *feedbackPlan) {
	clear(f.sumCells)
	f.resetLinks()
}

// TestRFBlockDown checks that the levels rfBlockDown hands to one settle of
// rfCellSettles share rf's cell and hold no parts floor under the one it
// gives (the levels of a stock with pairs, every start and window end).
func TestRFBlockDown(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E12, 10, 1e4, 0.05, 0.25, 100, 1000), Transistors: benchTransistors(1)}
	e := newTestEvaluator(t, st, Request{Topology: solver.CollectorFeedback, VCC_V: 12, IC_A: 1e-3, Pairs: true})
	f := &feedbackPlan{e: e}
	n := len(e.vs.levels)
	pairRuns := 0
	for rf := range n {
		for _, lo := range []int{0, rf / 2, max(0, rf-3), rf} {
			from, pfRF := f.rfBlockDown(rf, lo)
			if from < lo || from > rf {
				t.Fatalf("rf %d, lo %d: from %d outside lo..rf", rf, lo, from)
			}
			if from > lo && (from-1)/rfCellLevels == rf/rfCellLevels {
				t.Fatalf("rf %d, lo %d: from %d stops short of the block's first level", rf, lo, from)
			}
			for l := from; l <= rf; l++ {
				if l/rfCellLevels != rf/rfCellLevels {
					t.Fatalf("rf %d, lo %d: level %d is not in rf's block", rf, lo, l)
				}
				if e.partsFloor(l) < pfRF {
					t.Fatalf("rf %d, lo %d: level %d has parts floor %g, under %g", rf, lo, l, e.partsFloor(l), pfRF)
				}
			}
			if pfRF > 0 {
				pairRuns++
			}
		}
	}
	if pairRuns == 0 {
		t.Fatal("no block of pairs alone: the test does not reach its case")
	}
}
