package pickcmd

import (
	"context"
	"math"
	"path/filepath"
	"testing"

	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/store"
)

// The numbers in this file are invented for formatting tests: they check
// layout, not computation, so no outside source applies.

// fakeStock is a small stock matching fakeResult's part IDs.
func fakeStock() picker.Stock {
	return picker.Stock{
		Resistors: []picker.Resistor{
			{ID: 1, Ohm: 39e3, Tol: 0.05, Rated_W: 0.25, Qty: 30, Bin: "A3"},
			{ID: 2, Ohm: 4.7e3, Tol: 0.05, Rated_W: 0.25, Qty: 3, Bin: "B1"},
			{ID: 3, Ohm: 330, Tol: 0.05, Rated_W: 0.25, Qty: 40, Bin: "C2"},
			{ID: 4, Ohm: 2.2e3, Tol: 0.01, Rated_W: 0.25, Qty: 15, Bin: "A7"},
			{ID: 5, Ohm: 10e3, Tol: 0.01, Rated_W: 0.25, Qty: 50, Bin: "A9"},
		},
		Transistors: []picker.Transistor{
			{ID: 10, Qty: 8, Bin: "D1", Sheet: solver.Datasheet{Label: "QN-104A", Polarity: solver.NPN, HFEMin: 110, HFEMax: 330,
				VCEO_V: 80, PD25_W: 0.625, ICMax_A: 0.2}},
		},
	}
}

