package picker

import (
	"math"

	"biasbin/solver"
)

// Bound F-T: floors on the terms of the builds whose RC + RE lies in a
// span of the grid of sums and whose RF lies in a range of levels, taken
// from the grid's solves at the two corners, before any build there is
// solved (doc.go, "The collector-feedback plan").

// sumRFFloor is bound F-T over the builds of device di with RC + RE in
// [R(gLo), R(gHi)) and RF in levels a..b.
type sumRFFloor struct {
	ok bool // false: the corners could not be solved, no floor
	// icLo and ieHi bound the nominal IC from below and IE from above
	icLo, ieHi float64
	// qb bounds w_QPoint·q + w_Beta·β + w_Headroom·h from below, hr is
	// its headroom part (0 unless near saturation), use the transistor's
	// utilization
	qb, hr, use float64
}

// sumRFFloorOf is bound F-T. By F1 and F-G the nominal IC of such a build
// lies between IC at (R(gHi), RF b) and at (R(gLo), RF a). KVL round the
// loop RF–base–emitter gives VCE = VBE + IB·RF, KCL IE = IC + IB, and
// VCE = VCC − IE·(RC + RE), so with r = RC + RE
//
//	VCE = (VCC − r·IC + r·VBE/RF)/(1 + r/RF),
//
// which falls as r or IC rises and rises with VBE whatever the others
// are, and is monotonic in RF for fixed others: over the box of r, IC,
// VBE (vbeBounds) and RF its least and largest values lie at corners.
// The QPoint term is at least IC's distance from the target plus VCE's
// from the target band [vceLo, vceHi] over the span; bound B with R_TH
// over RF's range, RE' over the sums' and IC's range bounds the beta
// term; the transistor dissipates at least IC·VCE; and IE ≤ IC + (VCE −
// VBE)/RF. Near saturation the headroom term is at least its saturation
// part at cornerVCE over the span's least sum and RF's largest level.
func (f *feedbackPlan) sumRFFloorOf(di, gLo, gHi, a, b int, vceLo, vceHi float64, cnt *counters) sumRFFloor {
	top, bottom := f.gridIC(di, gLo, a, cnt), f.gridIC(di, gHi, b, cnt)
	if math.IsNaN(top) || math.IsNaN(bottom) || !(bottom > 0) {
		return sumRFFloor{}
	}
	e := f.e
	dv := &e.devs[di]
	w, vcc, it := e.s.w, e.s.vcc, e.s.icT
	icLo, icHi := bottom*(1-gridSlack), top*(1+gridSlack)
	rLo, rHi := f.gridOhm(gLo), f.gridOhm(gHi)
	fLo, fHi := e.vs.levels[a].ohm, e.vs.levels[b].ohm
	vbeLo, vbeHi := e.vbeBounds(dv, icLo, icHi)
	vce := func(r, ic, vbe, rf float64) float64 { return (vcc - r*ic + r*vbe/rf) / (1 + r/rf) }
	vceMin := min(vce(rHi, icHi, vbeLo, fLo), vce(rHi, icHi, vbeLo, fHi)) - vcc*1e-9
	vceMax := max(vce(rLo, icLo, vbeHi, fLo), vce(rLo, icLo, vbeHi, fHi)) + vcc*1e-9
	q := max(0, icLo-it, it-icHi)/it + max(0, vceMin-vceHi, vceLo-vceMax)/e.span
	beta, hr := 0.0, 0.0
	if w.Beta > 0 {
		beta = e.betaFloor(dv, betaWindow{RTH: fLo, RTHMax: fHi, RE: rLo, REMax: rHi, ICLo: icLo, ICHi: icHi})
	}
	if w.Headroom > 0 && e.nearSaturation(dv, vceMax) {
		if v := f.cornerVCE(di, gLo, b, cnt); !math.IsNaN(v) {
			// (with room for the self-heated solve's own tolerance:
			// near the edge of the active region the corner's VCE
			// moves by a few millionths with the split of the sum)
			hr = w.Headroom * e.headroomSat(dv, v+vcc*cornerSlack)
		}
	}
	fl := sumRFFloor{ok: true, icLo: icLo, ieHi: icHi + max(0, vceMax-vbeLo)/fLo, hr: hr, qb: (w.QPoint*q + w.Beta*beta + hr) * (1 - 1e-12)}
	if !math.IsInf(dv.allowHot, 1) {
		fl.use = icLo * max(0, vceMin) / dv.allowHot
	}
	return fl
}

