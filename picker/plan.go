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
// provides one (doc.go, "Search", says what a plan must guarantee); the
// exhaustive evaluation and the hill-climb are shared by all.
type plan interface {
	// seed evaluates a few hand-method builds per device so the pool
	// fills early and the bounds start tight.
	seed(p *pool, cnt *counters)
	// search covers every build: evaluating it or proving by a bound that
	// it cannot enter the pool.
	search(p *pool, cnt *counters)
}

// stopped reports whether Request.TimeLimit has run out; a search that
// sees it leaves its work and notes that it did (Result.Ranking.Stopped).
func (e *evaluator) stopped() bool {
	if e.s.stop == nil || !e.s.stop.Load() {
		return false
	}
	e.s.hit.Store(true)
	return true
}

// planFor returns the search plan of the evaluator's topology.
func planFor(e *evaluator) plan {
	switch e.lay.topo {
	case solver.CollectorFeedback:
		return &feedbackPlan{e: e}
	case solver.SplitSupply:
		return &splitPlan{e: e}
	}
	return &dividerPlan{e: e}
}

// searchByRE runs a plan's search of one RE level of one device (visit)
// for every device and RE level on the search's workers, each with a plan
// of its own that newWorker makes (so a tuple cache of its own). Each
// device's run is its RE levels from its best seed upward, then downward
// below it. A worker takes the next device's run not yet begun, in the
// order of the best seeds (seedOrder), and works through it level by
// level; once every run has begun, it joins the run with the most levels
// left, so the last device's search is shared too. An upward run ends
// for everyone once one RE in it fails a bound that rises with RE
// (reCuts' stop), whatever worker found it; a level reCuts skips is not
// visited. visit gets the device's VCE target band, kE = 1 + 1/β_min
// (IE ≤ kE·IC at the nominal point) and the bounds in force. The result
// does not depend on which worker takes what (onWorkers).
func searchByRE[P any](e *evaluator, p *pool, so *seedOrder, cnt *counters, newWorker func() P,
	visit func(w P, wc *counters, di, re int, kE, vceLo, vceHi float64, bd bounds)) {
	n := len(e.vs.levels)
	if n == 0 {
		return
	}
	type run struct {
		di   int
		res  []int // RE levels in order
		up   int   // res[:up] is the upward run
		next atomic.Int64
		// stop is the least level of the upward run that reCuts stopped
		stop atomic.Int64
	}
	reLo, reHi := e.levelRange(e.lay.re)
	order := so.order(len(e.devs))
	runs := make([]run, len(order))
	total := int64(0)
	for k, di := range order {
		r := &runs[k]
		r.di = di
		start := max(reLo, min(so.start(di), reHi))
		for re := start; re <= reHi; re++ {
			r.res = append(r.res, re)
		}
		r.up = len(r.res)
		for re := start - 1; re >= reLo; re-- {
			r.res = append(r.res, re)
		}
		r.stop.Store(int64(n))
		total += int64(len(r.res))
	}
	var begun, done atomic.Int64
	var progressMu sync.Mutex
	// item visits level i of run r
	item := func(w P, wc *counters, r *run, i int) {
		if d := done.Add(1); d%64 == 0 {
			progressMu.Lock()
			e.progress(d, total)
			progressMu.Unlock()
		}
		re := r.res[i]
		up := i < r.up
		if up && int64(re) >= r.stop.Load() {
			return
		}
		dv := &e.devs[r.di]
		vceLo, vceHi := e.targetBand(dv)
		kE := 1 + 1/dv.betaNomMin
		bd := e.boundsNow(p)
		if stop, skip := e.reCuts(bd, re, kE, vceLo); skip {
			for stop && up {
				cur := r.stop.Load()
				if int64(re) >= cur || r.stop.CompareAndSwap(cur, int64(re)) {
					break
				}
			}
			return
		}
		visit(w, wc, r.di, re, kE, vceLo, vceHi, bd)
	}
	workers := max(1, min(searchWorkers, runtime.GOMAXPROCS(0)))
	e.onWorkers(workers, cnt, func(_, _ int, wc *counters) {
		w := newWorker()
		var r *run
		for !e.stopped() {
			if r != nil {
				if i := int(r.next.Add(1) - 1); i < len(r.res) {
					item(w, wc, r, i)
					continue
				}
			}
			// this run is done: begin the next, else join the one with
			// the most levels left
			if k := int(begun.Add(1) - 1); k < len(runs) {
				r = &runs[k]
				continue
			}
			r = nil
			most := 0
			for k := range runs {
				if left := len(runs[k].res) - int(runs[k].next.Load()); left > most {
					r, most = &runs[k], left
				}
			}
			if r == nil {
				break
			}
		}
	})
	e.progress(total, total)
}

