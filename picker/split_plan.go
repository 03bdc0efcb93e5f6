package picker

// Positions of a split-supply build's arrays (splitLayout).
const (
	sRB = iota
	sRC
	sRE
)

// splitPlan searches RB, RC, RE of a split-supply stage over (device, RE,
// RB, RC); doc.go, "The split-supply plan", states its bounds.
type splitPlan struct {
	e     *evaluator
	cache tupleCache
	// splitGuess is where the last RC scan split (a start for the next)
	splitGuess int
	seeds      seedOrder
}

// tuple returns the (cached) solved level tuple of device di.
func (sp *splitPlan) tuple(di, rb, rc, re int, cnt *counters) *tuple {
	return sp.cache.get(sp.e, di, [maxPos]int{rb, rc, re}, cnt)
}

// seed evaluates, for every device, hand-method builds: RB = 0.1, 0.03
// and 0.3 of hFE min·RE, RE by a search for the target current, RC for
// the target VCE, and the 3×3 RE, RC levels around them. It changes only
// the order of the search. (Snapped to levels holding a single, as the
// other plans' seeds are with pairs, they made the search slower: on an
// E24 wall with pairs, ±12 V at 10 mA, 0.9 s became 5.9 s.)
func (sp *splitPlan) seed(p *pool, cnt *counters) {
	e := sp.e
	seedByDevice(e, &sp.seeds, cnt, func() *splitPlan { return &splitPlan{e: e, seeds: sp.seeds} },
		func(w *splitPlan, wc *counters, di int) { w.seedDevice(p, wc, di) })
}

// seedDevice is seed for device di.
func (sp *splitPlan) seedDevice(p *pool, cnt *counters, di int) {
	e := sp.e
	n := len(e.vs.levels)
	sp.cache.reset()
	dv := &e.devs[di]
	_, vceHi := e.targetBand(dv)
	re0 := clampLevel(e.vs.levelAtOrAbove((e.s.vee-handVBE_V)/e.s.icT), n)
	rc0 := clampLevel(e.vs.levelAtOrAbove((e.s.vcc+handVBE_V-vceHi)/e.s.icT), n)
	for _, stiff := range []float64{0.1, 0.03, 0.3} {
		rb := clampLevel(e.vs.levelAtOrAbove(stiff*dv.hfeMin*e.vs.levels[re0].ohm), n)
		re := clampLevel(firstLevel(n, func(i int) bool { return sp.tuple(di, rb, rc0, i, cnt).icAtMost(e.s.icT) }), n)
		rc := clampLevel(firstLevel(n, func(i int) bool { return sp.tuple(di, rb, i, re, cnt).vceSolvedAtMost(vceHi) }), n)
		e.vs.eachAround(re, rc, false, func(a, c int) {
			e.scoreVariants(sp.tuple(di, rb, c, a, cnt), p, func(ev *evaluated) {
				sp.seeds.note(di, a, ev)
				p.add(ev)
			}, cnt)
		})
	}
}

// rbBlock is how many RB levels share one beta floor in searchDevice.
const rbBlock = 8

// search is the branch and bound over (device, RE, RB, RC).
func (sp *splitPlan) search(p *pool, cnt *counters) {
	searchByRE(sp.e, p, &sp.seeds, cnt, func() *splitPlan { return &splitPlan{e: sp.e, seeds: sp.seeds, splitGuess: sp.splitGuess} },
		func(w *splitPlan, wc *counters, di, re int, kE, vceLo, vceHi float64, bd bounds) {
			w.searchRE(p, wc, di, re, kE, vceLo, vceHi, bd)
		})
}

