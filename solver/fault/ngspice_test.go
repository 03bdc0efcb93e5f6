package fault_test

import (
	"context"
	"fmt"
	"math"
	"strings"
	"testing"
	"time"

	"biasbin/solver"
	"biasbin/solver/fault"
	"biasbin/solver/spicecheck"
)

// meterDisplay rounds v as a 3½-digit meter on its best range shows it:
// 1999 counts on the 200 mV, 2 V, 20 V and 200 V ranges (common practice).
func meterDisplay(v float64) float64 {
	for _, fullScale := range []float64{0.2, 2, 20, 200} {
		if math.Abs(v) < fullScale*1999/2000 {
			step := fullScale / 2000
			return math.Round(v/step) * step
		}
	}
	return math.Round(v/1) * 1
}

// injected is one faulty circuit: the stage as marked, the datasheet the
// diagnosis is given, the actual part (hFE and VBE offset inside the
// datasheet's spread) and the fault as ngspice netlist edits.
type injected struct {
	name  string
	s     solver.Stage
	d     solver.Datasheet
	hfe   float64 // the actual part's forward beta
	shift float64 // the actual part's VBE(on) offset from the datasheet, V
	want  fault.Fault
}

// faultDeck writes the faulty stage as an ngspice deck, written here from
// the fault's physical meaning and not by the package under test: the
// stage is a subcircuit instanced three times, each with a 10 MΩ meter on
// one node (b, e, c), and an open part is 1 TΩ.
func faultDeck(c injected) string {
	s, w := c.s, c.want
	var b strings.Builder
	fmt.Fprintf(&b, "* injected fault: %s\n", c.name)
	// cr and er are the collector-side and emitter-side rails: node 0 is
	// the emitter side, or the collector side for a stage grounded there
	// (a PNP stage on a positive supply: the emitter side sits at |VCC|).
	cr, er := "vcc", "0"
	if s.Ground == solver.CollectorRailGround {
		cr, er = "0", "vs"
		fmt.Fprintf(&b, "vs vs 0 dc %.12g\n", -s.VCC_V)
	} else {
		fmt.Fprintf(&b, "vcc vcc 0 dc %.12g\n", s.VCC_V)
	}
	vee := er
	if s.Topology == solver.SplitSupply {
		fmt.Fprintf(&b, "vee vee 0 dc %.12g\n", s.VEE_V)
		vee = "vee"
	}
	b.WriteString(".subckt stage vcc er vee b c e\n")
	res := func(sl solver.Slot, n1, n2 string) {
		r := s.R_Ohm[sl]
		if p, ok := w.Position.Slot(); ok && p == sl {
			switch w.Kind {
			case fault.Open:
				r = 1e12
			case fault.Short:
				r = 0.1
			case fault.Drift:
				r = w.Ohm
			}
		}
		if r == 0 {
			fmt.Fprintf(&b, "v%s %s %s dc 0\n", sl, n1, n2)
			return
		}
		fmt.Fprintf(&b, "r%s %s %s %.12g\n", sl, n1, n2, r)
	}
	switch s.Topology {
	case solver.Divider:
		res(solver.R1, "vcc", "b")
		res(solver.R2, "b", "er")
		res(solver.RE, "e", "er")
	case solver.CollectorFeedback:
		res(solver.RF, "c", "b")
		res(solver.RE, "e", "er")
	case solver.SplitSupply:
		res(solver.RB, "b", "0")
		res(solver.RE, "e", "vee")
	}
	res(solver.RC, "vcc", "c")
	cn, en := "c", "e"
	if w.Position == fault.Transistor {
		switch w.Kind {
		case fault.BEOpen:
			en = "ei"
			b.WriteString("ropen ei e 1e12\n")
		case fault.BCOpen:
			cn = "ci"
			b.WriteString("ropen ci c 1e12\n")
		case fault.BEShort:
			b.WriteString("rshort b e 0.1\n")
		case fault.BCShort:
			b.WriteString("rshort b c 0.1\n")
		case fault.CEShort:
			b.WriteString("rshort c e 0.1\n")
		case fault.Leak:
			from, to := "c", "b"
			if c.d.Polarity == solver.PNP {
				from, to = "b", "c"
			}
			fmt.Fprintf(&b, "ileak %s %s dc %.12g\n", from, to, w.Leak_A)
		}
	}
	fmt.Fprintf(&b, "q1 %s b %s qdut\n.ends\n", cn, en)
	for i, probe := range []string{"b", "e", "c"} {
		nodes := map[string]string{"b": "b", "c": "c", "e": "e"}
		for k := range nodes {
			nodes[k] = fmt.Sprintf("%s%d", k, i)
		}
		fmt.Fprintf(&b, "x%d %s %s %s %s %s %s stage\n", i, cr, er, vee, nodes["b"], nodes["c"], nodes["e"])
		fmt.Fprintf(&b, "rmeter%d %s 0 10meg\n", i, nodes[probe])
	}
	hfe := c.hfe
	if w.Kind == fault.LowHFE {
		hfe = w.HFE
	}
	m, err := solver.ModelFor(c.d, hfe)
	if err != nil {
		panic(err)
	}
	is := m.IS_A * math.Exp(-c.shift/solver.ThermalVoltage_V(25))
	typ := "npn"
	if c.d.Polarity == solver.PNP {
		typ = "pnp"
	}
	fmt.Fprintf(&b, ".model qdut %s (is=%.12g bf=%.12g br=1 nf=1 xti=3 xtb=1.5 eg=1.11 tnom=25)\n", typ, is, hfe)
	b.WriteString(".options tnom=25 temp=25 reltol=1e-9 vntol=1e-12 abstol=1e-18\n.end\n")
	return b.String()
}

