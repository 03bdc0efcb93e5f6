package picker

import (
	"math/rand/v2"
	"testing"

	"biasbin/solver"
	"biasbin/solver/eseries"
)

// seriesStock returns one line per value of series s in [lo, hi] ohms,
// IDs from firstID, with tolerance tol, rating ratedW and qty parts each.
func seriesStock(s eseries.Series, lo, hi, tol, ratedW float64, qty int, firstID int64) []Resistor {
	var out []Resistor
	for i, v := range eseries.Range(s, lo, hi) {
		out = append(out, Resistor{ID: firstID + int64(i), Ohm: v, Tol: tol, TCR_PPMPerK: 100, Rated_W: ratedW, Qty: qty, Bin: "B"})
	}
	return out
}

// smallNPN is an invented small-signal NPN line with realistic datasheet
// ranges (common practice for a TO-92 general-purpose part).
func smallNPN(id int64, hmin, hmax float64) Transistor {
	return Transistor{ID: id, Qty: 50, Bin: "T", Sheet: solver.Datasheet{
		Label: "QN-" + string(rune('A'+id%26)), Polarity: solver.NPN,
		HFEMin: hmin, HFEMax: hmax, VBEOn_V: 0.65, VBEAt_A: 1e-3, VCESat_V: 0.2,
		VCEO_V: 45, ICMax_A: 0.1, PD25_W: 0.5, TjMax_C: 150, VAF_V: 100,
	}}
}

// smallPNP mirrors smallNPN.
func smallPNP(id int64, hmin, hmax float64) Transistor {
	t := smallNPN(id, hmin, hmax)
	t.Sheet.Polarity = solver.PNP
	t.Sheet.Label = "QP-" + string(rune('A'+id%26))
	return t
}

// randomStock draws a small random stock: nVals E12/E24 values spread over
// 100 Ω..100 kΩ with random tolerance, rating and quantity, and nT NPN
// lines with random hFE ranges.
func randomStock(rng *rand.Rand, nVals, nT int) Stock {
	all := eseries.Range(eseries.E24, 100, 100e3)
	var st Stock
	for i := range nVals {
		v := all[rng.IntN(len(all))]
		tol := []float64{0.01, 0.05}[rng.IntN(2)]
		w := []float64{0.25, 0.5, 0.01}[rng.IntN(3)] // 10 mW parts make some builds fail
		st.Resistors = append(st.Resistors, Resistor{ID: int64(100 + i), Ohm: v, Tol: tol, TCR_PPMPerK: float64(rng.IntN(3)) * 100,
			Rated_W: w, Qty: 1 + rng.IntN(6), Bin: "R"})
	}
	for i := range nT {
		hmin := 50 + float64(rng.IntN(100))
		st.Transistors = append(st.Transistors, smallNPN(int64(1+i), hmin, hmin*(2+rng.Float64()*2)))
	}
	return st
}

// newTestEvaluator is the evaluator a Pick of req on st would search with
// (req normalized, its topology's defaults filled in); bad input fails tb.
func newTestEvaluator(tb testing.TB, st Stock, req Request) *evaluator {
	tb.Helper()
	s, err := normalize(req)
	if err != nil {
		tb.Fatal(err)
	}
	e, _ := newEvaluator(s, st, s.topo)
	return e
}
