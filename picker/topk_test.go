package picker

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"biasbin/solver"
)

// TestRankingDoesNotDependOnTop checks that the first K builds are the
// true first K whatever K is (issue 8, item 6): on random stocks small
// enough that one pool holds every build (a divider from 4 values and 2
// transistors, collector feedback from 8 values and 1 transistor: at most
// 4⁴·2 or 8³ = 512 builds; the largest Finalists is 517), the reference is
// the exhaustive search with that pool, in which every build that could
// rank is yielded. For several K, the default search with Settle must
// give the head of the reference and say it is proven; without Settle it
// must give the head whenever it says the order is proven. source: the
// ranking's definition (doc.go, Order): the order by final score over
// every build of the stock. The yield weight is raised so that the yield
// term reorders builds, and the fixture must make the search take further
// rounds.
func TestRankingDoesNotDependOnTop(t *testing.T) {
	cases := 12
	if testing.Short() {
		cases = 6
	}
	reordered, rounds := 0, 0
	for k := range cases {
		rng := rand.New(rand.NewPCG(uint64(k), 88))
		// a divider has four positions, collector feedback three
		st := randomStock(rng, []int{4, 8}[k%2], []int{2, 1}[k%2])
		w := DefaultWeights()
		w.Yield = 10
		req := Request{
			Topology:     []solver.Topology{solver.Divider, solver.CollectorFeedback}[k%2],
			VCC_V:        []float64{9, 12, 15}[rng.IntN(3)],
			VCCTol:       0.05,
			IC_A:         []float64{0.5e-3, 1e-3, 2e-3}[rng.IntN(3)],
			Top:          1,
			Seed:         rng.Uint64(),
			Weights:      w,
			YieldBoards:  30,
			AmbientMin_C: 20, AmbientMax_C: 30,
			ShowFailing: true,
		}
		t.Run(fmt.Sprintf("case%d", k), func(t *testing.T) {
			ref := req
			ref.Exhaustive, ref.Top, ref.Finalists = true, 5, int(FinalistsRange.Max)
			// the target is the nominal current of one of the stock's
			// builds, so that the yields near the top lie between 0 and 1
			trial, err := Pick(st, ref)
			if err != nil || len(trial.Candidates) == 0 {
				t.Skipf("random stock is bad input: %v", err)
			}
			req.IC_A = trial.Candidates[rng.IntN(len(trial.Candidates))].Nominal.IC_A
			ref.IC_A = req.IC_A
			want, err := Pick(st, ref)
			if err != nil {
				t.Skipf("random stock is bad input: %v", err)
			}
			if len(want.Candidates) == 0 {
				t.Skip("no build")
			}
			if !want.Ranking.Proven || want.Ranking.Rounds != 1 {
				t.Fatalf("reference: ranking %+v, want proven in one round (the pool holds every build)", want.Ranking)
			}
			for i, c := range want.Candidates[1:] {
				if c.Score-w.Yield*c.Terms.Yield < want.Candidates[i].Score-w.Yield*want.Candidates[i].Terms.Yield {
					reordered++
					break
				}
			}
			for _, top := range []int{1, 2, 3, 5} {
				// the smallest pool (Finalists 1, so Top) makes further
				// rounds the rule
				for _, mode := range []struct {
					exhaustive, settle bool
					finalists          int
				}{{false, true, 0}, {false, true, 1}, {false, false, 1}, {top == 3, true, 1}} {
					r := req
					r.Top, r.Exhaustive, r.Settle, r.Finalists = top, mode.exhaustive, mode.settle, mode.finalists
					got, err := Pick(st, r)
					if err != nil {
						t.Fatal(err)
					}
					if got.Ranking.Rounds > 1 {
						rounds++
					}
					if mode.settle && !got.Ranking.Proven {
						t.Fatalf("top %d %+v: ranking %+v not proven with Settle", top, mode, got.Ranking)
					}
					if !got.Ranking.Proven {
						continue
					}
					for i, c := range got.Candidates {
						if i >= len(want.Candidates) || c.ID != want.Candidates[i].ID || c.Score != want.Candidates[i].Score {
							t.Fatalf("top %d %+v: build %d is %s score %.6f; the reference has %s score %.6f",
								top, mode, i+1, c.ID, c.Score, want.Candidates[i].ID, want.Candidates[i].Score)
						}
					}
					if len(got.Candidates) != min(top, len(want.Candidates)) {
						t.Fatalf("top %d: %d builds, want %d", top, len(got.Candidates), min(top, len(want.Candidates)))
					}
				}
			}
		})
	}
	if reordered == 0 || rounds == 0 {
		t.Fatalf("fixture too weak: the yield term reordered %d reference rankings, %d searches took further rounds", reordered, rounds)
	}
	t.Logf("%d reference rankings reordered by the yield term, %d searches took further rounds", reordered, rounds)
}