func stageOf(top solver.Topology, vcc, vee float64, r map[solver.Slot]float64) solver.Stage {
	s := solver.Stage{Topology: top, VCC_V: vcc, VEE_V: vee}
	for k, v := range r {
		s.R_Ohm[k] = v
	}
	return s
}

// injectedFaults are invented stages and parts; each fault is one of the
// kinds the diagnosis names.
func injectedFaults() []injected {
	type R = map[solver.Slot]float64
	npn := solver.Datasheet{Label: "general npn", Polarity: solver.NPN, HFEMin: 110, HFEMax: 450, VBEOn_V: 0.66}
	pnp := solver.Datasheet{Label: "general pnp", Polarity: solver.PNP, HFEMin: 100, HFEMax: 300, VBEOn_V: 0.68}
	div := stageOf(solver.Divider, 12, 0, R{solver.R1: 39e3, solver.R2: 8.2e3, solver.RC: 3.9e3, solver.RE: 1e3})
	divP := stageOf(solver.Divider, -9, 0, R{solver.R1: 33e3, solver.R2: 10e3, solver.RC: 2.2e3, solver.RE: 820})
	fb := stageOf(solver.CollectorFeedback, 15, 0, R{solver.RF: 330e3, solver.RC: 4.7e3, solver.RE: 470})
	split := stageOf(solver.SplitSupply, 12, -12, R{solver.RB: 22e3, solver.RC: 5.6e3, solver.RE: 10e3})
	divPos := divP // the same PNP stage on a positive supply: 0 V on its collector side
	divPos.Ground = solver.CollectorRailGround
	fbPos := stageOf(solver.CollectorFeedback, -12, 0, R{solver.RF: 220e3, solver.RC: 3.3e3, solver.RE: 680})
	fbPos.Ground = solver.CollectorRailGround
	splitP := stageOf(solver.SplitSupply, -15, 15, R{solver.RB: 47e3, solver.RC: 6.8e3, solver.RE: 12e3})
	at := fault.ResistorAt
	q := fault.Transistor
	return []injected{
		{"divider, R2 open", div, npn, 300, 0.01, fault.Fault{Position: at(solver.R2), Kind: fault.Open}},
		{"divider, R1 drifted 39k to 68k", div, npn, 180, -0.015, fault.Fault{Position: at(solver.R1), Kind: fault.Drift, Ohm: 68e3}},
		{"divider, RE drifted 1k to 2.7k", div, npn, 250, 0, fault.Fault{Position: at(solver.RE), Kind: fault.Drift, Ohm: 2.7e3}},
		{"divider, RC open", div, npn, 200, 0.02, fault.Fault{Position: at(solver.RC), Kind: fault.Open}},
		{"divider, RE shorted", div, npn, 150, 0, fault.Fault{Position: at(solver.RE), Kind: fault.Short}},
		{"divider, emitter junction open", div, npn, 220, 0, fault.Fault{Position: q, Kind: fault.BEOpen}},
		{"divider, collector-emitter short", div, npn, 220, 0, fault.Fault{Position: q, Kind: fault.CEShort}},
		{"divider, base-collector short", div, npn, 120, -0.02, fault.Fault{Position: q, Kind: fault.BCShort}},
		{"divider, base-emitter short", div, npn, 400, 0, fault.Fault{Position: q, Kind: fault.BEShort}},
		{"pnp divider, R1 shorted", divP, pnp, 160, 0.01, fault.Fault{Position: at(solver.R1), Kind: fault.Short}},
		{"pnp divider, collector junction open", divP, pnp, 200, 0, fault.Fault{Position: q, Kind: fault.BCOpen}},
		{"pnp divider on a positive supply, R2 open", divPos, pnp, 180, 0, fault.Fault{Position: at(solver.R2), Kind: fault.Open}},
		{"pnp divider on a positive supply, RE drifted 820 to 2.2k", divPos, pnp, 220, 0.01, fault.Fault{Position: at(solver.RE), Kind: fault.Drift, Ohm: 2.2e3}},
		{"pnp collector feedback on a positive supply, RC open", fbPos, pnp, 150, 0, fault.Fault{Position: at(solver.RC), Kind: fault.Open}},
		{"collector feedback, RF open", fb, npn, 300, 0, fault.Fault{Position: at(solver.RF), Kind: fault.Open}},
		{"collector feedback, 40 µA collector-base leakage", fb, npn, 200, 0, fault.Fault{Position: q, Kind: fault.Leak, Leak_A: 40e-6}},
		{"split supply, hFE fallen to 8", split, npn, 200, 0, fault.Fault{Position: q, Kind: fault.LowHFE, HFE: 8}},
		{"pnp split supply, RB drifted 47k to 220k", splitP, pnp, 150, 0, fault.Fault{Position: at(solver.RB), Kind: fault.Drift, Ohm: 220e3}},
	}
}

