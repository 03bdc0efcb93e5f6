package picker

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"biasbin/solver"
	"biasbin/solver/eseries"
)

// TestSearchMatchesExhaustive is the property test of the pruning: over
// many random small stocks, targets and seeds the default search returns
// exactly the top K of the exhaustive evaluation (same builds, same order,
// same scores). The reference is the exhaustive evaluation itself, which
// computes every build with no bound at all.
func TestSearchMatchesExhaustive(t *testing.T) {
	cases, large := 40, 6 // the last `large` cases draw 14..20 values
	if testing.Short() {
		cases, large = 10, 0
	}
	for k := range cases + large {
		rng := rand.New(rand.NewPCG(uint64(k), 7))
		pairs := k%5 == 4 && k < cases
		nVals := 6 + rng.IntN(9)
		if pairs {
			nVals = 3
		}
		if k >= cases {
			nVals = 14 + rng.IntN(7)
		}
		st := randomStock(rng, nVals, 1+rng.IntN(2))
		req := Request{
			VCC_V:  []float64{5, 9, 12, 15, 24}[rng.IntN(5)],
			VCCTol: []float64{0, 0.05}[rng.IntN(2)],
			IC_A:   []float64{0.2e-3, 0.5e-3, 1e-3, 2e-3, 5e-3}[rng.IntN(5)],
			Boards: 1 + rng.IntN(2),
			Top:    1 + rng.IntN(5),
			Seed:   rng.Uint64(),
			Pairs:  pairs,
			// failing builds are compared too when listed
			ShowFailing: k%3 == 0,
		}
		switch rng.IntN(5) {
		case 1:
			req.VCE_V = req.VCC_V * (0.3 + 0.3*rng.Float64())
		case 2:
			req.RL_Ohm = 10e3
			req.Bypass = true
		case 3:
			req.Weights = Weights{QPoint: 4 * rng.Float64(), Emitter: 4 * rng.Float64(), Beta: 2 * rng.Float64(), Headroom: rng.Float64(), Utilization: rng.Float64(), Yield: rng.Float64(),
				Parts: []float64{0, 0.01, 0.05, 0.3}[rng.IntN(4)] * rng.Float64()}
		case 4:
			// a narrow emitter band of the user's own
			req.VEMin_V = req.VCC_V * (0.05 + 0.1*rng.Float64())
			req.VEMax_V = req.VEMin_V * (1 + 0.2*rng.Float64())
		}
		// ambient ranges that hold 25 °C and ones wholly below or above it
		amb := [][2]float64{{0, 0}, {-20, 10}, {30, 70}, {-40, 85}}[rng.IntN(4)]
		req.AmbientMin_C, req.AmbientMax_C = amb[0], amb[1]
		// every topology, both polarities (the PNP stage mirrors the NPN
		// one: signed rails, the same transistors of the other polarity)
		req.Topology = []solver.Topology{solver.Divider, solver.CollectorFeedback, solver.SplitSupply}[k%3]
		if req.Topology == solver.SplitSupply {
			req.VEE_V = -[]float64{5, 9, 12}[rng.IntN(3)]
			req.VEETol = []float64{0, 0.02, 0.1}[(k/3)%3] // 0: the supply's
		}
		if k%4 == 1 {
			req.VCC_V, req.VEE_V = -req.VCC_V, -req.VEE_V
			for i := range st.Transistors {
				st.Transistors[i].Sheet.Polarity = solver.PNP
			}
		}
		if k%7 == 3 {
			req.Transistor = "qn-b" // one line, named in another letter case
		}
		if k%4 == 2 || k%6 == 5 {
			req.Keep = randomKeep(rng, st, req, 1+k%2)
		}
		t.Run(fmt.Sprintf("case%02d_%v", k, req.Topology), func(t *testing.T) { matchExhaustive(t, st, req) })
	}
}

// matchExhaustive fails unless the default search returns exactly the
// exhaustive evaluation's top K for req (same builds, order and scores,
// every kept part in its position), or both fail with the same error.
func matchExhaustive(t *testing.T, st Stock, req Request) {
	t.Helper()
	fast, errFast := Pick(st, req)
	req.Exhaustive = true
	full, err := Pick(st, req)
	if err != nil || errFast != nil {
		// a random stock may be bad input (e.g. every value too
		// large for the current): both modes must say so alike.
		if fmt.Sprint(err) != fmt.Sprint(errFast) {
			t.Fatalf("default error %v, exhaustive error %v", errFast, err)
		}
		return
	}
	if len(fast.Candidates) != len(full.Candidates) {
		t.Fatalf("default found %d builds, exhaustive %d (request %+v)", len(fast.Candidates), len(full.Candidates), req)
	}
	for i := range full.Candidates {
		a, b := fast.Candidates[i], full.Candidates[i]
		if a.ID != b.ID || a.Score != b.Score {
			t.Errorf("rank %d: default %s (%.6g), exhaustive %s (%.6g)", i+1, a.ID, a.Score, b.ID, b.Score)
		}
		for _, kp := range req.Keep {
			if p := a.Positions[kp.Position]; p.Arrangement != Kept || p.Ohm != kp.Ohm || len(p.Parts) != 0 {
				t.Errorf("rank %d: %s is %+v, want the kept %g ohm", i+1, kp.Position, p, kp.Ohm)
			}
		}
	}
}

