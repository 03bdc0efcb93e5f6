package store

import (
	"context"
	"database/sql"
	"errors"
	"fmt"
	"strings"

	"github.com/jmoiron/sqlx"
)

// listParts reads the lines sel selects that match f, in order, with
// their tags.
func listParts[P any, R interface {
	part() P
	partID() int64
}](ctx context.Context, db *DB, k Kind, sel, order string, f Filter,
	withTags func(P, []string) P) ([]P, error) {
	where, args := filterSQL(f)
	var out []P
	err := db.read(ctx, func(tx *sqlx.Tx) error {
		var rows []R
		if err := tx.SelectContext(ctx, &rows, sel+where+order, args...); err != nil {
			return err
		}
		tags, err := tagsOf(ctx, tx, k)
		if err != nil {
			return err
		}
		out = make([]P, len(rows))
		for i, r := range rows {
			out[i] = r.part()
			if t := tags[r.partID()]; t != nil {
				out[i] = withTags(out[i], t)
			}
		}
		return nil
	})
	if err != nil {
		return nil, fmt.Errorf("list %ss: %w", k, err)
	}
	return out, nil
}

func resistorWithTags(r Resistor, tags []string) Resistor       { r.Tags = tags; return r }
func transistorWithTags(t Transistor, tags []string) Transistor { t.Tags = tags; return t }

// ListResistors returns the resistor lines matching f, sorted by value,
// tolerance, power, technology, bin and ID.
func (db *DB) ListResistors(ctx context.Context, f Filter) ([]Resistor, error) {
	return listParts[Resistor, resistorRow](ctx, db, KindResistor, resistorSelect,
		` ORDER BY r.ohm, r.tol, r.rated_w, r.tech, p.bin, p.id`, f, resistorWithTags)
}

// ListTransistors returns the transistor lines matching f, sorted by
// label, bin and ID.
func (db *DB) ListTransistors(ctx context.Context, f Filter) ([]Transistor, error) {
	return listParts[Transistor, transistorRow](ctx, db, KindTransistor, transistorSelect,
		` ORDER BY t.label, p.bin, p.id`, f, transistorWithTags)
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
	return partByID[Resistor, resistorRow](ctx, db, "resistor", resistorSelect, id, resistorWithTags)
}

// TransistorByID returns the transistor line id; ErrNotFound when there is
// no transistor with that ID.
func (db *DB) TransistorByID(ctx context.Context, id int64) (Transistor, error) {
	return partByID[Transistor, transistorRow](ctx, db, "transistor", transistorSelect, id, transistorWithTags)
}

// TransistorByLabel returns the stock line with that label, matched
// without regard to ASCII letter case and surrounding spaces (qn-230 finds
// QN-230); when several bins hold the label, the line with the lowest ID.
// When the stock spells the label more than one way (QN-230 and qn-230) it
// does not choose: the error is an *AmbiguousLabelError listing every
// matching line. ErrNotFound when no line matches.
func (db *DB) TransistorByLabel(ctx context.Context, label string) (Transistor, error) {
	label = strings.TrimSpace(label)
	var lines []LabelMatch
	err := db.read(ctx, func(tx *sqlx.Tx) error {
		lines = lines[:0]
		return tx.SelectContext(ctx, &lines, `SELECT p.id, t.label, p.bin FROM transistors t
			JOIN parts p ON p.id = t.part_id WHERE t.label = ? COLLATE NOCASE ORDER BY p.id`, label)
	})
	if err != nil {
		return Transistor{}, fmt.Errorf("transistor %q: %w", label, err)
	}
	if len(lines) == 0 {
		return Transistor{}, fmt.Errorf("transistor %q: %w", label, ErrNotFound)
	}
	for _, l := range lines[1:] {
		if l.Label != lines[0].Label {
			return Transistor{}, &AmbiguousLabelError{Label: label, Lines: lines}
		}
	}
	return db.TransistorByID(ctx, lines[0].ID)
}
