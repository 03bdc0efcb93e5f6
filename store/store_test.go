package store

import (
	"context"
	"path/filepath"
	"testing"
)

// openTemp opens a fresh stock file under t.TempDir().
func openTemp(t testing.TB) (*DB, string) {
	t.Helper()
	path := filepath.Join(t.TempDir(), "stock.db")
	db, err := Open(context.Background(), path)
	if err != nil {
		t.Fatalf("Open: %v", err)
	}
	t.Cleanup(func() { db.Close() })
	return db, path
}

// r4k7 is a plain resistor line used across tests.
func r4k7(qty int, bin string) Resistor {
	return Resistor{Ohm: 4700, Tol: 0.05, Rated_W: 0.25, Tech: TechMetalFilm, Qty: qty, Bin: bin}
}

// bc547 is a plain transistor line used across tests (invented values).
func bc547(qty int, bin string) Transistor {
	return Transistor{Label: "Q-TEST", Polarity: "npn", HFEMin: 110, HFEMax: 800, Qty: qty, Bin: bin}
}
