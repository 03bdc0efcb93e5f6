package picker

import (
	"slices"
	"strings"

	"biasbin/solver"
)

// HasTags reports whether a stock line carrying have carries every tag in
// want. Tags match without regard to letter case ("Approved" is
// "approved"); this is the one tag-matching rule of the program.
func HasTags(have, want []string) bool {
	for _, w := range want {
		if !slices.ContainsFunc(have, func(h string) bool { return strings.EqualFold(h, w) }) {
			return false
		}
	}
	return true
}

// LabelMatches reports whether a stocked label is the one asked for ("" =
// any): equal but for ASCII letter case, as the stock looks a label up
// (SQLite NOCASE). It is the one label rule of every command.
func LabelMatches(label, want string) bool {
	if want == "" {
		return true
	}
	if len(label) != len(want) {
		return false
	}
	for i := range len(label) {
		a, b := label[i], want[i]
		if 'A' <= a && a <= 'Z' {
			a += 'a' - 'A'
		}
		if 'A' <= b && b <= 'Z' {
			b += 'a' - 'A'
		}
		if a != b {
			return false
		}
	}
	return true
}

// StockGapError means a search cannot find anything because a kind of
// part is missing from the stock altogether: no resistor line with parts
// (and the required tags), or no transistor line of the polarity.
type StockGapError struct {
	// Resistors is true when no resistor is stocked (with the tags);
	// otherwise no transistor of Polarity is, and OtherPolarity counts
	// the lines of the other polarity that are.
	Resistors     bool
	Polarity      solver.Polarity
	OtherPolarity int
	// Tags are the tags the request required.
	Tags []string
}

func (e *StockGapError) Error() string {
	what := "resistor"
	if !e.Resistors {
		what = e.Polarity.String() + " transistor"
	}
	if len(e.Tags) > 0 {
		return "no " + what + " in stock tagged " + strings.Join(e.Tags, " and ")
	}
	return "no " + what + " in stock"
}

// CheckStock refuses a search for req that cannot find anything because
// a kind of part is missing altogether (a *StockGapError). Pick runs it
// before searching; a front end may run it before it starts a progress
// display.
func CheckStock(st Stock, req Request) error {
	pol, tags := req.polarity(), req.RequireTags
	if !slices.ContainsFunc(st.Resistors, func(r Resistor) bool { return r.Qty > 0 && HasTags(r.Tags, tags) }) {
		return &StockGapError{Resistors: true, Tags: tags}
	}
	var same, other int
	for _, t := range st.Transistors {
		if t.Qty == 0 || !HasTags(t.Tags, tags) {
			continue
		}
		if t.Sheet.Polarity == pol {
			same++
		} else {
			other++
		}
	}
	if same == 0 {
		return &StockGapError{Polarity: pol, OtherPolarity: other, Tags: tags}
	}
	return nil
}

// polarity is the request's polarity: as given, else the sign of the rail
// (a negative VCC is a PNP stage).
func (r Request) polarity() solver.Polarity {
	switch {
	case r.Polarity != 0:
		return r.Polarity
	case r.VCC_V < 0:
		return solver.PNP
	}
	return solver.NPN
}