// rfCellEntry is bound F-T of the device being searched (dev:
// feedbackPlan.gridDev) over the sums of span g (rfCellPoints grid
// cells) and the RF levels of block rf (rfCellLevels levels).
type rfCellEntry struct {
	g, rf, dev int
	sumRFFloor
}

// The spans of bound F-T per tuple: 2^rfCellShift grid cells of sums
// (about 0.02 % of the sum on the E96 wall with pairs) by rfCellLevels
// RF levels. Wider spans share more and settle less.
const (
	rfCellShift  = 3
	rfCellLevels = 8
)

// rfCellMemoBits caps feedbackPlan.rfCellBits (2^16 slots: 4 MB per
// worker; E96 with pairs, collector feedback at 10 mA, solves no more
// than with 2^18 and peaks 40 MB lower).
const rfCellMemoBits = 16

// rfCell is bound F-T over the span of sums holding grid cell g and the
// block of RF levels holding rf, kept in f.rfCells (direct-mapped at a
// hash of the two), which every (RC, RE) pair whose sum falls in the span
// shares.
func (f *feedbackPlan) rfCell(di, g, rf int, vceLo, vceHi float64, cnt *counters) *rfCellEntry {
	g, rf = g>>rfCellShift, rf/rfCellLevels
	k := gridKey(g, rf)
	slot := &f.rfCells[(k*0x9e3779b97f4a7c15)>>(64-f.rfCellBits)]
	if slot.dev == f.gridDev && slot.g == g && slot.rf == rf {
		return slot
	}
	a, b := rf*rfCellLevels, min((rf+1)*rfCellLevels, len(f.e.vs.levels))-1
	*slot = rfCellEntry{g, rf, f.gridDev, f.sumRFFloorOf(di, g<<rfCellShift, (g+1)<<rfCellShift, a, b, vceLo, vceHi, cnt)}
	return slot
}

// rfCellSettles reports whether bound F-T settles every build of device
// di at levels (rf, rc, re), whose sum RC + RE lies in grid cell g: the
// floors of rfCell with the emitter term's from IC's and IE's bounds,
// RC's and RE's utilization (each carries IE ≥ IC) over its own level's
// best allowance, and the parts floor pf (of every position). It
// returns the floors too. Its floor is the same for every RF level of
// rf's block of rfCellLevels but for pf, so where it settles at the least
// pf of some of them, it settles them all.
func (f *feedbackPlan) rfCellSettles(di, g, rf, rc, re int, pf, vceLo, vceHi, thr float64, cnt *counters) (*rfCellEntry, bool) {
	c := f.rfCell(di, g, rf, vceLo, vceHi, cnt)
	if !c.ok {
		return c, false
	}
	e := f.e
	w, lv := e.s.w, e.vs.levels
	fl := pf + c.qb
	if fl > thr {
		return c, true
	}
	reOhm := lv[re].ohm
	if e.lay.emitterBand {
		fl += w.Emitter * e.emitterFloor(bounds{icLo: c.icLo, icHi: c.ieHi}, reOhm, 1)
	}
	u := max(c.use, c.icLo*c.icLo*max(lv[rc].ohm/lv[rc].allowHot_W, reOhm/lv[re].allowHot_W))
	return c, fl+w.Utilization*u > thr
}

// rfBlockDown is the least level from, no lower than lo, of the levels
// from rf down that share rf's block of rfCellLevels (so its rfCell), and
// the least parts floor pfRF among them.
func (f *feedbackPlan) rfBlockDown(rf, lo int) (from int, pfRF float64) {
	e := f.e
	from = max(lo, rf/rfCellLevels*rfCellLevels)
	if e.vs.prevSingle[rf] < from {
		pfRF = e.partsFloor(rf) // every level there a pair
	}
	return from, pfRF
}

