package fault

import (
	"errors"
	"fmt"
	"math"

	"biasbin/solver"
)

// Element values of the faulty network (doc.go, "The faulty circuit").
const (
	// OpenOhm stands for an open part: high enough to carry no current a
	// meter could see, finite so that the network stays solvable.
	OpenOhm = 1e12
	// ShortOhm is a shorted part or junction (a failed-short part measures
	// well under an ohm, common practice).
	ShortOhm = 0.1
	// WireOhm is a position marked 0 Ω (a wire).
	WireOhm = 1e-3
	// gmin is the conductance ngspice puts across each junction.
	gmin = 1e-12
)

// ErrNoConvergence is wrapped by the error returned when a faulty network's
// operating point is not found.
var ErrNoConvergence = errors.New("faulty stage: operating point did not converge")

// node indexes the network's nodes: three fixed rails, then the unknowns.
type node int

const (
	nGnd node = iota
	nVCC
	nVEE
	nB // base terminal
	nC // collector terminal
	nE // emitter terminal
	nX // the inside end of an open transistor lead
	numNodes
)

// firstUnknown is the first node whose voltage is solved for.
const firstUnknown = nB

// element is a conductance between two nodes.
type element struct {
	a, b node
	g    float64
}

// junctions are the transistor's parameters at the ambient, in the
// mirrored-NPN frame (package solver, doc.go).
type junctions struct {
	is, bf, br, nvt, vt, invVAF, ileak float64
	critBE, critBC                     float64
}

// network is one stage with one fault applied, mirrored to NPN, with the
// meter's input resistance on one node (or none).
type network struct {
	rail       [firstUnknown]float64
	sg         float64       // +1 NPN, −1 PNP: back from the mirrored frame
	ground     solver.Ground // the stage's 0 V, where the meter's black lead goes
	vcc        float64       // the stage's signed collector rail
	elems      []element
	tc, tb, te node
	unknowns   int // 3, or 4 when nX is used
	q          junctions
}

// slotNodes returns where resistor slot sl sits in topology t
// (solver.Topology.Joins), in the mirrored frame's nodes: nGnd is the
// emitter-side rail of a single supply and the common of a split one.
func slotNodes(t solver.Topology, sl solver.Slot) (a, b node, ok bool) {
	t1, t2, ok := t.Joins(sl)
	if !ok {
		return 0, 0, false
	}
	at := func(p solver.Terminal) node {
		switch p {
		case solver.BaseLead:
			return nB
		case solver.CollectorLead:
			return nC
		case solver.EmitterLead:
			return nE
		case solver.CollectorRail:
			return nVCC
		case solver.EmitterRail:
			if t == solver.SplitSupply {
				return nVEE
			}
		}
		return nGnd
	}
	return at(t1), at(t2), true
}

// newNetwork builds the network of stage s (marked values) with fault f
// and transistor model m evaluated at temp_C. meter is the probed node
// (0 = none) and meterOhm the meter's input resistance.
func newNetwork(s solver.Stage, m solver.Model, temp_C float64, f Fault, meter node, meterOhm float64) network {
	sg := 1.0
	if m.Polarity == solver.PNP {
		sg = -1
	}
	nw := network{tc: nC, tb: nB, te: nE, unknowns: 3, sg: sg, ground: s.Ground, vcc: s.VCC_V}
	nw.rail[nVCC] = sg * s.VCC_V
	nw.rail[nVEE] = sg * s.VEE_V
	for _, sl := range s.Topology.Slots() {
		a, b, _ := slotNodes(s.Topology, sl)
		r := s.R_Ohm[sl]
		if p, ok := f.Position.Slot(); ok && p == sl {
			switch f.Kind {
			case Open:
				r = OpenOhm
			case Short:
				r = ShortOhm
			case Drift:
				r = f.Ohm
			}
		} else if r == 0 {
			r = WireOhm
		}
		nw.elems = append(nw.elems, element{a, b, 1 / r})
	}
	if f.Position == Transistor {
		switch f.Kind {
		case BEOpen:
			nw.te, nw.unknowns = nX, 4
			nw.elems = append(nw.elems, element{nX, nE, 1 / OpenOhm})
		case BCOpen:
			nw.tc, nw.unknowns = nX, 4
			nw.elems = append(nw.elems, element{nX, nC, 1 / OpenOhm})
		case BEShort:
			nw.elems = append(nw.elems, element{nB, nE, 1 / ShortOhm})
		case BCShort:
			nw.elems = append(nw.elems, element{nB, nC, 1 / ShortOhm})
		case CEShort:
			nw.elems = append(nw.elems, element{nC, nE, 1 / ShortOhm})
		case Leak:
			m.ICBO_A = f.Leak_A
		case LowHFE:
			m.BF = f.HFE
		}
	}
	if meter >= firstUnknown {
		black := nGnd
		if s.Ground == solver.CollectorRailGround {
			black = nVCC
		}
		nw.elems = append(nw.elems, element{meter, black, 1 / meterOhm})
	}
	is, bf, br, leak := m.At(temp_C)
	vt := solver.ThermalVoltage_V(temp_C)
	nw.q = junctions{is: is, bf: bf, br: br, nvt: m.NF * vt, vt: vt, ileak: leak}
	if m.VAF_V > 0 {
		nw.q.invVAF = 1 / m.VAF_V
	}
	nw.q.critBE = solver.CriticalVoltage_V(nw.q.nvt, is)
	nw.q.critBC = solver.CriticalVoltage_V(vt, is)
	return nw
}

