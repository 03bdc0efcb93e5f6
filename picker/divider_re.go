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
	d.cache.reset()
	guessLo, guessHi := n/2, n/2
	var vbeLo, vbeHi, lastThr float64
	// upSeen and floorSeen hold, per R1 level, the IC at the band's bottom RC and the
	// IC floor seen at the last R2 probed: lower bounds at every larger R2
	// (IC rises with R2; the band only narrows, raising the floor).
	if d.upSeen == nil {
		d.upSeen, d.floorSeen = map[int]float64{}, map[int]float64{}
	}
	upSeen, floorSeen := d.upSeen, d.floorSeen
	clear(upSeen)
	clear(floorSeen)
	lastRcLo := -1
	start := 0
	if bd := e.boundsNow(p); bd.finite {
		// Skip the R2 levels whose divider bound, with the best allowance
		// of any value (a weaker bound that falls with R2), is over.
		lo, hi := e.vbeBounds(dv, bd.icLo, bd.icHi)
		vbLo, vbHi := lo+bd.icLo*reOhm, hi+bd.icHi*kE*reOhm
		start = firstLevel(n, func(i int) bool {
			return w.Utilization*e.dividerPowerBoundWeak(i, vbLo, vbHi) <= bd.thr
		})
	}
	// r2Floors bounds, for every build with R2 in levels [first, last],
	// the beta term (bound B with R_TH between rthFloor of the first R2,
	// which rises with R2, and the last R2), RE's utilization (every build
	// carries RE: icLo²·RE over RE's best allowance) and the emitter term
	// (bound E-RE: VE = IE·RE lies in [icLo·RE, kE·icHi·RE] whatever R1, R2
	// and RC are).
	r2Floors := func(bd bounds, first, last, rcLo, rcHi int) (bLo, uRE, eLo float64) {
		if w.Beta > 0 {
			vbHi := vbeHi + bd.icHi*kE*reOhm
			bLo = e.betaFloor(dv, betaWindow{RTH: e.rthFloor(e.vs.levels[first].ohm, vbHi, bd.icHi/dv.betaNomMin),
				RTHMax: e.vs.levels[last].ohm, RE: reOhm, RCMin: e.vs.levels[rcLo].ohm, RCMax: e.vs.levels[rcHi].ohm,
				ICLo: bd.icLo, ICHi: bd.icHi})
		}
		uRE = bd.icLo * bd.icLo * reOhm / e.vs.levels[re].allowHot_W
		eLo = math.Max(0, math.Max(bd.icLo*reOhm-e.s.veHi, e.s.veLo-kE*bd.icHi*reOhm)) / e.s.vcc
		return bLo, uRE, eLo
	}
	// skip is how many R2 levels the next block floor tries to settle at
	// once: it doubles while blocks fall and drops to 1 when one does not.
	// (vbeHi is set by then: skip > 1 only after a level was settled; a
	// value from an earlier, wider IC window is still an upper bound.)
	skip := 1
	for r2 := start; r2 < n; r2++ {
		bd := e.boundsNow(p)
		rcLo, rcHi := e.rcBand(bd, reOhm, kE, vceLo, vceHi)
		if rcLo > rcHi {
			break // the band only narrows as the threshold falls
		}
		if skip > 1 && bd.finite && w.Beta > 0 {
			last := min(r2+skip-1, n-1)
			if bLo, uRE, eLo := r2Floors(bd, r2, last, rcLo, rcHi); w.Beta*bLo+w.Utilization*uRE+w.Emitter*eLo > bd.thr {
				r2 = last
				skip *= 2
				continue
			}
			skip = 1
		}
		if rcLo != lastRcLo {
			// upSeen holds IC at the band's bottom RC: only valid for it
			clear(upSeen)
			lastRcLo = rcLo
		}
		r1Lo, r1Hi := 0, n-1
		// base is a lower bound on the beta, utilization and emitter
		// terms of every build at this R2:
		// bLo·w_Beta + uBase·w_Utilization + eLo·w_Emitter.
		var base, bLo, uBase, eLo float64
		if bd.finite && bd.thr != lastThr {
			vbeLo, vbeHi = e.vbeBounds(dv, bd.icLo, bd.icHi)
			lastThr = bd.thr
		}
		if bd.finite {
			// Bounds B, U-RE and E-RE at this R2 (r2Floors), and bound
			// U-R2 (divider power, see dividerPowerBound). Once the first
			// three are over the threshold the next R2 levels are tried
			// in growing blocks.
			vbHi := vbeHi + bd.icHi*kE*reOhm
			uDiv := e.dividerPowerBound(r2, vbeLo+bd.icLo*reOhm, vbHi)
			var uRE float64
			bLo, uRE, eLo = r2Floors(bd, r2, r2, rcLo, rcHi)
			if w.Beta*bLo+w.Utilization*uRE+w.Emitter*eLo > bd.thr {
				skip = 2 // try the next levels in blocks
				continue
			}
			uBase = math.Max(uRE, uDiv)
			base = w.Beta*bLo + w.Utilization*uBase + w.Emitter*eLo
			if base > bd.thr {
				continue
			}
			// What is left of the threshold bounds the QPoint term of
			// every build at this R2, so the IC window narrows to
			// ±(T − base)/w_QPoint.
			icLo, icHi := bd.icLo, bd.icHi
			if w.QPoint > 0 {
				d2 := (bd.thr - base) / w.QPoint
				icLo, icHi = e.s.icT*math.Max(0, 1-d2), e.s.icT*(1+d2)
			}
			// Bound IC-R1 high side: IC(R1, RC) ≤ IC(R1, band bottom) in the band,
			// which falls with R1 (lemmas L1, L2).
			// IC rises with R2 (L1), so an IC seen at a smaller R2
			// bounds this R2's from below and can settle a probe.
			r1Hi = firstFrom(n, guessHi, func(i int) bool {
				if v, ok := upSeen[i]; ok && v >= icLo {
					return false
				}
				t := d.tuple(di, [maxPos]int{i, r2, rcLo, re}, cnt)
				if t.ok {
					upSeen[i] = t.op.IC_A
				}
				return t.ok && t.op.IC_A < icLo
			}) - 1
			// R1 dissipates at least (VCC − vbHi)²/R1, which falls with
			// R1: at R1 ≤ r1Hi it is at least its value at r1Hi (with the
			// best allowance of any value).
			if r1Hi >= 0 && vbHi < e.s.vcc {
				r1Ohm := e.vs.levels[r1Hi].ohm
				uR1 := (e.s.vcc - vbHi) * (e.s.vcc - vbHi) / r1Ohm / e.vs.allowHotMax_W
				if w.Beta*bLo+w.Utilization*math.Max(uBase, uR1)+w.Emitter*eLo > bd.thr {
					continue
				}
			}
			// Bound IC-R1 low side: the lowest IC any build at R1
			// that is active at its nominal point can have (a build
			// whose nominal point is not active fails its bench limit).
			r1Lo = firstFrom(n, guessLo, func(i int) bool {
				if v, ok := floorSeen[i]; ok && v > icHi {
					return false
				}
				ic, any := d.icFloor(di, i, r2, re, rcLo, rcHi, icHi, cnt)
				if !any {
					ic = math.Inf(1)
				}
				floorSeen[i] = ic
				return any && ic <= icHi
			})
			guessLo, guessHi = r1Lo, r1Hi+1
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
			b1 := base
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
				b1 = w.Beta*math.Max(bLo, bR1) + w.Utilization*math.Max(uBase, uR1) + w.Emitter*eLo
			}
			d.scanRC(e, p, cnt, di, r1, r2, re, rcLo, rcHi, vceLo, vceHi, kE, b1)
		}
	}
}

