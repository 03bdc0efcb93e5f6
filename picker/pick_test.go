package picker

import (
	"context"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"biasbin/solver"
	"biasbin/solver/eseries"
	"biasbin/solver/spicecheck"
)

// mixedStock is an invented parts wall: E12 at 5 % 1/4 W plus E24 at 1 %
// 1/2 W over 100 Ω..220 kΩ, two NPN and one PNP line.
func mixedStock() Stock {
	st := Stock{Resistors: append(seriesStock(eseries.E12, 100, 220e3, 0.05, 0.25, 10, 1000), seriesStock(eseries.E24, 100, 220e3, 0.01, 0.5, 4, 2000)...)}
	st.Transistors = []Transistor{smallNPN(1, 110, 800), smallNPN(2, 200, 450), smallPNP(3, 100, 300)}
	return st
}

// TestAgreesWithSolverAnalyses: the picker's tight evaluation gives the
// same numbers as the solver's own analyses of the picked build
// (solver.Nominal, EvalSensitivity, EvalDissipation, EvalWorstCase).
func TestAgreesWithSolverAnalyses(t *testing.T) {
	for _, req := range []Request{
		{VCC_V: 12, IC_A: 1e-3, Top: 3},
		{VCC_V: -9, IC_A: 0.5e-3, Top: 3, RL_Ohm: 10e3, Bypass: true},
		{Topology: solver.CollectorFeedback, VCC_V: 12, IC_A: 1e-3, Top: 3},
		{Topology: solver.SplitSupply, VCC_V: -12, VEE_V: 6, IC_A: 1e-3, Top: 3},
	} {
		res, err := Pick(mixedStock(), req)
		if err != nil {
			t.Fatal(err)
		}
		if len(res.Candidates) == 0 {
			t.Fatalf("%+v: no build", req)
		}
		for _, c := range res.Candidates {
			op, _, err := solver.Nominal(c.Build)
			if err != nil {
				t.Fatal(err)
			}
			if op.IC_A != c.Nominal.IC_A || op.VCE_V != c.Nominal.VCE_V {
				t.Errorf("%s: nominal IC %g VCE %g, solver.Nominal %g %g", c.ID, c.Nominal.IC_A, c.Nominal.VCE_V, op.IC_A, op.VCE_V)
			}
			sens, err := solver.EvalSensitivity(c.Build)
			if err != nil {
				t.Fatal(err)
			}
			if math.Abs(sens.BetaSpread) != c.Terms.Beta {
				t.Errorf("%s: beta term %g, EvalSensitivity %g", c.ID, c.Terms.Beta, sens.BetaSpread)
			}
			dis := solver.EvalDissipation(c.Build, op, 50, solver.Limits{})
			if dis.MaxUtilization != c.Terms.Utilization {
				t.Errorf("%s: utilization %g, EvalDissipation %g", c.ID, c.Terms.Utilization, dis.MaxUtilization)
			}
			wc, err := solver.EvalWorstCase(c.Build, solver.Limits{})
			if err != nil {
				t.Fatal(err)
			}
			if wc.VCEMin_V != c.Worst.VCEMin_V || wc.ICMin_A != c.Worst.ICMin_A || wc.AllActive != (len(c.Failing) == 0) {
				t.Errorf("%s: worst VCE %g IC %g ok %v, EvalWorstCase %g %g %v", c.ID, c.Worst.VCEMin_V, c.Worst.ICMin_A, len(c.Failing) == 0, wc.VCEMin_V, wc.ICMin_A, wc.AllActive)
			}
		}
	}
}

