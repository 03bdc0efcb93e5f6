package picker

import (
	"math"
	"math/bits"
	"slices"

	"biasbin/solver"
)

// Positions of a collector-feedback build's arrays (feedbackLayout).
const (
	fRF = iota
	fRC
	fRE
)

// feedbackPlan searches RF, RC, RE of a collector-feedback stage over
// (device, RE, RC, RF); doc.go, "The collector-feedback plan", states its
// bounds.
type feedbackPlan struct {
	e     *evaluator
	cache tupleCache
	seeds seedOrder
	// grid holds the solved IC of the device being searched at (grid
	// point of RC + RE, RF level) (rfWindow); lnStep is the grid's step
	grid   map[uint64]float64 // keyed by gridKey
	lnStep float64
	// corners holds cornerVCE of the device being searched, keyed by
	// gridKey; corner is the stage at that corner (cornerSet: taken for
	// that device)
	corners   map[uint64]float64
	corner    solver.Stage
	cornerSet bool
	// gridA and gridB give the grid's points without an exponential
	// (gridOhm): R(g) = gridA[g >> gridSplit]·gridB[g & (2^gridSplit −
	// 1)] for g ≥ 0 up to above twice the largest level
	gridA, gridB []float64
	// above memoizes icFloorAbove of the device being searched by grid
	// point, direct-mapped at slot g & cellMask: neighbouring points,
	// which the search visits in a row, never take each other's slot
	above    []aboveEntry
	cellMask uint64
	// gridDev is the device whose solves grid holds, plus one (0: none)
	gridDev int
	// fb memoizes betaFloorRC by grid cell of sums RC + RE (the grid of
	// rfWindow), device and IC window: the (RC, RE) pairs whose sums
	// share a cell share its floor. It is direct-mapped: a cell's entry
	// is at a hash of its index, and a newer cell takes the slot. It has
	// 2^fbBits slots, about twice as many as the grid has cells between
	// the least and the largest sum of two levels, and at most
	// 2^fbMemoBits.
	fb     []fbEntry
	fbBits int
	// wb memoizes betaFloorWindow by device, grid cell of sums, RF window
	// and IC window, direct-mapped like fb, with as many slots.
	wb []wbEntry
	// qb memoizes betaQFloorRC by grid cell (the same key as fb's, with
	// xLo), direct-mapped like above.
	qb []qbEntry
	// cellGroups keeps, per group of cellGroup neighbouring cells (g /
	// cellGroup, direct-mapped with a slot for every group between the
	// least level and twice the largest, not capped like qb), F-QB's
	// least over the group's sums, with the device and IC window it holds
	// for (cellsSettle).
	cellGroups []cellGroupEntry
	// sumCells memoizes sumCell: sumCells[i] is span sumCellBase + i,
	// from the least level to twice the largest
	sumCells    []sumCellEntry
	sumCellBase int
	// spanNext links the spans of sumCells known to hold nothing that
	// can enter to the next one (liveSpan): [0] for every build, [1] for
	// builds with a pair's part; a span not so known is its own link
	spanNext [2][]int32
	// spanRF is the RF window sumCell found last, its next guess
	spanRF [2]int
	// rfCells memoizes rfCell by (span of 2^rfCellShift grid cells of
	// sums, block of rfCellLevels RF levels) of the device being
	// searched, direct-mapped at a hash of the two
	rfCells    []rfCellEntry
	rfCellBits int
	// blocks memoizes sumsQBLeast's blocks: blocks[i] is block
	// blockBase + i (ln R/qbBlockStep), from the least level to twice the
	// largest.
	blocks    []keptFloor
	blockBase int
	// groups keeps, per group of qbGroup blocks, their least floor and
	// the IC window it holds for (the blocks' windows' intersection).
	groups []keptFloor
}

// keptFloor is a floor of device dv's builds kept with the IC window
// [icLo, icHi] it was taken for; it holds for every window inside that
// one (a floor over more builds is a floor over fewer).
type keptFloor struct {
	dv                *device
	floor, icLo, icHi float64
}

// holds reports whether the kept floor is one for device dv's builds in
// the window of bd.
func (k *keptFloor) holds(dv *device, bd bounds) bool {
	return k.dv == dv && k.icLo <= bd.icLo && k.icHi >= bd.icHi
}

// aboveEntry is icFloorAbove's value x at grid point g for device dev
// (feedbackPlan.gridDev: 0 is none).
type aboveEntry struct {
	g, dev int
	x      float64
}

// cellGroupEntry is F-QB's kept least over the sums of group k of cells
// (cellsSettle).
type cellGroupEntry struct {
	k int
	keptFloor
}

// qbEntry is betaQFloorRC of device dv at the grid cell key for the IC
// window [icLo, icHi] and currents at least xLo.
type qbEntry struct {
	key             uint64
	dv              *device
	icLo, icHi, xLo float64
	parts           qbFloors
	least           float64 // parts.least()
}

// wbEntry is betaFloorWindow of device dv at grid cell g and RF levels
// lo..hi for the IC window [icLo, icHi]: everything it depends on.
type wbEntry struct {
	g, lo, hi         int
	dv                *device
	floor, icLo, icHi float64
}

// fbMemoBits caps feedbackPlan.fbBits (2^18 slots: 10 MB of fb and 15 MB
// of wb per worker).
const fbMemoBits = 18

// fbEntry is betaFloorRC of device dv at the grid cell key for the IC
// window [icLo, icHi]: everything it depends on.
type fbEntry struct {
	key               uint64
	dv                *device
	floor, icLo, icHi float64
}

// tuple returns the (cached) solved level tuple of device di.
func (f *feedbackPlan) tuple(di, rf, rc, re int, cnt *counters) *tuple {
	return f.cache.get(f.e, di, [maxPos]int{rf, rc, re}, cnt)
}

// rfWindow returns the RF levels whose builds with RC + RE = r, in the
// grid cell g of sums (R(g) ≤ r < R(g+1), gridIndex), can have a
// nominal IC in [icLo, icHi] (bound F-G): IC falls as RF rises (lemma F1)
// and as RC + RE rises (L1 in the divider picture, RE' = RC + RE), and
// depends on RC and RE only through their sum (both carry IE). So with
// R(g) ≤ r < R(g+1) two neighbouring points of a grid of sums, IC lies
// between its values at R(g+1) and R(g): the RF levels whose IC at R(g+1)
// is over icHi, and those whose IC at R(g) is under icLo, are out. The
// two searches run on the grid (gridIC), so the (RC, RE) pairs whose sums
// share a grid cell share its solves. A grid point that cannot be solved
// never narrows the window, and a relative slack of gridSlack covers the
// solver's tolerance. With singles (no room for a pair in RF, bound P)
// only the levels holding a single are probed. It searches only the
// levels of dom (lo..hi), the window's part there: a window known to lie
// in dom costs fewer solves.
func (f *feedbackPlan) rfWindow(di, g int, icLo, icHi float64, gLo, gHi int, dom [2]int, singles bool, cnt *counters) (lo, hi int) {
	vs := f.e.vs
	lo = vs.firstIn(dom[0], dom[1], gLo, singles, func(i int) bool {
		v := f.gridIC(di, g+1, i, cnt)
		return math.IsNaN(v) || v <= icHi*(1+gridSlack)
	})
	hi = vs.firstIn(dom[0], dom[1], gHi, singles, func(i int) bool {
		v := f.gridIC(di, g, i, cnt)
		return !math.IsNaN(v) && v < icLo*(1-gridSlack)
	}) - 1
	return f.e.clampRange(fRF, lo, hi)
}

