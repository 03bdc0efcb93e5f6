package store

import (
	"context"
	"errors"

	"github.com/jmoiron/sqlx"
	_ "modernc.org/sqlite" // database/sql driver "sqlite"
)

// TEMPORARY CONTRACT FILE. The helper implementing the store replaces it.
// Signatures here are the agreed API; bodies land in their own files.

// DB is an open stock database.
type DB struct{ x *sqlx.DB }

// Open opens (creating if needed, and migrating) the stock database at path.
func Open(ctx context.Context, path string) (*DB, error) { panic("store: Open not implemented yet") }

// Close closes the database.
func (db *DB) Close() error { return nil }

var errTODO = errors.New("store: not implemented yet")

// ListResistors returns the resistor lines matching f, sorted by value,
// tolerance, power, technology, bin.
func (db *DB) ListResistors(ctx context.Context, f Filter) ([]Resistor, error) { return nil, errTODO }

// ListTransistors returns the transistor lines matching f, sorted by label, bin.
func (db *DB) ListTransistors(ctx context.Context, f Filter) ([]Transistor, error) {
	return nil, errTODO
}

// TransistorByLabel returns the stock line with that label (the lowest ID
// when several bins hold it); ErrNotFound when none.
func (db *DB) TransistorByLabel(ctx context.Context, label string) (Transistor, error) {
	return Transistor{}, errTODO
}