// TestPickedBuildInNgspice re-solves each picked build's nominal point in
// ngspice with the reported model parameters at the reported junction
// temperature (source: ngspice, run by the test): IC within 0.1 %.
func TestPickedBuildInNgspice(t *testing.T) {
	spicecheck.Require(t)
	reqs := []Request{
		{VCC_V: 12, IC_A: 1e-3},
		{VCC_V: 5, IC_A: 0.5e-3, VCE_V: 2},
		{VCC_V: 24, IC_A: 2e-3, RL_Ohm: 4.7e3, Bypass: true},
		{VCC_V: -9, IC_A: 1e-3},
		{VCC_V: -15, IC_A: 0.2e-3, Pairs: true},
		{Topology: solver.CollectorFeedback, VCC_V: 12, IC_A: 1e-3},
		{Topology: solver.CollectorFeedback, VCC_V: -9, IC_A: 0.5e-3},
		{Topology: solver.SplitSupply, VCC_V: 12, VEE_V: -12, IC_A: 1e-3},
		{Topology: solver.SplitSupply, VCC_V: -9, VEE_V: 5, IC_A: 1e-3, Pairs: true},
		{Topology: AnyTopology, VCC_V: 15, VEE_V: -15, IC_A: 2e-3},
	}
	var jobs []spicecheck.Job
	var want []float64
	for _, req := range reqs {
		req.Top = 2
		st := mixedStock()
		if req.Pairs {
			st.Resistors = seriesStock(eseries.E6, 100, 100e3, 0.05, 0.25, 10, 1000)
		}
		res, err := Pick(st, req)
		if err != nil {
			t.Fatal(err)
		}
		for _, c := range res.Candidates {
			jobs = append(jobs, spicecheck.Job{
				Deck:    solver.Netlist(c.Build.NominalStage(), c.Model, c.Nominal.Tj_C, "picked "+c.ID),
				Vectors: []string{"@q1[ic]"},
			})
			want = append(want, c.Nominal.IC_A)
		}
	}
	got, err := spicecheck.Run(context.Background(), jobs)
	if err != nil {
		t.Fatal(err)
	}
	for i, g := range got {
		ic := math.Abs(g["@q1[ic]"])
		if math.Abs(ic-want[i]) > 1e-3*want[i] { // ngspice: IC within 0.1 %
			t.Errorf("build %d: picker IC %.6g A, ngspice %.6g A", i, want[i], ic)
		}
	}
	t.Logf("ngspice: %d picked builds re-solved", len(jobs))
}

// handMethod is the common-practice design (common practice, REFERENCE.md
// §5: VE ≈ VCC/10, VCE ≈ VCC/2, R_TH ≤ 0.1(β_min + 1)RE, VBE 0.7 V):
// R1, R2, RC, RE in ohms.
func handMethod(vcc, ic, hfeMin float64) [nPos]float64 {
	ve := vcc / 10
	re := ve / ic
	rc := (vcc - vcc/2 - ve) / ic
	rth := 0.1 * (hfeMin + 1) * re
	vb := ve + 0.7
	return [nPos]float64{rth * vcc / vb, rth * vcc / (vcc - vb), rc, re}
}

// scoreOf scores one build through the picker's own scoring: the given
// transistor line and, per position, the stocked single nearest the ohms
// (on a log scale). It returns the final score (with yield) and whether
// the build passes.
func scoreOf(t *testing.T, st Stock, req Request, tr int64, ohms [maxPos]float64) (float64, bool) {
	t.Helper()
	s, err := normalize(req)
	if err != nil {
		t.Fatal(err)
	}
	e, _ := newEvaluator(s, st, s.topo)
	dev := -1
	for i := range e.devs {
		if e.devs[i].line.ID == tr {
			dev = i
		}
	}
	var c combo
	c.dev = dev
	for i, r := range ohms[:e.lay.n] {
		best := math.Inf(1)
		for l, lv := range e.vs.levels {
			if d := math.Abs(math.Log(lv.ohm / r)); d < best {
				best, c.lv[i] = d, l
			}
		}
		for _, vi := range e.vs.levels[c.lv[i]].values {
			if e.vs.values[vi].arr == Single {
				c.val[i] = vi
				break
			}
		}
	}
	tp := e.newTuple(dev, c.lv)
	if !tp.ok {
		t.Fatalf("hand-method build does not solve")
	}
	b := e.build(c)
	util := solver.EvalDissipation(b, tp.op, s.ambMax, s.lim).MaxUtilization
	e.betaSpread(tp, &counters{})
	ev := e.finish(c, b, tp, util)
	cand, _, err := e.candidate(ev, 0)
	if err != nil {
		t.Fatal(err)
	}
	return ev.score + s.w.Yield*(1-cand.Yield.Yield), len(ev.failing) == 0
}