// seedByDevice resets so and runs a plan's seeding of one device (seed)
// for every device on the search's workers (onWorkers), each with a plan
// of its own that newWorker makes (sharing so, of which a seed notes only
// its own device's entries), without reporting progress (that is the
// search's).
func seedByDevice[P any](e *evaluator, so *seedOrder, cnt *counters, newWorker func() P, seed func(w P, cnt *counters, di int)) {
	so.reset(len(e.devs))
	if len(e.vs.levels) == 0 {
		return
	}
	workers := make([]P, searchWorkers)
	for k := range workers {
		workers[k] = newWorker()
	}
	e.onWorkers(len(e.devs), cnt, func(k, di int, wc *counters) { seed(workers[k], wc, di) })
}

// onWorkers runs fn for every item 0..n−1 (a device, a shown build, a
// start of polish, or one of searchByRE's worker loops), each going to the
// next free worker (at most searchWorkers goroutines, numbered from 0),
// with counters of its own that are added to cnt at the end. The result
// does not depend on the order the items finish in: the pool keeps the
// exact best builds whatever order they arrive in.
func (e *evaluator) onWorkers(n int, cnt *counters, fn func(worker, item int, wc *counters)) {
	workers := max(1, min(searchWorkers, runtime.GOMAXPROCS(0), n))
	var next atomic.Int64
	wcnt := make([]counters, workers)
	var wg sync.WaitGroup
	for k := range workers {
		wg.Go(func() {
			for i := int(next.Add(1) - 1); i < n; i = int(next.Add(1) - 1) {
				fn(k, i, &wcnt[k])
			}
		})
	}
	wg.Wait()
	for _, c := range wcnt {
		cnt.evaluated += c.evaluated
		cnt.solves += c.solves
	}
}

// progress reports the search's progress when the request asks for it.
func (e *evaluator) progress(done, total int64) {
	if e.s.progress != nil {
		e.s.progress.report(e.slot, done, total)
	} else if e.s.req.Progress != nil {
		e.s.req.Progress(done, total)
	}
}

// progressSum reports the progress of several searches run at once (one
// per topology) through one callback, one call at a time: the steps done
// and, once every search has counted its steps, their total (0 before:
// unknown, so the share never runs backwards).
type progressSum struct {
	mu          sync.Mutex
	fn          func(done, total int64)
	done, total []int64
}

// newProgressSum gathers n searches' progress for fn.
func newProgressSum(fn func(done, total int64), n int) *progressSum {
	return &progressSum{fn: fn, done: make([]int64, n), total: make([]int64, n)}
}

// report records search i's progress and passes on the sum.
func (ps *progressSum) report(i int, done, total int64) {
	ps.mu.Lock()
	defer ps.mu.Unlock()
	ps.done[i], ps.total[i] = done, total
	var d, t int64
	for k := range ps.done {
		d += ps.done[k]
		if t >= 0 && ps.total[k] > 0 {
			t += ps.total[k]
		} else {
			t = -1
		}
	}
	ps.fn(d, max(t, 0))
}

