package picker

import (
	"math"

	"biasbin/solver"
)

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

// headroomFloor solves two of the worst-case corners of b
// (solver.Build.CornerStage, solver.CornerModel) — the one expected to
// give the lowest VCE (hFE max, VBE(on) and VAF low, hot, supply low, an
// emitter rail high, each resistor at the end of its tolerance the
// layout's lowVCE names) and the one expected to give the lowest IC (hFE
// min, VBE(on) and VAF high, cold, supplies low, lowIC) —
// and returns the headroom term those two alone give. The lowest VCE and
// IC over all corners are at most these corners' values and the term
// falls as they rise, so it is a lower bound on the build's headroom term
// whatever the true extreme corners are. fails is true when either corner
// already breaks a hard limit (outside the active region or the VCE
// margin, a part over its allowance, or not solvable): the build then
// fails for certain, and the headroom floor is then 0.
func (e *evaluator) headroomFloor(dev int, b solver.Build, cnt *counters) (h float64, fails bool) {
	d := &e.devs[dev]
	cnt.solves += 2
	floor := d.vceSat + e.s.lim.VCEMargin_V
	// (an emitter rail of its own, split supply only, is high at the
	// first corner and low at the second)
	opV, err := solver.SolveSelfHeated(b.CornerStage(e.lay.highEnds(e.lay.lowVCE), false, true, true), d.vceLow, e.s.ambMax, d.thetaJA, d.tjMax_C)
	if err != nil || opV.Region != solver.Active || opV.VCE_V < floor || !solver.EvalDissipation(b, opV, e.s.ambMax, e.s.lim).Ok {
		return 0, true
	}
	opI, err := solver.SolveSelfHeated(b.CornerStage(e.lay.highEnds(e.lay.lowIC), false, false, false), d.icLow, e.s.ambMin, d.thetaJA, d.tjMax_C)
	if err != nil || opI.Region != solver.Active || opI.VCE_V < floor || !solver.EvalDissipation(b, opI, e.s.ambMin, e.s.lim).Ok {
		return 0, true
	}
	return e.headroomAt(d, opV.VCE_V, opI.IC_A), false
}

// finish runs the worst-case corners of a build and completes its
// pre-yield score. It returns nil when the corners cannot be solved.
func (e *evaluator) finish(c combo, b solver.Build, t *tuple, util float64) *evaluated {
	d := &e.devs[c.dev]
	ev := &evaluated{e: e, c: c, key: e.key(c), op: t.op, beta: t.beta, util: util}
	wc, err := solver.EvalWorstCaseWith(b, e.s.lim, solver.WorstCaseOptions{SkipCorners: true, SkipRSS: true})
	if err != nil {
		ev.failing = append(ev.failing, Failure{Kind: FailWorstCase, Err: err})
		ev.terms = Terms{QPoint: t.q, Emitter: t.em, Beta: math.Abs(t.beta), Headroom: 2, Utilization: util, Parts: e.extraParts(c)}
	} else {
		ev.worst = wc
		ev.noYield = e.missesWindow(d, t, wc)
		ev.terms = Terms{QPoint: t.q, Emitter: t.em, Beta: math.Abs(t.beta), Headroom: e.headroom(d, wc), Utilization: util, Parts: e.extraParts(c)}
		ev.failing = e.hardLimits(d, wc)
	}
	if t.bench != nil {
		ev.failing = append(ev.failing, *t.bench)
	}
	w := e.s.w
	ev.score = w.QPoint*ev.terms.QPoint + w.Emitter*ev.terms.Emitter + w.Beta*ev.terms.Beta + w.Headroom*ev.terms.Headroom + w.Utilization*ev.terms.Utilization + w.Parts*ev.terms.Parts
	return ev
}

