package picker

import (
	"math"
	"slices"
	"sync"
	"sync/atomic"
)

// pool keeps the best `size` builds by the ranking order (see less). It
// is safe for concurrent use: add locks, threshold reads an atomic copy.
type pool struct {
	size int
	// fold keeps one build per group of near-duplicates (fold.go): the
	// best one.
	fold  bool
	mu    sync.Mutex
	items []*evaluated
	thr   atomic.Uint64 // math.Float64bits of the threshold
	last  atomic.Uint64 // math.Float64bits of lastScore
	// cut, known, failOK: a pool of a later round (newRoundPool).
	cut    float64
	known  map[string]bool
	groups map[foldGroup]bool
	failOK bool
}

// newPool returns an empty pool of the given size; with fold it keeps
// only the best build of each group of near-duplicates.
func newPool(size int, fold bool) *pool {
	return newRoundPool(size, fold, math.Inf(1), false, nil)
}

// newRoundPool returns a pool for a later round of the search: like
// newPool, but it admits only builds whose final score can be at most cut
// (finalFloor) and that are not among known (the builds of the rounds
// before, already ranked); with fold, none of a known build's group
// either (that build is the best of its group). Its threshold and
// lastScore never exceed cut. A build known to fail enters only with
// failOK (the cut is a failing build's).
func newRoundPool(size int, fold bool, cut float64, failOK bool, known []*evaluated) *pool {
	p := &pool{size: size, fold: fold, cut: cut, failOK: failOK}
	if known != nil {
		p.known, p.groups = map[string]bool{}, map[foldGroup]bool{}
		for _, ev := range known {
			p.known[ev.key] = true
			if fold {
				p.groups[ev.group()] = true
			}
		}
	}
	p.thr.Store(math.Float64bits(cut))
	p.last.Store(math.Float64bits(cut))
	return p
}

// admits reports whether a later round's pool may take ev at all.
func (p *pool) admits(ev *evaluated) bool {
	if p.known == nil {
		return true
	}
	if ev.finalFloor() > p.cut || len(ev.failing) > 0 && !p.failOK || p.known[ev.key] {
		return false
	}
	return !p.fold || !p.groups[ev.group()]
}

// add offers ev to the pool; a build already in it is ignored.
func (p *pool) add(ev *evaluated) {
	p.mu.Lock()
	defer p.mu.Unlock()
	if !p.admits(ev) {
		return
	}
	if len(p.items) == p.size && !less(ev, p.items[len(p.items)-1]) {
		return
	}
	if slices.ContainsFunc(p.items, func(x *evaluated) bool { return x.key == ev.key }) {
		return
	}
	if p.fold {
		// a near-duplicate replaces its group's member only when better
		ev.grp = ev.group()
		if i := slices.IndexFunc(p.items, func(x *evaluated) bool { return x.grp == ev.grp }); i >= 0 {
			if !less(ev, p.items[i]) {
				return
			}
			p.items = slices.Delete(p.items, i, i+1)
		}
	}
	i, _ := slices.BinarySearchFunc(p.items, ev, func(x, y *evaluated) int {
		if less(x, y) {
			return -1
		}
		return 1
	})
	p.items = slices.Insert(p.items, i, ev)
	if len(p.items) > p.size {
		p.items = p.items[:p.size]
	}
	p.thr.Store(math.Float64bits(p.computeThreshold()))
	if len(p.items) == p.size {
		p.last.Store(math.Float64bits(math.Min(p.cut, p.items[len(p.items)-1].score)))
	}
}

// lastScore is the score of the last member once the pool is full (+Inf
// before), passing or not: a build known to fail with a score above it
// cannot enter (it would rank below the last member either way).
func (p *pool) lastScore() float64 { return math.Float64frombits(p.last.Load()) }

// threshold is the score a build must not exceed to enter the pool: the
// last member's score once the pool is full of passing builds, +Inf
// before. A build (or region of builds) whose score is bounded below by
// more than the threshold can never enter, whether it passes or not: a
// passing build would rank below the last member, a failing one below
// every passing build.
func (p *pool) threshold() float64 { return math.Float64frombits(p.thr.Load()) }

// computeThreshold is threshold from the members (called under the lock).
func (p *pool) computeThreshold() float64 {
	if len(p.items) < p.size {
		return p.cut
	}
	last := p.items[len(p.items)-1]
	if len(last.failing) > 0 {
		return p.cut
	}
	return math.Min(p.cut, last.score)
}
