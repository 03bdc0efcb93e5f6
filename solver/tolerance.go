package solver

import (
	"fmt"
	"math"
)

// MaxTolerance bounds the tolerance of a resistor and of a supply, as a
// fraction, exclusive: at ±50 % a part's low end is half its value and a
// supply given as a range has its top three times its bottom; a wider
// spread is no longer one part or one supply but a guess, and the worst
// case would swallow the design. It is the one place this rule lives: the
// solver's Validate methods, the picker's request and the commands call
// CheckTolerance.
const MaxTolerance = 0.5

// CheckTolerance returns nil for a tolerance tol (a fraction) from 0 up to,
// not including, MaxTolerance; else an *InputError naming field ("vcc_tol",
// "tolerance" ...).
func CheckTolerance(field string, tol float64) error {
	if err := checkTolerance(field, tol); err != nil {
		return err
	}
	return nil
}

// checkTolerance is CheckTolerance with the concrete error type.
func checkTolerance(field string, tol float64) *InputError {
	if !math.IsNaN(tol) && !math.IsInf(tol, 0) && tol >= 0 && tol < MaxTolerance {
		return nil
	}
	problem := fmt.Sprintf("±%.3g %%: want a tolerance from 0 to below ±%g %%", 100*tol, 100*MaxTolerance)
	if field == "vcc_tol" {
		problem += " (a supply given as a range: its top below 3 times its bottom)"
	}
	return &InputError{Field: field, Problem: problem}
}