// exhaustive evaluates every build of every device: the nominal point of
// each level tuple, and every value combination of it, with no bound but
// the exact per-build ones of scoreVariants.
func (e *evaluator) exhaustive(p *pool, cnt *counters) {
	n := len(e.vs.levels)
	np := e.lay.n
	if n == 0 {
		return
	}
	// each position runs over its levels (a kept one has one)
	var lo, hi [maxPos]int
	for i := range np {
		lo[i], hi[i] = e.levelRange(i)
	}
	total := int64(len(e.devs) * n)
	for di := range e.devs {
		for first := lo[0]; first <= hi[0]; first++ {
			if e.stopped() {
				return
			}
			e.progress(int64(di*n+first), total)
			// the first position is fixed; the others run an odometer
			lv := lo
			lv[0] = first
			for {
				t := e.newTuple(di, lv)
				cnt.solves++
				e.scoreVariants(t, p, p.add, cnt)
				i := np - 1
				for ; i >= 1; i-- {
					if lv[i]++; lv[i] <= hi[i] {
						break
					}
					lv[i] = lo[i]
				}
				if i < 1 {
					break
				}
			}
		}
	}
	e.progress(total, total)
}

// tupleCache holds the solved level tuples of one device while a plan
// works on it, reusing its storage across resets.
type tupleCache struct {
	m map[[maxPos]int]*tuple
	// slab holds the cached tuples; used counts the ones in use
	slab [][]tuple
	used int
}

// reset empties the cache, keeping its storage.
func (tc *tupleCache) reset() {
	if tc.m == nil {
		tc.m = map[[maxPos]int]*tuple{}
	}
	clear(tc.m)
	tc.used = 0
}

// get returns the (cached) solved level tuple of device dev.
//
// A kept position is solved at its kept level whatever lv says
// (pinLevels): the plans' seeds then make builds that keep the parts, and
// a search over a level range clamped to the kept level (levelRange) asks
// for nothing else.
func (tc *tupleCache) get(e *evaluator, dev int, lv [maxPos]int, cnt *counters) *tuple {
	lv = e.pinLevels(lv)
	if t, ok := tc.m[lv]; ok {
		return t
	}
	t := tc.alloc()
	e.solveTuple(t, dev, lv)
	cnt.solves++
	tc.m[lv] = t
	return t
}

// peek returns a cached tuple without solving (a miss only costs a
// bound).
func (tc *tupleCache) peek(lv [maxPos]int) (*tuple, bool) {
	t, ok := tc.m[lv]
	return t, ok
}

// slabChunk is the number of tuples allocated at once for the cache.
const slabChunk = 1024

// alloc returns storage for one cached tuple, reused after reset
// (nothing keeps a tuple pointer beyond the cache).
func (tc *tupleCache) alloc() *tuple {
	k, i := tc.used/slabChunk, tc.used%slabChunk
	if k == len(tc.slab) {
		tc.slab = append(tc.slab, make([]tuple, slabChunk))
	}
	tc.used++
	return &tc.slab[k][i]
}

// polish hill-climbs from the best passing builds in the pool: each
// round moves one position one level, or to the nearest level holding a
// single, up or down to the neighbour with the best score, until no
// neighbour improves (at most maxPolishSteps rounds per start). Every
// build it scores goes to the pool, so the threshold falls early; it
// changes nothing but the order of the search.
func (e *evaluator) polish(p *pool, cnt *counters) {
	type start struct {
		c     combo
		score float64
	}
	var starts []start
	for _, it := range p.items {
		if it.e == e && len(it.failing) == 0 && len(starts) < polishStarts {
			starts = append(starts, start{it.c, it.score})
		}
	}
	// the climbs are independent: they run on the search's workers, each
	// with a tuple cache of its own
	tcs := make([]tupleCache, searchWorkers)
	e.onWorkers(len(starts), cnt, func(k, i int, wc *counters) { e.climb(p, &tcs[k], starts[i].c, starts[i].score, wc) })
}

