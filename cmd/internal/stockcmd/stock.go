// Package stockcmd implements `biasbin stock ...`: add, list, tag, import,
// export, adjust, remove and verify the parts in stock.
package stockcmd

import (
	"context"
	"encoding/json"
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/store"
)

// StoreFunc opens the stock database: cmdutil.Factory.Store (creating the
// file on first use) for add and import, Factory.ExistingStore (an
// existing file only) for the commands that read or change stocked parts.
type StoreFunc func(ctx context.Context) (*store.DB, error)

// New returns the stock command with its subcommands.
func New(f *cmdutil.Factory) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "stock",
		Short: "Keep the parts stock: add, list, import, export, adjust, verify",
		Long: `Keep the stock of resistors and transistors in the local stock file.

Every stock line has an ID, unique across resistors and transistors, that
adjust, tag, untag and remove take. Values take the IEC 60062
letter-and-digit code (4K7, R47, 2M2) or SI (4.7k, 4700, 4.7 kΩ).`,
		Args: usageArgs(cobra.NoArgs),
		RunE: func(cmd *cobra.Command, _ []string) error { return cmd.Help() },
	}
	cmd.AddCommand(
		newAddCmd(f),
		newListCmd(f, nil),
		newTagCmd(f, true, nil),
		newTagCmd(f, false, nil),
		newImportCmd(f, nil),
		newExportCmd(f, nil),
		newAdjustCmd(f, nil),
		newRemoveCmd(f, nil),
		newVerifyCmd(f, nil),
	)
	return cmd
}

// parseID reads a part ID as shown by stock list.
func parseID(s string) (int64, error) {
	id, err := strconv.ParseInt(strings.TrimPrefix(strings.TrimSpace(s), "#"), 10, 64)
	if err != nil || id <= 0 {
		return 0, cmdutil.Usagef("part ID %q: want the number shown by `biasbin stock list`", s)
	}
	return id, nil
}

// writeJSON writes v indented, with a final newline.
func writeJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	if err := enc.Encode(v); err != nil {
		return fmt.Errorf("write JSON: %w", err)
	}
	return nil
}

// usageArgs makes an argument-count mistake a usage error (exit status 2).
func usageArgs(check cobra.PositionalArgs) cobra.PositionalArgs {
	return func(cmd *cobra.Command, args []string) error {
		if err := check(cmd, args); err != nil {
			path := strings.TrimPrefix(cmd.CommandPath(), cmd.Root().Name()+" ")
			return &cmdutil.UsageError{Err: fmt.Errorf("%s: %w", path, err)}
		}
		return nil
	}
}
