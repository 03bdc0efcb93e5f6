package picker

import (
	"math"
)

// Positions of a divider build's arrays: R1, R2, RC, RE (dividerLayout).
const (
	iR1 = iota
	iR2
	iRC
	iRE
	nPos
)

// dividerPlan searches R1, R2, RC, RE of a voltage-divider stage.
type dividerPlan struct {
	e *evaluator
	// cache of solved level tuples of the current device and RE
	cache tupleCache
	// splitGuess is where the last RC scan split (a start for the next)
	splitGuess int
	// per-RE memos of searchRE, kept to reuse their storage
	upSeen    map[int]float64
	floorSeen map[int]bandFloor
	// seeds orders the devices and each device's RE levels from its
	// best seed
	seeds seedOrder
}

// tuple returns the (cached) solved level tuple of device dev.
func (d *dividerPlan) tuple(dev int, lv [maxPos]int, cnt *counters) *tuple {
	return d.cache.get(d.e, dev, lv, cnt)
}

// seed evaluates, for every device, hand-method builds: VE = 0.05, 0.1,
// 0.15, 0.2, 0.25, 0.3 and 0.4 of VCC; R_TH = 0.1, 0.03 and 0.3 (hFE min
// + 1)·RE with VBE 0.65 V (common practice); R1 then set by a search for
// the target current, RC for the target VCE, and the 3×3 R1, RC levels
// around them scored; with pairs, once more with every level snapped to
// one holding a single (valueSet.seedSnaps). Like polish it changes only
// the order of the search.
func (d *dividerPlan) seed(p *pool, cnt *counters) {
	e := d.e
	seedByDevice(e, &d.seeds, cnt, func() *dividerPlan { return &dividerPlan{e: e, seeds: d.seeds} },
		func(w *dividerPlan, wc *counters, di int) { w.seedDevice(p, wc, di) })
}

// seedDevice is seed for device di.
func (d *dividerPlan) seedDevice(p *pool, cnt *counters, di int) {
	e := d.e
	n := len(e.vs.levels)
	d.cache.reset()
	dv := &e.devs[di]
	_, vceHi := e.targetBand(dv)
	for _, singles := range e.vs.seedSnaps() {
		for _, veShare := range []float64{0.05, 0.1, 0.15, 0.2, 0.25, 0.3, 0.4} {
			for _, stiff := range []float64{0.1, 0.03, 0.3} {
				ve := e.s.vcc * veShare
				re := clampLevel(e.vs.up(e.vs.levelAtOrAbove(ve/e.s.icT), singles), n)
				rc := clampLevel(e.vs.up(e.vs.levelAtOrAbove((e.s.vcc-vceHi-ve)/e.s.icT), singles), n)
				rth := stiff * (dv.hfeMin + 1) * e.vs.levels[re].ohm
				vb := ve + 0.65
				r2 := clampLevel(e.vs.up(e.vs.levelAtOrAbove(rth*e.s.vcc/(e.s.vcc-vb)), singles), n)
				// R1: first level whose IC is at or below the target.
				r1 := e.vs.firstIn(0, n-1, n/2, singles, func(i int) bool {
					return d.tuple(di, [maxPos]int{i, r2, rc, re}, cnt).icAtMost(e.s.icT)
				})
				r1 = clampLevel(r1, n)
				rc = e.vs.firstIn(0, n-1, rc, singles, func(i int) bool {
					return d.tuple(di, [maxPos]int{r1, r2, i, re}, cnt).vceSolvedAtMost(vceHi)
				})
				rc = clampLevel(rc, n)
				e.vs.eachAround(r1, rc, singles, func(a, c int) {
					e.scoreVariants(d.tuple(di, [maxPos]int{a, r2, c, re}, cnt), p, func(ev *evaluated) {
						d.seeds.note(di, re, ev)
						p.add(ev)
					}, cnt)
				})
			}
		}
	}
}

// search is the branch and bound over (device, RE, R2, R1, RC); doc.go
// states each bound and why it is sound.
func (d *dividerPlan) search(p *pool, cnt *counters) {
	searchByRE(d.e, p, &d.seeds, cnt, func() *dividerPlan { return &dividerPlan{e: d.e} },
		func(w *dividerPlan, wc *counters, di, re int, kE, vceLo, vceHi float64, _ bounds) {
			w.searchRE(w.e, p, wc, di, re, kE, vceLo, vceHi)
		})
}

// emitterFloor is bound E-RE: VE = IE·RE lies in [icLo·RE, kE·icHi·RE]
// whatever the other positions are, so the emitter term of every build at
// this RE is at least its distance from [VE min, VE max] over VCC.
func (e *evaluator) emitterFloor(bd bounds, reOhm, kE float64) float64 {
	return max(0, max(bd.icLo*reOhm-e.s.veHi, e.s.veLo-kE*bd.icHi*reOhm)) / e.s.vcc
}

// reCuts applies the bounds of one RE level (doc.go) for any topology
// whose VCE is at most span − IC·(RC + RE) and whose every build carries
// RE: U-RE (RE dissipates IE²·RE ≥ icLo²·RE), Q-RE (VCE ≤ span −
// icLo·(RCmin + RE)) and, where the emitter band applies, E-RE (VE = IE·RE
// ≥ icLo·RE: the emitter term is at least (icLo·RE − VE max)/VCC). These
// rise with RE: stop is true when one is over the threshold, and no larger
// RE can enter either. skip is true when this RE cannot enter: those, or
// the sum of the floors of different terms — U-RE with this level's own
// allowance, Q-RE, E-RE with its low side (VE = IE·RE ≤ kE·icHi·RE, so the
// emitter term is at least (VE min − kE·icHi·RE)/VCC) and the level's
// parts floor (bound P) — is over it.
func (e *evaluator) reCuts(bd bounds, re int, kE, vceLo float64) (stop, skip bool) {
	if !bd.finite {
		return false, false
	}
	s, w := &e.s, e.s.w
	reOhm := e.vs.levels[re].ohm
	band := e.lay.emitterBand
	q := w.QPoint * (vceLo - (e.span - bd.icLo*(e.vs.levels[0].ohm+reOhm))) / e.span
	eHi := 0.0
	if band {
		eHi = w.Emitter * (bd.icLo*reOhm - s.veHi) / s.vcc
	}
	if w.Utilization*bd.icLo*bd.icLo*reOhm/e.vs.allowHotMax_W > bd.thr || q > bd.thr || eHi > bd.thr {
		return true, true
	}
	// The floors of different terms add up, with this level's parts
	// floor (bound P); none of these need rise with RE, so they only skip.
	uOwn := w.Utilization * bd.icLo * bd.icLo * reOhm / e.vs.levels[re].allowHot_W
	eLo := 0.0
	if band {
		eLo = w.Emitter * (s.veLo - kE*bd.icHi*reOhm) / s.vcc
	}
	if e.partsFloor(re)+uOwn+math.Max(0, q)+math.Max(0, math.Max(eHi, eLo)) > bd.thr {
		return false, true
	}
	return false, false
}

// searchWorkers is the number of goroutines of the default search. The
// result does not depend on it: the pool keeps the exact best builds
// whatever order they arrive in; only the counters of work done vary.
const searchWorkers = 2
