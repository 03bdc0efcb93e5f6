package stockcmd

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/stockcsv"
	"biasbin/store"
)

// ImportOptions are the arguments of `stock import`.
type ImportOptions struct {
	IO *cmdutil.IOStreams
	// Store opens the stock to write, creating it on first use.
	Store StoreFunc
	// ReadStore opens an existing stock only; a dry run uses it, so that
	// checking a file never creates the stock file.
	ReadStore StoreFunc
	JSON      bool

	File    string // "-" reads standard input
	DryRun  bool
	Replace bool
}

func newImportCmd(f *cmdutil.Factory, runF func(*ImportOptions) error) *cobra.Command {
	o := &ImportOptions{IO: f.IO, Store: f.Store, ReadStore: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "import FILE.csv",
		Short: "Load a CSV file of resistors or transistors, all or nothing",
		Long: fmt.Sprintf(`Load a CSV file into the stock in one transaction: if any row is bad,
nothing is written and every bad row is reported as FILE:LINE: column:
problem. The header row decides the kind.

Resistor columns: value,tolerance,power,qty,bin required;
tcr,tech,knee_c,max_c,tags,note optional.
Transistor columns: label,polarity,hfe_min,hfe_max,qty required;
hfe_typ,hfe_at,vbe,vbe_at,vce_sat,vceo,ic_max,pd,theta_ja,tj_max,vaf,icbo,
bin,tags,note optional. Tags are separated by ';'.

Values may be in any notation (4K7, 4.7k, 1%%, J, 250mW, 1/4W, 2mA ...).
A cell a spreadsheet would read as a formula may be written with a leading
' (as export writes it); the ' is taken off.

A row for a part already stocked (same value, tolerance, power, technology
and bin; or same label in any letter case and bin) adds its quantity to
that line, under the stocked spelling, only when every value it gives
agrees with the line; it may add tags and fill in a note the line lacks.
Any other difference is a bad row (FILE:LINE: column: stocked line #N
has ...). --replace makes the line take the row's quantity, note, tags
and values instead, and lists each value it rewrites. FILE "-" reads
standard input.

Limits: a cell at most %d characters, a row at most %d bytes, at most
%d rows per file, at most %d parts per stock line; reading stops after
%d problems. The file is checked whole before the stock is opened, then
written in one transaction.

--dry-run writes nothing and shows what would change. When there is no
stock file yet it checks the rows against an empty stock and does not
create the file either.`, stockcsv.MaxFieldChars, stockcsv.MaxRowBytes, stockcsv.MaxRows, store.MaxQty,
			stockcsv.MaxProblems),
		Example: `  biasbin stock import resistors.csv --dry-run
  biasbin stock import resistors.csv
  biasbin stock import counted.csv --replace`,
		Args: usageArgs(cobra.ExactArgs(1)),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.File = args[0]
			if runF != nil {
				return runF(o)
			}
			return runImport(cmd.Context(), o)
		},
	}
	fl := cmd.Flags()
	fl.BoolVar(&o.DryRun, "dry-run", false, "check everything and say what would change, write nothing")
	fl.BoolVar(&o.Replace, "replace", false, "set the quantity of lines already stocked instead of adding to it")
	fl.BoolVar(&o.JSON, "json", false, "print the summary as JSON")
	return cmd
}

// importResult is the --json output of stock import.
type importResult struct {
	File    string `json:"file"`
	Kind    string `json:"kind"`
	Rows    int    `json:"rows"`
	Added   int    `json:"added"`
	Merged  int    `json:"merged"`
	DryRun  bool   `json:"dry_run"`
	Replace bool   `json:"replace"`
	// Changed counts the values of stocked lines --replace rewrites;
	// Changes lists the first of them.
	Changed int            `json:"changed"`
	Changes []importChange `json:"changes"`
}

func runImport(ctx context.Context, o *ImportOptions) error {
	src, name, done, err := o.openSource()
	if err != nil {
		return err
	}
	defer done()
	// First pass: the whole file is checked before the stock is opened,
	// so a bad file never creates or locks the stock.
	sum, err := src.scan(func(stockcsv.Row) error { return nil })
	if err != nil {
		return reportFileError(o.IO.ErrOut, name, err)
	}
	db, closeDB, err := o.openStore(ctx)
	if err != nil {
		return err
	}
	defer closeDB()
	// Second pass: the rows go into one transaction as they are read.
	var lines []int
	res, err := db.ImportEach(ctx, store.ImportOptions{Replace: o.Replace, DryRun: o.DryRun},
		func(it *store.ImportTx) error {
			_, err := src.scan(func(row stockcsv.Row) error {
				i := len(lines)
				lines = append(lines, row.Line)
				if row.Kind == store.KindResistor {
					return it.Resistor(ctx, i, row.Resistor)
				}
				return it.Transistor(ctx, i, row.Transistor)
			})
			return err
		})
	if err != nil {
		return reportFileError(o.IO.ErrOut, name, stockcsv.Explain(name, lines, err))
	}
	return o.report(name, sum, lines, res)
}