// sumCellEntry is bound F-T's least over a span of sums of device dev
// (feedbackPlan.gridDev) (sumCell).
type sumCellEntry struct {
	dev     int
	qb, qbu float64
	// hull[k] is the least and the largest RF level whose part of the
	// span's RF window bound F-T leaves at most the threshold less k
	// parts' weight (hullOf): every build in the span with k extra parts
	// in RC and RE that can enter has RF in it (empty: lo > hi)
	hull [2][2]int
}

// sumCellShift sets the spans of sumCell: 2^sumCellShift grid cells of
// sums (about 0.09 % of the sum on the E96 wall with pairs).
const sumCellShift = 5

// sumCellLevels is the fewest RF levels sumCell splits further.
const sumCellLevels = 8

// sumCell bounds the builds of device di whose RC + RE lies in span G of
// the grid of sums (grid cells G·2^sumCellShift up to the next span) from
// below: qb bounds w_QPoint·q + w_Beta·β and qbu that plus w_Utilization
// times the transistor's utilization. A build with its nominal IC outside
// bd's window scores over bd.thr, and by F1 and F-G the others have RF in
// the levels whose IC at the span's ends can meet the window (as
// rfWindow). Those are split in halves, bound F-T taken on each, while it
// is at most bd.thr and under the least found so far and the part is
// wider than sumCellLevels; the least over the parts it leaves (and
// bd.thr, for the builds the window and the parts over it rule out) is a
// floor of every build in the span that does not score over bd.thr, so of
// every build that can enter then or later (the threshold only falls). It
// is kept per span (f.sumCells).
func (f *feedbackPlan) sumCell(di, G int, bd bounds, vceLo, vceHi float64, cnt *counters) *sumCellEntry {
	var slot *sumCellEntry
	if i := G - f.sumCellBase; i >= 0 && i < len(f.sumCells) {
		if slot = &f.sumCells[i]; slot.dev == f.gridDev {
			return slot
		}
	} else {
		slot = new(sumCellEntry) // outside the memo: not kept
	}
	e := f.e
	w, lv := e.s.w, e.vs.levels
	n := len(lv)
	gLo, gHi := G<<sumCellShift, (G+1)<<sumCellShift
	// the last span's window is the guess: neighbouring spans' are close
	lo := firstFrom(n, f.spanRF[0], func(i int) bool {
		v := f.gridIC(di, gHi, i, cnt)
		return math.IsNaN(v) || v <= bd.icHi*(1+gridSlack)
	})
	hi := firstFrom(n, f.spanRF[1]+1, func(i int) bool {
		v := f.gridIC(di, gLo, i, cnt)
		return !math.IsNaN(v) && v < bd.icLo*(1-gridSlack)
	}) - 1
	f.spanRF = [2]int{lo, hi}
	lo, hi = e.clampRange(fRF, lo, hi)
	*slot = sumCellEntry{dev: f.gridDev, qb: bd.thr, qbu: bd.thr}
	// Depth first, the part with the lower floor first: a part whose
	// floor is over the threshold, or no lower than the least found so
	// far (both with and without the transistor's utilization), cannot
	// lower the least and is not split.
	type part struct {
		a, b int
		fl   sumRFFloor
	}
	var stack [64]part
	top := 0
	found, noFloor := false, false
	if lo <= hi {
		stack[0] = part{lo, hi, f.sumRFFloorOf(di, gLo, gHi, lo, hi, vceLo, vceHi, cnt)}
		top = 1
	}
	for top > 0 {
		top--
		pt := stack[top]
		fl := pt.fl
		if !fl.ok {
			// no floor here (0), though its parts may have one: it is
			// split unless the least is 0 already
			fl = sumRFFloor{}
		}
		if fl.qb > bd.thr || fl.qb >= slot.qb && fl.qb+w.Utilization*fl.use >= slot.qbu {
			continue
		}
		if pt.b-pt.a+1 <= sumCellLevels || top+2 > len(stack) {
			found = true
			noFloor = noFloor || !pt.fl.ok
			slot.qb = min(slot.qb, fl.qb)
			slot.qbu = min(slot.qbu, fl.qb+w.Utilization*fl.use)
			continue
		}
		m := int(uint(pt.a+pt.b) >> 1)
		l := part{pt.a, m, f.sumRFFloorOf(di, gLo, gHi, pt.a, m, vceLo, vceHi, cnt)}
		r := part{m + 1, pt.b, f.sumRFFloorOf(di, gLo, gHi, m+1, pt.b, vceLo, vceHi, cnt)}
		if l.fl.ok && (!r.fl.ok || r.fl.qb < l.fl.qb) {
			l, r = r, l
		}
		stack[top], stack[top+1] = r, l
		top += 2
	}
	// the hulls: empty where every part is over (no part of at most
	// sumCellLevels levels was reached), or the least is over with a
	// pair's part
	none := [2]int{hi + 1, hi}
	slot.hull = [2][2]int{none, none}
	if !found {
		return slot
	}
	if noFloor {
		// a part without a floor (its corners cannot be solved) put
		// the least at 0: the hull is the window (halving from the
		// ends would meet such parts too, at a cost)
		slot.hull = [2][2]int{{lo, hi}, {lo, hi}}
		return slot
	}
	slot.hull[0] = f.hullOf(di, gLo, gHi, lo, hi, bd.thr, vceLo, vceHi, cnt)
	slot.hull[1] = slot.hull[0]
	if w.Parts > 0 {
		slot.hull[1] = none
		if slot.qb <= bd.thr-w.Parts {
			slot.hull[1] = f.hullOf(di, gLo, gHi, slot.hull[0][0], slot.hull[0][1], bd.thr-w.Parts, vceLo, vceHi, cnt)
		}
	}
	return slot
}

