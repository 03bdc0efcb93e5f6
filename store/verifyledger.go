package store

import (
	"context"
	"fmt"

	"github.com/jmoiron/sqlx"
)

// ledgerProblems checks the quantities against the ledger: every line's
// quantity is the sum of its ledger rows (a removed line's sum is 0), each
// row's qty_after is the running sum, and each build's rows take exactly
// what its parts say (and give it all back when cancelled).
func ledgerProblems(ctx context.Context, tx *sqlx.Tx) ([]string, error) {
	var out []string
	checks := []struct{ what, sql string }{
		{"quantities", `SELECT 'line ' || p.id || ': quantity ' || p.qty || ' but the ledger sums to ' || coalesce(l.s, 0)
			FROM parts p LEFT JOIN (SELECT line, sum(delta) AS s FROM ledger GROUP BY line) l ON l.line = p.id
			WHERE p.qty <> coalesce(l.s, 0) ORDER BY p.id`},
		{"removed lines", `SELECT 'line ' || line || ' is removed but the ledger sums to ' || sum(delta)
			FROM ledger WHERE line NOT IN (SELECT id FROM parts) GROUP BY line HAVING sum(delta) <> 0 ORDER BY line`},
		{"running sums", `SELECT 'ledger entry ' || id || ': line ' || line || ' quantity after ' || qty_after ||
			' but the entries so far sum to ' || s
			FROM (SELECT id, line, qty_after, sum(delta) OVER (PARTITION BY line ORDER BY id) AS s FROM ledger)
			WHERE qty_after <> s ORDER BY id`},
		{"builds", `SELECT 'build ' || b.id || ' (' || b.state || '): line ' || bp.line || ' took ' || bp.taken ||
			' for ' || b.boards || ' boards of ' || bp.per_board || ' but the ledger says ' || coalesce(-l.s, 0)
			FROM builds b JOIN build_parts bp ON bp.build = b.id
			LEFT JOIN (SELECT build, line, sum(CASE WHEN reason = 'build' THEN -delta ELSE 0 END) AS s,
			                  sum(CASE WHEN reason = 'cancel' THEN delta ELSE 0 END) AS back
			           FROM ledger WHERE build IS NOT NULL GROUP BY build, line) l
			  ON l.build = b.id AND l.line = bp.line
			WHERE bp.taken <> bp.per_board * b.boards OR coalesce(l.s, 0) <> bp.taken
			   OR coalesce(l.back, 0) <> (CASE WHEN b.state = 'cancelled' THEN bp.taken ELSE 0 END)
			ORDER BY b.id, bp.line`},
	}
	for _, c := range checks {
		var ps []string
		if err := tx.SelectContext(ctx, &ps, c.sql); err != nil {
			return nil, fmt.Errorf("ledger %s: %w", c.what, err)
		}
		out = append(out, ps...)
	}
	return out, nil
}
