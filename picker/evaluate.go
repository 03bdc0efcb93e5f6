package picker

import (
	"fmt"
	"math"

	"biasbin/solver"
)

// Slot order of a divider build's arrays: R1, R2, RC, RE.
const (
	iR1 = iota
	iR2
	iRC
	iRE
	nPos
)

// divSlots maps the array positions to solver slots.
var divSlots = [nPos]solver.Slot{solver.R1, solver.R2, solver.RC, solver.RE}

// Headroom shape (see doc.go).
const (
	// headroomSatBand: the saturation penalty starts when the lowest
	// corner VCE comes within this share of the supply of VCE(sat) plus
	// the margin.
	headroomSatBand = 0.10
	// headroomCutBand: the cut-off penalty starts when the lowest corner
	// IC falls below this share of the target.
	headroomCutBand = 0.50
)

// combo is one build: a device and a value per position.
type combo struct {
	dev int
	lv  [nPos]int // level per position
	val [nPos]int // value per position
}

// evaluated is a build with its pre-yield score.
type evaluated struct {
	c       combo
	key     string // tie-break: device line ID and values, fixed width
	score   float64
	terms   Terms
	failing []Failure
	op      solver.OperatingPoint
	worst   solver.WorstCase
	beta    float64 // beta sensitivity, signed as IC(hFE max) − IC(hFE min) over IC
	util    float64
}

// less is the ranking order: passing before failing, then lower score,
// then the tie-break key (device line ID, then the values' ascending
// resistances and preference order per position R1, R2, RC, RE).
func less(a, b *evaluated) bool {
	af, bf := len(a.failing) > 0, len(b.failing) > 0
	if af != bf {
		return !af
	}
	if a.score != b.score {
		return a.score < b.score
	}
	return a.key < b.key
}

// evaluator scores builds for one request.
type evaluator struct {
	s    settings
	vs   *valueSet
	devs []device
}

// ohms returns the nominal resistances of a level tuple.
func (e *evaluator) ohms(lv [nPos]int) [nPos]float64 {
	var r [nPos]float64
	for i := range nPos {
		if lv[i] >= 0 {
			r[i] = e.vs.levels[lv[i]].ohm
		}
	}
	return r
}

// stage is the nominal circuit of a level tuple (values at their marked
// resistance; at 25 °C TCR moves nothing).
func (e *evaluator) stage(r [nPos]float64) solver.Stage {
	st := solver.Stage{Topology: solver.Divider, VCC_V: e.s.sign * e.s.vcc, RL_Ohm: e.s.rl}
	for i, sl := range divSlots {
		st.R_Ohm[sl] = r[i]
	}
	if e.s.bypass {
		st.RBypass_Ohm = r[iRE]
	}
	return st
}

// solveAt solves the nominal circuit r with model m, self-heated at the
// nominal ambient, exactly as solver.Nominal does.
func (e *evaluator) solveAt(d *device, m solver.Model, r [nPos]float64) (solver.OperatingPoint, error) {
	return solver.SolveSelfHeated(e.stage(r), m, NominalAmbient_C, d.thetaJA, d.tjMax_C)
}

// vceTarget is the VCE the Q-point term aims at: the request's, or the
// VCE that maximises symmetrical swing on this build's load lines at the
// target current (REFERENCE.md §7): with r_ac = RC‖RL + RE(unbypassed) and
// R_dc = RC + RE, the optimum Q-point on the DC load line is
// IC = (VCC − VCE(sat))/(R_dc + r_ac), VCE = VCE(sat) + IC·r_ac, i.e.
// VCE(sat) + (VCC − VCE(sat))·r_ac/(R_dc + r_ac). With no load and no
// bypass r_ac = R_dc and this is the mid-point (VCC + VCE(sat))/2.
func (e *evaluator) vceTarget(d *device, r [nPos]float64) float64 {
	if e.s.vceT > 0 {
		return e.s.vceT
	}
	return swingVCE(e.s.vcc, d.vceSat, r[iRC], r[iRE], e.s.rl, e.s.bypass)
}

