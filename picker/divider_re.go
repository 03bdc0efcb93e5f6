package picker

import (
	"math"

	"biasbin/solver"
)

// searchRE covers every build of device di with RE level re.
func (d *dividerPlan) searchRE(e *evaluator, p *pool, cnt *counters, di, re int, kE, vceLo, vceHi float64) {
	n := len(e.vs.levels)
	w := e.s.w
	dv := &e.devs[di]
	reOhm := e.vs.levels[re].ohm
	// pfRE is RE's parts floor (bound P): every build here carries it.
	pfRE := e.partsFloor(re)
	d.cache.reset()
	guessLo, guessHi := n/2, n/2
	var vbeLo, vbeHi, lastThr float64
	// upSeen and floorSeen hold, per R1 level, the IC at the band's bottom RC and the
	// IC floor over the band seen at the last R2 probed: lower bounds at
	// every larger R2 (IC rises with R2), the floor for a band whose RC
	// levels are among those it was taken over (floorSeen).
	if d.upSeen == nil {
		d.upSeen, d.floorSeen = map[int]float64{}, map[int]bandFloor{}
	}
	upSeen, floorSeen := d.upSeen, d.floorSeen
	clear(upSeen)
	clear(floorSeen)
	lastRcLo := -1
	// reFloors bounds RE's utilization (every build carries RE:
	// icLo²·RE over RE's best allowance) and the emitter term (bound E-RE:
	// VE = IE·RE lies in [icLo·RE, kE·icHi·RE] whatever R1, R2 and RC are)
	// of every build at this RE.
	reFloors := func(bd bounds) (uRE, eLo float64) {
		uRE = bd.icLo * bd.icLo * reOhm / e.vs.levels[re].allowHot_W
		eLo = e.emitterFloor(bd, reOhm, kE)
		return uRE, eLo
	}
	start := 0
	if bd := e.boundsNow(p); bd.finite {
		// Skip the R2 levels that bound U-P settles with the divider's
		// powers (bound U-R2), RC's at the band's bottom (U-RC), RE's
		// utilization and emitter floors and RE's parts floor, each of
		// R1, R2 and RC one part or a pair: the powers fall as R2
		// rises, so the floor does, and the first level it admits is
		// found by bisection.
		lo, hi := e.vbeBounds(dv, bd.icLo, bd.icHi)
		vbLo, vbHi := lo+bd.icLo*reOhm, hi+bd.icHi*kE*reOhm
		uRE, eLo := reFloors(bd)
		pRC := 0.0
		if rcLo, rcHi := e.rcBand(bd, reOhm, 1, kE, vceLo, vceHi); rcLo <= rcHi {
			pRC = bd.icLo * bd.icLo * e.vs.levels[rcLo].ohm
		}
		start = firstLevel(n, func(i int) bool {
			pR2, pR1 := e.dividerPowers(i, vbLo, vbHi)
			return pfRE+e.useAndPartsFloor(uRE, pR2, pR1, pRC)+w.Emitter*eLo <= bd.thr
		})
	}
	// r2Beta bounds the beta term of every build with R2 in levels
	// [first, last] (bound B with R_TH between rthFloor of the first R2,
	// which rises with R2, and the last R2).
	r2Beta := func(bd bounds, first, last, rcLo, rcHi int) float64 {
		if w.Beta == 0 {
			return 0
		}
		vbHi := vbeHi + bd.icHi*kE*reOhm
		return e.betaFloor(dv, betaWindow{RTH: e.rthFloor(e.vs.levels[first].ohm, vbHi, bd.icHi/dv.betaNomMin),
			RTHMax: e.vs.levels[last].ohm, RE: reOhm, RCMin: e.vs.levels[rcLo].ohm, RCMax: e.vs.levels[rcHi].ohm,
			ICLo: bd.icLo, ICHi: bd.icHi})
	}
	// skip is how many R2 levels the next block floor tries to settle at
	// once: it doubles while blocks fall and drops to 1 when one does not.
	// (vbeHi is set by then: skip > 1 only after a level was settled; a
	// value from an earlier, wider IC window is still an upper bound.)
	skip := 1
	r2Lo, r2Hi := e.clampRange(iR2, start, n-1)
	r2BlockEnd, r2BlockB := -1, 0.0
	bandLo, bandHi, bandThr := 0, -1, math.NaN()
	for r2 := r2Lo; r2 <= r2Hi; r2++ {
		if e.stopped() {
			return
		}
		// every tuple below has this R2: the cache holds one R2
		// level's at a time (upSeen and floorSeen keep what carries
		// over)
		d.cache.reset()
		bd := e.boundsNow(p)
		if e.vs.levels[r2].pairOnly && e.singlesOnly(pfRE, bd.thr) {
			r2 = e.vs.nextSingle[r2] - 1 // bound P: no room for a pair in R2
			continue
		}
		if bd.thr != bandThr {
			// the RC band depends on the threshold alone here
			bandLo, bandHi = e.rcBand(bd, reOhm, 1, kE, vceLo, vceHi)
			bandThr = bd.thr
		}
		rcLo, rcHi := bandLo, bandHi
		if rcLo > rcHi {
			break // the band only narrows as the threshold falls
		}
		// pf2 is the parts floor of RE and R2 (bound P).
		pf2 := pfRE + e.partsFloor(r2)
		if skip > 1 && bd.finite && w.Beta > 0 {
			last := min(r2+skip-1, n-1)
			uRE, eLo := reFloors(bd)
			if pfRE+w.Beta*r2Beta(bd, r2, last, rcLo, rcHi)+w.Utilization*uRE+w.Emitter*eLo > bd.thr {
				r2 = last
				skip *= 2
				continue
			}
			skip = 1
		}
		rcSingles := e.singlesOnly(pf2, bd.thr)
		if rcSingles {
			// bound P: no room for a pair in RC either
			rcLo, rcHi = e.vs.up(rcLo, true), e.vs.down(rcHi, true)
			if rcLo > rcHi {
				continue
			}
		}
		r1Lo, r1Hi := e.levelRange(iR1)
		// base is a lower bound on the beta, utilization and emitter
		// terms of every build at this R2:
		// bLo·w_Beta + uBase·w_Utilization + eLo·w_Emitter.
		var base, bLo, uBase, uNoRC, pRC, eLo float64
		if bd.finite && bd.thr != lastThr {
			vbeLo, vbeHi = e.vbeBounds(dv, bd.icLo, bd.icHi)
			lastThr = bd.thr
		}
		if bd.finite {
			// Bounds B (r2Beta), U-RE and E-RE (reFloors) at this R2, and bound
			// U-R2 (divider power, see dividerPowerBound). Once the first
			// three are over the threshold the next R2 levels are tried
			// in growing blocks.
			vbHi := vbeHi + bd.icHi*kE*reOhm
			uDiv := e.dividerPowerBound(r2, vbeLo+bd.icLo*reOhm, vbHi)
			// Bound U-RC: RC carries IC ≥ icLo and is at least the
			// band's bottom level, so it dissipates at least pRC =
			// icLo²·RC_lo (with the best allowance of any value); with
			// U-RE, U-R2, E-RE and bound U-P it may settle the level
			// before bound B is taken.
			var uRE float64
			uRE, eLo = reFloors(bd)
			pRC = bd.icLo * bd.icLo * e.vs.levels[rcLo].ohm
			if pf2+e.useAndPartsFloor(max(uRE, uDiv), pRC)+w.Emitter*eLo > bd.thr {
				// Over the run of pair-only levels up to the next single
				// every build carries the same parts floor pf2 and at least
				// the weak divider power at the run's last level (it falls
				// with R2): when that settles too, the run is stepped over.
				if e.vs.levels[r2].pairOnly {
					end := e.vs.nextSingle[r2] - 1
					if pf2+e.useAndPartsFloor(max(uRE, e.dividerPowerBoundWeak(end, vbeLo+bd.icLo*reOhm, vbHi)), pRC)+w.Emitter*eLo > bd.thr {
						r2 = end
					}
				}
				continue // settled without bound B
			}
			// Bound B is taken per block of r2Block R2 levels: a floor
			// over a wider IC window and RC band (an earlier, higher
			// threshold's) is a floor over this one's builds too, and a
			// floor per level would cost more than the solves it saves.
			if r2 > r2BlockEnd {
				r2BlockEnd = min(r2+r2Block-1, r2Hi)
				r2BlockB = r2Beta(bd, r2, r2BlockEnd, rcLo, rcHi)
			}
			bLo = r2BlockB
			if pfRE+w.Beta*bLo+w.Utilization*uRE+w.Emitter*eLo > bd.thr {
				skip = 2 // try the next levels in blocks
				continue
			}
			// Bound U-Q: the transistor's own dissipation.
			uQ := e.transistorUseFloor(dv, bd, vceLo, pf2+w.Beta*bLo+w.Emitter*eLo)
			uNoRC = max(max(uRE, uDiv), uQ)
			uBase = max(uNoRC, pRC/e.vs.allowHotMax_W)
			// base (the floor scanRC takes, RC open) and baseUP, with
			// RC as one part or a pair (bound U-P), which only cuts.
			base = pf2 + w.Beta*bLo + w.Utilization*uBase + w.Emitter*eLo
			baseUP := pf2 + w.Beta*bLo + e.useAndPartsFloor(uNoRC, pRC) + w.Emitter*eLo
			if baseUP > bd.thr {
				continue
			}
			// What is left of the threshold bounds the QPoint term of
			// every build at this R2, so the IC window narrows to
			// ±(T − base)/w_QPoint.
			icLo, icHi := bd.icLo, bd.icHi
			if w.QPoint > 0 {
				d2 := (bd.thr - baseUP) / w.QPoint
				within := e.boundsWithin(bd.thr, d2)
				icLo, icHi = within.icLo, within.icHi
				// and the RC band narrows to it (bound RC with δ = d2)
				lo, hi := e.rcBandAll(within, reOhm, 1, kE, vceLo, vceHi)
				if rcSingles {
					lo, hi = e.vs.up(lo, true), e.vs.down(hi, true)
				}
				rcLo, rcHi = max(rcLo, lo), min(rcHi, hi)
				if rcLo > rcHi {
					continue
				}
			}
			if rcLo != lastRcLo {
				// upSeen holds IC at the band's bottom RC: only valid for it
				clear(upSeen)
				lastRcLo = rcLo
			}
			// Bound IC-R1 high side: IC(R1, RC) ≤ IC(R1, band bottom) in the band,
			// which falls with R1 (lemmas L1, L2).
			// IC rises with R2 (L1), so an IC seen at a smaller R2
			// bounds this R2's from below and can settle a probe.
			// Bound P: with no room for a pair in R1 only the levels
			// holding a single are probed (the loop below steps over
			// the others).
			singles := e.singlesOnly(baseUP, bd.thr)
			r1Hi = e.vs.firstIn(0, n-1, guessHi, singles, func(i int) bool {
				if v, ok := upSeen[i]; ok && v >= icLo {
					return false
				}
				t := d.tuple(di, [maxPos]int{i, r2, rcLo, re}, cnt)
				if t.ok {
					// saturated at a smaller R2, saturated here too
					// (more base drive): never under any current
					upSeen[i] = math.Inf(1)
					if t.op.Region != solver.Saturation {
						upSeen[i] = t.op.IC_A
					}
				}
				return t.icUnder(icLo)
			}) - 1
			_, r1Hi = e.clampRange(iR1, 0, r1Hi)
			guessHi = r1Hi + 1
			// R1 dissipates at least (VCC − vbHi)²/R1, which falls with
			// R1: at R1 ≤ r1Hi it is at least its value at r1Hi (with the
			// best allowance of any value).
			if r1Hi >= 0 && vbHi < e.s.vcc {
				r1Ohm := e.vs.levels[r1Hi].ohm
				pR1 := (e.s.vcc - vbHi) * (e.s.vcc - vbHi) / r1Ohm
				// with R1 and RC each one part or a pair (bound U-P)
				if pf2+w.Beta*bLo+e.useAndPartsFloor(uNoRC, pRC, pR1)+w.Emitter*eLo > bd.thr {
					continue
				}
			}
			// Bound IC-R1 low side: the lowest IC any build at R1
			// that is active at its nominal point can have (a build
			// whose nominal point is not active fails its bench limit).
			// Only levels up to r1Hi are searched: above it nothing is
			// left to cover, and where none qualifies the range is empty
			// (most visits near the threshold, whose IC window is narrower
			// than one R1 step) at the cost of one probe.
			r1Lo = e.vs.firstIn(0, r1Hi, guessLo, singles, func(i int) bool {
				if f, ok := floorSeen[i]; ok && f.ic > icHi && f.covers(rcLo, rcHi, rcSingles) {
					return false
				}
				ic, any := e.vs.icFloor(func(rc int) *tuple { return d.tuple(di, [maxPos]int{i, r2, rc, re}, cnt) }, rcLo, rcHi, icHi, rcSingles)
				if !any {
					ic = math.Inf(1)
				}
				floorSeen[i] = bandFloor{ic: ic, rcLo: rcLo, rcHi: rcHi, singles: rcSingles}
				return any && ic <= icHi
			})
			guessLo, guessHi = r1Lo, r1Hi+1
			r1Lo, r1Hi = e.clampRange(iR1, r1Lo, r1Hi)
		}
		// The beta floor is taken per block of r1Block R1 levels, with
		// R_TH = R1‖R2 between its values at the block's ends (it rises
		// with R1): a floor per level would cost more than the solves it
		// saves.
		bR1, blockEnd := 0.0, -1
		rthAt := func(r1 int) float64 {
			r1Ohm, r2Ohm := e.vs.levels[r1].ohm, e.vs.levels[r2].ohm
			return r1Ohm * r2Ohm / (r1Ohm + r2Ohm)
		}
		for r1 := r1Lo; r1 <= r1Hi; r1++ {
			if bd.finite && e.vs.levels[r1].pairOnly && e.singlesOnly(base, p.threshold()) {
				r1 = e.vs.nextSingle[r1] - 1 // bound P: no room for a pair in R1
				continue
			}
			b1, use1 := base, 0.0
			if bd.finite {
				// R1 dissipates (VCC − VB)²/R1 ≥ (VCC − vbHi)²/R1.
				r1Ohm := e.vs.levels[r1].ohm
				vbHi := vbeHi + bd.icHi*kE*reOhm
				if w.Beta > 0 && r1 > blockEnd {
					blockEnd = min(r1+r1Block-1, r1Hi)
					bR1 = e.betaFloor(dv, betaWindow{RTH: rthAt(r1), RTHMax: rthAt(blockEnd), RE: reOhm,
						RCMin: e.vs.levels[rcLo].ohm, RCMax: e.vs.levels[rcHi].ohm, ICLo: bd.icLo, ICHi: bd.icHi})
				}
				uR1 := 0.0
				if vbHi < e.s.vcc {
					uR1 = (e.s.vcc - vbHi) * (e.s.vcc - vbHi) / r1Ohm / e.vs.levels[r1].allowHot_W
				}
				use1 = max(uBase, uR1)
				b1 = pf2 + e.partsFloor(r1) + w.Beta*max(bLo, bR1) + w.Utilization*use1 + w.Emitter*eLo
				// bound U-P with RC as one part or a pair
				if b1-w.Utilization*use1+e.useAndPartsFloor(max(uNoRC, uR1), pRC) > p.threshold() {
					continue
				}
			}
			lv := [maxPos]int{r1, r2, 0, re}
			e.scanRC(p, &d.cache, cnt, di, lv, iRC, &d.splitGuess, rcLo, rcHi, vceLo, vceHi, kE, b1, use1)
		}
	}
}

// r1Block is how many R1 levels share one beta floor in searchRE.
const r1Block = 8

// r2Block is how many R2 levels share one beta floor in searchRE (the
// floor over the block's R_TH range is a floor at each of its levels).
const r2Block = 8

// bandFloor is an IC floor over the builds of an RC band at one R1 and R2
// level (valueSet.icFloor): at most the IC of every build in the band
// active at its nominal point, +Inf when none is active.
type bandFloor struct {
	ic         float64
	rcLo, rcHi int  // the band
	singles    bool // taken over the band's singles alone
}

// covers reports whether the floor bounds from below the active builds of
// the band [rcLo, rcHi] (singles alone with singles) at this R1 and a
// larger R2 (IC rises with R2, L1). A band reaching higher, or holding
// pairs where the floor's held singles alone, may have an active build
// with less IC; one reaching lower only adds builds with more IC (L2),
// unless none was active (+Inf): a smaller RC may be.
func (f bandFloor) covers(rcLo, rcHi int, singles bool) bool {
	return rcHi <= f.rcHi && (singles || !f.singles) && (!math.IsInf(f.ic, 1) || rcLo >= f.rcLo)
}
