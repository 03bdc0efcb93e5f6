package picker

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"biasbin/solver"
	"biasbin/solver/eseries"
)

// TestBoundsHoldOnRandomBuilds checks every closed-form bound the search
// uses against the exact self-heated solution of random builds (the
// reference is solver.SolveSelfHeated itself, the function whose results
// the bounds must stay below or above): VBE within vbeBounds, R_TH above
// rthFloor, the divider's utilization above dividerPowerBound, IC/IB above
// nominalBetaMin and the beta term above betaFloor, for builds whose
// nominal, hFE-min and hFE-max points are active with VCE above VCE(sat) +
// margin (the premise of the bounds: the builds the search bounds). The stock mixes small-signal
// parts with ones that heat noticeably (θJA 500 and 1000 K/W), one that
// does not heat at all, low Early voltages and a PNP line, where the
// bound's thermal and Early terms matter.
func TestBoundsHoldOnRandomBuilds(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E24, 10, 1e6, 0.01, 0.25, 100, 1000), Transistors: benchTransistors(6)}
	st.Transistors[2].Sheet.VAF_V = 0  // one without Early effect
	st.Transistors[2].Sheet.PD25_W = 0 // and without self-heating
	st.Transistors[3].Sheet.VAF_V = 25
	st.Transistors[4].Sheet.ThetaJA_KPerW = 500
	st.Transistors[5].Sheet.ThetaJA_KPerW = 1000
	st.Transistors[5].Sheet.VAF_V = 40
	st.Transistors[5].Sheet.VCESat_V = 0.05 // the least VCE floor
	// A PNP line with self-heating, for the negative rail.
	pnp := smallPNP(40, 80, 320)
	pnp.Sheet.ThetaJA_KPerW = 400
	st.Transistors = append(st.Transistors, pnp)
	checked, positive, positiveRange := 0, 0, 0
	sumRatio := 0.0
	for _, vcc := range []float64{5, 12, 30, -15} {
		e := newTestEvaluator(t, st, Request{VCC_V: vcc, IC_A: 1e-3})
		rng := rand.New(rand.NewPCG(uint64(math.Abs(vcc)), 1))
		n := len(e.vs.levels)
		for range 6000 {
			di := rng.IntN(len(e.devs))
			lv := [nPos]int{rng.IntN(n), rng.IntN(n), rng.IntN(n), rng.IntN(n)}
			a := e.newTuple(di, lv)
			if !a.ok || a.op.Region != solver.Active || a.op.VCE_V < 0.7 {
				continue
			}
			dv := &e.devs[di]
			floor := dv.vceSat + e.s.lim.VCEMargin_V
			hi, err := e.solveAt(dv, dv.hi, a.r)
			if err != nil || hi.Region != solver.Active || hi.VCE_V < floor {
				continue
			}
			lo, err := e.solveAt(dv, dv.lo, a.r)
			if err != nil || lo.Region != solver.Active || lo.VCE_V < floor {
				continue
			}
			for _, p := range []solver.OperatingPoint{lo, a.op, hi} {
				if beta := p.IC_A / p.IB_A; beta < dv.betaNomMin {
					t.Errorf("IC/IB %.6g below the nominal floor %.6g (vcc %g, %s, %v)", beta, dv.betaNomMin, vcc, dv.line.Sheet.Label, a.r)
				}
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
			checkTransistorUse(t, e, dv, a)
			checkPointTemperatures(t, e, dv, a, lo, hi)
			rth := r[iR1] * r[iR2] / (r[iR1] + r[iR2])
			if f := e.rthFloor(r[iR2], op.V_V[solver.R2], op.IB_A); f > rth*(1+1e-12) {
				t.Errorf("R_TH floor %.6g above R_TH %.6g (%v)", f, rth, r)
			}
			u := math.Max(op.P_W[solver.R1]/e.vs.levels[lv[iR1]].allowHot_W, op.P_W[solver.R2]/e.vs.levels[lv[iR2]].allowHot_W)
			if f := e.dividerPowerBound(lv[iR2], op.V_V[solver.R2], op.V_V[solver.R2]); f > u*(1+1e-9) {
				t.Errorf("divider bound %.6g above the divider's utilization %.6g (%v)", f, u, r)
			}
			// the weak bound at any level at or above R2's too (the search
			// takes it at the last level of a run of pair-only levels)
			// (and the search's first R2 takes the powers at any level up
			// to R2's, each against its own part)
			for j := lv[iR2]; j < min(lv[iR2]+4, len(e.vs.levels)); j++ {
				if f := e.dividerPowerBoundWeak(j, op.V_V[solver.R2], op.V_V[solver.R2]); f > u*(1+1e-9) {
					t.Errorf("weak divider bound %.6g at level %d (R2 at %d) above the divider's utilization %.6g (%v)", f, j, lv[iR2], u, r)
				}
				pR2, pR1 := e.dividerPowers(j, op.V_V[solver.R2], op.V_V[solver.R2])
				if pR2 > op.P_W[solver.R2]*(1+1e-9) || pR1 > op.P_W[solver.R1]*(1+1e-9) {
					t.Errorf("divider power floors R2 %.6g, R1 %.6g W at level %d (R2 at %d) above R2's %.6g, R1's %.6g W (%v)", pR2, pR1, j, lv[iR2], op.P_W[solver.R2], op.P_W[solver.R1], r)
				}
			}
			// The floor for a window around IC and an R_TH below the build's
			// must hold too, and for a range of RE around the build's: the
			// search uses it that way.
			// The build's RE sits at either end of the range, where a
			// step that took RE at the wrong end would show.
			for _, k := range []float64{1, 0.5} {
				for _, reRange := range [][2]float64{{1, 1}, {0.5, 1}, {1, 2}} {
					f := e.betaFloor(dv, betaWindow{RTH: rth * k, RTHMax: r[iR2], RE: r[iRE] * reRange[0], REMax: r[iRE] * reRange[1], RCMin: r[iRC] * k, RCMax: r[iRC] / k, ICLo: ic * (1 - (1-k)/4), ICHi: ic * (1 + (1-k)/4)})
					if f > math.Abs(a.beta) {
						t.Errorf("beta floor %.6g above the beta term %.6g (vcc %g, %s, %v, VCE %.3g, window %g, RE ×%v)", f, math.Abs(a.beta), vcc, dv.line.Sheet.Label, r, op.VCE_V, k, reRange)
					}
					// Over a range of RE the floor is at most the floor at
					// each RE in it (each step takes the worse end), up
					// to the half kelvin the model's junction bound may
					// settle apart.
					if reRange[0] != reRange[1] {
						single := math.Inf(1)
						for _, x := range []float64{reRange[0], math.Sqrt(reRange[0] * reRange[1]), reRange[1]} {
							single = min(single, e.betaFloor(dv, betaWindow{RTH: rth * k, RTHMax: r[iR2], RE: r[iRE] * x, RCMin: r[iRC] * k, RCMax: r[iRC] / k, ICLo: ic * (1 - (1-k)/4), ICHi: ic * (1 + (1-k)/4)}))
						}
						if f > single*(1+1e-3)+1e-12 {
							t.Errorf("beta floor %.6g over RE ×%v above the least floor %.6g at single values in it (vcc %g, %s, %v)", f, reRange, single, vcc, dv.line.Sheet.Label, r)
						}
					}
					if k == 1 && reRange[1] == 1 && f > 0 {
						if reRange[0] == 1 {
							positive++
							sumRatio += f / math.Abs(a.beta)
						} else {
							positiveRange++
						}
					}
				}
			}
		}
	}
	if checked < 1000 {
		t.Fatalf("only %d builds checked", checked)
	}
	// A floor that is always 0 would hold and prune nothing.
	if positive < checked/2 {
		t.Errorf("beta floor positive on only %d of %d builds", positive, checked)
	}
	if positiveRange < checked/4 {
		t.Errorf("beta floor over a range of RE positive on only %d of %d builds", positiveRange, checked)
	}
	t.Logf("%d builds checked; beta floor positive on %d, on average %.2f of the exact term; with RE from half the build's positive on %d", checked, positive, sumRatio/float64(max(positive, 1)), positiveRange)
}

