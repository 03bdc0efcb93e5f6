package solver_test

import (
	"context"
	"errors"
	"fmt"
	"math"
	"testing"
	"time"

	"biasbin/solver"
	"biasbin/solver/spicecheck"
)

var selfHeatedStages = []struct {
	name          string
	s             solver.Stage
	m             solver.Model
	ambient, th   float64
	vceBelowHalfV bool // VCE < VCC/2: inherently stable
}{
	{"divider 15 V, 4 mA", stage(solver.Divider, 15, 0, R{solver.R1: 10e3, solver.R2: 5e3, solver.RC: 1e3, solver.RE: 1e3}), npnModel(1e-14, 100, 0, 0), 25, 200, false},
	{"divider RE=0, 30 mA", stage(solver.Divider, 12, 0, R{solver.R1: 22e3, solver.R2: 1.5e3, solver.RC: 180}), npnModel(1e-14, 150, 80, 0), 40, 250, false},
	{"collector feedback, hot ambient", stage(solver.CollectorFeedback, 24, 0, R{solver.RF: 100e3, solver.RC: 1e3, solver.RE: 220}), npnModel(5e-15, 200, 0, 0), 85, 300, false},
	{"split supply, VCE < VCC/2", stage(solver.SplitSupply, 12, -12, R{solver.RB: 10e3, solver.RC: 1.5e3, solver.RE: 1.2e3}), npnModel(1e-14, 120, 0, 0), -20, 500, true},
}

// TestSelfHeatedAgainstNgspice: the self-heated point must be an
// equilibrium of the heat balance as ngspice sees it — ngspice run at the
// returned Tj gives the same node voltages (1 mV or 0.1 %) and a
// dissipation @q1[p] with Ta + θJA·P = Tj within 1 mK (source: ngspice op
// run; @q1[p] is VCE·IC + VBE·IB, REFERENCE.md §8 [C]).
func TestSelfHeatedAgainstNgspice(t *testing.T) {
	spicecheck.Require(t)
	var jobs []spicecheck.Job
	var ops []solver.OperatingPoint
	for _, c := range selfHeatedStages {
		for _, pol := range []solver.Polarity{solver.NPN, solver.PNP} {
			s, m := c.s, c.m
			if pol == solver.PNP {
				s, m = mirror(s, m)
			}
			op, err := solver.SolveSelfHeated(s, m, c.ambient, c.th, 150)
			if err != nil {
				t.Fatalf("%s %v: %v", c.name, pol, err)
			}
			if op.Tj_C <= c.ambient {
				t.Errorf("%s %v: Tj %g °C not above ambient %g °C", c.name, pol, op.Tj_C, c.ambient)
			}
			ops = append(ops, op)
			jobs = append(jobs, spicecheck.Job{Deck: solver.Netlist(s, m, op.Tj_C, fmt.Sprintf("%s %v", c.name, pol)),
				Vectors: []string{"v(b)", "v(c)", "v(e)", "@q1[p]"}})
		}
	}
	ctx, cancel := context.WithTimeout(context.Background(), 30*time.Second)
	defer cancel()
	got, err := spicecheck.Run(ctx, jobs)
	if err != nil {
		t.Fatal(err)
	}
	for i, op := range ops {
		c := selfHeatedStages[i/2]
		ng := got[i]
		if tj := c.ambient + c.th*ng["@q1[p]"]; math.Abs(tj-op.Tj_C) > 1e-3 {
			t.Errorf("%s #%d: Tj = %.5f °C, ngspice heat balance gives %.5f °C", c.name, i%2, op.Tj_C, tj)
		}
		for _, n := range []struct {
			name       string
			mine, spic float64
		}{{"VB", op.VB_V, ng["v(b)"]}, {"VC", op.VC_V, ng["v(c)"]}, {"VE", op.VE_V, ng["v(e)"]}} {
			if d := math.Abs(n.mine - n.spic); d > 1e-3 && d > 1e-3*math.Abs(n.spic) {
				t.Errorf("%s #%d: %s = %.7g V, ngspice %.7g V", c.name, i%2, n.name, n.mine, n.spic)
			}
		}
	}
	t.Logf("ngspice: %d self-heated points checked", len(ops))
}

