package picker

import (
	"math"

	"biasbin/solver"
)

// counters of a search.
type counters struct {
	evaluated int64 // builds whose every pre-yield term was computed
	solves    int64
}

// scoreVariants scores every value combination of the tuple whose
// quantities fit, computing the cheap terms first and stopping as soon as
// a build's partial score exceeds the pool's threshold (the score of its
// last passing member; +Inf while it is not full of passing builds). Each
// build that is fully scored goes to keep.
func (e *evaluator) scoreVariants(t *tuple, p *pool, keep func(*evaluated), cnt *counters) {
	if !t.ok {
		return
	}
	n := e.lay.n
	base, thr := e.s.w.QPoint*t.q+e.s.w.Emitter*t.em, p.threshold()
	// bound U-Q at the tuple: the transistor's utilization is the same
	// for every combination and part of each one's (scoreOne's second
	// check, with the same terms)
	base += e.s.w.Utilization * e.transistorUse(&e.devs[t.c.dev], t.op)
	if base > thr {
		return
	}
	// bound B at the tuple: the floor of the beta term is the same for
	// every combination too (scoreOne's third check, with the same terms
	// and the floor it takes from the same cache)
	if w := e.s.w; !t.betaDone && w.Beta > 0 && !math.IsInf(thr, 1) {
		if base += w.Beta * e.betaFloorAt(t); base > thr {
			return
		}
	}
	// bound P: a combination with more positions filled by a pair than
	// the threshold leaves room for, with the terms and floors already
	// known, cannot enter (scoreOne's checks, with the same sums), so only the
	// combinations with at most maxPairs pairs are formed: a level's
	// singles come first in its stock, and a kept part is one part.
	maxPairs := 0
	if e.s.w.Parts <= 0 {
		maxPairs = n
	}
	for maxPairs < n && base+e.s.w.Parts*float64(maxPairs+1) <= thr {
		maxPairs++
	}
	var L [maxPos][]int
	var one [maxPos]int // L[i][:one[i]] are one part each
	for i := range n {
		// a kept position takes its kept part, a free one stock
		L[i] = e.admitted(i, t.c.lv[i])
		one[i] = len(L[i])
		if !e.kept[i] {
			one[i] = e.vs.levels[t.c.lv[i]].singles
		}
		if maxPairs == 0 {
			L[i] = L[i][:one[i]]
		}
		if len(L[i]) == 0 {
			return
		}
	}
	c := t.c
	e.eachVariant(&L, &one, n, maxPairs, &c, 0, 0, func() { e.scoreOne(t, c, p, keep, cnt) })
}

// eachVariant sets c.val[i:n] to every combination of the values L[i:n]
// with at most maxPairs positions (pairs of them already in c.val[:i])
// outside their one-part prefix L[j][:one[j]], the last position fastest,
// and calls fn on each.
func (e *evaluator) eachVariant(L *[maxPos][]int, one *[maxPos]int, n, maxPairs int, c *combo, i, pairs int, fn func()) {
	if i == n {
		fn()
		return
	}
	vals := L[i]
	if pairs == maxPairs {
		vals = vals[:one[i]]
	}
	for k, v := range vals {
		c.val[i] = v
		if k < one[i] {
			e.eachVariant(L, one, n, maxPairs, c, i+1, pairs, fn)
		} else {
			e.eachVariant(L, one, n, maxPairs, c, i+1, pairs+1, fn)
		}
	}
}

// scoreOne scores one value combination of a solved tuple (see
// scoreVariants).
func (e *evaluator) scoreOne(t *tuple, c combo, p *pool, keep func(*evaluated), cnt *counters) {
	w := e.s.w
	thr, lastScore := p.threshold, p.lastScore
	partial := w.QPoint*t.q + w.Emitter*t.em + w.Parts*e.extraParts(c)
	if partial > thr() || !e.fitsQuantity(c) {
		return
	}
	b := e.build(c)
	dis := solver.EvalDissipation(b, t.op, e.s.ambMax, e.s.lim)
	partial += w.Utilization * dis.MaxUtilization
	if partial > thr() {
		return
	}
	if th := thr(); !t.betaDone && !math.IsInf(th, 1) && w.Beta > 0 &&
		partial+w.Beta*e.betaFloorAt(t) > th {
		return // the beta term's floor settles it without two solves
	}
	e.betaSpread(t, cnt)
	if !t.betaOK {
		return
	}
	partial += w.Beta * math.Abs(t.beta)
	if partial > thr() {
		return
	}
	hlb, fails := e.headroomFloor(c.dev, b, cnt)
	fails = fails || t.bench != nil
	if th := thr(); fails && !math.IsInf(th, 1) && !p.failOK || partial+w.Headroom*hlb > th {
		return
	}
	if fails && partial+w.Headroom*hlb > lastScore() {
		return // fails for certain and ranks below the last member
	}
	ev := e.finish(c, b, t, dis.MaxUtilization)
	cnt.evaluated++
	if ev != nil {
		keep(ev)
	}
}

