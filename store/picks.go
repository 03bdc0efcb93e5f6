package store

import (
	"context"
	"database/sql"
	"errors"
	"fmt"
	"time"

	"github.com/jmoiron/sqlx"
)

// PickKeep is how long a pick's results stay in the stock file so that
// their build IDs can be built later; a pick older than this is deleted
// when the next pick is kept.
const PickKeep = PickKeepDays * 24 * time.Hour

// PickKeepDays is PickKeep in days, for the words that state it.
const PickKeepDays = 30

// KeptPick is one build a pick listed, kept under its build ID.
type KeptPick struct {
	Candidate string
	Created   time.Time
	// Plan is the caller's JSON: the request and the build as picked.
	Plan []byte
}

// KeepPicks stores the builds of one pick, each under its build ID,
// replacing an earlier pick of the same ID (the same stock lines picked
// for another request), and deletes the kept picks older than PickKeep.
func (db *DB) KeepPicks(ctx context.Context, picks []KeptPick) error {
	err := db.write(ctx, func(tx *sqlx.Tx) error {
		cutoff := time.Now().Add(-PickKeep).UTC().Format(TimeLayout)
		if _, err := tx.ExecContext(ctx, `DELETE FROM picks WHERE created < ?`, cutoff); err != nil {
			return err
		}
		for _, p := range picks {
			if p.Candidate == "" {
				return fmt.Errorf("%w: build ID is empty", ErrInvalid)
			}
			if _, err := tx.ExecContext(ctx, `INSERT OR REPLACE INTO picks (candidate, plan) VALUES (?, ?)`,
				p.Candidate, string(p.Plan)); err != nil {
				return domainError(err)
			}
		}
		return nil
	})
	if err != nil {
		return fmt.Errorf("keep pick results: %w", err)
	}
	return nil
}

// Pick returns the kept pick of build ID candidate; ErrNoPick when none is
// kept (never picked, or older than PickKeep).
func (db *DB) Pick(ctx context.Context, candidate string) (KeptPick, error) {
	var row struct {
		Candidate string `db:"candidate"`
		Created   string `db:"created"`
		Plan      string `db:"plan"`
	}
	cutoff := time.Now().Add(-PickKeep).UTC().Format(TimeLayout)
	err := db.read(ctx, func(tx *sqlx.Tx) error {
		return tx.GetContext(ctx, &row, `SELECT candidate, created, plan FROM picks
			WHERE candidate = ? AND created >= ?`, candidate, cutoff)
	})
	if errors.Is(err, sql.ErrNoRows) {
		return KeptPick{}, fmt.Errorf("build ID %s: %w", candidate, ErrNoPick)
	}
	if err != nil {
		return KeptPick{}, fmt.Errorf("build ID %s: %w", candidate, err)
	}
	t, err := parseTime(row.Created)
	if err != nil {
		return KeptPick{}, fmt.Errorf("build ID %s: %w", candidate, err)
	}
	return KeptPick{Candidate: row.Candidate, Created: t, Plan: []byte(row.Plan)}, nil
}
