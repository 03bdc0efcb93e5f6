package job

import (
	"slices"
	"strings"

	"biasbin/picker"
	"biasbin/solver"
)

// StockGapError means a search cannot find anything because a kind of
// part is missing from the stock altogether (with the tags asked for).
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

// CheckStock refuses a search that cannot find anything because a kind
// of part is missing altogether: no resistor line with parts (and the
// required tags), or no transistor line of the polarity.
func CheckStock(st picker.Stock, req picker.Request) error {
	tagged := func(tags []string) bool {
		for _, want := range req.RequireTags {
			if !slices.ContainsFunc(tags, func(t string) bool { return strings.EqualFold(t, want) }) {
				return false
			}
		}
		return true
	}
	if !slices.ContainsFunc(st.Resistors, func(r picker.Resistor) bool { return r.Qty > 0 && tagged(r.Tags) }) {
		return &StockGapError{Resistors: true, Tags: req.RequireTags}
	}
	var same, other int
	for _, t := range st.Transistors {
		if t.Qty == 0 || !tagged(t.Tags) {
			continue
		}
		if t.Sheet.Polarity == req.Polarity {
			same++
		} else {
			other++
		}
	}
	if same == 0 {
		return &StockGapError{Polarity: req.Polarity, OtherPolarity: other, Tags: req.RequireTags}
	}
	return nil
}
