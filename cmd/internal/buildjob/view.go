package buildjob

import (
	"context"
	"encoding/json"
	"fmt"
	"time"

	"biasbin/store"
)

// View is a build as shown: the run, the plan it was picked with, the
// parts it took (by bin) and every recorded board.
type View struct {
	ID        int64
	Candidate string
	Boards    int
	State     store.BuildState
	Created   time.Time
	// Ended is when the build was closed or cancelled; zero while open.
	Ended time.Time
	Note  string
	Plan  Plan
	// Parts are in bin order, then line.
	Parts []store.BuildPart
	// Readings are the recorded boards in board order.
	Readings []Reading
}

// Show returns build id; store.ErrNoBuild when there is none.
func Show(ctx context.Context, db *store.DB, id int64) (View, error) {
	b, err := db.Build(ctx, id)
	if err != nil {
		return View{}, err
	}
	return viewOf(b)
}

// List returns the builds, newest first (only the open ones with
// openOnly), without parts, plans or readings.
func List(ctx context.Context, db *store.DB, openOnly bool) ([]View, error) {
	bs, err := db.Builds(ctx, openOnly)
	if err != nil {
		return nil, err
	}
	out := make([]View, len(bs))
	for i, b := range bs {
		out[i] = View{ID: b.ID, Candidate: b.Candidate, Boards: b.Boards, State: b.State, Created: b.Created,
			Ended: b.Ended, Note: b.Note}
	}
	return out, nil
}

// Cancel returns an open build's parts to stock.
func Cancel(ctx context.Context, db *store.DB, id int64) error { return db.CancelBuild(ctx, id) }

// Close marks an open build finished.
func Close(ctx context.Context, db *store.DB, id int64) error { return db.CloseBuild(ctx, id) }

// viewOf reads a stored build's plan and readings.
func viewOf(b store.Build) (View, error) {
	v := View{ID: b.ID, Candidate: b.Candidate, Boards: b.Boards, State: b.State, Created: b.Created,
		Ended: b.Ended, Note: b.Note, Parts: b.Parts}
	var err error
	if v.Plan, err = decodePlan(b.Plan); err != nil {
		return View{}, fmt.Errorf("build %d: %w", b.ID, err)
	}
	for _, r := range b.Readings {
		rd := Reading{Board: r.Board, Time: r.Time, VB_V: r.VB_V, VE_V: r.VE_V, VC_V: r.VC_V, Verdict: Verdict(r.Verdict)}
		var d readingDetail
		if err := json.Unmarshal(r.Detail, &d); err != nil {
			return View{}, fmt.Errorf("build %d board %d: %w", b.ID, r.Board, err)
		}
		rd.InBand, rd.Explained, rd.Causes = d.InBand, d.Explained, d.Causes
		v.Readings = append(v.Readings, rd)
	}
	return v, nil
}
