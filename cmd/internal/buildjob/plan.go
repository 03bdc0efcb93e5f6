package buildjob

import (
	"encoding/json"
	"fmt"
	"sort"

	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/store"
)

// planVersion is the layout of the kept plan; a plan of another version
// is refused rather than misread.
const planVersion = 1

// Plan is a build as picked: enough to reserve it, re-solve it and judge a
// board's readings, kept as JSON with the pick and with the build.
type Plan struct {
	Version   int    `json:"version"`
	Candidate string `json:"candidate"`
	// Request is the pick's request (Boards is the run it was picked for).
	Request picker.Request `json:"request"`
	// Build is the stage with its marked values, transistor datasheet,
	// supply and ambient range.
	Build solver.Build `json:"build"`
	// Slots say which stock lines fill each resistor position, in the
	// topology's order.
	Slots []SlotUse `json:"slots"`
	// Transistor is the transistor's stock line.
	Transistor int64 `json:"transistor"`
	// Lines are the stock lines the build draws on, as they were at the
	// pick (values, tags and bin; quantities left out), in line order.
	Lines   []LineSnapshot `json:"lines"`
	Figures Figures        `json:"figures"`
	Bands   Bands          `json:"bands"`
	// Cautions are the pick's hazards that concern this build: a supply
	// above the extra-low-voltage boundary, a part near its design limit.
	Cautions []job.Caution `json:"cautions,omitempty"`
}

// SlotUse is what fills one resistor position.
type SlotUse struct {
	Slot string `json:"slot"`
	// Arrangement is "single", "series", "parallel" or "kept" (on the
	// board, no stock line).
	Arrangement string  `json:"arrangement"`
	Ohm         float64 `json:"ohms"`
	// Lines are the stock lines of the part or pair (a pair of one line
	// names it twice).
	Lines []int64 `json:"lines"`
}

// LineSnapshot is one stock line as the picker saw it, quantity left out.
type LineSnapshot struct {
	Line       int64              `json:"line"`
	Kind       store.Kind         `json:"kind"`
	Resistor   *picker.Resistor   `json:"resistor,omitempty"`
	Transistor *picker.Transistor `json:"transistor,omitempty"`
}

// Figures are what the build was picked with.
type Figures struct {
	Rank     int     `json:"rank"`
	Score    float64 `json:"score"`
	IC_A     float64 `json:"ic_a"`
	VCE_V    float64 `json:"vce_v"`
	ICMin_A  float64 `json:"ic_min_a"`
	ICMax_A  float64 `json:"ic_max_a"`
	VCEMin_V float64 `json:"vce_min_v"`
	VCEMax_V float64 `json:"vce_max_v"`
	Yield    float64 `json:"yield"`
	// YieldLow95 and YieldHigh95 are the yield's 95 % Clopper–Pearson
	// interval, YieldBoards and YieldPassed its count, and Window the
	// window (rule and design point) it ran against; absent in plans kept
	// before they were recorded.
	YieldLow95  float64             `json:"yield_low95,omitempty"`
	YieldHigh95 float64             `json:"yield_high95,omitempty"`
	YieldBoards int                 `json:"yield_boards,omitempty"`
	YieldPassed int                 `json:"yield_passed,omitempty"`
	Window      *picker.YieldWindow `json:"window,omitempty"`
	// Failing are the hard limits the build broke at the pick (empty for
	// a good build).
	Failing []picker.Failure `json:"failing,omitempty"`
}

// Band is one test point's expected voltage to ground: the nominal value
// and the band the worst-case corners span (hFE spread, part tolerances,
// supply tolerance, the ambient range), signed as a meter reads it.
type Band struct {
	Nominal_V float64 `json:"nominal_v"`
	Min_V     float64 `json:"min"`
	Max_V     float64 `json:"max"`
}

// Contains reports whether v lies in the band (ends included).
func (b Band) Contains(v float64) bool { return v >= b.Min_V && v <= b.Max_V }

// Bands are the three test points of a board.
type Bands struct {
	VB Band `json:"vb_v"`
	VE Band `json:"ve_v"`
	VC Band `json:"vc_v"`
}