// r1Block is how many R1 levels share one beta floor in searchRE.
const r1Block = 8

// icFloor is the lower envelope of the nominal IC over the builds at
// (R1, R2, RE) with RC in [rcLo, rcHi] that are active at their nominal
// point: IC falls with RC (lemma L2) and saturation only deepens with RC,
// so it is IC at the largest band RC whose nominal point is active. any
// is false when no band RC is active (every such build fails a hard
// limit).
func (d *dividerPlan) icFloor(di, r1, r2, re, rcLo, rcHi int, icHi float64, cnt *counters) (ic float64, any bool) {
	probe := func(rc int) *tuple { return d.tuple(di, [maxPos]int{r1, r2, rc, re}, cnt) }
	top := probe(rcHi)
	if top.ok && top.op.Region != solver.Saturation {
		return top.op.IC_A, true
	}
	// Saturated at the top of the band. If the bottom is saturated too,
	// so is every band RC; if the bottom is active with IC at most icHi,
	// the floor (IC at the last active RC, at most IC at the bottom) is
	// too, which is all the caller asks.
	if bot := probe(rcLo); bot.ok {
		if bot.op.Region == solver.Saturation {
			return 0, false
		}
		if bot.op.IC_A <= icHi {
			return bot.op.IC_A, true
		}
	}
	// first band RC that saturates; the one below it is the last active
	k := rcLo + firstLevel(rcHi-rcLo+1, func(i int) bool {
		t := probe(rcLo + i)
		return t.ok && t.op.Region == solver.Saturation
	})
	if k == rcLo {
		return 0, false
	}
	t := probe(k - 1)
	if !t.ok {
		return 0, true
	}
	return t.op.IC_A, true
}

