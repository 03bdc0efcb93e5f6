package report

import (
	"testing"

	"biasbin/picker"
	"biasbin/solver"
)

// TestRejectionQty: a transistor line too short for the run says what it
// holds and what the run needs, one transistor per board (a single-stage
// build has one transistor, common practice).
func TestRejectionQty(t *testing.T) {
	line := picker.Transistor{ID: 12, Bin: "T2", Sheet: solver.Datasheet{Label: "QP-104B"}}
	tests := []struct {
		qty, boards int
		want        string
	}{
		{2, 5, "QP-104B (line 12, bin T2): only 2 in stock; 5 boards need one each"},
		{0, 1, "QP-104B (line 12, bin T2): none in stock; the board needs one"},
	}
	for _, tt := range tests {
		line.Qty = tt.qty
		got := Rejection(picker.Rejection{Kind: picker.RejectQty, Line: line, Qty: tt.qty, Boards: tt.boards})
		if got != tt.want {
			t.Errorf("%d in stock for %d boards: %q, want %q", tt.qty, tt.boards, got, tt.want)
		}
	}
}