// gridSlack is the relative margin of rfWindow's comparisons: the
// self-heated solve balances the junction to 1e-6 K, which moves IC by
// far less.
const gridSlack = 1e-7

// gridPoints is how many grid points of RC + RE sums rfWindow puts
// between two neighbouring resistance levels (on average over the
// stock's range), at most one per 0.5 %: the window it brackets is then
// at most about one level wider than the exact one on each side.
const gridPoints = 4

// gridMax bounds the grid's solves kept at once (about 40 bytes each).
const gridMax = 1 << 18

// setGrid sets the grid's step from the stock's levels (gridPoints per
// mean level spacing, at most 0.5 %), allocates the tables and memos
// once (gridOhm's, by grid cell and by grid point) and empties the grid's
// solves and the spans' links for a new device.
func (f *feedbackPlan) setGrid() {
	lv := f.e.vs.levels
	step := 0.005
	if n := len(lv); n > 1 {
		step = min(step, math.Log(lv[n-1].ohm/lv[0].ohm)/float64(n-1)/gridPoints)
	}
	f.lnStep = math.Log1p(step)
	if f.grid == nil {
		f.grid = map[uint64]float64{}
		f.corners = map[uint64]float64{}
	}
	if f.fb == nil && len(lv) > 0 {
		least, largest := lv[0].ohm, lv[len(lv)-1].ohm
		top := int(math.Ceil(math.Log(2*largest)/f.lnStep)) + 2
		for k := 0; k <= top>>gridSplit; k++ {
			f.gridA = append(f.gridA, math.Exp(float64(k<<gridSplit)*f.lnStep))
		}
		f.gridB = make([]float64, 1<<gridSplit)
		for j := range f.gridB {
			f.gridB[j] = math.Exp(float64(j) * f.lnStep)
		}
		// the memos by grid cell of sums
		cells := uint64(math.Log(largest/least)/f.lnStep) + 2
		f.fbBits = min(fbMemoBits, bits.Len64(cells)+1)
		f.fb = make([]fbEntry, 1<<f.fbBits)
		f.wb = make([]wbEntry, 1<<f.fbBits)
		// the memos by grid point: about twice as many slots as the
		// points between the least level and twice the largest, at most
		// 2^cellMemoBits (cellGroups not capped)
		points := uint64(math.Log(2*largest/least)/f.lnStep) + 2
		b := min(cellMemoBits, bits.Len64(points)+1)
		f.cellMask = 1<<b - 1
		f.above = make([]aboveEntry, 1<<b)
		f.qb = make([]qbEntry, 1<<b)
		f.cellGroups = make([]cellGroupEntry, 1<<bits.Len64(points>>cellGroupBits+1))
		f.blockBase = int(math.Floor(math.Log(least) / qbBlockStep))
		f.blocks = make([]keptFloor, int(math.Floor(math.Log(2*largest)/qbBlockStep))-f.blockBase+1)
		f.groups = make([]keptFloor, (len(f.blocks)+qbGroup-1)/qbGroup)
		f.sumCellBase = int(math.Floor(math.Log(least)/f.lnStep)) >> sumCellShift
		f.sumCells = make([]sumCellEntry, (top>>sumCellShift)-f.sumCellBase+2)
		f.spanNext = [2][]int32{make([]int32, len(f.sumCells)), make([]int32, len(f.sumCells))}
		f.rfCellBits = min(rfCellMemoBits, b+2)
		f.rfCells = make([]rfCellEntry, 1<<f.rfCellBits)
	}
	// The other memos' entries name the device they hold for (and the
	// IC window, where they depend on it), so they stay: a worker that
	// comes back to a device finds them again, and clearing them cost
	// tens of megabytes per change of device. The grid's solves and the
	// spans' links do not name it.
	clear(f.grid)
	clear(f.corners)
	f.cornerSet = false // the stage is taken from the device's build
	f.resetLinks()
}

// resetLinks makes every span of sumCells its own link (spanNext).
func (f *feedbackPlan) resetLinks() {
	for _, links := range f.spanNext {
		for i := range links {
			links[i] = int32(i)
		}
	}
}

// gridOhm is the grid's point g: e^(g·lnStep) Ω, for g ≥ 0 the product
// of gridA's and gridB's entries (within rounding of the exponential: the
// grid only needs to rise with g and to be read the same everywhere).
func (f *feedbackPlan) gridOhm(g int) float64 {
	if k := g >> gridSplit; g >= 0 && k < len(f.gridA) {
		return f.gridA[k] * f.gridB[g&(1<<gridSplit-1)]
	}
	return math.Exp(float64(g) * f.lnStep)
}

// gridSplit is how many low bits of a grid point gridOhm reads from
// gridB.
const gridSplit = 10

// cellMemoBits caps the memos by grid point (2^16 slots: 14 MB of qb
// per worker).
const cellMemoBits = 16

// gridIndex is the grid point g with R(g) ≤ r < R(g+1).
func (f *feedbackPlan) gridIndex(r float64) int {
	g := int(math.Floor(math.Log(r) / f.lnStep))
	for f.gridOhm(g) > r {
		g--
	}
	for f.gridOhm(g+1) <= r {
		g++
	}
	return g
}

// icFloorAbove bounds from below the nominal IC of every build of device
// di with RC + RE at most R(g + 1), the top of grid cell g (0 when it
// gives nothing): IC at the largest RF level and that grid point (F1,
// F-G), read on the grid so that every RE shares it, less the grid's
// slack.
func (f *feedbackPlan) icFloorAbove(di, g int, cnt *counters) float64 {
	var slot *aboveEntry
	if f.gridDev == di+1 && f.above != nil {
		slot = &f.above[uint64(int64(g))&f.cellMask]
		if slot.dev == f.gridDev && slot.g == g {
			return slot.x
		}
	}
	_, rfTop := f.e.levelRange(fRF)
	x := 0.0
	if v := f.gridIC(di, g+1, rfTop, cnt); !math.IsNaN(v) {
		x = v * (1 - gridSlack)
	}
	if slot != nil {
		*slot = aboveEntry{g, f.gridDev, x}
	}
	return x
}

// gridKey is the grid's key of (grid point g, RF level rf): one word
// hashes faster than two.
func gridKey(g, rf int) uint64 { return uint64(int64(g))<<32 ^ uint64(uint32(rf)) }

// gridIC is the nominal IC of device di with RF at level rf and RC + RE
// at the grid's point g (split evenly: only the sum counts), NaN when it
// cannot be solved; solved once per device.
func (f *feedbackPlan) gridIC(di, g, rf int, cnt *counters) float64 {
	return gridMemo(f.grid, g, rf, func() float64 {
		e := f.e
		sum := f.gridOhm(g)
		var r [maxPos]float64
		r[fRF], r[fRC], r[fRE] = e.vs.levels[rf].ohm, sum/2, sum/2
		d := &e.devs[di]
		cnt.solves++
		if op, err := e.solveAt(d, d.typ, r); err == nil {
			return op.IC_A
		}
		return math.NaN()
	})
}

