package solver_test

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
	"time"

	"biasbin/solver"
	"biasbin/solver/spicecheck"
)

// refCircuit is one generated circuit for the ngspice comparison, written
// for NPN; the test also runs its PNP mirror.
type refCircuit struct {
	name string
	s    solver.Stage
	m    solver.Model
}

func stage(top solver.Topology, vcc, vee float64, r map[solver.Slot]float64) solver.Stage {
	s := solver.Stage{Topology: top, VCC_V: vcc, VEE_V: vee}
	for k, v := range r {
		s.R_Ohm[k] = v
	}
	return s
}

func npnModel(is, bf, vaf, icbo float64) solver.Model {
	return solver.Model{Polarity: solver.NPN, IS_A: is, BF: bf, BR: 1, NF: 1, VAF_V: vaf,
		XTI: 3, XTB: 1.5, EG_eV: 1.11, TNOM_C: 25, ICBO_A: icbo}
}

func mirror(s solver.Stage, m solver.Model) (solver.Stage, solver.Model) {
	s.VCC_V, s.VEE_V = -s.VCC_V, -s.VEE_V
	m.Polarity = solver.PNP
	return s, m
}

// refCircuits spans the three topologies and the three regions; values are
// chosen to land in each region, not taken from any source.
func refCircuits() []refCircuit {
	type R = map[solver.Slot]float64
	const (
		D, F, S = solver.Divider, solver.CollectorFeedback, solver.SplitSupply
	)
	return []refCircuit{
		{"divider active (REFERENCE §11 circuit)", stage(D, 15, 0, R{solver.R1: 10e3, solver.R2: 5e3, solver.RC: 1e3, solver.RE: 1e3}), npnModel(1e-14, 100, 0, 0)},
		{"divider active, VAF, RE=0", stage(D, 12, 0, R{solver.R1: 470e3, solver.R2: 47e3, solver.RC: 2.2e3}), npnModel(2e-14, 250, 80, 0)},
		{"divider active, leaky, high R_TH", stage(D, 20, 0, R{solver.R1: 1e6, solver.R2: 100e3, solver.RC: 10e3, solver.RE: 1e3}), npnModel(5e-15, 150, 60, 50e-9)},
		{"divider saturated", stage(D, 10, 0, R{solver.R1: 10e3, solver.R2: 4.7e3, solver.RC: 10e3, solver.RE: 470}), npnModel(1e-14, 120, 0, 0)},
		{"divider saturated hard, RE=0", stage(D, 5, 0, R{solver.R1: 4.7e3, solver.R2: 10e3, solver.RC: 1e3}), npnModel(3e-14, 80, 100, 0)},
		{"divider cut off", stage(D, 12, 0, R{solver.R1: 100e3, solver.R2: 2.2e3, solver.RC: 4.7e3, solver.RE: 1e3}), npnModel(1e-14, 200, 0, 0)},
		{"divider emitter follower, RC=0", stage(D, 9, 0, R{solver.R1: 22e3, solver.R2: 33e3, solver.RE: 2.2e3}), npnModel(1e-14, 150, 50, 0)},
		{"collector feedback with RE", stage(F, 10, 0, R{solver.RF: 250e3, solver.RC: 4.7e3, solver.RE: 1.2e3}), npnModel(1e-14, 90, 0, 0)},
		{"collector feedback, RE=0, VAF", stage(F, 12, 0, R{solver.RF: 100e3, solver.RC: 2.2e3}), npnModel(4e-15, 200, 100, 0)},
		{"collector feedback starved (cut off)", stage(F, 0.3, 0, R{solver.RF: 1e6, solver.RC: 10e3}), npnModel(1e-14, 100, 0, 0)},
		{"split supply active", stage(S, 15, -15, R{solver.RB: 10e3, solver.RC: 10e3, solver.RE: 20e3}), npnModel(1e-14, 100, 0, 0)},
		{"split supply saturated", stage(S, 5, -5, R{solver.RB: 1e3, solver.RC: 10e3, solver.RE: 1e3}), npnModel(1e-14, 100, 75, 0)},
		{"split supply follower, RB=0 RC=0", stage(S, 9, -9, R{solver.RE: 4.7e3}), npnModel(1e-14, 150, 0, 0)},
		{"split supply cut off", stage(S, 5, -0.25, R{solver.RB: 10e3, solver.RC: 1e3, solver.RE: 1e3}), npnModel(1e-14, 100, 0, 0)},
	}
}