// swingVCE is the maximum-symmetrical-swing VCE of a divider stage.
func swingVCE(vcc, vceSat, rc, re, rl float64, bypass bool) float64 {
	rac := rc
	if rl > 0 {
		rac = rc * rl / (rc + rl)
	}
	if !bypass {
		rac += re
	}
	rdc := rc + re
	if rdc+rac <= 0 {
		return (vcc + vceSat) / 2
	}
	return vceSat + (vcc-vceSat)*rac/(rdc+rac)
}

// qpoint is the Q-point term of an operating point.
func (e *evaluator) qpoint(op solver.OperatingPoint, vceT float64) float64 {
	return math.Abs(op.IC_A-e.s.icT)/e.s.icT + math.Abs(op.VCE_V-vceT)/e.s.vcc
}

// emitter is the emitter term of an operating point: how far the emitter
// voltage lies outside the emitter band, as a share of |VCC| (0 inside).
func (e *evaluator) emitter(op solver.OperatingPoint) float64 {
	ve := math.Abs(op.VE_V)
	return (math.Max(0, ve-e.s.veHi) + math.Max(0, e.s.veLo-ve)) / e.s.vcc
}

// build returns the solver.Build of a combo.
func (e *evaluator) build(c combo) solver.Build {
	d := &e.devs[c.dev]
	b := solver.Build{
		Topology:         solver.Divider,
		VCC_V:            e.s.sign * e.s.vcc,
		VCCTol:           e.s.vccTol,
		RL_Ohm:           e.s.rl,
		Device:           d.line.Sheet,
		AmbientMin_C:     e.s.ambMin,
		AmbientMax_C:     e.s.ambMax,
		NominalAmbient_C: NominalAmbient_C,
	}
	for i, sl := range divSlots {
		b.Resistors[sl] = e.vs.values[c.val[i]].spec
	}
	if e.s.bypass {
		b.RBypass_Ohm = b.Resistors[solver.RE].Nominal_Ohm
	}
	return b
}

// key is the fixed-width tie-break key of a combo: the device line ID,
// then per position the level (ascending resistance) and the value's
// preference rank within it, so input order never decides a tie.
func (e *evaluator) key(c combo) string {
	rk := func(i int) int { return e.vs.values[c.val[i]].rank }
	return fmt.Sprintf("%020d|%06d.%06d|%06d.%06d|%06d.%06d|%06d.%06d", e.devs[c.dev].line.ID,
		c.lv[0], rk(0), c.lv[1], rk(1), c.lv[2], rk(2), c.lv[3], rk(3))
}

// fitsQuantity reports whether N boards of the combo can be built from
// stock: each line must hold N times the parts the build draws from it
// over all positions (a pair draws one part of each of its lines).
func (e *evaluator) fitsQuantity(c combo) bool {
	var ids [2 * nPos]int
	n := 0
	for _, vi := range c.val {
		for _, li := range e.vs.values[vi].parts() {
			ids[n] = li
			n++
		}
	}
	for i := range n {
		count := 0
		for j := range n {
			if ids[j] == ids[i] {
				count++
			}
		}
		if e.vs.lines[ids[i]].Qty < count*e.s.boards {
			return false
		}
	}
	return true
}

// tuple holds what depends only on the device and the level tuple.
type tuple struct {
	c        combo // dev and lv set
	r        [nPos]float64
	op       solver.OperatingPoint
	ok       bool // nominal solve succeeded
	vceT     float64
	q        float64
	em       float64 // emitter term
	betaDone bool
	betaOK   bool
	beta     float64 // signed relative spread
	// bench is why the 25 °C points at hFE min, typical or max break the
	// VCE margin or leave the active region (nil when none does; set
	// with the beta spread).
	bench *Failure
}