// gridMemo is m's value at (grid point g, RF level rf), which solve gives
// the first time; m holds at most gridMax values (a memo of a
// deterministic solve: emptying it only changes the work).
func gridMemo(m map[uint64]float64, g, rf int, solve func() float64) float64 {
	key := gridKey(g, rf)
	if v, ok := m[key]; ok {
		return v
	}
	if len(m) >= gridMax {
		clear(m)
	}
	v := solve()
	m[key] = v
	return v
}

// seed evaluates, for every device, hand-method builds: VE = 0.05, 0.1,
// 0.15 and 0.2 of VCC, RE = VE/IC, RC for the target VCE, RF by a search
// for the target current (then RC and RF once more), and the 3×3 RF, RC
// levels around them; when even the largest RF leaves IC over the target,
// also the 3×3 around it and the RC that brings IC to the target; with
// pairs, all of it once more with every level snapped to one holding a
// single (valueSet.seedSnaps). It changes only the order of the search.
func (f *feedbackPlan) seed(p *pool, cnt *counters) {
	e := f.e
	seedByDevice(e, &f.seeds, cnt, func() *feedbackPlan { return &feedbackPlan{e: e, seeds: f.seeds} },
		func(w *feedbackPlan, wc *counters, di int) { w.seedDevice(p, wc, di) })
}

// seedDevice is seed for device di.
func (f *feedbackPlan) seedDevice(p *pool, cnt *counters, di int) {
	e := f.e
	n := len(e.vs.levels)
	f.cache.reset()
	_, vceHi := e.targetBand(&e.devs[di])
	for _, singles := range e.vs.seedSnaps() {
		for _, veShare := range []float64{0.05, 0.1, 0.15, 0.2} {
			ve := e.s.vcc * veShare
			re := clampLevel(e.vs.up(e.vs.levelAtOrAbove(ve/e.s.icT), singles), n)
			rc := clampLevel(e.vs.up(e.vs.levelAtOrAbove((e.s.vcc-vceHi-ve)/e.s.icT), singles), n)
			var rf int
			for range 2 {
				rf = clampLevel(e.vs.firstIn(0, n-1, n/2, singles, func(i int) bool { return f.tuple(di, i, rc, re, cnt).icAtMost(e.s.icT) }), n)
				rc = clampLevel(e.vs.firstIn(0, n-1, rc, singles, func(i int) bool { return f.tuple(di, rf, i, re, cnt).vceSolvedAtMost(vceHi) }), n)
			}
			starts := [][2]int{{rf, rc}}
			if rf == n-1 {
				// the largest RF cannot bring IC down to the target:
				// RC then sets the current instead (at the cost of VCE)
				rcIC := clampLevel(e.vs.firstIn(0, n-1, rc, singles, func(i int) bool { return f.tuple(di, rf, i, re, cnt).icAtMost(e.s.icT) }), n)
				starts = append(starts, [2]int{rf, rcIC})
			}
			for _, s := range starts {
				e.vs.eachAround(s[0], s[1], singles, func(a, c int) {
					e.scoreVariants(f.tuple(di, a, c, re, cnt), p, func(ev *evaluated) {
						f.seeds.note(di, re, ev)
						p.add(ev)
					}, cnt)
				})
			}
		}
	}
}

// search is the branch and bound over (device, RE, RC, RF).
func (f *feedbackPlan) search(p *pool, cnt *counters) {
	searchByRE(f.e, p, &f.seeds, cnt, func() *feedbackPlan { return &feedbackPlan{e: f.e, seeds: f.seeds} },
		func(w *feedbackPlan, wc *counters, di, re int, kE, vceLo, vceHi float64, bd bounds) {
			w.searchRE(p, wc, di, re, kE, vceLo, vceHi, bd)
		})
}

