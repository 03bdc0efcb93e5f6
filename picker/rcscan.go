package picker

import (
	"math"

	"biasbin/solver"
)

// rcBand returns the RC levels whose builds can have a nominal VCE within
// delta·VCC of the target band (bound RC, doc.go): with IC in
// [icLo, icHi] and IE in [IC, kE·IC], VCE = VCC − IC·RC − IE·RE lies in
// [VCC − icHi(RC + kE·RE), VCC − icLo(RC + RE)] (VCC the span).
//
// kRC generalises it to a stage whose RC carries up to kRC·IC (the
// collector-feedback stage's RC carries IE: kRC = kE); it is 1 where RC
// carries IC alone.
//
// The band is clamped to the levels RC may take (a kept RC's alone).
func (e *evaluator) rcBand(b bounds, reOhm, kRC, kE, vceLo, vceHi float64) (lo, hi int) {
	lo, hi = e.rcBandAll(b, reOhm, kRC, kE, vceLo, vceHi)
	return e.clampRange(e.lay.rc, lo, hi)
}

// rcBandAll is rcBand over every level.
func (e *evaluator) rcBandAll(b bounds, reOhm, kRC, kE, vceLo, vceHi float64) (lo, hi int) {
	n := len(e.vs.levels)
	if !b.finite {
		return 0, n - 1
	}
	vcc := e.span
	lo = e.vs.levelAtOrAbove(((vcc-vceHi-b.delta*vcc)/b.icHi - kE*reOhm) / kRC)
	hi = n - 1
	if b.icLo > 0 {
		rcMax := (vcc-vceLo+b.delta*vcc)/b.icLo - reOhm
		if rcMax < 0 {
			return 1, 0
		}
		hi = min(n-1, e.vs.levelAtOrAbove(rcMax*(1+1e-12))-1)
		if hi+1 < n && sameOhm(e.vs.levels[hi+1].ohm, rcMax) {
			hi++
		}
	}
	return lo, hi
}

// icFloor is the lower envelope of the nominal IC over the builds at
// (R1, R2, RE) with RC in [rcLo, rcHi] that are active at their nominal
// point: IC falls with RC (lemma L2) and saturation only deepens with RC,
// so it is IC at the largest band RC whose nominal point is active. any
// is false when no band RC is active (every such build fails a hard
// limit). With singles (no room for a pair in RC, bound P; rcLo and rcHi
// then hold singles) only the levels holding a single count.
func (vs *valueSet) icFloor(probe func(rc int) *tuple, rcLo, rcHi int, icHi float64, singles bool) (ic float64, any bool) {
	top := probe(rcHi)
	if top.ok && top.op.Region != solver.Saturation {
		return top.op.IC_A, true
	}
	// Saturated at the top of the band. If the bottom is saturated too,
	// so is every band RC; if the bottom is active with IC at most icHi,
	// the floor (IC at the last active RC, at most IC at the bottom) is
	// too, which is all the caller asks: 0 stands for it then, a floor
	// still (IC at the bottom is not one, and a caller may keep it).
	if bot := probe(rcLo); bot.ok {
		if bot.op.Region == solver.Saturation {
			return 0, false
		}
		if bot.op.IC_A <= icHi {
			return 0, true
		}
	}
	// first band RC that saturates; the one below it is the last active
	k := vs.firstIn(rcLo, rcHi, rcLo, singles, func(rc int) bool {
		t := probe(rc)
		return t.ok && t.op.Region == solver.Saturation
	})
	if k == rcLo {
		return 0, false
	}
	t := probe(vs.down(k-1, singles))
	if !t.ok {
		return 0, true
	}
	return t.op.IC_A, true
}

