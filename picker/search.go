package picker

import (
	"cmp"
	"math"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"

	"biasbin/solver"
)

// plan is the search over one topology's positions. Each topology
// provides one; the divider is the first (collector feedback and split
// supply add their own plans over RF/RC/RE and RB/RC/RE).
type plan interface {
	// seed evaluates a few hand-method builds per device so the pool
	// fills early and the bounds start tight.
	seed(e *evaluator, p *pool, cnt *counters)
	// polish improves on the seeds by local moves (order only).
	polish(e *evaluator, p *pool, cnt *counters)
	// search covers every build: evaluating it or proving by a bound that
	// it cannot enter the pool.
	search(e *evaluator, p *pool, cnt *counters)
	// exhaustive evaluates every build (the nominal point of each level
	// tuple at least), with no region pruning.
	exhaustive(e *evaluator, p *pool, cnt *counters)
}

// planFor returns the search plan of a topology.
func planFor(e *evaluator) plan {
	return &dividerPlan{e: e}
}

// progress reports the search's progress when the request asks for it.
func (e *evaluator) progress(done, total int64) {
	if e.s.req.Progress != nil {
		e.s.req.Progress(done, total)
	}
}

// allLevelsExhaustive runs every level tuple of a device.
func (d *dividerPlan) exhaustive(e *evaluator, p *pool, cnt *counters) {
	n := len(e.vs.levels)
	total := int64(len(e.devs) * n)
	for di := range e.devs {
		for re := range n {
			e.progress(int64(di*n+re), total)
			for r2 := range n {
				for r1 := range n {
					for rc := range n {
						t := e.newTuple(di, [nPos]int{r1, r2, rc, re})
						cnt.solves++
						e.scoreVariants(t, p.threshold, p.lastScore, p.add, cnt)
					}
				}
			}
		}
	}
	e.progress(total, total)
}

// dividerPlan searches R1, R2, RC, RE of a voltage-divider stage.
type dividerPlan struct {
	e *evaluator
	// cache of solved level tuples of the current device and RE
	cache map[[nPos]int]*tuple
	// splitGuess is where the last RC scan split (a start for the next)
	splitGuess int
	// per-RE memos of searchRE, kept to reuse their storage
	upSeen, floorSeen map[int]float64
	// slab holds the cached tuples; used counts the ones in use
	slab [][]tuple
	used int
	// best passing seed score and its RE level per device: the search
	// visits devices from the best seed and each device's RE levels
	// outward from its best seed (any order is sound; this one tightens
	// the threshold early).
	seedBest []float64
	seedRE   []int
}

// resetCache empties the tuple cache, keeping its storage.
func (d *dividerPlan) resetCache() {
	if d.cache == nil {
		d.cache = map[[nPos]int]*tuple{}
	}
	clear(d.cache)
	d.used = 0
}

// tuple returns the (cached) solved level tuple of device dev.
func (d *dividerPlan) tuple(dev int, lv [nPos]int, cnt *counters) *tuple {
	if t, ok := d.cache[lv]; ok {
		return t
	}
	t := d.alloc()
	d.e.solveTuple(t, dev, lv)
	cnt.solves++
	d.cache[lv] = t
	return t
}

// slabChunk is the number of tuples allocated at once for the cache.
const slabChunk = 1024

// alloc returns storage for one cached tuple, reused after resetCache
// (nothing keeps a tuple pointer beyond the cache).
func (d *dividerPlan) alloc() *tuple {
	k, i := d.used/slabChunk, d.used%slabChunk
	if k == len(d.slab) {
		d.slab = append(d.slab, make([]tuple, slabChunk))
	}
	d.used++
	return &d.slab[k][i]
}

// targetBand returns bounds on the VCE target over all builds of device
// dev: the request's VCE, the mid-point rule without load and bypass, and
// [VCE(sat), mid-point] otherwise (the swing rule's r_ac/(R_dc+r_ac) lies
// in (0, 1/2] because r_ac ≤ R_dc).
func (e *evaluator) targetBand(dv *device) (lo, hi float64) {
	if e.s.vceT > 0 {
		return e.s.vceT, e.s.vceT
	}
	mid := (e.s.vcc + dv.vceSat) / 2
	if e.s.rl == 0 && !e.s.bypass {
		return mid, mid
	}
	return dv.vceSat, mid
}