// searchRE is search over the builds of device di at RE level re, with
// the bounds bd in force (each worker of search has its own plan, so its
// own tuple cache and grid).
func (f *feedbackPlan) searchRE(p *pool, cnt *counters, di, re int, kE, vceLo, vceHi float64, bd bounds) {
	e := f.e
	if f.gridDev != di+1 {
		f.setGrid()
		f.gridDev = di + 1
	}
	n := len(e.vs.levels)
	w := e.s.w
	dv := &e.devs[di]
	reOhm := e.vs.levels[re].ohm
	pfRE := e.partsFloor(re) // bound P
	// Bound RC (kRC = kE: RC carries IE = IC + IB).
	rcLo, rcHi := e.rcBand(bd, reOhm, kE, kE, vceLo, vceHi)
	// RE's parts floor and F-QB over every sum of the RC band
	// (sumsQBLeast) bound every build at this RE from below: where a
	// pair in RC would put that over the threshold, RC takes singles
	// alone (rcSingles), and where it is over, nothing here can enter.
	// The threshold only falls, so both stay true. It is taken only
	// where some level holds only pairs: on singles alone it costs more
	// than it saves.
	rcSingles := false
	rAt := (e.s.vcc - (vceLo+vceHi)/2) / e.s.icT
	if bd.finite && w.Beta > 0 && w.QPoint > 0 && w.Parts > 0 && e.vs.hasPairOnly() && rcLo <= rcHi {
		rLo, rHi := e.vs.levels[rcLo].ohm+reOhm, e.vs.levels[rcHi].ohm+reOhm
		least := f.sumsQBLeast(dv, bd, rLo, rHi, rAt, bd.thr-pfRE-w.Parts, kE, vceLo, vceHi)
		if rcSingles = pfRE+w.Parts+least > bd.thr; pfRE+least > bd.thr {
			return
		}
	}
	// F-RS over a block of RC levels costs a solve per try; on a stock
	// with pairs the tries are many and seldom settle (E96 with pairs,
	// 0.1 mA at f826b68: 46 million solves and 70 s with it, 1.8 million
	// and 28–42 s without), so there F-RF's blocks go without it (and
	// take F-QBU cell by cell instead, cellsSettle)
	rsBlocks := !e.vs.hasPairOnly()
	// Bound F-T (feedback_cells.go) over spans of sums in the RC scan and
	// per tuple before it is solved: with pairs, thousands of (RC, RE)
	// pairs share a span of sums and so its floors (E96 with pairs at 10
	// mA: 10 million tuples solved without it, 0.6 million with it). It
	// settles the top of the RF window as bound B over [k, hi] did, so
	// that bisection goes.
	cellFloors := e.vs.hasPairOnly()
	gLo, gHi := n/2, n/2
	// skip is how many RC levels the next block floor (bound
	// F-RF) tries to settle at once: it doubles while blocks
	// fall and drops to 1 when one does not.
	skip := 1
	for rc := rcLo; rc <= rcHi; rc++ {
		if e.stopped() {
			return
		}
		// every tuple below has this RC and RE: the cache holds one
		// RC level's at a time (the RF window reads the grid)
		f.cache.reset()
		bd := e.boundsNow(p)
		if e.vs.levels[rc].pairOnly && (rcSingles || e.singlesOnly(pfRE, bd.thr)) {
			rc = e.vs.nextSingle[rc] - 1 // bound P: no room for a pair in RC
			continue
		}
		// RE's utilization and the emitter term bound every build at
		// this RE from below (bounds U-RE and E-RE), and so does the
		// transistor's (U-Q): none of these floors falls as RC rises
		var uRE, eLo float64
		if bd.finite {
			eLo = e.emitterFloor(bd, reOhm, kE)
			uRE = max(bd.icLo*bd.icLo*reOhm/e.vs.levels[re].allowHot_W, e.transistorUseFloor(dv, bd, vceLo, pfRE+w.Emitter*eLo))
		}
		if cellFloors && bd.finite {
			// bound F-T over the span of sums holding RC + RE
			if next := f.sumCellNext(di, rc, rcHi, re, bd, pfRE+w.Emitter*eLo, uRE, vceLo, vceHi, cnt); next > rc {
				rc = next - 1
				continue
			}
		}
		if bd.finite && w.QPoint > 0 {
			// Bound F-RF over RC levels rc..last, with RE's
			// utilization, emitter and parts floors, and past a
			// level that bound F-B settled, F-B over the block's
			// sums (blockSettles: with pairs, F-QB).
			// That floor is taken only where F-B at the block's
			// largest sum (kept per cell) settles: F-B falls as the
			// sum rises, so where that one does not the block's
			// does not either (it only saves the work).
			last := min(rc+skip-1, rcHi)
			rLo, rHi := e.vs.levels[rc].ohm+reOhm, e.vs.levels[last].ohm+reOhm
			gHi := f.gridIndex(rHi)
			xLo := f.icFloorAbove(di, gHi, cnt)
			q := e.feedbackQFloorBlock(rLo, rHi, xLo, kE, vceLo, vceHi)
			fl := pfRE + w.Utilization*max(uRE, f.uRC(bd, rc)) + w.Emitter*eLo + w.QPoint*q
			if fl > bd.thr || skip > 1 && w.Beta > 0 && fl+w.Beta*f.betaFloorRC(dv, bd, gHi) > bd.thr &&
				f.blockSettles(dv, bd, rLo, rHi, rAt, fl, w.QPoint*q, kE, vceLo, vceHi) ||
				rsBlocks && skip > 1 && w.Headroom > 0 && e.nearSaturation(dv, e.s.vcc-xLo*rLo) && fl+w.Headroom*f.headroomBelow(di, n, rc, last, re, cnt) > bd.thr ||
				!rsBlocks && skip > 1 && w.Beta > 0 && w.QPoint > 0 && f.cellsSettle(di, bd, rc, last, re, uRE, w.Emitter*eLo+pfRE, kE, vceLo, vceHi, cnt) {
				rc = last
				skip *= 2
				continue
			}
			skip = 1
		}
		icLo, icHi := bd.icLo, bd.icHi
		// pf is the parts floor of RE and RC (bound P); fl bounds
		// every other term of every build at (RC, RE) from below.
		pf := pfRE + e.partsFloor(rc)
		fl := pf
		// nonBeta bounds every term but Beta of every build here
		nonBeta := pf
		// sf bounds every term but RF's parts of every build here (with
		// F-QB): it decides whether a pair in RF can enter
		sf := pf
		// [qbLo, qbHi] holds the IC of every build here that can enter
		// by F-QB's parts
		qbLo, qbHi := 0.0, math.Inf(1)
		// the pair's sum and its cell of the grid of sums
		r := e.vs.levels[rc].ohm + reOhm
		g := f.gridIndex(r)
		if bd.finite {
			// With RE's floors (above) and bound B every build at
			// this RC and RE (F-B); what is left of the threshold
			// bounds the QPoint term, so the IC window narrows.
			// The QPoint term itself is at least qFloor (F-Q).
			base := pfRE + w.Utilization*max(uRE, f.uRC(bd, rc)) + w.Emitter*eLo
			if base > bd.thr {
				break
			}
			// U-RC with this level's own best allowance (not
			// monotone in RC, so it only skips this RC)
			uOwn := max(uRE, bd.icLo*bd.icLo*e.vs.levels[rc].ohm/e.vs.levels[rc].allowHot_W)
			base = pf + w.Utilization*uOwn + w.Emitter*eLo
			// Every build here has IC at least xLo (F-RF per
			// pair): F-Q over x ≥ xLo first (cheap), then with F-B.
			xLo := f.icFloorAbove(di, g, cnt)
			qFloor := w.QPoint * e.feedbackQFloorBlock(r, r, xLo, kE, vceLo, vceHi)
			if base+qFloor > bd.thr {
				continue
			}
			nonBeta = base + qFloor
			nonBQ := base
			if w.Beta > 0 {
				base += w.Beta * f.betaFloorRC(dv, bd, g)
			}
			if base+qFloor > bd.thr {
				// F-B settled it: the next levels are tried in
				// blocks (F-B falls as the sum rises, so a block
				// often falls whole)
				skip = 2
				continue
			}
			// F-QB: the two together, over parts of the IC window; the
			// parts that cannot enter narrow the window (qbLo, qbHi)
			if w.Beta > 0 && w.QPoint > 0 {
				// with RC's and RE's utilization per part (F-QBU)
				coef := max(e.vs.levels[rc].ohm/e.vs.levels[rc].allowHot_W, reOhm/e.vs.levels[re].allowHot_W)
				qf := f.betaQFloorRC(dv, bd, g, xLo, kE, vceLo, vceHi).parts.withUse(coef, uOwn, w.Utilization)
				sf = nonBQ + qf.least()
				var ok bool
				if qbLo, qbHi, ok = qf.window(bd.thr - nonBQ); sf > bd.thr || !ok {
					skip = 2
					continue
				}
			}
			// F-RS over every RF level, near saturation (VCE ≤ VCC −
			// xLo·(RC + RE)): one solve for the pair
			if w.Headroom > 0 && e.nearSaturation(dv, e.s.vcc-xLo*r) &&
				base+qFloor+w.Headroom*f.headroomBelow(di, n, rc, rc, re, cnt) > bd.thr {
				skip = 2
				continue
			}
			if w.QPoint > 0 {
				d2 := (bd.thr - base) / w.QPoint
				var ok bool
				within := e.boundsWithin(bd.thr, d2)
				icLo, icHi, ok = e.feedbackICWindow(r, xLo, kE, vceLo, vceHi, d2, within.icLo, within.icHi)
				if icLo, icHi = max(icLo, qbLo), min(icHi, qbHi); !ok || icLo > icHi {
					continue
				}
			}
			fl = base
		}
		sf = max(sf, fl)
		// bound F-T: RF lies in the hull of the span of sums
		hull := [2]int{0, len(e.vs.levels) - 1}
		if cellFloors && bd.finite {
			k := 0
			if w.Parts > 0 && pf >= w.Parts {
				k = 1
			}
			if hull = f.sumCell(di, g>>sumCellShift, bd, vceLo, vceHi, cnt).hull[k]; hull[0] > hull[1] {
				continue
			}
		}
		lo, hi := f.rfWindow(di, g, icLo, icHi, gLo, gHi, hull, bd.finite && e.singlesOnly(sf, bd.thr), cnt)
		gLo, gHi = lo, hi+1
		if lo > hi {
			continue
		}
		if bd.finite && w.Beta > 0 {
			// Bound B over the window, with R_TH = RF between
			// its ends and RE' = RC + RE (baseLoop): what is
			// left of the threshold narrows the window again.
			bLo := f.betaFloorWindow(dv, bd, g, lo, hi)
			uQ := e.transistorUseFloor(dv, bd, vceLo, pf+w.Beta*bLo)
			base := pf + w.Utilization*max(max(bd.icLo*bd.icLo*reOhm/e.vs.levels[re].allowHot_W,
				bd.icLo*bd.icLo*e.vs.levels[rc].ohm/e.vs.levels[rc].allowHot_W), uQ) + w.Beta*bLo
			if base > bd.thr {
				continue
			}
			fl = max(fl, base)
			sf = max(sf, fl)
			if w.QPoint > 0 {
				d2 := (bd.thr - base) / w.QPoint
				within := e.boundsWithin(bd.thr, d2)
				wLo, wHi, ok := e.feedbackICWindow(r, 0, kE, vceLo, vceHi, d2, within.icLo, within.icHi)
				if wLo, wHi = max(wLo, qbLo), min(wHi, qbHi); !ok || wLo > wHi {
					continue
				}
				lo, hi = f.rfWindow(di, g, wLo, wHi, lo, hi+1, hull, e.singlesOnly(sf, bd.thr), cnt)
			}
		}
		if !cellFloors && bd.finite && w.Beta > 0 && lo < hi {
			// Bound B over the top of the window: the levels from
			// k to hi are settled by the floor over RF in [k, hi]
			// (with the IC window and the other terms' floors).
			// The bisection assumes nothing of the floor's shape:
			// the k it returns below the end is one whose floor
			// was computed and settles.
			k := firstLevel(hi-lo+1, func(i int) bool {
				return nonBeta+w.Beta*e.betaFloor(dv, betaWindow{RTH: e.vs.levels[lo+i].ohm, RTHMax: e.vs.levels[hi].ohm,
					RE: r, ICLo: icLo, ICHi: icHi}) > p.threshold()
			})
			hi = lo + k - 1
		}
		// The window's tuples go to scoring a block of rfBlock
		// visited levels at a time, with bound B over the block,
		// from the top of the window down. Bound F-RS: by F1 every
		// RF below the lowest one solved has IC at least that one's,
		// so F-Q over currents from there up and the headroom floor
		// below it (headroomBelow), with the other terms' floors,
		// settle the rest of the window once they are over.
		var blk [rfBlock]*tuple
		xSeen, vceSeen := 0.0, 0.0
		// blocks grow from two levels to rfBlock, so F-RS can settle
		// a window after its first levels
		size := 2
		for rf := hi; rf >= lo; size = min(2*size, rfBlock) {
			if xSeen > 0 && bd.finite {
				sweep := fl + w.QPoint*e.feedbackQFloorBlock(r, r, xSeen, kE, vceLo, vceHi)
				if sweep > p.threshold() {
					break
				}
				// the headroom floor costs a solve: taken only where
				// the nominal VCE is near enough saturation for a
				// corner to reach the band
				if w.Headroom > 0 && e.nearSaturation(dv, vceSeen) &&
					sweep+w.Headroom*f.headroomBelow(di, rf+1, rc, rc, re, cnt) > p.threshold() {
					break
				}
			}
			n := 0
			for ; rf >= lo && n < size; rf-- {
				if e.vs.levels[rf].pairOnly && e.singlesOnly(sf, p.threshold()) {
					rf = e.vs.prevSingle[rf] + 1 // bound P: no room for a pair in RF
					continue
				}
				if cellFloors && bd.finite {
					// bound F-T: the cell's floors settle the tuple
					// unsolved; by F1 every RF below has IC at least
					// the cell's floor (F-RS)
					// the levels of rf's block from rf down share its
					// cell: where the least parts floor among them
					// settles, the cell settles them all
					from, pfRF := f.rfBlockDown(rf, lo)
					if c, ok := f.rfCellSettles(di, g, rf, rc, re, pf+pfRF, vceLo, vceHi, p.threshold(), cnt); ok {
						xSeen = max(xSeen, c.icLo)
						rf = from
						continue
					}
				}
				blk[n] = f.tuple(di, rf, rc, re, cnt)
				n++
			}
			for _, t := range blk[:n] {
				if t.ok {
					xSeen, vceSeen = t.op.IC_A, t.op.VCE_V // the lowest RF solved so far
				}
			}
			e.scoreBlock(blk[:n], fRF, pf, p, cnt)
		}
	}
}

