package buildjob

import (
	"context"
	"encoding/json"
	"fmt"
	"time"

	"biasbin/solver/fault"
	"biasbin/store"
)

// Verdict is what a board's readings say.
type Verdict string

const (
	// VerdictPass means VB, VE and VC each lie inside their band.
	VerdictPass Verdict = "pass"
	// VerdictOut means at least one reading lies outside its band.
	VerdictOut Verdict = "out-of-band"
)

// shownCauses is how many of the ranked faults a board keeps.
const shownCauses = 3

// Cause is one single fault that could explain a board's readings, as
// solver/fault fitted it.
type Cause struct {
	Rank int `json:"rank"`
	// Part is the position ("r1", "r2", "rc", "re") or "q" for the
	// transistor; Fault the kind (open, short, drift, be-short, leak ...).
	Part  string `json:"part"`
	Fault string `json:"fault"`
	// Ohm is the fitted value of a drifted resistor, Leak_A the fitted
	// collector-base leakage, HFE a fitted low hFE; 0 when not that kind.
	Ohm    float64 `json:"ohms,omitempty"`
	Leak_A float64 `json:"leak_a,omitempty"`
	HFE    float64 `json:"hfe,omitempty"`
	// Fit is the worst reading's deviation in units of the meter's
	// accuracy; at most 1 means every reading is matched within it.
	Fit float64 `json:"fit"`
}

// Reading is one board's bring-up record.
type Reading struct {
	Board            int
	Time             time.Time
	VB_V, VE_V, VC_V float64
	Verdict          Verdict
	// InBand says, for VB, VE and VC in that order, whether the reading
	// lies inside its band.
	InBand [3]bool
	// Explained is set when the first cause matches every reading within
	// the meter's accuracy; Causes are the best single faults, most likely
	// first (empty for a passing board).
	Explained bool
	Causes    []Cause
}

// BoardError means a board number the build does not have.
type BoardError struct {
	Build         int64
	Board, Boards int
}

func (e *BoardError) Error() string {
	return fmt.Sprintf("build %d has boards 1 to %d, not %d", e.Build, e.Boards, e.Board)
}

// readingDetail is what a board's record keeps beside the readings.
type readingDetail struct {
	InBand    [3]bool `json:"in_band"`
	Explained bool    `json:"explained"`
	Causes    []Cause `json:"causes"`
}

// Measure records the readings of board (1..boards) of build id, checks
// each against its band and, when one lies outside, ranks the single
// faults that explain them with solver/fault (the same engine as
// diagnose). A board measured again replaces its earlier record. Readings
// that cannot come from the stage (outside its rails) are a
// *fault.ReadingError and nothing is recorded.
func Measure(ctx context.Context, db *store.DB, id int64, board int, r fault.Readings) (Reading, error) {
	b, err := db.Build(ctx, id)
	if err != nil {
		return Reading{}, err
	}
	if board < 1 || board > b.Boards {
		return Reading{}, &BoardError{Build: id, Board: board, Boards: b.Boards}
	}
	if b.State == store.BuildCancelled {
		return Reading{}, &store.BuildStateError{Build: id, State: b.State, Want: "measured"}
	}
	p, err := decodePlan(b.Plan)
	if err != nil {
		return Reading{}, fmt.Errorf("build %d: %w", id, err)
	}
	rd, err := Judge(p, r)
	if err != nil {
		return Reading{}, fmt.Errorf("build %d board %d: %w", id, board, err)
	}
	rd.Board = board
	detail, err := json.Marshal(readingDetail{InBand: rd.InBand, Explained: rd.Explained, Causes: rd.Causes})
	if err != nil {
		return Reading{}, err
	}
	if err := db.RecordBoard(ctx, id, store.BoardReading{Board: board, VB_V: r.VB_V, VE_V: r.VE_V, VC_V: r.VC_V,
		Verdict: string(rd.Verdict), Detail: detail}); err != nil {
		return Reading{}, err
	}
	rd.Time = time.Now()
	return rd, nil
}

// Judge checks readings r of one board of plan p against the bands and,
// when one is out, names the likely causes.
func Judge(p Plan, r fault.Readings) (Reading, error) {
	stage := p.Build.NominalStage()
	if err := fault.CheckRails(stage, r, fault.Meter{}.WithDefaults()); err != nil {
		return Reading{}, err
	}
	rd := Reading{VB_V: r.VB_V, VE_V: r.VE_V, VC_V: r.VC_V, Verdict: VerdictPass,
		InBand: [3]bool{p.Bands.VB.Contains(r.VB_V), p.Bands.VE.Contains(r.VE_V), p.Bands.VC.Contains(r.VC_V)}}
	if rd.InBand == [3]bool{true, true, true} {
		return rd, nil
	}
	rd.Verdict = VerdictOut
	dg, err := fault.Diagnose(stage, p.Build.Device, r, fault.Settings{})
	if err != nil {
		return Reading{}, err
	}
	rd.Explained = dg.Explained
	for _, c := range dg.Faults[:min(shownCauses, len(dg.Faults))] {
		cause := Cause{Rank: c.Rank, Part: c.Fault.Position.String(), Fault: c.Fault.Kind.String(), Fit: c.Fit}
		switch c.Fault.Kind {
		case fault.Drift:
			cause.Ohm = c.Fault.Ohm
		case fault.Leak:
			cause.Leak_A = c.Fault.Leak_A
		case fault.LowHFE:
			cause.HFE = c.Fault.HFE
		}
		rd.Causes = append(rd.Causes, cause)
	}
	return rd, nil
}
