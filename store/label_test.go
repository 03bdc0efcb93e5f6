package store

import (
	"context"
	"errors"
	"fmt"
	"strings"
	"testing"
)

// TestTransistorByLabel: labels match without regard to ASCII case; one
// spelling in several bins gives the lowest ID; two spellings give an
// *AmbiguousLabelError listing every matching line.
func TestTransistorByLabel(t *testing.T) {
	type line struct{ label, bin string }
	for _, tc := range []struct {
		name   string
		stock  []line
		ask    string
		want   int   // index into stock of the line found, -1 for an error
		listed []int // with an ambiguity, the lines the error lists
		err    error
	}{
		{"exact", []line{{"QN-230", "A"}, {"QP-12", "B"}}, "QN-230", 0, nil, nil},
		{"lower case finds upper", []line{{"QP-12", "B"}, {"QN-230", "A"}}, "qn-230", 1, nil, nil},
		{"mixed case and spaces", []line{{"qn-230", "A"}}, "  Qn-230 ", 0, nil, nil},
		{"one spelling in two bins: lowest ID", []line{{"QN-230", "B"}, {"QN-230", "A"}}, "qn-230", 0, nil, nil},
		{"two spellings", []line{{"QN-230", "A"}, {"QP-12", "A"}, {"qn-230", "B"}}, "qn-230", -1, []int{0, 2}, ErrAmbiguousLabel},
		{"two spellings, exact asked", []line{{"QN-230", "A"}, {"Qn-230", "C"}}, "QN-230", -1, []int{0, 1}, ErrAmbiguousLabel},
		{"no ASCII fold beyond case", []line{{"QN-230", "A"}}, "QN_230", -1, nil, ErrNotFound},
		{"not stocked", []line{{"QN-230", "A"}}, "QN-23", -1, nil, ErrNotFound},
	} {
		t.Run(tc.name, func(t *testing.T) {
			db, _ := openTemp(t)
			ctx := context.Background()
			ids := make([]int64, len(tc.stock))
			for i, l := range tc.stock {
				q := bc547(i+1, l.bin)
				q.Label = l.label
				res, err := db.AddTransistor(ctx, q)
				if err != nil || res.Merged {
					t.Fatalf("stock %v: %+v %v", l, res, err)
				}
				ids[i] = res.ID
			}
			got, err := db.TransistorByLabel(ctx, tc.ask)
			if tc.want >= 0 {
				w := tc.stock[tc.want]
				if err != nil || got.ID != ids[tc.want] || got.Label != w.label || got.Bin != w.bin || got.Qty != tc.want+1 {
					t.Fatalf("got %+v %v, want line %d (%s in %s)", got, err, ids[tc.want], w.label, w.bin)
				}
				return
			}
			if !errors.Is(err, tc.err) {
				t.Fatalf("got %+v %v, want %v", got, err, tc.err)
			}
			var amb *AmbiguousLabelError
			if errors.As(err, &amb) != (tc.listed != nil) {
				t.Fatalf("error %T %v: ambiguity expected %v", err, err, tc.listed != nil)
			}
			if amb == nil {
				return
			}
			if len(amb.Lines) != len(tc.listed) {
				t.Fatalf("lines %+v, want %d", amb.Lines, len(tc.listed))
			}
			for i, k := range tc.listed {
				l := amb.Lines[i]
				if l.ID != ids[k] || l.Label != tc.stock[k].label || l.Bin != tc.stock[k].bin {
					t.Errorf("line %d: %+v, want ID %d %s in %s", i, l, ids[k], tc.stock[k].label, tc.stock[k].bin)
				}
				for _, s := range []string{tc.stock[k].label, "bin " + tc.stock[k].bin, fmt.Sprintf("ID %d", ids[k])} {
					if !strings.Contains(err.Error(), s) {
						t.Errorf("message %q lacks %q", err, s)
					}
				}
			}
		})
	}
}

// TestAddJoinsOtherLetterCase: a transistor added (or imported) under a
// label that differs from a stocked line in the same bin only by letter
// case is the same part: its quantity joins that line, under the stocked
// spelling; in another bin it is a line of its own.
func TestAddJoinsOtherLetterCase(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	first := bc547(5, "A")
	first.Label = "QN-230"
	res, err := db.AddTransistor(ctx, first)
	if err != nil {
		t.Fatal(err)
	}
	same := bc547(3, "A")
	same.Label = "qn-230"
	again, err := db.AddTransistor(ctx, same)
	if err != nil || !again.Merged || again.ID != res.ID {
		t.Fatalf("add qn-230 to bin A: %+v %v, want it merged into line %d", again, err, res.ID)
	}
	other := bc547(2, "B")
	other.Label = "Qn-230"
	elsewhere, err := db.AddTransistor(ctx, other)
	if err != nil || elsewhere.Merged {
		t.Fatalf("add Qn-230 to bin B: %+v %v, want a new line", elsewhere, err)
	}
	lines, err := db.ListTransistors(ctx, Filter{})
	if err != nil {
		t.Fatal(err)
	}
	got := map[string]string{}
	for _, l := range lines {
		got[l.Bin] = fmt.Sprintf("%s %d", l.Label, l.Qty)
	}
	if got["A"] != "QN-230 8" || got["B"] != "Qn-230 2" || len(lines) != 2 {
		t.Fatalf("stock %v, want A: QN-230 8 and B: Qn-230 2", got)
	}
	if problems, err := db.Verify(ctx); err != nil || len(problems) > 0 {
		t.Fatalf("verify: %v %v", problems, err)
	}
}