// scoreBlock scores the solved tuples ts of one device, which differ only
// in position pos, one that sets the base loop's R_TH alone (baseLoop),
// after bound B over all of them: the floor over R_TH and the nominal IC
// between the least and largest of the active ones is a floor on each
// one's beta term; with its exact QPoint and emitter terms and the parts
// floor pf of the fixed positions plus its own level's at pos, it may
// settle a tuple before scoreVariants takes the floor at the tuple alone
// (betaFloorAt): one floor where there were len(ts).
func (e *evaluator) scoreBlock(ts []*tuple, pos int, pf float64, p *pool, cnt *counters) {
	w := e.s.w
	bF := 0.0
	if th := p.threshold(); len(ts) > 1 && w.Beta > 0 && !math.IsInf(th, 1) {
		win := betaWindow{RTH: math.Inf(1), ICLo: math.Inf(1)}
		for _, t := range ts {
			if !t.ok || t.op.Region != solver.Active {
				continue
			}
			rth, re, rc := e.baseLoop(t.r)
			win.RTH, win.RTHMax = min(win.RTH, rth), max(win.RTHMax, rth)
			win.ICLo, win.ICHi = min(win.ICLo, t.op.IC_A), max(win.ICHi, t.op.IC_A)
			win.RE, win.RCMin, win.RCMax = re, rc, rc
		}
		if win.ICHi > 0 {
			bF = e.betaFloor(&e.devs[ts[0].c.dev], win)
		}
	}
	for _, t := range ts {
		if bF > 0 && t.ok && t.op.Region == solver.Active && !t.betaDone &&
			pf+e.partsFloor(t.c.lv[pos])+w.QPoint*t.q+w.Emitter*t.em+w.Beta*bF > p.threshold() {
			continue
		}
		e.scoreVariants(t, p, p.add, cnt)
	}
}

// extraParts is the parts term of a combo: one per position filled by a
// pair.
func (e *evaluator) extraParts(c combo) float64 {
	n := 0
	for _, vi := range c.val[:e.lay.n] {
		if e.vs.values[vi].lines[1] >= 0 {
			n++
		}
	}
	return float64(n)
}

// betaFloorAt is betaFloor at a solved tuple: its exact base-loop
// resistances (baseLoop) and nominal IC (0 unless the tuple is active at
// its nominal point).
//
// It depends on the tuple alone, so it is computed once and kept on the
// tuple for all of its value variants.
func (e *evaluator) betaFloorAt(t *tuple) float64 {
	if t.floorDone {
		return t.floorAt
	}
	t.floorDone = true
	if t.op.Region != solver.Active {
		return 0
	}
	ic := t.op.IC_A
	rth, re, rc := e.baseLoop(t.r)
	t.floorAt = e.betaFloor(&e.devs[t.c.dev], betaWindow{RTH: rth, RTHMax: rth, RE: re, RCMin: rc, RCMax: rc, ICLo: ic, ICHi: ic})
	return t.floorAt
}

// baseLoop maps a build's resistances onto the divider's base loop that
// betaFloor bounds, V_TH − VBE = IB·R_TH + IE·RE with VCE = V − IC·RC −
// IE·RE (V the span): the transistor's VBE, VCE and currents are the same
// in both circuits, so the bound carries over.
//
//   - divider: R_TH = R1‖R2, RE, RC (V_TH = VCC·R2/(R1 + R2));
//   - collector feedback: VCC − VBE = IB·RF + IE·(RC + RE) and VCE = VCC −
//     IE·(RC + RE), so R_TH = RF, RE' = RC + RE, RC' = 0 (V_TH = VCC);
//   - split supply: |VEE| − VBE = IB·RB + IE·RE and VCE = VCC + |VEE| −
//     IC·RC − IE·RE, so R_TH = RB, RE, RC on the span (V_TH = |VEE|).
func (e *evaluator) baseLoop(r [maxPos]float64) (rth, re, rc float64) {
	switch e.lay.topo {
	case solver.CollectorFeedback:
		return r[fRF], r[fRC] + r[fRE], 0
	case solver.SplitSupply:
		return r[sRB], r[sRE], r[sRC]
	}
	return r[iR1] * r[iR2] / (r[iR1] + r[iR2]), r[iRE], r[iRC]
}