// report prints what the import did (or would do).
func (o *ImportOptions) report(name string, sum stockcsv.Summary, lines []int, res store.ImportResult) error {
	changes := make([]importChange, len(res.Changes))
	for i, c := range res.Changes {
		changes[i] = importChange{Line: lines[c.Index], LineID: c.LineID, Column: c.Field, Stocked: c.Stocked, Given: c.Given}
	}
	if o.JSON {
		return writeJSON(o.IO.Out, importResult{File: name, Kind: string(sum.Kind), Rows: sum.Rows,
			Added: res.Added, Merged: res.Merged, DryRun: o.DryRun, Replace: o.Replace,
			Changed: res.ChangeCount, Changes: changes})
	}
	merged := "added to"
	if o.Replace {
		merged = "set on"
	}
	if o.DryRun {
		merged = "would be " + merged
	}
	if _, err := fmt.Fprintf(o.IO.Out, "%s: %d %s rows: %d new lines, %d %s existing lines%s\n",
		name, sum.Rows, sum.Kind, res.Added, res.Merged, merged, dryNote(o.DryRun)); err != nil {
		return err
	}
	if res.ChangeCount == 0 {
		return nil
	}
	verb := "rewrote"
	if o.DryRun {
		verb = "would rewrite"
	}
	fmt.Fprintf(o.IO.Out, "--replace %s %d values of stocked lines:\n", verb, res.ChangeCount)
	for i, c := range changes {
		show := func(v string) string { return v }
		if res.Changes[i].Text {
			show = strconv.Quote
		}
		fmt.Fprintf(o.IO.Out, "%s:%d: %s: stocked line #%d: %s -> %s\n", name, c.Line, c.Column, c.LineID,
			show(c.Stocked), show(c.Given))
	}
	if n := res.ChangeCount - len(changes); n > 0 {
		fmt.Fprintf(o.IO.Out, "... and %d more\n", n)
	}
	return nil
}

// importChange is one value --replace rewrites, in --json output.
type importChange struct {
	Line    int    `json:"line"`
	LineID  int64  `json:"stock_line_id"`
	Column  string `json:"column"`
	Stocked string `json:"stocked"`
	Given   string `json:"given"`
}

// source is the file being imported, readable twice.
type source struct {
	name string
	open func() (io.Reader, error)
}

func (s source) scan(each func(stockcsv.Row) error) (stockcsv.Summary, error) {
	r, err := s.open()
	if err != nil {
		return stockcsv.Summary{}, fmt.Errorf("read %s: %w", s.name, err)
	}
	return stockcsv.Scan(r, s.name, each)
}

// openSource opens the file to import so that it can be read twice: a
// regular file is read from its start again; standard input, a pipe or a
// device is copied to a temporary file on the first pass (the limits of
// stockcsv.Scan bound the copy). done closes and removes what it opened.
func (o *ImportOptions) openSource() (src source, name string, done func(), err error) {
	var in io.Reader = o.IO.In
	name = "stdin"
	var fh *os.File
	if o.File != "-" {
		fh, err = os.Open(o.File)
		if err != nil {
			return source{}, "", nil, fmt.Errorf("import: %w", err)
		}
		fi, err := fh.Stat()
		if err != nil {
			fh.Close()
			return source{}, "", nil, fmt.Errorf("import: %w", err)
		}
		if fi.IsDir() {
			fh.Close()
			return source{}, "", nil, fmt.Errorf("import %s: is a folder, not a CSV file", o.File)
		}
		name = o.File
		if fi.Mode().IsRegular() {
			pass := 0
			return source{name: name, open: func() (io.Reader, error) {
				pass++
				if pass > 1 {
					if _, err := fh.Seek(0, io.SeekStart); err != nil {
						return nil, err
					}
				}
				return fh, nil
			}}, name, func() { fh.Close() }, nil
		}
		in = fh
	}
	spool, err := os.CreateTemp("", "biasbin-import-*.csv")
	if err != nil {
		if fh != nil {
			fh.Close()
		}
		return source{}, "", nil, fmt.Errorf("import %s: copy for a second reading: %w", name, err)
	}
	done = func() {
		spool.Close()
		os.Remove(spool.Name())
		if fh != nil {
			fh.Close()
		}
	}
	pass := 0
	return source{name: name, open: func() (io.Reader, error) {
		pass++
		if pass == 1 {
			return io.TeeReader(in, spool), nil
		}
		if _, err := spool.Seek(0, io.SeekStart); err != nil {
			return nil, err
		}
		return spool, nil
	}}, name, done, nil
}

// openStore opens the stock the import goes to; done releases what it
// opened beyond the factory's handle. A dry run never creates the stock
// file: when there is none, it runs against an empty scratch stock in a
// temporary folder that done removes, and says so on stderr.
func (o *ImportOptions) openStore(ctx context.Context) (db *store.DB, done func(), err error) {
	done = func() {}
	if !o.DryRun {
		db, err = o.Store(ctx)
		return db, done, err
	}
	db, err = o.ReadStore(ctx)
	var missing *cmdutil.NoStockFileError
	if !errors.As(err, &missing) {
		return db, done, err
	}
	dir, err := os.MkdirTemp("", "biasbin-dry-run-")
	if err != nil {
		return nil, nil, fmt.Errorf("dry run: make a folder for an empty stock: %w", err)
	}
	scratch, err := store.Open(ctx, filepath.Join(dir, "stock.db"))
	if err != nil {
		os.RemoveAll(dir)
		return nil, nil, fmt.Errorf("dry run: empty stock: %w", err)
	}
	fmt.Fprintf(o.IO.ErrOut, "no stock file at %s yet: checked against an empty stock (the import will create the file)\n",
		missing.Path)
	return scratch, func() { scratch.Close(); os.RemoveAll(dir) }, nil
}

func dryNote(dry bool) string {
	if dry {
		return " (dry run: nothing written)"
	}
	return ""
}

// reportFileError writes each FILE:LINE problem on its own line to w and
// returns a short error for the exit status; other errors pass through.
func reportFileError(w io.Writer, name string, err error) error {
	var fe *stockcsv.FileError
	if !errors.As(err, &fe) {
		return fmt.Errorf("import %s: %w", name, err)
	}
	fmt.Fprintln(w, fe.Error())
	n := len(fe.Problems)
	plural := "s"
	if n == 1 {
		plural = ""
	}
	return fmt.Errorf("import %s: %d problem%s; nothing was imported", name, n, plural)
}