// TestSelfHeatedStableBelowHalfSupply: with VCE ≤ VCC/2 a stage is
// inherently stable against thermal runaway (REFERENCE.md §8 [D], after
// Millman & Halkias, Integrated Electronics, ch. 9, from memory): even a
// very high θJA gives an equilibrium, and at it dP/dTj·θJA < 1.
func TestSelfHeatedStableBelowHalfSupply(t *testing.T) {
	c := selfHeatedStages[3]
	op25, err := solver.Solve(c.s, c.m, c.ambient)
	if err != nil {
		t.Fatal(err)
	}
	if op25.VCE_V > c.s.VCC_V/2 {
		t.Fatalf("fixture: VCE %g V is not below VCC/2", op25.VCE_V)
	}
	for _, th := range []float64{100, 1000, 5000} {
		op, err := solver.SolveSelfHeated(c.s, c.m, c.ambient, th, 150)
		if err != nil {
			t.Fatalf("θJA %g K/W: %v", th, err)
		}
		a, err := solver.Solve(c.s, c.m, op.Tj_C-0.5)
		if err != nil {
			t.Fatalf("θJA %g K/W: solve at Tj − 0.5 K: %v", th, err)
		}
		b, err := solver.Solve(c.s, c.m, op.Tj_C+0.5)
		if err != nil {
			t.Fatalf("θJA %g K/W: solve at Tj + 0.5 K: %v", th, err)
		}
		if b.PTransistor_W == a.PTransistor_W {
			t.Fatalf("θJA %g K/W: dissipation %g W does not move with Tj: no slope to check", th, a.PTransistor_W)
		}
		if loop := th * (b.PTransistor_W - a.PTransistor_W); loop >= 1 {
			t.Errorf("θJA %g K/W: θ·dP/dTj = %g at the equilibrium, want < 1", th, loop)
		}
	}
}

// TestThermalRunaway: a stage whose dissipation heats the junction past
// Tj max (VCE > VCC/2, no emitter feedback) has no stable equilibrium
// below it; the error wraps ErrThermalRunaway. Below that θJA the same
// stage settles.
func TestThermalRunaway(t *testing.T) {
	// 8 mA at VCE ≈ 28.6 V at 25 °C (0.23 W), rising to 22 mA and 0.58 W at
	// 150 °C: the positive feedback of the unstabilised base. With
	// Tj = Ta + θJA·PD (REFERENCE.md §8) no Tj ≤ 150 °C balances for
	// θJA ≥ 300 K/W (25 + 300·0.58 > 150).
	s := stage(solver.Divider, 30, 0, R{solver.R1: 100e3, solver.R2: 3.3e3, solver.RC: 180})
	m := npnModel(1e-14, 100, 0, 0)
	for _, c := range []struct {
		th      float64
		runaway bool
	}{{20, false}, {80, false}, {200, false}, {300, true}, {400, true}} {
		op, err := solver.SolveSelfHeated(s, m, 25, c.th, 150)
		if c.runaway {
			if !errors.Is(err, solver.ErrThermalRunaway) {
				t.Errorf("θJA %g K/W: err %v, want ErrThermalRunaway", c.th, err)
			}
			continue
		}
		if err != nil {
			t.Errorf("θJA %g K/W: %v", c.th, err)
			continue
		}
		if d := 25 + c.th*op.PTransistor_W - op.Tj_C; math.Abs(d) > 1e-5 {
			t.Errorf("θJA %g K/W: heat balance off by %g K", c.th, d)
		}
	}
}

// TestSelfHeatedNoHeadroom: with the ambient at Tj max any dissipation is
// runaway, while θJA = 0 still solves.
func TestSelfHeatedNoHeadroom(t *testing.T) {
	c := selfHeatedStages[0]
	if _, err := solver.SolveSelfHeated(c.s, c.m, 125, 200, 125); !errors.Is(err, solver.ErrThermalRunaway) {
		t.Errorf("ambient = Tj max = 125 °C: err %v, want ErrThermalRunaway", err)
	}
	if op, err := solver.SolveSelfHeated(c.s, c.m, 125, 0, 125); err != nil || op.Tj_C != 125 {
		t.Errorf("θJA = 0 at Tj max: Tj %g, err %v", op.Tj_C, err)
	}
}

// TestSelfHeatedZeroTheta: θJA = 0 means the junction sits at the ambient.
func TestSelfHeatedZeroTheta(t *testing.T) {
	c := selfHeatedStages[0]
	op, err := solver.SolveSelfHeated(c.s, c.m, 40, 0, 150)
	if err != nil {
		t.Fatal(err)
	}
	plain, err := solver.Solve(c.s, c.m, 40)
	if err != nil {
		t.Fatal(err)
	}
	if op != plain {
		t.Errorf("θJA = 0: %+v, want the plain solve at ambient %+v", op, plain)
	}
}
