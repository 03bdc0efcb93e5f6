package job

import (
	"cmp"
	"slices"

	"biasbin/picker"
	"biasbin/solver"
)

// PartKind says what a stock line holds.
type PartKind int

// The kinds of stock line a build draws on.
const (
	Resistor PartKind = iota + 1
	Transistor
)

// PullLine is one line of a build's pull list: a stock line, how many
// parts the run takes from it and how many the line holds.
type PullLine struct {
	// ID is the stock line; Kind what it holds.
	ID   int64
	Kind PartKind
	// Ohm is a resistor line's value, Label a transistor line's type.
	Ohm   float64
	Label string
	Bin   string
	// Qty is what the run takes, OnHand what the line holds.
	Qty    int
	OnHand int
}

// Missing is how many parts the line lacks for the run (0 when enough).
func (p PullLine) Missing() int { return max(0, p.Qty-p.OnHand) }

// PullList totals what build c takes from each stock line for boards
// boards: two positions drawing on one line need twice the parts. Order:
// resistors by first use in the topology's order (R1, R2, RC, RE), then
// the transistor.
func PullList(c picker.Candidate, stock picker.Stock, boards int) []PullLine {
	onHand := map[int64]int{}
	for _, r := range stock.Resistors {
		onHand[r.ID] = r.Qty
	}
	for _, t := range stock.Transistors {
		onHand[t.ID] = t.Qty
	}
	var out []PullLine
	index := map[int64]int{}
	add := func(p PullLine) {
		if i, ok := index[p.ID]; ok {
			out[i].Qty += boards
			return
		}
		index[p.ID] = len(out)
		p.Qty, p.OnHand = boards, onHand[p.ID]
		out = append(out, p)
	}
	for _, slot := range Slots(c) {
		for _, part := range c.Positions[slot].Parts {
			add(PullLine{ID: part.ID, Kind: Resistor, Ohm: part.Ohm, Bin: part.Bin})
		}
	}
	add(PullLine{ID: c.Transistor.ID, Kind: Transistor, Label: c.Transistor.Sheet.Label, Bin: c.Transistor.Bin})
	return out
}

// ShortLines lists the pull lines whose stock falls short for the run,
// most missing first.
func ShortLines(ps []PullLine) []PullLine {
	var out []PullLine
	for _, p := range ps {
		if p.Missing() > 0 {
			out = append(out, p)
		}
	}
	slices.SortStableFunc(out, func(a, b PullLine) int { return cmp.Compare(b.Missing(), a.Missing()) })
	return out
}

// Slots lists a candidate's filled resistor positions in its topology's
// order, by slot name.
func Slots(c picker.Candidate) []string {
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
