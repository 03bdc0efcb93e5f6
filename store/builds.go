package store

import (
	"context"
	"database/sql"
	"errors"
	"fmt"
	"sort"
	"time"

	"github.com/jmoiron/sqlx"
)

// BuildState is where a build stands.
type BuildState string

const (
	// BuildOpen is a build whose parts are out of stock and whose boards
	// are being made.
	BuildOpen BuildState = "open"
	// BuildClosed is a finished run; its parts stay used.
	BuildClosed BuildState = "closed"
	// BuildCancelled is a run called off; its parts went back to stock.
	BuildCancelled BuildState = "cancelled"
)

// MaxBoards is the largest run one build may be.
const MaxBoards = 100_000

// PartUse is one stock line a build draws on: how many parts each board
// takes from it.
type PartUse struct {
	Line     int64
	Kind     Kind
	PerBoard int
}

// BuildOrder is a build to reserve.
type BuildOrder struct {
	// Candidate is the build ID the pick gave.
	Candidate string
	Boards    int
	Note      string
	// Plan is what the caller keeps with the build (JSON): the request,
	// the figures it was picked with, the bands. The store does not read
	// it.
	Plan []byte
	// Parts are the lines drawn on, each once.
	Parts []PartUse
}

// BuildPart is one line a build took parts from, as it was when taken.
type BuildPart struct {
	Line     int64   `db:"line"`
	Kind     Kind    `db:"kind"`
	Ohm      float64 `db:"ohm"`
	Label    string  `db:"label"`
	Bin      string  `db:"bin"`
	PerBoard int     `db:"per_board"`
	// Taken is what left the line for all the boards.
	Taken int `db:"taken"`
}

// BoardReading is one board's bring-up readings with what the caller
// concluded.
type BoardReading struct {
	Board   int
	Time    time.Time
	VB_V    float64
	VE_V    float64
	VC_V    float64
	Verdict string
	// Detail is the caller's JSON about the verdict (the bands, the causes).
	Detail []byte
}

// Build is a run that took parts out of stock.
type Build struct {
	ID        int64
	Candidate string
	Boards    int
	State     BuildState
	Created   time.Time
	// Ended is when the build was closed or cancelled; zero while open.
	Ended time.Time
	Note  string
	Plan  []byte
	// Parts are in bin order, then line.
	Parts []BuildPart
	// Readings are in board order.
	Readings []BoardReading
}

// checkOrder refuses an order the store cannot take.
func checkOrder(o BuildOrder) error {
	switch {
	case o.Candidate == "":
		return fmt.Errorf("%w: build ID is empty", ErrInvalid)
	case o.Boards < 1 || o.Boards > MaxBoards:
		return fmt.Errorf("%w: boards %d: want 1 to %d", ErrInvalid, o.Boards, MaxBoards)
	case len(o.Parts) == 0:
		return fmt.Errorf("%w: the build uses no parts", ErrInvalid)
	}
	seen := map[int64]bool{}
	for _, p := range o.Parts {
		if p.PerBoard < 1 {
			return fmt.Errorf("%w: line %d: %d parts per board", ErrInvalid, p.Line, p.PerBoard)
		}
		if seen[p.Line] {
			return fmt.Errorf("%w: line %d is named twice", ErrInvalid, p.Line)
		}
		seen[p.Line] = true
	}
	return nil
}

// stockedLine is a line as a build reads it.
type stockedLine struct {
	ID    int64   `db:"id"`
	Kind  Kind    `db:"kind"`
	Qty   int     `db:"qty"`
	Bin   string  `db:"bin"`
	Ohm   float64 `db:"ohm"`
	Label string  `db:"label"`
}

func readLine(ctx context.Context, tx *sqlx.Tx, id int64) (stockedLine, error) {
	var l stockedLine
	err := tx.GetContext(ctx, &l, `SELECT p.id, p.kind, p.qty, p.bin,
		coalesce(r.ohm, 0) AS ohm, coalesce(t.label, '') AS label
		FROM parts p LEFT JOIN resistors r ON r.part_id = p.id LEFT JOIN transistors t ON t.part_id = p.id
		WHERE p.id = ?`, id)
	if errors.Is(err, sql.ErrNoRows) {
		return l, fmt.Errorf("line %d: %w", id, ErrNotFound)
	}
	return l, err
}

