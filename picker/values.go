package picker

import (
	"cmp"
	"math"
	"slices"
	"sync"

	"biasbin/solver"
)

// value is one way to fill a resistor position: a single stocked line or
// a series or parallel pair of two lines (the same line twice when its
// quantity allows).
type value struct {
	ohm   float64
	arr   string
	lines [2]int // indexes into the resistor lines; lines[1] = -1 for a single
	spec  solver.ResistorSpec
	// rank is the value's place in its level's preference order: the
	// tie-break uses it, never the index into valueSet.values, which
	// follows the order the stock lines came in.
	rank int
	// kept is a part already on the board (Request.Keep): no stock line.
	kept bool
	// shape is the value's group of near-duplicates within its level
	// (fold.go: setShapes).
	shape int
}

// parts returns the line indexes the value draws one part from each.
func (v value) parts() []int {
	if v.kept {
		return nil
	}
	if v.lines[1] < 0 {
		return v.lines[:1]
	}
	return v.lines[:]
}

// level is one distinct nominal resistance with every value that gives it.
// The nominal operating point depends only on the levels of a build; the
// values of a level differ in tolerance, TCR and rating.
type level struct {
	ohm    float64
	values []int // indexes into valueSet.values, in preference order
	// stock are the values drawn from stock (values without the kept
	// parts; the same slice when the set holds none)
	stock []int
	// allowHot_W is the largest derated, margined allowance at the hottest
	// ambient among the level's values (for utilization bounds).
	allowHot_W float64
	// allowHotOne_W and allowHotPair_W split it: the largest among the
	// values that are one part (a single or a kept part) and among the
	// pairs, 0 where the level holds none.
	allowHotOne_W, allowHotPair_W float64
	// singles is how many of stock are singles (they come first).
	// pairOnly is true when every value of the level is a pair (no
	// stocked single, no kept part): any build with this level in a
	// position carries at least one extra part there (bound P, doc.go).
	singles  int
	pairOnly bool
}

// valueMemo keeps the value sets one Pick has built: a set depends on the
// stock lines, the boards, the limits and the hottest ambient (the same
// for every search of one request), whether pairs are searched and the
// kept parts, so the topologies of AnyTopology and the singles pass share
// theirs instead of building each anew. A set is read-only once built.
type valueMemo struct {
	mu   sync.Mutex
	sets []memoSet
}

// memoSet is one value set the memo holds and what it was built for.
type memoSet struct {
	pairs bool
	kept  []solver.ResistorSpec
	vs    *valueSet
}

// get returns the set built for pairs and kept, building it with build
// the first time (every time on a nil memo).
func (m *valueMemo) get(pairs bool, kept []solver.ResistorSpec, build func() *valueSet) *valueSet {
	if m == nil {
		return build()
	}
	m.mu.Lock()
	defer m.mu.Unlock()
	for _, s := range m.sets {
		if s.pairs == pairs && slices.Equal(s.kept, kept) {
			return s.vs
		}
	}
	vs := build()
	m.sets = append(m.sets, memoSet{pairs: pairs, kept: slices.Clone(kept), vs: vs})
	return vs
}

// valueSet is every value the search may put in a position, grouped into
// levels sorted by ascending resistance.
type valueSet struct {
	lines  []Resistor
	values []value
	levels []level
	// allowHotMax_W is the largest allowHot_W of any level;
	// allowHotOneMax_W the largest allowance of a value that is one part
	// (a single or a kept part: no extra part), 0 when there is none.
	allowHotMax_W, allowHotOneMax_W float64
	// tcrMax_PPMPerK is the largest |TCR| of any value.
	tcrMax_PPMPerK float64
	// hotHighMin is the least factor a worst-case corner at the hottest
	// ambient multiplies any value by at the high end of its tolerance
	// (solver.ResistorSpec.CornerFactor), hotLowMax the largest at the
	// low end.
	hotHighMin, hotLowMax float64
	// kept are the value indexes of the kept parts, in the order given
	// to buildValues.
	kept []int
	// nextSingle[i] is the first level at or above i holding a single
	// (len(levels) when none); prevSingle[i] the last at or below i (−1
	// when none). With them a loop whose budget leaves no room for a
	// pair's extra part steps over the pair-only levels at no cost.
	nextSingle, prevSingle []int
	// ohms is every level's resistance, in level order: a search over
	// them reads one word per level, not a whole level.
	ohms []float64
	// singleLevels lists the levels holding a single, ascending;
	// singleRank[i] is how many of them lie below level i (i ≤ len(levels)).
	singleLevels, singleRank []int
}

// sameOhm reports whether two resistances are one level (relative 1e-9,
// so 4.7e3 read from text and 4700 agree).
func sameOhm(a, b float64) bool { return math.Abs(a-b) <= 1e-9*math.Max(a, b) }

// arrRank orders arrangements: singles before series before parallel
// pairs, and kept parts last.
func arrRank(a string) int {
	switch a {
	case Single:
		return 0
	case Series:
		return 1
	case Kept:
		return 3
	}
	return 2
}

