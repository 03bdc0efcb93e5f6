package stockcmd

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"

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
		Long: `Load a CSV file into the stock in one transaction: if any row is bad,
nothing is written and every bad row is reported as FILE:LINE: column:
problem. The header row decides the kind.

Resistor columns: value,tolerance,power,qty,bin required;
tcr,tech,knee_c,max_c,tags,note optional.
Transistor columns: label,polarity,hfe_min,hfe_max,qty required;
hfe_typ,hfe_at,vbe,vbe_at,vce_sat,vceo,ic_max,pd,theta_ja,tj_max,vaf,icbo,
bin,tags,note optional. Tags are separated by ';'.

Values may be in any notation (4K7, 4.7k, 1%, J, 250mW, 1/4W, 2mA ...).
A part already stocked (same value, tolerance, power, technology and bin;
or same label in any letter case and bin) has the file's quantity added to
it, under the stocked spelling; --replace sets it instead. FILE "-" reads
standard input.

--dry-run writes nothing. When there is no stock file yet it checks the
rows against an empty stock and does not create the file either.`,
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
}

func runImport(ctx context.Context, o *ImportOptions) error {
	var in io.Reader = o.IO.In
	name := "stdin"
	if o.File != "-" {
		fh, err := os.Open(o.File)
		if err != nil {
			return fmt.Errorf("import: %w", err)
		}
		defer fh.Close()
		in, name = fh, o.File
	}
	file, err := stockcsv.Read(in, name)
	if err != nil {
		return reportFileError(o.IO.ErrOut, name, err)
	}
	db, done, err := o.openStore(ctx)
	if err != nil {
		return err
	}
	defer done()
	res, err := db.Import(ctx, file.Batch, store.ImportOptions{Replace: o.Replace, DryRun: o.DryRun})
	if err != nil {
		return reportFileError(o.IO.ErrOut, name, file.Explain(err))
	}
	rows := len(file.Lines)
	if o.JSON {
		return writeJSON(o.IO.Out, importResult{File: name, Kind: string(file.Kind), Rows: rows,
			Added: res.Added, Merged: res.Merged, DryRun: o.DryRun, Replace: o.Replace})
	}
	merged := "added to"
	if o.Replace {
		merged = "set on"
	}
	if o.DryRun {
		merged = "would be " + merged
	}
	_, err = fmt.Fprintf(o.IO.Out, "%s: %d %s rows: %d new lines, %d %s existing lines%s\n",
		name, rows, file.Kind, res.Added, res.Merged, merged, dryNote(o.DryRun))
	return err
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