// randomCircuits draws n bench-realistic stages (seeded): resistors
// 100 Ω..1 MΩ, supplies 3..30 V, IS 1e-16..1e-13 A, BF 30..500, Early
// voltage and leakage on some.
func randomCircuits(n int) []refCircuit {
	rng := rand.New(rand.NewPCG(2026, 12))
	logU := func(lo, hi float64) float64 { return lo * math.Pow(hi/lo, rng.Float64()) }
	out := make([]refCircuit, n)
	for i := range out {
		top := solver.Topology(1 + i%3)
		r := R{}
		for _, sl := range top.Slots() {
			r[sl] = logU(100, 1e6)
		}
		if rng.IntN(4) == 0 {
			r[solver.RE] = 0
		}
		vee := 0.0
		if top == solver.SplitSupply {
			vee = -logU(1, 15)
		}
		vaf, icbo := 0.0, 0.0
		if rng.IntN(2) == 0 {
			vaf = logU(20, 200)
		}
		if rng.IntN(3) == 0 {
			icbo = logU(1e-10, 1e-8)
		}
		out[i] = refCircuit{fmt.Sprintf("random #%d %v", i, top), stage(top, logU(3, 30), vee, r),
			npnModel(logU(1e-16, 1e-13), logU(30, 500), vaf, icbo)}
	}
	return out
}

