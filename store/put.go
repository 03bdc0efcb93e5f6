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
	tx                          *sqlx.Tx
	findID, insPart, insR, insT *sqlx.Stmt
	spelling                    *sqlx.Stmt
	getR, getT, getTags         *sqlx.Stmt
	addQty, setQty              *sqlx.Stmt
	updR, updT                  *sqlx.Stmt
	insTag, delTags             *sqlx.Stmt
}

func newPutter(ctx context.Context, tx *sqlx.Tx) (*putter, error) {
	p := &putter{tx: tx}
	stmts := []struct {
		dst **sqlx.Stmt
		sql string
	}{
		{&p.findID, `SELECT id FROM parts WHERE kind = ? AND ident = ? AND bin = ?`},
		{&p.getR, resistorSelect + ` WHERE p.id = ?`},
		{&p.getT, transistorSelect + ` WHERE p.id = ?`},
		{&p.getTags, `SELECT tag FROM part_tags WHERE part_id = ? ORDER BY tag`},
		{&p.spelling, `SELECT ident FROM parts WHERE kind = ? AND bin = ? AND ident = ? COLLATE NOCASE
			ORDER BY id LIMIT 1`},
		// A new line never takes the ID of a removed one: the ledger and
		// the builds keep naming removed lines by their IDs.
		{&p.insPart, `INSERT INTO parts (id, kind, ident, qty, bin, note, part_number) VALUES (1 + max(
			(SELECT coalesce(max(id), 0) FROM parts), (SELECT coalesce(max(line), 0) FROM ledger),
			(SELECT coalesce(max(line), 0) FROM build_parts)), ?, ?, ?, ?, ?, ?)`},
		{&p.insR, `INSERT INTO resistors (part_id, ohm, tol, rated_w, knee_c, max_c, tcr_ppm_per_k, tech, lev_v)
			VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)`},
		{&p.insT, `INSERT INTO transistors (part_id, label, polarity, hfe_min, hfe_max, hfe_typ, hfe_at_a,
			vbe_on_v, vbe_at_a, vce_sat_v, vceo_v, ic_max_a, pd25_w, theta_ja_k_per_w, tj_max_c, vaf_v, icbo_a,
			vbe_min_v, vbe_max_v, vaf_min_v, vaf_max_v)
			VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`},
		{&p.addQty, `UPDATE parts SET qty = qty + ?, note = CASE WHEN note = '' THEN ? ELSE note END,
			part_number = CASE WHEN part_number = '' THEN ? ELSE part_number END WHERE id = ?`},
		{&p.setQty, `UPDATE parts SET qty = ?, note = ?, part_number = ? WHERE id = ?`},
		{&p.updR, `UPDATE resistors SET knee_c = ?, max_c = ?, tcr_ppm_per_k = ?, lev_v = ? WHERE part_id = ?`},
		{&p.updT, `UPDATE transistors SET polarity = ?, hfe_min = ?, hfe_max = ?, hfe_typ = ?, hfe_at_a = ?,
			vbe_on_v = ?, vbe_at_a = ?, vce_sat_v = ?, vceo_v = ?, ic_max_a = ?, pd25_w = ?,
			theta_ja_k_per_w = ?, tj_max_c = ?, vaf_v = ?, icbo_a = ?,
			vbe_min_v = ?, vbe_max_v = ?, vaf_min_v = ?, vaf_max_v = ? WHERE part_id = ?`},
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
	for _, s := range []*sqlx.Stmt{p.findID, p.spelling, p.getR, p.getT, p.getTags, p.insPart, p.insR, p.insT, p.addQty, p.setQty, p.updR, p.updT, p.insTag, p.delTags} {
		if s != nil {
			s.Close()
		}
	}
}

// putResult says where a part went.
type putResult struct {
	id         int64
	merged     bool
	kind       Kind
	identField string   // the column that names the line (value or label)
	changes    []Change // with replace: the stocked values rewritten
}

// problemError carries the problems a part has against the stock; the
// caller records them and the transaction is rolled back.
type problemError struct{ problems []Problem }

func (e *problemError) Error() string { return (&InvalidError{Problems: e.problems}).Error() }

// line is what every kind has in the parts table.
type line struct {
	kind  Kind
	ident string
	qty   int
	bin   string
	note  string
	pn    string // the maker's part number
	tags  []string
}

// find returns the ID of the line with l's identity in l's bin, if any.
func (p *putter) find(ctx context.Context, l line) (int64, bool, error) {
	var id int64
	err := p.findID.GetContext(ctx, &id, string(l.kind), l.ident, l.bin)
	if errors.Is(err, sql.ErrNoRows) {
		return 0, false, nil
	}
	return id, err == nil, err
}

// insert makes a new line for l and returns its ID.
func (p *putter) insert(ctx context.Context, l line) (int64, error) {
	res, err := p.insPart.ExecContext(ctx, string(l.kind), l.ident, l.qty, l.bin, l.note, l.pn)
	if err != nil {
		return 0, domainError(err)
	}
	id, err := res.LastInsertId()
	if err != nil {
		return 0, err
	}
	return id, p.addTags(ctx, id, l.tags)
}

func (p *putter) addTags(ctx context.Context, id int64, tags []string) error {
	for _, t := range tags {
		if _, err := p.insTag.ExecContext(ctx, id, t); err != nil {
			return domainError(err)
		}
	}
	return nil
}

// merge adds l's quantity to stocked line id (holding stockedQty), or with
// replace sets its quantity, note and tags, after checking the differences
// diffs between the line and the part: without replace any difference is a
// problem, as is a quantity above MaxQty.
func (p *putter) merge(ctx context.Context, id int64, stockedQty int, stockedTags []string, l line,
	diffs []difference, replace bool) ([]Change, error) {
	var ps []Problem
	if !replace {
		for _, d := range diffs {
			ps = append(ps, Problem{Kind: l.kind, Field: d.field,
				Msg: fmt.Sprintf("stocked line #%d has %s, this one %s", id, d.show(d.stocked), d.show(d.given))})
		}
	}
	qty := l.qty
	if !replace {
		qty += stockedQty
		if n := len(unionTags(stockedTags, l.tags)); n > MaxTags {
			ps = append(ps, Problem{Kind: l.kind, Field: "tags", Msg: fmt.Sprintf(
				"stocked line #%d would carry %d tags with this one's; at most %d", id, n, MaxTags)})
		}
	}
	if qty > MaxQty {
		ps = append(ps, Problem{Kind: l.kind, Field: "qty", Msg: fmt.Sprintf(
			"stocked line #%d holds %d; adding %d makes %d, above the limit of %d per line",
			id, stockedQty, l.qty, qty, MaxQty)})
	}
	if len(ps) > 0 {
		return nil, &problemError{problems: ps}
	}
	if !replace {
		if _, err := p.addQty.ExecContext(ctx, l.qty, l.note, l.pn, id); err != nil {
			return nil, domainError(err)
		}
		return nil, p.addTags(ctx, id, l.tags)
	}
	if _, err := p.setQty.ExecContext(ctx, qty, l.note, l.pn, id); err != nil {
		return nil, domainError(err)
	}
	if _, err := p.delTags.ExecContext(ctx, id); err != nil {
		return nil, err
	}
	if err := p.addTags(ctx, id, l.tags); err != nil {
		return nil, err
	}
	changes := make([]Change, len(diffs))
	for i, d := range diffs {
		changes[i] = Change{LineID: id, Field: d.field, Stocked: d.stocked, Given: d.given, Text: d.text}
	}
	return changes, nil
}

// putResistor stocks r (raw as given, def with defaults filled in).
func (p *putter) putResistor(ctx context.Context, raw, r Resistor, replace bool) (putResult, error) {
	l := line{KindResistor, r.ident(), r.Qty, r.Bin, r.Note, r.PartNumber, r.Tags}
	res := putResult{kind: KindResistor, identField: "value"}
	id, found, err := p.find(ctx, l)
	if err != nil {
		return res, err
	}
	res.id, res.merged = id, found
	if !found {
		if res.id, err = p.insert(ctx, l); err != nil {
			return res, err
		}
		_, err = p.insR.ExecContext(ctx, res.id, r.Ohm, r.Tol, r.Rated_W, r.Knee_C, r.Max_C, r.TCR_PPMPerK, r.Tech, r.LEV_V)
		return res, domainError(err)
	}
	var row resistorRow
	if err := p.getR.GetContext(ctx, &row, id); err != nil {
		return res, err
	}
	stocked := row.part()
	if stocked.Tags, err = p.tagsOf(ctx, id); err != nil {
		return res, err
	}
	if res.changes, err = p.merge(ctx, id, stocked.Qty, stocked.Tags, l, diffResistor(stocked, raw, r, replace), replace); err != nil {
		return res, err
	}
	if replace {
		_, err = p.updR.ExecContext(ctx, r.Knee_C, r.Max_C, r.TCR_PPMPerK, r.LEV_V, id)
	}
	return res, domainError(err)
}

// putTransistor stocks t (raw as given, t with defaults filled in). A line
// in the same bin whose label differs only in letter case is the same
// part: t joins it under the stocked spelling.
func (p *putter) putTransistor(ctx context.Context, raw, t Transistor, replace bool) (putResult, error) {
	res := putResult{kind: KindTransistor, identField: "label"}
	ident := t.ident()
	var spelled string
	switch err := p.spelling.GetContext(ctx, &spelled, string(KindTransistor), t.Bin, ident); {
	case err == nil:
		ident = spelled
	case !errors.Is(err, sql.ErrNoRows):
		return res, err
	}
	l := line{KindTransistor, ident, t.Qty, t.Bin, t.Note, t.PartNumber, t.Tags}
	id, found, err := p.find(ctx, l)
	if err != nil {
		return res, err
	}
	res.id, res.merged = id, found
	vals := []any{t.Polarity, t.HFEMin, t.HFEMax, t.HFETyp, t.HFEAt_A, t.VBEOn_V, t.VBEAt_A, t.VCESat_V,
		t.VCEO_V, t.ICMax_A, t.PD25_W, t.ThetaJA_KPerW, t.TjMax_C, t.VAF_V, t.ICBO_A,
		t.VBEMin_V, t.VBEMax_V, t.VAFMin_V, t.VAFMax_V}
	if !found {
		if res.id, err = p.insert(ctx, l); err != nil {
			return res, err
		}
		_, err = p.insT.ExecContext(ctx, append([]any{res.id, t.Label}, vals...)...)
		return res, domainError(err)
	}
	var row transistorRow
	if err := p.getT.GetContext(ctx, &row, id); err != nil {
		return res, err
	}
	stocked := row.part()
	if stocked.Tags, err = p.tagsOf(ctx, id); err != nil {
		return res, err
	}
	if res.changes, err = p.merge(ctx, id, stocked.Qty, stocked.Tags, l, diffTransistor(stocked, raw, t, replace), replace); err != nil {
		return res, err
	}
	if replace {
		_, err = p.updT.ExecContext(ctx, append(vals, id)...)
	}
	return res, domainError(err)
}

// tagsOf returns the tags of line id, sorted.
func (p *putter) tagsOf(ctx context.Context, id int64) ([]string, error) {
	tags := []string{}
	if err := p.getTags.SelectContext(ctx, &tags, id); err != nil {
		return nil, fmt.Errorf("read tags of part %d: %w", id, err)
	}
	return tags, nil
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
	put func(p *putter) (putResult, error)) (AddResult, error) {
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
		r, err := put(p)
		var pe *problemError
		if errors.As(err, &pe) {
			return &InvalidError{Problems: pe.problems}
		}
		res.ID, res.Merged = r.id, r.merged
		return err
	})
	if err != nil {
		return AddResult{}, fmt.Errorf("add %s: %w", what, err)
	}
	return res, nil
}

