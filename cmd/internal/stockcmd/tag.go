package stockcmd

import (
	"biasbin/store"
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
	IDs  []int64
	Tags []string
}

func newTagCmd(f *cmdutil.Factory, add bool, runF func(*TagOptions) error) *cobra.Command {
	o := &TagOptions{IO: f.IO, Store: f.ExistingStore, Add: add}
	verb := "tag"
	short := "Attach tags (approved, rohs, reel ...) to stock lines"
	if !add {
		verb, short = "untag", "Take tags off stock lines"
	}
	var flagTags []string
	cmd := &cobra.Command{
		Use:   verb + " --tag TAG ID... | " + verb + " ID TAG...",
		Short: short,
		Long: short + `. Name the tags with --tag (repeatable) and give any number of
line IDs, or give one ID followed by its tags. All lines change or none
(a missing ID changes nothing). A tag is one word and not only digits, so
that it never reads as a line ID.`,
		Example: "  biasbin stock " + verb + " --tag approved 5 6 7\n  biasbin stock " + verb + " 12 approved rohs",
		Args:    usageArgs(cobra.MinimumNArgs(1)),
		RunE: func(cmd *cobra.Command, args []string) error {
			ids, tags := args, flagTags
			if len(flagTags) == 0 {
				if len(args) < 2 {
					return cmdutil.Usagef("give the tags with --tag and the line IDs, e.g. stock %s --tag approved 5 6 7", verb)
				}
				ids, tags = args[:1], args[1:]
			}
			o.IDs = o.IDs[:0]
			for _, a := range ids {
				id, err := parseID(a)
				if err != nil {
					if len(flagTags) == 0 {
						return err
					}
					return cmdutil.Usagef("%q is not a line ID: with --tag every argument is a line ID", a)
				}
				o.IDs = append(o.IDs, id)
			}
			for _, t := range tags {
				// a bad tag is a mistake in the command line (exit 2),
				// refused before the stock is opened
				if m := store.TagProblem(t); m != "" {
					if _, err := parseID(t); err == nil && len(flagTags) == 0 {
						m += fmt.Sprintf("; for several lines give the tags with --tag: stock %s --tag TAG ID...", verb)
					}
					return cmdutil.Usagef("%s", m)
				}
			}
			o.Tags = tags
			if runF != nil {
				return runF(o)
			}
			return runTag(cmd.Context(), o)
		},
	}
	cmd.Flags().StringSliceVar(&flagTags, "tag", nil, "tag to "+verb+" (repeatable, or comma-separated); the arguments are then line IDs")
	cmd.Flags().BoolVar(&o.JSON, "json", false, "print the lines' tags as JSON")
	return cmd
}

// tagLine is one line's tags in --json output.
type tagLine struct {
	ID   int64    `json:"id"`
	Tags []string `json:"tags"`
}

func runTag(ctx context.Context, o *TagOptions) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	var tags [][]string
	if o.Add {
		tags, err = db.TagLines(ctx, o.IDs, o.Tags...)
	} else {
		tags, err = db.UntagLines(ctx, o.IDs, o.Tags...)
	}
	if err != nil {
		return err
	}
	if o.JSON {
		if len(o.IDs) == 1 {
			return writeJSON(o.IO.Out, tagLine{o.IDs[0], nonNil(tags[0])})
		}
		out := make([]tagLine, len(o.IDs))
		for i, id := range o.IDs {
			out[i] = tagLine{id, nonNil(tags[i])}
		}
		return writeJSON(o.IO.Out, out)
	}
	for i, id := range o.IDs {
		if _, err := fmt.Fprintf(o.IO.Out, "line %d tags: %s\n", id, orDash(strings.Join(tags[i], ","))); err != nil {
			return err
		}
	}
	return nil
}
