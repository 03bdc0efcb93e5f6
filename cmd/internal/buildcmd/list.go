package buildcmd

import (
	"context"
	"fmt"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/cmdutil"
)

// ListOptions are the flags of `build list`.
type ListOptions struct {
	IO    *cmdutil.IOStreams
	Store StoreFunc
	Open  bool
	JSON  bool
}

func newListCmd(f *cmdutil.Factory, runF func(*ListOptions) error) *cobra.Command {
	o := &ListOptions{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "list [--open] [--json]",
		Short: "List the builds, newest first",
		Args:  noArgs("build list"),
		RunE: func(cmd *cobra.Command, _ []string) error {
			if runF != nil {
				return runF(o)
			}
			return runList(cmd.Context(), o)
		},
	}
	cmd.Flags().BoolVar(&o.Open, "open", false, "only the open builds")
	cmd.Flags().BoolVar(&o.JSON, "json", false, `print {"builds": [{id, candidate, boards, state, created, note}]}`)
	return cmd
}

func runList(ctx context.Context, o *ListOptions) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	vs, err := buildjob.List(ctx, db, o.Open)
	if err != nil {
		return err
	}
	if o.JSON {
		out := struct {
			Builds []jsonBuild `json:"builds"`
		}{Builds: []jsonBuild{}}
		for _, v := range vs {
			out.Builds = append(out.Builds, listJSON(v))
		}
		return writeJSON(o.IO.Out, out)
	}
	if len(vs) == 0 {
		fmt.Fprintln(o.IO.Out, "no builds")
		return nil
	}
	tw := tabwriter.NewWriter(o.IO.Out, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "BUILD\tSTATE\tBOARDS\tCREATED (UTC)\tBUILD ID\tNOTE")
	for _, v := range vs {
		fmt.Fprintf(tw, "%d\t%s\t%d\t%s\t%s\t%s\n", v.ID, v.State, v.Boards, v.Created.UTC().Format("2006-01-02 15:04"),
			v.Candidate, v.Note)
	}
	return tw.Flush()
}
