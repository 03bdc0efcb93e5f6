package picker

import (
	"fmt"
	"maps"
	"slices"
	"strings"

	"biasbin/solver"
)

// KeptPart is a resistor already on the board that the build keeps in its
// position (a repair): the search fills only the other positions, and the
// kept part is never taken from stock.
type KeptPart struct {
	// Position is the position's name in the topology: "r1", "r2", "rc",
	// "re" (divider), "rf", "rc", "re" (collector feedback), "rb", "rc",
	// "re" (split supply).
	Position string
	// Ohm is the part's marked (or measured) value; it need not be
	// stocked.
	Ohm float64
	// Tol is its tolerance as a fraction; 0 = KeptDefaultTol.
	Tol float64
	// Rated_W is its power rating at 70 °C; 0 = KeptDefaultRated_W.
	Rated_W float64
}

// Defaults for a kept part whose tolerance or rating is not given. The
// part on the board is of unknown make and age, so they are conservative:
// a technician who knows better (a measured value, a marked band) gives
// them after the value (47K/1%/0.25W).
const (
	// KeptDefaultTol is ±10 %: E12's customary tolerance (REFERENCE.md
	// §1), the band much older gear was built with; an aged part can sit
	// beyond it, so a measured value with the meter's accuracy is better.
	KeptDefaultTol = 0.10
	// KeptDefaultRated_W is 1/8 W, the smallest common through-hole rating
	// (common practice).
	KeptDefaultRated_W = 0.125
	// KeptTCR_PPMPerK is the temperature coefficient every kept part is
	// taken with: the worst of carbon film's −200 to −1000 ppm/K
	// (REFERENCE.md §3, from memory), as its make is unknown.
	KeptTCR_PPMPerK = 1000
)

// Kept is the arrangement of a position filled by a kept part.
const Kept = "kept"

// What a kept part's figures were assumed from (KeptPart.Spec).
const (
	AssumedTol    = "tol"
	AssumedRating = "rated_w"
	AssumedTCR    = "tcr_ppm_per_k"
)

// Spec is the kept part as the solver takes it, with the defaults filled
// in, and the figures that were assumed (AssumedTol, AssumedRating,
// AssumedTCR: the TCR always is).
func (k KeptPart) Spec() (solver.ResistorSpec, []string) {
	s := solver.ResistorSpec{Nominal_Ohm: k.Ohm, Tol: k.Tol, TCR_PPMPerK: KeptTCR_PPMPerK, Rated_W: k.Rated_W,
		Knee_C: solver.DefaultResistorKnee_C, Max_C: solver.DefaultResistorMax_C}
	var assumed []string
	if s.Tol == 0 {
		s.Tol = KeptDefaultTol
		assumed = append(assumed, AssumedTol)
	}
	if s.Rated_W == 0 {
		s.Rated_W = KeptDefaultRated_W
		assumed = append(assumed, AssumedRating)
	}
	return s, append(assumed, AssumedTCR)
}

// checkKeep validates the kept parts of a request and narrows the
// topologies searched to those having every kept position (with
// AnyTopology, a kept r1 leaves the divider alone; rc and re are in
// every topology). It fills s.keep.
func (s *settings) checkKeep(keep []KeptPart) error {
	if len(keep) == 0 {
		return nil
	}
	names := map[string]bool{}
	for _, k := range keep {
		name := strings.ToLower(strings.TrimSpace(k.Position))
		if name == "" {
			return inputErr("keep", "name the position, e.g. --keep r1=47K", "a kept part without a position")
		}
		if names[name] {
			return inputErr("keep", "keep each position once", "%s is kept twice", name)
		}
		names[name] = true
		r := solver.ResistanceRange
		r.Field, r.Quantity = "keep", name+"'s value"
		if err := r.Check(k.Ohm); err != nil {
			return err
		}
		if !(k.Tol >= 0 && k.Tol < 0.5) {
			return inputErr("keep", "give a tolerance below 50 % (a part that far off is worth measuring: give the reading)",
				"%s's tolerance ±%g %% is not a resistor's", name, 100*k.Tol)
		}
		if !(k.Rated_W >= 0 && k.Rated_W <= 1000) {
			return inputErr("keep", "give the rating in watts, e.g. 0.25W, up to 1 kW",
				"%s's rating %g W is not a bias resistor's", name, k.Rated_W)
		}
		k.Position = name
		s.keep = append(s.keep, k)
	}
	has := func(t solver.Topology) bool {
		lay := layoutOf(t)
		for name := range names {
			if !slices.Contains(lay.names[:lay.n], name) {
				return false
			}
		}
		return true
	}
	var topos []solver.Topology
	for _, t := range s.topos {
		if has(t) {
			topos = append(topos, t)
		}
	}
	if len(topos) == 0 && len(s.topos) == 1 {
		lay := layoutOf(s.topos[0])
		var extra []string
		for _, name := range slices.Sorted(maps.Keys(names)) {
			if !slices.Contains(lay.names[:lay.n], name) {
				extra = append(extra, name)
			}
		}
		return inputErr("keep", "keep its positions: "+strings.Join(lay.names[:lay.n], ", "),
			"the %v stage has no %s", s.topos[0], strings.Join(extra, ", "))
	}
	if len(topos) == 0 {
		var want []string
		for _, t := range s.topos {
			lay := layoutOf(t)
			want = append(want, fmt.Sprintf("%v: %s", t, strings.Join(lay.names[:lay.n], ", ")))
		}
		return inputErr("keep", "keep positions of the topology asked for ("+strings.Join(want, "; ")+")",
			"%s: no topology searched has every kept position", strings.Join(slices.Sorted(maps.Keys(names)), ", "))
	}
	s.topos = topos
	if s.topo == AnyTopology && len(topos) == 1 {
		s.topo = topos[0]
	}
	return nil
}