// TestOtherTopologyBoundsHold checks the bounds of the collector-feedback
// and split-supply plans against the exact self-heated solution of random
// builds (solver.SolveSelfHeated is the reference): the beta-term floor
// through baseLoop at the exact point, F-B over a window around it, the
// QPoint floor F-Q, and nominalBetaMin, for builds whose three bench
// points are active with the VCE margin (the premise of the bounds). The
// stock is that of TestBoundsHoldOnRandomBuilds with a PNP line.
func TestOtherTopologyBoundsHold(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E24, 10, 1e6, 0.01, 0.25, 100, 1000), Transistors: benchTransistors(6)}
	st.Transistors[3].Sheet.VAF_V = 25
	st.Transistors[4].Sheet.ThetaJA_KPerW = 500
	st.Transistors[5].Sheet.ThetaJA_KPerW = 1000
	pnp := smallPNP(40, 80, 320)
	pnp.Sheet.ThetaJA_KPerW = 400
	st.Transistors = append(st.Transistors, pnp)
	checked := map[solver.Topology]int{}
	rsChecked, rsPositive := 0, 0
	windowChecked, windowPositive := 0, 0
	rbNear := 0                // split-supply builds with RB within 25 % of the RB-IB floor
	qbChecked, qbJoint := 0, 0 // F-QB checks, and those where it beat F-Q and F-B apart
	qbNarrow := 0              // F-QB windows narrower than the IC window
	for _, req := range []Request{
		{Topology: solver.CollectorFeedback, VCC_V: 12, IC_A: 1e-3},
		{Topology: solver.CollectorFeedback, VCC_V: -9, IC_A: 1e-3},
		{Topology: solver.SplitSupply, VCC_V: 12, VEE_V: -12, IC_A: 1e-3},
		{Topology: solver.SplitSupply, VCC_V: -15, VEE_V: 5, IC_A: 1e-3},
	} {
		e := newTestEvaluator(t, st, req)
		rng := rand.New(rand.NewPCG(uint64(math.Abs(req.VCC_V)), 2))
		n := len(e.vs.levels)
		for range 6000 {
			di := rng.IntN(len(e.devs))
			lv := [maxPos]int{rng.IntN(n), rng.IntN(n), rng.IntN(n)}
			a, ok := benchedTuple(e, di, lv)
			if !ok {
				continue
			}
			checked[req.Topology]++
			dv := &e.devs[di]
			if b := a.op.IC_A / a.op.IB_A; b < dv.betaNomMin*(1-1e-9) || b < dv.betaTypMin*(1-1e-9) {
				t.Errorf("%v %v: IC/IB %g under nominalBetaMin %g or its typical-model floor %g", req.Topology, a.r, b, dv.betaNomMin, dv.betaTypMin)
			}
			if f := e.betaFloorAt(a); f > math.Abs(a.beta)*(1+1e-9)+1e-12 {
				t.Errorf("%v %v: beta floor %g over the beta term %g", req.Topology, a.r, f, math.Abs(a.beta))
			}
			checkTransistorUse(t, e, dv, a)
			if lo, err := e.solveAt(dv, dv.lo, a.r); err == nil {
				if hi, err := e.solveAt(dv, dv.hi, a.r); err == nil {
					checkPointTemperatures(t, e, dv, a, lo, hi)
				}
			}
			kE := 1 + 1/dv.betaNomMin
			if req.Topology == solver.SplitSupply {
				// RB-IB: RB at least the floor at the build's own IC, at
				// its nominal point and at hFE min (the closest to it)
				lo, err := e.solveAt(dv, dv.lo, a.r)
				for _, op := range []solver.OperatingPoint{a.op, lo} {
					if f := e.splitRBFloor(dv, op.IC_A, a.r[sRE], kE); err == nil && a.r[sRB] < f*(1-1e-9) {
						t.Errorf("%v: RB under the RB-IB floor %g at IC %g", a.r, f, op.IC_A)
					} else if err == nil && a.r[sRB] < 1.25*f {
						rbNear++
					}
				}
				// B-RB: RB at or over the floor's level, the beta term
				// over bound B from there up, for windows around the
				// build's IC and RC
				for _, k := range []float64{1, 1.1} {
					from, f := e.splitRBBeta(dv, a.r[sRE], kE, a.r[sRC]/k, a.r[sRC]*k, a.op.IC_A/k, a.op.IC_A*k)
					if lv[sRB] < from || f > math.Abs(a.beta)*(1+1e-9)+1e-12 {
						t.Errorf("%v: RB level %d under B-RB's %d, or its floor %g over the beta term %g", a.r, lv[sRB], from, f, math.Abs(a.beta))
					}
				}
			}
			if req.Topology != solver.CollectorFeedback {
				continue
			}
			vceLo, vceHi := e.targetBand(dv)
			r := a.r[fRC] + a.r[fRE]
			if f := e.feedbackQFloorBlock(r, r, 0, kE, vceLo, vceHi); f > a.q*(1+1e-9) {
				t.Errorf("%v: QPoint floor %g over the term %g", a.r, f, a.q)
			}
			// F-QW: the IC window of the builds whose QPoint term is at
			// most this one's holds this build's IC
			it := e.s.icT
			if lo, hi, ok := e.feedbackICWindow(r, 0, kE, vceLo, vceHi, a.q, it*math.Max(0, 1-a.q), it*(1+a.q)); !ok || a.op.IC_A < lo || a.op.IC_A > hi {
				t.Errorf("%v: IC %g outside the F-QW window [%g, %g] (ok %v) at QPoint term %g", a.r, a.op.IC_A, lo, hi, ok, a.q)
			}
			ic := a.op.IC_A
			bd := bounds{icLo: ic * 0.9, icHi: ic * 1.1, finite: true}
			f := &feedbackPlan{e: e}
			// F-G: the RF window bracketed on the grid of sums holds the
			// build's RF level, for windows that just hold its IC
			f.setGrid()
			var cnt2 counters
			for _, w := range [][2]float64{{ic, ic}, {ic * 0.999, ic * 1.001}, {ic * 0.9, ic * 1.1}} {
				if lo, hi := f.rfWindow(di, f.gridIndex(r), w[0], w[1], rng.IntN(n), rng.IntN(n), [2]int{0, n - 1}, false, &cnt2); lv[fRF] < lo || lv[fRF] > hi {
					t.Errorf("%v: RF level %d outside the F-G window [%d, %d] for IC %g in [%g, %g]", a.r, lv[fRF], lo, hi, ic, w[0], w[1])
				}
			}
			// F-QB: F-Q and F-B together over parts of the IC window, at
			// the grid cell, from a current floor at or under IC, and over
			// a block of sums around r
			wt := e.s.w
			both := wt.QPoint*a.q + wt.Beta*math.Abs(a.beta)
			// F-QBU: with the utilization term of RC and RE (each
			// carries IE ≥ IC) joined per part, from several floors
			// already taken
			cu := a.c
			for i := range e.lay.n {
				cu.val[i] = e.vs.levels[cu.lv[i]].values[0]
			}
			uExact := solver.EvalDissipation(e.build(cu), a.op, e.s.ambMax, e.s.lim).MaxUtilization
			coef := max(e.vs.levels[lv[fRC]].ohm/e.vs.levels[lv[fRC]].allowHot_W, e.vs.levels[lv[fRE]].ohm/e.vs.levels[lv[fRE]].allowHot_W)
			for _, xLo := range []float64{0, ic * 0.97, ic} {
				qf := f.betaQFloorRC(dv, bd, f.gridIndex(r), xLo, kE, vceLo, vceHi).parts
				for _, use := range []float64{0, uExact / 2, uExact} {
					three := both + wt.Utilization*max(0, uExact-use)
					qfu := qf.withUse(coef, use, wt.Utilization)
					if fl := qfu.least(); fl > three*(1+1e-9)+1e-12 {
						t.Errorf("%v: F-QBU floor %g (use %g) over the terms %g", a.r, fl, use, three)
					}
					if lo, hi, ok := qfu.window(three * (1 + 1e-9)); !ok || ic < lo*(1-1e-12) || ic > hi*(1+1e-12) {
						t.Errorf("%v: IC %g outside F-QBU's window [%g, %g] (ok %v, use %g)", a.r, ic, lo, hi, ok, use)
					}
				}
				if fl := qf.least(); fl > both*(1+1e-9)+1e-12 {
					t.Errorf("%v: F-QB floor %g (currents from %g) over the terms %g", a.r, fl, xLo, both)
				}
				// the window of the parts that can hold a build whose two
				// terms are this one's holds its IC
				if lo, hi, ok := qf.window(both * (1 + 1e-9)); !ok || ic < lo*(1-1e-12) || ic > hi*(1+1e-12) {
					t.Errorf("%v: IC %g outside F-QB's window [%g, %g] (ok %v, currents from %g)", a.r, ic, lo, hi, ok, xLo)
				} else if hi-lo < 0.999*(bd.icHi-max(bd.icLo, xLo)) {
					qbNarrow++
				}
			}
			// F-QBU over a block of RC levels, cell by cell of the grid of
			// sums (cellsSettle, kept least per group of cells included):
			// a block that holds this build's RC level does not settle
			// at a threshold of the terms it bounds
			for _, span := range []int{0, 2, 60} {
				rc0, last := max(0, lv[fRC]-span), min(n-1, lv[fRC]+span)
				at := bd
				at.thr = (both+wt.Utilization*uExact)*(1+1e-9) + 1e-12
				if f.cellsSettle(di, at, rc0, last, lv[fRE], 0, 0, kE, vceLo, vceHi, &cnt2) {
					t.Errorf("%v: F-QBU over RC levels %d..%d settles at the build's own terms %g", a.r, rc0, last, at.thr)
				}
			}
			// over the kept blocks of sums of a band around r, scanned in
			// full, and from the block the scan starts at
			for _, rAt := range []float64{r, r * 2, r / 2} {
				if fl := f.sumsQBLeast(dv, bd, r/1.1, r*1.1, rAt, math.Inf(-1), kE, vceLo, vceHi); fl > both*(1+1e-9)+1e-12 {
					t.Errorf("%v: F-QB over blocks of sums %g over the terms %g", a.r, fl, both)
				}
			}
			// a least kept for a window that misses the build's IC is
			// not taken for one that holds it (over the whole group of
			// blocks that holds r, which keeps one)
			g := (int(math.Floor(math.Log(r)/qbBlockStep)) - f.blockBase) / qbGroup
			gLo := math.Exp(float64(g*qbGroup+f.blockBase)*qbBlockStep) * (1 + 1e-9)
			gHi := math.Exp(float64((g+1)*qbGroup+f.blockBase)*qbBlockStep) * (1 - 1e-9)
			far := 3 * math.Max(ic, e.s.icT) // a window whose QPoint term is well over this build's
			f2 := &feedbackPlan{e: e}        // memos with nothing kept yet
			f2.setGrid()
			f2.sumsQBLeast(dv, bounds{icLo: far, icHi: far * 1.05, finite: true}, gLo, gHi, r, math.Inf(-1), kE, vceLo, vceHi)
			if fl := f2.sumsQBLeast(dv, bd, gLo, gHi, r, math.Inf(-1), kE, vceLo, vceHi); fl > both*(1+1e-9)+1e-12 {
				t.Errorf("%v: F-QB over blocks of sums %g, after a window that misses IC, over the terms %g", a.r, fl, both)
			}
			if fl := f.betaQFloorSums(dv, bd, r*0.99, r*1.01, 0, kE, vceLo, vceHi).least(); fl > both*(1+1e-9)+1e-12 {
				t.Errorf("%v: F-QB floor %g over sums ±1 %% over the terms %g", a.r, fl, both)
			} else if fl > wt.QPoint*e.feedbackQFloorBlock(r*0.99, r*1.01, 0, kE, vceLo, vceHi)+wt.Beta*f.betaFloorSums(dv, bd, r*0.99, r*1.01)+1e-9 {
				qbJoint++ // the parts raised the floor over the two apart
			}
			// and at most the two floors at the build's own IC and sum
			// (every part covers the currents it is taken over)
			at := bounds{icLo: ic, icHi: ic, finite: true}
			if fl, own := f.betaQFloorSums(dv, bd, r, r, 0, kE, vceLo, vceHi).least(), wt.QPoint*e.feedbackQAt(ic, r, r, 0, kE, vceLo, vceHi)+wt.Beta*f.betaFloorSums(dv, at, r, r); fl > own*(1+1e-3)+1e-12 {
				t.Errorf("%v: F-QB floor %g over the floors %g at the build's IC %g", a.r, fl, own, ic)
			}
			qbChecked++
			if fl := f.betaFloorRC(dv, bd, f.gridIndex(r)); fl > math.Abs(a.beta)*(1+1e-9)+1e-12 {
				t.Errorf("%v: F-B floor %g over the beta term %g", a.r, fl, math.Abs(a.beta))
			} else if at := f.betaFloorSums(dv, bd, r, r); fl > at*(1+1e-3)+1e-12 {
				// kept per grid cell of sums: the cell's floor covers
				// this sum, so it is at most the floor at the sum alone
				t.Errorf("%v: F-B floor %g of the grid cell over the floor %g at the sum %g", a.r, fl, at, r)
			}
			// bound B over an RF window that holds the build's level, by
			// grid cell of sums: at most the term, and at most the floor
			// at the sum alone
			for _, w := range [][2]int{{lv[fRF], lv[fRF]}, {lv[fRF] - 2, lv[fRF] + 1}, {lv[fRF] - 1, lv[fRF] + 5}} {
				lo, hi := max(w[0], 0), min(w[1], n-1)
				fl := f.betaFloorWindow(dv, bd, f.gridIndex(r), lo, hi)
				if fl > math.Abs(a.beta)*(1+1e-9)+1e-12 {
					t.Errorf("%v: B floor %g over RF levels %d..%d over the beta term %g", a.r, fl, lo, hi, math.Abs(a.beta))
				}
				at := e.betaFloor(dv, betaWindow{RTH: e.vs.levels[lo].ohm, RTHMax: e.vs.levels[hi].ohm, RE: r, ICLo: bd.icLo, ICHi: bd.icHi})
				if fl > at*(1+1e-3)+1e-12 {
					t.Errorf("%v: B floor %g over RF levels %d..%d of the grid cell over the floor %g at the sum %g", a.r, fl, lo, hi, at, r)
				}
				if fl > 0 {
					windowPositive++
				}
				windowChecked++
			}
			// F-RS: the headroom floor of the builds below an RF level
			// holds for this build, one level below (and at the level
			// itself, the nearest the bound comes)
			c := a.c // the build of the levels' first values (singles here)
			for i := range e.lay.n {
				c.val[i] = e.vs.levels[c.lv[i]].values[0]
			}
			if wc, err := solver.EvalWorstCase(e.build(c), e.s.lim); err == nil {
				h := e.headroom(dv, wc)
				for _, top := range []int{lv[fRF] + 1, min(lv[fRF]+4, n-1)} {
					if top <= lv[fRF] {
						continue
					}
					if fl := f.headroomBelow(di, top, lv[fRC], lv[fRC], lv[fRE], &cnt2); fl > h*(1+1e-9)+1e-12 {
						t.Errorf("%v: F-RS headroom floor %g (RF below level %d) over the headroom term %g", a.r, fl, top, h)
					}
					if top == lv[fRF]+1 && h > 0 {
						rsChecked++
						if f.headroomBelow(di, top, lv[fRC], lv[fRC], lv[fRE], &cnt2) > 0 {
							rsPositive++
						}
					}
				}
			}
			// F-B over a block of sums with this build's at either end,
			// and at most F-B at either end alone (the block's floor
			// covers both; up to the half kelvin betaFloor's junction
			// bound may settle apart)
			for _, rr := range [][2]float64{{r * 0.7, r}, {r, r * 1.4}} {
				fl := f.betaFloorSums(dv, bd, rr[0], rr[1])
				if fl > math.Abs(a.beta)*(1+1e-9)+1e-12 {
					t.Errorf("%v: F-B floor %g over sums %g..%g above the beta term %g", a.r, fl, rr[0], rr[1], math.Abs(a.beta))
				}
				if ends := min(f.betaFloorSums(dv, bd, rr[0], rr[0]), f.betaFloorSums(dv, bd, rr[1], rr[1])); fl > ends*(1+1e-3)+1e-12 {
					t.Errorf("%v: F-B floor %g over sums %g..%g above the least at its ends %g", a.r, fl, rr[0], rr[1], ends)
				}
			}
		}
	}
	for _, topo := range []solver.Topology{solver.CollectorFeedback, solver.SplitSupply} {
		if checked[topo] < 200 {
			t.Errorf("%v: only %d builds checked", topo, checked[topo])
		}
	}
	if windowPositive < windowChecked/4 {
		t.Errorf("B floor over RF windows positive on only %d of %d", windowPositive, windowChecked)
	}
	if qbChecked == 0 || qbJoint == 0 || qbNarrow == 0 {
		t.Errorf("fixture too weak: F-QB checked on %d builds, above F-Q and F-B apart on %d, its window narrower on %d", qbChecked, qbJoint, qbNarrow)
	}
	t.Logf("F-QB checked on %d builds, above F-Q and F-B apart on %d, its window narrower than the IC window on %d", qbChecked, qbJoint, qbNarrow)
	if rbNear == 0 {
		t.Errorf("no split-supply build has RB within 25 %% of the RB-IB floor: the check does not reach it")
	}
	t.Logf("F-RS headroom floor positive on %d of %d builds with a headroom term; B over RF windows positive on %d of %d; %d split-supply builds within 25 %% of the RB-IB floor", rsPositive, rsChecked, windowPositive, windowChecked, rbNear)
}