// randomKeep draws n kept parts for distinct random positions of the
// request's topology: mostly a value near the free search's first build
// (as on a board that worked), stocked or not, sometimes any E24 value
// 100 Ω..100 kΩ; with or without a tolerance and rating of its own.
func randomKeep(rng *rand.Rand, st Stock, req Request, n int) []KeptPart {
	lay := layoutOf(req.Topology)
	all := eseries.Range(eseries.E24, 100, 100e3)
	free, _ := Pick(st, req)
	var out []KeptPart
	for _, i := range rng.Perm(lay.n)[:n] {
		k := KeptPart{Position: lay.names[i], Ohm: all[rng.IntN(len(all))]}
		if len(free.Candidates) > 0 && rng.IntN(4) > 0 {
			k.Ohm = free.Candidates[0].Positions[k.Position].Ohm * []float64{1, 1, 1.07, 0.9}[rng.IntN(4)]
		}
		if rng.IntN(2) == 0 {
			k.Tol, k.Rated_W = 0.05, 0.25
		}
		out = append(out, k)
	}
	return out
}

// TestE12DefaultEqualsExhaustive: on E12 100 Ω–10 kΩ with one transistor
// the default search and the exhaustive one give the identical top 10
// (the larger comparison runs in BenchmarkE12DefaultVsExhaustive).
func TestE12DefaultEqualsExhaustive(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E12, 100, 10e3, 0.05, 0.25, 100, 1000), Transistors: benchTransistors(1)}
	req := Request{VCC_V: 12, IC_A: 1e-3, Top: 10}
	fast, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	req.Exhaustive = true
	full, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	if len(fast.Candidates) != 10 || len(full.Candidates) != 10 {
		t.Fatalf("default %d builds, exhaustive %d", len(fast.Candidates), len(full.Candidates))
	}
	for i := range full.Candidates {
		if fast.Candidates[i].ID != full.Candidates[i].ID || fast.Candidates[i].Score != full.Candidates[i].Score {
			t.Errorf("rank %d: default %s, exhaustive %s", i+1, fast.Candidates[i].ID, full.Candidates[i].ID)
		}
	}
	if fast.Solved*10 > full.Solved {
		t.Errorf("default solved %d tuples, exhaustive %d: the bounds cut less than 90 %%", fast.Solved, full.Solved)
	}
}

// TestPairsMatchExhaustive is the property test of the search with pairs
// on sub-walls of the E96 wall (IEC 60063:2015, Table 2, the values of a
// real parts wall): random E96 lines from 100 Ω to 100 kΩ at 1 %, with
// every series and parallel pair formed, every topology and polarity, and
// parts weights from 0 (pairs free) to well above the default, so that
// bound P prunes pair levels at some depth of every plan. As in
// TestSearchMatchesExhaustive the reference is the exhaustive evaluation,
// which scores every build with no bound at all; the default search must
// return exactly its top K, and with a pool of 60 exactly its pool
// (matchExhaustivePool). The sub-walls are as large as the exhaustive
// run finishes on quickly in a unit test (a divider with 5 lines would
// have 35 levels per position, 1.5 million level tuples).
func TestPairsMatchExhaustive(t *testing.T) {
	cases := 12
	if testing.Short() {
		cases = 4
	}
	for k := range cases {
		st, req, name := pairsCase(k)
		t.Run(name, func(t *testing.T) {
			matchExhaustive(t, st, req)
			req.Finalists = 60
			matchExhaustivePool(t, st, req)
		})
	}
}

// pairsCase draws case k of TestPairsMatchExhaustive: a few lines of the
// E96 wall, two transistor types, a topology and parts weight by k.
func pairsCase(k int) (Stock, Request, string) {
	wall := eseries.Range(eseries.E96, 100, 100e3)
	rng := rand.New(rand.NewPCG(uint64(k), 96))
	topo := []solver.Topology{solver.Divider, solver.CollectorFeedback, solver.SplitSupply}[k%3]
	nVals := 6 // up to 48 levels per position on three positions
	if topo == solver.Divider {
		nVals = 4 // up to 24 levels on four
	}
	var st Stock
	for _, i := range rng.Perm(len(wall))[:nVals] {
		st.Resistors = append(st.Resistors, Resistor{ID: int64(100 + i), Ohm: wall[i], Tol: 0.01, TCR_PPMPerK: 100,
			Rated_W: []float64{0.25, 0.6}[rng.IntN(2)], Qty: 1 + rng.IntN(4), Bin: "R"})
	}
	for i := range 2 {
		hmin := 50 + float64(rng.IntN(150))
		st.Transistors = append(st.Transistors, smallNPN(int64(1+i), hmin, hmin*(2+2*rng.Float64())))
	}
	req := Request{
		Topology: topo,
		VCC_V:    []float64{9, 12, 15}[rng.IntN(3)],
		IC_A:     []float64{0.1e-3, 0.5e-3, 1e-3, 2e-3, 10e-3}[rng.IntN(5)],
		Top:      1 + rng.IntN(10),
		Seed:     rng.Uint64(),
		Pairs:    true,
	}
	if parts := []float64{-1, 0, 0.01, 0.2}[k%4]; parts >= 0 {
		req.Weights = DefaultWeights()
		req.Weights.Parts = parts
	}
	if topo == solver.SplitSupply {
		req.VEE_V = -[]float64{5, 12}[rng.IntN(2)]
	}
	if k%5 == 2 {
		req.VCC_V, req.VEE_V = -req.VCC_V, -req.VEE_V
		for i := range st.Transistors {
			st.Transistors[i].Sheet.Polarity = solver.PNP
		}
	}
	return st, req, fmt.Sprintf("case%02d_%v_%d_lines", k, topo, nVals)
}