// seed evaluates, for every device, hand-method builds: VE = 0.1, 0.2,
// 0.3, 0.4 and 0.05 of VCC; R_TH = 0.1, 0.03 and 0.3 (hFE min + 1)·RE with
// VBE 0.65 V (common practice); R1 then set by a search for the target
// current, RC for the target VCE, and the 3×3 R1, RC levels around them
// scored. Like polish it changes only the order of the search.
func (d *dividerPlan) seed(e *evaluator, p *pool, cnt *counters) {
	n := len(e.vs.levels)
	if n == 0 {
		return
	}
	d.seedBest = make([]float64, len(e.devs))
	d.seedRE = make([]int, len(e.devs))
	for di := range e.devs {
		d.resetCache()
		dv := &e.devs[di]
		_, vceHi := e.targetBand(dv)
		d.seedBest[di] = math.Inf(1)
		for _, veShare := range []float64{0.1, 0.2, 0.3, 0.4, 0.05} {
			for _, stiff := range []float64{0.1, 0.03, 0.3} {
				ve := e.s.vcc * veShare
				re := clampLevel(e.vs.levelAtOrAbove(ve/e.s.icT), n)
				rc := clampLevel(e.vs.levelAtOrAbove((e.s.vcc-vceHi-ve)/e.s.icT), n)
				rth := stiff * (dv.hfeMin + 1) * e.vs.levels[re].ohm
				vb := ve + 0.65
				r2 := clampLevel(e.vs.levelAtOrAbove(rth*e.s.vcc/(e.s.vcc-vb)), n)
				// R1: first level whose IC is at or below the target.
				r1 := firstLevel(n, func(i int) bool {
					return d.tuple(di, [nPos]int{i, r2, rc, re}, cnt).icAtMost(e.s.icT)
				})
				r1 = clampLevel(r1, n)
				rc = firstLevel(n, func(i int) bool {
					return d.tuple(di, [nPos]int{r1, r2, i, re}, cnt).vceAtMost(vceHi)
				})
				for a := max(r1-1, 0); a <= min(r1+1, n-1); a++ {
					for c := max(rc-1, 0); c <= min(rc+1, n-1); c++ {
						e.scoreVariants(d.tuple(di, [nPos]int{a, r2, c, re}, cnt), p.threshold, p.lastScore, func(ev *evaluated) {
							if len(ev.failing) == 0 && ev.score < d.seedBest[di] {
								d.seedBest[di], d.seedRE[di] = ev.score, re
							}
							p.add(ev)
						}, cnt)
					}
				}
			}
		}
	}
}

// polish hill-climbs from the best passing builds in the pool: each
// round moves one position one level up or down to the neighbour with the
// best score, until no neighbour improves (at most maxPolishSteps rounds
// per start). Every build it scores goes to the pool, so the threshold
// falls early; it changes nothing but the order of the search.
func (d *dividerPlan) polish(e *evaluator, p *pool, cnt *counters) {
	n := len(e.vs.levels)
	type start struct {
		c     combo
		score float64
	}
	var starts []start
	for _, it := range p.items {
		if len(it.failing) == 0 && len(starts) < polishStarts {
			starts = append(starts, start{it.c, it.score})
		}
	}
	for _, st := range starts {
		c := st.c
		d.resetCache()
		best := st.score
		cur := c.lv
		for range maxPolishSteps {
			next, nextScore := cur, best
			for pos := range nPos {
				for _, step := range []int{-1, 1} {
					lv := cur
					lv[pos] += step
					if lv[pos] < 0 || lv[pos] >= n {
						continue
					}
					t := d.tuple(c.dev, lv, cnt)
					e.scoreVariants(t, p.threshold, p.lastScore, func(ev *evaluated) {
						p.add(ev)
						if len(ev.failing) == 0 && ev.score < nextScore {
							next, nextScore = lv, ev.score
						}
					}, cnt)
				}
			}
			if nextScore >= best {
				break
			}
			cur, best = next, nextScore
		}
	}
}

