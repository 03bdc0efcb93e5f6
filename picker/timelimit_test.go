package picker

import (
	"errors"
	"testing"
	"time"

	"biasbin/solver"
	"biasbin/solver/eseries"
)

// TestTimeLimitStopsTheSearch: a search that would run for seconds (every
// E24 value 10 Ω–1 MΩ, IEC 60063:2015 Table 1, with pairs, the divider at
// 10 mA with a parts weight of 0: a pair costs nothing, so the pair levels
// form a near-continuum; 5.5 s unlimited on the 2-core machine it was
// written on) stops at its time limit, ranks what it found, and says so; a
// search that ends in time does not; a negative limit is refused.
func TestTimeLimitStopsTheSearch(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E24, 10, 1e6, 0.01, 0.25, 50, 1000), Transistors: benchTransistors(4)}
	free := DefaultWeights()
	free.Parts = 0
	req := Request{Topology: solver.Divider, VCC_V: 12, IC_A: 10e-3, Top: 3, Pairs: true, Weights: free, TimeLimit: 300 * time.Millisecond}
	res, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	r := res.Ranking
	if !r.Stopped || r.Proven || r.TimeLimit != req.TimeLimit {
		t.Fatalf("ranking %+v: want stopped at %v and not proven", r, req.TimeLimit)
	}
	if len(res.Candidates) == 0 {
		t.Fatal("a stopped search lists no build; the seeds alone find some")
	}
	for i, c := range res.Candidates {
		if len(c.Failing) > 0 {
			t.Errorf("build %d fails %v", i+1, c.Failing)
		}
		if i > 0 && c.Score < res.Candidates[i-1].Score {
			t.Errorf("build %d scores %g, under build %d's %g", i+1, c.Score, i, res.Candidates[i-1].Score)
		}
	}

	fast := Request{VCC_V: 12, IC_A: 1e-3, Top: 3, TimeLimit: time.Hour}
	res, err = Pick(Stock{Resistors: seriesStock(eseries.E12, 100, 100e3, 0.05, 0.25, 10, 1), Transistors: benchTransistors(2)}, fast)
	if err != nil {
		t.Fatal(err)
	}
	if res.Ranking.Stopped {
		t.Errorf("a search that ended within its hour says it stopped: %+v", res.Ranking)
	}

	_, err = Pick(st, Request{VCC_V: 12, IC_A: 1e-3, TimeLimit: -time.Second})
	var ie *InputError
	if !errors.As(err, &ie) || ie.Field != "time-limit" {
		t.Errorf("a negative time limit gives %v, want an InputError on time-limit", err)
	}
}
