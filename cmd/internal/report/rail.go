package report

import (
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/solver/notation"
)

// Point words a point a resistor joins: "base", "+V", "0 V".
func Point(p job.Point) string {
	switch p {
	case job.PointPlus:
		return "+V"
	case job.PointMinus:
		return "-V"
	case job.PointZero:
		return "0 V"
	}
	return p.String()
}

// Join words what a resistor joins: "+V to base".
func Join(j job.Join) string { return Point(j.From) + " to " + Point(j.To) }

// Rail words how a stage of polarity p sits on its supply (rail settled by
// solver.SettleRail): "positive supply: emitter side to +V, collector side
// to 0 V".
func Rail(p solver.Polarity, r solver.RailSign) string {
	switch {
	case r == solver.SplitRails && p == solver.PNP:
		return "split supply: emitter rail +V, collector rail -V, base returned to 0 V (the common)"
	case r == solver.SplitRails:
		return "split supply: collector rail +V, emitter rail -V, base returned to 0 V (the common)"
	case r == solver.NegativeRail:
		return "negative supply: emitter side to 0 V, collector side to -V"
	case p == solver.PNP:
		return "positive supply: emitter side to +V, collector side to 0 V"
	}
	return "positive supply: collector side to +V, emitter side to 0 V"
}

// ZeroV words where a stage's 0 V (the meter's black lead) is: "the
// collector-side rail".
func ZeroV(t solver.Topology, g solver.Ground) string {
	switch {
	case t == solver.SplitSupply:
		return "the common of the two supplies"
	case g == solver.CollectorRailGround:
		return "the collector-side rail"
	}
	return "the emitter-side rail"
}

// Reference is, for the JSON documents, what a build's voltages are
// measured against.
type Reference struct {
	// Rail is how the supply is built: "positive", "negative" or "split".
	Rail string `json:"rail"`
	// Ground is where 0 V (the meter's black lead) is: "emitter-rail",
	// "collector-rail" or "common" (split supply).
	Ground string `json:"ground"`
}

// ReferenceOf is the reference of a stage of polarity p and topology t
// with ground g.
func ReferenceOf(p solver.Polarity, t solver.Topology, g solver.Ground) Reference {
	ground := g.String()
	if t == solver.SplitSupply {
		ground = "common"
	}
	return Reference{Rail: solver.RailOf(p, t, g).String(), Ground: ground}
}

// JoinsJSON maps each fitted resistor ("r1") to the two points it joins
// ("+v", "base"), the higher first.
func JoinsJSON(js []job.Join) map[string][2]job.Point {
	out := map[string][2]job.Point{}
	for _, j := range js {
		out[j.Slot.String()] = [2]job.Point{j.From, j.To}
	}
	return out
}

// SupplyBand writes the span a supply moves over with its tolerance, low
// end first in the rail's own sign, in one unit: "7 V..9.6 V",
// "-9.6 V..-7 V".
func SupplyBand(v, tol float64) string {
	lo, hi := v*(1-tol), v*(1+tol)
	if lo > hi {
		lo, hi = hi, lo
	}
	return notation.FormatBand(lo, hi, "V")
}
