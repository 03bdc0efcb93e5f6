package store

import (
	"context"
	"errors"
	"fmt"

	"github.com/jmoiron/sqlx"
)

// Batch is a set of parts to import together.
type Batch struct {
	Resistors   []Resistor
	Transistors []Transistor
}

// ImportOptions change how Import writes.
type ImportOptions struct {
	// Replace sets the quantity (and note and tags) of a line already
	// stocked instead of adding to it; each part may then appear once.
	Replace bool
	// DryRun checks and applies everything inside the transaction, then
	// rolls it back: the result says what would happen.
	DryRun bool
}

// ImportResult counts what an import did (or would do).
type ImportResult struct {
	// Added is the number of new stock lines.
	Added int
	// Merged is the number of parts that went to a line already stocked
	// (or to a line an earlier part of the same batch made).
	Merged int
}

// errDryRun rolls a dry run's transaction back.
var errDryRun = errors.New("dry run")

// Import stocks every part of b in one transaction: all or nothing. Each
// part gets its defaults filled in and is checked first; when any breaks a
// rule nothing is written and the error is an *InvalidError listing every
// problem with the part's index in its slice. A part whose identity is
// already stocked in the same bin adds to that line (see AddResistor and
// AddTransistor), or with opt.Replace sets it.
func (db *DB) Import(ctx context.Context, b Batch, opt ImportOptions) (ImportResult, error) {
	rs := make([]Resistor, len(b.Resistors))
	ts := make([]Transistor, len(b.Transistors))
	var problems []Problem
	type key struct {
		kind       Kind
		ident, bin string
	}
	first := map[key]int{}
	// check records item i's problems and, with Replace, a repeated line.
	check := func(k key, i int, ps []Problem) {
		for _, p := range ps {
			p.Index = i
			problems = append(problems, p)
		}
		if j, ok := first[k]; ok && opt.Replace {
			field := "value"
			if k.kind == KindTransistor {
				field = "label"
			}
			problems = append(problems, Problem{Kind: k.kind, Index: i, Field: field, Ref: j + 1,
				Msg: "same part and bin as an earlier one; with replace each part may appear once"})
			return
		}
		first[k] = i
	}
	for i, r := range b.Resistors {
		rs[i] = r.WithDefaults()
		check(key{KindResistor, rs[i].ident(), rs[i].Bin}, i, rs[i].Validate())
	}
	for i, t := range b.Transistors {
		ts[i] = t.WithDefaults()
		check(key{KindTransistor, ts[i].ident(), ts[i].Bin}, i, ts[i].Validate())
	}
	if len(problems) > 0 {
		return ImportResult{}, &InvalidError{Problems: problems}
	}
	var res ImportResult
	err := db.writeFor(ctx, ReasonImport, 0, func(tx *sqlx.Tx) error {
		res = ImportResult{}
		p, err := newPutter(ctx, tx)
		if err != nil {
			return err
		}
		defer p.close()
		count := func(merged bool) {
			if merged {
				res.Merged++
			} else {
				res.Added++
			}
		}
		for i, r := range rs {
			_, merged, err := p.putResistor(ctx, r, opt.Replace)
			if err != nil {
				return fmt.Errorf("resistor %d: %w", i+1, err)
			}
			count(merged)
		}
		for i, t := range ts {
			_, merged, err := p.putTransistor(ctx, t, opt.Replace)
			if err != nil {
				return fmt.Errorf("transistor %d: %w", i+1, err)
			}
			count(merged)
		}
		if opt.DryRun {
			return errDryRun
		}
		return nil
	})
	if errors.Is(err, errDryRun) {
		return res, nil
	}
	if err != nil {
		return ImportResult{}, fmt.Errorf("import: %w", err)
	}
	return res, nil
}
