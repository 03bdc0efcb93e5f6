package stockcmd

import (
	"context"
	"fmt"
	"regexp"
	"strconv"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/store"
)

// AdjustOptions are the arguments of `stock adjust`.
type AdjustOptions struct {
	IO    *cmdutil.IOStreams
	Store StoreFunc
	JSON  bool

	ID  int64
	N   int  // the change (+N, -N) or the new count (=N)
	Set bool // =N
}

// changeArg is +N, -N or =N.
var changeArg = regexp.MustCompile(`^[-+=][0-9]+$`)

// shield marks a -N argument so the flag parser takes it as an argument.
const shield = "\x00"

func newAdjustCmd(f *cmdutil.Factory, runF func(*AdjustOptions) error) *cobra.Command {
	o := &AdjustOptions{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "adjust ID (+N|-N|=N)",
		Short: "Change a line's quantity: +N put in, -N take out, =N counted",
		Long: `Change the quantity of stock line ID. +N puts N parts in, -N takes N out,
=N sets the count. A quantity never goes below zero: taking more than the
line holds is refused and changes nothing.`,
		Example: `  biasbin stock adjust 12 -4
  biasbin stock adjust 12 +100
  biasbin stock adjust 12 =37`,
		// -N would read as a flag; flags are parsed below with -N shielded.
		DisableFlagParsing: true,
		RunE: func(cmd *cobra.Command, args []string) error {
			pos, help, err := parseAdjustArgs(cmd, args)
			if err != nil {
				return err
			}
			if help {
				return cmd.Help()
			}
			if err := o.fromArgs(pos); err != nil {
				return err
			}
			if runF != nil {
				return runF(o)
			}
			return runAdjust(cmd.Context(), o)
		},
	}
	cmd.Flags().BoolVar(&o.JSON, "json", false, "print the line's new quantity as JSON")
	return cmd
}

// parseAdjustArgs parses the command's own and inherited flags with every
// -N argument shielded, and returns the positional arguments.
func parseAdjustArgs(cmd *cobra.Command, args []string) (pos []string, help bool, err error) {
	fs := pflag.NewFlagSet(cmd.Name(), pflag.ContinueOnError)
	fs.SetOutput(cmd.ErrOrStderr())
	fs.AddFlagSet(cmd.Flags())
	fs.AddFlagSet(cmd.InheritedFlags())
	shielded := make([]string, len(args))
	for i, a := range args {
		if changeArg.MatchString(a) {
			a = shield + a
		}
		shielded[i] = a
	}
	if err := fs.Parse(shielded); err != nil {
		if err == pflag.ErrHelp {
			return nil, true, nil
		}
		return nil, false, &cmdutil.UsageError{Err: err}
	}
	if h := fs.Lookup("help"); h != nil && h.Value.String() == "true" {
		return nil, true, nil
	}
	for _, a := range fs.Args() {
		pos = append(pos, strings.TrimPrefix(a, shield))
	}
	return pos, false, nil
}

func (o *AdjustOptions) fromArgs(pos []string) error {
	if len(pos) != 2 {
		return cmdutil.Usagef("adjust takes ID and a change (+N, -N or =N), e.g. biasbin stock adjust 12 -4")
	}
	id, err := parseID(pos[0])
	if err != nil {
		return err
	}
	c := pos[1]
	if !changeArg.MatchString(c) {
		return cmdutil.Usagef("change %q: want +N, -N or =N with N a whole number, e.g. -4", c)
	}
	n, err := strconv.Atoi(c[1:])
	if err != nil || n > store.MaxQty {
		return cmdutil.Usagef("change %q: N is too large", c)
	}
	o.ID, o.Set, o.N = id, c[0] == '=', n
	if c[0] == '-' {
		o.N = -n
	}
	return nil
}

func runAdjust(ctx context.Context, o *AdjustOptions) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	var before int
	if !o.JSON {
		if before, err = quantity(ctx, db, o.ID); err != nil {
			return err
		}
	}
	var qty int
	if o.Set {
		qty, err = db.SetQty(ctx, o.ID, o.N)
	} else {
		qty, err = db.Adjust(ctx, o.ID, o.N)
	}
	if err != nil {
		return err
	}
	if o.JSON {
		return writeJSON(o.IO.Out, struct {
			ID  int64 `json:"id"`
			Qty int   `json:"qty"`
		}{o.ID, qty})
	}
	what, err := describeID(ctx, db, o.ID)
	if err != nil {
		return err
	}
	_, err = fmt.Fprintf(o.IO.Out, "line %d: %s: %d -> %d\n", o.ID, what, before, qty)
	return err
}

// quantity returns the current quantity of line id.
func quantity(ctx context.Context, db *store.DB, id int64) (int, error) {
	k, err := db.KindOf(ctx, id)
	if err != nil {
		return 0, err
	}
	if k == store.KindResistor {
		r, err := db.ResistorByID(ctx, id)
		return r.Qty, err
	}
	t, err := db.TransistorByID(ctx, id)
	return t.Qty, err
}

// describeID names line id in one phrase.
func describeID(ctx context.Context, db *store.DB, id int64) (string, error) {
	k, err := db.KindOf(ctx, id)
	if err != nil {
		return "", err
	}
	if k == store.KindResistor {
		r, err := db.ResistorByID(ctx, id)
		return describeResistor(r), err
	}
	t, err := db.TransistorByID(ctx, id)
	return describeTransistor(t), err
}