// newTuple solves the nominal point of a level tuple.
func (e *evaluator) newTuple(dev int, lv [nPos]int) *tuple {
	t := &tuple{}
	e.solveTuple(t, dev, lv)
	return t
}

// solveTuple fills t with the solved nominal point of a level tuple.
func (e *evaluator) solveTuple(t *tuple, dev int, lv [nPos]int) {
	*t = tuple{c: combo{dev: dev, lv: lv}, r: e.ohms(lv)}
	d := &e.devs[dev]
	op, err := e.solveAt(d, d.typ, t.r)
	if err != nil {
		return
	}
	t.op, t.ok = op, true
	t.vceT = e.vceTarget(d, t.r)
	t.q = e.qpoint(op, t.vceT)
	t.em = e.emitter(op)
}

// betaSpread solves the tuple at hFE min and max (self-heated, nominal
// ambient): (IC(hFE max) − IC(hFE min))/IC(nominal).
func (e *evaluator) betaSpread(t *tuple, cnt *counters) {
	if t.betaDone {
		return
	}
	cnt.solves += 2
	t.betaDone = true
	d := &e.devs[t.c.dev]
	lo, err := e.solveAt(d, d.lo, t.r)
	if err != nil {
		return
	}
	hi, err := e.solveAt(d, d.hi, t.r)
	if err != nil {
		return
	}
	t.beta = (hi.IC_A - lo.IC_A) / t.op.IC_A
	t.betaOK = true
	floor := d.vceSat + e.s.lim.VCEMargin_V
	for _, p := range []struct {
		at HFEPoint
		op *solver.OperatingPoint
	}{{HFEAtMin, &lo}, {HFEAtTyp, &t.op}, {HFEAtMax, &hi}} {
		if p.op.Region != solver.Active || p.op.VCE_V < floor {
			t.bench = &Failure{Kind: FailBench, Ambient_C: NominalAmbient_C, HFEPoint: p.at, Region: p.op.Region,
				VCE_V: p.op.VCE_V, VCESat_V: d.vceSat, Margin_V: e.s.lim.VCEMargin_V}
			break
		}
	}
}

// betaFloorAt is betaFloor at a solved tuple: its exact R_TH, RE, RC and
// nominal IC (0 unless the tuple is active at its nominal point).
func (e *evaluator) betaFloorAt(t *tuple) float64 {
	if t.op.Region != solver.Active {
		return 0
	}
	r := t.r
	ic := t.op.IC_A
	rth := r[iR1] * r[iR2] / (r[iR1] + r[iR2])
	return e.betaFloor(&e.devs[t.c.dev], betaWindow{RTH: rth, RTHMax: rth, RE: r[iRE], RCMin: r[iRC], RCMax: r[iRC], ICLo: ic, ICHi: ic})
}

// counters of a search.
type counters struct {
	evaluated int64 // builds whose every pre-yield term was computed
	solves    int64
}

