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
}

// newPool returns an empty pool of the given size; with fold it keeps
// only the best build of each group of near-duplicates.
func newPool(size int, fold bool) *pool {
	p := &pool{size: size, fold: fold}
	p.thr.Store(math.Float64bits(math.Inf(1)))
	p.last.Store(math.Float64bits(math.Inf(1)))
	return p
}

// add offers ev to the pool; a build already in it is ignored.
func (p *pool) add(ev *evaluated) {
	p.mu.Lock()
	defer p.mu.Unlock()
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
		p.last.Store(math.Float64bits(p.items[len(p.items)-1].score))
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
		return math.Inf(1)
	}
	last := p.items[len(p.items)-1]
	if len(last.failing) > 0 {
		return math.Inf(1)
	}
	return last.score
}
