package store

import (
	"slices"
	"testing"
)

// TestNearValues: "do I have a 6K8?" on a stock of E12 neighbours 5K6 and
// 8K2 (IEC 60063 E12: 5.6, 6.8, 8.2) lists the two either side when no
// 6K8 is stocked, the 6K8 lines and both neighbours when it is, and a
// range with what lies in it and the nearest outside.
func TestNearValues(t *testing.T) {
	rs := []Resistor{{ID: 1, Ohm: 4700}, {ID: 2, Ohm: 5600}, {ID: 3, Ohm: 5600}, {ID: 4, Ohm: 8200}, {ID: 5, Ohm: 10000}}
	ids := func(rs []Resistor) []int64 {
		var out []int64
		for _, r := range rs {
			out = append(out, r.ID)
		}
		return out
	}
	tests := []struct {
		name   string
		rs     []Resistor
		lo, hi float64
		want   []int64
		how    []ValueMatch
	}{
		{"6K8 not stocked", rs, 6800, 6800, []int64{2, 3, 4}, []ValueMatch{MatchBelow, MatchBelow, MatchAbove}},
		{"6K8 stocked", append(slices.Clone(rs[:3]), append([]Resistor{{ID: 9, Ohm: 6800}}, rs[3:]...)...), 6800, 6800,
			[]int64{2, 3, 9, 4}, []ValueMatch{MatchBelow, MatchBelow, MatchIn, MatchAbove}},
		{"4K..5K", rs, 4000, 5000, []int64{1, 2, 3}, []ValueMatch{MatchIn, MatchAbove, MatchAbove}},
		{"below everything", rs, 100, 100, []int64{1}, []ValueMatch{MatchAbove}},
		{"above everything", rs, 1e6, 1e6, []int64{5}, []ValueMatch{MatchBelow}},
		{"empty stock", nil, 6800, 6800, nil, nil},
	}
	for _, tt := range tests {
		got, how := NearValues(tt.rs, tt.lo, tt.hi)
		if !slices.Equal(ids(got), tt.want) || !slices.Equal(how, tt.how) {
			t.Errorf("%s: %v %v, want %v %v", tt.name, ids(got), how, tt.want, tt.how)
		}
	}
}
