package store

import (
	"context"
	"fmt"
	"strings"
	"time"

	"github.com/jmoiron/sqlx"
)

// Reason says why a quantity changed; every ledger row carries one.
type Reason string

// The reasons a quantity changes.
const (
	// ReasonOpening is a line's quantity when the ledger began (the
	// migration that added it).
	ReasonOpening Reason = "opening"
	// ReasonAdd is a part added with stock add.
	ReasonAdd Reason = "add"
	// ReasonImport is a part imported from a file.
	ReasonImport Reason = "import"
	// ReasonAdjust is a change by hand (+N or -N).
	ReasonAdjust Reason = "adjust"
	// ReasonCount is a counted quantity set by hand (=N).
	ReasonCount Reason = "count"
	// ReasonBuild is parts taken out for a build.
	ReasonBuild Reason = "build"
	// ReasonCancel is parts returned by a cancelled build.
	ReasonCancel Reason = "cancel"
	// ReasonRemove is a line removed with what it still held.
	ReasonRemove Reason = "remove"
	// ReasonUnrecorded is a change made without naming its reason (by
	// hand in SQLite, say); it is still counted.
	ReasonUnrecorded Reason = "unrecorded"
)

// TimeLayout is how the stock file writes times: UTC, milliseconds.
const TimeLayout = "2006-01-02T15:04:05.000Z"

// LedgerEntry is one change of one line's quantity.
type LedgerEntry struct {
	// Seq orders the entries: a later change has a larger Seq.
	Seq  int64
	Time time.Time
	// Line is the stock line's ID (it may have been removed since).
	Line int64
	// Delta is the change: negative when parts left the bin.
	Delta int
	// QtyAfter is the line's quantity right after the change.
	QtyAfter int
	Reason   Reason
	// Build is the build the change belongs to, 0 for none.
	Build int64
}

// LedgerFilter narrows Ledger. The zero value lists everything.
type LedgerFilter struct {
	Line  int64     // 0 = every line
	Build int64     // 0 = every change, with or without a build
	Since time.Time // zero = from the start
}

// ledgerRow is one ledger row as stored.
type ledgerRow struct {
	ID       int64  `db:"id"`
	Time     string `db:"time"`
	Line     int64  `db:"line"`
	Delta    int    `db:"delta"`
	QtyAfter int    `db:"qty_after"`
	Reason   string `db:"reason"`
	Build    *int64 `db:"build"`
}

// Ledger returns the quantity changes f selects, oldest first.
func (db *DB) Ledger(ctx context.Context, f LedgerFilter) ([]LedgerEntry, error) {
	var conds []string
	var args []any
	if f.Line != 0 {
		conds = append(conds, "line = ?")
		args = append(args, f.Line)
	}
	if f.Build != 0 {
		conds = append(conds, "build = ?")
		args = append(args, f.Build)
	}
	if !f.Since.IsZero() {
		conds = append(conds, "time >= ?")
		args = append(args, f.Since.UTC().Format(TimeLayout))
	}
	q := `SELECT id, time, line, delta, qty_after, reason, build FROM ledger`
	if len(conds) > 0 {
		q += " WHERE " + strings.Join(conds, " AND ")
	}
	var rows []ledgerRow
	err := db.read(ctx, func(tx *sqlx.Tx) error {
		rows = rows[:0]
		return tx.SelectContext(ctx, &rows, q+" ORDER BY id", args...)
	})
	if err != nil {
		return nil, fmt.Errorf("read ledger: %w", err)
	}
	out := make([]LedgerEntry, len(rows))
	for i, r := range rows {
		t, err := parseTime(r.Time)
		if err != nil {
			return nil, fmt.Errorf("read ledger: entry %d: %w", r.ID, err)
		}
		out[i] = LedgerEntry{Seq: r.ID, Time: t, Line: r.Line, Delta: r.Delta, QtyAfter: r.QtyAfter,
			Reason: Reason(r.Reason)}
		if r.Build != nil {
			out[i].Build = *r.Build
		}
	}
	return out, nil
}

// parseTime reads a time as the stock file writes it.
func parseTime(s string) (time.Time, error) {
	t, err := time.Parse(TimeLayout, s)
	if err != nil {
		return time.Time{}, fmt.Errorf("time %q: %w", s, err)
	}
	return t, nil
}

// writeFor is write with the ledger told why the quantities change: every
// ledger row the transaction writes carries reason and build (0 = none).
func (db *DB) writeFor(ctx context.Context, reason Reason, build int64, fn func(tx *sqlx.Tx) error) error {
	return db.write(ctx, func(tx *sqlx.Tx) error {
		if err := setCause(ctx, tx, reason, build); err != nil {
			return err
		}
		if err := fn(tx); err != nil {
			return err
		}
		if _, err := tx.ExecContext(ctx, `DELETE FROM ledger_cause`); err != nil {
			return fmt.Errorf("ledger cause: %w", err)
		}
		return nil
	})
}

// setCause names the reason (and build, 0 = none) of the quantity changes
// that follow in tx.
func setCause(ctx context.Context, tx *sqlx.Tx, reason Reason, build int64) error {
	var b any
	if build != 0 {
		b = build
	}
	if _, err := tx.ExecContext(ctx, `INSERT OR REPLACE INTO ledger_cause (one, reason, build) VALUES (1, ?, ?)`,
		string(reason), b); err != nil {
		return fmt.Errorf("ledger cause: %w", err)
	}
	return nil
}
