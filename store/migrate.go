package store

import (
	"context"
	"fmt"
	"io/fs"
	"path"
	"regexp"
	"sort"
	"strings"

	"github.com/jmoiron/sqlx"
)

// migrationName is the form of a migration file: four digits, an
// underscore, a lower-case name, ".sql".
var migrationName = regexp.MustCompile(`^[0-9]{4}_[a-z0-9_]+\.sql$`)

// migrationFiles returns the names of the migration files in fsys, sorted.
func migrationFiles(fsys fs.FS) ([]string, error) {
	entries, err := fs.ReadDir(fsys, ".")
	if err != nil {
		return nil, fmt.Errorf("read migrations: %w", err)
	}
	var names []string
	for _, e := range entries {
		if e.IsDir() || path.Ext(e.Name()) != ".sql" {
			continue
		}
		if !migrationName.MatchString(e.Name()) {
			return nil, fmt.Errorf("migration %s: name is not NNNN_name.sql", e.Name())
		}
		names = append(names, e.Name())
	}
	sort.Strings(names)
	return names, nil
}

// migrate applies the migrations in fsys that the database has not seen,
// each in its own transaction, recording each name in schema_migrations.
// A database that records a migration fsys does not have was written by a
// newer program: it is refused with ErrNewerSchema before anything is
// written.
func migrate(ctx context.Context, x *sqlx.DB, fsys fs.FS) error {
	names, err := migrationFiles(fsys)
	if err != nil {
		return err
	}
	known := make(map[string]bool, len(names))
	for _, n := range names {
		known[n] = true
	}
	applied, err := appliedMigrations(ctx, x)
	if err != nil {
		return err
	}
	var unknown []string
	for n := range applied {
		if !known[n] {
			unknown = append(unknown, n)
		}
	}
	if len(unknown) > 0 {
		sort.Strings(unknown)
		return fmt.Errorf("%w (schema steps %s are unknown to this version); "+
			"use the newer biasbin, the file was not changed", ErrNewerSchema, strings.Join(unknown, ", "))
	}
	for _, n := range names {
		if applied[n] {
			continue
		}
		body, err := fs.ReadFile(fsys, n)
		if err != nil {
			return fmt.Errorf("read migration %s: %w", n, err)
		}
		if err := applyMigration(ctx, x, n, string(body)); err != nil {
			return err
		}
	}
	return nil
}

// appliedMigrations reads the recorded migration names without writing:
// a fresh file has no schema_migrations table yet.
func appliedMigrations(ctx context.Context, x *sqlx.DB) (map[string]bool, error) {
	applied := map[string]bool{}
	err := retry(ctx, func() error {
		var n int
		if err := x.GetContext(ctx, &n,
			`SELECT count(*) FROM sqlite_master WHERE type = 'table' AND name = 'schema_migrations'`); err != nil {
			return err
		}
		if n == 0 {
			return nil
		}
		var names []string
		if err := x.SelectContext(ctx, &names, `SELECT name FROM schema_migrations`); err != nil {
			return err
		}
		for _, s := range names {
			applied[s] = true
		}
		return nil
	})
	if err != nil {
		return nil, fmt.Errorf("read schema version: %w", err)
	}
	return applied, nil
}

// applyMigration runs one migration and records it in the same IMMEDIATE
// transaction. Another process may have applied it meanwhile; then it is
// skipped.
func applyMigration(ctx context.Context, x *sqlx.DB, name, body string) error {
	return retry(ctx, func() error {
		tx, err := x.BeginTxx(ctx, nil)
		if err != nil {
			return fmt.Errorf("migration %s: begin: %w", name, err)
		}
		defer tx.Rollback()
		if _, err := tx.ExecContext(ctx, `CREATE TABLE IF NOT EXISTS schema_migrations (
			name       TEXT PRIMARY KEY,
			applied_at TEXT NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%SZ', 'now'))
		)`); err != nil {
			return fmt.Errorf("migration %s: record table: %w", name, err)
		}
		var done int
		if err := tx.GetContext(ctx, &done, `SELECT count(*) FROM schema_migrations WHERE name = ?`, name); err != nil {
			return fmt.Errorf("migration %s: %w", name, err)
		}
		if done > 0 {
			return nil
		}
		if _, err := tx.ExecContext(ctx, body); err != nil {
			return fmt.Errorf("migration %s: %w", name, err)
		}
		if _, err := tx.ExecContext(ctx, `INSERT INTO schema_migrations (name) VALUES (?)`, name); err != nil {
			return fmt.Errorf("migration %s: record: %w", name, err)
		}
		if err := tx.Commit(); err != nil {
			return fmt.Errorf("migration %s: commit: %w", name, err)
		}
		return nil
	})
}
