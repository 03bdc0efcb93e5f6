package stockcmd

import (
	"context"
	"fmt"
	"io"
	"os"
	"path/filepath"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/stockcsv"
	"biasbin/store"
)

// ExportOptions are the arguments of `stock export`.
type ExportOptions struct {
	IO    *cmdutil.IOStreams
	Store StoreFunc
	// StockPath names the stock file (Factory.ResolveDBPath), so that an
	// export onto it or its -wal or -shm is refused.
	StockPath func() (string, error)

	Kind string
	File string // "" writes standard output
}

func newExportCmd(f *cmdutil.Factory, runF func(*ExportOptions) error) *cobra.Command {
	o := &ExportOptions{IO: f.IO, Store: f.ExistingStore, StockPath: f.ResolveDBPath}
	cmd := &cobra.Command{
		Use:   "export --kind resistor|transistor [FILE]",
		Short: "Write one kind's stock as CSV in the import format",
		Long: `Write the resistor or transistor stock as CSV with every import column, to
FILE or standard output. Importing the file into an empty stock gives the
same stock back.

FILE is written whole to a temporary file beside it and then renamed into
place, so a failed export leaves any earlier FILE as it was. FILE may not
be the stock file itself or its -wal, -shm or -journal (under any
spelling or link). Text cells starting with = + - @ tab or carriage
return get a leading ' so that a spreadsheet shows them as text; import
takes the ' off again.`,
		Example: `  biasbin stock export --kind resistor > resistors.csv
  biasbin stock export --kind transistor transistors.csv`,
		Args: usageArgs(cobra.MaximumNArgs(1)),
		RunE: func(cmd *cobra.Command, args []string) error {
			k, err := parseKind(o.Kind, false)
			if err != nil {
				return err
			}
			o.Kind = string(k)
			if len(args) == 1 {
				o.File = args[0]
			}
			if runF != nil {
				return runF(o)
			}
			return runExport(cmd.Context(), o)
		},
	}
	cmd.Flags().StringVar(&o.Kind, "kind", "", "resistor or transistor (required)")
	return cmd
}

func runExport(ctx context.Context, o *ExportOptions) error {
	if o.File != "" && o.StockPath != nil {
		dbPath, err := o.StockPath()
		if err != nil {
			return err
		}
		if store.IsStockFile(dbPath, o.File) {
			return cmdutil.Usagef("export: %s is the stock file %s (or one SQLite keeps beside it): "+
				"writing there would destroy the stock; name another file", o.File, dbPath)
		}
	}
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	write := func(w io.Writer) error {
		if o.Kind == string(store.KindResistor) {
			rs, err := db.ListResistors(ctx, store.Filter{})
			if err != nil {
				return err
			}
			return stockcsv.WriteResistors(w, rs)
		}
		ts, err := db.ListTransistors(ctx, store.Filter{})
		if err != nil {
			return err
		}
		return stockcsv.WriteTransistors(w, ts)
	}
	if o.File == "" {
		return write(o.IO.Out)
	}
	return writeFileAtomic(o.File, write)
}

// writeFileAtomic writes a temporary file beside path and renames it into
// place, so an interrupted export never leaves half a file. A symbolic
// link at path is written through (the link stays); the file keeps its
// permissions, a new one gets 0644.
func writeFileAtomic(path string, write func(io.Writer) error) error {
	if real, err := filepath.EvalSymlinks(path); err == nil {
		path = real
	}
	mode := os.FileMode(0o644)
	if fi, err := os.Stat(path); err == nil {
		switch {
		case fi.IsDir():
			return fmt.Errorf("export %s: is a folder; name a file in it", path)
		case !fi.Mode().IsRegular():
			// A device or pipe (/dev/stdout, a FIFO) is written as it is:
			// there is no file to replace.
			return writeDevice(path, write)
		}
		mode = fi.Mode().Perm()
	}
	if fi, err := os.Stat(filepath.Dir(path)); err != nil || !fi.IsDir() {
		return fmt.Errorf("export %s: there is no folder %s", path, filepath.Dir(path))
	}
	tmp, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".*")
	if err != nil {
		return fmt.Errorf("export %s: %w", path, err)
	}
	defer os.Remove(tmp.Name())
	if err := write(tmp); err != nil {
		tmp.Close()
		return fmt.Errorf("export %s: %w", path, err)
	}
	if err := tmp.Chmod(mode); err != nil {
		tmp.Close()
		return fmt.Errorf("export %s: %w", path, err)
	}
	if err := tmp.Sync(); err != nil {
		tmp.Close()
		return fmt.Errorf("export %s: %w", path, err)
	}
	if err := tmp.Close(); err != nil {
		return fmt.Errorf("export %s: %w", path, err)
	}
	if err := os.Rename(tmp.Name(), path); err != nil {
		return fmt.Errorf("export %s: %w", path, err)
	}
	return nil
}

// writeDevice writes to a device or pipe that is already there.
func writeDevice(path string, write func(io.Writer) error) error {
	fh, err := os.OpenFile(path, os.O_WRONLY, 0)
	if err != nil {
		return fmt.Errorf("export %s: %w", path, err)
	}
	if err := write(fh); err != nil {
		fh.Close()
		return fmt.Errorf("export %s: %w", path, err)
	}
	if err := fh.Close(); err != nil {
		return fmt.Errorf("export %s: %w", path, err)
	}
	return nil
}