// TestFeedbackHeadroomBelowHolds checks bound F-RS's headroom floor
// (headroomBelow), and headroomFloor, against the exact worst case
// (solver.EvalWorstCase, the search's own reference) of collector-feedback builds that come near
// saturation at some corner: a small target current with RF near the
// largest level and RC + RE taking most of the supply, on an E96 wall at
// 1 % and one at 5 % with TCRs of 100 and 250 ppm/K, so the corners' TCR
// and tolerance ends matter. For the build at RF level j the floor of
// the builds below level j + 1 (and j + 3, and below the top: every
// level) must be at most its headroom term, and positive on most builds
// whose term is.
func TestFeedbackHeadroomBelowHolds(t *testing.T) {
	walls := [][]Resistor{seriesStock(eseries.E96, 10, 1e6, 0.01, 0.25, 100, 1000), seriesStock(eseries.E24, 10, 1e6, 0.05, 0.25, 100, 1000)}
	for i := range walls[1] {
		walls[1][i].TCR_PPMPerK = 250
	}
	checked, positive, blocks, blocksPositive := 0, 0, 0, 0
	for wi, wall := range walls {
		st := Stock{Resistors: wall, Transistors: benchTransistors(6)}
		st.Transistors[4].Sheet.ThetaJA_KPerW = 500
		e := newTestEvaluator(t, st, Request{Topology: solver.CollectorFeedback, VCC_V: 12, IC_A: 0.1e-3})
		f := &feedbackPlan{e: e}
		n := len(e.vs.levels)
		rng := rand.New(rand.NewPCG(uint64(wi), 17))
		for range 1500 {
			di := rng.IntN(len(e.devs))
			rf := n - 1 - rng.IntN(n/8)
			re := rng.IntN(n * 3 / 4)
			// RC so that RC + RE is 60..140 kΩ
			rc := e.vs.levelAtOrAbove(max(10, 60e3+80e3*rng.Float64()-e.vs.levels[re].ohm))
			if rc >= n {
				continue
			}
			lv := [maxPos]int{rf, rc, re}
			a := e.newTuple(di, lv)
			if !a.ok {
				continue
			}
			c := a.c // the build of the levels' values (singles here)
			for i := range e.lay.n {
				c.val[i] = e.vs.levels[c.lv[i]].values[0]
			}
			wc, err := solver.EvalWorstCase(e.build(c), e.s.lim)
			if err != nil {
				continue
			}
			h := e.headroom(&e.devs[di], wc)
			var cnt counters
			// headroomFloor's two corners are corners of the worst case
			if hf, fails := e.headroomFloor(di, e.build(c), &cnt); !fails && hf > h*(1+1e-9)+1e-12 {
				t.Errorf("%v (%s): headroom floor %g over the headroom term %g", a.r, e.devs[di].line.Sheet.Label, hf, h)
			}
			// (top n: every RF level, the floor of the pair)
			for _, top := range []int{rf + 1, rf + 3, n} {
				if top > n {
					continue
				}
				fl := f.headroomBelow(di, top, rc, rc, re, &cnt)
				if fl > h*(1+1e-9)+1e-12 {
					t.Errorf("%v (%s): F-RS headroom floor %g below level %d over the headroom term %g", a.r, e.devs[di].line.Sheet.Label, fl, top, h)
				}
				if top == rf+1 && h > 0.05 {
					checked++
					if fl > 0 {
						positive++
					}
				}
			}
			// over a block of RC levels that holds rc (F-RF's blocks):
			// at most the term, and at most the pair's own floor (the
			// block's corner IC is at its largest RC, its sum at its
			// least)
			own := f.headroomBelow(di, n, rc, rc, re, &cnt)
			for _, blk := range [][2]int{{rc - 1, rc}, {rc, rc + 1}, {rc - 2, rc + 3}} {
				lo, hi := max(blk[0], 0), min(blk[1], n-1)
				fb := f.headroomBelow(di, n, lo, hi, re, &cnt)
				if fb > h*(1+1e-9)+1e-12 {
					t.Errorf("%v (%s): F-RS headroom floor %g over RC levels %d..%d over the headroom term %g", a.r, e.devs[di].line.Sheet.Label, fb, lo, hi, h)
				}
				if fb > own*(1+1e-9)+1e-12 {
					t.Errorf("%v (%s): F-RS headroom floor %g over RC levels %d..%d over the pair's own %g", a.r, e.devs[di].line.Sheet.Label, fb, lo, hi, own)
				}
				if h > 0.05 {
					blocks++
					if fb > 0 {
						blocksPositive++
					}
				}
			}
		}
	}
	if checked < 200 {
		t.Fatalf("only %d builds near saturation checked", checked)
	}
	// a floor that is always 0 would hold and settle nothing
	if positive < checked/2 {
		t.Errorf("F-RS headroom floor positive on only %d of %d builds near saturation", positive, checked)
	}
	if blocksPositive < blocks/2 {
		t.Errorf("F-RS headroom floor over RC blocks positive on only %d of %d", blocksPositive, blocks)
	}
	t.Logf("%d builds near saturation checked; floor positive on %d, over RC blocks on %d of %d", checked, positive, blocksPositive, blocks)
}

