package picker

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