// buildValues forms the values from the usable lines: each line with at
// least `boards` parts as a single and, with pairs, every worthwhile series
// and parallel pair of two lines each holding `boards` parts (one line
// twice when it holds 2·boards). Levels are ascending; within a level the
// values are ordered single, series, parallel, then tighter tolerance,
// higher rating, lower TCR magnitude, lower line IDs — the documented
// tie-break. Each kept part (Request.Keep) is one more value, after the
// stocked ones of its level; only its own position takes it.
func buildValues(lines []Resistor, boards int, pairs bool, hotAmbient_C float64, lim solver.Limits, kept ...solver.ResistorSpec) valueSet {
	vs := valueSet{lines: lines}
	if pairs {
		vs.values = make([]value, 0, len(lines)*(len(lines)+2))
	}
	for i, r := range lines {
		if r.Qty < boards || !(r.Ohm > 0) {
			continue
		}
		vs.values = append(vs.values, value{ohm: r.Ohm, arr: Single, lines: [2]int{i, -1}, spec: partSpec(r)})
	}
	if pairs {
		for i, a := range lines {
			if a.Qty < boards || !(a.Ohm > 0) {
				continue
			}
			for j := i; j < len(lines); j++ {
				b := lines[j]
				if !(b.Ohm > 0) || b.Qty < boards || (i == j && a.Qty < 2*boards) || !pairWorthwhile(a, b) {
					continue
				}
				s := seriesSpec(a, b)
				vs.values = append(vs.values, value{ohm: s.Nominal_Ohm, arr: Series, lines: [2]int{i, j}, spec: s})
				p := parallelSpec(a, b)
				vs.values = append(vs.values, value{ohm: p.Nominal_Ohm, arr: Parallel, lines: [2]int{i, j}, spec: p})
			}
		}
	}
	for _, k := range kept {
		vs.kept = append(vs.kept, len(vs.values))
		vs.values = append(vs.values, value{ohm: k.Nominal_Ohm, arr: Kept, lines: [2]int{-1, -1}, spec: k, kept: true})
	}
	idOf := func(v value, k int) int64 {
		if v.lines[k] < 0 {
			return -1
		}
		return lines[v.lines[k]].ID
	}
	order := indexes(len(vs.values))
	slices.SortStableFunc(order, func(x, y int) int {
		a, b := vs.values[x], vs.values[y]
		if !sameOhm(a.ohm, b.ohm) {
			return cmp.Compare(a.ohm, b.ohm)
		}
		return cmp.Or(
			cmp.Compare(arrRank(a.arr), arrRank(b.arr)),
			cmp.Compare(a.spec.Tol, b.spec.Tol),
			-cmp.Compare(a.spec.Rated_W, b.spec.Rated_W),
			cmp.Compare(math.Abs(a.spec.TCR_PPMPerK), math.Abs(b.spec.TCR_PPMPerK)),
			cmp.Compare(idOf(a, 0), idOf(b, 0)),
			cmp.Compare(idOf(a, 1), idOf(b, 1)),
		)
	})
	vs.hotHighMin = math.Inf(1)
	// a level's values are a run of order (it is sorted by resistance)
	for k, vi := range order {
		v := vs.values[vi]
		allow := allowance(v.spec, hotAmbient_C, lim)
		if n := len(vs.levels); n > 0 && sameOhm(vs.levels[n-1].ohm, v.ohm) {
			l := &vs.levels[n-1]
			vs.values[vi].rank = len(l.values)
			l.values = l.values[:len(l.values)+1]
			l.allowHot_W = math.Max(l.allowHot_W, allow)
		} else {
			vs.levels = append(vs.levels, level{ohm: v.ohm, values: order[k : k+1 : len(order)], allowHot_W: allow})
		}
		if l := &vs.levels[len(vs.levels)-1]; v.lines[1] < 0 {
			l.allowHotOne_W = math.Max(l.allowHotOne_W, allow)
		} else {
			l.allowHotPair_W = math.Max(l.allowHotPair_W, allow)
		}
		vs.allowHotMax_W = math.Max(vs.allowHotMax_W, allow)
		vs.tcrMax_PPMPerK = math.Max(vs.tcrMax_PPMPerK, math.Abs(v.spec.TCR_PPMPerK))
		vs.hotHighMin = math.Min(vs.hotHighMin, v.spec.CornerFactor(true, hotAmbient_C))
		vs.hotLowMax = math.Max(vs.hotLowMax, v.spec.CornerFactor(false, hotAmbient_C))
		if v.lines[1] < 0 {
			vs.allowHotOneMax_W = math.Max(vs.allowHotOneMax_W, allow)
		}
	}
	for i := range vs.levels {
		l := &vs.levels[i]
		l.values = l.values[:len(l.values):len(l.values)]
		l.stock = l.values
		if len(kept) > 0 {
			l.stock = slices.DeleteFunc(slices.Clone(l.values), func(vi int) bool { return vs.values[vi].kept })
		}
	}
	vs.setShapes()
	n := len(vs.levels)
	vs.nextSingle, vs.prevSingle = make([]int, n), make([]int, n)
	next := n
	for i := n - 1; i >= 0; i-- {
		l := &vs.levels[i]
		for _, vi := range l.stock {
			if vs.values[vi].lines[1] < 0 {
				l.singles++
			}
		}
		l.pairOnly = l.singles == 0 && len(l.stock) == len(l.values) // a kept part is no pair
		if !l.pairOnly {
			next = i
		}
		vs.nextSingle[i] = next
	}
	prev := -1
	vs.singleRank = make([]int, n+1)
	for i := range n {
		vs.singleRank[i] = len(vs.singleLevels)
		if !vs.levels[i].pairOnly {
			prev = i
			vs.singleLevels = append(vs.singleLevels, i)
		}
		vs.prevSingle[i] = prev
	}
	vs.singleRank[n] = len(vs.singleLevels)
	vs.ohms = make([]float64, n)
	for i, l := range vs.levels {
		vs.ohms[i] = l.ohm
	}
	return vs
}

