package store

import (
	"context"
	"database/sql"
	"errors"
	"fmt"

	"github.com/jmoiron/sqlx"
)

// ListResistors returns the resistor lines matching f, sorted by value,
// tolerance, power, technology, bin and ID.
func (db *DB) ListResistors(ctx context.Context, f Filter) ([]Resistor, error) {
	where, args := filterSQL(f)
	var out []Resistor
	err := db.read(ctx, func(tx *sqlx.Tx) error {
		var rows []resistorRow
		q := resistorSelect + where + ` ORDER BY r.ohm, r.tol, r.rated_w, r.tech, p.bin, p.id`
		if err := tx.SelectContext(ctx, &rows, q, args...); err != nil {
			return err
		}
		tags, err := tagsOf(ctx, tx, KindResistor)
		if err != nil {
			return err
		}
		out = make([]Resistor, len(rows))
		for i, r := range rows {
			out[i] = r.part()
			if t := tags[r.ID]; t != nil {
				out[i].Tags = t
			}
		}
		return nil
	})
	if err != nil {
		return nil, fmt.Errorf("list resistors: %w", err)
	}
	return out, nil
}

// ListTransistors returns the transistor lines matching f, sorted by
// label, bin and ID.
func (db *DB) ListTransistors(ctx context.Context, f Filter) ([]Transistor, error) {
	where, args := filterSQL(f)
	var out []Transistor
	err := db.read(ctx, func(tx *sqlx.Tx) error {
		var rows []transistorRow
		q := transistorSelect + where + ` ORDER BY t.label, p.bin, p.id`
		if err := tx.SelectContext(ctx, &rows, q, args...); err != nil {
			return err
		}
		tags, err := tagsOf(ctx, tx, KindTransistor)
		if err != nil {
			return err
		}
		out = make([]Transistor, len(rows))
		for i, r := range rows {
			out[i] = r.part()
			if t := tags[r.ID]; t != nil {
				out[i].Tags = t
			}
		}
		return nil
	})
	if err != nil {
		return nil, fmt.Errorf("list transistors: %w", err)
	}
	return out, nil
}

// KindOf returns the kind of the stock line id; ErrNotFound when there is
// none.
func (db *DB) KindOf(ctx context.Context, id int64) (Kind, error) {
	var k string
	err := db.read(ctx, func(tx *sqlx.Tx) error {
		return tx.GetContext(ctx, &k, `SELECT kind FROM parts WHERE id = ?`, id)
	})
	if errors.Is(err, sql.ErrNoRows) {
		return "", fmt.Errorf("part %d: %w", id, ErrNotFound)
	}
	if err != nil {
		return "", fmt.Errorf("part %d: %w", id, err)
	}
	return Kind(k), nil
}

// partByID reads one line of the kind sel selects, with its tags.
func partByID[P any, R interface{ part() P }](ctx context.Context, db *DB, what, sel string, id int64,
	withTags func(P, []string) P) (P, error) {
	var out P
	err := db.read(ctx, func(tx *sqlx.Tx) error {
		var row R
		if err := tx.GetContext(ctx, &row, sel+` WHERE p.id = ?`, id); err != nil {
			return err
		}
		tags, err := tagsOfPart(ctx, tx, id)
		out = withTags(row.part(), tags)
		return err
	})
	if errors.Is(err, sql.ErrNoRows) {
		return out, fmt.Errorf("%s %d: %w", what, id, ErrNotFound)
	}
	if err != nil {
		return out, fmt.Errorf("%s %d: %w", what, id, err)
	}
	return out, nil
}

// ResistorByID returns the resistor line id; ErrNotFound when there is no
// resistor with that ID.
func (db *DB) ResistorByID(ctx context.Context, id int64) (Resistor, error) {
	return partByID[Resistor, resistorRow](ctx, db, "resistor", resistorSelect, id,
		func(r Resistor, tags []string) Resistor { r.Tags = tags; return r })
}

// TransistorByID returns the transistor line id; ErrNotFound when there is
// no transistor with that ID.
func (db *DB) TransistorByID(ctx context.Context, id int64) (Transistor, error) {
	return partByID[Transistor, transistorRow](ctx, db, "transistor", transistorSelect, id,
		func(t Transistor, tags []string) Transistor { t.Tags = tags; return t })
}

// TransistorByLabel returns the stock line with that label (the lowest ID
// when several bins hold it); ErrNotFound when none does.
func (db *DB) TransistorByLabel(ctx context.Context, label string) (Transistor, error) {
	var id int64
	err := db.read(ctx, func(tx *sqlx.Tx) error {
		return tx.GetContext(ctx, &id, `SELECT part_id FROM transistors WHERE label = ? ORDER BY part_id LIMIT 1`, label)
	})
	if errors.Is(err, sql.ErrNoRows) {
		return Transistor{}, fmt.Errorf("transistor %q: %w", label, ErrNotFound)
	}
	if err != nil {
		return Transistor{}, fmt.Errorf("transistor %q: %w", label, err)
	}
	return db.TransistorByID(ctx, id)
}
