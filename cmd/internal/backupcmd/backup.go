// Package backupcmd implements `biasbin backup FILE`: a consistent copy of
// the stock file taken while others may be writing it.
package backupcmd

import (
	"context"
	"errors"
	"fmt"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/store"
)

// Options are the arguments of `backup`.
type Options struct {
	IO    *cmdutil.IOStreams
	Store func(context.Context) (*store.DB, error)
	// File is where the copy goes; it must not exist yet.
	File string
}

// New returns the backup command.
func New(f *cmdutil.Factory) *cobra.Command { return newCmd(f, nil) }

func newCmd(f *cmdutil.Factory, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "backup FILE",
		Short: "Write a consistent copy of the stock file",
		Long: `Write a copy of the stock file to FILE while other biasbin processes may
go on changing the stock: the copy is one consistent moment of it (stock,
ledger, builds, kept picks). FILE must not exist yet; it is either written
whole or not at all.

To restore, stop every biasbin process using the stock, move the stock file
aside together with its -wal and -shm files, copy the backup into its place,
and run "biasbin stock verify".`,
		Example: `  biasbin backup ~/stock-$(date +%F).db`,
		Args: func(_ *cobra.Command, args []string) error {
			if len(args) != 1 {
				return cmdutil.Usagef("backup takes one argument, the file to write, e.g. biasbin backup stock-copy.db")
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			o.File = args[0]
			if runF != nil {
				return runF(o)
			}
			return Run(cmd.Context(), o)
		},
	}
	return cmd
}

// Run writes the copy.
func Run(ctx context.Context, o *Options) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	if err := db.Backup(ctx, o.File); err != nil {
		if errors.Is(err, store.ErrBackupExists) {
			return fmt.Errorf("%w: choose a new name; nothing was written", err)
		}
		return err
	}
	_, err = fmt.Fprintf(o.IO.Out, "wrote %s\n", o.File)
	return err
}
