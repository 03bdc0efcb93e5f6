package democmd

import (
	"context"
	"fmt"
	"io"
	"math"
	"strconv"

	"biasbin/cmd/internal/buildcmd"
	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/ledgercmd"
	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/solver/fault"
	"biasbin/store"
)

// demoNote is the note the demo build carries.
const demoNote = "demo run"

// buildStep commits the best build of a pick for its boards through the
// same jobs as build new and build measure, then records two boards: one
// whose readings (invented) sit in the middle of their bands, and one
// whose collector reads the full supply, as a board with RC shorted would.
func buildStep(ctx context.Context, w io.Writer, db *store.DB, stock picker.Stock, out *job.PickOutcome) error {
	fmt.Fprintln(w, "\n=== Build: commit pick 1's best build and bring up two boards")
	fmt.Fprintln(w, `The first pick's builds were kept in the stock file under their ids. build new
takes the parts for the run out of stock in one step, all or none; then each
board's VB, VE and VC (to ground) are recorded and judged against the bands.`)
	if err := buildjob.KeepPick(ctx, db, out, stock); err != nil {
		return fmt.Errorf("demo build: %w", err)
	}
	best := out.Builds[0]
	boards := max(1, out.Request.Boards)
	fmt.Fprintf(w, "$ biasbin build new %s --boards %d --note %q\n\n", best.ID, boards, demoNote)
	res, err := buildjob.Reserve(ctx, db, buildjob.Order{Candidate: best.ID, Boards: boards, Note: demoNote})
	if err != nil {
		return fmt.Errorf("demo build: %w", err)
	}
	buildcmd.WriteReserved(w, res)
	b := res.Build.Plan.Bands
	mid := func(bd buildjob.Band) float64 { return math.Round((bd.Min_V+bd.Max_V)/2*100) / 100 }
	// The second board's collector sits at its rail, as the meter reads it.
	rail, _ := res.Build.Plan.Build.NominalStage().RailVoltage_V(solver.CollectorRail)
	boardReadings := []fault.Readings{
		{VB_V: mid(b.VB), VE_V: mid(b.VE), VC_V: mid(b.VC)},
		{VB_V: mid(b.VB), VE_V: mid(b.VE), VC_V: rail},
	}
	for i, r := range boardReadings {
		fmt.Fprintf(w, "\n$ biasbin build measure %d --board %d --vb %s --ve %s --vc %s\n", res.Build.ID, i+1,
			num(r.VB_V), num(r.VE_V), num(r.VC_V))
		rd, err := buildjob.Measure(ctx, db, res.Build.ID, i+1, r)
		if err != nil {
			return fmt.Errorf("demo build: board %d: %w", i+1, err)
		}
		buildcmd.WriteMeasured(w, res.Build.ID, rd, b)
	}
	fmt.Fprintf(w, "\n$ biasbin ledger --build %d\n", res.Build.ID)
	es, err := db.Ledger(ctx, store.LedgerFilter{Build: res.Build.ID})
	if err != nil {
		return fmt.Errorf("demo build: %w", err)
	}
	return ledgercmd.WriteText(w, es)
}

// num writes a reading as a technician would type it.
func num(v float64) string { return strconv.FormatFloat(v, 'f', -1, 64) }
