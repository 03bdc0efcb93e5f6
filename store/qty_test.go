package store

import (
	"context"
	"errors"
	"testing"
)

func TestAdjustNeverOversells(t *testing.T) {
	for _, tc := range []struct {
		name    string
		start   int
		delta   int
		set     bool
		want    int
		wantErr error
	}{
		{"put in", 10, 5, false, 15, nil},
		{"take some", 10, -4, false, 6, nil},
		{"take all", 10, -10, false, 0, nil},
		{"take one too many", 10, -11, false, 10, ErrBelowZero},
		{"count", 10, 37, true, 37, nil},
		{"count zero", 10, 0, true, 0, nil},
		{"count negative", 10, -1, true, 10, ErrBelowZero},
		{"beyond the maximum", 10, MaxQty, false, 10, ErrInvalid},
	} {
		t.Run(tc.name, func(t *testing.T) {
			db, _ := openTemp(t)
			ctx := context.Background()
			a, err := db.AddResistor(ctx, r4k7(tc.start, "A"))
			if err != nil {
				t.Fatal(err)
			}
			var got int
			if tc.set {
				got, err = db.SetQty(ctx, a.ID, tc.delta)
			} else {
				got, err = db.Adjust(ctx, a.ID, tc.delta)
			}
			if !errors.Is(err, tc.wantErr) || (tc.wantErr != nil) != (err != nil) {
				t.Fatalf("err = %v, want %v", err, tc.wantErr)
			}
			r, _ := db.ResistorByID(ctx, a.ID)
			if r.Qty != tc.want {
				t.Fatalf("stock %d, want %d", r.Qty, tc.want)
			}
			if err == nil && got != tc.want {
				t.Fatalf("returned %d, want %d", got, tc.want)
			}
		})
	}
}

func TestRemoveTakesTagsToo(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	a, _ := db.AddResistor(ctx, Resistor{Ohm: 10, Tol: 0.01, Rated_W: 0.25, Qty: 1, Tags: []string{"rohs"}})
	if err := db.Remove(ctx, a.ID); err != nil {
		t.Fatal(err)
	}
	var n int
	db.x.Get(&n, `SELECT count(*) FROM part_tags`)
	if n != 0 {
		t.Fatalf("%d tags left", n)
	}
	if _, err := db.KindOf(ctx, a.ID); !errors.Is(err, ErrNotFound) {
		t.Fatalf("removed part: %v", err)
	}
}