// checkTransistorUse checks bound U-Q on the build of tuple a: at the
// threshold where a just enters (its QPoint term on top of other floors of
// 0 and 0.02) and with its own IC as the window's low end, the floor is at
// most the transistor's utilization at the exact point (solver.EvalDissipation
// counts VCE·IC + VBE·IB against the same allowance).
func checkTransistorUse(t *testing.T, e *evaluator, dv *device, a *tuple) {
	t.Helper()
	if math.IsInf(dv.allowHot, 1) {
		return
	}
	use := a.op.PTransistor_W / dv.allowHot
	// transistorUse is the transistor's utilization as EvalDissipation
	// rates it, for any value combination of the tuple
	c := a.c
	for i := range e.lay.n {
		c.val[i] = e.vs.levels[c.lv[i]].values[0]
	}
	if dis := solver.EvalDissipation(e.build(c), a.op, e.s.ambMax, e.s.lim); math.Abs(e.transistorUse(dv, a.op)-dis.Transistor.Utilization) > 1e-12*use {
		t.Errorf("%v: transistorUse %g, EvalDissipation's transistor utilization %g", a.r, e.transistorUse(dv, a.op), dis.Transistor.Utilization)
	}
	// at an RC level before it is solved (divider and split supply)
	if rc, re, ok := rcAndRE(e, a.r); ok {
		kE := 1 + 1/dv.betaNomMin
		if f := e.transistorUseAtRC(dv, rc, re, kE, a.op.IC_A, a.op.IC_A); f > use*(1+1e-9) {
			t.Errorf("%v: U-Q floor at RC %g over the transistor's utilization %g (VCE %g, IC %g)", a.r, f, use, a.op.VCE_V, a.op.IC_A)
		}
		checkRCQPointUse(t, e, a, rc)
	}
	vceLo, _ := e.targetBand(dv)
	for _, other := range []float64{0, 0.02} {
		bd := bounds{thr: e.s.w.QPoint*a.q + other, icLo: a.op.IC_A, finite: true}
		if f := e.transistorUseFloor(dv, bd, vceLo, other); f > use*(1+1e-9) {
			t.Errorf("%v: U-Q floor %g over the transistor's utilization %g (VCE %g, IC %g)", a.r, f, use, a.op.VCE_V, a.op.IC_A)
		}
	}
}

