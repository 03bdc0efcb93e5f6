package picker

import (
	"math"

	"biasbin/solver"
)

// evaluator scores builds of one topology for one request.
type evaluator struct {
	s settings
	// slot is the topology's place in settings.topos (its progress)
	slot int
	lay  *layout
	vs   *valueSet
	devs []device
	// span is the supply the collector-emitter loop spans: |VCC|, plus
	// |VEE| for the split-supply stage. The VCE target, the Q-point
	// term's VCE part and the headroom term are shares of it.
	span float64
	// kept is, per position, whether a kept part fixes it (the zero
	// value: every position free); keepLv is then its level and keepOne
	// its value alone (pinKept, keep.go).
	kept    [maxPos]bool
	keepLv  [maxPos]int
	keepOne [maxPos][]int
	// stock is the stock it was made from (singlesFirst makes an
	// evaluator of its singles alone).
	stock Stock
}

// tuple holds what depends only on the device and the level tuple.
type tuple struct {
	c        combo // dev and lv set
	r        [maxPos]float64
	op       solver.OperatingPoint
	ok       bool // nominal solve succeeded
	vceT     float64
	q        float64
	em       float64 // emitter term
	betaDone bool
	betaOK   bool
	beta     float64 // signed relative spread
	// floorAt caches betaFloorAt for the tuple's value variants (valid
	// when floorDone)
	floorAt   float64
	floorDone bool
	// bench is why the 25 °C points at hFE min, typical or max break the
	// VCE margin or leave the active region (nil when none does; set
	// with the beta spread).
	bench *Failure
}

// ohms returns the nominal resistances of a level tuple.
func (e *evaluator) ohms(lv [maxPos]int) [maxPos]float64 {
	var r [maxPos]float64
	for i := range e.lay.n {
		if lv[i] >= 0 {
			r[i] = e.vs.levels[lv[i]].ohm
		}
	}
	return r
}

// stage is the nominal circuit of a level tuple (values at their marked
// resistance; at 25 °C TCR moves nothing).
func (e *evaluator) stage(r [maxPos]float64) solver.Stage {
	st := solver.Stage{Topology: e.lay.topo, VCC_V: e.s.sign * e.s.vcc, VEE_V: e.veeSigned(), Ground: e.ground(), RL_Ohm: e.s.rl}
	for i := range e.lay.n {
		st.R_Ohm[e.lay.slots[i]] = r[i]
	}
	if e.s.bypass {
		st.RBypass_Ohm = r[e.lay.re]
	}
	return st
}

// solveAt solves the nominal circuit r with model m, self-heated at the
// nominal ambient, exactly as solver.Nominal does.
func (e *evaluator) solveAt(d *device, m solver.Model, r [maxPos]float64) (solver.OperatingPoint, error) {
	return solver.SolveSelfHeated(e.stage(r), m, NominalAmbient_C, d.thetaJA, d.tjMax_C)
}

// vceTarget is the VCE the Q-point term aims at: the request's, or the
// VCE that maximises symmetrical swing on this build's load lines at the
// target current (REFERENCE.md §7): with r_ac = RC‖RL + RE(unbypassed) and
// R_dc = RC + RE, the optimum Q-point on the DC load line is
// IC = (VCC − VCE(sat))/(R_dc + r_ac), VCE = VCE(sat) + IC·r_ac, i.e.
// VCE(sat) + (VCC − VCE(sat))·r_ac/(R_dc + r_ac). With no load and no
// bypass r_ac = R_dc and this is the mid-point (VCC + VCE(sat))/2.
func (e *evaluator) vceTarget(d *device, r [maxPos]float64) float64 {
	if e.s.vceT > 0 {
		return e.s.vceT
	}
	return swingVCE(e.span, d.vceSat, r[e.lay.rc], r[e.lay.re], e.s.rl, e.s.bypass)
}

// ground is the 0 V of this topology's builds (solver.GroundOf).
func (e *evaluator) ground() solver.Ground { return solver.GroundOf(e.s.pol, e.lay.topo, e.s.rail) }

// veeSigned is the emitter rail as the solver takes it (opposite in sign
// to VCC), 0 for a stage without one.
func (e *evaluator) veeSigned() float64 {
	if !e.lay.split {
		return 0
	}
	return -e.s.sign * e.s.vee
}

// swingVCE is the maximum-symmetrical-swing VCE of a stage.
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
	return math.Abs(op.IC_A-e.s.icT)/e.s.icT + math.Abs(op.VCE_V-vceT)/e.span
}

// emitter is the emitter term of an operating point: how far the emitter
// voltage lies outside the emitter band, as a share of |VCC| (0 inside;
// always 0 where the layout has no emitter band).
func (e *evaluator) emitter(op solver.OperatingPoint) float64 {
	if !e.lay.emitterBand {
		return 0
	}
	ve := op.V_V[solver.RE] // across RE: VE's magnitude against the emitter-side rail
	return (math.Max(0, ve-e.s.veHi) + math.Max(0, e.s.veLo-ve)) / e.s.vcc
}

// newTuple solves the nominal point of a level tuple.
func (e *evaluator) newTuple(dev int, lv [maxPos]int) *tuple {
	t := &tuple{}
	e.solveTuple(t, dev, lv)
	return t
}

// solveTuple fills t with the solved nominal point of a level tuple.
func (e *evaluator) solveTuple(t *tuple, dev int, lv [maxPos]int) {
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

// icAtMost reports whether the tuple was solved and its nominal IC is at
// most ic: the seeds' search for the target current. A tuple that could
// not be solved counts as over: with small resistances the base or
// collector current heats the junction past Tj max (runaway), and a seed
// taken there would start the search at the smallest levels. A saturated
// tuple counts as over too: deep in saturation a stiff base drive pulls
// the emitter, and so the collector, up towards the supply and IC falls
// as the drive grows, so its IC is not the active-region current that
// lemmas L1 and F1 order, and a search for the first level at or under a
// current must pass over it (its nominal point fails the bench limit).
func (t *tuple) icAtMost(ic float64) bool {
	return t.ok && t.op.Region != solver.Saturation && t.op.IC_A <= ic
}

// vceSolvedAtMost is vceAtMost for the seeds: a tuple that could not be
// solved counts as over (icAtMost says why).
func (t *tuple) vceSolvedAtMost(v float64) bool { return t.ok && t.op.VCE_V <= v }

// icUnder reports whether the tuple was solved, is not saturated and its
// nominal IC is under ic: the envelope probes' test (L1 orders only
// active-region currents; a saturated tuple tells nothing of the levels
// past it, icAtMost says why).
func (t *tuple) icUnder(ic float64) bool {
	return t.ok && t.op.Region != solver.Saturation && t.op.IC_A < ic
}

// vceAtMost reports whether the tuple's nominal VCE is at most v.
func (t *tuple) vceAtMost(v float64) bool { return !t.ok || t.op.VCE_V <= v }
