package notation

import (
	"errors"
	"fmt"
	"unicode/utf8"
)

// ErrSyntax is the kind of error for text that is not a value of the asked
// quantity: unexpected characters, missing digits, empty text.
var ErrSyntax = errors.New("invalid syntax")

// ErrRange is the kind of error for well-formed text whose value is not
// allowed: beyond float64 range, negative where only magnitudes make sense,
// zero where zero is not meaningful, below absolute zero.
var ErrRange = errors.New("value out of range")

// Error is a parse error. Its message reads like
// `resistance "4x7": unexpected character 'x'`.
type Error struct {
	Quantity string // what was being read: "resistance", "tolerance", ...
	Input    string // the text as given (shortened in the message when long)
	Problem  string // what is wrong with it
	Kind     error  // ErrSyntax or ErrRange
}

// maxShown is how many bytes of the input an error message repeats.
const maxShown = 40

// Error implements error.
func (e *Error) Error() string {
	in := e.Input
	if len(in) > maxShown {
		cut := maxShown
		for cut > 0 && !utf8.RuneStart(in[cut]) {
			cut--
		}
		in = in[:cut] + "…"
	}
	return fmt.Sprintf("%s %q: %s", e.Quantity, in, e.Problem)
}

// Unwrap returns the kind (ErrSyntax or ErrRange) for errors.Is.
func (e *Error) Unwrap() error { return e.Kind }

// problem is an error before the quantity and input are known.
type problem struct {
	msg  string
	kind error
}

func syntaxf(format string, a ...any) *problem {
	return &problem{msg: fmt.Sprintf(format, a...), kind: ErrSyntax}
}

func rangef(format string, a ...any) *problem {
	return &problem{msg: fmt.Sprintf(format, a...), kind: ErrRange}
}

// unexpected reports the first rune of rest as unexpected.
func unexpected(rest string) *problem {
	r, _ := utf8.DecodeRuneInString(rest)
	if r == utf8.RuneError {
		return syntaxf("invalid UTF-8")
	}
	return syntaxf("unexpected character %q", r)
}

// wrap turns p into an *Error.
func (p *problem) wrap(quantity, input string) *Error {
	return &Error{Quantity: quantity, Input: input, Problem: p.msg, Kind: p.kind}
}
