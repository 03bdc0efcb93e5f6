package job

import (
	"testing"

	"biasbin/picker"
	"biasbin/solver"
)

// TestCandidateRequest: analysing a picked build with CandidateRequest
// reproduces the pick's own figures for it — the same nominal point, the
// same window and the same boards passing (the yield's definition,
// REFERENCE.md §9, applied to the same draws) — so a picture of a picked
// build tells what the pick told. The stock is invented.
func TestCandidateRequest(t *testing.T) {
	var st picker.Stock
	for i, ohm := range []float64{1e3, 1.5e3, 2.2e3, 3.3e3, 4.7e3, 6.8e3, 10e3, 15e3, 22e3, 33e3, 47e3, 68e3} {
		st.Resistors = append(st.Resistors, picker.Resistor{ID: int64(i + 1), Ohm: ohm, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: 0.25, Qty: 20, Bin: "A"})
	}
	st.Transistors = []picker.Transistor{{ID: 100, Qty: 20, Bin: "T", Sheet: solver.Datasheet{Label: "QX-1", Polarity: solver.NPN,
		HFEMin: 100, HFEMax: 300, VBEOn_V: 0.65, VBEAt_A: 1e-3, VCESat_V: 0.2, VCEO_V: 40, ThetaJA_KPerW: 200, TjMax_C: 150}}}
	res, err := picker.Pick(st, picker.Request{Polarity: solver.NPN, VCC_V: 12, VCCTol: 0.05, IC_A: 2e-3, Top: 2, Seed: 3,
		Window: picker.WindowRule{IC: picker.Band{Min: 1.9e-3, Max: 2.1e-3}, VCE: picker.Band{Min: 1, Max: 11}}}) // a narrow IC band: some boards fail
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Candidates) == 0 {
		t.Fatal("no build picked")
	}
	for _, c := range res.Candidates {
		req := CandidateRequest(c)
		req.KeepBoards = true
		a, err := Check(req)
		if err != nil {
			t.Fatal(err)
		}
		if c.Yield.Pass == 0 || c.Yield.Pass == c.Yield.Boards {
			t.Errorf("build %s: %d of %d pass; the test wants a window some boards miss", c.ID, c.Yield.Pass, c.Yield.Boards)
		}
		if a.Yield == nil || a.Yield.Boards != c.Yield.Boards || a.Yield.Pass != c.Yield.Pass || len(a.Yield.Samples) != c.Yield.Boards {
			t.Errorf("build %s: analysis yield %+v, the pick had %d of %d", c.ID, a.Yield, c.Yield.Pass, c.Yield.Boards)
		}
		if a.Window != c.Window || c.Window.Window != (solver.Window{ICMin_A: 1.9e-3, ICMax_A: 2.1e-3, VCEMin_V: 1, VCEMax_V: 11}) {
			t.Errorf("build %s: window %+v, the pick's %+v", c.ID, a.Window, c.Window)
		}
		if a.Nominal.IC_A != c.Nominal.IC_A || a.Nominal.VCE_V != c.Nominal.VCE_V || req.Label != "QX-1" {
			t.Errorf("build %s: nominal %g A, %g V; the pick's %g A, %g V", c.ID, a.Nominal.IC_A, a.Nominal.VCE_V, c.Nominal.IC_A, c.Nominal.VCE_V)
		}
	}
}
