package store

import (
	"context"
	"fmt"

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
	return db.retag(ctx, "tag", `INSERT OR IGNORE INTO part_tags (part_id, tag) VALUES (?, ?)`, id, tags)
}

// Untag removes tags from line id (tags it does not carry are ignored) and
// returns its tags afterwards.
func (db *DB) Untag(ctx context.Context, id int64, tags ...string) ([]string, error) {
	return db.retag(ctx, "untag", `DELETE FROM part_tags WHERE part_id = ? AND tag = ?`, id, tags)
}

// retag runs stmt (taking the part ID and one tag) for each tag.
func (db *DB) retag(ctx context.Context, verb, stmt string, id int64, tags []string) ([]string, error) {
	tags, err := checkTags("", tags)
	if err != nil {
		return nil, fmt.Errorf("%s part %d: %w", verb, id, err)
	}
	var out []string
	err = db.write(ctx, func(tx *sqlx.Tx) error {
		if _, err := qtyOf(ctx, tx, id); err != nil {
			return err
		}
		for _, t := range tags {
			if _, err := tx.ExecContext(ctx, stmt, id, t); err != nil {
				return domainError(err)
			}
		}
		out, err = tagsOfPart(ctx, tx, id)
		if err == nil && len(out) > MaxTags {
			return &InvalidError{Problems: []Problem{{Field: "tags",
				Msg: fmt.Sprintf("the line would carry %d tags; at most %d", len(out), MaxTags)}}}
		}
		return err
	})
	if err != nil {
		return nil, fmt.Errorf("%s part %d: %w", verb, id, err)
	}
	return out, nil
}
