package repair

import (
	"math"
	"sort"

	"biasbin/picker"
	"biasbin/solver"
)

// Change search (doc.go of package repair, Substitute).
const (
	// changeSpan is how far from its marked value a position's ideal
	// value is sought (×/÷ changeSpan).
	changeSpan = 30.0
	// changeGrid is the number of log-spaced values the search brackets
	// the ideal value with.
	changeGrid = 41
	// changeLevels is how many stocked resistances on each side of the
	// ideal value are solved exactly.
	changeLevels = 4
)

// Change is one resistor position refitted from stock.
type Change struct {
	Position solver.Slot
	// FromOhm is the value marked on the board; Filling the stocked part
	// or pair that replaces it.
	FromOhm float64
	Filling picker.Position
	// After is the stage with the substitute and the change.
	After Point
	// ICShift, WorstShiftMin, WorstShiftMax, Within, Margins and Failing
	// are as in Candidate, for the changed stage.
	ICShift, VCEShift            float64
	WorstShiftMin, WorstShiftMax float64
	Within                       bool
	Margins                      Margins
	Failing                      []Failure
}

// nominalIC solves b's nominal collector current and VCE; ok is false
// when it does not solve.
func nominalIC(b solver.Build) (ic, vce float64, ok bool) {
	op, _, err := solver.Nominal(b)
	return op.IC_A, op.VCE_V, err == nil
}

// qpointError is how far a nominal point sits from the original's: the
// larger of the relative IC and VCE shifts, so that a change restores
// both (a collector resistor alone can bring IC back while moving VCE
// far).
func qpointError(icShift, vceShift float64) float64 {
	return max(math.Abs(icShift), math.Abs(vceShift))
}

// idealValue finds the value of position sl that puts the nominal IC at
// ic0 with everything else as in b: a log grid brackets it, bisection
// refines it. Without a bracket it returns the grid's closest value.
func idealValue(b solver.Build, sl solver.Slot, ic0 float64) (float64, bool) {
	r0 := b.Resistors[sl].Nominal_Ohm
	f := func(r float64) (float64, bool) {
		bb := b
		bb.Resistors[sl].Nominal_Ohm = r
		ic, _, ok := nominalIC(bb)
		return ic - ic0, ok
	}
	var rs, fs []float64
	for k := range changeGrid {
		r := r0 / changeSpan * math.Pow(changeSpan*changeSpan, float64(k)/(changeGrid-1))
		if v, ok := f(r); ok {
			rs, fs = append(rs, r), append(fs, v)
		}
	}
	if len(rs) == 0 {
		return 0, false
	}
	best := 0
	for i := range rs {
		if math.Abs(fs[i]) < math.Abs(fs[best]) {
			best = i
		}
		if i > 0 && (fs[i-1] < 0) != (fs[i] < 0) {
			lo, hi, flo := rs[i-1], rs[i], fs[i-1]
			for range 40 {
				mid := math.Sqrt(lo * hi)
				fm, ok := f(mid)
				if !ok {
					break
				}
				if (fm < 0) == (flo < 0) {
					lo, flo = mid, fm
				} else {
					hi = mid
				}
			}
			return math.Sqrt(lo * hi), true
		}
	}
	return rs[best], true
}

// nearbyFillings returns the preferred filling of each of the changeLevels
// stocked resistances below and above r (fills ascending in Ohm).
func nearbyFillings(fills []picker.Position, r float64) []picker.Position {
	i := sort.Search(len(fills), func(k int) bool { return fills[k].Ohm >= r })
	var out []picker.Position
	// Below: walk down, one per distinct resistance.
	for k, n := i-1, 0; k >= 0 && n < changeLevels; k-- {
		if k > 0 && fills[k-1].Ohm == fills[k].Ohm {
			continue
		}
		out = append(out, fills[k])
		n++
	}
	for k, n := i, 0; k < len(fills) && n < changeLevels; k++ {
		if k > i && fills[k-1].Ohm == fills[k].Ohm {
			continue
		}
		out = append(out, fills[k])
		n++
	}
	return out
}

// bestChange finds the one position and stocked filling that brings c's
// nominal point nearest the original's (qpointError): for each position
// the value that restores IC exactly is found, and the stocked values
// around it are solved; nil when no change does better than none.
func bestChange(c *Candidate, fills []picker.Position, orig Original, tol float64, lim solver.Limits) *Change {
	if len(fills) == 0 {
		return nil
	}
	b := c.Point.Build
	ic0 := orig.IC_A
	type option struct {
		sl   solver.Slot
		fill picker.Position
		err  float64 // qpointError
	}
	var best *option
	better := func(o option) bool {
		if best == nil {
			return true
		}
		if o.err != best.err {
			return o.err < best.err
		}
		return len(o.fill.Parts) < len(best.fill.Parts)
	}
	for _, sl := range b.Topology.Slots() {
		if b.Resistors[sl].Nominal_Ohm == 0 {
			continue
		}
		r, ok := idealValue(b, sl, ic0)
		if !ok {
			continue
		}
		for _, fl := range nearbyFillings(fills, r) {
			bb := b
			bb.Resistors[sl] = fl.Spec
			ic, vce, ok := nominalIC(bb)
			if !ok {
				continue
			}
			if o := (option{sl, fl, qpointError(ic/ic0-1, vce/orig.VCE_V-1)}); better(o) {
				best = &o
			}
		}
	}
	if best == nil || best.err >= qpointError(c.ICShift, c.VCEShift) {
		return nil
	}
	bb := b
	bb.Resistors[best.sl] = best.fill.Spec
	p, err := solvePoint(bb, b.Device, lim)
	if err != nil {
		return nil
	}
	ch := &Change{Position: best.sl, FromOhm: b.Resistors[best.sl].Nominal_Ohm, Filling: best.fill, After: p}
	ch.ICShift, ch.VCEShift = p.Nominal.IC_A/ic0-1, p.Nominal.VCE_V/orig.VCE_V-1
	ch.WorstShiftMin, ch.WorstShiftMax = p.Worst.ICMin_A/ic0-1, p.Worst.ICMax_A/ic0-1
	ch.Margins, ch.Failing = limits(p, lim)
	ch.Within = len(ch.Failing) == 0 && math.Abs(ch.ICShift) <= tol
	return ch
}