// fakeCandidate is one build drawing R1 from line 1, R2 as a series pair of
// lines 2 and 3, RC from line 4 and RE as a parallel pair of line 5 twice.
func fakeCandidate(rank int, failing ...picker.Failure) picker.Candidate {
	tr := fakeStock().Transistors[0]
	op := func(ic, vb, ve, vc float64) solver.OperatingPoint {
		return solver.OperatingPoint{Region: solver.Active, IC_A: ic, IB_A: ic / 180, VB_V: vb, VE_V: ve, VC_V: vc, VCE_V: vc - ve, Tj_C: 27.4}
	}
	c := picker.Candidate{
		ID:         "b-" + string(rune('0'+rank)) + "f3a9c01",
		Rank:       rank,
		Score:      0.1234 * float64(rank),
		Terms:      picker.Terms{QPoint: 0.01, Beta: 0.052, Headroom: 0.02, Utilization: 0.3, Yield: 0.013},
		Transistor: tr,
		Positions: map[string]picker.Position{
			"r1": {Ohm: 39e3, Arrangement: "single", Parts: []picker.Part{{ID: 1, Ohm: 39e3, Bin: "A3"}},
				Spec: solver.ResistorSpec{Nominal_Ohm: 39e3, Tol: 0.05, Rated_W: 0.25}},
			"r2": {Ohm: 5030, Arrangement: "series", Parts: []picker.Part{{ID: 2, Ohm: 4.7e3, Bin: "B1"}, {ID: 3, Ohm: 330, Bin: "C2"}},
				Spec: solver.ResistorSpec{Nominal_Ohm: 5030, Tol: 0.05, Rated_W: 0.25}},
			"rc": {Ohm: 2.2e3, Arrangement: "single", Parts: []picker.Part{{ID: 4, Ohm: 2.2e3, Bin: "A7"}},
				Spec: solver.ResistorSpec{Nominal_Ohm: 2.2e3, Tol: 0.01, Rated_W: 0.25}},
			"re": {Ohm: 5e3, Arrangement: "parallel", Parts: []picker.Part{{ID: 5, Ohm: 10e3, Bin: "A9"}, {ID: 5, Ohm: 10e3, Bin: "A9"}},
				Spec: solver.ResistorSpec{Nominal_Ohm: 5e3, Tol: 0.01, Rated_W: 0.5}},
		},
		Build: solver.Build{Topology: solver.Divider, VCC_V: 12, VCCTol: 0.05, Device: tr.Sheet,
			Resistors: [solver.NumSlots]solver.ResistorSpec{
				{Nominal_Ohm: 39e3, Tol: 0.05, Rated_W: 0.25}, {Nominal_Ohm: 5030, Tol: 0.05, Rated_W: 0.25},
				{Nominal_Ohm: 2.2e3, Tol: 0.01, Rated_W: 0.25}, {Nominal_Ohm: 5e3, Tol: 0.01, Rated_W: 0.5}},
			AmbientMax_C: 50, NominalAmbient_C: 25},
		Model:   solver.Model{Polarity: solver.NPN, IS_A: 1.2e-14, BF: 180, BR: 1, NF: 1, XTI: 3, XTB: 1.5, EG_eV: 1.11, TNOM_C: 27},
		Nominal: op(2.01e-3, 1.62, 0.95, 7.58),
		Worst: solver.WorstCase{
			Corners: []solver.Corner{
				{OP: op(1.82e-3, 1.55, 0.9, 8.0)},
				{OP: op(2.21e-3, 1.7, 1.0, 7.1)},
			},
			ICMin_A: 1.82e-3, ICMax_A: 2.21e-3, VCEMin_V: 6.1, VCEMax_V: 7.1, AllActive: len(failing) == 0, TjMax_C: 52,
			Dissipation: solver.Dissipation{Ok: true, MaxUtilization: 0.31,
				Resistor: [solver.NumSlots]solver.PartLoad{solver.RC: {Power_W: 0.03875, Allowed_W: 0.125, Utilization: 0.31, Rated: true}}},
		},
		Yield: solver.YieldResult{Boards: 1000, Pass: 987, Yield: 0.987, Low95: 0.9778, High95: 0.9931, StdErr: 0.0036, Seed: 1}, // invented figures
		Window: picker.YieldWindow{Window: solver.Window{ICMin_A: 1.8e-3, ICMax_A: 2.2e-3, VCEMin_V: 5.3, VCEMax_V: 7.95},
			Rule: picker.DefaultWindowRule(), Centre: picker.WindowCentre{IC_A: 2e-3, ICOf: picker.CentreTarget, VCE_V: 6.63, VCEOf: picker.CentreTarget}},
		BetaSensitivity: 0.064,
		MaxUtilization:  0.31,
		Failing:         failing,
		OnTarget:        true,
	}
	// The test-point extremes over the corners, as the solver fills them.
	wc := &c.Worst
	wc.Count = len(wc.Corners)
	wc.VBMin_V, wc.VEMin_V, wc.VCMin_V = math.Inf(1), math.Inf(1), math.Inf(1)
	wc.VBMax_V, wc.VEMax_V, wc.VCMax_V = math.Inf(-1), math.Inf(-1), math.Inf(-1)
	for _, k := range wc.Corners {
		wc.VBMin_V, wc.VBMax_V = min(wc.VBMin_V, k.OP.VB_V), max(wc.VBMax_V, k.OP.VB_V)
		wc.VEMin_V, wc.VEMax_V = min(wc.VEMin_V, k.OP.VE_V), max(wc.VEMax_V, k.OP.VE_V)
		wc.VCMin_V, wc.VCMax_V = min(wc.VCMin_V, k.OP.VC_V), max(wc.VCMax_V, k.OP.VC_V)
	}
	return c
}

// outcome runs job.Pick on fakeStock with a search that answers res for
// more than buildable boards and fewer for buildable boards or less, as a
// stock short for the run would.
func outcome(req picker.Request, res picker.Result, buildable int, fewer picker.Result) *job.PickOutcome {
	search := func(_ picker.Stock, r picker.Request) (picker.Result, error) {
		if buildable > 0 && r.Boards <= buildable {
			return fewer, nil
		}
		return res, nil
	}
	o, err := job.Pick(fakeStock(), req, search)
	if err != nil {
		panic(err)
	}
	return o
}

// fakeRequest is the request fakeResult answers.
func fakeRequest() picker.Request {
	return picker.Request{Topology: solver.Divider, Polarity: solver.NPN, VCC_V: 12, VCCTol: 0.05, IC_A: 2e-3,
		AmbientMax_C: 50, Boards: 4, Pairs: true, Top: 5, Seed: 1}
}

// newTestDB makes a stock file under t.TempDir() holding b.
func newTestDB(t *testing.T, b store.Batch) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "stock.db")
	ctx := context.Background()
	db, err := store.Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	if len(b.Resistors)+len(b.Transistors) > 0 {
		if _, err := db.Import(ctx, b, store.ImportOptions{}); err != nil {
			t.Fatal(err)
		}
	}
	return path
}
