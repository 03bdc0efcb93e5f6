package picker

import (
	"math"
)

// plan is the search over one topology's positions. Each topology
// provides one; the divider is the first (collector feedback and split
// supply add their own plans over RF/RC/RE and RB/RC/RE).
type plan interface {
	// seed evaluates a few hand-method builds per device so the pool
	// fills early and the bounds start tight.
	seed(e *evaluator, p *pool, cnt *counters)
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
						e.scoreVariants(t, p.threshold, p.add, cnt)
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
	// cache of solved level tuples of the current device
	cache map[[nPos]int]*tuple
}

// tuple returns the (cached) solved level tuple of device dev.
func (d *dividerPlan) tuple(dev int, lv [nPos]int, cnt *counters) *tuple {
	if t, ok := d.cache[lv]; ok {
		return t
	}
	t := d.e.newTuple(dev, lv)
	cnt.solves++
	d.cache[lv] = t
	return t
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

// seed evaluates, for every device, hand-method builds: VE = VCC/10,
// VCC/5 and VCC/20; R_TH = 0.1, 0.03 and 0.3 (hFE min + 1)·RE; R1 then set
// by a search for the target current, RC for the target VCE.
func (d *dividerPlan) seed(e *evaluator, p *pool, cnt *counters) {
	n := len(e.vs.levels)
	if n == 0 {
		return
	}
	for di := range e.devs {
		d.cache = map[[nPos]int]*tuple{}
		dv := &e.devs[di]
		_, vceHi := e.targetBand(dv)
		for _, veShare := range []float64{0.1, 0.2, 0.05} {
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
						e.scoreVariants(d.tuple(di, [nPos]int{a, r2, c, re}, cnt), p.threshold, p.add, cnt)
					}
				}
			}
		}
	}
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

// icAtMost reports whether the tuple's nominal IC is at most ic; a tuple
// that could not be solved counts as "at most" (it never bounds).
func (t *tuple) icAtMost(ic float64) bool { return !t.ok || t.op.IC_A <= ic }

// vceAtMost reports whether the tuple's nominal VCE is at most v.
func (t *tuple) vceAtMost(v float64) bool { return !t.ok || t.op.VCE_V <= v }

// betaCutSafety is the share of a probed beta term the R2 cut-off trusts
// (see doc.go, bound B): 0.9.
const betaCutSafety = 0.9

