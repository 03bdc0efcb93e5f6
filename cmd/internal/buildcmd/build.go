// Package buildcmd implements `biasbin build ...`: take the parts of a
// picked build out of stock for a run, list and show builds, cancel or
// close them, print the pull sheet and record each board's bring-up
// readings. The work is done by cmd/internal/buildjob; this package turns
// flags into its requests and renders what comes back.
package buildcmd

import (
	"context"
	"io"
	"strconv"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/solver/notation"
	"biasbin/store"
)

// StoreFunc opens the stock database (Factory.ExistingStore: every build
// command works on an existing stock file).
type StoreFunc func(ctx context.Context) (*store.DB, error)

// New returns the build command with its subcommands.
func New(f *cmdutil.Factory) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "build",
		Short: "Take a picked build's parts out of stock for a run, and track the run",
		Long: `Commit to a build from a pick: "build new ID --boards N" takes the parts for
N boards out of stock in one step (all or none) and records the build.
Every change of a quantity is a row of the ledger ("biasbin ledger").

A pick keeps the builds it lists in the stock file for ` + strconv.Itoa(store.PickKeepDays) + ` days so that their
IDs can be built later. When a stock line the build draws on has changed
since the pick (other values, tags or bin), the build is solved again on
the stock as it is now and refused, with the reason, unless it still passes
every hard limit; a line removed since the pick refuses it too.

Then: "build show" and "build sheet" print the pull list by bin with the
voltages each board should measure, "build measure" records a board's
readings and names the likely cause of one out of its band, and "build
close" ends the run ("build cancel" returns the parts instead).`,
		Args: noArgs("build"),
		RunE: func(cmd *cobra.Command, _ []string) error { return cmd.Help() },
	}
	cmd.AddCommand(
		newNewCmd(f, nil),
		newListCmd(f, nil),
		newShowCmd(f, nil),
		newEndCmd(f, true, nil),
		newEndCmd(f, false, nil),
		newSheetCmd(f, nil),
		newMeasureCmd(f, nil),
	)
	return cmd
}

// parseBuildID reads a build number as build list shows it.
func parseBuildID(s string) (int64, error) {
	id, err := buildjob.ParseBuildNumber(s)
	if err != nil {
		return 0, &cmdutil.UsageError{Err: err}
	}
	return id, nil
}

// oneBuildID is the argument check of the commands that take one build.
func oneBuildID(verb string) cobra.PositionalArgs {
	return func(_ *cobra.Command, args []string) error {
		if len(args) != 1 {
			return cmdutil.Usagef("build %s takes one build number, e.g. biasbin build %s 3", verb, verb)
		}
		return nil
	}
}

// writeJSON writes v as every --json output is written.
func writeJSON(w io.Writer, v any) error { return cmdutil.WriteJSON(w, v) }

// binName shows an empty bin as "-".
func binName(b string) string {
	if b == "" {
		return "-"
	}
	return b
}

// partName names a build part: a resistor by its value, a transistor by
// its label.
func partName(p store.BuildPart) string {
	if p.Kind == store.KindResistor {
		return notation.FormatResistanceExact(p.Ohm)
	}
	return p.Label
}

// noArgs refuses positional arguments as a usage error.
func noArgs(path string) cobra.PositionalArgs {
	return func(_ *cobra.Command, args []string) error {
		if len(args) > 0 {
			return cmdutil.Usagef("%s takes no arguments (got %q)", path, args[0])
		}
		return nil
	}
}