// Hill-climbing limits of polishSeeds.
const (
	polishStarts   = 5
	maxPolishSteps = 40
)

// clampLevel keeps a level index inside [0, n).
func clampLevel(i, n int) int { return max(0, min(i, n-1)) }

// firstLevel returns the first index in [0, n) where the monotone
// predicate f turns true (n when it never does): a binary search.
func firstLevel(n int, f func(int) bool) int {
	lo, hi := 0, n
	for lo < hi {
		m := int(uint(lo+hi) >> 1)
		if f(m) {
			hi = m
		} else {
			lo = m + 1
		}
	}
	return lo
}

// icAtMost reports whether the tuple's nominal IC is at most ic; a tuple
// that could not be solved counts as "at most" (it never bounds).
func (t *tuple) icAtMost(ic float64) bool { return !t.ok || t.op.IC_A <= ic }

// vceAtMost reports whether the tuple's nominal VCE is at most v.
func (t *tuple) vceAtMost(v float64) bool { return !t.ok || t.op.VCE_V <= v }

// bounds are the threshold-derived limits in force at one point of the
// search: any build that can still enter the pool has its nominal IC in
// [icLo, icHi] and its nominal VCE within delta·VCC of its target.
type bounds struct {
	thr, delta, icLo, icHi float64
	finite                 bool
}

// boundsNow derives the limits from the pool's current threshold.
func (e *evaluator) boundsNow(p *pool) bounds {
	b := bounds{thr: p.threshold(), delta: math.Inf(1)}
	if e.s.w.QPoint > 0 && !math.IsInf(b.thr, 1) {
		b.delta = b.thr / e.s.w.QPoint
		b.finite = true
	}
	b.icLo = e.s.icT * math.Max(0, 1-b.delta)
	b.icHi = e.s.icT * (1 + b.delta)
	return b
}

