// Package democmd implements `biasbin demo`: the whole job on an invented
// parts wall, in a throwaway stock file.
package democmd

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/pickcmd"
	"biasbin/cmd/internal/picture"
	"biasbin/cmd/internal/stockcsv"
	"biasbin/cmd/internal/stockparts"
	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/store"
)

// Options are the demo command's inputs.
type Options struct {
	IO *cmdutil.IOStreams
	// Keep, when not empty, is where the demo stock file is made and left
	// for exploring; otherwise it lives in a temporary folder removed at
	// the end.
	Keep string
	// Plot, when not empty, is where the load-line picture of the first
	// pick's best build is drawn (.svg, .png or .pdf).
	Plot string
}

// New returns the demo command.
func New(f *cmdutil.Factory) *cobra.Command {
	o := &Options{IO: f.IO}
	cmd := &cobra.Command{
		Use:   "demo",
		Short: "Run the whole job on an invented parts wall",
		Long: `Stock a throwaway database with an invented parts wall (carbon and metal
film resistors in E6/E12/E24 values, 5 % and 1 %, 1/4 W and 1/2 W, a few NPN
and PNP types; some drawers nearly empty) through the normal CSV import,
then run eight picks: a plain build, one from a sparse approved list where
pairs fill the gaps, a run larger than the stock can supply, a
collector-feedback stage, a split-supply stage on ±12 V, --topology any
choosing between them, a repair that keeps the board's divider (--keep),
and a 24 V driver whose hot parts each get a caution in plain words. Then it
commits the first pick's best build (the parts leave the demo stock) and
records two boards' bring-up readings, one of them out of its band with
the likely cause named, and shows the build's ledger rows. Last, a repair
bench on an invented unit: a dead transistor replaced from the wall
(substitute) and a faulty stage found from its voltages (diagnose).

Your own stock is never touched. With --keep PATH the demo stock stays at
PATH so you can try commands on it: biasbin --db PATH stock list.`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			return Run(cmd.Context(), o)
		},
	}
	cmd.Flags().StringVar(&o.Keep, "keep", "", "make the demo stock file at `PATH` and keep it (must not exist yet)")
	cmd.Flags().StringVar(&o.Plot, "plot", "", "also draw the first pick's best build to `FILE` (.svg, .png or .pdf), as pick --plot does")
	return cmd
}

// Run stocks the demo wall and runs the demo picks, narrating on Out.
func Run(ctx context.Context, o *Options) error {
	if ctx == nil {
		ctx = context.Background()
	}
	if o.Plot != "" {
		if _, err := picture.FormatOf(o.Plot); err != nil {
			return cmdutil.Usagef("--plot: %v", err)
		}
	}
	path, cleanup, err := demoPath(o.Keep)
	if err != nil {
		return err
	}
	defer cleanup()

	w := o.IO.Out
	fmt.Fprintln(w, "biasbin demo: an invented parts wall in a throwaway stock file")
	if err := load(ctx, w, path); err != nil {
		return err
	}
	db, err := store.OpenExisting(ctx, path)
	if err != nil {
		return fmt.Errorf("demo stock: %w", err)
	}
	defer db.Close()
	stock, err := stockparts.Read(ctx, db)
	if err != nil {
		return fmt.Errorf("demo stock: %w", err)
	}
	var first *job.PickOutcome
	for i, sc := range scenarios() {
		out, err := runScenario(w, pickcmd.StyleFor(o.IO), stock, i+1, sc)
		if err != nil {
			return err
		}
		if i == 0 && o.Plot != "" {
			if _, err := pickcmd.DrawBuilds(o.Plot, picture.DefaultSize, out, 1); err != nil {
				return fmt.Errorf("demo: --plot: %w", err)
			}
			fmt.Fprintf(w, "\nThe load-line picture of #1 is in %s (biasbin pick ... --plot FILE draws it).\n", o.Plot)
		}
		if i == 0 {
			first = out
		}
	}
	if err := buildStep(ctx, w, db, stock, first); err != nil {
		return err
	}
	// The build took parts out: the repair bench sees the stock as it is now.
	if stock, err = stockparts.Read(ctx, db); err != nil {
		return fmt.Errorf("demo stock: %w", err)
	}
	if err := runRepair(w, stock); err != nil {
		return err
	}
	fmt.Fprintln(w)
	if o.Keep != "" {
		fmt.Fprintf(w, "The demo stock is kept at %s: try biasbin --db %s stock list\n", path, path)
	} else {
		fmt.Fprintln(w, "The demo stock file has been removed; your own stock was not touched.")
	}
	fmt.Fprintln(w, "Next: load your own drawers with biasbin stock import FILE.csv, then biasbin pick --vcc ... --ic ...")
	return nil
}