// AddResistor stocks r (defaults filled in): when a line with the same
// value, tolerance, power and technology is in the same bin and every
// value r gives (derating, TCR, note, tags) agrees with it, its quantity
// grows by r.Qty; otherwise a new line is made. Errors wrap ErrInvalid
// (with an *InvalidError) when r breaks a rule or disagrees with the
// stocked line.
func (db *DB) AddResistor(ctx context.Context, r Resistor) (AddResult, error) {
	def := r.WithDefaults()
	return db.add(ctx, "resistor", def.Validate(), func(p *putter) (putResult, error) {
		return p.putResistor(ctx, r, def, false)
	})
}

// AddTransistor stocks t (defaults filled in): when a line with the same
// label is in the same bin and every datasheet value, note and tag t gives
// agrees with it, its quantity grows by t.Qty; otherwise a new line is
// made. A disagreement is an *InvalidError naming each value.
func (db *DB) AddTransistor(ctx context.Context, t Transistor) (AddResult, error) {
	def := t.WithDefaults()
	return db.add(ctx, "transistor", def.Validate(), func(p *putter) (putResult, error) {
		return p.putTransistor(ctx, t, def, false)
	})
}

// unionTags returns the tags in a or b (both sorted), each once.
func unionTags(a, b []string) []string {
	return NormalizeTags(append(append([]string(nil), a...), b...))
}