// checkPointTemperatures checks two steps of bound B against a build's
// nominal points at hFE min (lo), typical (a) and max (hi): the
// temperature step (betaModel.ratio), for each two, bounds how far apart
// their junctions are (each point's IC range its exact IC) by at least
// the solved difference; and R_TH is at most bound B-RTH's cap
// (betaModel.rthCap) at the typical point.
func checkPointTemperatures(t *testing.T, e *evaluator, dv *device, a *tuple, lo, hi solver.OperatingPoint) {
	t.Helper()
	rth, re, rc := e.baseLoop(a.r)
	ics := []float64{lo.IC_A, a.op.IC_A, hi.IC_A}
	bm, ok := e.newBetaModel(dv, dv.tjMax_C+thermalSlack_K, re, re, rth, rth, rc, rc, slices.Min(ics))
	if !ok {
		return
	}
	// bound B-RTH: R_TH under the cap at the typical point
	if c := bm.rthCap(bm.point(bm.bt, bm.cnAt(a.op.IC_A), a.op.IC_A, a.op.IC_A)); rth > c*(1+1e-9) {
		t.Errorf("%v %s: R_TH %.6g over bound B-RTH's %.6g (IC %.6g A)", a.r, dv.line.Sheet.Label, rth, c, a.op.IC_A)
	}
	ops := []solver.OperatingPoint{lo, a.op, hi}
	bs := []float64{bm.b1, bm.bt, bm.b2}
	for i := range ops {
		for j := range ops {
			if i == j {
				continue
			}
			pa := bm.point(bs[i], bm.cnAt(ops[i].IC_A), ops[i].IC_A, ops[i].IC_A)
			pb := bm.point(bs[j], bm.cnAt(ops[j].IC_A), ops[j].IC_A, ops[j].IC_A)
			if _, _, dT := bm.ratio(pa, pb); dT < math.Abs(ops[i].Tj_C-ops[j].Tj_C)-1e-6 {
				t.Errorf("%v %s: junctions %.6g and %.6g °C (IC %.6g, %.6g A) apart by more than bound B's %.6g K", a.r, dv.line.Sheet.Label, ops[i].Tj_C, ops[j].Tj_C, ops[i].IC_A, ops[j].IC_A, dT)
			}
		}
	}
}

// checkRCQPointUse checks qPointUseFloor with RC's coefficient against a divider or
// split-supply build's exact QPoint term and RC utilization (its level's
// best allowance), for IC windows around the build's IC and utilization
// floors from 0 to well over RC's, where the floor's least lies at an
// end, at a kink or inside. Builds under 1 mA on a heavy RC are rare, so
// the utilization weight is raised for part of the checks (the floor is
// per weight).
func checkRCQPointUse(t *testing.T, e *evaluator, a *tuple, rcOhm float64) {
	t.Helper()
	lv := a.c.lv[e.lay.rc]
	allow := e.vs.levels[lv].allowHot_W
	ic := a.op.IC_A
	uRC := ic * ic * rcOhm / allow
	for _, wu := range []float64{e.s.w.Utilization, 40, 4000} {
		f := *e
		f.s.w.Utilization = wu
		for _, use := range []float64{0, uRC / 2, uRC * 0.99, uRC * 2} {
			exact := f.s.w.QPoint*a.q + wu*max(0, uRC-use)
			for _, win := range [][2]float64{{ic, ic}, {ic * 0.5, ic * 2}, {ic * 0.9, ic * 1.01}, {ic * 0.2, ic}} {
				if got := f.qPointUseFloor(rcOhm/allow, use, win[0], win[1]); got > exact*(1+1e-9)+1e-15 {
					t.Errorf("%v: QPoint and RC utilization floor %g over the exact %g (w_U %g, use %g, IC %g in [%g, %g])", a.r, got, exact, wu, use, ic, win[0], win[1])
				}
			}
		}
	}
}