// TestNeverWorseThanHandMethod: over several stocks and targets the hand
// method (common practice, REFERENCE.md §5), with each value rounded to
// the nearest stocked part, never scores better than the picker's first
// build.
func TestNeverWorseThanHandMethod(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	stocks := []Stock{mixedStock(),
		{Resistors: seriesStock(eseries.E12, 10, 1e6, 0.05, 0.25, 10, 1000), Transistors: []Transistor{smallNPN(1, 100, 300)}},
		randomStock(rng, 25, 2)}
	targets := []Request{{VCC_V: 12, IC_A: 1e-3}, {VCC_V: 9, IC_A: 2e-3}, {VCC_V: 15, IC_A: 0.5e-3}, {VCC_V: 24, IC_A: 1e-3}}
	for si, st := range stocks {
		for _, req := range targets {
			res, err := Pick(st, req)
			if err != nil {
				continue // a random stock may not reach the target current
			}
			if len(res.Candidates) == 0 || len(res.Candidates[0].Failing) > 0 {
				continue
			}
			first := res.Candidates[0]
			tr := st.Transistors[0]
			hand := handMethod(req.VCC_V, req.IC_A, tr.Sheet.HFEMin)
			score, pass := scoreOf(t, st, req, tr.ID, hand)
			if pass && score < first.Score {
				t.Errorf("stock %d, %g V %g A: hand method scores %.4g, better than the picker's first %.4g", si, req.VCC_V, req.IC_A, score, first.Score)
			}
			t.Logf("stock %d, %g V %g A: picker %.4g, hand method %.4g (passes %v)", si, req.VCC_V, req.IC_A, first.Score, score, pass)
		}
	}
}

// TestNeverWorseThanHandRulesOtherTopologies: the hand rules of the other
// topologies (common practice, REFERENCE.md §20), each value rounded to
// the nearest stocked part, never score better than the picker's first
// build. Collector feedback: VE = VCC/10 across RE = VE/IC, RC from the
// target IC and the mid-supply VCE, RF = β·RC with β the geometric mean of
// the hFE range. Split supply: RE = (VEE − 0.7 V)/IC, RB = 0.1·β_min·RE,
// RC for a VCE at the middle of the span with the emitter at −0.7 V.
func TestNeverWorseThanHandRulesOtherTopologies(t *testing.T) {
	stocks := []Stock{mixedStock(),
		{Resistors: seriesStock(eseries.E12, 10, 1e6, 0.05, 0.25, 10, 1000), Transistors: []Transistor{smallNPN(1, 100, 300)}}}
	checked := 0
	for si, st := range stocks {
		for _, req := range []Request{
			{Topology: solver.CollectorFeedback, VCC_V: 12, IC_A: 1e-3}, {Topology: solver.CollectorFeedback, VCC_V: 9, IC_A: 0.5e-3},
			{Topology: solver.SplitSupply, VCC_V: 12, VEE_V: -12, IC_A: 1e-3}, {Topology: solver.SplitSupply, VCC_V: 9, VEE_V: -5, IC_A: 2e-3},
		} {
			res, err := Pick(st, req)
			if err != nil {
				t.Fatal(err)
			}
			if len(res.Candidates) == 0 || len(res.Candidates[0].Failing) > 0 {
				continue
			}
			first := res.Candidates[0]
			tr := st.Transistors[0].Sheet
			vcc, vee, ic := req.VCC_V, -req.VEE_V, req.IC_A
			var hand [maxPos]float64
			if req.Topology == solver.CollectorFeedback {
				re := vcc / 10 / ic
				rc := (vcc - vcc/2 - vcc/10) / ic
				hand = [maxPos]float64{math.Sqrt(tr.HFEMin*tr.HFEMax) * rc, rc, re}
			} else {
				re := (vee - 0.7) / ic
				rc := (vcc + 0.7 - (vcc+vee)/2) / ic
				hand = [maxPos]float64{0.1 * tr.HFEMin * re, rc, re}
			}
			score, pass := scoreOf(t, st, req, st.Transistors[0].ID, hand)
			if pass && score < first.Score {
				t.Errorf("stock %d, %v %g V %g A: hand rule scores %.4g, better than the picker's first %.4g", si, req.Topology, vcc, ic, score, first.Score)
			}
			checked++
			t.Logf("stock %d, %v %g V %g A: picker %.4g, hand rule %.4g (passes %v)", si, req.Topology, vcc, ic, first.Score, score, pass)
		}
	}
	if checked < 4 {
		t.Errorf("only %d requests had a passing first build", checked)
	}
}

