package picker

import (
	"sync"
	"testing"

	"biasbin/solver"
	"biasbin/solver/eseries"
)

// TestAnyTopologySameAsAlone: with AnyTopology the three topologies are
// searched at once, each exactly as alone, so the builds of each in the
// result are the first builds of its own search (same IDs and scores, in
// order), and the progress reported through the one callback is one call
// at a time, never more steps done than its total once a total is given,
// and ends with every step done.
func TestAnyTopologySameAsAlone(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E24, 10, 1e6, 0.01, 0.25, 50, 1000), Transistors: benchTransistors(3)}
	var mu sync.Mutex
	busy, calls := false, 0
	var last [2]int64
	req := Request{Topology: AnyTopology, VCC_V: 12, VEE_V: -12, IC_A: 1e-3, Top: 12, Progress: func(done, total int64) {
		mu.Lock()
		if busy {
			t.Error("two progress calls at once")
		}
		busy = true
		mu.Unlock()
		if total > 0 && done > total {
			t.Errorf("progress %d of %d steps", done, total)
		}
		last = [2]int64{done, total}
		calls++
		mu.Lock()
		busy = false
		mu.Unlock()
	}}
	res, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	if calls == 0 || last[1] == 0 || last[0] != last[1] {
		t.Errorf("%d progress calls, the last %d of %d steps", calls, last[0], last[1])
	}
	seen := map[solver.Topology]int{}
	for _, c := range res.Candidates {
		seen[c.Topology]++
	}
	if len(seen) < 2 {
		t.Fatalf("the first %d builds are of %d topologies: the test does not compare across them", len(res.Candidates), len(seen))
	}
	for topo := range seen {
		alone := req
		alone.Topology, alone.Progress = topo, nil
		if topo != solver.SplitSupply {
			alone.VEE_V = 0
		}
		ra, err := Pick(st, alone)
		if err != nil {
			t.Fatal(err)
		}
		k := 0
		for _, c := range res.Candidates {
			if c.Topology != topo {
				continue
			}
			if k >= len(ra.Candidates) || ra.Candidates[k].ID != c.ID || ra.Candidates[k].Score != c.Score {
				t.Errorf("%v build %d: %s %.9g with any, alone %v", topo, k+1, c.ID, c.Score, ra.Candidates[k:min(k+1, len(ra.Candidates))])
			}
			k++
		}
	}
}