// firstIn is firstFrom over the levels lo..hi: the first level where the
// monotone predicate f turns true (hi + 1 when it never does), searching
// outward from the level guess. With singles it probes only the levels
// holding a single and returns the first of them where f is true: the
// pair-only levels it passes over are the caller's to step over (bound
// P), and f, monotone over every level, is monotone over these.
func (vs *valueSet) firstIn(lo, hi, guess int, singles bool, f func(int) bool) int {
	if lo > hi {
		return hi + 1
	}
	guess = max(lo, min(guess, hi))
	if !singles {
		return lo + firstFrom(hi-lo+1, guess-lo, func(i int) bool { return f(lo + i) })
	}
	a, b := vs.singleRank[lo], vs.singleRank[hi+1]
	k := firstFrom(b-a, vs.singleRank[guess]-a, func(k int) bool { return f(vs.singleLevels[a+k]) })
	if k == b-a {
		return hi + 1
	}
	return vs.singleLevels[a+k]
}

// seedSnaps lists the ways a plan's seed takes its levels: as the hand
// method puts them (false) and, when some level holds only pairs, also
// snapped to levels holding a single (true). A pair costs a placement
// (bound P), so the best builds of a wall with pairs mostly hold singles,
// and seeds among pairs alone leave the threshold high for long.
func (vs *valueSet) seedSnaps() []bool {
	if !vs.hasPairOnly() {
		return []bool{false}
	}
	return []bool{false, true}
}

// hasPairOnly reports whether some level holds only pairs.
func (vs *valueSet) hasPairOnly() bool { return len(vs.singleLevels) < len(vs.levels) }

// eachAround calls fn on every pair of levels (a, c) with a among level
// x and the levels next to it below and above, and c the same for y (with
// singles, the nearest levels holding a single): the 3×3 a seed scores.
func (vs *valueSet) eachAround(x, y int, singles bool, fn func(a, c int)) {
	around := func(i int) [3]int { return [3]int{vs.down(i-1, singles), i, vs.up(i+1, singles)} }
	for _, a := range around(x) {
		for _, c := range around(y) {
			if a >= 0 && a < len(vs.levels) && c >= 0 && c < len(vs.levels) {
				fn(a, c)
			}
		}
	}
}

// partsFloor is the least parts term (extra parts) of any value of level i.
func (vs *valueSet) partsFloor(i int) float64 {
	if vs.levels[i].pairOnly {
		return 1
	}
	return 0
}

// up returns the first level at or above i a loop must visit: i itself,
// or, with singles (no room for a pair's extra part), the first level at
// or above i holding a single (len(levels) when none).
func (vs *valueSet) up(i int, singles bool) int {
	if !singles || i < 0 || i >= len(vs.levels) {
		return i
	}
	return vs.nextSingle[i]
}

// down is up going downward: i, or with singles the last level at or
// below i holding a single (−1 when none).
func (vs *valueSet) down(i int, singles bool) int {
	if !singles || i < 0 || i >= len(vs.levels) {
		return i
	}
	return vs.prevSingle[i]
}

// allowance is the power a value may dissipate at ambient_C within the
// design margin; +Inf for an unrated part (never limits).
func allowance(s solver.ResistorSpec, ambient_C float64, lim solver.Limits) float64 {
	if s.Rated_W <= 0 {
		return math.Inf(1)
	}
	return solver.ResistorAllowed_W(s.Rated_W, s.Knee_C, s.Max_C, ambient_C) * lim.ResistorMaxFraction
}

// levelAtOrAbove returns the index of the first level with ohm >= r
// (len(levels) when none).
func (vs *valueSet) levelAtOrAbove(r float64) int {
	i, _ := slices.BinarySearch(vs.ohms, r)
	return i
}