// keptSpecs returns the kept parts of the layout's positions: their specs
// (for buildValues) and, per position, the index into them (−1 where the
// position is free).
func (s *settings) keptSpecs(lay *layout) (specs []solver.ResistorSpec, at [maxPos]int) {
	for i := range at {
		at[i] = -1
	}
	for _, k := range s.keep {
		i := slices.Index(lay.names[:lay.n], k.Position)
		if i < 0 {
			continue
		}
		spec, _ := k.Spec()
		at[i] = len(specs)
		specs = append(specs, spec)
	}
	return specs, at
}

// assumedOf returns the figures assumed for the part kept at position
// name (KeptPart.Spec).
func (s *settings) assumedOf(name string) []string {
	for _, k := range s.keep {
		if k.Position == name {
			_, assumed := k.Spec()
			return assumed
		}
	}
	return nil
}

// pinKept records, per position, the level and value a kept part fixes
// (at from keptSpecs, over e.vs built with those specs).
func (e *evaluator) pinKept(at [maxPos]int) {
	for i := range e.lay.n {
		if at[i] < 0 {
			continue
		}
		vi := e.vs.kept[at[i]]
		e.kept[i] = true
		e.keepOne[i] = []int{vi}
		for li, l := range e.vs.levels {
			if slices.Contains(l.values, vi) {
				e.keepLv[i] = li
			}
		}
	}
}

// levelRange is the range of levels position pos may take: the kept
// part's level alone, or every level.
func (e *evaluator) levelRange(pos int) (lo, hi int) {
	if e.kept[pos] {
		return e.keepLv[pos], e.keepLv[pos]
	}
	return 0, len(e.vs.levels) - 1
}

// clampRange narrows the level range [lo, hi] of position pos to the
// levels it may take (lo > hi when none is left).
func (e *evaluator) clampRange(pos, lo, hi int) (int, int) {
	a, b := e.levelRange(pos)
	return max(lo, a), min(hi, b)
}

// pinLevels moves the kept positions of a level tuple to their kept
// levels: a plan's seed and hill-climb, which pick levels by hand rules,
// then only make builds that keep the parts.
func (e *evaluator) pinLevels(lv [maxPos]int) [maxPos]int {
	for i := range e.lay.n {
		if e.kept[i] {
			lv[i] = e.keepLv[i]
		}
	}
	return lv
}

// admitted returns the values position pos may take at level lv: the kept
// part at its level (nothing elsewhere), or the level's stocked values.
func (e *evaluator) admitted(pos, lv int) []int {
	if e.kept[pos] {
		if lv == e.keepLv[pos] {
			return e.keepOne[pos]
		}
		return nil
	}
	return e.vs.levels[lv].stock
}

// keptNote is a kept part's spec written for an ID: value, tolerance and
// rating, so builds keeping different parts never share an ID.
func keptNote(s solver.ResistorSpec) string {
	return fmt.Sprintf("%.6g/%.4g/%.4g", s.Nominal_Ohm, s.Tol, s.Rated_W)
}