// missesWindow reports whether the worst-case band of a build lies wholly
// outside its yield window in IC or in VCE: every Monte Carlo board draws
// its inputs inside the corners' bounds and so lies inside the band
// (solver.EvalYield), so no board can pass: the yield is 0 for certain.
func (e *evaluator) missesWindow(d *device, t *tuple, wc solver.WorstCase) bool {
	w := e.window(e.vceTarget(d, t.r)).Window
	const slack = 1e-9 // relative, against rounding at the band's edges
	return wc.ICMax_A < w.ICMin_A*(1-slack) || w.ICMax_A > 0 && wc.ICMin_A > w.ICMax_A*(1+slack) ||
		wc.VCEMax_V < w.VCEMin_V*(1-slack) || w.VCEMax_V > 0 && wc.VCEMin_V > w.VCEMax_V*(1+slack)
}

// headroom is the worst-case headroom term (see doc.go): a saturation
// part growing linearly from 0 when the lowest corner VCE is
// headroomSatBand·VCC above VCE(sat)+margin to 1 at VCE(sat)+margin (and
// beyond), plus a cut-off part growing from 0 when the lowest corner IC is
// headroomCutBand of the target to 1 at IC = 0.
func (e *evaluator) headroom(d *device, wc solver.WorstCase) float64 {
	return e.headroomAt(d, wc.VCEMin_V, wc.ICMin_A)
}

// headroomAt is the headroom term with the lowest corner VCE vceMin and
// the lowest corner IC icMin.
func (e *evaluator) headroomAt(d *device, vceMin, icMin float64) float64 {
	cut := icMin / e.s.icT
	return e.headroomSat(d, vceMin) + math.Max(0, 1-cut/headroomCutBand)
}

// headroomSat is the headroom term's saturation part with the lowest
// corner VCE vceMin.
func (e *evaluator) headroomSat(d *device, vceMin float64) float64 {
	sat := (vceMin - d.vceSat - e.s.lim.VCEMargin_V) / e.span
	return math.Max(0, 1-sat/headroomSatBand)
}

// nearSaturation reports whether a build whose VCE is at most vce can
// come near enough saturation at a corner for the headroom term's
// saturation part to count: vce within three times the band of VCE(sat)
// plus the margin. It only decides whether that part's floor is worth a
// solve.
func (e *evaluator) nearSaturation(d *device, vce float64) bool {
	return vce-d.vceSat-e.s.lim.VCEMargin_V < 3*headroomSatBand*e.span
}

// hardLimits lists why a build fails: a corner outside the active region
// or within the VCE margin of saturation, a part over its derated,
// margined rating or a resistor over its limiting element voltage at some
// corner, the collector current over the transistor's IC max.
func (e *evaluator) hardLimits(d *device, wc solver.WorstCase) []Failure {
	var why []Failure
	if !wc.AllActive {
		cn := wc.VCEMinAt
		why = append(why, Failure{Kind: FailCorners, NotActive: wc.NotActive, Corners: wc.Count, Region: cn.OP.Region,
			VCE_V: wc.VCEMin_V, VCESat_V: d.vceSat, Margin_V: e.s.lim.VCEMargin_V, HFE: cn.BF, Ambient_C: cn.Temp_C, VCC_V: math.Abs(cn.VCC_V)})
	}
	if !wc.Dissipation.Ok {
		worstU, worstName := 0.0, ""
		for j := range e.lay.n {
			if u := wc.Dissipation.Resistor[e.lay.slots[j]].Utilization; u > worstU {
				worstU, worstName = u, e.lay.names[j]
			}
		}
		if u := wc.Dissipation.Transistor.Utilization; u > worstU {
			worstU, worstName = u, PartTransistor
		}
		if worstU > 1 {
			why = append(why, Failure{Kind: FailAllowance, Part: worstName, Utilization: worstU})
		}
		for j := range e.lay.n {
			if pl := wc.Dissipation.Resistor[e.lay.slots[j]]; pl.VoltageUtilization > 1 {
				why = append(why, Failure{Kind: FailVoltage, Part: e.lay.names[j], Voltage_V: pl.Voltage_V, VoltageAllowed_V: pl.VoltageAllowed_V})
			}
		}
	}
	if im := d.line.Sheet.ICMax_A; im > 0 && wc.ICMax_A > im {
		why = append(why, Failure{Kind: FailICMax, IC_A: wc.ICMax_A, ICMax_A: im})
	}
	return why
}