// PlanFor makes the plan of candidate c of a pick of stock for req.
func PlanFor(c picker.Candidate, req picker.Request, stock picker.Stock) Plan {
	req.Progress = nil
	p := Plan{Version: planVersion, Candidate: c.ID, Request: req, Build: c.Build, Transistor: c.Transistor.ID}
	top := c.Build.Topology
	if top == 0 {
		top = solver.Divider
	}
	used := map[int64]bool{c.Transistor.ID: true}
	for _, sl := range top.Slots() {
		pos, ok := c.Positions[sl.String()]
		if !ok {
			continue
		}
		su := SlotUse{Slot: sl.String(), Arrangement: pos.Arrangement, Ohm: pos.Ohm}
		for _, part := range pos.Parts {
			su.Lines = append(su.Lines, part.ID)
			used[part.ID] = true
		}
		p.Slots = append(p.Slots, su)
	}
	p.Lines = snapshot(stock, used)
	p.Figures = Figures{Rank: c.Rank, Score: c.Score, IC_A: c.Nominal.IC_A, VCE_V: c.Nominal.VCE_V,
		ICMin_A: c.Worst.ICMin_A, ICMax_A: c.Worst.ICMax_A, VCEMin_V: c.Worst.VCEMin_V, VCEMax_V: c.Worst.VCEMax_V,
		Yield: c.Yield.Yield, YieldLow95: c.Yield.Low95, YieldHigh95: c.Yield.High95, YieldBoards: c.Yield.Boards,
		YieldPassed: c.Yield.Pass, Failing: c.Failing}
	if c.Yield.Boards > 0 {
		w := c.Window
		p.Figures.Window = &w
	}
	p.Bands = bandsOf(c.Nominal, c.Worst)
	return p
}

// bandsOf takes the test-point bands from job.TestPoints: the worst case
// over the corners, or the nominal value alone when no corner was solved.
func bandsOf(op solver.OperatingPoint, wc solver.WorstCase) Bands {
	var b Bands
	for _, tp := range job.TestPoints(op, &wc) {
		band := Band{Nominal_V: tp.Nominal_V, Min_V: tp.Min_V, Max_V: tp.Max_V}
		switch tp.Node {
		case job.NodeB:
			b.VB = band
		case job.NodeE:
			b.VE = band
		case job.NodeC:
			b.VC = band
		}
	}
	return b
}

// snapshot returns the lines of stock in used, quantities left out, in
// line order.
func snapshot(stock picker.Stock, used map[int64]bool) []LineSnapshot {
	var out []LineSnapshot
	for _, r := range stock.Resistors {
		if used[r.ID] {
			r.Qty = 0
			out = append(out, LineSnapshot{Line: r.ID, Kind: store.KindResistor, Resistor: &r})
		}
	}
	for _, t := range stock.Transistors {
		if used[t.ID] {
			t.Qty = 0
			out = append(out, LineSnapshot{Line: t.ID, Kind: store.KindTransistor, Transistor: &t})
		}
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Line < out[j].Line })
	return out
}

// Uses returns how many parts each board takes from each line: a line
// filling two positions (or both halves of a pair) counts twice.
func (p Plan) Uses() []store.PartUse {
	count := map[int64]int{p.Transistor: 1}
	for _, s := range p.Slots {
		for _, l := range s.Lines {
			count[l]++
		}
	}
	var out []store.PartUse
	for _, l := range p.Lines {
		if n := count[l.Line]; n > 0 {
			out = append(out, store.PartUse{Line: l.Line, Kind: l.Kind, PerBoard: n})
		}
	}
	return out
}

// encode writes the plan as JSON.
func (p Plan) encode() ([]byte, error) {
	b, err := json.Marshal(p)
	if err != nil {
		return nil, fmt.Errorf("plan of build %s: %w", p.Candidate, err)
	}
	return b, nil
}

// decodePlan reads a kept plan.
func decodePlan(b []byte) (Plan, error) {
	var p Plan
	if err := json.Unmarshal(b, &p); err != nil {
		return Plan{}, fmt.Errorf("kept plan: %w", err)
	}
	if p.Version != planVersion {
		return Plan{}, fmt.Errorf("kept plan: version %d, this biasbin reads %d", p.Version, planVersion)
	}
	return p, nil
}
