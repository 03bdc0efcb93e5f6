package buildjob

import (
	"context"

	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/store"
)

// KeepPick keeps the plans of the builds a pick shows in the stock file
// for store.PickKeep, so that `build new ID` finds them later.
func KeepPick(ctx context.Context, db *store.DB, out *job.PickOutcome, stock picker.Stock) error {
	kept := make([]store.KeptPick, 0, len(out.Builds))
	for _, b := range out.Builds {
		p := PlanFor(b.Candidate, out.Request, stock)
		for _, c := range out.Cautions {
			if c.Build == 0 || c.Build == b.Rank {
				c.Build = 0
				p.Cautions = append(p.Cautions, c)
			}
		}
		enc, err := p.encode()
		if err != nil {
			return err
		}
		kept = append(kept, store.KeptPick{Candidate: b.ID, Plan: enc})
	}
	return db.KeepPicks(ctx, kept)
}