// Reserve takes the parts of o out of stock for all its boards and records
// the build, in one transaction: all parts or none. When any line holds too
// few it changes nothing and returns a *ShortageError listing every short
// line. A line that is gone is ErrNotFound; one of another kind than
// ordered is ErrInvalid. The ledger gets one row per line, reason build.
func (db *DB) Reserve(ctx context.Context, o BuildOrder) (Build, error) {
	if err := checkOrder(o); err != nil {
		return Build{}, fmt.Errorf("reserve build %s: %w", o.Candidate, err)
	}
	plan := o.Plan
	if len(plan) == 0 {
		plan = []byte("{}")
	}
	var id int64
	err := db.write(ctx, func(tx *sqlx.Tx) error {
		lines := make([]stockedLine, len(o.Parts))
		var short []Shortage
		for i, p := range o.Parts {
			l, err := readLine(ctx, tx, p.Line)
			if err != nil {
				return err
			}
			if l.Kind != p.Kind {
				return fmt.Errorf("%w: line %d is a %s, not a %s", ErrInvalid, p.Line, l.Kind, p.Kind)
			}
			lines[i] = l
			if need := p.PerBoard * o.Boards; l.Qty < need {
				short = append(short, Shortage{Line: l.ID, Kind: l.Kind, Ohm: l.Ohm, Label: l.Label, Bin: l.Bin,
					Needed: need, OnHand: l.Qty})
			}
		}
		if len(short) > 0 {
			sort.Slice(short, func(i, j int) bool { return short[i].Line < short[j].Line })
			return &ShortageError{Shortages: short}
		}
		res, err := tx.ExecContext(ctx, `INSERT INTO builds (candidate, boards, note, plan) VALUES (?, ?, ?, ?)`,
			o.Candidate, o.Boards, o.Note, string(plan))
		if err != nil {
			return domainError(err)
		}
		if id, err = res.LastInsertId(); err != nil {
			return err
		}
		if err := setCause(ctx, tx, ReasonBuild, id); err != nil {
			return err
		}
		for i, p := range o.Parts {
			l := lines[i]
			need := p.PerBoard * o.Boards
			if _, err := tx.ExecContext(ctx, `UPDATE parts SET qty = qty - ? WHERE id = ?`, need, l.ID); err != nil {
				return domainError(err)
			}
			if _, err := tx.ExecContext(ctx, `INSERT INTO build_parts (build, line, kind, ohm, label, bin, per_board, taken)
				VALUES (?, ?, ?, ?, ?, ?, ?, ?)`, id, l.ID, string(l.Kind), l.Ohm, l.Label, l.Bin, p.PerBoard, need); err != nil {
				return domainError(err)
			}
		}
		_, err = tx.ExecContext(ctx, `DELETE FROM ledger_cause`)
		return err
	})
	if err != nil {
		return Build{}, fmt.Errorf("reserve build %s: %w", o.Candidate, err)
	}
	return db.Build(ctx, id)
}

// endBuild moves an open build to state; with cancel its parts go back to
// their lines (ledger reason cancel).
func (db *DB) endBuild(ctx context.Context, id int64, state BuildState) error {
	err := db.write(ctx, func(tx *sqlx.Tx) error {
		var have BuildState
		err := tx.GetContext(ctx, &have, `SELECT state FROM builds WHERE id = ?`, id)
		if errors.Is(err, sql.ErrNoRows) {
			return fmt.Errorf("build %d: %w", id, ErrNoBuild)
		}
		if err != nil {
			return err
		}
		if have != BuildOpen {
			return &BuildStateError{Build: id, State: have, Want: state}
		}
		if state == BuildCancelled {
			if err := setCause(ctx, tx, ReasonCancel, id); err != nil {
				return err
			}
			// An open build's lines cannot be removed (Remove refuses
			// them), so every line is still there to take its parts back.
			res, err := tx.ExecContext(ctx, `UPDATE parts SET qty = qty +
				(SELECT taken FROM build_parts b WHERE b.build = ? AND b.line = parts.id)
				WHERE id IN (SELECT line FROM build_parts WHERE build = ?)`, id, id)
			if err != nil {
				return domainError(err)
			}
			var want int64
			if err := tx.GetContext(ctx, &want, `SELECT count(*) FROM build_parts WHERE build = ?`, id); err != nil {
				return err
			}
			if n, err := res.RowsAffected(); err != nil {
				return err
			} else if n != want {
				return fmt.Errorf("build %d: %d of its %d lines are no longer stocked: %w", id, want-n, want, ErrNotFound)
			}
			if _, err := tx.ExecContext(ctx, `DELETE FROM ledger_cause`); err != nil {
				return err
			}
		}
		_, err = tx.ExecContext(ctx, `UPDATE builds SET state = ?, ended = strftime('%Y-%m-%dT%H:%M:%fZ', 'now')
			WHERE id = ?`, string(state), id)
		return domainError(err)
	})
	if err != nil {
		verb := "close"
		if state == BuildCancelled {
			verb = "cancel"
		}
		return fmt.Errorf("%s build %d: %w", verb, id, err)
	}
	return nil
}

// CancelBuild returns an open build's parts to their lines and marks it
// cancelled, in one transaction. A build already closed or cancelled is a
// *BuildStateError; an unknown one ErrNoBuild.
func (db *DB) CancelBuild(ctx context.Context, id int64) error {
	return db.endBuild(ctx, id, BuildCancelled)
}

// CloseBuild marks an open build finished: its parts stay used. A build
// already closed or cancelled is a *BuildStateError.
func (db *DB) CloseBuild(ctx context.Context, id int64) error {
	return db.endBuild(ctx, id, BuildClosed)
}

// refuseHeld returns a *HeldError when an open build holds line.
func refuseHeld(ctx context.Context, tx *sqlx.Tx, line int64) error {
	var ids []int64
	if err := tx.SelectContext(ctx, &ids, `SELECT b.id FROM build_parts p JOIN builds b ON b.id = p.build
		WHERE p.line = ? AND b.state = 'open' ORDER BY b.id`, line); err != nil {
		return fmt.Errorf("builds holding line %d: %w", line, err)
	}
	if len(ids) > 0 {
		return &HeldError{Line: line, Builds: ids}
	}
	return nil
}
