package picture

import (
	"math"
	"testing"
)

// TestHistogramCounts checks the IC histogram against the Monte Carlo run
// it counts: every board's IC at both ambient ends falls in exactly one
// bin, the bins are contiguous and equal, the window is the yield window
// and the band is the worst case's IC extremes over the corners.
func TestHistogramCounts(t *testing.T) {
	s := subjectOf(t, dividerFixture(), 500)
	h, err := Histogram(s)
	if err != nil {
		t.Fatal(err)
	}
	if len(h.Bins) != HistogramBins || h.Points != 1000 || h.Boards != 500 || h.Passed != s.Yield.Pass {
		t.Fatalf("%d bins, %d points of %d boards, %d pass; want %d bins, 1000 points, 500 boards, %d pass", len(h.Bins), h.Points, h.Boards, h.Passed, HistogramBins, s.Yield.Pass)
	}
	var cold, hot int
	for i, b := range h.Bins {
		cold, hot = cold+b.Cold, hot+b.Hot
		if b.Between != 0 {
			t.Errorf("bin %d: %d points between the ambient ends, want none", i, b.Between)
		}
		if i > 0 && b.ICMin_A != h.Bins[i-1].ICMax_A {
			t.Errorf("bin %d starts at %g A, the previous ends at %g A", i, b.ICMin_A, h.Bins[i-1].ICMax_A)
		}
	}
	if cold != 500 || hot != 500 {
		t.Errorf("%d cold and %d hot points counted, want 500 each", cold, hot)
	}
	for _, board := range s.Yield.Samples {
		for j, p := range board.Points {
			n := 0
			for _, b := range h.Bins {
				if p.IC_A >= b.ICMin_A && (p.IC_A < b.ICMax_A || b == h.Bins[len(h.Bins)-1] && p.IC_A <= b.ICMax_A) {
					n++
				}
			}
			if n != 1 {
				t.Errorf("board point %d at %g A falls in %d bins", j, p.IC_A, n)
			}
		}
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, k := range s.Corners {
		lo, hi = math.Min(lo, k.OP.IC_A), math.Max(hi, k.OP.IC_A)
	}
	if !h.HasWorst || h.WorstICMin_A != lo || h.WorstICMax_A != hi {
		t.Errorf("worst-case band %g..%g A, corners span %g..%g A", h.WorstICMin_A, h.WorstICMax_A, lo, hi)
	}
	if h.WindowICMin_A != s.Window.ICMin_A || h.WindowICMax_A != s.Window.ICMax_A || h.Nominal_A != s.Nominal.IC_A {
		t.Errorf("window %g..%g A, nominal %g A; want %g..%g A, %g A", h.WindowICMin_A, h.WindowICMax_A, h.Nominal_A, s.Window.ICMin_A, s.Window.ICMax_A, s.Nominal.IC_A)
	}
	s.Yield = nil
	if _, err := Histogram(s); err == nil {
		t.Error("a histogram without Monte Carlo boards, want an error")
	}
}