// cellsSettle is bound F-QBU over a block of RC levels rc..last at RE
// level re (bound F-RF's block, taken cell by cell of the grid of sums):
// every build there has RC + RE in one of the cells g its sums span, IC
// at least icFloorAbove(g) (F-RF), its QPoint and beta terms at least
// F-QB over the cell with that floor (betaQFloorRC, the per-pair floor's
// own), RC's parts floor the least over the block's levels, and RC or
// RE carrying IE ≥ IC with at least coef·IC² of utilization, coef the
// larger of RC's least resistance over the best allowance of any value
// and RE's over its own (F-QBU); other is the floors of the emitter term
// and RE's parts, and uRE RE's utilization floor. A whole group of
// cellGroup cells first takes F-QB once over the group's sums, with the
// IC floor at its top (kept per group); only a group that does not
// settle so is taken cell by cell. It reports whether every cell's floor
// is over the threshold.
func (f *feedbackPlan) cellsSettle(di int, bd bounds, rc, last, re int, uRE, other, kE, vceLo, vceHi float64, cnt *counters) bool {
	e := f.e
	w, lv, dv := e.s.w, e.vs.levels, &e.devs[di]
	pfRC := e.partsFloor(rc)
	if s := e.vs.nextSingle[rc]; s <= last {
		pfRC = min(pfRC, e.partsFloor(s))
	}
	use := max(uRE, f.uRC(bd, rc))
	coef := max(lv[rc].ohm/e.vs.allowHotMax_W, lv[re].ohm/lv[re].allowHot_W)
	other += pfRC + w.Utilization*use
	for g, gHi := f.gridIndex(lv[rc].ohm+lv[re].ohm), f.gridIndex(lv[last].ohm+lv[re].ohm); g <= gHi; g++ {
		if g%cellGroup == 0 && g+cellGroup-1 <= gHi && f.cellGroups != nil {
			// a whole group of cells inside the range first takes F-QB
			// over the group's sums, [R(g), R(g + cellGroup)], with the
			// current floor at its top (withUse only adds, so that
			// floor holds under it too): one floor for cellGroup cells
			k := &f.cellGroups[uint64(int64(g/cellGroup))&uint64(len(f.cellGroups)-1)]
			if k.k != g/cellGroup || !k.holds(dv, bd) {
				top := g + cellGroup - 1
				qf := f.betaQFloorSums(dv, bd, f.gridOhm(g), f.gridOhm(top+1), f.icFloorAbove(di, top, cnt), kE, vceLo, vceHi)
				*k = cellGroupEntry{g / cellGroup, keptFloor{dv, qf.least(), bd.icLo, bd.icHi}}
			}
			if other+k.floor > bd.thr {
				g += cellGroup - 1
				continue
			}
		}
		// withUse only adds: a cell already over without it is over
		qb := f.betaQFloorRC(dv, bd, g, f.icFloorAbove(di, g, cnt), kE, vceLo, vceHi)
		if other+qb.least <= bd.thr && other+qb.parts.withUse(coef, use, w.Utilization).least() <= bd.thr {
			return false
		}
	}
	return true
}

