package store

import (
	"context"

	"github.com/jmoiron/sqlx"
	_ "modernc.org/sqlite" // database/sql driver "sqlite"
)

// TEMPORARY CONTRACT FILE. The helper implementing the store replaces it.

// DB is an open stock database.
type DB struct{ x *sqlx.DB }

// Open opens (creating if needed, and migrating) the stock database at path.
func Open(ctx context.Context, path string) (*DB, error) { panic("store: Open not implemented yet") }

// Close closes the database.
func (db *DB) Close() error { return nil }
