package picker

import (
	"slices"
	"testing"

	"biasbin/solver"
)

// TestQuantities checks that N boards draw N parts per position from a
// line, that two positions on one line need twice that, and that a pair
// needs one part of each of its lines (or two of one line) per position
// (common practice: a kit is counted over every position of every board).
func TestQuantities(t *testing.T) {
	lines := []Resistor{
		{ID: 1, Ohm: 1000, Qty: 4, Tol: 0.05, Rated_W: 0.25},
		{ID: 2, Ohm: 2200, Qty: 2, Tol: 0.05, Rated_W: 0.25},
		{ID: 3, Ohm: 4700, Qty: 3, Tol: 0.05, Rated_W: 0.25},
		{ID: 4, Ohm: 100e3, Qty: 10, Tol: 0.05, Rated_W: 0.25},
	}
	s, err := normalize(Request{VCC_V: 12, IC_A: 1e-3, Boards: 2})
	if err != nil {
		t.Fatal(err)
	}
	vs := buildValues(lines, 2, true, 50, s.lim)
	e := &evaluator{s: s, lay: &dividerLayout, vs: &vs, devs: []device{{line: smallNPN(9, 100, 300)}}}
	find := func(ohm float64, arr string) int {
		for i, v := range vs.values {
			if sameOhm(v.ohm, ohm) && v.arr == arr {
				return i
			}
		}
		t.Fatalf("no %s value of %g ohm", arr, ohm)
		return -1
	}
	k1, k2, k3, k4 := find(1000, Single), find(2200, Single), find(4700, Single), find(100e3, Single)
	s11 := find(2000, Series)  // 1000 + 1000, line 1 twice: 2 parts/board
	p11 := find(500, Parallel) // 1000 ‖ 1000
	s12 := find(3200, Series)  // 1000 + 2200
	cases := []struct {
		name string
		val  [nPos]int
		want bool
	}{
		{"all different lines", [nPos]int{k1, k2, k3, k1}, true},        // line 1: 2/board × 2 = 4 ≤ 4
		{"line 1 in three positions", [nPos]int{k1, k1, k3, k1}, false}, // 6 > 4
		{"pair of line 1 plus a single", [nPos]int{s11, k2, k3, k4}, true},
		{"line 3 in two positions", [nPos]int{s11, k2, k3, k3}, false},                  // 4 > 3
		{"pair of line 1 twice plus a single of it", [nPos]int{s11, k1, k3, k2}, false}, // 3/board × 2 = 6 > 4
		{"parallel of line 1 and line 3 twice", [nPos]int{p11, k3, k3, k2}, false},      // line 3: 4 > 3
		{"mixed pair uses one of each", [nPos]int{s12, k3, k1, k1}, true},               // line 1: 3/board?
	}
	// the last case draws line 1 three times per board: 6 > 4
	cases[len(cases)-1].want = false
	for _, c := range cases {
		got := e.fitsQuantity(combo{val: c.val})
		if got != c.want {
			t.Errorf("%s: fits = %v, want %v", c.name, got, c.want)
		}
	}
	// A line with fewer parts than boards gives no value at all; the same
	// line twice in a pair needs 2·boards parts.
	for _, v := range vs.values {
		if v.arr != Single && v.lines[0] == v.lines[1] && lines[v.lines[0]].Qty < 4 {
			t.Errorf("pair of line %d twice with only %d parts for 2 boards", lines[v.lines[0]].ID, lines[v.lines[0]].Qty)
		}
	}
}

// TestValueOrder checks the level grouping and the documented preference
// inside a level: single before series before parallel, then tighter
// tolerance.
func TestValueOrder(t *testing.T) {
	lines := []Resistor{
		{ID: 1, Ohm: 2000, Qty: 10, Tol: 0.05, Rated_W: 0.25},
		{ID: 2, Ohm: 1000, Qty: 10, Tol: 0.05, Rated_W: 0.25},
		{ID: 3, Ohm: 2000, Qty: 10, Tol: 0.01, Rated_W: 0.25},
		{ID: 4, Ohm: 4000, Qty: 10, Tol: 0.01, Rated_W: 0.25},
	}
	vs := buildValues(lines, 1, true, 50, solver.Limits{}.WithDefaults())
	for i := 1; i < len(vs.levels); i++ {
		if vs.levels[i].ohm <= vs.levels[i-1].ohm {
			t.Fatalf("levels not ascending at %d", i)
		}
	}
	l := vs.levelAtOrAbove(2000)
	var got []string
	for _, vi := range vs.levels[l].values {
		v := vs.values[vi]
		got = append(got, v.arr)
	}
	// 2000 ohm: two singles (1 % first), series 1000+1000, parallel 4000‖4000
	want := []string{Single, Single, Series, Parallel}
	if len(got) != len(want) {
		t.Fatalf("2000 ohm level has %v, want %v", got, want)
	}
	for i := range want {
		if got[i] != want[i] {
			t.Fatalf("2000 ohm level order %v, want %v", got, want)
		}
	}
	if first := vs.values[vs.levels[l].values[0]]; lines[first.lines[0]].ID != 3 {
		t.Errorf("first single at 2000 ohm is line %d, want the 1 %% line 3", lines[first.lines[0]].ID)
	}
}

// TestValueMemoSharesBySetting: one Pick's searches share a value set
// only when it was built for the same pairs setting and the same kept
// parts, and a nil memo builds every time.
func TestValueMemoSharesBySetting(t *testing.T) {
	builds := 0
	build := func() *valueSet { builds++; return &valueSet{} }
	k1 := []solver.ResistorSpec{{Nominal_Ohm: 4700, Tol: 0.05}}
	k2 := []solver.ResistorSpec{{Nominal_Ohm: 4700, Tol: 0.1}}
	m := &valueMemo{}
	a := m.get(true, nil, build)
	cases := []struct {
		name  string
		pairs bool
		kept  []solver.ResistorSpec
		same  bool // the first set again
	}{
		{"same setting", true, nil, true},
		{"no pairs", false, nil, false},
		{"a kept part", true, k1, false},
		{"another tolerance", true, k2, false},
	}
	for _, c := range cases {
		if got := m.get(c.pairs, c.kept, build); (got == a) != c.same {
			t.Errorf("%s: shared %v, want %v", c.name, got == a, c.same)
		}
	}
	if m.get(true, slices.Clone(k1), build) == m.get(true, k2, build) {
		t.Error("the sets of two kept parts are shared")
	}
	if builds != 4 {
		t.Errorf("%d sets built, want 4 (one per setting)", builds)
	}
	var none *valueMemo
	if none.get(true, nil, build) == none.get(true, nil, build) {
		t.Error("a nil memo shared a set")
	}
}