// TestOneTransistor: with Request.Transistor every build uses that line
// (matched without regard to ASCII letter case), and the first build is
// the best of that line in the unrestricted search's terms: the same as
// searching a stock that holds only that line.
func TestOneTransistor(t *testing.T) {
	st := mixedStock()
	req := Request{VCC_V: 12, IC_A: 1e-3, Top: 3, Transistor: "qn-c"}
	res, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	only := st
	only.Transistors = []Transistor{st.Transistors[1]}
	req.Transistor = ""
	want, err := Pick(only, req)
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Candidates) == 0 || len(res.Candidates) != len(want.Candidates) {
		t.Fatalf("%d builds, want %d", len(res.Candidates), len(want.Candidates))
	}
	for i, c := range res.Candidates {
		if c.Transistor.Sheet.Label != "QN-C" || c.ID != want.Candidates[i].ID {
			t.Errorf("rank %d: %s %s, want %s on QN-C", i+1, c.Transistor.Sheet.Label, c.ID, want.Candidates[i].ID)
		}
	}
}

// TestStableIDsAndOrder: the same stock in another order gives the same
// builds, IDs and scores (the documented tie-break is on line IDs and
// values, never on input order).
func TestStableIDsAndOrder(t *testing.T) {
	st := mixedStock()
	req := Request{VCC_V: 12, IC_A: 1e-3, Top: 5, Seed: 7}
	a, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(1, 2))
	rng.Shuffle(len(st.Resistors), func(i, j int) { st.Resistors[i], st.Resistors[j] = st.Resistors[j], st.Resistors[i] })
	rng.Shuffle(len(st.Transistors), func(i, j int) { st.Transistors[i], st.Transistors[j] = st.Transistors[j], st.Transistors[i] })
	b, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	if len(a.Candidates) != len(b.Candidates) || len(a.Candidates) == 0 {
		t.Fatalf("%d vs %d builds", len(a.Candidates), len(b.Candidates))
	}
	for i := range a.Candidates {
		if a.Candidates[i].ID != b.Candidates[i].ID || a.Candidates[i].Score != b.Candidates[i].Score {
			t.Errorf("rank %d: %s %g vs %s %g", i+1, a.Candidates[i].ID, a.Candidates[i].Score, b.Candidates[i].ID, b.Candidates[i].Score)
		}
	}
}