// rcAndRE returns a divider's or split-supply build's RC and RE (false
// for collector feedback, whose RC carries the base current too).
func rcAndRE(e *evaluator, r [maxPos]float64) (rc, re float64, ok bool) {
	switch e.lay.topo {
	case solver.Divider:
		return r[iRC], r[iRE], true
	case solver.SplitSupply:
		return r[sRC], r[sRE], true
	}
	return 0, 0, false
}

// TestPartsFloorAndSingleIndex checks bound P's pieces on an E24 wall
// with pairs (IEC 60063:2015, Table 1) against a direct reading of the
// values: a level's parts floor is at most the extra parts of every value
// in it (and 1 exactly when all are pairs), nextSingle and prevSingle
// name the nearest levels holding a single, and firstIn over the singles
// finds, for monotone predicates, the first single level a linear scan
// finds.
func TestPartsFloorAndSingleIndex(t *testing.T) {
	lines := seriesStock(eseries.E24, 100, 100e3, 0.01, 0.25, 4, 1)
	vs := buildValues(lines, 1, true, 50, solver.Limits{}.WithDefaults())
	n := len(vs.levels)
	holdsSingle := func(i int) bool {
		for _, vi := range vs.levels[i].values {
			if vs.values[vi].lines[1] < 0 {
				return true
			}
		}
		return false
	}
	pairOnly := 0
	for i := range n {
		want := 0.0
		if !holdsSingle(i) {
			want = 1
			pairOnly++
		}
		if got := vs.partsFloor(i); got != want {
			t.Fatalf("level %d (%g Ω): parts floor %g, want %g", i, vs.levels[i].ohm, got, want)
		}
		next, prev := n, -1
		for j := i; j < n; j++ {
			if holdsSingle(j) {
				next = j
				break
			}
		}
		for j := i; j >= 0; j-- {
			if holdsSingle(j) {
				prev = j
				break
			}
		}
		if vs.up(i, true) != next || vs.down(i, true) != prev {
			t.Fatalf("level %d: up %d down %d, want %d and %d", i, vs.up(i, true), vs.down(i, true), next, prev)
		}
	}
	if pairOnly == 0 || pairOnly == n {
		t.Fatalf("%d of %d levels pair-only: the wall does not test the index", pairOnly, n)
	}
	rng := rand.New(rand.NewPCG(3, 5))
	for range 2000 {
		lo := rng.IntN(n)
		hi := lo + rng.IntN(n-lo)
		cut := rng.IntN(n + 1)
		f := func(i int) bool { return i >= cut }
		want := hi + 1
		for j := lo; j <= hi; j++ {
			if f(j) && holdsSingle(j) {
				want = j
				break
			}
		}
		if got := vs.firstIn(lo, hi, lo+rng.IntN(hi-lo+1), true, f); got != want {
			t.Fatalf("firstIn(%d, %d) singles, cut %d: %d, want %d", lo, hi, cut, got, want)
		}
		if got, all := vs.firstIn(lo, hi, lo, false, f), max(lo, min(cut, hi+1)); got != all {
			t.Fatalf("firstIn(%d, %d), cut %d: %d, want %d", lo, hi, cut, got, all)
		}
	}
}

// TestFactorUpBoundsFactor: betaFloor takes the temperature factor of a
// point's hottest junction from a table (factorUp), which must never be
// under the factor itself, for a rising and a falling factor, and not over
// it by more than one table step's worth; and the model's IS and factor
// at its hottest (25 °C and up) from the table's next hotter point
// (hotter), which must not be under IS, nor the factor on 25 °C's side of
// it. source: the SPICE BJT model's temperature laws of BF, BF·(T/TNOM)^XTB,
// and of IS, rising with T (ngspice manual, BJT temperature effects).
func TestFactorUpBoundsFactor(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 1))
	for _, xtb := range []float64{1.5, 0, -0.7} {
		tr := smallNPN(1, 100, 300)
		st := Stock{Transistors: []Transistor{tr}}
		e := newTestEvaluator(t, st, Request{VCC_V: 12, IC_A: 1e-3})
		dv := &e.devs[0]
		dv.typ.XTB = xtb
		dv.xtb = newXTBTable(dv)
		bm := betaModel{m: dv.typ, xtb: &dv.xtb}
		for range 5000 {
			tc := NominalAmbient_C - 1 + rng.Float64()*(dv.tjMax_C-NominalAmbient_C+2)
			got, want := bm.factorUp(tc), bm.factor(tc)
			if got < want || got > want*(1+math.Abs(xtb)*xtbStep_K/250) {
				t.Fatalf("XTB %g at %.4f °C: table %.12g, factor %.12g", xtb, tc, got, want)
			}
			// hotter: IS at least IS(T), the factor beyond factor(T) on
			// the side away from 25 °C's
			is, f, ok := dv.xtb.hotter(tc)
			isT, _, _, _ := dv.typ.At(tc)
			if ok && tc >= NominalAmbient_C && (is < isT || (f-want)*(want-bm.factor(NominalAmbient_C)) < 0) {
				t.Fatalf("XTB %g at %.4f °C: hotter point IS %.6g factor %.12g, at T IS %.6g factor %.12g", xtb, tc, is, f, isT, want)
			}
		}
	}
}