// matchExhaustivePool: the search keeps the best builds by the score
// without the yield term (the pool, Request.Finalists of them), and its
// bounds cut against the pool's last member, so the whole pool, not only
// the top K, must be the exhaustive evaluation's: a bound that is wrong
// only near the threshold (a pair's extra part at the margin) shows here
// first.
func matchExhaustivePool(t *testing.T, st Stock, req Request) {
	t.Helper()
	s, err := normalize(req)
	if err != nil {
		t.Fatal(err)
	}
	pools := [2]*pool{}
	for i := range pools {
		e, _ := newEvaluator(s, st, req.Topology)
		p := newPool(s.pool, true)
		var cnt counters
		e.firstSearch(p, &cnt, i == 1)
		pools[i] = p
	}
	fast, full := pools[0].items, pools[1].items
	if len(fast) != len(full) {
		t.Fatalf("default pool holds %d builds, exhaustive %d", len(fast), len(full))
	}
	for i := range full {
		if fast[i].key != full[i].key || fast[i].score != full[i].score {
			t.Errorf("pool place %d: default %s (%.9g), exhaustive %s (%.9g)", i+1, fast[i].key, fast[i].score, full[i].key, full[i].score)
		}
	}
}

// TestFeedbackNearSaturationMatchesExhaustive: a collector-feedback target
// the largest stocked RF cannot bring IC down to (0.1 mA from 12 V) puts
// the best builds at the largest RF, near saturation, with scores near 1
// and the headroom term large, where bound F-RS (the RF window swept
// from the top, with headroomBelow) does the cutting. The default search
// gives the exhaustive top K on E6 10 Ω–1 MΩ at 1 % and at 5 % with
// 250 ppm/K (top 40), with the supply's tolerance and a wide ambient
// range, and with RC and RE kept on an E96 wall (top 10), also with a
// heavy beta weight.
func TestFeedbackNearSaturationMatchesExhaustive(t *testing.T) {
	for _, c := range []struct {
		tol, tcr float64
		amb      [2]float64
	}{{0.01, 100, [2]float64{0, 50}}, {0.05, 250, [2]float64{-20, 70}}} {
		res := seriesStock(eseries.E6, 10, 1e6, c.tol, 0.25, 100, 1000)
		for i := range res {
			res[i].TCR_PPMPerK = c.tcr
		}
		st := Stock{Resistors: res, Transistors: benchTransistors(2)}
		req := Request{Topology: solver.CollectorFeedback, VCC_V: 12, VCCTol: 0.05, IC_A: 0.1e-3, Top: 40,
			AmbientMin_C: c.amb[0], AmbientMax_C: c.amb[1]}
		t.Run(fmt.Sprintf("tol%g", c.tol), func(t *testing.T) { matchExhaustive(t, st, req) })
	}
	// RC and RE kept at a sum that leaves the transistor near saturation,
	// RF from an E96 wall (1 % apart): the top 10 are the RF levels from
	// the largest down, where the sweep settles the rest of the window
	// just below the last of them
	for _, keep := range [][]KeptPart{{{Position: "rc", Ohm: 82e3}, {Position: "re", Ohm: 18e3}}, {{Position: "rc", Ohm: 56e3, Tol: 0.05, Rated_W: 0.25}, {Position: "re", Ohm: 39e3}}} {
		st := Stock{Resistors: seriesStock(eseries.E96, 10, 1e6, 0.01, 0.25, 100, 1000), Transistors: benchTransistors(2)}
		req := Request{Topology: solver.CollectorFeedback, VCC_V: 12, VCCTol: 0.05, IC_A: 0.1e-3, Top: 10, Keep: keep}
		t.Run(fmt.Sprintf("kept%g", keep[0].Ohm), func(t *testing.T) { matchExhaustive(t, st, req) })
		// a heavy beta weight: lower RF is stiffer, so the order along
		// the window is no longer the order of the scores
		req.Weights = DefaultWeights()
		req.Weights.Beta = 12
		t.Run(fmt.Sprintf("kept%g_beta", keep[0].Ohm), func(t *testing.T) { matchExhaustive(t, st, req) })
	}
}
