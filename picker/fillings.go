package picker

import "biasbin/solver"

// Fillings returns every way the stocked resistor lines can fill one
// position for `boards` boards: each line as a single and, with pairs,
// every worthwhile series and parallel pair, ascending in resistance and,
// within one resistance, in the picker's documented preference order
// (single, series, parallel, then tighter tolerance, higher rating, lower
// TCR, lower line IDs). Each carries its parts and its solver spec, as a
// picked build's positions do.
func Fillings(lines []Resistor, boards int, pairs bool) []Position {
	if boards < 1 {
		boards = 1
	}
	vs := buildValues(lines, boards, pairs, solver.DefaultResistorKnee_C, solver.Limits{}.WithDefaults())
	var out []Position
	for _, l := range vs.levels {
		for _, vi := range l.values {
			out = append(out, vs.position(vi))
		}
	}
	return out
}

// position is value vi as a build's position: its parts and spec.
func (vs *valueSet) position(vi int) Position {
	v := vs.values[vi]
	pos := Position{Ohm: v.ohm, Arrangement: v.arr, Spec: v.spec}
	for _, li := range v.parts() {
		r := vs.lines[li]
		pos.Parts = append(pos.Parts, Part{ID: r.ID, Ohm: r.Ohm, Bin: r.Bin})
	}
	return pos
}