// TestNothingFits: the shortfall names the failed constraint and a
// purchase that the test then verifies gives a passing build.
func TestNothingFits(t *testing.T) {
	// Only 2 transistors in stock for 5 boards.
	few := mixedStock()
	few.Transistors = []Transistor{smallNPN(1, 110, 800)}
	few.Transistors[0].Qty = 2
	res, err := Pick(few, Request{VCC_V: 12, IC_A: 1e-3, Boards: 5})
	if err != nil {
		t.Fatal(err)
	}
	if res.Shortfall == nil || len(res.Shortfall.Reasons) == 0 || len(res.Shortfall.Rejected) != 1 || len(res.Shortfall.Purchases) == 0 ||
		res.Shortfall.Purchases[0].Slot != "transistor" {
		t.Errorf("too few transistors: shortfall %+v", res.Shortfall)
	}
	// Only large resistors: every build saturates or misses the current;
	// the picker must name a resistor to buy that fixes it.
	big := Stock{Resistors: seriesStock(eseries.E6, 1e3, 1e6, 0.05, 0.25, 20, 500), Transistors: []Transistor{smallNPN(1, 100, 300)}}
	req := Request{VCC_V: 5, IC_A: 2.4e-3}
	res, err = Pick(big, req)
	if err != nil {
		t.Fatal(err)
	}
	if res.Shortfall == nil || len(res.Shortfall.Reasons) == 0 {
		t.Fatalf("large values only: no shortfall (%d builds)", len(res.Candidates))
	}
	if len(res.Candidates) == 0 {
		t.Errorf("the nearest builds should be listed")
	}
	if len(res.Shortfall.Purchases) == 0 {
		t.Fatalf("no purchase suggested: %+v", res.Shortfall)
	}
	for i, p := range res.Shortfall.Purchases {
		if p.Ohm <= 0 || !eseries.Contains(eseries.E24, p.Ohm) {
			t.Errorf("purchase %+v is not an E24 value", p)
		}
		big.Resistors = append(big.Resistors, Resistor{ID: 900 + int64(i), Ohm: p.Ohm, Tol: p.Tol, Rated_W: p.Rated_W, TCR_PPMPerK: 200, Qty: p.Qty})
	}
	after, err := Pick(big, req)
	if err != nil {
		t.Fatal(err)
	}
	if after.Shortfall != nil || len(after.Candidates) == 0 || len(after.Candidates[0].Failing) > 0 ||
		math.Abs(after.Candidates[0].Nominal.IC_A/req.IC_A-1) > DefaultICWindow {
		t.Errorf("after buying %+v the stock still has no passing build", res.Shortfall.Purchases)
	}
	t.Logf("reasons %+v, buy %+v", res.Shortfall.Reasons, res.Shortfall.Purchases)
}

// TestOverloadedEverywhere: when every stocked value that could serve as
// RC or RE has too small a rating for the target current, no build fits;
// the shortfall says why, and the suggested purchase gives a build that
// fits (derating: REFERENCE.md §3, 50 % of the derated rating, common
// practice).
func TestOverloadedEverywhere(t *testing.T) {
	st := Stock{Resistors: append(seriesStock(eseries.E6, 100, 3.3e3, 0.05, 0.002, 20, 100), seriesStock(eseries.E6, 4.7e3, 100e3, 0.05, 0.25, 20, 200)...),
		Transistors: []Transistor{smallNPN(1, 100, 300)}}
	req := Request{VCC_V: 12, IC_A: 2e-3, Top: 3}
	res, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	if res.Shortfall == nil || len(res.Shortfall.Reasons) == 0 || len(res.Candidates) == 0 {
		t.Fatalf("no shortfall with 2 mW resistors: %+v", res.Shortfall)
	}
	want := Reason{Kind: OffTarget} // the nearest builds pass only far from the target current
	if len(res.Candidates[0].Failing) > 0 {
		want = Reason{Kind: NearestFail, Limit: FailAllowance} // a part overloaded
	}
	if !slices.ContainsFunc(res.Shortfall.Reasons, func(r Reason) bool { return r.Kind == want.Kind && r.Limit == want.Limit }) {
		t.Errorf("reasons %+v, want one of kind %d (limit %d)", res.Shortfall.Reasons, want.Kind, want.Limit)
	}
	if len(res.Shortfall.Purchases) == 0 {
		t.Fatalf("no purchase suggested: %+v", res.Shortfall)
	}
	for i, p := range res.Shortfall.Purchases {
		if p.Rated_W <= 0.002 {
			t.Errorf("purchase %+v keeps the too-small rating", p)
		}
		st.Resistors = append(st.Resistors, Resistor{ID: 900 + int64(i), Ohm: p.Ohm, Tol: p.Tol, Rated_W: p.Rated_W, TCR_PPMPerK: 200, Qty: p.Qty})
	}
	after, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	if after.Shortfall != nil {
		t.Errorf("after buying %+v: still %+v", res.Shortfall.Purchases, after.Shortfall.Reasons)
	}
	t.Logf("reasons %+v, buy %+v", res.Shortfall.Reasons, res.Shortfall.Purchases)
}