// TestDiagnoseInjectedFaults is the outside check: for each
// injected fault, ngspice (Debian package, run by the test) solves the
// faulty circuit with a 10 MΩ meter on each node, the readings are rounded
// as a 3½-digit meter shows them, and the diagnosis must rank the injected
// fault first or second.
func TestDiagnoseInjectedFaults(t *testing.T) {
	spicecheck.Require(t)
	cases := injectedFaults()
	jobs := make([]spicecheck.Job, len(cases))
	for i, c := range cases {
		jobs[i] = spicecheck.Job{Deck: faultDeck(c), Vectors: []string{"v(b0)", "v(e1)", "v(c2)"}}
	}
	ctx, cancel := context.WithTimeout(context.Background(), 2*time.Minute)
	defer cancel()
	res, err := spicecheck.Run(ctx, jobs)
	if err != nil {
		t.Fatal(err)
	}
	first, second := 0, 0
	for i, c := range cases {
		r := fault.Readings{VB_V: meterDisplay(res[i]["v(b0)"]), VE_V: meterDisplay(res[i]["v(e1)"]), VC_V: meterDisplay(res[i]["v(c2)"])}
		dg, err := fault.Diagnose(c.s, c.d, r, fault.Settings{})
		if err != nil {
			t.Errorf("%s: readings %+v: %v", c.name, r, err)
			continue
		}
		rank := 0
		for _, f := range dg.Faults {
			if f.Fault.Position == c.want.Position && f.Fault.Kind == c.want.Kind {
				rank = f.Rank
				break
			}
		}
		top := dg.Faults[0]
		t.Logf("%s: readings %.4g/%.4g/%.4g V; injected ranks %d; first %v %v fit %.2f, second %v %v fit %.2f; explained %v",
			c.name, r.VB_V, r.VE_V, r.VC_V, rank, top.Fault.Position, top.Fault.Kind, top.Fit, dg.Faults[1].Fault.Position, dg.Faults[1].Fault.Kind, dg.Faults[1].Fit, dg.Explained)
		switch rank {
		case 1:
			first++
		case 2:
			second++
		default:
			t.Errorf("%s: injected %v %v ranks %d, want 1 or 2", c.name, c.want.Position, c.want.Kind, rank)
		}
		if !dg.Explained {
			t.Errorf("%s: the injected fault reproduces the readings, yet no fault explains them (best fit %.2f)", c.name, top.Fit)
		}
		if dg.Healthy {
			t.Errorf("%s: the faulty readings are reported as a working stage (fit %.2f)", c.name, dg.Working.Fit)
		}
	}
	t.Logf("ngspice: %d injected faults diagnosed from 3½-digit readings (%d ranked first, %d second)", len(cases), first, second)
}
