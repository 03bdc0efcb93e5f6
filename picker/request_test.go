package picker

import (
	"errors"
	"strings"
	"testing"

	"biasbin/solver"
	"biasbin/solver/eseries"
)

// TestBadInput: every bad request or stock is an *InputError naming the
// field and saying what would fix it.
func TestBadInput(t *testing.T) {
	good := Stock{Resistors: seriesStock(eseries.E12, 100, 100e3, 0.05, 0.25, 10, 100), Transistors: []Transistor{smallNPN(1, 100, 300)}}
	base := Request{VCC_V: 12, IC_A: 1e-3}
	cases := []struct {
		name  string
		stock Stock
		mod   func(*Request)
		field string
	}{
		{"zero supply", good, func(r *Request) { r.VCC_V = 0 }, "vcc"},
		{"pnp with a positive rail", good, func(r *Request) { r.Polarity = solver.PNP }, "vcc"},
		{"no current", good, func(r *Request) { r.IC_A = 0 }, "ic"},
		{"current the supply cannot drive", good, func(r *Request) { r.IC_A = 0.5 }, "ic"},
		{"vce above the supply", good, func(r *Request) { r.VCE_V = 12 }, "vce"},
		{"emitter band upside down", good, func(r *Request) { r.VEMin_V, r.VEMax_V = 3, 1 }, "ve"},
		{"emitter band leaves no VCE", good, func(r *Request) { r.VCE_V, r.VEMin_V, r.VEMax_V = 6, 6, 7 }, "ve"},
		{"negative weight", good, func(r *Request) { r.Weights = Weights{QPoint: 1, Beta: -1} }, "weights.beta"},
		{"ambient upside down", good, func(r *Request) { r.AmbientMin_C, r.AmbientMax_C = 60, 10 }, "ambient"},
		{"negative boards", good, func(r *Request) { r.Boards = -2 }, "boards"},
		{"negative load", good, func(r *Request) { r.RL_Ohm = -1 }, "load"},
		{"transistor not stocked", good, func(r *Request) { r.Transistor = "QX-9" }, "transistor"},
		{"unknown topology", good, func(r *Request) { r.Topology = solver.Topology(9) }, "topology"},
		{"split supply without its rail", good, func(r *Request) { r.Topology = solver.SplitSupply }, "vee"},
		{"emitter rail on a divider", good, func(r *Request) { r.VEE_V = -12 }, "vee"},
		{"emitter rail tolerance without the rail", good, func(r *Request) { r.VEETol = 0.1 }, "vee_tol"},
		{"emitter rail of the collector's sign", good, func(r *Request) { r.Topology = solver.SplitSupply; r.VEE_V = 12 }, "vee"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			req := base
			c.mod(&req)
			_, err := Pick(c.stock, req)
			var ie *InputError
			if !errors.As(err, &ie) {
				t.Fatalf("error %v, want an *InputError", err)
			}
			if ie.Field != c.field || ie.Fix == "" || !strings.Contains(err.Error(), ie.Fix) {
				t.Errorf("error %q: field %q (want %q), fix %q", err, ie.Field, c.field, ie.Fix)
			}
		})
	}
}

// TestStockGap: a stock without resistors (with the tags asked for), or
// without a transistor of the polarity, is refused before any search,
// naming what is missing; tags match without regard to letter case.
func TestStockGap(t *testing.T) {
	good := Stock{Resistors: seriesStock(eseries.E12, 100, 100e3, 0.05, 0.25, 10, 100), Transistors: []Transistor{smallNPN(1, 100, 300)}}
	tagged := good
	tagged.Resistors = append([]Resistor(nil), good.Resistors...)
	for i := range tagged.Resistors {
		tagged.Resistors[i].Tags = []string{"approved"}
	}
	tagged.Transistors = []Transistor{smallNPN(1, 100, 300)}
	tagged.Transistors[0].Tags = []string{"approved"}
	cases := []struct {
		name      string
		stock     Stock
		req       Request
		resistors bool
		pol       solver.Polarity
		other     int
	}{
		{"empty stock", Stock{}, Request{VCC_V: 12, IC_A: 1e-3}, true, 0, 0},
		{"no resistors", Stock{Transistors: good.Transistors}, Request{VCC_V: 12, IC_A: 1e-3}, true, 0, 0},
		{"no resistor with the tag", good, Request{VCC_V: 12, IC_A: 1e-3, RequireTags: []string{"approved"}}, true, 0, 0},
		{"no transistor of the polarity", good, Request{VCC_V: -12, IC_A: 1e-3}, false, solver.PNP, 1},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := Pick(c.stock, c.req)
			var g *StockGapError
			if !errors.As(err, &g) || g.Resistors != c.resistors || (!c.resistors && (g.Polarity != c.pol || g.OtherPolarity != c.other)) {
				t.Fatalf("error %v, want a stock gap (resistors %v, polarity %v, other %d)", err, c.resistors, c.pol, c.other)
			}
		})
	}
	if _, err := Pick(tagged, Request{VCC_V: 12, IC_A: 1e-3, RequireTags: []string{"APPROVED"}, Top: 1}); err != nil {
		t.Errorf("a tag in capitals does not match the stocked lower-case tag: %v", err)
	}
}

// TestDefaults: the zero request fields take the documented defaults.
func TestDefaults(t *testing.T) {
	s, err := normalize(Request{VCC_V: -9, IC_A: 1e-3})
	if err != nil {
		t.Fatal(err)
	}
	if s.pol != solver.PNP || s.vcc != 9 || s.top != DefaultTop || s.boards != 1 || s.ambMin != 0 || s.ambMax != 50 ||
		s.w != DefaultWeights() || s.pool != 2*DefaultTop+5 || s.yieldBoards != DefaultYieldBoards ||
		s.lim.ResistorMaxFraction != 0.5 || s.lim.VCEMargin_V != 0.5 {
		t.Errorf("defaults: %+v", s)
	}
}

// TestEmitterRailTolerance: a split-supply build carries the request's
// emitter rail tolerance, or the supply's when none is given; the other
// topologies carry none.
func TestEmitterRailTolerance(t *testing.T) {
	st := Stock{Resistors: seriesStock(eseries.E12, 100, 100e3, 0.05, 0.25, 10, 100), Transistors: []Transistor{smallNPN(1, 100, 300)}}
	for _, c := range []struct {
		topo   solver.Topology
		veeTol float64
		want   float64
	}{
		{solver.SplitSupply, 0.1, 0.1},
		{solver.SplitSupply, 0, 0.05},
		{solver.Divider, 0, 0},
	} {
		req := Request{Topology: c.topo, VCC_V: 12, VCCTol: 0.05, VEETol: c.veeTol, IC_A: 1e-3, Top: 1}
		if c.topo == solver.SplitSupply {
			req.VEE_V = -12
		}
		res, err := Pick(st, req)
		if err != nil {
			t.Fatal(err)
		}
		if len(res.Candidates) == 0 {
			t.Fatalf("%v: no build", c.topo)
		}
		if got := res.Candidates[0].Build.VEETol; got != c.want {
			t.Errorf("%v with VEETol %g: the build carries %g, want %g", c.topo, c.veeTol, got, c.want)
		}
	}
}
