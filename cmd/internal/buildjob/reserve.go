package buildjob

import (
	"context"
	"errors"
	"fmt"

	"biasbin/cmd/internal/stockparts"
	"biasbin/picker"
	"biasbin/store"
)

// Order is a build to take out of stock.
type Order struct {
	// Candidate is the build ID a pick listed.
	Candidate string
	Boards    int
	Note      string
}

// Reserved is a build taken out of stock.
type Reserved struct {
	Build View
	// Changes are the lines that differ from the pick; when there are any
	// the build was re-solved on the stock as it is now and still passes.
	Changes []LineChange
}

// RefusedError means the build is not reserved because, on the stock as
// it is now, it does not pass: a line it draws on was removed, the
// re-solve no longer finds it, or it breaks a hard limit. Nothing was
// taken.
type RefusedError struct {
	Candidate string
	// Changes are the lines that differ from the pick (empty when the
	// build already broke a limit at the pick).
	Changes []LineChange
	// NotFound is set when the re-solve on the changed lines does not
	// list the build any more.
	NotFound bool
	// Failing are the hard limits the build breaks.
	Failing []picker.Failure
}

func (e *RefusedError) Error() string {
	switch {
	case e.NotFound:
		return fmt.Sprintf("build %s: the stock changed since the pick and the build is no longer found", e.Candidate)
	case len(e.Failing) > 0 && len(e.Changes) > 0:
		return fmt.Sprintf("build %s: the stock changed since the pick and the build breaks %d hard limits", e.Candidate, len(e.Failing))
	case len(e.Failing) > 0:
		return fmt.Sprintf("build %s breaks %d hard limits", e.Candidate, len(e.Failing))
	}
	return fmt.Sprintf("build %s: a stock line it draws on was removed since the pick", e.Candidate)
}

// ErrBoards means the number of boards is outside 1..store.MaxBoards.
var ErrBoards = errors.New("boards out of range")

// Reserve takes the parts of a kept pick's build out of stock for the
// order's boards, all or none. The build must be kept (store.ErrNoPick
// otherwise). When a line it draws on changed since the pick, the build is
// re-solved on the stock as it is now and refused with a *RefusedError
// unless it still passes; a build that broke a hard limit at the pick is
// refused too. When any line holds too few parts the error is a
// *store.ShortageError listing every short line, and nothing changes.
func Reserve(ctx context.Context, db *store.DB, o Order) (Reserved, error) {
	if o.Boards < 1 || o.Boards > store.MaxBoards {
		return Reserved{}, fmt.Errorf("%w: %d boards: want 1 to %d", ErrBoards, o.Boards, store.MaxBoards)
	}
	kept, err := db.Pick(ctx, o.Candidate)
	if err != nil {
		return Reserved{}, err
	}
	p, err := decodePlan(kept.Plan)
	if err != nil {
		return Reserved{}, fmt.Errorf("build %s: %w", o.Candidate, err)
	}
	now, err := stockparts.Read(ctx, db)
	if err != nil {
		return Reserved{}, err
	}
	ch := changes(p, now)
	refused := &RefusedError{Candidate: o.Candidate, Changes: ch}
	for _, c := range ch {
		if c.Removed {
			return Reserved{}, refused
		}
	}
	if len(ch) > 0 {
		c, found, err := resolve(p, now)
		if err != nil {
			return Reserved{}, fmt.Errorf("build %s: re-solve on the changed stock: %w", o.Candidate, err)
		}
		if !found {
			refused.NotFound = true
			return Reserved{}, refused
		}
		if len(c.Failing) > 0 {
			refused.Failing = c.Failing
			return Reserved{}, refused
		}
		cautions := p.Cautions
		p = PlanFor(c, p.Request, now)
		p.Cautions = cautions
	} else if len(p.Figures.Failing) > 0 {
		refused.Failing = p.Figures.Failing
		return Reserved{}, refused
	}
	plan, err := p.encode()
	if err != nil {
		return Reserved{}, err
	}
	b, err := db.Reserve(ctx, store.BuildOrder{Candidate: o.Candidate, Boards: o.Boards, Note: o.Note, Plan: plan,
		Parts: p.Uses()})
	if err != nil {
		return Reserved{}, err
	}
	v, err := viewOf(b)
	if err != nil {
		return Reserved{}, err
	}
	return Reserved{Build: v, Changes: ch}, nil
}
