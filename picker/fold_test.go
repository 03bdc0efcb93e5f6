package picker

import (
	"fmt"
	"slices"
	"strings"
	"testing"

	"biasbin/solver/eseries"
)

// TestFoldNearDuplicates: a wall holding every value twice (a 1 % metal
// film drawer and a 5 % carbon drawer) would list the same set of values
// again and again; by default each set of values is listed once, as its
// best build, with the others counted, and with ShowAll every build is
// listed. The sets of values are written out here from the parts, not by
// the picker's own key.
func TestFoldNearDuplicates(t *testing.T) {
	st := Stock{
		Resistors:   append(seriesStock(eseries.E6, 100, 100e3, 0.01, 0.25, 50, 100), seriesStock(eseries.E6, 100, 100e3, 0.05, 0.25, 50, 200)...),
		Transistors: []Transistor{smallNPN(1, 100, 300)},
	}
	values := func(c Candidate) string {
		var out []string
		for _, slot := range []string{"r1", "r2", "rc", "re"} {
			var ohms []string
			for _, p := range c.Positions[slot].Parts {
				ohms = append(ohms, fmt.Sprintf("%.0f", p.Ohm))
			}
			slices.Sort(ohms)
			out = append(out, slot+"="+c.Positions[slot].Arrangement+strings.Join(ohms, "+"))
		}
		return c.Transistor.Sheet.Label + " " + strings.Join(out, " ")
	}
	req := Request{VCC_V: 12, IC_A: 2e-3, Top: 5}
	folded, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	req.ShowAll = true
	all, err := Pick(st, req)
	if err != nil {
		t.Fatal(err)
	}
	if len(folded.Candidates) != 5 || len(all.Candidates) != 5 {
		t.Fatalf("%d folded, %d with ShowAll; want 5 each", len(folded.Candidates), len(all.Candidates))
	}
	seen := map[string]bool{}
	total := 0
	for i, c := range folded.Candidates {
		v := values(c)
		if seen[v] {
			t.Errorf("#%d repeats the values %s", c.Rank, v)
		}
		seen[v] = true
		if c.Rank != i+1 {
			t.Errorf("rank %d at place %d", c.Rank, i+1)
		}
		total += c.Folded
	}
	for _, c := range folded.Candidates {
		// two drawers of every value, four single positions, one
		// transistor line: 2⁴ builds with these values, this one shown
		if want := 15; c.Folded != want && !strings.Contains(values(c), "series") && !strings.Contains(values(c), "parallel") {
			t.Errorf("#%d folds %d builds, want %d", c.Rank, c.Folded, want)
		}
	}
	if total == 0 {
		t.Errorf("every value stocked twice, yet nothing folded")
	}
	dup := false
	for i, c := range all.Candidates {
		if c.Folded != 0 {
			t.Errorf("ShowAll #%d counts %d folded", c.Rank, c.Folded)
		}
		if i > 0 && values(c) == values(all.Candidates[0]) {
			dup = true
		}
	}
	if !dup {
		t.Logf("ShowAll lists no near-duplicate of its first build in the top 5")
	}
	// the best build is the same either way
	if folded.Candidates[0].ID != all.Candidates[0].ID {
		t.Errorf("first build %s folded, %s with ShowAll", folded.Candidates[0].ID, all.Candidates[0].ID)
	}
	// each listed build is the best of its values: none of the ShowAll
	// list with the same values ranks above it
	for _, c := range folded.Candidates {
		for _, a := range all.Candidates {
			if values(a) == values(c) {
				if a.Score < c.Score {
					t.Errorf("%s listed (score %g) while %s with the same values scores %g", c.ID, c.Score, a.ID, a.Score)
				}
				break
			}
		}
	}
}