// searchRE is search over the builds of device di at RE level re, with
// the bounds bd in force (each worker of search has its own plan, so its
// own tuple cache).
func (sp *splitPlan) searchRE(p *pool, cnt *counters, di, re int, kE, vceLo, vceHi float64, bd bounds) {
	e := sp.e
	n := len(e.vs.levels)
	w := e.s.w
	dv := &e.devs[di]
	sp.cache.reset()
	reOhm := e.vs.levels[re].ohm
	rcLo, rcHi := e.rcBand(bd, reOhm, 1, kE, vceLo, vceHi)
	if rcLo > rcHi {
		return
	}
	icLo, icHi := bd.icLo, bd.icHi
	base := e.partsFloor(re) // bound P
	use := 0.0               // the utilization floor in base
	if bd.finite {
		// RE's utilization bounds every build at this RE from
		// below (U-RE); what is left of the threshold bounds
		// the QPoint term, so the IC window narrows.
		// and U-RC: RC carries IC and is at least the band's
		// bottom level (with the best allowance of any value)
		// and U-Q: the transistor's own dissipation
		uQ := e.transistorUseFloor(dv, bd, vceLo, base)
		uOwn := max(bd.icLo*bd.icLo*reOhm/e.vs.levels[re].allowHot_W, uQ)
		pRC := bd.icLo * bd.icLo * e.vs.levels[rcLo].ohm
		// baseUP: with RC as one part or a pair (bound U-P); base,
		// RC open, is the floor the RC scan takes
		baseUP := base + e.useAndPartsFloor(uOwn, pRC)
		use = max(uOwn, pRC/e.vs.allowHotMax_W)
		base += w.Utilization * use
		if baseUP > bd.thr {
			return
		}
		if w.QPoint > 0 {
			d2 := (bd.thr - baseUP) / w.QPoint
			within := e.boundsWithin(bd.thr, d2)
			// and RE's utilization with the QPoint term's IC part
			// (bound QU-RE)
			ru, ok := e.reWindow(&within, re)
			if !ok {
				return
			}
			icLo, icHi = within.icLo, within.icHi
			base += max(0, ru.parts-e.partsFloor(re))
			if u := icLo * icLo * ru.coef; u > use {
				base += w.Utilization * (u - use)
				use = u
			}
			// and the RC band narrows to it (bound RC with δ the
			// VCE part's room)
			lo, hi := e.rcBandAll(within, reOhm, 1, kE, vceLo, vceHi)
			if rcLo, rcHi = max(rcLo, lo), min(rcHi, hi); rcLo > rcHi {
				return
			}
		}
	}
	// Bound IC-RB: IC falls with RB (lemma L1 with R_TH = RB)
	// and with RC (L2). IC at the band's bottom RC bounds every
	// band build from above, so RB past the first where it is
	// under the window is out; the IC of the band's largest
	// active RC bounds the active builds from below, so RB
	// before the first where that floor is within the window is
	// out.
	// (Only once the pool is full of passing builds: before, a
	// failing build may still enter.)
	rbLo, rbHi := 0, n-1
	// bound P: with no room for a pair's extra part, RB and RC
	// hold singles, and only those levels are probed
	singles := bd.finite && e.singlesOnly(base, bd.thr)
	if singles {
		rcLo, rcHi = e.vs.up(rcLo, true), e.vs.down(rcHi, true)
		if rcLo > rcHi {
			return
		}
	}
	if bd.finite {
		// Bound RB-IB (splitRBFloor). Below it a build saturates, or its
		// base current heats the junction past Tj max: a solve each
		// that the IC bounds below cannot tell from an active build.
		// Bound B-RB: a stage that needs a large RB to drop what RE
		// does not leans on beta
		rbFrom, bAll := e.splitRBBeta(dv, reOhm, kE, e.vs.levels[rcLo].ohm, e.vs.levels[rcHi].ohm, icLo, icHi)
		if rbFrom >= n || base+w.Beta*bAll > bd.thr {
			return
		}
		rbHi = e.vs.firstIn(rbFrom, n-1, max(rbFrom, n/2), singles, func(i int) bool {
			return sp.tuple(di, i, rcLo, re, cnt).icUnder(icLo)
		}) - 1
		rbLo = e.vs.firstIn(rbFrom, rbHi, rbFrom, singles, func(i int) bool {
			ic, any := e.vs.icFloor(func(rc int) *tuple { return sp.tuple(di, i, rc, re, cnt) }, rcLo, rcHi, icHi, singles)
			return any && ic <= icHi
		})
	}
	rbLo, rbHi = e.clampRange(sRB, rbLo, rbHi)
	// bRB is bound B over the block of RB levels up to blockEnd
	blockEnd, bRB := -1, 0.0
	for rb := rbLo; rb <= rbHi; rb++ {
		if e.stopped() {
			return
		}
		if bd.finite && e.vs.levels[rb].pairOnly && e.singlesOnly(base, p.threshold()) {
			rb = e.vs.nextSingle[rb] - 1 // bound P: no room for a pair in RB
			continue
		}
		if bd := e.boundsNow(p); bd.finite && w.Beta > 0 && rb > blockEnd {
			// Bound B over RB (R_TH = RB, baseLoop), per block of
			// rbBlock levels: the beta term of every build in the
			// block is at least the floor over it (taken at the
			// block's first threshold: a wider window only lowers
			// it); when that settles the block, the floor over the
			// block and every level above it may settle them all.
			blockEnd = min(rb+rbBlock-1, rbHi)
			bw := betaWindow{RTH: e.vs.levels[rb].ohm, RTHMax: e.vs.levels[blockEnd].ohm, RE: reOhm,
				RCMin: e.vs.levels[rcLo].ohm, RCMax: e.vs.levels[rcHi].ohm, ICLo: bd.icLo, ICHi: bd.icHi}
			if bRB = e.betaFloor(dv, bw); base+w.Beta*bRB > bd.thr {
				if bw.RTHMax = e.vs.levels[rbHi].ohm; base+w.Beta*e.betaFloor(dv, bw) > bd.thr {
					break
				}
				rb = blockEnd
				continue
			}
		}
		// tuples of one RB level serve only its RC scan: the
		// cache starts again, so it holds one level's at a time
		sp.cache.reset()
		e.scanRC(p, &sp.cache, cnt, di, [maxPos]int{rb, 0, re}, sRC, &sp.splitGuess, rcLo, rcHi, vceLo, vceHi, kE, base+e.partsFloor(rb)+w.Beta*bRB, use)
	}
}