// state is a solution of a network: every node voltage (mirrored frame)
// and the junction voltages the device was last evaluated at.
type state struct {
	v        [numNodes]float64
	vbe, vbc float64
}

// currents returns the transistor's collector and base currents (into the
// device) and their derivatives by VBE and VBC, GMIN included.
func (q *junctions) currents(vbe, vbc float64) (ic, ib, dicBE, dicBC, dibBE, dibBC float64) {
	ebe := math.Exp(min(vbe/q.nvt, 80))
	ebc := math.Exp(min(vbc/q.vt, 80))
	ibe, gbe := q.is*(ebe-1), q.is*ebe/q.nvt
	ibc, gbc := q.is*(ebc-1), q.is*ebc/q.vt
	k := 1 - vbc*q.invVAF
	ic = (ibe-ibc)*k - ibc/q.br + q.ileak - gmin*vbc
	ib = ibe/q.bf + ibc/q.br - q.ileak + gmin*vbe + gmin*vbc
	dicBE = gbe * k
	dicBC = -gbc*k - (ibe-ibc)*q.invVAF - gbc/q.br - gmin
	dibBE = gbe/q.bf + gmin
	dibBC = gbc/q.br + gmin
	return
}

// solve finds the operating point from start (nil = SPICE's initial
// junction guess), falling back to source stepping.
func (nw *network) solve(start *state) (state, error) {
	var st state
	if start != nil {
		st = *start
	} else {
		st.vbe, st.vbc = nw.q.critBE, 0
	}
	if nw.newton(&st, 1, 150) {
		return st, nil
	}
	st = state{vbe: nw.q.critBE}
	for _, lambda := range []float64{0.01, 0.03, 0.1, 0.2, 0.35, 0.5, 0.65, 0.8, 0.9, 1} {
		if !nw.newton(&st, lambda, 200) {
			return state{}, ErrNoConvergence
		}
	}
	return st, nil
}

// newton iterates with the rails scaled by lambda; it reports convergence.
func (nw *network) newton(st *state, lambda float64, maxIter int) bool {
	n := nw.unknowns
	for range maxIter {
		vbeRaw := st.v[nw.tb] - st.v[nw.te]
		vbcRaw := st.v[nw.tb] - st.v[nw.tc]
		vbe, limBE := solver.LimitJunction(vbeRaw, st.vbe, nw.q.nvt, nw.q.critBE)
		vbc, limBC := solver.LimitJunction(vbcRaw, st.vbc, nw.q.vt, nw.q.critBC)
		st.vbe, st.vbc = vbe, vbc
		var a [4][5]float64 // augmented matrix of the unknowns
		idx := func(k node) int { return int(k - firstUnknown) }
		for _, e := range nw.elems {
			for _, side := range [2][2]node{{e.a, e.b}, {e.b, e.a}} {
				p, o := side[0], side[1]
				if p < firstUnknown {
					continue
				}
				a[idx(p)][idx(p)] += e.g
				if o >= firstUnknown {
					a[idx(p)][idx(o)] -= e.g
				} else {
					a[idx(p)][4] += e.g * lambda * nw.rail[o]
				}
			}
		}
		ic, ib, dicBE, dicBC, dibBE, dibBC := nw.q.currents(vbe, vbc)
		// Current leaving each terminal node into the device, linearised.
		terms := [3]struct {
			k            node
			i0, gBE, gBC float64
		}{
			{nw.tc, ic, dicBE, dicBC},
			{nw.tb, ib, dibBE, dibBC},
			{nw.te, -(ic + ib), -(dicBE + dibBE), -(dicBC + dibBC)},
		}
		for _, t := range terms {
			r := idx(t.k)
			a[r][idx(nw.tb)] += t.gBE + t.gBC
			a[r][idx(nw.te)] -= t.gBE
			a[r][idx(nw.tc)] -= t.gBC
			a[r][4] -= t.i0 - t.gBE*vbe - t.gBC*vbc
		}
		x, ok := gauss(&a, n)
		if !ok {
			return false
		}
		done := !limBE && !limBC
		for i := 0; i < n; i++ {
			k := firstUnknown + node(i)
			if math.Abs(x[i]-st.v[k]) > 1e-9+1e-9*math.Abs(x[i]) {
				done = false
			}
			st.v[k] = x[i]
		}
		for k := nGnd; k < firstUnknown; k++ {
			st.v[k] = lambda * nw.rail[k]
		}
		if done {
			return true
		}
	}
	return false
}

