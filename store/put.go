package store

import (
	"context"
	"database/sql"
	"errors"
	"fmt"

	"github.com/jmoiron/sqlx"
)

// putter writes stock lines inside one transaction with prepared
// statements, so that a large import costs one parse per statement.
type putter struct {
	tx                        *sqlx.Tx
	find, insPart, insR, insT *sqlx.Stmt
	spelling                  *sqlx.Stmt
	addQty, setQty            *sqlx.Stmt
	updR, updT                *sqlx.Stmt
	insTag, delTags           *sqlx.Stmt
}

func newPutter(ctx context.Context, tx *sqlx.Tx) (*putter, error) {
	p := &putter{tx: tx}
	stmts := []struct {
		dst **sqlx.Stmt
		sql string
	}{
		{&p.find, `SELECT id FROM parts WHERE kind = ? AND ident = ? AND bin = ?`},
		{&p.spelling, `SELECT ident FROM parts WHERE kind = ? AND bin = ? AND ident = ? COLLATE NOCASE
			ORDER BY id LIMIT 1`},
		// A new line never takes the ID of a removed one: the ledger and
		// the builds keep naming removed lines by their IDs.
		{&p.insPart, `INSERT INTO parts (id, kind, ident, qty, bin, note) VALUES (1 + max(
			(SELECT coalesce(max(id), 0) FROM parts), (SELECT coalesce(max(line), 0) FROM ledger),
			(SELECT coalesce(max(line), 0) FROM build_parts)), ?, ?, ?, ?, ?)`},
		{&p.insR, `INSERT INTO resistors (part_id, ohm, tol, rated_w, knee_c, max_c, tcr_ppm_per_k, tech)
			VALUES (?, ?, ?, ?, ?, ?, ?, ?)`},
		{&p.insT, `INSERT INTO transistors (part_id, label, polarity, hfe_min, hfe_max, hfe_typ, hfe_at_a,
			vbe_on_v, vbe_at_a, vce_sat_v, vceo_v, ic_max_a, pd25_w, theta_ja_k_per_w, tj_max_c, vaf_v, icbo_a)
			VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`},
		{&p.addQty, `UPDATE parts SET qty = qty + ?, note = CASE WHEN ? <> '' THEN ? ELSE note END
			WHERE id = ? RETURNING qty`},
		{&p.setQty, `UPDATE parts SET qty = ?, note = ? WHERE id = ? RETURNING qty`},
		{&p.updR, `UPDATE resistors SET knee_c = ?, max_c = ?, tcr_ppm_per_k = ? WHERE part_id = ?`},
		{&p.updT, `UPDATE transistors SET polarity = ?, hfe_min = ?, hfe_max = ?, hfe_typ = ?, hfe_at_a = ?,
			vbe_on_v = ?, vbe_at_a = ?, vce_sat_v = ?, vceo_v = ?, ic_max_a = ?, pd25_w = ?,
			theta_ja_k_per_w = ?, tj_max_c = ?, vaf_v = ?, icbo_a = ? WHERE part_id = ?`},
		{&p.insTag, `INSERT OR IGNORE INTO part_tags (part_id, tag) VALUES (?, ?)`},
		{&p.delTags, `DELETE FROM part_tags WHERE part_id = ?`},
	}
	for _, s := range stmts {
		st, err := tx.PreparexContext(ctx, s.sql)
		if err != nil {
			p.close()
			return nil, fmt.Errorf("prepare: %w", err)
		}
		*s.dst = st
	}
	return p, nil
}

func (p *putter) close() {
	for _, s := range []*sqlx.Stmt{p.find, p.spelling, p.insPart, p.insR, p.insT, p.addQty, p.setQty, p.updR, p.updT, p.insTag, p.delTags} {
		if s != nil {
			s.Close()
		}
	}
}

// line is what every kind has in the parts table.
type line struct {
	kind  Kind
	ident string
	qty   int
	bin   string
	note  string
	tags  []string
}

// putLine finds the line with the same identity in the same bin and adds
// to (or, with replace, sets) its quantity, or inserts a new line; it
// returns the line's ID and whether it existed.
func (p *putter) putLine(ctx context.Context, l line, replace bool) (id int64, merged bool, err error) {
	err = p.find.GetContext(ctx, &id, string(l.kind), l.ident, l.bin)
	switch {
	case errors.Is(err, sql.ErrNoRows):
		res, err := p.insPart.ExecContext(ctx, string(l.kind), l.ident, l.qty, l.bin, l.note)
		if err != nil {
			return 0, false, domainError(err)
		}
		if id, err = res.LastInsertId(); err != nil {
			return 0, false, err
		}
	case err != nil:
		return 0, false, err
	default:
		merged = true
		var qty int64
		if replace {
			err = p.setQty.GetContext(ctx, &qty, l.qty, l.note, id)
		} else {
			err = p.addQty.GetContext(ctx, &qty, l.qty, l.note, l.note, id)
		}
		if err != nil {
			return 0, false, domainError(err)
		}
		if qty > MaxQty {
			return 0, false, fmt.Errorf("%w: quantity of part %d would be %d, above %d", ErrInvalid, id, qty, MaxQty)
		}
		if replace {
			if _, err := p.delTags.ExecContext(ctx, id); err != nil {
				return 0, false, err
			}
		}
	}
	for _, t := range l.tags {
		if _, err := p.insTag.ExecContext(ctx, id, t); err != nil {
			return 0, false, domainError(err)
		}
	}
	return id, merged, nil
}