// cellGroup is how many neighbouring cells of the grid of sums share one
// kept least in cellsSettle: 2^cellGroupBits.
const (
	cellGroupBits = 5
	cellGroup     = 1 << cellGroupBits
)

// headroomBelow is the headroom term's floor of bound F-RS: a lower
// bound on the headroom term of every build of device di with RC level
// in [rcLo, rcHi], RE level re and RF below level top (top =
// len(levels): any RF; 0 where it gives none). The worst case's lowest
// VCE is at most VCE at its corner with hFE max, VBE(on) and VAF low
// (device.vceLow), the hottest ambient, the supply low, RF and RE at the
// low end of their tolerance and RC at the high end
// (solver.Build.CornerStage). There RF is at most R_up = R(top −
// 1)·(1 + |TCR|max·|ΔT|) whatever the build's RF, and RC at most RC'max,
// the largest of the levels' corner values, so by F1 and L1 (RE' = RC +
// RE) IC there is at least IC_up, the IC of that corner with RF = R_up
// and RC = RC'max, and VCE = VCC − IE·(RC + RE) ≤ VCC − IC_up·(RC'min +
// RE) with RC'min the least corner value. It needs each RC level's and
// RE's value known: it gives 0 unless each of those levels admits one
// value.
func (f *feedbackPlan) headroomBelow(di, top, rcLo, rcHi, re int, cnt *counters) float64 {
	e := f.e
	if top <= 0 || top > len(e.vs.levels) {
		return 0
	}
	vRE := e.admitted(fRE, re)
	if len(vRE) != 1 {
		return 0
	}
	d := &e.devs[di]
	high := e.lay.highEnds(e.lay.lowVCE)
	b := e.build(combo{dev: di, lv: [maxPos]int{top - 1, rcLo, re}, val: [maxPos]int{e.vs.levels[top-1].values[0], 0, vRE[0]}})
	var st solver.Stage
	rcMin, rcMax := math.Inf(1), 0.0
	for rc := rcLo; rc <= rcHi; rc++ {
		vRC := e.admitted(fRC, rc)
		if len(vRC) != 1 {
			return 0
		}
		b.Resistors[solver.RC] = e.vs.values[vRC[0]].spec
		st = b.CornerStage(high, false, true, true)
		rcMin, rcMax = min(rcMin, st.R_Ohm[solver.RC]), max(rcMax, st.R_Ohm[solver.RC])
	}
	st.R_Ohm[solver.RC] = rcMax
	st.R_Ohm[solver.RF] = e.vs.levels[top-1].ohm * (1 + e.vs.tcrMax_PPMPerK*1e-6*math.Abs(e.s.ambMax-solver.TCRReference_C))
	cnt.solves++
	op, err := solver.SolveSelfHeated(st, d.vceLow, e.s.ambMax, d.thetaJA, d.tjMax_C)
	if err != nil || op.Region != solver.Active {
		return 0
	}
	return e.headroomSat(d, math.Abs(st.VCC_V)-op.IC_A*(rcMin+st.R_Ohm[solver.RE]))
}

// rfBlock is how many RF levels of a window share one beta floor
// (scoreBlock).
const rfBlock = 8

// uRC is bound U-RC at RC level rc and above: RC carries IE ≥ IC ≥
// icLo, so it dissipates at least icLo²·RC, over the best allowance of any
// value (so the floor rises with the level).
func (f *feedbackPlan) uRC(bd bounds, rc int) float64 {
	return bd.icLo * bd.icLo * f.e.vs.levels[rc].ohm / f.e.vs.allowHotMax_W
}

// betaFloorRC is bound F-B at a sum RC + RE in grid cell g:
// betaFloorSums over the cell, [R(g), R(g+1)], a floor at every sum in
// it, kept in f.fb.
func (f *feedbackPlan) betaFloorRC(dv *device, bd bounds, g int) float64 {
	k := uint64(int64(g))
	slot := &f.fb[(k*0x9e3779b97f4a7c15)>>(64-f.fbBits)]
	if slot.key == k && slot.dv == dv && slot.icLo == bd.icLo && slot.icHi == bd.icHi {
		return slot.floor
	}
	fl := f.betaFloorSums(dv, bd, f.gridOhm(g), f.gridOhm(g+1))
	*slot = fbEntry{k, dv, fl, bd.icLo, bd.icHi}
	return fl
}

// qbParts is how many equal parts of the IC window betaQFloorSums takes:
// narrower parts give a higher floor at more cost per part (E96 with
// pairs, collector feedback at 1 mA: 8 parts 1.8 s, 16 parts 1.0 s, 32
// parts 1.04 s).
const qbParts = 16

// qbFloors is F-QB's floor on each part of an IC window: part i covers
// [lo + i·step, lo + (i+1)·step].
type qbFloors struct {
	lo, step float64
	floor    [qbParts]float64
}

// least is the least floor over the parts: F-QB over the whole window.
func (qf qbFloors) least() float64 { return slices.Min(qf.floor[:]) }

// window returns the currents of the parts whose floor is at most need:
// every build whose w_QPoint·q + w_Beta·β is at most need has its IC in
// [lo, hi]; ok is false when no part is.
func (qf qbFloors) window(need float64) (lo, hi float64, ok bool) {
	first, last := -1, -1
	for i, v := range qf.floor {
		if v <= need {
			if first < 0 {
				first = i
			}
			last = i
		}
	}
	if first < 0 {
		return 0, 0, false
	}
	return qf.lo + float64(first)*qf.step, qf.lo + float64(last+1)*qf.step, true
}

// withUse is qf with the utilization term joined to each part (bound
// F-QBU): a build whose hottest part carries at least coef·IC² of
// utilization (RC and RE carry IE ≥ IC in collector feedback) and whose
// IC lies in part i has w_Utilization·max(0, U − use) at least
// w_Utilization·max(0, coef·a² − use), a the part's least current.
func (qf qbFloors) withUse(coef, use, wU float64) qbFloors {
	for i := range qf.floor {
		a := qf.lo + float64(i)*qf.step
		qf.floor[i] += wU * max(0, coef*a*a-use)
	}
	return qf
}

