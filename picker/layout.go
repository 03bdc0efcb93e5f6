package picker

import "biasbin/solver"

// maxPos is the most resistor positions a topology has (the divider's
// four); a build's per-position arrays have this length and use the first
// layout.n entries.
const maxPos = 4

// layout is what the evaluator needs to know of a topology's positions:
// which solver slot each holds, its name, and which positions carry the
// collector and emitter resistors. A topology plugs into the search with a
// layout and a plan (plan.go); doc.go, "Search", says how.
type layout struct {
	topo  solver.Topology
	n     int                 // positions in use
	slots [maxPos]solver.Slot // solver slot per position
	names [maxPos]string      // position names in JSON and on screen
	rc    int                 // position of RC
	re    int                 // position of RE
	// lowVCE and lowIC are the tolerance signs (+1 high, −1 low) per
	// position of the two corners headroomFloor solves: the one expected
	// to give the lowest VCE and the one expected to give the lowest IC.
	// Any choice keeps the floor a lower bound; a good one makes it tight.
	lowVCE, lowIC [maxPos]float64
	// emitterBand is whether the emitter term applies: the share of the
	// supply the emitter resistor takes is a choice of the divider and the
	// collector-feedback stage; in the split-supply stage it is fixed by
	// the emitter rail (|VEE| − VBE), so the term is 0 there.
	emitterBand bool
	// split is whether the emitter returns to the emitter rail VEE.
	split bool
}

// dividerLayout: R1, R2, RC, RE. The lowest VCE comes with the most base
// drive (R1 low, R2 high) and the largest collector drop (RC high, RE
// low); the lowest IC with the least drive (R1 high, R2 low, RE high).
var dividerLayout = layout{
	topo: solver.Divider, n: 4,
	slots: [maxPos]solver.Slot{solver.R1, solver.R2, solver.RC, solver.RE},
	names: [maxPos]string{"r1", "r2", "rc", "re"},
	rc:    2, re: 3,
	lowVCE:      [maxPos]float64{-1, 1, 1, -1},
	lowIC:       [maxPos]float64{1, -1, 1, 1},
	emitterBand: true,
}

// feedbackLayout: RF, RC, RE. Less RF means more base drive and more IC;
// RC carries IE and lowers VC, so more RC means less VCE and less IC.
var feedbackLayout = layout{
	topo: solver.CollectorFeedback, n: 3,
	slots: [maxPos]solver.Slot{solver.RF, solver.RC, solver.RE},
	names: [maxPos]string{"rf", "rc", "re"},
	rc:    1, re: 2,
	lowVCE:      [maxPos]float64{-1, 1, -1},
	lowIC:       [maxPos]float64{1, 1, 1},
	emitterBand: true,
}

// splitLayout: RB, RC, RE. Less RB and RE mean more IC; RC lowers VCE.
var splitLayout = layout{
	topo: solver.SplitSupply, n: 3,
	slots: [maxPos]solver.Slot{solver.RB, solver.RC, solver.RE},
	names: [maxPos]string{"rb", "rc", "re"},
	rc:    1, re: 2,
	lowVCE: [maxPos]float64{-1, 1, -1},
	lowIC:  [maxPos]float64{1, 1, 1},
	split:  true,
}

// layoutOf returns the layout of a topology.
func layoutOf(t solver.Topology) *layout {
	switch t {
	case solver.CollectorFeedback:
		return &feedbackLayout
	case solver.SplitSupply:
		return &splitLayout
	}
	return &dividerLayout
}

// highEnds is the corner of solver.Build.CornerStage whose tolerance
// signs per position are signs (+1 the high end, −1 the low end), by slot.
func (l *layout) highEnds(signs [maxPos]float64) [solver.NumSlots]bool {
	var out [solver.NumSlots]bool
	for i := range l.n {
		out[l.slots[i]] = signs[i] > 0
	}
	return out
}
