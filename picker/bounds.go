package picker

import (
	"math"

	"biasbin/solver"
)

// vbeBounds returns bounds on the nominal-point VBE of any build of dv
// whose collector current lies in [icLo, icHi] (forward-active):
//
//   - upper: the junction is at least at the nominal ambient (self-heating
//     only warms it), and in the active region IC ≥ IS(e^(VBE/(NF·VT)) − 1)
//     (the Early factor 1 − VBC/VAF ≥ 1 and the reverse terms add), so
//     VBE ≤ NF·VT(25 °C)·ln(icHi/IS(25 °C) + 1); IS grows with temperature,
//     which only lowers VBE further.
//   - lower: the junction is at most 25 °C + θJA·P with P ≤ VCC·IC·2
//     (VCE ≤ VCC, VBE·IB ≤ VCC·IC for hFE ≥ 1), and IC ≤ IS·e^(VBE/(NF·VT))·
//     (1 + VCC/VAF) + IS/BR, so VBE ≥ NF·VT(Tj)·ln((icLo − IS/BR)/(IS(Tj)(1 +
//     VCC/VAF))). With a leakage current in the model (ICBO > 0), which
//     adds to IC without VBE, the lower bound is 0.
func (e *evaluator) vbeBounds(dv *device, icLo, icHi float64) (lo, hi float64) {
	m := dv.typ
	hi = vbeHi(dv, icHi)
	if m.ICBO_A > 0 || icLo <= 0 {
		return 0, hi
	}
	tj := min(dv.tjMax_C, NominalAmbient_C+dv.thetaJA*e.s.vcc*icHi*2)
	isT, _, br, _ := m.At(tj)
	early := 1.0
	if m.VAF_V > 0 {
		early += e.s.vcc / m.VAF_V
	}
	num := icLo - isT/max(br, 1e-9)
	if num <= 0 {
		return 0, hi
	}
	lo = max(0, m.NF*solver.ThermalVoltage_V(tj)*math.Log(num/(isT*early))*(1-1e-9))
	return lo, hi
}

// vbeHi is vbeBounds' upper end alone: NF·VT(25 °C)·ln(icHi/IS(25 °C) +
// 1), widened by 1e-9 relative (with no self-heating both ends are the
// solved VBE itself, up to round-off).
func vbeHi(dv *device, icHi float64) float64 {
	m := dv.typ
	is25 := dv.isNominal
	if is25 == 0 { // a device made without newEvaluator
		is25, _, _, _ = m.At(NominalAmbient_C)
	}
	return m.NF * solver.ThermalVoltage_V(NominalAmbient_C) * math.Log(icHi/is25+1) * (1 + 1e-9)
}

// dividerPowerBound is a lower bound on the larger utilization of R1 and
// R2 for any build with this R2 level whose base voltage lies in
// [vbLo, vbHi] (see doc.go, bound U-R2):
//
//   - R2 dissipates VB²/R2 ≥ vbLo²/R2;
//   - base current flows into the base, so VB ≤ VTH = VCC·R2/(R1+R2), i.e.
//     R1 ≤ R2(VCC − VB)/VB, and R1 dissipates (VCC − VB)²/R1 ≥
//     (VCC − VB)·VB/R2, a concave function of VB whose minimum over the
//     interval is at an end.
//
// R1's allowance is bounded by the largest allowance of any value.
func (e *evaluator) dividerPowerBound(r2 int, vbLo, vbHi float64) float64 {
	pR2, pR1 := e.dividerPowers(r2, vbLo, vbHi)
	return max(pR2/e.vs.levels[r2].allowHot_W, pR1/e.vs.allowHotMax_W)
}

// dividerPowerBoundWeak is dividerPowerBound with R2's allowance
// replaced by the best of any value: weaker, but falling with R2, so the
// first R2 it admits can be found by bisection.
func (e *evaluator) dividerPowerBoundWeak(r2 int, vbLo, vbHi float64) float64 {
	pR2, pR1 := e.dividerPowers(r2, vbLo, vbHi)
	return max(pR2, pR1) / e.vs.allowHotMax_W
}

// dividerPowers returns the powers of dividerPowerBound's two floors at R2
// level r2: R2 dissipates at least pR2 and R1 at least pR1 (watts). Both
// fall as R2 rises.
func (e *evaluator) dividerPowers(r2 int, vbLo, vbHi float64) (pR2, pR1 float64) {
	r2Ohm := e.vs.levels[r2].ohm
	pR2 = vbLo * vbLo / r2Ohm
	if vcc := e.s.vcc; vbHi < vcc && vbLo > 0 {
		pR1 = min((vcc-vbLo)*vbLo, (vcc-vbHi)*vbHi) / r2Ohm
	}
	return pR2, pR1
}

