package picker

import (
	"errors"
	"fmt"

	"biasbin/solver"
)

// InputError is a request the picker cannot work on: Field names the
// input as the user knows it, Problem says what is wrong and Fix what
// would make it right.
type InputError struct {
	Field   string
	Problem string
	Fix     string
}

func (e *InputError) Error() string {
	if e.Fix == "" {
		return e.Field + ": " + e.Problem
	}
	return e.Field + ": " + e.Problem + "; " + e.Fix
}

func inputErr(field, fix, format string, a ...any) error {
	return &InputError{Field: field, Problem: fmt.Sprintf(format, a...), Fix: fix}
}

// withFix turns the solver's refusal of a request's value into the
// picker's, with how to fix it; other errors pass unchanged.
func withFix(err error, fix string) error {
	var ie *solver.InputError
	if errors.As(err, &ie) {
		return &InputError{Field: ie.Field, Problem: ie.Problem, Fix: fix}
	}
	return err
}
