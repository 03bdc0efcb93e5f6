package picker

import (
	"math"

	"biasbin/solver"
)

// handVBE_V is the base-emitter drop the hand methods assume (common
// practice for a small-signal silicon transistor).
const handVBE_V = 0.65

// ideal is the hand-method design of the evaluator's topology for device
// d (common practice), per position in the layout's order:
//
//   - divider: VE = VCC/10, RE = VE/IC, RC for the VCE target,
//     R_TH = 0.1·(hFE min + 1)·RE, R1 and R2 for VB = VE + VBE;
//   - collector feedback: RC from the target IC and the mid-supply VCE
//     (with VE = VCC/10 across RE = VE/IC), then RF = β·RC with β the
//     geometric mean of the hFE range;
//   - split supply: RE = (|VEE| − VBE)/IE with IE ≈ IC, RB = 0.1·hFE min·RE
//     (the base resistor's drop stays a tenth of RE's), RC for the VCE
//     target with the emitter at −VBE.
func (e *evaluator) ideal(d *device) [maxPos]float64 {
	s := e.s
	vceT := s.vceT
	if vceT == 0 {
		vceT = (e.span + d.vceSat) / 2
	}
	switch e.lay.topo {
	case solver.CollectorFeedback:
		ve := s.vcc / 10
		re := ve / s.icT
		rc := math.Max((s.vcc-vceT-ve)/s.icT, re/10)
		beta := math.Sqrt(d.line.Sheet.HFEMin * d.line.Sheet.HFEMax)
		return [maxPos]float64{beta * rc, rc, re}
	case solver.SplitSupply:
		re := (s.vee - handVBE_V) / s.icT
		rc := math.Max((s.vcc+handVBE_V-vceT)/s.icT, re/10)
		return [maxPos]float64{0.1 * d.hfeMin * re, rc, re}
	}
	ve := s.vcc / 10
	re := ve / s.icT
	rc := math.Max((s.vcc-vceT-ve)/s.icT, re/10)
	rth := 0.1 * (d.hfeMin + 1) * re
	vb := ve + handVBE_V
	return [maxPos]float64{rth * s.vcc / vb, rth * s.vcc / (s.vcc - vb), rc, re}
}

// idealPower_W estimates what position i of the hand-method design id
// dissipates with the value ohm there (to choose a rating to buy): the
// target current squared times the value in the collector and emitter,
// the divider's share of VCC²/(R1 + R2), and the base current at hFE min
// squared times the value in a base resistor.
func (e *evaluator) idealPower_W(d *device, id [maxPos]float64, i int, ohm float64) float64 {
	s := e.s
	switch {
	case i == e.lay.rc || i == e.lay.re:
		return s.icT * s.icT * ohm
	case e.lay.topo == solver.Divider:
		return s.vcc * s.vcc / (id[iR1] + id[iR2]) * (id[i] / (id[iR1] + id[iR2]))
	}
	ib := s.icT / math.Max(d.hfeMin, 1)
	return ib * ib * ohm
}