// TestSolveAgainstNgspice solves every generated circuit, NPN and PNP (a
// single-supply PNP stage also on a positive supply, 0 V on its
// collector-side rail), at
// −20, 25 and 85 °C and holds each against an ngspice op run of the deck
// Netlist writes. Tolerances (from the task): node voltages within 1 mV or
// 0.1 %, IC within 0.1 %.
func TestSolveAgainstNgspice(t *testing.T) {
	spicecheck.Require(t)
	temps := []float64{-20, 25, 85}
	type run struct {
		name string
		s    solver.Stage
		m    solver.Model
		tj   float64
		op   solver.OperatingPoint
	}
	var runs []run
	var jobs []spicecheck.Job
	vectors := []string{"v(b)", "v(c)", "v(e)", "@q1[ic]", "@q1[ib]"}
	for _, c := range append(refCircuits(), randomCircuits(30)...) {
		ps, pm := mirror(c.s, c.m)
		variants := []struct {
			s solver.Stage
			m solver.Model
		}{{c.s, c.m}, {ps, pm}}
		if c.s.Topology != solver.SplitSupply {
			// The PNP stage on a positive supply: the same circuit with
			// 0 V on the collector-side rail, so every node reads |VCC|
			// higher; ngspice solves the deck grounded there.
			pos := ps
			pos.Ground = solver.CollectorRailGround
			variants = append(variants, struct {
				s solver.Stage
				m solver.Model
			}{pos, pm})
		}
		for _, v := range variants {
			for _, tj := range temps {
				op, err := solver.Solve(v.s, v.m, tj)
				if err != nil {
					t.Fatalf("%s %v %g °C: %v", c.name, v.m.Polarity, tj, err)
				}
				name := fmt.Sprintf("%s, %v %v, %g °C", c.name, v.m.Polarity, v.s.Ground, tj)
				runs = append(runs, run{name, v.s, v.m, tj, op})
				jobs = append(jobs, spicecheck.Job{Deck: solver.Netlist(v.s, v.m, tj, name), Vectors: vectors})
			}
		}
	}
	ctx, cancel := context.WithTimeout(context.Background(), 50*time.Second)
	defer cancel()
	start := time.Now()
	got, err := spicecheck.Run(ctx, jobs)
	if err != nil {
		t.Fatal(err)
	}
	regions := map[solver.Region]int{}
	covered := map[string]int{} // topology × polarity × temperature
	compared := 0
	worstV, worstIC := 0.0, 0.0 // largest node-voltage difference (V), relative IC difference
	for i, r := range runs {
		ng := got[i]
		sg := 1.0
		if r.m.Polarity == solver.PNP {
			sg = -1
		}
		for _, n := range []struct {
			node       string
			mine, spic float64
		}{{"VB", r.op.VB_V, ng["v(b)"]}, {"VC", r.op.VC_V, ng["v(c)"]}, {"VE", r.op.VE_V, ng["v(e)"]}} {
			// source: ngspice 39 op run; 1 mV or 0.1 %, whichever is looser.
			worstV = math.Max(worstV, math.Abs(n.mine-n.spic))
			if d := math.Abs(n.mine - n.spic); d > 1e-3 && d > 1e-3*math.Abs(n.spic) {
				t.Errorf("%s: %s = %.7g V, ngspice %.7g V", r.name, n.node, n.mine, n.spic)
			}
		}
		// ngspice's @q1[ic] is the device current without the leakage
		// source, current into the collector (negative for a PNP).
		_, _, _, leak := r.m.At(r.tj)
		icDev := r.op.IC_A - leak
		icNg := sg * ng["@q1[ic]"]
		// source: ngspice op; 0.1 %, with a 100 pA floor for cut-off points
		// where ngspice's GMIN (1e-12 S per junction) dominates.
		if r.op.Region != solver.Cutoff {
			worstIC = math.Max(worstIC, math.Abs(icDev/icNg-1))
		}
		if d := math.Abs(icDev - icNg); d > 1e-3*math.Abs(icNg) && d > 1e-10 {
			t.Errorf("%s: IC = %.7g A, ngspice %.7g A (%s)", r.name, icDev, icNg, r.op.Region)
		}
		regions[r.op.Region]++
		covered[fmt.Sprintf("%v %v %g", r.s.Topology, r.m.Polarity, r.tj)]++
		covered[fmt.Sprintf("%v %v %v %g", r.s.Topology, r.m.Polarity, r.s.Ground, r.tj)]++
		compared++
	}
	t.Logf("ngspice: %d circuits compared in %v (regions: %d active, %d saturation, %d cutoff); largest differences: node %.2g V, IC %.2g relative (outside cutoff)",
		compared, time.Since(start).Round(time.Millisecond), regions[solver.Active], regions[solver.Saturation], regions[solver.Cutoff], worstV, worstIC)
	if compared < 40 {
		t.Fatalf("only %d circuits compared with ngspice, want at least 40", compared)
	}
	for _, top := range []solver.Topology{solver.Divider, solver.CollectorFeedback, solver.SplitSupply} {
		for _, pol := range []solver.Polarity{solver.NPN, solver.PNP} {
			for _, tj := range temps {
				if covered[fmt.Sprintf("%v %v %g", top, pol, tj)] == 0 {
					t.Errorf("no %v %v circuit compared at %g °C", top, pol, tj)
				}
			}
		}
	}
	for _, top := range []solver.Topology{solver.Divider, solver.CollectorFeedback} {
		for _, tj := range temps {
			if covered[fmt.Sprintf("%v %v %v %g", top, solver.PNP, solver.CollectorRailGround, tj)] == 0 {
				t.Errorf("no %v PNP stage on a positive supply compared at %g °C", top, tj)
			}
		}
	}
	for _, rg := range []solver.Region{solver.Active, solver.Saturation, solver.Cutoff} {
		if regions[rg] == 0 {
			t.Errorf("no circuit in the %v region was compared", rg)
		}
	}
}