// search is the branch and bound over (device, RE, R2, R1, RC); doc.go
// states each bound and why it is sound.
func (d *dividerPlan) search(e *evaluator, p *pool, cnt *counters) {
	n := len(e.vs.levels)
	if n == 0 {
		return
	}
	s := &e.s
	w := s.w
	total := int64(len(e.devs) * n)
	for di := range e.devs {
		d.cache = map[[nPos]int]*tuple{}
		dv := &e.devs[di]
		vceLo, vceHi := e.targetBand(dv)
		kE := 1 + 2/dv.hfeMin
		rcMinOhm := e.vs.levels[0].ohm
		for re := range n {
			e.progress(int64(di*n+re), total)
			thr := p.threshold()
			delta := math.Inf(1)
			if w.QPoint > 0 {
				delta = thr / w.QPoint
			}
			reOhm := e.vs.levels[re].ohm
			icLo := s.icT * math.Max(0, 1-delta)
			icHi := s.icT * (1 + delta)
			if !math.IsInf(delta, 1) {
				// Bound U-RE: P(RE) ≥ IC²·RE ≥ icLo²·RE.
				if w.Utilization*icLo*icLo*reOhm/e.vs.allowHotMax_W > thr {
					break
				}
				if w.Utilization*icLo*icLo*reOhm/e.vs.levels[re].allowHot_W > thr {
					continue
				}
				// Bound Q-RE: VCE ≤ VCC − IC·(RC + RE) ≤ VCC − icLo·(RCmin + RE).
				if w.QPoint*(vceLo-(s.vcc-icLo*(rcMinOhm+reOhm)))/s.vcc > thr {
					break
				}
			}
			// Bound RC band: VCE within delta·VCC of the target band needs
			// VCC − icHi(RC + kE·RE) ≤ vceHi + δ·VCC and
			// VCC − icLo(RC + RE) ≥ vceLo − δ·VCC.
			rcLo, rcHi := 0, n-1
			if !math.IsInf(delta, 1) {
				rcMin := (s.vcc-vceHi-delta*s.vcc)/icHi - kE*reOhm
				rcLo = e.vs.levelAtOrAbove(rcMin)
				if icLo > 0 {
					rcMax := (s.vcc-vceLo+delta*s.vcc)/icLo - reOhm
					rcHi = e.vs.levelAtOrAbove(rcMax*(1+1e-12)+1e-300) - 1
					if rcHi >= n {
						rcHi = n - 1
					}
				}
			}
			if rcLo > rcHi {
				continue
			}

			d.cache = map[[nPos]int]*tuple{}
			for r2 := range n {
				thr = p.threshold()
				if !math.IsInf(thr, 1) && w.QPoint > 0 {
					delta = thr / w.QPoint
					icLo = s.icT * math.Max(0, 1-delta)
					icHi = s.icT * (1 + delta)
				}
				// Bound U-R2 (divider power, see dividerPowerBound).
				if !math.IsInf(thr, 1) {
					vbeLo, vbeHi := e.vbeBounds(dv, icLo, icHi)
					vbLo := vbeLo + icLo*reOhm
					vbHi := vbeHi + icHi*kE*reOhm
					if w.Utilization*e.dividerPowerBound(r2, vbLo, vbHi) > thr {
						continue
					}
				}
				// R1 range from IC monotonicity (lemma L1).
				r1Lo, r1Hi := 0, n-1
				if !math.IsInf(thr, 1) {
					r1Hi = firstLevel(n, func(i int) bool {
						t := d.tuple(di, [nPos]int{i, r2, rcLo, re}, cnt)
						return t.ok && t.op.IC_A < icLo
					}) - 1
					r1Lo = firstLevel(n, func(i int) bool {
						t := d.tuple(di, [nPos]int{i, r2, rcHi, re}, cnt)
						return !t.ok || t.op.IC_A <= icHi
					})

				}
				for r1 := r1Lo; r1 <= r1Hi; r1++ {
					// RC: VCE falls with RC (lemma L2). Split at the first RC
					// whose VCE is at or below the top of the target band.
					split := rcLo + firstLevel(rcHi-rcLo+1, func(i int) bool {
						return d.tuple(di, [nPos]int{r1, r2, rcLo + i, re}, cnt).vceAtMost(vceHi)
					})
					for rc := split - 1; rc >= rcLo; rc-- {
						t := d.tuple(di, [nPos]int{r1, r2, rc, re}, cnt)
						if t.ok && w.QPoint*(t.op.VCE_V-vceHi)/s.vcc > p.threshold() {
							break
						}
						e.scoreVariants(t, p.threshold, p.add, cnt)
					}
					for rc := split; rc <= rcHi; rc++ {
						t := d.tuple(di, [nPos]int{r1, r2, rc, re}, cnt)
						if t.ok && w.QPoint*(vceLo-t.op.VCE_V)/s.vcc > p.threshold() {
							break
						}
						e.scoreVariants(t, p.threshold, p.add, cnt)
					}
				}
				// Bound B (lemma L3): the beta term grows with R2 and R1
				// along the staircase; stop when even the probe at the
				// smallest admissible R1 is over the threshold.
				thr = p.threshold()
				if !math.IsInf(thr, 1) && w.Beta > 0 && r1Lo < n && r1Lo <= r1Hi {
					bmin := math.Inf(1)
					for _, rc := range []int{rcLo, rcHi} {
						t := d.tuple(di, [nPos]int{r1Lo, r2, rc, re}, cnt)
						if !t.ok {
							bmin = 0
							continue
						}
						e.betaSpread(t)
						if !t.betaOK {
							bmin = 0
							continue
						}
						bmin = math.Min(bmin, math.Abs(t.beta))
					}
					if w.Beta*betaCutSafety*bmin > thr {
						for r := r2 + 1; r < n; r++ {
						}
						break
					}
				}
			}
		}
	}
	e.progress(total, total)
}