// scoreVariants scores every value combination of the tuple whose
// quantities fit, computing the cheap terms first and stopping as soon as
// a build's partial score exceeds the threshold thr() (the score of the
// pool's last passing member; +Inf while the pool is not full of passing
// builds). Each build that is fully scored goes to keep.
func (e *evaluator) scoreVariants(t *tuple, thr, lastScore func() float64, keep func(*evaluated), cnt *counters) {
	if !t.ok {
		return
	}
	w := e.s.w
	lv := t.c.lv
	var c combo = t.c
	L := [nPos][]int{e.vs.levels[lv[0]].values, e.vs.levels[lv[1]].values, e.vs.levels[lv[2]].values, e.vs.levels[lv[3]].values}
	for _, v0 := range L[0] {
		for _, v1 := range L[1] {
			for _, v2 := range L[2] {
				for _, v3 := range L[3] {
					c.val = [nPos]int{v0, v1, v2, v3}
					if !e.fitsQuantity(c) {
						continue
					}
					b := e.build(c)
					dis := solver.EvalDissipation(b, t.op, e.s.ambMax, e.s.lim)
					partial := w.QPoint*t.q + w.Emitter*t.em + w.Utilization*dis.MaxUtilization
					if partial > thr() {
						continue
					}
					if th := thr(); !t.betaDone && !math.IsInf(th, 1) && w.Beta > 0 &&
						partial+w.Beta*e.betaFloorAt(t) > th {
						continue // the beta term's floor settles it without two solves
					}
					e.betaSpread(t, cnt)
					if !t.betaOK {
						continue
					}
					partial += w.Beta * math.Abs(t.beta)
					if partial > thr() {
						continue
					}
					hlb, fails := e.headroomFloor(c.dev, b, cnt)
					fails = fails || t.bench != nil
					if th := thr(); fails && !math.IsInf(th, 1) || partial+w.Headroom*hlb > th {
						continue
					}
					if fails && partial+w.Headroom*hlb > lastScore() {
						continue // fails for certain and ranks below the last member
					}
					ev := e.finish(c, b, t, dis.MaxUtilization)
					cnt.evaluated++
					if ev != nil {
						keep(ev)
					}
				}
			}
		}
	}
}

// headroomFloor solves two of the worst-case corners of b — the one
// expected to give the lowest VCE (hFE max, hot, supply low, R1 −tol,
// R2 +tol, RC +tol, RE −tol) and the one expected to give the lowest IC
// (hFE min, cold, supply low, R1 +tol, R2 −tol, RE +tol) — and returns the
// headroom term those two alone give. The lowest VCE and IC over all
// corners are at most these corners' values and the term falls as they
// rise, so it is a lower bound on the build's headroom term whatever the
// true extreme corners are. fails is true when either corner already
// breaks a hard limit (outside the active region or the VCE margin, a
// part over its allowance, or not solvable): the build then fails for
// certain, and the headroom floor is then 0.
func (e *evaluator) headroomFloor(dev int, b solver.Build, cnt *counters) (h float64, fails bool) {
	d := &e.devs[dev]
	lowV := 1 - e.s.vccTol
	tol := func(sl solver.Slot, sign float64) float64 { return sign * b.Resistors[sl].Tol }
	var devVCE, devIC [solver.NumSlots]float64
	devVCE[solver.R1], devVCE[solver.R2], devVCE[solver.RC], devVCE[solver.RE] = tol(solver.R1, -1), tol(solver.R2, 1), tol(solver.RC, 1), tol(solver.RE, -1)
	devIC[solver.R1], devIC[solver.R2], devIC[solver.RC], devIC[solver.RE] = tol(solver.R1, 1), tol(solver.R2, -1), tol(solver.RC, 1), tol(solver.RE, 1)
	cnt.solves += 2
	floor := d.vceSat + e.s.lim.VCEMargin_V
	opV, err := solver.SolveSelfHeated(b.Resolve(devVCE, lowV, e.s.ambMax), d.hi, e.s.ambMax, d.thetaJA, d.tjMax_C)
	if err != nil || opV.Region != solver.Active || opV.VCE_V < floor || !solver.EvalDissipation(b, opV, e.s.ambMax, e.s.lim).Ok {
		return 0, true
	}
	opI, err := solver.SolveSelfHeated(b.Resolve(devIC, lowV, e.s.ambMin), d.lo, e.s.ambMin, d.thetaJA, d.tjMax_C)
	if err != nil || opI.Region != solver.Active || opI.VCE_V < floor || !solver.EvalDissipation(b, opI, e.s.ambMin, e.s.lim).Ok {
		return 0, true
	}
	sat := (opV.VCE_V - d.vceSat - e.s.lim.VCEMargin_V) / e.s.vcc
	h = math.Max(0, 1-sat/headroomSatBand)
	return h + math.Max(0, 1-opI.IC_A/e.s.icT/headroomCutBand), false
}

