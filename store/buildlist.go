package store

import (
	"context"
	"database/sql"
	"errors"
	"fmt"

	"github.com/jmoiron/sqlx"
)

// buildRow is one builds row as stored.
type buildRow struct {
	ID        int64   `db:"id"`
	Candidate string  `db:"candidate"`
	Boards    int     `db:"boards"`
	State     string  `db:"state"`
	Created   string  `db:"created"`
	Ended     *string `db:"ended"`
	Note      string  `db:"note"`
	Plan      string  `db:"plan"`
}

func (r buildRow) build() (Build, error) {
	b := Build{ID: r.ID, Candidate: r.Candidate, Boards: r.Boards, State: BuildState(r.State), Note: r.Note,
		Plan: []byte(r.Plan)}
	var err error
	if b.Created, err = parseTime(r.Created); err != nil {
		return b, fmt.Errorf("build %d: created: %w", r.ID, err)
	}
	if r.Ended != nil {
		if b.Ended, err = parseTime(*r.Ended); err != nil {
			return b, fmt.Errorf("build %d: ended: %w", r.ID, err)
		}
	}
	return b, nil
}

const buildSelect = `SELECT id, candidate, boards, state, created, ended, note, plan FROM builds`

// Builds returns the builds, newest first; with openOnly only the open
// ones. Parts and readings are left empty (see Build).
func (db *DB) Builds(ctx context.Context, openOnly bool) ([]Build, error) {
	q := buildSelect
	if openOnly {
		q += ` WHERE state = 'open'`
	}
	var rows []buildRow
	err := db.read(ctx, func(tx *sqlx.Tx) error {
		rows = rows[:0]
		return tx.SelectContext(ctx, &rows, q+` ORDER BY id DESC`)
	})
	if err != nil {
		return nil, fmt.Errorf("list builds: %w", err)
	}
	out := make([]Build, len(rows))
	for i, r := range rows {
		if out[i], err = r.build(); err != nil {
			return nil, fmt.Errorf("list builds: %w", err)
		}
	}
	return out, nil
}

// boardRow is one build_boards row as stored.
type boardRow struct {
	Board   int     `db:"board"`
	Time    string  `db:"time"`
	VB      float64 `db:"vb_v"`
	VE      float64 `db:"ve_v"`
	VC      float64 `db:"vc_v"`
	Verdict string  `db:"verdict"`
	Detail  string  `db:"detail"`
}

// Build returns build id with its parts (in bin order) and its boards'
// readings; ErrNoBuild when there is none.
func (db *DB) Build(ctx context.Context, id int64) (Build, error) {
	var b Build
	err := db.read(ctx, func(tx *sqlx.Tx) error {
		var r buildRow
		if err := tx.GetContext(ctx, &r, buildSelect+` WHERE id = ?`, id); err != nil {
			return err
		}
		var err error
		if b, err = r.build(); err != nil {
			return err
		}
		if err := tx.SelectContext(ctx, &b.Parts, `SELECT line, kind, ohm, label, bin, per_board, taken
			FROM build_parts WHERE build = ? ORDER BY bin, line`, id); err != nil {
			return fmt.Errorf("parts: %w", err)
		}
		var boards []boardRow
		if err := tx.SelectContext(ctx, &boards, `SELECT board, time, vb_v, ve_v, vc_v, verdict, detail
			FROM build_boards WHERE build = ? ORDER BY board`, id); err != nil {
			return fmt.Errorf("boards: %w", err)
		}
		for _, br := range boards {
			t, err := parseTime(br.Time)
			if err != nil {
				return fmt.Errorf("board %d: %w", br.Board, err)
			}
			b.Readings = append(b.Readings, BoardReading{Board: br.Board, Time: t, VB_V: br.VB, VE_V: br.VE,
				VC_V: br.VC, Verdict: br.Verdict, Detail: []byte(br.Detail)})
		}
		return nil
	})
	if errors.Is(err, sql.ErrNoRows) {
		return Build{}, fmt.Errorf("build %d: %w", id, ErrNoBuild)
	}
	if err != nil {
		return Build{}, fmt.Errorf("build %d: %w", id, err)
	}
	return b, nil
}

// RecordBoard stores the readings of one board of build id, replacing an
// earlier record of the same board. The board must be one of the build's
// (1..Boards) and the build must not be cancelled.
func (db *DB) RecordBoard(ctx context.Context, id int64, r BoardReading) error {
	detail := r.Detail
	if len(detail) == 0 {
		detail = []byte("{}")
	}
	err := db.write(ctx, func(tx *sqlx.Tx) error {
		var b buildRow
		err := tx.GetContext(ctx, &b, buildSelect+` WHERE id = ?`, id)
		if errors.Is(err, sql.ErrNoRows) {
			return ErrNoBuild
		}
		if err != nil {
			return err
		}
		if r.Board < 1 || r.Board > b.Boards {
			return fmt.Errorf("%w: board %d: the build has boards 1 to %d", ErrInvalid, r.Board, b.Boards)
		}
		if BuildState(b.State) == BuildCancelled {
			return &BuildStateError{Build: id, State: BuildCancelled, Want: "measured"}
		}
		_, err = tx.ExecContext(ctx, `INSERT OR REPLACE INTO build_boards (build, board, vb_v, ve_v, vc_v, verdict, detail)
			VALUES (?, ?, ?, ?, ?, ?, ?)`, id, r.Board, r.VB_V, r.VE_V, r.VC_V, r.Verdict, string(detail))
		return domainError(err)
	})
	if err != nil {
		return fmt.Errorf("record board %d of build %d: %w", r.Board, id, err)
	}
	return nil
}