// firstFrom returns the first index in [0, n) where the monotone
// predicate f turns true (n when it never does), searching outward from
// a guess (galloping), so a guess near the answer costs few calls.
func firstFrom(n, guess int, f func(int) bool) int {
	if n == 0 {
		return 0
	}
	guess = clampLevel(guess, n)
	if f(guess) {
		// answer in [0, guess]: step down until false
		hi, step := guess, 1
		lo := guess - step
		for lo >= 0 && f(lo) {
			hi = lo
			step *= 2
			lo = hi - step
		}
		lo = max(lo+1, 0)
		return lo + firstLevel(hi-lo, func(i int) bool { return f(lo + i) })
	}
	lo, step := guess+1, 1
	hi := lo + step - 1
	for hi < n && !f(hi) {
		lo = hi + 1
		step *= 2
		hi = lo + step - 1
	}
	hi = min(hi, n-1)
	if lo > hi {
		return n
	}
	return lo + firstLevel(hi-lo+1, func(i int) bool { return f(lo + i) })
}

// rthFloor is a lower bound on R_TH = R1‖R2 for a divider with this R2
// whose nominal base voltage is at most vbHi and base current at most
// ibHi: R_TH = R2(1 − V_TH/VCC) and V_TH = VB + IB·R_TH, so
// R_TH ≥ R2(1 − vbHi/VCC)/(1 + R2·ibHi/VCC).
func (e *evaluator) rthFloor(r2Ohm, vbHi, ibHi float64) float64 {
	vcc := e.s.vcc
	return max(0, r2Ohm*(1-vbHi/vcc)/(1+r2Ohm*ibHi/vcc))
}

// transistorUse is the transistor's utilization at op, the same for every
// value combination of a level tuple: its dissipation over its margined
// allowance at the hottest ambient, as solver.EvalDissipation rates it
// (0 for an unrated transistor).
func (e *evaluator) transistorUse(dv *device, op solver.OperatingPoint) float64 {
	if math.IsInf(dv.allowHot, 1) {
		return 0
	}
	return op.PTransistor_W / dv.allowHot
}

// qPointUseFloor is a joint floor on w_QPoint·q + w_Utilization·max(0,
// U − use) for a build whose IC lies in [lo, hi] and one of whose parts
// carries at least IC with a utilization of at least coef·IC² (coef its
// resistance over its best allowance: RC in the divider and split supply,
// RE anywhere, as IE ≥ IC): q ≥ |IC − IC_t|/IC_t. The two pull IC apart
// (a lower IC eases the part and moves off the target), so the floor is
// the least of their sum over the window, a convex function of IC whose
// least lies at an end, at a kink (IC_t, or where the part's utilization
// reaches use) or where its slope is 0 (IC = w_QPoint/(2
// w_Utilization·coef·IC_t)); per term, the floors at the window's ends
// are weaker.
func (e *evaluator) qPointUseFloor(coef, use, lo, hi float64) float64 {
	w, it := e.s.w, e.s.icT
	if lo > hi || coef <= 0 {
		return 0
	}
	f := func(ic float64) float64 {
		return w.QPoint*math.Abs(ic-it)/it + w.Utilization*max(0, ic*ic*coef-use)
	}
	least := min(f(lo), f(hi))
	for _, x := range []float64{it, math.Sqrt(use / coef), w.QPoint / (2 * w.Utilization * coef * it)} {
		if x > lo && x < hi {
			least = min(least, f(x))
		}
	}
	return least
}

