package stockcsv

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strings"
	"unicode/utf8"

	"biasbin/store"
)

// File is a stock file read into parts.
type File struct {
	// Name is the file name used in messages.
	Name string
	// Kind is the kind the header row names.
	Kind store.Kind
	// Batch holds the parts; only the slice of Kind is filled.
	Batch store.Batch
	// Lines[i] is the line the i-th part starts on.
	Lines []int
}

// utf8BOM is the byte-order mark some spreadsheets write first.
var utf8BOM = []byte{0xEF, 0xBB, 0xBF}

// Read reads a whole stock file. name is used in messages. When anything
// is wrong the error is a *FileError listing every problem found.
func Read(r io.Reader, name string) (*File, error) {
	data, err := io.ReadAll(r)
	if err != nil {
		return nil, fmt.Errorf("read %s: %w", name, err)
	}
	data = bytes.TrimPrefix(data, utf8BOM)
	cr := csv.NewReader(bytes.NewReader(data))
	cr.FieldsPerRecord = -1
	cr.ReuseRecord = true
	f := &File{Name: name}
	var ps []Problem
	fail := func() (*File, error) {
		sortProblems(ps)
		return nil, &FileError{File: name, Problems: ps}
	}

	rec, err := cr.Read()
	if errors.Is(err, io.EOF) {
		ps = append(ps, Problem{Line: 1, Column: "header", Msg: "empty file: the first row must name the columns"})
		return fail()
	}
	if err != nil {
		ps = append(ps, csvProblem(err))
		return fail()
	}
	cols, hps := readHeader(rec)
	if len(hps) > 0 {
		ps = append(ps, hps...)
		return fail()
	}
	f.Kind = cols.kind
	for {
		rec, err := cr.Read()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			// A quoting error leaves the reader lost: report it and stop.
			ps = append(ps, csvProblem(err))
			break
		}
		line, _ := cr.FieldPos(0)
		if len(rec) != len(cols.names) {
			ps = append(ps, Problem{Line: line, Msg: fmt.Sprintf(
				"row has %d fields, the header has %d (a cut-off or unquoted comma?)", len(rec), len(cols.names))})
			continue
		}
		row := make(map[string]string, len(rec))
		bad := false
		for i, v := range rec {
			if !utf8.ValidString(v) {
				ps = append(ps, Problem{Line: line, Column: cols.names[i],
					Msg: "not UTF-8 text (save the file as UTF-8 CSV)"})
				bad = true
				continue
			}
			row[cols.names[i]] = v
		}
		if bad {
			continue
		}
		var rowPs []Problem
		if f.Kind == store.KindResistor {
			var r store.Resistor
			r, rowPs = ResistorFromFields(row)
			f.Batch.Resistors = append(f.Batch.Resistors, r)
		} else {
			var t store.Transistor
			t, rowPs = TransistorFromFields(row)
			f.Batch.Transistors = append(f.Batch.Transistors, t)
		}
		for _, p := range rowPs {
			p.Line = line
			ps = append(ps, p)
		}
		f.Lines = append(f.Lines, line)
	}
	if len(ps) > 0 {
		return fail()
	}
	return f, nil
}

// csvProblem turns an encoding/csv error into a Problem on its line.
func csvProblem(err error) Problem {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return Problem{Line: pe.Line, Msg: fmt.Sprintf("bad CSV at column %d: %v", pe.Column, pe.Err)}
	}
	return Problem{Line: 1, Msg: err.Error()}
}

// columns is a checked header row.
type columns struct {
	kind  store.Kind
	names []string // by position, lower-cased
}

// readHeader checks the header row: which kind, no unknown, duplicated or
// missing required columns.
func readHeader(rec []string) (columns, []Problem) {
	var ps []Problem
	add := func(msg string) { ps = append(ps, Problem{Line: 1, Column: "header", Msg: msg}) }
	names := make([]string, len(rec))
	seen := map[string]bool{}
	for i, n := range rec {
		if !utf8.ValidString(n) {
			add("not UTF-8 text (save the file as UTF-8 CSV)")
			return columns{}, ps
		}
		names[i] = strings.ToLower(strings.TrimSpace(n))
		if seen[names[i]] {
			add(fmt.Sprintf("column %q appears twice", names[i]))
		}
		seen[names[i]] = true
	}
	var kind store.Kind
	switch {
	case seen["value"] && seen["label"]:
		add("both value and label columns: a file holds either resistors (value) or transistors (label)")
		return columns{}, ps
	case seen["value"]:
		kind = store.KindResistor
	case seen["label"]:
		kind = store.KindTransistor
	default:
		add("no value or label column: cannot tell resistors (value,tolerance,power,qty,bin) " +
			"from transistors (label,polarity,hfe_min,hfe_max,qty)")
		return columns{}, ps
	}
	req, opt := Columns(kind)
	known := map[string]bool{}
	for _, c := range append(req, opt...) {
		known[c] = true
	}
	for _, n := range names {
		if !known[n] {
			add(fmt.Sprintf("unknown %s column %q (columns: %s)", kind, n, strings.Join(append(req, opt...), ",")))
		}
	}
	for _, c := range req {
		if !seen[c] {
			add(fmt.Sprintf("missing required %s column %q", kind, c))
		}
	}
	return columns{kind: kind, names: names}, ps
}
