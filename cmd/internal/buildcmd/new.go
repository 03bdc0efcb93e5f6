package buildcmd

import (
	"context"
	"errors"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/report"
	"biasbin/solver/notation"
	"biasbin/store"
)

// NewOptions are the arguments of `build new`.
type NewOptions struct {
	IO    *cmdutil.IOStreams
	Store StoreFunc
	JSON  bool

	Candidate string
	Boards    int
	Note      string
}

func newNewCmd(f *cmdutil.Factory, runF func(*NewOptions) error) *cobra.Command {
	o := &NewOptions{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "new BUILD-ID --boards N [--note TEXT]",
		Short: "Take the parts of a picked build out of stock for N boards",
		Long: `Take the parts of build BUILD-ID (the id a pick listed) out of stock for N
boards, in one step: all parts or none. When any line holds too few, nothing
is taken and every short line is listed with its bin, what the run needs and
what the line holds. The build is refused, with the reason, when the stock
changed since the pick and the build no longer passes.`,
		Example: `  biasbin build new b3f09c1d2e4a --boards 4 --note "amp rev B"`,
		Args: func(_ *cobra.Command, args []string) error {
			if len(args) != 1 {
				return cmdutil.Usagef("build new takes one build ID from a pick, e.g. biasbin build new b3f09c1d2e4a --boards 4")
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			o.Candidate = strings.TrimSpace(args[0])
			if !cmd.Flags().Changed("boards") {
				return cmdutil.Usagef("build new: say how many boards with --boards N")
			}
			if o.Boards < 1 || o.Boards > store.MaxBoards {
				return cmdutil.Usagef("--boards %d: want 1 to %d", o.Boards, store.MaxBoards)
			}
			if runF != nil {
				return runF(o)
			}
			return runNew(cmd.Context(), o)
		},
	}
	cmd.Flags().IntVar(&o.Boards, "boards", 0, "boards in the run; every part is taken this many times (required)")
	cmd.Flags().StringVar(&o.Note, "note", "", "a note kept with the build")
	cmd.Flags().BoolVar(&o.JSON, "json", false, "print the new build as JSON (as build show --json)")
	return cmd
}

func runNew(ctx context.Context, o *NewOptions) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	res, err := buildjob.Reserve(ctx, db, buildjob.Order{Candidate: o.Candidate, Boards: o.Boards, Note: o.Note})
	if err != nil {
		return newError(o.Candidate, o.Boards, err)
	}
	if o.JSON {
		return writeJSON(o.IO.Out, showJSON(res.Build))
	}
	WriteReserved(o.IO.Out, res)
	return nil
}

// WriteReserved writes a build just taken out of stock, as build new
// prints it.
func WriteReserved(w io.Writer, res buildjob.Reserved) {
	fmt.Fprintf(w, "build %d: %d board%s of %s, parts taken out of stock\n", res.Build.ID, res.Build.Boards,
		plural(res.Build.Boards), res.Build.Candidate)
	if len(res.Changes) > 0 {
		fmt.Fprintf(w, "stock lines %s changed since the pick; solved again on the stock as it is now, the build still passes\n",
			changedLines(res.Changes))
	}
	writeParts(w, res.Build)
	writeCautions(w, "", res.Build.Plan.Cautions)
	fmt.Fprintf(w, "next: biasbin build sheet %d   (pull list and test points)\n", res.Build.ID)
}

// newError words why a build was not taken; nothing changed in each case.
func newError(candidate string, boards int, err error) error {
	var short *store.ShortageError
	var refused *buildjob.RefusedError
	switch {
	case errors.As(err, &short):
		var b strings.Builder
		fmt.Fprintf(&b, "build %s: not enough parts in stock for %d board%s; nothing was taken:\n", candidate, boards, plural(boards))
		tw := tabwriter.NewWriter(&b, 0, 0, 2, ' ', 0)
		fmt.Fprintln(tw, "  part\tbin\tline\tneeded\ton hand\tmissing")
		for _, s := range short.Shortages {
			name := s.Label
			if s.Kind == store.KindResistor {
				name = notation.FormatResistance(s.Ohm)
			}
			fmt.Fprintf(tw, "  %s\t%s\t%d\t%d\t%d\t%d\n", name, binName(s.Bin), s.Line, s.Needed, s.OnHand, s.Needed-s.OnHand)
		}
		tw.Flush()
		return errors.New(strings.TrimRight(b.String(), "\n"))
	case errors.As(err, &refused):
		var b strings.Builder
		fmt.Fprintf(&b, "build %s refused; nothing was taken:", candidate)
		for _, c := range refused.Changes {
			if c.Removed {
				fmt.Fprintf(&b, "\n  - stock line %d was removed since the pick", c.Line)
			} else {
				fmt.Fprintf(&b, "\n  - stock line %d changed since the pick (values, tags or bin)", c.Line)
			}
		}
		if refused.NotFound {
			b.WriteString("\n  - solved again on the stock as it is now, the build no longer comes up for the pick's request")
		}
		for _, f := range refused.Failing {
			fmt.Fprintf(&b, "\n  - breaks a hard limit: %s", report.Failure(f))
		}
		b.WriteString("\n  pick again to get a build from the stock as it is now")
		return errors.New(b.String())
	case errors.Is(err, store.ErrNoPick):
		return fmt.Errorf("build ID %s: no pick kept in this stock file lists it (picks are kept for %d days; a mistyped ID?): run biasbin pick again and use an id it lists", candidate, store.PickKeepDays)
	}
	return err
}

// changedLines lists the changed lines' numbers.
func changedLines(cs []buildjob.LineChange) string {
	ids := make([]string, len(cs))
	for i, c := range cs {
		ids[i] = fmt.Sprint(c.Line)
	}
	return strings.Join(ids, ", ")
}

// writeParts writes the parts a build took, by bin.
func writeParts(w io.Writer, v buildjob.View) {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "  bin\tline\tpart\tper board\ttaken")
	for _, p := range v.Parts {
		fmt.Fprintf(tw, "  %s\t%d\t%s\t%d\t%d\n", binName(p.Bin), p.Line, partName(p), p.PerBoard, p.Taken)
	}
	tw.Flush()
}

// plural returns "s" unless n is 1.
func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}