// TestBetaModelOverRangeIsConservative checks bound B's model over a range
// of RE step by step (a fact of the bound's construction, not of any one
// build): the model for RE in [lo, hi] is never less conservative than the
// model at either end alone, field by field and method by method with the
// same inputs (R_TH + RE's range and the loop drop wider, the power,
// VBE, Early and base-current bounds no smaller, every lower bound no
// larger, every upper bound no smaller). TestBoundsHoldOnRandomBuilds
// checks the whole floor against exact builds; this catches a step that
// takes RE at the wrong end where the floor has room to spare.
func TestBetaModelOverRangeIsConservative(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E24, 10, 1e6, 0.01, 0.25, 100, 1000), Transistors: benchTransistors(6)}
	st.Transistors[2].Sheet.PD25_W = 0 // no self-heating
	st.Transistors[3].Sheet.VAF_V = 25
	st.Transistors[4].Sheet.ThetaJA_KPerW = 500
	e := newTestEvaluator(t, st, Request{VCC_V: 12, IC_A: 1e-3})
	rng := rand.New(rand.NewPCG(5, 9))
	logU := func(lo, hi float64) float64 { return lo * math.Pow(hi/lo, rng.Float64()) }
	const tol = 1e-12
	le := func(a, b float64) bool { return a <= b+tol*math.Abs(b) || math.IsInf(b, 1) }
	checked := 0
	for range 3000 {
		dv := &e.devs[rng.IntN(len(e.devs))]
		th := NominalAmbient_C + (dv.tjMax_C-NominalAmbient_C)*rng.Float64()
		reLo := logU(10, 10e3)
		reHi := reLo * logU(1, 4)
		rth := logU(100, 1e6)
		rthMax := rth * logU(1, 4)
		rc := logU(100, 20e3)
		icLo := logU(1e-5, 1e-2)
		icHi := icLo * logU(1, 1.3)
		r, ok := e.newBetaModel(dv, th, reLo, reHi, rth, rthMax, 0, rc, icLo)
		if !ok {
			continue
		}
		for _, x := range []float64{reLo, reHi} {
			m, ok := e.newBetaModel(dv, th, x, x, rth, rthMax, 0, rc, icLo)
			if !ok {
				t.Fatalf("RE %g: no model where the range %g..%g has one", x, reLo, reHi)
			}
			checked++
			fail := func(what string, a, b float64) {
				t.Errorf("RE %g of %g..%g (%s): %s %g vs %g at the single RE", x, reLo, reHi, dv.line.Sheet.Label, what, a, b)
			}
			if !le(r.a, m.a) || !le(m.aMax, r.aMax) {
				fail("R_TH + RE range", r.a, m.a)
			}
			if !le(m.vbeCap, r.vbeCap) || !le(r.qMin, m.qMin) || !le(r.kMin, m.kMin) || !le(m.kappa, r.kappa) {
				fail("VBE cap, q min, k min or κ", r.vbeCap, m.vbeCap)
			}
			cn := r.cnAt(icLo)
			pr, pm := r.point(r.bt, cn, icLo, icHi), m.point(r.bt, cn, icLo, icHi)
			if !le(pm.pUp, pr.pUp) || !le(pm.ibUp, pr.ibUp) || !le(pm.phiMax, pr.phiMax) {
				fail("point power, base current or φ max", pr.pUp, pm.pUp)
			}
			lr, hr := r.loopDrop(pr)
			lm, hm := m.loopDrop(pr)
			if !le(lr, lm) || !le(hm, hr) {
				fail("loop drop low end", lr, lm)
			}
			rho := 0.9 + 0.1*rng.Float64()
			if gr, gm := r.gRatio(r.b2, r.b1, r.betaMin(r.b1)/r.b1, pr.phiMax, rho), m.gRatio(r.b2, r.b1, r.betaMin(r.b1)/r.b1, pr.phiMax, rho); !le(gr, gm) {
				fail("g ratio", gr, gm)
			}
			if gr, gm := r.gRatio(r.b1, r.bt, r.betaMin(r.bt)/r.bt, pr.phiMax, rho), m.gRatio(r.b1, r.bt, r.betaMin(r.bt)/r.bt, pr.phiMax, rho); !le(gr, gm) {
				fail("g ratio, hFE min against typical", gr, gm)
			}
			if ur, um := r.upRatio(r.b2, cn, pr), m.upRatio(r.b2, cn, pr); !le(um, ur) {
				fail("up ratio", ur, um)
			}
			qk, dT := 1+0.1*rng.Float64(), r.dT*rng.Float64()
			// the range's low ratio is at most the single model's fixed
			// point: the single model's map does not fall below it there
			// (the map is nonincreasing)
			if yr := r.lowRatio(r.b1, cn, qk, dT, rho, pr); yr > 0 {
				if fm, _ := m.lowRatioMap(r.b1, cn, qk, dT, rho, pr).at(yr); !le(yr, fm) {
					fail("low ratio against the single model's map there", yr, fm)
				}
			}
			p2 := r.point(r.b2, cn, icLo, icHi*1.5)
			rhoR, qkR, _ := r.ratio(p2, pr)
			rhoM, qkM, _ := m.ratio(p2, pr)
			if !le(rhoR, rhoM) || !le(qkM, qkR) {
				fail("φ ratio", rhoR, rhoM)
			}
		}
	}
	if checked < 1000 {
		t.Fatalf("only %d models compared", checked)
	}
}

// TestFeedbackICWindowHoldsTheSublevelSet checks bound F-QW's window
// against a dense scan of F-Q's floor (feedbackQAt, convex in the current)
// over random sums, current floors, IC windows and thresholds: every
// scanned current inside [icLo, icHi] whose floor is at most d lies in the
// window (it must hold them all), and the window reaches no further than
// one scan step (and the edges' margin) beyond the outermost such current
// (it must narrow).
func TestFeedbackICWindowHoldsTheSublevelSet(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E24, 10, 1e6, 0.01, 0.25, 100, 1000), Transistors: benchTransistors(2)}
	rng := rand.New(rand.NewPCG(5, 11))
	checked, narrowed := 0, 0
	for _, vcc := range []float64{5, 12, 24} {
		for _, ic := range []float64{0.1e-3, 1e-3, 10e-3} {
			e := newTestEvaluator(t, st, Request{Topology: solver.CollectorFeedback, VCC_V: vcc, IC_A: ic})
			dv := &e.devs[0]
			vceLo, vceHi := e.targetBand(dv)
			kE := 1 + 1/dv.betaNomMin
			for range 400 {
				r := (vcc / ic) * math.Exp(rng.Float64()*3-2.5) // RC + RE around the target's
				xLo := 0.0
				if rng.IntN(2) == 0 {
					xLo = ic * rng.Float64() * 1.5
				}
				d := rng.Float64() * 1.5
				icLo, icHi := ic*rng.Float64()*0.9, ic*(1.1+rng.Float64()*2)
				lo, hi, ok := e.feedbackICWindow(r, xLo, kE, vceLo, vceHi, d, icLo, icHi)
				const steps = 20000
				in, first, last := 0, math.Inf(1), math.Inf(-1)
				for i := range steps + 1 {
					x := min(icHi, icLo+(icHi-icLo)*float64(i)/steps)
					if x < xLo || e.feedbackQAt(x, r, r, xLo, kE, vceLo, vceHi) > d {
						continue
					}
					in++
					first, last = min(first, x), max(last, x)
					if !ok || x < lo || x > hi {
						t.Fatalf("r %g Ω, xLo %g, d %g, IC window [%g, %g]: current %g has floor %g ≤ d but F-QW gives [%g, %g] (ok %v)",
							r, xLo, d, icLo, icHi, x, e.feedbackQAt(x, r, r, xLo, kE, vceLo, vceHi), lo, hi, ok)
					}
				}
				checked++
				if in == 0 {
					continue
				}
				// one scan step, and the edge's outward margin of 2⁻²⁴
				// of the window (against rounding)
				step := (icHi - icLo) / steps
				slack := step*(1+1e-6) + (icHi-icLo)*0x1p-24
				if lo < first-slack || hi > last+slack {
					t.Errorf("r %g Ω, xLo %g, d %g: F-QW window [%g, %g] wider than the scanned set [%g, %g] by over a step %g", r, xLo, d, lo, hi, first, last, step)
				}
				if hi-lo < (icHi-icLo)*0.99 {
					narrowed++
				}
			}
		}
	}
	if narrowed < checked/4 {
		t.Errorf("F-QW narrowed only %d of %d windows", narrowed, checked)
	}
	t.Logf("%d windows checked, %d narrowed", checked, narrowed)
}

