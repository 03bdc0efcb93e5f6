package store

import (
	"context"
	"errors"
	"testing"
)

func TestImportIsAllOrNothing(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	if _, err := db.AddResistor(ctx, r4k7(10, "A")); err != nil {
		t.Fatal(err)
	}
	b := Batch{Resistors: []Resistor{
		r4k7(5, "A"),
		{Ohm: 100, Tol: 0.01, Rated_W: 0.25, Qty: 3, Bin: "B"},
		{Ohm: 220, Tol: 0.01, Rated_W: 0.25, Qty: -2, Bin: "B"}, // bad
		{Ohm: -1, Tol: 0.01, Rated_W: 0.25, Qty: 2, Bin: "B"},   // bad
	}}
	_, err := db.Import(ctx, b, ImportOptions{})
	var ie *InvalidError
	if !errors.As(err, &ie) {
		t.Fatalf("err = %v, want InvalidError", err)
	}
	if len(ie.Problems) != 2 || ie.Problems[0].Index != 2 || ie.Problems[1].Index != 3 {
		t.Fatalf("problems %+v, want items 2 and 3", ie.Problems)
	}
	rs, _ := db.ListResistors(ctx, Filter{})
	if len(rs) != 1 || rs[0].Qty != 10 {
		t.Fatalf("stock changed: %+v", rs)
	}
}

func TestImportMergeReplaceDryRun(t *testing.T) {
	for _, tc := range []struct {
		name       string
		opt        ImportOptions
		batch      []Resistor
		wantQty    int // of the 4K7 line in bin A after import
		wantAdded  int
		wantMerged int
		wantErr    bool
	}{
		{"adds to the stocked line", ImportOptions{}, []Resistor{r4k7(5, "A")}, 15, 0, 1, false},
		{"two rows of one part add up", ImportOptions{}, []Resistor{r4k7(5, "A"), r4k7(7, "A")}, 22, 0, 2, false},
		{"other bin is a new line", ImportOptions{}, []Resistor{r4k7(5, "Z")}, 10, 1, 0, false},
		{"replace sets", ImportOptions{Replace: true}, []Resistor{r4k7(3, "A")}, 3, 0, 1, false},
		{"replace refuses a part twice", ImportOptions{Replace: true}, []Resistor{r4k7(3, "A"), r4k7(4, "A")}, 10, 0, 0, true},
		{"dry run writes nothing", ImportOptions{DryRun: true}, []Resistor{r4k7(5, "A"), r4k7(5, "Z")}, 10, 1, 1, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			db, _ := openTemp(t)
			ctx := context.Background()
			a, err := db.AddResistor(ctx, r4k7(10, "A"))
			if err != nil {
				t.Fatal(err)
			}
			res, err := db.Import(ctx, Batch{Resistors: tc.batch}, tc.opt)
			if (err != nil) != tc.wantErr {
				t.Fatalf("err = %v, wantErr %v", err, tc.wantErr)
			}
			if err == nil && (res.Added != tc.wantAdded || res.Merged != tc.wantMerged) {
				t.Fatalf("result %+v, want added %d merged %d", res, tc.wantAdded, tc.wantMerged)
			}
			r, _ := db.ResistorByID(ctx, a.ID)
			if r.Qty != tc.wantQty {
				t.Fatalf("qty %d, want %d", r.Qty, tc.wantQty)
			}
			if tc.opt.DryRun {
				rs, _ := db.ListResistors(ctx, Filter{})
				if len(rs) != 1 {
					t.Fatalf("dry run left %d lines", len(rs))
				}
			}
		})
	}
}

func TestImportMergeBeyondMaximumRollsBack(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	db.AddResistor(ctx, r4k7(MaxQty, "A"))
	_, err := db.Import(ctx, Batch{Resistors: []Resistor{{Ohm: 10, Tol: 0.01, Rated_W: 0.25, Qty: 1}, r4k7(1, "A")}}, ImportOptions{})
	if !errors.Is(err, ErrInvalid) {
		t.Fatalf("err = %v, want ErrInvalid", err)
	}
	rs, _ := db.ListResistors(ctx, Filter{})
	if len(rs) != 1 || rs[0].Qty != MaxQty {
		t.Fatalf("stock changed: %+v", rs)
	}
}

func TestTagsAndFilters(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	a, _ := db.AddResistor(ctx, Resistor{Ohm: 1000, Tol: 0.01, Rated_W: 0.25, Qty: 1, Bin: "A", Tags: []string{"RoHS", "approved"}})
	b, _ := db.AddResistor(ctx, Resistor{Ohm: 100, Tol: 0.01, Rated_W: 0.25, Qty: 1, Bin: "B", Tags: []string{"rohs"}})
	q, _ := db.AddTransistor(ctx, bc547(1, "A"))
	if tags, err := db.Tag(ctx, q.ID, "Approved", "reel", "reel"); err != nil || len(tags) != 2 {
		t.Fatalf("tag: %v %v", tags, err)
	}
	if tags, err := db.Untag(ctx, q.ID, "reel", "never-had"); err != nil || len(tags) != 1 || tags[0] != "approved" {
		t.Fatalf("untag: %v %v", tags, err)
	}
	if _, err := db.Tag(ctx, q.ID, "two words"); !errors.Is(err, ErrInvalid) {
		t.Fatalf("bad tag: %v", err)
	}
	if _, err := db.Tag(ctx, 999, "x"); !errors.Is(err, ErrNotFound) {
		t.Fatalf("tag missing part: %v", err)
	}
	for _, tc := range []struct {
		name   string
		f      Filter
		wantR  []int64
		wantQs int
	}{
		{"all, sorted by value", Filter{}, []int64{b.ID, a.ID}, 1},
		{"bin A", Filter{Bin: "A"}, []int64{a.ID}, 1},
		{"tag rohs", Filter{Tags: []string{"ROHS"}}, []int64{b.ID, a.ID}, 0},
		{"tags rohs and approved", Filter{Tags: []string{"rohs", "approved"}}, []int64{a.ID}, 0},
		{"tag approved", Filter{Tags: []string{"approved"}}, []int64{a.ID}, 1},
		{"no match", Filter{Bin: "nowhere"}, nil, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			rs, err := db.ListResistors(ctx, tc.f)
			if err != nil {
				t.Fatal(err)
			}
			var ids []int64
			for _, r := range rs {
				ids = append(ids, r.ID)
			}
			if len(ids) != len(tc.wantR) {
				t.Fatalf("resistors %v, want %v", ids, tc.wantR)
			}
			for i := range ids {
				if ids[i] != tc.wantR[i] {
					t.Fatalf("resistors %v, want %v", ids, tc.wantR)
				}
			}
			ts, err := db.ListTransistors(ctx, tc.f)
			if err != nil || len(ts) != tc.wantQs {
				t.Fatalf("transistors %v %v, want %d", ts, err, tc.wantQs)
			}
		})
	}
}