// demoPath returns the stock file to use and how to clean it up.
func demoPath(keep string) (path string, cleanup func(), err error) {
	if keep != "" {
		if _, err := os.Stat(keep); err == nil {
			return "", nil, cmdutil.Usagef("--keep %s: the file exists; the demo makes a new stock file, so give a path that does not exist yet", keep)
		} else if !errors.Is(err, os.ErrNotExist) {
			return "", nil, fmt.Errorf("--keep %s: %w", keep, err)
		}
		if err := os.MkdirAll(filepath.Dir(keep), 0o755); err != nil {
			return "", nil, fmt.Errorf("create folder for %s: %w", keep, err)
		}
		return keep, func() {}, nil
	}
	dir, err := os.MkdirTemp("", "biasbin-demo-")
	if err != nil {
		return "", nil, fmt.Errorf("make a temporary folder for the demo stock: %w", err)
	}
	return filepath.Join(dir, "stock.db"), func() { os.RemoveAll(dir) }, nil
}

// load imports the embedded wall through the same reader and store import
// that `biasbin stock import` uses.
func load(ctx context.Context, w io.Writer, path string) error {
	db, err := store.Open(ctx, path)
	if err != nil {
		return fmt.Errorf("demo stock: %w", err)
	}
	defer db.Close()
	var counts []string
	for _, name := range wallFiles {
		data, err := wall.ReadFile(name)
		if err != nil {
			return fmt.Errorf("demo wall %s: %w", name, err)
		}
		file, err := stockcsv.Read(bytes.NewReader(data), name)
		if err != nil {
			return fmt.Errorf("demo wall: %w", err)
		}
		res, err := db.Import(ctx, file.Batch, store.ImportOptions{})
		if err != nil {
			return fmt.Errorf("demo wall %s: import: %w", name, err)
		}
		counts = append(counts, fmt.Sprintf("%d %s lines", res.Added, file.Kind))
	}
	fmt.Fprintf(w, "Stocked %s (the same import as biasbin stock import).\n", strings.Join(counts, " and "))
	return nil
}

// runScenario narrates one pick and runs it as biasbin pick does, through
// the same application layer and the same text renderer, with its notes
// on the same stream so the story reads in order.
func runScenario(w io.Writer, st pickcmd.Style, stock picker.Stock, n int, sc scenario) (*job.PickOutcome, error) {
	fmt.Fprintf(w, "\n=== Pick %d: %s\n", n, sc.title)
	fmt.Fprintln(w, sc.story)
	fmt.Fprintf(w, "$ biasbin pick %s\n\n", strings.Join(sc.args, " "))
	out, err := job.Pick(stock, sc.req, picker.Pick)
	if err != nil {
		return nil, fmt.Errorf("demo pick %d: %w", n, err)
	}
	pickcmd.WriteText(w, out, st)
	pickcmd.WriteNotes(w, out)
	switch {
	case out.Fits && sc.nothingFits:
		fmt.Fprintln(w, "(this time the stock was enough after all)")
	case !out.Fits && sc.nothingFits:
		fmt.Fprintln(w, "(pick exits with status 1 here: nothing fits, and it says what to buy)")
	case !out.Fits:
		return nil, fmt.Errorf("demo pick %d: nothing fits", n)
	}
	return out, nil
}
