// Package root assembles the biasbin command tree.
package root

import (
	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
)

// Version is the program version printed by --version; the release build
// may override it with -ldflags "-X biasbin/cmd/internal/root.Version=...".
var Version = "0.1.0-dev"

// New builds the root command. Nothing is opened until a subcommand runs.
func New(f *cmdutil.Factory) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "biasbin",
		Short: "Bias single-transistor stages from the parts in stock",
		Long: `biasbin keeps a parts stock in a local SQLite file, searches stocked
resistors (singles and series/parallel pairs) and transistors for bias
builds, solves each build's operating point exactly over hFE spread,
tolerance, supply and temperature, and ranks the builds.

Exit status, the same for every command:
  0  the job is done
  1  the job could not be done: nothing fits, a stock line holds data the
     math refuses (the message names the line and the field), a file
     cannot be read or written, the stock file is missing
  2  a usage error: a flag or argument is wrong (the message names it)`,
		Version:       Version,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	cmd.SetOut(f.IO.Out)
	cmd.SetErr(f.IO.ErrOut)
	cmd.PersistentFlags().Var(dbFlag{&f.DBPath}, "db",
		"stock database file (default $BIASBIN_DB, else $XDG_DATA_HOME/biasbin/stock.db, else ~/.local/share/biasbin/stock.db)")
	cmd.SetFlagErrorFunc(func(_ *cobra.Command, err error) error {
		return &cmdutil.UsageError{Err: err}
	})
	// Subcommands: each package exports New(f) *cobra.Command.
	for _, sub := range subcommands(f) {
		cmd.AddCommand(sub)
	}
	cmdutil.RefuseRepeatedFlags(cmd)
	return cmd
}
