package store

import "math"

// ValueMatch says how a resistor line stands to a value asked for.
type ValueMatch int

// How a line stands to the value or range asked for.
const (
	// MatchIn: the line's value is the value asked for, or inside the range.
	MatchIn ValueMatch = iota + 1
	// MatchBelow: the line holds the nearest stocked value below.
	MatchBelow
	// MatchAbove: the line holds the nearest stocked value above.
	MatchAbove
)

// String names the match for JSON ("in", "below", "above").
func (m ValueMatch) String() string {
	switch m {
	case MatchIn:
		return "in"
	case MatchBelow:
		return "below"
	case MatchAbove:
		return "above"
	}
	return ""
}

// sameValue is the relative tolerance two stored values agree within (the
// store keeps 12 significant digits).
const sameValue = 1e-9

// NearValues picks from rs (sorted by value, as ListResistors returns
// them) the lines whose value lies in lo..hi (ohms; lo == hi asks for one
// value), and every line of the nearest stocked value below lo and of the
// nearest above hi, so that "do I have a 6K8?" also shows what is on
// either side. It returns each picked line with how it matches, in value
// order.
func NearValues(rs []Resistor, lo, hi float64) ([]Resistor, []ValueMatch) {
	lo, hi = lo*(1-sameValue), hi*(1+sameValue)
	below, above := math.Inf(-1), math.Inf(1)
	for _, r := range rs {
		switch {
		case r.Ohm < lo:
			below = math.Max(below, r.Ohm)
		case r.Ohm > hi:
			above = math.Min(above, r.Ohm)
		}
	}
	var out []Resistor
	var how []ValueMatch
	for _, r := range rs {
		var m ValueMatch
		switch {
		case r.Ohm >= lo && r.Ohm <= hi:
			m = MatchIn
		case r.Ohm == below:
			m = MatchBelow
		case r.Ohm == above:
			m = MatchAbove
		default:
			continue
		}
		out = append(out, r)
		how = append(how, m)
	}
	return out, how
}