// finish runs the worst-case corners of a build and completes its
// pre-yield score. It returns nil when the corners cannot be solved.
func (e *evaluator) finish(c combo, b solver.Build, t *tuple, util float64) *evaluated {
	d := &e.devs[c.dev]
	ev := &evaluated{c: c, key: e.key(c), op: t.op, beta: t.beta, util: util}
	wc, err := solver.EvalWorstCaseWith(b, e.s.lim, solver.WorstCaseOptions{SkipCorners: true, SkipRSS: true})
	if err != nil {
		ev.failing = append(ev.failing, Failure{Kind: FailWorstCase, Err: err})
		ev.terms = Terms{QPoint: t.q, Emitter: t.em, Beta: math.Abs(t.beta), Headroom: 2, Utilization: util}
	} else {
		ev.worst = wc
		ev.terms = Terms{QPoint: t.q, Emitter: t.em, Beta: math.Abs(t.beta), Headroom: e.headroom(d, wc), Utilization: util}
		ev.failing = e.hardLimits(d, wc)
	}
	if t.bench != nil {
		ev.failing = append(ev.failing, *t.bench)
	}
	w := e.s.w
	ev.score = w.QPoint*ev.terms.QPoint + w.Emitter*ev.terms.Emitter + w.Beta*ev.terms.Beta + w.Headroom*ev.terms.Headroom + w.Utilization*ev.terms.Utilization
	return ev
}

// headroom is the worst-case headroom term (see doc.go): a saturation
// part growing linearly from 0 when the lowest corner VCE is
// headroomSatBand·VCC above VCE(sat)+margin to 1 at VCE(sat)+margin (and
// beyond), plus a cut-off part growing from 0 when the lowest corner IC is
// headroomCutBand of the target to 1 at IC = 0.
func (e *evaluator) headroom(d *device, wc solver.WorstCase) float64 {
	sat := (wc.VCEMin_V - d.vceSat - e.s.lim.VCEMargin_V) / e.s.vcc
	h := math.Max(0, 1-sat/headroomSatBand)
	cut := wc.ICMin_A / e.s.icT
	return h + math.Max(0, 1-cut/headroomCutBand)
}

// hardLimits lists why a build fails: a corner outside the active region
// or within the VCE margin of saturation, a part over its derated,
// margined rating at some corner, the collector current over the
// transistor's IC max.
func (e *evaluator) hardLimits(d *device, wc solver.WorstCase) []Failure {
	var why []Failure
	if !wc.AllActive {
		cn := wc.VCEMinAt
		why = append(why, Failure{Kind: FailCorners, NotActive: wc.NotActive, Corners: wc.Count, Region: cn.OP.Region,
			VCE_V: wc.VCEMin_V, VCESat_V: d.vceSat, Margin_V: e.s.lim.VCEMargin_V, HFE: cn.BF, Ambient_C: cn.Temp_C, VCC_V: math.Abs(cn.VCC_V)})
	}
	if !wc.Dissipation.Ok {
		worstU, worstName := 0.0, ""
		for j, sl := range divSlots {
			if u := wc.Dissipation.Resistor[sl].Utilization; u > worstU {
				worstU, worstName = u, slotNames[j]
			}
		}
		if u := wc.Dissipation.Transistor.Utilization; u > worstU {
			worstU, worstName = u, PartTransistor
		}
		why = append(why, Failure{Kind: FailAllowance, Part: worstName, Utilization: worstU})
	}
	if im := d.line.Sheet.ICMax_A; im > 0 && wc.ICMax_A > im {
		why = append(why, Failure{Kind: FailICMax, IC_A: wc.ICMax_A, ICMax_A: im})
	}
	return why
}

// slotNames are the position names in array order.
var slotNames = [nPos]string{"r1", "r2", "rc", "re"}
