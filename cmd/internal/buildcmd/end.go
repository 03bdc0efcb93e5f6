package buildcmd

import (
	"context"
	"fmt"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/cmdutil"
)

// EndOptions are the arguments of `build cancel` and `build close`.
type EndOptions struct {
	IO     *cmdutil.IOStreams
	Store  StoreFunc
	Cancel bool
	ID     int64
}

func newEndCmd(f *cmdutil.Factory, cancel bool, runF func(*EndOptions) error) *cobra.Command {
	o := &EndOptions{IO: f.IO, Store: f.ExistingStore, Cancel: cancel}
	verb, short, long := "close", "Mark an open build finished; its parts stay used",
		`Mark open build ID finished: the run is done and its parts stay used. A
closed build cannot be cancelled.`
	if cancel {
		verb, short, long = "cancel", "Call off an open build and put its parts back in stock",
			`Call off open build ID: every part it took goes back to its stock line
(ledger reason "cancel"), in one step. A build cannot be cancelled twice,
nor after it is closed.`
	}
	cmd := &cobra.Command{
		Use:     verb + " ID",
		Short:   short,
		Long:    long,
		Example: "  biasbin build " + verb + " 3",
		Args:    oneBuildID(verb),
		RunE: func(cmd *cobra.Command, args []string) error {
			id, err := parseBuildID(args[0])
			if err != nil {
				return err
			}
			o.ID = id
			if runF != nil {
				return runF(o)
			}
			return runEnd(cmd.Context(), o)
		},
	}
	return cmd
}

func runEnd(ctx context.Context, o *EndOptions) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	if o.Cancel {
		if err := buildjob.Cancel(ctx, db, o.ID); err != nil {
			return err
		}
		_, err = fmt.Fprintf(o.IO.Out, "build %d cancelled; its parts are back in stock\n", o.ID)
		return err
	}
	if err := buildjob.Close(ctx, db, o.ID); err != nil {
		return err
	}
	_, err = fmt.Fprintf(o.IO.Out, "build %d closed\n", o.ID)
	return err
}