// hullOf is the least and the largest RF level in lo..hi that bound F-T
// over the sums [R(gLo), R(gHi)) does not put over limit, to within
// sumCellLevels levels: the first and the last part of at most that many
// levels not over it, found by halving from each end (lo > hi: none).
func (f *feedbackPlan) hullOf(di, gLo, gHi, lo, hi int, limit, vceLo, vceHi float64, cnt *counters) [2]int {
	end := func(fromTop bool) int {
		type part struct{ a, b int }
		var stack [64]part
		stack[0] = part{lo, hi}
		for top := 1; top > 0; {
			top--
			pt := stack[top]
			if fl := f.sumRFFloorOf(di, gLo, gHi, pt.a, pt.b, vceLo, vceHi, cnt); fl.ok && fl.qb > limit {
				continue
			}
			if pt.b-pt.a+1 <= sumCellLevels || top+2 > len(stack) {
				if fromTop {
					return pt.b
				}
				return pt.a
			}
			m := int(uint(pt.a+pt.b) >> 1)
			l, r := part{pt.a, m}, part{m + 1, pt.b}
			if fromTop {
				l, r = r, l
			}
			stack[top], stack[top+1] = r, l
			top += 2
		}
		return -1
	}
	if lo > hi {
		return [2]int{lo, hi}
	}
	a := end(false)
	if a < 0 {
		return [2]int{hi + 1, hi}
	}
	return [2]int{a, end(true)}
}