// TestPurchaseRatedForWorstCorner: on an eighth-watt wall, a split-supply
// stage at 10 mA needs an RE that dissipates over 100 mW (VEE across
// about 1.1 kΩ), more at the worst corner (rail high, RE low) than at the
// nominal point; the suggested purchase must carry a rating that holds
// at that corner, so buying it gives a passing build. The allowance is
// 50 % of the derated rating (REFERENCE.md §3, common practice).
func TestPurchaseRatedForWorstCorner(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E12, 100, 22e3, 0.05, 0.125, 50, 1), Transistors: []Transistor{smallNPN(1, 60, 200)}}
	req := Request{Topology: solver.SplitSupply, VCC_V: 12, VCCTol: 0.05, VEE_V: -12, IC_A: 10e-3, Top: 3}
	res, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	if res.Shortfall == nil || len(res.Shortfall.Purchases) == 0 {
		t.Fatalf("no purchase suggested: %+v", res.Shortfall)
	}
	for i, p := range res.Shortfall.Purchases {
		st.Resistors = append(st.Resistors, Resistor{ID: 900 + int64(i), Ohm: p.Ohm, Tol: p.Tol, Rated_W: p.Rated_W, TCR_PPMPerK: buyTCR_PPMPerK, Qty: p.Qty})
	}
	after, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	if after.Shortfall != nil || len(after.Candidates) == 0 || len(after.Candidates[0].Failing) > 0 {
		t.Errorf("after buying %+v the stock still has no passing build: %+v", res.Shortfall.Purchases, after.Shortfall)
	}
	t.Logf("buy %+v", res.Shortfall.Purchases)
}

// TestShowFailing: failing builds are listed only on request and never
// above a passing one; the progress callback reaches the total.

func TestShowFailing(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E3, 100, 100e3, 0.2, 0.002, 20, 100), Transistors: []Transistor{smallNPN(1, 100, 300)}}
	var last, total int64
	req := Request{VCC_V: 12, IC_A: 1e-3, Top: 50, Finalists: 105, YieldBoards: 20, ShowFailing: true,
		Progress: func(done, all int64) { last, total = done, all }}
	res, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	seenFailing, failing := false, 0
	for _, c := range res.Candidates {
		if len(c.Failing) > 0 {
			seenFailing = true
			failing++
		} else if seenFailing {
			t.Fatalf("passing build %s ranked below a failing one", c.ID)
		}
	}
	if failing == 0 || failing == len(res.Candidates) {
		t.Fatalf("%d failing of %d shown; the case does not test the order", failing, len(res.Candidates))
	}
	req.ShowFailing = false
	res2, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range res2.Candidates {
		if len(c.Failing) > 0 {
			t.Errorf("failing build %s shown without ShowFailing", c.ID)
		}
	}
	if total == 0 || last != total {
		t.Errorf("progress ended at %d of %d", last, total)
	}
}