// rcBand returns the RC levels whose builds can have a nominal VCE within
// delta·VCC of the target band (bound RC, doc.go): with IC in
// [icLo, icHi] and IE in [IC, kE·IC], VCE = VCC − IC·RC − IE·RE lies in
// [VCC − icHi(RC + kE·RE), VCC − icLo(RC + RE)].
func (e *evaluator) rcBand(b bounds, reOhm, kE, vceLo, vceHi float64) (lo, hi int) {
	n := len(e.vs.levels)
	if !b.finite {
		return 0, n - 1
	}
	vcc := e.s.vcc
	lo = e.vs.levelAtOrAbove((vcc-vceHi-b.delta*vcc)/b.icHi - kE*reOhm)
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

// search is the branch and bound over (device, RE, R2, R1, RC); doc.go
// states each bound and why it is sound.
func (d *dividerPlan) search(e *evaluator, p *pool, cnt *counters) {
	n := len(e.vs.levels)
	if n == 0 {
		return
	}
	s := &e.s
	w := s.w
	order := make([]int, len(e.devs))
	for i := range order {
		order[i] = i
	}
	if len(d.seedBest) == len(e.devs) {
		slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(d.seedBest[a], d.seedBest[b]) })
	}
	// The work: per device, RE levels from the best seed upward, then
	// downward below it. Workers take items in this order; an upward run
	// ends for everyone once one RE in it fails a bound that rises with
	// RE (U-RE, Q-RE), whatever worker found it.
	type item struct {
		di, re int
		up     bool
	}
	var items []item
	for _, di := range order {
		start := 0
		if len(d.seedRE) == len(e.devs) {
			start = d.seedRE[di]
		}
		for re := start; re < n; re++ {
			items = append(items, item{di, re, true})
		}
		for re := start - 1; re >= 0; re-- {
			items = append(items, item{di, re, false})
		}
	}
	upStop := make([]atomic.Int64, len(e.devs))
	for i := range upStop {
		upStop[i].Store(int64(n))
	}
	total := int64(len(items))
	var next atomic.Int64
	var progressMu sync.Mutex
	worker := func(wd *dividerPlan, wc *counters) {
		for {
			i := next.Add(1) - 1
			if i >= total {
				return
			}
			it := items[i]
			if i%64 == 0 {
				progressMu.Lock()
				e.progress(i, total)
				progressMu.Unlock()
			}
			if it.up && int64(it.re) >= upStop[it.di].Load() {
				continue
			}
			dv := &e.devs[it.di]
			vceLo, vceHi := e.targetBand(dv)
			kE := 1 + 1/dv.betaNomMin // IE ≤ kE·IC at the nominal point
			bd := e.boundsNow(p)
			reOhm := e.vs.levels[it.re].ohm
			if bd.finite {
				// Bound U-RE: P(RE) = IE²·RE ≥ icLo²·RE. Bound Q-RE:
				// VCE ≤ VCC − IC·(RC + RE) ≤ VCC − icLo·(RCmin + RE).
				// Bound E-RE: VE = IE·RE ≥ icLo·RE, so the emitter term
				// is at least (icLo·RE − VE max)/VCC. All rise with RE.
				if w.Utilization*bd.icLo*bd.icLo*reOhm/e.vs.allowHotMax_W > bd.thr ||
					w.QPoint*(vceLo-(s.vcc-bd.icLo*(e.vs.levels[0].ohm+reOhm)))/s.vcc > bd.thr ||
					w.Emitter*(bd.icLo*reOhm-s.veHi)/s.vcc > bd.thr {
					if it.up {
						for {
							cur := upStop[it.di].Load()
							if int64(it.re) >= cur || upStop[it.di].CompareAndSwap(cur, int64(it.re)) {
								break
							}
						}
					}
					continue
				}
				if w.Utilization*bd.icLo*bd.icLo*reOhm/e.vs.levels[it.re].allowHot_W > bd.thr {
					continue
				}
				// Bound E-RE, low side: VE = IE·RE ≤ kE·icHi·RE, so the
				// emitter term is at least (VE min − kE·icHi·RE)/VCC.
				if w.Emitter*(s.veLo-kE*bd.icHi*reOhm)/s.vcc > bd.thr {
					continue
				}
			}
			wd.searchRE(e, p, wc, it.di, it.re, kE, vceLo, vceHi)
		}
	}
	workers := max(1, min(searchWorkers, runtime.GOMAXPROCS(0)))
	var wg sync.WaitGroup
	wcnt := make([]counters, workers)
	for k := range workers {
		wd := &dividerPlan{e: e}
		wg.Go(func() { worker(wd, &wcnt[k]) })
	}
	wg.Wait()
	for _, c := range wcnt {
		cnt.evaluated += c.evaluated
		cnt.solves += c.solves
	}
	e.progress(total, total)
}

// searchWorkers is the number of goroutines of the default search. The
// result does not depend on it: the pool keeps the exact best builds
// whatever order they arrive in; only the counters of work done vary.
const searchWorkers = 2

// searchRE covers every build of device di with RE level re.
func (d *dividerPlan) searchRE(e *evaluator, p *pool, cnt *counters, di, re int, kE, vceLo, vceHi float64) {
	n := len(e.vs.levels)
	w := e.s.w
	dv := &e.devs[di]
	reOhm := e.vs.levels[re].ohm
	d.resetCache()
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
				t := d.tuple(di, [nPos]int{i, r2, rcLo, re}, cnt)
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
	probe := func(rc int) *tuple { return d.tuple(di, [nPos]int{r1, r2, rc, re}, cnt) }
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
	tup := func(rc int) *tuple { return d.tuple(di, [nPos]int{r1, r2, rc, re}, cnt) }
	reOhm := e.vs.levels[re].ohm
	// IC at the band's bottom bounds IC at every band RC from above and, for builds active
	// at their nominal point, IC at the top of the band bounds it from
	// below (lemma L2); both are usually solved already by the R1 range
	// search. With them VCE = VCC − IC·RC − IE·RE is bounded before a
	// solve: VCE ≥ VCC − icUp(RC + kE·RE) and VCE ≤ VCC − icDn(RC + RE).
	icUp, icDn := math.Inf(1), 0.0
	if t, ok := d.cache[[nPos]int{r1, r2, rcLo, re}]; ok && t.ok {
		icUp = t.op.IC_A
	}
	if t, ok := d.cache[[nPos]int{r1, r2, rcHi, re}]; ok && t.ok && t.op.Region == solver.Active {
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
