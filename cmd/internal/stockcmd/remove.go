package stockcmd

import (
	"context"
	"fmt"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
)

// RemoveOptions are the arguments of `stock remove`.
type RemoveOptions struct {
	IO    *cmdutil.IOStreams
	Store StoreFunc
	ID    int64
}

func newRemoveCmd(f *cmdutil.Factory, runF func(*RemoveOptions) error) *cobra.Command {
	o := &RemoveOptions{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:     "remove ID",
		Short:   "Delete a stock line and its tags",
		Example: "  biasbin stock remove 12",
		Args:    usageArgs(cobra.ExactArgs(1)),
		RunE: func(cmd *cobra.Command, args []string) error {
			id, err := parseID(args[0])
			if err != nil {
				return err
			}
			o.ID = id
			if runF != nil {
				return runF(o)
			}
			return runRemove(cmd.Context(), o)
		},
	}
	return cmd
}

func runRemove(ctx context.Context, o *RemoveOptions) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	what, err := describeID(ctx, db, o.ID)
	if err != nil {
		return err
	}
	if err := db.Remove(ctx, o.ID); err != nil {
		return err
	}
	_, err = fmt.Fprintf(o.IO.Out, "removed line %d: %s\n", o.ID, what)
	return err
}
