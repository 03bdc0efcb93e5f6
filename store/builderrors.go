package store

import (
	"errors"
	"fmt"
	"strings"
)

var (
	// ErrShortage means the stock does not hold the parts a build needs;
	// nothing was taken (see ShortageError for the lines).
	ErrShortage = errors.New("not enough parts in stock for the build")
	// ErrNoBuild means no build has the given ID.
	ErrNoBuild = errors.New("no such build")
	// ErrBuildState means the build is not in a state that allows the
	// change (cancelling a closed build, say); see BuildStateError.
	ErrBuildState = errors.New("build is not open")
	// ErrHeld means an open build still holds parts of the line; see
	// HeldError.
	ErrHeld = errors.New("an open build holds this line")
	// ErrNoPick means no kept pick result has the given build ID.
	ErrNoPick = errors.New("no kept pick result has this build ID")
)

// Shortage is one line that holds fewer parts than a build needs.
type Shortage struct {
	Line  int64
	Kind  Kind
	Ohm   float64 // resistors
	Label string  // transistors
	Bin   string
	// Needed is what the build takes from the line for all its boards.
	Needed int
	// OnHand is what the line holds.
	OnHand int
}

// ShortageError lists every line a build is short of, in line order;
// errors.Is(err, ErrShortage) holds.
type ShortageError struct {
	Shortages []Shortage
}

func (e *ShortageError) Error() string {
	parts := make([]string, len(e.Shortages))
	for i, s := range e.Shortages {
		parts[i] = fmt.Sprintf("line %d needs %d, holds %d", s.Line, s.Needed, s.OnHand)
	}
	return ErrShortage.Error() + ": " + strings.Join(parts, "; ")
}

// Is makes errors.Is(err, ErrShortage) true.
func (e *ShortageError) Is(target error) bool { return target == ErrShortage }

// BuildStateError says a build cannot change because of its state;
// errors.Is(err, ErrBuildState) holds.
type BuildStateError struct {
	Build int64
	State BuildState
	// Want is what was asked: BuildClosed or BuildCancelled.
	Want BuildState
}

func (e *BuildStateError) Error() string {
	if e.State == BuildCancelled && e.Want != BuildClosed && e.Want != BuildCancelled {
		return fmt.Sprintf("build %d is cancelled: its parts went back to stock, so it cannot be %s", e.Build, e.Want)
	}
	return fmt.Sprintf("build %d is %s already; only an open build can be %s", e.Build, e.State, e.Want)
}

// Is makes errors.Is(err, ErrBuildState) true.
func (e *BuildStateError) Is(target error) bool { return target == ErrBuildState }

// HeldError names the open builds that hold a line;
// errors.Is(err, ErrHeld) holds.
type HeldError struct {
	Line   int64
	Builds []int64
}

func (e *HeldError) Error() string {
	ids := make([]string, len(e.Builds))
	for i, b := range e.Builds {
		ids[i] = fmt.Sprint(b)
	}
	return fmt.Sprintf("line %d is held by open build %s: close or cancel it first", e.Line, strings.Join(ids, ", "))
}

// Is makes errors.Is(err, ErrHeld) true.
func (e *HeldError) Is(target error) bool { return target == ErrHeld }