func (p *putter) putResistor(ctx context.Context, r Resistor, replace bool) (int64, bool, error) {
	id, merged, err := p.putLine(ctx, line{KindResistor, r.ident(), r.Qty, r.Bin, r.Note, r.Tags}, replace)
	if err != nil {
		return 0, false, err
	}
	if merged {
		_, err = p.updR.ExecContext(ctx, r.Knee_C, r.Max_C, r.TCR_PPMPerK, id)
	} else {
		_, err = p.insR.ExecContext(ctx, id, r.Ohm, r.Tol, r.Rated_W, r.Knee_C, r.Max_C, r.TCR_PPMPerK, r.Tech)
	}
	return id, merged, domainError(err)
}

// putTransistor stocks t. A line in the same bin whose label differs only
// in letter case is the same part: t joins it under the stocked spelling.
func (p *putter) putTransistor(ctx context.Context, t Transistor, replace bool) (int64, bool, error) {
	ident := t.ident()
	var stocked string
	switch err := p.spelling.GetContext(ctx, &stocked, string(KindTransistor), t.Bin, ident); {
	case err == nil:
		ident = stocked
	case !errors.Is(err, sql.ErrNoRows):
		return 0, false, err
	}
	id, merged, err := p.putLine(ctx, line{KindTransistor, ident, t.Qty, t.Bin, t.Note, t.Tags}, replace)
	if err != nil {
		return 0, false, err
	}
	vals := []any{t.Polarity, t.HFEMin, t.HFEMax, t.HFETyp, t.HFEAt_A, t.VBEOn_V, t.VBEAt_A, t.VCESat_V,
		t.VCEO_V, t.ICMax_A, t.PD25_W, t.ThetaJA_KPerW, t.TjMax_C, t.VAF_V, t.ICBO_A}
	if merged {
		_, err = p.updT.ExecContext(ctx, append(vals, id)...)
	} else {
		_, err = p.insT.ExecContext(ctx, append([]any{id, t.Label}, vals...)...)
	}
	return id, merged, domainError(err)
}

// AddResult says what adding one part did.
type AddResult struct {
	// ID is the stock line the part went to.
	ID int64
	// Merged is true when the line existed and its quantity was added to.
	Merged bool
}

// add writes one checked part through put in its own transaction.
func (db *DB) add(ctx context.Context, what string, problems []Problem,
	put func(p *putter) (int64, bool, error)) (AddResult, error) {
	if len(problems) > 0 {
		return AddResult{}, fmt.Errorf("add %s: %w", what, &InvalidError{Problems: problems})
	}
	var res AddResult
	err := db.writeFor(ctx, ReasonAdd, 0, func(tx *sqlx.Tx) error {
		p, err := newPutter(ctx, tx)
		if err != nil {
			return err
		}
		defer p.close()
		res.ID, res.Merged, err = put(p)
		return err
	})
	if err != nil {
		return AddResult{}, fmt.Errorf("add %s: %w", what, err)
	}
	return res, nil
}

// AddResistor stocks r (defaults filled in): when a line with the same
// value, tolerance, power and technology is in the same bin, its quantity
// grows by r.Qty, its tags gain r's and its derating and TCR become r's;
// otherwise a new line is made. Errors wrap ErrInvalid (with an
// *InvalidError) when r breaks a rule.
func (db *DB) AddResistor(ctx context.Context, r Resistor) (AddResult, error) {
	r = r.WithDefaults()
	return db.add(ctx, "resistor", r.Validate(), func(p *putter) (int64, bool, error) {
		return p.putResistor(ctx, r, false)
	})
}

// AddTransistor stocks t (defaults filled in): when a line with the same
// label is in the same bin, its quantity grows by t.Qty, its tags gain t's
// and its datasheet values become t's; otherwise a new line is made.
func (db *DB) AddTransistor(ctx context.Context, t Transistor) (AddResult, error) {
	t = t.WithDefaults()
	return db.add(ctx, "transistor", t.Validate(), func(p *putter) (int64, bool, error) {
		return p.putTransistor(ctx, t, false)
	})
}
