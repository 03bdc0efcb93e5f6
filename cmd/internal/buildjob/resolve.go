package buildjob

import (
	"encoding/json"

	"biasbin/picker"
	"biasbin/solver"
	"biasbin/store"
)

// LineChange is a stock line the build draws on that differs from the
// pick: removed, or with other values, tags or bin.
type LineChange struct {
	Line    int64
	Kind    store.Kind
	Removed bool
}

// changes compares the plan's lines with the stock now.
func changes(p Plan, now picker.Stock) []LineChange {
	cur := snapshot(now, lineSet(p))
	byLine := map[int64]LineSnapshot{}
	for _, l := range cur {
		byLine[l.Line] = l
	}
	var out []LineChange
	for _, was := range p.Lines {
		is, ok := byLine[was.Line]
		if !ok || is.Kind != was.Kind {
			out = append(out, LineChange{Line: was.Line, Kind: was.Kind, Removed: true})
			continue
		}
		a, errA := json.Marshal(was)
		b, errB := json.Marshal(is)
		if errA != nil || errB != nil || string(a) != string(b) {
			out = append(out, LineChange{Line: was.Line, Kind: was.Kind})
		}
	}
	return out
}

// lineSet is the set of the plan's lines.
func lineSet(p Plan) map[int64]bool {
	set := map[int64]bool{}
	for _, l := range p.Lines {
		set[l.Line] = true
	}
	return set
}

// resolveLimit is how many builds of the plan's own lines the re-solve
// ranks: every build of four single values (4⁴ = 256) fits.
const resolveLimit = 256

// resolveYieldBoards is the Monte Carlo size of the re-solve: the yield
// is not what decides it, the hard limits are.
const resolveYieldBoards = 100

// resolve searches again, on the plan's own lines as they are now (their
// quantities taken as ample: running short is the reservation's question,
// not the circuit's), for the plan's request and one board, and returns
// the build with the plan's ID, or false when the search no longer finds
// it.
func resolve(p Plan, now picker.Stock) (picker.Candidate, bool, error) {
	set := lineSet(p)
	var st picker.Stock
	for _, r := range now.Resistors {
		if set[r.ID] {
			r.Qty = store.MaxQty
			st.Resistors = append(st.Resistors, r)
		}
	}
	for _, t := range now.Transistors {
		if set[t.ID] {
			t.Qty = store.MaxQty
			st.Transistors = append(st.Transistors, t)
		}
	}
	req := p.Request
	if b := p.Build; b.Topology != solver.SplitSupply {
		// The build keeps the rail it was picked on: a plan stored before
		// the ground was kept has 0 V on its emitter-side rail.
		req.Rail = solver.RailOf(b.Device.Polarity, b.Topology, b.Ground)
	}
	req.Boards, req.Top, req.Finalists, req.YieldBoards = 1, resolveLimit, resolveLimit, resolveYieldBoards
	req.ShowFailing, req.Exhaustive, req.Progress = true, !req.Pairs, nil
	res, err := picker.Pick(st, req)
	if err != nil {
		return picker.Candidate{}, false, err
	}
	for _, c := range res.Candidates {
		if c.ID == p.Candidate {
			return c, true, nil
		}
	}
	return picker.Candidate{}, false, nil
}