// betaQFloorSums is bounds F-Q and F-B together (F-QB) over the sums RC +
// RE in [rLo, rHi], for the builds of dv whose nominal IC lies in the
// window of bd and is at least xLo: on each of qbParts equal parts [a, b]
// of the window from max(icLo, xLo) up, the QPoint term is at least F-Q's
// least over the sums and the currents in the part (convex in the
// current: the least over x ≥ a, or the value at b when that least lies
// above b), and the beta term at least F-B with [a, b] as the window
// (betaFloorSums). The least over the parts of w_QPoint·q + w_Beta·β
// floors the two terms' sum; taken apart, each term's floor lies where
// the other's is least (far off target F-B is least, at the target F-Q).
// The parts over what is left of the threshold narrow the IC window.
func (f *feedbackPlan) betaQFloorSums(dv *device, bd bounds, rLo, rHi, xLo, kE, vceLo, vceHi float64) qbFloors {
	e, w := f.e, f.e.s.w
	lo := min(max(bd.icLo, xLo), bd.icHi)
	qf := qbFloors{lo: lo, step: (bd.icHi - lo) / qbParts}
	for i := range qbParts {
		a := lo + (bd.icHi-lo)*float64(i)/qbParts
		b := lo + (bd.icHi-lo)*float64(i+1)/qbParts
		q, at := e.feedbackQLeast(rLo, rHi, a, kE, vceLo, vceHi)
		if at > b {
			q = e.feedbackQAt(b, rLo, rHi, a, kE, vceLo, vceHi)
		}
		part := bd
		part.icLo, part.icHi = a, b
		qf.floor[i] = w.QPoint*q*(1-1e-12) + w.Beta*f.betaFloorSums(dv, part, rLo, rHi)
	}
	return qf
}

// betaQFloorRC is betaQFloorSums over grid cell g, [R(g), R(g+1)] (a
// floor at every sum in it), memoized in f.qb like fb.
func (f *feedbackPlan) betaQFloorRC(dv *device, bd bounds, g int, xLo, kE, vceLo, vceHi float64) *qbEntry {
	k := uint64(int64(g))
	slot := &f.qb[k&f.cellMask]
	if slot.key == k && slot.dv == dv && slot.icLo == bd.icLo && slot.icHi == bd.icHi && slot.xLo == xLo {
		return slot
	}
	parts := f.betaQFloorSums(dv, bd, f.gridOhm(g), f.gridOhm(g+1), xLo, kE, vceLo, vceHi)
	*slot = qbEntry{key: k, dv: dv, icLo: bd.icLo, icHi: bd.icHi, xLo: xLo, parts: parts, least: parts.least()}
	return slot
}

// qbBlockStep is the width (in ln Ω) of the blocks of sums sumsQBLeast
// takes F-QB over: 0.25 %.
const qbBlockStep = 0.0025

// sumsQBLeast is F-QB (betaQFloorSums, currents from 0) over every sum
// in [rLo, rHi]: the least over the blocks of qbBlockStep that cover it,
// each memoized in f.blocks for the device and the IC window it was taken
// for (a floor taken over a wider window, at a higher threshold, holds
// for a narrower one and is kept while it is over stop). The blocks are
// taken outward from the one holding rAt, where the floor tends to be
// least, and the scan returns at the first block at or under stop (its
// floor, then an upper end of the least, which is all a caller asking
// whether the least is over stop needs).
func (f *feedbackPlan) sumsQBLeast(dv *device, bd bounds, rLo, rHi, rAt, stop, kE, vceLo, vceHi float64) float64 {
	block := func(r float64) int { return int(math.Floor(math.Log(r)/qbBlockStep)) - f.blockBase }
	b0, b1 := block(rLo), block(rHi)
	if b0 < 0 || b1 >= len(f.blocks) {
		return 0 // outside the sums of two levels: no floor kept
	}
	floorAt := func(b int) float64 {
		v := &f.blocks[b]
		if v.holds(dv, bd) && (v.floor > stop || v.icLo == bd.icLo && v.icHi == bd.icHi) {
			return v.floor
		}
		k := b + f.blockBase
		lo, hi := math.Exp(float64(k)*qbBlockStep), math.Exp(float64(k+1)*qbBlockStep)
		qf := f.betaQFloorSums(dv, bd, lo*(1-1e-12), hi*(1+1e-12), 0, kE, vceLo, vceHi)
		*v = keptFloor{dv, qf.least(), bd.icLo, bd.icHi}
		return v.floor
	}
	// The blocks go by groups of qbGroup, outward from the one holding
	// rAt; a whole group inside the range takes its kept least (f.groups)
	// when that holds for this window and is over stop.
	start := min(max(block(rAt), b0), b1) / qbGroup
	g0, g1 := b0/qbGroup, b1/qbGroup
	least := math.Inf(1)
	group := func(g int) float64 {
		lo, hi := max(g*qbGroup, b0), min((g+1)*qbGroup-1, b1)
		whole := lo == g*qbGroup && hi == (g+1)*qbGroup-1
		ge := &f.groups[g]
		if whole && ge.holds(dv, bd) && ge.floor > stop {
			return ge.floor
		}
		v, wLo, wHi := math.Inf(1), 0.0, math.Inf(1)
		for b := lo; b <= hi; b++ {
			v = min(v, floorAt(b))
			wLo, wHi = max(wLo, f.blocks[b].icLo), min(wHi, f.blocks[b].icHi)
		}
		if whole {
			// each block's floor holds for every window inside its own,
			// so the least holds inside all of them
			*ge = keptFloor{dv, v, wLo, wHi}
		}
		return v
	}
	for d := 0; start-d >= g0 || start+d <= g1; d++ {
		if start-d >= g0 {
			least = min(least, group(start-d))
		}
		if d > 0 && start+d <= g1 {
			least = min(least, group(start+d))
		}
		if least <= stop {
			return least
		}
	}
	return least
}

// qbGroup is how many blocks of sums share one kept least in
// sumsQBLeast.
const qbGroup = 32

// blockSettles reports whether F-RF's block of RC levels with sums in
// [rLo, rHi] is over the threshold by its other floors fl, of which qfl
// is F-Q's, and the beta term's: with pairs, F-QB from the kept blocks of
// sums (sumsQBLeast) in place of F-Q; with singles alone, whose RC levels
// are few, F-B over the block taken afresh (betaFloorSums), which costs
// less than F-QB's blocks.
func (f *feedbackPlan) blockSettles(dv *device, bd bounds, rLo, rHi, rAt, fl, qfl, kE, vceLo, vceHi float64) bool {
	if f.e.vs.hasPairOnly() {
		need := bd.thr - (fl - qfl)
		return f.sumsQBLeast(dv, bd, rLo, rHi, rAt, need, kE, vceLo, vceHi) > need
	}
	return fl+f.e.s.w.Beta*f.betaFloorSums(dv, bd, rLo, rHi) > bd.thr
}

// betaFloorWindow is bound B over the RF window lo..hi of the builds of
// dv whose RC + RE lies in grid cell g (R_TH = RF between the window's
// ends, RE' = RC + RE, baseLoop) with nominal IC in the window of bd:
// taken over the cell, [R(g), R(g+1)] (bound B over a range of RE, a
// floor at every sum in it), and kept in f.wb, so the pairs of
// neighbouring sums with the same RF window share it.
func (f *feedbackPlan) betaFloorWindow(dv *device, bd bounds, g, lo, hi int) float64 {
	h := (uint64(int64(g))*0x9e3779b97f4a7c15 ^ uint64(lo)*0xc2b2ae3d27d4eb4f ^ uint64(hi)*0x165667b19e3779f9) >> (64 - f.fbBits)
	slot := &f.wb[h]
	if slot.g == g && slot.lo == lo && slot.hi == hi && slot.dv == dv && slot.icLo == bd.icLo && slot.icHi == bd.icHi {
		return slot.floor
	}
	lv := f.e.vs.levels
	fl := f.e.betaFloor(dv, betaWindow{RTH: lv[lo].ohm, RTHMax: lv[hi].ohm, RE: f.gridOhm(g), REMax: f.gridOhm(g + 1), ICLo: bd.icLo, ICHi: bd.icHi})
	*slot = wbEntry{g, lo, hi, dv, fl, bd.icLo, bd.icHi}
	return fl
}

