package stockcmd

import (
	"context"
	"fmt"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
)

// VerifyOptions are the flags of `stock verify`.
type VerifyOptions struct {
	IO    *cmdutil.IOStreams
	Store StoreFunc
	JSON  bool
}

func newVerifyCmd(f *cmdutil.Factory, runF func(*VerifyOptions) error) *cobra.Command {
	o := &VerifyOptions{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "verify",
		Short: "Check the stock file: SQLite integrity and the stock's own rules",
		Long: `Run SQLite's integrity and foreign-key checks and biasbin's own
consistency checks on the stock file. Prints "ok" or each problem; exits 1
when there is any.`,
		Args: usageArgs(cobra.NoArgs),
		RunE: func(cmd *cobra.Command, _ []string) error {
			if runF != nil {
				return runF(o)
			}
			return runVerify(cmd.Context(), o)
		},
	}
	cmd.Flags().BoolVar(&o.JSON, "json", false, `print {"ok": ..., "problems": [...]}`)
	return cmd
}

func runVerify(ctx context.Context, o *VerifyOptions) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	problems, err := db.Verify(ctx)
	if err != nil {
		return err
	}
	if o.JSON {
		if err := writeJSON(o.IO.Out, struct {
			OK       bool     `json:"ok"`
			Problems []string `json:"problems"`
		}{len(problems) == 0, nonNil(problems)}); err != nil {
			return err
		}
	} else if len(problems) == 0 {
		fmt.Fprintln(o.IO.Out, "ok")
	} else {
		for _, p := range problems {
			fmt.Fprintln(o.IO.Out, p)
		}
	}
	if len(problems) > 0 {
		return fmt.Errorf("stock file has %d problems", len(problems))
	}
	return nil
}
