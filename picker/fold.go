package picker

import (
	"slices"
	"strings"
)

// Near-duplicate builds. Two builds of one search are near-duplicates when
// they share the topology, the transistor type (its label, whichever
// stock line it comes from) and, in every resistor position, the nominal
// value, the arrangement and the values of its parts: they differ only in
// the tolerance grade, power rating, TCR or stock line of parts of the
// same value. Unless Request.ShowAll is set, the search keeps only the
// best of each such group (the pool holds one build per group), and each
// candidate counts in Candidate.Folded the other builds of the stock with
// its values.

// foldGroup identifies a group of near-duplicates within one evaluator.
type foldGroup struct {
	e     *evaluator
	dev   int // the first device with the transistor's label
	lv    [maxPos]int
	shape [maxPos]int
}

// group returns the build's group of near-duplicates.
func (ev *evaluated) group() foldGroup {
	e := ev.e
	g := foldGroup{e: e, dev: e.devGroup(ev.c.dev), lv: ev.c.lv}
	for i := range e.lay.n {
		g.shape[i] = e.vs.values[ev.c.val[i]].shape
	}
	return g
}

// devGroup returns the index of the first device with the label of device
// i (letter case aside).
func (e *evaluator) devGroup(i int) int { return e.devs[i].labelGroup }

// setLabelGroups sets each device's labelGroup (after the devices are
// sorted).
func (e *evaluator) setLabelGroups() {
	for i := range e.devs {
		e.devs[i].labelGroup = i
		for j := range i {
			if strings.EqualFold(e.devs[j].line.Sheet.Label, e.devs[i].line.Sheet.Label) {
				e.devs[i].labelGroup = j
				break
			}
		}
	}
}

// folded counts the other builds of the stock that are near-duplicates of
// c: the ways to fill each position with the same shape at the same
// level, times the transistor lines with the same label, less c itself.
func (e *evaluator) folded(c combo) int {
	n := 0
	g := e.devGroup(c.dev)
	for i := range e.devs {
		if e.devGroup(i) == g {
			n++
		}
	}
	for i := range e.lay.n {
		shape := e.vs.values[c.val[i]].shape
		k := 0
		for _, vi := range e.vs.levels[c.lv[i]].values {
			if e.vs.values[vi].shape == shape {
				k++
			}
		}
		n *= k
	}
	return n - 1
}

// setShapes numbers the values of each level by shape: values of one
// level with the same arrangement and the same part values (sorted) share
// a shape, the index of the first of them in the level.
func (vs *valueSet) setShapes() {
	partOhms := func(v value) []float64 {
		var out []float64
		for _, li := range v.parts() {
			out = append(out, vs.lines[li].Ohm)
		}
		slices.Sort(out)
		return out
	}
	for _, l := range vs.levels {
		for k, vi := range l.values {
			v := &vs.values[vi]
			v.shape = k
			for j, wi := range l.values[:k] {
				w := vs.values[wi]
				if w.arr == v.arr && slices.EqualFunc(partOhms(w), partOhms(*v), sameOhm) {
					v.shape = j
					break
				}
			}
		}
	}
}