// climb is polish's hill climb from build c, whose score is score.
func (e *evaluator) climb(p *pool, tc *tupleCache, c combo, score float64, cnt *counters) {
	n := len(e.vs.levels)
	tc.reset()
	best := score
	cur := c.lv
	for range maxPolishSteps {
		next, nextScore := cur, best
		for pos := range e.lay.n {
			if e.kept[pos] {
				continue
			}
			// one level either way, and the nearest level holding a
			// single either way (with pairs, the level next door is
			// mostly a pair's)
			i := cur[pos]
			for k, to := range [4]int{i - 1, i + 1, e.vs.down(i-1, true), e.vs.up(i+1, true)} {
				lv := cur
				lv[pos] = to
				if to < 0 || to >= n || k >= 2 && (to == i-1 || to == i+1) {
					continue
				}
				t := tc.get(e, c.dev, lv, cnt)
				e.scoreVariants(t, p, func(ev *evaluated) {
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

// Hill-climbing limits of polish.
const (
	polishStarts   = 5
	maxPolishSteps = 40
)

// indexes returns 0, 1, …, n − 1.
func indexes(n int) []int {
	out := make([]int, n)
	for i := range out {
		out[i] = i
	}
	return out
}

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

// bounds are the threshold-derived limits in force at one point of the
// search: any build that can still enter the pool has its nominal IC in
// [icLo, icHi] and its nominal VCE within delta·VCC of its target.
type bounds struct {
	thr, delta, icLo, icHi float64
	finite                 bool
}

// boundsNow derives the limits from the pool's current threshold.
func (e *evaluator) boundsNow(p *pool) bounds {
	thr := p.threshold()
	if e.s.w.QPoint > 0 && !math.IsInf(thr, 1) {
		return e.boundsWithin(thr, thr/e.s.w.QPoint)
	}
	return bounds{thr: thr, delta: math.Inf(1), icHi: math.Inf(1)}
}

// boundsWithin returns the limits of the builds whose QPoint term is at
// most d under threshold thr: IC within ±d of the target and VCE within
// d·span of its target band.
func (e *evaluator) boundsWithin(thr, d float64) bounds {
	return bounds{thr: thr, delta: d, icLo: e.s.icT * max(0, 1-d), icHi: e.s.icT * (1 + d), finite: true}
}

// targetBand returns bounds on the VCE target over all builds of device
// dev: the request's VCE, the mid-point rule without load and bypass, and
// [VCE(sat), mid-point] otherwise (the swing rule's r_ac/(R_dc+r_ac) lies
// in (0, 1/2] because r_ac ≤ R_dc).
func (e *evaluator) targetBand(dv *device) (lo, hi float64) {
	if e.s.vceT > 0 {
		return e.s.vceT, e.s.vceT
	}
	mid := (e.span + dv.vceSat) / 2
	if e.s.rl == 0 && !e.s.bypass {
		return mid, mid
	}
	return dv.vceSat, mid
}

// seedOrder keeps, per device, the best seed's score and RE level, a
// passing seed before any failing one: plans visit devices from the best
// seed and RE levels outward from it (any order is sound; this one
// tightens the threshold early, and where no seed passes it still starts
// at the hand method's RE, not at the smallest level).
type seedOrder struct {
	best []float64
	pass []bool
	re   []int
}

// reset prepares for nDev devices.
func (so *seedOrder) reset(nDev int) {
	so.best, so.pass, so.re = make([]float64, nDev), make([]bool, nDev), make([]int, nDev)
	for i := range so.best {
		so.best[i] = math.Inf(1)
	}
}

// note records a seed build of device di at RE level re.
func (so *seedOrder) note(di, re int, ev *evaluated) {
	pass := len(ev.failing) == 0
	if pass && !so.pass[di] || pass == so.pass[di] && ev.score < so.best[di] {
		so.best[di], so.pass[di], so.re[di] = ev.score, pass, re
	}
}

// order returns the device indexes from the best seed.
func (so *seedOrder) order(nDev int) []int {
	order := indexes(nDev)
	if len(so.best) == nDev {
		slices.SortStableFunc(order, func(a, b int) int {
			if so.pass[a] != so.pass[b] {
				if so.pass[a] {
					return -1
				}
				return 1
			}
			return cmp.Compare(so.best[a], so.best[b])
		})
	}
	return order
}

// start is the RE level device di's search starts from.
func (so *seedOrder) start(di int) int {
	if di < len(so.re) {
		return so.re[di]
	}
	return 0
}
