package picker

import "math"

// singlesOnly applies bound P (doc.go): every value of a pair-only level
// is a pair, so a build that puts such a level in one more position
// scores at least floor + w_Parts, where floor bounds the rest of its
// score. When that is over the threshold thr, the loop over that position
// visits only the levels holding a single (valueSet.up and down).
func (e *evaluator) singlesOnly(floor, thr float64) bool {
	return e.s.w.Parts > 0 && floor+e.s.w.Parts > thr
}

// partsFloor is the weighted parts term every build with level i in a
// position carries for that position.
func (e *evaluator) partsFloor(i int) float64 {
	return e.s.w.Parts * e.vs.partsFloor(i)
}

// useAndPartsFloor is a lower bound on w_Utilization·U + w_Parts·(the
// extra parts of the open positions) for a build whose other parts'
// utilization is at least u and whose open positions (levels not yet
// chosen) dissipate at least ps watts each (bound U-P): a position filled
// by one part (a single or a kept part) has a utilization of at least its
// power over the best allowance of such a value; one filled by a pair at
// least its power over the best of any value, and the pair adds its extra
// part. The least over every choice is at least w_Utilization·max(u, each
// power over the best of any value), the floor without the choice.
func (e *evaluator) useAndPartsFloor(u float64, ps ...float64) float64 {
	w := e.s.w
	best := math.Inf(1)
choices:
	for pairs := 0; pairs < 1<<len(ps); pairs++ {
		f, v := 0.0, u
		for i, p := range ps {
			allow := e.vs.allowHotOneMax_W
			if pairs&(1<<i) != 0 {
				f += w.Parts
				allow = e.vs.allowHotMax_W
			}
			if allow <= 0 {
				continue choices // no such value
			}
			v = max(v, p/allow)
		}
		best = min(best, f+w.Utilization*v)
	}
	return best
}