// splitRBFloor is bound RB-IB: a build of dv active at its nominal point
// with IC ≤ icHi draws IB ≤ icHi/β_nom,min through RB, and RB·IB = |VEE|
// − VBE − IE·RE with VBE ≤ vbeHi(icHi) and IE·RE ≤ kE·icHi·RE, so RB is
// at least β_nom,min(|VEE| − vbeHi − kE·icHi·RE)/icHi (0 when that is
// not positive).
func (e *evaluator) splitRBFloor(dv *device, icHi, reOhm, kE float64) float64 {
	v := e.s.vee - vbeHi(dv, icHi) - kE*icHi*reOhm
	if v <= 0 {
		return 0
	}
	return dv.betaNomMin * v / icHi
}

// splitRBBeta is bound B-RB: bound RB-IB's level (the first an active
// build of dv at RE with IC ≤ icHi can hold; n when none) and bound B
// with R_TH from it to the largest level, for builds with RC in [rcMin,
// rcMax] and IC in [icLo, icHi] (0 where w_Beta is 0): a floor on the
// beta term of every such build whatever its RB.
func (e *evaluator) splitRBBeta(dv *device, reOhm, kE, rcMin, rcMax, icLo, icHi float64) (from int, floor float64) {
	n := len(e.vs.levels)
	from = e.vs.levelAtOrAbove(e.splitRBFloor(dv, icHi, reOhm, kE))
	if from >= n || e.s.w.Beta == 0 {
		return from, 0
	}
	return from, e.betaFloor(dv, betaWindow{RTH: e.vs.levels[from].ohm, RTHMax: e.vs.levels[n-1].ohm, RE: reOhm,
		RCMin: rcMin, RCMax: rcMax, ICLo: icLo, ICHi: icHi})
}

// reWindow narrows within (bounds of the builds at RE level re that can
// enter, its delta the room of the QPoint term's VCE part) by bound QU-RE
// (reUseWindow, with room within.thr): the IC window to the choices' and
// the VCE part to what their floor leaves. It returns what the bound
// leaves, and false when no build at re can enter.
func (e *evaluator) reWindow(within *bounds, re int) (reUse, bool) {
	ru := e.reUseWindow(re, within.thr)
	within.icLo, within.icHi = max(within.icLo, ru.icLo), min(within.icHi, ru.icHi)
	if within.icLo > within.icHi || e.s.w.QPoint <= 0 {
		return ru, within.icLo <= within.icHi
	}
	within.delta = min(within.delta, (within.thr-ru.floor)/e.s.w.QPoint)
	return ru, true
}
