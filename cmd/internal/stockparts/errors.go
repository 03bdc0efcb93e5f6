package stockparts

import (
	"errors"
	"fmt"

	"biasbin/solver"
	"biasbin/store"
)

// LineError is a stock line whose data the solver refuses: the job cannot
// be done until the line is corrected (exit status 1, not a usage error).
type LineError struct {
	ID   int64
	Kind store.Kind
	// Part is the line's value or label, Bin its bin.
	Part string
	Bin  string
	// Field names the refused figure as the stock knows it (tolerance,
	// tcr, hfe_min ...); Problem says what is wrong with it.
	Field   string
	Problem string
}

func (e *LineError) Error() string {
	bin := e.Bin
	if bin == "" {
		bin = "-"
	}
	return fmt.Sprintf("stock line #%d (%s %s, bin %s): %s: %s; correct the line (biasbin stock remove %d, then add it again with the right figures)",
		e.ID, e.Kind, e.Part, bin, e.Field, e.Problem, e.ID)
}

// lineError names the line and field of a solver input error.
func lineError(kind store.Kind, id int64, part, bin string, err error) error {
	le := &LineError{ID: id, Kind: kind, Part: part, Bin: bin, Field: "data", Problem: err.Error()}
	var ie *solver.InputError
	if errors.As(err, &ie) {
		le.Field, le.Problem = ie.Field, ie.Problem
	}
	return le
}
