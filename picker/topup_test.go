package picker

import (
	"slices"
	"testing"
)

// approvedStock is a small-run producer's wall: an approved list (tagged
// "approved") of a few values, one of them (4K7) short for ten boards,
// beside untagged values and an untagged transistor the run may not use.
func approvedStock(t4K7Qty, approvedQ int) Stock {
	var st Stock
	for i, ohm := range []float64{1e3, 2.2e3, 4.7e3, 10e3, 47e3, 100e3} {
		r := Resistor{ID: int64(1 + i), Ohm: ohm, Tol: 0.01, TCR_PPMPerK: 50, Rated_W: 0.25, Qty: 200, Bin: "A", Tags: []string{"approved"}}
		if ohm == 4.7e3 {
			r.Qty = t4K7Qty
		}
		st.Resistors = append(st.Resistors, r)
	}
	for i, ohm := range []float64{470, 3.3e3, 6.8e3, 15e3, 22e3} {
		st.Resistors = append(st.Resistors, Resistor{ID: int64(20 + i), Ohm: ohm, Tol: 0.05, TCR_PPMPerK: 200, Rated_W: 0.25, Qty: 200, Bin: "B"})
	}
	q := smallNPN(40, 100, 300)
	q.Tags, q.Qty = []string{"approved"}, approvedQ
	spare := smallNPN(41, 100, 300)
	spare.Qty = 500
	st.Transistors = []Transistor{q, spare}
	return st
}

// TestApprovedPurchases: with --require-tag, the parts to buy are only
// top-ups of lines on the approved list (each purchase names its line,
// and buying it gives a build that fits); when no approved line would do,
// the shortfall says so and lists the parts that would do only as
// unapproved. What fits is the picker's own verdict, so the test checks
// the purchase by searching the stock again after it (common practice: a
// purchase is proven by the build it makes).
func TestApprovedPurchases(t *testing.T) {
	req := Request{VCC_V: 12, IC_A: 1e-3, Boards: 10, RequireTags: []string{"approved"}, Top: 3}
	tagged := func(st Stock, id int64) bool {
		for _, r := range st.Resistors {
			if r.ID == id {
				return HasTags(r.Tags, req.RequireTags)
			}
		}
		for _, tr := range st.Transistors {
			if tr.ID == id {
				return HasTags(tr.Tags, req.RequireTags)
			}
		}
		return false
	}
	buy := func(st Stock, ps []Purchase) Stock {
		for _, p := range ps {
			for i := range st.Resistors {
				if st.Resistors[i].ID == p.Line {
					st.Resistors[i].Qty += p.Qty
				}
			}
			for i := range st.Transistors {
				if st.Transistors[i].ID == p.Line {
					st.Transistors[i].Qty += p.Qty
				}
			}
		}
		return st
	}
	for _, tc := range []struct {
		name   string
		st     Stock
		topUps bool // a top-up of approved lines exists
	}{
		{"4K7 short", approvedStock(3, 200), true},
		{"transistor short", approvedStock(200, 4), true},
		{"4K7 missing", approvedStock(0, 200), false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			st := tc.st
			if !tc.topUps {
				st.Resistors = slices.DeleteFunc(slices.Clone(st.Resistors), func(r Resistor) bool { return r.Ohm == 4.7e3 })
			}
			res, err := Pick(st, req)
			if err != nil {
				t.Fatal(err)
			}
			sf := res.Shortfall
			if sf == nil {
				t.Fatalf("the approved list fits as stocked: %d builds", len(res.Candidates))
			}
			for _, p := range sf.Purchases {
				if p.Line == 0 || !tagged(st, p.Line) || p.Qty <= 0 {
					t.Errorf("purchase %+v is not a top-up of an approved line", p)
				}
			}
			for _, p := range sf.Unapproved {
				if p.Line != 0 {
					t.Errorf("unapproved purchase %+v names a stock line", p)
				}
			}
			noApproved := slices.ContainsFunc(sf.Reasons, func(r Reason) bool { return r.Kind == NoApprovedPurchase })
			if !tc.topUps {
				if len(sf.Purchases) > 0 || !noApproved {
					t.Errorf("nothing approved would do, yet purchases %+v, reasons %+v", sf.Purchases, sf.Reasons)
				}
				return
			}
			if len(sf.Purchases) == 0 || noApproved {
				t.Fatalf("no top-up offered: reasons %+v, unapproved %+v", sf.Reasons, sf.Unapproved)
			}
			after, err := Pick(buy(st, sf.Purchases), req)
			if err != nil {
				t.Fatal(err)
			}
			if after.Shortfall != nil {
				t.Errorf("after the top-up %+v still nothing fits: %+v", sf.Purchases, after.Shortfall.Reasons)
			}
			for _, c := range after.Candidates {
				for _, pos := range c.Positions {
					for _, part := range pos.Parts {
						if !tagged(st, part.ID) {
							t.Errorf("build %s uses unapproved line %d", c.ID, part.ID)
						}
					}
				}
			}
		})
	}
}
