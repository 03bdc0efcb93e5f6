package stockcmd

import (
	"context"
	"fmt"
	"strings"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
)

// TagOptions are the arguments of `stock tag` and `stock untag`.
type TagOptions struct {
	IO    *cmdutil.IOStreams
	Store StoreFunc
	JSON  bool

	Add  bool // tag (true) or untag (false)
	ID   int64
	Tags []string
}

func newTagCmd(f *cmdutil.Factory, add bool, runF func(*TagOptions) error) *cobra.Command {
	o := &TagOptions{IO: f.IO, Store: f.ExistingStore, Add: add}
	use, short := "tag ID TAG...", "Attach tags (approved, rohs, reel ...) to a stock line"
	if !add {
		use, short = "untag ID TAG...", "Take tags off a stock line"
	}
	cmd := &cobra.Command{
		Use:     use,
		Short:   short,
		Example: "  biasbin stock " + strings.Fields(use)[0] + " 12 approved rohs",
		Args:    usageArgs(cobra.MinimumNArgs(2)),
		RunE: func(cmd *cobra.Command, args []string) error {
			id, err := parseID(args[0])
			if err != nil {
				return err
			}
			o.ID, o.Tags = id, args[1:]
			if runF != nil {
				return runF(o)
			}
			return runTag(cmd.Context(), o)
		},
	}
	cmd.Flags().BoolVar(&o.JSON, "json", false, "print the line's tags as JSON")
	return cmd
}

func runTag(ctx context.Context, o *TagOptions) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	var tags []string
	if o.Add {
		tags, err = db.Tag(ctx, o.ID, o.Tags...)
	} else {
		tags, err = db.Untag(ctx, o.ID, o.Tags...)
	}
	if err != nil {
		return err
	}
	if o.JSON {
		return writeJSON(o.IO.Out, struct {
			ID   int64    `json:"id"`
			Tags []string `json:"tags"`
		}{o.ID, nonNil(tags)})
	}
	_, err = fmt.Fprintf(o.IO.Out, "line %d tags: %s\n", o.ID, orDash(strings.Join(tags, ",")))
	return err
}
