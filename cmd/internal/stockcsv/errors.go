package stockcsv

import (
	"errors"
	"fmt"
	"sort"
	"strings"

	"biasbin/store"
)

// Problem is one thing wrong in a file: its line (1 = the header), the
// column it is in ("" for the whole row) and what is wrong.
type Problem struct {
	Line   int
	Column string
	Msg    string
}

// FileError lists every problem found in one file. Its message has one
// FILE:LINE: column: problem line per problem.
type FileError struct {
	File     string
	Problems []Problem
}

func (e *FileError) Error() string {
	var b strings.Builder
	for i, p := range e.Problems {
		if i > 0 {
			b.WriteByte('\n')
		}
		b.WriteString(e.format(p))
	}
	return b.String()
}

func (e *FileError) format(p Problem) string {
	if p.Column == "" {
		return fmt.Sprintf("%s:%d: %s", e.File, p.Line, p.Msg)
	}
	return fmt.Sprintf("%s:%d: %s: %s", e.File, p.Line, p.Column, p.Msg)
}

// sortProblems orders problems by line, keeping each line's order.
func sortProblems(ps []Problem) {
	sort.SliceStable(ps, func(i, j int) bool { return ps[i].Line < ps[j].Line })
}

// Explain turns the store's *store.InvalidError about f's parts into a
// *FileError naming the lines; other errors come back as they are.
func (f *File) Explain(err error) error { return Explain(f.Name, f.Lines, err) }

// Explain turns the store's *store.InvalidError about the parts of file
// name into a *FileError naming the lines: lines[i] is the line part i
// starts on. Other errors come back as they are.
func Explain(name string, lines []int, err error) error {
	var ie *store.InvalidError
	if !errors.As(err, &ie) {
		return err
	}
	fe := &FileError{File: name}
	last := 0
	for _, p := range ie.Problems {
		line := 0
		if p.Index >= 0 && p.Index < len(lines) {
			line = lines[p.Index]
		}
		last = max(last, line)
		msg := p.Msg
		if p.Ref > 0 && p.Ref <= len(lines) {
			msg = fmt.Sprintf("%s (line %d)", msg, lines[p.Ref-1])
		}
		fe.Problems = append(fe.Problems, Problem{Line: line, Column: p.Field, Msg: msg})
	}
	sortProblems(fe.Problems)
	if ie.More > 0 {
		fe.Problems = append(fe.Problems, Problem{Line: last,
			Msg: fmt.Sprintf("stopped checking after %d problems", len(ie.Problems))})
	}
	return fe
}
