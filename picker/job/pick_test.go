package job

import (
	"fmt"
	"testing"

	"biasbin/picker"
	"biasbin/solver"
)

// The stock and builds here are invented: the tests check how the pick is
// assembled (searches, counts, pull lines), not any computation.

// tinyStock holds one resistor line and one NPN line.
func tinyStock() picker.Stock {
	return picker.Stock{
		Resistors:   []picker.Resistor{{ID: 1, Ohm: 10e3, Tol: 0.05, Rated_W: 0.25, Qty: 50, Bin: "A1"}},
		Transistors: []picker.Transistor{{ID: 2, Qty: 12, Bin: "D1", Sheet: solver.Datasheet{Label: "QX-1", Polarity: solver.NPN, HFEMin: 100, HFEMax: 300}}},
	}
}

// tinyBuild draws every divider position from line 1 and the transistor
// from line 2.
func tinyBuild(id string) picker.Candidate {
	st := tinyStock()
	pos := picker.Position{Ohm: 10e3, Arrangement: "single", Parts: []picker.Part{{ID: 1, Ohm: 10e3, Bin: "A1"}}}
	return picker.Candidate{ID: id, Rank: 1, Transistor: st.Transistors[0], OnTarget: true,
		Positions: map[string]picker.Position{"r1": pos, "r2": pos, "rc": pos, "re": pos}}
}

// TestFewerBoards: when the run is too large for the stock, Pick finds the
// most boards the stock builds with a binary search (fewer boards only
// loosen the quantity limits) and shows that search's builds.
func TestFewerBoards(t *testing.T) {
	tests := []struct {
		boards, limit int // the fake stock builds up to limit boards
		want          int
		maxSearches   int // the search as asked, then the binary search
	}{
		{30, 12, 12, 7}, // as asked, one board, then log2(29) rounded up
		{30, 29, 29, 7},
		{30, 1, 1, 7},
		{30, 0, 0, 2}, // not even one board: a single search settles it
		{2, 1, 1, 2},
	}
	for _, tt := range tests {
		searches := 0
		search := func(_ picker.Stock, r picker.Request) (picker.Result, error) {
			searches++
			if r.Boards > tt.limit {
				return picker.Result{}, nil
			}
			return picker.Result{Candidates: []picker.Candidate{tinyBuild(fmt.Sprint(r.Boards))}}, nil
		}
		o, err := Pick(tinyStock(), picker.Request{Polarity: solver.NPN, VCC_V: 12, IC_A: 1e-3, Boards: tt.boards}, search)
		if err != nil {
			t.Fatal(err)
		}
		if o.Fits || o.Buildable != tt.want || o.Short() != (tt.want > 0) {
			t.Errorf("%d boards, stock for %d: fits %v, found %d", tt.boards, tt.limit, o.Fits, o.Buildable)
		}
		if tt.want > 0 && (len(o.Builds) != 1 || o.Builds[0].ID != fmt.Sprint(tt.want)) {
			t.Errorf("%d boards, stock for %d: builds shown are not the search for %d boards: %+v", tt.boards, tt.limit, tt.want, o.Builds)
		}
		if searches > tt.maxSearches {
			t.Errorf("%d boards: %d searches, want at most %d", tt.boards, searches, tt.maxSearches)
		}
	}
}

// TestPullList: a line feeding several positions is taken once per
// position and board; the transistor comes last; a line short for the run
// is listed in TopUp with what it lacks.
func TestPullList(t *testing.T) {
	search := func(_ picker.Stock, r picker.Request) (picker.Result, error) {
		if r.Boards > 12 {
			return picker.Result{}, nil
		}
		return picker.Result{Candidates: []picker.Candidate{tinyBuild("b")}}, nil
	}
	o, err := Pick(tinyStock(), picker.Request{Polarity: solver.NPN, VCC_V: 12, IC_A: 1e-3, Boards: 20}, search)
	if err != nil {
		t.Fatal(err)
	}
	if len(o.Builds) != 1 {
		t.Fatalf("builds %+v", o.Builds)
	}
	want := []PullLine{
		{ID: 1, Kind: Resistor, Ohm: 10e3, Bin: "A1", Qty: 80, OnHand: 50}, // four positions × 20 boards
		{ID: 2, Kind: Transistor, Label: "QX-1", Bin: "D1", Qty: 20, OnHand: 12},
	}
	got := o.Builds[0].Pull
	if len(got) != len(want) || got[0] != want[0] || got[1] != want[1] {
		t.Errorf("pull list %+v, want %+v", got, want)
	}
	if len(o.TopUp) != 2 || o.TopUp[0].ID != 1 || o.TopUp[0].Missing() != 30 || o.TopUp[1].Missing() != 8 {
		t.Errorf("top-up %+v, want line 1 short by 30, then line 2 by 8", o.TopUp)
	}
}
