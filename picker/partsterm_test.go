package picker

import (
	"testing"

	"biasbin/solver/eseries"
)

// pairCount is the number of positions of a candidate filled by a pair.
func pairCount(c Candidate) int {
	n := 0
	for _, p := range c.Positions {
		if p.Arrangement != Single {
			n++
		}
	}
	return n
}

// TestPairCostsAPlacement: a pair is one more part to place and solder
// (common practice: every placement is assembly time and one more joint
// to fail), so a build with pairs must beat the best build of stocked
// singles by more than the parts term to rank first. On an E24 wall at
// 1 % (IEC 60063:2015, Table 1) with pairs, the best build with free pairs
// (weight 0) uses pairs and beats the best all-singles build by less than
// the default weight per pair — a hair: one of its pairs is 22K‖22K where
// a stocked 11K gives the same value, taken for its higher rating. With the
// default weight the all-singles build ranks first, exactly as the search
// with pairs off finds it.
func TestPairCostsAPlacement(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E24, 1e3, 22e3, 0.01, 0.25, 4, 1000), Transistors: benchTransistors(1)}
	req := Request{VCC_V: 12, IC_A: 1e-3, Top: 3, Pairs: true}
	free := req
	free.Weights = DefaultWeights()
	free.Weights.Parts = 0
	withFree, err := Pick(st, free)
	if err != nil {
		t.Fatal(err)
	}
	singles := req
	singles.Pairs = false
	onlySingles, err := Pick(st, singles)
	if err != nil {
		t.Fatal(err)
	}
	priced, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	if len(withFree.Candidates) == 0 || len(onlySingles.Candidates) == 0 || len(priced.Candidates) == 0 {
		t.Fatal("no builds")
	}
	first, best := withFree.Candidates[0], onlySingles.Candidates[0]
	k := pairCount(first)
	if k == 0 {
		t.Fatalf("with free pairs the first build %s uses no pair: the case does not test the term", first.ID)
	}
	gain := best.Score - first.Score
	if gain <= 0 || gain >= DefaultPartsWeight*float64(k) {
		t.Fatalf("free pairs gain %.4g with %d pairs: not a hair (0 < gain < %.3g per pair)", gain, k, DefaultPartsWeight)
	}
	// the case of the 22K‖22K that displaces a stocked 11K: a pair whose
	// value a single line holds too, preferred for its rating
	twin := false
	for _, p := range first.Positions {
		for _, r := range st.Resistors {
			twin = twin || p.Arrangement == Parallel && sameOhm(p.Spec.Nominal_Ohm, r.Ohm)
		}
	}
	if !twin {
		t.Fatalf("with free pairs the first build %v has no parallel pair equal to a stocked value: the case does not test the term", first.Positions)
	}
	got := priced.Candidates[0]
	if pairCount(got) != 0 || got.ID != best.ID || got.Score != best.Score {
		t.Errorf("with the default parts weight the first build is %s (%d pairs, %.6g), want the singles build %s (%.6g)",
			got.ID, pairCount(got), got.Score, best.ID, best.Score)
	}
	if got.Terms.Parts != 0 || first.Terms.Parts != float64(k) {
		t.Errorf("parts terms %g and %g, want 0 and %d", got.Terms.Parts, first.Terms.Parts, k)
	}
}
