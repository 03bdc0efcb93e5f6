package picker

import (
	"slices"
	"testing"

	"biasbin/solver"
	"biasbin/solver/eseries"
)

// TestUnratedTransistorIsNotRankedAsSafe: a stocked pull that states no
// VCEO and no power rating is left out of a pick unless unrated parts are
// allowed, and then every build on it names the unknown ratings. Source
// for why they matter: a stage that cuts off puts the whole supply across
// the transistor (common practice), and every conducting part dissipates
// VCE·IC (REFERENCE.md §8).
func TestUnratedTransistorIsNotRankedAsSafe(t *testing.T) {
	pull := smallNPN(7, 150, 450)
	pull.Sheet.VCEO_V, pull.Sheet.PD25_W, pull.Sheet.ThetaJA_KPerW = 0, 0, 0
	rated := smallNPN(8, 110, 330)
	rated.Sheet.VCEO_V = 80
	st := Stock{Resistors: seriesStock(eseries.E12, 100, 220e3, 0.05, 0.5, 10, 1000),
		Transistors: []Transistor{pull, rated}}
	req := Request{VCC_V: 24, IC_A: 5e-3, Top: 5}

	res, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Candidates) == 0 {
		t.Fatal("no build on the rated part")
	}
	for _, c := range res.Candidates {
		if c.Transistor.ID == pull.ID {
			t.Fatalf("%s: a build on the unrated pull was ranked without --allow-unrated", c.ID)
		}
		if len(c.UnknownRatings) > 0 {
			t.Fatalf("%s: the rated part is listed with unknown ratings %v", c.ID, c.UnknownRatings)
		}
	}

	req.AllowUnrated = true
	res, err = Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	seen := false
	for _, c := range res.Candidates {
		if c.Transistor.ID != pull.ID {
			continue
		}
		seen = true
		if want := []solver.Rating{solver.RatingVCEO, solver.RatingDissipation}; !slices.Equal(c.UnknownRatings, want) {
			t.Errorf("%s: unknown ratings %v, want %v", c.ID, c.UnknownRatings, want)
		}
	}
	if !seen {
		t.Fatal("with unrated parts allowed, no build on the pull was listed")
	}
}

// TestUnratedReasonInShortfall: when the only line of the polarity is
// unrated, the shortfall says why it was left out.
func TestUnratedReasonInShortfall(t *testing.T) {
	pull := smallNPN(7, 150, 450)
	pull.Sheet.VCEO_V = 0
	st := Stock{Resistors: seriesStock(eseries.E12, 100, 220e3, 0.05, 0.5, 10, 1000), Transistors: []Transistor{pull}}
	res, err := Pick(st, Request{VCC_V: 12, IC_A: 1e-3})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Candidates) != 0 || res.Shortfall == nil {
		t.Fatalf("%d builds, shortfall %v", len(res.Candidates), res.Shortfall)
	}
	if rj := res.Shortfall.Rejected; len(rj) != 1 || rj[0].Kind != RejectUnrated || !slices.Equal(rj[0].Unknown, []solver.Rating{solver.RatingVCEO}) {
		t.Fatalf("rejected %+v", rj)
	}
}
