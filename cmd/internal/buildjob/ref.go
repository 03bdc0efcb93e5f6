package buildjob

import (
	"context"
	"fmt"
	"strconv"
	"strings"

	"biasbin/store"
)

// Ref names a build one of two ways: a pick's build ID ("b3b39a272f57c",
// kept with the pick for store.PickKeep) or a reserved build's number as
// `build list` shows it ("3" or "#3").
type Ref struct {
	Candidate string // a pick's build ID, or ""
	Build     int64  // a reserved build's number, or 0
}

// String writes the reference as the user gave it.
func (r Ref) String() string {
	if r.Candidate != "" {
		return r.Candidate
	}
	return "#" + strconv.FormatInt(r.Build, 10)
}

// ParseBuildNumber reads a reserved build's number ("3" or "#3").
func ParseBuildNumber(s string) (int64, error) {
	id, err := strconv.ParseInt(strings.TrimPrefix(strings.TrimSpace(s), "#"), 10, 64)
	if err != nil || id <= 0 {
		return 0, fmt.Errorf("build %q: want the number shown by `biasbin build list`", s)
	}
	return id, nil
}

// ParseRef reads a pick's build ID (b and twelve hex digits, as pick
// shows it) or a reserved build's number.
func ParseRef(s string) (Ref, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	if strings.HasPrefix(t, "b") {
		if _, err := strconv.ParseUint(t[1:], 16, 64); err != nil || len(t) != 13 {
			return Ref{}, fmt.Errorf("%q: want a pick's build ID (b and twelve hex digits, e.g. b3b39a272f57c) or a build number from `biasbin build list`", s)
		}
		return Ref{Candidate: t}, nil
	}
	n, err := ParseBuildNumber(s)
	if err != nil {
		return Ref{}, fmt.Errorf("%q: want a pick's build ID (e.g. b3b39a272f57c) or a build number from `biasbin build list`", s)
	}
	return Ref{Build: n}, nil
}

// PlanOf returns the plan a reference names: the kept pick's
// (store.ErrNoPick when it was never picked or is older than
// store.PickKeep) or the reserved build's (store.ErrNoBuild).
func PlanOf(ctx context.Context, db *store.DB, r Ref) (Plan, error) {
	if r.Candidate != "" {
		kept, err := db.Pick(ctx, r.Candidate)
		if err != nil {
			return Plan{}, err
		}
		return decodePlan(kept.Plan)
	}
	v, err := Show(ctx, db, r.Build)
	if err != nil {
		return Plan{}, err
	}
	return v.Plan, nil
}