// scanRC scores the RC levels of one (R1, R2, RE) outward from the VCE
// target: VCE falls with RC (lemma L2), so below the first RC whose VCE is
// at or under the top of the target band the VCE term only grows going
// down, and from it upward only grows once VCE is under the bottom of the
// band. IC falls with RC too, so going down an IC already over the target
// only moves further off, and going up one already under it likewise.
func (d *dividerPlan) scanRC(e *evaluator, p *pool, cnt *counters, di, r1, r2, re, rcLo, rcHi int, vceLo, vceHi, kE, base float64) {
	w, vcc, ict := e.s.w, e.s.vcc, e.s.icT
	tup := func(rc int) *tuple { return d.tuple(di, [maxPos]int{r1, r2, rc, re}, cnt) }
	reOhm := e.vs.levels[re].ohm
	// IC at the band's bottom bounds IC at every band RC from above and, for builds active
	// at their nominal point, IC at the top of the band bounds it from
	// below (lemma L2); both are usually solved already by the R1 range
	// search. With them VCE = VCC − IC·RC − IE·RE is bounded before a
	// solve: VCE ≥ VCC − icUp(RC + kE·RE) and VCE ≤ VCC − icDn(RC + RE).
	icUp, icDn := math.Inf(1), 0.0
	if t, ok := d.cache.peek([maxPos]int{r1, r2, rcLo, re}); ok && t.ok {
		icUp = t.op.IC_A
	}
	if t, ok := d.cache.peek([maxPos]int{r1, r2, rcHi, re}); ok && t.ok && t.op.Region == solver.Active {
		icDn = t.op.IC_A
	}
	// the QPoint term's IC part is at least the envelope's distance
	// from the target; with the other terms' floor that may settle it
	if base+w.QPoint*math.Max(0, math.Max(icDn-ict, ict-icUp))/ict > p.threshold() {
		return
	}
	split := rcLo + firstFrom(rcHi-rcLo+1, d.splitGuess-rcLo, func(i int) bool { return tup(rcLo + i).vceAtMost(vceHi) })
	d.splitGuess = split
	for rc := split - 1; rc >= rcLo; rc-- {
		rcOhm := e.vs.levels[rc].ohm
		if vceMin := vcc - icUp*(rcOhm+kE*reOhm); base+w.QPoint*(vceMin-vceHi)/vcc > p.threshold() {
			break
		}
		t := tup(rc)
		if t.ok {
			icOff := math.Max(0, math.Max(t.op.IC_A-ict, ict-icUp)) / ict
			if base+w.QPoint*((t.op.VCE_V-vceHi)/vcc+icOff) > p.threshold() {
				break
			}
		}
		e.scoreVariants(t, p.threshold, p.lastScore, p.add, cnt)
	}
	for rc := split; rc <= rcHi; rc++ {
		rcOhm := e.vs.levels[rc].ohm
		if vceMax := vcc - icDn*(rcOhm+reOhm); base+w.QPoint*(vceLo-vceMax)/vcc > p.threshold() {
			break
		}
		t := tup(rc)
		if t.ok && base+w.QPoint*((vceLo-t.op.VCE_V)/vcc+math.Max(0, ict-t.op.IC_A)/ict) > p.threshold() {
			break
		}
		e.scoreVariants(t, p.threshold, p.lastScore, p.add, cnt)
	}
}
