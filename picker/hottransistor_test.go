package picker

import (
	"testing"

	"biasbin/solver"
	"biasbin/solver/eseries"
)

// TestHotTransistorMatchesExhaustive: at 10 mA on 12 V a small-signal
// transistor rated 0.25 W runs near a third of its derated allowance, so
// its own dissipation (bound U-Q) is the largest utilization of the best
// builds and the floor that prunes most; the default search of every
// topology, with and without pairs, must return the exhaustive top 10.
// source: the ranking's definition (doc.go): the exhaustive search scores
// every build, so a U-Q floor above the true utilization that cut a build
// of the true top 10 shows here.
func TestHotTransistorMatchesExhaustive(t *testing.T) {
	if testing.Short() {
		t.Skip("exhaustive searches")
	}
	hot := func(id int64, hmin, hmax float64) Transistor {
		tr := smallNPN(id, hmin, hmax)
		tr.Sheet.PD25_W = 0.25
		return tr
	}
	trs := []Transistor{hot(1, 100, 300), hot(2, 60, 240)}
	lines := func(ohms ...float64) []Resistor {
		var out []Resistor
		for i, v := range ohms {
			out = append(out, Resistor{ID: int64(100 + i), Ohm: v, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: 0.6, Qty: 10, Bin: "B"})
		}
		return out
	}
	for _, c := range []struct {
		name string
		vals []Resistor
		req  Request
	}{
		{"divider", seriesStock(eseries.E12, 100, 22e3, 0.05, 0.6, 10, 100), Request{VCC_V: 12, IC_A: 10e-3, Top: 10}},
		{"collector-feedback", seriesStock(eseries.E12, 10, 100e3, 0.05, 0.6, 10, 100), Request{Topology: solver.CollectorFeedback, VCC_V: 12, IC_A: 10e-3, Top: 10}},
		{"split-supply", seriesStock(eseries.E12, 10, 100e3, 0.05, 0.6, 10, 100), Request{Topology: solver.SplitSupply, VCC_V: 12, VEE_V: -12, IC_A: 10e-3, Top: 10}},
		// with pairs, a few lines each (every pair of them is a level)
		{"divider-pairs", lines(150, 330, 1e3, 4.7e3), Request{VCC_V: 12, IC_A: 10e-3, Top: 10, Pairs: true}},
		{"collector-feedback-pairs", lines(100, 220, 470, 10e3, 47e3, 100e3), Request{Topology: solver.CollectorFeedback, VCC_V: 12, IC_A: 10e-3, Top: 10, Pairs: true}},
		{"split-supply-pairs", lines(220, 470, 1e3, 2.2e3, 4.7e3, 10e3), Request{Topology: solver.SplitSupply, VCC_V: 12, VEE_V: -12, IC_A: 10e-3, Top: 10, Pairs: true}},
	} {
		t.Run(c.name, func(t *testing.T) {
			st := Stock{Resistors: c.vals, Transistors: trs}
			s, err := normalize(c.req)
			if err != nil {
				t.Fatal(err)
			}
			fast, full, err := bothModes(st, c.req)
			if err != nil {
				t.Fatal(err)
			}
			if len(full.Candidates) != c.req.Top || len(fast.Candidates) != c.req.Top {
				t.Fatalf("default %d builds, exhaustive %d", len(fast.Candidates), len(full.Candidates))
			}
			hottest := 0
			for i := range full.Candidates {
				a, b := fast.Candidates[i], full.Candidates[i]
				if a.ID != b.ID || a.Score != b.Score {
					t.Errorf("rank %d: default %s (%.6g), exhaustive %s (%.6g)", i+1, a.ID, a.Score, b.ID, b.Score)
				}
				d := solver.EvalDissipation(b.Build, b.Nominal, s.ambMax, s.lim)
				if d.Transistor.Utilization == b.MaxUtilization && b.MaxUtilization > 0.2 {
					hottest++
				}
			}
			if hottest == 0 {
				t.Errorf("fixture too weak: in no build of the top 10 is the transistor the hottest part above 20 %% of its allowance")
			}
			t.Logf("default solved %d tuples, exhaustive %d; transistor hottest in %d of 10", fast.Solved, full.Solved, hottest)
		})
	}
}