// scanRC scores the RC levels of one tuple lv (every position but RC's,
// rcPos, fixed) outward from the VCE target, for any topology whose VCE is
// span − IC·RC − IE·RE with IC and VCE falling as RC rises (lemma L2):
// below the first RC whose VCE is at or under the top of the target band
// the VCE term only grows going down, and from it upward only grows once
// VCE is under the bottom of the band. IC falls with RC too, so going
// down an IC already over the target only moves further off, and going up
// one already under it likewise. guess is where the last scan split.
// base bounds the other terms of every build of lv from below, the parts
// floors of its fixed positions included, and use is the utilization
// floor within it; a pair-only RC level is stepped over when base +
// w_Parts is over the threshold (bound P).
func (e *evaluator) scanRC(p *pool, tc *tupleCache, cnt *counters, di int, lv [maxPos]int, rcPos int, guess *int, rcLo, rcHi int, vceLo, vceHi, kE, base, use float64) {
	w, vcc, ict := e.s.w, e.span, e.s.icT
	at := func(rc int) [maxPos]int { lv[rcPos] = rc; return lv }
	tup := func(rc int) *tuple { return tc.get(e, di, at(rc), cnt) }
	re := lv[e.lay.re]
	reOhm := e.vs.levels[re].ohm
	// IC at the band's bottom bounds IC at every band RC from above and, for builds active
	// at their nominal point, IC at the top of the band bounds it from
	// below (lemma L2); both are usually solved already by the R1 range
	// search. With them VCE = VCC − IC·RC − IE·RE is bounded before a
	// solve: VCE ≥ VCC − icUp(RC + kE·RE) and VCE ≤ VCC − icDn(RC + RE).
	icUp, icDn := math.Inf(1), 0.0
	if t, ok := tc.peek(at(rcLo)); ok && t.ok {
		icUp = t.op.IC_A
	}
	if t, ok := tc.peek(at(rcHi)); ok && t.ok && t.op.Region == solver.Active {
		icDn = t.op.IC_A
	}
	// the QPoint term's IC part is at least the envelope's distance
	// from the target; with the other terms' floor that may settle it
	if base+w.QPoint*max(0, max(icDn-ict, ict-icUp))/ict > p.threshold() {
		return
	}
	// What is left of the threshold over base bounds the QPoint term of
	// every build of lv, so IC and VCE lie within d of the target and
	// only the RC levels of that narrower band (bound RC) can enter.
	if thr := p.threshold(); w.QPoint > 0 && !math.IsInf(thr, 1) {
		lo, hi := e.rcBandAll(e.boundsWithin(thr, (thr-base)/w.QPoint), reOhm, 1, kE, vceLo, vceHi)
		rcLo, rcHi = max(rcLo, lo), min(rcHi, hi)
		if rcLo > rcHi {
			return
		}
	}
	// own is base with an RC level's own floors before it is solved:
	// its parts floor (bound P) and its utilization where that is over
	// use, the utilization floor in base: the level's own, as it carries
	// IC ≥ icDn (active builds) and IC ≥ IC_t(1 − d) (a build with less
	// has a QPoint term over d = (T − base)/w_QPoint), over its own best
	// allowance (bound U-RC per level; not monotone in RC, so it only
	// skips the level), and the transistor's (bound U-Q at the level,
	// transistorUseAtRC) with IC in that window.
	dv := &e.devs[di]
	// RE carries IE ≥ IC: its utilization is at least coefRE·IC²
	coefRE := reOhm / e.vs.levels[re].allowHot_W
	// window is the IC range of every build that can enter: within the
	// envelope [icDn, icUp] and within d of the target (false while the
	// threshold is +Inf).
	window := func() (icLo, icHi float64, ok bool) {
		thr := p.threshold()
		if w.QPoint <= 0 || math.IsInf(thr, 1) {
			return icDn, icUp, false
		}
		win := e.boundsWithin(thr, (thr-base)/w.QPoint)
		return max(icDn, win.icLo), min(icUp, win.icHi), true
	}
	qUse := func(rc int, icLo, icHi float64) float64 {
		return e.transistorUseAtRC(dv, e.vs.levels[rc].ohm, reOhm, kE, icLo, icHi)
	}
	own := func(rc int) float64 {
		ic, uQ, joint := icDn, 0.0, 0.0
		if lo, hi, ok := window(); ok {
			ic, uQ = lo, qUse(rc, lo, hi)
			joint = e.qPointUseFloor(max(e.vs.levels[rc].ohm/e.vs.levels[rc].allowHot_W, coefRE), use, lo, hi)
		}
		return base + e.partsFloor(rc) + max(w.Utilization*max(0, max(e.levelUseFloor(rc, ic), uQ)-use), joint)
	}
	singles := e.singlesOnly(base, p.threshold()) // bound P: probe singles only
	split := e.vs.firstIn(rcLo, rcHi, *guess, singles, func(rc int) bool { return tup(rc).vceAtMost(vceHi) })
	*guess = split
	for rc := split - 1; rc >= rcLo; rc-- {
		rcOhm := e.vs.levels[rc].ohm
		if vceMin := vcc - icUp*(rcOhm+kE*reOhm); base+w.QPoint*(vceMin-vceHi)/vcc > p.threshold() {
			break
		}
		// bound U-Q at the level only rises going down
		if lo, hi, ok := window(); ok && base+w.Utilization*max(0, qUse(rc, lo, hi)-use) > p.threshold() {
			break
		}
		if e.vs.levels[rc].pairOnly && e.singlesOnly(base, p.threshold()) {
			rc = e.vs.prevSingle[rc] + 1 // bound P: no room for a pair in RC
			continue
		}
		if _, ok := tc.peek(at(rc)); !ok && own(rc) > p.threshold() {
			continue
		}
		t := tup(rc)
		// IC only rises going down, and RE's utilization with it
		if t.ok && base+w.QPoint*(t.op.VCE_V-vceHi)/vcc+e.qPointUseFloor(coefRE, use, t.op.IC_A, max(icUp, t.op.IC_A)) > p.threshold() {
			break
		}
		e.scoreVariants(t, p, p.add, cnt)
	}
	for rc := split; rc <= rcHi; rc++ {
		rcOhm := e.vs.levels[rc].ohm
		if vceMax := vcc - icDn*(rcOhm+reOhm); base+w.QPoint*(vceLo-vceMax)/vcc > p.threshold() {
			break
		}
		if e.vs.levels[rc].pairOnly && e.singlesOnly(base, p.threshold()) {
			rc = e.vs.nextSingle[rc] - 1 // bound P: no room for a pair in RC
			continue
		}
		if _, ok := tc.peek(at(rc)); !ok && own(rc) > p.threshold() {
			continue
		}
		t := tup(rc)
		if t.ok && base+w.QPoint*(vceLo-t.op.VCE_V)/vcc+e.qPointUseFloor(coefRE, use, 0, t.op.IC_A) > p.threshold() {
			break
		}
		e.scoreVariants(t, p, p.add, cnt)
	}
}

// levelUseFloor is the least utilization of a part at level i carrying a
// current of at least ic: ic²·R over the level's best allowance.
func (e *evaluator) levelUseFloor(i int, ic float64) float64 {
	return ic * ic * e.vs.levels[i].ohm / e.vs.levels[i].allowHot_W
}
