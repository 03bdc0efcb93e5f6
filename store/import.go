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
	// Replace makes a line already stocked take the part's quantity, note,
	// tags and datasheet values instead of refusing any difference; each
	// part may then appear once.
	Replace bool
	// DryRun checks and applies everything inside the transaction, then
	// rolls it back: the result says what would happen.
	DryRun bool
}

// MaxImportProblems is how many problems an import collects before it
// stops looking for more.
const MaxImportProblems = 100

// maxChanges is how many field changes ImportResult lists one by one.
const maxChanges = 1000

// ImportResult counts what an import did (or would do).
type ImportResult struct {
	// Added is the number of new stock lines.
	Added int
	// Merged is the number of parts that went to a line already stocked
	// (or to a line an earlier part of the same batch made).
	Merged int
	// Changes lists, with Replace, each value of a stocked line the import
	// rewrites (the first maxChanges of them; ChangeCount counts all).
	Changes []Change
	// ChangeCount is the number of values rewritten.
	ChangeCount int
}

// errDryRun rolls a dry run's transaction back.
var errDryRun = errors.New("dry run")

// errTooManyProblems stops an import that has found MaxImportProblems.
var errTooManyProblems = errors.New("too many problems")

// Import stocks every part of b in one transaction: all or nothing (see
// ImportEach). Parts are numbered by their index in their slice.
func (db *DB) Import(ctx context.Context, b Batch, opt ImportOptions) (ImportResult, error) {
	return db.ImportEach(ctx, opt, func(it *ImportTx) error {
		for i, r := range b.Resistors {
			if err := it.Resistor(ctx, i, r); err != nil {
				return err
			}
		}
		for i, t := range b.Transistors {
			if err := it.Transistor(ctx, i, t); err != nil {
				return err
			}
		}
		return nil
	})
}

// ImportTx takes the parts of one import, one at a time, inside its
// transaction. Memory stays flat however many parts come (with Replace it
// keeps one map entry per line touched).
type ImportTx struct {
	p        *putter
	opt      ImportOptions
	res      ImportResult
	problems []Problem
	more     int           // problems beyond MaxImportProblems
	touched  map[int64]int // with Replace: line ID -> index of the part that set it
}

// ImportEach stocks, in one transaction, every part feed hands to the
// ImportTx: all or nothing. Each part gets its defaults filled in and is
// checked, also against the stock: a part whose identity is already
// stocked in the same bin adds its quantity to that line only when every
// other value agrees (an empty note or tag list agrees with any), and no
// line may go above MaxQty. With opt.Replace the line takes the part's
// values instead, and each change is listed in the result. When any part
// breaks a rule nothing is written and the error is an *InvalidError
// listing every problem (up to MaxImportProblems) with the part's index as
// feed gave it.
//
// The write lock is taken before feed runs and held until it returns, so
// feed should not wait on a person.
func (db *DB) ImportEach(ctx context.Context, opt ImportOptions, feed func(*ImportTx) error) (ImportResult, error) {
	var it *ImportTx
	err := db.writeStream(ctx, func(tx *sqlx.Tx) error {
		if err := setCause(ctx, tx, ReasonImport, 0); err != nil {
			return err
		}
		p, err := newPutter(ctx, tx)
		if err != nil {
			return err
		}
		defer p.close()
		it = &ImportTx{p: p, opt: opt}
		if opt.Replace {
			it.touched = map[int64]int{}
		}
		if err := feed(it); err != nil && !errors.Is(err, errTooManyProblems) {
			return err
		}
		if len(it.problems) > 0 {
			return &InvalidError{Problems: it.problems, More: it.more}
		}
		if opt.DryRun {
			return errDryRun
		}
		if _, err := tx.ExecContext(ctx, `DELETE FROM ledger_cause`); err != nil {
			return fmt.Errorf("ledger cause: %w", err)
		}
		return nil
	})
	if errors.Is(err, errDryRun) {
		return it.res, nil
	}
	if err != nil {
		return ImportResult{}, fmt.Errorf("import: %w", err)
	}
	return it.res, nil
}

// problem records p for part i; errTooManyProblems once there are enough.
func (it *ImportTx) problem(i int, p Problem) error {
	if len(it.problems) >= MaxImportProblems {
		it.more++
		return errTooManyProblems
	}
	p.Index = i
	it.problems = append(it.problems, p)
	return nil
}

// Resistor checks resistor number i and stocks it.
func (it *ImportTx) Resistor(ctx context.Context, i int, r Resistor) error {
	def := r.WithDefaults()
	if ps := def.Validate(); len(ps) > 0 {
		return it.checked(i, ps)
	}
	return it.put(ctx, i, func(replace bool) (putResult, error) { return it.p.putResistor(ctx, r, def, replace) })
}

// Transistor checks transistor number i and stocks it.
func (it *ImportTx) Transistor(ctx context.Context, i int, t Transistor) error {
	def := t.WithDefaults()
	if ps := def.Validate(); len(ps) > 0 {
		return it.checked(i, ps)
	}
	return it.put(ctx, i, func(replace bool) (putResult, error) { return it.p.putTransistor(ctx, t, def, replace) })
}

// checked records the problems of part i.
func (it *ImportTx) checked(i int, ps []Problem) error {
	for _, p := range ps {
		if err := it.problem(i, p); err != nil {
			return err
		}
	}
	return nil
}

// put writes part i with put and records what it did or why it may not.
func (it *ImportTx) put(ctx context.Context, i int, put func(replace bool) (putResult, error)) error {
	res, err := put(it.opt.Replace)
	var pe *problemError
	if errors.As(err, &pe) {
		for _, p := range pe.problems {
			if err := it.problem(i, p); err != nil {
				return err
			}
		}
		return nil
	}
	if err != nil {
		return fmt.Errorf("part %d: %w", i+1, err)
	}
	if it.touched != nil && res.merged {
		if j, ok := it.touched[res.id]; ok {
			return it.problem(i, Problem{Kind: res.kind, Field: res.identField, Ref: j + 1,
				Msg: "same part and bin as an earlier one; with replace each part may appear once"})
		}
	}
	if it.touched != nil {
		it.touched[res.id] = i
	}
	if res.merged {
		it.res.Merged++
	} else {
		it.res.Added++
	}
	for _, c := range res.changes {
		c.Index = i
		it.res.ChangeCount++
		if len(it.res.Changes) < maxChanges {
			it.res.Changes = append(it.res.Changes, c)
		}
	}
	return nil
}
