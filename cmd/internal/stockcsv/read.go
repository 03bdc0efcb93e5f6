package stockcsv

import (
	"bufio"
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

// Limits on what Scan and Read take (stated in `stock import --help`), so
// that any input, however large or strange, is read in bounded memory.
const (
	// MaxFieldChars is the longest cell: the store keeps bins, labels and
	// notes of up to 1000 characters.
	MaxFieldChars = 1000
	// MaxRowBytes is the longest row in bytes, line breaks inside quotes
	// included.
	MaxRowBytes = 64 << 10
	// MaxRows is the most rows one file may hold.
	MaxRows = 1_000_000
	// MaxProblems is how many problems are listed before reading stops.
	MaxProblems = store.MaxImportProblems
)

// Row is one row of a stock file that read without problems.
type Row struct {
	// Line is the line the row starts on (1 = the header).
	Line int
	// Kind is the file's kind.
	Kind store.Kind
	// Resistor or Transistor holds the part, as the file's Kind says.
	Resistor   store.Resistor
	Transistor store.Transistor
}

// Summary is what Scan saw.
type Summary struct {
	// Kind is the kind the header row names.
	Kind store.Kind
	// Rows is the number of rows (blank lines not counted).
	Rows int
}

// Read reads a whole stock file into memory. name is used in messages.
// When anything is wrong the error is a *FileError listing every problem
// found (up to MaxProblems).
func Read(r io.Reader, name string) (*File, error) {
	f := &File{Name: name}
	sum, err := Scan(r, name, func(row Row) error {
		if row.Kind == store.KindTransistor {
			f.Batch.Transistors = append(f.Batch.Transistors, row.Transistor)
		} else {
			f.Batch.Resistors = append(f.Batch.Resistors, row.Resistor)
		}
		f.Lines = append(f.Lines, row.Line)
		return nil
	})
	if err != nil {
		return nil, err
	}
	f.Kind = sum.Kind
	return f, nil
}

// Scan reads a stock file row by row and calls each for every row, in
// order, as long as no row so far had a problem; it reads on to the end
// to find every problem (up to MaxProblems). Memory stays bounded by the
// limits above whatever comes in. When anything is wrong the error is a
// *FileError; an error from each stops the scan and is returned as it is.
func Scan(r io.Reader, name string, each func(Row) error) (Summary, error) {
	var sum Summary
	lim := &rowLimit{r: r}
	br := bufio.NewReader(lim)
	if b, err := br.Peek(len(utf8BOM)); err == nil && bytes.Equal(b, utf8BOM) {
		br.Discard(len(utf8BOM))
	}
	decimalComma := semicolonHeader(br)
	cr := csv.NewReader(br)
	if decimalComma {
		cr.Comma = ';'
	}
	cr.FieldsPerRecord = -1
	cr.ReuseRecord = true
	var ps []Problem
	add := func(p Problem) bool {
		if len(ps) == MaxProblems {
			ps = append(ps, Problem{Line: p.Line, Msg: fmt.Sprintf("stopped reading after %d problems", MaxProblems)})
			return false
		}
		ps = append(ps, p)
		return true
	}
	fail := func() (Summary, error) {
		sortProblems(ps)
		return sum, &FileError{File: name, Problems: ps}
	}
	// read returns the next record, or a problem that ends the file.
	read := func(line int) ([]string, *Problem) {
		lim.mark(cr.InputOffset())
		rec, err := cr.Read()
		switch {
		case err == nil:
			return rec, nil
		case errors.Is(err, io.EOF):
			return nil, nil
		case errors.Is(err, errRowTooLong):
			return nil, &Problem{Line: line, Msg: fmt.Sprintf(
				"a row longer than %d bytes (is this a stock CSV file?); reading stopped", MaxRowBytes)}
		}
		p := csvProblem(err)
		return nil, &p
	}

	rec, p := read(1)
	if p != nil {
		add(*p)
		return fail()
	}
	if rec == nil {
		add(Problem{Line: 1, Column: "header", Msg: "empty file: the first row must name the columns"})
		return fail()
	}
	cols, hps := readHeader(unescapeAll(rec))
	if len(hps) > 0 {
		ps = append(ps, hps...)
		return fail()
	}
	sum.Kind = cols.kind
	row := make(map[string]string, len(cols.names))
	lastLine := 1
	for {
		rec, p := read(lastLine + 1)
		if p != nil {
			// A quoting error or an over-long row leaves the reader lost:
			// report it and stop.
			add(*p)
			break
		}
		if rec == nil {
			break
		}
		line, _ := cr.FieldPos(0)
		lastLine = line
		if sum.Rows == MaxRows {
			add(Problem{Line: line, Msg: fmt.Sprintf("more than %d rows: split the file", MaxRows)})
			break
		}
		sum.Rows++
		if len(rec) != len(cols.names) {
			if !add(Problem{Line: line, Msg: fmt.Sprintf(
				"row has %d fields, the header has %d (a cut-off or unquoted comma? numbers written with a decimal comma, like 4,7k, need a file with semicolons between fields, as spreadsheets export it in those locales)", len(rec), len(cols.names))}) {
				break
			}
			continue
		}
		clear(row)
		var bad []Problem
		for i, v := range rec {
			switch {
			case !utf8.ValidString(v):
				bad = append(bad, Problem{Line: line, Column: cols.names[i],
					Msg: "not UTF-8 text (save the file as UTF-8 CSV)"})
			case utf8.RuneCountInString(v) > MaxFieldChars:
				bad = append(bad, Problem{Line: line, Column: cols.names[i],
					Msg: fmt.Sprintf("longer than %d characters", MaxFieldChars)})
			case decimalComma && !textColumns[cols.names[i]]:
				row[cols.names[i]] = strings.ReplaceAll(UnescapeFormula(v), ",", ".")
			default:
				row[cols.names[i]] = UnescapeFormula(v)
			}
		}
		var rowPs []Problem
		var part Row
		if len(bad) == 0 {
			part.Line, part.Kind = line, cols.kind
			if cols.kind == store.KindResistor {
				part.Resistor, rowPs = ResistorFromFields(row)
			} else {
				part.Transistor, rowPs = TransistorFromFields(row)
			}
		}
		stop := false
		for _, p := range append(bad, rowPs...) {
			p.Line = line
			if !add(p) {
				stop = true
				break
			}
		}
		if stop {
			break
		}
		if len(ps) == 0 && each != nil {
			if err := each(part); err != nil {
				return sum, err
			}
		}
	}
	if len(ps) > 0 {
		return fail()
	}
	return sum, nil
}

// errRowTooLong stops reading a row longer than MaxRowBytes.
var errRowTooLong = errors.New("row too long")

// rowLimit passes bytes through until more than MaxRowBytes (plus what the
// CSV reader's buffer reads ahead) follow the start of the current row.
type rowLimit struct {
	r     io.Reader
	read  int64 // bytes handed out
	start int64 // offset where the current row starts
}

// readAhead covers the bytes the buffered readers hold beyond the row.
const readAhead = 2 * 4096

func (l *rowLimit) mark(offset int64) { l.start = offset }

func (l *rowLimit) Read(p []byte) (int, error) {
	room := l.start + MaxRowBytes + readAhead - l.read
	if room <= 0 {
		return 0, errRowTooLong
	}
	if int64(len(p)) > room {
		p = p[:room]
	}
	n, err := l.r.Read(p)
	l.read += int64(n)
	return n, err
}

// unescapeAll takes the formula guard off every cell of a record.
func unescapeAll(rec []string) []string {
	for i, v := range rec {
		rec[i] = UnescapeFormula(v)
	}
	return rec
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

// semicolonHeader reports whether the header row (the first line) is
// separated by semicolons and holds no comma: the CSV a spreadsheet writes
// where the comma is the decimal mark ("4,7k;5%;0,25W"). Such a file is
// read with ';' between fields and ',' as the decimal mark in every number
// column.
func semicolonHeader(br *bufio.Reader) bool {
	head, _ := br.Peek(4096)
	if i := bytes.IndexByte(head, '\n'); i >= 0 {
		head = head[:i]
	}
	return bytes.IndexByte(head, ';') >= 0 && bytes.IndexByte(head, ',') < 0
}

// textColumns are the columns of free text, where a comma is a comma.
var textColumns = map[string]bool{"bin": true, "tags": true, "note": true, "tech": true, "label": true,
	"polarity": true, "part_number": true}
