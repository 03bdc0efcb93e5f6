package pickcmd

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"

	"biasbin/picker"
	"biasbin/solver"
	"biasbin/solver/notation"
)

// view is one search's outcome together with what the output needs to
// explain it: the request and the stock it ran on (for on-hand counts).
type view struct {
	req   picker.Request
	res   picker.Result
	stock picker.Stock
	// buildable is, when the stock cannot supply req.Boards, the most
	// boards it does supply (0 = not searched or not even one), and fewer
	// the search for that many boards.
	buildable int
	fewer     picker.Result
}

// fits reports whether at least one build passes every hard limit for the
// boards requested.
func (v view) fits() bool {
	return slices.ContainsFunc(v.res.Candidates, func(c picker.Candidate) bool { return len(c.Failing) == 0 })
}

// short reports whether the stock runs short for the run but builds a
// smaller one.
func (v view) short() bool { return !v.fits() && v.buildable > 0 }

// shown returns the builds to show: the search's own, or, when the stock
// runs short for the run, the best builds for the boards it does supply.
func (v view) shown() []picker.Candidate {
	if v.short() {
		return v.fewer.Candidates
	}
	return v.res.Candidates
}

// boards is the number of boards the request builds (at least one).
func (v view) boards() int { return max(1, v.req.Boards) }

// slotsOf lists a candidate's resistor positions in the topology's order.
func slotsOf(c picker.Candidate) []string {
	top := c.Build.Topology
	if top == 0 {
		top = solver.Divider
	}
	var out []string
	for _, s := range top.Slots() {
		if _, ok := c.Positions[s.String()]; ok {
			out = append(out, s.String())
		}
	}
	return out
}

// positionCode writes a position's value: a single part as its code, a
// series pair as 4K7+330R and a parallel pair as 10K‖10K.
func positionCode(p picker.Position) string {
	if len(p.Parts) < 2 {
		return notation.FormatResistance(p.Ohm)
	}
	codes := make([]string, len(p.Parts))
	for i, part := range p.Parts {
		codes[i] = notation.FormatResistance(part.Ohm)
	}
	sep := "+"
	if p.Arrangement == "parallel" {
		sep = "‖"
	}
	return strings.Join(codes, sep)
}

// testPoint is a node a technician measures at bring-up with its band.
type testPoint struct {
	name            string
	nominal, lo, hi float64
	haveBand        bool
}

// testPoints returns VB, VE and VC at the nominal point with their extremes
// over the worst-case corners.
func testPoints(c picker.Candidate) []testPoint {
	pick := []func(solver.OperatingPoint) float64{
		func(op solver.OperatingPoint) float64 { return op.VB_V },
		func(op solver.OperatingPoint) float64 { return op.VE_V },
		func(op solver.OperatingPoint) float64 { return op.VC_V },
	}
	out := make([]testPoint, 0, 3)
	for i, name := range []string{"vb", "ve", "vc"} {
		tp := testPoint{name: name, nominal: pick[i](c.Nominal), lo: math.Inf(1), hi: math.Inf(-1)}
		for _, k := range c.Worst.Corners {
			x := pick[i](k.OP)
			tp.lo, tp.hi = math.Min(tp.lo, x), math.Max(tp.hi, x)
		}
		if len(c.Worst.Corners) == 0 {
			tp.lo, tp.hi = tp.nominal, tp.nominal
		} else {
			tp.haveBand = true
		}
		out = append(out, tp)
	}
	return out
}

// pull is one line of a build's pull list: a stock line, how many parts the
// run takes from it and how many the line holds.
type pull struct {
	id     int64
	kind   string
	value  string
	bin    string
	qty    int
	onHand int
}

// pullList totals what a build takes from each stock line for all boards:
// two positions drawing on one line need twice the parts. Order: resistors
// by first use (R1, R2, RC, RE), then the transistor.
func (v view) pullList(c picker.Candidate) []pull {
	onHand := map[int64]int{}
	for _, r := range v.stock.Resistors {
		onHand[r.ID] = r.Qty
	}
	for _, t := range v.stock.Transistors {
		onHand[t.ID] = t.Qty
	}
	var out []pull
	index := map[int64]int{}
	add := func(id int64, kind, value, bin string) {
		if i, ok := index[id]; ok {
			out[i].qty += v.boards()
			return
		}
		index[id] = len(out)
		out = append(out, pull{id: id, kind: kind, value: value, bin: bin, qty: v.boards(), onHand: onHand[id]})
	}
	for _, slot := range slotsOf(c) {
		for _, part := range c.Positions[slot].Parts {
			add(part.ID, "resistor", notation.FormatResistance(part.Ohm), part.Bin)
		}
	}
	add(c.Transistor.ID, "transistor", c.Transistor.Sheet.Label, c.Transistor.Bin)
	return out
}

// cautions lists the hot-part warnings that apply: a supply above the
// extra-low-voltage boundary, or a shown part near its design limit.
func (v view) cautions() []string {
	var out []string
	if hi := math.Abs(v.req.VCC_V) * (1 + v.req.VCCTol); hi > hotSupply_V {
		out = append(out, fmt.Sprintf("the supply reaches %s, above %s: parts run hot and can burn, and touching the circuit can hurt; follow your local codes and licensed practice",
			trimV(hi), trimV(hotSupply_V)))
	}
	for _, c := range v.shown() {
		if c.MaxUtilization > nearRating && len(c.Failing) == 0 {
			out = append(out, fmt.Sprintf("build %d runs a part at %.0f %% of its design limit: it will be hot and can burn; keep it clear of other parts and follow local codes and licensed practice",
				c.Rank, c.MaxUtilization*100))
		}
	}
	return out
}

// shortLines lists pull lines whose stock falls short for the run, across
// the given candidates, most missing first.
func shortLines(ps []pull) []pull {
	var out []pull
	for _, p := range ps {
		if p.qty > p.onHand {
			out = append(out, p)
		}
	}
	slices.SortStableFunc(out, func(a, b pull) int { return cmp.Compare(b.qty-b.onHand, a.qty-a.onHand) })
	return out
}
