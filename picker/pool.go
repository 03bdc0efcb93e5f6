package picker

import (
	"math"
	"slices"
)

// pool keeps the best `size` builds by the ranking order (see less).
type pool struct {
	size  int
	items []*evaluated
}

// add offers ev to the pool; a build already in it is ignored.
func (p *pool) add(ev *evaluated) {
	if len(p.items) == p.size && !less(ev, p.items[len(p.items)-1]) {
		return
	}
	if slices.ContainsFunc(p.items, func(x *evaluated) bool { return x.key == ev.key }) {
		return
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
}

// threshold is the score a build must not exceed to enter the pool: the
// last member's score once the pool is full of passing builds, +Inf
// before. A build (or region of builds) whose score is bounded below by
// more than the threshold can never enter, whether it passes or not: a
// passing build would rank below the last member, a failing one below
// every passing build.
func (p *pool) threshold() float64 {
	if len(p.items) < p.size {
		return math.Inf(1)
	}
	last := p.items[len(p.items)-1]
	if len(last.failing) > 0 {
		return math.Inf(1)
	}
	return last.score
}
