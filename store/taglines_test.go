package store

import (
	"context"
	"errors"
	"slices"
	"strings"
	"testing"
)

// TestTagLinesAllOrNone: tagging several lines changes all of them, and a
// missing line among them changes none; a tag of only digits (which reads
// as a line ID, `stock tag 5 approved 6 7`) is refused.
func TestTagLinesAllOrNone(t *testing.T) {
	ctx := context.Background()
	db, _ := openTemp(t)
	a, err := db.AddResistor(ctx, r4k7(5, "A1"))
	if err != nil {
		t.Fatal(err)
	}
	b, err := db.AddTransistor(ctx, bc547(5, "B1"))
	if err != nil {
		t.Fatal(err)
	}
	got, err := db.TagLines(ctx, []int64{a.ID, b.ID}, "Approved")
	if err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(got[0], []string{"approved"}) || !slices.Equal(got[1], []string{"approved"}) {
		t.Fatalf("tags %v", got)
	}
	if _, err := db.TagLines(ctx, []int64{a.ID, 999}, "rohs"); !errors.Is(err, ErrNotFound) {
		t.Fatalf("missing line: %v", err)
	}
	if r, _ := db.ResistorByID(ctx, a.ID); slices.Contains(r.Tags, "rohs") {
		t.Fatal("line tagged although another line of the same call was missing")
	}
	_, err = db.TagLines(ctx, []int64{a.ID}, "approved", "6")
	if !errors.Is(err, ErrInvalid) || !strings.Contains(err.Error(), "only digits") {
		t.Fatalf("all-digit tag: %v", err)
	}
}
