package store

import (
	"context"
	"fmt"
	"strings"

	"github.com/jmoiron/sqlx"
)

// resistorRow is one resistors row joined with its part.
type resistorRow struct {
	ID     int64   `db:"id"`
	Qty    int     `db:"qty"`
	Bin    string  `db:"bin"`
	Note   string  `db:"note"`
	Ohm    float64 `db:"ohm"`
	Tol    float64 `db:"tol"`
	RatedW float64 `db:"rated_w"`
	KneeC  float64 `db:"knee_c"`
	MaxC   float64 `db:"max_c"`
	TCR    float64 `db:"tcr_ppm_per_k"`
	Tech   string  `db:"tech"`
	LEV    float64 `db:"lev_v"`
	PN     string  `db:"part_number"`
	Ident  string  `db:"ident"`
}

func (r resistorRow) partID() int64 { return r.ID }

func (r resistorRow) part() Resistor {
	return Resistor{ID: r.ID, Ohm: r.Ohm, Tol: r.Tol, Rated_W: r.RatedW, Knee_C: r.KneeC, Max_C: r.MaxC,
		TCR_PPMPerK: r.TCR, Tech: r.Tech, LEV_V: r.LEV, PartNumber: r.PN, Qty: r.Qty, Bin: r.Bin, Note: r.Note, Tags: []string{}}
}

const resistorSelect = `SELECT p.id, p.qty, p.bin, p.note, p.ident, p.part_number, r.ohm, r.tol, r.rated_w,
	r.knee_c, r.max_c, r.tcr_ppm_per_k, r.tech, r.lev_v
	FROM parts p JOIN resistors r ON r.part_id = p.id`

// transistorRow is one transistors row joined with its part.
type transistorRow struct {
	ID       int64   `db:"id"`
	Qty      int     `db:"qty"`
	Bin      string  `db:"bin"`
	Note     string  `db:"note"`
	Ident    string  `db:"ident"`
	Label    string  `db:"label"`
	Polarity string  `db:"polarity"`
	HFEMin   float64 `db:"hfe_min"`
	HFEMax   float64 `db:"hfe_max"`
	HFETyp   float64 `db:"hfe_typ"`
	HFEAt    float64 `db:"hfe_at_a"`
	VBEOn    float64 `db:"vbe_on_v"`
	VBEAt    float64 `db:"vbe_at_a"`
	VCESat   float64 `db:"vce_sat_v"`
	VCEO     float64 `db:"vceo_v"`
	ICMax    float64 `db:"ic_max_a"`
	PD25     float64 `db:"pd25_w"`
	ThetaJA  float64 `db:"theta_ja_k_per_w"`
	TjMax    float64 `db:"tj_max_c"`
	VAF      float64 `db:"vaf_v"`
	ICBO     float64 `db:"icbo_a"`
	VBEMin   float64 `db:"vbe_min_v"`
	VBEMax   float64 `db:"vbe_max_v"`
	VAFMin   float64 `db:"vaf_min_v"`
	VAFMax   float64 `db:"vaf_max_v"`
	PN       string  `db:"part_number"`
}

func (r transistorRow) partID() int64 { return r.ID }

func (r transistorRow) part() Transistor {
	return Transistor{ID: r.ID, Label: r.Label, Polarity: r.Polarity, HFEMin: r.HFEMin, HFEMax: r.HFEMax,
		HFETyp: r.HFETyp, HFEAt_A: r.HFEAt, VBEOn_V: r.VBEOn, VBEAt_A: r.VBEAt, VCESat_V: r.VCESat,
		VCEO_V: r.VCEO, ICMax_A: r.ICMax, PD25_W: r.PD25, ThetaJA_KPerW: r.ThetaJA, TjMax_C: r.TjMax,
		VAF_V: r.VAF, ICBO_A: r.ICBO, VBEMin_V: r.VBEMin, VBEMax_V: r.VBEMax, VAFMin_V: r.VAFMin, VAFMax_V: r.VAFMax, PartNumber: r.PN, Qty: r.Qty, Bin: r.Bin, Note: r.Note, Tags: []string{}}
}

const transistorSelect = `SELECT p.id, p.qty, p.bin, p.note, p.ident, p.part_number, t.label, t.polarity, t.hfe_min,
	t.hfe_max, t.hfe_typ, t.hfe_at_a, t.vbe_on_v, t.vbe_at_a, t.vce_sat_v, t.vceo_v, t.ic_max_a,
	t.pd25_w, t.theta_ja_k_per_w, t.tj_max_c, t.vaf_v, t.icbo_a, t.vbe_min_v, t.vbe_max_v, t.vaf_min_v, t.vaf_max_v
	FROM parts p JOIN transistors t ON t.part_id = p.id`

// filterSQL returns the WHERE clause (starting with " WHERE") and its
// arguments for f.
func filterSQL(f Filter) (string, []any) {
	var conds []string
	var args []any
	if f.Bin != "" {
		conds = append(conds, "p.bin = ?")
		args = append(args, strings.TrimSpace(f.Bin))
	}
	for _, t := range NormalizeTags(f.Tags) {
		conds = append(conds, "EXISTS (SELECT 1 FROM part_tags g WHERE g.part_id = p.id AND g.tag = ?)")
		args = append(args, t)
	}
	if len(conds) == 0 {
		return "", nil
	}
	return " WHERE " + strings.Join(conds, " AND "), args
}

// tagsOf returns the tags of every part of kind k, keyed by part ID, each
// list sorted.
func tagsOf(ctx context.Context, tx *sqlx.Tx, k Kind) (map[int64][]string, error) {
	rows, err := tx.QueryxContext(ctx, `SELECT g.part_id, g.tag FROM part_tags g
		JOIN parts p ON p.id = g.part_id WHERE p.kind = ? ORDER BY g.part_id, g.tag`, string(k))
	if err != nil {
		return nil, fmt.Errorf("read tags: %w", err)
	}
	defer rows.Close()
	out := map[int64][]string{}
	for rows.Next() {
		var id int64
		var tag string
		if err := rows.Scan(&id, &tag); err != nil {
			return nil, fmt.Errorf("read tags: %w", err)
		}
		out[id] = append(out[id], tag)
	}
	return out, rows.Err()
}

// tagsOfPart returns one part's tags, sorted.
func tagsOfPart(ctx context.Context, tx *sqlx.Tx, id int64) ([]string, error) {
	tags := []string{}
	if err := tx.SelectContext(ctx, &tags, `SELECT tag FROM part_tags WHERE part_id = ? ORDER BY tag`, id); err != nil {
		return nil, fmt.Errorf("read tags of part %d: %w", id, err)
	}
	return tags, nil
}
