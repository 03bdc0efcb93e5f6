package store

import (
	"context"
	"fmt"
	"strconv"
	"strings"

	"github.com/jmoiron/sqlx"
)

// checkTags normalizes tags and returns an *InvalidError for a bad one.
func checkTags(k Kind, tags []string) ([]string, error) {
	tags = NormalizeTags(tags)
	if len(tags) == 0 {
		return nil, &InvalidError{Problems: []Problem{{Kind: k, Field: "tags", Msg: "no tag given"}}}
	}
	var ps []Problem
	for _, t := range tags {
		if m := checkTag(t); m != "" {
			ps = append(ps, Problem{Kind: k, Field: "tags", Msg: m})
		}
	}
	if len(ps) > 0 {
		return nil, &InvalidError{Problems: ps}
	}
	return tags, nil
}

// Tag adds tags (lower-cased) to line id and returns its tags afterwards.
func (db *DB) Tag(ctx context.Context, id int64, tags ...string) ([]string, error) {
	out, err := db.TagLines(ctx, []int64{id}, tags...)
	if err != nil {
		return nil, err
	}
	return out[0], nil
}

// Untag removes tags from line id (tags it does not carry are ignored) and
// returns its tags afterwards.
func (db *DB) Untag(ctx context.Context, id int64, tags ...string) ([]string, error) {
	out, err := db.UntagLines(ctx, []int64{id}, tags...)
	if err != nil {
		return nil, err
	}
	return out[0], nil
}

// TagLines adds tags to every line of ids in one transaction (all or
// none: a missing line changes nothing) and returns each line's tags
// afterwards, in the order of ids.
func (db *DB) TagLines(ctx context.Context, ids []int64, tags ...string) ([][]string, error) {
	return db.retag(ctx, "tag", `INSERT OR IGNORE INTO part_tags (part_id, tag) VALUES (?, ?)`, ids, tags)
}

// UntagLines removes tags from every line of ids in one transaction (all
// or none) and returns each line's tags afterwards.
func (db *DB) UntagLines(ctx context.Context, ids []int64, tags ...string) ([][]string, error) {
	return db.retag(ctx, "untag", `DELETE FROM part_tags WHERE part_id = ? AND tag = ?`, ids, tags)
}

// retag runs stmt (taking the part ID and one tag) for each line and tag.
func (db *DB) retag(ctx context.Context, verb, stmt string, ids []int64, tags []string) ([][]string, error) {
	what := fmt.Sprintf("part %d", ids[0])
	if len(ids) > 1 {
		what = fmt.Sprintf("parts %s", joinIDs(ids))
	}
	tags, err := checkTags("", tags)
	if err != nil {
		return nil, fmt.Errorf("%s %s: %w", verb, what, err)
	}
	var out [][]string
	err = db.write(ctx, func(tx *sqlx.Tx) error {
		out = out[:0]
		for _, id := range ids {
			if _, err := qtyOf(ctx, tx, id); err != nil {
				return err
			}
			for _, t := range tags {
				if _, err := tx.ExecContext(ctx, stmt, id, t); err != nil {
					return domainError(err)
				}
			}
			got, err := tagsOfPart(ctx, tx, id)
			if err != nil {
				return err
			}
			if len(got) > MaxTags {
				return &InvalidError{Problems: []Problem{{Field: "tags",
					Msg: fmt.Sprintf("line %d would carry %d tags; at most %d", id, len(got), MaxTags)}}}
			}
			out = append(out, got)
		}
		return nil
	})
	if err != nil {
		return nil, fmt.Errorf("%s %s: %w", verb, what, err)
	}
	return out, nil
}

// joinIDs writes IDs as "5, 6, 7".
func joinIDs(ids []int64) string {
	s := make([]string, len(ids))
	for i, id := range ids {
		s[i] = strconv.FormatInt(id, 10)
	}
	return strings.Join(s, ", ")
}