// qPointUseWindow is the IC window of qPointUseFloor with use 0: the IC
// where w_QPoint·|IC − IC_t|/IC_t + w_Utilization·coef·IC² is at most
// room, an interval as the sum is convex in IC (lo > hi when it is
// empty). A build outside it has those two terms over room.
func (e *evaluator) qPointUseWindow(coef, room float64) (lo, hi float64) {
	w, it := e.s.w, e.s.icT
	a, q := w.Utilization*coef, w.QPoint/it
	if room < 0 || q <= 0 {
		return 1, 0
	}
	if a <= 0 {
		return max(0, it-room/q), it + room/q
	}
	// over IC_t: a·IC² + q·IC − (w_QPoint + room) ≤ 0; under it:
	// a·IC² − q·IC + (w_QPoint − room) ≤ 0
	disc := q*q - 4*a*(w.QPoint-room)
	if disc < 0 {
		return 1, 0
	}
	lo = max(0, (q-math.Sqrt(disc))/(2*a))
	switch {
	case a*it*it <= room: // IC_t is inside
		hi = (-q + math.Sqrt(q*q+4*a*(w.QPoint+room))) / (2 * a)
	case q/(2*a) < it: // the sum is least under IC_t, the window too
		hi = (q + math.Sqrt(disc)) / (2 * a)
	default: // least at IC_t, and over room there
		return 1, 0
	}
	return lo, hi
}

// reUse is what bound QU-RE (reUseWindow) leaves of an RE level.
type reUse struct {
	// icLo, icHi is the IC window of the builds that can fit (icLo >
	// icHi when none can)
	icLo, icHi float64
	// coef is the least utilization coefficient of RE (its resistance
	// over an allowance) among the choices that fit
	coef float64
	// floor is the least of the QPoint, utilization and parts terms over
	// the window among them (the parts term of RE alone)
	floor float64
	// parts is the least weighted parts term of RE among them: w_Parts
	// where only a pair fits
	parts float64
}

// reUseWindow is bound QU-RE at RE level re: RE carries IE ≥ IC, so a
// build's QPoint term and RE's utilization are at least those of
// qPointUseFloor with coef RE over the allowance of the value RE holds,
// and a pair there adds its extra part. Per choice (one part, a pair)
// the builds whose three terms fit in room have IC in qPointUseWindow;
// the result spans the choices that can fit.
func (e *evaluator) reUseWindow(re int, room float64) reUse {
	l := &e.vs.levels[re]
	inf := math.Inf(1)
	r := reUse{icLo: inf, icHi: -inf, coef: inf, floor: inf, parts: inf}
	type choice struct{ allow, parts float64 }
	for _, c := range []choice{{l.allowHotOne_W, 0}, {l.allowHotPair_W, e.s.w.Parts}} {
		if c.allow <= 0 {
			continue
		}
		k := l.ohm / c.allow
		a, b := e.qPointUseWindow(k, room-c.parts)
		if a > b {
			continue
		}
		r.icLo, r.icHi, r.coef = min(r.icLo, a), max(r.icHi, b), min(r.coef, k)
		r.floor = min(r.floor, c.parts+e.qPointUseFloor(k, 0, a, b))
		r.parts = min(r.parts, c.parts)
	}
	return r
}

// transistorUseAtRC is bound U-Q at an RC level before it is solved, for
// a topology whose VCE is span − IC·RC − IE·RE (scanRC's): the transistor
// dissipates at least IC·VCE, and a build with IC in [icLo, icHi], active
// at its nominal point (IE ≤ kE·IC), has VCE ≥ span − icHi·(RC + kE·RE).
// It rises as RC falls; 0 for an unrated transistor.
func (e *evaluator) transistorUseAtRC(dv *device, rcOhm, reOhm, kE, icLo, icHi float64) float64 {
	if math.IsInf(dv.allowHot, 1) {
		return 0
	}
	return icLo * max(0, e.span-icHi*(rcOhm+kE*reOhm)) / dv.allowHot
}

// transistorUseFloor is bound U-Q (doc.go): a lower bound on the
// transistor's utilization at the nominal point of every build of dv that
// can enter under bd when the terms other than QPoint and Utilization add
// at least other. The transistor dissipates VCE·IC + VBE·IB ≥ VCE·IC
// (VBE and IB have the same sign), IC ≥ bd.icLo, and the QPoint term's
// VCE part |VCE − VCE target|/span is at most (thr − other)/w_QPoint, so
// VCE ≥ vceLo − span·(thr − other)/w_QPoint with vceLo the lowest VCE
// target (targetBand). 0 for an unrated transistor or an unbounded
// threshold.
func (e *evaluator) transistorUseFloor(dv *device, bd bounds, vceLo, other float64) float64 {
	w := e.s.w
	if !bd.finite || w.QPoint <= 0 || math.IsInf(dv.allowHot, 1) {
		return 0
	}
	vceMin := vceLo - e.span*(bd.thr-other)/w.QPoint
	if vceMin <= 0 {
		return 0
	}
	return bd.icLo * vceMin / dv.allowHot
}