// gauss solves the n×n system in a (augmented, column 4 is the right-hand
// side) by elimination with partial pivoting.
func gauss(a *[4][5]float64, n int) ([4]float64, bool) {
	var x [4]float64
	for c := 0; c < n; c++ {
		p := c
		for r := c + 1; r < n; r++ {
			if math.Abs(a[r][c]) > math.Abs(a[p][c]) {
				p = r
			}
		}
		if a[p][c] == 0 || math.IsNaN(a[p][c]) {
			return x, false
		}
		a[c], a[p] = a[p], a[c]
		for r := c + 1; r < n; r++ {
			f := a[r][c] / a[c][c]
			if f == 0 {
				continue
			}
			for k := c; k < n; k++ {
				a[r][k] -= f * a[c][k]
			}
			a[r][4] -= f * a[c][4]
		}
	}
	for r := n - 1; r >= 0; r-- {
		s := a[r][4]
		for k := r + 1; k < n; k++ {
			s -= a[r][k] * x[k]
		}
		x[r] = s / a[r][r]
		if math.IsNaN(x[r]) || math.IsInf(x[r], 0) {
			return x, false
		}
	}
	return x, true
}

// Point is a solved faulty stage: node voltages against the stage's
// ground (as a meter shows them) and the
// forward-referenced collector and base currents (package solver's
// conventions).
type Point struct {
	VB_V, VE_V, VC_V float64
	IC_A, IB_A       float64
}

// point reads a state back into the stage's own polarity, the node
// voltages against the stage's ground.
func (nw *network) point(st *state) Point {
	ic, ib, _, _, _, _ := nw.q.currents(st.v[nw.tb]-st.v[nw.te], st.v[nw.tb]-st.v[nw.tc])
	return Point{VB_V: nw.reading(st, nB), VE_V: nw.reading(st, nE), VC_V: nw.reading(st, nC), IC_A: ic, IB_A: ib}
}

// reading is node n of a state as a meter shows it against the stage's
// ground (solver.Ground.Meter).
func (nw *network) reading(st *state, n node) float64 {
	return nw.ground.Meter(nw.sg*st.v[n], nw.vcc)
}

// Solve returns the operating point of stage s (marked values) with fault f
// and transistor m at temp_C, with no meter attached.
func Solve(s solver.Stage, m solver.Model, temp_C float64, f Fault) (Point, error) {
	if err := checkInput(s, m, f); err != nil {
		return Point{}, err
	}
	nw := newNetwork(s, m, temp_C, f, 0, 0)
	st, err := nw.solve(nil)
	if err != nil {
		return Point{}, fmt.Errorf("%v %v: %w", f.Position, f.Kind, err)
	}
	return nw.point(&st), nil
}

// checkInput validates the stage, the model and the fault's values.
func checkInput(s solver.Stage, m solver.Model, f Fault) error {
	if err := m.Validate(); err != nil {
		return fmt.Errorf("faulty stage: %w", err)
	}
	if err := s.Validate(m.Polarity); err != nil {
		return fmt.Errorf("faulty stage: %w", err)
	}
	switch f.Kind {
	case Drift:
		if !(f.Ohm > 0) || math.IsInf(f.Ohm, 0) {
			return fmt.Errorf("faulty stage: %w", &solver.InputError{Field: "ohms", Problem: fmt.Sprintf("%g: a drifted value must be finite and > 0", f.Ohm)})
		}
	case Leak:
		if !(f.Leak_A >= 0) || math.IsInf(f.Leak_A, 0) {
			return fmt.Errorf("faulty stage: %w", &solver.InputError{Field: "leak", Problem: fmt.Sprintf("%g A: want a finite current >= 0", f.Leak_A)})
		}
	case LowHFE:
		if !(f.HFE > 0) || math.IsInf(f.HFE, 0) {
			return fmt.Errorf("faulty stage: %w", &solver.InputError{Field: "hfe", Problem: fmt.Sprintf("%g: want a finite hFE > 0", f.HFE)})
		}
	}
	if sl, ok := f.Position.Slot(); ok {
		if _, _, used := slotNodes(s.Topology, sl); !used {
			return fmt.Errorf("faulty stage: %w", &solver.InputError{Field: "position", Problem: fmt.Sprintf("%v is not a position of a %v stage", sl, s.Topology)})
		}
	}
	return nil
}
