package store

import (
	"errors"
	"fmt"
	"strings"

	"modernc.org/sqlite"
	sqlite3 "modernc.org/sqlite/lib"
)

var (
	// ErrNotFound means no stock line has the given ID or label.
	ErrNotFound = errors.New("no such part in stock")
	// ErrBelowZero means a change would take a quantity below zero; the
	// stock is left unchanged.
	ErrBelowZero = errors.New("not enough in stock")
	// ErrNewerSchema means the database was written by a newer biasbin; it
	// is left untouched.
	ErrNewerSchema = errors.New("stock file was written by a newer biasbin")
	// ErrInvalid means a part's values break a rule of the stock (see
	// InvalidError for the details).
	ErrInvalid = errors.New("invalid part")
	// ErrNoFile means OpenExisting found no stock file at the path; nothing
	// was created.
	ErrNoFile = errors.New("no stock file")
	// ErrAmbiguousLabel means a label names stock lines that spell it
	// differently (see AmbiguousLabelError).
	ErrAmbiguousLabel = errors.New("label is stocked in more than one spelling")
	// ErrNotWAL means SQLite refused write-ahead logging for the file.
	ErrNotWAL = errors.New("stock file cannot use write-ahead logging")
)

// Problem is one rule a part breaks. Index is the part's position in the
// slice given to Import (or 0 for a single part), Field the CSV column
// name the value comes from. Ref, when not 0, is 1 + the index of another
// part of the same slice the problem is about (an earlier duplicate).
type Problem struct {
	Kind  Kind
	Index int
	Field string
	Msg   string
	Ref   int
}

func (p Problem) String() string { return p.Field + ": " + p.Msg }

// InvalidError lists every problem found in the parts given; errors.Is(err,
// ErrInvalid) holds.
type InvalidError struct {
	Problems []Problem
	// More counts problems found after the list was full
	// (MaxImportProblems); the search stopped at the first of them.
	More int
}

func (e *InvalidError) Error() string {
	msgs := make([]string, 0, len(e.Problems))
	for i, p := range e.Problems {
		if i == 10 {
			msgs = append(msgs, fmt.Sprintf("and %d more", len(e.Problems)-10))
			break
		}
		msgs = append(msgs, p.String())
	}
	return "invalid part: " + strings.Join(msgs, "; ")
}

// Is makes errors.Is(err, ErrInvalid) true.
func (e *InvalidError) Is(target error) bool { return target == ErrInvalid }

// LabelMatch is one stock line a transistor label matched.
type LabelMatch struct {
	ID    int64  `db:"id"`
	Label string `db:"label"`
	Bin   string `db:"bin"`
}

// AmbiguousLabelError lists the lines a label matched when they spell it
// in more than one way (they differ in letter case), in ID order;
// errors.Is(err, ErrAmbiguousLabel) holds.
type AmbiguousLabelError struct {
	// Label is the label as asked for.
	Label string
	// Lines are every matching line, lowest ID first.
	Lines []LabelMatch
}

func (e *AmbiguousLabelError) Error() string {
	lines := make([]string, len(e.Lines))
	for i, l := range e.Lines {
		bin := l.Bin
		if bin == "" {
			bin = "none"
		}
		lines[i] = fmt.Sprintf("%s (ID %d, bin %s)", l.Label, l.ID, bin)
	}
	return fmt.Sprintf("transistor %q: %s: %s", e.Label, ErrAmbiguousLabel, strings.Join(lines, ", "))
}

// Is makes errors.Is(err, ErrAmbiguousLabel) true.
func (e *AmbiguousLabelError) Is(target error) bool { return target == ErrAmbiguousLabel }

// sqliteCode returns the SQLite extended result code inside err, or 0.
func sqliteCode(err error) int {
	var se *sqlite.Error
	if errors.As(err, &se) {
		return se.Code()
	}
	return 0
}

// isBusy reports SQLITE_BUSY or SQLITE_LOCKED in any extended form.
func isBusy(err error) bool {
	c := sqliteCode(err) & 0xff
	return c == sqlite3.SQLITE_BUSY || c == sqlite3.SQLITE_LOCKED
}

// domainError turns a constraint failure into a message a technician can
// act on; other errors pass through.
func domainError(err error) error {
	if err == nil {
		return nil
	}
	c := sqliteCode(err)
	if c&0xff != sqlite3.SQLITE_CONSTRAINT {
		return err
	}
	msg := err.Error()
	switch {
	case strings.Contains(msg, "at most 16 tags"):
		return fmt.Errorf("%w: a stock line carries at most %d tags", ErrInvalid, MaxTags)
	case strings.Contains(msg, "qty"):
		return fmt.Errorf("%w: a quantity cannot go below zero", ErrBelowZero)
	case strings.Contains(msg, "hfe_max >= hfe_min"):
		return fmt.Errorf("%w: hFE min is above hFE max", ErrInvalid)
	case c == sqlite3.SQLITE_CONSTRAINT_UNIQUE || c == sqlite3.SQLITE_CONSTRAINT_PRIMARYKEY:
		return fmt.Errorf("%w: that part is already stocked in that bin", ErrInvalid)
	case c == sqlite3.SQLITE_CONSTRAINT_FOREIGNKEY:
		return fmt.Errorf("%w: the part no longer exists", ErrNotFound)
	}
	return fmt.Errorf("%w: a value is out of range (%s)", ErrInvalid, msg)
}
