package solver_test

import (
	"context"
	"math"
	"testing"
	"time"

	"biasbin/solver"
	"biasbin/solver/spicecheck"
)

// sensBuild is the 15 V, 10k/5k, 1k/1k divider of REFERENCE.md §10 row 7
// and §11 with a 3:1 hFE window and no self-heating.
func sensBuild() solver.Build {
	b := solver.Build{
		Topology:         solver.Divider,
		VCC_V:            15,
		Device:           solver.Datasheet{Polarity: solver.NPN, HFEMin: 100, HFEMax: 300},
		AmbientMin_C:     25,
		AmbientMax_C:     25,
		NominalAmbient_C: 25,
	}
	for s, r := range map[solver.Slot]float64{solver.R1: 10e3, solver.R2: 5e3, solver.RC: 1e3, solver.RE: 1e3} {
		b.Resistors[s] = solver.ResistorSpec{Nominal_Ohm: r, Tol: 0.05, Rated_W: 0.25}
	}
	return b
}

func TestBetaSpreadStiffDivider(t *testing.T) {
	// common practice (REFERENCE.md §5): with R_TH ≤ 0.1(β+1)RE a 3:1 beta
	// spread moves IC by only a few percent. Here R_TH = 3.33k ≤ 10.1k.
	s, err := solver.EvalSensitivity(sensBuild())
	if err != nil {
		t.Fatal(err)
	}
	if s.BetaSpread <= 0 || s.BetaSpread > 0.05 {
		t.Errorf("beta spread %.4f, want a few percent (0 < spread ≤ 0.05)", s.BetaSpread)
	}
	// A base resistor far above 0.1(β+1)RE lets beta through: spread large.
	b := sensBuild()
	b.Resistors[solver.R1].Nominal_Ohm, b.Resistors[solver.R2].Nominal_Ohm = 1e6, 500e3
	b.Resistors[solver.RC].Nominal_Ohm = 100
	loose, err := solver.EvalSensitivity(b)
	if err != nil {
		t.Fatal(err)
	}
	if loose.BetaSpread < 0.5 {
		t.Errorf("loose divider beta spread %.4f, want large (R_TH 333k ≫ 0.1(β+1)RE)", loose.BetaSpread)
	}
}

func TestBetaSpreadAgainstNgspice(t *testing.T) {
	spicecheck.Require(t)
	b := sensBuild()
	s, err := solver.EvalSensitivity(b)
	if err != nil {
		t.Fatal(err)
	}
	op, m, err := solver.Nominal(b)
	if err != nil {
		t.Fatal(err)
	}
	var jobs []spicecheck.Job
	for _, bf := range []float64{m.BF, 100, 300} {
		mm := m
		mm.BF = bf
		jobs = append(jobs, spicecheck.Job{Deck: solver.Netlist(b.NominalStage(), mm, 25, "beta spread"), Vectors: []string{"@q1[ic]"}})
	}
	ctx, cancel := context.WithTimeout(context.Background(), 30*time.Second)
	defer cancel()
	got, err := spicecheck.Run(ctx, jobs)
	if err != nil {
		t.Fatal(err)
	}
	// source: ngspice op at 25 °C with BF = typical, hFE min, hFE max.
	want := (got[2]["@q1[ic]"] - got[1]["@q1[ic]"]) / got[0]["@q1[ic]"]
	if math.Abs(s.BetaSpread-want) > 1e-3*want {
		t.Errorf("beta spread %.6g, ngspice %.6g", s.BetaSpread, want)
	}
	if math.Abs(op.IC_A-got[0]["@q1[ic]"]) > 1e-3*op.IC_A {
		t.Errorf("nominal IC %.7g A, ngspice %.7g A", op.IC_A, got[0]["@q1[ic]"])
	}
}
