package democmd

import (
	"bytes"
	"context"
	"path/filepath"
	"strings"
	"testing"

	"biasbin/store"
)

// TestLoadWall stocks the embedded wall through the import path and checks
// the invented scenario the picks rely on: both polarities, the approved
// list, nearly empty drawers, and PNP drawers too small for a 30-board run.
func TestLoadWall(t *testing.T) {
	ctx := context.Background()
	path := filepath.Join(t.TempDir(), "stock.db")
	var out bytes.Buffer
	if err := load(ctx, &out, path); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(out.String(), "80 resistor lines and 6 transistor lines") {
		t.Errorf("narration %q", out.String())
	}
	db, err := store.Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	rs, err := db.ListResistors(ctx, store.Filter{})
	if err != nil {
		t.Fatal(err)
	}
	approved, err := db.ListResistors(ctx, store.Filter{Tags: []string{"approved"}})
	if err != nil {
		t.Fatal(err)
	}
	ts, err := db.ListTransistors(ctx, store.Filter{})
	if err != nil {
		t.Fatal(err)
	}
	var nearlyEmpty, halfWatt, onePercent, pnpMax int
	for _, r := range rs {
		if r.Qty < 5 {
			nearlyEmpty++
		}
		if r.Rated_W == 0.5 {
			halfWatt++
		}
		if r.Tol == 0.01 {
			onePercent++
		}
	}
	for _, tr := range ts {
		if tr.Polarity == "pnp" {
			pnpMax = max(pnpMax, tr.Qty)
		}
	}
	checks := []struct {
		what      string
		got, want int
	}{
		{"resistor lines", len(rs), 80},
		{"approved resistor lines", len(approved), 20},
		{"nearly empty drawers (under 5)", nearlyEmpty, 5},
		{"1/2 W lines", halfWatt, 5},
		{"1 % lines", onePercent, 26},
		{"transistor lines", len(ts), 6},
		{"largest PNP drawer (must be under 30 boards)", pnpMax, 12},
	}
	for _, c := range checks {
		if c.got != c.want {
			t.Errorf("%s: %d, want %d", c.what, c.got, c.want)
		}
	}
}