// sumCellNext is bound F-T over the spans of sums in the RC scan of RE
// level re: a span's floors (sumCell) with other (RE's parts floor and
// the emitter term's floor, which hold at this RE) and the utilization
// floors uRE (RE's and the transistor's) and RC's (U-RC at the span's
// least RC: it rises with RC) bound every build whose RC + RE lies in
// the span. It returns the first RC level from rc on that can hold a
// build under bd: in the first span whose floor is at most bd.thr, and a
// level holding a single where a pair's part puts the span's floor over
// (rcHi + 1: none up to rcHi).
func (f *feedbackPlan) sumCellNext(di, rc, rcHi, re int, bd bounds, other, uRE, vceLo, vceHi float64, cnt *counters) int {
	e := f.e
	w, lv := e.s.w, e.vs.levels
	reOhm := lv[re].ohm
	top := lv[rcHi].ohm + reOhm
	G := f.gridIndex(lv[rc].ohm+reOhm) >> sumCellShift
	// where other holds a pair's part (RE's), the links of the spans a
	// pair's part puts over
	links, part := f.spanNext[0], 0.0
	if w.Parts > 0 && other >= w.Parts {
		links, part = f.spanNext[1], w.Parts
	}
	for {
		// skip the spans known to hold nothing that can enter
		G = f.sumCellBase + liveSpan(links, G-f.sumCellBase)
		start := f.gridOhm(G << sumCellShift)
		if start > top {
			return rcHi + 1
		}
		c := f.sumCell(di, G, bd, vceLo, vceHi, cnt)
		if c.qbu+part > bd.thr {
			markDead(links, G-f.sumCellBase)
			G++
			continue
		}
		uP := max(uRE, bd.icLo*bd.icLo*max(lv[rc].ohm, start*(1-1e-12)-reOhm)/e.vs.allowHotMax_W)
		if fl := other + max(c.qbu, c.qb+w.Utilization*uP); fl <= bd.thr {
			// the span can hold a build: its first level from rc on
			// (rc itself, or the first whose sum lies in the span)
			if f.gridIndex(lv[rc].ohm+reOhm)>>sumCellShift < G {
				from := rc
				rc = max(rc+1, e.vs.levelAtOrAbove(start-reOhm))
				for rc-1 > from && f.gridIndex(lv[rc-1].ohm+reOhm)>>sumCellShift >= G {
					rc--
				}
				for rc <= rcHi && f.gridIndex(lv[rc].ohm+reOhm)>>sumCellShift < G {
					rc++
				}
				if rc > rcHi {
					return rc
				}
			}
			if !lv[rc].pairOnly || fl+e.partsFloor(rc) <= bd.thr {
				return rc
			}
			// no room for a pair in RC: the span's first single
			if s := e.vs.nextSingle[rc]; s <= rcHi && f.gridIndex(lv[s].ohm+reOhm)>>sumCellShift == G {
				return s
			}
		}
		G++
	}
}

// liveSpan is the first span from i on (an index of
// feedbackPlan.sumCells) not known to hold nothing that can enter: links
// ties each such span to the next (union-find with path halving); i
// itself where i lies outside.
func liveSpan(links []int32, i int) int {
	if i < 0 || i >= len(links) {
		return i
	}
	for {
		j := int(links[i])
		if j == i || j >= len(links) {
			return j
		}
		k := int(links[j])
		links[i] = int32(k)
		i = k
	}
}

// markDead records in links that span i holds nothing that can enter:
// its floor is over the threshold, which only falls.
func markDead(links []int32, i int) {
	if i >= 0 && i < len(links) {
		links[i] = int32(i + 1)
	}
}

// cornerSlack is the share of the supply added to cornerVCE before its
// headroom floor is taken.
const cornerSlack = 1e-5

// cornerVCE is an upper bound on the lowest worst-case VCE of every build
// of device di whose RC + RE is at least R(g) and RF at most level rf:
// VCE at the corner with hFE max, VBE(on) and VAF low (device.vceLow), the
// hottest ambient, the supply low, RF at the low end of its tolerance and
// RC and RE at the high end (solver.Build.CornerStage), NaN when that
// corner cannot be solved or is not active. As at the nominal point (F-T)
// VCE there depends on RC and RE only through their sum, falls as it
// rises and rises with RF; at the corner the sum is at least
// R(g)·hotHighMin and RF at most R(rf)·hotLowMax (valueSet), and the
// corner is solved there. Solved once per device and point (f.corners).
func (f *feedbackPlan) cornerVCE(di, g, rf int, cnt *counters) float64 {
	return gridMemo(f.corners, g, rf, func() float64 {
		e := f.e
		if !f.cornerSet {
			// the stage at that corner; its resistors are set below
			v0 := e.vs.levels[0].values[0]
			f.corner = e.build(combo{dev: di, val: [maxPos]int{v0, v0, v0}}).CornerStage(e.lay.highEnds(e.lay.lowVCE), false, true, true)
			f.corner.RBypass_Ohm = 0 // AC only
			f.cornerSet = true
		}
		st := f.corner
		sum := f.gridOhm(g) * e.vs.hotHighMin
		st.R_Ohm[solver.RF] = e.vs.levels[rf].ohm * e.vs.hotLowMax
		st.R_Ohm[solver.RC], st.R_Ohm[solver.RE] = sum/2, sum/2
		d := &e.devs[di]
		cnt.solves++
		if op, err := solver.SolveSelfHeated(st, d.vceLow, e.s.ambMax, d.thetaJA, d.tjMax_C); err == nil && op.Region == solver.Active {
			return op.VCE_V
		}
		return math.NaN()
	})
}
