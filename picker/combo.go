package picker

import (
	"fmt"
	"strings"

	"biasbin/solver"
)

// combo is one build: a device and a value per position (the layout's
// first n entries; the rest stay 0).
type combo struct {
	dev int
	lv  [maxPos]int // level per position
	val [maxPos]int // value per position
}

// evaluated is a build with its pre-yield score. e is the evaluator (and
// so the topology) it was scored by.
type evaluated struct {
	e       *evaluator
	c       combo
	key     string // tie-break: device line ID and values, fixed width
	score   float64
	terms   Terms
	failing []Failure
	op      solver.OperatingPoint
	worst   solver.WorstCase
	beta    float64 // beta sensitivity, signed as IC(hFE max) − IC(hFE min) over IC
	util    float64
	grp     foldGroup // set by a folding pool
	// noYield: the worst-case band misses the yield window, so the yield
	// is 0 for certain and the final score is score + the yield weight.
	noYield bool
}

// finalFloor is the least final score the build can have: its score
// without the yield term, plus the whole yield term when its yield is 0
// for certain.
func (ev *evaluated) finalFloor() float64 {
	if ev.noYield {
		return ev.score + ev.e.s.w.Yield
	}
	return ev.score
}

// less is the ranking order: passing before failing, then lower score,
// then the tie-break key (device line ID, then the values' ascending
// resistances and preference order per position, then the topology).
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

// key is the fixed-width tie-break key of a combo: the device line ID,
// then per position the level (ascending resistance) and the value's
// preference rank within it, so input order never decides a tie. A
// topology other than the divider is named at the end, so builds of two
// topologies never share a key.
func (e *evaluator) key(c combo) string {
	var sb strings.Builder
	fmt.Fprintf(&sb, "%020d", e.devs[c.dev].line.ID)
	for i := range e.lay.n {
		fmt.Fprintf(&sb, "|%06d.%06d", c.lv[i], e.vs.values[c.val[i]].rank)
	}
	if e.lay.topo != solver.Divider {
		sb.WriteString("|" + e.lay.topo.String())
	}
	return sb.String()
}

// fitsQuantity reports whether N boards of the combo can be built from
// stock: each line must hold N times the parts the build draws from it
// over all positions (a pair draws one part of each of its lines).
func (e *evaluator) fitsQuantity(c combo) bool {
	var ids [2 * maxPos]int
	n := 0
	for _, vi := range c.val[:e.lay.n] {
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

// build returns the solver.Build of a combo.
func (e *evaluator) build(c combo) solver.Build {
	d := &e.devs[c.dev]
	b := solver.Build{
		Topology:         e.lay.topo,
		VCC_V:            e.s.sign * e.s.vcc,
		VEE_V:            e.veeSigned(),
		Ground:           e.ground(),
		VCCTol:           e.s.vccTol,
		VEETol:           e.veeTolOfBuild(),
		RL_Ohm:           e.s.rl,
		Device:           d.line.Sheet,
		AmbientMin_C:     e.s.ambMin,
		AmbientMax_C:     e.s.ambMax,
		NominalAmbient_C: NominalAmbient_C,
	}
	for i := range e.lay.n {
		b.Resistors[e.lay.slots[i]] = e.vs.values[c.val[i]].spec
	}
	if e.s.bypass {
		b.RBypass_Ohm = b.Resistors[solver.RE].Nominal_Ohm
	}
	return b
}

// veeTolOfBuild is the emitter rail's tolerance a build carries: the
// request's (VEETol, else VCCTol) for the split-supply stage, 0 (no rail)
// for the others.
func (e *evaluator) veeTolOfBuild() float64 {
	if !e.lay.split {
		return 0
	}
	return e.s.veeTol
}
