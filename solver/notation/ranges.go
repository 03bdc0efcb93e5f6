package notation

import (
	"fmt"
	"strings"
	"unicode"
)

// Parser is the shape of the single-value parsers (ParseVoltage,
// ParseCurrent, ParseOhms, ParseNumber ...) that ParseRange and ParseAt
// combine.
type Parser func(string) (float64, error)

// ParseRange reads "MIN..MAX" with parse for each end: "100..300",
// "-10..60", "0..50C", "100..300mA". When only the high end carries a unit
// (a suffix without digits) and the low end is a bare number, the low end
// takes the same unit, so "100..300mA" is 0.1 mA to 0.3 mA. A single value
// without ".." gives lo == hi. lo > hi is an error.
func ParseRange(s string, parse Parser) (lo, hi float64, err error) {
	t, p := clean(s)
	if p != nil {
		return 0, 0, p.wrap("range", s)
	}
	if strings.Contains(t, "...") {
		return 0, 0, syntaxf("use two dots between the ends, like 100..300").wrap("range", s)
	}
	loText, hiText, isRange := strings.Cut(t, "..")
	if !isRange {
		v, err := parse(t)
		if err != nil {
			return 0, 0, err
		}
		return v, v, nil
	}
	loText = strings.TrimRightFunc(loText, unicode.IsSpace)
	hiText = strings.TrimLeftFunc(hiText, unicode.IsSpace)
	if loText == "" || hiText == "" {
		return 0, 0, syntaxf("missing end").wrap("range", s)
	}
	loText = shareUnit(loText, hiText)
	if lo, err = parse(loText); err != nil {
		return 0, 0, fmt.Errorf("range %q: low end: %w", s, err)
	}
	if hi, err = parse(hiText); err != nil {
		return 0, 0, fmt.Errorf("range %q: high end: %w", s, err)
	}
	if lo > hi {
		return 0, 0, rangef("low end above high end").wrap("range", s)
	}
	return lo, hi, nil
}

// shareUnit appends hi's unit suffix to lo when lo is a bare number and
// the suffix holds no digit.
func shareUnit(lo, hi string) string {
	n, rest, p := scanNumber(lo)
	if p != nil || rest != "" || n.mant == "" {
		return lo
	}
	_, suffix, p := scanNumber(hi)
	if p != nil || suffix == "" || strings.ContainsAny(suffix, "0123456789") {
		return lo
	}
	return lo + suffix
}

// ParseAt reads "VALUE@CURRENT", a value stated at a test current, such as
// "0.65V@1mA" (VBE(on) at IC = 1 mA). The value is read with parse, the
// current with ParseCurrent and must be positive. Without '@' hasAt is
// false and at_A is 0.
func ParseAt(s string, parse Parser) (v, at_A float64, hasAt bool, err error) {
	valText, atText, hasAt := strings.Cut(s, "@")
	if v, err = parse(valText); err != nil {
		return 0, 0, false, err
	}
	if !hasAt {
		return v, 0, false, nil
	}
	if at_A, err = positiveCurrent(s, atText); err != nil {
		return 0, 0, false, err
	}
	return v, at_A, true, nil
}

// ParseRangeAt reads "MIN..MAX@CURRENT" (an hFE window at a test current,
// "100..300@2mA"); the parts follow ParseRange and ParseAt.
func ParseRangeAt(s string, parse Parser) (lo, hi, at_A float64, hasAt bool, err error) {
	rangeText, atText, hasAt := strings.Cut(s, "@")
	if lo, hi, err = ParseRange(rangeText, parse); err != nil {
		return 0, 0, 0, false, err
	}
	if !hasAt {
		return lo, hi, 0, false, nil
	}
	if at_A, err = positiveCurrent(s, atText); err != nil {
		return 0, 0, 0, false, err
	}
	return lo, hi, at_A, true, nil
}

// positiveCurrent reads the test current after '@' in s.
func positiveCurrent(s, atText string) (float64, error) {
	if strings.Contains(atText, "@") {
		return 0, syntaxf("more than one '@'").wrap("value", s)
	}
	a, err := ParseCurrent(atText)
	if err != nil {
		return 0, fmt.Errorf("value %q: test current: %w", s, err)
	}
	if a == 0 {
		return 0, rangef("test current must not be zero").wrap("value", s)
	}
	return a, nil
}
