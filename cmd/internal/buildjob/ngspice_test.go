package buildjob

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

// The stage and part of this file are invented; the readings come from
// ngspice.

// bench is an NPN divider stage: 12 V, R1 47K, R2 10K, RC 4K7, RE 1K2,
// a transistor of hFE 110..450.
func bench(t *testing.T) Plan {
	t.Helper()
	b := solver.Build{Topology: solver.Divider, VCC_V: 12, VCCTol: 0.05, NominalAmbient_C: 25, AmbientMin_C: 0, AmbientMax_C: 50,
		Device: solver.Datasheet{Label: "QT-9", Polarity: solver.NPN, HFEMin: 110, HFEMax: 450, VBEOn_V: 0.65, VBEAt_A: 1e-3}}
	for sl, ohm := range map[solver.Slot]float64{solver.R1: 47e3, solver.R2: 10e3, solver.RC: 4.7e3, solver.RE: 1.2e3} {
		b.Resistors[sl] = solver.ResistorSpec{Nominal_Ohm: ohm, Tol: 0.05, Rated_W: 0.25}
	}
	op, _, err := solver.Nominal(b)
	if err != nil {
		t.Fatal(err)
	}
	wc, err := solver.EvalWorstCase(b, solver.Limits{})
	if err != nil {
		t.Fatal(err)
	}
	return Plan{Version: planVersion, Build: b, Bands: bandsOf(op, wc)}
}

// injectedFault is one fault as ngspice netlist edits, written here from
// the fault's physical meaning: the resistor values of the faulty board
// and any element added inside the transistor's case.
type injectedFault struct {
	name        string
	part, fault string // as Cause names them
	r           map[solver.Slot]float64
	extra       string // netlist lines inside the stage (nodes b c e, emitter internal node ei)
	emitterNode string // "e", or "ei" when the emitter lead is open
}

// faultyDeck writes the board: the stage as a subcircuit instanced three
// times, each with a 10 MΩ meter (a digital multimeter's input, common
// practice) from one node to ground, the actual part at hFE 200.
func faultyDeck(p Plan, f injectedFault) string {
	var b strings.Builder
	fmt.Fprintf(&b, "* board with %s\nvcc vcc 0 dc %g\n.subckt stage vcc b c e\n", f.name, p.Build.VCC_V)
	val := func(sl solver.Slot) float64 {
		if v, ok := f.r[sl]; ok {
			return v
		}
		return p.Build.Resistors[sl].Nominal_Ohm
	}
	fmt.Fprintf(&b, "r1 vcc b %g\nr2 b 0 %g\nrc vcc c %g\nre e 0 %g\n", val(solver.R1), val(solver.R2), val(solver.RC), val(solver.RE))
	b.WriteString(f.extra)
	en := f.emitterNode
	if en == "" {
		en = "e"
	}
	fmt.Fprintf(&b, "q1 c b %s qdut\n.ends\n", en)
	for i, probe := range []string{"b", "e", "c"} {
		fmt.Fprintf(&b, "x%d vcc b%d c%d e%d stage\nrm%d %s%d 0 10meg\n", i, i, i, i, i, probe, i)
	}
	m, err := solver.ModelFor(p.Build.Device, 200)
	if err != nil {
		panic(err)
	}
	fmt.Fprintf(&b, ".model qdut npn (is=%.12g bf=200 br=1 nf=1 tnom=25)\n", m.IS_A)
	b.WriteString(".options tnom=25 temp=25 reltol=1e-9\n.end\n")
	return b.String()
}

// display rounds v as a 3½-digit meter on its best range shows it (1999
// counts on 2 V, 20 V and 200 V; common practice).
func display(v float64) float64 {
	for _, fs := range []float64{2, 20, 200} {
		if math.Abs(v) < fs*1999/2000 {
			return math.Round(v/(fs/2000)) * (fs / 2000)
		}
	}
	return math.Round(v)
}

// TestMeasureNamesInjectedFaults is the outside check of build measure:
// six faults are injected into the board, ngspice (Debian package, run by
// the test) gives the readings, and the injected fault must be named
// first or second.
func TestMeasureNamesInjectedFaults(t *testing.T) {
	spicecheck.Require(t)
	p := bench(t)
	faults := []injectedFault{
		{name: "RE open", part: "re", fault: "open", r: map[solver.Slot]float64{solver.RE: 1e12}},
		{name: "base-emitter shorted", part: "q", fault: "be-short", extra: "rshort b e 0.1\n"},
		{name: "R2 open", part: "r2", fault: "open", r: map[solver.Slot]float64{solver.R2: 1e12}},
		{name: "R1 at twice its value", part: "r1", fault: "drift", r: map[solver.Slot]float64{solver.R1: 94e3}},
		{name: "60 µA collector-base leakage", part: "q", fault: "leak", extra: "ileak c b dc 60e-6\n"},
		{name: "RC at half its value", part: "rc", fault: "drift", r: map[solver.Slot]float64{solver.RC: 2.35e3}},
	}
	jobs := make([]spicecheck.Job, len(faults))
	for i, f := range faults {
		jobs[i] = spicecheck.Job{Deck: faultyDeck(p, f), Vectors: []string{"v(b0)", "v(e1)", "v(c2)"}}
	}
	ctx, cancel := context.WithTimeout(context.Background(), 2*time.Minute)
	defer cancel()
	res, err := spicecheck.Run(ctx, jobs)
	if err != nil {
		t.Fatal(err)
	}
	first, second := 0, 0
	for i, f := range faults {
		r := readingsOf(display(res[i]["v(b0)"]), display(res[i]["v(e1)"]), display(res[i]["v(c2)"]))
		rd, err := Judge(p, r)
		if err != nil {
			t.Errorf("%s: %v", f.name, err)
			continue
		}
		if rd.Verdict != VerdictOut {
			t.Errorf("%s: readings %+v judged %s, want out of band (bands %+v)", f.name, r, rd.Verdict, p.Bands)
			continue
		}
		rank := 0
		for _, c := range rd.Causes {
			if c.Part == f.part && c.Fault == f.fault {
				rank = c.Rank
				break
			}
		}
		t.Logf("%s: VB %.3g VE %.3g VC %.3g V; named %d; first %s %s (fit %.2f)", f.name, r.VB_V, r.VE_V, r.VC_V,
			rank, rd.Causes[0].Part, rd.Causes[0].Fault, rd.Causes[0].Fit)
		switch rank {
		case 1:
			first++
		case 2:
			second++
		default:
			t.Errorf("%s: injected fault ranks %d, want 1 or 2 (causes %+v)", f.name, rank, rd.Causes)
		}
	}
	t.Logf("ngspice: %d faulty boards judged by build measure (%d named first, %d second)", len(faults), first, second)
}

// readingsOf gathers three readings.
func readingsOf(vb, ve, vc float64) fault.Readings {
	return fault.Readings{VB_V: vb, VE_V: ve, VC_V: vc}
}