// betaFloorSums is bound B (betaFloor) over every build of dv with RC + RE
// in [rLo, rHi] whose nominal IC lies in the window of bd (bound F-B; the
// sum plays RE's part, baseLoop). The base loop is VCC − VBE = IB·RF +
// IE·(RC + RE), so with IB ≤ IC/β_min at the nominal point (β_min =
// betaTypMin, the typical model's floor) every such build has RF ≥
// β_min·(VCC − VBE_hi − kE·icHi·rHi)/icHi (kE = 1 + 1/β_min); R_TH runs
// from there to the largest level.
func (f *feedbackPlan) betaFloorSums(dv *device, bd bounds, rLo, rHi float64) float64 {
	e := f.e
	vHi := vbeHi(dv, bd.icHi)
	kE := 1 + 1/dv.betaTypMin
	rfMin := dv.betaTypMin * (e.s.vcc - vHi - kE*bd.icHi*rHi) / bd.icHi
	if !(rfMin > 0) {
		return 0
	}
	return e.betaFloor(dv, betaWindow{RTH: rfMin, RTHMax: max(rfMin, e.vs.levels[len(e.vs.levels)-1].ohm), RE: rLo, REMax: rHi,
		ICLo: bd.icLo, ICHi: bd.icHi})
}

// feedbackQFloorBlock is bound F-Q: a lower bound on the QPoint term of
// every collector-feedback build with RC + RE in [rLo, rHi] and nominal IC
// at least xLo (0: no such bound; bound F-RF). VCE is VCC − IE·(RC + RE)
// with IE between IC and kE·IC, so at a current x such a build's VCE lies
// in [VCC − kE·x·rHi, VCC − x·rLo], and the term is at least
// |x − IC_t|/IC_t plus that interval's distance from the target band over
// the span: a sum of maxima of linear functions, convex in x, so its least
// value over x ≥ xLo is at xLo or at a breakpoint above it: IC_t, where an
// end of the interval meets an end of the band, or where the two ends are
// equally far outside it.
func (e *evaluator) feedbackQFloorBlock(rLo, rHi, xLo, kE, vceLo, vceHi float64) float64 {
	q, _ := e.feedbackQLeast(rLo, rHi, xLo, kE, vceLo, vceHi)
	return q * (1 - 1e-12)
}

// feedbackQAt is F-Q's convex floor at a current x ≥ xLo (a smaller x
// counts as xLo): |x − IC_t|/IC_t plus the distance of
// [VCC − kE·x·rHi, VCC − x·rLo] from the band [vceLo, vceHi] over the span.
func (e *evaluator) feedbackQAt(x, rLo, rHi, xLo, kE, vceLo, vceHi float64) float64 {
	vcc, it := e.s.vcc, e.s.icT
	x = max(max(0, xLo), x)
	d := max(0, max(vcc-kE*x*rHi-vceHi, vceLo-(vcc-x*rLo)))
	return math.Abs(x-it)/it + d/e.span
}

// feedbackQLeast returns the least value of feedbackQAt over x ≥ xLo and
// a current where it is taken: a convex piecewise-linear function takes
// its least value at a breakpoint (feedbackQFloorBlock says which).
func (e *evaluator) feedbackQLeast(rLo, rHi, xLo, kE, vceLo, vceHi float64) (q, at float64) {
	vcc, it := e.s.vcc, e.s.icT
	at = max(max(0, xLo), it)
	q = e.feedbackQAt(at, rLo, rHi, xLo, kE, vceLo, vceHi)
	for _, x := range []float64{xLo, (vcc - vceLo) / rLo, (vcc - vceHi) / (kE * rHi), (vcc - vceHi) / rLo, (vcc - vceLo) / (kE * rHi),
		(2*vcc - vceHi - vceLo) / (kE*rHi + rLo)} {
		x = max(max(0, xLo), x)
		if v := e.feedbackQAt(x, rLo, rHi, xLo, kE, vceLo, vceHi); v < q {
			q, at = v, x
		}
	}
	return q, at
}

// feedbackICWindow narrows the IC window of the builds with RC + RE = r
// and IC at least xLo (0: no such bound) whose QPoint term can be at most
// d (bound F-QW): F-Q's floor at a current x ≥ xLo is convex and piecewise
// linear in x, so the currents where it is at most d form an interval
// around its least point, whose ends lie on the linear pieces next to it
// (feedbackQEdge). It returns [icLo, icHi] ∩ that interval, and ok false
// when the interval is empty.
func (e *evaluator) feedbackICWindow(r, xLo, kE, vceLo, vceHi, d, icLo, icHi float64) (lo, hi float64, ok bool) {
	q, x0 := e.feedbackQLeast(r, r, xLo, kE, vceLo, vceHi)
	if q*(1-1e-12) > d {
		return 0, 0, false
	}
	vcc := e.s.vcc
	// the pieces' ends: IC_t, where the VCE interval's ends meet the
	// band's, and xLo, below which the floor is constant
	bp := [4]float64{e.s.icT, (vcc - vceHi) / (kE * r), (vcc - vceLo) / r, xLo}
	f := func(x float64) float64 { return e.feedbackQAt(x, r, r, xLo, kE, vceLo, vceHi) * (1 - 1e-12) }
	lo = max(feedbackQEdge(f, d, x0, icLo, bp), xLo)
	hi = feedbackQEdge(f, d, x0, icHi, bp)
	return max(lo, icLo), min(hi, icHi), max(lo, icLo) <= min(hi, icHi)
}

// feedbackQEdge returns, for a convex piecewise-linear f whose pieces end
// at the points bp (in any order) with f(in) ≤ d, the point between in and
// out where f crosses d going from in toward out (out itself when f(out) ≤
// d): the first piece end where f is over d closes the piece the crossing
// lies on, and the crossing is solved on it. It is moved outward by 2⁻²⁴
// of |out − in| against rounding, so every point beyond it has f over d.
func feedbackQEdge(f func(float64) float64, d, in, out float64, bp [4]float64) float64 {
	fOut := f(out)
	if fOut <= d {
		return out
	}
	dir := 1.0
	if out < in {
		dir = -1
	}
	a, fa := in, f(in)
	b, fb := out, fOut
	// the nearest piece end past in toward out where f is over d
	for _, x := range bp {
		if t := (x - in) * dir; t > 0 && t < (b-in)*dir {
			if fx := f(x); fx > d {
				b, fb = x, fx
			}
		}
	}
	// the last piece end before b where f is at most d
	for _, x := range bp {
		if t := (x - in) * dir; t > (a-in)*dir && t < (b-in)*dir {
			if fx := f(x); fx <= d {
				a, fa = x, fx
			}
		}
	}
	x := a + (d-fa)*(b-a)/(fb-fa)
	x += dir * math.Abs(out-in) * 0x1p-24
	if (x-out)*dir > 0 {
		return out
	}
	return x
}
