package store

import (
	"context"
	"fmt"

	"github.com/jmoiron/sqlx"

	"biasbin/migrations"
)

// Verify runs SQLite's integrity and foreign-key checks and the stock's own
// consistency checks (every line has exactly its kind's detail row, its
// identity matches its values, its values pass Validate, every quantity is
// what the ledger sums to, every recorded schema step is known). It returns the problems found; none means clean.
func (db *DB) Verify(ctx context.Context) ([]string, error) {
	var problems []string
	err := db.read(ctx, func(tx *sqlx.Tx) error {
		problems = nil
		var integrity []string
		if err := tx.SelectContext(ctx, &integrity, `PRAGMA integrity_check`); err != nil {
			return fmt.Errorf("integrity check: %w", err)
		}
		for _, s := range integrity {
			if s != "ok" {
				problems = append(problems, "integrity: "+s)
			}
		}
		rows, err := tx.QueryxContext(ctx, `PRAGMA foreign_key_check`)
		if err != nil {
			return fmt.Errorf("foreign key check: %w", err)
		}
		for rows.Next() {
			v, err := rows.SliceScan()
			if err != nil {
				rows.Close()
				return err
			}
			problems = append(problems, fmt.Sprintf("foreign key: %v", v))
		}
		rows.Close()
		var orphans []string
		if err := tx.SelectContext(ctx, &orphans, `SELECT 'part ' || p.id || ' (' || p.kind || ') has no detail row'
			FROM parts p
			WHERE (p.kind = 'resistor' AND NOT EXISTS (SELECT 1 FROM resistors r WHERE r.part_id = p.id))
			   OR (p.kind = 'transistor' AND NOT EXISTS (SELECT 1 FROM transistors t WHERE t.part_id = p.id))
			   OR (EXISTS (SELECT 1 FROM resistors r WHERE r.part_id = p.id)
			       AND EXISTS (SELECT 1 FROM transistors t WHERE t.part_id = p.id))
			ORDER BY p.id`); err != nil {
			return fmt.Errorf("detail rows: %w", err)
		}
		problems = append(problems, orphans...)
		ledger, err := ledgerProblems(ctx, tx)
		if err != nil {
			return err
		}
		problems = append(problems, ledger...)
		var rs []resistorRow
		if err := tx.SelectContext(ctx, &rs, resistorSelect+` ORDER BY p.id`); err != nil {
			return fmt.Errorf("read resistors: %w", err)
		}
		for _, r := range rs {
			p := r.part()
			if p.ident() != r.Ident {
				problems = append(problems, fmt.Sprintf("part %d: identity %q does not match its values %q", r.ID, r.Ident, p.ident()))
			}
			for _, v := range p.Validate() {
				problems = append(problems, fmt.Sprintf("part %d: %s", r.ID, v))
			}
		}
		var ts []transistorRow
		if err := tx.SelectContext(ctx, &ts, transistorSelect+` ORDER BY p.id`); err != nil {
			return fmt.Errorf("read transistors: %w", err)
		}
		for _, t := range ts {
			p := t.part()
			if p.ident() != t.Ident {
				problems = append(problems, fmt.Sprintf("part %d: identity %q does not match its label %q", t.ID, t.Ident, p.ident()))
			}
			for _, v := range p.Validate() {
				problems = append(problems, fmt.Sprintf("part %d: %s", t.ID, v))
			}
		}
		names, err := migrationFiles(migrations.FS)
		if err != nil {
			return err
		}
		var applied []string
		if err := tx.SelectContext(ctx, &applied, `SELECT name FROM schema_migrations ORDER BY name`); err != nil {
			return fmt.Errorf("read schema steps: %w", err)
		}
		known := map[string]bool{}
		for _, n := range names {
			known[n] = true
		}
		for _, a := range applied {
			if !known[a] {
				problems = append(problems, "unknown schema step "+a)
			}
			delete(known, a)
		}
		for n := range known {
			problems = append(problems, "schema step "+n+" not applied")
		}
		return nil
	})
	if err != nil {
		return nil, fmt.Errorf("verify: %w", err)
	}
	return problems, nil
}
