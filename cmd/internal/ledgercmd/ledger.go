// Package ledgercmd implements `biasbin ledger`: every change of a stock
// line's quantity, with its reason and build.
package ledgercmd

import (
	"context"
	"fmt"
	"io"
	"strconv"
	"strings"
	"text/tabwriter"
	"time"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/store"
)

// Options are the flags of `ledger`.
type Options struct {
	IO    *cmdutil.IOStreams
	Store func(context.Context) (*store.DB, error)
	JSON  bool

	Filter store.LedgerFilter
}

// New returns the ledger command.
func New(f *cmdutil.Factory) *cobra.Command { return newCmd(f, nil) }

func newCmd(f *cmdutil.Factory, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: f.IO, Store: f.ExistingStore}
	var line, build int64
	var since string
	cmd := &cobra.Command{
		Use:   "ledger [--line ID] [--build ID] [--since DATE] [--json]",
		Short: "List every change of a quantity: time, line, change, quantity after, reason, build",
		Long: `List the stock ledger, oldest first: one row for every change of a stock
line's quantity, with the time (UTC), the line, the change, the quantity
after it, the reason (opening, add, import, adjust, count, build, cancel,
remove) and the build it belongs to. A line's quantity is the sum of its
rows; "biasbin stock verify" checks that it is.`,
		Example: `  biasbin ledger --line 12
  biasbin ledger --build 3 --json
  biasbin ledger --since 2026-12-01`,
		Args: func(_ *cobra.Command, args []string) error {
			if len(args) > 0 {
				return cmdutil.Usagef("ledger takes no arguments, only flags (got %q)", args[0])
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, _ []string) error {
			if cmd.Flags().Changed("line") && line <= 0 {
				return cmdutil.Usagef("--line %d: want a stock line ID as shown by biasbin stock list", line)
			}
			if cmd.Flags().Changed("build") && build <= 0 {
				return cmdutil.Usagef("--build %d: want a build number as shown by biasbin build list", build)
			}
			o.Filter.Line, o.Filter.Build = line, build
			if since != "" {
				t, err := parseSince(since)
				if err != nil {
					return err
				}
				o.Filter.Since = t
			}
			if runF != nil {
				return runF(o)
			}
			return Run(cmd.Context(), o)
		},
	}
	cmd.Flags().Int64Var(&line, "line", 0, "only this stock line")
	cmd.Flags().Int64Var(&build, "build", 0, "only this build's changes")
	cmd.Flags().StringVar(&since, "since", "", "only changes at or after DATE (2026-12-01, UTC) or a time (2026-12-01T15:04:05Z)")
	cmd.Flags().BoolVar(&o.JSON, "json", false, `print {"entries": [{time, line, delta, qty_after, reason, build}]}`)
	return cmd
}

// parseSince reads a date (midnight UTC) or an RFC 3339 time.
func parseSince(s string) (time.Time, error) {
	s = strings.TrimSpace(s)
	if t, err := time.Parse("2006-01-02", s); err == nil {
		return t, nil
	}
	if t, err := time.Parse(time.RFC3339, s); err == nil {
		return t, nil
	}
	return time.Time{}, cmdutil.Usagef("--since %q: want a date like 2026-12-01 (UTC) or a time like 2026-12-01T15:04:05Z", s)
}

// jsonEntry is one ledger row in --json; build is null when the change
// belongs to no build.
type jsonEntry struct {
	Time     string `json:"time"`
	Line     int64  `json:"line"`
	Delta    int    `json:"delta"`
	QtyAfter int    `json:"qty_after"`
	Reason   string `json:"reason"`
	Build    *int64 `json:"build"`
}

// Run lists the ledger.
func Run(ctx context.Context, o *Options) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	es, err := db.Ledger(ctx, o.Filter)
	if err != nil {
		return err
	}
	if o.JSON {
		out := struct {
			Entries []jsonEntry `json:"entries"`
		}{Entries: make([]jsonEntry, 0, len(es))}
		for _, e := range es {
			je := jsonEntry{Time: e.Time.UTC().Format(store.TimeLayout), Line: e.Line, Delta: e.Delta,
				QtyAfter: e.QtyAfter, Reason: string(e.Reason)}
			if e.Build != 0 {
				b := e.Build
				je.Build = &b
			}
			out.Entries = append(out.Entries, je)
		}
		return cmdutil.WriteJSON(o.IO.Out, out)
	}
	return WriteText(o.IO.Out, es)
}

// WriteText writes ledger entries as a table, as ledger prints them.
func WriteText(w io.Writer, es []store.LedgerEntry) error {
	if len(es) == 0 {
		_, err := fmt.Fprintln(w, "no ledger entries")
		return err
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "TIME (UTC)\tLINE\tCHANGE\tQTY AFTER\tREASON\tBUILD")
	for _, e := range es {
		b := ""
		if e.Build != 0 {
			b = strconv.FormatInt(e.Build, 10)
		}
		fmt.Fprintf(tw, "%s\t%d\t%+d\t%d\t%s\t%s\n", e.Time.UTC().Format("2006-01-02 15:04:05"), e.Line, e.Delta,
			e.QtyAfter, e.Reason, b)
	}
	return tw.Flush()
}
