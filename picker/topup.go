package picker

import "slices"

// With RequireTags a run may use only parts on the approved list (the
// stocked lines carrying every required tag). A part bought for such a
// run must be one of those parts, so the shortfall offers only top-ups of
// approved lines that hold too few parts for the run, never a new value;
// the generic purchases move to Shortfall.Unapproved.

// approvedOnly rewrites a shortfall for a request with RequireTags: it
// searches the stock again with every approved line short for the run
// filled up (a resistor line to two parts per board, so that one value may
// fill two positions; a transistor line to one per board) and, when a
// build then fits, offers the parts that build lacks as top-ups of those
// lines. When none does it says that nothing on the approved list would do,
// unless that search stopped at the request's time limit (stopped).
func approvedOnly(sf *Shortfall, stock Stock, req Request, boards int) (stopped bool, err error) {
	sf.Unapproved, sf.Purchases = sf.Purchases, nil
	filled, short := fillApproved(stock, req.RequireTags, boards)
	if len(short) > 0 {
		r := req
		r.Top, r.Finalists, r.Progress, r.ShowFailing = 1, 0, nil, false
		res, err := Pick(filled, r)
		if err != nil {
			return false, err
		}
		if len(res.Candidates) > 0 && res.Shortfall == nil {
			sf.Purchases = topUps(res.Candidates[0], short, boards)
		}
		stopped = res.Ranking.Stopped
	}
	if len(sf.Purchases) == 0 && !stopped {
		// (a search stopped at its time limit proves nothing missing)
		sf.Reasons = append(sf.Reasons, Reason{Kind: NoApprovedPurchase, Tags: req.RequireTags, Boards: boards})
	}
	return stopped, nil
}

// fillApproved returns a copy of stock whose approved lines short for a
// run of boards are filled up, and what those lines hold, by line ID.
func fillApproved(stock Stock, tags []string, boards int) (Stock, map[int64]int) {
	short := map[int64]int{}
	out := Stock{Resistors: slices.Clone(stock.Resistors), Transistors: slices.Clone(stock.Transistors)}
	for i, r := range out.Resistors {
		if HasTags(r.Tags, tags) && r.Qty < 2*boards {
			short[r.ID] = r.Qty
			out.Resistors[i].Qty = 2 * boards
		}
	}
	for i, t := range out.Transistors {
		if HasTags(t.Tags, tags) && t.Qty < boards {
			short[t.ID] = t.Qty
			out.Transistors[i].Qty = boards
		}
	}
	return out, short
}

// topUps lists what build c lacks, for a run of boards, on each of the
// short lines it draws from (onHand: what each holds).
func topUps(c Candidate, onHand map[int64]int, boards int) []Purchase {
	var out []Purchase
	take := func(slot string, id int64, p Purchase) {
		if _, ok := onHand[id]; !ok {
			return
		}
		for i := range out {
			if out[i].Line == id {
				out[i].Qty += boards
				out[i].Slot += "+" + slot
				return
			}
		}
		p.Slot, p.Line, p.Qty, p.OnHand = slot, id, boards, onHand[id]
		out = append(out, p)
	}
	lay := layoutOf(c.Topology)
	for _, slot := range lay.names[:lay.n] {
		pos := c.Positions[slot]
		for _, part := range pos.Parts {
			take(slot, part.ID, Purchase{Ohm: part.Ohm, Tol: pos.Spec.Tol, Rated_W: pos.Spec.Rated_W, Bin: part.Bin})
		}
	}
	t := c.Transistor
	take(PartTransistor, t.ID, Purchase{Polarity: t.Sheet.Polarity, VCEO_V: t.Sheet.VCEO_V, ICMax_A: t.Sheet.ICMax_A, Bin: t.Bin, Label: t.Sheet.Label})
	// Qty so far is what the run takes from the line: buy what it lacks
	kept := out[:0]
	for _, p := range out {
		if p.Qty -= p.OnHand; p.Qty > 0 {
			kept = append(kept, p)
		}
	}
	return kept
}