// TestICFloorHoldsAcrossBands checks valueSet.icFloor and bandFloor.covers
// against the exact self-heated solutions (solver.SolveSelfHeated is the
// reference) of every RC level of random divider bands: icFloor's IC is
// at most the IC of every build in the band that can pass (any false only
// when there is none), and a floor taken at one R2 holds at a larger R2 for
// every band it covers. The stock is E24 10 Ω–1 MΩ (IEC 60063:2015,
// Table 1) with six transistor types at 12 V, where small R1 and large
// RC saturate often, and the window's top icHi is drawn so that a band
// saturated at its top but active at its bottom under icHi occurs (the
// case where IC at the bottom is no floor).
func TestICFloorHoldsAcrossBands(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E24, 10, 1e6, 0.01, 0.25, 100, 1000), Transistors: benchTransistors(6)}
	e := newTestEvaluator(t, st, Request{VCC_V: 12, IC_A: 1e-3})
	n := len(e.vs.levels)
	rng := rand.New(rand.NewPCG(7, 12))
	// floorOf is the least IC of the band's builds that can pass (+Inf:
	// none): active at the nominal point with VCE at least VCE(sat) plus
	// the margin (the premise of the bounds; nearer saturation IC may
	// fall as the drive grows, and such a build fails its bench limit)
	floorOf := func(di, r1, r2, re, lo, hi int) float64 {
		f := math.Inf(1)
		for rc := lo; rc <= hi; rc++ {
			a := e.newTuple(di, [maxPos]int{r1, r2, rc, re})
			if a.ok && a.op.Region == solver.Active && a.op.VCE_V >= e.devs[di].vceSat+e.s.lim.VCEMargin_V {
				f = min(f, a.op.IC_A)
			}
		}
		return f
	}
	bottomOnly, covered, checked := 0, 0, 0
	for range 1500 {
		di := rng.IntN(len(e.devs))
		r1, r2, re := rng.IntN(n), rng.IntN(n-8), rng.IntN(n/2)
		lo := rng.IntN(n - 12)
		hi := lo + rng.IntN(12)
		probe := func(rc int) *tuple { return e.newTuple(di, [maxPos]int{r1, r2, rc, re}) }
		bot := probe(lo)
		icHi := 10 * e.s.icT
		if bot.ok && bot.op.Region != solver.Saturation && rng.IntN(2) == 0 {
			icHi = bot.op.IC_A * 1.01 // the bottom is under the window's top
		}
		ic, any := e.vs.icFloor(probe, lo, hi, icHi, false)
		truth := floorOf(di, r1, r2, re, lo, hi)
		checked++
		if !math.IsInf(truth, 1) && (!any || ic > truth*(1+1e-12)) {
			t.Fatalf("icFloor (%g, %v) over RC %d..%d at R1 %d, R2 %d, RE %d; least active IC %g", ic, any, lo, hi, r1, r2, re, truth)
		}
		if top := probe(hi); top.ok && top.op.Region == solver.Saturation && bot.ok && bot.op.Region != solver.Saturation && bot.op.IC_A <= icHi {
			bottomOnly++
		}
		if !any {
			ic = math.Inf(1)
		}
		f := bandFloor{ic: ic, rcLo: lo, rcHi: hi}
		// a larger R2 and a band moved by up to three levels each way
		r2b := r2 + 1 + rng.IntN(7)
		lob, hib := max(0, lo+rng.IntN(7)-3), min(n-1, hi+rng.IntN(7)-3)
		if lob > hib || !f.covers(lob, hib, false) {
			continue
		}
		covered++
		if truth := floorOf(di, r1, r2b, re, lob, hib); f.ic > truth*(1+1e-12) {
			t.Errorf("floor %g of RC %d..%d at R2 %d over the least active IC %g of RC %d..%d at R2 %d (R1 %d, RE %d)", f.ic, lo, hi, r2, truth, lob, hib, r2b, r1, re)
		}
	}
	if bottomOnly == 0 || covered < checked/4 {
		t.Errorf("%d bands saturated at the top and active under icHi at the bottom, %d of %d floors carried: the test does not reach its cases", bottomOnly, covered, checked)
	}
	t.Logf("%d bands, %d saturated at the top with the bottom under icHi, %d floors carried to a larger R2", checked, bottomOnly, covered)
}

// TestCellsSettleHoldsWithPairs checks cellsSettle on a stock with
// pairs: a block of RC levels that holds a build's RC level does not
// settle at a threshold of the terms it bounds for that build (solved by
// solver.SolveSelfHeated, the reference). Half the blocks start at a
// pair-only level below a single (RC's parts floor is the least over the
// block); half have RF at the top levels and reach far up (the IC floor
// of each cell and of whole groups of cells).
func TestCellsSettleHoldsWithPairs(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E12, 10, 1e6, 0.05, 0.25, 100, 1000), Transistors: benchTransistors(3)}
	req := Request{Topology: solver.CollectorFeedback, VCC_V: 12, IC_A: 1e-3, Pairs: true}
	e := newTestEvaluator(t, st, req)
	rng := rand.New(rand.NewPCG(7, 11))
	n := len(e.vs.levels)
	wt := e.s.w
	checked, top := 0, 0
	for i := range 40000 {
		di := rng.IntN(len(e.devs))
		lv := [maxPos]int{rng.IntN(n), rng.IntN(n), rng.IntN(n)}
		rc := lv[fRC]
		if e.vs.levels[rc].pairOnly || rc < 3 {
			continue
		}
		// every other build has RF at the top levels, where the IC
		// floor of a cell (icFloorAbove) is close to the build's own,
		// and its block of RC levels reaches far up (whole groups of
		// cells)
		rc0, last := rc-1-rng.IntN(3), rc
		if i%2 == 1 {
			lv[fRF] = n - 1 - rng.IntN(3)
			rc0, last = rc-rng.IntN(3), min(n-1, rc+rng.IntN(400))
		}
		if i%2 == 0 && !e.vs.levels[rc0].pairOnly {
			continue
		}
		a, ok := benchedTuple(e, di, lv)
		if !ok {
			continue
		}
		var cnt counters
		dv := &e.devs[di]
		kE := 1 + 1/dv.betaNomMin
		vceLo, vceHi := e.targetBand(dv)
		c := a.c
		for i := range e.lay.n {
			c.val[i] = e.vs.levels[c.lv[i]].values[0] // RC's is a single
		}
		u := solver.EvalDissipation(e.build(c), a.op, e.s.ambMax, e.s.lim).MaxUtilization
		ic := a.op.IC_A
		f := &feedbackPlan{e: e}
		f.setGrid()
		for _, k := range []float64{1.1, 1.001} {
			bd := bounds{icLo: ic / k, icHi: ic * k, finite: true}
			bd.thr = (wt.QPoint*a.q+wt.Beta*math.Abs(a.beta)+wt.Utilization*u)*(1+1e-9) + 1e-12
			if f.cellsSettle(di, bd, rc0, last, lv[fRE], 0, 0, kE, vceLo, vceHi, &cnt) {
				t.Errorf("%v: F-QBU over RC levels %d..%d settles at the build's own terms %g (IC window ×/÷ %g)", a.r, rc0, last, bd.thr, k)
			}
		}
		checked++
		top += i % 2
	}
	if checked < 400 || top < 200 {
		t.Fatalf("only %d builds checked, %d at the top RF levels", checked, top)
	}
}

// benchedTuple solves the level tuple lv of device di with its beta
// spread; ok is false unless it is active at its nominal point and its
// three bench points keep the VCE margin (the premise of the bounds).
func benchedTuple(e *evaluator, di int, lv [maxPos]int) (*tuple, bool) {
	a := e.newTuple(di, lv)
	if !a.ok || a.op.Region != solver.Active {
		return a, false
	}
	var cnt counters
	e.betaSpread(a, &cnt)
	return a, a.betaOK && a.bench == nil
}
